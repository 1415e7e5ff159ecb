package main

import (
	"strings"
	"testing"
	"time"
)

// The frames the program writes line by line (changed lines only, blocks
// of rows moved by the terminal) leave tmux's screen as a full repaint of
// the same state would: after what-if edits that add and remove a header
// line, scrolling and a layer change, the screen is captured, then a
// resize there and back makes the program repaint every row, and the two
// captures must be the same. Skips without tmux.
func TestTmuxFramesMatchRepaint(t *testing.T) {
	skipTerminalTest(t)
	bin := buildLikewind(t)
	p := startTmux(t, 150, 45, "env", "XDG_STATE_HOME="+t.TempDir(), bin, "--fresh")
	p.wait = 30 * time.Second
	idle := func(s string) bool {
		return strings.Contains(s, "likewind") && !strings.Contains(header(s), "computing")
	}
	settle := func() string {
		time.Sleep(150 * time.Millisecond)
		return p.waitScreen("the idle interface", idle)
	}
	settle()
	edit := func(val string) {
		p.send("Enter")
		p.send("C-u")
		p.send("-l", val)
		p.send("Enter")
		settle()
	}
	p.send("e")
	p.send("Down")
	edit("5K") // a what-if line comes into the header
	edit("0K") // and goes
	edit("8K")
	p.send("Escape")
	for _, k := range []string{"Up", "Up", "Up", "Down", "Right", "Tab", "Down", "Down"} {
		p.send(k)
	}
	before := settle()
	if err := p.resize(149, 45); err != nil {
		t.Skipf("tmux cannot resize: %v", err)
	}
	settle()
	if err := p.resize(150, 45); err != nil {
		t.Fatal(err)
	}
	after := settle()
	if before != after {
		t.Errorf("the screen built from changed lines differs from a repaint\nbuilt:\n%s\nrepainted:\n%s", before, after)
	}
	if !strings.Contains(header(before), "what-if:") {
		t.Errorf("the last edit's what-if line is not in the header:\n%s", header(before))
	}
	// Quit without saving and wait for the program to end, so that it
	// writes nothing into the state folder while the test removes it.
	p.send("q")
	p.send("y")
	p.waitGone(10 * time.Second)
}
