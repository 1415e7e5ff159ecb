package tui

import (
	"io"
	"strings"

	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"likewind/envelope"
)

// Styles holds every lipgloss style the interface uses. It is built once,
// by NewStyles or PlainStyles, and never changed afterwards; views only read
// it. Matrix cells use pre-split escape sequences (paint) so that a large
// matrix renders without one lipgloss call per cell.
type Styles struct {
	// Color reports whether the styles emit colour and attributes. With
	// colour off every meaning is still carried by glyphs and text.
	Color bool

	Title     lipgloss.Style // program title in the header
	Header    lipgloss.Style // header line text
	Changed   lipgloss.Style // a what-if value that differs from the files
	Status    lipgloss.Style // one-line status message
	Error     lipgloss.Style // error status message
	Caution   lipgloss.Style // safety and limit cautions
	Label     lipgloss.Style // field labels in the details panel
	Value     lipgloss.Style // field values
	Section   lipgloss.Style // section headings (FLIGHT, FACILITY, ...)
	Faint     lipgloss.Style // secondary text
	Axis      lipgloss.Style // matrix axis lines and labels
	Selected  lipgloss.Style // selected line in lists (picker, editor)
	Panel     lipgloss.Style // border around overlays
	HelpKey   lipgloss.Style // key names in help
	HelpDesc  lipgloss.Style // key descriptions in help
	HelpSep   lipgloss.Style // separators in help
	InputLine lipgloss.Style // the what-if input line

	// Cell styles per layer and level, plus the outside-envelope and
	// cursor variants, as pre-split paints.
	levels  [layerCount][]paint
	levelSt [layerCount][]lipgloss.Style
	outside paint
	outSt   lipgloss.Style
	cursor  [layerCount][]paint
	curOut  paint
	axis    paint
}

// paint is a style reduced to the escape sequences before and after the
// text, so runs of cells can be written straight into a builder.
type paint struct{ pre, post string }

func (p paint) wrap(b *strings.Builder, s string) {
	b.WriteString(p.pre)
	b.WriteString(s)
	b.WriteString(p.post)
}

func paintOf(st lipgloss.Style) paint {
	const probe = "\x1f"
	out := st.Render(probe)
	i := strings.Index(out, probe)
	if i < 0 {
		return paint{}
	}
	return paint{pre: out[:i], post: out[i+len(probe):]}
}

// Palette. These colours are chosen for this program: the match classes
// take the one class palette of envelope (Class.Colour), shared with the
// dumps and the pictures; the regimes a categorical set, and the graded
// layers one sequential ramp (cool to warm). They read on dark and light
// backgrounds alike, so no background detection is needed.
var (
	colNoFacility = "#8C8C8C" // class layer where no facility answers
	colRegime     = []string{
		"#8AB0CF", // incompressible
		"#4F86C9", // subsonic
		"#C9A23A", // transonic
		"#D8743A", // supersonic
		"#B8405E", // hypersonic
		"#9C86C8", // slip
		"#7A62AE", // transitional
		"#5A438F", // free molecular
	}
	colRamp = []string{
		"#4A3E8C", "#3B69AE", "#2E93A3", "#44A86B", "#98BD3E",
		"#DDBF3D", "#E3873A", "#CF4838", "#A93060",
	}
	colOutside = envelope.Outside.Colour()
	colAccent  = "#4F86C9"
	colWarn    = "#D19A1E"
	colDanger  = "#C24A3A"
	colText    = "#B8B8B8"
)

// NewStyles builds the colour styles for the renderer r (its colour
// profile decides how far the palette is reduced; NO_COLOR and dumb
// terminals give no colour). The profile is detected here, once, so that
// views never query the terminal.
func NewStyles(r *lipgloss.Renderer) Styles {
	if r == nil {
		r = lipgloss.NewRenderer(io.Discard)
		r.SetColorProfile(termenv.Ascii)
	}
	color := r.ColorProfile() != termenv.Ascii
	return buildStyles(r, color)
}

// PlainStyles builds styles with colour and attributes disabled; glyphs and
// text carry every meaning. Used for golden files, NO_COLOR and dumps.
func PlainStyles() Styles {
	r := lipgloss.NewRenderer(io.Discard)
	r.SetColorProfile(termenv.Ascii)
	return buildStyles(r, false)
}

func buildStyles(r *lipgloss.Renderer, color bool) Styles {
	ns := r.NewStyle
	fg := func(c string) lipgloss.Style { return ns().Foreground(lipgloss.Color(c)) }
	s := Styles{
		Color:     color,
		Title:     ns().Bold(true).Foreground(lipgloss.Color(colAccent)),
		Header:    fg(colText),
		Changed:   ns().Bold(true).Foreground(lipgloss.Color(colWarn)),
		Status:    fg(colAccent),
		Error:     ns().Bold(true).Foreground(lipgloss.Color(colDanger)),
		Caution:   ns().Foreground(lipgloss.Color(colWarn)),
		Label:     ns().Faint(true),
		Value:     ns(),
		Section:   ns().Bold(true).Underline(true),
		Faint:     ns().Faint(true),
		Axis:      ns().Faint(true),
		Selected:  ns().Reverse(true),
		Panel:     ns().Border(lipgloss.NormalBorder()).BorderForeground(lipgloss.Color(colAccent)).Padding(0, 1),
		HelpKey:   ns().Bold(true),
		HelpDesc:  ns(),
		HelpSep:   ns().Faint(true),
		InputLine: ns().Bold(true),
	}
	s.outSt = fg(colOutside).Faint(true)
	s.outside = paintOf(s.outSt)
	s.curOut = paintOf(s.outSt.Reverse(true).Faint(false))
	s.axis = paintOf(s.Axis)
	for l := Layer(0); l < layerCount; l++ {
		n := len(layerTable(l))
		s.levels[l] = make([]paint, n)
		s.levelSt[l] = make([]lipgloss.Style, n)
		s.cursor[l] = make([]paint, n)
		for k := 0; k < n; k++ {
			st := fg(levelColour(l, k))
			s.levelSt[l][k] = st
			s.levels[l][k] = paintOf(st)
			s.cursor[l][k] = paintOf(st.Reverse(true).Bold(true))
		}
	}
	return s
}

// levelColour picks the colour of level k of layer l.
func levelColour(l Layer, k int) string {
	switch l {
	case LayerClass:
		if c, ok := levelClass(k); ok {
			return c.Colour()
		}
		if k == lvClassNoFacility {
			return colNoFacility
		}
	case LayerRegime:
		if k < len(colRegime) {
			return colRegime[k]
		}
	default:
		// Graded layers: the ramp runs over the graded levels; the
		// special levels (no setting, no limit, over limit) get fixed
		// colours.
		lv := layerTable(l)
		if k < len(lv) {
			switch lv[k].kind {
			case levelNone:
				return colOutside
			case levelOver:
				return colDanger
			}
			return colRamp[rampIndex(lv, k)]
		}
	}
	return colText
}

// rampIndex spreads the graded levels of a table over the colour ramp.
func rampIndex(lv []levelDef, k int) int {
	n, pos := 0, 0
	for i, d := range lv {
		if d.kind == levelGraded {
			if i < k {
				pos++
			}
			n++
		}
	}
	if n <= 1 {
		return 0
	}
	return pos * (len(colRamp) - 1) / (n - 1)
}

// cellPaint returns the paint for a cell of layer l at level k.
func (s *Styles) cellPaint(l Layer, k int, inside, cursor bool) paint {
	if l >= layerCount {
		l = LayerClass
	}
	if !inside {
		if cursor {
			return s.curOut
		}
		return s.outside
	}
	if k < 0 || k >= len(s.levels[l]) {
		return paint{}
	}
	if cursor {
		return s.cursor[l][k]
	}
	return s.levels[l][k]
}

// LevelStyle returns the lipgloss style of level k of layer l, for legends
// drawn outside the matrix.
func (s *Styles) LevelStyle(l Layer, k int) lipgloss.Style {
	if l < layerCount && k >= 0 && k < len(s.levelSt[l]) {
		return s.levelSt[l][k]
	}
	return s.Value
}
