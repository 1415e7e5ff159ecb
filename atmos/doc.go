// Package atmos holds the physics of air and of the test media used to
// reproduce flight conditions on the ground. It knows nothing of vehicles,
// envelopes or facilities.
//
// The package covers:
//
//   - the U.S. Standard Atmosphere 1976 from -5 km to 86 km geometric
//     altitude (identical to the ICAO/ISO 2533 standard atmosphere up to
//     32 km), with off-standard (ΔT) days: [At], [AtDay], [State],
//     [PressureAltitudeOf] and the geometric/geopotential conversions;
//   - test gases and water as working media (gas properties, Sutherland
//     viscosity, condensation limits; water density, viscosity and vapour
//     pressure);
//   - isentropic and normal-shock relations for any ratio of specific heats;
//   - airspeed conversions (Mach, TAS, EAS, CAS) and impact pressure;
//   - similarity parameters (Reynolds, Knudsen, dynamic pressure) and flow
//     regime classification with configurable thresholds;
//   - parsing and display conversion of quantities with units, used only at
//     the edges of the program.
//
// All functions are pure and work in SI units on float64: m, K, Pa, kg/m³,
// m/s, Pa·s and m²/s. Inputs outside a model's range, and non-finite inputs,
// are reported as errors rather than returned as NaN.
//
// Results are planning estimates. They do not replace a facility's own
// operating procedures, local codes or licensed engineering judgement.
package atmos
