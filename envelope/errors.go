package envelope

import (
	"fmt"
	"sort"
	"strconv"
	"strings"
)

// FileError is one problem found in a vehicle or facility file. It names the
// file, the line (0 when no line applies), the field, the value found as it
// was written, and what was expected instead.
type FileError struct {
	File     string
	Line     int
	Field    string
	Found    string
	Expected string
}

// Error formats the problem as "file:line: field: found X, expected Y".
// Parts that do not apply are left out: a missing field reads
// "field: missing, expected Y". Every part passes through CleanText: the
// file name, a key name and a value found come from outside and may hold
// control characters.
func (e FileError) Error() string {
	var b strings.Builder
	b.WriteString(CleanText(e.File))
	if e.Line > 0 {
		b.WriteByte(':')
		b.WriteString(strconv.Itoa(e.Line))
	}
	b.WriteString(": ")
	if e.Field != "" {
		b.WriteString(CleanText(e.Field))
		b.WriteString(": ")
	}
	if e.Found == "" {
		b.WriteString("missing")
	} else {
		b.WriteString("found ")
		b.WriteString(CleanText(e.Found))
	}
	if e.Expected != "" {
		b.WriteString(", expected ")
		b.WriteString(CleanText(e.Expected))
	}
	return b.String()
}

// FileErrors is every problem found in one or more files, in file and line
// order. Loading reports all of them at once rather than stopping at the
// first.
type FileErrors []FileError

// Error joins the problems one per line.
func (es FileErrors) Error() string {
	lines := make([]string, len(es))
	for i, e := range es {
		lines[i] = e.Error()
	}
	return strings.Join(lines, "\n")
}

// Unwrap gives each problem as its own error, so errors.As can reach a
// single FileError.
func (es FileErrors) Unwrap() []error {
	out := make([]error, len(es))
	for i, e := range es {
		out[i] = e
	}
	return out
}

// sortErrors puts problems in file, then line order; problems on the same
// line keep the order they were found in.
func sortErrors(es FileErrors) {
	sort.SliceStable(es, func(i, j int) bool {
		if es[i].File != es[j].File {
			return es[i].File < es[j].File
		}
		return es[i].Line < es[j].Line
	})
}

// describe renders a decoded TOML value for the "found" part of an error.
func describe(v any) string {
	switch x := v.(type) {
	case nil:
		return ""
	case string:
		return strconv.Quote(x)
	case int64:
		return strconv.FormatInt(x, 10)
	case float64:
		return strconv.FormatFloat(x, 'g', -1, 64)
	case bool:
		return strconv.FormatBool(x)
	case map[string]any:
		return "a table"
	case []map[string]any:
		return fmt.Sprintf("an array of %d tables", len(x))
	case []any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = describe(e)
		}
		s := "[" + strings.Join(parts, ", ") + "]"
		if len(s) > 80 {
			return fmt.Sprintf("an array of %d values", len(x))
		}
		return s
	}
	return fmt.Sprintf("%v", v)
}
