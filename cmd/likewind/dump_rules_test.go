package main

import (
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/tui"
)

// TestDumpHeaderRule: the dump header names the operating rule of the
// facility shown in words, and for the best of all each facility's rule
// by its tag, or one name when all share it.
func TestDumpHeaderRule(t *testing.T) {
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	k := -1
	for n := range facs {
		if strings.HasPrefix(facs[n].Name, "Kellen") {
			k = n
		}
	}
	if k < 0 {
		t.Fatal("no Kellen Fold facility in the demo")
	}
	facs[k].Balance.MaxNormalForce = 1e6
	facs[k].Rule = envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 80e3}
	s := envelope.DefaultSettings(v)
	e, err := envelope.Evaluate(v, facs, s)
	if err != nil {
		t.Fatal(err)
	}
	if err := e.Err(); err != nil {
		t.Fatal(err)
	}
	dump := func(facility int) string {
		t.Helper()
		out, err := tui.Dump(tui.DumpInput{Version: "test", Date: "2025-01-01", Grid: e.Grid, Maps: e.Maps,
			Facilities: e.Facilities, Settings: s, Facility: facility, Units: units.SI}, tui.PlainStyles())
		if err != nil {
			t.Fatal(err)
		}
		head, _, _ := strings.Cut(out, "\ncaution")
		return head
	}
	if h := dump(k); !strings.Contains(h, "\nrule      fixed q 80.00 kPa, T0 to match\n") {
		t.Errorf("Kellen Fold dump header lacks its rule:\n%s", h)
	}
	if h := dump(0); !strings.Contains(h, "\nrule      warmest T0, then lowest p0\n") {
		t.Errorf("standard-rule dump header:\n%s", h)
	}
	var want []string
	for n := range facs {
		r := "warmest"
		if n == k {
			r = "fixed q 80.00 kPa"
		}
		want = append(want, string(tui.FacilityTag(n))+": "+r)
	}
	if h := dump(-1); !strings.Contains(h, "\nrule      "+strings.Join(want, ", ")+"\n") {
		t.Errorf("best-of-all header lacks %q:\n%s", strings.Join(want, ", "), h)
	}
}
