package main

import (
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope/report"
)

// The example files of testdata/examples (invented data): the demo's
// supersonic aircraft with load coefficients (CN max 1.2, Cm max 0.25 on
// its 28 m² reference area and 3.10 m reference length), and facilities
// under each operating rule, most with a balance capacity.
var (
	exampleVehicle    = filepath.Join("..", "..", "testdata", "examples", "loads-vehicle.toml")
	exampleFacilities = filepath.Join("..", "..", "testdata", "examples", "rules-facilities.toml")
)

// Facility names of the example, and what each is given.
const (
	exWarmest   = "Kellen Fold cryogenic transonic tunnel, warmest"
	exLeastLoad = "Kellen Fold cryogenic transonic tunnel, least load"
	exFixedT0   = "Kellen Fold cryogenic transonic tunnel, fixed T0"
	exFixedQ    = "Kellen Fold cryogenic transonic tunnel, fixed q"
	exNoBalance = "Skerrow 0.6 m supersonic blowdown tunnel"
	exWater     = "Wenlow 0.5 m water tunnel, fixed water temperature"
)

// TestExamplesCheck: `likewind check` passes the example files.
func TestExamplesCheck(t *testing.T) {
	code, out, errs := runCmd("check", exampleVehicle, exampleFacilities)
	if code != 0 || out != "2 file(s) checked, no problems\n" {
		t.Errorf("check on the examples: exit %d, output %q, stderr %q", code, out, errs)
	}
}

// exampleExport is the JSON export of the example files.
func exampleExport(t *testing.T) report.ExportDoc {
	t.Helper()
	code, out, errs := runCmd("export", exampleVehicle, exampleFacilities, "--format", "json", "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("export exit %d: %s", code, errs)
	}
	var doc report.ExportDoc
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("export JSON read back: %v", err)
	}
	return doc
}

// TestExamplesExportRulesAndLoads: the export states each facility's rule
// as its file names it, with the value a fixed rule holds, and the balance
// capacity; every record carries the rule, and the loads at its setting by
// the planning form N = CN·q·A·s², M = Cm·q·A·s²·(s·L), their share of the
// capacity and the q at which the model reaches it, by hand:
//
//	2 kN balance, 1/40 model: q_load = 2000/(1.2 × 28/1600) = 95 238.1 Pa
//	  (the 250 N·m moment capacity binds only at 250/(0.25 × 28 × 3.1/64 000)
//	  = 737 327 Pa)
//	1000 lbf = 4448.2216152605 N exactly: q_load = 211 820.08 Pa
//	4.5 kN: q_load = 214 285.71 Pa; at the fixed q of 60 kPa N = 1260 N,
//	  M = 20.34375 N·m, share 0.28
func TestExamplesExportRulesAndLoads(t *testing.T) {
	doc := exampleExport(t)
	type want struct {
		rule         string
		t0, q        float64 // NaN: none
		maxN, maxM   float64 // NaN: none
		qLoad        float64 // NaN: not checked
		balanceBinds bool    // some point is held by the balance
	}
	nan := math.NaN()
	wants := map[string]want{
		exWarmest:   {"warmest", nan, nan, 2000, 250, 2000 / (1.2 * 28 / 1600.0), true},
		exLeastLoad: {"least load", nan, nan, 2000, 250, 95238.0952380952, true},
		exFixedT0:   {"fixed temperature", 150, nan, 4448.2216152605, nan, 211820.076917167, false},
		exFixedQ:    {"fixed q", nan, 60000, 4500, nan, 214285.714285714, false},
		exNoBalance: {"warmest", nan, nan, nan, nan, nan, false},
		exWater:     {"fixed temperature", 293.15, nan, 800, 40, 0, false},
	}
	same := func(got report.Num, want float64) bool {
		g := float64(got)
		if math.IsNaN(want) {
			return math.IsNaN(g)
		}
		return math.Abs(g-want) <= 1e-9*math.Abs(want)
	}
	if len(doc.Facilities) != len(wants) {
		t.Fatalf("export has %d facilities, want %d", len(doc.Facilities), len(wants))
	}
	scale := map[string]float64{}
	for _, f := range doc.Facilities {
		w, ok := wants[f.Name]
		if !ok {
			t.Fatalf("unexpected facility %q", f.Name)
		}
		scale[f.Name] = float64(f.Scale)
		if f.Rule.Name != w.rule || !same(f.Rule.Temperature, w.t0) || !same(f.Rule.Q, w.q) {
			t.Errorf("%s: rule %+v, want %q (T %g, q %g)", f.Name, f.Rule, w.rule, w.t0, w.q)
		}
		if !same(f.BalanceMaxNormalForce, w.maxN) || !same(f.BalanceMaxPitchMoment, w.maxM) {
			t.Errorf("%s: balance %g N, %g N·m; want %g, %g", f.Name, f.BalanceMaxNormalForce, f.BalanceMaxPitchMoment, w.maxN, w.maxM)
		}
		if w.qLoad != 0 && !same(f.BalanceQLimit, w.qLoad) {
			t.Errorf("%s: balance q limit %g Pa, want %g", f.Name, f.BalanceQLimit, w.qLoad)
		}
	}
	const cn, cm, area, length = 1.2, 0.25, 28.0, 3.10
	binds := map[string]bool{}
	leastQ, warmQ := map[[2]int]float64{}, map[[2]int]float64{}
	for _, r := range doc.Records {
		w := wants[r.Facility]
		if r.Rule != w.rule || !same(r.RuleTemperature, w.t0) || !same(r.RuleQ, w.q) {
			t.Fatalf("%s (%d,%d): rule %q %g %g, want %q", r.Facility, r.Row, r.Col, r.Rule, r.RuleTemperature, r.RuleQ, w.rule)
		}
		if !r.HasSettings {
			continue
		}
		q, s := float64(r.TestQ), scale[r.Facility]
		n, m := cn*q*area*s*s, cm*q*area*s*s*(s*length)
		if !same(r.NormalForce, n) || !same(r.PitchMoment, m) {
			t.Fatalf("%s (%d,%d): loads %g N, %g N·m at q %g Pa; want %g, %g", r.Facility, r.Row, r.Col, r.NormalForce, r.PitchMoment, q, n, m)
		}
		share := nan
		if !math.IsNaN(w.maxN) {
			share = n / w.maxN
			if !math.IsNaN(w.maxM) {
				share = math.Max(share, m/w.maxM)
			}
		}
		if !same(r.LoadShare, share) {
			t.Fatalf("%s (%d,%d): load share %g, want %g", r.Facility, r.Row, r.Col, r.LoadShare, share)
		}
		if share > 1+1e-9 {
			t.Errorf("%s (%d,%d): load share %g above the capacity", r.Facility, r.Row, r.Col, share)
		}
		if r.Limit == "balance load" || r.SetWarmLimit == "balance load" {
			binds[r.Facility] = true
		}
		if r.Class == "full match" {
			switch r.Facility {
			case exLeastLoad:
				leastQ[[2]int{r.Row, r.Col}] = q
			case exWarmest:
				warmQ[[2]int{r.Row, r.Col}] = q
			}
		}
	}
	for name, w := range wants {
		if binds[name] != w.balanceBinds {
			t.Errorf("%s: balance load binds somewhere = %v, want %v", name, binds[name], w.balanceBinds)
		}
	}
	// The same tunnel under the least-load rule never runs a higher q
	// than under the standard rule where both match.
	both := 0
	for p, ql := range leastQ {
		if qw, ok := warmQ[p]; ok {
			both++
			if ql > qw*(1+1e-9) {
				t.Errorf("point %v: least load q %g Pa above warmest q %g Pa", p, ql, qw)
			}
		}
	}
	if both < 10 {
		t.Errorf("%d points matched under both rules, want at least 10", both)
	}
}

// TestExamplesExportCSVColumns: the CSV export of the example files has
// the rule and load columns, filled for the facilities that give them.
func TestExamplesExportCSVColumns(t *testing.T) {
	code, out, errs := runCmd("export", exampleVehicle, exampleFacilities, "--format", "csv")
	if code != 0 {
		t.Fatalf("export exit %d: %s", code, errs)
	}
	header, rest, _ := strings.Cut(out, "\n")
	for _, c := range []string{"rule", "rule_temperature_k", "rule_q_pa", "normal_force_n", "pitch_moment_n_m", "load_share",
		"balance_max_normal_force_n", "balance_max_pitch_moment_n_m", "balance_q_limit_pa"} {
		if !strings.Contains(","+header+",", ","+c+",") {
			t.Errorf("CSV header lacks %q", c)
		}
	}
	for _, want := range []string{",least load,", ",fixed temperature,150,", ",fixed q,,60000,", ",4448.2216152605,"} {
		if !strings.Contains(rest, want) {
			t.Errorf("CSV records hold no %q", want)
		}
	}
}

// TestExamplesRuns: the run list names each facility's rule in words, with
// the value a fixed rule holds.
func TestExamplesRuns(t *testing.T) {
	code, out, errs := runCmd("runs", exampleVehicle, exampleFacilities, "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs exit %d: %s", code, errs)
	}
	for name, rule := range map[string]string{
		exWarmest:   "operating rule: warmest T0, then lowest p0;",
		exLeastLoad: "operating rule: least load: coldest T0 on the matching line, lowest p0 and q;",
		exFixedT0:   "operating rule: fixed T0 150.0 K, p0 to match;",
		exFixedQ:    "operating rule: fixed q 60.00 kPa, T0 to match;",
		exWater:     "operating rule: fixed water temperature 293.1 K, speed to match;",
	} {
		got, _ := outListHead(t, out, name)
		if !strings.HasPrefix(got, rule) {
			t.Errorf("%s: rule line %q, want it to start %q", name, got, rule)
		}
	}
	// Under a fixed T0 no T0 change is counted.
	if _, counts := outListHead(t, out, exFixedT0); !strings.Contains(counts, "set-point changes: T0 0,") {
		t.Errorf("fixed T0 counts %q, want no T0 change", counts)
	}
}
