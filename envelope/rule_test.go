package envelope

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"likewind/atmos"
)

// ruleTol is the relative allowance with which two settings of these
// tests count as the same (the solver's rounding allowance is 1e-9).
const ruleTol = 1e-9

func sameRel(a, b, tol float64) bool { return withinTol(a, b, tol*math.Max(math.Abs(a), math.Abs(b))) }

// TestRuleNames: the rules are written and read by the names of their own
// (case, hyphens and underscores aside), and each medium lists its own.
func TestRuleNames(t *testing.T) {
	for in, want := range map[string]RuleKind{
		"warmest": RuleWarmest, "Least Load": RuleLeastLoad, "least-load": RuleLeastLoad,
		"fixed_temperature": RuleFixedTemperature, "fixed T0": RuleFixedTemperature,
		"fixed water temperature": RuleFixedTemperature, "fixed q": RuleFixedQ, "default": RuleDefault,
	} {
		got, err := ParseRuleKind(in)
		if err != nil || got != want {
			t.Errorf("ParseRuleKind(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	if _, err := ParseRuleKind("coldest"); err == nil ||
		!strings.Contains(err.Error(), `"warmest", "least load", "fixed temperature" or "fixed q"`) {
		t.Errorf(`ParseRuleKind("coldest"): %v, want an error listing the rules`, err)
	}
	if got := RuleKinds(MediumWater); len(got) != 2 || got[0] != RuleWarmest || got[1] != RuleFixedTemperature {
		t.Errorf("water rules %v, want warmest and fixed temperature", got)
	}
	if got := RuleKinds("nitrogen"); len(got) != 4 || got[0] != RuleWarmest {
		t.Errorf("gas rules %v, want the four, warmest first", got)
	}
	// The standard rule keeps the words the details panel showed before.
	for m, want := range map[Medium]string{"air": "warmest T0, then lowest p0", MediumWater: "warmest water, then lowest speed"} {
		if got := (OperatingRule{}).Describe(m, nil); got != want {
			t.Errorf("%s standard rule %q, want %q", m, got, want)
		}
	}
	if got := (OperatingRule{Kind: RuleFixedTemperature, Temperature: 110}).Describe("nitrogen", nil); got != "fixed T0 110 K, p0 to match" {
		t.Errorf("fixed T0 rule reads %q", got)
	}
	if got := (OperatingRule{Kind: RuleFixedQ, Q: 50e3}).Describe("air", nil); got != "fixed q 50.0 kPa, T0 to match" {
		t.Errorf("fixed q rule reads %q", got)
	}
}

// TestRuleInForce: a what-if rule overrides the facility's; with neither
// the standard rule is in force.
func TestRuleInForce(t *testing.T) {
	f := cryoTunnel()
	if r := RuleInForce(&f, Settings{}); r.Kind != RuleWarmest {
		t.Errorf("no rule anywhere: %v, want warmest", r.Kind)
	}
	f.Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: 120}
	if r := RuleInForce(&f, Settings{}); r != f.Rule {
		t.Errorf("facility rule: %+v, want %+v", r, f.Rule)
	}
	s := Settings{Rule: OperatingRule{Kind: RuleFixedQ, Q: 4e4}}
	if r := RuleInForce(&f, s); r != s.Rule {
		t.Errorf("what-if rule: %+v, want %+v", r, s.Rule)
	}
}

// TestCheckRuleRefuses: each bad rule is refused with the part that is
// wrong named, and Solve refuses it too.
func TestCheckRuleRefuses(t *testing.T) {
	cryo := cryoTunnel() // nitrogen, p0 1.2–4.5 bar, T0 90–320 K, Mach 0.2–1.2, q max 120 kPa
	loaded := cryo
	loaded.Balance.MaxNormalForce = 5000
	water := waterTunnel()
	water.Balance.MaxNormalForce = 5000
	// The condensation floor of the cryogenic tunnel: at p0 min 1.2 bar and
	// Mach 0.2 the static pressure is 1.2 bar × (1 + 0.2·0.04)^-3.5 =
	// 1.1666 bar and T/T0 = 1/1.008 (NACA Report 1135 isentropic
	// relations); nitrogen saturates at 1.1666 bar near 79.0 K (Span et
	// al. 2000 vapour-pressure line), so T0 must be at least about
	// 79.0 × 1.008 = 79.7 K — below T0 min 90 K: the floor is the range.
	n2 := atmos.Nitrogen()
	floor := n2.SaturationTemperature(1.2e5*math.Pow(1.008, -3.5)) * 1.008
	if floor < 78.5 || floor > 80.5 {
		t.Fatalf("condensation floor %g K, want about 79.7 K", floor)
	}
	cold := cryo
	cold.Gas.T0Min = 70 // now the floor lies inside the range
	for _, tc := range []struct {
		name  string
		r     OperatingRule
		f     Facility
		field string
		words string
	}{
		{"fixed T0 above the range", OperatingRule{Kind: RuleFixedTemperature, Temperature: 330}, cryo, "temperature", "90 K to 320 K"},
		{"fixed T0 below the range", OperatingRule{Kind: RuleFixedTemperature, Temperature: 80}, cryo, "temperature", "90 K to 320 K"},
		{"fixed T0 below condensation", OperatingRule{Kind: RuleFixedTemperature, Temperature: floor - 1}, cold, "temperature", "condenses"},
		{"fixed q above q max", OperatingRule{Kind: RuleFixedQ, Q: 130e3}, cryo, "q", "at most the facility's q max, 120000 Pa"},
		{"fixed q of zero", OperatingRule{Kind: RuleFixedQ}, cryo, "q", "above 0"},
		{"fixed q below any Mach number", OperatingRule{Kind: RuleFixedQ, Q: 1000}, cryo, "q", "a dynamic pressure the facility runs"},
		{"least load with no balance", OperatingRule{Kind: RuleLeastLoad}, cryo, "rule", "balance"},
		{"least load on water", OperatingRule{Kind: RuleLeastLoad}, water, "rule", "water tunnel"},
		{"fixed q on water", OperatingRule{Kind: RuleFixedQ, Q: 1e4}, water, "rule", "water tunnel"},
		{"fixed water temperature above the range", OperatingRule{Kind: RuleFixedTemperature, Temperature: 320}, water, "temperature", "283.15 K to 313.15 K"},
		{"unknown kind", OperatingRule{Kind: RuleKind(9)}, cryo, "rule", "warmest"},
	} {
		err := CheckRule(tc.r, &tc.f)
		var re *RuleError
		if !errors.As(err, &re) || re.Field != tc.field || !strings.Contains(err.Error(), tc.words) {
			t.Errorf("%s: %v, want a RuleError on %q saying %q", tc.name, err, tc.field, tc.words)
			continue
		}
		g, gerr := NewGrid(testTransport(), testSettings())
		if gerr != nil {
			t.Fatal(gerr)
		}
		s := testSettings()
		s.Scale = 0.05
		s.Rule = tc.r
		if _, err := Solve(g, &tc.f, s); err == nil || !strings.Contains(err.Error(), tc.words) {
			t.Errorf("%s: Solve gives %v, want the rule refused", tc.name, err)
		}
	}
	for _, tc := range []struct {
		name string
		r    OperatingRule
		f    Facility
	}{
		{"fixed T0 at condensation floor", OperatingRule{Kind: RuleFixedTemperature, Temperature: floor + 0.01}, cold},
		{"fixed T0 at T0 max", OperatingRule{Kind: RuleFixedTemperature, Temperature: 320}, cryo},
		{"fixed q at q max", OperatingRule{Kind: RuleFixedQ, Q: 120e3}, cryo},
		{"least load with a balance", OperatingRule{Kind: RuleLeastLoad}, loaded},
		{"fixed water temperature", OperatingRule{Kind: RuleFixedTemperature, Temperature: 293.15}, water},
		{"warmest water", OperatingRule{Kind: RuleWarmest}, water},
	} {
		if err := CheckRule(tc.r, &tc.f); err != nil {
			t.Errorf("%s: refused: %v", tc.name, err)
		}
	}
	// The parts return the value to use, a rounding outside the range
	// brought onto its end.
	if v, err := CheckRuleTemperature(&water, "", 313.15*(1+1e-12)); err != nil || v != 313.15 {
		t.Errorf("water temperature a rounding above the range: %v, %v", v, err)
	}
}

// demoRuleCase is the demo vehicle and its cryogenic tunnel (Kellen Fold:
// nitrogen, p0 1.2–4.5 bar, T0 105–313 K, q max 120 kPa, scale 1/40) with
// a balance, so that every gas rule may be chosen, on the demo grid.
func demoRuleCase(t *testing.T) (*Grid, Facility, Settings) {
	t.Helper()
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range facs {
		if strings.HasPrefix(f.Name, "Kellen") {
			f.Balance.MaxNormalForce = 1e6 // no vehicle coefficient: a capacity only
			return g, f, s
		}
	}
	t.Fatal("no Kellen Fold facility in the demo")
	return nil, Facility{}, s
}

// lineMatches are the points of m that the facility matches along a line
// (full match, flight Reynolds number reached, the set more than one
// setting), at most n of them, spread over the grid.
func lineMatches(t *testing.T, m *Map, n int) [][2]int {
	t.Helper()
	var out [][2]int
	for i := 0; i < m.Grid.Rows(); i++ {
		for j := 0; j < m.Grid.Cols(); j++ {
			if m.At(i, j).Class != FullMatch || m.At(i, j).Limit != LimitNone {
				continue
			}
			d, err := m.Detail(i, j)
			if err != nil {
				t.Fatal(err)
			}
			if d.Set.OK && !d.Set.Single() && d.Set.ReLimit == LimitNone && d.Set.Warm.T0 > d.Set.Cold.T0*(1+1e-6) {
				out = append(out, [2]int{i, j})
			}
		}
	}
	if len(out) < 5 {
		t.Fatalf("only %d demo points match along a line", len(out))
	}
	step := max(1, len(out)/n)
	var spread [][2]int
	for k := 0; k < len(out); k += step {
		spread = append(spread, out[k])
	}
	return spread
}

// isentropicRe is the model Reynolds number at (p0, T0) and Mach number M
// from the textbook steps, independent of the solver: T = T0/(1 + 0.2M²),
// p = p0·(1 + 0.2M²)^-3.5 (NACA Report 1135, γ = 1.4), ρ = p/(RT),
// V = M·√(γRT), μ from Sutherland's law of the gas, Re = ρVL/μ.
func isentropicRe(gas atmos.Gas, M, p0, t0, L float64) float64 {
	k := 1 + 0.2*M*M
	T, p := t0/k, p0*math.Pow(k, -3.5)
	rho := p / (gas.R() * T)
	return rho * M * math.Sqrt(gas.Gamma()*gas.R()*T) * L / gas.Viscosity(T)
}

// TestMatchingSetEnds: on the demo's cryogenic tunnel every setting at
// either end of a matching line gives the flight Reynolds number (by the
// textbook steps of isentropicRe), the ends lie on the facility's limits
// they name, and p0, q and T0 rise together from the cold end to the warm.
func TestMatchingSetEnds(t *testing.T) {
	g, f, s := demoRuleCase(t)
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	n2 := atmos.Nitrogen()
	for _, ij := range lineMatches(t, m, 30) {
		d, _ := m.Detail(ij[0], ij[1])
		set := d.Set
		for _, e := range []SetEnd{set.Cold, set.Warm} {
			if re := isentropicRe(n2, set.Mach, e.P0, e.T0, d.ModelLength); !sameRel(re, d.ReFlight, 1e-9) {
				t.Errorf("%v: end p0 %g T0 %g gives Re %g, want flight %g", ij, e.P0, e.T0, re, d.ReFlight)
			}
			// q = ½γ·p·M² (NACA Report 1135).
			if q := 0.7 * e.P0 * math.Pow(1+0.2*set.Mach*set.Mach, -3.5) * set.Mach * set.Mach; !sameRel(q, e.Q, 1e-12) {
				t.Errorf("%v: end q %g, want %g", ij, e.Q, q)
			}
		}
		if !(set.Cold.P0 < set.Warm.P0 && set.Cold.Q < set.Warm.Q && set.Cold.T0 < set.Warm.T0) {
			t.Errorf("%v: cold end %+v not below warm end %+v", ij, set.Cold, set.Warm)
		}
		switch set.Cold.Limit {
		case LimitT0Min:
			if set.Cold.T0 != f.Gas.T0Min {
				t.Errorf("%v: cold end bounded by T0 min at %g K, T0 min is %g K", ij, set.Cold.T0, f.Gas.T0Min)
			}
		case LimitP0Min:
			if !sameRel(set.Cold.P0, f.Gas.P0Min, 1e-12) {
				t.Errorf("%v: cold end bounded by p0 min at %g Pa", ij, set.Cold.P0)
			}
		case LimitCondensation:
		default:
			t.Errorf("%v: cold end bounded by %v", ij, set.Cold.Limit)
		}
		switch set.Warm.Limit {
		case LimitP0Max:
			if !sameRel(set.Warm.P0, f.Gas.P0Max, 1e-12) {
				t.Errorf("%v: warm end bounded by p0 max at %g Pa", ij, set.Warm.P0)
			}
		case LimitQMax:
			if !sameRel(set.Warm.Q, f.QMax, 1e-12) {
				t.Errorf("%v: warm end bounded by q max at %g Pa", ij, set.Warm.Q)
			}
		case LimitT0Max:
			if !sameRel(set.Warm.T0, f.Gas.T0Max, 1e-12) {
				t.Errorf("%v: warm end bounded by T0 max at %g K", ij, set.Warm.T0)
			}
		default:
			t.Errorf("%v: warm end bounded by %v", ij, set.Warm.Limit)
		}
	}
}

// TestRulesPickTheirEnd: at demo points matched along a line, the
// standard rule takes the warm end of the matching set, the least-load
// rule the cold end (lowest q), a fixed T0 inside the set keeps that T0
// with p0 between the ends, and a fixed q inside the set keeps that q with
// T0 between the ends; each reaches the flight Reynolds number.
func TestRulesPickTheirEnd(t *testing.T) {
	g, f, s := demoRuleCase(t)
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	pts := lineMatches(t, m, 12)
	solveAt := func(r OperatingRule, i, j int) Detail {
		t.Helper()
		s := s
		s.Rule = r
		m, err := Solve(g, &f, s)
		if err != nil {
			t.Fatalf("rule %+v: %v", r, err)
		}
		d, err := m.Detail(i, j)
		if err != nil {
			t.Fatal(err)
		}
		if got := m.At(i, j); got.Class != d.Class || got.Limit != d.Limit {
			t.Fatalf("rule %+v at (%d, %d): map %v (%v), detail %v (%v)", r, i, j, got.Class, got.Limit, d.Class, d.Limit)
		}
		return d
	}
	for _, ij := range pts {
		i, j := ij[0], ij[1]
		base, _ := m.Detail(i, j)
		set := base.Set
		if !sameRel(base.T0, set.Warm.T0, ruleTol) || !sameRel(base.P0, set.Warm.P0, ruleTol) {
			t.Errorf("%v warmest: T0 %g p0 %g, want the warm end %g, %g", ij, base.T0, base.P0, set.Warm.T0, set.Warm.P0)
		}
		d := solveAt(OperatingRule{Kind: RuleLeastLoad}, i, j)
		if d.Class != FullMatch || !sameRel(d.T0, set.Cold.T0, ruleTol) || !sameRel(d.Q, set.Cold.Q, ruleTol) ||
			!sameRel(d.Re, d.ReFlight, ruleTol) {
			t.Errorf("%v least load: %v T0 %g q %g Re %g, want the cold end %g, %g at Re %g", ij, d.Class, d.T0, d.Q, d.Re, set.Cold.T0, set.Cold.Q, d.ReFlight)
		}
		if d.Set != set {
			t.Errorf("%v: the matching set changes with the rule: %+v, was %+v", ij, d.Set, set)
		}
		midT := 0.5 * (set.Cold.T0 + set.Warm.T0)
		d = solveAt(OperatingRule{Kind: RuleFixedTemperature, Temperature: midT}, i, j)
		if d.Class != FullMatch || d.T0 != midT || !(d.P0 > set.Cold.P0 && d.P0 < set.Warm.P0) || !sameRel(d.Re, d.ReFlight, ruleTol) {
			t.Errorf("%v fixed T0 %g: %v T0 %g p0 %g Re %g, want p0 between %g and %g at flight Re %g",
				ij, midT, d.Class, d.T0, d.P0, d.Re, set.Cold.P0, set.Warm.P0, d.ReFlight)
		}
		midQ := 0.5 * (set.Cold.Q + set.Warm.Q)
		d = solveAt(OperatingRule{Kind: RuleFixedQ, Q: midQ}, i, j)
		if d.Class != FullMatch || !sameRel(d.Q, midQ, ruleTol) || !(d.T0 > set.Cold.T0 && d.T0 < set.Warm.T0) || !sameRel(d.Re, d.ReFlight, ruleTol) {
			t.Errorf("%v fixed q %g: %v q %g T0 %g Re %g, want T0 between %g and %g at flight Re %g",
				ij, midQ, d.Class, d.Q, d.T0, d.Re, set.Cold.T0, set.Warm.T0, d.ReFlight)
		}
		if want := "fixed q " + (SIFormat{}).Q(midQ) + ", T0 to match"; d.Rule.Describe(d.Medium, nil) != want {
			t.Errorf("detail states the rule as %q, want %q", d.Rule.Describe(d.Medium, nil), want)
		}
	}
}

// TestFixedRulesFallShort: where a fixed rule's value cannot reach the
// flight Reynolds number the point gets the best the rule allows, with
// the limit that stops it. The demo's cryogenic tunnel at a point the
// standard rule matches cold (near T0 min): held at T0 = 300 K, the p0
// needed is far above p0 max (Re ∝ p0·(T+S)/T² falls about 6-fold from
// 110 K to 300 K), so the point is Reynolds short at p0 max and 300 K; held
// at a q below the cold end, T0 cannot go below T0 min to make up for it.
func TestFixedRulesFallShort(t *testing.T) {
	g, f, s := demoRuleCase(t)
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	for _, ij := range lineMatches(t, m, 6) {
		base, _ := m.Detail(ij[0], ij[1])
		s := s
		s.Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: 300}
		mr, err := Solve(g, &f, s)
		if err != nil {
			t.Fatal(err)
		}
		d, _ := mr.Detail(ij[0], ij[1])
		if base.Set.Warm.Q < 0.99*f.QMax {
			// q at p0 max stays below q max: p0 max is what stops it.
			if d.Class != ReShort || d.Limit != LimitP0Max || d.T0 != 300 || !sameRel(d.P0, f.Gas.P0Max, ruleTol) {
				t.Errorf("%v fixed T0 300 K: %v (%v) T0 %g p0 %g, want Reynolds short by maximum p0 at 300 K, p0 max",
					ij, d.Class, d.Limit, d.T0, d.P0)
			}
		}
		s.Rule = OperatingRule{Kind: RuleFixedQ, Q: 0.8 * base.Set.Cold.Q}
		if s.Rule.Q < 8e3 {
			continue // below what p0 min gives at some Mach numbers: refused
		}
		if mr, err = Solve(g, &f, s); err != nil {
			t.Fatal(err)
		}
		d, _ = mr.Detail(ij[0], ij[1])
		if d.Class == FullMatch && d.Mach == base.Mach {
			t.Errorf("%v fixed q %g below the cold end %g: full match at the same Mach number", ij, s.Rule.Q, base.Set.Cold.Q)
		}
		if d.Class == ReShort && (d.Limit != LimitT0Min || !sameRel(d.Q, s.Rule.Q, ruleTol) || d.T0 != f.Gas.T0Min) {
			t.Errorf("%v fixed q %g: Reynolds short by %v at q %g T0 %g, want by minimum T0 at the fixed q", ij, s.Rule.Q, d.Limit, d.Q, d.T0)
		}
	}
}

// TestFixedQOutOfRange: a fixed q that p0 min exceeds at a Mach number
// leaves the point without a setting there, limited by p0 min. Hand
// calculation (NACA Report 1135, γ = 1.4): at Mach 1.2, p/p0 =
// 1.288^-3.5 = 0.41238 and q/p0 = 0.7·1.44·0.41238 = 0.41568, so 30 kPa
// needs p0 = 72.17 kPa, below the cryogenic tunnel's p0 min 1.2 bar; at
// Mach 0.5, p/p0 = 1.05^-3.5 = 0.84302, q/p0 = 0.14753, so 30 kPa is
// p0 = 203.35 kPa, inside 1.2–4.5 bar.
func TestFixedQOutOfRange(t *testing.T) {
	f := cryoTunnel()
	s := testSettings()
	s.Scale = 0.05
	s.Rule = OperatingRule{Kind: RuleFixedQ, Q: 30e3}
	for _, tc := range []struct {
		mach float64
		p0   float64
	}{{1.2, 0}, {0.5, 203.35e3}} {
		g, err := NewGrid(onePointVehicle(9000, tc.mach, 3), s)
		if err != nil {
			t.Fatal(err)
		}
		m, err := Solve(g, &f, s)
		if err != nil {
			t.Fatal(err)
		}
		d, _ := m.Detail(0, 0)
		if tc.p0 == 0 {
			if d.Class != NoMatch || d.Limit != LimitP0Min || d.HasSettings {
				t.Errorf("Mach %g at fixed q 30 kPa: %v (%v), want out of reach by minimum p0", tc.mach, d.Class, d.Limit)
			}
			continue
		}
		if !d.HasSettings || math.Abs(d.P0/tc.p0-1) > 1e-4 || !sameRel(d.Q, 30e3, ruleTol) {
			t.Errorf("Mach %g at fixed q 30 kPa: p0 %g, q %g, want p0 %g", tc.mach, d.P0, d.Q, tc.p0)
		}
	}
}

// TestLeastLoadOnCondensation: with T0 min far below the saturation line
// (the class tunnel: nitrogen, T0 from 80 K), the cold end of a matching
// line is where the line meets the saturation line, and the least-load
// rule runs there: the test-section static state on the saturation line
// (to 1e-9), q below the standard rule's.
func TestLeastLoadOnCondensation(t *testing.T) {
	f := classTunnel()
	f.Balance.MaxNormalForce = 1e6
	n2 := atmos.Nitrogen()
	found := 0
	for _, alt := range []float64{0, 3000, 6000, 9000, 12000} {
		for _, mach := range []float64{0.4, 0.6, 0.8} {
			s := testSettings()
			s.Scale = 0.05
			g, err := NewGrid(onePointVehicle(alt, mach, 3), s)
			if err != nil {
				t.Fatal(err)
			}
			m, _ := Solve(g, &f, s)
			base, _ := m.Detail(0, 0)
			if base.Class != FullMatch || base.Set.Cold.Limit != LimitCondensation || base.Set.Single() {
				continue
			}
			found++
			s.Rule = OperatingRule{Kind: RuleLeastLoad}
			m, err = Solve(g, &f, s)
			if err != nil {
				t.Fatal(err)
			}
			d, _ := m.Detail(0, 0)
			if !sameRel(d.T, n2.SaturationTemperature(d.P), 1e-9) {
				t.Errorf("%g m, Mach %g: least load static T %g K at p %g Pa, saturation %g K", alt, mach, d.T, d.P, n2.SaturationTemperature(d.P))
			}
			if n2.ExceedsVapourPressure(d.P, d.T) {
				t.Errorf("%g m, Mach %g: least load setting on the liquid side", alt, mach)
			}
			if !(d.Q < base.Q) || !sameRel(d.Q, base.Set.Cold.Q, ruleTol) || d.Class != FullMatch || d.Limit != LimitNone {
				t.Errorf("%g m, Mach %g: least load %v (%v) q %g, standard q %g, cold end %g", alt, mach, d.Class, d.Limit, d.Q, base.Q, base.Set.Cold.Q)
			}
		}
	}
	if found == 0 {
		t.Fatal("no case with the cold end on the saturation line")
	}
}

// TestPropertyLeastLoadDemo: at every demo point and for every demo gas
// facility, at equal class and test Mach number, no other rule reaches at
// least the least-load rule's Reynolds number at a lower q. Where the
// least-load rule reaches flight it runs the lowest-q end of the matching
// set, on which every other rule's setting that reaches flight lies; where
// it falls short it takes the facility's best setting, which another rule
// can only equal. (Another rule may reach the same class at a lower q
// with a Reynolds number below flight but within the tolerance — a fixed
// q below the cold end, say: the least-load rule aims at flight, not at
// the tolerance's edge.)
func TestPropertyLeastLoadDemo(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	compared, reached := 0, 0
	for k := range facs {
		f := facs[k]
		if f.Medium == MediumWater {
			continue
		}
		f.Balance.MaxNormalForce = 1e6
		solveRule := func(r OperatingRule) *Map {
			s := s
			s.Rule = r
			if err := CheckRule(r, &f); err != nil {
				return nil
			}
			m, err := Solve(g, &f, s)
			if err != nil {
				t.Fatalf("%s, rule %+v: %v", f.Name, r, err)
			}
			return m
		}
		least := solveRule(OperatingRule{Kind: RuleLeastLoad})
		others := []*Map{solveRule(OperatingRule{Kind: RuleWarmest})}
		for _, u := range []float64{0.1, 0.5, 0.9} {
			others = append(others, solveRule(OperatingRule{Kind: RuleFixedTemperature, Temperature: f.Gas.T0Min + u*(f.Gas.T0Max-f.Gas.T0Min)}))
			if lo, hi, ok := gasQRange(&f); ok {
				if f.QMax > 0 {
					hi = min(hi, f.QMax)
				}
				others = append(others, solveRule(OperatingRule{Kind: RuleFixedQ, Q: lo * math.Pow(hi/lo, u)}))
			}
		}
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				a, err := least.Detail(i, j)
				if err != nil || !a.HasSettings {
					continue
				}
				for _, o := range others {
					if o == nil {
						continue
					}
					b, _ := o.Detail(i, j)
					if !b.HasSettings || b.Class != a.Class || b.Mach != a.Mach {
						continue
					}
					compared++
					if a.Class == ReShort && a.Re < b.Re*(1-ruleTol) {
						t.Errorf("%s (%d, %d) Reynolds short: least load Re %g below rule %q's %g", f.Name, i, j, a.Re, b.Rule.Describe(f.Medium, nil), b.Re)
					}
					if b.Re >= a.Re*(1-ruleTol) {
						reached++
						if a.Q > b.Q*(1+ruleTol) {
							t.Errorf("%s (%d, %d) %v: least load q %g (Re %g) above rule %q's q %g (Re %g)",
								f.Name, i, j, a.Class, a.Q, a.Re, b.Rule.Describe(f.Medium, nil), b.Q, b.Re)
						}
					}
				}
			}
		}
	}
	if compared < 1000 || reached < 500 {
		t.Errorf("only %d comparisons, %d at an equal or higher Reynolds number", compared, reached)
	}
}

// TestPropertyRulesRandom: for random facilities and flight points (as
// FuzzSolve draws them), each rule's answer keeps the facility's limits
// and the rule's own value, the least-load answer's q is at most the
// standard answer's at equal class and test Mach number, and each takes
// its end of the matching set where it reaches flight directly.
func TestPropertyRulesRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 5))
	for n := 0; n < propCases/4; n++ {
		c := randomSolveCase(rng)
		if c.f.Medium == MediumWater {
			continue
		}
		c.f.Balance.MaxNormalForce = 1e6
		s := c.settings
		if s.Scale == 0 {
			s.Scale = 0.05
		}
		warm := solveOne(t, c, s)
		s.Rule = OperatingRule{Kind: RuleLeastLoad}
		cold := solveOne(t, c, s)
		check := func(s Settings) {
			t.Helper()
			cc := c
			cc.settings = s
			checkSolveCase(t, cc) // FuzzSolve's invariants under the rule
		}
		check(s)
		if warm.Class != cold.Class {
			t.Fatalf("least load class %v, standard %v\n%s", cold.Class, warm.Class, caseText(c))
		}
		if cold.Class.Matched() && cold.Mach == warm.Mach && cold.Q > warm.Q*(1+ruleTol) {
			t.Errorf("least load q %g above the standard q %g\n%s", cold.Q, warm.Q, caseText(c))
		}
		if set := cold.Set; cold.Class.Matched() && cold.Limit == LimitNone && set.OK && set.ReLimit == LimitNone && cold.Mach == set.Mach {
			if !sameRel(cold.Q, set.Cold.Q, 1e-7) || !sameRel(warm.Q, set.Warm.Q, 1e-7) {
				t.Errorf("q least %g standard %g, set from %g to %g\n%s", cold.Q, warm.Q, set.Cold.Q, set.Warm.Q, caseText(c))
			}
		}
		T := c.f.Gas.T0Min + rng.Float64()*(c.f.Gas.T0Max-c.f.Gas.T0Min)
		s.Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: T}
		if CheckRule(s.Rule, &c.f) == nil {
			if d := solveOne(t, c, s); d.HasSettings && d.T0 != T {
				t.Errorf("fixed T0 %g: T0 %g (%v)\n%s", T, d.T0, d.Class, caseText(c))
			}
			check(s)
		}
		if lo, hi, ok := gasQRange(&c.f); ok {
			if c.f.QMax > 0 {
				hi = min(hi, c.f.QMax)
			}
			s.Rule = OperatingRule{Kind: RuleFixedQ, Q: lo * math.Pow(hi/lo, rng.Float64())}
			if CheckRule(s.Rule, &c.f) == nil {
				if d := solveOne(t, c, s); d.HasSettings && !sameRel(d.Q, s.Rule.Q, 1e-7) {
					t.Errorf("fixed q %g: q %g (%v)\n%s", s.Rule.Q, d.Q, d.Class, caseText(c))
				}
				check(s)
			}
		}
	}
}

// TestWaterRules: a water tunnel under the standard rule runs the warm
// end of its matching set (the warmest water, the lowest speed); held at
// 20 °C it runs that water at the speed that matches, which lies between
// the ends, and along the set the speed falls as the water warms.
func TestWaterRules(t *testing.T) {
	f := waterTunnel() // 1–15 m/s, 10–40 °C, 2 bar
	s := testSettings()
	s.Scale = 0.5
	// Sea level, Mach 0.2 (68 m/s), 1 m: Re = ρVL/μ = 1.225·68.06/1.789e-5
	// ≈ 4.66e6 (U.S. Standard Atmosphere 1976 sea level). A 0.5 m model
	// needs V = Re·ν/L ≈ 6.2 m/s in water at 40 °C (ν ≈ 0.66e-6 m²/s) and
	// about 12 m/s at 10 °C (ν ≈ 1.31e-6 m²/s) — water viscosities from
	// memory — both inside 1–15 m/s: a line from the coldest water to the
	// warmest.
	g, err := NewGrid(onePointVehicle(0, 0.2, 1), s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	base, _ := m.Detail(0, 0)
	set := base.Set
	if base.Class != MachRelaxed || !set.OK || set.Single() {
		t.Fatalf("standard: %v, set %+v; want a Mach-relaxed match along a line", base.Class, set)
	}
	if base.T0 != set.Warm.T0 || !sameRel(base.V, set.Warm.V, ruleTol) || set.Warm.T0 != f.Water.TMax || set.Warm.Limit != LimitWaterTemp {
		t.Errorf("standard: T %g V %g, want the warm end %+v at the warmest water", base.T0, base.V, set.Warm)
	}
	if set.Cold.T0 != f.Water.TMin || set.Cold.Limit != LimitWaterTemp {
		t.Errorf("cold end %+v, want the coldest water", set.Cold)
	}
	if !(set.Cold.V > set.Warm.V && set.Cold.Q > set.Warm.Q && set.Cold.T0 < set.Warm.T0) {
		t.Errorf("cold end %+v not faster than the warm end %+v", set.Cold, set.Warm)
	}
	for _, e := range []SetEnd{set.Cold, set.Warm} {
		w, _ := atmos.WaterAtPressure(e.T0, e.P0)
		if re := e.V * base.ModelLength / w.KinematicViscosity; !sameRel(re, base.ReFlight, 1e-9) {
			t.Errorf("end %+v gives Re %g, want %g", e, re, base.ReFlight)
		}
	}
	s.Rule = OperatingRule{Kind: RuleFixedTemperature, Temperature: 293.15}
	if m, err = Solve(g, &f, s); err != nil {
		t.Fatal(err)
	}
	d, _ := m.Detail(0, 0)
	if d.T0 != 293.15 || !(d.V > set.Warm.V && d.V < set.Cold.V) || !sameRel(d.Re, d.ReFlight, 1e-9) || d.Set != set {
		t.Errorf("fixed 20 °C: T %g V %g Re %g, want V between %g and %g at Re %g", d.T0, d.V, d.Re, set.Warm.V, set.Cold.V, d.ReFlight)
	}
	if got := d.Rule.Describe(MediumWater, nil); got != "fixed water temperature 293 K, speed to match" {
		t.Errorf("rule reads %q", got)
	}
}

// TestDefaultRuleUnchanged: naming the standard rule, on the facility or
// as a what-if, gives the same map as naming none.
func TestDefaultRuleUnchanged(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	for k := range facs {
		f := facs[k]
		m0, err := Solve(g, &f, s)
		if err != nil {
			t.Fatal(err)
		}
		f.Rule = OperatingRule{Kind: RuleWarmest}
		m1, _ := Solve(g, &f, s)
		s1 := s
		s1.Rule = OperatingRule{Kind: RuleWarmest}
		f.Rule = OperatingRule{}
		m2, _ := Solve(g, &f, s1)
		for p := range m0.Results {
			if m1.Results[p] != m0.Results[p] || m2.Results[p] != m0.Results[p] {
				t.Fatalf("%s point %d: %+v / %+v, want %+v", f.Name, p, m1.Results[p], m2.Results[p], m0.Results[p])
			}
		}
	}
}
