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
	label   string
	value   string // current value, display units
	start   string // the text the input line starts with
	origin  string // where the starting value comes from, and that value ("facility file 450.0 kPa", "built-in 0.0100")
	changed bool
	enabled bool
	note    string // why disabled
}

// editor is the what-if panel: the list of fields and, for the one
// chosen, an input line. enter on a field opens the line with its value;
// enter on the line reads it with the field's parser (fieldReader) and
// reports the value (fieldAppliedMsg), or shows why it is refused and
// keeps the line open. The root gives it the rows, the facility the
// limits are for and the reader (SetFields).
type editor struct {
	frame
	rows    []editorRow
	fac     int    // facility the limits are for (-1: none)
	facName string // its name
	reader  fieldReader
	sel     int
	editing bool
	input   inputLine
	err     string
	lineW   int
}

// fieldReader reads the text typed for a field as the editor applies it:
// in the current units, for the chosen facility, then checked against the
// other settings. It holds copies of what it needs, so it stays valid as
// the model is copied.
type fieldReader struct {
	units units.System
	fac   *envelope.Facility // the chosen facility, nil for none (its slice is never changed in place)
	set   envelope.Settings
}

// read parses text for field f and checks it.
func (r fieldReader) read(f whatif.Field, text string) (float64, error) {
	v, err := f.Parse(text, r.units, r.fac)
	if err == nil {
		err = f.Validate(r.set, v)
	}
	return v, err
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
func (e editor) field() whatif.Field { return whatif.Field(e.sel) }

// begin opens the input line for the field under the pointer, holding
// text, with the field's parser as its Validate hook.
func (e *editor) begin(text string) {
	f, r := e.field(), e.reader
	e.editing = true
	e.err = ""
	e.input = newInputLine(e.keys, f.Label(whatif.IsWater(r.fac))+" > ", text, whatif.MaxEntry, func(s string) error {
		_, err := r.read(f, s)
		return err
	})
}

// Editing reports whether the input line is open.
func (e editor) Editing() bool { return e.editing }

// end closes the input line.
func (e *editor) end() { e.editing = false }

// Update takes a key: on the list it moves, opens the line or passes R, U,
// ? and q on to the root; on the line it edits, applies (enter) or
// closes it (esc).
func (e editor) Update(msg tea.Msg) (editor, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return e, nil
	}
	keys := e.keys
	if e.editing {
		switch {
		case key.Matches(k, keys.Select):
			v, err := e.reader.read(e.field(), e.input.Value())
			if err != nil {
				e.err = err.Error()
				return e, nil
			}
			e.end()
			e.err = ""
			return e, report(fieldAppliedMsg{field: e.field(), value: v})
		case key.Matches(k, keys.Back):
			e.end()
			e.err = ""
		case key.Matches(k, keys.Interrupt):
			e.end()
			return e, report(quitWantedMsg{})
		default:
			e.input, _ = e.input.Update(k)
			if r := e.input.Refused(); r != "" {
				e.err = e.field().Label(whatif.IsWater(e.reader.fac)) + ": " + r
			}
		}
		return e, nil
	}
	if sel, cmd, ok := listKey(k, keys, keys.Edit, e.sel, int(whatif.FieldCount)); ok {
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
	if e.editing {
		return []key.Binding{k.Select, k.Back, k.Interrupt}
	}
	return []key.Binding{k.Prev, k.Next, k.Select, k.Restore, k.Undo, k.Back}
}

// FullHelp lists the same keys.
func (e editor) FullHelp() [][]key.Binding { return [][]key.Binding{e.ShortHelp()} }

// PreferredHeight is how many lines the panel takes at width w.
func (e editor) PreferredHeight(w int) int {
	n := len(e.rows) + 1
	if e.err != "" {
		n += len(wrapLines(e.err, w, ""))
	}
	return n
}

// View draws the list of fields.
func (e editor) View() string {
	rows := e.rows
	var b strings.Builder
	b.WriteString(e.st.Section.Render("WHAT-IF") + " " + e.st.Faint.Render(e.title()))
	lw := 0
	for _, r := range rows {
		lw = max(lw, visibleWidth(r.label))
	}
	for k, r := range rows {
		b.WriteString("\n")
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
		switch {
		case k == e.sel:
			text = e.st.Selected.Render(text)
		case !r.enabled:
			text = e.st.Faint.Render(text)
		}
		b.WriteString(text)
		if r.changed && r.enabled {
			b.WriteString(e.st.Faint.Render("  (" + r.origin + ")"))
		}
	}
	if e.err != "" {
		// Wrapped whole: a refusal names what was found and expected.
		for _, l := range wrapLines(e.err, e.width, "") {
			b.WriteString("\n" + e.st.Error.Render(l))
		}
	}
	return e.fit(b.String())
}

// Line draws the input line (only while editing).
func (e editor) Line() string {
	if !e.editing {
		return ""
	}
	return e.input.View(e.st, e.lineW)
}
