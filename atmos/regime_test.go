package atmos

import (
	"math"
	"strings"
	"testing"
)

// Default thresholds are common practice: incompressible below M 0.3,
// transonic 0.8–1.2, hypersonic from M 5; continuum below Kn 0.01, slip to
// 0.1, transitional to 10, free-molecular above.
func TestDefaultSpeedRegimes(t *testing.T) {
	r := DefaultRegimes()
	tests := []struct {
		M    float64
		want SpeedRegime
	}{
		{0, Incompressible},
		{0.2999, Incompressible},
		{0.3, Subsonic},
		{0.7999, Subsonic},
		{0.8, Transonic},
		{1, Transonic},
		{1.1999, Transonic},
		{1.2, Supersonic},
		{4.999, Supersonic},
		{5, Hypersonic},
		{25, Hypersonic},
		{math.Inf(1), Hypersonic},
		{math.NaN(), Hypersonic},
	}
	for _, tc := range tests {
		if got := r.Speed(tc.M); got != tc.want {
			t.Errorf("DefaultRegimes().Speed(%g) = %v, want %v", tc.M, got, tc.want)
		}
	}
}

func TestDefaultRarefactionRegimes(t *testing.T) {
	r := DefaultRegimes()
	tests := []struct {
		Kn   float64
		want RarefactionRegime
	}{
		{0, Continuum},
		{0.00999, Continuum},
		{0.01, Slip},
		{0.0999, Slip},
		{0.1, Transitional},
		{10, Transitional},
		{10.0001, FreeMolecular},
		{1e6, FreeMolecular},
		{math.NaN(), FreeMolecular},
	}
	for _, tc := range tests {
		if got := r.Rarefaction(tc.Kn); got != tc.want {
			t.Errorf("DefaultRegimes().Rarefaction(%g) = %v, want %v", tc.Kn, got, tc.want)
		}
	}
}

func TestCustomRegimes(t *testing.T) {
	r := Regimes{Incompressible: 0.2, Subsonic: 0.7, Transonic: 1.3, Supersonic: 6, Continuum: 0.001, Slip: 0.2, Transitional: 5}
	if err := r.Validate(); err != nil {
		t.Fatalf("Validate() = %v, want nil", err)
	}
	for M, want := range map[float64]SpeedRegime{0.25: Subsonic, 0.75: Transonic, 1.25: Transonic, 5.5: Supersonic, 6: Hypersonic} {
		if got := r.Speed(M); got != want {
			t.Errorf("Speed(%g) = %v, want %v", M, got, want)
		}
	}
	for Kn, want := range map[float64]RarefactionRegime{0.005: Slip, 0.15: Slip, 5: Transitional, 6: FreeMolecular} {
		if got := r.Rarefaction(Kn); got != want {
			t.Errorf("Rarefaction(%g) = %v, want %v", Kn, got, want)
		}
	}
}

func TestRegimesValidate(t *testing.T) {
	if err := DefaultRegimes().Validate(); err != nil {
		t.Fatalf("DefaultRegimes().Validate() = %v, want nil", err)
	}
	tests := []struct {
		name   string
		modify func(*Regimes)
		want   string
	}{
		{"subsonic below incompressible", func(r *Regimes) { r.Subsonic = 0.25 }, "incompressible (0.3) must be below subsonic (0.25)"},
		{"equal transonic and supersonic", func(r *Regimes) { r.Supersonic = 1.2 }, "transonic (1.2) must be below supersonic (1.2)"},
		{"slip above transitional", func(r *Regimes) { r.Slip = 20 }, "slip (20) must be below transitional (10)"},
		{"continuum above slip", func(r *Regimes) { r.Continuum = 0.5 }, "continuum (0.5) must be below slip (0.1)"},
		{"NaN", func(r *Regimes) { r.Transonic = math.NaN() }, "transonic = NaN: must be finite and positive"},
		{"negative", func(r *Regimes) { r.Continuum = -1 }, "continuum = -1: must be finite and positive"},
		{"infinite", func(r *Regimes) { r.Transitional = math.Inf(1) }, "transitional = +Inf"},
		{"zero value", func(r *Regimes) { *r = Regimes{} }, "incompressible = 0"},
		{"transonic band above Mach 1", func(r *Regimes) { r.Subsonic = 1.05 }, "must contain Mach 1"},
		{"transonic band below Mach 1", func(r *Regimes) { r.Transonic = 0.95 }, "must contain Mach 1"},
	}
	for _, tc := range tests {
		r := DefaultRegimes()
		tc.modify(&r)
		err := r.Validate()
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: Validate() = %v, want error containing %q", tc.name, err, tc.want)
		}
	}
}

func TestRegimeNames(t *testing.T) {
	want := map[SpeedRegime]string{Incompressible: "incompressible", Subsonic: "subsonic", Transonic: "transonic", Supersonic: "supersonic", Hypersonic: "hypersonic", SpeedRegime(9): "SpeedRegime(9)"}
	for g, w := range want {
		if got := g.String(); got != w {
			t.Errorf("SpeedRegime(%d).String() = %q, want %q", int(g), got, w)
		}
	}
	wantR := map[RarefactionRegime]string{Continuum: "continuum", Slip: "slip", Transitional: "transitional", FreeMolecular: "free-molecular", RarefactionRegime(-1): "RarefactionRegime(-1)"}
	for g, w := range wantR {
		if got := g.String(); got != w {
			t.Errorf("RarefactionRegime(%d).String() = %q, want %q", int(g), got, w)
		}
	}
	if !Incompressible.IsSubsonic() || !Subsonic.IsSubsonic() || Transonic.IsSubsonic() {
		t.Error("IsSubsonic: want true for incompressible and subsonic only")
	}
}
