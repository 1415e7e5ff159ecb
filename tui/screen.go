package tui

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"strconv"
	"strings"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
	"github.com/charmbracelet/x/term"
)

// The running program draws its own frames. Bubble Tea's renderer writes
// the latest frame on a clock (at most 120 times a second), so a finished
// recompute waited up to 8 ms for the screen, and while both processors
// solved, the clock's goroutine could wait for one of them longer still.
// Run turns that renderer off and wraps the model in a drawing model: the
// event loop calls View right after each Update, and the wrapper writes
// the lines of that frame that differ from the one on screen, there and
// then, in one write.

// Terminal sequences the screen uses: the alternate screen with the
// cursor hidden while the program runs, and back on exit.
const (
	screenEnter = "\x1b[?1049h\x1b[?25l\x1b[2J"
	screenLeave = "\x1b[?25h\x1b[?1049l"
)

// screen is what the terminal shows: the lines last written, and the size
// they were written for.
type screen struct {
	out   io.Writer
	lines []string
	w, h  int
	fresh bool // the next frame repaints every line
	buf   []byte
	err   error // the first failed write; later frames are not written
}

func newScreen(out io.Writer) *screen { return &screen{out: out, fresh: true} }

// resize sets the terminal size; the next frame repaints everything (the
// terminal may have moved what it showed).
func (s *screen) resize(w, h int) {
	s.w, s.h = w, h
	s.fresh = true
}

// draw writes frame: each line that differs from the line on screen at
// the same row (all of them after a resize), cut to the width and
// cleared to the right, and clears rows the frame no longer reaches. Of a
// frame taller than the terminal the bottom rows are shown.
func (s *screen) draw(frame string) {
	if s.err != nil {
		return
	}
	lines := strings.Split(frame, "\n")
	if s.h > 0 && len(lines) > s.h {
		lines = lines[len(lines)-s.h:]
	}
	b := s.buf[:0]
	if s.fresh {
		b = append(b, "\x1b[2J"...)
		s.lines = s.lines[:0]
	} else {
		b = s.shift(b, lines)
	}
	for i, l := range lines {
		if !s.fresh && i < len(s.lines) && s.lines[i] == l {
			continue
		}
		if s.w > 0 && visibleWidth(l) > s.w {
			l = ansi.Truncate(l, s.w, "")
			lines[i] = l
		}
		b = moveTo(b, i)
		b = append(b, l...)
		b = append(b, "\x1b[K"...)
	}
	for i := len(lines); i < len(s.lines); i++ {
		b = moveTo(b, i)
		b = append(b, "\x1b[K"...)
	}
	s.fresh = false
	s.lines = append(s.lines[:0], lines...)
	if len(b) > 0 {
		_, s.err = s.out.Write(b)
	}
	s.buf = b[:0]
}

// Moving a block of rows: when a line of the header comes or goes (the
// first what-if, the last one undone) or the matrix scrolls a row, most
// lines of the new frame are lines of the old one a few rows up or down.
// The terminal moves them itself (a scrolling region set round them, and
// lines inserted or deleted at its top), and only the rows left over are
// written. The sequences are those of ECMA-48 and the VT100: DECSTBM
// "ESC [ top ; bottom r", IL "ESC [ n L", DL "ESC [ n M".
const (
	maxShift = 3 // rows a block may move
	minRun   = 8 // rows a block must have to be moved
)

// shift appends the sequences that move the longest block of rows of the
// screen that reappears in frame lines up to maxShift rows away, if it
// saves writing at least minRun rows, and changes s.lines to what the
// terminal shows then.
func (s *screen) shift(b []byte, lines []string) []byte {
	old := s.lines
	n := min(len(old), len(lines))
	bestK, bestStart, bestLen := 0, 0, 0
	for k := -maxShift; k <= maxShift; k++ {
		if k == 0 {
			continue
		}
		// Rows i of the new frame equal to row i-k of the old.
		run := 0
		for i := 0; i < n; i++ {
			if j := i - k; j >= 0 && j < n && lines[i] == old[j] && lines[i] != old[i] {
				run++
				if run > bestLen {
					bestK, bestStart, bestLen = k, i-run+1, run
				}
				continue
			}
			run = 0
		}
	}
	if bestLen < minRun {
		return b
	}
	k, start, end := bestK, bestStart, bestStart+bestLen-1 // new rows start..end
	var top, bottom int                                    // the region, old rows moved within it
	if k > 0 {
		// Old rows start-k..end-k move down k: insert k lines at start-k.
		top, bottom = start-k, end
	} else {
		// Old rows start-k..end-k move up -k: delete -k lines at start.
		top, bottom = start, end-k
	}
	b = append(b, "\x1b["...)
	b = strconv.AppendInt(b, int64(top+1), 10)
	b = append(b, ';')
	b = strconv.AppendInt(b, int64(bottom+1), 10)
	b = append(b, 'r')
	b = moveTo(b, top)
	b = append(b, "\x1b["...)
	b = strconv.AppendInt(b, int64(max(k, -k)), 10)
	if k > 0 {
		b = append(b, 'L')
	} else {
		b = append(b, 'M')
	}
	b = append(b, "\x1b[r"...)
	// What the terminal shows now: the block moved, blank rows where it
	// left, the region's far rows gone.
	moved := make([]string, bottom-top+1)
	for i := range moved {
		if j := top + i - k; j >= top && j <= bottom {
			moved[i] = old[j]
		}
	}
	copy(old[top:bottom+1], moved)
	return b
}

// moveTo appends the sequence that puts the cursor at the start of row
// (from 0).
func moveTo(b []byte, row int) []byte {
	b = append(b, "\x1b["...)
	b = strconv.AppendInt(b, int64(row+1), 10)
	return append(b, ";1H"...)
}

// drawn is the model the program runs: the interface's model, drawn to
// the screen by View (the one place the event loop calls after every
// Update) instead of by Bubble Tea's renderer.
//
// A key that starts a recompute holds its frame for up to holdFrame: a
// result that comes in that time (a what-if on the 400×400 demo takes
// 3 to 15 ms) is drawn at once, in place of the frame that would only
// have said "computing", and that frame's drawing does not take the
// processor from the solve. A result that takes longer finds the
// "computing" frame on screen after holdFrame, which is still well
// under what a user notices as a pause; the next key ends the hold.
type drawn struct {
	m    Model
	scr  *screen
	hold int  // the recompute generation whose frame is held, 0 none
	same bool // the last message changed nothing to draw
	// early tells the recompute whose early points the last message
	// brought that their frame is drawn (earlyMsg.drawn); nil for other
	// messages.
	early func()
}

// holdFrame is the longest a key's frame waits for the recompute the key
// started.
const holdFrame = 40 * time.Millisecond

// heldMsg ends the hold of the frame of recompute gen.
type heldMsg struct{ gen int }

func (d drawn) Init() tea.Cmd { return d.m.Init() }

func (d drawn) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case tea.WindowSizeMsg:
		d.scr.resize(msg.Width, msg.Height)
		d.hold = 0
	case heldMsg:
		// A hold the result ended already leaves the frame as it is.
		d.same = msg.gen != d.hold
		if !d.same {
			d.hold = 0
		}
		return d, nil
	}
	d.same, d.early = false, nil
	if e, ok := msg.(earlyMsg); ok {
		d.early = e.drawn
	}
	gen := d.m.gen
	next, cmd := d.m.Update(msg)
	d.m = next.(Model)
	_, key := msg.(tea.KeyMsg)
	switch {
	case !d.m.busy || d.m.showingEarly():
		// The screen's rows are final.
		d.hold = 0
	case key && d.m.gen != gen && d.hold == 0:
		d.hold = d.m.gen
		g := d.m.gen
		cmd = tea.Batch(cmd, tea.Tick(holdFrame, func(time.Time) tea.Msg { return heldMsg{gen: g} }))
	case key && d.m.gen == gen:
		// Any other key while a solve runs (a cursor move, say) is
		// shown at once.
		d.hold = 0
	}
	return d, cmd
}

// View writes the frame of the state it holds (unless the frame is held)
// and gives the (turned off) renderer nothing.
func (d drawn) View() string {
	if d.hold == 0 && !d.same {
		d.scr.draw(d.m.View())
	}
	if d.early != nil {
		d.early()
	}
	return ""
}

// terminal is the input and output Run uses, with what it changed of
// them: the input's mode before the program made it raw.
type terminal struct {
	inFile *os.File // the input when it is a terminal
	outFd  uintptr
	isTerm bool // the output is a terminal (it has a size)
	before *term.State
}

// openTerminal puts a terminal input into raw mode (keys arrive one at a
// time, unechoed) and notes whether the output is a terminal.
func openTerminal(in io.Reader, out io.Writer) (*terminal, error) {
	t := &terminal{}
	if f, ok := in.(*os.File); ok && term.IsTerminal(f.Fd()) {
		st, err := term.MakeRaw(f.Fd())
		if err != nil {
			return nil, fmt.Errorf("terminal input: %w", err)
		}
		t.inFile, t.before = f, st
	}
	if f, ok := out.(*os.File); ok && term.IsTerminal(f.Fd()) {
		t.outFd, t.isTerm = f.Fd(), true
	}
	return t, nil
}

// size is the output terminal's size; ok is false when it has none.
func (t *terminal) size() (w, h int, ok bool) {
	if !t.isTerm {
		return 0, 0, false
	}
	w, h, err := term.GetSize(t.outFd)
	return w, h, err == nil && w > 0 && h > 0
}

// restore gives the input back its mode.
func (t *terminal) restore() {
	if t.inFile != nil && t.before != nil {
		_ = term.Restore(t.inFile.Fd(), t.before)
	}
}

// sendSizes sends p the terminal's size each time it changes, until stop
// is called.
func (t *terminal) sendSizes(p *tea.Program) (stop func()) {
	if !t.isTerm {
		return func() {}
	}
	changed, quit := make(chan os.Signal, 1), make(chan struct{})
	notifyResize(changed)
	done := make(chan struct{})
	go func() {
		defer close(done)
		for {
			select {
			case <-quit:
				return
			case <-changed:
				if w, h, ok := t.size(); ok {
					p.Send(tea.WindowSizeMsg{Width: w, Height: h})
				}
			}
		}
	}()
	return func() {
		signal.Stop(changed)
		close(quit)
		<-done
	}
}

// enter switches the terminal to the alternate screen, cursor hidden.
func (s *screen) enter() { _, _ = io.WriteString(s.out, screenEnter) }

// leave gives the terminal back its main screen and cursor.
func (s *screen) leave() { _, _ = io.WriteString(s.out, screenLeave) }
