package envelope

import "strings"

// nearest returns the allowed key closest to a misspelt one, or "" when
// none is within two edits.
func nearest(key string, allowed []string) string {
	best, bestD := "", 3
	for _, a := range allowed {
		if d := editDistance(strings.ToLower(key), a); d < bestD {
			best, bestD = a, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between two short strings.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
