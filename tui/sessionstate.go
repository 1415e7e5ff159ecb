package tui

import (
	"fmt"
	"sort"
	"strings"

	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

// Session returns the state worth keeping: what-if values changed from the
// files, marks, the chosen facility, layer, units and cursor.
func (m Model) Session() session.Session {
	s := session.Session{
		Version: session.Version,
		Inputs:  append([]string(nil), m.inputs...),
		Hash:    m.hash,
		Layer:   m.layer.String(),
		Units:   m.units.String(),
	}
	if m.fac >= 0 && m.fac < len(m.facs) {
		s.Facility = m.facs[m.fac].Name
	} else {
		s.BestOfAll = true
	}
	s.WhatIf = whatif.Diff(m.set, m.fileSet, m.facs, m.fileFacs)
	g := m.res.grid
	if g != nil && g.Cols() > 0 {
		idx := make([]int, 0, len(m.marks))
		for k, on := range m.marks {
			if on {
				idx = append(idx, k)
			}
		}
		sort.Ints(idx)
		for _, k := range idx {
			i, j := k/g.Cols(), k%g.Cols()
			if i < g.Rows() {
				s.Marks = append(s.Marks, session.Point{Altitude: g.Alts[i], Speed: g.Speeds[j]})
			}
		}
		if m.curI < g.Rows() && m.curJ < g.Cols() {
			s.Cursor = &session.Point{Altitude: g.Alts[m.curI], Speed: g.Speeds[m.curJ]}
		}
	}
	return s
}

// applySession takes over the session's choices and what-if values (before
// the first evaluation). It returns a status message.
func (m *Model) applySession(s session.Session) string {
	var notes []string
	if l, err := ParseLayer(s.Layer); err == nil {
		m.layer = l
	} else if s.Layer != "" {
		notes = append(notes, err.Error())
	}
	if u, err := units.Parse(s.Units); err == nil {
		m.units = u
	} else {
		notes = append(notes, err.Error())
	}
	if s.BestOfAll || len(m.facs) == 0 {
		m.fac = -1
	} else if k := m.facilityIndex(s.Facility); k >= 0 {
		m.fac, m.lastFac = k, k
	} else {
		notes = append(notes, fmt.Sprintf("facility %q not found", s.Facility))
	}
	// Unknown facilities and values that are not numbers are left out
	// and named on the status line.
	if _, err := whatif.Apply(s.WhatIf, &m.set, m.facs); err != nil {
		for _, line := range strings.Split(err.Error(), "\n") {
			notes = append(notes, line+" ignored")
		}
	}
	msg := "session restored"
	if len(notes) > 0 {
		msg += "; " + strings.Join(notes, "; ")
	}
	return msg
}

func (m *Model) facilityIndex(name string) int {
	for k, f := range m.facs {
		if f.Name == name {
			return k
		}
	}
	return -1
}

// restoreSessionPoints puts back marks and the cursor on the evaluated
// grid, matching each point to the grid point within half a step.
func (m *Model) restoreSessionPoints(s session.Session) {
	g := m.res.grid
	if g == nil {
		return
	}
	snapped, lost := session.SnapMarks(g, s.Marks)
	marks := make(map[int]bool, len(snapped))
	for _, p := range snapped {
		marks[g.Index(p.Row, p.Col)] = true
	}
	m.marks = marks
	m.curI, m.curJ = m.startPoint()
	if s.Cursor != nil {
		if p, ok := session.SnapPoint(g, *s.Cursor); ok {
			m.curI, m.curJ = p.Row, p.Col
		}
	}
	if lost > 0 && m.status == "" {
		m.status = fmt.Sprintf("%d marks no longer on the grid were dropped", lost)
	}
}
