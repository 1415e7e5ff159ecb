package report

import (
	"image"
	"image/color"
	"math/rand/v2"
	"testing"

	"git.sr.ht/~sbinet/gg"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// TestFillRectAsVector: rectangles painted by fillRect, overlapping, at
// fractional corners, look as the same rectangles filled as paths by the
// vector rasteriser the PNG charts use (within 2/255 a channel: it
// measures coverage in steps of 1/256), and painting in bands of rows
// gives the same picture as painting it whole.
func TestFillRectAsVector(t *testing.T) {
	const w, h = 48, 40
	rng := rand.New(rand.NewPCG(5, 6))
	vec := image.NewRGBA(image.Rect(0, 0, w, h))
	whole := image.NewRGBA(vec.Rect)
	banded := image.NewRGBA(vec.Rect)
	for _, img := range []*image.RGBA{vec, whole, banded} {
		for k := range img.Pix {
			img.Pix[k] = 0xff
		}
	}
	gc := gg.NewContextForRGBA(vec)
	palette := []color.RGBA{{0x3e, 0x9e, 0x5a, 0xff}, {0xd1, 0x9a, 0x1e, 0xff}, {0x4f, 0x86, 0xc9, 0xff}, {0xc2, 0x4a, 0x3a, 0xff}}
	snap := func(v float64) float64 { return float64(int(v*64)) / 64 }
	for k := range 60 {
		x0, y0 := snap(rng.Float64()*(w-2)), snap(rng.Float64()*(h-2))
		r := pixelRect{x0: x0, y0: y0, x1: snap(x0 + 0.2 + rng.Float64()*12), y1: snap(y0 + 0.2 + rng.Float64()*9)}
		if k%10 == 0 { // thinner than a pixel, inside one
			r.x1, r.y1 = r.x0+0.25, r.y0+0.5
		}
		col := palette[k%len(palette)]
		gc.SetColor(col)
		gc.MoveTo(r.x0, r.y0)
		gc.LineTo(r.x1, r.y0)
		gc.LineTo(r.x1, r.y1)
		gc.LineTo(r.x0, r.y1)
		gc.ClosePath()
		gc.Fill()
		fillRect(whole, r, col, 0, h)
		for band := 0; band < h; band += 7 {
			fillRect(banded, r, col, band, band+7)
		}
	}
	worst := 0
	for k := range vec.Pix {
		d := int(vec.Pix[k]) - int(whole.Pix[k])
		worst = max(worst, d, -d)
		if whole.Pix[k] != banded.Pix[k] {
			t.Fatalf("byte %d: banded %d, whole %d", k, banded.Pix[k], whole.Pix[k])
		}
	}
	if worst > 2 {
		t.Errorf("fillRect differs from the vector fill by up to %d/255 a channel, want at most 2", worst)
	}
	t.Logf("largest difference from the vector fill: %d/255", worst)
}

// TestTransformsAsPlot: the written-out linear transforms give the plot's
// own values bit for bit, and a log axis keeps the plot's transform.
func TestTransformsAsPlot(t *testing.T) {
	p := plot.New()
	p.X.Min, p.X.Max = -0.3, 4.7
	p.Y.Min, p.Y.Max = 3, 9.25
	c := draw.Canvas{Rectangle: vg.Rectangle{Min: vg.Point{X: 31.5, Y: 12.25}, Max: vg.Point{X: 700.1, Y: 433}}}
	for _, logY := range []bool{false, true} {
		if logY {
			p.Y.Min, p.Y.Max, p.Y.Scale = 10, 1e7, plot.LogScale{}
		}
		wx, wy := p.Transforms(&c)
		gx, gy := transforms(&c, p)
		for _, v := range []float64{0.1, 1.0 / 3, 2.5, 4.7, 9.25, 11, 1e3, 1e7} {
			if gx(v) != wx(v) {
				t.Errorf("x(%g) = %v, plot's %v", v, gx(v), wx(v))
			}
			if gy(v) != wy(v) {
				t.Errorf("log %v: y(%g) = %v, plot's %v", logY, v, gy(v), wy(v))
			}
		}
	}
}
