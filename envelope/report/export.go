package report

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"

	"likewind/envelope"
)

// Num is a float64 that is written as null in JSON (and as an empty field
// in CSV) when it is not a finite number. The exports use NaN for "does not
// apply", e.g. the stagnation pressure of a water tunnel.
type Num float64

// na is the "does not apply" value of a Num.
var na = Num(math.NaN())

// Valid reports whether x is a finite number.
func (x Num) Valid() bool { return !math.IsNaN(float64(x)) && !math.IsInf(float64(x), 0) }

// MarshalJSON writes the shortest decimal form that reads back to the
// same float64, or null.
func (x Num) MarshalJSON() ([]byte, error) {
	if !x.Valid() {
		return []byte("null"), nil
	}
	return strconv.AppendFloat(nil, float64(x), 'g', -1, 64), nil
}

// UnmarshalJSON reads a number, or null as NaN.
func (x *Num) UnmarshalJSON(b []byte) error {
	if string(b) == "null" {
		*x = na
		return nil
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return fmt.Errorf("number: %w", err)
	}
	*x = Num(v)
	return nil
}

// String is the CSV form: the shortest round-trip decimal, or "".
func (x Num) String() string {
	if !x.Valid() {
		return ""
	}
	return strconv.FormatFloat(float64(x), 'g', -1, 64)
}

// ExportRecord is one grid point inside the envelope as answered by one
// facility, at full precision (from Map.Detail), all in SI units. The JSON
// keys are also the CSV column names, in field order. Quantities that do
// not apply (a water tunnel's Mach number, a setting that does not exist)
// are null in JSON and empty in CSV.
type ExportRecord struct {
	Facility string `json:"facility"`
	Medium   string `json:"medium"`
	Row      int    `json:"row"` // grid row, 0 = lowest altitude
	Col      int    `json:"col"` // grid column, 0 = slowest

	// Grid point.
	Altitude      Num    `json:"altitude_m"`
	AltitudeKind  string `json:"altitude_kind"`
	GridSpeed     Num    `json:"grid_speed"` // Mach number or m/s, per grid_speed_kind
	GridSpeedKind string `json:"grid_speed_kind"`

	// Flight state (atmosphere on the grid's day).
	PressureAltitude   Num `json:"pressure_altitude_m"`
	DeltaT             Num `json:"delta_t_k"`
	Temperature        Num `json:"temperature_k"`
	Pressure           Num `json:"pressure_pa"`
	Density            Num `json:"density_kg_m3"`
	SpeedOfSound       Num `json:"speed_of_sound_m_s"`
	Viscosity          Num `json:"viscosity_pa_s"`
	KinematicViscosity Num `json:"kinematic_viscosity_m2_s"`
	MeanFreePath       Num `json:"mean_free_path_m"`

	// Flight speeds and similarity numbers.
	Mach              Num    `json:"mach"`
	TAS               Num    `json:"tas_m_s"`
	EAS               Num    `json:"eas_m_s"`
	CAS               Num    `json:"cas_m_s"`
	Q                 Num    `json:"dynamic_pressure_pa"`
	Reynolds          Num    `json:"reynolds"`
	ReynoldsPerM      Num    `json:"reynolds_per_m"`
	Knudsen           Num    `json:"knudsen"`
	FlightT0          Num    `json:"flight_t0_k"`
	FlightP0          Num    `json:"flight_p0_pa"`
	SpeedRegime       string `json:"speed_regime"`
	RarefactionRegime string `json:"rarefaction_regime"`

	// Settings in force.
	Scale               Num `json:"model_scale"`
	ModelLength         Num `json:"model_length_m"`
	MachTol             Num `json:"mach_tol"`
	ReTol               Num `json:"re_tol"`
	CompressibilityMach Num `json:"compressibility_mach"`

	// Match.
	Class            string `json:"class"`
	Limit            string `json:"limit"`
	PressureLimit    string `json:"pressure_side_limit"`
	TemperatureLimit string `json:"temperature_side_limit"`
	Flags            string `json:"flags"`
	HasSettings      bool   `json:"has_settings"`

	// Facility settings and test-section state. Gas: test Mach number,
	// stagnation pressure and temperature. Water: water temperature and
	// speed; the static pressure is test_static_pressure_pa.
	TestMach          Num `json:"test_mach"`
	P0                Num `json:"p0_pa"`
	T0                Num `json:"t0_k"`
	WaterTemperature  Num `json:"water_temperature_k"`
	TestPressure      Num `json:"test_static_pressure_pa"`
	TestTemperature   Num `json:"test_static_temperature_k"`
	TestSpeed         Num `json:"test_speed_m_s"`
	TestQ             Num `json:"test_dynamic_pressure_pa"`
	TestDensity       Num `json:"test_density_kg_m3"`
	TestViscosity     Num `json:"test_viscosity_pa_s"`
	ModelReynolds     Num `json:"model_reynolds"`
	ReynoldsRatio     Num `json:"reynolds_ratio"`
	ModelReynoldsPerM Num `json:"model_reynolds_per_m"`
	DeltaCf           Num `json:"delta_cf"`
	ReMaxAtTestMach   Num `json:"max_reynolds_at_test_mach"`
	ReSweepMin        Num `json:"reynolds_sweep_min"`
	ReSweepMax        Num `json:"reynolds_sweep_max"`
	MinT0Condensation Num `json:"min_t0_condensation_k"`
	VapourPressure    Num `json:"vapour_pressure_pa"`
	Cavitation        Num `json:"cavitation_number"`

	// Operating rule in force (envelope.RuleInForce): its name as the
	// facility files write it ("warmest", "least load", "fixed
	// temperature", "fixed q") and the value a fixed rule holds (T0 or
	// water temperature, test-section q).
	Rule            string `json:"rule"`
	RuleTemperature Num    `json:"rule_temperature_k"`
	RuleQ           Num    `json:"rule_q_pa"`

	// Matching set at the test Mach number (envelope.MatchingSet): the
	// Reynolds number every setting of the set gives and the span of its
	// settings from the cold end to the warm end. Gas: T0 and p0; water:
	// water temperature and speed; both: q. Each span is written low to
	// high; set_cold_limit and set_warm_limit name what bounds the set at
	// its coldest and its warmest setting, set_re_limit what holds the
	// set's Reynolds number off flight ("none" where it is flight's).
	SetReynolds      Num    `json:"set_reynolds"`
	SetT0Min         Num    `json:"set_t0_min_k"`
	SetT0Max         Num    `json:"set_t0_max_k"`
	SetP0Min         Num    `json:"set_p0_min_pa"`
	SetP0Max         Num    `json:"set_p0_max_pa"`
	SetWaterTempMin  Num    `json:"set_water_temperature_min_k"`
	SetWaterTempMax  Num    `json:"set_water_temperature_max_k"`
	SetSpeedMin      Num    `json:"set_speed_min_m_s"`
	SetSpeedMax      Num    `json:"set_speed_max_m_s"`
	SetQMin          Num    `json:"set_q_min_pa"`
	SetQMax          Num    `json:"set_q_max_pa"`
	SetColdLimit     string `json:"set_cold_limit"`
	SetWarmLimit     string `json:"set_warm_limit"`
	SetReynoldsLimit string `json:"set_re_limit"`

	// Model loads at the setting (envelope.Detail.Load; planning loads at
	// the vehicle's largest coefficients): normal force (where the
	// vehicle gives a normal-force coefficient), pitching moment (where it
	// gives a pitching-moment coefficient), the larger share of the
	// balance capacity (where the facility gives one for a load the
	// vehicle gives), the capacities, and the test-section q at which this
	// model reaches the capacity.
	NormalForce           Num `json:"normal_force_n"`
	PitchMoment           Num `json:"pitch_moment_n_m"`
	LoadShare             Num `json:"load_share"`
	BalanceMaxNormalForce Num `json:"balance_max_normal_force_n"`
	BalanceMaxPitchMoment Num `json:"balance_max_pitch_moment_n_m"`
	BalanceQLimit         Num `json:"balance_q_limit_pa"`
}

// exportCSV is the export's CSV column table, derived once from
// ExportRecord's JSON tags (never changed after initialisation).
var exportCSV = newCSVTable[ExportRecord]()

// ExportColumns returns the CSV column names (and JSON record keys) in
// order.
func ExportColumns() []string { return exportCSV.header() }

// NewExportRecord builds the record of inside point (i, j) of m from
// Map.Detail (full precision).
func NewExportRecord(m *envelope.Map, i, j int) (ExportRecord, error) {
	var r ExportRecord
	err := newRecordMaker(m).record(&r, i, j)
	return r, err
}

// recordMaker builds the records of one map point after point, keeping
// what does not change from one to the next: the facility's cleaned name
// (cleaned once per map, not once per record), the Detail it fills (one
// per maker, not one per record) and the text of the last flags (they
// repeat from point to point, and Flags.String allocates).
type recordMaker struct {
	m        *envelope.Map
	facility string
	d        envelope.Detail

	flags     envelope.Flags
	flagsText string
	flagsSet  bool
}

// flagText is f.String(), remembered for the next record.
func (k *recordMaker) flagText(f envelope.Flags) string {
	if !k.flagsSet || f != k.flags {
		k.flags, k.flagsText, k.flagsSet = f, f.String(), true
	}
	return k.flagsText
}

func newRecordMaker(m *envelope.Map) *recordMaker {
	return &recordMaker{m: m, facility: envelope.CleanText(m.Facility.Name)}
}

// record is NewExportRecord into r. The record has no cautions, so it is
// built from Map.DetailFrom, which leaves them out.
func (k *recordMaker) record(r *ExportRecord, i, j int) error {
	m := k.m
	fd, err := m.Grid.FlightDetail(i, j)
	if err != nil {
		*r = ExportRecord{}
		return fmt.Errorf("export %s point (%d, %d): %w", m.Facility.Name, i, j, err)
	}
	if !fd.Inside {
		*r = ExportRecord{}
		return fmt.Errorf("export %s point (%d, %d): outside the envelope", m.Facility.Name, i, j)
	}
	m.DetailFrom(&k.d, &fd, i, j)
	d, s := &k.d, m.Settings
	*r = ExportRecord{
		Facility: k.facility,
		Medium:   m.Facility.Medium.String(),
		Row:      i,
		Col:      j,

		Scale:               Num(d.Scale),
		ModelLength:         Num(d.ModelLength),
		MachTol:             Num(s.MachTol),
		ReTol:               Num(s.ReTol),
		CompressibilityMach: Num(s.CompressibilityMach),

		Class:            d.Class.String(),
		Limit:            d.Limit.String(),
		PressureLimit:    d.PressureLimit.String(),
		TemperatureLimit: d.TemperatureLimit.String(),
		Flags:            k.flagText(d.Flags),
		HasSettings:      d.HasSettings,

		TestMach: na, P0: na, T0: na, WaterTemperature: na,
		TestPressure: na, TestTemperature: na, TestSpeed: na, TestQ: na,
		TestDensity: na, TestViscosity: na,
		ModelReynolds: na, ReynoldsRatio: na, ModelReynoldsPerM: na, DeltaCf: na,
		ReMaxAtTestMach: na, ReSweepMin: na, ReSweepMax: na,
		MinT0Condensation: na, VapourPressure: na, Cavitation: na,

		Rule: d.Rule.Kind.String(), RuleTemperature: na, RuleQ: na,

		SetReynolds: na, SetT0Min: na, SetT0Max: na, SetP0Min: na, SetP0Max: na,
		SetWaterTempMin: na, SetWaterTempMax: na, SetSpeedMin: na, SetSpeedMax: na,
		SetQMin: na, SetQMax: na,

		NormalForce: na, PitchMoment: na, LoadShare: na,
		BalanceMaxNormalForce: na, BalanceMaxPitchMoment: na, BalanceQLimit: na,
	}
	r.setFlight(m.Grid, &d.Flight)
	r.setRule(d.Rule)
	r.setBalance(m)
	if d.ReMax > 0 {
		r.ReMaxAtTestMach = Num(d.ReMax)
	}
	if !d.HasSettings {
		return nil
	}
	r.setMatchingSet(d.Set, d.Medium)
	r.setLoads(m.Grid.Vehicle, d.Load)
	water := d.Medium == envelope.MediumWater
	if water {
		r.WaterTemperature = Num(d.T0)
		r.VapourPressure = Num(d.VapourPressure)
		r.Cavitation = Num(d.Cavitation)
	} else {
		r.TestMach = Num(d.Mach)
		r.P0 = Num(d.P0)
		r.T0 = Num(d.T0)
		if d.MinT0Condensation > 0 {
			r.MinT0Condensation = Num(d.MinT0Condensation)
		}
	}
	r.TestPressure = Num(d.P)
	r.TestTemperature = Num(d.T)
	r.TestSpeed = Num(d.V)
	r.TestQ = Num(d.Q)
	r.TestDensity = Num(d.Density)
	r.TestViscosity = Num(d.Viscosity)
	r.ModelReynolds = Num(d.Re)
	r.ReynoldsRatio = Num(d.ReRatio)
	r.ModelReynoldsPerM = Num(d.RePerM)
	r.DeltaCf = Num(d.DCf)
	if d.ReSweepMax > 0 {
		r.ReSweepMin = Num(d.ReSweepMin)
		r.ReSweepMax = Num(d.ReSweepMax)
	}
	return nil
}

// setFlight writes the grid point and the flight side of it, fl, on grid
// g: the fields that are the same in every map on the grid.
func (r *ExportRecord) setFlight(g *envelope.Grid, fl *envelope.FlightDetail) {
	st := &fl.State
	r.Altitude = Num(fl.Altitude)
	r.AltitudeKind = g.Vehicle.AltitudeKind.String()
	r.GridSpeed = Num(fl.Speed)
	r.GridSpeedKind = g.SpeedKind.String()

	r.PressureAltitude = Num(st.PressureAltitude)
	r.DeltaT = Num(st.DeltaT)
	r.Temperature = Num(st.Temperature)
	r.Pressure = Num(st.Pressure)
	r.Density = Num(st.Density)
	r.SpeedOfSound = Num(st.SpeedOfSound)
	r.Viscosity = Num(st.Viscosity)
	r.KinematicViscosity = Num(st.KinematicViscosity)
	r.MeanFreePath = Num(st.MeanFreePath)

	r.Mach = Num(fl.Airspeeds.Mach)
	r.TAS = Num(fl.Airspeeds.TAS)
	r.EAS = Num(fl.Airspeeds.EAS)
	r.CAS = Num(fl.Airspeeds.CAS)
	r.Q = Num(fl.Q)
	r.Reynolds = Num(fl.Re)
	r.ReynoldsPerM = Num(fl.RePerM)
	r.Knudsen = Num(fl.Kn)
	r.FlightT0 = Num(fl.T0)
	r.FlightP0 = Num(fl.P0)
	r.SpeedRegime = fl.SpeedRegime.String()
	r.RarefactionRegime = fl.Rarefaction.String()
}

// setRule writes the value fixed rule ru holds.
func (r *ExportRecord) setRule(ru envelope.OperatingRule) {
	switch ru.Kind {
	case envelope.RuleFixedTemperature:
		r.RuleTemperature = Num(ru.Temperature)
	case envelope.RuleFixedQ:
		r.RuleQ = Num(ru.Q)
	}
}

// setBalance writes the balance capacities of m's facility and the q at
// which its model reaches them (each where given, or checked).
func (r *ExportRecord) setBalance(m *envelope.Map) {
	b := m.Facility.Balance
	if b.MaxNormalForce > 0 {
		r.BalanceMaxNormalForce = Num(b.MaxNormalForce)
	}
	if b.MaxPitchMoment > 0 {
		r.BalanceMaxPitchMoment = Num(b.MaxPitchMoment)
	}
	if m.LoadQ > 0 {
		r.BalanceQLimit = Num(m.LoadQ)
	}
}

// setMatchingSet writes the span of matching set ms for a facility of
// medium med (nothing when there is no set).
func (r *ExportRecord) setMatchingSet(ms envelope.MatchingSet, med envelope.Medium) {
	if !ms.OK {
		return
	}
	span := func(a, b float64) (Num, Num) { return Num(math.Min(a, b)), Num(math.Max(a, b)) }
	r.SetReynolds = Num(ms.Re)
	if med == envelope.MediumWater {
		r.SetWaterTempMin, r.SetWaterTempMax = span(ms.Cold.T0, ms.Warm.T0)
		r.SetSpeedMin, r.SetSpeedMax = span(ms.Cold.V, ms.Warm.V)
	} else {
		r.SetT0Min, r.SetT0Max = span(ms.Cold.T0, ms.Warm.T0)
		r.SetP0Min, r.SetP0Max = span(ms.Cold.P0, ms.Warm.P0)
	}
	r.SetQMin, r.SetQMax = span(ms.Cold.Q, ms.Warm.Q)
	r.SetColdLimit, r.SetWarmLimit = ms.Cold.Limit.String(), ms.Warm.Limit.String()
	r.SetReynoldsLimit = ms.ReLimit.String()
}

// setLoads writes the model loads l at the setting: each load where
// vehicle v gives its coefficient, the share where the balance is checked
// (a capacity for a load v gives).
func (r *ExportRecord) setLoads(v *envelope.Vehicle, l envelope.Load) {
	if v.Loads.CNMax > 0 {
		r.NormalForce = Num(l.NormalForce)
	}
	if v.Loads.CmMax > 0 {
		r.PitchMoment = Num(l.PitchMoment)
	}
	if l.QCap > 0 {
		r.LoadShare = Num(l.Share)
	}
}

// EachRecord calls fn with the record of every inside point of every map,
// map by map, rows from the lowest altitude up and columns from the
// slowest. It stops at the first error.
func EachRecord(maps []*envelope.Map, fn func(ExportRecord) error) error {
	for _, m := range maps {
		g, k := m.Grid, newRecordMaker(m)
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if !g.Inside(i, j) {
					continue
				}
				var r ExportRecord
				if err := k.record(&r, i, j); err != nil {
					return err
				}
				if err := fn(r); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// WriteExportCSV writes a header row of ExportColumns and one row per inside
// point per map. Rows are formatted in blocks on every core and written in
// order, with the bytes encoding/csv would write.
func WriteExportCSV(w io.Writer, maps []*envelope.Map) error {
	head := appendCSVRecord(nil, exportCSV.names)
	if _, err := w.Write(head); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	if err := writeBlocks(exportBlocks(maps), exportFormat{exportCSV.appendRow, exportCSV.cols}, writeAll(w)); err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	return nil
}

// ExportInfo describes the run that produced an export: the tool and its
// version and the date (kept as given, so tests can fix it).
type ExportInfo struct {
	Tool      string `json:"tool"`
	Version   string `json:"version"`
	Generated string `json:"generated"`
}

// ExportVehicle is the vehicle and grid block of the JSON export.
type ExportVehicle struct {
	Name          string `json:"name"`
	Source        string `json:"source"`
	RefLength     Num    `json:"reference_length_m"`
	RefLengthName string `json:"reference_length_is"`
	AltitudeKind  string `json:"altitude_kind"`
	GridSpeedKind string `json:"grid_speed_kind"`
	Rows          int    `json:"rows"`
	Cols          int    `json:"cols"`
	InsidePoints  int    `json:"inside_points"`
}

// ExportSettings is the settings block of the JSON export (SI).
type ExportSettings struct {
	ScaleOverride       Num `json:"scale_override"` // null: each facility's own
	DeltaT              Num `json:"delta_t_k"`
	MachTol             Num `json:"mach_tol"`
	ReTol               Num `json:"re_tol"`
	CompressibilityMach Num `json:"compressibility_mach"`
	// RuleOverride is the operating rule a what-if sets for every
	// facility; null: each facility's own.
	RuleOverride *RuleInfo `json:"rule_override"`
}

// RuleInfo states an operating rule in the JSON outputs: its name as the
// facility files write it, the rule in words (envelope.OperatingRule.
// Describe, SI) and the value a fixed rule holds (null otherwise).
type RuleInfo struct {
	Name        string `json:"name"`
	Description string `json:"description"`
	Temperature Num    `json:"temperature_k"` // fixed temperature: T0, or the water temperature
	Q           Num    `json:"q_pa"`          // fixed q: test-section dynamic pressure
}

// ruleOverrideInfo states a what-if rule r for facilities of the given
// media, in the words of a gas facility's rule unless all are water; nil
// when r is RuleDefault (each facility's own rule).
func ruleOverrideInfo(r envelope.OperatingRule, media []envelope.Medium) *RuleInfo {
	if r.Kind == envelope.RuleDefault {
		return nil
	}
	med := envelope.MediumWater
	for _, m := range media {
		if m != envelope.MediumWater {
			med = m
			break
		}
	}
	ri := NewRuleInfo(r, med)
	return &ri
}

// NewRuleInfo states rule r as it applies to a facility of medium m.
func NewRuleInfo(r envelope.OperatingRule, m envelope.Medium) RuleInfo {
	ri := RuleInfo{Name: r.Kind.String(), Description: r.Describe(m, nil), Temperature: na, Q: na}
	switch r.Kind {
	case envelope.RuleFixedTemperature:
		ri.Temperature = Num(r.Temperature)
	case envelope.RuleFixedQ:
		ri.Q = Num(r.Q)
	}
	return ri
}

// ExportFacility is one facility's block in the JSON export.
type ExportFacility struct {
	Name      string `json:"name"`
	Class     string `json:"class"`
	Medium    string `json:"medium"`
	Source    string `json:"source"`
	Scale     Num    `json:"model_scale"`
	ScaleRule string `json:"scale_rule"`
	FitScale  Num    `json:"fit_scale"`
	FitRule   string `json:"fit_rule"`
	// Rule is the operating rule the facility runs under (its own, or the
	// what-if's for every facility).
	Rule RuleInfo `json:"operating_rule"`
	// Balance capacities (null: not given) and the test-section q at which
	// the model of this scale reaches them (null: the balance is not
	// checked, no capacity or no load coefficient for it).
	BalanceMaxNormalForce Num `json:"balance_max_normal_force_n"`
	BalanceMaxPitchMoment Num `json:"balance_max_pitch_moment_n_m"`
	BalanceQLimit         Num `json:"balance_q_limit_pa"`
	Records               int `json:"records"`
}

// ExportHeader is everything in the JSON export but the records.
type ExportHeader struct {
	ExportInfo
	Caution    string           `json:"caution"`
	Units      string           `json:"units"`
	Vehicle    ExportVehicle    `json:"vehicle"`
	Settings   ExportSettings   `json:"settings"`
	Facilities []ExportFacility `json:"facilities"`
}

// ExportDoc is the whole JSON export, for reading it back.
type ExportDoc struct {
	ExportHeader
	Records []ExportRecord `json:"records"`
}

// NewExportHeader describes the maps (solved on one grid) for the JSON
// export. Names and file names pass through CleanText.
func NewExportHeader(info ExportInfo, maps []*envelope.Map) ExportHeader {
	h := ExportHeader{ExportInfo: info, Caution: envelope.PlanningNote, Units: "SI", Facilities: []ExportFacility{}}
	if len(maps) == 0 {
		return h
	}
	g := maps[0].Grid
	v := g.Vehicle
	h.Vehicle = ExportVehicle{
		Name: envelope.CleanText(v.Name), Source: envelope.CleanText(v.Source), RefLength: Num(v.RefLength), RefLengthName: envelope.CleanText(v.RefLengthName),
		AltitudeKind: v.AltitudeKind.String(), GridSpeedKind: g.SpeedKind.String(),
		Rows: g.Rows(), Cols: g.Cols(), InsidePoints: g.InsideCount(),
	}
	s := maps[0].Settings
	h.Settings = ExportSettings{
		ScaleOverride: na, DeltaT: Num(s.DeltaT), MachTol: Num(s.MachTol), ReTol: Num(s.ReTol),
		CompressibilityMach: Num(s.CompressibilityMach),
	}
	if s.Scale > 0 {
		h.Settings.ScaleOverride = Num(s.Scale)
	}
	media := make([]envelope.Medium, len(maps))
	for k, m := range maps {
		media[k] = m.Facility.Medium
	}
	h.Settings.RuleOverride = ruleOverrideInfo(s.Rule, media)
	for _, m := range maps {
		f := m.Facility
		ef := ExportFacility{
			Name: envelope.CleanText(f.Name), Class: envelope.CleanText(f.Class), Medium: f.Medium.String(), Source: envelope.CleanText(f.Source),
			Scale: Num(m.Scale), ScaleRule: m.ScaleRule, FitScale: na, FitRule: m.FitRule,
			Rule:                  NewRuleInfo(m.Rule, f.Medium),
			BalanceMaxNormalForce: na, BalanceMaxPitchMoment: na, BalanceQLimit: na,
			Records: m.Grid.InsideCount(),
		}
		if m.FitScale > 0 {
			ef.FitScale = Num(m.FitScale)
		}
		if f.Balance.MaxNormalForce > 0 {
			ef.BalanceMaxNormalForce = Num(f.Balance.MaxNormalForce)
		}
		if f.Balance.MaxPitchMoment > 0 {
			ef.BalanceMaxPitchMoment = Num(f.Balance.MaxPitchMoment)
		}
		if m.LoadQ > 0 {
			ef.BalanceQLimit = Num(m.LoadQ)
		}
		h.Facilities = append(h.Facilities, ef)
	}
	return h
}

// WriteExportJSON writes one JSON object: the header fields of NewExportHeader
// and "records", an array with one object per inside point per map (one
// per line, so large exports stream and diff well).
func WriteExportJSON(w io.Writer, info ExportInfo, maps []*envelope.Map) error {
	h := NewExportHeader(info, maps)
	head, err := json.MarshalIndent(h, "", "  ")
	if err != nil {
		return fmt.Errorf("json: %w", err)
	}
	// Reopen the header object to append the records array.
	head = head[:len(head)-2] // drop "\n}"
	if _, err := fmt.Fprintf(w, "%s,\n  \"records\": [", head); err != nil {
		return fmt.Errorf("json: %w", err)
	}
	// Each record follows ",\n    "; the first record's comma is left out.
	first := true
	row := func(b []byte, r *ExportRecord, memo []numMemo) []byte {
		return exportJSON.appendRecord(append(b, ",\n    "...), r, memo)
	}
	err = writeBlocks(exportBlocks(maps), exportFormat{row, exportJSON.cols}, func(b []byte) error {
		if first {
			b, first = b[1:], false
		}
		_, err := w.Write(b)
		return err
	})
	if err != nil {
		return fmt.Errorf("json: %w", err)
	}
	end := "\n  ]\n}\n"
	if first {
		end = "]\n}\n"
	}
	if _, err := io.WriteString(w, end); err != nil {
		return fmt.Errorf("json: %w", err)
	}
	return nil
}
