package envelope

import (
	"fmt"
	"math"

	"likewind/atmos"
)

// Defaults applied when a file leaves a value out.
const (
	// DefaultAltitudeRows and DefaultSpeedColumns size a grid axis that the
	// file gives neither a step nor a count for.
	DefaultAltitudeRows = 40
	DefaultSpeedColumns = 60
	// MaxAxisPoints is the largest number of points on one grid axis, so a
	// grid holds at most 1000 × 1000 points.
	MaxAxisPoints = 1000
	// MaxBoundaryPoints is the largest number of envelope vertices.
	MaxBoundaryPoints = 1000

	// DefaultPeakLocalMach is the local Mach number on the model at which
	// the condensation check looks (from memory: a typical peak on a
	// transonic wing upper surface).
	DefaultPeakLocalMach = 1.4
	// DefaultMaxSpanFraction is the largest model span as a share of the
	// section width when the model is fitted (common practice).
	DefaultMaxSpanFraction = 0.8

	// Default matching tolerances (common practice).
	DefaultMachTol             = 0.01
	DefaultReTol               = 0.10
	DefaultCompressibilityMach = 0.3
)

// DefaultSettings returns the what-if settings a session starts from: no
// scale override, the vehicle's design-day ΔT, Mach within 0.01, Reynolds
// number within 10 %, Mach relaxed below 0.3 and the default flow-regime
// thresholds. A nil vehicle gives a standard day.
func DefaultSettings(v *Vehicle) Settings {
	s := Settings{
		MachTol:             DefaultMachTol,
		ReTol:               DefaultReTol,
		CompressibilityMach: DefaultCompressibilityMach,
		Regimes:             atmos.DefaultRegimes(),
	}
	if v != nil {
		s.DeltaT = v.DeltaT
	}
	return s
}

// edgeSamples is how many pieces each boundary edge is cut into when the
// boundary is expressed in another speed kind: altitude and speed vary
// linearly along an edge in the boundary's own kind, but not in another.
const edgeSamples = 16

// boundaryBox returns the altitude range of the boundary and its speed range
// expressed in kind, on the vehicle's design day.
func boundaryBox(v *Vehicle, kind atmos.SpeedKind) (altLo, altHi, spLo, spHi float64, err error) {
	altLo, spLo = math.Inf(1), math.Inf(1)
	altHi, spHi = math.Inf(-1), math.Inf(-1)
	n := len(v.Boundary)
	for i, a := range v.Boundary {
		altLo = math.Min(altLo, a.Altitude)
		altHi = math.Max(altHi, a.Altitude)
		b := v.Boundary[(i+1)%n]
		steps := edgeSamples
		if kind == v.BoundaryKind {
			steps = 1 // linear in its own kind: the vertices are the extremes
		}
		for k := 0; k < steps; k++ {
			t := float64(k) / float64(steps)
			h := a.Altitude + t*(b.Altitude-a.Altitude)
			sp := a.Speed + t*(b.Speed-a.Speed)
			if kind != v.BoundaryKind {
				sp, err = convertSpeed(v, h, v.BoundaryKind, sp, kind)
				if err != nil {
					return 0, 0, 0, 0, fmt.Errorf("boundary edge %d–%d: %w", i+1, (i+1)%n+1, err)
				}
			}
			spLo = math.Min(spLo, sp)
			spHi = math.Max(spHi, sp)
		}
	}
	return altLo, altHi, spLo, spHi, nil
}

// convertSpeed re-expresses a speed of kind from at altitude h (of the
// vehicle's altitude kind, on its design day) as kind to.
func convertSpeed(v *Vehicle, h float64, from atmos.SpeedKind, sp float64, to atmos.SpeedKind) (float64, error) {
	st, err := atmos.AtDay(h, v.AltitudeKind, v.DeltaT)
	if err != nil {
		return 0, err
	}
	all, err := atmos.Speeds(from, sp, st)
	if err != nil {
		return 0, err
	}
	return all.Of(to), nil
}

// axisPoints returns how many points an axis has.
func axisPoints(a Axis) int {
	if a.Count > 0 {
		return a.Count
	}
	if a.Step > 0 && a.Max > a.Min {
		n := (a.Max-a.Min)/a.Step + 1e-9
		if n > MaxAxisPoints*10 {
			return MaxAxisPoints * 10
		}
		return int(n) + 1
	}
	return 0
}
