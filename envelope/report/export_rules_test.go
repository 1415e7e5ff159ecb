package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"likewind/atmos"
	"likewind/envelope"
)

// outKellenCase is the demo vehicle (reference area 28 m², length 3.1 m;
// invented data) with the load data loads, on its grid, and the demo's
// cryogenic tunnel (Kellen Fold: nitrogen, T0 105–313 K, scale 1/40)
// with balance capacity bal and operating rule r.
func outKellenCase(t *testing.T, loads envelope.ModelLoads, bal envelope.BalanceLimits, r envelope.OperatingRule) *envelope.Map {
	t.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	vv := *v
	vv.Loads = loads
	s := envelope.DefaultSettings(&vv)
	g, err := envelope.NewGrid(&vv, s)
	if err != nil {
		t.Fatal(err)
	}
	for k := range facs {
		if strings.HasPrefix(facs[k].Name, "Kellen") {
			f := facs[k]
			f.Balance, f.Rule = bal, r
			m, err := envelope.Solve(g, &f, s)
			if err != nil {
				t.Fatalf("solve %s under %+v: %v", f.Name, r, err)
			}
			return m
		}
	}
	t.Fatal("no Kellen Fold facility in the demo")
	return nil
}

// outRecords is every record of m.
func outRecords(t *testing.T, m *envelope.Map) []ExportRecord {
	t.Helper()
	var out []ExportRecord
	if err := EachRecord([]*envelope.Map{m}, func(r ExportRecord) error { out = append(out, r); return nil }); err != nil {
		t.Fatal(err)
	}
	return out
}

// outNear reports whether x is a number within rel of want.
func outNear(x Num, want, rel float64) bool { return x.Valid() && outClose(float64(x), want, rel) }

// TestExportLoadColumns: the load columns of a hand-worked case. Vehicle:
// CN max 1.2 and Cm max 0.3 on its reference area S = 28 m² and length
// L = 3.1 m; model scale s = 1/40; balance 1000 N and 100 N·m.
//
//	N = CN·q·S·s²       = 1.2 × q × 28/1600 = 0.021 m² × q
//	M = Cm·q·S·s²·(s·L) = 0.3 × q × 28/1600 × 3.1/40 = 4.06875e-4 m³ × q
//	q_load = min(1000/0.021, 100/4.06875e-4) = min(47 619.05, 245 775.04) Pa
//
// Where the balance binds (limit "balance load") q = 47 619.05 Pa, the
// normal force is the full 1000 N, the moment 0.3 × 47 619.05 × 28 × 3.1 /
// 64 000 = 19.375 N·m, and the share 1. Everywhere else the loads follow q.
func TestExportLoadColumns(t *testing.T) {
	m := outKellenCase(t, envelope.ModelLoads{CNMax: 1.2, CmMax: 0.3},
		envelope.BalanceLimits{MaxNormalForce: 1000, MaxPitchMoment: 100}, envelope.OperatingRule{})
	const qLoad = 1000 / 0.021 // 47 619.047619 Pa
	bound := 0
	for _, r := range outRecords(t, m) {
		if !outNear(r.BalanceMaxNormalForce, 1000, 0) || !outNear(r.BalanceMaxPitchMoment, 100, 0) || !outNear(r.BalanceQLimit, qLoad, 1e-12) {
			t.Fatalf("(%d, %d): capacities %v N, %v N·m, q limit %v; want 1000, 100, %g", r.Row, r.Col,
				r.BalanceMaxNormalForce, r.BalanceMaxPitchMoment, r.BalanceQLimit, qLoad)
		}
		if !r.HasSettings {
			if r.NormalForce.Valid() || r.PitchMoment.Valid() || r.LoadShare.Valid() {
				t.Errorf("(%d, %d) without settings: loads %v, %v, share %v; want empty", r.Row, r.Col, r.NormalForce, r.PitchMoment, r.LoadShare)
			}
			continue
		}
		q := float64(r.TestQ)
		n, mo := 0.021*q, 4.06875e-4*q
		if !outNear(r.NormalForce, n, 1e-12) || !outNear(r.PitchMoment, mo, 1e-12) || !outNear(r.LoadShare, math.Max(n/1000, mo/100), 1e-12) {
			t.Errorf("(%d, %d) at q %g: N %v, M %v, share %v; want %g, %g, %g", r.Row, r.Col, q, r.NormalForce, r.PitchMoment, r.LoadShare, n, mo, n/1000)
		}
		if r.Limit != "balance load" {
			continue
		}
		bound++
		if !outNear(r.TestQ, qLoad, 1e-9) || !outNear(r.NormalForce, 1000, 1e-9) || !outNear(r.PitchMoment, 19.375, 1e-9) ||
			!outNear(r.LoadShare, 1, 1e-9) || !strings.Contains(r.Flags, "load near balance capacity") {
			t.Errorf("(%d, %d) held by the balance: q %v, N %v, M %v, share %v, flags %q; want %g Pa, 1000 N, 19.375 N·m, 1",
				r.Row, r.Col, r.TestQ, r.NormalForce, r.PitchMoment, r.LoadShare, r.Flags, qLoad)
		}
		if r.PressureLimit != "balance load" && r.TemperatureLimit != "balance load" {
			t.Errorf("(%d, %d): balance load binds, side limits %q / %q name neither", r.Row, r.Col, r.PressureLimit, r.TemperatureLimit)
		}
		if r.SetWarmLimit != "balance load" && r.SetReynoldsLimit != "balance load" {
			t.Errorf("(%d, %d): balance load binds, matching set warm end %q, Reynolds limit %q", r.Row, r.Col, r.SetWarmLimit, r.SetReynoldsLimit)
		}
	}
	if bound == 0 {
		t.Fatal(`no record limited by "balance load"`)
	}
}

// TestExportLoadsPartial: a load is written only where its coefficient is
// given, a share only where the balance checks a load the vehicle gives.
// CN max 1.2 alone on a moment-only balance: the normal force is known
// (0.021 m² × q, as in TestExportLoadColumns), the moment and the share
// are not, and the capacity shown is the moment's.
func TestExportLoadsPartial(t *testing.T) {
	m := outKellenCase(t, envelope.ModelLoads{CNMax: 1.2}, envelope.BalanceLimits{MaxPitchMoment: 100}, envelope.OperatingRule{})
	for _, r := range outRecords(t, m) {
		if r.BalanceMaxNormalForce.Valid() || !outNear(r.BalanceMaxPitchMoment, 100, 0) || r.BalanceQLimit.Valid() {
			t.Fatalf("(%d, %d): capacities %v N, %v N·m, q limit %v; want empty, 100, empty", r.Row, r.Col,
				r.BalanceMaxNormalForce, r.BalanceMaxPitchMoment, r.BalanceQLimit)
		}
		if !r.HasSettings {
			continue
		}
		if !outNear(r.NormalForce, 0.021*float64(r.TestQ), 1e-12) || r.PitchMoment.Valid() || r.LoadShare.Valid() {
			t.Fatalf("(%d, %d): N %v, M %v, share %v; want 0.021 m² × q, empty, empty", r.Row, r.Col, r.NormalForce, r.PitchMoment, r.LoadShare)
		}
	}
}

// TestExportRuleColumns: each record names the rule in force as the
// files write it, with the value a fixed rule holds, and the setting is
// the one the rule asks for: the standard rule the warm end of the
// matching set (highest T0, p0 and q of the set), the least-load rule the
// cold end (lowest q), a fixed T0 of 200 K that T0 at every point with a
// setting, a fixed q of 80 kPa that q at every full match. The JSON header
// states each facility's rule in words.
func TestExportRuleColumns(t *testing.T) {
	bal := envelope.BalanceLimits{MaxNormalForce: 1e6}
	for _, c := range []struct {
		rule        envelope.OperatingRule
		name, words string
		temp, q     float64 // NaN: empty
	}{
		{envelope.OperatingRule{}, "warmest", "warmest T0, then lowest p0", math.NaN(), math.NaN()},
		{envelope.OperatingRule{Kind: envelope.RuleLeastLoad}, "least load", "least load: coldest T0 on the matching line, lowest p0 and q", math.NaN(), math.NaN()},
		{envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 200}, "fixed temperature", "fixed T0 200 K, p0 to match", 200, math.NaN()},
		{envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 80e3}, "fixed q", "fixed q 80.0 kPa, T0 to match", math.NaN(), 80e3},
	} {
		m := outKellenCase(t, envelope.ModelLoads{}, bal, c.rule)
		atEnd := 0
		for _, r := range outRecords(t, m) {
			if r.Rule != c.name || !sameNum(r.RuleTemperature, c.temp) || !sameNum(r.RuleQ, c.q) {
				t.Fatalf("%s (%d, %d): rule %q, %v K, %v Pa", c.name, r.Row, r.Col, r.Rule, r.RuleTemperature, r.RuleQ)
			}
			if !r.HasSettings {
				continue
			}
			full := r.Class == envelope.FullMatch.String()
			lineSet := r.SetReynoldsLimit == "none" && float64(r.SetT0Max) > float64(r.SetT0Min)*(1+1e-6)
			switch c.rule.Kind {
			case envelope.RuleDefault:
				if lineSet && full {
					atEnd++
					if !outNear(r.T0, float64(r.SetT0Max), 1e-9) || !outNear(r.P0, float64(r.SetP0Max), 1e-9) || !outNear(r.TestQ, float64(r.SetQMax), 1e-9) {
						t.Errorf("warmest (%d, %d): T0 %v p0 %v q %v, want the warm end %v, %v, %v", r.Row, r.Col, r.T0, r.P0, r.TestQ, r.SetT0Max, r.SetP0Max, r.SetQMax)
					}
				}
			case envelope.RuleLeastLoad:
				if lineSet && full {
					atEnd++
					if !outNear(r.T0, float64(r.SetT0Min), 1e-9) || !outNear(r.TestQ, float64(r.SetQMin), 1e-9) {
						t.Errorf("least load (%d, %d): T0 %v q %v, want the cold end %v, %v", r.Row, r.Col, r.T0, r.TestQ, r.SetT0Min, r.SetQMin)
					}
				}
			case envelope.RuleFixedTemperature:
				atEnd++
				if float64(r.T0) != 200 {
					t.Errorf("fixed T0 (%d, %d): T0 %v, want 200 K", r.Row, r.Col, r.T0)
				}
			case envelope.RuleFixedQ:
				if full {
					atEnd++
					if !outNear(r.TestQ, 80e3, 1e-9) {
						t.Errorf("fixed q (%d, %d): q %v, want 80000 Pa", r.Row, r.Col, r.TestQ)
					}
				}
			}
		}
		if atEnd == 0 {
			t.Errorf("%s: no point to check the setting at", c.name)
		}
		h := NewExportHeader(ExportInfo{}, []*envelope.Map{m})
		got := h.Facilities[0].Rule
		if got.Name != c.name || got.Description != c.words || !sameNum(got.Temperature, c.temp) || !sameNum(got.Q, c.q) {
			t.Errorf("%s: header rule %+v, want %q, %q", c.name, got, c.name, c.words)
		}
		if h.Settings.RuleOverride != nil {
			t.Errorf("%s on the facility: header rule_override %+v, want null", c.name, h.Settings.RuleOverride)
		}
	}
}

// sameNum reports whether x is want, or both do not apply (want NaN).
func sameNum(x Num, want float64) bool {
	if math.IsNaN(want) {
		return !x.Valid()
	}
	return float64(x) == want
}

// TestExportRuleOverride: a what-if rule for every facility is stated in
// the JSON header's settings and in each facility's rule.
func TestExportRuleOverride(t *testing.T) {
	e := outEvalVehicle(t, 0, func(s *envelope.Settings, fs []envelope.Facility) {
		s.Rule = envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 300}
		for k := range fs {
			fs[k].Gas.T0Min = math.Min(fs[k].Gas.T0Min, 300)
			fs[k].Gas.T0Max = math.Max(fs[k].Gas.T0Max, 300)
			fs[k].Water.TMax = math.Max(fs[k].Water.TMax, 300)
		}
	})
	h := NewExportHeader(ExportInfo{}, e.Solved())
	o := h.Settings.RuleOverride
	if o == nil || o.Name != "fixed temperature" || float64(o.Temperature) != 300 || o.Q.Valid() {
		t.Fatalf("rule_override %+v, want fixed temperature 300 K", o)
	}
	for _, f := range h.Facilities {
		if f.Rule.Name != "fixed temperature" || float64(f.Rule.Temperature) != 300 {
			t.Errorf("%s: rule %+v, want the what-if's", f.Name, f.Rule)
		}
	}
}

// TestExportMatchingSetColumns: on both demo vehicles the set columns
// are the point's matching set (Detail.Set), low to high, in the columns
// of the facility's medium, empty where there is no set.
func TestExportMatchingSetColumns(t *testing.T) {
	for _, e := range []*envelope.Evaluation{outEvalVehicle(t, 0, nil), outEvalVehicle(t, 1, nil)} {
		for _, m := range e.Solved() {
			for _, r := range outRecords(t, m) {
				d, err := m.Detail(r.Row, r.Col)
				if err != nil {
					t.Fatal(err)
				}
				set := d.Set
				if !set.OK {
					if r.SetReynolds.Valid() || r.SetQMin.Valid() || r.SetT0Min.Valid() || r.SetWaterTempMin.Valid() ||
						r.SetColdLimit != "" || r.SetReynoldsLimit != "" {
						t.Fatalf("%s (%d, %d): no set, columns %v %v %q %q", r.Facility, r.Row, r.Col, r.SetReynolds, r.SetQMin, r.SetColdLimit, r.SetReynoldsLimit)
					}
					continue
				}
				gasCols := []Num{r.SetT0Min, r.SetT0Max, r.SetP0Min, r.SetP0Max}
				waterCols := []Num{r.SetWaterTempMin, r.SetWaterTempMax, r.SetSpeedMin, r.SetSpeedMax}
				filled, empty := gasCols, waterCols
				if m.Facility.Medium == envelope.MediumWater {
					filled, empty = waterCols, gasCols
				}
				for k := range filled {
					if !filled[k].Valid() || empty[k].Valid() {
						t.Fatalf("%s (%d, %d): medium's set columns %v, other medium's %v", r.Facility, r.Row, r.Col, filled, empty)
					}
				}
				if filled[0] > filled[1] || filled[2] > filled[3] || r.SetQMin > r.SetQMax {
					t.Errorf("%s (%d, %d): spans not low to high: %v, q %v–%v", r.Facility, r.Row, r.Col, filled, r.SetQMin, r.SetQMax)
				}
				if float64(filled[0]) != math.Min(set.Cold.T0, set.Warm.T0) || float64(filled[1]) != math.Max(set.Cold.T0, set.Warm.T0) ||
					float64(r.SetReynolds) != set.Re || r.SetColdLimit != set.Cold.Limit.String() ||
					r.SetWarmLimit != set.Warm.Limit.String() || r.SetReynoldsLimit != set.ReLimit.String() {
					t.Errorf("%s (%d, %d): set columns T %v–%v Re %v limits %q %q %q; set %+v", r.Facility, r.Row, r.Col,
						filled[0], filled[1], r.SetReynolds, r.SetColdLimit, r.SetWarmLimit, r.SetReynoldsLimit, set)
				}
			}
		}
	}
}

// outWaterCase is one flight point, sea level at Mach 0.2, for a vehicle
// of reference length 1 m, and an invented water tunnel (1–15 m/s,
// 10–40 °C, 2 bar) running a 0.5 m model under rule r.
func outWaterCase(t *testing.T, r envelope.OperatingRule) *envelope.Map {
	t.Helper()
	v := &envelope.Vehicle{
		Name: "one point", RefLength: 1, RefArea: 1, Span: 3, FrontalArea: 0.1,
		Boundary:     []envelope.Vertex{{Altitude: -100, Speed: 0.1}, {Altitude: -100, Speed: 0.4}, {Altitude: 100, Speed: 0.4}, {Altitude: 100, Speed: 0.1}},
		BoundaryKind: atmos.Mach,
		Grid: envelope.GridSpec{
			Altitude: envelope.Axis{Min: 0, Max: 0, Count: 1},
			Speed:    envelope.Axis{Min: 0.2, Max: 0.2, Count: 1}, SpeedKind: atmos.Mach,
		},
	}
	f := envelope.Facility{Name: "water test tunnel", Medium: envelope.MediumWater, Rule: r,
		Water: envelope.WaterLimits{SpeedMin: 1, SpeedMax: 15, TMin: 283.15, TMax: 313.15, PMax: 2e5}, Width: 1, Height: 1}
	s := envelope.DefaultSettings(v)
	s.Scale = 0.5
	g, err := envelope.NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := envelope.Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestExportWaterSet: a water tunnel's matching set by hand. Sea level at
// Mach 0.2 on a 1 m length: Re = ρVL/μ = 1.2250 × 0.2 × 340.294 / 1.7894e-5
// = 4.659e6 (U.S. Standard Atmosphere 1976, Table I, 0 m). The 0.5 m model
// needs V = Re·ν/(0.5 m) in water: about 6.1 m/s at 40 °C (ν ≈ 0.66e-6
// m²/s) and 12.2 m/s at 10 °C (ν ≈ 1.31e-6 m²/s; water viscosities from
// memory), both inside 1–15 m/s, so the set runs over the whole
// temperature range, bounded at both ends by "water temperature range",
// and the standard rule runs its warm end (40 °C, the lowest speed); held
// at 20 °C by a fixed-temperature rule the water is 293.15 K and the speed
// lies inside the set's span. The gas columns stay empty.
func TestExportWaterSet(t *testing.T) {
	const reFlight = 1.2250 * 0.2 * 340.294 / 1.7894e-5
	for _, c := range []struct {
		rule envelope.OperatingRule
		name string
		temp float64
	}{
		{envelope.OperatingRule{}, "warmest", 313.15},
		{envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 293.15}, "fixed temperature", 293.15},
	} {
		rs := outRecords(t, outWaterCase(t, c.rule))
		if len(rs) != 1 {
			t.Fatalf("%d records, want 1", len(rs))
		}
		r := rs[0]
		if r.Class != envelope.MachRelaxed.String() || !outNear(r.ModelReynolds, reFlight, 1e-3) || !outNear(r.SetReynolds, reFlight, 1e-3) {
			t.Fatalf("%s: %s, model Re %v, set Re %v; want Mach relaxed at Re %g", c.name, r.Class, r.ModelReynolds, r.SetReynolds, reFlight)
		}
		if float64(r.SetWaterTempMin) != 283.15 || float64(r.SetWaterTempMax) != 313.15 ||
			r.SetColdLimit != "water temperature range" || r.SetWarmLimit != "water temperature range" || r.SetReynoldsLimit != "none" {
			t.Errorf("%s: set %v–%v K bounded by %q / %q (Re: %q); want 283.15–313.15 K by the water temperature range",
				c.name, r.SetWaterTempMin, r.SetWaterTempMax, r.SetColdLimit, r.SetWarmLimit, r.SetReynoldsLimit)
		}
		if !outNear(r.SetSpeedMin, 6.1, 0.03) || !outNear(r.SetSpeedMax, 12.2, 0.03) {
			t.Errorf("%s: set speeds %v–%v m/s, want about 6.1–12.2 m/s", c.name, r.SetSpeedMin, r.SetSpeedMax)
		}
		// q = ½ρV²: about ½ × 992 × 6.1² = 18.5 kPa at 40 °C and ½ × 1000 ×
		// 12.2² = 74 kPa at 10 °C (densities from memory).
		if !outNear(r.SetQMin, 18.5e3, 0.05) || !outNear(r.SetQMax, 74e3, 0.05) {
			t.Errorf("%s: set q %v–%v Pa, want about 18.5–74 kPa", c.name, r.SetQMin, r.SetQMax)
		}
		if r.Rule != c.name || float64(r.WaterTemperature) != c.temp {
			t.Errorf("%s: rule %q, water %v K; want %g K", c.name, r.Rule, r.WaterTemperature, c.temp)
		}
		if c.temp == 313.15 && float64(r.TestSpeed) != float64(r.SetSpeedMin) {
			t.Errorf("warmest: speed %v, want the set's lowest %v", r.TestSpeed, r.SetSpeedMin)
		}
		if c.temp != 313.15 && !(r.TestSpeed > r.SetSpeedMin && r.TestSpeed < r.SetSpeedMax) {
			t.Errorf("fixed 20 °C: speed %v outside the set %v–%v", r.TestSpeed, r.SetSpeedMin, r.SetSpeedMax)
		}
		for _, x := range []Num{r.SetT0Min, r.SetT0Max, r.SetP0Min, r.SetP0Max, r.T0, r.P0} {
			if x.Valid() {
				t.Errorf("%s: a gas column is %v, want empty", c.name, x)
			}
		}
	}
}

// outFormerColumns are the export's columns before the operating rule,
// the matching set and the loads were added; they stay first, in this
// order, so that files read by column position keep their meaning.
var outFormerColumns = []string{
	"facility", "medium", "row", "col", "altitude_m", "altitude_kind", "grid_speed", "grid_speed_kind",
	"pressure_altitude_m", "delta_t_k", "temperature_k", "pressure_pa", "density_kg_m3", "speed_of_sound_m_s",
	"viscosity_pa_s", "kinematic_viscosity_m2_s", "mean_free_path_m", "mach", "tas_m_s", "eas_m_s", "cas_m_s",
	"dynamic_pressure_pa", "reynolds", "reynolds_per_m", "knudsen", "flight_t0_k", "flight_p0_pa",
	"speed_regime", "rarefaction_regime", "model_scale", "model_length_m", "mach_tol", "re_tol",
	"compressibility_mach", "class", "limit", "pressure_side_limit", "temperature_side_limit", "flags",
	"has_settings", "test_mach", "p0_pa", "t0_k", "water_temperature_k", "test_static_pressure_pa",
	"test_static_temperature_k", "test_speed_m_s", "test_dynamic_pressure_pa", "test_density_kg_m3",
	"test_viscosity_pa_s", "model_reynolds", "reynolds_ratio", "model_reynolds_per_m", "delta_cf",
	"max_reynolds_at_test_mach", "reynolds_sweep_min", "reynolds_sweep_max", "min_t0_condensation_k",
	"vapour_pressure_pa", "cavitation_number",
}

// TestExportDefaultsNeutral: on files with no rule and no load data (the
// demo without its load data) the former columns come first and unchanged in order, every record
// names the standard rule "warmest" with no fixed value, and every load
// and balance column is empty in CSV and null in JSON.
func TestExportDefaultsNeutral(t *testing.T) {
	cols := ExportColumns()
	if strings.Join(cols[:len(outFormerColumns)], ",") != strings.Join(outFormerColumns, ",") {
		t.Fatalf("first columns %v, want the former ones %v", cols[:len(outFormerColumns)], outFormerColumns)
	}
	// The demo without its load data: files that give none.
	maps := outEvalNoLoads(t, 0).Maps
	var b bytes.Buffer
	if err := WriteExportCSV(&b, maps); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for k, c := range rows[0] {
		col[c] = k
	}
	empty := []string{"rule_temperature_k", "rule_q_pa", "normal_force_n", "pitch_moment_n_m", "load_share",
		"balance_max_normal_force_n", "balance_max_pitch_moment_n_m", "balance_q_limit_pa"}
	for _, row := range rows[1:] {
		if row[col["rule"]] != "warmest" {
			t.Fatalf("rule %q, want warmest", row[col["rule"]])
		}
		for _, c := range empty {
			if row[col[c]] != "" {
				t.Fatalf("%s = %q on the demo, want empty", c, row[col[c]])
			}
		}
	}
	b.Reset()
	if err := WriteExportJSON(&b, ExportInfo{}, maps[:1]); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Facilities []map[string]any
		Records    []map[string]any
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	for _, rec := range doc.Records {
		for _, c := range empty {
			if v, ok := rec[c]; !ok || v != nil {
				t.Fatalf("JSON %s = %v (present %v), want null", c, v, ok)
			}
		}
	}
	for _, c := range []string{"balance_max_normal_force_n", "balance_max_pitch_moment_n_m", "balance_q_limit_pa"} {
		if v, ok := doc.Facilities[0][c]; !ok || v != nil {
			t.Errorf("JSON facility %s = %v (present %v), want null", c, v, ok)
		}
	}
}
