//go:build unix

package main

import (
	"os"
	"path/filepath"
	"testing"
)

// TestDefaultSessionFolderIsPrivate: the folder the default session files
// go in is created 0700.
func TestDefaultSessionFolderIsPrivate(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	p, err := defaultSessionPath("sha256:test")
	if err != nil {
		t.Fatal(err)
	}
	dir := filepath.Dir(p)
	if dir != filepath.Join(state, "likewind") {
		t.Fatalf("session path %s, want it under %s/likewind", p, state)
	}
	if fi, err := os.Stat(dir); err != nil || fi.Mode().Perm() != 0o700 {
		t.Errorf("session folder mode %v, %v; want 0700", fi.Mode().Perm(), err)
	}
}
