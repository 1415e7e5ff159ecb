package tui

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// The details grade a Reynolds shortfall by its skin-friction effect.
// Hand-worked with the Prandtl–Schlichting formula Cf = 0.455/(log10 Re)^2.58:
// flight Re 2.47e7: log10 = 7.3927, ^2.58 = 174.4, Cf = 0.002609;
// model Re 1.81e7: log10 = 7.2577, ^2.58 = 166.3, Cf = 0.002736;
// ΔCf = +0.000127, +4.9 % of the flight value.
func TestSkinFrictionNote(t *testing.T) {
	cases := []struct {
		name         string
		re, reFlight float64
		want         []string
		notWant      string
	}{
		{"transonic shortfall", 1.81e7, 2.47e7, []string{"+0.00013", "+5 % of flight Cf"}, "outside"},
		{"model below the formula's range", 5e4, 2e6, []string{"outside formula range"}, ""},
		{"flight above the formula's range", 8e8, 3e9, []string{"outside formula range"}, ""},
	}
	for _, c := range cases {
		det := envelope.Detail{Re: c.re, ReFlight: c.reFlight,
			DCf: envelope.SkinFriction(c.re) - envelope.SkinFriction(c.reFlight)}
		got := skinFrictionNote(det)
		for _, w := range c.want {
			if !strings.Contains(got, w) {
				t.Errorf("%s: skinFrictionNote(Re %g, flight %g) = %q, want it to contain %q", c.name, c.re, c.reFlight, got, w)
			}
		}
		if c.notWant != "" && strings.Contains(got, c.notWant) {
			t.Errorf("%s: skinFrictionNote = %q, want no %q", c.name, got, c.notWant)
		}
	}
	if got := skinFrictionNote(envelope.Detail{Re: 0.5, ReFlight: 0.5}); got != "n/a" {
		t.Errorf("skinFrictionNote(Re 0.5) = %q, want n/a", got)
	}
}

// TestDetailsStateOperatingRule: where a facility has a setting, the
// details panel says which of the settings that reach the target was
// taken, and the README states the same operating rule.
func TestDetailsStateOperatingRule(t *testing.T) {
	want := map[string]string{
		"Kellen Fold": "rule warmest T0, then lowest p0",
		"Wenlow":      "rule warmest water, then lowest speed",
	}
	readme, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	text := strings.Join(strings.Fields(string(readme)), " ")
	if !strings.Contains(text, "Operating rule.") ||
		!strings.Contains(text, "for a gas facility the warmest T0, then the lowest p0") ||
		!strings.Contains(text, "for a water tunnel the warmest water (lowest viscosity), then the lowest speed") {
		t.Errorf("README does not state the operating rule")
	}
	vs, err := envelope.DemoVehicles()
	if err != nil {
		t.Fatal(err)
	}
	for name, line := range want {
		found := false
		for _, v := range vs {
			// Without the demo's balances, which take no model as large as
			// the one below.
			m := newDemo(t, 120, 40, func(o *Options) { o.Vehicle = v }, noLoads)
			m.fac = facilityNamed(t, m, name)
			// A larger model than the facilities' own, so that the water
			// tunnel matches somewhere too.
			m = edit(t, m, whatif.Scale, "0.2")
			m, _ = press(m, "esc")
			mp := m.res.maps[m.fac]
			for p, r := range mp.Results {
				i, j := p/m.res.grid.Cols(), p%m.res.grid.Cols()
				m.curI, m.curJ = i, j
				m.relayout()
				panel := strings.Join(m.detailBlocks(m.sideW).facility, "\n")
				if r.Class.Matched() {
					found = true
					if !strings.Contains(panel, line) {
						t.Errorf("%s (%d,%d) %s: details lack %q:\n%s", name, i, j, r.Class, line, panel)
					}
				} else if strings.Contains(panel, "rule ") {
					// Short of the target there is one best setting, no choice.
					t.Errorf("%s (%d,%d) %s: details state the rule though no setting reaches the target", name, i, j, r.Class)
				}
			}
		}
		if !found {
			t.Errorf("%s: no matched point in the demo", name)
		}
	}
}
