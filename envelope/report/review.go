package report

import (
	"errors"
	"fmt"
	"strconv"

	"likewind/envelope"
	"likewind/envelope/units"
)

// ReviewInput is what the review pack (NewReview, Review.WriteHTML) is made
// from: an evaluation with the session already applied, and the words of
// where it came from.
type ReviewInput struct {
	Info ExportInfo // tool, version and date of the page
	// Sources are the input file names (none: the built-in demo);
	// Session is the session file applied ("" none) and Changed the
	// what-if values it changed from the files (whatif.Apply).
	Sources []string
	Session string
	Changed []string

	Eval *envelope.Evaluation
	// Marks are the session's marked test points; without marks the run
	// lists hold every matched point (PlanAll).
	Marks []envelope.GridPoint
	Units units.System
	// Cost gives the time and cost of the run lists where the facility
	// data allows (nil: no facility has such data; the page says so).
	Cost CostSource
}

// Review is the content of the review pack: the reports the other outputs
// make (NewCoverage, PlanAll, MapChart, ReMachChart, envelope.Cautions),
// gathered for one page. Every text from the input files has passed
// through envelope.CleanText; the HTML writer escapes it again.
type Review struct {
	in       ReviewInput
	Coverage Coverage
	Plan     RunPlan
	// Facilities follow the evaluation's facility order.
	Facilities []ReviewFacility
	// ReMach is the Reynolds number–Mach number chart as SVG (nil when it
	// could not be drawn: ReMachErr says why).
	ReMach    []byte
	ReMachErr string
}

// ReviewFacility is one facility's part of the review pack.
type ReviewFacility struct {
	Index    int // in the evaluation's facility order
	Name     string
	Class    string // the facility file's class words ("" none)
	Medium   envelope.Medium
	Coverage CoverageRow
	// Map is the facility's match-class map as SVG (nil when the facility
	// could not be evaluated, or the map could not be drawn: MapErr).
	Map    []byte
	MapErr string
	// Runs is the facility's run list (nil when not evaluated).
	Runs *RunList
	// Cost is the run list's time and cost, where the facility data gives
	// them (HasCost).
	Cost    FacilityCost
	HasCost bool
	// Cautions are the cautions raised at the facility's inside points.
	Cautions []RaisedCaution
	// Rule is the operating rule in force, in words.
	Rule string
}

// RaisedCaution is one caution raised at some points of a facility: how
// many inside points raise it, how many of those the run list holds, and
// the caution's text at the first of them (in grid order), where it is.
type RaisedCaution struct {
	Kind   string // the flag's or limit's name, e.g. "q near limit"
	Points int
	InRuns int
	Text   string
	Where  string // the first point, e.g. "11000 m, Mach 0.80"
}

// cautionFlags are the caution flags in the order envelope.Cautions writes
// them.
var cautionFlags = []envelope.Flags{
	envelope.FlagCryogenic, envelope.FlagHighP0, envelope.FlagQNearLimit, envelope.FlagCondensationWarn,
	envelope.FlagRealGas, envelope.FlagEnthalpyShort, envelope.FlagReOver, envelope.FlagModelTooLarge,
	envelope.FlagLoadNearLimit, envelope.FlagLowCavitation,
}

// NewReview gathers the review pack of an evaluation.
func NewReview(in ReviewInput) (*Review, error) {
	e := in.Eval
	if e == nil || e.Grid == nil {
		return nil, errors.New("review: no evaluation")
	}
	plan, err := PlanAll(e, in.Marks, -1)
	if err != nil {
		return nil, fmt.Errorf("review: %w", err)
	}
	r := &Review{in: in, Coverage: NewCoverage(e), Plan: plan}
	custom := in.Units == units.Customary
	next := 0 // the next of plan.Lists: one per evaluated facility, in order
	for k := range e.Facilities {
		f := &e.Facilities[k]
		rf := ReviewFacility{Index: k, Name: envelope.CleanText(f.Name), Class: envelope.CleanText(f.Class),
			Medium: f.Medium, Coverage: r.Coverage.Facilities[k]}
		m := e.Maps[k]
		if m == nil {
			r.Facilities = append(r.Facilities, rf)
			continue
		}
		rf.Rule = m.Rule.Describe(f.Medium, in.Units)
		if ch, err := MapChart(e, k, custom); err != nil {
			rf.MapErr = envelope.CleanText(err.Error())
		} else if rf.Map, err = ch.inlineSVG(); err != nil {
			rf.MapErr = envelope.CleanText(err.Error())
		}
		rl := &plan.Lists[next]
		next++
		rf.Runs = rl
		if in.Cost != nil {
			if c, ok := in.Cost.RunListCost(*rl); ok {
				if err := c.check(len(rl.Runs)); err != nil {
					return nil, fmt.Errorf("review: time and cost of %s: %w", rf.Name, err)
				}
				rf.Cost, rf.HasCost = c.clean(), true
			}
		}
		rf.Cautions, err = raisedCautions(m, rl, in.Units)
		if err != nil {
			return nil, fmt.Errorf("review: cautions of %s: %w", rf.Name, err)
		}
		r.Facilities = append(r.Facilities, rf)
	}
	if ch, err := ReMachChart(e, nil); err != nil {
		r.ReMachErr = envelope.CleanText(err.Error())
	} else if r.ReMach, err = ch.inlineSVG(); err != nil {
		r.ReMachErr = envelope.CleanText(err.Error())
	}
	return r, nil
}

// raisedCautions counts each caution flag over the inside points of m
// and the points where the balance load limits the setting, with the
// caution's text (envelope.Cautions, in units u) at the first point that
// raises it.
func raisedCautions(m *envelope.Map, rl *RunList, u units.System) ([]RaisedCaution, error) {
	g := m.Grid
	inRuns := map[envelope.GridPoint]bool{}
	for _, r := range rl.Runs {
		inRuns[r.GridPoint] = true
	}
	type tally struct {
		points, inRuns int
		first          envelope.GridPoint
	}
	flags := make([]tally, len(cautionFlags))
	var balance tally
	count := func(t *tally, p envelope.GridPoint) {
		if t.points == 0 {
			t.first = p
		}
		t.points++
		if inRuns[p] {
			t.inRuns++
		}
	}
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			res := m.At(i, j)
			if res.Class == envelope.Outside {
				continue
			}
			p := envelope.GridPoint{Row: i, Col: j}
			for k, fl := range cautionFlags {
				if res.Flags.Has(fl) {
					count(&flags[k], p)
				}
			}
			if res.Limit == envelope.LimitBalanceLoad {
				count(&balance, p)
			}
		}
	}
	speedTitle, speedLabel := u.SpeedAxis(g.SpeedKind)
	where := func(p envelope.GridPoint) string {
		return u.Alt(g.Alts[p.Row]) + ", " + speedTitle + " " + speedLabel(g.Speeds[p.Col])
	}
	var out []RaisedCaution
	for k, fl := range cautionFlags {
		t := flags[k]
		if t.points == 0 {
			continue
		}
		d, err := m.Detail(t.first.Row, t.first.Col)
		if err != nil {
			return nil, err
		}
		// The caution of this flag alone: Cautions writes the planning
		// note, then one line per flag set.
		d.Flags = fl
		text := envelope.Cautions(&d, m.Facility, u)
		c := RaisedCaution{Kind: fl.String(), Points: t.points, InRuns: t.inRuns, Where: where(t.first)}
		if len(text) > 1 {
			c.Text = text[1]
		}
		out = append(out, c)
	}
	if balance.points > 0 {
		out = append(out, RaisedCaution{
			Kind: envelope.LimitBalanceLoad.String(), Points: balance.points, InRuns: balance.inRuns, Where: where(balance.first),
			Text: "The balance and sting capacity caps the test-section dynamic pressure of this model at " + u.Q(m.LoadQ) +
				": the setting is held below what the facility could otherwise run. A planning estimate; check model, sting and balance with their own ratings.",
		})
	}
	return out, nil
}

// pointsWords is "3 points", "1 point".
func reviewPoints(n int) string {
	if n == 1 {
		return "1 point"
	}
	return strconv.Itoa(n) + " points"
}
