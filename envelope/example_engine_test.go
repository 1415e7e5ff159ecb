package envelope_test

import (
	"fmt"
	"log"

	"likewind/atmos"
	"likewind/envelope"
)

// ExampleSolve evaluates an invented transport's envelope on a coarse grid
// (NewGrid, the flight side) and solves one invented cryogenic nitrogen
// tunnel over it (Solve, the facility side), then reads one point in full.
func ExampleSolve() {
	v := &envelope.Vehicle{
		Name:      "example transport",
		RefLength: 5, Span: 40, FrontalArea: 20,
		Boundary: []envelope.Vertex{
			{Altitude: 0, Speed: 0.15}, {Altitude: 0, Speed: 0.6}, {Altitude: 8000, Speed: 0.9},
			{Altitude: 13000, Speed: 0.9}, {Altitude: 13000, Speed: 0.5}, {Altitude: 3000, Speed: 0.2},
		},
		BoundaryKind: atmos.Mach,
		Grid: envelope.GridSpec{
			Altitude:  envelope.Axis{Min: 0, Max: 13000, Step: 1000},
			Speed:     envelope.Axis{Min: 0.1, Max: 0.95, Step: 0.05},
			SpeedKind: atmos.Mach,
		},
	}
	tunnel := envelope.Facility{
		Name: "example cryogenic tunnel", Medium: "nitrogen",
		Gas: envelope.GasLimits{MachMin: 0.2, MachMax: 1.2, P0Min: 1.2e5, P0Max: 2.5e5, T0Min: 90, T0Max: 320,
			Condensation: true},
		QMax: 8e4, Width: 2.5, Height: 2.5,
	}
	s := envelope.DefaultSettings(v)

	g, err := envelope.NewGrid(v, s)
	if err != nil {
		log.Fatal(err)
	}
	m, err := envelope.Solve(g, &tunnel, s)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("grid %d×%d, %d points inside\n", g.Rows(), g.Cols(), g.InsideCount())
	fmt.Printf("model scale %.3f (%s)\n", m.Scale, m.ScaleRule)
	sh := m.Shares()
	for _, c := range []envelope.Class{envelope.FullMatch, envelope.MachRelaxed, envelope.ReShort, envelope.NoMatch} {
		fmt.Printf("%-15s %3d (%.0f %%)\n", c, sh.Count[c], 100*sh.Share(c))
	}

	// 11 000 m, Mach 0.85 (row 11, column 15) and sea level, Mach 0.6
	// (row 0, column 10).
	for _, p := range [][2]int{{11, 15}, {0, 10}} {
		d, err := m.Detail(p[0], p[1])
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("%.0f m, Mach %.2f: %s, flight Re %.3g\n", d.Flight.Altitude, d.Flight.Airspeeds.Mach, d.Class, d.ReFlight)
		fmt.Printf("  p0 %.0f kPa, T0 %.1f K, q %.1f kPa, Re ratio %.2f, ΔCf %.5f, limit %s\n",
			d.P0/1e3, d.T0, d.Q/1e3, d.ReRatio, d.DCf, d.Limit)
		fmt.Printf("  cautions: %s\n", d.Flags)
	}
	// Output:
	// grid 14×18, 144 points inside
	// model scale 0.050 (fitted: span 80 % of section width)
	// full match       92 (64 %)
	// Mach relaxed      6 (4 %)
	// Reynolds short   46 (32 %)
	// out of reach      0 (0 %)
	// 11000 m, Mach 0.85: full match, flight Re 3.22e+07
	//   p0 250 kPa, T0 117.8 K, q 78.8 kPa, Re ratio 1.00, ΔCf 0.00000, limit none
	//   cautions: cryogenic, high p0, q near limit
	// 0 m, Mach 0.60: Reynolds short, flight Re 6.99e+07
	//   p0 250 kPa, T0 90.0 K, q 49.4 kPa, Re ratio 0.56, ΔCf 0.00020, limit maximum p0
	//   cautions: condensation warning, real-gas caution, cryogenic, high p0
}
