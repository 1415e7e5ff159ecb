package tui

import (
	"strings"

	"github.com/charmbracelet/x/ansi"
)

// frame is the part every component shares: its size, set by the root
// through SetSize, and the one Styles and KeyMap of the program.
type frame struct {
	width, height int
	st            *Styles
	keys          *KeyMap
}

// SetSize sets the area the component may draw in.
func (f *frame) SetSize(w, h int) {
	f.width, f.height = max(w, 0), max(h, 0)
}

// fit cuts s to at most the frame's height lines, each at most its width
// cells, padding nothing.
func (f frame) fit(s string) string { return clip(s, f.width, f.height) }

// clip cuts s to at most h lines of at most w cells.
func clip(s string, w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	lines := strings.Split(s, "\n")
	if len(lines) > h {
		lines = lines[:h]
	}
	for i, l := range lines {
		if visibleWidth(l) > w {
			lines[i] = ansi.Truncate(l, w, "")
		}
	}
	return strings.Join(lines, "\n")
}

// box pads s to exactly w×h cells (cutting where longer), so blocks can be
// joined side by side.
func box(s string, w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	lines := strings.Split(s, "\n")
	if len(lines) > h {
		lines = lines[:h]
	}
	for len(lines) < h {
		lines = append(lines, "")
	}
	for i, l := range lines {
		n := visibleWidth(l)
		if n > w {
			l = ansi.Truncate(l, w, "")
			n = visibleWidth(l)
		}
		if n < w {
			l += strings.Repeat(" ", w-n)
		}
		lines[i] = l
	}
	return strings.Join(lines, "\n")
}

// lineCount counts the lines of s ("" has none).
func lineCount(s string) int {
	if s == "" {
		return 0
	}
	return strings.Count(s, "\n") + 1
}

// visibleWidth is the display width of s without escape sequences, as
// ansi.StringWidth gives it. A frame is measured line by line several
// times while it is drawn, so the common case is counted directly: text
// of printable ASCII and CSI sequences (the styles' colours) is one cell
// a byte outside the sequences; anything else goes to ansi.StringWidth.
func visibleWidth(s string) int {
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= 0x20 && c < 0x7f:
			n++
		case c == 0x1b && i+1 < len(s) && s[i+1] == '[':
			// CSI: parameter and intermediate bytes, then a final byte.
			j := i + 2
			for j < len(s) && s[j] >= 0x30 && s[j] <= 0x3f {
				j++
			}
			for j < len(s) && s[j] >= 0x20 && s[j] <= 0x2f {
				j++
			}
			if j >= len(s) || s[j] < 0x40 || s[j] > 0x7e {
				return ansi.StringWidth(s)
			}
			i = j
		default:
			return ansi.StringWidth(s)
		}
	}
	return n
}

// wrapText wraps s to lines of at most w cells (see wrapLines).
func wrapText(s string, w int) string { return strings.Join(wrapLines(s, w, ""), "\n") }

// wrapLines breaks s into lines of at most w cells at spaces, never inside
// a word and never between a number and its unit ("105.0 K" stays whole);
// continuation lines start with indent. A word wider than the line (a long
// file path) is broken into pieces that fill the line, so no text is ever
// lost. Styled words keep their escape sequences; widths are measured
// without them.
func wrapLines(s string, w int, indent string) []string {
	if w <= 0 {
		return nil
	}
	if !strings.Contains(s, "\n") && visibleWidth(s) <= w {
		return []string{s} // fits: keep its spacing
	}
	if visibleWidth(indent) >= w {
		indent = ""
	}
	var lines []string
	cur, curW := "", 0
	flush := func() {
		lines = append(lines, cur)
		cur, curW = indent, visibleWidth(indent)
	}
	for _, word := range glueUnits(strings.Fields(s)) {
		ww := visibleWidth(word)
		start := curW == 0 || cur == indent
		if !start && curW+1+ww > w {
			flush()
			start = true
		}
		if !start {
			cur += " "
			curW++
		}
		for curW+ww > w {
			// Too wide for a line of its own: fill this line and go on.
			n := w - curW
			cur += ansi.Cut(word, 0, n)
			word = ansi.Cut(word, n, ww)
			ww -= n
			flush()
		}
		cur += word
		curW += ww
	}
	if curW > 0 && cur != indent {
		lines = append(lines, cur)
	}
	return lines
}

// unitWords are the unit names the screen writes after a number.
var unitWords = map[string]bool{
	"K": true, "°F": true, "Pa": true, "kPa": true, "MPa": true, "bar": true, "psi": true, "psf": true,
	"m": true, "km": true, "ft": true, "m/s": true, "kt": true, "%": true, "kg/m³": true,
	"slug/ft³": true, "/m": true, "/ft": true,
}

// glueUnits joins each unit word to the number before it, so that a line
// break never separates them.
func glueUnits(words []string) []string {
	out := words[:0:0]
	for _, w := range words {
		if n := len(out); n > 0 && isUnitWord(w) && endsInDigit(out[n-1]) {
			out[n-1] += " " + w
			continue
		}
		out = append(out, w)
	}
	return out
}

func isUnitWord(w string) bool {
	return unitWords[strings.TrimRight(ansi.Strip(w), ".,;:)")]
}

func endsInDigit(w string) bool {
	p := ansi.Strip(w)
	return p != "" && p[len(p)-1] >= '0' && p[len(p)-1] <= '9'
}
