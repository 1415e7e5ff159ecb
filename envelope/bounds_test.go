package envelope

import (
	"errors"
	"strings"
	"testing"

	"likewind/atmos"
)

func TestBoundHolds(t *testing.T) {
	b := Bound{Lo: 0, LoOpen: true, Hi: 10}
	for v, want := range map[float64]bool{0: false, 1e-300: true, 10: true, 10.0000001: false, -1: false} {
		if got := b.Holds(v); got != want {
			t.Errorf("(0, 10].Holds(%g) = %v, want %v", v, got, want)
		}
	}
	w := FacilityTemperatureBound(MediumWater)
	// 32 degF is 273.15 K by the definition of the Fahrenheit scale; a
	// conversion a rounding below it is clamped onto 0 degC.
	if !w.Holds(273.15-1e-12) || w.Clamp(273.15-1e-12) != 273.15 || w.Holds(273.14) {
		t.Errorf("water bound at 0 degC: holds %v clamp %v, holds 273.14 %v",
			w.Holds(273.15-1e-12), w.Clamp(273.15-1e-12), w.Holds(273.14))
	}
	err := DeltaTBound().Check(`"70 K"`, 70)
	if !errors.Is(err, ErrOutOfBounds) || err.Error() != `found "70 K", expected a temperature offset from the standard day within ±60 K` {
		t.Errorf("ΔT 70 K: %v", err)
	}
}

// TestParseModelScaleForms: the forms a file, a flag and the editor all
// take, and the bounds they all apply.
func TestParseModelScaleForms(t *testing.T) {
	for _, s := range []string{"0.05", "1/20", "1:20", "5 %", "5%", " 1 / 20 "} {
		if v, err := ParseModelScale(s); err != nil || v != 0.05 && !near(v, 0.05, 1e-15) {
			t.Errorf("ParseModelScale(%q) = %g, %v; want 0.05", s, v, err)
		}
	}
	for s, want := range map[string]string{
		"0":     `found "0", expected a model scale above 0 and at most 10`,
		"20":    `found "20", expected a model scale above 0 and at most 10`,
		"-1/20": "above 0",
		"1/0":   "division by zero",
		"fit":   "no number",
	} {
		if v, err := ParseModelScale(s); err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("ParseModelScale(%q) = %g, %v; want an error with %q", s, v, err, want)
		}
	}
}

func TestParseBoundedValues(t *testing.T) {
	ok := []struct {
		name  string
		parse func() (float64, error)
		want  float64
	}{
		{"ΔT 60 K", func() (float64, error) { return ParseDeltaT("60 K") }, 60},
		{"ΔT -108 degF", func() (float64, error) { return ParseDeltaT("-108 degF") }, -60},
		{"ΔT -0 K", func() (float64, error) { return ParseDeltaT("-0 K") }, 0},
		{"Mach M0.85", func() (float64, error) { return ParseFlightSpeed("M0.85", atmos.Mach) }, 0.85},
		{"Mach 30", func() (float64, error) { return ParseFlightSpeed("30", atmos.Mach) }, 30},
		{"TAS 10000 m/s", func() (float64, error) { return ParseFlightSpeed("10000 m/s", atmos.TAS) }, 10000},
		{"length 1 µm", func() (float64, error) { return ParseVehicleLength("0.001 mm") }, 1e-6},
		{"length 1000 m", func() (float64, error) { return ParseVehicleLength("1 km") }, 1000},
		{"Re tol 10 %", func() (float64, error) { return ParseReTol("10 %") }, 0.1},
		{"Mach tol", func() (float64, error) { return ParseMachTol("0.02") }, 0.02},
		{"compressibility", func() (float64, error) { return ParseCompressibilityMach("Mach 0.3") }, 0.3},
	}
	for _, c := range ok {
		v, err := c.parse()
		if err != nil || !near(v, c.want, 1e-12) {
			t.Errorf("%s: %g, %v; want %g", c.name, v, err, c.want)
		}
	}
	bad := []struct {
		name  string
		parse func() (float64, error)
		want  string
	}{
		{"ΔT 70 K", func() (float64, error) { return ParseDeltaT("70 K") }, "within ±60 K"},
		{"Mach 71000", func() (float64, error) { return ParseFlightSpeed("71000", atmos.Mach) }, "a Mach number from 0 to 30"},
		{"negative Mach", func() (float64, error) { return ParseFlightSpeed("-0.1", atmos.Mach) }, "a Mach number from 0 to 30"},
		{"speed of light", func() (float64, error) { return ParseFlightSpeed("299792458 m/s", atmos.TAS) }, "a TAS from 0 to 10000 m/s"},
		{"length 0", func() (float64, error) { return ParseVehicleLength("0 m") }, "a length from 1 µm to 1000 m"},
		{"length 2 km", func() (float64, error) { return ParseVehicleLength("2 km") }, "a length from 1 µm to 1000 m"},
		{"Re tol 100 %", func() (float64, error) { return ParseReTol("100 %") }, "not including"},
		{"Mach tol 0", func() (float64, error) { return ParseMachTol("0") }, "above 0"},
		{"compressibility 1", func() (float64, error) { return ParseCompressibilityMach("1") }, "below 1"},
	}
	for _, c := range bad {
		if v, err := c.parse(); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %g, %v; want an error with %q", c.name, v, err, c.want)
		}
	}
}

func TestFacilityLimitChecks(t *testing.T) {
	f := &Facility{Medium: "nitrogen", Gas: GasLimits{P0Min: 1.2e5, P0Max: 4.5e5, T0Min: 105, T0Max: 313}}
	if v, err := CheckP0Max(f, "", 1.2e5); err != nil || v != 1.2e5 {
		t.Errorf("p0 max at the minimum: %g, %v; want it taken (a file's range may be one value)", v, err)
	}
	if _, err := CheckP0Max(f, `"1 bar"`, 1e5); err == nil || !strings.Contains(err.Error(), `found "1 bar"`) {
		t.Errorf("p0 max below the minimum: %v", err)
	}
	if _, err := CheckP0Max(f, "", 1.1e8); err == nil {
		t.Error("p0 max of 1100 bar taken")
	}
	if _, err := CheckT0Min(f, "", 320); err == nil || !strings.Contains(err.Error(), "not above the facility's maximum 313 K") {
		t.Errorf("T0 min above T0 max: %v", err)
	}
	w := &Facility{Medium: MediumWater, Water: WaterLimits{TMin: 281.15, TMax: 308.15}}
	if _, err := CheckT0Min(w, "", 5); err == nil || !strings.Contains(err.Error(), "water temperature") {
		t.Errorf("water T0 min of 5 K: %v", err)
	}
	if v, err := CheckT0Min(w, "", 273.15-1e-12); err != nil || v != 273.15 {
		t.Errorf("water at 0 degC less a rounding: %g, %v; want 273.15", v, err)
	}
	if v, err := CheckQMax("", 0); err != nil || v != 0 {
		t.Errorf("stored q max 0 (no limit): %g, %v", v, err)
	}
	if _, err := CheckQMax(`"0 kPa"`, 0); err == nil {
		t.Error("a typed q max of 0 taken")
	}
}

// TestFileBoundsShared: the files take the same scale forms and refuse
// the same values as the editor and the command line.
func TestFileBoundsShared(t *testing.T) {
	withModel := func(scale string) string {
		return baseFacility + "\n[facility.model]\nscale = \"" + scale + "\"\n"
	}
	for _, s := range []string{"0.05", "1/20", "1:20", "5 %"} {
		fs, err := ParseFacilities("t.toml", []byte(withModel(s)))
		if err != nil || len(fs) != 1 || !near(fs[0].Model.Scale, 0.05, 1e-15) {
			t.Errorf("scale %q: %v", s, err)
		}
	}
	for s, want := range map[string]string{"0": "a model scale above 0 and at most 10", "20": "a model scale above 0 and at most 10"} {
		if _, err := ParseFacilities("t.toml", []byte(withModel(s))); err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("scale %q: %v, want %q", s, err, want)
		}
	}
	for dT, good := range map[string]bool{"60 K": true, "-60 K": true, "61 K": false, "70 K": false, "-108 degF": true, "-110 degF": false} {
		src := edit(t, baseVehicle, `temperature_offset = "0 K"`, `temperature_offset = "`+dT+`"`)
		_, err := ParseVehicle("v.toml", []byte(src))
		if good != (err == nil) {
			t.Errorf("temperature_offset %q: error %v, want accepted %v", dT, err, good)
		}
		if err != nil && !strings.Contains(err.Error(), DeltaTBound().Expected) {
			t.Errorf("temperature_offset %q: %v, want the shared bound's words", dT, err)
		}
	}
	src := edit(t, baseFacility, `["1 bar", "5 bar"]`, `["1 bar", "1100 bar"]`)
	if _, err := ParseFacilities("t.toml", []byte(src)); err == nil || !strings.Contains(err.Error(), FacilityPressureBound().Expected) {
		t.Errorf("p0 of 1100 bar: %v", err)
	}
	src = edit(t, baseFacility, `section_height = "1.5 m"`, "section_height = \"1.5 m\"\nmax_dynamic_pressure = \"0 Pa\"")
	if _, err := ParseFacilities("t.toml", []byte(src)); err == nil || !strings.Contains(err.Error(), QMaxBound().Expected) {
		t.Errorf("q max of 0: %v", err)
	}
}
