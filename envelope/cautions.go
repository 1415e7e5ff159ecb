package envelope

import (
	"fmt"
	"strconv"
)

// QuantityFormat writes quantities with their units for caution texts, so
// a caution reads in the unit system of the screen it is shown on. The
// interface passes its unit setting; Detail.Cautions uses SIFormat.
type QuantityFormat interface {
	Temp(k float64) string        // absolute temperature, from K
	Stagnation(pa float64) string // stagnation or vessel pressure, from Pa
	Q(pa float64) string          // dynamic pressure, from Pa
	Force(n float64) string       // force (model load, balance capacity), from N
	Moment(nm float64) string     // moment (pitching moment, balance capacity), from N·m
}

// SIFormat writes temperatures in K, pressures in kPa, forces in N and
// moments in N·m.
type SIFormat struct{}

// Temp writes k to the nearest kelvin, e.g. "105 K".
func (SIFormat) Temp(k float64) string { return strconv.FormatFloat(k, 'f', 0, 64) + " K" }

// Stagnation writes pa in kPa to the nearest kPa, e.g. "450 kPa".
func (SIFormat) Stagnation(pa float64) string {
	return strconv.FormatFloat(pa/1e3, 'f', 0, 64) + " kPa"
}

// Q writes pa in kPa to 0.1 kPa, e.g. "120.0 kPa".
func (SIFormat) Q(pa float64) string { return strconv.FormatFloat(pa/1e3, 'f', 1, 64) + " kPa" }

// Force writes n in N to 4 significant figures, e.g. "4500 N".
func (SIFormat) Force(n float64) string { return strconv.FormatFloat(n, 'g', 4, 64) + " N" }

// Moment writes nm in N·m to 4 significant figures, e.g. "612.5 N·m".
func (SIFormat) Moment(nm float64) string { return strconv.FormatFloat(nm, 'g', 4, 64) + " N·m" }

// Cautions lists the safety and validity notes for a detail of facility f,
// the planning note first, with every quantity written by u.
func Cautions(d *Detail, f *Facility, u QuantityFormat) []string {
	out := []string{PlanningNote}
	add := func(format string, args ...any) { out = append(out, fmt.Sprintf(format, args...)) }
	if d.Flags.Has(FlagCryogenic) {
		add("Cold gas: T0 %s. Cryogenic nitrogen brings cold-burn, embrittlement and oxygen-deficiency hazards; follow the facility's cryogenic procedures.", u.Temp(d.T0))
	}
	if d.Flags.Has(FlagHighP0) {
		add("p0 %s is within %.0f %% of the facility maximum %s: pressure-vessel limits govern.",
			u.Stagnation(d.P0), 100*(1-NearLimitFraction), u.Stagnation(f.Gas.P0Max))
	}
	if d.Flags.Has(FlagQNearLimit) {
		add("Dynamic pressure %s is within %.0f %% of the facility limit: check model, sting and balance loads.",
			u.Q(d.Q), 100*(1-NearLimitFraction))
	}
	if d.Flags.Has(FlagCondensationWarn) {
		add("At local Mach %.2f on the model the static state reaches the saturation line: condensation likely in the local supersonic region.", peakMach(f))
	}
	if d.Flags.Has(FlagRealGas) {
		add("Ideal-gas result is approximate here (cold gas near saturation, T0 below %s, p0 above %s, or hypersonic): real-gas corrections are not applied.",
			u.Temp(RealGasT0), u.Stagnation(RealGasP0))
	}
	if d.Flags.Has(FlagEnthalpyShort) {
		add("Facility T0 %s is below %.0f %% of the flight stagnation temperature %s: heating and high-temperature gas effects are not reproduced.",
			u.Temp(d.T0), 100*EnthalpyShortRatio, u.Temp(d.FlightT0))
	}
	if d.Flags.Has(FlagReOver) {
		add("The lowest setting still exceeds the flight Reynolds number (ratio %.2f).", d.ReRatio)
	}
	if d.Flags.Has(FlagModelTooLarge) {
		add("Model too large for the section: scale %.3g is above %.3g, the largest it takes (%s); "+
			"wall interference and blockage make these results unreliable.", d.Scale, d.SectionFit, d.SectionFitRule)
	}
	if d.Flags.Has(FlagLoadNearLimit) {
		add("Model load %.0f %% of the balance capacity (normal force %s, pitching moment %s at the largest load coefficients): "+
			"a planning estimate; check model, sting and balance with their own ratings.", 100*d.Load.Share, u.Force(d.Load.NormalForce), u.Moment(d.Load.PitchMoment))
	}
	if d.Flags.Has(FlagLowCavitation) {
		add("Cavitation number %.2f: cavitation on the model is likely.", d.Cavitation)
	}
	return out
}

// cautions is Cautions in SI, for Detail.Cautions.
func cautions(d *Detail, f *Facility) []string { return Cautions(d, f, SIFormat{}) }
