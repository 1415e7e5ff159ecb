package tui

import (
	"reflect"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"

	"likewind/envelope/whatif"
)

// reportOf runs a component's command and returns its report (nil for
// none).
func reportOf(cmd tea.Cmd) tea.Msg {
	if cmd == nil {
		return nil
	}
	return cmd()
}

// The picker owns its keys: it moves its pointer itself and reports the
// choice; nothing of the root changes until the root takes the report.
func TestPickerReportsChoice(t *testing.T) {
	m := newDemo(t, 120, 40)
	m, _ = press(m, "f")
	p := m.picker
	if len(p.rows) != len(m.facs)+1 {
		t.Fatalf("picker rows = %d, want best of all and %d facilities", len(p.rows), len(m.facs))
	}
	p.Open(0)
	p, cmd := p.Update(keyMsg("down"))
	if cmd != nil || p.sel != 1 {
		t.Fatalf("down: sel %d, report %v; want the pointer on the first facility and no report", p.sel, reportOf(cmd))
	}
	p, _ = p.Update(keyMsg("up"))
	p, _ = p.Update(keyMsg("up")) // wraps to the last facility
	if p.sel != len(m.facs) {
		t.Errorf("up twice from the first facility: sel %d, want %d", p.sel, len(m.facs))
	}
	_, cmd = p.Update(keyMsg("enter"))
	if got, want := reportOf(cmd), (facilityChosenMsg{fac: len(m.facs) - 1}); got != want {
		t.Errorf("enter reports %#v, want %#v", got, want)
	}
	for k, want := range map[string]tea.Msg{"esc": panelClosedMsg{}, "f": panelClosedMsg{}, "?": helpWantedMsg{}, "q": quitWantedMsg{}} {
		if _, cmd := p.Update(keyMsg(k)); reportOf(cmd) != want {
			t.Errorf("%s reports %#v, want %#v", k, reportOf(cmd), want)
		}
	}
}

// The editor reads and checks the value itself and reports it; a refused
// value keeps the line open with the reason and reports nothing.
func TestEditorReportsAppliedField(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m, _ = press(m, "e")
	e := m.editor
	e.sel = int(whatif.P0Max)
	e, _ = e.Update(keyMsg("enter"))
	if !e.editing || e.input.Value() != "450.0 kPa" {
		t.Fatalf("enter on p0 max: editing %v, line %q; want the line open on the value", e.editing, e.input.Value())
	}
	e, _ = e.Update(keyMsg("ctrl+u"))
	for _, r := range "3 bar" {
		e, _ = e.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
	}
	e2, cmd := e.Update(keyMsg("enter"))
	if got, want := reportOf(cmd), (fieldAppliedMsg{edits: []whatif.Edit{{Field: whatif.P0Max, Value: 3e5}}}); !reflect.DeepEqual(got, want) || e2.editing {
		t.Errorf("enter on 3 bar reports %#v (editing %v), want %#v with the line closed", got, e2.editing, want)
	}
	e, _ = e.Update(keyMsg("ctrl+u"))
	e, _ = e.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("1 bar")})
	e, cmd = e.Update(keyMsg("enter"))
	if cmd != nil || !e.editing || !strings.Contains(e.err, "not below the facility's minimum") {
		t.Errorf("1 bar: report %#v, editing %v, err %q; want the refusal with the line open", reportOf(cmd), e.editing, e.err)
	}
	// The editor's reader checks the value against the other settings:
	// the compressibility threshold stays below the subsonic bound.
	e.sel = int(whatif.CompMach)
	e.begin("0.85")
	if _, cmd := e.Update(keyMsg("enter")); cmd != nil {
		t.Errorf("compressibility 0.85 reported %#v, want a refusal", reportOf(cmd))
	}
	// The root applied nothing of all this.
	if m.facs[m.fac].PressureMax() != m.fileFacs[m.fac].PressureMax() {
		t.Errorf("the editor changed the root's facility")
	}
}

// The details are computed when the point, the facility or the results
// change, and stored: View draws what is stored and computes nothing.
func TestViewDrawsStoredDetails(t *testing.T) {
	for _, size := range []struct{ w, h int }{{80, 24}, {160, 48}} {
		m := newDemo(t, size.w, size.h)
		if len(m.details.blocks.flight) == 0 {
			t.Fatalf("%d×%d: no details stored after New", size.w, size.h)
		}
		// A stored text that no computation gives is what View shows.
		const mark = "STORED-DETAILS"
		m.details.blocks.flight = append([]string{mark}, m.details.blocks.flight[1:]...)
		if !strings.Contains(m.View(), mark) {
			t.Errorf("%d×%d: View does not draw the stored details", size.w, size.h)
		}
		// With the engine's results gone, View still draws the stored
		// details (the engine would say "no grid").
		noRes := m
		noRes.res = results{}
		if v := noRes.View(); !strings.Contains(v, mark) || strings.Contains(v, "no grid") {
			t.Errorf("%d×%d: View asked the engine for the details:\n%s", size.w, size.h, v)
		}
		// A move computes them again, for the new point.
		before := m.curJ
		m, _ = press(m, "right")
		if m.curJ == before {
			t.Fatalf("%d×%d: the cursor did not move", size.w, size.h)
		}
		if strings.Contains(m.View(), mark) {
			t.Errorf("%d×%d: details not computed again after a move", size.w, size.h)
		}
		want := m.detailBlocks(m.details.key.width)
		if strings.Join(m.details.blocks.flight, "\n") != strings.Join(want.flight, "\n") ||
			strings.Join(m.details.blocks.facility, "\n") != strings.Join(want.facility, "\n") {
			t.Errorf("%d×%d: stored details differ from the cursor point's", size.w, size.h)
		}
		// Results that arrive replace the details too: a facility edit
		// changes the answer at the point.
		m.details.blocks.facility = []string{mark}
		m = edit(t, m, whatif.Scale, "0.2")
		if strings.Contains(strings.Join(m.details.blocks.facility, "\n"), mark) {
			t.Errorf("%d×%d: details not computed again when results arrived", size.w, size.h)
		}
	}
}

// A report is taken in the same Update as the key that caused it, so a key
// typed ahead (a paste, a fast typist, a script) goes where the screen
// says: after enter in the picker the matrix has the keyboard at once, and
// after enter on a value the edit is already in the undo history.
func TestReportTakenWithItsKey(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.fac = 0
	m, _ = press(m, "f", "down", "down")
	next, cmd := m.Update(keyMsg("enter"))
	m = next.(Model)
	if cmd != nil || m.mode != modeMain || m.fac != 2 {
		t.Errorf("one Update of enter in the picker: mode %v facility %d, command %v; want the matrix on the third facility and no command left", m.mode, m.fac, cmd != nil)
	}
	m, _ = press(m, "e", "enter", "ctrl+u")
	m = typeText(m, "0.3")
	next, cmd = m.Update(keyMsg("enter"))
	m = next.(Model)
	if m.set.Scale != 0.3 || len(m.undo) != 1 || m.editor.editing {
		t.Errorf("one Update of enter on a scale: scale %g, %d undo steps, editing %v; want it applied at once", m.set.Scale, len(m.undo), m.editor.editing)
	}
	if cmd == nil {
		t.Errorf("no recompute started for the edit")
	}
}

// A refusal in the editor is shown whole, wrapped over the panel's lines,
// never cut at its edge: in the side panel and below the matrix.
func TestEditorRefusalShownWhole(t *testing.T) {
	for _, size := range []struct{ w, h int }{{80, 24}, {120, 40}} {
		m := newDemo(t, size.w, size.h)
		m.fac = facilityNamed(t, m, "Kellen Fold")
		m = edit(t, m, whatif.P0Max, "1 bar")
		want := m.editor.err
		if !strings.Contains(want, "not below the facility's minimum 120000 Pa") {
			t.Fatalf("%d×%d: refusal %q", size.w, size.h, want)
		}
		// The panel as the body draws it, its lines joined.
		panel := strings.Join(strings.Fields(ansi.Strip(m.editor.View())), " ")
		if !strings.Contains(panel, strings.Join(strings.Fields(want), " ")) {
			t.Errorf("%d×%d: the refusal is not shown whole:\n%s", size.w, size.h, m.editor.View())
		}
	}
}
