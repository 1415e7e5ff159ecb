package report

import (
	"fmt"
	"math"
	"strings"

	"likewind/atmos"
	"likewind/envelope"
)

// The campaign's time and cost: from a run list and the facility's
// campaign data (envelope.Campaign, the [facility.campaign] table), the
// time each run takes — the set-point changes before it under the run
// order, its data points and, in a blowdown tunnel, its blows and
// recharges — the running total, and the campaign summary: hours, shifts,
// occupancy cost, coolant, the changes by kind and the time the facility
// order saves against the order the points were given in. A figure whose
// data is missing is left out (Known false) and a note names the key;
// nothing is assumed in its place.

// DefaultShift is the shift length the campaign counts shifts in when
// none is set (common practice: an 8-hour shift).
const DefaultShift = 8 * atmos.Hour

// CampaignRun is the time of one run (set point) of a run list, all in
// seconds.
type CampaignRun struct {
	SetPoint int // Run.SetPoint
	First    int // index in RunList.Runs of its first flight point
	Points   int // flight points (data points) of the run
	Moves    Changes
	// Change is the time of the set-point changes before the run (0 for
	// the first run), Data the data time: Points × the data point time.
	Change, Data float64
	// ChangeBy is Change by kind (ChangeT0, ChangeP0, ChangeMach), each
	// where its data is given.
	ChangeBy [3]float64
	// Blowdown: Blow is the duration of one blow at the run's set point
	// (HasBlow), Blows the blows its data time needs (each followed by a
	// recharge, Recharge in all); Short says the data time is longer than
	// one blow; NoBlow that the storage cannot blow the set point at all
	// (its end pressure is not below the storage pressure).
	HasBlow       bool
	Blow          float64
	Blows         int
	Short, NoBlow bool
	Recharge      float64
	// Time is the run's time (Known), Total the campaign's running time
	// after it, model installation included (TotalKnown).
	Time, Total       float64
	Known, TotalKnown bool
}

// CampaignCost is the time and cost of one facility's run list.
type CampaignCost struct {
	Facility string
	Medium   envelope.Medium
	Data     envelope.Campaign
	Runs     []CampaignRun
	// Shift is the shift length the shifts are counted in, s.
	Shift float64
	// Time is the campaign's time, s: model installation and every run
	// that can be run (TimeKnown). Shifts is Time in shifts, rounded up.
	Time      float64
	TimeKnown bool
	Shifts    int
	// Occupancy cost: Time × the cost per hour, in Currency.
	Cost      float64
	CostKnown bool
	Currency  string
	// Coolant over the campaign's time, kg, and its cost.
	Coolant, CoolantCost           float64
	CoolantKnown, CoolantCostKnown bool
	// TotalCost is the occupancy and coolant cost together, where both
	// are known (or occupancy alone for a facility that uses no coolant).
	TotalCost      float64
	TotalCostKnown bool
	// Changes counts the set-point changes by kind along the run list;
	// ChangeTime is the time of each kind (T0, p0 with q, Mach number), s,
	// known where its data is given (ChangeKnown).
	Changes Changes
	// Kinds counts the changes by kind as they are timed: T0, p0 (a step
	// that moves p0 or a held q, once), Mach number.
	Kinds       [3]int
	ChangeTime  [3]float64
	ChangeKnown [3]bool
	DataTime    float64
	DataKnown   bool
	Blows       int
	Recharge    float64
	// GivenTime is the time of the same runs in the order the points were
	// given (RunList.Given), s, and Saved how much less the facility order
	// takes (negative: the given order is quicker); SavedKnown where both
	// are known.
	GivenTime, Saved float64
	SavedKnown       bool
	// Short lists the runs (set points) whose data time is longer than one
	// blow; NoBlow those the storage cannot blow.
	Short, NoBlow []int
	// Missing names the campaign keys a figure needed and did not have,
	// in the order of the keys.
	Missing []string
}

// Change kinds of CampaignCost.ChangeTime.
const (
	ChangeT0 = iota
	ChangeP0
	ChangeMach
)

// BlowDuration is the length of one blow of a blowdown tunnel, s, at a set
// point of stagnation pressure p0 (Pa), stagnation temperature T0 (K) and
// test Mach number M through a test section of area A (m²) in gas g: the
// mass that can be used from the storage over the mass flow. The mass flow
// is the flow through the section at M, the choked flow through the sonic
// throat A/(A/A*) (atmos.MassFlowParameter, NACA Report 1135); the storage
// starts at the storage pressure p_s and the set T0 and expands
// isentropically to the end pressure p_e = ratio × p0 (the cautious
// choice: an isothermal storage, with heat from its walls, yields more
// mass), giving m = p_s·V/(R·T0)·(1 − (p_e/p_s)^(1/γ)). ok is false when
// p_e is not below p_s (the storage cannot hold the set p0) or an input is
// not usable.
func BlowDuration(c envelope.Campaign, g atmos.Gas, A, M, p0, T0 float64) (seconds float64, ok bool) {
	if !c.Blowdown() || g == nil || !(A > 0) || !(M > 0) || !(p0 > 0) || !(T0 > 0) {
		return 0, false
	}
	ps, pe := c.StoragePressure.V, c.UsableRatio.V*p0
	if !(pe < ps) {
		return 0, false
	}
	gamma, R := g.Gamma(), g.R()
	usable := ps * c.StorageVolume.V / (R * T0) * (1 - math.Pow(pe/ps, 1/gamma))
	flow := p0 * A / math.Sqrt(T0) * atmos.MassFlowParameter(M, gamma, R)
	if !(flow > 0) {
		return 0, false
	}
	return usable / flow, true
}

// visits splits runs into visits of the facility: consecutive flight
// points with the same set point.
func visits(runs []Run) [][2]int {
	var out [][2]int
	for k := 0; k < len(runs); {
		end := k + 1
		for end < len(runs) && sameSetPoint(&runs[end-1], &runs[end]) {
			end++
		}
		out = append(out, [2]int{k, end})
		k = end
	}
	return out
}

// campaignWalk is the time of a sequence of runs: every visit timed.
type campaignWalk struct {
	runs  []CampaignRun
	need  map[string]bool // keys a figure needed and lacked
	known bool            // every run timed (apart from those that cannot be blown)
	time  float64
}

// walk times runs (in the order given) for a facility of medium m, section
// area A and campaign data c under run order o.
func walk(runs []Run, o RunOrder, m envelope.Medium, A float64, c envelope.Campaign) campaignWalk {
	w := campaignWalk{need: map[string]bool{}, known: true}
	var g atmos.Gas
	if m.IsGas() {
		g, _ = atmos.GasByName(m.String())
	}
	for _, v := range visits(runs) {
		r := &runs[v[0]]
		cr := CampaignRun{SetPoint: r.SetPoint, First: v[0], Points: v[1] - v[0], Known: true}
		if v[0] > 0 {
			prev := &runs[v[0]-1]
			cr.Moves = o.Count(runs[v[0]-1 : v[0]+1])
			moved := [3]bool{cr.Moves.T0 > 0, cr.Moves.P0 > 0 || cr.Moves.Q > 0, cr.Moves.Mach > 0}
			for kind := range moved {
				if !moved[kind] {
					continue
				}
				t, missing := changeTime(c, kind, math.Abs(r.T0-prev.T0))
				if len(missing) > 0 {
					cr.Known = false
					for _, key := range missing {
						w.need[key] = true
					}
					continue
				}
				cr.ChangeBy[kind] = t
				cr.Change += t
			}
		}
		if c.DataPoint.Set {
			cr.Data = float64(cr.Points) * c.DataPoint.V
		} else {
			cr.Known = false
			w.need["data_point_time"] = true
		}
		if c.Blowdown() && m.IsGas() {
			cr.Blow, cr.HasBlow = BlowDuration(c, g, A, r.Mach, r.P0, r.T0)
			switch {
			case !cr.HasBlow:
				cr.NoBlow, cr.Known = true, false
			case c.DataPoint.Set:
				cr.Blows = max(1, int(math.Ceil(cr.Data/cr.Blow-1e-9)))
				cr.Short = cr.Blows > 1
				cr.Recharge = float64(cr.Blows) * c.Recharge.V
			}
		}
		if cr.Known {
			cr.Time = cr.Change + cr.Data + cr.Recharge
			w.time += cr.Time
		} else if !cr.NoBlow {
			w.known = false
		}
		w.runs = append(w.runs, cr)
	}
	return w
}

// changeTime is the time of one change of kind (ChangeT0, ChangeP0,
// ChangeMach) under campaign data c, dT the size of a T0 change (K), or
// the campaign keys it needs and c does not give.
func changeTime(c envelope.Campaign, kind int, dT float64) (t float64, missing []string) {
	need := func(o envelope.Opt, key string) {
		if !o.Set {
			missing = append(missing, key)
		}
	}
	switch kind {
	case ChangeT0:
		need(c.T0PerKelvin, "t0_change_per_kelvin")
		need(c.T0Fixed, "t0_change_fixed")
		return c.T0Fixed.V + c.T0PerKelvin.V*dT, missing
	case ChangeP0:
		need(c.P0Change, "p0_change_time")
		return c.P0Change.V, missing
	}
	need(c.MachChange, "mach_change_time")
	return c.MachChange.V, missing
}

// NewCampaignCost works out the time and cost of run list rl from the
// facility's campaign data it carries (RunList.Campaign), counting shifts
// of length shift (s; 0 or less: DefaultShift). ok is false when the
// facility has no campaign data.
func NewCampaignCost(rl RunList, shift float64) (CampaignCost, bool) {
	c := rl.Campaign
	if !c.Any() {
		return CampaignCost{}, false
	}
	if !(shift > 0) {
		shift = DefaultShift
	}
	cc := CampaignCost{Facility: rl.Facility, Medium: rl.Medium, Data: c, Shift: shift, Changes: rl.Changes}
	w := walk(rl.Runs, rl.Order, rl.Medium, rl.SectionArea, c)
	cc.Runs = w.runs
	need := w.need
	total, totalKnown := 0.0, true
	if len(rl.Runs) > 0 {
		if c.ModelChange.Set {
			total = c.ModelChange.V
		} else {
			totalKnown = false
			need["model_change_time"] = true
		}
	}
	cc.DataKnown = c.DataPoint.Set
	cc.ChangeKnown = [3]bool{c.T0PerKelvin.Set && c.T0Fixed.Set, c.P0Change.Set, c.MachChange.Set}
	for k := range cc.Runs {
		r := &cc.Runs[k]
		if r.Known {
			total += r.Time
		} else if !r.NoBlow {
			totalKnown = false
		}
		r.Total, r.TotalKnown = total, totalKnown && r.Known
		cc.DataTime += r.Data
		cc.Blows += r.Blows
		cc.Recharge += r.Recharge
		if r.Short {
			cc.Short = append(cc.Short, r.SetPoint)
		}
		if r.NoBlow {
			cc.NoBlow = append(cc.NoBlow, r.SetPoint)
		}
		if k == 0 {
			continue
		}
		moved := [3]bool{r.Moves.T0 > 0, r.Moves.P0 > 0 || r.Moves.Q > 0, r.Moves.Mach > 0}
		for kind := range moved {
			if moved[kind] {
				cc.Kinds[kind]++
				cc.ChangeTime[kind] += r.ChangeBy[kind]
			}
		}
	}
	cc.Time, cc.TimeKnown = total, totalKnown
	if totalKnown {
		cc.Shifts = int(math.Ceil(total/shift - 1e-9))
	}
	if c.OccupancyCost.Set {
		cc.Currency = c.OccupancyCost.Currency
		if totalKnown {
			cc.Cost, cc.CostKnown = total*c.OccupancyCost.Amount, true
		}
	} else {
		need["occupancy_cost"] = true
	}
	if c.CoolantUse.Set && totalKnown {
		cc.Coolant, cc.CoolantKnown = total*c.CoolantUse.V, true
		if c.CoolantPrice.Set {
			cc.CoolantCost, cc.CoolantCostKnown = cc.Coolant*c.CoolantPrice.Amount, true
			cc.Currency = c.CoolantPrice.Currency
		}
	}
	if c.CoolantUse.Set && !c.CoolantPrice.Set {
		need["coolant_price"] = true
	}
	switch {
	case cc.CostKnown && c.CoolantUse.Set:
		cc.TotalCost, cc.TotalCostKnown = cc.Cost+cc.CoolantCost, cc.CoolantCostKnown
	case cc.CostKnown:
		cc.TotalCost, cc.TotalCostKnown = cc.Cost, true
	}
	given := walk(rl.Given, rl.Order, rl.Medium, rl.SectionArea, c)
	if w.known && given.known && len(rl.Given) > 0 {
		cc.GivenTime, cc.SavedKnown = given.time, true
		cc.Saved = given.time - w.time
	}
	for _, k := range campaignKeyOrder {
		if need[k] {
			cc.Missing = append(cc.Missing, k)
		}
	}
	return cc, true
}

// campaignKeyOrder is the order of the campaign keys in docs/FORMAT.md.
var campaignKeyOrder = []string{"occupancy_cost", "model_change_time", "data_point_time", "t0_change_per_kelvin",
	"t0_change_fixed", "p0_change_time", "mach_change_time", "coolant_price"}

// Hours writes a time in hours to two decimals, "12.25 h".
func Hours(s float64) string { return fmt.Sprintf("%.2f h", s/atmos.Hour) }

// Minutes writes a time in minutes to one decimal, "42.5 min".
func Minutes(s float64) string { return fmt.Sprintf("%.1f min", s/atmos.Minute) }

// Seconds writes a time in seconds to one decimal, "12.3 s".
func Seconds(s float64) string { return fmt.Sprintf("%.1f s", s) }

// Duration writes a time in the unit that suits it: seconds below a
// minute ("20 s"), minutes below an hour ("42.5 min"), else hours.
func Duration(s float64) string {
	switch {
	case s < atmos.Minute:
		return fmt.Sprintf("%.3g s", s)
	case s < atmos.Hour:
		return Minutes(s)
	}
	return Hours(s)
}

// Money writes an amount with its currency to two decimals, "1234.50 EUR".
func Money(x float64, currency string) string { return fmt.Sprintf("%.2f %s", x, currency) }

// MissingNote says which campaign keys were missing and what is left out
// for want of them ("" when none).
func (cc CampaignCost) MissingNote() string {
	if len(cc.Missing) == 0 {
		return ""
	}
	return "not given in the facility file: " + strings.Join(cc.Missing, ", ") + "; the figures that need them are left out"
}

// RunNotes are the remarks on single runs: those shorter than their data
// time needs, and those the storage cannot blow.
func (cc CampaignCost) RunNotes() []string {
	var out []string
	if len(cc.Short) > 0 {
		out = append(out, fmt.Sprintf("runs %s: one blow is shorter than the data time; each takes the blows shown, with a recharge after each", intList(cc.Short)))
	}
	if len(cc.NoBlow) > 0 {
		out = append(out, fmt.Sprintf("runs %s: the storage cannot hold the set p0 (its pressure is not above usable_pressure_ratio × p0); left out of the totals", intList(cc.NoBlow)))
	}
	return out
}

func intList(xs []int) string {
	parts := make([]string, len(xs))
	for k, x := range xs {
		parts[k] = fmt.Sprint(x)
	}
	return strings.Join(parts, ", ")
}
