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
		if ansi.StringWidth(l) > w {
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
	lines := strings.Split(clip(s, w, h), "\n")
	for len(lines) < h {
		lines = append(lines, "")
	}
	for i, l := range lines {
		if n := ansi.StringWidth(l); n < w {
			lines[i] = l + strings.Repeat(" ", w-n)
		}
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

// visibleWidth is the display width of s without escape sequences.
func visibleWidth(s string) int { return ansi.StringWidth(s) }
