package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Speed target (issue 14): `likewind plot` of a 1000×1000 grid, the whole
// command (load the files, the grid, the six demo facilities' solves, both
// pictures rendered and written), under 0.6 s. The benchmark runs runPlot
// in the process on a copy of the demo vehicle with its grid set to
// 1000×1000 and the demo facilities, writing both PNG pictures over the
// last ones (--force); one op is one command.
//
//	go test ./cmd/likewind/ -run '^$' -bench PlotCommand1000 -benchtime 10x
func BenchmarkPlotCommand1000(b *testing.B) {
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", "corvane-sx3.toml"))
	if err != nil {
		b.Fatal(err)
	}
	text := gridRe.ReplaceAllString(string(src), "count = 1000")
	if strings.Count(text, "count = 1000") != 2 {
		b.Fatal("corvane-sx3.toml: the grid is not two axes with a step or count each")
	}
	dir := b.TempDir()
	vehicle := filepath.Join(dir, "v.toml")
	if err := os.WriteFile(vehicle, []byte(text), 0o600); err != nil {
		b.Fatal(err)
	}
	facs := filepath.Join("..", "..", "testdata", "facilities.toml")
	out := filepath.Join(dir, "out.png")
	for b.Loop() {
		var stdout, stderr bytes.Buffer
		if code := runPlot([]string{vehicle, facs, "-o", out, "--force"}, &stdout, &stderr); code != 0 {
			b.Fatalf("plot exit %d: %s", code, stderr.String())
		}
	}
	b.ReportMetric(float64(b.Elapsed().Microseconds())/1e3/float64(b.N), "ms/op")
	for _, name := range []string{"out-map.png", "out-remach.png"} {
		st, err := os.Stat(filepath.Join(dir, name))
		if err != nil {
			b.Fatal(err)
		}
		if st.Size() >= 1<<20 {
			b.Errorf("%s: %d bytes, want under 1 MB", name, st.Size())
		}
	}
}
