package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"likewind/envelope"
)

// runPlot writes the altitude–speed class map and the Reynolds–Mach chart
// as PNG or SVG pictures.
func runPlot(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("plot", stderr)
	var o outFlags
	o.register(fs)
	chart := fs.String("chart", "both", "map, re-mach, or both (both writes FILE-map.EXT and FILE-remach.EXT)")
	facility := fs.String("facility", "", `facility: name, unique part of a name, or number (default: map of the best of all, Reynolds–Mach chart of every facility)`)
	customary := fs.Bool("customary", false, "map axes in ft and kt")
	session := fs.String("session", "", "apply the what-if values of this session file")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind plot [VEHICLE.toml FACILITIES.toml...] -o FILE.png|FILE.svg [--chart map|re-mach|both] [--facility NAME] [--customary] [--force] [--session FILE]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	if o.path == "" {
		return usageFail(stderr, fmt.Errorf("plot: give the picture file with -o FILE.png or -o FILE.svg"))
	}
	ext := strings.ToLower(filepath.Ext(o.path))
	format := strings.TrimPrefix(ext, ".")
	if format != "png" && format != "svg" {
		return usageFail(stderr, fmt.Errorf("plot: -o %s: the name must end in .png or .svg", o.path))
	}
	var targets []plotTarget
	base := strings.TrimSuffix(o.path, filepath.Ext(o.path))
	switch strings.ToLower(*chart) {
	case "map":
		targets = []plotTarget{{"map", o.path}}
	case "re-mach", "remach":
		targets = []plotTarget{{"re-mach", o.path}}
	case "both":
		targets = []plotTarget{{"map", base + "-map" + ext}, {"re-mach", base + "-remach" + ext}}
	default:
		return usageFail(stderr, fmt.Errorf("plot: --chart %q: want map, re-mach or both", *chart))
	}
	// Refuse before any work, so nothing is half done.
	for _, t := range targets {
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
		var ch *envelope.Chart
		var err error
		if t.chart == "map" {
			ch, err = envelope.MapChart(ev.e, fac, *customary)
		} else {
			var sel []int
			if fac >= 0 {
				sel = []int{fac}
			}
			ch, err = envelope.ReMachChart(ev.e, sel)
		}
		if err == nil {
			outs[k], err = ch.Render(format)
		}
		if err != nil {
			return fail(stderr, fmt.Errorf("plot: %w", err))
		}
	}
	for k, t := range targets {
		if err := envelope.WriteFileAtomic(t.path, outs[k], o.force); err != nil {
			return fail(stderr, fmt.Errorf("plot: %w", err))
		}
		fmt.Fprintln(stdout, "wrote", envelope.CleanText(t.path))
	}
	return 0
}

// plotTarget is one picture to write.
type plotTarget struct {
	chart string // "map" or "re-mach"
	path  string
}
