package envelope

import (
	"fmt"
	"strconv"
	"strings"

	"likewind/atmos"
)

// MarshalVehicle writes v in the vehicle file format, every quantity in SI
// units at full precision, so that ParseVehicle gives back the same vehicle
// (apart from Source). Limits that are not set are left out; the grid is
// written as loaded, with its defaults filled in.
func MarshalVehicle(v *Vehicle) []byte {
	var b strings.Builder
	b.WriteString("# likewind vehicle file (SI units; see docs/FORMAT.md)\n\n[vehicle]\n")
	kv(&b, "name", tomlQuote(v.Name))
	kv(&b, "reference_length", si(v.RefLength, "m"))
	kv(&b, "reference_length_is", tomlQuote(v.RefLengthName))
	kv(&b, "reference_area", si(v.RefArea, "m2"))
	kv(&b, "span", si(v.Span, "m"))
	kv(&b, "frontal_area", si(v.FrontalArea, "m2"))

	b.WriteString("\n[envelope]\n")
	kv(&b, "speed_kind", tomlQuote(v.BoundaryKind.String()))
	kv(&b, "altitude_kind", tomlQuote(v.AltitudeKind.String()))
	kv(&b, "temperature_offset", si(v.DeltaT, "K"))
	b.WriteString("boundary = [\n")
	for _, w := range v.Boundary {
		fmt.Fprintf(&b, "  [%s, %s],\n", si(w.Altitude, "m"), speedText(w.Speed, v.BoundaryKind))
	}
	b.WriteString("]\n")

	l := v.Limits
	if l != (Limits{}) {
		b.WriteString("\n[limits]\n")
		if l.Ceiling != 0 {
			kv(&b, "ceiling", si(l.Ceiling, "m"))
		}
		if l.MaxMach != 0 {
			kv(&b, "max_mach", si(l.MaxMach, ""))
		}
		if l.MaxEAS != 0 {
			kv(&b, "max_eas", si(l.MaxEAS, "m/s"))
		}
		if l.MaxCAS != 0 {
			kv(&b, "max_cas", si(l.MaxCAS, "m/s"))
		}
		if l.MaxQ != 0 {
			kv(&b, "max_dynamic_pressure", si(l.MaxQ, "Pa"))
		}
		if l.MinSpeed != 0 {
			if l.MinSpeedKind == atmos.Mach {
				kv(&b, "min_speed", tomlQuote("M"+num(l.MinSpeed)))
			} else {
				kv(&b, "min_speed", tomlQuote(num(l.MinSpeed)+" m/s "+l.MinSpeedKind.String()))
			}
		}
	}

	b.WriteString("\n[grid]\n")
	kv(&b, "speed_kind", tomlQuote(v.Grid.SpeedKind.String()))
	writeAxis(&b, "altitude", v.Grid.Altitude, "m")
	su := "m/s"
	if v.Grid.SpeedKind == atmos.Mach {
		su = ""
	}
	writeAxis(&b, "speed", v.Grid.Speed, su)
	return []byte(b.String())
}

func writeAxis(b *strings.Builder, name string, a Axis, u string) {
	fmt.Fprintf(b, "\n[grid.%s]\n", name)
	kv(b, "from", si(a.Min, u))
	kv(b, "to", si(a.Max, u))
	if a.Step > 0 {
		kv(b, "step", si(a.Step, u))
	} else if a.Count > 0 {
		kv(b, "count", strconv.Itoa(a.Count))
	}
}

// MarshalFacilities writes facilities in the facility file format, every
// quantity in SI units at full precision, so that ParseFacilities gives
// back the same facilities (apart from Source).
func MarshalFacilities(fs []Facility) []byte {
	var b strings.Builder
	b.WriteString("# likewind facility file (SI units; see docs/FORMAT.md)\n")
	for _, f := range fs {
		b.WriteString("\n[[facility]]\n")
		kv(&b, "name", tomlQuote(f.Name))
		if f.Class != "" {
			kv(&b, "class", tomlQuote(f.Class))
		}
		kv(&b, "medium", tomlQuote(f.Medium.String()))
		if f.Medium.IsGas() {
			g := &f.Gas
			kv(&b, "mach_range", rangeText(g.MachMin, g.MachMax, ""))
			kv(&b, "stagnation_pressure_range", rangeText(g.P0Min, g.P0Max, "Pa"))
			kv(&b, "stagnation_temperature_range", rangeText(g.T0Min, g.T0Max, "K"))
			if g.MinStaticT != 0 {
				kv(&b, "min_static_temperature", si(g.MinStaticT, "K"))
			}
			kv(&b, "condensation_check", strconv.FormatBool(g.Condensation))
			kv(&b, "peak_local_mach", si(g.PeakLocalMach, ""))
		} else {
			w := &f.Water
			kv(&b, "speed_range", rangeText(w.SpeedMin, w.SpeedMax, "m/s"))
			kv(&b, "static_pressure_range", rangeText(w.PMin, w.PMax, "Pa"))
			kv(&b, "water_temperature_range", rangeText(w.TMin, w.TMax, "K"))
		}
		if f.QMax != 0 {
			kv(&b, "max_dynamic_pressure", si(f.QMax, "Pa"))
		}
		if f.MaxReynoldsPerM != 0 {
			kv(&b, "max_reynolds_per_metre", tomlQuote(num(f.MaxReynoldsPerM)+" /m"))
		}
		kv(&b, "section_width", si(f.Width, "m"))
		kv(&b, "section_height", si(f.Height, "m"))
		b.WriteString("\n[facility.model]\n")
		if f.Model.Scale != 0 {
			kv(&b, "scale", si(f.Model.Scale, ""))
		}
		kv(&b, "max_span_fraction", si(f.Model.MaxSpanFraction, ""))
		if f.Model.MaxBlockage != 0 {
			kv(&b, "max_blockage", si(f.Model.MaxBlockage, ""))
		}
	}
	return []byte(b.String())
}

func kv(b *strings.Builder, key, value string) {
	b.WriteString(key)
	b.WriteString(" = ")
	b.WriteString(value)
	b.WriteByte('\n')
}

// num writes x with the fewest digits that read back exactly.
func num(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

// si writes a quoted quantity in unit u ("" for pure numbers).
func si(x float64, u string) string {
	if u == "" {
		return tomlQuote(num(x))
	}
	return tomlQuote(num(x) + " " + u)
}

func speedText(x float64, k atmos.SpeedKind) string {
	if k == atmos.Mach {
		return si(x, "")
	}
	return si(x, "m/s")
}

func rangeText(lo, hi float64, u string) string {
	return "[" + si(lo, u) + ", " + si(hi, u) + "]"
}

// tomlQuote writes s as a TOML basic string.
func tomlQuote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"' || r == '\\':
			b.WriteByte('\\')
			b.WriteRune(r)
		case r < 0x20 || r == 0x7f:
			fmt.Fprintf(&b, `\u%04X`, r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return b.String()
}
