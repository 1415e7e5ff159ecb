package tui

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"likewind/envelope"
	"likewind/envelope/units"
)

// Invented load data for the tests, a round hand case in place of the
// demo's own (CN 1.2 and Cm 0.25, a 2.4 kN, 120 N·m balance): the
// vehicle's largest normal-force coefficient 1.2 on its reference area,
// 28.0 m², no moment coefficient, and a balance of 2100 N in the
// cryogenic tunnel, whose model scale is 0.025. By hand, the normal force per unit q is
// CN·A·s² = 1.2 × 28.0 m² × 0.025² = 0.021 m², so the balance caps the
// tunnel q at 2100 N / 0.021 m² = 100 kPa (below its q max, 120 kPa).
const (
	loadCN       = 1.2
	loadBalanceN = 2100.0
	loadForcePer = 0.021 // N per Pa, by hand as above
	loadQCap     = 100e3 // Pa, by hand as above
)

// loadDemo is the demo with that load data, on the cryogenic tunnel.
func loadDemo(t *testing.T, w, h int) Model {
	t.Helper()
	m := newDemo(t, w, h, func(o *Options) {
		v := *o.Vehicle
		v.Loads = envelope.ModelLoads{CNMax: loadCN}
		o.Vehicle = &v
		facs := append([]envelope.Facility(nil), o.Facilities...)
		for k := range facs {
			if strings.HasPrefix(facs[k].Name, "Kellen Fold") {
				facs[k].Balance.MaxNormalForce = loadBalanceN
			}
		}
		o.Facilities = facs
	})
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.relayout()
	return m
}

// The load layer's levels and glyphs: below half the capacity '1', to
// 80 % '2', to the capacity '3', above it '!', no balance data '-', no
// setting 'x'.
func TestLoadLevelsAndGlyphs(t *testing.T) {
	for _, c := range []struct {
		share   float64
		checked bool
		glyph   byte
	}{
		{0.2, true, '1'}, {0.4999, true, '1'}, {0.5, true, '2'}, {0.79, true, '2'}, {0.8, true, '3'},
		{1, true, '3'}, {1.05, true, '!'}, {0, true, 'x'}, {math.Inf(1), true, 'x'}, {0.6, false, '-'}, {0, false, '-'},
	} {
		if got := Glyph(LayerLoad, LoadLevel(c.share, c.checked)); got != c.glyph {
			t.Errorf("load share %g (checked %v): glyph %q, want %q", c.share, c.checked, got, c.glyph)
		}
	}
	leg := RenderLegend(LegendInput{Layer: LayerLoad}, PlainStyles(), 200)
	for _, want := range []string{"model load / capacity:", "1 < 50 %", "2 50-80 %", "3 80-100 %", "! above capacity", "- no balance data", "x no setting"} {
		if !strings.Contains(leg, want) {
			t.Errorf("load legend lacks %q:\n%s", want, leg)
		}
	}
	if l, err := ParseLayer("model load / capacity"); err != nil || l != LayerLoad {
		t.Errorf("ParseLayer(model load / capacity) = %v, %v", l, err)
	}
}

// On the map, each point's cell is its q over the balance's q cap,
// 100 kPa by hand; a facility without balance data (the demo's
// supersonic tunnel) says so at every inside point.
func TestLoadLayerCells(t *testing.T) {
	m := loadDemo(t, 120, 40)
	mp := m.res.maps[m.fac]
	if math.Abs(mp.LoadQ-loadQCap) > 1e-6*loadQCap {
		t.Fatalf("balance q cap %g Pa, want %g Pa by hand", mp.LoadQ, loadQCap)
	}
	m.layer = LayerLoad
	v := m.gridView()
	seen := map[int]int{}
	g := m.res.grid
	for i := range g.Rows() {
		for j := range g.Cols() {
			if !g.Inside(i, j) {
				continue
			}
			r := mp.At(i, j)
			want := lvLoadNone
			if r.Q > 0 {
				want = LoadLevel(float64(r.Q)/loadQCap, true)
			}
			if c := v.Cell(i, j); c.Level != want {
				t.Fatalf("(%d, %d): level %d, want %d (q %g Pa)", i, j, c.Level, want, r.Q)
			}
			seen[want]++
		}
	}
	for _, lv := range []int{lvLoad1, lvLoad2, lvLoad3} {
		if seen[lv] == 0 {
			t.Errorf("no point at load level %q on the demo map: %v", Glyph(LayerLoad, lv), seen)
		}
	}
	// Another facility has no balance data.
	v.Facility = facilityNamed(t, m, "Skerrow")
	for i := range g.Rows() {
		for j := range g.Cols() {
			if g.Inside(i, j) && v.Cell(i, j).Level != lvLoadNoData {
				t.Fatalf("(%d, %d) on a facility without a balance: level %d, want no balance data", i, j, v.Cell(i, j).Level)
			}
		}
	}
}

// The details state the load as a share of the capacity with the normal
// force against it, in the units shown: N = 0.021 m² × q by hand.
func TestDetailsLoadLine(t *testing.T) {
	m := loadDemo(t, 120, 40)
	m.curI, m.curJ = 20, 8 // 12192 m, Mach 0.6 on the demo grid: a full match
	m.relayout()
	det, err := m.res.maps[m.fac].Detail(m.curI, m.curJ)
	if err != nil || !det.HasSettings {
		t.Fatalf("no setting at the point: %v", err)
	}
	n := loadForcePer * det.Q
	for _, u := range []units.System{units.SI, units.Customary} {
		m.units = u
		m.relayout()
		want := fmt.Sprintf("load %.0f %% of capacity: N %s of %s", 100*n/loadBalanceN, u.Force(n), u.Force(loadBalanceN))
		if det := strings.Join(m.details.blocks.facility, "\n"); !strings.Contains(det, want) {
			t.Errorf("%v: details lack %q:\n%s", u, want, det)
		}
	}
	// Without load data there is no load line.
	d := newDemo(t, 120, 40, noLoads)
	d.fac = facilityNamed(t, d, "Kellen Fold")
	d.curI, d.curJ = 20, 8
	d.relayout()
	if det := strings.Join(d.details.blocks.facility, "\n"); strings.Contains(det, "load") {
		t.Errorf("details without load data name a load:\n%s", det)
	}
}

// The details state the matching set in the units shown, with what bounds
// each end. At 12192 m, Mach 0.6 the cryogenic tunnel (demo data) reaches
// the flight Reynolds number from its T0 min, 105 K, up to where p0
// reaches its maximum, 450 kPa.
func TestDetailsMatchingSet(t *testing.T) {
	m := newDemo(t, 120, 40)
	m.fac = facilityNamed(t, m, "Kellen Fold")
	m.curI, m.curJ = 20, 8
	m.relayout()
	det, _ := m.res.maps[m.fac].Detail(m.curI, m.curJ)
	s := det.Set
	if !s.OK || s.Single() || s.Cold.T0 != 105 || math.Abs(s.Warm.P0-450e3) > 1e-6*450e3 {
		t.Fatalf("matching set %+v, want a line from T0 105 K up to p0 450 kPa", s)
	}
	for _, u := range []units.System{units.SI, units.Customary} {
		m.units = u
		m.relayout()
		want := []string{
			"set at M 0.600: T0 " + u.Temp(s.Cold.T0) + " – " + u.Temp(s.Warm.T0) +
				", p0 " + u.Stagnation(s.Cold.P0) + " – " + u.Stagnation(s.Warm.P0) +
				", q " + u.Q(s.Cold.Q) + " – " + u.Q(s.Warm.Q),
			"cold end minimum T0, warm end maximum p0",
		}
		if got := m.details.blocks.set; strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("%v: set lines\n%s\nwant\n%s", u, strings.Join(got, "\n"), strings.Join(want, "\n"))
		}
		// Where the panel has room, it shows them.
		view := strings.Join(strings.Fields(m.View()), " ")
		if !strings.Contains(view, strings.Join(strings.Fields(want[1]), " ")) {
			t.Errorf("%v: the matching set is not on the 120×40 screen", u)
		}
	}
}

// The load line keeps to its column: every load where it fits, else the
// one that sets the share, else the share alone. The demo's cryogenic
// tunnel at its balance's normal force: 2.4 kN of 2.4 kN, and a moment
// of 38.75 N·m of 120 N·m (by hand: 0.25 × 114.3 kPa × 28 m² × 0.025² ×
// 0.025 × 3.10 m).
func TestLoadLineNarrow(t *testing.T) {
	st := PlainStyles()
	l := envelope.Load{NormalForce: 2400, MaxNormalForce: 2400, PitchMoment: 38.75, MaxPitchMoment: 120, Share: 1}
	for _, c := range []struct {
		w    int
		want string
	}{
		{100, "load 100 % of capacity: N 2.400 kN of 2.400 kN, M 38.75 N·m of 120.0 N·m"},
		{60, "load 100 % of capacity: N 2.400 kN of 2.400 kN"},
		{40, "load 100 % of capacity"},
	} {
		if got := loadLine(&st, units.SI, l, c.w); got != c.want {
			t.Errorf("width %d: %q, want %q", c.w, got, c.want)
		}
	}
	// Where the moment sets the share, it is the one kept.
	l.PitchMoment, l.NormalForce, l.Share = 114, 1200, 0.95
	if got, want := loadLine(&st, units.SI, l, 60), "load 95 % of capacity: M 114.0 N·m of 120.0 N·m"; got != want {
		t.Errorf("moment setting the share: %q, want %q", got, want)
	}
}
