package report

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"likewind/envelope"
)

// CoverageRow is one facility's line of the coverage report.
type CoverageRow struct {
	Facility string `json:"facility"`
	Medium   string `json:"medium"`
	// Error says why the facility could not be evaluated ("" when it
	// was); the numbers below are then zero.
	Error     string `json:"error,omitempty"`
	Scale     Num    `json:"model_scale"`
	ScaleRule string `json:"scale_rule"`
	FitScale  Num    `json:"fit_scale"` // largest scale the section takes, null when unknown
	// Inside is the number of points inside the envelope (the report's
	// Inside, repeated on each CSV row).
	Inside int `json:"-" csv:"inside_points"`

	Counts [envelope.NumClasses]int `json:"-"`
	// Shares of inside points per class (0–1).
	FullMatch   float64 `json:"full_match"`
	ReShort     float64 `json:"reynolds_short"`
	MachRelaxed float64 `json:"mach_relaxed"`
	NoMatch     float64 `json:"out_of_reach"`
	Matched     float64 `json:"matched"` // full match or Mach relaxed

	// MinScale is the smallest model scale at which every inside point
	// the facility can run at flight Mach number becomes a full match
	// (null when no point can: water, or no Mach overlap). MachMatchable
	// counts those points; MinScaleCoversAll says they are all of the
	// inside points, so MinScale gives a full match over the whole
	// envelope. MinScaleFits says a model of MinScale fits the section
	// by the span and blockage rules.
	MinScale          Num  `json:"min_scale_full_match"`
	MachMatchable     int  `json:"mach_matchable_points"`
	MinScaleCoversAll bool `json:"min_scale_covers_envelope"`
	MinScaleFits      bool `json:"min_scale_fits_section"`

	// ScaleFits says the model scale in force fits the section by the span
	// and blockage rules at every inside point (null when no fit scale is
	// known: no span or frontal area); TooLargePoints counts the inside
	// points flagged FlagModelTooLarge.
	ScaleFits      *bool `json:"scale_fits_section"`
	TooLargePoints int   `json:"model_too_large_points"`

	// Balance is the balance's scale limit, where the vehicle's load data
	// and the facility's balance capacity are set (nil otherwise: the
	// JSON leaves it out, and the CSV its columns unless some row has it).
	Balance *CoverageBalance `json:"balance,omitempty" csv:"-"`
}

// CoverageBalance is the largest model scale a facility's balance takes
// (envelope.BalanceScaleEnvelope): Scale at every point it lets be a full
// match (null where it lets none: Open 0), Open those points, Closed the
// points the facility could Mach-match that no model is a full match at
// within the balance.
type CoverageBalance struct {
	Scale  Num `json:"balance_scale"`
	Open   int `json:"balance_open_points"`
	Closed int `json:"balance_closed_points"`
	// ScaleCarried says the model scale in force is within Scale.
	ScaleCarried *bool `json:"scale_within_balance"`
}

// Coverage is the facilities × match classes table of a vehicle's
// envelope, the best-of-all shares and the union coverage.
type Coverage struct {
	Vehicle    string         `json:"vehicle"`
	GridRows   int            `json:"grid_rows"`
	GridCols   int            `json:"grid_cols"`
	Inside     int            `json:"inside_points"`
	Settings   ExportSettings `json:"settings"`
	Facilities []CoverageRow  `json:"facilities"`
	Best       CoverageRow    `json:"best_of_all"`
	Union      float64        `json:"union_coverage"`
	Caution    string         `json:"caution"`
	// SolvedCount is the number of facilities that could be evaluated.
	SolvedCount int `json:"solved_facilities"`
}

// NewCoverage summarises an evaluation. Names pass through
// CleanText.
func NewCoverage(e *envelope.Evaluation) Coverage {
	g := e.Grid
	s := e.Settings
	r := Coverage{
		Vehicle: envelope.CleanText(g.Vehicle.Name), GridRows: g.Rows(), GridCols: g.Cols(), Inside: g.InsideCount(),
		Settings: ExportSettings{ScaleOverride: na, DeltaT: Num(s.DeltaT), MachTol: Num(s.MachTol),
			ReTol: Num(s.ReTol), CompressibilityMach: Num(s.CompressibilityMach)},
		Caution:    envelope.PlanningNote,
		Facilities: []CoverageRow{},
	}
	if s.Scale > 0 {
		r.Settings.ScaleOverride = Num(s.Scale)
	}
	for k := range e.Facilities {
		f := &e.Facilities[k]
		row := CoverageRow{Facility: envelope.CleanText(f.Name), Medium: f.Medium.String(), Scale: na, FitScale: na, MinScale: na,
			Inside: r.Inside}
		m := e.Maps[k]
		if m == nil {
			row.Error = "not evaluated"
			if e.Errs[k] != nil {
				row.Error = envelope.CleanText(e.Errs[k].Error())
			}
			r.Facilities = append(r.Facilities, row)
			continue
		}
		r.SolvedCount++
		row.Scale, row.ScaleRule = Num(m.Scale), m.ScaleRule
		if m.FitScale > 0 {
			row.FitScale = Num(m.FitScale)
		}
		row.setShares(m.Shares())
		row.setFit(m)
		row.setBalance(m)
		ms := envelope.SurveyMinScale(g, f, s)
		row.MachMatchable = ms.Points
		if ms.Points > 0 {
			row.MinScale = Num(ms.Scale)
			row.MinScaleCoversAll = ms.Points == g.InsideCount()
			row.MinScaleFits = m.Fits(ms.Scale)
		}
		r.Facilities = append(r.Facilities, row)
	}
	r.Best = CoverageRow{Facility: "best of all", Scale: na, FitScale: na, MinScale: na, Inside: r.Inside}
	if solved := e.Solved(); len(solved) > 0 {
		r.Best.setShares(envelope.BestShares(solved))
		r.Union = envelope.UnionCoverage(solved)
	}
	return r
}

// setFit records whether the map's model fits the section: the inside
// points flagged too large, and whether there are none. Nothing is known
// without a fit scale (no span or frontal area, or no section size):
// FitScale is then 0 at every test Mach number.
func (row *CoverageRow) setFit(m *envelope.Map) {
	if m.FitScale <= 0 {
		return
	}
	for k := range m.Results {
		if c := m.Results[k].Class; c != envelope.Outside && m.Results[k].Flags.Has(envelope.FlagModelTooLarge) {
			row.TooLargePoints++
		}
	}
	fits := row.TooLargePoints == 0
	row.ScaleFits = &fits
}

// setBalance records the balance's scale limit where it is checked.
func (row *CoverageRow) setBalance(m *envelope.Map) {
	if !envelope.BalanceChecked(m.Grid.Vehicle, m.Facility) {
		return
	}
	bs := envelope.BalanceScaleEnvelope(m.Grid, m.Facility, m.Settings)
	b := &CoverageBalance{Scale: na, Open: bs.Open, Closed: bs.Closed}
	if bs.Open > 0 && !math.IsInf(bs.Max, 1) {
		b.Scale = Num(bs.Max)
		in := m.Scale <= bs.Max*(1+1e-9)
		b.ScaleCarried = &in
	}
	row.Balance = b
}

// balanceSet reports whether some facility's balance is checked.
func (r Coverage) balanceSet() bool {
	for _, row := range r.Facilities {
		if row.Balance != nil {
			return true
		}
	}
	return false
}

func (row *CoverageRow) setShares(sh envelope.Shares) {
	row.Counts = sh.Count
	row.FullMatch = sh.Share(envelope.FullMatch)
	row.ReShort = sh.Share(envelope.ReShort)
	row.MachRelaxed = sh.Share(envelope.MachRelaxed)
	row.NoMatch = sh.Share(envelope.NoMatch)
	row.Matched = sh.Matched()
}

// balanceCell is the balance column of a facility's row: its scale limit,
// "none" where no model is a full match within it, "" where it is not
// checked.
func balanceCell(b *CoverageBalance) string {
	switch {
	case b == nil:
		return ""
	case b.Scale.Valid():
		return g3(b.Scale)
	}
	return "none"
}

// pct formats a share as a percentage with one decimal.
func pct(x float64) string { return strconv.FormatFloat(100*x, 'f', 1, 64) + " %" }

// g3 formats a number with three significant digits, "-" when not valid.
func g3(x Num) string {
	if !x.Valid() {
		return "-"
	}
	return strconv.FormatFloat(float64(x), 'g', 3, 64)
}

// WriteText writes the report as an aligned table for a terminal or a
// review document.
func (r Coverage) WriteText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "Coverage of %s: %d×%d grid, %d points inside the envelope\n", r.Vehicle, r.GridRows, r.GridCols, r.Inside)
	st := r.Settings
	scale := "per facility"
	if st.ScaleOverride.Valid() {
		scale = g3(st.ScaleOverride) + " for every facility"
	}
	fmt.Fprintf(&b, "Match: Mach within %s, Reynolds number within %s, Mach relaxed below Mach %s; ΔT %s K; model scale %s\n\n",
		st.MachTol.String(), pct(float64(st.ReTol)), st.CompressibilityMach.String(), st.DeltaT.String(), scale)

	head := []string{"facility", "medium", "scale", envelope.FullMatch.String(), envelope.ReShort.String(), envelope.MachRelaxed.String(),
		envelope.NoMatch.String(), "matched", "min scale", "fits"}
	balance := r.balanceSet()
	if balance {
		head = append(head, "balance")
	}
	var rows [][]string
	for _, row := range r.Facilities {
		if row.Error != "" {
			cells := []string{row.Facility, row.Medium, "-", "-", "-", "-", "-", "-", "-", "-"}
			if balance {
				cells = append(cells, "-")
			}
			rows = append(rows, cells)
			continue
		}
		minScale, fits := g3(row.MinScale), "-"
		if row.MinScale.Valid() {
			if !row.MinScaleCoversAll {
				minScale += "*"
			}
			fits = "no"
			if row.MinScaleFits {
				fits = "yes"
			}
		}
		scale := g3(row.Scale)
		if row.TooLargePoints > 0 {
			scale += "!"
		}
		cells := []string{row.Facility, row.Medium, scale, pct(row.FullMatch), pct(row.ReShort),
			pct(row.MachRelaxed), pct(row.NoMatch), pct(row.Matched), minScale, fits}
		if balance {
			cells = append(cells, balanceCell(row.Balance))
		}
		rows = append(rows, cells)
	}
	bo := r.Best
	best := []string{bo.Facility, "", "", pct(bo.FullMatch), pct(bo.ReShort), pct(bo.MachRelaxed),
		pct(bo.NoMatch), pct(bo.Matched), "", ""}
	if balance {
		best = append(best, "")
	}
	rows = append(rows, best)
	WriteTable(&b, head, rows, func(k int) bool { return k < 2 })
	fmt.Fprintf(&b, "\nUnion coverage (full match or Mach relaxed in at least one facility): %s of inside points.\n", pct(r.Union))
	b.WriteString("Shares are of inside points. min scale: smallest model scale giving a full match at every inside\n" +
		"point the facility can run at flight Mach number; * marks a facility that cannot Mach-match every\n" +
		"point, so the scale covers only those it can; - where none (water tunnels never match Mach).\n" +
		"fits: that scale is within the largest the test section takes by the span and blockage rules.\n")
	if balance {
		b.WriteString("balance: the largest model scale the balance takes at every point it lets be a full match; none\n" +
			"where it lets none; blank where the balance is not checked (no capacity or no load coefficient).\n")
	}
	tooLarge := false
	for _, row := range r.Facilities {
		if row.Error != "" {
			fmt.Fprintf(&b, "%s: not evaluated: %s\n", row.Facility, row.Error)
			continue
		}
		if row.MinScale.Valid() && !row.MinScaleCoversAll {
			fmt.Fprintf(&b, "%s: %d of %d inside points can be run at flight Mach number.\n", row.Facility, row.MachMatchable, r.Inside)
		}
		if bal := row.Balance; bal != nil {
			var line string
			if bal.Scale.Valid() {
				carried := "carries"
				if !*bal.ScaleCarried {
					carried = "does not carry"
				}
				line = fmt.Sprintf("%s: the balance takes models up to scale %s at every point it lets be a full match (%d points); it %s the model in force (%s).",
					row.Facility, g3(bal.Scale), bal.Open, carried, g3(row.Scale))
			} else {
				line = row.Facility + ": no model is a full match within the balance at any point."
			}
			if bal.Closed > 0 {
				line += fmt.Sprintf(" At %d points the facility can run at flight Mach number no model is a full match within it.", bal.Closed)
			}
			b.WriteString(wrapWords(line, 100))
		}
		if row.TooLargePoints > 0 {
			tooLarge = true
			fmt.Fprintf(&b, "%s: model too large for the section: scale %s (%s) is above the largest the test section takes (%s) at %d of %d inside points.\n",
				row.Facility, g3(row.Scale), row.ScaleRule, g3(row.FitScale), row.TooLargePoints, r.Inside)
		}
	}
	if tooLarge {
		b.WriteString("! after a scale: the model in force is too large for the section; its points are flagged.\n")
	}
	b.WriteString(wrapWords("Caution: "+r.Caution, 100))
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteTable writes rows under head in aligned columns two spaces apart:
// columns for which left(k) is true left-aligned, the others (numbers)
// right-aligned, no trailing space. Widths count runes. The text reports of
// the command line share it.
func WriteTable(b *strings.Builder, head []string, rows [][]string, left func(col int) bool) {
	w := make([]int, len(head))
	all := append([][]string{head}, rows...)
	for _, r := range all {
		for k, c := range r {
			w[k] = max(w[k], utf8.RuneCountInString(c))
		}
	}
	for _, r := range all {
		var line strings.Builder
		for k, c := range r {
			pad := strings.Repeat(" ", w[k]-utf8.RuneCountInString(c))
			if k > 0 {
				line.WriteString("  ")
			}
			if left(k) {
				line.WriteString(c + pad)
			} else {
				line.WriteString(pad + c)
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " "))
		b.WriteByte('\n')
	}
}

// wrapWords wraps s at width columns, ending every line with a newline.
func wrapWords(s string, width int) string {
	var b strings.Builder
	n := 0
	for _, word := range strings.Fields(s) {
		l := utf8.RuneCountInString(word)
		if n > 0 && n+1+l > width {
			b.WriteByte('\n')
			n = 0
		}
		if n > 0 {
			b.WriteByte(' ')
			n++
		}
		b.WriteString(word)
		n += l
	}
	b.WriteByte('\n')
	return b.String()
}

// coverageCSV is the coverage report's CSV column table, derived once
// from CoverageRow's tags (never changed after initialisation).
var coverageCSV = newCSVTable[CoverageRow]()

// bestBlank are the CSV columns left empty on the best-of-all row: they
// count or judge one facility's points and model.
var bestBlank = []string{"mach_matchable_points", "min_scale_covers_envelope", "min_scale_fits_section", "model_too_large_points"}

// WriteCSV writes one row per facility and a last row "best of all" whose
// matched column is the union coverage. Shares are fractions of the inside
// points (0–1).
//
// Where some facility's balance is checked, the columns of CoverageBalance
// follow (empty on the other rows); otherwise they are left out.
func (r Coverage) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	balance := r.balanceSet()
	if err := cw.Write(coverageHeader(nil, balance)); err != nil {
		return err
	}
	if err := r.writeCSV(cw, nil, balance); err != nil {
		return err
	}
	cw.Flush()
	return cw.Error()
}

// coverageHeader is the CSV header: the lead columns, the columns of
// CoverageRow and, with balance, those of CoverageBalance.
func coverageHeader(lead []string, balance bool) []string {
	head := append(append([]string(nil), lead...), coverageCSV.header()...)
	if balance {
		head = append(head, coverageBalanceCSV.header()...)
	}
	return head
}

// writeCSV writes the rows to cw, each with lead cells first (a
// comparison of vehicles puts the vehicle there), with the balance
// columns when balance is set.
func (r Coverage) writeCSV(cw *csv.Writer, lead []string, balance bool) error {
	var buf, bbuf []string
	row := func(c *CoverageRow, edit func(cells []string)) error {
		buf = coverageCSV.row(c, buf)
		if edit != nil {
			edit(buf)
		}
		cells := append(append([]string(nil), lead...), buf...)
		if balance {
			bal := CoverageBalance{Scale: na}
			if c.Balance != nil {
				bal = *c.Balance
			}
			bbuf = coverageBalanceCSV.row(&bal, bbuf)
			if c.Balance == nil {
				for k := range bbuf {
					bbuf[k] = ""
				}
			}
			cells = append(cells, bbuf...)
		}
		return cw.Write(cells)
	}
	for k := range r.Facilities {
		if err := row(&r.Facilities[k], nil); err != nil {
			return err
		}
	}
	best := r.Best
	best.Matched = r.Union
	return row(&best, func(cells []string) {
		for _, name := range bestBlank {
			cells[coverageCSV.column(name)] = ""
		}
	})
}

// coverageBalanceCSV is the CSV column table of CoverageBalance.
var coverageBalanceCSV = newCSVTable[CoverageBalance]()

// WriteJSON writes the report as one indented JSON object.
func (r Coverage) WriteJSON(w io.Writer) error {
	b, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		return err
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// CoverageSet is the coverage report of several vehicles or
// configurations in the same facilities: one Coverage per vehicle and the
// comparison of their matched shares.
type CoverageSet struct {
	Vehicles   []Coverage        `json:"vehicles"`
	Comparison []CoverageCompare `json:"comparison"`
	Caution    string            `json:"caution"`
}

// CoverageCompare is one facility (or "best of all", whose shares are the
// union coverage) across the vehicles: the matched share of each, in
// vehicle order (null where the facility was not evaluated for it).
type CoverageCompare struct {
	Facility string `json:"facility"`
	Matched  []Num  `json:"matched"`
}

// NewCoverageSet summarises one evaluation per vehicle, all on the same
// facilities.
func NewCoverageSet(evs []*envelope.Evaluation) CoverageSet {
	cs := CoverageSet{Caution: envelope.PlanningNote, Vehicles: []Coverage{}, Comparison: []CoverageCompare{}}
	for _, e := range evs {
		cs.Vehicles = append(cs.Vehicles, NewCoverage(e))
	}
	if len(cs.Vehicles) == 0 {
		return cs
	}
	for k, row := range cs.Vehicles[0].Facilities {
		c := CoverageCompare{Facility: row.Facility}
		for _, v := range cs.Vehicles {
			x := na
			if k < len(v.Facilities) && v.Facilities[k].Error == "" {
				x = Num(v.Facilities[k].Matched)
			}
			c.Matched = append(c.Matched, x)
		}
		cs.Comparison = append(cs.Comparison, c)
	}
	union := CoverageCompare{Facility: "union coverage"}
	for _, v := range cs.Vehicles {
		union.Matched = append(union.Matched, Num(v.Union))
	}
	cs.Comparison = append(cs.Comparison, union)
	return cs
}

// WriteText writes each vehicle's coverage report, then the matched
// share of each facility per vehicle side by side.
func (cs CoverageSet) WriteText(w io.Writer) error {
	var b strings.Builder
	for k, v := range cs.Vehicles {
		if k > 0 {
			b.WriteString("\n")
		}
		if err := v.WriteText(&b); err != nil {
			return err
		}
	}
	b.WriteString("\nComparison of vehicles: matched share (full match or Mach relaxed) of inside points\n")
	head := []string{"facility"}
	for k, v := range cs.Vehicles {
		head = append(head, "V"+strconv.Itoa(k+1))
		fmt.Fprintf(&b, "V%d: %s\n", k+1, v.Vehicle)
	}
	var rows [][]string
	for _, c := range cs.Comparison {
		cells := []string{c.Facility}
		for _, x := range c.Matched {
			cell := "-"
			if x.Valid() {
				cell = pct(float64(x))
			}
			cells = append(cells, cell)
		}
		rows = append(rows, cells)
	}
	WriteTable(&b, head, rows, func(k int) bool { return k == 0 })
	b.WriteString(wrapWords("Caution: "+cs.Caution, 100))
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteCSV writes every vehicle's rows under one header, with a first
// column "vehicle".
func (cs CoverageSet) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	balance := false
	for _, v := range cs.Vehicles {
		balance = balance || v.balanceSet()
	}
	if err := cw.Write(coverageHeader([]string{"vehicle"}, balance)); err != nil {
		return err
	}
	for _, v := range cs.Vehicles {
		if err := v.writeCSV(cw, []string{v.Vehicle}, balance); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteJSON writes the set as one indented JSON object.
func (cs CoverageSet) WriteJSON(w io.Writer) error {
	b, err := json.MarshalIndent(cs, "", "  ")
	if err != nil {
		return err
	}
	_, err = w.Write(append(b, '\n'))
	return err
}
