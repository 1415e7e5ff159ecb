package report

import (
	"io"
	"runtime"
	"sync"
	"sync/atomic"

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
}

// exportBlockRecords is about how many records a block holds (a block is
// whole grid rows: at least one row).
const exportBlockRecords = 512

// exportBlocks cuts the inside points of the maps into blocks, in the
// order of EachRecord.
func exportBlocks(maps []*envelope.Map) []exportBlock {
	var out []exportBlock
	for _, m := range maps {
		g := m.Grid
		i0, n := 0, 0
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if g.Inside(i, j) {
					n++
				}
			}
			if n >= exportBlockRecords {
				out = append(out, exportBlock{m, i0, i + 1})
				i0, n = i+1, 0
			}
		}
		if n > 0 {
			out = append(out, exportBlock{m, i0, g.Rows()})
		}
	}
	return out
}

// exportRow appends one record, formatting its numbers through memo (one
// entry per column).
type exportRow func(b []byte, r *ExportRecord, memo []numMemo) []byte

// appendBlock appends the records of block bl to b, each formatted by
// row.
func appendBlock(b []byte, bl exportBlock, row exportRow) ([]byte, error) {
	g := bl.m.Grid
	var r ExportRecord
	memo := make([]numMemo, len(exportCSV.cols))
	k := newRecordMaker(bl.m)
	for i := bl.i0; i < bl.i1; i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			if err := k.record(&r, i, j); err != nil {
				return b, err
			}
			b = row(b, &r, memo)
		}
	}
	return b, nil
}

// writeBlocks formats the blocks with row on up to GOMAXPROCS goroutines
// and passes each block's bytes to emit in block order. It stops at the
// first error, of a record or of emit, and returns it once every
// goroutine it started has ended.
func writeBlocks(blocks []exportBlock, row exportRow, emit func([]byte) error) error {
	workers := min(runtime.GOMAXPROCS(0), len(blocks))
	if workers <= 1 {
		var buf []byte
		for _, bl := range blocks {
			var err error
			if buf, err = appendBlock(buf[:0], bl, row); err != nil {
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
				buf, err := appendBlock(buf[:0], blocks[k], row)
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
