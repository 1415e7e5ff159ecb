package atmos

import (
	"math"
	"testing"
)

// Speed target: one standard-day evaluation At(z) costs at most 3× the bare
// math it cannot avoid, BenchmarkBareMath/exp-or-pow: per altitude, one
// math.Exp (isothermal layer) or one math.Pow (gradient layer) for the
// pressure, and one math.Sqrt for the speed of sound and T^1.5. Compare ns/op:
//
//	go test ./atmos/ -run '^$' -bench '^Benchmark(At|BareMath)$' -cpu 1 -count 5
//
// On a loaded machine take the minimum of each; the ratios only mean
// anything when both are measured in the same run.
//
// Two stricter floors are measured beside it for reference:
//
//   - exp-or-explog does the gradient-layer power as math.Exp(n·math.Log(x)),
//     the cheapest exact form and the one At uses;
//   - exp-only does one math.Exp and one math.Sqrt everywhere. It is not a
//     reachable floor: a gradient layer (86 % of the range) needs a logarithm
//     as well, and the Log→Exp chain alone costs about three times this.
//
// All walk the same 1024 altitudes spread evenly over the model range, so
// every layer and both pressure forms are weighed by the share of the range
// they cover.

// ussaBenchAltitudes is the length of the altitude sweep (a power of two so
// the index wraps with a mask).
const ussaBenchAltitudes = 1024

func ussaBenchSweep() []float64 {
	zs := make([]float64, ussaBenchAltitudes)
	for i := range zs {
		zs[i] = MinAltitude + (MaxAltitude-MinAltitude)*float64(i)/float64(len(zs)-1)
	}
	return zs
}

// ussaBenchSink keeps results alive so the compiler cannot drop the work.
var ussaBenchSink float64

func BenchmarkAt(b *testing.B) {
	zs := ussaBenchSweep()
	var sum float64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		s, err := At(zs[i&(ussaBenchAltitudes-1)])
		if err != nil {
			b.Fatal(err)
		}
		sum += s.Pressure + s.Density + s.SpeedOfSound + s.KinematicViscosity + s.MeanFreePath
	}
	ussaBenchSink = sum
}

// ussaBareArgs are the arguments of the unavoidable calls at one altitude,
// prepared outside the timed loop so the floor does no other work.
type ussaBareArgs struct {
	iso  bool    // isothermal layer: exp(k) instead of x^n
	k    float64 // exponent for math.Exp (isothermal)
	x, n float64 // base and exponent of the power (gradient)
	t    float64 // temperature for math.Sqrt
}

func ussaBenchBareArgs() []ussaBareArgs {
	zs := ussaBenchSweep()
	args := make([]ussaBareArgs, len(zs))
	for i, z := range zs {
		h := GeopotentialFromGeometric(z)
		l := ussa.layerFor(h)
		tm, _ := l.at(h)
		args[i] = ussaBareArgs{iso: l.lapse == 0, k: l.slope * (h - l.hBase), x: tm * l.invTBase, n: l.expo, t: tm}
	}
	return args
}

func BenchmarkBareMath(b *testing.B) {
	args := ussaBenchBareArgs()
	b.Run("exp-or-pow", func(b *testing.B) {
		var sum float64
		for i := 0; i < b.N; i++ {
			a := &args[i&(ussaBenchAltitudes-1)]
			var e float64
			if a.iso {
				e = math.Exp(a.k)
			} else {
				e = math.Pow(a.x, a.n)
			}
			sum += e + math.Sqrt(a.t)
		}
		ussaBenchSink = sum
	})
	b.Run("exp-or-explog", func(b *testing.B) {
		var sum float64
		for i := 0; i < b.N; i++ {
			a := &args[i&(ussaBenchAltitudes-1)]
			var e float64
			if a.iso {
				e = math.Exp(a.k)
			} else {
				e = math.Exp(a.n * math.Log(a.x))
			}
			sum += e + math.Sqrt(a.t)
		}
		ussaBenchSink = sum
	})
	b.Run("exp-only", func(b *testing.B) {
		var sum float64
		for i := 0; i < b.N; i++ {
			a := &args[i&(ussaBenchAltitudes-1)]
			sum += math.Exp(a.k+a.x) + math.Sqrt(a.t)
		}
		ussaBenchSink = sum
	})
}

// BenchmarkAtDay measures the general path (any altitude kind, ΔT day).
func BenchmarkAtDay(b *testing.B) {
	zs := ussaBenchSweep()
	var sum float64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		s, err := AtDay(zs[i&(ussaBenchAltitudes-1)], Geometric, 10)
		if err != nil {
			b.Fatal(err)
		}
		sum += s.Pressure + s.Density + s.SpeedOfSound + s.KinematicViscosity + s.MeanFreePath
	}
	ussaBenchSink = sum
}

func BenchmarkPressureAltitudeOf(b *testing.B) {
	zs := ussaBenchSweep()
	ps := make([]float64, len(zs))
	for i, z := range zs {
		s, err := At(z)
		if err != nil {
			b.Fatal(err)
		}
		ps[i] = s.Pressure
	}
	var sum float64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		z, err := PressureAltitudeOf(ps[i&(ussaBenchAltitudes-1)])
		if err != nil {
			b.Fatal(err)
		}
		sum += z
	}
	ussaBenchSink = sum
}
