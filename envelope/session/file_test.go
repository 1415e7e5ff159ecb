package session

import (
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope"
)

// demoData loads the built-in demo (invented vehicle and facilities).
func demoData(tb testing.TB) (*envelope.Vehicle, []envelope.Facility) {
	tb.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		tb.Fatalf("envelope.Demo() error: %v", err)
	}
	return v, facs
}

// demoHashOf is the data hash of the demo, as an interface on it without
// files uses.
func demoHashOf(t *testing.T) string {
	v, facs := demoData(t)
	return DataHash(v, facs)
}

// Item 3: two holders of one session file. The first holds the lock; the
// second opens read-only, names the holder and cannot save there; after
// the first closes, the lock file is gone and a new opener gets the lock.
func TestSessionFileSecondHolderIsReadOnly(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	hash := demoHashOf(t)
	a, err := Open(path, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	if ro, _ := a.ReadOnly(); ro || a.LockError() != nil {
		t.Fatalf("first holder: read-only %v, lock error %v; want the lock", ro, a.LockError())
	}
	b, err := Open(path, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	ro, holder := b.ReadOnly()
	if !ro || holder != "pid "+strconv.Itoa(os.Getpid()) {
		t.Fatalf("second holder: read-only %v holder %q, want read-only held by pid %d", ro, holder, os.Getpid())
	}
	s := Session{Hash: hash, Layer: "match class", Units: "SI"}
	if _, err := b.Save(s, false); !errors.Is(err, ErrInUse) {
		t.Errorf("read-only Save = %v, want ErrInUse", err)
	}
	if _, err := os.Stat(path); err == nil {
		t.Errorf("the read-only holder wrote the session file")
	}
	// The read-only one saves beside, under its own lock.
	res, err := b.SaveBeside(s)
	if err != nil || res.Path != filepath.Join(dir, "s.1.json") || !strings.Contains(res.Note, "in use by another likewind") {
		t.Errorf("SaveBeside = %+v, %v; want s.1.json and a note", res, err)
	}
	if _, err := a.Save(s, false); err != nil {
		t.Errorf("the lock holder cannot save: %v", err)
	}
	a.Close()
	b.Close()
	if _, err := os.Stat(path + ".lock"); err == nil {
		t.Errorf("lock file left after Close")
	}
	c, _ := Open(path, nil, hash)
	defer c.Close()
	if ro, _ := c.ReadOnly(); ro {
		t.Errorf("after both closed, a new opener is read-only")
	}
}

// Item 3: a save re-reads the file; when another program wrote it since,
// the session goes beside it and the other's file is left alone.
func TestSessionFileChangedOnDiskSavesBeside(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	hash := demoHashOf(t)
	f, _ := Open(path, nil, hash)
	defer f.Close()
	s := Session{Hash: hash, Layer: "match class", Units: "SI"}
	if _, err := f.Save(s, false); err != nil {
		t.Fatal(err)
	}
	theirs := Session{Hash: hash, Layer: "match class", Units: "SI", Marks: []Point{{Altitude: 1, Speed: 2}}}
	if err := Save(path, theirs); err != nil { // another program, without the lock
		t.Fatal(err)
	}
	before, _ := os.ReadFile(path)
	s.Units = "customary"
	res, err := f.Save(s, false)
	if err != nil {
		t.Fatal(err)
	}
	if res.Path != filepath.Join(dir, "s.1.json") || !strings.Contains(res.Note, "changed on disk") || f.Path() != res.Path {
		t.Errorf("Save = %+v (path now %s); want s.1.json with a note", res, f.Path())
	}
	after, _ := os.ReadFile(path)
	if string(after) != string(before) {
		t.Errorf("the file another program wrote was replaced")
	}
}

// Session files are 0600; the lock file too.
func TestSessionFileMode(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	f, _ := Open(path, nil, "h")
	defer f.Close()
	if _, err := f.Save(Session{Hash: "h"}, false); err != nil {
		t.Fatal(err)
	}
	for _, p := range []string{path, path + ".lock"} {
		fi, err := os.Stat(p)
		if err != nil {
			t.Fatal(err)
		}
		if fi.Mode().Perm() != 0o600 {
			t.Errorf("%s mode %v, want 0600", filepath.Base(p), fi.Mode().Perm())
		}
	}
}
