package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/report"
	"likewind/envelope/units"
)

var runsCommand = commandSpec{
	name:      "runs",
	usage:     "likewind runs [VEHICLE.toml FACILITIES.toml...] [--session FILE] [--format text|csv|json] [--facility NAME] [-o FILE] [--force] [--customary] [--shift DURATION]",
	format:    "text, csv or json",
	formats:   []string{"text", "csv", "json"},
	session:   "session file whose marked test points to list (and whose what-if values apply)",
	facility:  "list only this facility (name, unique part of a name, or number)",
	customary: "text in ft, kt, psi, psf and °F (CSV and JSON stay SI)",
	date:      "date written into the header, YYYY-MM-DD (default today)",
}

// runRuns prints the run list per facility: the session's marked test
// points, or without marks every matched point, in the order a facility
// runs them (flight points with the same set point as one run), with the
// number of set-point changes.
func runRuns(args []string, stdout, stderr io.Writer) int {
	c := newCommand(runsCommand, stdout, stderr)
	shiftText := shiftFlag(c)
	return c.run(args, func() error {
		shift, err := parseShift(c, *shiftText)
		if err != nil {
			return err
		}
		if err := c.load(); err != nil {
			return err
		}
		sel, err := c.pickFacility(c.facility != "", -1, false)
		if err != nil {
			return err
		}
		plan, err := planAll(c.ev, sel)
		if err != nil {
			return c.errorf("%w", err)
		}
		plan.date = c.day
		plan.Shift = shift
		return c.write(func(w io.Writer) error {
			switch c.format {
			case "csv":
				return plan.WriteCSV(w)
			case "json":
				return plan.writeJSON(w)
			}
			return plan.writeText(w, c.units())
		})
	})
}

// runPlan is the run lists of every selected facility, with the inputs
// they came from for the text header.
type runPlan struct {
	report.RunPlan
	ev   *evaluated
	date string
}

// planAll builds the run list of facility sel, or of every evaluated
// facility when sel < 0.
func planAll(ev *evaluated, sel int) (*runPlan, error) {
	rp, err := report.PlanAll(ev.e, ev.marks, sel)
	if err != nil {
		return nil, err
	}
	return &runPlan{RunPlan: rp, ev: ev}, nil
}

// writeJSON writes the run lists as JSON under this program's name,
// version and the plan's date.
func (p *runPlan) writeJSON(w io.Writer) error {
	return p.RunPlan.WriteJSON(w, report.ExportInfo{Tool: "likewind", Version: version, Generated: p.date})
}

func (p *runPlan) pointsWords() string {
	if p.Marked {
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

// writeText writes the run lists as aligned tables under a header.
func (p *runPlan) writeText(w io.Writer, u units.System) error {
	var b strings.Builder
	g := p.ev.e.Grid
	fmt.Fprintf(&b, "likewind %s run list, %s\n", version, p.date)
	src := "built-in demo data"
	if len(p.ev.in.files) > 0 {
		src = strings.Join(envelope.CleanAll(p.ev.in.files), ", ")
	}
	fmt.Fprintf(&b, "%-9s %s (%s)\n", "vehicle", envelope.CleanText(g.Vehicle.Name), src)
	fmt.Fprintf(&b, "%-9s %s\n", "points", p.pointsWords())
	fmt.Fprintf(&b, "%-9s per facility as its operating rule sets it: grouped by T0, then p0, then Mach number ascending\n"+
		"%-9s (water: temperature, static pressure, speed), under a fixed q by q, then T0, then Mach number;\n"+
		"%-9s a setting counts as changed when it moves by %g K, %g %% of p0 or of a held q, %g in Mach or %g m/s\n",
		"order", "", "", report.RunT0Step, 100*report.RunP0Frac, report.RunMachStep, report.RunSpeedStep)
	rule := "each facility's own operating rule, stated with its list"
	if r := p.RuleOverride; r.Kind != envelope.RuleDefault {
		rule = "what-if for every facility: " + r.Name(u)
	}
	fmt.Fprintf(&b, "%-9s %s\n", "rule", rule)
	fmt.Fprintf(&b, "%-9s %s\n", "caution", envelope.SafetyNote)
	t := newRunText(u, g.SpeedKind)
	t.cost = report.CampaignSource{Shift: p.Shift, Units: u}
	for _, rl := range p.Lists {
		t.writeList(&b, rl)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// runText formats run lists in SI units (kPa, K, m/s) or customary ones
// (psi for p0 and static pressure, psf for q, °F, ft/s).
type runText struct {
	u          units.System
	speedTitle string
	speedLabel func(float64) string
	// unit labels of altitude, pressure, dynamic pressure, temperature
	// and speed
	altU, pU, qU, tU, vU string
	// cost gives the campaign time and cost of a list whose facility has
	// campaign data.
	cost report.CampaignSource
}

func newRunText(u units.System, kind atmos.SpeedKind) runText {
	t := runText{u: u, altU: u.AltUnit(), pU: "kPa", qU: "kPa", tU: "K", vU: "m/s"}
	t.speedTitle, t.speedLabel = u.SpeedAxis(kind)
	if u == units.Customary {
		t.pU, t.qU, t.tU, t.vU = "psi", "psf", "°F", "ft/s"
	}
	return t
}

func (t runText) customary() bool { return t.u == units.Customary }

// p is a stagnation or static pressure.
func (t runText) p(x float64) string {
	if t.customary() {
		return sig4(x / atmos.PSI)
	}
	return sig4(x / 1000)
}

// q is a dynamic pressure.
func (t runText) q(x float64) string {
	if t.customary() {
		return sig4(x / atmos.PSF)
	}
	return sig4(x / 1000)
}

func (t runText) temp(k float64) string {
	if t.customary() {
		return strconv.FormatFloat(k*9/5-459.67, 'f', 1, 64)
	}
	return strconv.FormatFloat(k, 'f', 1, 64)
}

func (t runText) speed(x float64) string {
	if t.customary() {
		return strconv.FormatFloat(x/atmos.Foot, 'f', 2, 64)
	}
	return strconv.FormatFloat(x, 'f', 2, 64)
}

// writeList writes one facility's list: the counts of runs and set-point
// changes, the runs in order and the points it cannot run.
func (t runText) writeList(b *strings.Builder, rl report.RunList) {
	water := rl.Medium == envelope.MediumWater
	fmt.Fprintf(b, "\n%s (%s, model scale %.3g)\n", rl.Facility, rl.Medium, rl.Scale)
	fmt.Fprintf(b, "operating rule: %s; runs grouped by %s\n", rl.Rule.Describe(rl.Medium, t.u), orderWords(rl.Order))
	c := rl.Changes
	fc, hasCost := t.cost.RunListCost(rl)
	if len(rl.Runs) == 0 {
		b.WriteString("no points to run\n")
	} else if water {
		fmt.Fprintf(b, "%s; set-point changes: water temperature %d, static pressure %d, speed %d; %d of %s change a setting\n",
			runCount(rl), c.T0, c.P0, c.Mach, c.Moved, plural(c.Steps, "step", "steps"))
	} else {
		held := ""
		if rl.Order.HoldQ {
			held = fmt.Sprintf("q %d, ", c.Q)
		}
		fmt.Fprintf(b, "%s; set-point changes: %sT0 %d, p0 %d, Mach %d; %d of %s change a setting\n",
			runCount(rl), held, c.T0, c.P0, c.Mach, c.Moved, plural(c.Steps, "step", "steps"))
	}
	if len(rl.Runs) > 0 {
		head := []string{"run", "altitude " + t.altU, t.speedTitle, "flight Re", "flight q " + t.qU}
		if water {
			head = append(head, "water T "+t.tU, "static p "+t.pU, "speed "+t.vU)
		} else {
			head = append(head, "T0 "+t.tU, "p0 "+t.pU, "test Mach")
		}
		head = append(head, "model Re", "Re ratio", "q "+t.qU, "class", "changes")
		if hasCost {
			head = append(head, fc.Columns...)
		}
		var rows [][]string
		for k := range rl.Runs {
			row := t.row(rl.Runs, k, rl.Order)
			if hasCost {
				row = append(row, fc.Cells[k]...)
			}
			rows = append(rows, row)
		}
		report.WriteTable(b, head, rows, func(k int) bool { return k == 11 || k == 12 })
	}
	if hasCost {
		writeCost(b, fc)
	}
	if len(rl.Unrunnable) > 0 {
		fmt.Fprintf(b, "not runnable (%s):\n", plural(len(rl.Unrunnable), "point", "points"))
		for _, r := range rl.Unrunnable {
			why := r.Class.String()
			if r.Limit != envelope.LimitNone {
				why += ", limit: " + r.Limit.String()
			}
			fmt.Fprintf(b, "  %s, %s %s: %s\n", t.u.Alt(r.Altitude), t.speedTitle, t.speedLabel(r.GridSpeed), why)
		}
	}
}

// writeCost writes a list's campaign summary and notes under its table.
func writeCost(b *strings.Builder, fc report.FacilityCost) {
	b.WriteString("campaign time and cost:\n")
	w := 0
	for _, it := range fc.Summary {
		w = max(w, utf8.RuneCountInString(it.Label))
	}
	for _, it := range fc.Summary {
		fmt.Fprintf(b, "  %s%s  %s\n", it.Label, strings.Repeat(" ", w-utf8.RuneCountInString(it.Label)), it.Value)
	}
	for _, n := range fc.Notes {
		fmt.Fprintf(b, "  note: %s\n", n)
	}
}

// shiftFlag adds --shift to c: the shift length the campaign summary
// counts shifts in.
func shiftFlag(c *command) *string {
	return c.fs.String("shift", "8 h", "shift length for the campaign's shift count, a time with its unit, e.g. \"8 h\" or \"450 min\" (above 0, at most 24 h)")
}

// parseShift reads --shift: a time above 0 and at most 24 h.
func parseShift(c *command, s string) (float64, error) {
	v, err := atmos.ParseQuantity(s, atmos.Time)
	if err != nil {
		return 0, c.usagef("--shift: %w", err)
	}
	if !(v > 0 && v <= 24*atmos.Hour) {
		return 0, c.usagef("--shift %q: want a shift above 0 and at most 24 h", s)
	}
	return v, nil
}

// row is the table row of run k. A further flight point of the same run
// leaves the run number and the settings blank.
func (t runText) row(runs []report.Run, k int, o report.RunOrder) []string {
	water := o.Water
	r := runs[k]
	again := k > 0 && runs[k-1].SetPoint == r.SetPoint
	row := []string{strconv.Itoa(r.SetPoint), t.u.AltLabel(r.Altitude), t.speedLabel(r.GridSpeed),
		sig3(r.FlightRe), t.q(r.FlightQ)}
	switch {
	case again:
		row[0] = ""
		row = append(row, "", "", "", "")
	case water:
		row = append(row, t.temp(r.T0), t.p(r.P0), t.speed(r.Speed), sig3(r.Re))
	default:
		row = append(row, t.temp(r.T0), t.p(r.P0), strconv.FormatFloat(r.Mach, 'f', 3, 64), sig3(r.Re))
	}
	q, changes := t.q(r.Q), changeWords(o.Step(runs, k), water)
	if again {
		q, changes = "", "same run"
	}
	return append(row, strconv.FormatFloat(r.ReRatio, 'f', 2, 64), q, r.Class.String(), changes)
}

// changeWords names the settings that move before a run ("" for none and
// for the first).
func changeWords(c report.Changes, water bool) string {
	var parts []string
	names := [4]string{"q", "T0", "p0", "Mach"}
	if water {
		names = [4]string{"q", "temperature", "pressure", "speed"}
	}
	for k, n := range []int{c.Q, c.T0, c.P0, c.Mach} {
		if n > 0 {
			parts = append(parts, names[k])
		}
	}
	return strings.Join(parts, " ")
}

// orderWords says how a run list is grouped: "T0, then p0, then Mach
// number", "q, then T0, then Mach number" or for water "temperature, then
// static pressure, then speed".
func orderWords(o report.RunOrder) string {
	if o.Water {
		return "water temperature, then static pressure, then speed"
	}
	words := map[string]string{"t0": "T0", "p0": "p0", "mach": "Mach number", "q": "q"}
	var parts []string
	for _, k := range o.Keys() {
		parts = append(parts, words[k])
	}
	return strings.Join(parts, ", then ")
}

func sig3(x float64) string { return strconv.FormatFloat(x, 'g', 3, 64) }

func sig4(x float64) string { return strconv.FormatFloat(x, 'g', 4, 64) }
