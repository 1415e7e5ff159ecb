package atmos_test

import (
	"fmt"

	"likewind/atmos"
)

// Calibrated airspeed at altitude: 250 kt CAS at FL400 on a standard day.
func ExampleSpeeds() {
	s, err := atmos.AtDay(40000*atmos.Foot, atmos.Geopotential, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	a, err := atmos.Speeds(atmos.CAS, 250*atmos.Knot, s)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Mach %.3f\n", a.Mach)
	fmt.Printf("TAS  %.1f kt\n", a.TAS/atmos.Knot)
	fmt.Printf("EAS  %.1f kt\n", a.EAS/atmos.Knot)
	fmt.Printf("CAS  %.1f kt\n", a.CAS/atmos.Knot)
	// Output:
	// Mach 0.823
	// TAS  472.0 kt
	// EAS  234.2 kt
	// CAS  250.0 kt
}

// Supersonic flight: the pitot reads through a normal shock, and CAS above
// a0 uses the Rayleigh pitot formula.
func ExampleCASFromMach() {
	s, err := atmos.At(15000)
	if err != nil {
		fmt.Println(err)
		return
	}
	cas := atmos.CASFromMach(2, s)
	fmt.Printf("M 2 at 15 km: CAS %.1f m/s (%.0f kt)\n", cas, cas/atmos.Knot)
	M, err := atmos.MachFromCAS(cas, s)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("back to Mach %.6f\n", M)
	// Output:
	// M 2 at 15 km: CAS 278.9 m/s (542 kt)
	// back to Mach 2.000000
}

func ExampleImpactPressure() {
	for _, M := range []float64{0.5, 1, 2} {
		fmt.Printf("M %.1f: qc/p = %.4f\n", M, atmos.ImpactPressure(M, 1))
	}
	// Output:
	// M 0.5: qc/p = 0.1862
	// M 1.0: qc/p = 0.8929
	// M 2.0: qc/p = 4.6404
}

func ExampleParseQuantity() {
	for _, in := range []struct {
		text string
		dim  atmos.Dimension
	}{
		{"35000 ft", atmos.Length},
		{"250 kt", atmos.Speed},
		{"-56.5 °C", atmos.Temperature},
		{"15 degC", atmos.TemperatureDelta},
		{"3 bar", atmos.Length},
	} {
		v, err := atmos.ParseQuantity(in.text, in.dim)
		if err != nil {
			fmt.Println("error:", err)
			continue
		}
		fmt.Printf("%s -> %g (SI)\n", in.text, v)
	}
	// Output:
	// 35000 ft -> 10668 (SI)
	// 250 kt -> 128.61111111111111 (SI)
	// -56.5 °C -> 216.64999999999998 (SI)
	// 15 degC -> 15 (SI)
	// error: "3 bar": "bar" is a pressure unit; expected a length (m, km, mm, cm, in, ft, kft, mi, nmi): unit of the wrong dimension
}

func ExampleParseAirspeed() {
	for _, in := range []string{"M0.85", "250 KCAS", "130 m/s EAS"} {
		k, v, err := atmos.ParseAirspeed(in)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-12s %s %s\n", in, k, atmos.FormatNumber(v))
	}
	// Output:
	// M0.85        Mach 0.85
	// 250 KCAS     CAS 128.61
	// 130 m/s EAS  EAS 130
}

func ExampleFormat() {
	s, err := atmos.At(11000)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, customary := range []bool{false, true} {
		fmt.Println(atmos.Format(s.Altitude, atmos.Length, customary),
			atmos.Format(s.Pressure, atmos.Pressure, customary),
			atmos.Format(s.Temperature, atmos.Temperature, customary))
	}
	// Output:
	// 11000 m 22.7 kPa 216.77 K
	// 36089 ft 3.2924 psi -69.478 °F
}

func ExampleRegimes() {
	r := atmos.DefaultRegimes()
	for _, M := range []float64{0.2, 0.6, 0.95, 2, 6} {
		fmt.Printf("M %.2f %s\n", M, r.Speed(M))
	}
	for _, Kn := range []float64{1e-4, 0.05, 1, 50} {
		fmt.Printf("Kn %g %s\n", Kn, r.Rarefaction(Kn))
	}
	// Output:
	// M 0.20 incompressible
	// M 0.60 subsonic
	// M 0.95 transonic
	// M 2.00 supersonic
	// M 6.00 hypersonic
	// Kn 0.0001 continuum
	// Kn 0.05 slip
	// Kn 1 transitional
	// Kn 50 free-molecular
}

// Reynolds, dynamic pressure and Knudsen number for a 0.2 m model length at
// Mach 6 and 30 km.
func ExampleKnudsenMachRe() {
	s, err := atmos.At(30000)
	if err != nil {
		fmt.Println(err)
		return
	}
	const M, L = 6.0, 0.2
	V := M * s.SpeedOfSound
	Re := atmos.Reynolds(s.Density, V, L, s.Viscosity)
	fmt.Printf("Re = %.3g\n", Re)
	fmt.Printf("q  = %.1f kPa\n", atmos.DynamicPressure(s.Density, V)/1000)
	fmt.Printf("Kn = %.2g (M/Re form)\n", atmos.KnudsenMachRe(M, Re, atmos.GammaAir))
	fmt.Printf("Kn = %.2g (USSA mean free path)\n", atmos.Knudsen(s.MeanFreePath, L))
	// Output:
	// Re = 4.52e+05
	// q  = 30.2 kPa
	// Kn = 2e-05 (M/Re form)
	// Kn = 2.2e-05 (USSA mean free path)
}
