package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// pickerRow is one line of the facility picker.
type pickerRow struct {
	name, info string
	full       float64 // full-match share
	matched    float64 // full match or Mach relaxed
	err        string
	// pending: a recompute is running, and the shares above are those
	// before it; they are shown as not known yet.
	pending bool
}

// picker lists "best of all" and the facilities with their coverage; enter
// chooses one (facilityChosenMsg). The root gives it the rows (SetRows).
type picker struct {
	frame
	rows    []pickerRow
	current int // row of the facility shown
	sel     int // row under the pointer
}

// ShownMark marks, in the facility list, the facility the matrix shows.
// It is no glyph of any layer, so it cannot be read as a match class.
const ShownMark = "✓"

// Open puts the pointer on row sel (0 = best of all).
func (p *picker) Open(sel int) { p.sel = sel }

// SetRows sets the rows and which of them is shown now.
func (p *picker) SetRows(rows []pickerRow, current int) { p.rows, p.current = rows, current }

// Update moves the pointer, chooses, or closes the list.
func (p picker) Update(msg tea.Msg) (picker, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return p, nil
	}
	var cmd tea.Cmd
	if p.sel, cmd, ok = listKey(k, p.keys, p.keys.Facility, p.sel, len(p.rows)); ok {
		return p, cmd
	}
	if key.Matches(k, p.keys.Select) {
		return p, report(facilityChosenMsg{fac: p.sel - 1})
	}
	return p, nil
}

// ShortHelp is the key line while the list is open.
func (p picker) ShortHelp() []key.Binding {
	return []key.Binding{p.keys.Prev, p.keys.Next, p.keys.Select, p.keys.Back}
}

// FullHelp lists the same keys.
func (p picker) FullHelp() [][]key.Binding { return [][]key.Binding{p.ShortHelp()} }

// PreferredHeight is how many lines the list takes at width w, with a
// line to spare.
func (p picker) PreferredHeight(w int) int {
	p.SetSize(w, 1<<20)
	return lineCount(p.View()) + 1
}

// View draws the list.
func (p picker) View() string {
	var b strings.Builder
	b.WriteString(wrapText(p.st.Section.Render("FACILITIES")+" "+
		p.st.Faint.Render("("+ShownMark+" shown)  full match, matched share of envelope"), p.width))
	for k, r := range p.rows {
		pointer, cur := " ", " "
		if k == p.sel {
			pointer = ">"
		}
		if k == p.current {
			cur = ShownMark
		}
		share := fmt.Sprintf("%3.0f%% %3.0f%%", 100*r.full, 100*r.matched)
		if r.pending {
			share = "   …    …"
		}
		if r.err != "" {
			share = "  not solved"
		}
		// The name wraps under itself where it is too long for the row.
		nameW := max(p.width-visibleWidth(share)-5, 8)
		name := wrapLines(r.name, nameW, "  ")
		for n, l := range name {
			text := "    " + l
			if n == 0 {
				text = pointer + cur + " " + padRight(l, nameW) + " " + share
			}
			if k == p.sel {
				text = p.st.Selected.Render(text)
			}
			b.WriteString("\n" + text)
		}
		if r.info != "" && k == p.sel {
			for _, l := range wrapLines(r.info, p.width-4, "") {
				b.WriteString("\n    " + p.st.Faint.Render(l))
			}
		}
		if r.err != "" && k == p.sel {
			for _, l := range wrapLines(r.err, p.width-4, "") {
				b.WriteString("\n    " + p.st.Error.Render(l))
			}
		}
	}
	return p.fit(b.String())
}
