package envelope

import (
	"context"
	"errors"
	"fmt"
	"reflect"
	"runtime"
	"sync"
)

// PlanningNote is attached to every facility detail: the engine plans,
// it does not authorise runs.
const PlanningNote = "Planning estimate only: confirm settings with the facility's own operating procedures, " +
	"pressure-vessel and model-load ratings, local codes and licensed engineering review before any run."

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

	// Rule is the operating rule the map was solved under (RuleInForce).
	Rule OperatingRule
	// LoadQ is the test-section dynamic pressure at which the model of
	// this scale reaches the balance capacity (0: the balance is not
	// checked: no capacity, or no load coefficient for it); it caps q like
	// q max.
	LoadQ float64
	loads loadModel

	Results []Result

	sv solver
	// solved: Results are as Solve made them, Outside exactly at the
	// points outside the envelope, with shares counted while solving.
	solved bool
	shares Shares
	// reused: Results was handed in (SolveReusing), so outside points are
	// written too; a new array is left zero (Outside) there, so that its
	// pages outside the envelope are never touched (a coverage report of
	// a large grid keeps less resident).
	reused bool
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
	// Rule is the operating rule that picked the setting.
	Rule OperatingRule

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

	// Set is the matching set at the test Mach number: every setting that
	// gives the same Reynolds number as the best the facility does there
	// (the flight Reynolds number where it reaches it), with what bounds
	// each end.
	Set MatchingSet
	// Load is the model load at the setting, with its share of the
	// balance capacity (zero without load data).
	Load Load

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
// The solver of the facility's medium does the work (solver.go). Gas
// facilities (gasSolver): at the target Mach number the test-section
// static state follows from the isentropic relations, and the Reynolds
// number from Sutherland's law, so for each Mach number the limits (p0 and
// T0 ranges, dynamic pressure, static temperature, saturation line, unit
// Reynolds number) are solved jointly in (p0, T0) in closed form. Of the
// settings that reach the flight Reynolds number the operating rule in
// force (RuleInForce: s.Rule, else the facility's) picks one: by default
// the warmest T0, then the lowest p0. Water facilities (waterSolver):
// by default the warmest water (lowest viscosity), then the lowest speed.
//
// Where the vehicle gives load coefficients and the facility a balance
// capacity, the balance caps the test-section dynamic pressure at LoadQ
// (loads.go), a constraint like q max that binds as LimitBalanceLoad.
//
// The day (DeltaT) and regime thresholds are the grid's; of s, Solve uses
// the scale override, the tolerances and the rule. The model scale is
// s.Scale if set, else the facility's Model.Scale, else the largest that
// fits (FitScale).
func Solve(g *Grid, f *Facility, s Settings) (*Map, error) {
	return SolveReusing(context.Background(), g, f, s, nil)
}

// SolveReusing is Solve writing the results into buf when it holds enough
// (every point is written, outside ones too), so that a caller solving
// again and again (the interface's what-ifs) need not allocate, clear and
// collect a new array each time. buf must not be used by anything else
// any more; with a nil or short buf a new array is made. When ctx ends
// first (a newer what-if made this map stale) it stops between blocks of
// rows and returns ctx's error.
func SolveReusing(ctx context.Context, g *Grid, f *Facility, s Settings, buf []Result) (*Map, error) {
	return SolveStaged(ctx, g, f, s, buf, Window{}, nil)
}

// SolveStaged is SolveReusing solving the points of window first before
// the others, for an interface that shows some points and would show
// them as soon as they are done: once they are, it calls ready with a
// copy of the map whose results are final in the window alone, and goes
// on with the rest. The copy's other points are being written while ready
// runs and after it returns, until SolveStaged returns: the copy may be
// read in the window only, and its shares are not counted yet. The rest
// is solved as work no one waits for, letting the program's other
// goroutines run between blocks. With ready nil, or the window empty or
// the whole grid, it is SolveReusing and ready is not called.
func SolveStaged(ctx context.Context, g *Grid, f *Facility, s Settings, buf []Result, first Window, ready func(*Map)) (*Map, error) {
	m, err := newMap(g, f, s, buf)
	if err != nil {
		return nil, err
	}
	// Points are independent: blocks are solved side by side, each result
	// written to its own slot, so the map is the same as a point-by-point
	// solve.
	var mu sync.Mutex // guards the counts while workers add theirs
	var counts [NumClasses]int
	pass := func(blocks []block, background bool) bool {
		return forBlocks(ctx, blocks, runtime.GOMAXPROCS(0), background, func() func(b block) {
			solve := m.sv.rowSolver(len(g.Speeds))
			return func(b block) {
				n := solve(m, b)
				mu.Lock()
				for c := range n {
					counts[c] += n[c]
				}
				mu.Unlock()
			}
		})
	}
	var early func()
	if ready != nil {
		early = func() {
			cp := *m
			ready(&cp)
		}
	}
	if !inStages(first, len(g.Alts), len(g.Speeds), rowBlockSize(len(g.Alts)), early, pass) {
		return nil, ctx.Err()
	}
	m.finish(counts)
	return m, nil
}

// newMap makes the map of facility f on g under s, ready to be solved:
// its solver, model scale and balance cap set, its results in buf when
// it holds enough (see SolveReusing).
func newMap(g *Grid, f *Facility, s Settings, buf []Result) (*Map, error) {
	if g == nil || f == nil {
		return nil, errors.New("solve: need a grid and a facility")
	}
	if err := checkSettings(s); err != nil {
		return nil, fmt.Errorf("solve %q: %w", f.Name, err)
	}
	sv, err := newSolver(f, s, g.Regimes)
	if err != nil {
		return nil, fmt.Errorf("solve %q: %w", f.Name, err)
	}
	m := &Map{Grid: g, Facility: f, Settings: s, sv: sv, Rule: RuleInForce(f, s), loads: newLoadModel(g.Vehicle, f)}
	m.FitScale, m.FitRule = FitScale(g.Vehicle, f, sv.fitMach(g.maxMach))
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
	sv.setModelLength(m.Scale * g.Vehicle.RefLength)
	m.LoadQ = m.loads.qCap(m.Scale)
	sv.setLoadCap(m.LoadQ)
	if cap(buf) >= len(g.points) {
		m.Results, m.reused = buf[:len(g.points)], true
	} else {
		m.Results = make([]Result, len(g.points))
	}
	return m, nil
}

// finish records the class counts of the solved inside points (from the
// row solvers) as the map's shares, and marks it solved.
func (m *Map) finish(counts [NumClasses]int) {
	m.shares.Count = counts
	m.shares.Total = len(m.Results)
	m.shares.Inside = m.Grid.inside
	m.shares.Count[Outside] = m.shares.Total - m.shares.Inside
	m.solved = true
}

// At returns the stored result of point (i, j).
func (m *Map) At(i, j int) Result { return m.Results[m.Grid.Index(i, j)] }

// StoredBytes is the memory the map holds for its results (28 bytes per
// point).
func (m *Map) StoredBytes() int { return len(m.Results) * int(reflect.TypeFor[Result]().Size()) }

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
	var d Detail
	m.DetailFrom(&d, &fd, i, j)
	if fd.Inside {
		d.Cautions = cautions(&d, m.Facility)
	}
	return d, nil
}

// DetailFrom writes into d what Detail gives for point (i, j) but the
// cautions, which it leaves nil, from fd, the point's flight side as
// m.Grid.FlightDetail(i, j) gives it. It is for callers that answer many
// points and show no caution texts, or write them in units of their own
// (Cautions): the exports build a record per point and facility, and the
// SI caution texts, formatted with fmt, were a tenth of the CSV export's
// time (BenchmarkExportCSV400) for text it never writes. d is written
// whole, so one Detail serves point after point with no allocation.
func (m *Map) DetailFrom(d *Detail, fd *FlightDetail, i, j int) {
	*d = Detail{
		Flight:      *fd,
		Facility:    m.Facility.Name,
		Medium:      m.Facility.Medium,
		Scale:       m.Scale,
		ModelLength: m.Scale * m.Grid.Vehicle.RefLength,
		Rule:        m.Rule,
		FlightT0:    fd.T0,
	}
	if !fd.Inside {
		d.Class = Outside
		return
	}
	r := &m.Grid.points[m.Grid.Index(i, j)]
	ps := m.sv.solve(r.mach, r.re, fd.State.Temperature, true)
	d.Class, d.Limit, d.Flags = ps.class, ps.limit, ps.flags
	d.PressureLimit, d.TemperatureLimit = ps.pLim, ps.tLim
	d.HasSettings = ps.has
	d.Mach, d.P0, d.T0 = ps.mach, ps.p0, ps.t0
	d.P, d.T, d.V, d.Q, d.Density, d.Viscosity = ps.p, ps.t, ps.v, ps.q, ps.rho, ps.mu
	d.Re, d.ReFlight, d.ReRatio, d.DCf, d.ReMax = ps.re, ps.reFlight, ps.ratio, ps.dcf, ps.reMax
	if ps.has && ps.mu > 0 {
		d.RePerM = ps.rho * ps.v / ps.mu
	}
	m.sv.addDetail(d, ps)
	if ps.has && m.loads.forcePerQ+m.loads.momentPerQ > 0 {
		d.Load = m.loads.at(ps.q, m.Scale)
	}
	sm := m.sizeMach(r.mach, ps.has, ps.mach)
	d.Flags |= m.sizeFlag(sm)
	if d.Flags.Has(FlagModelTooLarge) {
		d.SectionFit, d.SectionFitRule = m.fit.at(sm)
	}
}

// LoadShare is the model load of result r as a share of the balance
// capacity (the larger of normal force and pitching moment over theirs),
// 0 where the balance is not checked or r has no setting. The load is
// proportional to q at a given scale, so it is r.Q over LoadQ: a layer can
// be drawn from the stored results without another solve.
func (m *Map) LoadShare(r Result) float64 {
	if !(m.LoadQ > 0) || r.Class == Outside {
		return 0
	}
	return float64(r.Q) / m.LoadQ
}

// ReynoldsRange is the span of model Reynolds numbers the map's gas
// facility reaches at test Mach number mach with the map's model: from the
// lowest setting (P0Min at T0Max, within the unit-Reynolds cap) to the
// best setting within every limit. ok is false for a water facility, for a
// Mach number outside the facility range, and where no setting exists.
func (m *Map) ReynoldsRange(mach float64) (lo, hi float64, ok bool) {
	if m.sv == nil {
		return 0, 0, false
	}
	return m.sv.reynoldsRange(mach)
}

// ReRange is the span of model Reynolds numbers a facility reaches at one
// test Mach number with its model: from the lowest setting (P0Min at
// T0Max) to the highest (ReMax of Detail), within every limit. Lo is 0
// when the facility sets no lower p0 limit.
type ReRange struct {
	Mach   float64
	Lo, Hi float64
}

// ReachableRe samples the Reynolds range of the map's facility at the
// map's model scale: for a gas facility at samples (at least 2) test Mach
// numbers evenly over its Mach range, leaving out those where no setting
// exists (ReynoldsRange at each); for a water tunnel the band it spans, at
// flight Mach 0 and at the compressibility threshold, where it matches
// with Mach relaxed.
func (m *Map) ReachableRe(samples int) []ReRange {
	if m.sv == nil {
		return nil
	}
	return m.sv.reachableRe(max(samples, 2))
}
