// Package session is likewind's session file: what survives a restart of
// the interface (what-if values, marked test points, the chosen facility,
// layer and units, the cursor), for the input files whose names and
// content hash it records, so that a session is never applied to other
// data.
//
// Session is the file's content (JSON, format fixed by
// TestSessionFileFormatUnchanged); Load and Save read and replace a file
// whole. File is the session file an interface works on: it holds an
// advisory lock (PATH.lock) while the interface runs, re-reads the file
// before each save and puts anything it did not read as this session's
// under a numbered name beside instead of writing over it. DataHash,
// HashFiles, Check and CheckInputs tie a session to its inputs; SnapPoint
// and SnapMarks put saved points back on a grid. The what-if values are
// whatif.Changes, applied with whatif.Apply.
//
// The interface and the command line's --session both use this package;
// it has no terminal code.
package session
