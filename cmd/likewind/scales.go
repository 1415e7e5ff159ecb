package main

import (
	"io"
	"strconv"

	"likewind/envelope"
	"likewind/envelope/report"
)

var scalesCommand = commandSpec{
	name: "scales",
	usage: "likewind scales [VEHICLE.toml... FACILITIES.toml...] [--format text|csv|json] [-o FILE] [--force] " +
		"[--facility NAME] [--session FILE] [--date YYYY-MM-DD] [--steps N] [--min SCALE] [--max SCALE]",
	format:   "text, csv or json",
	formats:  []string{"text", "csv", "json"},
	facility: "study only this facility (name, unique part of a name, or number); the union still counts the others",
	session:  sessionWhatIf + " (one vehicle only)",
	date:     "date written into the JSON header, YYYY-MM-DD (default today)",
	vehicles: true,
}

// runScales prints the model-scale study: per vehicle and facility, the
// class shares, union and reach-ratio quantiles by model scale with the
// fit and balance limits marked, and with several vehicles the best scale
// of each.
func runScales(args []string, stdout, stderr io.Writer) int {
	c := newCommand(scalesCommand, stdout, stderr)
	steps := c.fs.Int("steps", envelope.DefaultStudySteps, "number of log-spaced model scales, 2 to "+strconv.Itoa(envelope.MaxStudySteps))
	minScale := c.fs.String("min", "", "smallest model scale, e.g. 0.01, 1/100 or 1 % (default: a twentieth of the largest the section takes)")
	maxScale := c.fs.String("max", "", "largest model scale (default: 1.5 times the largest the section takes)")
	return c.run(args, func() error {
		opt := envelope.StudyOptions{Steps: *steps}
		if *steps < 2 || *steps > envelope.MaxStudySteps {
			return c.usagef("--steps %d: want 2 to %d", *steps, envelope.MaxStudySteps)
		}
		for _, x := range []struct {
			flag, text string
			v          *float64
		}{{"--min", *minScale, &opt.Min}, {"--max", *maxScale, &opt.Max}} {
			if x.text == "" {
				continue
			}
			v, err := envelope.ParseModelScale(x.text)
			if err != nil {
				return c.usagef("%s: %w", x.flag, err)
			}
			*x.v = v
		}
		if opt.Min > 0 && opt.Max > 0 && !(opt.Min < opt.Max) {
			return c.usagef("--min %s is not below --max %s", *minScale, *maxScale)
		}
		if err := c.load(); err != nil {
			return err
		}
		fac := -1
		if c.facility != "" {
			k, err := c.pickFacility(true, -1, false)
			if err != nil {
				return err
			}
			fac = k
		}
		if len(c.ev.e.Solved()) == 0 {
			return c.errorf("no facility could be evaluated")
		}
		r := report.NewScales(report.ExportInfo{Tool: "likewind", Version: version, Generated: c.day}, evaluations(c.evs), opt)
		if fac >= 0 {
			r = r.Only(fac)
		}
		for _, v := range r.Vehicles {
			for _, f := range v.Facilities {
				if f.Error != "" && fac >= 0 {
					return c.errorf("%s: %s", f.Facility, f.Error)
				}
			}
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
