package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"likewind/envelope/session"
)

// Bounds of the signal test: generous, since a loaded machine may be slow
// to start and draw; they only stop a broken run from hanging the test.
const (
	signalDrawWait = 20 * time.Second
	signalExitWait = 10 * time.Second
	// signalIdle is how long the drawn screen sits before the signal, as
	// it would between key presses.
	signalIdle = time.Second
	// signalRounds is how many runs each signal gets: the signal races the
	// program's own shutdown, and one run can miss a deadlock.
	signalRounds = 3
)

// startSignalTmux runs likewind at 100×32 in a reporting tmux session
// (its exit status is printed when it ends), with its state in state and
// its session in sessPath, and waits for the screen to be drawn.
func startSignalTmux(t *testing.T, state, bin, sessPath string) *tmuxTerm {
	t.Helper()
	s := startTmuxReporting(t, 100, 32, "env", "XDG_STATE_HOME="+state, bin, "--fresh", "--session", sessPath)
	s.wait = signalDrawWait
	s.waitFor("likewind |")
	return s
}

// changeUnits presses u (units), a change worth saving, and waits for it to be
// drawn: with nothing changed, nothing is written.
func changeUnits(s *tmuxTerm) {
	s.tb.Helper()
	s.send("u")
	s.waitFor("altitude ft")
}

// TestSignalSavesSession starts the interface in a real terminal, waits for
// the first screen, changes the units, then ends it with SIGTERM (a polite kill) or SIGHUP (a
// dropped SSH connection): the program must exit with status 0, say where
// the session went, and leave a session file that loads, with no temporary
// file beside it.
//
// A program that never ends after SIGTERM is the deadlock this test was
// written for: bubbletea installs its own SIGINT/SIGTERM handler unless
// told not to (tea.WithoutSignalHandler), and when the signal context of
// runOpen wins the race, the event loop stops first and bubbletea's handler
// blocks for ever sending its QuitMsg, so Program.Run never returns and the
// session is never written.
func TestSignalSavesSession(t *testing.T) {
	skipTerminalTest(t)
	bin := buildLikewind(t)
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGHUP} {
		for round := 1; round <= signalRounds; round++ {
			t.Run(fmt.Sprintf("%s/%d", sig, round), func(t *testing.T) {
				state := t.TempDir()
				sessPath := filepath.Join(t.TempDir(), "signal-session.json")
				s := startSignalTmux(t, state, bin, sessPath)
				changeUnits(s)
				time.Sleep(signalIdle)
				pid := s.programPID()
				if err := syscall.Kill(pid, sig); err != nil {
					t.Fatalf("kill(%d, %v): %v", pid, sig, err)
				}
				if code := s.waitExit(signalExitWait); code != 0 {
					t.Errorf("after %v likewind exited with status %d, want 0; screen:\n%s", sig, code, s.screen())
				}
				if scr := s.screen(); !strings.Contains(scr, "session saved to "+sessPath) {
					t.Errorf("after %v the terminal lacks %q; screen:\n%s", sig, "session saved to "+sessPath, scr)
				}
				got, err := session.Load(sessPath)
				if err != nil {
					t.Fatalf("after %v: %v", sig, err)
				}
				if got.Version != session.Version || got.Hash == "" || got.Layer == "" || got.Units != "customary" {
					t.Errorf("after %v the session is %+v, want version %d with the data hash and layer", sig, got, session.Version)
				}
				entries, err := os.ReadDir(filepath.Dir(sessPath))
				if err != nil {
					t.Fatal(err)
				}
				if len(entries) != 1 {
					var names []string
					for _, e := range entries {
						names = append(names, e.Name())
					}
					t.Errorf("after %v the session folder holds %q, want only the session file", sig, names)
				}
			})
		}
	}
}

// TestSignalSaveFailureReported: when the session cannot be written (its
// folder does not exist), a hang-up must not claim it was saved, and the
// exit status must say the save failed, so a lost session never passes
// unnoticed.
func TestSignalSaveFailureReported(t *testing.T) {
	skipTerminalTest(t)
	bin := buildLikewind(t)
	sessPath := filepath.Join(t.TempDir(), "no-such-folder", "signal-session.json")
	s := startSignalTmux(t, t.TempDir(), bin, sessPath)
	changeUnits(s)
	time.Sleep(signalIdle)
	if err := syscall.Kill(s.programPID(), syscall.SIGHUP); err != nil {
		t.Fatal(err)
	}
	code := s.waitExit(signalExitWait)
	scr := s.screen()
	if code == 0 {
		t.Errorf("after a failed save likewind exited with status 0, want non-zero; screen:\n%s", scr)
	}
	if strings.Contains(scr, "session saved to") {
		t.Errorf("after a failed save the terminal says the session was saved; screen:\n%s", scr)
	}
	if !strings.Contains(scr, "save session") {
		t.Errorf("after a failed save the terminal does not say why; screen:\n%s", scr)
	}
	if _, err := os.Stat(sessPath); err == nil {
		t.Errorf("session file %s exists", sessPath)
	}
}
