package main

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope/report"
)

func TestPlotBothPNG(t *testing.T) {
	dir := t.TempDir()
	code, out, errs := outCmd("plot", "-o", filepath.Join(dir, "corvane.png"))
	if code != 0 {
		t.Fatalf("plot exit %d: %s", code, errs)
	}
	for _, name := range []string{"corvane-map.png", "corvane-remach.png"} {
		p := filepath.Join(dir, name)
		if !strings.Contains(out, p) {
			t.Errorf("output %q does not name %s", out, p)
		}
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(bytes.NewReader(b))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		want := int(report.ChartWidth.Dots(report.ChartDPI) + 0.5)
		if img.Bounds().Dx() != want || img.Bounds().Dy() <= int(report.ChartHeight.Dots(report.ChartDPI)) {
			t.Errorf("%s is %v, want %d px wide and taller than the plot area", name, img.Bounds().Size(), want)
		}
	}
}

func TestPlotSVGAndRefusal(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "map.svg")
	if code, _, errs := outCmd("plot", "--chart", "map", "--facility", "Skerrow", "--customary", "-o", p); code != 0 {
		t.Fatalf("plot exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(b))
	n := 0
	for {
		_, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		n++
	}
	if n < 10 {
		t.Errorf("SVG has %d tokens, want a drawing", n)
	}
	// With both charts, one existing target stops everything: the other
	// is not written either.
	base := filepath.Join(dir, "pair.png")
	if err := os.WriteFile(filepath.Join(dir, "pair-remach.png"), []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := outCmd("plot", "-o", base); code != 1 || !strings.Contains(errs, "--force") {
		t.Errorf("plot over an existing file: exit %d, stderr %q; want 1", code, errs)
	}
	if exists(filepath.Join(dir, "pair-map.png")) {
		t.Error("pair-map.png written although pair-remach.png was refused")
	}
	if code, _, errs := outCmd("plot", "-o", base, "--force"); code != 0 {
		t.Errorf("plot --force: exit %d: %s", code, errs)
	}
	// Parent is a file: fails cleanly.
	bad := filepath.Join(p, "x.png")
	if code, _, errs := outCmd("plot", "--chart", "re-mach", "-o", bad); code != 1 || !strings.Contains(errs, bad) {
		t.Errorf("plot into a file's child: exit %d, stderr %q", code, errs)
	}
}
