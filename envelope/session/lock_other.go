//go:build !unix

package session

import (
	"errors"
	"os"
)

// tryLock has no advisory lock to take on this system: the session file
// is used without one and the start note says so.
func tryLock(*os.File) error {
	return errors.New("advisory file locks are not supported on this system")
}

func sameFile(*os.File, string) bool { return true }
