package tui

import (
	"fmt"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// The user's changes: marks, what-if values from the editor, restoring
// the files' values, and undo.

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
	marks := cloneMarks(m.marks)
	added := 0
	for idx := range g.Rows() * g.Cols() {
		var r envelope.Result
		if m.fac < 0 {
			r, _ = m.res.bestAt(idx)
		} else if mp := m.res.maps[m.fac]; mp != nil {
			r = mp.Results[idx]
		}
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
	if m.rv != nil {
		m.rv.changed = true
	}
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
	if m.rv != nil {
		m.rv.changed = true
	}
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

// applyField applies the values the editor read (checked there) as one
// change, undone as one, and recomputes what they change: the grid for a
// flight-side setting, every facility for another setting, the chosen
// facility for its own fields.
func (m *Model) applyField(edits ...whatif.Edit) tea.Cmd {
	if len(edits) == 0 {
		return nil
	}
	hasFac := m.fac >= 0 && m.fac < len(m.facs)
	for _, e := range edits {
		if e.Field.Facility() && !hasFac {
			return nil // the editor opens no facility field without a facility
		}
	}
	first := edits[0].Field
	// The state before the edit, for undo.
	before := undoStep{what: "what-if " + first.Label(first.Facility() && whatif.IsWater(&m.facs[m.fac])), whatIf: true, set: m.set, facs: m.facs, marks: m.marks}
	kind := recomputeOneFac
	var facs []envelope.Facility
	for _, e := range edits {
		switch {
		case e.Field.Facility():
			if facs == nil {
				facs = append([]envelope.Facility(nil), m.facs...)
			}
			e.Field.Set(nil, &facs[m.fac], e.Value)
		case e.Field.Grid():
			e.Field.Set(&m.set, nil, e.Value)
			kind = recomputeGrid
		default:
			e.Field.Set(&m.set, nil, e.Value)
			kind = min(kind, recomputeSolve)
		}
	}
	if facs != nil {
		m.facs = facs
	}
	m.pushStep(before)
	if m.rv != nil {
		m.rv.what = "what-if " + m.describeEdits(edits)
	}
	return m.recompute(kind)
}
