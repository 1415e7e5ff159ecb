package report

import (
	"image"
	"image/color"
	"math"

	"git.sr.ht/~sbinet/gg"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// pictureCanvas is the vector canvas of a PNG chart: a vgimg canvas
// drawing into a picture of our own, through a context made on it
// (vgimg.NewWith would copy a picture it is given, or the one it makes,
// into the context's, and the chart's plotters paint into img directly).
type pictureCanvas struct {
	*vgimg.Canvas
	img *image.RGBA
	// shift is the canvas's height, a whole number of pixels from the
	// picture it is given, less the chart's: text is placed from the
	// top of a canvas of the chart's own height, as on a canvas vgimg
	// makes at that size.
	shift vg.Length
}

// newPictureCanvas is a white picture canvas w × h at dpi (the picture
// rounded to whole pixels, as vgimg rounds it).
func newPictureCanvas(w, h vg.Length, dpi int) *pictureCanvas {
	px := func(l vg.Length) int { return int(l/vg.Inch*vg.Length(dpi) + 0.5) }
	img := image.NewRGBA(image.Rect(0, 0, px(w), px(h)))
	gc := gg.NewContextForRGBA(img)
	gc.SetLineCapButt()
	gc.InvertY()
	// The background is the canvas's default, white, painted by NewWith.
	vc := vgimg.NewWith(vgimg.UseImageWithContext(img, gc), vgimg.UseDPI(dpi))
	_, ch := vc.Size()
	return &pictureCanvas{Canvas: vc, img: img, shift: ch - h}
}

// FillString draws text as the vgimg canvas does, placed as on a canvas
// of the chart's height.
func (c *pictureCanvas) FillString(f font.Face, pt vg.Point, s string) {
	pt.Y += c.shift
	c.Canvas.FillString(f, pt, s)
}

// rasterOf is the picture under canvas c and its resolution, when c draws
// into a picture (a PNG chart); ok is false on another canvas (SVG).
func rasterOf(c draw.Canvas) (img *image.RGBA, dpi float64, ok bool) {
	pc, ok := rootCanvas(c.Canvas).(*pictureCanvas)
	if !ok {
		return nil, 0, false
	}
	return pc.img, pc.DPI(), true
}

// rootCanvas is the canvas under any draw.Canvas wrapping (a cropped
// canvas wraps the one it crops).
func rootCanvas(c vg.Canvas) vg.Canvas {
	for {
		switch w := c.(type) {
		case draw.Canvas:
			c = w.Canvas
		case *draw.Canvas:
			c = w.Canvas
		default:
			return c
		}
	}
}

// transforms is p.Transforms(c): data to canvas coordinates. Where an
// axis has the linear scale (every axis of the charts) its transform is
// the same arithmetic written out, without the copy of the axis and the
// call through its scale that p's makes per value (a plotter of a million
// points calls it two million times).
func transforms(c *draw.Canvas, p *plot.Plot) (x, y func(float64) vg.Length) {
	x, y = p.Transforms(c)
	if _, ok := p.X.Scale.(plot.LinearScale); ok {
		lo, hi, c0, c1 := p.X.Min, p.X.Max, c.Min.X, c.Max.X
		x = func(v float64) vg.Length { return vg.Length((v-lo)/(hi-lo))*(c1-c0) + c0 }
	}
	if _, ok := p.Y.Scale.(plot.LinearScale); ok {
		lo, hi, c0, c1 := p.Y.Min, p.Y.Max, c.Min.Y, c.Max.Y
		y = func(v float64) vg.Length { return vg.Length((v-lo)/(hi-lo))*(c1-c0) + c0 }
	}
	return x, y
}

// pixelRect is an axis-aligned rectangle in the pixels of a picture, x
// right and y down from its top left corner, at the 1/64 pixel the vector
// rasteriser places corners at.
type pixelRect struct{ x0, y0, x1, y1 float64 }

// toPixels is rectangle [x0, x1] × [y0, y1] of a canvas (points, y up) in
// the pixels of a picture h pixels tall at dpi, as the vector canvas maps
// it (y flipped, corners rounded to 1/64 pixel).
func toPixels(x0, y0, x1, y1 vg.Length, dpi, h float64) pixelRect {
	snap := func(v float64) float64 { return math.Round(v*64) / 64 }
	r := pixelRect{
		x0: snap(x0.Dots(dpi)), x1: snap(x1.Dots(dpi)),
		y0: snap(h - y1.Dots(dpi)), y1: snap(h - y0.Dots(dpi)),
	}
	if r.x0 > r.x1 {
		r.x0, r.x1 = r.x1, r.x0
	}
	if r.y0 > r.y1 {
		r.y0, r.y1 = r.y1, r.y0
	}
	return r
}

// fillRect paints r in opaque colour col over img, only on the picture's
// rows ylo..yhi-1: each pixel by the share of it the rectangle covers,
// blended as the vector rasteriser blends a filled polygon (source over,
// by coverage), so that a rectangle drawn here looks as one filled as a
// path would, without building and scanning the path.
func fillRect(img *image.RGBA, r pixelRect, col color.RGBA, ylo, yhi int) {
	b := img.Bounds()
	px0 := max(int(math.Floor(r.x0)), b.Min.X)
	px1 := min(int(math.Ceil(r.x1)), b.Max.X)
	py0 := max(int(math.Floor(r.y0)), b.Min.Y, ylo)
	py1 := min(int(math.Ceil(r.y1)), b.Max.Y, yhi)
	if px0 >= px1 || py0 >= py1 {
		return
	}
	const full = 0xffff
	// Coverage of the first and last columns (the others are covered
	// whole, so a row's inner pixels share its coverage).
	cx0 := min(r.x1, float64(px0+1)) - max(r.x0, float64(px0))
	cx1 := min(r.x1, float64(px1)) - max(r.x0, float64(px1-1))
	for py := py0; py < py1; py++ {
		cy := min(r.y1, float64(py+1)) - max(r.y0, float64(py))
		if cy <= 0 {
			continue
		}
		i := img.PixOffset(px0, py)
		row := img.Pix[i : i+4*(px1-px0) : i+4*(px1-px0)]
		n := px1 - px0
		blendPixel(row[:4], col, uint32(math.Round(cx0*cy*full)))
		if n > 1 {
			blendPixel(row[4*(n-1):], col, uint32(math.Round(cx1*cy*full)))
		}
		if n > 2 {
			inner := row[4 : 4*(n-1)]
			ma := uint32(math.Round(cy * full))
			if ma >= full {
				for k := 0; k < len(inner); k += 4 {
					p := inner[k : k+4 : k+4]
					p[0], p[1], p[2], p[3] = col.R, col.G, col.B, 0xff
				}
				continue
			}
			for k := 0; k < len(inner); k += 4 {
				blendPixel(inner[k:k+4:k+4], col, ma)
			}
		}
	}
}

// blendPixel blends opaque colour col over pixel p (4 bytes RGBA) by
// coverage ma (0..0xffff), as the vector rasteriser's painter does.
func blendPixel(p []byte, col color.RGBA, ma uint32) {
	const full = 0xffff
	switch {
	case ma >= full:
		p[0], p[1], p[2], p[3] = col.R, col.G, col.B, 0xff
	case ma > 0:
		a := (full - ma) * 0x101
		p[0] = uint8((uint32(p[0])*a + uint32(col.R)*0x101*ma) / full >> 8)
		p[1] = uint8((uint32(p[1])*a + uint32(col.G)*0x101*ma) / full >> 8)
		p[2] = uint8((uint32(p[2])*a + uint32(col.B)*0x101*ma) / full >> 8)
		p[3] = uint8((uint32(p[3])*a + full*ma) / full >> 8)
	}
}
