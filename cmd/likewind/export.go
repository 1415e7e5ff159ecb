package main

import (
	"io"

	"likewind/envelope"
	"likewind/envelope/report"
)

var exportCommand = commandSpec{
	name:    "export",
	usage:   "likewind export [VEHICLE.toml FACILITIES.toml...] [--format csv|json] [-o FILE] [--force] [--facility NAME] [--session FILE]",
	format:  "csv or json (default: from the -o extension, else csv)",
	formats: []string{"csv", "json"}, formatFromExt: true,
	facility: "export only this facility (name, unique part of a name, or number)",
	session:  sessionWhatIf,
	date:     "date written into the JSON header, YYYY-MM-DD (default today)",
}

// runExport writes every grid point inside the envelope, per facility, as
// CSV or JSON (SI units, full precision).
func runExport(args []string, stdout, stderr io.Writer) int {
	c := newCommand(exportCommand, stdout, stderr)
	return c.run(args, func() error {
		if err := c.load(); err != nil {
			return err
		}
		maps := c.ev.e.Solved()
		if c.facility != "" {
			k, err := c.pickFacility(true, -1, false)
			if err != nil {
				return err
			}
			maps = []*envelope.Map{c.ev.e.Maps[k]}
		}
		if len(maps) == 0 {
			return c.errorf("no facility could be evaluated")
		}
		return c.write(func(w io.Writer) error {
			if c.format == "json" {
				return report.WriteExportJSON(w, report.ExportInfo{Tool: "likewind", Version: version, Generated: c.day}, maps)
			}
			return report.WriteExportCSV(w, maps)
		})
	})
}
