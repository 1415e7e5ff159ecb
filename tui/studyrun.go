package tui

import (
	"fmt"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// The root's side of the model-scale study panel: it runs the study of
// the facility on screen in a command whenever the panel is open and the
// facility's map is not the one studied last (the panel was opened, the
// what-if values or the facility changed), gives the panel the result, and
// applies the scale the panel reports.

// studyTarget is the facility on screen with its name and map, or why it
// has none.
func (m *Model) studyTarget() (fac int, name, facErr string, cur *envelope.Map) {
	fac = m.fac
	if fac < 0 || fac >= len(m.facs) {
		return -1, "", "", nil
	}
	name = m.facs[fac].Name
	if fac < len(m.res.maps) {
		cur = m.res.maps[fac]
	}
	if cur == nil && fac < len(m.res.errs) && m.res.errs[fac] != nil {
		facErr = m.res.errs[fac].Error()
	}
	return fac, name, facErr, cur
}

// syncStudy gives the panel the facility on screen and the latest study
// of it, stale where it is of another map than the one on screen or a
// recompute is running.
func (m *Model) syncStudy() {
	fac, name, facErr, cur := m.studyTarget()
	m.study.SetFacility(fac, name, envelope.CleanLines(facErr))
	if r := m.studied; fac >= 0 && r.of != nil && r.fac == fac {
		var err error
		if r.err != nil {
			err = fmt.Errorf("%s", envelope.CleanLines(r.err.Error()))
		}
		m.study.SetStudy(r.of, r.study, err, r.of != cur || m.busy)
	}
}

// studyCmd is the command that studies the facility on screen, when the
// panel is open, no recompute is running and its map was not studied yet;
// nil otherwise. The study reads the map and the others without changing
// them (envelope.StudyMap), and results are never changed in place, so it
// runs beside the interface.
func (m *Model) studyCmd() tea.Cmd {
	if m.mode != modeStudy || m.busy {
		return nil
	}
	fac, _, _, cur := m.studyTarget()
	if cur == nil || cur == m.studyFor {
		return nil
	}
	m.studyFor = cur
	m.studyGen++
	gen, others := m.studyGen, m.res.maps
	m.arrays.begin() // until Update takes studiedMsg
	return func() tea.Msg {
		st, err := envelope.StudyMap(cur, others, envelope.StudyOptions{})
		return studiedMsg{gen: gen, of: cur, fac: fac, study: st, err: err}
	}
}

// studyScale applies the scale of the study's row as the what-if scale of
// every facility, as the + and - keys do.
func (m *Model) studyScale(s float64) tea.Cmd {
	if m.set.Scale == s {
		m.setStatus(fmt.Sprintf("model scale %s is the what-if scale of all facilities already", whatif.Scale.Show(m.units, s, false)))
		return nil
	}
	return m.setScale(s, fmt.Sprintf("from the study of %c", facilityTag(m.fac)))
}

// stepStudyFacility shows the facility step places on (±1), over the
// facilities alone: from best of all, ] goes to the first and [ to the
// last.
func (m *Model) stepStudyFacility(step int) {
	n := len(m.facs)
	if n == 0 {
		return
	}
	k := m.fac + step
	switch {
	case m.fac < 0 && step < 0:
		k = n - 1
	case m.fac < 0:
		k = 0
	}
	m.chooseFacility(((k % n) + n) % n)
}
