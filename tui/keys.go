package tui

import "github.com/charmbracelet/bubbles/key"

// KeyMap is the one table of key bindings. The short help line, the full
// help overlay and every key test in Update come from it.
type KeyMap struct {
	Up, Down, Left, Right key.Binding
	PageUp, PageDown      key.Binding
	Home, End             key.Binding

	Layer     key.Binding
	Units     key.Binding
	Facility  key.Binding
	PrevFac   key.Binding
	NextFac   key.Binding
	BestOfAll key.Binding

	Edit    key.Binding
	Restore key.Binding
	// ScaleUp and ScaleDown step the what-if model scale (every
	// facility's) from the scale in force on screen (scalekey.go).
	ScaleUp, ScaleDown key.Binding
	// Study opens the model-scale study of the facility on screen
	// (studypanel.go).
	Study key.Binding
	// Undo puts back the state before the latest change of what-if values
	// or marks (R and X included).
	Undo key.Binding

	Mark      key.Binding
	MarkMatch key.Binding
	ClearMark key.Binding

	// Follow and Present work in a review (likewind serve) only: follow
	// the presenter's view, or become the presenter.
	Follow, Present key.Binding

	Save      key.Binding
	WriteView key.Binding
	Help      key.Binding
	Quit      key.Binding

	// Keys inside lists, the input line and the quit question.
	Prev    key.Binding
	Next    key.Binding
	Select  key.Binding
	Back    key.Binding
	Yes     key.Binding
	No      key.Binding
	SaveYes key.Binding
	// SaveElsewhere is SaveYes on a read-only session: it asks for a file.
	SaveElsewhere key.Binding
	// Interrupt quits (asking first) even from the input line.
	Interrupt key.Binding

	// Editing keys of the input line; typed characters are inserted.
	InputLeft, InputRight, InputHome, InputEnd key.Binding
	InputBackspace, InputDelete, InputClear    key.Binding
}

// DefaultKeyMap returns the standard bindings.
func DefaultKeyMap() KeyMap {
	b := func(keys []string, k, desc string) key.Binding {
		return key.NewBinding(key.WithKeys(keys...), key.WithHelp(k, desc))
	}
	return KeyMap{
		Up:            b([]string{"up", "k"}, "↑/k", "altitude up"),
		Down:          b([]string{"down", "j"}, "↓/j", "altitude down"),
		Left:          b([]string{"left", "h"}, "←/h", "speed down"),
		Right:         b([]string{"right", "l"}, "→/l", "speed up"),
		PageUp:        b([]string{"pgup", "ctrl+u"}, "pgup", "page up"),
		PageDown:      b([]string{"pgdown", "ctrl+d"}, "pgdn", "page down"),
		Home:          b([]string{"home", "g"}, "home/g", "first column"),
		End:           b([]string{"end", "G"}, "end/G", "last column"),
		Layer:         b([]string{"tab"}, "tab", "layer"),
		Units:         b([]string{"u"}, "u", "SI/customary"),
		Facility:      b([]string{"f"}, "f", "facility list"),
		PrevFac:       b([]string{"["}, "[", "prev facility"),
		NextFac:       b([]string{"]"}, "]", "next facility"),
		BestOfAll:     b([]string{"b"}, "b", "best of all"),
		Edit:          b([]string{"e"}, "e", "what-if"),
		Restore:       b([]string{"R"}, "R", "file values"),
		ScaleUp:       b([]string{"+", "="}, "+", "scale up"),
		ScaleDown:     b([]string{"-"}, "-", "scale down"),
		Study:         b([]string{"S"}, "S", "scale study"),
		Undo:          b([]string{"U"}, "U", "undo"),
		Mark:          b([]string{" ", "space"}, "space", "mark point"),
		MarkMatch:     b([]string{"M"}, "M", "mark matches"),
		ClearMark:     b([]string{"X"}, "X", "clear marks"),
		Follow:        b([]string{"F"}, "F", "follow presenter"),
		Present:       b([]string{"P"}, "P", "present (editors)"),
		Save:          b([]string{"s", "ctrl+s"}, "s", "save session"),
		WriteView:     b([]string{"w"}, "w", "write view"),
		Help:          b([]string{"?"}, "?", "help"),
		Quit:          b([]string{"q", "ctrl+c"}, "q", "quit"),
		Prev:          b([]string{"up", "k"}, "↑/k", "previous"),
		Next:          b([]string{"down", "j"}, "↓/j", "next"),
		Select:        b([]string{"enter"}, "enter", "choose"),
		Back:          b([]string{"esc"}, "esc", "back"),
		Yes:           b([]string{"y"}, "y", "quit without saving"),
		No:            b([]string{"n", "esc"}, "n/esc", "stay"),
		SaveYes:       b([]string{"s"}, "s", "save and quit"),
		SaveElsewhere: b([]string{"s"}, "s", "save to another file"),
		Interrupt:     b([]string{"ctrl+c"}, "ctrl+c", "quit"),

		InputLeft:      b([]string{"left", "ctrl+b"}, "←", "cursor left"),
		InputRight:     b([]string{"right", "ctrl+f"}, "→", "cursor right"),
		InputHome:      b([]string{"home", "ctrl+a"}, "home", "start of line"),
		InputEnd:       b([]string{"end", "ctrl+e"}, "end", "end of line"),
		InputBackspace: b([]string{"backspace", "ctrl+h"}, "bksp", "delete back"),
		InputDelete:    b([]string{"delete", "ctrl+d"}, "del", "delete"),
		InputClear:     b([]string{"ctrl+u"}, "ctrl+u", "clear line"),
	}
}

// ShortHelp is the key line at the bottom of the main screen.
func (k KeyMap) ShortHelp() []key.Binding {
	return []key.Binding{k.Help, k.Layer, k.Facility, k.Edit, k.Mark, k.Units, k.Save, k.WriteView, k.Quit}
}

// FullHelp is the help overlay, in columns.
func (k KeyMap) FullHelp() [][]key.Binding {
	return [][]key.Binding{
		{k.Up, k.Down, k.Left, k.Right, k.PageUp, k.PageDown, k.Home, k.End},
		{k.Layer, k.Units, k.Facility, k.PrevFac, k.NextFac, k.BestOfAll, k.Study},
		{k.Edit, k.Restore, k.Undo, k.ScaleUp, k.ScaleDown, k.Mark, k.MarkMatch, k.ClearMark},
		{k.Save, k.WriteView, k.Help, k.Quit, k.Select, k.Back},
	}
}

// confirmKeys is the key map of the quit question.
type confirmKeys struct {
	k        *KeyMap
	canSave  bool
	readOnly bool // saving asks for another file
}

func (c confirmKeys) ShortHelp() []key.Binding {
	if c.canSave && c.readOnly {
		return []key.Binding{c.k.SaveElsewhere, c.k.Yes, c.k.No}
	}
	if c.canSave {
		return []key.Binding{c.k.SaveYes, c.k.Yes, c.k.No}
	}
	return []key.Binding{c.k.Yes, c.k.No}
}
func (c confirmKeys) FullHelp() [][]key.Binding { return [][]key.Binding{c.ShortHelp()} }
