package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope/report"
)

// outCampaignDoc is the campaign part of the JSON run list read back.
type outCampaignDoc struct {
	Facilities []struct {
		Facility string
		Runs     []report.RunRecord
		Campaign *struct {
			Time          report.Num `json:"time_s"`
			Shift         report.Num `json:"shift_s"`
			Shifts        *int       `json:"shifts"`
			ModelChange   report.Num `json:"model_change_s"`
			Currency      string     `json:"currency"`
			OccupancyCost report.Num `json:"occupancy_cost"`
			Coolant       report.Num `json:"coolant_kg"`
			CoolantCost   report.Num `json:"coolant_cost"`
			TotalCost     report.Num `json:"total_cost"`
			Blows         *int       `json:"blows"`
			Missing       []string   `json:"missing"`
		}
	}
}

// TestRunsCampaignJSON: the demo's invented campaign figures reach the
// JSON run list, and the figures agree with each other: the last run's
// running total is the campaign time, the shifts are that time in 8-hour
// shifts rounded up, the occupancy cost is the time at the file's hourly
// rate, the coolant the time at the file's use.
func TestRunsCampaignJSON(t *testing.T) {
	code, out, errs := outCmd("runs", "--format", "json", "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs: exit %d: %s", code, errs)
	}
	var doc outCampaignDoc
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	// Hourly rates and coolant use of envelope/demo/facilities.toml
	// (invented figures).
	rates := map[string]float64{"Bracken Ness": 2900, "Harl Cove": 4600, "Kellen Fold": 7800, "Skerrow": 1500, "Wenlow": 900}
	seen := 0
	for _, f := range doc.Facilities {
		c := f.Campaign
		if c == nil {
			t.Errorf("%s: no campaign object; every demo facility has campaign data", f.Facility)
			continue
		}
		if len(f.Runs) == 0 {
			continue
		}
		seen++
		last := f.Runs[len(f.Runs)-1]
		for k := len(f.Runs) - 1; k >= 0 && !last.TotalTime.Valid(); k-- {
			last = f.Runs[k]
		}
		if float64(last.TotalTime) != float64(c.Time) {
			t.Errorf("%s: last running total %v s, campaign %v s", f.Facility, last.TotalTime, c.Time)
		}
		if c.Shifts == nil || *c.Shifts != int(math.Ceil(float64(c.Time)/(8*3600))) || float64(c.Shift) != 8*3600 {
			t.Errorf("%s: %v shifts of %v s for %v s", f.Facility, c.Shifts, c.Shift, c.Time)
		}
		for name, rate := range rates {
			if strings.HasPrefix(f.Facility, name) {
				if want := float64(c.Time) / 3600 * rate; math.Abs(float64(c.OccupancyCost)-want) > 1e-9*want || c.Currency != "EUR" {
					t.Errorf("%s: occupancy %v %s, want %v EUR", f.Facility, c.OccupancyCost, c.Currency, want)
				}
			}
		}
		switch {
		case strings.HasPrefix(f.Facility, "Kellen Fold"):
			// 9 t/h at 0.16 EUR/kg.
			if want := float64(c.Time) / 3600 * 9000; math.Abs(float64(c.Coolant)-want) > 1e-9*want ||
				math.Abs(float64(c.CoolantCost)-0.16*want) > 1e-9*want {
				t.Errorf("coolant %v kg, %v EUR; want %v kg at 0.16 EUR/kg", c.Coolant, c.CoolantCost, want)
			}
		case strings.HasPrefix(f.Facility, "Skerrow"):
			if c.Blows == nil || *c.Blows < len(f.Runs)/2 || !f.Runs[0].BlowTime.Valid() {
				t.Errorf("blowdown: %v blows for %d flight points, first blow %v s", c.Blows, len(f.Runs), f.Runs[0].BlowTime)
			}
		}
	}
	if seen < 4 {
		t.Errorf("only %d demo facilities with runs", seen)
	}
}

// stripCampaign drops every [facility.campaign] table of a facility
// file: its lines up to the next table header.
func stripCampaign(s string) string {
	var out []string
	in := false
	for _, line := range strings.Split(s, "\n") {
		if strings.HasPrefix(line, "[") {
			in = strings.HasPrefix(line, "[facility.campaign]")
		}
		if !in {
			out = append(out, line)
		}
	}
	return strings.Join(out, "\n")
}

// TestRunsWithoutCampaign: facilities without campaign data list their
// runs as before: no time columns, no summary, empty CSV time fields,
// a null JSON campaign; the figures missing from a partial table are
// named and left out.
func TestRunsWithoutCampaign(t *testing.T) {
	data, err := os.ReadFile(demoFacFile)
	if err != nil {
		t.Fatal(err)
	}
	stripped := stripCampaign(string(data))
	if strings.Contains(stripped, "\n[facility.campaign]") || strings.Contains(stripped, "occupancy_cost =") {
		t.Fatal("the campaign tables were not stripped")
	}
	dir := t.TempDir()
	fac := filepath.Join(dir, "plain.toml")
	if err := os.WriteFile(fac, []byte(stripped), 0o600); err != nil {
		t.Fatal(err)
	}
	veh := "../../testdata/corvane-sx3.toml"
	code, out, errs := outCmd("runs", veh, fac, "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs: exit %d: %s", code, errs)
	}
	for _, bad := range []string{"campaign", "run time min", "total h", "blow s"} {
		if strings.Contains(out, bad) {
			t.Errorf("text of facilities without campaign data holds %q", bad)
		}
	}
	code, out, _ = outCmd("runs", veh, fac, "--format", "csv")
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if code != 0 || err != nil || len(rows) < 2 {
		t.Fatalf("runs csv: exit %d, %v", code, err)
	}
	col := map[string]int{}
	for k, c := range rows[0] {
		col[c] = k
	}
	for _, row := range rows[1:] {
		for _, c := range []string{"run_time_s", "total_time_s", "blow_duration_s", "blows", "blow_short"} {
			if row[col[c]] != "" {
				t.Fatalf("CSV %s = %q without campaign data", c, row[col[c]])
			}
		}
	}
	code, out, _ = outCmd("runs", veh, fac, "--format", "json")
	if code != 0 || strings.Contains(out, `"time_s"`) || !strings.Contains(out, `"campaign": null`) {
		t.Errorf("JSON without campaign data: exit %d, holds a campaign figure or lacks \"campaign\": null", code)
	}
	// A partial table: data time and model change only. The run times
	// that need a change time are left out, and the summary says which
	// keys are missing; no cost is shown.
	partial := strings.Replace(stripped, "max_blockage = \"0.8 %\"\n", "max_blockage = \"0.8 %\"\n\n[facility.campaign]\ndata_point_time = \"6 min\"\nmodel_change_time = \"8 h\"\n", 1)
	if err := os.WriteFile(fac, []byte(partial), 0o600); err != nil {
		t.Fatal(err)
	}
	code, out, errs = outCmd("runs", veh, fac, "--facility", "Harl Cove", "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs partial: exit %d: %s", code, errs)
	}
	for _, want := range []string{"campaign time         left out (data not given)", "occupancy cost        left out (data not given)",
		"not given in the facility file: occupancy_cost, t0_change_per_kelvin, t0_change_fixed, p0_change_time, mach_change_time"} {
		if !strings.Contains(out, want) {
			t.Errorf("partial campaign text lacks %q:\n%s", want, out[max(0, len(out)-1500):])
		}
	}
	if strings.Contains(out, "EUR") {
		t.Error("a cost shown without occupancy_cost")
	}
}

// TestRunsShiftFlag: --shift sets the shift length; a bad one is a usage
// error naming the flag.
func TestRunsShiftFlag(t *testing.T) {
	code, out, errs := outCmd("runs", "--shift", "450 min", "--facility", "Harl Cove", "--date", "2025-01-01")
	if code != 0 || !strings.Contains(out, "shifts (7.50 h)") {
		t.Errorf("runs --shift 450 min: exit %d %s; want a summary in 7.50-hour shifts", code, errs)
	}
	for _, bad := range []string{"-1 h", "2 days", "eight"} {
		if code, _, errs := outCmd("runs", "--shift", bad); code != 2 || !strings.Contains(errs, "--shift") {
			t.Errorf("runs --shift %q: exit %d %q; want a usage error", bad, code, errs)
		}
	}
}

// TestRunsCampaignText: the text list of a facility with campaign data
// gains the time columns and the summary; customary units give the
// coolant in lb (the demo's 9 t/h is 19841.6 lb/h: 9000/0.45359237).
func TestRunsCampaignText(t *testing.T) {
	code, out, errs := outCmd("runs", "--facility", "Kellen Fold", "--date", "2025-01-01")
	if code != 0 {
		t.Fatalf("runs: exit %d: %s", code, errs)
	}
	for _, want := range []string{"run time min  total h", "campaign time and cost:", "coolant cost", "t)\n", "the coolant is a cryogen"} {
		if !strings.Contains(out, want) {
			t.Errorf("runs text lacks %q", want)
		}
	}
	_, cust, _ := outCmd("runs", "--facility", "Kellen Fold", "--customary", "--date", "2025-01-01")
	if !strings.Contains(cust, " lb\n") || strings.Contains(cust, " kg (") {
		t.Error("runs --customary: the coolant is not in lb")
	}
	code, out, _ = outCmd("runs", "--facility", "Skerrow", "--date", "2025-01-01")
	if code != 0 || !strings.Contains(out, "blow s    blows") || !strings.Contains(out, "2 short") || !strings.Contains(out, "is a pressure vessel") || !strings.Contains(out, "storage               600 m³ at 4000 kPa") {
		t.Error("runs text of the blowdown tunnel lacks the blow columns, a short run or the storage line")
	}
}
