package tui

import (
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// bigDemo is the demo vehicle on a 400×400 grid.
func bigDemo(tb testing.TB, w, h int) Model {
	tb.Helper()
	v, facs := demoData(tb)
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = 400, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = 400, 0
	st := PlainStyles()
	m := New(Options{Vehicle: v, Facilities: facs, Styles: &st, Width: w, Height: h})
	if m.rows() != 400 || m.cols() != 400 {
		tb.Fatalf("grid %d×%d, want 400×400", m.rows(), m.cols())
	}
	return m
}

// BenchmarkView measures one frame at 200×60 (target < 5 ms), with
// colour on so the escape sequences are part of the cost.
func BenchmarkView(b *testing.B) {
	for _, c := range []struct {
		name string
		big  bool
	}{{"demo", false}, {"grid400", true}} {
		b.Run(c.name, func(b *testing.B) {
			var m Model
			if c.big {
				m = bigDemo(b, 200, 60)
			} else {
				m = newDemo(b, 200, 60)
			}
			st := colourStyles()
			m.fr.st = &st
			m = relayoutAll(m)
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				_ = m.View()
			}
		})
	}
}

// relayoutAll rebuilds the components after the styles were swapped.
func relayoutAll(m Model) Model {
	fr := m.fr
	m.matrix.frame.st, m.details.frame.st, m.legend.frame.st = fr.st, fr.st, fr.st
	m.picker.frame.st, m.editor.frame.st, m.saveAs.frame.st = fr.st, fr.st, fr.st
	m.help = newHelpView(fr)
	m.relayout()
	return m
}

// keyToFrameTarget is the key-press-to-frame budget on a 400×400 grid,
// what-if recompute included.
const keyToFrameTarget = 16 * time.Millisecond

// reportTarget adds the time per key press as a share of keyToFrameTarget
// (metric "x16ms": below 1 meets the target).
func reportTarget(b *testing.B) {
	if b.N > 0 {
		b.ReportMetric(float64(b.Elapsed())/float64(b.N)/float64(keyToFrameTarget), "x16ms")
	}
}

// BenchmarkKeyToFrame measures a key press to the finished frame on a
// 400×400 grid (target < 16 ms, see keyToFrameTarget): a cursor move, a
// maximum-p0 what-if edit on each demo facility (Solve of that facility,
// then the best-of-all update), and a ΔT edit (NewGrid and Solve of every
// facility), with the recompute run in the command as the runtime would
// run it. Compare the x16ms metrics of one run.
func BenchmarkKeyToFrame(b *testing.B) {
	// A model of its own per part, reusing replaced arrays as Run does
	// (a copy of a model with arrays must not be driven beside it).
	fresh := func() Model {
		m := bigDemo(b, 200, 60)
		m.arrays = newArrays()
		return m
	}
	b.Run("move", func(b *testing.B) {
		m := fresh()
		keys := []tea.Msg{keyMsg("right"), keyMsg("left")}
		b.ResetTimer()
		for k := range b.N {
			m, _ = drive(m, keys[k%2])
			_ = m.View()
		}
		reportTarget(b)
	})
	for _, fc := range []string{"Aldmoor", "Bracken Ness", "Harl Cove", "Kellen Fold", "Skerrow", "Wenlow"} {
		b.Run("p0max/"+fc, func(b *testing.B) {
			m := fresh()
			m.fac = facilityNamed(b, m, fc)
			p0 := m.facs[m.fac].PressureMax()
			lower := max(0.9*p0, 0.5*(m.facs[m.fac].PressureMin()+p0)) // stays above P0Min
			benchEdit(b, m, whatif.P0Max, units.Sig(lower/1000, 4)+" kPa", units.Sig(p0/1000, 4)+" kPa")
		})
	}
	b.Run("deltaT", func(b *testing.B) { benchEdit(b, fresh(), whatif.DeltaT, "5 K", "0 K") })
}

// benchEdit times enter on the what-if line of field f, holding each of
// values in turn, to the finished frame (the line is opened untimed).
func benchEdit(b *testing.B, m Model, f whatif.Field, values ...string) {
	m.mode = modeEdit
	m.editor.sel = int(f)
	m.relayout() // the editor's rows and reader for the chosen facility
	b.ResetTimer()
	for k := range b.N {
		b.StopTimer()
		m.editor.begin(values[k%len(values)])
		b.StartTimer()
		m, _ = drive(m, keyMsg("enter"))
		_ = m.View()
	}
	b.StopTimer()
	if m.busy || m.editor.err != "" {
		b.Fatalf("recompute did not finish: busy %v err %q", m.busy, m.editor.err)
	}
	reportTarget(b)
}

// colourStyles are full-colour styles, independent of the test terminal.
func colourStyles() Styles {
	return NewStyles(trueColourRenderer())
}
