package envelope

import (
	"fmt"
	"strconv"
	"strings"
)

// The operating rule and balance keys of a [[facility]] table. The rows
// (facilityFields) read each key on its own; checkRule then checks the
// rule against the facility it is read with (CheckRuleKind,
// CheckRuleTemperature, CheckRuleQ) and the values against the rule, and
// names the key in each refusal.

// File keys of the operating rule.
const (
	keyRule     = "operating_rule"
	keyRuleT    = "rule_temperature"
	keyRuleQ    = "rule_q"
	keyBalanceN = "balance_max_normal_force"
	keyBalanceM = "balance_max_pitching_moment"
)

// ruleFields are the rows of the operating rule, read into f.Rule.
func ruleFields(f *Facility) []facilityField {
	r := &f.Rule
	return []facilityField{
		{everyMedium, keyFunc{keyRule, func(t *table) { readRuleKind(t, f) }, func(b *strings.Builder) {
			if r.Kind != RuleDefault {
				kv(b, keyRule, tomlQuote(r.Kind.String()))
			}
		}}},
		{everyMedium, keyFunc{keyRuleT, func(t *table) {
			b := gasT0Bound()
			if f.Medium == MediumWater {
				b = waterTemperatureBound()
			}
			q := t.quantity(keyRuleT, uTemp, false)
			r.Temperature = t.d.within(&q, b)
		}, func(b *strings.Builder) {
			if r.Kind == RuleFixedTemperature {
				kv(b, keyRuleT, si(r.Temperature, "K"))
			}
		}}},
		{everyMedium, keyFunc{keyRuleQ, func(t *table) {
			q := t.quantity(keyRuleQ, uPressure, false)
			r.Q = t.d.within(&q, QMaxBound())
		}, func(b *strings.Builder) {
			if r.Kind == RuleFixedQ {
				kv(b, keyRuleQ, si(r.Q, "Pa"))
			}
		}}},
	}
}

// knownMedium reports whether m is a medium the loader knows.
func knownMedium(m Medium) bool { return m.IsGas() || m == MediumWater }

// readRuleKind reads operating_rule into f.Rule.Kind: one of the rules
// RuleKinds lists for f's medium (an unknown word lists them).
func readRuleKind(t *table, f *Facility) {
	f.Rule.Kind = RuleDefault
	names := ruleNameList(RuleKinds(f.Medium))
	s, ok := t.text(keyRule, false, "an operating rule in quotes: "+names)
	if !ok {
		return
	}
	k, err := ParseRuleKind(s)
	if err != nil {
		p := t.keyPath(keyRule)
		t.d.fail(p, display(p), strconv.Quote(s), "an operating rule: "+names)
		return
	}
	f.Rule.Kind = k
}

// ruleRefused reports whether t holds an operating_rule that was refused
// when read (not text, or no rule's name).
func ruleRefused(t *table) bool {
	raw, ok := t.get(keyRule)
	if !ok {
		return false
	}
	s, isText := raw.(string)
	_, err := ParseRuleKind(s)
	return !isText || strings.TrimSpace(s) == "" || err != nil
}

// checkRule checks facility f's operating rule as read from t: the rule
// against the facility's medium and balance, each value a fixed rule
// holds present and within what the facility runs (only when its limits
// read clean, limitsOK: a refused range would give false reasons), and no
// value without the rule that holds it. A refused rule leaves f.Rule the
// standard one.
func (d *doc) checkRule(t *table, f *Facility, limitsOK bool) {
	if ruleRefused(t) {
		f.Rule = OperatingRule{}
		return
	}
	bad := false
	fail := func(key, found, expected string) {
		p := t.keyPath(key)
		d.fail(p, display(p), found, expected)
		bad = true
	}
	k := f.Rule.Kind
	balanceRefused := f.Balance.MaxNormalForce == 0 && t.has(keyBalanceN) || f.Balance.MaxPitchMoment == 0 && t.has(keyBalanceM)
	var re *RuleError
	switch err := CheckRuleKind(k, f); {
	case !knownMedium(f.Medium) || err == nil:
	case k == RuleLeastLoad && f.Medium != MediumWater && !f.Balance.Set():
		if !balanceRefused {
			fail(keyRule, strconv.Quote(k.String())+" with no balance capacity",
				keyBalanceN+" or "+keyBalanceM+" to plan the load against, or another rule: "+
					ruleNameList([]RuleKind{RuleWarmest, RuleFixedTemperature, RuleFixedQ}))
		}
		bad = true
	case asRuleError(err, &re):
		fail(keyRule, re.Found, re.Expected)
	default:
		fail(keyRule, strconv.Quote(k.String()), err.Error())
	}
	what := "T0"
	if f.Medium == MediumWater {
		what = "water temperature"
	}
	for _, v := range []struct {
		key  string
		kind RuleKind
		val  *float64
		need string
		chk  func(*Facility, string, float64) (float64, error)
	}{
		{keyRuleT, RuleFixedTemperature, &f.Rule.Temperature, "the " + what + " the \"fixed temperature\" rule holds, " + uTemp.expect(), CheckRuleTemperature},
		{keyRuleQ, RuleFixedQ, &f.Rule.Q, "the test-section dynamic pressure the \"fixed q\" rule holds, " + uPressure.expect(), CheckRuleQ},
	} {
		has := t.has(v.key)
		switch {
		case k != v.kind && has:
			with := "with no " + keyRule
			if t.has(keyRule) {
				with = fmt.Sprintf("with %s %q", keyRule, k.String())
			}
			fail(v.key, v.key+" "+with, fmt.Sprintf("%s = %q to hold it, or no %s", keyRule, v.kind.String(), v.key))
		case k != v.kind || bad:
		case !has:
			t.missing(v.key, v.need)
			bad = true
		case *v.val != 0 && limitsOK && knownMedium(f.Medium):
			raw, _ := t.get(v.key)
			got, err := v.chk(f, describe(raw), *v.val)
			if asRuleError(err, &re) {
				key := map[string]string{"rule": keyRule, "temperature": keyRuleT, "q": keyRuleQ}[re.Field]
				fail(key, re.Found, re.Expected)
			} else if err != nil {
				fail(v.key, describe(raw), err.Error())
			}
			*v.val = got
		}
	}
	if bad || !knownMedium(f.Medium) {
		f.Rule = OperatingRule{}
		return
	}
	if k != RuleFixedTemperature {
		f.Rule.Temperature = 0
	}
	if k != RuleFixedQ {
		f.Rule.Q = 0
	}
}

// asRuleError is errors.As for a *RuleError.
func asRuleError(err error, re **RuleError) bool {
	e, ok := err.(*RuleError)
	if ok {
		*re = e
	}
	return ok
}
