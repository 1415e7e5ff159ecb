package report

import (
	"image"
	"image/color"
	"math"
	"sync"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// dotSteps is how finely a dot's centre is placed within a pixel: a
// quarter of a pixel each way. Dots whose centres fall on the same
// quarter pixel are drawn once.
const dotSteps = 4

// flightDots draws many points as filled round dots of one opaque colour
// and radius, as a scatter of circle glyphs would, but fast: on a PNG
// canvas it stamps a dot rendered once (per quarter-pixel offset of its
// centre) straight into the picture, each distinct quarter-pixel position
// once; on another canvas (SVG) it draws one circle per distinct position.
// It reports no glyph boxes: the plot pads its data area for glyph boxes,
// and with boxes that cover only the top of a log axis that padding goes
// wrong.
type flightDots struct {
	xy     plotter.XYs
	color  color.RGBA // opaque
	radius vg.Length
}

func (d *flightDots) style() draw.GlyphStyle {
	return draw.GlyphStyle{Color: d.color, Radius: d.radius, Shape: draw.CircleGlyph{}}
}

func (d *flightDots) DataRange() (xmin, xmax, ymin, ymax float64) { return plotter.XYRange(d.xy) }

func (d *flightDots) Thumbnail(c *draw.Canvas) { c.DrawGlyph(d.style(), c.Center()) }

func (d *flightDots) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	img, dpi, raster := rasterOf(c)
	if !raster {
		dpi = ChartDPI
	}
	// Positions are in quarter pixels of the picture, y down from top
	// (the picture's top for a raster, the area's top otherwise), counted
	// from the area's top left pixel; seen marks those drawn.
	top := c.Max.Y.Dots(dpi)
	if raster {
		top = float64(img.Bounds().Dy())
	}
	px0 := math.Floor(c.Min.X.Dots(dpi))
	py0 := math.Floor(top - c.Max.Y.Dots(dpi))
	cols := int((c.Max.X.Dots(dpi)-px0+1)*dotSteps) + 1
	rows := int((top-c.Min.Y.Dots(dpi)-py0+1)*dotSteps) + 1
	seen := make([]uint64, (cols*rows+63)/64)
	var st *dotStamps
	if raster {
		st = stampsFor(d.radius.Dots(dpi))
	}
	sty := d.style()
	for _, q := range d.xy {
		pt := vg.Point{X: trX(q.X), Y: trY(q.Y)}
		if !c.Contains(pt) {
			continue
		}
		qx := int(math.Floor((pt.X.Dots(dpi) - px0) * dotSteps))
		qy := int(math.Floor((top - pt.Y.Dots(dpi) - py0) * dotSteps))
		if qx < 0 || qy < 0 || qx >= cols || qy >= rows {
			continue
		}
		k := qy*cols + qx
		if seen[k/64]&(1<<(k%64)) != 0 {
			continue
		}
		seen[k/64] |= 1 << (k % 64)
		if raster {
			st.stamp(img, int(px0)*dotSteps+qx, int(py0)*dotSteps+qy, d.color)
		} else {
			c.DrawGlyph(sty, pt)
		}
	}
}

// dotStamps are the coverage masks of a disc of one radius (in pixels)
// for each quarter-pixel offset of its centre: stamp (u, v) is the disc
// centred at ((u+½)/dotSteps, (v+½)/dotSteps) within pixel (0, 0), on the
// pixels -reach..reach each way, coverage 0..0xffff.
type dotStamps struct {
	reach int
	side  int // 2·reach+1
	mask  [dotSteps * dotSteps][]uint32
}

// stampSamples is the supersampling of a stamp's coverage, per pixel
// each way.
const stampSamples = 16

var stampCache sync.Map // radius (float64) → *dotStamps

// stampsFor returns the stamps of a disc of radius r pixels, made once.
func stampsFor(r float64) *dotStamps {
	if s, ok := stampCache.Load(r); ok {
		return s.(*dotStamps)
	}
	reach := int(math.Ceil(r)) + 1
	st := &dotStamps{reach: reach, side: 2*reach + 1}
	for u := range dotSteps {
		for v := range dotSteps {
			cx := (float64(u) + 0.5) / dotSteps
			cy := (float64(v) + 0.5) / dotSteps
			m := make([]uint32, st.side*st.side)
			for py := -reach; py <= reach; py++ {
				for px := -reach; px <= reach; px++ {
					n := 0
					for sy := range stampSamples {
						for sx := range stampSamples {
							dx := float64(px) + (float64(sx)+0.5)/stampSamples - cx
							dy := float64(py) + (float64(sy)+0.5)/stampSamples - cy
							if dx*dx+dy*dy <= r*r {
								n++
							}
						}
					}
					m[(py+reach)*st.side+px+reach] = uint32(math.Round(float64(n) * 0xffff / (stampSamples * stampSamples)))
				}
			}
			st.mask[v*dotSteps+u] = m
		}
	}
	s, _ := stampCache.LoadOrStore(r, st)
	return s.(*dotStamps)
}

// stamp draws the disc whose centre is at quarter pixel (qx, qy) of img in
// opaque colour col, over what is there, blending as the vector
// rasteriser does (source over, by coverage).
func (st *dotStamps) stamp(img *image.RGBA, qx, qy int, col color.RGBA) {
	x0, y0 := qx/dotSteps-st.reach, qy/dotSteps-st.reach
	m := st.mask[(qy%dotSteps)*dotSteps+qx%dotSteps]
	b := img.Bounds()
	const full = 0xffff
	cr, cg, cb := uint32(col.R)*0x101, uint32(col.G)*0x101, uint32(col.B)*0x101
	inside := x0 >= b.Min.X && y0 >= b.Min.Y && x0+st.side <= b.Max.X && y0+st.side <= b.Max.Y
	for v := range st.side {
		y := y0 + v
		if !inside && (y < b.Min.Y || y >= b.Max.Y) {
			continue
		}
		row := m[v*st.side : (v+1)*st.side]
		i := img.PixOffset(x0, y)
		for u, ma := range row {
			if ma == 0 {
				continue
			}
			if !inside && (x0+u < b.Min.X || x0+u >= b.Max.X) {
				continue
			}
			p := img.Pix[i+4*u : i+4*u+4 : i+4*u+4]
			if ma == full {
				p[0], p[1], p[2], p[3] = col.R, col.G, col.B, 0xff
				continue
			}
			a := (full - ma) * 0x101
			p[0] = uint8((uint32(p[0])*a + cr*ma) / full >> 8)
			p[1] = uint8((uint32(p[1])*a + cg*ma) / full >> 8)
			p[2] = uint8((uint32(p[2])*a + cb*ma) / full >> 8)
			p[3] = uint8((uint32(p[3])*a + full*ma) / full >> 8)
		}
	}
}
