package report

import (
	"bytes"
	"encoding/csv"
	"slices"
	"strings"
	"testing"

	"likewind/envelope"
)

// outKellenFold evaluates the demo (invented data) with its settings
// changed by edit and returns the evaluation and the index of the Kellen
// Fold tunnel, whose section takes a model of scale 0.267 below Mach 0.6
// and 0.171 from it (worked by hand in envelope's modelsize_test.go).
func outKellenFold(t *testing.T, edit func(*envelope.Settings)) (*envelope.Evaluation, int) {
	t.Helper()
	e := outEvalVehicle(t, 0, func(s *envelope.Settings, _ []envelope.Facility) { edit(s) })
	k := slices.IndexFunc(e.Facilities, func(f envelope.Facility) bool { return strings.HasPrefix(f.Name, "Kellen Fold") })
	if k < 0 {
		t.Fatal("no Kellen Fold tunnel in the demo")
	}
	return e, k
}

// The flag reaches the export's flags column.
func TestModelTooLargeInExport(t *testing.T) {
	for _, scale := range []float64{0, 0.5} {
		e, k := outKellenFold(t, func(s *envelope.Settings) { s.Scale = scale })
		var b bytes.Buffer
		if err := WriteExportCSV(&b, []*envelope.Map{e.Maps[k]}); err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(&b).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		col := slices.Index(rows[0], "flags")
		n := 0
		for _, r := range rows[1:] {
			if strings.Contains(r[col], "model too large for the section") {
				n++
			}
		}
		want := 0
		if scale > 0 {
			want = len(rows) - 1
		}
		if n != want || len(rows) < 2 {
			t.Errorf("scale %g: %d of %d export records flag the model too large, want %d", scale, n, len(rows)-1, want)
		}
	}
}

// Coverage says whether the scale in force fits, in text, CSV and the row.
func TestModelTooLargeInCoverage(t *testing.T) {
	e, k := outKellenFold(t, func(s *envelope.Settings) { s.Scale = 0.5 })
	r := NewCoverage(e)
	row := r.Facilities[k]
	if row.ScaleFits == nil || *row.ScaleFits || row.TooLargePoints != r.Inside {
		t.Errorf("coverage row: fits %v, %d too-large points of %d; want false and all", row.ScaleFits, row.TooLargePoints, r.Inside)
	}
	var text, c bytes.Buffer
	if err := r.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), row.Facility+": model too large for the section: scale 0.5") || !strings.Contains(text.String(), "0.5!") {
		t.Errorf("coverage text does not say the model is too large:\n%s", text.String())
	}
	if err := r.WriteCSV(&c); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&c).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := slices.Index(rows[0], "scale_fits_section")
	if col < 0 || rows[k+1][col] != "false" {
		t.Errorf("coverage CSV scale_fits_section for %s = %v", row.Facility, rows[k+1])
	}

	e, k = outKellenFold(t, func(*envelope.Settings) {})
	row = NewCoverage(e).Facilities[k]
	if row.ScaleFits == nil || !*row.ScaleFits || row.TooLargePoints != 0 {
		t.Errorf("files' scale 1/40: fits %v, %d too-large points; want true, 0", row.ScaleFits, row.TooLargePoints)
	}
}
