package envelope

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
)

// The plausibility bounds and value parsers shared by the file loader, the
// command-line flags and the interface's what-if editor and sessions, so
// that a value one of them takes the others take too, written the same
// ways, and a value one refuses the others refuse with the same words. The
// limits themselves are the constants below.

// Plausibility bounds. They catch typing slips (a wrong unit, a missing
// exponent); they are not facility or vehicle limits.
const (
	MaxLength      = 1000.0  // m, vehicle dimensions and test sections
	maxArea        = 1e5     // m²
	maxMach        = 30.0    // flight and facility Mach numbers
	maxSpeed       = 10000.0 // m/s, flight speeds
	maxWaterSpeed  = 100.0   // m/s
	maxPressure    = 1e8     // Pa, facility pressures (1000 bar)
	maxGasT0       = 3000.0  // K
	MaxDeltaT      = 60.0    // K, design-day offset either way
	maxModelScale  = 10.0
	maxBlockage    = 0.5
	waterFreezingK = 273.15
	waterBoilingK  = 373.15
)

// Bound is the range a kind of value must lie in, with the words that say
// so in an error ("expected ..."). An open end excludes the end value
// itself. Slack widens the closed ends by that much for values that
// arrive there through a unit conversion (32 degF is 273.15 K give or take
// a rounding); Clamp brings such a value back onto the end.
type Bound struct {
	Lo, Hi         float64
	LoOpen, HiOpen bool
	Slack          float64
	Expected       string
}

// Holds reports whether v is a finite number within the bound.
func (b Bound) Holds(v float64) bool {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return false
	}
	lo := v > b.Lo || !b.LoOpen && v >= b.Lo-b.Slack
	hi := v < b.Hi || !b.HiOpen && v <= b.Hi+b.Slack
	return lo && hi
}

// Clamp moves v onto the nearer closed end when it lies beyond it by no
// more than the slack; other values are returned as they are.
func (b Bound) Clamp(v float64) float64 {
	switch {
	case !b.LoOpen && v < b.Lo && v >= b.Lo-b.Slack:
		return b.Lo
	case !b.HiOpen && v > b.Hi && v <= b.Hi+b.Slack:
		return b.Hi
	}
	return v
}

// Check returns nil when v holds, else an *OutOfBounds error that shows
// found, the value as it was written (e.g. `"70 K"`).
func (b Bound) Check(found string, v float64) error {
	if b.Holds(v) {
		return nil
	}
	return &OutOfBounds{Found: found, Expected: b.Expected}
}

// OutOfBounds is the error of a value outside its Bound. It reads like the
// loader's file errors: `found "70 K", expected a temperature offset ...`.
type OutOfBounds struct {
	Found    string
	Expected string
}

func (e *OutOfBounds) Error() string { return "found " + e.Found + ", expected " + e.Expected }

// ErrOutOfBounds is matched by errors.Is for every *OutOfBounds.
var ErrOutOfBounds = errors.New("value out of bounds")

// Is makes errors.Is(err, ErrOutOfBounds) true.
func (e *OutOfBounds) Is(target error) bool { return target == ErrOutOfBounds }

// numberText is how a value that was not typed (a session's, say) is shown
// in an error.
func numberText(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// FlightMachBound bounds a flight Mach number: envelope speeds, the
// command line's --mach, and the Mach number any flight speed comes to.
func FlightMachBound() Bound {
	return Bound{Lo: 0, Hi: maxMach, Expected: fmt.Sprintf("a Mach number from 0 to %g", maxMach)}
}

// FlightSpeedBound bounds a flight speed of kind k: a Mach number for
// Mach, else a TAS, EAS or CAS in m/s.
func FlightSpeedBound(k atmos.SpeedKind) Bound {
	if k == atmos.Mach {
		return FlightMachBound()
	}
	return Bound{Lo: 0, Hi: maxSpeed, Expected: fmt.Sprintf("a%s %s from 0 to %g m/s", article(strings.ToLower(k.String())), k, maxSpeed)}
}

// CheckAltitude checks that altitude h (m, of kind) lies in the standard
// atmosphere's range, as an envelope altitude must; found is h as written.
func CheckAltitude(found string, h float64, kind atmos.AltitudeKind) error {
	if _, err := atmos.AtDay(h, kind, 0); err != nil {
		return &OutOfBounds{Found: found, Expected: altitudeRange(kind)}
	}
	return nil
}

// altitudeRange describes the altitudes the standard atmosphere covers on
// the scale of kind.
func altitudeRange(kind atmos.AltitudeKind) string {
	lo, hi := atmos.AltitudeRange(kind)
	return fmt.Sprintf("a %s altitude from %.0f m to %.0f m (the standard atmosphere's range)", kind, lo, hi)
}

// MinVehicleLength is the shortest vehicle length taken (1 µm): far below
// any model, yet far from where a Knudsen number overflows.
const MinVehicleLength = 1e-6

// VehicleLengthBound bounds a vehicle's reference length and span, and the
// command line's --length.
func VehicleLengthBound() Bound {
	return Bound{Lo: MinVehicleLength, Hi: MaxLength, Expected: fmt.Sprintf("a length from 1 µm to %g m", MaxLength)}
}

// DeltaTBound bounds the temperature offset of the day from the standard
// day.
func DeltaTBound() Bound {
	return Bound{Lo: -MaxDeltaT, Hi: MaxDeltaT, Expected: fmt.Sprintf("a temperature offset from the standard day within ±%g K", MaxDeltaT)}
}

// ModelScaleBound bounds a model scale (model size over full size).
func ModelScaleBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: maxModelScale, Expected: fmt.Sprintf("a model scale above 0 and at most %g", maxModelScale)}
}

// MachTolBound bounds the Mach tolerance of a match.
func MachTolBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: 1, HiOpen: true, Expected: "a Mach tolerance above 0 and below 1"}
}

// ReTolBound bounds the relative Reynolds-number tolerance of a match.
func ReTolBound() Bound {
	return Bound{Lo: 0, Hi: 1, HiOpen: true, Expected: `a Reynolds tolerance from 0 up to (not including) 1, e.g. "0.1" or "10 %"`}
}

// CompressibilityMachBound bounds the Mach number below which Mach number
// may be relaxed.
func CompressibilityMachBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: 1, HiOpen: true, Expected: "a Mach number above 0 and below 1"}
}

// FacilityPressureBound bounds a facility pressure: the ends of a
// stagnation or static pressure range, and so a p0 max.
func FacilityPressureBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: maxPressure, Expected: "a pressure above 0 and at most 1000 bar"}
}

// QMaxBound bounds a facility's test-section dynamic pressure limit (no
// limit is written by leaving it out, not as 0).
func QMaxBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: maxPressure, Expected: "a dynamic pressure above 0 and at most 1000 bar"}
}

// FacilityTemperatureBound bounds the ends of a facility's temperature
// range: stagnation temperature for air and nitrogen, water temperature
// for water.
func FacilityTemperatureBound(m Medium) Bound {
	if m == MediumWater {
		return waterTemperatureBound()
	}
	return gasT0Bound()
}

// gasT0Bound bounds a gas facility's stagnation temperatures.
func gasT0Bound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: maxGasT0, Expected: fmt.Sprintf("a temperature above 0 K and at most %g K", maxGasT0)}
}

// waterTemperatureBound bounds a water facility's water temperatures.
func waterTemperatureBound() Bound {
	return Bound{Lo: waterFreezingK, Hi: waterBoilingK, Slack: 1e-9, Expected: "a water temperature from 0 degC to 100 degC"}
}

// ParseMach reads a Mach number as written: "0.85", "M0.85" or
// "Mach 0.85". It does not bound it.
func ParseMach(s string) (float64, error) {
	t := strings.TrimSpace(s)
	l := strings.ToLower(t)
	for _, p := range []string{"mach", "m"} {
		if r := strings.TrimSpace(t[min(len(p), len(t)):]); strings.HasPrefix(l, p) && r != "" && (r[0] == '.' || r[0] >= '0' && r[0] <= '9') {
			t = r
			break
		}
	}
	return atmos.ParseQuantity(t, atmos.Dimensionless)
}

// ParseRatio reads a pure number written as a decimal, a fraction or a
// ratio, or a percentage: "0.025", "1/40", "1:40", "2.5 %". It does not
// bound it.
func ParseRatio(s string) (float64, error) {
	t := strings.TrimSpace(s)
	if r, ok := strings.CutSuffix(t, "%"); ok {
		v, err := atmos.ParseQuantity(r, atmos.Dimensionless)
		return v / 100, err
	}
	if a, b, ok := cutAny(t, "/:"); ok {
		num, err := atmos.ParseQuantity(a, atmos.Dimensionless)
		if err != nil {
			return 0, err
		}
		den, err := atmos.ParseQuantity(b, atmos.Dimensionless)
		if err != nil {
			return 0, err
		}
		if den == 0 {
			return 0, errors.New("division by zero")
		}
		return num / den, nil
	}
	return atmos.ParseQuantity(t, atmos.Dimensionless)
}

// cutAny splits s around the first of the separator bytes.
func cutAny(s, seps string) (string, string, bool) {
	if i := strings.IndexAny(s, seps); i >= 0 {
		return s[:i], s[i+1:], true
	}
	return s, "", false
}

// parseBounded reads s with parse and checks it against b.
func parseBounded(s string, parse func(string) (float64, error), b Bound) (float64, error) {
	v, err := parse(s)
	if err != nil {
		return 0, err
	}
	v = b.Clamp(v)
	if err := b.Check(strconv.Quote(strings.TrimSpace(s)), v); err != nil {
		return 0, err
	}
	return PositiveZero(v), nil
}

// ParseModelScale reads a model scale written as a file, a flag or the
// editor takes it ("0.025", "1/40", "1:40", "2.5 %") within
// ModelScaleBound.
func ParseModelScale(s string) (float64, error) {
	return parseBounded(s, ParseRatio, ModelScaleBound())
}

// ParseDeltaT reads a temperature offset with its unit ("10 K", "-18 degF")
// within DeltaTBound.
func ParseDeltaT(s string) (float64, error) {
	return parseBounded(s, func(t string) (float64, error) { return atmos.ParseQuantity(t, atmos.TemperatureDelta) }, DeltaTBound())
}

// ParseFlightSpeed reads a flight speed of kind k (a Mach number as
// ParseMach reads it, else a speed with its unit) within FlightSpeedBound.
func ParseFlightSpeed(s string, k atmos.SpeedKind) (float64, error) {
	parse := ParseMach
	if k != atmos.Mach {
		parse = func(t string) (float64, error) { return atmos.ParseQuantity(t, atmos.Speed) }
	}
	return parseBounded(s, parse, FlightSpeedBound(k))
}

// ParseVehicleLength reads a length with its unit within
// VehicleLengthBound.
func ParseVehicleLength(s string) (float64, error) {
	return parseBounded(s, func(t string) (float64, error) { return atmos.ParseQuantity(t, atmos.Length) }, VehicleLengthBound())
}

// ParseMachTol, ParseReTol and ParseCompressibilityMach read the matching
// tolerances and threshold: plain numbers, and for the Reynolds tolerance
// also a percentage or fraction ("10 %", "1/10").
func ParseMachTol(s string) (float64, error) {
	return parseBounded(s, func(t string) (float64, error) { return atmos.ParseQuantity(t, atmos.Dimensionless) }, MachTolBound())
}

// ParseReTol reads a Reynolds tolerance within ReTolBound.
func ParseReTol(s string) (float64, error) { return parseBounded(s, ParseRatio, ReTolBound()) }

// ParseCompressibilityMach reads the compressibility threshold within
// CompressibilityMachBound.
func ParseCompressibilityMach(s string) (float64, error) {
	return parseBounded(s, ParseMach, CompressibilityMachBound())
}

// PositiveZero returns v with a negative zero made positive, so that no
// output shows "-0".
func PositiveZero(v float64) float64 {
	if v == 0 {
		return 0
	}
	return v
}

// CheckP0Max checks a new maximum pressure v (Pa) for facility f
// (stagnation pressure; static pressure for water): within
// FacilityPressureBound and not below the facility's minimum, as the range
// in a file must be. found is the value as typed, shown in the error (""
// shows v in Pa).
func CheckP0Max(f *Facility, found string, v float64) (float64, error) {
	b := FacilityPressureBound()
	if f.PressureMin() > 0 {
		b.Lo, b.LoOpen = f.PressureMin(), false
		b.Expected += fmt.Sprintf(", not below the facility's minimum %s Pa", numberText(f.PressureMin()))
	}
	return checked(b, found, "Pa", v)
}

// CheckT0Min checks a new minimum temperature v (K) for facility f
// (stagnation temperature; water temperature for water): within
// FacilityTemperatureBound and not above the facility's maximum. It
// returns the value to use (a water temperature a rounding below 0 degC is
// 0 degC).
func CheckT0Min(f *Facility, found string, v float64) (float64, error) {
	b := FacilityTemperatureBound(f.Medium)
	if f.TemperatureMax() > 0 && f.TemperatureMax() < b.Hi {
		b.Hi, b.HiOpen = f.TemperatureMax(), false
		b.Expected += fmt.Sprintf(", not above the facility's maximum %s K", numberText(f.TemperatureMax()))
	}
	return checked(b, found, "K", v)
}

// CheckQMax checks a dynamic-pressure limit v (Pa) as stored: 0 for no
// limit, else within QMaxBound.
func CheckQMax(found string, v float64) (float64, error) {
	if v == 0 && found == "" {
		return 0, nil
	}
	return checked(QMaxBound(), found, "Pa", v)
}

// checked clamps v into b and checks it, showing found (or v in unit).
func checked(b Bound, found, unit string, v float64) (float64, error) {
	if found == "" {
		found = numberText(v) + " " + unit
	}
	v = b.Clamp(v)
	if err := b.Check(found, v); err != nil {
		return 0, err
	}
	return v, nil
}

// LoadCoefficientBound bounds a vehicle's largest normal-force or
// pitching-moment coefficient: above 0, and at most MaxLoadCoefficient, a
// plausibility bound far above what a body or wing reaches on its own
// reference area (an absurd value is more likely a typing slip).
func LoadCoefficientBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: MaxLoadCoefficient,
		Expected: fmt.Sprintf("a load coefficient above 0 and at most %g", MaxLoadCoefficient)}
}

// BalanceForceBound and BalanceMomentBound bound a balance's capacity.
func BalanceForceBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: MaxBalanceForce,
		Expected: fmt.Sprintf("a force above 0 and at most %s kN", numberText(MaxBalanceForce/1e3))}
}

// BalanceMomentBound: see BalanceForceBound.
func BalanceMomentBound() Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: MaxBalanceMoment,
		Expected: fmt.Sprintf("a moment above 0 and at most %s kN·m", numberText(MaxBalanceMoment/1e3))}
}

// Plausibility bounds of load data (not physical limits: values beyond
// them are refused as more likely a slip of unit or digit).
const (
	MaxLoadCoefficient = 50.0
	MaxBalanceForce    = 1e7 // N (1 MN is already a very large balance)
	MaxBalanceMoment   = 1e7 // N·m
)

// MaxArea bounds a load reference area, m² (a square kilometre).
const MaxArea = 1e6
