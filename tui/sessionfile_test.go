package tui

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/session"
)

// demoHashOf is the input hash New uses for the demo without files.
func demoHashOf(t *testing.T) string {
	v, facs := demoData(t)
	return session.DataHash(v, facs)
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
	if _, err := session.Load(want); err != nil {
		t.Errorf("beside: %v", err)
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
	k, err := session.Load(kept)
	if err != nil || len(k.Marks) != len(old.Marks) {
		t.Fatalf("kept session %+v, %v; want the old %d marks", k, err, len(old.Marks))
	}
	now, _ := session.Load(path)
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
	if s, err := session.Load(target); err != nil || len(s.Marks) != 1 {
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
	first, _ := session.Open(path, nil, hash)
	defer first.Close()
	second, _ := session.Open(path, nil, hash)
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
	if _, err := session.Load(filepath.Join(dir, "s.1.json")); err != nil {
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
