package atmos

import "math"

// Similarity parameters. All arguments are SI; the functions are plain
// formulas and do not validate (non-finite input gives a non-finite result).

// Reynolds returns the Reynolds number ρVL/μ for density rho (kg/m3), speed
// v (m/s), reference length L (m) and dynamic viscosity mu (Pa·s).
func Reynolds(rho, v, L, mu float64) float64 {
	return rho * v * L / mu
}

// ReynoldsPerMetre returns the unit Reynolds number ρV/μ (1/m).
func ReynoldsPerMetre(rho, v, mu float64) float64 {
	return rho * v / mu
}

// DynamicPressure returns q = ½ρV² (Pa).
func DynamicPressure(rho, v float64) float64 {
	return 0.5 * rho * v * v
}

// DynamicPressureMach returns q = ½γpM² (Pa) for static pressure p (Pa), Mach
// number M and ratio of specific heats g. For a perfect gas this equals ½ρV²
// because ρa² = γp.
func DynamicPressureMach(p, M, g float64) float64 {
	return 0.5 * g * p * M * M
}

// Knudsen returns the Knudsen number λ/L for mean free path lambda (m) and
// reference length L (m).
func Knudsen(lambda, L float64) float64 {
	return lambda / L
}

// KnudsenMachRe returns the Knudsen number (M/Re)·√(γπ/2) for Mach number M,
// Reynolds number Re (on the same length as the Knudsen number) and ratio of
// specific heats g.
//
// The relation is exact when the mean free path is the viscosity-based one of
// simple kinetic theory, λμ = (μ/ρ)·√(π/(2RT)) (ViscousMeanFreePath), since then
// λμ/L = (ν/(VL))·V·√(π/(2RT)) = (M/Re)·√(γπ/2) with V = M√(γRT).
// The hard-sphere mean free path of the U.S. Standard Atmosphere 1976
// (State.MeanFreePath, σ = 3.65e-10 m) is about 4 % larger than λμ at sea level
// and the ratio varies with temperature as (T + S)/T through Sutherland's law,
// so the two Knudsen forms agree to within about 20 % over 0–86 km. (Above
// 80 km USSA 1976 takes the speed of sound from the molecular-scale
// temperature, which adds a further 0.02 % at 86 km.)
func KnudsenMachRe(M, Re, g float64) float64 {
	return M / Re * math.Sqrt(g*math.Pi/2)
}

// ViscousMeanFreePath returns the mean free path (m) implied by the dynamic
// viscosity mu (Pa·s) through simple kinetic theory, μ = ½ρ·c̄·λ with mean
// molecular speed c̄ = √(8RT/π): λ = (μ/ρ)·√(π/(2RT)), for density rho (kg/m3),
// temperature T (K) and specific gas constant R (J/(kg·K)).
func ViscousMeanFreePath(mu, rho, T, R float64) float64 {
	return mu / rho * math.Sqrt(math.Pi/(2*R*T))
}
