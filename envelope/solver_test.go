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
