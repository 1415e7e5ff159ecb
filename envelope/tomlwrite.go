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
	writeFields(&b, "vehicle", vehicleFields(v))

	b.WriteString("\n[envelope]\n")
	kv(&b, "speed_kind", tomlQuote(v.BoundaryKind.String()))
	kv(&b, "altitude_kind", tomlQuote(v.AltitudeKind.String()))
	kv(&b, "temperature_offset", si(v.DeltaT, "K"))
	b.WriteString("boundary = [\n")
	for _, w := range v.Boundary {
		fmt.Fprintf(&b, "  [%s, %s],\n", si(w.Altitude, "m"), speedText(w.Speed, v.BoundaryKind))
	}
	b.WriteString("]\n")

	if v.Limits != (Limits{}) {
		b.WriteString("\n[limits]\n")
		writeFields(&b, "limits", limitFields(v))
	}

	b.WriteString("\n[grid]\n")
	kv(&b, "speed_kind", tomlQuote(v.Grid.SpeedKind.String()))
	writeAxis(&b, "altitude", v.Grid.Altitude, "m")
	writeAxis(&b, "speed", v.Grid.Speed, speedUnit(v.Grid.SpeedKind).si())
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
		for ff := range inReadOrder(facilityFields(&f), f.Medium) {
			ff.write(&b, "facility")
		}
	}
	return []byte(b.String())
}

// writeFields writes each of fs as a key of the table at path table.
func writeFields(b *strings.Builder, table string, fs []field) {
	for _, f := range fs {
		f.write(b, table)
	}
}

func (f quantityField) write(b *strings.Builder, _ string) {
	if f.required || f.def != 0 || *f.to != 0 {
		kv(b, f.key, si(*f.to, f.unit.si()))
	}
}

func (f rangeField) write(b *strings.Builder, _ string) {
	if f.required || *f.toLo != 0 || *f.toHi != 0 {
		kv(b, f.key, rangeText(*f.toLo, *f.toHi, f.unit.si()))
	}
}

func (f textField) write(b *strings.Builder, _ string) {
	if f.required || f.def != "" || *f.to != "" {
		kv(b, f.key, tomlQuote(*f.to))
	}
}

func (f boolField) write(b *strings.Builder, _ string) {
	kv(b, f.key, strconv.FormatBool(*f.to))
}

// write writes the sub-table's header, always, then its fields.
func (f tableField) write(b *strings.Builder, table string) {
	path := joinPath(table, f.key)
	b.WriteString("\n[" + path + "]\n")
	writeFields(b, path, f.fields)
}

func (f keyFunc) write(b *strings.Builder, _ string) { f.put(b) }

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

// speedText writes a speed of kind k: a Mach number, or m/s.
func speedText(x float64, k atmos.SpeedKind) string { return si(x, speedUnit(k).si()) }

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
