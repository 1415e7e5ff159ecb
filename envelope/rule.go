package envelope

// OperatingRule says, in a few words, which setting Solve takes when many
// settings of a facility of medium m reach the target: for a gas facility
// the warmest stagnation temperature, then the lowest stagnation pressure;
// for a water facility the warmest water (lowest viscosity), then the
// lowest speed. The interface shows it beside each answer and the README
// states it, so the choice is never hidden in the solver.
func OperatingRule(m Medium) string {
	if m.IsGas() {
		return "warmest T0, then lowest p0"
	}
	return "warmest water, then lowest speed"
}
