package tui

import (
	"fmt"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"likewind/envelope"
)

func press(s string) tea.KeyMsg {
	switch s {
	case "tab":
		return tea.KeyMsg{Type: tea.KeyTab}
	case "enter":
		return tea.KeyMsg{Type: tea.KeyEnter}
	case "esc":
		return tea.KeyMsg{Type: tea.KeyEsc}
	case "down":
		return tea.KeyMsg{Type: tea.KeyDown}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(s)}
}

func TestScratch(t *testing.T) {
	v, facs, err := envelope.Demo()
	if err != nil {
		t.Fatal(err)
	}
	var m tea.Model = New(Options{Vehicle: v, Facilities: facs})
	for _, k := range []string{"]", "]", "tab", "tab", "tab", "tab", "b", "tab", "f", "esc", "e", "down", "down", "down", "down", "down", "enter", "?"} {
		var cmd tea.Cmd
		m, cmd = m.Update(press(k))
		if cmd != nil {
			m, _ = m.Update(cmd())
		}
		fmt.Println("== key", k)
		fmt.Println(m.View())
	}
}
