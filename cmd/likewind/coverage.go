package main

import (
	"io"

	"likewind/envelope/report"
)

var coverageCommand = commandSpec{
	name:    "coverage",
	usage:   "likewind coverage [VEHICLE.toml FACILITIES.toml...] [--format text|csv|json] [-o FILE] [--force] [--session FILE]",
	format:  "text, csv or json",
	formats: []string{"text", "csv", "json"},
	session: sessionWhatIf,
}

// runCoverage prints the facilities × match classes table, the union
// coverage and each facility's minimum scale for a full match.
func runCoverage(args []string, stdout, stderr io.Writer) int {
	c := newCommand(coverageCommand, stdout, stderr)
	return c.run(args, func() error {
		if err := c.load(); err != nil {
			return err
		}
		r := report.NewCoverage(c.ev.e)
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
