package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
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

// signalWrapper runs likewind under a shell that prints its exit status
// when it ends, so the status can be read from the terminal: $1 is the
// state folder, $2 the binary, $3 the session file.
const signalWrapper = `env XDG_STATE_HOME="$1" "$2" --fresh --session "$3"; echo "likewind exit status $?"`

var signalStatusLine = regexp.MustCompile(`likewind exit status (\d+)`)

// sigTmux is a detached tmux session running the wrapper, on a tmux
// server of its own (a socket in a temporary folder), so that it neither
// races other tests' servers starting and stopping nor touches the user's.
type sigTmux struct {
	t      *testing.T
	name   string
	socket string
}

// tmux is a tmux command on the test's own server.
func (s *sigTmux) tmux(args ...string) *exec.Cmd {
	return exec.Command("tmux", append([]string{"-S", s.socket}, args...)...)
}

func startSigTmux(t *testing.T, state, bin, sessPath string) *sigTmux {
	t.Helper()
	name := fmt.Sprintf("likewind-signal-%d-%d", os.Getpid(), time.Now().UnixNano())
	s := &sigTmux{t: t, name: name, socket: filepath.Join(t.TempDir(), "tmux.sock")}
	cmd := s.tmux("new-session", "-d", "-s", name, "-x", "100", "-y", "32",
		"sh", "-c", signalWrapper+"; sleep 60", "sh", state, bin, sessPath)
	cmd.Env = append(os.Environ(), "TERM=xterm-256color")
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("tmux new-session: %v\n%s", err, out)
	}
	t.Cleanup(func() { _ = s.tmux("kill-server").Run() })
	return s
}

// screen is the pane's text with its scroll-back (what the program printed
// after leaving the alternate screen may have scrolled off).
func (s *sigTmux) screen() string {
	out, err := s.tmux("capture-pane", "-p", "-S", "-", "-t", s.name).Output()
	if err != nil {
		return ""
	}
	return string(out)
}

// exitStatus is the status the wrapper printed, or -1 while likewind runs.
func (s *sigTmux) exitStatus() int {
	m := signalStatusLine.FindStringSubmatch(s.screen())
	if m == nil {
		return -1
	}
	n, _ := strconv.Atoi(m[1])
	return n
}

// waitScreen waits until the screen contains want.
func (s *sigTmux) waitScreen(want string) {
	s.t.Helper()
	deadline := time.Now().Add(signalDrawWait)
	for !strings.Contains(s.screen(), want) {
		if code := s.exitStatus(); code >= 0 {
			s.t.Fatalf("likewind ended (status %d) before the screen showed %q; screen:\n%s", code, want, s.screen())
		}
		if time.Now().After(deadline) {
			s.t.Fatalf("screen never showed %q within %v; screen:\n%s", want, signalDrawWait, s.screen())
		}
		time.Sleep(100 * time.Millisecond)
	}
}

// change presses u (units), a change worth saving, and waits for it to be
// drawn: with nothing changed, nothing is written.
func (s *sigTmux) change() {
	s.t.Helper()
	if out, err := s.tmux("send-keys", "-t", s.name, "u").CombinedOutput(); err != nil {
		s.t.Fatalf("tmux send-keys: %v\n%s", err, out)
	}
	s.waitScreen("altitude ft")
}

// likewindPID is the wrapper shell's child, the likewind process. A
// process still running when the test ends is killed, so that a failure
// leaves nothing behind.
func (s *sigTmux) likewindPID() int {
	s.t.Helper()
	out, err := s.tmux("display-message", "-p", "-t", s.name, "#{pane_pid}").Output()
	if err != nil {
		s.t.Fatalf("tmux pane pid: %v", err)
	}
	sh := strings.TrimSpace(string(out))
	children, err := os.ReadFile(filepath.Join("/proc", sh, "task", sh, "children"))
	if err != nil {
		s.t.Skipf("cannot find the child of the wrapper shell %s: %v", sh, err)
	}
	fields := strings.Fields(string(children))
	if len(fields) != 1 {
		s.t.Fatalf("wrapper shell %s has children %q, want likewind alone", sh, fields)
	}
	pid, err := strconv.Atoi(fields[0])
	if err != nil || pid <= 1 {
		s.t.Fatalf("likewind pid %q: %v", fields[0], err)
	}
	s.t.Cleanup(func() {
		if s.exitStatus() < 0 {
			_ = syscall.Kill(pid, syscall.SIGKILL)
		}
	})
	return pid
}

// waitExit waits for the wrapper to print likewind's exit status.
func (s *sigTmux) waitExit() int {
	s.t.Helper()
	deadline := time.Now().Add(signalExitWait)
	for {
		if code := s.exitStatus(); code >= 0 {
			return code
		}
		if time.Now().After(deadline) {
			s.t.Fatalf("likewind still running %v after the signal (a shutdown deadlock; see TestSignalSavesSession); screen:\n%s",
				signalExitWait, s.screen())
		}
		time.Sleep(50 * time.Millisecond)
	}
}

// buildSignalBinary skips without tmux or in -short mode, and builds the
// command into a temporary folder.
func buildSignalBinary(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("terminal signal test skipped in -short mode")
	}
	if _, err := exec.LookPath("tmux"); err != nil {
		t.Skip("tmux not installed; terminal signal test skipped")
	}
	bin := filepath.Join(t.TempDir(), "likewind")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
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
	bin := buildSignalBinary(t)
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGHUP} {
		for round := 1; round <= signalRounds; round++ {
			t.Run(fmt.Sprintf("%s/%d", sig, round), func(t *testing.T) {
				state := t.TempDir()
				sessPath := filepath.Join(t.TempDir(), "signal-session.json")
				s := startSigTmux(t, state, bin, sessPath)
				s.waitScreen("likewind |")
				s.change()
				time.Sleep(signalIdle)
				pid := s.likewindPID()
				if err := syscall.Kill(pid, sig); err != nil {
					t.Fatalf("kill(%d, %v): %v", pid, sig, err)
				}
				if code := s.waitExit(); code != 0 {
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
	bin := buildSignalBinary(t)
	sessPath := filepath.Join(t.TempDir(), "no-such-folder", "signal-session.json")
	s := startSigTmux(t, t.TempDir(), bin, sessPath)
	s.waitScreen("likewind |")
	s.change()
	time.Sleep(signalIdle)
	if err := syscall.Kill(s.likewindPID(), syscall.SIGHUP); err != nil {
		t.Fatal(err)
	}
	code := s.waitExit()
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
