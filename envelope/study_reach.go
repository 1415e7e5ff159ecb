package envelope

import "math"

// The solver side of the scale study (study.go): what a point's class
// depends on besides its flight Reynolds number, at the solver's model
// length and balance cap. Solve decides a point by comparing the
// Reynolds numbers of a few best settings with the flight Reynolds number
// (1 − ReTol) (solveGas, waterSolver.solveInto); those best settings
// depend on the flight Mach number alone, so the study asks for them once
// per flight Mach number and compares each point's own target with them.

// pointReach is what decides the class of a point of flight Mach number
// mf, at the solver's model length, apart from its flight Reynolds
// number.
type pointReach struct {
	// matched: the facility runs the flight Mach number within MachTol.
	matched bool
	// atOK: a best setting exists at that Mach number (a Reynolds-short
	// answer is possible), with Reynolds number at.
	atOK bool
	at   float64
	// full is the highest Reynolds number of a best setting the point may
	// be a full match with: at, or anywhere in the Mach tolerance band
	// (-1: none).
	full float64
	// relax: the flight Mach number is below the compressibility
	// threshold, so Mach number may be relaxed (the facility's relaxed
	// range, relaxReach, decides).
	relax bool
}

// reach is the pointReach of flight Mach number mf (gas): the best setting
// at mf held within the facility range, and the highest of the Mach
// tolerance band (bandTopRe), as solveGas and fullMatch find them.
func (sv *gasSolver) reach(mf float64) pointReach {
	mm := sv.matchMach(mf)
	r := pointReach{matched: withinTol(mm, mf, sv.mTol), relax: mf < sv.compMach, full: -1}
	if !r.matched {
		return r
	}
	if c := sv.bounds(mm); c.ok {
		if b, ok := sv.best(&c); ok {
			r.atOK, r.at, r.full = true, b.re, b.re
		}
	}
	if sv.mTol > 0 {
		r.full = math.Max(r.full, sv.bandTopRe(mf, nil))
	}
	return r
}

// relaxReach is the Reynolds number of the highest setting over the range
// where Mach number may be relaxed (relaxFor's range), ok false when the
// range is empty or has no usable Mach number.
func (sv *gasSolver) relaxReach() (float64, bool) {
	lo, hi := sv.lim.MachMin, math.Min(sv.lim.MachMax, sv.compMach)
	if !(hi > lo) {
		return 0, false
	}
	top, ok := sv.maxOver(lo, hi)
	return top.re, ok
}

// topQ is the highest test-section dynamic pressure the facility runs at
// any setting: P0Max at the Mach number of its range where q/p0 peaks
// (gasQRange), or q max when lower. A balance cap at or above it changes
// nothing.
func (sv *gasSolver) topQ() float64 {
	g := sv.fac
	qOverP0 := func(M float64) float64 {
		tau := 1 / (1 + 0.5*(sv.gamma-1)*M*M)
		return 0.5 * sv.gamma * M * M * sv.pressureRatio(tau)
	}
	q := g.P0Max * qOverP0(min(max(math.Sqrt2, g.MachMin), g.MachMax))
	if sv.qMax > 0 {
		q = math.Min(q, sv.qMax)
	}
	return q
}

// reach: Mach number is never matched in water; below the
// compressibility threshold the tunnel's top speed in the warmest water
// (relaxReach) decides.
func (sv *waterSolver) reach(mf float64) pointReach {
	return pointReach{relax: mf < sv.compMach, full: -1}
}

// relaxReach is the highest Reynolds number of the tunnel, its highest
// usable speed in the warmest water (solveInto's reMax); ok is false
// where that speed is below the lowest it runs.
func (sv *waterSolver) relaxReach() (float64, bool) {
	vcap, _ := sv.speedCap()
	if vcap < sv.lim.SpeedMin {
		return 0, false
	}
	return vcap * sv.L / sv.hot.KinematicViscosity, true
}

// topQ: a water tunnel's reach is one closed-form speed cap, so where
// the balance is checked it is simply recomputed at every scale (no cap
// counts as too high to bind).
func (sv *waterSolver) topQ() float64 { return math.Inf(1) }
