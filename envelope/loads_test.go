package envelope

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestLoadWorkedCase: the planning loads of a worked case, by hand.
// Vehicle: CN max 1.2 and Cm max 0.3 on the reference area A = 28 m² and
// length L = 3.1 m; model scale s = 1/40; balance 3000 N and 100 N·m.
//
//	N = CN·q·A·s² = 1.2 × 50 000 Pa × 28 m² / 1600 = 1050 N      (q = 50 kPa)
//	M = Cm·q·A·s²·(s·L) = 0.3 × 50 000 × 28 / 1600 × 3.1/40 = 20.34375 N·m
//	share = max(1050/3000, 20.34375/100) = 0.35
//	q_load = min(3000/(1.2 × 28/1600), 100/(0.3 × 28 × 3.1/64 000))
//	       = min(142 857.14, 245 775.04) = 142 857.14 Pa
func TestLoadWorkedCase(t *testing.T) {
	v := &Vehicle{RefArea: 28, RefLength: 3.1, Loads: ModelLoads{CNMax: 1.2, CmMax: 0.3}}
	f := &Facility{Balance: BalanceLimits{MaxNormalForce: 3000, MaxPitchMoment: 100}}
	lm := newLoadModel(v, f)
	got := lm.at(50e3, 1.0/40)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"normal force", got.NormalForce, 1050},
		{"pitching moment", got.PitchMoment, 20.34375},
		{"share", got.Share, 0.35},
		{"q cap", got.QCap, 3000 / (1.2 * 28 / 1600.0)},
		{"q cap by hand", got.QCap, 142857.142857},
	} {
		if math.Abs(c.got/c.want-1) > 1e-11 {
			t.Errorf("%s %.12g, want %.12g", c.name, c.got, c.want)
		}
	}
	// A separate load area: CN on 14 m² halves the force.
	v.Loads.Area = 14
	if n := newLoadModel(v, f).at(50e3, 1.0/40).NormalForce; math.Abs(n/525-1) > 1e-12 {
		t.Errorf("normal force on a 14 m² area %g N, want 525 N", n)
	}
	// Without a capacity the loads are known, the share and cap are not.
	if l := newLoadModel(v, &Facility{}).at(50e3, 1.0/40); l.NormalForce == 0 || l.Share != 0 || l.QCap != 0 {
		t.Errorf("no capacity: %+v", l)
	}
}

// demoLoadCase is the demo vehicle (reference area 28 m², length 3.1 m)
// with CN max 1.2, and the demo's cryogenic tunnel (scale 1/40, q max
// 120 kPa) on a balance of maxN newtons.
func demoLoadCase(t *testing.T, maxN float64) (*Grid, Facility, Settings) {
	t.Helper()
	g, f, s := demoRuleCase(t)
	v := *g.Vehicle
	v.Loads = ModelLoads{CNMax: 1.2}
	g2, err := NewGrid(&v, s)
	if err != nil {
		t.Fatal(err)
	}
	f.Balance = BalanceLimits{MaxNormalForce: maxN}
	return g2, f, s
}

// TestBalanceLoadBinds: a 1000 N balance caps q at 1000/(1.2 × 28/1600) =
// 47 619.05 Pa for the 1/40 model, below q max: no setting exceeds it,
// the points it stops are limited by "balance load" at that q with the
// load at capacity, and the stored results give the same share as the
// details.
func TestBalanceLoadBinds(t *testing.T) {
	g, f, s := demoLoadCase(t, 1000)
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	const qLoad = 47619.047619047619
	if math.Abs(m.LoadQ/qLoad-1) > 1e-12 {
		t.Fatalf("LoadQ %g, want %g", m.LoadQ, qLoad)
	}
	free := f
	free.Balance = BalanceLimits{}
	mf, _ := Solve(g, &free, s)
	bound := 0
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			r := m.At(i, j)
			if r.Class == Outside || r.Q == 0 {
				continue
			}
			d, _ := m.Detail(i, j)
			if d.Q > qLoad*(1+1e-9) {
				t.Fatalf("(%d, %d): q %g above the balance cap", i, j, d.Q)
			}
			if want := 1.2 * d.Q * 28 / 1600; math.Abs(d.Load.NormalForce/want-1) > 1e-12 || math.Abs(d.Load.Share*1000/want-1) > 1e-12 {
				t.Errorf("(%d, %d): normal force %g, share %g; want %g N of 1000", i, j, d.Load.NormalForce, d.Load.Share, want)
			}
			if got := m.LoadShare(r); math.Abs(got/d.Load.Share-1) > 1e-6 {
				t.Errorf("(%d, %d): stored share %g, detail %g", i, j, got, d.Load.Share)
			}
			if r.Limit != LimitBalanceLoad {
				continue
			}
			bound++
			if math.Abs(d.Q/qLoad-1) > 1e-9 || math.Abs(d.Load.Share-1) > 1e-9 || !d.Flags.Has(FlagLoadNearLimit) {
				t.Errorf("(%d, %d): limited by the balance at q %g, share %g, flags %v", i, j, d.Q, d.Load.Share, d.Flags)
			}
			if fr := mf.At(i, j); !(fr.Q > float32(qLoad)) {
				t.Errorf("(%d, %d): without the balance q %g, not above the cap", i, j, fr.Q)
			}
			if !strings.Contains(strings.Join(d.Cautions, "\n"), "100 % of the balance capacity") {
				t.Errorf("(%d, %d): cautions %q, want the balance caution", i, j, d.Cautions)
			}
		}
	}
	if bound == 0 {
		t.Fatal("the balance binds nowhere")
	}
	if LimitBalanceLoad.String() != "balance load" || FlagLoadNearLimit.String() != "load near balance capacity" {
		t.Errorf("names %q, %q", LimitBalanceLoad, FlagLoadNearLimit)
	}
}

// TestBalanceMomentBinds: the pitching moment caps q when it is the
// tighter: Cm max 0.3 on 28 m² and 3.1 m, 15 N·m at scale 1/40 give
// q_load = 15/(0.3 × 28 × 3.1/64 000) = 36 866.36 Pa, below the 1000 N
// force cap of 47 619.05 Pa.
func TestBalanceMomentBinds(t *testing.T) {
	g, f, s := demoLoadCase(t, 1000)
	v := *g.Vehicle
	v.Loads.CmMax = 0.3
	g, err := NewGrid(&v, s)
	if err != nil {
		t.Fatal(err)
	}
	f.Balance.MaxPitchMoment = 15
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	if want := 15 / (0.3 * 28 * 3.1 / 64000); math.Abs(m.LoadQ/want-1) > 1e-12 || math.Abs(want-36866.36) > 0.01 {
		t.Errorf("LoadQ %g, want %g", m.LoadQ, want)
	}
}

// TestWaterBalanceLoad: a water model's balance caps the speed like q max:
// in the warmest water of the test tunnel (40 °C, ρ ≈ 992 kg/m³) a cap of
// q = 20 kPa allows √(2q/ρ) ≈ 6.35 m/s.
func TestWaterBalanceLoad(t *testing.T) {
	f := waterTunnel()
	v := onePointVehicle(0, 0.2, 1)
	v.RefArea = 1
	v.Loads.CNMax = 1
	s := testSettings()
	s.Scale = 0.5
	// CN·A·s² = 0.25 m²: 5000 N is q = 20 kPa.
	f.Balance.MaxNormalForce = 5000
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	// Flight needs about 12 m/s in cold water and 6.2 m/s at 40 °C (see
	// TestWaterRules); so with the cap the cold end of the set is cut.
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	d, _ := m.Detail(0, 0)
	if d.Class != MachRelaxed || d.Set.Cold.Limit != LimitBalanceLoad || math.Abs(d.Set.Cold.Q/20e3-1) > 1e-6 {
		t.Errorf("%v, set %+v: want the cold end cut by the balance at 20 kPa", d.Class, d.Set)
	}
	f.Balance.MaxNormalForce = 2500 // 10 kPa: 4.5 m/s, short of the 6.2 m/s needed
	if m, err = Solve(g, &f, s); err != nil {
		t.Fatal(err)
	}
	d, _ = m.Detail(0, 0)
	if d.Class != NoMatch || d.Limit != LimitBalanceLoad || math.Abs(d.Q/10e3-1) > 1e-9 {
		t.Errorf("%v (%v) q %g: want out of reach by the balance at 10 kPa", d.Class, d.Limit, d.Q)
	}
}

// TestMinScaleWithBalance: the smallest full-match scale stands only where
// the balance carries the model there. At that scale s0 the point runs at
// the best setting (q_best); the balance takes it when
// capacity ≥ CN·q_best·A·s0², else no scale gives a full match (ok
// false), and Solve at s0 agrees.
func TestMinScaleWithBalance(t *testing.T) {
	g, f, s := demoLoadCase(t, 1000)
	free := f
	free.Balance = BalanceLimits{}
	checked := 0
	for i := 0; i < g.Rows() && checked < 10; i += 4 {
		for j := 0; j < g.Cols() && checked < 10; j += 3 {
			s0, ok := MinScaleFullMatch(g, &free, s, i, j)
			if !ok {
				continue
			}
			ss := s
			ss.Scale = s0 * (1 + 1e-7)
			m, _ := Solve(g, &free, ss)
			d, _ := m.Detail(i, j)
			if d.Class != FullMatch {
				t.Fatalf("(%d, %d): %v at the smallest scale %g", i, j, d.Class, s0)
			}
			need := 1.2 * d.Q * 28 * s0 * s0 // N at the best setting
			checked++
			for _, k := range []float64{1.001, 0.999} {
				f.Balance.MaxNormalForce = k * need
				_, ok := MinScaleFullMatch(g, &f, s, i, j)
				if ok != (k > 1) {
					t.Errorf("(%d, %d): capacity %g × %g N: ok %v", i, j, k, need, ok)
				}
				m, _ := Solve(g, &f, ss)
				if got := m.At(i, j).Class; (got == FullMatch) != (k > 1) {
					t.Errorf("(%d, %d): capacity %g × the load, Solve at the smallest scale gives %v", i, j, k, got)
				}
			}
		}
	}
	if checked == 0 {
		t.Fatal("no point to check")
	}
}

// TestScaleWindow: the window agrees with Solve: a point is a full match
// a little inside [Min, Max] and not a little outside, the balance setting
// the top (and under every rule the window's top holds: the least-load
// setting is what sets it, and the best setting under the cap reaches
// the tolerance there whichever rule runs).
func TestScaleWindow(t *testing.T) {
	g, f, s := demoLoadCase(t, 3000)
	checked := 0
	for i := 0; i < g.Rows(); i += 2 {
		for j := 0; j < g.Cols(); j += 2 {
			w, ok := ScaleWindowAt(g, &f, s, i, j)
			if !ok || !w.Open() || math.IsInf(w.Max, 1) || w.Max < 1.05*w.Min {
				continue
			}
			checked++
			for _, tc := range []struct {
				scale float64
				full  bool
			}{{w.Min * 1.001, true}, {w.Max * 0.999, true}, {w.Max * 1.01, false}, {w.Min * 0.99, false}} {
				ss := s
				ss.Scale = tc.scale
				m, err := Solve(g, &f, ss)
				if err != nil {
					t.Fatal(err)
				}
				r := m.At(i, j)
				if (r.Class == FullMatch) != tc.full {
					t.Errorf("(%d, %d) window %g–%g: scale %g gives %v (%v)", i, j, w.Min, w.Max, tc.scale, r.Class, r.Limit)
				}
				if tc.scale > w.Max && r.Limit != LimitBalanceLoad && r.Class != FullMatch {
					t.Errorf("(%d, %d): above the window top by %v, want the balance load", i, j, r.Limit)
				}
			}
		}
	}
	if checked < 5 {
		t.Fatalf("only %d windows checked", checked)
	}
	bs := BalanceScaleEnvelope(g, &f, s)
	if bs.Open == 0 || !(bs.Max > 0) || math.IsInf(bs.Max, 1) {
		t.Errorf("balance scale %+v", bs)
	}
	// With the smallest top over the points, no open point is cut.
	ss := s
	ss.Scale = 0.999 * bs.Max
	m, _ := Solve(g, &f, ss)
	for k := range m.Results {
		if m.Results[k].Limit == LimitBalanceLoad && m.Results[k].Class != FullMatch {
			i, j := k/g.Cols(), k%g.Cols()
			if w, _ := ScaleWindowAt(g, &f, s, i, j); w.Open() && w.Min <= ss.Scale {
				t.Errorf("(%d, %d) at the balance scale %g: %v by the balance, window %+v", i, j, ss.Scale, m.Results[k].Class, w)
			}
		}
	}
	// No balance data: no top.
	f.Balance = BalanceLimits{}
	if bs := BalanceScaleEnvelope(g, &f, s); !math.IsInf(bs.Max, 1) {
		t.Errorf("no balance: %+v", bs)
	}
}

// TestLoadDataChecks: negative, zero where a value is needed and absurd
// load data are refused with the field named.
func TestLoadDataChecks(t *testing.T) {
	for _, tc := range []struct {
		l     ModelLoads
		field string
	}{
		{ModelLoads{CNMax: -1}, "CNMax"},
		{ModelLoads{CNMax: 500}, "CNMax"},
		{ModelLoads{CNMax: math.NaN()}, "CNMax"},
		{ModelLoads{CNMax: 1, CmMax: -0.2}, "CmMax"},
		{ModelLoads{CNMax: 1, Area: -3}, "Area"},
		{ModelLoads{Area: 3}, "Area"},
	} {
		var le *LoadError
		if err := CheckModelLoads(tc.l); !errors.As(err, &le) || le.Field != tc.field || !errors.Is(err, ErrOutOfBounds) {
			t.Errorf("%+v: %v, want a LoadError on %s", tc.l, err, tc.field)
		}
	}
	if err := CheckModelLoads(ModelLoads{CNMax: 1.2, CmMax: 0.3, Area: 20}); err != nil {
		t.Errorf("good load data refused: %v", err)
	}
	for _, tc := range []struct {
		b     BalanceLimits
		field string
	}{
		{BalanceLimits{MaxNormalForce: -10}, "MaxNormalForce"},
		{BalanceLimits{MaxNormalForce: 1e9}, "MaxNormalForce"},
		{BalanceLimits{MaxPitchMoment: math.Inf(1)}, "MaxPitchMoment"},
	} {
		var le *LoadError
		if err := CheckBalance(tc.b); !errors.As(err, &le) || le.Field != tc.field {
			t.Errorf("%+v: %v, want a LoadError on %s", tc.b, err, tc.field)
		}
	}
	g, f, s := demoLoadCase(t, -5)
	if _, err := Solve(g, &f, s); err == nil || !strings.Contains(err.Error(), "balance normal force") {
		t.Errorf("Solve with a negative capacity: %v", err)
	}
}
