package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"time"

	"likewind/envelope"
	"likewind/envelope/fileout"
	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// ---- Shared by the output commands (dump, export, plot, coverage, runs).

// commandSpec declares an output command: its name, usage line and which
// of the common flags it takes, each with its help text ("" leaves the
// flag out; -o and --force are always there).
type commandSpec struct {
	name  string
	usage string // after "usage: "

	session   string // --session FILE
	facility  string // --facility NAME
	date      string // --date YYYY-MM-DD
	customary string // --customary

	// format is the help of --format. formats, when set, are the values
	// the command accepts (case-insensitive), the first the default;
	// with formatFromExt the default is instead the -o name's extension
	// when it is one of them. Without formats the command reads --format
	// itself.
	format        string
	formats       []string
	formatFromExt bool

	// vehicles: the command takes several vehicle files (told apart from
	// facility files by content) and evaluates each (vehicles.go).
	vehicles bool
}

// Help texts of --session shared by several commands.
const sessionWhatIf = "apply the what-if values of this session file"

// command is one run of an output command: the common flags as parsed,
// the input files, and after load the evaluation.
type command struct {
	spec           commandSpec
	fs             *flag.FlagSet
	stdout, stderr io.Writer

	out       outFlags
	session   string
	facility  string
	format    string // lower case, checked against spec.formats
	date      string
	customary bool

	files []string
	// targets are the files load checks before any work (default -o
	// FILE); "-" is standard output.
	targets []string
	day     string // the checked --date, or today
	ev      *evaluated
	// evs are the evaluations of every vehicle (spec.vehicles; ev is the
	// first).
	evs []*evaluated
	// evaluate is how load evaluates the facilities (nil:
	// envelope.Evaluate, every map with its results).
	evaluate evaluator
}

// evaluator evaluates every facility on a vehicle's grid
// (envelope.Evaluate or envelope.EvaluateBest).
type evaluator func(*envelope.Vehicle, []envelope.Facility, envelope.Settings) (*envelope.Evaluation, error)

// newCommand makes the flag set of spec with its common flags; the
// command may add its own flags to c.fs before run.
func newCommand(spec commandSpec, stdout, stderr io.Writer) *command {
	c := &command{spec: spec, fs: newFlags(spec.name, stderr), stdout: stdout, stderr: stderr}
	fs := c.fs
	if spec.format != "" {
		def := ""
		if len(spec.formats) > 0 && !spec.formatFromExt {
			def = spec.formats[0]
		}
		fs.StringVar(&c.format, "format", def, spec.format)
	}
	c.out.register(fs)
	if spec.facility != "" {
		fs.StringVar(&c.facility, "facility", "", spec.facility)
	}
	if spec.customary != "" {
		fs.BoolVar(&c.customary, "customary", false, spec.customary)
	}
	if spec.session != "" {
		fs.StringVar(&c.session, "session", "", spec.session)
	}
	if spec.date != "" {
		fs.StringVar(&c.date, "date", "", spec.date)
	}
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: "+spec.usage)
		fs.PrintDefaults()
	}
	return c
}

// run parses args (flags anywhere among the file names), checks --format
// and runs body, which calls load when it has checked its own flags. It
// returns the exit status: 0, 2 for a usage error (bad flag or value), 1
// for a failure of the work; an error is printed as "likewind: ERROR".
func (c *command) run(args []string, body func() error) int {
	files, code := parseArgs(c.fs, args, c.stderr)
	if code >= 0 {
		return code
	}
	c.files = files
	err := c.checkFormat()
	if err == nil {
		err = body()
	}
	if err == nil {
		return 0
	}
	fmt.Fprintln(c.stderr, "likewind:", err)
	var ue usageError
	if errors.As(err, &ue) {
		return 2
	}
	return 1
}

// checkFormat settles --format against spec.formats.
func (c *command) checkFormat() error {
	fm := c.spec.formats
	if len(fm) == 0 {
		return nil
	}
	raw := c.format
	c.format = strings.ToLower(raw)
	if c.format == "" && c.spec.formatFromExt {
		c.format = fm[0]
		if ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(c.out.path), ".")); ext != "" && slices.Contains(fm, ext) {
			c.format = ext
		}
	}
	if !slices.Contains(fm, c.format) {
		return c.usagef("--format %q: want %s", raw, orList(fm))
	}
	return nil
}

// orList is "a or b", "a, b or c".
func orList(words []string) string {
	if len(words) < 2 {
		return strings.Join(words, "")
	}
	return strings.Join(words[:len(words)-1], ", ") + " or " + words[len(words)-1]
}

// usagef is a usage error (exit 2) of the command, named after it.
func (c *command) usagef(format string, a ...any) error {
	return usageError{fmt.Errorf(c.spec.name+": "+format, a...)}
}

// errorf is a failure (exit 1) of the command, named after it.
func (c *command) errorf(format string, a ...any) error {
	return fmt.Errorf(c.spec.name+": "+format, a...)
}

// load checks --date and the output targets (an existing file without
// --force, or a link, device, pipe or folder, is refused before any work),
// then loads the inputs, applies --session and evaluates every facility.
func (c *command) load() error {
	if c.spec.date != "" {
		day, err := reportDate(c.date)
		if err != nil {
			return c.usagef("%w", err)
		}
		c.day = day
	}
	targets := c.targets
	if targets == nil && !c.out.stdout() {
		targets = []string{c.out.path}
	}
	for _, t := range targets {
		if t == "-" {
			continue
		}
		if err := fileout.CheckOutputTarget(t, c.out.force); err != nil {
			return err
		}
	}
	if c.spec.vehicles {
		evs, err := evaluateVehicles(c.files, c.session, c.stderr)
		if err != nil {
			return err
		}
		c.evs, c.ev = evs, evs[0]
		return nil
	}
	in, err := loadInputs(c.files)
	if err != nil {
		return err
	}
	c.ev, err = evaluateLoadedWith(in, c.session, c.stderr, c.evaluate)
	return err
}

// pickFacility is the facility --facility names (given: the flag was
// set), or def; with allowBest "best" is -1 (best of all). A chosen
// facility that could not be evaluated is an error.
func (c *command) pickFacility(given bool, def int, allowBest bool) (int, error) {
	fac := def
	if given {
		k, err := pickFacility(c.ev.e, c.facility, allowBest)
		if err != nil {
			return 0, c.usagef("%w", err)
		}
		fac = k
	}
	if e := c.ev.e; fac >= 0 && e.Maps[fac] == nil {
		return 0, c.errorf("%s could not be evaluated: %w", e.Facilities[fac].Name, e.Errs[fac])
	}
	return fac, nil
}

// units is SI, or customary with --customary.
func (c *command) units() units.System {
	if c.customary {
		return units.Customary
	}
	return units.SI
}

// write sends the output to -o FILE atomically, or to standard output.
func (c *command) write(write func(io.Writer) error) error {
	if err := c.out.write(c.stdout, write); err != nil {
		return c.errorf("%w", err)
	}
	return nil
}

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
	session *session.Session // nil without --session
	marks   []envelope.GridPoint
	// lostMarks counts session marks that no longer fall on the grid.
	lostMarks int
	// changed lists the what-if values that differ from the files.
	changed []string
}

// evaluateInputs loads the files (or the demo), applies a session's
// what-if values and evaluates every facility, printing a warning for
// each facility left out and each session mark off the grid. A problem
// with the command line is a usageError.
func evaluateInputs(files []string, sessionPath string, stderr io.Writer) (*evaluated, error) {
	in, err := loadInputs(files)
	if err != nil {
		return nil, err
	}
	return evaluateLoaded(in, sessionPath, stderr)
}

// evaluateLoaded is evaluateInputs on inputs already loaded.
func evaluateLoaded(in inputs, sessionPath string, stderr io.Writer) (*evaluated, error) {
	return evaluateLoadedWith(in, sessionPath, stderr, nil)
}

// evaluateLoadedWith is evaluateLoaded evaluating by evaluate (nil:
// envelope.Evaluate).
func evaluateLoadedWith(in inputs, sessionPath string, stderr io.Writer, evaluate evaluator) (*evaluated, error) {
	if evaluate == nil {
		evaluate = envelope.Evaluate
	}
	ev := &evaluated{in: in}
	s := envelope.DefaultSettings(in.vehicle)
	facs := append([]envelope.Facility(nil), in.facilities...)
	if sessionPath != "" {
		sess, err := session.Load(sessionPath)
		if err != nil {
			return nil, err
		}
		if err := session.CheckInputs(sess, in.files, in.vehicle, in.facilities); err != nil {
			return nil, fmt.Errorf("session %s: %w", sessionPath, err)
		}
		ev.session = &sess
		ev.changed, err = whatif.Apply(sess.WhatIf, &s, facs)
		if err != nil {
			return nil, fmt.Errorf("session %s: %w", sessionPath, err)
		}
	}
	e, err := evaluate(in.vehicle, facs, s)
	if err != nil {
		return nil, fmt.Errorf("evaluate %s: %w", in.vehicle.Name, err)
	}
	ev.e = e
	for k, err := range e.Errs {
		if err != nil {
			fmt.Fprintf(stderr, "likewind: warning: %s left out: %v\n", facs[k].Name, err)
		}
	}
	if ev.session != nil {
		ev.marks, ev.lostMarks = session.SnapMarks(e.Grid, ev.session.Marks)
		if ev.lostMarks > 0 {
			fmt.Fprintf(stderr, "likewind: warning: %d marked point(s) of the session are no longer on the grid\n", ev.lostMarks)
		}
	}
	return ev, nil
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
