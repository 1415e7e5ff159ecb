package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope/report"
)

// outRel is the relative tolerance for numbers read back from the
// exports, which are written in shortest round-trip form.
const outRel = 1e-12

func TestExportCSVCommand(t *testing.T) {
	e := outDemoEval(t)
	code, out, errs := outCmd("export", "--format", "csv")
	if code != 0 {
		t.Fatalf("export exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("export CSV read back: %v", err)
	}
	if got, want := len(rows)-1, e.Grid.InsideCount()*len(e.Solved()); got != want {
		t.Fatalf("CSV records = %d, want %d", got, want)
	}
	col := map[string]int{}
	for k, c := range rows[0] {
		col[c] = k
	}
	for _, name := range []string{"facility", "altitude_m", "mach", "reynolds", "class", "model_scale", "p0_pa", "t0_k", "limit"} {
		if _, ok := col[name]; !ok {
			t.Fatalf("CSV header lacks %q", name)
		}
	}
	for n, row := range rows[1:] {
		if n%97 != 0 { // a spread sample is enough here; envelope tests check all
			continue
		}
		k := e.Facility(row[col["facility"]])
		i, _ := strconv.Atoi(row[col["row"]])
		j, _ := strconv.Atoi(row[col["col"]])
		d, err := e.Maps[k].Detail(i, j)
		if err != nil {
			t.Fatal(err)
		}
		re, _ := strconv.ParseFloat(row[col["reynolds"]], 64)
		if !outClose(re, d.Flight.Re) {
			t.Errorf("row %d reynolds = %g, want %g", n, re, d.Flight.Re)
		}
		if row[col["class"]] != d.Class.String() {
			t.Errorf("row %d class = %q, want %q", n, row[col["class"]], d.Class)
		}
	}
}

func outClose(a, b float64) bool {
	return a == b || math.Abs(a-b) <= outRel*math.Max(math.Abs(a), math.Abs(b))
}

func TestExportJSONFile(t *testing.T) {
	e := outDemoEval(t)
	dir := t.TempDir()
	p := filepath.Join(dir, "points.json") // format from the extension
	code, _, errs := outCmd("export", "-o", p, "--date", "2025-01-01", "--facility", "Kellen")
	if code != 0 {
		t.Fatalf("export exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	var doc report.ExportDoc
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatalf("JSON read back: %v", err)
	}
	if doc.Generated != "2025-01-01" || doc.Version != version || doc.Units != "SI" {
		t.Errorf("header %+v, want the given date, this version and SI", doc.ExportInfo)
	}
	if len(doc.Facilities) != 1 || len(doc.Records) != e.Grid.InsideCount() {
		t.Fatalf("facilities %d, records %d; want 1 and %d", len(doc.Facilities), len(doc.Records), e.Grid.InsideCount())
	}
	k := e.Facility(doc.Facilities[0].Name)
	for _, r := range doc.Records {
		if got, want := r.Class, e.Maps[k].At(r.Row, r.Col).Class.String(); got != want {
			t.Fatalf("(%d,%d) class %q, want %q", r.Row, r.Col, got, want)
		}
	}
	// Refused without --force; a second format still needs it.
	if code, _, errs := outCmd("export", "-o", p, "--format", "csv"); code != 1 || !strings.Contains(errs, "--force") {
		t.Errorf("export over an existing file: exit %d, stderr %q; want 1", code, errs)
	}
	if code, _, errs := outCmd("export", "-o", p, "--format", "csv", "--force"); code != 0 {
		t.Errorf("export --force: exit %d: %s", code, errs)
	}
	if b, _ := os.ReadFile(p); !strings.HasPrefix(string(b), "facility,") {
		t.Errorf("file after --force starts %q, want the CSV header", string(b[:20]))
	}
	// Unwritable place: nothing left behind.
	bad := filepath.Join(dir, "missing", "points.csv")
	if code, _, errs := outCmd("export", "-o", bad); code != 1 || !strings.Contains(errs, bad) {
		t.Errorf("export into a missing folder: exit %d, stderr %q", code, errs)
	}
	if es, _ := os.ReadDir(dir); len(es) != 1 {
		t.Errorf("folder holds %d entries, want only points.json", len(es))
	}
}

func TestParseArgsInterleaved(t *testing.T) {
	fs := newFlags("t", &strings.Builder{})
	o := fs.String("o", "", "")
	force := fs.Bool("force", false, "")
	files, code := parseArgs(fs, []string{"a.toml", "-o", "x", "b.toml", "--force", "--", "-c.toml"}, &strings.Builder{})
	if code != -1 || *o != "x" || !*force || strings.Join(files, " ") != "a.toml b.toml -c.toml" {
		t.Errorf("parseArgs = %v, %d, o=%q force=%v; want files a b -c, o x, force", files, code, *o, *force)
	}
}
