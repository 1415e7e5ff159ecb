package tui

import (
	"fmt"
	"strings"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/units"
)

// GridView is one way of looking at an evaluated grid: which facility,
// which layer, which units and which points are marked. It builds the
// inputs of RenderMatrix and RenderLegend, so the interactive screen and a
// text dump draw the very same cells.
type GridView struct {
	Grid *envelope.Grid
	// Maps holds one map per facility, in the order of Facilities; nil
	// where the facility could not be solved.
	Maps       []*envelope.Map
	Facilities []envelope.Facility
	// Facility is the index of the facility shown; -1 shows, per point,
	// the best facility (best of all) with its letter.
	Facility int
	// Best and BestRes are the best-of-all answer (BestOfAll(Maps)); when
	// Best is nil and needed, Matrix computes them. With Best alone, the
	// answer at a point is its winner's result in Maps.
	Best    []int
	BestRes []envelope.Result

	Layer Layer
	Units units.System
	// FullNames puts each facility's whole name beside its letter in the
	// legend, instead of the first word of it.
	FullNames bool
	ReTol     float64      // Reynolds tolerance, for the Reynolds-ratio layer
	Marks     map[int]bool // marked test points by grid index

	// Partial says the maps and Best are final in window Ready alone (a
	// recompute's points solved first, the others still being written):
	// the other cells are drawn pending, and not read.
	Partial bool
	Ready   envelope.Window

	// Cursor and scroll, as in MatrixInput; use -1 for no cursor.
	CursorRow, CursorCol int
	ScrollRow, ScrollCol int
}

// BestOfAll is envelope.Best over the solved maps (nil entries skipped),
// with facility indices into maps.
func BestOfAll(maps []*envelope.Map) ([]int, []envelope.Result) { return bestOfAllInto(maps, nil, nil) }

// bestOfAllInto is BestOfAll made in idx and res where they hold enough
// (envelope.BestReusing).
func bestOfAllInto(maps []*envelope.Map, idx []int, res []envelope.Result) ([]int, []envelope.Result) {
	var solved []*envelope.Map
	var index []int
	for k, m := range maps {
		if m != nil {
			solved = append(solved, m)
			index = append(index, k)
		}
	}
	if len(solved) == 0 {
		return nil, nil
	}
	best, res := envelope.BestReusing(solved, idx, res)
	for p, b := range best {
		if b >= 0 {
			best[p] = index[b]
		}
	}
	return best, res
}

// ClassLevel is the class layer's level for a match class.
func ClassLevel(c envelope.Class) int {
	switch c {
	case envelope.FullMatch:
		return lvClassFull
	case envelope.ReShort:
		return lvClassReShort
	case envelope.MachRelaxed:
		return lvClassMachRelaxed
	}
	return lvClassNoMatch
}

// levelClass is the inverse of ClassLevel: the match class drawn at level
// k of the class layer (false for the "no facility" level).
func levelClass(k int) (envelope.Class, bool) {
	switch k {
	case lvClassFull:
		return envelope.FullMatch, true
	case lvClassReShort:
		return envelope.ReShort, true
	case lvClassMachRelaxed:
		return envelope.MachRelaxed, true
	case lvClassNoMatch:
		return envelope.NoMatch, true
	}
	return envelope.Outside, false
}

// NoFacilityLevel is the class layer's level where no facility answers.
const NoFacilityLevel = lvClassNoFacility

// RegimeLevel is the regime layer's level: the rarefaction regime where
// the flow is not continuum, the speed regime otherwise.
func RegimeLevel(sp atmos.SpeedRegime, ra atmos.RarefactionRegime) int {
	switch ra {
	case atmos.Slip:
		return lvRegSlip
	case atmos.Transitional:
		return lvRegTransitional
	case atmos.FreeMolecular:
		return lvRegFreeMolecular
	}
	switch sp {
	case atmos.Incompressible:
		return lvRegIncompressible
	case atmos.Subsonic:
		return lvRegSubsonic
	case atmos.Transonic:
		return lvRegTransonic
	case atmos.Supersonic:
		return lvRegSupersonic
	}
	return lvRegHypersonic
}

// FacilityTag is the letter of facility k in best-of-all mode.
func FacilityTag(k int) byte { return facilityTag(k) }

// withBest fills Best/BestRes when best of all is shown and they are
// missing.
func (v GridView) withBest() GridView {
	if v.Facility < 0 && v.Best == nil {
		v.Best, v.BestRes = BestOfAll(v.Maps)
	}
	return v
}

// answer returns the facility result at grid index p and the facility
// that gave it (-1 when none).
func (v *GridView) answer(p int) (envelope.Result, int) {
	if v.Facility < 0 {
		if p < len(v.BestRes) && p < len(v.Best) {
			return v.BestRes[p], v.Best[p]
		}
		return winnerAt(v.Best, v.Maps, p)
	}
	if v.Facility >= len(v.Maps) || v.Maps[v.Facility] == nil {
		return envelope.Result{}, -1
	}
	return v.Maps[v.Facility].Results[p], v.Facility
}

// Cell computes the cell at grid point (i, j).
func (v *GridView) Cell(i, j int) Cell {
	if v.Partial && !v.Ready.Has(i, j) {
		return Cell{Pending: true}
	}
	g := v.Grid
	p := g.Index(i, j)
	c := Cell{Inside: g.Inside(i, j), Marked: v.Marks[p]}
	if !c.Inside {
		return c
	}
	switch v.Layer {
	case LayerRegime:
		f := g.Flight(i, j)
		c.Level = RegimeLevel(f.Speed, f.Rarefaction)
		return c
	case LayerMach:
		c.Level = MachLevel(float64(g.Flight(i, j).Mach))
		return c
	}
	res, k := v.answer(p)
	if k < 0 {
		switch v.Layer {
		case LayerReynolds:
			c.Level = lvReNone
		case LayerQ:
			c.Level = lvQNone
		case LayerLoad:
			c.Level = lvLoadNone
		default:
			c.Level = lvClassNoFacility
		}
		return c
	}
	if v.Facility < 0 && res.Class != envelope.NoMatch {
		// out-of-reach points carry no letter: no facility reaches them
		c.Tag = facilityTag(k)
	}
	switch v.Layer {
	case LayerClass:
		c.Level = ClassLevel(res.Class)
	case LayerReynolds:
		c.Level = ReynoldsLevel(float64(res.ReRatio), v.ReTol)
	case LayerQ:
		qMax := 0.0
		if k < len(v.Facilities) {
			qMax = v.Facilities[k].QMax
		}
		c.Level = QLevel(float64(res.Q), qMax)
	case LayerLoad:
		if k < len(v.Maps) && v.Maps[k] != nil {
			mp := v.Maps[k]
			c.Level = LoadLevel(mp.LoadShare(res), mp.LoadQ > 0)
		} else {
			c.Level = lvLoadNone
		}
	}
	return c
}

// Matrix builds the renderer input: axis labels in the view's units and
// a cell function over the grid.
func (v GridView) Matrix() MatrixInput {
	v = v.withBest()
	in := MatrixInput{
		Layer:     v.Layer,
		AltTitle:  "altitude " + v.Units.AltUnit(),
		CursorRow: v.CursorRow,
		CursorCol: v.CursorCol,
		ScrollRow: v.ScrollRow,
		ScrollCol: v.ScrollCol,
		Tags:      v.Facility < 0 && v.Layer.NeedsFacility() && len(v.Facilities) > 0,
		Marks:     anyMarked(v.Marks),
	}
	g := v.Grid
	if g == nil {
		return in
	}
	in.Rows, in.Cols = g.Rows(), g.Cols()
	title, label := v.Units.SpeedAxis(g.SpeedKind)
	in.SpeedTitle = title
	in.AltLabels = make([]string, len(g.Alts))
	for i, a := range g.Alts {
		in.AltLabels[i] = v.Units.AltLabel(a)
	}
	in.SpeedLabel = make([]string, len(g.Speeds))
	for j, s := range g.Speeds {
		in.SpeedLabel[j] = label(s)
	}
	in.Cell = v.Cell
	return in
}

// anyMarked reports whether any point is marked.
func anyMarked(marks map[int]bool) bool {
	for _, on := range marks {
		if on {
			return true
		}
	}
	return false
}

// Legend builds the legend input: the layer's glyphs and, in best-of-all
// mode on a facility layer, each facility letter with the first word of
// its name (its whole name with FullNames).
func (v GridView) Legend() LegendInput {
	in := LegendInput{Layer: v.Layer, ReTol: v.ReTol, NoFacility: true}
	for _, m := range v.Maps {
		if m != nil {
			in.NoFacility = false
			break
		}
	}
	if v.Facility >= 0 || len(v.Facilities) == 0 || !v.Layer.NeedsFacility() {
		return in
	}
	for k, f := range v.Facilities {
		word := f.Name
		if w := strings.Fields(f.Name); len(w) > 0 && !v.FullNames {
			word = w[0]
		}
		in.Tags = append(in.Tags, fmt.Sprintf("%c %s", facilityTag(k), word))
	}
	return in
}
