package report

import (
	"encoding/csv"
	"fmt"
	"io"
	"reflect"
	"strconv"
	"strings"
)

// csvTable is the CSV columns of record type T, derived once from its
// fields in order: a field's column is named by its `csv` tag when it has
// one, else by its JSON key, so that CSV columns and JSON keys cannot
// drift apart; "-" leaves a field out. A new field with a JSON tag is a
// new column.
type csvTable[T any] struct {
	names  []string
	fields []int // field index per column
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
		t.fields = append(t.fields, k)
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

// row formats r in column order into buf (reused).
func (t *csvTable[T]) row(r *T, buf []string) []string {
	v := reflect.ValueOf(r).Elem()
	buf = buf[:0]
	for _, k := range t.fields {
		buf = append(buf, csvCell(v.Field(k).Interface()))
	}
	return buf
}

// csvCell is the CSV form of one value: a Num or float64 in shortest
// round-trip form ("" when it does not apply), a yes/no as true or false
// ("" when unknown, a nil *bool).
func csvCell(x any) string {
	switch x := x.(type) {
	case Num:
		return x.String()
	case float64:
		return strconv.FormatFloat(x, 'g', -1, 64)
	case string:
		return x
	case int:
		return strconv.Itoa(x)
	case bool:
		return strconv.FormatBool(x)
	case *bool:
		if x == nil {
			return ""
		}
		return strconv.FormatBool(*x)
	}
	return fmt.Sprint(x)
}

// csvWriter writes records of type T under the header of their table.
type csvWriter[T any] struct {
	t   *csvTable[T]
	cw  *csv.Writer
	buf []string
}

// newCSVWriter writes the header row of t to w.
func newCSVWriter[T any](w io.Writer, t *csvTable[T]) (*csvWriter[T], error) {
	cw := csv.NewWriter(w)
	if err := cw.Write(t.names); err != nil {
		return nil, err
	}
	return &csvWriter[T]{t: t, cw: cw, buf: make([]string, 0, len(t.names))}, nil
}

// write writes r as one row; edit, when not nil, may change its cells
// (by column index) before they are written.
func (w *csvWriter[T]) write(r *T, edit func(cells []string)) error {
	w.buf = w.t.row(r, w.buf)
	if edit != nil {
		edit(w.buf)
	}
	return w.cw.Write(w.buf)
}

// flush writes what is buffered and reports the first error.
func (w *csvWriter[T]) flush() error {
	w.cw.Flush()
	return w.cw.Error()
}
