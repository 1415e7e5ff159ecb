//go:build unix

package session

import (
	"errors"
	"os"
	"syscall"
)

// tryLock takes an exclusive advisory lock (flock) on f without waiting.
// It reports errLockHeld when another open file holds it.
func tryLock(f *os.File) error {
	for {
		err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB)
		switch {
		case err == nil:
			return nil
		case errors.Is(err, syscall.EINTR):
			continue
		case errors.Is(err, syscall.EWOULDBLOCK):
			return errLockHeld
		}
		return err
	}
}

// sameFile reports whether the open file f is still the file at path (the
// lock file was not removed and created anew while we waited).
func sameFile(f *os.File, path string) bool {
	a, err := f.Stat()
	if err != nil {
		return false
	}
	b, err := os.Lstat(path)
	if err != nil {
		return false
	}
	return os.SameFile(a, b)
}
