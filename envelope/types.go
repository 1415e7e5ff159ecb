// Package envelope holds flight vehicles and their altitude–speed envelopes,
// ground test facilities, the grid of flight conditions, and the similarity
// matching that decides, point by point, which conditions a facility can
// reproduce with a scale model. It also loads and validates the vehicle and
// facility files and writes the data exports. It contains no terminal code.
//
// All quantities are SI (m, m/s, Pa, K) once loaded; units are parsed only at
// the file edge.
package envelope

import "likewind/atmos"

// Vehicle is a flight vehicle with its envelope and the grid to evaluate it on.
type Vehicle struct {
	Name string
	// Source is the file the vehicle came from ("" for built-in data).
	Source string

	RefLength     float64 // m, length used for Reynolds and Knudsen numbers
	RefLengthName string  // what the length is, e.g. "mean aerodynamic chord"
	RefArea       float64 // m²
	Span          float64 // m, full-scale span (for the model-span rule)
	FrontalArea   float64 // m², full-scale frontal area (for the blockage rule)
	// Loads is the optional load data for planning balance loads
	// (loads.go).
	Loads ModelLoads

	// Boundary is the closed envelope outline, in order, in (altitude,
	// speed) with speeds of kind BoundaryKind. The last vertex joins the
	// first.
	Boundary     []Vertex
	BoundaryKind atmos.SpeedKind
	// AltitudeKind says how the file's altitudes are meant (geometric by
	// default).
	AltitudeKind atmos.AltitudeKind

	Limits Limits
	DeltaT float64 // K, temperature offset of the design day
	Grid   GridSpec
}

// Vertex is one corner of an envelope boundary: altitude in m and a speed
// whose kind is the boundary's (Mach number, or m/s for TAS, EAS and CAS).
type Vertex struct {
	Altitude float64
	Speed    float64
}

// Limits are optional straight limit lines that clip the envelope. A zero
// value means the limit is not set.
type Limits struct {
	Ceiling  float64 // m
	MaxMach  float64
	MaxEAS   float64 // m/s
	MaxCAS   float64 // m/s
	MaxQ     float64 // Pa, flight dynamic pressure
	MinSpeed float64 // in MinSpeedKind units (Mach or m/s)
	// MinSpeedKind is the kind of MinSpeed.
	MinSpeedKind atmos.SpeedKind
}

// Axis describes one grid axis: from Min to Max inclusive, either with a
// fixed Step or with Count points. When both are zero the loader derives
// the axis from the boundary.
type Axis struct {
	Min, Max float64
	Step     float64
	Count    int
}

// GridSpec is the altitude axis (m) and the speed axis with its kind.
type GridSpec struct {
	Altitude  Axis
	Speed     Axis
	SpeedKind atmos.SpeedKind
}

// Medium is the working fluid of a facility: a gas by the name
// atmos.GasByName gives it ("air", "nitrogen"), or MediumWater.
type Medium string

// MediumWater is liquid water (IAPWS properties, see atmos/water.go).
const MediumWater Medium = "water"

func (m Medium) String() string { return string(m) }

// IsGas reports whether the medium is a gas (compressible): any medium
// but water. Solve refuses a name atmos.GasByName does not know.
func (m Medium) IsGas() bool { return m != MediumWater && m != "" }

// Facility is a ground test facility with its operating limits: those of
// its medium in Gas (a gas facility) or Water (a water facility), the
// other left zero, and those every facility has.
type Facility struct {
	Name   string
	Class  string // free text, e.g. "pressurized transonic"
	Source string // file it came from
	Medium Medium

	Gas   GasLimits   // when Medium is a gas
	Water WaterLimits // when Medium is MediumWater

	QMax float64 // Pa, test-section dynamic pressure, 0 = no limit
	// MaxReynoldsPerM is an optional cap on unit Reynolds number (1/m), 0 =
	// none.
	MaxReynoldsPerM float64

	Width, Height float64 // m, test section
	Model         ModelSizing

	// Rule picks the setting where many reach the target (rule.go); the
	// zero value is the standard rule, RuleWarmest.
	Rule OperatingRule
	// Balance is the optional balance and sting capacity (loads.go).
	Balance BalanceLimits
	// Campaign is the optional time and cost data (campaign.go).
	Campaign Campaign
}

// GasLimits are the operating limits of a gas facility.
type GasLimits struct {
	MachMin, MachMax float64 // test-section Mach number
	P0Min, P0Max     float64 // stagnation pressure, Pa
	T0Min, T0Max     float64 // stagnation temperature, K

	// MinStaticT is a lower bound on test-section static temperature (K),
	// 0 when not set.
	MinStaticT float64
	// Condensation turns on the saturation-line check of the medium.
	Condensation bool
	// PeakLocalMach is the local Mach number on the model at which the
	// condensation warning is evaluated (default 1.4).
	PeakLocalMach float64
}

// WaterLimits are the operating limits of a water facility.
type WaterLimits struct {
	SpeedMin, SpeedMax float64 // test-section speed, m/s
	// PMin and PMax bound the test-section static pressure (Pa); the
	// solve takes PMax (for the water properties and the cavitation
	// number).
	PMin, PMax float64
	TMin, TMax float64 // water temperature, K
}

// PressureMin and PressureMax are the facility's pressure limits: the
// stagnation pressure of a gas facility, the test-section static pressure
// of a water facility. TemperatureMin and TemperatureMax are its
// temperature limits: stagnation temperature (gas) or water temperature.
// They are the limits the what-if editor changes, whatever the medium.
func (f *Facility) PressureMin() float64 { return *f.ranges().pMin }

// PressureMax: see PressureMin.
func (f *Facility) PressureMax() float64 { return *f.ranges().pMax }

// TemperatureMin: see PressureMin.
func (f *Facility) TemperatureMin() float64 { return *f.ranges().tMin }

// TemperatureMax: see PressureMin.
func (f *Facility) TemperatureMax() float64 { return *f.ranges().tMax }

// SetPressureMax sets the limit PressureMax reads.
func (f *Facility) SetPressureMax(p float64) { *f.ranges().pMax = p }

// SetTemperatureMin sets the limit TemperatureMin reads.
func (f *Facility) SetTemperatureMin(T float64) { *f.ranges().tMin = T }

// rangeLimits points at the pressure and temperature limits of a
// facility's medium.
type rangeLimits struct{ pMin, pMax, tMin, tMax *float64 }

func (f *Facility) ranges() rangeLimits {
	if f.Medium == MediumWater {
		w := &f.Water
		return rangeLimits{&w.PMin, &w.PMax, &w.TMin, &w.TMax}
	}
	g := &f.Gas
	return rangeLimits{&g.P0Min, &g.P0Max, &g.T0Min, &g.T0Max}
}

// ModelSizing says how big the model is: a fixed scale, or the largest scale
// that fits the section by the span and blockage rules.
type ModelSizing struct {
	// Scale is the fixed model scale (model/full size); 0 means "fit".
	Scale float64
	// MaxSpanFraction is the largest model span as a fraction of the
	// section width (common practice: about 0.8).
	MaxSpanFraction float64
	// MaxBlockage is the largest frontal-area blockage as a fraction of the
	// section area; 0 means by speed: about 5 % at low speed and 1 %
	// transonic (common practice).
	MaxBlockage float64
}

// Settings are the what-if values a user can change without editing files.
type Settings struct {
	// Scale overrides every facility's model scale when > 0.
	Scale  float64
	DeltaT float64 // K

	// MachTol is the absolute Mach tolerance for a match.
	MachTol float64
	// ReTol is the relative Reynolds-number tolerance: a match needs
	// Re_model/Re_flight ≥ 1−ReTol.
	ReTol float64
	// CompressibilityMach is the flight Mach below which Mach may be
	// relaxed to match Reynolds number (common practice 0.3).
	CompressibilityMach float64

	// Rule overrides every facility's operating rule when its Kind is not
	// RuleDefault (see RuleInForce); Solve refuses a rule that does not
	// suit a facility (CheckRule).
	Rule OperatingRule

	Regimes atmos.Regimes
}
