package envelope

import (
	"fmt"
	"math"

	"likewind/atmos"
)

// solver answers the points of one facility for one medium: gasSolver
// (gas_solver.go) or waterSolver (water_solver.go), each holding the
// facility's constants and owning its caches. Solve, Map.Detail, the
// Reynolds ranges of the charts and the scale fitting go through these
// methods only.
type solver interface {
	// fitMach is the test Mach number the model is sized for (the blockage
	// rule depends on it), given the highest inside flight Mach number.
	fitMach(flightMax float64) float64
	// setModelLength fixes the model reference length, m. It is called
	// once, before any other method but fitMach.
	setModelLength(L float64)
	// setLoadCap sets the dynamic pressure at which the model reaches the
	// balance capacity (0: not checked), a cap on q like q max; called
	// with setModelLength.
	setLoadCap(q float64)

	// rowSolver returns a function that solves the inside points of a
	// block of m (rows b.i0..b.i1-1, columns b.j0..b.j1-1) into
	// m.Results and counts them per class. It keeps caches of its own:
	// each goroutine takes one.
	rowSolver(cols int) func(m *Map, b block) [NumClasses]int
	// solve answers one point at full precision: flight Mach number mf,
	// flight Reynolds number reF, flight static temperature tFlight (K).
	// With detail set it also finds what only the point details show (the
	// highest reachable Reynolds number where the target was hit directly,
	// the skin-friction difference).
	solve(mf, reF, tFlight float64, detail bool) pointSol
	// addDetail adds to d what the medium tells about the answer ps: the
	// matching set, the Reynolds sweep at the chosen dynamic pressure, and
	// the condensation floor (gas) or the vapour pressure and cavitation
	// number (water). ps is passed by value: a pointer passed through the
	// interface would move each point's answer to the heap, an allocation
	// per point of every export (BenchmarkExportCSV400 with -benchmem).
	addDetail(d *Detail, ps pointSol)
	// matchQ is the lowest test-section dynamic pressure of a setting that
	// reaches Reynolds number target at flight Mach number mf (gas: at
	// the Mach number a match is tried at; water: below the
	// compressibility threshold), under the facility's own limits without
	// the balance cap; ok is false where no setting reaches it.
	matchQ(mf, target float64) (q float64, ok bool)

	// reynoldsRange is the span of model Reynolds numbers reached at test
	// Mach number mach (see Map.ReynoldsRange).
	reynoldsRange(mach float64) (lo, hi float64, ok bool)
	// reachableRe is the facility's region of the Reynolds–Mach chart,
	// sampled at about samples Mach numbers (see Map.ReachableRe).
	reachableRe(samples int) []ReRange
	// minScale is the smallest model scale that makes flight record r a
	// full match (see MinScaleFullMatch), without the balance cap; memo,
	// when not nil, keeps what depends on the flight Mach number alone.
	minScale(r *flightRec, memo map[float64]scaleOne) minScaleSol

	// reach, relaxReach and topQ serve the scale study (study_reach.go):
	// the best settings a point's class is decided by, at flight Mach
	// number mf; the highest setting where Mach number may be relaxed;
	// the highest dynamic pressure the facility runs (a balance cap at or
	// above it binds nowhere).
	reach(mf float64) pointReach
	relaxReach() (re float64, ok bool)
	topQ() float64
}

// scaleOne is the best setting at a flight Mach number for a full-scale
// model: its Reynolds number and dynamic pressure.
type scaleOne struct{ re, q float64 }

// minScaleSol is the smallest model scale that makes a point a full match
// (ok false: none does), with the dynamic pressure of the best setting
// that sets it (the same at every scale: the best setting's unit Reynolds
// number does not depend on scale), for the balance check.
type minScaleSol struct {
	scale, q float64
	ok       bool
}

// newSolver checks facility f and returns the solver of its medium, with
// the tolerances of s and the regime thresholds reg. A gas is looked up by
// name (atmos.GasByName), so a gas added there needs nothing here.
//
// The solver runs under the operating rule in force (RuleInForce), which
// must suit the facility (CheckRule).
func newSolver(f *Facility, s Settings, reg atmos.Regimes) (solver, error) {
	if err := checkFacility(f); err != nil {
		return nil, err
	}
	var gas atmos.Gas
	if f.Medium != MediumWater {
		var err error
		if gas, err = atmos.GasByName(string(f.Medium)); err != nil {
			return nil, fmt.Errorf("medium %q: want %s", string(f.Medium), mediumWanted())
		}
	}
	r := RuleInForce(f, s)
	if r.Kind != RuleWarmest {
		if err := CheckRule(r, f); err != nil {
			return nil, err
		}
	}
	if f.Medium == MediumWater {
		return newWaterSolver(f, s, r)
	}
	return newGasSolver(f, gas, s, reg, r)
}

// pointSol is the full-precision answer for one point.
type pointSol struct {
	class      Class
	limit      Limit
	pLim, tLim Limit
	flags      Flags
	has        bool

	mach, p0, t0             float64
	p, t, v, q, rho, mu      float64
	re, reFlight, ratio, dcf float64
	reMax                    float64
	pv, sigma                float64
}

func (ps *pointSol) result() Result {
	return Result{
		Class: ps.class, Limit: ps.limit, Flags: ps.flags,
		P0: float32(ps.p0), T0: float32(ps.t0), Q: float32(ps.q),
		Re: float32(ps.re), ReRatio: float32(ps.ratio),
		V: float32(ps.v),
	}
}

// finish adds what follows from the model Reynolds number reached: its
// ratio to flight, the flag when it overshoots flight by more than reTol,
// and (detail) the skin-friction difference.
func (ps *pointSol) finish(reTol float64, detail bool) {
	if !ps.has || !(ps.reFlight > 0) {
		return
	}
	ps.ratio = ps.re / ps.reFlight
	// The skin-friction difference is for the point details only; the
	// compact map does not keep it.
	if detail && math.Abs(ps.ratio-1) > 1e-9 {
		ps.dcf = skinFrictionDelta(ps.re, ps.reFlight)
	}
	if ps.ratio > 1+reTol {
		ps.flags |= FlagReOver
	}
}

// checkSettings checks the tolerances and scale of s.
func checkSettings(s Settings) error {
	switch {
	case !isFiniteNum(s.Scale) || s.Scale < 0:
		return fmt.Errorf("settings: scale %g: want 0 (use the facility's) or a positive number", s.Scale)
	case !isFiniteNum(s.MachTol) || s.MachTol < 0:
		return fmt.Errorf("settings: Mach tolerance %g: want a non-negative number", s.MachTol)
	case !(s.ReTol >= 0 && s.ReTol < 1):
		return fmt.Errorf("settings: Reynolds tolerance %g: want a fraction from 0 up to (not including) 1", s.ReTol)
	case !isFiniteNum(s.CompressibilityMach) || s.CompressibilityMach < 0:
		return fmt.Errorf("settings: compressibility Mach %g: want a non-negative number", s.CompressibilityMach)
	}
	return nil
}

// checkFacility checks the limits every facility has; each solver checks
// the limits of its medium.
func checkFacility(f *Facility) error {
	return checkNonNegative([]namedValue{{"q max", f.QMax},
		{"max unit Reynolds number", f.MaxReynoldsPerM}, {"model scale", f.Model.Scale},
		{"balance normal force", f.Balance.MaxNormalForce}, {"balance pitching moment", f.Balance.MaxPitchMoment}})
}

// namedValue is a facility limit with the name an error gives it.
type namedValue struct {
	name string
	v    float64
}

// checkNonNegative reports the first value that is not a finite,
// non-negative number.
func checkNonNegative(vs []namedValue) error {
	for _, x := range vs {
		if !isFiniteNum(x.v) || x.v < 0 {
			return fmt.Errorf("%s %g: want a finite, non-negative number", x.name, x.v)
		}
	}
	return nil
}

// qLimits is the test-section dynamic-pressure cap both media share: the
// facility's q max and the q at which the model reaches the balance
// capacity.
type qLimits struct {
	qMax float64 // Pa (0: none)
	// qLoad is the dynamic pressure at which the model reaches the
	// balance capacity (0: not checked); qCap, the lower of it and qMax,
	// caps p0 (gas) or the speed (water), and qCapLim names it.
	qLoad, qCap float64
	qCapLim     Limit
}

// setLoadCap sets the dynamic pressure at which the model reaches the
// balance capacity (0: not checked).
func (c *qLimits) setLoadCap(q float64) {
	c.qLoad = q
	c.qCap, c.qCapLim = c.qMax, LimitQMax
	if q > 0 && (c.qCap == 0 || q < c.qCap) {
		c.qCap, c.qCapLim = q, LimitBalanceLoad
	}
}
