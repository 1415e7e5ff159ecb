package tui

import (
	"fmt"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope"
)

// intendedClassColour is the colour each match class must have on screen,
// in dumps and in pictures, stated here rather than read from the code:
// full match green, Reynolds short amber, Mach relaxed blue, out of reach
// red, outside the envelope grey.
var intendedClassColour = map[byte]string{
	'#': "#3E9E5A", // full match
	'=': "#D19A1E", // Reynolds short
	'~': "#4F86C9", // Mach relaxed
	'x': "#C24A3A", // out of reach
	'.': "#5C5C5C", // outside the envelope
}

// sameColour reports whether the 24-bit colour got ("#RRGGBB") is want to
// within one step per channel: the terminal colour library passes each
// channel through a float and truncates, so 0x5A may arrive as 0x59. Any two
// class colours differ by far more than that.
func sameColour(got, want string) bool {
	g, err1 := strconv.ParseUint(strings.TrimPrefix(got, "#"), 16, 32)
	w, err2 := strconv.ParseUint(strings.TrimPrefix(want, "#"), 16, 32)
	if err1 != nil || err2 != nil || len(got) != 7 {
		return false
	}
	for sh := 0; sh <= 16; sh += 8 {
		d := int(g>>sh&0xFF) - int(w>>sh&0xFF)
		if d < -1 || d > 1 {
			return false
		}
	}
	return true
}

// styledRune is one printed character with the foreground colour in force
// when it was printed ("" for the terminal's default).
type styledRune struct {
	r  rune
	fg string
}

// parseSGR reads text with ANSI SGR sequences into its printed characters,
// each with its foreground colour as "#RRGGBB" (24-bit colour) or "256:n".
// Other attributes are skipped; a reset (0, empty or 39) clears the colour.
func parseSGR(t *testing.T, s string) []styledRune {
	t.Helper()
	var out []styledRune
	fg := ""
	for len(s) > 0 {
		if strings.HasPrefix(s, "\x1b[") {
			end := strings.IndexByte(s, 'm')
			if end < 0 {
				t.Fatalf("unterminated escape sequence %q", s)
			}
			params := strings.Split(s[2:end], ";")
			s = s[end+1:]
			for k := 0; k < len(params); k++ {
				switch p := params[k]; {
				case p == "" || p == "0" || p == "39":
					fg = ""
				case p == "38" && k+4 < len(params) && params[k+1] == "2":
					var rgb [3]int
					for c := range rgb {
						v, err := strconv.Atoi(params[k+2+c])
						if err != nil {
							t.Fatalf("bad colour in %q", params)
						}
						rgb[c] = v
					}
					fg = fmt.Sprintf("#%02X%02X%02X", rgb[0], rgb[1], rgb[2])
					k += 4
				case p == "38" && k+2 < len(params) && params[k+1] == "5":
					fg = "256:" + params[k+2]
					k += 2
				}
			}
			continue
		}
		if s[0] == '\x1b' {
			t.Fatalf("escape sequence other than SGR: %q", s)
		}
		r := []rune(s)[0]
		out = append(out, styledRune{r: r, fg: fg})
		s = s[len(string(r)):]
	}
	return out
}

// checkCellColours checks every glyph of the matrix rows in text (rendered
// with 24-bit colour) against intendedClassColour and returns how many
// cells of each glyph it saw. cw is the cell width; glyphs sit at the
// start of each cell after the '|' axis.
func checkCellColours(t *testing.T, text string, cw int) map[byte]int {
	t.Helper()
	seen := map[byte]int{}
	for _, line := range strings.Split(text, "\n") {
		rs := parseSGR(t, line)
		bar := -1
		for k, r := range rs {
			if r.r == '|' {
				bar = k
				break
			}
		}
		if bar < 0 {
			continue // title, axis or label line
		}
		for k := bar + 1; k < len(rs); k += cw {
			g := rs[k].r
			want, ok := intendedClassColour[byte(g)]
			if g > 0x7f || !ok {
				t.Errorf("unexpected glyph %q in %q", g, ansiStripForLog(rs))
				continue
			}
			seen[byte(g)]++
			if !sameColour(rs[k].fg, want) {
				t.Errorf("glyph %q drawn in %s, want %s (line %q)", g, rs[k].fg, want, ansiStripForLog(rs))
			}
		}
	}
	return seen
}

func ansiStripForLog(rs []styledRune) string {
	var b strings.Builder
	for _, r := range rs {
		b.WriteRune(r.r)
	}
	return b.String()
}

// TestClassPaletteIsTheIntendedOne: the one class palette in envelope has
// the intended colour per class.
func TestClassPaletteIsTheIntendedOne(t *testing.T) {
	for c, g := range map[envelope.Class]byte{envelope.FullMatch: '#', envelope.ReShort: '=',
		envelope.MachRelaxed: '~', envelope.NoMatch: 'x', envelope.Outside: '.'} {
		if got := c.Colour(); got != intendedClassColour[g] {
			t.Errorf("%s.Colour() = %s, want %s", c, got, intendedClassColour[g])
		}
		if c != envelope.Outside && Glyph(LayerClass, ClassLevel(c)) != g {
			t.Errorf("%s glyph %q, want %q", c, Glyph(LayerClass, ClassLevel(c)), g)
		}
	}
}

// TestMatrixClassColours renders one row with every class and an outside
// point in 24-bit colour and checks the colour before each glyph.
func TestMatrixClassColours(t *testing.T) {
	levels := []int{lvClassFull, lvClassReShort, lvClassMachRelaxed, lvClassNoMatch, -1}
	in := MatrixInput{Layer: LayerClass, Rows: 1, Cols: len(levels), AltTitle: "altitude m", SpeedTitle: "Mach",
		AltLabels: []string{"0"}, SpeedLabel: []string{"0.1", "0.2", "0.3", "0.4", "0.5"},
		CursorRow: -1, CursorCol: -1,
		Cell: func(i, j int) Cell { return Cell{Level: max(levels[j], 0), Inside: levels[j] >= 0} }}
	w, h := MatrixSize(in)
	out := RenderMatrix(in, colourStyles(), w, h)
	seen := checkCellColours(t, out, 2)
	for g := range intendedClassColour {
		if seen[g] != 1 {
			t.Errorf("glyph %q seen %d times, want once:\n%q", g, seen[g], out)
		}
	}
}

// TestScreenAndDumpClassColours checks the class colours where users see
// them: the interface's matrix and the colour dump, on the demo, every
// facility and best of all.
func TestScreenAndDumpClassColours(t *testing.T) {
	vs, err := envelope.DemoVehicles()
	if err != nil {
		t.Fatal(err)
	}
	total := map[byte]int{}
	for _, v := range vs {
		m := newDemo(t, 200, 60, func(o *Options) { o.Vehicle = v })
		st := colourStyles()
		m.fr.st = &st
		m = relayoutAll(m)
		checkScreenAndDump(t, m, &st, total)
	}
	for g := range intendedClassColour {
		if total[g] == 0 {
			t.Errorf("glyph %q never drawn on the demo: the test saw no cell of that class", g)
		}
	}
}

func checkScreenAndDump(t *testing.T, m Model, st *Styles, total map[byte]int) {
	t.Helper()
	for k := -1; k < len(m.facs); k++ {
		m.fac = k
		m.relayout()
		cw := 2
		if k < 0 {
			cw = 3
		}
		screen := m.matrix.View(m.matrixInput())
		for g, n := range checkCellColours(t, screen, cw) {
			total[g] += n
		}
		d, err := Dump(DumpInput{Version: "test", Date: "2025-01-01", Grid: m.res.grid, Maps: m.res.maps,
			Facilities: m.facs, Settings: m.set, Facility: k, Layer: LayerClass}, *st)
		if err != nil {
			t.Fatal(err)
		}
		mat := d[strings.Index(d, "altitude "):strings.Index(d, "\n\n")]
		for g, n := range checkCellColours(t, mat, cw) {
			total[g] += n
		}
	}
}
