package tui

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/charmbracelet/x/ansi"
)

// screenSizes are the terminal sizes the layout is tested at.
var screenSizes = []struct{ w, h int }{{80, 24}, {120, 40}, {200, 60}}

// plainView is the model's screen without escape sequences, as lines.
func plainView(m Model) []string { return strings.Split(ansi.Strip(m.View()), "\n") }

// TestNoLineWiderThanTheTerminal: every golden state, and the long-status
// state, fits the terminal at each size.
func TestNoLineWiderThanTheTerminal(t *testing.T) {
	for _, size := range screenSizes {
		for _, s := range goldenStates(t) {
			checkFits(t, s.make(size.w, size.h).View(), size.w, size.h)
		}
		m := newDemo(t, size.w, size.h)
		m.setError(longStatus)
		m.relayout()
		checkFits(t, m.View(), size.w, size.h)
	}
}

// longStatus is an error as a failed save reports it: longer than any
// terminal line, with a long path in it.
const longStatus = "session not saved: open /home/engineer/projects/transonic-campaign-2025/state/likewind/" +
	"corvane-sx-3-supersonic-research_kellen-fold-cryogenic-transonic.session.json: permission denied; " +
	"choose another path with --session or make the state folder writable, then save again with s"

// TestLongStatusWrappedWhole: a long status message is shown whole, over
// several lines, broken only at spaces (the path, wider than an 80-column
// line, is the one word split), at every size.
func TestLongStatusWrappedWhole(t *testing.T) {
	for _, size := range screenSizes {
		m := newDemo(t, size.w, size.h)
		m.setError(longStatus)
		m.relayout()
		lines := plainView(m)
		// The status is at the bottom of the screen.
		n := len(wrapLines(longStatus, size.w, "  "))
		if n < 2 {
			t.Fatalf("%dx%d: the test message fits one line; make it longer", size.w, size.h)
		}
		got := lines[len(lines)-n:]
		words := strings.Fields(strings.Join(got, " "))
		if strings.Join(words, " ") != longStatus && size.w >= 200 { // the path fits a 200-column line
			t.Errorf("%dx%d: status reads\n%s\nwant\n%s", size.w, size.h, strings.Join(got, "\n"), longStatus)
		}
		if strings.ReplaceAll(strings.Join(got, ""), " ", "") != strings.ReplaceAll(longStatus, " ", "") {
			t.Errorf("%dx%d: status text lost characters:\n%s", size.w, size.h, strings.Join(got, "\n"))
		}
		for k, l := range got {
			if k == 0 && !strings.HasPrefix(l, "session not saved:") {
				t.Errorf("%dx%d: status starts %q", size.w, size.h, l)
			}
			if k < len(got)-1 && len(l) < size.w-20 && !strings.HasSuffix(strings.TrimRight(l, " "), "permission denied;") {
				// A line ends early only where the next word did not fit.
				next := strings.Fields(got[k+1])[0]
				if len([]rune(strings.TrimRight(l, " ")))+1+len([]rune(next)) <= size.w {
					t.Errorf("%dx%d: line %d ends early though %q fits:\n%s", size.w, size.h, k, next, strings.Join(got, "\n"))
				}
			}
		}
		for _, w := range []string{"permission", "denied;", "writable,", "--session"} {
			found := false
			for _, l := range got {
				if strings.Contains(l, w) {
					found = true
				}
			}
			if !found {
				t.Errorf("%dx%d: word %q broken across lines:\n%s", size.w, size.h, w, strings.Join(got, "\n"))
			}
		}
	}
}

// TestQuitPromptWholeAt80: the quit question with a session file, the
// longest one, reads whole on an 80×24 screen.
func TestQuitPromptWholeAt80(t *testing.T) {
	path := filepath.Join(t.TempDir(), "s.json")
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = path })
	m, _ = press(m, "space", "q")
	if m.mode != modeConfirm {
		t.Fatalf("q after a mark did not ask; mode %v", m.mode)
	}
	screen := strings.Join(plainView(m), " ")
	text := strings.Join(strings.Fields(screen), " ")
	for _, want := range []string{"Unsaved what-if changes or marks.", "s save and quit", "y quit without saving", "n/esc stay"} {
		if !strings.Contains(text, want) {
			t.Errorf("quit prompt lacks %q:\n%s", want, m.View())
		}
	}
}

// TestTitleWholeAt80: the title names the facility and the vehicle in full
// on an 80-column screen (it wraps between its parts).
func TestTitleWholeAt80(t *testing.T) {
	m := newDemo(t, 80, 24)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.relayout()
	head := strings.Join(strings.Fields(ansi.Strip(m.headerText())), " ")
	for _, want := range []string{m.facs[m.fac].Name, m.vehicle.Name, "match class", "SI"} {
		if !strings.Contains(head, want) {
			t.Errorf("title lacks %q: %q", want, head)
		}
	}
}

// TestDetailsWholeAt80: on an 80×24 screen the details panel shows every
// line it has, the caution flags included (the matching set, shown only
// where there is room, left out).
func TestDetailsWholeAt80(t *testing.T) {
	for _, s := range goldenStates(t) {
		if s.name != "class" && s.name != "edited" && s.name != "customary" && s.name != "best" {
			continue
		}
		m := s.make(80, 24)
		// The matching set is shown where there is room for it: not
		// here.
		b := m.detailBlocks(80)
		b.set = nil
		want := detailLines(b, 80, 0, false)
		if m.lowerH < len(want) {
			t.Errorf("%s: details panel %d lines high, its text %d lines", s.name, m.lowerH, len(want))
		}
		screen := strings.Join(plainView(m), "\n")
		for _, l := range want {
			if l = strings.TrimRight(ansi.Strip(l), " "); !strings.Contains(screen, l) {
				t.Errorf("%s: details line %q not on screen:\n%s", s.name, l, screen)
			}
		}
	}
}

// TestNamesWholeAt200: on a 200-column screen facility names are whole in
// the details panel and the facility list.
func TestNamesWholeAt200(t *testing.T) {
	m := newDemo(t, 200, 60)
	for k := range m.facs {
		m.fac = k
		m.relayout()
		name := m.facs[k].Name
		if !strings.Contains(ansi.Strip(m.bodyView()), name) {
			t.Errorf("details at 200 columns lack the whole name %q", name)
		}
	}
	m, _ = press(m, "f")
	screen := ansi.Strip(m.View())
	for _, f := range m.facs {
		if !strings.Contains(screen, f.Name) {
			t.Errorf("facility list at 200 columns lacks the whole name %q", f.Name)
		}
	}
}

// TestKeyLineKeepsQuit: where the key help does not fit, whole keys are
// left out, "…" says so, and quit stays.
func TestKeyLineKeepsQuit(t *testing.T) {
	m := newDemo(t, 80, 24)
	lines := plainView(m)
	last := lines[len(lines)-1]
	if !strings.HasSuffix(strings.TrimRight(last, " "), "q quit") || !strings.Contains(last, "…") {
		t.Errorf("key line at 80 columns %q: want whole keys, … and q quit", last)
	}
	for _, k := range m.fr.keys.ShortHelp() {
		h := k.Help()
		item := h.Key + " " + h.Desc
		if strings.Contains(last, h.Key+" ") && !strings.Contains(last, item) {
			t.Errorf("key line cuts %q: %q", item, last)
		}
	}
}

// TestLegendNamesWholeWhereRoom: in best of all on a 200×60 screen the
// legend explains each facility letter with the facility's whole name; on
// 80×24 it keeps the first word.
func TestLegendNamesWholeWhereRoom(t *testing.T) {
	for _, size := range []struct {
		w, h int
		full bool
	}{{200, 60, true}, {80, 24, false}} {
		m := newDemo(t, size.w, size.h)
		m, _ = press(m, "b")
		legend := strings.Join(strings.Fields(ansi.Strip(m.legend.View(m.legendInput()))), " ")
		for k, f := range m.facs {
			want := string(facilityTag(k)) + " " + f.Name
			if !size.full {
				want = string(facilityTag(k)) + " " + strings.Fields(f.Name)[0]
			}
			if !strings.Contains(legend, want) {
				t.Errorf("%dx%d: legend lacks %q: %s", size.w, size.h, want, legend)
			}
		}
	}
}
