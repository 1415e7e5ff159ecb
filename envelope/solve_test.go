package envelope

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"likewind/atmos"
)

// Tolerances of the solver tests.
const (
	// tableTol4 is half a unit in the fourth decimal place, for tables
	// printed to four decimals.
	tableTol4 = 0.5e-4
	// handTol is the relative tolerance against hand-worked values carried
	// to five significant figures.
	handTol = 1e-4
	// exactTol is the relative tolerance for identities that hold to
	// rounding error (linearity, round trips).
	exactTol = 1e-12
	// solveTol is the relative tolerance of solved settings against their
	// defining equations (the saturation inverse iterates to 1e-12).
	solveTol = 1e-9
)

// testSettings are the default tolerances (common practice): Mach within
// 0.01, Reynolds number within 10 %, Mach relaxed below 0.3.
func testSettings() Settings {
	return Settings{MachTol: 0.01, ReTol: 0.10, CompressibilityMach: 0.3, Regimes: atmos.DefaultRegimes()}
}

// cryoTunnel is an invented pressurised cryogenic nitrogen tunnel.
func cryoTunnel() Facility {
	return Facility{Name: "cryogenic test tunnel", Medium: "nitrogen",
		Gas:  GasLimits{MachMin: 0.2, MachMax: 1.2, P0Min: 1.2e5, P0Max: 4.5e5, T0Min: 90, T0Max: 320, Condensation: true},
		QMax: 1.2e5, Width: 2.5, Height: 2.5}
}

// waterTunnel is an invented water tunnel.
func waterTunnel() Facility {
	return Facility{Name: "water test tunnel", Medium: MediumWater,
		Water: WaterLimits{SpeedMin: 1, SpeedMax: 15, TMin: 283.15, TMax: 313.15, PMax: 2e5}, Width: 1, Height: 1}
}

// classTunnel is an invented cryogenic nitrogen tunnel whose limits make
// every class happen: a low T0Min so that the saturation line binds, a
// dynamic-pressure cap that binds near its top Mach number, and a Mach
// range that starts above the lowest flight Mach numbers.
func classTunnel() Facility {
	return Facility{Name: "class tunnel", Medium: "nitrogen",
		Gas:  GasLimits{MachMin: 0.2, MachMax: 0.9, P0Min: 1e5, P0Max: 3e5, T0Min: 80, T0Max: 320, Condensation: true},
		QMax: 6e4, Width: 2, Height: 2}
}

// testSolver is the solver of gas facility f for a model of reference
// length L (m), and testWaterSolver that of a water facility.
func testSolver(t testing.TB, f Facility, s Settings, L float64) *gasSolver {
	t.Helper()
	sv, ok := mustSolver(t, f, s, L).(*gasSolver)
	if !ok {
		t.Fatalf("%s: not a gas facility", f.Name)
	}
	return sv
}

func testWaterSolver(t testing.TB, f Facility, s Settings, L float64) *waterSolver {
	t.Helper()
	sv, ok := mustSolver(t, f, s, L).(*waterSolver)
	if !ok {
		t.Fatalf("%s: not a water facility", f.Name)
	}
	return sv
}

func mustSolver(t testing.TB, f Facility, s Settings, L float64) solver {
	t.Helper()
	sv, err := newSolver(&f, s, atmos.DefaultRegimes())
	if err != nil {
		t.Fatal(err)
	}
	sv.setModelLength(L)
	return sv
}

// TestIsentropicSteps checks the isentropic ratios and q/p0 used by the
// solver against printed tables for γ = 1.4: Aeronautical Engineer's Data
// Book, Appendix 4, Tables A4.1 (subsonic) and A4.2 (supersonic), the same
// values as NACA Report 1135, Table I.
func TestIsentropicSteps(t *testing.T) {
	sv := testSolver(t, classTunnel(), testSettings(), 1)
	tests := []struct {
		M, p, T, q float64 // p/p0, T/T0, q/p0
	}{
		{0.10, 0.9930, 0.9980, 6.951e-3},
		{0.20, 0.9725, 0.9921, 2.723e-2},
		{0.90, 0.5913, 0.8606, 0.3352},
		{1.00, 0.5283, 0.8333, 0.3698},
		{1.10, 0.4684, 0.8052, 0.3967},
	}
	for _, tc := range tests {
		c := sv.bounds(tc.M)
		if math.Abs(c.pi-tc.p) > tableTol4 {
			t.Errorf("p/p0(M %v) = %.5f, want %.4f (Data Book Table A4)", tc.M, c.pi, tc.p)
		}
		if math.Abs(c.tau-tc.T) > tableTol4 {
			t.Errorf("T/T0(M %v) = %.5f, want %.4f (Data Book Table A4)", tc.M, c.tau, tc.T)
		}
		if q := 0.5 * 1.4 * c.pi * tc.M * tc.M; math.Abs(q-tc.q) > tableTol4*math.Max(1, tc.q/0.1) {
			t.Errorf("q/p0(M %v) = %.5f, want %.4g (Data Book Table A4)", tc.M, q, tc.q)
		}
		// The solver's own τ and π agree with atmos (NACA 1135 forms).
		if relErr(c.pi, atmos.PressureRatio(tc.M, 1.4)) > exactTol || relErr(c.tau, atmos.TemperatureRatio(tc.M, 1.4)) > exactTol {
			t.Errorf("M %v: solver ratios %v %v, atmos %v %v", tc.M, c.pi, c.tau,
				atmos.PressureRatio(tc.M, 1.4), atmos.TemperatureRatio(tc.M, 1.4))
		}
	}
}

// TestHandWorkedTransonic solves one transonic air point worked by hand.
// Air, γ = 1.4, R = 287.053 J/(kg·K), Sutherland β = 1.458e-6, S = 110.4 K
// (U.S. Standard Atmosphere 1976); model length 0.3 m; M = 0.90:
//
//	T/T0 = 1/(1 + 0.2·0.81) = 0.86059     (Table A4.1: 0.8606)
//	p/p0 = 0.86059^3.5      = 0.59126     (Table A4.1: 0.5913)
//	at T0 = 300 K, p0 = 200 kPa:
//	T  = 300 × 0.86059                  = 258.18 K
//	p  = 200 000 × 0.59126              = 118 252 Pa
//	a  = √(1.4 × 287.053 × 258.18)      = 322.11 m/s,  V = 0.9a = 289.90 m/s
//	ρ  = 118 252/(287.053 × 258.18)     = 1.5956 kg/m³
//	μ  = 1.458e-6 × 258.18^1.5/(258.18 + 110.4) = 1.6410e-5 Pa·s
//	Re = 1.5956 × 289.90 × 0.3/1.6410e-5 = 8.4566e6
//	q  = ½γpM² = 0.7 × 118 252 × 0.81   = 67 049 Pa (Table A4.1 q/p0 0.3352 → 67 040)
//
// With flight Re = 8.4566e6 at Mach 0.90, T0 range 250–320 K and p0 up to
// 200 kPa, the warmest T0 that reaches the target is the one where p0 =
// 200 kPa gives it, i.e. T0 = 300 K (the quadratic in T), and the lowest p0
// at that T0 is 200 kPa.
func TestHandWorkedTransonic(t *testing.T) {
	f := Facility{Name: "hand", Medium: "air",
		Gas: GasLimits{MachMin: 0.3, MachMax: 1.1, P0Min: 1e5, P0Max: 2e5, T0Min: 250, T0Max: 320},
	}
	sv := testSolver(t, f, testSettings(), 0.3)
	ps := sv.solve(0.90, 8.4566e6, 250, true)
	if ps.class != FullMatch {
		t.Fatalf("class = %v, want full match", ps.class)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"T0", ps.t0, 300}, {"p0", ps.p0, 2e5},
		{"T", ps.t, 258.18}, {"p", ps.p, 118252}, {"V", ps.v, 289.90},
		{"rho", ps.rho, 1.5956}, {"mu", ps.mu, 1.6410e-5}, {"Re", ps.re, 8.4566e6}, {"q", ps.q, 67049},
	}
	for _, c := range checks {
		if e := relErr(c.got, c.want); e > handTol {
			t.Errorf("M 0.90 hand-worked %s = %.6g, want %.5g (rel err %.2g)", c.name, c.got, c.want, e)
		}
	}
	if math.Abs(ps.q/ps.p0-0.3352) > tableTol4 {
		t.Errorf("q/p0 = %.5f, want 0.3352 (Data Book Table A4.1)", ps.q/ps.p0)
	}
}

// TestReynoldsProperties checks exact properties of the closed-form
// Reynolds number: linear in p0 at fixed Mach and T0, falling with T0, and
// equal to ρVL/μ computed directly.
func TestReynoldsProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, f := range []Facility{classTunnel(), benchFacilities()[1]} {
		sv := testSolver(t, f, testSettings(), 0.25)
		gas := sv.gas
		for k := 0; k < 200; k++ {
			M := 0.05 + 3*rng.Float64()
			c := sv.bounds(M)
			p0 := 1e4 + 1e6*rng.Float64()
			t0 := 60 + 900*rng.Float64()
			re := sv.reAt(&c, p0, t0)
			if got := sv.reAt(&c, 3*p0, t0); relErr(got, 3*re) > exactTol {
				t.Errorf("Re(3·p0) = %v, want 3·Re(p0) = %v (M %v, T0 %v)", got, 3*re, M, t0)
			}
			if got := sv.reAt(&c, p0, t0*1.01); !(got < re) {
				t.Errorf("Re(T0·1.01) = %v not below Re(T0) = %v (M %v, T0 %v)", got, re, M, t0)
			}
			T := t0 * atmos.TemperatureRatio(M, 1.4)
			p := p0 * atmos.PressureRatio(M, 1.4)
			rho := p / (gas.R() * T)
			V := M * math.Sqrt(gas.Gamma()*gas.R()*T)
			if want := atmos.Reynolds(rho, V, 0.25, gas.Viscosity(T)); relErr(re, want) > 1e-12*10 {
				t.Errorf("Re closed form %v, ρVL/μ %v (M %v, p0 %v, T0 %v)", re, want, M, p0, t0)
			}
		}
	}
}

// feasible checks a gas setting against every facility limit directly,
// independently of the solver's joint reasoning.
func feasible(f *Facility, gas atmos.IdealGas, M, p0, t0, L float64, condOn bool) bool {
	tol := 1e-9
	T := t0 * atmos.TemperatureRatio(M, 1.4)
	p := p0 * atmos.PressureRatio(M, 1.4)
	if p0 < f.Gas.P0Min*(1-tol) || p0 > f.Gas.P0Max*(1+tol) || t0 < f.Gas.T0Min*(1-tol) || t0 > f.Gas.T0Max*(1+tol) {
		return false
	}
	if f.QMax > 0 && 0.7*p*M*M > f.QMax*(1+tol) {
		return false
	}
	if T < f.Gas.MinStaticT*(1-tol) {
		return false
	}
	if condOn && T < gas.SaturationTemperature(p)*(1-tol) {
		return false
	}
	if f.MaxReynoldsPerM > 0 {
		rho := p / (gas.R() * T)
		if rho*M*math.Sqrt(1.4*gas.R()*T)/gas.Viscosity(T) > f.MaxReynoldsPerM*(1+tol) {
			return false
		}
	}
	return true
}

// TestBestIsJointMaximum samples the (p0, T0) box at many Mach numbers:
// every sample that passes all limits checked directly has a Reynolds
// number no higher than the solver's best corner, and the best corner
// itself passes them.
func TestBestIsJointMaximum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	f := classTunnel()
	f.Gas.MinStaticT = 70
	f.MaxReynoldsPerM = 3.5e8
	sv := testSolver(t, f, testSettings(), 0.2)
	gas := atmos.Nitrogen()
	for k := 0; k < 60; k++ {
		M := 0.2 + 0.7*rng.Float64()
		c := sv.bounds(M)
		if !c.ok {
			continue
		}
		top, ok := sv.best(&c)
		p0b, t0b, reb := top.p0, top.t0, top.re
		if !ok {
			continue
		}
		if !feasible(&f, gas, M, p0b, t0b, sv.L, c.condOn) {
			t.Errorf("M %.3f: best corner p0 %.6g T0 %.6g fails a limit", M, p0b, t0b)
		}
		for n := 0; n < 400; n++ {
			p0 := f.Gas.P0Min + (f.Gas.P0Max-f.Gas.P0Min)*rng.Float64()
			t0 := f.Gas.T0Min + (f.Gas.T0Max-f.Gas.T0Min)*rng.Float64()*rng.Float64()
			if !feasible(&f, gas, M, p0, t0, sv.L, c.condOn) {
				continue
			}
			if re := sv.reAt(&c, p0, t0); re > reb*(1+solveTol) {
				t.Errorf("M %.3f: feasible p0 %.6g T0 %.6g gives Re %.6g above the best corner %.6g (p0 %.6g T0 %.6g)",
					M, p0, t0, re, reb, p0b, t0b)
			}
		}
	}
}

// TestHitIsWarmestThenLowest: the chosen setting reaches the target
// exactly, no warmer T0 reaches it (within the limits), and no lower p0
// at that T0 does.
func TestHitIsWarmestThenLowest(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	f := classTunnel()
	sv := testSolver(t, f, testSettings(), 0.2)
	gas := atmos.Nitrogen()
	n := 0
	for k := 0; k < 400; k++ {
		M := 0.2 + 0.7*rng.Float64()
		c := sv.bounds(M)
		top, ok := sv.best(&c)
		reb := top.re
		if !ok {
			continue
		}
		target := reb * (0.05 + 0.95*rng.Float64())
		h, ok := sv.tryHit(&c, target)
		p0, t0, re, over := h.p0, h.t0, h.re, h.over
		if !ok {
			t.Errorf("M %.3f: target %.4g below best %.4g not reached", M, target, reb)
			continue
		}
		if !feasible(&f, gas, M, p0, t0, sv.L, true) {
			t.Errorf("M %.3f: setting p0 %.6g T0 %.6g fails a limit", M, p0, t0)
		}
		if over {
			if !(re >= target) || p0 != f.Gas.P0Min {
				t.Errorf("M %.3f: overshoot flagged with Re %v target %v p0 %v", M, re, target, p0)
			}
			continue
		}
		n++
		if relErr(re, target) > solveTol {
			t.Errorf("M %.3f: Re %.10g, want target %.10g", M, re, target)
		}
		// Warmer by 0.1 K at the highest usable p0 falls short (unless T0 is
		// already at T0Max).
		if t0 < f.Gas.T0Max-1e-9 {
			if r := sv.reAt(&c, c.p0hi, t0+0.1); r >= target {
				t.Errorf("M %.3f: T0 %.4f not the warmest: T0+0.1 K at p0hi gives %.6g ≥ %.6g", M, t0, r, target)
			}
		}
		if r := sv.reAt(&c, p0*(1-1e-6), t0); r >= target {
			t.Errorf("M %.3f: p0 %.6g not the lowest", M, p0)
		}
	}
	if n < 100 {
		t.Errorf("only %d exact hits checked", n)
	}
}

// TestClassesOneFacility runs points through classTunnel (and a water
// tunnel for the liquid case) so that each class and the binding limits
// happen in turn.
func TestClassesOneFacility(t *testing.T) {
	s := testSettings()
	f := classTunnel()
	sv := testSolver(t, f, s, 0.2)
	bestAt := func(M float64) float64 {
		c := sv.bounds(M)
		top, ok := sv.best(&c)
		re := top.re
		if !ok {
			t.Fatalf("no setting at M %v", M)
		}
		return re
	}
	re25 := bestAt(0.25)
	tests := []struct {
		name      string
		mf, reF   float64
		class     Class
		limit     Limit
		wantRatio float64 // 0: not checked
	}{
		{"reachable", 0.6, 0.5 * bestAt(0.6), FullMatch, LimitNone, 1},
		{"within tolerance", 0.6, bestAt(0.6) / 0.95, FullMatch, LimitCondensation, 0.95},
		// Near its top Mach number the tunnel is held by its dynamic-pressure cap.
		{"q cap", 0.85, 3 * bestAt(0.85), ReShort, LimitQMax, 1.0 / 3},
		// At Mach 0.5 full p0 and the saturation line hold it.
		{"saturation line", 0.5, 3 * bestAt(0.5), ReShort, LimitCondensation, 1.0 / 3},
		{"below Mach range, Mach relaxed", 0.1, 0.8 * re25, MachRelaxed, LimitNone, 1},
		{"below Mach range, out of reach", 0.1, 50 * re25, NoMatch, LimitCondensation, 0},
		{"above Mach range", 0.95, 1e6, NoMatch, LimitMachRange, 0},
	}
	for _, tc := range tests {
		ps := sv.solve(tc.mf, tc.reF, 250, true)
		if ps.class != tc.class || ps.limit != tc.limit {
			t.Errorf("%s: M %v Re %.4g: class %v, limit %v; want %v, %v", tc.name, tc.mf, tc.reF, ps.class, ps.limit, tc.class, tc.limit)
			continue
		}
		if tc.wantRatio > 0 && relErr(ps.ratio, tc.wantRatio) > solveTol {
			t.Errorf("%s: Re ratio %v, want %v", tc.name, ps.ratio, tc.wantRatio)
		}
		if ps.has && !feasible(&f, atmos.Nitrogen(), ps.mach, ps.p0, ps.t0, sv.L, true) {
			t.Errorf("%s: setting M %v p0 %v T0 %v fails a limit", tc.name, ps.mach, ps.p0, ps.t0)
		}
		if ps.class == ReShort {
			// ΔCf = Cf(model) − Cf(flight) > 0 for a model short of flight.
			want := SkinFriction(ps.re) - SkinFriction(tc.reF)
			if !(ps.dcf > 0) || relErr(ps.dcf, want) > exactTol {
				t.Errorf("%s: ΔCf %v, want %v", tc.name, ps.dcf, want)
			}
		}
		if ps.class == MachRelaxed {
			if ps.mach < f.Gas.MachMin || ps.mach > s.CompressibilityMach {
				t.Errorf("%s: relaxed Mach %v outside %v–%v", tc.name, ps.mach, f.Gas.MachMin, s.CompressibilityMach)
			}
			// Nearest to flight: a little nearer does not reach the target.
			if ps.mach > f.Gas.MachMin+1e-4 {
				c := sv.bounds(ps.mach - 1e-4)
				if _, ok := sv.tryHit(&c, tc.reF); ok {
					t.Errorf("%s: Mach %v is not the nearest to flight that reaches Re", tc.name, ps.mach)
				}
			}
		}
	}
	// The liquid case: a water tunnel cannot run Mach 0.5.
	w := testWaterSolver(t, waterTunnel(), s, 0.2)
	if ps := w.solve(0.5, 1e6, 250, true); ps.class != NoMatch || ps.limit != LimitIncompressible {
		t.Errorf("water at M 0.5: class %v limit %v, want out of reach, %v", ps.class, ps.limit, LimitIncompressible)
	}
}

// TestJointLimits is a point that independent range checks would call
// feasible: at Mach 0.5 the target needs about full p0 and a T0 near
// T0Min; p0 = P0Max is within its range, T0 = T0Min is within its range,
// the dynamic pressure at P0Max is below QMax, and at P0Min the static
// state at T0Min is clear of the saturation line. Checked jointly, full p0
// at that T0 lies on the liquid side, and the best the tunnel does is
// short.
func TestJointLimits(t *testing.T) {
	f := classTunnel()
	sv := testSolver(t, f, testSettings(), 0.2)
	gas := atmos.Nitrogen()
	const M = 0.5
	c := sv.bounds(M)
	tau, pi := c.tau, c.pi
	// Independent checks, each at its own most favourable corner.
	if q := 0.7 * f.Gas.P0Max * pi * M * M; q > f.QMax {
		t.Fatalf("setup: q at P0Max %v above QMax", q)
	}
	if f.Gas.T0Min*tau < gas.SaturationTemperature(f.Gas.P0Min*pi) {
		t.Fatalf("setup: T0Min condenses even at P0Min")
	}
	naive := sv.reAt(&c, f.Gas.P0Max, f.Gas.T0Min) // "p0 in range, T0 in range"
	top, ok := sv.best(&c)
	joint := top.re
	if !ok || !(joint < naive) {
		t.Fatalf("setup: joint best %v not below naive %v", joint, naive)
	}
	target := 0.5 * (joint/(1-0.10) + naive) // beyond the tolerance of the joint best
	if target > naive || target < joint/(1-0.10) {
		t.Fatalf("setup: target %v not between joint %v and naive %v", target, joint, naive)
	}
	ps := sv.solve(M, target, 250, true)
	if ps.class != ReShort || ps.limit != LimitCondensation {
		t.Errorf("joint: class %v limit %v, want Reynolds short by condensation (independent checks would say feasible: naive Re %.4g ≥ target %.4g)",
			ps.class, ps.limit, naive, target)
	}
	if T := ps.t; T < gas.SaturationTemperature(ps.p)*(1-solveTol) {
		t.Errorf("joint: chosen static T %v below saturation %v at p %v", T, gas.SaturationTemperature(ps.p), ps.p)
	}
	if relErr(ps.re, joint) > exactTol || !(ps.re < target) {
		t.Errorf("joint: Re %v, want the joint best %v below target %v", ps.re, joint, target)
	}
}

// TestLimitLines: the q cap gives q = QMax at the best corner, and where
// the saturation line binds the static state sits on it.
func TestLimitLines(t *testing.T) {
	f := classTunnel()
	sv := testSolver(t, f, testSettings(), 0.2)
	gas := atmos.Nitrogen()
	c := sv.bounds(0.85)
	top, _ := sv.best(&c)
	p0, pl := top.p0, top.lim.p
	if pl != LimitQMax {
		t.Fatalf("M 0.85 pressure limit %v, want q cap", pl)
	}
	if want := 2 * f.QMax / (1.4 * 0.85 * 0.85 * c.pi); relErr(p0, want) > exactTol {
		t.Errorf("q-capped p0 = %v, want 2·QMax/(γM²π) = %v", p0, want)
	}
	if q := 0.7 * p0 * c.pi * 0.85 * 0.85; relErr(q, f.QMax) > exactTol {
		t.Errorf("q at the corner = %v, want QMax %v", q, f.QMax)
	}
	c = sv.bounds(0.5)
	top, _ = sv.best(&c)
	p0, t0, tl := top.p0, top.t0, top.lim.t
	if tl != LimitCondensation {
		t.Fatalf("M 0.5 temperature limit %v, want condensation", tl)
	}
	if T, Ts := t0*c.tau, gas.SaturationTemperature(p0*c.pi); relErr(T, Ts) > solveTol {
		t.Errorf("static T on the saturation line = %v, want Tsat = %v", T, Ts)
	}
	// With the flag off (nitrogen, subsonic) the floor is T0Min.
	f.Gas.Condensation = false
	sv = testSolver(t, f, testSettings(), 0.2)
	c = sv.bounds(0.5)
	if top, _ := sv.best(&c); top.lim.t != LimitT0Min || top.t0 != f.Gas.T0Min {
		t.Errorf("without the condensation check: T0 %v limit %v, want T0Min %v", top.t0, top.lim.t, f.Gas.T0Min)
	}
}

// TestCondensationWarning: a free stream on the vapour side whose local
// peak Mach 1.4 state lies on the liquid side is flagged; a warmer run is
// not. Checked with the isentropic ratios at M 1.4 directly.
func TestCondensationWarning(t *testing.T) {
	f := cryoTunnel()
	f.Gas.T0Min = 80
	sv := testSolver(t, f, testSettings(), 0.2)
	gas := atmos.Nitrogen()
	tau14, pi14 := atmos.TemperatureRatio(1.4, 1.4), atmos.PressureRatio(1.4, 1.4)
	c := sv.bounds(0.8)
	top, _ := sv.best(&c)
	reb := top.re
	var warned, clear int
	for _, frac := range []float64{0.2, 0.4, 0.6, 0.8, 0.95, 1.0} {
		ps := sv.solve(0.8, frac*reb, 250, true)
		local := ps.t0*tau14 <= gas.SaturationTemperature(ps.p0*pi14)
		if got := ps.flags.Has(FlagCondensationWarn); got != local {
			t.Errorf("Re %.3g of best: warning %v, local state at M 1.4 condenses: %v (T0 %v p0 %v)", frac, got, local, ps.t0, ps.p0)
		}
		if local {
			warned++
		} else {
			clear++
		}
		if ps.t < gas.SaturationTemperature(ps.p)*(1-solveTol) {
			t.Errorf("free stream condenses: T %v < Tsat %v", ps.t, gas.SaturationTemperature(ps.p))
		}
	}
	if warned == 0 || clear == 0 {
		t.Errorf("warned %d, clear %d: want both cases", warned, clear)
	}
}

// TestAirSupersonicMinT0: a supersonic air tunnel without the condensation
// flag still keeps the free stream above the dew line of air (Lemmon et al.
// 2000 ancillary, in atmos): at Mach 4.5 the T0 floor is Tsat(p)/τ.
func TestAirSupersonicMinT0(t *testing.T) {
	f := benchFacilities()[3] // supersonic blowdown, air
	f.Gas.Condensation = false
	f.Gas.T0Min = 250
	sv := testSolver(t, f, testSettings(), 0.05)
	gas := atmos.Air()
	const M = 4.5
	c := sv.bounds(M)
	top, ok := sv.best(&c)
	p0, t0, tl := top.p0, top.t0, top.lim.t
	if !ok || tl != LimitCondensation {
		t.Fatalf("M 4.5 best: ok %v, T0 limit %v, want condensation", ok, tl)
	}
	want := gas.SaturationTemperature(p0*c.pi) / c.tau
	if relErr(t0, want) > solveTol || t0 <= f.Gas.T0Min {
		t.Errorf("T0 floor %v, want Tsat(p)/τ = %v above T0Min", t0, want)
	}
	ps := sv.solve(M, 1e12, 220, true) // far beyond reach: report the best
	if ps.class != ReShort || !(ps.t0 >= want*(1-solveTol)) {
		t.Errorf("M 4.5 short point: class %v T0 %v, want Reynolds short at T0 ≥ %v", ps.class, ps.t0, want)
	}
}

// TestEnthalpyAndRealGas: a Mach 6 flight point at 30 km has a stagnation
// temperature of 226.5 × (1 + 0.2 × 36) = 1857 K (USSA 1976: T = 226.51 K at
// 30 km); a facility T0 of at most 900 K is below half of it.
func TestEnthalpyAndRealGas(t *testing.T) {
	f := benchFacilities()[4] // hypersonic blowdown, air, T0 up to 1100 K
	f.Gas.T0Max = 900
	sv := testSolver(t, f, testSettings(), 0.1)
	st, err := atmos.At(30000)
	if err != nil {
		t.Fatal(err)
	}
	ps := sv.solve(6, 1e6, st.Temperature, true)
	if !ps.has {
		t.Fatalf("no setting at Mach 6: class %v limit %v", ps.class, ps.limit)
	}
	if !ps.flags.Has(FlagEnthalpyShort) || !ps.flags.Has(FlagRealGas) {
		t.Errorf("Mach 6 flags %v, want enthalpy short and real-gas caution", ps.flags)
	}
	if flightT0 := st.Temperature * 8.2; math.Abs(flightT0-1857) > 1 {
		t.Errorf("flight T0 at 30 km, M 6 = %v, want 1857 K", flightT0)
	}
}

// TestOvershoot: when even P0Min at T0Max exceeds the flight Reynolds
// number the point is still a full match, flagged, with the limit that
// stops the settings from coming down.
func TestOvershoot(t *testing.T) {
	f := benchFacilities()[1]
	f.Gas.P0Min = 2.5e5
	sv := testSolver(t, f, testSettings(), 0.5)
	c := sv.bounds(0.6)
	low := sv.reAt(&c, f.Gas.P0Min, f.Gas.T0Max)
	ps := sv.solve(0.6, low/2, 250, true)
	if ps.class != FullMatch || ps.limit != LimitP0Min || !ps.flags.Has(FlagReOver) {
		t.Errorf("overshoot: class %v limit %v flags %v, want full match, minimum p0, Reynolds over", ps.class, ps.limit, ps.flags)
	}
	if ps.pLim != LimitP0Min || ps.tLim != LimitT0Max {
		t.Errorf("overshoot side limits %v, %v; want minimum p0, maximum T0", ps.pLim, ps.tLim)
	}
	if ps.p0 != f.Gas.P0Min || ps.t0 != f.Gas.T0Max || relErr(ps.ratio, 2) > exactTol {
		t.Errorf("overshoot setting p0 %v T0 %v ratio %v, want P0Min, T0Max, 2", ps.p0, ps.t0, ps.ratio)
	}
}

// TestReynoldsSweep: at the chosen p0 (constant q) the sweep over T0 runs
// from Re at T0Max to Re at the T0 floor and contains the chosen Re.
func TestReynoldsSweep(t *testing.T) {
	f := classTunnel()
	sv := testSolver(t, f, testSettings(), 0.2)
	c := sv.bounds(0.7)
	top, _ := sv.best(&c)
	reb := top.re
	ps := sv.solve(0.7, 0.5*reb, 250, true)
	lo, hi := sv.sweep(&c, ps.p0)
	if !(lo <= ps.re*(1+exactTol) && ps.re <= hi*(1+exactTol)) {
		t.Errorf("sweep %v–%v does not contain Re %v", lo, hi, ps.re)
	}
	if want := sv.reAt(&c, ps.p0, f.Gas.T0Max); relErr(lo, want) > exactTol {
		t.Errorf("sweep low end %v, want Re at T0Max %v", lo, want)
	}
	floor, _ := sv.floorT0(&c, ps.p0)
	if want := sv.reAt(&c, ps.p0, floor); relErr(hi, want) > exactTol {
		t.Errorf("sweep high end %v, want Re at the T0 floor %v", hi, want)
	}
}

// TestWaterHandWorked: water at 20 °C and a static pressure of one
// atmosphere, ρ = 998.21 kg/m³, μ = 1.0016e-3 Pa·s (CRC Handbook, from
// memory, values at 1 atm), vapour pressure 2339 Pa (IAPWS-IF97), model
// length 0.5 m, flight Re 5e6 at Mach 0.2:
//
//	ν = 1.0016e-3/998.21         = 1.00340e-6 m²/s
//	V = Re·ν/L = 5e6 × 1.00340e-6/0.5 = 10.034 m/s
//	q = ½ × 998.21 × 10.034²     = 50 250 Pa
//	σ = (101 325 − 2339)/50 250  = 1.9699
func TestWaterHandWorked(t *testing.T) {
	f := waterTunnel()
	f.Water.TMin, f.Water.TMax = 293.15, 293.15
	f.Water.PMin, f.Water.PMax = 0, atmos.SeaLevelPressure
	sv := testWaterSolver(t, f, testSettings(), 0.5)
	ps := sv.solve(0.2, 5e6, 288.15, true)
	if ps.class != MachRelaxed {
		t.Fatalf("water class %v limit %v, want Mach relaxed", ps.class, ps.limit)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"V", ps.v, 10.034}, {"q", ps.q, 50250}, {"sigma", ps.sigma, 1.9699}, {"Re", ps.re, 5e6}, {"p", ps.p, atmos.SeaLevelPressure}} {
		if e := relErr(c.got, c.want); e > handTol {
			t.Errorf("water %s = %.6g, want %.5g (rel err %.2g)", c.name, c.got, c.want, e)
		}
	}
	// Out of reach: the top speed falls short, limit is the speed range.
	if ps := sv.solve(0.2, 1e9, 288.15, true); ps.class != NoMatch || ps.limit != LimitSpeedRange {
		t.Errorf("water at Re 1e9: class %v limit %v, want out of reach, speed range", ps.class, ps.limit)
	}
	// Minimum speed overshoots warm water: cooling brings Re down to flight.
	f = waterTunnel()
	f.Water.SpeedMin = 3
	sv = testWaterSolver(t, f, testSettings(), 0.5)
	hot, _ := atmos.WaterAt(f.Water.TMax)
	target := 0.8 * 3 * 0.5 / hot.KinematicViscosity
	ps = sv.solve(0.2, target, 288.15, true)
	if ps.class != MachRelaxed || ps.v != 3 || relErr(ps.re, target) > 1e-6 || !(ps.t0 < f.Water.TMax && ps.t0 > f.Water.TMin) {
		t.Errorf("cooled water: class %v V %v T %v Re %v, want Mach relaxed at 3 m/s, cooler water, Re %v", ps.class, ps.v, ps.t0, ps.re, target)
	}
}

func TestSolveErrors(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	good := cryoTunnel()
	tests := []struct {
		name string
		f    func(*Facility)
		s    func(*Settings)
	}{
		{"no p0 max", func(f *Facility) { f.Gas.P0Max = 0 }, nil},
		{"T0 range reversed", func(f *Facility) { f.Gas.T0Max = 50 }, nil},
		{"negative q", func(f *Facility) { f.QMax = -1 }, nil},
		{"water too hot", func(f *Facility) { *f = waterTunnel(); f.Water.TMax = 400 }, nil},
		{"Re tolerance 1", nil, func(s *Settings) { s.ReTol = 1 }},
		{"NaN scale", nil, func(s *Settings) { s.Scale = math.NaN() }},
		{"no scale", func(f *Facility) { f.Width = 0 }, nil},
	}
	for _, tc := range tests {
		f, s := good, testSettings()
		if tc.f != nil {
			tc.f(&f)
		}
		if tc.s != nil {
			tc.s(&s)
		}
		if _, err := Solve(g, &f, s); err == nil {
			t.Errorf("%s: Solve gave no error", tc.name)
		}
	}
}

// TestWhatIfTouchesOnlySolve: a facility change re-runs Solve on the same
// grid; the grid is not modified and the answers follow the change.
func TestWhatIfTouchesOnlySolve(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	before := append([]flightRec(nil), g.points...)
	f := cryoTunnel()
	s := testSettings()
	s.Scale = 0.05
	m1, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	f.Gas.P0Max = 2e5
	m2, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	for k := range before {
		if before[k] != g.points[k] {
			t.Fatalf("Solve changed grid point %d", k)
		}
	}
	if m2.Shares().Count[FullMatch] >= m1.Shares().Count[FullMatch] {
		t.Errorf("lower p0 max: full matches %d, before %d; want fewer", m2.Shares().Count[FullMatch], m1.Shares().Count[FullMatch])
	}
}

// onTestMaps solves the cryogenic, class and water test facilities at
// scale 0.05 on the test transport's grid and calls f with each map.
func onTestMaps(t *testing.T, f func(m *Map)) {
	t.Helper()
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	for _, fac := range []Facility{cryoTunnel(), classTunnel(), waterTunnel()} {
		s := testSettings()
		s.Scale = 0.05
		m, err := Solve(g, &fac, s)
		if err != nil {
			t.Fatal(err)
		}
		f(m)
	}
}

// TestDetailAgreesWithMap: every inside point's detail has the map's class,
// limit and flags, and its settings to single precision.
func TestDetailAgreesWithMap(t *testing.T) {
	onTestMaps(t, func(m *Map) {
		g, f := m.Grid, m.Facility
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				d, err := m.Detail(i, j)
				if err != nil {
					t.Fatal(err)
				}
				r := m.At(i, j)
				if d.Class != r.Class || d.Limit != r.Limit || d.Flags != r.Flags {
					t.Errorf("%s (%d,%d): detail %v/%v/%v, map %v/%v/%v", f.Name, i, j, d.Class, d.Limit, d.Flags, r.Class, r.Limit, r.Flags)
				}
				if relErr(float64(r.P0), d.P0) > float32Tol || relErr(float64(r.Re), d.Re) > float32Tol {
					t.Errorf("%s (%d,%d): map p0 %v Re %v, detail %v %v", f.Name, i, j, r.P0, r.Re, d.P0, d.Re)
				}
				if d.Class != Outside && (len(d.Cautions) == 0 || d.Cautions[0] != PlanningNote) {
					t.Errorf("%s (%d,%d): cautions %q, want the planning note first", f.Name, i, j, d.Cautions)
				}
			}
		}
	})
}

// TestDetailFromIsDetail: DetailFrom, given the point's flight side and
// one Detail reused from point to point (a stale field would show), writes
// what Detail returns but the cautions, at inside and outside points.
func TestDetailFromIsDetail(t *testing.T) {
	onTestMaps(t, func(m *Map) {
		g, f := m.Grid, m.Facility
		var got Detail
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				want, err := m.Detail(i, j)
				if err != nil {
					t.Fatal(err)
				}
				fd, err := g.FlightDetail(i, j)
				if err != nil {
					t.Fatal(err)
				}
				m.DetailFrom(&got, &fd, i, j)
				want.Cautions = nil
				if !reflect.DeepEqual(got, want) {
					t.Fatalf("%s (%d,%d): DetailFrom\n%+v\nwant Detail without cautions\n%+v", f.Name, i, j, got, want)
				}
			}
		}
	})
}

// TestReynoldsRange: the reachable range at a test Mach number runs from
// P0Min at T0Max up to the best setting.
func TestReynoldsRange(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := classTunnel()
	m, err := Solve(g, &f, testSettings())
	if err != nil {
		t.Fatal(err)
	}
	lo, hi, ok := m.ReynoldsRange(0.7)
	sv := m.sv.(*gasSolver)
	c := sv.bounds(0.7)
	top, _ := sv.best(&c)
	best := top.re
	if !ok || relErr(hi, best) > exactTol || relErr(lo, sv.reAt(&c, f.Gas.P0Min, f.Gas.T0Max)) > exactTol || !(lo < hi) {
		t.Errorf("ReynoldsRange(0.7) = %v, %v, %v; want P0Min/T0Max Re up to the best %v", lo, hi, ok, best)
	}
	if _, _, ok := m.ReynoldsRange(0.95); ok {
		t.Error("ReynoldsRange above the Mach range: want ok false")
	}
}

// TestEveryClassOnAMap: over the test transport's envelope, the class
// tunnel (top Mach number cut to 0.85) at scale 0.05 shows every class.
func TestEveryClassOnAMap(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := classTunnel()
	f.Gas.MachMax = 0.85
	s := testSettings()
	s.Scale = 0.05
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	sh := m.Shares()
	for c := Class(0); int(c) < NumClasses; c++ {
		if sh.Count[c] == 0 {
			t.Errorf("no point classed %v (shares %+v)", c, sh)
		}
	}
}
