package envelope

import (
	"math"
	"testing"
)

// TestBestAndUnion works four points by hand over two facilities:
//
//	point  A                    B                     best
//	0      outside              outside               -1
//	1      full match 1.00      Mach relaxed 1.00     A (better class)
//	2      Reynolds short 0.50  full match 0.95       B
//	3      out of reach         Reynolds short 0.70   B
//
// Union coverage: points 1 and 2 of the three inside points are matched,
// 2/3.
func TestBestAndUnion(t *testing.T) {
	g := &Grid{}
	a := &Map{Grid: g, Results: []Result{
		{}, {Class: FullMatch, ReRatio: 1}, {Class: ReShort, ReRatio: 0.5}, {Class: NoMatch},
	}}
	b := &Map{Grid: g, Results: []Result{
		{}, {Class: MachRelaxed, ReRatio: 1}, {Class: FullMatch, ReRatio: 0.95}, {Class: ReShort, ReRatio: 0.7},
	}}
	idx, best := Best([]*Map{a, b})
	wantIdx := []int{-1, 0, 1, 1}
	wantClass := []Class{Outside, FullMatch, FullMatch, ReShort}
	for k := range wantIdx {
		if idx[k] != wantIdx[k] || best[k].Class != wantClass[k] {
			t.Errorf("Best point %d = facility %d %v, want %d %v", k, idx[k], best[k].Class, wantIdx[k], wantClass[k])
		}
	}
	if got := UnionCoverage([]*Map{a, b}); math.Abs(got-2.0/3) > 1e-15 {
		t.Errorf("UnionCoverage = %v, want 2/3", got)
	}
	sa := a.Shares()
	if sa.Total != 4 || sa.Inside != 3 || sa.Count[FullMatch] != 1 || sa.Count[ReShort] != 1 || sa.Count[NoMatch] != 1 {
		t.Errorf("Shares(A) = %+v", sa)
	}
	if got := sa.Share(FullMatch); math.Abs(got-1.0/3) > 1e-15 {
		t.Errorf("Share(full match) = %v, want 1/3", got)
	}
	if got := sa.Share(Outside); got != 0.25 {
		t.Errorf("Share(outside) = %v, want 1/4 of all points", got)
	}
	if got := BestShares([]*Map{a, b}).Matched(); math.Abs(got-2.0/3) > 1e-15 {
		t.Errorf("BestShares matched = %v, want 2/3", got)
	}
	// A map on another grid is left out.
	other := &Map{Grid: &Grid{}, Results: []Result{{}, {Class: NoMatch}, {Class: FullMatch, ReRatio: 1}, {Class: FullMatch, ReRatio: 1}}}
	if got := UnionCoverage([]*Map{a, other}); math.Abs(got-1.0/3) > 1e-15 {
		t.Errorf("UnionCoverage with a foreign map = %v, want A's own 1/3", got)
	}
	idx, _ = Best([]*Map{nil, b})
	if idx[1] != 1 || idx[2] != 1 {
		t.Errorf("Best with a nil map first: indexes %v, want B's index 1 kept", idx)
	}
	if idx, best := Best(nil); idx != nil || best != nil {
		t.Error("Best(nil) should return nil slices")
	}
	// BestClasses: the winners' classes alone, Outside where there is
	// none.
	got := BestClasses([]*Map{a, b})
	for k, want := range wantClass {
		if got[k] != want {
			t.Errorf("BestClasses point %d = %v, want %v", k, got[k], want)
		}
	}
	if BestClasses(nil) != nil {
		t.Error("BestClasses(nil) should be nil")
	}
}

// TestBestClassesOfRealMaps: on a solved grid, BestClasses is the class
// of Best's winner at every point.
func TestBestClassesOfRealMaps(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	var maps []*Map
	for _, f := range []Facility{cryoTunnel(), benchFacilities()[1], waterTunnel()} {
		m, err := Solve(g, &f, testSettings())
		if err != nil {
			t.Fatal(err)
		}
		maps = append(maps, m)
	}
	_, best := Best(maps)
	classes := BestClasses(maps)
	if len(classes) != len(best) {
		t.Fatalf("%d classes, want %d", len(classes), len(best))
	}
	for k := range best {
		if classes[k] != best[k].Class {
			t.Fatalf("point %d: class %v, Best's winner %v", k, classes[k], best[k].Class)
		}
	}
}

// TestUnionOfRealMaps: the union over facilities covers at least what
// each facility covers on its own, on a solved grid.
func TestUnionOfRealMaps(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	var maps []*Map
	for _, f := range []Facility{cryoTunnel(), benchFacilities()[1], benchFacilities()[2], waterTunnel()} {
		f := f
		m, err := Solve(g, &f, testSettings())
		if err != nil {
			t.Fatal(err)
		}
		maps = append(maps, m)
	}
	u := UnionCoverage(maps)
	for _, m := range maps {
		if s := m.Shares().Matched(); s > u+1e-15 {
			t.Errorf("%s covers %v alone, more than the union %v", m.Facility.Name, s, u)
		}
	}
	idx, best := Best(maps)
	// BestShares counts without Best's arrays: the same counts as the
	// winners Best keeps, with the points no map has inside as Outside.
	want := Shares{Total: len(best)}
	for k, r := range best {
		if idx[k] < 0 {
			want.Count[Outside]++
			continue
		}
		want.Count[r.Class]++
	}
	want.Inside = want.Total - want.Count[Outside]
	if got := BestShares(maps); got != want {
		t.Errorf("BestShares = %+v, want the counts of Best's winners %+v", got, want)
	}
	for k, r := range best {
		if idx[k] < 0 {
			continue
		}
		for _, m := range maps {
			if Better(m.Results[k], r) {
				t.Errorf("point %d: %s has a better result than the chosen one", k, m.Facility.Name)
			}
		}
	}
}
