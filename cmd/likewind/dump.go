package main

import (
	"flag"
	"fmt"
	"io"
	"strings"

	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"likewind/envelope/units"
	"likewind/tui"
)

var dumpCommand = commandSpec{
	name:      "dump",
	usage:     "likewind dump [VEHICLE.toml FACILITIES.toml...] [-o FILE] [--force] [--facility NAME] [--layer NAME] [--plain|--color] [--customary] [--session FILE]",
	facility:  `facility to show: name, unique part of a name, number, or "best" (default: the one the interface opens on, with the most full matches)`,
	customary: "altitude in ft and airspeeds in kt",
	session:   "apply this session file: what-if values, marks, facility, layer and units",
	date:      "date written into the header, YYYY-MM-DD (default today)",
}

// runDump writes the envelope matrix of one facility and layer as text,
// drawn by the interface's own matrix and legend renderer, under a header
// that says what it shows.
func runDump(args []string, stdout, stderr io.Writer) int {
	c := newCommand(dumpCommand, stdout, stderr)
	layer := c.fs.String("layer", "", "layer: class, regime, reynolds, q, load or mach (default class)")
	plain := c.fs.Bool("plain", false, "no colour, even on a terminal")
	color := c.fs.Bool("color", false, "ANSI colour, even into a file or pipe")
	return c.run(args, func() error {
		if *plain && *color {
			return c.usagef("--plain and --color exclude each other")
		}
		set := flagsSet(c.fs)
		var lay tui.Layer
		if set["layer"] {
			l, err := parseLayer(*layer)
			if err != nil {
				return c.usagef("%w", err)
			}
			lay = l
		}
		if err := c.load(); err != nil {
			return err
		}
		ev := c.ev
		sys := c.units()
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
				if u, err := units.Parse(s.Units); err == nil {
					sys = u
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
		fac, err := c.pickFacility(set["facility"], fac, true)
		if err != nil {
			return err
		}
		text, err := renderDump(ev, dumpView{fac: fac, layer: lay, units: sys, date: c.day}, c.dumpStyles(*plain, *color))
		if err != nil {
			return c.errorf("%w", err)
		}
		return c.write(func(w io.Writer) error {
			_, err := io.WriteString(w, text)
			return err
		})
	})
}

// dumpStyles are plain with --plain or into a file, ANSI colour with
// --color, otherwise as standard output's terminal takes them.
func (c *command) dumpStyles(plain, color bool) tui.Styles {
	switch {
	case plain:
		return tui.PlainStyles()
	case color:
		r := lipgloss.NewRenderer(io.Discard)
		r.SetColorProfile(termenv.TrueColor)
		return tui.NewStyles(r)
	case !c.out.stdout():
		return tui.PlainStyles()
	}
	return tui.NewStyles(lipgloss.NewRenderer(c.stdout))
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
	"load": tui.LayerLoad,
	"mach": tui.LayerMach,
}

func parseLayer(s string) (tui.Layer, error) {
	if l, ok := layerAliases[strings.ToLower(strings.TrimSpace(s))]; ok {
		return l, nil
	}
	l, err := tui.ParseLayer(s)
	if err != nil {
		return l, fmt.Errorf("--layer %q: expected class, regime, reynolds, q, load or mach", s)
	}
	return l, nil
}

// dumpView is what a dump shows.
type dumpView struct {
	fac   int // facility index, -1 best of all
	layer tui.Layer
	units units.System
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
