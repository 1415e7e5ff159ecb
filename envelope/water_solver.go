package envelope

import (
	"fmt"
	"math"

	"likewind/atmos"
)

// Bounded search of the water solver (the rest is closed form).
const (
	// waterIter caps the regula-falsi search for the water temperature
	// that brings the Reynolds number down to flight at the minimum speed;
	// it stops earlier once the bracket is narrower than waterTolK
	// (kelvin) or the viscosity is met to 1e-12 relative.
	waterIter = 60
	waterTolK = 1e-6
)

// waterSolver answers the points of a water facility. Mach number is not
// matched in a liquid: only flight Mach numbers below the compressibility
// threshold are tried, and matched with Mach relaxed. Water properties are
// taken at the test-section static pressure (IAPWS-IF97 region 1). Of
// the settings that reach the target the operating rule picks one: the
// warmest water, then the lowest speed (the standard rule), or the speed
// that matches at a fixed water temperature.
type waterSolver struct {
	// lim are the facility's limits (fac) with the rule's fixed water
	// temperature, if any, as both ends of the temperature range.
	lim, fac  WaterLimits
	qLimits           // q max and the balance's q cap
	maxRePerM float64 // unit Reynolds cap, 1/m (0: none)
	rule      OperatingRule
	limT      Limit // what bounds the water temperature (range or rule)
	reTol     float64
	compMach  float64          // flight Mach numbers below it are tried
	L         float64          // model reference length, m
	pStatic   float64          // test-section static pressure, Pa
	hot, cold atmos.WaterState // at the warmest and the coldest water
}

// newWaterSolver checks the water limits of f and prepares its solver
// under operating rule r (checked by the caller).
func newWaterSolver(f *Facility, s Settings, r OperatingRule) (*waterSolver, error) {
	w := f.Water
	if err := checkNonNegative([]namedValue{{"speed min", w.SpeedMin}, {"speed max", w.SpeedMax},
		{"static pressure min", w.PMin}, {"static pressure max", w.PMax},
		{"water temperature min", w.TMin}, {"water temperature max", w.TMax}}); err != nil {
		return nil, err
	}
	switch {
	case w.TMax < w.TMin:
		return nil, fmt.Errorf("water temperature max %g K is below the min %g K", w.TMax, w.TMin)
	case !(w.SpeedMax > 0) || w.SpeedMin > w.SpeedMax:
		return nil, fmt.Errorf("speed range %g–%g m/s: want 0 ≤ min ≤ max, max > 0", w.SpeedMin, w.SpeedMax)
	case w.TMin < atmos.WaterMinTemperature || w.TMax > atmos.WaterMaxTemperature:
		return nil, fmt.Errorf("water temperature range %g–%g K: want within %g–%g K",
			w.TMin, w.TMax, atmos.WaterMinTemperature, atmos.WaterMaxTemperature)
	}
	sv := &waterSolver{
		lim:       w,
		fac:       w,
		qLimits:   qLimits{qMax: f.QMax},
		maxRePerM: f.MaxReynoldsPerM,
		rule:      r,
		limT:      LimitWaterTemp,
		reTol:     s.ReTol,
		compMach:  s.CompressibilityMach,
		pStatic:   w.PMax,
	}
	if !(w.PMax > 0) {
		sv.pStatic = math.Max(w.PMin, atmos.SeaLevelPressure)
	}
	if r.Kind == RuleFixedTemperature {
		sv.lim.TMin, sv.lim.TMax, sv.limT = r.Temperature, r.Temperature, LimitRuleTemperature
	}
	sv.hot, _ = sv.waterAt(sv.lim.TMax) // range checked above and by CheckRule
	sv.cold, _ = sv.waterAt(sv.lim.TMin)
	sv.setLoadCap(0)
	return sv, nil
}

// free is the solver of the same facility and model under the standard
// rule and the facility's own temperature range (see gasSolver.free).
func (sv *waterSolver) free() *waterSolver {
	if sv.rule.Kind == RuleWarmest {
		return sv
	}
	f := *sv
	f.lim, f.rule, f.limT = f.fac, OperatingRule{Kind: RuleWarmest}, LimitWaterTemp
	f.hot, _ = f.waterAt(f.lim.TMax)
	f.cold, _ = f.waterAt(f.lim.TMin)
	return &f
}

// fitMach: a water model is sized at low speed.
func (sv *waterSolver) fitMach(float64) float64 { return 0 }

func (sv *waterSolver) setModelLength(L float64) { sv.L = L }

// waterAt is liquid water at temperature T and the test-section static
// pressure (IAPWS-IF97 region 1 depends on pressure: 2.5 bar makes water
// denser than at 1 atm by about 7e-5), or at the vapour pressure where that
// is higher, so that the state stays liquid.
func (sv *waterSolver) waterAt(T float64) (atmos.WaterState, error) {
	return atmos.WaterAtPressure(T, math.Max(sv.pStatic, atmos.WaterVapourPressure(T)))
}

func (sv *waterSolver) rowSolver(cols int) func(m *Map, b block) [NumClasses]int {
	return func(m *Map, b block) (n [NumClasses]int) {
		g := m.Grid
		var ps pointSol
		for i := b.i0; i < b.i1; i++ {
			base := i * cols
			for j := b.j0; j < b.j1; j++ {
				r := &g.points[base+j]
				if r.excl != InEnvelope {
					if m.reused {
						m.Results[base+j] = Result{} // Outside
					}
					continue
				}
				if !(r.mach < sv.compMach) {
					// What solveInto gives, without filling a pointSol.
					m.Results[base+j] = Result{Class: NoMatch, Limit: LimitIncompressible, Flags: m.sizeFlag(0)}
					n[NoMatch]++
					continue
				}
				ps = pointSol{reFlight: r.re}
				sv.solveInto(&ps, r.mach)
				ps.finish(sv.reTol, false)
				m.Results[base+j] = ps.result()
				m.Results[base+j].Flags |= m.sizeFlag(0) // judged at low speed
				n[ps.class]++
			}
		}
		return n
	}
}

func (sv *waterSolver) solve(mf, reF, _ float64, detail bool) pointSol {
	ps := pointSol{reFlight: reF}
	sv.solveInto(&ps, mf)
	ps.finish(sv.reTol, detail)
	return ps
}

// solveInto answers flight Mach number mf into ps (whose reFlight is set,
// the rest zero), before finish. The warmest water gives
// the lowest viscosity and the highest Reynolds number per speed; the
// lowest speed that reaches flight is taken, and if even the minimum speed
// overshoots, the water is cooled to bring the Reynolds number down.
func (sv *waterSolver) solveInto(ps *pointSol, mf float64) {
	if !(mf < sv.compMach) {
		ps.class, ps.limit = NoMatch, LimitIncompressible
		return
	}
	lim := &sv.lim
	target := ps.reFlight
	need := (1 - sv.reTol) * target
	w := sv.hot
	vcap, vl := sv.speedCap()
	if vcap < lim.SpeedMin {
		ps.class, ps.limit = NoMatch, vl
		return
	}
	reMax := vcap * sv.L / w.KinematicViscosity
	ps.reMax = reMax
	var V float64
	switch {
	case reMax >= target:
		ps.class = MachRelaxed
		V = target * w.KinematicViscosity / sv.L
		if V < lim.SpeedMin {
			V = lim.SpeedMin
			var over bool
			if w, over = sv.coolFor(V, target); over {
				ps.limit = LimitSpeedRange
			}
			if sv.qCap > 0 && 0.5*w.Density*V*V > sv.qCap {
				// Colder water is denser: at this speed it would break the
				// dynamic-pressure limit, which the warmest water keeps.
				w, ps.limit = sv.coldestWithinQ(w, V), sv.qCapLim
			}
		}
	case reMax >= need:
		ps.class, ps.limit, V = MachRelaxed, vl, vcap
	default:
		ps.class, ps.limit, V = NoMatch, vl, vcap
	}
	ps.pLim, ps.tLim = vl, sv.limT
	ps.has = true
	ps.t0, ps.t = w.Temperature, w.Temperature
	ps.p0, ps.p = sv.pStatic, sv.pStatic
	ps.v = V
	ps.rho, ps.mu = w.Density, w.Viscosity
	ps.q = 0.5 * w.Density * V * V
	ps.re = V * sv.L / w.KinematicViscosity
	ps.pv = w.VapourPressure
	ps.sigma = (sv.pStatic - w.VapourPressure) / ps.q
	if ps.sigma < LowCavitationNumber {
		ps.flags |= FlagLowCavitation
	}
	if sv.qMax > 0 && ps.q >= NearLimitFraction*sv.qMax {
		ps.flags |= FlagQNearLimit
	}
	if sv.qLoad > 0 && ps.q >= NearLimitFraction*sv.qLoad {
		ps.flags |= FlagLoadNearLimit
	}
}

// speedCap is the highest usable speed in the warmest water, with the
// limit that sets it: the speed range, the dynamic pressure (q max or the
// balance load) or the unit Reynolds cap.
func (sv *waterSolver) speedCap() (float64, Limit) {
	w := sv.hot
	vcap, vl := sv.lim.SpeedMax, LimitSpeedRange
	if sv.qCap > 0 {
		if vq := math.Sqrt(2 * sv.qCap / w.Density); vq < vcap {
			vcap, vl = vq, sv.qCapLim
		}
	}
	if sv.maxRePerM > 0 {
		if vr := sv.maxRePerM * w.KinematicViscosity; vr < vcap {
			vcap, vl = vr, LimitRePerM
		}
	}
	return vcap, vl
}

// coldestWithinQ is the coldest water, between cold (which breaks the
// dynamic-pressure limit at speed V) and the facility's warmest (which
// keeps it), that keeps it: bisection on the temperature, at most waterIter
// steps, to waterTolK.
func (sv *waterSolver) coldestWithinQ(cold atmos.WaterState, V float64) atmos.WaterState {
	keep := sv.hot
	lo, hi := cold.Temperature, sv.hot.Temperature
	for it := 0; it < waterIter && hi-lo > waterTolK; it++ {
		w, err := sv.waterAt(0.5 * (lo + hi))
		if err != nil {
			break
		}
		if 0.5*w.Density*V*V > sv.qCap {
			lo = w.Temperature
		} else {
			hi, keep = w.Temperature, w
		}
	}
	return keep
}

// coolFor finds the water temperature at which speed V gives exactly the
// target Reynolds number (kinematic viscosity V·L/target) within the
// facility range; viscosity falls as the water warms. It runs regula falsi
// with the Illinois modification on ln ν(T), which is nearly straight over a
// facility's range, so it ends in a few steps: at most waterIter, stopping
// when the bracket is narrower than waterTolK or ν is met to 1e-12. over
// reports that even the coldest water overshoots.
func (sv *waterSolver) coolFor(V, target float64) (atmos.WaterState, bool) {
	want := math.Log(V * sv.L / target)
	if sv.cold.KinematicViscosity <= V*sv.L/target {
		return sv.cold, true
	}
	lo, hi := sv.lim.TMin, sv.lim.TMax
	flo := math.Log(sv.cold.KinematicViscosity) - want // > 0
	fhi := math.Log(sv.hot.KinematicViscosity) - want  // <= 0
	best := sv.hot
	side := 0
	for it := 0; it < waterIter && hi-lo > waterTolK; it++ {
		T := hi - fhi*(hi-lo)/(fhi-flo)
		if !(T > lo && T < hi) {
			T = 0.5 * (lo + hi)
		}
		w, err := sv.waterAt(T)
		if err != nil {
			break
		}
		fm := math.Log(w.KinematicViscosity) - want
		if math.Abs(fm) <= 1e-12 {
			return w, false
		}
		if fm > 0 {
			lo, flo = T, fm
			if side == -1 {
				fhi /= 2
			}
			side = -1
		} else {
			hi, fhi, best = T, fm, w
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
	}
	return best, false
}

func (sv *waterSolver) addDetail(d *Detail, ps pointSol) {
	d.VapourPressure, d.Cavitation = ps.pv, ps.sigma
	if ps.has {
		fs := sv.free()
		d.ReSweepMin, d.ReSweepMax = fs.sweep(ps.q)
		d.Set = fs.matchingSet(ps.reFlight)
	}
}

// matchingSet is the matching set for flight Reynolds number target (see
// MatchingSet), on the limits of sv (the free solver). Along the line
// V(T) = target·ν(T)/L the speed falls as the water warms, and with it
// q = ½ρV² (μ²/ρ falls), so the warm end is bounded by the warmest water
// or the lowest speed, the cold end by the coldest water, the highest
// speed or the dynamic-pressure cap (q max, balance load). The unit
// Reynolds number V/ν is the same all along: the cap admits the whole line
// or none of it, and then holds the set on its own line.
func (sv *waterSolver) matchingSet(target float64) MatchingSet {
	vcap, vl := sv.speedCap()
	if vcap < sv.lim.SpeedMin || !(sv.L > 0) {
		return MatchingSet{}
	}
	ms := MatchingSet{OK: true, Re: target}
	re := target
	if sv.maxRePerM > 0 && re > sv.maxRePerM*sv.L {
		re, ms.ReLimit = sv.maxRePerM*sv.L, LimitRePerM
	}
	if vw := re * sv.hot.KinematicViscosity / sv.L; vw > vcap*(1+solveSlack) {
		// Short of flight: the one best setting, top speed in the warmest
		// water.
		ms.Re, ms.ReLimit = vcap*sv.L/sv.hot.KinematicViscosity, vl
		ms.Cold = sv.setEnd(sv.hot, vcap, sv.limT)
		ms.Warm = sv.setEnd(sv.hot, vcap, vl)
		return ms
	}
	// The warm end: the warmest water, or where the speed falls to the
	// lowest the tunnel runs.
	warm, wl := sv.hot, sv.limT
	if re*sv.hot.KinematicViscosity/sv.L < sv.lim.SpeedMin {
		var over bool
		warm, over = sv.coolFor(sv.lim.SpeedMin, re)
		wl = LimitSpeedRange
		if over {
			// Even the coldest water at the lowest speed overshoots: the
			// one setting that comes nearest (warmer where the coldest
			// breaks the dynamic-pressure cap, as solveInto takes it).
			if v := sv.lim.SpeedMin; sv.qCap > 0 && 0.5*warm.Density*v*v > sv.qCap {
				warm = sv.coldestWithinQ(warm, v)
			}
			ms.Re, ms.ReLimit = sv.lim.SpeedMin*sv.L/warm.KinematicViscosity, LimitSpeedRange
			ms.Cold = sv.setEnd(warm, sv.lim.SpeedMin, sv.limT)
			ms.Warm = sv.setEnd(warm, sv.lim.SpeedMin, LimitSpeedRange)
			return ms
		}
	}
	if vw := re * warm.KinematicViscosity / sv.L; sv.qCap > 0 && 0.5*warm.Density*vw*vw > sv.qCap {
		// The cooled water at the lowest speed breaks the dynamic-pressure
		// cap, and every colder setting of the line more so: the one
		// setting is the one solveInto takes, warmer water that keeps
		// the cap and overshoots flight.
		w := sv.coldestWithinQ(warm, sv.lim.SpeedMin)
		ms.Re, ms.ReLimit = sv.lim.SpeedMin*sv.L/w.KinematicViscosity, sv.qCapLim
		ms.Cold = sv.setEnd(w, sv.lim.SpeedMin, sv.qCapLim)
		ms.Warm = sv.setEnd(w, sv.lim.SpeedMin, LimitSpeedRange)
		return ms
	}
	ms.Warm = sv.setEnd(warm, re*warm.KinematicViscosity/sv.L, wl)
	// The cold end: the coldest water, unless its speed breaks the speed
	// range or the dynamic-pressure cap first.
	cold, cl := sv.cold, sv.limT
	if v := re * cold.KinematicViscosity / sv.L; v > sv.lim.SpeedMax {
		cold, _ = sv.coolFor(sv.lim.SpeedMax, re)
		cl = LimitSpeedRange
	}
	if v := re * cold.KinematicViscosity / sv.L; sv.qCap > 0 && 0.5*cold.Density*v*v > sv.qCap {
		cold, cl = sv.coldestLineWithinQ(cold, re), sv.qCapLim
	}
	if cold.Temperature > warm.Temperature {
		cold = warm // only by rounding
	}
	ms.Cold = sv.setEnd(cold, re*cold.KinematicViscosity/sv.L, cl)
	return ms
}

// coldestLineWithinQ is the coldest water, between cold (whose speed on
// the line of target breaks the dynamic-pressure cap) and the warmest
// (which keeps it), whose speed on that line keeps it: bisection on the
// temperature, at most waterIter steps, to waterTolK.
func (sv *waterSolver) coldestLineWithinQ(cold atmos.WaterState, target float64) atmos.WaterState {
	keep := sv.hot
	lo, hi := cold.Temperature, sv.hot.Temperature
	for it := 0; it < waterIter && hi-lo > waterTolK; it++ {
		w, err := sv.waterAt(0.5 * (lo + hi))
		if err != nil {
			break
		}
		v := target * w.KinematicViscosity / sv.L
		if 0.5*w.Density*v*v > sv.qCap {
			lo = w.Temperature
		} else {
			hi, keep = w.Temperature, w
		}
	}
	return keep
}

// setEnd is the end of a matching set in water w at speed V.
func (sv *waterSolver) setEnd(w atmos.WaterState, V float64, lim Limit) SetEnd {
	return SetEnd{P0: sv.pStatic, T0: w.Temperature, V: V, Q: 0.5 * w.Density * V * V, Limit: lim}
}

// sweep is the Reynolds range at dynamic pressure q as the water
// temperature runs over the facility range (speed from q, within the
// speed range and the unit Reynolds cap).
func (sv *waterSolver) sweep(q float64) (lo, hi float64) {
	re := func(T float64) float64 {
		w, err := sv.waterAt(T)
		if err != nil {
			return 0
		}
		v := math.Min(math.Sqrt(2*q/w.Density), sv.lim.SpeedMax)
		r := v * sv.L / w.KinematicViscosity
		if sv.maxRePerM > 0 {
			r = math.Min(r, sv.maxRePerM*sv.L)
		}
		return r
	}
	a, b := re(sv.lim.TMin), re(sv.lim.TMax)
	return math.Min(a, b), math.Max(a, b)
}

// reynoldsRange: a water facility has no test Mach number.
func (sv *waterSolver) reynoldsRange(float64) (lo, hi float64, ok bool) { return 0, 0, false }

// reachableRe is the band a water tunnel spans, from the minimum speed in
// the coldest water to the highest usable speed in the warmest, drawn at
// flight Mach 0 and at the compressibility threshold: it matches with Mach
// relaxed below it.
func (sv *waterSolver) reachableRe(int) []ReRange {
	vcap, _ := sv.speedCap()
	if vcap < sv.lim.SpeedMin {
		return nil
	}
	lo := sv.lim.SpeedMin * sv.L / sv.cold.KinematicViscosity
	hi := vcap * sv.L / sv.hot.KinematicViscosity
	return []ReRange{{Mach: 0, Lo: lo, Hi: hi}, {Mach: sv.compMach, Lo: lo, Hi: hi}}
}

// minScale: no scale makes a water point a full match (Mach number is not
// matched in a liquid).
func (sv *waterSolver) minScale(*flightRec, map[float64]scaleOne) minScaleSol { return minScaleSol{} }

// matchQ: the warmest water at the lowest speed that reaches target
// (cooled where even the lowest speed overshoots), which has the lowest
// q of the line (see matchingSet), under the facility's own limits (the
// balance cap aside).
func (sv *waterSolver) matchQ(mf, target float64) (float64, bool) {
	fs := sv.free()
	if fs.qLoad > 0 {
		c := *fs
		c.setLoadCap(0)
		fs = &c
	}
	if !(mf < fs.compMach) || !(fs.L > 0) {
		return 0, false
	}
	vcap, _ := fs.speedCap()
	re := target
	if fs.maxRePerM > 0 && re > fs.maxRePerM*fs.L*(1+solveSlack) {
		return 0, false
	}
	w := fs.hot
	V := re * w.KinematicViscosity / fs.L
	if V > vcap*(1+solveSlack) {
		return 0, false
	}
	if V < fs.lim.SpeedMin {
		V = fs.lim.SpeedMin
		w, _ = fs.coolFor(V, re)
		if fs.qCap > 0 && 0.5*w.Density*V*V > fs.qCap {
			w = fs.coldestWithinQ(w, V) // as solveInto does
		}
	}
	return 0.5 * w.Density * V * V, true
}
