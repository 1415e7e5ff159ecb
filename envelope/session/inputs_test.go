package session

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestCheckSessionRefusesOtherFiles(t *testing.T) {
	s := Session{Version: Version, Inputs: []string{"old.toml"}, Hash: "sha256:1"}
	if err := Check(s, []string{"old.toml"}, "sha256:1"); err != nil {
		t.Errorf("same hash: %v", err)
	}
	err := Check(s, []string{"new.toml"}, "sha256:2")
	if !errors.Is(err, ErrMismatch) {
		t.Fatalf("other hash: err = %v, want ErrMismatch", err)
	}
	if !strings.Contains(err.Error(), "old.toml") || !strings.Contains(err.Error(), "new.toml") {
		t.Errorf("message %q does not name both file sets", err)
	}
}

func TestHashFiles(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a"), filepath.Join(dir, "b")
	os.WriteFile(a, []byte("x = 1\n"), 0o600)
	os.WriteFile(b, []byte("x = 2\n"), 0o600)
	ha, err := HashFiles(a)
	if err != nil {
		t.Fatal(err)
	}
	hb, _ := HashFiles(b)
	ha2, _ := HashFiles(a)
	if ha == hb || ha != ha2 {
		t.Errorf("HashFiles: a %s, b %s, a again %s; want a≠b and a stable", ha, hb, ha2)
	}
	if _, err := HashFiles(filepath.Join(dir, "none")); err == nil {
		t.Errorf("HashFiles of a missing file = nil error")
	}
}

func TestCheckSessionInputs(t *testing.T) {
	v, facs := demoData(t)
	s := Session{Version: Version, Hash: DataHash(v, facs)}
	if err := CheckInputs(s, nil, v, facs); err != nil {
		t.Errorf("CheckInputs(demo session) = %v, want nil", err)
	}
	files := []string{filepath.Join("..", "..", "testdata", "corvane-sx3.toml"), filepath.Join("..", "..", "testdata", "facilities.toml")}
	h, err := HashFiles(files...)
	if err != nil {
		t.Fatal(err)
	}
	s.Hash = h
	if err := CheckInputs(s, files, v, facs); err != nil {
		t.Errorf("CheckInputs(file-hash session) = %v, want nil", err)
	}
	s.Hash = "sha256:other"
	if err := CheckInputs(s, files, v, facs); !errors.Is(err, ErrMismatch) {
		t.Errorf("CheckInputs(other data) = %v, want ErrMismatch", err)
	}
}
