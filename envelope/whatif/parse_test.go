package whatif

import (
	"math"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
)

// TestParseField reads what-if values as a user types them. Conversion
// references as in TestUnitsFormat (envelope/units); 1 bar = 100 kPa by definition.
func TestParseField(t *testing.T) {
	const relTol = 1e-9 // exact conversions
	_, facs := demoData(t)
	kellen := &facs[3] // Kellen Fold: p0 1.2–4.5 bar, T0 105–313 K (demo data, invented)
	wenlow := &facs[5] // Wenlow water tunnel: 8–35 degC
	if !strings.HasPrefix(kellen.Name, "Kellen Fold") || !strings.HasPrefix(wenlow.Name, "Wenlow") {
		t.Fatalf("demo facilities moved: %q, %q", kellen.Name, wenlow.Name)
	}
	cases := []struct {
		f     Field
		text  string
		units units.System
		fac   *envelope.Facility
		want  float64
	}{
		{P0Max, "3 bar", units.SI, kellen, 3e5},
		{P0Max, "45 psi", units.SI, kellen, 45 * 6894.757293168361},
		{P0Max, "300", units.SI, kellen, 3e5},                          // bare number: kPa in SI
		{P0Max, "45", units.Customary, kellen, 45 * 6894.757293168361}, // psi in customary
		{P0Max, "1.2 bar", units.SI, kellen, 1.2e5},                    // equal to the minimum, as a file's range may be
		{QMax, "1500 psf", units.SI, kellen, 1500 * 47.88025898033584},
		{QMax, "none", units.SI, kellen, 0},
		{T0Min, "-150 degC", units.SI, kellen, 123.15},
		{T0Min, "-150 °C", units.SI, kellen, 123.15},
		{T0Min, "110", units.SI, kellen, 110},
		{T0Min, "313 K", units.SI, kellen, 313}, // equal to the maximum
		{T0Min, "32", units.Customary, wenlow, 273.15},
		{T0Min, "0 degC", units.SI, wenlow, 273.15},
		{DeltaT, "10 K", units.SI, nil, 10},
		{DeltaT, "-18", units.Customary, nil, -10},
		{DeltaT, "60 K", units.SI, nil, 60},
		{DeltaT, "-108 degF", units.SI, nil, -60},
		{Scale, "0.05", units.SI, nil, 0.05},
		{Scale, "1/20", units.SI, nil, 0.05},
		{Scale, "1:20", units.SI, nil, 0.05},
		{Scale, "5 %", units.SI, nil, 0.05},
		{Scale, "5%", units.SI, nil, 0.05},
		{Scale, "10", units.SI, nil, 10},
		{Scale, "fit", units.SI, nil, 0},
		{Scale, "FIT", units.SI, nil, 0},
		{ReTol, "5 %", units.SI, nil, 0.05},
		{ReTol, "0.1", units.SI, nil, 0.1},
		{ReTol, "1/10", units.SI, nil, 0.1},
		{ReTol, "0", units.SI, nil, 0},
		{MachTol, "0.02", units.SI, nil, 0.02},
		{CompMach, "0.35", units.SI, nil, 0.35},
		{CompMach, "M0.35", units.SI, nil, 0.35},
	}
	for _, c := range cases {
		got, err := c.f.Parse(c.text, c.units, c.fac)
		if err != nil {
			t.Errorf("Parse(%s, %q) error %v", c.f.Label(false), c.text, err)
			continue
		}
		if math.Abs(got-c.want) > relTol*math.Max(1, math.Abs(c.want)) {
			t.Errorf("Parse(%s, %q) = %.12g, want %.12g", c.f.Label(false), c.text, got, c.want)
		}
	}
	bad := []struct {
		f    Field
		text string
		fac  *envelope.Facility
		want string // part of the message
	}{
		{P0Max, "", kellen, "empty"},
		{P0Max, "lots", kellen, "no number"},
		{P0Max, "3 parsec", kellen, "unknown pressure unit"},
		{P0Max, "-1 bar", kellen, "negative"},
		{P0Max, "1 bar", kellen, "not below the facility's minimum 120000 Pa"},
		{P0Max, "1001 bar", kellen, "a pressure above 0 and at most 1000 bar"},
		{P0Max, "3 bar", nil, "choose a facility"},
		{QMax, "0", kellen, `expected a dynamic pressure above 0 and at most 1000 bar, or the word "none" for no limit`},
		{QMax, "2000 bar", kellen, "at most 1000 bar"},
		{T0Min, "-300 degC", kellen, "below absolute zero"},
		{T0Min, "320 K", kellen, "not above the facility's maximum 313 K"},
		{T0Min, "-5 degC", wenlow, "a water temperature from 0 degC to 100 degC"},
		{MachTol, "0", nil, "a Mach tolerance above 0 and below 1"},
		{MachTol, "2", nil, "a Mach tolerance above 0 and below 1"},
		{ReTol, "150 %", nil, "a Reynolds tolerance from 0 up to (not including) 1"},
		{ReTol, "x%", nil, "no number"},
		{Scale, "-0.1", nil, "a model scale above 0 and at most 10"},
		{Scale, "0", nil, `found "0", expected a model scale above 0 and at most 10, or the word "fit" for each facility's own sizing`},
		{Scale, "1/0", nil, "division by zero"},
		{Scale, "20", nil, "at most 10"},
		{Scale, "files", nil, "no number"},
		{DeltaT, "70 K", nil, `found "70 K", expected a temperature offset from the standard day within ±60 K`},
		{DeltaT, "-61", nil, "within ±60 K"},
		{DeltaT, "200 K", nil, "within ±60 K"},
		{CompMach, "1.2", nil, "a Mach number above 0 and below 1"},
		{CompMach, "0", nil, "a Mach number above 0 and below 1"},
	}
	for _, c := range bad {
		v, err := c.f.Parse(c.text, units.SI, c.fac)
		if err == nil {
			t.Errorf("Parse(%s, %q) = %g, want an error", c.f.Label(false), c.text, v)
			continue
		}
		water := c.fac != nil && c.fac.Medium == envelope.MediumWater
		if !strings.HasPrefix(err.Error(), c.f.Label(water)+": ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Parse(%s, %q) error %q, want the field named and %q", c.f.Label(false), c.text, err, c.want)
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
		fl := Field(int(which) % int(FieldCount))
		fac := &facs[int(which/uint8(FieldCount))%len(facs)]
		for _, u := range []units.System{units.SI, units.Customary} {
			v, err := fl.Parse(s, u, fac)
			if err != nil {
				continue
			}
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("Parse(%v, %q) = %g", fl, s, v)
			}
			if _, err := fl.Check(v, fac); err != nil {
				t.Fatalf("Parse(%v, %q) = %g outside its range: %v", fl, s, v, err)
			}
		}
	})
}
