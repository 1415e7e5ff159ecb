package tui

import (
	"strings"
	"testing"

	"likewind/envelope"
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
