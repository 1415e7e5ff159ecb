package atmos_test

import (
	"fmt"

	"likewind/atmos"
)

func ExampleAt() {
	s, err := atmos.At(11000) // geometric altitude, m
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T   = %.3f K\n", s.Temperature)
	fmt.Printf("p   = %.1f Pa\n", s.Pressure)
	fmt.Printf("rho = %.5f kg/m3\n", s.Density)
	fmt.Printf("a   = %.3f m/s\n", s.SpeedOfSound)
	fmt.Printf("mu  = %.4e Pa s\n", s.Viscosity)
	fmt.Printf("nu  = %.4e m2/s\n", s.KinematicViscosity)
	fmt.Printf("mfp = %.4e m\n", s.MeanFreePath)

	_, err = atmos.At(90000)
	fmt.Println(err)
	// Output:
	// T   = 216.774 K
	// p   = 22700.0 Pa
	// rho = 0.36480 kg/m3
	// a   = 295.154 m/s
	// mu  = 1.4223e-05 Pa s
	// nu  = 3.8988e-05 m2/s
	// mfp = 2.2274e-07 m
	// atmosphere: geometric altitude 90000 m: want -5000 to 86000 m: altitude outside the U.S. Standard Atmosphere 1976 range
}

func ExampleAtDay() {
	// A hot day, ISA+20, at a pressure altitude of 3000 m.
	s, err := atmos.AtDay(3000, atmos.PressureAlt, 20)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T = %.2f K, p = %.0f Pa, rho = %.4f kg/m3\n", s.Temperature, s.Pressure, s.Density)
	// Output:
	// T = 288.65 K, p = 70109 Pa, rho = 0.8461 kg/m3
}

func ExamplePressureAltitudeOf() {
	z, err := atmos.PressureAltitudeOf(50000) // Pa
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("pressure altitude %.1f m (geopotential), %.1f m geometric on a standard day\n", z, atmos.GeometricFromGeopotential(z))
	// Output:
	// pressure altitude 5574.4 m (geopotential), 5579.3 m geometric on a standard day
}
