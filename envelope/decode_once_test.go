package envelope

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// countDecodes makes decodeTOML count its calls for the rest of the test.
func countDecodes(t *testing.T) *int {
	t.Helper()
	n := new(int)
	orig := decodeTOML
	decodeTOML = func(src string, v any) error {
		*n++
		return orig(src, v)
	}
	t.Cleanup(func() { decodeTOML = orig })
	return n
}

// TestDecodeOnce: every way in decodes each file exactly once (the line
// index and the size scan read the text without decoding it), and a file
// refused by its size or nesting is never decoded.
func TestDecodeOnce(t *testing.T) {
	n := countDecodes(t)
	examples := []string{
		filepath.Join("..", "testdata", "corvane-sx3.toml"),
		filepath.Join("..", "testdata", "halcyra-ha1.toml"),
		filepath.Join("..", "testdata", "facilities.toml"),
	}
	bad := func(name string) string { return filepath.Join("..", "testdata", "bad", name) }
	deep := filepath.Join(t.TempDir(), "deep.toml")
	if err := os.WriteFile(deep, []byte("x = [[[[[1]]]]]\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name string
		run  func()
		want int
	}{
		{"Check of three good files", func() { Check(examples...) }, 3},
		{"Check of a file with faults", func() { Check(bad("many_faults.toml")) }, 1},
		{"Check of a vehicle with an empty grid", func() { Check(bad("grid_misses_envelope.toml")) }, 1},
		{"Check of a syntax error", func() { Check(bad("syntax.toml")) }, 1},
		{"Check of a file nested too deep", func() { Check(deep) }, 0},
		{"LoadVehicle", func() { _, _ = LoadVehicle(examples[0]) }, 1},
		{"LoadFacilities", func() { _, _ = LoadFacilities(examples[2]) }, 1},
		{"Demo", func() { _, _, _ = Demo() }, 2},
	}
	for _, c := range cases {
		*n = 0
		c.run()
		if *n != c.want {
			t.Errorf("%s: %d decodes, want %d", c.name, *n, c.want)
		}
	}
	// The hook sees real decoding: a good file gives a decoded root.
	*n = 0
	if _, err := ParseVehicle("v.toml", []byte(strings.TrimSpace(baseVehicle)+"\n")); err != nil || *n != 1 {
		t.Errorf("ParseVehicle(baseVehicle) = %v after %d decodes, want nil after 1", err, *n)
	}
}
