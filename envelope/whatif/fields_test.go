package whatif

import (
	"math"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
)

// Every row of the field table is whole, and what the editor starts the
// input line with reads back as the value shown, in both unit systems.
func TestFieldTableRows(t *testing.T) {
	v, facs := demoData(t)
	keys := map[string]bool{}
	seenLimit := false
	for f := range FieldCount {
		d := f.row()
		if d.label == "" || d.name == "" || d.key == "" || d.get == nil || d.set == nil || d.show == nil {
			t.Errorf("field %d: row incomplete: %+v", f, d)
		}
		if d.facility && d.limit == nil || !d.facility && (d.read == nil || d.bound == nil) || d.choice != nil && !d.facility {
			t.Errorf("%s: no parser or bound", d.label)
		}
		if keys[d.key] {
			t.Errorf("%s: session key %q used twice", d.label, d.key)
		}
		keys[d.key] = true
		if seenLimit && !d.facility {
			t.Errorf("%s: the editor lists the settings before the facility limits", d.label)
		}
		seenLimit = seenLimit || d.facility
		for k := range facs {
			s := envelope.DefaultSettings(v)
			fc := facs[k]
			fac := &fc
			if !f.Applies(fac) {
				// A fixed rule's value: a field once the rule that holds
				// it is chosen, where the medium offers that rule.
				kind := envelope.RuleFixedTemperature
				if f == RuleQ {
					kind = envelope.RuleFixedQ
				}
				if fac.Medium == envelope.MediumWater && !kind.ForWater() {
					continue
				}
				fac.Rule.Kind = kind
			}
			var on *envelope.Facility
			if d.facility {
				on = fac
			}
			want := f.StartValue(&s, fac)
			for _, u := range []units.System{units.SI, units.Customary} {
				text := f.EditText(u, want, IsWater(fac))
				got, err := f.Parse(text, u, on)
				if err != nil {
					t.Errorf("%s of %s: the start text %q is refused: %v", d.label, fac.Name, text, err)
					continue
				}
				// The text is rounded as shown: within its last digit.
				if math.Abs(got-want) > 5e-3*math.Abs(want)+1e-9 {
					t.Errorf("%s of %s: %q reads %g, want %g", d.label, fac.Name, text, got, want)
				}
			}
			if !d.facility {
				break
			}
		}
	}
	// The session keys of today's files (see oldSessionFile in envelope/session).
	for _, k := range []string{"scale", "delta_t_K", "mach_tol", "re_tol", "compressibility_mach", "p0_max_Pa", "t0_min_K", "q_max_Pa"} {
		if !keys[k] {
			t.Errorf("session key %q is no field's: old session files would not load", k)
		}
	}
}

// A hand-edited session cannot bring in a compressibility threshold the
// editor refuses: at or above the subsonic bound of the regime classes
// (Mach 0.8 by default, common practice), which would leave the regimes
// out of order.
func TestApplyCompressibilityBelowSubsonic(t *testing.T) {
	v, facs := demoData(t)
	s := envelope.DefaultSettings(v)
	before := s
	changed, err := Apply(Changes{Values: map[string]float64{"compressibility_mach": 0.9}}, &s, facs)
	if err == nil || !strings.Contains(err.Error(), "below the subsonic bound 0.80") {
		t.Errorf("Apply(compressibility 0.9) error = %v, want the subsonic bound named", err)
	}
	if len(changed) != 0 || s != before {
		t.Errorf("Apply applied %q: settings %+v", changed, s)
	}
	// Set in code, a key that names no field is named too.
	_, err = Apply(Changes{Values: map[string]float64{"scael": 0.1}}, &s, facs)
	if err == nil || !strings.Contains(err.Error(), `unknown value "scael"`) {
		t.Errorf("Apply(unknown key) error = %v", err)
	}
}
