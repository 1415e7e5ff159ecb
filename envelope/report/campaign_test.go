package report

import (
	"math"
	"reflect"
	"testing"

	"likewind/atmos"
	"likewind/envelope"
)

// campaignTol is the relative tolerance of the campaign's hand values:
// they are worked to five or six figures.
const campaignTol = 1e-4

func campaignNear(got, want float64) bool {
	return math.Abs(got-want) <= campaignTol*math.Max(math.Abs(want), 1e-9)
}

// handCampaign is invented campaign data for the hand-worked tests.
func handCampaign() envelope.Campaign {
	min := atmos.Minute
	return envelope.Campaign{
		OccupancyCost: envelope.Money{Amount: 1800.0 / 3600, Currency: "EUR", Set: true},
		ModelChange:   envelope.Opt{V: 120 * min, Set: true},
		DataPoint:     envelope.Opt{V: 5 * min, Set: true},
		T0PerKelvin:   envelope.Opt{V: 0.5 * min, Set: true},
		T0Fixed:       envelope.Opt{V: 10 * min, Set: true},
		P0Change:      envelope.Opt{V: 6 * min, Set: true},
		MachChange:    envelope.Opt{V: 2 * min, Set: true},
		CoolantUse:    envelope.Opt{V: 4000.0 / 3600, Set: true}, // 4 t/h
		CoolantPrice:  envelope.Money{Amount: 0.2, Currency: "EUR", Set: true},
	}
}

// handRunList orders five flight points (a to e; e has a's set point) as
// PlanRuns would and keeps the given order.
func handRunList(c envelope.Campaign) RunList {
	pt := func(col int, t0, p0, mach float64) Run {
		return Run{GridPoint: envelope.GridPoint{Row: 0, Col: col}, HasSettings: true, T0: t0, P0: p0, Mach: mach}
	}
	given := []Run{pt(0, 300, 2e5, 0.5), pt(1, 250, 2e5, 0.5), pt(2, 300, 2e5, 0.8), pt(3, 300, 3e5, 0.5), pt(4, 300, 2e5, 0.5)}
	rl := RunList{Facility: "hand tunnel", Medium: "nitrogen", Campaign: c, SectionArea: 1,
		Given: append([]Run(nil), given...), Runs: given}
	rl.Changes = rl.Order.Order(rl.Runs)
	rl.SetPoints = rl.Runs[len(rl.Runs)-1].SetPoint
	return rl
}

// TestCampaignHand: a campaign of four runs summed by hand.
//
// Facility order (T0, then p0, then Mach number): b (250 K) | a, e (300 K,
// 2 bar, M 0.5) | c (M 0.8) | d (3 bar, M 0.5). Changes: b→a T0 by 50 K,
// 10 + 0.5·50 = 35 min; a→c Mach, 2 min; c→d p0 and Mach, 6 + 2 = 8 min.
// Data 5 min a point: 5, 10, 5, 5 min. Run times 5, 45, 7, 13 min (70);
// with the 120-minute model installation 190 min = 3.16667 h, running
// totals 125, 170, 177, 190 min. Occupancy 3.16667 h × 1800 EUR/h = 5700
// EUR; coolant 4 t/h × 3.16667 h = 12666.7 kg at 0.2 EUR/kg = 2533.33 EUR;
// together 8233.33 EUR. One 8-hour shift, four 1-hour shifts.
//
// Given order a, b, c, d, e: 5 | 35 + 5 | 35 + 2 + 5 | 8 + 5 | 6 + 5 =
// 111 min, so the facility order saves 41 min.
func TestCampaignHand(t *testing.T) {
	rl := handRunList(handCampaign())
	cc, ok := NewCampaignCost(rl, 0)
	if !ok {
		t.Fatal("no campaign cost from campaign data")
	}
	min := atmos.Minute
	wantRun := []float64{5, 45, 7, 13}
	wantTotal := []float64{125, 170, 177, 190}
	if len(cc.Runs) != 4 {
		t.Fatalf("%d runs, want 4", len(cc.Runs))
	}
	for k, r := range cc.Runs {
		if !r.Known || !r.TotalKnown || !campaignNear(r.Time, wantRun[k]*min) || !campaignNear(r.Total, wantTotal[k]*min) {
			t.Errorf("run %d: time %v min total %v min (known %v %v), want %v and %v (by hand)",
				k+1, r.Time/min, r.Total/min, r.Known, r.TotalKnown, wantRun[k], wantTotal[k])
		}
	}
	if cc.Runs[1].Points != 2 {
		t.Errorf("run 2 has %d points, want 2 (a and e)", cc.Runs[1].Points)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"hours", cc.Time / atmos.Hour, 190.0 / 60},
		{"cost EUR", cc.Cost, 5700},
		{"coolant kg", cc.Coolant, 12666.667},
		{"coolant EUR", cc.CoolantCost, 2533.3333},
		{"total EUR", cc.TotalCost, 8233.3333},
		{"T0 change min", cc.ChangeTime[ChangeT0] / min, 35},
		{"p0 change min", cc.ChangeTime[ChangeP0] / min, 6},
		{"Mach change min", cc.ChangeTime[ChangeMach] / min, 4},
		{"data min", cc.DataTime / min, 25},
		{"given order min", cc.GivenTime / min, 111},
		{"saved min", cc.Saved / min, 41},
	}
	for _, c := range checks {
		if !campaignNear(c.got, c.want) {
			t.Errorf("%s = %.6g, want %.6g (by hand)", c.name, c.got, c.want)
		}
	}
	if !cc.TimeKnown || !cc.CostKnown || !cc.CoolantCostKnown || !cc.TotalCostKnown || !cc.SavedKnown || cc.Shifts != 1 || len(cc.Missing) != 0 {
		t.Errorf("known %v %v %v %v %v, shifts %d, missing %v; want all known, 1 shift, none missing",
			cc.TimeKnown, cc.CostKnown, cc.CoolantCostKnown, cc.TotalCostKnown, cc.SavedKnown, cc.Shifts, cc.Missing)
	}
	if c := cc.Changes; c.T0 != 1 || c.P0 != 1 || c.Mach != 2 || cc.Kinds != [3]int{1, 1, 2} {
		t.Errorf("changes %+v, kinds %v; want T0 1, p0 1, Mach 2", c, cc.Kinds)
	}
	if cc1, _ := NewCampaignCost(rl, atmos.Hour); cc1.Shifts != 4 {
		t.Errorf("1-hour shifts: %d, want 4 (3.17 h)", cc1.Shifts)
	}
}

// TestCampaignMissing: a figure whose data is missing is left out, never
// guessed, and the missing key is named.
func TestCampaignMissing(t *testing.T) {
	c := handCampaign()
	c.P0Change = envelope.Opt{}
	c.OccupancyCost = envelope.Money{}
	cc, ok := NewCampaignCost(handRunList(c), 0)
	if !ok {
		t.Fatal("no campaign cost")
	}
	// Runs 1 to 3 move no p0: timed, 5, 45 and 7 min; run 4 moves p0.
	for k, want := range []bool{true, true, true, false} {
		if cc.Runs[k].Known != want {
			t.Errorf("run %d known %v, want %v", k+1, cc.Runs[k].Known, want)
		}
	}
	if cc.TimeKnown || cc.CostKnown || cc.CoolantKnown || cc.TotalCostKnown || cc.SavedKnown || cc.Shifts != 0 {
		t.Errorf("campaign figures known without p0_change_time: %+v", cc)
	}
	if want := []string{"occupancy_cost", "p0_change_time"}; !reflect.DeepEqual(cc.Missing, want) {
		t.Errorf("missing %v, want %v", cc.Missing, want)
	}
	// Only the fixed part of a T0 change missing: run 2 (the T0 change) is
	// left out, and only that key is named.
	c = handCampaign()
	c.T0Fixed = envelope.Opt{}
	cc, _ = NewCampaignCost(handRunList(c), 0)
	if cc.Runs[1].Known || !cc.Runs[2].Known || !reflect.DeepEqual(cc.Missing, []string{"t0_change_fixed"}) {
		t.Errorf("without t0_change_fixed: run 2 known %v, run 3 known %v, missing %v", cc.Runs[1].Known, cc.Runs[2].Known, cc.Missing)
	}
	if _, ok := NewCampaignCost(handRunList(envelope.Campaign{}), 0); ok {
		t.Error("campaign cost from no campaign data")
	}
}

// TestBlowDuration: one blow worked by hand. Storage 50 m³ at 20 bar,
// usable to 1.2 × p0; set point p0 = 5 bar, T0 = 290 K, Mach 2, section
// 0.36 m², air (γ = 1.4, R = 287.053 J/(kg·K), U.S. Standard Atmosphere
// 1976's R*/M0). Isentropic storage (chosen as the cautious assumption: no
// heat from the walls during a short blow; an isothermal storage gives
// more mass and a longer blow): stored 20e5·50/(287.053·290) = 1201.27 kg;
// end pressure 6 bar, (6/20)^(1/1.4) = 0.42317, usable 1201.27·0.57683 =
// 692.93 kg. Mass flow (NACA Report 1135): 5e5·0.36/√290 · 0.023949 =
// 253.14 kg/s. Blow 692.93/253.14 = 2.7373 s (isothermal: 3.3217 s).
func TestBlowDuration(t *testing.T) {
	c := envelope.Campaign{
		StorageVolume:   envelope.Opt{V: 50, Set: true},
		StoragePressure: envelope.Opt{V: 20e5, Set: true},
		UsableRatio:     envelope.Opt{V: 1.2, Set: true},
		Recharge:        envelope.Opt{V: 30 * atmos.Minute, Set: true},
		DataPoint:       envelope.Opt{V: 5, Set: true},
		ModelChange:     envelope.Opt{V: 0, Set: true},
		MachChange:      envelope.Opt{V: 60, Set: true},
		P0Change:        envelope.Opt{V: 60, Set: true},
		T0PerKelvin:     envelope.Opt{V: 0, Set: true},
		T0Fixed:         envelope.Opt{V: 0, Set: true},
	}
	d, ok := BlowDuration(c, atmos.Air(), 0.36, 2, 5e5, 290)
	if !ok || !campaignNear(d, 2.7373) {
		t.Errorf("BlowDuration = %.5f s (%v), want 2.7373 s (by hand)", d, ok)
	}
	// At p0 = 18 bar the end pressure 21.6 bar is above the storage's 20.
	if _, ok := BlowDuration(c, atmos.Air(), 0.36, 2, 18e5, 290); ok {
		t.Error("a blow whose end pressure is above the storage pressure")
	}
	// A run list of one flight point there and one at 3 bar: the 5 s data
	// point needs two blows of 2.7373 s at 5 bar (short, two recharges: 60
	// min); at 3 bar, 1.2·3 = 3.6 bar, (0.18)^(1/1.4) = 0.29380, usable
	// 848.34 kg over 151.887 kg/s = 5.5853 s: one blow, one recharge.
	rl := RunList{Facility: "blow", Medium: "air", Campaign: c, SectionArea: 0.36,
		Runs: []Run{{HasSettings: true, Mach: 2, P0: 3e5, T0: 290, SetPoint: 1}, {HasSettings: true, Mach: 2, P0: 5e5, T0: 290, SetPoint: 2}}}
	rl.Given = rl.Runs
	cc, _ := NewCampaignCost(rl, 0)
	r1, r2 := cc.Runs[0], cc.Runs[1]
	if !campaignNear(r1.Blow, 5.5853) || r1.Blows != 1 || r1.Short || !campaignNear(r1.Time, 5+1800) {
		t.Errorf("run 1: blow %.4f s, %d blows, short %v, time %v s; want 5.5853 s, 1, false, 1805 s", r1.Blow, r1.Blows, r1.Short, r1.Time)
	}
	if !campaignNear(r2.Blow, 2.7373) || r2.Blows != 2 || !r2.Short || !campaignNear(r2.Time, 60+5+3600) {
		t.Errorf("run 2: blow %.4f s, %d blows, short %v, time %v s; want 2.7373 s, 2, true, 3665 s", r2.Blow, r2.Blows, r2.Short, r2.Time)
	}
	if !reflect.DeepEqual(cc.Short, []int{2}) || cc.Blows != 3 {
		t.Errorf("short %v blows %d, want [2] and 3", cc.Short, cc.Blows)
	}
	// A third run at 18 bar cannot be blown (end pressure 21.6 bar above
	// the storage's 20): flagged, no time, left out of the totals, which
	// stay known: 1805 + 3665 s (p0 moves before it: +60 s is not counted
	// either, the run is not timed).
	rl.Runs = append(rl.Runs, Run{HasSettings: true, Mach: 2, P0: 18e5, T0: 290, SetPoint: 3})
	rl.Given = rl.Runs
	cc, _ = NewCampaignCost(rl, 0)
	r3 := cc.Runs[2]
	if !r3.NoBlow || r3.Known || r3.HasBlow || !reflect.DeepEqual(cc.NoBlow, []int{3}) {
		t.Errorf("run 3: %+v, no-blow list %v; want a run that cannot be blown", r3, cc.NoBlow)
	}
	if !cc.TimeKnown || !campaignNear(cc.Time, 1805+3665) || len(cc.RunNotes()) != 2 {
		t.Errorf("campaign time %v s (known %v), notes %q; want 5470 s and two notes", cc.Time, cc.TimeKnown, cc.RunNotes())
	}
}

// TestCampaignHeldQ: under a fixed q a step that moves q moves p0 too; it
// is one p0 change, timed once: by hand 5 min of data, then 6 + 5 = 11
// min.
func TestCampaignHeldQ(t *testing.T) {
	runs := []Run{
		{GridPoint: envelope.GridPoint{Col: 0}, HasSettings: true, T0: 200, P0: 2e5, Mach: 0.5, Q: 30e3},
		{GridPoint: envelope.GridPoint{Col: 1}, HasSettings: true, T0: 200, P0: 3e5, Mach: 0.5, Q: 45e3},
	}
	rl := RunList{Facility: "held q", Medium: "nitrogen", Campaign: handCampaign(), SectionArea: 1,
		Order: RunOrder{HoldQ: true}, Given: append([]Run(nil), runs...), Runs: runs}
	rl.Changes = rl.Order.Order(rl.Runs)
	cc, _ := NewCampaignCost(rl, 0)
	if c := rl.Changes; c.Q != 1 || c.P0 != 1 {
		t.Fatalf("changes %+v, want q 1 and p0 1", c)
	}
	if cc.Kinds != [3]int{0, 1, 0} || !campaignNear(cc.ChangeTime[ChangeP0], 6*atmos.Minute) ||
		!campaignNear(cc.Runs[1].Time, 11*atmos.Minute) {
		t.Errorf("kinds %v, p0 time %v s, run 2 %v s; want one p0 change of 360 s and a 660 s run", cc.Kinds, cc.ChangeTime[ChangeP0], cc.Runs[1].Time)
	}
}
