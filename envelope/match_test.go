package envelope

import (
	"math"
	"strings"
	"testing"
)

// skinFrictionTol is the relative tolerance against the Prandtl–Schlichting
// formula evaluated by hand to five significant figures.
const skinFrictionTol = 1e-4

func TestClassNamesAndRank(t *testing.T) {
	order := []Class{FullMatch, MachRelaxed, ReShort, NoMatch, Outside}
	for k := 1; k < len(order); k++ {
		if !(order[k-1].Rank() < order[k].Rank()) {
			t.Errorf("Rank(%v) = %d not below Rank(%v) = %d", order[k-1], order[k-1].Rank(), order[k], order[k].Rank())
		}
	}
	seen := map[string]bool{}
	for c := Class(0); int(c) < NumClasses; c++ {
		n := c.String()
		if n == "" || seen[n] || strings.HasPrefix(n, "Class(") {
			t.Errorf("Class(%d).String() = %q: want a distinct name", c, n)
		}
		seen[n] = true
	}
	if !FullMatch.Matched() || !MachRelaxed.Matched() || ReShort.Matched() || NoMatch.Matched() || Outside.Matched() {
		t.Error("Matched: want true for full match and Mach relaxed only")
	}
	seen = map[string]bool{}
	for l := Limit(0); int(l) < numLimits; l++ {
		n := l.String()
		if n == "" || seen[n] || strings.HasPrefix(n, "Limit(") {
			t.Errorf("Limit(%d).String() = %q: want a distinct name", l, n)
		}
		seen[n] = true
	}
	if got := LimitIncompressible.String(); got != "Mach (incompressible medium)" {
		t.Errorf("LimitIncompressible = %q", got)
	}
	if got := (FlagCryogenic | FlagHighP0).String(); got != "cryogenic, high p0" {
		t.Errorf("Flags.String() = %q, want %q", got, "cryogenic, high p0")
	}
	if got := Flags(0).String(); got != "" {
		t.Errorf("Flags(0).String() = %q, want empty", got)
	}
}

func TestBetter(t *testing.T) {
	tests := []struct {
		a, b Result
		want bool
	}{
		{Result{Class: FullMatch, ReRatio: 0.92}, Result{Class: MachRelaxed, ReRatio: 1}, true},
		{Result{Class: MachRelaxed, ReRatio: 1}, Result{Class: ReShort, ReRatio: 0.89}, true},
		{Result{Class: ReShort, ReRatio: 0.2}, Result{Class: NoMatch, ReRatio: 0.9}, true},
		{Result{Class: NoMatch}, Result{Class: Outside}, true},
		// Same class: ratio nearer 1 on a log scale; |ln 0.85| = 0.163 < |ln 1.3| = 0.262.
		{Result{Class: FullMatch, ReRatio: 0.85}, Result{Class: FullMatch, ReRatio: 1.3}, true},
		{Result{Class: FullMatch, ReRatio: 1.3}, Result{Class: FullMatch, ReRatio: 0.85}, false},
		{Result{Class: NoMatch, ReRatio: 0}, Result{Class: NoMatch, ReRatio: 0.1}, false},
	}
	for _, tc := range tests {
		if got := Better(tc.a, tc.b); got != tc.want {
			t.Errorf("Better(%v %.2f, %v %.2f) = %v, want %v", tc.a.Class, tc.a.ReRatio, tc.b.Class, tc.b.ReRatio, got, tc.want)
		}
	}
}

// TestSkinFriction checks the Prandtl–Schlichting formula
// Cf = 0.455/(log10 Re)^2.58 (Schlichting, Boundary-Layer Theory),
// evaluated by hand:
//
//	Re = 1e7: 7^2.58 = e^(2.58 × 1.94591) = 151.48, Cf = 0.0030037
//	Re = 1e8: 8^2.58 = e^(2.58 × 2.07944) = 213.78, Cf = 0.0021283
//	ΔCf(model 1e7, flight 1e8) = 0.00087538
func TestSkinFriction(t *testing.T) {
	tests := []struct{ re, want float64 }{{1e7, 0.0030037}, {1e8, 0.0021283}}
	for _, tc := range tests {
		if got := SkinFriction(tc.re); relErr(got, tc.want) > skinFrictionTol {
			t.Errorf("SkinFriction(%g) = %.6g, want %.5g", tc.re, got, tc.want)
		}
	}
	if got := skinFrictionDelta(1e7, 1e8); relErr(got, 0.00087538) > skinFrictionTol {
		t.Errorf("skinFrictionDelta(1e7, 1e8) = %.6g, want 0.00087538", got)
	}
	if got := SkinFriction(1); !math.IsNaN(got) {
		t.Errorf("SkinFriction(1) = %v, want NaN", got)
	}
	if got := skinFrictionDelta(0, 1e8); got != 0 {
		t.Errorf("skinFrictionDelta(0, 1e8) = %v, want 0", got)
	}
}
