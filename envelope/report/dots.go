package report

import (
	"image"
	"image/color"
	"math"
	"math/bits"
	"sync"
	"sync/atomic"

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
// centre) at each distinct quarter-pixel position once, into a buffer of
// what is left uncovered of each pixel, and blends the colour into the
// picture once per pixel; on another canvas (SVG) it draws one circle per
// distinct position.
// It reports no glyph boxes: the plot pads its data area for glyph boxes,
// and with boxes that cover only the top of a log axis that padding goes
// wrong.
type flightDots struct {
	xy     plotter.XYs
	color  color.RGBA // opaque
	radius vg.Length
	// box is the range of xy (x min, max, y min, max) where it is known
	// (nil: found from the points).
	box *[4]float64
}

func (d *flightDots) style() draw.GlyphStyle {
	return draw.GlyphStyle{Color: d.color, Radius: d.radius, Shape: draw.CircleGlyph{}}
}

func (d *flightDots) DataRange() (xmin, xmax, ymin, ymax float64) {
	if d.box != nil {
		return d.box[0], d.box[1], d.box[2], d.box[3]
	}
	return plotter.XYRange(d.xy)
}

func (d *flightDots) Thumbnail(c *draw.Canvas) { c.DrawGlyph(d.style(), c.Center()) }

// dotBlocks is how many blocks of points are placed side by side, and
// dotBands how many bands of picture rows are stamped side by side.
const (
	dotBlocks = 4
	dotBands  = 4
)

func (d *flightDots) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := transforms(&c, p)
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
	// quarter is where point q is drawn and the number of its quarter
	// pixel, -1 outside the area.
	quarter := func(q plotter.XY) (vg.Point, int) {
		pt := vg.Point{X: trX(q.X), Y: trY(q.Y)}
		if !c.Contains(pt) {
			return pt, -1
		}
		qx := int(math.Floor((pt.X.Dots(dpi) - px0) * dotSteps))
		qy := int(math.Floor((top - pt.Y.Dots(dpi) - py0) * dotSteps))
		if qx < 0 || qy < 0 || qx >= cols || qy >= rows {
			return pt, -1
		}
		return pt, qy*cols + qx
	}
	if !raster {
		sty := d.style()
		for _, q := range d.xy {
			pt, k := quarter(q)
			if k < 0 || seen[k/64]&(1<<(k%64)) != 0 {
				continue
			}
			seen[k/64] |= 1 << (k % 64)
			c.DrawGlyph(sty, pt)
		}
		return
	}
	// On a picture: mark the quarter pixels of the points, the points in
	// blocks side by side, then stamp each marked position once, in
	// bands of picture rows side by side, each band every stamp that
	// reaches it, clipped to it. Every pixel sees its stamps in the same
	// order (the positions' order, row by row), whatever the bands.
	var wg sync.WaitGroup
	n := len(d.xy)
	for b := range dotBlocks {
		pts := d.xy[b*n/dotBlocks : (b+1)*n/dotBlocks]
		wg.Go(func() {
			for _, q := range pts {
				if _, k := quarter(q); k >= 0 {
					atomic.OrUint64(&seen[k/64], 1<<(k%64))
				}
			}
		})
	}
	wg.Wait()
	st := stampsFor(d.radius.Dots(dpi))
	// What the stamps leave uncovered of each pixel of the picture,
	// 0..0xffff: blending one opaque colour over a pixel by coverage a,
	// then b, leaves (1-a)(1-b) of what was there, so the product is
	// taken first and the colour blended once.
	w, h := img.Bounds().Dx(), img.Bounds().Dy()
	left := make([]uint16, w*h)
	ox, oy := int(px0)*dotSteps, int(py0)*dotSteps
	for b := range dotBands {
		lo, hi := b*h/dotBands, (b+1)*h/dotBands
		wg.Go(func() {
			band := left[lo*w : hi*w]
			for k := range band {
				band[k] = 0xffff
			}
			// The quarter rows whose stamps reach picture rows lo..hi-1.
			q0 := max(0, (lo-st.reach)*dotSteps-oy)
			q1 := min(rows, (hi+st.reach)*dotSteps-oy)
			if q0 < q1 {
				k0, k1 := q0*cols, q1*cols
				for wd := k0 / 64; wd <= (k1-1)/64; wd++ {
					for word := seen[wd]; word != 0; word &= word - 1 {
						k := 64*wd + bits.TrailingZeros64(word)
						if k < k0 || k >= k1 {
							continue
						}
						st.cover(left, w, ox+k%cols, oy+k/cols, lo, hi)
					}
				}
			}
			blendLeft(img, left, d.color, lo, hi)
		})
	}
	wg.Wait()
}

// dotStamps are the coverage masks of a disc of one radius (in pixels)
// for each quarter-pixel offset of its centre: stamp (u, v) is the disc
// centred at ((u+½)/dotSteps, (v+½)/dotSteps) within pixel (0, 0), on the
// pixels -reach..reach each way, kept as what it leaves uncovered of each
// pixel (keep, 0xffff less the coverage 0..0xffff), with the columns
// [first, last+1) of each row that it covers at all (spans).
type dotStamps struct {
	reach int
	side  int // 2·reach+1
	keep  [dotSteps * dotSteps][]uint32
	spans [dotSteps * dotSteps][][2]int
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
			keep := make([]uint32, len(m))
			spans := make([][2]int, st.side)
			for r := range st.side {
				lo, hi := st.side, 0
				for c := range st.side {
					k := r*st.side + c
					keep[k] = 0xffff - m[k]
					if m[k] != 0 {
						lo, hi = min(lo, c), c+1
					}
				}
				if lo < hi {
					spans[r] = [2]int{lo, hi}
				}
			}
			st.keep[v*dotSteps+u], st.spans[v*dotSteps+u] = keep, spans
		}
	}
	s, _ := stampCache.LoadOrStore(r, st)
	return s.(*dotStamps)
}

// cover multiplies what is left uncovered of each pixel of a picture w
// pixels wide (left, row by row) by what the disc whose centre is at
// quarter pixel (qx, qy) leaves of it, on the picture's rows ylo..yhi-1
// only.
func (st *dotStamps) cover(left []uint16, w, qx, qy, ylo, yhi int) {
	x0, y0 := qx/dotSteps-st.reach, qy/dotSteps-st.reach
	v := (qy%dotSteps)*dotSteps + qx%dotSteps
	keep, spans := st.keep[v], st.spans[v]
	const full = 0xffff
	for r := range st.side {
		y := y0 + r
		if y < ylo || y >= yhi {
			continue
		}
		u0, u1 := max(spans[r][0], -x0), min(spans[r][1], w-x0)
		if u0 >= u1 {
			continue
		}
		row := left[y*w+x0+u0 : y*w+x0+u1]
		k := keep[r*st.side+u0 : r*st.side+u1]
		k = k[:len(row)]
		for u, l := range row {
			if l != 0 {
				row[u] = uint16((uint32(l)*k[u] + full/2) / full)
			}
		}
	}
}

// blendLeft blends opaque colour col over rows ylo..yhi-1 of img, each
// pixel by the share of it the stamps covered (1 - left/0xffff), as the
// vector rasteriser blends (source over, by coverage).
func blendLeft(img *image.RGBA, left []uint16, col color.RGBA, ylo, yhi int) {
	const full = 0xffff
	w := img.Bounds().Dx()
	cr, cg, cb := uint32(col.R)*0x101, uint32(col.G)*0x101, uint32(col.B)*0x101
	for y := ylo; y < yhi; y++ {
		i := img.PixOffset(img.Bounds().Min.X, y)
		pix := img.Pix[i : i+4*w : i+4*w]
		for x, l := range left[y*w : (y+1)*w] {
			if l == full {
				continue
			}
			p := pix[4*x : 4*x+4 : 4*x+4]
			if l == 0 {
				p[0], p[1], p[2], p[3] = col.R, col.G, col.B, 0xff
				continue
			}
			ma := full - uint32(l)
			a := uint32(l) * 0x101
			p[0] = uint8((uint32(p[0])*a + cr*ma) / full >> 8)
			p[1] = uint8((uint32(p[1])*a + cg*ma) / full >> 8)
			p[2] = uint8((uint32(p[2])*a + cb*ma) / full >> 8)
			p[3] = uint8((uint32(p[3])*a + full*ma) / full >> 8)
		}
	}
}
