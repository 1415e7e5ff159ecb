package envelope

import (
	"slices"
	"strings"
	"testing"
)

// sizeCase solves the demo (invented data) with settings changed by edit
// and returns the evaluation and the index of the Kellen Fold tunnel.
//
// Kellen Fold's section is 2.4 m × 2.0 m (4.8 m²) and the Corvane SX-3
// has a 7.2 m span and 1.65 m² frontal area, so by hand the section takes
// a span of 80 % × 2.4 m: scale 0.8 × 2.4/7.2 = 0.267; a blockage of 5 %
// below Mach 0.6: √(0.05 × 4.8/1.65) = 0.381; of 1 % from Mach 0.6:
// √(0.01 × 4.8/1.65) = 0.171 (default shares, common practice). The
// largest model is 0.267 below Mach 0.6 and 0.171 from it.
func sizeCase(t *testing.T, edit func(*Settings, []Facility, int)) (*Evaluation, int) {
	t.Helper()
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	k := slices.IndexFunc(facs, func(f Facility) bool { return strings.HasPrefix(f.Name, "Kellen Fold") })
	if k < 0 {
		t.Fatal("no Kellen Fold tunnel in the demo")
	}
	s := DefaultSettings(v)
	edit(&s, facs, k)
	e, err := Evaluate(v, facs, s)
	if err != nil {
		t.Fatal(err)
	}
	if e.Maps[k] == nil {
		t.Fatalf("Kellen Fold not solved: %v", e.Errs[k])
	}
	return e, k
}

// flagged counts the inside points of m whose result and detail carry
// FlagModelTooLarge, checking that the two agree and that a flagged
// detail gives the caution.
func flagged(t *testing.T, m *Map) (n, inside int) {
	t.Helper()
	g := m.Grid
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			inside++
			d, err := m.Detail(i, j)
			if err != nil {
				t.Fatal(err)
			}
			r := m.At(i, j).Flags.Has(FlagModelTooLarge)
			if r != d.Flags.Has(FlagModelTooLarge) {
				t.Fatalf("%s (%d,%d): result flag %v, detail flag %v", m.Facility.Name, i, j, r, !r)
			}
			note := slices.ContainsFunc(d.Cautions, func(c string) bool { return strings.HasPrefix(c, "Model too large for the section") })
			if r != note {
				t.Fatalf("%s (%d,%d): flag %v but caution %v (%q)", m.Facility.Name, i, j, r, note, d.Cautions)
			}
			if r {
				n++
			}
		}
	}
	return n, inside
}

func TestModelTooLargeFlag(t *testing.T) {
	// The files' scales (1/40 in Kellen Fold) and fitted models fit.
	e, _ := sizeCase(t, func(*Settings, []Facility, int) {})
	for _, m := range e.Maps {
		if n, _ := flagged(t, m); n != 0 {
			t.Errorf("%s at the files' scale %.3g: %d points flagged too large, want none", m.Facility.Name, m.Scale, n)
		}
	}

	// A what-if scale of 0.5 is above both fit scales: every point.
	e, k := sizeCase(t, func(s *Settings, _ []Facility, _ int) { s.Scale = 0.5 })
	if n, inside := flagged(t, e.Maps[k]); n != inside || n == 0 {
		t.Errorf("what-if scale 0.5: %d of %d points flagged, want all", n, inside)
	}

	// The same scale set in the facility file.
	e, k = sizeCase(t, func(_ *Settings, fs []Facility, k int) { fs[k].Model.Scale = 0.5 })
	if n, inside := flagged(t, e.Maps[k]); n != inside || e.Maps[k].ScaleRule != "facility model scale" {
		t.Errorf("file scale 0.5: %d of %d points flagged (%s), want all", n, inside, e.Maps[k].ScaleRule)
	}

	// 0.2 fits below Mach 0.6 (0.267) but not from it (0.171): only the
	// points tested at Mach 0.6 or more are flagged.
	e, k = sizeCase(t, func(s *Settings, _ []Facility, _ int) { s.Scale = 0.2 })
	m := e.Maps[k]
	low, high := 0, 0
	for i := 0; i < e.Grid.Rows(); i++ {
		for j := 0; j < e.Grid.Cols(); j++ {
			if !e.Grid.Inside(i, j) {
				continue
			}
			d, err := m.Detail(i, j)
			if err != nil {
				t.Fatal(err)
			}
			mach := d.Mach
			if !d.HasSettings {
				mach = min(max(d.Flight.Airspeeds.Mach, m.Facility.Gas.MachMin), m.Facility.Gas.MachMax)
			}
			want := mach >= BlockageMach
			if got := d.Flags.Has(FlagModelTooLarge); got != want {
				t.Fatalf("scale 0.2 at (%d,%d), test Mach %.3f: flagged %v, want %v", i, j, mach, got, want)
			}
			if want {
				high++
			} else {
				low++
			}
		}
	}
	if low == 0 || high == 0 {
		t.Errorf("scale 0.2: %d points below Mach 0.6 and %d from it, want both kinds", low, high)
	}
	// At exactly the fit scale the model fits.
	e, k = sizeCase(t, func(s *Settings, _ []Facility, _ int) { s.Scale = 0.8 * 2.4 / 7.2 })
	for i := 0; i < e.Grid.Rows(); i++ {
		for j := 0; j < e.Grid.Cols(); j++ {
			if r := e.Maps[k].At(i, j); r.Class != Outside && r.Flags.Has(FlagModelTooLarge) {
				if d, _ := e.Maps[k].Detail(i, j); d.Mach < BlockageMach && d.HasSettings {
					t.Fatalf("scale at the span limit flagged at (%d,%d), test Mach %.3f", i, j, d.Mach)
				}
			}
		}
	}
	if FlagModelTooLarge.String() != "model too large for the section" {
		t.Errorf("flag name %q", FlagModelTooLarge.String())
	}
}
