package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/report"
	"likewind/envelope/whatif"
)

// demoFiles are the demo's vehicle and facility files under testdata/.
const (
	demoVehicleFile  = "../../testdata/corvane-sx3.toml"
	demoVehicle2File = "../../testdata/halcyra-ha1.toml"
	demoFacFile      = "../../testdata/facilities.toml"
)

func TestScalesCommand(t *testing.T) {
	e := outDemoEval(t)
	code, out, errs := outCmd("scales")
	if code != 0 {
		t.Fatalf("scales exit %d: %s", code, errs)
	}
	for _, f := range e.Facilities {
		if !strings.Contains(out, f.Name+" (") {
			t.Errorf("text lacks the block of %q", f.Name)
		}
	}
	for _, want := range []string{"Model-scale study of", "fit limit", "in force", "Caution: "} {
		if !strings.Contains(out, want) {
			t.Errorf("text lacks %q", want)
		}
	}

	code, out, errs = outCmd("scales", "--format", "csv", "--facility", "kellen", "--steps", "12")
	if code != 0 {
		t.Fatalf("scales csv exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	st, err := e.Study(3, envelope.StudyOptions{Steps: 12})
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != len(st.Steps)+1 {
		t.Fatalf("CSV %d rows, want %d steps and a header", len(rows), len(st.Steps))
	}
	for k, row := range rows[1:] {
		if row[1] != e.Facilities[3].Name || row[2] != report.Num(st.Steps[k].Scale).String() ||
			row[10] != report.Num(st.Steps[k].Shares.Matched()).String() {
			t.Errorf("CSV row %d: %v, want scale %g matched %g", k, row[:11], st.Steps[k].Scale, st.Steps[k].Shares.Matched())
		}
	}

	code, out, errs = outCmd("scales", "--format", "json", "--date", "2025-03-04", "--min", "1/200", "--max", "0.2")
	if code != 0 {
		t.Fatalf("scales json exit %d: %s", code, errs)
	}
	var got report.Scales
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatal(err)
	}
	if got.Tool != "likewind" || got.Version != version || got.Generated != "2025-03-04" || got.Caution == "" {
		t.Errorf("JSON header %+v", got.ExportInfo)
	}
	steps := got.Vehicles[0].Facilities[0].Steps
	if first, last := float64(steps[0].Scale), float64(steps[len(steps)-1].Scale); first != 0.005 || last != 0.2 {
		t.Errorf("--min 1/200 --max 0.2: steps %g to %g", first, last)
	}
}

// TestScalesVehicles: two vehicle files, in any order among the facility
// files, give a block per vehicle and the comparison; with one vehicle
// file given after the facilities the output is as with it first.
func TestScalesVehicles(t *testing.T) {
	code, out, errs := outCmd("scales", demoFacFile, demoVehicle2File, demoVehicleFile, "--steps", "8")
	if code != 0 {
		t.Fatalf("scales exit %d: %s", code, errs)
	}
	if n := strings.Count(out, "Model-scale study of "); n != 2 || !strings.Contains(out, "Best scale per vehicle") {
		t.Errorf("%d vehicle blocks; comparison %v", n, strings.Contains(out, "Best scale per vehicle"))
	}
	if strings.Index(out, "Halcyra") > strings.Index(out, "Corvane") {
		t.Error("vehicle blocks not in the order of the files")
	}
	_, a, _ := outCmd("scales", demoVehicleFile, demoFacFile, "--steps", "8")
	_, b, _ := outCmd("scales", demoFacFile, demoVehicleFile, "--steps", "8")
	if a != b || a == "" {
		t.Error("one vehicle file after the facility files gives another output")
	}
}

func TestCoverageVehicles(t *testing.T) {
	// One vehicle: the report of today, whatever the order of the files.
	_, single, _ := outCmd("coverage", demoVehicleFile, demoFacFile)
	_, swapped, _ := outCmd("coverage", demoFacFile, demoVehicleFile)
	if single != swapped || !strings.HasPrefix(single, "Coverage of ") {
		t.Error("coverage with the vehicle file second differs")
	}
	code, out, errs := outCmd("coverage", demoVehicleFile, demoVehicle2File, demoFacFile)
	if code != 0 {
		t.Fatalf("coverage exit %d: %s", code, errs)
	}
	if !strings.HasPrefix(out, single[:strings.Index(single, "Caution")]) {
		t.Error("the first vehicle's block is not its single report")
	}
	if !strings.Contains(out, "Comparison of vehicles") || strings.Count(out, "Coverage of ") != 2 {
		t.Errorf("no comparison or not two blocks:\n%s", out)
	}
	code, out, errs = outCmd("coverage", "--format", "json", demoVehicleFile, demoVehicle2File, demoFacFile)
	if code != 0 {
		t.Fatalf("coverage json exit %d: %s", code, errs)
	}
	var cs report.CoverageSet
	if err := json.Unmarshal([]byte(out), &cs); err != nil {
		t.Fatal(err)
	}
	if len(cs.Vehicles) != 2 || len(cs.Comparison) != len(cs.Vehicles[0].Facilities)+1 {
		t.Errorf("JSON: %d vehicles, %d comparison rows", len(cs.Vehicles), len(cs.Comparison))
	}
}

// TestCoverageGolden keeps the single-vehicle coverage report as it was
// before several vehicles and balance limits were added (the demo has no
// load data).
func TestCoverageGolden(t *testing.T) {
	for _, format := range []string{"text", "csv", "json"} {
		code, out, errs := outCmd("coverage", "--format", format)
		if code != 0 {
			t.Fatalf("coverage %s exit %d: %s", format, code, errs)
		}
		checkGolden(t, "coverage_"+format+".golden", out)
	}
}

func TestScalesBadFlags(t *testing.T) {
	dir := t.TempDir()
	session := filepath.Join(dir, "s.json")
	if err := os.WriteFile(session, []byte("{}"), 0o600); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"scales", "--steps", "1"}, 2, "--steps 1: want 2 to"},
		{[]string{"scales", "--min", "0"}, 2, "--min"},
		{[]string{"scales", "--max", "11"}, 2, "--max"},
		{[]string{"scales", "--min", "0.2", "--max", "0.1"}, 2, "is not below --max"},
		{[]string{"scales", "--format", "xml"}, 2, `--format "xml"`},
		{[]string{"scales", "--facility", "nowhere"}, 2, "no facility matches"},
		{[]string{"scales", demoFacFile}, 2, "no vehicle file"},
		{[]string{"scales", demoVehicleFile}, 2, "no facility file"},
		{[]string{"scales", demoVehicleFile, demoVehicle2File, demoFacFile, "--session", session}, 2, "one vehicle's files"},
		{[]string{"coverage", demoVehicleFile, demoVehicle2File, demoFacFile, "--session", session}, 2, "one vehicle's files"},
		{[]string{"plot", "--chart", "pie", "-o", filepath.Join(dir, "x.png")}, 2, "want map, re-mach, scales, both or all"},
		{[]string{"plot", "--chart", "all", "-o", "-", "--format", "png"}, 2, "takes one picture"},
	} {
		code, _, errs := outCmd(tc.args...)
		if code != tc.code || !strings.Contains(errs, tc.want) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", tc.args, code, errs, tc.code, tc.want)
		}
	}
}

func TestPlotScales(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "study.svg")
	if code, _, errs := outCmd("plot", "--chart", "scales", "--facility", "Harl", "-o", p); code != 0 {
		t.Fatalf("plot exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(b))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
	}
	if !bytes.Contains(b, []byte("Harl Cove")) || bytes.Contains(b, []byte("Kellen Fold")) {
		t.Error("--facility Harl: the chart should show Harl Cove alone")
	}
	// all: the two pictures of both and the scales chart; both: two.
	base := filepath.Join(dir, "set.png")
	code, out, errs := outCmd("plot", "--chart", "all", "-o", base)
	if code != 0 {
		t.Fatalf("plot all exit %d: %s", code, errs)
	}
	for _, name := range []string{"set-map.png", "set-remach.png", "set-scales.png"} {
		if !exists(filepath.Join(dir, name)) || !strings.Contains(out, name) {
			t.Errorf("%s not written or not named", name)
		}
	}
	base = filepath.Join(dir, "pair.png")
	if code, _, errs := outCmd("plot", "--chart", "both", "-o", base); code != 0 {
		t.Fatalf("plot both exit %d: %s", code, errs)
	}
	if exists(filepath.Join(dir, "pair-scales.png")) {
		t.Error("--chart both wrote the scales chart")
	}
}

// TestScalesSession: a session's what-if values apply, so a scale set
// for every facility is the scale in force of every study.
func TestScalesSession(t *testing.T) {
	sess := outDemoSession(t, nil, whatif.Changes{Values: map[string]float64{"scale": 0.05}}, "")
	code, out, errs := outCmd("scales", "--session", sess, "--format", "json")
	if code != 0 {
		t.Fatalf("scales exit %d: %s", code, errs)
	}
	var got report.Scales
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatal(err)
	}
	for _, f := range got.Vehicles[0].Facilities {
		inForce := 0
		for _, x := range f.Steps {
			if strings.Contains(x.Marks, "in force") {
				inForce++
				if float64(x.Scale) != 0.05 {
					t.Errorf("%s: in force at %g, want the session's 0.05", f.Facility, float64(x.Scale))
				}
			}
		}
		if inForce != 1 || float64(f.Scale) != 0.05 {
			t.Errorf("%s: scale %g, %d steps in force", f.Facility, float64(f.Scale), inForce)
		}
	}
}
