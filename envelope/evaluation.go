package envelope

import (
	"context"
	"errors"
	"strings"
)

// Evaluation is a vehicle's grid with every facility solved on it. A
// facility that cannot be solved (no model scale, say) has a nil map and
// its error; the others stay usable.
type Evaluation struct {
	Grid       *Grid
	Facilities []Facility
	Settings   Settings
	Maps       []*Map  // per facility, nil when Errs has the reason
	Errs       []error // per facility
	// Best is the class of the best of all facilities at each point
	// (BestClasses of the maps) when the evaluation was made by
	// EvaluateBest, whose maps keep no Results; nil from Evaluate.
	Best []Class
}

// Evaluate builds the grid of v and solves every facility on it.
func Evaluate(v *Vehicle, facs []Facility, s Settings) (*Evaluation, error) {
	g, err := NewGrid(v, s)
	if err != nil {
		return nil, err
	}
	e := &Evaluation{Grid: g, Facilities: facs, Settings: s,
		Maps: make([]*Map, len(facs)), Errs: make([]error, len(facs))}
	for k := range facs {
		e.Maps[k], e.Errs[k] = Solve(g, &facs[k], s)
	}
	return e, nil
}

// EvaluateBest is Evaluate for a caller that needs of the maps only the
// class of the best of all at each point and each map's own values (its
// facility, settings, scale and reachable Reynolds range), such as a
// picture of the best of all: the facilities are solved one after the
// other into one array of results, each folded into the best of all as it
// is done (the same winners as Best), so that one facility's results are
// held instead of one array per facility. The maps it returns have no
// Results (nil); e.Best has the classes.
func EvaluateBest(v *Vehicle, facs []Facility, s Settings) (*Evaluation, error) {
	g, err := NewGrid(v, s)
	if err != nil {
		return nil, err
	}
	e := &Evaluation{Grid: g, Facilities: facs, Settings: s,
		Maps: make([]*Map, len(facs)), Errs: make([]error, len(facs))}
	best := newBestFold(g.Len())
	var buf []Result
	for k := range facs {
		m, err := SolveReusing(context.Background(), g, &facs[k], s, buf)
		if err != nil {
			e.Errs[k] = err
			continue
		}
		best.add(m.Results)
		buf, m.Results = m.Results, nil
		e.Maps[k] = m
	}
	e.Best = best.class
	return e, nil
}

// Solved returns the maps that exist, in facility order.
func (e *Evaluation) Solved() []*Map {
	var out []*Map
	for _, m := range e.Maps {
		if m != nil {
			out = append(out, m)
		}
	}
	return out
}

// Err joins the errors of the facilities that could not be solved (nil
// when every facility was).
func (e *Evaluation) Err() error { return errors.Join(e.Errs...) }

// Facility returns the index of the facility named name (case-insensitive,
// surrounding space ignored), or -1.
func (e *Evaluation) Facility(name string) int {
	name = strings.TrimSpace(name)
	for k, f := range e.Facilities {
		if strings.EqualFold(f.Name, name) {
			return k
		}
	}
	return -1
}
