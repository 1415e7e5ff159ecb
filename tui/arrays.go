package tui

import (
	"slices"
	"sync"

	"likewind/envelope"
)

// arrays keeps the large arrays of results the running interface has
// replaced (a grid's points, a map's results, the best of all), so the
// next recompute makes its results in them instead of allocating,
// clearing and collecting tens of MB per what-if edit.
//
// Results are never changed in place, and commands read them beside the
// interface (a recompute reads the results it started from, the study a
// map, the view writer the view), so an array is handed out again only
// when nothing can read it any more: a replaced array is retired, and
// retired arrays become free only when no command that started before is
// still out. A command counts as out from when it is made (begin, in
// Update) until the root has taken its message (end), so an array a
// stale recompute shares with the results it started from is retired
// once (retire skips arrays it holds already) and is never in a result
// and free at the same time.
//
// Only Run sets one up: a model driven without the runtime (tests, a
// copy kept to compare) has none, and every method of a nil *arrays does
// nothing.
type arrays struct {
	mu      sync.Mutex
	out     int // commands made whose message the root has not taken yet
	pending arraySet
	free    arraySet
	held    map[any]bool // first elements of the arrays in pending and free
}

// arraySet is a set of arrays of each kind.
type arraySet struct {
	results [][]envelope.Result
	ints    [][]int
	grids   []*envelope.Grid
}

// maxFree caps how many free arrays of each kind are kept: one
// recompute of every facility takes a map per facility and the best of
// all, so a few more than the demo's six facilities and one to spare.
const maxFree = 8

func newArrays() *arrays { return &arrays{held: map[any]bool{}} }

// begin counts a command that reads results as out.
func (a *arrays) begin() {
	if a == nil {
		return
	}
	a.mu.Lock()
	a.out++
	a.mu.Unlock()
}

// end counts its message taken; with no command out, the retired arrays
// become free.
func (a *arrays) end() {
	if a == nil {
		return
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	a.out = max(a.out-1, 0)
	if a.out > 0 {
		return
	}
	p := &a.pending
	a.free.results = append(a.free.results, p.results...)
	a.free.ints = append(a.free.ints, p.ints...)
	a.free.grids = append(a.free.grids, p.grids...)
	*p = arraySet{}
	a.trim()
}

// trim drops the oldest free arrays beyond maxFree of a kind.
func (a *arrays) trim() {
	f := &a.free
	for len(f.results) > maxFree {
		delete(a.held, &f.results[0][0])
		f.results[0] = nil // let the collector have it
		f.results = f.results[1:]
	}
	for len(f.ints) > maxFree {
		delete(a.held, &f.ints[0][0])
		f.ints[0] = nil
		f.ints = f.ints[1:]
	}
	for len(f.grids) > maxFree {
		delete(a.held, f.grids[0])
		f.grids[0] = nil
		f.grids = f.grids[1:]
	}
}

// retire takes the arrays of old that keep does not use.
func (a *arrays) retire(old, keep *results) {
	if a == nil {
		return
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	inKeep := func(m *envelope.Map) bool {
		for _, k := range keep.maps {
			if k == m {
				return true
			}
		}
		return false
	}
	addResults := func(rs []envelope.Result, used []envelope.Result) {
		if len(rs) == 0 || (len(used) > 0 && &used[0] == &rs[0]) || a.held[&rs[0]] {
			return
		}
		a.held[&rs[0]] = true
		a.pending.results = append(a.pending.results, rs)
	}
	for _, m := range old.maps {
		if m != nil && !inKeep(m) {
			addResults(m.Results, nil)
		}
	}
	if is := old.best; len(is) > 0 && (len(keep.best) == 0 || &keep.best[0] != &is[0]) && !a.held[&is[0]] {
		a.held[&is[0]] = true
		a.pending.ints = append(a.pending.ints, is)
	}
	if g := old.grid; g != nil && g != keep.grid && !a.held[g] {
		a.held[g] = true
		a.pending.grids = append(a.pending.grids, g)
	}
	// While edits keep commands out, retired arrays wait; past a bound
	// the oldest go to the collector (an array dropped here is no
	// one's, so retiring it again later is as safe as the first time).
	p := &a.pending
	for len(p.results) > 2*maxFree {
		delete(a.held, &p.results[0][0])
		p.results[0] = nil
		p.results = p.results[1:]
	}
	for len(p.ints) > 2*maxFree {
		delete(a.held, &p.ints[0][0])
		p.ints[0] = nil
		p.ints = p.ints[1:]
	}
	for len(p.grids) > 2*maxFree {
		delete(a.held, p.grids[0])
		p.grids[0] = nil
		p.grids = p.grids[1:]
	}
}

// takeResults is a free results array of at least n points, or nil.
func (a *arrays) takeResults(n int) []envelope.Result {
	if a == nil {
		return nil
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	f := &a.free
	for k := len(f.results) - 1; k >= 0; k-- {
		if rs := f.results[k]; cap(rs) >= n {
			f.results = slices.Delete(f.results, k, k+1) // clears the freed slot
			delete(a.held, &rs[0])
			return rs
		}
	}
	return nil
}

// takeInts is a free index array of at least n points, or nil.
func (a *arrays) takeInts(n int) []int {
	if a == nil {
		return nil
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	f := &a.free
	for k := len(f.ints) - 1; k >= 0; k-- {
		if is := f.ints[k]; cap(is) >= n {
			f.ints = slices.Delete(f.ints, k, k+1)
			delete(a.held, &is[0])
			return is
		}
	}
	return nil
}

// takeGrid is a free grid whose points array NewGridReusing may use, or
// nil.
func (a *arrays) takeGrid() *envelope.Grid {
	if a == nil {
		return nil
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	f := &a.free
	if len(f.grids) == 0 {
		return nil
	}
	g := f.grids[len(f.grids)-1]
	f.grids[len(f.grids)-1] = nil
	f.grids = f.grids[:len(f.grids)-1]
	delete(a.held, g)
	return g
}
