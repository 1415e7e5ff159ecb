package main

import (
	"fmt"
	"io"
	"strings"

	"likewind/envelope/report"
)

// runCoverage prints the facilities × match classes table, the union
// coverage and each facility's minimum scale for a full match.
func runCoverage(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("coverage", stderr)
	format := fs.String("format", "text", "text, csv or json")
	var o outFlags
	o.register(fs)
	session := fs.String("session", "", "apply the what-if values of this session file")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind coverage [VEHICLE.toml FACILITIES.toml...] [--format text|csv|json] [-o FILE] [--force] [--session FILE]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	f := strings.ToLower(*format)
	if f != "text" && f != "csv" && f != "json" {
		return usageFail(stderr, fmt.Errorf("coverage: --format %q: want text, csv or json", *format))
	}
	if code := o.precheck(stderr); code >= 0 {
		return code
	}
	ev, code := evaluateInputs(files, *session, stderr)
	if code >= 0 {
		return code
	}
	r := report.NewCoverage(ev.e)
	err := o.write(stdout, func(w io.Writer) error {
		switch f {
		case "csv":
			return r.WriteCSV(w)
		case "json":
			return r.WriteJSON(w)
		}
		return r.WriteText(w)
	})
	if err != nil {
		return fail(stderr, fmt.Errorf("coverage: %w", err))
	}
	return 0
}
