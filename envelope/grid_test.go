package envelope

import (
	"math"
	"reflect"
	"strconv"
	"testing"

	"likewind/atmos"
)

// Tolerances of the grid tests.
const (
	// ussaTableTol is the relative tolerance against values printed to
	// five significant figures.
	ussaTableTol = 1e-4
	// float32Tol is the relative tolerance between the stored single
	// precision values and the full-precision detail.
	float32Tol = 1e-6
)

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// testTransport is an invented subsonic transport: reference length 5 m,
// envelope Mach 0.15–0.9 up to 13 km.
func testTransport() *Vehicle {
	return &Vehicle{
		Name: "test transport", RefLength: 5, Span: 40, FrontalArea: 20,
		Boundary: []Vertex{
			{0, 0.15}, {0, 0.6}, {8000, 0.9}, {13000, 0.9}, {13000, 0.5}, {3000, 0.2},
		},
		BoundaryKind: atmos.Mach,
		Grid: GridSpec{
			Altitude:  Axis{Min: 0, Max: 13000, Step: 1000},
			Speed:     Axis{Min: 0.1, Max: 0.95, Step: 0.05},
			SpeedKind: atmos.Mach,
		},
	}
}

func TestGridAxis(t *testing.T) {
	tests := []struct {
		name string
		a    Axis
		want []float64
	}{
		{"step divides", Axis{Min: 0, Max: 1000, Step: 250}, []float64{0, 250, 500, 750, 1000}},
		{"step does not divide", Axis{Min: 0, Max: 900, Step: 250}, []float64{0, 250, 500, 750}},
		{"count", Axis{Min: 0.2, Max: 0.8, Count: 4}, []float64{0.2, 0.4, 0.6, 0.8}},
		{"single", Axis{Min: 5, Max: 5, Count: 3}, []float64{5}},
		{"derived", Axis{}, nil}, // checked for its length below
	}
	for _, tc := range tests {
		got, err := gridAxis(tc.a, func() (float64, float64, bool) { return 0, 10, true })
		if err != nil {
			t.Errorf("%s: gridAxis(%+v) error %v", tc.name, tc.a, err)
			continue
		}
		if tc.want == nil {
			if len(got) != gridDefaultPoints || got[0] != 0 || got[len(got)-1] != 10 {
				t.Errorf("%s: gridAxis = %d points %v..%v, want %d points 0..10", tc.name, len(got), got[0], got[len(got)-1], gridDefaultPoints)
			}
			continue
		}
		if len(got) != len(tc.want) {
			t.Errorf("%s: gridAxis(%+v) = %v, want %v", tc.name, tc.a, got, tc.want)
			continue
		}
		for k := range got {
			if math.Abs(got[k]-tc.want[k]) > 1e-12 {
				t.Errorf("%s: gridAxis(%+v)[%d] = %v, want %v", tc.name, tc.a, k, got[k], tc.want[k])
			}
		}
	}
	for _, bad := range []Axis{
		{Min: 10, Max: 0, Step: 1},
		{Min: 0, Max: 1, Step: -1},
		{Min: 0, Max: 1e9, Step: 1},
		{Min: math.NaN(), Max: 1, Count: 3},
	} {
		if _, err := gridAxis(bad, func() (float64, float64, bool) { return 0, 1, true }); err == nil {
			t.Errorf("gridAxis(%+v) gave no error, want one", bad)
		}
	}
}

// TestFlightValuesSeaLevel checks the stored flight values at sea level,
// Mach 0.5, L = 5 m against the U.S. Standard Atmosphere 1976 sea-level
// values (Table I and Table III): ρ = 1.2250 kg/m³, a = 340.29 m/s,
// μ = 1.7894e-5 Pa·s, λ = 6.6328e-8 m, p = 101 325 Pa. By hand:
//
//	V  = 0.5 × 340.29            = 170.15 m/s
//	q  = ½γpM² = 0.7 × 101325 × 0.25 = 17 732 Pa
//	Re = 1.2250 × 170.15 × 5 / 1.7894e-5 = 5.8240e7
//	Kn = 6.6328e-8 / 5           = 1.3266e-8
//	T0 = 288.15 × (1 + 0.2 × 0.25) = 302.56 K
func TestFlightValuesSeaLevel(t *testing.T) {
	v := testTransport()
	v.Grid = GridSpec{Altitude: Axis{Min: 0, Max: 0, Count: 1}, Speed: Axis{Min: 0.5, Max: 0.5, Count: 1}, SpeedKind: atmos.Mach}
	g, err := NewGrid(v, testSettings())
	if err != nil {
		t.Fatal(err)
	}
	if !g.Inside(0, 0) {
		t.Fatalf("Inside(0, 0) = false, want true (%v)", g.Exclusion(0, 0))
	}
	fp := g.Flight(0, 0)
	fd, err := g.FlightDetail(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"TAS", float64(fp.TAS), 170.15},
		{"Q", float64(fp.Q), 17732},
		{"Re", float64(fp.Re), 5.8240e7},
		{"Kn", float64(fp.Kn), 1.3266e-8},
		{"detail T0", fd.T0, 302.56},
		{"detail Re", fd.Re, 5.8240e7},
	}
	for _, c := range checks {
		if e := relErr(c.got, c.want); e > ussaTableTol {
			t.Errorf("sea level M 0.5 %s = %.6g, want %.5g (USSA 1976 by hand, rel err %.2g)", c.name, c.got, c.want, e)
		}
	}
	if fp.Speed != atmos.Subsonic || fp.Rarefaction != atmos.Continuum {
		t.Errorf("regimes = %v, %v, want subsonic, continuum (default thresholds, common practice)", fp.Speed, fp.Rarefaction)
	}
}

// TestFlightDetailAgrees holds the stored single-precision values to the
// full-precision detail, and the detail's Mach and Reynolds numbers to the
// stored ones exactly (the facility solve uses them).
func TestFlightDetailAgrees(t *testing.T) {
	g, err := NewGrid(testTransport(), testSettings())
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			fd, err := g.FlightDetail(i, j)
			if err != nil {
				t.Fatal(err)
			}
			if fd.Inside != g.Inside(i, j) {
				t.Fatalf("(%d,%d) detail Inside %v, grid %v", i, j, fd.Inside, g.Inside(i, j))
			}
			if !fd.Inside {
				continue
			}
			n++
			r := g.points[g.Index(i, j)]
			if fd.Airspeeds.Mach != r.mach || fd.Re != r.re {
				t.Errorf("(%d,%d) detail M %v Re %v, stored %v %v: want identical", i, j, fd.Airspeeds.Mach, fd.Re, r.mach, r.re)
			}
			fp := g.Flight(i, j)
			for _, c := range []struct {
				name      string
				got, want float64
			}{{"Mach", float64(fp.Mach), fd.Airspeeds.Mach}, {"TAS", float64(fp.TAS), fd.Airspeeds.TAS},
				{"Q", float64(fp.Q), fd.Q}, {"Re", float64(fp.Re), fd.Re}, {"Kn", float64(fp.Kn), fd.Kn}} {
				if relErr(c.got, c.want) > float32Tol {
					t.Errorf("(%d,%d) Flight %s = %v, detail %v", i, j, c.name, c.got, c.want)
				}
			}
		}
	}
	if n != g.InsideCount() || n == 0 {
		t.Errorf("inside points counted %d, InsideCount %d", n, g.InsideCount())
	}
}

// pointInPolygon is a plain even–odd ray cast with points on an edge
// counted inside, written independently of the grid code.
func pointInPolygon(b []Vertex, h, s float64) bool {
	in := false
	for k := range b {
		p, q := b[k], b[(k+1)%len(b)]
		// On the segment?
		cross := (q.Altitude-p.Altitude)*(s-p.Speed) - (q.Speed-p.Speed)*(h-p.Altitude)
		if math.Abs(cross) < 1e-9*(math.Abs(q.Altitude-p.Altitude)+1)*(math.Abs(q.Speed-p.Speed)+1) &&
			h >= math.Min(p.Altitude, q.Altitude) && h <= math.Max(p.Altitude, q.Altitude) &&
			s >= math.Min(p.Speed, q.Speed)-1e-12 && s <= math.Max(p.Speed, q.Speed)+1e-12 {
			return true
		}
		if (p.Altitude > h) != (q.Altitude > h) {
			x := p.Speed + (h-p.Altitude)/(q.Altitude-p.Altitude)*(q.Speed-p.Speed)
			if s < x {
				in = !in
			}
		}
	}
	return in
}

// TestInsideMatchesDirectCheck compares NewGrid (which converts the
// boundary and limit lines to the grid's speed kind once per row) with the
// direct method: convert every point with atmos.Speeds to the boundary's
// kind, ray-cast, then test each limit line in its own kind.
func TestInsideMatchesDirectCheck(t *testing.T) {
	v := &Vehicle{
		Name: "mixed kinds", RefLength: 3,
		// Boundary in EAS (m/s), grid in Mach, limits in Mach, CAS, q and TAS.
		Boundary: []Vertex{
			{-300, 51.3}, {-300, 171.7}, {6100, 203.9}, {14900, 131.1}, {14900, 77.7}, {4200, 61.9},
		},
		BoundaryKind: atmos.EAS,
		Limits: Limits{
			Ceiling: 13777, MaxMach: 0.823, MaxCAS: 187.3, MaxQ: 17130,
			MinSpeed: 83.1, MinSpeedKind: atmos.TAS,
		},
		Grid: GridSpec{
			Altitude:  Axis{Min: -300, Max: 15000, Count: 53},
			Speed:     Axis{Min: 0.05, Max: 1.0, Count: 71},
			SpeedKind: atmos.Mach,
		},
	}
	s := testSettings()
	s.DeltaT = 12
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	reasons := map[Exclusion]int{}
	for i, h := range g.Alts {
		st, err := atmos.AtDay(h, v.AltitudeKind, s.DeltaT)
		if err != nil {
			t.Fatal(err)
		}
		for j, sp := range g.Speeds {
			a, err := atmos.Speeds(g.SpeedKind, sp, st)
			if err != nil {
				t.Fatal(err)
			}
			q := 0.5 * st.Density * a.TAS * a.TAS
			want := h <= v.Limits.Ceiling && pointInPolygon(v.Boundary, h, a.EAS) &&
				a.Mach <= v.Limits.MaxMach && a.CAS <= v.Limits.MaxCAS && q <= v.Limits.MaxQ &&
				a.TAS >= v.Limits.MinSpeed
			if got := g.Inside(i, j); got != want {
				t.Errorf("Inside at %.0f m, M %.4f (EAS %.2f, CAS %.2f, q %.0f) = %v, want %v (%v)",
					h, sp, a.EAS, a.CAS, q, got, want, g.Exclusion(i, j))
			}
			reasons[g.Exclusion(i, j)]++
		}
	}
	for _, e := range []Exclusion{InEnvelope, AboveCeiling, OutsideBoundary, AboveMaxMach, AboveMaxCAS, AboveMaxQ, BelowMinSpeed} {
		if reasons[e] == 0 {
			t.Errorf("no grid point excluded as %q; the test vehicle should exercise every limit", e)
		}
	}
}

// TestBoundaryEdgesInside: points exactly on the boundary (bottom, top and
// side edges, vertices) count as inside.
func TestBoundaryEdgesInside(t *testing.T) {
	v := &Vehicle{
		Name: "box", RefLength: 1,
		Boundary:     []Vertex{{0, 0.2}, {0, 0.8}, {10000, 0.8}, {10000, 0.2}},
		BoundaryKind: atmos.Mach,
		Grid: GridSpec{
			Altitude:  Axis{Min: 0, Max: 10000, Step: 5000},
			Speed:     Axis{Min: 0.1, Max: 0.9, Step: 0.1},
			SpeedKind: atmos.Mach,
		},
	}
	g, err := NewGrid(v, testSettings())
	if err != nil {
		t.Fatal(err)
	}
	for i := range g.Alts {
		for j, sp := range g.Speeds {
			want := sp >= 0.2-1e-12 && sp <= 0.8+1e-12
			if got := g.Inside(i, j); got != want {
				t.Errorf("Inside(%.0f m, M %.2f) = %v, want %v", g.Alts[i], sp, got, want)
			}
		}
	}
}

func TestNewGridErrors(t *testing.T) {
	base := testTransport()
	tests := []struct {
		name string
		edit func(v *Vehicle)
	}{
		{"no reference length", func(v *Vehicle) { v.RefLength = 0 }},
		{"two vertices", func(v *Vehicle) { v.Boundary = v.Boundary[:2] }},
		{"altitude out of the atmosphere", func(v *Vehicle) { v.Grid.Altitude = Axis{Min: 0, Max: 90000, Step: 10000} }},
		{"reversed axis", func(v *Vehicle) { v.Grid.Speed = Axis{Min: 0.9, Max: 0.1, Step: 0.1} }},
	}
	for _, tc := range tests {
		v := *base
		v.Boundary = append([]Vertex(nil), base.Boundary...)
		tc.edit(&v)
		if _, err := NewGrid(&v, testSettings()); err == nil {
			t.Errorf("%s: NewGrid gave no error, want one", tc.name)
		}
	}
	if _, err := NewGrid(nil, testSettings()); err == nil {
		t.Error("NewGrid(nil) gave no error")
	}
}

// TestGridOtherKinds builds the same envelope on TAS, EAS and CAS grids and
// checks that the flight values of every inside point agree with
// atmos.Speeds.
func TestGridOtherKinds(t *testing.T) {
	for _, kind := range []atmos.SpeedKind{atmos.TAS, atmos.EAS, atmos.CAS} {
		v := testTransport()
		v.Grid.SpeedKind = kind
		v.Grid.Speed = Axis{Min: 30, Max: 300, Step: 15}
		g, err := NewGrid(v, testSettings())
		if err != nil {
			t.Fatal(err)
		}
		if g.InsideCount() == 0 {
			t.Errorf("%s grid: no inside points", kind)
		}
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if !g.Inside(i, j) {
					continue
				}
				a, err := atmos.Speeds(kind, g.Speeds[j], g.Atmosphere(i))
				if err != nil {
					t.Fatal(err)
				}
				if fp := g.Flight(i, j); relErr(float64(fp.Mach), a.Mach) > float32Tol || relErr(float64(fp.TAS), a.TAS) > float32Tol {
					t.Errorf("%s grid (%d,%d): M %v TAS %v, atmos.Speeds gives %v %v", kind, i, j, fp.Mach, fp.TAS, a.Mach, a.TAS)
				}
				if a.Mach < 0.15-1e-9 || a.Mach > 0.9+1e-9 {
					t.Errorf("%s grid (%d,%d): inside at Mach %v, outside the boundary's 0.15–0.9", kind, i, j, a.Mach)
				}
			}
		}
	}
}

// TestStoredSizes holds the per-point storage to its documented size:
// 32 bytes of flight data and 28 bytes per facility result.
func TestStoredSizes(t *testing.T) {
	if n := reflect.TypeFor[flightRec]().Size(); n != 32 {
		t.Errorf("flightRec is %d bytes, want 32", n)
	}
	if n := reflect.TypeFor[Result]().Size(); n != 28 {
		t.Errorf("Result is %d bytes, want 28", n)
	}
}

// TestGridAxisDecimals: axis values are min + i·step (or evenly spread for
// a count) held to the decimal they stand for, so that exports write
// "0.3" and "1828.8", not 0.30000000000000004 or 1828.8000000000002.
func TestGridAxisDecimals(t *testing.T) {
	vs, err := DemoVehicles()
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range vs {
		g, err := NewGrid(v, DefaultSettings(v))
		if err != nil {
			t.Fatalf("%s: %v", v.Name, err)
		}
		// Every demo axis is in whole feet and hundredths of Mach: the
		// altitudes are multiples of 0.3048 m rounded to 0.1 mm, the
		// speeds multiples of 0.01.
		for _, ax := range []struct {
			name   string
			vals   []float64
			places int
		}{{"altitude", g.Alts, 4}, {"speed", g.Speeds, 2}} {
			for k, x := range ax.vals {
				want, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'f', ax.places, 64), 64)
				if x != want {
					t.Errorf("%s: %s[%d] = %s, want %s", v.Name, ax.name, k,
						strconv.FormatFloat(x, 'g', -1, 64), strconv.FormatFloat(want, 'g', -1, 64))
				}
			}
		}
	}
	// The step form is min + i·step, not a running sum: 0.1 added 30 times
	// is 3.0000000000000013, 0.1 + 29·0.1 rounds to 3.
	xs, err := gridAxis(Axis{Min: 0.1, Max: 3, Step: 0.1}, nil)
	if err != nil || len(xs) != 30 {
		t.Fatalf("gridAxis 0.1..3 step 0.1 = %v, %v", xs, err)
	}
	for k, x := range xs {
		if want := float64(k+1) / 10; x != want {
			t.Errorf("gridAxis 0.1..3 step 0.1 [%d] = %v, want %v", k, x, want)
		}
	}
	// Values that are not short decimals are left alone, and points only
	// a few ulps apart keep their order.
	if got := tidyDecimal(1.0 / 3); got != 1.0/3 {
		t.Errorf("tidyDecimal(1/3) = %v, want 1/3 unchanged", got)
	}
	if got := tidyDecimal(1.0 / 60); got != 1.0/60 {
		t.Errorf("tidyDecimal(1/60) = %v, want 1/60 unchanged", got)
	}
	near, err := gridAxis(Axis{Min: 1, Max: 1 + 4e-16, Count: 3}, nil)
	if err != nil {
		t.Fatal(err)
	}
	for k := 1; k < len(near); k++ {
		if !(near[k] > near[k-1]) {
			t.Errorf("gridAxis 1..1+4e-16 = %v, want strictly increasing", near)
		}
	}
}

// TestFitScaleDecimal: the fitted scale of a section and span given in
// round numbers is that round number (0.75 × 3.6 m / 24 m = 0.1125).
func TestFitScaleDecimal(t *testing.T) {
	v := &Vehicle{Span: 24}
	for _, c := range []struct {
		frac, width, want float64
	}{{0.75, 3.6, 0.1125}, {0.6, 2, 0.05}, {0.8, 2.4, 0.08}} {
		f := &Facility{Width: c.width, Height: 1, Model: ModelSizing{MaxSpanFraction: c.frac}}
		if got, _ := FitScale(v, f, 0.2); got != c.want {
			t.Errorf("FitScale(span 24 m, %g × %g m) = %s, want %g", c.frac, c.width, strconv.FormatFloat(got, 'g', -1, 64), c.want)
		}
	}
}
