package envelope

import (
	"strings"
	"testing"

	"likewind/atmos"
)

// TestSolverByMedium: each medium gets its own solver, and a gas solver
// works with the gas atmos.GasByName gives for the facility's medium.
func TestSolverByMedium(t *testing.T) {
	for _, tc := range []struct {
		f   Facility
		gas string // "" for water
	}{
		{cryoTunnel(), "nitrogen"},
		{benchFacilities()[1], "air"},
		{waterTunnel(), ""},
	} {
		sv, err := newSolver(&tc.f, testSettings(), atmos.DefaultRegimes())
		if err != nil {
			t.Fatalf("%s: %v", tc.f.Name, err)
		}
		switch s := sv.(type) {
		case *gasSolver:
			want, _ := atmos.GasByName(tc.gas)
			if tc.gas == "" || s.gas.Name() != tc.gas || s.rgas != want.R() {
				t.Errorf("%s: gas solver for %q (R %g), want %q", tc.f.Name, s.gas.Name(), s.rgas, tc.gas)
			}
		case *waterSolver:
			if tc.gas != "" {
				t.Errorf("%s: water solver, want a gas solver for %s", tc.f.Name, tc.gas)
			}
		default:
			t.Errorf("%s: solver %T", tc.f.Name, sv)
		}
	}
}

// TestSolveUnknownMedium: a medium that is neither water nor a gas atmos
// knows is refused, with the media that are accepted.
func TestSolveUnknownMedium(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	f := cryoTunnel()
	f.Medium = "helium"
	_, err = Solve(g, &f, testSettings())
	if err == nil || !strings.Contains(err.Error(), `"air", "nitrogen" or "water"`) {
		t.Errorf("Solve with medium helium: %v, want an error naming the accepted media", err)
	}
}

// TestMediumNamed: the file's medium text names water or a gas by any of
// its atmos names, case aside; the gas is kept by its canonical name.
func TestMediumNamed(t *testing.T) {
	for in, want := range map[string]Medium{
		"air": "air", "AIR": "air", "nitrogen": "nitrogen", "N2": "nitrogen", "Water": MediumWater,
	} {
		if got, ok := mediumNamed(in); !ok || got != want {
			t.Errorf("mediumNamed(%q) = %q, %v; want %q", in, got, ok, want)
		}
	}
	for _, in := range []string{"", " air", "helium", "water "} {
		if got, ok := mediumNamed(in); ok {
			t.Errorf("mediumNamed(%q) = %q, want refused", in, got)
		}
	}
}

// TestFacilityRanges: the medium-neutral pressure and temperature limits
// (what the what-if editor changes) read and write the limits of the
// facility's own medium and leave the other medium's untouched.
func TestFacilityRanges(t *testing.T) {
	gas := cryoTunnel()
	if gas.PressureMin() != 1.2e5 || gas.PressureMax() != 4.5e5 || gas.TemperatureMin() != 90 || gas.TemperatureMax() != 320 {
		t.Errorf("gas ranges %g–%g Pa, %g–%g K; want the p0 and T0 ranges", gas.PressureMin(), gas.PressureMax(),
			gas.TemperatureMin(), gas.TemperatureMax())
	}
	gas.SetPressureMax(3e5)
	gas.SetTemperatureMin(100)
	if gas.Gas.P0Max != 3e5 || gas.Gas.T0Min != 100 || gas.Water != (WaterLimits{}) {
		t.Errorf("after setting: p0 max %g, T0 min %g, water limits %+v", gas.Gas.P0Max, gas.Gas.T0Min, gas.Water)
	}
	water := waterTunnel()
	if water.PressureMax() != 2e5 || water.TemperatureMin() != 283.15 || water.TemperatureMax() != 313.15 {
		t.Errorf("water ranges max %g Pa, %g–%g K; want the static pressure and water temperature",
			water.PressureMax(), water.TemperatureMin(), water.TemperatureMax())
	}
	water.SetPressureMax(2.5e5)
	water.SetTemperatureMin(288.15)
	if water.Water.PMax != 2.5e5 || water.Water.TMin != 288.15 || water.Gas != (GasLimits{}) {
		t.Errorf("after setting: static p max %g, T min %g, gas limits %+v", water.Water.PMax, water.Water.TMin, water.Gas)
	}
}

// TestWithinTol: the tolerance holds where the decimals say it does, with
// the rounding of binary floating point allowed for, and not beyond.
func TestWithinTol(t *testing.T) {
	for _, tc := range []struct {
		a, b, tol float64
		want      bool
	}{
		{0.82, 0.81, 0.01, true}, // 0.82 − 0.81 is 0.010000000000000009 in binary
		{1.21, 1.2, 0.01, true},
		{0.8, 0.8, 0, true},
		{0.82, 0.81, 0.0099, false},
		{0.8 + 1e-9, 0.8, 0, false},
	} {
		if got := withinTol(tc.a, tc.b, tc.tol); got != tc.want {
			t.Errorf("withinTol(%v, %v, %v) = %v, want %v", tc.a, tc.b, tc.tol, got, tc.want)
		}
	}
}

// TestReachableReAgreesWithDetail checks the Reynolds–Mach region of each
// gas facility against its solver: at a full-match point the achieved
// model Reynolds number lies inside the range at its test Mach number, and
// Map.ReachableRe gives a range at the sampled Mach numbers.
func TestReachableReAgreesWithDetail(t *testing.T) {
	_, maps := outDemoMaps(t)
	const tol = 1e-6 // relative, interpolation-free: the range is recomputed at the test Mach number
	checked := 0
	for _, m := range maps {
		if m.Facility.Medium == MediumWater {
			continue
		}
		g := m.Grid
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if m.At(i, j).Class != FullMatch {
					continue
				}
				d, err := m.Detail(i, j)
				if err != nil {
					t.Fatal(err)
				}
				sv := m.sv.(*gasSolver)
				c := sv.bounds(d.Mach)
				top, ok := sv.best(&c)
				hi := top.re
				lo := sv.reAt(&c, sv.lim.P0Min, sv.lim.T0Max)
				if !ok || d.Re > hi*(1+tol) || d.Re < lo*(1-tol) {
					t.Errorf("%s (%d,%d): Re %g outside drawn range %g–%g at Mach %g", m.Facility.Name, i, j, d.Re, lo, hi, d.Mach)
				}
				checked++
			}
		}
		if rr := m.ReachableRe(50); len(rr) == 0 {
			t.Errorf("%s: no reachable range although it has full matches", m.Facility.Name)
		} else {
			for _, r := range rr {
				if !(r.Lo >= 0 && r.Hi >= r.Lo && r.Hi > 0) {
					t.Errorf("%s: range %+v, want 0 <= lo <= hi, hi > 0", m.Facility.Name, r)
				}
			}
		}
	}
	if checked == 0 {
		t.Fatal("no full-match gas points in the demo")
	}
}
