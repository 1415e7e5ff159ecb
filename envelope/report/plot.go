package report

import (
	"bytes"
	"errors"
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"
	"sync"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"

	"likewind/atmos"
	"likewind/envelope"
)

// Chart size and raster resolution. The legend is drawn under the plot
// area, so the picture is ChartHeight plus the legend's height.
const (
	ChartWidth  = 10 * vg.Inch // 1500 px at ChartDPI
	ChartHeight = 6.5 * vg.Inch
	ChartDPI    = 150
)

// reMachSamples is the number of test Mach numbers at which a gas
// facility's reachable Reynolds range is evaluated for the chart.
const reMachSamples = 240

// classColor is the colour of a match class in the pictures, from the one
// class palette (Class.Colour) the interface and the dumps use. Points
// outside the envelope are a light tint of the outside colour, so the grid
// extent shows without competing with the classes.
func classColor(c envelope.Class) color.Color {
	r, g, b := c.RGB()
	if c == envelope.Outside || int(c) >= envelope.NumClasses {
		const keep = 0.12 // share of the outside colour left in the tint
		tint := func(v uint8) uint8 { return uint8(math.Round(255 - keep*(255-float64(v)))) }
		r, g, b = tint(r), tint(g), tint(b)
	}
	return color.RGBA{R: r, G: g, B: b, A: 0xFF}
}

// facilityColor is the colour of the k-th facility region on the
// Reynolds–Mach chart.
func facilityColor(k int) color.RGBA {
	pal := [...]uint32{0x4F86C9, 0xD8743A, 0x3E9E5A, 0x8E5BB5, 0xC24A3A, 0x2E93A3, 0xB8A13A, 0x6E6E6E}
	return rgb(pal[k%len(pal)])
}

func rgb(x uint32) color.RGBA {
	return color.RGBA{R: uint8(x >> 16), G: uint8(x >> 8), B: uint8(x), A: 0xFF}
}

func withAlpha(c color.RGBA, a uint8) color.NRGBA {
	return color.NRGBA{R: c.R, G: c.G, B: c.B, A: a}
}

// Chart is a plot with its legend, ready to render.
type Chart struct {
	plot   *plot.Plot
	legend plot.Legend
}

// Render draws the chart as "png" or "svg" and returns the file content.
// The plot fills ChartWidth × ChartHeight; the legend is added below it.
func (ch *Chart) Render(format string) ([]byte, error) {
	pad := 0.4 * vg.Centimeter
	// Measure the legend in an area of the final width (it measures its
	// text by the font alone: the area needs no canvas).
	probe := draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: ChartWidth, Y: ChartHeight}}}
	lr := ch.legend.Rectangle(probe)
	legH := lr.Max.Y - lr.Min.Y + 2*pad
	w, h := ChartWidth, ChartHeight+legH

	var b bytes.Buffer
	switch strings.ToLower(format) {
	case "png":
		pc := newPictureCanvas(w, h, ChartDPI)
		ch.draw(draw.NewCanvas(pc, w, h), pad, legH)
		// The fastest compression: a chart is a few flat colours, which
		// it packs nearly as well as the default (files well under 1 MB).
		if err := encodePNG(&b, pc.img); err != nil {
			return nil, fmt.Errorf("render %s chart: %w", format, err)
		}
	case "svg":
		vc := vgsvg.NewWith(vgsvg.UseWH(w, h), vgsvg.EmbedFonts(true))
		ch.draw(draw.NewCanvas(vc, w, h), pad, legH)
		if _, err := vc.WriteTo(&b); err != nil {
			return nil, fmt.Errorf("render %s chart: %w", format, err)
		}
	default:
		return nil, fmt.Errorf("chart format %q: want png or svg", format)
	}
	return b.Bytes(), nil
}

// draw draws the plot on dc with the legend in a strip legH tall under
// it, pad from the edges.
func (ch *Chart) draw(dc draw.Canvas, pad, legH vg.Length) {
	h := dc.Max.Y - dc.Min.Y
	ch.plot.Draw(draw.Crop(dc, pad/2, -pad, legH, -pad/2))
	ch.legend.Draw(draw.Crop(dc, pad, -pad, pad, -(h - legH)))
}

// newChart is a plot with the common look: title, axis labels, legend
// stacked at the top left of its strip.
func newChart(title, x, y string) *Chart {
	p := plot.New()
	// Names in titles and labels come from files: the SVG writer escapes
	// only XML's markup characters, and a control character makes the
	// picture malformed XML.
	p.Title.Text = envelope.CleanText(title)
	p.X.Label.Text = envelope.CleanText(x)
	p.Y.Label.Text = envelope.CleanText(y)
	p.Title.TextStyle.Font.Size = vg.Points(13)
	p.X.Label.TextStyle.Font.Size = vg.Points(11)
	p.Y.Label.TextStyle.Font.Size = vg.Points(11)
	p.X.Tick.Label.Font.Size = vg.Points(10)
	p.Y.Tick.Label.Font.Size = vg.Points(10)
	p.X.Tick.Marker = stepTicks{}
	p.Y.Tick.Marker = stepTicks{}
	p.Add(plotter.NewGrid())
	leg := plot.NewLegend()
	leg.Top, leg.Left = true, true
	leg.TextStyle.Font.Size = vg.Points(10)
	leg.ThumbnailWidth = 0.8 * vg.Centimeter
	return &Chart{plot: p, legend: leg}
}

// chartAxes converts grid values to chart units: altitude in km (SI) or
// ft (customary); Mach unchanged; airspeeds in m/s or kt.
type chartAxes struct {
	customary bool
	kind      atmos.SpeedKind
}

func (a chartAxes) alt(m float64) float64 {
	if a.customary {
		return m / atmos.Foot
	}
	return m / 1000
}

func (a chartAxes) speed(v float64) float64 {
	if a.kind == atmos.Mach || !a.customary {
		return v
	}
	return v / atmos.Knot
}

func (a chartAxes) altLabel(k atmos.AltitudeKind) string {
	u := "km"
	if a.customary {
		u = "ft"
	}
	return fmt.Sprintf("%s altitude (%s)", k, u)
}

func (a chartAxes) speedLabel() string {
	switch {
	case a.kind == atmos.Mach:
		return "flight Mach number"
	case a.customary:
		return a.kind.String() + " (kt)"
	}
	return a.kind.String() + " (m/s)"
}

// MapChart draws the altitude–speed map of the envelope coloured by the
// match class of facility fac (an index into e.Facilities; -1 for the best
// facility per point), with the envelope boundary and the limit lines.
func MapChart(e *envelope.Evaluation, fac int, customary bool) (*Chart, error) {
	g := e.Grid
	v := g.Vehicle
	var class func(i, j int) envelope.Class
	what := "best of all facilities"
	switch {
	case fac < 0:
		solved := e.Solved()
		if len(solved) == 0 {
			return nil, errors.New("map chart: no facility could be evaluated")
		}
		best := e.Best // kept by EvaluateBest
		if best == nil {
			best = envelope.BestClasses(solved)
		}
		class = func(i, j int) envelope.Class { return best[g.Index(i, j)] }
	case fac >= len(e.Facilities):
		return nil, fmt.Errorf("map chart: facility %d of %d", fac+1, len(e.Facilities))
	case e.Maps[fac] == nil:
		return nil, fmt.Errorf("map chart: %s was not evaluated: %v", e.Facilities[fac].Name, e.Errs[fac])
	case e.Maps[fac].Results == nil:
		return nil, fmt.Errorf("map chart: the results of %s were not kept (an evaluation of the best of all only)", e.Facilities[fac].Name)
	default:
		m := e.Maps[fac]
		what = fmt.Sprintf("%s, model scale %.3g", m.Facility.Name, m.Scale)
		class = func(i, j int) envelope.Class { return m.At(i, j).Class }
	}
	ax := chartAxes{customary: customary, kind: g.SpeedKind}
	ch := newChart(fmt.Sprintf("%s: match class, %s", v.Name, what), ax.speedLabel(), ax.altLabel(v.AltitudeKind))

	cells := &classCells{
		xs:    mapAxis(g.Speeds, ax.speed),
		ys:    mapAxis(g.Alts, ax.alt),
		class: func(i, j int) envelope.Class { return classIf(g, class, i, j) },
	}
	ch.plot.Add(cells)
	for _, c := range []envelope.Class{envelope.FullMatch, envelope.ReShort, envelope.MachRelaxed, envelope.NoMatch} {
		ch.legend.Add(c.String(), swatch{classColor(c)})
	}
	ch.legend.Add("grid point outside the envelope", swatch{classColor(envelope.Outside)})

	bnd, err := boundaryXY(g, ax)
	if err != nil {
		return nil, fmt.Errorf("map chart: %w", err)
	}
	line, err := plotter.NewLine(bnd)
	if err != nil {
		return nil, fmt.Errorf("map chart: boundary: %w", err)
	}
	line.LineStyle = draw.LineStyle{Color: color.Black, Width: vg.Points(1.6)}
	ch.plot.Add(line)
	ch.legend.Add("envelope boundary", line)

	var limits []plot.Plotter
	dash := draw.LineStyle{Color: rgb(0x333333), Width: vg.Points(1), Dashes: []vg.Length{vg.Points(5), vg.Points(3)}}
	for _, l := range limitCurves(g, ax) {
		pl, err := plotter.NewLine(l)
		if err != nil {
			continue
		}
		pl.LineStyle = dash
		limits = append(limits, pl)
	}
	if len(limits) > 0 {
		ch.plot.Add(limits...)
		ch.legend.Add("limit lines (ceiling, Mach, EAS, CAS, q, minimum speed)", limits[0].(*plotter.Line))
	}
	ch.plot.X.Min, ch.plot.X.Max = cells.xs[0], cells.xs[len(cells.xs)-1]
	ch.plot.Y.Min, ch.plot.Y.Max = cells.ys[0], cells.ys[len(cells.ys)-1]
	return ch, nil
}

func classIf(g *envelope.Grid, class func(i, j int) envelope.Class, i, j int) envelope.Class {
	if !g.Inside(i, j) {
		return envelope.Outside
	}
	return class(i, j)
}

// mapAxis returns the cell edges of an axis in chart units: midway between
// points, and half a step beyond the ends.
func mapAxis(pts []float64, conv func(float64) float64) []float64 {
	n := len(pts)
	c := make([]float64, n)
	for k, p := range pts {
		c[k] = conv(p)
	}
	edges := make([]float64, n+1)
	if n == 1 {
		half := math.Max(math.Abs(c[0])*0.01, 0.5)
		return []float64{c[0] - half, c[0] + half}
	}
	for k := 1; k < n; k++ {
		edges[k] = 0.5 * (c[k-1] + c[k])
	}
	edges[0] = c[0] - (edges[1] - c[0])
	edges[n] = c[n-1] + (c[n-1] - edges[n-1])
	return edges
}

// classCells draws the grid as coloured cells, merging equal neighbours in
// a row into one rectangle.
type classCells struct {
	xs, ys []float64 // cell edges
	class  func(i, j int) envelope.Class
}

func (cc *classCells) DataRange() (xmin, xmax, ymin, ymax float64) {
	return cc.xs[0], cc.xs[len(cc.xs)-1], cc.ys[0], cc.ys[len(cc.ys)-1]
}

// cellSeam is how far each cell is drawn over its right and upper
// neighbours, which are drawn after it: a hair of overlap hides
// anti-aliasing seams between cells.
const cellSeam = 0.3 // points

// cellBands is how many bands of picture rows the cells are painted in,
// side by side, on a PNG canvas.
const cellBands = 4

func (cc *classCells) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := transforms(&c, p)
	img, dpi, raster := rasterOf(c)
	if !raster {
		cc.eachRun(0, len(cc.ys)-1, func(i, j, end int, k envelope.Class) {
			x0, x1, y0, y1 := cc.runCorners(trX, trY, i, j, end)
			c.FillPolygon(classColor(k), []vg.Point{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}})
		})
		return
	}
	// On a picture each run is painted as the rectangle it is, pixel by
	// pixel, in the order the polygons would be drawn; each band of
	// picture rows takes the cell rows that reach it, clipped to it, so
	// every pixel sees its cells in the same order.
	h := float64(img.Bounds().Dy())
	rowPx := func(i int) (top, bot float64) {
		r := toPixels(0, trY(cc.ys[i]), 0, trY(cc.ys[i+1])+vg.Points(cellSeam), dpi, h)
		return r.y0, r.y1
	}
	var wg sync.WaitGroup
	for band := range cellBands {
		lo, hi := band*img.Bounds().Dy()/cellBands, (band+1)*img.Bounds().Dy()/cellBands
		wg.Go(func() {
			first, last := -1, -1
			for i := 0; i < len(cc.ys)-1; i++ {
				if top, bot := rowPx(i); bot > float64(lo) && top < float64(hi) {
					if first < 0 {
						first = i
					}
					last = i
				}
			}
			if first < 0 {
				return
			}
			cc.eachRun(first, last+1, func(i, j, end int, k envelope.Class) {
				x0, x1, y0, y1 := cc.runCorners(trX, trY, i, j, end)
				fillRect(img, toPixels(x0, y0, x1, y1, dpi, h), classColor(k).(color.RGBA), lo, hi)
			})
		})
	}
	wg.Wait()
}

// eachRun calls f for each run of equal classes in rows i0..i1-1, row by
// row, left to right: columns j..end-1 of row i have class k.
func (cc *classCells) eachRun(i0, i1 int, f func(i, j, end int, k envelope.Class)) {
	cols := len(cc.xs) - 1
	for i := i0; i < i1; i++ {
		for j := 0; j < cols; {
			k := cc.class(i, j)
			end := j + 1
			for end < cols && cc.class(i, end) == k {
				end++
			}
			f(i, j, end, k)
			j = end
		}
	}
}

// runCorners are the corners on the canvas of the run of columns j..end-1
// in row i, with the seam overlap.
func (cc *classCells) runCorners(trX, trY func(float64) vg.Length, i, j, end int) (x0, x1, y0, y1 vg.Length) {
	return trX(cc.xs[j]), trX(cc.xs[end]) + vg.Points(cellSeam), trY(cc.ys[i]), trY(cc.ys[i+1]) + vg.Points(cellSeam)
}

// swatch is a legend thumbnail filled with one colour.
type swatch struct{ c color.Color }

func (s swatch) Thumbnail(c *draw.Canvas) {
	r := c.Rectangle
	c.FillPolygon(s.c, []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}})
}

// boundaryEdgeSamples is how many pieces each boundary edge is cut into
// when the boundary is drawn in another speed kind than its own.
const boundaryEdgeSamples = 24

// boundaryXY is the closed envelope boundary in chart units. Where the
// grid's speed kind differs from the boundary's, each edge is sampled and
// converted on the grid's day.
func boundaryXY(g *envelope.Grid, ax chartAxes) (plotter.XYs, error) {
	v := g.Vehicle
	b := v.Boundary
	var out plotter.XYs
	steps := 1
	if v.BoundaryKind != g.SpeedKind {
		steps = boundaryEdgeSamples
	}
	for k := range b {
		p, q := b[k], b[(k+1)%len(b)]
		for s := 0; s < steps; s++ {
			t := float64(s) / float64(steps)
			h := p.Altitude + t*(q.Altitude-p.Altitude)
			sp := p.Speed + t*(q.Speed-p.Speed)
			x, err := speedIn(g, h, v.BoundaryKind, sp)
			if err != nil {
				return nil, fmt.Errorf("boundary edge %d: %w", k+1, err)
			}
			out = append(out, plotter.XY{X: ax.speed(x), Y: ax.alt(h)})
		}
	}
	out = append(out, out[0])
	return out, nil
}

// speedIn converts a speed of kind k at altitude h (on the grid's day)
// into the grid's speed kind.
func speedIn(g *envelope.Grid, h float64, k atmos.SpeedKind, sp float64) (float64, error) {
	if k == g.SpeedKind {
		return sp, nil
	}
	st, err := atmos.AtDay(h, g.Vehicle.AltitudeKind, g.DeltaT)
	if err != nil {
		return 0, err
	}
	a, err := atmos.Speeds(k, sp, st)
	if err != nil {
		return 0, err
	}
	return a.Of(g.SpeedKind), nil
}

// limitCurves returns the limit lines of the vehicle that are set, in
// chart units, each sampled over the grid's altitude range.
func limitCurves(g *envelope.Grid, ax chartAxes) []plotter.XYs {
	v := g.Vehicle
	l := v.Limits
	lo, hi := g.Alts[0], g.Alts[len(g.Alts)-1]
	var out []plotter.XYs
	if l.Ceiling > 0 {
		x0, x1 := ax.speed(g.Speeds[0]), ax.speed(g.Speeds[len(g.Speeds)-1])
		out = append(out, plotter.XYs{{X: x0, Y: ax.alt(l.Ceiling)}, {X: x1, Y: ax.alt(l.Ceiling)}})
	}
	curve := func(speedAt func(st atmos.State) (atmos.SpeedKind, float64)) {
		const n = 60
		var xy plotter.XYs
		for k := 0; k <= n; k++ {
			h := lo + (hi-lo)*float64(k)/n
			if l.Ceiling > 0 && h > l.Ceiling {
				break
			}
			st, err := atmos.AtDay(h, v.AltitudeKind, g.DeltaT)
			if err != nil {
				continue
			}
			kind, sp := speedAt(st)
			a, err := atmos.Speeds(kind, sp, st)
			if err != nil {
				continue
			}
			xy = append(xy, plotter.XY{X: ax.speed(a.Of(g.SpeedKind)), Y: ax.alt(h)})
		}
		if len(xy) > 1 {
			out = append(out, xy)
		}
	}
	if l.MaxMach > 0 {
		curve(func(atmos.State) (atmos.SpeedKind, float64) { return atmos.Mach, l.MaxMach })
	}
	if l.MaxEAS > 0 {
		curve(func(atmos.State) (atmos.SpeedKind, float64) { return atmos.EAS, l.MaxEAS })
	}
	if l.MaxCAS > 0 {
		curve(func(atmos.State) (atmos.SpeedKind, float64) { return atmos.CAS, l.MaxCAS })
	}
	if l.MaxQ > 0 {
		curve(func(st atmos.State) (atmos.SpeedKind, float64) {
			return atmos.TAS, math.Sqrt(2 * l.MaxQ / st.Density)
		})
	}
	if l.MinSpeed > 0 {
		curve(func(atmos.State) (atmos.SpeedKind, float64) { return l.MinSpeedKind, l.MinSpeed })
	}
	return out
}

// reachableRe is the region of map m's facility on the Reynolds–Mach
// chart (Map.ReachableRe). Where the facility sets no lower p0 limit the
// region is drawn from three decades below its top, which a log axis can
// show.
func reachableRe(m *envelope.Map, samples int) []envelope.ReRange {
	out := m.ReachableRe(samples)
	for k := range out {
		if !(out[k].Lo > 0) {
			out[k].Lo = out[k].Hi / 1000
		}
	}
	return out
}

// ReMachChart draws the full-scale flight conditions of the envelope on a
// Reynolds number–Mach number chart, with each facility's reachable region
// at its model scale. facs selects facilities by index (nil: all that
// could be evaluated).
func ReMachChart(e *envelope.Evaluation, facs []int) (*Chart, error) {
	g := e.Grid
	v := g.Vehicle
	if facs == nil {
		for k, m := range e.Maps {
			if m != nil {
				facs = append(facs, k)
			}
		}
	}
	ch := newChart(fmt.Sprintf("%s: Reynolds number against Mach number", v.Name),
		"Mach number (flight; test section for facilities)",
		fmt.Sprintf("Reynolds number on %s", refLengthWords(v)))
	// The y axis is linear in log10(Re), labelled in decades: the plot's
	// own log scale centres the rotated axis title wrongly.
	ch.plot.Y.Tick.Marker = decadeTicks
	lg := math.Log10

	ylo, yhi := math.Inf(1), math.Inf(-1)
	span := func(y float64) {
		ylo, yhi = math.Min(ylo, y), math.Max(yhi, y)
	}
	flight := flightReMach(g)
	if len(flight.xy) == 0 {
		return nil, errors.New("Reynolds–Mach chart: no flight points inside the envelope")
	}
	span(flight.reLo)
	span(flight.reHi)
	for _, k := range facs {
		if k < 0 || k >= len(e.Maps) || e.Maps[k] == nil {
			continue
		}
		m := e.Maps[k]
		rr := reachableRe(m, reMachSamples)
		col := facilityColor(k)
		label := fmt.Sprintf("%s (scale %.3g)", envelope.CleanText(m.Facility.Name), m.Scale)
		if m.Facility.Medium == envelope.MediumWater {
			label += fmt.Sprintf(", Mach relaxed below %.2g", m.Settings.CompressibilityMach)
		}
		var first *plotter.Polygon
		for _, run := range contiguousRuns(rr) {
			ring := make(plotter.XYs, 0, 2*len(run))
			for _, r := range run {
				ring = append(ring, plotter.XY{X: r.Mach, Y: lg(r.Hi)})
				span(r.Hi)
			}
			for q := len(run) - 1; q >= 0; q-- {
				ring = append(ring, plotter.XY{X: run[q].Mach, Y: lg(run[q].Lo)})
				span(run[q].Lo)
			}
			poly, err := plotter.NewPolygon(ring)
			if err != nil {
				continue
			}
			poly.Color = withAlpha(col, 0x50)
			poly.LineStyle = draw.LineStyle{Color: col, Width: vg.Points(1.2)}
			ch.plot.Add(poly)
			if first == nil {
				first = poly
			}
		}
		if first != nil {
			ch.legend.Add(label, first)
		} else {
			ch.legend.Add(label+": no reachable setting", swatch{withAlpha(col, 0x50)})
		}
	}
	dots := &flightDots{xy: flight.xy, color: rgb(0x222222), radius: vg.Points(1.3),
		box: &[4]float64{flight.machLo, flight.machHi, lg(flight.reLo), lg(flight.reHi)}}
	ch.plot.Add(dots)
	ch.legend.Add("flight conditions inside the envelope (full scale)", dots)
	// Whole decades, so every tick lies on the axis.
	ch.plot.Y.Min = math.Floor(lg(ylo))
	ch.plot.Y.Max = math.Ceil(lg(yhi))
	ch.plot.X.Min = 0
	return ch, nil
}

// flightBlocks is how many blocks of grid rows flightReMach reads side by
// side.
const flightBlocks = 8

// flightPoints are the flight points of the Reynolds–Mach chart: Mach
// number and log10 of the Reynolds number, with the ranges of both.
type flightPoints struct {
	xy             plotter.XYs
	machLo, machHi float64
	reLo, reHi     float64 // Reynolds number (not its log)
}

// flightReMach is the flight Mach number and log10 of the Reynolds number
// of every grid point inside the envelope that has a Reynolds number, row
// by row. The rows are read in blocks side by side, each into its place
// in the one slice.
func flightReMach(g *envelope.Grid) flightPoints {
	rows, cols := g.Rows(), g.Cols()
	blocks := min(flightBlocks, rows)
	// Each block's place: the count of inside points before it.
	start := make([]int, blocks+1)
	for b := range blocks {
		n := 0
		for i := b * rows / blocks; i < (b+1)*rows/blocks; i++ {
			for j := range cols {
				if g.Inside(i, j) {
					n++
				}
			}
		}
		start[b+1] = start[b] + n
	}
	xy := make(plotter.XYs, start[blocks])
	got := make([]int, blocks)
	box := make([]flightPoints, blocks)
	var wg sync.WaitGroup
	for b := range blocks {
		wg.Go(func() {
			out := xy[start[b]:start[b+1]]
			n := 0
			bx := flightPoints{machLo: math.Inf(1), machHi: math.Inf(-1), reLo: math.Inf(1), reHi: math.Inf(-1)}
			for i := b * rows / blocks; i < (b+1)*rows/blocks; i++ {
				for j := range cols {
					if !g.Inside(i, j) {
						continue
					}
					f := g.Flight(i, j)
					if re := float64(f.Re); re > 0 {
						m := float64(f.Mach)
						out[n] = plotter.XY{X: m, Y: math.Log10(re)}
						n++
						bx.machLo, bx.machHi = min(bx.machLo, m), max(bx.machHi, m)
						bx.reLo, bx.reHi = min(bx.reLo, re), max(bx.reHi, re)
					}
				}
			}
			got[b], box[b] = n, bx
		})
	}
	wg.Wait()
	// Close the gaps left by inside points without a Reynolds number.
	fp := flightPoints{machLo: math.Inf(1), machHi: math.Inf(-1), reLo: math.Inf(1), reHi: math.Inf(-1)}
	n := 0
	for b := range blocks {
		n += copy(xy[n:], xy[start[b]:start[b]+got[b]])
		bx := box[b]
		fp.machLo, fp.machHi = min(fp.machLo, bx.machLo), max(fp.machHi, bx.machHi)
		fp.reLo, fp.reHi = min(fp.reLo, bx.reLo), max(fp.reHi, bx.reHi)
	}
	fp.xy = xy[:n]
	return fp
}

// logTicks marks an axis of log10 values at every whole multiple of each
// power of ten within the axis range, labelled where label gives a text
// for multiple f of 10^e.
type logTicks struct{ label func(f int, e float64) string }

// decadeTicks labels each power of ten ("1e7") and leaves 2–9 times it
// unlabelled.
var decadeTicks = logTicks{label: func(f int, e float64) string {
	if f == 1 {
		return "1e" + strconv.Itoa(int(e))
	}
	return ""
}}

func (lt logTicks) Ticks(lo, hi float64) []plot.Tick {
	var ticks []plot.Tick
	if !(hi > lo) {
		return ticks
	}
	for e := math.Floor(lo); e <= math.Ceil(hi); e++ {
		for f := 1; f <= 9; f++ {
			x := e + math.Log10(float64(f))
			if x < lo-1e-9 || x > hi+1e-9 {
				continue
			}
			ticks = append(ticks, plot.Tick{Value: x, Label: lt.label(f, e)})
		}
	}
	return ticks
}

// stepTicks marks a linear axis at 1, 2 or 5 times a power of ten, chosen
// for about eight labelled ticks, with four unlabelled ticks between.
type stepTicks struct{}

func (stepTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) {
		return plot.DefaultTicks{}.Ticks(lo, hi)
	}
	raw := (hi - lo) / 8
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := mag
	for _, f := range []float64{1, 2, 5, 10} {
		if f*mag >= raw {
			step = f * mag
			break
		}
	}
	prec := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	minor := step / 5
	var ticks []plot.Tick
	for k := math.Ceil(lo/minor - 1e-9); k*minor <= hi+1e-9*step; k++ {
		x := k * minor
		t := plot.Tick{Value: x}
		if math.Abs(x) < 1e-9*step {
			x, t.Value = 0, 0
		}
		if math.Abs(math.Remainder(x, step)) < 1e-6*step {
			t.Label = strconv.FormatFloat(x, 'f', prec, 64)
			if t.Label == "-0" {
				t.Label = "0"
			}
		}
		ticks = append(ticks, t)
	}
	return ticks
}

// contiguousRuns splits ranges where the Mach step jumps (a gap where no
// setting exists), so each run is drawn as one region.
func contiguousRuns(rr []envelope.ReRange) [][]envelope.ReRange {
	if len(rr) == 0 {
		return nil
	}
	var out [][]envelope.ReRange
	start := 0
	step := math.Inf(1)
	if len(rr) > 1 {
		step = rr[1].Mach - rr[0].Mach
		for k := 2; k < len(rr); k++ {
			step = math.Min(step, rr[k].Mach-rr[k-1].Mach)
		}
	}
	for k := 1; k <= len(rr); k++ {
		if k == len(rr) || rr[k].Mach-rr[k-1].Mach > 1.5*step {
			if k-start >= 2 {
				out = append(out, rr[start:k])
			}
			start = k
		}
	}
	return out
}

func refLengthWords(v *envelope.Vehicle) string {
	name := v.RefLengthName
	if name == "" {
		name = "reference length"
	}
	return fmt.Sprintf("%s (%.3g m full scale)", name, v.RefLength)
}
