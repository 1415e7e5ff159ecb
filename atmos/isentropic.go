package atmos

import (
	"errors"
	"fmt"
	"math"
)

// Isentropic and normal-shock relations of a calorically perfect gas with
// ratio of specific heats g, in the forms given in NACA Report 1135
// ("Equations, tables, and charts for compressible flow", 1953). They hold for any constant g > 1; for air
// above roughly Mach 5 or stagnation temperatures above about 600 K the
// constant-g assumption itself starts to fail, which these functions do not
// correct for.
//
// The forward ratios return NaN for invalid input (negative or non-finite
// Mach number, g <= 1); the inverses return an error.

// ErrGamma reports a ratio of specific heats that is not a finite number
// greater than 1.
var ErrGamma = errors.New("ratio of specific heats must be a finite number greater than 1")

func validGamma(g float64) bool {
	return g > 1 && !math.IsInf(g, 0) // NaN fails g > 1
}

func validMach(M float64) bool {
	return M >= 0 && !math.IsInf(M, 0) // NaN fails M >= 0
}

// TemperatureRatio returns T/T0, static over stagnation temperature, at Mach
// number M for ratio of specific heats g.
func TemperatureRatio(M, g float64) float64 {
	if !validMach(M) || !validGamma(g) {
		return math.NaN()
	}
	return 1 / (1 + 0.5*(g-1)*M*M)
}

// PressureRatio returns p/p0, static over stagnation pressure, at Mach
// number M for ratio of specific heats g.
func PressureRatio(M, g float64) float64 {
	if !validMach(M) || !validGamma(g) {
		return math.NaN()
	}
	return math.Pow(TemperatureRatio(M, g), g/(g-1))
}

// DensityRatio returns rho/rho0, static over stagnation density, at Mach
// number M for ratio of specific heats g.
func DensityRatio(M, g float64) float64 {
	if !validMach(M) || !validGamma(g) {
		return math.NaN()
	}
	return math.Pow(TemperatureRatio(M, g), 1/(g-1))
}

// MachFromTemperatureRatio inverts TemperatureRatio: tr = T/T0 must lie in
// (0, 1].
func MachFromTemperatureRatio(tr, g float64) (float64, error) {
	if !validGamma(g) {
		return 0, fmt.Errorf("Mach number from temperature ratio: gamma %v: %w", g, ErrGamma)
	}
	if !(tr > 0 && tr <= 1) {
		return 0, fmt.Errorf("Mach number from temperature ratio: T/T0 = %v, want a value in (0, 1]", tr)
	}
	return math.Sqrt(2 / (g - 1) * (1/tr - 1)), nil
}

// MachFromPressureRatio inverts PressureRatio: pr = p/p0 must lie in (0, 1].
func MachFromPressureRatio(pr, g float64) (float64, error) {
	if !validGamma(g) {
		return 0, fmt.Errorf("Mach number from pressure ratio: gamma %v: %w", g, ErrGamma)
	}
	if !(pr > 0 && pr <= 1) {
		return 0, fmt.Errorf("Mach number from pressure ratio: p/p0 = %v, want a value in (0, 1]", pr)
	}
	// 1/tr - 1 = pr^(-(g-1)/g) - 1, written with Expm1 to keep digits near M = 0.
	x := math.Expm1(-(g - 1) / g * math.Log(pr))
	return math.Sqrt(2 / (g - 1) * x), nil
}

// MachFromDensityRatio inverts DensityRatio: dr = rho/rho0 must lie in (0, 1].
func MachFromDensityRatio(dr, g float64) (float64, error) {
	if !validGamma(g) {
		return 0, fmt.Errorf("Mach number from density ratio: gamma %v: %w", g, ErrGamma)
	}
	if !(dr > 0 && dr <= 1) {
		return 0, fmt.Errorf("Mach number from density ratio: rho/rho0 = %v, want a value in (0, 1]", dr)
	}
	x := math.Expm1(-(g - 1) * math.Log(dr))
	return math.Sqrt(2 / (g - 1) * x), nil
}

// PitotRatio returns the ratio of pitot (total-head) pressure to free-stream
// static pressure for a probe facing a stream at Mach number M. Below Mach 1
// this is the isentropic p0/p; from Mach 1 up it is the Rayleigh pitot
// formula p02/p1, the stagnation pressure behind the normal shock that
// stands ahead of the probe, over the static pressure ahead of the shock. The two branches meet at Mach 1.
func PitotRatio(M, g float64) float64 {
	if !validMach(M) || !validGamma(g) {
		return math.NaN()
	}
	if M < 1 {
		return 1 / PressureRatio(M, g)
	}
	return rayleighPitot(M*M, g)
}

// rayleighPitot is p02/p1 for M² = m2 >= 1.
func rayleighPitot(m2, g float64) float64 {
	a := (g + 1) * (g + 1) * m2 / (4*g*m2 - 2*(g-1))
	b := (1 - g + 2*g*m2) / (g + 1)
	return math.Pow(a, g/(g-1)) * b
}

// SonicPitotRatio is PitotRatio at Mach 1, ((g+1)/2)^(g/(g-1)); about 1.8929
// for g = 1.4.
func SonicPitotRatio(g float64) float64 {
	if !validGamma(g) {
		return math.NaN()
	}
	return math.Pow((g+1)/2, g/(g-1))
}

// MachFromPitotRatio inverts PitotRatio on both branches: r is pitot over
// static pressure and must be at least 1. Ratios up to SonicPitotRatio(g)
// are solved in closed form; above that the Rayleigh formula is solved by a
// safeguarded Newton iteration to a relative tolerance of 1e-14 in M².
func MachFromPitotRatio(r, g float64) (float64, error) {
	if !validGamma(g) {
		return 0, fmt.Errorf("Mach number from pitot ratio: gamma %v: %w", g, ErrGamma)
	}
	if !(r >= 1) || math.IsInf(r, 0) {
		return 0, fmt.Errorf("Mach number from pitot ratio: pt/p = %v, want a finite value >= 1", r)
	}
	rs := SonicPitotRatio(g)
	if r <= rs {
		return MachFromPressureRatio(1/r, g)
	}
	// Work with f(m2) = ln(rayleighPitot(m2)) - ln(r), increasing in m2 >= 1.
	// For large M, p02/p1 approaches k·M², so r/k is a close
	// first guess; the bracket [lo, hi] keeps the iteration inside.
	target := math.Log(r)
	f := func(m2 float64) float64 { return math.Log(rayleighPitot(m2, g)) - target }
	k := math.Pow((g+1)*(g+1)/(4*g), g/(g-1)) * 2 * g / (g + 1)
	x := math.Max(1, r/k)
	lo, hi := 1.0, math.Max(2, 2*x)
	for f(hi) < 0 {
		lo = hi
		hi *= 4
		if hi > 1e300 {
			return 0, fmt.Errorf("Mach number from pitot ratio: pt/p = %v is beyond the range of float64", r)
		}
	}
	if !(x > lo && x < hi) {
		x = 0.5 * (lo + hi)
	}
	for range 200 {
		fx := f(x)
		if fx == 0 {
			break
		}
		if fx < 0 {
			lo = x
		} else {
			hi = x
		}
		// d ln(p02/p1) / d m2, from the two factors of the Rayleigh formula.
		den := 4*g*x - 2*(g-1)
		dlnA := 1/x - 4*g/den
		dlnB := 2 * g / (1 - g + 2*g*x)
		d := g/(g-1)*dlnA + dlnB
		next := x - fx/d
		if !(next > lo && next < hi) || d <= 0 {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-x) <= 1e-14*x {
			x = next
			break
		}
		x = next
	}
	return math.Sqrt(x), nil
}

// AreaRatio returns A/A*, the stream-tube area at Mach number M over the
// sonic-throat area.
func AreaRatio(M, g float64) float64 {
	if !validMach(M) || !validGamma(g) {
		return math.NaN()
	}
	if M == 0 {
		return math.Inf(1)
	}
	t := 2 / (g + 1) * (1 + 0.5*(g-1)*M*M)
	return math.Pow(t, 0.5*(g+1)/(g-1)) / M
}

// MachFromAreaRatio inverts AreaRatio for a ratio ar >= 1 on the supersonic
// branch (supersonic true) or the subsonic branch. It bisects in ln M to a
// relative tolerance of 1e-15, at most 200 steps.
func MachFromAreaRatio(ar, g float64, supersonic bool) (float64, error) {
	if !validGamma(g) {
		return 0, fmt.Errorf("Mach number from area ratio: gamma %v: %w", g, ErrGamma)
	}
	if !(ar >= 1) || math.IsInf(ar, 0) {
		return 0, fmt.Errorf("Mach number from area ratio: A/A* = %v, want a finite value >= 1", ar)
	}
	if ar == 1 {
		return 1, nil
	}
	var lo, hi float64
	if supersonic {
		lo, hi = 1, 2
		for AreaRatio(hi, g) < ar {
			lo = hi
			hi *= 2
			if hi > 1e150 {
				return 0, fmt.Errorf("Mach number from area ratio: A/A* = %v is beyond the range of float64", ar)
			}
		}
	} else {
		lo, hi = 0.5, 1
		for AreaRatio(lo, g) < ar {
			hi = lo
			lo /= 2
			if lo < 1e-300 {
				return 0, fmt.Errorf("Mach number from area ratio: A/A* = %v is beyond the range of float64", ar)
			}
		}
	}
	for range 200 {
		mid := math.Sqrt(lo * hi)
		if !(mid > lo && mid < hi) || (hi-lo) <= 1e-15*mid {
			break
		}
		above := AreaRatio(mid, g) > ar
		// Area ratio rises with M when supersonic and falls when subsonic.
		if above == supersonic {
			hi = mid
		} else {
			lo = mid
		}
	}
	return math.Sqrt(lo * hi), nil
}

// NormalShock holds the jump conditions across a stationary normal shock
// for upstream Mach number M1.
type NormalShock struct {
	M1, M2             float64 // upstream and downstream Mach numbers
	PressureRatio      float64 // p2/p1
	DensityRatio       float64 // rho2/rho1
	TemperatureRatio   float64 // T2/T1
	TotalPressureRatio float64 // p02/p01
	PitotRatio         float64 // p02/p1, as the function PitotRatio
}

// NormalShockAt returns the normal-shock jump for upstream Mach number
// M1 >= 1 and ratio of specific heats g.
func NormalShockAt(M1, g float64) (NormalShock, error) {
	if !validGamma(g) {
		return NormalShock{}, fmt.Errorf("normal shock: gamma %v: %w", g, ErrGamma)
	}
	if !(M1 >= 1) || math.IsInf(M1, 0) {
		return NormalShock{}, fmt.Errorf("normal shock: upstream Mach number %v, want a finite value >= 1", M1)
	}
	m2 := M1 * M1
	pr := (2*g*m2 - (g - 1)) / (g + 1)
	dr := (g + 1) * m2 / ((g-1)*m2 + 2)
	down := ((g-1)*m2 + 2) / (2*g*m2 - (g - 1))
	pitot := rayleighPitot(m2, g)
	return NormalShock{
		M1:                 M1,
		M2:                 math.Sqrt(down),
		PressureRatio:      pr,
		DensityRatio:       dr,
		TemperatureRatio:   pr / dr,
		TotalPressureRatio: pitot * PressureRatio(M1, g),
		PitotRatio:         pitot,
	}, nil
}

// MassFlowParameter returns ṁ·√T0 / (A·p0), the mass flow per unit area of
// a stream tube at Mach number M of a perfect gas with ratio of specific
// heats g and specific gas constant R (J/(kg·K)), per unit stagnation
// pressure over the root of the stagnation temperature, in s·K^0.5/m for SI
// inputs. From the isentropic relations of NACA Report 1135 (ρ0 = p0/(R T0),
// a0 = √(γ R T0), ρV = ρ0 a0 M (1 + (γ−1)M²/2)^(−(γ+1)/(2(γ−1)))):
//
//	ṁ√T0/(A p0) = √(γ/R) · M · (1 + (γ−1)M²/2)^(−(γ+1)/(2(γ−1)))
//
// At M = 1 it is the choked (sonic-throat) value, for air about 0.0404
// s·K^0.5/m; at any M it equals the sonic value over AreaRatio(M, g), as
// continuity through the throat requires. NaN for invalid input.
func MassFlowParameter(M, g, R float64) float64 {
	if !validMach(M) || !validGamma(g) || !(R > 0) || math.IsInf(R, 0) {
		return math.NaN()
	}
	return math.Sqrt(g/R) * M * math.Pow(1+0.5*(g-1)*M*M, -0.5*(g+1)/(g-1))
}

// ChokedMassFlow returns the mass flow (kg/s) through a sonic throat of
// area throat (m²) fed at stagnation pressure p0 (Pa) and temperature T0
// (K): p0·A*/√T0 · MassFlowParameter(1, g, R). NaN for invalid input.
func ChokedMassFlow(p0, T0, throat, g, R float64) float64 {
	if !(p0 >= 0) || !(T0 > 0) || !(throat >= 0) || math.IsInf(p0, 0) || math.IsInf(T0, 0) || math.IsInf(throat, 0) {
		return math.NaN()
	}
	return p0 * throat / math.Sqrt(T0) * MassFlowParameter(1, g, R)
}
