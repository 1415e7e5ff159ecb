package envelope

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"image/png"
	"io"
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
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

// TestReachableReAgreesWithDetail checks the chart's facility region
// against the solver: at a full-match point the achieved model Reynolds
// number lies inside the range drawn at its test Mach number.
func TestReachableReAgreesWithDetail(t *testing.T) {
	e := outDemoEval(t)
	const tol = 1e-6 // relative, interpolation-free: the range is recomputed at the test Mach number
	checked := 0
	for _, m := range e.Solved() {
		if m.Facility.Medium == MediumWater {
			continue
		}
		for _, p := range FullMatchPoints(m) {
			d, err := m.Detail(p.Row, p.Col)
			if err != nil {
				t.Fatal(err)
			}
			sv := m.sv.(*gasSolver)
			c := sv.bounds(d.Mach)
			top, ok := sv.best(&c)
			hi := top.re
			lo := sv.reAt(&c, sv.lim.P0Min, sv.lim.T0Max)
			if !ok || d.Re > hi*(1+tol) || d.Re < lo*(1-tol) {
				t.Errorf("%s (%d,%d): Re %g outside drawn range %g–%g at Mach %g", m.Facility.Name, p.Row, p.Col, d.Re, lo, hi, d.Mach)
			}
			checked++
		}
		if rr := ReachableRe(m, 50); len(rr) == 0 {
			t.Errorf("%s: no reachable range although it has full matches", m.Facility.Name)
		} else {
			for _, r := range rr {
				if !(r.Lo > 0 && r.Hi >= r.Lo) {
					t.Errorf("%s: range %+v, want 0 < lo <= hi", m.Facility.Name, r)
				}
			}
		}
	}
	if checked == 0 {
		t.Fatal("no full-match gas points in the demo")
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
	want := map[Class]color.RGBA{
		FullMatch:   {0x3E, 0x9E, 0x5A, 0xFF},
		ReShort:     {0xD1, 0x9A, 0x1E, 0xFF},
		MachRelaxed: {0x4F, 0x86, 0xC9, 0xFF},
		NoMatch:     {0xC2, 0x4A, 0x3A, 0xFF},
	}
	for c, w := range want {
		if got := classColor(c); got != w {
			t.Errorf("classColor(%s) = %v, want %v", c, got, w)
		}
		if r, g, b := c.RGB(); (color.RGBA{r, g, b, 0xFF}) != w {
			t.Errorf("%s.RGB() = %d,%d,%d, want %v", c, r, g, b, w)
		}
	}
	out, ok := classColor(Outside).(color.RGBA)
	if !ok || out.R < 0xE0 || out.G < 0xE0 || out.B < 0xE0 || out.R != out.G || out.G != out.B {
		t.Errorf("classColor(Outside) = %v, want a light grey", classColor(Outside))
	}
}
