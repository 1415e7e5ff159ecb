package report

import (
	"bytes"
	"hash/adler32"
	"image"
	"image/color"
	"image/draw"
	"image/png"
	"math/rand/v2"
	"os"
	"testing"
)

// TestAdler32Combine: the sum of two pieces combined is the sum of the
// whole (hash/adler32), for pieces of many lengths, including longer
// than the modulus 65521 and empty.
func TestAdler32Combine(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	data := make([]byte, 200000)
	for k := range data {
		data[k] = byte(rng.IntN(256))
	}
	for _, cut := range [][2]int{{0, 0}, {0, 10}, {10, 0}, {1, 1}, {5000, 65521}, {65521, 65522}, {70000, 130000}, {199999, 1}} {
		a, b := data[:cut[0]], data[cut[0]:cut[0]+cut[1]]
		whole := adler32.Checksum(data[:cut[0]+cut[1]])
		if got := adler32Combine(adler32.Checksum(a), adler32.Checksum(b), len(b)); got != whole {
			t.Errorf("pieces %d + %d: combined %08x, want %08x", len(a), len(b), got, whole)
		}
	}
}

// testPicture is an opaque w × h picture of flat areas, gradients and
// noise (every filter choice happens), or with one pixel not opaque.
func testPicture(w, h int, clear bool) *image.RGBA {
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	rng := rand.New(rand.NewPCG(3, 4))
	for y := range h {
		for x := range w {
			c := color.RGBA{0xff, 0xff, 0xff, 0xff}
			switch {
			case x < w/3:
				c = color.RGBA{0x3e, 0x9e, 0x5a, 0xff}
			case x < 2*w/3:
				c = color.RGBA{uint8(x), uint8(y), uint8(x + y), 0xff}
			case y%7 != 0:
				c = color.RGBA{uint8(rng.IntN(256)), uint8(rng.IntN(256)), uint8(rng.IntN(256)), 0xff}
			}
			img.SetRGBA(x, y, c)
		}
	}
	if clear {
		img.SetRGBA(w/2, h/2, color.RGBA{}) // transparent: exact in either colour model
	}
	return img
}

// TestEncodePNG: the file decodes (image/png checks every chunk's CRC and
// the zlib stream's Adler-32) to the same pixels, for pictures of fewer
// rows than bands and more, and a picture with a pixel not opaque (written
// by image/png, with its alpha).
func TestEncodePNG(t *testing.T) {
	for _, c := range []struct {
		w, h  int
		clear bool
	}{{1, 1, false}, {5, 3, false}, {64, 9, false}, {301, 257, false}, {40, 30, true}} {
		img := testPicture(c.w, c.h, c.clear)
		var b bytes.Buffer
		if err := encodePNG(&b, img); err != nil {
			t.Fatalf("%d×%d: %v", c.w, c.h, err)
		}
		got, err := png.Decode(&b)
		if err != nil {
			t.Fatalf("%d×%d: decode: %v", c.w, c.h, err)
		}
		if got.Bounds() != img.Bounds() {
			t.Fatalf("%d×%d: decoded %v", c.w, c.h, got.Bounds())
		}
		for y := range c.h {
			for x := range c.w {
				want := img.RGBAAt(x, y)
				if g := color.RGBAModel.Convert(got.At(x, y)).(color.RGBA); g != want {
					t.Fatalf("%d×%d: pixel (%d, %d) = %v, want %v", c.w, c.h, x, y, g, want)
				}
			}
		}
	}
}

// TestEncodePNGBytesFixed: the bytes do not depend on timing (the bands
// are fixed, not the number of processors): two encodings are equal.
func TestEncodePNGBytesFixed(t *testing.T) {
	img := testPicture(200, 100, false)
	var a, b bytes.Buffer
	if err := encodePNG(&a, img); err != nil {
		t.Fatal(err)
	}
	if err := encodePNG(&b, img); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("two encodings of one picture differ")
	}
}

// BenchmarkEncodePNG writes the demo's recorded Reynolds–Mach picture
// (testdata/golden) with encodePNG, and with image/png at its fastest
// level for comparison.
func BenchmarkEncodePNG(b *testing.B) {
	data, err := os.ReadFile(goldenPath("chart_remach.png"))
	if err != nil {
		b.Fatal(err)
	}
	m, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		b.Fatal(err)
	}
	img := image.NewRGBA(m.Bounds())
	draw.Draw(img, img.Rect, m, image.Point{}, draw.Src)
	b.SetBytes(int64(len(img.Pix)))
	for _, c := range []struct {
		name string
		enc  func(*bytes.Buffer) error
	}{
		{"bands", func(buf *bytes.Buffer) error { return encodePNG(buf, img) }},
		{"image-png", func(buf *bytes.Buffer) error {
			return (&png.Encoder{CompressionLevel: png.BestSpeed}).Encode(buf, img)
		}},
	} {
		b.Run(c.name, func(b *testing.B) {
			var buf bytes.Buffer
			for b.Loop() {
				buf.Reset()
				if err := c.enc(&buf); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(buf.Len()), "file-B")
		})
	}
}
