package tui

import (
	"context"
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

	minMatrixHeight = matrixOverhead + 6
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

	// SessionPath is the session file the save key and Run write; empty
	// means no session file.
	SessionPath string
	// Session is a restored session to apply, or nil. A session saved for
	// other input files is refused with a message on the status line.
	Session *Session

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
	sideW    int
	lowerH   int

	dirty       bool // state changed since the last save
	discard     bool // user chose to quit without saving
	quitting    bool
	sessionPath string
	inputs      []string
	hash        string

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
	m := Model{
		fr:          fr,
		matrix:      matrixView{frame: fr},
		details:     detailsView{frame: fr},
		legend:      legendView{frame: fr},
		picker:      picker{frame: fr},
		editor:      newEditor(fr),
		help:        newHelpView(fr),
		vehicle:     opts.Vehicle,
		fileFacs:    opts.Facilities,
		facs:        append([]envelope.Facility(nil), opts.Facilities...),
		marks:       map[int]bool{},
		sessionPath: opts.SessionPath,
		inputs:      append([]string(nil), opts.Inputs...),
		hash:        opts.InputHash,
		dumpDir:     opts.DumpDir,
		version:     opts.Version,
		clock:       opts.Clock,
	}
	if m.version == "" {
		m.version = "dev"
	}
	if m.clock == nil {
		m.clock = time.Now
	}
	if opts.Settings != nil {
		m.fileSet = *opts.Settings
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
	var sessionMsg string
	restored := false
	if opts.Session != nil {
		if err := CheckSession(*opts.Session, m.inputs, m.hash); err != nil {
			sessionMsg = "session not restored: " + err.Error()
		} else {
			sessionMsg = m.applySession(*opts.Session)
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
	if sessionMsg != "" {
		m.status, m.statusErr = sessionMsg, strings.HasPrefix(sessionMsg, "session not")
	}
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
	// savedMsg reports a session save.
	savedMsg struct {
		path string
		err  error
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
		if msg.err != nil {
			m.setError(msg.err.Error())
		} else {
			m.dirty = false
			m.setStatus("session saved to " + msg.path)
		}
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

func (m *Model) setStatus(s string) { m.status, m.statusErr = s, false }
func (m *Model) setError(s string)  { m.status, m.statusErr = s, true }

// onKey dispatches a key to the mode that has the keyboard.
func (m *Model) onKey(msg tea.KeyMsg) tea.Cmd {
	switch m.mode {
	case modeHelp:
		return m.keyHelp(msg)
	case modePicker:
		return m.keyPicker(msg)
	case modeEdit:
		return m.keyEdit(msg)
	case modeConfirm:
		return m.keyConfirm(msg)
	}
	return m.keyMain(msg)
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
		m.dirty = true
	case matches(msg, k.Units):
		m.units = m.units.Toggle()
		m.dirty = true
	case matches(msg, k.Facility):
		m.mode = modePicker
		m.picker.sel = m.fac + 1
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
		m.editor.err = ""
	case matches(msg, k.Restore):
		return m.restoreFiles()
	case matches(msg, k.Mark):
		m.toggleMark()
	case matches(msg, k.MarkMatch):
		m.markFullMatches()
	case matches(msg, k.ClearMark):
		if n := len(m.marks); n > 0 {
			m.marks = map[int]bool{}
			m.dirty = true
			m.setStatus(fmt.Sprintf("%d marks cleared", n))
		}
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

func (m *Model) keyPicker(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	n := len(m.facs) + 1
	switch {
	case matches(msg, k.Back), matches(msg, k.Facility):
		m.mode = modeMain
	case matches(msg, k.Help):
		m.mode = modeHelp
	case matches(msg, k.Prev):
		m.picker.sel = (m.picker.sel - 1 + n) % n
	case matches(msg, k.Next):
		m.picker.sel = (m.picker.sel + 1) % n
	case matches(msg, k.Select):
		m.chooseFacility(m.picker.sel - 1)
		m.mode = modeMain
	case matches(msg, k.Quit):
		m.mode = modeMain
		return m.askQuit()
	}
	return nil
}

func (m *Model) keyEdit(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	if m.editor.editing {
		switch {
		case matches(msg, k.Select):
			return m.applyEdit()
		case matches(msg, k.Back):
			m.editor.end()
			m.editor.err = ""
		case matches(msg, k.Interrupt):
			m.editor.end()
			return m.askQuit()
		default:
			m.editor.input.update(k, msg)
		}
		return nil
	}
	switch {
	case matches(msg, k.Back), matches(msg, k.Edit):
		m.mode = modeMain
	case matches(msg, k.Help):
		m.mode = modeHelp
	case matches(msg, k.Prev):
		m.editor.sel = (m.editor.sel - 1 + int(fieldCount)) % int(fieldCount)
		m.editor.err = ""
	case matches(msg, k.Next):
		m.editor.sel = (m.editor.sel + 1) % int(fieldCount)
		m.editor.err = ""
	case matches(msg, k.Select):
		f := field(m.editor.sel)
		if f.facilityField() && m.fac < 0 {
			m.editor.err = "choose a facility first (f or [ ])"
			return nil
		}
		row := m.editorRows()[f]
		m.editor.begin(row.label, m.editValue(f))
	case matches(msg, k.Restore):
		return m.restoreFiles()
	case matches(msg, k.Quit):
		m.mode = modeMain
		return m.askQuit()
	}
	return nil
}

func (m *Model) keyConfirm(msg tea.KeyMsg) tea.Cmd {
	k := m.fr.keys
	switch {
	case m.sessionPath != "" && matches(msg, k.SaveYes):
		m.quitting = true
		return tea.Quit
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

// askQuit quits, or asks first when there are unsaved changes.
func (m *Model) askQuit() tea.Cmd {
	if m.hasUnsaved() {
		m.mode = modeConfirm
		return nil
	}
	m.quitting = true
	return tea.Quit
}

// hasUnsaved reports whether quitting now would lose what-if values or
// marks.
func (m *Model) hasUnsaved() bool {
	if !m.dirty {
		return false
	}
	return m.whatIfChanged() || len(m.marks) > 0
}

// save writes the session in a command.
func (m *Model) save() tea.Cmd {
	if m.sessionPath == "" {
		m.setError("no session file was given; nothing saved")
		return nil
	}
	path, s := m.sessionPath, m.Session()
	return func() tea.Msg { return savedMsg{path: path, err: SaveSession(path, s)} }
}

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
	m.dirty = true
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
		delete(marks, idx)
		m.setStatus(fmt.Sprintf("mark removed (%d marked)", len(marks)))
	} else {
		marks[idx] = true
		m.setStatus(fmt.Sprintf("point marked (%d marked)", len(marks)))
	}
	m.marks = marks
	m.dirty = true
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
	m.marks = marks
	if added > 0 {
		m.dirty = true
	}
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
	gridChanged := m.set.DeltaT != m.fileSet.DeltaT || m.set.Regimes != m.fileSet.Regimes
	m.set = m.fileSet
	m.facs = append([]envelope.Facility(nil), m.fileFacs...)
	m.dirty = true
	m.setStatus("files' values restored")
	if gridChanged {
		return m.recompute(recomputeGrid)
	}
	return m.recompute(recomputeSolve)
}

// whatIfChanged reports whether any what-if value differs from the files.
func (m *Model) whatIfChanged() bool {
	return len(m.changes()) > 0
}

// editValue is the text the input line starts with for field f.
func (m *Model) editValue(f field) string {
	u := m.units
	switch f {
	case fieldScale:
		if m.set.Scale > 0 {
			return sig(m.set.Scale, 4)
		}
		return "fit"
	case fieldDeltaT:
		return strings.ReplaceAll(u.DeltaT(m.set.DeltaT), "°F", "degF")
	case fieldMachTol:
		return sig(m.set.MachTol, 3)
	case fieldReTol:
		return sig(m.set.ReTol*100, 3) + " %"
	case fieldCompMach:
		return sig(m.set.CompressibilityMach, 3)
	}
	if m.fac < 0 || m.fac >= len(m.facs) {
		return ""
	}
	fc := m.facs[m.fac]
	switch f {
	case fieldP0Max:
		if fc.Medium.IsGas() {
			return u.Stagnation(fc.PressureMax())
		}
		return u.Pressure(fc.PressureMax())
	case fieldT0Min:
		return strings.ReplaceAll(u.Temp(fc.TemperatureMin()), "°F", "degF")
	case fieldQMax:
		if fc.QMax <= 0 {
			return "none"
		}
		return u.Q(fc.QMax)
	}
	return ""
}

// applyEdit parses the input line and applies it.
func (m *Model) applyEdit() tea.Cmd {
	f := field(m.editor.sel)
	v, err := parseField(f, m.editor.input.Value(), m.units)
	if err != nil {
		m.editor.err = err.Error()
		return nil
	}
	kind := recomputeSolve
	switch f {
	case fieldScale:
		m.set.Scale = v
	case fieldDeltaT:
		m.set.DeltaT = v
		kind = recomputeGrid
	case fieldMachTol:
		m.set.MachTol = v
	case fieldReTol:
		m.set.ReTol = v
	case fieldCompMach:
		if v >= m.set.Regimes.Subsonic {
			m.editor.err = fmt.Sprintf("compressibility Mach must stay below the subsonic bound %.2f", m.set.Regimes.Subsonic)
			return nil
		}
		// The same threshold bounds incompressible flow in the regime
		// layer and the relaxation of Mach number in matching.
		m.set.CompressibilityMach = v
		m.set.Regimes.Incompressible = v
		kind = recomputeGrid
	default:
		if m.fac < 0 || m.fac >= len(m.facs) {
			m.editor.err = "choose a facility first"
			return nil
		}
		facs := append([]envelope.Facility(nil), m.facs...)
		fc := &facs[m.fac]
		switch f {
		case fieldP0Max:
			if v <= fc.PressureMin() {
				m.editor.err = "maximum must be above the minimum " + m.units.Stagnation(fc.PressureMin())
				return nil
			}
			fc.SetPressureMax(v)
		case fieldT0Min:
			if fc.TemperatureMax() > 0 && v >= fc.TemperatureMax() {
				m.editor.err = "minimum must be below the maximum " + m.units.Temp(fc.TemperatureMax())
				return nil
			}
			fc.SetTemperatureMin(v)
		case fieldQMax:
			fc.QMax = v
		}
		m.facs = facs
		kind = recomputeOneFac
	}
	m.editor.end()
	m.editor.err = ""
	m.dirty = true
	return m.recompute(kind)
}

// ErrSessionNotSaved is wrapped by Run's error when the session file could
// not be written on exit.
var ErrSessionNotSaved = errors.New("session not saved")

// Run starts the interactive program on the terminal and blocks until it
// ends. On exit, and also when ctx is cancelled, the session is written to
// opts.SessionPath unless the user chose to quit without saving; a failed
// write is reported as an error wrapping ErrSessionNotSaved. It returns the
// final model.
//
// Run leaves signals to the caller: the caller cancels ctx on SIGHUP,
// SIGTERM and SIGINT. (Bubble Tea's own handler is turned off because, with
// both listening, a signal could make the program quit through ctx while
// the handler still waits to deliver its quit message, and shutdown would
// hang.)
func Run(ctx context.Context, opts Options, progOpts ...tea.ProgramOption) (Model, error) {
	m := New(opts)
	all := append([]tea.ProgramOption{tea.WithAltScreen(), tea.WithContext(ctx), tea.WithoutSignalHandler()}, progOpts...)
	final, err := tea.NewProgram(m, all...).Run()
	if fm, ok := final.(Model); ok {
		m = fm
	}
	if m.WantsSave() {
		if serr := SaveSession(opts.SessionPath, m.Session()); serr != nil {
			err = errors.Join(err, fmt.Errorf("%w: %w", ErrSessionNotSaved, serr))
		}
	}
	return m, err
}

// WantsSave reports whether the session should be written on exit: a
// session file was given and the user did not choose to discard changes.
func (m Model) WantsSave() bool { return m.sessionPath != "" && !m.discard }

// Quitting reports whether the model asked to quit.
func (m Model) Quitting() bool { return m.quitting }
