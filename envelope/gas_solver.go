package envelope

import (
	"fmt"
	"math"

	"likewind/atmos"
)

// solveSlack is the relative rounding allowance with which a setting that
// hits its target counts as reaching it.
const solveSlack = 1e-9

// gasSolver answers the points of a gas facility. At the target Mach
// number the test-section static state follows from the isentropic
// relations and the Reynolds number from Sutherland's law, so for each Mach
// number the limits (p0 and T0 ranges, dynamic pressure, static
// temperature, saturation line, unit Reynolds number) are solved jointly in
// (p0, T0) in closed form. Of the settings that reach the flight Reynolds
// number the operating rule picks one (rule.go): by default the warmest
// T0, then the lowest p0. The searches over Mach number are in
// gas_search.go.
type gasSolver struct {
	// lim are the facility's limits (fac) with the rule's fixed T0, if
	// any, as both ends of the T0 range.
	lim, fac  GasLimits
	qLimits           // q max and the balance's q cap
	maxRePerM float64 // unit Reynolds cap, 1/m (0: none)
	reg       atmos.Regimes

	rule OperatingRule // in force, never RuleDefault
	// leastLoad: the rule takes the coldest end of the matching line;
	// fixedQ (Pa, 0: none): the rule holds q, and so p0 at each Mach number.
	leastLoad bool
	fixedQ    float64
	// limT0Lo, limT0Hi and limP0Lo name what bounds T0 from below and
	// above and p0 from below: the facility's limits, or the rule's fixed
	// value.
	limT0Lo, limT0Hi, limP0Lo Limit

	mTol, reTol float64
	compMach    float64 // below it Mach number may be relaxed
	L           float64 // model reference length, m

	gas         atmos.Gas
	gamma, rgas float64
	beta, suth  float64 // Sutherland constants (suth: S, K)
	// reCoef gives the model Reynolds number from the static state:
	// Re = M·reCoef·p·(T+S)/T², reCoef = L·√(γ/R)/β.
	reCoef float64
	// condFlag: the facility checks the saturation line at every Mach
	// number; drySupersonic: the gas is kept dry from Mach 1 up anyway.
	condFlag, drySupersonic bool
	tcrit                   float64 // top of the saturation line, K
	peakM                   float64 // PeakLocalMach and its isentropic ratios
	peakTau, peakPi         float64
}

// newGasSolver checks the gas limits of f and prepares its solver for gas
// under operating rule r (checked by the caller).
func newGasSolver(f *Facility, gas atmos.Gas, s Settings, reg atmos.Regimes, r OperatingRule) (*gasSolver, error) {
	g := f.Gas
	if err := checkNonNegative([]namedValue{{"Mach min", g.MachMin}, {"Mach max", g.MachMax},
		{"p0 min", g.P0Min}, {"p0 max", g.P0Max}, {"T0 min", g.T0Min}, {"T0 max", g.T0Max},
		{"minimum static temperature", g.MinStaticT}, {"peak local Mach", g.PeakLocalMach}}); err != nil {
		return nil, err
	}
	switch {
	case g.T0Max < g.T0Min:
		return nil, fmt.Errorf("T0 max %g K is below T0 min %g K", g.T0Max, g.T0Min)
	case !(g.MachMax > 0) || g.MachMin > g.MachMax:
		return nil, fmt.Errorf("Mach range %g–%g: want 0 ≤ min ≤ max, max > 0", g.MachMin, g.MachMax)
	case !(g.P0Max > 0) || g.P0Min > g.P0Max:
		return nil, fmt.Errorf("p0 range %g–%g Pa: want 0 ≤ min ≤ max, max > 0", g.P0Min, g.P0Max)
	case !(g.T0Min > 0):
		return nil, fmt.Errorf("T0 min %g: want a positive temperature in K", g.T0Min)
	}
	sv := &gasSolver{
		lim:       g,
		fac:       g,
		qLimits:   qLimits{qMax: f.QMax},
		maxRePerM: f.MaxReynoldsPerM,
		reg:       reg,
		rule:      r,
		limT0Lo:   LimitT0Min,
		limT0Hi:   LimitT0Max,
		limP0Lo:   LimitP0Min,
		mTol:      s.MachTol,
		reTol:     s.ReTol,
		compMach:  s.CompressibilityMach,

		gas:           gas,
		gamma:         gas.Gamma(),
		rgas:          gas.R(),
		condFlag:      g.Condensation,
		drySupersonic: gas.DrySupersonic(),
		tcrit:         gas.CriticalTemperature(),
		peakM:         peakMach(f),
	}
	sv.beta, sv.suth = gas.Sutherland()
	sv.peakTau = 1 / (1 + 0.5*(sv.gamma-1)*sv.peakM*sv.peakM)
	sv.peakPi = sv.pressureRatio(sv.peakTau)
	switch r.Kind {
	case RuleLeastLoad:
		sv.leastLoad = true
	case RuleFixedTemperature:
		sv.lim.T0Min, sv.lim.T0Max = r.Temperature, r.Temperature
		sv.limT0Lo, sv.limT0Hi = LimitRuleTemperature, LimitRuleTemperature
	case RuleFixedQ:
		sv.fixedQ = r.Q
		sv.limP0Lo = LimitRuleQ
	}
	sv.setLoadCap(0)
	return sv, nil
}

// free is the solver of the same facility and model under the standard
// rule and the facility's own limits: the matching set, the Reynolds
// sweep and the balance scale ask what the facility can do, whatever the
// rule picks.
func (sv *gasSolver) free() *gasSolver {
	if sv.rule.Kind == RuleWarmest {
		return sv
	}
	f := *sv
	f.lim, f.rule, f.leastLoad, f.fixedQ = f.fac, OperatingRule{Kind: RuleWarmest}, false, 0
	f.limT0Lo, f.limT0Hi, f.limP0Lo = LimitT0Min, LimitT0Max, LimitP0Min
	return &f
}

// fitMach: the model is sized for the highest inside flight Mach number,
// held within the facility's Mach range.
func (sv *gasSolver) fitMach(flightMax float64) float64 {
	return max(min(flightMax, sv.lim.MachMax), sv.lim.MachMin)
}

func (sv *gasSolver) setModelLength(L float64) {
	sv.L = L
	sv.reCoef = L * math.Sqrt(sv.gamma/sv.rgas) / sv.beta
}

// gasWorker is what one Solve worker reuses between points: a memo per
// grid column, and the relaxed range's highest setting.
type gasWorker struct {
	cols []colMemo
	aux  pointAux
}

// pointAux is what solveGas may reuse at one point: the memo of the
// point's grid column and the relaxed range's highest setting.
type pointAux struct {
	col *colMemo
	// relaxTop is maxOver of the relaxed range (relaxOK: it exists),
	// computed once per worker (relaxDone).
	relaxTop           gasPick
	relaxOK, relaxDone bool
	relaxSamples       sampledRange // the relaxed range's samples with their bounds
}

// colMemo holds values a Solve worker computed for one grid column, each
// with the exact inputs it was computed from, so that a later point reuses
// it only when it would compute the same thing: whether the flight Mach
// number is out of the facility's reach, the gas bounds at facility Mach
// number b.M, the best setting on them, the test-section state and setting
// cautions of the last setting filled in, and the Reynolds number of the
// Mach tolerance band. Reynolds-short points down a column all share one
// best setting, so they cost little after the first.
type colMemo struct {
	b      gasBounds // bounds at b.M (NaN: none yet)
	bestM  float64   // Mach number best was found at (NaN: none yet)
	best   gasPick
	bestOK bool
	fill   fillMemo
	// outM is the flight Mach number whose outOfRange answer is outLim,
	// out (NaN: none yet).
	outM   float64
	outLim Limit
	out    bool
	outRes Result // what such a point gets (when out)
	// bandRe is bandTopRe of flight Mach number bandM (NaN: none yet).
	bandM, bandRe float64
}

func (c *colMemo) reset() {
	nan := math.NaN()
	c.b.M, c.bestM, c.fill.M, c.outM, c.bandM = nan, nan, nan, nan, nan
}

// fillMemo is the part of fillGas that depends on the setting alone, for
// the setting (M, p0, t0, re).
type fillMemo struct {
	M, p0, t0, re       float64 // the setting (M NaN: none yet)
	t, p, v, rho, mu, q float64
	flags               Flags
}

func (sv *gasSolver) rowSolver(cols int) func(m *Map, b block) [NumClasses]int {
	// What depends only on the facility Mach number is reused down a
	// column (on a Mach grid every row shares it).
	w := &gasWorker{cols: make([]colMemo, cols)}
	for j := range w.cols {
		w.cols[j].reset()
	}
	return func(m *Map, b block) [NumClasses]int { return sv.solveRows(m, b, w) }
}

// solveRows solves the inside points of block b into m.Results with the
// caches of worker w, and returns how many of them fell in each class.
func (sv *gasSolver) solveRows(m *Map, b block, w *gasWorker) (n [NumClasses]int) {
	g := m.Grid
	cols := len(g.Speeds)
	var ps pointSol
	for i := b.i0; i < b.i1; i++ {
		tFlight := g.rows[i].Temperature
		base := i * cols
		for j := b.j0; j < b.j1; j++ {
			r := &g.points[base+j]
			if r.excl != InEnvelope {
				if m.reused {
					m.Results[base+j] = Result{} // Outside
				}
				continue
			}
			c := &w.cols[j]
			if c.outM != r.mach {
				c.outM = r.mach
				c.outLim, c.out = sv.outOfRange(r.mach)
				if c.out {
					c.outRes = Result{Class: NoMatch, Limit: c.outLim, Flags: m.sizeFlag(m.sizeMach(r.mach, false, 0))}
				}
			}
			if c.out {
				m.Results[base+j] = c.outRes
				n[NoMatch]++
				continue
			}
			w.aux.col = c
			ps = pointSol{reFlight: r.re}
			sv.solveGas(&ps, r.mach, tFlight, false, &w.aux)
			ps.finish(sv.reTol, false)
			m.Results[base+j] = ps.result()
			m.Results[base+j].Flags |= m.sizeFlag(m.sizeMach(r.mach, ps.has, ps.mach))
			n[ps.class]++
		}
	}
	return n
}

func (sv *gasSolver) solve(mf, reF, tFlight float64, detail bool) pointSol {
	ps := pointSol{reFlight: reF}
	sv.solveGas(&ps, mf, tFlight, detail, nil)
	ps.finish(sv.reTol, detail)
	return ps
}

// outOfRange reports flight Mach numbers that the facility can neither
// match nor relax, with the limit: what solve gives them without a search
// (class NoMatch, no settings, no flags).
func (sv *gasSolver) outOfRange(mf float64) (Limit, bool) {
	if mf < sv.compMach {
		return LimitNone, false
	}
	if withinTol(sv.matchMach(mf), mf, sv.mTol) {
		return LimitNone, false
	}
	return LimitMachRange, true
}

// matchMach is flight Mach number mf held within the facility range: the
// Mach number a match is tried at.
func (sv *gasSolver) matchMach(mf float64) float64 {
	return atMost(atLeast(mf, sv.lim.MachMin), sv.lim.MachMax)
}

// gasBounds is the feasible (p0, T0) region of a gas facility at one Mach
// number, before the saturation floor on T0 is resolved.
type gasBounds struct {
	M, tau, pi float64
	k          float64 // Re = k·p·(T+S)/T², p static, T static
	ok         bool
	why        Limit // when !ok
	condOn     bool
	p0hi       float64 // highest usable p0
	pLim       Limit   // what sets p0hi
	p0lo       float64 // lowest usable p0: P0Min, or a fixed-q rule's p0
	t0lo       float64 // lowest T0 from T0Min and the static-T floor
	tLim       Limit   // what sets t0lo
}

// bounds evaluates the limits at Mach number M jointly, in closed form:
//
//	p0 ≤ P0Max, p0 ≤ 2·qCap/(γM²π(M))      (dynamic pressure, balance load)
//	T0 ≥ T0Min, T0 ≥ MinStaticT/τ(M)                     (static temperature)
//	T0·τ(M) ≥ Tsat(p0·π(M))  ⇔  p0 ≤ psat(T0·τ)/π(M)     (saturation line)
//	T0 ≤ T0Max, p0 ≥ P0Min.
//
// The saturation constraint couples p0 and T0: at T0Max it caps p0, and
// at p0hi it sets a floor on T0 (resolved in best, only when needed). A
// fixed-q rule holds p0 at 2·q/(γM²π(M)): both ends of the p0 range, when
// that lies within them.
func (sv *gasSolver) bounds(M float64) gasBounds {
	g, lim := sv.gamma, &sv.lim
	c := gasBounds{M: M}
	c.tau = 1 / (1 + 0.5*(g-1)*M*M)
	c.pi = sv.pressureRatio(c.tau)
	c.k = M * sv.reCoef
	c.condOn = sv.condFlag || (sv.drySupersonic && M >= 1)
	c.p0hi, c.pLim = lim.P0Max, LimitP0Max
	if sv.qCap > 0 && M > 0 {
		if pq := 2 * sv.qCap / (g * M * M * c.pi); pq < c.p0hi {
			c.p0hi, c.pLim = pq, sv.qCapLim
		}
	}
	c.t0lo, c.tLim = lim.T0Min, sv.limT0Lo
	if lim.MinStaticT > 0 {
		if t := lim.MinStaticT / c.tau; t > c.t0lo {
			c.t0lo, c.tLim = t, LimitStaticT
		}
	}
	if c.t0lo > lim.T0Max*(1+1e-12) {
		c.why = c.tLim
		return c
	}
	if c.condOn {
		if pc := sv.gas.SaturationPressure(lim.T0Max*c.tau) / c.pi; pc < c.p0hi {
			c.p0hi, c.pLim = pc, LimitCondensation
		}
	}
	c.p0lo = lim.P0Min
	if sv.fixedQ > 0 {
		pq := 2 * sv.fixedQ / (g * M * M * c.pi)
		switch {
		case !(pq <= c.p0hi*(1+solveSlack)):
			c.why = c.pLim
			return c
		case pq < lim.P0Min*(1-solveSlack):
			c.why = LimitP0Min
			return c
		}
		pq = min(max(pq, lim.P0Min), c.p0hi)
		c.p0lo, c.p0hi, c.pLim = pq, pq, LimitRuleQ
	}
	if c.p0hi < c.p0lo {
		c.why = c.pLim
		return c
	}
	c.ok = true
	return c
}

// pressureRatio is p/p0 = τ^(γ/(γ−1)) for temperature ratio τ = T/T0.
// For γ = 1.4 (air and nitrogen) it is τ³·√τ: the searches over Mach
// number evaluate bounds at hundreds of Mach numbers, and math.Pow there
// costs about a tenth of BenchmarkDemoSolve400/Kellen.
func (sv *gasSolver) pressureRatio(tau float64) float64 {
	if sv.gamma == 1.4 {
		return tau * tau * tau * math.Sqrt(tau)
	}
	return math.Pow(tau, sv.gamma/(sv.gamma-1))
}

// reAt is the model Reynolds number at (p0, T0) on bounds c.
func (sv *gasSolver) reAt(c *gasBounds, p0, t0 float64) float64 {
	T := t0 * c.tau
	return c.k * p0 * c.pi * (T + sv.suth) / (T * T)
}

// floorT0 is the lowest T0 allowed at stagnation pressure p0 (the larger
// of t0lo and the saturation floor), never above T0Max. The saturation
// floor needs the inverse vapour-pressure line, which atmos iterates
// (Newton in a bracket to 1e-12 relative, at most 100 steps); it is only
// evaluated when the floor binds, i.e. when the static state at t0lo would
// be on the liquid side. Every other step of the gas solve is closed form.
func (sv *gasSolver) floorT0(c *gasBounds, p0 float64) (float64, Limit) {
	t0, lim := c.t0lo, c.tLim
	if c.condOn {
		p := p0 * c.pi
		if sv.gas.ExceedsVapourPressure(p, t0*c.tau) {
			t0, lim = sv.gas.SaturationTemperature(p)/c.tau, LimitCondensation
		}
	}
	return atMost(t0, sv.lim.T0Max), lim
}

// gasSetting is one setting of a gas facility: stagnation pressure and
// temperature, the model Reynolds number they give, and the limits that
// bound p0 and T0 there. (It and gasHit have at most four fields, so the
// compiler keeps them in registers: a wider struct returned from best or
// hit made the grid solve half as slow again, BenchmarkResolve400.)
type gasSetting struct {
	p0, t0, re float64
	lim        sideLimits
}

// sideLimits are the limits that bound a setting's p0 (p) and T0 (t).
type sideLimits struct{ p, t Limit }

// gasHit is the setting that reaches a target Reynolds number (hit), with
// over set when even P0Min at its T0 exceeds the target.
type gasHit struct {
	p0, t0, re float64
	over       bool
}

// best is the highest-Reynolds setting on bounds c: p0 at p0hi, T0 at its
// floor there (Re rises with p0 and falls with T0, and along the
// saturation line Re still rises with p0, so this corner is the maximum),
// then cut back to the unit-Reynolds cap if that binds, with the binding
// limit of each side. The cap is met as hit meets any target: T0 is raised
// at p0hi, so p0 stays bounded by what bounds p0hi (q max, say) and the cap
// bounds T0 from below; only where T0 reaches T0Max does p0 come down, and
// then the cap bounds p0 and T0Max the temperature.
//
// Under the least-load rule the cap is met at the coldest end of the line
// of settings that give it (coldest): the cap bounds p0 there, and what
// bounds the cold end bounds T0 (or, where that is the lowest p0, the
// other way round).
func (sv *gasSolver) best(c *gasBounds) (gasSetting, bool) {
	s := gasSetting{p0: c.p0hi, lim: sideLimits{p: c.pLim}}
	s.t0, s.lim.t = sv.floorT0(c, s.p0)
	s.re = sv.reAt(c, s.p0, s.t0)
	if sv.maxRePerM > 0 {
		if reCap := sv.maxRePerM * sv.L; s.re > reCap {
			h := sv.hit(c, reCap, s.t0)
			if h.over {
				return gasSetting{lim: sideLimits{LimitRePerM, s.lim.t}}, false
			}
			if sv.leastLoad {
				cold, lim := sv.coldest(c, reCap)
				s.p0, s.t0, s.re = cold.p0, cold.t0, cold.re
				s.lim = sideLimits{LimitRePerM, lim}
				if lim == sv.limP0Lo {
					s.lim = sideLimits{lim, LimitRePerM}
				}
				return s, true
			}
			s.p0, s.t0, s.re = h.p0, h.t0, h.re
			if s.p0 < c.p0hi*(1-solveSlack) {
				s.lim = sideLimits{LimitRePerM, sv.limT0Hi}
			} else {
				s.lim.t = LimitRePerM
			}
		}
	}
	return s, true
}

// hit is the operator's setting for target Reynolds number target on
// bounds c, known to be reachable with the floor tFloor at p0hi: the
// warmest T0 that still reaches it (at p0hi, solving the quadratic below),
// then the lowest p0 at that T0. With p static and T static,
//
//	Re = k·p·(T+S)/T²  ⇒  Re·T² − k·p·T − k·p·S = 0
//	⇒  T = (a + √(a² + 4aS))/2,  a = k·p/Re.
//
// over is set when even P0Min at that T0 exceeds the target.
func (sv *gasSolver) hit(c *gasBounds, target, tFloor float64) gasHit {
	var s gasHit
	T := sv.warmestStatic(c, target)
	s.t0 = atLeast(atMost(T/c.tau, sv.lim.T0Max), tFloor)
	T = s.t0 * c.tau
	s.p0 = atMost(target*T*T/(c.k*c.pi*(T+sv.suth)), c.p0hi)
	if s.p0 < c.p0lo {
		// Under a fixed-q rule p0lo is p0hi, and the p0 that meets the
		// target there may come out a rounding below it.
		s.over = sv.fixedQ == 0 || s.p0 < c.p0lo*(1-solveSlack)
		s.p0 = c.p0lo
	}
	s.re = sv.reAt(c, s.p0, s.t0)
	return s
}

// warmestStatic is the static temperature at which p0hi on bounds c gives
// Reynolds number target (the quadratic of hit).
func (sv *gasSolver) warmestStatic(c *gasBounds, target float64) float64 {
	return sv.staticFor(c, c.p0hi, target)
}

// staticFor is the static temperature at which stagnation pressure p0 on
// bounds c gives Reynolds number target (the quadratic of hit).
func (sv *gasSolver) staticFor(c *gasBounds, p0, target float64) float64 {
	a := c.k * p0 * c.pi / target
	return 0.5 * (a + math.Sqrt(a*a+4*a*sv.suth))
}

// linePressure is the static pressure at which static temperature T on
// bounds c gives Reynolds number target: the matching line,
// p = target·T²/(k·(T+S)), which rises with T.
func (sv *gasSolver) linePressure(c *gasBounds, target, T float64) float64 {
	return target * T * T / (c.k * (T + sv.suth))
}

// coldest is the least-load setting for target on bounds c, where tryHit
// has found target reachable: the coldest T0 on the matching line, where
// p0, and with it q = ½γM²·π·p0, is lowest (p0 rises with T0 along the
// line), with the limit that bounds it there:
//
//	T0 ≥ t0lo (T0Min, or the static-temperature floor),
//	p0 ≥ p0lo, i.e. T ≥ the static temperature at which p0lo gives target,
//	p ≤ psat(T) (saturation line: p rises with T along the line far more
//	    slowly than psat, so the line crosses it once; see saturationCrossing).
//
// Where even p0lo at T0Max overshoots it is that corner, with over set.
func (sv *gasSolver) coldest(c *gasBounds, target float64) (gasHit, Limit) {
	tHi := sv.lim.T0Max * c.tau
	T, lim := c.t0lo*c.tau, c.tLim
	if tp := sv.staticFor(c, c.p0lo, target); tp > T {
		T, lim = tp, sv.limP0Lo
	}
	if T > tHi {
		h := gasHit{p0: c.p0lo, t0: sv.lim.T0Max, over: true}
		h.re = sv.reAt(c, h.p0, h.t0)
		return h, sv.limP0Lo
	}
	tw := atMost(sv.warmestStatic(c, target), tHi)
	if T > tw {
		// Only by rounding: the line is empty. The warm end stands in.
		return sv.hit(c, target, c.t0lo), lim
	}
	if c.condOn && sv.gas.ExceedsVapourPressure(sv.linePressure(c, target, T), T) {
		T, lim = sv.saturationCrossing(c, target, T, tw), LimitCondensation
	}
	h := gasHit{t0: atLeast(atMost(T/c.tau, sv.lim.T0Max), c.t0lo)}
	h.p0 = atLeast(atMost(sv.linePressure(c, target, T)/c.pi, c.p0hi), c.p0lo)
	switch lim {
	case c.tLim:
		h.t0 = c.t0lo // exactly T0 min (or the static floor), not T0·τ/τ
	case sv.limP0Lo:
		h.p0 = c.p0lo
	}
	h.re = sv.reAt(c, h.p0, h.t0)
	return h, lim
}

// satIter caps the root search of saturationCrossing; it stops earlier
// once the bracket is narrower than satTol relative.
const (
	satIter = 100
	satTol  = 1e-12
)

// saturationCrossing is the static temperature at which the matching line
// of target on bounds c meets the saturation line, between lo (liquid
// side) and hi (vapour side): the root of
//
//	f(T) = ln p_line(T) − ln psat(T),
//
// which falls with T (d ln psat/d ln T = L/(R·T), about 8 for nitrogen
// near 80 K by the Clausius–Clapeyron relation — from memory — against at
// most 2 for the line), by regula falsi with the Illinois modification:
// a few steps, at most satIter, to satTol. It returns the vapour-side
// end of the final bracket.
func (sv *gasSolver) saturationCrossing(c *gasBounds, target, lo, hi float64) float64 {
	if tc := sv.tcrit; hi > tc {
		// Above the top of the saturation line nothing condenses.
		if sv.gas.ExceedsVapourPressure(sv.linePressure(c, target, tc), tc) {
			return math.Nextafter(tc, math.Inf(1))
		}
		hi = tc
	}
	f := func(T float64) float64 {
		return math.Log(sv.linePressure(c, target, T)) - math.Log(sv.gas.SaturationPressure(T))
	}
	flo, fhi := f(lo), f(hi)
	side := 0
	for it := 0; it < satIter && hi-lo > satTol*hi; it++ {
		T := hi - fhi*(hi-lo)/(fhi-flo)
		if !(T > lo && T < hi) {
			T = 0.5 * (lo + hi)
		}
		fm := f(T)
		if fm > 0 {
			lo, flo = T, fm
			if side == -1 {
				fhi /= 2
			}
			side = -1
		} else {
			hi, fhi = T, fm
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
	}
	for k := 0; k < 4 && sv.gas.ExceedsVapourPressure(sv.linePressure(c, target, hi), hi); k++ {
		hi *= 1 + satTol // onto the vapour side by the comparison the rest uses
	}
	return hi
}

// tryHit reaches target on bounds c if it can, without resolving the
// saturation floor unless it must: the warmest T0 reaching target at p0hi
// is accepted when it lies above t0lo and on the vapour side at p0hi.
func (sv *gasSolver) tryHit(c *gasBounds, target float64) (gasHit, bool) {
	if !c.ok || !(target > 0) {
		return gasHit{}, false
	}
	if sv.maxRePerM > 0 && target > sv.maxRePerM*sv.L {
		return gasHit{}, false
	}
	tw := atMost(sv.warmestStatic(c, target)/c.tau, sv.lim.T0Max)
	if tw < c.t0lo {
		return gasHit{}, false
	}
	if c.condOn && sv.gas.ExceedsVapourPressure(c.p0hi*c.pi, tw*c.tau) {
		return gasHit{}, false
	}
	var h gasHit
	if sv.leastLoad {
		h, _ = sv.coldest(c, target)
	} else {
		h = sv.hit(c, target, c.t0lo)
	}
	if h.over && sv.maxRePerM > 0 && h.re > sv.maxRePerM*sv.L*(1+solveSlack) {
		// Even the lowest setting (P0Min at the warmest T0) breaks the
		// unit-Reynolds cap: nothing runs at this Mach number.
		return gasHit{}, false
	}
	return h, true
}

// bindingLimit picks the one limit to report when both sides bind, in the
// order unit Reynolds, dynamic pressure, balance load, condensation,
// static temperature, maximum p0, minimum T0, then the values an operating
// rule fixes.
func bindingLimit(pl, tl Limit) Limit {
	for _, l := range [...]Limit{LimitRePerM, LimitQMax, LimitBalanceLoad, LimitCondensation, LimitStaticT,
		LimitP0Max, LimitT0Min, LimitRuleQ, LimitRuleTemperature} {
		if pl == l || tl == l {
			return l
		}
	}
	return pl
}

// gasPick is one chosen gas setting with the bounds it was found on, and
// reMax, the Reynolds number of the best setting on those bounds.
type gasPick struct {
	c gasBounds
	gasSetting
	reMax float64
	over  bool // see gasHit
}

// atMatch is what solveGas knows at the flight Mach number held within
// the facility range: the bounds there (c, which points at the column
// memo's bounds or at own), the best setting on them (best, bestOK) and
// the fill memo that goes with c (nil when c is own).
type atMatch struct {
	own    gasBounds
	c      *gasBounds
	best   gasPick
	bestOK bool
	fm     *fillMemo
}

// solveGas answers one point of a gas facility into ps (whose reFlight is
// set, the rest zero), before finish. Mach number is matched (within
// MachTol, inside the facility range) where it can be; otherwise, below
// the compressibility threshold, relaxed; otherwise the point is out of
// reach.
//
// aux, when not nil, holds the worker's memos: the point's grid column
// (aux.col), whose values are used where their inputs match and refilled
// otherwise, and the relaxed range's best setting.
func (sv *gasSolver) solveGas(ps *pointSol, mf, tFlight float64, detail bool, aux *pointAux) {
	var col *colMemo
	if aux != nil {
		col = aux.col
	}
	mm := sv.matchMach(mf)
	matched := withinTol(mm, mf, sv.mTol)
	var at atMatch
	at.c = &at.own
	if matched && sv.fullMatch(ps, &at, mm, mf, tFlight, detail, col) {
		return
	}
	var rp gasPick
	var rfound bool
	if mf < sv.compMach {
		rp, rfound, _ = sv.relaxFor(mf, ps.reFlight, aux)
		if rfound && rp.re >= (1-sv.reTol)*ps.reFlight {
			ps.class = MachRelaxed
			sv.useSearched(ps, &rp, mf, tFlight)
			return
		}
	}
	switch {
	case matched && at.bestOK:
		ps.class = ReShort
		sv.usePick(ps, &at.best, mf, tFlight, at.fm)
	case matched && !at.c.ok:
		ps.class, ps.limit = NoMatch, at.c.why
	case matched:
		// The unit-Reynolds cap lies below what P0Min gives at T0Max.
		ps.class, ps.limit = NoMatch, LimitRePerM
	case rfound:
		ps.class = NoMatch
		sv.usePick(ps, &rp, mf, tFlight, nil)
	default:
		ps.class, ps.limit = NoMatch, LimitMachRange
	}
}

// fullMatch tries for a full match at facility Mach number mm (flight Mach
// number mf held within the range, matching it within MachTol): the
// flight Reynolds number hit directly, else the best setting there if it
// is within the Reynolds tolerance, else a full match elsewhere in the
// Mach tolerance band (searchMach). It reports whether it found one (ps
// filled); at keeps the bounds and best setting at mm for what follows.
func (sv *gasSolver) fullMatch(ps *pointSol, at *atMatch, mm, mf, tFlight float64, detail bool, col *colMemo) bool {
	target := ps.reFlight
	need := (1 - sv.reTol) * target
	switch {
	case col == nil:
		at.own = sv.bounds(mm)
	case col.b.M == mm:
		at.c, at.fm = &col.b, &col.fill
	default:
		col.b = sv.bounds(mm)
		at.c, at.fm = &col.b, &col.fill
	}
	c := at.c
	if h, ok := sv.tryHit(c, target); ok {
		ps.class = FullMatch
		sv.fillGas(ps, c, h.p0, h.t0, h.re, mf, tFlight, at.fm)
		if detail {
			if top, ok := sv.best(c); ok {
				ps.reMax, ps.pLim, ps.tLim = top.re, top.lim.p, top.lim.t
			}
		}
		if h.over {
			// Overshoot only happens at T0Max: the settings cannot come
			// down further on either side.
			ps.limit, ps.pLim, ps.tLim = sv.limP0Lo, sv.limP0Lo, sv.limT0Hi
		}
		return true
	}
	if c.ok {
		if col != nil && col.bestM == mm {
			at.best, at.bestOK = col.best, col.bestOK
		} else {
			at.best.c = *c
			at.best.gasSetting, at.bestOK = sv.best(c)
			if col != nil {
				col.best, col.bestOK, col.bestM = at.best, at.bestOK, mm
			}
		}
		if at.bestOK && at.best.re >= need {
			ps.class = FullMatch
			sv.usePick(ps, &at.best, mf, tFlight, at.fm)
			return true
		}
	}
	// Short at the flight Mach number: a full match may still lie
	// elsewhere within the Mach tolerance.
	if sv.mTol > 0 && sv.bandTopRe(mf, col) >= need {
		lo, hi, _ := sv.machBand(mf)
		if top, ok := sv.maxOver(lo, hi); ok {
			pick, _, _ := sv.searchMach(lo, hi, mm, target, &top, nil)
			ps.class = FullMatch
			sv.useSearched(ps, &pick, mf, tFlight)
			return true
		}
	}
	return false
}

// useSearched fills ps from a setting found by searchMach: no limit when it
// reaches flight (minimum p0 when even that overshoots), otherwise the
// binding one.
func (sv *gasSolver) useSearched(ps *pointSol, g *gasPick, mf, tFlight float64) {
	sv.usePick(ps, g, mf, tFlight, nil)
	if g.re >= ps.reFlight*(1-solveSlack) {
		ps.limit = LimitNone
		if g.over {
			ps.limit = sv.limP0Lo
		}
	}
}

// usePick fills ps from a chosen setting, with the binding limit when the
// setting falls short of flight.
func (sv *gasSolver) usePick(ps *pointSol, g *gasPick, mf, tFlight float64, fm *fillMemo) {
	sv.fillGas(ps, &g.c, g.p0, g.t0, g.re, mf, tFlight, fm)
	ps.reMax, ps.pLim, ps.tLim = max(g.reMax, g.re), g.lim.p, g.lim.t
	if g.re < ps.reFlight*(1-solveSlack) {
		ps.limit = bindingLimit(g.lim.p, g.lim.t)
	}
}

// fillGas completes the test-section state and the cautions of a gas
// setting. fm, when not nil, memoises the part that depends on the setting
// alone (used when the setting is the one it holds).
func (sv *gasSolver) fillGas(ps *pointSol, c *gasBounds, p0, t0, re, mf, tFlight float64, fm *fillMemo) {
	ps.has = true
	ps.mach, ps.p0, ps.t0, ps.re = c.M, p0, t0, re
	var s *fillMemo
	switch {
	case fm == nil:
		var local fillMemo
		s = &local
		sv.fillSetting(s, c, p0, t0)
	case fm.M == c.M && fm.p0 == p0 && fm.t0 == t0 && fm.re == re:
		s = fm
	default:
		s = fm
		s.M, s.p0, s.t0, s.re = c.M, p0, t0, re
		sv.fillSetting(s, c, p0, t0)
	}
	ps.t, ps.p, ps.v, ps.rho, ps.mu, ps.q = s.t, s.p, s.v, s.rho, s.mu, s.q
	fl := s.flags
	// The flight side: hypersonic flight makes the ideal-gas result
	// approximate and asks for the flight enthalpy.
	if mf >= sv.reg.Supersonic {
		fl |= FlagRealGas
		if t0 < EnthalpyShortRatio*tFlight*(1+0.5*(atmos.GammaAir-1)*mf*mf) {
			fl |= FlagEnthalpyShort
		}
	}
	ps.flags |= fl
}

// fillSetting is the test-section state and the cautions that depend on
// the setting (Mach number of c, p0, t0) alone.
func (sv *gasSolver) fillSetting(s *fillMemo, c *gasBounds, p0, t0 float64) {
	g, R := sv.gamma, sv.rgas
	T := t0 * c.tau
	p := p0 * c.pi
	s.t, s.p = T, p
	s.v = c.M * math.Sqrt(g*R*T)
	s.rho = p / (R * T)
	s.mu = sv.beta * T * math.Sqrt(T) / (T + sv.suth)
	s.q = 0.5 * g * p * c.M * c.M

	var fl Flags
	if sv.peakM > c.M {
		if tl := t0 * sv.peakTau; tl < sv.tcrit && sv.gas.ReachesVapourPressure(p0*sv.peakPi, tl) {
			fl |= FlagCondensationWarn
		}
	}
	if t0 < RealGasT0 || p0 > RealGasP0 ||
		(T < RealGasSatMargin*sv.tcrit && sv.gas.ExceedsVapourPressure(p, T/RealGasSatMargin)) {
		fl |= FlagRealGas
	}
	if t0 < CryogenicT0 {
		fl |= FlagCryogenic
	}
	if sv.lim.P0Max > 0 && p0 >= NearLimitFraction*sv.lim.P0Max {
		fl |= FlagHighP0
	}
	if sv.qMax > 0 && s.q >= NearLimitFraction*sv.qMax {
		fl |= FlagQNearLimit
	}
	if sv.qLoad > 0 && s.q >= NearLimitFraction*sv.qLoad {
		fl |= FlagLoadNearLimit
	}
	s.flags = fl
}

// matchingSet is the matching set at test Mach number M for flight
// Reynolds number target (see MatchingSet), on the limits of sv (the
// free solver: the facility's own limits under the standard rule).
func (sv *gasSolver) matchingSet(M, target float64) MatchingSet {
	c := sv.bounds(M)
	if !c.ok {
		return MatchingSet{}
	}
	ms := MatchingSet{OK: true, Mach: M, Re: target}
	if h, ok := sv.tryHit(&c, target); ok {
		if h.over {
			ms.Re, ms.ReLimit = h.re, sv.limP0Lo
			ms.Cold = sv.setEnd(&c, h.p0, h.t0, sv.limP0Lo)
			ms.Warm = sv.setEnd(&c, h.p0, h.t0, sv.limT0Hi)
			return ms
		}
		cold, lim := sv.coldest(&c, target)
		ms.Cold = sv.setEnd(&c, cold.p0, cold.t0, lim)
		ms.Warm = sv.warmEnd(&c, h)
		return ms
	}
	top, ok := sv.best(&c)
	if !ok {
		return MatchingSet{}
	}
	ms.Re = top.re
	if top.lim.p == LimitRePerM || top.lim.t == LimitRePerM {
		// The unit-Reynolds cap holds the best below flight: every setting
		// on the cap's line gives it.
		ms.ReLimit = LimitRePerM
		floor, _ := sv.floorT0(&c, c.p0hi)
		cold, lim := sv.coldest(&c, top.re)
		ms.Cold = sv.setEnd(&c, cold.p0, cold.t0, lim)
		ms.Warm = sv.warmEnd(&c, sv.hit(&c, top.re, floor))
		return ms
	}
	ms.ReLimit = bindingLimit(top.lim.p, top.lim.t)
	ms.Cold = sv.setEnd(&c, top.p0, top.t0, top.lim.t)
	ms.Warm = sv.setEnd(&c, top.p0, top.t0, top.lim.p)
	return ms
}

// warmEnd is the warm end of a matching line at setting h (hit): bounded
// by T0Max where it reaches it, else by what bounds p0 there.
func (sv *gasSolver) warmEnd(c *gasBounds, h gasHit) SetEnd {
	lim := c.pLim
	if h.t0 >= sv.lim.T0Max*(1-solveSlack) && h.p0 < c.p0hi*(1-solveSlack) {
		lim = sv.limT0Hi
	}
	return sv.setEnd(c, h.p0, h.t0, lim)
}

// setEnd is the end of a matching set at (p0, t0) on bounds c.
func (sv *gasSolver) setEnd(c *gasBounds, p0, t0 float64, lim Limit) SetEnd {
	T := t0 * c.tau
	return SetEnd{P0: p0, T0: t0, V: c.M * math.Sqrt(sv.gamma*sv.rgas*T),
		Q: 0.5 * sv.gamma * p0 * c.pi * c.M * c.M, Limit: lim}
}

func (sv *gasSolver) addDetail(d *Detail, ps pointSol) {
	if !ps.has {
		return
	}
	fs := sv.free()
	c := fs.bounds(ps.mach)
	d.ReSweepMin, d.ReSweepMax = fs.sweep(&c, ps.p0)
	d.MinT0Condensation = sv.gas.SaturationTemperature(ps.p) / c.tau
	d.Set = fs.matchingSet(ps.mach, ps.reFlight)
}

// sweep is the Reynolds range at the Mach number of c and stagnation
// pressure p0 (fixed dynamic pressure) as T0 runs over its allowed range.
func (sv *gasSolver) sweep(c *gasBounds, p0 float64) (lo, hi float64) {
	tFloor, _ := sv.floorT0(c, p0)
	lo = sv.reAt(c, p0, sv.lim.T0Max)
	hi = sv.reAt(c, p0, tFloor)
	if sv.maxRePerM > 0 {
		reCap := sv.maxRePerM * sv.L
		lo, hi = math.Min(lo, reCap), math.Min(hi, reCap)
	}
	return lo, hi
}

// reynoldsRange: from the lowest setting (P0Min at T0Max, within the
// unit-Reynolds cap) to the best setting within every limit, at a test
// Mach number inside the facility range.
func (sv *gasSolver) reynoldsRange(mach float64) (lo, hi float64, ok bool) {
	if mach < sv.lim.MachMin || mach > sv.lim.MachMax || !(mach > 0) {
		return 0, 0, false
	}
	return sv.rangeAt(mach)
}

// rangeAt is reynoldsRange at Mach number M without the range check.
func (sv *gasSolver) rangeAt(M float64) (lo, hi float64, ok bool) {
	c := sv.bounds(M)
	if !c.ok {
		return 0, 0, false
	}
	top, ok := sv.best(&c)
	if !ok {
		return 0, 0, false
	}
	lo = sv.reAt(&c, c.p0lo, sv.lim.T0Max)
	if sv.maxRePerM > 0 {
		lo = min(lo, sv.maxRePerM*sv.L)
	}
	return lo, top.re, true
}

// reachableRe samples the range at samples Mach numbers evenly over the
// facility's Mach range (from Mach 0.01 at least); Mach numbers where no
// setting exists are left out.
func (sv *gasSolver) reachableRe(samples int) []ReRange {
	m0 := math.Max(sv.lim.MachMin, 0.01)
	var out []ReRange
	for k := 0; k < samples; k++ {
		M := m0 + (sv.lim.MachMax-m0)*float64(k)/float64(samples-1)
		lo, hi, ok := sv.rangeAt(M)
		if !ok || !(hi > 0) {
			continue
		}
		out = append(out, ReRange{Mach: M, Lo: lo, Hi: hi})
	}
	return out
}

// minScale is MinScaleFullMatch for flight record r: the model Reynolds
// number is proportional to scale, so the smallest scale is
// (1 − ReTol)·Re_flight over the best Reynolds number at scale 1 (the
// solver's model length is the full-scale length). memo, when not nil,
// keeps the scale-1 best per flight Mach number.
func (sv *gasSolver) minScale(r *flightRec, memo map[float64]scaleOne) minScaleSol {
	if r.excl != InEnvelope {
		return minScaleSol{}
	}
	mf := r.mach
	mm := sv.matchMach(mf)
	if !withinTol(mm, mf, sv.mTol) {
		return minScaleSol{}
	}
	one, seen := memo[mf]
	if !seen {
		one = sv.bestNearMach(mf, mm)
		if memo != nil {
			memo[mf] = one
		}
	}
	if !(one.re > 0) {
		return minScaleSol{}
	}
	return minScaleSol{scale: (1 - sv.reTol) * r.re / one.re, q: one.q, ok: true}
}

// bestNearMach is the highest best setting at facility Mach numbers
// within MachTol of flight Mach number mf (mm: mf held within the facility
// range): its Reynolds number (0 when none is usable) and dynamic
// pressure.
func (sv *gasSolver) bestNearMach(mf, mm float64) scaleOne {
	var one scaleOne
	take := func(c *gasBounds, s gasSetting) {
		if s.re > one.re {
			one = scaleOne{re: s.re, q: 0.5 * sv.gamma * s.p0 * c.pi * c.M * c.M}
		}
	}
	if c := sv.bounds(mm); c.ok {
		if top, ok := sv.best(&c); ok {
			take(&c, top)
		}
	}
	if lo, hi, ok := sv.machBand(mf); ok {
		if top, ok := sv.maxOver(lo, hi); ok {
			take(&top.c, top.gasSetting)
		}
	}
	return one
}

// matchQ: the cold end of the matching line at the Mach number a match is
// tried at (flight held within the facility range) and at the ends of the
// Mach tolerance band, the lowest of them (a full match may lie anywhere
// in the band, and along it q at the cold end changes monotonically, as
// about M·T²/(T+S) of the static temperature), under the facility's own
// limits (the balance cap aside).
func (sv *gasSolver) matchQ(mf, target float64) (float64, bool) {
	fs := sv.free()
	if fs.qLoad > 0 {
		c := *fs
		c.setLoadCap(0)
		fs = &c
	}
	mm := fs.matchMach(mf)
	if !withinTol(mm, mf, fs.mTol) {
		return 0, false
	}
	ms := [3]float64{mm, mm, mm}
	if lo, hi, ok := fs.machBand(mf); ok {
		ms[1], ms[2] = lo, hi
	}
	q, found := math.Inf(1), false
	for _, M := range ms {
		c := fs.bounds(M)
		if _, ok := fs.tryHit(&c, target); !ok {
			continue
		}
		h, _ := fs.coldest(&c, target)
		q, found = math.Min(q, 0.5*fs.gamma*h.p0*c.pi*c.M*c.M), true
	}
	return q, found
}

func peakMach(f *Facility) float64 {
	if f.Gas.PeakLocalMach > 0 {
		return f.Gas.PeakLocalMach
	}
	return DefaultPeakLocalMach
}

// atMost is min(x, hi) and atLeast max(x, lo) for operands that are not
// NaN. The per-point chain of the gas solve (hit, tryHit, floorT0) uses
// them: the built-in min and max also order NaNs and signed zeros, and
// there cost about 10 % of BenchmarkResolve400 and
// BenchmarkPointEvaluation.
func atMost(x, hi float64) float64 {
	if x < hi {
		return x
	}
	return hi
}

func atLeast(x, lo float64) float64 {
	if x > lo {
		return x
	}
	return lo
}
