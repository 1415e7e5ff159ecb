package tui

import "strings"

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

// editor is the what-if panel: a list of fields and an input line.
type editor struct {
	frame
	sel     int
	editing bool
	input   inputLine
	err     string
	lineW   int
}

func newEditor(f frame) editor {
	return editor{frame: f}
}

// SetLineWidth sets the width of the input line (the whole screen).
func (e *editor) SetLineWidth(w int) { e.lineW = max(w, 0) }

// begin opens the input line for the selected field, pre-filled, with
// parse as its Validate hook.
func (e *editor) begin(prompt, value string, parse func(string) (float64, error)) {
	e.editing = true
	e.err = ""
	e.input = newInputLine(e.keys, prompt+" > ", value, maxEntry, func(s string) error {
		_, err := parse(s)
		return err
	})
}

// end closes the input line.
func (e *editor) end() { e.editing = false }

// View draws the list of fields.
func (e editor) View(rows []editorRow, title string) string {
	var b strings.Builder
	b.WriteString(e.st.Section.Render("WHAT-IF") + " " + e.st.Faint.Render(title))
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
		b.WriteString("\n" + e.st.Error.Render(e.err))
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
