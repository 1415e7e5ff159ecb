package tui

import (
	"fmt"
	"math"
	"strings"
)

// Layer is what the matrix cells show.
type Layer uint8

const (
	// LayerClass shows the match class of the chosen facility (default).
	LayerClass Layer = iota
	// LayerRegime shows the flight speed regime, or the rarefaction regime
	// where the flow is not continuum.
	LayerRegime
	// LayerReynolds shows the achieved Reynolds number as a fraction of
	// flight, on a graded scale.
	LayerReynolds
	// LayerQ shows the tunnel dynamic pressure as a fraction of its limit.
	LayerQ
	// LayerLoad shows the model load as a share of the balance capacity
	// (envelope.Map.LoadShare), where the facility gives a capacity and
	// the vehicle load coefficients; elsewhere every cell says "no
	// balance data".
	LayerLoad
	// LayerMach shows the flight Mach number on a graded scale.
	LayerMach

	layerCount
)

// Layers lists every layer in cycling order.
func Layers() []Layer {
	return []Layer{LayerClass, LayerRegime, LayerReynolds, LayerQ, LayerLoad, LayerMach}
}

// String names the layer for headers and session files.
func (l Layer) String() string {
	switch l {
	case LayerClass:
		return "match class"
	case LayerRegime:
		return "flow regime"
	case LayerReynolds:
		return "Reynolds ratio"
	case LayerQ:
		return "tunnel q / limit"
	case LayerLoad:
		return "model load / capacity"
	case LayerMach:
		return "Mach number"
	}
	return "unknown layer"
}

// ParseLayer is the inverse of Layer.String.
func ParseLayer(s string) (Layer, error) {
	for _, l := range Layers() {
		if strings.EqualFold(s, l.String()) {
			return l, nil
		}
	}
	return LayerClass, fmt.Errorf("unknown layer %q (expected one of %s)", s, layerNames())
}

func layerNames() string {
	var b []string
	for _, l := range Layers() {
		b = append(b, fmt.Sprintf("%q", l.String()))
	}
	return strings.Join(b, ", ")
}

// Next returns the layer after l in cycling order.
func (l Layer) Next() Layer { return (l + 1) % layerCount }

// NeedsFacility reports whether the layer shows facility results (and so
// is blank where no facility answer exists).
func (l Layer) NeedsFacility() bool {
	return l == LayerClass || l == LayerReynolds || l == LayerQ || l == LayerLoad
}

type levelKind uint8

const (
	levelCategory levelKind = iota // categorical (classes, regimes)
	levelGraded                    // one step of a graded scale
	levelNone                      // no value (no setting, no limit)
	levelOver                      // beyond a limit
)

// levelDef is one glyph of a layer with its legend text. Labels that depend
// on settings (tolerances) are completed by Legend.
type levelDef struct {
	glyph byte
	label string
	kind  levelKind
}

// OutsideGlyph marks points outside the flight envelope in every layer.
const OutsideGlyph = '.'

// MarkGlyph marks a test point.
const MarkGlyph = '*'

// Level indices of each layer. The tables below are immutable.
const (
	// LayerClass
	lvClassFull = iota
	lvClassReShort
	lvClassMachRelaxed
	lvClassNoMatch
	lvClassNoFacility
)

const (
	// LayerRegime
	lvRegIncompressible = iota
	lvRegSubsonic
	lvRegTransonic
	lvRegSupersonic
	lvRegHypersonic
	lvRegSlip
	lvRegTransitional
	lvRegFreeMolecular
)

// Reynolds ratio bin edges (ratio of model to flight Reynolds number).
// The top bins depend on the Reynolds tolerance and are set at run time.
var reBins = [...]float64{0.03, 0.1, 0.3, 0.6}

const (
	lvRe1     = iota // < 0.03
	lvRe2            // 0.03–0.1
	lvRe3            // 0.1–0.3
	lvRe4            // 0.3–0.6
	lvRe5            // 0.6 – (1−tol)
	lvReMeets        // within tolerance
	lvReAbove        // above 1+tol
	lvReNone         // no setting
)

// Tunnel q as a fraction of the facility's q limit.
var qBins = [...]float64{0.25, 0.5, 0.75, 0.9, 1.0 + 1e-9}

const (
	lvQ1 = iota // < 25 %
	lvQ2
	lvQ3
	lvQ4
	lvQ5     // 90–100 %
	lvQOver  // above the limit
	lvQNoLim // facility has no q limit
	lvQNone  // no setting
)

// Model load as a share of the balance capacity. The solve holds the load
// within the capacity (a setting held at it rounds to a share of 1 within
// capSlack); the top bin is the last 20 % below it, where the details and
// cautions flag the load from 90 %.
const capSlack = 1e-9

var loadBins = [...]float64{0.5, 0.8, 1 + capSlack}

const (
	lvLoad1      = iota // < 50 %
	lvLoad2             // 50–80 %
	lvLoad3             // 80–100 %
	lvLoadOver          // above the capacity
	lvLoadNoData        // the facility gives no capacity, or the vehicle no coefficients
	lvLoadNone          // no setting
)

// Flight Mach number bins.
var machBins = [...]float64{0.3, 0.6, 0.8, 0.95, 1.05, 1.5, 3, 5}

var (
	tableClass = []levelDef{
		{'#', "full match", levelCategory},
		{'=', "Reynolds short", levelCategory},
		{'~', "Mach relaxed", levelCategory},
		{'x', "out of reach", levelCategory},
		{'?', "no facility", levelCategory},
	}
	tableRegime = []levelDef{
		{',', "incompressible", levelCategory},
		{':', "subsonic", levelCategory},
		{'+', "transonic", levelCategory},
		{'>', "supersonic", levelCategory},
		{'^', "hypersonic", levelCategory},
		{';', "slip flow", levelCategory},
		{'%', "transitional", levelCategory},
		{'@', "free molecular", levelCategory},
	}
	tableRe = []levelDef{
		{'1', "< 0.03", levelGraded},
		{'2', "0.03-0.1", levelGraded},
		{'3', "0.1-0.3", levelGraded},
		{'4', "0.3-0.6", levelGraded},
		{'5', "0.6-(1-tol)", levelGraded},
		{'6', "within tol", levelGraded},
		{'7', "above flight", levelGraded},
		{'x', "no setting", levelNone},
	}
	tableQ = []levelDef{
		{'1', "< 25 %", levelGraded},
		{'2', "25-50 %", levelGraded},
		{'3', "50-75 %", levelGraded},
		{'4', "75-90 %", levelGraded},
		{'5', "90-100 %", levelGraded},
		{'!', "over limit", levelOver},
		{'-', "no q limit", levelNone},
		{'x', "no setting", levelNone},
	}
	tableLoad = []levelDef{
		{'1', "< 50 %", levelGraded},
		{'2', "50-80 %", levelGraded},
		{'3', "80-100 %", levelGraded},
		{'!', "above capacity", levelOver},
		{'-', "no balance data", levelNone},
		{'x', "no setting", levelNone},
	}
	tableMach = []levelDef{
		{'0', "< 0.3", levelGraded},
		{'1', "0.3-0.6", levelGraded},
		{'2', "0.6-0.8", levelGraded},
		{'3', "0.8-0.95", levelGraded},
		{'4', "0.95-1.05", levelGraded},
		{'5', "1.05-1.5", levelGraded},
		{'6', "1.5-3", levelGraded},
		{'7', "3-5", levelGraded},
		{'8', ">= 5", levelGraded},
	}
)

func layerTable(l Layer) []levelDef {
	switch l {
	case LayerClass:
		return tableClass
	case LayerRegime:
		return tableRegime
	case LayerReynolds:
		return tableRe
	case LayerQ:
		return tableQ
	case LayerLoad:
		return tableLoad
	case LayerMach:
		return tableMach
	}
	return nil
}

// Glyph returns the glyph of level k of layer l ('?' if out of range).
func Glyph(l Layer, k int) byte {
	t := layerTable(l)
	if k < 0 || k >= len(t) {
		return '?'
	}
	return t[k].glyph
}

// LegendEntry is one glyph of the current layer and what it means.
type LegendEntry struct {
	Glyph byte
	Label string
	Level int // -1 for the outside-envelope and mark entries
}

// Legend lists every glyph the layer can draw, with labels completed from
// the Reynolds tolerance reTol, followed by the outside-envelope and
// test-point glyphs. The "no facility" class appears only when noFacility
// is set (no facility loaded or solved).
func Legend(l Layer, reTol float64, noFacility bool) []LegendEntry {
	t := layerTable(l)
	out := make([]LegendEntry, 0, len(t)+2)
	for k, d := range t {
		if l == LayerClass && k == lvClassNoFacility && !noFacility {
			continue
		}
		label := d.label
		if l == LayerReynolds {
			lo, hi := 1-reTol, 1+reTol
			switch k {
			case lvRe5:
				label = fmt.Sprintf("0.6-%.2f", lo)
			case lvReMeets:
				label = fmt.Sprintf("%.2f-%.2f", lo, hi)
			case lvReAbove:
				label = fmt.Sprintf("> %.2f", hi)
			}
		}
		out = append(out, LegendEntry{Glyph: d.glyph, Label: label, Level: k})
	}
	out = append(out,
		LegendEntry{Glyph: OutsideGlyph, Label: "outside envelope", Level: -1},
		LegendEntry{Glyph: MarkGlyph, Label: "test point", Level: -1})
	return out
}

// ReynoldsLevel bins a model/flight Reynolds ratio. Non-positive or
// non-finite ratios mean "no setting".
func ReynoldsLevel(ratio, reTol float64) int {
	if !(ratio > 0) || math.IsInf(ratio, 0) {
		return lvReNone
	}
	if ratio > 1+reTol {
		return lvReAbove
	}
	if ratio >= 1-reTol {
		return lvReMeets
	}
	for k, e := range reBins {
		if ratio < e {
			return k
		}
	}
	return lvRe5
}

// QLevel bins a tunnel dynamic pressure q against the limit qMax (0 = no
// limit).
func QLevel(q, qMax float64) int {
	if !(q > 0) || math.IsInf(q, 0) {
		return lvQNone
	}
	if !(qMax > 0) {
		return lvQNoLim
	}
	f := q / qMax
	for k, e := range qBins {
		if f < e {
			return k
		}
	}
	return lvQOver
}

// LoadLevel bins a model load given as a share of the balance capacity;
// checked is false where the balance is not checked (no capacity or no
// load coefficients), and a share that is not above 0 means no setting.
func LoadLevel(share float64, checked bool) int {
	if !checked {
		return lvLoadNoData
	}
	if !(share > 0) || math.IsInf(share, 0) {
		return lvLoadNone
	}
	for k, e := range loadBins {
		if share < e {
			return k
		}
	}
	return lvLoadOver
}

// MachLevel bins a flight Mach number.
func MachLevel(m float64) int {
	for k, e := range machBins {
		if m < e {
			return k
		}
	}
	return len(machBins)
}
