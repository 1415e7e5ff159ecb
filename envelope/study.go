package envelope

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"sync"
)

// The model-scale study: for one facility, the match-class shares, the
// union coverage with the other facilities and the Reynolds-ratio
// quantiles as a function of model scale, from a small model up to beyond
// the largest the test section takes (FitScale) and the balance takes
// (BalanceScaleEnvelope), with both limits marked.
//
// How it avoids solving the grid once per scale: Solve decides a point by
// comparing a few best settings' Reynolds numbers with (1 − ReTol) of the
// flight Reynolds number (study_reach.go). Those settings depend on the
// flight Mach number alone, and at a fixed setting the model Reynolds
// number is proportional to the model length, so their Reynolds numbers at
// scale s are s times those at scale 1: they are found once per flight
// Mach number (on a Mach grid, once per column), and each scale is then a
// comparison per point. That holds wherever the balance cannot bind: no
// load data, or a load cap (Map.LoadQ, falling as 1/s² or 1/s³) at or
// above the highest dynamic pressure the facility runs. Where it can bind
// the best settings are found again at that scale, once per flight Mach
// number, with the cap in force. A point whose comparison lies within a
// rounding (studyMargin) of its target is solved at that scale by the
// solver itself, so the class at each scale is the class Solve gives there.

// DefaultStudySteps is the number of log-spaced scale steps of a study
// when StudyOptions leaves it out.
const DefaultStudySteps = 40

// MaxStudySteps bounds StudyOptions.Steps.
const MaxStudySteps = 1000

// The default scale range of a study runs from studyLow to studyHigh times
// the facility's largest model (its fit scale, else the scale in force):
// from a small model (a twentieth of the section's largest) to half as
// large again as the section takes, so that what lies beyond the limit
// shows (planning choices of the tool, not a rule of the trade).
const (
	studyLow  = 1.0 / 20
	studyHigh = 1.5
)

// studyMargin is the relative distance from its target within which a
// point's comparison is left to the solver at that scale: far above the
// rounding of the scale-1 shortcut (a few units in the last place), far
// below any tolerance a user sets.
const studyMargin = 1e-9

// StudyQuantiles are the shares of points at or below which the
// Reynolds-ratio quantiles of a study lie (ScaleStep.ReRatio).
var StudyQuantiles = [3]float64{0.1, 0.5, 0.9}

// StudyOptions choose the scales of a study. The zero value is
// DefaultStudySteps log-spaced steps over the default range.
type StudyOptions struct {
	// Steps is the number of log-spaced scales (0: DefaultStudySteps;
	// at least 2, at most MaxStudySteps).
	Steps int
	// Min and Max are the ends of the range (0: the default range, from
	// a twentieth of the facility's largest model to 1.5 times it).
	Min, Max float64
}

// StepMark says what is special about a scale step.
type StepMark uint8

// Step marks.
const (
	// MarkInForce: the scale the facility is evaluated at (Map.Scale).
	MarkInForce StepMark = 1 << iota
	// MarkFitLimit: the largest scale the section takes (Map.FitScale).
	MarkFitLimit
	// MarkBalanceLimit: the largest scale the balance takes at every
	// point it lets be a full match (BalanceScale.Max).
	MarkBalanceLimit
	// MarkBeyondFit, MarkBeyondBalance: above that limit. The classes are
	// still those of a model of that scale, as if it could be run.
	MarkBeyondFit
	MarkBeyondBalance
)

// Has reports whether m has every mark of x.
func (m StepMark) Has(x StepMark) bool { return m&x == x }

// Beyond reports whether the step lies above the fit or the balance limit.
func (m StepMark) Beyond() bool { return m&(MarkBeyondFit|MarkBeyondBalance) != 0 }

// ScaleStep is the study at one model scale.
type ScaleStep struct {
	Scale float64
	Mark  StepMark
	// Shares are the facility's class counts at this scale, as Solve
	// counts them.
	Shares Shares
	// Union is the share of inside points matched (full match or Mach
	// relaxed) by this facility at this scale or by at least one of the
	// other facilities at the scale each is evaluated at.
	Union float64
	// Reached counts the inside points where the facility has a setting
	// at all (the population of ReRatio).
	Reached int
	// ReRatio are the quantiles at StudyQuantiles (nearest rank) of the
	// reach ratio over those points: the highest model Reynolds number
	// the facility gives at the point, at any Mach number Solve may use
	// there (within the Mach tolerance of flight, or the relaxed range
	// where Mach number may be relaxed), over the flight Reynolds number.
	// Above 1 it shows the margin; a point is matched where it is at least
	// 1 − ReTol. NaN when Reached is 0.
	ReRatio [len(StudyQuantiles)]float64
}

// ScaleStudy is the model-scale study of one facility.
type ScaleStudy struct {
	Facility string
	Medium   Medium
	Inside   int
	// Scale and ScaleRule are the scale the facility is evaluated at and
	// where it comes from (Map.Scale, Map.ScaleRule).
	Scale     float64
	ScaleRule string
	// FitScale is the largest scale the section takes by the span and
	// blockage rules (0: unknown), FitRule the rule that decides it.
	FitScale float64
	FitRule  string
	// BalanceChecked says the balance is checked (BalanceChecked), and
	// Balance is the largest scale it takes (BalanceScaleEnvelope; Max
	// +Inf where it is not checked, or where no point is a full match
	// within it: see Open and Closed).
	BalanceChecked bool
	Balance        BalanceScale
	// Others is the number of other facilities the union counts.
	Others int
	Steps  []ScaleStep
	// Best is the index of the step with the highest matched share among
	// those within both limits (the smallest scale on a tie), -1 when no
	// step within them matches any point.
	Best int
}

// BalanceLimit is the balance's scale limit and whether there is one: a
// finite BalanceScale.Max over at least one point it lets be a full match.
func (st *ScaleStudy) BalanceLimit() (float64, bool) {
	b := st.Balance
	return b.Max, b.Open > 0 && !math.IsInf(b.Max, 1)
}

// BalanceChecked reports whether the model of vehicle v is checked against
// facility f's balance: a capacity with the load coefficient it takes (a
// normal force with CNMax, a pitching moment with CmMax).
func BalanceChecked(v *Vehicle, f *Facility) bool { return newLoadModel(v, f).checks() }

// StudyMap studies the facility of map m (solved by Solve) over model
// scale; others are the maps of the other facilities on the same grid,
// which the union counts at their own scales (nil maps, m itself and maps
// of another grid are left out). It is safe to call while m is in use:
// it solves with solvers of its own.
func StudyMap(m *Map, others []*Map, opt StudyOptions) (*ScaleStudy, error) {
	if m == nil || m.Grid == nil || m.Facility == nil || m.sv == nil {
		return nil, errors.New("scale study: need a map made by Solve")
	}
	return studyMap(m, newMatchCount(m.Grid, others, m), opt)
}

// matchCount counts per grid point the maps that match it (full match or
// Mach relaxed), for the union of a study; self is the studied map when
// it is among them.
type matchCount struct {
	n    []uint16
	maps int
	self *Map
}

// newMatchCount counts the matches of maps on grid g, leaving out nil
// maps, maps of another grid and skip.
func newMatchCount(g *Grid, maps []*Map, skip *Map) *matchCount {
	mc := &matchCount{}
	for _, o := range maps {
		if o == nil || o == skip || o.Grid != g || len(o.Results) != g.Len() || mc.maps == math.MaxUint16 {
			continue
		}
		mc.maps++
		if mc.n == nil {
			mc.n = make([]uint16, g.Len())
		}
		for k := range o.Results {
			if c := o.Results[k].Class; c == FullMatch || c == MachRelaxed {
				mc.n[k]++
			}
		}
	}
	return mc
}

// others reports whether a map other than m matches point k.
func (mc *matchCount) others(m *Map, k int) bool {
	if mc.n == nil {
		return false
	}
	n := mc.n[k]
	if mc.self == m {
		if c := m.Results[k].Class; c == FullMatch || c == MachRelaxed {
			n--
		}
	}
	return n > 0
}

// studyMap is StudyMap with the matches of the union counted.
func studyMap(m *Map, mc *matchCount, opt StudyOptions) (*ScaleStudy, error) {
	sc, err := newStudier(m, mc)
	if err != nil {
		return nil, fmt.Errorf("scale study of %q: %w", m.Facility.Name, err)
	}
	st := &ScaleStudy{
		Facility: m.Facility.Name, Medium: m.Facility.Medium, Inside: m.Grid.InsideCount(),
		Scale: m.Scale, ScaleRule: m.ScaleRule, FitScale: m.FitScale, FitRule: m.FitRule,
		BalanceChecked: sc.loads.checks(), Balance: BalanceScaleEnvelope(m.Grid, m.Facility, m.Settings), Others: sc.others,
	}
	bal, balOK := st.BalanceLimit()
	if !balOK {
		bal = 0
	}
	scales, marks, err := studyScales(opt, m.Scale, m.FitScale, bal)
	if err != nil {
		return nil, fmt.Errorf("scale study of %q: %w", m.Facility.Name, err)
	}
	st.Steps = make([]ScaleStep, len(scales))
	var buf []float64
	for k, s := range scales {
		st.Steps[k], buf = sc.step(s, buf, nil)
		st.Steps[k].Mark = marks[k]
	}
	st.Best = bestStep(st.Steps)
	return st, nil
}

// Study is StudyMap of facility k of the evaluation, with the others of
// the evaluation in the union. It is the call for one facility's study
// panel (safe to run beside the interface's use of the maps): on the
// demo's 400×400 grid it takes a few milliseconds without load data, about
// one solve of the facility (BenchmarkStudy400 studies all six); with load
// data the balance's window search (BalanceScaleEnvelope) adds to it.
func (e *Evaluation) Study(k int, opt StudyOptions) (*ScaleStudy, error) {
	if k < 0 || k >= len(e.Facilities) {
		return nil, fmt.Errorf("scale study: facility %d of %d", k+1, len(e.Facilities))
	}
	if e.Maps[k] == nil {
		return nil, fmt.Errorf("scale study: %s was not evaluated: %w", e.Facilities[k].Name, e.Errs[k])
	}
	return StudyMap(e.Maps[k], e.Maps, opt)
}

// StudyAll studies every facility that was evaluated, side by side: per
// facility its study, or nil with the error (a facility not evaluated
// keeps its evaluation error).
func (e *Evaluation) StudyAll(opt StudyOptions) ([]*ScaleStudy, []error) {
	out := make([]*ScaleStudy, len(e.Facilities))
	errs := make([]error, len(e.Facilities))
	// The matches of every facility are counted once for all the unions.
	mc := newMatchCount(e.Grid, e.Maps, nil)
	var wg sync.WaitGroup
	for k := range e.Facilities {
		m := e.Maps[k]
		if m == nil || m.sv == nil {
			out[k], errs[k] = e.Study(k, opt) // its error
			continue
		}
		wg.Go(func() {
			own := *mc
			own.self = m
			out[k], errs[k] = studyMap(m, &own, opt)
		})
	}
	wg.Wait()
	return out, errs
}

// bestStep is the index of the step with the highest matched share within
// both limits, the smallest scale on a tie; -1 when no step within them
// matches any point.
func bestStep(steps []ScaleStep) int {
	best := -1
	for k := range steps {
		if steps[k].Mark.Beyond() || !(steps[k].Shares.Matched() > 0) {
			continue
		}
		if best < 0 || steps[k].Shares.Matched() > steps[best].Shares.Matched() {
			best = k
		}
	}
	return best
}

// studyScales are the scales of a study with their marks: opt.Steps
// log-spaced scales, each rounded to three significant digits (so that the
// scale shown is the scale studied), with the scale in force, the fit
// limit and the balance limit (0: none) added where they lie in the range.
func studyScales(opt StudyOptions, inForce, fit, bal float64) ([]float64, []StepMark, error) {
	n := opt.Steps
	if n == 0 {
		n = DefaultStudySteps
	}
	if n < 2 || n > MaxStudySteps {
		return nil, nil, fmt.Errorf("%d scale steps: want 2 to %d", n, MaxStudySteps)
	}
	top := fit
	if !(top > 0) {
		top = inForce
	}
	lo, hi := min(studyLow*top, inForce/2), min(max(studyHigh*top, studyHigh*inForce), maxModelScale)
	b := ModelScaleBound()
	for _, x := range []struct {
		v   *float64
		set float64
	}{{&lo, opt.Min}, {&hi, opt.Max}} {
		if x.set == 0 {
			continue
		}
		if err := b.Check(numberText(x.set), x.set); err != nil {
			return nil, nil, err
		}
		*x.v = x.set
	}
	if !(lo < hi) {
		return nil, nil, fmt.Errorf("scale range %s to %s: want the smaller first", numberText(lo), numberText(hi))
	}
	var scales []float64
	for k := range n {
		s := lo * math.Pow(hi/lo, float64(k)/float64(n-1))
		if k == 0 {
			s = lo
		} else if k == n-1 {
			s = hi
		}
		s = threeDigits(s)
		if len(scales) == 0 || s > scales[len(scales)-1] {
			scales = append(scales, s)
		}
	}
	marks := make([]StepMark, len(scales))
	add := func(s float64, mk StepMark) {
		if !(s >= lo*(1-1e-9) && s <= hi*(1+1e-9)) {
			return
		}
		k, found := slices.BinarySearch(scales, s)
		if found {
			marks[k] |= mk
			return
		}
		scales = slices.Insert(scales, k, s)
		marks = slices.Insert(marks, k, mk)
	}
	add(inForce, MarkInForce)
	if fit > 0 {
		add(fit, MarkFitLimit)
	}
	if bal > 0 {
		add(bal, MarkBalanceLimit)
	}
	for k, s := range scales {
		if fit > 0 && !fitsWithin(s, fit) {
			marks[k] |= MarkBeyondFit
		}
		if bal > 0 && !fitsWithin(s, bal) {
			marks[k] |= MarkBeyondBalance
		}
	}
	return scales, marks, nil
}

// threeDigits rounds x > 0 to three significant digits.
func threeDigits(x float64) float64 {
	v, err := strconv.ParseFloat(strconv.FormatFloat(x, 'g', 3, 64), 64)
	if err != nil {
		return x
	}
	return v
}

// studier holds what a facility's study reuses from scale to scale.
type studier struct {
	g      *Grid
	f      *Facility
	s      Settings
	loads  loadModel
	qTop   float64 // balance caps at or above it bind nowhere
	others int

	// pts are the inside points, grouped by flight Mach number (group j
	// is pts[start[j]:start[j+1]]) and, within a group, by target
	// ascending; otherPre[i] counts the points before pts[i] that another
	// facility matches.
	pts      []studyPt
	start    []int
	otherPre []int32
	// mach are the groups' flight Mach numbers; one are their reaches at
	// scale 1 without the balance cap, and relax1, relaxOK1 the relaxed
	// range's.
	mach     []float64
	one      []pointReach
	relax1   float64
	relaxOK1 bool
	// reached1 counts the points that have a setting where the balance
	// does not bind, and quant1 are the quantiles of their reach ratios at
	// scale 1: at scale s the ratios are s times as large, and so are
	// their quantiles.
	reached1 int
	quant1   [len(StudyQuantiles)]float64
	work     []pointReach // reaches at one scale with the balance cap
}

// studyPt is one inside point of the study.
type studyPt struct {
	need, re float64 // (1 − ReTol) of the flight Reynolds number, and it
	k        int32   // grid index
	other    bool    // matched by another facility at its scale
}

func newStudier(m *Map, mc *matchCount) (*studier, error) {
	g, f, s := m.Grid, m.Facility, m.Settings
	sv, err := newSolver(f, s, g.Regimes)
	if err != nil {
		return nil, err
	}
	sv.setModelLength(g.Vehicle.RefLength)
	sc := &studier{g: g, f: f, s: s, loads: m.loads, qTop: sv.topQ(), others: mc.maps}
	if mc.self == m {
		sc.others--
	}
	// Group the inside points by flight Mach number (a counting sort),
	// then order each group by target.
	at := map[float64]int{}
	grp := make([]int32, g.Len())
	var count []int
	// On a Mach grid a column shares its flight Mach number: the group of
	// the point above is tried first.
	cols := len(g.Speeds)
	colMach, colGrp := make([]float64, cols), make([]int, cols)
	for j := range colMach {
		colMach[j] = math.NaN()
	}
	for k := range g.points {
		r := &g.points[k]
		if r.excl != InEnvelope {
			continue
		}
		c := k % cols
		j := colGrp[c]
		if r.mach != colMach[c] {
			var seen bool
			if j, seen = at[r.mach]; !seen {
				j = len(sc.mach)
				at[r.mach] = j
				sc.mach = append(sc.mach, r.mach)
				count = append(count, 0)
			}
			colMach[c], colGrp[c] = r.mach, j
		}
		grp[k] = int32(j)
		count[j]++
	}
	sc.start = make([]int, len(sc.mach)+1)
	for j, n := range count {
		sc.start[j+1] = sc.start[j] + n
	}
	sc.pts = make([]studyPt, sc.start[len(sc.mach)])
	fill := slices.Clone(sc.start[:len(sc.mach)])
	for k := range g.points {
		r := &g.points[k]
		if r.excl != InEnvelope {
			continue
		}
		j := grp[k]
		sc.pts[fill[j]] = studyPt{need: (1 - s.ReTol) * r.re, re: r.re, k: int32(k), other: mc.others(m, k)}
		fill[j]++
	}
	sc.otherPre = make([]int32, len(sc.pts)+1)
	for j := range sc.mach {
		ps := sc.pts[sc.start[j]:sc.start[j+1]]
		slices.SortFunc(ps, func(a, b studyPt) int { return cmpFloat(a.need, b.need) })
	}
	for i := range sc.pts {
		sc.otherPre[i+1] = sc.otherPre[i]
		if sc.pts[i].other {
			sc.otherPre[i+1]++
		}
	}
	sc.one = sc.reachAll(sv, nil)
	sc.relax1, sc.relaxOK1 = sv.relaxReach()
	ratios := sc.ratios(sc.one, sc.relax1, sc.relaxOK1, 1, make([]float64, 0, len(sc.pts)))
	sc.reached1 = len(ratios)
	sc.quant1 = quantilesOf(ratios)
	return sc, nil
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// reachAll is the reach of solver sv at every flight Mach number of the
// groups, into buf.
func (sc *studier) reachAll(sv solver, buf []pointReach) []pointReach {
	buf = slices.Grow(buf[:0], len(sc.mach))[:len(sc.mach)]
	for j, mf := range sc.mach {
		buf[j] = sv.reach(mf)
	}
	return buf
}

// ratios appends to buf the reach ratio of every point that has a
// setting, with reaches reach times mult.
func (sc *studier) ratios(reach []pointReach, relax float64, relaxOK bool, mult float64, buf []float64) []float64 {
	for j := range sc.mach {
		for i := sc.start[j]; i < sc.start[j+1]; i++ {
			if x := reachRatio(&sc.pts[i], &reach[j], relax, relaxOK, mult); x > 0 {
				buf = append(buf, x)
			}
		}
	}
	return buf
}

// solverAt is the solver Solve uses at scale s: model length s times the
// vehicle's reference length, and the balance cap of that scale.
func (sc *studier) solverAt(s float64) solver {
	sv, err := newSolver(sc.f, sc.s, sc.g.Regimes)
	if err != nil {
		panic("scale study: the solver made once fails at another scale: " + err.Error())
	}
	sv.setModelLength(s * sc.g.Vehicle.RefLength)
	sv.setLoadCap(sc.loads.qCap(s))
	return sv
}

// step studies scale s: the class counts, the union and the reach-ratio
// quantiles. buf is reused for the ratios and returned; classes, when not
// nil, receives each inside point's class by grid index (for tests).
//
// Within a group (one flight Mach number) the classes follow the targets
// in order, as Solve decides them: a full match where the full reach is
// at least the target, else Mach relaxed where the relaxed reach is (and
// Mach number may be relaxed), else Reynolds short where there is a best
// setting at the flight Mach number, else out of reach. A band of points
// within studyMargin of a threshold is left to the solver, and with ReTol
// about 0 every relaxed point (a relaxed match then hinges on a setting
// that hits flight exactly, which rounding decides). So each group costs
// a few binary searches, plus one solve per point in a band.
func (sc *studier) step(s float64, buf []float64, classes []Class) (ScaleStep, []float64) {
	st := ScaleStep{Scale: s}
	// Where the balance cannot bind the scale-1 reaches serve, scaled.
	linear := !sc.loads.checks() || sc.loads.qCap(s) >= sc.qTop
	reach, relax, relaxOK, mult := sc.one, sc.relax1, sc.relaxOK1, s
	var exact solver
	if !linear {
		exact = sc.solverAt(s)
		sc.work = sc.reachAll(exact, sc.work)
		reach, mult = sc.work, 1
		relax, relaxOK = exact.relaxReach()
	}
	coin := sc.s.ReTol < studyMargin
	var n [NumClasses]int
	union := 0
	cols := len(sc.g.Speeds)
	hiM, loM := 1+studyMargin, 1-studyMargin
	for j := range sc.mach {
		a, b := sc.start[j], sc.start[j+1]
		ps := sc.pts[a:b]
		r := &reach[j]
		// upTo is the number of points of the group whose target t
		// satisfies t·f ≤ x (a prefix: the targets ascend).
		upTo := func(x, f float64) int {
			k, _ := slices.BinarySearchFunc(ps, x, func(p studyPt, x float64) int {
				if p.need*f <= x {
					return -1
				}
				return 1
			})
			return k
		}
		// Full matches: x ≥ t(1+m) sure, t(1−m) < x < t(1+m) left to the
		// solver; then Mach relaxed likewise among the rest.
		fullSure, fullAny := 0, 0
		if r.full > 0 {
			x := r.full * mult
			fullSure = upTo(x, hiM)
			fullAny = max(fullSure, upTo(math.Nextafter(x, 0), loM))
		}
		relSure, relAny := fullAny, fullAny
		if r.relax && relaxOK {
			x := relax * mult
			relSure = max(fullAny, upTo(x, hiM))
			relAny = max(relSure, upTo(math.Nextafter(x, 0), loM))
			if coin {
				relSure = fullAny
			}
		}
		rest := NoMatch
		if r.matched && r.atOK {
			rest = ReShort
		}
		n[FullMatch] += fullSure
		n[MachRelaxed] += relSure - fullAny
		n[rest] += len(ps) - relAny
		union += fullSure + relSure - fullAny + int(sc.otherPre[b]-sc.otherPre[a+relAny])
		for _, band := range [2][2]int{{fullSure, fullAny}, {relSure, relAny}} {
			for i := band[0]; i < band[1]; i++ {
				p := &ps[i]
				if exact == nil {
					exact = sc.solverAt(s)
				}
				fr := &sc.g.points[p.k]
				c := exact.solve(fr.mach, fr.re, sc.g.rows[int(p.k)/cols].Temperature, false).class
				n[c]++
				if c == FullMatch || c == MachRelaxed || p.other {
					union++
				}
				if classes != nil {
					classes[p.k] = c
				}
			}
		}
		if classes != nil {
			for i := range ps {
				switch {
				case i < fullSure:
					classes[ps[i].k] = FullMatch
				case i >= fullAny && i < relSure:
					classes[ps[i].k] = MachRelaxed
				case i >= relAny:
					classes[ps[i].k] = rest
				}
			}
		}
	}
	st.Shares = Shares{Total: sc.g.Len(), Inside: sc.g.inside, Count: n}
	st.Shares.Count[Outside] = st.Shares.Total - st.Shares.Inside
	if sc.g.inside > 0 {
		st.Union = float64(union) / float64(sc.g.inside)
	}
	if linear {
		st.Reached = sc.reached1
		for q := range st.ReRatio {
			st.ReRatio[q] = s * sc.quant1[q] // NaN stays NaN
		}
		return st, buf
	}
	buf = sc.ratios(reach, relax, relaxOK, mult, buf[:0])
	st.Reached = len(buf)
	st.ReRatio = quantilesOf(buf)
	return st, buf
}

// reachRatio is the point's reach ratio (ScaleStep.ReRatio) with reach r
// times mult, 0 where the facility has no setting there.
func reachRatio(p *studyPt, r *pointReach, relax float64, relaxOK bool, mult float64) float64 {
	x := r.full
	if r.relax && relaxOK {
		x = math.Max(x, relax)
	}
	if !(x > 0) || !(p.re > 0) {
		return 0
	}
	return x * mult / p.re
}

// nearestRank is the index in n sorted values of the quantile at share q:
// the smallest value with at least q of the values at or below it.
func nearestRank(q float64, n int) int {
	return min(max(int(math.Ceil(q*float64(n)))-1, 0), n-1)
}

// quantilesOf are the StudyQuantiles of xs (nearest rank; NaN when xs is
// empty), found by selection, which reorders xs.
func quantilesOf(xs []float64) [len(StudyQuantiles)]float64 {
	var out [len(StudyQuantiles)]float64
	from := 0
	for q, share := range StudyQuantiles {
		if len(xs) == 0 {
			out[q] = math.NaN()
			continue
		}
		k := nearestRank(share, len(xs))
		// xs[:from] are at most xs[from-1], the quantile before, so the
		// next lies at or after from.
		out[q] = selectNth(xs[from:], k-from)
		from = k
	}
	return out
}

// selectNth reorders xs so that xs[k] is the value a sort would put there,
// with none larger before it and none smaller after, and returns it
// (quickselect with a three-way partition around a median of three, which
// keeps runs of equal values cheap).
func selectNth(xs []float64, k int) float64 {
	lo, hi := 0, len(xs)-1
	for lo < hi {
		a, b, c := xs[lo], xs[lo+(hi-lo)/2], xs[hi]
		pivot := max(min(a, b), min(max(a, b), c))
		lt, i, gt := lo, lo, hi
		for i <= gt {
			switch {
			case xs[i] < pivot:
				xs[lt], xs[i] = xs[i], xs[lt]
				lt++
				i++
			case xs[i] > pivot:
				xs[gt], xs[i] = xs[i], xs[gt]
				gt--
			default:
				i++
			}
		}
		switch {
		case k < lt:
			hi = lt - 1
		case k > gt:
			lo = gt + 1
		default:
			return xs[k]
		}
	}
	return xs[k]
}
