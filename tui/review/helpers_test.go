package review

import (
	"crypto/ed25519"
	"crypto/rand"
	"net"
	"path/filepath"
	"strings"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/internal/sshtest"
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
// (name=value pairs; the server takes every variable).
func connect(t testing.TB, ts *testServer, k testKey, w, h int, env ...string) *sshtest.Client {
	t.Helper()
	conn, err := dial(ts, gossh.PublicKeys(k.signer))
	if err != nil {
		t.Fatalf("dial as %s: %v", k.comment, err)
	}
	return sshtest.Open(t, conn, "xterm-256color", w, h, env...)
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
