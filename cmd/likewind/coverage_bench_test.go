package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"syscall"
	"testing"

	"likewind/envelope"
)

// Memory target (issue 14): the coverage report of the demo vehicle on a
// 1000×1000 grid with the six demo facilities stays under 400 MB at its
// peak (the process's maximum resident set, measured by the kernel). The
// benchmark runs the built command on a copy of the demo vehicle with its
// grid set to 1000×1000 and reports the peak (peak-MB) and the peak per
// grid point (peak-B/point), beside what the evaluation keeps per point
// (stored-B/point: the grid and the six maps). "two" is the comparison of
// both demo vehicles, each on 1000×1000.
//
//	go test ./cmd/likewind/ -run '^$' -bench CoverageMemory -benchtime 3x

// gridRe matches a grid axis table's step or count line.
var gridRe = regexp.MustCompile(`(?m)^(step|count) = .*$`)

func BenchmarkCoverageMemory1000(b *testing.B) {
	bin := filepath.Join(b.TempDir(), "likewind")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		b.Fatalf("go build: %v\n%s", err, out)
	}
	dir := b.TempDir()
	grid1000 := func(name string) string {
		src, err := os.ReadFile(filepath.Join("..", "..", "testdata", name))
		if err != nil {
			b.Fatal(err)
		}
		text := gridRe.ReplaceAllString(string(src), "count = 1000")
		if strings.Count(text, "count = 1000") != 2 {
			b.Fatalf("%s: the grid is not two axes with a step or count each", name)
		}
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, []byte(text), 0o600); err != nil {
			b.Fatal(err)
		}
		return path
	}
	corvane, halcyra := grid1000("corvane-sx3.toml"), grid1000("halcyra-ha1.toml")
	facs := filepath.Join("..", "..", "testdata", "facilities.toml")
	for _, c := range []struct {
		name  string
		files []string
	}{{"one", []string{corvane}}, {"two", []string{corvane, halcyra}}} {
		b.Run(c.name, func(b *testing.B) {
			points := 1000 * 1000 * len(c.files)
			stored := 0
			for _, path := range c.files {
				v, err := envelope.LoadVehicle(path)
				if err != nil {
					b.Fatal(err)
				}
				fs, err := envelope.LoadFacilities(facs)
				if err != nil {
					b.Fatal(err)
				}
				e, err := envelope.Evaluate(v, fs, envelope.DefaultSettings(v))
				if err != nil {
					b.Fatal(err)
				}
				stored += e.Grid.StoredBytes()
				for _, m := range e.Solved() {
					stored += m.StoredBytes()
				}
			}
			var peak int64
			for b.Loop() {
				cmd := exec.Command(bin, append(append([]string{"coverage"}, c.files...), facs)...)
				if out, err := cmd.CombinedOutput(); err != nil {
					b.Fatalf("coverage: %v\n%s", err, out)
				}
				if ru, ok := cmd.ProcessState.SysUsage().(*syscall.Rusage); ok {
					peak = max(peak, ru.Maxrss*1024) // kB on Linux
				}
			}
			if peak == 0 {
				b.Skip("no resource usage from the kernel")
			}
			b.ReportMetric(float64(peak)/1e6, "peak-MB")
			b.ReportMetric(float64(peak)/float64(points), "peak-B/point")
			b.ReportMetric(float64(stored)/float64(points), "stored-B/point")
		})
	}
}
