package report

import (
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"

	"likewind/envelope"
)

// ScaleRow is one model scale of one facility's scale study
// (envelope.ScaleStep): one CSV row, one object of a facility's "steps"
// in JSON. Shares are fractions of the inside points (0–1).
type ScaleRow struct {
	// Vehicle and Facility name the row in CSV (JSON nests it).
	Vehicle  string `json:"-" csv:"vehicle"`
	Facility string `json:"-" csv:"facility"`

	Scale Num `json:"model_scale"`
	// Marks lists what is special about the scale, "; " between: "in
	// force", "fit limit", "balance limit", "beyond fit", "beyond
	// balance", "best".
	Marks         string `json:"marks"`
	BeyondFit     bool   `json:"beyond_fit"`
	BeyondBalance bool   `json:"beyond_balance"`

	FullMatch   float64 `json:"full_match"`
	ReShort     float64 `json:"reynolds_short"`
	MachRelaxed float64 `json:"mach_relaxed"`
	NoMatch     float64 `json:"out_of_reach"`
	Matched     float64 `json:"matched"`
	Union       float64 `json:"union_coverage"`
	// Reached counts the inside points with a setting; the reach-ratio
	// quantiles are over them (null when none).
	Reached int `json:"points_with_setting"`
	ReP10   Num `json:"reach_ratio_p10"`
	ReP50   Num `json:"reach_ratio_p50"`
	ReP90   Num `json:"reach_ratio_p90"`
}

// ScaleFacility is one facility's study.
type ScaleFacility struct {
	Facility string `json:"facility"`
	Medium   string `json:"medium"`
	// Error says why the facility has no study ("" when it has one).
	Error     string `json:"error,omitempty"`
	Scale     Num    `json:"model_scale"`
	ScaleRule string `json:"scale_rule"`
	// FitScale is the largest scale the section takes (null: unknown).
	FitScale Num    `json:"fit_scale"`
	FitRule  string `json:"fit_rule"`
	// BalanceChecked says the vehicle's load data and the facility's
	// balance capacity are set; BalanceScale is then the largest scale the
	// balance takes at every point it lets be a full match (null where no
	// point is: BalanceOpen 0), with the counts of BalanceScaleEnvelope.
	BalanceChecked bool `json:"balance_checked"`
	BalanceScale   Num  `json:"balance_scale"`
	BalanceOpen    int  `json:"balance_open_points"`
	BalanceClosed  int  `json:"balance_closed_points"`
	// BestScale is the scale with the highest matched share within both
	// limits (the smallest on a tie; null when no step within them
	// matches any point).
	BestScale   Num        `json:"best_scale"`
	BestMatched float64    `json:"best_matched"`
	Steps       []ScaleRow `json:"steps"`
}

// ScaleVehicle is the study of one vehicle in every facility.
type ScaleVehicle struct {
	Vehicle    string          `json:"vehicle"`
	Source     string          `json:"source"`
	GridRows   int             `json:"grid_rows"`
	GridCols   int             `json:"grid_cols"`
	Inside     int             `json:"inside_points"`
	Settings   ExportSettings  `json:"settings"`
	Facilities []ScaleFacility `json:"facilities"`
}

// ScaleBest is one line of the comparison of vehicles: a facility's best
// scale for one vehicle, with its limits.
type ScaleBest struct {
	Facility     string  `json:"facility"`
	Vehicle      string  `json:"vehicle"`
	BestScale    Num     `json:"best_scale"`
	BestMatched  float64 `json:"best_matched"`
	FitScale     Num     `json:"fit_scale"`
	BalanceScale Num     `json:"balance_scale"`
}

// Scales is the model-scale study report of one or more vehicles.
type Scales struct {
	ExportInfo
	Caution string `json:"caution"`
	// Quantiles are the shares at which the reach-ratio quantiles lie.
	Quantiles []float64      `json:"reach_ratio_quantiles"`
	Vehicles  []ScaleVehicle `json:"vehicles"`
	// Comparison lists, with more than one vehicle, each facility's best
	// scale per vehicle (facility by facility).
	Comparison []ScaleBest `json:"comparison,omitempty"`
}

// NewScales studies every evaluated facility of each evaluation (one per
// vehicle, on the same facilities) with options opt. Names pass through
// CleanText.
func NewScales(info ExportInfo, evs []*envelope.Evaluation, opt envelope.StudyOptions) Scales {
	r := Scales{ExportInfo: info, Caution: envelope.PlanningNote, Quantiles: envelope.StudyQuantiles[:], Vehicles: []ScaleVehicle{}}
	for _, e := range evs {
		g := e.Grid
		v := g.Vehicle
		sv := ScaleVehicle{Vehicle: envelope.CleanText(v.Name), Source: envelope.CleanText(v.Source),
			GridRows: g.Rows(), GridCols: g.Cols(), Inside: g.InsideCount(), Settings: exportSettings(e.Settings),
			Facilities: []ScaleFacility{}}
		studies, errs := e.StudyAll(opt)
		for k := range e.Facilities {
			f := &e.Facilities[k]
			sf := ScaleFacility{Facility: envelope.CleanText(f.Name), Medium: f.Medium.String(), Scale: na, FitScale: na,
				BalanceScale: na, BestScale: na, Steps: []ScaleRow{}}
			if studies[k] == nil {
				sf.Error = envelope.CleanText(errs[k].Error())
				sv.Facilities = append(sv.Facilities, sf)
				continue
			}
			sf.fill(studies[k], sv.Vehicle)
			sv.Facilities = append(sv.Facilities, sf)
		}
		r.Vehicles = append(r.Vehicles, sv)
	}
	if len(r.Vehicles) > 1 {
		for k := range r.Vehicles[0].Facilities {
			for _, sv := range r.Vehicles {
				if k >= len(sv.Facilities) {
					continue
				}
				sf := sv.Facilities[k]
				r.Comparison = append(r.Comparison, ScaleBest{Facility: sf.Facility, Vehicle: sv.Vehicle,
					BestScale: sf.BestScale, BestMatched: sf.BestMatched, FitScale: sf.FitScale, BalanceScale: sf.BalanceScale})
			}
		}
	}
	return r
}

// exportSettings is the settings block of the reports.
func exportSettings(s envelope.Settings) ExportSettings {
	out := ExportSettings{ScaleOverride: na, DeltaT: Num(s.DeltaT), MachTol: Num(s.MachTol), ReTol: Num(s.ReTol),
		CompressibilityMach: Num(s.CompressibilityMach)}
	if s.Scale > 0 {
		out.ScaleOverride = Num(s.Scale)
	}
	return out
}

// fill sets the facility's study from st.
func (sf *ScaleFacility) fill(st *envelope.ScaleStudy, vehicle string) {
	sf.Scale, sf.ScaleRule = Num(st.Scale), st.ScaleRule
	if st.FitScale > 0 {
		sf.FitScale, sf.FitRule = Num(st.FitScale), st.FitRule
	}
	sf.BalanceChecked = st.BalanceChecked
	sf.BalanceOpen, sf.BalanceClosed = st.Balance.Open, st.Balance.Closed
	if b, ok := st.BalanceLimit(); ok {
		sf.BalanceScale = Num(b)
	}
	if st.Best >= 0 {
		sf.BestScale, sf.BestMatched = Num(st.Steps[st.Best].Scale), st.Steps[st.Best].Shares.Matched()
	}
	for k, x := range st.Steps {
		sh := x.Shares
		row := ScaleRow{Vehicle: vehicle, Facility: sf.Facility, Scale: Num(x.Scale),
			Marks:     stepMarks(x.Mark, k == st.Best),
			BeyondFit: x.Mark.Has(envelope.MarkBeyondFit), BeyondBalance: x.Mark.Has(envelope.MarkBeyondBalance),
			FullMatch: sh.Share(envelope.FullMatch), ReShort: sh.Share(envelope.ReShort),
			MachRelaxed: sh.Share(envelope.MachRelaxed), NoMatch: sh.Share(envelope.NoMatch), Matched: sh.Matched(),
			Union: x.Union, Reached: x.Reached,
			ReP10: Num(x.ReRatio[0]), ReP50: Num(x.ReRatio[1]), ReP90: Num(x.ReRatio[2])}
		sf.Steps = append(sf.Steps, row)
	}
}

// stepMarks are the words for a step's marks, "; " between.
func stepMarks(m envelope.StepMark, best bool) string {
	var w []string
	for _, x := range []struct {
		mark envelope.StepMark
		word string
	}{{envelope.MarkInForce, "in force"}, {envelope.MarkFitLimit, "fit limit"}, {envelope.MarkBalanceLimit, "balance limit"},
		{envelope.MarkBeyondFit, "beyond fit"}, {envelope.MarkBeyondBalance, "beyond balance"}} {
		if m.Has(x.mark) {
			w = append(w, x.word)
		}
	}
	if best {
		w = append(w, "best")
	}
	return strings.Join(w, "; ")
}

// ratio3 writes a reach ratio with three significant digits, "-" when
// there is none.
func ratio3(x Num) string {
	if !x.Valid() {
		return "-"
	}
	return strconv.FormatFloat(float64(x), 'g', 3, 64)
}

// WriteText writes one block per vehicle, in it one table per facility
// (scale → shares, union, reach-ratio quantiles, marks), then with more
// than one vehicle the comparison of best scales.
func (r Scales) WriteText(w io.Writer) error {
	var b strings.Builder
	for vi, sv := range r.Vehicles {
		if vi > 0 {
			b.WriteString("\n")
		}
		fmt.Fprintf(&b, "Model-scale study of %s: %d×%d grid, %d points inside the envelope\n", sv.Vehicle, sv.GridRows, sv.GridCols, sv.Inside)
		st := sv.Settings
		fmt.Fprintf(&b, "Match: Mach within %s, Reynolds number within %s, Mach relaxed below Mach %s; ΔT %s K\n",
			st.MachTol.String(), pct(float64(st.ReTol)), st.CompressibilityMach.String(), st.DeltaT.String())
		for _, sf := range sv.Facilities {
			b.WriteString("\n")
			writeScaleFacility(&b, sf)
		}
	}
	b.WriteString("\n")
	b.WriteString(wrapWords("Shares are of inside points. union: matched by this facility at the scale shown or by another "+
		"facility at the scale it is evaluated at. reach p10/p50/p90: quantiles (nearest rank) over the points where the "+
		"facility has a setting of the highest model Reynolds number it gives there, at a Mach number within the tolerance "+
		"of flight or where Mach number may be relaxed, over the flight Reynolds number (1 or more: flight reached; a point is "+
		"matched from 1 − the Reynolds tolerance up). Marks: in force, the scale the facility is evaluated at; fit limit, the "+
		"largest model the test section takes by the span and blockage rules; balance limit, the largest the balance takes "+
		"at every point it lets be a full match; beyond: above that limit (shares as if such a model could be run); best, the "+
		"highest matched share within both limits.", 100))
	if len(r.Comparison) > 0 {
		b.WriteString("\nBest scale per vehicle (highest matched share within the fit and balance limits):\n")
		head := []string{"facility", "vehicle", "best scale", "matched", "fit limit", "balance limit"}
		var rows [][]string
		for _, c := range r.Comparison {
			matched := "-"
			if c.BestScale.Valid() {
				matched = pct(c.BestMatched)
			}
			rows = append(rows, []string{c.Facility, c.Vehicle, g3(c.BestScale), matched, g3(c.FitScale), g3(c.BalanceScale)})
		}
		WriteTable(&b, head, rows, func(k int) bool { return k < 2 })
	}
	b.WriteString(wrapWords("Caution: "+r.Caution, 100))
	_, err := io.WriteString(w, b.String())
	return err
}

// writeScaleFacility writes one facility's block.
func writeScaleFacility(b *strings.Builder, sf ScaleFacility) {
	fmt.Fprintf(b, "%s (%s)\n", sf.Facility, sf.Medium)
	if sf.Error != "" {
		fmt.Fprintf(b, "  not studied: %s\n", sf.Error)
		return
	}
	fmt.Fprintf(b, "  scale in force %s (%s)", g3(sf.Scale), sf.ScaleRule)
	if sf.FitScale.Valid() {
		fmt.Fprintf(b, "; section takes up to %s (%s)", g3(sf.FitScale), sf.FitRule)
	} else {
		b.WriteString("; no section fit (no span or frontal area, or no section size)")
	}
	switch {
	case !sf.BalanceChecked:
		b.WriteString("; balance not checked\n")
	case sf.BalanceScale.Valid():
		fmt.Fprintf(b, "; balance takes up to %s\n", g3(sf.BalanceScale))
	default:
		fmt.Fprintf(b, "; balance: no point is a full match within it (%d points shut out)\n", sf.BalanceClosed)
	}
	head := []string{"scale", envelope.FullMatch.String(), envelope.ReShort.String(), envelope.MachRelaxed.String(),
		envelope.NoMatch.String(), "matched", "union", "reach p10", "reach p50", "reach p90", "mark"}
	var rows [][]string
	for _, x := range sf.Steps {
		rows = append(rows, []string{g3(x.Scale), pct(x.FullMatch), pct(x.ReShort), pct(x.MachRelaxed), pct(x.NoMatch),
			pct(x.Matched), pct(x.Union), ratio3(x.ReP10), ratio3(x.ReP50), ratio3(x.ReP90), x.Marks})
	}
	var t strings.Builder
	WriteTable(&t, head, rows, func(k int) bool { return k == len(head)-1 })
	for _, line := range strings.SplitAfter(t.String(), "\n") {
		if line != "" {
			b.WriteString("  " + line)
		}
	}
	within := false
	for _, x := range sf.Steps {
		within = within || !x.BeyondFit && !x.BeyondBalance
	}
	switch {
	case sf.BestScale.Valid():
		fmt.Fprintf(b, "  best within the limits: scale %s, %s matched\n", g3(sf.BestScale), pct(sf.BestMatched))
	case within:
		b.WriteString("  no scale within the limits matches any point\n")
	default:
		b.WriteString("  no scale studied is within the limits\n")
	}
}

// scaleCSV is the CSV column table of ScaleRow (never changed after
// initialisation).
var scaleCSV = newCSVTable[ScaleRow]()

// WriteCSV writes one row per scale per facility per vehicle.
func (r Scales) WriteCSV(w io.Writer) error {
	cw, err := newCSVWriter(w, scaleCSV)
	if err != nil {
		return err
	}
	for _, sv := range r.Vehicles {
		for _, sf := range sv.Facilities {
			for k := range sf.Steps {
				if err := cw.write(&sf.Steps[k], nil); err != nil {
					return err
				}
			}
		}
	}
	return cw.flush()
}

// WriteJSON writes the report as one indented JSON object.
func (r Scales) WriteJSON(w io.Writer) error {
	b, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		return err
	}
	_, err = w.Write(append(b, '\n'))
	return err
}

// Only keeps facility k (by index in file order) of every vehicle, and of
// the comparison.
func (r Scales) Only(k int) Scales {
	out := r
	out.Vehicles = make([]ScaleVehicle, len(r.Vehicles))
	name := ""
	for vi, sv := range r.Vehicles {
		sv.Facilities = nil
		if k >= 0 && k < len(r.Vehicles[vi].Facilities) {
			sv.Facilities = []ScaleFacility{r.Vehicles[vi].Facilities[k]}
			name = sv.Facilities[0].Facility
		}
		out.Vehicles[vi] = sv
	}
	out.Comparison = nil
	for _, c := range r.Comparison {
		if c.Facility == name {
			out.Comparison = append(out.Comparison, c)
		}
	}
	return out
}
