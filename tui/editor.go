package tui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
)

// field is one what-if value.
type field int

const (
	fieldScale field = iota
	fieldDeltaT
	fieldMachTol
	fieldReTol
	fieldCompMach
	fieldP0Max
	fieldT0Min
	fieldQMax

	fieldCount
)

// facilityField reports whether the field belongs to the chosen facility.
func (f field) facilityField() bool { return f >= fieldP0Max }

// label names the field; water facilities bound static pressure and water
// temperature instead of p0 and T0.
func (f field) label(water bool) string {
	switch f {
	case fieldScale:
		return "model scale"
	case fieldDeltaT:
		return "ΔT of day"
	case fieldMachTol:
		return "Mach tolerance"
	case fieldReTol:
		return "Re tolerance"
	case fieldCompMach:
		return "compressibility M"
	case fieldP0Max:
		if water {
			return "max static p"
		}
		return "p0 max"
	case fieldT0Min:
		if water {
			return "min water T"
		}
		return "T0 min"
	case fieldQMax:
		return "q max"
	}
	return "?"
}

// dimension is the atmos dimension the field is parsed in.
func (f field) dimension() atmos.Dimension {
	switch f {
	case fieldDeltaT:
		return atmos.TemperatureDelta
	case fieldP0Max, fieldQMax:
		return atmos.Pressure
	case fieldT0Min:
		return atmos.Temperature
	}
	return atmos.Dimensionless
}

// bareUnit is the unit assumed when a number is typed without one, in the
// current unit system ("" for dimensionless fields).
func (f field) bareUnit(u Units) string {
	switch f {
	case fieldDeltaT:
		if u == Customary {
			return "degF"
		}
		return "K"
	case fieldP0Max:
		if u == Customary {
			return "psi"
		}
		return "kPa"
	case fieldQMax:
		if u == Customary {
			return "psf"
		}
		return "kPa"
	case fieldT0Min:
		if u == Customary {
			return "degF"
		}
		return "K"
	}
	return ""
}

// parseField reads the text typed for field f. A bare number takes the
// field's unit in the current unit system. For the scale, "fit" (or 0)
// means the facilities' own sizing; for q max, "none" (or 0) means no
// limit. Both return 0 then.
func parseField(f field, text string, u Units) (float64, error) {
	t := strings.TrimSpace(text)
	if t == "" {
		return 0, fmt.Errorf("%s: empty value", f.label(false))
	}
	lower := strings.ToLower(t)
	switch {
	case f == fieldScale && (lower == "fit" || lower == "file" || lower == "files"):
		return 0, nil
	case f == fieldQMax && (lower == "none" || lower == "off"):
		return 0, nil
	}
	if f == fieldReTol && strings.HasSuffix(t, "%") {
		v, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimSuffix(t, "%")), 64)
		if err != nil {
			return 0, fmt.Errorf("%s: %q is not a percentage", f.label(false), t)
		}
		return checkField(f, v/100)
	}
	d := f.dimension()
	if d != atmos.Dimensionless {
		if _, err := strconv.ParseFloat(t, 64); err == nil {
			t += " " + f.bareUnit(u)
		}
	}
	v, err := atmos.ParseQuantity(t, d)
	if err != nil {
		return 0, fmt.Errorf("%s: %w", f.label(false), err)
	}
	return checkField(f, v)
}

// checkField refuses values no facility or tolerance can take.
func checkField(f field, v float64) (float64, error) {
	bad := func(want string) (float64, error) {
		return 0, fmt.Errorf("%s: %s is out of range, expected %s", f.label(false), strconv.FormatFloat(v, 'g', 6, 64), want)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return bad("a finite number")
	}
	switch f {
	case fieldScale:
		if v < 0 || v > 10 {
			return bad("0 (fit) or a scale up to 10")
		}
	case fieldDeltaT:
		if math.Abs(v) > 100 {
			return bad("an offset within ±100 K")
		}
	case fieldMachTol:
		if v <= 0 || v >= 1 {
			return bad("0 < tolerance < 1")
		}
	case fieldReTol:
		if v < 0 || v >= 1 {
			return bad("0 ≤ tolerance < 1 (or a percentage)")
		}
	case fieldCompMach:
		if v <= 0 || v >= 1 {
			return bad("a Mach number between 0 and 1")
		}
	case fieldP0Max:
		if v <= 0 {
			return bad("a positive pressure")
		}
	case fieldT0Min:
		if v <= 0 {
			return bad("a temperature above absolute zero")
		}
	case fieldQMax:
		if v < 0 {
			return bad("0 (no limit) or a positive pressure")
		}
	}
	return v, nil
}

// editorRow is one line of the what-if list as the root describes it.
type editorRow struct {
	label   string
	value   string // current value, display units
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
	input   lineInput
	err     string
	lineW   int
}

func newEditor(f frame) editor {
	return editor{frame: f, input: lineInput{limit: 40}}
}

// SetLineWidth sets the width of the input line (the whole screen).
func (e *editor) SetLineWidth(w int) { e.lineW = max(w, 0) }

// begin opens the input line for the selected field, pre-filled.
func (e *editor) begin(prompt, value string) {
	e.editing = true
	e.err = ""
	e.input.prompt = prompt + " > "
	e.input.set(value)
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
	return e.input.view(e.st, e.lineW)
}
