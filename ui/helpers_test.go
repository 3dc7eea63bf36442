package ui

import (
	"context"
	"strings"
	"sync"
	"testing"
	"time"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
	v "fieldfit/ui/view"
)

// timers is a manual scheduler for Options.After: nothing runs until the
// test fires it.
type timers struct {
	mu      sync.Mutex
	pending []*timer
}

type timer struct {
	d       time.Duration
	f       func()
	stopped bool
}

func (ts *timers) after(d time.Duration, f func()) func() {
	ts.mu.Lock()
	defer ts.mu.Unlock()
	t := &timer{d: d, f: f}
	ts.pending = append(ts.pending, t)
	return func() {
		ts.mu.Lock()
		t.stopped = true
		ts.mu.Unlock()
	}
}

// fire runs the pending timers with delay ≤ max and reports how many ran.
func (ts *timers) fire(max time.Duration) int {
	ts.mu.Lock()
	var run []*timer
	keep := ts.pending[:0]
	for _, t := range ts.pending {
		switch {
		case t.stopped:
		case t.d <= max:
			run = append(run, t)
		default:
			keep = append(keep, t)
		}
	}
	ts.pending = keep
	ts.mu.Unlock()
	for _, t := range run {
		t.f()
	}
	return len(run)
}

// harness is an App on a memory store with manual timers and a fixed
// clock.
type harness struct {
	t   *testing.T
	app *App
	st  store.Store
	ts  *timers
	dl  chan []byte
}

var clock0 = time.Date(2026, 6, 2, 10, 0, 0, 0, time.UTC)

func newHarness(t *testing.T, st store.Store) *harness {
	t.Helper()
	if st == nil {
		st = store.NewMemory()
	}
	h := &harness{t: t, st: st, ts: &timers{}, dl: make(chan []byte, 10)}
	h.app = NewApp(Options{Store: st, Now: func() time.Time { return clock0 }, After: h.ts.after,
		Download: func(name, mime string, data []byte) { h.dl <- data }})
	h.app.Start()
	h.settle()
	return h
}

// settle fires short timers (saves, refits; not the undo window) and
// waits for the background work until the app is idle.
func (h *harness) settle() {
	h.t.Helper()
	deadline := time.Now().Add(10 * time.Second)
	for time.Now().Before(deadline) {
		h.ts.fire(time.Second)
		if h.app.Idle() {
			h.ts.mu.Lock()
			n := 0
			for _, t := range h.ts.pending {
				if !t.stopped && t.d <= time.Second {
					n++
				}
			}
			h.ts.mu.Unlock()
			if n == 0 {
				return
			}
		}
		time.Sleep(2 * time.Millisecond)
	}
	h.t.Fatal("app did not become idle")
}

func (h *harness) render() *v.Node { return h.app.Render() }

// byID returns the rendered node with id, failing the test when absent.
func (h *harness) byID(id string) *v.Node {
	h.t.Helper()
	n := h.render().ByID(id)
	if n == nil {
		h.t.Fatalf("no element #%s in\n%s", id, h.render())
	}
	return n
}

func (h *harness) click(id string) {
	h.t.Helper()
	if !h.byID(id).Fire("click", nil) {
		h.t.Fatalf("#%s has no click handler", id)
	}
	h.settle()
}

func (h *harness) input(id, text string) {
	h.t.Helper()
	n := h.byID(id)
	typ := "input"
	if n.Tag == "select" || n.Attrs["type"] == "checkbox" {
		typ = "change"
	}
	if !n.Fire(typ, &v.Event{Value: text, Checked: text == "true"}) {
		h.t.Fatalf("#%s has no %s handler", id, typ)
	}
	h.settle()
}

func (h *harness) text(id string) string {
	h.t.Helper()
	return h.byID(id).TextContent()
}

// stored reads the project with id back from the store.
func (h *harness) stored(id string) *project.Project {
	h.t.Helper()
	rec, err := h.st.Get(context.Background(), id)
	if err != nil {
		h.t.Fatalf("store Get %s: %v", id, err)
	}
	p, err := project.Unmarshal(rec.Data)
	if err != nil {
		h.t.Fatalf("stored project does not decode: %v", err)
	}
	return p
}

// listItem returns the list item of the project named name.
func (h *harness) listItem(name string) *v.Node {
	h.t.Helper()
	li := h.render().Find(func(n *v.Node) bool {
		if n.Tag != "li" || n.Attrs["data-project-id"] == "" {
			return false
		}
		nm := n.Find(func(m *v.Node) bool { return strings.Contains(m.Attrs["class"], "project-name") })
		return nm != nil && nm.TextContent() == name
	})
	if li == nil {
		h.t.Fatalf("no list item %q in\n%s", name, h.render())
	}
	return li
}

func action(li *v.Node, name string) *v.Node {
	return li.Find(func(n *v.Node) bool { return n.Attrs["data-action"] == name })
}
