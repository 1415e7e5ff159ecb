package tui

import (
	"context"
	"errors"
	"slices"
	"testing"

	"likewind/envelope"
)

// checkFresh compares every map and the best of all of m with a fresh
// evaluation of m's what-if state.
func checkFresh(t *testing.T, m Model, step string) {
	t.Helper()
	if m.busy {
		t.Fatalf("%s: still computing", step)
	}
	e, err := envelope.Evaluate(m.vehicle, m.facs, m.set)
	if err != nil {
		t.Fatal(err)
	}
	for k := range m.facs {
		if !slices.Equal(m.res.maps[k].Results, e.Maps[k].Results) {
			t.Fatalf("%s: %s differs from a fresh evaluation", step, m.facs[k].Name)
		}
	}
	best, bestRes := BestOfAll(e.Maps)
	if !slices.Equal(m.res.best, best) {
		t.Fatalf("%s: the best of all differs from a fresh evaluation", step)
	}
	for p := range bestRes {
		if r, _ := m.res.bestAt(p); r != bestRes[p] {
			t.Fatalf("%s: the best answer at %d differs from a fresh evaluation", step, p)
		}
	}
	sh := envelope.BestShares(e.Solved())
	if m.res.union != sh.Matched() || m.res.bestFull != sh.Share(envelope.FullMatch) {
		t.Fatalf("%s: union %v, best full %v; a fresh evaluation gives %v, %v", step, m.res.union, m.res.bestFull,
			sh.Matched(), sh.Share(envelope.FullMatch))
	}
	if a := m.arrays; a != nil {
		// No array the results use is shared between two of their parts
		// or waiting to be handed out, and every array waiting is there
		// once.
		used := map[*envelope.Result]bool{}
		for _, p := range resultArrays(m.res) {
			if used[p] {
				t.Fatalf("%s: two parts of the results share an array", step)
			}
			used[p] = true
		}
		waiting := map[*envelope.Result]bool{}
		for _, rs := range append(slices.Clone(a.pending.results), a.free.results...) {
			if used[&rs[0]] {
				t.Fatalf("%s: an array in use is waiting to be handed out", step)
			}
			if waiting[&rs[0]] {
				t.Fatalf("%s: an array waits twice", step)
			}
			waiting[&rs[0]] = true
		}
	}
}

// resultArrays are the first elements of the result arrays of r.
func resultArrays(r results) []*envelope.Result {
	var out []*envelope.Result
	for _, m := range r.maps {
		if m != nil && len(m.Results) > 0 {
			out = append(out, &m.Results[0])
		}
	}
	return out
}

// TestArraysReusedStayCorrect: with replaced arrays reused, as Run does,
// every recompute still equals a fresh evaluation: ΔT, p0 max of several
// facilities, a scale step, undo and restore, and two recomputes whose
// messages come back newest first (the older one stale, sharing the maps
// it started from). The arrays must in fact be reused.
func TestArraysReusedStayCorrect(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.arrays = newArrays()
	seen := map[*envelope.Result]bool{}
	reused := 0
	note := func() {
		for _, p := range resultArrays(m.res) {
			if seen[p] {
				reused++
			}
			seen[p] = true
		}
	}
	note()
	steps := []struct {
		name string
		keys []string
	}{
		{"ΔT", []string{"e", "down", "enter", "ctrl+u", "1", "0", "K", "enter", "esc"}},
		{"p0 max", []string{"e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "3", "b", "a", "r", "enter", "esc"}},
		{"next facility p0 max", []string{"]", "e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "2", "b", "a", "r", "enter", "esc"}},
		{"ΔT again", []string{"e", "down", "enter", "ctrl+u", "-", "5", "K", "enter", "esc"}},
		{"scale up", []string{"+"}},
		{"undo", []string{"U"}},
		{"undo", []string{"U"}},
		{"restore", []string{"R"}},
		{"best of all ΔT", []string{"b", "e", "down", "enter", "ctrl+u", "4", "K", "enter", "esc"}},
	}
	for _, s := range steps {
		m, _ = press(m, s.keys...)
		checkFresh(t, m, s.name)
		note()
	}
	// Two recomputes out at once; the newer comes back first, then the
	// stale one, then a further edit.
	m.set.DeltaT = 3
	start := m.res
	c1 := m.recompute(recomputeGrid)
	m.set.DeltaT = 7
	c2 := m.recompute(recomputeGrid)
	out2 := finished(c2)
	m, _ = drive(m, out2)
	// c1 is still out and reads the results it started from: none of
	// their arrays may be handed out yet.
	for _, p := range resultArrays(start) {
		for _, rs := range m.arrays.free.results {
			if &rs[0] == p {
				t.Fatal("an array a command still out reads was made free")
			}
		}
	}
	out1 := finished(c1)
	m, _ = drive(m, out1)
	checkFresh(t, m, "newest first")
	m.fac = facilityNamed(t, m, "Harl Cove")
	m, _ = press(m, "e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "4", "b", "a", "r", "enter", "esc")
	checkFresh(t, m, "after the stale one")
	// One-facility recomputes out at once, stale one last.
	p0 := m.facs[m.fac].PressureMax()
	m.facs = slices.Clone(m.facs)
	m.facs[m.fac].SetPressureMax(0.9 * p0)
	c1 = m.recompute(recomputeOneFac)
	m.facs = slices.Clone(m.facs)
	m.facs[m.fac].SetPressureMax(0.8 * p0)
	c2 = m.recompute(recomputeOneFac)
	out1, out2 = finished(c1), finished(c2)
	m, _ = drive(m, out2, out1)
	checkFresh(t, m, "one facility, newest first")
	m, _ = press(m, "e", "down", "enter", "ctrl+u", "2", "K", "enter", "esc")
	checkFresh(t, m, "ΔT after")
	// A one-facility recompute, then a grid one: the stale first shares
	// the maps of the results both started from, which the second
	// replaced; they must be retired once only.
	m.facs = slices.Clone(m.facs)
	m.facs[m.fac].SetPressureMax(0.85 * p0)
	c1 = m.recompute(recomputeOneFac)
	m.set.DeltaT = -3
	c2 = m.recompute(recomputeGrid)
	out1, out2 = finished(c1), finished(c2)
	m, _ = drive(m, out2, out1)
	checkFresh(t, m, "grid, then the stale one-facility")
	for _, keys := range [][]string{{"e", "down", "enter", "ctrl+u", "6", "K", "enter", "esc"},
		{"e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "3", "b", "a", "r", "enter", "esc"},
		{"e", "down", "enter", "ctrl+u", "1", "K", "enter", "esc"}} {
		m, _ = press(m, keys...)
		checkFresh(t, m, "after the double retire")
	}
	note()
	if m.arrays.out != 0 {
		t.Errorf("%d commands still counted out after every message was taken", m.arrays.out)
	}
	if reused == 0 {
		t.Error("no result array was reused")
	}
}

// TestStaleRecomputeStops: a recompute superseded by a newer one is
// cancelled and its message dropped, while the cursor moves as usual
// before either is back; the newer one's results are those of a fresh
// evaluation. (That a cancelled solve stops: TestStopsWhenCancelled.)
func TestStaleRecomputeStops(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.arrays = newArrays()
	m.set.DeltaT = 4
	c1 := m.recompute(recomputeGrid)
	i, j := m.curI, m.curJ
	next, _ := m.Update(keyMsg("up"))
	m = next.(Model)
	if !m.busy || m.curI == i && m.curJ == j {
		t.Fatalf("while computing: busy %v, cursor (%d,%d) → (%d,%d); want the cursor moved", m.busy, i, j, m.curI, m.curJ)
	}
	m.set.DeltaT = 8
	c2 := m.recompute(recomputeGrid)
	out1 := finished(c1)
	// It was running already: it stopped (context.Canceled) or, on this
	// small grid, may have finished first; either way it is dropped.
	if msg, ok := out1.(computedMsg); !ok || msg.err != nil && !errors.Is(msg.err, context.Canceled) {
		t.Fatalf("the superseded recompute gave %#v, want results or its context.Canceled", out1)
	}
	m, _ = drive(m, out1)
	if !m.busy || m.statusErr {
		t.Fatalf("the stale message changed the state: busy %v, status %q", m.busy, m.status)
	}
	m, _ = drive(m, finished(c2))
	checkFresh(t, m, "after the stale one stopped")
}
