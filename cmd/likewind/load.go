package main

import (
	"errors"
	"fmt"

	"likewind/envelope"
)

// inputs is what the command line asked to open: one vehicle and its
// facilities, with the file names they came from (empty for the demo).
type inputs struct {
	vehicle    *envelope.Vehicle
	facilities []envelope.Facility
	files      []string
}

// loadInputs loads VEHICLE.toml FACILITIES.toml... or, with no files, the
// embedded demo. Every problem of every file is returned, joined.
func loadInputs(files []string) (inputs, error) {
	if len(files) == 0 {
		v, facs, err := envelope.Demo()
		if err != nil {
			return inputs{}, fmt.Errorf("built-in demo: %w", err)
		}
		return inputs{vehicle: v, facilities: facs}, nil
	}
	if len(files) < 2 {
		return inputs{}, usagef("give a vehicle file followed by one or more facility files")
	}
	var problems []error
	v, err := envelope.LoadVehicle(files[0])
	if err != nil {
		problems = append(problems, err)
	}
	var facs []envelope.Facility
	for _, f := range files[1:] {
		fs, err := envelope.LoadFacilities(f)
		if err != nil {
			problems = append(problems, err)
			continue
		}
		facs = append(facs, fs...)
	}
	if len(problems) == 0 {
		if err := envelope.CheckDuplicateNames(facs); err != nil {
			problems = append(problems, err)
		}
	}
	if len(problems) > 0 {
		return inputs{}, errors.Join(problems...)
	}
	return inputs{vehicle: v, facilities: facs, files: files}, nil
}
