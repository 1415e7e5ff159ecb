package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"likewind/envelope"
	"likewind/envelope/fileout"
	"likewind/envelope/report"
	"likewind/tui"
)

// runExport writes every grid point inside the envelope, per facility, as
// CSV or JSON (SI units, full precision).
func runExport(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("export", stderr)
	format := fs.String("format", "", "csv or json (default: from the -o extension, else csv)")
	var o outFlags
	o.register(fs)
	facility := fs.String("facility", "", "export only this facility (name, unique part of a name, or number)")
	session := fs.String("session", "", "apply the what-if values of this session file")
	date := fs.String("date", "", "date written into the JSON header, YYYY-MM-DD (default today)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind export [VEHICLE.toml FACILITIES.toml...] [--format csv|json] [-o FILE] [--force] [--facility NAME] [--session FILE]")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return code
	}
	f := strings.ToLower(*format)
	if f == "" {
		f = "csv"
		if strings.EqualFold(filepath.Ext(o.path), ".json") {
			f = "json"
		}
	}
	if f != "csv" && f != "json" {
		return usageFail(stderr, fmt.Errorf("export: --format %q: want csv or json", *format))
	}
	day, err := reportDate(*date)
	if err != nil {
		return usageFail(stderr, fmt.Errorf("export: %w", err))
	}
	if code := o.precheck(stderr); code >= 0 {
		return code
	}
	ev, code := evaluateInputs(files, *session, stderr)
	if code >= 0 {
		return code
	}
	maps := ev.e.Solved()
	if *facility != "" {
		k, err := pickFacility(ev.e, *facility, false)
		if err != nil {
			return usageFail(stderr, fmt.Errorf("export: %w", err))
		}
		if ev.e.Maps[k] == nil {
			return fail(stderr, fmt.Errorf("export: %s could not be evaluated: %w", ev.e.Facilities[k].Name, ev.e.Errs[k]))
		}
		maps = []*envelope.Map{ev.e.Maps[k]}
	}
	if len(maps) == 0 {
		return fail(stderr, errors.New("export: no facility could be evaluated"))
	}
	write := func(w io.Writer) error {
		if f == "json" {
			return report.WriteExportJSON(w, report.ExportInfo{Tool: "likewind", Version: version, Generated: day}, maps)
		}
		return report.WriteExportCSV(w, maps)
	}
	if err := o.write(stdout, write); err != nil {
		return fail(stderr, fmt.Errorf("export: %w", err))
	}
	return 0
}

// ---- Shared by the output commands (dump, export, plot, coverage, runs).

// newFlags is a flag set that reports errors instead of exiting.
func newFlags(name string, stderr io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(stderr)
	return fs
}

// parseArgs parses flags placed anywhere among the file names (a "--"
// ends the flags). It returns the file names and -1, or an exit status:
// 0 after --help, 2 for a bad flag.
func parseArgs(fs *flag.FlagSet, args []string, stderr io.Writer) ([]string, int) {
	var files []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return nil, 0
			}
			return nil, 2 // the flag package has printed the message and usage
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return files, -1
		}
		// fs.Parse stops at the first non-flag, or after "--".
		consumed := len(args) - len(rest)
		if consumed > 0 && args[consumed-1] == "--" {
			return append(files, rest...), -1
		}
		files = append(files, rest[0])
		args = rest[1:]
	}
}

// usageFail prints a usage error and returns exit status 2.
func usageFail(stderr io.Writer, err error) int {
	fmt.Fprintln(stderr, "likewind:", err)
	return 2
}

// fail prints a failure of the work itself and returns exit status 1.
func fail(stderr io.Writer, err error) int {
	fmt.Fprintln(stderr, "likewind:", err)
	return 1
}

// outFlags are -o FILE and --force.
type outFlags struct {
	path  string
	force bool
}

func (o *outFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&o.path, "o", "", "write to this file (atomically) instead of standard output; - is standard output")
	fs.BoolVar(&o.force, "force", false, "replace an existing output file (only ever a regular file)")
}

// stdout reports whether the output goes to standard output (no -o, or
// -o -).
func (o *outFlags) stdout() bool { return o.path == "" || o.path == "-" }

// precheck refuses an output file that exists without --force, or that
// is not a regular file, before any work is done. It returns -1 to go on,
// or an exit status.
func (o *outFlags) precheck(stderr io.Writer) int {
	if o.stdout() {
		return -1
	}
	return checkTarget(o.path, o.force, stderr)
}

// write sends the output to -o FILE atomically, or to stdout.
func (o *outFlags) write(stdout io.Writer, write func(io.Writer) error) error {
	if o.stdout() {
		if err := write(stdout); err != nil {
			return fmt.Errorf("standard output: %w", err)
		}
		return nil
	}
	return fileout.WriteAtomic(o.path, o.force, write)
}

// checkTarget reports (exit 1) an output file that exists without --force,
// or that is a link, device, pipe or folder. The atomic write checks again
// when it puts the file in place.
func checkTarget(path string, force bool, stderr io.Writer) int {
	if err := fileout.CheckOutputTarget(path, force); err != nil {
		return fail(stderr, err)
	}
	return -1
}

// reportDate is the date for headers: the --date value checked, or today.
func reportDate(s string) (string, error) {
	if s == "" {
		return time.Now().Format(time.DateOnly), nil
	}
	if _, err := time.Parse(time.DateOnly, s); err != nil {
		return "", fmt.Errorf("--date %q: want YYYY-MM-DD", s)
	}
	return s, nil
}

// evaluated is the loaded input evaluated with the session applied.
type evaluated struct {
	in      inputs
	e       *envelope.Evaluation
	session *tui.Session // nil without --session
	marks   []envelope.GridPoint
	// lostMarks counts session marks that no longer fall on the grid.
	lostMarks int
	// changed lists the what-if values that differ from the files.
	changed []string
}

// evaluateInputs loads the files (or the demo), applies a session's
// what-if values and evaluates every facility. It returns -1 to go on, or
// an exit status after printing every problem.
func evaluateInputs(files []string, sessionPath string, stderr io.Writer) (*evaluated, int) {
	in, err := loadInputs(files)
	if err != nil {
		var ue usageError
		if errors.As(err, &ue) {
			return nil, usageFail(stderr, err)
		}
		return nil, fail(stderr, err)
	}
	ev := &evaluated{in: in}
	s := envelope.DefaultSettings(in.vehicle)
	facs := append([]envelope.Facility(nil), in.facilities...)
	if sessionPath != "" {
		sess, err := tui.LoadSession(sessionPath)
		if err != nil {
			return nil, fail(stderr, err)
		}
		if err := tui.CheckSessionInputs(sess, in.files, in.vehicle, in.facilities); err != nil {
			return nil, fail(stderr, fmt.Errorf("session %s: %w", sessionPath, err))
		}
		ev.session = &sess
		ev.changed, err = tui.ApplyWhatIf(sess.WhatIf, &s, facs)
		if err != nil {
			return nil, fail(stderr, fmt.Errorf("session %s: %w", sessionPath, err))
		}
	}
	e, err := envelope.Evaluate(in.vehicle, facs, s)
	if err != nil {
		return nil, fail(stderr, fmt.Errorf("evaluate %s: %w", in.vehicle.Name, err))
	}
	ev.e = e
	for k, err := range e.Errs {
		if err != nil {
			fmt.Fprintf(stderr, "likewind: warning: %s left out: %v\n", facs[k].Name, err)
		}
	}
	if ev.session != nil {
		ev.marks, ev.lostMarks = tui.SnapMarks(e.Grid, ev.session.Marks)
		if ev.lostMarks > 0 {
			fmt.Fprintf(stderr, "likewind: warning: %d marked point(s) of the session are no longer on the grid\n", ev.lostMarks)
		}
	}
	return ev, -1
}

// pickFacility finds a facility by exact name, unique case-insensitive
// part of a name, or 1-based number. With allowBest, "best" (or "best of
// all", "all") gives -1.
func pickFacility(e *envelope.Evaluation, name string, allowBest bool) (int, error) {
	name = strings.TrimSpace(name)
	low := strings.ToLower(name)
	if allowBest && (low == "best" || low == "best of all" || low == "all") {
		return -1, nil
	}
	if k := e.Facility(name); k >= 0 {
		return k, nil
	}
	if n, err := strconv.Atoi(name); err == nil && n >= 1 && n <= len(e.Facilities) {
		return n - 1, nil
	}
	var hits []int
	for k, f := range e.Facilities {
		if strings.Contains(strings.ToLower(f.Name), low) {
			hits = append(hits, k)
		}
	}
	if len(hits) == 1 && low != "" {
		return hits[0], nil
	}
	var list []string
	for k, f := range e.Facilities {
		list = append(list, fmt.Sprintf("  %d  %s", k+1, f.Name))
	}
	if allowBest {
		list = append(list, "  best (best of all facilities)")
	}
	why := "no facility matches"
	if len(hits) > 1 {
		why = "several facilities match"
	}
	return 0, fmt.Errorf("--facility %q: %s; expected one of:\n%s", name, why, strings.Join(list, "\n"))
}

// exists reports whether something is at path.
func exists(path string) bool {
	_, err := os.Lstat(path)
	return err == nil
}
