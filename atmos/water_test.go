package atmos

import (
	"math"
	"testing"
)

// Tolerances for the water formulations.
const (
	// if97NineDigitTol is the relative half-unit of the nine significant
	// figures IAPWS prints in its IF97 verification tables.
	if97NineDigitTol = 1e-8
	// iapws08SixDecimalTol is half a unit in the sixth decimal of the
	// IAPWS 2008 verification table, µPa·s.
	iapws08SixDecimalTol = 0.5e-6
)

// TestIF97Region1Volume checks IAPWS R7-97(2012), Table 5: specific volume
// from the region-1 equation.
func TestIF97Region1Volume(t *testing.T) {
	tests := []struct{ T, p, v float64 }{
		{300, 3e6, 0.100215168e-2},
		{300, 80e6, 0.971180894e-3},
		{500, 3e6, 0.120241800e-2},
	}
	for _, tc := range tests {
		if got := if97Region1Volume(tc.T, tc.p); mediaRelErr(got, tc.v) > if97NineDigitTol {
			t.Errorf("if97Region1Volume(%v, %v) = %.9e, want %.9e", tc.T, tc.p, got, tc.v)
		}
		rho, err := WaterDensityAt(tc.T, tc.p)
		if err != nil || mediaRelErr(rho, 1/tc.v) > if97NineDigitTol {
			t.Errorf("WaterDensityAt(%v, %v) = %v, %v, want %v", tc.T, tc.p, rho, err, 1/tc.v)
		}
	}
}

// TestIF97SaturationPressure checks IAPWS R7-97(2012), Table 35.
func TestIF97SaturationPressure(t *testing.T) {
	tests := []struct{ T, pMPa float64 }{
		{300, 0.353658941e-2},
		{500, 0.263889776e1}, // beyond WaterAt's range; checks the equation itself
		{600, 0.123443146e2},
	}
	for _, tc := range tests {
		if got := WaterVapourPressure(tc.T); mediaRelErr(got, tc.pMPa*1e6) > if97NineDigitTol {
			t.Errorf("WaterVapourPressure(%v) = %.9e, want %.9e", tc.T, got, tc.pMPa*1e6)
		}
	}
	// IF97 Table 36 (inverse direction): Ts = 0.372755919e3 K at 0.1 MPa,
	// so the vapour pressure there must be 0.1 MPa, to within the slope
	// times the half-unit 0.5e-6 K of the printed temperature.
	dpdT := (WaterVapourPressure(372.8) - WaterVapourPressure(372.7)) / 0.1
	if got := WaterVapourPressure(0.372755919e3); math.Abs(got-0.1e6) > 0.5e-6*dpdT {
		t.Errorf("WaterVapourPressure(372.755919) = %.9e, want 1e5", got)
	}
}

// TestIAPWS2008Viscosity checks IAPWS R12-08, Table 4 (verification
// values for mu2 = 1), in µPa·s.
func TestIAPWS2008Viscosity(t *testing.T) {
	tests := []struct{ T, rho, mu float64 }{
		{298.15, 998, 889.735100},
		{298.15, 1200, 1437.649467},
		{373.15, 1000, 307.883622},
		{433.15, 1, 14.538324},
		{433.15, 1000, 217.685358},
		{873.15, 1, 32.619287},
		{873.15, 100, 35.802262},
		{873.15, 600, 77.430195},
		{1173.15, 1, 44.217245},
		{1173.15, 100, 47.640433},
		{1173.15, 400, 64.154608},
	}
	for _, tc := range tests {
		got := waterViscosityTD(tc.T, tc.rho) * 1e6
		if math.Abs(got-tc.mu) > iapws08SixDecimalTol {
			t.Errorf("waterViscosityTD(%v, %v) = %.6f µPa·s, want %.6f", tc.T, tc.rho, got, tc.mu)
		}
	}
}

// TestWaterHandbook checks WaterAt against handbook values of liquid water
// at one atmosphere.
func TestWaterHandbook(t *testing.T) {
	tests := []struct {
		T           float64 // K
		rho, rhoTol float64 // kg/m3
		mu, muTol   float64 // Pa·s; 0 skips
		source      string
	}{
		// CRC Handbook of Chemistry and Physics, "Properties of water in
		// the range 0–100 °C": 20 °C density 998.21 kg/m3 and viscosity
		// 1.0016 mPa·s (from memory).
		{293.15, 998.21, 0.005, 1.0016e-3, 0.00005e-3, "CRC Handbook, 20 °C (from memory)"},
		// Maximum density 999.975 kg/m3 at 4 °C (Engineering ToolBox,
		// "Water - Thermophysical Properties"), reached at 3.98 °C.
		{277.13, 999.975, 0.0005, 0, 0, "Engineering ToolBox, maximum density"},
		// M. Chaplin, "Water structure and science", data table of liquid
		// water 0–100 °C (London South Bank University): 0 °C 999.8 kg/m3
		// and 1.792 cP; 100 °C 958.4 kg/m3.
		{273.15, 999.8, 0.05, 1.792e-3, 0.0005e-3, "Chaplin water data table, 0 °C"},
		{373.15, 958.4, 0.05, 0, 0, "Chaplin water data table, 100 °C"},
	}
	for _, tc := range tests {
		w, err := WaterAt(tc.T)
		if err != nil {
			t.Fatalf("WaterAt(%v): %v", tc.T, err)
		}
		if math.Abs(w.Density-tc.rho) > tc.rhoTol {
			t.Errorf("WaterAt(%v).Density = %.4f, want %v (%s)", tc.T, w.Density, tc.rho, tc.source)
		}
		if tc.mu != 0 && math.Abs(w.Viscosity-tc.mu) > tc.muTol {
			t.Errorf("WaterAt(%v).Viscosity = %.6g, want %v (%s)", tc.T, w.Viscosity, tc.mu, tc.source)
		}
		if w.KinematicViscosity != w.Viscosity/w.Density {
			t.Errorf("WaterAt(%v).KinematicViscosity = %v, want mu/rho %v", tc.T, w.KinematicViscosity, w.Viscosity/w.Density)
		}
		if w.VapourPressure != WaterVapourPressure(tc.T) || w.Density != WaterDensity(tc.T) || w.Viscosity != WaterViscosity(tc.T) {
			t.Errorf("WaterAt(%v) = %+v disagrees with the plain functions", tc.T, w)
		}
	}
	// Normal boiling point 99.974 °C = 373.124 K at 101.325 kPa
	// (Engineering ToolBox, "Water - Thermophysical Properties"), printed
	// to 1 mK: the vapour pressure there is 101.325 kPa within the slope
	// times 0.5 mK.
	dpdT := (WaterVapourPressure(373.2) - WaterVapourPressure(373.0)) / 0.2
	if got := WaterVapourPressure(373.124); math.Abs(got-101325) > 0.0005*dpdT {
		t.Errorf("WaterVapourPressure(373.124) = %.1f, want 101325", got)
	}
	// 20 °C vapour pressure 2.339 kPa (Chaplin water data table), printed
	// to 1 Pa.
	if got := WaterVapourPressure(293.15); math.Abs(got-2339) > 0.5 {
		t.Errorf("WaterVapourPressure(293.15) = %.1f, want 2339", got)
	}
}

func TestWaterRangeErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, T := range []float64{273.14, 373.16, 0, -10, nan, inf, -inf} {
		if w, err := WaterAt(T); err == nil {
			t.Errorf("WaterAt(%v) = %+v, want an error", T, w)
		}
	}
	for _, T := range []float64{273.15, 300, 373.15} {
		w, err := WaterAt(T)
		if err != nil {
			t.Errorf("WaterAt(%v): %v", T, err)
			continue
		}
		for _, v := range []float64{w.Density, w.Viscosity, w.KinematicViscosity, w.VapourPressure, w.Pressure} {
			if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
				t.Errorf("WaterAt(%v) = %+v has a non-positive or non-finite field", T, w)
			}
		}
	}
	// Below the vapour pressure the water would boil: region 1 does not apply.
	for _, c := range []struct{ T, p float64 }{
		{300, 3000}, {300, 101e6}, {300, nan}, {650, 30e6}, {nan, 1e5},
	} {
		if w, err := WaterAtPressure(c.T, c.p); err == nil {
			t.Errorf("WaterAtPressure(%v, %v) = %+v, want an error", c.T, c.p, w)
		}
	}
	if w, err := WaterAtPressure(300, 5e6); err != nil || w.Density <= WaterDensity(300) {
		t.Errorf("WaterAtPressure(300, 5 MPa) = %+v, %v, want denser than at 1 atm", w, err)
	}
	for _, T := range []float64{200, 700, nan, inf} {
		if v := WaterDensity(T); !math.IsNaN(v) {
			t.Errorf("WaterDensity(%v) = %v, want NaN", T, v)
		}
		if v := WaterViscosity(T); !math.IsNaN(v) {
			t.Errorf("WaterViscosity(%v) = %v, want NaN", T, v)
		}
		if v := WaterVapourPressure(T); !math.IsNaN(v) {
			t.Errorf("WaterVapourPressure(%v) = %v, want NaN", T, v)
		}
	}
}

func BenchmarkWaterAt(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		_, _ = WaterAt(273.15 + float64(i%100))
	}
}
