package main

import (
	"io"

	"likewind/envelope/report"
)

var reportCommand = commandSpec{
	name:      "report",
	usage:     "likewind report [VEHICLE.toml FACILITIES.toml...] [--session FILE] -o FILE.html [--force] [--customary] [--date YYYY-MM-DD] [--shift DURATION]",
	session:   "session file whose what-if values apply and whose marked test points the run lists hold",
	customary: "altitudes in ft, airspeeds in kt, pressures in psi and psf, temperatures in °F",
	date:      "date written into the page, YYYY-MM-DD (default today)",
}

// runReport writes the review pack: one self-contained HTML page with the
// settings, each facility's match-class map, coverage and scales, the
// Reynolds–Mach chart, the run lists, time and cost, and the cautions.
func runReport(args []string, stdout, stderr io.Writer) int {
	c := newCommand(reportCommand, stdout, stderr)
	shiftText := shiftFlag(c)
	return c.run(args, func() error {
		shift, err := parseShift(c, *shiftText)
		if err != nil {
			return err
		}
		if err := c.load(); err != nil {
			return err
		}
		ev := c.ev
		sess := ""
		if ev.session != nil {
			sess = c.session
		}
		r, err := report.NewReview(report.ReviewInput{
			Info:    report.ExportInfo{Tool: "likewind", Version: version, Generated: c.day},
			Sources: ev.in.files,
			Session: sess,
			Changed: ev.changed,
			Eval:    ev.e,
			Marks:   ev.marks,
			Units:   c.units(),
			Cost:    report.CampaignSource{Shift: shift, Units: c.units()},
		})
		if err != nil {
			return c.errorf("%w", err)
		}
		return c.write(r.WriteHTML)
	})
}
