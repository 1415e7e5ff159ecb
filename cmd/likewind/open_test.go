package main

import (
	"strings"
	"testing"
)

// A bad input file is reported before the interface starts: every problem
// with its file and line, exit status 1; a wrong number of files is a
// usage error, exit status 2.
func TestOpenRefusesBadInput(t *testing.T) {
	cases := []struct {
		name string
		args []string
		code int
		want []string
	}{
		{"bad vehicle file", []string{"../../testdata/bad/altitude_out_of_range.toml", "../../testdata/facilities.toml"}, 1,
			[]string{"altitude_out_of_range.toml:14:", "envelope.boundary point 4 altitude", `"95 km"`}},
		{"missing facility file", []string{"../../testdata/corvane-sx3.toml", "no-such-facilities.toml"}, 1,
			[]string{"no-such-facilities.toml"}},
		{"vehicle alone", []string{"../../testdata/corvane-sx3.toml"}, 2,
			[]string{"likewind:", "facility files"}},
		{"restore and fresh together", []string{"--restore", "--fresh"}, 2,
			[]string{"--restore", "--fresh"}},
	}
	for _, c := range cases {
		code, _, errs := runCmd(c.args...)
		if code != c.code {
			t.Errorf("%s: exit = %d, want %d (stderr %q)", c.name, code, c.code, errs)
		}
		for _, w := range c.want {
			if !strings.Contains(errs, w) {
				t.Errorf("%s: stderr = %q, want it to contain %q", c.name, errs, w)
			}
		}
	}
}

// The interface's flags are read as every subcommand's (parseArgs): a bad
// flag is reported once with exit status 2, flags may follow the file
// names, and -- ends the flags.
func TestOpenFlags(t *testing.T) {
	code, _, errs := runCmd("--no-such-flag")
	if code != 2 || strings.Count(errs, "no-such-flag") != 1 {
		t.Errorf("bad flag: exit %d, stderr %q; want 2 and the flag named once", code, errs)
	}
	o, code := parseOpenFlags([]string{"v.toml", "--fresh", "f.toml", "--", "--restore"}, &strings.Builder{})
	if code >= 0 || !o.fresh || o.restore || strings.Join(o.files, " ") != "v.toml f.toml --restore" {
		t.Errorf("parseOpenFlags = %+v, code %d; want fresh and files v.toml f.toml --restore", o, code)
	}
}
