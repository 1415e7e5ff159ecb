package main

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// fullWriter fails every write, as a full disk or a closed pipe does.
type fullWriter struct{}

var errFull = errors.New("no space left on device (test)")

func (fullWriter) Write(p []byte) (int, error) { return 0, errFull }

// outputCommands are command lines of every subcommand that prints to
// standard output.
func outputCommands(dir string) [][]string {
	return [][]string{
		{"help"},
		{"version"},
		{"point", "--alt", "11km", "--mach", "0.8"},
		{"point", "--alt", "11km", "--mach", "0.8", "--json"},
		{"check", filepath.Join("..", "..", "testdata", "facilities.toml")},
		{"check", filepath.Join("..", "..", "testdata", "bad", "zero_width.toml")},
		{"dump"},
		{"dump", "-o", "-"},
		{"export"},
		{"export", "--format", "json", "-o", "-"},
		{"coverage"},
		{"coverage", "--format", "csv"},
		{"coverage", "--format", "json"},
		{"runs"},
		{"runs", "--format", "csv"},
		{"runs", "--format", "json", "-o", "-"},
		{"plot", "--chart", "map", "--format", "svg", "-o", "-"},
		{"plot", "-o", filepath.Join(dir, "p.svg")}, // "wrote …" lines
		{"report", "-o", "-"},
	}
}

// TestEveryCommandReportsFailedWrite: when standard output fails, every
// command says so on standard error and exits non-zero.
func TestEveryCommandReportsFailedWrite(t *testing.T) {
	for _, args := range outputCommands(t.TempDir()) {
		var errb bytes.Buffer
		code := run(args, strings.NewReader(""), fullWriter{}, &errb)
		if code == 0 || !strings.Contains(errb.String(), errFull.Error()) {
			t.Errorf("%s with a failing standard output: exit %d, stderr %q; want non-zero and the write error",
				strings.Join(args, " "), code, errb.String())
		}
	}
}

// TestDevFull runs the built command with standard output on /dev/full,
// a device whose writes fail, as a user's shell would.
func TestDevFull(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command; skipped in -short mode")
	}
	full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
	if err != nil {
		t.Skip("no /dev/full on this system")
	}
	defer full.Close()
	bin := buildLikewind(t)
	for _, args := range outputCommands(t.TempDir()) {
		cmd := exec.Command(bin, args...)
		cmd.Dir = "."
		cmd.Stdout = full
		var errb bytes.Buffer
		cmd.Stderr = &errb
		err := cmd.Run()
		var ee *exec.ExitError
		if !errors.As(err, &ee) || ee.ExitCode() == 0 || !strings.Contains(errb.String(), "no space left on device") {
			t.Errorf("likewind %s >/dev/full: %v, stderr %q; want a non-zero exit and the write error", strings.Join(args, " "), err, errb.String())
		}
	}
}

// TestDashMeansStandardOutput: -o - writes to standard output, exactly
// what no -o writes.
func TestDashMeansStandardOutput(t *testing.T) {
	for _, args := range [][]string{
		{"dump", "--plain", "--date", "2025-01-01"},
		{"export"},
		{"coverage", "--format", "csv"},
		{"runs", "--date", "2025-01-01"},
		{"report", "--date", "2025-01-01"},
	} {
		code, want, errs := outCmd(args...)
		if code != 0 {
			t.Fatalf("%v: exit %d: %s", args, code, errs)
		}
		code, got, errs := outCmd(append(args, "-o", "-")...)
		if code != 0 || got != want {
			t.Errorf("%v -o -: exit %d (%s), output differs from standard output without -o", args, code, errs)
		}
		if _, err := os.Stat("-"); err == nil {
			t.Fatalf("%v -o - wrote a file named -", args)
		}
	}
	code, out, errs := outCmd("plot", "--chart", "re-mach", "--format", "svg", "-o", "-")
	if code != 0 || !strings.HasPrefix(out, "<?xml") {
		t.Errorf("plot -o - --format svg: exit %d (%s), output starts %.20q; want an SVG", code, errs, out)
	}
	for _, args := range [][]string{
		{"plot", "-o", "-"},                                          // no format
		{"plot", "-o", "-", "--format", "svg"},                       // two pictures
		{"plot", "-o", "x.png", "--format", "svg", "--chart", "map"}, // disagreeing format
		{"plot", "-o", "-", "--format", "gif", "--chart", "map"},
	} {
		if code, _, errs := outCmd(args...); code != 2 || errs == "" {
			t.Errorf("%v: exit %d, stderr %q; want a usage error (2)", args, code, errs)
		}
	}
}

// TestOutputsOnlyOverRegularFiles: -o onto a symbolic link, a folder or
// a device is refused, with --force too, and nothing is replaced.
func TestOutputsOnlyOverRegularFiles(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "target.csv")
	if err := os.WriteFile(target, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.csv")
	if err := os.Symlink(target, link); err != nil {
		t.Fatal(err)
	}
	folder := filepath.Join(dir, "folder.svg")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	for _, args := range [][]string{
		{"export", "-o", link, "--force"},
		{"dump", "-o", link, "--force"},
		{"coverage", "-o", link},
		{"runs", "-o", link, "--force"},
		{"report", "-o", link, "--force"},
		{"report", "-o", "/dev/null", "--force"},
		{"plot", "--chart", "map", "-o", folder, "--force"},
		{"export", "-o", "/dev/null", "--force"},
	} {
		code, _, errs := outCmd(args...)
		if code != 1 || !strings.Contains(errs, "outputs are written only over regular files, even with --force") {
			t.Errorf("%v: exit %d, stderr %q; want 1 and the regular-files message", args, code, errs)
		}
	}
	if fi, err := os.Lstat(link); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced")
	}
	if b, _ := os.ReadFile(target); string(b) != "keep" {
		t.Errorf("the link's target now holds %q", b)
	}
	if fi, err := os.Stat("/dev/null"); err != nil || fi.Mode()&os.ModeDevice == 0 {
		t.Errorf("/dev/null is no longer a device: %v %v", fi.Mode(), err)
	}
}

// TestPlotBothOrNeither: when the second picture cannot be written, the
// first is not left behind (and an old first picture is kept).
func TestPlotBothOrNeither(t *testing.T) {
	dir := t.TempDir()
	base := filepath.Join(dir, "pair.svg")
	mapPath, remach := filepath.Join(dir, "pair-map.svg"), filepath.Join(dir, "pair-remach.svg")
	if err := os.Mkdir(remach, 0o755); err != nil {
		t.Fatal(err)
	}
	code, _, errs := outCmd("plot", "-o", base, "--force")
	if code != 1 || !strings.Contains(errs, "pair-remach.svg") {
		t.Errorf("plot with the second target a folder: exit %d, stderr %q; want 1 naming it", code, errs)
	}
	if _, err := os.Lstat(mapPath); err == nil {
		t.Errorf("the map picture was written although the second picture could not be")
	}
	// An old map picture survives a failed pair.
	if err := os.WriteFile(mapPath, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, _ := outCmd("plot", "-o", base, "--force"); code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	if b, _ := os.ReadFile(mapPath); string(b) != "old" {
		t.Errorf("old map picture now holds %.20q, want it kept", b)
	}
}
