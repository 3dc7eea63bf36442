package ui

import (
	"context"
	"math"
	"strings"
	"testing"

	"fieldfit/ui/project"
	"fieldfit/ui/store"
	v "fieldfit/ui/view"
)

func TestRateUnit(t *testing.T) {
	h := newHarness(t, nil)
	h.click("new-project")
	h.click("tab-test")
	h.input("test-rate", "27")
	h.input("test-rate-unit", "m³/h")
	// 27 m³/h = 27/3600 m³/s = 7.5e-3 m³/s (1 h = 3600 s, exact).
	r := h.app.Current().Tests[0].Rate
	if math.Abs(r.SI-7.5e-3) > 1e-15 || r.Text != "27" || r.Unit != "m³/h" {
		t.Errorf("rate = %+v", r)
	}
	if !strings.Contains(h.render().Find(func(n *v.Node) bool { return n.Tag == "label" && n.Attrs["for"] == "test-rate" }).TextContent(), "(m³/h)") {
		t.Error("rate label lacks its unit")
	}
	h.input("test-rate", "-1")
	if got := h.text("test-rate-msg"); !strings.Contains(got, "greater than zero") {
		t.Errorf("message %q", got)
	}
	h.input("test-start", "2026-13-01T25:00")
	if got := h.text("test-start-msg"); !strings.Contains(got, "not a date and time") {
		t.Errorf("start message %q", got)
	}
	if got := h.app.Current().Tests[0].StartText; got != "2026-13-01T25:00" {
		t.Errorf("start text %q not kept", got)
	}
}

func TestOpenUnreadable(t *testing.T) {
	st := store.NewMemory()
	if err := st.Put(context.Background(), store.Record{ID: "bad1", Name: "Damaged", Rev: 1, Changed: clock0, Data: []byte("{not json")}); err != nil {
		t.Fatal(err)
	}
	h := newHarness(t, st)
	action(h.listItem("Damaged"), "open").Fire("click", nil)
	h.settle()
	if h.app.Screen() != ListScreen || !strings.Contains(h.text("notice"), "could not be opened") {
		t.Errorf("screen %v, notice %q", h.app.Screen(), h.app.Notice())
	}
	// Export still offers the stored bytes as they are.
	action(h.listItem("Damaged"), "export").Fire("click", nil)
	h.settle()
	if got := string(<-h.dl); got != "{not json" {
		t.Errorf("export gave %q", got)
	}
}

func TestDragWindow(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	// A tap changes nothing.
	h.app.DragWindow("start", 600, 0)
	h.app.DragWindow("end", 600, 2)
	if f := h.app.Current().Tests[0].Fit; f.WindowStart != 0 || f.WindowEnd != 0 {
		t.Errorf("tap set the window %+v", f)
	}
	// A drag from 60 min back to 10 min sets 10–60 min and refits.
	h.app.DragWindow("start", 3600, 0)
	h.app.DragWindow("move", 1200, 0)
	h.byID("plot-loglog") // the window follows the drag while it lasts
	h.app.DragWindow("end", 600, 80)
	h.settle()
	p := h.app.Current()
	f := p.Tests[0].Fit
	if f.WindowStart != 600 || f.WindowEnd != 3600 || f.WindowStartText != "10.0" || f.WindowEndText != "60.0" {
		t.Errorf("window %+v", f)
	}
	if r := p.Tests[0].Result; r == nil || r.N >= 25 {
		t.Errorf("not refitted on the window: %+v", r)
	}
	if h.byID("window-start").Attrs["value"] != "10.0" {
		t.Error("window input does not show the dragged start")
	}
	h.click("window-clear")
	if r := h.app.Current().Tests[0].Result; r.N != 25 {
		t.Errorf("after clearing the window %d readings used", r.N)
	}
	// A typed window that is not a number leaves that side open, says so.
	h.input("window-end", "6o")
	if got := h.text("window-msg"); !strings.Contains(got, `"6o" is not a number`) {
		t.Errorf("window message %q", got)
	}
}

func TestManualFit(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	h.input("auto-fit", "false")
	before := *h.app.Current().Tests[0].Result
	h.click("tab-readings")
	h.input("r-24-depth", "9.999")
	h.click("tab-fit")
	if r := h.app.Current().Tests[0].Result; r.Inputs != before.Inputs {
		t.Error("refitted although the fit is manual")
	}
	if got := h.text("fit-status"); !strings.Contains(got, "press Fit") {
		t.Errorf("status %q", got)
	}
	h.click("fit")
	if r := h.app.Current().Tests[0].Result; r.Inputs == before.Inputs {
		t.Error("Fit did not refit")
	}
}

func TestTests(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	h.click("tab-test")
	n := len(h.app.Current().Tests)
	h.click("add-test")
	p := h.app.Current()
	if len(p.Tests) != n+1 || p.Tests[n].ObservationWell == "" || p.Tests[n].PumpingWell == "" {
		t.Fatalf("new test %+v", p.Tests[n])
	}
	h.input("test-select", "0")
	if got := h.byID("test-name").Attrs["value"]; got != p.Tests[0].Name {
		t.Errorf("selected test name %q", got)
	}
	_ = project.Theis
}

// TestCJUMaxSetting: the Cooper–Jacob threshold defaults to 0.01 (Cooper &
// Jacob 1946, from memory), takes the offered choices through the select,
// ignores others, and reaches the validity line of the results.
func TestCJUMaxSetting(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	tst := h.app.Current().Tests[0]
	if got := tst.Fit.CJUMaxOrDefault(); got != 0.01 {
		t.Fatalf("default threshold %g, want 0.01", got)
	}
	if got := h.text("result-cj"); !strings.Contains(got, "u < 0.01") {
		t.Errorf("validity line %q does not name u < 0.01", got)
	}
	h.input("cj-umax", "0.05")
	h.settle()
	if got := h.app.Current().Tests[0].Fit.CJUMax; got != 0.05 {
		t.Errorf("after choosing 0.05: %g", got)
	}
	if got := h.text("result-cj"); !strings.Contains(got, "u < 0.05") {
		t.Errorf("validity line %q does not name u < 0.05", got)
	}
	h.app.SetCJUMax("0.07")
	if got := h.app.Current().Tests[0].Fit.CJUMax; got != 0.05 {
		t.Errorf("an unoffered value changed the threshold to %g", got)
	}
}
