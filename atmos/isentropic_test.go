package atmos

import (
	"math"
	"testing"
)

// Tolerances.
const (
	// halfUnit4 is half a unit in the fourth decimal place, the printing of
	// the four-decimal compressible-flow tables quoted below.
	halfUnit4 = 0.5e-4
	// halfUnit5 is half a unit in the fifth decimal place.
	halfUnit5 = 0.5e-5
	// inverseRoundTripTol is the relative tolerance of inverse round trips.
	inverseRoundTripTol = 1e-12
)

func mediaRelErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// TestIsentropicTables checks the isentropic ratios for gamma = 1.4 against
// printed tables. Each row carries its source and the absolute tolerance
// that matches the printed digits.
func TestIsentropicTables(t *testing.T) {
	tests := []struct {
		M              float64
		p, rho, T, tol float64
		source         string
	}{
		// Compressible-flow table for k = 1.4 (fluid-mechanics textbook
		// appendix, Table A.1 "Compressible Flow Tables for an Ideal Gas
		// with k = 1.4"), same values as NACA Report 1135, Table I.
		{0.5, 0.8430, 0.8852, 0.9524, halfUnit4, "k = 1.4 table A.1"},
		{0.9, 0.5913, 0.6870, 0.8606, halfUnit4, "k = 1.4 table A.1"},
		// Aeronautical Engineer's Data Book, Table A4.2 (gamma = 7/5).
		{1.0, 0.5283, 0.6339, 0.8333, halfUnit4, "Aeronautical Engineer's Data Book, Table A4.2"},
		// NACA Report 1135, Table I, five significant figures (from memory).
		{2.0, 0.12780, 0.23005, 0.55556, halfUnit5, "NACA 1135 Table I (from memory)"},
		{3.0, 0.027224, 0.076226, 0.35714, halfUnit5, "NACA 1135 Table I (from memory)"},
		{5.0, 0.0018900, 0.011340, 0.16667, halfUnit5, "NACA 1135 Table I (from memory)"},
	}
	for _, tc := range tests {
		if got := PressureRatio(tc.M, 1.4); math.Abs(got-tc.p) > tc.tol {
			t.Errorf("PressureRatio(%v, 1.4) = %.6f, want %v (%s)", tc.M, got, tc.p, tc.source)
		}
		if got := DensityRatio(tc.M, 1.4); math.Abs(got-tc.rho) > tc.tol {
			t.Errorf("DensityRatio(%v, 1.4) = %.6f, want %v (%s)", tc.M, got, tc.rho, tc.source)
		}
		if got := TemperatureRatio(tc.M, 1.4); math.Abs(got-tc.T) > tc.tol {
			t.Errorf("TemperatureRatio(%v, 1.4) = %.6f, want %v (%s)", tc.M, got, tc.T, tc.source)
		}
	}
}

// TestAreaRatioTable checks A/A* for gamma = 1.4.
func TestAreaRatioTable(t *testing.T) {
	tests := []struct {
		M, want, tol float64
	}{
		{0.5, 1.3398, halfUnit4}, // k = 1.4 table A.1
		{0.9, 1.0089, halfUnit4}, // k = 1.4 table A.1
		{1.0, 1.0000, halfUnit4}, // Aeronautical Engineer's Data Book, Table A4.2
		{2.0, 1.6875, halfUnit4}, // NACA 1135 Table I (from memory)
		{3.0, 4.2346, halfUnit4}, // NACA 1135 Table I (from memory)
		{5.0, 25.000, 0.5e-3},    // NACA 1135 Table I (from memory)
	}
	for _, tc := range tests {
		if got := AreaRatio(tc.M, 1.4); math.Abs(got-tc.want) > tc.tol {
			t.Errorf("AreaRatio(%v, 1.4) = %.6f, want %v", tc.M, got, tc.want)
		}
	}
}

// TestNormalShockTable checks the normal-shock jump and the Rayleigh pitot
// ratio for gamma = 1.4 against NACA Report 1135, Table II (values from
// memory, printed to five significant figures; p1/pt2 is the table's
// inverse pitot ratio).
func TestNormalShockTable(t *testing.T) {
	tests := []struct {
		M1                         float64
		p21, rho21, T21, pt21, ppt float64
		M2                         float64
	}{
		{1.5, 2.4583, 1.8621, 1.3202, 0.92978, 0.29297, 0.70109},
		{2.0, 4.5000, 2.6667, 1.6875, 0.72087, 0.17729, 0.57735},
		{3.0, 10.333, 3.8571, 2.6790, 0.32834, 0.082912, 0.47519},
		{5.0, 29.000, 5.0000, 5.8000, 0.061716, 0.030625, 0.41523},
	}
	// fiveFig is the relative half-unit of a five-significant-figure entry.
	const fiveFig = 0.5e-4
	for _, tc := range tests {
		ns, err := NormalShockAt(tc.M1, 1.4)
		if err != nil {
			t.Fatalf("NormalShockAt(%v, 1.4): %v", tc.M1, err)
		}
		check := func(name string, got, want float64) {
			t.Helper()
			if mediaRelErr(got, want) > fiveFig {
				t.Errorf("NormalShockAt(%v, 1.4).%s = %.6g, want %v", tc.M1, name, got, want)
			}
		}
		check("PressureRatio", ns.PressureRatio, tc.p21)
		check("DensityRatio", ns.DensityRatio, tc.rho21)
		check("TemperatureRatio", ns.TemperatureRatio, tc.T21)
		check("TotalPressureRatio", ns.TotalPressureRatio, tc.pt21)
		check("M2", ns.M2, tc.M2)
		check("1/PitotRatio", 1/ns.PitotRatio, tc.ppt)
		if got := 1 / PitotRatio(tc.M1, 1.4); mediaRelErr(got, tc.ppt) > fiveFig {
			t.Errorf("1/PitotRatio(%v, 1.4) = %.6g, want %v", tc.M1, got, tc.ppt)
		}
	}
}

// TestPitotRatioBranchesMeet checks that the subsonic isentropic and the
// supersonic Rayleigh branches agree at Mach 1 for several gammas.
func TestPitotRatioBranchesMeet(t *testing.T) {
	for _, g := range []float64{1.1, 1.3, 1.4, 5.0 / 3} {
		below := PitotRatio(math.Nextafter(1, 0), g)
		at := PitotRatio(1, g)
		if mediaRelErr(below, at) > 1e-12 || mediaRelErr(at, SonicPitotRatio(g)) > 1e-14 {
			t.Errorf("PitotRatio near M = 1, gamma %v: below %v, at %v, sonic %v", g, below, at, SonicPitotRatio(g))
		}
	}
	// ((g+1)/2)^(g/(g-1)) = 1.2^3.5 = 1.89293 for g = 1.4 (NACA 1135 Table I,
	// p/pt = 0.52828 at M = 1, from memory).
	if got := 1 / SonicPitotRatio(1.4); math.Abs(got-0.52828) > halfUnit5 {
		t.Errorf("1/SonicPitotRatio(1.4) = %v, want 0.52828", got)
	}
}

var testGammas = []float64{1.1, 1.3, 1.4, 5.0 / 3}

func machSweep() []float64 {
	var ms []float64
	for M := 0.1; M <= 20; M *= 1.07 {
		ms = append(ms, M)
	}
	return append(ms, 1, 20)
}

func TestInverseRoundTrips(t *testing.T) {
	for _, g := range testGammas {
		for _, M := range machSweep() {
			inv := []struct {
				name string
				r    float64
				f    func(float64, float64) (float64, error)
			}{
				{"MachFromTemperatureRatio", TemperatureRatio(M, g), MachFromTemperatureRatio},
				{"MachFromPressureRatio", PressureRatio(M, g), MachFromPressureRatio},
				{"MachFromDensityRatio", DensityRatio(M, g), MachFromDensityRatio},
				{"MachFromPitotRatio", PitotRatio(M, g), MachFromPitotRatio},
			}
			for _, c := range inv {
				got, err := c.f(c.r, g)
				if err != nil {
					t.Errorf("%s(%v, %v): %v", c.name, c.r, g, err)
					continue
				}
				if mediaRelErr(got, M) > inverseRoundTripTol {
					t.Errorf("%s(ratio at M %v, %v) = %.15g, want %.15g", c.name, M, g, got, M)
				}
			}
			ar := AreaRatio(M, g)
			got, err := MachFromAreaRatio(ar, g, M > 1)
			if err != nil || mediaRelErr(got, M) > inverseRoundTripTol {
				t.Errorf("MachFromAreaRatio(%v, %v, %v) = %.15g, %v, want %.15g", ar, g, M > 1, got, err, M)
			}
		}
	}
}

// TestRatioRoundTrips runs the other direction, ratio -> Mach -> ratio.
func TestRatioRoundTrips(t *testing.T) {
	for _, g := range testGammas {
		for r := 1e-6; r < 1; r *= 1.3 {
			M, err := MachFromPressureRatio(r, g)
			if err != nil || mediaRelErr(PressureRatio(M, g), r) > inverseRoundTripTol {
				t.Errorf("PressureRatio(MachFromPressureRatio(%v, %v)) = %v (%v), want %v", r, g, PressureRatio(M, g), err, r)
			}
			M, err = MachFromTemperatureRatio(r, g)
			if err != nil || mediaRelErr(TemperatureRatio(M, g), r) > inverseRoundTripTol {
				t.Errorf("TemperatureRatio(MachFromTemperatureRatio(%v, %v)) = %v (%v), want %v", r, g, TemperatureRatio(M, g), err, r)
			}
		}
		for r := 1.0; r < 1e6; r *= 1.3 {
			M, err := MachFromPitotRatio(r, g)
			if err != nil || mediaRelErr(PitotRatio(M, g), r) > inverseRoundTripTol {
				t.Errorf("PitotRatio(MachFromPitotRatio(%v, %v)) = %v (%v), want %v", r, g, PitotRatio(M, g), err, r)
			}
		}
	}
}

func TestIsentropicInvalidInput(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	badGammas := []float64{1, 0.9, 0, -1.4, nan, inf}
	for _, g := range badGammas {
		if _, err := MachFromPressureRatio(0.5, g); err == nil {
			t.Errorf("MachFromPressureRatio(0.5, %v): no error", g)
		}
		if _, err := MachFromTemperatureRatio(0.5, g); err == nil {
			t.Errorf("MachFromTemperatureRatio(0.5, %v): no error", g)
		}
		if _, err := MachFromDensityRatio(0.5, g); err == nil {
			t.Errorf("MachFromDensityRatio(0.5, %v): no error", g)
		}
		if _, err := MachFromPitotRatio(2, g); err == nil {
			t.Errorf("MachFromPitotRatio(2, %v): no error", g)
		}
		if _, err := MachFromAreaRatio(2, g, true); err == nil {
			t.Errorf("MachFromAreaRatio(2, %v): no error", g)
		}
		if _, err := NormalShockAt(2, g); err == nil {
			t.Errorf("NormalShockAt(2, %v): no error", g)
		}
		if v := PressureRatio(1, g); !math.IsNaN(v) {
			t.Errorf("PressureRatio(1, %v) = %v, want NaN", g, v)
		}
	}
	for _, r := range []float64{0, -0.1, 1.0000001, nan, inf, -inf} {
		if _, err := MachFromPressureRatio(r, 1.4); err == nil {
			t.Errorf("MachFromPressureRatio(%v, 1.4): no error", r)
		}
		if _, err := MachFromTemperatureRatio(r, 1.4); err == nil {
			t.Errorf("MachFromTemperatureRatio(%v, 1.4): no error", r)
		}
		if _, err := MachFromDensityRatio(r, 1.4); err == nil {
			t.Errorf("MachFromDensityRatio(%v, 1.4): no error", r)
		}
	}
	for _, r := range []float64{0.999, 0, -2, nan, inf} {
		if _, err := MachFromPitotRatio(r, 1.4); err == nil {
			t.Errorf("MachFromPitotRatio(%v, 1.4): no error", r)
		}
		if _, err := MachFromAreaRatio(r, 1.4, false); err == nil {
			t.Errorf("MachFromAreaRatio(%v, 1.4): no error", r)
		}
	}
	for _, M := range []float64{0.99, -1, nan, inf} {
		if _, err := NormalShockAt(M, 1.4); err == nil {
			t.Errorf("NormalShockAt(%v, 1.4): no error", M)
		}
	}
	for _, M := range []float64{-0.1, nan, inf} {
		if v := TemperatureRatio(M, 1.4); !math.IsNaN(v) {
			t.Errorf("TemperatureRatio(%v, 1.4) = %v, want NaN", M, v)
		}
		if v := PitotRatio(M, 1.4); !math.IsNaN(v) {
			t.Errorf("PitotRatio(%v, 1.4) = %v, want NaN", M, v)
		}
	}
	// Limits that are valid: M = 0 and ratio 1.
	if M, err := MachFromPressureRatio(1, 1.4); err != nil || M != 0 {
		t.Errorf("MachFromPressureRatio(1, 1.4) = %v, %v, want 0", M, err)
	}
	if M, err := MachFromPitotRatio(1, 1.4); err != nil || M != 0 {
		t.Errorf("MachFromPitotRatio(1, 1.4) = %v, %v, want 0", M, err)
	}
}

func BenchmarkMachFromPitotRatio(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		_, _ = MachFromPitotRatio(2+float64(i%100), 1.4)
	}
}

func BenchmarkPressureRatio(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		_ = PressureRatio(float64(i%50)*0.1, 1.4)
	}
}

// TestMassFlowParameter checks the mass flow per unit area against the
// closed form of NACA Report 1135 worked by hand, and against continuity
// with the area ratio.
func TestMassFlowParameter(t *testing.T) {
	const tol = 1e-4 // relative; the hand values carry five figures
	// Hand calculation, NACA Report 1135 isentropic relations, γ = 1.4, R =
	// 287.05 J/(kg·K) (U.S. Standard Atmosphere 1976: 287.053): √(1.4/287.05) = 0.069837; (2/2.4)^3 = 0.578704;
	// product 0.040415 s·K^0.5/m, the usual "0.0404" for choked air.
	if got := MassFlowParameter(1, 1.4, 287.05); mediaRelErr(got, 0.040415) > tol {
		t.Errorf("MassFlowParameter(1, air) = %.6f, want 0.040415 (NACA 1135, by hand)", got)
	}
	// Hand calculation at M = 2: 0.069837 · 2 · 1.8^−3 = 0.023950.
	if got := MassFlowParameter(2, 1.4, 287.05); mediaRelErr(got, 0.023950) > tol {
		t.Errorf("MassFlowParameter(2, air) = %.6f, want 0.023950 (NACA 1135, by hand)", got)
	}
	// Nitrogen, γ = 1.4, R = 8.314462618/0.0280134 = 296.80 J/(kg·K) (molar
	// gas constant: CODATA 2018, exact; N2 molar mass 28.0134 g/mol from
	// the IUPAC standard atomic weight of nitrogen, from memory):
	// √(1.4/296.80) · 0.578704 = 0.039745 (by hand).
	if got := MassFlowParameter(1, 1.4, 296.80); mediaRelErr(got, 0.039745) > tol {
		t.Errorf("MassFlowParameter(1, nitrogen) = %.6f, want 0.039745 (by hand)", got)
	}
	// Continuity: the same mass flow passes the throat and the section, so
	// the parameter at M times A/A*(M) is the sonic one (NACA 1135).
	sonic := MassFlowParameter(1, 1.4, RAir)
	for _, M := range []float64{0.2, 0.6, 1.5, 3, 4} {
		if got := MassFlowParameter(M, 1.4, RAir) * AreaRatio(M, 1.4); mediaRelErr(got, sonic) > inverseRoundTripTol {
			t.Errorf("MassFlowParameter(%v)·A/A* = %.15g, want the sonic %.15g", M, got, sonic)
		}
	}
	// A 0.01 m² throat at 10 bar and 288.15 K passes, by hand,
	// 1e6 · 0.01 / 16.9750 · 0.040415 = 23.808 kg/s.
	if got := ChokedMassFlow(10e5, 288.15, 0.01, 1.4, 287.05); mediaRelErr(got, 23.808) > tol {
		t.Errorf("ChokedMassFlow = %.4f kg/s, want 23.808 (by hand)", got)
	}
	for _, bad := range [][3]float64{{-1, 1.4, 287}, {1, 1, 287}, {1, 1.4, 0}, {math.NaN(), 1.4, 287}} {
		if got := MassFlowParameter(bad[0], bad[1], bad[2]); !math.IsNaN(got) {
			t.Errorf("MassFlowParameter(%v) = %v, want NaN", bad, got)
		}
	}
	if got := ChokedMassFlow(1e5, 0, 1, 1.4, 287); !math.IsNaN(got) {
		t.Errorf("ChokedMassFlow at T0 = 0: %v, want NaN", got)
	}
}
