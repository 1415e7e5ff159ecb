package whatif

import (
	"fmt"

	"likewind/envelope"
)

// Edit is one value (SI, or a choice's value) for one field, read and
// checked by Field.Parse. The editor applies a choice and the value it
// needs (a fixed rule and its temperature) as one change.
type Edit struct {
	Field Field
	Value float64
}

// CheckEdits refuses edits that the other values rule out, applied
// together to copies of the settings s and of facility fac (nil when no
// edit is a facility's): each field's check against the settings
// (Field.Validate), and on the facility the operating rule in force as the
// solve checks it (envelope.CheckRule), so that a rule chosen without the
// value it holds, or a T0 min raised above a fixed T0, is refused with the
// engine's reason before anything is solved.
func CheckEdits(s envelope.Settings, fac *envelope.Facility, edits ...Edit) error {
	var fc envelope.Facility
	if fac != nil {
		fc = *fac
	}
	onFacility, ruleEdit := false, false
	for _, e := range edits {
		if err := e.Field.Validate(s, e.Value); err != nil {
			return err
		}
		if e.Field.Facility() {
			if fac == nil {
				return fmt.Errorf("%s: choose a facility first", e.Field.Label(false))
			}
			onFacility = true
			ruleEdit = ruleEdit || isRuleField(e.Field)
		}
		e.Field.Set(&s, &fc, e.Value)
	}
	if !onFacility {
		return nil
	}
	if err := envelope.CheckRule(fc.Rule, &fc); err != nil {
		if ruleEdit {
			return err
		}
		return fmt.Errorf("%s: conflicts with the operating rule in force: %w", edits[len(edits)-1].Field.Label(IsWater(fac)), err)
	}
	return nil
}

// isRuleField reports whether f is the operating rule or a value it holds.
func isRuleField(f Field) bool { return f == Rule || f == RuleTemperature || f == RuleQ }
