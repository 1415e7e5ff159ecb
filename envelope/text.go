package envelope

import (
	"fmt"
	"io"
	"io/fs"
	"strings"
	"unicode/utf8"
)

// Text from files, file names, sessions and the command line is hostile:
// a name holding ESC [ 2 J clears the terminal, an OSC sequence retitles
// it, a carriage return or a right-to-left override redraws a matrix row.
// The loaders refuse such characters in names (the first wall); CleanText
// is the second, applied to every outside string before it reaches a
// terminal, a text, CSV or JSON output, a picture or an error message.

// UnsafeRune reports whether r must never reach a terminal or an output
// raw: a C0 control (U+0000–U+001F, tab and newline included), DEL, a C1
// control (U+0080–U+009F), a bidirectional-text control (U+061C, U+200E,
// U+200F, U+202A–U+202E, U+2066–U+2069), the line and paragraph
// separators U+2028 and U+2029. Bytes that are not UTF-8 are unsafe too;
// CleanText escapes them.
func UnsafeRune(r rune) bool {
	switch {
	case r < 0x20, r >= 0x7f && r <= 0x9f:
		return true
	case r == 0x061c, r == 0x200e, r == 0x200f, r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
		return true
	case r == 0x2028, r == 0x2029:
		return true
	}
	return false
}

// unsafeKind names the kind of an unsafe rune for error messages.
func unsafeKind(r rune) string {
	switch {
	case r < 0x20 || r >= 0x7f && r <= 0x9f:
		return "control character"
	case r == 0x2028 || r == 0x2029:
		return "line-break character"
	case r == utf8.RuneError:
		return "byte that is not UTF-8"
	}
	return "bidirectional-text control"
}

// firstUnsafe returns the first unsafe rune of s and whether there is
// one; a byte that is not UTF-8 gives utf8.RuneError.
func firstUnsafe(s string) (rune, bool) {
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		if UnsafeRune(r) || r == utf8.RuneError && n == 1 {
			return r, true
		}
		i += n
	}
	return 0, false
}

// CleanText returns s with every unsafe rune (see UnsafeRune) replaced by
// a visible escape: \n, \t, \r for those, \x1b for the other C0 controls
// and DEL, \u009b for C1 controls and \u202e for the other characters, and
// \xff for each byte that is not UTF-8. Text without such characters comes
// back unchanged. The result is one line of printable text.
func CleanText(s string) string { return clean(s, false) }

// CleanLines is CleanText that keeps newlines and tabs, for messages of
// several lines (every other unsafe rune is escaped).
func CleanLines(s string) string { return clean(s, true) }

func clean(s string, keepLines bool) string {
	safe := func(r rune) bool { return !UnsafeRune(r) || keepLines && (r == '\n' || r == '\t') }
	i := 0
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && n == 1 || !safe(r) {
			break
		}
		i += n
	}
	if i == len(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case safe(r):
			b.WriteString(s[i : i+n])
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\t':
			b.WriteString(`\t`)
		case r == '\r':
			b.WriteString(`\r`)
		case r < 0x80:
			fmt.Fprintf(&b, `\x%02x`, r)
		default:
			fmt.Fprintf(&b, `\u%04x`, r)
		}
		i += n
	}
	return b.String()
}

// CleanWriter passes every Write through CleanLines, so that messages
// built from outside text cannot drive the terminal they are printed on.
// It suits text that is meant to hold no escape sequences at all (error
// messages and notes); a Write split inside a UTF-8 sequence shows the
// split bytes escaped.
type CleanWriter struct{ W io.Writer }

// Write writes CleanLines(p) and reports all of p as written when that
// succeeds.
func (c CleanWriter) Write(p []byte) (int, error) {
	s := CleanLines(string(p))
	if _, err := io.WriteString(c.W, s); err != nil {
		return 0, err
	}
	return len(p), nil
}

// cleanPathError makes the path inside a *fs.PathError safe to print.
func cleanPathError(err error) error {
	if pe, ok := err.(*fs.PathError); ok {
		return &fs.PathError{Op: pe.Op, Path: CleanText(pe.Path), Err: pe.Err}
	}
	return err
}

// CleanVehicle returns v with its name, reference-length words and source
// passed through CleanText: v itself when they are already clean (as
// every loaded vehicle's are), otherwise a copy.
func CleanVehicle(v *Vehicle) *Vehicle {
	if v == nil {
		return nil
	}
	name, ref, src := CleanText(v.Name), CleanText(v.RefLengthName), CleanText(v.Source)
	if name == v.Name && ref == v.RefLengthName && src == v.Source {
		return v
	}
	c := *v
	c.Name, c.RefLengthName, c.Source = name, ref, src
	return &c
}

// CleanFacilities returns fs with every name, class and source passed
// through CleanText: fs itself when they are already clean, otherwise a
// copy.
func CleanFacilities(fs []Facility) []Facility {
	var out []Facility
	for k, f := range fs {
		name, class, src := CleanText(f.Name), CleanText(f.Class), CleanText(f.Source)
		if name == f.Name && class == f.Class && src == f.Source {
			continue
		}
		if out == nil {
			out = append([]Facility(nil), fs...)
		}
		out[k].Name, out[k].Class, out[k].Source = name, class, src
	}
	if out == nil {
		return fs
	}
	return out
}

// CleanAll returns names with each passed through CleanText (a new
// slice).
func CleanAll(names []string) []string {
	out := make([]string, len(names))
	for k, s := range names {
		out[k] = CleanText(s)
	}
	return out
}
