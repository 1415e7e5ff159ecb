package report

import (
	"bytes"
	"encoding/csv"
	"math"
	"strings"
	"testing"
)

// TestCSVColumns states the CSV columns of the coverage report and the run
// list, in order, as README documents them; they are derived from the
// record types' tags, so this is where a change of a column shows.
func TestCSVColumns(t *testing.T) {
	for _, tc := range []struct {
		what string
		got  []string
		want string
	}{
		{"coverage", coverageCSV.header(), "facility,medium,error,model_scale,scale_rule,fit_scale,inside_points," +
			"full_match,reynolds_short,mach_relaxed,out_of_reach,matched," +
			"min_scale_full_match,mach_matchable_points,min_scale_covers_envelope,min_scale_fits_section," +
			"scale_fits_section,model_too_large_points"},
		{"runs", RunColumns(), "facility,medium,run,row,col,altitude_m,grid_speed,grid_speed_kind," +
			"flight_mach,flight_tas_m_s,flight_q_pa,flight_reynolds,class,limit,flags," +
			"test_mach,p0_pa,t0_k,water_temperature_k,static_pressure_pa,test_speed_m_s,test_q_pa," +
			"model_reynolds,reynolds_ratio,t0_change,p0_change,mach_change,q_change,rule,rule_temperature_k,rule_q_pa," +
			"run_time_s,total_time_s,blow_duration_s,blows,blow_short"},
	} {
		if got := strings.Join(tc.got, ","); got != tc.want {
			t.Errorf("%s CSV columns\n got %s\nwant %s", tc.what, got, tc.want)
		}
	}
}

// TestCSVTable: a column is named by its csv tag, else its JSON key
// (options dropped); "-" and untagged fields are left out; cells take the
// forms the exports document.
func TestCSVTable(t *testing.T) {
	type rec struct {
		Name     string  `json:"name,omitempty"`
		Hidden   int     `json:"-"`
		Count    int     `json:"-" csv:"count"`
		Untagged string  // a field without tags is no column
		X        Num     `json:"x"`
		Missing  Num     `json:"missing"`
		F        float64 `json:"f"`
		Yes      bool    `json:"yes"`
		Maybe    *bool   `json:"maybe"`
		Known    *bool   `json:"known"`
		Skip     string  `json:"skip" csv:"-"`
	}
	tb := newCSVTable[rec]()
	if got, want := strings.Join(tb.header(), ","), "name,count,x,missing,f,yes,maybe,known"; got != want {
		t.Fatalf("header %s, want %s", got, want)
	}
	if tb.column("f") != 4 || tb.column("skip") != -1 {
		t.Errorf("column(f) = %d, column(skip) = %d; want 4, -1", tb.column("f"), tb.column("skip"))
	}
	no := false
	r := rec{Name: "a, b", Hidden: 7, Count: 3, Untagged: "u", X: 0.1, Missing: Num(math.NaN()), F: 1e-7, Yes: true, Known: &no, Skip: "s"}
	var b bytes.Buffer
	w, err := newCSVWriter(&b, tb)
	if err != nil {
		t.Fatal(err)
	}
	if err := w.write(&r, nil); err != nil {
		t.Fatal(err)
	}
	if err := w.write(&r, func(cells []string) { cells[tb.column("count")] = "" }); err != nil {
		t.Fatal(err)
	}
	if err := w.flush(); err != nil {
		t.Fatal(err)
	}
	// Quoting is encoding/csv's; a Num that does not apply and an unknown
	// yes/no are empty.
	want := "name,count,x,missing,f,yes,maybe,known\n" +
		`"a, b",3,0.1,,1e-07,true,,false` + "\n" +
		`"a, b",,0.1,,1e-07,true,,false` + "\n"
	if b.String() != want {
		t.Errorf("CSV\n%s\nwant\n%s", b.String(), want)
	}
	if _, err := csv.NewReader(&b).ReadAll(); err != nil {
		t.Errorf("read back: %v", err)
	}
}
