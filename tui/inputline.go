package tui

import (
	"fmt"
	"strings"
	"unicode/utf8"

	"github.com/charmbracelet/bubbles/cursor"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/textinput"
	tea "github.com/charmbracelet/bubbletea"
)

// inputLine is the one-line text field of the what-if editor and the
// save-as question: a bubbles textinput with the program's editing keys
// (KeyMap.Input*) and its Validate hook set to the caller's parser. Around
// it, what textinput does not do:
//   - C0, DEL and C1 control characters are dropped from typed and pasted
//     text (a paste of a file's lines cannot send escape sequences);
//   - text that would make the entry longer than its limit is refused whole
//     and the refusal says so (Refused), never cut to fit as CharLimit
//     alone would;
//   - the line is drawn from the stored text and cursor (View), with the
//     program's styles, so that nothing blinks and a frame depends on the
//     state alone.
type inputLine struct {
	ti      textinput.Model
	prompt  string
	clear   key.Binding
	refused string
}

// newInputLine opens a line with prompt, holding value with the cursor at
// its end. limit is the longest entry in characters (a longer value is
// kept whole: the limit grows to it); validate may be nil.
func newInputLine(keys *KeyMap, prompt, value string, limit int, validate textinput.ValidateFunc) inputLine {
	ti := textinput.New()
	ti.Prompt = ""
	ti.KeyMap = textinput.KeyMap{
		CharacterForward:        keys.InputRight,
		CharacterBackward:       keys.InputLeft,
		LineStart:               keys.InputHome,
		LineEnd:                 keys.InputEnd,
		DeleteCharacterBackward: keys.InputBackspace,
		DeleteCharacterForward:  keys.InputDelete,
		// The other actions (words, clipboard, suggestions) have no
		// key: the keys stay those the help screen lists.
	}
	ti.CharLimit = max(limit, utf8.RuneCountInString(value))
	ti.Validate = validate
	ti.Cursor.SetMode(cursor.CursorStatic)
	ti.Focus()
	ti.SetValue(value)
	ti.CursorEnd()
	return inputLine{ti: ti, prompt: prompt, clear: keys.InputClear}
}

// Value is the text typed so far.
func (l inputLine) Value() string { return l.ti.Value() }

// Err is the Validate hook's verdict on the text as it stands (nil
// without a hook).
func (l inputLine) Err() error { return l.ti.Err }

// Refused says why the latest typed or pasted text was not taken ("" when
// it was).
func (l inputLine) Refused() string { return l.refused }

// Update takes one key: an editing key, or typed or pasted text.
func (l inputLine) Update(msg tea.Msg) (inputLine, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return l, nil
	}
	l.refused = ""
	if key.Matches(k, l.clear) {
		l.ti.SetValue("")
		return l, nil
	}
	if k.Type == tea.KeyRunes || k.Type == tea.KeySpace {
		runes := k.Runes
		if k.Type == tea.KeySpace {
			runes = []rune{' '}
		}
		runes = dropControls(runes)
		if len(runes) == 0 {
			return l, nil
		}
		if n := utf8.RuneCountInString(l.ti.Value()) + len(runes); n > l.ti.CharLimit {
			what := "typed"
			if k.Paste || len(runes) > 1 {
				what = "pasted"
			}
			l.refused = fmt.Sprintf("the entry would be %d characters long, expected at most %d; the %s text was not taken", n, l.ti.CharLimit, what)
			return l, nil
		}
		k = tea.KeyMsg{Type: tea.KeyRunes, Runes: runes, Alt: k.Alt, Paste: k.Paste}
	}
	// The cursor is static and the clipboard has no key: textinput
	// returns no command that matters here.
	l.ti, _ = l.ti.Update(k)
	return l, nil
}

// dropControls removes C0, DEL and C1 control characters.
func dropControls(rs []rune) []rune {
	out := rs[:0:0]
	for _, c := range rs {
		if c < ' ' || c >= 0x7f && c < 0xa0 {
			continue
		}
		out = append(out, c)
	}
	return out
}

// View draws prompt, text and cursor within width w, scrolling the text
// so the cursor stays visible. Without colour the cursor is drawn as '|'.
func (l inputLine) View(st *Styles, w int) string {
	if w <= 0 {
		return ""
	}
	value, pos := []rune(l.ti.Value()), l.ti.Position()
	prompt := st.InputLine.Render(l.prompt)
	room := w - visibleWidth(l.prompt) - 1
	if room < 1 {
		return clip(prompt, w, 1)
	}
	start := 0
	if pos > room-1 {
		start = pos - (room - 1)
	}
	end := min(len(value), start+room)
	var b strings.Builder
	b.WriteString(prompt)
	b.WriteString(string(value[start:pos]))
	if st.Color {
		c := " "
		rest := ""
		if pos < end {
			c = string(value[pos])
			rest = string(value[pos+1 : end])
		}
		b.WriteString(st.Selected.Render(c))
		b.WriteString(rest)
	} else {
		b.WriteString("|")
		b.WriteString(string(value[pos:end]))
	}
	return clip(b.String(), w, 1)
}
