package atmos

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Property tests over the whole model range, on standard and off-standard
// days and on every altitude scale. They complement the table checks in
// atmosphere_test.go and airspeed_test.go (which hold values to published
// tables) by checking laws that must hold everywhere in between.

const (
	// propStep is the altitude step of the continuity checks, m.
	propStep = 1e-3
	// propMaxLapse bounds |dT/dz| in K per geometric metre: the steepest
	// layer of U.S. Standard Atmosphere 1976, Table 4, is 6.5 K/km' (from
	// memory; the layer table in atmosphere.go has the same value), times
	// dH/dz = (r0/(r0+z))² ≤ 1.0016 at −5 km, plus a margin for the
	// molecular-weight ratio above 80 km, which moves T by under 0.1 K in
	// 6 km.
	propMaxLapse = 6.6e-3
	// propMaxRelSlope bounds the relative change per metre of p, ρ, a, μ,
	// ν and λ: hydrostatics gives |d ln p/dz| = g/(R·T_M) ≤ 2e-4 /m at
	// the coldest standard temperature (about 187 K), and the temperature
	// terms add at most propMaxLapse/T ≤ 6e-5 /m on a −60 K day.
	propMaxRelSlope = 1e-3
	// propRoundTrip is the relative tolerance of a conversion and back.
	propRoundTrip = 1e-9
)

var (
	propKinds  = []AltitudeKind{Geometric, Geopotential, PressureAlt}
	propDeltaT = []float64{-60, -15, 0, 20, 60}
)

// propRange is the model range on the scale of kind.
func propRange(kind AltitudeKind) (lo, hi float64) { return AltitudeRange(kind) }

// propAltitudes are the points where continuity is most at risk: the layer
// bases of U.S. Standard Atmosphere 1976, Table 4 (0, 11, 20, 32, 47, 51,
// 71 km', from memory), 80 km geometric where the kinetic temperature
// starts to differ from the molecular-scale one, the nodes of the
// molecular-weight table above it, and many random altitudes; all on the
// scale of kind.
func propAltitudes(kind AltitudeKind, rng *rand.Rand) []float64 {
	var out []float64
	for _, hb := range []float64{0, 11000, 20000, 32000, 47000, 51000, 71000} {
		if kind == Geopotential || kind == PressureAlt {
			out = append(out, hb)
		} else {
			out = append(out, GeometricFromGeopotential(hb))
		}
	}
	for z := 80000.0; z <= 86000; z += 500 {
		if kind == Geopotential || kind == PressureAlt {
			out = append(out, GeopotentialFromGeometric(z))
		} else {
			out = append(out, z)
		}
	}
	lo, hi := propRange(kind)
	for k := 0; k < 3000; k++ {
		out = append(out, lo+(hi-lo)*rng.Float64())
	}
	return out
}

// propAt is AtDay within the range, failing the test on an error.
func propAt(t *testing.T, alt float64, kind AltitudeKind, dT float64) State {
	t.Helper()
	lo, hi := propRange(kind)
	alt = math.Min(math.Max(alt, lo), hi)
	s, err := AtDay(alt, kind, dT)
	if err != nil {
		t.Fatalf("AtDay(%g, %v, %g): %v", alt, kind, dT, err)
	}
	return s
}

// TestPropertyPressureDensityFall: pressure and density fall strictly with
// altitude on every day and scale (hydrostatics dp/dz = −ρg; for density
// also because g/R exceeds every lapse rate of the standard even on a
// −60 K day), both between random pairs and over each 1 mm step.
func TestPropertyPressureDensityFall(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 76))
	for _, kind := range propKinds {
		for _, dT := range propDeltaT {
			lo, hi := propRange(kind)
			for _, a := range propAltitudes(kind, rng) {
				b := a + propStep
				if rng.IntN(2) == 0 {
					b = a + (hi-a)*rng.Float64()
				}
				if !(b > a) || b > hi || a < lo {
					continue
				}
				sa, sb := propAt(t, a, kind, dT), propAt(t, b, kind, dT)
				if !(sb.Pressure < sa.Pressure) {
					t.Fatalf("%v ΔT %g: p(%.6f) = %.15g, want < p(%.6f) = %.15g", kind, dT, b, sb.Pressure, a, sa.Pressure)
				}
				if !(sb.Density < sa.Density) {
					t.Fatalf("%v ΔT %g: ρ(%.6f) = %.15g, want < ρ(%.6f) = %.15g", kind, dT, b, sb.Density, a, sa.Density)
				}
			}
		}
	}
}

// TestPropertyContinuity: no state quantity jumps anywhere in the range,
// in particular not at a layer base or where the kinetic temperature takes
// over at 80 km: over a 1 mm step T moves by at most the steepest lapse
// rate, and every other quantity by at most propMaxRelSlope per metre.
func TestPropertyContinuity(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 1976))
	for _, kind := range propKinds {
		for _, dT := range propDeltaT {
			lo, hi := propRange(kind)
			for _, a := range propAltitudes(kind, rng) {
				for _, pair := range [][2]float64{{a - propStep, a}, {a, a + propStep}} {
					if pair[0] < lo || pair[1] > hi {
						continue
					}
					s0, s1 := propAt(t, pair[0], kind, dT), propAt(t, pair[1], kind, dT)
					dz := propStep
					if kind == Geopotential { // one geopotential metre is at most 1.014 m
						dz *= 1.02
					}
					if d := math.Abs(s1.Temperature - s0.Temperature); d > propMaxLapse*dz {
						t.Errorf("%v ΔT %g: T jumps by %g K between %.4f and %.4f (%.9g, %.9g), want ≤ %g",
							kind, dT, d, pair[0], pair[1], s0.Temperature, s1.Temperature, propMaxLapse*dz)
					}
					for _, q := range []struct {
						name   string
						v0, v1 float64
					}{
						{"p", s0.Pressure, s1.Pressure}, {"ρ", s0.Density, s1.Density},
						{"a", s0.SpeedOfSound, s1.SpeedOfSound}, {"μ", s0.Viscosity, s1.Viscosity},
						{"ν", s0.KinematicViscosity, s1.KinematicViscosity}, {"λ", s0.MeanFreePath, s1.MeanFreePath},
					} {
						if d := math.Abs(q.v1/q.v0 - 1); d > propMaxRelSlope*dz {
							t.Errorf("%v ΔT %g: %s jumps by a fraction %g between %.4f and %.4f (%.12g, %.12g), want ≤ %g",
								kind, dT, q.name, d, pair[0], pair[1], q.v0, q.v1, propMaxRelSlope*dz)
						}
					}
				}
			}
		}
	}
}

// propState is a random state: any scale, altitude and day.
func propState(t *testing.T, rng *rand.Rand) State {
	kind := propKinds[rng.IntN(len(propKinds))]
	lo, hi := propRange(kind)
	return propAt(t, lo+(hi-lo)*rng.Float64(), kind, -60+120*rng.Float64())
}

func propSpeed(a Airspeeds, k SpeedKind) float64 {
	return [...]float64{Mach: a.Mach, TAS: a.TAS, EAS: a.EAS, CAS: a.CAS}[k]
}

// TestPropertyAirspeedRoundTrips: at random states and Mach numbers from
// 0.001 to 30 (log-uniform), converting any of the four airspeeds back
// through Speeds gives the same four airspeeds.
func TestPropertyAirspeedRoundTrips(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 3))
	for n := 0; n < 4000; n++ {
		s := propState(t, rng)
		M := 1e-3 * math.Pow(3e4, rng.Float64())
		a, err := Speeds(Mach, M, s)
		if err != nil {
			t.Fatalf("Speeds(Mach %g) at %g m ΔT %g: %v", M, s.Altitude, s.DeltaT, err)
		}
		for _, k := range []SpeedKind{TAS, EAS, CAS} {
			b, err := Speeds(k, propSpeed(a, k), s)
			if err != nil {
				t.Fatalf("Speeds(%v %g) at %g m ΔT %g: %v", k, propSpeed(a, k), s.Altitude, s.DeltaT, err)
			}
			for _, j := range []SpeedKind{Mach, TAS, EAS, CAS} {
				if got, want := propSpeed(b, j), propSpeed(a, j); math.Abs(got-want) > propRoundTrip*want {
					t.Errorf("at %g m ΔT %g: Mach %g → %v %g → %v %.15g, want %.15g",
						s.Altitude, s.DeltaT, M, k, propSpeed(a, k), j, got, want)
				}
			}
		}
	}
}

// TestPropertyAirspeedsIncrease: at a fixed state every airspeed rises
// strictly with Mach number, across Mach 1 where the calibrated airspeed
// changes formula (the grid relies on this to compare speeds of different
// kinds); the two branches also meet there.
func TestPropertyAirspeedsIncrease(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	for n := 0; n < 300; n++ {
		s := propState(t, rng)
		prev := Airspeeds{}
		for i, M := range propMachLadder() {
			a, err := Speeds(Mach, M, s)
			if err != nil {
				t.Fatalf("Speeds(Mach %g): %v", M, err)
			}
			if i > 0 && !(a.TAS > prev.TAS && a.EAS > prev.EAS && a.CAS > prev.CAS) {
				t.Fatalf("at %g m ΔT %g: Mach %g gives %+v, not above Mach %g's %+v",
					s.Altitude, s.DeltaT, M, a, prev.Mach, prev)
			}
			prev = a
		}
		below, above := CASFromMach(1-1e-9, s), CASFromMach(1+1e-9, s)
		if d := math.Abs(above/below - 1); d > 1e-8 {
			t.Errorf("at %g m ΔT %g: CAS jumps by a fraction %g at Mach 1 (%.12g, %.12g)", s.Altitude, s.DeltaT, d, below, above)
		}
	}
}

// propMachLadder is a rising list of Mach numbers, dense around 1.
func propMachLadder() []float64 {
	var out []float64
	for M := 0.001; M < 30; M *= 1.07 {
		out = append(out, M)
	}
	for _, d := range []float64{-1e-6, -1e-9, 0, 1e-9, 1e-6} {
		out = append(out, 1+d)
	}
	// Sort by insertion: the ladder is short.
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && out[j] < out[j-1]; j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out
}

// TestPropertyReynoldsLinearInPressure: at fixed temperature, Mach number
// and length the Reynolds number ρVL/μ is proportional to pressure (ρ =
// p/RT for an ideal gas, V and μ depend on T only), for air and nitrogen.
func TestPropertyReynoldsLinearInPressure(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	for _, gas := range []struct {
		name string
		g    IdealGas
	}{{"air", Air()}, {"nitrogen", Nitrogen()}} {
		g := gas.g
		for n := 0; n < 500; n++ {
			T := 60 + 2000*rng.Float64()
			M := 0.01 + 10*rng.Float64()
			p := 10 * math.Pow(1e7, rng.Float64())
			k := 1 + 99*rng.Float64()
			re := func(p float64) float64 {
				rho := p / (g.R() * T)
				V := M * math.Sqrt(g.Gamma()*g.R()*T)
				return Reynolds(rho, V, 0.3, g.Viscosity(T))
			}
			if got, want := re(k*p), k*re(p); math.Abs(got/want-1) > propRoundTrip {
				t.Errorf("%s T %g M %g: Re(%g·p) = %.15g, want %g·Re(p) = %.15g", gas.name, T, M, k, got, k, want)
			}
		}
	}
}
