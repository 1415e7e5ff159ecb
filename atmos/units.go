package atmos

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Conversion factors to SI. The foot, inch, mile, nautical mile and pound are
// exact by definition (international yard and pound, 1959); the pound-force
// uses standard gravity 9.80665 m/s², so 1 lbf = 0.45359237 kg × 9.80665 m/s²
// = 4.4482216152605 N exactly (NIST Special Publication 811, Appendix B.8,
// lists it rounded, 4.448 222 N), and the foot and inch pound-force follow
// exactly from it. The inch of mercury is the conventional value (NIST
// Special Publication 811, Appendix B).
const (
	Foot              = 0.3048                           // m
	Inch              = 0.0254                           // m
	Mile              = 1609.344                         // m, statute mile
	NauticalMile      = 1852.0                           // m
	Knot              = NauticalMile / 3600              // m/s
	MilePerHour       = Mile / 3600                      // m/s
	KilometrePerHour  = 1000.0 / 3600                    // m/s
	FootPerSecond     = Foot                             // m/s
	PoundMass         = 0.45359237                       // kg
	PoundForce        = PoundMass * 9.80665              // N
	Slug              = PoundForce / Foot                // kg
	PSI               = PoundForce / (Inch * Inch)       // Pa, lbf/in²
	PSF               = PoundForce / (Foot * Foot)       // Pa, lbf/ft²
	Bar               = 1e5                              // Pa
	Atmosphere        = 101325.0                         // Pa, standard atmosphere
	Torr              = Atmosphere / 760                 // Pa
	MillimetreOfHg    = 133.322387415                    // Pa, conventional
	InchOfHg          = 3386.389                         // Pa, conventional
	SlugPerCubicFoot  = Slug / (Foot * Foot * Foot)      // kg/m³
	PoundPerCubicFoot = PoundMass / (Foot * Foot * Foot) // kg/m³
	FootPoundForce    = PoundForce * Foot                // N·m, lbf·ft
	InchPoundForce    = PoundForce * Inch                // N·m, lbf·in
	Minute            = 60.0                             // s
	Hour              = 3600.0                           // s
	Litre             = 1e-3                             // m³
	Tonne             = 1000.0                           // kg, metric ton
	CubicFoot         = Foot * Foot * Foot               // m³
)

// Dimension is the physical kind of a quantity read from text or shown on
// screen. It selects the accepted units.
type Dimension int

// Dimensions.
const (
	Length             Dimension = iota // m
	Area                                // m²
	Speed                               // m/s
	Pressure                            // Pa (absolute)
	Temperature                         // K (absolute)
	TemperatureDelta                    // K (a difference or offset, e.g. ΔT of a non-standard day)
	Dimensionless                       // pure number: Mach, Reynolds, ratios
	Density                             // kg/m³
	Force                               // N
	Moment                              // N·m (a moment of force, e.g. a balance's pitching-moment capacity)
	Time                                // s (a duration: a set-point change, a data point, a recharge)
	Volume                              // m³ (a storage vessel)
	Mass                                // kg
	MassRate                            // kg/s (a coolant use)
	TimePerTemperature                  // s/K (the time a temperature change takes per kelvin)
	numDimensions
)

var dimensionNames = [...]string{
	Length:             "length",
	Area:               "area",
	Speed:              "speed",
	Pressure:           "pressure",
	Temperature:        "temperature",
	TemperatureDelta:   "temperature difference",
	Dimensionless:      "dimensionless number",
	Density:            "density",
	Force:              "force",
	Moment:             "moment",
	Time:               "time",
	Volume:             "volume",
	Mass:               "mass",
	MassRate:           "mass flow",
	TimePerTemperature: "time per kelvin",
}

var dimensionExamples = [...]string{
	Length:             "35000 ft",
	Area:               "0.5 m2",
	Speed:              "250 kt",
	Pressure:           "101.325 kPa",
	Temperature:        "-56.5 degC",
	TemperatureDelta:   "15 K",
	Dimensionless:      "0.8",
	Density:            "1.225 kg/m3",
	Force:              "4.5 kN",
	Moment:             "600 N·m",
	Time:               "15 min",
	Volume:             "60 m3",
	Mass:               "500 kg",
	MassRate:           "8 t/h",
	TimePerTemperature: "1.5 min/K",
}

// Dimensions lists every dimension, in order.
func Dimensions() []Dimension {
	out := make([]Dimension, numDimensions)
	for d := range out {
		out[d] = Dimension(d)
	}
	return out
}

// String returns the dimension's name, e.g. "length".
func (d Dimension) String() string {
	if d >= 0 && d < numDimensions {
		return dimensionNames[d]
	}
	return fmt.Sprintf("Dimension(%d)", int(d))
}

// Errors wrapped by ParseQuantity and the conversion helpers, for errors.Is.
var (
	ErrNumber         = errors.New("bad number")
	ErrMissingUnit    = errors.New("missing unit")
	ErrUnknownUnit    = errors.New("unknown unit")
	ErrWrongDimension = errors.New("unit of the wrong dimension")
	ErrOutOfRange     = errors.New("value out of range")
)

// unitDef is one accepted unit: SI value = (v + shift) · scale.
type unitDef struct {
	name    string   // canonical spelling, listed in errors and accepted by ToSI/FromSI
	symbol  string   // display symbol
	aliases []string // other accepted spellings (after normalisation)
	exact   bool     // match only with exact case (e.g. MPa, never mPa)
	// hintCase: when text of another dimension is checked against this
	// unit for a "wrong dimension" hint, match only with exact case, so
	// that "NM" (nautical miles) is not hinted as "Nm".
	hintCase bool
	scale    float64
	shift    float64
}

func (u unitDef) toSI(v float64) float64   { return (v + u.shift) * u.scale }
func (u unitDef) fromSI(v float64) float64 { return v/u.scale - u.shift }

// unitTables lists the units accepted for each dimension; the first entry is
// the SI display unit. Immutable after initialisation.
var unitTables = [numDimensions][]unitDef{
	Length: {
		{name: "m", symbol: "m", aliases: []string{"metre", "metres", "meter", "meters"}, scale: 1},
		{name: "km", symbol: "km", aliases: []string{"kilometre", "kilometres", "kilometer", "kilometers"}, scale: 1000},
		{name: "mm", symbol: "mm", aliases: []string{"millimetre", "millimetres", "millimeter", "millimeters"}, scale: 1e-3},
		{name: "cm", symbol: "cm", aliases: []string{"centimetre", "centimetres", "centimeter", "centimeters"}, scale: 1e-2},
		{name: "in", symbol: "in", aliases: []string{"inch", "inches"}, scale: Inch},
		{name: "ft", symbol: "ft", aliases: []string{"foot", "feet"}, scale: Foot},
		{name: "kft", symbol: "kft", scale: 1000 * Foot},
		{name: "mi", symbol: "mi", aliases: []string{"mile", "miles"}, scale: Mile},
		{name: "nmi", symbol: "nmi", scale: NauticalMile},
	},
	Area: {
		{name: "m2", symbol: "m²", aliases: []string{"sqm"}, scale: 1},
		{name: "cm2", symbol: "cm²", aliases: []string{"sqcm"}, scale: 1e-4},
		{name: "mm2", symbol: "mm²", aliases: []string{"sqmm"}, scale: 1e-6},
		{name: "ft2", symbol: "ft²", aliases: []string{"sqft"}, scale: Foot * Foot},
		{name: "in2", symbol: "in²", aliases: []string{"sqin"}, scale: Inch * Inch},
	},
	Speed: {
		{name: "m/s", symbol: "m/s", aliases: []string{"mps"}, scale: 1},
		{name: "km/h", symbol: "km/h", aliases: []string{"kph", "kmh", "km/hr"}, scale: KilometrePerHour},
		{name: "kt", symbol: "kt", aliases: []string{"kts", "kn", "knot", "knots"}, scale: Knot},
		{name: "mph", symbol: "mph", aliases: []string{"mi/h"}, scale: MilePerHour},
		{name: "ft/s", symbol: "ft/s", aliases: []string{"fps", "ft/sec"}, scale: FootPerSecond},
	},
	Pressure: {
		{name: "Pa", symbol: "Pa", scale: 1},
		{name: "hPa", symbol: "hPa", scale: 100},
		{name: "kPa", symbol: "kPa", scale: 1e3},
		{name: "MPa", symbol: "MPa", exact: true, scale: 1e6},
		{name: "mbar", symbol: "mbar", aliases: []string{"mb", "millibar"}, scale: 100},
		{name: "bar", symbol: "bar", scale: Bar},
		{name: "psi", symbol: "psi", aliases: []string{"psia", "lbf/in2"}, scale: PSI},
		{name: "psf", symbol: "psf", aliases: []string{"psfa", "lbf/ft2", "lb/ft2"}, scale: PSF},
		{name: "atm", symbol: "atm", scale: Atmosphere},
		{name: "inHg", symbol: "inHg", scale: InchOfHg},
		{name: "mmHg", symbol: "mmHg", scale: MillimetreOfHg},
		{name: "torr", symbol: "torr", scale: Torr},
	},
	Temperature: {
		{name: "K", symbol: "K", aliases: []string{"kelvin"}, scale: 1},
		{name: "degC", symbol: "°C", aliases: []string{"C", "celsius"}, scale: 1, shift: 273.15},
		{name: "degF", symbol: "°F", aliases: []string{"F", "fahrenheit"}, scale: 5.0 / 9, shift: 459.67},
		{name: "degR", symbol: "°R", aliases: []string{"R", "rankine"}, scale: 5.0 / 9},
	},
	TemperatureDelta: {
		{name: "K", symbol: "K", aliases: []string{"kelvin"}, scale: 1},
		{name: "degC", symbol: "°C", aliases: []string{"C", "celsius"}, scale: 1},
		{name: "degF", symbol: "°F", aliases: []string{"F", "fahrenheit"}, scale: 5.0 / 9},
		{name: "degR", symbol: "°R", aliases: []string{"R", "rankine"}, scale: 5.0 / 9},
	},
	Dimensionless: nil,
	Density: {
		{name: "kg/m3", symbol: "kg/m³", scale: 1},
		{name: "g/cm3", symbol: "g/cm³", scale: 1000},
		{name: "slug/ft3", symbol: "slug/ft³", scale: SlugPerCubicFoot},
		{name: "lb/ft3", symbol: "lb/ft³", aliases: []string{"lbm/ft3"}, scale: PoundPerCubicFoot},
	},
	Force: {
		{name: "N", symbol: "N", aliases: []string{"newton", "newtons"}, scale: 1},
		{name: "daN", symbol: "daN", aliases: []string{"decanewton", "decanewtons"}, scale: 10},
		{name: "kN", symbol: "kN", aliases: []string{"kilonewton", "kilonewtons"}, scale: 1e3},
		{name: "lbf", symbol: "lbf", aliases: []string{"pound-force", "pounds-force", "poundforce"}, scale: PoundForce},
	},
	// Moments are written with a middle dot, a space or nothing between
	// the force and the length ("N·m", "N m", "Nm"; normaliseUnit drops
	// the space and reads "⋅" and "*" as "·"), or with a hyphen.
	Moment: {
		{name: "N·m", symbol: "N·m", hintCase: true, aliases: []string{"Nm", "N-m", "newton-metre", "newton-metres", "newtonmetre", "newtonmetres"}, scale: 1},
		{name: "kN·m", symbol: "kN·m", aliases: []string{"kNm", "kN-m"}, scale: 1e3},
		{name: "lbf·ft", symbol: "lbf·ft", aliases: []string{"lbfft", "lbf-ft", "ft·lbf", "ftlbf", "ft-lbf"}, scale: FootPoundForce},
		{name: "lbf·in", symbol: "lbf·in", aliases: []string{"lbfin", "lbf-in", "in·lbf", "inlbf", "in-lbf"}, scale: InchPoundForce},
	},
	Time: {
		{name: "s", symbol: "s", aliases: []string{"sec", "second", "seconds"}, scale: 1},
		{name: "min", symbol: "min", aliases: []string{"minute", "minutes"}, scale: Minute},
		{name: "h", symbol: "h", aliases: []string{"hr", "hour", "hours"}, scale: Hour},
	},
	Volume: {
		{name: "m3", symbol: "m³", aliases: []string{"cum"}, scale: 1},
		{name: "L", symbol: "L", aliases: []string{"litre", "litres", "liter", "liters"}, scale: Litre},
		{name: "ft3", symbol: "ft³", aliases: []string{"cuft"}, scale: CubicFoot},
	},
	Mass: {
		{name: "kg", symbol: "kg", aliases: []string{"kilogram", "kilograms"}, scale: 1},
		{name: "g", symbol: "g", aliases: []string{"gram", "grams"}, scale: 1e-3},
		{name: "t", symbol: "t", aliases: []string{"tonne", "tonnes"}, scale: Tonne},
		{name: "lb", symbol: "lb", aliases: []string{"lbm", "lbs", "pound", "pounds"}, scale: PoundMass},
	},
	MassRate: {
		{name: "kg/s", symbol: "kg/s", scale: 1},
		{name: "kg/h", symbol: "kg/h", aliases: []string{"kg/hr"}, scale: 1 / Hour},
		{name: "t/h", symbol: "t/h", aliases: []string{"t/hr"}, scale: Tonne / Hour},
		{name: "lb/s", symbol: "lb/s", aliases: []string{"lbm/s"}, scale: PoundMass},
		{name: "lb/h", symbol: "lb/h", aliases: []string{"lb/hr", "lbm/h"}, scale: PoundMass / Hour},
	},
	// A time per kelvin of temperature change; per degree Fahrenheit or
	// Rankine is 9/5 as much per kelvin.
	TimePerTemperature: {
		{name: "s/K", symbol: "s/K", aliases: []string{"s/degC"}, scale: 1},
		{name: "min/K", symbol: "min/K", aliases: []string{"min/degC"}, scale: Minute},
		{name: "h/K", symbol: "h/K", aliases: []string{"h/degC"}, scale: Hour},
		{name: "s/degF", symbol: "s/°F", aliases: []string{"s/degR"}, scale: 9.0 / 5},
		{name: "min/degF", symbol: "min/°F", aliases: []string{"min/degR"}, scale: Minute * 9 / 5},
	},
}

// customaryUnit names the display unit used by Format when customary is true.
var customaryUnit = [numDimensions]string{
	Length:             "ft",
	Area:               "ft2",
	Speed:              "kt",
	Pressure:           "psi",
	Temperature:        "degF",
	TemperatureDelta:   "degF",
	Density:            "slug/ft3",
	Force:              "lbf",
	Moment:             "lbf·ft",
	Time:               "h",
	Volume:             "ft3",
	Mass:               "lb",
	MassRate:           "lb/h",
	TimePerTemperature: "min/degF",
}

// siDisplayUnit names the display unit used by Format for SI output.
var siDisplayUnit = [numDimensions]string{
	Length:             "m",
	Area:               "m2",
	Speed:              "m/s",
	Pressure:           "kPa",
	Temperature:        "K",
	TemperatureDelta:   "K",
	Density:            "kg/m3",
	Force:              "N",
	Moment:             "N·m",
	Time:               "h",
	Volume:             "m3",
	Mass:               "kg",
	MassRate:           "kg/h",
	TimePerTemperature: "min/K",
}

// gaugeUnits are refused because every pressure here is absolute.
var gaugeUnits = []string{"psig", "barg", "kPag", "kPa(g)", "psi(g)", "bar(g)"}

// UnitsFor returns the canonical unit names accepted for dimension d (empty
// for Dimensionless or an unknown dimension). The slice is a fresh copy.
func UnitsFor(d Dimension) []string {
	if d < 0 || d >= numDimensions {
		return nil
	}
	out := make([]string, len(unitTables[d]))
	for i, u := range unitTables[d] {
		out[i] = u.name
	}
	return out
}

func acceptedList(d Dimension) string {
	return strings.Join(UnitsFor(d), ", ")
}

// normaliseUnit maps the ways people type a unit onto the table spellings:
// degree signs become "deg", superscripts become digits, "^" and all white
// space are dropped ("deg C" → "degC", "ft / s" → "ft/s", "m^2" → "m2"), and
// a dot operator or "*" between units becomes the middle dot ("N*m" → "N·m").
func normaliseUnit(u string) string {
	var b strings.Builder
	for _, r := range u {
		switch {
		case unicode.IsSpace(r), r == '^':
		case r == '°', r == 'º', r == '˚':
			b.WriteString("deg")
		case r == '℃':
			b.WriteString("degC")
		case r == '℉':
			b.WriteString("degF")
		case r == '\u212a': // Kelvin sign
			b.WriteByte('K')
		case r == '⋅', r == '*', r == '•':
			b.WriteString("·")
		case r == '²':
			b.WriteByte('2')
		case r == '³':
			b.WriteByte('3')
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

type unitMatch int

const (
	noMatch unitMatch = iota
	matched
	caseOnly // matches a case-sensitive unit only when case is ignored
)

func matchUnit(u unitDef, s string) unitMatch {
	names := append([]string{u.name}, u.aliases...)
	for _, n := range names {
		if n == s {
			return matched
		}
	}
	for _, n := range names {
		if strings.EqualFold(n, s) {
			if u.exact {
				return caseOnly
			}
			return matched
		}
	}
	return noMatch
}

// matchesExactly reports whether s is one of u's spellings, case and all.
func matchesExactly(u unitDef, s string) bool {
	if u.name == s {
		return true
	}
	for _, n := range u.aliases {
		if n == s {
			return true
		}
	}
	return false
}

// otherDimension finds the dimension other than d that has a unit
// spelled norm: one whose spelling matches with its case first, then one
// that matches with case ignored (never a hintCase unit).
func otherDimension(norm string, d Dimension) (Dimension, bool) {
	for _, exact := range []bool{true, false} {
		for od := Dimension(0); od < numDimensions; od++ {
			if od == d {
				continue
			}
			for _, u := range unitTables[od] {
				if exact && matchesExactly(u, norm) || !exact && !u.hintCase && matchUnit(u, norm) == matched {
					return od, true
				}
			}
		}
	}
	return 0, false
}

// lookupUnit finds unit text (already normalised) for dimension d.
func lookupUnit(norm string, d Dimension) (unitDef, error) {
	for _, g := range gaugeUnits {
		if strings.EqualFold(norm, g) {
			return unitDef{}, fmt.Errorf("%q is a gauge pressure unit; give absolute pressure (%s): %w",
				norm, acceptedList(Pressure), ErrUnknownUnit)
		}
	}
	for _, u := range unitTables[d] {
		switch matchUnit(u, norm) {
		case matched:
			return u, nil
		case caseOnly:
			return unitDef{}, fmt.Errorf("unit %q: write %q (units of different case differ by a factor of 10^9 here): %w",
				norm, u.name, ErrUnknownUnit)
		}
	}
	// A unit of another dimension: a hint. Spellings that match case and
	// all come first ("kN" is a force, though "kn" is a knot).
	if od, ok := otherDimension(norm, d); ok {
		if d == Dimensionless {
			return unitDef{}, fmt.Errorf("%q is a %s unit; expected a dimensionless number with no unit: %w",
				norm, od, ErrWrongDimension)
		}
		return unitDef{}, fmt.Errorf("%q is a %s unit; expected a %s (%s): %w",
			norm, od, d, acceptedList(d), ErrWrongDimension)
	}
	if d == Dimensionless {
		return unitDef{}, fmt.Errorf("unexpected unit %q; expected a dimensionless number with no unit: %w", norm, ErrUnknownUnit)
	}
	return unitDef{}, fmt.Errorf("unknown %s unit %q; accepted: %s: %w", d, norm, acceptedList(d), ErrUnknownUnit)
}

// splitNumber separates a leading decimal number from the rest of s.
// It accepts an optional sign (including U+2212 minus), digits with at most
// one decimal point, and an optional exponent. It returns ok=false if no
// digits lead the text.
func splitNumber(s string) (num, rest string, ok bool) {
	var b strings.Builder
	i := 0
	if r, n := utf8.DecodeRuneInString(s); r == '+' || r == '-' || r == '−' {
		if r == '−' {
			b.WriteByte('-')
		} else {
			b.WriteRune(r)
		}
		i += n
		for i < len(s) && s[i] == ' ' {
			i++
		}
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		b.WriteByte(s[i])
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		b.WriteByte('.')
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			b.WriteByte(s[i])
			i++
			digits++
		}
	}
	if digits == 0 {
		return "", s, false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j { // a real exponent, not the start of a unit
			b.WriteString(s[i:k])
			i = k
		}
	}
	return b.String(), s[i:], true
}

// ParseQuantity reads a value as a user types it, e.g. "35000 ft", "11km",
// "250 kt", "3 bar", "-56.5 degC", "15 K", and returns it in SI units for
// dimension d. A unit is required except for Dimensionless, which takes none.
//
// Spelling: white space between number and unit is optional; unit case is
// ignored ("KT", "Kt", "kts") except where it changes the meaning ("MPa" must
// be written so); "°C", "°F", "deg C", "m²", "m^2" and "ft2" are accepted.
// For TemperatureDelta, "15 K" and "15 degC" are the same offset and degF or
// degR count 5/9 K per degree. Pressures are absolute; gauge units are
// refused. No thousands separators: "35000 ft", not "35,000 ft".
//
// Errors name the input, the expected dimension and the accepted units; NaN,
// infinities, negative areas, speeds, pressures and densities, and
// temperatures below absolute zero are refused.
func ParseQuantity(s string, d Dimension) (float64, error) {
	if d < 0 || d >= numDimensions {
		return 0, fmt.Errorf("parse %q: unknown dimension %d", s, int(d))
	}
	t := strings.TrimSpace(s)
	if t == "" {
		return 0, fmt.Errorf("empty input; expected a %s such as %q: %w", d, dimensionExamples[d], ErrNumber)
	}
	num, rest, ok := splitNumber(t)
	if !ok {
		if isNonFiniteWord(t) {
			return 0, fmt.Errorf("%q: not a finite number: %w", s, ErrNumber)
		}
		return 0, fmt.Errorf("%q: no number; expected a %s such as %q: %w", s, d, dimensionExamples[d], ErrNumber)
	}
	if rest != "" && (rest[0] == ',' || rest[0] == '.' || rest[0] == '_' || (rest[0] >= '0' && rest[0] <= '9')) {
		return 0, fmt.Errorf("%q: malformed number (use '.' for decimals and no thousands separators): %w", s, ErrNumber)
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil && !(errors.Is(err, strconv.ErrRange) && !math.IsInf(v, 0)) {
		if errors.Is(err, strconv.ErrRange) {
			return 0, fmt.Errorf("%q: number out of range: %w", s, ErrOutOfRange)
		}
		return 0, fmt.Errorf("%q: malformed number: %w", s, ErrNumber)
	}
	unitText := normaliseUnit(rest)
	var si float64
	if d == Dimensionless {
		if unitText != "" {
			_, err := lookupUnit(unitText, d)
			return 0, fmt.Errorf("%q: %w", s, err)
		}
		si = v
	} else {
		if unitText == "" {
			return 0, fmt.Errorf("%q: missing %s unit; accepted: %s: %w", s, d, acceptedList(d), ErrMissingUnit)
		}
		u, err := lookupUnit(unitText, d)
		if err != nil {
			return 0, fmt.Errorf("%q: %w", s, err)
		}
		si = u.toSI(v)
	}
	if math.IsInf(si, 0) || math.IsNaN(si) {
		return 0, fmt.Errorf("%q: value out of range: %w", s, ErrOutOfRange)
	}
	if err := checkSign(si, d); err != nil {
		return 0, fmt.Errorf("%q: %w", s, err)
	}
	return si, nil
}

func isNonFiniteWord(t string) bool {
	l := strings.ToLower(strings.TrimLeft(t, "+-−"))
	return strings.HasPrefix(l, "nan") || strings.HasPrefix(l, "inf") || strings.HasPrefix(l, "∞")
}

func checkSign(si float64, d Dimension) error {
	switch d {
	case Area, Speed, Pressure, Density, Volume, Mass, MassRate:
		if si < 0 {
			return fmt.Errorf("%s must not be negative: %w", d, ErrOutOfRange)
		}
	case Temperature:
		if si < 0 {
			return fmt.Errorf("temperature %.6g K is below absolute zero: %w", si, ErrOutOfRange)
		}
	}
	return nil
}

// ToSI converts v expressed in unit (any accepted spelling) of dimension d to
// SI. For Dimensionless the unit must be empty.
func ToSI(v float64, unit string, d Dimension) (float64, error) {
	u, err := unitOf(unit, d)
	if err != nil {
		return 0, err
	}
	return u.toSI(v), nil
}

// FromSI converts the SI value v of dimension d to unit (any accepted
// spelling). For Dimensionless the unit must be empty.
func FromSI(v float64, unit string, d Dimension) (float64, error) {
	u, err := unitOf(unit, d)
	if err != nil {
		return 0, err
	}
	return u.fromSI(v), nil
}

var identityUnit = unitDef{scale: 1}

func unitOf(unit string, d Dimension) (unitDef, error) {
	if d < 0 || d >= numDimensions {
		return unitDef{}, fmt.Errorf("unit %q: unknown dimension %d", unit, int(d))
	}
	norm := normaliseUnit(unit)
	if d == Dimensionless && norm == "" {
		return identityUnit, nil
	}
	if norm == "" {
		return unitDef{}, fmt.Errorf("missing %s unit; accepted: %s: %w", d, acceptedList(d), ErrMissingUnit)
	}
	return lookupUnit(norm, d)
}

// Format renders the SI value v of dimension d for display with five
// significant figures, in SI (m, m², m/s, kPa, K, kg/m³, N, N·m) or, if
// customary is set, in customary units (ft, ft², kt, psi, °F, slug/ft³, lbf,
// lbf·ft). Dimensionless
// values have no unit.
func Format(v float64, d Dimension, customary bool) string {
	if d < 0 || d >= numDimensions {
		return FormatNumber(v)
	}
	if d == Dimensionless {
		return FormatNumber(v)
	}
	name := siDisplayUnit[d]
	if customary {
		name = customaryUnit[d]
	}
	s, err := FormatIn(v, d, name)
	if err != nil { // the display tables only name valid units
		return FormatNumber(v)
	}
	return s
}

// FormatIn renders the SI value v of dimension d in the given unit (any
// accepted spelling), e.g. FormatIn(q, Pressure, "psf").
func FormatIn(v float64, d Dimension, unit string) (string, error) {
	u, err := unitOf(unit, d)
	if err != nil {
		return "", err
	}
	n := FormatNumber(u.fromSI(v))
	if u.symbol == "" {
		return n, nil
	}
	return n + " " + u.symbol, nil
}

// FormatNumber writes x with five significant figures, in plain decimal
// notation between 1e-3 and 1e9 and in exponent notation otherwise, without
// trailing zeros.
func FormatNumber(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return strconv.FormatFloat(x, 'g', -1, 64)
	}
	if x == 0 {
		return "0"
	}
	a := math.Abs(x)
	if a >= 1e-3 && a < 1e9 {
		dec := 4 - int(math.Floor(math.Log10(a)))
		if dec < 0 {
			dec = 0
		}
		s := strconv.FormatFloat(x, 'f', dec, 64)
		if strings.Contains(s, ".") {
			s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
		}
		if s == "-0" {
			s = "0"
		}
		return s
	}
	s := strconv.FormatFloat(x, 'e', 4, 64)
	mant, exp, _ := strings.Cut(s, "e")
	if strings.Contains(mant, ".") {
		mant = strings.TrimRight(strings.TrimRight(mant, "0"), ".")
	}
	return mant + "e" + exp
}

// ParseAirspeed reads a flight speed as a user types it and returns its kind
// and value (Mach number, or m/s for TAS, EAS and CAS). Accepted forms:
//
//	"M0.85", "M 0.85", "Mach 0.85", "0.85 M", "0.85 Mach"
//	"250 KCAS", "250 KEAS", "480 KTAS"         (knots)
//	"250 kt CAS", "130 m/s EAS", "900 km/h TAS" (any speed unit, then the kind)
//
// A dimensional speed without TAS, EAS or CAS is refused rather than guessed.
func ParseAirspeed(s string) (SpeedKind, float64, error) {
	t := strings.TrimSpace(s)
	// Mach prefix: "M0.85", "Mach 0.85".
	for _, p := range []string{"mach", "m"} {
		if len(t) > len(p) && strings.EqualFold(t[:len(p)], p) {
			r := strings.TrimSpace(t[len(p):])
			if r != "" && (r[0] == '.' || (r[0] >= '0' && r[0] <= '9')) {
				v, err := ParseQuantity(r, Dimensionless)
				if err != nil {
					return 0, 0, fmt.Errorf("airspeed %q: %w", s, err)
				}
				if err := checkSpeed("Mach", v); err != nil {
					return 0, 0, fmt.Errorf("airspeed %q: %w", s, err)
				}
				return Mach, v, nil
			}
		}
	}
	num, rest, ok := splitNumber(t)
	if !ok {
		return 0, 0, fmt.Errorf("airspeed %q: no number; expected e.g. \"M0.85\", \"250 KCAS\" or \"130 m/s EAS\": %w", s, ErrNumber)
	}
	fields := strings.Fields(rest)
	kind := SpeedKind(-1)
	unit := ""
	switch {
	case len(fields) == 1 && (strings.EqualFold(fields[0], "M") || strings.EqualFold(fields[0], "mach")):
		v, err := ParseQuantity(num, Dimensionless)
		if err != nil {
			return 0, 0, fmt.Errorf("airspeed %q: %w", s, err)
		}
		if err := checkSpeed("Mach", v); err != nil {
			return 0, 0, fmt.Errorf("airspeed %q: %w", s, err)
		}
		return Mach, v, nil
	case len(fields) == 1 && len(fields[0]) == 4 && (fields[0][0] == 'k' || fields[0][0] == 'K'):
		k, err := ParseSpeedKind(fields[0][1:])
		if err == nil && k != Mach {
			kind, unit = k, "kt"
		}
	case len(fields) >= 2:
		k, err := ParseSpeedKind(fields[len(fields)-1])
		if err == nil && k != Mach {
			kind, unit = k, strings.Join(fields[:len(fields)-1], "")
		}
	}
	if kind < 0 {
		return 0, 0, fmt.Errorf("airspeed %q: say which speed: Mach (\"M0.85\"), or a speed unit followed by TAS, EAS or CAS (\"250 kt CAS\", \"250 KCAS\")", s)
	}
	v, err := ParseQuantity(num+" "+unit, Speed)
	if err != nil {
		return 0, 0, fmt.Errorf("airspeed %q: %w", s, err)
	}
	return kind, v, nil
}

// NoNegativeZero drops the minus sign of a formatted number that rounds
// to zero ("-0", "-0.00 m/s", "-0.0e+00" become "0", "0.00 m/s",
// "0.0e+00"), so that no output shows a negative zero; other text is
// returned as it is.
func NoNegativeZero(s string) string {
	rest, ok := strings.CutPrefix(s, "-")
	if !ok {
		return s
	}
	digits := false
	for _, c := range rest {
		switch {
		case c == '0':
			digits = true
		case c == '.':
		case c >= '1' && c <= '9':
			return s
		default:
			if !digits {
				return s
			}
			return rest
		}
	}
	if !digits {
		return s
	}
	return rest
}
