package atmos

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Airspeed relations for air (γ = GammaAir).
//
// Calibrated airspeed (CAS) is defined through the impact pressure
// qc = p_t − p that a pitot-static system senses: CAS is the speed which,
// at the standard sea-level pressure SeaLevelPressure and speed of sound
// SeaLevelSpeedOfSound, would produce the same qc. Below Mach 1 the pitot
// sees isentropic stagnation, qc = p[(1 + 0.2M²)^3.5 − 1]; at and above
// Mach 1 a normal shock stands ahead of the probe and the Rayleigh pitot
// formula applies. The same two branches are used for the sea-level
// reference, so a CAS above a0 is evaluated with the supersonic form.
//
// Equivalent airspeed is EAS = TAS·√(ρ/ρ0) and true airspeed is TAS = M·a.

// MachInverseTolerance is the relative tolerance on Mach number at which the
// supersonic (Rayleigh pitot) inverse stops iterating.
const MachInverseTolerance = 1e-12

// machInverseMaxIter bounds the Newton iteration of the supersonic inverse.
// From the starting guess used below the iteration needs at most 5 steps
// over Mach 1 to 10^6; the bound only guards against pathological input.
const machInverseMaxIter = 60

// sonicPitotRatio is p_t/p at Mach 1 for γ = 1.4: (1 + (γ−1)/2)^(γ/(γ−1)) = 1.2^3.5.
var sonicPitotRatio = math.Pow(1+(GammaAir-1)/2, GammaAir/(GammaAir-1))

// ErrInvalidSpeed is wrapped by every airspeed error caused by a negative,
// NaN or infinite speed or impact pressure.
var ErrInvalidSpeed = errors.New("invalid speed")

// ErrInvalidState is wrapped by airspeed errors caused by a State without a
// usable pressure, density or speed of sound (for example the zero State).
var ErrInvalidState = errors.New("invalid atmospheric state")

// ImpactPressure returns the pitot impact pressure qc = p_t − p (Pa) at
// free-stream Mach number M and static pressure p (Pa), for air.
// Below Mach 1 it is the isentropic p[(1+0.2M²)^3.5 − 1]; at and above Mach 1
// it is p·(PitotRatio(M, GammaAir) − 1) with the Rayleigh pitot formula.
// M must be finite and non-negative and p positive; otherwise the result is NaN.
func ImpactPressure(M, p float64) float64 {
	if !(M >= 0) || math.IsInf(M, 0) || !(p > 0) || math.IsInf(p, 0) {
		return math.NaN()
	}
	if M < 1 {
		// Written with expm1/log1p so low speeds keep full relative precision.
		g := GammaAir
		return p * math.Expm1(g/(g-1)*math.Log1p((g-1)/2*M*M))
	}
	return p * (PitotRatio(M, GammaAir) - 1)
}

// MachFromImpactPressure inverts ImpactPressure: it returns the Mach number at
// which a pitot in air at static pressure p (Pa) senses impact pressure qc (Pa).
// The subsonic branch is closed form; the supersonic branch (qc/p above
// 1.2^3.5 − 1) solves the Rayleigh pitot formula by Newton iteration in ln M to
// a relative tolerance of MachInverseTolerance, without allocating.
func MachFromImpactPressure(qc, p float64) (float64, error) {
	if math.IsNaN(qc) || math.IsInf(qc, 0) || qc < 0 {
		return 0, fmt.Errorf("impact pressure %g Pa: must be finite and non-negative: %w", qc, ErrInvalidSpeed)
	}
	if math.IsNaN(p) || math.IsInf(p, 0) || p <= 0 {
		return 0, fmt.Errorf("static pressure %g Pa: must be finite and positive: %w", p, ErrInvalidState)
	}
	r := qc / p
	if math.IsInf(r, 0) {
		return 0, fmt.Errorf("impact pressure ratio qc/p = %g/%g overflows: %w", qc, p, ErrInvalidSpeed)
	}
	g := GammaAir
	if r+1 <= sonicPitotRatio {
		// M = sqrt( 2/(γ−1) · [(1 + qc/p)^((γ−1)/γ) − 1] )
		return math.Sqrt(2 / (g - 1) * math.Expm1((g-1)/g*math.Log1p(r))), nil
	}
	return machFromRayleighPitot(r + 1)
}

// machFromRayleighPitot solves PitotRatio(M, 1.4) = target for M ≥ 1,
// target > 1.2^3.5. It iterates Newton's method on x = ln M:
//
//	f(x) = ln PitotRatio(e^x) − ln target,
//	df/dx = 2.8(2M² − 1)/(2.8M² − 0.4)   (γ = 1.4),
//
// which is smooth, increasing and nearly linear (slope 7/6 at M = 1, 2 as
// M → ∞), so the iteration converges from the asymptotic starting guess
// M ≈ √(target/1.2875) in a handful of steps.
func machFromRayleighPitot(target float64) (float64, error) {
	lt := math.Log(target)
	// Large-M asymptote: PitotRatio → ((γ+1)²/(4γ))^(γ/(γ−1)) · 2γM²/(γ+1).
	g := GammaAir
	k := math.Pow((g+1)*(g+1)/(4*g), g/(g-1)) * 2 * g / (g + 1)
	M := math.Max(1, math.Sqrt(target/k))
	for i := 0; i < machInverseMaxIter; i++ {
		m2 := M * M
		f := math.Log(PitotRatio(M, g)) - lt
		// d ln(p_t2/p1)/d ln M for the Rayleigh pitot formula, general γ:
		// 2γ/(γ−1) − 2γ·4γM²/((γ−1)(4γM² − 2(γ−1))) + 4γM²/(2γM² − (γ−1)).
		d := 2*g/(g-1) - 2*g/(g-1)*4*g*m2/(4*g*m2-2*(g-1)) + 4*g*m2/(2*g*m2-(g-1))
		step := f / d
		next := M * math.Exp(-step)
		if next < 1 {
			next = 1
		}
		if math.IsNaN(next) {
			break
		}
		if math.Abs(next-M) <= MachInverseTolerance*next {
			return next, nil
		}
		M = next
	}
	return 0, fmt.Errorf("supersonic pitot inverse for p_t/p = %g did not converge to %g: %w",
		target, MachInverseTolerance, ErrInvalidSpeed)
}

// CASFromMach returns the calibrated airspeed (m/s) at Mach M in state s.
// M must be finite and non-negative and s a State from At or AtDay;
// otherwise the result is NaN (Speeds gives the checked form).
func CASFromMach(M float64, s State) float64 {
	qc := ImpactPressure(M, s.Pressure)
	mc, err := MachFromImpactPressure(qc, SeaLevelPressure)
	if err != nil {
		return math.NaN()
	}
	return mc * SeaLevelSpeedOfSound
}

// MachFromCAS returns the Mach number in state s at calibrated airspeed cas
// (m/s). A CAS above SeaLevelSpeedOfSound is read with the supersonic
// (Rayleigh pitot) relation, as an instrument calibrated to it would.
func MachFromCAS(cas float64, s State) (float64, error) {
	if err := checkSpeed("CAS", cas); err != nil {
		return 0, err
	}
	if err := checkState(s); err != nil {
		return 0, err
	}
	qc := ImpactPressure(cas/SeaLevelSpeedOfSound, SeaLevelPressure)
	M, err := MachFromImpactPressure(qc, s.Pressure)
	if err != nil {
		return 0, fmt.Errorf("Mach from CAS %g m/s: %w", cas, err)
	}
	return M, nil
}

// EASFromMach returns the equivalent airspeed TAS·√(ρ/ρ0) (m/s) at Mach M in
// state s, with ρ0 = SeaLevelDensity. Invalid input gives NaN.
func EASFromMach(M float64, s State) float64 {
	if !validSpeed(M) || checkState(s) != nil {
		return math.NaN()
	}
	return M * s.SpeedOfSound * math.Sqrt(s.Density/SeaLevelDensity)
}

// MachFromEAS returns the Mach number in state s at equivalent airspeed eas
// (m/s). Invalid input gives NaN (Speeds gives the checked form).
func MachFromEAS(eas float64, s State) float64 {
	if !validSpeed(eas) || checkState(s) != nil {
		return math.NaN()
	}
	return eas / (s.SpeedOfSound * math.Sqrt(s.Density/SeaLevelDensity))
}

// TASFromMach returns the true airspeed M·a (m/s) in state s.
// Invalid input gives NaN.
func TASFromMach(M float64, s State) float64 {
	if !validSpeed(M) || checkState(s) != nil {
		return math.NaN()
	}
	return M * s.SpeedOfSound
}

// MachFromTAS returns the Mach number v/a in state s for true airspeed v (m/s).
// Invalid input gives NaN.
func MachFromTAS(v float64, s State) float64 {
	if !validSpeed(v) || checkState(s) != nil {
		return math.NaN()
	}
	return v / s.SpeedOfSound
}

// Airspeeds holds one flight condition expressed four ways; speeds in m/s.
type Airspeeds struct {
	Mach float64
	TAS  float64
	EAS  float64
	CAS  float64
}

// Of returns the speed of kind k: the Mach number, or TAS, EAS or CAS in
// m/s.
func (a Airspeeds) Of(k SpeedKind) float64 {
	switch k {
	case TAS:
		return a.TAS
	case EAS:
		return a.EAS
	case CAS:
		return a.CAS
	}
	return a.Mach
}

// SpeedKind names the form in which a speed is given.
type SpeedKind int

// Speed kinds.
const (
	Mach SpeedKind = iota // Mach number, dimensionless
	TAS                   // true airspeed, m/s
	EAS                   // equivalent airspeed, m/s
	CAS                   // calibrated airspeed, m/s
)

var speedKindNames = [...]string{Mach: "Mach", TAS: "TAS", EAS: "EAS", CAS: "CAS"}

// String returns "Mach", "TAS", "EAS" or "CAS".
func (k SpeedKind) String() string {
	if k >= 0 && int(k) < len(speedKindNames) {
		return speedKindNames[k]
	}
	return fmt.Sprintf("SpeedKind(%d)", int(k))
}

// ParseSpeedKind reads a speed kind name, ignoring case and surrounding space:
// "Mach" (or "M"), "TAS", "EAS", "CAS".
func ParseSpeedKind(s string) (SpeedKind, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "mach", "m":
		return Mach, nil
	case "tas":
		return TAS, nil
	case "eas":
		return EAS, nil
	case "cas":
		return CAS, nil
	}
	return 0, fmt.Errorf("speed kind %q: expected one of Mach, TAS, EAS, CAS", s)
}

// Speeds converts a speed v of the given kind (Mach number, or m/s) in state
// s to all four forms. The given form is returned exactly as passed.
// Negative, NaN or infinite v, an unknown kind, or a State without positive
// pressure, density and speed of sound give an error.
func Speeds(kind SpeedKind, v float64, s State) (Airspeeds, error) {
	if err := checkSpeed(kind.String(), v); err != nil {
		return Airspeeds{}, err
	}
	if err := checkState(s); err != nil {
		return Airspeeds{}, err
	}
	var M float64
	switch kind {
	case Mach:
		M = v
	case TAS:
		M = MachFromTAS(v, s)
	case EAS:
		M = MachFromEAS(v, s)
	case CAS:
		var err error
		if M, err = MachFromCAS(v, s); err != nil {
			return Airspeeds{}, err
		}
	default:
		return Airspeeds{}, fmt.Errorf("speeds: unknown speed kind %d", int(kind))
	}
	if math.IsInf(M, 0) || math.IsNaN(M) {
		return Airspeeds{}, fmt.Errorf("%s %g: Mach number not finite in this state: %w", kind, v, ErrInvalidSpeed)
	}
	a := Airspeeds{
		Mach: M,
		TAS:  TASFromMach(M, s),
		EAS:  EASFromMach(M, s),
		CAS:  CASFromMach(M, s),
	}
	switch kind {
	case Mach:
		a.Mach = v
	case TAS:
		a.TAS = v
	case EAS:
		a.EAS = v
	case CAS:
		a.CAS = v
	}
	if !finite(a.TAS) || !finite(a.EAS) || !finite(a.CAS) {
		return Airspeeds{}, fmt.Errorf("%s %g: speed out of range in this state: %w", kind, v, ErrInvalidSpeed)
	}
	return a, nil
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func validSpeed(v float64) bool { return v >= 0 && !math.IsInf(v, 0) }

func checkSpeed(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%s %g: not a finite number: %w", name, v, ErrInvalidSpeed)
	}
	if v < 0 {
		return fmt.Errorf("%s %g: must not be negative: %w", name, v, ErrInvalidSpeed)
	}
	return nil
}

func checkState(s State) error {
	if !(s.Pressure > 0) || math.IsInf(s.Pressure, 0) ||
		!(s.Density > 0) || math.IsInf(s.Density, 0) ||
		!(s.SpeedOfSound > 0) || math.IsInf(s.SpeedOfSound, 0) {
		return fmt.Errorf("state with p = %g Pa, rho = %g kg/m3, a = %g m/s (use At or AtDay): %w",
			s.Pressure, s.Density, s.SpeedOfSound, ErrInvalidState)
	}
	return nil
}
