package main

import (
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
)

// outRulePlan is the run list text of the demo vehicle on two invented
// facilities: a cryogenic nitrogen tunnel (Mach 0.2–1.2, p0 1.2–4.5 bar,
// T0 90–320 K, q max 120 kPa, a 1/40 model, a balance) under rule r, and a
// copy of it under the standard rule; with what-if rule w for both.
func outRulePlan(t *testing.T, r, w envelope.OperatingRule, u units.System) string {
	t.Helper()
	v, _, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	f := envelope.Facility{Name: "held tunnel", Medium: "nitrogen",
		Gas:  envelope.GasLimits{MachMin: 0.2, MachMax: 1.2, P0Min: 1.2e5, P0Max: 4.5e5, T0Min: 90, T0Max: 320, Condensation: true},
		QMax: 1.2e5, Width: 2.5, Height: 2.5, Rule: r, Balance: envelope.BalanceLimits{MaxNormalForce: 1e6}}
	f.Model.Scale = 1.0 / 40
	std := f
	std.Name, std.Rule = "standard tunnel", envelope.OperatingRule{}
	s := envelope.DefaultSettings(v)
	s.Rule = w
	e, err := envelope.Evaluate(v, []envelope.Facility{f, std}, s)
	if err != nil {
		t.Fatal(err)
	}
	if err := e.Err(); err != nil {
		t.Fatal(err)
	}
	p, err := planAll(&evaluated{e: e}, -1)
	if err != nil {
		t.Fatal(err)
	}
	p.date = "2025-01-01"
	var b strings.Builder
	if err := p.writeText(&b, u); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// outListHead is the rule line and the counts line of facility name's
// list in run list text.
func outListHead(t *testing.T, text, name string) (rule, counts string) {
	t.Helper()
	_, rest, ok := strings.Cut(text, "\n"+name+" (")
	lines := strings.Split(rest, "\n")
	if !ok || len(lines) < 3 {
		t.Fatalf("no list of %s in\n%s", name, text)
	}
	return lines[1], lines[2]
}

// TestRunsTextStatesRule: the run list's header says the order follows
// each facility's operating rule, and each list names its rule in words
// (in the units shown) and the settings it groups by; under a fixed q the
// changes count q, and under a fixed T0 no T0 change is counted.
func TestRunsTextStatesRule(t *testing.T) {
	text := outRulePlan(t, envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 80e3}, envelope.OperatingRule{}, units.SI)
	for _, want := range []string{
		"order     per facility as its operating rule sets it: grouped by T0, then p0, then Mach number ascending\n",
		"under a fixed q by q, then T0, then Mach number;\n",
		"0.5 % of p0 or of a held q",
		"rule      each facility's own operating rule, stated with its list\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("header lacks %q:\n%s", want, text)
		}
	}
	rule, counts := outListHead(t, text, "held tunnel")
	if rule != "operating rule: fixed q 80.00 kPa, T0 to match; runs grouped by q, then T0, then Mach number" {
		t.Errorf("fixed q rule line %q", rule)
	}
	if !strings.Contains(counts, "; set-point changes: q 0, T0 ") {
		t.Errorf("fixed q counts %q, want q 0 first", counts)
	}
	rule, counts = outListHead(t, text, "standard tunnel")
	if rule != "operating rule: warmest T0, then lowest p0; runs grouped by T0, then p0, then Mach number" ||
		strings.Contains(counts, " q ") {
		t.Errorf("standard lines %q / %q", rule, counts)
	}

	// Customary units write the held value in psf; a fixed T0 in °F.
	text = outRulePlan(t, envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 120}, envelope.OperatingRule{}, units.Customary)
	rule, counts = outListHead(t, text, "held tunnel")
	// 120 K = 120 × 9/5 − 459.67 = −243.67 °F (definition of the scales),
	// written to a tenth.
	if !strings.HasPrefix(rule, "operating rule: fixed T0 -243.7 °F, p0 to match; runs grouped by T0, then p0, then Mach number") {
		t.Errorf("fixed T0 rule line %q", rule)
	}
	if !strings.Contains(counts, "set-point changes: T0 0, p0 ") {
		t.Errorf("fixed T0 counts %q, want no T0 change", counts)
	}

	// A what-if rule for every facility is named in the header and applies
	// to both lists.
	text = outRulePlan(t, envelope.OperatingRule{}, envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 120}, units.SI)
	if !strings.Contains(text, "rule      what-if for every facility: fixed temperature 120.0 K\n") {
		t.Errorf("header lacks the what-if rule:\n%s", text)
	}
	for _, name := range []string{"held tunnel", "standard tunnel"} {
		if rule, _ := outListHead(t, text, name); !strings.HasPrefix(rule, "operating rule: fixed T0 120.0 K, p0 to match") {
			t.Errorf("%s under the what-if rule: %q", name, rule)
		}
	}
}
