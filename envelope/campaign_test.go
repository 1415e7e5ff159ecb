package envelope

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"likewind/atmos"
)

// TestParseCost: costs carry an amount, a currency and what they are per;
// the amount comes back per second or per kilogram.
func TestParseCost(t *testing.T) {
	good := []struct {
		in   string
		per  atmos.Dimension
		want Money
	}{
		// 2400 per hour is 2400/3600 per second.
		{"2400 EUR/h", atmos.Time, Money{Amount: 2400.0 / 3600, Currency: "EUR", Set: true}},
		{"40 usd/min", atmos.Time, Money{Amount: 40.0 / 60, Currency: "USD", Set: true}},
		{"1.5e3 GBP / hour", atmos.Time, Money{Amount: 1500.0 / 3600, Currency: "GBP", Set: true}},
		{"0.15 EUR/kg", atmos.Mass, Money{Amount: 0.15, Currency: "EUR", Set: true}},
		// 150 per tonne is 0.15 per kg.
		{"150 EUR/t", atmos.Mass, Money{Amount: 150.0 / 1000, Currency: "EUR", Set: true}},
		{"0 EUR/h", atmos.Time, Money{Amount: 0, Currency: "EUR", Set: true}},
	}
	for _, tc := range good {
		got, why := ParseCost(tc.in, tc.per)
		if why != "" || got.Currency != tc.want.Currency || !got.Set || relDiff(got.Amount, tc.want.Amount) > 1e-15 {
			t.Errorf("ParseCost(%q) = %+v, %q; want %+v", tc.in, got, why, tc.want)
		}
	}
	bad := []struct {
		in, why string
		per     atmos.Dimension
	}{
		{"2400", "missing currency and unit", atmos.Time},
		{"2400 EUR", "missing the unit it is per hour, e.g. /h", atmos.Time},
		{"2400 /h", "missing currency", atmos.Time},
		{"2400 EURO/h", `"EURO" is no currency code`, atmos.Time},
		{"2400 EUR/kg", `"kg" is a mass unit`, atmos.Time},
		{"0.15 EUR/h", `"h" is a time unit`, atmos.Mass},
		{"5 bar/h", `"bar" is a unit, not a currency`, atmos.Time},
		{"-5 EUR/h", "an amount from 0 to 1e12 per second or per kg is expected", atmos.Time},
		// 1e12 per gram is 1e15 per kg, beyond the bound (and so it could
		// not be written back in SI).
		{"1e12 EUR/g", "an amount from 0 to 1e12 per second or per kg is expected", atmos.Mass},
		{"EUR 2400/h", "no number", atmos.Time},
		{"2400 EUR/fortnight", `unknown time unit "fortnight"`, atmos.Time},
	}
	for _, tc := range bad {
		got, why := ParseCost(tc.in, tc.per)
		if got.Set || !strings.Contains(why, tc.why) {
			t.Errorf("ParseCost(%q) = %+v, %q; want a refusal saying %q", tc.in, got, why, tc.why)
		}
	}
}

func relDiff(a, b float64) float64 {
	if b == 0 {
		return a
	}
	d := (a - b) / b
	if d < 0 {
		return -d
	}
	return d
}

const campaignFacility = `
[[facility]]
name = "Test blowdown"
medium = "air"
mach_range = ["1.5", "3"]
stagnation_pressure_range = ["2 bar", "10 bar"]
stagnation_temperature_range = ["280 K", "300 K"]
section_width = "0.5 m"
section_height = "0.4 m"

[facility.campaign]
occupancy_cost = "1200 EUR/h"
model_change_time = "3 h"
data_point_time = "45 s"
t0_change_per_kelvin = "1 min/degF"
t0_change_fixed = "0 min"
p0_change_time = "5 min"
mach_change_time = "2 h"
storage_volume = "1000 ft3"
storage_pressure = "20 bar"
usable_pressure_ratio = 1.25
recharge_time = "40 min"
coolant_use = "2000 lb/h"
coolant_price = "100 eur/t"
`

// TestCampaignLoad reads every campaign key into SI and writes it back.
func TestCampaignLoad(t *testing.T) {
	fs, err := ParseFacilities("camp.toml", []byte(campaignFacility))
	if err != nil {
		t.Fatal(err)
	}
	c := fs[0].Campaign
	want := Campaign{
		OccupancyCost: Money{Amount: 1200.0 / 3600, Currency: "EUR", Set: true},
		ModelChange:   Opt{3 * 3600, true},
		DataPoint:     Opt{45, true},
		// 1 min per °F is 60·9/5 = 108 s per kelvin.
		T0PerKelvin:     Opt{108, true},
		T0Fixed:         Opt{0, true},
		P0Change:        Opt{300, true},
		MachChange:      Opt{7200, true},
		StorageVolume:   Opt{1000 * atmos.CubicFoot, true}, // 28.316846592 m³ (exact foot)
		StoragePressure: Opt{20e5, true},
		UsableRatio:     Opt{1.25, true},
		Recharge:        Opt{2400, true},
		// 2000 lb/h = 2000 · 0.45359237 / 3600 kg/s.
		CoolantUse:   Opt{2000 * atmos.PoundMass / 3600, true},
		CoolantPrice: Money{Amount: 0.1, Currency: "EUR", Set: true},
	}
	const tol = 1e-12
	gv, wv := reflect.ValueOf(c), reflect.ValueOf(want)
	for i := range gv.NumField() {
		g, w := gv.Field(i).Interface(), wv.Field(i).Interface()
		switch g := g.(type) {
		case Opt:
			w := w.(Opt)
			if g.Set != w.Set || relDiff(g.V, w.V) > tol {
				t.Errorf("%s = %+v, want %+v", gv.Type().Field(i).Name, g, w)
			}
		case Money:
			w := w.(Money)
			if g.Set != w.Set || g.Currency != w.Currency || relDiff(g.Amount, w.Amount) > tol {
				t.Errorf("%s = %+v, want %+v", gv.Type().Field(i).Name, g, w)
			}
		}
	}
	if !c.Blowdown() || !c.Any() {
		t.Error("Blowdown or Any false for a full campaign")
	}
	back, err := ParseFacilities("back.toml", MarshalFacilities(fs))
	if err != nil {
		t.Fatalf("reading back: %v\n%s", err, MarshalFacilities(fs))
	}
	if !reflect.DeepEqual(back[0].Campaign, c) {
		t.Errorf("round trip %+v, want %+v", back[0].Campaign, c)
	}
	// A facility without the table writes none.
	fs[0].Campaign = Campaign{}
	if text := string(MarshalFacilities(fs)); strings.Contains(text, "campaign") {
		t.Errorf("a facility without campaign data wrote a campaign table:\n%s", text)
	}
}

// TestCampaignFormatExample: the [facility.campaign] example of
// docs/FORMAT.md reads as it says.
func TestCampaignFormatExample(t *testing.T) {
	doc, err := os.ReadFile(filepath.Join("..", "docs", "FORMAT.md"))
	if err != nil {
		t.Fatal(err)
	}
	_, rest, ok := strings.Cut(string(doc), "```toml\n[facility.campaign]")
	if !ok {
		t.Fatal("docs/FORMAT.md has no [facility.campaign] example")
	}
	example, _, _ := strings.Cut(rest, "```")
	text := `[[facility]]
name = "Example"
medium = "nitrogen"
mach_range = ["0.2", "0.9"]
stagnation_pressure_range = ["1 bar", "4 bar"]
stagnation_temperature_range = ["110 K", "310 K"]
section_width = "2 m"
section_height = "2 m"

[facility.campaign]` + example
	fs, err := ParseFacilities("example.toml", []byte(text))
	if err != nil {
		t.Fatalf("the FORMAT.md example: %v", err)
	}
	c := fs[0].Campaign
	// As the example's comments say: 2400 EUR/h, 4 h, 6 min, 0.8 min/K
	// and 10 min, 8 min, 3 min, 9 t/h at 0.14 EUR/kg.
	if relDiff(c.OccupancyCost.Amount*3600, 2400) > 1e-12 || c.ModelChange.V != 4*3600 || c.DataPoint.V != 360 ||
		relDiff(c.T0PerKelvin.V, 48) > 1e-12 || c.T0Fixed.V != 600 || c.P0Change.V != 480 || c.MachChange.V != 180 ||
		relDiff(c.CoolantUse.V*3600, 9000) > 1e-12 || relDiff(c.CoolantPrice.Amount, 0.14) > 1e-12 {
		t.Errorf("the FORMAT.md example reads %+v", c)
	}
}
