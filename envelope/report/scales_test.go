package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"image/png"
	"io"
	"strings"
	"testing"

	"likewind/envelope"
)

// outLoadsEval is demo vehicle 0 with load data on the vehicle and a
// balance on every facility (invented values), so that the balance limit
// binds in the facilities that can Mach-match.
func outLoadsEval(t *testing.T) *envelope.Evaluation {
	t.Helper()
	vs, facs := demoFleet(t)
	v := *vs[0]
	v.Loads = envelope.ModelLoads{CNMax: 1.2}
	for k := range facs {
		facs[k].Balance = envelope.BalanceLimits{MaxNormalForce: 20e3}
	}
	e, err := envelope.Evaluate(&v, facs, envelope.DefaultSettings(&v))
	if err != nil {
		t.Fatal(err)
	}
	return e
}

func TestScalesReport(t *testing.T) {
	e := outDemoEval(t)
	r := NewScales(ExportInfo{Tool: "likewind", Version: "test", Generated: "2025-03-04"}, []*envelope.Evaluation{e}, envelope.StudyOptions{})
	if len(r.Vehicles) != 1 || len(r.Vehicles[0].Facilities) != len(e.Facilities) || r.Comparison != nil {
		t.Fatalf("report shape: %d vehicles, comparison %v", len(r.Vehicles), r.Comparison)
	}
	steps := 0
	for k, sf := range r.Vehicles[0].Facilities {
		st, err := e.Study(k, envelope.StudyOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if len(sf.Steps) != len(st.Steps) {
			t.Fatalf("%s: %d rows, want %d", sf.Facility, len(sf.Steps), len(st.Steps))
		}
		steps += len(sf.Steps)
		for i, row := range sf.Steps {
			x := st.Steps[i]
			if float64(row.Scale) != x.Scale || row.Matched != x.Shares.Matched() || row.Union != x.Union {
				t.Errorf("%s row %d: %+v, want the study's step %+v", sf.Facility, i, row, x)
			}
			// A row is marked "beyond fit" exactly above the fit scale.
			if sf.FitScale.Valid() && row.BeyondFit != (float64(row.Scale) > float64(sf.FitScale)*(1+1e-9)) {
				t.Errorf("%s at %g: beyond fit %v with fit %g", sf.Facility, float64(row.Scale), row.BeyondFit, float64(sf.FitScale))
			}
		}
	}

	var text bytes.Buffer
	if err := r.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Model-scale study of " + e.Grid.Vehicle.Name, "Kellen Fold cryogenic transonic tunnel (nitrogen)",
		"fit limit", "beyond fit", "in force", "best within the limits", "reach p10", "Caution: "} {
		if !strings.Contains(text.String(), want) {
			t.Errorf("text lacks %q", want)
		}
	}

	var b bytes.Buffer
	if err := r.WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != steps+1 {
		t.Fatalf("CSV %d rows, want a header and %d", len(rows), steps)
	}
	// The columns are the record's tags, in field order.
	want := []string{"vehicle", "facility", "model_scale", "marks", "beyond_fit", "beyond_balance", "full_match", "reynolds_short",
		"mach_relaxed", "out_of_reach", "matched", "union_coverage", "points_with_setting", "reach_ratio_p10", "reach_ratio_p50", "reach_ratio_p90"}
	if strings.Join(rows[0], ",") != strings.Join(want, ",") {
		t.Errorf("CSV header %v, want %v", rows[0], want)
	}

	b.Reset()
	if err := r.WriteJSON(&b); err != nil {
		t.Fatal(err)
	}
	var back Scales
	if err := json.Unmarshal(b.Bytes(), &back); err != nil {
		t.Fatal(err)
	}
	if back.Tool != "likewind" || back.Generated != "2025-03-04" || back.Caution != envelope.PlanningNote ||
		len(back.Vehicles) != 1 || len(back.Vehicles[0].Facilities[3].Steps) != len(r.Vehicles[0].Facilities[3].Steps) {
		t.Errorf("JSON read back: %+v", back.ExportInfo)
	}
}

// TestScalesReportVehicles: two vehicles give two blocks and a
// comparison with one line per facility per vehicle.
func TestScalesReportVehicles(t *testing.T) {
	a, b := outEvalVehicle(t, 0, nil), outEvalVehicle(t, 1, nil)
	r := NewScales(ExportInfo{}, []*envelope.Evaluation{a, b}, envelope.StudyOptions{Steps: 10})
	if len(r.Vehicles) != 2 || len(r.Comparison) != 2*len(a.Facilities) {
		t.Fatalf("%d vehicles, %d comparison lines", len(r.Vehicles), len(r.Comparison))
	}
	for k, c := range r.Comparison {
		sv := r.Vehicles[k%2]
		sf := sv.Facilities[k/2]
		if c.Vehicle != sv.Vehicle || c.Facility != sf.Facility || c.BestMatched != sf.BestMatched {
			t.Errorf("comparison line %d: %+v, want %s in %s", k, c, sf.Facility, sv.Vehicle)
		}
	}
	var text bytes.Buffer
	if err := r.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	if n := strings.Count(text.String(), "Model-scale study of "); n != 2 || !strings.Contains(text.String(), "Best scale per vehicle") {
		t.Errorf("text has %d vehicle blocks, comparison %v", n, strings.Contains(text.String(), "Best scale per vehicle"))
	}
	one := r.Only(3)
	if len(one.Vehicles[0].Facilities) != 1 || len(one.Comparison) != 2 || one.Vehicles[1].Facilities[0].Facility != a.Facilities[3].Name {
		t.Errorf("Only(3): %+v", one.Comparison)
	}
}

// TestCoverageBalance: with load data each facility's row carries the
// balance's scale limit (BalanceScaleEnvelope) in every format; without
// it the CSV has no balance columns.
func TestCoverageBalance(t *testing.T) {
	e := outLoadsEval(t)
	r := NewCoverage(e)
	for k, row := range r.Facilities {
		if row.Balance == nil {
			t.Fatalf("%s: no balance with load data", row.Facility)
		}
		bs := envelope.BalanceScaleEnvelope(e.Grid, &e.Facilities[k], e.Settings)
		if row.Balance.Open != bs.Open || row.Balance.Closed != bs.Closed ||
			(bs.Open > 0 && float64(row.Balance.Scale) != bs.Max) {
			t.Errorf("%s: balance %+v, want %+v", row.Facility, *row.Balance, bs)
		}
	}
	var text bytes.Buffer
	if err := r.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "balance takes models up to scale") || !strings.Contains(strings.SplitN(text.String(), "\n", 5)[3], "balance") {
		t.Errorf("text lacks the balance column or lines:\n%s", text.String())
	}
	var b bytes.Buffer
	if err := r.WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	head := strings.Join(rows[0], ",")
	if !strings.HasSuffix(head, ",balance_scale,balance_open_points,balance_closed_points,scale_within_balance") {
		t.Errorf("CSV header %s: want the balance columns last", head)
	}
	for _, row := range rows {
		if len(row) != len(rows[0]) {
			t.Errorf("CSV row of %d cells under %d columns", len(row), len(rows[0]))
		}
	}
	// Without load data (the demo without its own): no balance in any
	// format.
	plain := NewCoverage(outEvalNoLoads(t, 0))
	b.Reset()
	if err := plain.WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(b.String(), "balance") {
		t.Error("CSV without load data has balance columns")
	}
	b.Reset()
	if err := plain.WriteJSON(&b); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(b.String(), "balance") {
		t.Error("JSON without load data has a balance")
	}
}

// TestCoverageSet: one report per vehicle and the comparison, whose
// shares are each vehicle's own.
func TestCoverageSet(t *testing.T) {
	a, b := outEvalVehicle(t, 0, nil), outEvalVehicle(t, 1, nil)
	cs := NewCoverageSet([]*envelope.Evaluation{a, b})
	if len(cs.Comparison) != len(a.Facilities)+1 {
		t.Fatalf("%d comparison rows, want %d", len(cs.Comparison), len(a.Facilities)+1)
	}
	for k, c := range cs.Comparison[:len(a.Facilities)] {
		for v := range 2 {
			if float64(c.Matched[v]) != cs.Vehicles[v].Facilities[k].Matched {
				t.Errorf("%s vehicle %d: %g, want %g", c.Facility, v+1, float64(c.Matched[v]), cs.Vehicles[v].Facilities[k].Matched)
			}
		}
	}
	last := cs.Comparison[len(cs.Comparison)-1]
	if float64(last.Matched[0]) != cs.Vehicles[0].Union || float64(last.Matched[1]) != cs.Vehicles[1].Union {
		t.Errorf("union row %+v", last)
	}
	var buf bytes.Buffer
	if err := cs.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+2*(len(a.Facilities)+1) || rows[0][0] != "vehicle" || rows[1][0] != cs.Vehicles[0].Vehicle {
		t.Errorf("CSV: %d rows, first cells %q %q", len(rows), rows[0][0], rows[1][0])
	}
}

func TestScalesChart(t *testing.T) {
	e := outLoadsEval(t)
	studies, errs := e.StudyAll(envelope.StudyOptions{})
	for k, err := range errs {
		if err != nil {
			t.Fatalf("%s: %v", e.Facilities[k].Name, err)
		}
	}
	ch, err := ScalesChart(e.Grid.Vehicle.Name, studies)
	if err != nil {
		t.Fatal(err)
	}
	b, err := ch.Render("png")
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	if img.Bounds().Dx() != outPixels(ChartWidth) || img.Bounds().Dy() <= outPixels(ChartHeight) {
		t.Errorf("PNG %v", img.Bounds().Size())
	}
	// Each facility's curve is drawn in its colour (the one the
	// Reynolds–Mach chart gives it).
	for k := range studies {
		want := facilityColor(k)
		found := false
		for y := img.Bounds().Min.Y; y < img.Bounds().Max.Y && !found; y++ {
			for x := img.Bounds().Min.X; x < img.Bounds().Max.X; x++ {
				r, g, bl, _ := img.At(x, y).RGBA()
				if uint8(r>>8) == want.R && uint8(g>>8) == want.G && uint8(bl>>8) == want.B {
					found = true
					break
				}
			}
		}
		if !found {
			t.Errorf("%s: no pixel of its colour %v", e.Facilities[k].Name, want)
		}
	}
	sv, err := ch.Render("svg")
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(sv))
	for {
		_, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
	}
	for _, want := range []string{"matched share against model scale", "model scale", "balance load limit", "section fit limit"} {
		if !bytes.Contains(sv, []byte(want)) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	if _, err := ScalesChart("x", []*envelope.ScaleStudy{nil}); err == nil {
		t.Error("ScalesChart with no study: no error")
	}
}
