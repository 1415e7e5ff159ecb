package tui

import (
	"context"
	"math"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// TestUpdateKeys checks the effect of every main-screen key.
func TestUpdateKeys(t *testing.T) {
	base := newDemo(t, 80, 24)
	rows, cols := base.rows(), base.cols()
	if rows < 3 || cols < 3 {
		t.Fatalf("demo grid %d×%d, want at least 3×3", rows, cols)
	}
	mid := func(m Model) Model { m.curI, m.curJ = rows/2, cols/2; return m }
	cases := []struct {
		name  string
		setup func(Model) Model
		keys  []string
		check func(t *testing.T, before, after Model, quit bool)
	}{
		{"up moves to a higher altitude", mid, []string{"up"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curI != b.curI+1 || a.curJ != b.curJ {
				t.Errorf("cursor = (%d,%d), want (%d,%d)", a.curI, a.curJ, b.curI+1, b.curJ)
			}
		}},
		{"k moves up", mid, []string{"k"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curI != b.curI+1 {
				t.Errorf("row = %d, want %d", a.curI, b.curI+1)
			}
		}},
		{"down and j move down", mid, []string{"down", "j"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curI != b.curI-2 {
				t.Errorf("row = %d, want %d", a.curI, b.curI-2)
			}
		}},
		{"left and h move to lower speed", mid, []string{"left", "h"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curJ != b.curJ-2 {
				t.Errorf("column = %d, want %d", a.curJ, b.curJ-2)
			}
		}},
		{"right and l move to higher speed", mid, []string{"right", "l"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curJ != b.curJ+2 {
				t.Errorf("column = %d, want %d", a.curJ, b.curJ+2)
			}
		}},
		{"cursor stops at the grid edge", func(m Model) Model { m.curI, m.curJ = rows-1, cols-1; return m },
			[]string{"up", "right"}, func(t *testing.T, b, a Model, _ bool) {
				if a.curI != rows-1 || a.curJ != cols-1 {
					t.Errorf("cursor = (%d,%d), want (%d,%d)", a.curI, a.curJ, rows-1, cols-1)
				}
			}},
		{"pgup jumps a page up", func(m Model) Model { m.curI = 0; return m }, []string{"pgup"}, func(t *testing.T, b, a Model, _ bool) {
			want := min(max(b.visibleRows()-1, 1), rows-1)
			if a.curI != want {
				t.Errorf("row = %d, want %d", a.curI, want)
			}
		}},
		{"pgdown jumps a page down", func(m Model) Model { m.curI = rows - 1; return m }, []string{"pgdown"}, func(t *testing.T, b, a Model, _ bool) {
			want := max(rows-1-max(b.visibleRows()-1, 1), 0)
			if a.curI != want {
				t.Errorf("row = %d, want %d", a.curI, want)
			}
		}},
		{"home goes to the slowest column", mid, []string{"home"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curJ != 0 {
				t.Errorf("column = %d, want 0", a.curJ)
			}
		}},
		{"end goes to the fastest column", mid, []string{"end"}, func(t *testing.T, b, a Model, _ bool) {
			if a.curJ != cols-1 {
				t.Errorf("column = %d, want %d", a.curJ, cols-1)
			}
		}},
		{"tab cycles the layers and wraps", nil, []string{"tab", "tab", "tab", "tab", "tab", "tab"}, func(t *testing.T, b, a Model, _ bool) {
			if a.layer != LayerClass {
				t.Errorf("layer after six tabs = %v, want %v", a.layer, LayerClass)
			}
		}},
		{"tab after the q layer shows the model load", nil, []string{"tab", "tab", "tab", "tab"}, func(t *testing.T, b, a Model, _ bool) {
			if a.layer != LayerLoad {
				t.Errorf("layer after four tabs = %v, want %v", a.layer, LayerLoad)
			}
		}},
		{"tab once shows the regime layer", nil, []string{"tab"}, func(t *testing.T, b, a Model, _ bool) {
			if a.layer != LayerRegime {
				t.Errorf("layer = %v, want %v", a.layer, LayerRegime)
			}
		}},
		{"u toggles units", nil, []string{"u"}, func(t *testing.T, b, a Model, _ bool) {
			if a.units != units.Customary {
				t.Errorf("units = %v, want customary", a.units)
			}
			if !strings.Contains(a.View(), "altitude ft") {
				t.Errorf("view after u does not label the altitude axis in ft")
			}
		}},
		{"f opens the picker, esc closes it", nil, []string{"f"}, func(t *testing.T, b, a Model, _ bool) {
			if a.mode != modePicker {
				t.Fatalf("mode = %v, want picker", a.mode)
			}
			c, _ := press(a, "esc")
			if c.mode != modeMain {
				t.Errorf("mode after esc = %v, want main", c.mode)
			}
		}},
		{"picker chooses a facility", func(m Model) Model { m.fac = 0; return m }, []string{"f", "down", "down", "enter"}, func(t *testing.T, b, a Model, _ bool) {
			// Rows: best of all, then facilities; the picker starts on the
			// current facility (0), so two downs land on facility 2.
			if a.fac != 2 || a.mode != modeMain {
				t.Errorf("facility = %d mode %v, want 2 main", a.fac, a.mode)
			}
		}},
		{"] and [ step through facilities", func(m Model) Model { m.fac = 0; return m }, []string{"]", "]", "["}, func(t *testing.T, b, a Model, _ bool) {
			if a.fac != b.fac+1 {
				t.Errorf("facility = %d, want %d", a.fac, b.fac+1)
			}
		}},
		{"[ from the first facility goes to best of all", func(m Model) Model { m.fac = 0; return m }, []string{"["}, func(t *testing.T, b, a Model, _ bool) {
			if a.fac != -1 {
				t.Errorf("facility = %d, want -1 (best of all)", a.fac)
			}
		}},
		{"b toggles best of all and back", func(m Model) Model { m.fac = 3; return m }, []string{"b"}, func(t *testing.T, b, a Model, _ bool) {
			if a.fac != -1 {
				t.Fatalf("facility = %d, want -1", a.fac)
			}
			c, _ := press(a, "b")
			if c.fac != 3 {
				t.Errorf("facility after second b = %d, want 3", c.fac)
			}
		}},
		{"e opens the what-if editor", nil, []string{"e"}, func(t *testing.T, b, a Model, _ bool) {
			if a.mode != modeEdit {
				t.Errorf("mode = %v, want edit", a.mode)
			}
		}},
		{"? opens help and ? closes it", nil, []string{"?"}, func(t *testing.T, b, a Model, _ bool) {
			if a.mode != modeHelp {
				t.Fatalf("mode = %v, want help", a.mode)
			}
			c, _ := press(a, "?")
			if c.mode != modeMain {
				t.Errorf("mode after ? = %v, want main", c.mode)
			}
		}},
		{"space marks and unmarks an inside point", nil, []string{"space"}, func(t *testing.T, b, a Model, _ bool) {
			idx := a.res.grid.Index(a.curI, a.curJ)
			if !a.marks[idx] {
				t.Fatalf("point not marked after space")
			}
			if b.marks[idx] {
				t.Errorf("space changed the marks of the model before the key")
			}
			c, _ := press(a, "space")
			if c.marks[idx] {
				t.Errorf("point still marked after second space")
			}
		}},
		{"space refuses an outside point", func(m Model) Model {
			for j := 0; j < cols; j++ {
				if !m.res.grid.Inside(0, j) {
					m.curI, m.curJ = 0, j
					return m
				}
			}
			t.Fatal("no outside point on row 0")
			return m
		}, []string{"space"}, func(t *testing.T, b, a Model, _ bool) {
			if len(a.marks) != 0 || !a.statusErr {
				t.Errorf("marks = %d statusErr %v, want 0 and an error message", len(a.marks), a.statusErr)
			}
		}},
		{"M marks every full match of the facility", func(m Model) Model { m.fac = 2; return m }, []string{"M"}, func(t *testing.T, b, a Model, _ bool) {
			want := a.res.maps[2].Shares().Count[envelope.FullMatch]
			if want == 0 {
				t.Fatal("demo facility 2 has no full match; pick another")
			}
			if len(a.marks) != want {
				t.Errorf("marks = %d, want %d full-match points", len(a.marks), want)
			}
			for idx := range a.marks {
				if a.res.maps[2].Results[idx].Class != envelope.FullMatch {
					t.Errorf("marked point %d has class %v", idx, a.res.maps[2].Results[idx].Class)
				}
			}
		}},
		{"X clears the marks", func(m Model) Model { m.fac = 2; return m }, []string{"M", "X"}, func(t *testing.T, b, a Model, _ bool) {
			if len(a.marks) != 0 {
				t.Errorf("marks = %d after X, want 0", len(a.marks))
			}
		}},
		{"s without a session file says so", nil, []string{"s"}, func(t *testing.T, b, a Model, _ bool) {
			if !a.statusErr || !strings.Contains(a.status, "no session file") {
				t.Errorf("status = %q, want a no-session-file error", a.status)
			}
		}},
		{"q quits at once when nothing is unsaved", nil, []string{"q"}, func(t *testing.T, b, a Model, quit bool) {
			if !quit || a.mode == modeConfirm {
				t.Errorf("quit = %v mode %v, want quit without question", quit, a.mode)
			}
		}},
		{"q asks first with unsaved marks", nil, []string{"space", "q"}, func(t *testing.T, b, a Model, quit bool) {
			if quit || a.mode != modeConfirm {
				t.Fatalf("quit = %v mode %v, want the question", quit, a.mode)
			}
			c, _ := press(a, "n")
			if c.mode != modeMain {
				t.Errorf("mode after n = %v, want main", c.mode)
			}
			d, q := press(a, "y")
			if !q || !d.discard || d.WantsSave() {
				t.Errorf("after y: quit %v discard %v, want quit and discard", q, d.discard)
			}
		}},
		{"R with nothing changed leaves the results", nil, []string{"R"}, func(t *testing.T, b, a Model, _ bool) {
			if a.res.grid != b.res.grid {
				t.Errorf("R recomputed although nothing changed")
			}
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := base
			if c.setup != nil {
				m = c.setup(m)
				m.relayout()
			}
			after, quit := press(m, c.keys...)
			c.check(t, m, after, quit)
		})
	}
}

// edit opens the editor on field f, types text and applies it.
func edit(t *testing.T, m Model, f whatif.Field, text string) Model {
	t.Helper()
	if m.mode != modeEdit {
		m, _ = press(m, "e")
	}
	for n := 0; m.editor.field() != f; n++ {
		if n > int(whatif.FieldCount) || m.mode != modeEdit {
			t.Fatalf("cannot reach field %v in the editor", f.Label(false))
		}
		m, _ = press(m, "down")
	}
	m, _ = press(m, "enter")
	if !m.editor.editing {
		t.Fatalf("input line did not open for %v (err %q)", f.Label(false), m.editor.err)
	}
	m, _ = press(m, "ctrl+u")
	m = typeText(m, text)
	m, _ = press(m, "enter")
	return m
}

func TestWhatIfFacilityEditResolvesOnlyThatFacility(t *testing.T) {
	m := newDemo(t, 80, 24)
	k := facilityNamed(t, m, "Harl Cove")
	m.fac = k
	before := m
	m = edit(t, m, whatif.P0Max, "3 bar")
	if m.editor.err != "" {
		t.Fatalf("edit error %q", m.editor.err)
	}
	if got, want := m.facs[k].PressureMax(), 3e5; got != want {
		t.Errorf("p0 max = %g Pa, want %g", got, want)
	}
	if m.fileFacs[k].PressureMax() == 3e5 || before.facs[k].PressureMax() == 3e5 {
		t.Errorf("the edit changed the files' values or the earlier model")
	}
	if m.res.grid != before.res.grid {
		t.Errorf("a facility edit rebuilt the grid; only Solve should run")
	}
	for j := range m.res.maps {
		same := m.res.maps[j] == before.res.maps[j]
		if j == k && same {
			t.Errorf("map of the edited facility was not re-solved")
		}
		if j != k && !same {
			t.Errorf("map of facility %d was re-solved; only %d should be", j, k)
		}
	}
	if m.res.maps[k].Facility.PressureMax() != 3e5 {
		t.Errorf("re-solved map used p0 max %g, want 3e5", m.res.maps[k].Facility.PressureMax())
	}
	head := m.headerText()
	if !strings.Contains(head, "what-if:") || !strings.Contains(head, "p0 max 300") {
		t.Errorf("header does not list the change:\n%s", head)
	}
	if !m.hasUnsaved() {
		t.Errorf("hasUnsaved() = false after an edit")
	}
	// R restores the files' values.
	r, _ := press(m, "esc", "R")
	if r.facs[k].PressureMax() != r.fileFacs[k].PressureMax() || len(r.changes()) != 0 {
		t.Errorf("after R: p0 max %g, changes %v; want the file value and none", r.facs[k].PressureMax(), r.changes())
	}
}

func TestWhatIfDeltaTRebuildsGrid(t *testing.T) {
	m := newDemo(t, 80, 24)
	before := m
	m = edit(t, m, whatif.DeltaT, "-150 degC")
	if m.editor.err == "" {
		t.Errorf("ΔT of -150 K accepted; want a range error")
	}
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "15")
	m, _ = press(m, "enter")
	if m.editor.err != "" {
		t.Fatalf("edit error %q", m.editor.err)
	}
	if m.set.DeltaT != 15 {
		t.Errorf("ΔT = %g K, want 15 (a bare number takes K in SI)", m.set.DeltaT)
	}
	if m.res.grid == before.res.grid || m.res.grid.DeltaT != 15 {
		t.Errorf("grid not rebuilt for the new ΔT")
	}
}

func TestWhatIfT0MinTakesUnits(t *testing.T) {
	m := newDemo(t, 80, 24)
	k := facilityNamed(t, m, "Kellen Fold")
	m.fac = k
	m = edit(t, m, whatif.T0Min, "-150 degC")
	if m.editor.err != "" {
		t.Fatalf("edit error %q", m.editor.err)
	}
	// -150 °C = 123.15 K (definition of the Celsius scale).
	if got := m.facs[k].TemperatureMin(); got < 123.149 || got > 123.151 {
		t.Errorf("T0 min = %g K, want 123.15", got)
	}
}

// A long entry is taken whole: the unit at its end is not cut off (it
// once was at 40 characters, so 1000 psi became 1000 kPa).
func TestWhatIfLongEntryTakenWhole(t *testing.T) {
	m := newDemo(t, 80, 24)
	k := facilityNamed(t, m, "Harl Cove")
	m.fac = k
	long := "1000." + strings.Repeat("0", 60) + " psi"
	m = edit(t, m, whatif.P0Max, long)
	if m.editor.err != "" {
		t.Fatalf("edit error %q", m.editor.err)
	}
	// 1 psi = 6894.757 Pa (NIST SP 811, Appendix B.8).
	if got, want := m.facs[k].PressureMax(), 1000*6894.757293168361; math.Abs(got-want) > 1e-6*want {
		t.Errorf("p0 max = %.6g Pa after %d characters, want %.6g (1000 psi)", got, len(long), want)
	}
	// Beyond any value's length the typed text is refused with a message
	// as it is typed, the line holds what it took, and nothing is applied.
	before := m.facs[k].PressureMax()
	m, _ = press(m, "enter", "ctrl+u")
	m = typeText(m, "3"+strings.Repeat("0", whatif.MaxEntry)+" Pa")
	if !strings.Contains(m.editor.err, "p0 max: the entry would be 1025 characters long, expected at most 1024") || !m.editor.editing {
		t.Errorf("over-long entry: err %q editing %v, want a refusal naming the length with the line open", m.editor.err, m.editor.editing)
	}
	if got := m.editor.input.Value(); utf8.RuneCountInString(got) != whatif.MaxEntry {
		t.Errorf("input line holds %d characters, want the %d taken", utf8.RuneCountInString(got), whatif.MaxEntry)
	}
	m, _ = press(m, "enter")
	if m.facs[k].PressureMax() != before || m.editor.err == "" || !m.editor.editing {
		t.Errorf("over-long entry applied: p0 max %g, err %q", m.facs[k].PressureMax(), m.editor.err)
	}
}

// The editor takes a scale as the files write it and the word "fit", and
// refuses 0 and a ΔT the files refuse.
func TestWhatIfScaleFormsAndBounds(t *testing.T) {
	m := newDemo(t, 80, 24)
	for _, text := range []string{"1/20", "1:20", "5 %", "0.05"} {
		m = edit(t, m, whatif.Scale, text)
		if m.editor.err != "" || m.set.Scale != 0.05 {
			t.Errorf("scale %q: err %q, scale %g; want 0.05", text, m.editor.err, m.set.Scale)
		}
		m, _ = press(m, "esc")
	}
	m = edit(t, m, whatif.Scale, "0")
	if !strings.Contains(m.editor.err, `"fit"`) || m.set.Scale != 0.05 {
		t.Errorf("scale 0: err %q, scale %g; want a refusal naming the word fit, scale kept", m.editor.err, m.set.Scale)
	}
	m, _ = press(m, "esc")
	m = edit(t, m, whatif.Scale, "fit")
	if m.editor.err != "" || m.set.Scale != 0 {
		t.Errorf("scale fit: err %q, scale %g; want each facility's own sizing (0)", m.editor.err, m.set.Scale)
	}
	m, _ = press(m, "esc")
	m = edit(t, m, whatif.DeltaT, "70 K")
	if !strings.Contains(m.editor.err, "±60 K") || m.set.DeltaT != 0 {
		t.Errorf("ΔT 70 K: err %q, ΔT %g; want the files' ±60 K bound", m.editor.err, m.set.DeltaT)
	}
}

func TestWhatIfBadInputKeepsEditing(t *testing.T) {
	m := newDemo(t, 80, 24)
	before := m
	m = edit(t, m, whatif.MachTol, "fast")
	if m.editor.err == "" || !m.editor.editing {
		t.Errorf("err %q editing %v, want an error with the line still open", m.editor.err, m.editor.editing)
	}
	if m.busy || m.gen != before.gen {
		t.Errorf("bad input started a recompute")
	}
}

func TestStaleRecomputeIgnored(t *testing.T) {
	m := newDemo(t, 80, 24)
	m.fac = 0
	cmd1 := m.recompute(recomputeSolve)
	old := finished(cmd1).(computedMsg)
	cmd2 := m.recompute(recomputeSolve)
	newer := finished(cmd2).(computedMsg)
	got, _ := drive(m, old)
	if !got.busy {
		t.Errorf("an outdated result ended the running recompute")
	}
	got, _ = drive(got, newer)
	if got.busy || got.res.maps[0] != newer.res.maps[0] {
		t.Errorf("the latest result was not taken")
	}
}

func TestSaveKeyWritesSession(t *testing.T) {
	path := filepath.Join(t.TempDir(), "s.json")
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = path })
	m, _ = press(m, "space", "s")
	if m.statusErr {
		t.Fatalf("save failed: %s", m.status)
	}
	if m.hasUnsaved() {
		t.Errorf("still unsaved after s")
	}
	s, err := session.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Marks) != 1 {
		t.Errorf("saved marks = %d, want 1", len(s.Marks))
	}
	// Quitting now asks nothing.
	if _, quit := press(m, "q"); !quit {
		t.Errorf("q after save did not quit")
	}
}

func TestQuitQuestionOffersSave(t *testing.T) {
	path := filepath.Join(t.TempDir(), "s.json")
	m := newDemo(t, 80, 24, func(o *Options) { o.SessionPath = path })
	m, _ = press(m, "space", "q")
	if m.mode != modeConfirm {
		t.Fatalf("mode = %v, want confirm", m.mode)
	}
	if !strings.Contains(m.View(), "save and quit") {
		t.Errorf("question does not offer saving")
	}
	m, quit := press(m, "s")
	if !quit || m.WantsSave() {
		t.Errorf("s at the question: quit %v wantsSave %v, want quit with nothing left to save", quit, m.WantsSave())
	}
	s, err := session.Load(path)
	if err != nil || len(s.Marks) != 1 {
		t.Errorf("saved session %+v, %v; want the one mark", s, err)
	}
}

func TestResizeReflows(t *testing.T) {
	m := newDemo(t, 80, 24)
	if m.wide {
		t.Fatalf("80 columns laid out wide")
	}
	m, _ = drive(m, tea.WindowSizeMsg{Width: 160, Height: 48})
	if !m.wide {
		t.Errorf("160 columns not laid out wide")
	}
	m, _ = drive(m, tea.WindowSizeMsg{Width: 30, Height: 8})
	if !strings.Contains(m.View(), "too small") {
		t.Errorf("30×8 view does not say the terminal is too small:\n%s", m.View())
	}
}

func TestInputLineEditing(t *testing.T) {
	k := DefaultKeyMap()
	l := newInputLine(&k, "> ", "", whatif.MaxEntry, nil)
	send := func(msgs ...tea.KeyMsg) {
		for _, msg := range msgs {
			l, _ = l.Update(msg)
		}
	}
	for _, r := range "3 br" {
		send(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
	}
	send(keyMsg("left"), tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{'a'}})
	if got := l.Value(); got != "3 bar" {
		t.Errorf("value = %q, want %q", got, "3 bar")
	}
	send(keyMsg("home"), keyMsg("delete"), keyMsg("end"), keyMsg("backspace"))
	if got := l.Value(); got != " ba" {
		t.Errorf("value = %q, want %q", got, " ba")
	}
	// ctrl+u clears the whole line, wherever the cursor is.
	send(keyMsg("left"), keyMsg("ctrl+u"))
	if l.Value() != "" {
		t.Errorf("value after ctrl+u = %q, want empty", l.Value())
	}
	// The space key types a space; control characters typed or pasted
	// are dropped (ESC, BEL, newline, DEL, a C1 CSI).
	send(keyMsg("space"), tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("1\x1b[31m\a\n\x7f\u009b0 K"), Paste: true})
	if got := l.Value(); got != " 1[31m0 K" {
		t.Errorf("value = %q, want the controls dropped", got)
	}
	// The keys the help screen does not list do nothing to the text.
	send(tea.KeyMsg{Type: tea.KeyCtrlW}, tea.KeyMsg{Type: tea.KeyCtrlK}, tea.KeyMsg{Type: tea.KeyCtrlV}, tea.KeyMsg{Type: tea.KeyTab})
	if got := l.Value(); got != " 1[31m0 K" {
		t.Errorf("value = %q after unlisted keys, want it unchanged", got)
	}
}

// The input line takes entries whole up to its limit. Text that would go
// beyond is refused with a message, never cut to fit; what is in the line
// is exactly what enter reads.
func TestInputLineLimit(t *testing.T) {
	k := DefaultKeyMap()
	l := newInputLine(&k, "> ", "12", 5, nil)
	l, _ = l.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("3456"), Paste: true})
	if l.Value() != "12" || !strings.Contains(l.Refused(), "would be 6 characters long, expected at most 5; the pasted text was not taken") {
		t.Errorf("paste past the limit: value %q, refused %q; want the line unchanged and the refusal", l.Value(), l.Refused())
	}
	l, _ = l.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("345"), Paste: true})
	if l.Value() != "12345" || l.Refused() != "" {
		t.Errorf("paste up to the limit: value %q, refused %q; want it taken whole", l.Value(), l.Refused())
	}
	l, _ = l.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{'6'}})
	if l.Value() != "12345" || !strings.Contains(l.Refused(), "the typed text was not taken") {
		t.Errorf("typing past the limit: value %q, refused %q", l.Value(), l.Refused())
	}
	// An offered text longer than the limit is kept whole.
	long := strings.Repeat("x", 10)
	if l := newInputLine(&k, "> ", long, 5, nil); l.Value() != long {
		t.Errorf("offered %q, line holds %q", long, l.Value())
	}
	// The Validate hook sees the text as it stands.
	l = newInputLine(&k, "> ", "", 5, func(s string) error {
		if s == "" {
			return nil
		}
		_, err := whatif.MachTol.Parse(s, units.SI, nil)
		return err
	})
	l, _ = l.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("2")})
	if l.Err() == nil || !strings.Contains(l.Err().Error(), "Mach tolerance") {
		t.Errorf("Validate hook: Err %v, want the parser's refusal of 2", l.Err())
	}
}

// TestIncrementalBestMatchesBest checks the best-of-all update after a
// single-facility edit against envelope.Best over all maps: limits made
// tighter (answers get worse, the winner may change), then put back one
// by one (answers get better), on the demo grid and on a finer one.
func TestIncrementalBestMatchesBest(t *testing.T) {
	fine := func(o *Options) {
		v := *o.Vehicle
		v.Grid.Altitude.Count, v.Grid.Altitude.Step = 150, 0
		v.Grid.Speed.Count, v.Grid.Speed.Step = 150, 0
		o.Vehicle = &v
	}
	for _, m := range []Model{newDemo(t, 80, 24), newDemo(t, 80, 24, fine)} {
		names := []string{"Harl Cove", "Kellen Fold", "Skerrow", "Aldmoor", "Wenlow", "Bracken Ness"}
		check := func(name string, k int, facs []envelope.Facility) {
			t.Helper()
			got, err := solveOne(context.Background(), m.res, facs, m.set, k, nil, nil)
			if err != nil {
				t.Fatal(err)
			}
			wantIdx, wantRes := envelope.Best(got.maps)
			for p := range wantIdx {
				if r, w := got.bestAt(p); w != wantIdx[p] || r != wantRes[p] {
					t.Fatalf("%s: point %d: best = %d %+v, want %d %+v", name, p, w, r, wantIdx[p], wantRes[p])
				}
			}
			sh := envelope.BestShares(got.maps)
			if got.union != sh.Matched() || got.bestFull != sh.Share(envelope.FullMatch) {
				t.Fatalf("%s: union %v, best full %v; want %v, %v", name, got.union, got.bestFull, sh.Matched(), sh.Share(envelope.FullMatch))
			}
			// Staged: the early window's best of all is already final,
			// and the whole is the same.
			cols := m.res.grid.Cols()
			earlyBest := map[int]int{} // point → early winner
			first := envelope.Window{Rows: envelope.Span{Lo: 10, Hi: 17}, Cols: envelope.Span{Lo: 5, Hi: 21}}
			staged, err := solveOne(context.Background(), m.res, facs, m.set, k, nil, &early{win: first,
				send: func(r results, w envelope.Window) {
					for i := w.Rows.Lo; i < w.Rows.Hi; i++ {
						for j := w.Cols.Lo; j < w.Cols.Hi; j++ {
							earlyBest[i*cols+j] = r.best[i*cols+j]
						}
					}
				}})
			if err != nil {
				t.Fatal(err)
			}
			if len(earlyBest) != first.Rows.Len()*first.Cols.Len() {
				t.Fatalf("%s: early best of all of %d points, want %d", name, len(earlyBest), first.Rows.Len()*first.Cols.Len())
			}
			for p, w := range earlyBest {
				if w != wantIdx[p] {
					t.Fatalf("%s: early best at %d: %d, want %d", name, p, w, wantIdx[p])
				}
			}
			for p := range wantIdx {
				if staged.best[p] != wantIdx[p] {
					t.Fatalf("%s: staged best at %d: %d, want %d", name, p, staged.best[p], wantIdx[p])
				}
			}
			if staged.union != got.union || staged.bestFull != got.bestFull {
				t.Fatalf("%s: staged union %v best full %v, want %v %v", name, staged.union, staged.bestFull, got.union, got.bestFull)
			}
			m.res = got
			m.facs = facs
		}
		for _, name := range names {
			k := facilityNamed(t, m, name)
			facs := append([]envelope.Facility(nil), m.facs...)
			facs[k].SetPressureMax(facs[k].PressureMin() + 0.7*(facs[k].PressureMax()-facs[k].PressureMin()))
			facs[k].QMax *= 0.5
			check(name+" tighter", k, facs)
		}
		for _, name := range names {
			k := facilityNamed(t, m, name)
			facs := append([]envelope.Facility(nil), m.facs...)
			facs[k] = m.fileFacs[k]
			check(name+" put back", k, facs)
		}
	}
}

// TestNoDataNoFacilities: the screen works without a vehicle and without
// facilities, and every key is safe.
func TestNoDataNoFacilities(t *testing.T) {
	v, _ := demoData(t)
	st := PlainStyles()
	for name, o := range map[string]Options{
		"no vehicle":    {Styles: &st},
		"no facilities": {Vehicle: v, Styles: &st},
	} {
		m := New(o)
		for _, k := range fuzzKeys {
			m, _ = press(m, k)
			checkFits(t, m.View(), 80, 24)
		}
		m, _ = press(m, "esc", "esc")
		out := m.View()
		if name == "no facilities" && !strings.Contains(out, "no facilities") {
			t.Errorf("%s: view does not say so:\n%s", name, out)
		}
		if name == "no vehicle" && !strings.Contains(out, "no vehicle") {
			t.Errorf("%s: view does not say so:\n%s", name, out)
		}
	}
}

// The interface opens on the facility with the most full matches
// (StartFacility), not simply the first in the file.
func TestStartsOnBestCoveredFacility(t *testing.T) {
	m := newDemo(t, 120, 40)
	best, bestFull := -1, -1.0
	for k, mp := range m.res.maps {
		if f := mp.Shares().Share(envelope.FullMatch); f > bestFull {
			best, bestFull = k, f
		}
	}
	if m.fac != best {
		t.Errorf("start facility = %d, want %d (largest full-match share %.3f)", m.fac, best, bestFull)
	}
	if StartFacility(nil) != -1 {
		t.Errorf("StartFacility(nil) = %d, want -1", StartFacility(nil))
	}
}

// TestWhatIfOriginNamed: the editor and the header say where each starting
// value comes from: the built-in defaults for the tolerances and the scale
// override, the vehicle for ΔT, the facility for its limits; never "files"
// for a built-in default.
func TestWhatIfOriginNamed(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m = edit(t, m, whatif.MachTol, "0.02")
	m = edit(t, m, whatif.DeltaT, "5 K")
	m = edit(t, m, whatif.P0Max, "3 bar")
	rows := m.editorRows()
	want := map[whatif.Field]string{
		whatif.MachTol: "built-in 0.0100",
		whatif.DeltaT:  "demo vehicle +0.0 K",
		whatif.P0Max:   "demo facility 450.0 kPa",
	}
	for f, w := range want {
		if rows[f].origin != w {
			t.Errorf("%s: origin %q, want %q", f.Label(false), rows[f].origin, w)
		}
	}
	screen := m.View()
	head := m.headerText()
	for _, w := range want {
		if !strings.Contains(head, "("+w+")") {
			t.Errorf("header lacks %q:\n%s", "("+w+")", head)
		}
	}
	if strings.Contains(screen, "(files") {
		t.Errorf("screen still says \"(files …)\":\n%s", screen)
	}
	// Loaded from files, the vehicle and the facility are named as files.
	v := *m.vehicle
	v.Source = "corvane.toml"
	m.vehicle = &v
	m.fileFacs = append([]envelope.Facility(nil), m.fileFacs...)
	m.fileFacs[m.fac].Source = "facilities.toml"
	rows = m.editorRows()
	if rows[whatif.DeltaT].origin != "vehicle file +0.0 K" || rows[whatif.P0Max].origin != "facility file 450.0 kPa" {
		t.Errorf("origins from files: %q, %q", rows[whatif.DeltaT].origin, rows[whatif.P0Max].origin)
	}
}
