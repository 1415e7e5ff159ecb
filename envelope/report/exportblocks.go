package report

import (
	"fmt"
	"io"
	"math"
	"reflect"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"
	"unsafe"

	"likewind/envelope"
)

// exportJSON is the export's JSON record table, derived once from
// ExportRecord's JSON tags (never changed after initialisation).
var exportJSON = newJSONTable[ExportRecord]()

// exportBlock is a run of grid rows i0..i1-1 of one map whose records are
// formatted together, by one goroutine into one buffer.
type exportBlock struct {
	m      *envelope.Map
	i0, i1 int
	// pt is the text of the point fields over the block's rows, shared
	// by the blocks of every map on the grid over the same rows; nil
	// where the map is the only one on its grid.
	pt *pointText
}

// exportBlockRecords is about how many records a block holds (a block is
// whole grid rows: at least one row).
const exportBlockRecords = 512

// exportBlocks cuts the inside points of the maps into blocks, in the
// order of EachRecord. Maps on one grid are cut alike, so that their
// blocks over the same rows share one pointText.
func exportBlocks(maps []*envelope.Map) []exportBlock {
	onGrid := map[*envelope.Grid]int{}
	for _, m := range maps {
		onGrid[m.Grid]++
	}
	texts := map[*envelope.Grid][]*pointText{}
	var out []exportBlock
	for _, m := range maps {
		cuts := rowCuts(m.Grid)
		pts, ok := texts[m.Grid]
		if !ok && onGrid[m.Grid] > 1 {
			pts = make([]*pointText, len(cuts))
			for k := range pts {
				pts[k] = new(pointText)
			}
			texts[m.Grid] = pts
		}
		for k, c := range cuts {
			bl := exportBlock{m: m, i0: c[0], i1: c[1]}
			if pts != nil {
				bl.pt = pts[k]
			}
			out = append(out, bl)
		}
	}
	return out
}

// rowCuts cuts the rows of g into runs of whole rows holding about
// exportBlockRecords inside points each (the last may hold fewer).
func rowCuts(g *envelope.Grid) [][2]int {
	var out [][2]int
	i0, n := 0, 0
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				n++
			}
		}
		if n >= exportBlockRecords {
			out = append(out, [2]int{i0, i + 1})
			i0, n = i+1, 0
		}
	}
	if n > 0 {
		out = append(out, [2]int{i0, g.Rows()})
	}
	return out
}

// pointFields are the byte offsets in ExportRecord of its point fields:
// the Num fields that differ from grid point to grid point and are the
// same in every map on the grid (setFlight writes them). Of the flight
// side only these change along a grid row, so the per-column memo (which
// keeps the altitude's columns) misses them at every record: they were
// two thirds of the numbers the CSV export of the six demo facilities
// formatted, six times each (once per map). pointText formats them once
// per point for all the maps on the grid (BenchmarkExportCSV400).
var pointFields = exportNumFields("GridSpeed", "Mach", "TAS", "EAS", "CAS", "Q", "Reynolds", "ReynoldsPerM", "FlightT0", "FlightP0")

// exportNumFields are the offsets of the named Num fields of ExportRecord,
// in field order; a name that is not one panics (at initialisation, which
// the tests run).
func exportNumFields(names ...string) []uintptr {
	rt := reflect.TypeFor[ExportRecord]()
	want := map[string]bool{}
	for _, n := range names {
		if f, ok := rt.FieldByName(n); !ok || f.Type != numType {
			panic(fmt.Sprintf("report: %s is not a Num field of ExportRecord", n))
		}
		want[n] = true
	}
	var out []uintptr
	for k := range rt.NumField() {
		if f := rt.Field(k); want[f.Name] {
			out = append(out, f.Offset)
		}
	}
	return out
}

// pointText is the text of the point fields of the inside points of one
// run of rows of a grid, made by the first block over those rows that
// needs it: for each inside point in block order, for each point field in
// field order, the length of its shortest form (one byte; 0 where the
// value is not a finite number) and the form. It holds about 190 bytes
// per inside point, as long as the export runs.
type pointText struct {
	once sync.Once
	text []byte
	ok   bool // false: a point's flight side failed (its record reports it)
}

// build formats the point fields of rows i0..i1-1 of g.
func (pt *pointText) build(g *envelope.Grid, i0, i1 int) {
	var r ExportRecord
	p := unsafe.Pointer(&r)
	// Room for the block's text at once (a number takes up to 25 bytes
	// with its length, 17 or so on the demo), not regrown from empty.
	n := 0
	for i := i0; i < i1; i++ {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				n++
			}
		}
	}
	b := make([]byte, 0, n*len(pointFields)*20)
	for i := i0; i < i1; i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			fd, err := g.FlightDetail(i, j)
			if err != nil {
				return
			}
			r.setFlight(g, &fd)
			for _, off := range pointFields {
				x := *(*Num)(unsafe.Add(p, off))
				n := len(b)
				b = append(b, 0)
				if x.Valid() {
					b = strconv.AppendFloat(b, float64(x), 'g', -1, 64)
					b[n] = byte(len(b) - n - 1)
				}
			}
		}
	}
	pt.text, pt.ok = b, true
}

// exportFormat formats the records of an export: row appends one record
// through memo (one entry per column of table cols, whose point fields
// appendBlock fills in from the block's pointText).
type exportFormat struct {
	row  func(b []byte, r *ExportRecord, memo []numMemo) []byte
	cols []cell
}

// appendBlock appends the records of block bl to b, each formatted by f.
func appendBlock(b []byte, bl exportBlock, f exportFormat) ([]byte, error) {
	g := bl.m.Grid
	var r ExportRecord
	memo := make([]numMemo, len(f.cols))
	var point []int // memo entries of the point fields, in field order
	var text []byte
	if bl.pt != nil {
		bl.pt.once.Do(func() { bl.pt.build(g, bl.i0, bl.i1) })
		if bl.pt.ok {
			point, text = pointColumns(f.cols), bl.pt.text
		}
	}
	p := unsafe.Pointer(&r)
	k := newRecordMaker(bl.m)
	for i := bl.i0; i < bl.i1; i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			if err := k.record(&r, i, j); err != nil {
				return b, err
			}
			// The memo of a point field is given the text made once for
			// every map, so the row copies it instead of formatting.
			for _, c := range point {
				n := int(text[0])
				if n > 0 {
					m := &memo[c]
					m.bits = math.Float64bits(float64(*(*Num)(unsafe.Add(p, f.cols[c].off))))
					m.set, m.n = true, uint8(copy(m.b[:], text[1:1+n]))
				}
				text = text[1+n:]
			}
			b = f.row(b, &r, memo)
		}
	}
	return b, nil
}

// pointColumns are the positions in cols of the point fields, in field
// order.
func pointColumns(cols []cell) []int {
	var out []int
	for _, off := range pointFields {
		for k, c := range cols {
			if c.kind == cellNum && c.off == off {
				out = append(out, k)
			}
		}
	}
	return out
}

// writeBlocks formats the blocks with f on up to GOMAXPROCS goroutines
// and passes each block's bytes to emit in block order. It stops at the
// first error, of a record or of emit, and returns it once every
// goroutine it started has ended.
func writeBlocks(blocks []exportBlock, f exportFormat, emit func([]byte) error) error {
	workers := min(runtime.GOMAXPROCS(0), len(blocks))
	if workers <= 1 {
		var buf []byte
		for _, bl := range blocks {
			var err error
			if buf, err = appendBlock(buf[:0], bl, f); err != nil {
				return err
			}
			if err := emit(buf); err != nil {
				return err
			}
		}
		return nil
	}
	type done struct {
		buf []byte
		err error
	}
	results := make([]chan done, len(blocks))
	for k := range results {
		results[k] = make(chan done, 1)
	}
	// A goroutine takes a buffer before it takes the next block, so that
	// at most cap(free) blocks are in memory and the lowest block not yet
	// written is always being formatted or done.
	free := make(chan []byte, 2*workers)
	for range cap(free) {
		free <- nil
	}
	stop := make(chan struct{})
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for {
				var buf []byte
				select {
				case buf = <-free:
				case <-stop:
					return
				}
				select {
				case <-stop:
					return
				default:
				}
				k := int(next.Add(1) - 1)
				if k >= len(blocks) {
					return
				}
				buf, err := appendBlock(buf[:0], blocks[k], f)
				results[k] <- done{buf, err}
				if err != nil {
					return
				}
			}
		})
	}
	var err error
	for k := range blocks {
		d := <-results[k]
		if err = d.err; err == nil {
			err = emit(d.buf)
		}
		if err != nil {
			break
		}
		free <- d.buf
	}
	close(stop)
	wg.Wait()
	return err
}

// writeAll is emit for writing each block to w.
func writeAll(w io.Writer) func([]byte) error {
	return func(b []byte) error {
		_, err := w.Write(b)
		return err
	}
}
