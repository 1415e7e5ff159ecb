package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/x/ansi"
)

// Cell is what the matrix shows at one grid point.
type Cell struct {
	Level  int  // level index in the layer's table
	Inside bool // point is inside the flight envelope
	Tag    byte // facility letter in best-of-all mode (0 = none)
	Marked bool // point is a marked test point
	// Pending: the point's answer is still being computed; the cell is
	// drawn blank.
	Pending bool
}

// MatrixInput is everything RenderMatrix needs; it holds no Bubble Tea
// state, so exports and tests can call the renderer directly.
//
// Grid indices: i runs over altitudes (0 = lowest), j over speeds
// (0 = slowest). The matrix draws the highest altitude at the top.
type MatrixInput struct {
	Layer      Layer
	Rows, Cols int
	AltTitle   string   // altitude axis title with unit, e.g. "alt ft"
	SpeedTitle string   // speed axis title with unit, e.g. "Mach", "TAS kt"
	AltLabels  []string // len Rows, index i
	SpeedLabel []string // len Cols, index j
	// Cell returns the cell at (i, j). It is called only for visible
	// cells.
	Cell func(i, j int) Cell
	// Tags makes every cell one character wider to hold Cell.Tag.
	Tags bool
	// Marks makes every cell one character wider to hold the test-point
	// mark right after the glyph (and tag), so a mark is drawn inside its
	// cell and a gap still separates it from the next cell. Cells with
	// Marked set show MarkGlyph there; without Marks no mark is drawn.
	Marks bool
	// CursorRow and CursorCol are the grid indices of the cursor, or -1.
	CursorRow, CursorCol int
	// ScrollRow is the number of display rows hidden above the view
	// (counted from the highest altitude); ScrollCol the number of speed
	// columns hidden to the left. RenderMatrix corrects them so that the
	// cursor is visible; FitScroll returns the corrected values.
	ScrollRow, ScrollCol int
}

// matrix geometry for a given size.
type matrixGeom struct {
	gutter   int // width of the altitude label column including the cursor marker
	cw       int // cell width
	rows     int // visible rows
	cols     int // visible columns
	labelW   int // widest speed label
	ok       bool
	overhead int
}

const matrixOverhead = 3 // title line, axis line, speed label line

func geometry(in MatrixInput, width, height int) matrixGeom {
	g := matrixGeom{overhead: matrixOverhead}
	g.gutter = len([]rune(in.SpeedTitle))
	for _, s := range in.AltLabels {
		if n := visibleWidth(s); n > g.gutter {
			g.gutter = n
		}
	}
	g.gutter++ // cursor marker
	g.cw = 2   // glyph and gap
	if in.Tags {
		g.cw++
	}
	if in.Marks {
		g.cw++
	}
	for _, s := range in.SpeedLabel {
		if n := visibleWidth(s); n > g.labelW {
			g.labelW = n
		}
	}
	if in.Rows <= 0 || in.Cols <= 0 {
		return g
	}
	g.rows = min(in.Rows, height-matrixOverhead)
	g.cols = min(in.Cols, (width-g.gutter-1)/g.cw)
	g.ok = g.rows > 0 && g.cols > 0
	return g
}

// MatrixCapacity returns how many altitude rows and speed columns fit in a
// width×height area.
func MatrixCapacity(in MatrixInput, width, height int) (rows, cols int) {
	g := geometry(in, width, height)
	if !g.ok {
		return 0, 0
	}
	return g.rows, g.cols
}

// MatrixSize returns the width and height RenderMatrix needs to show the
// whole grid without scrolling.
func MatrixSize(in MatrixInput) (width, height int) {
	g := geometry(in, 1, 1)
	return g.gutter + 1 + max(in.Cols, 0)*g.cw, max(in.Rows, 0) + matrixOverhead
}

// FitScroll returns scroll offsets corrected so the cursor is visible with
// the least movement from in.ScrollRow/in.ScrollCol, and never past the
// grid's end.
func FitScroll(in MatrixInput, width, height int) (scrollRow, scrollCol int) {
	g := geometry(in, width, height)
	if !g.ok {
		return 0, 0
	}
	return fitAxis(in.ScrollRow, displayRow(in, in.CursorRow), g.rows, in.Rows),
		fitAxis(in.ScrollCol, in.CursorCol, g.cols, in.Cols)
}

// displayRow converts grid row i into a display row (0 = top = highest).
func displayRow(in MatrixInput, i int) int {
	if i < 0 || i >= in.Rows {
		return -1
	}
	return in.Rows - 1 - i
}

func fitAxis(off, cur, vis, total int) int {
	if cur >= 0 {
		if cur < off {
			off = cur
		}
		if cur >= off+vis {
			off = cur - vis + 1
		}
	}
	off = min(off, total-vis)
	return max(off, 0)
}

// RenderMatrix draws the envelope matrix into at most width×height cells:
// a title line with the altitude axis title and the visible range, one
// line per altitude row (highest at the top) with its label, an axis line
// that marks the cursor column, and the speed labels. The cursor cell is
// bracketed and drawn in reverse video; its row and column are marked on
// the axes. Outside-envelope points are drawn faint with '.'.
func RenderMatrix(in MatrixInput, st Styles, width, height int) string {
	if width <= 0 || height <= 0 {
		return ""
	}
	g := geometry(in, width, height)
	if !g.ok {
		msg := "matrix: no room"
		if in.Rows <= 0 || in.Cols <= 0 {
			msg = "matrix: empty grid"
		}
		return ansi.Truncate(msg, width, "")
	}
	sr, sc := FitScroll(in, width, height)
	var b strings.Builder
	b.Grow((g.rows + 3) * (width + 32) * 2)
	st.axis.wrap(&b, ansi.Truncate(matrixTitle(in, g, sr, sc, width), width, ""))
	avail := width - g.gutter // room for '|' and cells
	writeCellRows(&b, in, &st, g, sr, sc, avail)
	b.WriteByte('\n')
	st.axis.wrap(&b, strings.Repeat(" ", g.gutter)+columnAxis(in, g, sc, avail))
	b.WriteByte('\n')
	st.axis.wrap(&b, padLeft(in.SpeedTitle, g.gutter-1)+" "+speedLabels(in, g, sc, avail))
	return b.String()
}

// matrixTitle is the altitude title, with the rows and columns in view
// when the matrix does not show them all.
func matrixTitle(in MatrixInput, g matrixGeom, sr, sc, width int) string {
	title := in.AltTitle
	if sr > 0 || sc > 0 || g.rows < in.Rows || g.cols < in.Cols {
		info := fmt.Sprintf("rows %d-%d/%d  cols %d-%d/%d",
			sr+1, sr+g.rows, in.Rows, sc+1, sc+g.cols, in.Cols)
		if pad := width - visibleWidth(title) - visibleWidth(info); pad >= 2 {
			title += strings.Repeat(" ", pad) + info
		}
	}
	return title
}

// writeCellRows writes the rows in view, each on a new line: the altitude
// label with the cursor-row marker, then the cells from scroll column sc,
// cut to avail cells. Bytes of one paint are written as one run.
func writeCellRows(b *strings.Builder, in MatrixInput, st *Styles, g matrixGeom, sr, sc, avail int) {
	curD := displayRow(in, in.CursorRow)
	line := make([]byte, 0, g.cols*g.cw+1)
	ids := make([]int, 0, g.cols*g.cw+1)
	paints := make([]paint, 0, 8)
	pid := map[paint]int{}
	idOf := func(p paint) int {
		if k, ok := pid[p]; ok {
			return k
		}
		pid[p] = len(paints)
		paints = append(paints, p)
		return len(paints) - 1
	}
	plain := idOf(paint{})
	axisID := idOf(st.axis)
	put := func(c byte, id int) {
		line = append(line, c)
		ids = append(ids, id)
	}
	for r := 0; r < g.rows; r++ {
		d := sr + r
		i := in.Rows - 1 - d
		b.WriteByte('\n')
		label := ""
		if i >= 0 && i < len(in.AltLabels) {
			label = in.AltLabels[i]
		}
		marker := " "
		if d == curD {
			marker = ">"
		}
		st.axis.wrap(b, padLeft(label, g.gutter-1)+marker)

		line, ids = line[:0], ids[:0]
		put('|', axisID)
		for c := 0; c < g.cols; c++ {
			j := sc + c
			var cell Cell
			if in.Cell != nil {
				cell = in.Cell(i, j)
			}
			cur := d == curD && j == in.CursorCol
			glyph := byte(OutsideGlyph)
			switch {
			case cell.Pending:
				glyph = ' '
			case cell.Inside:
				glyph = Glyph(in.Layer, cell.Level)
			}
			p := idOf(st.cellPaint(in.Layer, cell.Level, cell.Inside, cur))
			put(glyph, p)
			if in.Tags {
				t := cell.Tag
				if t == 0 {
					t = ' '
				}
				put(t, p)
			}
			if in.Marks {
				mark := byte(' ')
				if cell.Marked {
					mark = MarkGlyph
				}
				put(mark, p)
			}
			gap := byte(' ')
			if cur {
				line[len(line)-g.cw] = '[' // previous cell's gap, or the axis
				ids[len(ids)-g.cw] = plain
				gap = ']'
			}
			put(gap, plain)
		}
		if len(line) > avail {
			line = line[:max(avail, 0)]
			ids = ids[:len(line)]
		}
		writeRuns(b, line, ids, paints)
	}
}

// columnAxis is the axis line under the cells, with the cursor column
// marked, cut to avail cells.
func columnAxis(in MatrixInput, g matrixGeom, sc, avail int) string {
	axis := make([]byte, 0, g.cols*g.cw+1)
	axis = append(axis, '+')
	for c := 0; c < g.cols; c++ {
		mark := byte('-')
		if sc+c == in.CursorCol {
			mark = '^'
		}
		axis = append(axis, mark)
		for k := 1; k < g.cw; k++ {
			axis = append(axis, '-')
		}
	}
	if len(axis) > avail {
		axis = axis[:max(avail, 0)]
	}
	return string(axis)
}

// speedLabels are the speed labels under the axis, every step-th absolute
// column so they do not jump while scrolling, cut to avail cells.
func speedLabels(in MatrixInput, g matrixGeom, sc, avail int) string {
	step := 1
	for step*g.cw < g.labelW+1 {
		step++
	}
	lab := []byte(strings.Repeat(" ", g.cols*g.cw+1))
	for c := 0; c < g.cols; c++ {
		j := sc + c
		if j%step != 0 || j >= len(in.SpeedLabel) {
			continue
		}
		pos := 1 + c*g.cw
		s := in.SpeedLabel[j]
		if pos+len(s) > len(lab) {
			continue
		}
		copy(lab[pos:], s)
	}
	labLine := strings.TrimRight(string(lab), " ")
	if len(labLine) > avail {
		labLine = labLine[:max(avail, 0)]
	}
	return labLine
}

// writeRuns writes line with paints grouped into runs of equal paint.
func writeRuns(b *strings.Builder, line []byte, ids []int, paints []paint) {
	start := 0
	for k := 1; k <= len(line); k++ {
		if k == len(line) || ids[k] != ids[start] {
			paints[ids[start]].wrap(b, string(line[start:k]))
			start = k
		}
	}
}

// padLeft right-aligns s in n columns (s is cut if longer).
func padLeft(s string, n int) string {
	w := visibleWidth(s)
	if w >= n {
		return ansi.Truncate(s, max(n, 0), "")
	}
	return strings.Repeat(" ", n-w) + s
}

// padRight left-aligns s in n columns (s is cut if longer).
func padRight(s string, n int) string {
	w := visibleWidth(s)
	if w >= n {
		return ansi.Truncate(s, max(n, 0), "")
	}
	return s + strings.Repeat(" ", n-w)
}

// LegendInput is what RenderLegend draws: the layer's glyphs and, in
// best-of-all mode, the facility letters.
type LegendInput struct {
	Layer      Layer
	ReTol      float64  // Reynolds tolerance, for the Reynolds-ratio labels
	NoFacility bool     // show the "no facility" class
	Tags       []string // "a Name" entries for facility letters
}

// RenderLegend lists every glyph of the layer with its meaning, wrapped to
// width, followed by the facility letters if any.
func RenderLegend(in LegendInput, st Styles, width int) string {
	if width <= 0 {
		return ""
	}
	l := in.Layer
	var items []string
	for _, e := range Legend(l, in.ReTol, in.NoFacility) {
		var g string
		switch {
		case e.Level >= 0:
			g = st.LevelStyle(l, e.Level).Render(string(e.Glyph))
		case e.Glyph == OutsideGlyph:
			g = st.outSt.Render(string(e.Glyph))
		default:
			g = st.HelpKey.Render(string(e.Glyph))
		}
		items = append(items, g+" "+e.Label)
	}
	items = append(items, in.Tags...)
	return wrapItems(l.String()+":", items, "  ", width)
}

// wrapItems joins items after a lead word, wrapping at width between
// items; an item wider than a line is wrapped at its own spaces, so no item
// is ever cut.
func wrapItems(lead string, items []string, sep string, width int) string {
	if width <= 0 {
		return ""
	}
	var lines []string
	cur := lead
	curW := visibleWidth(lead)
	sepW := visibleWidth(sep)
	for _, it := range items {
		w := visibleWidth(it)
		if curW > 0 && curW+sepW+w > width {
			lines = append(lines, cur)
			cur, curW = "", 0
		}
		if w > width {
			parts := wrapLines(it, width, "  ")
			lines = append(lines, parts[:len(parts)-1]...)
			it = parts[len(parts)-1]
			w = visibleWidth(it)
		}
		if curW > 0 {
			cur += sep
			curW += sepW
		}
		cur += it
		curW += w
	}
	lines = append(lines, cur)
	return strings.Join(lines, "\n")
}
