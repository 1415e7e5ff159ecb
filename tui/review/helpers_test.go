package review

import (
	"crypto/ed25519"
	"crypto/rand"
	"io"
	"net"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/charmbracelet/x/ansi"
	gossh "golang.org/x/crypto/ssh"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/tui"
)

// testKey is a reviewer's key made in the test.
type testKey struct {
	signer  gossh.Signer
	comment string
}

func newTestKey(t testing.TB, comment string) testKey {
	t.Helper()
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	s, err := gossh.NewSignerFromKey(priv)
	if err != nil {
		t.Fatal(err)
	}
	return testKey{signer: s, comment: comment}
}

// line is the key's authorized-keys line with the given options.
func (k testKey) line(opts string) string {
	l := strings.TrimSpace(string(gossh.MarshalAuthorizedKey(k.signer.PublicKey())))
	if opts != "" {
		l = opts + " " + l
	}
	return l + " " + k.comment
}

// testServer is a review server on 127.0.0.1:0 on the demo.
type testServer struct {
	addr string
	hub  *Hub
	srv  *Server
	host gossh.PublicKey
	sf   *session.File
}

type serverOpt func(*Config)

func startServer(t testing.TB, keysText string, opts ...serverOpt) *testServer {
	t.Helper()
	keys, err := ParseKeys("test_keys", []byte(keysText))
	if err != nil {
		t.Fatalf("ParseKeys: %v", err)
	}
	host, _, err := HostKey(filepath.Join(t.TempDir(), "host_key"))
	if err != nil {
		t.Fatalf("HostKey: %v", err)
	}
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "review.json")
	hash := session.DataHash(v, facs)
	sf, err := session.Open(path, nil, hash)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { sf.Close() })
	base := tui.New(tui.Options{Vehicle: v, Facilities: facs, InputHash: hash})
	hub := NewHub(base, sf, false, nil)
	cfg := Config{Hub: hub, Base: base, Keys: keys, Host: host, SessionPath: path, DumpDir: t.TempDir()}
	for _, o := range opts {
		o(&cfg)
	}
	srv, err := NewServer(cfg)
	if err != nil {
		t.Fatal(err)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	go func() { _ = srv.Serve(ln) }()
	t.Cleanup(func() {
		_ = srv.Close()
		hub.Close()
	})
	return &testServer{addr: ln.Addr().String(), hub: hub, srv: srv, host: host.PublicKey(), sf: sf}
}

// client is one reviewer's SSH connection with a pty, reading the screen
// bytes as they come.
type client struct {
	t     testing.TB
	conn  *gossh.Client
	sess  *gossh.Session
	stdin io.WriteCloser

	mu  sync.Mutex
	out []byte
}

// dial connects with auth and returns the client or the error.
func dial(ts *testServer, auth ...gossh.AuthMethod) (*gossh.Client, error) {
	cfg := &gossh.ClientConfig{
		User:            "reviewer",
		Auth:            auth,
		HostKeyCallback: gossh.FixedHostKey(ts.host),
		Timeout:         10 * time.Second,
	}
	return gossh.Dial("tcp", ts.addr, cfg)
}

// connect opens a session at w×h with the key and the environment env
// (name=value pairs).
func connect(t testing.TB, ts *testServer, k testKey, w, h int, env ...string) *client {
	t.Helper()
	conn, err := dial(ts, gossh.PublicKeys(k.signer))
	if err != nil {
		t.Fatalf("dial as %s: %v", k.comment, err)
	}
	sess, err := conn.NewSession()
	if err != nil {
		t.Fatalf("session: %v", err)
	}
	for _, kv := range env {
		name, val, _ := strings.Cut(kv, "=")
		_ = sess.Setenv(name, val) // the server takes every variable
	}
	if err := sess.RequestPty("xterm-256color", h, w, gossh.TerminalModes{}); err != nil {
		t.Fatalf("pty: %v", err)
	}
	stdin, err := sess.StdinPipe()
	if err != nil {
		t.Fatal(err)
	}
	stdout, err := sess.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	stderr, err := sess.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	c := &client{t: t, conn: conn, sess: sess, stdin: stdin}
	// Standard output and error go to one screen, as in a terminal.
	for _, r := range []io.Reader{stdout, stderr} {
		go func() {
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
		}()
	}
	if err := sess.Shell(); err != nil {
		t.Fatalf("shell: %v", err)
	}
	t.Cleanup(c.close)
	return c
}

func (c *client) close() {
	_ = c.sess.Close()
	_ = c.conn.Close()
}

// raw is every byte received so far; mark is its length, to wait for what
// comes after.
func (c *client) raw() []byte {
	c.mu.Lock()
	defer c.mu.Unlock()
	return append([]byte(nil), c.out...)
}

func (c *client) mark() int {
	c.mu.Lock()
	defer c.mu.Unlock()
	return len(c.out)
}

// text is what came since mark, without escape sequences.
func (c *client) text(from int) string {
	c.mu.Lock()
	defer c.mu.Unlock()
	from = min(from, len(c.out))
	return ansi.Strip(string(c.out[from:]))
}

// send types keys (bytes as a terminal sends them).
func (c *client) send(keys string) {
	c.t.Helper()
	if _, err := io.WriteString(c.stdin, keys); err != nil {
		c.t.Fatalf("send %q: %v", keys, err)
	}
}

// keys types keys one at a time, as a person would (keys sent together
// arrive as one run of characters).
func (c *client) keys(keys ...string) {
	c.t.Helper()
	for _, k := range keys {
		c.send(k)
		time.Sleep(30 * time.Millisecond)
	}
}

// waitFor waits until the text since from contains want, and returns
// that text.
func (c *client) waitFor(from int, want string) string {
	c.t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for {
		s := c.text(from)
		if strings.Contains(s, want) {
			return s
		}
		if time.Now().After(deadline) {
			c.t.Fatalf("screen never showed %q; last text:\n%s", want, tail(s, 3000))
		}
		time.Sleep(10 * time.Millisecond)
	}
}

// settle waits until no screen bytes have come for 250 ms (at most 15 s):
// the keys sent so far are drawn.
func (c *client) settle() {
	deadline := time.Now().Add(15 * time.Second)
	last, since := c.mark(), time.Now()
	for time.Now().Before(deadline) {
		time.Sleep(10 * time.Millisecond)
		if n := c.mark(); n != last {
			last, since = n, time.Now()
		} else if time.Since(since) >= 250*time.Millisecond {
			return
		}
	}
}

// waitMatch waits until the text since from matches re and returns the
// last match's first group.
func (c *client) waitMatch(from int, re *regexp.Regexp) string {
	c.t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for {
		s := c.text(from)
		if m := re.FindAllStringSubmatch(s, -1); len(m) > 0 {
			return m[len(m)-1][1]
		}
		if time.Now().After(deadline) {
			c.t.Fatalf("screen never matched %v; last text:\n%s", re, tail(s, 3000))
		}
		time.Sleep(10 * time.Millisecond)
	}
}

func tail(s string, n int) string {
	if len(s) > n {
		return s[len(s)-n:]
	}
	return s
}

// waitHub waits until cond holds of the hub's state.
func waitHub(t testing.TB, h *Hub, what string, cond func(tui.Shared) bool) {
	t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for !cond(h.Current()) {
		if time.Now().After(deadline) {
			t.Fatalf("hub never reached: %s", what)
		}
		time.Sleep(5 * time.Millisecond)
	}
}
