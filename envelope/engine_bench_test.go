package envelope

import (
	"context"
	"sync"
	"testing"

	"likewind/atmos"
)

// Speed targets (benchmarks, not timed tests): NewGrid+Solve on a 400×400
// grid for one facility under 30 ms on one core, and under 100 bytes stored
// per point (grid + one map). Run together with the atmosphere benchmark so
// the ratio to atmos.At is measured on the same machine in one run:
//
//	go test -run '^$' -bench . -cpu 1 ./atmos/ ./envelope/

// benchVehicle is an invented supersonic vehicle whose envelope fills most
// of a 0–20 km, Mach 0.1–2.4 grid, so that nearly every point is solved.
func benchVehicle(n int) *Vehicle {
	return &Vehicle{
		Name:        "bench delta",
		RefLength:   6,
		Span:        12,
		FrontalArea: 3.5,
		Boundary: []Vertex{
			{0, 0.12}, {0, 1.0}, {11000, 2.2}, {20000, 2.3}, {20000, 0.9}, {6000, 0.3},
		},
		BoundaryKind: atmos.Mach,
		Grid: GridSpec{
			Altitude:  Axis{Min: 0, Max: 20000, Count: n},
			Speed:     Axis{Min: 0.1, Max: 2.4, Count: n},
			SpeedKind: atmos.Mach,
		},
	}
}

// benchFacilities are six invented facilities covering every solve path:
// cryogenic nitrogen with the saturation line, pressurised ambient air,
// atmospheric low speed, supersonic and hypersonic blowdown air, and water.
func benchFacilities() []Facility {
	return []Facility{
		cryoTunnel(),
		{Name: "pressurised transonic", Medium: "air",
			Gas:  GasLimits{MachMin: 0.2, MachMax: 1.3, P0Min: 0.3e5, P0Max: 3e5, T0Min: 300, T0Max: 330},
			QMax: 1.2e5, Width: 3, Height: 3},
		{Name: "atmospheric low speed", Medium: "air",
			Gas:   GasLimits{MachMin: 0.03, MachMax: 0.3, P0Min: 1e5, P0Max: 1.03e5, T0Min: 285, T0Max: 315},
			Width: 4, Height: 3},
		{Name: "supersonic blowdown", Medium: "air",
			Gas: GasLimits{MachMin: 1.5, MachMax: 4.5, P0Min: 1.5e5, P0Max: 1.5e6, T0Min: 280, T0Max: 320,
				Condensation: true},
			Width: 0.6, Height: 0.6},
		{Name: "hypersonic blowdown", Medium: "air",
			Gas: GasLimits{MachMin: 5, MachMax: 10, P0Min: 1e6, P0Max: 12e6, T0Min: 400, T0Max: 1100,
				Condensation: true},
			Width: 0.5, Height: 0.5},
		waterTunnel(),
	}
}

// BenchmarkPointEvaluation is one point evaluated fully: airspeeds,
// envelope test, flight values, and the facility solve in cryogenic
// nitrogen (saturation line active), reported per point.
func BenchmarkPointEvaluation(b *testing.B) {
	v := benchVehicle(2)
	s := testSettings()
	g, err := NewGrid(v, s)
	if err != nil {
		b.Fatal(err)
	}
	f := cryoTunnel()
	m, err := Solve(g, &f, s)
	if err != nil {
		b.Fatal(err)
	}
	st, _ := atmos.At(9000)
	rl := g.rowLimits(9000, &st, boundaryEnvSpans(v.Boundary, 9000, nil))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		r := g.evalPoint(0.85, &st, &rl)
		ps := m.sv.solve(r.mach, r.re, st.Temperature, false)
		benchSink = ps.result()
	}
}

var benchSink Result

func benchGridSolve(b *testing.B, fs []Facility) {
	const n = 400
	v := benchVehicle(n)
	s := testSettings()
	b.ReportAllocs()
	var bytes int
	for i := 0; i < b.N; i++ {
		g, err := NewGrid(v, s)
		if err != nil {
			b.Fatal(err)
		}
		bytes = g.StoredBytes()
		for k := range fs {
			m, err := Solve(g, &fs[k], s)
			if err != nil {
				b.Fatal(err)
			}
			bytes += m.StoredBytes()
		}
	}
	b.ReportMetric(float64(bytes)/(n*n), "B/point")
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/(n*n), "ns/point")
}

// BenchmarkGridSolve400 is NewGrid plus Solve for the cryogenic facility
// on a 400×400 grid (target: under 30 ms per op on one core).
func BenchmarkGridSolve400(b *testing.B) {
	benchGridSolve(b, benchFacilities()[:1])
}

// BenchmarkGridSolve400Six is NewGrid plus Solve for all six facilities.
func BenchmarkGridSolve400Six(b *testing.B) {
	benchGridSolve(b, benchFacilities())
}

// BenchmarkNewGrid400 is the flight side alone.
func BenchmarkNewGrid400(b *testing.B) {
	v := benchVehicle(400)
	s := testSettings()
	for i := 0; i < b.N; i++ {
		if _, err := NewGrid(v, s); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkResolve400 is a facility what-if: Solve again on an existing
// grid (NewGrid is not repeated).
func BenchmarkResolve400(b *testing.B) {
	v := benchVehicle(400)
	s := testSettings()
	g, err := NewGrid(v, s)
	if err != nil {
		b.Fatal(err)
	}
	f := cryoTunnel()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		f.Gas.P0Max = 4e5 + float64(i%2)*0.5e5 // the what-if
		if _, err := Solve(g, &f, s); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkWaterCooling is the one searched water case: the minimum speed
// overshoots warm water, so the water temperature that brings the
// Reynolds number down to flight is found (a few atmos.WaterAt calls).
func BenchmarkWaterCooling(b *testing.B) {
	f := waterTunnel()
	f.Water.SpeedMin = 3
	sv := testWaterSolver(b, f, testSettings(), 0.5)
	target := 0.8 * 3 * 0.5 / sv.hot.KinematicViscosity
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		ps := sv.solve(0.2, target, 288.15, false)
		benchSink = ps.result()
	}
}

// demo400 is the demo vehicle on a 400×400 grid with the demo facilities
// and the vehicle's default settings, as the interface opens it.
func demo400(b *testing.B) (*Vehicle, []Facility, Settings) {
	b.Helper()
	v, facs, err := Demo()
	if err != nil {
		b.Fatal(err)
	}
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 400, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 400, 0
	return v, facs, DefaultSettings(v)
}

// shortName is the first word of a facility name, for sub-benchmarks.
func shortName(f *Facility) string {
	for k, r := range f.Name {
		if r == ' ' {
			return f.Name[:k]
		}
	}
	return f.Name
}

// BenchmarkDemoSolve400 is the engine side of a facility what-if in the
// interface: Solve of one demo facility on the demo vehicle's 400×400 grid
// (the grid is not rebuilt). The interface budget for the whole key press
// is 16 ms (tui BenchmarkKeyToFrame).
func BenchmarkDemoSolve400(b *testing.B) {
	v, facs, s := demo400(b)
	g, err := NewGrid(v, s)
	if err != nil {
		b.Fatal(err)
	}
	for k := range facs {
		b.Run(shortName(&facs[k]), func(b *testing.B) {
			f := facs[k]
			for i := 0; b.Loop(); i++ {
				f.SetPressureMax(facs[k].PressureMax() * (1 - 0.05*float64(i%2))) // the what-if
				if _, err := Solve(g, &f, s); err != nil {
					b.Fatal(err)
				}
			}
			reportPerPoint(b, g)
		})
	}
}

// reportPerPoint adds the time per grid point (ns/point, wall time with
// every processor): read it against atmos BenchmarkBareMath/exp-or-pow
// (one core) measured in the same run.
func reportPerPoint(b *testing.B, g *Grid) {
	if b.N > 0 {
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(g.Rows()*g.Cols()), "ns/point")
	}
}

// BenchmarkDemoDeltaT400 is the engine side of a ΔT what-if in the
// interface: NewGrid on the demo vehicle's 400×400 grid, Solve of the six
// demo facilities side by side (as the interface runs them), and Best.
func BenchmarkDemoDeltaT400(b *testing.B) {
	v, facs, s := demo400(b)
	b.Run("NewGrid", func(b *testing.B) {
		for i := 0; b.Loop(); i++ {
			s.DeltaT = 5 * float64(i%2)
			if _, err := NewGrid(v, s); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("Best", func(b *testing.B) {
		g, err := NewGrid(v, s)
		if err != nil {
			b.Fatal(err)
		}
		maps := make([]*Map, len(facs))
		for k := range facs {
			if maps[k], err = Solve(g, &facs[k], s); err != nil {
				b.Fatal(err)
			}
		}
		for b.Loop() {
			Best(maps)
		}
	})
	b.Run("all", func(b *testing.B) {
		maps := make([]*Map, len(facs))
		errs := make([]error, len(facs))
		for i := 0; b.Loop(); i++ {
			s.DeltaT = 5 * float64(i%2)
			g, err := NewGrid(v, s)
			if err != nil {
				b.Fatal(err)
			}
			var wg sync.WaitGroup
			for k := range facs {
				wg.Go(func() { maps[k], errs[k] = Solve(g, &facs[k], s) })
			}
			wg.Wait()
			for _, err := range errs {
				if err != nil {
					b.Fatal(err)
				}
			}
			Best(maps)
		}
		g, _ := NewGrid(v, s)
		reportPerPoint(b, g)
	})
	// The same in one pass (SolveAllReusing), the arrays reused as the
	// interface reuses them.
	b.Run("one-pass", func(b *testing.B) {
		var buf Buffers
		var grid *Grid
		for i := 0; b.Loop(); i++ {
			s.DeltaT = 5 * float64(i%2)
			g, err := NewGridReusing(context.Background(), v, s, grid)
			if err != nil {
				b.Fatal(err)
			}
			a, err := SolveAllReusing(context.Background(), g, facs, s, buf)
			if err != nil {
				b.Fatal(err)
			}
			buf = Buffers{Best: a.Best, BestRes: a.BestRes}
			for _, m := range a.Maps {
				buf.Results = append(buf.Results, m.Results)
			}
			grid = g
		}
		g, _ := NewGrid(v, s)
		reportPerPoint(b, g)
	})
}

// BenchmarkNewGridStaged400 is the flight side of a ΔT what-if as the
// interface makes it, on the demo vehicle's 400×400 grid with the window
// a 200×60 screen shows (60 rows by 80 columns, mid-grid): "head" is
// what the early points wait for (every row's atmosphere, the window's
// rows, each row's top), "whole" the head and the rest. Read against
// BenchmarkDemoDeltaT400/NewGrid.
func BenchmarkNewGridStaged400(b *testing.B) {
	v, _, s := demo400(b)
	win := Window{Span{170, 230}, Span{160, 240}}
	var g *Grid
	for _, whole := range []bool{false, true} {
		name := "head"
		if whole {
			name = "whole"
		}
		b.Run(name, func(b *testing.B) {
			for i := 0; b.Loop(); i++ {
				s.DeltaT = 5 * float64(i%2)
				var rest func() error
				var err error
				if g, rest, err = NewGridStaged(context.Background(), v, s, g, win); err != nil {
					b.Fatal(err)
				}
				if whole {
					if err := rest(); err != nil {
						b.Fatal(err)
					}
				}
			}
		})
	}
}
