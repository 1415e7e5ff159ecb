package report

import (
	"fmt"

	"likewind/envelope"
)

// The time and cost part of the review pack. The page draws the run list
// from the run records; the time and cost of each run and the campaign
// summary come from a CostSource, kept apart so that the campaign
// computation (the runs report's time and cost) feeds it without the page
// knowing how it is worked out. Where a facility has no time or cost data
// the page says so and shows no figure: nothing is invented here.

// CostSource gives the time and cost of a facility's run list, where the
// facility's data allows them. ok is false for a facility without time or
// cost data.
type CostSource interface {
	RunListCost(rl RunList) (c FacilityCost, ok bool)
}

// FacilityCost is the time and cost of one run list, written out in the
// units its source chose: the page prints the words as they are (escaped).
type FacilityCost struct {
	// Columns head the time and cost columns added to the run list table,
	// each with its unit, e.g. "run time h", "total h", "cost".
	Columns []string
	// Cells has one row per entry of RunList.Runs (flight point), in the
	// same order, with one cell per column ("" where a figure does not
	// apply, as on a further flight point of the same run).
	Cells [][]string
	// Summary is the campaign summary in order, e.g. {"occupancy",
	// "14.5 h"}, {"shifts (8 h)", "2"}.
	Summary []CostItem
	// Notes are remarks under the summary, e.g. runs shorter than their
	// data time, or a figure left out for want of data.
	Notes []string
}

// CostItem is one line of a campaign summary.
type CostItem struct {
	Label, Value string
}

// check reports a FacilityCost that does not fit a run list of n flight
// points: a row count or a row length that differs.
func (c FacilityCost) check(n int) error {
	if len(c.Cells) != n {
		return fmt.Errorf("%d rows of time and cost for %d flight points", len(c.Cells), n)
	}
	for k, row := range c.Cells {
		if len(row) != len(c.Columns) {
			return fmt.Errorf("row %d has %d cells for %d columns", k+1, len(row), len(c.Columns))
		}
	}
	return nil
}

// clean is c with every word passed through CleanText.
func (c FacilityCost) clean() FacilityCost {
	out := FacilityCost{Columns: envelope.CleanAll(c.Columns), Notes: envelope.CleanAll(c.Notes)}
	for _, row := range c.Cells {
		out.Cells = append(out.Cells, envelope.CleanAll(row))
	}
	for _, it := range c.Summary {
		out.Summary = append(out.Summary, CostItem{Label: envelope.CleanText(it.Label), Value: envelope.CleanText(it.Value)})
	}
	return out
}
