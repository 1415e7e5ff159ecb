package envelope

import (
	"strconv"
	"strings"
)

// lineIndex maps the path of every key, table and array element of a TOML
// document to the line it starts on. Paths are dotted key names with
// 0-based element numbers in brackets: "facility[1].model.scale",
// "envelope.boundary[3][0]". The BurntSushi/toml decoder keeps key
// positions private, so the index comes from a small scan of the source
// text. The scan runs only on text the decoder has already accepted, but it
// never panics or loops on any input.
type lineIndex map[string]int

// line returns the line of path, or of its nearest enclosing table or
// array when the path itself is absent (a missing key is reported at its
// table's header). It returns 0 when nothing encloses the path.
func (ix lineIndex) line(path string) int {
	for path != "" {
		if n, ok := ix[path]; ok {
			return n
		}
		path = parentPath(path)
	}
	return 0
}

// parentPath strips the last key or element number from a path.
func parentPath(path string) string {
	if strings.HasSuffix(path, "]") {
		if i := strings.LastIndexByte(path, '['); i >= 0 {
			return path[:i]
		}
	}
	if i := strings.LastIndexByte(path, '.'); i >= 0 {
		return path[:i]
	}
	return ""
}

// indexLines scans TOML source text and records where each path starts.
func indexLines(src string) lineIndex {
	s := &lineScanner{tomlCursor: tomlCursor{src: src, line: 1}, idx: lineIndex{}, arrays: map[string]int{}}
	s.run()
	return s.idx
}

type lineScanner struct {
	tomlCursor
	idx lineIndex
	// arrays counts the elements seen so far of each array of tables,
	// keyed by its resolved path.
	arrays map[string]int
	// table is the resolved path of the current table ("" at top level).
	table string
}

func (s *lineScanner) run() {
	for {
		s.skipBlank()
		if s.eof() {
			return
		}
		start := s.i
		if s.src[s.i] == '[' {
			s.header()
		} else {
			s.keyValue(s.table, true)
		}
		if s.i == start { // not TOML this scan understands; move on
			s.skipLine()
		}
	}
}

// header reads a [table] or [[array]] header line.
func (s *lineScanner) header() {
	line := s.line
	isArray := s.peek(1) == '['
	s.i++
	if isArray {
		s.i++
	}
	keys := s.key()
	if len(keys) == 0 { // "[" or "[[" at the end of the text
		s.skipLine()
		return
	}
	var path string
	if isArray {
		path = joinPath(s.resolve(keys[:len(keys)-1]), keys[len(keys)-1])
		if _, ok := s.idx[path]; !ok {
			s.idx[path] = line
		}
		n := s.arrays[path]
		s.arrays[path] = n + 1
		path += "[" + strconv.Itoa(n) + "]"
	} else {
		path = s.resolve(keys)
	}
	s.table = path
	if _, ok := s.idx[path]; !ok {
		s.idx[path] = line
	}
	s.skipLine()
}

// resolve turns a header's dotted key into a path, adding the current
// element number of every array of tables on the way (a [facility.model]
// header belongs to the latest [[facility]]).
func (s *lineScanner) resolve(keys []string) string {
	path := ""
	for _, k := range keys {
		path = joinPath(path, k)
		if n, ok := s.arrays[path]; ok && n > 0 {
			path += "[" + strconv.Itoa(n-1) + "]"
		}
	}
	return path
}

func joinPath(parent, key string) string {
	if parent == "" {
		return key
	}
	return parent + "." + key
}

// key reads a possibly dotted, possibly quoted key.
func (s *lineScanner) key() []string {
	var keys []string
	for !s.eof() {
		s.skipSpace()
		var k string
		switch s.peek(0) {
		case '"':
			k = s.str()
			// Escapes in a quoted key are read as Go reads them, which
			// covers TOML's \uXXXX forms.
			if u, err := strconv.Unquote(`"` + k + `"`); err == nil {
				k = u
			}
		case '\'':
			k = s.str()
		default:
			k = s.bareKey()
		}
		keys = append(keys, k)
		s.skipSpace()
		if s.peek(0) != '.' {
			break
		}
		s.i++
	}
	return keys
}

// keyValue reads "key = value" inside the table at path parent; record
// false reads it without recording lines (see value).
func (s *lineScanner) keyValue(parent string, record bool) {
	line := s.line
	keys := s.key()
	path := parent
	if record {
		for _, k := range keys {
			path = joinPath(path, k)
			if _, ok := s.idx[path]; !ok {
				s.idx[path] = line
			}
		}
	}
	s.skipSpace()
	if s.peek(0) != '=' {
		return
	}
	s.i++
	s.skipSpace()
	s.value(path, record)
}

// maxIndexedElements is how many elements of one array get a line in the
// index: errors name at most MaxBoundaryPoints + 1 elements (a longer
// boundary is refused at its own line), and a hostile array of millions
// then costs no memory here.
const maxIndexedElements = MaxBoundaryPoints + 1

// items reads the comma-separated items of the array or inline table
// opened at the cursor, up to closing, reading the nth with item.
func (s *lineScanner) items(closing byte, item func(n int)) {
	s.i++
	for n := 0; ; n++ {
		s.skipBlank()
		if s.eof() || s.peek(0) == closing {
			s.advance()
			return
		}
		start := s.i
		item(n)
		s.skipBlank()
		if s.peek(0) == ',' {
			s.i++
		} else if s.i == start {
			return
		}
	}
}

// value reads one value and records the lines of its elements (with
// record).
func (s *lineScanner) value(path string, record bool) {
	switch s.peek(0) {
	case '"', '\'':
		s.str()
	case '[':
		s.items(']', func(n int) {
			el, rec := "", record && n < maxIndexedElements
			if rec {
				el = path + "[" + strconv.Itoa(n) + "]"
				s.idx[el] = s.line
			}
			s.value(el, rec)
		})
	case '{':
		s.items('}', func(int) { s.keyValue(path, record) })
	default:
		// Number, boolean or date: runs to a delimiter.
		for !s.eof() {
			switch s.src[s.i] {
			case ',', ']', '}', '#', '\n', '\r':
				return
			}
			s.i++
		}
	}
}
