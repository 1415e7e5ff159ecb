package main

import (
	"fmt"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// badFiles lists testdata/bad, each file holding one fault (many_faults.toml
// several).
func badFiles(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join("..", "..", "testdata", "bad", "*.toml"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 30 {
		t.Fatalf("testdata/bad holds %d files, want at least 30", len(files))
	}
	return files
}

// checkLine is one reported problem: FILE[:LINE]: ... found|missing ...
var checkLine = regexp.MustCompile(`^(.+?\.toml)(:\d+)?: (.*)$`)

// TestCheckEveryBadFile runs `likewind check` on the whole bad-input folder
// at once: exit status 1, every file named, every problem on a line of its
// own in the documented form, and the count in the summary.
func TestCheckEveryBadFile(t *testing.T) {
	files := badFiles(t)
	code, out, errs := runCmd(append([]string{"check"}, files...)...)
	if code != 1 {
		t.Errorf("check on testdata/bad exit = %d, want 1; stderr: %s", code, errs)
	}
	lines := strings.Split(strings.TrimRight(out, "\n"), "\n")
	if len(lines) < 2 {
		t.Fatalf("check output has %d lines:\n%s", len(lines), out)
	}
	summary := lines[len(lines)-1]
	problems := lines[:len(lines)-1]
	if want := fmt.Sprintf("%d problem(s) in %d file(s) checked", len(problems), len(files)); summary != want {
		t.Errorf("summary %q, want %q", summary, want)
	}
	named := map[string]int{}
	for _, l := range problems {
		m := checkLine.FindStringSubmatch(l)
		if m == nil {
			t.Errorf("problem line %q is not FILE[:LINE]: ...", l)
			continue
		}
		if !strings.Contains(m[3], "found ") && !strings.Contains(m[3], "missing") {
			t.Errorf("problem line %q says neither what was found nor what is missing", l)
		}
		if !strings.Contains(m[3], ", expected ") {
			t.Errorf("problem line %q does not say what was expected", l)
		}
		named[m[1]]++
	}
	for _, f := range files {
		if named[f] == 0 {
			t.Errorf("check output never names %s:\n%s", f, out)
		}
	}
	// The one file with several faults reports each of them.
	if n := named[filepath.Join("..", "..", "testdata", "bad", "many_faults.toml")]; n < 2 {
		t.Errorf("many_faults.toml reported %d time(s), want every fault", n)
	}
}

// TestCheckEachBadFileAlone: each bad file on its own also fails with
// status 1 and is named, so no fault depends on another file.
func TestCheckEachBadFileAlone(t *testing.T) {
	for _, f := range badFiles(t) {
		code, out, _ := runCmd("check", f)
		if code != 1 || !strings.HasPrefix(out, f) {
			t.Errorf("check %s: exit %d, output %q; want 1 and the file named first", filepath.Base(f), code, out)
		}
	}
}

// TestCheckGoodFiles: the example files pass, and a bad file among good
// ones is still found.
func TestCheckGoodFiles(t *testing.T) {
	good, err := filepath.Glob(filepath.Join("..", "..", "testdata", "*.toml"))
	if err != nil || len(good) < 3 {
		t.Fatalf("example files %v: %v", good, err)
	}
	code, out, _ := runCmd(append([]string{"check"}, good...)...)
	if want := fmt.Sprintf("%d file(s) checked, no problems\n", len(good)); code != 0 || out != want {
		t.Errorf("check on the examples: exit %d, output %q; want 0 and %q", code, out, want)
	}
	bad := filepath.Join("..", "..", "testdata", "bad", "nan.toml")
	code, out, _ = runCmd(append([]string{"check"}, append(good, bad)...)...)
	if code != 1 || !strings.Contains(out, bad+":") || !strings.Contains(out, fmt.Sprintf("1 problem(s) in %d file(s)", len(good)+1)) {
		t.Errorf("check on the examples and nan.toml: exit %d, output %q", code, out)
	}
	if code, _, errs := runCmd("check"); code != 2 || !strings.Contains(errs, "give one or more") {
		t.Errorf("check with no files: exit %d, stderr %q; want 2 and a usage message", code, errs)
	}
	missing := filepath.Join(t.TempDir(), "absent.toml")
	if code, out, _ := runCmd("check", missing); code != 1 || !strings.Contains(out, missing) {
		t.Errorf("check on a missing file: exit %d, output %q; want 1 naming it", code, out)
	}
}
