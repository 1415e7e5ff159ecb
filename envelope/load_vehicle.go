package envelope

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"likewind/atmos"
)

// Tables and keys of the vehicle format, in the order they are documented
// (unknown-key errors list them in this order); the keys of [vehicle] and
// [limits] are their fields below.
var (
	vehicleTables = []string{"vehicle", "envelope", "limits", "grid"}
	envelopeKeys  = []string{"speed_kind", "altitude_kind", "temperature_offset", "boundary"}
	gridKeys      = []string{"speed_kind", "altitude", "speed"}
	axisKeys      = []string{"from", "to", "step", "count"}
)

// The names a speed kind and an altitude kind are written with.
const (
	speedKinds    = `"Mach", "TAS", "EAS" or "CAS"`
	altitudeKinds = `"geometric", "geopotential" or "pressure"`
)

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

func (d *doc) altitude(q *qty, kind atmos.AltitudeKind) {
	if q.ok {
		d.need(q, CheckAltitude("", q.v, kind) == nil, altitudeRange(kind))
	}
}

func (d *doc) speedBounds(q *qty, k atmos.SpeedKind) { d.within(q, FlightSpeedBound(k)) }

// vehicleFields are the keys of the [vehicle] table, read into v.
func vehicleFields(v *Vehicle) []field {
	area := aboveZero(maxArea, "an area above 0 m2")
	return []field{
		textField{key: "name", required: true, expected: `the vehicle's name in quotes`, to: &v.Name},
		quantityField{key: "reference_length", unit: uLength, required: true, bound: VehicleLengthBound(), to: &v.RefLength},
		textField{key: "reference_length_is", expected: `what the reference length is, in quotes, e.g. "mean aerodynamic chord"`, def: "reference length", to: &v.RefLengthName},
		quantityField{key: "reference_area", unit: uArea, required: true, bound: area, to: &v.RefArea},
		quantityField{key: "span", unit: uLength, required: true, bound: VehicleLengthBound(), to: &v.Span},
		quantityField{key: "frontal_area", unit: uArea, required: true, bound: area, to: &v.FrontalArea},
		quantityField{key: "max_normal_coefficient", unit: uCoeff, bound: LoadCoefficientBound(), to: &v.Loads.CNMax},
		quantityField{key: "max_pitching_moment_coefficient", unit: uCoeff, bound: LoadCoefficientBound(), to: &v.Loads.CmMax},
		quantityField{key: "load_reference_area", unit: uArea, bound: aboveZero(MaxArea, "an area above 0 m2 (leave it out for the reference area)"), to: &v.Loads.Area},
	}
}

// loadKeys are the file keys of the fields of ModelLoads (LoadError.Field).
var loadKeys = map[string]string{
	"CNMax": "max_normal_coefficient",
	"CmMax": "max_pitching_moment_coefficient",
	"Area":  "load_reference_area",
}

// checkLoads checks the vehicle's load data as a whole (CheckModelLoads:
// an area needs a coefficient), once each coefficient the table gives
// was read; a coefficient refused is reported already.
func (d *doc) checkLoads(vt *table, v *Vehicle) {
	if vt.has(loadKeys["CNMax"]) && v.Loads.CNMax == 0 || vt.has(loadKeys["CmMax"]) && v.Loads.CmMax == 0 {
		return
	}
	var le *LoadError
	if err := CheckModelLoads(v.Loads); errors.As(err, &le) {
		p := vt.keyPath(loadKeys[le.Field])
		found, expected := err.Error(), ""
		if ob, ok := le.Err.(*OutOfBounds); ok {
			found, expected = ob.Found, ob.Expected
		}
		d.fail(p, display(p), found, expected)
		v.Loads = ModelLoads{}
	}
}

// limitFields are the keys of the optional [limits] table, read into
// v.Limits (the ceiling is checked against v's boundary, read before).
func limitFields(v *Vehicle) []field {
	l := &v.Limits
	speed := aboveZero(maxSpeed, "a speed above 0")
	return []field{
		keyFunc{"ceiling", func(t *table) { t.d.ceiling(t, v) }, func(b *strings.Builder) {
			if l.Ceiling != 0 {
				kv(b, "ceiling", si(l.Ceiling, "m"))
			}
		}},
		quantityField{key: "max_mach", unit: uMach, bound: aboveZero(maxMach, fmt.Sprintf("a Mach number above 0 and at most %g", maxMach)), to: &l.MaxMach},
		quantityField{key: "max_eas", unit: uSpeed, bound: speed, to: &l.MaxEAS},
		quantityField{key: "max_cas", unit: uSpeed, bound: speed, to: &l.MaxCAS},
		quantityField{key: "max_dynamic_pressure", unit: uPressure, bound: aboveZero(maxPressure, "a pressure above 0"), to: &l.MaxQ},
		keyFunc{"min_speed", func(t *table) { t.d.minSpeed(t, v) }, func(b *strings.Builder) {
			switch {
			case l.MinSpeed == 0:
			case l.MinSpeedKind == atmos.Mach:
				kv(b, "min_speed", tomlQuote("M"+num(l.MinSpeed)))
			default:
				kv(b, "min_speed", tomlQuote(num(l.MinSpeed)+" m/s "+l.MinSpeedKind.String()))
			}
		}},
	}
}

// vehicle reads and checks a vehicle file.
func (d *doc) vehicle() *Vehicle {
	v := &Vehicle{Source: d.file}
	root := d.table("", d.root, vehicleTables)
	root.hint = "a vehicle file; facilities go in a file of their own"
	defer root.finish()

	fields := vehicleFields(v)
	if vt := root.sub("vehicle", fieldKeys(fields), true); vt != nil {
		readFields(vt, fields)
		d.checkLoads(vt, v)
		vt.finish()
	}

	boundaryOK := false
	if et := root.sub("envelope", envelopeKeys, true); et != nil {
		sk := choose(et, "speed_kind", true, `the kind of the boundary speeds: `+speedKinds, speedKinds, known(atmos.ParseSpeedKind))
		ak := choose(et, "altitude_kind", false, altitudeKinds, altitudeKinds, known(atmos.ParseAltitudeKind))
		v.BoundaryKind, v.AltitudeKind = sk.v, ak.v
		kindsOK := sk.ok && !ak.unknown
		dT := et.quantity("temperature_offset", uDeltaT, false)
		v.DeltaT = d.within(&dT, DeltaTBound())
		dTOK := dT.ok || !et.has("temperature_offset")
		boundaryOK = d.boundary(et, v, kindsOK && dTOK)
		et.finish()
	}

	fields = limitFields(v)
	if lt := root.sub("limits", fieldKeys(fields), false); lt != nil {
		readFields(lt, fields)
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
	verts := make([]Vertex, 0, len(arr))
	for i, el := range arr {
		w, ok := d.boundaryPoint(el, fmt.Sprintf("%s[%d]", p, i), fmt.Sprintf("%s point %d", display(p), i+1), v, kindsOK)
		if !ok {
			good = false
			continue
		}
		verts = append(verts, w)
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

// boundaryPoint reads the boundary point el, at internal path ep and shown
// as field: an [altitude, speed] pair whose speed exists at its altitude
// on the design day. Its speed is read only when the boundary's kinds are
// (kindsOK).
func (d *doc) boundaryPoint(el any, ep, field string, v *Vehicle, kindsOK bool) (Vertex, bool) {
	pair, ok := el.([]any)
	if !ok || len(pair) != 2 {
		d.fail(ep, field, describe(el), `a pair [altitude, speed], e.g. ["41000 ft", "0.85"]`)
		return Vertex{}, false
	}
	alt := d.value(pair[0], ep+"[0]", field+" altitude", uAltitude)
	d.altitude(&alt, v.AltitudeKind)
	sp := qty{}
	if kindsOK {
		sp = d.value(pair[1], ep+"[1]", field+" speed", speedUnit(v.BoundaryKind))
		d.speedBounds(&sp, v.BoundaryKind)
	}
	if !alt.ok || !sp.ok {
		return Vertex{}, false
	}
	// The speed must mean something at this altitude (a CAS beyond what
	// the standard atmosphere allows does not).
	if m, err := convertSpeed(v, alt.v, v.BoundaryKind, sp.v, atmos.Mach); err != nil || !FlightMachBound().Holds(m) {
		why := fmt.Sprintf("Mach %.3g", m)
		if err != nil {
			why = err.Error()
		}
		d.fail(ep, field, fmt.Sprintf("%s (%s)", describe(el), why),
			fmt.Sprintf("a %s that exists at this altitude on the design day, at most Mach %g", v.BoundaryKind, maxMach))
		return Vertex{}, false
	}
	return Vertex{Altitude: alt.v, Speed: sp.v}, true
}

// ceiling reads the ceiling limit: an altitude above the boundary's lowest
// point.
func (d *doc) ceiling(lt *table, v *Vehicle) {
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
}

// minSpeed reads the lower speed limit, a speed with its kind.
func (d *doc) minSpeed(lt *table, v *Vehicle) {
	raw, ok := lt.get("min_speed")
	if !ok {
		return
	}
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
	gk := choose(gt, "speed_kind", false, speedKinds, speedKinds, known(atmos.ParseSpeedKind))
	if gk.ok {
		v.Grid.SpeedKind = gk.v
	}
	kindOK := !gk.unknown
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
