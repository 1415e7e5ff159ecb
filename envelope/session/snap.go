package session

import (
	"math"
	"sort"

	"likewind/envelope"
)

// SnapPoint finds the grid point of a saved point: the altitude and speed
// each within half a grid step of an axis value. It reports false when
// the point is no longer on the grid (the grid or ΔT changed).
func SnapPoint(g *envelope.Grid, p Point) (envelope.GridPoint, bool) {
	if g == nil {
		return envelope.GridPoint{}, false
	}
	i, ok1 := nearestIndex(g.Alts, p.Altitude)
	j, ok2 := nearestIndex(g.Speeds, p.Speed)
	if !ok1 || !ok2 {
		return envelope.GridPoint{}, false
	}
	return envelope.GridPoint{Row: i, Col: j}, true
}

// SnapMarks puts saved marks on the grid with SnapPoint, in their saved
// order without repeats, and counts those no longer on the grid.
func SnapMarks(g *envelope.Grid, pts []Point) (marks []envelope.GridPoint, lost int) {
	seen := map[envelope.GridPoint]bool{}
	for _, p := range pts {
		gp, ok := SnapPoint(g, p)
		if !ok {
			lost++
			continue
		}
		if !seen[gp] {
			seen[gp] = true
			marks = append(marks, gp)
		}
	}
	return marks, lost
}

// nearestIndex finds the axis value within half a step of v.
func nearestIndex(axis []float64, v float64) (int, bool) {
	if len(axis) == 0 || math.IsNaN(v) {
		return 0, false
	}
	k := sort.SearchFloat64s(axis, v)
	best, bd := -1, math.Inf(1)
	for _, c := range []int{k - 1, k} {
		if c >= 0 && c < len(axis) {
			if d := math.Abs(axis[c] - v); d < bd {
				best, bd = c, d
			}
		}
	}
	step := 0.0
	if len(axis) > 1 {
		step = math.Abs(axis[len(axis)-1]-axis[0]) / float64(len(axis)-1)
	}
	tol := math.Max(step/2, 1e-9*math.Max(1, math.Abs(v)))
	if best < 0 || bd > tol {
		return 0, false
	}
	return best, true
}
