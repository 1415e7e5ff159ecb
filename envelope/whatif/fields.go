package whatif

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/units"
)

// Field names a what-if field: a row of the field table.
type Field int

// The fields, in the order the editor lists them: the settings, then the
// limits of the chosen facility.
const (
	Scale Field = iota
	DeltaT
	MachTol
	ReTol
	CompMach
	P0Max
	T0Min
	QMax
	// Rule is the facility's operating rule, a choice among the rules of
	// its medium (envelope.RuleKinds); RuleTemperature and RuleQ are the
	// value a fixed rule holds, fields only while that rule is chosen.
	Rule
	RuleTemperature
	RuleQ

	// FieldCount is the number of fields: range over it for each in order.
	FieldCount
)

// Origin is where a field's starting value comes from.
type Origin uint8

const (
	FromSettings Origin = iota // the built-in defaults, or the settings the caller gave
	FromVehicle                // the vehicle (its file, or the demo)
	FromFacility               // the facility (its file, or the demo)
)

// row declares one what-if field.
type row struct {
	// label names the field in the editor, in its errors and, for a
	// facility limit, in the header; waterLabel replaces it for a water
	// facility, which bounds static pressure and water temperature.
	label, waterLabel string
	// short names a setting in the header's what-if list ("" = label).
	short string
	// name is how a restored session names the change, in the dump
	// header and in its errors ("Mach tolerance"; "<facility> p0 max").
	name string
	// key is the session file's JSON key of the value (SI).
	key string
	// facility marks a limit of the chosen facility; the others are
	// settings of the whole evaluation.
	facility bool
	origin   Origin
	// grid marks a value of the flight side: a change rebuilds the grid.
	// Other settings re-solve every facility, a limit only its facility.
	grid bool

	// dim is the dimension the typed value is read in; bareSI and
	// bareCustomary are the units a bare number takes ("" = none).
	dim                   atmos.Dimension
	bareSI, bareCustomary string
	// words are typed for values that are no quantity ("fit" for the
	// scale 0: each facility's own sizing; "none" for q max 0: no limit).
	// An out-of-range refusal names them; a typed number is never read as
	// one (a typed 0 is refused).
	words []fieldWord
	// choice marks a field whose every value is a word, offered as a
	// list (the operating rule); nil for a field that takes a typed
	// value. Its limit checks a chosen value against the facility.
	choice *choiceDef
	// applies reports whether the field is one of facility f's now (nil:
	// always): the value a fixed rule holds is a field only while that
	// rule is chosen. A field that does not apply is not listed, saved
	// or shown as changed.
	applies func(f *envelope.Facility) bool
	// start is the value an input line starts from when the field holds
	// none yet (nil: the value held).
	start func(f *envelope.Facility) float64

	// get and set read and write the value (SI): settings in s, a limit
	// in f, the facility it belongs to.
	get func(s *envelope.Settings, f *envelope.Facility) float64
	set func(s *envelope.Settings, f *envelope.Facility, v float64)

	// A setting is read by its shared parser (envelope/bounds.go), which
	// bounds it, and a stored value is checked against bound (shown with
	// siUnit). A facility limit is read as a quantity of dim and checked,
	// typed or stored, by limit against the facility's own ranges.
	read   func(text string) (float64, error)
	bound  func() envelope.Bound
	siUnit string
	limit  func(f *envelope.Facility, found string, v float64) (float64, error)

	// validate refuses a value that the other settings rule out (nil:
	// none).
	validate func(s envelope.Settings, v float64) error
	// show writes the value in the units u; water is set for a limit of
	// a water facility.
	show func(u units.System, v float64, water bool) string
}

// fieldWord is a word a field takes for a value, and what it means.
type fieldWord struct {
	word  string
	value float64
	means string
}

// choiceDef is how a choice field's words map to its values.
type choiceDef struct {
	// offer lists the choices for facility f, in the order shown.
	offer func(f *envelope.Facility) []Choice
	// word is the word of value v, as the session file and the input
	// line write it (false for a value that is no choice).
	word func(v float64) (string, bool)
	// read reads a word, typed or stored.
	read func(s string) (float64, error)
	// needs is the field whose value choice v holds, if any (a fixed
	// rule's temperature or q).
	needs func(v float64) (Field, bool)
}

// Choice is one word a choice field offers, its value and what it means.
type Choice struct {
	Word  string
	Value float64
	Means string
}

// table is every what-if field, indexed by Field. Each value a user can
// change without editing files is one row: the editor lists, reads and
// applies it, the header lists its change, the session file stores it
// under its key and a restored session is checked by it. Adding a field is
// one row here (and, when it is new engine state, its envelope.Settings or
// Facility field).
var table = [FieldCount]row{
	Scale: {
		// The what-if scale overrides every facility's: the header says so.
		label: "model scale", short: "model scale (all facilities)", name: "model scale", key: "scale",
		words: []fieldWord{{word: "fit", value: 0, means: "each facility's own sizing"}},
		get:   func(s *envelope.Settings, _ *envelope.Facility) float64 { return s.Scale },
		set:   func(s *envelope.Settings, _ *envelope.Facility, v float64) { s.Scale = v },
		read:  envelope.ParseModelScale, bound: envelope.ModelScaleBound,
		show: func(_ units.System, v float64, _ bool) string { return scaleText(v) },
	},
	DeltaT: {
		label: "ΔT of day", short: "ΔT", name: "ΔT", key: "delta_t_K",
		origin: FromVehicle, grid: true,
		dim: atmos.TemperatureDelta, bareSI: "K", bareCustomary: "degF",
		get:  func(s *envelope.Settings, _ *envelope.Facility) float64 { return s.DeltaT },
		set:  func(s *envelope.Settings, _ *envelope.Facility, v float64) { s.DeltaT = v },
		read: envelope.ParseDeltaT, bound: envelope.DeltaTBound, siUnit: "K",
		show: func(u units.System, v float64, _ bool) string { return u.DeltaT(v) },
	},
	MachTol: {
		label: "Mach tolerance", short: "Mach tol", name: "Mach tolerance", key: "mach_tol",
		get:  func(s *envelope.Settings, _ *envelope.Facility) float64 { return s.MachTol },
		set:  func(s *envelope.Settings, _ *envelope.Facility, v float64) { s.MachTol = v },
		read: envelope.ParseMachTol, bound: envelope.MachTolBound,
		show: func(_ units.System, v float64, _ bool) string { return units.Sig(v, 3) },
	},
	ReTol: {
		label: "Re tolerance", short: "Re tol", name: "Reynolds tolerance", key: "re_tol",
		get:  func(s *envelope.Settings, _ *envelope.Facility) float64 { return s.ReTol },
		set:  func(s *envelope.Settings, _ *envelope.Facility, v float64) { s.ReTol = v },
		read: envelope.ParseReTol, bound: envelope.ReTolBound,
		show: func(_ units.System, v float64, _ bool) string { return units.Sig(v*100, 3) + " %" },
	},
	CompMach: {
		label: "compressibility M", name: "compressibility Mach", key: "compressibility_mach",
		grid: true,
		get:  func(s *envelope.Settings, _ *envelope.Facility) float64 { return s.CompressibilityMach },
		// The same threshold bounds incompressible flow in the regime
		// layer and the relaxation of Mach number in matching.
		set: func(s *envelope.Settings, _ *envelope.Facility, v float64) {
			s.CompressibilityMach = v
			s.Regimes.Incompressible = v
		},
		read: envelope.ParseCompressibilityMach, bound: envelope.CompressibilityMachBound,
		validate: func(s envelope.Settings, v float64) error {
			if v >= s.Regimes.Subsonic {
				return fmt.Errorf("compressibility Mach must stay below the subsonic bound %.2f", s.Regimes.Subsonic)
			}
			return nil
		},
		show: func(_ units.System, v float64, _ bool) string { return units.Sig(v, 3) },
	},
	P0Max: {
		label: "p0 max", waterLabel: "max static p", name: "p0 max", key: "p0_max_Pa",
		facility: true, origin: FromFacility,
		dim: atmos.Pressure, bareSI: "kPa", bareCustomary: "psi",
		get:   func(_ *envelope.Settings, f *envelope.Facility) float64 { return f.PressureMax() },
		set:   func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.SetPressureMax(v) },
		limit: envelope.CheckP0Max,
		show: func(u units.System, v float64, water bool) string {
			if water {
				return u.Pressure(v)
			}
			return u.Stagnation(v)
		},
	},
	T0Min: {
		label: "T0 min", waterLabel: "min water T", name: "T0 min", key: "t0_min_K",
		facility: true, origin: FromFacility,
		dim: atmos.Temperature, bareSI: "K", bareCustomary: "degF",
		get:   func(_ *envelope.Settings, f *envelope.Facility) float64 { return f.TemperatureMin() },
		set:   func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.SetTemperatureMin(v) },
		limit: envelope.CheckT0Min,
		show:  func(u units.System, v float64, _ bool) string { return u.Temp(v) },
	},
	QMax: {
		label: "q max", name: "q max", key: "q_max_Pa",
		facility: true, origin: FromFacility,
		dim: atmos.Pressure, bareSI: "kPa", bareCustomary: "psf",
		words: []fieldWord{{word: "none", value: 0, means: "no limit"}},
		get:   func(_ *envelope.Settings, f *envelope.Facility) float64 { return f.QMax },
		set:   func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.QMax = v },
		limit: func(_ *envelope.Facility, found string, v float64) (float64, error) {
			return envelope.CheckQMax(found, v)
		},
		show: func(u units.System, v float64, _ bool) string { return qText(u, v) },
	},
	Rule: {
		label: "operating rule", short: "rule", name: "operating rule", key: "rule",
		facility: true, origin: FromFacility,
		choice: &choiceDef{offer: ruleChoices, word: ruleWord, read: readRule, needs: ruleNeeds},
		// The standard rule is the one a facility that names none runs
		// under: both read as "warmest".
		get: func(_ *envelope.Settings, f *envelope.Facility) float64 { return float64(ruleKind(f)) },
		set: func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.Rule.Kind = envelope.RuleKind(v) },
		limit: func(f *envelope.Facility, _ string, v float64) (float64, error) {
			return v, envelope.CheckRuleKind(envelope.RuleKind(v), f)
		},
		show: func(_ units.System, v float64, _ bool) string { w, _ := ruleWord(v); return w },
	},
	RuleTemperature: {
		label: "fixed T0", waterLabel: "fixed water T", name: "rule temperature", key: "rule_temperature_K",
		facility: true, origin: FromFacility,
		dim: atmos.Temperature, bareSI: "K", bareCustomary: "degF",
		applies: func(f *envelope.Facility) bool { return ruleKind(f) == envelope.RuleFixedTemperature },
		// A new fixed temperature starts from the top of the range: the
		// standard rule's pick wherever the facility reaches flight there.
		start: func(f *envelope.Facility) float64 { return f.TemperatureMax() },
		get:   func(_ *envelope.Settings, f *envelope.Facility) float64 { return f.Rule.Temperature },
		set:   func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.Rule.Temperature = v },
		limit: envelope.CheckRuleTemperature,
		show:  func(u units.System, v float64, _ bool) string { return u.Temp(v) },
	},
	RuleQ: {
		label: "fixed q", name: "rule q", key: "rule_q_Pa",
		facility: true, origin: FromFacility,
		dim: atmos.Pressure, bareSI: "kPa", bareCustomary: "psf",
		applies: func(f *envelope.Facility) bool { return ruleKind(f) == envelope.RuleFixedQ },
		// A new fixed q starts from the facility's q max (none: typed).
		start: func(f *envelope.Facility) float64 { return f.QMax },
		get:   func(_ *envelope.Settings, f *envelope.Facility) float64 { return f.Rule.Q },
		set:   func(_ *envelope.Settings, f *envelope.Facility, v float64) { f.Rule.Q = v },
		limit: envelope.CheckRuleQ,
		show:  func(u units.System, v float64, _ bool) string { return u.Q(v) },
	},
}

// ruleKind is the kind of facility f's own rule, RuleWarmest where it
// names none.
func ruleKind(f *envelope.Facility) envelope.RuleKind {
	if f.Rule.Kind == envelope.RuleDefault {
		return envelope.RuleWarmest
	}
	return f.Rule.Kind
}

// ruleChoices are the rules a facility of f's medium may run under, with
// what each does there.
func ruleChoices(f *envelope.Facility) []Choice {
	water := IsWater(f)
	var out []Choice
	for _, k := range envelope.RuleKinds(f.Medium) {
		out = append(out, Choice{Word: k.String(), Value: float64(k), Means: ruleMeans(k, water)})
	}
	return out
}

// ruleMeans says in a few words what rule k does on a gas facility or a
// water tunnel.
func ruleMeans(k envelope.RuleKind, water bool) string {
	switch {
	case k == envelope.RuleWarmest && water:
		return "warmest water, then lowest speed (least speed and load)"
	case k == envelope.RuleWarmest:
		return "warmest T0, then lowest p0 (least coolant or heating)"
	case k == envelope.RuleLeastLoad:
		return "coldest T0 on the matching line: lowest p0, q and model load (needs balance data)"
	case k == envelope.RuleFixedTemperature && water:
		return "water temperature held at a value you give; only the speed moves"
	case k == envelope.RuleFixedTemperature:
		return "T0 held at a value you give; only p0 moves (fewest slow changes)"
	case k == envelope.RuleFixedQ:
		return "test-section q held at a value you give; Reynolds number by T0 alone"
	}
	return k.String()
}

// ruleWord is the name of the rule of value v.
func ruleWord(v float64) (string, bool) {
	k := envelope.RuleKind(v)
	if v != math.Trunc(v) || v < 0 || float64(k) != v || !k.ForGas() {
		return "", false
	}
	if k == envelope.RuleDefault {
		k = envelope.RuleWarmest
	}
	return k.String(), true
}

// readRule reads a rule's name (envelope.ParseRuleKind).
func readRule(s string) (float64, error) {
	k, err := envelope.ParseRuleKind(s)
	if err != nil {
		return 0, err
	}
	if k == envelope.RuleDefault {
		k = envelope.RuleWarmest
	}
	return float64(k), nil
}

// ruleNeeds is the field of the value rule v holds.
func ruleNeeds(v float64) (Field, bool) {
	switch envelope.RuleKind(v) {
	case envelope.RuleFixedTemperature:
		return RuleTemperature, true
	case envelope.RuleFixedQ:
		return RuleQ, true
	}
	return 0, false
}

// ratioSlack is the rounding allowed between a scale and the ratio it is
// shown as (1/20 read back from "1:20").
const ratioSlack = 1e-9

// scaleText shows a model scale: as a ratio "1:40" where it is one to
// three significant digits (as models are made), else as a number; 0 is
// each facility's own sizing.
func scaleText(s float64) string {
	if !(s > 0) {
		return "facility sizing"
	}
	if s < 1 {
		n, _ := strconv.ParseFloat(strconv.FormatFloat(1/s, 'g', 3, 64), 64)
		if math.Abs(1/n-s) <= ratioSlack*s {
			return "1:" + strconv.FormatFloat(n, 'f', -1, 64)
		}
	}
	return units.Sig(s, 4)
}

// qText shows a q max; 0 is no limit.
func qText(u units.System, q float64) string {
	if q > 0 {
		return u.Q(q)
	}
	return "none"
}

// row is the field's row of the table.
func (f Field) row() *row { return &table[f] }

// Key is the field's key in the session file (its value is stored in SI).
func (f Field) Key() string { return f.row().key }

// Name is how a restored session names the change, in the dump header and
// in its errors ("Mach tolerance"; a facility limit is prefixed with the
// facility's name: "<facility> p0 max").
func (f Field) Name() string { return f.row().name }

// Facility reports whether the field is a limit of one facility; the
// others are settings of the whole evaluation.
func (f Field) Facility() bool { return f.row().facility }

// Grid reports whether the field is a value of the flight side: a change
// rebuilds the grid. A change of another setting re-solves every facility,
// a change of a limit only its facility.
func (f Field) Grid() bool { return f.row().grid }

// Origin is where the field's starting value comes from.
func (f Field) Origin() Origin { return f.row().origin }

// Get reads the field's value (SI): a setting from s, a limit from fac,
// the facility it belongs to (the other may be nil).
func (f Field) Get(s *envelope.Settings, fac *envelope.Facility) float64 { return f.row().get(s, fac) }

// Set writes the field's value (SI) into s or fac. It does not check it:
// read a value with Parse or Check first.
func (f Field) Set(s *envelope.Settings, fac *envelope.Facility, v float64) { f.row().set(s, fac, v) }

// Label names the field; water facilities bound static pressure and water
// temperature instead of p0 and T0.
func (f Field) Label(water bool) string {
	d := f.row()
	if water && d.waterLabel != "" {
		return d.waterLabel
	}
	return d.label
}

// HeaderLabel is the field's name in the header's what-if list.
func (f Field) HeaderLabel(water bool) string {
	if d := f.row(); d.short != "" {
		return d.short
	}
	return f.Label(water)
}

// BareUnit is the unit assumed when a number is typed without one, in the
// unit system u ("" for dimensionless fields).
func (f Field) BareUnit(u units.System) string {
	if u == units.Customary {
		return f.row().bareCustomary
	}
	return f.row().bareSI
}

// Show writes a value of the field in the units u; water is set for a
// limit of a water facility.
func (f Field) Show(u units.System, v float64, water bool) string { return f.row().show(u, v, water) }

// EditText is the text an input line starts with for the value v: what
// Show writes, in a form Parse reads back (the field's word, degF for °F).
func (f Field) EditText(u units.System, v float64, water bool) string {
	if w, ok := f.wordFor(v); ok {
		return w.word
	}
	if w, ok := f.Word(v); ok {
		return w
	}
	return strings.ReplaceAll(f.Show(u, v, water), "°F", "degF")
}

// IsChoice reports whether the field's every value is a word offered as
// a list (Choices): the operating rule.
func (f Field) IsChoice() bool { return f.row().choice != nil }

// Choices lists the words a choice field offers for facility fac, in the
// order shown, with what each means there (nil for other fields, or
// without a facility).
func (f Field) Choices(fac *envelope.Facility) []Choice {
	if c := f.row().choice; c != nil && fac != nil {
		return c.offer(fac)
	}
	return nil
}

// Word is the word of a choice field's value v, as the session file
// stores it ("least load"); false for other fields and for a value that
// is no choice.
func (f Field) Word(v float64) (string, bool) {
	if c := f.row().choice; c != nil {
		return c.word(v)
	}
	return "", false
}

// Needs is the field whose value the choice v holds, if any: a fixed
// rule's temperature (RuleTemperature) or q (RuleQ). Choosing v sets both
// at once.
func (f Field) Needs(v float64) (Field, bool) {
	if c := f.row().choice; c != nil && c.needs != nil {
		return c.needs(v)
	}
	return 0, false
}

// Applies reports whether the field is one of facility fac's now: the
// value a fixed rule holds is a field only while that rule is chosen.
// Every other field applies (a facility limit needs a facility).
func (f Field) Applies(fac *envelope.Facility) bool {
	d := f.row()
	if d.applies == nil {
		return true
	}
	return fac != nil && d.applies(fac)
}

// StartValue is the value an input line for the field starts from: the
// value held, or where a field holds none yet (a fixed rule's
// temperature or q before that rule was chosen) a value in the
// facility's range to start from (0: none, the line starts empty).
func (f Field) StartValue(s *envelope.Settings, fac *envelope.Facility) float64 {
	d := f.row()
	v := d.get(s, fac)
	if d.start != nil && fac != nil && !(v > 0) {
		v = d.start(fac)
	}
	return v
}

// wordFor is the word the field takes for the value v, if any.
func (f Field) wordFor(v float64) (fieldWord, bool) {
	for _, w := range f.row().words {
		if w.value == v {
			return w, true
		}
	}
	return fieldWord{}, false
}

// wordHint is what an out-of-range refusal adds about the field's words
// ("" for none): `or the word "fit" for each facility's own sizing`.
func (f Field) wordHint() string {
	var parts []string
	for _, w := range f.row().words {
		parts = append(parts, fmt.Sprintf("%q for %s", w.word, w.means))
	}
	switch len(parts) {
	case 0:
		return ""
	case 1:
		return "or the word " + parts[0]
	}
	return "or one of the words " + strings.Join(parts, ", ")
}

// IsWater reports whether fac is a water facility (false for nil).
func IsWater(fac *envelope.Facility) bool { return fac != nil && fac.Medium == envelope.MediumWater }

// MaxEntry is the longest text the input line takes for a value, in
// characters: far beyond any value written out in full, yet a paste of a
// whole file is refused with a message rather than parsed.
const MaxEntry = 1024

// Parse reads the text typed for the field, with the parsers and bounds
// the files and the command line use (envelope/bounds.go). A bare number
// takes the field's unit in the unit system u. The model scale
// takes the forms a file takes ("0.05", "1/20", "1:20", "5 %") or the word
// "fit" for each facility's own sizing; q max takes a pressure or the word
// "none". Both words return 0, as the settings store them; a typed 0 is
// refused, not read as either. The facility limits (p0 max, T0 min, q max)
// are checked against fac, the facility they are for, as its file's ranges
// are.
func (f Field) Parse(text string, u units.System, fac *envelope.Facility) (float64, error) {
	d := f.row()
	fail := func(err error) (float64, error) { return 0, labelled(f.Label(IsWater(fac)), err) }
	t := strings.TrimSpace(text)
	if t == "" {
		return fail(errors.New("empty value"))
	}
	if n := utf8.RuneCountInString(t); n > MaxEntry {
		return fail(fmt.Errorf("the entry is %d characters long, expected at most %d", n, MaxEntry))
	}
	for _, w := range d.words {
		if strings.EqualFold(t, w.word) {
			return w.value, nil
		}
	}
	if d.facility && fac == nil {
		return fail(errors.New("choose a facility first"))
	}
	if d.choice != nil {
		v, err := d.choice.read(t)
		if err == nil {
			v, err = d.limit(fac, strconv.Quote(t), v)
		}
		if err != nil {
			return fail(err)
		}
		return v, nil
	}
	if unit := f.BareUnit(u); unit != "" {
		if _, err := strconv.ParseFloat(t, 64); err == nil {
			t += " " + unit
		}
	}
	var v float64
	var err error
	if d.facility {
		v, err = atmos.ParseQuantity(t, d.dim)
		if err == nil {
			v, err = d.limit(fac, strconv.Quote(t), v)
		}
	} else {
		v, err = d.read(t)
	}
	if hint := f.wordHint(); hint != "" && errors.Is(err, envelope.ErrOutOfBounds) {
		err = fmt.Errorf("%w, %s", err, hint)
	}
	if err != nil {
		return fail(err)
	}
	return v, nil
}

// Check refuses a stored value (a session's, in SI) that Parse would
// refuse typed: the same bounds, with 0 meaning each facility's own
// sizing for the scale and no limit for q max, as the settings store them.
// fac is the facility a limit is for (nil for the other fields).
func (f Field) Check(v float64, fac *envelope.Facility) (float64, error) {
	d := f.row()
	var err error
	_, isWord := f.wordFor(v)
	switch {
	case isWord:
		return v, nil
	case d.facility && fac == nil:
		err = errors.New("no facility")
	case d.choice != nil:
		if _, ok := d.choice.word(v); !ok {
			err = fmt.Errorf("found %s, expected one of %s", strconv.FormatFloat(v, 'g', 6, 64), choiceWords(d.choice.offer(fac)))
		} else {
			v, err = d.limit(fac, "", v)
		}
	case d.facility:
		v, err = d.limit(fac, "", v)
	default:
		found := strconv.FormatFloat(v, 'g', 6, 64)
		if d.siUnit != "" {
			found += " " + d.siUnit
		}
		err = d.bound().Check(found, v)
	}
	if err != nil {
		return 0, labelled(f.Label(IsWater(fac)), err)
	}
	return v, nil
}

// labelled prefixes err with the field's label, unless it names its
// field itself: the engine's rule errors begin "operating rule".
func labelled(label string, err error) error {
	if _, ok := err.(*envelope.RuleError); ok {
		return err
	}
	return fmt.Errorf("%s: %w", label, err)
}

// choiceWords lists the words of cs: "warmest", "least load".
func choiceWords(cs []Choice) string {
	q := make([]string, len(cs))
	for k, c := range cs {
		q[k] = strconv.Quote(c.Word)
	}
	return strings.Join(q, ", ")
}

// Validate refuses a value of the field that the settings s rule out.
func (f Field) Validate(s envelope.Settings, v float64) error {
	if d := f.row(); d.validate != nil {
		return d.validate(s, v)
	}
	return nil
}

// ByKey is the field stored under a session key, among the settings
// (facility false) or the facility limits, matched as encoding/json
// matches struct keys (case folded); ok is false for none.
func ByKey(key string, facility bool) (Field, bool) {
	for f := range FieldCount {
		if d := f.row(); d.facility == facility && strings.EqualFold(d.key, key) {
			return f, true
		}
	}
	return 0, false
}

// Keys lists the session keys of the settings (facility false) or of the
// facility limits, for error messages: "p0_max_Pa, t0_min_K, q_max_Pa".
func Keys(facility bool) string {
	var keys []string
	for f := range FieldCount {
		if d := f.row(); d.facility == facility {
			keys = append(keys, d.key)
		}
	}
	return strings.Join(keys, ", ")
}
