package atmos

import (
	"fmt"
	"math"
	"strings"
)

// Gas is a test or flight medium treated as a calorically perfect gas with
// Sutherland viscosity and a liquid–vapour saturation (condensation) line.
type Gas interface {
	// Name is the lower-case name accepted by GasByName.
	Name() string
	// Gamma is the ratio of specific heats cp/cv.
	Gamma() float64
	// R is the specific gas constant, J/(kg·K).
	R() float64
	// Viscosity is the dynamic viscosity at static temperature T (K), Pa·s.
	Viscosity(T float64) float64
	// Sutherland returns the constants of mu = beta*T^1.5/(T+s):
	// beta in Pa·s/K^0.5 and s in K.
	Sutherland() (beta, s float64)
	// SaturationTemperature is the temperature (K) below which the gas
	// starts to condense at static pressure p (Pa). For p above the
	// critical pressure it returns the critical temperature.
	SaturationTemperature(p float64) float64
	// SaturationPressure is the vapour pressure (Pa) at temperature T (K),
	// the inverse of SaturationTemperature below the critical temperature;
	// above it the result is +Inf (no pressure condenses the gas).
	SaturationPressure(T float64) float64
	// CriticalTemperature is the upper end of the saturation line, K.
	CriticalTemperature() float64
	// ExceedsVapourPressure reports p > SaturationPressure(T), and
	// ReachesVapourPressure p >= SaturationPressure(T), with the same answer
	// for every input (p in Pa, T in K).
	ExceedsVapourPressure(p, T float64) bool
	ReachesVapourPressure(p, T float64) bool
	// DrySupersonic reports whether a supersonic test section in this gas is
	// always kept on the vapour side of the saturation line, whatever a
	// facility's own condensation check says.
	DrySupersonic() bool
}

// MolarMassNitrogen is the molar mass of N2, kg/mol (Span et al. 2000 give
// 28.01348 g/mol; 28.0134 g/mol is the usual rounded value).
const MolarMassNitrogen = 28.0134e-3

// Sutherland constants of air as defined by the U.S. Standard Atmosphere
// 1976 (viscosity equation): beta = 1.458e-6 kg/(m·s·K^0.5), S = 110.4 K.
const (
	SutherlandBetaAir = 1.458e-6
	SutherlandSAir    = 110.4
)

// Sutherland constants of nitrogen in reference-viscosity form,
// mu = mu0*(T/T0)^1.5*(T0+S)/(T+S). White, Viscous Fluid Flow (2nd ed.,
// Table 1-2) lists for N2 mu0 = 1.663e-5 Pa·s at T0 = 273 K with S = 107 K,
// quoted as good to about 2 % from 100 K to 1500 K (values from memory).
// In the beta form used by Gas, beta = mu0*(T0+S)/T0^1.5 ≈ 1.4010e-6.
const (
	SutherlandMu0Nitrogen = 1.663e-5
	SutherlandT0Nitrogen  = 273.0
	SutherlandSNitrogen   = 107.0
)

// SutherlandBeta converts a reference viscosity mu0 (Pa·s) at T0 (K) with
// Sutherland temperature s (K) to the beta of mu = beta*T^1.5/(T+s).
func SutherlandBeta(mu0, t0, s float64) float64 {
	return mu0 * (t0 + s) / (t0 * math.Sqrt(t0))
}

// IdealGas is a calorically perfect gas with Sutherland viscosity and a
// published saturation line. The zero value is not usable; obtain one from
// Air, Nitrogen or GasByName. Values are immutable and safe to copy.
type IdealGas struct {
	name  string
	gamma float64
	r     float64
	beta  float64
	s     float64
	sat   *satCurve // one of the immutable curves below
	// drySupersonic: see DrySupersonic.
	drySupersonic bool
}

// Air returns dry air as modelled by the U.S. Standard Atmosphere 1976:
// gamma = 1.4, R = RAir, Sutherland beta = 1.458e-6, S = 110.4 K. Its
// saturation line is the dew line of Lemmon et al. (2000): below this
// temperature at a given pressure the first liquid appears. A supersonic
// air test section is always kept clear of that line (DrySupersonic;
// common practice: supersonic and hypersonic air tunnels heat the air so
// that it does not liquefy in the nozzle).
func Air() IdealGas {
	return IdealGas{
		name:          "air",
		gamma:         GammaAir,
		r:             RAir,
		beta:          SutherlandBetaAir,
		s:             SutherlandSAir,
		sat:           &airDewLine,
		drySupersonic: true,
	}
}

// Nitrogen returns gaseous N2: gamma = 1.4, R from M = 28.0134 g/mol and
// the USSA 1976 universal gas constant (296.80 J/(kg·K)), Sutherland
// constants after White (see SutherlandMu0Nitrogen), and the vapour-pressure
// line of Span et al. (2000). Whether a nitrogen facility keeps clear of
// that line is its own condensation check (a cryogenic tunnel sets it).
func Nitrogen() IdealGas {
	return IdealGas{
		name:  "nitrogen",
		gamma: 1.4,
		r:     GasConstantUniversal / MolarMassNitrogen,
		beta:  SutherlandBeta(SutherlandMu0Nitrogen, SutherlandT0Nitrogen, SutherlandSNitrogen),
		s:     SutherlandSNitrogen,
		sat:   &nitrogenVapourLine,
	}
}

// gases is the register behind GasByName: each gas with the names it is
// known by, its canonical name (Name) first. A new gas is one more row.
var gases = []struct {
	names []string
	gas   func() IdealGas
}{
	{[]string{"air"}, Air},
	{[]string{"nitrogen", "n2"}, Nitrogen},
}

// GasNames lists the names GasByName accepts, canonical names first.
func GasNames() []string {
	var out []string
	for _, g := range gases {
		out = append(out, g.names[0])
	}
	for _, g := range gases {
		out = append(out, g.names[1:]...)
	}
	return out
}

// GasByName returns the gas called name: "air", or "nitrogen" / "n2".
// Case and surrounding space are ignored.
func GasByName(name string) (Gas, error) {
	key := strings.ToLower(strings.TrimSpace(name))
	for _, g := range gases {
		for _, n := range g.names {
			if n == key {
				return g.gas(), nil
			}
		}
	}
	return nil, fmt.Errorf("unknown gas %q: want one of %s", name, strings.Join(GasNames(), ", "))
}

// Name implements Gas.
func (g IdealGas) Name() string { return g.name }

// Gamma implements Gas.
func (g IdealGas) Gamma() float64 { return g.gamma }

// R implements Gas.
func (g IdealGas) R() float64 { return g.r }

// Sutherland implements Gas.
func (g IdealGas) Sutherland() (beta, s float64) { return g.beta, g.s }

// Cp is the specific heat at constant pressure, J/(kg·K).
func (g IdealGas) Cp() float64 { return g.gamma * g.r / (g.gamma - 1) }

// Viscosity implements Gas with Sutherland's law. It returns 0 for T <= 0
// and NaN for NaN.
func (g IdealGas) Viscosity(T float64) float64 {
	if T <= 0 {
		return 0
	}
	return g.beta * T * math.Sqrt(T) / (T + g.s)
}

// SpeedOfSound is sqrt(gamma R T), m/s.
func (g IdealGas) SpeedOfSound(T float64) float64 {
	if T <= 0 {
		return 0
	}
	return math.Sqrt(g.gamma * g.r * T)
}

// DrySupersonic implements Gas.
func (g IdealGas) DrySupersonic() bool { return g.drySupersonic }

// Density is p/(R T), kg/m3.
func (g IdealGas) Density(p, T float64) float64 { return p / (g.r * T) }

// CriticalTemperature is the upper end of the saturation line, K (for air
// the maxcondentherm of the dew line).
func (g IdealGas) CriticalTemperature() float64 { return g.sat.tc }

// CriticalPressure is the pressure at the upper end of the saturation
// line, Pa.
func (g IdealGas) CriticalPressure() float64 { return g.sat.pc }

// TriplePointTemperature is the lower end of the liquid–vapour correlation,
// K; below it the saturation line follows a sublimation estimate.
func (g IdealGas) TriplePointTemperature() float64 { return g.sat.tt }

// SaturationSource names the published correlation behind the saturation
// line, for reports.
func (g IdealGas) SaturationSource() string { return g.sat.source }

// SaturationPressure implements Gas. It returns 0 for T <= 0, +Inf above
// the critical temperature (no pressure condenses the gas there) and NaN
// for NaN.
func (g IdealGas) SaturationPressure(T float64) float64 { return g.sat.pressure(T) }

// SaturationTemperature implements Gas. It returns 0 for p <= 0, the
// critical temperature for p at or above the critical pressure, and NaN for
// NaN; any other input gives a finite temperature.
func (g IdealGas) SaturationTemperature(p float64) float64 { return g.sat.temperature(p) }

// ExceedsVapourPressure reports whether pressure p (Pa) is above the
// vapour pressure at temperature T (K): p > g.SaturationPressure(T), with
// the same answer for every input. Far from the saturation line it is
// settled from a table of the line, without evaluating it.
func (g IdealGas) ExceedsVapourPressure(p, T float64) bool {
	switch g.sat.side(p, T) {
	case 1:
		return true
	case -1:
		return false
	}
	return p > g.sat.pressure(T)
}

// ReachesVapourPressure reports whether pressure p (Pa) is at or above the
// vapour pressure at temperature T (K): p >= g.SaturationPressure(T), with
// the same answer for every input (see ExceedsVapourPressure).
func (g IdealGas) ReachesVapourPressure(p, T float64) bool {
	switch g.sat.side(p, T) {
	case 1:
		return true
	case -1:
		return false
	}
	return p >= g.sat.pressure(T)
}

// Condenses reports whether gas g at static temperature T (K) and static
// pressure p (Pa) lies at or below its saturation temperature, so that
// condensation can begin (equilibrium view; real expanding flows supercool
// some way before condensing, which this does not credit).
func Condenses(g Gas, T, p float64) bool {
	return T <= g.SaturationTemperature(p)
}

// satCurve is an ancillary vapour-pressure equation of the form
//
//	ln(p/pc) = (tc/T) * sum n[i] * theta^e[i],  theta = 1 - T/tc,
//
// valid from the triple point tt to tc. Below tt it is continued by a
// Clausius–Clapeyron sublimation line
//
//	ln(p/pt) = -b * (tt/T - 1),  pt = p(tt) from the ancillary,
//
// which has the form of the nitrogen sublimation equation of Lemmon
// (b = 13.088692, with the Span et al. 2000 triple point 63.151 K and
// 12.523 kPa; coefficient as distributed with that equation of state).
// Anchoring pt to the ancillary keeps the line continuous.
type satCurve struct {
	source string
	tc, pc float64
	n, e   [4]float64
	tt     float64
	b      float64

	// Filled by prepared: k[i] = 2·e[i] when every exponent is a multiple
	// of one half (halves set), so that θ^e is a product of θ and √θ and
	// u^(2e) a product of u, without math.Pow; lt = ln(p/pc) at tt; nodes
	// the pressure at T = j·tc/satNodes, j = 0..satNodes (see side).
	halves bool
	k      [4]int
	lt     float64
	nodes  []float64
}

// satNodes is the number of intervals of a curve's node table.
const satNodes = 1024

// satMargin is the relative allowance side gives the node pressures, far
// above the rounding of the curve (about 1e-15 relative), so that the
// computed curve lies inside the bracket wherever the exact one does.
const satMargin = 1e-12

// prepared returns c with its derived fields filled in.
func prepared(c satCurve) satCurve {
	c.halves = true
	for i, e := range c.e {
		k := math.Round(2 * e)
		if k != 2*e || k < 0 || k > 64 {
			c.halves = false
			break
		}
		c.k[i] = int(k)
	}
	c.lt = c.lnRatio(c.tt)
	c.nodes = make([]float64, satNodes+1)
	for j := range c.nodes {
		c.nodes[j] = c.pressure(float64(j) * c.tc / satNodes)
	}
	return c
}

// side settles p against the vapour pressure at T from the node table
// when it can: +1 when p is surely above pressure(T), −1 when surely
// below, 0 when it must be evaluated (near the line, T outside (0, tc), or
// NaN). The line rises with T; the index of T may be off by one through
// rounding, so the bracket is taken one node wider on each side, and
// widened by satMargin.
func (c *satCurve) side(p, T float64) int {
	if !(T > 0 && T < c.tc) {
		return 0
	}
	j := int(T * (satNodes / c.tc))
	lo, hi := c.nodes[max(j-1, 0)], c.nodes[min(j+2, satNodes)]
	switch {
	case p > hi*(1+satMargin):
		return 1
	case p < lo*(1-satMargin):
		return -1
	}
	return 0
}

// nitrogenVapourLine is the vapour-pressure ancillary equation of Span,
// Lemmon, Jacobsen, Wagner & Yokozeki, "A reference equation of state for
// the thermodynamic properties of nitrogen...", J. Phys. Chem. Ref. Data
// 29(6), 1361 (2000), with Tc = 126.192 K, pc = 3.3958 MPa, triple point
// 63.151 K. Below the triple point: Lemmon's sublimation line (see
// satCurve).
var nitrogenVapourLine = prepared(satCurve{
	source: "N2 vapour pressure: Span et al., J. Phys. Chem. Ref. Data 29, 1361 (2000), ancillary equation; " +
		"below 63.151 K the sublimation line of Lemmon (b = 13.088692)",
	tc: 126.192,
	pc: 3.3958e6,
	n:  [4]float64{-6.12445284, 1.26327220, -0.765910082, -1.77570564},
	e:  [4]float64{1, 1.5, 2.5, 5},
	tt: 63.151,
	b:  13.088692,
})

// airDewLine is the dew-point ancillary equation of Lemmon, Jacobsen,
// Penoncello & Friend, "Thermodynamic properties of air and mixtures of
// nitrogen, argon, and oxygen from 60 to 2000 K at pressures to 2000 MPa",
// J. Phys. Chem. Ref. Data 29(3), 331 (2000), reduced by the maxcondentherm
// Tj = 132.6312 K, pj = 3.78502 MPa; lower limit 59.75 K (solidification
// of air). Air has no published sublimation line there; below 59.75 K the
// curve is continued with the nitrogen sublimation slope b*Tt = 826.6 K
// taken through the air dew point at 59.75 K. That predicts condensation at
// a higher temperature than extending the liquid dew line would, which errs
// on the cautious side; treat it as an estimate.
var airDewLine = prepared(satCurve{
	source: "air dew line: Lemmon et al., J. Phys. Chem. Ref. Data 29, 331 (2000), dew-point ancillary equation; " +
		"below 59.75 K continued with the N2 sublimation slope (estimate)",
	tc: 132.6312,
	pc: 3.78502e6,
	n:  [4]float64{-0.1567266, -5.539635, 0.7567212, -3.514322},
	e:  [4]float64{0.5, 1, 2.5, 4},
	tt: 59.75,
	b:  13.088692 * 63.151 / 59.75,
})

// lnRatio returns ln(p/pc) of the ancillary at T in [tt, tc].
func (c *satCurve) lnRatio(T float64) float64 {
	th := 1 - T/c.tc
	if !(th > 0) {
		return 0
	}
	var s float64
	if c.halves {
		r := math.Sqrt(th)
		for i, n := range c.n {
			s += n * halfPow(th, r, c.k[i])
		}
	} else {
		for i, n := range c.n {
			s += n * math.Pow(th, c.e[i])
		}
	}
	return c.tc / T * s
}

// halfPow is x^(k/2) for r = √x: the integer power of x times r when k is
// odd.
func halfPow(x, r float64, k int) float64 {
	p := intPow(x, k>>1)
	if k&1 != 0 {
		p *= r
	}
	return p
}

// intPow is x^n for n >= 0 by repeated squaring.
func intPow(x float64, n int) float64 {
	p := 1.0
	for n > 0 {
		if n&1 != 0 {
			p *= x
		}
		n >>= 1
		if n > 0 {
			x *= x
		}
	}
	return p
}

func (c *satCurve) pressure(T float64) float64 {
	switch {
	case math.IsNaN(T):
		return T
	case T <= 0:
		return 0
	case T > c.tc:
		return math.Inf(1)
	case T >= c.tt:
		return c.pc * math.Exp(c.lnRatio(T))
	}
	return c.pc * math.Exp(c.lt-c.b*(c.tt/T-1))
}

// temperature inverts pressure. Between the triple point and the critical
// point it solves for u = sqrt(1 - T/tc), in which the ancillary is a
// smooth rational function, by Newton iteration kept inside a shrinking
// bracket by bisection, to |du| <= 1e-13 (at most 100 steps; the ancillary
// is monotone so the bracket always holds the root). Typical inputs take
// three to seven steps.
func (c *satCurve) temperature(p float64) float64 {
	switch {
	case math.IsNaN(p):
		return p
	case p <= 0:
		return 0
	case p >= c.pc:
		return c.tc
	}
	target := math.Log(p / c.pc)
	lt := c.lt
	if target <= lt {
		// Sublimation branch: target = lt - b*(tt/T - 1).
		return c.tt / (1 + (lt-target)/c.b)
	}
	// F(u) = ln(p/pc) = sum n u^(2e) / (1 - u²), decreasing from 0 at u = 0
	// to lt at the triple point.
	lo, hi := 0.0, math.Sqrt(1-c.tt/c.tc)
	// First guess: straight line in (1/T, ln p) between the end points.
	T0 := 1 / (1/c.tt + (target-lt)/(0-lt)*(1/c.tc-1/c.tt))
	u := math.Sqrt(1 - T0/c.tc)
	for range 100 {
		w := 1 - u*u
		var s, ds float64
		for i, n := range c.n {
			k := 2 * c.e[i]
			var pk float64
			if c.halves {
				pk = intPow(u, c.k[i])
			} else {
				pk = math.Pow(u, k)
			}
			s += n * pk
			if u > 0 {
				ds += n * k * pk / u
			}
		}
		f := s/w - target
		if f == 0 {
			break
		}
		if f > 0 {
			lo = u // still above the target pressure: move to lower T
		} else {
			hi = u
		}
		d := ds/w + 2*u*s/(w*w)
		next := u - f/d
		if !(next > lo && next < hi) || math.IsNaN(next) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-u) <= 1e-13 {
			u = next
			break
		}
		u = next
	}
	return c.tc * (1 - u*u)
}
