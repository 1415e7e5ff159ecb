package whatif

import (
	"math"
	"slices"
	"strings"
	"testing"

	"likewind/envelope"
)

func TestApplyWhatIfOrderAndBadValues(t *testing.T) {
	v, facs := demoData(t)
	s := envelope.DefaultSettings(v)
	w := Changes{
		Values: map[string]float64{"delta_t_K": 10, "scale": 0.05, "re_tol": math.NaN(), "compressibility_mach": 0.25},
		Facilities: map[string]FacilityChanges{
			facs[2].Name:     {"q_max_Pa": 5e4, "p0_max_Pa": 6e5},
			facs[0].Name:     {"t0_min_K": 100},
			"No such tunnel": {"q_max_Pa": 1},
		},
	}
	wantReTol := s.ReTol
	changed, err := Apply(w, &s, facs)
	want := []string{"model scale", "ΔT", "compressibility Mach",
		facs[0].Name + " T0 min", facs[2].Name + " p0 max", facs[2].Name + " q max"}
	if facs[2].Name < facs[0].Name {
		want = []string{"model scale", "ΔT", "compressibility Mach",
			facs[2].Name + " p0 max", facs[2].Name + " q max", facs[0].Name + " T0 min"}
	}
	if !slices.Equal(changed, want) {
		t.Errorf("Apply changed = %q, want %q", changed, want)
	}
	if s.Scale != 0.05 || s.DeltaT != 10 || s.ReTol != wantReTol || s.CompressibilityMach != 0.25 || s.Regimes.Incompressible != 0.25 {
		t.Errorf("settings after what-if = %+v", s)
	}
	if facs[2].QMax != 5e4 || facs[2].PressureMax() != 6e5 || facs[0].TemperatureMin() != 100 {
		t.Errorf("facility limits after what-if: q %g p0 %g T0 %g", facs[2].QMax, facs[2].PressureMax(), facs[0].TemperatureMin())
	}
	if err == nil {
		t.Fatal("Apply error = nil, want the NaN and the unknown facility named")
	}
	for _, part := range []string{"Reynolds tolerance", "No such tunnel"} {
		if !strings.Contains(err.Error(), part) {
			t.Errorf("Apply error %q lacks %q", err, part)
		}
	}
}

// A hand-edited session must not bring in values the editor refuses.
func TestApplyWhatIfOutOfRange(t *testing.T) {
	v, facs := demoData(t)
	cases := []struct {
		name string
		w    Changes
		want string // part of the error
	}{
		{"ΔT far below any day", Changes{Values: map[string]float64{"delta_t_K": -1000}}, "ΔT"},
		{"absurd scale", Changes{Values: map[string]float64{"scale": 1e300}}, "model scale"},
		{"negative scale", Changes{Values: map[string]float64{"scale": -0.1}}, "model scale"},
		{"Mach tolerance of 2", Changes{Values: map[string]float64{"mach_tol": 2}}, "Mach tolerance"},
		{"compressibility above 1", Changes{Values: map[string]float64{"compressibility_mach": 1.5}}, "compressibility"},
		{"negative p0 max", Changes{Facilities: map[string]FacilityChanges{facs[0].Name: {"p0_max_Pa": -1}}}, "p0 max"},
		{"T0 min at absolute zero", Changes{Facilities: map[string]FacilityChanges{facs[0].Name: {"t0_min_K": 0}}}, "T0 min"},
		// The bounds of the files (±60 K; 0–100 degC water; 1000 bar).
		{"ΔT of 70 K", Changes{Values: map[string]float64{"delta_t_K": 70}}, "within ±60 K"},
		{"scale above 10", Changes{Values: map[string]float64{"scale": 11}}, "a model scale above 0 and at most 10"},
		{"water at 5 K", Changes{Facilities: map[string]FacilityChanges{facs[5].Name: {"t0_min_K": 5}}}, "a water temperature from 0 degC to 100 degC"},
		{"p0 max below p0 min", Changes{Facilities: map[string]FacilityChanges{facs[3].Name: {"p0_max_Pa": 1e5}}}, "not below the facility's minimum"},
		{"T0 min above T0 max", Changes{Facilities: map[string]FacilityChanges{facs[3].Name: {"t0_min_K": 400}}}, "not above the facility's maximum"},
		{"q max of 2000 bar", Changes{Facilities: map[string]FacilityChanges{facs[3].Name: {"q_max_Pa": 2e8}}}, "at most 1000 bar"},
		{"negative q max", Changes{Facilities: map[string]FacilityChanges{facs[3].Name: {"q_max_Pa": -1}}}, "q max"},
	}
	for _, c := range cases {
		s := envelope.DefaultSettings(v)
		before := s
		fs := append([]envelope.Facility(nil), facs...)
		changed, err := Apply(c.w, &s, fs)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Apply error = %v, want one naming %q", c.name, err, c.want)
		}
		if len(changed) != 0 || s != before || !slices.Equal(fs, facs) {
			t.Errorf("%s: Apply changed %q (settings %+v), want nothing applied", c.name, changed, s)
		}
	}
}
