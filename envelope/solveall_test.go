package envelope

import (
	"context"
	"errors"
	"fmt"
	"runtime"
	"testing"
)

// SolveAll must give every map exactly as Solve does (results and shares)
// and the best of all exactly as Best and BestShares do, on both demo
// vehicles, at several grid sizes (a block smaller than, equal to and
// larger than a row), on one processor and on several, and when the
// arrays handed in hold older results.
func TestSolveAllEqualsSolveAndBest(t *testing.T) {
	vs, facs := demoFleet(t)
	for _, procs := range []int{1, runtime.GOMAXPROCS(0), 3} {
		for vi, v0 := range vs {
			for _, n := range []int{0, 37, 230} {
				t.Run(fmt.Sprintf("procs%d/vehicle%d/%d", procs, vi, n), func(t *testing.T) {
					defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
					v := *v0
					if n > 0 {
						v.Grid.Altitude.Count, v.Grid.Altitude.Step = n, 0
						v.Grid.Speed.Count, v.Grid.Speed.Step = n+3, 0
					}
					s := DefaultSettings(&v)
					g, err := NewGrid(&v, s)
					if err != nil {
						t.Fatal(err)
					}
					var want []*Map
					for k := range facs {
						m, err := Solve(g, &facs[k], s)
						if err != nil {
							t.Fatalf("Solve(%s): %v", facs[k].Name, err)
						}
						want = append(want, m)
					}
					wantBest, wantRes := Best(want)
					wantShares := BestShares(want)
					// Dirty buffers: the results of another day.
					s2 := s
					s2.DeltaT = 12
					g2, err := NewGrid(&v, s2)
					if err != nil {
						t.Fatal(err)
					}
					old, err := SolveAll(g2, facs, s2)
					if err != nil {
						t.Fatal(err)
					}
					buf := Buffers{Best: old.Best, BestRes: old.BestRes}
					for _, m := range old.Maps {
						buf.Results = append(buf.Results, m.Results)
					}
					for _, b := range []Buffers{{}, buf, {IndexOnly: true}} {
						got, err := SolveAllReusing(context.Background(), g, facs, s, b)
						if err != nil {
							t.Fatal(err)
						}
						for k, m := range got.Maps {
							if got.Errs[k] != nil || m == nil {
								t.Fatalf("%s: %v", facs[k].Name, got.Errs[k])
							}
							if m.Scale != want[k].Scale || m.LoadQ != want[k].LoadQ || m.Shares() != want[k].Shares() {
								t.Errorf("%s: scale %v load q %v shares %+v, want %v %v %+v", facs[k].Name,
									m.Scale, m.LoadQ, m.Shares(), want[k].Scale, want[k].LoadQ, want[k].Shares())
							}
							for p := range m.Results {
								if m.Results[p] != want[k].Results[p] {
									t.Fatalf("%s point %d: %+v, want %+v", facs[k].Name, p, m.Results[p], want[k].Results[p])
								}
							}
						}
						if b.IndexOnly != (got.BestRes == nil) {
							t.Fatalf("IndexOnly %v: best results %d long", b.IndexOnly, len(got.BestRes))
						}
						for p := range wantBest {
							res := Result{}
							if w := got.Best[p]; b.IndexOnly && w >= 0 {
								res = got.Maps[w].Results[p]
							} else if !b.IndexOnly {
								res = got.BestRes[p]
							}
							if got.Best[p] != wantBest[p] || res != wantRes[p] {
								t.Fatalf("best at %d: %d %+v, want %d %+v", p, got.Best[p], res, wantBest[p], wantRes[p])
							}
						}
						if got.BestShares != wantShares {
							t.Errorf("best shares %+v, want %+v", got.BestShares, wantShares)
						}
					}
				})
			}
		}
	}
}

// A facility that cannot be solved has a nil map and its error, and the
// best of all is that of the others; a cancelled context stops the work.
func TestSolveAllUnsolvableAndCancelled(t *testing.T) {
	g, facs, s := demoGridCase(t)
	bad := facs[1]
	bad.Model.Scale = 0
	bad.Width, bad.Height = 0, 0
	two := []Facility{facs[0], bad, facs[2]}
	a, err := SolveAll(g, two, s)
	if err != nil {
		t.Fatal(err)
	}
	if a.Maps[1] != nil || a.Errs[1] == nil {
		t.Fatalf("unsolvable facility: map %v, error %v", a.Maps[1], a.Errs[1])
	}
	wantBest, wantRes := Best([]*Map{a.Maps[0], a.Maps[2]})
	for p := range wantBest {
		w := wantBest[p]
		if w == 1 {
			w = 2 // index among the two solved, 1 is facility 2
		}
		if a.Best[p] != w || a.BestRes[p] != wantRes[p] {
			t.Fatalf("best at %d: %d, want %d", p, a.Best[p], w)
		}
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := SolveAllReusing(ctx, g, facs, s, Buffers{}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled: error %v, want context.Canceled", err)
	}
}

// onFleet runs f on each demo vehicle with its grid set to rows × cols,
// on one processor, on all of them and on three, as subtests.
func onFleet(t *testing.T, rows, cols int, f func(t *testing.T, v *Vehicle, facs []Facility)) {
	vs, facs := demoFleet(t)
	for _, procs := range []int{1, runtime.GOMAXPROCS(0), 3} {
		for vi, v0 := range vs {
			t.Run(fmt.Sprintf("procs%d/vehicle%d", procs, vi), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				v := *v0
				v.Grid.Altitude.Count, v.Grid.Altitude.Step = rows, 0
				v.Grid.Speed.Count, v.Grid.Speed.Step = cols, 0
				f(t, &v, facs)
			})
		}
	}
}

// A staged solve calls ready once, when the window's points are done,
// with maps and a best of all that are already final there; the finished
// maps and best of all are those of the unstaged solve. Where the window
// is empty or the whole grid, ready is not called. Run with -race: ready
// reads its window while the other points are being solved.
func TestSolveStagedWindowFinalEarly(t *testing.T) {
	onFleet(t, 90, 91, func(t *testing.T, v *Vehicle, facs []Facility) {
		s := DefaultSettings(v)
		g, err := NewGrid(v, s)
		if err != nil {
			t.Fatal(err)
		}
		want, err := SolveAll(g, facs, s)
		if err != nil {
			t.Fatal(err)
		}
		cols := g.Cols()
		for _, first := range []Window{
			{Span{30, 47}, Span{20, 50}}, {Span{0, 12}, Span{0, 91}}, {Span{80, 200}, Span{-3, 10}}, {Span{-5, 3}, Span{60, 91}},
		} {
			inFirst := Window{first.Rows.clip(g.Rows()), first.Cols.clip(cols)}
			calls := 0
			got, err := SolveAllStaged(context.Background(), g, facs, s, Buffers{IndexOnly: true}, first, func(a All) {
				calls++
				for p := range want.Best {
					if !inFirst.Has(p/cols, p%cols) {
						continue
					}
					if a.Best[p] != want.Best[p] {
						t.Fatalf("first %v: early best at %d: %d, want %d", first, p, a.Best[p], want.Best[p])
					}
					for k, m := range a.Maps {
						if m.Results[p] != want.Maps[k].Results[p] {
							t.Fatalf("first %v: early %s at %d: %+v, want %+v", first, facs[k].Name, p, m.Results[p], want.Maps[k].Results[p])
						}
					}
				}
			})
			if err != nil {
				t.Fatal(err)
			}
			if calls != 1 {
				t.Errorf("first %v: ready called %d times, want once", first, calls)
			}
			for p := range want.Best {
				if got.Best[p] != want.Best[p] {
					t.Fatalf("first %v: best at %d: %d, want %d", first, p, got.Best[p], want.Best[p])
				}
			}
			for k, m := range got.Maps {
				if m.Shares() != want.Maps[k].Shares() {
					t.Errorf("first %v: %s shares %+v, want %+v", first, facs[k].Name, m.Shares(), want.Maps[k].Shares())
				}
				for p := range m.Results {
					if m.Results[p] != want.Maps[k].Results[p] {
						t.Fatalf("first %v: %s at %d differs", first, facs[k].Name, p)
					}
				}
			}
			if got.BestShares != want.BestShares {
				t.Errorf("first %v: best shares %+v, want %+v", first, got.BestShares, want.BestShares)
			}

			// One facility, staged the same way.
			calls = 0
			m, err := SolveStaged(context.Background(), g, &facs[2], s, nil, first, func(e *Map) {
				calls++
				for p := range e.Results {
					if !inFirst.Has(p/cols, p%cols) {
						continue
					}
					if e.Results[p] != want.Maps[2].Results[p] {
						t.Fatalf("first %v: early one-facility result at %d differs", first, p)
					}
				}
			})
			if err != nil {
				t.Fatal(err)
			}
			if calls != 1 || m.Shares() != want.Maps[2].Shares() {
				t.Errorf("first %v: one facility: ready called %d times, shares %+v, want once, %+v", first, calls, m.Shares(), want.Maps[2].Shares())
			}
		}
		for _, first := range []Window{{}, {Span{0, g.Rows()}, Span{0, cols}}, {Span{-3, g.Rows() + 4}, Span{-1, cols + 1}},
			{Span{200, 300}, Span{0, 10}}, {Span{0, 10}, Span{}}, {Span{0, 10}, Span{95, 99}}} {
			if _, err := SolveAllStaged(context.Background(), g, facs, s, Buffers{}, first, func(All) {
				t.Errorf("first %v: ready called", first)
			}); err != nil {
				t.Fatal(err)
			}
			if _, err := SolveStaged(context.Background(), g, &facs[0], s, nil, first, func(*Map) {
				t.Errorf("first %v: one facility: ready called", first)
			}); err != nil {
				t.Fatal(err)
			}
		}
	})
}

// A staged grid has the window's rows, every row's atmosphere and the
// highest inside Mach number at once, and after rest is the grid NewGrid
// makes, point for point; a staged grid and staged solve together give
// the unstaged maps. Run with -race: the window is read while rest runs.
func TestNewGridStagedEqualsNewGrid(t *testing.T) {
	onFleet(t, 120, 111, func(t *testing.T, v *Vehicle, facs []Facility) {
		s := DefaultSettings(v)
		s.DeltaT = 6
		want, err := NewGrid(v, s)
		if err != nil {
			t.Fatal(err)
		}
		wantAll, err := SolveAll(want, facs, s)
		if err != nil {
			t.Fatal(err)
		}
		// Dirty buffers: a grid of another day.
		s2 := s
		s2.DeltaT = -20
		old, _, err := NewGridStaged(context.Background(), v, s2, nil, Window{Span{10, 30}, Span{0, 20}})
		if err != nil {
			t.Fatal(err)
		}
		cols := want.Cols()
		for _, first := range []Window{{Span{40, 70}, Span{30, 60}}, {Span{0, 5}, Span{0, 111}}, {Span{100, 130}, Span{-4, 200}}} {
			for _, buf := range []*Grid{nil, old} {
				g, rest, err := NewGridStaged(context.Background(), v, s, buf, first)
				if err != nil {
					t.Fatal(err)
				}
				if g.maxMach != want.maxMach {
					t.Fatalf("first %v: highest inside Mach %v before the rest, want %v", first, g.maxMach, want.maxMach)
				}
				for i := range want.Rows() {
					if g.rows[i] != want.rows[i] {
						t.Fatalf("first %v: row %d atmosphere differs before the rest", first, i)
					}
				}
				win := first.Within(want.Rows(), cols)
				calls := 0
				all, err := SolveAllStaged(context.Background(), g, facs, s, Buffers{IndexOnly: true}, first, func(a All) {
					calls++
					for p := range want.points {
						if i := p / cols; win.Rows.Has(i) && g.points[p] != want.points[p] {
							t.Fatalf("first %v: window row %d point differs before the rest", first, i)
						}
						if win.Has(p/cols, p%cols) && a.Best[p] != wantAll.Best[p] {
							t.Fatalf("first %v: early best at %d differs", first, p)
						}
					}
					if err := rest(); err != nil {
						t.Fatal(err)
					}
				})
				if err != nil {
					t.Fatal(err)
				}
				if calls != 1 {
					t.Fatalf("first %v: ready called %d times", first, calls)
				}
				if err := rest(); err != nil { // again: nothing more
					t.Fatal(err)
				}
				if g.inside != want.inside || g.maxMach != want.maxMach {
					t.Errorf("first %v: inside %d max Mach %v, want %d %v", first, g.inside, g.maxMach, want.inside, want.maxMach)
				}
				for p := range want.points {
					if g.points[p] != want.points[p] {
						t.Fatalf("first %v: point %d differs: %+v, want %+v", first, p, g.points[p], want.points[p])
					}
				}
				for k, m := range all.Maps {
					if m.Shares() != wantAll.Maps[k].Shares() || m.Scale != wantAll.Maps[k].Scale {
						t.Errorf("first %v: %s shares %+v scale %v, want %+v %v", first, facs[k].Name, m.Shares(), m.Scale, wantAll.Maps[k].Shares(), wantAll.Maps[k].Scale)
					}
					for p := range m.Results {
						if m.Results[p] != wantAll.Maps[k].Results[p] {
							t.Fatalf("first %v: %s at %d differs", first, facs[k].Name, p)
						}
					}
				}
			}
		}
	})
}
