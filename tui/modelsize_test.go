package tui

import (
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/whatif"
)

// cursorOnInside puts the cursor on the first inside point of the grid.
func cursorOnInside(t *testing.T, m Model) Model {
	t.Helper()
	g := m.res.grid
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				m.curI, m.curJ = i, j
				return m
			}
		}
	}
	t.Fatal("no inside point")
	return m
}

// A model scale the section cannot take, set in the what-if editor or
// brought in by a session, is a caution on the details panel: the flag by
// name on a narrow screen, the full caution on a wide one.
func TestModelTooLargeShownOnScreen(t *testing.T) {
	for _, size := range [][2]int{{80, 24}, {160, 48}} {
		m := newDemo(t, size[0], size[1])
		m.fac = facilityNamed(t, m, "Kellen Fold")
		m = cursorOnInside(t, m)
		if strings.Contains(m.View(), "too large") {
			t.Fatalf("%v: the files' scale 1/40 is shown as too large", size)
		}
		m = edit(t, m, whatif.Scale, "1/2")
		if m.editor.err != "" {
			t.Fatalf("edit error %q", m.editor.err)
		}
		m, _ = press(m, "esc")
		view := m.View()
		want := "model too large for the section"
		if m.wide {
			want = "Model too large for the section: scale 0.5"
		}
		if !strings.Contains(view, want) {
			t.Errorf("%v (wide %v): screen lacks %q after a what-if scale of 1/2:\n%s", size, m.wide, want, view)
		}
	}

	v, facs := demoData(t)
	half := 0.5
	s := &session.Session{Version: session.Version, Hash: session.DataHash(v, facs), WhatIf: whatif.Changes{Values: map[string]float64{"scale": half}}}
	m := newDemo(t, 160, 48, func(o *Options) { o.Session = s })
	if m.set.Scale != 0.5 {
		t.Fatalf("session scale not applied: %g (status %q)", m.set.Scale, m.status)
	}
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m = cursorOnInside(t, m)
	if k := m.fac; !m.res.maps[k].At(m.curI, m.curJ).Flags.Has(envelope.FlagModelTooLarge) {
		t.Errorf("session scale 0.5: cursor point not flagged")
	}
	if !strings.Contains(m.View(), "too large for the section") {
		t.Errorf("session scale 0.5: screen lacks the caution:\n%s", m.View())
	}
}
