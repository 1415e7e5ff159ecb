package tui

import (
	"strings"
	"sync"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// fakeHub is a ReviewHub in one goroutine: Edit stores the change and
// counts it, and compute runs Shared.Compute when asked. (The real hub,
// with its programs and saves, is tui/review's, tested there over SSH.)
type fakeHub struct {
	mu       sync.Mutex
	cur      Shared
	changes  []Change
	computes int
}

func (h *fakeHub) Edit(id int, f func(Shared) (Shared, Change)) {
	h.mu.Lock()
	defer h.mu.Unlock()
	next, ch := f(h.cur)
	if ch != 0 {
		h.cur = next
		h.changes = append(h.changes, ch)
	}
}

func (h *fakeHub) Current() Shared {
	h.mu.Lock()
	defer h.mu.Unlock()
	return h.cur
}

func (h *fakeHub) compute() {
	h.mu.Lock()
	defer h.mu.Unlock()
	if h.cur.Pending() {
		h.computes++
		h.cur, _ = h.cur.WithResults(h.cur.Compute())
	}
}

// reviewPair is a base model on the demo with an editor and a viewer
// joined.
func reviewPair(t *testing.T) (h *fakeHub, ed, vw Model) {
	t.Helper()
	base := newDemo(t, 120, 40)
	h = &fakeHub{cur: base.Shared()}
	h.cur = h.cur.WithPresenter(1, "ed@lab")
	st := PlainStyles()
	ed = base.Join(Review{ID: 1, Name: "ed@lab", Editor: true, Hub: h}, &st, "", 120, 40)
	vw = base.Join(Review{ID: 2, Name: "vw\x1b[31m@lab", Hub: h}, &st, "", 120, 40)
	return h, ed, vw
}

func TestReviewJoinCleansNameAndFollows(t *testing.T) {
	_, ed, vw := reviewPair(t)
	if strings.Contains(vw.rv.Name, "\x1b") {
		t.Errorf("reviewer name %q keeps an escape", vw.rv.Name)
	}
	if !vw.rv.following || ed.rv.following {
		t.Errorf("following: viewer %v, editor %v; want the viewer following the presenter, the editor not", vw.rv.following, ed.rv.following)
	}
	if v := vw.View(); !strings.Contains(v, "review: vw\\x1b[31m@lab (viewer) · following the presenter") {
		t.Errorf("viewer's review line missing:\n%s", v)
	}
}

func TestReviewHelpShowsReviewKeysOnlyInReview(t *testing.T) {
	single, _ := press(newDemo(t, 120, 40), "?")
	_, ed, _ := reviewPair(t)
	ed, _ = press(ed, "?")
	if v := single.View(); strings.Contains(v, "follow presenter") || strings.Contains(v, "Review:") {
		t.Errorf("single-user help shows the review keys:\n%s", v)
	}
	if v := ed.View(); !strings.Contains(v, "F follow presenter") || !strings.Contains(v, "P present (editors)") || !strings.Contains(v, "Review:") {
		t.Errorf("review help lacks F, P or the Review paragraph:\n%s", v)
	}
}

func TestReviewMarkReachesTheOtherWithWho(t *testing.T) {
	h, ed, vw := reviewPair(t)
	ed, _ = press(ed, " ")
	if got := h.Current().Marks(); got != 1 || len(h.changes) != 1 || h.changes[0]&ChangeWork == 0 {
		t.Fatalf("hub after the editor's mark: %d marks, changes %v; want 1 mark, one work change", got, h.changes)
	}
	vw, _ = drive(vw, ReviewChangedMsg{})
	if len(vw.marks) != 1 || vw.status != "point marked (1 marked) by ed@lab" {
		t.Errorf("viewer: %d marks, status %q; want the mark and who made it", len(vw.marks), vw.status)
	}
	if ed.status != "point marked (1 marked)" {
		t.Errorf("editor's own status = %q, want no 'by' for one's own change", ed.status)
	}
}

func TestReviewViewerChangePutBack(t *testing.T) {
	h, _, vw := reviewPair(t)
	for _, k := range []string{" ", "+", "M"} {
		vw, _ = press(vw, k)
		if len(vw.marks) != 0 || vw.set != h.Current().Settings() || !vw.statusErr {
			t.Errorf("viewer key %q: %d marks, set changed %v, status %q; want nothing changed and an error", k, len(vw.marks), vw.set != h.Current().Settings(), vw.status)
		}
	}
	if len(h.changes) != 0 {
		t.Errorf("hub took %d changes from a viewer, want none", len(h.changes))
	}
}

func TestReviewWhatIfComputedOnceByTheHub(t *testing.T) {
	h, ed, vw := reviewPair(t)
	before := h.Current().Settings().Scale
	var cmd tea.Cmd
	next, cmd := ed.Update(keyMsg("+"))
	ed = next.(Model)
	if !h.Current().Pending() || !ed.busy {
		t.Fatalf("after +: hub pending %v, editor busy %v; want both", h.Current().Pending(), ed.busy)
	}
	if cmd != nil {
		if msg := cmd(); msg != nil {
			if _, ok := msg.(computedMsg); ok {
				t.Fatal("the editor's model computed on its own; the hub computes")
			}
		}
	}
	h.compute()
	vw, _ = drive(vw, ReviewChangedMsg{})
	ed, _ = drive(ed, ReviewChangedMsg{})
	if h.computes != 1 || vw.busy || ed.busy {
		t.Errorf("computes %d, busy viewer %v editor %v; want one compute and both done", h.computes, vw.busy, ed.busy)
	}
	if vw.res.grid != ed.res.grid || vw.res.maps[0] != ed.res.maps[0] {
		t.Error("the two reviewers do not share the one computed result")
	}
	if s := h.Current().Settings().Scale; s == before || vw.set.Scale != s {
		t.Errorf("scale %v → %v, viewer's %v; want the new scale everywhere", before, s, vw.set.Scale)
	}
	if !strings.Contains(vw.status, "by ed@lab") {
		t.Errorf("viewer status %q, want who changed the scale", vw.status)
	}
}

func TestReviewFollowAndMoveOff(t *testing.T) {
	_, ed, vw := reviewPair(t)
	ed, _ = press(ed, "k", "k", "tab")
	vw, _ = drive(vw, ReviewChangedMsg{})
	if vw.curI != ed.curI || vw.curJ != ed.curJ || vw.layer != ed.layer || vw.fac != ed.fac {
		t.Fatalf("follower at (%d,%d) layer %v fac %d; presenter at (%d,%d) layer %v fac %d",
			vw.curI, vw.curJ, vw.layer, vw.fac, ed.curI, ed.curJ, ed.layer, ed.fac)
	}
	vw, _ = press(vw, "l")
	if vw.rv.following || !strings.Contains(vw.status, "follow off") {
		t.Errorf("after the follower's own move: following %v, status %q", vw.rv.following, vw.status)
	}
	i := vw.curI
	ed, _ = press(ed, "k")
	vw, _ = drive(vw, ReviewChangedMsg{})
	if vw.curI != i {
		t.Errorf("not following, the view moved with the presenter (%d → %d)", i, vw.curI)
	}
	vw, _ = press(vw, "F")
	if !vw.rv.following || vw.curI != ed.curI {
		t.Errorf("F: following %v at row %d, presenter at %d", vw.rv.following, vw.curI, ed.curI)
	}
}
