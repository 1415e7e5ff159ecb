package main

import (
	"encoding/csv"
	"encoding/json"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope/report"
)

func TestCoverageCommand(t *testing.T) {
	e := outDemoEval(t)
	want := report.NewCoverage(e)

	code, out, errs := outCmd("coverage")
	if code != 0 {
		t.Fatalf("coverage exit %d: %s", code, errs)
	}
	for _, f := range e.Facilities {
		if !strings.Contains(out, f.Name) {
			t.Errorf("text lacks %q", f.Name)
		}
	}
	if !strings.Contains(out, "Union coverage") || !strings.Contains(out, "Caution") {
		t.Errorf("text lacks the union line or the caution:\n%s", out)
	}

	code, out, errs = outCmd("coverage", "--format", "csv")
	if code != 0 {
		t.Fatalf("coverage csv exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != len(e.Facilities)+2 {
		t.Fatalf("CSV rows %d, want %d", len(rows), len(e.Facilities)+2)
	}
	for k, row := range want.Facilities {
		got, _ := strconv.ParseFloat(rows[k+1][7], 64)
		if got != row.FullMatch {
			t.Errorf("%s full_match %g, want %g", row.Facility, got, row.FullMatch)
		}
	}

	code, out, errs = outCmd("coverage", "--format", "json")
	if code != 0 {
		t.Fatalf("coverage json exit %d: %s", code, errs)
	}
	var got report.Coverage
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatalf("JSON read back: %v", err)
	}
	if got.Union != want.Union || len(got.Facilities) != len(want.Facilities) {
		t.Errorf("JSON union %g, %d rows; want %g, %d", got.Union, len(got.Facilities), want.Union, len(want.Facilities))
	}
	for k := range got.Facilities {
		g, w := got.Facilities[k], want.Facilities[k]
		if g.MinScale.Valid() != w.MinScale.Valid() || (w.MinScale.Valid() && g.MinScale != w.MinScale) {
			t.Errorf("%s min scale %v, want %v", w.Facility, float64(g.MinScale), float64(w.MinScale))
		}
	}
}
