package envelope

import "testing"

// TestOvershootWithinUnitReynoldsCap: where even the lowest setting (P0Min
// at T0Max) overshoots flight and breaks the facility's unit-Reynolds cap,
// nothing can run at that Mach number: the point is out of reach by the cap,
// not a full match at a setting the facility does not allow. (Found by
// FuzzSolve.)
//
// Invented facility: nitrogen, p0 10–50 bar, T0 285–315 K, cap 1e7 /m. At
// Mach 0.4, P0Min and T0Max the unit Reynolds number is about 8e7 /m
// (ρ ≈ 9.9 kg/m³, V ≈ 142 m/s, μ ≈ 1.8e-5 Pa·s, from the isentropic
// relations and Sutherland's law), far above the cap; flight at 15 km and
// Mach 0.4 on a 2 m model needs only about 3e6.
func TestOvershootWithinUnitReynoldsCap(t *testing.T) {
	f := Facility{Name: "capped", Medium: MediumNitrogen, MachMin: 0.2, MachMax: 0.6,
		P0Min: 10e5, P0Max: 50e5, T0Min: 285, T0Max: 315, MaxReynoldsPerM: 1e7, Width: 2, Height: 2}
	v := onePointVehicle(15000, 0.4, 2)
	s := testSettings()
	s.Scale = 1
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := Solve(g, &f, s)
	if err != nil {
		t.Fatal(err)
	}
	d, err := m.Detail(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	if d.Class != NoMatch || d.Limit != LimitRePerM {
		t.Errorf("class %v (%v) with unit Re %.3g, want out of reach by the unit Reynolds limit", d.Class, d.Limit, d.RePerM)
	}
	if d.HasSettings && d.RePerM > f.MaxReynoldsPerM*(1+fuzzSlack) {
		t.Errorf("settings give unit Re %.4g, above the cap %.4g", d.RePerM, f.MaxReynoldsPerM)
	}
	// Below the compressibility Mach number the relaxed search must skip
	// such Mach numbers the same way.
	v = onePointVehicle(15000, 0.25, 2)
	if g, err = NewGrid(v, s); err != nil {
		t.Fatal(err)
	}
	if m, err = Solve(g, &f, s); err != nil {
		t.Fatal(err)
	}
	if d, err = m.Detail(0, 0); err != nil {
		t.Fatal(err)
	}
	if d.HasSettings && d.RePerM > f.MaxReynoldsPerM*(1+fuzzSlack) {
		t.Errorf("Mach 0.25: class %v, settings give unit Re %.4g, above the cap %.4g", d.Class, d.RePerM, f.MaxReynoldsPerM)
	}
}
