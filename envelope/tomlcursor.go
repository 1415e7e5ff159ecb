package envelope

// tomlCursor walks TOML source text byte by byte, counting lines. It reads
// what both scans of a file's text read alike (blanks, comments, keys and
// strings): the size and nesting scan before the decoder (nesting.go) and
// the position scan after it (tomlpos.go). Every step moves on or stops at
// the end, so it never panics or loops on any input.
type tomlCursor struct {
	src  string
	i    int
	line int
}

func (c *tomlCursor) eof() bool { return c.i >= len(c.src) }

// peek returns the byte off places ahead, or 0 past the end.
func (c *tomlCursor) peek(off int) byte {
	if c.i+off < len(c.src) {
		return c.src[c.i+off]
	}
	return 0
}

// advance moves on by one byte, counting a newline.
func (c *tomlCursor) advance() {
	if c.i < len(c.src) {
		if c.src[c.i] == '\n' {
			c.line++
		}
		c.i++
	}
}

// skipSpace skips blanks on the current line.
func (c *tomlCursor) skipSpace() {
	for !c.eof() && (c.src[c.i] == ' ' || c.src[c.i] == '\t') {
		c.i++
	}
}

// skipBlank skips blanks, newlines and comments.
func (c *tomlCursor) skipBlank() {
	for !c.eof() {
		switch c.src[c.i] {
		case ' ', '\t', '\r', '\n':
			c.advance()
		case '#': // up to, not including, the newline
			for !c.eof() && c.src[c.i] != '\n' {
				c.i++
			}
		default:
			return
		}
	}
}

// skipLine skips to the start of the next line.
func (c *tomlCursor) skipLine() {
	for !c.eof() && c.src[c.i] != '\n' {
		c.i++
	}
	c.advance()
}

func isBareKeyChar(b byte) bool {
	return b >= 'A' && b <= 'Z' || b >= 'a' && b <= 'z' || b >= '0' && b <= '9' || b == '_' || b == '-'
}

// bareKey reads a bare key ("" when there is none here).
func (c *tomlCursor) bareKey() string {
	start := c.i
	for !c.eof() && isBareKeyChar(c.src[c.i]) {
		c.i++
	}
	return c.src[start:c.i]
}

// str reads the basic ("...", """...""") or literal ('...', ”'...”')
// string at the cursor and returns its raw contents: escapes are skipped,
// not decoded. An unterminated string stops at the end of its line, or of
// the text for a multi-line one; the decoder reports it.
func (c *tomlCursor) str() string {
	q := c.src[c.i]
	escapes := q == '"'
	if c.i+2 < len(c.src) && c.src[c.i+1] == q && c.src[c.i+2] == q {
		c.i += 3
		start := c.i
		for !c.eof() {
			b := c.src[c.i]
			if b == '\\' && escapes {
				c.advance()
				c.advance()
				continue
			}
			if b == q && c.i+2 < len(c.src) && c.src[c.i+1] == q && c.src[c.i+2] == q {
				end := c.i
				c.i += 3
				for !c.eof() && c.src[c.i] == q { // up to two more quotes close it
					c.i++
				}
				return c.src[start:end]
			}
			c.advance()
		}
		return c.src[start:]
	}
	c.i++
	start := c.i
	for !c.eof() && c.src[c.i] != q && c.src[c.i] != '\n' {
		if c.src[c.i] == '\\' && escapes {
			c.i++
		}
		c.i++
	}
	end := min(c.i, len(c.src))
	if c.peek(0) == q {
		c.i++
	}
	return c.src[start:end]
}
