package main

import (
	"fmt"
	"os"
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

func BenchmarkTmuxEdit(b *testing.B) {
	skipWithoutTmux(b)
	bin := buildLikewind(b)
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
				p := startTmux(b, 200, 60, "env", "XDG_STATE_HOME="+b.TempDir(), bin, "--fresh", veh, facs)
				p.wait, p.poll = 30*time.Second, 2*time.Millisecond
				p.waitScreen("the idle interface", func(s string) bool {
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
					p.waitFor(val)
					time.Sleep(20 * time.Millisecond)
					b.StartTimer()
					start := time.Now()
					p.send("Enter")
					p.waitScreen("the edit's result", func(s string) bool {
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
