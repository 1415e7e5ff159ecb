package tui

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// demoHashOf is the input hash New uses for the demo without files.
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
	a, err := OpenSessionFile(path, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	if ro, _ := a.ReadOnly(); ro || a.LockError() != nil {
		t.Fatalf("first holder: read-only %v, lock error %v; want the lock", ro, a.LockError())
	}
	b, err := OpenSessionFile(path, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	ro, holder := b.ReadOnly()
	if !ro || holder != "pid "+strconv.Itoa(os.Getpid()) {
		t.Fatalf("second holder: read-only %v holder %q, want read-only held by pid %d", ro, holder, os.Getpid())
	}
	s := Session{Hash: hash, Layer: "match class", Units: "SI"}
	if _, err := b.Save(s, false); !errors.Is(err, ErrSessionInUse) {
		t.Errorf("read-only Save = %v, want ErrSessionInUse", err)
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
	c, _ := OpenSessionFile(path, nil, hash)
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
	f, _ := OpenSessionFile(path, nil, hash)
	defer f.Close()
	s := Session{Hash: hash, Layer: "match class", Units: "SI"}
	if _, err := f.Save(s, false); err != nil {
		t.Fatal(err)
	}
	theirs := Session{Hash: hash, Layer: "match class", Units: "SI", Marks: []Point{{Altitude: 1, Speed: 2}}}
	if err := SaveSession(path, theirs); err != nil { // another program, without the lock
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

// Item 1 (model side): a session path holding something that is not a
// session of these inputs is never written over; the save goes beside.
func TestSessionFileNeverWritesOverRefusedFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "facilities.toml")
	body := []byte("[[facility]]\nname = \"x\"\n")
	if err := os.WriteFile(path, body, 0o644); err != nil {
		t.Fatal(err)
	}
	m := newDemo(t, 100, 30, func(o *Options) { o.SessionPath = path })
	if !strings.Contains(m.status, "not a likewind session") {
		t.Errorf("start status %q does not say the file is not a session", m.status)
	}
	m, _ = press(m, "space", "s")
	got, _ := os.ReadFile(path)
	if string(got) != string(body) {
		t.Fatalf("the refused file was written over:\n%s", got)
	}
	want := filepath.Join(dir, "facilities.1.toml")
	if m.sessionPath != want || !strings.Contains(m.status, want) {
		t.Errorf("session path %s, status %q; want it saved to %s and said", m.sessionPath, m.status, want)
	}
	if _, err := LoadSession(want); err != nil {
		t.Errorf("beside: %v", err)
	}
}

// Session files are 0600; the lock file too.
func TestSessionFileMode(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	f, _ := OpenSessionFile(path, nil, "h")
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

// Item 2: a session on disk that the start did not restore is kept beside
// under a numbered name before the first save, and the screen says so.
func TestDeclinedSessionKeptBeside(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	old := savedDemoSession(t, path, 2)
	oldData, _ := os.ReadFile(path)
	m := newDemo(t, 100, 30, func(o *Options) { o.SessionPath = path })
	// Nothing changed: q quits and nothing is written.
	if _, quit := press(m, "q"); !quit {
		t.Fatalf("q with nothing changed did not quit")
	}
	if got, _ := os.ReadFile(path); string(got) != string(oldData) {
		t.Fatalf("quitting unchanged rewrote the declined session")
	}
	// A change, then save and quit: the old one is kept as s.1.json.
	m, _ = press(m, "space", "q")
	if m.mode != modeConfirm {
		t.Fatalf("mode %v, want the quit question", m.mode)
	}
	m, quit := press(m, "s")
	if !quit {
		t.Fatalf("save and quit did not quit: %s", m.status)
	}
	kept := filepath.Join(dir, "s.1.json")
	k, err := LoadSession(kept)
	if err != nil || len(k.Marks) != len(old.Marks) {
		t.Fatalf("kept session %+v, %v; want the old %d marks", k, err, len(old.Marks))
	}
	now, _ := LoadSession(path)
	if len(now.Marks) != 1 {
		t.Errorf("new session has %d marks, want 1", len(now.Marks))
	}
	report := strings.Join(m.SaveReport(), "\n")
	if !strings.Contains(report, "session saved to "+path) || !strings.Contains(report, kept) {
		t.Errorf("report %q does not say where both went", report)
	}
}

// Item 4: a failed save, then "save and quit", keeps the interface open,
// shows the whole error and offers another file; the typed file is saved
// and the program ends. esc instead stays with the marks.
func TestFailedSaveKeepsInterfaceOpen(t *testing.T) {
	dir := t.TempDir()
	folder := filepath.Join(dir, "a-folder") // the session path is a folder
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = folder; o.DumpDir = dir })
	m, _ = press(m, "space", "q", "s")
	if m.Quitting() || m.mode != modeSaveAs {
		t.Fatalf("after a failed save and quit: quitting %v mode %v, want open asking for a file", m.Quitting(), m.mode)
	}
	reason := m.saveAs.reason
	if !strings.Contains(reason, folder) || !strings.Contains(reason, "is a folder") {
		t.Errorf("reason %q does not name the folder and why", reason)
	}
	view := m.View()
	if !strings.Contains(strings.Join(strings.Fields(view), " "), strings.Join(strings.Fields(reason), " ")) {
		t.Errorf("the whole error is not on screen:\n%s", view)
	}
	if len(m.marks) != 1 {
		t.Errorf("marks %d, want the one", len(m.marks))
	}
	// esc: still open, nothing lost.
	e, quit := press(m, "esc")
	if quit || e.mode != modeMain || len(e.marks) != 1 || !e.WantsSave() {
		t.Errorf("esc: quit %v mode %v marks %d wantsSave %v", quit, e.mode, len(e.marks), e.WantsSave())
	}
	// ctrl+c then y: quit without saving, said explicitly.
	c, _ := press(m, "ctrl+c")
	if c.mode != modeConfirm || !strings.Contains(c.View(), "quit without saving") {
		t.Errorf("ctrl+c: mode %v, want the question offering to quit without saving", c.mode)
	}
	// Another file: typed, saved, and the program ends.
	target := filepath.Join(dir, "elsewhere.json")
	m, _ = press(m, "ctrl+u")
	m = typeText(m, target)
	m, quit = press(m, "enter")
	if !quit {
		t.Fatalf("saving to %s did not quit: mode %v status %q reason %q", target, m.mode, m.status, m.saveAs.reason)
	}
	if s, err := LoadSession(target); err != nil || len(s.Marks) != 1 {
		t.Errorf("saved to another file: %+v, %v", s, err)
	}
	// An existing file is refused, and the question stays.
	m2 := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = folder })
	m2, _ = press(m2, "space", "s")
	m2, _ = press(m2, "ctrl+u")
	m2 = typeText(m2, target)
	m2, quit = press(m2, "enter")
	if quit || m2.mode != modeSaveAs || !strings.Contains(m2.saveAs.reason, "exists") {
		t.Errorf("saving over an existing file: quit %v mode %v reason %q", quit, m2.mode, m2.saveAs.reason)
	}
}

// Item 4: a save into a missing folder offers the folder likewind was
// started from.
func TestFailedSaveSuggestsAnotherFolder(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "missing", "s.json")
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = path; o.DumpDir = dir })
	m, _ = press(m, "space", "s")
	if m.mode != modeSaveAs {
		t.Fatalf("mode %v after a failed save, want the question", m.mode)
	}
	if got, want := m.saveAs.input.Value(), filepath.Join(dir, "s.json"); got != want {
		t.Errorf("offered %q, want %q", got, want)
	}
}

// Item 3 (model side): a read-only interface says so on screen, and its
// save key asks for another file.
func TestReadOnlyInterfaceSavesElsewhere(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	hash := demoHashOf(t)
	first, _ := OpenSessionFile(path, nil, hash)
	defer first.Close()
	second, _ := OpenSessionFile(path, nil, hash)
	defer second.Close()
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionFile = second })
	if !strings.Contains(strings.SplitN(m.View(), "\n", 2)[0], "read-only session") || !strings.Contains(m.status, "open in another likewind") {
		t.Errorf("read-only not said: status %q\n%s", m.status, m.View())
	}
	m, _ = press(m, "space", "q")
	if !strings.Contains(m.View(), "save to another file") {
		t.Errorf("quit question does not offer another file:\n%s", m.View())
	}
	m, _ = press(m, "s")
	if m.mode != modeSaveAs || m.saveAs.input.Value() != filepath.Join(dir, "s.1.json") {
		t.Fatalf("mode %v offer %q, want the question offering s.1.json", m.mode, m.saveAs.input.Value())
	}
	m, quit := press(m, "enter")
	if !quit {
		t.Fatalf("did not quit after saving elsewhere: %q", m.saveAs.reason)
	}
	if _, err := os.Stat(path); err == nil {
		t.Errorf("the read-only interface wrote the held session file")
	}
	if _, err := LoadSession(filepath.Join(dir, "s.1.json")); err != nil {
		t.Error(err)
	}
}

// Item 5: when the program cannot start (no terminal to open), Run writes
// nothing: a saved session stays as it was and no new file appears.
func TestRunWritesNothingWhenProgramCannotStart(t *testing.T) {
	if f, err := os.OpenFile("/dev/tty", os.O_RDWR, 0); err == nil {
		f.Close()
		t.Skip("a terminal is available; this test needs a process without one")
	}
	v, facs := demoData(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	savedDemoSession(t, path, 2)
	before, _ := os.ReadFile(path)
	for _, p := range []string{path, filepath.Join(dir, "new.json")} {
		_, err := Run(context.Background(), Options{Vehicle: v, Facilities: facs, SessionPath: p}, tea.WithInputTTY())
		if err == nil {
			t.Fatalf("Run started without a terminal")
		}
		if errors.Is(err, ErrSessionNotSaved) {
			t.Errorf("Run tried to save: %v", err)
		}
	}
	if after, _ := os.ReadFile(path); string(after) != string(before) {
		t.Errorf("the saved session was rewritten")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("folder holds %v, want the saved session alone", names)
	}
}
