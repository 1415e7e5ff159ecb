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
)

// The one tmux driver of the tests and benchmarks that run the built
// command in a real terminal (smoke_test.go, signal_test.go,
// tmux_frames_test.go, tmux_bench_test.go).

// tmuxTerm is a detached tmux session on a tmux server of its own (a
// socket in a temporary folder), so that it neither races other tests'
// servers starting and stopping nor touches the user's, and leaves no
// socket behind. The server is killed when the test ends.
type tmuxTerm struct {
	tb     testing.TB
	name   string
	socket string
	// wait bounds each wait for the screen: generous, since a loaded
	// machine may be slow to start and draw (these are correctness checks,
	// not speed checks); it only stops a broken run from hanging.
	wait time.Duration
	// poll is the pause between captures while waiting. Each capture is a
	// tmux client process: polling without a pause would take a
	// processor from the program.
	poll time.Duration
	// history makes captures include the scroll-back (what the program
	// printed after leaving the alternate screen may have scrolled off).
	history bool
	// reports: the command runs under a shell that prints its exit status
	// (see exitStatus).
	reports bool
}

// tmuxExitLine is what a reporting session prints when its command ends.
var tmuxExitLine = regexp.MustCompile(`likewind exit status (\d+)`)

// skipWithoutTmux skips tb when tmux is not installed.
func skipWithoutTmux(tb testing.TB) {
	tb.Helper()
	if _, err := exec.LookPath("tmux"); err != nil {
		tb.Skip("tmux not installed; terminal test skipped")
	}
}

// skipTerminalTest skips a test that drives the built command in tmux in
// -short mode or when tmux is not installed; call it before building.
func skipTerminalTest(t *testing.T) {
	t.Helper()
	if testing.Short() {
		t.Skip("terminal test skipped in -short mode")
	}
	skipWithoutTmux(t)
}

// startTmux runs command in a new detached session of width×height with
// TERM=xterm-256color. The session ends when the command does (alive).
// Skips without tmux.
func startTmux(tb testing.TB, width, height int, command ...string) *tmuxTerm {
	tb.Helper()
	skipWithoutTmux(tb)
	p := &tmuxTerm{
		tb:     tb,
		name:   "likewind-test",
		socket: filepath.Join(tb.TempDir(), "tmux.sock"),
		wait:   15 * time.Second,
		poll:   100 * time.Millisecond,
	}
	args := []string{"new-session", "-d", "-s", p.name, "-x", fmt.Sprint(width), "-y", fmt.Sprint(height)}
	cmd := p.tmux(append(args, command...)...)
	cmd.Env = append(os.Environ(), "TERM=xterm-256color")
	if out, err := cmd.CombinedOutput(); err != nil {
		tb.Fatalf("tmux new-session: %v\n%s", err, out)
	}
	tb.Cleanup(func() { _ = p.tmux("kill-server").Run() })
	return p
}

// startTmuxReporting is startTmux with command run under a shell that,
// when it ends, prints "likewind exit status N" and keeps the pane open a
// minute, so that the status (exitStatus) and the last output can be
// read. Its captures include the scroll-back.
func startTmuxReporting(tb testing.TB, width, height int, command ...string) *tmuxTerm {
	tb.Helper()
	wrapped := append([]string{"sh", "-c", `"$@"; echo "likewind exit status $?"; sleep 60`, "sh"}, command...)
	p := startTmux(tb, width, height, wrapped...)
	p.history, p.reports = true, true
	return p
}

// tmux is a tmux command on the session's own server.
func (p *tmuxTerm) tmux(args ...string) *exec.Cmd {
	return exec.Command("tmux", append([]string{"-S", p.socket}, args...)...)
}

// run runs a tmux command on the session's own server.
func (p *tmuxTerm) run(args ...string) ([]byte, error) {
	return p.tmux(args...).CombinedOutput()
}

// screen is the pane's text, "" when it cannot be captured (the session
// has ended).
func (p *tmuxTerm) screen() string {
	args := []string{"capture-pane", "-p", "-t", p.name}
	if p.history {
		args = append(args, "-S", "-")
	}
	out, err := p.tmux(args...).Output()
	if err != nil {
		return ""
	}
	return string(out)
}

// send sends one send-keys command: tmux key names, or "-l" and a
// literal string.
func (p *tmuxTerm) send(keys ...string) {
	p.tb.Helper()
	if out, err := p.run(append([]string{"send-keys", "-t", p.name}, keys...)...); err != nil {
		p.tb.Fatalf("tmux send-keys %q: %v\n%s", keys, err, out)
	}
}

// keys sends tmux key names one at a time, with a pause after each, so
// that each arrives as its own key press.
func (p *tmuxTerm) keys(keys ...string) {
	p.tb.Helper()
	for _, k := range keys {
		p.send(k)
		time.Sleep(60 * time.Millisecond)
	}
}

// resize sets the window's size.
func (p *tmuxTerm) resize(width, height int) error {
	out, err := p.run("resize-window", "-t", p.name, "-x", fmt.Sprint(width), "-y", fmt.Sprint(height))
	if err != nil {
		return fmt.Errorf("%v: %s", err, out)
	}
	return nil
}

// waitScreen waits until done holds for the screen and returns that
// screen, failing after p.wait; what names the wait in the failure. In a
// reporting session, the command ending first is a failure too.
func (p *tmuxTerm) waitScreen(what string, done func(string) bool) string {
	p.tb.Helper()
	deadline := time.Now().Add(p.wait)
	for {
		scr := p.screen()
		if done(scr) {
			return scr
		}
		if code := p.exitStatusIn(scr); code >= 0 {
			p.tb.Fatalf("likewind ended (status %d) before the screen showed %s; screen:\n%s", code, what, scr)
		}
		if time.Now().After(deadline) {
			p.tb.Fatalf("screen never showed %s within %v; last screen:\n%s", what, p.wait, scr)
		}
		time.Sleep(p.poll)
	}
}

// waitFor waits until the screen contains want and returns that screen.
func (p *tmuxTerm) waitFor(want string) string {
	p.tb.Helper()
	return p.waitScreen(strconv.Quote(want), func(s string) bool { return strings.Contains(s, want) })
}

// alive reports whether the session still runs (in a session that is not
// reporting, whether the command does).
func (p *tmuxTerm) alive() bool {
	return p.tmux("has-session", "-t", p.name).Run() == nil
}

// waitGone waits up to within for the session, and so the command, to
// end.
func (p *tmuxTerm) waitGone(within time.Duration) {
	p.tb.Helper()
	deadline := time.Now().Add(within)
	for p.alive() && time.Now().Before(deadline) {
		time.Sleep(20 * time.Millisecond)
	}
	if p.alive() {
		p.tb.Fatalf("likewind still running %v after it was told to end; screen:\n%s", within, p.screen())
	}
}

// exitStatus is the status a reporting session printed when its command
// ended, or -1 while the command runs (always -1 when not reporting).
func (p *tmuxTerm) exitStatus() int {
	if !p.reports {
		return -1
	}
	return p.exitStatusIn(p.screen())
}

// waitExit waits up to within for a reporting session's command to end
// and returns its exit status.
func (p *tmuxTerm) waitExit(within time.Duration) int {
	p.tb.Helper()
	deadline := time.Now().Add(within)
	for {
		if code := p.exitStatus(); code >= 0 {
			return code
		}
		if time.Now().After(deadline) {
			p.tb.Fatalf("likewind still running %v after it was told to end (after a signal, a shutdown deadlock: see TestSignalSavesSession); screen:\n%s",
				within, p.screen())
		}
		time.Sleep(50 * time.Millisecond)
	}
}

func (p *tmuxTerm) exitStatusIn(scr string) int {
	if !p.reports {
		return -1
	}
	m := tmuxExitLine.FindStringSubmatch(scr)
	if m == nil {
		return -1
	}
	n, _ := strconv.Atoi(m[1])
	return n
}

// programPID is the pid of the program in a reporting session: the only
// child of the wrapper shell. Skips where /proc does not list children. A
// program still running when the test ends is killed, so that a failure
// leaves nothing behind.
func (p *tmuxTerm) programPID() int {
	p.tb.Helper()
	if !p.reports {
		p.tb.Fatal("programPID needs a reporting session (startTmuxReporting)")
	}
	out, err := p.run("display-message", "-p", "-t", p.name, "#{pane_pid}")
	if err != nil {
		p.tb.Fatalf("tmux pane pid: %v\n%s", err, out)
	}
	sh := strings.TrimSpace(string(out))
	children, err := os.ReadFile(filepath.Join("/proc", sh, "task", sh, "children"))
	if err != nil {
		p.tb.Skipf("cannot find the child of the wrapper shell %s: %v", sh, err)
	}
	fields := strings.Fields(string(children))
	if len(fields) != 1 {
		p.tb.Fatalf("wrapper shell %s has children %q, want likewind alone", sh, fields)
	}
	pid, err := strconv.Atoi(fields[0])
	if err != nil || pid <= 1 {
		p.tb.Fatalf("likewind pid %q: %v", fields[0], err)
	}
	p.tb.Cleanup(func() {
		if p.exitStatus() < 0 {
			_ = syscall.Kill(pid, syscall.SIGKILL)
		}
	})
	return pid
}

// header is the screen's first lines (title and what-if values).
func header(scr string) string {
	lines := strings.SplitN(scr, "\n", 4)
	return strings.Join(lines[:min(3, len(lines))], "\n")
}

// buildLikewind compiles the command into a temporary folder.
func buildLikewind(tb testing.TB) string {
	tb.Helper()
	bin := filepath.Join(tb.TempDir(), "likewind")
	out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput()
	if err != nil {
		tb.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}
