package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"

	"likewind/atmos"
	"likewind/envelope"
)

// pointReport is the `point --json` record. The keys are part of the
// command-line contract documented in README; all values are SI.
type pointReport struct {
	Altitude             float64 `json:"altitude_m"`
	GeopotentialAltitude float64 `json:"geopotential_altitude_m"`
	PressureAltitude     float64 `json:"pressure_altitude_m"`
	Temperature          float64 `json:"temperature_k"`
	Pressure             float64 `json:"pressure_pa"`
	Density              float64 `json:"density_kg_m3"`
	SpeedOfSound         float64 `json:"speed_of_sound_m_s"`
	Viscosity            float64 `json:"dynamic_viscosity_pa_s"`
	KinematicViscosity   float64 `json:"kinematic_viscosity_m2_s"`
	MeanFreePath         float64 `json:"mean_free_path_m"`
	Mach                 float64 `json:"mach"`
	TAS                  float64 `json:"tas_m_s"`
	EAS                  float64 `json:"eas_m_s"`
	CAS                  float64 `json:"cas_m_s"`
	DynamicPressure      float64 `json:"dynamic_pressure_pa"`
	Reynolds             float64 `json:"reynolds"`
	ReynoldsPerM         float64 `json:"reynolds_per_m"`
	Knudsen              float64 `json:"knudsen"`
	Regime               string  `json:"regime"`
	Continuum            bool    `json:"continuum"`
}

// usageError marks errors that come from bad flags or values (exit 2).
type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }
func (e usageError) Unwrap() error { return e.err }

func usagef(format string, a ...any) error { return usageError{fmt.Errorf(format, a...)} }

// pointQuery is a parsed `point` command line.
type pointQuery struct {
	alt       float64
	altKind   atmos.AltitudeKind
	speed     float64
	speedKind atmos.SpeedKind
	speedFlag string // the flag that gave the speed, and its text
	speedText string
	length    float64
	dT        float64
	json      bool
}

func parsePointFlags(args []string, stderr io.Writer) (pointQuery, error) {
	fs := flag.NewFlagSet("point", flag.ContinueOnError)
	fs.SetOutput(stderr)
	alt := fs.String("alt", "", "geometric altitude, e.g. 11km or 35000ft")
	geo := fs.String("geopotential", "", "geopotential altitude instead of --alt")
	palt := fs.String("pressure-alt", "", "pressure altitude (standard-atmosphere pressure level, geopotential scale) instead of --alt")
	mach := fs.String("mach", "", "flight Mach number, e.g. 0.8")
	tas := fs.String("tas", "", "true airspeed with unit, e.g. 240m/s")
	eas := fs.String("eas", "", "equivalent airspeed with unit, e.g. 150kt")
	cas := fs.String("cas", "", "calibrated airspeed with unit, e.g. 250kt")
	length := fs.String("length", "1 m", "reference length for Reynolds and Knudsen numbers")
	dt := fs.String("dt", "0 K", "temperature offset from the standard day, e.g. 10K or -15degC")
	asJSON := fs.Bool("json", false, "print one JSON object (SI units)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind point --alt H (--mach M | --tas V | --eas V | --cas V) [--length L] [--dt DT] [--json]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return pointQuery{}, err
		}
		return pointQuery{}, usageError{err}
	}
	if fs.NArg() > 0 {
		return pointQuery{}, usagef("point: unexpected argument %q", fs.Arg(0))
	}
	q := pointQuery{json: *asJSON}

	altFlags := []struct {
		name, val string
		kind      atmos.AltitudeKind
	}{{"alt", *alt, atmos.Geometric}, {"geopotential", *geo, atmos.Geopotential}, {"pressure-alt", *palt, atmos.PressureAlt}}
	// Every value is read and bounded as the vehicle files read and bound
	// it (envelope/bounds.go): the bounds catch a wrong unit or a missing
	// exponent, and keep every result finite.
	n := 0
	for _, f := range altFlags {
		if f.val == "" {
			continue
		}
		n++
		v, err := atmos.ParseQuantity(f.val, atmos.Length)
		if err != nil {
			return q, usagef("point: --%s: %w", f.name, err)
		}
		if err := envelope.CheckAltitude(strconv.Quote(f.val), v, f.kind); err != nil {
			return q, usagef("point: --%s: %w", f.name, err)
		}
		q.alt, q.altKind = envelope.PositiveZero(v), f.kind
	}
	if n != 1 {
		return q, usagef("point: give exactly one of --alt, --geopotential or --pressure-alt")
	}

	speedFlags := []struct {
		name, val string
		kind      atmos.SpeedKind
	}{{"mach", *mach, atmos.Mach}, {"tas", *tas, atmos.TAS}, {"eas", *eas, atmos.EAS}, {"cas", *cas, atmos.CAS}}
	n = 0
	for _, f := range speedFlags {
		if f.val == "" {
			continue
		}
		n++
		v, err := envelope.ParseFlightSpeed(f.val, f.kind)
		if err != nil {
			return q, usagef("point: --%s: %w", f.name, err)
		}
		q.speed, q.speedKind, q.speedFlag = v, f.kind, f.name
		q.speedText = f.val
	}
	if n != 1 {
		return q, usagef("point: give exactly one of --mach, --tas, --eas or --cas")
	}

	var err error
	if q.length, err = envelope.ParseVehicleLength(*length); err != nil {
		return q, usagef("point: --length: %w", err)
	}
	if q.dT, err = envelope.ParseDeltaT(*dt); err != nil {
		return q, usagef("point: --dt: %w", err)
	}
	return q, nil
}

// evaluatePoint computes the report for one flight condition.
func evaluatePoint(q pointQuery) (pointReport, error) {
	s, err := atmos.AtDay(q.alt, q.altKind, q.dT)
	if err != nil {
		return pointReport{}, usagef("point: %w", err)
	}
	sp, err := atmos.Speeds(q.speedKind, q.speed, s)
	if err != nil {
		return pointReport{}, usagef("point: %w", err)
	}
	// As for an envelope point: the speed must come to a Mach number the
	// files take at this altitude on this day.
	if err := envelope.FlightMachBound().Check(fmt.Sprintf("%q (Mach %.4g here)", q.speedText, sp.Mach), sp.Mach); err != nil {
		return pointReport{}, usagef("point: --%s: %w", q.speedFlag, err)
	}
	reg := atmos.DefaultRegimes()
	kn := atmos.Knudsen(s.MeanFreePath, q.length)
	r := pointReport{
		Altitude:             s.Altitude,
		GeopotentialAltitude: s.GeopotentialAltitude,
		PressureAltitude:     s.PressureAltitude,
		Temperature:          s.Temperature,
		Pressure:             s.Pressure,
		Density:              s.Density,
		SpeedOfSound:         s.SpeedOfSound,
		Viscosity:            s.Viscosity,
		KinematicViscosity:   s.KinematicViscosity,
		MeanFreePath:         s.MeanFreePath,
		Mach:                 sp.Mach,
		TAS:                  sp.TAS,
		EAS:                  sp.EAS,
		CAS:                  sp.CAS,
		DynamicPressure:      atmos.DynamicPressure(s.Density, sp.TAS),
		Reynolds:             atmos.Reynolds(s.Density, sp.TAS, q.length, s.Viscosity),
		ReynoldsPerM:         atmos.ReynoldsPerMetre(s.Density, sp.TAS, s.Viscosity),
		Knudsen:              kn,
		Regime:               reg.Speed(sp.Mach).String(),
		Continuum:            reg.Rarefaction(kn) == atmos.Continuum,
	}
	r.positiveZeros()
	return r, nil
}

// positiveZeros makes every negative zero of r positive, so that the JSON
// never shows -0.
func (r *pointReport) positiveZeros() {
	for _, x := range []*float64{&r.Altitude, &r.GeopotentialAltitude, &r.Temperature, &r.Pressure, &r.Density,
		&r.SpeedOfSound, &r.Viscosity, &r.KinematicViscosity, &r.MeanFreePath, &r.Mach, &r.TAS, &r.EAS, &r.CAS,
		&r.DynamicPressure, &r.Reynolds, &r.ReynoldsPerM, &r.Knudsen} {
		*x = envelope.PositiveZero(*x)
	}
}

func runPoint(args []string, stdout, stderr io.Writer) int {
	q, err := parsePointFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		fmt.Fprintln(stderr, "likewind:", err)
		return 2
	}
	r, err := evaluatePoint(q)
	if err != nil {
		fmt.Fprintln(stderr, "likewind:", err)
		return 2
	}
	if q.json {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(r); err != nil {
			fmt.Fprintln(stderr, "likewind: point: standard output:", err)
			return 1
		}
		return 0
	}
	if err := writePointTable(stdout, q, r); err != nil {
		fmt.Fprintln(stderr, "likewind: point: standard output:", err)
		return 1
	}
	return 0
}

// writePointTable prints the report as a table; the error is the first
// failed write.
func writePointTable(w io.Writer, q pointQuery, r pointReport) error {
	ew := &errWriter{w: w}
	w = ew
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	row := func(name, si, cust string) { fmt.Fprintf(tw, "%s\t%s\t%s\n", name, si, cust) }
	reg := atmos.DefaultRegimes()
	day := "standard day"
	if q.dT != 0 {
		day = "standard " + signed(num("%.1f K", q.dT))
	}
	fmt.Fprintf(w, "Flight condition (U.S. Standard Atmosphere 1976, %s, reference length %s m)\n\n", day, num("%.4g", q.length))
	row("quantity", "SI", "customary")
	row("altitude (geometric)", num("%.1f m", r.Altitude), num("%.0f ft", r.Altitude/atmos.Foot))
	row("altitude (geopotential)", num("%.1f m", r.GeopotentialAltitude), num("%.0f ft", r.GeopotentialAltitude/atmos.Foot))
	row("pressure altitude", num("%.1f m", r.PressureAltitude), num("%.0f ft", r.PressureAltitude/atmos.Foot))
	row("static temperature", num("%.2f K", r.Temperature), num("%.1f degF", r.Temperature*9/5-459.67))
	row("static pressure", num("%.1f Pa", r.Pressure), num("%.2f psf", r.Pressure/atmos.PSF))
	row("density", num("%.5g kg/m3", r.Density), num("%.5g slug/ft3", r.Density/515.378818))
	row("speed of sound", num("%.2f m/s", r.SpeedOfSound), num("%.1f kt", r.SpeedOfSound/atmos.Knot))
	row("dynamic viscosity", num("%.5g Pa s", r.Viscosity), "")
	row("kinematic viscosity", num("%.5g m2/s", r.KinematicViscosity), num("%.5g ft2/s", r.KinematicViscosity/(atmos.Foot*atmos.Foot)))
	row("mean free path", num("%.4g m", r.MeanFreePath), "")
	row("Mach number", num("%.4f", r.Mach), "")
	row("TAS", num("%.2f m/s", r.TAS), num("%.1f kt", r.TAS/atmos.Knot))
	row("EAS", num("%.2f m/s", r.EAS), num("%.1f kt", r.EAS/atmos.Knot))
	row("CAS", num("%.2f m/s", r.CAS), num("%.1f kt", r.CAS/atmos.Knot))
	row("dynamic pressure", num("%.1f Pa", r.DynamicPressure), num("%.1f psf", r.DynamicPressure/atmos.PSF))
	row("Reynolds number", num("%.4g", r.Reynolds), "")
	row("Reynolds number per metre", num("%.4g 1/m", r.ReynoldsPerM), num("%.4g 1/ft", r.ReynoldsPerM*atmos.Foot))
	row("Knudsen number", num("%.3g", r.Knudsen), "")
	row("speed regime", r.Regime, "")
	row("rarefaction regime", reg.Rarefaction(r.Knudsen).String(), "")
	if err := tw.Flush(); err != nil {
		return err
	}
	return ew.err
}

// errWriter keeps the first write error and writes nothing after it, so
// a run of prints can be checked once.
type errWriter struct {
	w   io.Writer
	err error
}

func (e *errWriter) Write(p []byte) (int, error) {
	if e.err != nil {
		return 0, e.err
	}
	n, err := e.w.Write(p)
	e.err = err
	return n, err
}

// num formats one number as format says, never as a negative zero.
func num(format string, x float64) string { return atmos.NoNegativeZero(fmt.Sprintf(format, x)) }

// signed puts a plus sign before a formatted number that has no minus.
func signed(s string) string {
	if strings.HasPrefix(s, "-") {
		return s
	}
	return "+" + s
}
