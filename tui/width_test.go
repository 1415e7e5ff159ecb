package tui

import (
	"strings"
	"testing"

	"github.com/charmbracelet/x/ansi"
)

// TestVisibleWidth checks the counted case of visibleWidth against
// ansi.StringWidth, which it stands in for: every line of colour frames
// of the demo in each mode, and strings that leave the counted case.
func TestVisibleWidth(t *testing.T) {
	cases := []string{"", "abc", "\x1b[38;2;1;2;3mab\x1b[0m", "\x1b[1m", "\x1b[", "\x1b[12", "\x1b]0;t\x07x",
		"ΔT +5 K", "a\tb", "\x1b[ q x", "\x1b[1 2m", "\x1b[?25lz", "e\u0301", "日本", "\x7f", "x\x1bq"}
	for _, keys := range [][]string{nil, {"e"}, {"?"}, {"f"}, {"tab"}, {"S"}} {
		m := newDemo(t, 200, 60)
		st := colourStyles()
		m.fr.st = &st
		m = relayoutAll(m)
		m, _ = press(m, keys...)
		cases = append(cases, strings.Split(m.View(), "\n")...)
	}
	for _, s := range cases {
		if got, want := visibleWidth(s), ansi.StringWidth(s); got != want {
			t.Errorf("visibleWidth(%q) = %d, want %d (ansi.StringWidth)", s, got, want)
		}
	}
}
