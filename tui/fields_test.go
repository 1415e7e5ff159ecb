package tui

import (
	"math"
	"reflect"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
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
		WhatIf: WhatIf{
			Values: map[string]float64{"scale": 0.05, "delta_t_K": -10, "mach_tol": 0.02, "re_tol": 0.05, "compressibility_mach": 0.25},
			Facilities: map[string]FacilityWhatIf{
				"Tunnel A": {"q_max_Pa": 5e4},
				"Tunnel B": {"p0_max_Pa": 3e5, "t0_min_K": 120, "q_max_Pa": 0},
			},
		},
		Marks:  []Point{{Altitude: 1000, Speed: 0.8}},
		Cursor: &Point{Altitude: 1000, Speed: 0.8},
	}
	got, err := parseSession([]byte(oldSessionFile))
	if err != nil {
		t.Fatalf("an old session file no longer loads: %v", err)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("old session file read as\n%+v\nwant\n%+v", got, want)
	}
	b, err := encodeSession(want)
	if err != nil {
		t.Fatal(err)
	}
	if string(b) != oldSessionFile {
		t.Errorf("session written as\n%s\nwant the old bytes\n%s", b, oldSessionFile)
	}
	// No what-if value: an empty object, as before.
	b, _ = encodeSession(Session{Version: 1, Layer: "class", Units: "SI"})
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
		{`{"facilities": {"T": {"p0_max": 1}}}`, `unknown facility what-if field "p0_max" (expected p0_max_Pa, t0_min_K, q_max_Pa)`},
		{`{"scale": "big"}`, "what-if scale: json: cannot unmarshal string"},
	} {
		_, err := parseSession([]byte(head + c.what + "}"))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("what_if %s: error %v, want one containing %q", c.what, err, c.want)
		}
	}
	s, err := parseSession([]byte(head + `{"scale": null, "Delta_T_K": 5, "facilities": {"T": {"q_max_Pa": null}}}}`))
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(s.WhatIf.Values, map[string]float64{"delta_t_K": 5}) || len(s.WhatIf.Facilities["T"]) != 0 {
		t.Errorf("what-if read as %+v, want only ΔT 5 K", s.WhatIf)
	}
}

// Every row of the field table is whole, and what the editor starts the
// input line with reads back as the value shown, in both unit systems.
func TestFieldTableRows(t *testing.T) {
	v, facs := demoData(t)
	keys := map[string]bool{}
	seenLimit := false
	for f := range fieldCount {
		d := f.def()
		if d.label == "" || d.name == "" || d.key == "" || d.get == nil || d.set == nil || d.show == nil {
			t.Errorf("field %d: row incomplete: %+v", f, d)
		}
		if d.facility && d.limit == nil || !d.facility && (d.read == nil || d.bound == nil) {
			t.Errorf("%s: no parser or bound", d.label)
		}
		if keys[d.key] {
			t.Errorf("%s: session key %q used twice", d.label, d.key)
		}
		keys[d.key] = true
		if seenLimit && !d.facility {
			t.Errorf("%s: the editor lists the settings before the facility limits", d.label)
		}
		seenLimit = seenLimit || d.facility
		for k := range facs {
			s := envelope.DefaultSettings(v)
			fac := &facs[k]
			var on *envelope.Facility
			if d.facility {
				on = fac
			}
			want := d.get(&s, fac)
			for _, u := range []units.System{units.SI, units.Customary} {
				text := f.editText(u, want, isWater(fac))
				got, err := parseField(f, text, u, on)
				if err != nil {
					t.Errorf("%s of %s: the start text %q is refused: %v", d.label, fac.Name, text, err)
					continue
				}
				// The text is rounded as shown: within its last digit.
				if math.Abs(got-want) > 5e-3*math.Abs(want)+1e-9 {
					t.Errorf("%s of %s: %q reads %g, want %g", d.label, fac.Name, text, got, want)
				}
			}
			if !d.facility {
				break
			}
		}
	}
	// The session keys of today's files (see oldSessionFile).
	for _, k := range []string{"scale", "delta_t_K", "mach_tol", "re_tol", "compressibility_mach", "p0_max_Pa", "t0_min_K", "q_max_Pa"} {
		if !keys[k] {
			t.Errorf("session key %q is no field's: old session files would not load", k)
		}
	}
}

// A hand-edited session cannot bring in a compressibility threshold the
// editor refuses: at or above the subsonic bound of the regime classes
// (Mach 0.8 by default, common practice), which would leave the regimes
// out of order.
func TestApplyWhatIfCompressibilityBelowSubsonic(t *testing.T) {
	v, facs := demoData(t)
	s := envelope.DefaultSettings(v)
	before := s
	changed, err := ApplyWhatIf(WhatIf{Values: map[string]float64{"compressibility_mach": 0.9}}, &s, facs)
	if err == nil || !strings.Contains(err.Error(), "below the subsonic bound 0.80") {
		t.Errorf("ApplyWhatIf(compressibility 0.9) error = %v, want the subsonic bound named", err)
	}
	if len(changed) != 0 || s != before {
		t.Errorf("ApplyWhatIf applied %q: settings %+v", changed, s)
	}
	// Set in code, a key that names no field is named too.
	_, err = ApplyWhatIf(WhatIf{Values: map[string]float64{"scael": 0.1}}, &s, facs)
	if err == nil || !strings.Contains(err.Error(), `unknown value "scael"`) {
		t.Errorf("ApplyWhatIf(unknown key) error = %v", err)
	}
}
