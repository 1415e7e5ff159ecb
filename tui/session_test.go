package tui

import (
	"context"
	"errors"
	"io"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"likewind/envelope/session"
	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

func TestModelSessionRoundTrip(t *testing.T) {
	// Without the demo's balance, which takes no full match at scale 0.3.
	m := newDemo(t, 80, 24, noLoads)
	k := facilityNamed(t, m, "Harl Cove")
	m.fac = k
	m = edit(t, m, whatif.P0Max, "3 bar")
	m = edit(t, m, whatif.Scale, "0.3")
	m = edit(t, m, whatif.ReTol, "5 %")
	m, _ = press(m, "esc", "M", "tab", "tab", "u", "up", "left")
	s := m.Session()
	if s.Facility != m.facs[k].Name || s.BestOfAll {
		t.Errorf("session facility = %q best %v", s.Facility, s.BestOfAll)
	}
	if scale, ok := s.WhatIf.Values["scale"]; !ok || scale != 0.3 || len(s.WhatIf.Values) != 2 {
		t.Errorf("session what-if values %v, want scale 0.3, the Reynolds tolerance and nothing else", s.WhatIf.Values)
	}

	path := filepath.Join(t.TempDir(), "s.json")
	if err := session.Save(path, s); err != nil {
		t.Fatal(err)
	}
	loaded, err := session.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	r := newDemo(t, 80, 24, noLoads, func(o *Options) { o.Session = &loaded })
	if r.statusErr {
		t.Fatalf("restore failed: %s", r.status)
	}
	if r.fac != m.fac || r.layer != m.layer || r.units != m.units {
		t.Errorf("restored facility/layer/units = %d/%v/%v, want %d/%v/%v", r.fac, r.layer, r.units, m.fac, m.layer, m.units)
	}
	if r.set != m.set {
		t.Errorf("restored settings %+v, want %+v", r.set, m.set)
	}
	if r.facs[k] != m.facs[k] {
		t.Errorf("restored facility %+v, want %+v", r.facs[k], m.facs[k])
	}
	if !reflect.DeepEqual(r.marks, m.marks) || len(r.marks) == 0 {
		t.Errorf("restored %d marks, want the %d saved", len(r.marks), len(m.marks))
	}
	if r.curI != m.curI || r.curJ != m.curJ {
		t.Errorf("restored cursor (%d,%d), want (%d,%d)", r.curI, r.curJ, m.curI, m.curJ)
	}
	if len(r.changes()) != len(m.changes()) {
		t.Errorf("restored header lists %d changes, want %d", len(r.changes()), len(m.changes()))
	}
}

func TestNewRefusesForeignSession(t *testing.T) {
	s := session.Session{Version: session.Version, Inputs: []string{"other.toml"}, Hash: "sha256:other", Layer: LayerMach.String(), Units: "customary"}
	m := newDemo(t, 80, 24, func(o *Options) { o.Session = &s })
	if !m.statusErr || !strings.Contains(m.status, "session not restored") {
		t.Errorf("status = %q, want a refusal", m.status)
	}
	if m.layer != LayerClass || m.units != units.SI {
		t.Errorf("a foreign session was applied: layer %v units %v", m.layer, m.units)
	}
	if !strings.Contains(m.View(), "session not restored") {
		t.Errorf("the refusal is not on screen")
	}
}

// runOnPipe runs the real program loop on a pipe, types keys into it,
// then cancels it the way the caller does on SIGHUP/SIGTERM, and returns
// Run's results.
func runOnPipe(t *testing.T, opts Options, keys string) (Model, error) {
	t.Helper()
	ctx, cancel := context.WithCancel(context.Background())
	inR, inW := io.Pipe()
	defer inW.Close()
	type result struct {
		m   Model
		err error
	}
	done := make(chan result, 1)
	go func() {
		opts.Input, opts.Output = inR, io.Discard
		m, err := Run(ctx, opts)
		done <- result{m, err}
	}()
	time.Sleep(200 * time.Millisecond)
	if keys != "" {
		if _, err := inW.Write([]byte(keys)); err != nil {
			t.Fatal(err)
		}
		time.Sleep(200 * time.Millisecond)
	}
	cancel()
	select {
	case r := <-done:
		return r.m, r.err
	case <-time.After(10 * time.Second):
		t.Fatal("Run did not return after the context was cancelled")
	}
	return Model{}, nil
}

// TestRunWritesSessionWhenCancelled: a change not yet saved is written
// when the program is cancelled (a hang-up), and the lock file is gone
// afterwards.
func TestRunWritesSessionWhenCancelled(t *testing.T) {
	v, facs := demoData(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	m, err := runOnPipe(t, Options{Vehicle: v, Facilities: facs, SessionPath: path}, "u")
	if err == nil || !errors.Is(err, tea.ErrProgramKilled) {
		t.Errorf("Run error = %v, want ErrProgramKilled", err)
	}
	s, err := session.Load(path)
	if err != nil {
		t.Fatalf("session not written on cancel: %v", err)
	}
	if s.Units != units.Customary.String() {
		t.Errorf("saved units %q, want the change %q", s.Units, units.Customary)
	}
	if r := m.SaveReport(); len(r) != 1 || r[0] != "session saved to "+path {
		t.Errorf("report = %q, want the one save", r)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("folder holds %d entries after Run, want the session alone", len(entries))
	}
}

// Item 2: a run that changes nothing writes nothing, whether the session
// was restored or declined; in particular a declined session with marks is
// not replaced by an empty one.
func TestRunWithoutChangesWritesNothing(t *testing.T) {
	v, facs := demoData(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "s.json")
	saved := savedDemoSession(t, path, 2)
	before, _ := os.ReadFile(path)

	for _, c := range []struct {
		name    string
		session *session.Session
	}{{"declined (--fresh, or n at the prompt)", nil}, {"restored", &saved}} {
		opts := Options{Vehicle: v, Facilities: facs, SessionPath: path, Session: c.session}
		// Quit with q, and also cancel without a key.
		for _, keys := range []string{"q", ""} {
			m, _ := runOnPipe(t, opts, keys)
			after, _ := os.ReadFile(path)
			if string(after) != string(before) {
				t.Errorf("%s, keys %q: the session file was rewritten:\n%s", c.name, keys, after)
			}
			if r := m.SaveReport(); len(r) != 0 {
				t.Errorf("%s, keys %q: report %q, want nothing saved", c.name, keys, r)
			}
		}
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("folder holds %d entries, want the session alone", len(entries))
	}
}

// savedDemoSession saves a session of the demo with n marks at path and
// returns it.
func savedDemoSession(t *testing.T, path string, n int) session.Session {
	t.Helper()
	m := newDemo(t, 80, 24)
	for k := 0; k < n; k++ {
		m, _ = press(m, "space", "right", "right")
	}
	s := m.Session()
	if len(s.Marks) != n {
		t.Fatalf("demo session has %d marks, want %d", len(s.Marks), n)
	}
	if err := session.Save(path, s); err != nil {
		t.Fatal(err)
	}
	return s
}
