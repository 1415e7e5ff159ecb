package envelope

import "math"

// The TOML decoder spends memory and time that grow with the square of
// nesting depth (100 000 levels of [[[[… or {a={a=… take gigabytes) and
// some hundreds of bytes per item, so a file is measured before the
// decoder sees it: its size (MaxFileSize), how deeply its keys, tables and
// arrays nest (MaxNesting) and how many of them it holds (MaxItems).

// MaxFileSize is the largest vehicle or facility file read, 4 MiB: real
// files are a few kilobytes, and the limit bounds the memory a hostile
// file can make the loader use.
const MaxFileSize = 4 << 20

// MaxNesting is the deepest nesting of keys, tables and arrays a file may
// have: the deepest the formats use, envelope.boundary = [[altitude,
// speed], ...], counts 4 (two keys, two arrays). A level is a component of
// a table header or a dotted key, one more for an array of tables
// ([[facility]] counts 2), and one per array bracket; an inline table
// counts by its keys.
const MaxNesting = 4

// MaxItems is the most keys, values, arrays and tables a file may hold.
// The largest vehicle file, 1000 boundary points, holds about 3000; the
// limit keeps a file of millions of tiny items (an array of 700 000 inline
// tables fits in 4 MiB and costs the decoder a gigabyte) to tens of
// megabytes.
const MaxItems = 50000

// shapeFault is what the scan found beyond the limits: the line where
// nesting first went Depth levels deep, or where the file's items passed
// MaxItems (Items > 0). Line 0 means nothing.
type shapeFault struct {
	Line, Depth, Items int
}

// nestingScan finds the first place where src nests deeper than limit.
// It reads TOML's strings and comments as the decoder does, so brackets
// inside them do not count; on text that is not TOML it still ends, moving
// on by at least one byte each step, and never recurses.
type nestingScan struct {
	tomlCursor
	limit int
	// stack holds the open arrays and inline tables of the value being
	// read.
	stack []nestFrame
	// items counts keys, values, arrays and tables, up to maxItems.
	items, maxItems int
	fault           shapeFault
}

// nestFrame is an open array or inline table: the level of an array's
// elements, or of an inline table's own keys' parent.
type nestFrame struct {
	table bool
	level int
}

// scanShape reports where src first nests deeper than maxDepth or holds
// more than maxItems items.
func scanShape(src string, maxDepth, maxItems int) shapeFault {
	s := &nestingScan{tomlCursor: tomlCursor{src: src, line: 1}, limit: maxDepth, maxItems: maxItems}
	s.run()
	return s.fault
}

// checkNesting returns the line and depth where src first nests deeper
// than limit, or 0, 0 (items are not limited).
func checkNesting(src string, limit int) (line, depth int) {
	f := scanShape(src, limit, math.MaxInt)
	return f.Line, f.Depth
}

// over counts one more item at level and reports whether that passes a
// limit, recording where.
func (s *nestingScan) over(level int) bool {
	if level > s.limit {
		s.fault = shapeFault{Line: s.line, Depth: level}
		return true
	}
	if s.items++; s.items > s.maxItems {
		s.fault = shapeFault{Line: s.line, Items: s.items}
		return true
	}
	return false
}

func (s *nestingScan) run() {
	tableLevel := 0
	for {
		s.skipBlank()
		if s.eof() {
			return
		}
		if s.peek(0) == '[' { // a [table] or [[array of tables]] header
			s.i++
			array := s.peek(0) == '['
			if array {
				s.i++
			}
			tableLevel = s.keyCount()
			if array {
				tableLevel++
			}
			if s.over(tableLevel) {
				return
			}
			s.skipLine()
			continue
		}
		start := s.i
		k := s.keyCount()
		if s.over(tableLevel + k) {
			return
		}
		s.skipSpace()
		if s.i == start || s.peek(0) != '=' {
			s.skipLine() // not a key = value line; the decoder reports it
			continue
		}
		s.i++
		if !s.value(tableLevel + k) {
			return
		}
	}
}

// keyCount reads a possibly dotted, possibly quoted key and returns its
// number of components (0 when there is no key here).
func (s *nestingScan) keyCount() int {
	n := 0
	for {
		s.skipSpace()
		switch c := s.peek(0); {
		case c == '"' || c == '\'':
			s.str()
		case isBareKeyChar(c):
			s.bareKey()
		default:
			return n
		}
		n++
		s.skipSpace()
		if s.peek(0) != '.' {
			return n
		}
		s.i++
	}
}

// value reads the value of a key at level and everything nested in it.
// It reports false when the nesting passes the limit.
func (s *nestingScan) value(level int) bool {
	s.stack = s.stack[:0]
	cur := level
	for {
		// One value at level cur.
		if len(s.stack) == 0 {
			s.skipSpace()
		} else {
			s.skipBlank()
		}
		switch c := s.peek(0); c {
		case '[':
			s.i++
			if s.over(cur + 1) {
				return false
			}
			s.stack = append(s.stack, nestFrame{level: cur + 1})
		case '{':
			s.i++
			if s.over(cur) {
				return false
			}
			s.stack = append(s.stack, nestFrame{table: true, level: cur})
		case '"', '\'':
			if s.over(cur) {
				return false
			}
			s.str()
		default:
			if s.over(cur) {
				return false
			}
			s.scalar()
		}
		// The next value, closing arrays and tables on the way.
	next:
		for {
			if len(s.stack) == 0 {
				return true
			}
			top := s.stack[len(s.stack)-1]
			s.skipBlank()
			if s.eof() {
				return true
			}
			switch c := s.peek(0); {
			case c == ',':
				s.i++
			case !top.table && c == ']', top.table && c == '}':
				s.i++
				s.stack = s.stack[:len(s.stack)-1]
			case !top.table:
				cur = top.level
				break next
			default: // a key of an inline table
				start := s.i
				k := s.keyCount()
				if s.i == start {
					s.advance() // not a key; the decoder reports it
					continue
				}
				if s.over(top.level + k) {
					return false
				}
				s.skipSpace()
				if s.peek(0) == '=' {
					s.i++
				}
				cur = top.level + k
				break next
			}
		}
	}
}

// scalar skips a number, boolean or date (or anything else up to a
// delimiter), always moving on by at least one byte.
func (s *nestingScan) scalar() {
	start := s.i
	for !s.eof() {
		switch s.src[s.i] {
		case ',', '[', ']', '{', '}', '#', ' ', '\t', '\r', '\n', '"', '\'':
			if s.i == start {
				s.advance()
			}
			return
		}
		s.i++
	}
}
