package report

import (
	"bytes"
	"errors"
	"runtime"
	"testing"
	"time"
	"unsafe"

	"likewind/envelope"
)

// TestExportBlocksOrder: the blocks cover every inside point once, map by
// map and row by row, as EachRecord visits them.
func TestExportBlocksOrder(t *testing.T) {
	e := evalDemoGrid(t, 0, 60, 70, nil)
	bl := exportBlocks(e.Maps)
	if len(bl) < 2*len(e.Maps) {
		t.Fatalf("%d blocks for %d maps of %d inside points, want several per map", len(bl), len(e.Maps), e.Grid.InsideCount())
	}
	n := 0
	for k, b := range bl {
		if k > 0 && bl[k-1].m == b.m && bl[k-1].i1 != b.i0 {
			t.Fatalf("block %d starts at row %d, the one before ends at %d", k, b.i0, bl[k-1].i1)
		}
		for i := b.i0; i < b.i1; i++ {
			for j := 0; j < b.m.Grid.Cols(); j++ {
				if b.m.Grid.Inside(i, j) {
					n++
				}
			}
		}
	}
	if want := e.Grid.InsideCount() * len(e.Maps); n != want {
		t.Errorf("blocks hold %d points, want %d (inside points × maps)", n, want)
	}
}

// TestExportSameOnOneCore: the exports are the same bytes made on one
// goroutine or on several.
func TestExportSameOnOneCore(t *testing.T) {
	e := evalDemoGrid(t, 1, 50, 60, nil)
	write := func(format string) []byte {
		var b bytes.Buffer
		if err := writeExport(&b, e, format); err != nil {
			t.Fatal(err)
		}
		return b.Bytes()
	}
	for _, format := range []string{"csv", "json"} {
		prev := runtime.GOMAXPROCS(1)
		one := write(format)
		runtime.GOMAXPROCS(max(prev, 3))
		many := write(format)
		runtime.GOMAXPROCS(prev)
		if !bytes.Equal(one, many) {
			t.Errorf("%s export differs between one goroutine (%d bytes) and several (%d bytes)", format, len(one), len(many))
		}
	}
}

// failAfter is a writer that fails once it has taken n bytes.
type failAfter struct{ n int }

var errFull = errors.New("disk full (test)")

func (f *failAfter) Write(p []byte) (int, error) {
	if len(p) > f.n {
		k := f.n
		f.n = 0
		return k, errFull
	}
	f.n -= len(p)
	return len(p), nil
}

// goroutinesAbove is how many more goroutines than n run, given a second
// to end: a goroutine that has signalled its WaitGroup may not have
// returned yet.
func goroutinesAbove(n int) int {
	for range 100 {
		if runtime.NumGoroutine() <= n {
			return 0
		}
		time.Sleep(10 * time.Millisecond)
	}
	return runtime.NumGoroutine() - n
}

// TestExportWriteError: a failing writer stops the export with its error,
// on one goroutine or several, at the start or part way.
func TestExportWriteError(t *testing.T) {
	e := evalDemoGrid(t, 0, 60, 70, nil)
	for _, procs := range []int{1, 3} {
		prev := runtime.GOMAXPROCS(procs)
		for _, format := range []string{"csv", "json"} {
			for _, n := range []int{0, 100, 200000} {
				before := runtime.NumGoroutine()
				err := writeExport(&failAfter{n}, e, format)
				if !errors.Is(err, errFull) {
					t.Errorf("%s export, %d goroutines, writer failing after %d bytes = %v, want the write error", format, procs, n, err)
				}
				if n := goroutinesAbove(before); n > 0 {
					t.Errorf("%s export left %d goroutines running", format, n)
				}
			}
		}
		runtime.GOMAXPROCS(prev)
	}
}

// TestExportPointTextSame: maps that share a grid share the text of their
// point fields, and the export is the same bytes as with every record
// formatted on its own, with the maps of two grids interleaved, on one
// goroutine or several.
func TestExportPointTextSame(t *testing.T) {
	a, b := evalDemoGrid(t, 0, 50, 60, nil), evalDemoGrid(t, 1, 40, 30, nil)
	maps := []*envelope.Map{a.Maps[0], b.Maps[0], a.Maps[1], b.Maps[1], a.Maps[2]}
	shared := exportBlocks(maps)
	alone := make([]exportBlock, len(shared))
	texts := map[*pointText]*envelope.Grid{}
	for k, bl := range shared {
		if bl.pt == nil {
			t.Fatalf("block %d (rows %d..%d) has no point text; every grid here has two maps or more", k, bl.i0, bl.i1)
		}
		if g, ok := texts[bl.pt]; ok && g != bl.m.Grid {
			t.Fatalf("block %d shares its point text with a block of another grid", k)
		}
		texts[bl.pt] = bl.m.Grid
		alone[k] = bl
		alone[k].pt = nil
	}
	if want := len(shared) / 2; len(texts) > want+1 {
		t.Errorf("%d point texts for %d blocks of five maps on two grids, want about %d", len(texts), len(shared), want)
	}
	formats := map[string]exportFormat{
		"csv":  {exportCSV.appendRow, exportCSV.cols},
		"json": {exportJSON.appendRecord, exportJSON.cols},
	}
	for name, f := range formats {
		for _, procs := range []int{1, 3} {
			prev := runtime.GOMAXPROCS(procs)
			var got, want bytes.Buffer
			if err := writeBlocks(exportBlocks(maps), f, writeAll(&got)); err != nil {
				t.Fatal(err)
			}
			if err := writeBlocks(alone, f, writeAll(&want)); err != nil {
				t.Fatal(err)
			}
			runtime.GOMAXPROCS(prev)
			if !bytes.Equal(got.Bytes(), want.Bytes()) {
				t.Errorf("%s on %d goroutines: %d bytes with shared point text, %d with each record formatted alone", name, procs, got.Len(), want.Len())
			}
		}
	}
}

// TestPointFieldsAreFlight: every point field is one setFlight writes
// (from the grid and the flight side only, so it is the same in every
// map on the grid).
func TestPointFieldsAreFlight(t *testing.T) {
	e := evalDemoGrid(t, 0, 20, 20, nil)
	g := e.Grid
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			fd, err := g.FlightDetail(i, j)
			if err != nil {
				t.Fatal(err)
			}
			const sentinel = Num(-12345.5)
			var r ExportRecord
			p := unsafe.Pointer(&r)
			for _, off := range pointFields {
				*(*Num)(unsafe.Add(p, off)) = sentinel
			}
			r.setFlight(g, &fd)
			for k, off := range pointFields {
				if *(*Num)(unsafe.Add(p, off)) == sentinel {
					t.Errorf("point field %d (offset %d) is not written by setFlight", k, off)
				}
			}
			return
		}
	}
	t.Fatal("no inside point")
}
