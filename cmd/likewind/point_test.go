package main

import (
	"bytes"
	"encoding/json"
	"math"
	"sort"
	"strings"
	"testing"
)

// pointKeys are the keys `point --json` must print, exactly (README).
var pointKeys = []string{
	"altitude_m", "geopotential_altitude_m", "pressure_altitude_m", "temperature_k", "pressure_pa", "density_kg_m3",
	"speed_of_sound_m_s", "dynamic_viscosity_pa_s", "kinematic_viscosity_m2_s", "mean_free_path_m",
	"mach", "tas_m_s", "eas_m_s", "cas_m_s", "dynamic_pressure_pa", "reynolds", "reynolds_per_m",
	"knudsen", "regime", "continuum",
}

func runCmd(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = run(args, strings.NewReader(""), &out, &errb)
	return code, out.String(), errb.String()
}

func TestPointJSONKeysAndValues(t *testing.T) {
	code, out, errs := runCmd("point", "--alt", "11km", "--mach", "0.8", "--length", "3.5m", "--json")
	if code != 0 {
		t.Fatalf("point exit = %d, want 0; stderr: %s", code, errs)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("point --json output is not JSON: %v\n%s", err, out)
	}
	var got []string
	for k := range m {
		got = append(got, k)
	}
	sort.Strings(got)
	want := append([]string(nil), pointKeys...)
	sort.Strings(want)
	if strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("point --json keys = %v, want %v", got, want)
	}

	// Reference values: U.S. Standard Atmosphere 1976, Table I, at 11 000 m
	// geometric: T = 216.774 K, p = 2.2700e4 Pa, rho = 0.36480 kg/m3,
	// a = 295.154 m/s (tables printed to 5–6 significant digits).
	const rel = 2e-4
	checks := []struct {
		key  string
		want float64
	}{
		{"temperature_k", 216.774},
		{"pressure_pa", 22700},
		{"density_kg_m3", 0.36480},
		{"speed_of_sound_m_s", 295.154},
		{"mach", 0.8},
		// TAS = M·a, q = ½γpM² (definitions).
		{"tas_m_s", 0.8 * 295.154},
		{"dynamic_pressure_pa", 0.5 * 1.4 * 22700 * 0.64},
	}
	for _, c := range checks {
		v, ok := m[c.key].(float64)
		if !ok {
			t.Errorf("point --json %s = %v, want a number", c.key, m[c.key])
			continue
		}
		if math.Abs(v-c.want) > rel*math.Abs(c.want) {
			t.Errorf("point --json %s = %g, want %g", c.key, v, c.want)
		}
	}
	re, rePerM := m["reynolds"].(float64), m["reynolds_per_m"].(float64)
	if math.Abs(re-3.5*rePerM) > 1e-9*re {
		t.Errorf("reynolds = %g, want 3.5 m × reynolds_per_m = %g", re, 3.5*rePerM)
	}
	if m["regime"] != "transonic" {
		t.Errorf("regime = %v, want transonic (M 0.8 is the lower transonic bound, common practice)", m["regime"])
	}
	if m["continuum"] != true {
		t.Errorf("continuum = %v, want true at 11 km with a 3.5 m length", m["continuum"])
	}
}

func TestPointTable(t *testing.T) {
	code, out, errs := runCmd("point", "--alt", "35000ft", "--cas", "250kt", "--dt", "10K")
	if code != 0 {
		t.Fatalf("point exit = %d, want 0; stderr: %s", code, errs)
	}
	for _, want := range []string{"Mach number", "Reynolds number per metre", "Knudsen number", "standard +10.0 K"} {
		if !strings.Contains(out, want) {
			t.Errorf("point table lacks %q:\n%s", want, out)
		}
	}
}

// The ends of the bounds are taken, as in the files.
func TestPointBoundsInclusive(t *testing.T) {
	for _, args := range [][]string{
		{"point", "--alt", "30km", "--mach", "30"},
		{"point", "--alt", "0m", "--mach", "0.5", "--dt", "-60K"},
		{"point", "--alt", "0m", "--mach", "0.5", "--dt", "108degF"},
		{"point", "--alt", "0m", "--mach", "0.5", "--length", "1000m"},
		{"point", "--alt", "0m", "--mach", "0.5", "--length", "0.001mm"},
	} {
		if code, _, errs := runCmd(args...); code != 0 {
			t.Errorf("%v: exit %d, stderr %q; want 0", args[1:], code, errs)
		}
	}
}

// No output of point shows a negative zero, in the table or the JSON.
func TestPointNoNegativeZero(t *testing.T) {
	for _, args := range [][]string{
		{"point", "--alt", "0m", "--mach", "-0"},
		{"point", "--alt", "-0m", "--tas", "-0m/s", "--dt", "-0K"},
		{"point", "--alt", "-0.01m", "--mach", "0.001", "--dt", "-0.01K"},
	} {
		for _, extra := range [][]string{nil, {"--json"}} {
			a := append(append([]string(nil), args...), extra...)
			code, out, errs := runCmd(a...)
			if code != 0 {
				t.Fatalf("%v: exit %d, stderr %q", a[1:], code, errs)
			}
			for _, line := range strings.Split(out, "\n") {
				for _, f := range strings.Fields(strings.NewReplacer(",", " ", ":", " ").Replace(line)) {
					if strings.HasPrefix(f, "-") && strings.Trim(f, "-0.") == "" {
						t.Errorf("%v: negative zero %q in line %q", a[1:], f, line)
					}
				}
			}
		}
	}
}

func TestPointBadInputExits2(t *testing.T) {
	cases := []struct {
		name string
		args []string
		want string // part of the message
	}{
		{"no altitude", []string{"point", "--mach", "0.8"}, "--alt"},
		{"no speed", []string{"point", "--alt", "11km"}, "--mach"},
		{"two speeds", []string{"point", "--alt", "11km", "--mach", "0.8", "--tas", "200m/s"}, "exactly one"},
		{"bad unit", []string{"point", "--alt", "11 furlongs", "--mach", "0.8"}, "--alt"},
		{"too high", []string{"point", "--alt", "90km", "--mach", "0.8"}, "point"},
		{"unknown flag", []string{"point", "--speed", "3"}, "speed"},
		{"zero length", []string{"point", "--alt", "1km", "--mach", "0.5", "--length", "0m"}, "--length"},
		{"huge length", []string{"point", "--alt", "1km", "--mach", "0.5", "--length", "1e308m"}, "--length"},
		{"tiny length", []string{"point", "--alt", "1km", "--mach", "0.5", "--length", "1e-320m"}, "--length"},
		{"absurd day", []string{"point", "--alt", "1km", "--mach", "0.5", "--dt", "1000K"}, "--dt"},
		{"negative speed", []string{"point", "--alt", "1km", "--tas", "-5m/s"}, "negative"},
		// The bounds of the vehicle files (envelope/bounds.go).
		{"Mach 71000", []string{"point", "--alt", "11km", "--mach", "71000"}, `--mach: found "71000", expected a Mach number from 0 to 30`},
		{"Mach above 30", []string{"point", "--alt", "11km", "--mach", "M30.5"}, "a Mach number from 0 to 30"},
		{"negative Mach", []string{"point", "--alt", "11km", "--mach", "-0.5"}, "a Mach number from 0 to 30"},
		{"speed of light", []string{"point", "--alt", "0m", "--tas", "299792458m/s"}, "--tas: found \"299792458m/s\", expected a TAS from 0 to 10000 m/s"},
		{"EAS above the bound", []string{"point", "--alt", "0m", "--eas", "20000kt"}, "an EAS from 0 to 10000 m/s"},
		{"CAS beyond Mach 30", []string{"point", "--alt", "80km", "--cas", "400kt"}, "--cas: found \"400kt\" (Mach 144.8 here), expected a Mach number from 0 to 30"},
		{"ΔT of 70 K", []string{"point", "--alt", "1km", "--mach", "0.5", "--dt", "70K"}, "--dt: found \"70K\", expected a temperature offset from the standard day within ±60 K"},
		{"ΔT of -110 degF", []string{"point", "--alt", "1km", "--mach", "0.5", "--dt", "-110degF"}, "within ±60 K"},
		{"length of 2 km", []string{"point", "--alt", "1km", "--mach", "0.5", "--length", "2km"}, "--length: found \"2km\", expected a length from 1 µm to 1000 m"},
		{"altitude of 95 km", []string{"point", "--alt", "95km", "--mach", "0.5"}, "--alt: found \"95km\", expected a geometric altitude from -5000 m to 86000 m"},
		{"geopotential of 85 km", []string{"point", "--geopotential", "85km", "--mach", "0.5"}, "expected a geopotential altitude from"},
	}
	for _, c := range cases {
		code, _, errs := runCmd(c.args...)
		if code != 2 {
			t.Errorf("%s: exit = %d, want 2 (stderr %q)", c.name, code, errs)
		}
		if !strings.Contains(errs, c.want) {
			t.Errorf("%s: stderr = %q, want it to mention %q", c.name, errs, c.want)
		}
	}
}

// TestPointPressureAltitude: --pressure-alt is the geopotential altitude of
// the standard pressure level, so the pressure at a printed pressure
// altitude is the level's pressure. Pressure-level table of the ICAO
// standard atmosphere (ICAO 1964) as printed at meteowvl.be (MetInfo,
// "The International Standard Atmosphere"): 100 hPa at 53 083 ft and
// 16 180 m, 200 hPa at 38 662 ft, 50 hPa at 67 507 ft.
func TestPointPressureAltitude(t *testing.T) {
	for _, c := range []struct {
		alt string
		hPa float64
	}{{"53083ft", 100}, {"16180m", 100}, {"38662ft", 200}, {"67507ft", 50}} {
		code, out, errs := runCmd("point", "--pressure-alt", c.alt, "--mach", "0.8", "--json")
		if code != 0 {
			t.Fatalf("point --pressure-alt %s: exit %d, stderr %s", c.alt, code, errs)
		}
		var m map[string]float64
		_ = json.Unmarshal([]byte(out), &m) // the non-numeric keys do not decode
		// Half a printed unit of height (0.5 m) moves p by at most 1e-4
		// relative at these levels (dp/p = g0 dH/(R T)).
		if got, want := m["pressure_pa"], 100*c.hPa; math.Abs(got-want) > 1e-4*want {
			t.Errorf("point --pressure-alt %s: pressure_pa = %.6g, want %g (ICAO pressure level)", c.alt, got, want)
		}
		if got := m["pressure_altitude_m"]; math.Abs(got-m["geopotential_altitude_m"]) > 1e-9 {
			t.Errorf("point --pressure-alt %s: pressure_altitude_m = %.9g, want the geopotential altitude %.9g",
				c.alt, got, m["geopotential_altitude_m"])
		}
	}
}
