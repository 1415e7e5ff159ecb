package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"testing"
)

// The fast formatters must write the bytes of the standard library's
// writers they stand in for (encoding/csv with its defaults, encoding/json's
// Marshal with its HTML-safe escaping); these tests compare them directly.

var oddTexts = []string{
	"", "plain", "a,b", `say "hi"`, " lead", "\tlead", "\u00a0nbsp lead", "\u2003em lead", "trail ",
	"line\nbreak", "cr\rhere", `\.`, `\.x`, "<b>&</b>", "\u2028\u2029", "\x00\x01\x1f\x7f", "\b\f",
	"bad \xff utf-8", "\xc3", "Überdruck–Kanal 風洞", `back\slash`, "\"", ",", "\n",
}

func csvWant(t testing.TB, cells []string) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	if err := w.Write(cells); err != nil {
		t.Fatal(err)
	}
	w.Flush()
	return b.Bytes()
}

func TestAppendCSVFieldMatchesEncodingCSV(t *testing.T) {
	for _, s := range oddTexts {
		if got, want := appendCSVRecord(nil, []string{s, "x"}), csvWant(t, []string{s, "x"}); !bytes.Equal(got, want) {
			t.Errorf("CSV of %q = %q, want %q (encoding/csv)", s, got, want)
		}
	}
}

func TestAppendJSONStringMatchesMarshal(t *testing.T) {
	for _, s := range oddTexts {
		want, err := json.Marshal(s)
		if err != nil {
			t.Fatal(err)
		}
		if got := appendJSONString(nil, s); !bytes.Equal(got, want) {
			t.Errorf("JSON of %q = %s, want %s (encoding/json)", s, got, want)
		}
	}
}

// FuzzCellText: any text is written as encoding/csv and encoding/json
// write it.
func FuzzCellText(f *testing.F) {
	for _, s := range oddTexts {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if got, want := appendCSVRecord(nil, []string{s}), csvWant(t, []string{s}); !bytes.Equal(got, want) {
			t.Fatalf("CSV of %q = %q, want %q", s, got, want)
		}
		want, err := json.Marshal(s)
		if err != nil {
			t.Fatal(err)
		}
		if got := appendJSONString(nil, s); !bytes.Equal(got, want) {
			t.Fatalf("JSON of %q = %s, want %s", s, got, want)
		}
	})
}

// TestExportRecordBytes: a record with hostile text and numbers of every
// magnitude (and not-applicable values) is written as csv.Writer writes
// its cells and as json.Marshal writes it; every column is a kind the fast
// formatters know.
func TestExportRecordBytes(t *testing.T) {
	for k, c := range exportCSV.cols {
		if c.kind == cellOther {
			t.Errorf("export column %s is formatted by reflection", exportCSV.names[k])
		}
	}
	nums := []float64{0, math.Copysign(0, -1), 1, -2.5, 1e-7, 1e21, 123456789012345678, 5e-324, math.MaxFloat64, math.NaN(), math.Inf(1), 1.0 / 3}
	j := 0
	// One memo for every record, as a block uses it: the texts and numbers
	// change from record to record.
	memo := make([]numMemo, len(exportCSV.cols))
	jmemo := make([]numMemo, len(exportCSV.cols))
	for k, s := range append(oddTexts, oddTexts...) {
		var r ExportRecord
		r.Facility, r.Flags, r.Row, r.Col, r.HasSettings = s, s, k, -k, k%2 == 0
		for _, n := range []*Num{&r.Altitude, &r.Mach, &r.Pressure, &r.Knudsen, &r.TestMach, &r.BalanceQLimit} {
			*n = Num(nums[j%len(nums)])
			j++
		}
		cells := reflectCells(&r)
		if got, want := exportCSV.appendRow(nil, &r, memo), csvWant(t, cells); !bytes.Equal(got, want) {
			t.Errorf("CSV row %d =\n%q\nwant\n%q", k, got, want)
		}
		want, err := json.Marshal(r)
		if err != nil {
			t.Fatal(err)
		}
		if got := exportJSON.appendRecord(nil, &r, jmemo); !bytes.Equal(got, want) {
			t.Errorf("JSON record %d =\n%s\nwant\n%s", k, got, want)
		}
	}
}

// reflectCells are the CSV cells of r as the export wrote them before
// its column table (reflection on each field).
func reflectCells(r *ExportRecord) []string {
	var out []string
	v := reflect.ValueOf(r).Elem()
	for k := range v.NumField() {
		switch x := v.Field(k).Interface().(type) {
		case Num:
			out = append(out, x.String())
		case string:
			out = append(out, x)
		case int:
			out = append(out, strconv.Itoa(x))
		case bool:
			out = append(out, strconv.FormatBool(x))
		default:
			panic(fmt.Sprintf("field %d: %T", k, x))
		}
	}
	return out
}

// TestAppendNumMemo: the memo gives the text of the number asked for,
// whether it repeats or not (0 and -0 differ).
func TestAppendNumMemo(t *testing.T) {
	var m numMemo
	for _, x := range []float64{1.5, 1.5, 2, math.Copysign(0, -1), 0, 0, 1e-300, 1.5} {
		if got, want := string(appendNum(nil, x, &m)), strconv.FormatFloat(x, 'g', -1, 64); got != want {
			t.Errorf("appendNum(%v) = %q, want %q", x, got, want)
		}
	}
}
