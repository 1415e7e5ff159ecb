package envelope

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"likewind/atmos"
)

// TestOvershootWithinUnitReynoldsCap: where even the lowest setting (P0Min
// at T0Max) overshoots flight and breaks the facility's unit-Reynolds cap,
// nothing can run at that Mach number: the point is out of reach by the cap,
// not a full match at a setting the facility does not allow. (Found by
// FuzzSolve.)
//
// Invented facility: nitrogen, p0 10–50 bar, T0 285–315 K, cap 1e7 /m. At
// Mach 0.4, P0Min and T0Max the unit Reynolds number is about 8e7 /m
// (ρ ≈ 9.9 kg/m³, V ≈ 142 m/s, μ ≈ 1.8e-5 Pa·s, from the isentropic
// relations and Sutherland's law), far above the cap; flight at 15 km and
// Mach 0.4 on a 2 m model needs only about 3e6.
func TestOvershootWithinUnitReynoldsCap(t *testing.T) {
	f := Facility{Name: "capped", Medium: "nitrogen",
		Gas:             GasLimits{MachMin: 0.2, MachMax: 0.6, P0Min: 10e5, P0Max: 50e5, T0Min: 285, T0Max: 315},
		MaxReynoldsPerM: 1e7, Width: 2, Height: 2}
	v := onePointVehicle(15000, 0.4, 2)
	s := testSettings()
	s.Scale = 1
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	d, err := m.Detail(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	if d.Class != NoMatch || d.Limit != LimitRePerM {
		t.Errorf("class %v (%v) with unit Re %.3g, want out of reach by the unit Reynolds limit", d.Class, d.Limit, d.RePerM)
	}
	if d.HasSettings && d.RePerM > f.MaxReynoldsPerM*(1+fuzzSlack) {
		t.Errorf("settings give unit Re %.4g, above the cap %.4g", d.RePerM, f.MaxReynoldsPerM)
	}
	// Below the compressibility Mach number the relaxed search must skip
	// such Mach numbers the same way.
	v = onePointVehicle(15000, 0.25, 2)
	if g, err = NewGrid(v, s); err != nil {
		t.Fatal(err)
	}
	if m, err = Solve(g, &f, s); err != nil {
		t.Fatal(err)
	}
	if d, err = m.Detail(0, 0); err != nil {
		t.Fatal(err)
	}
	if d.HasSettings && d.RePerM > f.MaxReynoldsPerM*(1+fuzzSlack) {
		t.Errorf("Mach 0.25: class %v, settings give unit Re %.4g, above the cap %.4g", d.Class, d.RePerM, f.MaxReynoldsPerM)
	}
}

// propCases is how many random facility and flight-point cases each
// property test solves.
const propCases = 20000

// randomSolveCase draws a case the way FuzzSolve decodes its input: a
// facility the loader accepts, a flight point of the standard atmosphere
// and matching tolerances.
func randomSolveCase(rng *rand.Rand) solveCase {
	u := rng.Float64
	return decodeSolveCase(solveInputs{uint8(rng.IntN(3)), rng.IntN(2) == 0,
		u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u(), u()})
}

// solveOne solves a case's single grid point with settings s.
func solveOne(t *testing.T, c solveCase, s Settings) Detail {
	t.Helper()
	g, err := NewGrid(onePointVehicle(c.alt, c.mf, c.refLen), s)
	if err != nil {
		t.Fatal(err)
	}
	f := c.f
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatalf("Solve: %v\n%+v", err, f)
	}
	d, err := m.Detail(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	if r := m.At(0, 0); r.Class != d.Class {
		t.Fatalf("map class %v, detail class %v", r.Class, d.Class)
	}
	return d
}

func caseText(c solveCase) string {
	return fmt.Sprintf("%s\nflight alt %g m, Mach %g, L %g m, settings %+v",
		MarshalFacilities([]Facility{c.f}), c.alt, c.mf, c.refLen, c.settings)
}

// TestPropertyClassMonotoneInScale: a larger model never gives a worse
// class (Class.Rank), for random facilities and flight points; the fixed
// demo-like cases are in TestClassMonotoneInScale.
func TestPropertyClassMonotoneInScale(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 40))
	for n := 0; n < propCases; n++ {
		c := randomSolveCase(rng)
		s := c.settings
		s.Scale = 1e-4 * math.Pow(1e4, rng.Float64())
		small := solveOne(t, c, s)
		s.Scale *= 1 + 9*rng.Float64()
		large := solveOne(t, c, s)
		if large.Class.Rank() > small.Class.Rank() {
			t.Errorf("scale %g gives %v (%v), scale %g gave %v (%v)\n%s",
				s.Scale, large.Class, large.Limit, small.Scale, small.Class, small.Limit, caseText(c))
		}
	}
}

// TestPropertyClassMonotoneInTolerances: a looser Mach or Reynolds-number
// tolerance, or a higher compressibility threshold (Mach may be relaxed
// over a wider range), never gives a worse class.
func TestPropertyClassMonotoneInTolerances(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 2))
	for n := 0; n < propCases; n++ {
		c := randomSolveCase(rng)
		tight := c.settings
		if tight.Scale == 0 {
			tight.Scale = 0.05
		}
		base := solveOne(t, c, tight)
		for _, loosen := range []struct {
			name string
			f    func(*Settings)
		}{
			{"Mach tolerance", func(s *Settings) { s.MachTol += 0.2 * rng.Float64() }},
			{"Reynolds tolerance", func(s *Settings) { s.ReTol += (0.99 - s.ReTol) * rng.Float64() }},
			{"compressibility threshold", func(s *Settings) {
				s.CompressibilityMach += (0.99 - s.CompressibilityMach) * rng.Float64()
			}},
		} {
			loose := tight
			loosen.f(&loose)
			d := solveOne(t, c, loose)
			if d.Class.Rank() > base.Class.Rank() {
				t.Errorf("looser %s (%+v) gives %v (%v), tighter gave %v (%v)\n%s",
					loosen.name, loose, d.Class, d.Limit, base.Class, base.Limit, caseText(c))
			}
		}
	}
}

// TestPropertyReynoldsLinearInP0: with only the p0 and T0 ranges limiting
// (no dynamic-pressure, static-temperature, unit-Reynolds or saturation
// limit), scaling both ends of the p0 range by k scales the facility's
// reachable Reynolds numbers at every Mach number by k exactly: Re is
// proportional to p0 at fixed Mach number and T0.
func TestPropertyReynoldsLinearInP0(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 1))
	for n := 0; n < propCases; n++ {
		c := randomSolveCase(rng)
		if c.f.Medium == MediumWater {
			continue
		}
		c.f.QMax, c.f.Gas.MinStaticT, c.f.MaxReynoldsPerM, c.f.Gas.Condensation = 0, 0, 0, false
		s := c.settings
		s.Scale = 0.05
		k := 1 + 9*rng.Float64()
		if c.f.Gas.P0Max*k > maxPressure {
			k = maxPressure / c.f.Gas.P0Max
		}
		g, err := NewGrid(onePointVehicle(c.alt, c.mf, c.refLen), s)
		if err != nil {
			t.Fatal(err)
		}
		f1, fk := c.f, c.f
		fk.Gas.P0Min, fk.Gas.P0Max = k*c.f.Gas.P0Min, k*c.f.Gas.P0Max
		m1, err1 := Solve(g, &f1, s)
		mk, errk := Solve(g, &fk, s)
		if err1 != nil || errk != nil {
			t.Fatal(err1, errk)
		}
		M := f1.Gas.MachMin + (f1.Gas.MachMax-f1.Gas.MachMin)*rng.Float64()
		if gas, _ := atmos.GasByName(string(f1.Medium)); M >= 1 && gas.DrySupersonic() {
			continue // the saturation line always applies (supersonic air)
		}
		lo1, hi1, ok1 := m1.ReynoldsRange(M)
		lok, hik, okk := mk.ReynoldsRange(M)
		if !ok1 || !okk {
			t.Fatalf("ReynoldsRange(%g): ok %v, %v with no coupled limits\n%s", M, ok1, okk, caseText(c))
		}
		if math.Abs(lok/(k*lo1)-1) > exactTol*10 || math.Abs(hik/(k*hi1)-1) > exactTol*10 {
			t.Errorf("Mach %g: p0 × %g gives Re %g–%g, want %g × (%g–%g)\n%s", M, k, lok, hik, k, lo1, hi1, caseText(c))
		}
	}
}

// randomGridVehicle is a vehicle around a case's flight point: a box
// envelope from a third to three times the flight speed and a few
// kilometres either side, on a 7 × 9 grid in Mach number or (so that the
// Mach number changes down each column) in EAS.
func randomGridVehicle(c solveCase, rng *rand.Rand) *Vehicle {
	lo := math.Max(c.alt-3000*rng.Float64(), -4999)
	hi := math.Min(c.alt+3000*rng.Float64()+1, 85999)
	v := onePointVehicle(c.alt, c.mf, c.refLen)
	v.Boundary = []Vertex{{lo, c.mf / 3}, {lo, 3 * c.mf}, {hi, 3 * c.mf}, {hi, c.mf / 3}}
	v.Grid.Altitude = Axis{Min: lo, Max: hi, Count: 7}
	v.Grid.Speed = Axis{Min: c.mf / 3, Max: 3 * c.mf, Count: 9}
	if rng.IntN(2) == 0 {
		st, err := atmos.At(c.alt)
		if err == nil {
			eas := atmos.EASFromMach(c.mf, st)
			v.BoundaryKind, v.Grid.SpeedKind = atmos.EAS, atmos.EAS
			for k := range v.Boundary {
				v.Boundary[k].Speed *= eas / c.mf
			}
			v.Grid.Speed = Axis{Min: eas / 3, Max: 3 * eas, Count: 9}
		}
	}
	return v
}

// TestPropertyMapAgreesWithDetail: over random facilities and small grids,
// every stored result of Solve (which reuses work down columns and across
// workers) equals the full-precision Detail of its point, solved afresh:
// the same class, limit and flags, and the same settings to single
// precision.
func TestPropertyMapAgreesWithDetail(t *testing.T) {
	const f32 = 1e-6 // relative rounding of the stored float32 values
	rng := rand.New(rand.NewPCG(30, 12))
	for n := 0; n < propCases/10; n++ {
		c := randomSolveCase(rng)
		g, err := NewGrid(randomGridVehicle(c, rng), c.settings)
		if err != nil {
			t.Fatal(err)
		}
		f := c.f
		s := c.settings
		if s.Scale == 0 {
			s.Scale = 0.05
		}
		m, err := Solve(g, &f, s)
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				r := m.At(i, j)
				d, err := m.Detail(i, j)
				if err != nil {
					t.Fatal(err)
				}
				same := r.Class == d.Class && r.Limit == d.Limit && r.Flags == d.Flags
				for _, p := range [][2]float64{
					{float64(r.P0), d.P0}, {float64(r.T0), d.T0}, {float64(r.Q), d.Q}, {float64(r.Re), d.Re},
					{float64(r.ReRatio), d.ReRatio}, {float64(r.V), d.V},
				} {
					if math.Abs(p[0]-p[1]) > f32*math.Abs(p[1])+1e-30 {
						same = false
					}
				}
				if !same {
					t.Fatalf("point (%d, %d) of %d × %d: map %+v, detail class %v limit %v flags %v p0 %g T0 %g q %g Re %g ratio %g ΔCf %g V %g\n%s",
						i, j, g.Rows(), g.Cols(), r, d.Class, d.Limit, d.Flags, d.P0, d.T0, d.Q, d.Re, d.ReRatio, d.DCf, d.V, caseText(c))
				}
			}
		}
	}
}

// TestPropertyConcurrentSolves: facilities solved at the same time on one
// shared grid large enough for Solve's own workers give exactly the maps
// they give one at a time (run with -race to check the shared memos).
func TestPropertyConcurrentSolves(t *testing.T) {
	g, err := NewGrid(benchVehicle(80), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	facs := benchFacilities()
	alone := make([]*Map, len(facs))
	for k := range facs {
		if alone[k], err = Solve(g, &facs[k], testSettings()); err != nil {
			t.Fatal(err)
		}
	}
	together := make([]*Map, len(facs))
	errs := make([]error, len(facs))
	var wg sync.WaitGroup
	for k := range facs {
		wg.Go(func() { together[k], errs[k] = Solve(g, &facs[k], testSettings()) })
	}
	wg.Wait()
	for k := range facs {
		if errs[k] != nil {
			t.Fatal(errs[k])
		}
		for p := range alone[k].Results {
			if a, b := alone[k].Results[p], together[k].Results[p]; a != b {
				t.Fatalf("%s point %d: alone %+v, concurrently %+v", facs[k].Name, p, a, b)
			}
		}
	}
}

// TestWaterCoolingKeepsDynamicPressure: where even the minimum speed
// overshoots flight and the water is cooled to bring the Reynolds number
// down, colder (denser) water raises the dynamic pressure at that speed;
// the cooling must stop where the facility's dynamic-pressure limit is
// reached. (Found by FuzzSolve.)
//
// Invented water tunnel whose minimum speed sits just under the q limit at
// its warmest water (40 °C); water at 10 °C is about 0.8 % denser
// (IAPWS-IF97 region 1 at its 3 bar static pressure, as the solver takes
// it), so cooling all the way would break the limit.
func TestWaterCoolingKeepsDynamicPressure(t *testing.T) {
	const qmax, pStatic = 50e3, 3e5
	hot, err := atmos.WaterAtPressure(313.15, pStatic)
	if err != nil {
		t.Fatal(err)
	}
	vmin := math.Sqrt(2*qmax/hot.Density) * (1 - 1e-6)
	f := Facility{Name: "q-limited water", Medium: MediumWater,
		Water: WaterLimits{SpeedMin: vmin, SpeedMax: 3 * vmin, PMin: 1e5, PMax: pStatic, TMin: 283.15, TMax: 313.15},
		QMax:  qmax, Width: 1, Height: 1}
	s := testSettings()
	s.Scale = 0.5
	g, err := NewGrid(onePointVehicle(10000, 0.01, 1), s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	d, err := m.Detail(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	if d.Q > qmax*(1+1e-9) {
		t.Errorf("q = %.8g Pa at %.3f K, above the limit %g", d.Q, d.T0, qmax)
	}
	if d.Class != MachRelaxed || d.Limit != LimitQMax || !d.Flags.Has(FlagReOver) {
		t.Errorf("class %v, limit %v, flags %v; want Mach relaxed held by the dynamic-pressure limit, Reynolds over", d.Class, d.Limit, d.Flags)
	}
	if !(d.T0 >= f.Water.TMin && d.T0 <= f.Water.TMax) || d.V != vmin {
		t.Errorf("setting %.4f K at %.6g m/s, want within %g–%g K at the minimum speed %.6g", d.T0, d.V, f.Water.TMin, f.Water.TMax, vmin)
	}
	// The water is as cold as the limit allows: 0.01 K colder breaks it.
	colder, err := atmos.WaterAtPressure(d.T0-0.01, pStatic)
	if err != nil {
		t.Fatal(err)
	}
	if q := 0.5 * colder.Density * vmin * vmin; q <= qmax {
		t.Errorf("water %.3f K gives q %.8g Pa within the limit: the cooling stopped short", d.T0-0.01, q)
	}
	if r := m.At(0, 0); r.Class != d.Class || r.Limit != d.Limit || float64(r.Q) > qmax*(1+1e-6) {
		t.Errorf("map %+v disagrees with detail", r)
	}
}
