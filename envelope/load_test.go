package envelope

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"likewind/atmos"
)

// unitTol is the relative tolerance for values converted from customary
// units: the factors are exact or given to more digits than this.
const unitTol = 1e-12

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Max(math.Abs(want), 1e-300)
}

// baseVehicle is a small valid vehicle file the tests edit line by line.
const baseVehicle = `[vehicle]
name = "Test glider"
reference_length = "1.1 m"
reference_area = "26 m2"
span = "24 m"
frontal_area = "0.6 m2"

[envelope]
speed_kind = "EAS"
temperature_offset = "0 K"
boundary = [
  ["0 ft", "40 kt"],
  ["0 ft", "120 kt"],
  ["30000 ft", "110 kt"],
  ["40000 ft", "50 kt"],
]

[limits]
ceiling = "40000 ft"
max_mach = "0.6"

[grid.altitude]
step = "1000 ft"
`

// baseFacility is a small valid gas facility file.
const baseFacility = `[[facility]]
name = "Test tunnel"
medium = "air"
mach_range = ["0.05", "0.3"]
stagnation_pressure_range = ["1 bar", "5 bar"]
stagnation_temperature_range = ["280 K", "320 K"]
section_width = "2 m"
section_height = "1.5 m"
`

// baseWater is a small valid water facility file.
const baseWater = `[[facility]]
name = "Test water tunnel"
medium = "water"
speed_range = ["0.5 m/s", "10 m/s"]
static_pressure_range = ["0.2 bar", "2 bar"]
water_temperature_range = ["10 degC", "30 degC"]
section_width = "0.5 m"
section_height = "0.5 m"
`

func edit(t *testing.T, base, old, new string) string {
	t.Helper()
	if !strings.Contains(base, old) {
		t.Fatalf("test setup: %q not in base text", old)
	}
	return strings.Replace(base, old, new, 1)
}

func TestBaseFilesLoad(t *testing.T) {
	if _, err := ParseVehicle("v.toml", []byte(baseVehicle)); err != nil {
		t.Fatalf("ParseVehicle(baseVehicle) = %v, want no error", err)
	}
	for _, src := range []string{baseFacility, baseWater} {
		if _, err := ParseFacilities("f.toml", []byte(src)); err != nil {
			t.Fatalf("ParseFacilities = %v, want no error", err)
		}
	}
}

// Unit factors below are exact by definition or from NIST Special
// Publication 811 (2008), Appendix B.8: 1 ft = 0.3048 m, 1 in = 0.0254 m,
// 1 kn = 1852/3600 m/s, 1 lbf/in² = 6894.757 Pa, 1 lbf/ft² = 47.88026 Pa,
// 1 atm = 101325 Pa, 1 torr = 101325/760 Pa, T/K = t/°C + 273.15,
// T/K = (t/°F + 459.67)·5/9, 1 °R = 5/9 K.
func TestVehicleFieldUnits(t *testing.T) {
	tests := []struct {
		name     string
		old, new string
		get      func(v *Vehicle) float64
		want     float64
	}{
		{"reference length in ft", `reference_length = "1.1 m"`, `reference_length = "4.5 ft"`,
			func(v *Vehicle) float64 { return v.RefLength }, 4.5 * 0.3048},
		{"reference area in ft2", `reference_area = "26 m2"`, `reference_area = "10 ft2"`,
			func(v *Vehicle) float64 { return v.RefArea }, 10 * 0.3048 * 0.3048},
		{"span in inches", `span = "24 m"`, `span = "300 in"`,
			func(v *Vehicle) float64 { return v.Span }, 300 * 0.0254},
		{"frontal area in cm2", `frontal_area = "0.6 m2"`, `frontal_area = "5000 cm2"`,
			func(v *Vehicle) float64 { return v.FrontalArea }, 0.5},
		{"temperature offset in degF", `temperature_offset = "0 K"`, `temperature_offset = "27 degF"`,
			func(v *Vehicle) float64 { return v.DeltaT }, 15},
		{"temperature offset in degC", `temperature_offset = "0 K"`, `temperature_offset = "-10 degC"`,
			func(v *Vehicle) float64 { return v.DeltaT }, -10},
		{"boundary altitude in km", `["30000 ft", "110 kt"]`, `["11 km", "110 kt"]`,
			func(v *Vehicle) float64 { return v.Boundary[2].Altitude }, 11000},
		{"boundary EAS in kt", `["30000 ft", "110 kt"]`, `["30000 ft", "250 kt"]`,
			func(v *Vehicle) float64 { return v.Boundary[2].Speed }, 250 * 1852.0 / 3600},
		{"boundary EAS in m/s", `["30000 ft", "110 kt"]`, `["30000 ft", "60 m/s"]`,
			func(v *Vehicle) float64 { return v.Boundary[2].Speed }, 60},
		{"ceiling in kft", `ceiling = "40000 ft"`, `ceiling = "20 kft"`,
			func(v *Vehicle) float64 { return v.Limits.Ceiling }, 20000 * 0.3048},
		{"max Mach written M2.2", `max_mach = "0.6"`, `max_mach = "M2.2"`,
			func(v *Vehicle) float64 { return v.Limits.MaxMach }, 2.2},
		{"max Mach bare", `max_mach = "0.6"`, `max_mach = 0.75`,
			func(v *Vehicle) float64 { return v.Limits.MaxMach }, 0.75},
		{"max EAS in km/h", `max_mach = "0.6"`, `max_eas = "300 km/h"`,
			func(v *Vehicle) float64 { return v.Limits.MaxEAS }, 300 / 3.6},
		{"max CAS in ft/s", `max_mach = "0.6"`, `max_cas = "500 ft/s"`,
			func(v *Vehicle) float64 { return v.Limits.MaxCAS }, 500 * 0.3048},
		{"max dynamic pressure in psf", `max_mach = "0.6"`, `max_dynamic_pressure = "1000 psf"`,
			func(v *Vehicle) float64 { return v.Limits.MaxQ }, 1000 * 0.45359237 * 9.80665 / (0.3048 * 0.3048)},
		{"min speed in KEAS", `max_mach = "0.6"`, `min_speed = "90 KEAS"`,
			func(v *Vehicle) float64 { return v.Limits.MinSpeed }, 90 * 1852.0 / 3600},
		{"grid altitude step in m", `step = "1000 ft"`, `step = "500 m"`,
			func(v *Vehicle) float64 { return v.Grid.Altitude.Step }, 500},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			v, err := ParseVehicle("v.toml", []byte(edit(t, baseVehicle, tt.old, tt.new)))
			if err != nil {
				t.Fatalf("ParseVehicle: %v", err)
			}
			if got := tt.get(v); !near(got, tt.want, unitTol) {
				t.Errorf("%s = %.15g, want %.15g", tt.name, got, tt.want)
			}
		})
	}
}

func TestMinSpeedKind(t *testing.T) {
	for _, tt := range []struct {
		text string
		kind atmos.SpeedKind
		want float64
	}{
		{"M0.25", atmos.Mach, 0.25},
		{"90 KEAS", atmos.EAS, 90 * 1852.0 / 3600},
		{"120 kt CAS", atmos.CAS, 120 * 1852.0 / 3600},
		{"60 m/s TAS", atmos.TAS, 60},
	} {
		v, err := ParseVehicle("v.toml", []byte(edit(t, baseVehicle, `max_mach = "0.6"`, `min_speed = "`+tt.text+`"`)))
		if err != nil {
			t.Fatalf("min_speed %q: %v", tt.text, err)
		}
		if v.Limits.MinSpeedKind != tt.kind || !near(v.Limits.MinSpeed, tt.want, unitTol) {
			t.Errorf("min_speed %q = %v %g, want %v %g", tt.text, v.Limits.MinSpeedKind, v.Limits.MinSpeed, tt.kind, tt.want)
		}
	}
}

// Factors as in TestVehicleFieldUnits (NIST SP 811, Appendix B.8).
func TestFacilityFieldUnits(t *testing.T) {
	psi := 0.45359237 * 9.80665 / (0.0254 * 0.0254)
	tests := []struct {
		name     string
		base     string
		old, new string
		get      func(f Facility) float64
		want     float64
	}{
		{"P0 in psi", baseFacility, `["1 bar", "5 bar"]`, `["14.7 psi", "45 psi"]`,
			func(f Facility) float64 { return f.Gas.P0Max }, 45 * psi},
		{"P0 in atm", baseFacility, `["1 bar", "5 bar"]`, `["1 atm", "3 atm"]`,
			func(f Facility) float64 { return f.Gas.P0Min }, 101325},
		{"P0 in torr", baseFacility, `["1 bar", "5 bar"]`, `["760 torr", "3 bar"]`,
			func(f Facility) float64 { return f.Gas.P0Min }, 101325},
		{"T0 in degC", baseFacility, `["280 K", "320 K"]`, `["-20 degC", "50 degC"]`,
			func(f Facility) float64 { return f.Gas.T0Min }, 253.15},
		{"T0 in degF", baseFacility, `["280 K", "320 K"]`, `["-40 degF", "100 degF"]`,
			func(f Facility) float64 { return f.Gas.T0Min }, 233.15},
		{"T0 in degR", baseFacility, `["280 K", "320 K"]`, `["500 degR", "560 degR"]`,
			func(f Facility) float64 { return f.Gas.T0Min }, 500 * 5.0 / 9},
		{"Mach range written Mach 0.1", baseFacility, `["0.05", "0.3"]`, `["Mach 0.1", "M0.4"]`,
			func(f Facility) float64 { return f.Gas.MachMax }, 0.4},
		{"min static temperature", baseFacility, `section_width`, "min_static_temperature = \"-150 degC\"\nsection_width",
			func(f Facility) float64 { return f.Gas.MinStaticT }, 123.15},
		{"peak local Mach", baseFacility, `section_width`, "peak_local_mach = \"1.6\"\nsection_width",
			func(f Facility) float64 { return f.Gas.PeakLocalMach }, 1.6},
		{"max q in kPa", baseFacility, `section_width`, "max_dynamic_pressure = \"60 kPa\"\nsection_width",
			func(f Facility) float64 { return f.QMax }, 60000},
		{"unit Reynolds per foot", baseFacility, `section_width`, "max_reynolds_per_metre = \"30e6 /ft\"\nsection_width",
			func(f Facility) float64 { return f.MaxReynoldsPerM }, 30e6 / 0.3048},
		{"unit Reynolds per metre", baseFacility, `section_width`, "max_reynolds_per_metre = \"80e6 1/m\"\nsection_width",
			func(f Facility) float64 { return f.MaxReynoldsPerM }, 80e6},
		{"section width in inches", baseFacility, `section_width = "2 m"`, `section_width = "78.74 in"`,
			func(f Facility) float64 { return f.Width }, 78.74 * 0.0254},
		{"section height in mm", baseFacility, `section_height = "1.5 m"`, `section_height = "1500 mm"`,
			func(f Facility) float64 { return f.Height }, 1.5},
		{"scale 1:40", baseFacility + "\n[facility.model]\n", "[facility.model]\n", "[facility.model]\nscale = \"1:40\"\n",
			func(f Facility) float64 { return f.Model.Scale }, 0.025},
		{"scale 1/50", baseFacility + "\n[facility.model]\n", "[facility.model]\n", "[facility.model]\nscale = \"1/50\"\n",
			func(f Facility) float64 { return f.Model.Scale }, 0.02},
		{"scale bare", baseFacility + "\n[facility.model]\n", "[facility.model]\n", "[facility.model]\nscale = 0.04\n",
			func(f Facility) float64 { return f.Model.Scale }, 0.04},
		{"blockage in percent", baseFacility + "\n[facility.model]\n", "[facility.model]\n", "[facility.model]\nmax_blockage = \"1.5 %\"\n",
			func(f Facility) float64 { return f.Model.MaxBlockage }, 0.015},
		{"span fraction in percent", baseFacility + "\n[facility.model]\n", "[facility.model]\n", "[facility.model]\nmax_span_fraction = \"70%\"\n",
			func(f Facility) float64 { return f.Model.MaxSpanFraction }, 0.7},
		{"model as inline table", baseFacility, `section_width`, "model = { scale = \"1/20\" }\nsection_width",
			func(f Facility) float64 { return f.Model.Scale }, 0.05},
		{"water speed in ft/s", baseWater, `["0.5 m/s", "10 m/s"]`, `["1 ft/s", "20 ft/s"]`,
			func(f Facility) float64 { return f.Water.SpeedMax }, 20 * 0.3048},
		{"water temperature in degF", baseWater, `["10 degC", "30 degC"]`, `["50 degF", "68 degF"]`,
			func(f Facility) float64 { return f.Water.TMax }, 293.15},
		{"water static pressure in kPa", baseWater, `["0.2 bar", "2 bar"]`, `["20 kPa", "200 kPa"]`,
			func(f Facility) float64 { return f.Water.PMax }, 200000},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			fs, err := ParseFacilities("f.toml", []byte(edit(t, tt.base, tt.old, tt.new)))
			if err != nil {
				t.Fatalf("ParseFacilities: %v", err)
			}
			if got := tt.get(fs[0]); !near(got, tt.want, unitTol) {
				t.Errorf("%s = %.15g, want %.15g", tt.name, got, tt.want)
			}
		})
	}
}

func TestFacilityDefaults(t *testing.T) {
	fs, err := ParseFacilities("f.toml", []byte(baseFacility+"\n"+baseWater))
	if err != nil {
		t.Fatal(err)
	}
	gas, water := fs[0], fs[1]
	if !gas.Gas.Condensation || gas.Gas.PeakLocalMach != DefaultPeakLocalMach {
		t.Errorf("gas defaults: Condensation %v, PeakLocalMach %g; want true, %g", gas.Gas.Condensation, gas.Gas.PeakLocalMach, DefaultPeakLocalMach)
	}
	if water.Gas != (GasLimits{}) {
		t.Errorf("water facility has gas limits %+v, want none", water.Gas)
	}
	if gas.Water != (WaterLimits{}) {
		t.Errorf("gas facility has water limits %+v, want none", gas.Water)
	}
	for _, f := range fs {
		if f.Model != (ModelSizing{MaxSpanFraction: DefaultMaxSpanFraction}) {
			t.Errorf("%s: Model = %+v, want fit with span fraction %g and blockage by speed", f.Name, f.Model, DefaultMaxSpanFraction)
		}
		if f.Source != "f.toml" {
			t.Errorf("%s: Source = %q, want f.toml", f.Name, f.Source)
		}
	}
	if water.Medium != MediumWater || water.Water.TMin != 283.15 || water.Water.SpeedMax != 10 {
		t.Errorf("water = %+v", water)
	}
}

// TestNitrogenWarm checks that a nitrogen facility may run warm (no
// air-only temperature cap applies to it).
func TestNitrogenWarm(t *testing.T) {
	src := edit(t, edit(t, baseFacility, `"air"`, `"nitrogen"`), `["280 K", "320 K"]`, `["100 K", "380 K"]`)
	fs, err := ParseFacilities("f.toml", []byte(src))
	if err != nil {
		t.Fatalf("warm nitrogen: %v", err)
	}
	if fs[0].Medium != "nitrogen" || fs[0].Gas.T0Max != 380 {
		t.Errorf("nitrogen facility = %+v", fs[0])
	}
}

// TestBadFiles checks the exact error text for each file of testdata/bad,
// one fault per file except many_faults.toml.
func TestBadFiles(t *testing.T) {
	const lengthUnits = `(units: m, km, mm, cm, in, ft, kft, mi, nmi)`
	const printableOnly = `printable text only (no control, line-break or bidirectional-text characters)`
	tests := []struct {
		file string
		want []string
	}{
		{"syntax.toml", []string{
			`syntax.toml:3: syntax after vehicle.name: found strings cannot contain newlines, expected valid TOML`}},
		{"unknown_key.toml", []string{
			`unknown_key.toml:2: vehicle.span: missing, expected a length with its unit, e.g. "1.2 m" ` + lengthUnits,
			`unknown_key.toml:6: vehicle.spann: found unknown key "spann", expected "span", or one of: name, reference_length, reference_length_is, reference_area, span, frontal_area, max_normal_coefficient, max_pitching_moment_coefficient, load_reference_area`}},
		{"missing_field.toml", []string{
			`missing_field.toml:2: vehicle.reference_length: missing, expected a length with its unit, e.g. "1.2 m" ` + lengthUnits}},
		{"missing_table.toml", []string{
			`missing_table.toml: envelope: missing, expected the [envelope] table`}},
		{"missing_unit.toml", []string{
			`missing_unit.toml:6: vehicle.span: found "24" (missing length unit), expected a length with its unit, e.g. "1.2 m" ` + lengthUnits}},
		{"bare_number.toml", []string{
			`bare_number.toml:8: facility[1].section_width: found 2 (a number without its unit), expected a length with its unit, e.g. "1.2 m" ` + lengthUnits + `, in quotes`}},
		{"wrong_dimension.toml", []string{
			`wrong_dimension.toml:5: vehicle.reference_area: found "26 m" ("m" is a length unit), expected an area with its unit, e.g. "12.5 m2" (units: m2, cm2, mm2, ft2, in2)`}},
		{"inverted_range.toml", []string{
			`inverted_range.toml:6: facility[1].stagnation_pressure_range: found ["5 bar", "1 bar"] (low above high), expected the low value first`}},
		{"short_range.toml", []string{
			`short_range.toml:5: facility[1].mach_range: found ["0.3"], expected a range [low, high] of two values, each a Mach number, e.g. "0.85"`}},
		{"nan.toml", []string{
			`nan.toml:17: limits.max_mach: found NaN, expected a finite number`}},
		{"negative_length.toml", []string{
			`negative_length.toml:4: vehicle.reference_length: found "-1.1 m", expected a length from 1 µm to 1000 m`}},
		{"altitude_out_of_range.toml", []string{
			`altitude_out_of_range.toml:14: envelope.boundary point 4 altitude: found "95 km", expected a geometric altitude from -5000 m to 86000 m (the standard atmosphere's range)`}},
		{"self_intersecting.toml", []string{
			`self_intersecting.toml:12: envelope.boundary: found edge from point 1 to 2 crossing edge from point 3 to 4, expected an outline that does not cross or touch itself (list the points in order around the envelope)`}},
		{"degenerate.toml", []string{
			`degenerate.toml:11: envelope.boundary: found points on one line (no enclosed area), expected at least 3 points enclosing an area`}},
		{"repeated_point.toml", []string{
			`repeated_point.toml:14: envelope.boundary point 4: found the same point as point 3, expected distinct consecutive points`}},
		{"unknown_speed_kind.toml", []string{
			`unknown_speed_kind.toml:9: envelope.speed_kind: found "KIAS", expected "Mach", "TAS", "EAS" or "CAS"`}},
		{"grid_too_large.toml", []string{
			`grid_too_large.toml:18: grid.altitude: found step "10 ft" giving 4001 points, expected from 2 to 1000 altitude points (the grid is limited to 1000 × 1000)`}},
		{"step_and_count.toml", []string{
			`step_and_count.toml:19: grid.speed: found both step and count, expected a step or a count, not both`}},
		{"duplicate_names.toml", []string{
			`duplicate_names.toml:12: facility[2].name: found "Test tunnel", expected a name not already used (facility[1] has it)`}},
		{"medium_mismatch.toml", []string{
			`medium_mismatch.toml:5: facility[1].mach_range: found mach_range on a water facility, expected speed_range instead`}},
		{"water_temperature.toml", []string{
			`water_temperature.toml:7: facility[1].water_temperature_range high: found "120 degC", expected a water temperature from 0 degC to 100 degC`}},
		{"unknown_medium.toml", []string{
			`unknown_medium.toml:4: facility[1].medium: found "helium", expected "air", "nitrogen" or "water"`}},
		{"single_brackets.toml", []string{
			`single_brackets.toml:2: facility: found a table, expected one or more [[facility]] tables (note the double brackets)`}},
		{"mixed_file.toml", []string{
			`mixed_file.toml:17: facility: found [[facility]] tables in a vehicle file, expected vehicles and facilities in separate files`}},
		{"altitude_below_range.toml", []string{
			`altitude_below_range.toml:11: envelope.boundary point 1 altitude: found "-6 km", expected a geometric altitude from -5000 m to 86000 m (the standard atmosphere's range)`}},
		{"below_absolute_zero.toml", []string{
			`below_absolute_zero.toml:7: facility[1].stagnation_temperature_range low: found "-300 degC" (temperature -26.85 K is below absolute zero), expected a temperature with its unit, e.g. "-20 degC" (units: K, degC, degF, degR)`}},
		{"cas_too_high.toml", []string{
			`cas_too_high.toml:14: envelope.boundary point 4: found ["80 km", "400 kt"] (Mach 145), expected a CAS that exists at this altitude on the design day, at most Mach 30`}},
		{"ceiling_too_low.toml", []string{
			`ceiling_too_low.toml:17: limits.ceiling: found "0 ft", expected a ceiling above the lowest boundary point`}},
		{"condensation_on_water.toml", []string{
			`condensation_on_water.toml:8: facility[1].condensation_check: found condensation_check on a water facility, expected no condensation_check (condensation limits apply to air and nitrogen only)`}},
		{"duplicate_key.toml", []string{
			`duplicate_key.toml:9: syntax after facility.section_width: found Key 'facility.section_width' has already been defined, expected valid TOML`}},
		{"empty_boundary.toml", []string{
			`empty_boundary.toml:10: envelope.boundary: found 0 distinct points, expected at least 3 points enclosing an area`}},
		{"empty_file.toml", []string{
			`empty_file.toml:1: found neither [vehicle] nor [[facility]] tables, expected a vehicle file ([vehicle], [envelope], optional [limits], [grid]) or a facility file ([[facility]] tables)`}},
		{"gauge_pressure.toml", []string{
			`gauge_pressure.toml:6: facility[1].stagnation_pressure_range high: found "4 barg" ("barg" is a gauge pressure unit), expected a pressure with its unit, e.g. "2.5 bar" (units: Pa, hPa, kPa, MPa, mbar, bar, psi, psf, atm, inHg, mmHg, torr)`}},
		{"grid_count_too_large.toml", []string{
			`grid_count_too_large.toml:18: grid.speed.count: found 5000, expected from 2 to 1000 points (the grid is limited to 1000 × 1000)`}},
		{"grid_inverted.toml", []string{
			`grid_inverted.toml:17: grid.altitude: found from "30000 ft" to "10000 ft", expected a range whose to is above its from`}},
		{"infinite.toml", []string{
			`infinite.toml:6: vehicle.span: found "1e999 m" (number out of range), expected a length with its unit, e.g. "1.2 m" (units: m, km, mm, cm, in, ft, kft, mi, nmi)`}},
		{"mach_too_high.toml", []string{
			`mach_too_high.toml:13: envelope.boundary point 3 speed: found "35", expected a Mach number from 0 to 30`}},
		{"min_speed_kind.toml", []string{
			`min_speed_kind.toml:17: limits.min_speed: found "90", expected a speed with its kind, e.g. "M0.25", "90 KEAS", "120 kt CAS" or "60 m/s TAS"`}},
		{"missing_medium.toml", []string{
			`missing_medium.toml:2: facility[1].medium: missing, expected "air", "nitrogen" or "water"`}},
		{"not_utf8.toml", []string{
			`not_utf8.toml:3: syntax after vehicle.name: found invalid UTF-8 byte: 0xff, expected valid TOML`}},
		{"peak_local_mach.toml", []string{
			`peak_local_mach.toml:8: facility[1].peak_local_mach: found "0.8", expected a Mach number from 1 to 10`}},
		{"speed_range_on_air.toml", []string{
			`speed_range_on_air.toml:2: facility[1].mach_range: missing, expected a range [low, high] of two values, each a Mach number, e.g. "0.85"`,
			`speed_range_on_air.toml:5: facility[1].speed_range: found speed_range on an air facility, expected mach_range instead`}},
		{"step_zero.toml", []string{
			`step_zero.toml:18: grid.altitude.step: found "0 ft", expected an altitude step above 0`}},
		{"temperature_offset.toml", []string{
			`temperature_offset.toml:10: envelope.temperature_offset: found "80 K", expected a temperature offset from the standard day within ±60 K`}},
		{"thousands_separator.toml", []string{
			`thousands_separator.toml:13: envelope.boundary point 3 altitude: found "30,000 ft" (malformed number (use '.' for decimals and no thousands separators)), expected a length with its unit, e.g. "41000 ft" (units: m, km, mm, cm, in, ft, kft, mi, nmi)`}},
		{"too_many_points.toml", []string{
			`too_many_points.toml:10: envelope.boundary: found 1001 points, expected at most 1000 points`}},
		{"unknown_unit.toml", []string{
			`unknown_unit.toml:6: facility[1].stagnation_pressure_range high: found "5 bars" (unknown pressure unit "bars"), expected a pressure with its unit, e.g. "2.5 bar" (units: Pa, hPa, kPa, MPa, mbar, bar, psi, psf, atm, inHg, mmHg, torr)`}},
		{"water_too_fast.toml", []string{
			`water_too_fast.toml:5: facility[1].speed_range high: found "150 m/s", expected a water speed up to 100 m/s`}},
		{"wrong_type.toml", []string{
			`wrong_type.toml:8: facility[1].condensation_check: found "yes", expected true or false, without quotes`}},
		{"zero_scale.toml", []string{
			`zero_scale.toml:12: facility[1].model.scale: found "0", expected a model scale above 0 and at most 10`}},
		{"zero_width.toml", []string{
			`zero_width.toml:8: facility[1].section_width: found "0 m", expected a length above 0 m`}},
		{"limits_exclude_all.toml", []string{
			`limits_exclude_all.toml:16: limits: found limit lines that exclude every grid point of the envelope, expected limits that leave part of the envelope inside`}},
		{"grid_misses_envelope.toml", []string{
			`grid_misses_envelope.toml:17: grid: found no grid point inside the envelope boundary (40 × 60 points), expected grid axes that overlap the envelope, with steps fine enough to put points inside it`}},
		{"escape_in_name.toml", []string{
			`escape_in_name.toml:3: vehicle.name: found "Test glider\x1b[2J" (control character U+001B), expected the vehicle's name in quotes, ` + printableOnly}},
		{"c1_in_reference_length_is.toml", []string{
			`c1_in_reference_length_is.toml:5: vehicle.reference_length_is: found "chord\u009b31m" (control character U+009B), expected what the reference length is, in quotes, e.g. "mean aerodynamic chord", ` + printableOnly}},
		{"newline_in_facility_name.toml", []string{
			`newline_in_facility_name.toml:3: facility[1].name: found "Test tunnel\r\nfull match" (control character U+000D), expected the facility's name in quotes, ` + printableOnly}},
		{"bidi_in_class.toml", []string{
			`bidi_in_class.toml:4: facility[1].class: found "atmospheric \u202ehctam lluf" (bidirectional-text control U+202E), expected a short description in quotes, e.g. "pressurized transonic", ` + printableOnly}},
		{"load_coefficient_negative.toml", []string{
			`load_coefficient_negative.toml:8: vehicle.max_normal_coefficient: found -1.2, expected a load coefficient above 0 and at most 50`}},
		{"load_coefficient_zero.toml", []string{
			`load_coefficient_zero.toml:9: vehicle.max_pitching_moment_coefficient: found 0, expected a load coefficient above 0 and at most 50`}},
		{"load_coefficient_absurd.toml", []string{
			`load_coefficient_absurd.toml:8: vehicle.max_normal_coefficient: found "80", expected a load coefficient above 0 and at most 50`}},
		{"load_area_alone.toml", []string{
			`load_area_alone.toml:8: vehicle.load_reference_area: found a load area with no coefficient, expected the largest normal-force or pitching-moment coefficient it goes with`}},
		{"balance_force_zero.toml", []string{
			`balance_force_zero.toml:11: facility[1].balance_max_normal_force: found "0 N", expected a force above 0 and at most 10000 kN`}},
		{"balance_force_negative.toml", []string{
			`balance_force_negative.toml:11: facility[1].balance_max_normal_force: found "-4 kN", expected a force above 0 and at most 10000 kN`}},
		{"balance_force_absurd.toml", []string{
			`balance_force_absurd.toml:11: facility[1].balance_max_normal_force: found "20000 kN", expected a force above 0 and at most 10000 kN`}},
		{"balance_moment_as_force.toml", []string{
			`balance_moment_as_force.toml:12: facility[1].balance_max_pitching_moment: found "600 N" ("N" is a force unit), expected a moment with its unit, e.g. "600 N·m" (units: N·m, kN·m, lbf·ft, lbf·in)`}},
		{"rule_unknown.toml", []string{
			`rule_unknown.toml:11: facility[1].operating_rule: found "coldest", expected an operating rule: "warmest", "least load", "fixed temperature" or "fixed q"`}},
		{"rule_unknown_water.toml", []string{
			`rule_unknown_water.toml:10: facility[1].operating_rule: found "slowest", expected an operating rule: "warmest" or "fixed temperature"`}},
		{"least_load_no_balance.toml", []string{
			`least_load_no_balance.toml:11: facility[1].operating_rule: found "least load" with no balance capacity, expected balance_max_normal_force or balance_max_pitching_moment to plan the load against, or another rule: "warmest", "fixed temperature" or "fixed q"`}},
		{"gas_rule_on_water.toml", []string{
			`gas_rule_on_water.toml:10: facility[1].operating_rule: found "fixed q" on a water tunnel, expected a water tunnel's rule: "warmest" or "fixed temperature" (the warmest water already needs the least speed and load)`}},
		{"rule_temperature_out_of_range.toml", []string{
			`rule_temperature_out_of_range.toml:12: facility[1].rule_temperature: found "-40 degC", expected a temperature within the facility's range, 280 K to 320 K`}},
		{"rule_temperature_condensing.toml", []string{
			`rule_temperature_condensing.toml:12: facility[1].rule_temperature: found "85 K", expected a T0 of at least 88.1278 K: colder, the test section condenses even at the facility's lowest p0 and Mach number`}},
		{"rule_q_above_q_max.toml", []string{
			`rule_q_above_q_max.toml:12: facility[1].rule_q: found "120 kPa", expected a dynamic pressure above 0 and at most the facility's q max, 90000 Pa`}},
		{"rule_value_without_rule.toml", []string{
			`rule_value_without_rule.toml:12: facility[1].rule_temperature: found rule_temperature with operating_rule "warmest", expected operating_rule = "fixed temperature" to hold it, or no rule_temperature`}},
		{"rule_q_without_rule.toml", []string{
			`rule_q_without_rule.toml:11: facility[1].rule_q: found rule_q with no operating_rule, expected operating_rule = "fixed q" to hold it, or no rule_q`}},
		{"rule_temperature_missing.toml", []string{
			`rule_temperature_missing.toml:2: facility[1].rule_temperature: missing, expected the T0 the "fixed temperature" rule holds, a temperature with its unit, e.g. "-20 degC" (units: K, degC, degF, degR)`}},
		// q/p0 = ½γM²(1 + (γ−1)M²/2)^(−γ/(γ−1)) = 0.0155044 at Mach 0.15 (γ = 1.4; the
		// isentropic relations of NACA Report 1135): 1 bar gives 1550.44 Pa.
		{"rule_q_unreachable.toml", []string{
			`rule_q_unreachable.toml:12: facility[1].rule_q: found "1 kPa", expected a dynamic pressure the facility runs, 1550.44 Pa (its lowest p0 at an end of its Mach range) to 134098 Pa (its highest p0)`}},
		{"campaign_negative_time.toml", []string{
			`campaign_negative_time.toml:14: facility[1].campaign.p0_change_time: found "-5 min", expected a time from 0 s to 1000 h`}},
		{"campaign_storage_below_p0.toml", []string{
			`campaign_storage_below_p0.toml:14: facility[1].campaign.storage_pressure: found "3 bar", expected a storage pressure at least the facility's highest p0, 400000 Pa`}},
		{"campaign_cost_no_unit.toml", []string{
			`campaign_cost_no_unit.toml:13: facility[1].campaign.occupancy_cost: found "2400" (missing currency and unit), expected a cost per hour with its currency, e.g. "2400 EUR/h" (per: s, min, h)`}},
		{"campaign_cost_wrong_unit.toml", []string{
			`campaign_cost_wrong_unit.toml:13: facility[1].campaign.occupancy_cost: found "2400 EUR/kg" ("kg" is a mass unit), expected a cost per hour with its currency, e.g. "2400 EUR/h" (per: s, min, h)`}},
		{"campaign_cost_no_per.toml", []string{
			`campaign_cost_no_per.toml:13: facility[1].campaign.occupancy_cost: found "2400 EUR" (missing the unit it is per hour, e.g. /h), expected a cost per hour with its currency, e.g. "2400 EUR/h" (per: s, min, h)`,
			`campaign_cost_no_per.toml:15: facility[1].campaign.coolant_price: found 0.15 (a number without its unit), expected a price per mass with its currency, e.g. "0.15 EUR/kg" (per: kg, g, t, lb), in quotes`}},
		{"campaign_storage_partial.toml", []string{
			`campaign_storage_partial.toml:12: facility[1].campaign.usable_pressure_ratio: missing, expected the blowdown storage in full: storage_volume, storage_pressure, usable_pressure_ratio, recharge_time together (or none of them)`,
			`campaign_storage_partial.toml:12: facility[1].campaign.recharge_time: missing, expected the blowdown storage in full: storage_volume, storage_pressure, usable_pressure_ratio, recharge_time together (or none of them)`}},
		{"campaign_currency_mixed.toml", []string{
			`campaign_currency_mixed.toml:15: facility[1].campaign.coolant_price: found "0.15 USD/kg", expected a price in EUR, the currency of occupancy_cost`}},
		{"campaign_storage_on_water.toml", []string{
			`campaign_storage_on_water.toml:13: facility[1].campaign.storage_volume: found storage_volume on a water facility, expected no storage_volume (blowdown storage and coolant apply to air and nitrogen facilities)`}},
		{"many_faults.toml", []string{
			`many_faults.toml:6: facility[1].stagnation_pressure_range high: found "4.5 psx" (unknown pressure unit "psx"), expected a pressure with its unit, e.g. "2.5 bar" (units: Pa, hPa, kPa, MPa, mbar, bar, psi, psf, atm, inHg, mmHg, torr)`,
			`many_faults.toml:9: facility[1].section_height: found "-2 m", expected a length above 0 m`,
			`many_faults.toml:10: facility[1].colour: found unknown key "colour", expected one of: name, class, medium, mach_range, speed_range, stagnation_pressure_range, static_pressure_range, stagnation_temperature_range, water_temperature_range, max_dynamic_pressure, min_static_temperature, condensation_check, peak_local_mach, max_reynolds_per_metre, section_width, section_height, balance_max_normal_force, balance_max_pitching_moment, operating_rule, rule_temperature, rule_q, model, campaign`,
			`many_faults.toml:12: facility[2].section_height: missing, expected a length with its unit, e.g. "1.2 m" ` + lengthUnits,
			`many_faults.toml:15: facility[2].speed_range: found ["10 m/s", "1 m/s"] (low above high), expected the low value first`,
			`many_faults.toml:17: facility[2].water_temperature_range low: found "-5 degC", expected a water temperature from 0 degC to 100 degC`,
			`many_faults.toml:21: facility[2].model.scale: found "1/0" (division by zero), expected a number, fraction or percentage, e.g. "0.025", "1/40" or "2.5 %"`,
			`many_faults.toml:22: facility[2].model.max_blockage: found "70 %", expected a share of the section area above 0 and at most 0.5 (50 %)`}},
	}
	covered := map[string]bool{}
	for _, tt := range tests {
		covered[tt.file] = true
		t.Run(tt.file, func(t *testing.T) {
			dir := filepath.Join("..", "testdata", "bad")
			errs := Check(filepath.Join(dir, tt.file))
			var got []string
			for _, e := range errs {
				got = append(got, strings.TrimPrefix(e.Error(), dir+string(filepath.Separator)))
			}
			if !reflect.DeepEqual(got, tt.want) {
				t.Errorf("Check(%s) =\n  %s\nwant\n  %s", tt.file, strings.Join(got, "\n  "), strings.Join(tt.want, "\n  "))
			}
		})
	}
	files, err := filepath.Glob(filepath.Join("..", "testdata", "bad", "*.toml"))
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range files {
		if !covered[filepath.Base(f)] {
			t.Errorf("testdata/bad/%s has no case in TestBadFiles", filepath.Base(f))
		}
	}
}

// TestBadFilesSayTheirFault: every file of testdata/bad opens with a
// "# fault:" comment saying what is wrong with it (many_faults.toml with
// "# faults:"), so a reader of the folder knows what each one tests.
func TestBadFilesSayTheirFault(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("..", "testdata", "bad", "*.toml"))
	if err != nil || len(files) < 30 {
		t.Fatalf("testdata/bad: %d files, %v; want at least 30", len(files), err)
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		first, _, _ := strings.Cut(string(data), "\n")
		if !strings.HasPrefix(first, "# fault: ") && !strings.HasPrefix(first, "# faults: ") {
			t.Errorf("%s starts %q, want a \"# fault: ...\" comment", filepath.Base(f), first)
		}
	}
}

// TestErrorsAreFileErrors checks the error types the loaders return.
func TestErrorsAreFileErrors(t *testing.T) {
	_, err := LoadFacilities(filepath.Join("..", "testdata", "bad", "many_faults.toml"))
	var fe *FileErrors
	if !errors.As(err, &fe) {
		t.Fatalf("LoadFacilities error %T, want *FileErrors", err)
	}
	if len(*fe) != 8 {
		t.Errorf("len(FileErrors) = %d, want 8 (all faults at once)", len(*fe))
	}
	var one FileError
	if !errors.As(err, &one) || one.Line != 6 {
		t.Errorf("errors.As(FileError) = %+v, want the first problem, line 6", one)
	}
	if !strings.Contains(err.Error(), "\n") {
		t.Errorf("FileErrors.Error() = %q, want one line per problem", err.Error())
	}
	if _, err := LoadVehicle(filepath.Join("..", "testdata", "no-such-file.toml")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("LoadVehicle(missing file) = %v, want an error wrapping os.ErrNotExist", err)
	}
}

func TestFileErrorText(t *testing.T) {
	tests := []struct {
		e    FileError
		want string
	}{
		{FileError{"a.toml", 3, "vehicle.span", `"24"`, "a length"}, `a.toml:3: vehicle.span: found "24", expected a length`},
		{FileError{"a.toml", 2, "vehicle.name", "", "a name"}, `a.toml:2: vehicle.name: missing, expected a name`},
		{FileError{"a.toml", 0, "facility name", `"X"`, "a new name"}, `a.toml: facility name: found "X", expected a new name`},
		{FileError{"a.toml", 1, "", "nothing", "a table"}, `a.toml:1: found nothing, expected a table`},
	}
	for _, tt := range tests {
		if got := tt.e.Error(); got != tt.want {
			t.Errorf("FileError.Error() = %q, want %q", got, tt.want)
		}
	}
}

func TestBoundaryGeometry(t *testing.T) {
	const head = "[vehicle]\nname = \"g\"\nreference_length = \"1 m\"\nreference_area = \"1 m2\"\nspan = \"1 m\"\nfrontal_area = \"1 m2\"\n[envelope]\nspeed_kind = \"Mach\"\nboundary = [\n"
	tests := []struct {
		name   string
		points string
		ok     bool
		n      int // vertices kept when ok
	}{
		{"counter-clockwise square", `["0 m","0.2"],["0 m","0.8"],["10 km","0.8"],["10 km","0.2"]`, true, 4},
		{"clockwise square", `["0 m","0.2"],["10 km","0.2"],["10 km","0.8"],["0 m","0.8"]`, true, 4},
		{"closed by repeating the first point", `["0 m","0.2"],["0 m","0.8"],["10 km","0.8"],["0 m","0.2"]`, true, 3},
		{"concave", `["0 m","0.2"],["0 m","0.8"],["5 km","0.4"],["10 km","0.8"],["10 km","0.2"]`, true, 5},
		{"two points", `["0 m","0.2"],["10 km","0.8"]`, false, 0},
		{"bow tie", `["0 m","0.2"],["10 km","0.8"],["10 km","0.2"],["0 m","0.8"]`, false, 0},
		{"folds back on an edge", `["0 m","0.2"],["0 m","0.8"],["0 m","0.5"],["10 km","0.5"]`, false, 0},
		{"vertex touching an edge", `["0 m","0.2"],["0 m","0.8"],["10 km","0.8"],["0 m","0.5"],["10 km","0.2"]`, false, 0},
		{"all at one altitude", `["0 m","0.2"],["0 m","0.8"],["0 m","0.5"]`, false, 0},
		{"not a pair", `["0 m","0.2"],["0 m"],["10 km","0.8"]`, false, 0},
		{"negative Mach", `["0 m","-0.2"],["0 m","0.8"],["10 km","0.8"]`, false, 0},
	}
	for _, tt := range tests {
		v, err := ParseVehicle("g.toml", []byte(head+tt.points+"\n]\n"))
		if tt.ok && err != nil {
			t.Errorf("%s: ParseVehicle = %v, want no error", tt.name, err)
		}
		if !tt.ok && err == nil {
			t.Errorf("%s: ParseVehicle = no error, want a boundary error", tt.name)
		}
		if tt.ok && err == nil && len(v.Boundary) != tt.n {
			t.Errorf("%s: %d vertices, want %d", tt.name, len(v.Boundary), tt.n)
		}
	}
}

// TestCASTooHigh checks that a CAS beyond what the air can give at the
// vertex altitude is refused. At 80 km the standard static pressure is
// about 1.05 Pa (U.S. Standard Atmosphere 1976, Table I), so a CAS of
// 400 kt (impact pressure ≈ 27 kPa at sea level) needs a Mach number far
// beyond 30.
func TestCASTooHigh(t *testing.T) {
	src := edit(t, edit(t, baseVehicle, `"EAS"`, `"CAS"`), `["40000 ft", "50 kt"]`, `["80 km", "400 kt"]`)
	src = edit(t, src, `ceiling = "40000 ft"`, ``)
	_, err := ParseVehicle("v.toml", []byte(src))
	if err == nil || !strings.Contains(err.Error(), "envelope.boundary point 4: found") {
		t.Errorf("ParseVehicle(CAS 400 kt at 80 km) = %v, want an error at boundary point 4", err)
	}
}

func TestGridDefaults(t *testing.T) {
	src := edit(t, baseVehicle, "[grid.altitude]\nstep = \"1000 ft\"\n", "")
	src = edit(t, src, `ceiling = "40000 ft"`, `ceiling = "35000 ft"`)
	v, err := ParseVehicle("v.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	g := v.Grid
	kt := 1852.0 / 3600
	if g.SpeedKind != atmos.EAS {
		t.Errorf("grid speed kind = %v, want the boundary's EAS", g.SpeedKind)
	}
	// Altitude: boundary box 0..40000 ft narrowed by the 35000 ft ceiling.
	if g.Altitude != (Axis{Min: 0, Max: 35000 * 0.3048, Count: DefaultAltitudeRows}) {
		t.Errorf("altitude axis = %+v, want 0 to 35000 ft, %d rows", g.Altitude, DefaultAltitudeRows)
	}
	if !near(g.Speed.Min, 40*kt, unitTol) || !near(g.Speed.Max, 120*kt, unitTol) || g.Speed.Count != DefaultSpeedColumns {
		t.Errorf("speed axis = %+v, want 40 kt to 120 kt, %d columns", g.Speed, DefaultSpeedColumns)
	}
}

// TestGridInOtherKind checks the default speed axis when the grid is in
// Mach number and the boundary in EAS: its ends must be the extreme Mach
// numbers on the boundary, found here independently by sampling every
// edge finely with Mach = EAS/(a·sqrt(ρ/ρ0)) from the atmos package.
func TestGridInOtherKind(t *testing.T) {
	const tol = 1e-3 // relative; the loader samples each edge 16 times
	src := edit(t, baseVehicle, "[grid.altitude]", "[grid]\nspeed_kind = \"Mach\"\n\n[grid.altitude]")
	src = edit(t, src, `max_mach = "0.6"`, ``)
	v, err := ParseVehicle("v.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	n := len(v.Boundary)
	for i := range v.Boundary {
		a, b := v.Boundary[i], v.Boundary[(i+1)%n]
		for k := 0; k <= 2000; k++ {
			f := float64(k) / 2000
			s, err := atmos.At(a.Altitude + f*(b.Altitude-a.Altitude))
			if err != nil {
				t.Fatal(err)
			}
			m := atmos.MachFromEAS(a.Speed+f*(b.Speed-a.Speed), s)
			lo, hi = math.Min(lo, m), math.Max(hi, m)
		}
	}
	if !near(v.Grid.Speed.Min, lo, tol) || !near(v.Grid.Speed.Max, hi, tol) {
		t.Errorf("Mach axis = %g to %g, want %g to %g", v.Grid.Speed.Min, v.Grid.Speed.Max, lo, hi)
	}
}

func TestGridGiven(t *testing.T) {
	src := baseVehicle + "\n[grid.speed]\nfrom = \"50 kt\"\nto = \"110 kt\"\ncount = 13\n"
	src = edit(t, src, "[grid.altitude]\nstep = \"1000 ft\"", "[grid.altitude]\nfrom = \"1 km\"\nto = \"11 km\"\nstep = \"250 m\"")
	v, err := ParseVehicle("v.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	kt := 1852.0 / 3600
	if v.Grid.Altitude != (Axis{Min: 1000, Max: 11000, Step: 250}) {
		t.Errorf("altitude axis = %+v, want 1 km to 11 km by 250 m", v.Grid.Altitude)
	}
	if !near(v.Grid.Speed.Min, 50*kt, unitTol) || !near(v.Grid.Speed.Max, 110*kt, unitTol) || v.Grid.Speed.Count != 13 {
		t.Errorf("speed axis = %+v, want 50 kt to 110 kt, 13 points", v.Grid.Speed)
	}
	for _, bad := range []string{"count = 1001", "count = 1", "count = \"13\"", "to = \"40 kt\""} {
		src := edit(t, src, "count = 13", bad)
		if _, err := ParseVehicle("v.toml", []byte(src)); err == nil {
			t.Errorf("grid speed %s: no error, want one", bad)
		}
	}
}

func TestAltitudeKinds(t *testing.T) {
	for _, tt := range []struct {
		kind string
		want atmos.AltitudeKind
	}{{"geometric", atmos.Geometric}, {"geopotential", atmos.Geopotential}, {"pressure", atmos.PressureAlt}} {
		src := edit(t, baseVehicle, `speed_kind = "EAS"`, "speed_kind = \"EAS\"\naltitude_kind = \""+tt.kind+"\"")
		v, err := ParseVehicle("v.toml", []byte(src))
		if err != nil {
			t.Fatalf("altitude_kind %s: %v", tt.kind, err)
		}
		if v.AltitudeKind != tt.want {
			t.Errorf("altitude_kind %s = %v, want %v", tt.kind, v.AltitudeKind, tt.want)
		}
	}
	// 85 km is inside the geometric range but above the geopotential top
	// of the standard (84852 m', U.S. Standard Atmosphere 1976, Table 4).
	src := edit(t, baseVehicle, `speed_kind = "EAS"`, "speed_kind = \"EAS\"\naltitude_kind = \"geopotential\"")
	src = edit(t, src, `["40000 ft", "50 kt"]`, `["85 km", "50 kt"]`)
	src = edit(t, src, `ceiling = "40000 ft"`, ``)
	if _, err := ParseVehicle("v.toml", []byte(src)); err == nil || !strings.Contains(err.Error(), "geopotential altitude from -5004 m to 84852 m") {
		t.Errorf("geopotential 85 km: %v, want a range error naming -5004 m to 84852 m", err)
	}
}

func TestUnknownKeyInEveryTable(t *testing.T) {
	tests := []struct{ base, old, new, field string }{
		{baseVehicle, "[vehicle]\n", "[vehicle]\nwingspan = \"3 m\"\n", "vehicle.wingspan"},
		{baseVehicle, "[envelope]\n", "[envelope]\nkind = \"EAS\"\n", "envelope.kind"},
		{baseVehicle, "[limits]\n", "[limits]\nmax_g = \"9\"\n", "limits.max_g"},
		{baseVehicle, "[grid.altitude]\n", "[grid.altitude]\nrows = 3\n", "grid.altitude.rows"},
		{baseVehicle, "[vehicle]\n", "[weather]\nwind = \"3 m/s\"\n[vehicle]\n", "weather"},
		{baseFacility, "medium", "Medium = \"air\"\nmedium", "facility[1].Medium"},
		{baseFacility + "[facility.model]\nsize = 1\n", "", "", "facility[1].model.size"},
	}
	for _, tt := range tests {
		src := tt.base
		if tt.old != "" {
			src = edit(t, src, tt.old, tt.new)
		}
		var err error
		if strings.Contains(src, "[[facility]]") {
			_, err = ParseFacilities("x.toml", []byte(src))
		} else {
			_, err = ParseVehicle("x.toml", []byte(src))
		}
		if err == nil || !strings.Contains(err.Error(), tt.field+": found unknown key") {
			t.Errorf("unknown key %s: error %v", tt.field, err)
		}
	}
}

func TestWaterKeysOnGas(t *testing.T) {
	src := edit(t, baseFacility, "section_width", "speed_range = [\"1 m/s\", \"2 m/s\"]\nsection_width")
	_, err := ParseFacilities("f.toml", []byte(src))
	want := "f.toml:7: facility[1].speed_range: found speed_range on an air facility, expected mach_range instead"
	if err == nil || err.Error() != want {
		t.Errorf("speed_range on air: %v, want %s", err, want)
	}
	src = edit(t, baseWater, "section_width", "condensation_check = true\nsection_width")
	_, err = ParseFacilities("f.toml", []byte(src))
	if err == nil || !strings.Contains(err.Error(), "condensation_check on a water facility") {
		t.Errorf("condensation_check on water: %v", err)
	}
}

func TestCheckDuplicateNamesAcrossFiles(t *testing.T) {
	facs := []Facility{{Name: "Tunnel A", Source: "a.toml"}, {Name: "Tunnel B", Source: "a.toml"}, {Name: "tunnel a ", Source: "b.toml"}}
	err := CheckDuplicateNames(facs)
	want := `b.toml: facility name: found "tunnel a ", expected a name not already used (facility "Tunnel A" in a.toml has it)`
	if err == nil || err.Error() != want {
		t.Errorf("CheckDuplicateNames = %v, want %s", err, want)
	}
	if err := CheckDuplicateNames(facs[:2]); err != nil {
		t.Errorf("CheckDuplicateNames(distinct) = %v, want nil", err)
	}
}

func TestCheck(t *testing.T) {
	examples, err := filepath.Glob(filepath.Join("..", "testdata", "*.toml"))
	if err != nil || len(examples) < 3 {
		t.Fatalf("example files: %v %v", examples, err)
	}
	if errs := Check(examples...); len(errs) != 0 {
		t.Errorf("Check(examples) = %v, want no errors", errs)
	}
	// The example facility file twice: every name is repeated.
	fac := filepath.Join("..", "testdata", "facilities.toml")
	if errs := Check(fac, fac); len(errs) != 6 {
		t.Errorf("Check(same facility file twice) gave %d errors, want 6 repeated names", len(errs))
	}
	dir := t.TempDir()
	empty := filepath.Join(dir, "empty.toml")
	if err := os.WriteFile(empty, []byte("# nothing\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	errs := Check(empty, filepath.Join(dir, "absent.toml"))
	if len(errs) != 2 || !strings.Contains(errs[0].Error(), "neither [vehicle] nor [[facility]]") {
		t.Errorf("Check(empty, absent) = %v", errs)
	}
}

func TestDemo(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	if v.Name != "Corvane SX-3 supersonic research aircraft" || v.Source != "" {
		t.Errorf("Demo vehicle = %q (source %q), want the Corvane SX-3, built in", v.Name, v.Source)
	}
	// 70000 ft = 21336 m exactly (1 ft = 0.3048 m); 1500 lbf/ft² =
	// 71820.39 Pa (NIST SP 811, Appendix B.8: 47.88026 Pa per lbf/ft²).
	if v.Limits.Ceiling != 21336 || !near(v.Limits.MaxQ, 71820.388, 1e-7) {
		t.Errorf("Demo limits = %+v", v.Limits)
	}
	if len(facs) < 6 {
		t.Fatalf("Demo has %d facilities, want at least 6", len(facs))
	}
	media := map[Medium]int{}
	for _, f := range facs {
		media[f.Medium]++
		if f.Source != "" {
			t.Errorf("%s: Source %q, want empty for built-in data", f.Name, f.Source)
		}
	}
	if media["air"] < 3 || media["nitrogen"] < 1 || media[MediumWater] < 1 {
		t.Errorf("demo media = %v, want air, nitrogen and water facilities", media)
	}
	if err := CheckDuplicateNames(facs); err != nil {
		t.Error(err)
	}
	vs, err := DemoVehicles()
	if err != nil {
		t.Fatal(err)
	}
	if len(vs) != 2 || vs[0].Name != v.Name {
		t.Errorf("DemoVehicles = %d vehicles, first %q; want 2, the default first", len(vs), vs[0].Name)
	}
}

// TestDemoMatchesTestdata checks that the example files users copy are the
// embedded demo, byte for byte.
func TestDemoMatchesTestdata(t *testing.T) {
	entries, err := os.ReadDir("demo")
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		embedded, err := demoFiles.ReadFile("demo/" + e.Name())
		if err != nil {
			t.Fatal(err)
		}
		example, err := os.ReadFile(filepath.Join("..", "testdata", e.Name()))
		if err != nil {
			t.Errorf("testdata/%s: %v (copy envelope/demo/%[1]s there)", e.Name(), err)
			continue
		}
		if !bytes.Equal(embedded, example) {
			t.Errorf("testdata/%s differs from envelope/demo/%[1]s", e.Name())
		}
	}
}

// TestRoundTrip writes every demo file back out and reads it again: the
// vehicles and facilities must come back identical.
func TestRoundTrip(t *testing.T) {
	vs, err := DemoVehicles()
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range vs {
		text := MarshalVehicle(v)
		back, err := ParseVehicle("round.toml", text)
		if err != nil {
			t.Fatalf("%s: reading back: %v\n%s", v.Name, err, text)
		}
		back.Source = ""
		if !reflect.DeepEqual(back, v) {
			t.Errorf("%s: round trip\n got %+v\nwant %+v", v.Name, *back, *v)
		}
	}
	_, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	text := MarshalFacilities(facs)
	back, err := ParseFacilities("round.toml", text)
	if err != nil {
		t.Fatalf("facilities: reading back: %v\n%s", err, text)
	}
	for i := range back {
		back[i].Source = ""
	}
	if !reflect.DeepEqual(back, facs) {
		t.Errorf("facilities: round trip\n got %+v\nwant %+v", back, facs)
	}
	// Names with quotes and backslashes survive.
	odd := []Facility{facs[0]}
	odd[0].Name = `Tunnel "7" \ east`
	back, err = ParseFacilities("odd.toml", MarshalFacilities(odd))
	if err != nil || back[0].Name != odd[0].Name {
		t.Errorf("odd name round trip = %v, %v", back, err)
	}
}

func TestDefaultSettings(t *testing.T) {
	v := &Vehicle{DeltaT: 12}
	s := DefaultSettings(v)
	want := Settings{DeltaT: 12, MachTol: 0.01, ReTol: 0.10, CompressibilityMach: 0.3, Regimes: atmos.DefaultRegimes()}
	if s != want {
		t.Errorf("DefaultSettings = %+v, want %+v", s, want)
	}
	if DefaultSettings(nil).DeltaT != 0 {
		t.Errorf("DefaultSettings(nil).DeltaT != 0")
	}
}

func TestLineIndex(t *testing.T) {
	src := `# comment
title = """
multi
line"""
[[facility]]
name = 'one' # trailing
range = [
  "a",   # first
  ["b", "c"],
]
[facility.model]
scale = 1
[[facility]]
inline = { a = 1, b.c = "x" }
[facility.model]
"quoted key" = 2
[x.y]
z = 3
`
	idx := indexLines(src)
	for path, want := range map[string]int{
		"title":                        2,
		"facility":                     5,
		"facility[0]":                  5,
		"facility[0].name":             6,
		"facility[0].range":            7,
		"facility[0].range[0]":         8,
		"facility[0].range[1]":         9,
		"facility[0].range[1][1]":      9,
		"facility[0].model":            11,
		"facility[0].model.scale":      12,
		"facility[1]":                  13,
		"facility[1].inline.b.c":       14,
		"facility[1].model":            15,
		"facility[1].model.quoted key": 16,
		"x.y.z":                        18,
		"facility[1].missing":          13,
		"nowhere":                      0,
	} {
		if got := idx.line(path); got != want {
			t.Errorf("line(%q) = %d, want %d", path, got, want)
		}
	}
}

// TestLineIndexAnyText: the position scan ends without panicking on text
// the decoder would refuse too (it runs only after decoding, but says it
// never panics): a header bracket at the very end, and the example, demo
// and small bad files cut after each bracket, quote and line end.
func TestLineIndexAnyText(t *testing.T) {
	texts := []string{"[", "[[", "a = 1\n[", "[x]\n[[", "[[ ", "[\n"}
	for _, pattern := range []string{"demo/*.toml", "../testdata/*.toml", "../testdata/bad/*.toml"} {
		files, _ := filepath.Glob(pattern)
		for _, f := range files {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			if len(data) > 8<<10 {
				continue
			}
			for n, b := range data {
				if strings.IndexByte("[]{}\"'\n=", b) >= 0 {
					texts = append(texts, string(data[:n+1]))
				}
			}
		}
	}
	for _, src := range texts {
		func() {
			defer func() {
				if r := recover(); r != nil {
					t.Errorf("indexLines(%.40q) panicked: %v", src, r)
				}
			}()
			indexLines(src)
		}()
	}
}

func BenchmarkParseVehicle(b *testing.B) {
	data, err := demoFiles.ReadFile("demo/" + demoDefaultVehicle)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := ParseVehicle("demo.toml", data); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkParseFacilities(b *testing.B) {
	data, err := demoFiles.ReadFile("demo/" + demoFacilityFile)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := ParseFacilities("demo.toml", data); err != nil {
			b.Fatal(err)
		}
	}
}
