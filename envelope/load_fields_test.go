package envelope

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// TestFieldKeysDocumented: every key the loader reads is in docs/FORMAT.md
// (a key added as a row of a field list shows up in unknown-key errors, so
// it must be documented too).
func TestFieldKeysDocumented(t *testing.T) {
	doc, err := os.ReadFile(filepath.Join("..", "docs", "FORMAT.md"))
	if err != nil {
		t.Fatal(err)
	}
	var v Vehicle
	var m ModelSizing
	var c Campaign
	lists := map[string][]string{
		"vehicle":  fieldKeys(vehicleFields(&v)),
		"envelope": envelopeKeys,
		"limits":   fieldKeys(limitFields(&v)),
		"grid":     gridKeys,
		"axis":     axisKeys,
		"facility": facilityKeys,
		"model":    fieldKeys(modelFields(&m)),
		"campaign": fieldKeys(campaignFields(&c)),
	}
	for table, keys := range lists {
		for _, k := range keys {
			if !strings.Contains(string(doc), "`"+k+"`") && !strings.Contains(string(doc), "."+k+"]`") {
				t.Errorf("[%s] key %q is not in docs/FORMAT.md", table, k)
			}
		}
	}
}

// TestFacilityKeys states the keys of a [[facility]] table in their
// documented order, and which media take them.
func TestFacilityKeys(t *testing.T) {
	want := []string{"name", "class", "medium", "mach_range", "speed_range", "stagnation_pressure_range", "static_pressure_range", "stagnation_temperature_range", "water_temperature_range", "max_dynamic_pressure", "min_static_temperature", "condensation_check", "peak_local_mach", "max_reynolds_per_metre", "section_width", "section_height", "balance_max_normal_force", "balance_max_pitching_moment", "operating_rule", "rule_temperature", "rule_q", "model", "campaign"}
	if !reflect.DeepEqual(facilityKeys, want) {
		t.Errorf("facilityKeys =\n  %v\nwant\n  %v", facilityKeys, want)
	}
	var gas, water []string
	for _, ff := range facilityFields(&Facility{}) {
		switch ff.media {
		case gasOnly:
			gas = append(gas, ff.name())
		case waterOnly:
			water = append(water, ff.name())
		}
	}
	wantGas := []string{"mach_range", "stagnation_pressure_range", "stagnation_temperature_range", "min_static_temperature", "condensation_check", "peak_local_mach"}
	wantWater := []string{"speed_range", "static_pressure_range", "water_temperature_range"}
	if !reflect.DeepEqual(gas, wantGas) || !reflect.DeepEqual(water, wantWater) {
		t.Errorf("gas-only keys %v, water-only keys %v; want %v and %v", gas, water, wantGas, wantWater)
	}
	for k, c := range waterCounterpart {
		if waterCounterpart[c] != k {
			t.Errorf("waterCounterpart[%q] = %q, but waterCounterpart[%q] = %q", k, c, c, waterCounterpart[c])
		}
	}
}
