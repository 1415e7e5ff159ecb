package envelope

import (
	"context"
	"slices"
	"testing"
)

// TestReusingEqualsFresh: the grid, the maps and the best of all made into
// arrays full of other values (those of another day and grid size, then
// garbage) are the same as those made into new arrays.
func TestReusingEqualsFresh(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 150, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 150, 0
	s := DefaultSettings(v)
	// The arrays to reuse: a larger grid's, on another day.
	big := *v
	big.Grid.Altitude.Count, big.Grid.Speed.Count = 170, 170
	sOld := s
	sOld.DeltaT = -15
	old, err := NewGrid(&big, sOld)
	if err != nil {
		t.Fatal(err)
	}
	bufs := make([][]Result, len(facs))
	for k := range facs {
		m, err := Solve(old, &facs[k], sOld)
		if err != nil {
			t.Fatal(err)
		}
		bufs[k] = m.Results
	}
	for _, garbage := range []bool{false, true} {
		if garbage {
			for p := range old.points {
				old.points[p] = flightRec{mach: 9, re: 1e9, tas: 3, q: 4, kn: 5, speed: 7, rare: 1, excl: InEnvelope}
			}
			for k := range bufs {
				for p := range bufs[k] {
					bufs[k][p] = Result{Class: FullMatch, Limit: LimitQMax, Flags: FlagRealGas, P0: 1, T0: 2, Q: 3, Re: 4, ReRatio: 1, V: 6}
				}
			}
		}
		fresh, err := NewGrid(v, s)
		if err != nil {
			t.Fatal(err)
		}
		reused, err := NewGridReusing(context.Background(), v, s, old)
		if err != nil {
			t.Fatal(err)
		}
		if &reused.points[0] != &old.points[0] {
			t.Fatal("NewGridReusing made a new array though the old one holds enough")
		}
		if !slices.Equal(reused.points, fresh.points) || reused.inside != fresh.inside || reused.maxMach != fresh.maxMach {
			t.Fatalf("garbage %v: the grid made in the old array differs from a new one", garbage)
		}
		var freshMaps, reusedMaps []*Map
		for k := range facs {
			a, err := Solve(fresh, &facs[k], s)
			if err != nil {
				t.Fatal(err)
			}
			b, err := SolveReusing(context.Background(), reused, &facs[k], s, bufs[k])
			if err != nil {
				t.Fatal(err)
			}
			if &b.Results[0] != &bufs[k][0] {
				t.Fatal("SolveReusing made a new array though the buffer holds enough")
			}
			if !slices.Equal(a.Results, b.Results) || a.Shares() != b.Shares() {
				t.Fatalf("garbage %v: %s solved into a used array differs from a new one", garbage, facs[k].Name)
			}
			freshMaps, reusedMaps = append(freshMaps, a), append(reusedMaps, b)
		}
		wantIdx, wantBest := Best(freshMaps)
		idx := slices.Repeat([]int{3}, len(wantIdx)+9)
		best := slices.Repeat([]Result{{Class: FullMatch, ReRatio: 1}}, len(wantIdx)+9)
		gotIdx, gotBest := BestReusing(reusedMaps, idx, best)
		if !slices.Equal(gotIdx, wantIdx) || !slices.Equal(gotBest, wantBest) {
			t.Fatalf("garbage %v: the best of all made in used arrays differs from a new one", garbage)
		}
		// The next round reuses the maps just made.
		for k := range reusedMaps {
			bufs[k] = reusedMaps[k].Results
		}
		old = reused
	}
}

// TestStopsWhenCancelled: a grid or a map asked for with a context that
// has ended is not made (ctx's error), so a stale what-if stops early.
func TestStopsWhenCancelled(t *testing.T) {
	v, facs, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 200, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 200, 0
	s := DefaultSettings(v)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if g, err := NewGridReusing(ctx, v, s, nil); g != nil || err != context.Canceled {
		t.Errorf("NewGridReusing after cancel = %v, %v; want no grid and context.Canceled", g != nil, err)
	}
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	if m, err := SolveReusing(ctx, g, &facs[0], s, nil); m != nil || err != context.Canceled {
		t.Errorf("SolveReusing after cancel = %v, %v; want no map and context.Canceled", m != nil, err)
	}
}
