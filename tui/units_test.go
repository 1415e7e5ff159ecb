package tui

import (
	"math"
	"strings"
	"testing"

	"likewind/envelope"
)

// Display conversions. Reference values: the foot (0.3048 m) and the
// nautical mile (1852 m) are exact by definition; the pound-force per
// square foot (47.880 26 Pa), per square inch (6894.757 Pa) and the slug
// per cubic foot (515.3788 kg/m³) are from NIST Special Publication 811
// (2008), Appendix B.8/B.9; the Fahrenheit relation t/°F = T/K·1.8 −
// 459.67 is the definition in the same publication. The sea-level values
// 101 325 Pa = 2116.2 lbf/ft² = 14.696 lbf/in², 288.15 K = 59 °F and
// 1.225 kg/m³ = 0.002377 slug/ft³ are the U.S. Standard Atmosphere 1976
// sea-level values in both unit systems.
func TestUnitsFormat(t *testing.T) {
	cases := []struct {
		name string
		got  string
		want string
	}{
		{"SI altitude", SI.Alt(11000), "11000 m"},
		{"customary altitude 10 000 m", Customary.Alt(10000), "32808 ft"},
		{"customary altitude 11 km", Customary.AltLabel(11000), "36089"},
		{"SI speed", SI.Speed(100), "100.0 m/s"},
		{"customary speed 1852/3600 m/s = 1 kt", Customary.Speed(1852.0 / 3600 * 250), "250.0 kt"},
		{"SI sea-level pressure", SI.Pressure(101325), "101.3 kPa"},
		{"SI low pressure in Pa", SI.Pressure(522.0), "522.0 Pa"},
		{"customary sea-level pressure", Customary.Pressure(101325), "2116 psf"},
		{"customary stagnation pressure", Customary.Stagnation(101325), "14.70 psi"},
		{"SI stagnation pressure", SI.Stagnation(3e5), "300.0 kPa"},
		{"SI temperature", SI.Temp(288.15), "288.1 K"},
		{"customary sea-level temperature", Customary.Temp(288.15), "59.0 °F"},
		{"customary ΔT 10 K = 18 °F", Customary.DeltaT(10), "+18.0 °F"},
		{"SI negative ΔT", SI.DeltaT(-5), "-5.0 K"},
		{"SI density", SI.Density(1.225), "1.225 kg/m³"},
		{"customary sea-level density", Customary.Density(1.225), "0.002377 slug/ft³"},
		{"SI unit Reynolds", SI.PerLength(6.7e6), "6.70e6 /m"},
		{"customary unit Reynolds (per ft = per m × 0.3048)", Customary.PerLength(1e7), "3.05e6 /ft"},
		{"customary length", Customary.Length(0.3048), "1.00 ft"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("%s = %q, want %q", c.name, c.got, c.want)
		}
	}
}

func TestNumberFormat(t *testing.T) {
	cases := []struct {
		got, want string
	}{
		{sig(0, 3), "0"}, {sig(1234.6, 4), "1235"}, {sig(0.012345, 3), "0.0123"},
		{sig(3.1e7, 3), "3.10e7"}, {sig(2e-8, 2), "2.0e-8"}, {sig(math.NaN(), 3), "n/a"},
		{sig(math.Inf(1), 3), "inf"}, {expo(123456, 3), "1.23e5"}, {expo(1, 3), "1.00"},
		{fixed(-0.01, 1), "0.0"}, {machLabel(0.85), "0.85"}, {machLabel(12.5), "12.5"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
}

// TestParseField reads what-if values as a user types them. Conversion
// references as in TestUnitsFormat; 1 bar = 100 kPa by definition.
func TestParseField(t *testing.T) {
	const relTol = 1e-9 // exact conversions
	_, facs := demoData(t)
	kellen := &facs[3] // Kellen Fold: p0 1.2–4.5 bar, T0 105–313 K (demo data, invented)
	wenlow := &facs[5] // Wenlow water tunnel: 8–35 degC
	if !strings.HasPrefix(kellen.Name, "Kellen Fold") || !strings.HasPrefix(wenlow.Name, "Wenlow") {
		t.Fatalf("demo facilities moved: %q, %q", kellen.Name, wenlow.Name)
	}
	cases := []struct {
		f     field
		text  string
		units Units
		fac   *envelope.Facility
		want  float64
	}{
		{fieldP0Max, "3 bar", SI, kellen, 3e5},
		{fieldP0Max, "45 psi", SI, kellen, 45 * 6894.757293168361},
		{fieldP0Max, "300", SI, kellen, 3e5},                          // bare number: kPa in SI
		{fieldP0Max, "45", Customary, kellen, 45 * 6894.757293168361}, // psi in customary
		{fieldP0Max, "1.2 bar", SI, kellen, 1.2e5},                    // equal to the minimum, as a file's range may be
		{fieldQMax, "1500 psf", SI, kellen, 1500 * 47.88025898033584},
		{fieldQMax, "none", SI, kellen, 0},
		{fieldT0Min, "-150 degC", SI, kellen, 123.15},
		{fieldT0Min, "-150 °C", SI, kellen, 123.15},
		{fieldT0Min, "110", SI, kellen, 110},
		{fieldT0Min, "313 K", SI, kellen, 313}, // equal to the maximum
		{fieldT0Min, "32", Customary, wenlow, 273.15},
		{fieldT0Min, "0 degC", SI, wenlow, 273.15},
		{fieldDeltaT, "10 K", SI, nil, 10},
		{fieldDeltaT, "-18", Customary, nil, -10},
		{fieldDeltaT, "60 K", SI, nil, 60},
		{fieldDeltaT, "-108 degF", SI, nil, -60},
		{fieldScale, "0.05", SI, nil, 0.05},
		{fieldScale, "1/20", SI, nil, 0.05},
		{fieldScale, "1:20", SI, nil, 0.05},
		{fieldScale, "5 %", SI, nil, 0.05},
		{fieldScale, "5%", SI, nil, 0.05},
		{fieldScale, "10", SI, nil, 10},
		{fieldScale, "fit", SI, nil, 0},
		{fieldScale, "FIT", SI, nil, 0},
		{fieldReTol, "5 %", SI, nil, 0.05},
		{fieldReTol, "0.1", SI, nil, 0.1},
		{fieldReTol, "1/10", SI, nil, 0.1},
		{fieldReTol, "0", SI, nil, 0},
		{fieldMachTol, "0.02", SI, nil, 0.02},
		{fieldCompMach, "0.35", SI, nil, 0.35},
		{fieldCompMach, "M0.35", SI, nil, 0.35},
	}
	for _, c := range cases {
		got, err := parseField(c.f, c.text, c.units, c.fac)
		if err != nil {
			t.Errorf("parseField(%s, %q) error %v", c.f.label(false), c.text, err)
			continue
		}
		if math.Abs(got-c.want) > relTol*math.Max(1, math.Abs(c.want)) {
			t.Errorf("parseField(%s, %q) = %.12g, want %.12g", c.f.label(false), c.text, got, c.want)
		}
	}
	bad := []struct {
		f    field
		text string
		fac  *envelope.Facility
		want string // part of the message
	}{
		{fieldP0Max, "", kellen, "empty"},
		{fieldP0Max, "lots", kellen, "no number"},
		{fieldP0Max, "3 parsec", kellen, "unknown pressure unit"},
		{fieldP0Max, "-1 bar", kellen, "negative"},
		{fieldP0Max, "1 bar", kellen, "not below the facility's minimum 120000 Pa"},
		{fieldP0Max, "1001 bar", kellen, "a pressure above 0 and at most 1000 bar"},
		{fieldP0Max, "3 bar", nil, "choose a facility"},
		{fieldQMax, "0", kellen, `expected a dynamic pressure above 0 and at most 1000 bar, or the word "none" for no limit`},
		{fieldQMax, "2000 bar", kellen, "at most 1000 bar"},
		{fieldT0Min, "-300 degC", kellen, "below absolute zero"},
		{fieldT0Min, "320 K", kellen, "not above the facility's maximum 313 K"},
		{fieldT0Min, "-5 degC", wenlow, "a water temperature from 0 degC to 100 degC"},
		{fieldMachTol, "0", nil, "a Mach tolerance above 0 and below 1"},
		{fieldMachTol, "2", nil, "a Mach tolerance above 0 and below 1"},
		{fieldReTol, "150 %", nil, "a Reynolds tolerance from 0 up to (not including) 1"},
		{fieldReTol, "x%", nil, "no number"},
		{fieldScale, "-0.1", nil, "a model scale above 0 and at most 10"},
		{fieldScale, "0", nil, `found "0", expected a model scale above 0 and at most 10, or the word "fit" for each facility's own sizing`},
		{fieldScale, "1/0", nil, "division by zero"},
		{fieldScale, "20", nil, "at most 10"},
		{fieldScale, "files", nil, "no number"},
		{fieldDeltaT, "70 K", nil, `found "70 K", expected a temperature offset from the standard day within ±60 K`},
		{fieldDeltaT, "-61", nil, "within ±60 K"},
		{fieldDeltaT, "200 K", nil, "within ±60 K"},
		{fieldCompMach, "1.2", nil, "a Mach number above 0 and below 1"},
		{fieldCompMach, "0", nil, "a Mach number above 0 and below 1"},
	}
	for _, c := range bad {
		v, err := parseField(c.f, c.text, SI, c.fac)
		if err == nil {
			t.Errorf("parseField(%s, %q) = %g, want an error", c.f.label(false), c.text, v)
			continue
		}
		water := c.fac != nil && c.fac.Medium == envelope.MediumWater
		if !strings.HasPrefix(err.Error(), c.f.label(water)+": ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("parseField(%s, %q) error %q, want the field named and %q", c.f.label(false), c.text, err, c.want)
		}
	}
}

// FuzzParseField: any text gives a finite, in-range value or an error.
func FuzzParseField(f *testing.F) {
	for _, s := range []string{"3 bar", "45 psi", "-150 degC", "fit", "none", "5 %", "1/20", "1:20", "1e400 Pa", "NaN K", "0x10 kPa"} {
		f.Add(s, uint8(0))
	}
	_, facs := demoData(f)
	f.Fuzz(func(t *testing.T, s string, which uint8) {
		fl := field(int(which) % int(fieldCount))
		fac := &facs[int(which/uint8(fieldCount))%len(facs)]
		for _, u := range []Units{SI, Customary} {
			v, err := parseField(fl, s, u, fac)
			if err != nil {
				continue
			}
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("parseField(%v, %q) = %g", fl, s, v)
			}
			if _, err := checkField(fl, v, fac); err != nil {
				t.Fatalf("parseField(%v, %q) = %g outside its range: %v", fl, s, v, err)
			}
		}
	})
}
