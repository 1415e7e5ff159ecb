package report

import (
	"fmt"
	"math"
	"sort"

	"likewind/atmos"
	"likewind/envelope"
)

// Set-point resolution of a run list: two runs whose T0 (water:
// temperature), p0 (water: static pressure) or Mach number (water: speed)
// differ by less than these need no change of that setting. Planning
// choices of this program, about the steadiness a facility holds a set
// point to (common practice).
const (
	RunT0Step    = 1.0   // K
	RunP0Frac    = 0.005 // relative
	RunMachStep  = 0.005 // Mach number
	RunSpeedStep = 0.05  // m/s, water speed
)

// RunSameRel is the relative agreement within which two runs have the
// same set point (every setting): they are one run of the facility,
// covering several flight points. Settings solved the same way from the
// same limits agree to rounding; this only absorbs that rounding.
const RunSameRel = 1e-9

// Run is one flight point of a run list: the flight condition it stands
// for and the facility settings that reproduce it, all SI, full precision.
// Flight points with the same set point form one run of the facility: they
// are consecutive in the list and share SetPoint.
type Run struct {
	envelope.GridPoint
	// SetPoint numbers the run (set point) this flight point belongs to,
	// from 1 along the list (0 for a point that cannot be run).
	SetPoint  int
	Altitude  float64 // m, on the vehicle's altitude scale
	GridSpeed float64 // grid speed (Mach, or m/s per the grid's kind)

	FlightMach float64
	FlightTAS  float64 // m/s
	FlightQ    float64 // Pa
	FlightRe   float64

	Class envelope.Class
	Limit envelope.Limit
	Flags envelope.Flags

	// HasSettings is false when the facility has no setting for the
	// point; such runs are listed apart (RunList.Unrunnable).
	HasSettings bool
	// Gas: test Mach number, stagnation pressure and temperature. Water:
	// Mach 0, P0 the test-section static pressure, T0 the water
	// temperature.
	Mach, P0, T0 float64
	Speed        float64 // test-section speed, m/s
	Q            float64 // test-section dynamic pressure, Pa
	Re           float64 // expected model Reynolds number
	ReRatio      float64 // model over flight
}

// Changes counts set-point changes along a run list: how many times, going
// from one run to the next, T0 (water temperature), p0 (static pressure)
// and the Mach number (water speed) must be moved, and how many steps move
// any of them. Steps holds the number of steps from one set point to the
// next (set points − 1).
type Changes struct {
	T0, P0, Mach int
	// Moved counts the steps that move at least one of them.
	Moved int
	Steps int
}

// RunList is one facility's ordered run list.
type RunList struct {
	Facility string
	Medium   envelope.Medium
	Scale    float64
	// SpeedKind is the kind of the grid speed of the runs (Run.GridSpeed).
	SpeedKind atmos.SpeedKind
	// Runs are the flight points in facility order: grouped by T0
	// (ascending), within that by p0 (ascending), then by Mach number
	// ascending (water: by temperature, then speed), so that the slow
	// changes happen least. Flight points with the same set point are
	// consecutive and share Run.SetPoint.
	Runs []Run
	// SetPoints is the number of distinct set points (runs of the
	// facility) in Runs.
	SetPoints int
	// Unrunnable are requested points without facility settings (outside
	// the envelope or out of the facility's Mach range, say), in grid
	// order.
	Unrunnable []Run
	Changes    Changes
}

// FullMatchPoints lists the grid points where m is a full match, in grid
// order.
func FullMatchPoints(m *envelope.Map) []envelope.GridPoint {
	var out []envelope.GridPoint
	g := m.Grid
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if m.At(i, j).Class == envelope.FullMatch {
				out = append(out, envelope.GridPoint{Row: i, Col: j})
			}
		}
	}
	return out
}

// DefaultRunPoints lists the points a run list covers when no test points
// are marked: every matched point (full match or Mach relaxed, gas and
// water alike; a water tunnel only matches with Mach relaxed), in grid
// order.
func DefaultRunPoints(m *envelope.Map) []envelope.GridPoint {
	var out []envelope.GridPoint
	g := m.Grid
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if m.At(i, j).Class.Matched() {
				out = append(out, envelope.GridPoint{Row: i, Col: j})
			}
		}
	}
	return out
}

// PlanRuns builds the run list of facility map m for the given points
// (duplicates are dropped) and orders it with OrderRuns.
func PlanRuns(m *envelope.Map, points []envelope.GridPoint) (RunList, error) {
	rl := RunList{Facility: envelope.CleanText(m.Facility.Name), Medium: m.Facility.Medium, Scale: m.Scale,
		SpeedKind: m.Grid.SpeedKind}
	g := m.Grid
	seen := map[envelope.GridPoint]bool{}
	for _, p := range points {
		if p.Row < 0 || p.Row >= g.Rows() || p.Col < 0 || p.Col >= g.Cols() {
			return RunList{}, fmt.Errorf("run list %s: point (%d, %d) is not on the %d×%d grid",
				m.Facility.Name, p.Row, p.Col, g.Rows(), g.Cols())
		}
		if seen[p] {
			continue
		}
		seen[p] = true
		d, err := m.Detail(p.Row, p.Col)
		if err != nil {
			return RunList{}, fmt.Errorf("run list %s: %w", m.Facility.Name, err)
		}
		r := Run{
			GridPoint: p,
			Altitude:  g.Alts[p.Row], GridSpeed: g.Speeds[p.Col],
			FlightMach: d.Flight.Airspeeds.Mach, FlightTAS: d.Flight.Airspeeds.TAS,
			FlightQ: d.Flight.Q, FlightRe: d.Flight.Re,
			Class: d.Class, Limit: d.Limit, Flags: d.Flags,
			HasSettings: d.HasSettings && d.Flight.Inside,
		}
		if r.HasSettings {
			r.Mach, r.P0, r.T0 = d.Mach, d.P0, d.T0
			r.Speed, r.Q, r.Re, r.ReRatio = d.V, d.Q, d.Re, d.ReRatio
			rl.Runs = append(rl.Runs, r)
		} else {
			rl.Unrunnable = append(rl.Unrunnable, r)
		}
	}
	sort.Slice(rl.Unrunnable, func(a, b int) bool {
		x, y := rl.Unrunnable[a].GridPoint, rl.Unrunnable[b].GridPoint
		if x.Row != y.Row {
			return x.Row < y.Row
		}
		return x.Col < y.Col
	})
	rl.Changes = OrderRuns(rl.Runs, rl.Medium == envelope.MediumWater)
	if n := len(rl.Runs); n > 0 {
		rl.SetPoints = rl.Runs[n-1].SetPoint
	}
	return rl, nil
}

// sameSetPoint reports whether runs a and b have the same settings (T0, p0,
// Mach number and test-section speed) within RunSameRel.
func sameSetPoint(a, b *Run) bool {
	same := func(x, y float64) bool {
		return math.Abs(x-y) <= RunSameRel*math.Max(math.Abs(x), math.Abs(y))
	}
	return same(a.T0, b.T0) && same(a.P0, b.P0) && same(a.Mach, b.Mach) && same(a.Speed, b.Speed)
}

// mergeSetPoints moves every run with the set point of an earlier run (by
// sameSetPoint) up to just after the last run of that set point, keeping
// the order otherwise, and numbers the set points from 1 in Run.SetPoint.
// Runs are bucketed by T0 rounded to the T0 step, so a set point is only
// compared with runs of a neighbouring bucket.
func mergeSetPoints(runs []Run) {
	type group struct {
		first   int   // index of the run that opened the group
		members []int // indices of its runs, in list order
	}
	var groups []*group
	buckets := map[int64][]*group{}
	bucket := func(t0 float64) int64 { return int64(math.Floor(t0 / RunT0Step)) }
	for k := range runs {
		b := bucket(runs[k].T0)
		var home *group
	search:
		for _, nb := range [...]int64{b - 1, b, b + 1} {
			for _, gr := range buckets[nb] {
				if sameSetPoint(&runs[gr.first], &runs[k]) {
					home = gr
					break search
				}
			}
		}
		if home == nil {
			home = &group{first: k}
			groups = append(groups, home)
			buckets[b] = append(buckets[b], home)
		}
		home.members = append(home.members, k)
	}
	out := make([]Run, 0, len(runs))
	for n, gr := range groups {
		for _, k := range gr.members {
			r := runs[k]
			r.SetPoint = n + 1
			out = append(out, r)
		}
	}
	copy(runs, out)
}

// runKeys returns the three set points of a run, slowest to change first,
// with their resolutions: T0, p0 and Mach number, or for water the
// temperature, static pressure and speed.
func runKeys(r *Run, water bool) (k [3]float64, step [3]float64) {
	k = [3]float64{r.T0, r.P0, r.Mach}
	step = [3]float64{RunT0Step, RunP0Frac * math.Abs(r.P0), RunMachStep}
	if water {
		k[2], step[2] = r.Speed, RunSpeedStep
	}
	return k, step
}

// OrderRuns sorts runs into facility order and returns the set-point
// changes along it. Runs are grouped by T0: sorted by T0 ascending, a group
// holds the runs within RunT0Step of its coolest run. Within a T0 group,
// runs are grouped the same way by p0 (within RunP0Frac), and within a p0
// group sorted by Mach number ascending. Water runs use temperature, static
// pressure and speed (RunSpeedStep) instead. Ties keep grid order (altitude,
// then speed). Runs with the same set point (sameSetPoint) are then brought
// together as one run and numbered (Run.SetPoint).
func OrderRuns(runs []Run, water bool) Changes {
	less := func(a, b *Run) bool {
		if a.Row != b.Row {
			return a.Row < b.Row
		}
		return a.Col < b.Col
	}
	key := func(r *Run, level int) float64 {
		k, _ := runKeys(r, water)
		return k[level]
	}
	var order func(rs []Run, level int)
	order = func(rs []Run, level int) {
		sort.SliceStable(rs, func(a, b int) bool {
			ka, kb := key(&rs[a], level), key(&rs[b], level)
			if ka != kb {
				return ka < kb
			}
			return less(&rs[a], &rs[b])
		})
		if level == 2 {
			return
		}
		for start := 0; start < len(rs); {
			_, st := runKeys(&rs[start], water)
			lim := key(&rs[start], level) + st[level]
			end := start + 1
			for end < len(rs) && key(&rs[end], level) < lim {
				end++
			}
			order(rs[start:end], level+1)
			start = end
		}
	}
	order(runs, 0)
	mergeSetPoints(runs)
	return CountChanges(runs, water)
}

// CountChanges counts the set-point changes between consecutive runs: a
// setting changes when it moves by at least its resolution (RunT0Step,
// RunP0Frac of the larger p0, RunMachStep or RunSpeedStep). A flight point
// with the same set point as the one before (sameSetPoint) is no step.
func CountChanges(runs []Run, water bool) Changes {
	var c Changes
	for k := 1; k < len(runs); k++ {
		if sameSetPoint(&runs[k-1], &runs[k]) {
			continue
		}
		c.Steps++
		a, sa := runKeys(&runs[k-1], water)
		b, sb := runKeys(&runs[k], water)
		moved := false
		for level := range a {
			step := math.Max(sa[level], sb[level])
			if math.Abs(b[level]-a[level]) < step {
				continue
			}
			moved = true
			switch level {
			case 0:
				c.T0++
			case 1:
				c.P0++
			case 2:
				c.Mach++
			}
		}
		if moved {
			c.Moved++
		}
	}
	return c
}
