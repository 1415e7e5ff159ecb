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
// taken at the test-section static pressure (IAPWS-IF97 region 1).
type waterSolver struct {
	lim       WaterLimits
	qMax      float64 // Pa (0: none)
	maxRePerM float64 // unit Reynolds cap, 1/m (0: none)
	reTol     float64
	compMach  float64          // flight Mach numbers below it are tried
	L         float64          // model reference length, m
	pStatic   float64          // test-section static pressure, Pa
	hot, cold atmos.WaterState // at the warmest and the coldest water
}

// newWaterSolver checks the water limits of f and prepares its solver.
func newWaterSolver(f *Facility, s Settings) (*waterSolver, error) {
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
		qMax:      f.QMax,
		maxRePerM: f.MaxReynoldsPerM,
		reTol:     s.ReTol,
		compMach:  s.CompressibilityMach,
		pStatic:   w.PMax,
	}
	if !(w.PMax > 0) {
		sv.pStatic = math.Max(w.PMin, atmos.SeaLevelPressure)
	}
	sv.hot, _ = sv.waterAt(w.TMax) // range checked above
	sv.cold, _ = sv.waterAt(w.TMin)
	return sv, nil
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

func (sv *waterSolver) rowSolver(cols int) func(m *Map, i0, i1 int) [NumClasses]int {
	return func(m *Map, i0, i1 int) (n [NumClasses]int) {
		g := m.Grid
		var ps pointSol
		for i := i0; i < i1; i++ {
			base := i * cols
			for j := range cols {
				r := &g.points[base+j]
				if r.excl != InEnvelope {
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
			if sv.qMax > 0 && 0.5*w.Density*V*V > sv.qMax {
				// Colder water is denser: at this speed it would break the
				// dynamic-pressure limit, which the warmest water keeps.
				w, ps.limit = sv.coldestWithinQ(w, V), LimitQMax
			}
		}
	case reMax >= need:
		ps.class, ps.limit, V = MachRelaxed, vl, vcap
	default:
		ps.class, ps.limit, V = NoMatch, vl, vcap
	}
	ps.pLim, ps.tLim = vl, LimitWaterTemp
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
}

// speedCap is the highest usable speed in the warmest water, with the
// limit that sets it: the speed range, the dynamic pressure or the unit
// Reynolds cap.
func (sv *waterSolver) speedCap() (float64, Limit) {
	w := sv.hot
	vcap, vl := sv.lim.SpeedMax, LimitSpeedRange
	if sv.qMax > 0 {
		if vq := math.Sqrt(2 * sv.qMax / w.Density); vq < vcap {
			vcap, vl = vq, LimitQMax
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
		if 0.5*w.Density*V*V > sv.qMax {
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

func (sv *waterSolver) addDetail(d *Detail, ps *pointSol) {
	d.VapourPressure, d.Cavitation = ps.pv, ps.sigma
	if ps.has {
		d.ReSweepMin, d.ReSweepMax = sv.sweep(ps.q)
	}
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
func (sv *waterSolver) minScale(*flightRec, map[float64]float64) (float64, bool) { return 0, false }
