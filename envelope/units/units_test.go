package units

import (
	"math"
	"regexp"
	"strings"
	"testing"

	"likewind/envelope"
)

// Display conversions. Reference values: the foot (0.3048 m) and the
// nautical mile (1852 m) are exact by definition; the pound-force per
// square foot (47.880 26 Pa), per square inch (6894.757 Pa) and the slug
// per cubic foot (515.3788 kg/m³) are from NIST Special Publication 811
// (2008), Appendix B.8/B.9; the Fahrenheit relation t/°F = T/K·1.8 −
// 459.67 is the definition in the same publication. The sea-level values
// 101 325 Pa = 2116.2 lbf/ft² = 14.696 lbf/in², 288.15 K = 59 °F and
// 1.225 kg/m³ = 0.002377 slug/ft³ are the U.S. Standard Atmosphere 1976
// sea-level values in both unit systems.
func TestUnitsFormat(t *testing.T) {
	cases := []struct {
		name string
		got  string
		want string
	}{
		{"SI altitude", SI.Alt(11000), "11000 m"},
		{"customary altitude 10 000 m", Customary.Alt(10000), "32808 ft"},
		{"customary altitude 11 km", Customary.AltLabel(11000), "36089"},
		{"SI speed", SI.Speed(100), "100.0 m/s"},
		{"customary speed 1852/3600 m/s = 1 kt", Customary.Speed(1852.0 / 3600 * 250), "250.0 kt"},
		{"SI sea-level pressure", SI.Pressure(101325), "101.3 kPa"},
		{"SI low pressure in Pa", SI.Pressure(522.0), "522.0 Pa"},
		{"customary sea-level pressure", Customary.Pressure(101325), "2116 psf"},
		{"customary stagnation pressure", Customary.Stagnation(101325), "14.70 psi"},
		{"SI stagnation pressure", SI.Stagnation(3e5), "300.0 kPa"},
		{"SI temperature", SI.Temp(288.15), "288.1 K"},
		{"customary sea-level temperature", Customary.Temp(288.15), "59.0 °F"},
		{"customary ΔT 10 K = 18 °F", Customary.DeltaT(10), "+18.0 °F"},
		{"SI negative ΔT", SI.DeltaT(-5), "-5.0 K"},
		{"SI density", SI.Density(1.225), "1.225 kg/m³"},
		{"customary sea-level density", Customary.Density(1.225), "0.002377 slug/ft³"},
		{"SI unit Reynolds", SI.PerLength(6.7e6), "6.70e6 /m"},
		{"customary unit Reynolds (per ft = per m × 0.3048)", Customary.PerLength(1e7), "3.05e6 /ft"},
		{"customary length", Customary.Length(0.3048), "1.00 ft"},
		// The pound-force is 4.448 222 N and the pound-force foot
		// 1.355 818 N·m (NIST Special Publication 811 (2008), Appendix B.9).
		{"SI force", SI.Force(850), "850.0 N"},
		{"SI force in kN", SI.Force(12500), "12.50 kN"},
		{"customary force 4448.222 N = 1000 lbf", Customary.Force(4448.222), "1000 lbf"},
		{"SI moment", SI.Moment(120), "120.0 N·m"},
		{"SI moment in kN·m", SI.Moment(2500), "2.500 kN·m"},
		{"customary moment 135.5818 N·m = 100 lbf·ft", Customary.Moment(135.5818), "100.0 lbf·ft"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("%s = %q, want %q", c.name, c.got, c.want)
		}
	}
}

func TestNumberFormat(t *testing.T) {
	cases := []struct {
		got, want string
	}{
		{Sig(0, 3), "0"}, {Sig(1234.6, 4), "1235"}, {Sig(0.012345, 3), "0.0123"},
		{Sig(3.1e7, 3), "3.10e7"}, {Sig(2e-8, 2), "2.0e-8"}, {Sig(math.NaN(), 3), "n/a"},
		{Sig(math.Inf(1), 3), "inf"}, {Expo(123456, 3), "1.23e5"}, {Expo(1, 3), "1.00"},
		{Fixed(-0.01, 1), "0.0"}, {MachLabel(0.85), "0.85"}, {MachLabel(12.5), "12.5"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
}

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

func TestParse(t *testing.T) {
	for _, u := range []System{SI, Customary} {
		if got, err := Parse(u.String()); err != nil || got != u {
			t.Errorf("Parse(%q) = %v, %v", u.String(), got, err)
		}
	}
	if _, err := Parse("cubits"); err == nil {
		t.Errorf("Parse(cubits) = nil error")
	}
}

func FuzzParse(f *testing.F) {
	f.Add("SI")
	f.Add("customary")
	f.Fuzz(func(t *testing.T, s string) {
		u, err := Parse(s)
		if err == nil && u != SI && u != Customary {
			t.Errorf("Parse(%q) = %v", s, u)
		}
	})
}

// TestLoadCautionInUnits: the balance-load caution writes the loads in the
// screen's unit system. 4448.2216152605 N is 1000 lbf and 1355.8179483314
// N·m is 1000 lbf·ft exactly (the pound-force is 0.45359237 kg × 9.80665
// m/s²; NIST SP 811, Appendix B.8).
func TestLoadCautionInUnits(t *testing.T) {
	d := &envelope.Detail{Flags: envelope.FlagLoadNearLimit,
		Load: envelope.Load{NormalForce: 4448.2216152605, PitchMoment: 1355.8179483314, MaxNormalForce: 4500, Share: 0.988}}
	f := &envelope.Facility{Name: "t", Medium: "air"}
	find := func(u envelope.QuantityFormat) string {
		for _, c := range envelope.Cautions(d, f, u) {
			if strings.HasPrefix(c, "Model load") {
				return c
			}
		}
		return ""
	}
	for _, c := range []struct {
		u    envelope.QuantityFormat
		want string
	}{
		{Customary, "(normal force 1000 lbf, pitching moment 1000 lbf·ft at the largest load coefficients)"},
		{SI, "(normal force 4.448 kN, pitching moment 1.356 kN·m at the largest load coefficients)"},
		{envelope.SIFormat{}, "(normal force 4448 N, pitching moment 1356 N·m at the largest load coefficients)"},
	} {
		if got := find(c.u); !strings.Contains(got, c.want) {
			t.Errorf("%T caution = %q, want it to contain %q", c.u, got, c.want)
		}
	}
}
