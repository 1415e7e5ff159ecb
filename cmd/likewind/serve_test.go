package main

import (
	"bufio"
	"bytes"
	"crypto/ed25519"
	"crypto/rand"
	"fmt"
	"io"
	"net"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"

	"likewind/envelope/session"
	"likewind/internal/sshtest"
)

// serveProc is a likewind serve subprocess on 127.0.0.1:0.
type serveProc struct {
	t     *testing.T
	cmd   *exec.Cmd
	addr  string
	fp    string // host key fingerprint printed at start
	lines chan string
	mu    sync.Mutex
	out   []string
	exit  chan error
}

var (
	serveAddrLine = regexp.MustCompile(`^likewind review on (\S+) `)
	serveFPLine   = regexp.MustCompile(`^host key fingerprint (SHA256:\S+)$`)
)

func startServe(t *testing.T, bin, state string, args ...string) *serveProc {
	t.Helper()
	cmd := exec.Command(bin, append([]string{"serve", "--listen", "127.0.0.1:0"}, args...)...)
	cmd.Env = append(os.Environ(), "XDG_STATE_HOME="+state)
	cmd.Dir = t.TempDir()
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	p := &serveProc{t: t, cmd: cmd, lines: make(chan string, 100), exit: make(chan error, 1)}
	go func() {
		sc := bufio.NewScanner(stdout)
		for sc.Scan() {
			p.mu.Lock()
			p.out = append(p.out, sc.Text())
			p.mu.Unlock()
			p.lines <- sc.Text()
		}
		close(p.lines)
		p.exit <- cmd.Wait()
	}()
	t.Cleanup(func() {
		if cmd.ProcessState == nil {
			_ = cmd.Process.Kill()
		}
	})
	deadline := time.After(20 * time.Second)
	for p.addr == "" || p.fp == "" {
		select {
		case l, ok := <-p.lines:
			if !ok {
				t.Fatalf("likewind serve ended before it listened; stderr:\n%s", stderr.String())
			}
			if m := serveAddrLine.FindStringSubmatch(l); m != nil {
				p.addr = m[1]
			}
			if m := serveFPLine.FindStringSubmatch(l); m != nil {
				p.fp = m[1]
			}
		case <-deadline:
			t.Fatalf("likewind serve printed no address and fingerprint; stdout %q", p.output())
		}
	}
	return p
}

func (p *serveProc) output() string {
	p.mu.Lock()
	defer p.mu.Unlock()
	return strings.Join(p.out, "\n")
}

// stop sends sig and waits for the exit status.
func (p *serveProc) stop(sig syscall.Signal) error {
	p.t.Helper()
	if err := p.cmd.Process.Signal(sig); err != nil {
		p.t.Fatal(err)
	}
	go func() {
		for range p.lines { // the rest of standard output
		}
	}()
	select {
	case err := <-p.exit:
		return err
	case <-time.After(signalExitWait):
		p.t.Fatalf("likewind serve still running %v after %v", signalExitWait, sig)
	}
	return nil
}

// connectReview dials addr with signer, checking the host key against
// the fingerprint the server printed, and opens a session with a pty.
func connectReview(t *testing.T, addr, fp string, signer gossh.Signer) *sshtest.Client {
	t.Helper()
	cfg := &gossh.ClientConfig{
		User: "reviewer",
		Auth: []gossh.AuthMethod{gossh.PublicKeys(signer)},
		HostKeyCallback: func(_ string, _ net.Addr, key gossh.PublicKey) error {
			if got := gossh.FingerprintSHA256(key); got != fp {
				return fmt.Errorf("host key %s, the server printed %s", got, fp)
			}
			return nil
		},
		Timeout: 10 * time.Second,
	}
	conn, err := gossh.Dial("tcp", addr, cfg)
	if err != nil {
		t.Fatalf("dial: %v", err)
	}
	c := sshtest.Open(t, conn, "xterm", 100, 32)
	c.Wait = signalDrawWait
	return c
}

// TestServeSignalSavesAndRestartRestores starts likewind serve as a
// subprocess, marks a point and moves the model scale over SSH, ends the
// server with SIGTERM, SIGINT or SIGHUP, checks the session file is a
// valid session holding the work, and starts the server again on it.
func TestServeSignalSavesAndRestartRestores(t *testing.T) {
	if testing.Short() {
		t.Skip("subprocess test skipped in -short mode")
	}
	bin := buildLikewind(t)
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	signer, err := gossh.NewSignerFromKey(priv)
	if err != nil {
		t.Fatal(err)
	}
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT, syscall.SIGHUP} {
		t.Run(sig.String(), func(t *testing.T) {
			state := t.TempDir()
			keys := filepath.Join(state, "keys")
			line := "likewind-role=editor " + strings.TrimSpace(string(gossh.MarshalAuthorizedKey(signer.PublicKey()))) + " ada@test-lab\n"
			if err := os.WriteFile(keys, []byte(line), 0o600); err != nil {
				t.Fatal(err)
			}
			sessPath := filepath.Join(state, "review.json")
			p := startServe(t, bin, state, "--authorized-keys", keys, "--session", sessPath)
			if st, err := os.Stat(filepath.Join(state, "likewind", "review_host_ed25519")); err != nil || st.Mode().Perm() != 0o600 {
				t.Errorf("host key in the state folder: %v, mode %v; want it made 0600", err, st)
			}
			c := connectReview(t, p.addr, p.fp, signer)
			c.WaitFor(0, "review: ada@test-lab (editor)")
			c.Send(" ")
			c.WaitFor(0, "point marked (1 marked)")
			c.Send("+")
			c.WaitFor(0, "for all facilities, a step up")
			if err := p.stop(sig); err != nil {
				t.Fatalf("likewind serve after %v: %v; stdout:\n%s", sig, err, p.output())
			}
			s, err := session.Load(sessPath)
			if err != nil {
				t.Fatalf("session after %v: %v", sig, err)
			}
			if _, ok := s.WhatIf.Values["scale"]; len(s.Marks) != 1 || !ok {
				t.Errorf("saved session has %d marks and what-if %+v; want the mark and the scale", len(s.Marks), s.WhatIf)
			}
			if !strings.Contains(p.output(), "review ended; session in "+sessPath) {
				t.Errorf("no end line naming the session; stdout:\n%s", p.output())
			}

			// The next start restores it.
			p2 := startServe(t, bin, state, "--authorized-keys", keys, "--session", sessPath)
			if p2.fp != p.fp {
				t.Errorf("host key changed across restarts: %s then %s", p.fp, p2.fp)
			}
			c2 := connectReview(t, p2.addr, p2.fp, signer)
			c2.WaitFor(0, "review: ada@test-lab")
			if !strings.Contains(p2.output(), "session restored from "+sessPath+" (1 marks)") {
				t.Errorf("restart did not say it restored the session; stdout:\n%s", p2.output())
			}
			c2.Send("X")
			c2.WaitFor(0, "1 marks cleared")
			_ = p2.stop(syscall.SIGTERM)
		})
	}
}

// TestServeRefusesASessionInUse: a second server on the same session file
// is refused (the lock the single-user interface takes), and so are bad
// flags and a missing key file, each with a message saying why.
func TestServeRefusesASessionInUse(t *testing.T) {
	if testing.Short() {
		t.Skip("subprocess test skipped in -short mode")
	}
	bin := buildLikewind(t)
	state := t.TempDir()
	_, priv, _ := ed25519.GenerateKey(rand.Reader)
	signer, _ := gossh.NewSignerFromKey(priv)
	keys := filepath.Join(state, "keys")
	line := strings.TrimSpace(string(gossh.MarshalAuthorizedKey(signer.PublicKey()))) + " viewer@test-lab\n"
	if err := os.WriteFile(keys, []byte(line), 0o600); err != nil {
		t.Fatal(err)
	}
	sessPath := filepath.Join(state, "review.json")
	p := startServe(t, bin, state, "--authorized-keys", keys, "--session", sessPath)
	defer p.stop(syscall.SIGTERM)

	cases := []struct {
		name string
		args []string
		code int
		want string
	}{
		{"session in use", []string{"--authorized-keys", keys, "--session", sessPath}, 1, "in use by another likewind"},
		{"no keys file", []string{"--authorized-keys", filepath.Join(state, "none"), "--session", filepath.Join(state, "s2.json")}, 1, "not found: make it"},
		{"bad listen", []string{"--listen", "2290"}, 2, "expected host:port"},
		{"bad limit", []string{"--max-conns", "0"}, 2, "--max-conns 0: expected at least 1"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			cmd := exec.Command(bin, append([]string{"serve", "--listen", "127.0.0.1:0"}, c.args...)...)
			cmd.Env = append(os.Environ(), "XDG_STATE_HOME="+state)
			var stderr bytes.Buffer
			cmd.Stderr = &stderr
			err := cmd.Run()
			code := 0
			if ee, ok := err.(*exec.ExitError); ok {
				code = ee.ExitCode()
			}
			if code != c.code || !strings.Contains(stderr.String(), c.want) {
				t.Errorf("exit %d, stderr %q; want exit %d and %q", code, stderr.String(), c.code, c.want)
			}
		})
	}
}

func TestListenCautionOffLoopbackOnly(t *testing.T) {
	if c := listenCaution("127.0.0.1:2290"); c != "" {
		t.Errorf("loopback listen gives caution %q, want none", c)
	}
	for _, addr := range []string{"0.0.0.0:2290", "[::]:2290", "192.168.4.7:2290"} {
		if c := listenCaution(addr); !strings.Contains(c, "listen only on networks the lab trusts") {
			t.Errorf("listen on %s: caution %q, want the network caution", addr, c)
		}
	}
	o, err := parseServeFlags(nil, io.Discard)
	if err != nil || o.listen != defaultListen || !strings.HasPrefix(o.listen, "127.0.0.1:") {
		t.Errorf("default listen %q (%v), want a loopback address", o.listen, err)
	}
}
