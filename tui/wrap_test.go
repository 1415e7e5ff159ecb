package tui

import (
	"strings"
	"testing"
)

// TestWrapLines: lines break at spaces only, a number keeps its unit, a
// word longer than the line is split across lines rather than cut, and the
// words read back whole in order.
func TestWrapLines(t *testing.T) {
	cases := []struct {
		s    string
		w    int
		want []string
	}{
		{"T0 below 100.0 K, p0 above", 16, []string{"T0 below 100.0", "K, p0 above"}},
		{"the static state reaches the saturation line", 20, []string{"the static state", "reaches the", "saturation line"}},
		{"saved to /a/very/long/path/name.toml now", 12, []string{"saved to", "/a/very/long", "/path/name.t", "oml now"}},
	}
	// The first case: "100.0 K," is one piece, so it moves whole.
	cases[0].want = []string{"T0 below", "100.0 K, p0", "above"}
	for _, c := range cases {
		got := wrapLines(c.s, c.w, "")
		if strings.Join(got, "|") != strings.Join(c.want, "|") {
			t.Errorf("wrapLines(%q, %d) = %q, want %q", c.s, c.w, got, c.want)
		}
		for _, l := range got {
			if visibleWidth(l) > c.w {
				t.Errorf("line %q wider than %d", l, c.w)
			}
		}
	}
	got := wrapLines("limited by dynamic-pressure limit", 20, "  ")
	if want := []string{"limited by", "  dynamic-pressure", "  limit"}; strings.Join(got, "|") != strings.Join(want, "|") {
		t.Errorf("indented wrap = %q, want %q", got, want)
	}
}
