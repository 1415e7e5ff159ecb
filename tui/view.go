package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"

	"likewind/envelope"
)

// matrixView draws the matrix in its frame.
type matrixView struct{ frame }

func (v matrixView) View(in MatrixInput) string {
	return RenderMatrix(in, *v.st, v.width, v.height)
}

// legendView draws the legend of the current layer.
type legendView struct{ frame }

func (v legendView) View(in LegendInput) string {
	return v.fit(RenderLegend(in, *v.st, v.width))
}

// pickerRow is one line of the facility picker.
type pickerRow struct {
	name, info string
	full       float64 // full-match share
	matched    float64 // full match or Mach relaxed
	err        string
}

// picker lists the facilities with their coverage.
type picker struct {
	frame
	sel int
}

func (p picker) View(rows []pickerRow, current int) string {
	var b strings.Builder
	b.WriteString(p.st.Section.Render("FACILITIES") + " " + p.st.Faint.Render("(= shown)  full match, matched share of envelope"))
	for k, r := range rows {
		b.WriteString("\n")
		pointer, cur := " ", " "
		if k == p.sel {
			pointer = ">"
		}
		if k == current {
			cur = "="
		}
		share := fmt.Sprintf("%3.0f%% %3.0f%%", 100*r.full, 100*r.matched)
		if r.err != "" {
			share = "  not solved"
		}
		nameW := max(p.width-visibleWidth(share)-5, 8)
		text := pointer + cur + " " + padRight(r.name, nameW) + " " + share
		if k == p.sel {
			text = p.st.Selected.Render(text)
		}
		b.WriteString(text)
		if r.info != "" && k == p.sel {
			b.WriteString("\n    " + p.st.Faint.Render(r.info))
		}
		if r.err != "" && k == p.sel {
			b.WriteString("\n    " + p.st.Error.Render(r.err))
		}
	}
	return p.fit(b.String())
}

// detailsView draws the point details: flight conditions, the facility
// answer and cautions.
type detailsView struct{ frame }

// detailBlocks is the text of the details panel.
type detailBlocks struct {
	flight   []string
	facility []string
	cautions []string
	summary  string // one line for cramped screens
}

// View lays the blocks out: side by side when the frame is wide enough
// for two columns and short, stacked otherwise.
func (v detailsView) View(d detailBlocks, stacked bool) string {
	if v.width <= 0 || v.height <= 0 {
		return ""
	}
	if v.height < 4 {
		return v.fit(d.summary)
	}
	var b strings.Builder
	if stacked {
		b.WriteString(strings.Join(d.flight, "\n"))
		b.WriteString("\n\n")
		b.WriteString(strings.Join(d.facility, "\n"))
		for _, c := range d.cautions {
			b.WriteString("\n")
			b.WriteString(wrapText(c, v.width))
		}
		return v.fit(b.String())
	}
	half := (v.width - 1) / 2
	rows := max(len(d.flight), len(d.facility))
	left := box(strings.Join(d.flight, "\n"), half, rows)
	right := box(strings.Join(d.facility, "\n"), v.width-half-1, rows)
	b.WriteString(joinColumns(left, right, " "))
	for _, c := range d.cautions {
		b.WriteString("\n")
		b.WriteString(wrapText(c, v.width))
	}
	return v.fit(b.String())
}

// joinColumns joins two boxed blocks of equal height line by line.
func joinColumns(a, b, gap string) string {
	la, lb := strings.Split(a, "\n"), strings.Split(b, "\n")
	n := max(len(la), len(lb))
	var out strings.Builder
	for k := 0; k < n; k++ {
		if k > 0 {
			out.WriteByte('\n')
		}
		if k < len(la) {
			out.WriteString(la[k])
		}
		out.WriteString(gap)
		if k < len(lb) {
			out.WriteString(lb[k])
		}
	}
	return out.String()
}

// relayout sizes every component for the current terminal and state. It
// runs at the end of every Update, so View only draws.
func (m *Model) relayout() {
	W, H := m.fr.width, m.fr.height
	m.tooSmall = W < MinWidth || H < MinHeight
	m.help.SetSize(W, 1)
	m.editor.SetLineWidth(W)
	if m.tooSmall {
		return
	}
	m.headerH = lineCount(m.headerText())
	m.legend.SetSize(W, H)
	m.legendH = lineCount(m.legend.View(m.legendInput()))
	m.bodyH = max(H-m.headerH-m.legendH-1, 1)
	m.wide = W >= WideWidth
	if m.mode == modeHelp {
		m.help.SetSize(W, H-m.headerH-1)
		return
	}
	if m.wide {
		need, _ := MatrixSize(m.matrixInput())
		m.sideW = min(max(W-need-1, 42), 60)
		matW := W - m.sideW - 1
		m.matrix.SetSize(matW, m.bodyH)
		m.details.SetSize(m.sideW, m.bodyH)
		m.picker.SetSize(m.sideW, m.bodyH)
		m.editor.SetSize(m.sideW, m.bodyH)
		m.lowerH = 0
	} else {
		pref := m.lowerPreferred(W)
		avail := m.bodyH - minMatrixHeight
		m.lowerH = min(pref, max(avail, 1))
		m.matrix.SetSize(W, m.bodyH-m.lowerH)
		m.details.SetSize(W, m.lowerH)
		m.picker.SetSize(W, m.lowerH)
		m.editor.SetSize(W, m.lowerH)
	}
	m.legend.SetSize(m.fr.width, m.legendH)
	in := m.matrixInput()
	m.scrollR, m.scrollC = FitScroll(in, m.matrix.width, m.matrix.height)
}

// lowerPreferred is the height the panel below the matrix wants in the
// narrow layout.
func (m *Model) lowerPreferred(w int) int {
	switch m.mode {
	case modePicker:
		return len(m.facs) + 4
	case modeEdit:
		n := int(fieldCount) + 1
		if m.editor.err != "" {
			n += 1 + visibleWidth(m.editor.err)/max(w, 1)
		}
		return n
	}
	d := m.detailBlocks(w)
	return max(len(d.flight), len(d.facility)) + len(d.cautions)
}

// View implements tea.Model. It draws from the state only.
func (m Model) View() string {
	W, H := m.fr.width, m.fr.height
	if W <= 0 || H <= 0 {
		return ""
	}
	if m.tooSmall {
		return m.tooSmallView()
	}
	parts := make([]string, 0, 6)
	parts = append(parts, m.headerText())
	if m.mode == modeHelp {
		parts = append(parts, box(m.help.Overlay(), W, H-m.headerH-1))
		parts = append(parts, m.footer())
		return clip(strings.Join(parts, "\n"), W, H)
	}
	parts = append(parts, m.bodyView())
	parts = append(parts, box(m.legend.View(m.legendInput()), W, m.legendH))
	parts = append(parts, m.footer())
	return clip(strings.Join(parts, "\n"), W, H)
}

func (m Model) tooSmallView() string {
	msg := fmt.Sprintf("Terminal too small: %d×%d. likewind needs at least %d×%d; enlarge the window, or q to quit.",
		m.fr.width, m.fr.height, MinWidth, MinHeight)
	return clip(wrapText(msg, m.fr.width), m.fr.width, m.fr.height)
}

// bodyView is the matrix with details, picker or editor beside or below.
func (m Model) bodyView() string {
	mat := box(m.matrix.View(m.matrixInput()), m.matrix.width, m.matrix.height)
	var panel string
	switch m.mode {
	case modePicker:
		panel = m.picker.View(m.pickerRows(), m.fac+1)
	case modeEdit:
		panel = m.editor.View(m.editorRows(), m.editorTitle())
	default:
		if m.wide {
			panel = m.details.View(m.detailBlocks(m.sideW), true)
		} else {
			panel = m.details.View(m.detailBlocks(m.fr.width), false)
		}
	}
	if m.wide {
		return joinColumns(mat, box(panel, m.sideW, m.bodyH), " ")
	}
	if m.lowerH <= 0 {
		return mat
	}
	return mat + "\n" + box(panel, m.fr.width, m.lowerH)
}

// headerText is the title line and, when what-if values differ from the
// files, up to three lines listing them.
func (m Model) headerText() string {
	W := m.fr.width
	st := m.fr.st
	fac := "best of all"
	if m.fac >= 0 && m.fac < len(m.facs) {
		fac = fmt.Sprintf("%s (%d/%d)", m.facs[m.fac].Name, m.fac+1, len(m.facs))
	} else if len(m.facs) == 0 {
		fac = "no facilities"
	}
	veh := "no vehicle"
	if m.vehicle != nil {
		veh = m.vehicle.Name
	}
	sep := st.Faint.Render(" | ")
	title := st.Title.Render("likewind") + sep + fac + sep + m.layer.String() + sep + m.units.String()
	if m.busy {
		title += sep + st.Changed.Render("computing")
	}
	title += sep + st.Faint.Render(veh)
	lines := []string{clip(title, W, 1)}
	ch := m.changes()
	if len(ch) > 0 {
		var items []string
		for _, c := range ch {
			items = append(items, st.Changed.Render(c.label+" "+c.now)+st.Faint.Render(" (files "+c.file+")"))
		}
		w := wrapItems(st.Changed.Render("what-if:"), items, "  ", W)
		wl := strings.Split(w, "\n")
		if len(wl) > 3 {
			wl = append(wl[:2], st.Faint.Render(fmt.Sprintf("… %d values changed in all (e lists them)", len(ch))))
		}
		lines = append(lines, wl...)
	}
	return strings.Join(lines, "\n")
}

// statusLine is the message line above the key help.
func (m Model) statusLine() string {
	st := m.fr.st
	if m.status == "" {
		return ""
	}
	if m.statusErr {
		return clip(st.Error.Render(m.status), m.fr.width, 1)
	}
	return clip(st.Status.Render(m.status), m.fr.width, 1)
}

// footer is the last line: the quit question, the input line, a status
// message, or the key help.
func (m Model) footer() string {
	k := m.fr.keys
	if m.status != "" && m.mode != modeConfirm && !(m.mode == modeEdit && m.editor.editing) {
		return m.statusLine()
	}
	switch m.mode {
	case modeConfirm:
		q := "Unsaved what-if changes or marks. "
		if m.sessionPath == "" {
			q = "Unsaved changes; no session file. "
		}
		return clip(m.fr.st.Changed.Render(q)+m.help.Short(confirmKeys{k: k, canSave: m.sessionPath != ""}.ShortHelp()), m.fr.width, 1)
	case modeHelp:
		return m.help.Short([]key.Binding{k.Help, k.Back, k.Quit})
	case modePicker:
		return m.help.Short([]key.Binding{k.Prev, k.Next, k.Select, k.Back})
	case modeEdit:
		if m.editor.editing {
			return m.editor.Line()
		}
		return m.help.Short(listKeys{k: k}.ShortHelp())
	}
	return m.help.Short(k.ShortHelp())
}

// gridView is the model's current way of looking at the results.
func (m Model) gridView() GridView {
	return GridView{
		Grid:       m.res.grid,
		Maps:       m.res.maps,
		Facilities: m.facs,
		Facility:   m.fac,
		Best:       m.res.best,
		BestRes:    m.res.bestRes,
		Layer:      m.layer,
		Units:      m.units,
		ReTol:      m.set.ReTol,
		Marks:      m.marks,
		CursorRow:  m.curI,
		CursorCol:  m.curJ,
		ScrollRow:  m.scrollR,
		ScrollCol:  m.scrollC,
	}
}

// legendInput describes the legend of the current view.
func (m Model) legendInput() LegendInput { return m.gridView().Legend() }

// shortName cuts a long facility name to its first words.
func shortName(s string) string {
	const maxLen = 22
	if visibleWidth(s) <= maxLen {
		return s
	}
	words := strings.Fields(s)
	out := ""
	for _, w := range words {
		if visibleWidth(out)+len(w)+1 > maxLen-1 {
			break
		}
		if out != "" {
			out += " "
		}
		out += w
	}
	if out == "" {
		out = string([]rune(s)[:maxLen-1])
	}
	return out + "…"
}

// matrixInput describes the matrix for the renderer.
func (m Model) matrixInput() MatrixInput {
	if m.res.grid == nil {
		return MatrixInput{Layer: m.layer, AltTitle: "altitude " + m.units.AltUnit(), CursorRow: -1, CursorCol: -1}
	}
	return m.gridView().Matrix()
}

// pickerRows lists "best of all" and every facility.
func (m Model) pickerRows() []pickerRow {
	rows := []pickerRow{{
		name:    "best of all",
		info:    "per point the facility with the best class",
		full:    bestShare(m.res, envelope.FullMatch),
		matched: m.res.union,
	}}
	for k, f := range m.facs {
		r := pickerRow{name: fmt.Sprintf("%c %s", facilityTag(k), f.Name), info: f.Class + ", " + f.Medium.String()}
		if k < len(m.res.full) {
			r.full, r.matched = m.res.full[k], m.res.matched[k]
		}
		if k < len(m.res.errs) && m.res.errs[k] != nil {
			r.err = m.res.errs[k].Error()
		}
		if k < len(m.res.maps) && m.res.maps[k] != nil {
			r.info += ", scale " + sig(m.res.maps[k].Scale, 3) + " (" + m.res.maps[k].ScaleRule + ")"
		}
		rows = append(rows, r)
	}
	return rows
}

// bestShare is the share of inside points whose best class is c.
func bestShare(r results, c envelope.Class) float64 {
	var n, inside int
	for _, res := range r.bestRes {
		if res.Class == envelope.Outside {
			continue
		}
		inside++
		if res.Class == c {
			n++
		}
	}
	if inside == 0 {
		return 0
	}
	return float64(n) / float64(inside)
}

// change is one what-if value that differs from the files.
type change struct{ label, now, file string }

// changes lists every what-if value that differs from the files.
func (m Model) changes() []change {
	u := m.units
	var out []change
	s, f := m.set, m.fileSet
	if s.Scale != f.Scale {
		out = append(out, change{"model scale", scaleText(s.Scale), scaleText(f.Scale)})
	}
	if s.DeltaT != f.DeltaT {
		out = append(out, change{"ΔT", u.DeltaT(s.DeltaT), u.DeltaT(f.DeltaT)})
	}
	if s.MachTol != f.MachTol {
		out = append(out, change{"Mach tol", sig(s.MachTol, 3), sig(f.MachTol, 3)})
	}
	if s.ReTol != f.ReTol {
		out = append(out, change{"Re tol", sig(s.ReTol*100, 3) + " %", sig(f.ReTol*100, 3) + " %"})
	}
	if s.CompressibilityMach != f.CompressibilityMach || s.Regimes != f.Regimes {
		out = append(out, change{"compressibility M", sig(s.CompressibilityMach, 3), sig(f.CompressibilityMach, 3)})
	}
	for k := range m.facs {
		if k >= len(m.fileFacs) {
			break
		}
		now, file := m.facs[k], m.fileFacs[k]
		name := shortName(now.Name) + " "
		water := !now.Medium.IsGas()
		pfmt := u.Stagnation
		if water {
			pfmt = u.Pressure
		}
		if now.PressureMax() != file.PressureMax() {
			out = append(out, change{name + fieldP0Max.label(water), pfmt(now.PressureMax()), pfmt(file.PressureMax())})
		}
		if now.TemperatureMin() != file.TemperatureMin() {
			out = append(out, change{name + fieldT0Min.label(water), u.Temp(now.TemperatureMin()), u.Temp(file.TemperatureMin())})
		}
		if now.QMax != file.QMax {
			out = append(out, change{name + fieldQMax.label(water), qText(u, now.QMax), qText(u, file.QMax)})
		}
	}
	return out
}

func scaleText(s float64) string {
	if s > 0 {
		return sig(s, 4)
	}
	return "facility sizing"
}

func qText(u Units, q float64) string {
	if q > 0 {
		return u.Q(q)
	}
	return "none"
}

// editorTitle names what the facility fields apply to.
func (m Model) editorTitle() string {
	if m.fac >= 0 && m.fac < len(m.facs) {
		return "facility: " + shortName(m.facs[m.fac].Name)
	}
	return "facility limits: choose a facility"
}

// editorRows describes every what-if field in the current units.
func (m Model) editorRows() []editorRow {
	u := m.units
	s, f := m.set, m.fileSet
	rows := make([]editorRow, fieldCount)
	rows[fieldScale] = editorRow{value: scaleText(s.Scale), file: scaleText(f.Scale), changed: s.Scale != f.Scale}
	rows[fieldDeltaT] = editorRow{value: u.DeltaT(s.DeltaT), file: u.DeltaT(f.DeltaT), changed: s.DeltaT != f.DeltaT}
	rows[fieldMachTol] = editorRow{value: sig(s.MachTol, 3), file: sig(f.MachTol, 3), changed: s.MachTol != f.MachTol}
	rows[fieldReTol] = editorRow{value: sig(s.ReTol*100, 3) + " %", file: sig(f.ReTol*100, 3) + " %", changed: s.ReTol != f.ReTol}
	rows[fieldCompMach] = editorRow{value: sig(s.CompressibilityMach, 3), file: sig(f.CompressibilityMach, 3),
		changed: s.CompressibilityMach != f.CompressibilityMach}
	water := false
	if m.fac >= 0 && m.fac < len(m.facs) {
		now, file := m.facs[m.fac], m.fileFacs[m.fac]
		water = !now.Medium.IsGas()
		pfmt := u.Stagnation
		if water {
			pfmt = u.Pressure
		}
		rows[fieldP0Max] = editorRow{value: pfmt(now.PressureMax()), file: pfmt(file.PressureMax()), changed: now.PressureMax() != file.PressureMax()}
		rows[fieldT0Min] = editorRow{value: u.Temp(now.TemperatureMin()), file: u.Temp(file.TemperatureMin()), changed: now.TemperatureMin() != file.TemperatureMin()}
		rows[fieldQMax] = editorRow{value: qText(u, now.QMax), file: qText(u, file.QMax), changed: now.QMax != file.QMax}
	}
	for k := range rows {
		rows[k].label = field(k).label(water)
		rows[k].enabled = !field(k).facilityField() || m.fac >= 0
		if !rows[k].enabled {
			rows[k].note = "choose a facility"
		}
	}
	return rows
}
