package whatif

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"likewind/envelope"
)

// Apply applies a session's what-if values to the settings s and to the
// facilities facs (found by exact name), the way the interface does when
// it restores a session, and lists what it changed in a fixed order: the
// settings first, then each facility's limits by facility name, e.g. "ΔT"
// or "<facility> p0 max".
//
// A value is checked as the editor checks a typed one (Field.Check, then
// Field.Validate): a value out of its bounds or not a finite number, a key
// that names no field, or a facility that is not among facs, is left out;
// the returned error lists every such value (nil when everything was
// applied).
// A new compressibility Mach number also moves the incompressible bound of
// the regime classes, as in the editor.
func Apply(w Changes, s *envelope.Settings, facs []envelope.Facility) (changed []string, err error) {
	var problems []error
	// apply puts the value stored under field f's key in vals (if any)
	// into s or fac, checked as the editor checks it, so a hand-edited
	// session cannot bring in what the keyboard would refuse.
	apply := func(f Field, fac *envelope.Facility, prefix string, vals map[string]float64) {
		v, ok := vals[f.Key()]
		if !ok {
			return
		}
		name := prefix + f.Name()
		x, err := f.Check(v, fac)
		if err == nil {
			err = f.Validate(*s, x)
		}
		if err != nil {
			problems = append(problems, fmt.Errorf("what-if %s: %w", name, err))
			return
		}
		f.Set(s, fac, x)
		changed = append(changed, name)
	}
	problems = append(problems, unknownKeys(w.Values, false, "")...)
	for f := range FieldCount {
		if !f.Facility() {
			apply(f, nil, "", w.Values)
		}
	}
	names := make([]string, 0, len(w.Facilities))
	for n := range w.Facilities {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, name := range names {
		k := facilityByName(facs, name)
		if k < 0 {
			problems = append(problems, fmt.Errorf("what-if for unknown facility %q", name))
			continue
		}
		fw := w.Facilities[name]
		problems = append(problems, unknownKeys(fw, true, name+" ")...)
		before, n := facs[k], len(changed)
		for f := range FieldCount {
			if f.Facility() {
				apply(f, &facs[k], name+" ", fw)
			}
		}
		// The facility's values together must leave it a rule it can run
		// under, as the solve checks it; else none of them is applied.
		if err := envelope.CheckRule(facs[k].Rule, &facs[k]); err != nil && len(changed) > n {
			problems = append(problems, fmt.Errorf("what-if %s: %w; its values %s", name, err, strings.Join(changed[n:], ", ")))
			facs[k], changed = before, changed[:n]
		}
	}
	return changed, errors.Join(problems...)
}

// unknownKeys names the keys of vals that are no field's (settings, or
// facility limits), sorted.
func unknownKeys(vals map[string]float64, facility bool, prefix string) []error {
	var bad []string
	for k := range vals {
		if f, ok := ByKey(k, facility); !ok || f.Key() != k {
			bad = append(bad, k)
		}
	}
	sort.Strings(bad)
	var out []error
	for _, k := range bad {
		out = append(out, fmt.Errorf("what-if %sunknown value %q (expected %s)", prefix, k, Keys(facility)))
	}
	return out
}

// facilityByName is the index of the facility named exactly name, or -1.
func facilityByName(facs []envelope.Facility, name string) int {
	for k := range facs {
		if facs[k].Name == name {
			return k
		}
	}
	return -1
}
