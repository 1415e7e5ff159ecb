package report

import (
	"bytes"
	"compress/flate"
	"encoding/binary"
	"hash/adler32"
	"hash/crc32"
	"image"
	"image/png"
	"io"
	"runtime"
	"sync"
	"sync/atomic"
)

// pngBands is how many bands of rows a picture is filtered and compressed
// in, side by side. It is fixed, not the number of processors, so that a
// picture has the same bytes on every machine.
const pngBands = 8

// encodePNG writes img as a PNG file. An opaque picture (every chart: the
// canvas starts white and everything is drawn over it) is written as 8-bit
// RGB, its rows in pngBands bands each filtered and deflated (at the
// fastest level), the bands side by side, the bands' deflate streams joined
// at byte-aligned flush points into the one zlib stream of the file, as
// parallel compressors do. Any other picture goes to image/png.
func encodePNG(b *bytes.Buffer, img *image.RGBA) error {
	r := img.Bounds()
	w, h := r.Dx(), r.Dy()
	bands := min(pngBands, h)
	fallback := func() error {
		enc := png.Encoder{CompressionLevel: png.BestSpeed}
		return enc.Encode(b, img)
	}
	if w == 0 || h == 0 {
		return fallback()
	}
	type band struct {
		data  bytes.Buffer // deflated
		sum   uint32       // Adler-32 of the filtered rows
		n     int          // bytes of filtered rows
		err   error
		clear bool // a pixel is not opaque
	}
	out := make([]band, bands)
	// encodeBand filters and deflates band k with fw.
	encodeBand := func(k int, fw *flate.Writer) {
		y0, y1 := k*h/bands, (k+1)*h/bands
		bd := &out[k]
		fw.Reset(&bd.data)
		ad := adler32.New()
		rowLen := 1 + 3*w
		prev, cur := make([]byte, rowLen), make([]byte, rowLen)
		up, sub := make([]byte, rowLen), make([]byte, rowLen)
		if y0 > 0 {
			rgbRow(prev, img, y0-1)
		}
		for y := y0; y < y1; y++ {
			if !rgbRow(cur, img, y) {
				bd.clear = true
				return
			}
			row := filterRow(cur, prev, up, sub)
			ad.Write(row)
			if _, err := fw.Write(row); err != nil {
				bd.err = err
				return
			}
			bd.n += len(row)
			prev, cur = cur, prev
		}
		if k == bands-1 {
			bd.err = fw.Close()
		} else {
			bd.err = fw.Flush()
		}
		bd.sum = ad.Sum32()
	}
	// One worker per processor takes the bands in turn, each with one
	// deflate writer (a writer is over half a megabyte to make).
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), bands) {
		wg.Go(func() {
			fw, err := newDeflater()
			if err == nil {
				defer deflaters.Put(fw)
			}
			for {
				k := int(next.Add(1) - 1)
				if k >= bands {
					return
				}
				if err != nil {
					out[k].err = err
					continue
				}
				encodeBand(k, fw)
			}
		})
	}
	wg.Wait()
	size := 0
	for k := range out {
		if out[k].clear {
			return fallback()
		}
		size += out[k].data.Len() + 12
	}
	b.Grow(size + 64)
	b.WriteString("\x89PNG\r\n\x1a\n")
	var ihdr [13]byte
	binary.BigEndian.PutUint32(ihdr[0:4], uint32(w))
	binary.BigEndian.PutUint32(ihdr[4:8], uint32(h))
	ihdr[8], ihdr[9] = 8, 2 // 8 bits per sample, truecolour
	writeChunk(b, "IHDR", ihdr[:])
	// The zlib header of the fastest level: 32 KB window, deflate.
	writeChunk(b, "IDAT", []byte{0x78, 0x01})
	sum := uint32(1)
	for k := range out {
		if out[k].err != nil {
			return out[k].err
		}
		writeChunk(b, "IDAT", out[k].data.Bytes())
		sum = adler32Combine(sum, out[k].sum, out[k].n)
	}
	var tail [4]byte
	binary.BigEndian.PutUint32(tail[:], sum)
	writeChunk(b, "IDAT", tail[:])
	writeChunk(b, "IEND", nil)
	return nil
}

// deflaters keeps the deflate writers of finished pictures for the next.
var deflaters sync.Pool

// newDeflater is a deflate writer at the fastest level (to be Reset to
// its output).
func newDeflater() (*flate.Writer, error) {
	if fw, ok := deflaters.Get().(*flate.Writer); ok {
		return fw, nil
	}
	return flate.NewWriter(io.Discard, flate.BestSpeed)
}

// rgbRow puts row y of img into dst as a PNG scanline of RGB samples,
// dst[0] left for the filter type, and reports whether the row is opaque.
func rgbRow(dst []byte, img *image.RGBA, y int) bool {
	r := img.Bounds()
	i := img.PixOffset(r.Min.X, y)
	src := img.Pix[i : i+4*r.Dx()]
	d := dst[1:]
	opaque := true
	for x, j := 0, 0; x < len(src); x, j = x+4, j+3 {
		d[j], d[j+1], d[j+2] = src[x], src[x+1], src[x+2]
		opaque = opaque && src[x+3] == 0xff
	}
	return opaque
}

// PNG filter types (PNG specification, section 9.2).
const (
	pngFilterNone = 0
	pngFilterSub  = 1
	pngFilterUp   = 2
)

// filterRow returns scanline cur (RGB samples after the type byte)
// filtered against the previous scanline prev: by Up, None or Sub,
// whichever has the smallest sum of absolute differences (the heuristic
// of the PNG specification, section 12.8, over three of its filters), the
// first of them on a tie. A row equal to the one above (most of a chart)
// is all zeros by Up.
func filterRow(cur, prev, up, sub []byte) []byte {
	const bpp = 3
	c := cur[1:]
	p, u, s := prev[1:len(c)+1], up[1:len(c)+1], sub[1:len(c)+1]
	up[0], cur[0], sub[0] = pngFilterUp, pngFilterNone, pngFilterSub
	if bytes.Equal(c, p) {
		clear(u)
		return up
	}
	best, row := 0, up
	for i := range c {
		u[i] = c[i] - p[i]
		best += abs8(u[i])
	}
	sum := 0
	for _, v := range c {
		if sum += abs8(v); sum >= best {
			break
		}
	}
	if sum < best {
		best, row = sum, cur
	}
	sum = 0
	copy(s[:bpp], c[:bpp])
	for i := bpp; i < len(c) && sum < best; i++ {
		s[i] = c[i] - c[i-bpp]
		sum += abs8(s[i])
	}
	for _, v := range s[:bpp] {
		sum += abs8(v)
	}
	if sum < best {
		row = sub
	}
	return row
}

// abs8 is the size of a filtered byte read as a signed difference.
func abs8(d uint8) int {
	v := int(int8(d))
	m := v >> 63
	return (v ^ m) - m
}

// writeChunk appends a PNG chunk: length, type, data, CRC-32 of type and
// data.
func writeChunk(b *bytes.Buffer, kind string, data []byte) {
	var n [4]byte
	binary.BigEndian.PutUint32(n[:], uint32(len(data)))
	b.Write(n[:])
	b.WriteString(kind)
	b.Write(data)
	crc := crc32.NewIEEE()
	crc.Write([]byte(kind))
	crc.Write(data)
	binary.BigEndian.PutUint32(n[:], crc.Sum32())
	b.Write(n[:])
}

// adler32Combine is the Adler-32 of two pieces of data joined, from the
// sums a1 of the first and a2 of the second, n bytes long (the
// combination zlib's adler32_combine makes).
func adler32Combine(a1, a2 uint32, n int) uint32 {
	const base = 65521
	rem := uint32(n % base)
	s1 := a1 & 0xffff
	s2 := uint32((uint64(rem) * uint64(s1)) % base)
	s1 += (a2 & 0xffff) + base - 1
	s2 += (a1 >> 16) + (a2 >> 16) + base - rem
	if s1 >= base {
		s1 -= base
	}
	if s1 >= base {
		s1 -= base
	}
	if s2 >= 2*base {
		s2 -= 2 * base
	}
	if s2 >= base {
		s2 -= base
	}
	return s1 | s2<<16
}
