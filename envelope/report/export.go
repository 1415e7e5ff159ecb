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
	d, err := m.Detail(i, j)
	if err != nil {
		return ExportRecord{}, fmt.Errorf("export %s point (%d, %d): %w", m.Facility.Name, i, j, err)
	}
	if !d.Flight.Inside {
		return ExportRecord{}, fmt.Errorf("export %s point (%d, %d): outside the envelope", m.Facility.Name, i, j)
	}
	g := m.Grid
	fl := d.Flight
	st := fl.State
	s := m.Settings
	r := ExportRecord{
		Facility: envelope.CleanText(m.Facility.Name),
		Medium:   m.Facility.Medium.String(),
		Row:      i,
		Col:      j,

		Altitude:      Num(fl.Altitude),
		AltitudeKind:  g.Vehicle.AltitudeKind.String(),
		GridSpeed:     Num(fl.Speed),
		GridSpeedKind: g.SpeedKind.String(),

		PressureAltitude:   Num(st.PressureAltitude),
		DeltaT:             Num(st.DeltaT),
		Temperature:        Num(st.Temperature),
		Pressure:           Num(st.Pressure),
		Density:            Num(st.Density),
		SpeedOfSound:       Num(st.SpeedOfSound),
		Viscosity:          Num(st.Viscosity),
		KinematicViscosity: Num(st.KinematicViscosity),
		MeanFreePath:       Num(st.MeanFreePath),

		Mach:              Num(fl.Airspeeds.Mach),
		TAS:               Num(fl.Airspeeds.TAS),
		EAS:               Num(fl.Airspeeds.EAS),
		CAS:               Num(fl.Airspeeds.CAS),
		Q:                 Num(fl.Q),
		Reynolds:          Num(fl.Re),
		ReynoldsPerM:      Num(fl.RePerM),
		Knudsen:           Num(fl.Kn),
		FlightT0:          Num(fl.T0),
		FlightP0:          Num(fl.P0),
		SpeedRegime:       fl.SpeedRegime.String(),
		RarefactionRegime: fl.Rarefaction.String(),

		Scale:               Num(d.Scale),
		ModelLength:         Num(d.ModelLength),
		MachTol:             Num(s.MachTol),
		ReTol:               Num(s.ReTol),
		CompressibilityMach: Num(s.CompressibilityMach),

		Class:            d.Class.String(),
		Limit:            d.Limit.String(),
		PressureLimit:    d.PressureLimit.String(),
		TemperatureLimit: d.TemperatureLimit.String(),
		Flags:            d.Flags.String(),
		HasSettings:      d.HasSettings,

		TestMach: na, P0: na, T0: na, WaterTemperature: na,
		TestPressure: na, TestTemperature: na, TestSpeed: na, TestQ: na,
		TestDensity: na, TestViscosity: na,
		ModelReynolds: na, ReynoldsRatio: na, ModelReynoldsPerM: na, DeltaCf: na,
		ReMaxAtTestMach: na, ReSweepMin: na, ReSweepMax: na,
		MinT0Condensation: na, VapourPressure: na, Cavitation: na,
	}
	if d.ReMax > 0 {
		r.ReMaxAtTestMach = Num(d.ReMax)
	}
	if !d.HasSettings {
		return r, nil
	}
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
	return r, nil
}

// EachRecord calls fn with the record of every inside point of every map,
// map by map, rows from the lowest altitude up and columns from the
// slowest. It stops at the first error.
func EachRecord(maps []*envelope.Map, fn func(ExportRecord) error) error {
	for _, m := range maps {
		g := m.Grid
		for i := 0; i < g.Rows(); i++ {
			for j := 0; j < g.Cols(); j++ {
				if !g.Inside(i, j) {
					continue
				}
				r, err := NewExportRecord(m, i, j)
				if err != nil {
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
// point per map.
func WriteExportCSV(w io.Writer, maps []*envelope.Map) error {
	cw, err := newCSVWriter(w, exportCSV)
	if err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	err = EachRecord(maps, func(r ExportRecord) error { return cw.write(&r, nil) })
	if err != nil {
		return fmt.Errorf("csv: %w", err)
	}
	if err := cw.flush(); err != nil {
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
	Records   int    `json:"records"`
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
	for _, m := range maps {
		f := m.Facility
		ef := ExportFacility{
			Name: envelope.CleanText(f.Name), Class: envelope.CleanText(f.Class), Medium: f.Medium.String(), Source: envelope.CleanText(f.Source),
			Scale: Num(m.Scale), ScaleRule: m.ScaleRule, FitScale: na, FitRule: m.FitRule,
			Records: m.Grid.InsideCount(),
		}
		if m.FitScale > 0 {
			ef.FitScale = Num(m.FitScale)
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
	first := true
	err = EachRecord(maps, func(r ExportRecord) error {
		b, err := json.Marshal(r)
		if err != nil {
			return err
		}
		sep := ",\n    "
		if first {
			sep, first = "\n    ", false
		}
		if _, err := io.WriteString(w, sep); err != nil {
			return err
		}
		_, err = w.Write(b)
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
