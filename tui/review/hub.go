// Package review serves one likewind evaluation to several reviewers over
// SSH (likewind serve): the hub holds the shared state and saves it, the
// server admits reviewers by public key and gives each a Bubble Tea
// program of their own through wish's middleware.
package review

import (
	"fmt"
	"sync"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/session"
	"likewind/tui"
)

// SaveDelay is how long the hub waits after a change of the shared work
// before saving, so that a burst of keys is one write.
const SaveDelay = 300 * time.Millisecond

// Hub holds a review's shared state: one tui.Shared for every reviewer,
// guarded by one mutex. It passes every change on to the other
// reviewers' programs, computes what-if results once, and saves the
// session after changes (SaveDelay) and on Flush.
type Hub struct {
	mu     sync.Mutex
	cur    tui.Shared
	base   tui.Model
	conns  map[int]*conn
	order  []int // reviewer ids in the order they joined
	nextID int

	wake chan struct{} // the compute worker's bell (capacity 1)
	stop chan struct{}
	done chan struct{}

	store   *session.File // nil: nothing saved
	keepOld bool
	saveMu  sync.Mutex // one save at a time
	timer   *time.Timer
	dirty   bool
	saved   []string // what the saves did
	saveErr error    // the latest save's failure
	logf    func(format string, args ...any)
}

// conn is one reviewer's program.
type conn struct {
	id     int
	name   string
	editor bool
	bell   chan struct{} // capacity 1: a change to take
	quit   chan struct{}
}

// NewHub starts a hub on the server's model base (its evaluation, and the
// view new reviewers start on). store is the session file the hub saves
// to (nil: none); keepOld keeps a session found there that was not
// restored beside it before the first save. logf receives one line per
// save and per reviewer coming and going (nil: none).
func NewHub(base tui.Model, store *session.File, keepOld bool, logf func(string, ...any)) *Hub {
	if logf == nil {
		logf = func(string, ...any) {}
	}
	h := &Hub{
		cur:     base.Shared(),
		base:    base,
		conns:   map[int]*conn{},
		wake:    make(chan struct{}, 1),
		stop:    make(chan struct{}),
		done:    make(chan struct{}),
		store:   store,
		keepOld: keepOld,
		logf:    logf,
	}
	go h.computeLoop()
	return h
}

// Current implements tui.ReviewHub.
func (h *Hub) Current() tui.Shared {
	h.mu.Lock()
	defer h.mu.Unlock()
	return h.cur
}

// Edit implements tui.ReviewHub.
func (h *Hub) Edit(id int, f func(cur tui.Shared) (tui.Shared, tui.Change)) {
	h.mu.Lock()
	next, ch := f(h.cur)
	if ch != 0 {
		h.cur = next
	}
	h.mu.Unlock()
	if ch&tui.ChangeCompute != 0 {
		h.ring(h.wake)
	}
	if ch&tui.ChangeWork != 0 {
		h.scheduleSave()
	}
	if ch != 0 {
		h.tellAll(id)
	}
}

// Join admits a reviewer whose program takes messages through send; it
// returns the reviewer's id. The first editor to join presents.
func (h *Hub) Join(name string, editor bool) int {
	h.mu.Lock()
	h.nextID++
	id := h.nextID
	h.order = append(h.order, id)
	h.conns[id] = &conn{id: id, name: name, editor: editor, bell: make(chan struct{}, 1), quit: make(chan struct{})}
	if editor && h.cur.Presenter() == 0 {
		h.cur = h.cur.WithPresenter(id, name)
	}
	n := len(h.conns)
	h.mu.Unlock()
	h.logf("reviewer %d joined: %s (%s); %d connected", id, name, role(editor), n)
	return id
}

// Attach starts passing changes to reviewer id's program; it returns
// once the reviewer leaves.
func (h *Hub) Attach(id int, send func(tea.Msg)) {
	h.mu.Lock()
	c := h.conns[id]
	h.mu.Unlock()
	if c == nil {
		return
	}
	go func() {
		for {
			select {
			case <-c.quit:
				return
			case <-c.bell:
				send(tui.ReviewChangedMsg{})
			}
		}
	}()
}

// Leave removes reviewer id. When the presenter leaves, the editor who
// joined first among those left presents.
func (h *Hub) Leave(id int) {
	h.mu.Lock()
	c := h.conns[id]
	if c == nil {
		h.mu.Unlock()
		return
	}
	close(c.quit)
	delete(h.conns, id)
	for k, o := range h.order {
		if o == id {
			h.order = append(h.order[:k:k], h.order[k+1:]...)
			break
		}
	}
	if h.cur.Presenter() == id {
		h.cur = h.cur.WithPresenter(0, "")
		for _, o := range h.order {
			if oc := h.conns[o]; oc.editor {
				h.cur = h.cur.WithPresenter(o, oc.name)
				break
			}
		}
	}
	n := len(h.conns)
	h.mu.Unlock()
	h.logf("reviewer %d left: %s; %d connected", id, c.name, n)
	h.tellAll(id)
}

// Connected is how many reviewers are in.
func (h *Hub) Connected() int {
	h.mu.Lock()
	defer h.mu.Unlock()
	return len(h.conns)
}

func role(editor bool) string {
	if editor {
		return "editor"
	}
	return "viewer"
}

// ring rings a bell of capacity 1 without waiting: a bell already rung
// covers this change too (the receiver takes the latest state).
func (h *Hub) ring(bell chan struct{}) {
	select {
	case bell <- struct{}{}:
	default:
	}
}

// tellAll rings every reviewer's bell but from's.
func (h *Hub) tellAll(from int) {
	h.mu.Lock()
	defer h.mu.Unlock()
	for id, c := range h.conns {
		if id != from {
			h.ring(c.bell)
		}
	}
}

// computeLoop computes the shared results whenever they are older than
// the what-if values. Changes that come while it computes are taken
// together in the next round.
func (h *Hub) computeLoop() {
	defer close(h.done)
	for {
		select {
		case <-h.stop:
			return
		case <-h.wake:
		}
		for {
			h.mu.Lock()
			cur := h.cur
			h.mu.Unlock()
			if !cur.Pending() {
				break
			}
			done := cur.Compute()
			h.mu.Lock()
			next, ok := h.cur.WithResults(done)
			if ok {
				h.cur = next
			}
			h.mu.Unlock()
			if ok {
				h.tellAll(0)
				break
			}
		}
	}
}

// WaitComputed waits until the shared results are in step with the
// what-if values, or d has passed; it reports whether they are.
func (h *Hub) WaitComputed(d time.Duration) bool {
	deadline := time.Now().Add(d)
	for {
		if !h.Current().Pending() {
			return true
		}
		if time.Now().After(deadline) {
			return false
		}
		time.Sleep(5 * time.Millisecond)
	}
}

// scheduleSave saves SaveDelay after the first of a burst of changes.
func (h *Hub) scheduleSave() {
	if h.store == nil {
		return
	}
	h.mu.Lock()
	defer h.mu.Unlock()
	h.dirty = true
	if h.timer == nil {
		h.timer = time.AfterFunc(SaveDelay, func() { _ = h.save() })
	}
}

// save writes the shared session when it changed since the last save.
func (h *Hub) save() error {
	h.saveMu.Lock()
	defer h.saveMu.Unlock()
	h.mu.Lock()
	h.timer = nil
	dirty, cur := h.dirty, h.cur
	h.dirty = false
	h.mu.Unlock()
	if h.store == nil || !dirty {
		return nil
	}
	s := h.base.SessionOf(cur)
	res, err := h.store.Save(s, h.keepOld)
	h.mu.Lock()
	defer h.mu.Unlock()
	if err != nil {
		h.dirty = true // the next change, or Flush, tries again
		h.saveErr = err
		h.logf("session not saved: %v", err)
		return err
	}
	h.keepOld, h.saveErr = false, nil
	if res.Written {
		line := "session saved to " + res.Path
		if res.Note != "" {
			line += "; " + res.Note
		}
		h.saved = append(h.saved, line)
		h.logf("%s (change %d, %d marks)", line, cur.Rev(), cur.Marks())
	}
	return nil
}

// Flush saves what is not saved yet, at once (on shutdown).
func (h *Hub) Flush() error {
	h.mu.Lock()
	if h.timer != nil {
		h.timer.Stop()
		h.timer = nil
	}
	h.mu.Unlock()
	if err := h.save(); err != nil {
		return fmt.Errorf("%w: %w", tui.ErrSessionNotSaved, err)
	}
	return nil
}

// MarkDirty makes the next save write even without a change (the first
// save of a review started afresh, so the session file names it).
func (h *Hub) MarkDirty() {
	h.mu.Lock()
	h.dirty = true
	h.mu.Unlock()
}

// Close stops the compute worker.
func (h *Hub) Close() {
	select {
	case <-h.stop:
	default:
		close(h.stop)
	}
	<-h.done
}
