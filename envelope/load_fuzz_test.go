package envelope

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"testing"
)

// addSeeds adds the example, demo and bad files to a fuzz corpus.
func addSeeds(f *testing.F, extra ...string) {
	for _, s := range extra {
		f.Add([]byte(s))
	}
	for _, pattern := range []string{"demo/*.toml", "../testdata/*.toml", "../testdata/examples/*.toml", "../testdata/bad/*.toml"} {
		files, _ := filepath.Glob(pattern)
		for _, file := range files {
			if data, err := os.ReadFile(file); err == nil {
				f.Add(data)
			}
		}
	}
}

func finiteAll(xs ...float64) bool {
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

// checkFileErrors requires a loader error to be a non-empty *FileErrors
// naming the file.
func checkFileErrors(t *testing.T, err error) {
	t.Helper()
	var fe *FileErrors
	if !errors.As(err, &fe) || len(*fe) == 0 {
		t.Fatalf("error %T %v, want a non-empty *FileErrors", err, err)
	}
	for _, e := range *fe {
		if e.File != "fuzz.toml" || e.Expected == "" {
			t.Fatalf("FileError %+v: want File fuzz.toml and an Expected text", e)
		}
	}
}

// FuzzParseVehicle: any input either fails with a *FileErrors or gives a
// vehicle whose numbers are finite and in range (load data too), whose
// grid is within the size limit, and which survives a write and re-read
// unchanged.
func FuzzParseVehicle(f *testing.F) {
	addSeeds(f, baseVehicle)
	f.Fuzz(func(t *testing.T, data []byte) {
		v, err := ParseVehicle("fuzz.toml", data)
		if err != nil {
			checkFileErrors(t, err)
			return
		}
		if !(v.RefLength > 0 && v.RefArea > 0 && v.Span > 0 && v.FrontalArea > 0) ||
			!finiteAll(v.RefLength, v.RefArea, v.Span, v.FrontalArea, v.DeltaT) {
			t.Fatalf("dimensions not finite and positive: %+v", v)
		}
		if len(v.Boundary) < 3 || len(v.Boundary) > MaxBoundaryPoints {
			t.Fatalf("%d boundary points", len(v.Boundary))
		}
		for _, w := range v.Boundary {
			if !finiteAll(w.Altitude, w.Speed) || w.Speed < 0 {
				t.Fatalf("vertex %+v", w)
			}
		}
		l := v.Limits
		if !finiteAll(l.Ceiling, l.MaxMach, l.MaxEAS, l.MaxCAS, l.MaxQ, l.MinSpeed) {
			t.Fatalf("limits %+v", l)
		}
		for _, a := range []Axis{v.Grid.Altitude, v.Grid.Speed} {
			n := axisPoints(a)
			if !finiteAll(a.Min, a.Max, a.Step) || !(a.Max > a.Min) || n < 2 || n > MaxAxisPoints {
				t.Fatalf("grid axis %+v (%d points)", a, n)
			}
		}
		if err := CheckModelLoads(v.Loads); err != nil || !finiteAll(v.Loads.CNMax, v.Loads.CmMax, v.Loads.Area) {
			t.Fatalf("load data %+v: %v", v.Loads, err)
		}
		back, err := ParseVehicle("fuzz.toml", MarshalVehicle(v))
		if err != nil {
			t.Fatalf("re-reading the written vehicle: %v\n%s", err, MarshalVehicle(v))
		}
		if !reflect.DeepEqual(back, v) {
			t.Fatalf("round trip\n got %+v\nwant %+v", *back, *v)
		}
	})
}

// FuzzParseFacilities: any input either fails with a *FileErrors or gives
// facilities with finite, ordered ranges and a positive section, a
// balance within its bounds and an operating rule Solve takes, which
// survive a write and re-read unchanged.
func FuzzParseFacilities(f *testing.F) {
	addSeeds(f, baseFacility, baseWater, baseFacility+"\n"+baseWater)
	f.Fuzz(func(t *testing.T, data []byte) {
		fs, err := ParseFacilities("fuzz.toml", data)
		if err != nil {
			checkFileErrors(t, err)
			return
		}
		if len(fs) == 0 {
			t.Fatal("no facilities and no error")
		}
		for _, x := range fs {
			g, w := &x.Gas, &x.Water
			if !finiteAll(g.MachMin, g.MachMax, g.P0Min, g.P0Max, g.T0Min, g.T0Max, g.MinStaticT, g.PeakLocalMach,
				w.SpeedMin, w.SpeedMax, w.PMin, w.PMax, w.TMin, w.TMax,
				x.QMax, x.MaxReynoldsPerM, x.Width, x.Height,
				x.Model.Scale, x.Model.MaxSpanFraction, x.Model.MaxBlockage) {
				t.Fatalf("facility has a non-finite value: %+v", x)
			}
			if g.MachMin > g.MachMax || w.SpeedMin > w.SpeedMax || x.PressureMin() > x.PressureMax() ||
				x.TemperatureMin() > x.TemperatureMax() {
				t.Fatalf("facility has an inverted range: %+v", x)
			}
			if !(x.Width > 0 && x.Height > 0 && x.PressureMin() > 0 && x.TemperatureMin() > 0) || x.Name == "" {
				t.Fatalf("facility incomplete: %+v", x)
			}
			if x.Medium.IsGas() && !(g.MachMin > 0) || x.Medium == MediumWater && !(w.SpeedMin > 0) {
				t.Fatalf("facility has no speed range: %+v", x)
			}
			if err := CheckBalance(x.Balance); err != nil {
				t.Fatalf("balance %+v: %v", x.Balance, err)
			}
			if err := CheckRule(x.Rule, &x); err != nil {
				t.Fatalf("rule %+v: %v", x.Rule, err)
			}
		}
		back, err := ParseFacilities("fuzz.toml", MarshalFacilities(fs))
		if err != nil {
			t.Fatalf("re-reading the written facilities: %v\n%s", err, MarshalFacilities(fs))
		}
		if !reflect.DeepEqual(back, fs) {
			t.Fatalf("round trip\n got %+v\nwant %+v", back, fs)
		}
	})
}
