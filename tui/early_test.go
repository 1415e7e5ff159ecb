package tui

import (
	"bytes"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// fineDemo is the demo on a 150×150 grid, so that a screen shows a part
// of its rows.
func fineDemo(o *Options) {
	v := *o.Vehicle
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 150, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 150, 0
	o.Vehicle = &v
}

// step is one Update of m with msg (early rows taken as drawn).
func step(m Model, msg tea.Msg) (Model, tea.Cmd) {
	if e, ok := msg.(earlyMsg); ok {
		e.drawn()
	}
	next, cmd := m.Update(msg)
	return next.(Model), cmd
}

// A recompute sends the rows on screen first, and the frame drawn from
// them is the very frame of the finished results: every kind of
// recompute, for one facility and for the best of all.
func TestEarlyRowsDrawTheFinishedFrame(t *testing.T) {
	kinds := []struct {
		name string
		kind recomputeKind
		edit func(m *Model)
	}{
		{"grid (ΔT)", recomputeGrid, func(m *Model) { m.set.DeltaT = 7 }},
		{"every facility (Mach tolerance)", recomputeSolve, func(m *Model) { m.set.MachTol *= 2 }},
		{"one facility (p0 max)", recomputeOneFac, func(m *Model) {
			f := &m.facs[m.fac]
			f.SetPressureMax(f.PressureMin() + 0.6*(f.PressureMax()-f.PressureMin()))
		}},
	}
	for _, c := range kinds {
		for _, shown := range []string{"Skerrow", "best of all"} {
			t.Run(c.name+"/"+shown, func(t *testing.T) {
				m := newDemo(t, 120, 40, fineDemo)
				m.fac = facilityNamed(t, m, "Skerrow")
				if shown == "best of all" && c.kind != recomputeOneFac {
					m.fac = -1
				}
				m.curI = 75
				m, _ = step(m, tea.WindowSizeMsg{Width: 120, Height: 40})
				if m.visRows <= 0 || m.visRows >= m.rows() {
					t.Fatalf("the matrix shows %d of %d rows; want a part", m.visRows, m.rows())
				}
				c.edit(&m)
				msg := m.recompute(c.kind)()
				em, ok := msg.(earlyMsg)
				if !ok {
					t.Fatalf("first message %T, want the early rows", msg)
				}
				if em.rows.Len() >= m.rows() || !em.rows.Has(m.curI) {
					t.Fatalf("early rows %+v of %d, cursor row %d", em.rows, m.rows(), m.curI)
				}
				m, next := step(m, em)
				if !m.busy || !m.showingEarly() {
					t.Fatalf("after the early rows: busy %v, showing them %v; want both", m.busy, m.showingEarly())
				}
				earlyFrame := m.View()
				if strings.Contains(earlyFrame, "computing") {
					t.Error("the frame of the early rows says computing")
				}
				// The cells of rows not solved yet are pending, and not read.
				gv := m.gridView()
				if !gv.Partial || !gv.Cell(em.rows.Lo-1, 0).Pending || gv.Cell(m.curI, 0).Pending {
					t.Errorf("grid view of the early rows: partial %v, row %d pending %v, cursor row pending %v",
						gv.Partial, em.rows.Lo-1, gv.Cell(em.rows.Lo-1, 0).Pending, gv.Cell(m.curI, 0).Pending)
				}
				m, _ = step(m, next())
				if m.busy || m.showingEarly() {
					t.Fatalf("after the rest: busy %v, showing early rows %v", m.busy, m.showingEarly())
				}
				if got := m.View(); got != earlyFrame {
					t.Errorf("finished frame differs from the early one:\n%s\n---\n%s", got, earlyFrame)
				}
			})
		}
	}
}

// Where the screen moves off the early rows before the rest is solved,
// it shows the last finished results saying "computing", as it does
// before any rows are in; the facility list shows its shares as not
// known while any recompute runs.
func TestEarlyRowsOffScreenWait(t *testing.T) {
	m := newDemo(t, 120, 40, fineDemo)
	m.curI = 75
	m, _ = step(m, tea.WindowSizeMsg{Width: 120, Height: 40})
	m.set.DeltaT = -6
	em := m.recompute(recomputeGrid)().(earlyMsg)
	m, next := step(m, em)
	if !m.showingEarly() {
		t.Fatal("early rows not shown")
	}
	for _, r := range m.pickerRows() {
		if !r.pending {
			t.Errorf("facility list row %q: shares shown as known while computing", r.name)
		}
	}
	for range 60 {
		m, _ = step(m, keyMsg("down")) // far from the early rows
	}
	if !em.rows.Has(m.curI) && m.showingEarly() {
		t.Fatalf("cursor row %d outside the early rows %+v, still drawn from them", m.curI, em.rows)
	}
	if em.rows.Has(m.curI) {
		t.Fatalf("60 rows down left the cursor in the early rows (row %d, %+v)", m.curI, em.rows)
	}
	if !strings.Contains(m.View(), "computing") {
		t.Error("off the early rows, the frame does not say computing")
	}
	m, _ = step(m, next())
	if m.busy || strings.Contains(m.View(), "computing") {
		t.Error("after the rest, still computing")
	}
	for _, r := range m.pickerRows() {
		if r.pending {
			t.Errorf("facility list row %q: shares pending after the recompute", r.name)
		}
	}
}

// The program's root tells the recompute that the early rows' frame is
// drawn once it has written it, and only then.
func TestDrawnReportsEarlyFrameDrawn(t *testing.T) {
	var out bytes.Buffer
	d := drawn{m: newDemo(t, 120, 40, fineDemo), scr: newScreen(&out)}
	next, _ := d.Update(tea.WindowSizeMsg{Width: 120, Height: 40})
	d = next.(drawn)
	d.View()
	d.m.curI = 75
	d.m.relayout()
	d.m.set.DeltaT = 3
	em := d.m.recompute(recomputeGrid)().(earlyMsg)
	told := 0
	inner := em.drawn
	em.drawn = func() { told++; inner() }
	out.Reset()
	next, _ = d.Update(em)
	d = next.(drawn)
	if told != 0 {
		t.Fatal("told drawn before the frame was drawn")
	}
	d.View()
	if told != 1 || out.Len() == 0 || strings.Contains(out.String(), "computing") {
		t.Errorf("after View: told %d times, %d bytes drawn (computing: %v); want once, the early frame",
			told, out.Len(), strings.Contains(out.String(), "computing"))
	}
	next, _ = d.Update(finished(em.next))
	d = next.(drawn)
	d.View()
	if told != 1 {
		t.Errorf("told %d times after the rest, want once", told)
	}
}
