package tui

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"os"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/session"
	"likewind/envelope/whatif"
)

// Quitting and saving: the quit question, the save key, the outcome of a
// save, and Run, which saves what is left when the program ends otherwise.

func (m *Model) keyConfirm(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	switch {
	case m.store != nil && matches(msg, k.SaveYes):
		if m.readOnly {
			m.openSaveAs(true, nil, "")
			return nil
		}
		return m.saveCmd(true)
	case matches(msg, k.Yes), matches(msg, k.Interrupt):
		m.quitting = true
		m.discard = true
		return tea.Quit
	case matches(msg, k.No):
		m.mode = modeMain
	}
	return nil
}

// askQuit quits, asks first, or saves first. With nothing changed since
// the session was restored, started afresh or last saved, it quits at
// once and writes nothing. With changed what-if values or marks, or on a
// read-only session, it asks. When only the view changed (facility,
// layer, units), it saves and quits; a failed save keeps the program
// open and asks for another file.
func (m *Model) askQuit() tea.Cmd {
	if m.rv != nil {
		// The hub keeps the review's work: leaving loses nothing.
		m.quitting = true
		return tea.Quit
	}
	switch {
	case !m.unsaved(), m.store == nil && !m.hasUnsaved():
		m.quitting = true
		return tea.Quit
	case m.store == nil, m.readOnly, m.hasUnsaved():
		m.mode = modeConfirm
		return nil
	}
	return m.saveCmd(true)
}

// sessionState is the part of a session whose change is worth a write:
// all of it but the cursor (moving alone never rewrites a session).
func sessionState(s session.Session) string {
	s.Cursor, s.Version = nil, session.Version
	b, _ := json.Marshal(s) // numbers and strings: cannot fail
	return string(b)
}

// workState is the work in a session: what-if values and marks.
func workState(s session.Session) string {
	b, _ := json.Marshal(struct {
		W whatif.Changes
		M []session.Point
	}{s.WhatIf, s.Marks})
	return string(b)
}

// unsaved reports whether the state differs from the one last in step
// with the session file (restored, started afresh, or saved).
func (m *Model) unsaved() bool { return sessionState(m.Session()) != sessionState(m.saved) }

// hasUnsaved reports whether quitting now would lose what-if values or
// marks.
func (m *Model) hasUnsaved() bool { return workState(m.Session()) != workState(m.saved) }

// save is the save key: write the session in a command, or, on a
// read-only session, ask for another file.
func (m *Model) save() tea.Cmd {
	if m.rv != nil {
		m.setStatus("the review's session is saved by the server on every change of the shared work: " + m.rv.SessionPath)
		return nil
	}
	if m.store == nil {
		m.setError("no session file was given; nothing saved")
		return nil
	}
	if m.readOnly {
		m.openSaveAs(false, nil, "")
		return nil
	}
	return m.saveCmd(false)
}

// saveCmd saves the current state to the session file in a command; with
// quit the program ends once the save succeeded.
func (m *Model) saveCmd(quit bool) tea.Cmd {
	store, s, keep := m.store, m.Session(), m.keepOld
	return func() tea.Msg {
		res, err := store.Save(s, keep)
		return savedMsg{res: res, err: err, state: s, quit: quit}
	}
}

// onSaved takes a save's outcome. A failure never quits: it shows the whole
// error and asks for another file.
func (m *Model) onSaved(msg savedMsg) tea.Cmd {
	if msg.err != nil {
		m.openSaveAs(msg.quit, msg.err, msg.typed)
		return nil
	}
	m.noteSaved(msg.res, msg.state)
	if m.mode == modeSaveAs || m.mode == modeConfirm {
		m.mode = modeMain
	}
	if msg.quit {
		if m.unsaved() { // changed again while the save ran
			m.mode = modeConfirm
			return nil
		}
		m.quitting = true
		return tea.Quit
	}
	return nil
}

// noteSaved records a successful save.
func (m *Model) noteSaved(res session.SaveResult, state session.Session) {
	m.saved, m.keepOld = state, false
	m.sessionPath, m.readOnly, m.holder = res.Path, false, ""
	line := "session saved to " + res.Path
	if !res.Written {
		line = "session unchanged in " + res.Path
	}
	m.report = append(m.report, line)
	if res.Note != "" {
		m.report = append(m.report, res.Note)
		line += "; " + res.Note
	}
	m.setStatus(line)
}

// SaveReport is what the saves of this run did, one line each, for the
// terminal after the program ends: where the session went, and any file
// kept beside it.
func (m Model) SaveReport() []string { return append([]string(nil), m.report...) }

// SessionPath is the file the session is saved to now ("" without one).
func (m Model) SessionPath() string { return m.sessionPath }

// ErrSessionNotSaved is wrapped by Run's error when the session file could
// not be written on exit.
var ErrSessionNotSaved = errors.New("session not saved")

// Run starts the interactive program on the terminal and blocks until it
// ends. The user's quit saves inside the program (a failed save keeps it
// open). When the program ends otherwise (ctx cancelled: a hang-up or a
// kill) with state not yet saved, Run saves it: to the session file, or,
// on a read-only session, to a new numbered file beside it. Nothing is
// written when nothing changed, when the user chose to quit without
// saving, or when the program could not start. A failed write is reported
// as an error wrapping ErrSessionNotSaved. It returns the final model.
//
// Without opts.SessionFile, Run opens opts.SessionPath with its lock and
// releases it on return.
//
// Run leaves signals to the caller: the caller cancels ctx on SIGHUP,
// SIGTERM and SIGINT. (Bubble Tea's own handler is turned off because, with
// both listening, a signal could make the program quit through ctx while
// the handler still waits to deliver its quit message, and shutdown would
// hang.)
func Run(ctx context.Context, opts Options, progOpts ...tea.ProgramOption) (Model, error) {
	if opts.SessionFile == nil && opts.SessionPath != "" {
		hash := opts.InputHash
		if hash == "" {
			hash = session.DataHash(opts.Vehicle, opts.Facilities)
		}
		sf, err := session.Open(opts.SessionPath, opts.Inputs, hash)
		if err != nil {
			return New(opts), err
		}
		defer sf.Close()
		opts.SessionFile = sf
	}
	in, out := opts.Input, opts.Output
	if in == nil {
		in = os.Stdin
	}
	if out == nil {
		out = os.Stdout
	}
	tt, err := openTerminal(in, out)
	if err != nil {
		return New(opts), err
	}
	defer tt.restore()
	w, h, sized := tt.size()
	if sized {
		opts.Width, opts.Height = w, h
	}
	m := New(opts)
	m.arrays = newArrays()
	// The program draws its own frames (screen.go): Bubble Tea's renderer
	// is off, and with it its handling of the terminal, which tt does.
	scr := newScreen(out)
	if sized {
		scr.resize(w, h)
	}
	all := append([]tea.ProgramOption{tea.WithContext(ctx), tea.WithoutSignalHandler(), tea.WithoutRenderer(),
		tea.WithInput(in), tea.WithOutput(out)}, progOpts...)
	m.rootDraws = true
	p := tea.NewProgram(drawn{m: m, scr: scr}, all...)
	scr.enter()
	stopSizes := tt.sendSizes(p)
	final, err := p.Run()
	stopSizes()
	scr.leave()
	if fd, ok := final.(drawn); ok {
		m = fd.m
	}
	if m.WantsSave() {
		s := m.Session()
		var res session.SaveResult
		var serr error
		if m.readOnly {
			res, serr = m.store.SaveBeside(s)
		} else {
			res, serr = m.store.Save(s, m.keepOld)
		}
		if serr != nil {
			err = errors.Join(err, fmt.Errorf("%w: %w", ErrSessionNotSaved, serr))
		} else {
			m.noteSaved(res, s)
		}
	}
	return m, err
}

// WantsSave reports whether the state must still be written on exit: there
// is a session file, the state differs from the one last in step with it,
// and the user did not choose to quit without saving.
func (m Model) WantsSave() bool { return m.store != nil && !m.discard && m.unsaved() }

// Quitting reports whether the model asked to quit.
func (m Model) Quitting() bool { return m.quitting }
