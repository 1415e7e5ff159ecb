package main

import (
	"bytes"
	"errors"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
	"likewind/tui"
)

// update rewrites the golden files of this package: go test ./cmd/likewind -update
var update = flag.Bool("update", false, "rewrite golden files under testdata/golden")

const goldenDir = "../../testdata/golden"

// outCmd runs a command line through the dispatcher.
func outCmd(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = run(args, strings.NewReader(""), &out, &errb)
	return code, out.String(), errb.String()
}

// outDemoEval evaluates the built-in demo (invented data) with default
// settings, as the commands do.
func outDemoEval(t *testing.T) *envelope.Evaluation {
	t.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	e, err := envelope.Evaluate(v, facs, envelope.DefaultSettings(v))
	if err != nil {
		t.Fatal(err)
	}
	return e
}

// outDemoSession writes a session for the demo data with the given marks
// (grid row, column) and what-if values, and returns its path.
func outDemoSession(t *testing.T, marks [][2]int, w whatif.Changes, facility string) string {
	t.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	e := outDemoEval(t)
	s := session.Session{
		Version: session.Version, Hash: session.DataHash(v, facs),
		Facility: facility, Layer: tui.LayerClass.String(), Units: units.SI.String(), WhatIf: w,
	}
	for _, m := range marks {
		s.Marks = append(s.Marks, session.Point{Altitude: e.Grid.Alts[m[0]], Speed: e.Grid.Speeds[m[1]]})
	}
	p := filepath.Join(t.TempDir(), "session.json")
	if err := session.Save(p, s); err != nil {
		t.Fatal(err)
	}
	return p
}

func checkGolden(t *testing.T, name, got string) {
	t.Helper()
	p := filepath.Join(goldenDir, name)
	if *update {
		if err := os.MkdirAll(goldenDir, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(p)
	if err != nil {
		t.Fatalf("read golden (run with -update to create it): %v", err)
	}
	if got != string(want) {
		t.Errorf("%s differs from golden (run with -update after checking):\n--- got\n%s\n--- want\n%s", name, got, want)
	}
}

func TestDumpGolden(t *testing.T) {
	sess := outDemoSession(t, [][2]int{{10, 12}, {20, 20}, {20, 21}, {5, 8}},
		whatif.Changes{Values: map[string]float64{"delta_t_K": 10}}, "Kellen Fold cryogenic transonic tunnel")
	cases := []struct {
		golden string
		args   []string
	}{
		{"dump_class_plain.golden", []string{"--plain", "--facility", "Harl Cove"}},
		{"dump_class_ansi.golden", []string{"--color", "--facility", "Harl Cove"}},
		{"dump_best_reynolds_plain.golden", []string{"--plain", "--facility", "best", "--layer", "reynolds"}},
		{"dump_best_class_ansi.golden", []string{"--color", "--facility", "best"}},
		{"dump_regime_customary_plain.golden", []string{"--plain", "--layer", "regime", "--customary"}},
		{"dump_q_plain.golden", []string{"--plain", "--facility", "3", "--layer", "q"}},
		{"dump_session_plain.golden", []string{"--plain", "--session", sess}},
	}
	for _, c := range cases {
		t.Run(c.golden, func(t *testing.T) {
			args := append([]string{"dump", "--date", "2025-01-01"}, c.args...)
			code, out, errs := outCmd(args...)
			if code != 0 {
				t.Fatalf("dump %v exit %d, want 0; stderr: %s", c.args, code, errs)
			}
			if strings.Contains(c.golden, "session") {
				// The session path is a temporary file; keep it out of
				// the golden text.
				out = strings.ReplaceAll(out, sess, "SESSION")
			}
			checkGolden(t, c.golden, out)
			ansiOut := strings.Contains(c.golden, "_ansi")
			if hasESC := strings.Contains(out, "\x1b["); hasESC != ansiOut {
				t.Errorf("ANSI escapes present = %v, want %v", hasESC, ansiOut)
			}
		})
	}
}

// TestDumpPlainAndColourSameGlyphs checks that colour adds only escape
// sequences: stripped, the coloured dump is the plain one.
func TestDumpPlainAndColourSameGlyphs(t *testing.T) {
	for _, layer := range []string{"class", "regime", "reynolds", "q", "mach"} {
		_, plain, _ := outCmd("dump", "--date", "2025-01-01", "--plain", "--layer", layer, "--facility", "best")
		_, col, _ := outCmd("dump", "--date", "2025-01-01", "--color", "--layer", layer, "--facility", "best")
		if got := ansi.Strip(col); got != plain {
			t.Errorf("layer %s: coloured dump without escapes differs from the plain dump", layer)
		}
	}
}

// TestDumpMatchesEngine reads the class glyphs back from a plain dump and
// checks them against the engine's classes for that facility.
func TestDumpMatchesEngine(t *testing.T) {
	e := outDemoEval(t)
	glyph := map[envelope.Class]byte{
		envelope.FullMatch: '#', envelope.ReShort: '=', envelope.MachRelaxed: '~', envelope.NoMatch: 'x',
	}
	for k, f := range e.Facilities {
		m := e.Maps[k]
		code, out, errs := outCmd("dump", "--plain", "--facility", f.Name)
		if code != 0 {
			t.Fatalf("dump %s: exit %d: %s", f.Name, code, errs)
		}
		lines := strings.Split(out, "\n")
		start := -1
		for n, l := range lines {
			if strings.HasPrefix(l, "altitude m") {
				start = n + 1
				break
			}
		}
		if start < 0 {
			t.Fatalf("dump %s: no matrix title line", f.Name)
		}
		g := e.Grid
		for d := 0; d < g.Rows(); d++ {
			i := g.Rows() - 1 - d
			l := lines[start+d]
			bar := strings.IndexByte(l, '|')
			if bar < 0 {
				t.Fatalf("row %d: no axis bar in %q", i, l)
			}
			for j := 0; j < g.Cols(); j++ {
				got := l[bar+1+2*j]
				want := byte('.')
				if g.Inside(i, j) {
					want = glyph[m.At(i, j).Class]
				}
				if got != want {
					t.Fatalf("%s (%d,%d): glyph %q, want %q for %v", f.Name, i, j, got, want, m.At(i, j).Class)
				}
			}
		}
	}
}

func TestDumpToFile(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "matrix.txt")
	if code, _, errs := outCmd("dump", "-o", p); code != 0 {
		t.Fatalf("dump -o exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Contains(b, []byte("\x1b[")) {
		t.Error("dump into a file has ANSI escapes without --color")
	}
	if !bytes.Contains(b, []byte("caution")) || !bytes.Contains(b, []byte("match class:")) {
		t.Error("dump file lacks the caution line or the legend")
	}
	// Existing file: refused without --force, content kept.
	if err := os.WriteFile(p, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, errs := outCmd("dump", "-o", p)
	if code != 1 || !strings.Contains(errs, "--force") {
		t.Errorf("dump -o existing: exit %d, stderr %q; want 1 and a hint about --force", code, errs)
	}
	if b, _ := os.ReadFile(p); string(b) != "keep" {
		t.Errorf("existing file changed to %q", b)
	}
	if code, _, errs := outCmd("dump", "-o", p, "--force", "--color"); code != 0 {
		t.Fatalf("dump --force exit %d: %s", code, errs)
	}
	if b, _ := os.ReadFile(p); !bytes.Contains(b, []byte("\x1b[")) {
		t.Error("dump --color into a file has no ANSI escapes")
	}
	// A folder that cannot hold the file (its parent is a file): fails,
	// leaves nothing.
	bad := filepath.Join(p, "sub.txt")
	code, _, errs = outCmd("dump", "-o", bad)
	if code != 1 || !strings.Contains(errs, bad) {
		t.Errorf("dump -o %s: exit %d, stderr %q; want 1 naming the file", bad, code, errs)
	}
	es, _ := os.ReadDir(dir)
	if len(es) != 1 {
		t.Errorf("folder holds %d entries after a failed write, want 1", len(es))
	}
}

func TestOutputCommandsBadUsage(t *testing.T) {
	cases := [][]string{
		{"dump", "--plain", "--color"},
		{"dump", "--layer", "pressure"},
		{"dump", "--facility", "no such tunnel"},
		{"dump", "--facility", "tunnel"}, // several match
		{"dump", "--date", "yesterday"},
		{"dump", "--bogus"},
		{"export", "--format", "xml"},
		{"plot"},
		{"plot", "-o", "x.gif"},
		{"plot", "-o", "x.png", "--chart", "pie"},
		{"coverage", "--format", "html"},
		{"runs", "--format", "pdf"},
		{"runs", "--facility", "nowhere"},
		{"export", "only-one-file.toml"},
	}
	for _, c := range cases {
		code, _, errs := outCmd(c...)
		if code != 2 {
			t.Errorf("%v: exit %d, want 2 (stderr %q)", c, code, errs)
		}
		if strings.TrimSpace(errs) == "" {
			t.Errorf("%v: no message on stderr", c)
		}
	}
}

func TestOutputCommandsBadFiles(t *testing.T) {
	bad := "../../testdata/bad/many_faults.toml"
	veh := "../../testdata/bad/missing_field.toml"
	for _, cmd := range []string{"dump", "export", "coverage", "runs"} {
		code, _, errs := outCmd(cmd, veh, bad)
		if code != 1 {
			t.Errorf("%s with bad files: exit %d, want 1 (stderr %q)", cmd, code, errs)
		}
		// Every problem of both files is reported.
		for _, want := range []string{"many_faults.toml", "missing_field.toml", "section_height", "colour"} {
			if !strings.Contains(errs, want) {
				t.Errorf("%s: stderr lacks %q:\n%s", cmd, want, errs)
			}
		}
	}
}

func TestSessionForOtherData(t *testing.T) {
	p := filepath.Join(t.TempDir(), "s.json")
	s := session.Session{Version: session.Version, Hash: "sha256:not-this-data", Layer: "match class", Units: "SI"}
	if err := session.Save(p, s); err != nil {
		t.Fatal(err)
	}
	code, _, errs := outCmd("runs", "--session", p)
	if code != 1 || !strings.Contains(errs, "different input files") {
		t.Errorf("runs with a foreign session: exit %d, stderr %q; want 1 and the reason", code, errs)
	}
}

// TestDumpWithUnevaluatedFacility draws best of all when one facility has
// no map (as when it has no model scale): its letter is listed as not
// evaluated and the others still show.
func TestDumpWithUnevaluatedFacility(t *testing.T) {
	e := outDemoEval(t)
	e.Maps[0], e.Errs[0] = nil, errors.New("no model scale")
	ev := &evaluated{e: e}
	for _, layer := range tui.Layers() {
		out, err := renderDump(ev, dumpView{fac: -1, layer: layer, units: units.SI, date: "2025-01-01"}, tui.PlainStyles())
		if err != nil {
			t.Fatalf("layer %v: %v", layer, err)
		}
		if !strings.Contains(out, "a  "+e.Facilities[0].Name+" (not evaluated)") {
			t.Errorf("layer %v: header does not mark the unevaluated facility", layer)
		}
	}
	e.Maps = make([]*envelope.Map, len(e.Maps))
	out, err := renderDump(ev, dumpView{fac: -1, layer: tui.LayerClass, units: units.SI, date: "2025-01-01"}, tui.PlainStyles())
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, "? no facility") {
		t.Errorf("no facility evaluated: legend lacks the no-facility glyph:\n%s", out)
	}
}

// uiDrive sends messages to an interface model and feeds every command's
// result back, as the Bubble Tea runtime would.
func uiDrive(t *testing.T, m tui.Model, msgs ...tea.Msg) tui.Model {
	t.Helper()
	queue := append([]tea.Msg(nil), msgs...)
	for len(queue) > 0 {
		msg := queue[0]
		queue = queue[1:]
		next, cmd := m.Update(msg)
		m = next.(tui.Model)
		if cmd != nil {
			if out := cmd(); out != nil {
				queue = append(queue, out)
			}
		}
	}
	return m
}

// uiKeys turns key names into key messages; a name of more than one rune
// that is not a special key is typed rune by rune.
func uiKeys(names ...string) []tea.Msg {
	special := map[string]tea.KeyType{
		"up": tea.KeyUp, "down": tea.KeyDown, "tab": tea.KeyTab, "enter": tea.KeyEnter,
		"esc": tea.KeyEsc, "ctrl+u": tea.KeyCtrlU, "space": tea.KeySpace,
	}
	var out []tea.Msg
	for _, n := range names {
		if k, ok := special[n]; ok {
			out = append(out, tea.KeyMsg{Type: k})
			continue
		}
		for _, r := range n {
			if r == ' ' {
				out = append(out, tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}})
				continue
			}
			out = append(out, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
		}
	}
	return out
}

// TestInterfaceWriteEqualsDump drives the interface into a state, writes
// the view with its write key, saves the session of that state, and
// checks the file holds exactly what `likewind dump --plain --session`
// prints for the same state.
func TestInterfaceWriteEqualsDump(t *testing.T) {
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	day := time.Date(2025, 3, 4, 9, 30, 0, 0, time.Local)
	cases := []struct {
		name string
		keys []string
	}{
		{"start", nil},
		{"facility, layer, units, what-if, marks", []string{
			"]", "]", "tab", "tab", "u", "space", "up", "up", "space",
			"e", "down", "enter", "ctrl+u", "10 K", "enter", // ΔT
			"down", "down", "down", "down", "enter", "ctrl+u", "40 psi", "enter", // p0 max
			"esc"}},
		{"best of all with marks", []string{"b", "tab", "tab", "M", "e", "enter", "ctrl+u", "0.03", "enter", "esc"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			st := tui.PlainStyles()
			m := tui.New(tui.Options{
				Vehicle: v, Facilities: facs, Styles: &st, Width: 250, Height: 60,
				DumpDir: dir, Version: version, Clock: func() time.Time { return day },
			})
			m = uiDrive(t, m, uiKeys(c.keys...)...)
			m = uiDrive(t, m, uiKeys("w")...)
			screen := m.View()
			const prefix = "view written to "
			k := strings.Index(screen, prefix)
			if k < 0 {
				t.Fatalf("screen shows no written path:\n%s", screen)
			}
			path := strings.TrimSpace(strings.SplitN(screen[k+len(prefix):], "\n", 2)[0])
			if filepath.Dir(path) != dir {
				t.Fatalf("written to %q, want a file in %q", path, dir)
			}
			got, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}

			sess := filepath.Join(t.TempDir(), "session.json")
			if err := session.Save(sess, m.Session()); err != nil {
				t.Fatal(err)
			}
			code, want, errs := outCmd("dump", "--plain", "--date", day.Format(time.DateOnly), "--session", sess)
			if code != 0 {
				t.Fatalf("dump --session exit %d: %s", code, errs)
			}
			if string(got) != want {
				t.Errorf("written view differs from likewind dump --plain:\n--- written\n%s\n--- dump\n%s", got, want)
			}
		})
	}
}
