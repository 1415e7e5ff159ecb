package tui

import (
	"errors"
	"fmt"
	"io/fs"
	"path/filepath"
	"sort"
	"strings"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/fileout"
	"likewind/envelope/whatif"
)

// maxDumpTries is how many numbered names the write key tries when a
// file of the first name already exists (two writes within a second).
const maxDumpTries = 100

// writeView writes the text dump of the current view in a command. The
// view is taken now; the clock is read in the command.
func (m *Model) writeView() tea.Cmd {
	if m.dumpDir == "" && m.rv != nil {
		m.setError("this key may not write dumps on the server (the server's authorized keys mark those who may with likewind-dumps)")
		return nil
	}
	if m.dumpDir == "" {
		m.setError("writing the view is not available: no folder was given for it")
		return nil
	}
	if m.busy {
		m.setError("still computing; write the view when the results are in")
		return nil
	}
	in, err := m.DumpInput()
	if err != nil {
		m.setError("view not written: " + err.Error())
		return nil
	}
	dir, clock := m.dumpDir, m.clock
	m.arrays.begin() // the dump reads the results; until Update takes viewWrittenMsg
	return func() tea.Msg {
		path, err := WriteDumpFile(dir, in, clock())
		return viewWrittenMsg{path: path, err: err}
	}
}

// DumpInput describes the current view for Dump (the date left empty):
// the shown facility or the best of all, layer, units, marks, and the
// what-if values that differ from the files. It is what `likewind dump`
// builds from a session saved in this state.
func (m Model) DumpInput() (DumpInput, error) {
	if m.res.grid == nil {
		return DumpInput{}, errors.New("no evaluated grid")
	}
	// The same list `likewind dump --session` gives: the session's
	// what-if values applied to the files' values.
	set := m.fileSet
	facs := append([]envelope.Facility(nil), m.fileFacs...)
	changed, err := whatif.Apply(m.Session().WhatIf, &set, facs)
	if err != nil {
		return DumpInput{}, err
	}
	g := m.res.grid
	idx := make([]int, 0, len(m.marks))
	for k, on := range m.marks {
		if on {
			idx = append(idx, k)
		}
	}
	sort.Ints(idx)
	marks := make([]envelope.GridPoint, 0, len(idx))
	for _, k := range idx {
		marks = append(marks, envelope.GridPoint{Row: k / g.Cols(), Col: k % g.Cols()})
	}
	fac := m.fac
	if fac >= len(m.facs) {
		fac = -1
	}
	return DumpInput{
		Version:    m.version,
		Sources:    append([]string(nil), m.inputs...),
		Grid:       g,
		Maps:       m.res.maps,
		Facilities: m.facs,
		Settings:   m.set,
		Changed:    changed,
		Facility:   fac,
		Layer:      m.layer,
		Units:      m.units,
		Marks:      marks,
	}, nil
}

// WriteDumpFile writes Dump(in) as plain text to a new file in dir named
// after the vehicle, the facility, the layer and the time t, e.g.
// "corvane-sx3_kellen-fold_match-class_20250101-142530.txt", with t's
// date in the header. The file is written atomically and never replaces
// an existing one: when the name is taken a number is added. It returns
// the path written.
func WriteDumpFile(dir string, in DumpInput, t time.Time) (string, error) {
	in.Date = t.Format(time.DateOnly)
	text, err := Dump(in, PlainStyles())
	if err != nil {
		return "", err
	}
	base := filepath.Join(dir, dumpFileStem(in)+"_"+t.Format("20060102-150405"))
	for n := 1; n <= maxDumpTries; n++ {
		path := base + ".txt"
		if n > 1 {
			path = fmt.Sprintf("%s-%d.txt", base, n)
		}
		err := fileout.WriteFileAtomic(path, []byte(text), false)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		if err != nil {
			return "", err
		}
		return path, nil
	}
	return "", fmt.Errorf("write %s.txt: %d files of that name already exist", base, maxDumpTries)
}

// dumpFileStem names a dump by vehicle, facility and layer.
func dumpFileStem(in DumpInput) string {
	veh := "vehicle"
	if in.Grid != nil && in.Grid.Vehicle != nil {
		veh = in.Grid.Vehicle.Name
	}
	fac := "best of all"
	if in.Facility >= 0 && in.Facility < len(in.Facilities) {
		fac = in.Facilities[in.Facility].Name
	}
	return slug(veh, "vehicle") + "_" + slug(fac, "facility") + "_" + slug(in.Layer.String(), "layer")
}

// slugMax caps each part of a dump file name.
const slugMax = 32

// slug turns a name into a file-name part: ASCII letters and digits in
// lower case, every other run of characters one '-', cut at a word end to
// at most slugMax bytes; empty gives def.
func slug(s, def string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(s) {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(r)
			continue
		}
		dash = true
	}
	out := b.String()
	if len(out) > slugMax {
		cut := strings.LastIndexByte(out[:slugMax+1], '-')
		if cut <= 0 {
			cut = slugMax
		}
		out = out[:cut]
	}
	if out == "" {
		return def
	}
	return out
}
