package envelope

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Class is how well a facility reproduces one flight condition.
type Class uint8

// Match classes. The values order the enum only; use Rank to compare.
const (
	// Outside: the point is outside the flight envelope.
	Outside Class = iota
	// FullMatch: test Mach number within Settings.MachTol of flight (the
	// flight Mach number where it serves, else the nearest in that band)
	// and Reynolds number at least (1 − Settings.ReTol) of flight.
	FullMatch
	// ReShort: Mach number matched, Reynolds number short of flight; the
	// best reachable Reynolds number is reported with its ratio and the
	// skin-friction penalty ΔCf.
	ReShort
	// MachRelaxed: Reynolds number matched at a facility Mach number other
	// than flight (usually higher: a low-speed flight Reynolds number needs
	// more speed in a smaller model), allowed only where flight and
	// facility Mach numbers are both below Settings.CompressibilityMach
	// (water facilities always match this way).
	MachRelaxed
	// NoMatch: out of reach; Result.Limit says which limit stops it.
	NoMatch

	// NumClasses is the number of classes, for per-class arrays.
	NumClasses = int(NoMatch) + 1
)

var classNames = [...]string{
	Outside:     "outside envelope",
	FullMatch:   "full match",
	ReShort:     "Reynolds short",
	MachRelaxed: "Mach relaxed",
	NoMatch:     "out of reach",
}

// classColours is the one palette of the match classes, as hex RGB: the
// interface, the text dumps (likewind dump --color) and the pictures all
// read it, so a slide and the screen agree. Outside is the colour of grid
// points outside the envelope on a terminal; pictures draw a light tint of
// it so the outside stays background.
var classColours = [...]string{
	Outside:     "#5C5C5C",
	FullMatch:   "#3E9E5A", // green
	ReShort:     "#D19A1E", // amber
	MachRelaxed: "#4F86C9", // blue
	NoMatch:     "#C24A3A", // red
}

// Colour returns the colour of the class as hex RGB, e.g. "#3E9E5A".
// An unknown class has the colour of Outside.
func (c Class) Colour() string {
	if int(c) < len(classColours) {
		return classColours[c]
	}
	return classColours[Outside]
}

// RGB returns the colour of the class as red, green and blue bytes.
func (c Class) RGB() (r, g, b uint8) {
	x, _ := strconv.ParseUint(strings.TrimPrefix(c.Colour(), "#"), 16, 32)
	return uint8(x >> 16), uint8(x >> 8), uint8(x)
}

// String returns the class in plain words, e.g. "Reynolds short".
func (c Class) String() string {
	if int(c) < len(classNames) {
		return classNames[c]
	}
	return fmt.Sprintf("Class(%d)", int(c))
}

// Rank orders classes from best (0) to worst: full match, Mach relaxed,
// Reynolds short, out of reach, outside envelope. Mach relaxed ranks above
// Reynolds short because it only occurs below the compressibility threshold,
// where Reynolds number is the similarity parameter that governs; with this
// order a larger model never gives a worse class.
func (c Class) Rank() int {
	if int(c) < len(classRanks) {
		return int(classRanks[c])
	}
	return 4
}

var classRanks = [...]uint8{Outside: 4, FullMatch: 0, MachRelaxed: 1, ReShort: 2, NoMatch: 3}

// Matched reports whether the class reproduces the flight Reynolds number
// within tolerance with an acceptable Mach number: full match or Mach
// relaxed.
func (c Class) Matched() bool { return c == FullMatch || c == MachRelaxed }

// Limit names the facility constraint that decides a point: the one that
// stops the Reynolds number (or the Mach number) from reaching flight, or
// for an overshoot the one that stops the settings from coming down.
type Limit uint8

// Limits. For water facilities LimitP0Min/LimitP0Max are not used, the
// speed range is LimitSpeedRange and the water temperature range
// LimitWaterTemp.
const (
	LimitNone            Limit = iota
	LimitMachRange             // flight Mach outside the facility Mach range
	LimitIncompressible        // Mach number too high for a liquid (or to relax Mach)
	LimitSpeedRange            // water speed range
	LimitP0Max                 // maximum stagnation pressure
	LimitP0Min                 // minimum stagnation pressure
	LimitT0Min                 // minimum stagnation temperature
	LimitT0Max                 // maximum stagnation temperature
	LimitQMax                  // test-section dynamic pressure limit
	LimitCondensation          // saturation line of the test gas
	LimitStaticT               // minimum test-section static temperature
	LimitRePerM                // maximum unit Reynolds number
	LimitWaterTemp             // water temperature range
	LimitBalanceLoad           // balance and sting capacity (Facility.Balance)
	LimitRuleTemperature       // the temperature a fixed-temperature rule holds
	LimitRuleQ                 // the dynamic pressure a fixed-q rule holds

	numLimits = int(LimitRuleQ) + 1
)

var limitNames = [...]string{
	LimitNone:            "none",
	LimitMachRange:       "facility Mach range",
	LimitIncompressible:  "Mach (incompressible medium)",
	LimitSpeedRange:      "facility speed range",
	LimitP0Max:           "maximum p0",
	LimitP0Min:           "minimum p0",
	LimitT0Min:           "minimum T0",
	LimitT0Max:           "maximum T0",
	LimitQMax:            "dynamic-pressure limit",
	LimitCondensation:    "condensation",
	LimitStaticT:         "minimum static temperature",
	LimitRePerM:          "unit Reynolds limit",
	LimitWaterTemp:       "water temperature range",
	LimitBalanceLoad:     "balance load",
	LimitRuleTemperature: "fixed temperature of the rule",
	LimitRuleQ:           "fixed q of the rule",
}

// String returns the limit in plain words, e.g. "dynamic-pressure limit".
func (l Limit) String() string {
	if int(l) < len(limitNames) {
		return limitNames[l]
	}
	return fmt.Sprintf("Limit(%d)", int(l))
}

// Flags are cautions attached to a point's facility settings.
type Flags uint16

// Caution flags; the thresholds are in the constants below.
const (
	// FlagCondensationWarn: at PeakLocalMach on the model (same p0, T0) the
	// local static state reaches the saturation line.
	FlagCondensationWarn Flags = 1 << iota
	// FlagEnthalpyShort: hypersonic point whose facility T0 is below
	// EnthalpyShortRatio of the flight stagnation temperature.
	FlagEnthalpyShort
	// FlagRealGas: the ideal-gas result is approximate (cold gas near
	// saturation, T0 below RealGasT0, hypersonic, or p0 above RealGasP0).
	FlagRealGas
	// FlagCryogenic: T0 below CryogenicT0, cold-gas hazards apply.
	FlagCryogenic
	// FlagHighP0: p0 within the top NearLimitFraction of the facility
	// maximum.
	FlagHighP0
	// FlagQNearLimit: dynamic pressure within the top NearLimitFraction of
	// the facility limit.
	FlagQNearLimit
	// FlagReOver: even the lowest settings exceed the flight Reynolds
	// number by more than the tolerance.
	FlagReOver
	// FlagLowCavitation: water cavitation number below
	// LowCavitationNumber.
	FlagLowCavitation
	// FlagModelTooLarge: the model scale in force (a file's, a what-if's
	// or a session's) is above the largest the test section takes by the
	// span and blockage rules at the point's test Mach number (FitScale).
	FlagModelTooLarge
	// FlagLoadNearLimit: the model load (Load.Share) is within the top
	// NearLimitFraction of the balance capacity.
	FlagLoadNearLimit
)

// Caution thresholds (common practice; planning values, not facility
// rules).
const (
	// EnthalpyShortRatio: a hypersonic facility T0 below this share of the
	// flight stagnation temperature does not reproduce the flight enthalpy
	// (heat transfer, real-gas chemistry).
	EnthalpyShortRatio = 0.5
	// RealGasT0 is the stagnation temperature below which ideal-gas
	// results for nitrogen or air are treated as approximate, K.
	RealGasT0 = 100.0
	// RealGasSatMargin: a static temperature below this multiple of the
	// saturation temperature counts as near saturation.
	RealGasSatMargin = 1.10
	// RealGasP0 is the stagnation pressure above which the ideal-gas
	// equation of state is treated as approximate, Pa.
	RealGasP0 = 10e6
	// CryogenicT0 is the stagnation temperature below which a facility is
	// flagged as running cold (cryogenic handling, embrittlement,
	// oxygen-deficiency hazard from nitrogen), K.
	CryogenicT0 = 200.0
	// NearLimitFraction: settings at or above this share of a facility
	// maximum (p0, q, balance load) are flagged.
	NearLimitFraction = 0.9
	// LowCavitationNumber: below this water cavitation number cavitation
	// on the model is likely (the magnitude of a typical minimum pressure
	// coefficient).
	LowCavitationNumber = 1.0
)

var flagNames = [...]string{
	"condensation warning", "enthalpy short", "real-gas caution", "cryogenic",
	"high p0", "q near limit", "Reynolds over", "low cavitation number",
	"model too large for the section", "load near balance capacity",
}

// String lists the set flags, comma separated ("" when none).
func (f Flags) String() string {
	var parts []string
	for k, n := range flagNames {
		if f&(1<<k) != 0 {
			parts = append(parts, n)
		}
	}
	return strings.Join(parts, ", ")
}

// Has reports whether every flag in x is set.
func (f Flags) Has(x Flags) bool { return f&x == x }

// Result is the compact facility answer for one grid point: 28 bytes.
// For a gas facility P0 and T0 are stagnation pressure (Pa) and temperature
// (K); for a water facility P0 is the test-section static pressure and T0 the
// water temperature. V is the test-section speed (m/s), Q the test-section
// dynamic pressure (Pa), Re the model Reynolds number, ReRatio model over
// flight (the skin-friction difference is in Map.Detail). Points out of reach with no usable settings have zero settings.
//
// The values are single precision not for memory (BenchmarkGridSolve400
// stores 60 B per point against a 100 B target, 88 B in double precision)
// but because the best-of-all choice (Better) and the screen's layers are
// decided on them: in double precision near-ties fall the other way and
// the best-of-all dumps change.
type Result struct {
	Class Class
	Limit Limit
	Flags Flags
	P0    float32
	T0    float32
	Q     float32
	Re    float32
	// ReRatio is Re over the flight Reynolds number.
	ReRatio float32
	V       float32
}

// Better reports whether a is a better answer than b for the same point:
// the better class by Rank, then the Reynolds ratio nearer 1 (on a log
// scale).
func Better(a, b Result) bool { return better(&a, &b) }

func better(a, b *Result) bool {
	return outranks(a.Class.Rank(), a.ReRatio, b.Class.Rank(), b.ReRatio)
}

// outranks is Better's order on an answer's class rank and Reynolds
// ratio: answer a (rank ra, ratio a) beats answer b.
func outranks(ra int, a float32, rb int, b float32) bool {
	return ra < rb || (ra == rb && closerToOne(a, b))
}

func ratioDistance(r float32) float64 {
	if !(r > 0) {
		return math.Inf(1)
	}
	return math.Abs(math.Log(float64(r)))
}

// closerToOne reports ratioDistance(a) < ratioDistance(b). Where a and b
// lie on the same side of 1 it compares them directly: math.Log is
// strictly increasing over single-precision numbers (checked for every one
// from 2^-40 to 2^40), so the answer is the same without the logarithms.
// A ratio that is not a positive finite number has distance +Inf.
func closerToOne(a, b float32) bool {
	const lo, hi = 0x1p-40, 0x1p40
	switch {
	case !(a > 0) || a > math.MaxFloat32:
		return false // +Inf is not below anything
	case !(b > 0) || b > math.MaxFloat32:
		return true // a's distance is finite
	case a >= lo && a <= hi && b >= lo && b <= hi && (a >= 1) == (b >= 1):
		if a >= 1 {
			return a < b
		}
		return a > b
	}
	return ratioDistance(a) < ratioDistance(b)
}

// SkinFriction is the Prandtl–Schlichting turbulent flat-plate mean skin
// friction coefficient, Cf = 0.455/(log10 Re)^2.58 (Schlichting, Boundary
// Layer Theory; intended for roughly 1e5 < Re < 1e9). It returns NaN for
// Re <= 1.
func SkinFriction(re float64) float64 {
	if !(re > 1) {
		return math.NaN()
	}
	return 0.455 / math.Pow(math.Log10(re), 2.58)
}

// Reynolds-number range over which the Prandtl–Schlichting formula is
// normally used: up to about 1e9 (Schlichting, Boundary Layer Theory; from
// memory); the lower end, where a turbulent flat plate is a fair model, is
// common practice.
const (
	SkinFrictionReMin = 1e5
	SkinFrictionReMax = 1e9
)

// SkinFrictionInRange reports whether Re lies where SkinFriction is meant
// to be used.
func SkinFrictionInRange(re float64) bool {
	return re >= SkinFrictionReMin && re <= SkinFrictionReMax
}

// skinFrictionDelta is Cf(model) − Cf(flight), or 0 where either is not
// defined.
func skinFrictionDelta(reModel, reFlight float64) float64 {
	if !(reModel > 1) || !(reFlight > 1) || reModel == reFlight {
		return 0
	}
	return SkinFriction(reModel) - SkinFriction(reFlight)
}
