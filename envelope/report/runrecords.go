package report

import (
	"encoding/json"
	"io"

	"likewind/envelope"
)

// RunPlan is the run lists of the facilities of one evaluation, for one
// set of test points.
type RunPlan struct {
	Vehicle string // passed through CleanText
	// Marked says the points are marked test points; otherwise they are
	// every matched point of each facility (DefaultRunPoints).
	Marked bool
	Lists  []RunList
	// RuleOverride is the operating rule a what-if sets for every facility
	// (Kind RuleDefault: each facility's own).
	RuleOverride envelope.OperatingRule
	// Shift is the shift length the campaign summaries count shifts in,
	// s (0: DefaultShift).
	Shift float64
}

// PlanAll builds the run list of facility sel of e, or of every facility
// that could be evaluated when sel < 0: for the marked points, or without
// marks for every matched point of each facility.
func PlanAll(e *envelope.Evaluation, marks []envelope.GridPoint, sel int) (RunPlan, error) {
	p := RunPlan{Vehicle: envelope.CleanText(e.Grid.Vehicle.Name), Marked: len(marks) > 0, RuleOverride: e.Settings.Rule}
	for k, m := range e.Maps {
		if m == nil || (sel >= 0 && k != sel) {
			continue
		}
		pts := marks
		if !p.Marked {
			pts = DefaultRunPoints(m)
		}
		rl, err := PlanRuns(m, pts)
		if err != nil {
			return RunPlan{}, err
		}
		p.Lists = append(p.Lists, rl)
	}
	return p, nil
}

// RunRecord is one flight point of a run list as the CSV row and the JSON
// object write it; all SI. Settings that do not apply are null (JSON) or
// empty (CSV). The JSON keys are the CSV columns, in field order.
type RunRecord struct {
	Facility         string `json:"facility"`
	Medium           string `json:"medium"`
	Run              int    `json:"run"` // set point, 1-based (shared by its flight points); 0 for a point that cannot be run
	Row              int    `json:"row"`
	Col              int    `json:"col"`
	Altitude         Num    `json:"altitude_m"`
	GridSpeed        Num    `json:"grid_speed"`
	GridSpeedKind    string `json:"grid_speed_kind"`
	FlightMach       Num    `json:"flight_mach"`
	FlightTAS        Num    `json:"flight_tas_m_s"`
	FlightQ          Num    `json:"flight_q_pa"`
	FlightRe         Num    `json:"flight_reynolds"`
	Class            string `json:"class"`
	Limit            string `json:"limit"`
	Flags            string `json:"flags"`
	TestMach         Num    `json:"test_mach"`
	P0               Num    `json:"p0_pa"`
	T0               Num    `json:"t0_k"`
	WaterTemperature Num    `json:"water_temperature_k"`
	StaticPressure   Num    `json:"static_pressure_pa"`
	TestSpeed        Num    `json:"test_speed_m_s"`
	TestQ            Num    `json:"test_q_pa"`
	ModelRe          Num    `json:"model_reynolds"`
	ReRatio          Num    `json:"reynolds_ratio"`
	T0Change         bool   `json:"t0_change"`
	P0Change         bool   `json:"p0_change"`
	MachChange       bool   `json:"mach_change"`
	// QChange is whether q moves before the run where the rule holds q
	// (fixed q); null (empty) under other rules, where q follows the
	// other settings.
	QChange *bool `json:"q_change"`
	// Rule is the operating rule in force, as the facility files name it,
	// with the value a fixed rule holds.
	Rule            string `json:"rule"`
	RuleTemperature Num    `json:"rule_temperature_k"`
	RuleQ           Num    `json:"rule_q_pa"`
	// Campaign time of the run, on its first flight point, where the
	// facility has campaign data and the figure's data is given (null
	// otherwise): the run's time and the running total with the model
	// installation, s; for a blowdown tunnel one blow's duration, s, the
	// blows the data time needs and whether one blow is too short.
	RunTime   Num   `json:"run_time_s"`
	TotalTime Num   `json:"total_time_s"`
	BlowTime  Num   `json:"blow_duration_s"`
	Blows     Num   `json:"blows"`
	BlowShort *bool `json:"blow_short"`
}

// runCSV is the run list's CSV column table, derived once from
// RunRecord's JSON tags (never changed after initialisation).
var runCSV = newCSVTable[RunRecord]()

// RunColumns returns the CSV column names (and JSON record keys) of a run
// list in order.
func RunColumns() []string { return runCSV.header() }

// Records turns the run list into records: runs in order, then the points
// that cannot be run.
func (rl RunList) Records() (runs, unrunnable []RunRecord) {
	water := rl.Medium == envelope.MediumWater
	ri := NewRuleInfo(rl.Rule, rl.Medium)
	mk := func(r Run, n int) RunRecord {
		rec := RunRecord{
			Facility: rl.Facility, Medium: rl.Medium.String(), Run: n, Row: r.Row, Col: r.Col,
			Altitude: Num(r.Altitude), GridSpeed: Num(r.GridSpeed), GridSpeedKind: rl.SpeedKind.String(),
			FlightMach: Num(r.FlightMach), FlightTAS: Num(r.FlightTAS), FlightQ: Num(r.FlightQ),
			FlightRe: Num(r.FlightRe), Class: r.Class.String(), Limit: r.Limit.String(), Flags: r.Flags.String(),
			TestMach: na, P0: na, T0: na, WaterTemperature: na, StaticPressure: na,
			TestSpeed: na, TestQ: na, ModelRe: na, ReRatio: na,
			Rule: ri.Name, RuleTemperature: ri.Temperature, RuleQ: ri.Q,
			RunTime: na, TotalTime: na, BlowTime: na, Blows: na,
		}
		if !r.HasSettings {
			return rec
		}
		if water {
			rec.WaterTemperature, rec.StaticPressure = Num(r.T0), Num(r.P0)
		} else {
			rec.TestMach, rec.P0, rec.T0 = Num(r.Mach), Num(r.P0), Num(r.T0)
		}
		rec.TestSpeed, rec.TestQ = Num(r.Speed), Num(r.Q)
		rec.ModelRe, rec.ReRatio = Num(r.Re), Num(r.ReRatio)
		return rec
	}
	first := map[int]CampaignRun{}
	if cc, ok := NewCampaignCost(rl, 0); ok {
		for _, cr := range cc.Runs {
			first[cr.First] = cr
		}
	}
	for k, r := range rl.Runs {
		rec := mk(r, r.SetPoint)
		if cr, ok := first[k]; ok {
			if cr.Known {
				rec.RunTime = Num(cr.Time)
			}
			if cr.TotalKnown {
				rec.TotalTime = Num(cr.Total)
			}
			if cr.HasBlow {
				rec.BlowTime = Num(cr.Blow)
				if cr.Blows > 0 {
					rec.Blows = Num(cr.Blows)
					short := cr.Short
					rec.BlowShort = &short
				}
			}
			if cr.NoBlow {
				no := true
				rec.BlowShort = &no
			}
		}
		c := rl.Order.Step(rl.Runs, k)
		rec.T0Change, rec.P0Change, rec.MachChange = c.T0 > 0, c.P0 > 0, c.Mach > 0
		if rl.Order.HoldQ {
			moved := c.Q > 0
			rec.QChange = &moved
		}
		runs = append(runs, rec)
	}
	for _, r := range rl.Unrunnable {
		unrunnable = append(unrunnable, mk(r, 0))
	}
	return runs, unrunnable
}

// WriteCSV writes a header row of RunColumns and one row per flight point
// of every list: its runs in order, then the points it cannot run.
func (p RunPlan) WriteCSV(w io.Writer) error {
	cw, err := newCSVWriter(w, runCSV)
	if err != nil {
		return err
	}
	for _, rl := range p.Lists {
		runs, un := rl.Records()
		for _, rec := range append(runs, un...) {
			if err := cw.write(&rec, nil); err != nil {
				return err
			}
		}
	}
	return cw.flush()
}

// runsDoc is the JSON run list.
type runsDoc struct {
	ExportInfo
	Caution string `json:"caution"`
	Units   string `json:"units"`
	Vehicle string `json:"vehicle"`
	Points  string `json:"points"` // "marked" or "matched"
	// RuleOverride is a what-if rule for every facility; null: each
	// facility's own.
	RuleOverride *RuleInfo      `json:"rule_override"`
	Facilities   []runsFacility `json:"facilities"`
}

type runsFacility struct {
	Facility string   `json:"facility"`
	Medium   string   `json:"medium"`
	Scale    Num      `json:"model_scale"`
	Rule     RuleInfo `json:"operating_rule"`
	// Order names the settings the runs are grouped by, slowest first
	// (RunOrder.Keys).
	Order      []string    `json:"order"`
	SetPoints  int         `json:"set_points"` // runs; each record of "runs" is one flight point
	Changes    runChanges  `json:"changes"`
	Runs       []RunRecord `json:"runs"`
	Unrunnable []RunRecord `json:"unrunnable"`
	// Campaign is the campaign's time and cost (null: no campaign data).
	Campaign *campaignDoc `json:"campaign"`
}

// campaignDoc is a facility's campaign summary in JSON, SI (s, kg) and
// money in Currency; a figure left out for want of data is null and its
// key is named in Missing.
type campaignDoc struct {
	Time           Num              `json:"time_s"`
	Shift          Num              `json:"shift_s"`
	Shifts         *int             `json:"shifts"`
	ModelChange    Num              `json:"model_change_s"`
	DataTime       Num              `json:"data_time_s"`
	ChangeTime     campaignChangeTS `json:"change_time_s"`
	Blows          *int             `json:"blows"`
	RechargeTime   Num              `json:"recharge_time_s"`
	Currency       string           `json:"currency"`
	OccupancyCost  Num              `json:"occupancy_cost"`
	Coolant        Num              `json:"coolant_kg"`
	CoolantCost    Num              `json:"coolant_cost"`
	TotalCost      Num              `json:"total_cost"`
	GivenOrderTime Num              `json:"given_order_time_s"`
	Saved          Num              `json:"ordering_saves_s"`
	ShortRuns      []int            `json:"short_runs"`
	UnblowableRuns []int            `json:"unblowable_runs"`
	Missing        []string         `json:"missing"`
}

type campaignChangeTS struct {
	T0   Num `json:"t0"`
	P0   Num `json:"p0"`
	Mach Num `json:"mach"`
}

// newCampaignDoc is the JSON summary of cc.
func newCampaignDoc(cc CampaignCost) *campaignDoc {
	opt := func(ok bool, x float64) Num {
		if !ok {
			return na
		}
		return Num(x)
	}
	d := cc.Data
	doc := &campaignDoc{
		Time: opt(cc.TimeKnown, cc.Time), Shift: Num(cc.Shift),
		ModelChange: opt(d.ModelChange.Set, d.ModelChange.V), DataTime: opt(cc.DataKnown, cc.DataTime),
		RechargeTime: na, Currency: cc.Currency,
		OccupancyCost: opt(cc.CostKnown, cc.Cost), Coolant: opt(cc.CoolantKnown, cc.Coolant),
		CoolantCost: opt(cc.CoolantCostKnown, cc.CoolantCost), TotalCost: opt(cc.TotalCostKnown, cc.TotalCost),
		GivenOrderTime: opt(cc.SavedKnown, cc.GivenTime), Saved: opt(cc.SavedKnown, cc.Saved),
		ShortRuns: append([]int{}, cc.Short...), UnblowableRuns: append([]int{}, cc.NoBlow...),
		Missing: append([]string{}, cc.Missing...),
	}
	counts := cc.Kinds
	var ts [3]Num
	for k := range ts {
		ts[k] = opt(cc.ChangeKnown[k] || counts[k] == 0, cc.ChangeTime[k])
	}
	doc.ChangeTime = campaignChangeTS{T0: ts[ChangeT0], P0: ts[ChangeP0], Mach: ts[ChangeMach]}
	if cc.TimeKnown {
		n := cc.Shifts
		doc.Shifts = &n
	}
	if d.Blowdown() && cc.Medium.IsGas() {
		n := cc.Blows
		doc.Blows = &n
		doc.RechargeTime = Num(cc.Recharge)
	}
	return doc
}

type runChanges struct {
	T0   int `json:"t0"`
	P0   int `json:"p0"`
	Mach int `json:"mach"`
	// Q is counted where the rule holds q (fixed q); null otherwise.
	Q     *int `json:"q"`
	Moved int  `json:"any"`
}

// WriteJSON writes the run lists as one indented JSON object: info, the
// caution, the vehicle, which points ("marked" or "matched"), and per
// facility its set points, change counts, runs and unrunnable points.
func (p RunPlan) WriteJSON(w io.Writer, info ExportInfo) error {
	doc := runsDoc{
		ExportInfo: info,
		Caution:    envelope.PlanningNote, Units: "SI", Vehicle: p.Vehicle,
		Points: "matched", Facilities: []runsFacility{},
	}
	if p.Marked {
		doc.Points = "marked"
	}
	media := make([]envelope.Medium, len(p.Lists))
	for k, rl := range p.Lists {
		media[k] = rl.Medium
	}
	doc.RuleOverride = ruleOverrideInfo(p.RuleOverride, media)
	for _, rl := range p.Lists {
		runs, un := rl.Records()
		if runs == nil {
			runs = []RunRecord{}
		}
		if un == nil {
			un = []RunRecord{}
		}
		c := rl.Changes
		rc := runChanges{T0: c.T0, P0: c.P0, Mach: c.Mach, Moved: c.Moved}
		if rl.Order.HoldQ {
			q := c.Q
			rc.Q = &q
		}
		rf := runsFacility{
			Facility: rl.Facility, Medium: rl.Medium.String(), Scale: Num(rl.Scale),
			Rule: NewRuleInfo(rl.Rule, rl.Medium), Order: rl.Order.Keys(), SetPoints: rl.SetPoints,
			Changes: rc, Runs: runs, Unrunnable: un,
		}
		if cc, ok := NewCampaignCost(rl, p.Shift); ok {
			rf.Campaign = newCampaignDoc(cc)
		}
		doc.Facilities = append(doc.Facilities, rf)
	}
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	_, err = w.Write(append(b, '\n'))
	return err
}
