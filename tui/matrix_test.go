package tui

import (
	"fmt"
	"strings"
	"testing"

	"github.com/charmbracelet/x/ansi"

	"likewind/envelope/units"
)

// testMatrix is a small synthetic grid: rows altitudes 0..rows-1 km,
// columns Mach 0.1 steps; inside where j >= i.
func testMatrix(rows, cols int) MatrixInput {
	in := MatrixInput{Layer: LayerClass, Rows: rows, Cols: cols, AltTitle: "altitude m", SpeedTitle: "Mach",
		CursorRow: -1, CursorCol: -1, Marks: true}
	for i := 0; i < rows; i++ {
		in.AltLabels = append(in.AltLabels, fmt.Sprint(i*1000))
	}
	for j := 0; j < cols; j++ {
		in.SpeedLabel = append(in.SpeedLabel, units.MachLabel(0.1*float64(j+1)))
	}
	in.Cell = func(i, j int) Cell {
		return Cell{Inside: j >= i, Level: (i + j) % 4, Marked: i == 1 && j == 3}
	}
	return in
}

func TestRenderMatrixLayout(t *testing.T) {
	in := testMatrix(4, 6)
	in.CursorRow, in.CursorCol = 2, 4
	got := trimLines(RenderMatrix(in, PlainStyles(), 40, 10))
	want := strings.Join([]string{
		"altitude m",
		"3000 |.  .  .  ~  x  #",
		"2000>|.  .  #  = [~ ]x",
		"1000 |.  ~  x  #* =  ~",
		"   0 |#  =  ~  x  #  =",
		"     +------------^-----",
		"Mach  0.10  0.30  0.50",
	}, "\n")
	// The highest altitude is on top; '.' outside; '*' marks a test point
	// right after its glyph, inside its cell; the cursor is bracketed with
	// its row and column marked on the axes.
	if got != want {
		t.Errorf("RenderMatrix =\n%s\nwant\n%s", got, want)
	}
}

func TestRenderMatrixScrollKeepsCursorAndAxes(t *testing.T) {
	in := testMatrix(50, 80)
	for _, cur := range [][2]int{{0, 0}, {49, 79}, {25, 40}, {3, 77}, {48, 1}} {
		in.CursorRow, in.CursorCol = cur[0], cur[1]
		for _, size := range [][2]int{{30, 8}, {60, 20}, {12, 5}} {
			w, h := size[0], size[1]
			out := RenderMatrix(in, PlainStyles(), w, h)
			lines := strings.Split(out, "\n")
			if len(lines) > h {
				t.Errorf("cursor %v at %d×%d: %d lines", cur, w, h, len(lines))
			}
			for _, l := range lines {
				if ansi.StringWidth(l) > w {
					t.Errorf("cursor %v at %d×%d: line %q too wide", cur, w, h, l)
				}
			}
			rows, cols := MatrixCapacity(in, w, h)
			if rows == 0 || cols == 0 {
				continue
			}
			if !strings.Contains(out, "[") || !strings.Contains(out, ">") || !strings.Contains(out, "^") {
				t.Errorf("cursor %v at %d×%d not visible:\n%s", cur, w, h, out)
			}
			// The axis titles stay in place while scrolled.
			if !strings.HasPrefix(lines[0], "altitude m") || !strings.HasPrefix(strings.TrimLeft(lines[len(lines)-1], " "), "Mach") {
				t.Errorf("cursor %v at %d×%d: axis titles moved:\n%s", cur, w, h, out)
			}
			sr, sc := FitScroll(in, w, h)
			d := in.Rows - 1 - cur[0]
			if d < sr || d >= sr+rows || cur[1] < sc || cur[1] >= sc+cols {
				t.Errorf("FitScroll(%v, %d×%d) = %d,%d: cursor outside %d rows %d cols", cur, w, h, sr, sc, rows, cols)
			}
		}
	}
}

func TestRenderMatrixTinySizes(t *testing.T) {
	in := testMatrix(5, 5)
	in.CursorRow, in.CursorCol = 2, 2
	for w := 0; w < 20; w++ {
		for h := 0; h < 8; h++ {
			out := RenderMatrix(in, NewStyles(trueColourRenderer()), w, h)
			if lines := strings.Count(out, "\n") + 1; out != "" && lines > h {
				t.Errorf("%d×%d: %d lines", w, h, lines)
			}
			for _, l := range strings.Split(out, "\n") {
				if ansi.StringWidth(l) > w {
					t.Errorf("%d×%d: line %q too wide", w, h, l)
				}
			}
		}
	}
	empty := MatrixInput{}
	if out := RenderMatrix(empty, PlainStyles(), 20, 5); !strings.Contains(out, "empty grid") {
		t.Errorf("empty grid renders %q", out)
	}
}

// TestColourCarriesNoMeaningAlone renders with colour and without: after
// the escape sequences are removed the text must be identical, so every
// meaning is in the glyphs.
func TestColourCarriesNoMeaningAlone(t *testing.T) {
	for _, l := range Layers() {
		in := testMatrix(6, 12)
		in.Layer = l
		in.CursorRow, in.CursorCol = 3, 5
		colour := RenderMatrix(in, NewStyles(trueColourRenderer()), 60, 12)
		plain := RenderMatrix(in, PlainStyles(), 60, 12)
		if !strings.Contains(colour, "\x1b[") {
			t.Errorf("%v: colour styles drew no colour", l)
		}
		if ansi.Strip(colour) != plain {
			t.Errorf("%v: colour and plain text differ:\n%s\n---\n%s", l, ansi.Strip(colour), plain)
		}
		legC := RenderLegend(LegendInput{Layer: l, ReTol: 0.1}, NewStyles(trueColourRenderer()), 80)
		legP := RenderLegend(LegendInput{Layer: l, ReTol: 0.1}, PlainStyles(), 80)
		if ansi.Strip(legC) != legP {
			t.Errorf("%v: legend text differs with colour", l)
		}
	}
}

// TestGlyphsDistinctAndInLegend checks that within a layer every level
// has its own glyph, distinct from the outside and mark glyphs, and that
// the legend lists each one.
func TestGlyphsDistinctAndInLegend(t *testing.T) {
	for _, l := range Layers() {
		seen := map[byte]string{OutsideGlyph: "outside", MarkGlyph: "mark", '[': "cursor", ']': "cursor"}
		leg := RenderLegend(LegendInput{Layer: l, ReTol: 0.1, NoFacility: true}, PlainStyles(), 200)
		for k, d := range layerTable(l) {
			if other, dup := seen[d.glyph]; dup {
				t.Errorf("%v: level %d glyph %q also means %s", l, k, d.glyph, other)
			}
			seen[d.glyph] = d.label
			if !strings.Contains(leg, string(d.glyph)+" ") {
				t.Errorf("%v: legend lacks glyph %q:\n%s", l, d.glyph, leg)
			}
		}
	}
}

func TestLevelBins(t *testing.T) {
	const tol = 0.1
	re := []struct {
		ratio float64
		want  int
	}{
		{0, lvReNone}, {-1, lvReNone}, {0.01, lvRe1}, {0.03, lvRe2}, {0.2, lvRe3}, {0.5, lvRe4},
		{0.8, lvRe5}, {0.9, lvReMeets}, {1.0, lvReMeets}, {1.1, lvReMeets}, {1.5, lvReAbove},
	}
	for _, c := range re {
		if got := ReynoldsLevel(c.ratio, tol); got != c.want {
			t.Errorf("ReynoldsLevel(%g, %g) = %d, want %d", c.ratio, tol, got, c.want)
		}
	}
	q := []struct {
		q, qmax float64
		want    int
	}{
		{0, 100, lvQNone}, {10, 0, lvQNoLim}, {10, 100, lvQ1}, {30, 100, lvQ2}, {60, 100, lvQ3},
		{80, 100, lvQ4}, {95, 100, lvQ5}, {100, 100, lvQ5}, {101, 100, lvQOver},
	}
	for _, c := range q {
		if got := QLevel(c.q, c.qmax); got != c.want {
			t.Errorf("QLevel(%g, %g) = %d, want %d", c.q, c.qmax, got, c.want)
		}
	}
	mach := []struct {
		m    float64
		want int
	}{{0.1, 0}, {0.3, 1}, {0.79, 2}, {0.9, 3}, {1.0, 4}, {1.2, 5}, {2, 6}, {4, 7}, {7, 8}}
	for _, c := range mach {
		if got := MachLevel(c.m); got != c.want {
			t.Errorf("MachLevel(%g) = %d, want %d", c.m, got, c.want)
		}
	}
}

func TestParseLayer(t *testing.T) {
	for _, l := range Layers() {
		got, err := ParseLayer(l.String())
		if err != nil || got != l {
			t.Errorf("ParseLayer(%q) = %v, %v; want %v", l.String(), got, err, l)
		}
	}
	if _, err := ParseLayer("colour"); err == nil {
		t.Errorf("ParseLayer(colour) = nil error")
	}
}

func FuzzParseLayer(f *testing.F) {
	for _, l := range Layers() {
		f.Add(l.String())
	}
	f.Add("")
	f.Fuzz(func(t *testing.T, s string) {
		l, err := ParseLayer(s)
		if err == nil && !strings.EqualFold(l.String(), s) {
			t.Errorf("ParseLayer(%q) = %v", s, l)
		}
	})
}

func ExampleRenderMatrix() {
	in := MatrixInput{
		Layer: LayerClass, Rows: 3, Cols: 4,
		AltTitle: "altitude ft", SpeedTitle: "Mach",
		AltLabels:  []string{"0", "10000", "20000"},
		SpeedLabel: []string{"0.40", "0.60", "0.80", "1.00"},
		Cell: func(i, j int) Cell {
			return Cell{Inside: j >= i, Level: ClassLevel(0)}
		},
		CursorRow: 1, CursorCol: 2,
	}
	// Each cell is a glyph and a slot for the mark or the cursor
	// bracket; the trailing slots are trimmed here for the example.
	for _, line := range strings.Split(RenderMatrix(in, PlainStyles(), 40, 8), "\n") {
		fmt.Println(strings.TrimRight(line, " "))
	}
	// Output:
	// altitude ft
	// 20000 |. . x x
	// 10000>|. x[x]x
	//     0 |x x x x
	//       +----^---
	//  Mach  0.40
}

// trimLines removes trailing spaces from every line.
func trimLines(s string) string {
	lines := strings.Split(s, "\n")
	for k, l := range lines {
		lines[k] = strings.TrimRight(l, " ")
	}
	return strings.Join(lines, "\n")
}

// TestMarkDrawnInItsCell: a test-point mark sits right after its own
// cell's glyph and is followed by the gap before the next cell, so it can
// be read as belonging to one cell only; unmarked cells leave the place
// blank. Checked with and without facility letters and with the cursor on
// a marked cell.
func TestMarkDrawnInItsCell(t *testing.T) {
	for _, tags := range []bool{false, true} {
		in := testMatrix(4, 6)
		in.Tags = tags
		marked := map[[2]int]bool{{1, 3}: true, {1, 4}: true, {3, 5}: true, {0, 0}: true}
		in.Cell = func(i, j int) Cell {
			return Cell{Inside: j >= i, Level: (i + j) % 4, Marked: marked[[2]int{i, j}], Tag: 'c'}
		}
		in.CursorRow, in.CursorCol = 1, 4
		w, h := MatrixSize(in)
		lines := strings.Split(RenderMatrix(in, PlainStyles(), w, h), "\n")
		cw := 3
		if tags {
			cw = 4
		}
		for i := 0; i < in.Rows; i++ {
			line := lines[1+in.Rows-1-i]
			bar := strings.IndexByte(line, '|')
			for j := 0; j < in.Cols; j++ {
				cell := line[bar+1+j*cw : bar+1+(j+1)*cw]
				mark := cell[cw-2]
				gap := cell[cw-1]
				if want := byte(' '); marked[[2]int{i, j}] {
					want = MarkGlyph
					if mark != want {
						t.Errorf("tags %v: marked cell (%d,%d) drawn %q, want %q after its glyph", tags, i, j, cell, want)
					}
				} else if mark != want {
					t.Errorf("tags %v: unmarked cell (%d,%d) drawn %q", tags, i, j, cell)
				}
				if gap != ' ' && gap != ']' && gap != '[' {
					t.Errorf("tags %v: cell (%d,%d) %q has no gap after it", tags, i, j, cell)
				}
			}
		}
		if !strings.Contains(lines[1+in.Rows-2], "*]") {
			t.Errorf("tags %v: marked cursor cell does not read [glyph*]:\n%s", tags, strings.Join(lines, "\n"))
		}
	}
}

// TestShownMarkIsNoLayerGlyph: the facility list marks the facility on
// show with a sign that no layer uses for a cell, so it cannot be read as a
// match class (it used to be '=', the Reynolds-short glyph).
func TestShownMarkIsNoLayerGlyph(t *testing.T) {
	for _, l := range Layers() {
		for _, e := range Legend(l, 0.1, true) {
			if string(e.Glyph) == ShownMark {
				t.Errorf("shown mark %q is the %s glyph for %q", ShownMark, l, e.Label)
			}
		}
	}
	m := newDemo(t, 80, 24)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m, _ = press(m, "f")
	var row string
	for _, l := range strings.Split(m.View(), "\n") {
		if strings.Contains(l, "Kellen Fold") && strings.Contains(l, "%") {
			row = l
		}
	}
	if !strings.HasPrefix(row, ">"+ShownMark+" d Kellen Fold") {
		t.Errorf("facility list row of the shown facility %q, want it to start with %q", row, ">"+ShownMark+" d")
	}
	if strings.Contains(m.View(), "(= shown)") {
		t.Errorf("facility list still explains '=' as the shown mark")
	}
}
