package tui

import (
	"fmt"
	"strconv"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// The model-scale keys step the what-if model scale, which applies to
// every facility (envelope.Settings.Scale), starting from the scale in
// force for the facility on screen. The steps are the model ratios 1:N
// with N from a rounded preferred-number series of ten steps a decade,
// about 25 % apart (after ISO 3's R10, rounded so that the usual
// model-shop ratios 1:64 and 1:32 are on it): 1:100, 1:80, 1:64, 1:50,
// 1:40, 1:32, 1:25, 1:20, 1:16, 1:12.5, 1:10 and so on, from 1:10000 up to
// the largest scale a what-if takes (envelope.ModelScaleBound, 10:1).

// smallestRatio is the denominator of the smallest step, 1:10000.
const smallestRatio = 1e4

// scaleMantissas are the ratio denominators of one decade.
var scaleMantissas = [...]string{"1", "1.25", "1.6", "2", "2.5", "3.2", "4", "5", "6.4", "8"}

// scaleLadder is every step, as scales, ascending: computed once.
var scaleLadder = func() []float64 {
	bound := envelope.ModelScaleBound()
	var out []float64
	for e := 4; e >= -2; e-- {
		for k := len(scaleMantissas) - 1; k >= 0; k-- {
			n, _ := strconv.ParseFloat(scaleMantissas[k]+"e"+strconv.Itoa(e), 64)
			if s := 1 / n; s <= bound.Hi && n <= smallestRatio {
				out = append(out, s)
			}
		}
	}
	return out
}()

// stepSlack is the relative difference below which a scale counts as on
// a step already (a scale typed as 0.025 is the step 1:40).
const stepSlack = 1e-9

// scaleStep is the next step above (up) or below scale s; ok is false at
// the end of the ladder.
func scaleStep(s float64, up bool) (float64, bool) {
	if up {
		for _, x := range scaleLadder {
			if x > s*(1+stepSlack) {
				return x, true
			}
		}
		return 0, false
	}
	for k := len(scaleLadder) - 1; k >= 0; k-- {
		if x := scaleLadder[k]; x < s*(1-stepSlack) {
			return x, true
		}
	}
	return 0, false
}

// stepScale is the model-scale key: the what-if scale one step up or
// down from the scale in force (the facility on screen's where no what-if
// scale is set), applied to every facility as an edit of the scale field,
// undone by U.
func (m *Model) stepScale(up bool) tea.Cmd {
	from := m.set.Scale
	if !(from > 0) {
		if m.fac < 0 || m.fac >= len(m.res.maps) || m.res.maps[m.fac] == nil {
			m.setError("choose a facility (f or [ ]) to step from its model scale, or set a model scale for all facilities (e)")
			return nil
		}
		from = m.res.maps[m.fac].Scale
	}
	next, ok := scaleStep(from, up)
	dir, step := "smallest", "down"
	if up {
		dir, step = "largest", "up"
	}
	if !ok {
		m.setError(fmt.Sprintf("model scale %s is the %s step", whatif.Scale.Show(m.units, from, false), dir))
		return nil
	}
	return m.setScale(next, fmt.Sprintf("a step %s from %s", step, whatif.Scale.Show(m.units, from, false)))
}

// setScale applies s as the what-if model scale of every facility, as one
// change undone by U, and says so on the status line with how it was
// chosen.
func (m *Model) setScale(s float64, how string) tea.Cmd {
	if err := whatif.CheckEdits(m.set, nil, whatif.Edit{Field: whatif.Scale, Value: s}); err != nil {
		m.setError(err.Error())
		return nil
	}
	cmd := m.applyField(whatif.Edit{Field: whatif.Scale, Value: s})
	m.setStatus(fmt.Sprintf("model scale %s for all facilities, %s (%s undoes)",
		whatif.Scale.Show(m.units, s, false), how, m.fr.keys.Undo.Help().Key))
	return cmd
}
