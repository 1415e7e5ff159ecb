package tui

import (
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/whatif"
)

// chooseRule opens the editor on the operating rule, moves the choice
// list's pointer to word and picks it.
func chooseRule(t *testing.T, m Model, word string) Model {
	t.Helper()
	if m.mode != modeEdit {
		m, _ = press(m, "e")
	}
	for n := 0; m.editor.field() != whatif.Rule; n++ {
		if n > int(whatif.FieldCount) {
			t.Fatal("cannot reach the operating rule in the editor")
		}
		m, _ = press(m, "down")
	}
	m, _ = press(m, "enter")
	if !m.editor.choosing {
		t.Fatalf("enter on the operating rule opened no choice list (err %q)", m.editor.err)
	}
	for n := 0; m.editor.choices[m.editor.choiceSel].Word != word; n++ {
		if n > len(m.editor.choices) {
			t.Fatalf("no choice %q among %+v", word, m.editor.choices)
		}
		m, _ = press(m, "down")
	}
	m, _ = press(m, "enter")
	return m
}

// kellenAt9144 is the demo on the cryogenic tunnel with the cursor at
// 9144 m, Mach 0.85 (as the goldens).
func kellenAt9144(t *testing.T, w, h int) Model {
	t.Helper()
	m := newDemo(t, w, h)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.curI = gridIndex(m.res.grid.Alts, 9144)
	m.curJ = gridIndex(m.res.grid.Speeds, 0.85)
	m.relayout()
	return m
}

// The operating rule is a what-if of the facility on screen: the editor
// offers the rules of its medium, a fixed rule asks for its value next
// (starting from the top of the T0 range, 313 K for the demo cryogenic
// tunnel), and the rule applied is the one the details state, the header
// lists and U takes back.
func TestRuleWhatIfApplied(t *testing.T) {
	m := kellenAt9144(t, 120, 40)
	k := m.fac
	m = chooseRule(t, m, "fixed temperature")
	if !m.editor.editing || m.editor.lineField != whatif.RuleTemperature || m.editor.input.Value() != "313.0 K" {
		t.Fatalf("after choosing a fixed T0: editing %v on %v, line %q; want the fixed T0 line at 313.0 K",
			m.editor.editing, m.editor.lineField.Label(false), m.editor.input.Value())
	}
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "150 K")
	m, _ = press(m, "enter")
	if r := m.facs[k].Rule; r.Kind != envelope.RuleFixedTemperature || r.Temperature != 150 {
		t.Fatalf("rule applied %+v, want fixed temperature 150 K", r)
	}
	if m.res.maps[k].Rule.Kind != envelope.RuleFixedTemperature {
		t.Errorf("results not solved under the new rule: %+v", m.res.maps[k].Rule)
	}
	// The editor lists the value the rule holds, beside the rule.
	rows := m.editorRows()
	if n := len(rows); rows[n-2].field != whatif.Rule || rows[n-2].value != "fixed temperature" ||
		rows[n-1].field != whatif.RuleTemperature || rows[n-1].value != "150.0 K" || rows[n-1].origin != "demo facility: no fixed T0" {
		t.Errorf("editor rows end %+v, %+v", rows[n-2], rows[n-1])
	}
	m, _ = press(m, "esc")
	det := strings.Join(m.details.blocks.facility, "\n")
	if !strings.Contains(det, "rule fixed T0 150.0 K, p0 to match") {
		t.Errorf("details do not state the rule:\n%s", det)
	}
	head := m.headerText()
	for _, want := range []string{"rule fixed temperature (demo facility warmest)", "fixed T0 150.0 K (demo facility: no fixed T0)"} {
		if !strings.Contains(strings.Join(strings.Fields(head), " "), want) {
			t.Errorf("header lacks %q:\n%s", want, head)
		}
	}
	// One undo takes back the rule and its value together.
	m, _ = press(m, "U")
	if m.facs[k].Rule != m.fileFacs[k].Rule || len(m.changes()) != 0 {
		t.Errorf("after U: rule %+v, %d changes; want the file's rule", m.facs[k].Rule, len(m.changes()))
	}
	if !strings.Contains(m.status, "undone: what-if operating rule") {
		t.Errorf("undo status %q", m.status)
	}
}

// A rule the facility cannot run under is refused with the engine's whole
// reason, and the choice list stays open; esc closes it with nothing
// applied. Without its balance capacity the cryogenic demo tunnel refuses
// least load.
func TestRuleWhatIfRefused(t *testing.T) {
	m := newDemo(t, 120, 40, noLoads)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.relayout()
	m = chooseRule(t, m, "least load")
	want := `operating rule: found "least load" with no balance capacity, expected the facility's largest balance normal force or pitching moment, or another rule: "warmest", "fixed temperature" or "fixed q"`
	if !m.editor.choosing || m.editor.err != want {
		t.Fatalf("least load without a balance: choosing %v, err %q; want the list open and\n%s", m.editor.choosing, m.editor.err, want)
	}
	if panel := strings.Join(strings.Fields(m.editor.View()), " "); !strings.Contains(panel, want) {
		t.Errorf("the refusal is not shown whole:\n%s", m.editor.View())
	}
	// A fixed T0 below the facility's range: the line stays open.
	m, _ = press(m, "esc")
	m = chooseRule(t, m, "fixed temperature")
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "90 K")
	m, _ = press(m, "enter")
	if !m.editor.editing || !strings.Contains(m.editor.err, "expected a temperature within the facility's range, 105 K to 313 K") {
		t.Errorf("fixed T0 90 K: editing %v, err %q", m.editor.editing, m.editor.err)
	}
	m, _ = press(m, "esc", "esc")
	if len(m.changes()) != 0 || len(m.undo) != 0 {
		t.Errorf("refusals applied something: %d changes, %d undo steps", len(m.changes()), len(m.undo))
	}
	// A water tunnel offers its own rules only.
	m.fac = facilityNamed(t, m, "Wenlow")
	m, _ = press(m, "e")
	m = chooseRule(t, m, "warmest")
	if n := len(m.editor.choices); n != 2 {
		t.Errorf("water tunnel offers %d rules, want 2 (warmest, fixed temperature)", n)
	}
}

// A rule chosen in the editor is saved in the session and restored from
// it; a session saved before the rule existed (no "rule" key) still loads
// and leaves each facility's rule as its file has it.
func TestRuleSessionRoundTrip(t *testing.T) {
	m := kellenAt9144(t, 100, 30)
	k := m.fac
	m = chooseRule(t, m, "fixed q")
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "60 kPa")
	m, _ = press(m, "enter", "esc")
	want := envelope.OperatingRule{Kind: envelope.RuleFixedQ, Q: 60000}
	if m.facs[k].Rule != want {
		t.Fatalf("rule applied %+v, want %+v", m.facs[k].Rule, want)
	}
	s := m.Session()
	fw := s.WhatIf.Facilities[m.facs[k].Name]
	if fw["rule"] != float64(envelope.RuleFixedQ) || fw["rule_q_Pa"] != 60000 || len(fw) != 2 {
		t.Errorf("session what-if of the facility %v, want the rule and its q only", fw)
	}
	path := filepath.Join(t.TempDir(), "s.json")
	if err := session.Save(path, s); err != nil {
		t.Fatal(err)
	}
	loaded, err := session.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	r := newDemo(t, 100, 30, func(o *Options) { o.Session = &loaded })
	if r.statusErr || r.facs[k].Rule != want || r.res.maps[k].Rule != want {
		t.Errorf("restored rule %+v (solved %+v, status %q), want %+v", r.facs[k].Rule, r.res.maps[k].Rule, r.status, want)
	}
	// The old session: what-if values without a rule.
	old := s
	old.WhatIf = whatif.Changes{Facilities: map[string]whatif.FacilityChanges{m.facs[k].Name: {"q_max_Pa": 1e5}}}
	o := newDemo(t, 100, 30, func(opt *Options) { opt.Session = &old })
	if o.statusErr || o.facs[k].QMax != 1e5 || o.facs[k].Rule != o.fileFacs[k].Rule {
		t.Errorf("old session: q max %g, rule %+v, status %q", o.facs[k].QMax, o.facs[k].Rule, o.status)
	}
}

// The dump of the view lists the rule and its value among the session's
// changes.
func TestDumpNamesRule(t *testing.T) {
	m := kellenAt9144(t, 120, 40)
	m = chooseRule(t, m, "fixed temperature")
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "150 K")
	m, _ = press(m, "enter", "esc")
	in, err := m.DumpInput()
	if err != nil {
		t.Fatal(err)
	}
	in.Date = "2025-01-01"
	out, err := Dump(in, PlainStyles())
	if err != nil {
		t.Fatal(err)
	}
	name := m.facs[m.fac].Name
	for _, want := range []string{
		"changed by the session: " + name + " operating rule, " + name + " rule temperature",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("dump lacks %q:\n%s", want, out[:min(len(out), 1200)])
		}
	}
}

// A water tunnel's fixed rule holds the water temperature: its line is
// "fixed water T", read in the units shown, and the details state it.
func TestRuleWhatIfWater(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.fac = facilityNamed(t, m, "Wenlow")
	k := m.fac
	m = chooseRule(t, m, "fixed temperature")
	if !m.editor.editing || m.editor.lineField != whatif.RuleTemperature {
		t.Fatalf("no water temperature line after choosing a fixed rule (err %q)", m.editor.err)
	}
	if got := m.editor.Line(); !strings.HasPrefix(got, "fixed water T > ") {
		t.Errorf("input line %q, want it to ask for the fixed water T", got)
	}
	m, _ = press(m, "ctrl+u")
	m = typeText(m, "20 degC")
	m, _ = press(m, "enter", "esc")
	if r := m.facs[k].Rule; r.Kind != envelope.RuleFixedTemperature || r.Temperature != 293.15 {
		t.Fatalf("water rule %+v, want fixed temperature 293.15 K (20 °C)", r)
	}
	// The details state it wherever the tunnel has a setting.
	g := m.res.grid
	for i := range g.Rows() {
		for j := range g.Cols() {
			if r := m.res.maps[k].At(i, j); r.Class != envelope.Outside && r.Q > 0 {
				m.curI, m.curJ = i, j
				m.relayout()
				if det := strings.Join(m.details.blocks.facility, "\n"); !strings.Contains(det, "rule fixed water temperature 293.1 K, speed to match") {
					t.Errorf("details at (%d, %d) do not state the water rule:\n%s", i, j, det)
				}
				return
			}
		}
	}
	t.Error("no point of the water tunnel with a setting to read the details at")
}
