package main

import (
	"io"

	"likewind/envelope/report"
)

var coverageCommand = commandSpec{
	name:     "coverage",
	usage:    "likewind coverage [VEHICLE.toml... FACILITIES.toml...] [--format text|csv|json] [-o FILE] [--force] [--session FILE]",
	format:   "text, csv or json",
	formats:  []string{"text", "csv", "json"},
	session:  sessionWhatIf + " (one vehicle only)",
	vehicles: true,
}

// runCoverage prints the facilities × match classes table, the union
// coverage and each facility's minimum scale for a full match; with
// several vehicle files one report per vehicle and the comparison.
func runCoverage(args []string, stdout, stderr io.Writer) int {
	c := newCommand(coverageCommand, stdout, stderr)
	return c.run(args, func() error {
		if err := c.load(); err != nil {
			return err
		}
		var r coverageReport = report.NewCoverage(c.ev.e)
		if len(c.evs) > 1 {
			r = report.NewCoverageSet(evaluations(c.evs))
		}
		return c.write(func(w io.Writer) error {
			switch c.format {
			case "csv":
				return r.WriteCSV(w)
			case "json":
				return r.WriteJSON(w)
			}
			return r.WriteText(w)
		})
	})
}

// coverageReport is a coverage report of one vehicle or of several.
type coverageReport interface {
	WriteText(io.Writer) error
	WriteCSV(io.Writer) error
	WriteJSON(io.Writer) error
}
