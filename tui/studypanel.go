package tui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// studyPanel is the model-scale study of the facility on screen
// (envelope.StudyMap): a table of model scale against the facility's
// full-match and matched shares, the union with the other facilities and
// the reach-ratio quantiles, with the scale in force, the section's fit
// limit and the balance limit marked and the best scale named. The
// pointer moves over the rows; enter reports the row's scale
// (studyScaleChosenMsg), which the root applies as the what-if scale of
// every facility as the + and - keys do; [ and ] report a step to another
// facility (studyFacilityMsg); U undoes. The root runs the study in a
// command and gives the panel the facility, the study and whether the
// study is of what is on screen (SetStudy).
type studyPanel struct {
	frame
	fac     int    // facility on screen (-1: best of all)
	facName string // its name
	facErr  string // why the facility has no map ("" when it has one)
	// study is the latest study of this facility, of map of (nil: none
	// yet), err why it failed; stale says it is of values since changed
	// (a new one is on its way).
	of    *envelope.Map
	study *envelope.ScaleStudy
	err   string
	stale bool
	// rows are the table's cells, made when the study arrives.
	rows []studyRow
	sel  int // row under the pointer
	top  int // first row shown
}

// studyRow is one scale of the table, its cells as shown.
type studyRow struct {
	scale float64
	cells [studyCols]string
	words string // the marks in words ("in force, fit limit")
	codes string // the marks as letters (studyCodes)
	// beyond: above the fit or the balance limit.
	beyond bool
}

// The columns of the table: scale, the full-match and matched shares and
// the union (% of the envelope's inside points), and the reach-ratio
// quantiles (envelope.StudyQuantiles).
const studyCols = 7

var studyHead = [studyCols]string{"scale", "full%", "match%", "union%", "Re p10", "p50", "p90"}

// The marks, as words where the panel has room and otherwise as the
// letters of studyCodes, explained by studyCodeLegend.
var studyMarks = []struct {
	mark envelope.StepMark
	word string
	code byte
}{
	{mark: envelope.MarkInForce, word: "in force", code: 'I'},
	{mark: envelope.MarkFitLimit, word: "fit limit", code: 'F'},
	{mark: envelope.MarkBalanceLimit, word: "balance limit", code: 'B'},
}

// studyCodeLegend explains the letters of the marks.
const studyCodeLegend = "I in force  F fit limit  B balance limit  ^ best  f, b beyond the fit, balance limit"

// Messages of the study: the finished study (the root's), and the panel's
// reports.
type (
	// studiedMsg is a finished study of map of (gen: the request it
	// answers).
	studiedMsg struct {
		gen   int
		of    *envelope.Map
		fac   int
		study *envelope.ScaleStudy
		err   error
	}
	// studyScaleChosenMsg: apply scale as the what-if scale.
	studyScaleChosenMsg struct{ scale float64 }
	// studyFacilityMsg: study the facility step places on (±1, over the
	// facilities, best of all left out).
	studyFacilityMsg struct{ step int }
)

// SetFacility says which facility is on screen (fac -1: best of all) with
// its name and, for one that was not solved, why.
func (p *studyPanel) SetFacility(fac int, name, facErr string) {
	if fac != p.fac {
		p.of, p.study, p.err, p.rows, p.stale = nil, nil, "", nil, false
	}
	p.fac, p.facName, p.facErr = fac, name, facErr
}

// SetStudy gives the study of the facility's map of (or why it failed),
// and whether it is of values since changed. The pointer stays on the
// scale it was on where the new study has it, else it goes to the scale
// in force.
func (p *studyPanel) SetStudy(of *envelope.Map, st *envelope.ScaleStudy, err error, stale bool) {
	p.stale = stale
	if of == p.of {
		return
	}
	p.of = of
	was := math.NaN()
	if p.sel < len(p.rows) {
		was = p.rows[p.sel].scale
	}
	p.study, p.err = st, ""
	if err != nil {
		p.err = err.Error()
	}
	p.rows = studyRows(st)
	p.sel = -1
	for k, r := range p.rows {
		if r.scale == was {
			p.sel = k
		}
	}
	if p.sel < 0 {
		p.sel = p.inForceRow()
	}
	p.scrollToPointer()
}

// Open puts the pointer on the scale in force.
func (p *studyPanel) Open() {
	p.sel = p.inForceRow()
	p.scrollToPointer()
}

// hasTable reports whether there is a study to draw.
func (p studyPanel) hasTable() bool {
	return p.fac >= 0 && p.facErr == "" && p.err == "" && p.study != nil
}

// inForceRow is the row of the scale in force (0 when there is none).
func (p studyPanel) inForceRow() int {
	if p.study != nil {
		for k, s := range p.study.Steps {
			if s.Mark.Has(envelope.MarkInForce) {
				return k
			}
		}
	}
	return 0
}

// studyRows makes the table's cells.
func studyRows(st *envelope.ScaleStudy) []studyRow {
	if st == nil {
		return nil
	}
	rows := make([]studyRow, len(st.Steps))
	for k, x := range st.Steps {
		r := studyRow{scale: x.Scale, beyond: x.Mark.Beyond()}
		r.cells[0] = strconv.FormatFloat(x.Scale, 'g', 3, 64)
		r.cells[1] = shareCell(x.Shares.Share(envelope.FullMatch))
		r.cells[2] = shareCell(x.Shares.Matched())
		r.cells[3] = shareCell(x.Union)
		for q := range x.ReRatio {
			r.cells[4+q] = ratioCell(x.ReRatio[q])
		}
		r.words, r.codes = stepMarkText(x.Mark, k == st.Best)
		rows[k] = r
	}
	return rows
}

// stepMarkText is what is special about a step, in words and as letters.
func stepMarkText(m envelope.StepMark, best bool) (words, codes string) {
	var w []string
	var c []byte
	for _, x := range studyMarks {
		if m.Has(x.mark) {
			w, c = append(w, x.word), append(c, x.code)
		}
	}
	if best {
		w, c = append(w, "best"), append(c, '^')
	}
	switch bf, bb := m.Has(envelope.MarkBeyondFit), m.Has(envelope.MarkBeyondBalance); {
	case bf && bb:
		w, c = append(w, "beyond fit and balance"), append(c, 'f', 'b')
	case bf:
		w, c = append(w, "beyond fit"), append(c, 'f')
	case bb:
		w, c = append(w, "beyond balance"), append(c, 'b')
	}
	return strings.Join(w, ", "), string(c)
}

// shareCell is a share as a percentage with one decimal.
func shareCell(x float64) string { return strconv.FormatFloat(100*x, 'f', 1, 64) }

// ratioCell is a reach ratio in at most five cells: three significant
// digits from 0.1 up, "<0.01" below 0.01, "-" where there is none.
func ratioCell(x float64) string {
	switch {
	case math.IsNaN(x):
		return "-"
	case x < 0.01:
		return "<0.01"
	case x < 1:
		return strconv.FormatFloat(x, 'f', 3, 64)
	case x < 10:
		return strconv.FormatFloat(x, 'f', 2, 64)
	case x < 100:
		return strconv.FormatFloat(x, 'f', 1, 64)
	}
	return strconv.FormatFloat(x, 'f', 0, 64)
}

// SetSize sets the area and keeps the pointer's row in view.
func (p *studyPanel) SetSize(w, h int) {
	p.frame.SetSize(w, h)
	p.scrollToPointer()
}

// Update moves the pointer, chooses a scale, steps the facility, or
// passes U, ? and q on to the root.
func (p studyPanel) Update(msg tea.Msg) (studyPanel, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return p, nil
	}
	keys := p.keys
	var cmd tea.Cmd
	if p.sel, cmd, ok = listKey(k, keys, keys.Study, p.sel, len(p.rows)); ok {
		p.scrollToPointer()
		return p, cmd
	}
	page := max(p.tableRows()-1, 1)
	switch {
	case key.Matches(k, keys.PageUp):
		p.sel = max(p.sel-page, 0)
	case key.Matches(k, keys.PageDown):
		p.sel = max(min(p.sel+page, len(p.rows)-1), 0)
	case key.Matches(k, keys.Home):
		p.sel = 0
	case key.Matches(k, keys.End):
		p.sel = max(len(p.rows)-1, 0)
	case key.Matches(k, keys.Select):
		if p.sel < len(p.rows) {
			return p, report(studyScaleChosenMsg{scale: p.rows[p.sel].scale})
		}
	case key.Matches(k, keys.PrevFac):
		return p, report(studyFacilityMsg{step: -1})
	case key.Matches(k, keys.NextFac):
		return p, report(studyFacilityMsg{step: 1})
	case key.Matches(k, keys.Undo):
		return p, report(undoWantedMsg{})
	}
	p.scrollToPointer()
	return p, nil
}

// ShortHelp is the key line while the panel is open.
func (p studyPanel) ShortHelp() []key.Binding {
	k := p.keys
	return []key.Binding{k.Prev, k.Next, k.Select, k.Undo, k.PrevFac, k.NextFac, k.Back}
}

// FullHelp lists the same keys.
func (p studyPanel) FullHelp() [][]key.Binding { return [][]key.Binding{p.ShortHelp()} }

// codes reports whether the marks are shown as letters: where the words
// do not fit beside the table.
func (p studyPanel) codes() bool {
	tw := p.tableWidth()
	for _, r := range p.rows {
		if tw+2+visibleWidth(r.words) > p.width {
			return true
		}
	}
	return false
}

// colWidths are the widths of the table's columns.
func (p studyPanel) colWidths() [studyCols]int {
	var w [studyCols]int
	for c, h := range studyHead {
		w[c] = visibleWidth(h)
	}
	for _, r := range p.rows {
		for c, s := range r.cells {
			w[c] = max(w[c], visibleWidth(s))
		}
	}
	return w
}

// tableWidth is the width of a row without its marks: the pointer, the
// columns, one space between them and two before the ratios.
func (p studyPanel) tableWidth() int {
	n := 2
	for c, w := range p.colWidths() {
		n += w + studyGap(c)
	}
	return n
}

// studyGap is the space before column c.
func studyGap(c int) int {
	switch c {
	case 0:
		return 0
	case 4:
		return 2
	}
	return 1
}

// PreferredWidth is the width at which the marks are words.
func (p studyPanel) PreferredWidth() int {
	n := 0
	for _, r := range p.rows {
		n = max(n, visibleWidth(r.words))
	}
	return p.tableWidth() + 2 + n
}

// PreferredHeight is how many lines the panel takes at width w with every
// row shown.
func (p studyPanel) PreferredHeight(w int) int {
	p.SetSize(w, 1<<20)
	legend, notes := p.footing()
	return len(p.heading()) + len(p.rows) + len(legend) + len(notes) + 1
}

// heading is the panel's text above the table rows: its title, what the
// facility's limits are, the best scale, the state of the study and the
// column heads.
func (p studyPanel) heading() []string {
	st := p.st
	title := st.Section.Render("MODEL-SCALE STUDY")
	if p.fac < 0 {
		return append([]string{title}, p.wrap(fmt.Sprintf("Best of all has no model of its own: choose a facility to study (%s and %s step through them here, %s lists them).",
			p.keys.PrevFac.Help().Key, p.keys.NextFac.Help().Key, p.keys.Facility.Help().Key), st.Value)...)
	}
	title += " " + facilityLabel(p.fac, p.facName, p.width-len("MODEL-SCALE STUDY "))
	lines := p.wrap(title, st.Value)
	switch {
	case p.facErr != "":
		return append(lines, p.wrap("not solved: "+p.facErr, st.Error)...)
	case p.err != "":
		return append(lines, p.wrap(p.err, st.Error)...)
	case p.study == nil:
		return append(lines, st.Changed.Render("computing the study…"))
	}
	lines = append(lines, p.wrap(p.limitsText(), st.Faint)...)
	lines = append(lines, p.wrap(p.bestText(), st.Value)...)
	if p.stale {
		lines = append(lines, p.wrap("what-if values changed: computing the study again…", st.Changed)...)
	}
	return append(lines, p.headRow())
}

// wrap wraps s to the panel's width in style sty.
func (p studyPanel) wrap(s string, sty interface{ Render(...string) string }) []string {
	ls := wrapLines(s, p.width, "  ")
	for k := range ls {
		ls[k] = sty.Render(ls[k])
	}
	return ls
}

// limitsText says the scale in force and the two limits.
func (p studyPanel) limitsText() string {
	s := p.study
	t := "scale in force " + scaleWords(s.Scale)
	switch {
	case s.FitScale > 0 && sig3(s.FitScale) == sig3(s.Scale):
		t += fmt.Sprintf(", the largest the section takes (%s)", s.FitRule)
	case s.FitScale > 0:
		t += fmt.Sprintf(" (%s); the section takes up to %s (%s)", s.ScaleRule, sig3(s.FitScale), s.FitRule)
	default:
		t += fmt.Sprintf(" (%s); no section fit", s.ScaleRule)
	}
	switch b, ok := s.BalanceLimit(); {
	case !s.BalanceChecked:
		t += "; balance not checked"
	case ok:
		t += "; the balance takes up to " + sig3(b)
	default:
		t += fmt.Sprintf("; the balance lets no point be a full match (%d shut out)", s.Balance.Closed)
	}
	return t + "."
}

// scaleWords is a scale as the table shows it, with its ratio where it is
// one ("0.025 = 1:40").
func scaleWords(x float64) string {
	t := sig3(x)
	if r := whatif.Scale.Show(units.SI, x, false); strings.HasPrefix(r, "1:") {
		t += " = " + r
	}
	return t
}

// bestText names the best scale.
func (p studyPanel) bestText() string {
	s := p.study
	if s.Best < 0 {
		return "No scale within the limits matches any point."
	}
	b := s.Steps[s.Best]
	return fmt.Sprintf("Best within the limits: scale %s, %s %% matched.", sig3(b.Scale), shareCell(b.Shares.Matched()))
}

// sig3 is a scale with three significant digits, as the table shows it.
func sig3(x float64) string { return strconv.FormatFloat(x, 'g', 3, 64) }

// headRow is the line of column heads.
func (p studyPanel) headRow() string {
	w := p.colWidths()
	var b strings.Builder
	b.WriteString("  ")
	for c, h := range studyHead {
		b.WriteString(strings.Repeat(" ", studyGap(c)) + padLeft(h, w[c]))
	}
	b.WriteString("  mark")
	return p.st.Label.Render(b.String())
}

// footing is the text under the table rows: the letters of the marks
// where they are letters (legend), and what the columns are (notes).
func (p studyPanel) footing() (legend, notes []string) {
	if !p.hasTable() || len(p.rows) == 0 {
		return nil, nil
	}
	if p.codes() {
		legend = p.wrap(studyCodeLegend, p.st.Faint)
	}
	notes = p.wrap(fmt.Sprintf("Shares in %% of the %d points inside the envelope; union: matched here or by another facility; "+
		"Re p10, p50, p90: quantiles over the points of the highest model Reynolds number over flight's.", p.study.Inside), p.st.Faint)
	return legend, notes
}

// studyNoteRows is how many table rows the panel keeps before it shows
// the notes under them.
const studyNoteRows = 8

// footingShown is the footing drawn: the legend of the letters wherever a
// row fits beside it, the notes where every row fits with them or
// studyNoteRows do.
func (p studyPanel) footingShown() []string {
	legend, notes := p.footing()
	room := p.height - len(p.heading())
	var out []string
	if len(legend) > 0 && room-len(legend) >= 1 {
		out, room = legend, room-len(legend)
	}
	if room-len(notes) >= min(studyNoteRows, len(p.rows)) {
		out = append(out, notes...)
	}
	return out
}

// tableRows is how many rows fit under the heading (at least one), with
// the line that says which are in view where they do not all fit and the
// column heads' line has no room for it.
func (p studyPanel) tableRows() int {
	room := p.height - len(p.heading()) - len(p.footingShown())
	if len(p.rows) > room && !p.whereOnHead() {
		room--
	}
	return max(room, 1)
}

// whereOnHead reports whether the column heads' line has room for the
// rows in view ("rows 12–40 of 43").
func (p studyPanel) whereOnHead() bool {
	n := len(p.rows)
	return visibleWidth(p.headRow())+2+visibleWidth(fmt.Sprintf("rows %d–%d of %d", n, n, n)) <= p.width
}

// scrollToPointer keeps the pointer's row in view.
func (p *studyPanel) scrollToPointer() {
	n := p.tableRows()
	p.sel = max(min(p.sel, len(p.rows)-1), 0)
	if p.sel < p.top {
		p.top = p.sel
	}
	if p.sel >= p.top+n {
		p.top = p.sel - n + 1
	}
	p.top = max(min(p.top, len(p.rows)-n), 0)
}

// View draws the panel.
func (p studyPanel) View() string { return p.fit(strings.Join(p.body(), "\n")) }

// body is the panel's lines at its size: the heading, the rows in view
// and the footing, each line within the width (wrapped, never cut).
func (p studyPanel) body() []string {
	lines := p.heading()
	if !p.hasTable() || len(p.rows) == 0 {
		return lines
	}
	n := p.tableRows()
	w := p.colWidths()
	codes := p.codes()
	for k := p.top; k < min(p.top+n, len(p.rows)); k++ {
		r := p.rows[k]
		var b strings.Builder
		b.WriteString("  ")
		if k == p.sel {
			b.Reset()
			b.WriteString("> ")
		}
		for c, s := range r.cells {
			b.WriteString(strings.Repeat(" ", studyGap(c)) + padLeft(s, w[c]))
		}
		mark := r.words
		if codes {
			mark = r.codes
		}
		if mark != "" {
			b.WriteString("  " + mark)
		}
		style := p.st.Value
		switch {
		case k == p.sel:
			style = p.st.Selected
		case r.beyond:
			style = p.st.Faint
		}
		lines = append(lines, style.Render(b.String()))
	}
	foot := p.footingShown()
	if len(p.rows) > n {
		// Which rows are in view.
		where := p.st.Faint.Render(fmt.Sprintf("rows %d–%d of %d", p.top+1, min(p.top+n, len(p.rows)), len(p.rows)))
		if h := len(p.heading()) - 1; p.whereOnHead() {
			lines[h] += "  " + where
		} else {
			lines = append(lines, where)
		}
	}
	return append(lines, foot...)
}
