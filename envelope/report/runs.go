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
	RunQFrac     = 0.005 // relative, test-section q where the rule holds it
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
// and the Mach number (water speed) must be moved, and, where the
// operating rule holds the test-section dynamic pressure (RunOrder.HoldQ),
// q; and how many steps move any of them. Steps holds the number of steps
// from one set point to the next (set points − 1).
type Changes struct {
	T0, P0, Mach int
	// Q counts the moves of q; only a run list that holds q counts them
	// (0 otherwise: q then follows the other settings).
	Q int
	// Moved counts the steps that move at least one of them.
	Moved int
	Steps int
}

// RunOrder is how a run list is ordered and its changes counted, as the
// operating rule in force sets it (OrderFor). Runs are grouped by the
// slowest setting to change first: T0, then p0, then the Mach number
// ascending (water: temperature, static pressure, speed) — under a fixed
// T0 or water temperature every run shares the first, so only p0 and the
// Mach number move. Under a fixed q (HoldQ) q is the shared setting and
// the Reynolds number is varied by T0: runs are grouped by q, then T0,
// then the Mach number ascending (p0 follows q and the Mach number), and
// moves of q are counted too.
type RunOrder struct {
	Water bool
	HoldQ bool
}

// OrderFor is the run order of a facility of medium m under rule r.
func OrderFor(r envelope.OperatingRule, m envelope.Medium) RunOrder {
	water := m == envelope.MediumWater
	return RunOrder{Water: water, HoldQ: !water && r.Kind == envelope.RuleFixedQ}
}

// Settings of a run, as runSettings lists them.
const (
	settingT0   = iota // T0, or the water temperature
	settingP0          // p0, or the water's static pressure
	settingMach        // test Mach number, or the water speed
	settingQ           // test-section dynamic pressure
	numSettings
)

// levels are the settings the runs are grouped by, slowest first; the
// last is sorted ascending within the groups of the others.
func (o RunOrder) levels() [3]int {
	if o.HoldQ {
		return [3]int{settingQ, settingT0, settingMach}
	}
	return [3]int{settingT0, settingP0, settingMach}
}

// Keys names the grouping settings in order as the JSON run list's change
// counts do: "t0", "p0", "mach" and "q" (for water, t0, p0 and mach are the
// water temperature, static pressure and speed).
func (o RunOrder) Keys() []string {
	names := [numSettings]string{settingT0: "t0", settingP0: "p0", settingMach: "mach", settingQ: "q"}
	var out []string
	for _, l := range o.levels() {
		out = append(out, names[l])
	}
	return out
}

// RunList is one facility's ordered run list.
type RunList struct {
	Facility string
	Medium   envelope.Medium
	Scale    float64
	// SpeedKind is the kind of the grid speed of the runs (Run.GridSpeed).
	SpeedKind atmos.SpeedKind
	// Rule is the operating rule the facility's settings were picked by,
	// and Order the run order it sets (OrderFor).
	Rule  envelope.OperatingRule
	Order RunOrder
	// Runs are the flight points in facility order (see RunOrder): by
	// default grouped by T0 (ascending), within that by p0 (ascending),
	// then by Mach number ascending (water: by temperature, then speed),
	// so that the slow changes happen least. Flight points with the same
	// set point are consecutive and share Run.SetPoint.
	Runs []Run
	// SetPoints is the number of distinct set points (runs of the
	// facility) in Runs.
	SetPoints int
	// Unrunnable are requested points without facility settings (outside
	// the envelope or out of the facility's Mach range, say), in grid
	// order.
	Unrunnable []Run
	Changes    Changes
	// Given are the runnable flight points in the order they were given
	// (marked test points in the session's order, or grid order), for the
	// time the facility order saves (NewCampaignCost).
	Given []Run
	// Campaign is the facility's time and cost data (none: zero) and
	// SectionArea its test-section area, m², for the blow duration.
	Campaign    envelope.Campaign
	SectionArea float64
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
// (duplicates are dropped) and orders it in the order of the map's
// operating rule (OrderFor, RunOrder.Order).
func PlanRuns(m *envelope.Map, points []envelope.GridPoint) (RunList, error) {
	rl := RunList{Facility: envelope.CleanText(m.Facility.Name), Medium: m.Facility.Medium, Scale: m.Scale,
		SpeedKind: m.Grid.SpeedKind, Rule: m.Rule, Order: OrderFor(m.Rule, m.Facility.Medium),
		Campaign: m.Facility.Campaign, SectionArea: m.Facility.Width * m.Facility.Height}
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
	rl.Given = append([]Run(nil), rl.Runs...)
	rl.Changes = rl.Order.Order(rl.Runs)
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

// runSettings returns the settings of a run with their resolutions, in
// the order of the setting constants: T0, p0, Mach number and q, or for
// water the temperature, static pressure, speed and q.
func runSettings(r *Run, water bool) (k, step [numSettings]float64) {
	k = [numSettings]float64{r.T0, r.P0, r.Mach, r.Q}
	step = [numSettings]float64{RunT0Step, RunP0Frac * math.Abs(r.P0), RunMachStep, RunQFrac * math.Abs(r.Q)}
	if water {
		k[settingMach], step[settingMach] = r.Speed, RunSpeedStep
	}
	return k, step
}

// OrderRuns sorts runs into the standard facility order (the order of
// every rule but a fixed q: RunOrder{Water: water}.Order) and returns the
// set-point changes along it.
func OrderRuns(runs []Run, water bool) Changes { return RunOrder{Water: water}.Order(runs) }

// CountChanges counts the set-point changes between consecutive runs in
// the standard order (RunOrder{Water: water}.Count).
func CountChanges(runs []Run, water bool) Changes { return RunOrder{Water: water}.Count(runs) }

// Order sorts runs into facility order and returns the set-point changes
// along it. Sorted by the first grouping setting (o.levels) ascending, a
// group holds the runs within that setting's resolution of its lowest run
// (RunT0Step, RunP0Frac or RunQFrac of it); within a group, runs are
// grouped the same way by the second setting, and within that sorted by
// the last (the Mach number, or the water speed) ascending. Ties keep
// grid order (altitude, then speed). Runs with the same set point
// (sameSetPoint) are then brought together as one run and numbered
// (Run.SetPoint).
func (o RunOrder) Order(runs []Run) Changes {
	levels := o.levels()
	less := func(a, b *Run) bool {
		if a.Row != b.Row {
			return a.Row < b.Row
		}
		return a.Col < b.Col
	}
	key := func(r *Run, level int) (x, step float64) {
		k, st := runSettings(r, o.Water)
		return k[levels[level]], st[levels[level]]
	}
	var order func(rs []Run, level int)
	order = func(rs []Run, level int) {
		sort.SliceStable(rs, func(a, b int) bool {
			ka, _ := key(&rs[a], level)
			kb, _ := key(&rs[b], level)
			if ka != kb {
				return ka < kb
			}
			return less(&rs[a], &rs[b])
		})
		if level == len(levels)-1 {
			return
		}
		for start := 0; start < len(rs); {
			k0, st := key(&rs[start], level)
			lim := k0 + st
			end := start + 1
			for end < len(rs) {
				if k, _ := key(&rs[end], level); k >= lim {
					break
				}
				end++
			}
			order(rs[start:end], level+1)
			start = end
		}
	}
	order(runs, 0)
	mergeSetPoints(runs)
	return o.Count(runs)
}

// Count counts the set-point changes between consecutive runs: a setting
// changes when it moves by at least its resolution (RunT0Step, RunP0Frac
// of the larger p0, RunMachStep or RunSpeedStep, and where o holds q,
// RunQFrac of the larger q). A flight point with the same set point as the
// one before (sameSetPoint) is no step.
func (o RunOrder) Count(runs []Run) Changes {
	var c Changes
	for k := 1; k < len(runs); k++ {
		if sameSetPoint(&runs[k-1], &runs[k]) {
			continue
		}
		c.Steps++
		a, sa := runSettings(&runs[k-1], o.Water)
		b, sb := runSettings(&runs[k], o.Water)
		moved := false
		for s := range numSettings {
			if s == settingQ && !o.HoldQ {
				continue
			}
			if math.Abs(b[s]-a[s]) < math.Max(sa[s], sb[s]) {
				continue
			}
			moved = true
			switch s {
			case settingT0:
				c.T0++
			case settingP0:
				c.P0++
			case settingMach:
				c.Mach++
			case settingQ:
				c.Q++
			}
		}
		if moved {
			c.Moved++
		}
	}
	return c
}

// Step says which settings move from run k-1 to run k of runs (none for
// the first).
func (o RunOrder) Step(runs []Run, k int) Changes {
	if k == 0 {
		return Changes{}
	}
	return o.Count(runs[k-1 : k+1])
}
