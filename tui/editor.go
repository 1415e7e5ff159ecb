package tui

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"likewind/atmos"
	"likewind/envelope"
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

// maxEntry is the longest text the input line takes for a value, in
// characters: far beyond any value written out in full, yet a paste of a
// whole file is refused with a message rather than parsed.
const maxEntry = 1024

// parseField reads the text typed for field f, with the parsers and bounds
// the files and the command line use (envelope/bounds.go). A bare number
// takes the field's unit in the current unit system. The model scale
// takes the forms a file takes ("0.05", "1/20", "1:20", "5 %") or the word
// "fit" for each facility's own sizing; q max takes a pressure or the word
// "none". Both words return 0, as the settings store them; a typed 0 is
// refused, not read as either. The facility limits (p0 max, T0 min, q max)
// are checked against fac, the facility they are for, as its file's ranges
// are.
func parseField(f field, text string, u Units, fac *envelope.Facility) (float64, error) {
	water := fac != nil && fac.Medium == envelope.MediumWater
	fail := func(err error) (float64, error) { return 0, fmt.Errorf("%s: %w", f.label(water), err) }
	t := strings.TrimSpace(text)
	if t == "" {
		return fail(errors.New("empty value"))
	}
	if n := utf8.RuneCountInString(t); n > maxEntry {
		return fail(fmt.Errorf("the entry is %d characters long, expected at most %d", n, maxEntry))
	}
	lower := strings.ToLower(t)
	switch f {
	case fieldScale:
		if lower == "fit" {
			return 0, nil
		}
		v, err := envelope.ParseModelScale(t)
		if errors.Is(err, envelope.ErrOutOfBounds) {
			err = fmt.Errorf(`%w, or the word "fit" for each facility's own sizing`, err)
		}
		if err != nil {
			return fail(err)
		}
		return v, nil
	case fieldMachTol, fieldReTol, fieldCompMach:
		parse := map[field]func(string) (float64, error){
			fieldMachTol: envelope.ParseMachTol, fieldReTol: envelope.ParseReTol, fieldCompMach: envelope.ParseCompressibilityMach,
		}[f]
		v, err := parse(t)
		if err != nil {
			return fail(err)
		}
		return v, nil
	case fieldQMax:
		if lower == "none" {
			return 0, nil
		}
	}
	if f.facilityField() && fac == nil {
		return fail(errors.New("choose a facility first"))
	}
	if _, err := strconv.ParseFloat(t, 64); err == nil {
		t += " " + f.bareUnit(u)
	}
	if f == fieldDeltaT {
		v, err := envelope.ParseDeltaT(t)
		if err != nil {
			return fail(err)
		}
		return v, nil
	}
	v, err := atmos.ParseQuantity(t, f.dimension())
	if err != nil {
		return fail(err)
	}
	found := strconv.Quote(t)
	switch f {
	case fieldP0Max:
		v, err = envelope.CheckP0Max(fac, found, v)
	case fieldT0Min:
		v, err = envelope.CheckT0Min(fac, found, v)
	case fieldQMax:
		v, err = envelope.CheckQMax(found, v)
		if errors.Is(err, envelope.ErrOutOfBounds) {
			err = fmt.Errorf(`%w, or the word "none" for no limit`, err)
		}
	}
	if err != nil {
		return fail(err)
	}
	return v, nil
}

// checkField refuses a stored value (a session's, in SI) that the editor
// would refuse typed: the same bounds, with 0 meaning each facility's own
// sizing for the scale and no limit for q max, as the settings store them.
// fac is the facility a limit is for (nil for the other fields).
func checkField(f field, v float64, fac *envelope.Facility) (float64, error) {
	water := fac != nil && fac.Medium == envelope.MediumWater
	var err error
	found := strconv.FormatFloat(v, 'g', 6, 64)
	switch f {
	case fieldScale:
		if v != 0 {
			err = envelope.ModelScaleBound().Check(found, v)
		}
	case fieldDeltaT:
		err = envelope.DeltaTBound().Check(found+" K", v)
	case fieldMachTol:
		err = envelope.MachTolBound().Check(found, v)
	case fieldReTol:
		err = envelope.ReTolBound().Check(found, v)
	case fieldCompMach:
		err = envelope.CompressibilityMachBound().Check(found, v)
	default:
		if fac == nil {
			err = errors.New("no facility")
			break
		}
		switch f {
		case fieldP0Max:
			v, err = envelope.CheckP0Max(fac, "", v)
		case fieldT0Min:
			v, err = envelope.CheckT0Min(fac, "", v)
		case fieldQMax:
			v, err = envelope.CheckQMax("", v)
		}
	}
	if err != nil {
		return 0, fmt.Errorf("%s: %w", f.label(water), err)
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
	return editor{frame: f}
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
