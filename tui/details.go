package tui

import (
	"fmt"
	"math"

	"likewind/envelope"
)

// detailBlocks builds the details text for the cursor point. w is the
// width the panel has: blocks are laid out two to a line below w/2 each in
// the narrow layout, one above the other in the wide one.
func (m Model) detailBlocks(w int) detailBlocks {
	st := m.fr.st
	u := m.units
	var d detailBlocks
	g := m.res.grid
	if g == nil || g.Rows() == 0 || g.Cols() == 0 {
		d.flight = []string{st.Section.Render("FLIGHT"), "no grid"}
		d.summary = "no grid"
		return d
	}
	// Pairs of values line up in columns: a quarter of the narrow panel
	// (two blocks side by side), up to half of the wide one.
	colW := min(w/2, 22)
	if !m.wide {
		colW = (w - 1) / 4
	}
	colW = max(colW, 12)
	pair := func(a, av, b, bv string) string {
		left := st.Label.Render(a) + " " + av
		if b == "" {
			return left
		}
		if visibleWidth(left) >= colW {
			return left + " " + st.Label.Render(b) + " " + bv
		}
		return padRight(left, colW) + st.Label.Render(b) + " " + bv
	}

	fd, err := g.FlightDetail(m.curI, m.curJ)
	head := st.Section.Render("FLIGHT") + " " + u.Alt(g.Alts[m.curI]) + " " + st.Label.Render("ΔT") + " " + u.DeltaT(g.DeltaT)
	d.flight = append(d.flight, head)
	if err != nil {
		d.flight = append(d.flight, st.Error.Render(err.Error()))
		d.summary = err.Error()
		return d
	}
	s, a := fd.State, fd.Airspeeds
	if !fd.Inside {
		d.flight = append(d.flight, st.Faint.Render("outside envelope: "+fd.Exclusion.String()))
	}
	d.flight = append(d.flight,
		pair("T", u.Temp(s.Temperature), "p", u.Pressure(s.Pressure)),
		pair("ρ", u.Density(s.Density), "a", u.Speed(s.SpeedOfSound)),
		pair("M", fixed(a.Mach, 3), "TAS", u.Speed(a.TAS)),
		pair("EAS", u.Speed(a.EAS), "CAS", u.Speed(a.CAS)),
		pair("q", u.Q(fd.Q), "Kn", expo(fd.Kn, 2)),
		pair("Re", expo(fd.Re, 3), "unit Re", u.PerLength(fd.RePerM)),
		st.Label.Render("regime")+" "+fd.SpeedRegime.String()+", "+fd.Rarefaction.String(),
	)
	d.summary = fmt.Sprintf("%s M%s", u.Alt(g.Alts[m.curI]), fixed(a.Mach, 2))
	if m.marks[g.Index(m.curI, m.curJ)] {
		d.flight[0] += " " + st.HelpKey.Render("[test point]")
	}

	// Facility answer.
	res, k := m.res.result(m.fac, m.curI, m.curJ)
	if k < 0 || k >= len(m.res.maps) || m.res.maps[k] == nil {
		d.facility = append(d.facility, st.Section.Render("FACILITY"))
		switch {
		case len(m.facs) == 0:
			d.facility = append(d.facility, "no facilities loaded")
		case m.fac >= 0 && m.fac < len(m.res.errs) && m.res.errs[m.fac] != nil:
			d.facility = append(d.facility, st.Error.Render("not solved: "+m.res.errs[m.fac].Error()))
		case !fd.Inside:
			d.facility = append(d.facility, st.Faint.Render("no answer outside the envelope"))
		default:
			d.facility = append(d.facility, "no answer")
		}
		return d
	}
	mp := m.res.maps[k]
	fac := m.facs[k]
	title := st.Section.Render("FACILITY") + " "
	if m.fac < 0 {
		if res.Class == envelope.NoMatch {
			d.facility = append(d.facility, title+st.Label.Render("best of all"),
				"no facility reaches this point")
			d.summary += " | out of reach"
			return d
		}
		title += st.Label.Render("best:") + " "
	}
	// The facility by letter and name; in the narrow layout's column the
	// name is cut to its first words (the letter, in the header and legend
	// too, still names it).
	if m.wide {
		title += fmt.Sprintf("%c %s", facilityTag(k), fac.Name) // wraps in the side panel
	} else {
		title += m.facilityLabel(k, w-(w-1)/2-1-visibleWidth(title))
	}
	d.facility = append(d.facility, title)
	det, err := mp.Detail(m.curI, m.curJ)
	if err != nil {
		d.facility = append(d.facility, st.Error.Render(err.Error()))
		return d
	}
	if det.Class == envelope.Outside {
		d.facility = append(d.facility, st.Faint.Render("no answer outside the envelope"))
		return d
	}
	d.facility = append(d.facility, st.Label.Render("class")+" "+classWord(det.Class))
	if det.Limit != envelope.LimitNone {
		d.facility = append(d.facility, st.Label.Render("limited by")+" "+det.Limit.String())
	}
	d.summary += " | " + classWord(det.Class)
	if !det.HasSettings {
		d.facility = append(d.facility, st.Faint.Render("no setting reaches this condition"))
	} else if fac.Medium.IsGas() {
		d.facility = append(d.facility,
			pair("p0", u.Stagnation(det.P0), "T0", u.Temp(det.T0)),
			pair("M", fixed(det.Mach, 3), "V", u.Speed(det.V)),
		)
		d.summary += " | p0 " + u.Stagnation(det.P0) + " T0 " + u.Temp(det.T0)
	} else {
		d.facility = append(d.facility,
			pair("V", u.Speed(det.V), "water", u.Temp(det.T0)),
			pair("p", u.Pressure(det.P), "σ", fixed(det.Cavitation, 2)),
		)
		d.summary += " | V " + u.Speed(det.V) + " water " + u.Temp(det.T0)
	}
	if det.HasSettings {
		qLine := st.Label.Render("q") + " " + u.Q(det.Q)
		if fac.QMax > 0 {
			qLine += st.Label.Render(fmt.Sprintf(" (%.0f %% of max)", 100*det.Q/fac.QMax))
		}
		d.facility = append(d.facility,
			qLine,
			pair("Re", expo(det.Re, 3), "ratio", fixed(det.ReRatio, 3)),
		)
		if det.Class == envelope.ReShort {
			d.facility = append(d.facility, st.Label.Render("ΔCf")+" "+skinFrictionNote(det))
		}
	}
	d.facility = append(d.facility, pair("scale", sig(det.Scale, 3), "model", u.Length(det.ModelLength)))
	if det.HasSettings && det.Class.Matched() {
		// Which of the settings that reach the target was taken.
		d.facility = append(d.facility, st.Label.Render("rule")+" "+det.Rule.Describe(fac.Medium, u))
	}

	// The cautions by name, for panels without room for the full texts,
	// and the full texts in the panel's units, like every other value.
	if det.Flags != 0 {
		d.flags = st.Caution.Render("! " + det.Flags.String())
	}
	for _, c := range envelope.Cautions(&det, &fac, u) {
		if c == envelope.PlanningNote {
			continue
		}
		d.cautions = append(d.cautions, st.Caution.Render("! "+c))
	}
	return d
}

// skinFrictionNote grades a Reynolds shortfall by its effect: the change in
// turbulent flat-plate skin friction (Prandtl–Schlichting) from flight to
// model, absolute and as a share of the flight value, flagged when either
// Reynolds number lies outside the formula's range.
func skinFrictionNote(det envelope.Detail) string {
	cfFlight := envelope.SkinFriction(det.ReFlight)
	if math.IsNaN(cfFlight) || math.IsNaN(det.DCf) {
		return "n/a"
	}
	s := fmt.Sprintf("%+.2g (%+.0f %% of flight Cf)", det.DCf, 100*det.DCf/cfFlight)
	if !envelope.SkinFrictionInRange(det.Re) || !envelope.SkinFrictionInRange(det.ReFlight) {
		s += " outside formula range"
	}
	return s
}

// classWord is the class name as the details show it.
func classWord(c envelope.Class) string { return c.String() }
