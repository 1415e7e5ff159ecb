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
// cannot be Mach-matched at any scale, or no point can; the scale returned
// then still covers the points that can (0 when none can).
func MinScaleEnvelope(g *Grid, f *Facility, s Settings) (float64, bool) {
	most, n := minScaleSurvey(g, f, s)
	return most, n > 0 && n == g.InsideCount()
}

// minScaleSurvey is the largest MinScaleFullMatch over the inside points
// of g and the number of points that have one, with one solver and the
// scale-1 Reynolds number computed once per flight Mach number.
func minScaleSurvey(g *Grid, f *Facility, s Settings) (most float64, n int) {
	sv, ok := scaleOneSolver(g, f, s)
	if !ok {
		return 0, 0
	}
	memo := map[float64]scaleOne{}
	loads := newLoadModel(g.Vehicle, f)
	for k := range g.points {
		if sol := sv.minScale(&g.points[k], memo); sol.ok && carries(loads, sol) {
			most = math.Max(most, sol.scale)
			n++
		}
	}
	return most, n
}
