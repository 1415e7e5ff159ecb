package review

import (
	"context"
	"errors"
	"fmt"
	"net"
	"strings"
	"sync"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/ssh"
	"github.com/charmbracelet/wish"
	bm "github.com/charmbracelet/wish/bubbletea"
	"github.com/muesli/termenv"
	gossh "golang.org/x/crypto/ssh"

	"likewind/tui"
)

// Defaults of the server's limits.
const (
	DefaultMaxConns    = 16
	DefaultIdleTimeout = 30 * time.Minute
)

// Config is what a review server needs.
type Config struct {
	Hub  *Hub
	Base tui.Model // the server's model: data and starting view
	Keys *Keys
	Host gossh.Signer
	// MaxConns is how many reviewers may be connected at once;
	// IdleTimeout ends a connection with no traffic for that long.
	MaxConns    int
	IdleTimeout time.Duration
	// DumpDir is where the write key puts dumps of those who may write
	// them ("" nobody).
	DumpDir     string
	SessionPath string
	Logf        func(format string, args ...any)
}

// Server is a running review server.
type Server struct {
	cfg    Config
	srv    *ssh.Server
	mu     sync.Mutex
	active int
}

type ctxKey struct{ name string }

var reviewerKey = &ctxKey{"reviewer"}

// NewServer builds the SSH server: public-key authentication only
// (password and keyboard-interactive are not offered), keys from
// cfg.Keys, each session a Bubble Tea program through wish's middleware.
func NewServer(cfg Config) (*Server, error) {
	if cfg.Hub == nil || cfg.Keys == nil || cfg.Host == nil {
		return nil, errors.New("review server: hub, keys and host key are required")
	}
	if cfg.MaxConns <= 0 {
		cfg.MaxConns = DefaultMaxConns
	}
	if cfg.IdleTimeout <= 0 {
		cfg.IdleTimeout = DefaultIdleTimeout
	}
	if cfg.Logf == nil {
		cfg.Logf = func(string, ...any) {}
	}
	s := &Server{cfg: cfg}
	srv, err := wish.NewServer(
		wish.WithPublicKeyAuth(s.admit),
		wish.WithIdleTimeout(cfg.IdleTimeout),
		wish.WithVersion("likewind-review"),
		wish.WithMiddleware(
			bm.MiddlewareWithProgramHandler(s.program, termenv.Ascii),
			s.gate,
		),
	)
	if err != nil {
		return nil, fmt.Errorf("review server: %w", err)
	}
	srv.AddHostKey(cfg.Host)
	s.srv = srv
	return s, nil
}

// admit is the public-key check: only keys of the authorized-keys file,
// before anything is drawn.
func (s *Server) admit(ctx ssh.Context, key ssh.PublicKey) bool {
	r, ok := s.cfg.Keys.Lookup(key)
	if !ok {
		s.cfg.Logf("refused key %s from %s: not in the authorized keys", gossh.FingerprintSHA256(key), ctx.RemoteAddr())
		return false
	}
	ctx.SetValue(reviewerKey, r)
	return true
}

// gate runs before the interface: one line of refusal past the
// connection limit or without a terminal; the reviewer leaves the hub
// when the interface ends.
func (s *Server) gate(next ssh.Handler) ssh.Handler {
	return func(sess ssh.Session) {
		if _, _, ok := sess.Pty(); !ok {
			wish.Fatalln(sess, "likewind: the review needs a terminal; connect with ssh -t")
			return
		}
		s.mu.Lock()
		full := s.active >= s.cfg.MaxConns
		if !full {
			s.active++
		}
		s.mu.Unlock()
		if full {
			s.cfg.Logf("refused %s: %d reviewers connected, the limit", sess.RemoteAddr(), s.cfg.MaxConns)
			wish.Fatalln(sess, fmt.Sprintf("likewind: this review is full (%d reviewers); try again later", s.cfg.MaxConns))
			return
		}
		defer func() {
			s.mu.Lock()
			s.active--
			s.mu.Unlock()
		}()
		r, ok := sess.Context().Value(reviewerKey).(Reviewer)
		if !ok {
			// Admitted by key but not by this server's check: no screen.
			wish.Fatalln(sess, "likewind: key not admitted")
			return
		}
		id := s.cfg.Hub.Join(r.Name, r.Editor)
		sess.Context().SetValue(idKey, id)
		defer s.cfg.Hub.Leave(id)
		next(sess)
	}
}

var idKey = &ctxKey{"id"}

// program is the reviewer's Bubble Tea program: their own size and
// colour profile (the client's TERM and NO_COLOR), on the shared state.
func (s *Server) program(sess ssh.Session) *tea.Program {
	r, _ := sess.Context().Value(reviewerKey).(Reviewer)
	id, ok := sess.Context().Value(idKey).(int)
	if !ok {
		return nil
	}
	pty, _, _ := sess.Pty()
	st := tui.NewStyles(sessionRenderer(sess, pty.Term))
	dumps := ""
	if r.Dumps {
		dumps = s.cfg.DumpDir
	}
	m := s.cfg.Base.Join(tui.Review{ID: id, Name: r.Name, Editor: r.Editor, Hub: s.cfg.Hub, SessionPath: s.cfg.SessionPath},
		&st, dumps, pty.Window.Width, pty.Window.Height)
	opts := append(bm.MakeOptions(sess), tea.WithAltScreen(), tea.WithoutSignalHandler(), tea.WithContext(sess.Context()))
	p := tea.NewProgram(m, opts...)
	s.cfg.Hub.Attach(id, p.Send)
	return p
}

// sessionRenderer is a lipgloss renderer for the client's terminal: the
// colour profile from the TERM of its pty request and the environment it
// sent (NO_COLOR honoured). It asks the terminal nothing (wish's own
// renderer waits for an answer about the background colour).
func sessionRenderer(sess ssh.Session, term string) *lipgloss.Renderer {
	if term == "" || term == "dumb" {
		return lipgloss.NewRenderer(sess, termenv.WithProfile(termenv.Ascii))
	}
	env := environ(append(append([]string(nil), sess.Environ()...), "TERM="+term))
	r := lipgloss.NewRenderer(sess, termenv.WithEnvironment(env), termenv.WithUnsafe(), termenv.WithColorCache(true))
	r.SetHasDarkBackground(true)
	return r
}

// environ is a client's environment for termenv.
type environ []string

func (e environ) Environ() []string { return e }

func (e environ) Getenv(k string) string {
	v := ""
	for _, kv := range e {
		if name, val, ok := strings.Cut(kv, "="); ok && name == k {
			v = val // the last one given counts
		}
	}
	return v
}

// Serve accepts reviewers on ln until Shutdown.
func (s *Server) Serve(ln net.Listener) error {
	err := s.srv.Serve(ln)
	if errors.Is(err, ssh.ErrServerClosed) {
		return nil
	}
	return err
}

// Shutdown stops accepting and ends every connection: each interface
// ends, and the hub keeps the work (the caller then flushes it). It waits
// for the interfaces to end until ctx is done.
func (s *Server) Shutdown(ctx context.Context) error {
	err := s.srv.Close()
	for {
		s.mu.Lock()
		n := s.active
		s.mu.Unlock()
		if n == 0 {
			return err
		}
		select {
		case <-ctx.Done():
			return errors.Join(err, fmt.Errorf("%d interfaces still ending", n))
		case <-time.After(10 * time.Millisecond):
		}
	}
}

// Close ends every connection at once.
func (s *Server) Close() error { return s.srv.Close() }

// Fingerprint is the host key's SHA256 fingerprint, for reviewers to
// check on their first connection.
func Fingerprint(host gossh.Signer) string { return gossh.FingerprintSHA256(host.PublicKey()) }

// IsLoopback reports whether a listen address (host:port) stays on this
// machine: a loopback IP or "localhost". An empty host listens on every
// interface.
func IsLoopback(addr string) bool {
	host, _, err := net.SplitHostPort(addr)
	if err != nil {
		return false
	}
	if strings.EqualFold(host, "localhost") {
		return true
	}
	ip := net.ParseIP(host)
	return ip != nil && ip.IsLoopback()
}
