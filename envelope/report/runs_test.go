package report

import (
	"fmt"
	"strings"
	"testing"

	"likewind/envelope"
)

// outRun builds a hand-made gas run.
func outRun(row int, t0, p0, mach float64) Run {
	return Run{GridPoint: envelope.GridPoint{Row: row}, T0: t0, P0: p0, Mach: mach, HasSettings: true, Class: envelope.FullMatch}
}

func runNames(runs []Run, names map[envelope.GridPoint]string) string {
	var b []string
	for _, r := range runs {
		b = append(b, names[r.GridPoint])
	}
	return strings.Join(b, " ")
}

func TestOrderRunsGas(t *testing.T) {
	// Hand-built runs; rows only identify them. Worked by hand:
	// T0 groups {C,E} at 250 K, {A,D,B} within 1 K of 300 K, {F} at
	// 310 K; in the second group p0 groups {B} 1 bar and {A,D} within
	// 0.5 % of 2 bar; Mach ascending inside each.
	in := []struct {
		name         string
		t0, p0, mach float64
	}{
		{"A", 300, 2e5, 0.8},
		{"B", 300.4, 1e5, 0.6},
		{"C", 250, 2e5, 0.7},
		{"D", 300, 2.005e5, 0.5},
		{"E", 250, 2e5, 0.4},
		{"F", 310, 1e5, 0.9},
	}
	names := map[envelope.GridPoint]string{}
	var runs []Run
	for k, r := range in {
		run := outRun(k, r.t0, r.p0, r.mach)
		names[run.GridPoint] = r.name
		runs = append(runs, run)
	}
	before := CountChanges(runs, false)
	// Grid order A..F: T0 moves at B→C, C→D, D→E, E→F (A→B is 0.4 K).
	if before.T0 != 4 {
		t.Errorf("CountChanges(grid order).T0 = %d, want 4", before.T0)
	}
	got := OrderRuns(runs, false)
	if order := runNames(runs, names); order != "E C B D A F" {
		t.Errorf("OrderRuns order = %s, want E C B D A F", order)
	}
	// E→C Mach; C→B all three; B→D p0 and Mach (T0 0.4 K apart);
	// D→A Mach (p0 0.25 % apart); A→F all three.
	want := Changes{T0: 2, P0: 3, Mach: 5, Moved: 5, Steps: 5}
	if got != want {
		t.Errorf("OrderRuns changes = %+v, want %+v", got, want)
	}
}

func TestOrderRunsWater(t *testing.T) {
	// Water: group by temperature, then static pressure, then speed
	// ascending.
	mk := func(row int, temp, speed float64) Run {
		return Run{GridPoint: envelope.GridPoint{Row: row}, T0: temp, P0: 2e5, Speed: speed, HasSettings: true}
	}
	runs := []Run{mk(0, 308, 6), mk(1, 290, 9), mk(2, 308, 2), mk(3, 290, 3), mk(4, 308.5, 4)}
	got := OrderRuns(runs, true)
	var rows []string
	for _, r := range runs {
		rows = append(rows, fmt.Sprint(r.Row))
	}
	// 290 K: speeds 3, 9 (rows 3, 1); 308–308.5 K: speeds 2, 4, 6 (rows
	// 2, 4, 0).
	if s := strings.Join(rows, " "); s != "3 1 2 4 0" {
		t.Errorf("water order rows = %s, want 3 1 2 4 0", s)
	}
	want := Changes{T0: 1, P0: 0, Mach: 4, Moved: 4, Steps: 4}
	if got != want {
		t.Errorf("water changes = %+v, want %+v", got, want)
	}
}

func TestCountChangesEmpty(t *testing.T) {
	if c := CountChanges(nil, false); c != (Changes{}) {
		t.Errorf("CountChanges(nil) = %+v, want zero", c)
	}
	one := []Run{{T0: 300, P0: 1e5, Mach: 0.5}}
	if c := OrderRuns(one, false); c != (Changes{}) {
		t.Errorf("OrderRuns(one run) = %+v, want zero", c)
	}
}

func TestPlanRunsDemo(t *testing.T) {
	g, maps := outDemoMaps(t)
	var tested int
	for _, m := range maps {
		pts := FullMatchPoints(m)
		if len(pts) == 0 {
			continue
		}
		tested++
		// Add a duplicate and an outside point.
		extra := append([]envelope.GridPoint{}, pts...)
		extra = append(extra, pts[0])
		var outside envelope.GridPoint
		found := false
		for i := 0; i < g.Rows() && !found; i++ {
			for j := 0; j < g.Cols() && !found; j++ {
				if !g.Inside(i, j) {
					outside, found = envelope.GridPoint{Row: i, Col: j}, true
				}
			}
		}
		extra = append(extra, outside)
		rl, err := PlanRuns(m, extra)
		if err != nil {
			t.Fatalf("PlanRuns(%s) = %v", m.Facility.Name, err)
		}
		if len(rl.Runs) != len(pts) {
			t.Errorf("%s: %d runs, want %d full-match points", m.Facility.Name, len(rl.Runs), len(pts))
		}
		if len(rl.Unrunnable) != 1 || rl.Unrunnable[0].GridPoint != outside {
			t.Errorf("%s: unrunnable = %+v, want the outside point %v", m.Facility.Name, rl.Unrunnable, outside)
		}
		water := m.Facility.Medium == envelope.MediumWater
		if c := CountChanges(rl.Runs, water); c != rl.Changes {
			t.Errorf("%s: Changes = %+v, CountChanges = %+v", m.Facility.Name, rl.Changes, c)
		}
		if c := rl.Changes; c.Moved > len(rl.Runs)-1 || c.T0 > c.Moved || c.P0 > c.Moved || c.Mach > c.Moved {
			t.Errorf("%s: changes %+v inconsistent with %d runs", m.Facility.Name, c, len(rl.Runs))
		}
		for k, r := range rl.Runs {
			d, _ := m.Detail(r.Row, r.Col)
			if r.T0 != d.T0 || r.P0 != d.P0 || r.Re != d.Re || r.Class != envelope.FullMatch {
				t.Fatalf("%s run %d = %+v, want the settings of Detail (T0 %g, p0 %g, Re %g)", m.Facility.Name, k, r, d.T0, d.P0, d.Re)
			}
			// T0 never falls back by a whole step along the list.
			if k > 0 && r.T0 < rl.Runs[k-1].T0-RunT0Step {
				t.Errorf("%s: T0 falls from %g to %g at run %d", m.Facility.Name, rl.Runs[k-1].T0, r.T0, k)
			}
		}
		// Ordering never needs more T0 changes than grid order.
		grid := append([]Run(nil), rl.Runs...)
		sortGridOrder(grid)
		if naive := CountChanges(grid, water); rl.Changes.T0 > naive.T0 {
			t.Errorf("%s: ordered list has %d T0 changes, grid order %d", m.Facility.Name, rl.Changes.T0, naive.T0)
		}
	}
	if tested == 0 {
		t.Fatal("no demo facility has full-match points")
	}
	if _, err := PlanRuns(maps[0], []envelope.GridPoint{{Row: g.Rows(), Col: 0}}); err == nil {
		t.Error("PlanRuns(off-grid point) = nil error, want an error")
	}
}

func sortGridOrder(rs []Run) {
	for a := 1; a < len(rs); a++ {
		for b := a; b > 0; b-- {
			x, y := rs[b-1].GridPoint, rs[b].GridPoint
			if x.Row < y.Row || (x.Row == y.Row && x.Col <= y.Col) {
				break
			}
			rs[b-1], rs[b] = rs[b], rs[b-1]
		}
	}
}

// TestDefaultRunPoints: without marks a run list holds every matched
// point, Mach-relaxed ones included, for gas tunnels as for water.
func TestDefaultRunPoints(t *testing.T) {
	for _, demo := range []struct {
		maps        func(testing.TB) (*envelope.Grid, []*envelope.Map)
		wantRelaxed bool // the demo has Mach-relaxed gas points
	}{{outDemoMaps, false}, {outSecondDemoMaps, true}} {
		g, maps := demo.maps(t)
		relaxedGas := 0
		for _, m := range maps {
			got := map[envelope.GridPoint]bool{}
			for _, p := range DefaultRunPoints(m) {
				got[p] = true
			}
			for i := 0; i < g.Rows(); i++ {
				for j := 0; j < g.Cols(); j++ {
					c := m.At(i, j).Class
					if got[envelope.GridPoint{Row: i, Col: j}] != c.Matched() {
						t.Fatalf("%s: point (%d, %d) of class %v in the default run list: %v, want %v",
							m.Facility.Name, i, j, c, got[envelope.GridPoint{Row: i, Col: j}], c.Matched())
					}
					if c == envelope.MachRelaxed && m.Facility.Medium.IsGas() {
						relaxedGas++
					}
				}
			}
		}
		if demo.wantRelaxed && relaxedGas == 0 {
			t.Errorf("%s: no Mach-relaxed gas point to test", g.Vehicle.Name)
		}
	}
}

// TestOrderRunsMergesSetPoints: runs with the same set point are one run
// of the facility with several flight points, even when a run with the
// same Mach number but another (nearby) setting sorts between them.
func TestOrderRunsMergesSetPoints(t *testing.T) {
	runs := []Run{
		outRun(0, 300, 2e5, 0.8),
		outRun(1, 300.5, 2.004e5, 0.8), // within every step of row 0, not the same
		outRun(2, 300, 2e5, 0.8),       // row 0's set point
		outRun(3, 300, 2e5*(1+1e-12), 0.8),
	}
	c := OrderRuns(runs, false)
	var got []string
	for _, r := range runs {
		got = append(got, fmt.Sprintf("%d:%d", r.Row, r.SetPoint))
	}
	if s := strings.Join(got, " "); s != "0:1 2:1 3:1 1:2" {
		t.Errorf("OrderRuns rows:set points = %s, want 0:1 2:1 3:1 1:2", s)
	}
	if want := (Changes{Steps: 1}); c != want {
		t.Errorf("OrderRuns changes = %+v, want %+v (one step, within every resolution)", c, want)
	}
}

// TestPlanRunsMergesDemo: in the second demo vehicle's run lists, flight
// points that share a set point (e.g. the Bracken Ness tunnel at p0 max
// and T0 min for two altitudes at the same Mach number) are one run.
func TestPlanRunsMergesDemo(t *testing.T) {
	_, maps := outSecondDemoMaps(t)
	merged := 0
	for _, m := range maps {
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		if len(rl.Runs) == 0 {
			continue
		}
		if rl.Runs[0].SetPoint != 1 || rl.SetPoints != rl.Runs[len(rl.Runs)-1].SetPoint {
			t.Errorf("%s: set points numbered from %d to %d, SetPoints %d", m.Facility.Name,
				rl.Runs[0].SetPoint, rl.Runs[len(rl.Runs)-1].SetPoint, rl.SetPoints)
		}
		for k := 1; k < len(rl.Runs); k++ {
			a, b := &rl.Runs[k-1], &rl.Runs[k]
			switch b.SetPoint {
			case a.SetPoint:
				merged++
				if !sameSetPoint(a, b) {
					t.Errorf("%s: flight points %v and %v share run %d with settings %+v and %+v", m.Facility.Name, a.GridPoint, b.GridPoint, a.SetPoint, *a, *b)
				}
			case a.SetPoint + 1:
			default:
				t.Errorf("%s: run %d follows run %d", m.Facility.Name, b.SetPoint, a.SetPoint)
			}
		}
		// No two runs of the list have the same set point.
		first := map[int]*Run{}
		for k := range rl.Runs {
			r := &rl.Runs[k]
			if _, ok := first[r.SetPoint]; !ok {
				first[r.SetPoint] = r
			}
		}
		for a := 1; a <= rl.SetPoints; a++ {
			for b := a + 1; b <= rl.SetPoints; b++ {
				if sameSetPoint(first[a], first[b]) {
					t.Errorf("%s: runs %d and %d have the same set point", m.Facility.Name, a, b)
				}
			}
		}
		if c := rl.Changes; c.Steps != rl.SetPoints-1 || c.Moved > c.Steps {
			t.Errorf("%s: changes %+v with %d set points", m.Facility.Name, c, rl.SetPoints)
		}
	}
	if merged == 0 {
		t.Error("no two flight points share a set point in the second demo vehicle's run lists")
	}
}

func ExampleOrderRuns() {
	runs := []Run{
		{GridPoint: envelope.GridPoint{Row: 0}, T0: 300, P0: 2e5, Mach: 0.8},
		{GridPoint: envelope.GridPoint{Row: 1}, T0: 250, P0: 2e5, Mach: 0.7},
		{GridPoint: envelope.GridPoint{Row: 2}, T0: 300, P0: 2e5, Mach: 0.5},
		{GridPoint: envelope.GridPoint{Row: 3}, T0: 250, P0: 2e5, Mach: 0.4},
	}
	c := OrderRuns(runs, false)
	for _, r := range runs {
		fmt.Printf("T0 %.0f K  Mach %.1f\n", r.T0, r.Mach)
	}
	fmt.Printf("changes: T0 %d, p0 %d, Mach %d\n", c.T0, c.P0, c.Mach)
	// Output:
	// T0 250 K  Mach 0.4
	// T0 250 K  Mach 0.7
	// T0 300 K  Mach 0.5
	// T0 300 K  Mach 0.8
	// changes: T0 1, p0 0, Mach 3
}
