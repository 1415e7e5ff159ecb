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

// Medium is the working fluid of a facility.
type Medium uint8

const (
	MediumAir Medium = iota
	MediumNitrogen
	MediumWater
)

func (m Medium) String() string {
	switch m {
	case MediumAir:
		return "air"
	case MediumNitrogen:
		return "nitrogen"
	case MediumWater:
		return "water"
	}
	return "unknown"
}

// IsGas reports whether the medium is compressible (air or nitrogen).
func (m Medium) IsGas() bool { return m == MediumAir || m == MediumNitrogen }

// Facility is a ground test facility with its operating limits. For a gas
// facility the P0/T0 ranges are stagnation pressure and temperature; for a
// water facility SpeedMin/SpeedMax bound the test-section speed, T0Min/T0Max
// bound the water temperature and P0Min/P0Max bound the test-section static
// pressure (used for the cavitation number).
type Facility struct {
	Name   string
	Class  string // free text, e.g. "pressurized transonic"
	Source string // file it came from
	Medium Medium

	MachMin, MachMax   float64 // gas
	SpeedMin, SpeedMax float64 // water, m/s
	P0Min, P0Max       float64 // Pa
	T0Min, T0Max       float64 // K
	QMax               float64 // Pa, 0 = no limit

	// MinStaticT is a lower bound on test-section static temperature (K),
	// 0 when not set.
	MinStaticT float64
	// Condensation turns on the saturation-line check of the medium.
	Condensation bool
	// PeakLocalMach is the local Mach number on the model at which the
	// condensation warning is evaluated (default 1.4).
	PeakLocalMach float64
	// MaxReynoldsPerM is an optional cap on unit Reynolds number (1/m), 0 =
	// none.
	MaxReynoldsPerM float64

	Width, Height float64 // m, test section
	Model         ModelSizing
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

	Regimes atmos.Regimes
}
