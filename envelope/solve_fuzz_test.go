package envelope

import (
	"math"
	"testing"

	"likewind/atmos"
)

// fuzzSlack is the relative allowance with which a solved setting counts
// as inside a facility limit (the solver's own rounding allowance is
// solveSlack, 1e-9).
const fuzzSlack = 1e-7

// unitOf folds any fuzz value into [0, 1): the fractional part of |x|, and
// 0 for NaN and infinities.
func unitOf(x float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	x = math.Abs(x)
	return x - math.Floor(x)
}

// logBetween maps u in [0, 1) log-uniformly onto [lo, hi).
func logBetween(u, lo, hi float64) float64 {
	return lo * math.Pow(hi/lo, u)
}

// linBetween maps u in [0, 1) onto [lo, hi).
func linBetween(u, lo, hi float64) float64 { return lo + u*(hi-lo) }

// logUnit is the inverse of logBetween, for writing seeds.
func logUnit(x, lo, hi float64) float64 { return math.Log(x/lo) / math.Log(hi/lo) }

// solveCase is one fuzz input decoded into a facility, a flight point and
// settings, every value inside the ranges the file loader accepts.
type solveCase struct {
	f        Facility
	alt, mf  float64 // flight altitude (m) and Mach number
	refLen   float64
	settings Settings
}

// solveInputs is the raw fuzz input: every field is folded into its range
// by unitOf, so that any bit pattern is a valid case.
type solveInputs struct {
	medium                       uint8
	cond                         bool
	mLo, mHi, pLo, pHi, tLo, tHi float64
	q, minT, rePerM, peak, scale float64
	alt, mach, refLen, dT        float64
	machTol, reTol, compMach     float64
}

// fuzzMedia are the media a fuzz case picks from by its medium byte (the
// seed corpus keeps these numbers).
var fuzzMedia = [...]Medium{"air", "nitrogen", MediumWater}

// fuzzMediumByte is the medium byte that picks m.
func fuzzMediumByte(m Medium) uint8 {
	for k, x := range fuzzMedia {
		if x == m {
			return uint8(k)
		}
	}
	panic("no fuzz medium " + string(m))
}

func decodeSolveCase(in solveInputs) solveCase {
	var c solveCase
	f := &c.f
	f.Name = "fuzz tunnel"
	f.Medium = fuzzMedia[in.medium%uint8(len(fuzzMedia))]
	pLo := logBetween(unitOf(in.pLo), 1, maxPressure)
	pHi := logBetween(unitOf(in.pHi), pLo, maxPressure)
	if f.Medium.IsGas() {
		// Loader ranges: Mach above 0 up to 30, p0 above 0 up to 1000 bar,
		// T0 above 0 up to 3000 K; the lower ends here are far below any
		// real facility.
		g := &f.Gas
		g.MachMin = logBetween(unitOf(in.mLo), 1e-3, maxMach)
		g.MachMax = logBetween(unitOf(in.mHi), g.MachMin, maxMach)
		g.T0Min = logBetween(unitOf(in.tLo), 1, maxGasT0)
		g.T0Max = logBetween(unitOf(in.tHi), g.T0Min, maxGasT0)
		g.Condensation = in.cond
		g.PeakLocalMach = linBetween(unitOf(in.peak), 1, 10)
		if u := unitOf(in.minT); u > 0.6 {
			g.MinStaticT = logBetween((u-0.6)/0.4, 1, maxGasT0)
		}
		g.P0Min, g.P0Max = pLo, pHi
	} else {
		// Water: speed above 0 up to 100 m/s, 0 to 100 °C.
		w := &f.Water
		w.SpeedMin = logBetween(unitOf(in.mLo), 1e-3, maxWaterSpeed)
		w.SpeedMax = logBetween(unitOf(in.mHi), w.SpeedMin, maxWaterSpeed)
		w.TMin = linBetween(unitOf(in.tLo), waterFreezingK, waterBoilingK)
		w.TMax = linBetween(unitOf(in.tHi), w.TMin, waterBoilingK)
		w.PMin, w.PMax = pLo, pHi
	}
	if u := unitOf(in.q); u > 0.5 {
		f.QMax = logBetween((u-0.5)/0.5, 1, maxPressure)
	}
	if u := unitOf(in.rePerM); u > 0.6 {
		f.MaxReynoldsPerM = logBetween((u-0.6)/0.4, 1e3, 1e12)
	}
	f.Width, f.Height = 2, 1.5
	f.Model.MaxSpanFraction = DefaultMaxSpanFraction

	c.alt = linBetween(unitOf(in.alt), atmos.MinAltitude, atmos.MaxAltitude)
	c.mf = logBetween(unitOf(in.mach), 1e-3, maxMach)
	c.refLen = logBetween(unitOf(in.refLen), 1e-3, MaxLength)
	s := DefaultSettings(nil)
	s.DeltaT = linBetween(unitOf(in.dT), -MaxDeltaT, MaxDeltaT)
	s.MachTol = 0.2 * unitOf(in.machTol)
	s.ReTol = 0.99 * unitOf(in.reTol)
	s.CompressibilityMach = unitOf(in.compMach)
	// A scale in (0, 10], or (below 0.1 of the range) the fitted model.
	if u := unitOf(in.scale); u >= 0.1 {
		s.Scale = logBetween((u-0.1)/0.9, 1e-4, maxModelScale)
	}
	c.settings = s
	return c
}

// onePointVehicle is a vehicle whose 1 × 1 grid holds the flight point,
// inside a small rectangular envelope.
func onePointVehicle(alt, mach, refLen float64) *Vehicle {
	return &Vehicle{
		Name: "fuzz vehicle", RefLength: refLen, Span: 3 * refLen, FrontalArea: 0.1 * refLen * refLen,
		Boundary:     []Vertex{{alt - 100, mach / 2}, {alt - 100, 2 * mach}, {alt + 100, 2 * mach}, {alt + 100, mach / 2}},
		BoundaryKind: atmos.Mach,
		Grid: GridSpec{
			Altitude:  Axis{Min: alt, Max: alt, Count: 1},
			Speed:     Axis{Min: mach, Max: mach, Count: 1},
			SpeedKind: atmos.Mach,
		},
	}
}

// within reports lo ≤ x ≤ hi with a relative slack.
func within(x, lo, hi float64) bool {
	return x >= lo*(1-fuzzSlack) && x <= hi*(1+fuzzSlack)
}

// FuzzSolve: for any facility with limits the loader accepts and any
// flight point of the standard atmosphere, Solve does not panic, gives a
// finite answer whose settings lie within the facility's limits, and a
// class that agrees with its own Mach and Reynolds numbers and with the
// full-precision detail.
func FuzzSolve(f *testing.F) {
	// Seeds: each demo-like facility at a low-speed, a transonic and a
	// supersonic flight point (values written as their unit positions).
	for _, fac := range benchFacilities() {
		med := fuzzMediumByte(fac.Medium)
		var loU, hiU, tLo, tHi float64
		if fac.Medium == MediumWater {
			w := fac.Water
			loU, hiU = logUnit(w.SpeedMin, 1e-3, maxWaterSpeed), logUnit(w.SpeedMax, w.SpeedMin, maxWaterSpeed)
			tLo = (w.TMin - waterFreezingK) / (waterBoilingK - waterFreezingK)
			tHi = (w.TMax - w.TMin) / (waterBoilingK - w.TMin)
		} else {
			g := fac.Gas
			loU, hiU = logUnit(g.MachMin, 1e-3, maxMach), logUnit(g.MachMax, g.MachMin, maxMach)
			tLo, tHi = logUnit(g.T0Min, 1, maxGasT0), logUnit(g.T0Max, g.T0Min, maxGasT0)
		}
		pLo := logUnit(math.Max(fac.PressureMin(), 1), 1, maxPressure)
		pHi := logUnit(fac.PressureMax(), math.Max(fac.PressureMin(), 1), maxPressure)
		for _, pt := range []struct{ alt, mach float64 }{{500, 0.2}, {9000, 0.85}, {18000, 2}} {
			altU := (pt.alt - atmos.MinAltitude) / (atmos.MaxAltitude - atmos.MinAltitude)
			f.Add(med, fac.Gas.Condensation, loU, hiU, pLo, pHi, tLo, tHi,
				0.8, 0.0, 0.0, 0.04, 0.55, altU, logUnit(pt.mach, 1e-3, maxMach), 0.7, 0.5,
				0.05, 0.101, 0.3)
		}
	}
	f.Fuzz(func(t *testing.T, medium uint8, cond bool, mLo, mHi, pLo, pHi, tLo, tHi,
		q, minT, rePerM, peak, scale, alt, mach, refLen, dT, machTol, reTol, compMach float64) {
		c := decodeSolveCase(solveInputs{medium, cond, mLo, mHi, pLo, pHi, tLo, tHi,
			q, minT, rePerM, peak, scale, alt, mach, refLen, dT, machTol, reTol, compMach})
		checkSolveCase(t, c)
	})
}

// checkSolveCase solves one case and checks the answer.
func checkSolveCase(t *testing.T, c solveCase) {
	t.Helper()
	fac := c.f
	// The facility must be one the loader accepts (written out and read
	// back unchanged), or the case is not a valid input.
	back, err := ParseFacilities("fuzz.toml", MarshalFacilities([]Facility{fac}))
	if err != nil {
		t.Fatalf("generated facility is not valid: %v\n%+v", err, fac)
	}
	fac = back[0]
	// The rule and the balance are the engine's (the file keys for them
	// may not be written yet): carried over as they are.
	fac.Rule, fac.Balance = c.f.Rule, c.f.Balance
	v := onePointVehicle(c.alt, c.mf, c.refLen)
	g, err := NewGrid(v, c.settings)
	if err != nil {
		t.Fatalf("NewGrid(alt %g, Mach %g, ΔT %g): %v", c.alt, c.mf, c.settings.DeltaT, err)
	}
	if g.InsideCount() != 1 {
		t.Fatalf("grid has %d inside points, want the one flight point", g.InsideCount())
	}
	m, err := Solve(g, &fac, c.settings)
	if err != nil {
		t.Fatalf("Solve: %v\nfacility %+v\nsettings %+v", err, fac, c.settings)
	}
	r := m.At(0, 0)
	d, err := m.Detail(0, 0)
	if err != nil {
		t.Fatalf("Detail: %v", err)
	}
	ctx := func() string {
		return "\nfacility " + string(MarshalFacilities([]Facility{fac})) +
			"\nflight alt " + atmos.FormatNumber(c.alt) + " m, Mach " + atmos.FormatNumber(c.mf) +
			", L " + atmos.FormatNumber(c.refLen) + " m"
	}
	for _, x := range []struct {
		name string
		v    float64
	}{
		{"Result.P0", float64(r.P0)}, {"Result.T0", float64(r.T0)}, {"Result.Q", float64(r.Q)},
		{"Result.Re", float64(r.Re)}, {"Result.ReRatio", float64(r.ReRatio)},
		{"Result.V", float64(r.V)},
		{"Scale", m.Scale}, {"ModelLength", d.ModelLength}, {"Mach", d.Mach}, {"P0", d.P0}, {"T0", d.T0},
		{"P", d.P}, {"T", d.T}, {"V", d.V}, {"Q", d.Q}, {"Density", d.Density}, {"Viscosity", d.Viscosity},
		{"Re", d.Re}, {"ReFlight", d.ReFlight}, {"ReRatio", d.ReRatio}, {"RePerM", d.RePerM}, {"DCf", d.DCf},
		{"ReMax", d.ReMax}, {"ReSweepMin", d.ReSweepMin}, {"ReSweepMax", d.ReSweepMax},
		{"FlightT0", d.FlightT0}, {"MinT0Condensation", d.MinT0Condensation},
		{"VapourPressure", d.VapourPressure}, {"Cavitation", d.Cavitation},
	} {
		if math.IsNaN(x.v) || math.IsInf(x.v, 0) {
			t.Fatalf("%s = %g, want a finite number (class %v)%s", x.name, x.v, d.Class, ctx())
		}
		// ΔCf has either sign; a cavitation number is negative when the
		// static pressure is below the vapour pressure (boiling water).
		if x.v < 0 && x.name != "DCf" && x.name != "Cavitation" {
			t.Fatalf("%s = %g, want ≥ 0 (class %v)%s", x.name, x.v, d.Class, ctx())
		}
	}
	if r.Class != d.Class || r.Limit != d.Limit || r.Flags != d.Flags {
		t.Fatalf("map says %v (%v, %v), detail says %v (%v, %v)%s", r.Class, r.Limit, r.Flags, d.Class, d.Limit, d.Flags, ctx())
	}
	s := c.settings
	water := fac.Medium == MediumWater
	if d.HasSettings {
		if lo, hi := fac.PressureMin(), fac.PressureMax(); !within(d.P0, lo, hi) {
			t.Fatalf("p0 %g Pa outside the facility range %g–%g (class %v)%s", d.P0, lo, hi, d.Class, ctx())
		}
		if lo, hi := fac.TemperatureMin(), fac.TemperatureMax(); !within(d.T0, lo, hi) {
			t.Fatalf("T0 %g K outside the facility range %g–%g (class %v)%s", d.T0, lo, hi, d.Class, ctx())
		}
		if w := fac.Water; water && !within(d.V, w.SpeedMin, w.SpeedMax) {
			t.Fatalf("speed %g m/s outside the facility range %g–%g (class %v)%s", d.V, w.SpeedMin, w.SpeedMax, d.Class, ctx())
		}
		if g := fac.Gas; !water && !within(d.Mach, g.MachMin, g.MachMax) {
			t.Fatalf("Mach %g outside the facility range %g–%g (class %v)%s", d.Mach, g.MachMin, g.MachMax, d.Class, ctx())
		}
		if fac.QMax > 0 && d.Q > fac.QMax*(1+fuzzSlack) {
			t.Fatalf("q %g Pa above the facility limit %g (class %v)%s", d.Q, fac.QMax, d.Class, ctx())
		}
		if g := fac.Gas; g.MinStaticT > 0 && d.T < g.MinStaticT*(1-fuzzSlack) {
			t.Fatalf("static T %g K below the facility minimum %g (class %v)%s", d.T, g.MinStaticT, d.Class, ctx())
		}
		if fac.MaxReynoldsPerM > 0 && d.RePerM > fac.MaxReynoldsPerM*(1+fuzzSlack) {
			t.Fatalf("unit Re %g above the facility cap %g (class %v)%s", d.RePerM, fac.MaxReynoldsPerM, d.Class, ctx())
		}
		if gas, err := atmos.GasByName(string(fac.Medium)); err == nil &&
			(fac.Gas.Condensation || gas.DrySupersonic() && d.Mach >= 1) {
			if d.T < gas.CriticalTemperature() && d.P > gas.SaturationPressure(d.T)*(1+fuzzSlack) {
				t.Fatalf("static state p %g Pa, T %g K on the liquid side of the saturation line (psat %g Pa, class %v)%s",
					d.P, d.T, gas.SaturationPressure(d.T), d.Class, ctx())
			}
		}
		if !(d.Re > 0) || math.Abs(d.ReRatio-d.Re/d.ReFlight) > fuzzSlack*d.ReRatio {
			t.Fatalf("Re %g, flight %g, ratio %g: want Re > 0 and ratio = Re/flight%s", d.Re, d.ReFlight, d.ReRatio, ctx())
		}
	}
	// As the solver matches (withinTol), with this test's own 1e-9 more.
	machMatched := withinTol(d.Mach, c.mf, s.MachTol+1e-9)
	reMet := d.ReRatio >= (1-s.ReTol)*(1-fuzzSlack)
	switch d.Class {
	case FullMatch:
		if water || !d.HasSettings || !machMatched || !reMet {
			t.Fatalf("full match with Mach %g (flight %g, tolerance %g), Re ratio %g (tolerance %g)%s",
				d.Mach, c.mf, s.MachTol, d.ReRatio, s.ReTol, ctx())
		}
	case MachRelaxed:
		if !d.HasSettings || !reMet || !(c.mf < s.CompressibilityMach) ||
			(!water && d.Mach > s.CompressibilityMach*(1+1e-9)) {
			t.Fatalf("Mach relaxed at flight Mach %g, test Mach %g (threshold %g), Re ratio %g (tolerance %g)%s",
				c.mf, d.Mach, s.CompressibilityMach, d.ReRatio, s.ReTol, ctx())
		}
	case ReShort:
		if water || !d.HasSettings || !machMatched || d.ReRatio >= 1-s.ReTol {
			t.Fatalf("Reynolds short with Mach %g (flight %g), Re ratio %g (tolerance %g)%s",
				d.Mach, c.mf, d.ReRatio, s.ReTol, ctx())
		}
		if d.Limit == LimitNone {
			t.Fatalf("Reynolds short with no limit named%s", ctx())
		}
	case NoMatch:
		if d.Limit == LimitNone {
			t.Fatalf("out of reach with no limit named%s", ctx())
		}
	default:
		t.Fatalf("class %v for a point inside the envelope%s", d.Class, ctx())
	}
	// The matching set: each end within the facility's limits, giving the
	// set's Reynolds number, the cold end no warmer, slower-loaded than the
	// warm; the standard rule's setting is its warm end where it reaches
	// flight directly.
	if set := d.Set; set.OK {
		for _, e := range []SetEnd{set.Cold, set.Warm} {
			if lo, hi := fac.PressureMin(), fac.PressureMax(); !within(e.P0, lo, hi) {
				t.Fatalf("set end p0 %g outside %g–%g%s", e.P0, lo, hi, ctx())
			}
			if lo, hi := fac.TemperatureMin(), fac.TemperatureMax(); !within(e.T0, lo, hi) {
				t.Fatalf("set end T0 %g outside %g–%g%s", e.T0, lo, hi, ctx())
			}
			if fac.QMax > 0 && e.Q > fac.QMax*(1+fuzzSlack) {
				t.Fatalf("set end q %g above q max %g%s", e.Q, fac.QMax, ctx())
			}
		}
		if set.Cold.T0 > set.Warm.T0*(1+fuzzSlack) || (!water && set.Cold.Q > set.Warm.Q*(1+fuzzSlack)) {
			t.Fatalf("set cold end %+v above warm end %+v%s", set.Cold, set.Warm, ctx())
		}
		if RuleInForce(&fac, c.settings).Kind == RuleWarmest &&
			d.Limit == LimitNone && set.ReLimit == LimitNone && d.Class.Matched() && set.Mach == d.Mach &&
			!(within(d.T0, set.Warm.T0, set.Warm.T0) && within(d.P0, set.Warm.P0, set.Warm.P0)) {
			t.Fatalf("setting p0 %g T0 %g, set's warm end %+v%s", d.P0, d.T0, set.Warm, ctx())
		}
	}
	if len(d.Cautions) == 0 || d.Cautions[0] != PlanningNote {
		t.Fatalf("cautions %q, want the planning note first%s", d.Cautions, ctx())
	}
}
