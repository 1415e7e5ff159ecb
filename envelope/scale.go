package envelope

import (
	"fmt"
	"math"
)

// Default model blockage by test Mach number (common practice; planning
// values): frontal area up to about 5 % of the test-section area at low
// speed, where blockage corrections are routine, and about 1 % from
// BlockageMach up, where solid blockage drives the section toward choking
// (transonic) or stops a supersonic nozzle from starting.
const (
	LowSpeedBlockage  = 0.05
	HighSpeedBlockage = 0.01
	BlockageMach      = 0.6
)

// DefaultBlockage is the largest frontal blockage (share of the section
// area) used when a facility does not set one, for test Mach number mach.
func DefaultBlockage(mach float64) float64 {
	if mach < BlockageMach {
		return LowSpeedBlockage
	}
	return HighSpeedBlockage
}

// FitScale is the largest model scale that keeps the model span within
// MaxSpanFraction of the section width (default DefaultMaxSpanFraction) and
// its frontal area within MaxBlockage of the section area (default by Mach
// number, DefaultBlockage), for vehicle v in facility f at test Mach number
// mach. rule says which rule decides. Either rule is skipped when the
// vehicle lacks the span or frontal area, or the section its width or
// height; with neither it returns 0.
func FitScale(v *Vehicle, f *Facility, mach float64) (scale float64, rule string) {
	frac := f.Model.MaxSpanFraction
	if frac <= 0 {
		frac = DefaultMaxSpanFraction
	}
	block := f.Model.MaxBlockage
	if block <= 0 {
		block = DefaultBlockage(mach)
	}
	scale = math.Inf(1)
	if v.Span > 0 && f.Width > 0 {
		scale = frac * f.Width / v.Span
		rule = fmt.Sprintf("span %.0f %% of section width", 100*frac)
	}
	if v.FrontalArea > 0 && f.Width > 0 && f.Height > 0 {
		if s := math.Sqrt(block * f.Width * f.Height / v.FrontalArea); s < scale {
			scale = s
			rule = fmt.Sprintf("blockage %.3g %% of section area", 100*block)
		}
	}
	if math.IsInf(scale, 1) {
		return 0, "no span or frontal area to fit the model by"
	}
	// 0.75·3.6 m/24 m is 0.1125, not 0.11250000000000002.
	return tidyDecimal(scale), rule
}

// Fits reports whether a model of the given scale fits the map's facility
// by the span and blockage rules at the Mach number the model is sized for
// (false when the fit scale is unknown).
func (m *Map) Fits(scale float64) bool { return fitsWithin(scale, m.FitScale) }

// fitsWithin reports whether scale is at most fit, allowing for rounding
// (false when fit is unknown, 0).
func fitsWithin(scale, fit float64) bool { return fit > 0 && scale <= fit*(1+1e-9) }

// sectionFit holds the largest scales the section takes below and from
// BlockageMach (they differ only where the blockage share is by speed),
// for the model-size caution of each point.
type sectionFit struct {
	low, high         float64
	lowRule, highRule string
}

func newSectionFit(v *Vehicle, f *Facility) sectionFit {
	var s sectionFit
	s.low, s.lowRule = FitScale(v, f, 0)
	s.high, s.highRule = FitScale(v, f, BlockageMach)
	return s
}

// at is the largest scale and its rule at test Mach number mach.
func (s *sectionFit) at(mach float64) (float64, string) {
	if mach < BlockageMach {
		return s.low, s.lowRule
	}
	return s.high, s.highRule
}

// sizeMach is the test Mach number a point's model size is judged at: the
// setting's, or where there is none the flight Mach number held within
// the facility's Mach range (water: 0, low speed).
func (m *Map) sizeMach(flightMach float64, has bool, testMach float64) float64 {
	switch {
	case m.Facility.Medium == MediumWater:
		return 0
	case has:
		return testMach
	}
	return max(min(flightMach, m.Facility.Gas.MachMax), m.Facility.Gas.MachMin)
}

// sizeFlag is FlagModelTooLarge when the map's model does not fit the
// section at test Mach number mach; 0 when it fits or no fit scale is
// known (no span or frontal area).
func (m *Map) sizeFlag(mach float64) Flags {
	fit, _ := m.fit.at(mach)
	if fit > 0 && !fitsWithin(m.Scale, fit) {
		return FlagModelTooLarge
	}
	return 0
}

// MinScaleFullMatch is the smallest model scale at which point (i, j)
// becomes a full match in facility f: at every Mach number the best
// setting's unit Reynolds number does not depend on scale, so the model
// Reynolds number is proportional to scale and
//
//	scale_min = (1 − ReTol)·Re_flight / (Re_best at scale 1),
//
// with Re_best the highest over the Mach numbers within MachTol of flight
// (the flight Mach number and gasSolver.maxOver of the band), as Solve finds
// a full match anywhere in that band.
//
// ok is false when the point is outside the envelope, the facility cannot
// run the flight Mach number (within MachTol), no setting exists there, or
// the medium is a liquid (no Mach match).
//
// Where the balance is checked (loads.go), the model of that scale must
// also carry the load at that setting: the balance caps q at
// q_load ∝ 1/scale² (1/scale³ for the moment), and where the cap lies
// below the setting's q no model is a full match (ok false). A larger
// model does not help there: with q held at the cap p0 falls as
// 1/scale², and Re ∝ scale·p0 falls with it (where the saturation line
// lets T0 fall too, Re falls more slowly, about as scale^-0.6, but
// falls). This is judged at the Mach number of the best setting.
func MinScaleFullMatch(g *Grid, f *Facility, s Settings, i, j int) (float64, bool) {
	sv, ok := scaleOneSolver(g, f, s)
	if !ok {
		return 0, false
	}
	sol := sv.minScale(&g.points[g.Index(i, j)], nil)
	return sol.scale, sol.ok && carries(newLoadModel(g.Vehicle, f), sol)
}

// carries reports whether the balance of loads takes the model of the
// scale of sol at its setting (true where the balance is not checked).
func carries(loads loadModel, sol minScaleSol) bool {
	qc := loads.qCap(sol.scale)
	return !(qc > 0) || sol.q <= qc*(1+solveSlack)
}

// scaleOneSolver is the solver of facility f for a full-scale model (its
// Reynolds numbers are those at scale 1); ok is false when f or s is not
// valid.
func scaleOneSolver(g *Grid, f *Facility, s Settings) (solver, bool) {
	if checkSettings(s) != nil {
		return nil, false
	}
	sv, err := newSolver(f, s, g.Regimes)
	if err != nil {
		return nil, false
	}
	sv.setModelLength(g.Vehicle.RefLength)
	return sv, true
}

// MinScaleEnvelope is the smallest model scale at which every inside point
// that facility f can run at flight Mach number becomes a full match (the
// largest per-point MinScaleFullMatch). ok is false when some inside point
// cannot be Mach-matched at any scale (or, with load data, not within the
// balance), or no point can; the scale returned then still covers the
// points that can (0 when none can).
func MinScaleEnvelope(g *Grid, f *Facility, s Settings) (float64, bool) {
	ms := SurveyMinScale(g, f, s)
	return ms.Scale, ms.Points > 0 && ms.Points == g.InsideCount()
}

// MinScaleSurvey is what SurveyMinScale finds for one facility: the
// largest MinScaleFullMatch over the inside points (Scale, 0 when none has
// one) and the number of inside points that have one (Points: those the
// facility can run at flight Mach number).
type MinScaleSurvey struct {
	Scale  float64
	Points int
}

// SurveyMinScale surveys the inside points of g for facility f, with one
// solver and the scale-1 Reynolds number computed once per flight Mach
// number.
func SurveyMinScale(g *Grid, f *Facility, s Settings) MinScaleSurvey {
	var ms MinScaleSurvey
	sv, ok := scaleOneSolver(g, f, s)
	if !ok {
		return ms
	}
	memo := map[float64]scaleOne{}
	loads := newLoadModel(g.Vehicle, f)
	for k := range g.points {
		if sol := sv.minScale(&g.points[k], memo); sol.ok && carries(loads, sol) {
			ms.Scale = math.Max(ms.Scale, sol.scale)
			ms.Points++
		}
	}
	return ms
}

// ScaleWindow is the range of model scales over which a point is a full
// match in a facility with its balance: from the smallest scale whose
// best setting reaches the flight Reynolds number (within ReTol) to the
// largest at which a setting that does still keeps the model load within
// the balance capacity.
type ScaleWindow struct {
	// Min is MinScaleFullMatch without the balance; MinOK says whether
	// the facility can Mach-match the point at all.
	Min   float64
	MinOK bool
	// Max is the largest scale the balance takes at the point: the load
	// at the least-load setting that makes it a full match (the coldest
	// end of the matching line for (1 − ReTol) of the flight Reynolds
	// number, which every rule's setting loads at least as much) reaches
	// the capacity there. +Inf where the balance is not checked; 0 where
	// not even a model of scale Min is carried (no model is a full match
	// within the balance).
	Max float64
}

// Open reports whether some scale makes the point a full match within the
// balance: Min ≤ Max.
func (w ScaleWindow) Open() bool { return w.MinOK && w.Max > 0 && w.Min <= w.Max*(1+1e-9) }

// Scale search of ScaleWindowAt: the load at the least-load setting grows
// with scale (about as scale¹: q falls as 1/scale where T0 stays at its
// floor, load = C·q·A·scale²; as scale^0.8 where the saturation line lets
// T0 fall; as scale² where p0 is at its minimum), so its root is found by
// regula falsi (Illinois) on the logarithms, at most scaleIter steps, to
// scaleTol relative.
const (
	scaleIter = 100
	scaleTol  = 1e-10
)

// ScaleWindowAt is the scale window of point (i, j) in facility f with
// settings s (the load judged at the Mach number a match is tried at, the
// flight Mach number held within the facility range, and at the ends of
// the Mach tolerance band, where Solve may also find the match). ok is
// false when the point
// is outside the envelope or f or s is not valid, and for a water tunnel,
// which never makes a full match.
func ScaleWindowAt(g *Grid, f *Facility, s Settings, i, j int) (ScaleWindow, bool) {
	sv, ok := scaleOneSolver(g, f, s)
	if !ok || f.Medium == MediumWater {
		return ScaleWindow{}, false
	}
	r := &g.points[g.Index(i, j)]
	if r.excl != InEnvelope {
		return ScaleWindow{}, false
	}
	return scaleWindow(sv, g.Vehicle.RefLength, newLoadModel(g.Vehicle, f), r, s.ReTol, nil, math.Inf(1)), true
}

// scaleWindow is the scale window of flight record r with solver sv
// (whose model length it changes; L1 is the full-scale length).
//
// below, when finite, asks only whether Max lies below it: where the
// balance still carries the model at scale below (the load grows with
// scale: see the scale search above), Max is returned as below without the root
// search (BalanceScaleEnvelope keeps the smallest Max, so most points
// need two loads worked out instead of tens: BenchmarkStudy400Loads).
func scaleWindow(sv solver, L1 float64, loads loadModel, r *flightRec, reTol float64, memo map[float64]scaleOne, below float64) ScaleWindow {
	sv.setModelLength(L1)
	sol := sv.minScale(r, memo)
	w := ScaleWindow{Min: sol.scale, MinOK: sol.ok, Max: math.Inf(1)}
	if !sol.ok {
		w.Max = 0
		return w
	}
	if !loads.checks() {
		return w
	}
	need := (1 - reTol) * r.re
	// share is the load at the least-load full-match setting over the
	// capacity, at scale sc (at Min the one setting is minScale's).
	share := func(sc float64) float64 {
		sv.setModelLength(sc * L1)
		q, ok := sv.matchQ(r.mach, need)
		if !ok || sc <= sol.scale {
			q = sol.q
		}
		return q / loads.qCap(sc)
	}
	lo := sol.scale
	slo := share(lo)
	if slo > 1+solveSlack {
		w.Max = 0
		return w
	}
	switch {
	case below < lo:
		w.Max = lo // at least Min, so above below
		return w
	case below < math.Inf(1) && share(below) <= 1:
		w.Max = below
		return w
	}
	hi, shi := lo, slo
	for k := 0; shi <= 1 && k < 200; k++ {
		lo, slo = hi, shi
		hi *= 2
		shi = share(hi)
	}
	if shi <= 1 {
		return w // no capacity reached within 2^200 of Min: not checked in effect
	}
	fl, fh := math.Log(slo), math.Log(shi)
	x0, x1 := math.Log(lo), math.Log(hi)
	side := 0
	for it := 0; it < scaleIter && x1-x0 > scaleTol; it++ {
		x := x1 - fh*(x1-x0)/(fh-fl)
		if !(x > x0 && x < x1) {
			x = 0.5 * (x0 + x1)
		}
		fm := math.Log(share(math.Exp(x)))
		if fm <= 0 {
			x0, fl = x, fm
			if side == -1 {
				fh /= 2
			}
			side = -1
		} else {
			x1, fh = x, fm
			if side == 1 {
				fl /= 2
			}
			side = 1
		}
	}
	w.Max = math.Exp(x0) // the carried side
	return w
}

// BalanceScale is the largest model scale that facility f's balance takes
// at every inside point whose scale window is open (the smallest
// ScaleWindow.Max over them), for sizing a model to the balance as
// FitScale sizes it to the section. Closed counts the points the facility
// could Mach-match whose window is shut (no model is a full match there
// within the balance), Open those whose window is open. Max is +Inf where
// the balance is not checked, and for a water tunnel.
type BalanceScale struct {
	Max          float64
	Open, Closed int
}

// BalanceScaleEnvelope is the BalanceScale of facility f over grid g with
// settings s (one window search per inside point: for surveys and the
// scale study, not the per-frame solve).
func BalanceScaleEnvelope(g *Grid, f *Facility, s Settings) BalanceScale {
	out := BalanceScale{Max: math.Inf(1)}
	loads := newLoadModel(g.Vehicle, f)
	sv, ok := scaleOneSolver(g, f, s)
	if !ok || f.Medium == MediumWater || !loads.checks() {
		return out
	}
	memo := map[float64]scaleOne{}
	for k := range g.points {
		r := &g.points[k]
		if r.excl != InEnvelope {
			continue
		}
		w := scaleWindow(sv, g.Vehicle.RefLength, loads, r, s.ReTol, memo, out.Max)
		switch {
		case w.Open():
			out.Open++
			out.Max = math.Min(out.Max, w.Max)
		case w.MinOK:
			out.Closed++
		}
	}
	return out
}
