package envelope

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// WriteFileAtomic writes data to path so that path either keeps its old
// content or gets all of data, never a part: see WriteAtomic.
func WriteFileAtomic(path string, data []byte, overwrite bool) error {
	return WriteAtomic(path, overwrite, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// WriteAtomic creates path with the bytes write produces. The output goes
// to a temporary file in the same folder, which is synced and then renamed
// (or, without overwrite, linked) onto path, so a reader never sees a
// half-written file and a failure leaves nothing behind.
//
// Without overwrite an existing path is refused with an error that wraps
// fs.ErrExist; the check is made before any work and again, atomically,
// when the file is put in place. A directory is never replaced. When an
// existing file is replaced, its permission bits are kept; a new file gets
// 0644.
func WriteAtomic(path string, overwrite bool, write func(io.Writer) error) error {
	if path == "" {
		return errors.New("write: no output file given")
	}
	mode := fs.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		if fi.IsDir() {
			return fmt.Errorf("write %s: is a directory", path)
		}
		if !overwrite {
			return fmt.Errorf("write %s: %w; use --force to replace it", path, fs.ErrExist)
		}
		mode = fi.Mode().Perm()
	} else if !errors.Is(err, fs.ErrNotExist) {
		return fmt.Errorf("write %s: %w", path, err)
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("write %s: cannot create a file in %s: %w", path, dir, err)
	}
	name := tmp.Name()
	fail := func(err error) error {
		tmp.Close()
		os.Remove(name)
		return fmt.Errorf("write %s: %w", path, err)
	}
	bw := bufio.NewWriterSize(tmp, 64<<10)
	if err := write(bw); err != nil {
		return fail(err)
	}
	if err := bw.Flush(); err != nil {
		return fail(err)
	}
	if err := tmp.Chmod(mode); err != nil {
		return fail(err)
	}
	if err := tmp.Sync(); err != nil {
		return fail(err)
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return fmt.Errorf("write %s: %w", path, err)
	}
	if overwrite {
		if err := os.Rename(name, path); err != nil {
			os.Remove(name)
			return fmt.Errorf("write %s: %w", path, err)
		}
		return nil
	}
	// A hard link fails if path appeared meanwhile, where a rename would
	// silently replace it.
	err = os.Link(name, path)
	switch {
	case err == nil:
		os.Remove(name)
		return nil
	case errors.Is(err, fs.ErrExist):
		os.Remove(name)
		return fmt.Errorf("write %s: %w; use --force to replace it", path, fs.ErrExist)
	}
	// The file system has no hard links: fall back to a rename after a
	// last check.
	if _, serr := os.Lstat(path); serr == nil {
		os.Remove(name)
		return fmt.Errorf("write %s: %w; use --force to replace it", path, fs.ErrExist)
	}
	if err := os.Rename(name, path); err != nil {
		os.Remove(name)
		return fmt.Errorf("write %s: %w", path, err)
	}
	return nil
}
