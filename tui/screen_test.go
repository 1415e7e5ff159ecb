package tui

import (
	"bytes"
	"errors"
	"strings"
	"testing"
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
