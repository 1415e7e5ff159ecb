package envelope

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"likewind/atmos"
)

// The file formats are described in docs/FORMAT.md. In short: a vehicle
// file has the tables [vehicle], [envelope], and optionally [limits] and
// [grid]; a facility file has one or more [[facility]] tables. Every
// quantity is a quoted string carrying its unit ("41000 ft", "2.5 bar");
// pure numbers may also be written bare.

// Top-level tables and keys of the two formats, in the order they are
// documented (unknown-key errors list them in this order).
var (
	vehicleTables    = []string{"vehicle", "envelope", "limits", "grid"}
	vehicleKeys      = []string{"name", "reference_length", "reference_length_is", "reference_area", "span", "frontal_area"}
	envelopeKeys     = []string{"speed_kind", "altitude_kind", "temperature_offset", "boundary"}
	limitKeys        = []string{"ceiling", "max_mach", "max_eas", "max_cas", "max_dynamic_pressure", "min_speed"}
	gridKeys         = []string{"speed_kind", "altitude", "speed"}
	axisKeys         = []string{"from", "to", "step", "count"}
	facilityTables   = []string{"facility"}
	facilityKeys     = []string{"name", "class", "medium", "mach_range", "speed_range", "stagnation_pressure_range", "static_pressure_range", "stagnation_temperature_range", "water_temperature_range", "max_dynamic_pressure", "min_static_temperature", "condensation_check", "peak_local_mach", "max_reynolds_per_metre", "section_width", "section_height", "model"}
	modelKeys        = []string{"scale", "max_span_fraction", "max_blockage"}
	gasOnlyKeys      = []string{"mach_range", "stagnation_pressure_range", "stagnation_temperature_range", "min_static_temperature", "condensation_check", "peak_local_mach"}
	waterOnlyKeys    = []string{"speed_range", "static_pressure_range", "water_temperature_range"}
	waterCounterpart = map[string]string{
		"mach_range":                   "speed_range",
		"stagnation_pressure_range":    "static_pressure_range",
		"stagnation_temperature_range": "water_temperature_range",
		"speed_range":                  "mach_range",
		"static_pressure_range":        "stagnation_pressure_range",
		"water_temperature_range":      "stagnation_temperature_range",
	}
)

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

// checkInside reports a vehicle whose grid has no point inside the
// envelope, so that nothing would be evaluated: either the limit lines
// exclude every point the boundary holds, or no grid point falls inside the
// boundary at all.
func (d *doc) checkInside(v *Vehicle) {
	s := DefaultSettings(v)
	g, err := NewGrid(v, s)
	if err != nil || g.InsideCount() > 0 {
		return
	}
	open := *v
	open.Limits = Limits{}
	if g, err := NewGrid(&open, s); err == nil && g.InsideCount() > 0 {
		d.fail("limits", "limits", "limit lines that exclude every grid point of the envelope",
			"limits that leave part of the envelope inside")
		return
	}
	// Report at the grid's first table, or at the boundary when the file
	// leaves the grid to its defaults.
	p := "envelope.boundary"
	for _, q := range []string{"grid", "grid.altitude", "grid.speed"} {
		if d.idx[q] > 0 {
			p = q
			break
		}
	}
	d.fail(p, "grid", fmt.Sprintf("no grid point inside the envelope boundary (%d × %d points)", g.Rows(), g.Cols()),
		"grid axes that overlap the envelope, with steps fine enough to put points inside it")
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
	if _, err := toml.Decode(src, &d.root); err != nil {
		d.errs = *syntaxErrors(name, err)
		return d, false
	}
	d.idx = indexLines(src)
	return d, true
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

func (d *doc) altitude(q *qty, kind atmos.AltitudeKind) {
	if q.ok {
		d.need(q, CheckAltitude("", q.v, kind) == nil, altitudeRange(kind))
	}
}

func (d *doc) speedBounds(q *qty, k atmos.SpeedKind) { d.within(q, FlightSpeedBound(k)) }

// vehicle reads and checks a vehicle file.
func (d *doc) vehicle() *Vehicle {
	v := &Vehicle{Source: d.file, RefLengthName: "reference length"}
	root := d.table("", d.root, vehicleTables)
	root.hint = "a vehicle file; facilities go in a file of their own"
	defer root.finish()

	if vt := root.sub("vehicle", vehicleKeys, true); vt != nil {
		v.Name, _ = vt.freeText("name", true, `the vehicle's name in quotes`)
		q := vt.quantity("reference_length", uLength, true)
		v.RefLength = d.within(&q, VehicleLengthBound())
		if s, ok := vt.freeText("reference_length_is", false, `what the reference length is, in quotes, e.g. "mean aerodynamic chord"`); ok {
			v.RefLengthName = s
		}
		q = vt.quantity("reference_area", uArea, true)
		v.RefArea = d.positive(&q, maxArea, "an area above 0 m2")
		q = vt.quantity("span", uLength, true)
		v.Span = d.within(&q, VehicleLengthBound())
		q = vt.quantity("frontal_area", uArea, true)
		v.FrontalArea = d.positive(&q, maxArea, "an area above 0 m2")
		vt.finish()
	}

	boundaryOK := false
	if et := root.sub("envelope", envelopeKeys, true); et != nil {
		kindsOK := true
		if s, ok := et.text("speed_kind", true, `the kind of the boundary speeds: "Mach", "TAS", "EAS" or "CAS"`); ok {
			k, err := atmos.ParseSpeedKind(s)
			if err != nil {
				p := et.keyPath("speed_kind")
				d.fail(p, display(p), strconv.Quote(s), `"Mach", "TAS", "EAS" or "CAS"`)
				kindsOK = false
			}
			v.BoundaryKind = k
		} else {
			kindsOK = false
		}
		if s, ok := et.text("altitude_kind", false, `"geometric", "geopotential" or "pressure"`); ok {
			k, err := atmos.ParseAltitudeKind(s)
			if err != nil {
				p := et.keyPath("altitude_kind")
				d.fail(p, display(p), strconv.Quote(s), `"geometric", "geopotential" or "pressure"`)
				kindsOK = false
			}
			v.AltitudeKind = k
		}
		dT := et.quantity("temperature_offset", uDeltaT, false)
		v.DeltaT = d.within(&dT, DeltaTBound())
		dTOK := dT.ok || !et.has("temperature_offset")
		boundaryOK = d.boundary(et, v, kindsOK && dTOK)
		et.finish()
	}

	if lt := root.sub("limits", limitKeys, false); lt != nil {
		d.limits(lt, v)
		lt.finish()
	}

	var gt *table
	if g := root.sub("grid", gridKeys, false); g != nil {
		gt = g
	} else if !root.has("grid") {
		gt = d.table("grid", map[string]any{}, gridKeys)
	}
	if gt != nil {
		d.grid(gt, v, boundaryOK)
		gt.finish()
	}
	return v
}

// boundary reads the envelope outline and checks its geometry. It reports
// whether the outline is usable.
func (d *doc) boundary(et *table, v *Vehicle, kindsOK bool) bool {
	p := et.keyPath("boundary")
	const form = `a list of [altitude, speed] points, e.g. [["0 ft", "0.3"], ["40000 ft", "0.85"], ...]`
	raw, ok := et.get("boundary")
	if !ok {
		et.missing("boundary", form)
		return false
	}
	arr, ok := raw.([]any)
	if !ok {
		d.fail(p, display(p), describe(raw), form)
		return false
	}
	if len(arr) > MaxBoundaryPoints {
		d.fail(p, display(p), fmt.Sprintf("%d points", len(arr)), fmt.Sprintf("at most %d points", MaxBoundaryPoints))
		return false
	}
	good := kindsOK
	su := speedUnit(v.BoundaryKind)
	verts := make([]Vertex, 0, len(arr))
	for i, el := range arr {
		ep := fmt.Sprintf("%s[%d]", p, i)
		field := fmt.Sprintf("%s point %d", display(p), i+1)
		pair, ok := el.([]any)
		if !ok || len(pair) != 2 {
			d.fail(ep, field, describe(el), `a pair [altitude, speed], e.g. ["41000 ft", "0.85"]`)
			good = false
			continue
		}
		alt := d.value(pair[0], ep+"[0]", field+" altitude", uAltitude)
		d.altitude(&alt, v.AltitudeKind)
		sp := qty{}
		if kindsOK {
			sp = d.value(pair[1], ep+"[1]", field+" speed", su)
			d.speedBounds(&sp, v.BoundaryKind)
		}
		if !alt.ok || !sp.ok {
			good = false
			continue
		}
		// The speed must mean something at this altitude (a CAS beyond
		// what the standard atmosphere allows does not).
		if m, err := convertSpeed(v, alt.v, v.BoundaryKind, sp.v, atmos.Mach); err != nil || !FlightMachBound().Holds(m) {
			why := fmt.Sprintf("Mach %.3g", m)
			if err != nil {
				why = err.Error()
			}
			d.fail(ep, field, fmt.Sprintf("%s (%s)", describe(el), why),
				fmt.Sprintf("a %s that exists at this altitude on the design day, at most Mach %g", v.BoundaryKind, maxMach))
			good = false
			continue
		}
		verts = append(verts, Vertex{Altitude: alt.v, Speed: sp.v})
	}
	if !good {
		return false
	}
	// Closing the outline by repeating the first point is allowed.
	if n := len(verts); n > 1 && verts[0] == verts[n-1] {
		verts = verts[:n-1]
	}
	v.Boundary = verts
	return d.checkOutline(p, v)
}

// limits reads the optional limit lines.
func (d *doc) limits(lt *table, v *Vehicle) {
	q := lt.quantity("ceiling", uAltitude, false)
	d.altitude(&q, v.AltitudeKind)
	lowest := math.Inf(-1)
	for i, w := range v.Boundary {
		if i == 0 || w.Altitude < lowest {
			lowest = w.Altitude
		}
	}
	if d.need(&q, q.v > lowest, "a ceiling above the lowest boundary point") {
		v.Limits.Ceiling = q.v
	}
	q = lt.quantity("max_mach", uMach, false)
	v.Limits.MaxMach = d.positive(&q, maxMach, fmt.Sprintf("a Mach number above 0 and at most %g", maxMach))
	q = lt.quantity("max_eas", uSpeed, false)
	v.Limits.MaxEAS = d.positive(&q, maxSpeed, "a speed above 0")
	q = lt.quantity("max_cas", uSpeed, false)
	v.Limits.MaxCAS = d.positive(&q, maxSpeed, "a speed above 0")
	q = lt.quantity("max_dynamic_pressure", uPressure, false)
	v.Limits.MaxQ = d.positive(&q, maxPressure, "a pressure above 0")

	if raw, ok := lt.get("min_speed"); ok {
		p := lt.keyPath("min_speed")
		const exp = `a speed with its kind, e.g. "M0.25", "90 KEAS", "120 kt CAS" or "60 m/s TAS"`
		s, isText := raw.(string)
		if !isText {
			d.fail(p, display(p), describe(raw), exp)
			return
		}
		k, sp, err := atmos.ParseAirspeed(s)
		if err != nil {
			d.fail(p, display(p), strconv.Quote(s), exp)
			return
		}
		mq := qty{v: sp, raw: raw, path: p, field: display(p), ok: true}
		d.speedBounds(&mq, k)
		if mq.ok && sp > 0 {
			v.Limits.MinSpeed, v.Limits.MinSpeedKind = sp, k
		} else if mq.ok {
			d.need(&mq, false, "a speed above 0")
		}
	}
}

// axisIn is a grid axis as written in the file.
type axisIn struct {
	from, to, step qty
	count          int
	hasCount       bool
	path           string
}

func (d *doc) readAxis(gt *table, key string, u unit) axisIn {
	a := axisIn{path: gt.keyPath(key)}
	at := gt.sub(key, axisKeys, false)
	if at == nil {
		return a
	}
	a.from = at.quantity("from", u, false)
	a.to = at.quantity("to", u, false)
	a.step = at.quantity("step", u, false)
	if raw, ok := at.get("count"); ok {
		p := at.keyPath("count")
		n, isInt := raw.(int64)
		switch {
		case !isInt:
			d.fail(p, display(p), describe(raw), fmt.Sprintf("a whole number of points from 2 to %d, without quotes", MaxAxisPoints))
		case n < 2 || n > MaxAxisPoints:
			d.fail(p, display(p), describe(raw), fmt.Sprintf("from 2 to %d points (the grid is limited to %d × %d)", MaxAxisPoints, MaxAxisPoints, MaxAxisPoints))
		default:
			a.count, a.hasCount = int(n), true
		}
	}
	if at.has("step") && at.has("count") {
		p := at.keyPath("count")
		d.fail(p, display(a.path), "both step and count", "a step or a count, not both")
		a.hasCount = false
		a.step.ok = false
	}
	at.finish()
	return a
}

// grid reads the grid and fills what the file leaves out from the
// boundary's bounding box.
func (d *doc) grid(gt *table, v *Vehicle, boundaryOK bool) {
	v.Grid.SpeedKind = v.BoundaryKind
	kindOK := true
	if s, ok := gt.text("speed_kind", false, `"Mach", "TAS", "EAS" or "CAS"`); ok {
		k, err := atmos.ParseSpeedKind(s)
		if err != nil {
			p := gt.keyPath("speed_kind")
			d.fail(p, display(p), strconv.Quote(s), `"Mach", "TAS", "EAS" or "CAS"`)
			kindOK = false
		}
		v.Grid.SpeedKind = k
	}
	alt := d.readAxis(gt, "altitude", uAltitude)
	d.altitude(&alt.from, v.AltitudeKind)
	d.altitude(&alt.to, v.AltitudeKind)
	d.need(&alt.step, alt.step.v > 0, "an altitude step above 0")
	if !kindOK {
		if st := gt.sub("speed", axisKeys, false); st != nil {
			st.finish() // still report unknown keys
		}
		return
	}
	spd := d.readAxis(gt, "speed", speedUnit(v.Grid.SpeedKind))
	d.speedBounds(&spd.from, v.Grid.SpeedKind)
	d.speedBounds(&spd.to, v.Grid.SpeedKind)
	d.need(&spd.step, spd.step.v > 0, "a speed step above 0")

	if !boundaryOK {
		return
	}
	altLo, altHi, spLo, spHi, err := boundaryBox(v, v.Grid.SpeedKind)
	if err != nil {
		p := gt.keyPath("speed_kind")
		d.fail(p, display(p), v.Grid.SpeedKind.String(),
			fmt.Sprintf("a speed kind the whole boundary converts to (%v)", err))
		return
	}
	// Limit lines of the same kind narrow the default box.
	if c := v.Limits.Ceiling; c > altLo && c < altHi {
		altHi = c
	}
	switch lim := d.speedLimit(v); {
	case lim > spLo && lim < spHi:
		spHi = lim
	}
	if v.Limits.MinSpeed > spLo && v.Limits.MinSpeed < spHi && v.Limits.MinSpeedKind == v.Grid.SpeedKind {
		spLo = v.Limits.MinSpeed
	}
	v.Grid.Altitude = d.fillAxis(alt, altLo, altHi, DefaultAltitudeRows, "altitude")
	v.Grid.Speed = d.fillAxis(spd, spLo, spHi, DefaultSpeedColumns, "speed")
}

// speedLimit returns the upper limit line that is of the grid's speed kind,
// or 0.
func (d *doc) speedLimit(v *Vehicle) float64 {
	switch v.Grid.SpeedKind {
	case atmos.Mach:
		return v.Limits.MaxMach
	case atmos.EAS:
		return v.Limits.MaxEAS
	case atmos.CAS:
		return v.Limits.MaxCAS
	}
	return 0
}

// fillAxis completes an axis with defaults and checks its size.
func (d *doc) fillAxis(a axisIn, lo, hi float64, defCount int, what string) Axis {
	ax := Axis{Min: lo, Max: hi}
	if a.from.ok {
		ax.Min = a.from.v
	}
	if a.to.ok {
		ax.Max = a.to.v
	}
	field := display(a.path)
	if !(ax.Max > ax.Min) {
		found := fmt.Sprintf("from %s to %s (SI)", atmos.FormatNumber(ax.Min), atmos.FormatNumber(ax.Max))
		if a.from.ok && a.to.ok {
			found = fmt.Sprintf("from %s to %s", describe(a.from.raw), describe(a.to.raw))
		}
		d.fail(a.path, field, found, "a range whose to is above its from")
		return Axis{}
	}
	switch {
	case a.step.ok:
		ax.Step = a.step.v
		if n := axisPoints(ax); n > MaxAxisPoints || n < 2 {
			d.fail(a.step.path, field, fmt.Sprintf("step %s giving %d points", describe(a.step.raw), n),
				fmt.Sprintf("from 2 to %d %s points (the grid is limited to %d × %d)", MaxAxisPoints, what, MaxAxisPoints, MaxAxisPoints))
			return Axis{}
		}
	case a.hasCount:
		ax.Count = a.count
	default:
		ax.Count = defCount
	}
	return ax
}

// facilities reads and checks a facility file.
func (d *doc) facilities() []Facility {
	root := d.table("", d.root, facilityTables)
	root.hint = "a facility file; a vehicle goes in a file of its own"
	defer root.finish()
	const form = "one or more [[facility]] tables"
	raw, ok := root.get("facility")
	if !ok {
		root.missing("facility", form)
		return nil
	}
	list, ok := raw.([]map[string]any)
	if !ok {
		d.fail("facility", "facility", describe(raw), form+" (note the double brackets)")
		return nil
	}
	out := make([]Facility, 0, len(list))
	names := map[string]int{}
	for i, m := range list {
		p := fmt.Sprintf("facility[%d]", i)
		f := d.facility(d.table(p, m, facilityKeys))
		if f.Name != "" {
			key := strings.ToLower(f.Name)
			if j, dup := names[key]; dup {
				np := p + ".name"
				d.fail(np, display(np), strconv.Quote(f.Name),
					fmt.Sprintf("a name not already used (facility[%d] has it)", j+1))
			} else {
				names[key] = i
			}
		}
		out = append(out, f)
	}
	return out
}

// facility reads one [[facility]] table.
func (d *doc) facility(t *table) Facility {
	defer t.finish()
	f := Facility{Source: d.file}
	f.Name, _ = t.freeText("name", true, "the facility's name in quotes")
	f.Class, _ = t.freeText("class", false, `a short description in quotes, e.g. "pressurized transonic"`)

	mediumOK := false
	if s, ok := t.text("medium", true, mediumWanted()); ok {
		f.Medium, mediumOK = mediumNamed(s)
		if !mediumOK {
			p := t.keyPath("medium")
			d.fail(p, display(p), strconv.Quote(s), mediumWanted())
		}
	}

	if mediumOK {
		wrong := waterOnlyKeys
		if f.Medium == MediumWater {
			wrong = gasOnlyKeys
		}
		for _, k := range wrong {
			if !t.has(k) {
				continue
			}
			p := t.keyPath(k)
			exp := "no " + k + " (condensation limits apply to " + andList(gasMedia()) + " only)"
			if c, ok := waterCounterpart[k]; ok {
				exp = c + " instead"
			}
			d.fail(p, display(p), fmt.Sprintf("%s on a%s %s facility", k, article(f.Medium.String()), f.Medium), exp)
		}
	}

	if mediumOK && f.Medium.IsGas() {
		lo, hi := t.span("mach_range", uMach, true)
		d.need(&lo, lo.v > 0, "a Mach number above 0")
		d.need(&hi, hi.v <= maxMach, fmt.Sprintf("a Mach number up to %g", maxMach))
		g := &f.Gas
		g.MachMin, g.MachMax = lo.v, hi.v
		lo, hi = t.span("stagnation_pressure_range", uPressure, true)
		g.P0Min, g.P0Max = d.within(&lo, FacilityPressureBound()), d.within(&hi, FacilityPressureBound())
		lo, hi = t.span("stagnation_temperature_range", uTemp, true)
		tb := FacilityTemperatureBound(f.Medium)
		g.T0Min, g.T0Max = d.within(&lo, tb), d.within(&hi, tb)
		q := t.quantity("min_static_temperature", uTemp, false)
		g.MinStaticT = d.positive(&q, maxGasT0, "a temperature above 0 K")
		g.Condensation = t.boolean("condensation_check", true)
		q = t.quantity("peak_local_mach", uMach, false)
		g.PeakLocalMach = DefaultPeakLocalMach
		if d.need(&q, q.v >= 1 && q.v <= 10, "a Mach number from 1 to 10") {
			g.PeakLocalMach = q.v
		}
	}
	if mediumOK && f.Medium == MediumWater {
		lo, hi := t.span("speed_range", uSpeed, true)
		d.need(&lo, lo.v > 0, "a speed above 0")
		d.need(&hi, hi.v <= maxWaterSpeed, fmt.Sprintf("a water speed up to %g m/s", maxWaterSpeed))
		w := &f.Water
		w.SpeedMin, w.SpeedMax = lo.v, hi.v
		lo, hi = t.span("static_pressure_range", uPressure, true)
		w.PMin, w.PMax = d.within(&lo, FacilityPressureBound()), d.within(&hi, FacilityPressureBound())
		lo, hi = t.span("water_temperature_range", uTemp, true)
		wb := FacilityTemperatureBound(f.Medium)
		w.TMin, w.TMax = d.within(&lo, wb), d.within(&hi, wb)
	}

	q := t.quantity("max_dynamic_pressure", uPressure, false)
	f.QMax = d.within(&q, QMaxBound())
	q = t.quantity("max_reynolds_per_metre", uPerLength, false)
	f.MaxReynoldsPerM = d.positive(&q, 1e12, "a unit Reynolds number above 0")
	q = t.quantity("section_width", uLength, true)
	f.Width = d.positive(&q, MaxLength, "a length above 0 m")
	q = t.quantity("section_height", uLength, true)
	f.Height = d.positive(&q, MaxLength, "a length above 0 m")

	f.Model.MaxSpanFraction = DefaultMaxSpanFraction
	if mt := t.sub("model", modelKeys, false); mt != nil {
		q = mt.quantity("scale", uRatio, false)
		f.Model.Scale = d.within(&q, ModelScaleBound())
		q = mt.quantity("max_span_fraction", uFraction, false)
		if d.need(&q, q.v > 0 && q.v <= 1, "a share of the section width above 0 and at most 1 (100 %)") {
			f.Model.MaxSpanFraction = q.v
		}
		q = mt.quantity("max_blockage", uFraction, false)
		f.Model.MaxBlockage = d.positive(&q, maxBlockage, "a share of the section area above 0 and at most 0.5 (50 %)")
		mt.finish()
	}
	return f
}

func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "n"
	}
	return ""
}
