package review

import (
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"

	"likewind/internal/sshtest"
	"likewind/tui"
)

// The reviewers of the tests (invented names).
func reviewers(t *testing.T) (alice, bob, vera testKey, keys string) {
	alice = newTestKey(t, "alice@lab-a")
	bob = newTestKey(t, "bob@lab-b")
	vera = newTestKey(t, "vera@lab-c")
	keys = alice.line("likewind-role=editor") + "\n" + bob.line(`likewind-role="editor"`) + "\n" + vera.line("") + "\n"
	return
}

func TestReviewerSeesTheInterface(t *testing.T) {
	alice, _, _, keys := reviewers(t)
	ts := startServer(t, keys)
	c := connect(t, ts, alice, 120, 40)
	s := c.WaitFor(0, "review: alice@lab-a (editor)")
	if !strings.Contains(s, "likewind |") {
		t.Errorf("no header on the screen:\n%s", sshtest.Tail(s, 2000))
	}
}

func TestUnknownKeyRefused(t *testing.T) {
	_, _, _, keys := reviewers(t)
	ts := startServer(t, keys)
	stranger := newTestKey(t, "mallory@elsewhere")
	refused(t, ts, "a key not in the authorized keys", "unable to authenticate", gossh.PublicKeys(stranger.signer))
}

// refused checks that a login with auth is refused with an error
// containing want, and leaves no reviewer in the hub.
func refused(t *testing.T, ts *testServer, what, want string, auth ...gossh.AuthMethod) {
	t.Helper()
	conn, err := dial(ts, auth...)
	if err == nil {
		conn.Close()
		t.Fatalf("%s was admitted", what)
	}
	if !strings.Contains(err.Error(), want) {
		t.Errorf("%s: dial error = %v, want %q", what, err, want)
	}
	if n := ts.hub.Connected(); n != 0 {
		t.Errorf("%d reviewers in the hub after %s was refused, want 0", n, what)
	}
}

func TestPasswordAndKeyboardInteractiveRefused(t *testing.T) {
	_, _, _, keys := reviewers(t)
	ts := startServer(t, keys)
	ki := gossh.KeyboardInteractive(func(string, string, []string, []bool) ([]string, error) { return []string{"secret"}, nil })
	// The server offers public keys only: the client has nothing it may
	// try after "none".
	refused(t, ts, "password or keyboard-interactive login", "attempted methods [none], no supported methods remain",
		gossh.Password("secret"), ki)
}

func TestEditorsSeeEachOthersWhatIf(t *testing.T) {
	alice, bob, _, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	b := connect(t, ts, bob, 120, 40)
	a.WaitFor(0, "review: alice")
	b.WaitFor(0, "review: bob")
	scale0 := ts.hub.Current().Settings().Scale

	mb := b.Mark()
	a.Send("+") // the model scale a step up, for every facility
	b.WaitFor(mb, "by alice@lab-a")
	waitHub(t, ts.hub, "alice's scale computed", func(s tui.Shared) bool { return s.Rev() == 1 && !s.Pending() })
	scale1 := ts.hub.Current().Settings().Scale
	if !(scale1 > 0) || scale1 == scale0 {
		t.Fatalf("scale after + = %v (before %v), want a new what-if scale", scale1, scale0)
	}

	ma := a.Mark()
	b.Send("-")
	a.WaitFor(ma, "by bob@lab-b")
	waitHub(t, ts.hub, "bob's scale computed", func(s tui.Shared) bool { return s.Rev() == 2 && !s.Pending() })
	if s := ts.hub.Current(); s.By() != "bob@lab-b" || !strings.Contains(s.What(), "model scale") {
		t.Errorf("latest change = %q by %q, want bob's model scale", s.What(), s.By())
	}
	if got := ts.hub.Current().Settings().Scale; got >= scale1 {
		t.Errorf("scale after bob's - = %v, want below alice's %v", got, scale1)
	}
}

func TestViewerCannotChangeSharedState(t *testing.T) {
	alice, _, vera, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	v := connect(t, ts, vera, 120, 40)
	a.WaitFor(0, "review: alice")
	v.WaitFor(0, "review: vera@lab-c (viewer)")
	unit := []string{"altitude ft", "altitude m"}
	refused := func(n int, k string) {
		t.Helper()
		m := v.Mark()
		v.Send(k)
		v.WaitFor(m, "viewer: the shared evaluation is not changed")
		// A key of the viewer's own view clears the message, so the
		// next refusal is drawn anew.
		m = v.Mark()
		v.Send("u")
		v.WaitFor(m, unit[n%2])
	}
	for n, k := range []string{" ", "+", "M"} {
		refused(n, k)
	}
	// Let any change reach the hub before looking.
	time.Sleep(100 * time.Millisecond)
	if s := ts.hub.Current(); s.Rev() != 0 || s.Marks() != 0 {
		t.Errorf("after a viewer's keys: rev %d, %d marks; want 0, 0", s.Rev(), s.Marks())
	}
	// An editor's mark does change it, and the viewer sees who.
	m := v.Mark()
	a.Send(" ")
	v.WaitFor(m, "by alice@lab-a")
	if s := ts.hub.Current(); s.Marks() != 1 {
		t.Errorf("after alice's mark: %d marks, want 1", s.Marks())
	}
	// Neither undo nor clearing takes it away.
	refused(1, "U")
	refused(0, "X")
	time.Sleep(100 * time.Millisecond)
	if s := ts.hub.Current(); s.Rev() != 1 || s.Marks() != 1 {
		t.Errorf("after the viewer's U and X: rev %d, %d marks; want 1, 1", s.Rev(), s.Marks())
	}
}

var flightAlt = regexp.MustCompile(`FLIGHT (\d+) m`)

func TestFollowTracksThePresenter(t *testing.T) {
	alice, _, vera, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	a.WaitFor(0, "review: alice")
	v := connect(t, ts, vera, 120, 40)
	// A viewer joining with a presenter in follows at once.
	v.WaitFor(0, "following the presenter")
	start := v.WaitMatch(0, flightAlt)

	ma, mv := a.Mark(), v.Mark()
	a.Keys("k", "k", "k") // three rows up
	want := waitChange(t, a, ma, start)
	if got := waitValue(t, v, mv, want); got != want {
		t.Errorf("follower's flight altitude = %s m, want the presenter's %s m", got, want)
	}

	// Moving on one's own ends following; the presenter's moves then
	// leave the view alone.
	mv = v.Mark()
	v.Send("j")
	v.WaitFor(mv, "follow off")
	own := v.WaitMatch(mv, flightAlt)
	mv = v.Mark()
	a.Keys("k", "k")
	a.Settle()
	v.Settle()
	if got := v.Text(mv); flightAlt.MatchString(got) {
		if m := flightAlt.FindAllStringSubmatch(got, -1); m[len(m)-1][1] != own {
			t.Errorf("not following, the view moved to %s m with the presenter", m[len(m)-1][1])
		}
	}
	// F follows again and jumps to the presenter.
	a.Settle()
	aAlt := a.WaitMatch(0, flightAlt)
	mv = v.Mark()
	v.Send("F")
	v.WaitFor(mv, "following alice@lab-a")
	v.Settle()
	if got := v.WaitMatch(mv, flightAlt); got != aAlt {
		t.Errorf("after F the view is at %s m, want the presenter's %s m", got, aAlt)
	}
}

// waitChange waits until c's flight altitude differs from old and returns it.
func waitChange(t *testing.T, c *sshtest.Client, from int, old string) string {
	t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for time.Now().Before(deadline) {
		if m := flightAlt.FindAllStringSubmatch(c.Text(from), -1); len(m) > 0 && m[len(m)-1][1] != old {
			// Let the keys typed together settle.
			c.Settle()
			m = flightAlt.FindAllStringSubmatch(c.Text(from), -1)
			return m[len(m)-1][1]
		}
		time.Sleep(10 * time.Millisecond)
	}
	t.Fatalf("flight altitude never changed from %s", old)
	return ""
}

// waitValue waits until c's flight altitude is want (or times out) and
// returns the last one shown.
func waitValue(t *testing.T, c *sshtest.Client, from int, want string) string {
	t.Helper()
	deadline := time.Now().Add(5 * time.Second)
	last := ""
	for time.Now().Before(deadline) {
		if m := flightAlt.FindAllStringSubmatch(c.Text(from), -1); len(m) > 0 {
			last = m[len(m)-1][1]
			if last == want {
				return last
			}
		}
		time.Sleep(10 * time.Millisecond)
	}
	return last
}

func TestDroppedClientLeavesOthersWorking(t *testing.T) {
	alice, bob, vera, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	b := connect(t, ts, bob, 120, 40)
	v := connect(t, ts, vera, 100, 30)
	a.WaitFor(0, "review: alice")
	b.WaitFor(0, "review: bob")
	v.WaitFor(0, "review: vera")
	// Bob's connection dies mid-session: the TCP connection closed
	// without a goodbye.
	b.Send("k")
	b.Conn.Conn.Close()
	waitHubConns(t, ts.hub, 2)
	mv := v.Mark()
	a.Send(" ")
	v.WaitFor(mv, "by alice@lab-a")
	ma := a.Mark()
	a.Send("u")
	a.WaitFor(ma, "altitude ft")
	if s := ts.hub.Current(); s.Marks() != 1 {
		t.Errorf("%d marks after alice's mark, want 1", s.Marks())
	}
}

func waitHubConns(t *testing.T, h *Hub, n int) {
	t.Helper()
	deadline := time.Now().Add(15 * time.Second)
	for h.Connected() != n {
		if time.Now().After(deadline) {
			t.Fatalf("hub has %d reviewers, want %d", h.Connected(), n)
		}
		time.Sleep(10 * time.Millisecond)
	}
}

func TestConnectionLimitRefusesWithOneLine(t *testing.T) {
	alice, bob, vera, keys := reviewers(t)
	ts := startServer(t, keys, func(c *Config) { c.MaxConns = 2 })
	a := connect(t, ts, alice, 100, 30)
	b := connect(t, ts, bob, 100, 30)
	a.WaitFor(0, "review: alice")
	b.WaitFor(0, "review: bob")
	v := connect(t, ts, vera, 100, 30)
	s := v.WaitFor(0, "likewind: this review is full (2 reviewers); try again later")
	if strings.Contains(s, "likewind |") || strings.Count(strings.TrimSpace(s), "\n") > 0 {
		t.Errorf("past the limit the client got more than the one line:\n%q", s)
	}
	if n := ts.hub.Connected(); n != 2 {
		t.Errorf("%d reviewers in the hub, want the 2 admitted", n)
	}
	// One leaving makes room.
	a.Close()
	waitHubConns(t, ts.hub, 1)
	v2 := connect(t, ts, vera, 100, 30)
	v2.WaitFor(0, "review: vera")
}

func TestColourProfilePerConnection(t *testing.T) {
	alice, bob, _, keys := reviewers(t)
	ts := startServer(t, keys)
	colour := connect(t, ts, alice, 120, 40)
	plain := connect(t, ts, bob, 120, 40, "NO_COLOR=1")
	colour.WaitFor(0, "review: alice")
	plain.WaitFor(0, "review: bob")
	if !hasColour(colour.Raw()) {
		t.Error("the xterm-256color client got no colour")
	}
	if hasColour(plain.Raw()) {
		t.Error("the NO_COLOR client got colour")
	}
}

// sgr is a Select Graphic Rendition sequence.
var sgr = regexp.MustCompile(`\x1b\[([0-9;]*)m`)

// hasColour reports whether b sets a foreground or background colour
// (SGR 30–38, 40–48, 90–97, 100–107), as opposed to bold, faint or
// reverse alone.
func hasColour(b []byte) bool {
	for _, m := range sgr.FindAllSubmatch(b, -1) {
		for _, p := range strings.Split(string(m[1]), ";") {
			n, err := strconv.Atoi(p)
			if err == nil && (n >= 30 && n <= 38 || n >= 40 && n <= 48 || n >= 90 && n <= 97 || n >= 100 && n <= 107) {
				return true
			}
		}
	}
	return false
}

func TestWhatIfDeltaTShownWithWho(t *testing.T) {
	alice, bob, _, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	b := connect(t, ts, bob, 120, 40)
	a.WaitFor(0, "review: alice")
	b.WaitFor(0, "review: bob")
	mb := b.Mark()
	// The what-if editor: ΔT is the second field.
	a.Keys("e", "\x1b[B", "\r", "\x15", "-", "1", "0", "K", "\r")
	s := b.WaitFor(mb, "by alice@lab-a")
	if !strings.Contains(s, "what-if ΔT of day -10.0 K by alice@lab-a") {
		t.Errorf("bob's status does not name the ΔT change:\n%s", sshtest.Tail(s, 1500))
	}
	waitHub(t, ts.hub, "ΔT computed", func(s tui.Shared) bool { return !s.Pending() && s.Settings().DeltaT == -10 })
}

func TestViewerDumpsOnlyWhenAllowed(t *testing.T) {
	alice := newTestKey(t, "alice@lab-a")
	vNo, vYes := newTestKey(t, "vno@lab"), newTestKey(t, "vyes@lab")
	dir := t.TempDir()
	ts := startServer(t, alice.line("likewind-role=editor")+"\n"+vNo.line("")+"\n"+vYes.line("likewind-dumps")+"\n",
		func(c *Config) { c.DumpDir = dir })
	no := connect(t, ts, vNo, 120, 40)
	yes := connect(t, ts, vYes, 120, 40)
	no.WaitFor(0, "review: vno")
	yes.WaitFor(0, "review: vyes")
	m := no.Mark()
	no.Send("w")
	s := no.WaitFor(m, "this key may not write dumps on the server")
	if strings.Contains(s, "view written to") {
		t.Errorf("a viewer without likewind-dumps wrote a dump:\n%s", sshtest.Tail(s, 800))
	}
	if files, _ := os.ReadDir(dir); len(files) != 0 {
		t.Errorf("dump folder holds %d files after the refused viewer's w, want 0", len(files))
	}
	m = yes.Mark()
	yes.Send("w")
	yes.WaitFor(m, "view written to")
	if files, _ := os.ReadDir(dir); len(files) != 1 || !strings.HasSuffix(files[0].Name(), ".txt") {
		t.Errorf("dump folder after the allowed viewer's w: %v, want one text dump", files)
	}
}

func TestKeysArrivingTogetherEachCount(t *testing.T) {
	alice, _, _, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	a.WaitFor(0, "review: alice")
	start := a.WaitMatch(0, flightAlt)
	// "kkk" in one write arrives as one run of characters: three rows up.
	m := a.Mark()
	a.Send("kkk")
	got := waitChange(t, a, m, start)
	m = a.Mark()
	a.Keys("j", "j", "j")
	back := waitChange(t, a, m, got)
	if back != start {
		t.Errorf("kkk then j j j ends at %s m, want the start %s m (kkk moved other than three rows)", back, start)
	}
}

func TestIdleConnectionEnds(t *testing.T) {
	alice, bob, _, keys := reviewers(t)
	ts := startServer(t, keys, func(c *Config) { c.IdleTimeout = 500 * time.Millisecond })
	a := connect(t, ts, alice, 100, 30)
	a.WaitFor(0, "review: alice")
	// Bob keeps typing; alice does nothing.
	b := connect(t, ts, bob, 100, 30)
	b.WaitFor(0, "review: bob")
	done := make(chan error, 1)
	go func() { done <- a.Sess.Wait() }()
	deadline := time.After(10 * time.Second)
	tick := time.NewTicker(100 * time.Millisecond)
	defer tick.Stop()
	for n := 0; ; n++ {
		select {
		case <-done:
			// Bob, who kept typing, is still in.
			m := b.Mark()
			b.Send("u")
			b.WaitFor(m, "altitude")
			waitHubConns(t, ts.hub, 1)
			return
		case <-tick.C:
			b.Send([]string{"k", "j"}[n%2])
		case <-deadline:
			t.Fatal("an idle connection was still open 10 s after a 0.5 s idle timeout")
		}
	}
}

func TestResizeAndQuitPerConnection(t *testing.T) {
	alice, bob, _, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	b := connect(t, ts, bob, 120, 40)
	a.WaitFor(0, "review: alice")
	b.WaitFor(0, "review: bob")
	// Alice's window shrinks: her screen says so, bob's stays.
	ma, mb := a.Mark(), b.Mark()
	if err := a.Sess.WindowChange(10, 40); err != nil {
		t.Fatal(err)
	}
	a.WaitFor(ma, "Terminal too small: 40×10")
	if s := b.Text(mb); strings.Contains(s, "too small") {
		t.Errorf("bob's screen changed with alice's window:\n%s", s)
	}
	// q leaves at once (the server keeps the work); bob stays in.
	done := make(chan error, 1)
	go func() { done <- a.Sess.Wait() }()
	a.Send("q")
	select {
	case <-done:
	case <-time.After(10 * time.Second):
		t.Fatal("q did not end alice's session")
	}
	waitHubConns(t, ts.hub, 1)
	mb = b.Mark()
	b.Send("u")
	b.WaitFor(mb, "altitude")
}
