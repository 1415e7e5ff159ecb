package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope"
)

// outShareTol is the tolerance on shares that should sum to one.
const outShareTol = 1e-12

// outDemoEval evaluates every demo facility on the demo vehicle (invented
// data).
func outDemoEval(t testing.TB) *envelope.Evaluation { return outEvalVehicle(t, 0, nil) }

// outEvalVehicle evaluates every demo facility on demo vehicle k (0 the
// Corvane SX-3, 1 the Halcyra HA-1: low Mach numbers, many Mach-relaxed
// matches), each of which must solve, with the default settings changed
// by edit (when not nil).
func outEvalVehicle(t testing.TB, k int, edit func(*envelope.Settings, []envelope.Facility)) *envelope.Evaluation {
	t.Helper()
	return outEval(t, k, false, edit)
}

// outEvalNoLoads is outEvalVehicle without the demo's load data (the
// vehicle's coefficients and every balance capacity), for what must hold
// where no balance is checked.
func outEvalNoLoads(t testing.TB, k int) *envelope.Evaluation {
	t.Helper()
	return outEval(t, k, true, nil)
}

func outEval(t testing.TB, k int, noLoads bool, edit func(*envelope.Settings, []envelope.Facility)) *envelope.Evaluation {
	t.Helper()
	vs, facs := demoFleet(t)
	if noLoads {
		vs[k].Loads = envelope.ModelLoads{}
		for f := range facs {
			facs[f].Balance = envelope.BalanceLimits{}
		}
	}
	s := envelope.DefaultSettings(vs[k])
	if edit != nil {
		edit(&s, facs)
	}
	e, err := envelope.Evaluate(vs[k], facs, s)
	if err != nil {
		t.Fatalf("Evaluate = %v", err)
	}
	if err := e.Err(); err != nil {
		t.Fatal(err)
	}
	return e
}

// outDemoMaps and outSecondDemoMaps are the grid and maps of the two demo
// vehicles.
func outDemoMaps(t testing.TB) (*envelope.Grid, []*envelope.Map) {
	e := outEvalVehicle(t, 0, nil)
	return e.Grid, e.Maps
}

func outSecondDemoMaps(t testing.TB) (*envelope.Grid, []*envelope.Map) {
	e := outEvalVehicle(t, 1, nil)
	return e.Grid, e.Maps
}

func TestCoverageReportShares(t *testing.T) {
	e := outDemoEval(t)
	r := NewCoverage(e)
	if len(r.Facilities) != len(e.Facilities) {
		t.Fatalf("rows = %d, want %d", len(r.Facilities), len(e.Facilities))
	}
	for k, row := range r.Facilities {
		m := e.Maps[k]
		if m == nil {
			if row.Error == "" {
				t.Errorf("%s: no map but no error", row.Facility)
			}
			continue
		}
		sum := row.FullMatch + row.ReShort + row.MachRelaxed + row.NoMatch
		if math.Abs(sum-1) > outShareTol {
			t.Errorf("%s: shares sum to %g, want 1", row.Facility, sum)
		}
		sh := m.Shares()
		if row.FullMatch != sh.Share(envelope.FullMatch) || row.Matched != sh.Matched() {
			t.Errorf("%s: full %g matched %g, want Map.Shares %g %g", row.Facility, row.FullMatch, row.Matched,
				sh.Share(envelope.FullMatch), sh.Matched())
		}
	}
	if r.Union != envelope.UnionCoverage(e.Solved()) {
		t.Errorf("union = %g, want UnionCoverage %g", r.Union, envelope.UnionCoverage(e.Solved()))
	}
	for _, row := range r.Facilities {
		if r.Union+outShareTol < row.Matched {
			t.Errorf("union %g below %s's matched share %g", r.Union, row.Facility, row.Matched)
		}
	}
}

// TestCoverageMinScale checks the reported minimum scale against the
// engine: solved at that scale every Mach-matchable inside point is a full
// match, and at 2 % less at least one is not.
func TestCoverageMinScale(t *testing.T) {
	// Without the demo's balances: a balance shuts out larger models,
	// which the balance column reports (TestCoverageBalance).
	e := outEvalNoLoads(t, 0)
	r := NewCoverage(e)
	tested := 0
	for k, row := range r.Facilities {
		f := &e.Facilities[k]
		if f.Medium == envelope.MediumWater {
			if row.MinScale.Valid() {
				t.Errorf("%s: min scale %v for water, want none", f.Name, float64(row.MinScale))
			}
			continue
		}
		if !row.MinScale.Valid() {
			continue
		}
		tested++
		g := e.Grid
		full := func(scale float64) (n int) {
			s := e.Settings
			s.Scale = scale
			m, err := envelope.Solve(g, f, s)
			if err != nil {
				t.Fatal(err)
			}
			for i := 0; i < g.Rows(); i++ {
				for j := 0; j < g.Cols(); j++ {
					if _, ok := envelope.MinScaleFullMatch(g, f, e.Settings, i, j); ok && m.At(i, j).Class == envelope.FullMatch {
						n++
					}
				}
			}
			return n
		}
		sc := float64(row.MinScale)
		if n := full(sc * (1 + 1e-9)); n != row.MachMatchable {
			t.Errorf("%s at min scale %g: %d full matches, want all %d Mach-matchable points", f.Name, sc, n, row.MachMatchable)
		}
		if n := full(sc * 0.98); n >= row.MachMatchable {
			t.Errorf("%s at 0.98 × min scale: %d full matches, want fewer than %d", f.Name, n, row.MachMatchable)
		}
	}
	if tested == 0 {
		t.Fatal("no demo gas facility has a minimum scale")
	}
}

func TestCoverageWriters(t *testing.T) {
	e := outDemoEval(t)
	r := NewCoverage(e)

	var txt bytes.Buffer
	if err := r.WriteText(&txt); err != nil {
		t.Fatal(err)
	}
	for _, f := range e.Facilities {
		if !strings.Contains(txt.String(), f.Name) {
			t.Errorf("text report lacks %q", f.Name)
		}
	}
	flat := strings.Join(strings.Fields(txt.String()), " ")
	for _, want := range []string{"best of all", "Union coverage", "Caution: " + envelope.PlanningNote} {
		if !strings.Contains(flat, want) {
			t.Errorf("text report lacks %q", want)
		}
	}

	var cb bytes.Buffer
	if err := r.WriteCSV(&cb); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&cb).ReadAll()
	if err != nil {
		t.Fatalf("coverage CSV read back: %v", err)
	}
	if len(rows) != len(e.Facilities)+2 {
		t.Fatalf("CSV rows = %d, want header + %d facilities + best of all", len(rows), len(e.Facilities))
	}
	for k, row := range r.Facilities {
		got, err := strconv.ParseFloat(rows[k+1][7], 64)
		if err != nil || got != row.FullMatch {
			t.Errorf("CSV %s full_match = %q, want %g", row.Facility, rows[k+1][7], row.FullMatch)
		}
	}
	last := rows[len(rows)-1]
	if last[0] != "best of all" {
		t.Errorf("last CSV row = %v, want best of all", last)
	}
	if u, _ := strconv.ParseFloat(last[11], 64); u != r.Union {
		t.Errorf("CSV union = %q, want %g", last[11], r.Union)
	}

	var jb bytes.Buffer
	if err := r.WriteJSON(&jb); err != nil {
		t.Fatal(err)
	}
	var back Coverage
	if err := json.Unmarshal(jb.Bytes(), &back); err != nil {
		t.Fatalf("coverage JSON read back: %v", err)
	}
	if back.Union != r.Union || len(back.Facilities) != len(r.Facilities) || back.Inside != r.Inside {
		t.Errorf("JSON read back = union %g, %d rows, %d inside; want %g, %d, %d",
			back.Union, len(back.Facilities), back.Inside, r.Union, len(r.Facilities), r.Inside)
	}
}

func TestCoverageUnsolvedFacility(t *testing.T) {
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	bad := facs[0]
	bad.Name = "no scale"
	bad.Width, bad.Height, bad.Model = 0, 0, envelope.ModelSizing{}
	e, err := envelope.Evaluate(v, append(facs[:1:1], bad), envelope.DefaultSettings(v))
	if err != nil {
		t.Fatal(err)
	}
	if e.Maps[1] != nil || e.Errs[1] == nil {
		t.Fatalf("facility without a scale solved: %v", e.Errs[1])
	}
	r := NewCoverage(e)
	if r.Facilities[1].Error == "" || r.SolvedCount != 1 {
		t.Errorf("unsolved row = %+v, solved %d; want an error and 1 solved", r.Facilities[1], r.SolvedCount)
	}
	var b bytes.Buffer
	if err := r.WriteJSON(&b); err != nil {
		t.Fatalf("JSON with an unsolved facility: %v", err)
	}
}

func BenchmarkCoverageReportDemo(b *testing.B) {
	e := outDemoEval(b)
	for b.Loop() {
		_ = NewCoverage(e)
	}
}
