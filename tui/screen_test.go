package tui

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// The screen writes a frame's changed lines only, each at its row and
// cleared to the right; the expected bytes are spelled out from the
// ECMA-48 sequences the screen uses (CUP "ESC [ row ; 1 H", EL "ESC [ K",
// ED "ESC [ 2 J").
func TestScreenWritesChangedLines(t *testing.T) {
	var out bytes.Buffer
	s := newScreen(&out)
	s.resize(10, 4)
	s.draw("ab\ncd\nef")
	if got, want := out.String(), "\x1b[2J\x1b[1;1Hab\x1b[K\x1b[2;1Hcd\x1b[K\x1b[3;1Hef\x1b[K"; got != want {
		t.Fatalf("first frame wrote %q, want %q", got, want)
	}
	out.Reset()
	s.draw("ab\nCD\nef")
	if got, want := out.String(), "\x1b[2;1HCD\x1b[K"; got != want {
		t.Errorf("one changed line wrote %q, want %q", got, want)
	}
	out.Reset()
	s.draw("ab\nCD\nef")
	if out.Len() != 0 {
		t.Errorf("the same frame wrote %q, want nothing", out.String())
	}
	s.draw("ab")
	if got, want := out.String(), "\x1b[2;1H\x1b[K\x1b[3;1H\x1b[K"; got != want {
		t.Errorf("a shorter frame wrote %q, want the rows below cleared: %q", got, want)
	}
	out.Reset()
	s.resize(10, 4)
	s.draw("ab")
	if got, want := out.String(), "\x1b[2J\x1b[1;1Hab\x1b[K"; got != want {
		t.Errorf("after a resize wrote %q, want a repaint %q", got, want)
	}
}

func TestScreenCutsToTheTerminal(t *testing.T) {
	var out bytes.Buffer
	s := newScreen(&out)
	s.resize(4, 2)
	s.draw("abcdefgh\n\x1b[31mxyzuvw\x1b[0m\nlast")
	got := out.String()
	// Three lines on two rows: the bottom two are shown, each cut to four
	// cells (the colour sequences kept).
	if strings.Contains(got, "abcd") {
		t.Errorf("the top line of a frame taller than the terminal was written: %q", got)
	}
	if !strings.Contains(got, "\x1b[1;1H\x1b[31mxyzu") || strings.Contains(got, "xyzuv") {
		t.Errorf("the wide line was not cut to 4 cells at row 1: %q", got)
	}
	if !strings.Contains(got, "\x1b[2;1Hlast\x1b[K") {
		t.Errorf("the last line is not at row 2: %q", got)
	}
}

type failWriter struct{ n int }

func (w *failWriter) Write(p []byte) (int, error) { w.n++; return 0, errors.New("gone") }

func TestScreenStopsAfterAFailedWrite(t *testing.T) {
	w := &failWriter{}
	s := newScreen(w)
	s.draw("a")
	s.draw("b")
	if w.n != 1 {
		t.Errorf("%d writes after the terminal failed, want 1", w.n)
	}
}

// A frame whose lines are the old ones a row lower (a header line added
// above) moves them with a scrolling region and an inserted line, and
// writes the new row alone; one a row higher deletes a line instead.
func TestScreenMovesShiftedRows(t *testing.T) {
	rows := make([]string, 12)
	for i := range rows {
		rows[i] = "row " + string(rune('a'+i))
	}
	var out bytes.Buffer
	s := newScreen(&out)
	s.resize(20, 14)
	s.draw("title\n" + strings.Join(rows, "\n"))
	out.Reset()
	s.draw("title\nwhat-if\n" + strings.Join(rows[:11], "\n"))
	// Old rows 2..12 (1-based) move to 3..13: region 2..13, one line
	// inserted at row 2, then row 2 written.
	if got, want := out.String(), "\x1b[2;13r\x1b[2;1H\x1b[1L\x1b[r\x1b[2;1Hwhat-if\x1b[K"; got != want {
		t.Fatalf("shift down wrote %q, want %q", got, want)
	}
	out.Reset()
	s.draw("title\n" + strings.Join(rows, "\n"))
	// Back: rows 3..13 move to 2..12 (one line deleted at row 2 of region
	// 2..13), and row 13 gets the last row.
	if got, want := out.String(), "\x1b[2;13r\x1b[2;1H\x1b[1M\x1b[r\x1b[13;1Hrow l\x1b[K"; got != want {
		t.Fatalf("shift up wrote %q, want %q", got, want)
	}
	// The screen's own picture of the terminal is the frame.
	if got := strings.Join(s.lines, "\n"); got != "title\n"+strings.Join(rows, "\n") {
		t.Errorf("screen holds %q", got)
	}
}

// cmdMsgs runs cmd and, for a batch, each command in it, and returns the
// messages they give.
func cmdMsgs(cmd tea.Cmd) []tea.Msg {
	if cmd == nil {
		return nil
	}
	msg := cmd()
	if b, ok := msg.(tea.BatchMsg); ok {
		var out []tea.Msg
		for _, c := range b {
			out = append(out, cmdMsgs(c)...)
		}
		return out
	}
	if msg == nil {
		return nil
	}
	return []tea.Msg{msg}
}

// The frame of a key that starts a recompute is held until the result
// comes (then the result's frame is drawn), holdFrame has passed or
// another key comes (then the frame as it is, saying "computing").
func TestDrawnHoldsTheKeysFrameForItsResult(t *testing.T) {
	for _, endBy := range []string{"result", "clock", "key"} {
		t.Run(endBy, func(t *testing.T) {
			var out bytes.Buffer
			d := drawn{m: newDemo(t, 120, 40), scr: newScreen(&out)}
			step := func(msg tea.Msg) tea.Cmd {
				next, cmd := d.Update(msg)
				d = next.(drawn)
				d.View()
				return cmd
			}
			step(tea.WindowSizeMsg{Width: 120, Height: 40})
			for _, k := range []string{"e", "down", "enter", "ctrl+u", "5", "K"} {
				if cmd := step(keyMsg(k)); cmd != nil {
					for _, msg := range cmdMsgs(cmd) {
						step(msg)
					}
				}
			}
			out.Reset()
			cmd := step(keyMsg("enter"))
			if d.hold == 0 || out.Len() != 0 {
				t.Fatalf("the key that starts a recompute: hold %d, %d bytes drawn; want held, none", d.hold, out.Len())
			}
			var result, clock tea.Msg
			for _, msg := range cmdMsgs(cmd) {
				switch msg.(type) {
				case computedMsg, earlyMsg:
					result = msg
				case heldMsg:
					clock = msg
				}
			}
			if result == nil || clock == nil {
				t.Fatalf("the key's commands gave result %v and clock %v", result, clock)
			}
			if endBy == "key" {
				step(keyMsg("down"))
				if d.hold != 0 || !strings.Contains(out.String(), "computing") {
					t.Errorf("after another key: hold %d, drawn %q; want the frame drawn at once", d.hold, out.String())
				}
				return
			}
			if endBy == "result" {
				next := step(result)
				if d.hold != 0 || !strings.Contains(out.String(), "ΔT +5.0 K") || strings.Contains(out.String(), "computing") {
					t.Errorf("after the result: hold %d, drawn %q; want the result's frame, never computing", d.hold, out.String())
				}
				// The rows on screen came first; the rest of the grid
				// changes nothing on screen.
				if _, early := result.(earlyMsg); early {
					out.Reset()
					for _, msg := range cmdMsgs(next) {
						step(msg)
					}
					if out.Len() != 0 || d.m.busy {
						t.Errorf("the rest of the grid after the screen's rows: busy %v, drew %q; want done, nothing drawn", d.m.busy, out.String())
					}
				}
				return
			}
			step(clock)
			if d.hold != 0 || !strings.Contains(out.String(), "computing") {
				t.Errorf("after the clock: hold %d, drawn %q; want the computing frame", d.hold, out.String())
			}
			out.Reset()
			step(result)
			if strings.Contains(out.String(), "computing") || out.Len() == 0 {
				t.Errorf("the result after the clock drew %q", out.String())
			}
		})
	}
}
