// Package fileout writes files so that a reader never sees half of one:
// each output goes to a temporary file in the target's folder, is synced,
// and is then renamed or linked into place. Outputs are written only over
// regular files (never over a link, device, pipe or folder), an existing
// file only when asked, and a set of files (two pictures) all or none.
//
// The command line writes its outputs with WriteAtomic and
// WriteFilesAtomic, the interface its session files with WriteFilePrivate
// (0600) and its text dumps with WriteFileAtomic. Paths in messages pass
// through envelope.CleanText.
package fileout
