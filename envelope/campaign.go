package envelope

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"

	"likewind/atmos"
)

// Campaign is a facility's optional time and cost data, the
// [facility.campaign] table of a facility file: what its occupancy costs,
// how long a model change, a data point and each kind of set-point change
// take, and for a blowdown tunnel its air storage, for a cryogenic one its
// coolant. Every figure is optional: a figure not given is left out of the
// campaign's time and cost, never guessed (the zero Opt or Money is "not
// given"). All SI once loaded: s, s/K, m³, Pa, kg/s; money per s or per kg.
type Campaign struct {
	// OccupancyCost is the cost of an hour in the facility, kept per
	// second.
	OccupancyCost Money
	ModelChange   Opt // s, to install or change the model
	DataPoint     Opt // s, one data point (a polar, a sweep) at a set point
	// T0PerKelvin and T0Fixed give the time of a T0 change (water: of the
	// water temperature): T0Fixed + T0PerKelvin·|ΔT0|.
	T0PerKelvin Opt // s/K
	T0Fixed     Opt // s
	P0Change    Opt // s, per change of p0 (water: static pressure)
	MachChange  Opt // s, per change of Mach number (water: speed)

	// Blowdown storage (air and nitrogen only; all three or none): the
	// storage volume, the pressure it is charged to, the ratio of storage
	// pressure to the set p0 below which the control valve no longer holds
	// p0, and the time to recharge the storage after a blow.
	StorageVolume   Opt // m³
	StoragePressure Opt // Pa
	UsableRatio     Opt // storage pressure over p0 at the end of a blow, ≥ 1
	Recharge        Opt // s

	// Coolant use of a cryogenic tunnel per second of occupancy (air and
	// nitrogen only), and its price per kg.
	CoolantUse   Opt // kg/s
	CoolantPrice Money
}

// Opt is an optional figure: Set says it was given.
type Opt struct {
	V   float64
	Set bool
}

// Money is an optional cost: Amount of Currency per second (a rate) or per
// kilogram (a price); Set says it was given.
type Money struct {
	Amount   float64
	Currency string // a three-letter code as written, upper case, e.g. "EUR"
	Set      bool
}

// Any reports whether any campaign figure is given.
func (c Campaign) Any() bool { return c != Campaign{} }

// Blowdown reports whether the campaign describes a blowdown tunnel (its
// storage is given).
func (c Campaign) Blowdown() bool { return c.StorageVolume.Set }

// File keys of [facility.campaign], in the order docs/FORMAT.md lists them.
const (
	keyCampaign        = "campaign"
	keyOccupancyCost   = "occupancy_cost"
	keyModelChange     = "model_change_time"
	keyDataPoint       = "data_point_time"
	keyT0PerKelvin     = "t0_change_per_kelvin"
	keyT0Fixed         = "t0_change_fixed"
	keyP0Change        = "p0_change_time"
	keyMachChange      = "mach_change_time"
	keyStorageVolume   = "storage_volume"
	keyStoragePressure = "storage_pressure"
	keyUsableRatio     = "usable_pressure_ratio"
	keyRecharge        = "recharge_time"
	keyCoolantUse      = "coolant_use"
	keyCoolantPrice    = "coolant_price"
)

// Plausibility bounds of the campaign figures (planning choices of this
// program: generous, to catch a slip of unit rather than to judge).
const (
	maxCampaignTime    = 1000 * atmos.Hour // s, any one duration
	maxT0PerKelvin     = 10 * atmos.Hour   // s/K
	maxStorageVolume   = 1e6               // m³
	maxUsableRatio     = 10
	maxCoolantUse      = 1000 * atmos.Tonne / atmos.Hour // kg/s
	maxCostAmount      = 1e12
	campaignTimeExpect = "a time from 0 s to 1000 h"
)

var (
	uTime        = unit{dim: atmos.Time, example: "15 min"}
	uTimePerK    = unit{dim: atmos.TimePerTemperature, example: "1.5 min/K"}
	uVolume      = unit{dim: atmos.Volume, example: "60 m3"}
	uMassRate    = unit{dim: atmos.MassRate, example: "8 t/h"}
	uUsableRatio = unit{dim: atmos.Dimensionless, example: "1.3"}
)

// campaignFields are the keys of [facility.campaign], read into c.
func campaignFields(c *Campaign) []field {
	timeBound := Bound{Lo: 0, Hi: maxCampaignTime, Expected: campaignTimeExpect}
	return []field{
		costField{key: keyOccupancyCost, per: atmos.Time, to: &c.OccupancyCost},
		optField{key: keyModelChange, unit: uTime, bound: timeBound, to: &c.ModelChange},
		optField{key: keyDataPoint, unit: uTime, bound: aboveZero(maxCampaignTime, "a time above 0 s and at most 1000 h"), to: &c.DataPoint},
		optField{key: keyT0PerKelvin, unit: uTimePerK, bound: Bound{Lo: 0, Hi: maxT0PerKelvin, Expected: "a time per kelvin from 0 to 10 h/K"}, to: &c.T0PerKelvin},
		optField{key: keyT0Fixed, unit: uTime, bound: timeBound, to: &c.T0Fixed},
		optField{key: keyP0Change, unit: uTime, bound: timeBound, to: &c.P0Change},
		optField{key: keyMachChange, unit: uTime, bound: timeBound, to: &c.MachChange},
		optField{key: keyStorageVolume, unit: uVolume, bound: aboveZero(maxStorageVolume, "a volume above 0 m³ and at most 1e6 m³"), to: &c.StorageVolume},
		optField{key: keyStoragePressure, unit: uPressure, bound: FacilityPressureBound(), to: &c.StoragePressure},
		optField{key: keyUsableRatio, unit: uUsableRatio, bound: Bound{Lo: 1, Hi: maxUsableRatio, Expected: "a ratio of storage pressure to p0 from 1 to 10"}, to: &c.UsableRatio},
		optField{key: keyRecharge, unit: uTime, bound: timeBound, to: &c.Recharge},
		optField{key: keyCoolantUse, unit: uMassRate, bound: aboveZero(maxCoolantUse, "a mass flow above 0 and at most 1000 t/h"), to: &c.CoolantUse},
		costField{key: keyCoolantPrice, per: atmos.Mass, to: &c.CoolantPrice},
	}
}

// campaignTable is the [facility.campaign] row of a facility: its keys
// read one by one, then checked together and against the facility read
// before it (checkCampaign). Written back only when a figure is given.
type campaignTable struct {
	f      *Facility
	fields []field
	keys   []string
}

func newCampaignTable(f *Facility) campaignTable {
	fs := campaignFields(&f.Campaign)
	return campaignTable{f: f, fields: fs, keys: fieldKeys(fs)}
}

func (c campaignTable) name() string { return keyCampaign }

func (c campaignTable) read(t *table) {
	st := t.sub(keyCampaign, c.keys, false)
	if st == nil {
		c.f.Campaign = Campaign{}
		return
	}
	readFields(st, c.fields)
	st.finish()
	st.d.checkCampaign(st, c.f)
}

func (c campaignTable) write(b *strings.Builder, table string) {
	if !c.f.Campaign.Any() {
		return
	}
	path := joinPath(table, keyCampaign)
	b.WriteString("\n[" + path + "]\n")
	writeFields(b, path, c.fields)
}

// checkCampaign checks the campaign figures of f together: blowdown
// storage keys all or none, on a gas facility, charged to at least the
// facility's highest p0; coolant on a gas facility, its price only with
// its use; one currency for every cost.
func (d *doc) checkCampaign(t *table, f *Facility) {
	c := &f.Campaign
	fail := func(key, found, expected string) {
		p := t.keyPath(key)
		d.fail(p, display(p), found, expected)
	}
	storage := []string{keyStorageVolume, keyStoragePressure, keyUsableRatio, keyRecharge}
	if f.Medium == MediumWater {
		for _, k := range append(storage, keyCoolantUse, keyCoolantPrice) {
			if t.has(k) {
				fail(k, k+" on a water facility", "no "+k+" (blowdown storage and coolant apply to air and nitrogen facilities)")
			}
		}
		c.StorageVolume, c.StoragePressure, c.UsableRatio, c.Recharge = Opt{}, Opt{}, Opt{}, Opt{}
		c.CoolantUse, c.CoolantPrice = Opt{}, Money{}
		return
	}
	given := 0
	for _, k := range storage {
		if t.has(k) {
			given++
		}
	}
	if given > 0 && given < len(storage) {
		for _, k := range storage {
			if !t.has(k) {
				t.missing(k, "the blowdown storage in full: "+strings.Join(storage, ", ")+" together (or none of them)")
			}
		}
	}
	if c.StoragePressure.Set && f.Gas.P0Max > 0 && c.StoragePressure.V < f.Gas.P0Max {
		fail(keyStoragePressure, describe(t.m[keyStoragePressure]),
			fmt.Sprintf("a storage pressure at least the facility's highest p0, %s Pa", num(f.Gas.P0Max)))
		c.StoragePressure = Opt{}
	}
	if !(c.StorageVolume.Set && c.StoragePressure.Set && c.UsableRatio.Set && c.Recharge.Set) {
		c.StorageVolume, c.StoragePressure, c.UsableRatio, c.Recharge = Opt{}, Opt{}, Opt{}, Opt{}
	}
	if t.has(keyCoolantPrice) && !t.has(keyCoolantUse) {
		fail(keyCoolantPrice, "a coolant price with no coolant use", keyCoolantUse+", the coolant used per hour, that it prices")
		c.CoolantPrice = Money{}
	}
	if o, p := c.OccupancyCost, c.CoolantPrice; o.Set && p.Set && o.Currency != p.Currency {
		fail(keyCoolantPrice, describe(t.m[keyCoolantPrice]), "a price in "+o.Currency+", the currency of "+keyOccupancyCost)
		c.CoolantPrice = Money{}
	}
}

// optField is a key holding an optional quantity of unit within bound,
// stored with its Set flag (a refused value is not set).
type optField struct {
	key   string
	unit  unit
	bound Bound
	to    *Opt
}

func (f optField) name() string { return f.key }

func (f optField) read(t *table) {
	q := t.quantity(f.key, f.unit, false)
	v := t.d.within(&q, f.bound)
	*f.to = Opt{V: v, Set: q.ok}
}

func (f optField) write(b *strings.Builder, _ string) {
	if f.to.Set {
		kv(b, f.key, si(f.to.V, f.unit.si()))
	}
}

// costField is a key holding an optional cost: an amount, a currency code
// and a unit it is per, e.g. "2400 EUR/h" (per a time) or "0.15 EUR/kg"
// (per a mass), stored per SI unit (per second, per kilogram).
type costField struct {
	key string
	per atmos.Dimension // atmos.Time or atmos.Mass
	to  *Money
}

func (f costField) name() string { return f.key }

func (f costField) expect() string {
	if f.per == atmos.Mass {
		return `a price per mass with its currency, e.g. "0.15 EUR/kg" (per: ` + strings.Join(atmos.UnitsFor(atmos.Mass), ", ") + ")"
	}
	return `a cost per hour with its currency, e.g. "2400 EUR/h" (per: ` + strings.Join(atmos.UnitsFor(atmos.Time), ", ") + ")"
}

func (f costField) read(t *table) {
	*f.to = Money{}
	raw, ok := t.get(f.key)
	if !ok {
		return
	}
	p := t.keyPath(f.key)
	s, isText := raw.(string)
	if !isText {
		found := describe(raw)
		if _, isNum := raw.(int64); isNum {
			found += " (a number without its unit)"
		} else if _, isNum := raw.(float64); isNum {
			found += " (a number without its unit)"
		}
		t.d.fail(p, display(p), found, f.expect()+", in quotes")
		return
	}
	m, why := ParseCost(s, f.per)
	if why != "" {
		t.d.fail(p, display(p), strconv.Quote(s)+" ("+why+")", f.expect())
		return
	}
	*f.to = m
}

func (f costField) write(b *strings.Builder, _ string) {
	if !f.to.Set {
		return
	}
	per := "s"
	if f.per == atmos.Mass {
		per = "kg"
	}
	kv(b, f.key, tomlQuote(num(f.to.Amount)+" "+f.to.Currency+"/"+per))
}

// ParseCost reads a cost as "AMOUNT CUR/UNIT": a number from 0 (at most
// 1e12 per second or per kg), a
// currency code of three letters (any case; kept upper case) and, after a
// slash, a unit of dimension per (atmos.Time: s, min, h; atmos.Mass: kg,
// g, t, lb). The amount is returned per SI unit (per second, per kg). why
// says what is wrong ("" when the text is a cost).
func ParseCost(s string, per atmos.Dimension) (m Money, why string) {
	t := strings.TrimSpace(s)
	numText, rest, ok := splitCostNumber(t)
	if !ok {
		return Money{}, "no number"
	}
	v, err := strconv.ParseFloat(numText, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return Money{}, "not a finite number"
	}
	if v < 0 {
		return Money{}, "an amount from 0 to 1e12 per second or per kg is expected"
	}
	rest = strings.TrimSpace(rest)
	if rest == "" {
		return Money{}, "missing currency and unit"
	}
	cur, unitText, slash := strings.Cut(rest, "/")
	cur = strings.TrimSpace(cur)
	perWord, perEg := "per hour", "/h"
	if per == atmos.Mass {
		perWord, perEg = "per mass", "/kg"
	}
	if cur == "" {
		return Money{}, "missing currency"
	}
	if !isCurrencyCode(cur) {
		if _, err := atmos.ParseQuantity("1 "+rest, per); err == nil {
			return Money{}, "missing currency"
		}
		return Money{}, fmt.Sprintf("%q is no currency code (three letters, e.g. EUR, USD)", cur)
	}
	if isUnitWord(cur) {
		return Money{}, fmt.Sprintf("%q is a unit, not a currency", cur)
	}
	if !slash || strings.TrimSpace(unitText) == "" {
		return Money{}, "missing the unit it is " + perWord + ", e.g. " + perEg
	}
	one, err := atmos.ToSI(1, strings.TrimSpace(unitText), per)
	if err != nil {
		return Money{}, reason(unitText, err)
	}
	// The bound holds for the amount per SI unit, the form it is written
	// back in, so that a file written reads back.
	if v/one > maxCostAmount {
		return Money{}, "an amount from 0 to 1e12 per second or per kg is expected"
	}
	return Money{Amount: v / one, Currency: strings.ToUpper(cur), Set: true}, ""
}

// splitCostNumber separates the leading number of a cost from its
// currency (ParseQuantity's number rules: sign, digits, a point, an
// exponent).
func splitCostNumber(s string) (num, rest string, ok bool) {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && (s[i] >= '0' && s[i] <= '9' || s[i] == '.') {
		if s[i] != '.' {
			digits++
		}
		i++
	}
	if digits == 0 {
		return "", s, false
	}
	if i+1 < len(s) && (s[i] == 'e' || s[i] == 'E') && (s[i+1] >= '0' && s[i+1] <= '9' || s[i+1] == '-' || s[i+1] == '+') {
		j := i + 1
		if s[j] == '-' || s[j] == '+' {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return s[:i], s[i:], true
}

// isCurrencyCode reports three ASCII letters.
func isCurrencyCode(s string) bool {
	if len(s) != 3 {
		return false
	}
	for _, r := range s {
		if r > unicode.MaxASCII || !unicode.IsLetter(r) {
			return false
		}
	}
	return true
}

// isUnitWord reports a word that is a unit of some physical dimension
// ("bar", "psi", "min"), which a cost must not take for its currency.
func isUnitWord(s string) bool {
	for _, d := range atmos.Dimensions() {
		if _, err := atmos.ToSI(1, s, d); d != atmos.Dimensionless && err == nil {
			return true
		}
	}
	return false
}
