package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/x/ansi"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
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

// Layout limits.
const (
	// minMatrixRows is the fewest altitude rows the matrix keeps below
	// the details panel when space is short.
	minMatrixRows = 3
	// maxSideWidth caps the side panel of the wide layout for reading.
	maxSideWidth = 100
	minSideWidth = 42
	// studyMatrixWidth is the width the matrix keeps beside the study.
	studyMatrixWidth = 40
)

// relayout sizes every component for the current terminal and state. It
// runs at the end of every Update, so View only draws.
func (m *Model) relayout() {
	W, H := m.fr.width, m.fr.height
	m.tooSmall = W < MinWidth || H < MinHeight
	m.help.SetSize(W, 1)
	m.editor.SetLineWidth(W)
	m.syncPanels()
	if m.tooSmall {
		return
	}
	m.headerH = lineCount(m.headerText())
	m.footerH = max(lineCount(m.footer()), 1)
	m.legend.SetSize(W, H)
	m.legendH = lineCount(m.legend.View(m.legendInput()))
	m.bodyH = max(H-m.headerH-m.legendH-m.footerH, 1)
	m.wide = W >= WideWidth
	if m.mode == modeHelp {
		m.help.SetSize(W, H-m.headerH-m.footerH)
		return
	}
	if m.wide {
		need, _ := MatrixSize(m.matrixInput())
		m.sideW = min(max(W-need-len(sideGap), minSideWidth), maxSideWidth)
		if m.mode == modeStudy {
			// The study's table takes the width its marks need as
			// words; the matrix scrolls in what is left.
			m.sideW = max(m.sideW, min(m.study.PreferredWidth(), W-studyMatrixWidth, maxSideWidth))
		}
		matW := W - m.sideW - len(sideGap)
		m.matrix.SetSize(matW, m.bodyH)
		m.refreshDetails(m.sideW)
		m.setPanelSize(m.sideW, m.bodyH)
		m.lowerH = 0
	} else {
		m.refreshDetails(W)
		pref := m.lowerPreferred(W)
		avail := m.bodyH - minMatrixHeight
		m.lowerH = min(pref, max(avail, 1))
		m.matrix.SetSize(W, m.bodyH-m.lowerH)
		m.setPanelSize(W, m.lowerH)
	}
	m.legend.SetSize(m.fr.width, m.legendH)
	in := m.matrixInput()
	m.scrollR, m.scrollC = FitScroll(in, m.matrix.width, m.matrix.height)
	m.visRows, m.visCols = MatrixCapacity(in, m.matrix.width, m.matrix.height)
}

// setPanelSize gives the panels beside or below the matrix their area.
func (m *Model) setPanelSize(w, h int) {
	m.details.SetSize(w, h)
	m.picker.SetSize(w, h)
	m.editor.SetSize(w, h)
	m.saveAs.SetSize(w, h)
	m.study.SetSize(w, h)
}

// syncPanels gives the open panel what it shows: the picker its rows,
// the editor its rows, the facility its limits are for and the reader of
// typed values. It runs before a key reaches the panel and in every
// relayout, so that a panel's Update and View read only its own state.
func (m *Model) syncPanels() {
	switch m.mode {
	case modePicker:
		m.picker.SetRows(m.pickerRows(), m.fac+1)
	case modeEdit:
		name := ""
		if m.fac >= 0 && m.fac < len(m.facs) {
			name = m.facs[m.fac].Name
		}
		m.editor.SetFields(m.editorRows(), m.fac, name, m.fieldReader())
	case modeStudy:
		m.syncStudy()
	}
}

// sideGap separates the matrix from the side panel in the wide layout.
const sideGap = "  "

// lowerPreferred is the height the panel below the matrix wants in the
// narrow layout.
func (m *Model) lowerPreferred(w int) int {
	switch m.mode {
	case modePicker:
		return m.picker.PreferredHeight(w)
	case modeEdit:
		return m.editor.PreferredHeight(w)
	case modeSaveAs:
		return m.saveAs.PreferredHeight(w)
	case modeStudy:
		return m.study.PreferredHeight(w)
	}
	// The matching set takes only rows the matrix does not need.
	base, all := m.details.PreferredHeight(w, false), m.details.PreferredHeight(w, true)
	_, need := MatrixSize(m.matrixInput())
	return min(all, max(m.bodyH-need, base))
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
		parts = append(parts, box(m.help.Overlay(), W, H-m.headerH-m.footerH))
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
		panel = m.picker.View()
	case modeEdit:
		panel = m.editor.View()
	case modeSaveAs:
		panel = m.saveAs.View()
	case modeStudy:
		panel = m.study.View()
	default:
		panel = m.details.View()
	}
	if m.wide {
		return joinColumns(mat, box(panel, m.sideW, m.bodyH), sideGap)
	}
	if m.lowerH <= 0 {
		return mat
	}
	return mat + "\n" + box(panel, m.fr.width, m.lowerH)
}

// headerText is the title, wrapped between its parts where the screen is
// narrow, and, when what-if values differ from the files, up to three lines
// listing them.
func (m Model) headerText() string {
	W := m.fr.width
	st := m.fr.st
	fac := "best of all"
	if m.fac >= 0 && m.fac < len(m.facs) {
		fac = fmt.Sprintf("%c %s (%d/%d)", facilityTag(m.fac), m.facs[m.fac].Name, m.fac+1, len(m.facs))
	} else if len(m.facs) == 0 {
		fac = "no facilities"
	}
	veh := "no vehicle"
	if m.vehicle != nil {
		veh = m.vehicle.Name
	}
	parts := []string{st.Title.Render("likewind")}
	if m.readOnly { // first, so that a narrow screen still shows it
		parts = append(parts, st.Error.Render("read-only session"))
	}
	parts = append(parts, fac, m.layer.String(), m.units.String())
	if m.busy && !m.showingEarly() {
		parts = append(parts, st.Changed.Render("computing"))
	}
	parts = append(parts, st.Faint.Render(veh))
	lines := []string{wrapItems(parts[0], parts[1:], st.Faint.Render(" | "), W)}
	if ch := m.changes(); len(ch) > 0 {
		lines = append(lines, m.changeLines(ch, W)...)
	}
	return strings.Join(lines, "\n")
}

// maxChangeLines is how many header lines the what-if list may take.
const maxChangeLines = 3

// changeLines lists the what-if changes in at most maxChangeLines lines:
// with full facility names where they fit, else with each facility's
// letter and the first words of its name, else a count that points to the
// editor.
func (m Model) changeLines(ch []change, W int) []string {
	st := m.fr.st
	var best []string
	for _, short := range []bool{true, false} {
		var items []string
		for _, c := range ch {
			label := c.label
			if c.fac >= 0 {
				name := m.facs[c.fac].Name
				if short {
					name = shortName(name)
				}
				label = fmt.Sprintf("%c %s %s", facilityTag(c.fac), name, c.label)
			}
			items = append(items, st.Changed.Render(label+" "+c.now)+st.Faint.Render(" ("+c.origin+")"))
		}
		// Full names where they take no more lines than short ones.
		wl := strings.Split(wrapItems(st.Changed.Render("what-if:"), items, "  ", W), "\n")
		if best == nil || len(wl) <= len(best) {
			best = wl
		}
	}
	if len(best) <= maxChangeLines {
		return best
	}
	return strings.Split(wrapText(st.Changed.Render("what-if:")+" "+
		st.Faint.Render(fmt.Sprintf("%d values differ from the files and defaults (e lists them)", len(ch))), W), "\n")
}

// footer is the bottom of the screen: a status message, the quit
// question or the input line, wrapped whole at word boundaries, or one
// line of key help.
func (m Model) footer() string {
	if m.rv != nil {
		return m.reviewLine() + "\n" + m.footerBody()
	}
	return m.footerBody()
}

// footerBody is the footer but the review line.
func (m Model) footerBody() string {
	k := m.fr.keys
	st := m.fr.st
	W := m.fr.width
	if m.status != "" && m.mode != modeConfirm && m.mode != modeSaveAs && !(m.mode == modeEdit && m.editor.Editing()) {
		style := st.Status
		if m.statusErr {
			style = st.Error
		}
		var out []string
		for _, l := range wrapLines(m.status, W, "  ") {
			out = append(out, style.Render(l))
		}
		return strings.Join(out, "\n")
	}
	switch m.mode {
	case modeConfirm:
		q := "Unsaved what-if changes or marks."
		switch {
		case m.store == nil:
			q = "Unsaved changes; no session file."
		case m.readOnly:
			q = "Unsaved changes; the session file is read-only here."
		}
		return wrapItems(st.Changed.Render(q), keyItems(st, confirmKeys{k: k, canSave: m.store != nil, readOnly: m.readOnly}.ShortHelp()), "  ", W)
	case modeSaveAs:
		return m.saveAs.Line(W)
	case modeHelp:
		return keyLine(st, []key.Binding{k.Help, k.Back, k.Quit}, W)
	case modePicker:
		return keyLine(st, m.picker.ShortHelp(), W)
	case modeStudy:
		return keyLine(st, m.study.ShortHelp(), W)
	case modeEdit:
		if m.editor.Editing() {
			return m.editor.Line()
		}
		return keyLine(st, m.editor.ShortHelp(), W)
	}
	return keyLine(st, k.ShortHelp(), W)
}

// keyItems renders bindings as "key description" items.
func keyItems(st *Styles, bs []key.Binding) []string {
	var out []string
	for _, b := range bs {
		if !b.Enabled() {
			continue
		}
		h := b.Help()
		out = append(out, st.HelpKey.Render(h.Key)+" "+st.HelpDesc.Render(h.Desc))
	}
	return out
}

// keyLine is one line of key help within w cells. Keys are shown whole:
// when not all fit, the last binding (quit or back) is kept, the ones
// before it are dropped from the end, and "…" says so (the help screen
// lists every key).
func keyLine(st *Styles, bs []key.Binding, w int) string {
	items := keyItems(st, bs)
	const sep = "  "
	width := func(it []string) int {
		n := 0
		for k, s := range it {
			if k > 0 {
				n += len(sep)
			}
			n += visibleWidth(s)
		}
		return n
	}
	if width(items) <= w || len(items) < 2 {
		return clip(strings.Join(items, sep), w, 1)
	}
	last := items[len(items)-1]
	more := st.HelpSep.Render("…")
	keep := items[:len(items)-1]
	for len(keep) > 0 && width(append(append([]string(nil), keep...), more, last)) > w {
		keep = keep[:len(keep)-1]
	}
	return clip(strings.Join(append(append(keep[:len(keep):len(keep)], more), last), sep), w, 1)
}

// gridView is the model's current way of looking at the results.
func (m Model) gridView() GridView {
	r := m.shown()
	v := GridView{
		Grid:       r.grid,
		Maps:       r.maps,
		Facilities: m.facs,
		Facility:   m.fac,
		Best:       r.best,
		Layer:      m.layer,
		Units:      m.units,
		ReTol:      m.set.ReTol,
		Marks:      m.marks,
		CursorRow:  m.curI,
		CursorCol:  m.curJ,
		ScrollRow:  m.scrollR,
		ScrollCol:  m.scrollC,
	}
	if r != &m.res {
		v.Partial, v.Ready = true, m.earlyWin
	}
	return v
}

// legendInput describes the legend of the current view.
//
// Where the screen has room (the wide layout, 40 lines or more), facility
// letters are explained with whole names.
func (m Model) legendInput() LegendInput {
	v := m.gridView()
	v.FullNames = m.fr.width >= WideWidth && m.fr.height >= 40
	return v.Legend()
}

// shortName shortens a long facility name to its first words, for places
// where it stands beside the facility's letter, which names it uniquely.
func shortName(s string) string { return fitWords(s, 22) }

// fitWords shortens s to at most n cells by keeping its first whole words
// and adding "…"; s is returned as it is when it fits.
func fitWords(s string, n int) string {
	if visibleWidth(s) <= n {
		return s
	}
	out := ""
	for _, w := range strings.Fields(s) {
		next := w
		if out != "" {
			next = out + " " + w
		}
		if visibleWidth(next) > n-1 {
			break
		}
		out = next
	}
	if out == "" {
		return ansi.Truncate(s, max(n, 1), "…")
	}
	return out + "…"
}

// facilityLabel is facility k's letter and name within n cells: the whole
// name where it fits, else its first words (the letter still names it).
func (m Model) facilityLabel(k, n int) string { return facilityLabel(k, m.facs[k].Name, n) }

// facilityLabel is the letter of facility k and its name within n cells.
func facilityLabel(k int, name string, n int) string {
	tag := string(facilityTag(k)) + " "
	return tag + fitWords(name, max(n-len(tag), 8))
}

// matrixInput describes the matrix for the renderer.
func (m Model) matrixInput() MatrixInput {
	if m.shown().grid == nil {
		return MatrixInput{Layer: m.layer, AltTitle: "altitude " + m.units.AltUnit(), CursorRow: -1, CursorCol: -1}
	}
	return m.gridView().Matrix()
}

// pickerRows lists "best of all" and every facility.
func (m Model) pickerRows() []pickerRow {
	rows := []pickerRow{{
		name:    "best of all",
		info:    "per point the facility with the best class",
		full:    m.res.bestFull,
		matched: m.res.union,
		pending: m.busy,
	}}
	for k, f := range m.facs {
		r := pickerRow{name: fmt.Sprintf("%c %s", facilityTag(k), f.Name), info: f.Class + ", " + f.Medium.String(), pending: m.busy}
		if k < len(m.res.full) {
			r.full, r.matched = m.res.full[k], m.res.matched[k]
		}
		if k < len(m.res.errs) && m.res.errs[k] != nil {
			r.err = m.res.errs[k].Error()
		}
		if k < len(m.res.maps) && m.res.maps[k] != nil {
			r.info += ", scale " + units.Sig(m.res.maps[k].Scale, 3) + " (" + m.res.maps[k].ScaleRule + ")"
		}
		rows = append(rows, r)
	}
	return rows
}

// change is one what-if value that differs from the files: its label, the
// value now, and where the starting value came from with that value
// ("vehicle file +0.0 K", "built-in 0.0100"). fac is the facility of a
// facility limit, -1 for the others.
type change struct {
	label, now, origin string
	fac                int
}

// changes lists every what-if value that differs from the files, each
// with where its starting value came from: the settings, then each
// facility's limits.
func (m Model) changes() []change {
	u := m.units
	var out []change
	for f := range whatif.FieldCount {
		if f.Facility() {
			continue
		}
		now, file := f.Get(&m.set, nil), f.Get(&m.fileSet, nil)
		if now != file {
			out = append(out, change{label: f.HeaderLabel(false), now: f.Show(u, now, false),
				origin: m.originText(f, -1) + " " + f.Show(u, file, false), fac: -1})
		}
	}
	for k := range min(len(m.facs), len(m.fileFacs)) {
		water := whatif.IsWater(&m.facs[k])
		for f := range whatif.FieldCount {
			if !f.Facility() || !f.Applies(&m.facs[k]) {
				continue
			}
			now, file := f.Get(nil, &m.facs[k]), f.Get(nil, &m.fileFacs[k])
			if now != file {
				out = append(out, change{label: f.HeaderLabel(water), now: f.Show(u, now, water),
					origin: m.fileValueText(f, k, water), fac: k})
			}
		}
	}
	return out
}

// fileValueText says where facility k's starting value of field f comes
// from and what it is there ("demo facility 450.0 kPa"); for the value of
// a rule the file does not choose, that it holds none ("demo facility: no
// fixed T0").
func (m Model) fileValueText(f whatif.Field, k int, water bool) string {
	file := &m.fileFacs[k]
	if !f.Applies(file) {
		return m.originText(f, k) + ": no " + f.Label(water)
	}
	return m.originText(f, k) + " " + f.Show(m.units, f.Get(nil, file), water)
}

// originText says where the starting value of field f comes from (fac:
// the facility of a limit).
func (m Model) originText(f whatif.Field, fac int) string {
	switch f.Origin() {
	case whatif.FromVehicle:
		return m.vehicleOrigin()
	case whatif.FromFacility:
		return facilityOrigin(m.fileFacs[fac])
	}
	return m.settingsOrigin()
}

// settingsOrigin says where the starting scale override and tolerances
// come from: the built-in defaults, unless the caller gave them.
func (m Model) settingsOrigin() string {
	if m.setGiven {
		return "given"
	}
	return "built-in"
}

// vehicleOrigin says where the vehicle's values (its design-day ΔT) come
// from.
func (m Model) vehicleOrigin() string {
	if m.vehicle != nil && m.vehicle.Source == "" {
		return "demo vehicle"
	}
	return "vehicle file"
}

// facilityOrigin says where a facility's limits come from.
func facilityOrigin(f envelope.Facility) string {
	if f.Source == "" {
		return "demo facility"
	}
	return "facility file"
}

// editorRows describes every what-if field in the current units: the
// settings, then the chosen facility's fields (the value a fixed rule
// holds only while that rule is chosen).
func (m Model) editorRows() []editorRow {
	u := m.units
	rows := make([]editorRow, 0, whatif.FieldCount)
	var now, file *envelope.Facility
	if m.fac >= 0 && m.fac < len(m.facs) {
		now, file = &m.facs[m.fac], &m.fileFacs[m.fac]
	}
	water := whatif.IsWater(now)
	for f := range whatif.FieldCount {
		if !f.Applies(now) {
			continue
		}
		r := editorRow{field: f, label: f.Label(water), enabled: !f.Facility() || now != nil}
		if !r.enabled {
			r.note = "choose a facility"
			rows = append(rows, r)
			continue
		}
		v := f.Get(&m.set, now)
		r.value, r.start = f.Show(u, v, water), f.EditText(u, f.StartValue(&m.set, now), water)
		if f.Facility() {
			r.changed = v != f.Get(nil, file) || !f.Applies(file)
			r.origin = m.fileValueText(f, m.fac, water)
		} else {
			was := f.Get(&m.fileSet, nil)
			r.changed = v != was
			r.origin = m.originText(f, m.fac) + " " + f.Show(u, was, water)
		}
		rows = append(rows, r)
	}
	return rows
}
