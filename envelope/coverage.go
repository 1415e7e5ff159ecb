package envelope

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
func Best(maps []*Map) ([]int, []Result) {
	var first *Map
	for _, m := range maps {
		if m != nil {
			first = m
			break
		}
	}
	if first == nil {
		return nil, nil
	}
	g := first.Grid
	n := len(first.Results)
	idx := make([]int, n)
	best := make([]Result, n)
	var use []*Map // the maps taking part, with their index in maps
	var at []int
	allSolved := true
	for f, m := range maps {
		if m == nil || m.Grid != g || len(m.Results) != n {
			continue
		}
		use, at = append(use, m), append(at, f)
		allSolved = allSolved && m.solved
	}
	// Points are independent: ranges of points are decided side by side,
	// each writing only its own slots. Per point the maps are taken in
	// order and a later one replaces the winner only when Better, so ties
	// go to the lower index, as in a map-by-map pass.
	rs := make([][]Result, len(use))
	for u, m := range use {
		rs[u] = m.Results
	}
	forRanges(n, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			if allSolved && len(rs) > 0 && rs[0][k].Class == Outside {
				// Outside the envelope, so Outside in every map Solve made
				// on this grid.
				idx[k] = -1
				continue
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
				if w < 0 || rank < wRank || (rank == wRank && closerToOne(r.ReRatio, wr.ReRatio)) {
					w, wr, wRank = u, r, rank
				}
			}
			if w < 0 {
				idx[k] = -1
				continue
			}
			idx[k], best[k] = at[w], *wr
		}
	})
	return idx, best
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
func UnionCoverage(maps []*Map) float64 {
	_, best := Best(maps)
	return sharesOf(best).Matched()
}

// BestShares counts the best results of Best per class.
func BestShares(maps []*Map) Shares {
	_, best := Best(maps)
	return sharesOf(best)
}
