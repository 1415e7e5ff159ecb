package tui

import (
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// lineInput is a one-line text field: typed characters are inserted at
// the cursor; editing keys come from the KeyMap. It keeps everything
// typed or pasted, however long: the view scrolls, and the caller decides
// what is too long to use (and says so), so no text is dropped unseen.
type lineInput struct {
	prompt string
	value  []rune
	pos    int
}

func (l *lineInput) set(s string) {
	l.value = []rune(s)
	l.pos = len(l.value)
}

// Value returns the text typed so far.
func (l lineInput) Value() string { return string(l.value) }

// update applies one key; it reports whether the key was used.
func (l *lineInput) update(k *KeyMap, msg tea.KeyMsg) bool {
	switch {
	case key.Matches(msg, k.InputLeft):
		l.pos = max(l.pos-1, 0)
	case key.Matches(msg, k.InputRight):
		l.pos = min(l.pos+1, len(l.value))
	case key.Matches(msg, k.InputHome):
		l.pos = 0
	case key.Matches(msg, k.InputEnd):
		l.pos = len(l.value)
	case key.Matches(msg, k.InputBackspace):
		if l.pos > 0 {
			l.value = append(l.value[:l.pos-1], l.value[l.pos:]...)
			l.pos--
		}
	case key.Matches(msg, k.InputDelete):
		if l.pos < len(l.value) {
			l.value = append(l.value[:l.pos], l.value[l.pos+1:]...)
		}
	case key.Matches(msg, k.InputClear):
		l.value, l.pos = l.value[:0], 0
	case msg.Type == tea.KeyRunes || msg.Type == tea.KeySpace:
		r := msg.Runes
		if msg.Type == tea.KeySpace {
			r = []rune{' '}
		}
		for _, c := range r {
			if c < ' ' || c >= 0x7f && c < 0xa0 { // C0, DEL and C1 controls
				continue
			}
			l.value = append(l.value, 0)
			copy(l.value[l.pos+1:], l.value[l.pos:])
			l.value[l.pos] = c
			l.pos++
		}
	default:
		return false
	}
	return true
}

// view draws prompt, text and cursor within width w, scrolling the text
// so the cursor stays visible. Without colour the cursor is drawn as '|'.
func (l lineInput) view(st *Styles, w int) string {
	if w <= 0 {
		return ""
	}
	prompt := st.InputLine.Render(l.prompt)
	room := w - visibleWidth(l.prompt) - 1
	if room < 1 {
		return clip(prompt, w, 1)
	}
	start := 0
	if l.pos > room-1 {
		start = l.pos - (room - 1)
	}
	end := min(len(l.value), start+room)
	before := string(l.value[start:l.pos])
	var b strings.Builder
	b.WriteString(prompt)
	b.WriteString(before)
	if st.Color {
		c := " "
		rest := ""
		if l.pos < end {
			c = string(l.value[l.pos])
			rest = string(l.value[l.pos+1 : end])
		}
		b.WriteString(st.Selected.Render(c))
		b.WriteString(rest)
	} else {
		b.WriteString("|")
		b.WriteString(string(l.value[l.pos:end]))
	}
	return clip(b.String(), w, 1)
}
