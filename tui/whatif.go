package tui

import (
	"errors"
	"fmt"
	"sort"

	"likewind/envelope"
)

// ApplyWhatIf applies a session's what-if values to the settings s and to
// the facilities facs (found by exact name), the way the interface does
// when it restores a session, and lists what it changed in a fixed order:
// the settings first, then each facility's limits by facility name, e.g.
// "ΔT" or "<facility> p0 max".
//
// A value is checked as the editor checks a typed one (the what-if field
// table): a value out of its bounds or not a finite number, a key that
// names no field, or a facility that is not among facs, is left out; the
// returned error lists every such value (nil when everything was applied).
// A new compressibility Mach number also moves the incompressible bound of
// the regime classes, as in the editor.
func ApplyWhatIf(w WhatIf, s *envelope.Settings, facs []envelope.Facility) (changed []string, err error) {
	var problems []error
	// apply puts the value stored under field f's key in vals (if any)
	// into s or fac, checked as the editor checks it, so a hand-edited
	// session cannot bring in what the keyboard would refuse.
	apply := func(f field, fac *envelope.Facility, prefix string, vals map[string]float64) {
		v, ok := vals[f.def().key]
		if !ok {
			return
		}
		name := prefix + f.def().name
		x, err := checkField(f, v, fac)
		if err == nil {
			err = validateField(f, *s, x)
		}
		if err != nil {
			problems = append(problems, fmt.Errorf("what-if %s: %w", name, err))
			return
		}
		f.def().set(s, fac, x)
		changed = append(changed, name)
	}
	problems = append(problems, unknownKeys(w.Values, false, "")...)
	for f := range fieldCount {
		if !f.facilityField() {
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
		for f := range fieldCount {
			if f.facilityField() {
				apply(f, &facs[k], name+" ", fw)
			}
		}
	}
	return changed, errors.Join(problems...)
}

// unknownKeys names the keys of vals that are no field's (settings, or
// facility limits), sorted.
func unknownKeys(vals map[string]float64, facility bool, prefix string) []error {
	var bad []string
	for k := range vals {
		if f, ok := fieldByKey(k, facility); !ok || f.def().key != k {
			bad = append(bad, k)
		}
	}
	sort.Strings(bad)
	var out []error
	for _, k := range bad {
		out = append(out, fmt.Errorf("what-if %sunknown value %q (expected %s)", prefix, k, fieldKeys(facility)))
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

// SnapPoint finds the grid point of a saved point: the altitude and speed
// each within half a grid step of an axis value. It reports false when
// the point is no longer on the grid (the grid or ΔT changed).
func SnapPoint(g *envelope.Grid, p Point) (envelope.GridPoint, bool) {
	if g == nil {
		return envelope.GridPoint{}, false
	}
	i, ok1 := nearestIndex(g.Alts, p.Altitude)
	j, ok2 := nearestIndex(g.Speeds, p.Speed)
	if !ok1 || !ok2 {
		return envelope.GridPoint{}, false
	}
	return envelope.GridPoint{Row: i, Col: j}, true
}

// SnapMarks puts saved marks on the grid with SnapPoint, in their saved
// order without repeats, and counts those no longer on the grid.
func SnapMarks(g *envelope.Grid, pts []Point) (marks []envelope.GridPoint, lost int) {
	seen := map[envelope.GridPoint]bool{}
	for _, p := range pts {
		gp, ok := SnapPoint(g, p)
		if !ok {
			lost++
			continue
		}
		if !seen[gp] {
			seen[gp] = true
			marks = append(marks, gp)
		}
	}
	return marks, lost
}

// CheckSessionInputs accepts a session saved for the same data as the
// input files (their content hash, HashFiles) or as the loaded vehicle
// and facilities (DataHash: the built-in demo, or a session hashed that
// way). It returns CheckSession's reason otherwise.
func CheckSessionInputs(s Session, files []string, v *envelope.Vehicle, facs []envelope.Facility) error {
	var hashes []string
	if len(files) > 0 {
		if h, err := HashFiles(files...); err == nil {
			hashes = append(hashes, h)
		}
	}
	hashes = append(hashes, DataHash(v, facs))
	var err error
	for _, h := range hashes {
		if err = CheckSession(s, files, h); err == nil {
			return nil
		}
	}
	return err
}
