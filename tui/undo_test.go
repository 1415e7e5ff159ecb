package tui

import (
	"strings"
	"testing"

	"likewind/envelope/whatif"
)

// Item 17: R (file values) and X (clear marks) act at once; U puts back
// what they took, with the results recomputed, and says what it undid.
func TestUndoRestoreAndClear(t *testing.T) {
	// Without the demo's balance, which takes no full match at scale 0.3.
	m := newDemo(t, 100, 30, noLoads)
	k := facilityNamed(t, m, "Harl Cove")
	m.fac = k
	m = edit(t, m, whatif.Scale, "0.3")
	m = edit(t, m, whatif.P0Max, "3 bar")
	m, _ = press(m, "esc", "M")
	edited, editedFac, marks := m.set, m.facs[k], len(m.marks)
	if marks == 0 || len(m.changes()) != 2 {
		t.Fatalf("setup: %d marks, %d changes; want marks and two changes", marks, len(m.changes()))
	}

	// X, then U: the marks are back.
	m, _ = press(m, "X")
	if len(m.marks) != 0 || !strings.Contains(m.status, "U undoes") {
		t.Fatalf("X left %d marks, status %q", len(m.marks), m.status)
	}
	m, _ = press(m, "U")
	if len(m.marks) != marks || !strings.Contains(m.status, "undone: clear") {
		t.Errorf("U after X: %d marks (want %d), status %q", len(m.marks), marks, m.status)
	}

	// R, then U: the what-if values are back and the results follow them.
	m, _ = press(m, "R")
	if len(m.changes()) != 0 || m.res.maps[k].Facility.PressureMax() == editedFac.PressureMax() {
		t.Fatalf("R did not restore the files' values")
	}
	m, _ = press(m, "U")
	if m.set != edited || m.facs[k] != editedFac {
		t.Errorf("U after R: settings %+v facility p0 max %g, want the edited %+v and %g", m.set, m.facs[k].PressureMax(), edited, editedFac.PressureMax())
	}
	if m.busy || m.res.maps[k].Facility.PressureMax() != editedFac.PressureMax() || m.res.maps[k].Scale != 0.3 {
		t.Errorf("results not recomputed after the undo")
	}
	if !strings.Contains(m.status, "undone: restore the files' values") {
		t.Errorf("status %q", m.status)
	}

	// Further U steps back through the edits and the marks, then stops.
	m, _ = press(m, "U") // M
	if len(m.marks) != 0 {
		t.Errorf("U after M: %d marks, want 0", len(m.marks))
	}
	m, _ = press(m, "U", "U") // both edits
	if len(m.changes()) != 0 {
		t.Errorf("after undoing both edits %d changes remain", len(m.changes()))
	}
	m, _ = press(m, "U")
	if m.status != "nothing to undo" {
		t.Errorf("status %q, want nothing to undo", m.status)
	}

	// U works in the what-if list too, and the key is in the help.
	m, _ = press(m, "e", "R")
	if len(m.changes()) != 0 {
		t.Fatalf("nothing to restore expected")
	}
	m = edit(t, m, whatif.Scale, "0.25")
	m, _ = press(m, "R", "U")
	if m.mode != modeEdit || m.set.Scale != 0.25 {
		t.Errorf("U in the what-if list: mode %v scale %g, want the list and 0.25", m.mode, m.set.Scale)
	}
	found := false
	for _, b := range m.editor.ShortHelp() {
		found = found || b.Help().Key == "U"
	}
	if !found {
		t.Errorf("the what-if list's key line lacks U")
	}
	h, _ := press(newDemo(t, 100, 30), "?")
	if !strings.Contains(h.View(), "undo") {
		t.Errorf("help screen lacks undo")
	}
}
