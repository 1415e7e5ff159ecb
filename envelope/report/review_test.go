package report

import (
	"bytes"
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"golang.org/x/net/html"
	"golang.org/x/net/html/atom"

	"likewind/envelope"
	"likewind/envelope/units"
)

// outReviewPage writes the review pack of e and parses it.
func outReviewPage(t *testing.T, in ReviewInput) (*html.Node, string) {
	t.Helper()
	if in.Info.Tool == "" {
		in.Info = ExportInfo{Tool: "likewind", Version: "test", Generated: "2025-01-01"}
	}
	r, err := NewReview(in)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := r.WriteHTML(&b); err != nil {
		t.Fatal(err)
	}
	doc, err := html.Parse(bytes.NewReader(b.Bytes()))
	if err != nil {
		t.Fatalf("the page does not parse as HTML: %v", err)
	}
	return doc, b.String()
}

// htmlFind returns the elements under n for which ok is true, in document
// order.
func htmlFind(n *html.Node, ok func(*html.Node) bool) []*html.Node {
	var out []*html.Node
	var walk func(*html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.ElementNode && ok(n) {
			out = append(out, n)
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(n)
	return out
}

func htmlTag(a atom.Atom) func(*html.Node) bool {
	return func(n *html.Node) bool { return n.DataAtom == a }
}

func htmlAttr(n *html.Node, key string) string {
	for _, a := range n.Attr {
		if a.Key == key {
			return a.Val
		}
	}
	return ""
}

// htmlByID is the element with id, or nil.
func htmlByID(n *html.Node, id string) *html.Node {
	got := htmlFind(n, func(n *html.Node) bool { return htmlAttr(n, "id") == id })
	if len(got) == 0 {
		return nil
	}
	return got[0]
}

// htmlText is the text under n, with runs of white space made one space.
func htmlText(n *html.Node) string {
	var b strings.Builder
	var walk func(*html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.TextNode {
			b.WriteString(n.Data)
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(n)
	return strings.Join(strings.Fields(b.String()), " ")
}

// htmlRows are the text cells of each body row of a table.
func htmlRows(table *html.Node) [][]string {
	var out [][]string
	for _, tb := range htmlFind(table, htmlTag(atom.Tbody)) {
		for _, tr := range htmlFind(tb, htmlTag(atom.Tr)) {
			var cells []string
			for _, td := range htmlFind(tr, func(n *html.Node) bool { return n.DataAtom == atom.Td || n.DataAtom == atom.Th }) {
				cells = append(cells, htmlText(td))
			}
			out = append(out, cells)
		}
	}
	return out
}

// htmlHead are the column heads of a table.
func htmlHead(table *html.Node) []string {
	var out []string
	for _, th := range htmlFind(table, htmlTag(atom.Thead)) {
		for _, c := range htmlFind(th, htmlTag(atom.Th)) {
			out = append(out, htmlText(c))
		}
	}
	return out
}

// htmlPairs are the label and value rows of the key–value tables under
// n (class kv), by label.
func htmlPairs(n *html.Node) map[string]string {
	out := map[string]string{}
	for _, tb := range htmlFind(n, func(n *html.Node) bool {
		return n.DataAtom == atom.Table && strings.Contains(htmlAttr(n, "class"), "kv")
	}) {
		for _, row := range htmlRows(tb) {
			if len(row) == 2 {
				out[row[0]] = row[1]
			}
		}
	}
	return out
}

// firstTable is the first table under n.
func firstTable(t *testing.T, n *html.Node, what string) *html.Node {
	t.Helper()
	if n == nil {
		t.Fatalf("%s: no such section", what)
	}
	tabs := htmlFind(n, htmlTag(atom.Table))
	if len(tabs) == 0 {
		t.Fatalf("%s: no table", what)
	}
	return tabs[0]
}

// TestReviewSections: the page has the job and the caution first, then
// every section, a heading for each facility, and no script or outside
// resource.
func TestReviewSections(t *testing.T) {
	e := outDemoEval(t)
	doc, page := outReviewPage(t, ReviewInput{Eval: e})
	h1 := htmlFind(doc, htmlTag(atom.H1))
	if len(h1) != 1 || htmlText(h1[0]) != "Review pack: "+e.Grid.Vehicle.Name {
		t.Fatalf("h1 = %v, want one naming the vehicle", h1)
	}
	var h2 []string
	for _, n := range htmlFind(doc, htmlTag(atom.H2)) {
		h2 = append(h2, htmlText(n))
	}
	want := []string{"Planning caution", "The job", "Contents", "Vehicle, grid, day and what-if settings", "Coverage of the facilities"}
	for k, f := range e.Facilities {
		want = append(want, fmt.Sprintf("%d. %s", k+1, f.Name))
	}
	want = append(want, "Reynolds number against Mach number", "Run lists", "Time, cost and campaign summary", "Cautions raised")
	if strings.Join(h2, " | ") != strings.Join(want, " | ") {
		t.Errorf("sections:\n%s\nwant\n%s", strings.Join(h2, " | "), strings.Join(want, " | "))
	}
	caution := htmlText(htmlByID(doc, "caution"))
	if !strings.Contains(caution, envelope.SafetyNote) || !strings.Contains(caution, envelope.PlanningNote) {
		t.Errorf("the caution at the top lacks the safety and planning notes: %q", caution)
	}
	for _, n := range htmlFind(doc, func(n *html.Node) bool {
		return n.DataAtom == atom.Script || n.DataAtom == atom.Link || n.DataAtom == atom.Img || n.DataAtom == atom.Iframe
	}) {
		t.Errorf("the page holds a <%s>: it must need no script and no outside resource", n.Data)
	}
	for _, a := range htmlFind(doc, htmlTag(atom.A)) {
		if h := htmlAttr(a, "href"); !strings.HasPrefix(h, "#") {
			t.Errorf("link %q leaves the page", h)
		}
	}
	if strings.Contains(page, "http://") && !strings.Contains(page, `xmlns="http://www.w3.org/2000/svg"`) {
		t.Errorf("the page names an outside address")
	}
	// One picture per evaluated facility and the Reynolds–Mach chart,
	// each an inline SVG in a figure.
	figs := 0
	for _, f := range htmlFind(doc, htmlTag(atom.Figure)) {
		if len(htmlFind(f, func(n *html.Node) bool { return n.Data == "svg" })) > 0 {
			figs++
		}
	}
	if want := len(e.Solved()) + 1; figs != want {
		t.Errorf("%d figures with an SVG, want %d", figs, want)
	}
}

// TestReviewPrintStyles: the page prints clean: print rules with page
// breaks and repeated table heads, and no dark background anywhere.
func TestReviewPrintStyles(t *testing.T) {
	doc, _ := outReviewPage(t, ReviewInput{Eval: outDemoEval(t)})
	styles := htmlFind(doc, htmlTag(atom.Style))
	if len(styles) != 1 {
		t.Fatalf("%d style elements, want 1", len(styles))
	}
	css := htmlText(styles[0])
	for _, rule := range []string{"@media print", "break-before: page", "break-inside: avoid", "thead { display: table-header-group; }", "@page"} {
		if !strings.Contains(css, rule) {
			t.Errorf("the style lacks %q", rule)
		}
	}
	// Every background is light: relative luminance (sRGB weights, ITU-R
	// BT.709) above 0.85.
	bg := regexp.MustCompile(`background(?:-color)?:\s*([^;}]+)`)
	hex := regexp.MustCompile(`^#([0-9a-fA-F]{6}|[0-9a-fA-F]{3})$`)
	for _, m := range bg.FindAllStringSubmatch(css, -1) {
		v := strings.TrimSpace(m[1])
		h := hex.FindStringSubmatch(v)
		if h == nil {
			t.Errorf("background %q is not a plain colour the test can judge", v)
			continue
		}
		s := h[1]
		if len(s) == 3 {
			s = string([]byte{s[0], s[0], s[1], s[1], s[2], s[2]})
		}
		x, _ := strconv.ParseUint(s, 16, 32)
		r, g, b := float64(x>>16&0xff)/255, float64(x>>8&0xff)/255, float64(x&0xff)/255
		if l := 0.2126*r + 0.7152*g + 0.0722*b; l < 0.85 {
			t.Errorf("background %s is dark (luminance %.2f)", v, l)
		}
	}
}

// TestReviewCoverageValues: the coverage table and each facility's shares
// agree with the coverage report and with the classes counted here from
// the maps.
func TestReviewCoverageValues(t *testing.T) {
	e := outDemoEval(t)
	doc, _ := outReviewPage(t, ReviewInput{Eval: e})
	cov := NewCoverage(e)
	rows := htmlRows(firstTable(t, htmlByID(doc, "coverage"), "coverage"))
	if len(rows) != len(cov.Facilities)+1 {
		t.Fatalf("coverage table has %d rows, want %d facilities and best of all", len(rows), len(cov.Facilities))
	}
	for k, row := range cov.Facilities {
		got := rows[k]
		minScale, fits := minScaleCells(row)
		want := []string{row.Facility, row.Medium, g3(row.Scale), pct(row.FullMatch), pct(row.ReShort), pct(row.MachRelaxed),
			pct(row.NoMatch), pct(row.Matched), minScale, fits}
		if row.TooLargePoints > 0 {
			want[2] += " (too large)"
		}
		if strings.Join(got[:len(want)], "|") != strings.Join(want, "|") {
			t.Errorf("coverage row %d:\n%v\nwant\n%v", k, got, want)
		}
	}
	if last := rows[len(rows)-1]; last[0] != "best of all" || last[7] != pct(cov.Best.Matched) {
		t.Errorf("last row %v, want best of all with matched %s", last, pct(cov.Best.Matched))
	}
	g := e.Grid
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		var counts [envelope.NumClasses]int
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if g.Inside(i, j) {
					counts[m.At(i, j).Class]++
				}
			}
		}
		sec := htmlByID(doc, "facility-"+strconv.Itoa(k+1))
		shares := htmlRows(firstTable(t, sec, e.Facilities[k].Name))
		for r, cl := range []envelope.Class{envelope.FullMatch, envelope.ReShort, envelope.MachRelaxed, envelope.NoMatch} {
			want := []string{cl.String(), strconv.Itoa(counts[cl]), pct(float64(counts[cl]) / float64(g.InsideCount()))}
			if strings.Join(shares[r], "|") != strings.Join(want, "|") {
				t.Errorf("%s shares row %d: %v, want %v", e.Facilities[k].Name, r, shares[r], want)
			}
		}
		text := htmlText(sec)
		row := cov.Facilities[k]
		if row.MinScale.Valid() {
			fit := "it does not fit the test section"
			if row.MinScaleFits {
				fit = "it fits the test section"
			}
			if !strings.Contains(text, "Smallest full-match scale: "+g3(row.MinScale)+" gives a full match") || !strings.Contains(text, fit) {
				t.Errorf("%s: the scale paragraph does not give %s and %q:\n%s", row.Facility, g3(row.MinScale), fit, text)
			}
		} else if !strings.Contains(text, "Smallest full-match scale: none") {
			t.Errorf("%s: the scale paragraph does not say there is none", row.Facility)
		}
	}
}

// TestReviewRunTables: each facility's run table lists its run list's
// flight points in order with their run numbers and settings.
func TestReviewRunTables(t *testing.T) {
	e := outDemoEval(t)
	doc, _ := outReviewPage(t, ReviewInput{Eval: e})
	tables := htmlFind(doc, func(n *html.Node) bool { return n.DataAtom == atom.Table && htmlAttr(n, "class") == "runs" })
	byFac := map[string]*html.Node{}
	for _, tb := range tables {
		byFac[htmlAttr(tb, "data-facility")] = tb
	}
	total := 0
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		tb := byFac[strconv.Itoa(k+1)]
		if len(rl.Runs) == 0 {
			if tb != nil {
				t.Errorf("%s: a run table without runs", m.Facility.Name)
			}
			if s := htmlText(htmlByID(doc, "runs-"+strconv.Itoa(k+1))); !strings.Contains(s, "No points to run.") {
				t.Errorf("%s: no runs, but the list does not say so: %q", m.Facility.Name, s)
			}
			continue
		}
		if tb == nil {
			t.Fatalf("%s: no run table", m.Facility.Name)
		}
		head := htmlHead(tb)
		rows := htmlRows(tb)
		if len(rows) != len(rl.Runs) {
			t.Fatalf("%s: %d rows, want %d flight points", m.Facility.Name, len(rows), len(rl.Runs))
		}
		water := m.Facility.Medium == envelope.MediumWater
		col := func(name string) int {
			for c, h := range head {
				if h == name {
					return c
				}
			}
			t.Fatalf("%s: no column %q in %v", m.Facility.Name, name, head)
			return -1
		}
		tcol := col("T0 K")
		if water {
			tcol = col("water T K")
		}
		for r, run := range rl.Runs {
			cells := rows[r]
			again := r > 0 && rl.Runs[r-1].SetPoint == run.SetPoint
			if again {
				if cells[0] != "" || cells[len(cells)-1] != "same run" {
					t.Errorf("%s row %d: a further point of run %d shows %q … %q", m.Facility.Name, r, run.SetPoint, cells[0], cells[len(cells)-1])
				}
				continue
			}
			if cells[0] != strconv.Itoa(run.SetPoint) || cells[tcol] != units.Fixed(run.T0, 1) ||
				cells[col("class")] != run.Class.String() || cells[col("altitude m")] != units.Fixed(run.Altitude, 0) {
				t.Errorf("%s row %d: %v; want run %d, T %.1f, %s at %.0f m", m.Facility.Name, r, cells, run.SetPoint, run.T0, run.Class, run.Altitude)
			}
			if !water && cells[col("test Mach")] != units.Fixed(run.Mach, 3) {
				t.Errorf("%s row %d: test Mach %s, want %.3f", m.Facility.Name, r, cells[col("test Mach")], run.Mach)
			}
		}
		total += len(rows)
	}
	if total == 0 {
		t.Fatal("no run rows at all for the demo")
	}
}

// TestReviewCautions: the cautions list of each facility counts each flag
// over the inside points as counted here, and gives its caution text.
func TestReviewCautions(t *testing.T) {
	e := outDemoEval(t)
	doc, _ := outReviewPage(t, ReviewInput{Eval: e})
	g := e.Grid
	seen := map[string]bool{}
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		sec := htmlByID(doc, "cautions-"+strconv.Itoa(k+1))
		if sec == nil {
			t.Fatalf("%s: no cautions section", m.Facility.Name)
		}
		var items []string
		for _, li := range htmlFind(sec, htmlTag(atom.Li)) {
			items = append(items, htmlText(li))
		}
		find := func(kind string) string {
			for _, it := range items {
				if strings.HasPrefix(it, kind+": ") {
					return it
				}
			}
			return ""
		}
		for _, fl := range cautionFlags {
			n := 0
			for i := 0; i < g.Rows(); i++ {
				for j := 0; j < g.Cols(); j++ {
					if g.Inside(i, j) && m.At(i, j).Flags.Has(fl) {
						n++
					}
				}
			}
			it := find(fl.String())
			switch {
			case n == 0 && it != "":
				t.Errorf("%s: %q listed, no point raises it", m.Facility.Name, it)
			case n > 0 && !strings.HasPrefix(it, fmt.Sprintf("%s: %s", fl.String(), reviewPoints(n))):
				t.Errorf("%s: %s at %d points, listed as %q", m.Facility.Name, fl, n, it)
			case n > 0:
				seen[fl.String()] = true
			}
		}
		n := 0
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if g.Inside(i, j) && m.At(i, j).Limit == envelope.LimitBalanceLoad {
					n++
				}
			}
		}
		if it := find("balance load"); (n > 0) != strings.HasPrefix(it, "balance load: "+reviewPoints(n)) {
			t.Errorf("%s: balance load binds at %d points, listed as %q", m.Facility.Name, n, it)
		} else if n > 0 {
			seen["balance load"] = true
		}
		if len(items) == 0 && !strings.Contains(htmlText(sec), "No caution is raised") {
			t.Errorf("%s: no cautions and no word that there are none", m.Facility.Name)
		}
	}
	// The demo (invented data) raises these; the cryogenic tunnel's
	// caution text is Cautions' own.
	for _, kind := range []string{"cryogenic", "condensation warning", "q near limit", "balance load", "load near balance capacity"} {
		if !seen[kind] {
			t.Errorf("the demo's page lists no %q caution", kind)
		}
	}
	if s := htmlText(htmlByID(doc, "cautions")); !strings.Contains(s, "Cryogenic nitrogen brings cold-burn") {
		t.Errorf("the cryogenic caution text is missing")
	}
}

// TestReviewSessionValues: marks make the run lists, the settings name
// what the session changed, and a what-if scale shows.
func TestReviewSessionValues(t *testing.T) {
	e := outEvalVehicle(t, 0, func(s *envelope.Settings, _ []envelope.Facility) { s.Scale = 0.05 })
	g := e.Grid
	var marks []envelope.GridPoint
	for i := 0; i < g.Rows() && len(marks) < 2; i += 9 {
		for j := 0; j < g.Cols(); j++ {
			if g.Inside(i, j) {
				marks = append(marks, envelope.GridPoint{Row: i, Col: j})
				break
			}
		}
	}
	doc, _ := outReviewPage(t, ReviewInput{Eval: e, Marks: marks, Session: "s.json", Changed: []string{"model scale"}})
	set := htmlPairs(htmlByID(doc, "settings"))
	for label, want := range map[string]string{"model scale": "0.05 for every facility", "changed by the session": "model scale",
		"name": e.Grid.Vehicle.Name, "inside the envelope": reviewPoints(g.InsideCount())} {
		if set[label] != want {
			t.Errorf("settings: %s %q, want %q", label, set[label], want)
		}
	}
	if s := htmlText(htmlByID(doc, "runs")); !strings.Contains(s, "the 2 points marked in the session") {
		t.Errorf("the run lists do not say they hold the marks: %q", s)
	}
	for _, tb := range htmlFind(doc, func(n *html.Node) bool { return n.DataAtom == atom.Table && htmlAttr(n, "class") == "runs" }) {
		if n := len(htmlRows(tb)); n > len(marks) {
			t.Errorf("facility %s: %d run rows for %d marks", htmlAttr(tb, "data-facility"), n, len(marks))
		}
	}
}

// outCost is a cost source for the tests of the time and cost part: it
// gives figures for one facility only, numbering the flight points so the
// test can find each in its row.
type outCost struct{ facility string }

func (c outCost) RunListCost(rl RunList) (FacilityCost, bool) {
	if rl.Facility != c.facility {
		return FacilityCost{}, false
	}
	fc := FacilityCost{Columns: []string{"point time h", "total h"},
		Summary: []CostItem{{"flight points", strconv.Itoa(len(rl.Runs))}, {"<b>label</b>", "value\x1b[2J"}},
		Notes:   []string{"a note"}}
	for k := range rl.Runs {
		fc.Cells = append(fc.Cells, []string{"t" + strconv.Itoa(k), "sum" + strconv.Itoa(k)})
	}
	return fc, true
}

// TestReviewCostSeam: without a cost source every facility says it has no
// time or cost data; with one, that facility's run table gains its
// columns and the campaign its summary, and the others still say so.
func TestReviewCostSeam(t *testing.T) {
	e := outDemoEval(t)
	doc, _ := outReviewPage(t, ReviewInput{Eval: e})
	const none = "No time or cost data for this facility"
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		if s := htmlText(htmlByID(doc, "campaign-"+strconv.Itoa(k+1))); !strings.Contains(s, none) {
			t.Errorf("%s without cost data: %q", m.Facility.Name, s)
		}
	}
	// The facility with the most runs gets figures.
	best, most := -1, 0
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		if n := len(DefaultRunPoints(m)); n > most {
			best, most = k, n
		}
	}
	name := e.Facilities[best].Name
	doc, page := outReviewPage(t, ReviewInput{Eval: e, Cost: outCost{facility: name}})
	for k, m := range e.Maps {
		if m == nil {
			continue
		}
		s := htmlText(htmlByID(doc, "campaign-"+strconv.Itoa(k+1)))
		if k != best {
			if !strings.Contains(s, none) {
				t.Errorf("%s has no cost data: %q", m.Facility.Name, s)
			}
			continue
		}
		if strings.Contains(s, none) {
			t.Errorf("%s has cost data but says it has none", name)
		}
		rl, err := PlanRuns(m, DefaultRunPoints(m))
		if err != nil {
			t.Fatal(err)
		}
		sum := htmlPairs(htmlByID(doc, "campaign-"+strconv.Itoa(k+1)))
		if sum["flight points"] != strconv.Itoa(len(rl.Runs)) || sum["<b>label</b>"] != `value\x1b[2J` || !strings.Contains(s, "a note") {
			t.Errorf("campaign of %s: %v, %q", name, sum, s)
		}
		var tb *html.Node
		for _, n := range htmlFind(doc, func(n *html.Node) bool { return n.DataAtom == atom.Table && htmlAttr(n, "class") == "runs" }) {
			if htmlAttr(n, "data-facility") == strconv.Itoa(k+1) {
				tb = n
			}
		}
		head := htmlHead(tb)
		if got := strings.Join(head[len(head)-2:], "|"); got != "point time h|total h" {
			t.Errorf("run table ends with %q, want the cost columns", got)
		}
		for r, row := range htmlRows(tb) {
			if got := strings.Join(row[len(row)-2:], "|"); got != fmt.Sprintf("t%d|sum%d", r, r) {
				t.Errorf("row %d ends with %q", r, got)
			}
		}
	}
	if strings.Contains(page, "<b>label</b>") || strings.Contains(page, "\x1b") {
		t.Errorf("cost words reach the page unescaped")
	}
	if _, err := NewReview(ReviewInput{Eval: e, Cost: outBadCost{}}); err == nil || !strings.Contains(err.Error(), "rows of time and cost") {
		t.Errorf("a cost source with too few rows: %v, want an error", err)
	}
}

type outBadCost struct{}

func (outBadCost) RunListCost(rl RunList) (FacilityCost, bool) {
	return FacilityCost{Columns: []string{"x"}, Cells: [][]string{}}, len(rl.Runs) > 0
}

// TestReviewHostileNames: names holding markup and control characters
// come out as text, escaped, and the page keeps its structure.
func TestReviewHostileNames(t *testing.T) {
	const name = "<script>alert(1)</script>\x1b]0;x\x07\u202e&amp;"
	const shown = `<script>alert(1)</script>\x1b]0;x\x07\u202e&amp;`
	e := outEvalVehicle(t, 0, func(_ *envelope.Settings, fs []envelope.Facility) {
		fs[0].Name, fs[0].Class = name, name
	})
	e.Grid.Vehicle.Name = name + " vehicle"
	doc, page := outReviewPage(t, ReviewInput{Eval: e, Sources: []string{name + ".toml"}, Session: name})
	if n := len(htmlFind(doc, htmlTag(atom.Script))); n != 0 {
		t.Fatalf("%d script elements from a name", n)
	}
	for _, c := range []string{"\x1b", "\x07", "\u202e"} {
		if strings.Contains(page, c) {
			t.Errorf("the page holds a raw %q", c)
		}
	}
	if got := htmlText(htmlFind(doc, htmlTag(atom.H1))[0]); got != "Review pack: "+shown+" vehicle" {
		t.Errorf("h1 %q, want the name as text", got)
	}
	if got := htmlText(htmlFind(doc, htmlTag(atom.H2))[5]); got != "1. "+shown {
		t.Errorf("first facility heading %q", got)
	}
	if s := htmlText(htmlByID(doc, "job")); !strings.Contains(s, shown+".toml") {
		t.Errorf("the inputs do not show the file name escaped: %q", s)
	}
}

// TestReviewCampaign: the review pack's time and cost part is fed by the
// campaign computation (CampaignSource). Three marked points of distinct
// set points in the transonic tunnel, with invented campaign data of no
// change time: by hand each run takes its one 6-minute data point (6.0
// min), the running totals after the 1-hour model installation are 1.10,
// 1.20 and 1.30 h, one 8-hour shift, and at 1000 EUR/h the occupancy costs
// 1300.00 EUR; with no change time the order saves nothing.
func TestReviewCampaign(t *testing.T) {
	const tunnel = "Harl Cove T2 pressurized transonic tunnel"
	camp := envelope.Campaign{
		OccupancyCost: envelope.Money{Amount: 1000.0 / 3600, Currency: "EUR", Set: true},
		ModelChange:   envelope.Opt{V: 3600, Set: true},
		DataPoint:     envelope.Opt{V: 360, Set: true},
		T0PerKelvin:   envelope.Opt{Set: true}, T0Fixed: envelope.Opt{Set: true},
		P0Change: envelope.Opt{Set: true}, MachChange: envelope.Opt{Set: true},
	}
	e := outEvalVehicle(t, 0, func(_ *envelope.Settings, fs []envelope.Facility) {
		for k := range fs {
			if fs[k].Name == tunnel {
				fs[k].Campaign = camp
			}
		}
	})
	k := e.Facility(tunnel)
	m := e.Maps[k]
	pts := DefaultRunPoints(m)
	marks := []envelope.GridPoint{pts[0], pts[len(pts)/2], pts[len(pts)-1]}
	rl, err := PlanRuns(m, marks)
	if err != nil || rl.SetPoints != 3 {
		t.Fatalf("three marks give %d set points (%v); the test needs 3", rl.SetPoints, err)
	}
	doc, _ := outReviewPage(t, ReviewInput{Eval: e, Marks: marks, Cost: CampaignSource{}})
	var tb *html.Node
	for _, n := range htmlFind(doc, func(n *html.Node) bool { return n.DataAtom == atom.Table && htmlAttr(n, "class") == "runs" }) {
		if htmlAttr(n, "data-facility") == strconv.Itoa(k+1) {
			tb = n
		}
	}
	if tb == nil {
		t.Fatal("no run table of the transonic tunnel")
	}
	head := htmlHead(tb)
	if got := strings.Join(head[len(head)-2:], "|"); got != ColRunTime+"|"+ColTotal {
		t.Errorf("run table ends with %q, want the time columns", got)
	}
	wantTotal := []string{"1.10", "1.20", "1.30"}
	rows := htmlRows(tb)
	if len(rows) != 3 {
		t.Fatalf("%d rows, want 3", len(rows))
	}
	for r, row := range rows {
		if got := strings.Join(row[len(row)-2:], "|"); got != "6.0|"+wantTotal[r] {
			t.Errorf("row %d ends with %q, want 6.0|%s (by hand)", r+1, got, wantTotal[r])
		}
	}
	sum := htmlPairs(htmlByID(doc, "campaign-"+strconv.Itoa(k+1)))
	for label, want := range map[string]string{
		"model installation":   "1.00 h",
		"campaign time":        "1.30 h",
		"shifts (8 h)":         "1",
		"occupancy cost":       "1300.00 EUR (1000.00 EUR per hour)",
		"total cost":           "1300.00 EUR",
		"facility order saves": "0.00 h against the order given (0.30 h of runs there, 0.30 h here)",
	} {
		if sum[label] != want {
			t.Errorf("summary %q = %q, want %q (by hand)", label, sum[label], want)
		}
	}
	// Without a cost source the same facility has no figures.
	doc, _ = outReviewPage(t, ReviewInput{Eval: e, Marks: marks})
	if s := htmlText(htmlByID(doc, "campaign-"+strconv.Itoa(k+1))); !strings.Contains(s, "No time or cost data") {
		t.Errorf("no cost source: %q", s)
	}
}
