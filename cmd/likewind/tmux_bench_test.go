package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"likewind/envelope"
	"likewind/envelope/units"
	"likewind/tui"
)

// The interface's what-if edits measured the way a user sees them: the
// built command in tmux at 200×60, keys sent with send-keys, the screen
// read with capture-pane until the edited value is in the header and
// "computing" has gone (polled every 2 ms, so each figure is late by up to
// one capture and pause, a few ms). The pseudo-terminal benchmark in tui
// (BenchmarkTerminalEdit) times the same edits without tmux in between.
// Skips without tmux.
//
//	go test ./cmd/likewind/ -run '^$' -bench TmuxEdit -benchtime 20x

// tmuxPane is one tmux session of the benchmark, on its own server.
type tmuxPane struct {
	tb     testing.TB
	socket string
	name   string
}

func (p *tmuxPane) run(args ...string) ([]byte, error) {
	return exec.Command("tmux", append([]string{"-S", p.socket}, args...)...).CombinedOutput()
}

func (p *tmuxPane) screen() string {
	out, _ := p.run("capture-pane", "-p", "-t", p.name)
	return string(out)
}

func (p *tmuxPane) send(keys ...string) {
	p.tb.Helper()
	if out, err := p.run(append([]string{"send-keys", "-t", p.name}, keys...)...); err != nil {
		p.tb.Fatalf("send-keys %q: %v\n%s", keys, err, out)
	}
}

// waitScreen polls until done holds for the screen and returns it.
func (p *tmuxPane) waitScreen(done func(string) bool) string {
	p.tb.Helper()
	deadline := time.Now().Add(30 * time.Second)
	for {
		scr := p.screen()
		if done(scr) {
			return scr
		}
		if time.Now().After(deadline) {
			p.tb.Fatalf("screen never came; last screen:\n%s", scr)
		}
		// Each capture is a tmux client process: polling without a
		// pause would take a processor from the program measured.
		time.Sleep(2 * time.Millisecond)
	}
}

// header is the screen's first lines (title and what-if values).
func header(scr string) string {
	lines := strings.SplitN(scr, "\n", 4)
	return strings.Join(lines[:min(3, len(lines))], "\n")
}

func BenchmarkTmuxEdit(b *testing.B) {
	if _, err := exec.LookPath("tmux"); err != nil {
		b.Skip("tmux not installed")
	}
	bin := filepath.Join(b.TempDir(), "likewind")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		b.Fatalf("go build: %v\n%s", err, out)
	}
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", "corvane-sx3.toml"))
	if err != nil {
		b.Fatal(err)
	}
	facs := filepath.Join("..", "..", "testdata", "facilities.toml")
	for _, n := range []int{400, 1000} {
		text := gridRe.ReplaceAllString(string(src), fmt.Sprintf("count = %d", n))
		veh := filepath.Join(b.TempDir(), "vehicle.toml")
		if err := os.WriteFile(veh, []byte(text), 0o600); err != nil {
			b.Fatal(err)
		}
		// The maximum p0 of the facility the interface opens on, and a
		// lower value for the edit.
		v, err := envelope.LoadVehicle(veh)
		if err != nil {
			b.Fatal(err)
		}
		fs, err := envelope.LoadFacilities(facs)
		if err != nil {
			b.Fatal(err)
		}
		e, err := envelope.Evaluate(v, fs, envelope.DefaultSettings(v))
		if err != nil {
			b.Fatal(err)
		}
		f := &fs[tui.StartFacility(e.Maps)]
		p0 := f.PressureMax()
		lower := max(0.9*p0, 0.5*(f.PressureMin()+p0))
		p0s := []string{units.Sig(lower/1000, 4) + "kPa", units.Sig(p0/1000, 4) + "kPa"}
		e = nil
		for _, c := range []struct {
			name   string
			downs  int
			values []string
		}{{"deltaT", 1, []string{"5K", "0K"}}, {"p0max", 5, p0s}} {
			b.Run(fmt.Sprintf("%s/%d", c.name, n), func(b *testing.B) {
				p := &tmuxPane{tb: b, socket: filepath.Join(b.TempDir(), "tmux.sock"), name: "bench"}
				cmd := exec.Command("tmux", "-S", p.socket, "new-session", "-d", "-s", p.name, "-x", "200", "-y", "60",
					"env", "XDG_STATE_HOME="+b.TempDir(), bin, "--fresh", veh, facs)
				cmd.Env = append(os.Environ(), "TERM=xterm-256color")
				if out, err := cmd.CombinedOutput(); err != nil {
					b.Fatalf("tmux new-session: %v\n%s", err, out)
				}
				b.Cleanup(func() { _, _ = p.run("kill-server") })
				p.waitScreen(func(s string) bool {
					return strings.Contains(s, "likewind") && !strings.Contains(header(s), "computing")
				})
				p.send("e")
				for range c.downs {
					p.send("Down")
				}
				times := make([]float64, 0, b.N)
				b.ResetTimer()
				for k := range b.N {
					b.StopTimer()
					val := c.values[k%len(c.values)]
					changed := k%2 == 0 // the first value differs from the files, the second is theirs
					p.send("Enter")
					p.send("C-u")
					p.send("-l", val)
					p.waitScreen(func(s string) bool { return strings.Contains(s, val) })
					time.Sleep(20 * time.Millisecond)
					b.StartTimer()
					start := time.Now()
					p.send("Enter")
					p.waitScreen(func(s string) bool {
						h := header(s)
						return !strings.Contains(h, "computing") && strings.Contains(h, "what-if:") == changed
					})
					times = append(times, float64(time.Since(start).Microseconds())/1000)
				}
				b.StopTimer()
				slices.Sort(times)
				b.ReportMetric(times[len(times)/2], "ms/edit")
			})
		}
	}
}
