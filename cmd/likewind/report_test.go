package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"golang.org/x/net/html"

	"likewind/envelope/whatif"
)

// outReportPage runs likewind report with args and parses the page it
// printed.
func outReportPage(t *testing.T, args ...string) (*html.Node, string) {
	t.Helper()
	code, out, errs := outCmd(append([]string{"report", "--date", "2025-01-01"}, args...)...)
	if code != 0 {
		t.Fatalf("report %v: exit %d: %s", args, code, errs)
	}
	doc, err := html.Parse(strings.NewReader(out))
	if err != nil {
		t.Fatalf("report %v: the page does not parse: %v", args, err)
	}
	return doc, out
}

// pageText is the text of the page, white space made single spaces.
func pageText(n *html.Node) string {
	var b strings.Builder
	var walk func(*html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.TextNode {
			b.WriteString(n.Data + " ")
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(n)
	return strings.Join(strings.Fields(b.String()), " ")
}

func TestReportWritesPage(t *testing.T) {
	doc, out := outReportPage(t)
	if !strings.HasPrefix(out, "<!DOCTYPE html>") {
		t.Errorf("the page starts %.30q", out)
	}
	text := pageText(doc)
	for _, want := range []string{"Review pack: Corvane SX-3", "Planning caution", "likewind " + version + " review pack, 2025-01-01",
		"built-in demo data", "Run lists", "Cautions raised",
		// The demo facilities carry invented campaign data: the time and
		// cost columns and summary are fed from it.
		"run time min", "total h", "blow s", "campaign time", "shifts (8 h)", "occupancy cost", "coolant", "facility order saves"} {
		if !strings.Contains(text, want) {
			t.Errorf("the page lacks %q", want)
		}
	}
	if strings.Contains(text, "No time or cost data for this facility") {
		t.Error("the demo page says a facility has no time or cost data; every demo facility has some")
	}
	// Facilities without campaign data: the page says so.
	doc, _ = outReportPage(t, "../../testdata/corvane-sx3.toml", "../../testdata/examples/rules-facilities.toml")
	if text := pageText(doc); !strings.Contains(text, "No time or cost data for this facility") || strings.Contains(text, "campaign time") {
		t.Error("a page of facilities without campaign data lacks the no-data words, or shows a campaign time")
	}
	// --shift sets the shift length the summary counts in; a bad one is
	// a usage error.
	doc, _ = outReportPage(t, "--shift", "12 h")
	if !strings.Contains(pageText(doc), "shifts (12 h)") {
		t.Error("report --shift 12 h: the page lacks \"shifts (12 h)\"")
	}
	for _, bad := range []string{"0 h", "25 h", "8", "8 kg"} {
		if code, _, errs := outCmd("report", "--shift", bad); code != 2 || !strings.Contains(errs, "--shift") {
			t.Errorf("report --shift %q: exit %d, %q; want a usage error naming --shift", bad, code, errs)
		}
	}
	dir := t.TempDir()
	p := filepath.Join(dir, "review.html")
	if code, _, errs := outCmd("report", "--date", "2025-01-01", "-o", p); code != 0 {
		t.Fatalf("report -o: exit %d: %s", code, errs)
	}
	if b, err := os.ReadFile(p); err != nil || string(b) != out {
		t.Errorf("report -o FILE wrote other content than standard output (%v)", err)
	}
	if code, _, errs := outCmd("report", "-o", p); code != 1 || !strings.Contains(errs, "--force") {
		t.Errorf("report over an existing file: exit %d, %q; want 1 and the --force hint", code, errs)
	}
	if code, _, errs := outCmd("report", "-o", p, "--force"); code != 0 {
		t.Errorf("report --force: exit %d: %s", code, errs)
	}
	if code, _, errs := outCmd("report", "--format", "pdf"); code != 2 || errs == "" {
		t.Errorf("report --format: exit %d, %q; want a usage error", code, errs)
	}
}

// TestReportSession: the session's what-if values and marks make the
// page, and say so.
func TestReportSession(t *testing.T) {
	e := outDemoEval(t)
	g := e.Grid
	var marks [][2]int
	for i := 0; i < g.Rows() && len(marks) < 3; i += 8 {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				marks = append(marks, [2]int{i, j})
				break
			}
		}
	}
	sess := outDemoSession(t, marks, whatif.Changes{Values: map[string]float64{"scale": 0.04}}, "")
	doc, _ := outReportPage(t, "--session", sess)
	text := pageText(doc)
	for _, want := range []string{"Session applied: " + sess, "model scale 0.04 for every facility", "the 3 points marked in the session"} {
		if !strings.Contains(text, want) {
			t.Errorf("the page lacks %q", want)
		}
	}
	if code, _, errs := outCmd("report", "--session", filepath.Join("..", "..", "testdata", "facilities.toml")); code != 1 || errs == "" {
		t.Errorf("report with a facility file as session: exit %d, %q; want it refused", code, errs)
	}
}

func TestReportCustomary(t *testing.T) {
	doc, _ := outReportPage(t, "--customary")
	text := pageText(doc)
	for _, want := range []string{"altitude ft", "T0 °F", "p0 psi", "flight q psf"} {
		if !strings.Contains(text, want) {
			t.Errorf("--customary page lacks %q", want)
		}
	}
}
