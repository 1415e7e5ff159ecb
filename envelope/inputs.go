package envelope

import (
	"errors"
	"fmt"
)

// InputFile is one file of a set opened together, read as what its
// content says it is (Check tells the kinds apart the same way).
type InputFile struct {
	Path string
	// Vehicle is set for a vehicle file, Facilities for a facility file.
	Vehicle    *Vehicle
	Facilities []Facility
}

// LoadFiles reads vehicle and facility files in any order, telling them
// apart by their top-level tables ([vehicle] and [envelope], or
// [[facility]]), for commands that compare several vehicles or
// configurations in the same facilities. Every problem of every file is
// returned, joined (a *FileErrors per file, as LoadVehicle and
// LoadFacilities give them), with facility names repeated across files.
func LoadFiles(paths ...string) ([]InputFile, error) {
	var out []InputFile
	var problems []error
	var facs []Facility
	for _, p := range paths {
		data, err := readInput(p)
		if err != nil {
			problems = append(problems, fmt.Errorf("load: %w", err))
			continue
		}
		d, ok := newDoc(p, data)
		if !ok {
			problems = append(problems, d.result())
			continue
		}
		kind, err := d.kind()
		if err != nil {
			problems = append(problems, err)
			continue
		}
		in := InputFile{Path: p}
		if kind == "vehicle" {
			in.Vehicle, err = d.parseVehicle()
		} else {
			in.Facilities, err = d.parseFacilities()
			facs = append(facs, in.Facilities...)
		}
		if err != nil {
			problems = append(problems, err)
			continue
		}
		out = append(out, in)
	}
	if len(problems) == 0 {
		if err := CheckDuplicateNames(facs); err != nil {
			problems = append(problems, err)
		}
	}
	if len(problems) > 0 {
		return nil, errors.Join(problems...)
	}
	return out, nil
}
