package envelope

import (
	"reflect"
	"testing"
)

// TestEvaluateBest: on both demo vehicles with every demo facility (one
// made unsolvable), EvaluateBest has Evaluate's errors, maps (scale,
// shares, reachable Reynolds range) without their results, and the best
// of all's class at every point (BestClasses of Evaluate's maps).
func TestEvaluateBest(t *testing.T) {
	vs, facs := demoFleet(t)
	for _, v := range vs {
		v.Grid.Altitude.Count, v.Grid.Altitude.Step = 60, 0
		v.Grid.Speed.Count, v.Grid.Speed.Step = 70, 0
		fs := append([]Facility(nil), facs...)
		// No model scale and no section to fit one: this facility fails.
		fs[1].Model.Scale, fs[1].Width, fs[1].Height = 0, 0, 0
		s := DefaultSettings(v)
		want, err := Evaluate(v, fs, s)
		if err != nil {
			t.Fatal(err)
		}
		got, err := EvaluateBest(v, fs, s)
		if err != nil {
			t.Fatal(err)
		}
		if want.Best != nil {
			t.Error("Evaluate set Best")
		}
		for k := range fs {
			if (got.Errs[k] == nil) != (want.Errs[k] == nil) || (got.Maps[k] == nil) != (want.Maps[k] == nil) {
				t.Fatalf("%s, %s: error %v map %v, want error %v", v.Name, fs[k].Name, got.Errs[k], got.Maps[k] != nil, want.Errs[k])
			}
			g, w := got.Maps[k], want.Maps[k]
			if g == nil {
				continue
			}
			if g.Results != nil {
				t.Errorf("%s: map keeps %d results", fs[k].Name, len(g.Results))
			}
			if g.Scale != w.Scale || g.Shares() != w.Shares() || !reflect.DeepEqual(g.ReachableRe(20), w.ReachableRe(20)) {
				t.Errorf("%s, %s: scale %g shares %+v, want %g %+v (or the reachable range differs)", v.Name, fs[k].Name, g.Scale, g.Shares(), w.Scale, w.Shares())
			}
		}
		if got.Errs[1] == nil {
			t.Errorf("%s: the facility without a scale solved", fs[1].Name)
		}
		classes := BestClasses(want.Solved())
		if !reflect.DeepEqual(got.Best, classes) {
			t.Errorf("%s: the best of all's classes differ from BestClasses of the maps", v.Name)
		}
		n := 0
		for _, c := range classes {
			if c != Outside {
				n++
			}
		}
		if n == 0 {
			t.Errorf("%s: no point inside", v.Name)
		}
	}
}
