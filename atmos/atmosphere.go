package atmos

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Defining constants of the U.S. Standard Atmosphere 1976 (USSA 1976, Part 1;
// table and section numbers in these comments are from memory unless a test
// names another source) and values derived from them.
const (
	// GasConstantUniversal is R*, the gas constant as adopted by USSA 1976,
	// J/(mol·K). (It differs from the present CODATA value; the standard's
	// tables were computed with this one.)
	GasConstantUniversal = 8.31432
	// MolarMassAir is M0, the sea-level mean molar mass of dry air, kg/mol.
	MolarMassAir = 28.9644e-3
	// G0 is the standard acceleration of gravity, m/s².
	G0 = 9.80665
	// EarthRadius is r0, the effective Earth radius used by USSA 1976 for the
	// geopotential altitude, m.
	EarthRadius = 6356.766e3
	// RAir is the specific gas constant of air, R*/M0 ≈ 287.0531 J/(kg·K).
	RAir = GasConstantUniversal / MolarMassAir
	// GammaAir is the ratio of specific heats of air used by USSA 1976.
	GammaAir = 1.4

	// SeaLevelPressure is the standard sea-level pressure, Pa.
	SeaLevelPressure = 101325.0
	// SeaLevelTemperature is the standard sea-level temperature, K.
	SeaLevelTemperature = 288.15
	// SeaLevelDensity is the standard sea-level density p0/(R T0),
	// ≈ 1.2250 kg/m³.
	SeaLevelDensity = SeaLevelPressure / (RAir * SeaLevelTemperature)
	// SeaLevelSpeedOfSound is sqrt(γ R T0) ≈ 340.294 m/s. Go constants cannot
	// call math.Sqrt; the literal is that expression evaluated in float64,
	// and a test holds it to the computed value.
	SeaLevelSpeedOfSound = 340.29410778693529

	// MinAltitude and MaxAltitude bound the geometric altitude range of the
	// model, m. Below 86 km the air is treated as a well-mixed ideal gas of
	// constant composition.
	MinAltitude = -5000.0
	MaxAltitude = 86000.0

	// CollisionDiameterAir is σ, the effective collision diameter of an air
	// molecule used by USSA 1976 for the mean free path, m.
	CollisionDiameterAir = 3.65e-10
	// AvogadroUSSA is N_A as adopted by USSA 1976, 1/mol.
	AvogadroUSSA = 6.022169e23
)

// Errors returned by the atmosphere functions; test with errors.Is.
var (
	// ErrAltitudeOutOfRange reports an altitude outside the model range or
	// not a finite number.
	ErrAltitudeOutOfRange = errors.New("altitude outside the U.S. Standard Atmosphere 1976 range")
	// ErrPressureOutOfRange reports a pressure outside the range the model
	// reaches between MinAltitude and MaxAltitude, or not a finite number.
	ErrPressureOutOfRange = errors.New("pressure outside the U.S. Standard Atmosphere 1976 range")
	// ErrTemperatureOffset reports a temperature offset that is not finite or
	// that drives the absolute temperature to zero or below.
	ErrTemperatureOffset = errors.New("invalid temperature offset")
)

// AltitudeKind says how an altitude argument is to be read.
type AltitudeKind int

const (
	// Geometric is height above mean sea level as a tape measure gives it.
	Geometric AltitudeKind = iota
	// Geopotential is the altitude scale on which the standard defines its
	// temperature layers (m', equal potential energy per unit mass /G0).
	Geopotential
	// PressureAlt is pressure altitude: the geopotential altitude at which
	// the standard atmosphere has the given pressure (ICAO / ISO 2533, whose
	// tables and altimeter scale are by geopotential altitude; USSA 1976
	// defines its layers on the same scale). Its range is the geopotential
	// range of the model.
	PressureAlt
)

// String returns the name used in messages and files.
func (k AltitudeKind) String() string {
	switch k {
	case Geometric:
		return "geometric"
	case Geopotential:
		return "geopotential"
	case PressureAlt:
		return "pressure"
	}
	return fmt.Sprintf("AltitudeKind(%d)", int(k))
}

// ParseAltitudeKind reads an altitude kind name as written by String, plus a
// few common spellings ("geom", "z", "geop", "h", "pressure-altitude", "pa").
// Case and surrounding space are ignored.
func ParseAltitudeKind(s string) (AltitudeKind, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "geometric", "geom", "z":
		return Geometric, nil
	case "geopotential", "geop", "h":
		return Geopotential, nil
	case "pressure", "pressure-altitude", "pressure altitude", "pa":
		return PressureAlt, nil
	}
	return 0, fmt.Errorf("altitude kind %q: want geometric, geopotential or pressure", s)
}

// State is the state of the air at one point of a standard or off-standard
// day. All values are SI.
type State struct {
	// Altitude is the geometric altitude, m. On an off-standard day it is
	// the standard-day height of the level that defines the pressure (see
	// AtDay).
	Altitude float64
	// GeopotentialAltitude is Altitude on the geopotential scale, m'.
	GeopotentialAltitude float64
	// PressureAltitude is the pressure altitude: the geopotential altitude
	// whose standard pressure equals Pressure, m'. It equals
	// GeopotentialAltitude, since the pressure of every day is the
	// standard pressure at the given level.
	PressureAltitude float64
	// DeltaT is the temperature offset from the standard day, K.
	DeltaT float64
	// Temperature is the (kinetic) static temperature, K.
	Temperature float64
	// Pressure is the static pressure, Pa.
	Pressure float64
	// Density is the air density, kg/m³.
	Density float64
	// SpeedOfSound is sqrt(γ R T), m/s.
	SpeedOfSound float64
	// Viscosity is the dynamic viscosity from Sutherland's law, Pa·s.
	Viscosity float64
	// KinematicViscosity is Viscosity/Density, m²/s.
	KinematicViscosity float64
	// MeanFreePath is the mean free path of the air molecules, m.
	MeanFreePath float64
}

// ussaGMR is g0·M0/R*, the hydrostatic constant, K per geopotential metre.
const ussaGMR = G0 * MolarMassAir / GasConstantUniversal

// Sutherland viscosity law μ = β T^1.5/(T + S) with the constants adopted by
// USSA 1976 (equation 51): β in kg/(m·s·K^0.5), S in K. (The same numbers are
// exported by the gas model; kept private here so the atmosphere stands on
// its own.)
const (
	ussaSutherlandBeta = 1.458e-6
	ussaSutherlandS    = 110.4
)

// Derived constants used on the hot path.
const (
	// ussaMFP turns T/p into the mean free path of USSA 1976:
	// λ = 1/(√2 π σ² n) with the number density n = N_A p/(R* T),
	// so λ = R*/(√2 π σ² N_A) · T/p.
	ussaMFP = GasConstantUniversal / (math.Sqrt2 * math.Pi * CollisionDiameterAir * CollisionDiameterAir * AvogadroUSSA)
	// ussaInvR is 1/R for the density p/(R T_M).
	ussaInvR = 1 / RAir
)

// ussaSqrtGammaR is sqrt(γ R), so that a = ussaSqrtGammaR·sqrt(T_M). Go
// constants cannot call math.Sqrt; the literal is the float64 value of
// sqrt(1.4·8.31432/28.9644e-3), held to it by a test.
const ussaSqrtGammaR = 20.046802759190566

// ussaLayer is one layer of the temperature profile in geopotential altitude.
// Temperatures here are molecular-scale temperatures T_M, on which USSA 1976
// defines its layers; T_M equals the kinetic temperature below 80 km
// geometric.
type ussaLayer struct {
	hBase    float64 // base geopotential altitude, m'
	tBase    float64 // T_M at the base, K
	pBase    float64 // pressure at the base, Pa
	lapse    float64 // dT_M/dH, K/m'
	invTBase float64 // 1/tBase
	// For lapse != 0: p = pBase·(T_M/tBase)^expo with expo = -g0M0/(R* lapse).
	// For lapse == 0: p = pBase·exp(slope·(H - hBase)) with slope = -g0M0/(R* tBase).
	expo  float64
	slope float64
}

// ussaLayerCount is the number of layers from 0 to 84.852 km'.
const ussaLayerCount = 7

// ussaTable is the immutable table of layer bases, computed once from the
// defining base altitudes and lapse rates (USSA 1976, Table 4) with the exact
// hydrostatic solution of each layer (USSA 1976, equations 33a and 33b).
type ussaTable struct {
	layers [ussaLayerCount]ussaLayer
	// hMin, hMax: the model range on the geopotential scale.
	hMin, hMax float64
	// pMin, pMax: pressures at MaxAltitude and MinAltitude.
	pMin, pMax float64
}

// ussa is the layer table. It is built once at package initialisation and
// never written afterwards.
var ussa = newUSSATable()

func newUSSATable() ussaTable {
	// Defining base geopotential altitudes (m') and lapse rates (K/m'),
	// USSA 1976 Table 4. The first layer also serves down to -5 km.
	hb := [ussaLayerCount]float64{0, 11000, 20000, 32000, 47000, 51000, 71000}
	lb := [ussaLayerCount]float64{-6.5e-3, 0, 1.0e-3, 2.8e-3, 0, -2.8e-3, -2.0e-3}

	var t ussaTable
	T, p := SeaLevelTemperature, SeaLevelPressure
	for i := range t.layers {
		if i > 0 {
			// Carry T and p from the base of the layer below to this base.
			prev := t.layers[i-1]
			T, p = prev.at(hb[i])
		}
		l := ussaLayer{hBase: hb[i], tBase: T, pBase: p, lapse: lb[i], invTBase: 1 / T}
		if lb[i] != 0 {
			l.expo = -ussaGMR / lb[i]
		} else {
			l.slope = -ussaGMR / T
		}
		t.layers[i] = l
	}
	t.hMin = GeopotentialFromGeometric(MinAltitude)
	t.hMax = GeopotentialFromGeometric(MaxAltitude)
	_, t.pMin = t.layers[ussaLayerCount-1].at(t.hMax)
	_, t.pMax = t.layers[0].at(t.hMin)
	return t
}

// at returns T_M and p at geopotential altitude h within (or extrapolated
// from) the layer.
func (l *ussaLayer) at(h float64) (tm, p float64) {
	dh := h - l.hBase
	tm = l.tBase + l.lapse*dh
	if l.lapse == 0 {
		return tm, l.pBase * math.Exp(l.slope*dh)
	}
	return tm, l.pBase * math.Exp(l.expo*math.Log(tm*l.invTBase))
}

// layerFor picks the layer holding geopotential altitude h by comparisons
// (a fixed decision tree; no search loop). Altitudes below 0 fall in the
// first layer and above 71 km' in the last, as the model range requires.
func (t *ussaTable) layerFor(h float64) *ussaLayer {
	if h < 32000 {
		if h < 11000 {
			return &t.layers[0]
		}
		if h < 20000 {
			return &t.layers[1]
		}
		return &t.layers[2]
	}
	if h < 51000 {
		if h < 47000 {
			return &t.layers[3]
		}
		return &t.layers[4]
	}
	if h < 71000 {
		return &t.layers[5]
	}
	return &t.layers[6]
}

// ussaMWRatios tabulates M/M0 from 80 to 86 km geometric at 0.5 km steps
// (USSA 1976, Table 8). Above 80 km the kinetic temperature is T = T_M·M/M0,
// by the definition of the molecular-scale temperature; below it the ratio
// is 1. Values written from memory of Table 8; they agree digit for digit
// with an independent public copy of the tables, and the 86 km value with the
// standard's M7/M0 = 0.99957908 (also from memory).
var ussaMWRatios = [13]float64{
	1.000000, 0.999996, 0.999989, 0.999971, 0.999941, 0.999909, 0.999870,
	0.999829, 0.999786, 0.999741, 0.999694, 0.999641, 0.999579,
}

// ussaMWRatio returns M/M0 at geometric altitude z by linear interpolation
// in Table 8 (1 at and below 80 km).
func ussaMWRatio(z float64) float64 {
	if z <= 80000 {
		return 1
	}
	x := (z - 80000) / 500
	i := int(x)
	if i >= len(ussaMWRatios)-1 {
		return ussaMWRatios[len(ussaMWRatios)-1]
	}
	f := x - float64(i)
	return ussaMWRatios[i] + f*(ussaMWRatios[i+1]-ussaMWRatios[i])
}

// GeopotentialFromGeometric converts geometric altitude z (m) to geopotential
// altitude (m'): H = r0 z/(r0 + z) (USSA 1976, equation 19). It does no
// range check.
func GeopotentialFromGeometric(z float64) float64 {
	return EarthRadius * z / (EarthRadius + z)
}

// GeometricFromGeopotential converts geopotential altitude h (m') to
// geometric altitude (m): z = r0 h/(r0 - h), the inverse of
// GeopotentialFromGeometric. It does no range check.
func GeometricFromGeopotential(h float64) float64 {
	return EarthRadius * h / (EarthRadius - h)
}

// At returns the standard-day state at geometric altitude z (m), from
// MinAltitude to MaxAltitude. Any other z, NaN or ±Inf gives an error that
// wraps ErrAltitudeOutOfRange.
func At(z float64) (State, error) {
	if !(z >= MinAltitude && z <= MaxAltitude) { // also rejects NaN
		return State{}, altitudeError(z, Geometric)
	}
	h := EarthRadius * z / (EarthRadius + z)
	l := ussa.layerFor(h)
	dh := h - l.hBase
	tm := l.tBase + l.lapse*dh
	var p float64
	if l.lapse == 0 {
		p = l.pBase * math.Exp(l.slope*dh)
	} else {
		p = l.pBase * math.Exp(l.expo*math.Log(tm*l.invTBase))
	}
	if z > 80000 {
		return ussaState(z, h, tm, p, 0), nil
	}
	// Below 80 km the kinetic and molecular-scale temperatures coincide and
	// one square root serves both the speed of sound and T^1.5. One
	// division gives 1/T and 1/(T+S) without waiting for the pressure; 1/p
	// is the only division after it. (Same formulas as ussaState.)
	sq := math.Sqrt(tm)
	ts := tm + ussaSutherlandS
	r := 1 / (tm * ts)
	invP := 1 / p
	mu := ussaSutherlandBeta * tm * tm * sq * r
	return State{
		Altitude:             z,
		GeopotentialAltitude: h,
		PressureAltitude:     h,
		Temperature:          tm,
		Pressure:             p,
		Density:              p * ussaInvR * ts * r,
		SpeedOfSound:         ussaSqrtGammaR * sq,
		Viscosity:            mu,
		KinematicViscosity:   mu * RAir * tm * invP,
		MeanFreePath:         ussaMFP * tm * invP,
	}, nil
}

// AtDay returns the state at altitude alt read as kind, on a day whose
// temperature differs from the standard by dT (K).
//
// The pressure is the standard pressure at the given level, the temperature
// is the standard temperature there plus dT, and the density follows from
// the ideal-gas law. With dT ≠ 0 the given altitude is therefore taken to
// define the pressure level, as is common practice for hot and cold days
// (the true geometric height of that pressure level differs). A PressureAlt
// argument is the same number as a Geopotential one: pressure altitude is
// measured on the geopotential scale.
//
// Errors: an altitude outside MinAltitude..MaxAltitude (on its own scale), a
// non-finite altitude or dT, or a dT that makes the temperature zero or
// negative.
func AtDay(alt float64, kind AltitudeKind, dT float64) (State, error) {
	var z, h float64
	switch kind {
	case Geometric:
		if !(alt >= MinAltitude && alt <= MaxAltitude) {
			return State{}, altitudeError(alt, kind)
		}
		z = alt
		h = GeopotentialFromGeometric(z)
	case Geopotential, PressureAlt:
		if !(alt >= ussa.hMin && alt <= ussa.hMax) {
			return State{}, altitudeError(alt, kind)
		}
		h = alt
		// Clamp so a round-off in the conversion cannot leave the range.
		z = math.Min(math.Max(GeometricFromGeopotential(h), MinAltitude), MaxAltitude)
	default:
		return State{}, fmt.Errorf("atmosphere: unknown altitude kind %d", int(kind))
	}
	if math.IsNaN(dT) || math.IsInf(dT, 0) {
		return State{}, fmt.Errorf("atmosphere at %s altitude %g m: temperature offset %g K: %w",
			kind, alt, dT, ErrTemperatureOffset)
	}
	tm, p := ussa.layerFor(h).at(h)
	if tm+dT <= 0 {
		return State{}, fmt.Errorf("atmosphere at %s altitude %g m: offset %g K on standard %.2f K gives T ≤ 0: %w",
			kind, alt, dT, tm, ErrTemperatureOffset)
	}
	return ussaState(z, h, tm, p, dT), nil
}

// ussaState completes a State from the geometric and geopotential altitudes,
// the standard molecular-scale temperature, the pressure and the offset.
func ussaState(z, h, tmStd, p, dT float64) State {
	tm := tmStd + dT // molecular-scale temperature of the day
	t := tm          // kinetic temperature
	sqTM := math.Sqrt(tm)
	sqT := sqTM
	ratio := 1.0
	if z > 80000 {
		ratio = ussaMWRatio(z)
		t = tm * ratio // kinetic T from T_M
		sqT = math.Sqrt(t)
	}
	// One division gives both 1/T and 1/(T+S) and does not wait for the
	// pressure; 1/p is the only division after it.
	ts := t + ussaSutherlandS
	r := 1 / (t * ts)
	invP := 1 / p
	mu := ussaSutherlandBeta * t * t * sqT * r // β T^1.5/(T+S), USSA 1976 eq. 51
	return State{
		Altitude:             z,
		GeopotentialAltitude: h,
		PressureAltitude:     h,
		DeltaT:               dT,
		Temperature:          t,
		Pressure:             p,
		Density:              p * ussaInvR * ratio * ts * r, // p M0/(R* T_M), eq. 42
		SpeedOfSound:         ussaSqrtGammaR * sqTM,         // sqrt(γ R* T_M/M0), eq. 50
		Viscosity:            mu,
		KinematicViscosity:   mu * RAir * tm * invP, // μ/ρ
		MeanFreePath:         ussaMFP * t * invP,    // λ = 1/(√2 π σ² n)
	}
}

// AltitudeRange is the model range on the scale of kind, m: MinAltitude to
// MaxAltitude geometric, about -5004 to 84852 m' geopotential (and pressure
// altitude, which is on the geopotential scale).
func AltitudeRange(kind AltitudeKind) (lo, hi float64) {
	if kind == Geopotential || kind == PressureAlt {
		return ussa.hMin, ussa.hMax
	}
	return MinAltitude, MaxAltitude
}

func altitudeError(alt float64, kind AltitudeKind) error {
	lo, hi := AltitudeRange(kind)
	return fmt.Errorf("atmosphere: %s altitude %g m: want %.0f to %.0f m: %w",
		kind, alt, lo, hi, ErrAltitudeOutOfRange)
}

// PressureAltitudeOf returns the pressure altitude of pressure p (Pa): the
// geopotential altitude (m') at which the standard atmosphere has that
// pressure, by the closed-form inverse of each layer. GeometricFromGeopotential
// gives its standard-day geometric height.
// Pressures outside the model range (about 0.373 Pa to 177.7 kPa), NaN and
// ±Inf give an error wrapping ErrPressureOutOfRange.
func PressureAltitudeOf(p float64) (float64, error) {
	if !(p >= ussa.pMin && p <= ussa.pMax) {
		return 0, fmt.Errorf("atmosphere: pressure %g Pa: want %.4g to %.6g Pa: %w",
			p, ussa.pMin, ussa.pMax, ErrPressureOutOfRange)
	}
	// The first layer (from the top) whose base pressure is at least p.
	i := ussaLayerCount - 1
	for i > 0 && p > ussa.layers[i].pBase {
		i--
	}
	l := &ussa.layers[i]
	var h float64
	if l.lapse == 0 {
		h = l.hBase + math.Log(p/l.pBase)/l.slope
	} else {
		tm := l.tBase * math.Pow(p/l.pBase, 1/l.expo)
		h = l.hBase + (tm-l.tBase)/l.lapse
	}
	// Round-off at the range ends must not step outside the model range.
	return math.Min(math.Max(h, ussa.hMin), ussa.hMax), nil
}
