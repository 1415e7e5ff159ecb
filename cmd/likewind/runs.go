package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/report"
	"likewind/tui"
)

// runRuns prints the run list per facility: the session's marked test
// points, or without marks every matched point, in the order a facility
// runs them (flight points with the same set point as one run), with the
// number of set-point changes.
func runRuns(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("runs", stderr)
	format := fs.String("format", "text", "text, csv or json")
	var o outFlags
	o.register(fs)
	session := fs.String("session", "", "session file whose marked test points to list (and whose what-if values apply)")
	facility := fs.String("facility", "", "list only this facility (name, unique part of a name, or number)")
	customary := fs.Bool("customary", false, "text in ft, kt, psi, psf and °F (CSV and JSON stay SI)")
	date := fs.String("date", "", "date written into the header, YYYY-MM-DD (default today)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind runs [VEHICLE.toml FACILITIES.toml...] [--session FILE] [--format text|csv|json] [--facility NAME] [-o FILE] [--force] [--customary]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	f := strings.ToLower(*format)
	if f != "text" && f != "csv" && f != "json" {
		return usageFail(stderr, fmt.Errorf("runs: --format %q: want text, csv or json", *format))
	}
	day, err := reportDate(*date)
	if err != nil {
		return usageFail(stderr, fmt.Errorf("runs: %w", err))
	}
	if code := o.precheck(stderr); code >= 0 {
		return code
	}
	ev, code := evaluateInputs(files, *session, stderr)
	if code >= 0 {
		return code
	}
	sel := -1
	if *facility != "" {
		k, err := pickFacility(ev.e, *facility, false)
		if err != nil {
			return usageFail(stderr, fmt.Errorf("runs: %w", err))
		}
		if ev.e.Maps[k] == nil {
			return fail(stderr, fmt.Errorf("runs: %s could not be evaluated: %w", ev.e.Facilities[k].Name, ev.e.Errs[k]))
		}
		sel = k
	}
	plan, err := planAll(ev, sel)
	if err != nil {
		return fail(stderr, fmt.Errorf("runs: %w", err))
	}
	plan.date = day
	units := tui.SI
	if *customary {
		units = tui.Customary
	}
	err = o.write(stdout, func(w io.Writer) error {
		switch f {
		case "csv":
			return plan.writeCSV(w)
		case "json":
			return plan.writeJSON(w)
		}
		return plan.writeText(w, units)
	})
	if err != nil {
		return fail(stderr, fmt.Errorf("runs: %w", err))
	}
	return 0
}

// runPlan is the run lists of every selected facility.
type runPlan struct {
	ev     *evaluated
	marked bool // points are the session's marks, not the full matches
	lists  []report.RunList
	date   string
}

// planAll builds the run list of facility sel, or of every evaluated
// facility when sel < 0.
func planAll(ev *evaluated, sel int) (*runPlan, error) {
	p := &runPlan{ev: ev, marked: len(ev.marks) > 0}
	for k, m := range ev.e.Maps {
		if m == nil || (sel >= 0 && k != sel) {
			continue
		}
		pts := ev.marks
		if !p.marked {
			pts = report.DefaultRunPoints(m)
		}
		rl, err := report.PlanRuns(m, pts)
		if err != nil {
			return nil, err
		}
		p.lists = append(p.lists, rl)
	}
	return p, nil
}

// stepChanges says which settings move from run k-1 to run k.
func stepChanges(runs []report.Run, k int, water bool) report.Changes {
	if k == 0 {
		return report.Changes{}
	}
	return report.CountChanges(runs[k-1:k+1], water)
}

func (p *runPlan) pointsWords() string {
	if p.marked {
		return fmt.Sprintf("%d marked test points of the session", len(p.ev.marks))
	}
	return "every matched point of each facility (full match or Mach relaxed); no marked test points given"
}

// plural is "1 run", "2 runs".
func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

// runCount says how many runs (set points) cover how many flight points.
func runCount(rl report.RunList) string {
	s := plural(rl.SetPoints, "run", "runs")
	if len(rl.Runs) != rl.SetPoints {
		s += " for " + plural(len(rl.Runs), "flight point", "flight points")
	}
	return s
}

// writeText writes the run lists as aligned tables.
func (p *runPlan) writeText(w io.Writer, u tui.Units) error {
	var b strings.Builder
	e := p.ev.e
	g := e.Grid
	fmt.Fprintf(&b, "likewind %s run list, %s\n", version, p.date)
	src := "built-in demo data"
	if len(p.ev.in.files) > 0 {
		src = strings.Join(envelope.CleanAll(p.ev.in.files), ", ")
	}
	fmt.Fprintf(&b, "%-9s %s (%s)\n", "vehicle", envelope.CleanText(g.Vehicle.Name), src)
	fmt.Fprintf(&b, "%-9s %s\n", "points", p.pointsWords())
	fmt.Fprintf(&b, "%-9s grouped by T0, then p0, then Mach number ascending (water: temperature, static pressure, speed);\n"+
		"%-9s a setting counts as changed when it moves by %g K, %g %% of p0, %g in Mach or %g m/s\n",
		"order", "", report.RunT0Step, 100*report.RunP0Frac, report.RunMachStep, report.RunSpeedStep)
	fmt.Fprintf(&b, "%-9s %s\n", "caution", tui.SafetyNote)
	speedTitle, speedLabel := u.SpeedAxis(g.SpeedKind)
	altU := u.AltUnit()
	pU, qU, tU, vU := "kPa", "kPa", "K", "m/s"
	if u == tui.Customary {
		pU, qU, tU, vU = "psi", "psf", "°F", "ft/s"
	}
	pv := func(x float64) string { // stagnation or static pressure
		if u == tui.Customary {
			return sig4(x / atmos.PSI)
		}
		return sig4(x / 1000)
	}
	qv := func(x float64) string {
		if u == tui.Customary {
			return sig4(x / atmos.PSF)
		}
		return sig4(x / 1000)
	}
	tv := func(k float64) string {
		if u == tui.Customary {
			return strconv.FormatFloat(k*9/5-459.67, 'f', 1, 64)
		}
		return strconv.FormatFloat(k, 'f', 1, 64)
	}
	vv := func(x float64) string {
		if u == tui.Customary {
			return strconv.FormatFloat(x/atmos.Foot, 'f', 2, 64)
		}
		return strconv.FormatFloat(x, 'f', 2, 64)
	}
	for _, rl := range p.lists {
		water := rl.Medium == envelope.MediumWater
		fmt.Fprintf(&b, "\n%s (%s, model scale %.3g)\n", rl.Facility, rl.Medium, rl.Scale)
		c := rl.Changes
		if len(rl.Runs) == 0 {
			b.WriteString("no points to run\n")
		} else if water {
			fmt.Fprintf(&b, "%s; set-point changes: water temperature %d, static pressure %d, speed %d; %d of %s change a setting\n",
				runCount(rl), c.T0, c.P0, c.Mach, c.Moved, plural(c.Steps, "step", "steps"))
		} else {
			fmt.Fprintf(&b, "%s; set-point changes: T0 %d, p0 %d, Mach %d; %d of %s change a setting\n",
				runCount(rl), c.T0, c.P0, c.Mach, c.Moved, plural(c.Steps, "step", "steps"))
		}
		if len(rl.Runs) > 0 {
			head := []string{"run", "altitude " + altU, speedTitle, "flight Re", "flight q " + qU}
			if water {
				head = append(head, "water T "+tU, "static p "+pU, "speed "+vU)
			} else {
				head = append(head, "T0 "+tU, "p0 "+pU, "test Mach")
			}
			head = append(head, "model Re", "Re ratio", "q "+qU, "class", "changes")
			var rows [][]string
			for k, r := range rl.Runs {
				// A further flight point of the same run leaves the run
				// number and the settings blank.
				again := k > 0 && rl.Runs[k-1].SetPoint == r.SetPoint
				row := []string{strconv.Itoa(r.SetPoint), u.AltLabel(r.Altitude), speedLabel(r.GridSpeed),
					sig3(r.FlightRe), qv(r.FlightQ)}
				switch {
				case again:
					row[0] = ""
					row = append(row, "", "", "", "")
				case water:
					row = append(row, tv(r.T0), pv(r.P0), vv(r.Speed), sig3(r.Re))
				default:
					row = append(row, tv(r.T0), pv(r.P0), strconv.FormatFloat(r.Mach, 'f', 3, 64), sig3(r.Re))
				}
				q, changes := qv(r.Q), changeWords(stepChanges(rl.Runs, k, water), water)
				if again {
					q, changes = "", "same run"
				}
				row = append(row, strconv.FormatFloat(r.ReRatio, 'f', 2, 64), q, r.Class.String(), changes)
				rows = append(rows, row)
			}
			report.WriteTable(&b, head, rows, func(k int) bool { return k == 11 || k == 12 })
		}
		if len(rl.Unrunnable) > 0 {
			fmt.Fprintf(&b, "not runnable (%s):\n", plural(len(rl.Unrunnable), "point", "points"))
			for _, r := range rl.Unrunnable {
				why := r.Class.String()
				if r.Limit != envelope.LimitNone {
					why += ", limit: " + r.Limit.String()
				}
				fmt.Fprintf(&b, "  %s, %s %s: %s\n", u.Alt(r.Altitude), speedTitle, speedLabel(r.GridSpeed), why)
			}
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// changeWords names the settings that move before a run ("" for none,
// "start" for the first).
func changeWords(c report.Changes, water bool) string {
	var parts []string
	names := [3]string{"T0", "p0", "Mach"}
	if water {
		names = [3]string{"temperature", "pressure", "speed"}
	}
	for k, n := range []int{c.T0, c.P0, c.Mach} {
		if n > 0 {
			parts = append(parts, names[k])
		}
	}
	return strings.Join(parts, " ")
}

func sig3(x float64) string { return strconv.FormatFloat(x, 'g', 3, 64) }

func sig4(x float64) string { return strconv.FormatFloat(x, 'g', 4, 64) }

// runRecord is one line of the CSV and one object of the JSON run list;
// all SI. Settings that do not apply are null (JSON) or empty (CSV).
type runRecord struct {
	Facility         string     `json:"facility"`
	Medium           string     `json:"medium"`
	Run              int        `json:"run"` // set point, 1-based (shared by its flight points); 0 for a point that cannot be run
	Row              int        `json:"row"`
	Col              int        `json:"col"`
	Altitude         report.Num `json:"altitude_m"`
	GridSpeed        report.Num `json:"grid_speed"`
	GridSpeedKind    string     `json:"grid_speed_kind"`
	FlightMach       report.Num `json:"flight_mach"`
	FlightTAS        report.Num `json:"flight_tas_m_s"`
	FlightQ          report.Num `json:"flight_q_pa"`
	FlightRe         report.Num `json:"flight_reynolds"`
	Class            string     `json:"class"`
	Limit            string     `json:"limit"`
	Flags            string     `json:"flags"`
	TestMach         report.Num `json:"test_mach"`
	P0               report.Num `json:"p0_pa"`
	T0               report.Num `json:"t0_k"`
	WaterTemperature report.Num `json:"water_temperature_k"`
	StaticPressure   report.Num `json:"static_pressure_pa"`
	TestSpeed        report.Num `json:"test_speed_m_s"`
	TestQ            report.Num `json:"test_q_pa"`
	ModelRe          report.Num `json:"model_reynolds"`
	ReRatio          report.Num `json:"reynolds_ratio"`
	T0Change         bool       `json:"t0_change"`
	P0Change         bool       `json:"p0_change"`
	MachChange       bool       `json:"mach_change"`
}

var runCSVHeader = []string{
	"facility", "medium", "run", "row", "col", "altitude_m", "grid_speed", "grid_speed_kind",
	"flight_mach", "flight_tas_m_s", "flight_q_pa", "flight_reynolds", "class", "limit", "flags",
	"test_mach", "p0_pa", "t0_k", "water_temperature_k", "static_pressure_pa", "test_speed_m_s", "test_q_pa",
	"model_reynolds", "reynolds_ratio", "t0_change", "p0_change", "mach_change",
}

func (rr runRecord) csv() []string {
	return []string{rr.Facility, rr.Medium, strconv.Itoa(rr.Run), strconv.Itoa(rr.Row), strconv.Itoa(rr.Col),
		rr.Altitude.String(), rr.GridSpeed.String(), rr.GridSpeedKind, rr.FlightMach.String(), rr.FlightTAS.String(),
		rr.FlightQ.String(), rr.FlightRe.String(), rr.Class, rr.Limit, rr.Flags,
		rr.TestMach.String(), rr.P0.String(), rr.T0.String(), rr.WaterTemperature.String(), rr.StaticPressure.String(),
		rr.TestSpeed.String(), rr.TestQ.String(), rr.ModelRe.String(), rr.ReRatio.String(),
		strconv.FormatBool(rr.T0Change), strconv.FormatBool(rr.P0Change), strconv.FormatBool(rr.MachChange)}
}

// records turns a run list into records: runs in order, then the points
// that cannot be run.
func (p *runPlan) records(rl report.RunList) (runs, unrunnable []runRecord) {
	g := p.ev.e.Grid
	water := rl.Medium == envelope.MediumWater
	nan := report.Num(math.NaN())
	mk := func(r report.Run, n int) runRecord {
		rec := runRecord{
			Facility: rl.Facility, Medium: rl.Medium.String(), Run: n, Row: r.Row, Col: r.Col,
			Altitude: report.Num(r.Altitude), GridSpeed: report.Num(r.GridSpeed), GridSpeedKind: g.SpeedKind.String(),
			FlightMach: report.Num(r.FlightMach), FlightTAS: report.Num(r.FlightTAS), FlightQ: report.Num(r.FlightQ),
			FlightRe: report.Num(r.FlightRe), Class: r.Class.String(), Limit: r.Limit.String(), Flags: r.Flags.String(),
			TestMach: nan, P0: nan, T0: nan, WaterTemperature: nan, StaticPressure: nan,
			TestSpeed: nan, TestQ: nan, ModelRe: nan, ReRatio: nan,
		}
		if !r.HasSettings {
			return rec
		}
		if water {
			rec.WaterTemperature, rec.StaticPressure = report.Num(r.T0), report.Num(r.P0)
		} else {
			rec.TestMach, rec.P0, rec.T0 = report.Num(r.Mach), report.Num(r.P0), report.Num(r.T0)
		}
		rec.TestSpeed, rec.TestQ = report.Num(r.Speed), report.Num(r.Q)
		rec.ModelRe, rec.ReRatio = report.Num(r.Re), report.Num(r.ReRatio)
		return rec
	}
	for k, r := range rl.Runs {
		rec := mk(r, r.SetPoint)
		c := stepChanges(rl.Runs, k, water)
		rec.T0Change, rec.P0Change, rec.MachChange = c.T0 > 0, c.P0 > 0, c.Mach > 0
		runs = append(runs, rec)
	}
	for _, r := range rl.Unrunnable {
		unrunnable = append(unrunnable, mk(r, 0))
	}
	return runs, unrunnable
}

func (p *runPlan) writeCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(runCSVHeader); err != nil {
		return err
	}
	for _, rl := range p.lists {
		runs, un := p.records(rl)
		for _, rec := range append(runs, un...) {
			if err := cw.Write(rec.csv()); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// runJSON is the JSON run list.
type runJSON struct {
	report.ExportInfo
	Caution    string            `json:"caution"`
	Units      string            `json:"units"`
	Vehicle    string            `json:"vehicle"`
	Points     string            `json:"points"` // "marked" or "matched"
	Facilities []runJSONFacility `json:"facilities"`
}

type runJSONFacility struct {
	Facility   string      `json:"facility"`
	Medium     string      `json:"medium"`
	Scale      report.Num  `json:"model_scale"`
	SetPoints  int         `json:"set_points"` // runs; each record of "runs" is one flight point
	Changes    runChanges  `json:"changes"`
	Runs       []runRecord `json:"runs"`
	Unrunnable []runRecord `json:"unrunnable"`
}

type runChanges struct {
	T0    int `json:"t0"`
	P0    int `json:"p0"`
	Mach  int `json:"mach"`
	Moved int `json:"any"`
}

func (p *runPlan) writeJSON(w io.Writer) error {
	doc := runJSON{
		ExportInfo: report.ExportInfo{Tool: "likewind", Version: version, Generated: p.date},
		Caution:    envelope.PlanningNote, Units: "SI", Vehicle: envelope.CleanText(p.ev.e.Grid.Vehicle.Name),
		Points: "matched", Facilities: []runJSONFacility{},
	}
	if p.marked {
		doc.Points = "marked"
	}
	for _, rl := range p.lists {
		runs, un := p.records(rl)
		if runs == nil {
			runs = []runRecord{}
		}
		if un == nil {
			un = []runRecord{}
		}
		c := rl.Changes
		doc.Facilities = append(doc.Facilities, runJSONFacility{
			Facility: rl.Facility, Medium: rl.Medium.String(), Scale: report.Num(rl.Scale), SetPoints: rl.SetPoints,
			Changes: runChanges{T0: c.T0, P0: c.P0, Mach: c.Mach, Moved: c.Moved}, Runs: runs, Unrunnable: un,
		})
	}
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	_, err = w.Write(append(b, '\n'))
	return err
}
