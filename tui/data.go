package tui

import (
	"context"
	"errors"
	"fmt"
	"runtime"
	"sync"

	"likewind/envelope"
)

// results is one complete evaluation: the flight grid, one map per
// facility (same order as the facilities), and the best facility per
// point. It is replaced as a whole, never changed in place, so a view of
// an older results stays consistent while a recompute runs.
type results struct {
	grid *envelope.Grid
	maps []*envelope.Map
	// best is the facility index of the best answer per point, -1
	// outside; the answer itself is that map's result there (bestAt).
	best    []int
	full    []float64 // full-match share of inside points, per facility
	matched []float64 // full match or Mach relaxed, per facility
	union   float64   // share of inside points some facility matches
	// bestFull is the share of inside points whose best class is a full
	// match.
	bestFull float64
	errs     []error // per facility: why it has no map (nil map)
}

// early asks a recompute for some points first: those on screen. Once
// they are solved, send gets results that may be read in that window
// alone (its other points are still being written) while the rest is
// solved. A nil *early asks for nothing early.
type early struct {
	win  envelope.Window
	send func(results, envelope.Window)
}

// window is the points asked for, none for a nil e.
func (e *early) window() envelope.Window {
	if e == nil {
		return envelope.Window{}
	}
	return e.win
}

// computeGrid evaluates the flight side and every facility, in arrays
// from pool where it has them (nil: new arrays), with the points of e
// first.
func computeGrid(ctx context.Context, v *envelope.Vehicle, facs []envelope.Facility, s envelope.Settings, pool *arrays, e *early) (results, error) {
	// The flight side too is made for the early points first (with what
	// their solve needs of the rest: each row's atmosphere, the highest
	// inside Mach number), and the rest once they are sent.
	g, rest, err := envelope.NewGridStaged(ctx, v, s, pool.takeGrid(), e.window())
	if err != nil {
		return results{}, err
	}
	var staged *early
	if e != nil {
		staged = &early{win: e.win, send: func(r results, w envelope.Window) {
			e.send(r, w)
			_ = rest() // an error is ctx's, which the solve's rest reports
		}}
	}
	r, err := solveAll(ctx, g, facs, s, pool, staged)
	if err == nil {
		err = rest() // where no early points were sent (no facility solved)
	}
	if err != nil {
		return results{}, err
	}
	return r, nil
}

// solveAll solves every facility on an existing grid with the best of
// all, in one pass (envelope.SolveAllReusing). When ctx ends first (the
// results are stale) it returns ctx's error.
func solveAll(ctx context.Context, g *envelope.Grid, facs []envelope.Facility, s envelope.Settings, pool *arrays, e *early) (results, error) {
	if g == nil {
		return results{}, errors.New("no flight grid to solve on")
	}
	n := g.Rows() * g.Cols()
	buf := envelope.Buffers{Results: make([][]envelope.Result, len(facs)), Best: pool.takeInts(n), IndexOnly: true}
	for k := range facs {
		buf.Results[k] = pool.takeResults(n)
	}
	var ready func(envelope.All)
	if e != nil {
		ready = func(a envelope.All) {
			e.send(results{grid: g, maps: a.Maps, errs: a.Errs, best: a.Best}, e.win)
		}
	}
	a, err := envelope.SolveAllStaged(ctx, g, facs, s, buf, e.window(), ready)
	if err != nil {
		// The arrays taken are left to the collector.
		return results{}, err
	}
	r := results{grid: g, maps: a.Maps, errs: a.Errs, best: a.Best}
	r.shares(nil, -1)
	sh := a.BestShares
	if sh.Inside > 0 {
		r.union = sh.Matched()
		r.bestFull = sh.Share(envelope.FullMatch)
	}
	return r, nil
}

// restBlock is how many points the rest of a staged best of all decides
// between two chances for the interface to run (about 0.2 ms of work).
const restBlock = 16384

// solveOne re-solves facility k only, keeping the other maps of prev,
// with the points of e first.
func solveOne(ctx context.Context, prev results, facs []envelope.Facility, s envelope.Settings, k int, pool *arrays, e *early) (results, error) {
	if prev.grid == nil || k < 0 || k >= len(facs) || len(prev.maps) != len(facs) {
		return solveAll(ctx, prev.grid, facs, s, pool, e)
	}
	with := func(m *envelope.Map) results {
		r := results{
			grid: prev.grid,
			maps: append([]*envelope.Map(nil), prev.maps...),
			errs: append([]error(nil), prev.errs...),
		}
		r.maps[k] = m
		r.errs[k] = nil
		return r
	}
	// The best of all of the early points is decided as soon as they are
	// solved, and the rest after the solve: each point once.
	var (
		upd     *bestUpdate
		first   envelope.Window
		counted bestCounts
	)
	rows, cols := prev.grid.Rows(), prev.grid.Cols()
	var ready func(*envelope.Map)
	if e != nil {
		ready = func(em *envelope.Map) {
			er := with(em)
			u, ok := er.newBestUpdate(&prev, k, pool)
			if !ok {
				return
			}
			upd, first = &u, e.win.Within(rows, cols)
			for i := first.Rows.Lo; i < first.Rows.Hi; i++ {
				counted.plus(u.update(i*cols+first.Cols.Lo, i*cols+first.Cols.Hi))
			}
			er.best = u.best
			e.send(er, first)
		}
	}
	m, err := envelope.SolveStaged(ctx, prev.grid, &facs[k], s, pool.takeResults(rows*cols), e.window(), ready)
	if err != nil {
		return results{}, fmt.Errorf("%s: %w", facs[k].Name, err)
	}
	r := with(m)
	if upd == nil {
		r.summarise(&prev, k, pool)
		return r, nil
	}
	r.shares(&prev, k)
	// The rest is decided, like the rest of the solve
	// (envelope.SolveStaged), letting the interface run between blocks:
	// the screen shows the early points already. Above and below the
	// window the rows are whole; beside it, a row's two sides.
	c := counted
	for _, part := range [][2]int{{0, first.Rows.Lo * cols}, {first.Rows.Hi * cols, rows * cols}} {
		c.plus(byParts(part[1]-part[0], func(lo, hi int) (c bestCounts) {
			for q := part[0] + lo; q < part[0]+hi; q += restBlock {
				runtime.Gosched()
				c.plus(upd.update(q, min(q+restBlock, part[0]+hi)))
			}
			return c
		}))
	}
	for i := first.Rows.Lo; i < first.Rows.Hi; i++ {
		c.plus(upd.update(i*cols, i*cols+first.Cols.Lo))
		c.plus(upd.update(i*cols+first.Cols.Hi, (i+1)*cols))
	}
	r.best = upd.best
	r.setUnion(c)
	return r, nil
}

// summarise fills the best-of-all arrays (in arrays from pool where it
// has them) and the coverage shares. With prev given, the shares of every
// map but changed are taken from it.
func (r *results) summarise(prev *results, changed int, pool *arrays) {
	if r.grid == nil {
		return
	}
	if r.shares(prev, changed) == 0 {
		return
	}
	var c bestCounts
	ok := prev != nil && changed >= 0
	if ok {
		c, ok = r.incrementalBest(prev, changed, pool)
	}
	if !ok {
		n := r.grid.Rows() * r.grid.Cols()
		var res []envelope.Result
		r.best, res = bestOfAllInto(r.maps, pool.takeInts(n), nil)
		c = byParts(len(res), func(lo, hi int) (c bestCounts) {
			for p := lo; p < hi; p++ {
				c.add(&res[p])
			}
			return c
		})
	}
	r.setUnion(c)
}

// setUnion sets the best-of-all shares from their counts.
func (r *results) setUnion(c bestCounts) {
	if c.inside > 0 {
		r.union = float64(c.matched) / float64(c.inside)
		r.bestFull = float64(c.full) / float64(c.inside)
	}
}

// bestCounts counts the best-of-all answers: inside the envelope,
// matched, full match.
type bestCounts struct{ inside, matched, full int }

// plus adds the counts of d.
func (c *bestCounts) plus(d bestCounts) {
	c.inside, c.matched, c.full = c.inside+d.inside, c.matched+d.matched, c.full+d.full
}

func (c *bestCounts) add(res *envelope.Result) {
	if res.Class != envelope.Outside {
		c.inside++
	}
	if res.Class.Matched() {
		c.matched++
	}
	if res.Class == envelope.FullMatch {
		c.full++
	}
}

// byParts splits points 0..n-1 over the processors (points are
// independent) and adds up what each part counts.
func byParts(n int, part func(lo, hi int) bestCounts) bestCounts {
	parts := min(runtime.GOMAXPROCS(0), 8)
	counts := make([]bestCounts, parts)
	var wg sync.WaitGroup
	for c := range parts {
		wg.Go(func() { counts[c] = part(c*n/parts, (c+1)*n/parts) })
	}
	wg.Wait()
	var sum bestCounts
	for _, c := range counts {
		sum.plus(c)
	}
	return sum
}

// incrementalBest updates the best-of-all arrays of prev after facility k
// alone was re-solved: a point keeps its previous winner unless the new
// answer of k beats it, and points k used to win are decided afresh. The
// outcome equals envelope.Best (ties go to the lower facility index). It
// reports false when prev cannot be reused.
func (r *results) incrementalBest(prev *results, k int, pool *arrays) (bestCounts, bool) {
	u, ok := r.newBestUpdate(prev, k, pool)
	if !ok {
		return bestCounts{}, false
	}
	c := byParts(len(u.best), u.update)
	r.best = u.best
	return c, true
}

// bestUpdate is the best of all of incrementalBest being made: update
// decides points lo..hi-1 into best and counts their answers.
type bestUpdate struct {
	best   []int
	update func(lo, hi int) bestCounts
}

// newBestUpdate prepares incrementalBest of r (prev with facility k
// re-solved) in an array from pool; false when prev cannot be reused.
func (r *results) newBestUpdate(prev *results, k int, pool *arrays) (bestUpdate, bool) {
	n := len(r.grid.Alts) * len(r.grid.Speeds)
	if prev.grid != r.grid || len(prev.best) != n || len(prev.maps) != len(r.maps) || r.maps[k] == nil {
		return bestUpdate{}, false
	}
	for j, m := range r.maps {
		if m == nil || len(m.Results) != n || (j != k && prev.maps[j] != m) {
			return bestUpdate{}, false
		}
	}
	best := pool.takeInts(n)
	if best == nil {
		best = make([]int, n)
	}
	best = best[:n]
	newK := r.maps[k].Results
	prevBest, prevMaps, maps := prev.best, prev.maps, r.maps
	var none envelope.Result
	update := func(lo, hi int) (c bestCounts) {
		for p := lo; p < hi; p++ {
			// The previous winner's answer is in its previous map (for
			// k the old one).
			w, wr := prevBest[p], &none
			if w >= 0 {
				wr = &prevMaps[w].Results[p]
			}
			nk := &newK[p]
			switch {
			case nk.Class == envelope.Outside:
				// as before
			case w == k && !envelope.Better(*wr, *nk):
				// k won and its new answer is at least as good as the
				// old one: Better orders answers by one key (class
				// rank, then the ratio's distance from 1), so it still
				// beats every map the old one beat and ties those it
				// tied.
				wr = nk
			case w == k || w < 0:
				// k's answer got worse (or no map had won): decide the
				// point again.
				w, wr = -1, &none
				for j, m := range maps {
					res := &m.Results[p]
					if res.Class == envelope.Outside {
						continue
					}
					if w < 0 || envelope.Better(*res, *wr) {
						w, wr = j, res
					}
				}
			case envelope.Better(*nk, *wr):
				w, wr = k, nk
			case k < w && !envelope.Better(*wr, *nk):
				// a tie goes to the lower index
				w, wr = k, nk
			}
			best[p] = w
			c.add(wr)
		}
		return c
	}
	return bestUpdate{best: best, update: update}, true
}

// result returns the facility answer at (i, j) for facility fac (-1 =
// best of all) and the index of the facility that gave it (-1 if none).
func (r *results) result(fac, i, j int) (envelope.Result, int) {
	if r.grid == nil || i < 0 || j < 0 || i >= r.grid.Rows() || j >= r.grid.Cols() {
		return envelope.Result{}, -1
	}
	idx := r.grid.Index(i, j)
	if fac < 0 {
		return r.bestAt(idx)
	}
	if fac >= len(r.maps) || r.maps[fac] == nil {
		return envelope.Result{}, -1
	}
	return r.maps[fac].At(i, j), fac
}

// facilityTag is the letter of facility k in best-of-all mode.
func facilityTag(k int) byte {
	const tags = "abcdefghijklmnopqrstuvwxyz"
	if k < 0 {
		return 0
	}
	return tags[k%len(tags)]
}

// shares fills the coverage shares of each map (taken from prev for every
// map but changed, where prev has them) and returns how many maps there
// are.
func (r *results) shares(prev *results, changed int) int {
	r.full = make([]float64, len(r.maps))
	r.matched = make([]float64, len(r.maps))
	solved := 0
	for k, m := range r.maps {
		if m == nil {
			continue
		}
		if prev != nil && k != changed && k < len(prev.full) && prev.maps[k] == m {
			r.full[k], r.matched[k] = prev.full[k], prev.matched[k]
		} else {
			sh := m.Shares()
			r.full[k] = sh.Share(envelope.FullMatch)
			r.matched[k] = sh.Matched()
		}
		solved++
	}
	return solved
}

// bestAt is the best-of-all answer at grid index p and the facility that
// gave it (-1 and the zero result, Outside, when none).
func (r *results) bestAt(p int) (envelope.Result, int) { return winnerAt(r.best, r.maps, p) }

// winnerAt is the answer at grid index p of the facility best names there
// (its result in maps) and that facility; -1 and the zero result,
// Outside, when there is none.
func winnerAt(best []int, maps []*envelope.Map, p int) (envelope.Result, int) {
	if p < 0 || p >= len(best) {
		return envelope.Result{}, -1
	}
	w := best[p]
	if w < 0 || w >= len(maps) || maps[w] == nil {
		return envelope.Result{}, -1
	}
	return maps[w].Results[p], w
}
