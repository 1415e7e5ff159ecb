package envelope

import (
	"strings"
	"testing"
)

// TestDemoLoadData: the demo carries invented load data so that the load
// features show on it, and each balance binds at some points but not at
// all of them. By hand, with the Corvane SX-3's CN 1.2 and Cm 0.25 on
// 28.0 m² and 3.10 m:
//   - the cryogenic tunnel's 1/40 model carries 1.2 × 28.0 m² × 0.025² =
//     0.021 m² of normal force per unit q, so its 2.4 kN balance caps q at
//     2400 / 0.021 = 114.3 kPa, below q max (120 kPa); the moment per unit
//     q, 0.25 × 0.0175 m² × 0.0775 m = 3.39e-4 m³, would allow
//     120 / 3.39e-4 = 354 kPa, so the normal force governs;
//   - the transonic tunnel's fitted model (s = 0.13926, by its 0.8 %
//     blockage) carries 1.2 × 28.0 × s² = 0.6516 m² per unit q: its
//     50 kN balance caps q at 76.73 kPa, below q max (85 kPa); the moment
//     (6 kN·m over 0.25 × 28.0 × s² × 3.10 m × s = 0.05861 m³) would allow
//     102.4 kPa.
func TestDemoLoadData(t *testing.T) {
	_, maps := outDemoMaps(t)
	for _, c := range []struct {
		prefix string
		qCap   float64
	}{{"Kellen Fold", 114285.714}, {"Harl Cove", 76729.911}} {
		m := facilityNamed(t, maps, c.prefix)
		if relErr(m.LoadQ, c.qCap) > 1e-6 {
			t.Errorf("%s: balance q cap %.6g Pa, want %.6g Pa by hand", c.prefix, m.LoadQ, c.qCap)
		}
		bound, within := 0, 0
		for _, r := range m.Results {
			switch {
			case r.Limit == LimitBalanceLoad:
				bound++
			case r.Class == FullMatch && m.LoadShare(r) < 1:
				within++
			}
		}
		if bound == 0 || within == 0 {
			t.Errorf("%s: %d points limited by the balance, %d full matches within it; want some of each", c.prefix, bound, within)
		}
	}
	// The other facilities give no capacity: their balance is not checked.
	for _, m := range maps {
		if !strings.HasPrefix(m.Facility.Name, "Kellen Fold") && !strings.HasPrefix(m.Facility.Name, "Harl Cove") && m.LoadQ != 0 {
			t.Errorf("%s: balance q cap %g, want none", m.Facility.Name, m.LoadQ)
		}
	}
}
