package envelope

import (
	"fmt"
	"math"
	"strings"
)

// An operating rule picks one setting when many settings of a facility
// reach the target at a point: at a test Mach number a gas facility
// usually reaches the flight Reynolds number along a whole line of
// (p0, T0), and a water tunnel along a line of (water temperature,
// speed) — the point's matching set (MatchingSet). The rule is a choice,
// per facility (Facility.Rule) and as a what-if for every facility
// (Settings.Rule); whatever picks it, every output uses the same rule and
// states it (OperatingRule.Describe).

// RuleKind names an operating rule.
type RuleKind uint8

// Operating rules.
const (
	// RuleDefault is the zero value: on a facility, its medium's standard
	// rule (RuleWarmest); on Settings, "keep each facility's rule".
	RuleDefault RuleKind = iota
	// RuleWarmest takes the warmest setting that reaches the target: for a
	// gas facility the warmest T0, then the lowest p0 at that T0 (least
	// coolant in a cooled tunnel, fewest changes of T0); for a water
	// tunnel the warmest water (lowest viscosity), then the lowest speed.
	// It is the standard rule of both media.
	RuleWarmest
	// RuleLeastLoad takes the lowest test-section dynamic pressure, and so
	// the lowest model, sting and balance load: the coldest T0 on the
	// matching line, where p0 is lowest (gas only; in water the warmest
	// water already needs the least speed). It needs the facility's
	// balance capacity (Facility.Balance).
	RuleLeastLoad
	// RuleFixedTemperature holds the stagnation temperature (gas) or the
	// water temperature at OperatingRule.Temperature: only p0 (gas) or
	// the speed (water) moves, the fewest slow changes of a run list.
	RuleFixedTemperature
	// RuleFixedQ holds the test-section dynamic pressure at
	// OperatingRule.Q: the Reynolds number is varied by T0 alone, so that
	// Reynolds effects are kept apart from aeroelastic ones (gas only).
	RuleFixedQ

	numRuleKinds = int(RuleFixedQ) + 1
)

// ruleKindNames are the names of the rules as files and the editor write
// them (ParseRuleKind also takes a few other spellings).
var ruleKindNames = [...]string{
	RuleDefault:          "default",
	RuleWarmest:          "warmest",
	RuleLeastLoad:        "least load",
	RuleFixedTemperature: "fixed temperature",
	RuleFixedQ:           "fixed q",
}

// String returns the rule's name, e.g. "least load".
func (k RuleKind) String() string {
	if int(k) < len(ruleKindNames) {
		return ruleKindNames[k]
	}
	return fmt.Sprintf("RuleKind(%d)", int(k))
}

// ForGas and ForWater report whether the rule applies to a gas facility
// and to a water tunnel.
func (k RuleKind) ForGas() bool { return int(k) < numRuleKinds }

// ForWater: see ForGas.
func (k RuleKind) ForWater() bool {
	return k == RuleDefault || k == RuleWarmest || k == RuleFixedTemperature
}

// ruleSpellings are the other ways a rule's name may be written (after
// case folding and with '-' and '_' read as spaces).
var ruleSpellings = map[string]RuleKind{
	"least coolant":           RuleWarmest,
	"warmest water":           RuleWarmest,
	"least-load":              RuleLeastLoad,
	"lowest q":                RuleLeastLoad,
	"fixed t0":                RuleFixedTemperature,
	"fixed water temperature": RuleFixedTemperature,
	"fixed dynamic pressure":  RuleFixedQ,
}

// RuleKinds lists the rules a facility of medium m may name, the standard
// one first (RuleDefault left out).
func RuleKinds(m Medium) []RuleKind {
	var out []RuleKind
	for k := RuleWarmest; int(k) < numRuleKinds; k++ {
		if m == MediumWater && k.ForWater() || m != MediumWater && k.ForGas() {
			out = append(out, k)
		}
	}
	return out
}

// ParseRuleKind reads a rule's name: "warmest", "least load", "fixed
// temperature" or "fixed q" (case ignored, '-' or '_' for the spaces; also
// "fixed T0", "fixed water temperature", "warmest water"). "default" is
// RuleDefault.
func ParseRuleKind(s string) (RuleKind, error) {
	t := strings.ToLower(strings.Join(strings.FieldsFunc(s, func(r rune) bool {
		return r == ' ' || r == '-' || r == '_' || r == '\t'
	}), " "))
	for k, n := range ruleKindNames {
		if t == n {
			return RuleKind(k), nil
		}
	}
	if k, ok := ruleSpellings[t]; ok {
		return k, nil
	}
	return 0, fmt.Errorf("found %q, expected an operating rule: %s", s, ruleNameList(RuleKinds("")))
}

// ruleNameList writes the names of ks as a quoted list, "a", "b" or "c".
func ruleNameList(ks []RuleKind) string {
	q := make([]string, len(ks))
	for i, k := range ks {
		q[i] = fmt.Sprintf("%q", k.String())
	}
	if len(q) < 2 {
		return strings.Join(q, "")
	}
	return strings.Join(q[:len(q)-1], ", ") + " or " + q[len(q)-1]
}

// OperatingRule is the rule that picks a facility's setting at each point
// (see RuleKind), with the value a fixed rule holds. The zero value is the
// standard rule (RuleWarmest).
type OperatingRule struct {
	Kind RuleKind
	// Temperature is the T0 (gas) or water temperature that
	// RuleFixedTemperature holds, K.
	Temperature float64
	// Q is the test-section dynamic pressure RuleFixedQ holds, Pa.
	Q float64
}

// RuleInForce is the rule facility f runs under with settings s: s.Rule
// when it names one, else the facility's, RuleWarmest when neither does.
// It is never RuleDefault.
func RuleInForce(f *Facility, s Settings) OperatingRule {
	r := f.Rule
	if s.Rule.Kind != RuleDefault {
		r = s.Rule
	}
	if r.Kind == RuleDefault {
		r = OperatingRule{Kind: RuleWarmest}
	}
	return r
}

// Describe states the rule in a few words for a facility of medium m, with
// the value a fixed rule holds written by u (nil: SI): "warmest T0, then
// lowest p0". The interface shows it beside each answer and the outputs
// carry it, so the choice is never hidden in the solver.
func (r OperatingRule) Describe(m Medium, u QuantityFormat) string {
	if u == nil {
		u = SIFormat{}
	}
	water := m == MediumWater
	switch r.Kind {
	case RuleDefault, RuleWarmest:
		if water {
			return "warmest water, then lowest speed"
		}
		return "warmest T0, then lowest p0"
	case RuleLeastLoad:
		return "least load: coldest T0 on the matching line, lowest p0 and q"
	case RuleFixedTemperature:
		if water {
			return "fixed water temperature " + u.Temp(r.Temperature) + ", speed to match"
		}
		return "fixed T0 " + u.Temp(r.Temperature) + ", p0 to match"
	case RuleFixedQ:
		return "fixed q " + u.Q(r.Q) + ", T0 to match"
	}
	return r.Kind.String()
}

// Name is the rule by its name as the files write it, with the value a
// fixed rule holds written by u (nil: SI): "warmest", "fixed q 80 kPa".
func (r OperatingRule) Name(u QuantityFormat) string {
	if u == nil {
		u = SIFormat{}
	}
	switch r.Kind {
	case RuleFixedTemperature:
		return r.Kind.String() + " " + u.Temp(r.Temperature)
	case RuleFixedQ:
		return r.Kind.String() + " " + u.Q(r.Q)
	}
	return r.Kind.String()
}

// RuleError is a rule that does not suit a facility: Field says which part
// of the rule is wrong ("rule" for the kind, "temperature" or "q" for the
// value), so that the loader and the editor can name the key or field.
type RuleError struct {
	Field string
	// Found and Expected read like the loader's file errors.
	Found, Expected string
}

func (e *RuleError) Error() string {
	what := "operating rule"
	if e.Field != "rule" {
		what += " " + e.Field
	}
	return what + ": found " + e.Found + ", expected " + e.Expected
}

// CheckRuleKind checks that rule kind k suits facility f: a gas rule on a
// gas facility, a water rule on a water tunnel, and for RuleLeastLoad a
// balance capacity to plan the load against.
func CheckRuleKind(k RuleKind, f *Facility) error {
	water := f.Medium == MediumWater
	switch {
	case int(k) >= numRuleKinds:
		return &RuleError{Field: "rule", Found: k.String(), Expected: ruleNameList(RuleKinds(f.Medium))}
	case water && !k.ForWater():
		return &RuleError{Field: "rule", Found: fmt.Sprintf("%q on a water tunnel", k.String()),
			Expected: "a water tunnel's rule: " + ruleNameList(RuleKinds(MediumWater)) +
				" (the warmest water already needs the least speed and load)"}
	case k == RuleLeastLoad && !f.Balance.Set():
		return &RuleError{Field: "rule", Found: `"least load" with no balance capacity`,
			Expected: "the facility's largest balance normal force or pitching moment, or another rule: " +
				ruleNameList([]RuleKind{RuleWarmest, RuleFixedTemperature, RuleFixedQ})}
	}
	return nil
}

// CheckRuleTemperature checks a fixed temperature v (K) for facility f:
// within the facility's T0 (gas) or water temperature range, and for a gas
// facility that checks condensation, not so cold that the test section
// condenses even at its lowest p0 and Mach number (nowhere could it run).
// found is the value as typed, shown in the error ("" shows v in K). It
// returns the value to use (a water temperature a rounding below the range
// is its end).
func CheckRuleTemperature(f *Facility, found string, v float64) (float64, error) {
	lo, hi := f.TemperatureMin(), f.TemperatureMax()
	b := Bound{Lo: lo, Hi: hi, Slack: 1e-9 * hi,
		Expected: fmt.Sprintf("a temperature within the facility's range, %s K to %s K", numberText(lo), numberText(hi))}
	if found == "" {
		found = numberText(v) + " K"
	}
	if err := b.Check(found, b.Clamp(v)); err != nil {
		return 0, ruleValueError("temperature", err)
	}
	v = min(max(v, lo), hi)
	if f.Medium == MediumWater {
		return v, nil
	}
	if floor, ok := condensationFreeT0(f); ok && v < floor*(1-1e-12) {
		return 0, &RuleError{Field: "temperature", Found: found,
			Expected: fmt.Sprintf("a T0 of at least %s K: colder, the test section condenses even at the facility's lowest p0 and Mach number", numberText(floor))}
	}
	return v, nil
}

// condensationFreeT0 is the lowest T0 at which gas facility f runs clear
// of the saturation line at all: at its lowest p0 and Mach number, where
// the static state is warmest relative to its pressure. ok is false when f
// does not check condensation there, or its gas is unknown.
func condensationFreeT0(f *Facility) (float64, bool) {
	sv, err := newSolver(&Facility{Medium: f.Medium, Gas: f.Gas, Width: f.Width, Height: f.Height},
		Settings{}, DefaultSettings(nil).Regimes)
	gs, isGas := sv.(*gasSolver)
	if err != nil || !isGas {
		return 0, false
	}
	c := gs.bounds(f.Gas.MachMin)
	if !c.condOn {
		return 0, false
	}
	return gs.gas.SaturationTemperature(f.Gas.P0Min*c.pi) / c.tau, true
}

// CheckRuleQ checks a fixed dynamic pressure v (Pa) for gas facility f:
// above 0, not above its q max, and within what the facility runs at some
// Mach number of its range between its lowest and highest p0. found is the
// value as typed ("" shows v in Pa).
func CheckRuleQ(f *Facility, found string, v float64) (float64, error) {
	if found == "" {
		found = numberText(v) + " Pa"
	}
	if f.Medium == MediumWater {
		return 0, &RuleError{Field: "rule", Found: `"fixed q" on a water tunnel`, Expected: "a water tunnel's rule: " + ruleNameList(RuleKinds(MediumWater))}
	}
	b := QMaxBound()
	if f.QMax > 0 {
		b.Hi = f.QMax
		b.Expected = fmt.Sprintf("a dynamic pressure above 0 and at most the facility's q max, %s Pa", numberText(f.QMax))
	}
	if err := b.Check(found, v); err != nil {
		return 0, ruleValueError("q", err)
	}
	if lo, hi, ok := gasQRange(f); ok && (v < lo*(1-1e-12) || v > hi*(1+1e-12)) {
		return 0, &RuleError{Field: "q", Found: found,
			Expected: fmt.Sprintf("a dynamic pressure the facility runs, %s Pa (its lowest p0 at an end of its Mach range) to %s Pa (its highest p0)", numberText(lo), numberText(hi))}
	}
	return v, nil
}

// gasQRange is the span of test-section dynamic pressure gas facility f
// runs over its Mach range: from P0Min at an end of the range up to P0Max
// at the Mach number of its range nearest √2, where q/p0 = ½γM²·τ^e peaks for every γ
// (τ = 1/(1 + aM²), a = (γ − 1)/2, e = γ/(γ − 1): d ln(M²τ^e)/d(M²) =
// 1/M² − ea/(1 + aM²) vanishes at M² = 1/(a(e − 1)) = 2). q/p0 rises with
// M below √2 and falls above, so its lowest is at an end of the range.
func gasQRange(f *Facility) (lo, hi float64, ok bool) {
	sv, err := newSolver(&Facility{Medium: f.Medium, Gas: f.Gas, Width: f.Width, Height: f.Height},
		Settings{}, DefaultSettings(nil).Regimes)
	gs, isGas := sv.(*gasSolver)
	if err != nil || !isGas {
		return 0, 0, false
	}
	qOverP0 := func(M float64) float64 {
		tau := 1 / (1 + 0.5*(gs.gamma-1)*M*M)
		return 0.5 * gs.gamma * M * M * gs.pressureRatio(tau)
	}
	g := f.Gas
	peak := min(max(math.Sqrt2, g.MachMin), g.MachMax)
	return g.P0Min * min(qOverP0(g.MachMin), qOverP0(g.MachMax)), g.P0Max * qOverP0(peak), true
}

// ruleValueError turns a bound's error into a RuleError for field.
func ruleValueError(field string, err error) error {
	if ob, ok := err.(*OutOfBounds); ok {
		return &RuleError{Field: field, Found: ob.Found, Expected: ob.Expected}
	}
	return err
}

// CheckRule checks rule r against facility f: its kind (CheckRuleKind)
// and the value a fixed rule holds (CheckRuleTemperature, CheckRuleQ).
// Solve calls it for the rule in force; the loader and the editor call the
// parts to name the key or field.
func CheckRule(r OperatingRule, f *Facility) error {
	if err := CheckRuleKind(r.Kind, f); err != nil {
		return err
	}
	switch r.Kind {
	case RuleFixedTemperature:
		_, err := CheckRuleTemperature(f, "", r.Temperature)
		return err
	case RuleFixedQ:
		_, err := CheckRuleQ(f, "", r.Q)
		return err
	}
	return nil
}
