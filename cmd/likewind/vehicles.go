package main

import (
	"fmt"
	"io"

	"likewind/envelope"
)

// evaluateVehicles loads the files of a command that compares vehicles or
// configurations (coverage, scales): one or more vehicle files and one or
// more facility files, in any order, told apart by content; with no files
// the demo. Each vehicle is evaluated in all the facilities. With one
// vehicle it is evaluateInputs on the vehicle file followed by the
// facility files (so a session of those files applies); --session with
// several vehicles is a usage error, as a session belongs to one
// vehicle's files.
func evaluateVehicles(files []string, sessionPath string, stderr io.Writer) ([]*evaluated, error) {
	if len(files) == 0 {
		ev, err := evaluateInputs(nil, sessionPath, stderr)
		if err != nil {
			return nil, err
		}
		return []*evaluated{ev}, nil
	}
	loaded, err := envelope.LoadFiles(files...)
	if err != nil {
		return nil, err
	}
	var vehicles []envelope.InputFile
	var facFiles []string
	var facs []envelope.Facility
	for _, in := range loaded {
		if in.Vehicle != nil {
			vehicles = append(vehicles, in)
			continue
		}
		facFiles = append(facFiles, in.Path)
		facs = append(facs, in.Facilities...)
	}
	switch {
	case len(vehicles) == 0:
		return nil, usagef("no vehicle file among the files given: give one or more vehicle files and one or more facility files")
	case len(facFiles) == 0:
		return nil, usagef("no facility file among the files given: give one or more vehicle files and one or more facility files")
	case len(vehicles) > 1 && sessionPath != "":
		return nil, usagef("--session applies to one vehicle's files; %d vehicle files are given", len(vehicles))
	}
	var evs []*evaluated
	for _, vf := range vehicles {
		in := inputs{vehicle: vf.Vehicle, facilities: append([]envelope.Facility(nil), facs...),
			files: append([]string{vf.Path}, facFiles...)}
		ev, err := evaluateLoaded(in, sessionPath, stderr)
		if err != nil && len(vehicles) > 1 {
			return nil, fmt.Errorf("%s: %w", envelope.CleanText(vf.Path), err)
		}
		if err != nil {
			return nil, err
		}
		evs = append(evs, ev)
	}
	return evs, nil
}

// evaluations are the engine evaluations of evs.
func evaluations(evs []*evaluated) []*envelope.Evaluation {
	out := make([]*envelope.Evaluation, len(evs))
	for k, ev := range evs {
		out[k] = ev.e
	}
	return out
}
