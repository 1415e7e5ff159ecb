package tui

import (
	"io"
	"math"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"likewind/envelope"
)

// demoData loads the built-in demo (invented vehicle and facilities).
func demoData(tb testing.TB) (*envelope.Vehicle, []envelope.Facility) {
	tb.Helper()
	v, facs, err := envelope.Demo()
	if err != nil {
		tb.Fatalf("envelope.Demo() error: %v", err)
	}
	return v, facs
}

// newDemo builds a model on the demo data at w×h with plain styles.
func newDemo(tb testing.TB, w, h int, edit ...func(*Options)) Model {
	tb.Helper()
	v, facs := demoData(tb)
	st := PlainStyles()
	o := Options{Vehicle: v, Facilities: facs, Styles: &st, Width: w, Height: h}
	for _, e := range edit {
		e(&o)
	}
	return New(o)
}

// noLoads strips the demo's load data (the vehicle's coefficients and
// every balance capacity): an Options edit for newDemo, for what holds on
// files that give none.
func noLoads(o *Options) {
	v := *o.Vehicle
	v.Loads = envelope.ModelLoads{}
	o.Vehicle = &v
	facs := append([]envelope.Facility(nil), o.Facilities...)
	for k := range facs {
		facs[k].Balance = envelope.BalanceLimits{}
	}
	o.Facilities = facs
}

// keyMsg turns a key name into the message the terminal would send.
func keyMsg(s string) tea.KeyMsg {
	types := map[string]tea.KeyType{
		"up": tea.KeyUp, "down": tea.KeyDown, "left": tea.KeyLeft, "right": tea.KeyRight,
		"pgup": tea.KeyPgUp, "pgdown": tea.KeyPgDown, "home": tea.KeyHome, "end": tea.KeyEnd,
		"tab": tea.KeyTab, "enter": tea.KeyEnter, "esc": tea.KeyEsc, "backspace": tea.KeyBackspace,
		"delete": tea.KeyDelete, "ctrl+c": tea.KeyCtrlC, "ctrl+u": tea.KeyCtrlU, "space": tea.KeySpace,
		"ctrl+a": tea.KeyCtrlA, "ctrl+e": tea.KeyCtrlE, "ctrl+s": tea.KeyCtrlS,
	}
	if t, ok := types[s]; ok {
		return tea.KeyMsg{Type: t}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(s)}
}

// drive sends messages to the model and runs every command it returns
// synchronously, feeding the results back, as the Bubble Tea runtime
// would. It reports whether the model asked to quit.
func drive(m Model, msgs ...tea.Msg) (Model, bool) {
	quit := false
	queue := append([]tea.Msg(nil), msgs...)
	for len(queue) > 0 {
		msg := queue[0]
		queue = queue[1:]
		if _, ok := msg.(tea.QuitMsg); ok {
			quit = true
			continue
		}
		if b, ok := msg.(tea.BatchMsg); ok {
			for _, c := range b {
				if c != nil {
					queue = append(queue, c())
				}
			}
			continue
		}
		if e, ok := msg.(earlyMsg); ok {
			e.drawn() // as the program's root would after drawing it
		}
		next, cmd := m.Update(msg)
		m = next.(Model)
		if cmd != nil {
			if out := cmd(); out != nil {
				queue = append(queue, out)
			}
		}
	}
	return m, quit
}

// press sends named keys.
func press(m Model, keys ...string) (Model, bool) {
	msgs := make([]tea.Msg, len(keys))
	for k, s := range keys {
		msgs[k] = keyMsg(s)
	}
	return drive(m, msgs...)
}

// typeText sends each rune of s as a key.
func typeText(m Model, s string) Model {
	for _, r := range s {
		if r == ' ' {
			m, _ = drive(m, tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}})
			continue
		}
		m, _ = drive(m, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
	}
	return m
}

// gridIndex finds the axis index nearest v.
func gridIndex(axis []float64, v float64) int {
	best, bd := 0, math.Inf(1)
	for k, a := range axis {
		if d := math.Abs(a - v); d < bd {
			best, bd = k, d
		}
	}
	return best
}

// facilityNamed returns the index of the demo facility whose name starts
// with prefix.
func facilityNamed(tb testing.TB, m Model, prefix string) int {
	tb.Helper()
	for k, f := range m.facs {
		if len(f.Name) >= len(prefix) && f.Name[:len(prefix)] == prefix {
			return k
		}
	}
	tb.Fatalf("no demo facility named %q…", prefix)
	return -1
}

// trueColourRenderer is a lipgloss renderer fixed to 24-bit colour.
func trueColourRenderer() *lipgloss.Renderer {
	r := lipgloss.NewRenderer(io.Discard)
	r.SetColorProfile(termenv.TrueColor)
	return r
}

// finished runs a recompute's command past the early rows it may send
// first (earlyMsg) and returns its last message.
func finished(cmd tea.Cmd) tea.Msg {
	msg := cmd()
	for {
		e, ok := msg.(earlyMsg)
		if !ok {
			return msg
		}
		e.drawn()
		msg = e.next()
	}
}
