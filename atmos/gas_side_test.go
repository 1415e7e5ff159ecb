package atmos

import (
	"math"
	"math/rand/v2"
	"testing"
)

// ExceedsVapourPressure and ReachesVapourPressure settle most points from a
// table of the saturation line; they must give exactly the answer of a
// direct comparison with SaturationPressure, near the line, on it, and far
// from it, for both gases (an identity of the implementation, no outside
// reference needed).
func TestVapourPressureSideMatchesDirectComparison(t *testing.T) {
	rng := rand.New(rand.NewPCG(1976, 1135))
	for _, g := range []IdealGas{Air(), Nitrogen()} {
		check := func(p, T float64) {
			t.Helper()
			ps := g.SaturationPressure(T)
			if got, want := g.ExceedsVapourPressure(p, T), p > ps; got != want {
				t.Errorf("%s ExceedsVapourPressure(%g Pa, %g K) = %v, want %v (saturation %g Pa)", g.Name(), p, T, got, want, ps)
			}
			if got, want := g.ReachesVapourPressure(p, T), p >= ps; got != want {
				t.Errorf("%s ReachesVapourPressure(%g Pa, %g K) = %v, want %v (saturation %g Pa)", g.Name(), p, T, got, want, ps)
			}
		}
		for range 200000 {
			// Temperatures from deep cryogenic to warm, pressures over
			// twelve decades, half of them within a few ulps of the line.
			T := 20 + 380*rng.Float64()
			p := math.Pow(10, -3+12*rng.Float64())
			if rng.IntN(2) == 0 {
				ps := g.SaturationPressure(T)
				if ps > 0 && !math.IsInf(ps, 0) {
					p = ps
					for range rng.IntN(4) {
						if rng.IntN(2) == 0 {
							p = math.Nextafter(p, math.Inf(1))
						} else {
							p = math.Nextafter(p, 0)
						}
					}
				}
			}
			check(p, T)
		}
		// Edges: zero and infinite pressure, the critical and triple
		// points.
		for _, T := range []float64{g.CriticalTemperature(), g.TriplePointTemperature(), 1, 1e4} {
			for _, p := range []float64{0, 1e-300, g.CriticalPressure(), 1e12, math.Inf(1)} {
				check(p, T)
			}
		}
	}
}
