package report

import (
	"fmt"
	"strconv"
	"strings"

	"likewind/atmos"
	"likewind/envelope"
	"likewind/envelope/units"
)

// CampaignSource is the CostSource of the review pack and the time and
// cost words of the runs report: the campaign computation
// (NewCampaignCost) of each run list, written out in units u with shifts
// of length Shift (s; 0: DefaultShift).
type CampaignSource struct {
	Shift float64
	Units units.System
}

// RunListCost implements CostSource: ok is false for a facility without
// campaign data.
func (s CampaignSource) RunListCost(rl RunList) (FacilityCost, bool) {
	cc, ok := NewCampaignCost(rl, s.Shift)
	if !ok {
		return FacilityCost{}, false
	}
	return cc.Words(len(rl.Runs), s.Units), true
}

// Column heads of the time and cost columns.
const (
	ColRunTime = "run time min"
	ColTotal   = "total h"
	ColBlow    = "blow s"
	ColBlows   = "blows"
)

// leftOut is the value of a figure left out for want of data.
const leftOut = "left out (data not given)"

// Words writes the campaign out for a run list of n flight points: the
// time and cost columns (one row per flight point; the figures of a run on
// its first point), the summary and the notes.
func (cc CampaignCost) Words(n int, u units.System) FacilityCost {
	fc := FacilityCost{Columns: []string{ColRunTime, ColTotal}}
	blow := cc.Data.Blowdown() && cc.Medium.IsGas()
	if blow {
		fc.Columns = append(fc.Columns, ColBlow, ColBlows)
	}
	fc.Cells = make([][]string, n)
	for k := range fc.Cells {
		fc.Cells[k] = make([]string, len(fc.Columns))
	}
	for _, r := range cc.Runs {
		row := fc.Cells[r.First]
		if r.Known {
			row[0] = strconv.FormatFloat(r.Time/atmos.Minute, 'f', 1, 64)
		}
		if r.TotalKnown {
			row[1] = strconv.FormatFloat(r.Total/atmos.Hour, 'f', 2, 64)
		}
		if blow {
			switch {
			case r.NoBlow:
				row[2] = "none"
			case r.HasBlow:
				row[2] = strconv.FormatFloat(r.Blow, 'f', 1, 64)
				if r.Blows > 0 {
					row[3] = strconv.Itoa(r.Blows)
					if r.Short {
						row[3] += " short"
					}
				}
			}
		}
	}
	add := func(label, value string) { fc.Summary = append(fc.Summary, CostItem{Label: label, Value: value}) }
	if n == 0 {
		add("campaign", "no points to run")
		return fc
	}
	fig := func(ok bool, s string) string {
		if !ok {
			return leftOut
		}
		return s
	}
	d := cc.Data
	if d.ModelChange.Set {
		add("model installation", Hours(d.ModelChange.V))
	} else {
		add("model installation", leftOut)
	}
	add("data points", fig(cc.DataKnown, fmt.Sprintf("%d at %s: %s", n, Duration(d.DataPoint.V), Hours(cc.DataTime))))
	add("set-point changes", cc.changeWords())
	if blow {
		custom := u == units.Customary
		add("storage", fmt.Sprintf("%s at %s, a blow ending at %s × p0 (isentropic storage; blow length from the choked mass flow, NACA Report 1135)",
			atmos.Format(d.StorageVolume.V, atmos.Volume, custom), atmos.Format(d.StoragePressure.V, atmos.Pressure, custom),
			atmos.FormatNumber(d.UsableRatio.V)))
		add("blows", fmt.Sprintf("%d, each followed by a %s recharge: %s", cc.Blows, Duration(d.Recharge.V), Hours(cc.Recharge)))
	}
	add("campaign time", fig(cc.TimeKnown, Hours(cc.Time)))
	add(fmt.Sprintf("shifts (%s)", strings.TrimSuffix(strings.TrimSuffix(Hours(cc.Shift), " h"), ".00")+" h"), fig(cc.TimeKnown, strconv.Itoa(cc.Shifts)))
	if d.OccupancyCost.Set {
		add("occupancy cost", fig(cc.CostKnown, fmt.Sprintf("%s (%s per hour)", Money(cc.Cost, cc.Currency),
			Money(d.OccupancyCost.Amount*atmos.Hour, d.OccupancyCost.Currency))))
	} else {
		add("occupancy cost", leftOut)
	}
	if d.CoolantUse.Set {
		add("coolant", fig(cc.CoolantKnown, massWords(cc.Coolant, u)))
		if d.CoolantPrice.Set {
			add("coolant cost", fig(cc.CoolantCostKnown, Money(cc.CoolantCost, d.CoolantPrice.Currency)))
		} else {
			add("coolant cost", leftOut)
		}
	}
	if d.OccupancyCost.Set || d.CoolantPrice.Set {
		add("total cost", fig(cc.TotalCostKnown, Money(cc.TotalCost, cc.Currency)))
	}
	saved := leftOut
	if cc.SavedKnown {
		if cc.Saved >= 0 {
			saved = fmt.Sprintf("%s against the order given (%s of runs there, %s here)", Hours(cc.Saved), Hours(cc.GivenTime), Hours(cc.GivenTime-cc.Saved))
		} else {
			saved = fmt.Sprintf("none: the order given is %s quicker (%s of runs there, %s here)", Hours(-cc.Saved), Hours(cc.GivenTime), Hours(cc.GivenTime-cc.Saved))
		}
	}
	add("facility order saves", saved)
	fc.Notes = cc.RunNotes()
	if m := cc.MissingNote(); m != "" {
		fc.Notes = append(fc.Notes, m)
	}
	if blow {
		fc.Notes = append(fc.Notes, "the air storage is a pressure vessel: its charging and every blow follow the facility's pressure-equipment procedures and local codes")
	}
	if d.CoolantUse.Set {
		fc.Notes = append(fc.Notes, "the coolant is a cryogen: handling, venting and oxygen-deficiency monitoring follow the facility's procedures")
	}
	fc.Notes = append(fc.Notes, "planning estimates from the facility file's figures; the facility's own schedule and procedures govern")
	return fc
}

// changeWords are the set-point changes by kind with their times, e.g.
// "T0 1 (0.58 h), p0 1 (0.10 h), Mach 2 (0.07 h)".
func (cc CampaignCost) changeWords() string {
	names := [3]string{"T0", "p0", "Mach"}
	if cc.Medium == envelope.MediumWater {
		names = [3]string{"temperature", "pressure", "speed"}
	}
	counts := cc.Kinds
	var parts []string
	for k, name := range names {
		t := "time " + leftOut
		if cc.ChangeKnown[k] || counts[k] == 0 {
			t = Hours(cc.ChangeTime[k])
		}
		parts = append(parts, fmt.Sprintf("%s %d (%s)", name, counts[k], t))
	}
	s := strings.Join(parts, ", ")
	if cc.Changes.Q > 0 {
		s += fmt.Sprintf("; p0 counts each step that moves p0 or the held q (%d moves of q) once", cc.Changes.Q)
	}
	return s
}

// massWords writes a coolant mass in kg and t, or in lb.
func massWords(kg float64, u units.System) string {
	if u == units.Customary {
		return fmt.Sprintf("%.0f lb", kg/atmos.PoundMass)
	}
	return fmt.Sprintf("%.0f kg (%.2f t)", kg, kg/atmos.Tonne)
}
