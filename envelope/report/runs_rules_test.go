package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strings"
	"testing"

	"likewind/atmos"
	"likewind/envelope"
)

// TestRunOrderFixedQ: under a fixed q the runs are grouped by q, then T0,
// then sorted by Mach number, and moves of q are counted. Hand-built
// runs; rows only identify them. Worked by hand: q groups {C} at 60 kPa
// and {A,B,D,E} within 0.5 % of 80 kPa; in the second, T0 groups {D,B}
// within 1 K of 150 K and {E,A} at 200 K; Mach ascending inside each.
func TestRunOrderFixedQ(t *testing.T) {
	in := []struct {
		name            string
		q, t0, p0, mach float64
	}{
		{"A", 80e3, 200, 2.0e5, 0.8},
		{"B", 80.2e3, 150.5, 2.4e5, 0.7},
		{"C", 60e3, 150, 1.5e5, 0.8},
		{"D", 80e3, 150, 3.0e5, 0.5},
		{"E", 80e3, 200, 2.6e5, 0.6},
	}
	names := map[envelope.GridPoint]string{}
	var runs []Run
	for k, r := range in {
		run := outRun(k, r.t0, r.p0, r.mach)
		run.Q = r.q
		names[run.GridPoint] = r.name
		runs = append(runs, run)
	}
	o := OrderFor(envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 80e3}, "nitrogen")
	if !o.HoldQ || o.Water || strings.Join(o.Keys(), " ") != "q t0 mach" {
		t.Fatalf("fixed q order %+v, keys %v; want q t0 mach", o, o.Keys())
	}
	got := o.Order(runs)
	if order := runNames(runs, names); order != "C D B E A" {
		t.Errorf("order = %s, want C D B E A", order)
	}
	// C→D q, p0, Mach (T0 equal); D→B p0, Mach (q 0.25 %, T0 0.5 K apart);
	// B→E T0, p0, Mach (q 0.25 %); E→A p0, Mach.
	want := Changes{Q: 1, T0: 1, P0: 4, Mach: 4, Moved: 4, Steps: 4}
	if got != want {
		t.Errorf("changes = %+v, want %+v", got, want)
	}
	// The same runs in the standard order do not count q.
	if c := (RunOrder{}).Count(runs); c.Q != 0 {
		t.Errorf("standard order counts q: %+v", c)
	}
	for _, r := range []envelope.OperatingRule{{}, {Kind: envelope.RuleLeastLoad}, {Kind: envelope.RuleFixedTemperature, Temperature: 200}} {
		if o := OrderFor(r, "nitrogen"); o.HoldQ || strings.Join(o.Keys(), " ") != "t0 p0 mach" {
			t.Errorf("%v: order %+v, keys %v; want t0 p0 mach", r.Kind, o, o.Keys())
		}
		if o := OrderFor(r, envelope.MediumWater); !o.Water || o.HoldQ {
			t.Errorf("%v on water: order %+v", r.Kind, o)
		}
	}
}

// outHandCryo is an invented cryogenic nitrogen tunnel (Mach 0.2–1.2,
// p0 1.2–4.5 bar, T0 90–320 K, q max 120 kPa, a 1/40 model, a balance
// large enough never to bind) under rule r, solved on the demo vehicle's
// grid.
func outHandCryo(t *testing.T, r envelope.OperatingRule) *envelope.Map {
	t.Helper()
	v, _, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	f := envelope.Facility{Name: "hand cryogenic tunnel", Medium: "nitrogen",
		Gas:  envelope.GasLimits{MachMin: 0.2, MachMax: 1.2, P0Min: 1.2e5, P0Max: 4.5e5, T0Min: 90, T0Max: 320, Condensation: true},
		QMax: 1.2e5, Width: 2.5, Height: 2.5, Rule: r, Balance: envelope.BalanceLimits{MaxNormalForce: 1e6}}
	f.Model.Scale = 1.0 / 40
	s := envelope.DefaultSettings(v)
	g, err := envelope.NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := envelope.Solve(g, &f, s)
	if err != nil {
		t.Fatalf("solve under %+v: %v", r, err)
	}
	return m
}

// TestPlanRunsPerRule: the run list of a hand-built cryogenic tunnel
// under each gas rule carries the rule and its order. Under a fixed T0 of
// 120 K every run has that T0, so T0 never changes (0 T0 changes); under
// a fixed q of 80 kPa every run (each a match, reached at that q) shares
// q, so q never changes, and T0 rises along the list (the Reynolds number
// is varied by T0); under the standard and least-load rules T0 rises along
// the list, and each least-load run's q is at most the standard rule's q
// for the same flight point.
func TestPlanRunsPerRule(t *testing.T) {
	base := outHandCryo(t, envelope.OperatingRule{})
	baseList, err := PlanRuns(base, DefaultRunPoints(base))
	if err != nil {
		t.Fatal(err)
	}
	baseQ := map[envelope.GridPoint]float64{}
	for _, r := range baseList.Runs {
		baseQ[r.GridPoint] = r.Q
	}
	for _, r := range []envelope.OperatingRule{
		{},
		{Kind: envelope.RuleLeastLoad},
		{Kind: envelope.RuleFixedTemperature, Temperature: 120},
		{Kind: envelope.RuleFixedQ, Q: 80e3},
	} {
		m := outHandCryo(t, r)
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		if len(rl.Runs) < 10 {
			t.Fatalf("%v: %d runs, want a list to order", r.Kind, len(rl.Runs))
		}
		if rl.Rule != m.Rule || rl.Order != OrderFor(m.Rule, "nitrogen") {
			t.Errorf("%v: list rule %+v order %+v", r.Kind, rl.Rule, rl.Order)
		}
		if c := rl.Order.Count(rl.Runs); c != rl.Changes {
			t.Errorf("%v: changes %+v, recounted %+v", r.Kind, rl.Changes, c)
		}
		for k, run := range rl.Runs {
			switch r.Kind {
			case envelope.RuleFixedTemperature:
				if run.T0 != 120 {
					t.Fatalf("fixed T0: run %d at T0 %g, want 120 K", k, run.T0)
				}
			case envelope.RuleFixedQ:
				if !outClose(run.Q, 80e3, 1e-9) {
					t.Fatalf("fixed q: run %d at q %g, want 80000 Pa", k, run.Q)
				}
			case envelope.RuleLeastLoad:
				if q, ok := baseQ[run.GridPoint]; ok && run.Q > q*(1+1e-9) {
					t.Errorf("least load: run %d q %g above the standard rule's %g", k, run.Q, q)
				}
			}
			if k > 0 && run.T0 < rl.Runs[k-1].T0-RunT0Step {
				t.Errorf("%v: T0 falls from %g to %g at run %d", r.Kind, rl.Runs[k-1].T0, run.T0, k)
			}
		}
		c := rl.Changes
		switch r.Kind {
		case envelope.RuleFixedTemperature:
			if c.T0 != 0 || c.P0 == 0 {
				t.Errorf("fixed T0: changes %+v, want no T0 change and some p0 changes", c)
			}
		case envelope.RuleFixedQ:
			if c.Q != 0 || c.T0 == 0 {
				t.Errorf("fixed q: changes %+v, want no q change and some T0 changes", c)
			}
		default:
			if c.Q != 0 {
				t.Errorf("%v: q counted %+v", r.Kind, c)
			}
		}
	}
}

// outWaterRunsCase is an invented water tunnel (1–15 m/s, 10–40 °C,
// 2 bar) running a 0.5 m model under rule r, for a vehicle of reference
// length 1 m at sea level to 1000 m and Mach 0.1–0.2 (3 × 3 points).
func outWaterRunsCase(t *testing.T, r envelope.OperatingRule) *envelope.Map {
	t.Helper()
	v := &envelope.Vehicle{
		Name: "low-speed vehicle", RefLength: 1, RefArea: 1, Span: 3, FrontalArea: 0.1,
		Boundary:     []envelope.Vertex{{Altitude: -100, Speed: 0.05}, {Altitude: -100, Speed: 0.3}, {Altitude: 1100, Speed: 0.3}, {Altitude: 1100, Speed: 0.05}},
		BoundaryKind: atmos.Mach,
		Grid: envelope.GridSpec{
			Altitude: envelope.Axis{Min: 0, Max: 1000, Count: 3},
			Speed:    envelope.Axis{Min: 0.1, Max: 0.2, Count: 3}, SpeedKind: atmos.Mach,
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

// TestPlanRunsWaterRules: a water tunnel's run list under the standard
// rule runs the warmest water, 40 °C, and under a fixed water temperature
// of 20 °C that water: either way every run shares the temperature (0
// temperature changes) and only the speed moves, ascending. Flight
// Reynolds numbers from 2.3e6 to 4.7e6 on 1 m (sea level to 1000 m, Mach
// 0.1–0.2) need 3–6.2 m/s at 40 °C on the 0.5 m model (ν ≈ 0.66e-6 m²/s,
// from memory), inside 1–15 m/s, so every point runs.
func TestPlanRunsWaterRules(t *testing.T) {
	for _, c := range []struct {
		rule envelope.OperatingRule
		temp float64
	}{
		{envelope.OperatingRule{}, 313.15},
		{envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 293.15}, 293.15},
	} {
		m := outWaterRunsCase(t, c.rule)
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		if len(rl.Runs) != 9 || !rl.Order.Water || rl.Order.HoldQ {
			t.Fatalf("%v: %d runs, order %+v; want 9 water runs", c.rule.Kind, len(rl.Runs), rl.Order)
		}
		for k, r := range rl.Runs {
			if r.T0 != c.temp || (k > 0 && r.Speed < rl.Runs[k-1].Speed) {
				t.Errorf("%v: run %d water %g K speed %g m/s; want %g K, speeds ascending", c.rule.Kind, k, r.T0, r.Speed, c.temp)
			}
		}
		if ch := rl.Changes; ch.T0 != 0 || ch.Mach == 0 || ch.Q != 0 {
			t.Errorf("%v: changes %+v, want speed changes only", c.rule.Kind, ch)
		}
	}
}

// TestRunRecordsRule: every run record names the rule in force with its
// fixed value; q_change is empty (CSV) or null (JSON) unless the rule
// holds q, and then says whether q moved. The JSON list states the rule
// and the order per facility and counts q only where it is held.
func TestRunRecordsRule(t *testing.T) {
	for _, c := range []struct {
		rule  envelope.OperatingRule
		name  string
		order string
	}{
		{envelope.OperatingRule{}, "warmest", "t0 p0 mach"},
		{envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 80e3}, "fixed q", "q t0 mach"},
	} {
		m := outHandCryo(t, c.rule)
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		plan := RunPlan{Vehicle: "v", Lists: []RunList{rl}}
		var b bytes.Buffer
		if err := plan.WriteCSV(&b); err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(&b).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		col := map[string]int{}
		for k, n := range rows[0] {
			col[n] = k
		}
		held := c.rule.Kind == envelope.RuleFixedQ
		if len(rows) < 10 {
			t.Fatalf("%s: %d rows, want a list", c.name, len(rows))
		}
		for k, row := range rows[1:] {
			qc := row[col["q_change"]]
			if row[col["rule"]] != c.name || (held != (qc == "false" || qc == "true")) || (!held && qc != "") {
				t.Fatalf("%s row %d: rule %q q_change %q", c.name, k, row[col["rule"]], qc)
			}
			if want := map[bool]string{true: "80000", false: ""}[held]; row[col["rule_q_pa"]] != want || row[col["rule_temperature_k"]] != "" {
				t.Fatalf("%s row %d: rule_q_pa %q rule_temperature_k %q, want %q and empty", c.name, k, row[col["rule_q_pa"]], row[col["rule_temperature_k"]], want)
			}
		}
		b.Reset()
		if err := plan.WriteJSON(&b, ExportInfo{}); err != nil {
			t.Fatal(err)
		}
		var doc struct {
			RuleOverride *RuleInfo `json:"rule_override"`
			Facilities   []struct {
				Rule    RuleInfo `json:"operating_rule"`
				Order   []string
				Changes map[string]*int
			}
		}
		if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
			t.Fatal(err)
		}
		f := doc.Facilities[0]
		if doc.RuleOverride != nil || f.Rule.Name != c.name || strings.Join(f.Order, " ") != c.order {
			t.Errorf("%s: JSON override %+v, rule %+v, order %v; want %q", c.name, doc.RuleOverride, f.Rule, f.Order, c.order)
		}
		if q, ok := f.Changes["q"]; !ok || (q != nil) != held || (held && *q != rl.Changes.Q) {
			t.Errorf("%s: JSON q changes %v (present %v)", c.name, q, ok)
		}
	}
}
