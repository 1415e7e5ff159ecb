package tui

import (
	"math"
	"strings"
	"testing"
)

// The steps are the ratios 1:N of a rounded ten-a-decade series; within a
// decade 1:100, 1:80, 1:64, 1:50, 1:40, 1:32, 1:25, 1:20, 1:16, 1:12.5,
// 1:10, and a scale between steps steps to its neighbours.
func TestScaleSteps(t *testing.T) {
	want := []float64{100, 80, 64, 50, 40, 32, 25, 20, 16, 12.5, 10}
	s := 1.0 / 100
	for k, n := range want[1:] {
		next, ok := scaleStep(s, true)
		if !ok || math.Abs(next-1/n) > 1e-12 {
			t.Fatalf("step %d up from 1:%g = %g, %v; want 1:%g", k+1, want[k], next, ok, n)
		}
		if back, _ := scaleStep(next, false); back != s {
			t.Errorf("down from 1:%g = %g, want 1:%g", n, back, want[k])
		}
		s = next
	}
	// The demo supersonic tunnel's own sizing, 0.0661, lies between 1:16
	// (0.0625) and 1:12.5 (0.08).
	if up, _ := scaleStep(0.0661, true); up != 0.08 {
		t.Errorf("up from 0.0661 = %g, want 0.08 (1:12.5)", up)
	}
	if down, _ := scaleStep(0.0661, false); down != 0.0625 {
		t.Errorf("down from 0.0661 = %g, want 0.0625 (1:16)", down)
	}
	// The ends: 10:1 (the largest scale a what-if takes) and 1:10000.
	if _, ok := scaleStep(10, true); ok {
		t.Error("a step above 10")
	}
	if _, ok := scaleStep(1e-4, false); ok {
		t.Error("a step below 1:10000")
	}
}

// + and - step the what-if model scale of every facility from the scale
// in force on screen (the cryogenic demo tunnel's is 0.025, 1:40), live
// and undoable, and the header says the scale is every facility's.
func TestScaleKeys(t *testing.T) {
	m := kellenAt9144(t, 120, 40)
	if got := m.res.maps[m.fac].Scale; got != 0.025 {
		t.Fatalf("demo cryogenic tunnel scale %g, want 0.025", got)
	}
	m, _ = press(m, "+")
	if m.set.Scale != 1.0/32 {
		t.Fatalf("+ from 1:40: what-if scale %g, want 1:32", m.set.Scale)
	}
	for k, mp := range m.res.maps {
		if mp != nil && mp.Scale != 1.0/32 {
			t.Errorf("facility %d solved at scale %g, want 1:32 for all", k, mp.Scale)
		}
	}
	if !strings.Contains(m.status, "model scale 1:32 for all facilities, a step up from 1:40 (U undoes)") {
		t.Errorf("status %q", m.status)
	}
	if head := strings.Join(strings.Fields(m.headerText()), " "); !strings.Contains(head, "model scale (all facilities) 1:32 (built-in facility sizing)") {
		t.Errorf("header does not say the scale is every facility's:\n%s", m.headerText())
	}
	m, _ = press(m, "-", "-")
	if m.set.Scale != 1.0/50 || m.res.maps[m.fac].Scale != 1.0/50 {
		t.Errorf("+ - -: scale %g (solved %g), want 1:50", m.set.Scale, m.res.maps[m.fac].Scale)
	}
	m, _ = press(m, "U", "U", "U")
	if m.set.Scale != 0 || m.res.maps[m.fac].Scale != 0.025 || len(m.changes()) != 0 {
		t.Errorf("after three undos: what-if scale %g, solved %g; want the facility's own sizing back", m.set.Scale, m.res.maps[m.fac].Scale)
	}
	// Best of all with no what-if scale: nothing to step from.
	m, _ = press(m, "b", "+")
	if m.set.Scale != 0 || !m.statusErr || !strings.Contains(m.status, "choose a facility") {
		t.Errorf("+ on best of all: scale %g, status %q", m.set.Scale, m.status)
	}
}
