package ui

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"fieldfit/models"
	"fieldfit/models/decay"
	"fieldfit/models/infiltration"
	"fieldfit/models/slug"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// The scenario of these tests is our own invention ("Quarry Bend"); the
// readings are the example's, made from the models with seeded noise
// (kinds_demo.go). The check values are the pure-Go fits of the kinds'
// packages on the same SI inputs: the screen must show exactly them.

// kindHarness opens a new project with one test of the given kind on its
// Test tab.
func kindHarness(t *testing.T, kind project.TestKind) *harness {
	h := newHarness(t, nil)
	h.click("new-project")
	h.input("project-name", "Quarry Bend")
	h.click("tab-test")
	h.click("add-" + string(kind) + "-test")
	if k := h.app.Current().Tests[h.app.testIdx].Kind; k != kind {
		t.Fatalf("the new test is a %q test, want %q", k, kind)
	}
	return h
}

func (h *harness) kindRows(rows []project.KindRow) {
	h.t.Helper()
	for i, r := range rows {
		p := "kr-" + strconv.Itoa(i) + "-"
		h.input(p+"time", r.Time)
		h.input(p+"value", r.Value)
		if r.Refill != "" {
			h.input(p+"refill", r.Refill)
		}
	}
}

// result returns the shown value of parameter name in unit, failing
// when it is not shown.
func (h *harness) result(name, unit string) float64 {
	h.t.Helper()
	n := h.render().Find(func(n *v.Node) bool { return n.Attrs["data-param"] == name && n.Attrs["data-unit"] == unit })
	if n == nil {
		h.t.Fatalf("no result %s in %s; status %q", name, unit, h.text("fit-status"))
	}
	x, err := strconv.ParseFloat(n.Attrs["data-value"], 64)
	if err != nil {
		h.t.Fatalf("result %s: %v", name, err)
	}
	return x
}

func near(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }

// slugInputs are the SI inputs the screen is given in TestKindSlugScreen.
func slugInputs() slug.Test {
	rows := DemoSlugRows()
	var d models.Data
	for _, r := range rows {
		tv, _ := strconv.ParseFloat(r.Time, 64)
		dv, _ := strconv.ParseFloat(r.Value, 64)
		d.Time = append(d.Time, tv)
		d.Value = append(d.Value, dv-3.415)
	}
	return slug.Test{Geometry: slug.Geometry{CasingRadius: 0.025, WellRadius: 0.05, ScreenLength: 1.5, ScreenBottom: 4.2},
		Readings: d, SlugVolume: 1.2e-3}
}

// infilInputs are the SI inputs of TestKindInfiltrationScreen: a 30 cm
// inner ring, levels in mm, minutes.
func infilInputs(rows []project.KindRow) infiltration.Test {
	it := infiltration.Test{InnerDiameter: 0.3, OuterDiameter: 0.6, Unit: "mm"}
	for _, r := range rows {
		tv, _ := strconv.ParseFloat(r.Time, 64)
		x, _ := strconv.ParseFloat(r.Value, 64)
		rd := infiltration.Reading{Time: tv * 60, Value: x}
		if r.Refill != "" {
			rd.Refill, rd.RefillTo = true, 150
		}
		it.Readings = append(it.Readings, rd)
	}
	return it
}

// decayInputs are the readings of TestKindDecayScreen in seconds.
func decayInputs(rows []project.KindRow) models.Data {
	var d models.Data
	for _, r := range rows {
		tv, _ := strconv.ParseFloat(r.Time, 64)
		x, _ := strconv.ParseFloat(r.Value, 64)
		d.Time, d.Value = append(d.Time, tv*60), append(d.Value, x)
	}
	return d
}

func TestKindSlugScreen(t *testing.T) {
	h := kindHarness(t, project.SlugTest)
	h.input("k-casing-radius", "2.5") // cm, the default unit of radii
	h.input("k-well-radius", "0.05")
	h.input("k-well-radius-unit", "m") // the text is read again in metres
	h.input("k-screen-length", "1.5")
	h.input("k-screen-bottom", "4.2")
	h.input("k-static", "3.415")
	h.input("k-slug-volume", "1.2")
	h.click("tab-readings")
	h.kindRows(DemoSlugRows())
	if got := h.text("readings-count"); got != "19 readings, 19 usable for the fit." {
		t.Errorf("count %q", got)
	}
	h.click("tab-test")
	if got := h.text("k-h0-check"); !strings.Contains(got, "expected initial displacement") || !strings.Contains(got, "first reading") {
		t.Errorf("H0 check %q", got)
	}
	h.click("tab-fit")
	in := slugInputs()
	want, err := slug.Hvorslev(in, slug.ScreenLong, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Check value: the pure-Go fit of models/slug (itself checked against
	// reference §6, Hvorslev computed check).
	if got := h.result("K", "m/s"); !near(got, want.K.Value, 1e-9) {
		t.Errorf("Hvorslev K = %g m/s on the page, %g from models/slug", got, want.K.Value)
	}
	if got := h.result("K", "m/d"); !near(got, want.K.Value*86400, 1e-9) {
		t.Errorf("K = %g m/d, want %g", got, want.K.Value*86400)
	}
	for _, u := range []string{"ft/d", "cm/s"} {
		h.result("K", u)
	}
	if h.byID("caution").TextContent() != Caution {
		t.Error("no caution")
	}
	if h.byID("plot-kind").Attrs["data-drag"] != "window" {
		t.Error("the H/H0 plot does not choose the window")
	}

	// Bouwer–Rice with the built-in coefficients says they are unverified.
	h.input("fit-model", "bouwer-rice")
	br, err := slug.BouwerRice(in, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := h.result("K", "m/s"); !near(got, br.K.Value, 1e-9) {
		t.Errorf("Bouwer–Rice K = %g, want %g", got, br.K.Value)
	}
	if !strings.Contains(h.text("result-warnings"), "NOT been verified") {
		t.Errorf("warnings %q do not say the coefficients are unverified", h.text("result-warnings"))
	}
	// CBP: K = T/b with the screen length as b.
	h.input("fit-model", "cbp")
	cbp, err := slug.CooperBredehoeftPapadopulos(in, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := h.result("T", "m²/d"); !near(got, cbp.Transmissivity.Value*86400, 1e-6) {
		t.Errorf("CBP T = %g m²/d, want %g", got, cbp.Transmissivity.Value*86400)
	}

	// A dragged window (the later straight segment) is used.
	h.input("fit-model", "hvorslev")
	h.app.DragKindWindow("start", 60, 0)
	h.app.DragKindWindow("end", 400, 100)
	h.settle()
	s := h.app.Current().Tests[0].Setup
	if s.WindowStart != 60 || s.WindowEnd != 400 || s.WindowStartText != "60" {
		t.Fatalf("window %v–%v %q", s.WindowStart, s.WindowEnd, s.WindowStartText)
	}
	win, _ := slug.Hvorslev(in, slug.ScreenLong, &slug.Settings{From: 60, To: 400})
	if got := h.result("K", "m/s"); !near(got, win.K.Value, 1e-9) {
		t.Errorf("windowed K = %g, want %g", got, win.K.Value)
	}

	// Stored, and shown again after a reload.
	id := h.app.Current().ID
	h.click("back-to-list")
	p := h.stored(id)
	st := p.Tests[0]
	if len(p.Tests) != 1 {
		t.Errorf("%d tests, want the slug test alone (the empty pumping test gives way)", len(p.Tests))
	}
	if st.Kind != project.SlugTest || len(st.Setup.Rows) != 19 || len(st.Fits) != 3 || st.Setup.Values["casing-radius"].Unit != "cm" {
		t.Fatalf("stored test %+v", st)
	}
	h2 := newHarness(t, h.st)
	h2.app.Open(id)
	h2.settle()
	h2.click("tab-fit")
	if got := h2.result("K", "m/s"); !near(got, win.K.Value, 1e-9) {
		t.Errorf("after reload K = %g, want %g", got, win.K.Value)
	}
}

func TestKindBadInputs(t *testing.T) {
	h := kindHarness(t, project.SlugTest)
	h.input("k-casing-radius", "0")
	if got := h.text("k-casing-radius-msg"); !strings.Contains(got, "greater than zero") {
		t.Errorf("zero radius: %q", got)
	}
	h.input("k-casing-radius", "2,5") // a decimal comma is fine
	h.input("k-well-radius", "5")
	h.input("k-screen-length", "1.5")
	h.input("k-thickness", "1.2")
	if got := h.text("k-check"); !strings.Contains(got, "Screen length") || !strings.Contains(got, "longer than the aquifer") {
		t.Errorf("screen longer than the aquifer: %q", got)
	}
	h.input("k-thickness", "")
	h.click("tab-readings")
	h.input("kr-0-time", "0")
	h.input("kr-0-value", "2.9")
	h.input("kr-1-time", "x")
	h.input("kr-1-value", "3.0")
	if got := h.text("kr-1-msg"); !strings.Contains(got, `"x"`) {
		t.Errorf("bad time: %q", got)
	}
	if got := h.text("kr-0-msg"); !strings.Contains(got, "static depth") {
		t.Errorf("depth without a static level: %q", got)
	}
	if got := h.byID("kr-1-time").Attrs["value"]; got != "x" {
		t.Errorf("the typed text was not kept: %q", got)
	}

	// Refill marks out of order: a refill that does not raise the water.
	h = kindHarness(t, project.InfiltrationTest)
	h.input("k-inner-diameter", "30")
	h.click("tab-readings")
	h.kindRows([]project.KindRow{{Time: "0", Value: "150"}, {Time: "5", Value: "140", Refill: "130"}, {Time: "10", Value: "125"}, {Time: "15", Value: "120"}})
	h.click("tab-fit")
	if got := h.text("fit-status"); !strings.Contains(got, "Row 2") || !strings.Contains(got, "refill") {
		t.Errorf("refill out of order: %q", got)
	}
	// Times out of order.
	h.click("tab-readings")
	h.input("kr-2-time", "4")
	if got := h.text("kr-2-msg"); !strings.Contains(got, "not after the row above") {
		t.Errorf("time out of order: %q", got)
	}

	// Non-decaying data.
	h = kindHarness(t, project.DecayTest)
	h.click("tab-readings")
	h.kindRows([]project.KindRow{{Time: "0", Value: "5"}, {Time: "1", Value: "5"}, {Time: "2", Value: "5"}, {Time: "3", Value: "5"}})
	h.click("tab-fit")
	if got := h.text("fit-status"); !strings.Contains(got, "The fit failed") {
		t.Errorf("non-decaying data: %q", got)
	}
}

func TestKindInfiltrationScreen(t *testing.T) {
	h := kindHarness(t, project.InfiltrationTest)
	h.input("k-inner-diameter", "30")
	h.input("k-outer-diameter", "60")
	h.input("k-fit-curve", "rate")
	h.input("k-safety", "2")
	h.click("tab-readings")
	rows := DemoInfiltrationRows()
	h.kindRows(rows)
	h.click("tab-fit")
	c, err := infiltration.Rebuild(infilInputs(rows))
	if err != nil {
		t.Fatal(err)
	}
	want, err := infiltration.Fit(c, infiltration.Horton, &infiltration.Settings{Rate: true, SafetyFactor: 2})
	if err != nil {
		t.Fatal(err)
	}
	if got := h.result("steady rate", "mm/h"); !near(got, want.Steady.Value*3.6e6, 1e-9) {
		t.Errorf("steady rate %g mm/h, want %g", got, want.Steady.Value*3.6e6)
	}
	if got := h.result("design rate", "mm/h"); !near(got, want.Design.Value*3.6e6, 1e-9) {
		t.Errorf("design rate %g mm/h, want %g", got, want.Design.Value*3.6e6)
	}
	notes := h.text("result-notes")
	if !strings.Contains(notes, "Rawls") || !strings.Contains(notes, "2 refills") {
		t.Errorf("notes %q", notes)
	}
	if !strings.Contains(h.text("result-warnings"), "safety factor") {
		t.Error("no design caution")
	}
	if h.byID("plot-rate") == nil {
		t.Error("no rate plot")
	}
	for _, m := range infilDesc.models {
		h.input("fit-model", m.value)
		if got := h.text("fit-status"); !strings.HasPrefix(got, "Fitted") {
			t.Errorf("%s: %q", m.value, got)
		}
	}
}

func TestKindDecayScreen(t *testing.T) {
	h := kindHarness(t, project.DecayTest)
	h.input("k-value-unit", "mg/L")
	h.input("k-baseline-mode", "fixed")
	h.input("k-baseline", "3.5")
	h.click("tab-readings")
	rows := DemoDecayRows()
	h.kindRows(rows)
	h.click("tab-fit")
	d := decayInputs(rows)
	want, err := decay.Fit(d, &decay.Settings{FixBaseline: true, Baseline: 3.5})
	if err != nil {
		t.Fatal(err)
	}
	if got := h.result("k", "1/min"); !near(got, want.Rates[0].Value*60, 1e-9) {
		t.Errorf("k = %g 1/min, want %g", got, want.Rates[0].Value*60)
	}
	if got := h.result("t½ (k)", "min"); !near(got, want.HalfLives[0].Value/60, 1e-9) {
		t.Errorf("half-life %g min, want %g", got, want.HalfLives[0].Value/60)
	}
	if got := h.result("y0", "mg/L"); !near(got, want.Y0.Value, 1e-9) {
		t.Errorf("y0 %g, want %g", got, want.Y0.Value)
	}
	h.click("tab-test")
	h.input("k-baseline-mode", "fit")
	h.click("tab-fit")
	h.input("fit-model", "decay-2")
	two, err := decay.Fit(d, &decay.Settings{Form: decay.TwoTerm})
	if err != nil {
		t.Logf("two-term fit of one exponential: %v", err)
	}
	if two != nil {
		if got := h.result("y∞", "mg/L"); !near(got, two.Baseline.Value, 1e-9) {
			t.Errorf("two-term y∞ %g, want %g", got, two.Baseline.Value)
		}
	} else if got := h.text("fit-status"); !strings.Contains(got, "The fit failed") {
		t.Errorf("status %q", got)
	}
}

// TestKindPaste: spreadsheet text fills the readings from the cell it is
// pasted in, a heading line is skipped.
func TestKindPaste(t *testing.T) {
	s := &project.KindSetup{}
	n, msg := pasteKindRows(s, 0, "time", "min\tmm\trefill\n0\t150\n5\t141\t150\n10\t144\n")
	if n != 3 || len(s.Rows) != 3 || s.Rows[1] != (project.KindRow{Time: "5", Value: "141", Refill: "150"}) || !strings.Contains(msg, "heading") {
		t.Fatalf("%d %q %+v", n, msg, s.Rows)
	}
	pasteKindRows(s, 1, "value", "139\n137")
	if s.Rows[1].Value != "139" || s.Rows[2].Value != "137" || s.Rows[2].Time != "10" {
		t.Errorf("%+v", s.Rows)
	}
}

// TestKindReport: the report of a kind test has the kind's sections, the
// fitted parameters with the report's table, and the caution.
func TestKindReport(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	for i, tt := range h.app.Current().Tests {
		if tt.Kind == project.PumpingTest {
			continue
		}
		h.app.SelectTest(i)
		h.settle()
		h.click("tab-report")
		for _, id := range []string{"report-test", "report-fits", "report-plot-kind"} {
			if h.render().ByID(id) == nil {
				t.Errorf("%s: no #%s in the report", tt.Name, id)
			}
		}
		txt := h.text("report-fits")
		if !strings.Contains(txt, kindModelLabel(tt.Fits[0].Model)) || strings.Contains(txt, " m ") && tt.Kind == project.SlugTest {
			t.Errorf("%s: fits table %q", tt.Name, txt)
		}
		if !strings.Contains(h.text("app-root"), Caution) {
			t.Errorf("%s: no caution in the report", tt.Name)
		}
	}
}

// TestKindFromLogger: a kind test takes its readings from the logger
// import of the Logger data tab (the change of level from the static
// level against time), the same record a pumping test would fit.
func TestKindFromLogger(t *testing.T) {
	h := kindHarness(t, project.DecayTest)
	h.click("tab-logger")
	h.importFixture("logger-file", "elapsed-seconds.csv")
	h.click("tab-fit")
	h.input("fit-source", "logger")
	tt := h.app.Current().Tests[0]
	req, missing := kindRequest(h.app.Current(), &tt, nil)
	if len(missing) > 0 || !req.Data.FromLogger || len(req.Data.T) != 34 || req.ValueUnit != "m" {
		t.Fatalf("logger request: %d readings, from logger %v, unit %q, missing %q", len(req.Data.T), req.Data.FromLogger, req.ValueUnit, missing)
	}
	if got := h.byID("fit-source").Attrs["value"]; got != "logger" {
		t.Errorf("fit tab source %q", got)
	}
	if got := h.text("fit-status"); strings.Contains(got, "readings are needed") {
		t.Errorf("status %q", got)
	}
	h.click("tab-readings")
	if !strings.Contains(h.text("app-root"), "uses the logger record") {
		t.Error("the readings tab does not say the fit uses the logger record")
	}
}
