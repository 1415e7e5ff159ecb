package envelope

import (
	"math"
	"slices"
	"testing"

	"likewind/atmos"
)

// studyClasses are the per-point classes the study gives facility k of e
// at scale s (Outside elsewhere), with its step.
func studyClasses(t *testing.T, e *Evaluation, k int, s float64) ([]Class, ScaleStep) {
	t.Helper()
	sc, err := newStudier(e.Maps[k], newMatchCount(e.Grid, e.Maps, e.Maps[k]))
	if err != nil {
		t.Fatal(err)
	}
	classes := make([]Class, e.Grid.Len())
	st, _ := sc.step(s, nil, classes)
	return classes, st
}

// checkStudyEqualsSolve solves every facility of e at each of scales and
// checks that the study's class at every point, and its counts, are
// Solve's.
func checkStudyEqualsSolve(t *testing.T, e *Evaluation, scales []float64) {
	t.Helper()
	var seen [NumClasses]int
	defer func() {
		if seen[FullMatch] == 0 || seen[ReShort] == 0 || seen[NoMatch] == 0 {
			t.Errorf("classes seen %v: the comparison checks too little", seen)
		}
	}()
	for k := range e.Facilities {
		f := &e.Facilities[k]
		if e.Maps[k] == nil {
			t.Fatalf("%s: %v", f.Name, e.Errs[k])
		}
		for _, s := range scales {
			set := e.Settings
			set.Scale = s
			m, err := Solve(e.Grid, f, set)
			if err != nil {
				t.Fatal(err)
			}
			classes, st := studyClasses(t, e, k, s)
			for c, n := range st.Shares.Count {
				seen[c] += n
			}
			if st.Shares != m.Shares() {
				t.Errorf("%s at scale %g: study counts %v, Solve %v", f.Name, s, st.Shares.Count, m.Shares().Count)
			}
			bad := 0
			for p := range m.Results {
				if m.Results[p].Class == Outside {
					continue
				}
				if classes[p] != m.Results[p].Class {
					if bad < 3 {
						t.Errorf("%s at scale %g, point %d: study %v, Solve %v", f.Name, s, p, classes[p], m.Results[p].Class)
					}
					bad++
				}
			}
			if bad > 0 {
				t.Errorf("%s at scale %g: %d points differ", f.Name, s, bad)
			}
		}
	}
}

// demoEvaluation is the demo on a rows × cols grid.
func demoEvaluation(t *testing.T, rows, cols int, edit func(v *Vehicle, fs []Facility)) *Evaluation {
	t.Helper()
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = rows, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = cols, 0
	if edit != nil {
		edit(v, facs)
	}
	e, err := Evaluate(v, facs, DefaultSettings(v))
	if err != nil {
		t.Fatal(err)
	}
	return e
}

// studyScalesSample are scales from a small model to beyond every demo
// section's fit (the demo fit scales lie between about 0.01 and 0.3).
var studyScalesSample = []float64{0.004, 0.0125, 0.025, 0.06, 0.11, 0.3, 0.7}

// TestStudyEqualsSolve: without load data the scale-1 reaches serve every
// scale, scaled; on the demo as it is (two facilities with a balance) the
// study solves again where the balance binds.
func TestStudyEqualsSolve(t *testing.T) {
	checkStudyEqualsSolve(t, demoEvaluation(t, 60, 60, stripLoads), studyScalesSample)
	checkStudyEqualsSolve(t, demoEvaluation(t, 60, 60, nil), studyScalesSample)
}

// stripLoads removes the demo's load data (the vehicle's coefficients,
// every balance capacity), for the properties that hold where the balance
// cannot bind.
func stripLoads(v *Vehicle, fs []Facility) {
	v.Loads = ModelLoads{}
	for k := range fs {
		fs[k].Balance = BalanceLimits{}
	}
}

// TestStudyEqualsSolveBalance: with load data the balance caps q at a
// level that falls with scale (load = CN·q·A·s²), so the best settings are
// found again at each scale where the cap can bind.
func TestStudyEqualsSolveBalance(t *testing.T) {
	e := demoEvaluation(t, 60, 60, func(v *Vehicle, fs []Facility) {
		v.Loads = ModelLoads{CNMax: 1.2, CmMax: 0.3}
		for k := range fs {
			fs[k].Balance = BalanceLimits{MaxNormalForce: 20e3, MaxPitchMoment: 1.5e3}
		}
	})
	checkStudyEqualsSolve(t, e, studyScalesSample)
}

// TestStudyEqualsSolveRules: the operating rules change the settings, and
// under a fixed T0 the best settings themselves.
func TestStudyEqualsSolveRules(t *testing.T) {
	e := demoEvaluation(t, 40, 40, func(v *Vehicle, fs []Facility) {
		for k := range fs {
			switch fs[k].Medium {
			case MediumWater:
				fs[k].Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: 300}
			case "nitrogen":
				fs[k].Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: 200}
			}
		}
	})
	checkStudyEqualsSolve(t, e, []float64{0.01, 0.05, 0.2})
}

// TestStudyEqualsSolveZeroReTol: with no Reynolds tolerance a relaxed
// match is decided by a setting that hits flight exactly, which rounding
// decides; the study leaves those points to the solver.
func TestStudyEqualsSolveZeroReTol(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 25, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 25, 0
	s := DefaultSettings(v)
	s.ReTol = 0
	e, err := Evaluate(v, facs, s)
	if err != nil {
		t.Fatal(err)
	}
	checkStudyEqualsSolve(t, e, []float64{0.02, 0.1})
}

// studyTinyVehicle is an invented vehicle on a 3 × 2 Mach grid at sea
// level, 1 km and 2 km, Mach 0.5 and 0.6, all inside the envelope.
func studyTinyVehicle() *Vehicle {
	return &Vehicle{Name: "tiny", RefLength: 2, Span: 2, FrontalArea: 0.1,
		Boundary:     []Vertex{{-100, 0.4}, {-100, 0.7}, {2100, 0.7}, {2100, 0.4}},
		BoundaryKind: atmos.Mach,
		Grid: GridSpec{Altitude: Axis{Min: 0, Max: 2000, Count: 3}, Speed: Axis{Min: 0.5, Max: 0.6, Count: 2},
			SpeedKind: atmos.Mach}}
}

// TestStudyTinyHandChecked checks the shares on a six-point grid against
// a hand calculation: in an invented air tunnel whose only limits that
// bind are a fixed p0 of 1 bar and a fixed T0 of 300 K at every Mach
// number, the best setting at test Mach number M is that one setting, so
// its Reynolds number per metre is ρVT/μ of the isentropic static state,
// and a point is a full match from the scale (1 − ReTol)·Re_flight/Re(M,
// scale 1) up.
func TestStudyTinyHandChecked(t *testing.T) {
	v := studyTinyVehicle()
	f := Facility{Name: "fixed tunnel", Medium: "air",
		Gas:   GasLimits{MachMin: 0.1, MachMax: 0.9, P0Min: 1e5, P0Max: 1e5, T0Min: 300, T0Max: 300},
		Width: 2, Height: 2}
	s := Settings{MachTol: 0.001, ReTol: 0.1, CompressibilityMach: 0.3, Regimes: atmos.DefaultRegimes()}
	e, err := Evaluate(v, []Facility{f}, s)
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: the isentropic static state at M (γ = 1.4), the
	// Sutherland viscosity of air (β = 1.458e-6 kg/(m·s·√K), S = 110.4 K,
	// U.S. Standard Atmosphere 1976, eq. 51), R = 287.05 J/(kg·K).
	reModel := func(M float64) float64 {
		T := 300 / (1 + 0.2*M*M)
		p := 1e5 * math.Pow(T/300, 3.5)
		rho := p / (287.05287 * T)
		mu := 1.458e-6 * math.Pow(T, 1.5) / (T + 110.4)
		return rho * M * math.Sqrt(1.4*287.05287*T) * 2 / mu
	}
	// The six points' scale from which each is a full match.
	var from []float64
	for i := range 3 {
		for j := range 2 {
			fl := e.Grid.Flight(i, j)
			from = append(from, 0.9*float64(fl.Re)/reModel(float64(fl.Mach)))
		}
	}
	slices.Sort(from)
	for _, k := range []int{0, 2, 5} {
		for _, side := range []float64{0.99, 1.01} {
			s := from[k] * side
			_, st := studyClasses(t, e, 0, s)
			want := k // points full below this scale's threshold
			if side > 1 {
				want = k + 1
			}
			if got := st.Shares.Count[FullMatch]; got != want {
				t.Errorf("scale %.4g (%.2f × the %d-th threshold): %d full matches, want %d", s, side, k+1, got, want)
			}
			// The rest are Reynolds short (Mach 0.5 and 0.6 are above the
			// compressibility threshold: nothing is relaxed).
			if got := st.Shares.Count[ReShort]; got != 6-want {
				t.Errorf("scale %.4g: %d Reynolds short, want %d", s, got, 6-want)
			}
		}
	}
}

// TestStudyReachRatio: the reach ratio is the best Reynolds number over
// flight, so it scales with the model where the balance is not checked
// (the quantiles of scale 2s are twice those of s), and a point is
// matched where it is at least 1 − ReTol: the matched share lies at a
// quantile at or above 1 − ReTol exactly when at least that share of the
// points reach it.
func TestStudyReachRatio(t *testing.T) {
	e := demoEvaluation(t, 40, 40, stripLoads)
	for k := range e.Facilities {
		st, err := e.Study(k, StudyOptions{Steps: 2, Min: 0.02, Max: 0.04})
		if err != nil {
			t.Fatal(err)
		}
		var a, b ScaleStep
		for _, x := range st.Steps {
			switch x.Scale {
			case 0.02:
				a = x
			case 0.04:
				b = x
			}
		}
		for q := range StudyQuantiles {
			if a.Reached == 0 {
				if !math.IsNaN(a.ReRatio[q]) {
					t.Errorf("%s: quantile with no points %g, want NaN", st.Facility, a.ReRatio[q])
				}
				continue
			}
			if r := b.ReRatio[q] / a.ReRatio[q]; math.Abs(r-2) > 1e-12 {
				t.Errorf("%s: quantile %g at scale 0.04 over 0.02 is %g, want 2", st.Facility, StudyQuantiles[q], r)
			}
		}
		matchedPts := a.Shares.Count[FullMatch] + a.Shares.Count[MachRelaxed]
		if matchedPts > a.Reached {
			t.Errorf("%s: %d matched points but only %d with a setting", st.Facility, matchedPts, a.Reached)
		}
	}
}

// TestStudyBalanceLimits: the limits the study reports are the engine's,
// and the steps above them are marked.
func TestStudyBalanceLimits(t *testing.T) {
	e := demoEvaluation(t, 30, 30, func(v *Vehicle, fs []Facility) {
		v.Loads = ModelLoads{CNMax: 1.2}
		for k := range fs {
			fs[k].Balance = BalanceLimits{MaxNormalForce: 20e3}
		}
	})
	for k := range e.Facilities {
		st, err := e.Study(k, StudyOptions{})
		if err != nil {
			t.Fatal(err)
		}
		want := BalanceScaleEnvelope(e.Grid, &e.Facilities[k], e.Settings)
		if st.Balance != want {
			t.Errorf("%s: balance %+v, want %+v", st.Facility, st.Balance, want)
		}
		if st.FitScale != e.Maps[k].FitScale {
			t.Errorf("%s: fit %g, want %g", st.Facility, st.FitScale, e.Maps[k].FitScale)
		}
		bal, balOK := st.BalanceLimit()
		var sawFit, sawForce bool
		for _, x := range st.Steps {
			if got, want := x.Mark.Has(MarkBeyondFit), x.Scale > st.FitScale*(1+1e-9); got != want {
				t.Errorf("%s at %g: beyond fit %v, want %v (fit %g)", st.Facility, x.Scale, got, want, st.FitScale)
			}
			if got, want := x.Mark.Has(MarkBeyondBalance), balOK && x.Scale > bal*(1+1e-9); got != want {
				t.Errorf("%s at %g: beyond balance %v, want %v (limit %g)", st.Facility, x.Scale, got, want, bal)
			}
			sawFit = sawFit || x.Mark.Has(MarkFitLimit) && x.Scale == st.FitScale
			sawForce = sawForce || x.Mark.Has(MarkInForce) && x.Scale == st.Scale
		}
		if !sawFit || !sawForce {
			t.Errorf("%s: fit limit step %v, scale-in-force step %v; want both", st.Facility, sawFit, sawForce)
		}
		if st.Best >= 0 && st.Steps[st.Best].Mark.Beyond() {
			t.Errorf("%s: best step %g is beyond a limit", st.Facility, st.Steps[st.Best].Scale)
		}
	}
}

func TestStudyScalesSteps(t *testing.T) {
	sc, marks, err := studyScales(StudyOptions{}, 0.025, 0.1, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	// 40 steps from 0.1/20 = 0.005 to 1.5 × 0.1, plus the scale in force
	// and both limits.
	if sc[0] != 0.005 || sc[len(sc)-1] != 0.15 {
		t.Errorf("range %g to %g, want 0.005 to 0.15", sc[0], sc[len(sc)-1])
	}
	if n := len(sc); n < 40 || n > 43 {
		t.Errorf("%d steps, want 40 and up to 3 added", n)
	}
	if !slices.IsSorted(sc) {
		t.Errorf("steps not ascending: %v", sc)
	}
	for k, s := range sc {
		if s > 0.1 && !marks[k].Has(MarkBeyondFit) || s > 0.05 && !marks[k].Has(MarkBeyondBalance) {
			t.Errorf("scale %g: marks %b", s, marks[k])
		}
	}
	for _, bad := range []StudyOptions{{Steps: 1}, {Steps: MaxStudySteps + 1}, {Min: -1}, {Min: 0.2, Max: 0.1}, {Max: 11}} {
		if _, _, err := studyScales(bad, 0.025, 0.1, 0); err == nil {
			t.Errorf("options %+v: no error", bad)
		}
	}
}

func TestSelectNth(t *testing.T) {
	xs := []float64{5, 1, 4, 1, 5, 9, 2, 6, 5, 3, 5, 8, 9, 7, 9}
	sorted := slices.Sorted(slices.Values(xs))
	for k := range xs {
		c := slices.Clone(xs)
		if got := selectNth(c, k); got != sorted[k] {
			t.Errorf("selectNth(%d) = %g, want %g", k, got, sorted[k])
		}
	}
	// Nearest rank over 1..10: the 10 % quantile is 1, the median 5, the
	// 90 % quantile 9.
	q := quantilesOf([]float64{10, 9, 8, 7, 6, 5, 4, 3, 2, 1})
	if q != [3]float64{1, 5, 9} {
		t.Errorf("quantiles %v, want [1 5 9]", q)
	}
}

// TestBalanceScaleEnvelopePruned: BalanceScaleEnvelope skips the window
// search of points the balance still carries at the smallest top found so
// far; its answer is still the smallest top over every point's own window
// (ScaleWindowAt), with the same counts.
func TestBalanceScaleEnvelopePruned(t *testing.T) {
	e := demoEvaluation(t, 24, 24, func(v *Vehicle, fs []Facility) {
		v.Loads = ModelLoads{CNMax: 1.2, CmMax: 0.3}
		for k := range fs {
			fs[k].Balance = BalanceLimits{MaxNormalForce: 20e3, MaxPitchMoment: 1.5e3}
		}
	})
	g := e.Grid
	searched := 0
	for k := range e.Facilities {
		f := &e.Facilities[k]
		want := BalanceScale{Max: math.Inf(1)}
		for i := range g.Rows() {
			for j := range g.Cols() {
				w, ok := ScaleWindowAt(g, f, e.Settings, i, j)
				switch {
				case !ok:
				case w.Open():
					want.Open++
					want.Max = math.Min(want.Max, w.Max)
				case w.MinOK:
					want.Closed++
				}
			}
		}
		if want.Open > 1 {
			searched++
		}
		got := BalanceScaleEnvelope(g, f, e.Settings)
		if got.Open != want.Open || got.Closed != want.Closed ||
			!(got.Max == want.Max || math.Abs(got.Max-want.Max) <= 1e-9*want.Max) {
			t.Errorf("%s: %+v, want %+v", f.Name, got, want)
		}
	}
	if searched < 2 {
		t.Fatalf("only %d facilities with open windows: the test checks too little", searched)
	}
}

// TestStudyEqualsSolveTASGrid: on a true-airspeed grid every point has a
// flight Mach number of its own (groups of one).
func TestStudyEqualsSolveTASGrid(t *testing.T) {
	e := demoEvaluation(t, 30, 30, func(v *Vehicle, fs []Facility) {
		v.Grid.SpeedKind = atmos.TAS
		v.Grid.Speed = Axis{Min: 60, Max: 800, Count: 30}
		v.Loads = ModelLoads{CNMax: 1.2}
		fs[3].Balance = BalanceLimits{MaxNormalForce: 20e3}
	})
	checkStudyEqualsSolve(t, e, []float64{0.01, 0.03, 0.1})
}

// TestStudyEqualsSolveRelaxed: the second demo vehicle flies slowly, so
// many of its points are matched with Mach number relaxed.
func TestStudyEqualsSolveRelaxed(t *testing.T) {
	vs, facs := demoFleet(t)
	for _, loads := range []bool{false, true} {
		v := *vs[1]
		fs := append([]Facility(nil), facs...)
		if loads {
			v.Loads = ModelLoads{CNMax: 1.5}
			for k := range fs {
				fs[k].Balance = BalanceLimits{MaxNormalForce: 5e3}
			}
		}
		e, err := Evaluate(&v, fs, DefaultSettings(&v))
		if err != nil {
			t.Fatal(err)
		}
		relaxed := 0
		for k := range e.Facilities {
			for _, s := range []float64{0.005, 0.02, 0.08} {
				_, st := studyClasses(t, e, k, s)
				relaxed += st.Shares.Count[MachRelaxed]
			}
		}
		if relaxed == 0 {
			t.Fatal("no Mach-relaxed point: the test checks too little")
		}
		checkStudyEqualsSolve(t, e, []float64{0.005, 0.02, 0.08})
	}
}

// TestStudyUnionInForce: at the scale each facility is evaluated at, the
// union of the study is the union coverage of the evaluation, one study
// at a time and all together.
func TestStudyUnionInForce(t *testing.T) {
	e := demoEvaluation(t, 50, 50, nil)
	want := UnionCoverage(e.Solved())
	all, errs := e.StudyAll(StudyOptions{})
	for k := range e.Facilities {
		if errs[k] != nil {
			t.Fatal(errs[k])
		}
		one, err := e.Study(k, StudyOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for _, st := range []*ScaleStudy{one, all[k]} {
			if st.Others != len(e.Facilities)-1 {
				t.Errorf("%s: %d others, want %d", st.Facility, st.Others, len(e.Facilities)-1)
			}
			found := false
			for _, x := range st.Steps {
				if x.Mark.Has(MarkInForce) {
					found = true
					if x.Union != want || x.Shares != e.Maps[k].Shares() {
						t.Errorf("%s at its scale %g: union %g, shares %v; want %g, %v", st.Facility, x.Scale, x.Union, x.Shares.Count, want, e.Maps[k].Shares().Count)
					}
				}
			}
			if !found {
				t.Errorf("%s: no step at the scale in force", st.Facility)
			}
		}
	}
}
