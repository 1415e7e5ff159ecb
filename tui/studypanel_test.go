package tui

import (
	"math"
	"reflect"
	"strconv"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"

	"likewind/envelope"
)

// studyOpen is the cryogenic demo tunnel (file scale 1/40) with its study
// open and computed.
func studyOpen(t *testing.T, w, h int) Model {
	t.Helper()
	m, _ := press(kellenAt9144(t, w, h), "S")
	if m.mode != modeStudy || m.study.study == nil {
		t.Fatalf("S: mode %v, study %v; want the study panel with its study", m.mode, m.study.study)
	}
	return m
}

// rowMarked is the index of the only row whose marks include word, -1
// when none is; it fails when several are.
func rowMarked(t *testing.T, p studyPanel, word string) int {
	t.Helper()
	at := -1
	for k, r := range p.rows {
		for _, w := range strings.Split(r.words, ", ") {
			if w == word {
				if at >= 0 {
					t.Fatalf("rows %d and %d both marked %q", at, k, word)
				}
				at = k
			}
		}
	}
	return at
}

// rowShare reads the matched share (%) of row k as the panel shows it.
func rowShare(t *testing.T, p studyPanel, k int) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(p.rows[k].cells[2], 64)
	if err != nil {
		t.Fatalf("row %d matched share %q: %v", k, p.rows[k].cells[2], err)
	}
	return v
}

// The study of the facility on screen: the row in force is the
// facility's own scale (the demo cryogenic tunnel's file says 1/40), the
// fit-limit row is the section's largest model, the rows above it say
// they are beyond it, the pointer starts on the scale in force, and the
// best scale named is the row of the highest matched share among those
// within both limits, the fit and the balance's (the smallest on a tie).
func TestStudyPanelMarksAndBest(t *testing.T) {
	m := studyOpen(t, 120, 40)
	p := m.study
	mp := m.res.maps[m.fac]
	in := rowMarked(t, p, "in force")
	if in < 0 || p.rows[in].scale != 0.025 {
		t.Fatalf("in-force row %d, want the file's scale 0.025 (1/40)", in)
	}
	if p.sel != in {
		t.Errorf("pointer on row %d at open, want the scale in force (row %d)", p.sel, in)
	}
	fit := rowMarked(t, p, "fit limit")
	if fit < 0 || math.Abs(p.rows[fit].scale-mp.FitScale) > 5e-4*mp.FitScale {
		t.Fatalf("fit-limit row %d, want the section's largest model %g", fit, mp.FitScale)
	}
	best, bestShare := -1, -1.0
	for k, r := range p.rows {
		beyond := strings.Contains(r.words, "beyond fit")
		if beyond != (k > fit) {
			t.Errorf("row %d (scale %g): beyond fit %v, want %v (fit limit %g)", k, r.scale, beyond, k > fit, mp.FitScale)
		}
		if !r.beyond {
			if s := rowShare(t, p, k); s > bestShare {
				best, bestShare = k, s
			}
		}
	}
	if got := rowMarked(t, p, "best"); got != best || best < 0 {
		t.Fatalf("row marked best %d, want %d (highest matched share within the limits, %g %%)", got, best, bestShare)
	}
	screen := strings.Join(strings.Fields(ansi.Strip(m.View())), " ")
	want := "Best within the limits: scale " + p.rows[best].cells[0] + ", " + p.rows[best].cells[2] + " % matched."
	if !strings.Contains(screen, want) {
		t.Errorf("screen does not name the best scale %q:\n%s", want, m.View())
	}
	// The demo tunnel's balance (2.4 kN, 120 N·m) is checked.
	lim, ok := p.study.BalanceLimit()
	if !ok {
		t.Fatal("no balance limit for the demo cryogenic tunnel")
	}
	for _, w := range []string{"MODEL-SCALE STUDY d Kellen Fold", "scale in force 0.025 = 1:40", "the balance takes up to " + sig3(lim)} {
		if !strings.Contains(screen, w) {
			t.Errorf("screen lacks %q:\n%s", w, m.View())
		}
	}
}

// With balance data the balance's largest scale is marked and the rows
// above it say they are beyond it; the best scale lies within it.
func TestStudyPanelBalanceLimit(t *testing.T) {
	m, _ := press(loadDemo(t, 200, 60), "S")
	p := m.study
	lim, ok := p.study.BalanceLimit()
	if !ok {
		t.Fatal("the test's load data give no balance limit")
	}
	at := rowMarked(t, p, "balance limit")
	if at < 0 || p.rows[at].scale != lim {
		t.Fatalf("balance-limit row %d, want the scale %g", at, lim)
	}
	for k, r := range p.rows {
		beyond := strings.Contains(r.words, "beyond balance") || strings.Contains(r.words, "and balance")
		if beyond != (r.scale > lim) {
			t.Errorf("row %d (scale %g): beyond balance %v, want %v", k, r.scale, beyond, r.scale > lim)
		}
	}
	if b := rowMarked(t, p, "best"); b < 0 || p.rows[b].scale > lim {
		t.Errorf("best row %d lies beyond the balance limit %g", b, lim)
	}
	screen := strings.Join(strings.Fields(ansi.Strip(m.View())), " ")
	if !strings.Contains(screen, "the balance takes up to "+sig3(lim)) {
		t.Errorf("screen does not state the balance limit %s:\n%s", sig3(lim), m.View())
	}
}

// enter applies the row's scale as the what-if scale of every facility,
// as + and - do; the study is made again at once with that scale in
// force and the pointer stays on it; U puts the facility's own scale
// back.
func TestStudyPanelEnterAppliesScaleAndUndo(t *testing.T) {
	m := studyOpen(t, 120, 40)
	in := m.study.sel
	m, _ = press(m, "down", "down")
	want := m.study.rows[in+2].scale
	m, _ = press(m, "enter")
	if m.set.Scale != want {
		t.Fatalf("enter: what-if scale %g, want the row's %g", m.set.Scale, want)
	}
	for k, mp := range m.res.maps {
		if mp != nil && mp.Scale != want {
			t.Errorf("facility %d solved at %g, want %g for all", k, mp.Scale, want)
		}
	}
	if m.mode != modeStudy || m.study.stale || m.study.study.Scale != want {
		t.Fatalf("after enter: mode %v, stale %v, study in force %g; want the panel open on a fresh study at %g",
			m.mode, m.study.stale, m.study.study.Scale, want)
	}
	if r := rowMarked(t, m.study, "in force"); r != m.study.sel || m.study.rows[r].scale != want {
		t.Errorf("in-force row %d, pointer %d; want both on %g", r, m.study.sel, want)
	}
	if !strings.Contains(m.status, "for all facilities, from the study of d (U undoes)") {
		t.Errorf("status %q", m.status)
	}
	m, _ = press(m, "U")
	if m.set.Scale != 0 || m.res.maps[m.fac].Scale != 0.025 || len(m.changes()) != 0 {
		t.Fatalf("U: what-if scale %g, solved %g; want the file's 1/40 back", m.set.Scale, m.res.maps[m.fac].Scale)
	}
	if r := rowMarked(t, m.study, "in force"); r < 0 || m.study.rows[r].scale != 0.025 || m.mode != modeStudy {
		t.Errorf("after U the study's in-force row is %d, mode %v; want 0.025 with the panel open", r, m.mode)
	}
	// enter on the what-if scale already in force changes nothing.
	m, _ = press(m, "down", "enter")
	n := len(m.undo)
	m, _ = press(m, "enter")
	if len(m.undo) != n || !strings.Contains(m.status, "already") {
		t.Errorf("enter on the scale in force: %d undo steps (was %d), status %q", len(m.undo), n, m.status)
	}
}

// The study runs in a command: the panel says it is computing until the
// study comes back; a what-if change while the panel is open marks the
// table stale until the recompute and the new study are done, and the
// new study is started by the recompute's arrival.
func TestStudyPanelComputingAndStale(t *testing.T) {
	m := kellenAt9144(t, 120, 40)
	next, cmd := m.Update(keyMsg("S"))
	m = next.(Model)
	if cmd == nil || !strings.Contains(ansi.Strip(m.View()), "computing the study…") {
		t.Fatalf("S: command %v; want a study command and the panel saying it is computing:\n%s", cmd != nil, m.View())
	}
	msg, ok := cmd().(studiedMsg)
	if !ok || msg.study == nil || msg.err != nil {
		t.Fatalf("the study command returned %#v", msg)
	}
	next, _ = m.Update(msg)
	m = next.(Model)
	if m.study.study == nil || strings.Contains(ansi.Strip(m.View()), "computing") {
		t.Fatalf("the study did not arrive in the panel:\n%s", m.View())
	}
	// A what-if change: the recompute runs, the old table stays, stale.
	next, cmd = m.Update(keyMsg("enter"))
	m = next.(Model)
	if !m.busy || !m.study.stale || !strings.Contains(ansi.Strip(m.View()), "what-if values changed: computing the study again…") {
		t.Fatalf("after a what-if change: busy %v, stale %v:\n%s", m.busy, m.study.stale, m.View())
	}
	if cmd == nil {
		t.Fatal("no recompute command")
	}
	next, cmd = m.Update(finished(cmd))
	m = next.(Model)
	if cmd == nil || !m.study.stale {
		t.Fatalf("the recompute's arrival: study command %v, stale %v; want a new study started, the table still stale", cmd != nil, m.study.stale)
	}
	next, _ = m.Update(cmd())
	m = next.(Model)
	if m.study.stale || m.study.study.Scale != m.set.Scale {
		t.Errorf("new study: stale %v, in force %g; want fresh at the what-if scale %g", m.study.stale, m.study.study.Scale, m.set.Scale)
	}
	// A study that comes back after a newer request is dropped.
	old := msg
	next, _ = m.Update(old)
	if m2 := next.(Model); m2.studied.of != m.studied.of {
		t.Error("an outdated study replaced the newer one")
	}
}

// In best of all the panel says to choose a facility and [ ] step
// through the facilities from it; esc closes it.
func TestStudyPanelBestOfAll(t *testing.T) {
	m, _ := press(kellenAt9144(t, 120, 40), "b", "S")
	screen := strings.Join(strings.Fields(ansi.Strip(m.study.View())), " ")
	if m.mode != modeStudy || !strings.Contains(screen, "choose a facility to study ([ and ] step through them here, f lists them)") {
		t.Fatalf("S on best of all:\n%s", m.View())
	}
	m, _ = press(m, "]")
	if m.fac != 0 || m.study.study == nil || m.study.study.Facility != m.facs[0].Name {
		t.Fatalf("]: facility %d, study of %v; want the first facility studied", m.fac, m.study.study)
	}
	m, _ = press(m, "[")
	if last := len(m.facs) - 1; m.fac != last || m.study.study.Facility != m.facs[last].Name {
		t.Errorf("[ from the first: facility %d, want the last (%d), best of all left out", m.fac, last)
	}
	m, _ = press(m, "esc")
	if m.mode != modeMain {
		t.Errorf("esc: mode %v, want the matrix", m.mode)
	}
}

// The panel's keys are its own: it moves its pointer and reports the
// rest.
func TestStudyPanelReports(t *testing.T) {
	m := studyOpen(t, 120, 40)
	p := m.study
	p.sel = 0
	p, _ = p.Update(keyMsg("up")) // wraps to the last row
	if p.sel != len(p.rows)-1 {
		t.Errorf("up from the first row: %d, want the last (%d)", p.sel, len(p.rows)-1)
	}
	p, _ = p.Update(keyMsg("home"))
	_, cmd := p.Update(keyMsg("enter"))
	if got, want := reportOf(cmd), (studyScaleChosenMsg{scale: p.rows[0].scale}); got != want {
		t.Errorf("enter reports %#v, want %#v", got, want)
	}
	for k, want := range map[string]tea.Msg{"esc": panelClosedMsg{}, "S": panelClosedMsg{}, "?": helpWantedMsg{}, "q": quitWantedMsg{},
		"U": undoWantedMsg{}, "[": studyFacilityMsg{step: -1}, "]": studyFacilityMsg{step: 1}} {
		if _, cmd := p.Update(keyMsg(k)); reportOf(cmd) != want {
			t.Errorf("%s reports %#v, want %#v", k, reportOf(cmd), want)
		}
	}
}

// Scales are dimensionless and shares in %: the units key changes
// nothing in the panel.
func TestStudyPanelSameInBothUnits(t *testing.T) {
	m := studyOpen(t, 120, 40)
	si := append(m.study.heading(), m.study.footingShown()...)
	rows := m.study.rows
	m, _ = press(m, "esc", "u", "S")
	if m.units == 0 {
		t.Fatal("u did not change the units")
	}
	if c := append(m.study.heading(), m.study.footingShown()...); strings.Join(c, "\n") != strings.Join(si, "\n") || !reflect.DeepEqual(m.study.rows, rows) {
		t.Errorf("study panel differs in customary units:\n%s\n---\n%s", strings.Join(c, "\n"), strings.Join(si, "\n"))
	}
}

// At each screen size the panel's lines are within its width (wrapped,
// never cut), the pointer's row is in view, and where not every row fits
// the panel says which are shown and scrolls to the first and last.
func TestStudyPanelFitsAndScrolls(t *testing.T) {
	for _, size := range screenSizes {
		m := studyOpen(t, size.w, size.h)
		for _, keys := range [][]string{nil, {"home"}, {"end"}, {"pgup"}, {"pgdown", "pgdown"}} {
			m, _ := press(m, keys...)
			p := m.study
			body := p.body()
			if len(body) > p.height {
				t.Errorf("%dx%d %v: panel body %d lines, panel %d", size.w, size.h, keys, len(body), p.height)
			}
			for _, l := range body {
				if visibleWidth(l) > p.width {
					t.Errorf("%dx%d %v: line wider than the panel (%d): %q", size.w, size.h, keys, p.width, ansi.Strip(l))
				}
			}
			screen := ansi.Strip(m.View())
			checkFits(t, m.View(), size.w, size.h)
			row := strings.Fields(ansi.Strip(p.body()[len(p.heading())+p.sel-p.top]))
			if len(row) < 2 || row[0] != ">" || row[1] != p.rows[p.sel].cells[0] {
				t.Errorf("%dx%d %v: pointer's row not in view where expected: %q", size.w, size.h, keys, row)
			}
			if n := p.tableRows(); n < len(p.rows) && !strings.Contains(screen, "rows "+strconv.Itoa(p.top+1)+"–") {
				t.Errorf("%dx%d %v: %d of %d rows shown and no line says which:\n%s", size.w, size.h, keys, n, len(p.rows), screen)
			}
		}
		m, _ = press(m, "end")
		if m.study.sel != len(m.study.rows)-1 {
			t.Errorf("%dx%d end: pointer %d, want the last row", size.w, size.h, m.study.sel)
		}
	}
	// At 80 columns the marks are words; where the panel is too narrow
	// for them, letters explained under the table.
	m := studyOpen(t, 80, 24)
	if m.study.codes() {
		t.Error("80 columns: marks as letters, want words")
	}
	m, _ = drive(m, tea.WindowSizeMsg{Width: 60, Height: 30})
	if !m.study.codes() || !strings.Contains(strings.Join(strings.Fields(ansi.Strip(m.View())), " "), strings.Join(strings.Fields(studyCodeLegend), " ")) {
		t.Errorf("60 columns: want letters with their legend:\n%s", m.View())
	}
	for _, r := range m.study.rows {
		if strings.Contains(r.words, "in force") && !strings.Contains(r.codes, "I") {
			t.Errorf("in-force row coded %q", r.codes)
		}
	}
}

// The marks' words and letters, and the cells of a row.
func TestStudyRowText(t *testing.T) {
	w, c := stepMarkText(envelope.MarkInForce|envelope.MarkFitLimit, true)
	if w != "in force, fit limit, best" || c != "IF^" {
		t.Errorf("in force + fit limit + best: %q %q", w, c)
	}
	w, c = stepMarkText(envelope.MarkBeyondFit|envelope.MarkBeyondBalance, false)
	if w != "beyond fit and balance" || c != "fb" {
		t.Errorf("beyond both: %q %q", w, c)
	}
	for x, want := range map[float64]string{math.NaN(): "-", 0.004: "<0.01", 0.0141: "0.014", 0.5: "0.500", 1.048: "1.05", 12.34: "12.3", 456.7: "457"} {
		if got := ratioCell(x); got != want {
			t.Errorf("ratioCell(%g) = %q, want %q", x, got, want)
		}
	}
	if got := shareCell(0.2356); got != "23.6" {
		t.Errorf("shareCell(0.2356) = %q, want 23.6", got)
	}
}
