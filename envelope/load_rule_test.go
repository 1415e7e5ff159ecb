package envelope

import (
	"reflect"
	"strings"
	"testing"
)

// TestLoadKeys reads the load keys of both formats in every unit they
// take. Factors: 1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N
// exactly, lbf·ft and lbf·in that times 0.3048 m and 0.0254 m exactly
// (NIST SP 811, Appendix B.8: 4.448 222 N, 1.355 818 N·m, 0.112 984 8 N·m,
// from memory), 1 ft² = 0.09290304 m² exactly.
func TestLoadKeys(t *testing.T) {
	const lbf = 0.45359237 * 9.80665
	vt := []struct {
		name, add string
		want      ModelLoads
	}{
		{"CN bare", "max_normal_coefficient = 1.2", ModelLoads{CNMax: 1.2}},
		{"CN quoted", `max_normal_coefficient = "1.2"`, ModelLoads{CNMax: 1.2}},
		{"Cm alone", "max_pitching_moment_coefficient = 0.35", ModelLoads{CmMax: 0.35}},
		{"both, area in ft2", "max_normal_coefficient = 1.5\nmax_pitching_moment_coefficient = 0.2\nload_reference_area = \"100 ft2\"",
			ModelLoads{CNMax: 1.5, CmMax: 0.2, Area: 100 * 0.09290304}},
	}
	for _, tt := range vt {
		t.Run("vehicle "+tt.name, func(t *testing.T) {
			v, err := ParseVehicle("v.toml", []byte(edit(t, baseVehicle, "frontal_area = \"0.6 m2\"\n", "frontal_area = \"0.6 m2\"\n"+tt.add+"\n")))
			if err != nil {
				t.Fatal(err)
			}
			if !nearLoads(v.Loads, tt.want) {
				t.Errorf("Loads = %+v, want %+v", v.Loads, tt.want)
			}
		})
	}
	ft := []struct {
		name, add string
		want      BalanceLimits
	}{
		{"force in N", `balance_max_normal_force = "4500 N"`, BalanceLimits{MaxNormalForce: 4500}},
		{"force in kN", `balance_max_normal_force = "4.5 kN"`, BalanceLimits{MaxNormalForce: 4500}},
		{"force in daN", `balance_max_normal_force = "450 daN"`, BalanceLimits{MaxNormalForce: 4500}},
		{"force in lbf", `balance_max_normal_force = "1000 lbf"`, BalanceLimits{MaxNormalForce: 1000 * lbf}},
		{"moment in N·m", `balance_max_pitching_moment = "600 N·m"`, BalanceLimits{MaxPitchMoment: 600}},
		{"moment in N m", `balance_max_pitching_moment = "600 N m"`, BalanceLimits{MaxPitchMoment: 600}},
		{"moment in Nm", `balance_max_pitching_moment = "600 Nm"`, BalanceLimits{MaxPitchMoment: 600}},
		{"moment in kN·m", `balance_max_pitching_moment = "0.6 kN·m"`, BalanceLimits{MaxPitchMoment: 600}},
		{"moment in lbf·ft", `balance_max_pitching_moment = "450 lbf·ft"`, BalanceLimits{MaxPitchMoment: 450 * lbf * 0.3048}},
		{"moment in ft·lbf", `balance_max_pitching_moment = "450 ft·lbf"`, BalanceLimits{MaxPitchMoment: 450 * lbf * 0.3048}},
		{"moment in lbf·in", `balance_max_pitching_moment = "5400 lbf·in"`, BalanceLimits{MaxPitchMoment: 450 * lbf * 0.3048}},
		{"moment in in-lbf", `balance_max_pitching_moment = "5400 in-lbf"`, BalanceLimits{MaxPitchMoment: 5400 * lbf * 0.0254}},
	}
	for _, tt := range ft {
		t.Run("facility "+tt.name, func(t *testing.T) {
			fs, err := ParseFacilities("f.toml", []byte(baseFacility+tt.add+"\n"))
			if err != nil {
				t.Fatal(err)
			}
			got := fs[0].Balance
			if !near(got.MaxNormalForce, tt.want.MaxNormalForce, unitTol) || !near(got.MaxPitchMoment, tt.want.MaxPitchMoment, unitTol) {
				t.Errorf("Balance = %+v, want %+v", got, tt.want)
			}
		})
	}
}

func nearLoads(a, b ModelLoads) bool {
	return near(a.CNMax, b.CNMax, unitTol) && near(a.CmMax, b.CmMax, unitTol) && near(a.Area, b.Area, unitTol)
}

// TestRuleKeys reads each operating rule a facility file can name, with
// the value a fixed rule holds.
func TestRuleKeys(t *testing.T) {
	const balance = "balance_max_normal_force = \"2 kN\"\n"
	tests := []struct {
		name, base, add string
		want            OperatingRule
	}{
		{"no rule", baseFacility, "", OperatingRule{}},
		{"warmest", baseFacility, `operating_rule = "warmest"`, OperatingRule{Kind: RuleWarmest}},
		{"least coolant", baseFacility, `operating_rule = "least coolant"`, OperatingRule{Kind: RuleWarmest}},
		{"least load", baseFacility, balance + `operating_rule = "least load"`, OperatingRule{Kind: RuleLeastLoad}},
		{"least-load, moment only", baseFacility, "balance_max_pitching_moment = \"300 N·m\"\noperating_rule = \"Least-Load\"", OperatingRule{Kind: RuleLeastLoad}},
		{"fixed temperature in K", baseFacility, "operating_rule = \"fixed temperature\"\nrule_temperature = \"300 K\"", OperatingRule{Kind: RuleFixedTemperature, Temperature: 300}},
		{"fixed T0 in degC", baseFacility, "operating_rule = \"fixed T0\"\nrule_temperature = \"20 degC\"", OperatingRule{Kind: RuleFixedTemperature, Temperature: 293.15}},
		{"fixed T0 at the range's end", baseFacility, "operating_rule = \"fixed_temperature\"\nrule_temperature = \"280 K\"", OperatingRule{Kind: RuleFixedTemperature, Temperature: 280}},
		{"fixed q in kPa", baseFacility, "operating_rule = \"fixed q\"\nrule_q = \"10 kPa\"", OperatingRule{Kind: RuleFixedQ, Q: 10e3}},
		{"fixed q in psf", baseFacility, "operating_rule = \"fixed dynamic pressure\"\nrule_q = \"200 psf\"", OperatingRule{Kind: RuleFixedQ, Q: 200 * 0.45359237 * 9.80665 / (0.3048 * 0.3048)}},
		{"water warmest", baseWater, `operating_rule = "warmest water"`, OperatingRule{Kind: RuleWarmest}},
		{"water fixed temperature", baseWater, "operating_rule = \"fixed water temperature\"\nrule_temperature = \"68 degF\"", OperatingRule{Kind: RuleFixedTemperature, Temperature: 293.15}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			fs, err := ParseFacilities("f.toml", []byte(tt.base+tt.add+"\n"))
			if err != nil {
				t.Fatal(err)
			}
			got := fs[0].Rule
			if got.Kind != tt.want.Kind || !near(got.Temperature, tt.want.Temperature, unitTol) || !near(got.Q, tt.want.Q, unitTol) {
				t.Errorf("Rule = %+v, want %+v", got, tt.want)
			}
			if err := CheckRule(got, &fs[0]); err != nil {
				t.Errorf("CheckRule of the rule read: %v", err)
			}
		})
	}
}

// TestRuleChecksNeedCleanLimits: a refused limit does not give the rule
// false reasons (a T0 range refused is no range to check rule_temperature
// against), and a refused balance capacity is not "no balance capacity".
func TestRuleChecksNeedCleanLimits(t *testing.T) {
	for _, c := range []struct{ name, src, want string }{
		{"T0 range refused", edit(t, baseFacility, `["280 K", "320 K"]`, `["280 K", "3200 K"]`) +
			"operating_rule = \"fixed temperature\"\nrule_temperature = \"300 K\"\n", "stagnation_temperature_range high"},
		{"balance refused", baseFacility + "balance_max_normal_force = \"-2 kN\"\noperating_rule = \"least load\"\n", "balance_max_normal_force"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseFacilities("f.toml", []byte(c.src))
			fe, ok := err.(*FileErrors)
			if !ok || len(*fe) != 1 || !strings.Contains((*fe)[0].Field, c.want) {
				t.Errorf("errors %v, want one, at %s", err, c.want)
			}
		})
	}
}

// TestLoadAndRuleRoundTrip: MarshalVehicle and MarshalFacilities write the
// load keys and every rule so that reading them back gives the same data.
func TestLoadAndRuleRoundTrip(t *testing.T) {
	v, err := ParseVehicle("v.toml", []byte(edit(t, baseVehicle, "frontal_area = \"0.6 m2\"\n",
		"frontal_area = \"0.6 m2\"\nmax_normal_coefficient = 1.25\nmax_pitching_moment_coefficient = 0.3\nload_reference_area = \"13 ft2\"\n")))
	if err != nil {
		t.Fatal(err)
	}
	text := MarshalVehicle(v)
	back, err := ParseVehicle("v.toml", text)
	if err != nil {
		t.Fatalf("reading back: %v\n%s", err, text)
	}
	if back.Loads != v.Loads || !strings.Contains(string(text), "max_normal_coefficient = \"1.25\"\n") {
		t.Errorf("loads round trip: %+v, want %+v\n%s", back.Loads, v.Loads, text)
	}
	gas := func(name, add string) string {
		return edit(t, baseFacility, `"Test tunnel"`, `"`+name+`"`) + add + "\n"
	}
	src := gas("A", "") +
		gas("B", "balance_max_normal_force = \"1000 lbf\"\nbalance_max_pitching_moment = \"450 lbf·ft\"\noperating_rule = \"least load\"") +
		gas("C", "operating_rule = \"fixed temperature\"\nrule_temperature = \"20 degC\"") +
		gas("D", "operating_rule = \"fixed q\"\nrule_q = \"200 psf\"") +
		gas("E", "operating_rule = \"warmest\"") +
		edit(t, baseWater, "\"Test water tunnel\"", "\"F\"") + "operating_rule = \"fixed temperature\"\nrule_temperature = \"15 degC\"\nbalance_max_normal_force = \"300 N\"\n"
	fs, err := ParseFacilities("f.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	text = MarshalFacilities(fs)
	fb, err := ParseFacilities("f.toml", text)
	if err != nil {
		t.Fatalf("reading back: %v\n%s", err, text)
	}
	if !reflect.DeepEqual(fb, fs) {
		t.Errorf("facilities round trip\n got %+v\nwant %+v\n%s", fb, fs, text)
	}
	for _, want := range []string{`operating_rule = "least load"`, `balance_max_pitching_moment = "`, ` N·m"`, `rule_temperature = "293.15 K"`, `rule_q = "`} {
		if !strings.Contains(string(text), want) {
			t.Errorf("written facilities lack %q:\n%s", want, text)
		}
	}
	if strings.Count(string(text), "operating_rule") != 5 {
		t.Errorf("written facilities: %d operating_rule keys, want 5 (none for the facility that names none):\n%s", strings.Count(string(text), "operating_rule"), text)
	}
}
