package envelope

import "testing"

// TestRuleName: a rule's name is the one the files write, with the value
// a fixed rule holds in the units given (SI without).
func TestRuleName(t *testing.T) {
	for _, c := range []struct {
		r    OperatingRule
		want string
	}{
		{OperatingRule{Kind: RuleWarmest}, "warmest"},
		{OperatingRule{Kind: RuleLeastLoad}, "least load"},
		{OperatingRule{Kind: RuleFixedTemperature, Temperature: 110}, "fixed temperature 110 K"},
		{OperatingRule{Kind: RuleFixedQ, Q: 50e3}, "fixed q 50.0 kPa"},
	} {
		if got := c.r.Name(nil); got != c.want {
			t.Errorf("%+v: Name %q, want %q", c.r, got, c.want)
		}
		if k, err := ParseRuleKind(c.r.Kind.String()); err != nil || k != c.r.Kind {
			t.Errorf("%q does not read back: %v, %v", c.r.Kind, k, err)
		}
	}
}
