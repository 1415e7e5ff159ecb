package review

import (
	"testing"
	"time"

	"likewind/envelope/session"
	"likewind/tui"
)

func TestHubSavesAfterAChangeWithoutASignal(t *testing.T) {
	alice, _, _, keys := reviewers(t)
	ts := startServer(t, keys)
	a := connect(t, ts, alice, 120, 40)
	a.WaitFor(0, "review: alice")
	a.Send(" ")
	a.WaitFor(0, "point marked (1 marked)")
	// Saved SaveDelay after the change; allow for a slow machine.
	deadline := time.Now().Add(SaveDelay + 10*time.Second)
	for {
		s, err := session.Load(ts.sf.Path())
		if err == nil && len(s.Marks) == 1 {
			if s.Cursor == nil {
				t.Error("saved session has no cursor (the presenter's)")
			}
			return
		}
		if time.Now().After(deadline) {
			t.Fatalf("session not saved with the mark: %v, %+v", err, s)
		}
		time.Sleep(20 * time.Millisecond)
	}
}

func TestHubPresenterPassesOnWhenTheyLeave(t *testing.T) {
	alice, bob, vera, keys := reviewers(t)
	ts := startServer(t, keys)
	v := connect(t, ts, vera, 100, 30)
	v.WaitFor(0, "review: vera")
	if p := ts.hub.Current().Presenter(); p != 0 {
		t.Errorf("presenter with a viewer alone = %d, want none", p)
	}
	a := connect(t, ts, alice, 100, 30)
	a.WaitFor(0, "review: alice")
	b := connect(t, ts, bob, 100, 30)
	b.WaitFor(0, "review: bob")
	first := ts.hub.Current().Presenter()
	if first == 0 {
		t.Fatal("no presenter with two editors in")
	}
	a.Close()
	waitHub(t, ts.hub, "bob presents", func(s tui.Shared) bool { return s.Presenter() != 0 && s.Presenter() != first })
	// P takes the lead back for whoever presses it.
	a2 := connect(t, ts, alice, 100, 30)
	a2.WaitFor(0, "review: alice")
	m := a2.Mark()
	a2.Send("P")
	a2.WaitFor(m, "you present")
	waitHub(t, ts.hub, "alice presents again", func(s tui.Shared) bool { return s.Presenter() > first+1 })
}
