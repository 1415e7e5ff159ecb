package envelope

import (
	"math"
	"strings"
	"testing"
)

// TestFitScale works the span and blockage rules by hand for a 2.5 m ×
// 2.5 m section (6.25 m²):
//
//	span 40 m, 80 % of width:  0.8 × 2.5/40            = 0.05
//	frontal 20 m², M 0.8, 1 %: √(0.01 × 6.25/20)       = 0.0559
//	frontal 100 m², M 0.8, 1 %: √(0.01 × 6.25/100)     = 0.025
//	span 20 m: 0.1; frontal 100 m², M 0.3, 5 %: √(0.05 × 6.25/100) = 0.0559
//
// Blockage defaults (common practice): 5 % below Mach 0.6, 1 % from 0.6.
func TestFitScale(t *testing.T) {
	f := cryoTunnel()
	tests := []struct {
		name         string
		span, area   float64
		mach         float64
		want         float64
		ruleContains string
	}{
		{"span decides", 40, 20, 0.8, 0.05, "span"},
		{"blockage decides, transonic", 40, 100, 0.8, 0.025, "blockage 1 %"},
		{"low-speed blockage", 20, 100, 0.3, 0.0559017, "blockage 5 %"},
		{"span only", 40, 0, 0.8, 0.05, "span"},
		{"nothing to fit by", 0, 0, 0.8, 0, "no span"},
	}
	for _, tc := range tests {
		v := &Vehicle{Span: tc.span, FrontalArea: tc.area}
		got, rule := FitScale(v, &f, tc.mach)
		if math.Abs(got-tc.want) > 1e-6 || !strings.Contains(rule, tc.ruleContains) {
			t.Errorf("%s: FitScale = %.6g (%q), want %.6g (%q)", tc.name, got, rule, tc.want, tc.ruleContains)
		}
	}
	if DefaultBlockage(0.59) != 0.05 || DefaultBlockage(0.6) != 0.01 || DefaultBlockage(3) != 0.01 {
		t.Error("DefaultBlockage thresholds: want 5 % below Mach 0.6, 1 % from 0.6")
	}
	// A facility's own blockage and span fraction override the defaults.
	f.Model.MaxBlockage, f.Model.MaxSpanFraction = 0.04, 0.5
	if got, _ := FitScale(&Vehicle{Span: 40, FrontalArea: 100}, &f, 0.8); math.Abs(got-0.03125) > 1e-9 {
		t.Errorf("FitScale with 4 %% blockage, 50 %% span = %v, want min(0.5×2.5/40, √(0.04×6.25/100)) = 0.03125", got)
	}
}

// TestMinScaleFullMatch: just above the per-point minimum scale the point
// is a full match; a little below it is not (Re ∝ scale at fixed settings).
func TestMinScaleFullMatch(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := cryoTunnel()
	checked := 0
	for i := 0; i < g.Rows(); i += 3 {
		for j := 0; j < g.Cols(); j += 2 {
			sc, ok := MinScaleFullMatch(g, &f, testSettings(), i, j)
			if !ok {
				continue
			}
			for _, c := range []struct {
				factor float64
				full   bool
			}{{1 + 1e-6, true}, {0.999, false}} {
				s := testSettings()
				s.Scale = sc * c.factor
				m, err := Solve(g, &f, s)
				if err != nil {
					t.Fatal(err)
				}
				if got := m.At(i, j).Class == FullMatch; got != c.full {
					t.Errorf("(%d,%d) at %.6g × min scale %.6g: class %v", i, j, c.factor, sc, m.At(i, j).Class)
				}
			}
			checked++
		}
	}
	if checked < 10 {
		t.Errorf("only %d points checked", checked)
	}
	if _, ok := MinScaleFullMatch(g, &f, testSettings(), 0, 0); ok {
		t.Error("MinScaleFullMatch at an outside point: want ok false")
	}
	w := waterTunnel()
	if _, ok := MinScaleFullMatch(g, &w, testSettings(), 5, 5); ok {
		t.Error("MinScaleFullMatch in water: want ok false (no Mach match)")
	}
}

// TestMinScaleEnvelope: at the envelope minimum scale every inside point
// the facility can run at flight Mach is a full match.
func TestMinScaleEnvelope(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := cryoTunnel()
	sc, ok := MinScaleEnvelope(g, &f, testSettings())
	// The tunnel runs Mach 0.2–1.2; the transport flies from Mach 0.15, so
	// some points can never be Mach-matched.
	if ok || !(sc > 0) {
		t.Fatalf("MinScaleEnvelope = %v, %v; want a positive scale and ok false", sc, ok)
	}
	s := testSettings()
	s.Scale = sc * (1 + 1e-9)
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if _, can := MinScaleFullMatch(g, &f, testSettings(), i, j); can && m.At(i, j).Class != FullMatch {
				t.Errorf("(%d,%d) at envelope minimum scale %v: %v", i, j, sc, m.At(i, j).Class)
			}
		}
	}
	f.Gas.MachMin = 0.1
	if sc2, ok := MinScaleEnvelope(g, &f, testSettings()); !ok || sc2 < sc {
		t.Errorf("with Mach 0.1 reachable: MinScaleEnvelope = %v, %v; want ok and at least %v", sc2, ok, sc)
	}
}

// TestClassMonotoneInScale: a larger model never gives a worse class at
// any point (classes compared by Rank), in every test facility.
func TestClassMonotoneInScale(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	scales := []float64{0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5}
	for _, f := range append(benchFacilities(), classTunnel()) {
		f := f
		var prev *Map
		for _, sc := range scales {
			s := testSettings()
			s.Scale = sc
			m, err := Solve(g, &f, s)
			if err != nil {
				t.Fatal(err)
			}
			if prev != nil {
				for k := range m.Results {
					if m.Results[k].Class.Rank() > prev.Results[k].Class.Rank() {
						t.Errorf("%s point %d: scale %v gives %v, smaller scale gave %v",
							f.Name, k, sc, m.Results[k].Class, prev.Results[k].Class)
					}
				}
			}
			prev = m
		}
	}
}

func TestFits(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := cryoTunnel()
	m, err := Solve(g, &f, testSettings())
	if err != nil {
		t.Fatal(err)
	}
	// Span rule: 0.8 × 2.5/40 = 0.05 (blockage allows 0.0559 at 1 %).
	if math.Abs(m.FitScale-0.05) > 1e-12 || m.Scale != m.FitScale {
		t.Errorf("fit scale %v, scale %v (%s), want 0.05 fitted", m.FitScale, m.Scale, m.ScaleRule)
	}
	if !m.Fits(0.05) || m.Fits(0.051) {
		t.Error("Fits: want 0.05 to fit and 0.051 not")
	}
	f.Model.Scale = 0.03
	if m, _ := Solve(g, &f, testSettings()); m.Scale != 0.03 || m.ScaleRule != "facility model scale" {
		t.Errorf("facility scale: got %v (%s)", m.Scale, m.ScaleRule)
	}
	s := testSettings()
	s.Scale = 0.07
	if m, _ := Solve(g, &f, s); m.Scale != 0.07 || m.Fits(m.Scale) {
		t.Errorf("settings scale 0.07: got %v, fits %v; want 0.07, not fitting", m.Scale, m.Fits(m.Scale))
	}
}
