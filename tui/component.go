package tui

import (
	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/whatif"
)

// component is the shape of the panels the root composes (the facility
// picker, the what-if editor, the details, the save-as question), after
// soft-serve's Component: Bubble Tea's Update and View, the keys it
// answers as a help.KeyMap, and the area the root gives it. The root
// passes a key to the panel that has the keyboard and never handles that
// panel's keys itself; the panel says what the user chose with a report.
type component[T any] interface {
	Update(msg tea.Msg) (T, tea.Cmd)
	View() string
	help.KeyMap
	SetSize(width, height int)
}

// A further panel plugs in as the model-scale study does
// (studypanel.go): a component, a mode in model.go with the key that
// opens it in KeyMap, its case in bodyView, lowerPreferred and
// setPanelSize (view.go), what it shows given in syncPanels, and its
// reports handled in onReport. Work that takes time (the study) runs in a
// command of the root whose typed message brings the result back.

var (
	_ component[picker]       = (*picker)(nil)
	_ component[editor]       = (*editor)(nil)
	_ component[detailsView]  = (*detailsView)(nil)
	_ component[saveAsPrompt] = (*saveAsPrompt)(nil)
	_ component[studyPanel]   = (*studyPanel)(nil)
)

// The reports of the components: the message of the command a
// component's Update returns.
type (
	// facilityChosenMsg: the picker chose facility fac (-1: best of all).
	facilityChosenMsg struct{ fac int }
	// fieldAppliedMsg: the editor read the values (SI) of edits, parsed
	// and checked together (a fixed rule with the value it holds); the
	// root applies them as one change and recomputes.
	fieldAppliedMsg struct {
		edits []whatif.Edit
	}
	// panelClosedMsg: back to the matrix.
	panelClosedMsg struct{}
	// helpWantedMsg: open the help screen.
	helpWantedMsg struct{}
	// quitWantedMsg: quit, asking first (askQuit).
	quitWantedMsg struct{}
	// restoreWantedMsg and undoWantedMsg: the R and U keys of the editor.
	restoreWantedMsg struct{}
	undoWantedMsg    struct{}
	// sessionFileChosenMsg: the save-as question was answered with path;
	// quit ends the program once the session is saved there.
	sessionFileChosenMsg struct {
		path string
		quit bool
	}
	// saveAsCancelledMsg: the save-as question was closed unanswered.
	saveAsCancelledMsg struct{}
)

// listKey is what a key does in a list of n rows with the pointer on
// sel, the same in the picker and the editor's list: up and down move the
// pointer (wrapping around), esc or closer (the key that opened the list)
// closes it, ? opens the help and q quits, each by its report. ok is false
// for any other key, which the list handles itself.
func listKey(k tea.KeyMsg, keys *KeyMap, closer key.Binding, sel, n int) (next int, cmd tea.Cmd, ok bool) {
	n = max(n, 1)
	switch {
	case key.Matches(k, keys.Prev):
		return (sel - 1 + n) % n, nil, true
	case key.Matches(k, keys.Next):
		return (sel + 1) % n, nil, true
	case key.Matches(k, keys.Back), key.Matches(k, closer):
		return sel, report(panelClosedMsg{}), true
	case key.Matches(k, keys.Help):
		return sel, report(helpWantedMsg{}), true
	case key.Matches(k, keys.Quit):
		return sel, report(quitWantedMsg{}), true
	}
	return sel, nil, false
}

// report is the command whose message is msg.
func report(msg tea.Msg) tea.Cmd { return func() tea.Msg { return msg } }

// takeReport handles the report a component returned, in the same Update
// as the key that caused it: through the runtime it would come after keys
// already typed ahead, which would then reach a panel that is closing.
// Components' commands only report (they do no I/O), so running one here
// costs nothing.
func (m *Model) takeReport(cmd tea.Cmd) tea.Cmd {
	if cmd == nil {
		return nil
	}
	return m.onReport(cmd())
}

// onReport acts on a component's report; it returns nil for any other
// message.
func (m *Model) onReport(msg tea.Msg) tea.Cmd {
	switch r := msg.(type) {
	case facilityChosenMsg:
		m.chooseFacility(r.fac)
		m.mode = modeMain
	case fieldAppliedMsg:
		return m.applyField(r.edits...)
	case panelClosedMsg:
		m.mode = modeMain
	case helpWantedMsg:
		m.mode = modeHelp
	case quitWantedMsg:
		m.mode = modeMain
		return m.askQuit()
	case restoreWantedMsg:
		return m.restoreFiles()
	case undoWantedMsg:
		return m.undoLast()
	case sessionFileChosenMsg:
		return m.saveAsCmd(r.path, r.quit)
	case studyScaleChosenMsg:
		return m.studyScale(r.scale)
	case studyFacilityMsg:
		m.stepStudyFacility(r.step)
	case saveAsCancelledMsg:
		m.mode = modeMain
		m.setError("session not saved; the changes are still here")
	}
	return nil
}
