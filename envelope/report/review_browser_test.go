package report

import (
	"bytes"
	"context"
	"image"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"golang.org/x/net/html"
	"golang.org/x/net/html/atom"

	"likewind/envelope"
)

// browser finds a Chromium to render the page with, or skips the test.
func browser(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("runs a browser; skipped in -short mode")
	}
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	t.Skip("no chromium on this machine (apt-get install chromium); the browser test skips")
	return ""
}

// runBrowser runs the headless browser with args on the page and returns
// what it printed on standard output.
func runBrowser(t *testing.T, bin, dir, page string, args ...string) []byte {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	all := append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--hide-scrollbars", "--no-first-run",
		"--user-data-dir=" + filepath.Join(dir, "profile")}, args...)
	cmd := exec.CommandContext(ctx, bin, append(all, "file://"+page)...)
	cmd.Env = append(os.Environ(), "HOME="+dir)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("%s %s: %v\n%s", bin, strings.Join(args, " "), err, errb.String())
	}
	return out.Bytes()
}

// TestReviewInBrowser renders the demo's page in a headless Chromium: the
// screenshot is not blank and shows the class colours of the maps, and
// the page the browser built holds every section and run table.
func TestReviewInBrowser(t *testing.T) {
	bin := browser(t)
	e := outDemoEval(t)
	r, err := NewReview(ReviewInput{Info: ExportInfo{Tool: "likewind", Version: "test", Generated: "2025-01-01"}, Eval: e})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := r.WriteHTML(&b); err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	page := filepath.Join(dir, "review.html")
	if err := os.WriteFile(page, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}

	shot := filepath.Join(dir, "review.png")
	runBrowser(t, bin, dir, page, "--screenshot="+shot, "--window-size=1200,2600")
	f, err := os.Open(shot)
	if err != nil {
		t.Fatalf("no screenshot: %v", err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("screenshot is not a PNG: %v", err)
	}
	ink, class := outInk(img, envelope.NoMatch)
	total := img.Bounds().Dx() * img.Bounds().Dy()
	t.Logf("screenshot %v: %.1f %% of pixels not white, %d in the out-of-reach colour", img.Bounds().Size(), 100*float64(ink)/float64(total), class)
	// The top 2600 px hold the caution, the settings and coverage tables
	// and the first facility's map, mostly out of reach at the demo's
	// scale: text and rules ink a few per cent, the map tens of
	// thousands of pixels.
	if float64(ink) < 0.02*float64(total) {
		t.Errorf("the page renders nearly blank: %d of %d pixels not white", ink, total)
	}
	if class < 5000 {
		t.Errorf("only %d pixels in the out-of-reach colour: the first map did not draw", class)
	}

	dom := runBrowser(t, bin, dir, page, "--dump-dom")
	doc, err := html.Parse(bytes.NewReader(dom))
	if err != nil {
		t.Fatalf("the browser's DOM does not parse: %v", err)
	}
	text := htmlText(doc)
	for _, want := range []string{"Planning caution", "Coverage of the facilities", "Run lists", "Time, cost and campaign summary", "Cautions raised"} {
		if !strings.Contains(text, want) {
			t.Errorf("the rendered page lacks %q", want)
		}
	}
	runs := map[string]int{}
	for _, tb := range htmlFind(doc, func(n *html.Node) bool { return n.DataAtom == atom.Table && htmlAttr(n, "class") == "runs" }) {
		runs[htmlAttr(tb, "data-facility")] = len(htmlRows(tb))
	}
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		if got := runs[strconv.Itoa(k+1)]; got != len(rl.Runs) {
			t.Errorf("%s: the rendered run table has %d rows, want %d", m.Facility.Name, got, len(rl.Runs))
		}
	}
}

// outInk counts the pixels of img that are not white, and those within a
// few levels of the colour of class c.
func outInk(img image.Image, c envelope.Class) (ink, class int) {
	cr, cg, cb := c.RGB()
	near := func(a uint32, b uint8) bool {
		d := int(a>>8) - int(b)
		return d > -12 && d < 12
	}
	bd := img.Bounds()
	for y := bd.Min.Y; y < bd.Max.Y; y++ {
		for x := bd.Min.X; x < bd.Max.X; x++ {
			r, g, b, _ := img.At(x, y).RGBA()
			if r>>8 < 245 || g>>8 < 245 || b>>8 < 245 {
				ink++
			}
			if near(r, cr) && near(g, cg) && near(b, cb) {
				class++
			}
		}
	}
	return ink, class
}
