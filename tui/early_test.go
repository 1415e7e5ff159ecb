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

// step is one Update of m with msg (early points taken as drawn).
func step(m Model, msg tea.Msg) (Model, tea.Cmd) {
	if e, ok := msg.(earlyMsg); ok {
		e.drawn()
	}
	next, cmd := m.Update(msg)
	return next.(Model), cmd
}

// A recompute sends the points on screen first, and the frame drawn from
// them is the very frame of the finished results: every kind of
// recompute, for one facility and for the best of all.
func TestEarlyPointsDrawTheFinishedFrame(t *testing.T) {
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
				m.curI, m.curJ = 75, 75
				m, _ = step(m, tea.WindowSizeMsg{Width: 120, Height: 40})
				if m.visRows <= 0 || m.visRows >= m.rows() {
					t.Fatalf("the matrix shows %d of %d rows; want a part", m.visRows, m.rows())
				}
				c.edit(&m)
				msg := m.recompute(c.kind)()
				em, ok := msg.(earlyMsg)
				if !ok {
					t.Fatalf("first message %T, want the early points", msg)
				}
				if em.win.Rows.Len() >= m.rows() || em.win.Cols.Len() >= m.cols() || !em.win.Has(m.curI, m.curJ) {
					t.Fatalf("early window %+v of %d×%d, cursor (%d, %d)", em.win, m.rows(), m.cols(), m.curI, m.curJ)
				}
				m, next := step(m, em)
				if !m.busy || !m.showingEarly() {
					t.Fatalf("after the early points: busy %v, showing them %v; want both", m.busy, m.showingEarly())
				}
				earlyFrame := m.View()
				if strings.Contains(earlyFrame, "computing") {
					t.Error("the frame of the early points says computing")
				}
				// The cells not solved yet are pending, and not read.
				gv := m.gridView()
				below, right := gv.Cell(em.win.Rows.Lo-1, m.curJ), gv.Cell(m.curI, em.win.Cols.Hi)
				if !gv.Partial || !below.Pending || !right.Pending || gv.Cell(m.curI, m.curJ).Pending {
					t.Errorf("grid view of the early window: partial %v, below it pending %v, right of it %v, cursor %v",
						gv.Partial, below.Pending, right.Pending, gv.Cell(m.curI, m.curJ).Pending)
				}
				m, _ = step(m, next())
				if m.busy || m.showingEarly() {
					t.Fatalf("after the rest: busy %v, showing early points %v", m.busy, m.showingEarly())
				}
				if got := m.View(); got != earlyFrame {
					t.Errorf("finished frame differs from the early one:\n%s\n---\n%s", got, earlyFrame)
				}
			})
		}
	}
}

// Where the screen moves off the early points before the rest is solved,
// it shows the last finished results saying "computing", as it does
// before any rows are in; the facility list shows its shares as not
// known while any recompute runs.
func TestEarlyPointsOffScreenWait(t *testing.T) {
	m := newDemo(t, 120, 40, fineDemo)
	m.curI = 75
	m, _ = step(m, tea.WindowSizeMsg{Width: 120, Height: 40})
	m.set.DeltaT = -6
	em := m.recompute(recomputeGrid)().(earlyMsg)
	m, next := step(m, em)
	if !m.showingEarly() {
		t.Fatal("early points not shown")
	}
	for _, r := range m.pickerRows() {
		if !r.pending {
			t.Errorf("facility list row %q: shares shown as known while computing", r.name)
		}
	}
	for range 60 {
		m, _ = step(m, keyMsg("down")) // far from the early points
	}
	if !em.win.Has(m.curI, m.curJ) && m.showingEarly() {
		t.Fatalf("cursor (%d, %d) outside the early window %+v, still drawn from it", m.curI, m.curJ, em.win)
	}
	if em.win.Has(m.curI, m.curJ) {
		t.Fatalf("60 rows down left the cursor in the early window ((%d, %d), %+v)", m.curI, m.curJ, em.win)
	}
	if !strings.Contains(m.View(), "computing") {
		t.Error("off the early points, the frame does not say computing")
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

// The program's root tells the recompute that the early points' frame is
// drawn once it has written it, and only then.
func TestDrawnReportsEarlyFrameDrawn(t *testing.T) {
	var out bytes.Buffer
	d := drawn{m: newDemo(t, 120, 40, fineDemo), scr: newScreen(&out)}
	d.m.rootDraws = true // as Run sets it
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
