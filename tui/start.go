package tui

import "likewind/envelope"

// StartFacility is the facility a view opens on when nothing chose one:
// the one with the largest share of full matches, then of matched points
// (any class but out of reach), then the first in file order. It is -1
// when no facility has results. The interface and `likewind dump` both use
// it, so a dump without --facility shows what the interface opens on.
func StartFacility(maps []*envelope.Map) int {
	best := -1
	var bestFull, bestMatched float64
	for k, mp := range maps {
		if mp == nil {
			continue
		}
		sh := mp.Shares()
		full, matched := sh.Share(envelope.FullMatch), sh.Matched()
		if best < 0 || full > bestFull || (full == bestFull && matched > bestMatched) {
			best, bestFull, bestMatched = k, full, matched
		}
	}
	return best
}
