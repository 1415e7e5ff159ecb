package envelope

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
)

// unit says how a value is written and read.
type unit struct {
	dim     atmos.Dimension
	example string
	// mach accepts "M0.85" and "Mach 0.85" as well as "0.85".
	mach bool
	// ratio accepts "1/40", "1:40" and "80 %" as well as "0.025".
	ratio bool
	// perLength reads a unit Reynolds number: "30e6 /m" or "9e6 /ft".
	perLength bool
}

var (
	uAltitude  = unit{dim: atmos.Length, example: "41000 ft"}
	uLength    = unit{dim: atmos.Length, example: "1.2 m"}
	uArea      = unit{dim: atmos.Area, example: "12.5 m2"}
	uSpeed     = unit{dim: atmos.Speed, example: "350 kt"}
	uPressure  = unit{dim: atmos.Pressure, example: "2.5 bar"}
	uTemp      = unit{dim: atmos.Temperature, example: "-20 degC"}
	uDeltaT    = unit{dim: atmos.TemperatureDelta, example: "15 K"}
	uMach      = unit{dim: atmos.Dimensionless, example: "0.85", mach: true}
	uRatio     = unit{dim: atmos.Dimensionless, example: "1/40", ratio: true}
	uFraction  = unit{dim: atmos.Dimensionless, example: "80 %", ratio: true}
	uPerLength = unit{dim: atmos.Dimensionless, example: "30e6 /m", perLength: true}
	uCoeff     = unit{dim: atmos.Dimensionless, example: "1.2"}
	uForce     = unit{dim: atmos.Force, example: "4.5 kN"}
	uMoment    = unit{dim: atmos.Moment, example: "600 N·m"}
)

// expect describes a well-formed value of this unit.
func (u unit) expect() string {
	switch {
	case u.perLength:
		return `a unit Reynolds number per metre or per foot, e.g. "30e6 /m" or "9e6 /ft"`
	case u.ratio:
		return fmt.Sprintf(`a number, fraction or percentage, e.g. "0.025", "1/40" or "2.5 %%"`)
	case u.mach:
		return fmt.Sprintf(`a Mach number, e.g. %q`, u.example)
	case u.dim == atmos.Dimensionless:
		return fmt.Sprintf(`a number, e.g. %q`, u.example)
	}
	return fmt.Sprintf("a%s %s with its unit, e.g. %q (units: %s)", article(u.dim.String()), u.dim, u.example, strings.Join(atmos.UnitsFor(u.dim), ", "))
}

// si is the SI unit a value of this unit is written back in (tomlwrite.go):
// "" for pure numbers.
func (u unit) si() string {
	switch {
	case u.perLength:
		return "/m"
	case u.dim == atmos.Length:
		return "m"
	case u.dim == atmos.Area:
		return "m2"
	case u.dim == atmos.Speed:
		return "m/s"
	case u.dim == atmos.Pressure:
		return "Pa"
	case u.dim == atmos.Temperature, u.dim == atmos.TemperatureDelta:
		return "K"
	case u.dim == atmos.Force:
		return "N"
	case u.dim == atmos.Moment:
		return "N·m"
	case u.dim == atmos.Time:
		return "s"
	case u.dim == atmos.TimePerTemperature:
		return "s/K"
	case u.dim == atmos.Volume:
		return "m3"
	case u.dim == atmos.Mass:
		return "kg"
	case u.dim == atmos.MassRate:
		return "kg/s"
	}
	return ""
}

// expectRange describes a well-formed range of values of this unit.
func (u unit) expectRange() string {
	return "a range [low, high] of two values, each " + u.expect()
}

// qty is a number read from the file, with where it came from.
type qty struct {
	v     float64
	raw   any
	path  string // internal path, for the line
	field string // displayed field name
	ok    bool   // present and well formed
}

// value reads a quantity from a decoded TOML value.
func (d *doc) value(raw any, path, field string, u unit) qty {
	q := qty{raw: raw, path: path, field: field}
	var err error
	switch x := raw.(type) {
	case string:
		q.v, err = parseWithUnit(x, u)
		if err != nil {
			d.fail(path, field, strconv.Quote(x)+" ("+reason(x, err)+")", u.expect())
			return q
		}
	case int64:
		q.v = float64(x)
	case float64:
		q.v = x
	default:
		d.fail(path, field, describe(raw), u.expect())
		return q
	}
	if _, isString := raw.(string); !isString && (u.dim != atmos.Dimensionless || u.perLength) {
		d.fail(path, field, describe(raw)+" (a number without its unit)", u.expect()+", in quotes")
		return q
	}
	if math.IsNaN(q.v) || math.IsInf(q.v, 0) {
		d.fail(path, field, describe(raw), "a finite number")
		return q
	}
	q.ok = true
	return q
}

// parseWithUnit reads text as u says: Mach numbers and ratios with the
// parsers the command line and the interface use too (bounds.go).
func parseWithUnit(s string, u unit) (float64, error) {
	t := strings.TrimSpace(s)
	switch {
	case u.mach:
		return ParseMach(t)
	case u.ratio:
		return ParseRatio(t)
	case u.perLength:
		l := strings.ToLower(t)
		for _, suf := range []struct {
			s      string
			metres float64
		}{{" 1/m", 1}, {"/m", 1}, {" per m", 1}, {" per metre", 1}, {" per meter", 1},
			{" 1/ft", atmos.Foot}, {"/ft", atmos.Foot}, {" per ft", atmos.Foot}, {" per foot", atmos.Foot}} {
			if strings.HasSuffix(l, suf.s) {
				v, err := atmos.ParseQuantity(t[:len(t)-len(suf.s)], atmos.Dimensionless)
				return v / suf.metres, err
			}
		}
		return 0, errors.New("missing the per-length unit /m or /ft")
	}
	return atmos.ParseQuantity(t, u.dim)
}

// reason shortens a unit-parser error to the part that says what is wrong
// with the text (the expected form is given separately).
func reason(s string, err error) string {
	msg := err.Error()
	for _, sentinel := range []error{atmos.ErrNumber, atmos.ErrMissingUnit, atmos.ErrUnknownUnit, atmos.ErrWrongDimension, atmos.ErrOutOfRange} {
		msg = strings.TrimSuffix(msg, ": "+sentinel.Error())
	}
	msg = strings.TrimPrefix(msg, strconv.Quote(s)+": ")
	if i := strings.Index(msg, "; "); i > 0 {
		msg = msg[:i]
	}
	return msg
}

// need reports q when it is well formed but cond does not hold, and marks
// it unusable.
func (d *doc) need(q *qty, cond bool, expected string) bool {
	if !q.ok {
		return false
	}
	if !cond {
		d.fail(q.path, q.field, describe(q.raw), expected)
		q.ok = false
	}
	return q.ok
}

// within reports q when it is well formed but outside b (a shared bound,
// bounds.go), and returns its value, or 0 when it is not usable.
func (d *doc) within(q *qty, b Bound) float64 {
	if q.ok {
		q.v = b.Clamp(q.v)
	}
	if !d.need(q, b.Holds(q.v), b.Expected) {
		return 0
	}
	return q.v
}

// aboveZero bounds a value above 0 and at most hi, in the words of
// expected (a loader-only bound; shared ones live in bounds.go).
func aboveZero(hi float64, expected string) Bound {
	return Bound{Lo: 0, LoOpen: true, Hi: hi, Expected: expected}
}

// upTo bounds a value from above only, in the words of expected.
func upTo(hi float64, expected string) Bound {
	return Bound{Lo: math.Inf(-1), Hi: hi, Expected: expected}
}

// speedUnit is how a speed of kind is written: a Mach number or a speed.
func speedUnit(k atmos.SpeedKind) unit {
	if k == atmos.Mach {
		return uMach
	}
	return uSpeed
}
