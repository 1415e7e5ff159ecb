package envelope

import (
	"fmt"
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
		if !contains(t.allowed, k) {
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

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
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
	p := t.keyPath(key)
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.missing(key, u.expect())
		}
		return qty{path: p, field: display(p)}
	}
	return t.d.value(raw, p, display(p), u)
}

// span reads a two-element [low, high] range.
func (t *table) span(key string, u unit, required bool) (lo, hi qty) {
	p := t.keyPath(key)
	expected := fmt.Sprintf("a range [low, high] of two values, each %s", u.expect())
	raw, ok := t.get(key)
	if !ok {
		if required {
			t.missing(key, expected)
		}
		return qty{path: p}, qty{path: p}
	}
	arr, ok := raw.([]any)
	if !ok || len(arr) != 2 {
		t.d.fail(p, display(p), describe(raw), expected)
		return qty{path: p}, qty{path: p}
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
