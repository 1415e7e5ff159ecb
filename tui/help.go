package tui

import (
	"strings"

	"likewind/envelope"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
)

// ClassHelp defines the match classes on the help screen.
const ClassHelp = "full match = Mach within tolerance and Reynolds number at least (1 - tol) of flight; " +
	"Reynolds short = Mach matched, Reynolds number below; Mach relaxed = Reynolds matched at a Mach " +
	"other than flight (usually higher), both below the compressibility threshold; out of reach = neither."

// helpTextWidth caps the width of the help paragraphs for reading.
const helpTextWidth = 96

// helpView draws the short key line and the full help overlay from the
// one KeyMap.
type helpView struct {
	frame
	h help.Model
	// extra is a further column of keys (a review's follow and present).
	extra []key.Binding
}

func newHelpView(f frame) helpView {
	h := help.New()
	h.ShortSeparator = "  "
	h.FullSeparator = "  "
	h.Ellipsis = "…"
	h.Styles = help.Styles{
		Ellipsis:       f.st.HelpSep,
		ShortKey:       f.st.HelpKey,
		ShortDesc:      f.st.HelpDesc,
		ShortSeparator: f.st.HelpSep,
		FullKey:        f.st.HelpKey,
		FullDesc:       f.st.HelpDesc,
		FullSeparator:  f.st.HelpSep,
	}
	return helpView{frame: f, h: h}
}

// SetSize sets the area and the help model's width.
func (v *helpView) SetSize(w, h int) {
	v.frame.SetSize(w, h)
	v.h.Width = v.width
}

// Short renders one line of key help for the given bindings.
func (v helpView) Short(b []key.Binding) string {
	return clip(v.h.ShortHelpView(b), v.width, 1)
}

// Overlay renders the full help screen. Where the screen is short, the
// closing hint, the blank line, the heading and then the paragraphs other
// than the caution are left out, in that order, so that the keys and the
// caution are always shown whole.
func (v helpView) Overlay() string {
	w := min(v.width, helpTextWidth)
	para := func(title, text string) []string {
		return wrapLines(v.st.HelpKey.Render(title)+" "+text, w, "")
	}
	cols := v.keys.FullHelp()
	if len(v.extra) > 0 {
		cols = append(cols, v.extra)
	}
	keys := strings.Split(v.h.FullHelpView(cols), "\n")
	layers := para("Layers:", "match class, flow regime, Reynolds ratio (model/flight), "+
		"tunnel q and model load as shares of their limits (load where there are balance data), "+
		"flight Mach number. Glyphs differ per value; the legend under the matrix lists them.")
	classes := para("Classes:", ClassHelp)
	whatIf := para("What-if:", "values take units (3 bar, 45 psi, -150 degC, 10 K); scale 1:20, 5% or fit;"+
		" q max none; the rule from a list; + and - step every facility's model scale (1:50, 1:40,"+
		" 1:32...); R restores the files' values, U undoes.")
	var review []string
	if len(v.extra) > 0 {
		review = para("Review:", "what-if values, marks and undo are shared by every reviewer, who made a change"+
			" is on the status line; cursor, layer, units and facility are your own. F follows the presenter"+
			" (P makes an editor the presenter); viewers cannot change the shared work; q leaves, the server"+
			" keeps the session.")
	}
	caution := wrapLines(v.st.Caution.Render("CAUTION")+" "+envelope.SafetyNote, w, "")
	heading := []string{v.st.Section.Render("Keys")}
	blank := []string{""}
	hint := []string{v.st.Faint.Render("? or esc closes this screen")}
	for _, drop := range []*[]string{nil, &hint, &blank, &heading, &whatIf, &layers, &review, &classes} {
		if drop != nil {
			*drop = nil
		}
		var all []string
		for _, part := range [][]string{heading, keys, blank, review, layers, classes, whatIf, caution, hint} {
			all = append(all, part...)
		}
		if len(all) <= v.height || drop == &classes {
			return v.fit(strings.Join(all, "\n"))
		}
	}
	return ""
}
