package envelope

import (
	"errors"
	"fmt"
	"math"
	"sync"
	"unsafe"

	"likewind/atmos"
)

// PlanningNote is attached to every facility detail: the engine plans,
// it does not authorise runs.
const PlanningNote = "Planning estimate only: confirm settings with the facility's own operating procedures, " +
	"pressure-vessel and model-load ratings, local codes and licensed engineering review before any run."

// Bounded searches of the solver (the rest is closed form).
const (
	// relaxStep is the spacing of the facility Mach numbers sampled when
	// looking for the Mach number nearest flight that reaches the flight
	// Reynolds number (Mach relaxed, or within the Mach tolerance band):
	// every multiple of relaxStep inside the range, and both ends exactly
	// (machSamples). The samples inside do not depend on the range's ends,
	// which only cut them off, so a higher compressibility threshold or a
	// lower Mach-range end searches a superset. Below Mach 1 that is at
	// most 400 samples; only points that need a search make one.
	relaxStep = 0.0025
	// relaxIter caps the bisection that then locates that Mach number;
	// it stops earlier once the bracket is narrower than relaxTol.
	relaxIter = 48
	relaxTol  = 1e-7
	// waterIter caps the regula-falsi search for the water temperature
	// that brings the Reynolds number down to flight at the minimum speed;
	// it stops earlier once the bracket is narrower than waterTolK
	// (kelvin) or the viscosity is met to 1e-12 relative.
	waterIter = 60
	waterTolK = 1e-6
	// solveSlack is the relative rounding allowance with which a setting
	// that hits its target counts as reaching it.
	solveSlack = 1e-9
)

// Map is one facility's answer over a grid: a Result per grid point, in
// Grid.Index order.
type Map struct {
	Grid     *Grid
	Facility *Facility
	Settings Settings

	// Scale is the model scale used (model/full size) and ScaleRule says
	// where it came from.
	Scale     float64
	ScaleRule string
	// FitScale is the largest scale the test section takes by the span and
	// blockage rules (0 when the vehicle gives neither span nor frontal
	// area), with the rule that decides it.
	FitScale float64
	FitRule  string
	fit      sectionFit // fit scales by test Mach number, for FlagModelTooLarge

	Results []Result

	sv *solver
	// solved: Results are as Solve made them, Outside exactly at the
	// points outside the envelope, with shares counted while solving.
	solved bool
	shares Shares
}

// Detail is the full-precision facility answer for one grid point.
type Detail struct {
	Flight   FlightDetail
	Facility string
	Medium   Medium

	Class Class
	Limit Limit
	// PressureLimit and TemperatureLimit are the constraints bounding the
	// best reachable setting at the test Mach number on the pressure side
	// and the temperature side (gas facilities; LimitNone when not solved).
	PressureLimit    Limit
	TemperatureLimit Limit
	Flags            Flags

	Scale       float64 // model scale
	ModelLength float64 // model reference length, m

	// Settings. Gas: stagnation pressure P0 (Pa) and temperature T0 (K).
	// Water: P0 is the test-section static pressure, T0 the water
	// temperature. HasSettings is false when no setting exists (Mach out
	// of range, no feasible region).
	HasSettings bool
	Mach        float64 // test-section Mach number (gas; 0 for water)
	P0, T0      float64
	// Test-section static state.
	P, T      float64 // Pa, K
	V         float64 // m/s
	Q         float64 // Pa
	Density   float64 // kg/m3
	Viscosity float64 // Pa·s

	Re       float64 // model Reynolds number achieved
	ReFlight float64 // flight Reynolds number (the target)
	ReRatio  float64
	RePerM   float64 // model unit Reynolds number, 1/m
	DCf      float64 // Prandtl–Schlichting Cf(model) − Cf(flight)
	ReMax    float64 // highest Reynolds number reachable at the test Mach number

	// ReSweepMin and ReSweepMax are the Reynolds numbers the facility spans
	// at the test Mach number and the dynamic pressure of the chosen setting,
	// by varying T0 (water: temperature) within every limit.
	ReSweepMin, ReSweepMax float64

	FlightT0 float64 // flight stagnation temperature, K
	// MinT0Condensation is the lowest T0 that keeps the test-section static
	// state on the vapour side of the saturation line at the chosen p0 and
	// test Mach number (gas).
	MinT0Condensation float64

	VapourPressure float64 // water, Pa
	Cavitation     float64 // water cavitation number (p − pv)/(½ρV²)

	Cautions []string
	// SectionFit is the largest model scale the section takes at the test
	// Mach number, and SectionFitRule the rule that sets it; both are set
	// only where FlagModelTooLarge is.
	SectionFit     float64
	SectionFitRule string
}

// Solve finds, for every inside point of g, the settings of facility f that
// best reproduce the flight condition with a scale model, and classifies the
// point. It depends on the facility and on the scale and tolerances of s;
// the grid is not changed, so a facility what-if re-runs only Solve.
//
// Gas facilities: at the target Mach number the test-section static state
// follows from the isentropic relations, and the Reynolds number from
// Sutherland's law, so for each Mach number the limits (p0 and T0 ranges,
// dynamic pressure, static temperature, saturation line, unit Reynolds
// number) are solved jointly in (p0, T0) in closed form. Of the settings
// that reach the flight Reynolds number the warmest T0 is taken, then the
// lowest p0. Water facilities: warmest water (lowest viscosity), then the
// lowest speed.
//
// The day (DeltaT) and regime thresholds are the grid's; of s, Solve uses
// the scale override and the tolerances. The model scale is s.Scale if set,
// else the facility's Model.Scale, else the largest that fits (FitScale).
func Solve(g *Grid, f *Facility, s Settings) (*Map, error) {
	if g == nil || f == nil {
		return nil, errors.New("solve: need a grid and a facility")
	}
	if err := checkSettings(s); err != nil {
		return nil, fmt.Errorf("solve %q: %w", f.Name, err)
	}
	if err := checkFacility(f); err != nil {
		return nil, fmt.Errorf("solve %q: %w", f.Name, err)
	}
	m := &Map{Grid: g, Facility: f, Settings: s}
	m.FitScale, m.FitRule = FitScale(g.Vehicle, f, fitMach(g, f))
	switch {
	case s.Scale > 0:
		m.Scale, m.ScaleRule = s.Scale, "set in settings"
	case f.Model.Scale > 0:
		m.Scale, m.ScaleRule = f.Model.Scale, "facility model scale"
	case m.FitScale > 0:
		m.Scale, m.ScaleRule = m.FitScale, "fitted: "+m.FitRule
	default:
		return nil, fmt.Errorf("solve %q: no model scale: set a scale, or give the vehicle span or frontal area and the section width and height", f.Name)
	}
	m.fit = newSectionFit(g.Vehicle, f)
	m.sv = solverFor(f, s, g.Regimes, m.Scale*g.Vehicle.RefLength)
	m.Results = make([]Result, len(g.points))
	cols := len(g.Speeds)
	// Points are independent: blocks of rows are solved side by side, each
	// result written to its own slot, so the map is the same as a
	// point-by-point solve.
	var mu sync.Mutex // guards m.shares while workers add their counts
	forRowBlocks(len(g.Alts), cols, func() func(i0, i1 int) {
		// What depends only on the facility Mach number is reused down a
		// column (on a Mach grid every row shares it): one memo per column
		// and worker.
		col := make([]colMemo, cols)
		for j := range col {
			col[j].reset()
		}
		return func(i0, i1 int) {
			n := m.solveRows(i0, i1, col)
			mu.Lock()
			for c := range n {
				m.shares.Count[c] += n[c]
			}
			mu.Unlock()
		}
	})
	m.shares.Total = len(m.Results)
	m.shares.Inside = g.inside
	m.shares.Count[Outside] = m.shares.Total - m.shares.Inside
	m.solved = true
	return m, nil
}

// solveRows solves the inside points of rows i0..i1-1 into m.Results, with
// the column memos col, and returns how many of them fell in each class.
func (m *Map) solveRows(i0, i1 int, col []colMemo) (n [NumClasses]int) {
	g, sv := m.Grid, m.sv
	cols := len(g.Speeds)
	var aux pointAux
	var ps pointSol
	for i := i0; i < i1; i++ {
		tFlight := g.rows[i].Temperature
		base := i * cols
		for j := 0; j < cols; j++ {
			r := &g.points[base+j]
			if r.excl != InEnvelope {
				continue
			}
			c := &col[j]
			if c.oorM != r.mach {
				c.oorM = r.mach
				c.oorL, c.oor = sv.outOfRange(r.mach)
			}
			if c.oor {
				m.Results[base+j] = Result{Class: NoMatch, Limit: c.oorL, Flags: m.sizeFlag(m.sizeMach(r.mach, false, 0))}
				n[NoMatch]++
				continue
			}
			aux.col = c
			ps = pointSol{}
			sv.solveInto(&ps, r.mach, r.re, tFlight, false, &aux)
			m.Results[base+j] = ps.result()
			m.Results[base+j].Flags |= m.sizeFlag(m.sizeMach(r.mach, ps.has, ps.mach))
			n[ps.class]++
		}
	}
	return n
}

// outOfRange reports flight Mach numbers that the facility can neither
// match nor relax, with the limit: what solve gives them without a search
// (class NoMatch, no settings, no flags).
func (sv *solver) outOfRange(mf float64) (Limit, bool) {
	if mf < sv.cm {
		return LimitNone, false
	}
	if sv.water {
		return LimitIncompressible, true
	}
	mm := lesserOf(greaterOf(mf, sv.f.MachMin), sv.f.MachMax)
	if sv.machMatched(mm, mf) {
		return LimitNone, false
	}
	return LimitMachRange, true
}

// machMatched reports whether facility Mach number mm (flight Mach number
// mf held within the facility range) matches flight within MachTol.
func (sv *solver) machMatched(mm, mf float64) bool {
	return math.Abs(mm-mf) <= sv.mTol*(1+1e-9)+1e-12
}

// pointAux is what a Solve worker reuses between points: the memo of the
// point's grid column, the point's slot of the grid's flight skin-friction
// memo, and the logarithm of the flight Reynolds number when the grid
// keeps it split.
type pointAux struct {
	col *colMemo
	// relaxTop is maxOver of the relaxed range (relaxOK: it exists),
	// computed once per worker (relaxDone).
	relaxTop           gasPick
	relaxOK, relaxDone bool
}

// colMemo holds values a Solve worker computed for one grid column, each
// with the exact inputs it was computed from, so that a later point reuses
// it only when it would compute the same thing: whether the flight Mach
// number is out of the facility's reach, the gas bounds at facility Mach
// number b.M, the best setting on them, the test-section state and setting
// cautions of the last setting filled in, and the model skin friction of
// the last model Reynolds number. Reynolds-short points down a column all
// share one best setting, so they cost little after the first.
type colMemo struct {
	b      gasBounds // bounds at b.M (NaN: none yet)
	bestM  float64   // Mach number best was found at (NaN: none yet)
	best   gasPick
	bestOK bool
	fill   fillMemo
	oorM   float64 // flight Mach number of oor, oorL (NaN: none yet)
	oorL   Limit
	oor    bool // outOfRange(oorM)
	// bandRe is bandTopRe of flight Mach number bandM (NaN: none yet).
	bandM, bandRe float64
}

func (c *colMemo) reset() {
	nan := math.NaN()
	c.b.M, c.bestM, c.fill.M, c.oorM, c.bandM = nan, nan, nan, nan, nan
}

// fillMemo is the part of fillGas that depends on the setting alone, for
// the setting (M, p0, t0, re).
type fillMemo struct {
	M, p0, t0, re       float64 // the setting (M NaN: none yet)
	t, p, v, rho, mu, q float64
	flags               Flags
}

// At returns the stored result of point (i, j).
func (m *Map) At(i, j int) Result { return m.Results[m.Grid.Index(i, j)] }

// StoredBytes is the memory the map holds for its results (28 bytes per
// point).
func (m *Map) StoredBytes() int { return len(m.Results) * int(unsafe.Sizeof(Result{})) }

// Detail recomputes point (i, j) at full precision and adds what the
// compact Result leaves out: the test-section state, the Reynolds sweep at
// constant dynamic pressure, flight against facility T0, the cavitation
// number for water, and cautions. The facility is solved from the stored
// flight Mach and Reynolds numbers, so the class agrees with the map.
func (m *Map) Detail(i, j int) (Detail, error) {
	fd, err := m.Grid.FlightDetail(i, j)
	if err != nil {
		return Detail{}, err
	}
	sv := m.sv
	d := Detail{
		Flight:      fd,
		Facility:    m.Facility.Name,
		Medium:      m.Facility.Medium,
		Scale:       m.Scale,
		ModelLength: sv.L,
		FlightT0:    fd.T0,
	}
	if !fd.Inside {
		d.Class = Outside
		return d, nil
	}
	r := m.Grid.points[m.Grid.Index(i, j)]
	ps := sv.solve(r.mach, r.re, fd.State.Temperature, true)
	d.Class, d.Limit, d.Flags = ps.class, ps.limit, ps.flags
	d.PressureLimit, d.TemperatureLimit = ps.pLim, ps.tLim
	d.HasSettings = ps.has
	d.Mach, d.P0, d.T0 = ps.mach, ps.p0, ps.t0
	d.P, d.T, d.V, d.Q, d.Density, d.Viscosity = ps.p, ps.t, ps.v, ps.q, ps.rho, ps.mu
	d.Re, d.ReFlight, d.ReRatio, d.DCf, d.ReMax = ps.re, ps.reFlight, ps.ratio, ps.dcf, ps.reMax
	if ps.has && ps.mu > 0 {
		d.RePerM = ps.rho * ps.v / ps.mu
	}
	if sv.water {
		d.VapourPressure, d.Cavitation = ps.pv, ps.sigma
		if ps.has {
			d.ReSweepMin, d.ReSweepMax = sv.waterSweep(ps.q)
		}
	} else if ps.has {
		c := sv.bounds(ps.mach)
		d.ReSweepMin, d.ReSweepMax = sv.gasSweep(&c, ps.p0)
		d.MinT0Condensation = sv.gas.SaturationTemperature(ps.p) / c.tau
	}
	sm := m.sizeMach(r.mach, ps.has, ps.mach)
	d.Flags |= m.sizeFlag(sm)
	if d.Flags.Has(FlagModelTooLarge) {
		d.SectionFit, d.SectionFitRule = m.fit.at(sm)
	}
	d.Cautions = cautions(&d, m.Facility)
	return d, nil
}

// ReynoldsRange is the span of model Reynolds numbers the map's gas
// facility reaches at test Mach number mach with the map's model: from the
// lowest setting (P0Min at T0Max, within the unit-Reynolds cap) to the
// best setting within every limit. ok is false for a water facility, for a
// Mach number outside the facility range, and where no setting exists.
func (m *Map) ReynoldsRange(mach float64) (lo, hi float64, ok bool) {
	sv := m.sv
	if sv == nil || sv.water || mach < sv.f.MachMin || mach > sv.f.MachMax || !(mach > 0) {
		return 0, 0, false
	}
	c := sv.bounds(mach)
	if !c.ok {
		return 0, 0, false
	}
	_, _, hi, _, _, ok = sv.best(&c)
	if !ok {
		return 0, 0, false
	}
	lo = sv.reAt(&c, sv.p0min, sv.t0max)
	if sv.rpm > 0 {
		lo = lesserOf(lo, sv.rpm*sv.L)
	}
	return lo, hi, true
}

// solver holds the per-facility constants of a Solve.
type solver struct {
	f     *Facility
	water bool
	reg   atmos.Regimes

	mTol, reTol, cm float64
	L               float64 // model reference length, m

	// gas
	gas           atmos.IdealGas
	gamma, beta   float64
	suth          float64 // Sutherland S, K
	rgas          float64
	kFac          float64 // Re = M·kFac·p·(T+S)/T², kFac = L·√(γ/R)/β
	condFlag, air bool
	tcrit         float64 // top of the saturation line, K
	peakM         float64 // PeakLocalMach and its isentropic ratios
	peakTau       float64
	peakPi        float64
	p0min, p0max  float64
	t0min, t0max  float64
	qmax, minT    float64
	rpm           float64 // unit Reynolds cap, 1/m (0: none)

	// water
	hot     atmos.WaterState // at T0Max
	cold    atmos.WaterState // at T0Min
	pStatic float64
}

// solverFor prepares facility f (already checked) for a model of
// reference length L (m), with the tolerances of s and regime thresholds
// reg.
func solverFor(f *Facility, s Settings, reg atmos.Regimes, L float64) *solver {
	sv := &solver{
		f:     f,
		water: f.Medium == MediumWater,
		reg:   reg,
		mTol:  s.MachTol,
		reTol: s.ReTol,
		cm:    s.CompressibilityMach,
		L:     L,
		p0min: f.P0Min, p0max: f.P0Max,
		t0min: f.T0Min, t0max: f.T0Max,
		qmax: f.QMax, minT: f.MinStaticT,
		rpm: f.MaxReynoldsPerM,
	}
	if sv.water {
		switch {
		case f.P0Max > 0:
			sv.pStatic = f.P0Max
		default:
			sv.pStatic = math.Max(f.P0Min, atmos.SeaLevelPressure)
		}
		sv.hot, _ = sv.waterAt(f.T0Max) // range checked by checkFacility
		sv.cold, _ = sv.waterAt(f.T0Min)
		return sv
	}
	var gas atmos.IdealGas
	if f.Medium == MediumNitrogen {
		gas = atmos.Nitrogen()
	} else {
		gas = atmos.Air()
		sv.air = true
	}
	sv.gas = gas
	sv.gamma, sv.rgas = gas.Gamma(), gas.R()
	sv.beta, sv.suth = gas.Sutherland()
	sv.kFac = sv.L * math.Sqrt(sv.gamma/sv.rgas) / sv.beta
	sv.condFlag = f.Condensation
	sv.tcrit = gas.CriticalTemperature()
	sv.peakM = peakMach(f)
	sv.peakTau = 1 / (1 + 0.5*(sv.gamma-1)*sv.peakM*sv.peakM)
	sv.peakPi = sv.pressureRatio(sv.peakTau)
	return sv
}

// waterAt is liquid water at temperature T and the test-section static
// pressure (IAPWS-IF97 region 1 depends on pressure: 2.5 bar makes water
// denser than at 1 atm by about 7e-5), or at the vapour pressure where that
// is higher, so that the state stays liquid.
func (sv *solver) waterAt(T float64) (atmos.WaterState, error) {
	return atmos.WaterAtPressure(T, math.Max(sv.pStatic, atmos.WaterVapourPressure(T)))
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

// solve answers one point: flight Mach mf, flight Reynolds number reF and
// flight static temperature tFlight. With detail set it also finds the
// highest reachable Reynolds number where the target was hit directly.
func (sv *solver) solve(mf, reF, tFlight float64, detail bool) pointSol {
	var ps pointSol
	sv.solveInto(&ps, mf, reF, tFlight, detail, nil)
	return ps
}

// solveInto is solve writing into ps, which must be zero, with the
// reusable values of aux (nil: none); the answer is the same.
func (sv *solver) solveInto(ps *pointSol, mf, reF, tFlight float64, detail bool, aux *pointAux) {
	ps.reFlight = reF
	if sv.water {
		sv.solveWater(ps, mf)
	} else {
		sv.solveGas(ps, mf, tFlight, detail, aux)
	}
	if ps.has && reF > 0 {
		ps.ratio = ps.re / reF
		// The skin-friction difference is for the point details only;
		// the compact map does not keep it.
		if detail && math.Abs(ps.ratio-1) > 1e-9 {
			ps.dcf = skinFrictionDelta(ps.re, reF)
		}
		if ps.ratio > 1+sv.reTol {
			ps.flags |= FlagReOver
		}
	}
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
	t0lo       float64 // lowest T0 from T0Min and the static-T floor
	tLim       Limit   // what sets t0lo
}

// bounds evaluates the limits at Mach number M jointly, in closed form:
//
//	p0 ≤ P0Max, p0 ≤ 2·QMax/(γM²π(M))                   (dynamic pressure)
//	T0 ≥ T0Min, T0 ≥ MinStaticT/τ(M)                     (static temperature)
//	T0·τ(M) ≥ Tsat(p0·π(M))  ⇔  p0 ≤ psat(T0·τ)/π(M)     (saturation line)
//	T0 ≤ T0Max, p0 ≥ P0Min.
//
// The saturation constraint couples p0 and T0: at T0Max it caps p0, and
// at p0hi it sets a floor on T0 (resolved in best, only when needed).
func (sv *solver) bounds(M float64) gasBounds {
	g := sv.gamma
	c := gasBounds{M: M}
	c.tau = 1 / (1 + 0.5*(g-1)*M*M)
	c.pi = sv.pressureRatio(c.tau)
	c.k = M * sv.kFac
	c.condOn = sv.condFlag || (sv.air && M >= 1)
	c.p0hi, c.pLim = sv.p0max, LimitP0Max
	if sv.qmax > 0 && M > 0 {
		if pq := 2 * sv.qmax / (g * M * M * c.pi); pq < c.p0hi {
			c.p0hi, c.pLim = pq, LimitQMax
		}
	}
	c.t0lo, c.tLim = sv.t0min, LimitT0Min
	if sv.minT > 0 {
		if t := sv.minT / c.tau; t > c.t0lo {
			c.t0lo, c.tLim = t, LimitStaticT
		}
	}
	if c.t0lo > sv.t0max*(1+1e-12) {
		c.why = c.tLim
		return c
	}
	if c.condOn {
		if pc := sv.gas.SaturationPressure(sv.t0max*c.tau) / c.pi; pc < c.p0hi {
			c.p0hi, c.pLim = pc, LimitCondensation
		}
	}
	if c.p0hi < sv.p0min {
		c.why = c.pLim
		return c
	}
	c.ok = true
	return c
}

// pressureRatio is p/p0 = τ^(γ/(γ−1)) for temperature ratio τ = T/T0;
// for γ = 1.4 it is τ³·√τ, without the cost of math.Pow.
func (sv *solver) pressureRatio(tau float64) float64 {
	if sv.gamma == 1.4 {
		return tau * tau * tau * math.Sqrt(tau)
	}
	return math.Pow(tau, sv.gamma/(sv.gamma-1))
}

// reAt is the model Reynolds number at (p0, T0) on bounds c.
func (sv *solver) reAt(c *gasBounds, p0, t0 float64) float64 {
	T := t0 * c.tau
	return c.k * p0 * c.pi * (T + sv.suth) / (T * T)
}

// floorT0 is the lowest T0 allowed at stagnation pressure p0 (the larger
// of t0lo and the saturation floor), never above T0Max. The saturation
// floor needs the inverse vapour-pressure line, which atmos iterates
// (Newton in a bracket to 1e-12 relative, at most 100 steps); it is only
// evaluated when the floor binds, i.e. when the static state at t0lo would
// be on the liquid side. Every other step of the gas solve is closed form.
func (sv *solver) floorT0(c *gasBounds, p0 float64) (float64, Limit) {
	t0, lim := c.t0lo, c.tLim
	if c.condOn {
		p := p0 * c.pi
		if sv.gas.ExceedsVapourPressure(p, t0*c.tau) {
			t0, lim = sv.gas.SaturationTemperature(p)/c.tau, LimitCondensation
		}
	}
	return lesserOf(t0, sv.t0max), lim
}

// best returns the highest-Reynolds setting on bounds c: p0 at p0hi, T0 at
// its floor there (Re rises with p0 and falls with T0, and along the
// saturation line Re still rises with p0, so this corner is the maximum),
// then cut back to the unit-Reynolds cap if that binds. It returns the
// binding limits of each side. The cap is met as hit meets any target:
// T0 is raised at p0hi, so p0 stays bounded by what bounds p0hi (q max,
// say) and the cap bounds T0 from below; only where T0 reaches T0Max does
// p0 come down, and then the cap bounds p0 and T0Max the temperature.
func (sv *solver) best(c *gasBounds) (p0, t0, re float64, pLim, tLim Limit, ok bool) {
	p0 = c.p0hi
	t0, tLim = sv.floorT0(c, p0)
	pLim = c.pLim
	re = sv.reAt(c, p0, t0)
	if sv.rpm > 0 {
		if lim := sv.rpm * sv.L; re > lim {
			var over bool
			p0, t0, re, over = sv.hit(c, lim, t0)
			if over {
				return 0, 0, 0, LimitRePerM, tLim, false
			}
			if p0 < c.p0hi*(1-solveSlack) {
				pLim, tLim = LimitRePerM, LimitT0Max
			} else {
				tLim = LimitRePerM
			}
		}
	}
	return p0, t0, re, pLim, tLim, true
}

// hit returns the operator's setting for target Reynolds number target on
// bounds c, known to be reachable with the floor tFloor at p0hi: the
// warmest T0 that still reaches it (at p0hi, solving the quadratic below),
// then the lowest p0 at that T0. With p static and T static,
//
//	Re = k·p·(T+S)/T²  ⇒  Re·T² − k·p·T − k·p·S = 0
//	⇒  T = (a + √(a² + 4aS))/2,  a = k·p/Re.
//
// over reports that even P0Min at that T0 exceeds the target.
func (sv *solver) hit(c *gasBounds, target, tFloor float64) (p0, t0, re float64, over bool) {
	a := c.k * c.p0hi * c.pi / target
	T := 0.5 * (a + math.Sqrt(a*a+4*a*sv.suth))
	t0 = greaterOf(lesserOf(T/c.tau, sv.t0max), tFloor)
	T = t0 * c.tau
	p0 = target * T * T / (c.k * c.pi * (T + sv.suth))
	p0 = lesserOf(p0, c.p0hi)
	if p0 < sv.p0min {
		p0, over = sv.p0min, true
	}
	return p0, t0, sv.reAt(c, p0, t0), over
}

// tryHit reaches target on bounds c if it can, without resolving the
// saturation floor unless it must: the warmest T0 reaching target at p0hi
// is accepted when it lies above t0lo and on the vapour side at p0hi.
func (sv *solver) tryHit(c *gasBounds, target float64) (p0, t0, re float64, over, ok bool) {
	if !c.ok || !(target > 0) {
		return 0, 0, 0, false, false
	}
	if sv.rpm > 0 && target > sv.rpm*sv.L {
		return 0, 0, 0, false, false
	}
	a := c.k * c.p0hi * c.pi / target
	T := 0.5 * (a + math.Sqrt(a*a+4*a*sv.suth))
	tw := lesserOf(T/c.tau, sv.t0max)
	if tw < c.t0lo {
		return 0, 0, 0, false, false
	}
	if c.condOn && sv.gas.ExceedsVapourPressure(c.p0hi*c.pi, tw*c.tau) {
		return 0, 0, 0, false, false
	}
	p0, t0, re, over = sv.hit(c, target, c.t0lo)
	if over && sv.rpm > 0 && re > sv.rpm*sv.L*(1+solveSlack) {
		// Even the lowest setting (P0Min at the warmest T0) breaks the
		// unit-Reynolds cap: nothing runs at this Mach number.
		return 0, 0, 0, false, false
	}
	return p0, t0, re, over, true
}

// bindingLimit picks the one limit to report when both sides bind, in the
// order unit Reynolds, dynamic pressure, condensation, static temperature,
// maximum p0, minimum T0.
func bindingLimit(pl, tl Limit) Limit {
	for _, l := range [...]Limit{LimitRePerM, LimitQMax, LimitCondensation, LimitStaticT, LimitP0Max, LimitT0Min} {
		if pl == l || tl == l {
			return l
		}
	}
	return pl
}

// gasPick is one chosen gas setting with the bounds it was found on, and
// reMax, the Reynolds number of the best setting on those bounds.
type gasPick struct {
	c          gasBounds
	p0, t0, re float64
	reMax      float64
	pLim, tLim Limit
	over       bool
}

// solveGas answers one point of a gas facility. Mach number is matched
// (within MachTol, inside the facility range) where it can be; otherwise,
// below the compressibility threshold, relaxed; otherwise the point is out
// of reach.
//
// Where the flight Mach number falls short of a full match, the rest of
// the Mach tolerance band is searched (searchMach) for a full match before
// Mach is relaxed.
//
// aux, when not nil, holds the worker's memos: the point's grid column
// (aux.col), whose values are used where their inputs match and refilled
// otherwise, and the relaxed range's best setting.
func (sv *solver) solveGas(ps *pointSol, mf, tFlight float64, detail bool, aux *pointAux) {
	f := sv.f
	var col *colMemo
	if aux != nil {
		col = aux.col
	}
	target := ps.reFlight
	need := (1 - sv.reTol) * target
	mm := lesserOf(greaterOf(mf, f.MachMin), f.MachMax)
	matched := sv.machMatched(mm, mf)

	var cl gasBounds
	c := &cl       // bounds at the matched Mach number (read only)
	var cb gasPick // best setting at the matched Mach number
	var cok bool
	var fm *fillMemo // the column's fill memo, when c is the column's bounds
	if matched {
		switch {
		case col == nil:
			cl = sv.bounds(mm)
		case col.b.M == mm:
			c, fm = &col.b, &col.fill
		default:
			col.b = sv.bounds(mm)
			c, fm = &col.b, &col.fill
		}
		if p0, t0, re, over, ok := sv.tryHit(c, target); ok {
			ps.class = FullMatch
			sv.fillGas(ps, c, p0, t0, re, mf, tFlight, fm)
			if detail {
				if _, _, r, pl, tl, ok := sv.best(c); ok {
					ps.reMax, ps.pLim, ps.tLim = r, pl, tl
				}
			}
			if over {
				// Overshoot only happens at T0Max: the settings cannot come
				// down further on either side.
				ps.limit, ps.pLim, ps.tLim = LimitP0Min, LimitP0Min, LimitT0Max
			}
			return
		}
		if c.ok {
			if col != nil && col.bestM == mm {
				cb, cok = col.best, col.bestOK
			} else {
				cb.c = *c
				cb.p0, cb.t0, cb.re, cb.pLim, cb.tLim, cok = sv.best(c)
				if col != nil {
					col.best, col.bestOK, col.bestM = cb, cok, mm
				}
			}
			if cok && cb.re >= need {
				ps.class = FullMatch
				sv.usePick(ps, &cb, mf, tFlight, fm)
				return
			}
		}
		// Short at the flight Mach number: a full match may still lie
		// elsewhere within the Mach tolerance.
		if sv.mTol > 0 && sv.bandTopRe(mf, col) >= need {
			lo, hi, _ := sv.machBand(mf)
			if top, ok := sv.maxOver(lo, hi); ok {
				pick, _, _ := sv.searchMach(lo, hi, mm, target, &top)
				ps.class = FullMatch
				sv.useSearched(ps, &pick, mf, tFlight)
				return
			}
		}
	}
	var rp gasPick
	var rfound bool
	if mf < sv.cm {
		rp, rfound, _ = sv.relaxFor(mf, target, aux)
		if rfound && rp.re >= need {
			ps.class = MachRelaxed
			sv.useSearched(ps, &rp, mf, tFlight)
			return
		}
	}
	switch {
	case matched && cok:
		ps.class = ReShort
		sv.usePick(ps, &cb, mf, tFlight, fm)
	case matched && !c.ok:
		ps.class, ps.limit = NoMatch, c.why
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

// useSearched fills ps from a setting found by searchMach: no limit when it
// reaches flight (minimum p0 when even that overshoots), otherwise the
// binding one.
func (sv *solver) useSearched(ps *pointSol, g *gasPick, mf, tFlight float64) {
	sv.usePick(ps, g, mf, tFlight, nil)
	if g.re >= ps.reFlight*(1-solveSlack) {
		ps.limit = LimitNone
		if g.over {
			ps.limit = LimitP0Min
		}
	}
}

// bandTopRe is the Reynolds number of maxOver over the Mach band of flight
// Mach number mf (machBand; -1 when the band is a single point or no Mach
// number in it is usable), from the column memo when it holds that band.
// Only the points it lets through (a full match in the band) search the
// band.
func (sv *solver) bandTopRe(mf float64, col *colMemo) float64 {
	if col != nil && col.bandM == mf {
		return col.bandRe
	}
	re := -1.0
	if lo, hi, ok := sv.machBand(mf); ok {
		if top, ok := sv.maxOver(lo, hi); ok {
			re = top.re
		}
	}
	if col != nil {
		col.bandM, col.bandRe = mf, re
	}
	return re
}

// relaxFor looks for the facility Mach number nearest flight, at or below
// the compressibility threshold, whose best setting reaches the flight
// Reynolds number target (Mach relaxed), by searchMach over the facility's
// usable range, with the highest setting of that range taken from the
// worker's memo (aux, when not nil) so that points that cannot reach it
// skip the search. found is false when no Mach number in the range is
// usable; hit reports that pick reaches target, otherwise pick is the
// range's highest setting.
func (sv *solver) relaxFor(mf, target float64, aux *pointAux) (pick gasPick, found, hit bool) {
	lo, hi := sv.f.MachMin, math.Min(sv.f.MachMax, sv.cm)
	if !(hi > lo) {
		return gasPick{}, false, false
	}
	var top *gasPick
	if aux != nil {
		if !aux.relaxDone {
			aux.relaxDone = true
			aux.relaxTop, aux.relaxOK = sv.maxOver(lo, hi)
		}
		if aux.relaxOK {
			top = &aux.relaxTop
		}
	}
	return sv.searchMach(lo, hi, mf, target, top)
}

// usePick fills ps from a chosen setting, with the binding limit when the
// setting falls short of flight.
func (sv *solver) usePick(ps *pointSol, g *gasPick, mf, tFlight float64, fm *fillMemo) {
	sv.fillGas(ps, &g.c, g.p0, g.t0, g.re, mf, tFlight, fm)
	ps.reMax, ps.pLim, ps.tLim = greaterOf(g.reMax, g.re), g.pLim, g.tLim
	if g.re < ps.reFlight*(1-solveSlack) {
		ps.limit = bindingLimit(g.pLim, g.tLim)
	}
}

// machBand is the range of facility Mach numbers that match flight Mach
// number mf within the Mach tolerance, [mf − MachTol, mf + MachTol] held
// within the facility range (each end the decimal it stands for, 2.56 for
// 2.55 + 0.01; see tidyDecimal); ok is false when it is a single point or
// empty.
func (sv *solver) machBand(mf float64) (lo, hi float64, ok bool) {
	lo = greaterOf(tidyDecimal(mf-sv.mTol), sv.f.MachMin)
	hi = lesserOf(tidyDecimal(mf+sv.mTol), sv.f.MachMax)
	return lo, hi, hi-lo > relaxTol
}

// searchMach looks in [lo, hi] for the facility Mach number nearest m0
// (held within the range) whose best setting reaches target, and returns
// the operator's setting there (relaxAt). The range is sampled at both
// ends exactly and at every multiple of relaxStep between them (so the
// samples inside do not depend on where the ends lie); when no sample
// reaches target, the highest setting of the range (maxOver) decides, and
// where even that reaches target (a peak narrower than the step) its Mach
// number stands in for the nearest sample. The Mach number is then located
// by bisection (at most relaxIter steps, to relaxTol) between m0 and the
// nearest Mach number that reaches.
//
// top, when not nil, is maxOver(lo, hi) already known; the search then
// skips what it can. If no Mach number reaches target, pick is that
// highest setting and hit is false; found is false when no Mach number in
// the range is usable.
func (sv *solver) searchMach(lo, hi, m0, target float64, top *gasPick) (pick gasPick, found, hit bool) {
	m0 = lesserOf(greaterOf(m0, lo), hi)
	reaches := func(M float64) (gasBounds, bool) {
		b := sv.bounds(M)
		_, _, _, _, ok := sv.tryHit(&b, target)
		return b, ok
	}
	if b, yes := reaches(m0); yes {
		return sv.relaxAt(&b, target), true, true
	}
	if top != nil && top.re < target*(1-solveSlack) {
		return *top, true, false
	}
	nearest, nearestD := math.NaN(), math.Inf(1)
	var samples [machSampleCap]float64
	for _, M := range machSamples(lo, hi, samples[:0]) {
		if _, yes := reaches(M); yes {
			if d := math.Abs(M - m0); d < nearestD {
				nearest, nearestD = M, d
			}
		}
	}
	if math.IsNaN(nearest) {
		if top == nil {
			t, ok := sv.maxOver(lo, hi)
			if !ok {
				return pick, false, false
			}
			top = &t
		}
		if top.re < target*(1-solveSlack) {
			return *top, true, false
		}
		if _, yes := reaches(top.c.M); !yes {
			return *top, true, false
		}
		nearest = top.c.M
	}
	fail, pass := m0, nearest
	for it := 0; it < relaxIter && math.Abs(pass-fail) > relaxTol; it++ {
		mid := 0.5 * (fail + pass)
		if _, yes := reaches(mid); yes {
			pass = mid
		} else {
			fail = mid
		}
	}
	b := sv.bounds(pass)
	return sv.relaxAt(&b, target), true, true
}

// machSampleCap bounds the number of Mach samples of one search: the whole
// range up to Mach 1 (the relaxed range lies below the compressibility
// threshold) at relaxStep, with both ends. Wider ranges are sampled at a
// coarser multiple of the step (machSamples).
const machSampleCap = int(1/relaxStep) + 3

// maxOver is the highest-Reynolds setting over facility Mach numbers
// lo..hi: the best of the samples of machSamples, refined by golden-section
// search where a higher value may lie between samples (see needsRefine).
// ok is false when no Mach number in the range is usable.
func (sv *solver) maxOver(lo, hi float64) (gasPick, bool) {
	var samples [machSampleCap]float64
	var res [machSampleCap]float64
	var lims [machSampleCap][2]Limit
	ms := machSamples(lo, hi, samples[:0])
	var best gasPick
	best.re = -1
	bestK := -1
	for k, M := range ms {
		b := sv.bounds(M)
		g, ok := sv.pickAt(&b)
		res[k], lims[k] = -1, [2]Limit{}
		if !ok {
			continue
		}
		res[k], lims[k] = g.re, [2]Limit{g.pLim, g.tLim}
		if g.re > best.re {
			best, bestK = g, k
		}
	}
	if bestK < 0 {
		return best, false
	}
	if a, b, ok := needsRefine(bestK, res[:len(ms)], lims[:len(ms)]); ok {
		best = sv.refineTop(ms[a], ms[b], best)
	}
	return best, true
}

// needsRefine says whether a higher value than the best sample (index k)
// may lie between samples, and between which: when the best is interior
// (the peak lies between its neighbours), or when a neighbour's best
// setting is bounded by other limits (the maximum may sit where the limits
// change over, e.g. where q max starts to bind). Between two samples on
// the same limits at the end of the range the best-setting Reynolds number
// is smooth, and the end sample stands for the peak to within the
// curvature over one step.
func needsRefine(k int, res []float64, lims [][2]Limit) (a, b int, ok bool) {
	n := len(res)
	if n < 2 {
		return 0, 0, false
	}
	if k > 0 && k < n-1 {
		return k - 1, k + 1, true
	}
	nb := 1
	if k == n-1 {
		nb = n - 2
	}
	if res[nb] < 0 || lims[nb] != lims[k] {
		return min(k, nb), max(k, nb), true
	}
	return 0, 0, false
}

// machSamples appends to buf the Mach numbers searchMach samples in
// [lo, hi]: lo, every multiple of the sample step strictly between, and hi,
// both ends exactly. (An end within a hundredth of a step of a multiple
// stands for that multiple.) The step is relaxStep, or for a range wider
// than machSampleCap samples allow, the smallest multiple of it that fits.
func machSamples(lo, hi float64, buf []float64) []float64 {
	buf = append(buf, lo)
	if !(hi > lo) {
		return buf
	}
	step := relaxStep
	for (hi-lo)/step > float64(machSampleCap-4) {
		step *= 2
	}
	endGap := 0.01 * step
	for k := math.Ceil(lo / step); ; k++ {
		M := k * step
		if M >= hi-endGap {
			break
		}
		if M > lo+endGap {
			buf = append(buf, M)
		}
	}
	return append(buf, hi)
}

// pickAt is the best setting on bounds b (see best) as a gasPick.
func (sv *solver) pickAt(b *gasBounds) (gasPick, bool) {
	g := gasPick{c: *b}
	var ok bool
	g.p0, g.t0, g.re, g.pLim, g.tLim, ok = sv.best(b)
	if !ok || !b.ok {
		return g, false
	}
	g.reMax = g.re
	return g, true
}

// refineTop improves top by a golden-section search for the highest
// best-setting Reynolds number between Mach numbers a and b, to relaxTol.
// The refined setting replaces top only where it is higher.
func (sv *solver) refineTop(a, b float64, top gasPick) gasPick {
	if !(b-a > relaxTol) {
		return top
	}
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	eval := func(M float64) gasPick {
		c := sv.bounds(M)
		g, ok := sv.pickAt(&c)
		if !ok {
			g.re = -1
		}
		return g
	}
	x1, x2 := b-invPhi*(b-a), a+invPhi*(b-a)
	g1, g2 := eval(x1), eval(x2)
	for it := 0; it < relaxIter && b-a > relaxTol; it++ {
		if g1.re >= g2.re {
			b, x2, g2 = x2, x1, g1
			x1 = b - invPhi*(b-a)
			g1 = eval(x1)
		} else {
			a, x1, g1 = x1, x2, g2
			x2 = a + invPhi*(b-a)
			g2 = eval(x2)
		}
	}
	for _, g := range [...]gasPick{g1, g2} {
		if g.re > top.re {
			top = g
		}
	}
	return top
}

// relaxAt is the operator's setting reaching target on bounds b, with the
// limits and the Reynolds number of the best setting there (reMax).
func (sv *solver) relaxAt(b *gasBounds, target float64) gasPick {
	g := gasPick{c: *b}
	g.p0, g.t0, g.re, g.over, _ = sv.tryHit(b, target)
	_, _, g.reMax, g.pLim, g.tLim, _ = sv.best(b)
	if g.over {
		g.pLim, g.tLim = LimitP0Min, LimitT0Max
	}
	return g
}

// fillGas completes the test-section state and the cautions of a gas
// setting. fm, when not nil, memoises the part that depends on the setting
// alone (used when the setting is the one it holds).
func (sv *solver) fillGas(ps *pointSol, c *gasBounds, p0, t0, re, mf, tFlight float64, fm *fillMemo) {
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
func (sv *solver) fillSetting(s *fillMemo, c *gasBounds, p0, t0 float64) {
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
	if sv.p0max > 0 && p0 >= NearLimitFraction*sv.p0max {
		fl |= FlagHighP0
	}
	if sv.qmax > 0 && s.q >= NearLimitFraction*sv.qmax {
		fl |= FlagQNearLimit
	}
	s.flags = fl
}

// gasSweep is the Reynolds range at the Mach number of c and stagnation
// pressure p0 (fixed dynamic pressure) as T0 runs over its allowed range.
func (sv *solver) gasSweep(c *gasBounds, p0 float64) (lo, hi float64) {
	tFloor, _ := sv.floorT0(c, p0)
	lo = sv.reAt(c, p0, sv.t0max)
	hi = sv.reAt(c, p0, tFloor)
	if sv.rpm > 0 {
		lim := sv.rpm * sv.L
		lo, hi = math.Min(lo, lim), math.Min(hi, lim)
	}
	return lo, hi
}

// solveWater: Mach number is not matched in a liquid, so only flight Mach
// numbers below the compressibility threshold are tried. The warmest water
// gives the lowest viscosity and the highest Reynolds number per speed;
// the lowest speed that reaches flight is taken, and if even the minimum
// speed overshoots, the water is cooled to bring the Reynolds number down.
func (sv *solver) solveWater(ps *pointSol, mf float64) {
	f := sv.f
	if !(mf < sv.cm) {
		ps.class, ps.limit = NoMatch, LimitIncompressible
		return
	}
	target := ps.reFlight
	need := (1 - sv.reTol) * target
	w := sv.hot
	vcap, vl := f.SpeedMax, LimitSpeedRange
	if sv.qmax > 0 {
		if vq := math.Sqrt(2 * sv.qmax / w.Density); vq < vcap {
			vcap, vl = vq, LimitQMax
		}
	}
	if sv.rpm > 0 {
		if vr := sv.rpm * w.KinematicViscosity; vr < vcap {
			vcap, vl = vr, LimitRePerM
		}
	}
	if vcap < f.SpeedMin {
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
		if V < f.SpeedMin {
			V = f.SpeedMin
			var over bool
			if w, over = sv.coolFor(V, target); over {
				ps.limit = LimitSpeedRange
			}
			if sv.qmax > 0 && 0.5*w.Density*V*V > sv.qmax {
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
	if sv.qmax > 0 && ps.q >= NearLimitFraction*sv.qmax {
		ps.flags |= FlagQNearLimit
	}
}

// coldestWithinQ is the coldest water, between cold (which breaks the
// dynamic-pressure limit at speed V) and the facility's warmest (which
// keeps it), that keeps it: bisection on the temperature, at most waterIter
// steps, to waterTolK.
func (sv *solver) coldestWithinQ(cold atmos.WaterState, V float64) atmos.WaterState {
	keep := sv.hot
	lo, hi := cold.Temperature, sv.hot.Temperature
	for it := 0; it < waterIter && hi-lo > waterTolK; it++ {
		w, err := sv.waterAt(0.5 * (lo + hi))
		if err != nil {
			break
		}
		if 0.5*w.Density*V*V > sv.qmax {
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
func (sv *solver) coolFor(V, target float64) (atmos.WaterState, bool) {
	want := math.Log(V * sv.L / target)
	if sv.cold.KinematicViscosity <= V*sv.L/target {
		return sv.cold, true
	}
	lo, hi := sv.f.T0Min, sv.f.T0Max
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

// waterSweep is the Reynolds range at dynamic pressure q as the water
// temperature runs over the facility range (speed from q, within the
// speed range and the unit Reynolds cap).
func (sv *solver) waterSweep(q float64) (lo, hi float64) {
	re := func(T float64) float64 {
		w, err := sv.waterAt(T)
		if err != nil {
			return 0
		}
		v := math.Min(math.Sqrt(2*q/w.Density), sv.f.SpeedMax)
		r := v * sv.L / w.KinematicViscosity
		if sv.rpm > 0 {
			r = math.Min(r, sv.rpm*sv.L)
		}
		return r
	}
	a, b := re(sv.f.T0Min), re(sv.f.T0Max)
	return math.Min(a, b), math.Max(a, b)
}

func peakMach(f *Facility) float64 {
	if f.PeakLocalMach > 0 {
		return f.PeakLocalMach
	}
	return DefaultPeakLocalMach
}

// fitMach is the Mach number the model is sized for: the highest inside
// flight Mach number, held within the facility's Mach range (gas); 0 for
// water.
func fitMach(g *Grid, f *Facility) float64 {
	if f.Medium == MediumWater {
		return 0
	}
	return greaterOf(lesserOf(g.maxMach, f.MachMax), f.MachMin)
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

// checkFacility checks what the engine needs of a facility.
func checkFacility(f *Facility) error {
	bad := func(field string, v float64, want string) error {
		return fmt.Errorf("%s %g: want %s", field, v, want)
	}
	for _, x := range []struct {
		name string
		v    float64
	}{{"Mach min", f.MachMin}, {"Mach max", f.MachMax}, {"speed min", f.SpeedMin}, {"speed max", f.SpeedMax},
		{"p0 min", f.P0Min}, {"p0 max", f.P0Max}, {"T0 min", f.T0Min}, {"T0 max", f.T0Max}, {"q max", f.QMax},
		{"minimum static temperature", f.MinStaticT}, {"peak local Mach", f.PeakLocalMach},
		{"max unit Reynolds number", f.MaxReynoldsPerM}, {"model scale", f.Model.Scale}} {
		if !isFiniteNum(x.v) || x.v < 0 {
			return bad(x.name, x.v, "a finite, non-negative number")
		}
	}
	if f.T0Max < f.T0Min {
		return fmt.Errorf("T0 max %g K is below T0 min %g K", f.T0Max, f.T0Min)
	}
	switch f.Medium {
	case MediumWater:
		if !(f.SpeedMax > 0) || f.SpeedMin > f.SpeedMax {
			return fmt.Errorf("speed range %g–%g m/s: want 0 ≤ min ≤ max, max > 0", f.SpeedMin, f.SpeedMax)
		}
		if f.T0Min < atmos.WaterMinTemperature || f.T0Max > atmos.WaterMaxTemperature {
			return fmt.Errorf("water temperature range %g–%g K: want within %g–%g K",
				f.T0Min, f.T0Max, atmos.WaterMinTemperature, atmos.WaterMaxTemperature)
		}
	case MediumAir, MediumNitrogen:
		if !(f.MachMax > 0) || f.MachMin > f.MachMax {
			return fmt.Errorf("Mach range %g–%g: want 0 ≤ min ≤ max, max > 0", f.MachMin, f.MachMax)
		}
		if !(f.P0Max > 0) || f.P0Min > f.P0Max {
			return fmt.Errorf("p0 range %g–%g Pa: want 0 ≤ min ≤ max, max > 0", f.P0Min, f.P0Max)
		}
		if !(f.T0Min > 0) {
			return bad("T0 min", f.T0Min, "a positive temperature in K")
		}
	default:
		return fmt.Errorf("medium %d: want air, nitrogen or water", f.Medium)
	}
	return nil
}

// lesserOf and greaterOf are math.Min and math.Max for operands known not
// to be NaN, without their special-case cost in the per-point loop.
func lesserOf(a, b float64) float64 {
	if a < b {
		return a
	}
	return b
}

func greaterOf(a, b float64) float64 {
	if a > b {
		return a
	}
	return b
}
