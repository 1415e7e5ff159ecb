package main

import (
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strings"
	"sync"

	"likewind/envelope"
	"likewind/envelope/fileout"
	"likewind/envelope/report"
)

var plotCommand = commandSpec{
	name:      "plot",
	usage:     "likewind plot [VEHICLE.toml FACILITIES.toml...] -o FILE.png|FILE.svg|- [--format png|svg] [--chart map|re-mach|scales|both|all] [--facility NAME] [--customary] [--force] [--session FILE]",
	format:    "png or svg (default: from the -o extension; needed with -o -)",
	facility:  `facility: name, unique part of a name, or number (default: map of the best of all, Reynolds–Mach and scales charts of every facility)`,
	customary: "map axes in ft and kt",
	session:   sessionWhatIf,
}

// runPlot writes the altitude–speed class map and the Reynolds–Mach chart
// as PNG or SVG pictures.
func runPlot(args []string, stdout, stderr io.Writer) int {
	c := newCommand(plotCommand, stdout, stderr)
	chart := c.fs.String("chart", "both", "map, re-mach, scales (matched share against model scale), both (FILE-map.EXT and FILE-remach.EXT) or all (those and FILE-scales.EXT)")
	return c.run(args, func() error {
		format, err := c.pictureFormat()
		if err != nil {
			return err
		}
		targets, err := c.plotTargets(*chart)
		if err != nil {
			return err
		}
		for _, t := range targets {
			c.targets = append(c.targets, t.path)
		}
		if c.facility == "" && !slices.ContainsFunc(targets, func(t plotTarget) bool { return t.chart == "scales" }) {
			// The map of the best of all and the Reynolds–Mach chart
			// of every facility need no facility's results: solve
			// them one after the other in one array.
			c.evaluate = envelope.EvaluateBest
		}
		if err := c.load(); err != nil {
			return err
		}
		fac, err := c.pickFacility(c.facility != "", -1, true)
		if err != nil {
			return err
		}
		if len(c.ev.e.Solved()) == 0 {
			return c.errorf("no facility could be evaluated")
		}
		// Render everything first, the pictures side by side: a failure
		// then leaves no file at all.
		set := make([]fileout.AtomicFile, len(targets))
		errs := make([]error, len(targets))
		var wg sync.WaitGroup
		for k, t := range targets {
			wg.Go(func() {
				b, err := renderChart(c.ev.e, t.chart, fac, c.customary, format)
				set[k], errs[k] = fileout.AtomicFile{Path: t.path, Data: b}, err
			})
		}
		wg.Wait()
		for _, err := range errs {
			if err != nil {
				return c.errorf("%w", err)
			}
		}
		if c.out.path == "-" {
			if _, err := c.stdout.Write(set[0].Data); err != nil {
				return c.errorf("standard output: %w", err)
			}
			return nil
		}
		// Both pictures or neither.
		if err := fileout.WriteFilesAtomic(set, c.out.force); err != nil {
			return c.errorf("%w", err)
		}
		for _, t := range targets {
			if _, err := fmt.Fprintln(c.stdout, "wrote", envelope.CleanText(t.path)); err != nil {
				return c.errorf("the pictures are written, but standard output failed: %w", err)
			}
		}
		return nil
	})
}

// pictureFormat is png or svg, from --format or the -o name, which the
// plot command needs.
func (c *command) pictureFormat() (string, error) {
	path := c.out.path
	if path == "" {
		return "", c.usagef("give the picture file with -o FILE.png or -o FILE.svg (or -o - --format png|svg for standard output)")
	}
	toStdout := path == "-"
	ext := strings.ToLower(filepath.Ext(path))
	format := strings.ToLower(c.format)
	switch {
	case format != "" && format != "png" && format != "svg":
		return "", c.usagef("--format %q: want png or svg", c.format)
	case toStdout && format == "":
		return "", c.usagef("-o - (standard output) needs --format png or --format svg")
	case !toStdout && ext != ".png" && ext != ".svg":
		return "", c.usagef("-o %s: the name must end in .png or .svg", path)
	case !toStdout && format != "" && "."+format != ext:
		return "", c.usagef("--format %s does not match the name -o %s", format, path)
	case format == "":
		format = strings.TrimPrefix(ext, ".")
	}
	return format, nil
}

// plotTarget is one picture to write.
type plotTarget struct {
	chart string // "map", "re-mach" or "scales"
	path  string
}

// plotTargets are the pictures --chart asks for: one at -o FILE, or with
// both FILE-map.EXT and FILE-remach.EXT, with all FILE-scales.EXT too
// (both keeps its two pictures, as before the scales chart).
func (c *command) plotTargets(chart string) ([]plotTarget, error) {
	path := c.out.path
	ext := strings.ToLower(filepath.Ext(path))
	base := strings.TrimSuffix(path, filepath.Ext(path))
	switch strings.ToLower(chart) {
	case "map":
		return []plotTarget{{"map", path}}, nil
	case "re-mach", "remach":
		return []plotTarget{{"re-mach", path}}, nil
	case "scales":
		return []plotTarget{{"scales", path}}, nil
	case "both", "all":
		if path == "-" {
			return nil, c.usagef("-o - takes one picture: give --chart map, re-mach or scales")
		}
		t := []plotTarget{{"map", base + "-map" + ext}, {"re-mach", base + "-remach" + ext}}
		if strings.EqualFold(chart, "all") {
			t = append(t, plotTarget{"scales", base + "-scales" + ext})
		}
		return t, nil
	}
	return nil, c.usagef("--chart %q: want map, re-mach, scales, both or all", chart)
}

// renderChart draws one chart of e as png or svg: the class map of
// facility fac (-1 the best of all), or the Reynolds–Mach chart or the
// scales chart of fac (-1 every facility).
func renderChart(e *envelope.Evaluation, chart string, fac int, customary bool, format string) ([]byte, error) {
	var ch *report.Chart
	var err error
	switch chart {
	case "map":
		ch, err = report.MapChart(e, fac, customary)
	case "scales":
		studies, errs := e.StudyAll(envelope.StudyOptions{})
		if fac >= 0 {
			if errs[fac] != nil {
				return nil, errs[fac]
			}
			only := make([]*envelope.ScaleStudy, len(studies))
			only[fac] = studies[fac]
			studies = only
		}
		ch, err = report.ScalesChart(e.Grid.Vehicle.Name, studies)
	default:
		var sel []int
		if fac >= 0 {
			sel = []int{fac}
		}
		ch, err = report.ReMachChart(e, sel)
	}
	if err != nil {
		return nil, err
	}
	return ch.Render(format)
}
