//go:build unix

package session

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"
)

// TestSessionFileIsPrivate: a saved session is readable by its owner
// only, whatever the umask.
func TestSessionFileIsPrivate(t *testing.T) {
	old := syscall.Umask(0o002)
	defer syscall.Umask(old)
	p := filepath.Join(t.TempDir(), "s.json")
	if err := Save(p, Session{Layer: "class", Units: "SI"}); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Stat(p); err != nil || fi.Mode().Perm() != 0o600 {
		t.Errorf("session file mode %v, %v; want 0600", fi.Mode().Perm(), err)
	}
}
