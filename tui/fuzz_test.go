package tui

import (
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// fuzzKeys are the keys the fuzz target presses, indexed by input bytes.
var fuzzKeys = []string{
	"up", "down", "left", "right", "k", "j", "h", "l", "pgup", "pgdown", "home", "end",
	"tab", "u", "f", "[", "]", "b", "e", "R", "space", "M", "X", "s", "?", "q", "n", "y",
	"enter", "esc", "backspace", "delete", "ctrl+u", "ctrl+a", "ctrl+e",
	"1", "0", ".", "5", "-", " ", "b", "a", "r", "K", "%", "x", "S",
}

// FuzzUpdate presses random keys and resizes the terminal between 1×1 and
// 300×100; Update and View must never panic and the view must fit.
func FuzzUpdate(f *testing.F) {
	f.Add([]byte{80, 24, 0, 1, 2, 3, 12, 12, 12, 12})
	f.Add([]byte{1, 1, 13, 14, 15, 16, 17})
	f.Add([]byte{255, 99, 18, 28, 28, 28, 29, 30, 19, 20, 21})
	f.Add([]byte{40, 10, 18, 2, 2, 2, 2, 2, 28, 32, 35, 37, 38, 28})
	f.Add([]byte{200, 60, 14, 28, 18, 28, 36, 28, 25, 26})
	base := newDemo(f, 80, 24)
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) < 2 {
			return
		}
		m := base
		w, h := 1+int(data[0])%300, 1+int(data[1])%100
		m, _ = drive(m, tea.WindowSizeMsg{Width: w, Height: h})
		for k, b := range data[2:] {
			if k > 64 {
				break
			}
			var msg tea.Msg
			if b >= 250 {
				// occasionally resize mid-sequence
				w, h = 1+int(b)*(k+7)%300, 1+int(b)*(k+3)%100
				msg = tea.WindowSizeMsg{Width: w, Height: h}
			} else {
				msg = keyMsg(fuzzKeys[int(b)%len(fuzzKeys)])
			}
			m, _ = drive(m, msg)
			out := m.View()
			checkFits(t, out, w, h)
		}
	})
}

// TestViewFitsEverySize sweeps terminal sizes from 1×1 to 300×100 in the
// main modes.
func TestViewFitsEverySize(t *testing.T) {
	base := newDemo(t, 80, 24)
	states := map[string]Model{"main": base}
	states["help"], _ = press(base, "?")
	states["picker"], _ = press(base, "f")
	states["editor"], _ = press(base, "e", "enter")
	states["best"], _ = press(base, "b")
	states["study"], _ = press(base, "S")
	states["confirm"], _ = press(base, "space", "q")
	for name, s := range states {
		for w := 1; w <= 300; w += 7 {
			for h := 1; h <= 100; h += 3 {
				m, _ := drive(s, tea.WindowSizeMsg{Width: w, Height: h})
				out := m.View()
				lines := 0
				if out != "" {
					lines = len(splitLines(out))
				}
				if lines > h {
					t.Errorf("%s at %d×%d: %d lines", name, w, h, lines)
				}
				checkFits(t, out, w, h)
			}
		}
	}
}

func splitLines(s string) []string {
	var out []string
	start := 0
	for k := 0; k < len(s); k++ {
		if s[k] == '\n' {
			out = append(out, s[start:k])
			start = k + 1
		}
	}
	return append(out, s[start:])
}
