package report

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"likewind/envelope"
)

// TestReadmeNamesColumns: README's output sections name every column of
// the export and of the run list, in backquotes, so that a new column
// cannot go undocumented, and states each operating rule by its name.
func TestReadmeNamesColumns(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	readme := string(b)
	for what, cols := range map[string][]string{"export": ExportColumns(), "runs": RunColumns()} {
		for _, c := range cols {
			if !strings.Contains(readme, "`"+c+"`") {
				t.Errorf("README does not name the %s column `%s`", what, c)
			}
		}
	}
	// Each rule a facility may name has its entry under "Operating rule".
	_, rules, _ := strings.Cut(readme, "**Operating rule.**")
	for _, k := range envelope.RuleKinds("nitrogen") {
		if !strings.Contains(rules, "- `"+k.String()+"` — ") {
			t.Errorf("README's operating rules lack an entry for %q", k)
		}
	}
}
