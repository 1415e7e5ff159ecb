package tui

import (
	"bytes"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/exp/teatest"

	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// TestProgramEndToEnd runs the model in a real Bubble Tea program: keys
// go in through the program, the screen is read back, and q ends it.
func TestProgramEndToEnd(t *testing.T) {
	m := newDemo(t, 80, 24)
	m.fac = 0 // the first facility, so that "]]" below lands on the third
	tm := teatest.NewTestModel(t, m, teatest.WithInitialTermSize(100, 30))
	waitFor := func(what string) {
		t.Helper()
		teatest.WaitFor(t, tm.Output(), func(b []byte) bool {
			return bytes.Contains(b, []byte(what))
		}, teatest.WithDuration(5*time.Second), teatest.WithCheckInterval(10*time.Millisecond))
	}
	waitFor("match class")
	tm.Send(tea.KeyMsg{Type: tea.KeyTab})
	waitFor("flow regime")
	tm.Type("u")
	waitFor("altitude ft")
	// A what-if edit: the recompute runs as a command inside the program.
	tm.Type("]]e")
	for range int(whatif.P0Max) {
		tm.Send(tea.KeyMsg{Type: tea.KeyDown})
	}
	tm.Send(tea.KeyMsg{Type: tea.KeyEnter})
	tm.Send(tea.KeyMsg{Type: tea.KeyCtrlU})
	tm.Type("40 psi")
	tm.Send(tea.KeyMsg{Type: tea.KeyEnter})
	waitFor("what-if:")
	tm.Send(tea.KeyMsg{Type: tea.KeyEsc})
	tm.Type("q")
	waitFor("Unsaved changes")
	tm.Type("y")
	final := tm.FinalModel(t, teatest.WithFinalTimeout(5*time.Second)).(Model)
	if final.layer != LayerRegime || final.units != units.Customary {
		t.Errorf("final layer/units = %v/%v, want %v/%v", final.layer, final.units, LayerRegime, units.Customary)
	}
	k := final.fac
	if k != 2 {
		t.Fatalf("final facility = %d, want 2", k)
	}
	// 40 psi = 275.79 kPa (NIST SP 811: 1 lbf/in² = 6894.757 Pa).
	if got := final.facs[k].PressureMax(); got < 275789 || got > 275791 {
		t.Errorf("p0 max = %g Pa, want 275790", got)
	}
	if final.busy || final.res.maps[k].Facility.PressureMax() != final.facs[k].PressureMax() {
		t.Errorf("the recompute of the edit did not land")
	}
	if !final.discard || !final.Quitting() {
		t.Errorf("discard %v quitting %v, want both", final.discard, final.Quitting())
	}
}
