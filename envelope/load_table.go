package envelope

import (
	"fmt"
	"slices"
	"sort"
	"strconv"
	"strings"
)

// table is one TOML table being read.
type table struct {
	d       *doc
	path    string
	m       map[string]any
	allowed []string
	// hint is added to unknown-key errors.
	hint string
}

func (d *doc) table(path string, m map[string]any, allowed []string) *table {
	return &table{d: d, path: path, m: m, allowed: allowed}
}

func (t *table) keyPath(key string) string { return joinPath(t.path, key) }

func (t *table) get(key string) (any, bool) {
	v, ok := t.m[key]
	return v, ok
}

func (t *table) has(key string) bool {
	_, ok := t.m[key]
	return ok
}

// finish reports every key of the table that the format does not define.
func (t *table) finish() {
	var unknown []string
	for k := range t.m {
		if !slices.Contains(t.allowed, k) {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	for _, k := range unknown {
		p := t.keyPath(k)
		exp := "one of: " + strings.Join(t.allowed, ", ")
		if t.path == "" {
			exp = "only the tables " + strings.Join(t.allowed, ", ")
		}
		if near := nearest(k, t.allowed); near != "" {
			exp = fmt.Sprintf("%q, or %s", near, exp)
		}
		if t.hint != "" {
			exp += " (" + t.hint + ")"
		}
		t.d.fail(p, display(p), "unknown key "+strconv.Quote(k), exp)
	}
}

// missing reports a required key that is absent.
func (t *table) missing(key, expected string) {
	p := t.keyPath(key)
	t.d.fail(p, display(p), "", expected)
}

// sub returns the sub-table key, or nil if absent (reported when required)
// or not a table.
func (t *table) sub(key string, allowed []string, required bool) *table {
	p := t.keyPath(key)
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.d.fail(p, display(p), "", "the ["+display(p)+"] table")
		}
		return nil
	}
	m, ok := raw.(map[string]any)
	if !ok {
		t.d.fail(p, display(p), describe(raw), "the ["+display(p)+"] table")
		return nil
	}
	return t.d.table(p, m, allowed)
}

// text reads a string value; absent gives "" (reported when required).
func (t *table) text(key string, required bool, expected string) (string, bool) {
	p := t.keyPath(key)
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.missing(key, expected)
		}
		return "", false
	}
	s, ok := raw.(string)
	if !ok || strings.TrimSpace(s) == "" {
		t.d.fail(p, display(p), describe(raw), expected)
		return "", false
	}
	return strings.TrimSpace(s), true
}

// freeText reads a free-text value (a name or a description) and refuses
// characters that could drive a terminal or spoof a screen (see
// UnsafeRune): names are one line of printable text.
func (t *table) freeText(key string, required bool, expected string) (string, bool) {
	s, ok := t.text(key, required, expected)
	if !ok {
		return s, false
	}
	if r, bad := firstUnsafe(s); bad {
		p := t.keyPath(key)
		t.d.fail(p, display(p), fmt.Sprintf("%s (%s U+%04X)", strconv.Quote(s), unsafeKind(r), r),
			expected+", printable text only (no control, line-break or bidirectional-text characters)")
		return "", false
	}
	return s, true
}

// boolean reads true or false.
func (t *table) boolean(key string, def bool) bool {
	raw, ok := t.get(key)
	if !ok {
		return def
	}
	b, ok := raw.(bool)
	if !ok {
		p := t.keyPath(key)
		t.d.fail(p, display(p), describe(raw), "true or false, without quotes")
		return def
	}
	return b
}

// quantity reads key as u; absent gives a qty with ok false (reported when
// required).
func (t *table) quantity(key string, u unit, required bool) qty {
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.missing(key, u.expect())
		}
		return qty{}
	}
	p := t.keyPath(key)
	return t.d.value(raw, p, display(p), u)
}

// span reads a two-element [low, high] range.
func (t *table) span(key string, u unit, required bool) (lo, hi qty) {
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.missing(key, u.expectRange())
		}
		return qty{}, qty{}
	}
	p := t.keyPath(key)
	arr, ok := raw.([]any)
	if !ok || len(arr) != 2 {
		t.d.fail(p, display(p), describe(raw), u.expectRange())
		return qty{}, qty{}
	}
	f := display(p)
	lo = t.d.value(arr[0], p+"[0]", f+" low", u)
	hi = t.d.value(arr[1], p+"[1]", f+" high", u)
	if lo.ok && hi.ok && lo.v > hi.v {
		t.d.fail(p, f, describe(raw)+" (low above high)", "the low value first")
		lo.ok, hi.ok = false, false
	}
	return lo, hi
}

// A field is one key of a table in a vehicle or facility file: its name,
// and how its value is read, checked and stored. A table declares its
// fields in the order docs/FORMAT.md lists them; they are read in that
// order (problems on one line keep it) and an unknown-key error lists
// them so, and MarshalVehicle and MarshalFacilities write them back from
// the same rows. Adding a key to a format is adding a row to its list.
type field interface {
	name() string
	read(t *table)
	// write writes the field back in SI units (tomlwrite.go) as a key of
	// the table at path table ("facility"), unless it is optional, has
	// no default and is not set.
	write(b *strings.Builder, table string)
}

// readFields reads each of fs from t, in order.
func readFields(t *table, fs []field) {
	for _, f := range fs {
		f.read(t)
	}
}

// fieldKeys lists the keys of fs, in order.
func fieldKeys(fs []field) []string {
	out := make([]string, len(fs))
	for i, f := range fs {
		out[i] = f.name()
	}
	return out
}

// quantityField is a key holding a quantity of unit that must lie within
// bound. A value read and within bound is stored in to; otherwise (absent,
// malformed or out of bound, the last two reported) to holds def.
type quantityField struct {
	key      string
	unit     unit
	required bool
	bound    Bound
	def      float64
	to       *float64
}

func (f quantityField) name() string { return f.key }

func (f quantityField) read(t *table) {
	q := t.quantity(f.key, f.unit, f.required)
	v := t.d.within(&q, f.bound)
	if !q.ok {
		v = f.def
	}
	*f.to = v
}

// rangeField is a key holding a [low, high] range of unit, each end
// within its own bound (lo, hi), stored in toLo and toHi (0 when not
// usable).
type rangeField struct {
	key        string
	unit       unit
	required   bool
	lo, hi     Bound
	toLo, toHi *float64
}

func (f rangeField) name() string { return f.key }

func (f rangeField) read(t *table) {
	lo, hi := t.span(f.key, f.unit, f.required)
	*f.toLo, *f.toHi = t.d.within(&lo, f.lo), t.d.within(&hi, f.hi)
}

// textField is a key holding one line of printable text (a name, a
// description), described by expected; to holds def when the key is
// absent or refused.
type textField struct {
	key      string
	required bool
	expected string
	def      string
	to       *string
}

func (f textField) name() string { return f.key }

func (f textField) read(t *table) {
	s, ok := t.freeText(f.key, f.required, f.expected)
	if !ok {
		s = f.def
	}
	*f.to = s
}

// boolField is a key holding true or false, def when absent or refused.
type boolField struct {
	key string
	def bool
	to  *bool
}

func (f boolField) name() string { return f.key }

func (f boolField) read(t *table) { *f.to = t.boolean(f.key, f.def) }

// keyFunc is a key read and written by functions of its own, for a check
// a bound cannot say (a ceiling above the boundary's lowest point, a speed
// with its kind).
type keyFunc struct {
	key string
	get func(t *table)
	put func(b *strings.Builder)
}

func (f keyFunc) name() string { return f.key }

func (f keyFunc) read(t *table) { f.get(t) }

// tableField is a key holding a table of its own with fields (made by
// subTable); an absent or refused table leaves them at their defaults.
type tableField struct {
	key    string
	fields []field
	keys   []string // fieldKeys(fields)
}

func subTable(key string, fields []field) tableField {
	return tableField{key: key, fields: fields, keys: fieldKeys(fields)}
}

func (f tableField) name() string { return f.key }

func (f tableField) read(t *table) {
	st := t.sub(f.key, f.keys, false)
	if st == nil {
		st = t.d.table(t.keyPath(f.key), nil, nil)
	}
	readFields(st, f.fields)
	st.finish()
}

// choice is what choose read: the thing a key's text names.
type choice[T any] struct {
	v T
	// ok: the key holds text that names one. unknown: text that names
	// none (reported). A key absent (reported when required) or not text
	// (reported) is neither.
	ok, unknown bool
}

// choose reads a key whose text names one of a few things (a speed kind,
// a medium) with parse; expected describes the key when it is absent or
// not text, wanted lists the names when the text names none of them.
func choose[T any](t *table, key string, required bool, expected, wanted string, parse func(string) (T, bool)) choice[T] {
	s, ok := t.text(key, required, expected)
	if !ok {
		return choice[T]{}
	}
	v, ok := parse(s)
	if !ok {
		p := t.keyPath(key)
		t.d.fail(p, display(p), strconv.Quote(s), wanted)
		return choice[T]{unknown: true}
	}
	return choice[T]{v: v, ok: true}
}

// known turns a parser that refuses with an error into one for choose.
func known[T any](parse func(string) (T, error)) func(string) (T, bool) {
	return func(s string) (T, bool) {
		v, err := parse(s)
		return v, err == nil
	}
}
