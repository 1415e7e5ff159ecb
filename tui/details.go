package tui

import (
	"fmt"
	"math"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/units"
)

// detailsView is the details panel: the flight conditions of the point
// under the cursor, the facility answer there and its cautions. The root
// computes them when what they show changes (Model.refreshDetails) and
// stores them here with Show; View only lays them out. It owns no keys:
// the keys that move the cursor are the matrix's, the root's own.
type detailsView struct {
	frame
	key     detailKey
	blocks  detailBlocks
	stacked bool // one block above the other (the wide layout)
}

// detailBlocks is the text of the details panel.
type detailBlocks struct {
	flight   []string
	facility []string
	// cautions are the full caution texts; flags names the same cautions
	// in a few words, for panels without room for the full texts.
	cautions []string
	flags    string
	summary  string // one line for cramped screens
	// set is the point's matching set, shown under the facility block
	// where the panel has room for it (it is the first thing left out).
	set []string
}

// Shows reports whether the panel holds the details for k.
func (v detailsView) Shows(k detailKey) bool { return v.key == k }

// Show stores the details for k, laid out one block above the other
// (stacked) or side by side.
func (v *detailsView) Show(k detailKey, d detailBlocks, stacked bool) {
	v.key, v.blocks, v.stacked = k, d, stacked
}

// Update does nothing: the panel takes no keys.
func (v detailsView) Update(tea.Msg) (detailsView, tea.Cmd) { return v, nil }

// ShortHelp and FullHelp are empty: the panel takes no keys.
func (v detailsView) ShortHelp() []key.Binding  { return nil }
func (v detailsView) FullHelp() [][]key.Binding { return nil }

// PreferredHeight is how many lines the blocks take side by side at
// width w, every caution by its flag, with the matching set (all) or
// without it.
func (v detailsView) PreferredHeight(w int, all bool) int {
	b := v.blocks
	if !all {
		b.set = nil
	}
	return len(detailLines(b, w, 0, false))
}

// View lays the stored blocks out: one above the other (stacked, the wide
// layout) or side by side (below the matrix).
func (v detailsView) View() string {
	if v.width <= 0 || v.height <= 0 {
		return ""
	}
	if v.height < 4 {
		return v.fit(wrapText(v.blocks.summary, v.width))
	}
	return v.fit(strings.Join(detailLines(v.blocks, v.width, v.height, v.stacked), "\n"))
}

// detailLines is the details panel as lines of at most w cells. Lines too
// long for their column are wrapped, never cut. Within h lines (h ≤ 0: no
// limit) what does not fit is left out in this order: the matching set,
// then the full caution texts, which are named by their short flags
// instead (side by side, below the matrix, the cautions are always named
// by their flags), then the matching set again beside the flags.
func detailLines(d detailBlocks, w, h int, stacked bool) []string {
	withSet := func(full, set bool) []string {
		b := d
		if !set {
			b.set = nil
		}
		return layDetails(b, w, stacked, stacked && full)
	}
	tries := [][2]bool{{true, true}, {true, false}, {false, true}, {false, false}}
	if !stacked {
		tries = tries[2:]
	}
	var out []string
	for _, t := range tries {
		out = withSet(t[0], t[1])
		if h <= 0 || len(out) <= h {
			break
		}
	}
	return out
}

// layDetails lays the blocks out at width w: stacked or side by side, the
// matching set under the facility block, then the cautions in full or by
// their flags.
func layDetails(d detailBlocks, w int, stacked, full bool) []string {
	wrapAll := func(ls []string, w int) []string {
		var out []string
		for _, l := range ls {
			out = append(out, wrapLines(l, w, "  ")...)
		}
		return out
	}
	facility := append(append([]string(nil), d.facility...), d.set...)
	var body []string
	if stacked {
		body = wrapAll(d.flight, w)
		if len(facility) > 0 {
			body = append(body, "")
			body = append(body, wrapAll(facility, w)...)
		}
	} else {
		half := (w - 1) / 2
		left, right := wrapAll(d.flight, half), wrapAll(facility, w-half-1)
		rows := max(len(left), len(right))
		body = strings.Split(joinColumns(box(strings.Join(left, "\n"), half, rows),
			box(strings.Join(right, "\n"), w-half-1, rows), " "), "\n")
	}
	var tail []string
	if full {
		tail = wrapAll(d.cautions, w)
	} else if d.flags != "" {
		tail = wrapLines(d.flags, w, "  ")
	}
	return append(body, tail...)
}

// detailKey is everything the details depend on. The panel is computed
// again only when it changes.
type detailKey struct {
	grid   *envelope.Grid
	answer *envelope.Map      // the map that answers at the point (nil: none)
	fac    *envelope.Facility // its facility, as edited now
	shown  int                // the facility shown (-1: best of all)
	facs   int
	errs   string // why the shown facility has no map
	i, j   int
	marked bool
	units  units.System
	width  int
	wide   bool
	st     *Styles
}

// detailKey describes the details of the cursor point at width w.
func (m *Model) detailKey(w int) detailKey {
	r := m.shown()
	k := detailKey{grid: r.grid, shown: m.fac, facs: len(m.facs), i: m.curI, j: m.curJ,
		units: m.units, width: w, wide: m.wide, st: m.fr.st}
	if g := r.grid; g != nil && g.Rows() > 0 && g.Cols() > 0 {
		k.marked = m.marks[g.Index(min(m.curI, g.Rows()-1), min(m.curJ, g.Cols()-1))]
	}
	if _, f := r.result(m.fac, m.curI, m.curJ); f >= 0 && f < len(r.maps) {
		k.answer = r.maps[f]
		if f < len(m.facs) {
			k.fac = &m.facs[f]
		}
	}
	if m.fac >= 0 && m.fac < len(r.errs) && r.errs[m.fac] != nil {
		k.errs = r.errs[m.fac].Error()
	}
	return k
}

// refreshDetails computes the details of the cursor point at width w when
// the point, the facility, the results, the units, the marks at the point
// or the panel changed since they were last computed, so that View draws
// them without asking the engine.
func (m *Model) refreshDetails(w int) {
	if k := m.detailKey(w); !m.details.Shows(k) {
		m.details.Show(k, m.detailBlocks(w), m.wide)
	}
}

// detailBlocks builds the details text for the cursor point. w is the
// width the panel has: blocks are laid out two to a line below w/2 each in
// the narrow layout, one above the other in the wide one.
func (m Model) detailBlocks(w int) detailBlocks {
	var d detailBlocks
	g := m.shown().grid
	if g == nil || g.Rows() == 0 || g.Cols() == 0 {
		d.flight = []string{m.fr.st.Section.Render("FLIGHT"), "no grid"}
		d.summary = "no grid"
		return d
	}
	pair := m.pairs(w)
	fd, ok := m.flightBlock(&d, pair)
	if ok {
		m.facilityBlock(&d, fd, w, pair)
	}
	return d
}

// pairFunc writes two labelled values on one line, the second in a column.
type pairFunc func(a, av, b, bv string) string

// pairs lines pairs of values up in columns: a quarter of the narrow
// panel (two blocks side by side), up to half of the wide one.
func (m Model) pairs(w int) pairFunc {
	st := m.fr.st
	colW := min(w/2, 22)
	if !m.wide {
		colW = (w - 1) / 4
	}
	colW = max(colW, 12)
	return func(a, av, b, bv string) string {
		left := st.Label.Render(a) + " " + av
		if b == "" {
			return left
		}
		if visibleWidth(left) >= colW {
			return left + " " + st.Label.Render(b) + " " + bv
		}
		return padRight(left, colW) + st.Label.Render(b) + " " + bv
	}
}

// flightBlock writes the flight conditions of the cursor point into d;
// ok is false when there are none.
func (m Model) flightBlock(d *detailBlocks, pair pairFunc) (fd envelope.FlightDetail, ok bool) {
	st, u, g := m.fr.st, m.units, m.shown().grid
	fd, err := g.FlightDetail(m.curI, m.curJ)
	head := st.Section.Render("FLIGHT") + " " + u.Alt(g.Alts[m.curI]) + " " + st.Label.Render("ΔT") + " " + u.DeltaT(g.DeltaT)
	d.flight = append(d.flight, head)
	if err != nil {
		d.flight = append(d.flight, st.Error.Render(err.Error()))
		d.summary = err.Error()
		return fd, false
	}
	s, a := fd.State, fd.Airspeeds
	if !fd.Inside {
		d.flight = append(d.flight, st.Faint.Render("outside envelope: "+fd.Exclusion.String()))
	}
	d.flight = append(d.flight,
		pair("T", u.Temp(s.Temperature), "p", u.Pressure(s.Pressure)),
		pair("ρ", u.Density(s.Density), "a", u.Speed(s.SpeedOfSound)),
		pair("M", units.Fixed(a.Mach, 3), "TAS", u.Speed(a.TAS)),
		pair("EAS", u.Speed(a.EAS), "CAS", u.Speed(a.CAS)),
		pair("q", u.Q(fd.Q), "Kn", units.Expo(fd.Kn, 2)),
		pair("Re", units.Expo(fd.Re, 3), "unit Re", u.PerLength(fd.RePerM)),
		st.Label.Render("regime")+" "+fd.SpeedRegime.String()+", "+fd.Rarefaction.String(),
	)
	d.summary = fmt.Sprintf("%s M%s", u.Alt(g.Alts[m.curI]), units.Fixed(a.Mach, 2))
	if m.marks[g.Index(m.curI, m.curJ)] {
		d.flight[0] += " " + st.HelpKey.Render("[test point]")
	}
	return fd, true
}

// facilityBlock writes the facility answer at the cursor point into d:
// the facility, class and limit, the settings and the cautions.
func (m Model) facilityBlock(d *detailBlocks, fd envelope.FlightDetail, w int, pair pairFunc) {
	st, r := m.fr.st, m.shown()
	res, k := r.result(m.fac, m.curI, m.curJ)
	if k < 0 || k >= len(r.maps) || r.maps[k] == nil {
		d.facility = append(d.facility, st.Section.Render("FACILITY"))
		switch {
		case len(m.facs) == 0:
			d.facility = append(d.facility, "no facilities loaded")
		case m.fac >= 0 && m.fac < len(r.errs) && r.errs[m.fac] != nil:
			d.facility = append(d.facility, st.Error.Render("not solved: "+r.errs[m.fac].Error()))
		case !fd.Inside:
			d.facility = append(d.facility, st.Faint.Render("no answer outside the envelope"))
		default:
			d.facility = append(d.facility, "no answer")
		}
		return
	}
	fac := m.facs[k]
	title := st.Section.Render("FACILITY") + " "
	if m.fac < 0 {
		if res.Class == envelope.NoMatch {
			d.facility = append(d.facility, title+st.Label.Render("best of all"),
				"no facility reaches this point")
			d.summary += " | out of reach"
			return
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
	det, err := r.maps[k].Detail(m.curI, m.curJ)
	if err != nil {
		d.facility = append(d.facility, st.Error.Render(err.Error()))
		return
	}
	if det.Class == envelope.Outside {
		d.facility = append(d.facility, st.Faint.Render("no answer outside the envelope"))
		return
	}
	d.facility = append(d.facility, st.Label.Render("class")+" "+classWord(det.Class))
	if det.Limit != envelope.LimitNone {
		d.facility = append(d.facility, st.Label.Render("limited by")+" "+det.Limit.String())
	}
	d.summary += " | " + classWord(det.Class)
	// The facility block's column where it is the right of two blocks
	// side by side (layDetails), the narrow layout, whose height is
	// short; stacked (the wide layout) lines wrap.
	colW := 0
	if !m.wide {
		colW = w - (w-1)/2 - 1
	}
	m.settingLines(d, &det, &fac, pair, colW)

	// The cautions by name, for panels without room for the full texts,
	// and the full texts in the panel's units, like every other value.
	if det.Flags != 0 {
		d.flags = st.Caution.Render("! " + det.Flags.String())
	}
	for _, c := range envelope.Cautions(&det, &fac, m.units) {
		if c == envelope.PlanningNote {
			continue
		}
		d.cautions = append(d.cautions, st.Caution.Render("! "+c))
	}
}

// settingLines writes the facility settings of det into d: p0 and T0, or
// water speed and temperature, then q, the Reynolds number reached, the
// model and the operating rule; colW is the width of the block's column
// where lines are to keep to it (0: they wrap).
func (m Model) settingLines(d *detailBlocks, det *envelope.Detail, fac *envelope.Facility, pair pairFunc, colW int) {
	st, u := m.fr.st, m.units
	if !det.HasSettings {
		d.facility = append(d.facility, st.Faint.Render("no setting reaches this condition"))
	} else if fac.Medium.IsGas() {
		d.facility = append(d.facility,
			pair("p0", u.Stagnation(det.P0), "T0", u.Temp(det.T0)),
			pair("M", units.Fixed(det.Mach, 3), "V", u.Speed(det.V)),
		)
		d.summary += " | p0 " + u.Stagnation(det.P0) + " T0 " + u.Temp(det.T0)
	} else {
		d.facility = append(d.facility,
			pair("V", u.Speed(det.V), "water", u.Temp(det.T0)),
			pair("p", u.Pressure(det.P), "σ", units.Fixed(det.Cavitation, 2)),
		)
		d.summary += " | V " + u.Speed(det.V) + " water " + u.Temp(det.T0)
	}
	if det.HasSettings {
		qLine := st.Label.Render("q") + " " + u.Q(det.Q)
		if fac.QMax > 0 {
			qLine += st.Label.Render(fmt.Sprintf(" (%.0f %% of max)", 100*det.Q/fac.QMax))
		}
		d.facility = append(d.facility, qLine)
		if l := loadLine(st, u, det.Load, colW); l != "" {
			d.facility = append(d.facility, l)
		}
		d.facility = append(d.facility, pair("Re", units.Expo(det.Re, 3), "ratio", units.Fixed(det.ReRatio, 3)))
		if det.Class == envelope.ReShort {
			d.facility = append(d.facility, st.Label.Render("ΔCf")+" "+skinFrictionNote(*det))
		}
	}
	d.facility = append(d.facility, pair("scale", units.Sig(det.Scale, 3), "model", u.Length(det.ModelLength)))
	if det.HasSettings && (det.Class.Matched() || det.Rule.Kind != envelope.RuleWarmest) {
		// Which of the settings that reach the target was taken; a rule
		// other than the standard one is stated wherever it holds a
		// setting, as it can be what falls short.
		d.facility = append(d.facility, st.Label.Render("rule")+" "+det.Rule.Describe(fac.Medium, u))
	}
	if det.HasSettings {
		d.set = setLines(st, u, det)
	}
}

// loadLine is the model load at the setting as a share of the balance
// capacity, with the normal force and pitching moment against theirs
// ("" where the balance is not checked: no capacity or no coefficients).
// Where that is wider than w cells (w > 0), the load that sets the share
// is kept alone, and where that is too, the share alone (an 80-column
// screen keeps the details whole; the exports give every load).
func loadLine(st *Styles, u units.System, l envelope.Load, w int) string {
	if !(l.Share > 0) {
		return ""
	}
	var parts []string
	var shares []float64
	if l.NormalForce > 0 {
		p := st.Label.Render("N") + " " + u.Force(l.NormalForce)
		share := 0.0
		if l.MaxNormalForce > 0 {
			p += " of " + u.Force(l.MaxNormalForce)
			share = l.NormalForce / l.MaxNormalForce
		}
		parts, shares = append(parts, p), append(shares, share)
	}
	if l.PitchMoment > 0 {
		p := st.Label.Render("M") + " " + u.Moment(l.PitchMoment)
		share := 0.0
		if l.MaxPitchMoment > 0 {
			p += " of " + u.Moment(l.MaxPitchMoment)
			share = l.PitchMoment / l.MaxPitchMoment
		}
		parts, shares = append(parts, p), append(shares, share)
	}
	line := st.Label.Render("load") + " " + fmt.Sprintf("%.0f %% of capacity", 100*l.Share)
	if len(parts) == 0 {
		return line
	}
	if all := line + ": " + strings.Join(parts, ", "); w <= 0 || visibleWidth(all) <= w {
		return all
	}
	top := 0
	for k := range shares {
		if shares[k] > shares[top] {
			top = k
		}
	}
	if one := line + ": " + parts[top]; visibleWidth(one) <= w {
		return one
	}
	return line
}

// setLines state the point's matching set in the units u: its span of
// T0, p0 and q (water: temperature, speed and q) and what bounds each end
// (the cold end and the warm end), or that only the one setting reaches
// what the facility reaches there. Nil where there is no set.
func setLines(st *Styles, u units.System, det *envelope.Detail) []string {
	s := det.Set
	if !s.OK {
		return nil
	}
	label := st.Label.Render
	span := func(a, b string) string {
		if a == b {
			return a
		}
		return a + " – " + b
	}
	c, w := s.Cold, s.Warm
	head := label("set")
	if det.Medium.IsGas() {
		head += " " + label("at M") + " " + units.Fixed(s.Mach, 3)
	}
	if s.Single() {
		line := head + " one setting only"
		if lim := setEndLimits(c.Limit, w.Limit); lim != "" {
			line += ", bounded by " + lim
		}
		return []string{line}
	}
	var parts []string
	if det.Medium.IsGas() {
		parts = []string{
			label("T0") + " " + span(u.Temp(c.T0), u.Temp(w.T0)),
			label("p0") + " " + span(u.Stagnation(c.P0), u.Stagnation(w.P0)),
		}
	} else {
		parts = []string{
			label("water") + " " + span(u.Temp(c.T0), u.Temp(w.T0)),
			label("V") + " " + span(u.Speed(c.V), u.Speed(w.V)),
		}
	}
	parts = append(parts, label("q")+" "+span(u.Q(c.Q), u.Q(w.Q)))
	ends := label("cold end") + " " + c.Limit.String() + ", " + label("warm end") + " " + w.Limit.String()
	if s.ReLimit != envelope.LimitNone {
		ends += "; " + label("Re held by") + " " + s.ReLimit.String()
	}
	return []string{head + ": " + strings.Join(parts, ", "), ends}
}

// setEndLimits names the limits at the two ends of a one-setting set,
// once where they are the same ("" where neither binds).
func setEndLimits(a, b envelope.Limit) string {
	switch {
	case a == envelope.LimitNone:
		a, b = b, envelope.LimitNone
	case a == b:
		b = envelope.LimitNone
	}
	if a == envelope.LimitNone {
		return ""
	}
	if b == envelope.LimitNone {
		return a.String()
	}
	return a.String() + " and " + b.String()
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
