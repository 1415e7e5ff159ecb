package report

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"flag"
	"fmt"
	"image/color"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope"
)

// The golden files under testdata/golden record the exports and pictures
// as the code wrote them before a rewrite for speed, so that the rewrite
// is shown to keep every byte (exports) or every visible pixel (pictures,
// within pictureTolerance). They only record: the values themselves are
// checked by the other tests of the package. Rewrite them with
//
//	go test ./envelope/report/ -run Golden -update
//
// and read the diff (or the picture) before committing.
var update = flag.Bool("update", false, "rewrite the golden files under testdata/golden")

// goldenPath is the path of golden file name.
func goldenPath(name string) string { return filepath.Join("testdata", "golden", name) }

// checkGoldenBytes compares got with golden file name (rewriting it with
// -update) and reports the first differing line.
func checkGoldenBytes(t *testing.T, name string, got []byte) {
	t.Helper()
	p := goldenPath(name)
	if *update {
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(p)
	if err != nil {
		t.Fatalf("golden %s: %v (run with -update to record it)", name, err)
	}
	if bytes.Equal(got, want) {
		return
	}
	gl, wl := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
	for k := 0; k < max(len(gl), len(wl)); k++ {
		var g, w string
		if k < len(gl) {
			g = gl[k]
		}
		if k < len(wl) {
			w = wl[k]
		}
		if g != w {
			t.Fatalf("%s differs from the golden file at line %d (%d bytes, golden %d):\n got: %.400q\nwant: %.400q", name, k+1, len(got), len(want), g, w)
		}
	}
	t.Fatalf("%s differs from the golden file (%d bytes, golden %d)", name, len(got), len(want))
}

// goldenInfo is the JSON export's run description in the golden files.
var goldenInfo = ExportInfo{Tool: "likewind", Version: "golden", Generated: "2026-01-01"}

// demoFleet is both demo vehicles and the demo facilities, loaded afresh
// (the caller may change them).
func demoFleet(t testing.TB) ([]*envelope.Vehicle, []envelope.Facility) {
	t.Helper()
	vs, err := envelope.DemoVehicles()
	if err != nil || len(vs) < 2 {
		t.Fatalf("DemoVehicles() = %d vehicles, %v", len(vs), err)
	}
	_, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	return vs, facs
}

// plotCharts are the two pictures the plot command draws of e: the class
// map of the best of all and the Reynolds–Mach chart of every facility.
func plotCharts(t testing.TB, e *envelope.Evaluation) (mc, rc *Chart) {
	t.Helper()
	mc, err := MapChart(e, -1, false)
	if err != nil {
		t.Fatal(err)
	}
	if rc, err = ReMachChart(e, nil); err != nil {
		t.Fatal(err)
	}
	return mc, rc
}

// evalDemoGrid evaluates every demo facility on demo vehicle k with its
// grid set to rows × cols points (0 keeps the demo's own axis), the
// facility names replaced by rename (when not nil).
func evalDemoGrid(t testing.TB, k, rows, cols int, rename func(int, string) string) *envelope.Evaluation {
	t.Helper()
	vs, facs := demoFleet(t)
	v := vs[k]
	if rows > 0 {
		v.Grid.Altitude.Count, v.Grid.Altitude.Step = rows, 0
	}
	if cols > 0 {
		v.Grid.Speed.Count, v.Grid.Speed.Step = cols, 0
	}
	if rename != nil {
		for f := range facs {
			facs[f].Name = rename(f, facs[f].Name)
		}
	}
	e, err := envelope.Evaluate(v, facs, envelope.DefaultSettings(v))
	if err != nil {
		t.Fatalf("Evaluate = %v", err)
	}
	if err := e.Err(); err != nil {
		t.Fatal(err)
	}
	return e
}

// hostileNames gives the demo facilities names with every character the
// CSV and JSON writers treat specially: separators, quotes, a leading
// space, a backslash, HTML's markup characters, non-ASCII letters, and
// (after CleanText's escapes) a control character and a line separator.
func hostileNames(k int, name string) string {
	odd := []string{
		`comma, "quoted" ` + name,
		` leading space ` + name,
		`<b>&amp;</b> \ ` + name,
		"Überdruck–Kanal 風洞 " + name,
		"tab\there\nline\u2028sep " + name,
		`\.`,
	}
	return odd[k%len(odd)]
}

// goldenExports are the exports recorded: the demo's own grids (as a
// SHA-256 each: several MB), and a small grid and the hostile names in
// full.
func goldenExports(t *testing.T) (hashes map[string][]byte, small map[string][]byte) {
	hashes, small = map[string][]byte{}, map[string][]byte{}
	write := func(e *envelope.Evaluation, format string) []byte {
		var b bytes.Buffer
		var err error
		if format == "csv" {
			err = WriteExportCSV(&b, e.Maps)
		} else {
			err = WriteExportJSON(&b, goldenInfo, e.Maps)
		}
		if err != nil {
			t.Fatalf("export %s: %v", format, err)
		}
		return b.Bytes()
	}
	for _, format := range []string{"csv", "json"} {
		for k := range 2 {
			hashes[fmt.Sprintf("demo%d.%s", k, format)] = write(evalDemoGrid(t, k, 0, 0, nil), format)
		}
		small["export_small."+format] = write(evalDemoGrid(t, 0, 9, 12, nil), format)
		small["export_hostile."+format] = write(evalDemoGrid(t, 1, 5, 7, hostileNames), format)
	}
	return hashes, small
}

// TestExportGolden: the CSV and JSON exports of the demo keep their bytes.
func TestExportGolden(t *testing.T) {
	hashes, small := goldenExports(t)
	var sums strings.Builder
	for _, name := range []string{"demo0.csv", "demo1.csv", "demo0.json", "demo1.json"} {
		s := sha256.Sum256(hashes[name])
		fmt.Fprintf(&sums, "%s  %s %d bytes\n", hex.EncodeToString(s[:]), name, len(hashes[name]))
	}
	checkGoldenBytes(t, "export_demo.sha256", []byte(sums.String()))
	for _, name := range []string{"export_small.csv", "export_small.json", "export_hostile.csv", "export_hostile.json"} {
		checkGoldenBytes(t, name, small[name])
	}
}

// pictureTolerance is how far a chart may drift from its golden picture
// and still count as the same picture: a pixel differs when a channel
// differs by more than Level (of 255); at most Share of the pixels may
// differ. The tolerance is there for anti-aliased edges only (a flight
// dot drawn as a stamped raster instead of a vector circle shades its rim
// pixels a little differently); a moved, missing or recoloured element
// changes far more pixels than Share.
var pictureTolerance = struct {
	Level int
	Share float64
}{Level: 40, Share: 0.0005}

// pictureDiff decodes two PNG pictures and returns the share of pixels
// that differ by more than level in any channel, and the largest channel
// difference.
func pictureDiff(t *testing.T, got, want []byte, level int) (share float64, worst int) {
	t.Helper()
	a, err := png.Decode(bytes.NewReader(got))
	if err != nil {
		t.Fatalf("decode picture: %v", err)
	}
	b, err := png.Decode(bytes.NewReader(want))
	if err != nil {
		t.Fatalf("decode golden picture: %v", err)
	}
	if a.Bounds() != b.Bounds() {
		t.Fatalf("picture is %v, golden %v", a.Bounds(), b.Bounds())
	}
	r := a.Bounds()
	n := 0
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			c1 := color.NRGBAModel.Convert(a.At(x, y)).(color.NRGBA)
			c2 := color.NRGBAModel.Convert(b.At(x, y)).(color.NRGBA)
			d := max(absDiff(c1.R, c2.R), absDiff(c1.G, c2.G), absDiff(c1.B, c2.B), absDiff(c1.A, c2.A))
			worst = max(worst, d)
			if d > level {
				n++
			}
		}
	}
	return float64(n) / float64(r.Dx()*r.Dy()), worst
}

func absDiff(a, b uint8) int {
	if a > b {
		return int(a - b)
	}
	return int(b - a)
}

// goldenCharts are the demo's pictures as plot writes them: the class map
// of the best of all facilities and the Reynolds–Mach chart.
func goldenCharts(t *testing.T) map[string]*Chart {
	mc, rc := plotCharts(t, outDemoEval(t))
	return map[string]*Chart{"chart_map.png": mc, "chart_remach.png": rc}
}

// TestChartGolden: the demo's PNG pictures look as recorded (within
// pictureTolerance).
func TestChartGolden(t *testing.T) {
	for name, ch := range goldenCharts(t) {
		got, err := ch.Render("png")
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if *update {
			checkGoldenBytes(t, name, got)
			continue
		}
		// issue 14: the faster PNG compression keeps a picture under 1 MB.
		if len(got) >= 1<<20 {
			t.Errorf("%s: %d bytes, want under 1 MB", name, len(got))
		}
		want, err := os.ReadFile(goldenPath(name))
		if err != nil {
			t.Fatalf("golden %s: %v (run with -update to record it)", name, err)
		}
		share, worst := pictureDiff(t, got, want, pictureTolerance.Level)
		t.Logf("%s: %.4f %% of the pixels differ by more than %d, largest difference %d", name, 100*share, pictureTolerance.Level, worst)
		if os.Getenv("LIKEWIND_PICTURE_OUT") != "" {
			_ = os.WriteFile(filepath.Join(os.Getenv("LIKEWIND_PICTURE_OUT"), name), got, 0o644)
		}
		if share > pictureTolerance.Share {
			t.Errorf("%s: %.3f %% of the pixels differ from the golden picture by more than %d (largest %d), want at most %.3f %%",
				name, 100*share, pictureTolerance.Level, worst, 100*pictureTolerance.Share)
		}
	}
}
