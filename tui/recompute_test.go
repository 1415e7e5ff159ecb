package tui

import (
	"testing"

	"likewind/envelope"
)

// TestRecomputeSupersededKeepsItsWork types a ΔT edit and a facility
// limit edit in one go, so the second request is made while the grid
// rebuild of the first still runs (drive delivers command results after
// the keys already queued). The results must equal a fresh evaluation of
// the final values: the newer request may not solve on the old grid.
func TestRecomputeSupersededKeepsItsWork(t *testing.T) {
	cases := []struct {
		name string
		keys []string
	}{
		{"ΔT then p0 max", []string{"e", "down", "enter", "ctrl+u", "1", "0", "K", "enter",
			"down", "down", "down", "down", "enter", "ctrl+u", "3", "b", "a", "r", "enter"}},
		{"p0 max, next facility, q max", []string{"e", "down", "down", "down", "down", "down", "enter", "ctrl+u", "3", "b", "a", "r", "enter",
			"esc", "]", "e", "down", "down", "enter", "ctrl+u", "2", "0", "k", "P", "a", "enter"}},
		{"scale then p0 max", []string{"e", "enter", "ctrl+u", "0", ".", "0", "3", "enter",
			"down", "down", "down", "down", "down", "enter", "ctrl+u", "3", "b", "a", "r", "enter"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := newDemo(t, 120, 40)
			m.fac = facilityNamed(t, m, "Harl Cove")
			m, _ = press(m, c.keys...)
			if m.busy {
				t.Fatal("still computing after every command ran")
			}
			if !m.whatIfChanged() {
				t.Fatalf("no what-if value changed; editor error %q", m.editor.err)
			}
			e, err := envelope.Evaluate(m.vehicle, m.facs, m.set)
			if err != nil {
				t.Fatal(err)
			}
			for k := range m.facs {
				for p := range e.Maps[k].Results {
					if got, want := m.res.maps[k].Results[p], e.Maps[k].Results[p]; got != want {
						t.Fatalf("%s point %d = %+v, want %+v (fresh evaluation)", m.facs[k].Name, p, got, want)
					}
				}
			}
		})
	}
}
