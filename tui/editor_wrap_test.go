package tui

import (
	"strings"
	"testing"

	"likewind/envelope/whatif"
)

// Defect seen at 120×40: with the model scale set to 1:20 in the editor,
// the row's origin "(built-in facility sizing)" was cut at the panel's
// edge to "(built-in f". A row's text is wrapped, never cut: the origin
// goes on a line of its own when it does not fit beside the value.
func TestEditorRowOriginNotCut(t *testing.T) {
	for _, size := range []struct{ w, h int }{{120, 40}, {80, 24}, {200, 60}} {
		m := newDemo(t, size.w, size.h)
		m.fac = facilityNamed(t, m, "Skerrow")
		m = edit(t, m, whatif.Scale, "1:20")
		m.relayout()
		view := m.View()
		checkFits(t, view, size.w, size.h)
		// The panel itself (the header says it too).
		panel := m.editor.View()
		flat := strings.Join(strings.Fields(panel), " ")
		if !strings.Contains(flat, "(built-in facility sizing)") {
			t.Errorf("%d×%d: the editor row's origin is cut:\n%s", size.w, size.h, panel)
		}
	}
}
