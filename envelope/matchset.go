package envelope

// MatchingSet is a point's matching set: the settings of a facility, at
// the test Mach number of the point's answer, that give one model Reynolds
// number — the flight Reynolds number where the facility reaches it, else
// the highest it reaches there. Usually that is a line. Along a gas
// facility's line p0 rises with T0 (Re ∝ p0·(T+S)/T² at a fixed Mach
// number), and q = ½γM²·p with it, so its ends are the coldest setting
// (lowest p0 and q, the least-load rule's pick) and the warmest (highest
// p0 and q, the standard rule's pick). Along a water tunnel's line the
// speed, and q, fall as the water warms. Where the facility falls short
// the set is the one best setting (both ends the same), or where the
// unit-Reynolds cap holds it, the line of settings on the cap.
//
// The set is the facility's, under its own limits (the balance load
// included): whatever the operating rule picks lies on it when the rule
// reaches the target, and a fixed rule that misses it shows how far off
// it is.
type MatchingSet struct {
	// OK is false where no setting exists (no set).
	OK bool
	// Mach is the test Mach number (0 for water).
	Mach float64
	// Re is the model Reynolds number every setting of the set gives.
	Re float64
	// ReLimit is LimitNone where the set gives the flight Reynolds
	// number; else what holds it below flight (the unit Reynolds cap, or
	// the binding limit of the best setting), or for an overshoot (even
	// the lowest setting exceeds flight) what stops the settings coming
	// down.
	ReLimit Limit
	// Cold and Warm are the ends of the set: the coldest setting and the
	// warmest.
	Cold, Warm SetEnd
}

// Single reports whether the set is one setting.
func (s MatchingSet) Single() bool { return s.Cold.T0 == s.Warm.T0 && s.Cold.P0 == s.Warm.P0 }

// SetEnd is one end of a matching set, with the limit that bounds the set
// there: for a gas facility T0 min, the static-temperature floor,
// condensation or p0 min at the cold end, T0 max, p0 max, q max or the
// balance load at the warm end; for a water tunnel the temperature range,
// the speed range, q max or the balance load.
type SetEnd struct {
	// P0 and T0 are the stagnation pressure (Pa) and temperature (K) of a
	// gas facility; for a water tunnel the test-section static pressure
	// and the water temperature.
	P0, T0 float64
	V      float64 // test-section speed, m/s
	Q      float64 // test-section dynamic pressure, Pa
	Limit  Limit
}
