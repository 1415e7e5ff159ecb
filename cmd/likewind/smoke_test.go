package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"likewind/envelope/session"
)

// TestTerminalSmoke starts the interface on the demo, moves the cursor,
// changes the layer, edits the model scale, toggles units and quits.
func TestTerminalSmoke(t *testing.T) {
	skipTerminalTest(t)
	bin := buildLikewind(t)
	dir := t.TempDir()
	sessPath := filepath.Join(dir, "smoke-session.json")
	s := startTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--fresh", "--session", sessPath)

	first := s.waitFor("likewind |")
	if !strings.Contains(first, "match class") {
		t.Errorf("first screen lacks the default layer name 'match class':\n%s", first)
	}
	flight := func(scr string) string {
		for _, line := range strings.Split(scr, "\n") {
			if i := strings.Index(line, "FLIGHT"); i >= 0 {
				return strings.TrimSpace(line[i:])
			}
		}
		return ""
	}

	// Move: the flight-condition line follows the cursor.
	s.keys("k", "k")
	moved := s.waitFor("FLIGHT")
	if flight(moved) == flight(first) {
		t.Errorf("cursor move did not change the flight line %q", flight(first))
	}

	// Layer: tab moves to the flow-regime layer.
	s.keys("Tab")
	s.waitFor("flow regime")

	// What-if: edit the model scale.
	s.keys("e")
	s.waitFor("model scale")
	s.keys("Enter", "C-u")
	s.keys("0", ".", "0", "5", "Enter")
	s.keys("Escape")
	edited := s.waitFor("what-if:")
	if !strings.Contains(edited, "model scale (all facilities) 1:20") {
		t.Errorf("header does not list the edited model scale:\n%s", edited)
	}

	// Units: toggle to customary, altitude axis in feet.
	s.keys("u")
	s.waitFor("altitude ft")

	// Quit: unsaved changes ask first; answer "save and quit".
	s.keys("q")
	s.waitFor("Unsaved")
	s.keys("s")
	s.waitGone(10 * time.Second)
	data, err := os.ReadFile(sessPath)
	if err != nil {
		t.Fatalf("session file not written on quit: %v", err)
	}
	if !strings.Contains(string(data), `"scale": 0.05`) {
		t.Errorf("session file lacks the edited scale:\n%s", data)
	}
}

// TestTerminalTwoInstances: two interfaces on one session file. The
// second opens read-only, says so, and saves only to another file; the
// first keeps its lock and saves its own marks to the file.
func TestTerminalTwoInstances(t *testing.T) {
	skipTerminalTest(t)
	bin := buildLikewind(t)
	dir := t.TempDir()
	sessPath := filepath.Join(dir, "shared.json")
	a := startTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--session", sessPath)
	a.waitFor("likewind |")
	b := startTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--fresh", "--session", sessPath)
	b.waitFor("read-only session")

	// The second: mark, quit; saving asks for another file.
	b.keys("Space", "q")
	b.waitFor("read-only here")
	b.keys("s")
	b.waitFor("READ-ONLY SESSION")
	b.keys("Enter")
	b.waitGone(10 * time.Second)
	beside := filepath.Join(dir, "shared.1.json")
	if _, err := os.Stat(beside); err != nil {
		t.Errorf("the second interface's session is not beside: %v", err)
	}
	if _, err := os.Stat(sessPath); err == nil {
		t.Errorf("the read-only interface wrote the shared session file")
	}

	// The first: two marks, save and quit, into the shared file.
	a.keys("Space", "Right", "Space", "q")
	a.waitFor("Unsaved")
	a.keys("s")
	a.waitGone(10 * time.Second)
	got, err := session.Load(sessPath)
	if err != nil {
		t.Fatalf("the first interface did not save: %v", err)
	}
	if len(got.Marks) != 2 {
		t.Errorf("shared session holds %d marks, want the first interface's 2", len(got.Marks))
	}
	other, err := session.Load(beside)
	if err != nil || len(other.Marks) != 1 {
		t.Errorf("the second interface's session: %d marks, %v; want its 1", len(other.Marks), err)
	}
	if _, err := os.Stat(sessPath + ".lock"); err == nil {
		t.Errorf("lock file left after both ended")
	}
}
