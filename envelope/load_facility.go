package envelope

import (
	"fmt"
	"iter"
	"math"
	"strconv"
	"strings"
)

// The facility format: one or more [[facility]] tables, each with a name,
// a class and a medium, then the fields below and a [facility.model] table.
var (
	facilityTables = []string{"facility"}
	// facilityKeys are the keys of a [[facility]] table, in the order they
	// are documented (unknown-key errors list them in this order).
	facilityKeys = append([]string{"name", "class", "medium"}, facilityFieldKeys()...)
	// waterCounterpart names, for a key of one medium, the key a facility
	// of the other medium has instead.
	waterCounterpart = map[string]string{
		"mach_range":                   "speed_range",
		"stagnation_pressure_range":    "static_pressure_range",
		"stagnation_temperature_range": "water_temperature_range",
		"speed_range":                  "mach_range",
		"static_pressure_range":        "stagnation_pressure_range",
		"water_temperature_range":      "stagnation_temperature_range",
	}
)

// facilities reads and checks a facility file.
func (d *doc) facilities() []Facility {
	root := d.table("", d.root, facilityTables)
	root.hint = "a facility file; a vehicle goes in a file of its own"
	defer root.finish()
	const form = "one or more [[facility]] tables"
	raw, ok := root.get("facility")
	if !ok {
		root.missing("facility", form)
		return nil
	}
	list, ok := raw.([]map[string]any)
	if !ok {
		d.fail("facility", "facility", describe(raw), form+" (note the double brackets)")
		return nil
	}
	// Each table is read into f, then copied out: the fields are bound to
	// f once per file, not once per facility (a file may hold thousands).
	var f Facility
	fields := facilityFields(&f)
	out := make([]Facility, 0, len(list))
	names := map[string]int{}
	for i, m := range list {
		p := fmt.Sprintf("facility[%d]", i)
		f = Facility{Source: d.file}
		d.facility(d.table(p, m, facilityKeys), &f, fields)
		if f.Name != "" {
			key := strings.ToLower(f.Name)
			if j, dup := names[key]; dup {
				np := p + ".name"
				d.fail(np, display(np), strconv.Quote(f.Name),
					fmt.Sprintf("a name not already used (facility[%d] has it)", j+1))
			} else {
				names[key] = i
			}
		}
		out = append(out, f)
	}
	return out
}

// facility reads one [[facility]] table into f, with fields, the
// facilityFields bound to f.
func (d *doc) facility(t *table, f *Facility, fields []facilityField) {
	defer t.finish()
	f.Name, _ = t.freeText("name", true, "the facility's name in quotes")
	f.Class, _ = t.freeText("class", false, `a short description in quotes, e.g. "pressurized transonic"`)

	medium := choose(t, "medium", true, mediumWanted(), mediumWanted(), mediumNamed)
	f.Medium = medium.v
	if medium.ok {
		for _, ff := range fields {
			if !ff.media.takes(f.Medium) && t.has(ff.name()) {
				d.wrongMedium(t, ff.name(), f.Medium)
			}
		}
	}
	start, limitsOK := d.problems(), false
	for ff := range inReadOrder(fields, f.Medium) {
		if ff.name() == keyRule {
			limitsOK = d.problems() == start
		}
		ff.read(t)
	}
	d.checkRule(t, f, limitsOK)
}

// inReadOrder gives the fields a facility of medium m takes in the order
// they are read and written: the medium's own first, then those of every
// facility (only those for a medium not known).
func inReadOrder(fields []facilityField, m Medium) iter.Seq[field] {
	return func(yield func(field) bool) {
		for _, own := range []bool{true, false} {
			for _, ff := range fields {
				if (ff.media != everyMedium) == own && ff.media.takes(m) && !yield(ff.field) {
					return
				}
			}
		}
	}
}

// wrongMedium reports key, one that facilities of medium m do not take.
func (d *doc) wrongMedium(t *table, key string, m Medium) {
	p := t.keyPath(key)
	exp := "no " + key + " (condensation limits apply to " + andList(gasMedia()) + " only)"
	if c, ok := waterCounterpart[key]; ok {
		exp = c + " instead"
	}
	d.fail(p, display(p), fmt.Sprintf("%s on a%s %s facility", key, article(m.String()), m), exp)
}

// media says which facilities take a key: every facility, or only those
// of a gas or of water.
type media int

const (
	everyMedium media = iota
	gasOnly
	waterOnly
)

// takes reports whether a facility of medium m takes a key of these media.
func (k media) takes(m Medium) bool {
	switch k {
	case gasOnly:
		return m.IsGas()
	case waterOnly:
		return m == MediumWater
	}
	return true
}

// facilityField is a key of a [[facility]] table and the facilities that
// take it.
type facilityField struct {
	media media
	field
}

// facilityFields are the keys of a [[facility]] table after its name,
// class and medium, in the order docs/FORMAT.md lists them, read into f.
func facilityFields(f *Facility) []facilityField {
	g, w := &f.Gas, &f.Water
	p0 := FacilityPressureBound()
	t0, tw := gasT0Bound(), waterTemperatureBound()
	length := aboveZero(MaxLength, "a length above 0 m")
	machLo, machHi := aboveZero(math.Inf(1), "a Mach number above 0"), upTo(maxMach, fmt.Sprintf("a Mach number up to %g", maxMach))
	speedLo, speedHi := aboveZero(math.Inf(1), "a speed above 0"), upTo(maxWaterSpeed, fmt.Sprintf("a water speed up to %g m/s", maxWaterSpeed))
	out := []facilityField{
		{gasOnly, rangeField{key: "mach_range", unit: uMach, required: true, lo: machLo, hi: machHi, toLo: &g.MachMin, toHi: &g.MachMax}},
		{waterOnly, rangeField{key: "speed_range", unit: uSpeed, required: true, lo: speedLo, hi: speedHi, toLo: &w.SpeedMin, toHi: &w.SpeedMax}},
		{gasOnly, rangeField{key: "stagnation_pressure_range", unit: uPressure, required: true, lo: p0, hi: p0, toLo: &g.P0Min, toHi: &g.P0Max}},
		{waterOnly, rangeField{key: "static_pressure_range", unit: uPressure, required: true, lo: p0, hi: p0, toLo: &w.PMin, toHi: &w.PMax}},
		{gasOnly, rangeField{key: "stagnation_temperature_range", unit: uTemp, required: true, lo: t0, hi: t0, toLo: &g.T0Min, toHi: &g.T0Max}},
		{waterOnly, rangeField{key: "water_temperature_range", unit: uTemp, required: true, lo: tw, hi: tw, toLo: &w.TMin, toHi: &w.TMax}},
		{everyMedium, quantityField{key: "max_dynamic_pressure", unit: uPressure, bound: QMaxBound(), to: &f.QMax}},
		{gasOnly, quantityField{key: "min_static_temperature", unit: uTemp, bound: aboveZero(maxGasT0, "a temperature above 0 K"), to: &g.MinStaticT}},
		{gasOnly, boolField{key: "condensation_check", def: true, to: &g.Condensation}},
		{gasOnly, quantityField{key: "peak_local_mach", unit: uMach, bound: Bound{Lo: 1, Hi: 10, Expected: "a Mach number from 1 to 10"}, def: DefaultPeakLocalMach, to: &g.PeakLocalMach}},
		{everyMedium, quantityField{key: "max_reynolds_per_metre", unit: uPerLength, bound: aboveZero(1e12, "a unit Reynolds number above 0"), to: &f.MaxReynoldsPerM}},
		{everyMedium, quantityField{key: "section_width", unit: uLength, required: true, bound: length, to: &f.Width}},
		{everyMedium, quantityField{key: "section_height", unit: uLength, required: true, bound: length, to: &f.Height}},
		{everyMedium, quantityField{key: keyBalanceN, unit: uForce, bound: BalanceForceBound(), to: &f.Balance.MaxNormalForce}},
		{everyMedium, quantityField{key: keyBalanceM, unit: uMoment, bound: BalanceMomentBound(), to: &f.Balance.MaxPitchMoment}},
	}
	// The rule is read after every limit it is checked against (checkRule).
	out = append(out, ruleFields(f)...)
	out = append(out, facilityField{everyMedium, subTable("model", modelFields(&f.Model))})
	// The campaign data is read last: its storage pressure is checked
	// against the pressure range.
	return append(out, facilityField{everyMedium, newCampaignTable(f)})
}

// facilityFieldKeys lists the keys of facilityFields, in order.
func facilityFieldKeys() []string {
	var out []string
	for _, ff := range facilityFields(&Facility{}) {
		out = append(out, ff.name())
	}
	return out
}

// modelFields are the keys of a [facility.model] table, read into m.
func modelFields(m *ModelSizing) []field {
	return []field{
		quantityField{key: "scale", unit: uRatio, bound: ModelScaleBound(), to: &m.Scale},
		quantityField{key: "max_span_fraction", unit: uFraction, bound: aboveZero(1, "a share of the section width above 0 and at most 1 (100 %)"), def: DefaultMaxSpanFraction, to: &m.MaxSpanFraction},
		quantityField{key: "max_blockage", unit: uFraction, bound: aboveZero(maxBlockage, "a share of the section area above 0 and at most 0.5 (50 %)"), to: &m.MaxBlockage},
	}
}
