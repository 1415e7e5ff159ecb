package envelope

import "sync"

// Shares counts the points of a map by class.
type Shares struct {
	Total  int             // grid points
	Inside int             // points inside the envelope
	Count  [NumClasses]int // points per class (Count[Outside] = Total − Inside)
}

// Share is the fraction of inside points in class c (for Outside, the
// fraction of all grid points). It is 0 when there are none.
func (s Shares) Share(c Class) float64 {
	if c == Outside {
		if s.Total == 0 {
			return 0
		}
		return float64(s.Count[Outside]) / float64(s.Total)
	}
	if s.Inside == 0 || int(c) >= NumClasses {
		return 0
	}
	return float64(s.Count[c]) / float64(s.Inside)
}

// Matched is the fraction of inside points that are a full match or Mach
// relaxed.
func (s Shares) Matched() float64 {
	if s.Inside == 0 {
		return 0
	}
	return float64(s.Count[FullMatch]+s.Count[MachRelaxed]) / float64(s.Inside)
}

// Shares counts the map's points per class. For a map made by Solve the
// counts are taken while solving (Results are not to be changed after).
func (m *Map) Shares() Shares {
	if m.solved {
		return m.shares
	}
	return sharesOf(m.Results)
}

func sharesOf(rs []Result) Shares {
	s := Shares{Total: len(rs)}
	for _, r := range rs {
		if int(r.Class) < NumClasses {
			s.Count[r.Class]++
		}
	}
	s.Inside = s.Total - s.Count[Outside]
	return s
}

// Best picks, point by point, the facility whose result is best (by
// Better: class rank, then Reynolds ratio nearest 1). It returns the index
// into maps per point (-1 outside the envelope) and the winning results.
// All maps must be solved on the same grid (that of the first non-nil
// map); nil maps and maps on another grid are skipped, keeping their index.
func Best(maps []*Map) ([]int, []Result) { return BestReusing(maps, nil, nil) }

// BestReusing is Best writing into idx and best where they hold enough
// (every point is written); they must not be used by anything else any
// more (nil: new arrays).
func BestReusing(maps []*Map, idx []int, best []Result) ([]int, []Result) {
	bs, ok := newBestSet(maps)
	if !ok {
		return nil, nil
	}
	idx, best = sized(idx, bs.n), sized(best, bs.n)
	forRanges(bs.n, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			w, wr := bs.at(k)
			if w < 0 {
				idx[k], best[k] = -1, Result{}
				continue
			}
			idx[k], best[k] = bs.index[w], *wr
		}
	})
	return idx, best
}

// BestClasses is the class of Best's winner at each point (Outside where
// no map has the point inside), without Best's arrays of indices and
// results: what a class map of the best of all needs (nil when there is
// no map).
func BestClasses(maps []*Map) []Class {
	bs, ok := newBestSet(maps)
	if !ok {
		return nil
	}
	out := make([]Class, bs.n)
	forRanges(bs.n, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			c := Outside
			if w, wr := bs.at(k); w >= 0 {
				c = wr.Class
			}
			out[k] = c
		}
	})
	return out
}

// bestFold is the best of all made one map at a time: the winner's class
// and Reynolds ratio at each point so far (Outside: no winner yet).
type bestFold struct {
	class []Class
	ratio []float32
}

func newBestFold(n int) *bestFold {
	f := &bestFold{class: make([]Class, n), ratio: make([]float32, n)}
	for k := range f.class {
		f.class[k] = Outside
	}
	return f
}

// add takes the next map's results (maps in facility order): a result
// replaces the winner only when better (class rank, then Reynolds ratio
// nearest 1), so ties go to the earlier map, as in Best.
func (f *bestFold) add(rs []Result) {
	forRanges(len(rs), func(lo, hi int) {
		for k := lo; k < hi; k++ {
			r := &rs[k]
			if r.Class == Outside {
				continue
			}
			w := f.class[k]
			rank, wRank := r.Class.Rank(), w.Rank()
			if w == Outside || outranks(rank, r.ReRatio, wRank, f.ratio[k]) {
				f.class[k], f.ratio[k] = r.Class, r.ReRatio
			}
		}
	})
}

// bestSet is what Best decides points from: the results of the maps
// taking part, with their index in the maps given.
type bestSet struct {
	n         int
	rs        [][]Result
	index     []int
	allSolved bool
}

// newBestSet takes the maps solved on the grid of the first non-nil map
// (ok false when there is none).
func newBestSet(maps []*Map) (bestSet, bool) {
	var first *Map
	for _, m := range maps {
		if m != nil {
			first = m
			break
		}
	}
	if first == nil {
		return bestSet{}, false
	}
	g := first.Grid
	bs := bestSet{n: len(first.Results), allSolved: true}
	for f, m := range maps {
		if m == nil || m.Grid != g || len(m.Results) != bs.n {
			continue
		}
		bs.rs, bs.index = append(bs.rs, m.Results), append(bs.index, f)
		bs.allSolved = bs.allSolved && m.solved
	}
	return bs, true
}

// at is the winner at point k: its position in bs.rs and its result, or
// -1 when no map has the point inside. Points are independent, so ranges
// of points are decided side by side. Per point the maps are taken in
// order and a later one replaces the winner only when Better, so ties go
// to the lower index, as in a map-by-map pass.
func (bs *bestSet) at(k int) (int, *Result) {
	rs := bs.rs
	if bs.allSolved && len(rs) > 0 && rs[0][k].Class == Outside {
		// Outside the envelope, so Outside in every map Solve made on
		// this grid.
		return -1, nil
	}
	w, wRank := -1, 0
	var wr *Result
	for u := range rs {
		r := &rs[u][k]
		if r.Class == Outside {
			continue
		}
		// better(r, wr), with the winner's rank kept
		rank := r.Class.Rank()
		if w < 0 || outranks(rank, r.ReRatio, wRank, wr.ReRatio) {
			w, wr, wRank = u, r, rank
		}
	}
	return w, wr
}

// shares counts the winners per class without keeping them (a point
// without one counts as Outside, as Best's zero result does).
func (bs *bestSet) shares() Shares {
	s := Shares{Total: bs.n}
	var mu sync.Mutex
	forRanges(bs.n, func(lo, hi int) {
		var n [NumClasses]int
		for k := lo; k < hi; k++ {
			c := Outside
			if w, wr := bs.at(k); w >= 0 {
				c = wr.Class
			}
			if int(c) < NumClasses {
				n[c]++
			}
		}
		mu.Lock()
		for c := range n {
			s.Count[c] += n[c]
		}
		mu.Unlock()
	})
	s.Inside = s.Total - s.Count[Outside]
	return s
}

// forRanges calls work(lo, hi) for consecutive ranges covering 0..n-1,
// side by side as forRowBlocks does for rows.
func forRanges(n int, work func(lo, hi int)) {
	const chunk = 1024
	rows := (n + chunk - 1) / chunk
	forRowBlocks(rows, chunk, func() func(i0, i1 int) {
		return func(i0, i1 int) { work(i0*chunk, min(i1*chunk, n)) }
	})
}

// UnionCoverage is the fraction of inside points that at least one of the
// maps matches (full match or Mach relaxed); maps must share one grid.
func UnionCoverage(maps []*Map) float64 { return BestShares(maps).Matched() }

// BestShares counts the best results of Best per class (without making
// Best's arrays: a coverage report of a large grid keeps less at once).
func BestShares(maps []*Map) Shares {
	bs, ok := newBestSet(maps)
	if !ok {
		return sharesOf(nil)
	}
	return bs.shares()
}
