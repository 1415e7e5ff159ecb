package report

import (
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"
	"unicode/utf8"
	"unsafe"
)

// cellKind is the kind of a record field the fast formatters know.
type cellKind uint8

const (
	cellOther   cellKind = iota // formatted through reflection
	cellNum                     // Num
	cellFloat                   // float64
	cellString                  // string
	cellInt                     // int
	cellBool                    // bool
	cellBoolPtr                 // *bool
)

// cell is one column of a record table: the kind of its field, where the
// field lies in the record and its index (for cellOther).
type cell struct {
	kind  cellKind
	off   uintptr
	field int
}

// numMemo keeps the last number a column formatted and its text: along a
// grid row the altitude's columns repeat, and the settings' columns repeat
// throughout a map, so most of them are copied instead of formatted again.
// For a text column it keeps the last text and whether CSV quotes it.
type numMemo struct {
	bits uint64
	set  bool
	n    uint8
	b    [24]byte // the longest shortest form of a float64 has 24 bytes

	text    string
	textSet bool
	quote   bool
}

// appendNum appends x in shortest round-trip form ('g', as
// strconv.FormatFloat(x, 'g', -1, 64) writes it), through memo m.
func appendNum(b []byte, x float64, m *numMemo) []byte {
	bits := math.Float64bits(x)
	if m.set && m.bits == bits {
		return append(b, m.b[:m.n]...)
	}
	start := len(b)
	b = strconv.AppendFloat(b, x, 'g', -1, 64)
	m.bits, m.set, m.n = bits, true, uint8(copy(m.b[:], b[start:]))
	return b
}

var (
	numType     = reflect.TypeFor[Num]()
	float64Type = reflect.TypeFor[float64]()
	stringType  = reflect.TypeFor[string]()
	intType     = reflect.TypeFor[int]()
	boolType    = reflect.TypeFor[bool]()
	boolPtrType = reflect.TypeFor[*bool]()
)

// newCell is the column of field f (field number k of its struct). Only
// exact types count: a named type over float64 other than Num is
// cellOther, as its own formatting may differ.
func newCell(f reflect.StructField, k int) cell {
	c := cell{off: f.Offset, field: k}
	switch f.Type {
	case numType:
		c.kind = cellNum
	case float64Type:
		c.kind = cellFloat
	case stringType:
		c.kind = cellString
	case intType:
		c.kind = cellInt
	case boolType:
		c.kind = cellBool
	case boolPtrType:
		c.kind = cellBoolPtr
	}
	return c
}

// jsonTable writes records of type T as JSON objects with the bytes
// encoding/json's Marshal gives them, from a column table built once: a
// field's key is its JSON tag's name (the field's name without one); "-"
// and unexported fields are left out. Every field must be of a kind the
// table knows (a float64 is not: a record holds a Num, which writes null
// where encoding/json would fail) and its tag may carry no option:
// newJSONTable panics otherwise (at initialisation, which the tests run).
type jsonTable[T any] struct {
	keys [][]byte // `{"key":` for the first column, `,"key":` for the others
	cols []cell
}

func newJSONTable[T any]() *jsonTable[T] {
	rt := reflect.TypeFor[T]()
	t := &jsonTable[T]{}
	for k := 0; k < rt.NumField(); k++ {
		f := rt.Field(k)
		if !f.IsExported() {
			continue
		}
		tag := f.Tag.Get("json")
		name, opts, hasOpts := strings.Cut(tag, ",")
		if tag == "-" {
			continue
		}
		if hasOpts || f.Anonymous {
			panic(fmt.Sprintf("report: json table of %s: field %s: options %q or embedding not supported", rt, f.Name, opts))
		}
		if name == "" {
			name = f.Name
		}
		c := newCell(f, k)
		if c.kind == cellOther || c.kind == cellFloat {
			panic(fmt.Sprintf("report: json table of %s: field %s of type %s not supported", rt, f.Name, f.Type))
		}
		sep := byte(',')
		if len(t.keys) == 0 {
			sep = '{'
		}
		key := appendJSONString([]byte{sep}, name)
		t.keys = append(t.keys, append(key, ':'))
		t.cols = append(t.cols, c)
	}
	return t
}

// appendRecord appends r as one JSON object; memo has one entry per
// column (kept from record to record).
func (t *jsonTable[T]) appendRecord(b []byte, r *T, memo []numMemo) []byte {
	p := unsafe.Pointer(r)
	for k, c := range t.cols {
		b = append(b, t.keys[k]...)
		q := unsafe.Add(p, c.off)
		switch c.kind {
		case cellNum:
			if x := *(*Num)(q); x.Valid() {
				b = appendNum(b, float64(x), &memo[k])
			} else {
				b = append(b, "null"...)
			}
		case cellString:
			b = appendJSONString(b, *(*string)(q))
		case cellInt:
			b = strconv.AppendInt(b, int64(*(*int)(q)), 10)
		case cellBool:
			b = strconv.AppendBool(b, *(*bool)(q))
		case cellBoolPtr:
			if x := *(**bool)(q); x != nil {
				b = strconv.AppendBool(b, *x)
			} else {
				b = append(b, "null"...)
			}
		}
	}
	if len(t.cols) == 0 {
		b = append(b, '{')
	}
	return append(b, '}')
}

const jsonHex = "0123456789abcdef"

// appendJSONString appends s as a JSON string with encoding/json's
// escapes (HTML-safe, as Marshal writes): \" \\ \b \f \n \r \t, \u00XX for
// the other control characters and for < > &, \ufffd for each byte that is
// not UTF-8, and \u2028, \u2029 for the line and paragraph separators.
func appendJSONString(b []byte, s string) []byte {
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); {
		if c := s[i]; c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' && c != '<' && c != '>' && c != '&' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '\\', '"':
				b = append(b, '\\', c)
			case '\b':
				b = append(b, '\\', 'b')
			case '\f':
				b = append(b, '\\', 'f')
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', jsonHex[c>>4], jsonHex[c&0xF])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			b = append(b, s[start:i]...)
			b = append(b, '\\', 'u', '2', '0', '2', jsonHex[r&0xF])
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}
