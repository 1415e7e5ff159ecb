package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope/session"
)

// copyFile copies src into dir and returns the copy's path.
func copyFile(t *testing.T, src, dir string) string {
	t.Helper()
	data, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(dir, filepath.Base(src))
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// sameFile fails unless path still holds want.
func sameFile(t *testing.T, path string, want []byte) {
	t.Helper()
	got, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s was written over:\n%s", path, got)
	}
}

// Item 1: --session naming a file that is not a session of these inputs is
// refused before the interface starts, with exit status 1 and a message
// naming the file and why; the file is left as it was.
func TestOpenRefusesUnusableSessionFile(t *testing.T) {
	t.Setenv("XDG_STATE_HOME", t.TempDir())
	dir := t.TempDir()
	toml := copyFile(t, "../../testdata/facilities.toml", dir)
	tomlData, _ := os.ReadFile(toml)

	other := filepath.Join(dir, "other.json")
	if err := session.Save(other, session.Session{Inputs: []string{"someone-else.toml"}, Hash: "sha256:other",
		Layer: "match class", Units: "SI", Marks: []session.Point{{Altitude: 1000, Speed: 0.5}}}); err != nil {
		t.Fatal(err)
	}
	otherData, _ := os.ReadFile(other)

	folder := filepath.Join(dir, "a-folder")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}

	cases := []struct {
		name, path string
		data       []byte
		why        string
	}{
		{"facility file", toml, tomlData, "not a likewind session"},
		{"session of other files", other, otherData, "other input files"},
		{"folder", folder, nil, "folder"},
	}
	for _, c := range cases {
		code, _, errs := runCmd("--session", c.path)
		if code != 1 {
			t.Errorf("%s: exit = %d, want 1 (stderr %q)", c.name, code, errs)
		}
		if !strings.Contains(errs, c.path) || !strings.Contains(errs, c.why) {
			t.Errorf("%s: stderr = %q, want the file %s and %q", c.name, errs, c.path, c.why)
		}
		if c.data != nil {
			sameFile(t, c.path, c.data)
		}
		if _, err := os.Stat(c.path + ".lock"); err == nil {
			t.Errorf("%s: lock file left behind", c.name)
		}
	}
}

// Item 5: without a terminal the interface cannot start; it says so, exits
// with status 1 and writes no session file (neither a new one nor over a
// saved one).
func TestOpenWithoutTerminalWritesNoSession(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	dir := t.TempDir()

	fresh := filepath.Join(dir, "new.json")
	code, _, errs := runCmd("--session", fresh)
	if code != 1 || !strings.Contains(errs, "terminal") {
		t.Errorf("new session: exit %d stderr %q, want 1 and a message about the terminal", code, errs)
	}
	if _, err := os.Stat(fresh); err == nil {
		t.Errorf("a session file was written although the interface never started")
	}

	// A saved session of the demo with a mark: --fresh must not replace it.
	saved := filepath.Join(dir, "saved.json")
	code, _, _ = runCmd("dump", "--plain") // the demo loads
	if code != 0 {
		t.Fatalf("dump of the demo failed")
	}
	hash := demoHash(t)
	if err := session.Save(saved, session.Session{Hash: hash, Layer: "match class", Units: "SI",
		Marks: []session.Point{{Altitude: 0, Speed: 0.3}}}); err != nil {
		t.Fatal(err)
	}
	data, _ := os.ReadFile(saved)
	if code, _, _ := runCmd("--fresh", "--session", saved); code != 1 {
		t.Errorf("--fresh without a terminal: exit %d, want 1", code)
	}
	sameFile(t, saved, data)

	// The default session folder holds nothing afterwards, not even a lock.
	runCmd()
	entries, _ := os.ReadDir(filepath.Join(state, "likewind"))
	for _, e := range entries {
		t.Errorf("state folder holds %s after a start without a terminal", e.Name())
	}
}

// demoHash is the input hash the interface records for the built-in demo.
func demoHash(t *testing.T) string {
	t.Helper()
	in, err := loadInputs(nil)
	if err != nil {
		t.Fatal(err)
	}
	return session.DataHash(in.vehicle, in.facilities)
}

// Item 1, default path: a file at the default session path that is not a
// session of these inputs is kept, and the session goes to the first
// numbered name beside it (which the next start finds again); the note
// says where. The state folder is created 0700.
func TestDefaultSessionUnusableKeptBeside(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	hash := demoHash(t)
	def, err := defaultSessionPath(hash)
	if err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(filepath.Dir(def))
	if err != nil || fi.Mode().Perm() != 0o700 {
		t.Errorf("state folder mode %v (%v), want 0700", fi.Mode().Perm(), err)
	}
	junk := []byte("not a session\n")
	if err := os.WriteFile(def, junk, 0o600); err != nil {
		t.Fatal(err)
	}
	sf, note, err := openDefaultSession(def, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	beside := strings.TrimSuffix(def, ".json") + ".1.json"
	if sf.Path() != beside || !strings.Contains(note, def) || !strings.Contains(note, beside) {
		t.Errorf("path %s note %q; want %s and a note naming both files", sf.Path(), note, beside)
	}
	if _, err := sf.Save(session.Session{Hash: hash, Layer: "match class", Units: "SI"}, false); err != nil {
		t.Fatal(err)
	}
	sf.Close()
	sameFile(t, def, junk)
	// The next start finds the session beside.
	sf, _, err = openDefaultSession(def, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	defer sf.Close()
	if _, ok := sf.Found(); !ok || sf.Path() != beside {
		t.Errorf("next start: path %s found %v, want the session at %s", sf.Path(), ok, beside)
	}
}
