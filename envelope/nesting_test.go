package envelope

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// TestCheckNesting states the depth of each construct the formats use
// and of the first level beyond them.
func TestCheckNesting(t *testing.T) {
	tests := []struct {
		name      string
		src       string
		line, lvl int // 0, 0: within the limit
	}{
		{"boundary", "[envelope]\nboundary = [\n  [\"0 ft\", \"0.3\"],\n]\n", 0, 0},
		{"facility model", "[[facility]]\nname = \"a\"\n[facility.model]\nscale = \"1/40\"\n", 0, 0},
		{"dotted model key", "[[facility]]\nmodel.scale = \"1/40\"\n", 0, 0},
		{"inline facility list", "facility = [{name = \"a\", model = {scale = \"1/40\"}}]\n", 0, 0},
		{"inline envelope", "envelope = {boundary = [[\"0 ft\", \"0.3\"]]}\n", 0, 0},
		{"brackets in strings", "[vehicle]\nname = \"[[[[{{{{\"\nreference_length_is = '[[[['\n", 0, 0},
		{"brackets in a comment", "[vehicle] # [[[[[[\nname = \"x\" # {a={a={a={a=\n", 0, 0},
		{"brackets in multi-line strings", "[vehicle]\nname = \"\"\"\n[[[[[\n\"\"\"\nclass = '''\n{{{{{'''\nx = 1\n", 0, 0},
		{"escaped quote", "[vehicle]\nname = \"a\\\"[[[[[[\"\n", 0, 0},
		{"array of arrays", "x = [[[[1]]]]\n", 1, 5},
		{"deep array, line 3", "[vehicle]\nname = \"x\"\ny = [[[[\n]]]]\n", 3, 5},
		{"boundary one level too deep", "[envelope]\nboundary = [\n  [[\"0 ft\", \"0.3\"]],\n]\n", 3, 5},
		{"inline tables", "x = {a = {a = {a = {a = 1}}}}\n", 1, 5},
		{"dotted key", "a.b.c.d.e = 1\n", 1, 5},
		{"header", "[a.b.c.d.e]\n", 1, 5},
		{"array of tables header and key", "[[a.b.c]]\nx = 1\n", 2, 5},
		{"key in deep table", "[a.b.c.d]\nx = 1\n", 2, 5},
		{"array after a multi-line string", "s = \"\"\"\n\n\"\"\"\nx = [[[[[1]]]]]\n", 4, 5},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			line, lvl := checkNesting(tt.src, MaxNesting)
			if line != tt.line || lvl != tt.lvl {
				t.Errorf("checkNesting = line %d, level %d; want line %d, level %d", line, lvl, tt.line, tt.lvl)
			}
		})
	}
}

// TestExamplesWithinNesting: every example and demo file is within the
// limit (the limit refuses nothing the formats use).
func TestExamplesWithinNesting(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("..", "testdata", "*.toml"))
	demo, _ := filepath.Glob(filepath.Join("demo", "*.toml"))
	for _, f := range append(files, demo...) {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if line, lvl := checkNesting(string(data), MaxNesting); line != 0 {
			t.Errorf("%s: nesting %d at line %d, want within %d", f, lvl, line, MaxNesting)
		}
	}
}

// TestDeepNestingRefusedBeforeDecoding: 100 000 levels of brackets,
// braces or dotted keys are refused with a message naming the limit (the
// decoder would take gigabytes and minutes over them).
func TestDeepNestingRefusedBeforeDecoding(t *testing.T) {
	const n = 100000
	for name, src := range map[string]string{
		"arrays": "x = " + strings.Repeat("[", n) + strings.Repeat("]", n) + "\n",
		"tables": "x = " + strings.Repeat("{a=", n) + "1" + strings.Repeat("}", n) + "\n",
		"keys":   strings.Repeat("a.", n) + "a = 1\n",
	} {
		t.Run(name, func(t *testing.T) {
			_, err := ParseVehicle("deep.toml", []byte(src))
			want := "deep.toml:1: nesting: found keys, tables and arrays nested "
			if err == nil || !strings.HasPrefix(err.Error(), want) || !strings.Contains(err.Error(), "expected at most 4 levels") {
				t.Errorf("ParseVehicle = %v, want %q… expected at most 4 levels", err, want)
			}
		})
	}
}

// TestFileSizeLimit: a file larger than MaxFileSize is refused, naming the
// limit, without reading it to its end; one of exactly MaxFileSize is
// read.
func TestFileSizeLimit(t *testing.T) {
	dir := t.TempDir()
	const want = "big.toml: file size: found more than 4 MiB, expected a file of at most 4 MiB (4194304 bytes); vehicle and facility files are a few kilobytes"
	big := filepath.Join(dir, "big.toml")
	if err := os.WriteFile(big, []byte(baseVehicle+strings.Repeat("#", MaxFileSize-len(baseVehicle)+1)), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := LoadVehicle(big)
	if err == nil || strings.TrimPrefix(err.Error(), dir+string(filepath.Separator)) != want {
		t.Errorf("LoadVehicle(4 MiB + 1) = %v, want %q", err, want)
	}
	if errs := Check(big); len(errs) != 1 || !strings.HasSuffix(errs[0].Error(), "(4194304 bytes); vehicle and facility files are a few kilobytes") {
		t.Errorf("Check(4 MiB + 1) = %v, want the size error", errs)
	}
	// Padded with a comment to exactly the limit: still a good file.
	ok := baseVehicle + "#" + strings.Repeat("x", MaxFileSize-len(baseVehicle)-2) + "\n"
	if len(ok) != MaxFileSize {
		t.Fatalf("test setup: %d bytes", len(ok))
	}
	if _, err := ParseVehicle("ok.toml", []byte(ok)); err != nil {
		t.Errorf("ParseVehicle(exactly 4 MiB) = %v, want no error", err)
	}
	// A device that never ends is cut at the limit.
	if _, err := os.Stat("/dev/zero"); err == nil {
		var fe *FileErrors
		if _, err := LoadFacilities("/dev/zero"); !errors.As(err, &fe) || (*fe)[0].Field != "file size" {
			t.Errorf("LoadFacilities(/dev/zero) = %v, want the size error", err)
		}
	}
}

// decodedDepth is the nesting of a decoded TOML value: one level per map
// key and per array.
func decodedDepth(v any) int {
	d := 0
	switch x := v.(type) {
	case map[string]any:
		for _, e := range x {
			d = max(d, 1+decodedDepth(e))
		}
	case []map[string]any:
		for _, e := range x {
			d = max(d, 1+decodedDepth(e))
		}
	case []any:
		d = 1
		for _, e := range x {
			d = max(d, 1+decodedDepth(e))
		}
	}
	return d
}

// FuzzCheckNesting: the scan ends on any input, and text it lets through
// that the decoder accepts is never deeper than the limit allows (a table
// under an array of tables adds at most one level per header component).
func FuzzCheckNesting(f *testing.F) {
	addSeeds(f, "x = [[[[1]]]]", "a.b.c.d.e = 1", "x = {a={a={a={a=1}}}}", "[[a.b]]\n[[a.b.c]]\n", "s = '''[[[[[[", "s = \"\\\"[[[[[[\"")
	f.Fuzz(func(t *testing.T, data []byte) {
		src := string(data)
		if line, _ := checkNesting(src, MaxNesting); line != 0 {
			return
		}
		var root map[string]any
		if _, err := toml.Decode(src, &root); err != nil {
			return
		}
		if d := decodedDepth(root); d > 2*MaxNesting {
			t.Fatalf("decoded depth %d passed a scan limited to %d", d, MaxNesting)
		}
	})
}

// TestItemLimit: a file of more than MaxItems keys, values, arrays and
// tables is refused before decoding, at the line where the count passes.
func TestItemLimit(t *testing.T) {
	src := "x = [\n" + strings.Repeat("1,\n", MaxItems) + "]\n"
	_, err := ParseVehicle("many.toml", []byte(src))
	// Items: the key x, the array, then numbers; the 50001st item is
	// number 49999, on line 50000.
	const want = "many.toml:50000: file size: found more than 50000 keys, values, arrays and tables, expected at most 50000 (a vehicle file of 1000 boundary points holds about 3000)"
	if err == nil || err.Error() != want {
		t.Errorf("ParseVehicle = %v, want %q", err, want)
	}
	if f := scanShape(baseVehicle, MaxNesting, MaxItems); f.Line != 0 {
		t.Errorf("scanShape(baseVehicle) = %+v, want within the limits", f)
	}
}

// TestProblemListCapped: a file of thousands of faults lists the first
// maxListedProblems and counts the rest.
func TestProblemListCapped(t *testing.T) {
	_, err := ParseFacilities("empty.toml", []byte(strings.Repeat("[[facility]]\n", 1000)))
	var fe *FileErrors
	if !errors.As(err, &fe) || len(*fe) != maxListedProblems+1 {
		t.Fatalf("ParseFacilities(1000 empty facilities) = %d problems, want %d listed and a count", len(*fe), maxListedProblems)
	}
	last := (*fe)[maxListedProblems].Error()
	// Each empty facility lacks name, medium, section width and height.
	const want = "empty.toml: found 3800 more problems, not listed, expected at most 200 problems listed per file; correct the ones above and check again"
	if last != want {
		t.Errorf("last problem %q, want %q", last, want)
	}
}
