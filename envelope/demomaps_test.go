package envelope

import "testing"

// outDemoMaps solves every demo facility on the demo vehicle's grid
// (invented data).
func outDemoMaps(t testing.TB) (*Grid, []*Map) { return demoMapsWith(t, nil) }

// outDemoMapsNoLoads is outDemoMaps without the demo's load data
// (stripLoads).
func outDemoMapsNoLoads(t testing.TB) (*Grid, []*Map) { return demoMapsWith(t, stripLoads) }

// demoMapsWith solves every demo facility on the demo vehicle's grid,
// the data changed by edit first (nil: as they are).
func demoMapsWith(t testing.TB, edit func(*Vehicle, []Facility)) (*Grid, []*Map) {
	t.Helper()
	v, facs, err := Demo()
	if err != nil {
		t.Fatalf("Demo() = %v", err)
	}
	if edit != nil {
		edit(v, facs)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatalf("NewGrid = %v", err)
	}
	var maps []*Map
	for k := range facs {
		m, err := Solve(g, &facs[k], s)
		if err != nil {
			t.Fatalf("Solve(%s) = %v", facs[k].Name, err)
		}
		maps = append(maps, m)
	}
	return g, maps
}

// outSecondDemoMaps solves every demo facility on the second demo vehicle
// (Halcyra HA-1, low Mach numbers, many Mach-relaxed matches).
func outSecondDemoMaps(t testing.TB) (*Grid, []*Map) {
	t.Helper()
	vs, facs := demoFleet(t)
	v := vs[1]
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatal(err)
	}
	var maps []*Map
	for k := range facs {
		m, err := Solve(g, &facs[k], s)
		if err != nil {
			t.Fatal(err)
		}
		maps = append(maps, m)
	}
	return g, maps
}

// demoGridCase is the demo vehicle's grid under its default settings,
// with the demo facilities (invented data).
func demoGridCase(t testing.TB) (*Grid, []Facility, Settings) {
	t.Helper()
	v, facs, err := Demo()
	if err != nil {
		t.Fatalf("Demo() = %v", err)
	}
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil {
		t.Fatalf("NewGrid = %v", err)
	}
	return g, facs, s
}

// demoFleet is both demo vehicles and the demo facilities (invented
// data).
func demoFleet(t testing.TB) ([]*Vehicle, []Facility) {
	t.Helper()
	vs, err := DemoVehicles()
	if err != nil || len(vs) < 2 {
		t.Fatalf("DemoVehicles() = %d vehicles, %v", len(vs), err)
	}
	_, facs, err := Demo()
	if err != nil {
		t.Fatalf("Demo() = %v", err)
	}
	return vs, facs
}
