package report

import (
	"fmt"
	"io"
	"reflect"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
	"unsafe"
)

// csvTable is the CSV columns of record type T, derived once from its
// fields in order: a field's column is named by its `csv` tag when it has
// one, else by its JSON key, so that CSV columns and JSON keys cannot
// drift apart; "-" leaves a field out. A new field with a JSON tag is a
// new column.
//
// Each column keeps the kind and offset of its field, so that a row is
// formatted by appending each value into a byte buffer with no reflection
// and no boxing (cells.go); only a field of a kind not listed in cellKind
// is formatted through reflection.
type csvTable[T any] struct {
	names []string
	cols  []cell
}

func newCSVTable[T any]() *csvTable[T] {
	rt := reflect.TypeFor[T]()
	t := &csvTable[T]{}
	for k := 0; k < rt.NumField(); k++ {
		f := rt.Field(k)
		name, ok := f.Tag.Lookup("csv")
		if !ok {
			name, _, _ = strings.Cut(f.Tag.Get("json"), ",")
		}
		if name == "" || name == "-" {
			continue
		}
		t.names = append(t.names, name)
		t.cols = append(t.cols, newCell(f, k))
	}
	return t
}

// header returns the column names in order (a new slice).
func (t *csvTable[T]) header() []string { return append([]string(nil), t.names...) }

// column is the position of the named column, or -1.
func (t *csvTable[T]) column(name string) int {
	for k, n := range t.names {
		if n == name {
			return k
		}
	}
	return -1
}

// row formats r in column order into buf (reused) as strings, for a
// caller that edits cells before writing them.
func (t *csvTable[T]) row(r *T, buf []string) []string {
	buf = buf[:0]
	var b []byte
	for _, c := range t.cols {
		b = c.appendCSVValue(b[:0], unsafe.Pointer(r), r, nil)
		buf = append(buf, string(b))
	}
	return buf
}

// appendRow appends r as one CSV row, newline included; memo has one
// entry per column (kept from row to row).
func (t *csvTable[T]) appendRow(b []byte, r *T, memo []numMemo) []byte {
	p := unsafe.Pointer(r)
	for k, c := range t.cols {
		if k > 0 {
			b = append(b, ',')
		}
		if c.kind == cellString {
			// Most text columns repeat from row to row: whether a
			// text needs quotes is decided once per change.
			s, m := *(*string)(unsafe.Add(p, c.off)), &memo[k]
			if !m.textSet || s != m.text {
				m.text, m.textSet, m.quote = s, true, csvNeedsQuotes(s)
			}
			if m.quote {
				b = appendCSVQuoted(b, s)
			} else {
				b = append(b, s...)
			}
			continue
		}
		b = c.appendCSVValue(b, p, r, &memo[k])
	}
	return append(b, '\n')
}

// appendCSVValue appends the CSV form of column c of the record at p (r
// is the same record, for a field of another kind): a Num or float64 in
// shortest round-trip form ("" when it does not apply), a yes/no as true
// or false ("" when unknown, a nil *bool). Strings are appended as they
// are (appendRow quotes them). Numbers go through memo when it is not nil.
func (c cell) appendCSVValue(b []byte, p unsafe.Pointer, r any, memo *numMemo) []byte {
	var x float64
	switch c.kind {
	case cellNum:
		n := *(*Num)(unsafe.Add(p, c.off))
		if !n.Valid() {
			return b
		}
		x = float64(n)
	case cellFloat:
		x = *(*float64)(unsafe.Add(p, c.off))
	case cellString:
		return append(b, *(*string)(unsafe.Add(p, c.off))...)
	case cellInt:
		return strconv.AppendInt(b, int64(*(*int)(unsafe.Add(p, c.off))), 10)
	case cellBool:
		return strconv.AppendBool(b, *(*bool)(unsafe.Add(p, c.off)))
	case cellBoolPtr:
		if x := *(**bool)(unsafe.Add(p, c.off)); x != nil {
			return strconv.AppendBool(b, *x)
		}
		return b
	default:
		return append(b, fmt.Sprint(reflect.ValueOf(r).Elem().Field(c.field).Interface())...)
	}
	if memo == nil {
		return strconv.AppendFloat(b, x, 'g', -1, 64)
	}
	return appendNum(b, x, memo)
}

// appendCSVField appends s as one CSV field, quoted exactly where
// encoding/csv's Writer quotes (a field holding a comma, a quote, a
// carriage return or a newline, one that begins with a space, and `\.`),
// with quotes doubled; so the bytes are those of csv.Writer with its
// defaults (comma, no CRLF).
func appendCSVField(b []byte, s string) []byte {
	if !csvNeedsQuotes(s) {
		return append(b, s...)
	}
	return appendCSVQuoted(b, s)
}

// appendCSVQuoted appends s in quotes, its quotes doubled.
func appendCSVQuoted(b []byte, s string) []byte {
	b = append(b, '"')
	for {
		i := strings.IndexByte(s, '"')
		if i < 0 {
			break
		}
		b = append(b, s[:i+1]...)
		b = append(b, '"')
		s = s[i+1:]
	}
	b = append(b, s...)
	return append(b, '"')
}

func csvNeedsQuotes(s string) bool {
	if s == "" {
		return false
	}
	if s == `\.` {
		return true
	}
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '\n', '\r', '"', ',':
			return true
		}
	}
	r, _ := utf8.DecodeRuneInString(s)
	return unicode.IsSpace(r)
}

// csvWriter writes records of type T under the header of their table,
// through one reused buffer.
type csvWriter[T any] struct {
	t    *csvTable[T]
	w    io.Writer
	buf  []byte
	memo []numMemo
	err  error
}

// csvFlushAt is the buffered size at which a csvWriter writes out.
const csvFlushAt = 64 << 10

// newCSVWriter writes the header row of t to w (buffered).
func newCSVWriter[T any](w io.Writer, t *csvTable[T]) (*csvWriter[T], error) {
	cw := &csvWriter[T]{t: t, w: w, buf: make([]byte, 0, csvFlushAt+4<<10), memo: make([]numMemo, len(t.cols))}
	cw.buf = appendCSVRecord(cw.buf, t.names)
	return cw, nil
}

// appendCSVRecord appends cells as one CSV row.
func appendCSVRecord(b []byte, cells []string) []byte {
	for k, s := range cells {
		if k > 0 {
			b = append(b, ',')
		}
		b = appendCSVField(b, s)
	}
	return append(b, '\n')
}

// write writes r as one row; edit, when not nil, may change its cells
// (by column index) before they are written.
func (w *csvWriter[T]) write(r *T, edit func(cells []string)) error {
	if w.err != nil {
		return w.err
	}
	if edit != nil {
		cells := w.t.row(r, nil)
		edit(cells)
		w.buf = appendCSVRecord(w.buf, cells)
	} else {
		w.buf = w.t.appendRow(w.buf, r, w.memo)
	}
	if len(w.buf) >= csvFlushAt {
		w.out()
	}
	return w.err
}

// out writes the buffer out.
func (w *csvWriter[T]) out() {
	if w.err == nil && len(w.buf) > 0 {
		_, w.err = w.w.Write(w.buf)
	}
	w.buf = w.buf[:0]
}

// flush writes what is buffered and reports the first error.
func (w *csvWriter[T]) flush() error {
	w.out()
	return w.err
}
