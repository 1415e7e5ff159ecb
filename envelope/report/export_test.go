package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"likewind/envelope"
)

// outRelTol is the relative tolerance for values read back from an
// export: they are written in shortest round-trip form, so they should
// agree to rounding.
const outRelTol = 1e-12

func outClose(got, want, rel float64) bool {
	if got == want {
		return true
	}
	return math.Abs(got-want) <= rel*math.Max(math.Abs(got), math.Abs(want))
}

func TestExportColumnsUnique(t *testing.T) {
	seen := map[string]bool{}
	for _, c := range ExportColumns() {
		if c == "" || seen[c] {
			t.Errorf("column %q empty or repeated", c)
		}
		seen[c] = true
	}
	if len(seen) < 50 {
		t.Errorf("ExportColumns() has %d columns, want every computed quantity (>= 50)", len(seen))
	}
}

func TestWriteCSVReadBack(t *testing.T) {
	g, maps := outDemoMaps(t)
	var b bytes.Buffer
	if err := WriteExportCSV(&b, maps); err != nil {
		t.Fatalf("WriteCSV = %v", err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatalf("csv read back: %v", err)
	}
	head := rows[0]
	if strings.Join(head, ",") != strings.Join(ExportColumns(), ",") {
		t.Fatalf("header = %v, want ExportColumns()", head)
	}
	if got, want := len(rows)-1, g.InsideCount()*len(maps); got != want {
		t.Fatalf("records = %d, want %d (inside points × facilities)", got, want)
	}
	col := map[string]int{}
	for k, c := range head {
		col[c] = k
	}
	num := func(t *testing.T, row []string, name string) float64 {
		t.Helper()
		s := row[col[name]]
		if s == "" {
			return math.NaN()
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("column %s = %q: %v", name, s, err)
		}
		return v
	}
	byName := map[string]*envelope.Map{}
	for _, m := range maps {
		byName[m.Facility.Name] = m
	}
	classes := map[string]int{}
	for _, row := range rows[1:] {
		m := byName[row[col["facility"]]]
		if m == nil {
			t.Fatalf("unknown facility %q", row[col["facility"]])
		}
		i, _ := strconv.Atoi(row[col["row"]])
		j, _ := strconv.Atoi(row[col["col"]])
		if !g.Inside(i, j) {
			t.Fatalf("record (%d, %d) is outside the envelope", i, j)
		}
		d, err := m.Detail(i, j)
		if err != nil {
			t.Fatal(err)
		}
		checks := []struct {
			name string
			want float64
		}{
			{"altitude_m", g.Alts[i]},
			{"grid_speed", g.Speeds[j]},
			{"mach", d.Flight.Airspeeds.Mach},
			{"reynolds", d.Flight.Re},
			{"dynamic_pressure_pa", d.Flight.Q},
			{"knudsen", d.Flight.Kn},
			{"model_scale", m.Scale},
			{"model_reynolds", d.Re},
			{"reynolds_ratio", d.ReRatio},
		}
		for _, c := range checks {
			got := num(t, row, c.name)
			if !d.HasSettings && (c.name == "model_reynolds" || c.name == "reynolds_ratio") {
				if !math.IsNaN(got) {
					t.Errorf("%s (%d,%d) %s = %g, want empty without settings", m.Facility.Name, i, j, c.name, got)
				}
				continue
			}
			if !outClose(got, c.want, outRelTol) {
				t.Errorf("%s (%d,%d) %s = %g, want %g", m.Facility.Name, i, j, c.name, got, c.want)
			}
		}
		if got, want := row[col["class"]], m.At(i, j).Class.String(); got != want {
			t.Errorf("%s (%d,%d) class = %q, want %q (Map.At)", m.Facility.Name, i, j, got, want)
		}
		classes[row[col["class"]]]++
		if m.Facility.Medium == envelope.MediumWater {
			if row[col["p0_pa"]] != "" || row[col["test_mach"]] != "" {
				t.Errorf("water record has p0 %q, test Mach %q, want empty", row[col["p0_pa"]], row[col["test_mach"]])
			}
		} else if d.HasSettings && !outClose(num(t, row, "p0_pa"), d.P0, outRelTol) {
			t.Errorf("p0 = %g, want %g", num(t, row, "p0_pa"), d.P0)
		}
	}
	if len(classes) < 3 {
		t.Errorf("demo export has classes %v, want a mix", classes)
	}
}

// TestExportSeaLevelState checks the flight state columns of the sea-level
// row against the standard atmosphere.
func TestExportSeaLevelState(t *testing.T) {
	_, maps := outDemoMaps(t)
	// U.S. Standard Atmosphere 1976, Table I, 0 m: T 288.150 K,
	// p 1.01325e5 Pa, rho 1.2250 kg/m3, a 340.294 m/s,
	// mu 1.7894e-5 Pa·s. The demo grid's lowest row is 0 ft pressure
	// altitude on a standard day.
	const tol = 1e-4
	var found int
	err := EachRecord(maps[:1], func(r ExportRecord) error {
		if r.Row != 0 {
			return nil
		}
		found++
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"temperature_k", float64(r.Temperature), 288.150},
			{"pressure_pa", float64(r.Pressure), 101325},
			{"density_kg_m3", float64(r.Density), 1.2250},
			{"speed_of_sound_m_s", float64(r.SpeedOfSound), 340.294},
			{"viscosity_pa_s", float64(r.Viscosity), 1.7894e-5},
			// TAS = M·a at sea level (definition of Mach number).
			{"tas_m_s", float64(r.TAS), float64(r.Mach) * 340.294},
			// At sea level on a standard day EAS = TAS (definition).
			{"eas_m_s", float64(r.EAS), float64(r.TAS)},
		} {
			if !outClose(c.got, c.want, tol) {
				t.Errorf("row 0 col %d %s = %g, want %g", r.Col, c.name, c.got, c.want)
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if found == 0 {
		t.Fatal("no sea-level records in the demo export")
	}
}

func TestWriteJSONReadBack(t *testing.T) {
	g, maps := outDemoMaps(t)
	var b bytes.Buffer
	info := ExportInfo{Tool: "likewind", Version: "test", Generated: "2001-02-03"}
	if err := WriteExportJSON(&b, info, maps); err != nil {
		t.Fatalf("WriteJSON = %v", err)
	}
	var doc ExportDoc
	dec := json.NewDecoder(&b)
	dec.DisallowUnknownFields()
	if err := dec.Decode(&doc); err != nil {
		t.Fatalf("decode JSON export: %v", err)
	}
	if doc.ExportInfo != info {
		t.Errorf("info = %+v, want %+v", doc.ExportInfo, info)
	}
	if doc.Caution != envelope.PlanningNote || doc.Units != "SI" {
		t.Errorf("caution %q, units %q: want the planning note and SI", doc.Caution, doc.Units)
	}
	if doc.Vehicle.InsidePoints != g.InsideCount() || doc.Vehicle.Rows != g.Rows() || doc.Vehicle.Cols != g.Cols() {
		t.Errorf("vehicle block = %+v, want grid %d×%d, %d inside", doc.Vehicle, g.Rows(), g.Cols(), g.InsideCount())
	}
	if len(doc.Facilities) != len(maps) {
		t.Fatalf("facilities = %d, want %d", len(doc.Facilities), len(maps))
	}
	if got, want := len(doc.Records), g.InsideCount()*len(maps); got != want {
		t.Fatalf("records = %d, want %d", got, want)
	}
	k := 0
	err := EachRecord(maps, func(want ExportRecord) error {
		got := doc.Records[k]
		k++
		// Compare through JSON so NaN (null) fields compare equal.
		a, _ := json.Marshal(got)
		b, _ := json.Marshal(want)
		if !bytes.Equal(a, b) {
			t.Fatalf("record %d read back differs:\n got %s\nwant %s", k-1, a, b)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
}

func TestWriteJSONEmpty(t *testing.T) {
	var b bytes.Buffer
	if err := WriteExportJSON(&b, ExportInfo{Tool: "likewind"}, nil); err != nil {
		t.Fatal(err)
	}
	var doc ExportDoc
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatalf("empty export is not JSON: %v\n%s", err, b.String())
	}
	if len(doc.Records) != 0 {
		t.Errorf("records = %d, want 0", len(doc.Records))
	}
}

func TestNumJSON(t *testing.T) {
	for _, c := range []struct {
		in   Num
		want string
	}{
		{1.5, "1.5"}, {Num(math.NaN()), "null"}, {Num(math.Inf(1)), "null"}, {2.5e-7, "2.5e-07"}, {0, "0"},
	} {
		b, err := json.Marshal(c.in)
		if err != nil || string(b) != c.want {
			t.Errorf("json(%v) = %s, %v, want %s", float64(c.in), b, err, c.want)
		}
	}
	var x Num
	if err := json.Unmarshal([]byte("null"), &x); err != nil || x.Valid() {
		t.Errorf("unmarshal null = %v, %v, want NaN", float64(x), err)
	}
}

func BenchmarkWriteCSVDemo(b *testing.B) {
	_, maps := outDemoMaps(b)
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := WriteExportCSV(&buf, maps); err != nil {
			b.Fatal(err)
		}
	}
}

// FuzzNumJSON: any bytes either fail to parse or read back to a Num that
// writes and reads again to the same value; any float64 round-trips.
func FuzzNumJSON(f *testing.F) {
	for _, s := range []string{"1.5", "null", "-0", "2.5e-07", "1e308", "abc", "", "NaN"} {
		f.Add([]byte(s), 3.25)
	}
	f.Fuzz(func(t *testing.T, b []byte, x float64) {
		var n Num
		if err := n.UnmarshalJSON(b); err == nil {
			out, err := n.MarshalJSON()
			if err != nil {
				t.Fatalf("MarshalJSON(%v) = %v", float64(n), err)
			}
			var m Num
			if err := m.UnmarshalJSON(out); err != nil {
				t.Fatalf("reading back %s: %v", out, err)
			}
			if n.Valid() != m.Valid() || (n.Valid() && n != m) {
				t.Fatalf("%q → %v → %s → %v", b, float64(n), out, float64(m))
			}
		}
		out, _ := Num(x).MarshalJSON()
		var back Num
		if err := back.UnmarshalJSON(out); err != nil {
			t.Fatalf("read back %s: %v", out, err)
		}
		if Num(x).Valid() && back != Num(x) {
			t.Fatalf("%v → %s → %v", x, out, float64(back))
		}
	})
}

func ExampleExportColumns() {
	cols := ExportColumns()
	fmt.Println(cols[0], cols[4], cols[len(cols)-1])
	// Output: facility altitude_m balance_q_limit_pa
}

// TestExportGridDecimals: the grid point and the model scale are written
// as the decimals they stand for (shortest round-trip form of tidy axis
// values), for both demo vehicles: "0.3", "1828.8", "0.1125".
func TestExportGridDecimals(t *testing.T) {
	vs, facs := demoFleet(t)
	for _, v := range vs {
		s := envelope.DefaultSettings(v)
		g, err := envelope.NewGrid(v, s)
		if err != nil {
			t.Fatal(err)
		}
		var maps []*envelope.Map
		for k := range facs {
			m, err := envelope.Solve(g, &facs[k], s)
			if err != nil {
				t.Fatal(err)
			}
			maps = append(maps, m)
		}
		var b bytes.Buffer
		if err := WriteExportCSV(&b, maps); err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(&b).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		col := map[string]int{}
		for k, c := range rows[0] {
			col[c] = k
		}
		// Demo altitudes are whole feet (at most 4 decimals in metres),
		// speeds hundredths of Mach.
		for _, row := range rows[1:] {
			for _, c := range []struct {
				name   string
				maxLen int
			}{{"altitude_m", len("-12345.6789")}, {"grid_speed", len("0.12")}} {
				if x := row[col[c.name]]; len(x) > c.maxLen {
					t.Errorf("%s: %s = %q, want a short decimal", v.Name, c.name, x)
				}
			}
		}
		// Halcyra HA-1 (span 24 m) fitted by the span rule: 0.75 × 3.6 m,
		// 0.6 × 2 m and 0.8 × 2.4 m over 24 m.
		want := map[string]string{}
		if strings.HasPrefix(v.Name, "Halcyra") {
			want = map[string]string{"Bracken Ness": "0.1125", "Harl Cove": "0.05", "Aldmoor": "0.08"}
		}
		for _, row := range rows[1:] {
			for name, w := range want {
				if strings.HasPrefix(row[col["facility"]], name) && row[col["model_scale"]] != w {
					t.Fatalf("%s in %s: model_scale %q, want %q", v.Name, row[col["facility"]], row[col["model_scale"]], w)
				}
			}
		}
	}
}

// TestExportPressureAltitude: the demo's altitudes are pressure altitudes,
// which lie on the geopotential scale. At 36 000 ft (10 972.8 m) the
// standard temperature is 288.15 K − 6.5 K/km' × 10.9728 km' = 216.8268 K
// (ISA / USSA 1976 defining sea-level temperature and lapse rate of the
// first layer); read as a geometric height (10 953.9 m') it would be
// 216.95 K. pressure_altitude_m is the grid altitude itself.
func TestExportPressureAltitude(t *testing.T) {
	_, maps := outDemoMaps(t)
	found := 0
	err := EachRecord(maps[:1], func(r ExportRecord) error {
		if r.AltitudeKind != "pressure" || r.PressureAltitude != r.Altitude {
			t.Fatalf("record (%d, %d): %s altitude %v, pressure_altitude_m %v", r.Row, r.Col, r.AltitudeKind, float64(r.Altitude), float64(r.PressureAltitude))
		}
		if r.Altitude != 10972.8 {
			return nil
		}
		found++
		if want := 288.15 - 0.0065*10972.8; math.Abs(float64(r.Temperature)-want) > 1e-9 {
			t.Errorf("(%d, %d) at 36000 ft pressure altitude: temperature_k %.6f, want %.6f", r.Row, r.Col, float64(r.Temperature), want)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if found == 0 {
		t.Fatal("no 36000 ft records in the demo export")
	}
}
