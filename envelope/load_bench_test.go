package envelope

import (
	"fmt"
	"strings"
	"testing"
)

// worstFile is head, then unit repeated as often as the item limit
// allows (each unit holding perUnit items), then tail, padded with a
// comment line to exactly MaxFileSize bytes.
func worstFile(head, unit string, perUnit int, tail string) string {
	n := (MaxItems - 100) / perUnit
	body := head + strings.Repeat(unit, n) + tail
	pad := MaxFileSize - len(body) - 2
	return body + "#" + strings.Repeat("x", max(pad, 0)) + "\n"
}

// worstFiles are files as large and as deeply nested as allowed, with as
// many items as allowed, in the shapes that cost the loader most.
func worstFiles() map[string]string {
	at := strings.Index(baseVehicle, "boundary = [") + len("boundary = [")
	return map[string]string{
		// Numbers four levels deep under an unknown key.
		"deep array": worstFile("x = [[[", "1,", 1, "1]]]\n"+baseVehicle),
		// Nested inline tables (five items each) in an array.
		"inline tables": worstFile("x = [", "{a={b=1}},", 5, "{a=1}]\n"+baseVehicle),
		// Empty facilities, each missing its keys.
		"empty facilities": worstFile("", "[[facility]]\n", 1, ""),
		// Boundary points (refused as more than 1000, after decoding).
		"long boundary": worstFile(baseVehicle[:at], `["1 ft","1 kt"],`, 3, "]\n"+baseVehicle[strings.Index(baseVehicle, "]\n\n[limits]")+2:]),
		// Unknown keys, each with a long string.
		"many keys": manyKeys(),
	}
}

// manyKeys is a table of distinct unknown keys with long strings, up to
// the item and size limits.
func manyKeys() string {
	var b strings.Builder
	b.WriteString(baseVehicle + "[grid.speed]\n")
	long := strings.Repeat("a", MaxFileSize/(MaxItems/2)-16)
	for k := 0; k < (MaxItems-100)/2; k++ {
		fmt.Fprintf(&b, "k%d = %q\n", k, long)
	}
	return b.String()
}

// BenchmarkLoadWorstAllowed loads each worst allowed file; B/op is the
// memory one load allocates (the figure the loader's limits keep
// bounded).
func BenchmarkLoadWorstAllowed(b *testing.B) {
	for name, src := range worstFiles() {
		data := []byte(src)
		if len(data) > MaxFileSize {
			b.Fatalf("%s: %d bytes, over the limit", name, len(data))
		}
		if f := scanShape(src, MaxNesting, MaxItems); f.Line != 0 {
			b.Fatalf("%s: beyond the limits at line %d: %+v", name, f.Line, f)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			b.SetBytes(int64(len(data)))
			for b.Loop() {
				if strings.Contains(name, "facilities") {
					_, _ = ParseFacilities("worst.toml", data)
				} else {
					_, _ = ParseVehicle("worst.toml", data)
				}
			}
		})
	}
}
