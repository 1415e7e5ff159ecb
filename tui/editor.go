package tui

import (
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// editorRow is one line of the what-if list as the root describes it.
type editorRow struct {
	field   whatif.Field
	label   string
	value   string // current value, display units
	start   string // the text the input line starts with
	origin  string // where the starting value comes from, and that value ("facility file 450.0 kPa", "built-in 0.0100")
	changed bool
	enabled bool
	note    string // why disabled
}

// editor is the what-if panel: the list of fields and, for the one
// chosen, an input line, or for a choice field (the operating rule) the
// list of its choices. enter on a field opens the line with its value;
// enter on the line reads it with the field's parser (fieldReader) and
// reports the value (fieldAppliedMsg), or shows why it is refused and
// keeps the line open. A choice that holds a value (a fixed rule) opens
// the line for that value next, and both are reported together. The root
// gives it the rows, the facility the limits are for and the reader
// (SetFields).
type editor struct {
	frame
	rows    []editorRow
	fac     int    // facility the limits are for (-1: none)
	facName string // its name
	reader  fieldReader
	sel     int
	editing bool
	input   inputLine
	// The choice list of a choice field (choosing), the choice under
	// its pointer, and the choice the open input line's value goes with
	// (pending: nil when the line is for its field alone).
	choosing  bool
	choices   []whatif.Choice
	choiceSel int
	pending   []whatif.Edit
	lineField whatif.Field // the field the input line is for
	err       string
	lineW     int
}

// fieldReader reads the text typed for a field as the editor applies it:
// in the current units, for the chosen facility, then checked against the
// other settings and the facility's operating rule. It holds copies of
// what it needs, so it stays valid as the model is copied.
type fieldReader struct {
	units units.System
	fac   *envelope.Facility // the chosen facility, nil for none (its slice is never changed in place)
	set   envelope.Settings
}

// read parses text for field f and checks it with the edits it goes with
// (pending: a fixed rule the value is for), returning every edit to apply.
func (r fieldReader) read(f whatif.Field, text string, pending ...whatif.Edit) ([]whatif.Edit, error) {
	v, err := f.Parse(text, r.units, r.fac)
	if err != nil {
		return nil, err
	}
	edits := append(append([]whatif.Edit(nil), pending...), whatif.Edit{Field: f, Value: v})
	if err := whatif.CheckEdits(r.set, r.fac, edits...); err != nil {
		return nil, err
	}
	return edits, nil
}

func newEditor(f frame) editor {
	return editor{frame: f}
}

// Open shows the list with no message.
func (e *editor) Open() { e.err = "" }

// SetFields sets the rows, the facility the limits are for (fac -1:
// none) with its name, and the reader of typed values.
func (e *editor) SetFields(rows []editorRow, fac int, name string, r fieldReader) {
	e.rows, e.fac, e.facName, e.reader = rows, fac, name, r
	e.sel = min(e.sel, max(len(rows)-1, 0))
}

// title names what the facility fields apply to: the facility's letter and
// name, the name shortened to its first words where the panel is narrow
// (the letter still names it uniquely).
func (e editor) title() string {
	if e.fac >= 0 {
		return "facility " + facilityLabel(e.fac, e.facName, e.width-len("WHAT-IF facility "))
	}
	return "facility limits: choose a facility"
}

// SetLineWidth sets the width of the input line (the whole screen).
func (e *editor) SetLineWidth(w int) { e.lineW = max(w, 0) }

// field is the field under the pointer.
func (e editor) field() whatif.Field {
	if e.sel < len(e.rows) {
		return e.rows[e.sel].field
	}
	return whatif.Field(e.sel)
}

// begin opens the input line for the field under the pointer, holding
// text, with the field's parser as its Validate hook.
func (e *editor) begin(text string) { e.beginFor(e.field(), text) }

// beginFor opens the input line for field f, holding text, with the
// field's parser (and the pending choice's check) as its Validate hook.
func (e *editor) beginFor(f whatif.Field, text string, pending ...whatif.Edit) {
	r := e.reader
	e.editing, e.choosing = true, false
	e.lineField, e.pending = f, pending
	e.err = ""
	e.input = newInputLine(e.keys, f.Label(whatif.IsWater(r.fac))+" > ", text, whatif.MaxEntry, func(s string) error {
		_, err := r.read(f, s, pending...)
		return err
	})
}

// choose opens the choice list of the choice field under the pointer,
// with its pointer on the value held.
func (e *editor) choose() {
	f := e.field()
	e.choices = f.Choices(e.reader.fac)
	e.choosing, e.choiceSel, e.err = true, 0, ""
	held := f.Get(&e.reader.set, e.reader.fac)
	for k, c := range e.choices {
		if c.Value == held {
			e.choiceSel = k
		}
	}
}

// pick takes the choice under the pointer: checked, then reported, or
// where it holds a value (a fixed rule's temperature or q) the input line
// for that value opens, starting from the value held or a value in range.
func (e editor) pick() (editor, tea.Cmd) {
	f, c, r := e.field(), e.choices[e.choiceSel], e.reader
	if _, err := f.Parse(c.Word, r.units, r.fac); err != nil {
		e.err = err.Error()
		return e, nil
	}
	choice := whatif.Edit{Field: f, Value: c.Value}
	if vf, ok := f.Needs(c.Value); ok {
		water := whatif.IsWater(r.fac)
		text := ""
		if v := vf.StartValue(&r.set, r.fac); v > 0 {
			text = vf.EditText(r.units, v, water)
		}
		e.beginFor(vf, text, choice)
		return e, nil
	}
	if err := whatif.CheckEdits(r.set, r.fac, choice); err != nil {
		e.err = err.Error()
		return e, nil
	}
	e.choosing, e.err = false, ""
	return e, report(fieldAppliedMsg{edits: []whatif.Edit{choice}})
}

// Editing reports whether the input line is open.
func (e editor) Editing() bool { return e.editing }

// end closes the input line.
func (e *editor) end() { e.editing = false }

// Update takes a key: on the list it moves, opens the line or the choice
// list, or passes R, U, ? and q on to the root; on the choice list it
// moves, picks (enter) or closes it (esc); on the line it edits, applies
// (enter) or closes it (esc).
func (e editor) Update(msg tea.Msg) (editor, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return e, nil
	}
	keys := e.keys
	if e.editing {
		switch {
		case key.Matches(k, keys.Select):
			edits, err := e.reader.read(e.lineField, e.input.Value(), e.pending...)
			if err != nil {
				e.err = err.Error()
				return e, nil
			}
			e.end()
			e.err = ""
			return e, report(fieldAppliedMsg{edits: edits})
		case key.Matches(k, keys.Back):
			e.end()
			e.err = ""
		case key.Matches(k, keys.Interrupt):
			e.end()
			return e, report(quitWantedMsg{})
		default:
			e.input, _ = e.input.Update(k)
			if r := e.input.Refused(); r != "" {
				e.err = e.lineField.Label(whatif.IsWater(e.reader.fac)) + ": " + r
			}
		}
		return e, nil
	}
	if e.choosing {
		n := max(len(e.choices), 1)
		switch {
		case key.Matches(k, keys.Prev):
			e.choiceSel, e.err = (e.choiceSel-1+n)%n, ""
		case key.Matches(k, keys.Next):
			e.choiceSel, e.err = (e.choiceSel+1)%n, ""
		case key.Matches(k, keys.Select) && len(e.choices) > 0:
			return e.pick()
		case key.Matches(k, keys.Back):
			e.choosing, e.err = false, ""
		case key.Matches(k, keys.Interrupt):
			e.choosing = false
			return e, report(quitWantedMsg{})
		}
		return e, nil
	}
	if sel, cmd, ok := listKey(k, keys, keys.Edit, e.sel, len(e.rows)); ok {
		if sel != e.sel {
			e.sel, e.err = sel, ""
		}
		return e, cmd
	}
	switch {
	case key.Matches(k, keys.Select):
		if e.sel >= len(e.rows) || !e.rows[e.sel].enabled {
			e.err = "choose a facility first (f or [ ])"
			return e, nil
		}
		if e.field().IsChoice() {
			e.choose()
			return e, nil
		}
		e.begin(e.rows[e.sel].start)
	case key.Matches(k, keys.Restore):
		return e, report(restoreWantedMsg{})
	case key.Matches(k, keys.Undo):
		return e, report(undoWantedMsg{})
	}
	return e, nil
}

// ShortHelp is the key line of the list (the line itself shows instead of
// keys while editing).
func (e editor) ShortHelp() []key.Binding {
	k := e.keys
	switch {
	case e.editing:
		return []key.Binding{k.Select, k.Back, k.Interrupt}
	case e.choosing:
		return []key.Binding{k.Prev, k.Next, k.Select, k.Back}
	}
	return []key.Binding{k.Prev, k.Next, k.Select, k.Restore, k.Undo, k.Back}
}

// FullHelp lists the same keys.
func (e editor) FullHelp() [][]key.Binding { return [][]key.Binding{e.ShortHelp()} }

// PreferredHeight is how many lines the panel takes at width w.
func (e editor) PreferredHeight(w int) int {
	e.width = w
	return lineCount(e.body())
}

// View draws the list of fields.
func (e editor) View() string { return e.fit(e.body()) }

// body is the panel's text at its width: the title, each row (its origin
// on lines of its own where it does not fit beside the value: wrapped,
// never cut), the choice list under its row, and a refusal wrapped whole.
func (e editor) body() string {
	rows := e.rows
	var b strings.Builder
	b.WriteString(e.st.Section.Render("WHAT-IF") + " " + e.st.Faint.Render(e.title()))
	lw := 0
	for _, r := range rows {
		lw = max(lw, visibleWidth(r.label))
	}
	indent := strings.Repeat(" ", min(3+lw+2, max(e.width-12, 0)))
	for k, r := range rows {
		if e.choosing && k != e.sel {
			continue // the list of choices shows with its row alone
		}
		pointer, mark := " ", " "
		if k == e.sel {
			pointer = ">"
		}
		if r.changed {
			mark = "*"
		}
		text := pointer + mark + " " + padRight(r.label, lw) + "  "
		if r.enabled {
			text += r.value
		} else {
			text += r.note
		}
		style := e.st.Value
		switch {
		case k == e.sel:
			style = e.st.Selected
		case !r.enabled:
			style = e.st.Faint
		}
		origin := ""
		if r.changed && r.enabled {
			origin = "(" + r.origin + ")"
		}
		lines := wrapLines(text, e.width, indent)
		if n := len(lines); origin != "" && n > 0 && visibleWidth(lines[n-1])+2+visibleWidth(origin) <= e.width {
			lines[n-1] = style.Render(lines[n-1]) + e.st.Faint.Render("  "+origin)
			origin = ""
		} else if n > 0 {
			lines[n-1] = style.Render(lines[n-1])
		}
		for i := 0; i < len(lines)-1; i++ {
			lines[i] = style.Render(lines[i])
		}
		if origin != "" {
			for _, l := range wrapLines(origin, max(e.width-len(indent), 1), "") {
				lines = append(lines, indent+e.st.Faint.Render(l))
			}
		}
		for _, l := range lines {
			b.WriteString("\n" + l)
		}
		if k == e.sel && e.choosing {
			b.WriteString(e.choiceLines())
		}
	}
	if e.err != "" {
		// Wrapped whole: a refusal names what was found and expected.
		for _, l := range wrapLines(e.err, e.width, "") {
			b.WriteString("\n" + e.st.Error.Render(l))
		}
	}
	return b.String()
}

// choiceLines lists the choices of the open choice list, each with what
// it means (wrapped in a column of its own beside the word, or under it
// where the panel is narrow), the one under the pointer marked.
func (e editor) choiceLines() string {
	ww := 0
	for _, c := range e.choices {
		ww = max(ww, visibleWidth(c.Word))
	}
	const lead = "    "
	prefixW := len(lead) + 2 + ww + 2
	meansW := e.width - prefixW
	beside := meansW >= 20
	if !beside {
		prefixW, meansW = len(lead)+2, max(e.width-len(lead)-2, 1)
	}
	pad := strings.Repeat(" ", prefixW)
	var b strings.Builder
	for k, c := range e.choices {
		pointer := "  "
		if k == e.choiceSel {
			pointer = "> "
		}
		head := lead + pointer + padRight(c.Word, ww)
		if k == e.choiceSel {
			head = e.st.Selected.Render(head)
		}
		means := wrapLines(c.Means, meansW, "")
		if beside && len(means) > 0 {
			b.WriteString("\n" + head + "  " + means[0])
			means = means[1:]
		} else {
			b.WriteString("\n" + head)
		}
		for _, l := range means {
			b.WriteString("\n" + pad + e.st.Faint.Render(l))
		}
	}
	return b.String()
}

// Line draws the input line (only while editing).
func (e editor) Line() string {
	if !e.editing {
		return ""
	}
	return e.input.View(e.st, e.lineW)
}
