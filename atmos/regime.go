package atmos

import (
	"errors"
	"fmt"
	"math"
)

// Regimes holds the thresholds that split Mach number and Knudsen number into
// named flow regimes. Each speed field is the upper Mach bound of the class of
// the same name; each rarefaction field is the upper Knudsen bound of its class.
//
// Classification with the defaults (common practice):
//
//	Incompressible  M < 0.3        (the low-speed part of subsonic flow)
//	Subsonic        0.3 ≤ M < 0.8
//	Transonic       0.8 ≤ M < 1.2
//	Supersonic      1.2 ≤ M < 5
//	Hypersonic      M ≥ 5
//
//	Continuum       Kn < 0.01
//	Slip            0.01 ≤ Kn < 0.1
//	Transitional    0.1 ≤ Kn ≤ 10
//	FreeMolecular   Kn > 10
type Regimes struct {
	Incompressible float64 // upper Mach bound of incompressible flow
	Subsonic       float64 // upper Mach bound of subsonic flow (start of transonic)
	Transonic      float64 // upper Mach bound of transonic flow
	Supersonic     float64 // upper Mach bound of supersonic flow (start of hypersonic)

	Continuum    float64 // upper Knudsen bound of continuum flow
	Slip         float64 // upper Knudsen bound of slip flow
	Transitional float64 // upper Knudsen bound of transitional flow
}

// DefaultRegimes returns the thresholds in common practice: Mach 0.3, 0.8,
// 1.2, 5 and Knudsen 0.01, 0.1, 10.
func DefaultRegimes() Regimes {
	return Regimes{
		Incompressible: 0.3,
		Subsonic:       0.8,
		Transonic:      1.2,
		Supersonic:     5,
		Continuum:      0.01,
		Slip:           0.1,
		Transitional:   10,
	}
}

// Validate reports whether the thresholds are finite, positive and strictly
// increasing, and whether the transonic band contains Mach 1.
func (r Regimes) Validate() error {
	var errs []error
	check := func(name string, v float64) {
		if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
			errs = append(errs, fmt.Errorf("regime threshold %s = %g: must be finite and positive", name, v))
		}
	}
	check("incompressible", r.Incompressible)
	check("subsonic", r.Subsonic)
	check("transonic", r.Transonic)
	check("supersonic", r.Supersonic)
	check("continuum", r.Continuum)
	check("slip", r.Slip)
	check("transitional", r.Transitional)
	if len(errs) > 0 {
		return errors.Join(errs...)
	}
	order := func(lo string, a float64, hi string, b float64) {
		if !(a < b) {
			errs = append(errs, fmt.Errorf("regime thresholds: %s (%g) must be below %s (%g)", lo, a, hi, b))
		}
	}
	order("incompressible", r.Incompressible, "subsonic", r.Subsonic)
	order("subsonic", r.Subsonic, "transonic", r.Transonic)
	order("transonic", r.Transonic, "supersonic", r.Supersonic)
	order("continuum", r.Continuum, "slip", r.Slip)
	order("slip", r.Slip, "transitional", r.Transitional)
	if r.Subsonic > 1 || r.Transonic < 1 {
		errs = append(errs, fmt.Errorf("regime thresholds: transonic band %g–%g must contain Mach 1", r.Subsonic, r.Transonic))
	}
	return errors.Join(errs...)
}

// SpeedRegime is a Mach-number flow class.
type SpeedRegime int

// Speed regimes, slowest first. Incompressible is the low-speed sub-class of
// subsonic flow.
const (
	Incompressible SpeedRegime = iota
	Subsonic
	Transonic
	Supersonic
	Hypersonic
)

var speedRegimeNames = [...]string{
	Incompressible: "incompressible",
	Subsonic:       "subsonic",
	Transonic:      "transonic",
	Supersonic:     "supersonic",
	Hypersonic:     "hypersonic",
}

// String returns the lower-case regime name, e.g. "transonic".
func (g SpeedRegime) String() string {
	if g >= 0 && int(g) < len(speedRegimeNames) {
		return speedRegimeNames[g]
	}
	return fmt.Sprintf("SpeedRegime(%d)", int(g))
}

// IsSubsonic reports whether the class lies below the transonic band
// (incompressible or subsonic).
func (g SpeedRegime) IsSubsonic() bool { return g == Incompressible || g == Subsonic }

// RarefactionRegime is a Knudsen-number flow class.
type RarefactionRegime int

// Rarefaction regimes, densest first.
const (
	Continuum RarefactionRegime = iota
	Slip
	Transitional
	FreeMolecular
)

var rarefactionNames = [...]string{
	Continuum:     "continuum",
	Slip:          "slip",
	Transitional:  "transitional",
	FreeMolecular: "free-molecular",
}

// String returns the lower-case regime name, e.g. "free-molecular".
func (g RarefactionRegime) String() string {
	if g >= 0 && int(g) < len(rarefactionNames) {
		return rarefactionNames[g]
	}
	return fmt.Sprintf("RarefactionRegime(%d)", int(g))
}

// Speed classifies Mach number M. Each class includes its lower bound;
// Hypersonic is M ≥ r.Supersonic. M is expected finite and non-negative;
// a NaN classifies as Hypersonic so that it is never shown as benign.
func (r Regimes) Speed(M float64) SpeedRegime {
	switch {
	case M < r.Incompressible:
		return Incompressible
	case M < r.Subsonic:
		return Subsonic
	case M < r.Transonic:
		return Transonic
	case M < r.Supersonic:
		return Supersonic
	}
	return Hypersonic
}

// Rarefaction classifies Knudsen number Kn. Continuum and slip include their
// lower bound; transitional includes both bounds; FreeMolecular is
// Kn > r.Transitional. A NaN classifies as FreeMolecular so that it is never
// shown as benign.
func (r Regimes) Rarefaction(Kn float64) RarefactionRegime {
	switch {
	case Kn < r.Continuum:
		return Continuum
	case Kn < r.Slip:
		return Slip
	case Kn <= r.Transitional:
		return Transitional
	}
	return FreeMolecular
}
