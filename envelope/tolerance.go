package envelope

import "math"

// Rounding allowances of a comparison with a tolerance. Tolerances and the
// values they are compared with are mostly decimals (a Mach tolerance of
// 0.01, flight Mach 0.82 against a facility's 0.81) that binary floating
// point does not hold exactly; the allowances, far below any tolerance a
// user sets, make the decimal reading decide.
const (
	roundRel = 1e-9  // relative to the tolerance
	roundAbs = 1e-12 // absolute
)

// withinTol reports whether a and b agree to within tol, allowing for
// rounding: |a − b| ≤ tol·(1 + roundRel) + roundAbs. It has the shape of
// gonum's scalar.EqualWithinAbs, with the rounding allowance named once.
func withinTol(a, b, tol float64) bool {
	return math.Abs(a-b) <= tol*(1+roundRel)+roundAbs
}
