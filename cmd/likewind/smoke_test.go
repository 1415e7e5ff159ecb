package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"likewind/envelope/session"
)

// smokeTmux drives the built binary in a real terminal (tmux) the way a
// user would. It skips when tmux is not installed or in -short mode.
type smokeTmux struct {
	t      *testing.T
	name   string
	socket string // the test's own tmux server, in a temporary folder
}

// tmux runs a tmux command on the test's own server (-S), so tests never
// share, or race to stop, a server with other tmux users, and leave no
// socket behind.
func (s *smokeTmux) tmux(args ...string) *exec.Cmd {
	return exec.Command("tmux", append([]string{"-S", s.socket}, args...)...)
}

func newSmokeTmux(t *testing.T, width, height int, command ...string) *smokeTmux {
	t.Helper()
	if testing.Short() {
		t.Skip("terminal smoke test skipped in -short mode")
	}
	if _, err := exec.LookPath("tmux"); err != nil {
		t.Skip("tmux not installed; terminal smoke test skipped")
	}
	name := fmt.Sprintf("likewind-smoke-%d", time.Now().UnixNano())
	s := &smokeTmux{t: t, name: name, socket: filepath.Join(t.TempDir(), "tmux.sock")}
	args := []string{"new-session", "-d", "-s", name, "-x", fmt.Sprint(width), "-y", fmt.Sprint(height)}
	args = append(args, command...)
	cmd := s.tmux(args...)
	cmd.Env = append(os.Environ(), "TERM=xterm-256color")
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("tmux new-session: %v\n%s", err, out)
	}
	t.Cleanup(func() { _ = s.tmux("kill-server").Run() })
	return s
}

func (s *smokeTmux) screen() string {
	out, err := s.tmux("capture-pane", "-p", "-t", s.name).CombinedOutput()
	if err != nil {
		return ""
	}
	return string(out)
}

func (s *smokeTmux) alive() bool {
	return s.tmux("has-session", "-t", s.name).Run() == nil
}

// keys sends tmux key names one at a time, so each arrives as its own key
// press.
func (s *smokeTmux) keys(keys ...string) {
	s.t.Helper()
	for _, k := range keys {
		if out, err := s.tmux("send-keys", "-t", s.name, k).CombinedOutput(); err != nil {
			s.t.Fatalf("tmux send-keys %q: %v\n%s", k, err, out)
		}
		time.Sleep(60 * time.Millisecond)
	}
}

// waitFor waits until the screen contains want, failing after a generous
// bound (this is a correctness check, not a speed check).
func (s *smokeTmux) waitFor(want string) string {
	s.t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for {
		scr := s.screen()
		if strings.Contains(scr, want) {
			return scr
		}
		if time.Now().After(deadline) {
			s.t.Fatalf("screen never showed %q; last screen:\n%s", want, scr)
		}
		time.Sleep(100 * time.Millisecond)
	}
}

// buildLikewind compiles the command into a temporary folder.
func buildLikewind(t *testing.T) string {
	t.Helper()
	bin := filepath.Join(t.TempDir(), "likewind")
	out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput()
	if err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

// TestTerminalSmoke starts the interface on the demo, moves the cursor,
// changes the layer, edits the model scale, toggles units and quits.
func TestTerminalSmoke(t *testing.T) {
	bin := buildLikewind(t)
	dir := t.TempDir()
	sessPath := filepath.Join(dir, "smoke-session.json")
	s := newSmokeTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--fresh", "--session", sessPath)

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
	deadline := time.Now().Add(10 * time.Second)
	for s.alive() && time.Now().Before(deadline) {
		time.Sleep(100 * time.Millisecond)
	}
	if s.alive() {
		t.Fatalf("likewind still running after quit; screen:\n%s", s.screen())
	}
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
	bin := buildLikewind(t)
	dir := t.TempDir()
	sessPath := filepath.Join(dir, "shared.json")
	a := newSmokeTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--session", sessPath)
	a.waitFor("likewind |")
	b := newSmokeTmux(t, 120, 40, "env", "XDG_STATE_HOME="+dir, bin, "--fresh", "--session", sessPath)
	b.waitFor("read-only session")

	// The second: mark, quit; saving asks for another file.
	b.keys("Space", "q")
	b.waitFor("read-only here")
	b.keys("s")
	b.waitFor("READ-ONLY SESSION")
	b.keys("Enter")
	waitGone(t, b)
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
	waitGone(t, a)
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

// waitGone waits for the program in s to end.
func waitGone(t *testing.T, s *smokeTmux) {
	t.Helper()
	deadline := time.Now().Add(10 * time.Second)
	for s.alive() && time.Now().Before(deadline) {
		time.Sleep(100 * time.Millisecond)
	}
	if s.alive() {
		t.Fatalf("likewind still running; screen:\n%s", s.screen())
	}
}
