package atmos

import (
	"errors"
	"math"
	"testing"
)

// Tolerances used by the airspeed tests.
const (
	spdTolIdentity  = 1e-12 // relations that hold exactly in exact arithmetic
	spdTolRoundTrip = 1e-9  // conversion and back
	spdTolTable4    = 1e-4  // four-decimal published tables (relative)
)

func spdRelErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func spdState(t testing.TB, h float64) State {
	t.Helper()
	s, err := At(h)
	if err != nil {
		t.Fatalf("At(%g): %v", h, err)
	}
	return s
}

func spdStateDay(t testing.TB, h float64, k AltitudeKind, dT float64) State {
	t.Helper()
	s, err := AtDay(h, k, dT)
	if err != nil {
		t.Fatalf("AtDay(%g, %v, %g): %v", h, k, dT, err)
	}
	return s
}

// The pitot pressure ratio p_t/p = 1 + qc/p checked against published
// compressible-flow tables for γ = 1.4.
func TestImpactPressureTables(t *testing.T) {
	tests := []struct {
		M       float64
		pOverPt float64 // static over pitot pressure, as tabulated
		source  string
	}{
		// Munson, Young & Okiishi, Fundamentals of Fluid Mechanics, Table A.1
		// (compressible flow, k = 1.4), column p/p0.
		{0.50, 0.8430, "Munson et al., Table A.1, M 0.50"},
		{0.60, 0.7840, "Munson et al., Table A.1, M 0.60"},
		{0.90, 0.5913, "Munson et al., Table A.1, M 0.90"},
		// NACA Report 1135, Table II (normal shock), column p1/p02, i.e. the
		// Rayleigh pitot formula (values from memory).
		{1.50, 0.2930, "NACA Report 1135, Table II, M 1.50 (from memory)"},
		{2.00, 0.1773, "NACA Report 1135, Table II, M 2.00 (from memory)"},
		{3.00, 0.08291, "NACA Report 1135, Table II, M 3.00 (from memory)"},
	}
	const p = 1e4
	for _, tc := range tests {
		got := p / (p + ImpactPressure(tc.M, p))
		// The tables give four significant figures: allow half a unit in the last place.
		tol := 0.5e-4 / tc.pOverPt
		if tc.pOverPt < 0.1 {
			tol = 0.5e-5 / tc.pOverPt
		}
		if spdRelErr(got, tc.pOverPt) > tol {
			t.Errorf("p/(p+ImpactPressure(%g)) = %.5f, want %.5f (%s)", tc.M, got, tc.pOverPt, tc.source)
		}
	}
}

// The subsonic branch written with expm1 must equal p·(PitotRatio − 1).
func TestImpactPressureMatchesPitotRatio(t *testing.T) {
	const p = 54000.0
	for M := 0.05; M < 6; M += 0.05 {
		got := ImpactPressure(M, p)
		want := p * (PitotRatio(M, GammaAir) - 1)
		if spdRelErr(got, want) > spdTolIdentity {
			t.Errorf("ImpactPressure(%g, %g) = %.15g, want %.15g (p·(PitotRatio−1))", M, p, got, want)
		}
	}
}

// The subsonic and supersonic branches of the impact pressure meet at Mach 1:
// 1.2^3.5 − 1 = 0.892929 (isentropic p0/p at M 1, NACA Report 1135, Table I,
// p/p0 = 0.5283 at M 1.00, from memory).
func TestImpactPressureContinuousAtMach1(t *testing.T) {
	const p = SeaLevelPressure
	below := ImpactPressure(math.Nextafter(1, 0), p)
	at := ImpactPressure(1, p)
	if spdRelErr(below, at) > spdTolIdentity {
		t.Errorf("ImpactPressure(1−) = %.15g, ImpactPressure(1) = %.15g, want equal", below, at)
	}
	if got, want := p/(p+at), 0.5283; spdRelErr(got, want) > spdTolTable4 {
		t.Errorf("p/pt at M 1 = %.5f, want %.4f", got, want)
	}
}

func TestMachFromImpactPressureInverse(t *testing.T) {
	for _, p := range []float64{SeaLevelPressure, 22632, 120, 0.4} {
		for M := 0.0; M <= 25; M += 0.01 {
			qc := ImpactPressure(M, p)
			got, err := MachFromImpactPressure(qc, p)
			if err != nil {
				t.Fatalf("MachFromImpactPressure(%g, %g): %v", qc, p, err)
			}
			if math.Abs(got-M) > 10*MachInverseTolerance*math.Max(M, 1e-3) {
				t.Errorf("MachFromImpactPressure(ImpactPressure(%g), %g) = %.15g, want %g", M, p, got, M)
			}
		}
	}
}

// Cross-check of the two independent inverses of the pitot relation in the
// package (this file's Newton in ln M and the bracketed Newton of
// MachFromPitotRatio).
func TestMachFromImpactPressureAgreesWithPitotRatioInverse(t *testing.T) {
	for _, ratio := range []float64{1.0001, 1.5, 1.8929, 1.9, 3, 10, 100, 1e4} {
		mine, err := MachFromImpactPressure(ratio-1, 1)
		if err != nil {
			t.Fatal(err)
		}
		other, err := MachFromPitotRatio(ratio, GammaAir)
		if err != nil {
			t.Fatal(err)
		}
		if spdRelErr(mine, other) > 1e-11 {
			t.Errorf("MachFromImpactPressure(%g) = %.15g, MachFromPitotRatio = %.15g, want equal", ratio-1, mine, other)
		}
	}
}

func TestMachFromImpactPressureErrors(t *testing.T) {
	tests := []struct {
		qc, p float64
		want  error
	}{
		{-1, SeaLevelPressure, ErrInvalidSpeed},
		{math.NaN(), SeaLevelPressure, ErrInvalidSpeed},
		{math.Inf(1), SeaLevelPressure, ErrInvalidSpeed},
		{1000, 0, ErrInvalidState},
		{1000, -5, ErrInvalidState},
		{1000, math.NaN(), ErrInvalidState},
		{math.MaxFloat64, 1e-300, ErrInvalidSpeed},
	}
	for _, tc := range tests {
		M, err := MachFromImpactPressure(tc.qc, tc.p)
		if !errors.Is(err, tc.want) {
			t.Errorf("MachFromImpactPressure(%g, %g) = %g, %v; want error %v", tc.qc, tc.p, M, err, tc.want)
		}
	}
}

// On a standard sea-level day CAS = EAS = TAS at every Mach number, subsonic
// and supersonic: CAS and EAS are referred to standard sea-level air by
// definition (NACA Report 837, standard nomenclature for airspeeds; from memory).
func TestSeaLevelSpeedsAgree(t *testing.T) {
	s := spdState(t, 0)
	for _, M := range []float64{0.05, 0.3, 0.8, 0.99, 1, 1.01, 1.5, 2, 3.5, 6} {
		a, err := Speeds(Mach, M, s)
		if err != nil {
			t.Fatalf("Speeds(Mach, %g): %v", M, err)
		}
		if spdRelErr(a.CAS, a.TAS) > spdTolIdentity || spdRelErr(a.EAS, a.TAS) > spdTolIdentity {
			t.Errorf("sea level M %g: TAS %.12g, EAS %.12g, CAS %.12g m/s, want all equal", M, a.TAS, a.EAS, a.CAS)
		}
	}
}

// CAS at Mach 1 at standard sea level is a0 = 661.47 kt
// (a0 = 661.47 kt: "Calibrated airspeed", Wikipedia; 661.48 kt in other
// copies of the same article — both within 0.01 kt of the computed 661.479 kt).
func TestCASAtSonicSeaLevel(t *testing.T) {
	const tolKnots = 0.01
	s := spdState(t, 0)
	cas := CASFromMach(1, s)
	if spdRelErr(cas, SeaLevelSpeedOfSound) > spdTolIdentity {
		t.Errorf("CASFromMach(1, sea level) = %.15g m/s, want a0 = %.15g", cas, SeaLevelSpeedOfSound)
	}
	if got := cas / Knot; math.Abs(got-661.47) > tolKnots {
		t.Errorf("CASFromMach(1, sea level) = %.4f kt, want 661.47 kt", got)
	}
	M, err := MachFromCAS(SeaLevelSpeedOfSound, s)
	if err != nil || spdRelErr(M, 1) > spdTolIdentity {
		t.Errorf("MachFromCAS(a0, sea level) = %.15g, %v; want 1", M, err)
	}
}

// Published worked example: a flight-computer (CRP-5) exercise in an airline
// transport pilot navigation text — 250 kt CAS at FL400 with OAT −56.5 °C
// (ISA) gives 470 kt TAS after the compressibility correction. A graphical
// computer reads to a few knots and its compressibility correction is itself
// approximate (the example's uncorrected reading, 492 kt, is 2.4 % below
// CAS·√(ρ0/ρ) = 504 kt), so this is a coarse check at 1 %; the exact
// relations are held by the table and identity tests above. Flight levels are
// pressure altitudes on the geopotential scale (ICAO Doc 7488/3).
func TestCASToTASWorkedExample(t *testing.T) {
	const tolGraphical = 0.01
	s := spdStateDay(t, 40000*Foot, Geopotential, 0)
	if got := s.Temperature - 273.15; math.Abs(got+56.5) > 0.01 {
		t.Fatalf("FL400 OAT = %.2f °C, want −56.5 °C (ISA)", got)
	}
	a, err := Speeds(CAS, 250*Knot, s)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := a.TAS/Knot, 470.0; spdRelErr(got, want) > tolGraphical {
		t.Errorf("Speeds(CAS 250 kt, FL400).TAS = %.1f kt, want %.0f kt", got, want)
	}
	if !(a.EAS < a.CAS) {
		t.Errorf("FL400: EAS %.2f m/s not below CAS %.2f m/s", a.EAS, a.CAS)
	}
}

// Round trips over a sweep of altitude, temperature offset and speed,
// subsonic through hypersonic.
func TestAirspeedRoundTrips(t *testing.T) {
	type day struct {
		h, dT float64
	}
	days := []day{{0, 0}, {0, 25}, {-500, -20}, {3000, 10}, {11000, 0}, {15000, -15}, {25000, 0}, {50000, 0}, {80000, 0}}
	for _, d := range days {
		s := spdStateDay(t, d.h, Geometric, d.dT)
		for cas := 1.0; cas < 2000; cas *= 1.13 {
			M, err := MachFromCAS(cas, s)
			if err != nil {
				t.Fatalf("MachFromCAS(%g) at %g m: %v", cas, d.h, err)
			}
			tas := TASFromMach(M, s)
			back := CASFromMach(MachFromTAS(tas, s), s)
			if spdRelErr(back, cas) > spdTolRoundTrip {
				t.Errorf("h %g m ΔT %g: CAS %g → TAS %g → CAS %.12g, want %g", d.h, d.dT, cas, tas, back, cas)
			}
		}
		for eas := 1.0; eas < 2000; eas *= 1.13 {
			M := MachFromEAS(eas, s)
			back := EASFromMach(M, s)
			if spdRelErr(back, eas) > spdTolRoundTrip {
				t.Errorf("h %g m ΔT %g: EAS %g → Mach %g → EAS %.12g, want %g", d.h, d.dT, eas, M, back, eas)
			}
		}
		for M := 0.01; M < 30; M *= 1.2 {
			for _, k := range []SpeedKind{Mach, TAS, EAS, CAS} {
				a, err := Speeds(Mach, M, s)
				if err != nil {
					t.Fatal(err)
				}
				v := [...]float64{a.Mach, a.TAS, a.EAS, a.CAS}[k]
				b, err := Speeds(k, v, s)
				if err != nil {
					t.Fatalf("Speeds(%v, %g): %v", k, v, err)
				}
				if spdRelErr(b.Mach, M) > spdTolRoundTrip || spdRelErr(b.TAS, a.TAS) > spdTolRoundTrip ||
					spdRelErr(b.EAS, a.EAS) > spdTolRoundTrip || spdRelErr(b.CAS, a.CAS) > spdTolRoundTrip {
					t.Errorf("h %g: Speeds(%v, %g) = %+v, want %+v", d.h, k, v, b, a)
				}
			}
		}
	}
}

// EAS = TAS·√(ρ/ρ0) equals M·a0·√(p/p0) for a perfect gas (ρa² = γp).
func TestEASPressureForm(t *testing.T) {
	for _, h := range []float64{0, 5000, 11000, 30000} {
		for _, dT := range []float64{-20, 0, 20} {
			s := spdStateDay(t, h, Geometric, dT)
			got := EASFromMach(0.7, s)
			want := 0.7 * SeaLevelSpeedOfSound * math.Sqrt(s.Pressure/SeaLevelPressure)
			if spdRelErr(got, want) > 1e-9 {
				t.Errorf("EASFromMach(0.7, h %g, ΔT %g) = %.12g, want M·a0·√(p/p0) = %.12g", h, dT, got, want)
			}
		}
	}
}

// A hotter day at the same pressure altitude: same CAS and EAS for the same
// Mach (both depend on p only), higher TAS (a ∝ √T).
func TestHotDay(t *testing.T) {
	std := spdStateDay(t, 9000, PressureAlt, 0)
	hot := spdStateDay(t, 9000, PressureAlt, 20)
	a1, _ := Speeds(Mach, 0.75, std)
	a2, _ := Speeds(Mach, 0.75, hot)
	if spdRelErr(a1.CAS, a2.CAS) > 1e-12 || spdRelErr(a1.EAS, a2.EAS) > 1e-9 {
		t.Errorf("M 0.75 std vs ISA+20: CAS %g/%g EAS %g/%g, want equal", a1.CAS, a2.CAS, a1.EAS, a2.EAS)
	}
	wantRatio := math.Sqrt(hot.Temperature / std.Temperature)
	if spdRelErr(a2.TAS/a1.TAS, wantRatio) > 1e-12 {
		t.Errorf("TAS ratio ISA+20/ISA = %g, want √(T'/T) = %g", a2.TAS/a1.TAS, wantRatio)
	}
}

func TestSpeedsErrors(t *testing.T) {
	s := spdState(t, 1000)
	tests := []struct {
		name string
		kind SpeedKind
		v    float64
		s    State
		want error
	}{
		{"negative CAS", CAS, -1, s, ErrInvalidSpeed},
		{"NaN Mach", Mach, math.NaN(), s, ErrInvalidSpeed},
		{"Inf TAS", TAS, math.Inf(1), s, ErrInvalidSpeed},
		{"-Inf EAS", EAS, math.Inf(-1), s, ErrInvalidSpeed},
		{"zero state", TAS, 100, State{}, ErrInvalidState},
		{"huge TAS", TAS, math.MaxFloat64, s, ErrInvalidSpeed},
		{"unknown kind", SpeedKind(9), 1, s, nil},
	}
	for _, tc := range tests {
		a, err := Speeds(tc.kind, tc.v, tc.s)
		if err == nil {
			t.Errorf("%s: Speeds(%v, %g) = %+v, want error", tc.name, tc.kind, tc.v, a)
			continue
		}
		if tc.want != nil && !errors.Is(err, tc.want) {
			t.Errorf("%s: Speeds error %q, want %v", tc.name, err, tc.want)
		}
	}
	if _, err := MachFromCAS(-3, s); !errors.Is(err, ErrInvalidSpeed) {
		t.Errorf("MachFromCAS(-3) error = %v, want ErrInvalidSpeed", err)
	}
	if _, err := MachFromCAS(100, State{}); !errors.Is(err, ErrInvalidState) {
		t.Errorf("MachFromCAS(100, State{}) error = %v, want ErrInvalidState", err)
	}
}

// The unchecked forms return NaN for invalid input instead of a plausible number.
func TestUncheckedFormsFlagBadInput(t *testing.T) {
	s := spdState(t, 0)
	for name, v := range map[string]float64{
		"CASFromMach(-1)":      CASFromMach(-1, s),
		"EASFromMach(NaN)":     EASFromMach(math.NaN(), s),
		"TASFromMach(Inf)":     TASFromMach(math.Inf(1), s),
		"MachFromTAS(-1)":      MachFromTAS(-1, s),
		"MachFromEAS(State{})": MachFromEAS(100, State{}),
		"ImpactPressure(-1)":   ImpactPressure(-1, 1e5),
		"ImpactPressure(p=0)":  ImpactPressure(1, 0),
	} {
		if !math.IsNaN(v) {
			t.Errorf("%s = %g, want NaN", name, v)
		}
	}
}

func TestSpeedKindNames(t *testing.T) {
	for _, k := range []SpeedKind{Mach, TAS, EAS, CAS} {
		got, err := ParseSpeedKind(k.String())
		if err != nil || got != k {
			t.Errorf("ParseSpeedKind(%q) = %v, %v; want %v", k.String(), got, err, k)
		}
	}
	for in, want := range map[string]SpeedKind{" mach ": Mach, "M": Mach, "cas": CAS, "Tas": TAS, "eas": EAS} {
		if got, err := ParseSpeedKind(in); err != nil || got != want {
			t.Errorf("ParseSpeedKind(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	if _, err := ParseSpeedKind("IAS"); err == nil {
		t.Error("ParseSpeedKind(\"IAS\") succeeded, want error")
	}
	if got := SpeedKind(7).String(); got != "SpeedKind(7)" {
		t.Errorf("SpeedKind(7).String() = %q, want %q", got, "SpeedKind(7)")
	}
}

func TestSupersonicInverseAllocationFree(t *testing.T) {
	s := spdState(t, 12000)
	allocs := testing.AllocsPerRun(100, func() {
		_, _ = MachFromCAS(900, s)
	})
	if allocs != 0 {
		t.Errorf("MachFromCAS allocates %g times per call, want 0", allocs)
	}
}

func BenchmarkMachFromCASSubsonic(b *testing.B) {
	s := spdState(b, 10000)
	b.ReportAllocs()
	for b.Loop() {
		_, _ = MachFromCAS(150, s)
	}
}

func BenchmarkMachFromCASSupersonic(b *testing.B) {
	s := spdState(b, 10000)
	b.ReportAllocs()
	for b.Loop() {
		_, _ = MachFromCAS(700, s)
	}
}

func BenchmarkSpeeds(b *testing.B) {
	s := spdState(b, 10000)
	b.ReportAllocs()
	for b.Loop() {
		_, _ = Speeds(Mach, 2.2, s)
	}
}

// Airspeeds.Of picks the field of each kind (a definition, no outside
// reference needed).
func TestAirspeedsOf(t *testing.T) {
	a := Airspeeds{Mach: 0.8, TAS: 236, EAS: 129, CAS: 137}
	for _, c := range []struct {
		k    SpeedKind
		want float64
	}{{Mach, 0.8}, {TAS, 236}, {EAS, 129}, {CAS, 137}} {
		if got := a.Of(c.k); got != c.want {
			t.Errorf("Airspeeds.Of(%v) = %g, want %g", c.k, got, c.want)
		}
	}
}
