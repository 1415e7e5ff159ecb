package envelope

// Names of the media a facility can use: water and the gases of atmos.

import (
	"strconv"
	"strings"

	"likewind/atmos"
)

// gasMedia are the canonical names of the gases atmos knows, in its
// order (atmos.GasNames without the other spellings).
func gasMedia() []string {
	var out []string
	seen := map[string]bool{}
	for _, n := range atmos.GasNames() {
		g, err := atmos.GasByName(n)
		if err != nil || seen[g.Name()] {
			continue
		}
		seen[g.Name()] = true
		out = append(out, g.Name())
	}
	return out
}

// joinOr lists words as "a, b or c".
func joinOr(words []string) string {
	switch len(words) {
	case 0:
		return ""
	case 1:
		return words[0]
	}
	out := words[0]
	for _, w := range words[1 : len(words)-1] {
		out += ", " + w
	}
	return out + " or " + words[len(words)-1]
}

// mediumNamed is the medium a file's medium text names: water, or a gas
// atmos.GasByName knows (by its canonical name). Case is ignored; space
// around the name is not.
func mediumNamed(s string) (Medium, bool) {
	if strings.TrimSpace(s) != s {
		return "", false
	}
	if strings.EqualFold(s, string(MediumWater)) {
		return MediumWater, true
	}
	g, err := atmos.GasByName(s)
	if err != nil {
		return "", false
	}
	return Medium(g.Name()), true
}

// mediumWanted lists the media a facility file may name, e.g. `"air",
// "nitrogen" or "water"`.
func mediumWanted() string {
	var q []string
	for _, n := range append(gasMedia(), string(MediumWater)) {
		q = append(q, strconv.Quote(n))
	}
	return joinOr(q)
}

// andList lists words as "a, b and c".
func andList(words []string) string {
	s := joinOr(words)
	if i := strings.LastIndex(s, " or "); i >= 0 {
		s = s[:i] + " and " + s[i+len(" or "):]
	}
	return s
}
