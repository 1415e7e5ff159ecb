package envelope

import (
	"fmt"
	"math"
)

// Model loads, for planning against a balance and sting (a planning
// estimate, not a stress analysis). The vehicle gives the largest
// coefficients to plan for, the facility the balance's capacity. At a
// setting of test-section dynamic pressure q, a model of scale s carries
//
//	normal force     N = CN·q·A·s²        (A: the coefficients' area)
//	pitching moment  M = Cm·q·A·s²·(s·L)  (L: the vehicle's reference length)
//
// with Cm taken about the balance moment centre (the usual coefficient
// definition M = Cm·q·A·l with the model's reference length as l). Both
// grow with q, so the balance caps q like a facility's q max:
//
//	q ≤ q_load = min(Nmax/(CN·A·s²), Mmax/(Cm·A·L·s³)).
//
// The largest coefficients are the planner's choice (the highest angle of
// attack to be run, gusts and starting loads where the facility asks for
// them); a real test checks loads with the balance's own calibration and
// interaction rules and the facility's procedures.

// ModelLoads is a vehicle's optional load data. A zero coefficient means
// not given.
type ModelLoads struct {
	// CNMax is the largest normal-force (or lift) coefficient to plan for.
	CNMax float64
	// Area is the reference area of CNMax and CmMax, m²; 0 means the
	// vehicle's RefArea.
	Area float64
	// CmMax is the largest pitching-moment coefficient about the balance
	// moment centre, on Area and the vehicle's reference length.
	CmMax float64
}

// Set reports whether any load coefficient is given.
func (l ModelLoads) Set() bool { return l.CNMax > 0 || l.CmMax > 0 }

// BalanceLimits are a facility's optional balance and sting capacity. A
// zero capacity means not given.
type BalanceLimits struct {
	MaxNormalForce float64 // N
	MaxPitchMoment float64 // N·m, about the balance moment centre
}

// Set reports whether any capacity is given.
func (b BalanceLimits) Set() bool { return b.MaxNormalForce > 0 || b.MaxPitchMoment > 0 }

// loadModel is the load of one vehicle's model on one facility's balance
// per unit dynamic pressure, at scale 1.
type loadModel struct {
	forcePerQ  float64 // CN·A, m² (N per Pa at scale 1)
	momentPerQ float64 // Cm·A·L, m³ (N·m per Pa at scale 1)
	maxN, maxM float64 // capacity, 0: none
}

func newLoadModel(v *Vehicle, f *Facility) loadModel {
	if v == nil || f == nil {
		return loadModel{}
	}
	area := v.Loads.Area
	if !(area > 0) {
		area = v.RefArea
	}
	return loadModel{
		forcePerQ:  v.Loads.CNMax * area,
		momentPerQ: v.Loads.CmMax * area * v.RefLength,
		maxN:       f.Balance.MaxNormalForce,
		maxM:       f.Balance.MaxPitchMoment,
	}
}

// checks reports whether the balance is checked at all: some capacity
// with the coefficient that loads it.
func (l loadModel) checks() bool {
	return l.maxN > 0 && l.forcePerQ > 0 || l.maxM > 0 && l.momentPerQ > 0
}

// qCap is q_load at scale s: the dynamic pressure at which the model
// reaches the first of the balance's capacities (0: no limit).
func (l loadModel) qCap(s float64) float64 {
	q := math.Inf(1)
	if l.maxN > 0 && l.forcePerQ > 0 {
		q = l.maxN / (l.forcePerQ * s * s)
	}
	if l.maxM > 0 && l.momentPerQ > 0 {
		q = math.Min(q, l.maxM/(l.momentPerQ*s*s*s))
	}
	if math.IsInf(q, 1) || !(q > 0) {
		return 0
	}
	return q
}

// at is the load of the model of scale s at dynamic pressure q.
func (l loadModel) at(q, s float64) Load {
	d := Load{
		NormalForce:    l.forcePerQ * q * s * s,
		PitchMoment:    l.momentPerQ * q * s * s * s,
		MaxNormalForce: l.maxN, MaxPitchMoment: l.maxM,
	}
	if l.maxN > 0 && l.forcePerQ > 0 {
		d.Share = d.NormalForce / l.maxN
	}
	if l.maxM > 0 && l.momentPerQ > 0 {
		d.Share = math.Max(d.Share, d.PitchMoment/l.maxM)
	}
	d.QCap = l.qCap(s)
	return d
}

// Load is the planning load of the model at a point's setting.
type Load struct {
	// NormalForce (N) and PitchMoment (N·m) are the loads at the largest
	// coefficients of the vehicle's load data (0 where it gives none).
	NormalForce, PitchMoment float64
	// MaxNormalForce and MaxPitchMoment are the facility's capacities (0:
	// none given).
	MaxNormalForce, MaxPitchMoment float64
	// Share is the larger of the loads over its capacity (0 when the
	// balance is not checked: no capacity, or no coefficient for it).
	Share float64
	// QCap is the dynamic pressure at which the model reaches capacity at
	// this scale (0: not checked).
	QCap float64
}

// CheckModelLoads checks a vehicle's load data: each coefficient 0 (not
// given) or within LoadCoefficientBound, the area 0 (the reference area)
// or above 0, and a coefficient given when an area is. The error names the
// field ("max_normal_coefficient" style names are the loader's to choose:
// Field is "CNMax", "CmMax" or "Area").
func CheckModelLoads(l ModelLoads) error {
	for _, x := range []struct {
		field string
		v     float64
	}{{"CNMax", l.CNMax}, {"CmMax", l.CmMax}} {
		if x.v != 0 {
			if err := LoadCoefficientBound().Check(numberText(x.v), x.v); err != nil {
				return &LoadError{Field: x.field, Err: err}
			}
		}
	}
	if l.Area != 0 && !(l.Area > 0 && l.Area <= MaxArea) {
		return &LoadError{Field: "Area", Err: &OutOfBounds{Found: numberText(l.Area) + " m2",
			Expected: fmt.Sprintf("an area above 0 and at most %g m2 (leave it out for the reference area)", MaxArea)}}
	}
	if l.Area != 0 && !l.Set() {
		return &LoadError{Field: "Area", Err: &OutOfBounds{Found: "a load area with no coefficient",
			Expected: "the largest normal-force or pitching-moment coefficient it goes with"}}
	}
	return nil
}

// CheckBalance checks a facility's balance capacity: each 0 (not given) or
// within its bound.
func CheckBalance(b BalanceLimits) error {
	if b.MaxNormalForce != 0 {
		if err := BalanceForceBound().Check(numberText(b.MaxNormalForce)+" N", b.MaxNormalForce); err != nil {
			return &LoadError{Field: "MaxNormalForce", Err: err}
		}
	}
	if b.MaxPitchMoment != 0 {
		if err := BalanceMomentBound().Check(numberText(b.MaxPitchMoment)+" N·m", b.MaxPitchMoment); err != nil {
			return &LoadError{Field: "MaxPitchMoment", Err: err}
		}
	}
	return nil
}

// LoadError is a bad value in load data; Field names the struct field
// (ModelLoads or BalanceLimits) for the caller to map to its own key.
type LoadError struct {
	Field string
	Err   error
}

func (e *LoadError) Error() string { return e.Field + ": " + e.Err.Error() }
func (e *LoadError) Unwrap() error { return e.Err }
