package atmos

import (
	"fmt"
	"math"
)

// Liquid water for water tunnels and towing tanks.
//
//   - Density: IAPWS-IF97 region 1 (IAPWS R7-97(2012), "Revised release on
//     the IAPWS industrial formulation 1997 for the thermodynamic properties
//     of water and steam"), the Gibbs free energy g(p, T) and its pressure
//     derivative. IF97 keeps region-1 specific volume within its stated
//     tolerance of the scientific formulation IAPWS-95 (±0.05 %, from
//     memory); at 20 °C and 1 atm it is within 0.001 % of the handbook value
//     998.21 kg/m3 (see the tests).
//   - Viscosity: IAPWS R12-08, "Release on the IAPWS formulation 2008 for
//     the viscosity of ordinary water substance", industrial use: the
//     dilute-gas term mu0(T) times the residual term mu1(T, rho) with the
//     critical enhancement mu2 = 1, which IAPWS allows everywhere except very
//     near the critical point. IAPWS estimates its uncertainty at about 1 %
//     for liquid water at these conditions (from memory).
//   - Vapour pressure: IAPWS-IF97 region 4 saturation-pressure equation,
//     reproducing IAPWS-95 to within a few hundredths of a percent (from
//     memory).
//
// The plain functions WaterDensity, WaterViscosity and WaterVapourPressure
// return NaN outside their formulations' ranges; use WaterAt or
// WaterAtPressure for checked input.

// Water temperature limits of WaterAt, K (0 °C and 100 °C).
const (
	WaterMinTemperature = 273.15
	WaterMaxTemperature = 373.15
)

// Limits of IAPWS-IF97 region 1 (compressed and saturated liquid).
const (
	if97Region1MaxT = 623.15 // K
	if97MaxPressure = 100e6  // Pa
	waterCriticalT  = 647.096
)

// WaterState is liquid water at a temperature.
type WaterState struct {
	Temperature        float64 // K
	Pressure           float64 // Pa, the pressure Density and Viscosity refer to
	Density            float64 // kg/m3
	Viscosity          float64 // dynamic, Pa·s
	KinematicViscosity float64 // m2/s
	VapourPressure     float64 // Pa, saturation pressure at Temperature
}

// waterDefaultPressure is the pressure WaterAt evaluates at: one standard
// atmosphere, or the vapour pressure where that is higher (a few hundredths
// of a kelvin below 100 °C upward), so the state stays liquid.
func waterDefaultPressure(T float64) float64 {
	return math.Max(SeaLevelPressure, WaterVapourPressure(T))
}

// WaterAt returns liquid water at temperature T (K) at one standard
// atmosphere (at the vapour pressure where that exceeds 1 atm, i.e. within
// 0.03 K of 100 °C). T must be finite and within 273.15–373.15 K.
func WaterAt(T float64) (WaterState, error) {
	if math.IsNaN(T) || math.IsInf(T, 0) || T < WaterMinTemperature || T > WaterMaxTemperature {
		return WaterState{}, fmt.Errorf("water temperature %v K: want %v to %v K (0 to 100 °C)",
			T, WaterMinTemperature, WaterMaxTemperature)
	}
	return WaterAtPressure(T, waterDefaultPressure(T))
}

// WaterAtPressure returns compressed liquid water at temperature T (K) and
// pressure p (Pa), for pressurised water tunnels. It accepts the range of
// IAPWS-IF97 region 1: 273.15 K <= T <= 623.15 K and vapour pressure
// <= p <= 100 MPa.
func WaterAtPressure(T, p float64) (WaterState, error) {
	rho, err := WaterDensityAt(T, p)
	if err != nil {
		return WaterState{}, err
	}
	mu := waterViscosityTD(T, rho)
	return WaterState{
		Temperature:        T,
		Pressure:           p,
		Density:            rho,
		Viscosity:          mu,
		KinematicViscosity: mu / rho,
		VapourPressure:     WaterVapourPressure(T),
	}, nil
}

// WaterDensity is the density (kg/m3) of liquid water at temperature T (K)
// at one standard atmosphere (or at its vapour pressure where that is
// higher). It returns NaN outside 273.15–623.15 K.
func WaterDensity(T float64) float64 {
	if !(T >= WaterMinTemperature && T <= if97Region1MaxT) {
		return math.NaN()
	}
	return 1 / if97Region1Volume(T, waterDefaultPressure(T))
}

// WaterViscosity is the dynamic viscosity (Pa·s) of liquid water at
// temperature T (K) at one standard atmosphere (or at its vapour pressure
// where that is higher). It returns NaN outside 273.15–623.15 K.
func WaterViscosity(T float64) float64 {
	rho := WaterDensity(T)
	if math.IsNaN(rho) {
		return rho
	}
	return waterViscosityTD(T, rho)
}

// WaterDensityAt is the density (kg/m3) of liquid water at temperature T
// (K) and pressure p (Pa) from IAPWS-IF97 region 1, with an error outside
// that region.
func WaterDensityAt(T, p float64) (float64, error) {
	if math.IsNaN(T) || math.IsInf(T, 0) || T < WaterMinTemperature || T > if97Region1MaxT {
		return 0, fmt.Errorf("water temperature %v K: want %v to %v K", T, WaterMinTemperature, if97Region1MaxT)
	}
	ps := WaterVapourPressure(T)
	if math.IsNaN(p) || p < ps || p > if97MaxPressure {
		return 0, fmt.Errorf("water pressure %v Pa at %v K: want the vapour pressure %.6g Pa up to %v Pa (liquid)",
			p, T, ps, if97MaxPressure)
	}
	return 1 / if97Region1Volume(T, p), nil
}

// WaterVapourPressure is the saturation pressure (Pa) of water at T (K)
// from the IAPWS-IF97 region 4 saturation-pressure equation. It returns
// NaN outside 273.15 K to the critical temperature 647.096 K.
func WaterVapourPressure(T float64) float64 {
	if !(T >= WaterMinTemperature && T <= waterCriticalT) {
		return math.NaN()
	}
	n := &if97Region4N
	th := T + n[8]/(T-n[9])
	a := th*th + n[0]*th + n[1]
	b := n[2]*th*th + n[3]*th + n[4]
	c := n[5]*th*th + n[6]*th + n[7]
	x := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	x *= x
	return x * x * 1e6 // equation gives MPa
}

// if97Region4N are n1..n10 of IF97 Table 34.
var if97Region4N = [10]float64{
	0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
	0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
	-0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
	0.65017534844798e3,
}

// if97Region1 holds I, J and n of IF97 Table 2 (region 1, 34 terms).
var if97Region1 = [34]struct {
	i, j int
	n    float64
}{
	{0, -2, 0.14632971213167}, {0, -1, -0.84548187169114},
	{0, 0, -0.37563603672040e1}, {0, 1, 0.33855169168385e1},
	{0, 2, -0.95791963387872}, {0, 3, 0.15772038513228},
	{0, 4, -0.16616417199501e-1}, {0, 5, 0.81214629983568e-3},
	{1, -9, 0.28319080123804e-3}, {1, -7, -0.60706301565874e-3},
	{1, -1, -0.18990068218419e-1}, {1, 0, -0.32529748770505e-1},
	{1, 1, -0.21841717175414e-1}, {1, 3, -0.52838357969930e-4},
	{2, -3, -0.47184321073267e-3}, {2, 0, -0.30001780793026e-3},
	{2, 1, 0.47661393906987e-4}, {2, 3, -0.44141845330846e-5},
	{2, 17, -0.72694996297594e-15}, {3, -4, -0.31679644845054e-4},
	{3, 0, -0.28270797985312e-5}, {3, 6, -0.85205128120103e-9},
	{4, -5, -0.22425281908000e-5}, {4, -2, -0.65171222895601e-6},
	{4, 10, -0.14341729937924e-12}, {5, -8, -0.40516996860117e-6},
	{8, -11, -0.12734301741641e-8}, {8, -6, -0.17424871230634e-9},
	{21, -29, -0.68762131295531e-18}, {23, -31, 0.14478307828521e-19},
	{29, -38, 0.26335781662795e-22}, {30, -39, -0.11947622640071e-22},
	{31, -40, 0.18228094581404e-23}, {32, -41, -0.93537087292458e-25},
}

// if97Region1Volume is the specific volume (m3/kg) from IF97 region 1:
// v = R T pi gamma_pi / p with pi = p/16.53 MPa, tau = 1386 K / T and
// gamma_pi = sum -n I (7.1 - pi)^(I-1) (tau - 1.222)^J.
func if97Region1Volume(T, p float64) float64 {
	const (
		rWater = 461.526 // J/(kg·K), specific gas constant of IF97
		pStar  = 16.53e6
		tStar  = 1386.0
	)
	pi := p / pStar
	tau := tStar / T
	a := 7.1 - pi
	b := tau - 1.222
	var gp float64
	for _, c := range if97Region1 {
		if c.i == 0 {
			continue
		}
		gp -= c.n * float64(c.i) * ipow(a, c.i-1) * ipow(b, c.j)
	}
	return rWater * T * gp / pStar
}

// ipow is x^k for small integer k by repeated multiplication.
func ipow(x float64, k int) float64 {
	if k < 0 {
		x, k = 1/x, -k
	}
	r := 1.0
	for k > 0 {
		if k&1 == 1 {
			r *= x
		}
		x *= x
		k >>= 1
	}
	return r
}

// iapws08H0 are H0..H3 of IAPWS R12-08 Table 1; iapws08H is Table 2,
// indexed [i][j] for (1/Tbar - 1)^i (rhobar - 1)^j.
var (
	iapws08H0 = [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}
	iapws08H  = [6][7]float64{
		{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
		{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
		{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
		{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
		{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
		{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
	}
)

// waterViscosityTD is the IAPWS 2008 viscosity (Pa·s) at temperature T (K)
// and density rho (kg/m3), industrial form (mu2 = 1).
func waterViscosityTD(T, rho float64) float64 {
	const (
		rhoStar = 322.0 // kg/m3
		muStar  = 1e-6  // Pa·s
	)
	tb := T / waterCriticalT
	rb := rho / rhoStar
	var den float64
	for i, h := range iapws08H0 {
		den += h / ipow(tb, i)
	}
	mu0 := 100 * math.Sqrt(tb) / den
	x := 1/tb - 1
	y := rb - 1
	var sum float64
	xi := 1.0
	for i := range iapws08H {
		var inner float64
		yj := 1.0
		for j := range iapws08H[i] {
			inner += iapws08H[i][j] * yj
			yj *= y
		}
		sum += xi * inner
		xi *= x
	}
	mu1 := math.Exp(rb * sum)
	return mu0 * mu1 * muStar
}
