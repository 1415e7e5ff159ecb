package tui

import (
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
	"github.com/charmbracelet/x/exp/golden"

	"likewind/envelope/whatif"
)

// goldenStates are the screens kept as golden files, colour disabled.
// Rewrite them with: go test ./tui/ -run TestViewGolden -update
func goldenStates(t *testing.T) []struct {
	name string
	make func(w, h int) Model
} {
	// The cursor starts at 30000 ft (9144 m), Mach 0.85 on the cryogenic
	// facility: a full match with cold-gas cautions.
	start := func(w, h int) Model {
		m := newDemo(t, w, h)
		m.fac = facilityNamed(t, m, "Kellen Fold")
		m.curI = gridIndex(m.res.grid.Alts, 9144)
		m.curJ = gridIndex(m.res.grid.Speeds, 0.85)
		m.relayout()
		return m
	}
	keys := func(ks ...string) func(w, h int) Model {
		return func(w, h int) Model {
			m, _ := press(start(w, h), ks...)
			return m
		}
	}
	return []struct {
		name string
		make func(w, h int) Model
	}{
		{"class", start},
		{"regime", keys("tab")},
		{"reynolds", keys("tab", "tab")},
		{"q", keys("tab", "tab", "tab")},
		{"load", keys("tab", "tab", "tab", "tab")},
		{"mach", keys("tab", "tab", "tab", "tab", "tab")},
		{"best", keys("b")},
		{"customary", keys("u")},
		{"marks", keys("M", "up", "space")},
		{"help", keys("?")},
		{"picker", keys("f")},
		{"editor", keys("e", "down", "down", "down", "down", "down")},
		// The operating rule's choice list.
		{"choosing", keys("e", "down", "down", "down", "down", "down", "down", "down", "down", "enter")},
		// A full match whose matching set is a line (12192 m, Mach 0.6).
		{"set", func(w, h int) Model {
			m := start(w, h)
			m.curI, m.curJ = 20, 8
			m.relayout()
			return m
		}},
		// One step up of the model scale (1:40 to 1:32, every facility).
		{"scaled", keys("+")},
		{"editing", keys("e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "3", " ", "b", "a", "r")},
		{"edited", func(w, h int) Model {
			m := start(w, h)
			m = edit(t, m, whatif.P0Max, "3 bar")
			m = edit(t, m, whatif.DeltaT, "10 K")
			m, _ = press(m, "esc")
			return m
		}},
		// The model-scale study of the cryogenic tunnel: the pointer on
		// the scale in force (1:40); being computed; in best of all.
		{"study", keys("S")},
		{"studying", func(w, h int) Model {
			next, _ := start(w, h).Update(keyMsg("S")) // the study's command not run
			return next.(Model)
		}},
		{"studybest", keys("b", "S")},
		{"confirm", keys("space", "q")},
		{"scrolled", keys("end", "pgup", "pgup")},
	}
}

func TestViewGolden(t *testing.T) {
	for _, size := range []struct{ w, h int }{{80, 24}, {120, 40}, {200, 60}} {
		for _, s := range goldenStates(t) {
			name := s.name
			t.Run(sizeName(size.w, size.h)+"/"+name, func(t *testing.T) {
				m := s.make(size.w, size.h)
				out := m.View()
				checkFits(t, out, size.w, size.h)
				golden.RequireEqual(t, []byte(out+"\n"))
			})
		}
	}
	t.Run("small", func(t *testing.T) {
		m := newDemo(t, 80, 24)
		m, _ = drive(m, tea.WindowSizeMsg{Width: 40, Height: 10})
		out := m.View()
		checkFits(t, out, 40, 10)
		golden.RequireEqual(t, []byte(out+"\n"))
	})
}

func sizeName(w, h int) string {
	return strings.ReplaceAll(strings.TrimSpace(strings.Join([]string{itoa(w), itoa(h)}, "x")), " ", "")
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var b []byte
	for n > 0 {
		b = append([]byte{byte('0' + n%10)}, b...)
		n /= 10
	}
	return string(b)
}

// checkFits fails when the view is larger than the terminal.
func checkFits(t *testing.T, out string, w, h int) {
	t.Helper()
	lines := strings.Split(out, "\n")
	if len(lines) > h {
		t.Errorf("view has %d lines, terminal %d", len(lines), h)
	}
	for k, l := range lines {
		if n := ansi.StringWidth(l); n > w {
			t.Errorf("line %d is %d cells wide, terminal %d: %q", k+1, n, w, l)
		}
	}
}

// TestColourViewSameText builds every golden state with colour styles:
// without its escape sequences the screen must read exactly as the plain
// one, so nothing is said by colour alone.
func TestColourViewSameText(t *testing.T) {
	for _, s := range goldenStates(t) {
		plain := s.make(100, 30)
		colour := plain
		st := colourStyles()
		colour.fr.st = &st
		colour = relayoutAll(colour)
		c, p := colour.View(), plain.View()
		if s.name == "editing" {
			// The input line's text cursor is a reverse-video cell with
			// colour and '|' without; compare the rest.
			c, p = c[:strings.LastIndex(c, "\n")], p[:strings.LastIndex(p, "\n")]
		}
		if !strings.Contains(c, "\x1b[") {
			t.Errorf("%s: colour view has no colour", s.name)
		}
		if ansi.Strip(c) != p {
			t.Errorf("%s: colour view text differs from plain:\n%s\n---\n%s", s.name, ansi.Strip(c), p)
		}
	}
}
