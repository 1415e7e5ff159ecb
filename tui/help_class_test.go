package tui

import (
	"strings"
	"testing"

	"github.com/charmbracelet/x/ansi"
)

// TestHelpClassWording: the help screen defines Mach relaxed as the flight
// Reynolds number reached at a test Mach number other than flight (usually
// higher), never "at a lower Mach".
func TestHelpClassWording(t *testing.T) {
	for _, want := range []string{"other than flight", "usually higher", "compressibility threshold"} {
		if !strings.Contains(ClassHelp, want) {
			t.Errorf("ClassHelp lacks %q: %s", want, ClassHelp)
		}
	}
	m, _ := press(newDemo(t, 160, 48), "?")
	screen := strings.Join(strings.Fields(ansi.Strip(m.View())), " ")
	if strings.Contains(screen, "lower Mach") {
		t.Errorf("help screen still says \"lower Mach\":\n%s", screen)
	}
	if !strings.Contains(screen, "other than flight (usually higher)") {
		t.Errorf("help screen lacks the Mach-relaxed definition:\n%s", screen)
	}
}
