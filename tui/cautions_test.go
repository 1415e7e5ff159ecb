package tui

import (
	"regexp"
	"strings"
	"testing"

	"likewind/envelope"
)

// siUnit finds an SI unit written after a number: "105 K", "450 kPa",
// "10 MPa", "3.2 m/s".
var siUnit = regexp.MustCompile(`[0-9] (K|kPa|MPa|Pa|m/s)\b`)

// TestCautionsInCustomaryUnits: with the units toggle on customary, every
// quantity in a caution is in customary units. Conversions by hand:
// 105 K = 105·9/5 − 459.67 = −270.67 °F; 100 K = −279.67 °F; 400 K =
// 260.33 °F; 440 kPa / 6.894757 kPa/psi = 63.82 psi; 450 kPa = 65.27 psi;
// 10 MPa = 1450.4 psi; 119 kPa / 47.880 Pa/psf = 2485 psf.
func TestCautionsInCustomaryUnits(t *testing.T) {
	f := envelope.Facility{Medium: "nitrogen", Gas: envelope.GasLimits{P0Max: 450e3}}
	d := envelope.Detail{T0: 105, P0: 440e3, Q: 119e3, FlightT0: 400,
		Flags: envelope.FlagCryogenic | envelope.FlagHighP0 | envelope.FlagQNearLimit |
			envelope.FlagRealGas | envelope.FlagEnthalpyShort}
	got := strings.Join(envelope.Cautions(&d, &f, Customary), "\n")
	for _, want := range []string{"T0 -270.7 °F", "p0 63.82 psi", "maximum 65.27 psi", "pressure 2485 psf",
		"below -279.7 °F", "above 1450 psi", "temperature 260.3 °F"} {
		if !strings.Contains(got, want) {
			t.Errorf("customary cautions lack %q:\n%s", want, got)
		}
	}
	if m := siUnit.FindString(got); m != "" {
		t.Errorf("customary cautions still say %q:\n%s", m, got)
	}
	si := strings.Join(envelope.Cautions(&d, &f, SI), "\n")
	for _, want := range []string{"T0 105.0 K", "p0 440.0 kPa", "pressure 119.0 kPa"} {
		if !strings.Contains(si, want) {
			t.Errorf("SI cautions lack %q:\n%s", want, si)
		}
	}
}

// TestDetailsCautionsFollowUnits: on the screen, the cautions of the
// cryogenic facility's point switch units with the rest of the panel.
func TestDetailsCautionsFollowUnits(t *testing.T) {
	m := newDemo(t, 160, 48)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.curI = gridIndex(m.res.grid.Alts, 9144)
	m.curJ = gridIndex(m.res.grid.Speeds, 0.85)
	m.relayout()
	for _, u := range []Units{SI, Customary} {
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
		if u == Customary {
			if s := siUnit.FindString(text); s != "" {
				t.Errorf("customary cautions say %q:\n%s", s, text)
			}
		}
	}
}
