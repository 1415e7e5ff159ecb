package envelope

import (
	"fmt"
	"strconv"
	"strings"
)

// Tables and keys of the facility format, in the order they are documented.
var (
	facilityTables   = []string{"facility"}
	facilityKeys     = []string{"name", "class", "medium", "mach_range", "speed_range", "stagnation_pressure_range", "static_pressure_range", "stagnation_temperature_range", "water_temperature_range", "max_dynamic_pressure", "min_static_temperature", "condensation_check", "peak_local_mach", "max_reynolds_per_metre", "section_width", "section_height", "model"}
	modelKeys        = []string{"scale", "max_span_fraction", "max_blockage"}
	gasOnlyKeys      = []string{"mach_range", "stagnation_pressure_range", "stagnation_temperature_range", "min_static_temperature", "condensation_check", "peak_local_mach"}
	waterOnlyKeys    = []string{"speed_range", "static_pressure_range", "water_temperature_range"}
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
	out := make([]Facility, 0, len(list))
	names := map[string]int{}
	for i, m := range list {
		p := fmt.Sprintf("facility[%d]", i)
		f := d.facility(d.table(p, m, facilityKeys))
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

// facility reads one [[facility]] table.
func (d *doc) facility(t *table) Facility {
	defer t.finish()
	f := Facility{Source: d.file}
	f.Name, _ = t.freeText("name", true, "the facility's name in quotes")
	f.Class, _ = t.freeText("class", false, `a short description in quotes, e.g. "pressurized transonic"`)

	mediumOK := false
	if s, ok := t.text("medium", true, mediumWanted()); ok {
		f.Medium, mediumOK = mediumNamed(s)
		if !mediumOK {
			p := t.keyPath("medium")
			d.fail(p, display(p), strconv.Quote(s), mediumWanted())
		}
	}

	if mediumOK {
		wrong := waterOnlyKeys
		if f.Medium == MediumWater {
			wrong = gasOnlyKeys
		}
		for _, k := range wrong {
			if !t.has(k) {
				continue
			}
			p := t.keyPath(k)
			exp := "no " + k + " (condensation limits apply to " + andList(gasMedia()) + " only)"
			if c, ok := waterCounterpart[k]; ok {
				exp = c + " instead"
			}
			d.fail(p, display(p), fmt.Sprintf("%s on a%s %s facility", k, article(f.Medium.String()), f.Medium), exp)
		}
	}

	if mediumOK && f.Medium.IsGas() {
		lo, hi := t.span("mach_range", uMach, true)
		d.need(&lo, lo.v > 0, "a Mach number above 0")
		d.need(&hi, hi.v <= maxMach, fmt.Sprintf("a Mach number up to %g", maxMach))
		g := &f.Gas
		g.MachMin, g.MachMax = lo.v, hi.v
		lo, hi = t.span("stagnation_pressure_range", uPressure, true)
		g.P0Min, g.P0Max = d.within(&lo, FacilityPressureBound()), d.within(&hi, FacilityPressureBound())
		lo, hi = t.span("stagnation_temperature_range", uTemp, true)
		tb := FacilityTemperatureBound(f.Medium)
		g.T0Min, g.T0Max = d.within(&lo, tb), d.within(&hi, tb)
		q := t.quantity("min_static_temperature", uTemp, false)
		g.MinStaticT = d.positive(&q, maxGasT0, "a temperature above 0 K")
		g.Condensation = t.boolean("condensation_check", true)
		q = t.quantity("peak_local_mach", uMach, false)
		g.PeakLocalMach = DefaultPeakLocalMach
		if d.need(&q, q.v >= 1 && q.v <= 10, "a Mach number from 1 to 10") {
			g.PeakLocalMach = q.v
		}
	}
	if mediumOK && f.Medium == MediumWater {
		lo, hi := t.span("speed_range", uSpeed, true)
		d.need(&lo, lo.v > 0, "a speed above 0")
		d.need(&hi, hi.v <= maxWaterSpeed, fmt.Sprintf("a water speed up to %g m/s", maxWaterSpeed))
		w := &f.Water
		w.SpeedMin, w.SpeedMax = lo.v, hi.v
		lo, hi = t.span("static_pressure_range", uPressure, true)
		w.PMin, w.PMax = d.within(&lo, FacilityPressureBound()), d.within(&hi, FacilityPressureBound())
		lo, hi = t.span("water_temperature_range", uTemp, true)
		wb := FacilityTemperatureBound(f.Medium)
		w.TMin, w.TMax = d.within(&lo, wb), d.within(&hi, wb)
	}

	q := t.quantity("max_dynamic_pressure", uPressure, false)
	f.QMax = d.within(&q, QMaxBound())
	q = t.quantity("max_reynolds_per_metre", uPerLength, false)
	f.MaxReynoldsPerM = d.positive(&q, 1e12, "a unit Reynolds number above 0")
	q = t.quantity("section_width", uLength, true)
	f.Width = d.positive(&q, MaxLength, "a length above 0 m")
	q = t.quantity("section_height", uLength, true)
	f.Height = d.positive(&q, MaxLength, "a length above 0 m")

	f.Model.MaxSpanFraction = DefaultMaxSpanFraction
	if mt := t.sub("model", modelKeys, false); mt != nil {
		q = mt.quantity("scale", uRatio, false)
		f.Model.Scale = d.within(&q, ModelScaleBound())
		q = mt.quantity("max_span_fraction", uFraction, false)
		if d.need(&q, q.v > 0 && q.v <= 1, "a share of the section width above 0 and at most 1 (100 %)") {
			f.Model.MaxSpanFraction = q.v
		}
		q = mt.quantity("max_blockage", uFraction, false)
		f.Model.MaxBlockage = d.positive(&q, maxBlockage, "a share of the section area above 0 and at most 0.5 (50 %)")
		mt.finish()
	}
	return f
}
