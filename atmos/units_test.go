package atmos

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// unitsTolExact is for conversions whose factors are exact by definition; it
// only absorbs floating-point rounding.
const unitsTolExact = 1e-12

func unitsRel(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func TestParseQuantity(t *testing.T) {
	tests := []struct {
		in   string
		d    Dimension
		want float64
		tol  float64
		src  string
	}{
		// Length; foot and inch exact (international yard and pound, 1959).
		{"35000 ft", Length, 10668, unitsTolExact, "1 ft = 0.3048 m exactly"},
		{"35000ft", Length, 10668, unitsTolExact, "no space"},
		{"35 kft", Length, 10668, unitsTolExact, "thousands of feet"},
		{"11 km", Length, 11000, unitsTolExact, "SI"},
		{"11km", Length, 11000, unitsTolExact, "SI"},
		{"  11 KM ", Length, 11000, unitsTolExact, "case ignored"},
		{"5 mm", Length, 0.005, unitsTolExact, "SI"},
		{"5 cm", Length, 0.05, unitsTolExact, "SI"},
		{"12 in", Length, 0.3048, unitsTolExact, "1 in = 0.0254 m exactly"},
		{"3 m", Length, 3, unitsTolExact, "SI"},
		{"-500 m", Length, -500, unitsTolExact, "below sea level"},
		{"−500 m", Length, -500, unitsTolExact, "U+2212 minus"},
		{"+3 metres", Length, 3, unitsTolExact, "spelled out"},
		{"1e3 m", Length, 1000, unitsTolExact, "exponent"},
		{"1.5E+3ft", Length, 457.2, unitsTolExact, "exponent"},
		{".5 m", Length, 0.5, unitsTolExact, "leading point"},
		{"1 nmi", Length, 1852, unitsTolExact, "1 nmi = 1852 m exactly"},
		{"1 mi", Length, 1609.344, unitsTolExact, "1 mi = 1609.344 m exactly"},
		// Area.
		{"2 m2", Area, 2, unitsTolExact, "SI"},
		{"2 m²", Area, 2, unitsTolExact, "superscript"},
		{"2 m^2", Area, 2, unitsTolExact, "caret"},
		{"10 ft2", Area, 0.9290304, unitsTolExact, "1 ft² = 0.09290304 m² exactly"},
		{"10 sq ft", Area, 0.9290304, unitsTolExact, "spelled"},
		{"144 in2", Area, 0.09290304, unitsTolExact, "144 in² = 1 ft²"},
		// Speed; 1 kt = 1852/3600 m/s exactly.
		{"250 kt", Speed, 250 * 1852.0 / 3600, unitsTolExact, "1 kt = 1852 m/h exactly"},
		{"250 KT", Speed, 250 * 1852.0 / 3600, unitsTolExact, "case"},
		{"250 Kt", Speed, 250 * 1852.0 / 3600, unitsTolExact, "case"},
		{"250kts", Speed, 250 * 1852.0 / 3600, unitsTolExact, "plural"},
		{"250 knots", Speed, 250 * 1852.0 / 3600, unitsTolExact, "spelled"},
		{"10 m/s", Speed, 10, unitsTolExact, "SI"},
		{"36 km/h", Speed, 10, unitsTolExact, "SI"},
		{"1 mph", Speed, 0.44704, unitsTolExact, "1 mph = 0.44704 m/s exactly"},
		{"100 ft/s", Speed, 30.48, unitsTolExact, "exact"},
		{"100 ft / s", Speed, 30.48, unitsTolExact, "spaced"},
		// Pressure.
		{"3 bar", Pressure, 3e5, unitsTolExact, "1 bar = 1e5 Pa exactly"},
		{"101.325 kPa", Pressure, 101325, unitsTolExact, "SI"},
		{"10 MPa", Pressure, 1e7, unitsTolExact, "SI"},
		{"1013.25 hPa", Pressure, 101325, unitsTolExact, "SI"},
		{"1013.25 mbar", Pressure, 101325, unitsTolExact, "1 mbar = 1 hPa"},
		{"1 atm", Pressure, 101325, unitsTolExact, "standard atmosphere, exact"},
		{"760 torr", Pressure, 101325, unitsTolExact, "1 torr = 101325/760 Pa exactly"},
		// NIST Special Publication 811 (2008), Appendix B.9 (from memory):
		// 1 psi = 6.894 757 E+03 Pa, 1 lbf/ft² = 4.788 026 E+01 Pa.
		{"45 psi", Pressure, 45 * 6894.757, 1e-7, "NIST SP 811, psi"},
		{"45 PSIA", Pressure, 45 * 6894.757, 1e-7, "NIST SP 811, psi"},
		{"1 psf", Pressure, 47.88026, 1e-7, "NIST SP 811, lbf/ft²"},
		// FAA Pilot's Handbook of Aeronautical Knowledge (2008), chapter on the
		// atmosphere: standard sea-level pressure is 2116 psf, 14.7 psi,
		// 29.92 inHg, 1013.2 mb. Tolerances are the rounding of the figures.
		{"2116 psf", Pressure, 101325, 0.5 / 2116, "FAA PHAK: 2116 psf"},
		{"14.7 psi", Pressure, 101325, 0.05 / 14.7, "FAA PHAK: 14.7 psi"},
		{"29.92 inHg", Pressure, 101325, 0.005 / 29.92, "FAA PHAK: 29.92 inHg"},
		{"1013.2 mb", Pressure, 101325, 0.05 / 1013.2, "FAA PHAK: 1013.2 mb"},
		// Temperature: ISA tropopause 216.65 K = −56.5 °C = −69.7 °F
		// (U.S. Standard Atmosphere 1976, Table 4; −69.70 °F in ISA tables in
		// feet).
		{"-56.5 degC", Temperature, 216.65, unitsTolExact, "USSA 1976 tropopause"},
		{"-56.5 °C", Temperature, 216.65, unitsTolExact, "degree sign"},
		{"-56.5°C", Temperature, 216.65, unitsTolExact, "no space"},
		{"-56.5 ℃", Temperature, 216.65, unitsTolExact, "U+2103"},
		{"-56.5 deg C", Temperature, 216.65, unitsTolExact, "spaced"},
		{"-56.5 C", Temperature, 216.65, unitsTolExact, "bare letter"},
		{"-69.7 degF", Temperature, 216.65, unitsTolExact, "ISA tables in feet"},
		{"-69.7 °F", Temperature, 216.65, unitsTolExact, "degree sign"},
		{"216.65 K", Temperature, 216.65, unitsTolExact, "SI"},
		{"59 degF", Temperature, 288.15, unitsTolExact, "sea level 15 °C = 59 °F"},
		{"518.67 degR", Temperature, 288.15, unitsTolExact, "sea level 518.67 °R"},
		{"0 K", Temperature, 0, unitsTolExact, "absolute zero allowed"},
		// Temperature offsets.
		{"15 K", TemperatureDelta, 15, unitsTolExact, "offset"},
		{"15 degC", TemperatureDelta, 15, unitsTolExact, "1 °C step = 1 K"},
		{"-15 °C", TemperatureDelta, -15, unitsTolExact, "cold day"},
		{"27 degF", TemperatureDelta, 15, unitsTolExact, "1 °F step = 5/9 K"},
		// Density; 1 slug/ft³ = 515.3788 kg/m³ (NIST SP 811, Appendix B.9, from memory).
		{"1.225 kg/m3", Density, 1.225, unitsTolExact, "SI"},
		{"1.225 kg/m³", Density, 1.225, unitsTolExact, "superscript"},
		{"1 slug/ft3", Density, 515.3788, 1e-7, "NIST SP 811, slug/ft³"},
		{"1 lb/ft3", Density, 16.01846, 1e-6, "NIST SP 811, lb/ft³"},
		// Force. The pound-force is exact by definition: the pound
		// (0.45359237 kg, international yard and pound, 1959) under standard
		// gravity (9.80665 m/s², 3rd CGPM 1901), 4.4482216152605 N; NIST
		// SP 811, Appendix B.8 (from memory) lists 1 lbf = 4.448 222 E+00 N.
		{"4500 N", Force, 4500, unitsTolExact, "SI"},
		{"4.5 kN", Force, 4500, unitsTolExact, "SI"},
		{"450 daN", Force, 4500, unitsTolExact, "1 daN = 10 N"},
		{"1 lbf", Force, 0.45359237 * 9.80665, unitsTolExact, "lbf by definition"},
		{"1 lbf", Force, 4.4482216152605, unitsTolExact, "lbf = 4.4482216152605 N exactly"},
		{"1000 lbf", Force, 4448.222, 0.5e-6 / 4.448222, "NIST SP 811 B.8 (from memory), 4.448 222 N"},
		{"2 pounds-force", Force, 2 * 4.4482216152605, unitsTolExact, "spelled"},
		// Moment: lbf·ft = 4.4482216152605 N × 0.3048 m and lbf·in =
		// 4.4482216152605 N × 0.0254 m exactly; NIST SP 811, Appendix B.8
		// (from memory): 1 lbf·ft = 1.355 818 E+00 N·m, 1 lbf·in = 1.129 848
		// E-01 N·m.
		{"600 N·m", Moment, 600, unitsTolExact, "SI, middle dot"},
		{"600 N⋅m", Moment, 600, unitsTolExact, "dot operator U+22C5"},
		{"600 N*m", Moment, 600, unitsTolExact, "asterisk"},
		{"600 N m", Moment, 600, unitsTolExact, "space"},
		{"600 Nm", Moment, 600, unitsTolExact, "run together"},
		{"600 N-m", Moment, 600, unitsTolExact, "hyphen"},
		{"0.6 kN·m", Moment, 600, unitsTolExact, "SI"},
		{"0.6 kNm", Moment, 600, unitsTolExact, "SI"},
		{"1 lbf·ft", Moment, 4.4482216152605 * 0.3048, unitsTolExact, "lbf·ft exactly"},
		{"1 ft·lbf", Moment, 1.3558179483314004, unitsTolExact, "ft·lbf the same"},
		{"1 lbf ft", Moment, 1.3558179483314004, unitsTolExact, "space"},
		{"1 ft-lbf", Moment, 1.3558179483314004, unitsTolExact, "hyphen"},
		{"1000 lbf·ft", Moment, 1355.818, 0.5e-6 / 1.355818, "NIST SP 811 B.8 (from memory), 1.355 818 N·m"},
		{"1 lbf·in", Moment, 4.4482216152605 * 0.0254, unitsTolExact, "lbf·in exactly"},
		{"12 in·lbf", Moment, 1.3558179483314004, unitsTolExact, "12 lbf·in = 1 lbf·ft"},
		{"1000 lbf in", Moment, 112.9848, 0.5e-6 / 1.129848, "NIST SP 811 B.8 (from memory), 0.112 984 8 N·m"},
		// Dimensionless.
		{"0.8", Dimensionless, 0.8, unitsTolExact, "Mach number"},
		{" 2.5e6 ", Dimensionless, 2.5e6, unitsTolExact, "Reynolds number"},
		{"-0.25", Dimensionless, -0.25, unitsTolExact, "signed ratio"},
	}
	for _, tc := range tests {
		got, err := ParseQuantity(tc.in, tc.d)
		if err != nil {
			t.Errorf("ParseQuantity(%q, %v): %v (%s)", tc.in, tc.d, err, tc.src)
			continue
		}
		if unitsRel(got, tc.want) > tc.tol {
			t.Errorf("ParseQuantity(%q, %v) = %.10g, want %.10g (%s)", tc.in, tc.d, got, tc.want, tc.src)
		}
	}
}

func TestParseQuantityErrors(t *testing.T) {
	tests := []struct {
		in   string
		d    Dimension
		want []string
		is   error
	}{
		{"35000", Length, []string{`"35000": missing length unit; accepted: m, km, mm, cm, in, ft, kft, mi, nmi`}, ErrMissingUnit},
		{"15", TemperatureDelta, []string{"missing temperature difference unit; accepted: K, degC, degF, degR"}, ErrMissingUnit},
		{"35000 fx", Length, []string{`unknown length unit "fx"; accepted: m, km`}, ErrUnknownUnit},
		{"3 bar", Length, []string{`"bar" is a pressure unit; expected a length (m, km, mm, cm, in, ft, kft, mi, nmi)`}, ErrWrongDimension},
		{"3 kt", Temperature, []string{`"kt" is a speed unit; expected a temperature (K, degC, degF, degR)`}, ErrWrongDimension},
		{"15 K", Pressure, []string{`"K" is a temperature unit; expected a pressure`}, ErrWrongDimension},
		{"0.8 m", Dimensionless, []string{`"m" is a length unit; expected a dimensionless number with no unit`}, ErrWrongDimension},
		{"0.8 foo", Dimensionless, []string{`unexpected unit "foo"; expected a dimensionless number with no unit`}, ErrUnknownUnit},
		{"", Speed, []string{`empty input; expected a speed such as "250 kt"`}, ErrNumber},
		{"   ", Pressure, []string{"empty input"}, ErrNumber},
		{"fast", Speed, []string{`"fast": no number; expected a speed such as "250 kt"`}, ErrNumber},
		{"NaN", Dimensionless, []string{"not a finite number"}, ErrNumber},
		{"NaN m", Length, []string{"not a finite number"}, ErrNumber},
		{"Inf ft", Length, []string{"not a finite number"}, ErrNumber},
		{"-inf K", Temperature, []string{"not a finite number"}, ErrNumber},
		{"+Infinity", Dimensionless, []string{"not a finite number"}, ErrNumber},
		{"1e999 m", Length, []string{"out of range"}, ErrOutOfRange},
		{"1e308 mi", Length, []string{"out of range"}, ErrOutOfRange},
		{"35,000 ft", Length, []string{"no thousands separators"}, ErrNumber},
		{"1.2.3 m", Length, []string{"malformed number"}, ErrNumber},
		{"0x1p3 m", Length, []string{`unknown length unit "x1p3m"`}, ErrUnknownUnit},
		{"10 mPa", Pressure, []string{`write "MPa"`}, ErrUnknownUnit},
		{"10 mpa", Pressure, []string{`write "MPa"`}, ErrUnknownUnit},
		{"30 psig", Pressure, []string{"gauge pressure unit; give absolute pressure"}, ErrUnknownUnit},
		{"-5 K", Temperature, []string{"below absolute zero"}, ErrOutOfRange},
		{"-300 degC", Temperature, []string{"below absolute zero"}, ErrOutOfRange},
		{"-3 m2", Area, []string{"area must not be negative"}, ErrOutOfRange},
		{"-3 kt", Speed, []string{"speed must not be negative"}, ErrOutOfRange},
		{"-1 psi", Pressure, []string{"must not be negative"}, ErrOutOfRange},
		{"1 m", Dimension(99), []string{"unknown dimension 99"}, nil},
		// A mass where a force is meant: kg is a mass unit since the
		// campaign data (coolant, storage) reads masses.
		{"5 kg", Force, []string{`"kg" is a mass unit; expected a force (N, daN, kN, lbf)`}, ErrWrongDimension},
		{"5 kgf", Force, []string{`unknown force unit "kgf"; accepted: N, daN, kN, lbf`}, ErrUnknownUnit},
		{"15 min", Pressure, []string{`"min" is a time unit; expected a pressure`}, ErrWrongDimension},
		{"-5 kg/h", MassRate, []string{`mass flow must not be negative`}, ErrOutOfRange},
		{"5 kN", Moment, []string{`"kN" is a force unit; expected a moment (N·m, kN·m, lbf·ft, lbf·in)`}, ErrWrongDimension},
		{"5 N·m", Force, []string{`"N·m" is a moment unit; expected a force (N, daN, kN, lbf)`}, ErrWrongDimension},
		{"600", Moment, []string{`missing moment unit; accepted: N·m, kN·m, lbf·ft, lbf·in`}, ErrMissingUnit},
		// "NM" (nautical miles) is no hint of a newton metre.
		{"5 NM", Length, []string{`unknown length unit "NM"; accepted: m, km`}, ErrUnknownUnit},
	}
	for _, tc := range tests {
		got, err := ParseQuantity(tc.in, tc.d)
		if err == nil {
			t.Errorf("ParseQuantity(%q, %v) = %g, want error", tc.in, tc.d, got)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("ParseQuantity(%q, %v) error = %q, want it to contain %q", tc.in, tc.d, err, w)
			}
		}
		if tc.is != nil && !errors.Is(err, tc.is) {
			t.Errorf("ParseQuantity(%q, %v) error = %q, want errors.Is %v", tc.in, tc.d, err, tc.is)
		}
	}
}

// Every accepted unit converts to SI and back.
func TestUnitRoundTrip(t *testing.T) {
	for d := Dimension(0); d < numDimensions; d++ {
		units := UnitsFor(d)
		if d == Dimensionless {
			units = []string{""}
		}
		for _, u := range units {
			for _, v := range []float64{-40, 0.001, 1, 1234.5} {
				si, err := ToSI(v, u, d)
				if err != nil {
					t.Fatalf("ToSI(%g, %q, %v): %v", v, u, d, err)
				}
				back, err := FromSI(si, u, d)
				if err != nil {
					t.Fatalf("FromSI(%g, %q, %v): %v", si, u, d, err)
				}
				if math.Abs(back-v) > 1e-12*math.Max(1, math.Abs(v))*1e3 {
					t.Errorf("FromSI(ToSI(%g %s)) = %.15g, want %g", v, u, back, v)
				}
			}
		}
	}
	if _, err := ToSI(1, "", Length); !errors.Is(err, ErrMissingUnit) {
		t.Errorf("ToSI(1, \"\", Length) error = %v, want ErrMissingUnit", err)
	}
	if _, err := FromSI(1, "K", Dimension(-1)); err == nil {
		t.Error("FromSI with Dimension(-1) succeeded, want error")
	}
	u := UnitsFor(Length)
	u[0] = "changed"
	if UnitsFor(Length)[0] != "m" {
		t.Error("UnitsFor returned the shared table, want a copy")
	}
	if UnitsFor(Dimension(42)) != nil {
		t.Error("UnitsFor(42) != nil")
	}
}

func TestFormat(t *testing.T) {
	tests := []struct {
		v         float64
		d         Dimension
		customary bool
		want      string
	}{
		{10668, Length, true, "35000 ft"},
		{10668, Length, false, "10668 m"},
		{0.9290304, Area, true, "10 ft²"},
		{0.5, Area, false, "0.5 m²"},
		{250 * Knot, Speed, true, "250 kt"},
		{128.6, Speed, false, "128.6 m/s"},
		{101325, Pressure, true, "14.696 psi"},
		{22632.06, Pressure, false, "22.632 kPa"},
		{216.65, Temperature, true, "-69.7 °F"},
		{216.65, Temperature, false, "216.65 K"},
		{15, TemperatureDelta, true, "27 °F"},
		{15, TemperatureDelta, false, "15 K"},
		{1.225, Density, false, "1.225 kg/m³"},
		{515.3788184, Density, true, "1 slug/ft³"},
		{4500, Force, false, "4500 N"},
		{4.4482216152605 * 1000, Force, true, "1000 lbf"},
		{600, Moment, false, "600 N·m"},
		{1.3558179483314004 * 250, Moment, true, "250 lbf·ft"},
		{0.8, Dimensionless, true, "0.8"},
		{2.5e7, Dimensionless, false, "25000000"},
		{3, Dimension(77), false, "3"},
	}
	for _, tc := range tests {
		if got := Format(tc.v, tc.d, tc.customary); got != tc.want {
			t.Errorf("Format(%g, %v, %v) = %q, want %q", tc.v, tc.d, tc.customary, got, tc.want)
		}
	}
	if got, err := FormatIn(101325, Pressure, "psf"); err != nil || got != "2116.2 psf" {
		t.Errorf("FormatIn(101325, Pressure, psf) = %q, %v; want \"2116.2 psf\"", got, err)
	}
	if _, err := FormatIn(1, Pressure, "ft"); !errors.Is(err, ErrWrongDimension) {
		t.Errorf("FormatIn(1, Pressure, ft) error = %v, want ErrWrongDimension", err)
	}
}

func TestFormatNumber(t *testing.T) {
	tests := []struct {
		x    float64
		want string
	}{
		{0, "0"},
		{math.Copysign(0, -1), "0"},
		{1, "1"},
		{0.8, "0.8"},
		{123456, "123456"},
		{1.23456e9, "1.2346e+09"},
		{0.0012345, "0.0012345"},
		{1.2e-4, "1.2e-04"},
		{-56.5, "-56.5"},
		{6.6328e-8, "6.6328e-08"},
		{math.NaN(), "NaN"},
		{math.Inf(-1), "-Inf"},
	}
	for _, tc := range tests {
		if got := FormatNumber(tc.x); got != tc.want {
			t.Errorf("FormatNumber(%g) = %q, want %q", tc.x, got, tc.want)
		}
	}
}

func TestParseAirspeed(t *testing.T) {
	tests := []struct {
		in   string
		kind SpeedKind
		v    float64
	}{
		{"M0.85", Mach, 0.85},
		{"M 0.85", Mach, 0.85},
		{"m.5", Mach, 0.5},
		{"Mach 2", Mach, 2},
		{"0.85 M", Mach, 0.85},
		{"2.2 mach", Mach, 2.2},
		{"250 KCAS", CAS, 250 * Knot},
		{"250 kcas", CAS, 250 * Knot},
		{"300 KEAS", EAS, 300 * Knot},
		{"480 KTAS", TAS, 480 * Knot},
		{"250 kt CAS", CAS, 250 * Knot},
		{"130 m/s EAS", EAS, 130},
		{"900 km/h TAS", TAS, 250},
		{"900 km / h tas", TAS, 250},
	}
	for _, tc := range tests {
		k, v, err := ParseAirspeed(tc.in)
		if err != nil || k != tc.kind || unitsRel(v, tc.v) > unitsTolExact {
			t.Errorf("ParseAirspeed(%q) = %v, %g, %v; want %v, %g", tc.in, k, v, err, tc.kind, tc.v)
		}
	}
	bad := map[string]string{
		"250 kt":     "say which speed",
		"250 KIAS":   "say which speed",
		"250":        "say which speed",
		"fast":       "no number",
		"M-1":        "no number",
		"-5 kt TAS":  "must not be negative",
		"5 psi CAS":  `"psi" is a pressure unit; expected a speed`,
		"Mach NaN":   "no number",
		"M 1e999":    "out of range",
		"250 kt MAS": "say which speed",
	}
	for in, want := range bad {
		k, v, err := ParseAirspeed(in)
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("ParseAirspeed(%q) = %v, %g, %v; want error containing %q", in, k, v, err, want)
		}
	}
}

func TestDimensionString(t *testing.T) {
	if got := TemperatureDelta.String(); got != "temperature difference" {
		t.Errorf("TemperatureDelta.String() = %q", got)
	}
	if got := Moment.String(); got != "moment" {
		t.Errorf("Moment.String() = %q", got)
	}
	if got := Dimension(50).String(); got != "Dimension(50)" {
		t.Errorf("Dimension(50).String() = %q", got)
	}
}

func TestNoNegativeZero(t *testing.T) {
	for in, want := range map[string]string{
		"-0": "0", "-0.00 m/s": "0.00 m/s", "-0.0e+00": "0.0e+00", "-0.001": "-0.001", "-1.2e-05": "-1.2e-05",
		"-10": "-10", "0": "0", "-": "-", "-.": "-.", "-x": "-x", "-0 ft": "0 ft", "-0.0000": "0.0000",
	} {
		if got := NoNegativeZero(in); got != want {
			t.Errorf("NoNegativeZero(%q) = %q, want %q", in, got, want)
		}
	}
}
