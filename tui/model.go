package tui

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"
	"time"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
)

// Screen size limits.
const (
	// MinWidth and MinHeight are the smallest usable terminal; below it the
	// screen says so.
	MinWidth  = 56
	MinHeight = 14
	// WideWidth is the width from which details sit beside the matrix
	// rather than below it.
	WideWidth = 110

	minMatrixHeight = matrixOverhead + minMatrixRows
)

// Options configures New.
type Options struct {
	// Vehicle and Facilities are the loaded data (required: a vehicle;
	// facilities may be empty).
	Vehicle    *envelope.Vehicle
	Facilities []envelope.Facility
	// Settings are the files' what-if values; nil means
	// envelope.DefaultSettings(Vehicle).
	Settings *envelope.Settings

	// Inputs are the input file names recorded in the session (empty for
	// the built-in demo) and InputHash their content hash (HashFiles);
	// an empty InputHash uses DataHash of the loaded data.
	Inputs    []string
	InputHash string

	// SessionFile is the session file the save key and Run write, with
	// its lock (OpenSessionFile); nil means SessionPath.
	SessionFile *SessionFile
	// SessionPath is used when SessionFile is nil: New reads it without a
	// lock, Run opens it with one. Empty (and no SessionFile) means no
	// session file.
	SessionPath string
	// Session is a restored session to apply, or nil. A session saved for
	// other input files is refused with a message on the status line.
	// When the session file holds a session and none is restored, that
	// session is kept beside under a numbered name before the first save.
	Session *Session
	// SessionNote is shown on the status line at start (e.g. where the
	// session goes when the usual file could not be used).
	SessionNote string

	// DumpDir is the folder the write-view key puts text dumps of the
	// current view in; empty means the key only says it is unavailable.
	// Version is the tool version the dump header names ("dev" when
	// empty), and Clock gives the dump's date and file-name time
	// (time.Now when nil); it is called in the write command only.
	DumpDir string
	Version string
	Clock   func() time.Time

	// Styles and Keys default to PlainStyles() and DefaultKeyMap().
	Styles *Styles
	Keys   *KeyMap

	// Width and Height are the size before the first resize message
	// (default 80×24).
	Width, Height int
}

// mode is what has the keyboard.
type mode uint8

const (
	modeMain mode = iota
	modeHelp
	modePicker
	modeEdit
	modeConfirm
	modeSaveAs // the session could not be saved (or not there): ask for another file
)

// Model is the root Bubble Tea model. It composes the matrix, details,
// legend, facility picker, what-if editor and help components, which share
// one frame (size, styles, keys). Update dispatches and assigns; View is a
// pure function of the state.
type Model struct {
	fr      frame
	matrix  matrixView
	details detailsView
	legend  legendView
	picker  picker
	editor  editor
	help    helpView

	vehicle  *envelope.Vehicle
	fileFacs []envelope.Facility // as loaded
	facs     []envelope.Facility // with what-if limits
	fileSet  envelope.Settings
	set      envelope.Settings
	setGiven bool // fileSet came from Options.Settings, not the built-in defaults
	res      results
	gen      int  // generation of the latest recompute request
	busy     bool // a recompute is running
	// pending is the kind of the running recompute and pendingFac its
	// facility, so a newer request still covers what the one it
	// supersedes would have done.
	pending    recomputeKind
	pendingFac int

	layer   Layer
	units   Units
	fac     int // chosen facility, -1 = best of all
	lastFac int // facility to return to from best of all
	curI    int // cursor altitude index (0 = lowest)
	curJ    int // cursor speed index
	scrollR int
	scrollC int
	marks   map[int]bool // grid index → marked

	mode      mode
	status    string
	statusErr bool

	// layout
	wide     bool
	tooSmall bool
	headerH  int
	bodyH    int
	legendH  int
	footerH  int
	sideW    int
	lowerH   int

	// The session: the file it is saved to (nil = none), the state last
	// in step with it (restored, or the files' values, or last saved), and
	// whether a session on disk that was not restored must be kept beside
	// before the first save.
	store       *SessionFile
	sessionPath string
	saved       Session
	keepOld     bool
	readOnly    bool         // another likewind holds the session file
	holder      string       // which one
	saveAs      saveAsPrompt // the save-as question (modeSaveAs)
	report      []string     // what the saves did, for the terminal after exit
	discard     bool         // user chose to quit without saving
	quitting    bool
	inputs      []string
	hash        string

	undo []undoStep // what-if and mark changes, newest last

	dumpDir string
	version string
	clock   func() time.Time
}

// New builds the model and runs the first evaluation synchronously, so the
// first frame already shows results.
func New(opts Options) Model {
	st := opts.Styles
	if st == nil {
		p := PlainStyles()
		st = &p
	}
	keys := opts.Keys
	if keys == nil {
		k := DefaultKeyMap()
		keys = &k
	}
	fr := frame{st: st, keys: keys}
	// Names reach the screen: the second wall after the loaders'.
	veh, facs := envelope.CleanVehicle(opts.Vehicle), envelope.CleanFacilities(opts.Facilities)
	m := Model{
		fr:       fr,
		matrix:   matrixView{frame: fr},
		details:  detailsView{frame: fr},
		legend:   legendView{frame: fr},
		picker:   picker{frame: fr},
		saveAs:   saveAsPrompt{frame: fr},
		editor:   newEditor(fr),
		help:     newHelpView(fr),
		vehicle:  veh,
		fileFacs: facs,
		facs:     append([]envelope.Facility(nil), facs...),
		marks:    map[int]bool{},
		inputs:   append([]string(nil), opts.Inputs...),
		hash:     opts.InputHash,
		dumpDir:  opts.DumpDir,
		version:  opts.Version,
		clock:    opts.Clock,
	}
	if m.version == "" {
		m.version = "dev"
	}
	if m.clock == nil {
		m.clock = time.Now
	}
	if opts.Settings != nil {
		m.fileSet = *opts.Settings
		m.setGiven = true
	} else {
		m.fileSet = envelope.DefaultSettings(opts.Vehicle)
	}
	m.set = m.fileSet
	if m.hash == "" {
		m.hash = DataHash(opts.Vehicle, opts.Facilities)
	}
	if len(m.facs) == 0 {
		m.fac = -1
	}
	var notes []string
	notesErr := false
	m.store = opts.SessionFile
	if m.store == nil && opts.SessionPath != "" {
		// Opening without a lock only reads: it cannot fail but on an
		// empty path.
		m.store, _ = openSessionFile(opts.SessionPath, m.inputs, m.hash, false)
	}
	if m.store != nil {
		m.sessionPath = m.store.Path()
		m.readOnly, m.holder = m.store.ReadOnly()
	}
	restored := false
	if opts.Session != nil {
		if err := CheckSession(*opts.Session, m.inputs, m.hash); err != nil {
			notes, notesErr = append(notes, "session not restored: "+err.Error()), true
		} else {
			notes = append(notes, m.applySession(*opts.Session))
			restored = true
		}
	}
	if m.vehicle == nil {
		m.setError("no vehicle loaded")
	} else {
		r, err := computeGrid(m.vehicle, m.facs, m.set)
		if err != nil {
			m.setError("evaluation failed: " + err.Error())
		} else {
			m.res = r
			if !restored {
				if k := StartFacility(r.maps); k >= 0 {
					m.fac = k
				}
			}
		}
	}
	if opts.Session != nil {
		m.restoreSessionPoints(*opts.Session)
	} else {
		m.curI, m.curJ = m.startPoint()
	}
	if m.status != "" { // an evaluation error, or marks dropped
		notes, notesErr = append(notes, m.status), m.statusErr
	}
	if opts.SessionNote != "" {
		notes, notesErr = append(notes, opts.SessionNote), true
	}
	if m.store != nil {
		if _, ok := m.store.Found(); ok && !restored {
			m.keepOld = true
		}
		if m.readOnly {
			notes, notesErr = append(notes, fmt.Sprintf("read-only: %s is open in another likewind (%s); s saves this session to another file", m.sessionPath, m.holder)), true
		} else if err := m.store.LockError(); err != nil && opts.SessionFile != nil {
			notes, notesErr = append(notes, fmt.Sprintf("no lock on %s: %v", m.sessionPath, err)), true
		}
		if err := m.store.Refused(); err != nil {
			notes, notesErr = append(notes, fmt.Sprintf("%s %v; it is kept, and the session will be saved beside it", m.sessionPath, err)), true
		}
	}
	if len(notes) > 0 {
		m.status, m.statusErr = strings.Join(notes, "; "), notesErr
	}
	m.saved = m.Session()
	w, h := opts.Width, opts.Height
	if w <= 0 || h <= 0 {
		w, h = 80, 24
	}
	m.fr.SetSize(w, h)
	m.relayout()
	return m
}

// startPoint picks the inside point nearest the middle of the grid.
func (m *Model) startPoint() (int, int) {
	g := m.res.grid
	if g == nil || g.Rows() == 0 || g.Cols() == 0 {
		return 0, 0
	}
	ci, cj := g.Rows()/2, g.Cols()/2
	bi, bj, bd := ci, cj, math.Inf(1)
	for i := 0; i < g.Rows(); i++ {
		for j := 0; j < g.Cols(); j++ {
			if !g.Inside(i, j) {
				continue
			}
			di := float64(i-ci) / float64(g.Rows())
			dj := float64(j-cj) / float64(g.Cols())
			if d := di*di + dj*dj; d < bd {
				bi, bj, bd = i, j, d
			}
		}
	}
	return bi, bj
}

// Init implements tea.Model.
func (m Model) Init() tea.Cmd { return nil }

// Message types.
type (
	// computedMsg carries a finished recompute.
	computedMsg struct {
		gen int
		res results
		err error
	}
	// savedMsg reports a session save: the state saved, whether the
	// save was to end the program, and the file name the user typed
	// (save-as).
	savedMsg struct {
		res   SaveResult
		err   error
		state Session
		quit  bool
		typed string
	}
	// viewWrittenMsg reports a text dump of the view written to a file.
	viewWrittenMsg struct {
		path string
		err  error
	}
)

// recompute kinds
type recomputeKind uint8

const (
	recomputeGrid   recomputeKind = iota // flight side and every facility
	recomputeSolve                       // every facility on the same grid
	recomputeOneFac                      // only the chosen facility
)

// recompute starts a recompute in a command and returns it. A request
// made while another runs supersedes it, so it takes on the older one's
// work as well: a grid rebuild still pending is never lost to a newer
// one-facility solve on the old grid.
func (m *Model) recompute(kind recomputeKind) tea.Cmd {
	if m.vehicle == nil {
		return nil
	}
	fac := m.fac
	if m.busy {
		kind, fac = mergeRecompute(m.pending, m.pendingFac, kind, fac)
	}
	m.gen++
	m.busy = true
	m.pending, m.pendingFac = kind, fac
	gen := m.gen
	v, facs, set, prev := m.vehicle, m.facs, m.set, m.res
	return func() tea.Msg {
		var r results
		var err error
		switch {
		case kind == recomputeGrid || prev.grid == nil:
			r, err = computeGrid(v, facs, set)
		case kind == recomputeOneFac && fac >= 0:
			r, err = solveOne(prev, facs, set, fac)
		default:
			r, err = solveAll(prev.grid, facs, set)
		}
		return computedMsg{gen: gen, res: r, err: err}
	}
}

// mergeRecompute is the work that covers a pending recompute (a, fa) and
// a new one (b, fb): the grid when either rebuilds it, every facility
// when either solves all or they solve different facilities.
func mergeRecompute(a recomputeKind, fa int, b recomputeKind, fb int) (recomputeKind, int) {
	switch {
	case a == recomputeGrid || b == recomputeGrid:
		return recomputeGrid, fb
	case a == recomputeOneFac && b == recomputeOneFac && fa == fb:
		return recomputeOneFac, fb
	}
	return recomputeSolve, fb
}

// Update implements tea.Model.
func (m Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	var cmd tea.Cmd
	switch msg := msg.(type) {
	case tea.WindowSizeMsg:
		m.fr.SetSize(msg.Width, msg.Height)
	case computedMsg:
		m.onComputed(msg)
	case savedMsg:
		cmd = m.onSaved(msg)
	case viewWrittenMsg:
		if msg.err != nil {
			m.setError("view not written: " + msg.err.Error())
		} else {
			m.setStatus("view written to " + msg.path)
		}
	case tea.KeyMsg:
		cmd = m.onKey(msg)
	}
	m.relayout()
	return m, cmd
}

func (m *Model) onComputed(msg computedMsg) {
	if msg.gen != m.gen {
		return // an older request; a newer one is running
	}
	m.busy = false
	if msg.err != nil {
		m.setError("recompute failed: " + msg.err.Error())
		return
	}
	m.res = msg.res
	m.clampCursor()
}

func (m *Model) setStatus(s string) { m.status, m.statusErr = envelope.CleanLines(s), false }
func (m *Model) setError(s string)  { m.status, m.statusErr = envelope.CleanLines(s), true }

// onKey gives a key to whatever has the keyboard: the matrix, the help
// screen and the quit question are the root's own; a panel (picker,
// editor, save-as question) gets the key itself, and the root acts on
// what the panel reports.
func (m *Model) onKey(msg tea.KeyMsg) tea.Cmd {
	m.syncPanels()
	var cmd tea.Cmd
	switch m.mode {
	case modeHelp:
		return m.keyHelp(msg)
	case modeConfirm:
		return m.keyConfirm(msg)
	case modePicker:
		m.picker, cmd = m.picker.Update(msg)
	case modeEdit:
		m.editor, cmd = m.editor.Update(msg)
	case modeSaveAs:
		m.saveAs, cmd = m.saveAs.Update(msg)
	default:
		return m.keyMain(msg)
	}
	return m.takeReport(cmd)
}

func (m *Model) keyMain(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	m.status = ""
	switch {
	case matches(msg, k.Quit):
		return m.askQuit()
	case matches(msg, k.Help):
		m.mode = modeHelp
	case matches(msg, k.Up):
		m.moveCursor(1, 0)
	case matches(msg, k.Down):
		m.moveCursor(-1, 0)
	case matches(msg, k.Left):
		m.moveCursor(0, -1)
	case matches(msg, k.Right):
		m.moveCursor(0, 1)
	case matches(msg, k.PageUp):
		m.moveCursor(max(m.visibleRows()-1, 1), 0)
	case matches(msg, k.PageDown):
		m.moveCursor(-max(m.visibleRows()-1, 1), 0)
	case matches(msg, k.Home):
		m.moveCursor(0, -m.cols())
	case matches(msg, k.End):
		m.moveCursor(0, m.cols())
	case matches(msg, k.Layer):
		m.layer = m.layer.Next()
	case matches(msg, k.Units):
		m.units = m.units.Toggle()
	case matches(msg, k.Facility):
		m.mode = modePicker
		m.picker.Open(m.fac + 1)
	case matches(msg, k.NextFac):
		m.chooseFacility(m.fac + 1)
	case matches(msg, k.PrevFac):
		m.chooseFacility(m.fac - 1)
	case matches(msg, k.BestOfAll):
		if m.fac >= 0 {
			m.chooseFacility(-1)
		} else {
			m.chooseFacility(m.lastFac)
		}
	case matches(msg, k.Edit):
		m.mode = modeEdit
		m.editor.Open()
	case matches(msg, k.Restore):
		return m.restoreFiles()
	case matches(msg, k.Mark):
		m.toggleMark()
	case matches(msg, k.MarkMatch):
		m.markFullMatches()
	case matches(msg, k.ClearMark):
		if n := len(m.marks); n > 0 {
			m.pushUndo(fmt.Sprintf("clear %d marks", n), false)
			m.marks = map[int]bool{}
			m.setStatus(fmt.Sprintf("%d marks cleared (%s undoes)", n, k.Undo.Help().Key))
		}
	case matches(msg, k.Undo):
		return m.undoLast()
	case matches(msg, k.Save):
		return m.save()
	case matches(msg, k.WriteView):
		return m.writeView()
	}
	return nil
}

func (m *Model) keyHelp(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	switch {
	case matches(msg, k.Back), matches(msg, k.Help):
		m.mode = modeMain
	case matches(msg, k.Quit):
		m.mode = modeMain
		return m.askQuit()
	}
	return nil
}

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

// matches is key.Matches for one binding.
func matches(msg tea.KeyMsg, b key.Binding) bool { return key.Matches(msg, b) }

// askQuit quits, asks first, or saves first. With nothing changed since
// the session was restored, started afresh or last saved, it quits at
// once and writes nothing. With changed what-if values or marks, or on a
// read-only session, it asks. When only the view changed (facility,
// layer, units), it saves and quits; a failed save keeps the program
// open and asks for another file.
func (m *Model) askQuit() tea.Cmd {
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
func sessionState(s Session) string {
	s.Cursor, s.Version = nil, SessionVersion
	b, _ := json.Marshal(s) // numbers and strings: cannot fail
	return string(b)
}

// workState is the work in a session: what-if values and marks.
func workState(s Session) string {
	b, _ := json.Marshal(struct {
		W WhatIf
		M []Point
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
func (m *Model) noteSaved(res SaveResult, state Session) {
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

// chooseFacility selects facility k (-1 = best of all), wrapping around.
func (m *Model) chooseFacility(k int) {
	n := len(m.facs)
	if n == 0 {
		m.fac = -1
		return
	}
	// -1..n-1 cycle
	k = ((k+1)%(n+1)+(n+1))%(n+1) - 1
	if m.fac >= 0 {
		m.lastFac = m.fac
	}
	m.fac = k
	if k >= 0 {
		m.lastFac = k
	}
}

func (m *Model) rows() int {
	if m.res.grid == nil {
		return 0
	}
	return m.res.grid.Rows()
}

func (m *Model) cols() int {
	if m.res.grid == nil {
		return 0
	}
	return m.res.grid.Cols()
}

func (m *Model) moveCursor(di, dj int) {
	m.curI += di
	m.curJ += dj
	m.clampCursor()
}

func (m *Model) clampCursor() {
	m.curI = max(min(m.curI, m.rows()-1), 0)
	m.curJ = max(min(m.curJ, m.cols()-1), 0)
}

func (m *Model) visibleRows() int {
	r, _ := MatrixCapacity(m.matrixInput(), m.matrix.width, m.matrix.height)
	return r
}

// toggleMark marks or unmarks the cursor point.
func (m *Model) toggleMark() {
	g := m.res.grid
	if g == nil || m.rows() == 0 || m.cols() == 0 {
		return
	}
	if !g.Inside(m.curI, m.curJ) {
		m.setError("this point is outside the envelope; not marked")
		return
	}
	idx := g.Index(m.curI, m.curJ)
	marks := cloneMarks(m.marks)
	if marks[idx] {
		m.pushUndo("unmark a point", false)
		delete(marks, idx)
		m.setStatus(fmt.Sprintf("mark removed (%d marked)", len(marks)))
	} else {
		m.pushUndo("mark a point", false)
		marks[idx] = true
		m.setStatus(fmt.Sprintf("point marked (%d marked)", len(marks)))
	}
	m.marks = marks
}

// markFullMatches marks every full-match point of the current facility
// (or of the best facility per point in best-of-all mode).
func (m *Model) markFullMatches() {
	g := m.res.grid
	if g == nil || len(m.res.maps) == 0 {
		m.setError("no facility results to mark")
		return
	}
	var src []envelope.Result
	if m.fac < 0 {
		src = m.res.bestRes
	} else {
		src = m.res.maps[m.fac].Results
	}
	marks := cloneMarks(m.marks)
	added := 0
	for idx, r := range src {
		if r.Class == envelope.FullMatch && !marks[idx] {
			marks[idx] = true
			added++
		}
	}
	if added > 0 {
		m.pushUndo(fmt.Sprintf("mark %d full matches", added), false)
	}
	m.marks = marks
	m.setStatus(fmt.Sprintf("%d full-match points marked (%d marked)", added, len(marks)))
}

func cloneMarks(src map[int]bool) map[int]bool {
	out := make(map[int]bool, len(src)+1)
	for k, v := range src {
		out[k] = v
	}
	return out
}

// restoreFiles puts back the files' values and recomputes.
func (m *Model) restoreFiles() tea.Cmd {
	if !m.whatIfChanged() {
		m.setStatus("what-if values already match the files")
		return nil
	}
	n := len(m.changes())
	m.pushUndo(fmt.Sprintf("restore the files' values (%d what-if values back)", n), true)
	gridChanged := m.set.DeltaT != m.fileSet.DeltaT || m.set.Regimes != m.fileSet.Regimes
	m.set = m.fileSet
	m.facs = append([]envelope.Facility(nil), m.fileFacs...)
	m.setStatus(fmt.Sprintf("files' values restored (%s undoes)", m.fr.keys.Undo.Help().Key))
	if gridChanged {
		return m.recompute(recomputeGrid)
	}
	return m.recompute(recomputeSolve)
}

// maxUndo is how many what-if and mark changes can be undone.
const maxUndo = 200

// undoStep is the state before one change of what-if values or marks.
type undoStep struct {
	what   string
	whatIf bool // what-if values changed (a recompute on undo)
	set    envelope.Settings
	facs   []envelope.Facility
	marks  map[int]bool
}

// pushUndo records the state before a change. The maps and slices are
// never changed in place (every change builds new ones), so holding them
// is enough.
func (m *Model) pushUndo(what string, whatIf bool) {
	m.pushStep(undoStep{what: what, whatIf: whatIf, set: m.set, facs: m.facs, marks: m.marks})
}

func (m *Model) pushStep(st undoStep) {
	n := len(m.undo)
	if n >= maxUndo {
		m.undo = m.undo[n-maxUndo+1:]
		n = len(m.undo)
	}
	// A full slice expression: a copy of the model never shares the
	// appended element.
	m.undo = append(m.undo[:n:n], st)
}

// undoLast puts back the state before the latest change of what-if values
// or marks (R and X included) and recomputes when values changed.
func (m *Model) undoLast() tea.Cmd {
	n := len(m.undo)
	if n == 0 {
		m.setStatus("nothing to undo")
		return nil
	}
	st := m.undo[n-1]
	m.undo = m.undo[: n-1 : n-1]
	gridChanged := m.set.DeltaT != st.set.DeltaT || m.set.Regimes != st.set.Regimes
	m.set, m.facs, m.marks = st.set, st.facs, st.marks
	m.setStatus(fmt.Sprintf("undone: %s (%d marked)", st.what, len(m.marks)))
	switch {
	case gridChanged:
		return m.recompute(recomputeGrid)
	case st.whatIf:
		return m.recompute(recomputeSolve)
	}
	return nil
}

// whatIfChanged reports whether any what-if value differs from the files.
func (m *Model) whatIfChanged() bool {
	return len(m.changes()) > 0
}

// fieldReader reads typed values for the editor in the current units,
// for the chosen facility and against the current settings.
func (m *Model) fieldReader() fieldReader {
	r := fieldReader{units: m.units, set: m.set}
	if m.fac >= 0 && m.fac < len(m.facs) {
		r.fac = &m.facs[m.fac]
	}
	return r
}

// applyField applies the value v the editor read for field f (checked
// there) and recomputes what it changes: the grid for a flight-side
// setting, every facility for another setting, the chosen facility for
// one of its limits.
func (m *Model) applyField(f field, v float64) tea.Cmd {
	d := f.def()
	if d.facility && (m.fac < 0 || m.fac >= len(m.facs)) {
		return nil // the editor opens no limit without a facility
	}
	// The state before the edit, for undo.
	before := undoStep{what: "what-if " + f.label(d.facility && isWater(&m.facs[m.fac])), whatIf: true, set: m.set, facs: m.facs, marks: m.marks}
	kind := recomputeSolve
	switch {
	case d.facility:
		facs := append([]envelope.Facility(nil), m.facs...)
		d.set(nil, &facs[m.fac], v)
		m.facs = facs
		kind = recomputeOneFac
	case d.grid:
		d.set(&m.set, nil, v)
		kind = recomputeGrid
	default:
		d.set(&m.set, nil, v)
	}
	m.pushStep(before)
	return m.recompute(kind)
}

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
			hash = DataHash(opts.Vehicle, opts.Facilities)
		}
		sf, err := OpenSessionFile(opts.SessionPath, opts.Inputs, hash)
		if err != nil {
			return New(opts), err
		}
		defer sf.Close()
		opts.SessionFile = sf
	}
	m := New(opts)
	all := append([]tea.ProgramOption{tea.WithAltScreen(), tea.WithContext(ctx), tea.WithoutSignalHandler()}, progOpts...)
	final, err := tea.NewProgram(m, all...).Run()
	if fm, ok := final.(Model); ok {
		m = fm
	}
	if m.WantsSave() {
		s := m.Session()
		var res SaveResult
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
