package whatif

import (
	"encoding/json"
	"slices"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
)

// demoFacility is the demo facility whose name starts with prefix.
func demoFacility(t *testing.T, facs []envelope.Facility, prefix string) int {
	t.Helper()
	for k := range facs {
		if strings.HasPrefix(facs[k].Name, prefix) {
			return k
		}
	}
	t.Fatalf("no demo facility %q", prefix)
	return -1
}

// The rule field offers the rules of the facility's medium by their
// names, standard first (envelope.RuleKinds), reads a typed name with the
// engine's spellings and refuses one the facility cannot run, whole.
func TestRuleFieldChoices(t *testing.T) {
	_, facs := demoData(t)
	gas := &facs[demoFacility(t, facs, "Kellen Fold")]
	water := &facs[demoFacility(t, facs, "Wenlow")]
	words := func(cs []Choice) []string {
		var out []string
		for _, c := range cs {
			out = append(out, c.Word)
		}
		return out
	}
	if got, want := words(Rule.Choices(gas)), []string{"warmest", "least load", "fixed temperature", "fixed q"}; !slices.Equal(got, want) {
		t.Errorf("gas rule choices %q, want %q", got, want)
	}
	if got, want := words(Rule.Choices(water)), []string{"warmest", "fixed temperature"}; !slices.Equal(got, want) {
		t.Errorf("water rule choices %q, want %q", got, want)
	}
	if !Rule.IsChoice() || P0Max.IsChoice() || Rule.Choices(nil) != nil {
		t.Error("only the rule is a choice field, and it offers nothing without a facility")
	}
	// A facility that names no rule runs under the standard one.
	if got := Rule.Show(units.SI, Rule.Get(nil, gas), false); got != "warmest" {
		t.Errorf("rule of a facility naming none shown %q, want \"warmest\"", got)
	}
	for _, c := range []struct {
		text string
		fac  *envelope.Facility
		want envelope.RuleKind
	}{
		{"fixed T0", gas, envelope.RuleFixedTemperature},
		{"Fixed-Q", gas, envelope.RuleFixedQ},
		{"warmest water", water, envelope.RuleWarmest},
		{"fixed temperature", water, envelope.RuleFixedTemperature},
	} {
		v, err := Rule.Parse(c.text, units.SI, c.fac)
		if err != nil || envelope.RuleKind(v) != c.want {
			t.Errorf("Parse(rule, %q) = %v, %v; want %v", c.text, envelope.RuleKind(v), err, c.want)
		}
	}
	// The cryogenic demo tunnel without its balance capacity.
	noBalance := *gas
	noBalance.Balance = envelope.BalanceLimits{}
	for _, c := range []struct {
		text string
		fac  *envelope.Facility
		want string
	}{
		{"least load", &noBalance, `operating rule: found "least load" with no balance capacity, expected the facility's largest balance normal force or pitching moment, or another rule: "warmest", "fixed temperature" or "fixed q"`},
		{"fixed q", water, `operating rule: found "fixed q" on a water tunnel, expected a water tunnel's rule: "warmest" or "fixed temperature" (the warmest water already needs the least speed and load)`},
		{"coolest", gas, `operating rule: found "coolest", expected an operating rule: "warmest", "least load", "fixed temperature" or "fixed q"`},
	} {
		_, err := Rule.Parse(c.text, units.SI, c.fac)
		if err == nil || err.Error() != c.want {
			t.Errorf("Parse(rule, %q) error\n%v\nwant\n%s", c.text, err, c.want)
		}
	}
	// With a balance (the demo tunnel's own) the least-load rule is
	// taken.
	if gas.Balance == (envelope.BalanceLimits{}) {
		t.Fatal("the cryogenic demo tunnel has no balance capacity")
	}
	if v, err := Rule.Parse("least load", units.SI, gas); err != nil || envelope.RuleKind(v) != envelope.RuleLeastLoad {
		t.Errorf("least load with a balance: %v, %v", envelope.RuleKind(v), err)
	}
}

// A fixed rule's value is a field only while that rule is chosen; the
// rule names the field it needs; a new fixed temperature starts from the
// top of the facility's range (Kellen Fold: 105 K to 313 K, demo data).
func TestRuleValueFields(t *testing.T) {
	_, facs := demoData(t)
	fac := facs[demoFacility(t, facs, "Kellen Fold")]
	if RuleTemperature.Applies(&fac) || RuleQ.Applies(&fac) || !P0Max.Applies(&fac) {
		t.Error("under the standard rule no rule value is a field")
	}
	if f, ok := Rule.Needs(float64(envelope.RuleFixedTemperature)); !ok || f != RuleTemperature {
		t.Errorf("fixed temperature needs %v, %v; want the rule temperature", f, ok)
	}
	if f, ok := Rule.Needs(float64(envelope.RuleFixedQ)); !ok || f != RuleQ {
		t.Errorf("fixed q needs %v, %v; want the rule q", f, ok)
	}
	if _, ok := Rule.Needs(float64(envelope.RuleLeastLoad)); ok {
		t.Error("least load needs no value")
	}
	if got := RuleTemperature.StartValue(nil, &fac); got != 313 {
		t.Errorf("start of a new fixed T0 = %g K, want 313 K (T0 max)", got)
	}
	fac.Rule = envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 150}
	if !RuleTemperature.Applies(&fac) || RuleQ.Applies(&fac) {
		t.Error("under a fixed T0 its temperature is a field, q is not")
	}
	if got := RuleTemperature.StartValue(nil, &fac); got != 150 {
		t.Errorf("start of a held fixed T0 = %g K, want 150 K", got)
	}
	// Below condensation or outside the range: the engine's reason.
	if _, err := RuleTemperature.Parse("90 K", units.SI, &fac); err == nil || !strings.Contains(err.Error(), "105 K to 313 K") {
		t.Errorf("fixed T0 90 K: error %v, want the facility's range named", err)
	}
}

// The editor's edits are checked together with the engine's rule check:
// a fixed rule with its value passes, a fixed rule without one does not,
// and a limit moved past the value a rule holds is refused naming the
// conflict.
func TestCheckEditsRule(t *testing.T) {
	v, facs := demoData(t)
	s := envelope.DefaultSettings(v)
	fac := facs[demoFacility(t, facs, "Kellen Fold")]
	fixed := Edit{Rule, float64(envelope.RuleFixedTemperature)}
	if err := CheckEdits(s, &fac, fixed, Edit{RuleTemperature, 150}); err != nil {
		t.Errorf("fixed T0 150 K: %v", err)
	}
	if err := CheckEdits(s, &fac, fixed); err == nil || !strings.Contains(err.Error(), "operating rule temperature") {
		t.Errorf("fixed T0 with no temperature: error %v, want the temperature named", err)
	}
	fac.Rule = envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 150}
	err := CheckEdits(s, &fac, Edit{T0Min, 200})
	want := "T0 min: conflicts with the operating rule in force: operating rule temperature: found 150 K, expected a temperature within the facility's range, 200 K to 313 K"
	if err == nil || err.Error() != want {
		t.Errorf("T0 min 200 K under fixed T0 150 K: error\n%v\nwant\n%s", err, want)
	}
	if err := CheckEdits(s, &fac, Edit{T0Min, 120}); err != nil {
		t.Errorf("T0 min 120 K under fixed T0 150 K: %v", err)
	}
	if err := CheckEdits(s, nil, Edit{MachTol, 0.02}); err != nil {
		t.Errorf("a setting with no facility: %v", err)
	}
}

// A rule chosen in the editor goes into the session file by its name,
// with the value it holds, and comes back from it; a value no rule holds
// now is not saved.
func TestRuleSessionRoundTrip(t *testing.T) {
	v, fileFacs := demoData(t)
	s := envelope.DefaultSettings(v)
	k := demoFacility(t, fileFacs, "Kellen Fold")
	facs := slices.Clone(fileFacs)
	facs[k].Rule = envelope.OperatingRule{Kind: envelope.RuleFixedTemperature, Temperature: 150, Q: 40000}
	w := Diff(s, s, facs, fileFacs)
	b, err := json.Marshal(w)
	if err != nil {
		t.Fatal(err)
	}
	want := `{"facilities":{"Kellen Fold cryogenic transonic tunnel":{"rule":"fixed temperature","rule_temperature_K":150}}}`
	if string(b) != want {
		t.Errorf("what-if written as\n%s\nwant\n%s", b, want)
	}
	var back Changes
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	got := slices.Clone(fileFacs)
	changed, err := Apply(back, &s, got)
	if err != nil {
		t.Fatal(err)
	}
	if r := got[k].Rule; r.Kind != envelope.RuleFixedTemperature || r.Temperature != 150 {
		t.Errorf("rule restored as %+v, want fixed temperature 150 K", r)
	}
	if want := []string{facs[k].Name + " operating rule", facs[k].Name + " rule temperature"}; !slices.Equal(changed, want) {
		t.Errorf("Apply changed %q, want %q", changed, want)
	}
	// Back to the standard rule: the temperature held before is no field
	// now, and the rule is as the file has it: nothing to save.
	facs[k].Rule.Kind = envelope.RuleWarmest
	if w := Diff(s, s, facs, fileFacs); len(w.Facilities) != 0 {
		t.Errorf("standard rule with a stale temperature saved as %+v, want nothing", w.Facilities)
	}
	// A rule name the engine does not know is refused with the names.
	err = json.Unmarshal([]byte(`{"facilities":{"T":{"rule":"coolest"}}}`), &back)
	if err == nil || !strings.Contains(err.Error(), `what-if rule: found "coolest", expected an operating rule`) {
		t.Errorf("unknown rule: error %v", err)
	}
	if err := json.Unmarshal([]byte(`{"facilities":{"T":{"rule":3}}}`), &back); err == nil {
		t.Error("a rule given as a number is read; want it refused")
	}
}

// A hand-edited session cannot leave a facility with a rule it cannot run
// under: a fixed temperature without its value, or a rule value the
// facility refuses, leaves the facility as its file has it and is named.
func TestApplyRuleRefused(t *testing.T) {
	v, facs := demoData(t)
	kf := demoFacility(t, facs, "Kellen Fold")
	name := facs[kf].Name
	facs[kf].Balance = envelope.BalanceLimits{} // for the least-load case
	for _, c := range []struct {
		what string
		fw   FacilityChanges
		want string
	}{
		{"fixed temperature without one", FacilityChanges{"rule": float64(envelope.RuleFixedTemperature), "t0_min_K": 120},
			"what-if " + name + ": operating rule temperature: found 0 K"},
		{"fixed temperature out of range", FacilityChanges{"rule": float64(envelope.RuleFixedTemperature), "rule_temperature_K": 400},
			"what-if " + name + " rule temperature: operating rule temperature: found 400 K, expected a temperature within the facility's range"},
		{"least load without a balance", FacilityChanges{"rule": float64(envelope.RuleLeastLoad)},
			`operating rule: found "least load" with no balance capacity`},
	} {
		s := envelope.DefaultSettings(v)
		fs := slices.Clone(facs)
		changed, err := Apply(Changes{Facilities: map[string]FacilityChanges{name: c.fw}}, &s, fs)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.what, err, c.want)
		}
		if len(changed) != 0 || !slices.Equal(fs, facs) {
			t.Errorf("%s: applied %q, want the facility as its file has it", c.what, changed)
		}
	}
}
