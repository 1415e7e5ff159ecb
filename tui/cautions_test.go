package tui

import (
	"regexp"
	"strings"
	"testing"

	"likewind/envelope/units"
)

// siUnit finds an SI unit written after a number: "105 K", "450 kPa",
// "10 MPa", "3.2 m/s".
var siUnit = regexp.MustCompile(`[0-9] (K|kPa|MPa|Pa|m/s)\b`)

// TestDetailsCautionsFollowUnits: on the screen, the cautions of the
// cryogenic facility's point switch units with the rest of the panel.
func TestDetailsCautionsFollowUnits(t *testing.T) {
	m := newDemo(t, 160, 48)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.curI = gridIndex(m.res.grid.Alts, 9144)
	m.curJ = gridIndex(m.res.grid.Speeds, 0.85)
	m.relayout()
	for _, u := range []units.System{units.SI, units.Customary} {
		m.units = u
		m.relayout()
		d := m.detailBlocks(m.sideW)
		if len(d.cautions) == 0 {
			t.Fatalf("%s: no cautions at the cryogenic point", u)
		}
		text := strings.Join(d.cautions, " ")
		if !strings.Contains(text, "T0 "+u.Temp(105)) {
			t.Errorf("%s: cautions lack T0 %s:\n%s", u, u.Temp(105), text)
		}
		if u == units.Customary {
			if s := siUnit.FindString(text); s != "" {
				t.Errorf("customary cautions say %q:\n%s", s, text)
			}
		}
	}
}
