package session

import (
	"math"
	"slices"
	"testing"

	"likewind/envelope"
)

func TestSnapMarks(t *testing.T) {
	v, _ := demoData(t)
	g, err := envelope.NewGrid(v, envelope.DefaultSettings(v))
	if err != nil {
		t.Fatal(err)
	}
	if g.Rows() < 3 || g.Cols() < 3 {
		t.Fatalf("demo grid %d×%d too small", g.Rows(), g.Cols())
	}
	dAlt := g.Alts[1] - g.Alts[0]
	dSpd := g.Speeds[1] - g.Speeds[0]
	pts := []Point{
		{Altitude: g.Alts[1] + 0.4*dAlt, Speed: g.Speeds[2] - 0.4*dSpd}, // snaps to (1,2)
		{Altitude: g.Alts[1], Speed: g.Speeds[2]},                       // repeat
		{Altitude: g.Alts[0] - 0.6*dAlt, Speed: g.Speeds[0]},            // below the grid
		{Altitude: math.NaN(), Speed: g.Speeds[0]},
		{Altitude: g.Alts[2], Speed: g.Speeds[1]},
	}
	marks, lost := SnapMarks(g, pts)
	want := []envelope.GridPoint{{Row: 1, Col: 2}, {Row: 2, Col: 1}}
	if !slices.Equal(marks, want) || lost != 2 {
		t.Errorf("SnapMarks = %v, %d lost; want %v, 2 lost", marks, lost, want)
	}
	if _, ok := SnapPoint(nil, pts[0]); ok {
		t.Error("SnapPoint on no grid reported a point")
	}
}
