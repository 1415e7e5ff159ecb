package tui

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/units"
)

// DumpInput is everything a text dump of one view shows: the evaluated
// grid and facilities, which facility, layer and units, the marks, and
// the facts the header states. Dump reads no clock and no environment;
// the date and version come in here.
type DumpInput struct {
	// Version is the tool version and Date the date (YYYY-MM-DD) the
	// header names.
	Version, Date string
	// Sources are the input file names; empty means the built-in demo.
	Sources []string

	Grid *envelope.Grid
	// Maps holds one map per facility, in the order of Facilities; nil
	// where the facility could not be evaluated.
	Maps       []*envelope.Map
	Facilities []envelope.Facility
	// Settings are the settings the maps were solved with.
	Settings envelope.Settings
	// Changed lists the what-if values that differ from the files, as
	// whatif.Apply names them.
	Changed []string

	// Facility is the facility shown, or -1 for the best of all.
	Facility int
	Layer    Layer
	Units    units.System
	// Marks are the marked test points.
	Marks []envelope.GridPoint
}

// Dump draws a view as text for reports: a header naming the tool version
// and date, the vehicle and its source, the facility with its model
// scale, the layer, the what-if settings, the units, the grid and the
// safety caution; then the whole matrix (RenderMatrix, no cursor) and the
// legend (RenderLegend), the same cells and glyphs the interface draws.
// With PlainStyles the text has no escape sequences. `likewind dump` and
// the interface's write key both call it, so they write the same bytes
// for the same view.
func Dump(in DumpInput, st Styles) (string, error) {
	in.Facilities = envelope.CleanFacilities(in.Facilities)
	g := in.Grid
	if g == nil || g.Rows() == 0 || g.Cols() == 0 {
		return "", errors.New("dump: no evaluated grid")
	}
	if in.Facility >= len(in.Facilities) || in.Facility >= 0 && (in.Facility >= len(in.Maps) || in.Maps[in.Facility] == nil) {
		name := fmt.Sprintf("facility %d", in.Facility+1)
		if in.Facility < len(in.Facilities) {
			name = in.Facilities[in.Facility].Name
		}
		return "", fmt.Errorf("dump: %s has no results", name)
	}
	marks := make(map[int]bool, len(in.Marks))
	for _, p := range in.Marks {
		marks[g.Index(p.Row, p.Col)] = true
	}
	gv := GridView{
		Grid:       g,
		Maps:       in.Maps,
		Facilities: in.Facilities,
		Facility:   in.Facility,
		Layer:      in.Layer,
		Units:      in.Units,
		ReTol:      in.Settings.ReTol,
		Marks:      marks,
		CursorRow:  -1,
		CursorCol:  -1,
	}
	mat := gv.Matrix()
	w, h := MatrixSize(mat)
	var b strings.Builder
	b.WriteString(dumpHeader(in))
	b.WriteString("\n")
	b.WriteString(RenderMatrix(mat, st, w, h))
	b.WriteString("\n\n")
	b.WriteString(RenderLegend(gv.Legend(), st, max(w, 78)))
	b.WriteString("\n")
	return b.String(), nil
}

// dumpHeader says what the matrix shows.
func dumpHeader(in DumpInput) string {
	g := in.Grid
	veh := g.Vehicle
	s := in.Settings
	u := in.Units
	var b strings.Builder
	line := func(k, format string, a ...any) {
		fmt.Fprintf(&b, "%-9s %s\n", k, fmt.Sprintf(format, a...))
	}
	fmt.Fprintf(&b, "likewind %s matrix dump, %s\n", in.Version, in.Date)
	line("vehicle", "%s (%s)", envelope.CleanText(veh.Name), session.InputNames(in.Sources))
	if in.Facility < 0 {
		line("facility", "best of all: per point the facility with the best class, by the letter beside each cell (none where out of reach)")
		for k, f := range in.Facilities {
			note := "not evaluated"
			if k < len(in.Maps) && in.Maps[k] != nil {
				note = fmt.Sprintf("model scale %.3g", in.Maps[k].Scale)
			}
			line("", "%c  %s (%s)", FacilityTag(k), f.Name, note)
		}
		line("rule", "%s", bestRules(in))
	} else {
		f := &in.Facilities[in.Facility]
		m := in.Maps[in.Facility]
		desc := f.Medium.String()
		if f.Class != "" {
			desc = f.Class + ", " + desc
		}
		line("facility", "%s (%s); model scale %.3g (%s)", f.Name, desc, m.Scale, m.ScaleRule)
		line("rule", "%s", m.Rule.Describe(f.Medium, u))
	}
	line("layer", "%s", in.Layer)
	scale := "each facility's own"
	if s.Scale > 0 {
		scale = fmt.Sprintf("%.3g for every facility", s.Scale)
	}
	wi := fmt.Sprintf("model scale %s; ΔT %s; Mach within %g; Reynolds number within %g %%; Mach relaxed below %g",
		scale, u.DeltaT(s.DeltaT), s.MachTol, 100*s.ReTol, s.CompressibilityMach)
	if len(in.Changed) > 0 {
		wi += "; changed by the session: " + strings.Join(in.Changed, ", ")
	}
	line("what-if", "%s", wi)
	speedTitle, lab := u.SpeedAxis(g.SpeedKind)
	line("units", "%s: altitude %s (%s altitude), speed %s", u, u.AltUnit(), veh.AltitudeKind, speedTitle)
	grid := fmt.Sprintf("%d altitudes %s–%s × %d speeds %s–%s, %d points inside the envelope",
		g.Rows(), u.AltLabel(g.Alts[0]), u.Alt(g.Alts[g.Rows()-1]), g.Cols(),
		lab(g.Speeds[0]), lab(g.Speeds[g.Cols()-1]), g.InsideCount())
	if len(in.Marks) > 0 {
		grid += fmt.Sprintf(", %d marked", len(in.Marks))
	}
	line("grid", "%s", grid)
	line("caution", "%s", envelope.SafetyNote)
	return b.String()
}

// bestRules names the operating rule of each facility a best-of-all dump
// shows, by its tag ("a: warmest, b: fixed q 80.00 kPa"), or one name for
// all when they share it ("every facility warmest").
func bestRules(in DumpInput) string {
	var names, tagged []string
	for k := range in.Facilities {
		if k < len(in.Maps) && in.Maps[k] != nil {
			n := in.Maps[k].Rule.Name(in.Units)
			names = append(names, n)
			tagged = append(tagged, fmt.Sprintf("%c: %s", FacilityTag(k), n))
		}
	}
	if len(names) > 0 && slices.IndexFunc(names, func(n string) bool { return n != names[0] }) < 0 {
		return "every facility " + names[0]
	}
	return strings.Join(tagged, ", ")
}
