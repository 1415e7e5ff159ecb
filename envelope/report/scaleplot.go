package report

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"likewind/envelope"
)

// beyondAlpha is the opacity of a study curve above a facility's fit or
// balance limit, where the shares are those of a model that could not be
// run.
const beyondAlpha = 0x60

// ScalesChart draws the model-scale study of vehicle: the matched share
// (full match or Mach relaxed) of inside points against model scale, one
// curve per facility in the facility's colour (studies by facility index
// in file order, as ReMachChart colours them; nil entries are left out),
// lighter above a limit, with each facility's section fit limit (dashed)
// and balance limit (dotted) marked, and its scale in force as a dot. The
// scale axis is logarithmic (the steps are log-spaced).
func ScalesChart(vehicle string, studies []*envelope.ScaleStudy) (*Chart, error) {
	ch := newChart(fmt.Sprintf("%s: matched share against model scale", vehicle),
		"model scale (model size / full size, log scale)", "matched share of inside points (%)")
	ch.plot.X.Tick.Marker = scaleTicks
	lg := math.Log10
	xlo, xhi := math.Inf(1), math.Inf(-1)
	n := 0
	var fitLine, balLine *plotter.Line
	var dotShown *plotter.Scatter
	for k, st := range studies {
		if st == nil || len(st.Steps) == 0 {
			continue
		}
		n++
		col := facilityColor(k)
		var in, out plotter.XYs
		for _, x := range st.Steps {
			p := plotter.XY{X: lg(x.Scale), Y: 100 * x.Shares.Matched()}
			xlo, xhi = math.Min(xlo, p.X), math.Max(xhi, p.X)
			if !x.Mark.Beyond() {
				in = append(in, p)
				continue
			}
			if len(out) == 0 && len(in) > 0 {
				out = append(out, in[len(in)-1]) // join the lighter part on
			}
			out = append(out, p)
		}
		solid := draw.LineStyle{Color: col, Width: vg.Points(1.8)}
		var legendThumb plot.Thumbnailer
		if len(in) > 1 {
			l, err := plotter.NewLine(in)
			if err != nil {
				return nil, fmt.Errorf("scales chart: %w", err)
			}
			l.LineStyle = solid
			ch.plot.Add(l)
			legendThumb = l
		}
		if len(out) > 1 {
			l, err := plotter.NewLine(out)
			if err != nil {
				return nil, fmt.Errorf("scales chart: %w", err)
			}
			l.LineStyle = draw.LineStyle{Color: withAlpha(col, beyondAlpha), Width: vg.Points(1.8)}
			ch.plot.Add(l)
			if legendThumb == nil {
				legendThumb = l
			}
		}
		if legendThumb != nil {
			ch.legend.Add(envelope.CleanText(st.Facility), legendThumb)
		}
		mark := func(scale float64, dashes []vg.Length) *plotter.Line {
			l, err := plotter.NewLine(plotter.XYs{{X: lg(scale), Y: 0}, {X: lg(scale), Y: 100}})
			if err != nil {
				return nil
			}
			l.LineStyle = draw.LineStyle{Color: col, Width: vg.Points(1), Dashes: dashes}
			ch.plot.Add(l)
			return l
		}
		if st.FitScale > 0 {
			if l := mark(st.FitScale, []vg.Length{vg.Points(6), vg.Points(3)}); l != nil && fitLine == nil {
				fitLine = l
			}
		}
		if b, ok := st.BalanceLimit(); ok && b > 0 {
			if l := mark(b, []vg.Length{vg.Points(1.5), vg.Points(2.5)}); l != nil && balLine == nil {
				balLine = l
			}
		}
		for _, x := range st.Steps {
			if !x.Mark.Has(envelope.MarkInForce) {
				continue
			}
			sc, err := plotter.NewScatter(plotter.XYs{{X: lg(x.Scale), Y: 100 * x.Shares.Matched()}})
			if err != nil {
				break
			}
			sc.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(3.5), Shape: draw.CircleGlyph{}}
			ch.plot.Add(sc)
			if dotShown == nil {
				dotShown = sc
			}
		}
	}
	if n == 0 {
		return nil, errors.New("scales chart: no facility could be studied")
	}
	if fitLine != nil {
		ch.legend.Add("section fit limit (dashed, facility colour); lighter curve beyond a limit", grey(fitLine))
	}
	if balLine != nil {
		ch.legend.Add("balance load limit (dotted, facility colour)", grey(balLine))
	}
	if dotShown != nil {
		dot := *dotShown
		dot.GlyphStyle.Color = rgb(0x444444)
		ch.legend.Add("scale in force (dot, facility colour)", &dot)
	}
	ch.plot.X.Min, ch.plot.X.Max = xlo, xhi
	ch.plot.Y.Min, ch.plot.Y.Max = 0, 100
	return ch, nil
}

// grey is a legend thumbnail of l's dash pattern in dark grey (the marks
// take each facility's colour on the chart).
func grey(l *plotter.Line) plot.Thumbnailer {
	g := *l
	g.LineStyle.Color = rgb(0x444444)
	return &g
}

// scaleTicks labels 1, 2 and 5 times each power of ten as decimals (0.01,
// 0.02, 0.05) and leaves the other whole multiples unlabelled.
var scaleTicks = logTicks{label: func(f int, e float64) string {
	if f == 1 || f == 2 || f == 5 {
		return strconv.FormatFloat(float64(f)*math.Pow(10, e), 'g', 3, 64)
	}
	return ""
}}
