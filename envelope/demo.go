package envelope

import (
	"embed"
	"fmt"
	"io/fs"
	"path"
	"sort"
)

// demoFiles holds the built-in demo: invented vehicles and facilities. The
// same files ship in testdata/ as examples to copy.
//
//go:embed demo/*.toml
var demoFiles embed.FS

// demoDefaultVehicle is the demo vehicle shown first.
const demoDefaultVehicle = "corvane-sx3.toml"

// demoFacilityFile is the demo's facility file; every other demo file is a
// vehicle.
const demoFacilityFile = "facilities.toml"

// DemoFS returns the demo files (vehicle and facility files at its root),
// for writing them out as examples.
func DemoFS() fs.FS {
	sub, err := fs.Sub(demoFiles, "demo")
	if err != nil { // "demo" is a fixed, valid path
		panic(err)
	}
	return sub
}

// Demo returns the built-in demo: the default vehicle and every demo
// facility. The data is invented; built-in items have an empty Source.
func Demo() (*Vehicle, []Facility, error) {
	v, err := demoVehicle(demoDefaultVehicle)
	if err != nil {
		return nil, nil, err
	}
	facs, err := demoFacilities()
	if err != nil {
		return nil, nil, err
	}
	return v, facs, nil
}

// DemoVehicles returns every demo vehicle, the default one first.
func DemoVehicles() ([]*Vehicle, error) {
	names, err := fs.Glob(demoFiles, "demo/*.toml")
	if err != nil {
		return nil, err
	}
	sort.Slice(names, func(i, j int) bool {
		a, b := path.Base(names[i]), path.Base(names[j])
		if (a == demoDefaultVehicle) != (b == demoDefaultVehicle) {
			return a == demoDefaultVehicle
		}
		return a < b
	})
	var out []*Vehicle
	for _, n := range names {
		if path.Base(n) == demoFacilityFile {
			continue
		}
		v, err := demoVehicle(path.Base(n))
		if err != nil {
			return nil, err
		}
		out = append(out, v)
	}
	return out, nil
}

func demoVehicle(name string) (*Vehicle, error) {
	v, err := parseDemo(name, "demo vehicle", ParseVehicle)
	if err != nil {
		return nil, err
	}
	v.Source = ""
	return v, nil
}

func demoFacilities() ([]Facility, error) {
	facs, err := parseDemo(demoFacilityFile, "demo facilities", ParseFacilities)
	if err != nil {
		return nil, err
	}
	for i := range facs {
		facs[i].Source = ""
	}
	return facs, nil
}

// parseDemo reads the demo file name with parse; what names it in errors.
func parseDemo[T any](name, what string, parse func(string, []byte) (T, error)) (T, error) {
	data, err := demoFiles.ReadFile("demo/" + name)
	if err == nil {
		var v T
		if v, err = parse("demo/"+name, data); err == nil {
			return v, nil
		}
	}
	var zero T
	return zero, fmt.Errorf("%s: %w", what, err)
}
