package atmos

import (
	"math"
	"testing"
)

// FuzzParseQuantity checks that no input panics and that every accepted value
// is finite and respects the sign rules of its dimension.
func FuzzParseQuantity(f *testing.F) {
	seeds := []struct {
		s string
		d int
	}{
		{"35000 ft", int(Length)}, {"11km", int(Length)}, {"250 kt", int(Speed)},
		{"0.8", int(Dimensionless)}, {"3 bar", int(Pressure)}, {"45 psi", int(Pressure)},
		{"-56.5 °C", int(Temperature)}, {"-69.7 degF", int(Temperature)},
		{"15 K", int(TemperatureDelta)}, {"2 m²", int(Area)}, {"1.225 kg/m3", int(Density)},
		{"NaN m", int(Length)}, {"1e999 m", int(Length)}, {"−1e-400 K", int(Temperature)},
		{"35,000 ft", int(Length)}, {"10 mPa", int(Pressure)}, {"", 0}, {"1 m", 99},
		{"1.e5 ft", int(Length)}, {"1e+ ft", int(Length)}, {"- 5 m", int(Length)},
	}
	for _, sd := range seeds {
		f.Add(sd.s, sd.d)
	}
	f.Fuzz(func(t *testing.T, s string, d int) {
		dim := Dimension(d % (int(numDimensions) + 2))
		v, err := ParseQuantity(s, dim)
		if err != nil {
			if v != 0 {
				t.Errorf("ParseQuantity(%q, %v) = %g with error %v, want 0", s, dim, v, err)
			}
			return
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("ParseQuantity(%q, %v) = %g, want a finite value", s, dim, v)
		}
		switch dim {
		case Area, Speed, Pressure, Density, Temperature:
			if v < 0 {
				t.Errorf("ParseQuantity(%q, %v) = %g, want non-negative", s, dim, v)
			}
		}
		// Formatting an accepted value must not panic and must give text.
		if Format(v, dim, d%2 == 0) == "" {
			t.Errorf("Format(%g, %v) is empty", v, dim)
		}
	})
}

// FuzzParseAirspeed checks that no input panics and that accepted speeds are
// finite and non-negative with a known kind.
func FuzzParseAirspeed(f *testing.F) {
	for _, s := range []string{"M0.85", "Mach 2", "250 KCAS", "250 kt CAS", "130 m/s EAS", "900 km/h TAS", "M", "m/s", "250 kt", "M-1", "Mach Inf", "1e400 KTAS"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		k, v, err := ParseAirspeed(s)
		if err != nil {
			return
		}
		if k < Mach || k > CAS {
			t.Errorf("ParseAirspeed(%q) kind = %v, want Mach..CAS", s, k)
		}
		if !(v >= 0) || math.IsInf(v, 0) {
			t.Errorf("ParseAirspeed(%q) = %g, want finite and non-negative", s, v)
		}
	})
}

// FuzzParseSpeedKind checks that no input panics and that accepted names
// round-trip through String.
func FuzzParseSpeedKind(f *testing.F) {
	for _, s := range []string{"Mach", "tas", " EAS ", "cas", "ias", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		k, err := ParseSpeedKind(s)
		if err != nil {
			return
		}
		if back, err := ParseSpeedKind(k.String()); err != nil || back != k {
			t.Errorf("ParseSpeedKind(%q) = %v, which does not round-trip: %v, %v", s, k, back, err)
		}
	})
}
