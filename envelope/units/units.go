package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
	"likewind/envelope"
)

// System is the display unit system. Values are SI inside; conversion
// happens only here, at display time.
type System uint8

const (
	// SI shows m, m/s, K, kPa (Pa below 1 kPa), kg/m³.
	SI System = iota
	// Customary shows ft, kt, °F, psf (psi for stagnation pressure),
	// slug/ft³.
	Customary
)

func (u System) String() string {
	if u == Customary {
		return "customary"
	}
	return "SI"
}

// Parse is the inverse of System.String.
func Parse(s string) (System, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "si", "":
		return SI, nil
	case "customary", "us", "imperial":
		return Customary, nil
	}
	return SI, fmt.Errorf("unknown unit system %q (expected \"SI\" or \"customary\")", s)
}

// Toggle returns the other unit system.
func (u System) Toggle() System {
	if u == Customary {
		return SI
	}
	return Customary
}

// Sig formats v with n significant digits, without exponent between 1e-3
// and 1e6, and with a short exponent ("3.10e7") outside that range.
func Sig(v float64, n int) string {
	switch {
	case math.IsNaN(v):
		return "n/a"
	case math.IsInf(v, 1):
		return "inf"
	case math.IsInf(v, -1):
		return "-inf"
	case v == 0:
		return "0"
	}
	a := math.Abs(v)
	if a >= 1e6 || a < 1e-3 {
		return Expo(v, n)
	}
	e := int(math.Floor(math.Log10(a)))
	dec := max(n-1-e, 0)
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if s == "-0" {
		s = "0"
	}
	return s
}

// Expo formats v as mantissa and exponent with n significant digits:
// "3.10e7", "1.2e-8".
func Expo(v float64, n int) string {
	s := strconv.FormatFloat(v, 'e', max(n-1, 0), 64)
	mant, exp, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	neg := strings.HasPrefix(exp, "-")
	exp = strings.TrimLeft(exp, "+-0")
	if exp == "" {
		return mant
	}
	if neg {
		exp = "-" + exp
	}
	return mant + "e" + exp
}

// Fixed formats v with d decimals ("n/a" for NaN).
func Fixed(v float64, d int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Sig(v, 3)
	}
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.TrimLeft(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}

// AltUnit names the altitude unit.
func (u System) AltUnit() string {
	if u == Customary {
		return "ft"
	}
	return "m"
}

// AltValue converts an altitude in m to display units.
func (u System) AltValue(m float64) float64 {
	if u == Customary {
		return m / atmos.Foot
	}
	return m
}

// AltLabel is an altitude axis label: whole units, no unit name.
func (u System) AltLabel(m float64) string { return Fixed(u.AltValue(m), 0) }

// Alt formats an altitude with its unit.
func (u System) Alt(m float64) string { return Fixed(u.AltValue(m), 0) + " " + u.AltUnit() }

// Length formats a length (model span, mean free path...).
func (u System) Length(m float64) string {
	if u == Customary {
		return Sig(m/atmos.Foot, 3) + " ft"
	}
	return Sig(m, 3) + " m"
}

// SpeedUnit names the speed unit.
func (u System) SpeedUnit() string {
	if u == Customary {
		return "kt"
	}
	return "m/s"
}

// SpeedValue converts m/s to display units.
func (u System) SpeedValue(v float64) float64 {
	if u == Customary {
		return v / atmos.Knot
	}
	return v
}

// Speed formats a speed with its unit.
func (u System) Speed(v float64) string {
	return Fixed(u.SpeedValue(v), 1) + " " + u.SpeedUnit()
}

// Temp formats an absolute temperature.
func (u System) Temp(k float64) string {
	if u == Customary {
		return Fixed(k*9/5-459.67, 1) + " °F"
	}
	return Fixed(k, 1) + " K"
}

// DeltaT formats a temperature offset with its sign.
func (u System) DeltaT(k float64) string {
	v, unit := k, "K"
	if u == Customary {
		v, unit = k*9/5, "°F"
	}
	s := Fixed(v, 1)
	if v >= 0 && !strings.HasPrefix(s, "-") {
		s = "+" + s
	}
	return s + " " + unit
}

// Pressure formats a static pressure: kPa (Pa below 1 kPa) or psf.
func (u System) Pressure(p float64) string {
	if u == Customary {
		return Sig(p/atmos.PSF, 4) + " psf"
	}
	if math.Abs(p) < 1000 {
		return Sig(p, 4) + " Pa"
	}
	return Sig(p/1000, 4) + " kPa"
}

// Q formats a dynamic pressure (same units as Pressure).
func (u System) Q(q float64) string { return u.Pressure(q) }

// Stagnation formats a stagnation or vessel pressure: kPa or psi.
func (u System) Stagnation(p float64) string {
	if u == Customary {
		return Sig(p/atmos.PSI, 4) + " psi"
	}
	return Sig(p/1000, 4) + " kPa"
}

// Force formats a force (a model load): N, kN from 1 kN up, or lbf.
func (u System) Force(n float64) string {
	if u == Customary {
		return Sig(n/atmos.PoundForce, 4) + " lbf"
	}
	if math.Abs(n) < 1000 {
		return Sig(n, 4) + " N"
	}
	return Sig(n/1000, 4) + " kN"
}

// Moment formats a moment (a pitching moment on the balance): N·m, kN·m
// from 1 kN·m up, or lbf·ft.
func (u System) Moment(nm float64) string {
	if u == Customary {
		return Sig(nm/(atmos.PoundForce*atmos.Foot), 4) + " lbf·ft"
	}
	if math.Abs(nm) < 1000 {
		return Sig(nm, 4) + " N·m"
	}
	return Sig(nm/1000, 4) + " kN·m"
}

// Density formats a density.
func (u System) Density(rho float64) string {
	if u == Customary {
		return Sig(rho/atmos.SlugPerCubicFoot, 4) + " slug/ft³"
	}
	return Sig(rho, 4) + " kg/m³"
}

// PerLength formats a quantity per unit length (unit Reynolds number).
func (u System) PerLength(x float64) string {
	if u == Customary {
		return Expo(x*atmos.Foot, 3) + " /ft"
	}
	return Expo(x, 3) + " /m"
}

// SpeedAxis returns the axis title and a label formatter for a speed axis
// of the given kind (Mach is unitless; the others are speeds).
func (u System) SpeedAxis(kind atmos.SpeedKind) (title string, label func(v float64) string) {
	if kind == atmos.Mach {
		return "Mach", func(v float64) string { return MachLabel(v) }
	}
	return kind.String() + " " + u.SpeedUnit(), func(v float64) string {
		return Fixed(u.SpeedValue(v), 0)
	}
}

// MachLabel prints a Mach number with two decimals below 10 and one above.
func MachLabel(m float64) string {
	if math.Abs(m) >= 10 {
		return Fixed(m, 1)
	}
	return Fixed(m, 2)
}

// A System writes the quantities of the facility cautions too, so cautions
// read in the units the rest of a screen or dump shows.
var _ envelope.QuantityFormat = System(0)
