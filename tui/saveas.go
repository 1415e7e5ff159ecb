package tui

import (
	"errors"
	"fmt"
	"io/fs"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// saveAsPrompt is the question asked when the session cannot be saved to
// its file (the save failed, or another likewind holds it): the whole
// reason, and an input line for another file. enter reports the file
// typed (sessionFileChosenMsg), esc goes back to the matrix with nothing
// lost (saveAsCancelledMsg), ctrl+c asks the quit question (whose y quits
// without saving); other keys edit the line.
type saveAsPrompt struct {
	frame
	reason string // the whole error text, or why the file is not ours
	failed bool   // a save failed (rather than a read-only session)
	quit   bool   // end the program once saved
	input  inputLine
}

// maxPathEntry is the longest file name the save-as line takes, in
// characters (the usual PATH_MAX); a longer offer is kept whole.
const maxPathEntry = 4096

// openSaveAs asks for another session file. err is the failed save (nil on
// a read-only session); typed is a name to offer again.
func (m *Model) openSaveAs(quit bool, err error, typed string) {
	p := saveAsPrompt{frame: m.fr, quit: quit, failed: err != nil}
	if err != nil {
		p.reason = err.Error()
	} else {
		p.reason = fmt.Sprintf("%s is open in another likewind (%s); this one saves only to another file.", m.sessionPath, m.holder)
	}
	if typed == "" && m.store != nil {
		// When the folder is the trouble, offer the folder likewind was
		// started from; otherwise a new name beside the session file.
		elsewhere := err != nil && (errors.Is(err, fs.ErrPermission) || errors.Is(err, fs.ErrNotExist))
		typed = m.store.Suggest(m.dumpDir, elsewhere)
	}
	p.input = newInputLine(m.fr.keys, "save session to > ", typed, maxPathEntry, nil)
	m.saveAs = p
	m.mode = modeSaveAs
}

// saveAsCmd saves the session to the file the user typed, in a command;
// with quit the program ends once the save succeeded.
func (m *Model) saveAsCmd(typed string, quit bool) tea.Cmd {
	store, s := m.store, m.Session()
	if store == nil {
		m.mode = modeMain
		return nil
	}
	return func() tea.Msg {
		res, err := store.SaveAs(typed, s)
		return savedMsg{res: res, err: err, state: s, quit: quit, typed: typed}
	}
}

// Update answers the question or edits the line.
func (p saveAsPrompt) Update(msg tea.Msg) (saveAsPrompt, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return p, nil
	}
	switch {
	case key.Matches(k, p.keys.Select):
		return p, report(sessionFileChosenMsg{path: p.input.Value(), quit: p.quit})
	case key.Matches(k, p.keys.Back):
		return p, report(saveAsCancelledMsg{})
	case key.Matches(k, p.keys.Interrupt):
		return p, report(quitWantedMsg{})
	}
	p.input, _ = p.input.Update(k)
	return p, nil
}

// ShortHelp is what the panel says about its keys.
func (p saveAsPrompt) ShortHelp() []key.Binding {
	return []key.Binding{p.keys.Select, p.keys.Back, p.keys.Interrupt}
}

// FullHelp lists the same keys.
func (p saveAsPrompt) FullHelp() [][]key.Binding { return [][]key.Binding{p.ShortHelp()} }

// View is the panel of the question at the panel's width; the reason is
// shown whole.
func (p saveAsPrompt) View() string { return p.panel(p.width) }

// PreferredHeight is how many lines the panel takes at width w.
func (p saveAsPrompt) PreferredHeight(w int) int { return lineCount(p.panel(w)) }

// Line is the input line, w cells wide.
func (p saveAsPrompt) Line(w int) string { return p.input.View(p.st, w) }

// panel is the question wrapped to width w.
func (p saveAsPrompt) panel(w int) string {
	st, k := p.st, p.keys
	title := "SESSION NOT SAVED"
	if !p.failed {
		title = "READ-ONLY SESSION"
	}
	then := ""
	if p.quit {
		then = " and quits"
	}
	lines := []string{
		st.Section.Render(title),
		wrapText(st.Error.Render(p.reason), w),
		wrapText("Type a new file for the session on the line below (an existing file is never replaced).", w),
		wrapText(fmt.Sprintf("%s saves there%s · %s back to the matrix, nothing is lost · %s then %s quits without saving",
			k.Select.Help().Key, then, k.Back.Help().Key, k.Interrupt.Help().Key, k.Yes.Help().Key), w),
	}
	if r := p.input.Refused(); r != "" {
		lines = append(lines, wrapText(st.Error.Render(r), w))
	}
	return strings.Join(lines, "\n")
}
