package tui

import (
	"context"
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/whatif"
)

// A design review (likewind serve): several reviewers, each on a model of
// their own, work on one evaluation. The shared part (what-if values,
// facilities as changed, marks, undo steps, the results) lives in a hub
// as a Shared value; each model keeps its own cursor, layer, units,
// facility on screen, panels and status line. A model takes the hub's
// state under the hub's lock before every key (so no change is made on a
// stale copy) and hands back what the key changed; the hub tells the
// other models with a ReviewChangedMsg, on which each takes the new state
// and redraws. The results of a what-if change are computed once, by the
// hub (Shared.Compute), not by every model.

// ReviewHub is the hub a reviewer's model works through.
type ReviewHub interface {
	// Edit calls f with the current shared state while no other
	// reviewer can change it; f returns the next state and what changed,
	// which the hub stores and passes on to the other reviewers.
	Edit(id int, f func(cur Shared) (next Shared, ch Change))
	// Current is the shared state now.
	Current() Shared
}

// Change says what an Edit changed.
type Change uint8

const (
	// ChangeWork: what-if values, marks or undo steps (saved, shown to
	// everyone with who made it).
	ChangeWork Change = 1 << iota
	// ChangeCompute: a what-if value changed and the results must be
	// computed again (Shared.Compute).
	ChangeCompute
	// ChangeView: the presenter's cursor, facility or layer moved (for
	// those following).
	ChangeView
)

// Review makes a model one reviewer's view of a shared review.
type Review struct {
	// ID is the reviewer's connection, unique in the hub; Name is shown
	// beside the changes they make (it is cleaned here).
	ID   int
	Name string
	// Editor may change the shared state; a viewer only moves, follows
	// and (with a DumpDir) writes dumps.
	Editor bool
	Hub    ReviewHub
	// SessionPath is where the hub saves the shared session (for the
	// save key's message).
	SessionPath string
}

// ReviewChangedMsg tells a reviewer's model that the shared state changed;
// the model takes it from the hub.
type ReviewChangedMsg struct{}

// presenterView is what those who follow the presenter see.
type presenterView struct {
	ok         bool
	curI, curJ int
	fac        int
	layer      Layer
}

// Shared is the shared state of a review: one evaluation for every
// reviewer. Like results it is replaced as a whole, never changed in
// place, so a copy stays consistent.
type Shared struct {
	rev      int // counts changes of the work
	by, what string

	vehicle *envelope.Vehicle
	set     envelope.Settings
	facs    []envelope.Facility
	marks   map[int]bool
	undo    []undoStep

	res    results
	work   int    // rev of the latest what-if change
	resFor int    // the work revision res belongs to
	resErr string // why the latest compute failed
	// kind and kindFac are the recompute the changes since res need
	// (merged as a single model merges them).
	kind    recomputeKind
	kindFac int

	presenter     int // reviewer id, 0 = none
	presenterName string
	view          presenterView
}

// Shared is the model's evaluation as the starting state of a review:
// the files' or a restored session's what-if values, marks and results.
func (m Model) Shared() Shared {
	return Shared{
		vehicle: m.vehicle, set: m.set, facs: m.facs, marks: m.marks, undo: m.undo,
		res: m.res, view: m.viewNow(),
	}
}

// Rev counts the changes of the shared work; By and What say who made the
// latest and what it was (clean text).
func (s Shared) Rev() int       { return s.rev }
func (s Shared) By() string     { return s.by }
func (s Shared) What() string   { return s.what }
func (s Shared) Marks() int     { return len(s.marks) }
func (s Shared) Presenter() int { return s.presenter }

// Pending reports whether the results are older than the what-if values.
func (s Shared) Pending() bool { return s.resFor != s.work }

// Settings are the shared what-if settings.
func (s Shared) Settings() envelope.Settings { return s.set }

// WithPresenter makes reviewer id (0: none) the one followers track.
func (s Shared) WithPresenter(id int, name string) Shared {
	s.presenter, s.presenterName = id, envelope.CleanText(name)
	return s
}

// Compute evaluates the shared what-if values, doing only the work the
// changes since the last results need. It reads s only; the caller
// offers the outcome back with WithResults.
func (s Shared) Compute() Shared {
	var r results
	var err error
	switch {
	case s.vehicle == nil:
		err = fmt.Errorf("no vehicle loaded")
	case s.kind == recomputeGrid || s.res.grid == nil:
		r, err = computeGrid(context.Background(), s.vehicle, s.facs, s.set, nil, nil)
	case s.kind == recomputeOneFac && s.kindFac >= 0:
		r, err = solveOne(context.Background(), s.res, s.facs, s.set, s.kindFac, nil, nil)
	default:
		r, err = solveAll(context.Background(), s.res.grid, s.facs, s.set, nil, nil)
	}
	s.resFor, s.resErr = s.work, ""
	if err != nil {
		s.resErr = envelope.CleanLines("recompute failed: " + err.Error())
	} else {
		s.res = r
	}
	return s
}

// WithResults takes the results of done (a Compute of an earlier s) when
// no what-if value changed since; ok is false when they are out of date
// (a later change has its own Compute coming).
func (s Shared) WithResults(done Shared) (Shared, bool) {
	if done.work != s.work || !s.Pending() {
		return s, false
	}
	s.res, s.resFor, s.resErr = done.res, done.resFor, done.resErr
	return s, true
}

// SessionOf is the session of the shared state as seen from m (the
// server's own model, whose facility, layer and units are the review's
// starting view): what-if values, marks and the presenter's cursor.
func (m Model) SessionOf(s Shared) session.Session {
	m.adoptShared(s)
	if s.view.ok {
		m.curI, m.curJ = s.view.curI, s.view.curJ
		m.clampCursor()
	}
	return m.Session()
}

// reviewState is a model's part in a review.
type reviewState struct {
	Review
	seen      int  // the shared rev last taken
	seenRes   int  // the work revision of the results last taken
	presenter int  // who presents, as last taken
	following bool // the view tracks the presenter
	// Set while a key is handled: whether it changed the shared work, and
	// how to say so.
	changed bool
	compute bool
	what    string
}

// Join is a reviewer's model on the shared review: a copy of the
// server's model m (data and starting view) with the reviewer's styles,
// size and dump folder, taking the hub's current state.
func (m Model) Join(r Review, st *Styles, dumpDir string, w, h int) Model {
	if st == nil {
		p := PlainStyles()
		st = &p
	}
	r.Name = envelope.CleanText(r.Name)
	if r.Name == "" {
		r.Name = fmt.Sprintf("reviewer %d", r.ID)
	}
	m.setComponents(frame{st: st, keys: m.fr.keys})
	m.help.extra = []key.Binding{m.fr.keys.Follow, m.fr.keys.Present}
	m.rv = &reviewState{Review: r}
	m.store, m.sessionPath, m.readOnly, m.holder = nil, "", false, ""
	m.dumpDir = dumpDir
	m.mode = modeMain
	m.status, m.statusErr = "", false
	cur := r.Hub.Current()
	m.adoptShared(cur)
	m.rv.seen, m.rv.seenRes, m.rv.presenter = cur.rev, cur.resFor, cur.presenter
	m.rv.following = !r.Editor && cur.presenter != 0 && cur.view.ok
	if m.rv.following {
		m.follow(cur)
	}
	if w <= 0 || h <= 0 {
		w, h = 80, 24
	}
	m.fr.SetSize(w, h)
	m.relayout()
	return m
}

// adoptShared takes the shared work and results.
func (m *Model) adoptShared(s Shared) {
	m.set, m.facs, m.marks, m.undo = s.set, s.facs, s.marks, s.undo
	if s.res.grid != nil {
		m.res = s.res
	}
	m.busy = s.Pending()
	m.pending, m.pendingFac = s.kind, s.kindFac
	m.clampCursor()
}

// follow puts the view where the presenter's is.
func (m *Model) follow(s Shared) {
	if !s.view.ok || s.presenter == 0 || s.presenter == m.rv.ID {
		return
	}
	m.curI, m.curJ, m.layer = s.view.curI, s.view.curJ, s.view.layer
	m.fac = s.view.fac
	if m.fac >= len(m.facs) {
		m.fac = -1
	}
	if m.fac >= 0 {
		m.lastFac = m.fac
	}
	m.clampCursor()
}

func (m *Model) viewNow() presenterView {
	return presenterView{ok: true, curI: m.curI, curJ: m.curJ, fac: m.fac, layer: m.layer}
}

// takeShared takes the hub's state after a ReviewChangedMsg: the work,
// the presenter's view when following, and who changed what on the
// status line.
func (m *Model) takeShared() {
	cur := m.rv.Hub.Current()
	m.takeState(cur)
}

func (m *Model) takeState(cur Shared) {
	m.adoptShared(cur)
	m.rv.presenter = cur.presenter
	if m.rv.following {
		m.follow(cur)
	}
	if cur.rev > m.rv.seen {
		m.rv.seen = cur.rev
		if cur.by != m.rv.Name {
			m.setStatus(cur.what + " by " + cur.by)
		}
	}
	if !cur.Pending() && cur.resFor != m.rv.seenRes {
		// Results that came in: a failure is said once.
		m.rv.seenRes = cur.resFor
		if cur.resErr != "" {
			m.setError(cur.resErr)
		}
	}
}

// reviewKeys handles the keys of a reviewer. Over SSH keys typed quickly
// can arrive in one packet, which the terminal reader gives as one run of
// characters; each is taken as its own key, so none is lost (a paste
// stays whole).
func (m *Model) reviewKeys(msg tea.KeyMsg) tea.Cmd {
	if msg.Type != tea.KeyRunes || len(msg.Runes) < 2 || msg.Paste {
		return m.reviewKey(msg)
	}
	cmds := make([]tea.Cmd, 0, len(msg.Runes))
	for _, r := range msg.Runes {
		k := tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}, Alt: msg.Alt}
		if r == ' ' {
			k.Type = tea.KeySpace
		}
		cmds = append(cmds, m.reviewKey(k))
	}
	return tea.Batch(cmds...)
}

// reviewKey handles a key of a reviewer: under the hub's lock it takes
// the current shared state, handles the key as a single model would, and
// hands back what the key changed. A viewer's change is put back.
func (m *Model) reviewKey(msg tea.KeyMsg) tea.Cmd {
	var cmd tea.Cmd
	r := m.rv
	r.Hub.Edit(r.ID, func(cur Shared) (Shared, Change) {
		m.takeState(cur)
		next, ch := cur, Change(0)
		before := m.viewNow()
		wasFollowing := m.rv.following
		r.changed, r.compute, r.what = false, false, ""
		switch {
		case m.mode == modeMain && matches(msg, m.fr.keys.Follow):
			m.rv.following = !m.rv.following
			switch {
			case !m.rv.following:
				m.setStatus("follow off: your own view")
			case cur.presenter == r.ID:
				m.rv.following = false
				m.setStatus("you are the presenter; the others follow you")
			case !cur.view.ok || cur.presenter == 0:
				m.setStatus("following; no presenter yet (an editor takes the lead with P)")
			default:
				m.follow(cur)
				m.setStatus("following " + cur.presenterName + " (F again for your own view)")
			}
			before = m.viewNow()
		case m.mode == modeMain && matches(msg, m.fr.keys.Present):
			if !r.Editor {
				m.setError("viewers follow; only an editor can present")
				break
			}
			next = next.WithPresenter(r.ID, r.Name)
			r.presenter = r.ID
			next.view = m.viewNow()
			m.rv.following = false
			ch |= ChangeView
			m.setStatus("you present: those following (F) see your cursor, facility and layer")
		default:
			cmd = m.onKey(msg)
		}
		if r.changed {
			if !r.Editor {
				m.adoptShared(cur)
				cmd = nil
				m.mode = modeMain
				m.setError("viewer: the shared evaluation is not changed (an editor's key may)")
			} else {
				what := r.what
				if what == "" && !m.statusErr {
					what = m.status
				}
				next.rev++
				next.by, next.what = r.Name, envelope.CleanLines(what)
				next.set, next.facs, next.marks, next.undo = m.set, m.facs, m.marks, m.undo
				ch |= ChangeWork
				if r.compute {
					next.work = next.rev
					next.kind, next.kindFac = m.pending, m.pendingFac
					ch |= ChangeCompute
				}
				r.seen = next.rev
			}
		}
		if v := m.viewNow(); v != before && wasFollowing && m.rv.following {
			m.rv.following = false
			if !r.changed {
				m.setStatus("follow off: you moved (F follows again)")
			}
		}
		if next.presenter == r.ID {
			if v := m.viewNow(); v != next.view {
				next.view = v
				ch |= ChangeView
			}
		}
		return next, ch
	})
	return cmd
}

// describeEdits is what a what-if change says beside its author, in the
// author's units.
func (m *Model) describeEdits(edits []whatif.Edit) string {
	parts := make([]string, 0, len(edits))
	for _, e := range edits {
		water := e.Field.Facility() && m.fac >= 0 && m.fac < len(m.facs) && whatif.IsWater(&m.facs[m.fac])
		label := e.Field.Label(water)
		if e.Field.Facility() && m.fac >= 0 && m.fac < len(m.facs) {
			label = m.facs[m.fac].Name + " " + label
		}
		parts = append(parts, label+" "+e.Field.Show(m.units, e.Value, water))
	}
	return strings.Join(parts, ", ")
}

// reviewLine is the footer's first line in a review: who you are here and
// whom you follow.
func (m Model) reviewLine() string {
	role := "viewer"
	if m.rv.Editor {
		role = "editor"
	}
	s := fmt.Sprintf("review: %s (%s)", m.rv.Name, role)
	switch {
	case m.rv.presenter == m.rv.ID:
		s += " · presenting: those following see your view"
	case m.rv.following:
		s += " · following the presenter"
	default:
		s += " · F follows the presenter"
	}
	if m.busy {
		s += " · computing"
	}
	return m.fr.st.Faint.Render(s)
}
