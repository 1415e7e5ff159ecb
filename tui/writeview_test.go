package tui

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// dumpClock is a fixed clock that counts its calls.
type dumpClock struct {
	t     time.Time
	calls int
}

func (c *dumpClock) now() time.Time { c.calls++; return c.t }

// writeDemo is the demo at a width that shows a whole status line, with
// the write key pointed at dir.
func writeDemo(t *testing.T, dir string, clock *dumpClock) Model {
	t.Helper()
	return newDemo(t, 220, 40, func(o *Options) {
		o.DumpDir = dir
		o.Version = "9.9.9"
		o.Clock = clock.now
	})
}

// pressWrite sends the write key and returns the model after Update and
// the command it returned.
func pressWrite(t *testing.T, m Model) (Model, tea.Cmd) {
	t.Helper()
	next, cmd := m.Update(keyMsg("w"))
	return next.(Model), cmd
}

func TestWriteViewKey(t *testing.T) {
	dir := t.TempDir()
	clock := &dumpClock{t: time.Date(2025, 3, 4, 14, 25, 30, 0, time.Local)}
	m := writeDemo(t, dir, clock)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.curI = gridIndex(m.res.grid.Alts, 9144)
	m.curJ = gridIndex(m.res.grid.Speeds, 0.85)
	m = edit(t, m, whatif.DeltaT, "10 K")
	m, _ = press(m, "esc", "space", "tab", "tab", "u")
	if m.busy || len(m.marks) != 1 || m.layer != LayerReynolds || m.units != units.Customary {
		t.Fatalf("state before writing: busy %v, %d marks, layer %v, units %v", m.busy, len(m.marks), m.layer, m.units)
	}

	m, cmd := pressWrite(t, m)
	if cmd == nil {
		t.Fatalf("write key gave no command; status %q", m.status)
	}
	if clock.calls != 0 {
		t.Errorf("clock read %d times before the command ran, want 0", clock.calls)
	}
	msg := cmd()
	if clock.calls != 1 {
		t.Errorf("clock read %d times by the command, want 1", clock.calls)
	}
	wm, ok := msg.(viewWrittenMsg)
	if !ok {
		t.Fatalf("command returned %T, want viewWrittenMsg", msg)
	}
	wantPath := filepath.Join(dir, "corvane-sx-3-supersonic-research_kellen-fold-cryogenic-transonic_reynolds-ratio_20250304-142530.txt")
	if wm.err != nil || wm.path != wantPath {
		t.Fatalf("written = %q, %v; want %q, nil", wm.path, wm.err, wantPath)
	}
	next, _ := m.Update(msg)
	m = next.(Model)
	if m.statusErr || m.status != "view written to "+wantPath {
		t.Errorf("status = %q (error %v), want the path", m.status, m.statusErr)
	}
	if !strings.Contains(m.View(), "view written to "+wantPath) {
		t.Error("screen does not show the written path")
	}

	got, err := os.ReadFile(wantPath)
	if err != nil {
		t.Fatal(err)
	}
	in, err := m.DumpInput()
	if err != nil {
		t.Fatal(err)
	}
	in.Date = "2025-03-04"
	want, err := Dump(in, PlainStyles())
	if err != nil {
		t.Fatal(err)
	}
	if string(got) != want {
		t.Errorf("file content differs from Dump of the view:\n--- file\n%s\n--- Dump\n%s", got, want)
	}
	for _, part := range []string{
		"likewind 9.9.9 matrix dump, 2025-03-04",
		"Kellen Fold cryogenic transonic tunnel",
		"layer     Reynolds ratio",
		"changed by the session: ΔT",
		"units     customary",
		", 1 marked",
		"caution   " + envelope.SafetyNote,
	} {
		if !strings.Contains(want, part) {
			t.Errorf("dump lacks %q:\n%s", part, want)
		}
	}
	if strings.Contains(string(got), "\x1b[") {
		t.Error("written view has escape sequences")
	}

	// A second write in the same second keeps the first file and takes a
	// numbered name.
	m.fac = -1
	m, cmd = pressWrite(t, m)
	wm = cmd().(viewWrittenMsg)
	wantPath2 := filepath.Join(dir, "corvane-sx-3-supersonic-research_best-of-all_reynolds-ratio_20250304-142530.txt")
	if wm.err != nil || wm.path != wantPath2 {
		t.Fatalf("best of all written = %q, %v; want %q", wm.path, wm.err, wantPath2)
	}
	m, cmd = pressWrite(t, m)
	wm = cmd().(viewWrittenMsg)
	if want := strings.TrimSuffix(wantPath2, ".txt") + "-2.txt"; wm.err != nil || wm.path != want {
		t.Errorf("repeat written = %q, %v; want %q", wm.path, wm.err, want)
	}
	if b, _ := os.ReadFile(wantPath); string(b) != want {
		t.Error("the first file changed")
	}
}

func TestWriteViewRefusals(t *testing.T) {
	clock := &dumpClock{t: time.Date(2025, 3, 4, 0, 0, 0, 0, time.UTC)}

	// No folder: the key says it is unavailable and runs nothing.
	m := writeDemo(t, "", clock)
	m, cmd := pressWrite(t, m)
	if cmd != nil || !m.statusErr || !strings.Contains(m.status, "not available") {
		t.Errorf("without a folder: command %v, status %q (error %v); want none and an unavailable message", cmd != nil, m.status, m.statusErr)
	}

	// While a recompute runs the results do not match the settings yet.
	dir := t.TempDir()
	m = writeDemo(t, dir, clock)
	m.busy = true
	m, cmd = pressWrite(t, m)
	if cmd != nil || !m.statusErr {
		t.Errorf("while computing: command %v, status %q; want none and an error", cmd != nil, m.status)
	}

	// A folder that does not exist: the error, naming the file, is on the
	// status line and nothing is left behind.
	missing := filepath.Join(dir, "gone")
	m = writeDemo(t, missing, clock)
	m, _ = drive(m, keyMsg("w"))
	if !m.statusErr || !strings.Contains(m.status, "view not written") || !strings.Contains(m.status, missing) {
		t.Errorf("missing folder: status %q (error %v); want the error naming the folder", m.status, m.statusErr)
	}
	if es, _ := os.ReadDir(dir); len(es) != 0 {
		t.Errorf("folder holds %d entries after a failed write, want 0", len(es))
	}
	if clock.calls != 1 {
		t.Errorf("clock read %d times, want once (by the one command that ran)", clock.calls)
	}
}

func TestSlug(t *testing.T) {
	cases := []struct{ in, want string }{
		{"Kellen Fold cryogenic transonic tunnel", "kellen-fold-cryogenic-transonic"},
		{"Corvane SX-3", "corvane-sx-3"},
		{"  --Mach number--  ", "mach-number"},
		{"tunnel q / limit", "tunnel-q-limit"},
		{"ΔT Ünïcode", "t-n-code"},
		{"abcdefghijklmnopqrstuvwxyz0123456789", "abcdefghijklmnopqrstuvwxyz012345"},
		{"", "def"},
		{"///", "def"},
	}
	for _, c := range cases {
		if got := slug(c.in, "def"); got != c.want {
			t.Errorf("slug(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
