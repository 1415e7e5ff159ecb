//go:build linux

package tui

import (
	"bytes"
	"context"
	"fmt"
	"math"
	"os"
	"runtime"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"golang.org/x/sys/unix"

	"likewind/envelope/units"
)

// The interface measured end to end through a pseudo-terminal: the real
// program (Run) reads its keys from the terminal and writes its frames to
// it; the benchmark writes key bytes to the other side and reads the
// frames back until the frame the edit leads to is there. Speed targets
// (issue 14): a ΔT what-if on the demo at 400×400 under 16 ms median, a
// maximum-p0 what-if under 8 ms; on 1000×1000 under 100 ms.
//
//	go test ./tui/ -run '^$' -bench Terminal -benchtime 20x
//
// ms/edit is the median of the timed edits. x-floor is that time over the
// bare math of the edit done on one core: one math.Pow and one math.Sqrt
// per grid point and per solve it makes (the flight side and every
// facility for ΔT, one facility for p0 max), measured in the same run
// (bareMathNs). The frame the edit leads to is known beforehand: the same
// keys go to a copy of the model driven without a terminal, and the wait
// ends when the last screen line that edit changes has been written.

// openPTY opens a pseudo-terminal pair of cols×rows.
func openPTY(cols, rows int) (master, slave *os.File, err error) {
	master, err = os.OpenFile("/dev/ptmx", os.O_RDWR|unix.O_NOCTTY, 0)
	if err != nil {
		return nil, nil, err
	}
	fd := int(master.Fd())
	if err := unix.IoctlSetPointerInt(fd, unix.TIOCSPTLCK, 0); err != nil {
		master.Close()
		return nil, nil, fmt.Errorf("unlock pty: %w", err)
	}
	n, err := unix.IoctlGetInt(fd, unix.TIOCGPTN)
	if err != nil {
		master.Close()
		return nil, nil, fmt.Errorf("pty number: %w", err)
	}
	slave, err = os.OpenFile(fmt.Sprintf("/dev/pts/%d", n), os.O_RDWR|unix.O_NOCTTY, 0)
	if err != nil {
		master.Close()
		return nil, nil, err
	}
	ws := &unix.Winsize{Row: uint16(rows), Col: uint16(cols)}
	if err := unix.IoctlSetWinsize(int(slave.Fd()), unix.TIOCSWINSZ, ws); err != nil {
		master.Close()
		slave.Close()
		return nil, nil, fmt.Errorf("pty size: %w", err)
	}
	return master, slave, nil
}

// termOut collects what the program wrote to the terminal.
type termOut struct {
	mu   sync.Mutex
	buf  []byte
	more chan struct{} // a signal after each read
}

func (o *termOut) read(f *os.File) {
	p := make([]byte, 64<<10)
	for {
		n, err := f.Read(p)
		if n > 0 {
			o.mu.Lock()
			o.buf = append(o.buf, p[:n]...)
			o.mu.Unlock()
			select {
			case o.more <- struct{}{}:
			default:
			}
		}
		if err != nil {
			return
		}
	}
}

func (o *termOut) mark() int {
	o.mu.Lock()
	defer o.mu.Unlock()
	return len(o.buf)
}

// waitFor waits until want appears in the output after offset from.
func (o *termOut) waitFor(from int, want string, limit time.Duration) bool {
	return o.waitUntil(from, func(out []byte) bool { return bytes.Contains(out, []byte(want)) }, limit)
}

// waitUntil waits until done holds for the output after offset from.
func (o *termOut) waitUntil(from int, done func(out []byte) bool, limit time.Duration) bool {
	deadline := time.After(limit)
	for {
		o.mu.Lock()
		found := done(o.buf[from:])
		o.mu.Unlock()
		if found {
			return true
		}
		select {
		case <-o.more:
		case <-deadline:
			return false
		}
	}
}

// keyBytes are the bytes a terminal sends for the named keys.
func keyBytes(keys ...string) []byte {
	named := map[string]string{"enter": "\r", "down": "\x1b[B", "up": "\x1b[A", "right": "\x1b[C",
		"left": "\x1b[D", "esc": "\x1b", "ctrl+u": "\x15"}
	var out []byte
	for _, k := range keys {
		if s, ok := named[k]; ok {
			out = append(out, s...)
		} else {
			out = append(out, k...)
		}
	}
	return out
}

// frameMark is the last line of frame next that differs from the same
// line of every frame in prev and occurs in none of them: once the
// program has written it, it has written next. "" when next changes no
// line.
func frameMark(next string, prev ...string) string {
	nl := strings.Split(next, "\n")
	pls := make([][]string, len(prev))
	for k, p := range prev {
		pls[k] = strings.Split(p, "\n")
	}
	for i := len(nl) - 1; i >= 0; i-- {
		line := nl[i]
		if strings.TrimSpace(line) == "" {
			continue
		}
		fresh := true
		for k, p := range prev {
			if (i < len(pls[k]) && pls[k][i] == line) || strings.Contains(p, line) {
				fresh = false
				break
			}
		}
		if fresh {
			return line
		}
	}
	return ""
}

// ptyDriver runs the program on a pseudo-terminal beside a copy of the
// model (twin) that gets the same keys, to know each frame beforehand.
type ptyDriver struct {
	tb     testing.TB
	master *os.File
	out    *termOut
	twin   Model
	cancel context.CancelFunc
	done   chan struct{}
}

func newPTYDriver(tb testing.TB, opts Options, cols, rows int) *ptyDriver {
	tb.Helper()
	master, slave, err := openPTY(cols, rows)
	if err != nil {
		tb.Skipf("no pseudo-terminal: %v", err)
	}
	d := &ptyDriver{tb: tb, master: master, out: &termOut{more: make(chan struct{}, 1)}, done: make(chan struct{})}
	opts.Width, opts.Height = cols, rows
	d.twin, _ = drive(New(opts), tea.WindowSizeMsg{Width: cols, Height: rows})
	go d.out.read(master)
	ctx, cancel := context.WithCancel(context.Background())
	d.cancel = cancel
	go func() {
		defer close(d.done)
		opts.Input, opts.Output = slave, slave
		_, _ = Run(ctx, opts)
	}()
	tb.Cleanup(func() {
		cancel()
		<-d.done
		slave.Close()
		master.Close()
	})
	if want := frameMark(d.twin.View()); !d.out.waitFor(0, want, 20*time.Second) {
		tb.Fatalf("the first frame never came; want line %q", want)
	}
	return d
}

// keys sends keys and waits for the frame they lead to (the twin's).
func (d *ptyDriver) keys(keys ...string) {
	d.tb.Helper()
	before := d.twin.View()
	from := d.out.mark()
	for _, k := range keys {
		d.twin, _ = drive(d.twin, keyMsg(k))
	}
	if _, err := d.master.Write(keyBytes(keys...)); err != nil {
		d.tb.Fatal(err)
	}
	if want := frameMark(d.twin.View(), before); want != "" && !d.out.waitFor(from, want, 20*time.Second) {
		d.tb.Fatalf("keys %q: the frame never came; want line %q", keys, want)
	}
}

// timedKey sends one key whose command recomputes and returns the time to
// the frame with the result. The frame right after the key (interim: the
// header says computing) may or may not be written before it: the
// program writes only the lines that differ from the frame it wrote last,
// and holds the frame of a key that starts a recompute for a while
// (holdFrame in screen.go). So where an interim line was written,
// the wait ends when the last line the result changes from the interim
// has been written after it; where none was, when the last line the result
// changes from the frame before the key has been.
func (d *ptyDriver) timedKey(k string) time.Duration {
	d.tb.Helper()
	before := d.twin.View()
	next, cmd := d.twin.Update(keyMsg(k))
	interim := next.(Model)
	d.twin = interim
	if cmd != nil {
		if out := cmd(); out != nil {
			d.twin, _ = drive(d.twin, out)
		}
	}
	final := d.twin.View()
	fromBefore := []byte(frameMark(final, before))
	fromInterim := []byte(frameMark(final, interim.View()))
	interimMark := []byte(frameMark(interim.View(), before, final))
	if len(fromBefore) == 0 || len(fromInterim) == 0 {
		d.tb.Fatalf("key %q changes no line of the frame", k)
	}
	done := func(out []byte) bool {
		if q := bytes.LastIndex(out, interimMark); len(interimMark) > 0 && q >= 0 {
			return bytes.Contains(out[q:], fromInterim)
		}
		return bytes.Contains(out, fromBefore)
	}
	from := d.out.mark()
	start := time.Now()
	if _, err := d.master.Write(keyBytes(k)); err != nil {
		d.tb.Fatal(err)
	}
	if !d.out.waitUntil(from, done, 20*time.Second) {
		d.tb.Fatalf("key %q: the frame never came; want line %q", k, fromBefore)
	}
	return time.Since(start)
}

// bareMathNs is the time of one math.Pow and one math.Sqrt on one core
// (the best of a few runs over 1024 arguments), in ns.
func bareMathNs() float64 {
	xs := make([]float64, 1024)
	for i := range xs {
		xs[i] = 0.7 + 0.3*float64(i)/1024
	}
	best := math.Inf(1)
	var sink float64
	for range 5 {
		const n = 1 << 20
		start := time.Now()
		for i := range n {
			x := xs[i&1023]
			sink += math.Pow(x, 5.2559) + math.Sqrt(x)
		}
		best = min(best, float64(time.Since(start).Nanoseconds())/n)
	}
	if sink == 0 {
		return math.NaN()
	}
	return best
}

// benchTerminalEdit types each value in turn into the what-if line of the
// field that down presses reach (the editor opened untimed), timing the
// final enter to the frame with the result.
func benchTerminalEdit(b *testing.B, n, downs int, solves int, valuesFor func(m Model) []string) {
	v, facs := demoData(b)
	v.Grid.Altitude.Count, v.Grid.Altitude.Step = n, 0
	v.Grid.Speed.Count, v.Grid.Speed.Step = n, 0
	st := colourStyles()
	d := newPTYDriver(b, Options{Vehicle: v, Facilities: facs, Styles: &st}, 200, 60)
	d.keys("e")
	for range downs {
		d.keys("down")
	}
	values := valuesFor(d.twin)
	floor := bareMathNs() * float64(n*n*solves) / 1e6
	times := make([]float64, 0, b.N)
	b.ResetTimer()
	for k := range b.N {
		b.StopTimer()
		d.keys("enter", "ctrl+u")
		d.keys(strings.Split(values[k%len(values)], "")...)
		runtime.GC() // the twin's garbage is not the program's
		b.StartTimer()
		times = append(times, float64(d.timedKey("enter").Microseconds())/1000)
	}
	b.StopTimer()
	slices.Sort(times)
	med := times[len(times)/2]
	b.ReportMetric(med, "ms/edit")
	b.ReportMetric(med/floor, "x-floor")
}

// BenchmarkTerminalEdit is a what-if edit through a pseudo-terminal at
// 200×60: ΔT (the grid and the six demo facilities) and the maximum p0 of
// the facility the interface opens on, on the demo at 400×400 and
// 1000×1000.
func BenchmarkTerminalEdit(b *testing.B) {
	facs := 0
	{
		_, f := demoData(b)
		facs = len(f)
	}
	for _, n := range []int{400, 1000} {
		b.Run(fmt.Sprintf("deltaT/%d", n), func(b *testing.B) {
			benchTerminalEdit(b, n, 1, facs+1, func(Model) []string { return []string{"5K", "0K"} })
		})
		b.Run(fmt.Sprintf("p0max/%d", n), func(b *testing.B) {
			benchTerminalEdit(b, n, 5, 1, func(m Model) []string {
				f := &m.facs[m.fac]
				p0 := f.PressureMax()
				lower := max(0.9*p0, 0.5*(f.PressureMin()+p0)) // stays above P0Min
				return []string{units.Sig(lower/1000, 4) + "kPa", units.Sig(p0/1000, 4) + "kPa"}
			})
		})
	}
}
