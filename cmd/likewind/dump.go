package main

import (
	"flag"
	"fmt"
	"io"
	"strings"

	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"likewind/tui"
)

// runDump writes the envelope matrix of one facility and layer as text,
// drawn by the interface's own matrix and legend renderer, under a header
// that says what it shows.
func runDump(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("dump", stderr)
	var o outFlags
	o.register(fs)
	facility := fs.String("facility", "", `facility to show: name, unique part of a name, number, or "best" (default: the one the interface opens on, with the most full matches)`)
	layer := fs.String("layer", "", "layer: class, regime, reynolds, q or mach (default class)")
	plain := fs.Bool("plain", false, "no colour, even on a terminal")
	color := fs.Bool("color", false, "ANSI colour, even into a file or pipe")
	customary := fs.Bool("customary", false, "altitude in ft and airspeeds in kt")
	session := fs.String("session", "", "apply this session file: what-if values, marks, facility, layer and units")
	date := fs.String("date", "", "date written into the header, YYYY-MM-DD (default today)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind dump [VEHICLE.toml FACILITIES.toml...] [-o FILE] [--force] [--facility NAME] [--layer NAME] [--plain|--color] [--customary] [--session FILE]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	if *plain && *color {
		return usageFail(stderr, fmt.Errorf("dump: --plain and --color exclude each other"))
	}
	set := flagsSet(fs)
	var lay tui.Layer
	if set["layer"] {
		l, err := parseLayer(*layer)
		if err != nil {
			return usageFail(stderr, fmt.Errorf("dump: %w", err))
		}
		lay = l
	}
	day, err := reportDate(*date)
	if err != nil {
		return usageFail(stderr, fmt.Errorf("dump: %w", err))
	}
	if code := o.precheck(stderr); code >= 0 {
		return code
	}
	ev, code := evaluateInputs(files, *session, stderr)
	if code >= 0 {
		return code
	}
	units := tui.SI
	if *customary {
		units = tui.Customary
	}
	// Without a choice, the facility the interface opens on.
	fac := tui.StartFacility(ev.e.Maps)
	if s := ev.session; s != nil {
		// The session's choices, unless a flag overrides them.
		if !set["layer"] && s.Layer != "" {
			if l, err := tui.ParseLayer(s.Layer); err == nil {
				lay = l
			}
		}
		if !set["customary"] {
			if u, err := tui.ParseUnits(s.Units); err == nil {
				units = u
			}
		}
		if !set["facility"] {
			if s.BestOfAll {
				fac = -1
			} else if k := ev.e.Facility(s.Facility); k >= 0 {
				fac = k
			}
		}
	}
	if set["facility"] {
		k, err := pickFacility(ev.e, *facility, true)
		if err != nil {
			return usageFail(stderr, fmt.Errorf("dump: %w", err))
		}
		fac = k
	}
	if fac >= 0 && ev.e.Maps[fac] == nil {
		return fail(stderr, fmt.Errorf("dump: %s could not be evaluated: %w", ev.e.Facilities[fac].Name, ev.e.Errs[fac]))
	}

	var st tui.Styles
	switch {
	case *plain:
		st = tui.PlainStyles()
	case *color:
		r := lipgloss.NewRenderer(io.Discard)
		r.SetColorProfile(termenv.TrueColor)
		st = tui.NewStyles(r)
	case !o.stdout():
		st = tui.PlainStyles()
	default:
		st = tui.NewStyles(lipgloss.NewRenderer(stdout))
	}
	text, err := renderDump(ev, dumpView{fac: fac, layer: lay, units: units, date: day}, st)
	if err != nil {
		return fail(stderr, fmt.Errorf("dump: %w", err))
	}
	if err := o.write(stdout, func(w io.Writer) error {
		_, err := io.WriteString(w, text)
		return err
	}); err != nil {
		return fail(stderr, fmt.Errorf("dump: %w", err))
	}
	return 0
}

// flagsSet reports which flags were given on the command line.
func flagsSet(fs *flag.FlagSet) map[string]bool {
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	return set
}

// layerAliases are the short layer names accepted on the command line,
// besides the names the interface writes into session files.
var layerAliases = map[string]tui.Layer{
	"class": tui.LayerClass, "match": tui.LayerClass,
	"regime": tui.LayerRegime, "flow": tui.LayerRegime,
	"reynolds": tui.LayerReynolds, "re": tui.LayerReynolds,
	"q":    tui.LayerQ,
	"mach": tui.LayerMach,
}

func parseLayer(s string) (tui.Layer, error) {
	if l, ok := layerAliases[strings.ToLower(strings.TrimSpace(s))]; ok {
		return l, nil
	}
	l, err := tui.ParseLayer(s)
	if err != nil {
		return l, fmt.Errorf("--layer %q: expected class, regime, reynolds, q or mach", s)
	}
	return l, nil
}

// dumpView is what a dump shows.
type dumpView struct {
	fac   int // facility index, -1 best of all
	layer tui.Layer
	units tui.Units
	date  string
}

// renderDump draws the header, the matrix and the legend with tui.Dump,
// the code the interface's write key uses, so both give the same text for
// the same view.
func renderDump(ev *evaluated, v dumpView, st tui.Styles) (string, error) {
	e := ev.e
	return tui.Dump(tui.DumpInput{
		Version:    version,
		Date:       v.date,
		Sources:    ev.in.files,
		Grid:       e.Grid,
		Maps:       e.Maps,
		Facilities: e.Facilities,
		Settings:   e.Settings,
		Changed:    ev.changed,
		Facility:   v.fac,
		Layer:      v.layer,
		Units:      v.units,
		Marks:      ev.marks,
	}, st)
}
