package envelope

import (
	"context"
	"errors"
	"runtime"
	"sync"
)

// All is every facility solved on one grid, with the best of all.
type All struct {
	// Maps has one map per facility, nil where the facility could not be
	// solved; Errs says why.
	Maps []*Map
	Errs []error
	// Best is, per grid point, the index in the facilities of the one
	// with the best answer (-1 where none has the point inside), and
	// BestRes that answer (zero, Outside, where none): as Best of the
	// solved maps. Nil when asked for the index alone (Buffers.IndexOnly).
	Best    []int
	BestRes []Result
	// BestShares counts BestRes per class (as BestShares of the maps).
	BestShares Shares
}

// Buffers are arrays a caller solving again and again hands back to
// SolveAllReusing to be written over: one result array per facility and
// the two best-of-all arrays. Any of them may be nil or short, and a new
// one is made; none may be used by anything else any more.
type Buffers struct {
	Results [][]Result
	Best    []int
	BestRes []Result
	// IndexOnly leaves All.BestRes nil: the caller reads each winner's
	// answer in its map (Maps[Best[p]].Results[p]), and the pass writes
	// 8 bytes a point instead of 36.
	IndexOnly bool
}

// SolveAll solves every facility on g under s and decides the best of
// all. See SolveAllReusing.
func SolveAll(g *Grid, facs []Facility, s Settings) (All, error) {
	return SolveAllReusing(context.Background(), g, facs, s, Buffers{})
}

// fusedPoints is about how many grid points one block of SolveAllReusing
// holds: the six demo facilities' results of a block (28 bytes each) and
// its flight records stay in a processor's cache between the solves and
// the best of all.
const fusedPoints = 8192

// SolveAllReusing solves every facility on g, each map the same as
// SolveReusing makes it, and decides the best of all as Best does, in
// one pass over the grid: a worker takes a block of rows, solves it for
// every facility in turn, then decides its best of all, while the block
// is still in its processor's cache (solving facility by facility and
// then the best of all read every result back from memory). A facility
// that cannot be solved (no model scale, say) has a nil map and its error
// in Errs and takes no part. When ctx ends first it stops between blocks
// and returns ctx's error.
func SolveAllReusing(ctx context.Context, g *Grid, facs []Facility, s Settings, buf Buffers) (All, error) {
	return SolveAllStaged(ctx, g, facs, s, buf, Window{}, nil)
}

// SolveAllStaged is SolveAllReusing solving the points of window first
// before the others, as SolveStaged does for one facility: once they are
// done it calls ready with an All whose maps are copies, and whose maps
// and best of all are final in the window alone (BestShares not counted
// yet), and goes on with the rest. The other points are being written
// while ready runs and after it returns, until SolveAllStaged returns, so
// the All given to ready may be read in the window only. The rest is
// solved as SolveStaged solves it. With ready nil, or the window empty or
// the whole grid, ready is not called.
func SolveAllStaged(ctx context.Context, g *Grid, facs []Facility, s Settings, buf Buffers, first Window, ready func(All)) (All, error) {
	if g == nil {
		return All{}, errors.New("solve: need a grid")
	}
	a := All{Maps: make([]*Map, len(facs)), Errs: make([]error, len(facs))}
	var maps []*Map // the solved ones, in facility order
	var index []int // their facility index
	for k := range facs {
		var b []Result
		if k < len(buf.Results) {
			b = buf.Results[k]
		}
		a.Maps[k], a.Errs[k] = newMap(g, &facs[k], s, b)
		if a.Maps[k] != nil {
			maps, index = append(maps, a.Maps[k]), append(index, k)
		}
	}
	if len(maps) == 0 {
		return a, nil
	}
	n := len(g.points)
	a.Best = sized(buf.Best, n)
	if !buf.IndexOnly {
		a.BestRes = sized(buf.BestRes, n)
	}
	cols := len(g.Speeds)
	var mu sync.Mutex // guards counts and best while workers add theirs
	counts := make([][NumClasses]int, len(maps))
	var best [NumClasses]int
	bs := bestSet{n: n, index: index, allSolved: true}
	for _, m := range maps {
		bs.rs = append(bs.rs, m.Results)
	}
	rowsPer := max(1, fusedPoints/max(cols, 1))
	pass := func(blocks []block, background bool) bool {
		return forBlocks(ctx, blocks, runtime.GOMAXPROCS(0), background, func() func(b block) {
			solvers := make([]func(m *Map, b block) [NumClasses]int, len(maps))
			for f, m := range maps {
				solvers[f] = m.sv.rowSolver(cols)
			}
			local := make([][NumClasses]int, len(maps))
			return func(b block) {
				for f, m := range maps {
					local[f] = solvers[f](m, b)
				}
				var nb [NumClasses]int
				for i := b.i0; i < b.i1; i++ {
					for p := i*cols + b.j0; p < i*cols+b.j1; p++ {
						w, wr := bs.at(p)
						if w < 0 {
							a.Best[p] = -1
							if a.BestRes != nil {
								a.BestRes[p] = Result{}
							}
							nb[Outside]++
							continue
						}
						a.Best[p] = bs.index[w]
						if a.BestRes != nil {
							a.BestRes[p] = *wr
						}
						if c := wr.Class; int(c) < NumClasses {
							nb[c]++
						}
					}
				}
				mu.Lock()
				for f := range local {
					for c := range local[f] {
						counts[f][c] += local[f][c]
					}
				}
				for c := range nb {
					best[c] += nb[c]
				}
				mu.Unlock()
			}
		})
	}
	var early func()
	if ready != nil {
		early = func() {
			e := All{Maps: make([]*Map, len(a.Maps)), Errs: a.Errs, Best: a.Best, BestRes: a.BestRes}
			for k, m := range a.Maps {
				if m != nil {
					cp := *m
					e.Maps[k] = &cp
				}
			}
			ready(e)
		}
	}
	if !inStages(first, len(g.Alts), cols, rowsPer, early, pass) {
		return All{}, ctx.Err()
	}
	for f, m := range maps {
		m.finish(counts[f])
	}
	a.BestShares = Shares{Total: n, Inside: n - best[Outside], Count: best}
	return a, nil
}

// sized is buf cut to n when it holds that many, else a new array.
func sized[T any](buf []T, n int) []T {
	if cap(buf) >= n {
		return buf[:n]
	}
	return make([]T, n)
}
