package fileout

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"

	"likewind/envelope"
)

// WriteFileAtomic writes data to path so that path either keeps its old
// content or gets all of data, never a part: see WriteAtomic.
func WriteFileAtomic(path string, data []byte, overwrite bool) error {
	return WriteAtomic(path, overwrite, writeBytes(data))
}

// WriteFilePrivate writes data to path as WriteFileAtomic does (an existing
// regular file is replaced only when overwrite is set), but the file is
// readable and writable by its
// owner only (0600) whatever the umask and whatever the mode of the file
// it replaces: for session files, which record a user's work.
func WriteFilePrivate(path string, data []byte, overwrite bool) error {
	s, err := stage(path, overwrite, true, writeBytes(data))
	if err != nil {
		return err
	}
	return s.commit(overwrite)
}

func writeBytes(data []byte) func(io.Writer) error {
	return func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}
}

// WriteAtomic creates path with the bytes write produces. The output goes
// to a temporary file in the same folder, which is synced and then renamed
// (or, without overwrite, linked) onto path, so a reader never sees a
// half-written file and a failure leaves nothing behind.
//
// Outputs are written only over regular files: a symbolic link, a
// device, a named pipe, a socket or a folder at path is refused, with
// overwrite too (replacing /dev/null or a link's target by a plain file is
// never what was meant). Without overwrite an existing path is refused
// with an error that wraps fs.ErrExist; the check is made before any work
// and again, atomically, when the file is put in place. A file that
// replaces another keeps its permission bits; a new file gets 0666 less
// the umask, as other programs' outputs do.
func WriteAtomic(path string, overwrite bool, write func(io.Writer) error) error {
	s, err := stage(path, overwrite, false, write)
	if err != nil {
		return err
	}
	return s.commit(overwrite)
}

// CheckOutputTarget reports whether path may receive an output: nothing
// there, or (with overwrite) a regular file. The error names the path and
// wraps fs.ErrExist for an existing file without overwrite.
func CheckOutputTarget(path string, overwrite bool) error {
	_, err := checkTarget(path, overwrite)
	return err
}

// checkTarget is CheckOutputTarget that also returns what is at path
// (nil when nothing).
func checkTarget(path string, overwrite bool) (fs.FileInfo, error) {
	if path == "" {
		return nil, errors.New("write: no output file given")
	}
	fi, err := os.Lstat(path)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, nil
	case err != nil:
		return nil, fmt.Errorf("write %s: %w", envelope.CleanText(path), cleanPathError(err))
	case !fi.Mode().IsRegular():
		return nil, fmt.Errorf("write %s: %s; outputs are written only over regular files, even with --force", envelope.CleanText(path), notRegular(fi.Mode()))
	case !overwrite:
		return nil, fmt.Errorf("write %s: %w; use --force to replace it", envelope.CleanText(path), fs.ErrExist)
	}
	return fi, nil
}

// notRegular says what kind of thing a non-regular file is.
func notRegular(m fs.FileMode) string {
	switch {
	case m&fs.ModeSymlink != 0:
		return "is a symbolic link"
	case m.IsDir():
		return "is a folder"
	case m&fs.ModeDevice != 0:
		return "is a device"
	case m&fs.ModeNamedPipe != 0:
		return "is a named pipe"
	case m&fs.ModeSocket != 0:
		return "is a socket"
	}
	return "is not a regular file"
}

// staged is an output written to its temporary file, ready to be put in
// place.
type staged struct {
	path, tmp string
}

// maxTempBase caps the part of a temporary file's name taken from the
// target, so that a long target name still leaves room within the file
// system's limit on a name.
const maxTempBase = 100

// createTemp creates a new file in dir, named after base, with mode perm
// less the umask (os.CreateTemp always uses 0600).
func createTemp(dir, base string, perm fs.FileMode) (*os.File, error) {
	if len(base) > maxTempBase {
		base = base[:maxTempBase]
	}
	for {
		name := filepath.Join(dir, "."+base+".tmp-"+strconv.FormatUint(rand.Uint64(), 36))
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, perm)
		if !errors.Is(err, fs.ErrExist) {
			return f, err
		}
	}
}

// stage checks path, then writes, syncs and closes its temporary file.
func stage(path string, overwrite, private bool, write func(io.Writer) error) (*staged, error) {
	old, err := checkTarget(path, overwrite)
	if err != nil {
		return nil, err
	}
	shown := envelope.CleanText(path)
	perm := fs.FileMode(0o666) // less the umask
	if private {
		perm = 0o600
	}
	dir := filepath.Dir(path)
	tmp, err := createTemp(dir, filepath.Base(path), perm)
	if err != nil {
		return nil, fmt.Errorf("write %s: cannot create a file in %s: %w", shown, envelope.CleanText(dir), cleanPathError(err))
	}
	name := tmp.Name()
	fail := func(err error) (*staged, error) {
		tmp.Close()
		os.Remove(name)
		return nil, fmt.Errorf("write %s: %w", shown, cleanPathError(err))
	}
	bw := bufio.NewWriterSize(tmp, 64<<10)
	if err := write(bw); err != nil {
		return fail(err)
	}
	if err := bw.Flush(); err != nil {
		return fail(err)
	}
	// A replaced file keeps its mode; a private one is 0600 even when it
	// replaces a file open to others.
	switch {
	case private:
		err = tmp.Chmod(0o600)
	case old != nil:
		err = tmp.Chmod(old.Mode().Perm())
	}
	if err != nil {
		return fail(err)
	}
	if err := tmp.Sync(); err != nil {
		return fail(err)
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return nil, fmt.Errorf("write %s: %w", shown, cleanPathError(err))
	}
	return &staged{path: path, tmp: name}, nil
}

// discard removes the temporary file.
func (s *staged) discard() { os.Remove(s.tmp) }

// commit puts the temporary file in place: renamed over path with
// overwrite, otherwise linked, which fails if path appeared meanwhile
// where a rename would silently replace it. On failure nothing is left.
func (s *staged) commit(overwrite bool) error {
	shown := envelope.CleanText(s.path)
	if overwrite {
		// Only a regular file is replaced, even if one was swapped in
		// since the check.
		if _, err := checkTarget(s.path, true); err != nil {
			s.discard()
			return err
		}
		if err := os.Rename(s.tmp, s.path); err != nil {
			s.discard()
			return fmt.Errorf("write %s: %w", shown, cleanPathError(err))
		}
		return nil
	}
	err := os.Link(s.tmp, s.path)
	switch {
	case err == nil:
		s.discard()
		return nil
	case errors.Is(err, fs.ErrExist):
		s.discard()
		return fmt.Errorf("write %s: %w; use --force to replace it", shown, fs.ErrExist)
	}
	// The file system has no hard links: fall back to a rename after a
	// last check.
	if _, serr := os.Lstat(s.path); serr == nil {
		s.discard()
		return fmt.Errorf("write %s: %w; use --force to replace it", shown, fs.ErrExist)
	}
	if err := os.Rename(s.tmp, s.path); err != nil {
		s.discard()
		return fmt.Errorf("write %s: %w", shown, cleanPathError(err))
	}
	return nil
}

// AtomicFile is one file of a set written by WriteFilesAtomic.
type AtomicFile struct {
	Path string
	Data []byte
}

// WriteFilesAtomic writes a set of files so that either all of them are
// written or none is (a set of pictures belongs together): each goes to a
// temporary file first, as WriteAtomic does; only when all are written
// are they put in place, and if one cannot be, those already in place are
// taken back (a file they replaced is restored).
func WriteFilesAtomic(files []AtomicFile, overwrite bool) error {
	return writeFiles(files, overwrite, nil)
}

// writeFiles is WriteFilesAtomic with a hook called before file k is put
// in place (tests use it to make a later file fail).
func writeFiles(files []AtomicFile, overwrite bool, beforeCommit func(k int)) error {
	for _, f := range files {
		if _, err := checkTarget(f.Path, overwrite); err != nil {
			return err
		}
	}
	var set []*staged
	discardAll := func(from int) {
		for _, s := range set[from:] {
			s.discard()
		}
	}
	for _, f := range files {
		s, err := stage(f.Path, overwrite, false, writeBytes(f.Data))
		if err != nil {
			discardAll(0)
			return err
		}
		set = append(set, s)
	}
	// backups[k] keeps the file that file k replaces ("" if none), to
	// restore it if a later file fails.
	backups := make([]string, len(set))
	undo := func(n int) {
		for j := n - 1; j >= 0; j-- {
			if backups[j] != "" {
				os.Rename(backups[j], set[j].path)
			} else {
				os.Remove(set[j].path)
			}
		}
	}
	for k, s := range set {
		if beforeCommit != nil {
			beforeCommit(k)
		}
		if overwrite {
			b, err := keepOld(s.path)
			if err != nil {
				undo(k)
				discardAll(k)
				return fmt.Errorf("%w (no file of the set was written)", err)
			}
			backups[k] = b
		}
		if err := s.commit(overwrite); err != nil {
			// A failed commit left path as it was.
			if backups[k] != "" {
				os.Remove(backups[k])
			}
			undo(k)
			discardAll(k + 1)
			return fmt.Errorf("%w (no file of the set was written)", err)
		}
	}
	for _, b := range backups {
		if b != "" {
			os.Remove(b)
		}
	}
	return nil
}

// keepOld links an existing file at path to a hidden name beside it and
// returns that name ("" when nothing is there), so that it can be put
// back.
func keepOld(path string) (string, error) {
	if fi, err := checkTarget(path, true); err != nil || fi == nil {
		return "", err
	}
	base := filepath.Base(path)
	if len(base) > maxTempBase {
		base = base[:maxTempBase]
	}
	for {
		name := filepath.Join(filepath.Dir(path), "."+base+".old-"+strconv.FormatUint(rand.Uint64(), 36))
		err := os.Link(path, name)
		if err == nil {
			return name, nil
		}
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		// No hard links here: move the old file aside instead.
		if _, serr := os.Lstat(name); errors.Is(serr, fs.ErrNotExist) {
			if rerr := os.Rename(path, name); rerr == nil {
				return name, nil
			}
		}
		return "", fmt.Errorf("write %s: cannot keep the old file to restore on failure: %w", envelope.CleanText(path), cleanPathError(err))
	}
}

// cleanPathError makes the path inside a *fs.PathError safe to print.
func cleanPathError(err error) error {
	if pe, ok := err.(*fs.PathError); ok {
		return &fs.PathError{Op: pe.Op, Path: envelope.CleanText(pe.Path), Err: pe.Err}
	}
	return err
}
