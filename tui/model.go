package tui

import (
	"context"
	"fmt"
	"io"
	"math"
	"strings"
	"sync"
	"time"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/session"
	"likewind/envelope/units"
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
	// the built-in demo) and InputHash their content hash
	// (session.HashFiles); an empty InputHash uses session.DataHash of the
	// loaded data.
	Inputs    []string
	InputHash string

	// SessionFile is the session file the save key and Run write, with
	// its lock (session.Open); nil means SessionPath.
	SessionFile *session.File
	// SessionPath is used when SessionFile is nil: New reads it without a
	// lock, Run opens it with one. Empty (and no SessionFile) means no
	// session file.
	SessionPath string
	// Session is a restored session to apply, or nil. A session saved for
	// other input files is refused with a message on the status line.
	// When the session file holds a session and none is restored, that
	// session is kept beside under a numbered name before the first save.
	Session *session.Session
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
	// (default 80×24). Run takes the terminal's own size where it has one.
	Width, Height int

	// Input and Output are the terminal Run reads keys from and draws on
	// (os.Stdin and os.Stdout when nil).
	Input  io.Reader
	Output io.Writer
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
	modeStudy  // the model-scale study of the facility on screen
)

// Model is the root Bubble Tea model. It owns the data, the what-if values,
// the facility, layer, cursor, marks and units, and composes the matrix,
// legend and help with the panels (details, facility picker, what-if
// editor, save-as question), which share one frame (styles, keys) and get
// their sizes from relayout. Update passes a key to the panel that has the
// keyboard and acts on its report (component.go); View draws the state.
type Model struct {
	fr      frame
	matrix  matrixView
	details detailsView
	legend  legendView
	picker  picker
	editor  editor
	study   studyPanel
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
	// early is the running recompute's points solved first (those on
	// screen when it started), which View draws in place of res while
	// they cover the screen: results that may be read in window earlyWin
	// alone, from recompute earlyGen.
	early    *results
	earlyWin envelope.Window
	earlyGen int
	// rootDraws: the program's root (drawn, under Run) tells a recompute
	// when the frame of its early points is drawn; otherwise (the model
	// run by a Bubble Tea program of its own) Update tells it when it
	// takes them.
	rootDraws bool
	// arrays keeps replaced result arrays for the next recompute (set by
	// Run only; nil: every recompute makes new ones).
	arrays *arrays
	// cancelRun stops the running recompute when a newer one supersedes
	// it (nil: none running).
	cancelRun context.CancelFunc
	// pending is the kind of the running recompute and pendingFac its
	// facility, so a newer request still covers what the one it
	// supersedes would have done.
	pending    recomputeKind
	pendingFac int

	layer   Layer
	units   units.System
	fac     int // chosen facility, -1 = best of all
	lastFac int // facility to return to from best of all
	curI    int // cursor altitude index (0 = lowest)
	curJ    int // cursor speed index
	scrollR int
	scrollC int
	visRows int          // matrix rows on screen at the last layout
	visCols int          // and speed columns
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
	store       *session.File
	sessionPath string
	saved       session.Session
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

	// The model-scale study: the map of the latest request (studyFor)
	// and its generation, and the latest study that came back.
	studyFor *envelope.Map
	studyGen int
	studied  studiedMsg

	dumpDir string
	version string
	clock   func() time.Time

	rv *reviewState // nil but in a review (review.go)
}

// New builds the model and runs the first evaluation synchronously, so the
// first frame already shows results.
func New(opts Options) Model {
	m := newModel(opts)
	var notes statusNotes
	restored := false
	if opts.Session != nil {
		if err := session.Check(*opts.Session, m.inputs, m.hash); err != nil {
			notes.add("session not restored: "+err.Error(), true)
		} else {
			notes.lines = append(notes.lines, m.applySession(*opts.Session))
			restored = true
		}
	}
	m.evaluate(!restored)
	if opts.Session != nil {
		m.restoreSessionPoints(*opts.Session)
	} else {
		m.curI, m.curJ = m.startPoint()
	}
	if m.status != "" { // an evaluation error, or marks dropped
		notes.add(m.status, m.statusErr)
	}
	if opts.SessionNote != "" {
		notes.add(opts.SessionNote, true)
	}
	if m.store != nil {
		if _, ok := m.store.Found(); ok && !restored {
			m.keepOld = true
		}
		m.storeNotes(&notes, opts.SessionFile != nil)
	}
	if len(notes.lines) > 0 {
		m.status, m.statusErr = strings.Join(notes.lines, "; "), notes.err
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

// newModel sets the model up from opts with the files' values: styles,
// keys, components, data, settings and the session file, nothing
// evaluated yet.
func newModel(opts Options) Model {
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
	m.setComponents(fr)
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
		m.hash = session.DataHash(opts.Vehicle, opts.Facilities)
	}
	if len(m.facs) == 0 {
		m.fac = -1
	}
	m.store = opts.SessionFile
	if m.store == nil && opts.SessionPath != "" {
		// Opening without a lock only reads: it cannot fail but on an
		// empty path.
		m.store, _ = session.OpenUnlocked(opts.SessionPath, m.inputs, m.hash)
	}
	if m.store != nil {
		m.sessionPath = m.store.Path()
		m.readOnly, m.holder = m.store.ReadOnly()
	}
	return m
}

// setComponents gives the root and its components the frame fr (styles
// and keys), each component afresh.
func (m *Model) setComponents(fr frame) {
	m.fr = fr
	m.matrix = matrixView{frame: fr}
	m.details = detailsView{frame: fr}
	m.legend = legendView{frame: fr}
	m.picker = picker{frame: fr}
	m.saveAs = saveAsPrompt{frame: fr}
	m.editor = newEditor(fr)
	m.study = studyPanel{frame: fr}
	m.help = newHelpView(fr)
}

// evaluate runs the first evaluation synchronously; with pick it opens on
// the facility with the most full matches (StartFacility).
func (m *Model) evaluate(pick bool) {
	if m.vehicle == nil {
		m.setError("no vehicle loaded")
		return
	}
	r, err := computeGrid(context.Background(), m.vehicle, m.facs, m.set, nil, nil)
	if err != nil {
		m.setError("evaluation failed: " + err.Error())
		return
	}
	m.res = r
	if !pick {
		return
	}
	if k := StartFacility(r.maps); k >= 0 {
		m.fac = k
	}
}

// statusNotes collects the status line at start; err is whether the
// latest note that says so is an error.
type statusNotes struct {
	lines []string
	err   bool
}

func (n *statusNotes) add(s string, isErr bool) { n.lines, n.err = append(n.lines, s), isErr }

// storeNotes adds what the status line says about the session file: held
// by another likewind, not locked (when the caller gave the file, locked),
// or refused and kept.
func (m *Model) storeNotes(notes *statusNotes, locked bool) {
	if m.readOnly {
		notes.add(fmt.Sprintf("read-only: %s is open in another likewind (%s); s saves this session to another file", m.sessionPath, m.holder), true)
	} else if err := m.store.LockError(); err != nil && locked {
		notes.add(fmt.Sprintf("no lock on %s: %v", m.sessionPath, err), true)
	}
	if err := m.store.Refused(); err != nil {
		notes.add(fmt.Sprintf("%s %v; it is kept, and the session will be saved beside it", m.sessionPath, err), true)
	}
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
	// earlyMsg carries the points a running recompute solved first (see
	// Model.early), and the command that waits for the rest. The
	// recompute waits for drawn (up to earlyWait) before it solves the
	// rest, so that the frame of these points is drawn with the
	// processors to itself: whoever puts the frame on screen calls it
	// then (drawn, the program's root), and calling it again does
	// nothing.
	earlyMsg struct {
		gen   int
		res   results
		win   envelope.Window
		next  tea.Cmd
		drawn func()
	}
	// savedMsg reports a session save: the state saved, whether the
	// save was to end the program, and the file name the user typed
	// (save-as).
	savedMsg struct {
		res   session.SaveResult
		err   error
		state session.Session
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
		// The running one is stale: it stops at its next block of rows
		// and leaves both processors to this one.
		m.stopRunning()
	}
	m.gen++
	m.busy = true
	m.pending, m.pendingFac = kind, fac
	if m.rv != nil {
		// In a review the hub computes, once for every reviewer.
		m.rv.compute = true
		return nil
	}
	gen := m.gen
	m.early = nil
	ctx, cancel := context.WithCancel(context.Background())
	m.cancelRun = cancel
	v, facs, set, prev, pool := m.vehicle, m.facs, m.set, m.res, m.arrays
	pool.begin() // until onComputed takes the message
	// The work starts now, beside the frame the runtime draws after this
	// Update, and the command only waits for it: started by the command,
	// it would begin only after that frame. The points on screen are
	// solved first and sent on their own (earlyMsg), so that their frame
	// need not wait for the rest of the grid.
	done := make(chan tea.Msg, 2)
	wait := func() tea.Msg { return <-done }
	e := &early{win: m.screenWindow(earlyMargin), send: func(r results, win envelope.Window) {
		on := make(chan struct{})
		done <- earlyMsg{gen: gen, res: r, win: win, next: wait, drawn: sync.OnceFunc(func() { close(on) })}
		t := time.NewTimer(earlyWait)
		defer t.Stop()
		select {
		case <-on:
			// Drawn: the terminal gets a moment to show it.
			select {
			case <-ctx.Done():
			case <-time.After(settleFrame):
			}
		case <-ctx.Done():
		case <-t.C:
		}
	}}
	go func() {
		defer cancel()
		var r results
		var err error
		switch {
		case kind == recomputeGrid || prev.grid == nil:
			r, err = computeGrid(ctx, v, facs, set, pool, e)
		case kind == recomputeOneFac && fac >= 0:
			r, err = solveOne(ctx, prev, facs, set, fac, pool, e)
		default:
			r, err = solveAll(ctx, prev.grid, facs, set, pool, e)
		}
		done <- computedMsg{gen: gen, res: r, err: err}
	}()
	return wait
}

// earlyWait is the longest a recompute waits for the frame of its early
// points to be drawn before it solves the rest.
const earlyWait = 30 * time.Millisecond

// settleFrame is how long the rest of a recompute waits after the frame
// of its early points is drawn. The terminal reads and shows that frame
// in this moment: on a machine whose processors share one core (as on the
// one the speed figures come from), the rest solved at once took the
// processor from it, and the frame reached the screen 2 to 8 ms later
// (BenchmarkTerminalEdit, docs/SPEED.md). The finished results come this
// much later.
const settleFrame = 2 * time.Millisecond

// earlyMargin is how many rows and columns beyond those on screen are
// solved early on every side, so that a matrix that scrolls a little as
// the results come in (a what-if line added to the header takes a row)
// still shows them all.
const earlyMargin = 4

// screenWindow is the grid points the matrix shows, with margin rows and
// columns more on every side (empty before the first layout): the points
// a recompute solves first.
func (m *Model) screenWindow(margin int) envelope.Window {
	n := m.rows()
	if n == 0 || m.visRows <= 0 || m.visCols <= 0 {
		return envelope.Window{}
	}
	// Display row d shows grid row n-1-d, the highest altitude on top.
	return envelope.Window{
		Rows: envelope.Span{Lo: n - m.scrollR - m.visRows - margin, Hi: n - m.scrollR + margin},
		Cols: envelope.Span{Lo: m.scrollC - margin, Hi: m.scrollC + m.visCols + margin},
	}
}

// shown is the results the screen draws: the early points of the running
// recompute where they hold every point on screen and the cursor, else
// the last finished results.
func (m *Model) shown() *results {
	if e := m.early; e != nil && m.busy && m.earlyGen == m.gen && e.grid != nil && m.res.grid != nil &&
		e.grid.Rows() == m.res.grid.Rows() && e.grid.Cols() == m.res.grid.Cols() {
		on := m.screenWindow(0).Within(e.grid.Rows(), e.grid.Cols())
		w := m.earlyWin
		if w.Has(m.curI, m.curJ) && w.Has(on.Rows.Lo, on.Cols.Lo) && w.Has(on.Rows.Hi-1, on.Cols.Hi-1) {
			return e
		}
	}
	return &m.res
}

// showingEarly reports whether the screen draws the early points of the
// running recompute, which are its final answer there.
func (m *Model) showingEarly() bool { return m.shown() != &m.res }

// stopRunning ends the context of the running recompute, if any.
func (m *Model) stopRunning() {
	if m.cancelRun != nil {
		m.cancelRun()
		m.cancelRun = nil
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
	case earlyMsg:
		if !m.rootDraws {
			msg.drawn()
		}
		if msg.gen == m.gen && m.busy {
			m.early, m.earlyWin, m.earlyGen = &msg.res, msg.win, msg.gen
		}
		cmd = msg.next
	case savedMsg:
		cmd = m.onSaved(msg)
	case viewWrittenMsg:
		m.arrays.end()
		if msg.err != nil {
			m.setError("view not written: " + msg.err.Error())
		} else {
			m.setStatus("view written to " + msg.path)
		}
	case studiedMsg:
		m.arrays.end()
		if msg.gen == m.studyGen {
			m.studied = msg
		}
	case ReviewChangedMsg:
		if m.rv != nil {
			m.takeShared()
		}
	case tea.KeyMsg:
		if m.rv != nil {
			cmd = m.reviewKeys(msg)
		} else {
			cmd = m.onKey(msg)
		}
	}
	m.relayout()
	return m, tea.Batch(cmd, m.studyCmd())
}

func (m *Model) onComputed(msg computedMsg) {
	defer m.arrays.end()
	if msg.gen != m.gen {
		// An older request; a newer one is running. What it made is
		// no one's.
		m.arrays.retire(&msg.res, &m.res)
		return
	}
	m.busy = false
	m.early = nil
	m.cancelRun = nil
	if msg.err != nil {
		m.setError("recompute failed: " + msg.err.Error())
		return
	}
	old := m.res
	m.res = msg.res
	m.arrays.retire(&old, &m.res)
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
	case modeStudy:
		m.study, cmd = m.study.Update(msg)
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
	case matches(msg, k.Study):
		m.mode = modeStudy
		m.syncPanels()
		m.study.Open()
	case matches(msg, k.Restore):
		return m.restoreFiles()
	case matches(msg, k.ScaleUp):
		return m.stepScale(true)
	case matches(msg, k.ScaleDown):
		return m.stepScale(false)
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

// matches is key.Matches for one binding.
func matches(msg tea.KeyMsg, b key.Binding) bool { return key.Matches(msg, b) }

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

// visibleRows is the number of matrix rows on screen, as the last layout
// found it.
func (m *Model) visibleRows() int { return m.visRows }
