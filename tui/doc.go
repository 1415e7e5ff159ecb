// Package tui is the terminal interface of likewind: a keyboard-driven
// view of a vehicle's altitude–speed envelope as a matrix, with the flight
// conditions and the facility answer of the point under the cursor, what-if
// editing of settings and facility limits, marked test points and a
// session that survives restarts. It also holds the matrix renderer, a
// plain function the text dump uses without Bubble Tea.
//
// # Entry points
//
//	New(opts Options) Model
//	    The root Bubble Tea model. New evaluates the grid and every
//	    facility once, synchronously, so the first frame shows results.
//	Run(ctx context.Context, opts Options, progOpts ...tea.ProgramOption) (Model, error)
//	    Runs the program in the alternate screen until the user quits or
//	    ctx is cancelled (the caller cancels it on SIGHUP/SIGTERM). A quit
//	    saves inside the program (a failed save keeps it open and asks for
//	    another file); on cancellation Run saves what was not saved yet.
//	    Nothing is written when nothing changed or the program never
//	    started.
//	OpenSessionFile(path, inputs, hash) (*SessionFile, error)
//	    The session file with its lock (flock on PATH.lock): Refused says
//	    why a file there is not a session of these inputs, ReadOnly that
//	    another likewind holds it, Found the session to offer. Save
//	    re-reads the file first and never writes over what it did not
//	    read; SaveAs and SaveBeside write new files only.
//	(Model) Session() Session, (Model) WantsSave() bool, (Model) SaveReport() []string
//	    The state to keep, whether it still needs writing, and what the
//	    saves did, for callers that run the model themselves.
//	SaveSession(path string, s Session) error   // atomic: temp file + rename, 0600; replaces path
//	LoadSession(path string) (Session, error)
//	CheckSession(s Session, inputs []string, hash string) error
//	HashFiles(paths ...string) (string, error), DataHash(v, facs) string
//	NewStyles(r *lipgloss.Renderer) Styles      // colour by r's profile (NO_COLOR honoured)
//	PlainStyles() Styles                        // no colour; glyphs carry every meaning
//	RenderMatrix(in MatrixInput, st Styles, width, height int) string
//	RenderLegend(in LegendInput, st Styles, width int) string
//	GridView{...}.Matrix() / .Legend()          // renderer inputs from a grid and its maps
//	Dump(in DumpInput, st Styles) (string, error)
//	    The text dump of one view (header, whole matrix, legend) that
//	    `likewind dump` prints and the write key saves; pure, the date
//	    and version come in with DumpInput.
//	(Model) DumpInput() (DumpInput, error)      // the current view, date left empty
//	WriteDumpFile(dir string, in DumpInput, t time.Time) (string, error)
//	ApplyWhatIf(w WhatIf, s *envelope.Settings, facs []envelope.Facility) ([]string, error)
//	SnapPoint(g, p) / SnapMarks(g, pts)         // saved points back onto a grid
//	CheckSessionInputs(s, files, vehicle, facs) // a session for these files or this data
//
// # Screen
//
// A header names the facility (or "best of all"), the layer, the unit
// system and the vehicle, followed by every what-if value that differs
// from its start, with where the start came from (a vehicle or facility
// file, the demo, or a built-in default). The matrix has altitude rows, highest on top, and speed
// columns; each cell is a glyph (with the facility letter in best-of-all
// mode) and a gap; once any point is marked, every cell also has a place
// right after its glyph that shows '*' for a marked test point, so a mark
// reads as part of its own cell. The cursor cell is bracketed, drawn in reverse video, and its row
// and column are marked on the axes ('>' and '^'). Points outside the
// envelope are a faint '.'. When the grid is larger than the screen the
// matrix scrolls under fixed axis labels. Point details sit beside the
// matrix on wide screens (WideWidth columns and more) and below it on
// narrow ones; the legend of the current layer follows, then one line of
// key help (or a status message, the input line or the quit question,
// wrapped over as many lines as they need). Text is wrapped, never cut;
// where a facility name must be shortened it keeps its first words beside
// the facility's letter. Below MinWidth×MinHeight the screen says it is
// too small.
//
// # Keys
//
// The one KeyMap (DefaultKeyMap) feeds the key line, the help screen and
// Update:
//
//	↑/k ↓/j ←/h →/l  move        pgup/pgdn  page       home/g end/G  first/last column
//	tab  next layer               u  SI/customary units
//	f    facility list            [ ]  previous/next facility    b  best of all
//	e    what-if editor           R  restore the files' values    U  undo
//	space  mark/unmark point      M  mark every full match       X  clear marks
//	s    save session             w  write view to a text file   ?  help
//	q    quit (asks when unsaved)
//
// U undoes the latest change of what-if values or marks (R and X
// included), one step per press.
//
// The write key saves the text dump of the current view (facility or best
// of all, layer, units, what-if values, marks) to a new file in
// Options.DumpDir named after vehicle, facility, layer and the time, and
// shows its path; it never replaces a file.
//
// In lists ↑/↓ (or k/j) move, enter chooses, esc closes. What-if values
// take units ("3 bar", "45 psi", "-150 degC", "10 K"); a bare number takes
// the field's unit in the current unit system.
//
// # Layers
//
// Match class (default), flow regime, Reynolds ratio model/flight on a
// graded scale, tunnel dynamic pressure as a share of its limit, and flight
// Mach number. Each level has its own glyph as well as its own colour.
//
// # Recompute
//
// Facility limit edits re-run envelope.Solve for that facility only (and
// update the best-of-all answer incrementally); scale and tolerance edits
// re-run Solve for every facility; ΔT and compressibility-threshold edits
// rebuild the grid as well. The work runs in a tea.Cmd that returns a
// typed message; a newer request supersedes an older one.
//
// Results are planning estimates. Pressure vessels, cryogenic nitrogen and
// model loads need the facility's own procedures, local codes and licensed
// engineering practice.
package tui
