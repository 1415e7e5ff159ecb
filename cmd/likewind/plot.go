package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"likewind/envelope"
	"likewind/envelope/fileout"
	"likewind/envelope/report"
)

// runPlot writes the altitude–speed class map and the Reynolds–Mach chart
// as PNG or SVG pictures.
func runPlot(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("plot", stderr)
	var o outFlags
	o.register(fs)
	chart := fs.String("chart", "both", "map, re-mach, or both (both writes FILE-map.EXT and FILE-remach.EXT)")
	pictureFormat := fs.String("format", "", "png or svg (default: from the -o extension; needed with -o -)")
	facility := fs.String("facility", "", `facility: name, unique part of a name, or number (default: map of the best of all, Reynolds–Mach chart of every facility)`)
	customary := fs.Bool("customary", false, "map axes in ft and kt")
	session := fs.String("session", "", "apply the what-if values of this session file")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind plot [VEHICLE.toml FACILITIES.toml...] -o FILE.png|FILE.svg|- [--format png|svg] [--chart map|re-mach|both] [--facility NAME] [--customary] [--force] [--session FILE]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	if o.path == "" {
		return usageFail(stderr, fmt.Errorf("plot: give the picture file with -o FILE.png or -o FILE.svg (or -o - --format png|svg for standard output)"))
	}
	toStdout := o.path == "-"
	ext := strings.ToLower(filepath.Ext(o.path))
	format := strings.ToLower(*pictureFormat)
	switch {
	case format != "" && format != "png" && format != "svg":
		return usageFail(stderr, fmt.Errorf("plot: --format %q: want png or svg", *pictureFormat))
	case toStdout && format == "":
		return usageFail(stderr, fmt.Errorf("plot: -o - (standard output) needs --format png or --format svg"))
	case !toStdout && ext != ".png" && ext != ".svg":
		return usageFail(stderr, fmt.Errorf("plot: -o %s: the name must end in .png or .svg", o.path))
	case !toStdout && format != "" && "."+format != ext:
		return usageFail(stderr, fmt.Errorf("plot: --format %s does not match the name -o %s", format, o.path))
	case format == "":
		format = strings.TrimPrefix(ext, ".")
	}
	var targets []plotTarget
	base := strings.TrimSuffix(o.path, filepath.Ext(o.path))
	switch strings.ToLower(*chart) {
	case "map":
		targets = []plotTarget{{"map", o.path}}
	case "re-mach", "remach":
		targets = []plotTarget{{"re-mach", o.path}}
	case "both":
		if toStdout {
			return usageFail(stderr, fmt.Errorf("plot: -o - takes one picture: give --chart map or --chart re-mach"))
		}
		targets = []plotTarget{{"map", base + "-map" + ext}, {"re-mach", base + "-remach" + ext}}
	default:
		return usageFail(stderr, fmt.Errorf("plot: --chart %q: want map, re-mach or both", *chart))
	}
	// Refuse before any work, so nothing is half done.
	for _, t := range targets {
		if t.path == "-" {
			continue
		}
		if code := checkTarget(t.path, o.force, stderr); code >= 0 {
			return code
		}
	}
	ev, code := evaluateInputs(files, *session, stderr)
	if code >= 0 {
		return code
	}
	fac := -1
	if *facility != "" {
		k, err := pickFacility(ev.e, *facility, true)
		if err != nil {
			return usageFail(stderr, fmt.Errorf("plot: %w", err))
		}
		fac = k
	}
	if fac >= 0 && ev.e.Maps[fac] == nil {
		return fail(stderr, fmt.Errorf("plot: %s could not be evaluated: %w", ev.e.Facilities[fac].Name, ev.e.Errs[fac]))
	}
	if len(ev.e.Solved()) == 0 {
		return fail(stderr, fmt.Errorf("plot: no facility could be evaluated"))
	}
	// Render everything first: a failure then leaves no file at all.
	outs := make([][]byte, len(targets))
	for k, t := range targets {
		var ch *report.Chart
		var err error
		if t.chart == "map" {
			ch, err = report.MapChart(ev.e, fac, *customary)
		} else {
			var sel []int
			if fac >= 0 {
				sel = []int{fac}
			}
			ch, err = report.ReMachChart(ev.e, sel)
		}
		if err == nil {
			outs[k], err = ch.Render(format)
		}
		if err != nil {
			return fail(stderr, fmt.Errorf("plot: %w", err))
		}
	}
	if toStdout {
		if _, err := stdout.Write(outs[0]); err != nil {
			return fail(stderr, fmt.Errorf("plot: standard output: %w", err))
		}
		return 0
	}
	// Both pictures or neither.
	set := make([]fileout.AtomicFile, len(targets))
	for k, t := range targets {
		set[k] = fileout.AtomicFile{Path: t.path, Data: outs[k]}
	}
	if err := fileout.WriteFilesAtomic(set, o.force); err != nil {
		return fail(stderr, fmt.Errorf("plot: %w", err))
	}
	for _, t := range targets {
		if _, err := fmt.Fprintln(stdout, "wrote", envelope.CleanText(t.path)); err != nil {
			return fail(stderr, fmt.Errorf("plot: the pictures are written, but standard output failed: %w", err))
		}
	}
	return 0
}

// plotTarget is one picture to write.
type plotTarget struct {
	chart string // "map" or "re-mach"
	path  string
}
