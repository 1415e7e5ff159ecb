package tui

import (
	"errors"
	"fmt"
	"io/fs"
	"strings"

	tea "github.com/charmbracelet/bubbletea"
)

// saveAsPrompt is the question asked when the session cannot be saved to
// its file (the save failed, or another likewind holds it): the whole
// reason, and an input line for another file.
type saveAsPrompt struct {
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
	p := saveAsPrompt{quit: quit, failed: err != nil}
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

// keySaveAs: enter saves to the typed file, esc goes back to the matrix
// (nothing is lost), ctrl+c asks the quit question (whose y quits without
// saving); other keys edit the line.
func (m *Model) keySaveAs(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	switch {
	case matches(msg, k.Select):
		store, s, quit, typed := m.store, m.Session(), m.saveAs.quit, m.saveAs.input.Value()
		if store == nil {
			m.mode = modeMain
			return nil
		}
		return func() tea.Msg {
			res, err := store.SaveAs(typed, s)
			return savedMsg{res: res, err: err, state: s, quit: quit, typed: typed}
		}
	case matches(msg, k.Back):
		m.mode = modeMain
		m.setError("session not saved; the changes are still here")
	case matches(msg, k.Interrupt):
		m.mode = modeMain
		return m.askQuit()
	default:
		m.saveAs.input, _ = m.saveAs.input.Update(msg)
	}
	return nil
}

// saveAsPanel is the panel of the save-as question, wrapped to width w:
// the reason is shown whole.
func (m Model) saveAsPanel(w int) string {
	st, k := m.fr.st, m.fr.keys
	title := "SESSION NOT SAVED"
	if !m.saveAs.failed {
		title = "READ-ONLY SESSION"
	}
	then := ""
	if m.saveAs.quit {
		then = " and quits"
	}
	lines := []string{
		st.Section.Render(title),
		wrapText(st.Error.Render(m.saveAs.reason), w),
		wrapText("Type a new file for the session on the line below (an existing file is never replaced).", w),
		wrapText(fmt.Sprintf("%s saves there%s · %s back to the matrix, nothing is lost · %s then %s quits without saving",
			k.Select.Help().Key, then, k.Back.Help().Key, k.Interrupt.Help().Key, k.Yes.Help().Key), w),
	}
	if r := m.saveAs.input.Refused(); r != "" {
		lines = append(lines, wrapText(st.Error.Render(r), w))
	}
	return strings.Join(lines, "\n")
}
