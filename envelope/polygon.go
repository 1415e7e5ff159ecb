package envelope

import (
	"fmt"
	"math"
)

// checkOutline checks that the boundary is a simple polygon enclosing an
// area.
func (d *doc) checkOutline(p string, v *Vehicle) bool {
	verts := v.Boundary
	n := len(verts)
	field := display(p)
	if n < 3 {
		d.fail(p, field, fmt.Sprintf("%d distinct points", n), "at least 3 points enclosing an area")
		return false
	}
	// Work in coordinates scaled to the bounding box so that altitude in
	// metres and Mach number weigh alike.
	aLo, aHi, sLo, sHi := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, w := range verts {
		aLo, aHi = math.Min(aLo, w.Altitude), math.Max(aHi, w.Altitude)
		sLo, sHi = math.Min(sLo, w.Speed), math.Max(sHi, w.Speed)
	}
	if aHi == aLo || sHi == sLo {
		what := "altitude"
		if sHi == sLo {
			what = "speed"
		}
		d.fail(p, field, fmt.Sprintf("all points at one %s (no enclosed area)", what), "at least 3 points enclosing an area")
		return false
	}
	pts := make([]pt, n)
	for i, w := range verts {
		pts[i] = pt{(w.Altitude - aLo) / (aHi - aLo), (w.Speed - sLo) / (sHi - sLo)}
	}
	for i := range pts {
		j := (i + 1) % n
		if pts[i] == pts[j] {
			d.fail(fmt.Sprintf("%s[%d]", p, j), fmt.Sprintf("%s point %d", field, j+1),
				fmt.Sprintf("the same point as point %d", i+1), "distinct consecutive points")
			return false
		}
	}
	area := 0.0
	for i := range pts {
		j := (i + 1) % n
		area += pts[i].x*pts[j].y - pts[j].x*pts[i].y
	}
	if math.Abs(area)/2 < 1e-6 {
		d.fail(p, field, "points on one line (no enclosed area)", "at least 3 points enclosing an area")
		return false
	}
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			if crossing(pts, i, j) {
				d.fail(fmt.Sprintf("%s[%d]", p, i), field,
					fmt.Sprintf("edge from point %d to %d crossing edge from point %d to %d", i+1, (i+1)%n+1, j+1, (j+1)%n+1),
					"an outline that does not cross or touch itself (list the points in order around the envelope)")
				return false
			}
		}
	}
	return true
}

type pt struct{ x, y float64 }

func orient(a, b, c pt) float64 { return (b.x-a.x)*(c.y-a.y) - (b.y-a.y)*(c.x-a.x) }

const geomEps = 1e-12

func sign(x float64) int {
	switch {
	case x > geomEps:
		return 1
	case x < -geomEps:
		return -1
	}
	return 0
}

func onSegment(a, b, c pt) bool { // c on segment ab, given collinear
	return math.Min(a.x, b.x)-geomEps <= c.x && c.x <= math.Max(a.x, b.x)+geomEps &&
		math.Min(a.y, b.y)-geomEps <= c.y && c.y <= math.Max(a.y, b.y)+geomEps
}

// crossing reports whether edges i and j (edge k joins point k to k+1) of
// the closed outline meet anywhere other than at the corner that adjacent
// edges share.
func crossing(p []pt, i, j int) bool {
	n := len(p)
	a, b := p[i], p[(i+1)%n]
	c, e := p[j], p[(j+1)%n]
	adjacent := (i+1)%n == j || (j+1)%n == i
	if adjacent {
		// Adjacent edges share a corner; they overlap only if they fold
		// back along one line.
		var shared, ao, co pt
		if (i+1)%n == j {
			shared, ao, co = b, a, e
		} else {
			shared, ao, co = a, b, c
		}
		if sign(orient(ao, shared, co)) != 0 {
			return false
		}
		dx1, dy1 := ao.x-shared.x, ao.y-shared.y
		dx2, dy2 := co.x-shared.x, co.y-shared.y
		return dx1*dx2+dy1*dy2 > 0
	}
	o1, o2 := sign(orient(a, b, c)), sign(orient(a, b, e))
	o3, o4 := sign(orient(c, e, a)), sign(orient(c, e, b))
	if o1 != o2 && o3 != o4 && o1 != 0 && o2 != 0 && o3 != 0 && o4 != 0 {
		return true
	}
	return o1 == 0 && onSegment(a, b, c) || o2 == 0 && onSegment(a, b, e) ||
		o3 == 0 && onSegment(c, e, a) || o4 == 0 && onSegment(c, e, b)
}
