package envelope

import (
	"context"
	"errors"
	"fmt"
	"math"
	"reflect"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"

	"likewind/atmos"
)

// gridAxisCap bounds the number of points on one grid axis built by
// NewGrid, so that a mistyped step cannot exhaust memory. (Files are held to
// the tighter MaxAxisPoints when loaded.)
const gridAxisCap = 4001

// gridDefaultPoints is the number of points NewGrid puts on an axis that
// gives neither a step nor a count (the loader normally fills these in).
const gridDefaultPoints = 41

// gridEdgeTol is the relative tolerance with which points on the envelope
// boundary or on a limit line count as inside.
const gridEdgeTol = 1e-9

// Exclusion says why a grid point is outside the envelope, or that it is
// inside.
type Exclusion uint8

// Reasons a grid point lies outside the envelope, checked in this order.
const (
	InEnvelope      Exclusion = iota // inside the boundary and every limit line
	AboveCeiling                     // above Limits.Ceiling
	OutsideBoundary                  // outside the boundary polygon
	AboveMaxMach                     // above Limits.MaxMach
	AboveMaxEAS                      // above Limits.MaxEAS
	AboveMaxCAS                      // above Limits.MaxCAS
	AboveMaxQ                        // above Limits.MaxQ
	BelowMinSpeed                    // below Limits.MinSpeed
	NoFlow                           // zero speed: no Reynolds number to match
	SpeedUnusable                    // the grid speed has no airspeed equivalent at this altitude
)

var exclusionNames = [...]string{
	InEnvelope:      "inside envelope",
	AboveCeiling:    "above ceiling",
	OutsideBoundary: "outside boundary",
	AboveMaxMach:    "above Mach limit",
	AboveMaxEAS:     "above EAS limit",
	AboveMaxCAS:     "above CAS limit",
	AboveMaxQ:       "above dynamic-pressure limit",
	BelowMinSpeed:   "below minimum speed",
	NoFlow:          "zero speed",
	SpeedUnusable:   "speed not convertible",
}

// String returns the reason in plain words, e.g. "above EAS limit".
func (e Exclusion) String() string {
	if int(e) < len(exclusionNames) {
		return exclusionNames[e]
	}
	return fmt.Sprintf("Exclusion(%d)", int(e))
}

// FlightPoint is the flight side of one grid point as stored: single
// precision and one-byte regimes. Use Grid.FlightDetail for full precision.
// (The Mach layer and the Reynolds–Mach chart draw these stored values;
// see Result on why they stay single precision.)
type FlightPoint struct {
	Mach float32 // flight Mach number
	TAS  float32 // true airspeed, m/s
	Q    float32 // dynamic pressure, Pa
	Re   float32 // full-scale Reynolds number on Vehicle.RefLength
	Kn   float32 // Knudsen number on Vehicle.RefLength

	Speed       atmos.SpeedRegime
	Rarefaction atmos.RarefactionRegime
}

// FlightDetail is the flight side of one grid point at full precision.
type FlightDetail struct {
	Altitude  float64         // m, on the vehicle's altitude scale
	Speed     float64         // grid speed, in Grid.SpeedKind units
	State     atmos.State     // atmosphere at the altitude on the grid's day
	Airspeeds atmos.Airspeeds // the grid speed in all four forms

	Q      float64 // dynamic pressure ½ρV², Pa
	Re     float64 // Reynolds number on Vehicle.RefLength
	RePerM float64 // unit Reynolds number, 1/m
	Kn     float64 // Knudsen number on Vehicle.RefLength
	T0     float64 // flight stagnation temperature T(1+(γ−1)M²/2), K
	P0     float64 // flight stagnation pressure (isentropic), Pa

	SpeedRegime atmos.SpeedRegime
	Rarefaction atmos.RarefactionRegime

	Inside    bool
	Exclusion Exclusion
}

// flightRec is the stored flight side of one point: 32 bytes. Mach and
// Reynolds numbers, the inputs of every facility solve, keep full
// precision so that a point's class and its detail always agree.
type flightRec struct {
	mach, re    float64
	tas, q, kn  float32
	speed, rare uint8
	excl        Exclusion
}

// Grid is the flight side of an envelope evaluated on an altitude × speed
// grid. Row i is altitude Alts[i], column j is speed Speeds[j]; rows run
// from the lowest altitude up. A Grid depends only on the vehicle and on the
// day (ΔT) and regime thresholds of the settings it was built with; facility
// what-ifs re-run Solve on the same Grid.
type Grid struct {
	Vehicle   *Vehicle
	Alts      []float64       // m, ascending, on Vehicle.AltitudeKind
	Speeds    []float64       // ascending, in SpeedKind units (Mach, or m/s)
	SpeedKind atmos.SpeedKind // kind of Speeds
	DeltaT    float64         // K, temperature offset of the day
	Regimes   atmos.Regimes   // thresholds the regimes were classified with

	rows    []atmos.State // atmosphere per row
	points  []flightRec   // per point, Index(i, j)
	inside  int
	maxMach float64 // highest inside flight Mach number (0 when none)
	// reused: points is an array handed in (NewGridReusing), cleared
	// point by point as it is filled; a new one is zero already.
	reused bool
	// top is, per row, the lowest column NewGridStaged evaluated before
	// the rest (rowTop).
	top []int
}

// NewGrid evaluates the flight side of vehicle v on its grid: the
// atmosphere once per altitude row, then per point the airspeeds, whether the
// point is inside the envelope, and for inside points Mach number, true
// airspeed, dynamic pressure, Reynolds and Knudsen numbers and the regimes.
//
// A point is inside when its speed, converted to the boundary's kind at
// that altitude, lies within the boundary polygon (edges included), and each
// limit line holds in its own kind. Since every speed kind increases with
// every other at a fixed altitude, NewGrid converts the few boundary
// crossings and limit lines of each row to the grid's kind instead of
// converting every point; the answer is the same. Settings supply the day (DeltaT) and the
// regime thresholds (zero Regimes means atmos.DefaultRegimes).
func NewGrid(v *Vehicle, s Settings) (*Grid, error) {
	return NewGridReusing(context.Background(), v, s, nil)
}

// NewGridReusing is NewGrid keeping the points in the array of old when
// it holds enough (every point is written), so that an interface making
// grid after grid need not allocate, clear and collect a new one each
// time. old must not be used by anything else any more (nil: a new array).
// When ctx ends first (a newer what-if made this grid stale) it stops
// between blocks of rows and returns ctx's error.
func NewGridReusing(ctx context.Context, v *Vehicle, s Settings, old *Grid) (*Grid, error) {
	g, err := newGrid(v, s, old)
	if err != nil {
		return nil, err
	}
	if err := g.evalWhole(ctx, s.DeltaT); err != nil {
		return nil, err
	}
	return g, nil
}

// evalWhole evaluates every point of the new grid g on the day dT.
func (g *Grid) evalWhole(ctx context.Context, dT float64) error {
	// Rows are independent: they are evaluated side by side in blocks,
	// each point written to its own slot, so the grid is the same as a
	// row-by-row evaluation. The first failing row (lowest index) is
	// reported.
	acc := rowsAcc{errRow: -1}
	if !forRowBlocksUntil(ctx, len(g.Alts), len(g.Speeds), func() func(i0, i1 int) {
		var spans []envSpan // scratch space of one worker
		return func(i0, i1 int) { g.evalRows(i0, i1, dT, &spans, &acc, wholeRow) }
	}) {
		return ctx.Err()
	}
	if err := acc.failed(g.Vehicle); err != nil {
		return err
	}
	g.inside, g.maxMach = acc.inside, acc.maxMach
	return nil
}

// NewGridStaged is NewGridReusing for a staged solve of window first
// (SolveStaged, SolveAllStaged): it evaluates first only what that solve
// needs before the rest, namely every row's atmosphere, the whole rows of
// the window, and in each other row its points from the fastest down to
// the first one inside the envelope (so the grid's highest inside Mach
// number, on which a fitted model scale depends, is known: every speed
// kind increases with Mach number along a row). It returns the grid and
// rest, which evaluates the other points. Until rest has returned nil
// the grid may be read, and solved, in the window's rows only, and its
// inside count is not final; rest may be called more than once (only the
// first call works) and may run while the window is read. With the
// window empty or the whole grid, the grid is whole at once.
func NewGridStaged(ctx context.Context, v *Vehicle, s Settings, old *Grid, first Window) (g *Grid, rest func() error, err error) {
	g, err = newGrid(v, s, old)
	if err != nil {
		return nil, nil, err
	}
	rows, cols := len(g.Alts), len(g.Speeds)
	first = first.Within(rows, cols)
	if !first.splits(rows, cols) {
		if err := g.evalWhole(ctx, s.DeltaT); err != nil {
			return nil, nil, err
		}
		return g, func() error { return nil }, nil
	}
	if cap(g.top) >= rows {
		g.top = g.top[:rows]
	} else {
		g.top = make([]int, rows)
	}
	size := rowBlockSize(rows)
	// Now the window's rows whole and every other row's top; the rest of
	// those rows (others) in rest.
	var others []block
	others = rowBlocks(others, Span{0, first.Rows.Lo}, Span{0, cols}, size)
	others = rowBlocks(others, Span{first.Rows.Hi, rows}, Span{0, cols}, size)
	now := rowBlocks(nil, first.Rows, Span{0, cols}, size)
	acc := rowsAcc{errRow: -1}
	if !forBlocks(ctx, append(now, others...), runtime.GOMAXPROCS(0), false, func() func(b block) {
		var spans []envSpan
		return func(b block) {
			part := rowTop
			if first.Rows.Has(b.i0) {
				part = wholeRow
			}
			g.evalRows(b.i0, b.i1, s.DeltaT, &spans, &acc, part)
		}
	}) {
		return nil, nil, ctx.Err()
	}
	if err := acc.failed(v); err != nil {
		return nil, nil, err
	}
	g.inside, g.maxMach = acc.inside, acc.maxMach
	var once sync.Once
	var restErr error
	rest = func() error {
		once.Do(func() {
			if !forBlocks(ctx, others, runtime.GOMAXPROCS(0), true, func() func(b block) {
				var spans []envSpan
				return func(b block) { g.evalRows(b.i0, b.i1, s.DeltaT, &spans, &acc, rowRest) }
			}) {
				restErr = ctx.Err()
				return
			}
			g.inside = acc.inside
		})
		return restErr
	}
	return g, rest, nil
}

// newGrid checks v and s and makes the grid's axes, with its points in
// the array of old when it holds enough (see NewGridReusing), not yet
// evaluated.
func newGrid(v *Vehicle, s Settings, old *Grid) (*Grid, error) {
	if v == nil {
		return nil, errors.New("grid: no vehicle")
	}
	if err := checkGridVehicle(v); err != nil {
		return nil, fmt.Errorf("grid for %q: %w", v.Name, err)
	}
	reg := s.Regimes
	if reg == (atmos.Regimes{}) {
		reg = atmos.DefaultRegimes()
	}
	if err := reg.Validate(); err != nil {
		return nil, fmt.Errorf("grid for %q: %w", v.Name, err)
	}
	alts, err := gridAxis(v.Grid.Altitude, func() (float64, float64, bool) {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, p := range v.Boundary {
			lo, hi = math.Min(lo, p.Altitude), math.Max(hi, p.Altitude)
		}
		return lo, hi, true
	})
	if err != nil {
		return nil, fmt.Errorf("grid for %q: altitude axis: %w", v.Name, err)
	}
	speeds, err := gridAxis(v.Grid.Speed, func() (float64, float64, bool) {
		if v.Grid.SpeedKind != v.BoundaryKind {
			return 0, 0, false
		}
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, p := range v.Boundary {
			lo, hi = math.Min(lo, p.Speed), math.Max(hi, p.Speed)
		}
		return lo, hi, true
	})
	if err != nil {
		return nil, fmt.Errorf("grid for %q: %s axis: %w", v.Name, v.Grid.SpeedKind, err)
	}
	g := &Grid{
		Vehicle:   v,
		Alts:      alts,
		Speeds:    speeds,
		SpeedKind: v.Grid.SpeedKind,
		DeltaT:    s.DeltaT,
		Regimes:   reg,
		rows:      make([]atmos.State, len(alts)),
	}
	if n := len(alts) * len(speeds); old != nil && cap(old.points) >= n {
		g.points, g.reused = old.points[:n], true
	} else {
		g.points = make([]flightRec, n)
	}
	if old != nil && cap(old.top) > 0 {
		g.top = old.top[:0]
	}
	return g, nil
}

// rowsAcc gathers what the row blocks of NewGrid add up, under mu.
type rowsAcc struct {
	mu      sync.Mutex
	inside  int     // inside points
	maxMach float64 // highest inside Mach number
	errRow  int     // first row whose atmosphere failed (-1: none)
	err     error
}

// failed is the error of the first row whose atmosphere failed, if any.
func (acc *rowsAcc) failed(v *Vehicle) error {
	if acc.errRow >= 0 {
		return fmt.Errorf("grid for %q: row %d: %w", v.Name, acc.errRow, acc.err)
	}
	return nil
}

// rowPart is which points of a row evalRows evaluates.
type rowPart uint8

const (
	wholeRow rowPart = iota // every point
	// rowTop: from the fastest point down to the first inside one (the
	// whole row when none is), the lowest column done noted in g.top.
	rowTop
	// rowRest: the points below g.top, the row's atmosphere being made
	// already (NewGridStaged).
	rowRest
)

// evalRows evaluates part of each of rows i0..i1-1 of g on the day dT:
// the atmosphere (but for rowRest), the envelope limits and the points,
// with spans as scratch space, and adds the inside count and highest Mach
// number to acc. A row whose atmosphere fails is recorded in acc and ends
// the block.
func (g *Grid) evalRows(i0, i1 int, dT float64, spans *[]envSpan, acc *rowsAcc, part rowPart) {
	v := g.Vehicle
	cols := len(g.Speeds)
	inside := 0
	maxMach := 0.0
	for i := i0; i < i1; i++ {
		h := g.Alts[i]
		st := g.rows[i]
		if part != rowRest {
			var err error
			if st, err = atmos.AtDay(h, v.AltitudeKind, dT); err != nil {
				acc.mu.Lock()
				if acc.errRow < 0 || i < acc.errRow {
					acc.errRow, acc.err = i, err
				}
				acc.mu.Unlock()
				return
			}
			g.rows[i] = st
		}
		*spans = boundaryEnvSpans(v.Boundary, h, (*spans)[:0])
		rl := g.rowLimits(h, &st, *spans)
		row := g.points[i*cols : (i+1)*cols]
		eval := func(j int) bool {
			r := &row[j]
			if g.reused {
				*r = flightRec{} // evalInto fills in a zero record
			}
			g.evalInto(r, g.Speeds[j], &st, &rl)
			if r.excl != InEnvelope {
				return false
			}
			inside++
			maxMach = max(maxMach, r.mach)
			return true
		}
		switch part {
		case wholeRow:
			for j := range cols {
				eval(j)
			}
		case rowTop:
			j := cols - 1
			for j >= 0 && !eval(j) {
				j--
			}
			g.top[i] = max(j, 0)
		case rowRest:
			for j := range g.top[i] {
				eval(j)
			}
		}
	}
	acc.mu.Lock()
	acc.inside += inside
	acc.maxMach = max(acc.maxMach, maxMach)
	acc.mu.Unlock()
}

// Work splitting for NewGrid and Solve: grids of fewer than parallelMin
// points are done on the calling goroutine; larger ones are cut into blocks
// of whole rows, about blocksPerWorker per processor, taken in turn by
// runtime.GOMAXPROCS workers (rows differ in cost, so small blocks keep the
// workers evenly loaded).
const (
	parallelMin     = 4096
	blocksPerWorker = 8
)

// forRowBlocks calls work(i0, i1) for consecutive blocks of rows covering
// 0..rows-1, on up to runtime.GOMAXPROCS goroutines at once, and returns
// when all are done. Each row is in exactly one block. Each goroutine gets
// its work function from newWorker, once, so that it can keep scratch
// space of its own.
func forRowBlocks(rows, cols int, newWorker func() func(i0, i1 int)) {
	forRowBlocksUntil(context.Background(), rows, cols, newWorker)
}

// forRowBlocksUntil is forRowBlocks that takes no new block once ctx has
// ended; it reports whether every block was done.
func forRowBlocksUntil(ctx context.Context, rows, cols int, newWorker func() func(i0, i1 int)) bool {
	return forRowBlocksSized(ctx, rows, cols, rowBlockSize(rows), newWorker)
}

// rowBlockSize is how many rows of a grid of rows a block holds: about
// blocksPerWorker blocks per processor.
func rowBlockSize(rows int) int {
	workers := min(runtime.GOMAXPROCS(0), rows)
	return max(1, rows/(max(workers, 1)*blocksPerWorker))
}

// forRowBlocksSized is forRowBlocksUntil with blocks of size rows (the
// last one shorter).
func forRowBlocksSized(ctx context.Context, rows, cols, size int, newWorker func() func(i0, i1 int)) bool {
	blocks := rowBlocks(nil, Span{0, rows}, Span{0, cols}, size)
	return forBlocks(ctx, blocks, runtime.GOMAXPROCS(0), false, func() func(b block) {
		work := newWorker()
		return func(b block) { work(b.i0, b.i1) }
	})
}

// block is the grid points of rows i0..i1-1 in columns j0..j1-1.
type block struct{ i0, i1, j0, j1 int }

// points is the number of grid points in the block.
func (b block) points() int { return max(b.i1-b.i0, 0) * max(b.j1-b.j0, 0) }

// rowBlocks appends to into the points of rows × cols, cut into blocks of
// size rows (the last one shorter); nothing when either span is empty.
func rowBlocks(into []block, rows, cols Span, size int) []block {
	if cols.Len() == 0 {
		return into
	}
	for i0 := rows.Lo; i0 < rows.Hi; i0 += size {
		into = append(into, block{i0, min(i0+size, rows.Hi), cols.Lo, cols.Hi})
	}
	return into
}

// forBlocks calls work(b) for each of blocks, on up to workers goroutines
// at once (on the calling one for fewer than parallelMin points), each
// with its own work function from newWorker, and reports whether every
// block was done: it takes no new block once ctx has ended. On one
// goroutine the blocks are done in order. With background set, each
// block is begun by letting the program's other goroutines run
// (runtime.Gosched): work no one waits for then delays an interface's
// keys and frames by at most one block, instead of by the runtime's time
// slice (10 ms) when every processor is taken.
func forBlocks(ctx context.Context, blocks []block, workers int, background bool, newWorker func() func(b block)) bool {
	yield := func() {}
	if background {
		yield = runtime.Gosched
	}
	points := 0
	for _, b := range blocks {
		points += b.points()
	}
	if workers < 2 || len(blocks) < 2 || points < parallelMin {
		work := newWorker()
		for k, b := range blocks {
			if k > 0 && ctx.Err() != nil {
				return false
			}
			yield()
			work(b)
		}
		return ctx.Err() == nil
	}
	var stopped atomic.Bool
	workers = min(workers, len(blocks))
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			work := newWorker()
			for {
				k := int(next.Add(1)) - 1
				if k >= len(blocks) {
					return
				}
				if ctx.Err() != nil {
					stopped.Store(true)
					return
				}
				yield()
				work(blocks[k])
			}
		})
	}
	wg.Wait()
	return !stopped.Load()
}

// Span is the indices Lo up to Hi-1 of grid rows (altitudes) or columns
// (speeds).
type Span struct{ Lo, Hi int }

// Len is the number of indices in the span (0 when empty).
func (r Span) Len() int { return max(r.Hi-r.Lo, 0) }

// Has reports whether index i is in the span.
func (r Span) Has(i int) bool { return i >= r.Lo && i < r.Hi }

// clip is the part of the span within 0..n-1.
func (r Span) clip(n int) Span {
	r.Lo, r.Hi = max(r.Lo, 0), min(r.Hi, n)
	if r.Hi < r.Lo {
		r.Hi = r.Lo
	}
	return r
}

// Window is the grid points of rows Rows in columns Cols.
type Window struct{ Rows, Cols Span }

// Has reports whether point (i, j) is in the window.
func (w Window) Has(i, j int) bool { return w.Rows.Has(i) && w.Cols.Has(j) }

// Within is the part of the window inside a grid of rows × cols points.
func (w Window) Within(rows, cols int) Window { return Window{w.Rows.clip(rows), w.Cols.clip(cols)} }

// splits reports whether the window, within a grid of rows × cols
// points, leaves a staged evaluation something to do first and something
// after: it holds points, but not all of them.
func (w Window) splits(rows, cols int) bool {
	w = w.Within(rows, cols)
	return w.Rows.Len() > 0 && w.Cols.Len() > 0 && (w.Rows.Len() < rows || w.Cols.Len() < cols)
}

// inStages calls pass on the points of a rows × cols grid cut into
// blocks of size rows: where early is set and window first splits the
// grid, on the window's blocks, then early (which may read them while the
// rest is done), then on the rest as background work; otherwise on every
// block at once. It reports whether every block was done (pass reports
// it of its own blocks).
func inStages(first Window, rows, cols, size int, early func(), pass func(blocks []block, background bool) bool) bool {
	if early == nil || !first.splits(rows, cols) {
		return pass(rowBlocks(nil, Span{0, rows}, Span{0, cols}, size), false)
	}
	first = first.Within(rows, cols)
	var rest []block
	rest = rowBlocks(rest, Span{0, first.Rows.Lo}, Span{0, cols}, size)
	rest = rowBlocks(rest, Span{first.Rows.Hi, rows}, Span{0, cols}, size)
	rest = rowBlocks(rest, first.Rows, Span{0, first.Cols.Lo}, size)
	rest = rowBlocks(rest, first.Rows, Span{first.Cols.Hi, cols}, size)
	if !pass(rowBlocks(nil, first.Rows, first.Cols, size), false) {
		return false
	}
	early()
	return pass(rest, true)
}

// rowLimits is the envelope on one altitude row expressed in the grid's
// speed kind: the boundary intervals and each limit line, converted once
// per row. At fixed altitude every speed kind is an increasing function of
// every other, so comparing in the grid's kind is the same as converting
// each point to the boundary's (or the limit's) kind.
type rowLimits struct {
	above     bool      // the row is above the ceiling
	spans     []envSpan // boundary intervals, grid kind, widened by their edge tolerance
	spanErr   bool      // a boundary crossing did not convert
	maxMach   float64   // +Inf when not set
	maxEAS    float64
	maxCAS    float64
	maxQ      float64
	minSpeed  float64   // -Inf when not set
	limitFail Exclusion // a limit line that did not convert
	// stateOK: the row's atmosphere passes atmos's state check, so that
	// atmos.TASFromMach(M, st) is M·a for every finite M ≥ 0.
	stateOK bool
}

func (g *Grid) rowLimits(h float64, st *atmos.State, spans []envSpan) rowLimits {
	v := g.Vehicle
	rl := rowLimits{maxMach: math.Inf(1), maxEAS: math.Inf(1), maxCAS: math.Inf(1), maxQ: math.Inf(1), minSpeed: math.Inf(-1)}
	rl.stateOK = !math.IsNaN(atmos.TASFromMach(1, *st))
	if lim := v.Limits.Ceiling; lim > 0 && h > lim*(1+gridEdgeTol) {
		rl.above = true
		return rl
	}
	conv := func(kind atmos.SpeedKind, x float64) (float64, bool) {
		if kind == g.SpeedKind {
			return x, true
		}
		a, err := atmos.Speeds(kind, x, *st)
		if err != nil {
			return 0, false
		}
		return a.Of(g.SpeedKind), true
	}
	for k, sp := range spans {
		lo, ok1 := conv(v.BoundaryKind, sp.lo)
		hi, ok2 := conv(v.BoundaryKind, sp.hi)
		if !ok1 || !ok2 {
			rl.spanErr = true
			continue
		}
		spans[k] = envSpan{lo, hi}
	}
	// Widen each interval by its edge tolerance once here rather than at
	// every point (see inWideSpans).
	for k, sp := range spans {
		tol := gridEdgeTol * math.Max(math.Abs(sp.lo), math.Abs(sp.hi))
		spans[k] = envSpan{sp.lo - tol, sp.hi + tol}
	}
	rl.spans = spans
	l := v.Limits
	set := func(dst *float64, kind atmos.SpeedKind, x float64, why Exclusion) {
		if c, ok := conv(kind, x); ok {
			*dst = c
		} else if rl.limitFail == InEnvelope {
			rl.limitFail = why
		}
	}
	if l.MaxMach > 0 {
		set(&rl.maxMach, atmos.Mach, l.MaxMach, AboveMaxMach)
	}
	if l.MaxEAS > 0 {
		set(&rl.maxEAS, atmos.EAS, l.MaxEAS, AboveMaxEAS)
	}
	if l.MaxCAS > 0 {
		set(&rl.maxCAS, atmos.CAS, l.MaxCAS, AboveMaxCAS)
	}
	if l.MaxQ > 0 {
		set(&rl.maxQ, atmos.TAS, math.Sqrt(2*l.MaxQ/st.Density), AboveMaxQ)
	}
	if l.MinSpeed > 0 {
		set(&rl.minSpeed, l.MinSpeedKind, l.MinSpeed, BelowMinSpeed)
	}
	return rl
}

// evalPoint classifies and evaluates one point of speed sp (grid kind) on
// a row with atmosphere st and limits rl.
func (g *Grid) evalPoint(sp float64, st *atmos.State, rl *rowLimits) flightRec {
	var r flightRec
	g.evalInto(&r, sp, st, rl)
	return r
}

// evalInto is evalPoint writing into r, which must be zero.
func (g *Grid) evalInto(r *flightRec, sp float64, st *atmos.State, rl *rowLimits) {
	hi := 1 + gridEdgeTol
	switch {
	case rl.above:
		r.excl = AboveCeiling
	case !inWideSpans(rl.spans, sp):
		r.excl = OutsideBoundary
		if rl.spanErr {
			r.excl = SpeedUnusable
		}
	case sp > rl.maxMach*hi:
		r.excl = AboveMaxMach
	case sp > rl.maxEAS*hi:
		r.excl = AboveMaxEAS
	case sp > rl.maxCAS*hi:
		r.excl = AboveMaxCAS
	case sp > rl.maxQ*hi:
		r.excl = AboveMaxQ
	case sp < rl.minSpeed*(1-gridEdgeTol):
		r.excl = BelowMinSpeed
	case rl.limitFail != InEnvelope:
		r.excl = rl.limitFail
	}
	if r.excl != InEnvelope {
		return
	}
	// Mach number and true airspeed from the grid's kind, by the same
	// atmos relations atmos.Speeds uses (so FlightDetail agrees exactly).
	var M, V float64
	switch g.SpeedKind {
	case atmos.Mach:
		M = sp
		if rl.stateOK && M >= 0 && !math.IsInf(M, 0) {
			V = M * st.SpeedOfSound // atmos.TASFromMach without its checks
		} else {
			V = atmos.TASFromMach(M, *st)
		}
	case atmos.TAS:
		V = sp
		M = atmos.MachFromTAS(V, *st)
	case atmos.EAS:
		M = atmos.MachFromEAS(sp, *st)
		V = atmos.TASFromMach(M, *st)
	case atmos.CAS:
		var err error
		if M, err = atmos.MachFromCAS(sp, *st); err != nil {
			r.excl = SpeedUnusable
			return
		}
		V = atmos.TASFromMach(M, *st)
	}
	if !isFiniteNum(V) {
		r.excl = SpeedUnusable
		return
	}
	if !(V > 0) {
		r.excl = NoFlow
		return
	}
	L := g.Vehicle.RefLength
	r.mach = M
	r.re = st.Density * V * L / st.Viscosity
	q := 0.5 * st.Density * V * V
	kn := st.MeanFreePath / L
	r.tas = float32(V)
	r.q = float32(q)
	r.kn = float32(kn)
	r.speed = uint8(g.Regimes.Speed(M))
	r.rare = uint8(g.Regimes.Rarefaction(kn))
}

// Rows is the number of altitudes.
func (g *Grid) Rows() int { return len(g.Alts) }

// Cols is the number of speeds.
func (g *Grid) Cols() int { return len(g.Speeds) }

// GridPoint names a grid point by row (altitude, 0 the lowest) and column
// (speed, 0 the slowest).
type GridPoint struct{ Row, Col int }

// Index is the position of point (i, j) in per-point slices such as
// Map.Results: i*Cols()+j.
func (g *Grid) Index(i, j int) int { return i*len(g.Speeds) + j }

// Len is the number of grid points, Rows()*Cols().
func (g *Grid) Len() int { return len(g.points) }

// InsideCount is the number of grid points inside the envelope.
func (g *Grid) InsideCount() int { return g.inside }

// Inside reports whether point (i, j) is inside the envelope.
func (g *Grid) Inside(i, j int) bool { return g.points[g.Index(i, j)].excl == InEnvelope }

// Exclusion says why point (i, j) is outside the envelope (InEnvelope when
// it is inside).
func (g *Grid) Exclusion(i, j int) Exclusion { return g.points[g.Index(i, j)].excl }

// Atmosphere is the state of the air on row i.
func (g *Grid) Atmosphere(i int) atmos.State { return g.rows[i] }

// Flight returns the stored flight values of point (i, j); zero for points
// outside the envelope.
func (g *Grid) Flight(i, j int) FlightPoint {
	r := g.points[g.Index(i, j)]
	return FlightPoint{
		Mach: float32(r.mach), TAS: r.tas, Q: r.q, Re: float32(r.re), Kn: r.kn,
		Speed:       atmos.SpeedRegime(r.speed),
		Rarefaction: atmos.RarefactionRegime(r.rare),
	}
}

// FlightDetail recomputes point (i, j) at full precision. Points outside
// the envelope get their atmosphere and, where convertible, airspeeds, with
// Inside false and the Exclusion set.
func (g *Grid) FlightDetail(i, j int) (FlightDetail, error) {
	if i < 0 || i >= len(g.Alts) || j < 0 || j >= len(g.Speeds) {
		return FlightDetail{}, fmt.Errorf("grid point (%d, %d): want row 0..%d, column 0..%d",
			i, j, len(g.Alts)-1, len(g.Speeds)-1)
	}
	st := g.rows[i]
	d := FlightDetail{
		Altitude:  g.Alts[i],
		Speed:     g.Speeds[j],
		State:     st,
		Exclusion: g.points[g.Index(i, j)].excl,
	}
	d.Inside = d.Exclusion == InEnvelope
	a, err := atmos.Speeds(g.SpeedKind, d.Speed, st)
	if err != nil {
		if d.Inside {
			return d, fmt.Errorf("grid point (%d, %d): %w", i, j, err)
		}
		return d, nil
	}
	L := g.Vehicle.RefLength
	d.Airspeeds = a
	d.Q = 0.5 * st.Density * a.TAS * a.TAS
	d.RePerM = st.Density * a.TAS / st.Viscosity
	d.Re = st.Density * a.TAS * L / st.Viscosity // as NewGrid stores it
	d.Kn = st.MeanFreePath / L
	d.T0 = st.Temperature / atmos.TemperatureRatio(a.Mach, atmos.GammaAir)
	d.P0 = st.Pressure / atmos.PressureRatio(a.Mach, atmos.GammaAir)
	d.SpeedRegime = g.Regimes.Speed(a.Mach)
	d.Rarefaction = g.Regimes.Rarefaction(d.Kn)
	return d, nil
}

// StoredBytes is the memory the grid holds: the per-point records (32
// bytes each), the per-row atmosphere and the axes.
func (g *Grid) StoredBytes() int {
	rec := int(reflect.TypeFor[flightRec]().Size())
	state := int(reflect.TypeFor[atmos.State]().Size())
	return len(g.points)*rec + len(g.rows)*state + 8*(len(g.Alts)+len(g.Speeds))
}

// envSpan is one interval of boundary speeds inside the envelope at one
// altitude.
type envSpan struct{ lo, hi float64 }

// boundaryEnvSpans returns the speed intervals where the horizontal line at
// altitude h lies inside the closed polygon b, appended to buf. Crossings
// follow the half-open rule (an edge counts when one end is at or below h
// and the other above), which settles vertices on the line; horizontal
// edges lying on the line are added as intervals of their own so that the
// whole boundary counts as inside.
func boundaryEnvSpans(b []Vertex, h float64, buf []envSpan) []envSpan {
	var xs [64]float64
	cross := xs[:0]
	for k := range b {
		p, q := b[k], b[(k+1)%len(b)]
		if p.Altitude == q.Altitude {
			if p.Altitude == h {
				buf = append(buf, envSpan{math.Min(p.Speed, q.Speed), math.Max(p.Speed, q.Speed)})
			}
			continue
		}
		if (p.Altitude <= h) != (q.Altitude <= h) {
			t := (h - p.Altitude) / (q.Altitude - p.Altitude)
			cross = append(cross, p.Speed+t*(q.Speed-p.Speed))
		}
	}
	sort.Float64s(cross)
	for k := 0; k+1 < len(cross); k += 2 {
		buf = append(buf, envSpan{cross[k], cross[k+1]})
	}
	return buf
}

// inWideSpans reports whether x lies in one of the intervals, ends
// included; rowLimits has widened each by a relative tolerance of
// gridEdgeTol (tol = gridEdgeTol·max(|lo|, |hi|)).
func inWideSpans(spans []envSpan, x float64) bool {
	for _, s := range spans {
		if x >= s.lo && x <= s.hi {
			return true
		}
	}
	return false
}

// gridAxis expands an axis into its points. With a step the points are
// Min + i·Step (never a running sum) up to Max (Max itself when the step
// divides the range); with a count they are spread evenly from Min to Max
// inclusive. Each value is then tidied (tidyAxis) to the decimal it stands
// for. An axis
// with neither takes gridDefaultPoints, and one with Min = Max = 0 as well
// takes its range from extent (when extent can give one).
func gridAxis(a Axis, extent func() (lo, hi float64, ok bool)) ([]float64, error) {
	if a.Step == 0 && a.Count == 0 {
		a.Count = gridDefaultPoints
		if a.Min == 0 && a.Max == 0 {
			lo, hi, ok := extent()
			if !ok {
				return nil, errors.New("no range given and the boundary is in another speed kind; give min and max")
			}
			a.Min, a.Max = lo, hi
		}
	}
	if !isFiniteNum(a.Min) || !isFiniteNum(a.Max) || !isFiniteNum(a.Step) {
		return nil, fmt.Errorf("min %g, max %g, step %g: want finite numbers", a.Min, a.Max, a.Step)
	}
	if a.Max < a.Min {
		return nil, fmt.Errorf("max %g is below min %g", a.Max, a.Min)
	}
	if a.Step < 0 || a.Count < 0 {
		return nil, fmt.Errorf("step %g, count %d: want positive values", a.Step, a.Count)
	}
	var n int
	if a.Step > 0 {
		f := (a.Max-a.Min)/a.Step + 1e-9
		if f >= gridAxisCap {
			return nil, fmt.Errorf("step %g over %g..%g gives more than %d points", a.Step, a.Min, a.Max, gridAxisCap)
		}
		n = int(f) + 1
	} else {
		n = a.Count
		if n > gridAxisCap {
			return nil, fmt.Errorf("count %d: at most %d points", n, gridAxisCap)
		}
		if a.Min == a.Max {
			n = 1
		}
	}
	out := make([]float64, n)
	for k := range out {
		if a.Step > 0 {
			out[k] = a.Min + float64(k)*a.Step
		} else if n > 1 {
			out[k] = a.Min + (a.Max-a.Min)*float64(k)/float64(n-1)
		} else {
			out[k] = a.Min
		}
	}
	if a.Step > 0 && math.Abs(out[n-1]-a.Max) <= 1e-9*math.Max(1, math.Abs(a.Max)) {
		out[n-1] = a.Max
	}
	tidyAxis(out)
	return out, nil
}

// tidyAxis replaces each axis value by its tidyDecimal form, so that
// 0.2 + 2·0.05 is stored (and exported) as 0.3 rather than
// 0.30000000000000004, unless that would break the strict order of an
// axis whose points lie only a few units of float64 rounding apart.
func tidyAxis(xs []float64) {
	for k := range xs {
		y := tidyDecimal(xs[k])
		if k > 0 && !(y > xs[k-1]) {
			return // keep the rest exactly as computed
		}
		xs[k] = y
	}
}

// tidyDecimalUlps is how far (in units in the last place) tidyDecimal may
// move a value: the rounding of one multiplication and one addition, with
// a margin, and far below any physical meaning.
const tidyDecimalUlps = 4

// tidyDecimal is the decimal of at most 15 places (N/10^d, |N| < 2^53)
// nearest to x when that lies within tidyDecimalUlps of x (the float64
// rounding of a computation on decimal inputs, such as min + i·step);
// otherwise x itself. N/10^d is computed as one correctly rounded division
// of two exact numbers, so the result is the float64 nearest that decimal,
// and its shortest round-trip form is the decimal the user wrote or would
// write ("0.3", "1828.8"). It takes a few multiplications, no formatting.
func tidyDecimal(x float64) float64 {
	if x == 0 || !isFiniteNum(x) {
		return x
	}
	ax := math.Abs(x)
	ulp := math.Nextafter(ax, math.Inf(1)) - ax
	p := 1.0
	for d := 0; d <= 15; d++ {
		v := x * p
		if math.Abs(v) >= 1<<53 {
			break
		}
		n := math.Round(v)
		// v carries x's own offset (at most tidyDecimalUlps) times 10^d
		// plus the half-ulp rounding of the product.
		if math.Abs(v-n) <= (tidyDecimalUlps+1)*ulp*p {
			if y := n / p; math.Abs(y-x) <= tidyDecimalUlps*ulp {
				return y
			}
		}
		p *= 10
	}
	return x
}

// checkGridVehicle checks what the engine needs of a vehicle.
func checkGridVehicle(v *Vehicle) error {
	if !(v.RefLength > 0) || !isFiniteNum(v.RefLength) {
		return fmt.Errorf("reference length %g m: want a positive length", v.RefLength)
	}
	if len(v.Boundary) < 3 {
		return fmt.Errorf("boundary has %d vertices: want at least 3", len(v.Boundary))
	}
	for k, p := range v.Boundary {
		if !isFiniteNum(p.Altitude) || !isFiniteNum(p.Speed) || p.Speed < 0 {
			return fmt.Errorf("boundary vertex %d (%g m, %g): want finite altitude and non-negative speed", k+1, p.Altitude, p.Speed)
		}
	}
	return nil
}

func isFiniteNum(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
