package main

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	"golang.org/x/net/html"

	"likewind/envelope"
	"likewind/envelope/report"
	"likewind/envelope/units"
	"likewind/tui"
)

// hostileVehicle and hostileFacilities are small files (invented data)
// the hostile-text tests put names into: a coarse grid keeps each run
// quick.
const hostileVehicle = `[vehicle]
name = "Test glider"
reference_length = "1.1 m"
reference_area = "26 m2"
span = "24 m"
frontal_area = "0.6 m2"

[envelope]
speed_kind = "EAS"
boundary = [
  ["0 ft", "40 kt"],
  ["0 ft", "120 kt"],
  ["30000 ft", "110 kt"],
  ["40000 ft", "50 kt"],
]

[grid.altitude]
count = 6

[grid.speed]
count = 6
`

const hostileFacilities = `[[facility]]
name = "Test tunnel"
class = "atmospheric"
medium = "air"
mach_range = ["0.05", "0.3"]
stagnation_pressure_range = ["1 bar", "5 bar"]
stagnation_temperature_range = ["280 K", "320 K"]
section_width = "2 m"
section_height = "1.5 m"

[[facility]]
name = "Test water tunnel"
medium = "water"
speed_range = ["0.5 m/s", "10 m/s"]
static_pressure_range = ["0.2 bar", "2 bar"]
water_temperature_range = ["10 degC", "30 degC"]
section_width = "0.5 m"
section_height = "0.5 m"
`

// rawControl returns a description of the first character of s that must
// not reach a terminal raw: a C0 control other than newline and tab, DEL,
// a C1 control, a bidirectional-text control, a line or paragraph
// separator, or a byte that is not UTF-8, and where it is. It returns ""
// when there is none.
func rawControl(s string) (string, int) {
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			return fmt.Sprintf("byte %#x (not UTF-8)", s[i]), i
		case r < 0x20 && r != '\n' && r != '\t', r == 0x7f, r >= 0x80 && r <= 0x9f,
			r == 0x061c, r == 0x200e, r == 0x200f, r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069,
			r == 0x2028, r == 0x2029:
			return fmt.Sprintf("U+%04X", r), i
		}
		i += n
	}
	return "", 0
}

func requireClean(t *testing.T, what, out string) {
	t.Helper()
	if c, i := rawControl(out); c != "" {
		lo, hi := max(i-40, 0), min(i+40, len(out))
		t.Fatalf("%s holds a raw %s: …%q…", what, c, out[lo:hi])
	}
}

// requireSVG checks that an SVG picture is well-formed XML without raw
// control characters.
func requireSVG(t *testing.T, what string, b []byte) {
	t.Helper()
	requireClean(t, what, string(b))
	dec := xml.NewDecoder(bytes.NewReader(b))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Fatalf("%s is not well-formed XML: %v", what, err)
		}
	}
}

// requireHTML checks that a page parses as HTML and that no text made an
// element: no script, and one heading of the first level.
func requireHTML(t *testing.T, what, page string) {
	t.Helper()
	doc, err := html.Parse(strings.NewReader(page))
	if err != nil {
		t.Fatalf("%s does not parse as HTML: %v", what, err)
	}
	count := map[string]int{}
	var walk func(*html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.ElementNode {
			count[n.Data]++
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(doc)
	if count["script"] > 0 || count["h1"] != 1 || count["iframe"] > 0 || count["img"] > 0 {
		t.Fatalf("%s: elements %v; a name made markup", what, count)
	}
}

// fileNamePart turns fuzz text into a name the file system takes.
func fileNamePart(s string) string {
	s = strings.NewReplacer("/", "_", "\x00", "_").Replace(s)
	for len(s) > 100 {
		_, n := utf8.DecodeLastRuneInString(s)
		s = s[:len(s)-n]
	}
	if s == "" || s == "." || s == ".." {
		s = "x"
	}
	return s
}

// hostileOutputs writes every output the commands make from an evaluation
// whose names, class words and file names are name and file, bypassing
// the loaders' refusal: the second wall alone must keep them clean.
func hostileOutputs(t *testing.T, name, file string) map[string]string {
	t.Helper()
	v, err := envelope.ParseVehicle(file, []byte(hostileVehicle))
	if err != nil {
		t.Fatal(err)
	}
	facs, err := envelope.ParseFacilities(file, []byte(hostileFacilities))
	if err != nil {
		t.Fatal(err)
	}
	v.Name, v.RefLengthName = name, name
	facs[0].Name, facs[0].Class = name, name
	facs[1].Name = name + " 2"
	e, err := envelope.Evaluate(v, facs, envelope.DefaultSettings(v))
	if err != nil {
		t.Fatal(err)
	}
	ev := &evaluated{in: inputs{vehicle: v, facilities: facs, files: []string{file, file}}, e: e,
		marks: []envelope.GridPoint{{Row: 1, Col: 1}}}
	out := map[string]string{}
	for _, fac := range []int{0, 1, -1} {
		d, err := renderDump(ev, dumpView{fac: fac, date: "2025-01-01"}, tui.PlainStyles())
		if err != nil {
			t.Fatal(err)
		}
		out[fmt.Sprintf("dump facility %d", fac)] = d
	}
	var b bytes.Buffer
	must := func(what string, err error) {
		t.Helper()
		if err != nil {
			t.Fatalf("%s: %v", what, err)
		}
		out[what] = b.String()
		b.Reset()
	}
	must("export csv", report.WriteExportCSV(&b, e.Solved()))
	must("export json", report.WriteExportJSON(&b, report.ExportInfo{Tool: "likewind"}, e.Solved()))
	r := report.NewCoverage(e)
	must("coverage text", r.WriteText(&b))
	must("coverage csv", r.WriteCSV(&b))
	must("coverage json", r.WriteJSON(&b))
	cs := report.NewCoverageSet([]*envelope.Evaluation{e, e})
	must("coverage set text", cs.WriteText(&b))
	must("coverage set csv", cs.WriteCSV(&b))
	must("coverage set json", cs.WriteJSON(&b))
	sr := report.NewScales(report.ExportInfo{Tool: "likewind"}, []*envelope.Evaluation{e, e}, envelope.StudyOptions{Steps: 6})
	must("scales text", sr.WriteText(&b))
	must("scales csv", sr.WriteCSV(&b))
	must("scales json", sr.WriteJSON(&b))
	p, err := planAll(ev, -1)
	if err != nil {
		t.Fatal(err)
	}
	must("runs text", p.writeText(&b, units.SI))
	must("runs csv", p.WriteCSV(&b))
	must("runs json", p.writeJSON(&b))
	rv, err := report.NewReview(report.ReviewInput{Info: report.ExportInfo{Tool: "likewind"}, Sources: ev.in.files,
		Session: file, Changed: []string{name}, Eval: e, Marks: ev.marks})
	if err != nil {
		t.Fatal(err)
	}
	must("report html", rv.WriteHTML(&b))
	requireHTML(t, "report html", out["report html"])
	for what, mk := range map[string]func() (*report.Chart, error){
		"map svg":     func() (*report.Chart, error) { return report.MapChart(e, 0, false) },
		"re-mach svg": func() (*report.Chart, error) { return report.ReMachChart(e, nil) },
		"scales svg": func() (*report.Chart, error) {
			studies, _ := e.StudyAll(envelope.StudyOptions{Steps: 6})
			return report.ScalesChart(e.Grid.Vehicle.Name, studies)
		},
	} {
		ch, err := mk()
		if err != nil {
			t.Fatal(err)
		}
		svg, err := ch.Render("svg")
		if err != nil {
			t.Fatal(err)
		}
		requireSVG(t, what, svg)
	}
	plain := tui.PlainStyles()
	m := tui.New(tui.Options{Vehicle: v, Facilities: facs, Inputs: []string{file, file}, Styles: &plain, Width: 120, Height: 40})
	out["interface"] = m.View()
	return out
}

// hostileCommands runs the commands on files holding name, in files named
// after file, and returns what each printed (stdout and stderr). A name
// the loaders refuse gives error messages, which must be as clean as the
// outputs.
func hostileCommands(t *testing.T, name, file string) map[string]string {
	t.Helper()
	dir := t.TempDir()
	v, err := envelope.ParseVehicle("v.toml", []byte(hostileVehicle))
	if err != nil {
		t.Fatal(err)
	}
	facs, err := envelope.ParseFacilities("f.toml", []byte(hostileFacilities))
	if err != nil {
		t.Fatal(err)
	}
	v.Name = name
	facs[0].Name, facs[0].Class = name, name
	base := fileNamePart(file)
	vp, fp := filepath.Join(dir, base+".toml"), filepath.Join(dir, base+"-f.toml")
	if err := os.WriteFile(vp, envelope.MarshalVehicle(v), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(fp, envelope.MarshalFacilities(facs), 0o644); err != nil {
		t.Fatal(err)
	}
	out := map[string]string{}
	for _, args := range [][]string{
		{"check", vp, fp, filepath.Join(dir, base+"-missing.toml")},
		{"dump", "--plain", "--date", "2025-01-01", vp, fp},
		{"export", vp, fp},
		{"export", "--format", "json", vp, fp},
		{"coverage", vp, fp},
		{"coverage", "--format", "csv", vp, fp},
		{"runs", vp, fp},
		{"runs", "--format", "json", vp, fp},
		{"report", vp, fp},
		{"plot", "--chart", "map", "-o", filepath.Join(dir, base+".svg"), vp, fp},
		{"dump", "--facility", name, vp, fp},
		{"dump", "-o", filepath.Join(dir, base+"-missing", "x.txt"), vp, fp},
	} {
		code, stdout, stderr := outCmd(args...)
		what := strings.Join(args[:min(3, len(args))], " ")
		out[what+" (stdout)"], out[what+" (stderr)"] = stdout, stderr
		if args[0] == "report" && code == 0 {
			requireHTML(t, "report page", stdout)
		}
		if args[0] == "plot" && code == 0 {
			svg, err := os.ReadFile(args[4])
			if err != nil {
				t.Fatal(err)
			}
			requireSVG(t, "plot file", svg)
		}
	}
	return out
}

// FuzzHostileText: whatever a name or a file name holds, no output of any
// command, no error message, picture or screen holds a raw control
// character other than newline and tab, and SVG stays well-formed XML.
func FuzzHostileText(f *testing.F) {
	for _, s := range []string{
		"Corvane SX-3",
		"\x1b]0;owned\x07",
		"\x1b[2J\x1b[H",
		"row\nrow\r\b\b",
		"\u202eoverride\u202c \u2066isolate\u2069 \u200f\u061c",
		"c1 \u009b31m \u0085",
		"bad \xff\xfe utf8",
		"sep\u2028\u2029",
		"tab\there",
		"<svg>&amp;\"'",
		"</title><script>alert(1)</script><h1>",
		"",
	} {
		f.Add(s, s)
	}
	f.Add("Kellen Fold", "\x1b[31mred")
	f.Fuzz(func(t *testing.T, name, file string) {
		for what, s := range hostileOutputs(t, name, file) {
			requireClean(t, what, s)
		}
		for what, s := range hostileCommands(t, name, file) {
			requireClean(t, what, s)
		}
	})
}

// TestHostileNamesShownEscaped states the visible form: a name holding
// an escape sequence appears with the escape written out, in every
// output that names it, and CSV keeps one line per record.
func TestHostileNamesShownEscaped(t *testing.T) {
	const name = "Glider\x1b]0;owned\x07\u202e"
	const shown = `Glider\x1b]0;owned\x07\u202e`
	out := hostileOutputs(t, name, "hostile\x1b[2J.toml")
	for _, what := range []string{"dump facility 0", "export csv", "coverage text", "runs text", "interface", "report html"} {
		if !strings.Contains(out[what], shown) {
			t.Errorf("%s does not show the name as %s", what, shown)
		}
	}
	if !strings.Contains(out["dump facility 0"], `hostile\x1b[2J.toml`) {
		t.Errorf("dump header does not show the file name escaped:\n%s", out["dump facility 0"])
	}
	clean := hostileOutputs(t, "X", "x.toml")
	for _, what := range []string{"export csv", "coverage csv", "runs csv"} {
		if got, want := strings.Count(out[what], "\n"), strings.Count(clean[what], "\n"); got != want {
			t.Errorf("%s: %d lines with the hostile name, %d with a plain one", what, got, want)
		}
	}
	var doc report.ExportDoc
	if err := json.Unmarshal([]byte(out["export json"]), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Vehicle.Name != shown || doc.Records[0].Facility != shown {
		t.Errorf("JSON names %q, %q; want %q", doc.Vehicle.Name, doc.Records[0].Facility, shown)
	}
	for what, s := range out {
		requireClean(t, what, s)
	}
}
