package envelope

import "math"

// Bounded searches of the gas solver over Mach number (the rest is closed
// form).
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
)

// bandTopRe is the Reynolds number of maxOver over the Mach band of flight
// Mach number mf (machBand; -1 when the band is a single point or no Mach
// number in it is usable), from the column memo when it holds that band.
// Only the points it lets through (a full match in the band) search the
// band.
func (sv *gasSolver) bandTopRe(mf float64, col *colMemo) float64 {
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
func (sv *gasSolver) relaxFor(mf, target float64, aux *pointAux) (pick gasPick, found, hit bool) {
	lo, hi := sv.lim.MachMin, math.Min(sv.lim.MachMax, sv.compMach)
	if !(hi > lo) {
		return gasPick{}, false, false
	}
	var top *gasPick
	var pre *sampledRange
	if aux != nil {
		if !aux.relaxDone {
			aux.relaxDone = true
			aux.relaxTop, aux.relaxOK = sv.maxOver(lo, hi)
			aux.relaxSamples = sv.sampleRange(lo, hi)
		}
		if aux.relaxOK {
			top = &aux.relaxTop
		}
		pre = &aux.relaxSamples
	}
	return sv.searchMach(lo, hi, mf, target, top, pre)
}

// sampledRange is the Mach samples of a range (machSamples) with the
// bounds at each: they do not depend on the point, so a Solve worker
// makes them once for the relaxed range.
type sampledRange struct {
	ms []float64
	b  []gasBounds
}

func (sv *gasSolver) sampleRange(lo, hi float64) sampledRange {
	ms := machSamples(lo, hi, nil)
	r := sampledRange{ms: ms, b: make([]gasBounds, len(ms))}
	for k, M := range ms {
		r.b[k] = sv.bounds(M)
	}
	return r
}

// machBand is the range of facility Mach numbers that match flight Mach
// number mf within the Mach tolerance, [mf − MachTol, mf + MachTol] held
// within the facility range (each end the decimal it stands for, 2.56 for
// 2.55 + 0.01; see tidyDecimal); ok is false when it is a single point or
// empty.
func (sv *gasSolver) machBand(mf float64) (lo, hi float64, ok bool) {
	lo = max(tidyDecimal(mf-sv.mTol), sv.lim.MachMin)
	hi = min(tidyDecimal(mf+sv.mTol), sv.lim.MachMax)
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
// skips what it can. pre, when not nil, is sampleRange(lo, hi). The
// samples are tried nearest m0 first (at equal distances the lower), so
// the search stops at the first that reaches: the one the whole scan
// would pick. If no Mach number reaches target, pick is that
// highest setting and hit is false; found is false when no Mach number in
// the range is usable.
func (sv *gasSolver) searchMach(lo, hi, m0, target float64, top *gasPick, pre *sampledRange) (pick gasPick, found, hit bool) {
	m0 = min(max(m0, lo), hi)
	reaches := func(M float64) (gasBounds, bool) {
		b := sv.bounds(M)
		_, ok := sv.tryHit(&b, target)
		return b, ok
	}
	if b, yes := reaches(m0); yes {
		return sv.relaxAt(&b, target), true, true
	}
	if top != nil && top.re < target*(1-solveSlack) {
		return *top, true, false
	}
	var samples [machSampleCap]float64
	var ms []float64
	var bs []gasBounds
	if pre != nil {
		ms, bs = pre.ms, pre.b
	} else {
		ms = machSamples(lo, hi, samples[:0])
	}
	nearest := sv.nearestReaching(ms, bs, m0, target)
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

// nearestReaching is the sample of ms nearest m0 (at equal distances the
// lower) whose best setting reaches target, NaN when none does; bs, when
// not nil, holds the bounds at each sample. The samples at or below m0
// (down from i) and above it (up from j) are taken merged by distance, so
// the first that reaches is the answer.
func (sv *gasSolver) nearestReaching(ms []float64, bs []gasBounds, m0, target float64) float64 {
	j := 0
	for j < len(ms) && ms[j] <= m0 {
		j++
	}
	for i := j - 1; i >= 0 || j < len(ms); {
		var k int
		if j >= len(ms) || (i >= 0 && m0-ms[i] <= ms[j]-m0) {
			k, i = i, i-1
		} else {
			k, j = j, j+1
		}
		var b gasBounds
		if bs != nil {
			b = bs[k]
		} else {
			b = sv.bounds(ms[k])
		}
		if _, yes := sv.tryHit(&b, target); yes {
			return ms[k]
		}
	}
	return math.NaN()
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
func (sv *gasSolver) maxOver(lo, hi float64) (gasPick, bool) {
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
		res[k], lims[k] = g.re, [2]Limit{g.lim.p, g.lim.t}
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
func (sv *gasSolver) pickAt(b *gasBounds) (gasPick, bool) {
	s, ok := sv.best(b)
	g := gasPick{c: *b, gasSetting: s}
	if !ok || !b.ok {
		return g, false
	}
	g.reMax = g.re
	return g, true
}

// refineTop improves top by a golden-section search for the highest
// best-setting Reynolds number between Mach numbers a and b, to relaxTol.
// The refined setting replaces top only where it is higher.
func (sv *gasSolver) refineTop(a, b float64, top gasPick) gasPick {
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
func (sv *gasSolver) relaxAt(b *gasBounds, target float64) gasPick {
	h, _ := sv.tryHit(b, target)
	top, _ := sv.best(b)
	g := gasPick{c: *b, gasSetting: gasSetting{p0: h.p0, t0: h.t0, re: h.re, lim: top.lim}, reMax: top.re, over: h.over}
	if g.over {
		g.lim = sideLimits{sv.limP0Lo, sv.limT0Hi}
	}
	return g
}
