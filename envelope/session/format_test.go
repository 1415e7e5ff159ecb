package session

import (
	"reflect"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// oldSessionFile is a session file as the interface wrote it before the
// what-if values were declared in one table (typed struct fields): files
// saved then must still load, and a session saved now is written with the
// same bytes.
const oldSessionFile = `{
  "version": 1,
  "inputs": [
    "v.toml",
    "f.toml"
  ],
  "hash": "sha256:abc",
  "facility": "Tunnel B",
  "layer": "class",
  "units": "SI",
  "what_if": {
    "scale": 0.05,
    "delta_t_K": -10,
    "mach_tol": 0.02,
    "re_tol": 0.05,
    "compressibility_mach": 0.25,
    "facilities": {
      "Tunnel A": {
        "q_max_Pa": 50000
      },
      "Tunnel B": {
        "p0_max_Pa": 300000,
        "t0_min_K": 120,
        "q_max_Pa": 0
      }
    }
  },
  "marks": [
    {
      "altitude_m": 1000,
      "speed": 0.8
    }
  ],
  "cursor": {
    "altitude_m": 1000,
    "speed": 0.8
  }
}
`

func TestSessionFileFormatUnchanged(t *testing.T) {
	want := Session{
		Version: 1, Inputs: []string{"v.toml", "f.toml"}, Hash: "sha256:abc", Facility: "Tunnel B", Layer: "class", Units: "SI",
		WhatIf: whatif.Changes{
			Values: map[string]float64{"scale": 0.05, "delta_t_K": -10, "mach_tol": 0.02, "re_tol": 0.05, "compressibility_mach": 0.25},
			Facilities: map[string]whatif.FacilityChanges{
				"Tunnel A": {"q_max_Pa": 5e4},
				"Tunnel B": {"p0_max_Pa": 3e5, "t0_min_K": 120, "q_max_Pa": 0},
			},
		},
		Marks:  []Point{{Altitude: 1000, Speed: 0.8}},
		Cursor: &Point{Altitude: 1000, Speed: 0.8},
	}
	got, err := parse([]byte(oldSessionFile))
	if err != nil {
		t.Fatalf("an old session file no longer loads: %v", err)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("old session file read as\n%+v\nwant\n%+v", got, want)
	}
	b, err := encode(want)
	if err != nil {
		t.Fatal(err)
	}
	if string(b) != oldSessionFile {
		t.Errorf("session written as\n%s\nwant the old bytes\n%s", b, oldSessionFile)
	}
	// No what-if value: an empty object, as before.
	b, _ = encode(Session{Version: 1, Layer: "class", Units: "SI"})
	if !strings.Contains(string(b), `"what_if": {}`) {
		t.Errorf("empty what-if written as\n%s", b)
	}
}

// The what-if object is read as strictly as the rest of the file: a key
// that names no field is refused, naming the keys taken; a null value is
// unchanged, as a missing one; keys match case-folded, as encoding/json
// matches struct fields.
func TestSessionWhatIfKeys(t *testing.T) {
	head := `{"version": 1, "inputs": [], "hash": "", "layer": "class", "units": "SI", "what_if": `
	for _, c := range []struct{ what, want string }{
		{`{"scael": 0.05}`, `unknown what-if field "scael" (expected scale, delta_t_K, mach_tol, re_tol, compressibility_mach or facilities)`},
		{`{"facilities": {"T": {"p0_max": 1}}}`, `unknown facility what-if field "p0_max" (expected p0_max_Pa, t0_min_K, q_max_Pa, rule, rule_temperature_K, rule_q_Pa)`},
		{`{"scale": "big"}`, "what-if scale: json: cannot unmarshal string"},
	} {
		_, err := parse([]byte(head + c.what + "}"))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("what_if %s: error %v, want one containing %q", c.what, err, c.want)
		}
	}
	s, err := parse([]byte(head + `{"scale": null, "Delta_T_K": 5, "facilities": {"T": {"q_max_Pa": null}}}}`))
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(s.WhatIf.Values, map[string]float64{"delta_t_K": 5}) || len(s.WhatIf.Facilities["T"]) != 0 {
		t.Errorf("what-if read as %+v, want only ΔT 5 K", s.WhatIf)
	}
}

// A facility's operating rule is kept under the key "rule" by its name,
// with the value a fixed rule holds in SI; such a file reads back as it
// was written (the keys of the files above are unchanged beside it).
func TestSessionRuleRoundTrip(t *testing.T) {
	const file = `{
  "version": 1,
  "inputs": [],
  "hash": "sha256:abc",
  "facility": "Tunnel B",
  "layer": "model load",
  "units": "SI",
  "what_if": {
    "scale": 0.025,
    "facilities": {
      "Tunnel A": {
        "rule": "least load"
      },
      "Tunnel B": {
        "t0_min_K": 120,
        "rule": "fixed temperature",
        "rule_temperature_K": 150
      }
    }
  }
}
`
	s, err := parse([]byte(file))
	if err != nil {
		t.Fatalf("a session with rules does not load: %v", err)
	}
	// In memory a rule is its engine value.
	want := whatif.Changes{
		Values: map[string]float64{"scale": 0.025},
		Facilities: map[string]whatif.FacilityChanges{
			"Tunnel A": {"rule": float64(envelope.RuleLeastLoad)},
			"Tunnel B": {"t0_min_K": 120, "rule": float64(envelope.RuleFixedTemperature), "rule_temperature_K": 150},
		},
	}
	if !reflect.DeepEqual(s.WhatIf, want) {
		t.Errorf("what-if read as %+v, want %+v", s.WhatIf, want)
	}
	b, err := encode(s)
	if err != nil {
		t.Fatal(err)
	}
	if string(b) != file {
		t.Errorf("session written as\n%s\nwant\n%s", b, file)
	}
}
