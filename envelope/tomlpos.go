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
	s := &lineScanner{src: src, line: 1, idx: lineIndex{}, arrays: map[string]int{}}
	s.run()
	return s.idx
}

type lineScanner struct {
	src  string
	i    int
	line int
	idx  lineIndex
	// arrays counts the elements seen so far of each array of tables,
	// keyed by its resolved path.
	arrays map[string]int
	// table is the resolved path of the current table ("" at top level).
	table string
}

func (s *lineScanner) eof() bool { return s.i >= len(s.src) }

func (s *lineScanner) peek(off int) byte {
	if s.i+off < len(s.src) {
		return s.src[s.i+off]
	}
	return 0
}

func (s *lineScanner) advance() {
	if s.i < len(s.src) {
		if s.src[s.i] == '\n' {
			s.line++
		}
		s.i++
	}
}

// skipSpace skips blanks on the current line.
func (s *lineScanner) skipSpace() {
	for !s.eof() && (s.src[s.i] == ' ' || s.src[s.i] == '\t') {
		s.i++
	}
}

// skipComment skips a comment up to, not including, the newline.
func (s *lineScanner) skipComment() {
	if s.peek(0) == '#' {
		for !s.eof() && s.src[s.i] != '\n' {
			s.i++
		}
	}
}

// skipBlank skips blanks, newlines and comments.
func (s *lineScanner) skipBlank() {
	for !s.eof() {
		switch s.src[s.i] {
		case ' ', '\t', '\r', '\n':
			s.advance()
		case '#':
			s.skipComment()
		default:
			return
		}
	}
}

// skipLine skips to the start of the next line.
func (s *lineScanner) skipLine() {
	for !s.eof() && s.src[s.i] != '\n' {
		s.i++
	}
	s.advance()
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
			k = s.basicString()
			// Escapes in a quoted key are read as Go reads them, which
			// covers TOML's \uXXXX forms.
			if u, err := strconv.Unquote(`"` + k + `"`); err == nil {
				k = u
			}
		case '\'':
			k = s.literalString()
		default:
			start := s.i
			for !s.eof() && isBareKeyChar(s.src[s.i]) {
				s.i++
			}
			k = s.src[start:s.i]
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

func isBareKeyChar(c byte) bool {
	return c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '_' || c == '-'
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

// value reads one value and records the lines of its elements (with
// record).
func (s *lineScanner) value(path string, record bool) {
	switch s.peek(0) {
	case '"':
		s.basicString()
	case '\'':
		s.literalString()
	case '[':
		s.i++
		for n := 0; ; n++ {
			s.skipBlank()
			if s.eof() || s.peek(0) == ']' {
				s.advance()
				return
			}
			el, rec := "", record && n < maxIndexedElements
			if rec {
				el = path + "[" + strconv.Itoa(n) + "]"
				s.idx[el] = s.line
			}
			start := s.i
			s.value(el, rec)
			s.skipBlank()
			if s.peek(0) == ',' {
				s.i++
			} else if s.i == start {
				return
			}
		}
	case '{':
		s.i++
		for {
			s.skipBlank()
			if s.eof() || s.peek(0) == '}' {
				s.advance()
				return
			}
			start := s.i
			s.keyValue(path, record)
			s.skipBlank()
			if s.peek(0) == ',' {
				s.i++
			} else if s.i == start {
				return
			}
		}
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

// basicString reads a "..." or """...""" string and returns its raw
// contents (escapes are not decoded here; key decodes those of a quoted
// key, so that an unknown key's error names its line).
func (s *lineScanner) basicString() string {
	if strings.HasPrefix(s.src[s.i:], `"""`) {
		s.i += 3
		start := s.i
		for !s.eof() {
			if s.src[s.i] == '\\' {
				s.advance()
				s.advance()
				continue
			}
			if strings.HasPrefix(s.src[s.i:], `"""`) {
				end := s.i
				s.i += 3
				for s.peek(0) == '"' { // up to two quotes may close the string
					s.i++
				}
				return s.src[start:end]
			}
			s.advance()
		}
		return s.src[start:]
	}
	s.i++
	start := s.i
	for !s.eof() && s.src[s.i] != '"' && s.src[s.i] != '\n' {
		if s.src[s.i] == '\\' {
			s.i++
		}
		s.i++
	}
	end := min(s.i, len(s.src))
	if s.peek(0) == '"' {
		s.i++
	}
	return s.src[start:end]
}

// literalString reads a '...' or ”'...”' string.
func (s *lineScanner) literalString() string {
	if strings.HasPrefix(s.src[s.i:], `'''`) {
		s.i += 3
		start := s.i
		for !s.eof() {
			if strings.HasPrefix(s.src[s.i:], `'''`) {
				end := s.i
				s.i += 3
				for s.peek(0) == '\'' {
					s.i++
				}
				return s.src[start:end]
			}
			s.advance()
		}
		return s.src[start:]
	}
	s.i++
	start := s.i
	for !s.eof() && s.src[s.i] != '\'' && s.src[s.i] != '\n' {
		s.i++
	}
	end := s.i
	if s.peek(0) == '\'' {
		s.i++
	}
	return s.src[start:end]
}
