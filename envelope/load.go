package envelope

import (
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"
)

// The file formats are described in docs/FORMAT.md. In short: a vehicle
// file has the tables [vehicle], [envelope], and optionally [limits] and
// [grid]; a facility file has one or more [[facility]] tables. Every
// quantity is a quoted string carrying its unit ("41000 ft", "2.5 bar");
// pure numbers may also be written bare.

// LoadVehicle reads and validates a vehicle file. When the file has
// problems the error is a *FileErrors listing all of them.
func LoadVehicle(path string) (*Vehicle, error) {
	data, err := readInput(path)
	if err != nil {
		return nil, fmt.Errorf("load vehicle: %w", err)
	}
	return ParseVehicle(path, data)
}

// LoadFacilities reads and validates a facility file holding one or more
// [[facility]] tables. When the file has problems the error is a
// *FileErrors listing all of them.
func LoadFacilities(path string) ([]Facility, error) {
	data, err := readInput(path)
	if err != nil {
		return nil, fmt.Errorf("load facilities: %w", err)
	}
	return ParseFacilities(path, data)
}

// readInput reads a file of at most MaxFileSize bytes, and one byte more
// when it is larger (so the size check can say so without reading, say,
// /dev/zero to the end). Errors name the path made safe to print.
func readInput(path string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, cleanPathError(err)
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileSize+1))
	if err != nil {
		return nil, cleanPathError(err)
	}
	return data, nil
}

// ParseVehicle reads a vehicle from file text; name labels the errors and
// becomes the vehicle's Source.
func ParseVehicle(name string, data []byte) (*Vehicle, error) {
	d, ok := newDoc(name, data)
	if !ok {
		return nil, d.result()
	}
	return d.parseVehicle()
}

// parseVehicle reads and checks the vehicle of a decoded file.
func (d *doc) parseVehicle() (*Vehicle, error) {
	v := d.vehicle()
	if len(d.errs) == 0 {
		d.checkInside(v)
	}
	if err := d.result(); err != nil {
		return nil, err
	}
	return v, nil
}

// ParseFacilities reads the facilities of a facility file from its text;
// name labels the errors and becomes each facility's Source.
func ParseFacilities(name string, data []byte) ([]Facility, error) {
	d, ok := newDoc(name, data)
	if !ok {
		return nil, d.result()
	}
	return d.parseFacilities()
}

// parseFacilities reads and checks the facilities of a decoded file.
func (d *doc) parseFacilities() ([]Facility, error) {
	fs := d.facilities()
	if err := d.result(); err != nil {
		return nil, err
	}
	return fs, nil
}

// CheckDuplicateNames reports facilities that share a name, across all the
// files they came from (names select facilities on the command line and in
// the interface, so they must be unique). The error is a *FileErrors with one
// entry per repeat, or nil.
func CheckDuplicateNames(facs []Facility) error {
	first := map[string]int{}
	var errs FileErrors
	for i, f := range facs {
		key := strings.ToLower(strings.TrimSpace(f.Name))
		j, seen := first[key]
		if !seen {
			first[key] = i
			continue
		}
		errs = append(errs, FileError{
			File:     f.Source,
			Field:    "facility name",
			Found:    strconv.Quote(f.Name),
			Expected: fmt.Sprintf("a name not already used (facility %q in %s has it)", facs[j].Name, sourceName(facs[j].Source)),
		})
	}
	if len(errs) == 0 {
		return nil
	}
	return &errs
}

func sourceName(s string) string {
	if s == "" {
		return "the built-in data"
	}
	return s
}

// Check validates vehicle and facility files for the check command. It
// tells the two kinds apart by their top-level tables and returns every
// problem found, one error per problem, including facility names repeated
// across files. An empty result means all files are good. Each file is
// read and decoded once.
func Check(paths ...string) []error {
	var out []error
	var facs []Facility
	for _, p := range paths {
		data, err := readInput(p)
		if err != nil {
			out = append(out, fmt.Errorf("check: %w", err))
			continue
		}
		d, ok := newDoc(p, data)
		if !ok {
			out = appendFlat(out, d.result())
			continue
		}
		var perr error
		switch kind, kerr := d.kind(); {
		case kerr != nil:
			perr = kerr
		case kind == "vehicle":
			_, perr = d.parseVehicle()
		default:
			var fs []Facility
			fs, perr = d.parseFacilities()
			facs = append(facs, fs...)
		}
		out = appendFlat(out, perr)
	}
	return appendFlat(out, CheckDuplicateNames(facs))
}

// appendFlat adds err to list, one entry per problem of a *FileErrors.
func appendFlat(list []error, err error) []error {
	if err == nil {
		return list
	}
	var fe *FileErrors
	if errors.As(err, &fe) {
		for _, e := range *fe {
			list = append(list, e)
		}
		return list
	}
	return append(list, err)
}

// kind tells a vehicle file from a facility file by its top-level
// tables: "vehicle" or "facility".
func (d *doc) kind() (string, error) {
	top := d.root
	_, hasFac := top["facility"]
	hasVeh := false
	for _, k := range vehicleTables {
		if _, ok := top[k]; ok {
			hasVeh = true
		}
	}
	switch {
	case hasFac && hasVeh:
		return "", &FileErrors{{File: d.file, Line: d.idx.line("facility"), Field: "facility",
			Found: "[[facility]] tables in a vehicle file", Expected: "vehicles and facilities in separate files"}}
	case hasFac:
		return "facility", nil
	case hasVeh:
		return "vehicle", nil
	}
	return "", &FileErrors{{File: d.file, Line: 1, Found: "neither [vehicle] nor [[facility]] tables",
		Expected: "a vehicle file ([vehicle], [envelope], optional [limits], [grid]) or a facility file ([[facility]] tables)"}}
}

// syntaxErrors turns a TOML decoding error into a *FileErrors.
func syntaxErrors(name string, err error) *FileErrors {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		fe := FileError{File: name, Line: pe.Position.Line, Field: "syntax",
			Found: strings.TrimSuffix(pe.Message, "."), Expected: "valid TOML"}
		if pe.LastKey != "" {
			fe.Field = "syntax after " + pe.LastKey
		}
		return &FileErrors{fe}
	}
	return &FileErrors{{File: name, Field: "syntax", Found: err.Error(), Expected: "valid TOML"}}
}

// doc is one file being read: its decoded tables, where each key sits, and
// the problems found so far.
type doc struct {
	file string
	root map[string]any
	idx  lineIndex
	errs FileErrors
	// unlisted counts problems found beyond maxListedProblems.
	unlisted int
}

// maxListedProblems is how many problems of one file are listed; a file
// of thousands of faults (a wrong file, a hostile one) gets a count of
// the rest instead of a list that costs memory and helps nobody.
const maxListedProblems = 200

// newDoc decodes file text. A file larger than MaxFileSize, nested
// deeper than MaxNesting or holding more than MaxItems items is refused
// before the decoder sees it.
func newDoc(name string, data []byte) (*doc, bool) {
	d := &doc{file: name}
	if len(data) > MaxFileSize {
		d.errs = FileErrors{{File: name, Field: "file size", Found: "more than 4 MiB",
			Expected: fmt.Sprintf("a file of at most 4 MiB (%d bytes); vehicle and facility files are a few kilobytes", MaxFileSize)}}
		return d, false
	}
	src := string(data)
	switch f := scanShape(src, MaxNesting, MaxItems); {
	case f.Depth > 0:
		d.errs = FileErrors{{File: name, Line: f.Line, Field: "nesting",
			Found:    fmt.Sprintf("keys, tables and arrays nested %d levels deep", f.Depth),
			Expected: fmt.Sprintf("at most %d levels, the deepest the formats use (envelope.boundary = [[altitude, speed], ...] is 4)", MaxNesting)}}
		return d, false
	case f.Items > 0:
		d.errs = FileErrors{{File: name, Line: f.Line, Field: "file size",
			Found:    fmt.Sprintf("more than %d keys, values, arrays and tables", MaxItems),
			Expected: fmt.Sprintf("at most %d (a vehicle file of 1000 boundary points holds about 3000)", MaxItems)}}
		return d, false
	}
	if err := decodeTOML(src, &d.root); err != nil {
		d.errs = *syntaxErrors(name, err)
		return d, false
	}
	d.idx = indexLines(src)
	return d, true
}

// decodeTOML runs the TOML decoder. newDoc is its only caller and every
// entry point (Load*, Parse*, Check, Demo) makes one doc per file, so each
// file is decoded once; the line index scans the text without decoding it.
// A variable only so that TestDecodeOnce can count the calls.
var decodeTOML = func(src string, v any) error {
	_, err := toml.Decode(src, v)
	return err
}

func (d *doc) result() error {
	if len(d.errs) == 0 {
		return nil
	}
	sortErrors(d.errs)
	errs := d.errs
	if d.unlisted > 0 {
		errs = append(errs, FileError{File: d.file, Found: fmt.Sprintf("%d more problems, not listed", d.unlisted),
			Expected: fmt.Sprintf("at most %d problems listed per file; correct the ones above and check again", maxListedProblems)})
	}
	return &errs
}

// problems counts the problems found so far, listed or not.
func (d *doc) problems() int { return len(d.errs) + d.unlisted }

// fail records a problem at the line of path (an internal path, see
// lineIndex) under the displayed field name.
func (d *doc) fail(path, field, found, expected string) {
	if len(d.errs) >= maxListedProblems {
		d.unlisted++
		return
	}
	d.errs = append(d.errs, FileError{File: d.file, Line: d.idx.line(path), Field: field, Found: found, Expected: expected})
}

// display turns an internal path into the field name shown to users:
// element numbers count from 1 ("facility[1]" is the first facility).
func display(path string) string {
	var b strings.Builder
	for i := 0; i < len(path); i++ {
		c := path[i]
		if c != '[' {
			b.WriteByte(c)
			continue
		}
		j := strings.IndexByte(path[i:], ']')
		n, err := strconv.Atoi(path[i+1 : i+max(j, 1)])
		if j < 0 || err != nil {
			b.WriteByte(c)
			continue
		}
		fmt.Fprintf(&b, "[%d]", n+1)
		i += j
	}
	return b.String()
}

func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "n"
	}
	return ""
}
