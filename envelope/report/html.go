package report

import (
	"bytes"
	_ "embed"
	"encoding/xml"
	"errors"
	"fmt"
	"html/template"
	"io"
	"strconv"
	"strings"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/units"
)

// The review pack as one self-contained HTML page: no network, no script,
// pictures as inline SVG, print styles for a clean PDF. html/template
// escapes every text; the texts from input files have passed through
// envelope.CleanText before, so no control or bidirectional character
// reaches the page raw either.

//go:embed review.html.tmpl
var reviewTemplateText string

var reviewTemplate = template.Must(template.New("review").Funcs(template.FuncMap{
	// costcol: column k of n is one of the last cost columns (the time
	// and cost part of a run table).
	"costcol": func(k, n, cost int) bool { return cost > 0 && k >= n-cost },
}).Parse(reviewTemplateText))

// inlineSVG draws the chart as SVG to be put inside a page: laid out as
// Render lays it out, without the embedded fonts (about half a megabyte a
// picture; the page's reader has fonts of its own), and without the XML
// prolog, which has no place inside HTML. The picture is checked to be
// well-formed XML.
func (ch *Chart) inlineSVG() ([]byte, error) {
	pad := 0.4 * vg.Centimeter
	probe := draw.NewCanvas(vgimg.New(ChartWidth, ChartHeight), ChartWidth, ChartHeight)
	lr := ch.legend.Rectangle(probe)
	legH := lr.Max.Y - lr.Min.Y + 2*pad
	w, h := ChartWidth, ChartHeight+legH
	vc := vgsvg.NewWith(vgsvg.UseWH(w, h))
	dc := draw.NewCanvas(vc, w, h)
	ch.plot.Draw(draw.Crop(dc, pad/2, -pad, legH, -pad/2))
	ch.legend.Draw(draw.Crop(dc, pad, -pad, pad, -(h - legH)))
	var b bytes.Buffer
	if _, err := vc.WriteTo(&b); err != nil {
		return nil, fmt.Errorf("render chart: %w", err)
	}
	svg := b.Bytes()
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("chart is not well-formed SVG: %w", err)
		}
	}
	k := bytes.Index(svg, []byte("<svg"))
	if k < 0 {
		return nil, errors.New("chart has no svg element")
	}
	return svg[k:], nil
}

// WriteHTML writes the review pack as one HTML page.
func (r *Review) WriteHTML(w io.Writer) error {
	var b bytes.Buffer
	if err := reviewTemplate.Execute(&b, r.page()); err != nil {
		return fmt.Errorf("review page: %w", err)
	}
	_, err := w.Write(b.Bytes())
	return err
}

// The page's view: every value written out as the page shows it.
type (
	htmlPage struct {
		Title, Vehicle, Tool, Date, Sources, Session string
		Job                                          []string
		Safety                                       []string
		Settings                                     []htmlGroup
		Facilities                                   htmlTable
		Coverage                                     htmlTable
		CoverageNotes                                []string
		Sections                                     []htmlFacility
		ReMach                                       template.HTML
		ReMachErr                                    string
		RunPoints                                    string
		RunOrder                                     string
	}
	htmlGroup struct {
		Title string
		Rows  []CostItem
	}
	htmlTable struct {
		Head []string
		Rows []htmlRow
		// Left marks the columns of words (left-aligned).
		Left map[int]bool
	}
	htmlRow struct {
		Cells []htmlCell
		Class string // "same" for a further flight point of a run, "best"
	}
	htmlCell struct {
		Text   string
		Left   bool
		Colour string // a class colour swatch before the text
	}
	htmlFacility struct {
		N                     int
		ID, Name, Desc, Error string
		Map                   template.HTML
		MapErr                string
		Shares                htmlTable
		Scale                 []string
		// Run list.
		RunSummary string
		Runs       htmlTable
		// CostCols is the number of the run table's time and cost columns
		// (the last ones), 0 without cost data.
		CostCols   int
		Unrunnable []string
		// Time and cost.
		HasCost     bool
		CostSummary []CostItem
		CostNotes   []string
		// Cautions.
		Cautions []string
	}
)

// page builds the view of the review.
func (r *Review) page() htmlPage {
	in := r.in
	e := in.Eval
	g := e.Grid
	v := g.Vehicle
	u := in.Units
	veh := envelope.CleanText(v.Name)
	p := htmlPage{
		Title:   "Review pack: " + veh,
		Vehicle: veh,
		Tool:    strings.TrimSpace(envelope.CleanText(in.Info.Tool + " " + in.Info.Version)),
		Date:    envelope.CleanText(in.Info.Generated),
		Sources: "built-in demo data (invented vehicles and facilities)",
		Safety: []string{envelope.SafetyNote, envelope.PlanningNote,
			"Ground testing involves pressure vessels at high stagnation pressure, cryogenic nitrogen " +
				"(asphyxiation and cold-burn hazards, brittle materials), and models and balances under high " +
				"aerodynamic load. This page checks none of the structural, pressure-safety or oxygen-deficiency " +
				"questions those raise; ideal-gas relations are used throughout, less reliable near the saturation " +
				"line of the test gas and at hypersonic conditions."},
	}
	if len(in.Sources) > 0 {
		p.Sources = strings.Join(envelope.CleanAll(in.Sources), ", ")
	}
	if in.Session != "" {
		p.Session = envelope.CleanText(in.Session)
	}
	p.Job = r.job()
	p.Settings = r.settings()
	p.Facilities = r.facilityTable()
	p.Coverage, p.CoverageNotes = r.coverageTable()
	p.RunPoints = "every matched point of each facility (full match or Mach relaxed); no marked test points given"
	if r.Plan.Marked {
		p.RunPoints = fmt.Sprintf("the %s marked in the session", reviewPoints(len(in.Marks)))
	}
	p.RunOrder = fmt.Sprintf("in the order each facility's operating rule sets: grouped by T0, then p0, then Mach number ascending "+
		"(water: temperature, static pressure, speed), under a fixed q by q, then T0, then Mach number; a setting counts as changed "+
		"when it moves by %g K, %g %% of p0 or of a held q, %g in Mach number or %g m/s; flight points with the same settings are one run",
		RunT0Step, 100*RunP0Frac, RunMachStep, RunSpeedStep)
	for _, rf := range r.Facilities {
		p.Sections = append(p.Sections, r.facilitySection(rf, u))
	}
	// The charts are drawn here and checked well-formed; their texts are
	// cleaned (newChart) and escaped by the SVG writer.
	p.ReMach, p.ReMachErr = template.HTML(r.ReMach), r.ReMachErr
	return p
}

// job is the opening summary: what is asked and the answer in a few
// lines.
func (r *Review) job() []string {
	e := r.in.Eval
	c := r.Coverage
	out := []string{fmt.Sprintf("Which of %s can reproduce the flight conditions of %s across its altitude–speed envelope "+
		"with a scale model, with which settings, and which points to run.", reviewPlural(len(e.Facilities), "facility", "facilities"), c.Vehicle)}
	out = append(out, fmt.Sprintf("%s inside the envelope on a %d × %d grid; %d of %d facilities evaluated.",
		reviewPoints(c.Inside), c.GridRows, c.GridCols, c.SolvedCount, len(e.Facilities)))
	if c.SolvedCount > 0 {
		best, bestShare := "", -1.0
		for _, row := range c.Facilities {
			if row.Error == "" && row.Matched > bestShare {
				best, bestShare = row.Facility, row.Matched
			}
		}
		out = append(out, fmt.Sprintf("Union coverage (full match or Mach relaxed in at least one facility): %s of the inside points; "+
			"the facility matching most alone: %s (%s).", pct(c.Union), best, pct(bestShare)))
	}
	n := 0
	for _, rl := range r.Plan.Lists {
		n += rl.SetPoints
	}
	out = append(out, fmt.Sprintf("Run lists: %s over %s.", reviewPlural(n, "run", "runs"), reviewPlural(len(r.Plan.Lists), "facility", "facilities")))
	return out
}

// plural is "1 run", "2 runs".
func reviewPlural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

// settings are the vehicle, grid, day and what-if groups.
func (r *Review) settings() []htmlGroup {
	in := r.in
	e := in.Eval
	g := e.Grid
	v := g.Vehicle
	u := in.Units
	s := e.Settings
	refName := envelope.CleanText(v.RefLengthName)
	if refName == "" {
		refName = "reference length"
	}
	veh := htmlGroup{Title: "Vehicle", Rows: []CostItem{
		{"name", envelope.CleanText(v.Name)},
		{"reference length", u.Length(v.RefLength) + " (" + refName + ")"},
		{"reference area", reviewArea(u, v.RefArea)},
	}}
	if v.Span > 0 {
		veh.Rows = append(veh.Rows, CostItem{"span", u.Length(v.Span)})
	}
	if v.FrontalArea > 0 {
		veh.Rows = append(veh.Rows, CostItem{"frontal area", reviewArea(u, v.FrontalArea)})
	}
	if l := v.Loads; l.CNMax > 0 || l.CmMax > 0 {
		veh.Rows = append(veh.Rows, CostItem{"load coefficients",
			fmt.Sprintf("CN %g, Cm %g (largest to plan for)", l.CNMax, l.CmMax)})
	}
	speedTitle, lab := u.SpeedAxis(g.SpeedKind)
	grid := htmlGroup{Title: "Grid", Rows: []CostItem{
		{"altitudes", fmt.Sprintf("%d from %s to %s (%s altitude)", g.Rows(), u.Alt(g.Alts[0]), u.Alt(g.Alts[g.Rows()-1]), v.AltitudeKind)},
		{"speeds", fmt.Sprintf("%d from %s to %s (%s)", g.Cols(), lab(g.Speeds[0]), lab(g.Speeds[g.Cols()-1]), speedTitle)},
		{"inside the envelope", reviewPoints(g.InsideCount())},
	}}
	day := htmlGroup{Title: "Day", Rows: []CostItem{
		{"atmosphere", "U.S. Standard Atmosphere 1976"},
		{"temperature offset", u.DeltaT(s.DeltaT) + " (pressure standard at the pressure altitude)"},
	}}
	scale := "each facility's own"
	if s.Scale > 0 {
		scale = fmt.Sprintf("%.3g for every facility", s.Scale)
	}
	rule := "each facility's own"
	if s.Rule.Kind != envelope.RuleDefault {
		rule = s.Rule.Name(u) + " for every facility"
	}
	wi := htmlGroup{Title: "What-if settings", Rows: []CostItem{
		{"model scale", scale},
		{"Mach tolerance", strconv.FormatFloat(s.MachTol, 'g', -1, 64)},
		{"Reynolds tolerance", strconv.FormatFloat(100*s.ReTol, 'g', -1, 64) + " %"},
		{"Mach relaxed below", strconv.FormatFloat(s.CompressibilityMach, 'g', -1, 64)},
		{"operating rule", rule},
	}}
	changed := "none: the files' values"
	if in.Session == "" {
		changed = "no session applied: the files' values"
	} else if len(in.Changed) > 0 {
		changed = strings.Join(envelope.CleanAll(in.Changed), ", ")
	}
	wi.Rows = append(wi.Rows, CostItem{"changed by the session", changed})
	return []htmlGroup{veh, grid, day, wi}
}

// area formats an area in m² or ft².
func reviewArea(u units.System, a float64) string {
	if u == units.Customary {
		return units.Sig(a/(atmos.Foot*atmos.Foot), 4) + " ft²"
	}
	return units.Sig(a, 4) + " m²"
}

// facilityTable lists the facilities with their model scale and rule.
func (r *Review) facilityTable() htmlTable {
	t := htmlTable{Head: []string{"#", "facility", "class", "medium", "model scale", "scale from", "fit scale", "operating rule"},
		Left: map[int]bool{1: true, 2: true, 3: true, 5: true, 7: true}}
	for _, rf := range r.Facilities {
		c := rf.Coverage
		cells := []string{strconv.Itoa(rf.Index + 1), rf.Name, rf.Class, rf.Medium.String()}
		if c.Error != "" {
			cells = append(cells, "-", "not evaluated: "+c.Error, "-", "-")
		} else {
			cells = append(cells, g3(c.Scale), envelope.CleanText(c.ScaleRule), g3(c.FitScale), rf.Rule)
		}
		t.Rows = append(t.Rows, t.row(cells, ""))
	}
	return t
}

// row is a table row of cells, aligned by the table's Left.
func (t htmlTable) row(cells []string, class string) htmlRow {
	row := htmlRow{Class: class}
	for k, c := range cells {
		row.Cells = append(row.Cells, htmlCell{Text: c, Left: t.Left[k]})
	}
	return row
}

// coverageTable is the coverage report's table (NewCoverage), with its
// notes.
func (r *Review) coverageTable() (htmlTable, []string) {
	c := r.Coverage
	t := htmlTable{Head: []string{"facility", "medium", "model scale", envelope.FullMatch.String(), envelope.ReShort.String(),
		envelope.MachRelaxed.String(), envelope.NoMatch.String(), "matched", "smallest full-match scale", "it fits"},
		Left: map[int]bool{0: true, 1: true}}
	balance := c.balanceSet()
	if balance {
		t.Head = append(t.Head, "balance scale")
	}
	for _, row := range c.Facilities {
		if row.Error != "" {
			cells := []string{row.Facility, row.Medium, "-", "-", "-", "-", "-", "-", "-", "-"}
			if balance {
				cells = append(cells, "-")
			}
			t.Rows = append(t.Rows, t.row(cells, ""))
			continue
		}
		minScale, fits := minScaleCells(row)
		scale := g3(row.Scale)
		if row.TooLargePoints > 0 {
			scale += " (too large)"
		}
		cells := []string{row.Facility, row.Medium, scale, pct(row.FullMatch), pct(row.ReShort), pct(row.MachRelaxed),
			pct(row.NoMatch), pct(row.Matched), minScale, fits}
		if balance {
			cells = append(cells, balanceCell(row.Balance))
		}
		t.Rows = append(t.Rows, t.row(cells, ""))
	}
	b := c.Best
	cells := []string{b.Facility, "", "", pct(b.FullMatch), pct(b.ReShort), pct(b.MachRelaxed), pct(b.NoMatch), pct(b.Matched), "", ""}
	if balance {
		cells = append(cells, "")
	}
	t.Rows = append(t.Rows, t.row(cells, "best"))
	notes := []string{
		fmt.Sprintf("Union coverage (full match or Mach relaxed in at least one facility): %s of the inside points.", pct(c.Union)),
		"Shares are of the points inside the envelope. Smallest full-match scale: the smallest model scale giving a full match at every " +
			"inside point the facility can run at flight Mach number (* where it cannot Mach-match every point, so the scale covers " +
			"only those it can; - where none: water tunnels never match Mach). It fits: that scale is within the largest the test section " +
			"takes by the span and blockage rules.",
	}
	if balance {
		notes = append(notes, "Balance scale: the largest model scale the balance takes at every point it lets be a full match; none where "+
			"it lets none; blank where the balance is not checked (no capacity or no load coefficient).")
	}
	return t, notes
}

// minScaleCells are the smallest full-match scale ("*" where it covers
// only the points the facility can Mach-match) and whether it fits.
func minScaleCells(row CoverageRow) (scale, fits string) {
	scale, fits = g3(row.MinScale), "-"
	if row.MinScale.Valid() {
		if !row.MinScaleCoversAll {
			scale += "*"
		}
		fits = "no"
		if row.MinScaleFits {
			fits = "yes"
		}
	}
	return scale, fits
}

// facilitySection is one facility's view: map, shares, scales, run list,
// time and cost, cautions.
func (r *Review) facilitySection(rf ReviewFacility, u units.System) htmlFacility {
	c := rf.Coverage
	desc := rf.Medium.String()
	if rf.Class != "" {
		desc = rf.Class + ", " + desc
	}
	s := htmlFacility{N: rf.Index + 1, ID: "facility-" + strconv.Itoa(rf.Index+1), Name: rf.Name, Desc: desc}
	if c.Error != "" {
		s.Error = "not evaluated: " + c.Error
		return s
	}
	s.Map, s.MapErr = template.HTML(rf.Map), rf.MapErr // as the Reynolds–Mach chart in page

	s.Shares = htmlTable{Head: []string{"match class", "points", "share of inside points"}, Left: map[int]bool{0: true}}
	for _, cl := range []envelope.Class{envelope.FullMatch, envelope.ReShort, envelope.MachRelaxed, envelope.NoMatch} {
		row := s.Shares.row([]string{cl.String(), strconv.Itoa(c.Counts[cl]), pct(reviewShare(c, cl))}, "")
		row.Cells[0].Colour = cl.Colour()
		s.Shares.Rows = append(s.Shares.Rows, row)
	}
	s.Shares.Rows = append(s.Shares.Rows, s.Shares.row([]string{"matched (full match or Mach relaxed)",
		strconv.Itoa(c.Counts[envelope.FullMatch] + c.Counts[envelope.MachRelaxed]), pct(c.Matched)}, "best"))

	s.Scale = append(s.Scale, fmt.Sprintf("Model scale in force: %s (%s).", g3(c.Scale), envelope.CleanText(c.ScaleRule)))
	if c.MinScale.Valid() {
		cover := fmt.Sprintf("at every one of the %s inside the envelope", reviewPoints(c.Inside))
		if !c.MinScaleCoversAll {
			cover = fmt.Sprintf("at the %d of %s inside the envelope that the facility can run at flight Mach number", c.MachMatchable, reviewPoints(c.Inside))
		}
		fit := "it does not fit the test section by the span and blockage rules"
		if c.MinScaleFits {
			fit = "it fits the test section by the span and blockage rules"
		}
		s.Scale = append(s.Scale, fmt.Sprintf("Smallest full-match scale: %s gives a full match %s; %s.", g3(c.MinScale), cover, fit))
	} else {
		s.Scale = append(s.Scale, "Smallest full-match scale: none; the facility can run no inside point at flight Mach number.")
	}
	switch {
	case c.ScaleFits == nil:
		s.Scale = append(s.Scale, "Section fit not checked: the vehicle gives neither span nor frontal area.")
	case *c.ScaleFits:
		s.Scale = append(s.Scale, fmt.Sprintf("The model in force fits the section (largest scale it takes: %s).", g3(c.FitScale)))
	default:
		s.Scale = append(s.Scale, fmt.Sprintf("Model too large for the section: scale %s is above the largest the section takes (%s) at %d of %s.",
			g3(c.Scale), g3(c.FitScale), c.TooLargePoints, reviewPoints(c.Inside)))
	}
	if b := c.Balance; b != nil {
		if b.Scale.Valid() {
			carried := "carries"
			if !*b.ScaleCarried {
				carried = "does not carry"
			}
			s.Scale = append(s.Scale, fmt.Sprintf("The balance takes models up to scale %s at every point it lets be a full match (%s); it %s the model in force.",
				g3(b.Scale), reviewPoints(b.Open), carried))
		} else {
			s.Scale = append(s.Scale, "No model is a full match within the balance at any point.")
		}
	}

	if rf.Runs != nil {
		s.runList(*rf.Runs, rf, r.in.Eval.Grid.SpeedKind, u)
	}
	s.HasCost = rf.HasCost
	if rf.HasCost {
		s.CostSummary, s.CostNotes = rf.Cost.Summary, rf.Cost.Notes
	}
	for _, rc := range rf.Cautions {
		in := ""
		if rc.InRuns > 0 {
			in = fmt.Sprintf(", %d of them in the run list", rc.InRuns)
		}
		s.Cautions = append(s.Cautions, fmt.Sprintf("%s: %s%s; first at %s: %s", rc.Kind, reviewPoints(rc.Points), in, rc.Where, rc.Text))
	}
	return s
}

// sharesOf is the share of class cl in a coverage row.
func reviewShare(c CoverageRow, cl envelope.Class) float64 {
	switch cl {
	case envelope.FullMatch:
		return c.FullMatch
	case envelope.ReShort:
		return c.ReShort
	case envelope.MachRelaxed:
		return c.MachRelaxed
	}
	return c.NoMatch
}

// runList fills the run list table: the run records' settings, then the
// time and cost columns where the facility has them.
func (s *htmlFacility) runList(rl RunList, rf ReviewFacility, kind atmos.SpeedKind, u units.System) {
	water := rl.Medium == envelope.MediumWater
	f := reviewUnits{u: u}
	speedTitle, speedLabel := u.SpeedAxis(kind)
	c := rl.Changes
	switch {
	case len(rl.Runs) == 0:
		s.RunSummary = "No points to run."
	case water:
		s.RunSummary = fmt.Sprintf("%s; set-point changes: water temperature %d, static pressure %d, speed %d; %d of %s change a setting.",
			reviewRunsWords(rl), c.T0, c.P0, c.Mach, c.Moved, reviewPlural(c.Steps, "step", "steps"))
	default:
		held := ""
		if rl.Order.HoldQ {
			held = fmt.Sprintf("q %d, ", c.Q)
		}
		s.RunSummary = fmt.Sprintf("%s; set-point changes: %sT0 %d, p0 %d, Mach number %d; %d of %s change a setting.",
			reviewRunsWords(rl), held, c.T0, c.P0, c.Mach, c.Moved, reviewPlural(c.Steps, "step", "steps"))
	}
	head := []string{"run", "altitude " + u.AltUnit(), speedTitle, "flight Re", "flight q " + f.qUnit()}
	if water {
		head = append(head, "water T "+f.tUnit(), "static p "+f.qUnit(), "speed "+u.SpeedUnit())
	} else {
		head = append(head, "T0 "+f.tUnit(), "p0 "+f.p0Unit(), "test Mach")
	}
	head = append(head, "model Re", "Re ratio", "q "+f.qUnit(), "class", "changes")
	left := map[int]bool{len(head) - 2: true, len(head) - 1: true}
	if rf.HasCost {
		head = append(head, rf.Cost.Columns...)
		s.CostCols = len(rf.Cost.Columns)
	}
	s.Runs = htmlTable{Head: head, Left: left}
	for k, r := range rl.Runs {
		again := k > 0 && rl.Runs[k-1].SetPoint == r.SetPoint
		cells := []string{strconv.Itoa(r.SetPoint), u.AltLabel(r.Altitude), speedLabel(r.GridSpeed), reviewSig3(r.FlightRe), f.q(r.FlightQ)}
		switch {
		case again:
			cells[0] = ""
			cells = append(cells, "", "", "", "")
		case water:
			cells = append(cells, f.temp(r.T0), f.q(r.P0), units.Fixed(u.SpeedValue(r.Speed), 2), reviewSig3(r.Re))
		default:
			cells = append(cells, f.temp(r.T0), f.p0(r.P0), units.Fixed(r.Mach, 3), reviewSig3(r.Re))
		}
		q, changes := f.q(r.Q), reviewChangeWords(rl.Order.Step(rl.Runs, k), water)
		if again {
			q, changes = "", "same run"
		}
		cells = append(cells, units.Fixed(r.ReRatio, 2), q, r.Class.String(), changes)
		class := ""
		if again {
			class = "same"
		}
		row := s.Runs.row(cells, class)
		row.Cells[len(cells)-2].Colour = r.Class.Colour()
		if rf.HasCost {
			for _, cc := range rf.Cost.Cells[k] {
				row.Cells = append(row.Cells, htmlCell{Text: cc})
			}
		}
		s.Runs.Rows = append(s.Runs.Rows, row)
	}
	for _, r := range rl.Unrunnable {
		why := r.Class.String()
		if r.Limit != envelope.LimitNone {
			why += ", limit: " + r.Limit.String()
		}
		s.Unrunnable = append(s.Unrunnable, fmt.Sprintf("%s, %s %s: %s", u.Alt(r.Altitude), speedTitle, speedLabel(r.GridSpeed), why))
	}
}

// runsWords says how many runs cover how many flight points.
func reviewRunsWords(rl RunList) string {
	s := reviewPlural(rl.SetPoints, "run", "runs")
	if len(rl.Runs) != rl.SetPoints {
		s += " for " + reviewPlural(len(rl.Runs), "flight point", "flight points")
	}
	return s
}

// changeWords names the settings that move before a run ("" for none and
// for the first).
func reviewChangeWords(c Changes, water bool) string {
	var parts []string
	names := [4]string{"q", "T0", "p0", "Mach"}
	if water {
		names = [4]string{"q", "temperature", "pressure", "speed"}
	}
	for k, n := range []int{c.Q, c.T0, c.P0, c.Mach} {
		if n > 0 {
			parts = append(parts, names[k])
		}
	}
	return strings.Join(parts, " ")
}

// reviewUnits writes run-list numbers without their unit (the column heads
// carry it): kPa and K, or psi for p0, psf for q and static pressure, °F.
type reviewUnits struct{ u units.System }

func (f reviewUnits) customary() bool { return f.u == units.Customary }

func (f reviewUnits) p0Unit() string {
	if f.customary() {
		return "psi"
	}
	return "kPa"
}

func (f reviewUnits) qUnit() string {
	if f.customary() {
		return "psf"
	}
	return "kPa"
}

func (f reviewUnits) tUnit() string {
	if f.customary() {
		return "°F"
	}
	return "K"
}

func (f reviewUnits) p0(pa float64) string {
	if f.customary() {
		return units.Sig(pa/atmos.PSI, 4)
	}
	return units.Sig(pa/1000, 4)
}

func (f reviewUnits) q(pa float64) string {
	if f.customary() {
		return units.Sig(pa/atmos.PSF, 4)
	}
	return units.Sig(pa/1000, 4)
}

func (f reviewUnits) temp(k float64) string {
	if f.customary() {
		return units.Fixed(k*9/5-459.67, 1)
	}
	return units.Fixed(k, 1)
}

func reviewSig3(x float64) string { return strconv.FormatFloat(x, 'g', 3, 64) }
