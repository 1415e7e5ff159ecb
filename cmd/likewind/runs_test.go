package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/report"
	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
	"likewind/tui"
)

// outRunsDoc is the JSON run list read back.
type outRunsDoc struct {
	Tool, Version, Generated, Caution, Units, Vehicle, Points string
	Facilities                                                []struct {
		Facility   string
		Medium     string
		Scale      report.Num `json:"model_scale"`
		SetPoints  int        `json:"set_points"`
		Changes    struct{ T0, P0, Mach, Any int }
		Runs       []report.RunRecord
		Unrunnable []report.RunRecord
	}
}

func outRunsJSON(t *testing.T, args ...string) outRunsDoc {
	t.Helper()
	code, out, errs := outCmd(append([]string{"runs", "--format", "json", "--date", "2025-01-01"}, args...)...)
	if code != 0 {
		t.Fatalf("runs %v exit %d: %s", args, code, errs)
	}
	var doc outRunsDoc
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("runs JSON read back: %v\n%s", err, out)
	}
	return doc
}

// back rebuilds engine runs from records, to recount changes.
func back(recs []report.RunRecord) []report.Run {
	var rs []report.Run
	for _, r := range recs {
		run := report.Run{Mach: float64(r.TestMach), P0: float64(r.P0), T0: float64(r.T0), Speed: float64(r.TestSpeed)}
		if r.Medium == "water" {
			run.Mach, run.P0, run.T0 = 0, float64(r.StaticPressure), float64(r.WaterTemperature)
		}
		rs = append(rs, run)
	}
	return rs
}

func TestRunsMatched(t *testing.T) {
	e := outDemoEval(t)
	doc := outRunsJSON(t)
	if doc.Points != "matched" || doc.Generated != "2025-01-01" || doc.Caution == "" {
		t.Errorf("header points %q date %q caution %q", doc.Points, doc.Generated, doc.Caution)
	}
	if len(doc.Facilities) != len(e.Solved()) {
		t.Fatalf("facilities %d, want %d", len(doc.Facilities), len(e.Solved()))
	}
	total := 0
	for _, f := range doc.Facilities {
		k := e.Facility(f.Facility)
		m := e.Maps[k]
		want := report.DefaultRunPoints(m)
		if len(f.Runs) != len(want) || len(f.Unrunnable) != 0 {
			t.Errorf("%s: %d runs, %d unrunnable; want %d and 0", f.Facility, len(f.Runs), len(f.Unrunnable), len(want))
		}
		total += len(f.Runs)
		water := f.Medium == "water"
		c := report.CountChanges(back(f.Runs), water)
		if c.T0 != f.Changes.T0 || c.P0 != f.Changes.P0 || c.Mach != f.Changes.Mach || c.Moved != f.Changes.Any {
			t.Errorf("%s: changes %+v, recounted %+v", f.Facility, f.Changes, c)
		}
		for n, r := range f.Runs {
			// Runs are numbered from 1; further flight points of the same
			// set point repeat its number.
			switch {
			case n == 0 && r.Run != 1:
				t.Fatalf("%s: first run numbered %d", f.Facility, r.Run)
			case n > 0 && r.Run == f.Runs[n-1].Run:
				p := f.Runs[n-1]
				same := func(a, b report.Num) bool { return a == b || (!a.Valid() && !b.Valid()) }
				if !same(r.T0, p.T0) || !same(r.P0, p.P0) || !same(r.TestMach, p.TestMach) || !same(r.TestSpeed, p.TestSpeed) ||
					!same(r.WaterTemperature, p.WaterTemperature) || r.T0Change || r.P0Change || r.MachChange {
					t.Errorf("%s: flight points %d and %d of run %d differ in settings: %+v, %+v", f.Facility, n, n+1, r.Run, p, r)
				}
			case n > 0 && r.Run != f.Runs[n-1].Run+1:
				t.Fatalf("%s: run %d follows run %d", f.Facility, r.Run, f.Runs[n-1].Run)
			}
			if n == len(f.Runs)-1 && r.Run != f.SetPoints {
				t.Errorf("%s: last run %d, set_points %d", f.Facility, r.Run, f.SetPoints)
			}
			d, err := m.Detail(r.Row, r.Col)
			if err != nil {
				t.Fatal(err)
			}
			if !outClose(float64(r.ModelRe), d.Re) || !outClose(float64(r.TestQ), d.Q) {
				t.Errorf("%s run %d: Re %g q %g, want %g %g", f.Facility, r.Run, float64(r.ModelRe), float64(r.TestQ), d.Re, d.Q)
			}
			t0, prev := float64(r.T0), 0.0
			if water {
				t0 = float64(r.WaterTemperature)
			}
			if n > 0 {
				prev = float64(f.Runs[n-1].T0)
				if water {
					prev = float64(f.Runs[n-1].WaterTemperature)
				}
			}
			if moved := n > 0 && math.Abs(t0-prev) >= report.RunT0Step; moved != r.T0Change {
				t.Errorf("%s run %d: T0 %g after %g, change flag %v", f.Facility, r.Run, t0, prev, r.T0Change)
			}
		}
	}
	if total == 0 {
		t.Fatal("no runs at all for the demo")
	}
}

func TestRunsMarkedFromSession(t *testing.T) {
	e := outDemoEval(t)
	g := e.Grid
	// Marks: three inside points and one outside (row 0, last column).
	var marks [][2]int
	for i := 0; i < g.Rows() && len(marks) < 3; i += 7 {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				marks = append(marks, [2]int{i, j})
				break
			}
		}
	}
	outside := [2]int{0, g.Cols() - 1}
	if g.Inside(outside[0], outside[1]) {
		t.Fatal("test assumes the sea-level fastest point is outside")
	}
	marks = append(marks, outside)
	sess := outDemoSession(t, marks, whatif.Changes{}, "")
	doc := outRunsJSON(t, "--session", sess)
	if doc.Points != "marked" {
		t.Errorf("points = %q, want marked", doc.Points)
	}
	for _, f := range doc.Facilities {
		if n := len(f.Runs) + len(f.Unrunnable); n != len(marks) {
			t.Errorf("%s: %d runs + unrunnable, want %d marks", f.Facility, n, len(marks))
		}
		found := false
		for _, u := range f.Unrunnable {
			if u.Row == outside[0] && u.Col == outside[1] {
				found = true
				if u.Class != envelope.Outside.String() || u.P0.Valid() {
					t.Errorf("%s: outside mark listed as %q with p0 %v", f.Facility, u.Class, float64(u.P0))
				}
			}
		}
		if !found {
			t.Errorf("%s: the outside mark is not listed as unrunnable", f.Facility)
		}
	}

	// Text and CSV of the same list.
	code, out, errs := outCmd("runs", "--session", sess, "--facility", "Kellen", "--customary")
	if code != 0 {
		t.Fatalf("runs text exit %d: %s", code, errs)
	}
	for _, want := range []string{"marked test points", "Kellen Fold", "T0 °F", "p0 psi", "not runnable", "caution"} {
		if !strings.Contains(out, want) {
			t.Errorf("runs text lacks %q:\n%s", want, out)
		}
	}
	code, out, errs = outCmd("runs", "--session", sess, "--format", "csv")
	if code != 0 {
		t.Fatalf("runs csv exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(rows[0], ",") != strings.Join(report.RunColumns(), ",") {
		t.Errorf("CSV header = %v", rows[0])
	}
	if got, want := len(rows)-1, len(marks)*len(e.Solved()); got != want {
		t.Errorf("CSV rows %d, want %d", got, want)
	}
	for _, r := range rows[1:] {
		if _, err := strconv.Atoi(r[2]); err != nil {
			t.Errorf("run column %q is not a number", r[2])
		}
	}
}

func TestApplyWhatIf(t *testing.T) {
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	s := envelope.DefaultSettings(v)
	w := whatif.Changes{Values: map[string]float64{"scale": 0.05, "compressibility_mach": 0.25},
		Facilities: map[string]whatif.FacilityChanges{facs[1].Name: {"p0_max_Pa": 6e5}}}
	changed, err := whatif.Apply(w, &s, facs)
	if err != nil {
		t.Fatal(err)
	}
	if s.Scale != 0.05 || s.CompressibilityMach != 0.25 || s.Regimes.Incompressible != 0.25 || facs[1].PressureMax() != 6e5 {
		t.Errorf("after what-if: scale %g, cm %g, incompressible %g, p0 max %g", s.Scale, s.CompressibilityMach, s.Regimes.Incompressible, facs[1].PressureMax())
	}
	if len(changed) != 3 {
		t.Errorf("changed = %v, want 3 entries", changed)
	}
	w = whatif.Changes{Facilities: map[string]whatif.FacilityChanges{"No such tunnel": {"q_max_Pa": 1}}}
	if _, err := whatif.Apply(w, &s, facs); err == nil {
		t.Error("what-if for an unknown facility accepted")
	}
}

// TestRunsMergeAndPlurals: flight points with the same set point are one
// run (Harl Cove T2 at Mach 1.00, q max and T0 min for 13 411 m and
// 14 021 m in the demo), counts are pluralised properly, and the text says
// so.
func TestRunsMergeAndPlurals(t *testing.T) {
	doc := outRunsJSON(t, "--facility", "Harl Cove")
	if len(doc.Facilities) != 1 {
		t.Fatalf("facilities %d, want 1", len(doc.Facilities))
	}
	f := doc.Facilities[0]
	if !(f.SetPoints > 0 && f.SetPoints < len(f.Runs)) {
		t.Fatalf("Harl Cove: %d set points for %d flight points, want fewer set points", f.SetPoints, len(f.Runs))
	}
	code, out, errs := outCmd("runs", "--facility", "Harl Cove", "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs exit %d: %s", code, errs)
	}
	want := fmt.Sprintf("%d runs for %d flight points;", f.SetPoints, len(f.Runs))
	if !strings.Contains(out, want) || !strings.Contains(out, "same run") {
		t.Errorf("runs text lacks %q or a \"same run\" line:\n%s", want, out)
	}
	if want := fmt.Sprintf("of %d steps change a setting", f.SetPoints-1); !strings.Contains(out, want) {
		t.Errorf("runs text lacks %q", want)
	}

	// One marked point: "1 run", "0 steps", "1 point" not runnable.
	e := outDemoEval(t)
	k := e.Facility("Harl Cove T2 pressurized transonic tunnel")
	var mark [2]int
	for _, p := range report.DefaultRunPoints(e.Maps[k]) {
		mark = [2]int{p.Row, p.Col}
		break
	}
	outside := [2]int{0, e.Grid.Cols() - 1}
	sess := outDemoSession(t, [][2]int{mark, outside}, whatif.Changes{}, "")
	code, out, errs = outCmd("runs", "--session", sess, "--facility", "Harl Cove")
	if code != 0 {
		t.Fatalf("runs exit %d: %s", code, errs)
	}
	for _, want := range []string{"\n1 run; ", "0 of 0 steps change", "not runnable (1 point):"} {
		if !strings.Contains(out, want) {
			t.Errorf("runs text lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "1 runs") || strings.Contains(out, "1 steps") {
		t.Errorf("runs text has a wrong plural:\n%s", out)
	}
}

// TestRunsMachRelaxedGas: a gas tunnel's Mach-relaxed matches are run
// points, in the default list and when marked (second demo vehicle in the
// Bracken Ness and Kellen Fold tunnels, where low flight Mach numbers are
// matched at a higher test Mach number).
func TestRunsMachRelaxedGas(t *testing.T) {
	files := []string{"../../testdata/halcyra-ha1.toml", "../../testdata/facilities.toml"}
	in, err := loadInputs(files)
	if err != nil {
		t.Fatal(err)
	}
	e, err := envelope.Evaluate(in.vehicle, in.facilities, envelope.DefaultSettings(in.vehicle))
	if err != nil {
		t.Fatal(err)
	}
	relaxed := map[string][][2]int{}
	for _, m := range e.Maps {
		if m == nil || m.Facility.Medium == envelope.MediumWater {
			continue
		}
		for i := 0; i < e.Grid.Rows(); i++ {
			for j := 0; j < e.Grid.Cols(); j++ {
				if m.At(i, j).Class == envelope.MachRelaxed {
					relaxed[m.Facility.Name] = append(relaxed[m.Facility.Name], [2]int{i, j})
				}
			}
		}
	}
	if len(relaxed) == 0 {
		t.Fatal("no Mach-relaxed gas point in the second demo vehicle")
	}
	count := func(doc outRunsDoc) map[string]int {
		n := map[string]int{}
		for _, f := range doc.Facilities {
			for _, r := range f.Runs {
				if r.Class == envelope.MachRelaxed.String() {
					n[f.Facility]++
				}
			}
		}
		return n
	}
	got := count(outRunsJSON(t, files...))
	for name, pts := range relaxed {
		if got[name] != len(pts) {
			t.Errorf("default run list of %s: %d Mach-relaxed runs, want all %d", name, got[name], len(pts))
		}
	}
	// Marked: two relaxed points of each gas facility that has them.
	s := session.Session{Version: session.Version, Hash: session.DataHash(in.vehicle, in.facilities),
		Layer: tui.LayerClass.String(), Units: units.SI.String()}
	want := map[string]map[[2]int]bool{}
	marked := map[[2]int]bool{}
	for name, pts := range relaxed {
		want[name] = map[[2]int]bool{}
		for _, p := range pts[:min(2, len(pts))] {
			want[name][p] = true
			if !marked[p] {
				marked[p] = true
				s.Marks = append(s.Marks, session.Point{Altitude: e.Grid.Alts[p[0]], Speed: e.Grid.Speeds[p[1]]})
			}
		}
	}
	p := filepath.Join(t.TempDir(), "session.json")
	if err := session.Save(p, s); err != nil {
		t.Fatal(err)
	}
	doc := outRunsJSON(t, append([]string{"--session", p}, files...)...)
	for _, f := range doc.Facilities {
		for _, r := range f.Runs {
			delete(want[f.Facility], [2]int{r.Row, r.Col})
		}
	}
	for _, f := range doc.Facilities {
		k := e.Facility(f.Facility)
		for _, r := range f.Runs {
			if c := e.Maps[k].At(r.Row, r.Col).Class; r.Class != c.String() {
				t.Errorf("%s (%d, %d): run class %q, map %v", f.Facility, r.Row, r.Col, r.Class, c)
			}
		}
	}
	for name, left := range want {
		if len(left) > 0 {
			t.Errorf("%s: marked Mach-relaxed points %v are not runs", name, left)
		}
	}
}
