package report

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"image/png"
	"io"
	"math"
	"testing"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"likewind/envelope"
)

// outPixels is the expected raster size of a chart dimension at ChartDPI.
func outPixels(l vg.Length) int { return int(math.Round(l.Dots(ChartDPI))) }

func TestMapChartPNG(t *testing.T) {
	e := outDemoEval(t)
	for _, fac := range []int{-1, 2} {
		ch, err := MapChart(e, fac, false)
		if err != nil {
			t.Fatalf("MapChart(%d) = %v", fac, err)
		}
		b, err := ch.Render("png")
		if err != nil {
			t.Fatalf("Render(png) = %v", err)
		}
		img, err := png.Decode(bytes.NewReader(b))
		if err != nil {
			t.Fatalf("decode PNG: %v", err)
		}
		sz := img.Bounds().Size()
		if sz.X != outPixels(ChartWidth) {
			t.Errorf("PNG width = %d px, want %d", sz.X, outPixels(ChartWidth))
		}
		// The legend is added below the plot.
		if sz.Y <= outPixels(ChartHeight) || sz.Y > 2*outPixels(ChartHeight) {
			t.Errorf("PNG height = %d px, want above %d (plot plus legend)", sz.Y, outPixels(ChartHeight))
		}
	}
	if _, err := MapChart(e, len(e.Facilities), false); err == nil {
		t.Error("MapChart(facility out of range) = nil error")
	}
}

func TestChartsSVG(t *testing.T) {
	e := outDemoEval(t)
	mc, err := MapChart(e, 0, true)
	if err != nil {
		t.Fatal(err)
	}
	rc, err := ReMachChart(e, nil)
	if err != nil {
		t.Fatal(err)
	}
	for name, ch := range map[string]*Chart{"map": mc, "re-mach": rc} {
		b, err := ch.Render("svg")
		if err != nil {
			t.Fatalf("%s Render(svg) = %v", name, err)
		}
		dec := xml.NewDecoder(bytes.NewReader(b))
		var root string
		for {
			tok, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("%s SVG is not well-formed XML: %v", name, err)
			}
			if se, ok := tok.(xml.StartElement); ok && root == "" {
				root = se.Name.Local
			}
		}
		if root != "svg" {
			t.Errorf("%s SVG root element = %q, want svg", name, root)
		}
	}
	if _, err := mc.Render("gif"); err == nil {
		t.Error("Render(gif) = nil error, want an unsupported-format error")
	}
}

func TestReMachChartPNG(t *testing.T) {
	e := outDemoEval(t)
	ch, err := ReMachChart(e, []int{3})
	if err != nil {
		t.Fatal(err)
	}
	b, err := ch.Render("png")
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		t.Fatalf("decode PNG: %v", err)
	}
	if img.Bounds().Dx() != outPixels(ChartWidth) {
		t.Errorf("PNG width = %d, want %d", img.Bounds().Dx(), outPixels(ChartWidth))
	}
}

// TestReachableReDrawn: every gas facility with full matches has a
// region on the chart, and where the facility sets no lower p0 limit the
// region is drawn down to three decades below its top (the engine's range,
// Map.ReachableRe, is tested against the solver in envelope).
func TestReachableReDrawn(t *testing.T) {
	e := outDemoEval(t)
	for _, m := range e.Solved() {
		if m.Facility.Medium == envelope.MediumWater || len(FullMatchPoints(m)) == 0 {
			continue
		}
		rr := reachableRe(m, 50)
		if len(rr) == 0 {
			t.Errorf("%s: no reachable range although it has full matches", m.Facility.Name)
		}
		engine := m.ReachableRe(50)
		for k, r := range rr {
			if !(r.Lo > 0 && r.Hi >= r.Lo) {
				t.Errorf("%s: range %+v, want 0 < lo <= hi", m.Facility.Name, r)
			}
			if lo := engine[k].Lo; lo > 0 && r.Lo != lo || !(lo > 0) && r.Lo != r.Hi/1000 {
				t.Errorf("%s: drawn low end %g, engine's %g (top %g)", m.Facility.Name, r.Lo, lo, r.Hi)
			}
		}
	}
}

func TestMapAxisEdges(t *testing.T) {
	got := mapAxis([]float64{0, 1, 3}, func(x float64) float64 { return x })
	want := []float64{-0.5, 0.5, 2, 4}
	for k := range want {
		if got[k] != want[k] {
			t.Fatalf("mapAxis = %v, want %v", got, want)
		}
	}
}

func BenchmarkMapChartPNGDemo(b *testing.B) {
	e := outDemoEval(b)
	for b.Loop() {
		ch, err := MapChart(e, -1, false)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := ch.Render("png"); err != nil {
			b.Fatal(err)
		}
	}
}

// TestPictureClassColours: the pictures paint each class in the colour the
// interface and the dumps use (full match green, Reynolds short amber, Mach
// relaxed blue, out of reach red); outside points are a light tint, lighter
// than every class.
func TestPictureClassColours(t *testing.T) {
	want := map[envelope.Class]color.RGBA{
		envelope.FullMatch:   {0x3E, 0x9E, 0x5A, 0xFF},
		envelope.ReShort:     {0xD1, 0x9A, 0x1E, 0xFF},
		envelope.MachRelaxed: {0x4F, 0x86, 0xC9, 0xFF},
		envelope.NoMatch:     {0xC2, 0x4A, 0x3A, 0xFF},
	}
	for c, w := range want {
		if got := classColor(c); got != w {
			t.Errorf("classColor(%s) = %v, want %v", c, got, w)
		}
		if r, g, b := c.RGB(); (color.RGBA{r, g, b, 0xFF}) != w {
			t.Errorf("%s.RGB() = %d,%d,%d, want %v", c, r, g, b, w)
		}
	}
	out, ok := classColor(envelope.Outside).(color.RGBA)
	if !ok || out.R < 0xE0 || out.G < 0xE0 || out.B < 0xE0 || out.R != out.G || out.G != out.B {
		t.Errorf("classColor(Outside) = %v, want a light grey", classColor(envelope.Outside))
	}
}

// TestFlightReMach: the points read in blocks side by side are the inside
// points with a Reynolds number, in row order, as one loop over the grid
// gives them, with the Reynolds range of those points.
func TestFlightReMach(t *testing.T) {
	for _, e := range []*envelope.Evaluation{outDemoEval(t), evalDemoGrid(t, 1, 5, 300, nil)} {
		g := e.Grid
		var want []float64
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if f := g.Flight(i, j); g.Inside(i, j) && f.Re > 0 {
					want = append(want, float64(f.Mach), math.Log10(float64(f.Re)))
					lo, hi = math.Min(lo, float64(f.Re)), math.Max(hi, float64(f.Re))
				}
			}
		}
		fp := flightReMach(g)
		xy, glo, ghi := fp.xy, fp.reLo, fp.reHi
		if xmin, xmax, ymin, ymax := plotter.XYRange(xy); fp.machLo != xmin || fp.machHi != xmax || math.Log10(glo) != ymin || math.Log10(ghi) != ymax {
			t.Errorf("ranges Mach %g..%g, log Re %g..%g; the points' %g..%g, %g..%g", fp.machLo, fp.machHi, math.Log10(glo), math.Log10(ghi), xmin, xmax, ymin, ymax)
		}
		if len(want) == 0 || 2*len(xy) != len(want) {
			t.Fatalf("%d points, want %d (and more than none)", len(xy), len(want)/2)
		}
		for k, p := range xy {
			if p.X != want[2*k] || p.Y != want[2*k+1] {
				t.Fatalf("point %d = %v, want (%g, %g)", k, p, want[2*k], want[2*k+1])
			}
		}
		if glo != lo || ghi != hi {
			t.Errorf("Reynolds range %g..%g, want %g..%g", glo, ghi, lo, hi)
		}
	}
}

// TestChartsOfEvaluateBest: the map of the best of all and the
// Reynolds–Mach chart drawn from EvaluateBest (no results kept per
// facility) are the same files as from Evaluate; a one-facility map,
// which needs that facility's results, is refused.
func TestChartsOfEvaluateBest(t *testing.T) {
	vs, facs := demoFleet(t)
	v := vs[0]
	s := envelope.DefaultSettings(v)
	full, err := envelope.Evaluate(v, facs, s)
	if err != nil {
		t.Fatal(err)
	}
	lean, err := envelope.EvaluateBest(v, facs, s)
	if err != nil {
		t.Fatal(err)
	}
	render := func(e *envelope.Evaluation, format string) (m, r []byte) {
		mc, rc := plotCharts(t, e)
		var err error
		if m, err = mc.Render(format); err != nil {
			t.Fatal(err)
		}
		if r, err = rc.Render(format); err != nil {
			t.Fatal(err)
		}
		return m, r
	}
	for _, format := range []string{"png", "svg"} {
		fm, fr := render(full, format)
		lm, lr := render(lean, format)
		if !bytes.Equal(fm, lm) || !bytes.Equal(fr, lr) {
			t.Errorf("%s: the pictures of EvaluateBest differ from Evaluate's (map equal %v, Reynolds–Mach equal %v)", format, bytes.Equal(fm, lm), bytes.Equal(fr, lr))
		}
	}
	if _, err := MapChart(lean, 0, false); err == nil {
		t.Error("MapChart(one facility) of EvaluateBest = nil error, want results not kept")
	}
}
