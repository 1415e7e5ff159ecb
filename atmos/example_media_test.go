package atmos_test

import (
	"fmt"

	"likewind/atmos"
)

func ExampleAir() {
	air := atmos.Air()
	beta, s := air.Sutherland()
	fmt.Printf("%s: gamma %.1f, R %.4f J/(kg K), Sutherland beta %.3e, S %.1f K\n",
		air.Name(), air.Gamma(), air.R(), beta, s)
	fmt.Printf("viscosity at 288.15 K: %.4e Pa s\n", air.Viscosity(288.15))
	// Output:
	// air: gamma 1.4, R 287.0531 J/(kg K), Sutherland beta 1.458e-06, S 110.4 K
	// viscosity at 288.15 K: 1.7894e-05 Pa s
}

func ExampleIdealGas_SaturationTemperature() {
	n2 := atmos.Nitrogen()
	for _, p := range []float64{1e3, 101325, 1e6} {
		fmt.Printf("N2 condenses below %.2f K at %.0f Pa\n", n2.SaturationTemperature(p), p)
	}
	// Output:
	// N2 condenses below 52.93 K at 1000 Pa
	// N2 condenses below 77.36 K at 101325 Pa
	// N2 condenses below 103.75 K at 1000000 Pa
}

func ExampleCondenses() {
	// Test-section static state of a cold, low-pressure air stream.
	air := atmos.Air()
	for _, T := range []float64{50, 60} {
		fmt.Printf("air at %.0f K, 2 kPa: condensation possible = %v\n", T, atmos.Condenses(air, T, 2000))
	}
	// Output:
	// air at 50 K, 2 kPa: condensation possible = true
	// air at 60 K, 2 kPa: condensation possible = false
}

func ExampleGasByName() {
	g, err := atmos.GasByName("N2")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s R = %.2f J/(kg K)\n", g.Name(), g.R())
	_, err = atmos.GasByName("helium")
	fmt.Println(err)
	// Output:
	// nitrogen R = 296.80 J/(kg K)
	// unknown gas "helium": want one of air, nitrogen, n2
}

func ExampleWaterAt() {
	w, err := atmos.WaterAt(293.15)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("rho %.2f kg/m3, mu %.4f mPa s, nu %.4e m2/s, pv %.0f Pa\n",
		w.Density, w.Viscosity*1e3, w.KinematicViscosity, w.VapourPressure)
	_, err = atmos.WaterAt(380)
	fmt.Println(err)
	// Output:
	// rho 998.21 kg/m3, mu 1.0016 mPa s, nu 1.0034e-06 m2/s, pv 2339 Pa
	// water temperature 380 K: want 273.15 to 373.15 K (0 to 100 °C)
}

func ExamplePressureRatio() {
	for _, M := range []float64{0.5, 1, 2} {
		fmt.Printf("M %.1f: p/p0 %.5f  T/T0 %.5f  rho/rho0 %.5f\n", M,
			atmos.PressureRatio(M, 1.4), atmos.TemperatureRatio(M, 1.4), atmos.DensityRatio(M, 1.4))
	}
	// Output:
	// M 0.5: p/p0 0.84302  T/T0 0.95238  rho/rho0 0.88517
	// M 1.0: p/p0 0.52828  T/T0 0.83333  rho/rho0 0.63394
	// M 2.0: p/p0 0.12780  T/T0 0.55556  rho/rho0 0.23005
}

func ExampleMachFromPitotRatio() {
	// A pitot probe reads 5.6404 times the free-stream static pressure.
	M, err := atmos.MachFromPitotRatio(5.6404, 1.4)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("M = %.4f\n", M)
	// Output:
	// M = 2.0000
}

func ExampleNormalShockAt() {
	ns, err := atmos.NormalShockAt(3, 1.4)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("M2 %.5f, p2/p1 %.4f, T2/T1 %.4f, p02/p01 %.5f, p02/p1 %.4f\n",
		ns.M2, ns.PressureRatio, ns.TemperatureRatio, ns.TotalPressureRatio, ns.PitotRatio)
	// Output:
	// M2 0.47519, p2/p1 10.3333, T2/T1 2.6790, p02/p01 0.32834, p02/p1 12.0610
}
