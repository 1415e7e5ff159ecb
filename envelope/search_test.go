package envelope

import (
	"math"
	"strings"
	"testing"

	"likewind/atmos"
)

// facilityNamed is the map of the facility whose name starts with prefix.
func facilityNamed(t *testing.T, maps []*Map, prefix string) *Map {
	t.Helper()
	for _, m := range maps {
		if strings.HasPrefix(m.Facility.Name, prefix) {
			return m
		}
	}
	t.Fatalf("no facility %q", prefix)
	return nil
}

// bestRe is the best-setting Reynolds number of m at facility Mach number
// M (0 when none).
func bestRe(m *Map, M float64) float64 {
	sv := m.sv.(*gasSolver)
	c := sv.bounds(M)
	if !c.ok {
		return 0
	}
	top, ok := sv.best(&c)
	if !ok {
		return 0
	}
	return top.re
}

// TestRelaxReachesTopOfRange: the Mach-relaxed search includes the top of
// its range exactly. Second demo vehicle in the Harl Cove T2 tunnel (Mach
// range from 0.20), row 5 col 3 (2286 m, flight Mach 0.07, Re 1.4536e6):
// at the compressibility threshold 0.30 the best setting reaches 90.5 % of
// flight, a Mach-relaxed match; the samples used to stop at 0.2975 (89.8 %).
func TestRelaxReachesTopOfRange(t *testing.T) {
	g, maps := outSecondDemoMaps(t)
	m := facilityNamed(t, maps, "Harl Cove")
	d, err := m.Detail(5, 3)
	if err != nil {
		t.Fatal(err)
	}
	if g.Alts[5] != 2286 || g.Speeds[3] != 0.07 {
		t.Fatalf("row 5 col 3 is %g m, Mach %g; the demo grid changed", g.Alts[5], g.Speeds[3])
	}
	if d.Class != MachRelaxed || d.Mach != m.Settings.CompressibilityMach || !(d.ReRatio >= 1-m.Settings.ReTol) {
		t.Errorf("(5, 3): %v at test Mach %g, ratio %.4f; want Mach relaxed at %g with ratio ≥ %g",
			d.Class, d.Mach, d.ReRatio, m.Settings.CompressibilityMach, 1-m.Settings.ReTol)
	}
	if r := d.Re / bestRe(m, 0.2975); !(r > 1) {
		t.Errorf("(5, 3): model Re %g not above the best at Mach 0.2975 (%g)", d.Re, bestRe(m, 0.2975))
	}
	// Rows 8 col 4 and 29 col 21 alike (flight Mach 0.08 and 0.25).
	for _, p := range [][2]int{{8, 4}, {29, 21}} {
		d, _ := m.Detail(p[0], p[1])
		if d.Class != MachRelaxed || d.Mach != m.Settings.CompressibilityMach {
			t.Errorf("(%d, %d): %v at test Mach %g, want Mach relaxed at %g", p[0], p[1], d.Class, d.Mach, m.Settings.CompressibilityMach)
		}
	}
}

// TestRelaxClassIndependentOfMachMin: where only Mach relaxed can match
// (flight Mach number below every facility range tried), the class does
// not depend on where the facility's Mach range starts: below Mach 0.3 the
// Harl Cove T2 tunnel's best Reynolds number rises with Mach number (its
// dynamic-pressure limit does not bind there), so the top of the range
// decides.
func TestRelaxClassIndependentOfMachMin(t *testing.T) {
	g, maps := outSecondDemoMaps(t)
	ref := facilityNamed(t, maps, "Harl Cove")
	lows := []float64{0.15, 0.17, 0.1913, 0.2, 0.2013, 0.21, 0.23}
	tested := 0
	for _, lo := range lows {
		f := *ref.Facility
		f.Gas.MachMin = lo
		m, err := Solve(g, &f, ref.Settings)
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				fp := g.Flight(i, j)
				if !g.Inside(i, j) || float64(fp.Mach) >= lows[0]-ref.Settings.MachTol {
					continue
				}
				tested++
				if got, want := m.At(i, j).Class, ref.At(i, j).Class; got != want {
					t.Errorf("Mach range from %g: (%d, %d) at flight Mach %.2f is %v, from %g it is %v",
						lo, i, j, fp.Mach, got, ref.Facility.Gas.MachMin, want)
				}
			}
		}
	}
	if tested == 0 {
		t.Fatal("no low-Mach point tested")
	}
}

// TestMachSamples: both ends exactly, the multiples of the step between
// them, nothing twice.
func TestMachSamples(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		n      int
	}{{0.2, 0.3, 41}, {0.15, 0.3, 61}, {0.2013, 0.3, 41}, {0.54, 0.56, 9}, {0.5, 0.5, 1}} {
		ms := machSamples(c.lo, c.hi, nil)
		if len(ms) != c.n || ms[0] != c.lo || ms[len(ms)-1] != c.hi {
			t.Errorf("machSamples(%g, %g) = %d samples %g … %g, want %d from %g to %g",
				c.lo, c.hi, len(ms), ms[0], ms[len(ms)-1], c.n, c.lo, c.hi)
		}
		for k := 1; k < len(ms); k++ {
			if !(ms[k] > ms[k-1]) {
				t.Errorf("machSamples(%g, %g) not increasing at %d: %v", c.lo, c.hi, k, ms)
			}
		}
	}
}

// TestFullMatchInMachBand: a full match is Mach within tolerance and Re at
// least (1 − ReTol) of flight, so where the flight Mach number falls short
// the rest of the band is searched. Every class is checked against a dense
// scan of the band (step 0.0005) on both demo vehicles: no point that is
// not a full match has a band Mach number whose best setting reaches
// (1 − ReTol) of flight, and every full match lies in the band.
func TestFullMatchInMachBand(t *testing.T) {
	upgraded := 0
	for _, demo := range []func(testing.TB) (*Grid, []*Map){outDemoMaps, outSecondDemoMaps} {
		g, maps := demo(t)
		for _, m := range maps {
			if m.Facility.Medium == MediumWater {
				continue
			}
			tol := m.Settings.MachTol
			for i := 0; i < g.Rows(); i++ {
				for j := 0; j < g.Cols(); j++ {
					if !g.Inside(i, j) {
						continue
					}
					r := m.At(i, j)
					d, err := m.Detail(i, j)
					if err != nil {
						t.Fatal(err)
					}
					mf := d.Flight.Airspeeds.Mach
					need := (1 - m.Settings.ReTol) * d.ReFlight
					if r.Class == FullMatch {
						if !withinTol(d.Mach, mf, tol) || d.ReRatio < (1-m.Settings.ReTol)*(1-1e-9) {
							t.Errorf("%s (%d, %d): full match at test Mach %g (flight %g), ratio %g", m.Facility.Name, i, j, d.Mach, mf, d.ReRatio)
						}
						if bestRe(m, math.Min(math.Max(mf, m.Facility.Gas.MachMin), m.Facility.Gas.MachMax)) < need {
							upgraded++
						}
						continue
					}
					lo, hi := math.Max(mf-tol, m.Facility.Gas.MachMin), math.Min(mf+tol, m.Facility.Gas.MachMax)
					for M := lo; M <= hi+1e-12; M += 0.0005 {
						if re := bestRe(m, math.Min(M, hi)); re >= need*(1+1e-6) {
							t.Errorf("%s (%d, %d): %v, but test Mach %.4f (flight %.2f) reaches ratio %.4f",
								m.Facility.Name, i, j, r.Class, M, mf, re/d.ReFlight)
							break
						}
					}
				}
			}
		}
	}
	// The demos have about 50 such points (flight 0.55, test 0.56, ratio
	// 0.9004 among them).
	if upgraded < 20 {
		t.Errorf("%d full matches away from the flight Mach number, want the demos' band matches (about 50)", upgraded)
	}
}

// TestBandSearchHandCases: a pressurised air tunnel held by its p0 and T0
// ranges alone, where the best Reynolds number rises with Mach number.
func TestBandSearchHandCases(t *testing.T) {
	f := Facility{Name: "band", Medium: "air",
		Gas:   GasLimits{MachMin: 0.3, MachMax: 0.9, P0Min: 1e5, P0Max: 2e5, T0Min: 290, T0Max: 320},
		Width: 2, Height: 2}
	s := testSettings()
	sv := testSolver(t, f, s, 0.3)
	at := func(M float64) float64 {
		c := sv.bounds(M)
		top, _ := sv.best(&c)
		re := top.re
		return re
	}
	const mf, tFlight = 0.55, 220.0
	// Flight Re 0.895 of flight... i.e. the best at the flight Mach number
	// is 89.5 % of flight: Reynolds short there, but at Mach 0.56 the best
	// is higher by more than 1/0.895·0.9 − 1 = 0.56 %.
	reF := at(mf) / 0.895
	if at(mf+0.01) < 0.9*reF {
		t.Fatalf("test premise: best at %g is %.4f of flight", mf+0.01, at(mf+0.01)/reF)
	}
	ps := sv.solve(mf, reF, tFlight, true)
	if ps.class != FullMatch || ps.mach != mf+0.01 || relErr(ps.ratio, at(mf+0.01)/reF) > solveTol {
		t.Errorf("band top: %v at test Mach %g, ratio %.5f; want full match at %g, ratio %.5f",
			ps.class, ps.mach, ps.ratio, mf+0.01, at(mf+0.01)/reF)
	}
	// A wider tolerance: the flight Re is reached inside the band, at the
	// Mach number nearest flight that reaches it.
	s.MachTol = 0.1
	sv = testSolver(t, f, s, 0.3)
	ps = sv.solve(mf, reF, tFlight, true)
	if ps.class != FullMatch || relErr(ps.re, reF) > solveTol || !(ps.mach > mf && ps.mach < mf+0.1) {
		t.Fatalf("wide band: %v at test Mach %g, Re %.6g; want full match reaching %.6g", ps.class, ps.mach, ps.re, reF)
	}
	if re := at(ps.mach - 1e-5); re >= reF {
		t.Errorf("wide band: test Mach %g is not the nearest reaching flight (Mach %g gives %.6g ≥ %.6g)", ps.mach, ps.mach-1e-5, re, reF)
	}
	// The flight Mach number keeps a full match it gives itself.
	ps = sv.solve(mf, at(mf)/0.95, tFlight, true)
	if ps.class != FullMatch || ps.mach != mf {
		t.Errorf("flight Mach full match: %v at %g, want full match at %g", ps.class, ps.mach, mf)
	}
}

// TestRelaxedReMaxIsBest: max_reynolds_at_test_mach is the highest
// Reynolds number reachable at the test Mach number, not the flight value
// reached. Second demo vehicle in the Kellen Fold cryogenic tunnel at its
// lowest Mach number, row 0 col 2: p0 is at its 4.5 bar maximum, so the
// highest is the top of the T0 sweep at that p0 (1.734e6, not the flight
// 1.538e6).
func TestRelaxedReMaxIsBest(t *testing.T) {
	for _, demo := range []func(testing.TB) (*Grid, []*Map){outDemoMaps, outSecondDemoMaps} {
		g, maps := demo(t)
		for _, m := range maps {
			if m.Facility.Medium == MediumWater {
				continue
			}
			for i := 0; i < g.Rows(); i++ {
				for j := 0; j < g.Cols(); j++ {
					if m.At(i, j).Class != MachRelaxed {
						continue
					}
					d, _ := m.Detail(i, j)
					if want := bestRe(m, d.Mach); relErr(d.ReMax, want) > solveTol || d.ReMax < d.Re*(1-solveTol) {
						t.Fatalf("%s (%d, %d): ReMax %.7g, want the best at test Mach %g, %.7g (model Re %.7g)",
							m.Facility.Name, i, j, d.ReMax, d.Mach, want, d.Re)
					}
				}
			}
		}
	}
	_, maps := outSecondDemoMaps(t)
	m := facilityNamed(t, maps, "Kellen Fold")
	d, _ := m.Detail(0, 2)
	if d.Class != MachRelaxed || d.Mach != m.Facility.Gas.MachMin || relErr(d.ReMax, d.ReSweepMax) > solveTol || !(d.ReMax > 1.1*d.Re) {
		t.Errorf("Kellen Fold (0, 2): %v at Mach %g, ReMax %.7g, sweep max %.7g, model Re %.7g; want ReMax = sweep max above Re",
			d.Class, d.Mach, d.ReMax, d.ReSweepMax, d.Re)
	}
}

// TestPressureSideLimitUnderReCap: where the unit-Reynolds cap cuts the
// best setting back, it does so by warming the gas at the highest usable
// p0, so the pressure side stays bounded by what bounds that p0 (here q
// max) and the cap bounds the temperature side; only when T0 reaches its
// maximum does the cap bound p0. Demo: Kellen Fold cryogenic tunnel (q max
// 120 kPa, 250e6 /m), Mach 0.75, rows 17–23 of the first demo vehicle,
// without the demo's balance (which would bound p0 below q max there).
func TestPressureSideLimitUnderReCap(t *testing.T) {
	g, maps := outDemoMapsNoLoads(t)
	m := facilityNamed(t, maps, "Kellen Fold")
	n := 0
	for i := 17; i <= 23; i++ {
		for j := 0; j < g.Cols(); j++ {
			if g.Speeds[j] != 0.75 || !g.Inside(i, j) {
				continue
			}
			n++
			d, _ := m.Detail(i, j)
			if d.PressureLimit != LimitQMax || d.TemperatureLimit != LimitRePerM ||
				relErr(d.Q, m.Facility.QMax) > solveTol || !(d.RePerM <= m.Facility.MaxReynoldsPerM*(1+solveTol)) {
				t.Errorf("row %d: pressure side %v, temperature side %v, q %.6g Pa, Re/m %.4g; want q max and the unit Reynolds limit",
					i, d.PressureLimit, d.TemperatureLimit, d.Q, d.RePerM)
			}
		}
	}
	if n != 7 {
		t.Fatalf("%d points at Mach 0.75 in rows 17–23, want 7", n)
	}
	// Hand cases on one facility: a cap that T0 can meet, and one so low
	// that T0 reaches its maximum and p0 must come down.
	f := Facility{Name: "cap", Medium: "air",
		Gas:  GasLimits{MachMin: 0.3, MachMax: 0.9, P0Min: 1e4, P0Max: 4e5, T0Min: 280, T0Max: 320},
		QMax: 5e4, Width: 2, Height: 2}
	for _, c := range []struct {
		cap        float64
		pLim, tLim Limit
	}{{0, LimitQMax, LimitT0Min}, {0.9, LimitQMax, LimitRePerM}, {0.5, LimitRePerM, LimitT0Max}} {
		sv := testSolver(t, f, testSettings(), 0.3)
		b := sv.bounds(0.7)
		top, _ := sv.best(&b)
		re := top.re
		f2 := f
		f2.MaxReynoldsPerM = c.cap * re / 0.3
		sv = testSolver(t, f2, testSettings(), 0.3)
		b = sv.bounds(0.7)
		top, ok := sv.best(&b)
		p0, t0, pl, tl := top.p0, top.t0, top.lim.p, top.lim.t
		if !ok || pl != c.pLim || tl != c.tLim {
			t.Errorf("cap %g of the uncapped best: p0 %.6g T0 %.5g limits %v / %v, want %v / %v",
				c.cap, p0, t0, pl, tl, c.pLim, c.tLim)
		}
	}
}

// TestWaterAtSectionPressure: water properties are taken at the
// test-section static pressure, not at one atmosphere. IAPWS R7-97(2012)
// (IAPWS-IF97), Table 5, region 1 verification values: v = 0.100215168e-2
// m³/kg at 300 K and 3 MPa, 0.971180894e-3 m³/kg at 300 K and 80 MPa (at
// 1 atm water at 300 K is lighter by 0.13 % and 3.5 %).
func TestWaterAtSectionPressure(t *testing.T) {
	for _, c := range []struct{ p, v float64 }{{3e6, 0.100215168e-2}, {80e6, 0.971180894e-3}} {
		f := Facility{Name: "pressurised water", Medium: MediumWater,
			Water: WaterLimits{SpeedMin: 0.5, SpeedMax: 20, PMin: c.p, PMax: c.p, TMin: 300, TMax: 300},
			Width: 1, Height: 1}
		s := testSettings()
		s.Scale = 0.1
		g, err := NewGrid(onePointVehicle(3000, 0.1, 2), s)
		if err != nil {
			t.Fatal(err)
		}
		m, err := Solve(g, &f, s)
		if err != nil {
			t.Fatal(err)
		}
		d, err := m.Detail(0, 0)
		if err != nil || !d.HasSettings {
			t.Fatalf("p %g Pa: detail %+v, %v", c.p, d, err)
		}
		// Nine printed figures (IF97 Table 5).
		if got := 1 / d.Density; relErr(got, c.v) > 1e-8 {
			t.Errorf("p %g Pa: water specific volume %.9e m³/kg, want %.9e (IF97 Table 5)", c.p, got, c.v)
		}
		if d.P != c.p {
			t.Errorf("p %g Pa: test-section static pressure %g", c.p, d.P)
		}
	}
	// The demo water tunnel at its 2.5 bar static pressure: density and
	// viscosity are those of IF97 at 2.5 bar, which differ from 1 atm.
	_, maps := outDemoMaps(t)
	m := facilityNamed(t, maps, "Wenlow")
	g := m.Grid
	checked := 0
	for i := 0; i < g.Rows() && checked < 5; i++ {
		for j := 0; j < g.Cols() && checked < 5; j++ {
			d, _ := m.Detail(i, j)
			if !d.Flight.Inside || !d.HasSettings {
				continue
			}
			checked++
			at, err := atmos.WaterAtPressure(d.T0, d.P)
			if err != nil {
				t.Fatal(err)
			}
			atm, _ := atmos.WaterAt(d.T0)
			if d.P != 2.5e5 || d.Density != at.Density || d.Viscosity != at.Viscosity || !(d.Density/atm.Density-1 > 5e-5) {
				t.Errorf("Wenlow (%d, %d): p %g, ρ %.8g, μ %.8g; want IF97 at 2.5 bar ρ %.8g, μ %.8g (1 atm: %.8g)",
					i, j, d.P, d.Density, d.Viscosity, at.Density, at.Viscosity, atm.Density)
			}
		}
	}
	if checked == 0 {
		t.Fatal("no Wenlow point with settings")
	}
}

// TestNearestReachingIsNearestOfAll: the search tries the Mach samples
// nearest first and stops at the first that reaches; that must be the
// sample a scan of all of them picks (the least distance from m0, at equal
// distances the lower Mach number), with and without the bounds made
// beforehand. Every demo gas facility over the relaxed range and a band,
// at starting Mach numbers across the range (ends, samples, midpoints
// and points exactly between two samples) and targets from below the
// lowest to above the highest reachable Reynolds number.
func TestNearestReachingIsNearestOfAll(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for k := range facs {
		if facs[k].Medium == MediumWater {
			continue
		}
		m, err := Solve(g, &facs[k], s)
		if err != nil {
			t.Fatal(err)
		}
		sv := m.sv.(*gasSolver)
		ranges := [][2]float64{{sv.lim.MachMin, math.Min(sv.lim.MachMax, sv.compMach)},
			{sv.lim.MachMin, sv.lim.MachMin + 0.0137}, {sv.lim.MachMin, sv.lim.MachMax}}
		for _, r := range ranges {
			lo, hi := r[0], r[1]
			if !(hi > lo) {
				continue
			}
			pre := sv.sampleRange(lo, hi)
			top, ok := sv.maxOver(lo, hi)
			if !ok {
				continue
			}
			for _, frac := range []float64{0, 0.001, 0.25, 0.5, 0.618, 0.99, 1} {
				for _, tf := range []float64{0.05, 0.3, 0.7, 0.95, 1, 1.2} {
					target := tf * top.re
					for _, m0 := range []float64{lo + frac*(hi-lo), 0.5 * (pre.ms[len(pre.ms)/2] + pre.ms[len(pre.ms)/2-1])} {
						// The whole scan, ascending, keeping the first of
						// the least distance.
						want, wantD := math.NaN(), math.Inf(1)
						for _, M := range pre.ms {
							b := sv.bounds(M)
							if _, yes := sv.tryHit(&b, target); yes {
								if d := math.Abs(M - m0); d < wantD {
									want, wantD = M, d
								}
							}
						}
						for _, bs := range [][]gasBounds{nil, pre.b} {
							got := sv.nearestReaching(pre.ms, bs, m0, target)
							if !(got == want || math.IsNaN(got) && math.IsNaN(want)) {
								t.Errorf("%s range %g–%g m0 %g target %g: nearest %v, whole scan %v",
									facs[k].Name, lo, hi, m0, target, got, want)
							}
						}
						checked++
					}
				}
			}
		}
	}
	if checked < 100 {
		t.Fatalf("only %d cases checked", checked)
	}
}
