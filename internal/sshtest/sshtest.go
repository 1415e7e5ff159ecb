// Package sshtest is test support for the SSH review tests (tui/review and
// cmd/likewind): a reviewer's session with a pty whose screen bytes are
// collected as they come, to type keys into and wait on. Only tests import
// it; no product code does.
package sshtest

import (
	"io"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/charmbracelet/x/ansi"
	gossh "golang.org/x/crypto/ssh"
)

// Client is one session with a pty on an SSH connection. Standard output
// and error are collected into one buffer, as a terminal shows them.
type Client struct {
	Conn  *gossh.Client
	Sess  *gossh.Session
	Stdin io.WriteCloser
	// Wait bounds WaitFor and WaitMatch: generous, since a loaded machine
	// may be slow to draw; it only stops a broken run from hanging.
	Wait time.Duration

	tb  testing.TB
	mu  sync.Mutex
	out []byte
}

// Open opens a session on conn with a pty of the terminal type term at
// width×height and the environment env (name=value pairs, each sent as
// is; a server may refuse some), starts reading its output and starts the
// shell. The session and connection are closed when the test ends.
func Open(tb testing.TB, conn *gossh.Client, term string, width, height int, env ...string) *Client {
	tb.Helper()
	sess, err := conn.NewSession()
	if err != nil {
		tb.Fatalf("ssh session: %v", err)
	}
	for _, kv := range env {
		name, val, _ := strings.Cut(kv, "=")
		_ = sess.Setenv(name, val)
	}
	if err := sess.RequestPty(term, height, width, gossh.TerminalModes{}); err != nil {
		tb.Fatalf("ssh pty: %v", err)
	}
	stdin, err := sess.StdinPipe()
	if err != nil {
		tb.Fatal(err)
	}
	stdout, err := sess.StdoutPipe()
	if err != nil {
		tb.Fatal(err)
	}
	stderr, err := sess.StderrPipe()
	if err != nil {
		tb.Fatal(err)
	}
	c := &Client{Conn: conn, Sess: sess, Stdin: stdin, Wait: 15 * time.Second, tb: tb}
	for _, r := range []io.Reader{stdout, stderr} {
		go c.collect(r)
	}
	if err := sess.Shell(); err != nil {
		tb.Fatalf("ssh shell: %v", err)
	}
	tb.Cleanup(c.Close)
	return c
}

// collect appends what r gives to the buffer until r ends.
func (c *Client) collect(r io.Reader) {
	buf := make([]byte, 32<<10)
	for {
		n, err := r.Read(buf)
		c.mu.Lock()
		c.out = append(c.out, buf[:n]...)
		c.mu.Unlock()
		if err != nil {
			return
		}
	}
}

// Close closes the session and the connection.
func (c *Client) Close() {
	_ = c.Sess.Close()
	_ = c.Conn.Close()
}

// Raw is a copy of every byte received so far.
func (c *Client) Raw() []byte {
	c.mu.Lock()
	defer c.mu.Unlock()
	return append([]byte(nil), c.out...)
}

// Mark is the number of bytes received so far, to read or wait for what
// comes after.
func (c *Client) Mark() int {
	c.mu.Lock()
	defer c.mu.Unlock()
	return len(c.out)
}

// Text is what came since the mark from, without escape sequences.
func (c *Client) Text(from int) string {
	c.mu.Lock()
	defer c.mu.Unlock()
	from = min(from, len(c.out))
	return ansi.Strip(string(c.out[from:]))
}

// Send types keys (bytes as a terminal sends them) in one write.
func (c *Client) Send(keys string) {
	c.tb.Helper()
	if _, err := io.WriteString(c.Stdin, keys); err != nil {
		c.tb.Fatalf("send %q: %v", keys, err)
	}
}

// Keys types keys one at a time with a pause after each, as a person
// would (keys sent together arrive as one run of characters).
func (c *Client) Keys(keys ...string) {
	c.tb.Helper()
	for _, k := range keys {
		c.Send(k)
		time.Sleep(30 * time.Millisecond)
	}
}

// WaitFor waits until the text since from contains want and returns that
// text, failing the test after c.Wait.
func (c *Client) WaitFor(from int, want string) string {
	c.tb.Helper()
	deadline := time.Now().Add(c.Wait)
	for {
		s := c.Text(from)
		if strings.Contains(s, want) {
			return s
		}
		if time.Now().After(deadline) {
			c.tb.Fatalf("screen never showed %q within %v; last text:\n%s", want, c.Wait, Tail(s, 3000))
		}
		time.Sleep(10 * time.Millisecond)
	}
}

// WaitMatch waits until the text since from matches re and returns the
// last match's first group, failing the test after c.Wait.
func (c *Client) WaitMatch(from int, re *regexp.Regexp) string {
	c.tb.Helper()
	deadline := time.Now().Add(c.Wait)
	for {
		s := c.Text(from)
		if m := re.FindAllStringSubmatch(s, -1); len(m) > 0 {
			return m[len(m)-1][1]
		}
		if time.Now().After(deadline) {
			c.tb.Fatalf("screen never matched %v within %v; last text:\n%s", re, c.Wait, Tail(s, 3000))
		}
		time.Sleep(10 * time.Millisecond)
	}
}

// Settle waits until no bytes have come for 250 ms (at most 15 s): the
// keys sent so far are drawn.
func (c *Client) Settle() {
	deadline := time.Now().Add(15 * time.Second)
	last, since := c.Mark(), time.Now()
	for time.Now().Before(deadline) {
		time.Sleep(10 * time.Millisecond)
		if n := c.Mark(); n != last {
			last, since = n, time.Now()
		} else if time.Since(since) >= 250*time.Millisecond {
			return
		}
	}
}

// Tail is the last n bytes of s (all of s when shorter).
func Tail(s string, n int) string {
	if len(s) > n {
		return s[len(s)-n:]
	}
	return s
}
