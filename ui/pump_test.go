package ui

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"fieldfit/models"
	"fieldfit/models/steptest"
	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// pumpScenario is the invented two-well leaky test of the screen tests
// ("Cinder Hollow", our own site and numbers; readings from the models
// with seeded noise).
var pumpScenario = leakyScenario{
	T: 2.3e-3, S: 1.1e-4, B: 650, Q: 8.5e-3, Stop: 360,
	Static: [2]float64{6.12, 6.40}, R: [2]float64{22, 70}, Noise: 0.003, Seed: 777,
	Minutes:  []float64{1, 1.5, 2, 3, 4, 5, 7, 10, 15, 20, 30, 45, 60, 90, 120, 150, 180, 240, 300, 360},
	Recovery: []float64{1, 2, 3, 5, 8, 12, 20, 30, 45, 60, 90, 120, 180, 240, 360},
}

// pasteText is readings as a spreadsheet paste (time ⇥ depth lines).
func pasteText(rs []project.Reading) string {
	var b strings.Builder
	for _, r := range rs {
		b.WriteString(r.TimeText + "\t" + r.DepthText + "\n")
	}
	return b.String()
}

func (h *harness) paste(id, text string) {
	h.t.Helper()
	e := &v.Event{Pasted: text}
	if !h.byID(id).Fire("paste", e) || !e.Prevent {
		h.t.Fatalf("#%s did not take the paste", id)
	}
	h.settle()
}

// pumpSession types the scenario's test through the screen: the wells,
// the rate and stop, the readings of both wells.
func pumpSession(h *harness, sc leakyScenario) {
	h.t.Helper()
	h.click("new-project")
	h.input("project-name", "Cinder Hollow trial")
	h.input("aquifer-b", "30")
	h.click("tab-wells")
	h.click("add-pumping-well")
	h.input("well-0-name", "PB-1")
	h.input("well-0-radius", "0.1")
	for k, r := range sc.R {
		h.click("add-observation-well")
		h.input("well-"+strconv.Itoa(k+1)+"-name", []string{"CH-A", "CH-B"}[k])
		h.input("well-"+strconv.Itoa(k+1)+"-distance", strconv.FormatFloat(r, 'f', -1, 64))
	}
	h.click("tab-test")
	h.input("test-rate", strconv.FormatFloat(sc.Q*1000, 'f', -1, 64))
	h.input("test-static", strconv.FormatFloat(sc.Static[0], 'f', -1, 64))
	p := h.app.Current()
	h.input("test-obs-well", p.Wells[1].ID)
	h.input("pump-stop", strconv.FormatFloat(sc.Stop, 'f', -1, 64))
	h.click("tab-readings")
	h.paste("r-0-time", pasteText(sc.readings(0)))
	h.input("readings-well", "add:"+p.Wells[2].ID)
	h.input("series-static", strconv.FormatFloat(sc.Static[1], 'f', -1, 64))
	h.paste("r-0-time", pasteText(sc.readings(1)))
}

// scenarioWells are the scenario's usable readings as models.Well values
// of model m (built per distance).
func scenarioWells(sc leakyScenario, m func(r float64) models.Model) []models.Well {
	var ws []models.Well
	for k := range sc.R {
		var d models.Data
		for _, r := range sc.readings(k) {
			tm, _ := strconv.ParseFloat(r.TimeText, 64)
			dep, _ := strconv.ParseFloat(r.DepthText, 64)
			d.Time = append(d.Time, tm*units.Minute)
			d.Value = append(d.Value, dep-sc.Static[k])
		}
		w := models.Well{Data: d}
		if m != nil {
			w.Model = m(sc.R[k])
		}
		ws = append(ws, w)
	}
	return ws
}

// TestPumpLeakyTwoWells runs the two-well leaky test with recovery
// through the screen: the page's Hantush–Jacob fit is models.FitWells'
// on the same readings over the same schedule, the invented truth lies
// in its intervals, the project keeps the schedule, the second well and
// every fit, and the plots of drawdown, recovery and all wells are drawn.
func TestPumpLeakyTwoWells(t *testing.T) {
	sc := pumpScenario
	h := newHarness(t, nil)
	pumpSession(h, sc)
	h.click("tab-fit")
	h.input("fit-model", string(project.Hantush))
	h.click("fit")
	p := h.app.Current()
	tt := p.Tests[0]
	f := currentFit(&tt)
	if f == nil || tt.Result == nil {
		t.Fatalf("no fit: %s", h.text("fit-status"))
	}
	steps := models.PumpAndStop(sc.Q, sc.Stop*units.Minute)
	want, err := models.FitWells(scenarioWells(sc, func(r float64) models.Model {
		return models.VariableRate{Base: models.Hantush{Q: sc.Q, R: r}, Steps: steps}
	}), nil)
	if err != nil {
		t.Fatal(err)
	}
	for j, name := range []string{"T", "S", "B"} {
		got, _ := f.Param(name)
		w := want.Estimates[j]
		if math.Abs(got.Value/w.Value-1) > 1e-9 || math.Abs(got.Lower/w.Lower-1) > 1e-9 {
			t.Errorf("%s: page %v (%v), models.FitWells %v (%v)", name, got.Value, got.Lower, w.Value, w.Lower)
		}
		truth := []float64{sc.T, sc.S, sc.B}[j]
		if !(got.Lower <= truth && truth <= got.Upper) {
			t.Errorf("%s = %v (%v – %v) misses the invented %v", name, got.Value, got.Lower, got.Upper, truth)
		}
	}
	if f.N != len(sc.Minutes)*2+len(sc.Recovery)*2 {
		t.Errorf("N = %d", f.N)
	}
	// The page shows T in m²/d with the interval, B and c.
	if got := h.byID("result-T").Attrs["data-value"]; got == "" {
		t.Error("no T on the page")
	} else if v, _ := strconv.ParseFloat(got, 64); math.Abs(v/(want.Params[0]*units.Day)-1) > 1e-6 {
		t.Errorf("page T %v m²/d, want %v", v, want.Params[0]*units.Day)
	}
	for _, id := range []string{"result-B", "result-c", "caution", "plot-loglog", "plot-semilog", "plot-recovery", "plot-recovery-line", "plot-wells", "plot-residuals", "distance-T", "hints"} {
		h.byID(id)
	}
	if h.render().ByID("can-stop") != nil {
		t.Error("the stop indicator is shown after the pump stopped")
	}

	// Every model for the comparison table.
	h.click("fit-all")
	p = h.app.Current()
	tt = p.Tests[0]
	if len(tt.Fits) != len(pumpModels) {
		t.Fatalf("%d fits stored, want %d: %s", len(tt.Fits), len(pumpModels), h.app.Notice())
	}
	rows := h.byID("compare-table").FindAll(func(n *v.Node) bool { return n.Attrs["data-row"] != "" })
	if len(rows) != len(pumpModels) || rows[0].Attrs["data-row"] != string(project.Hantush) {
		t.Errorf("comparison rows %d, first %q (want Hantush–Jacob lowest AICc)", len(rows), rows[0].Attrs["data-row"])
	}
	// Stored: schedule, second well, fits.
	st := h.stored(p.ID).Tests[0]
	if st.Pump == nil || st.Pump.Stop != sc.Stop*units.Minute || len(st.Pump.Wells) != 1 || len(st.Pump.Wells[0].Readings) != len(sc.Minutes)+len(sc.Recovery) {
		t.Fatalf("stored pumping data %+v", st.Pump)
	}
	if len(st.Fits) != len(pumpModels) {
		t.Errorf("stored %d fits", len(st.Fits))
	}
	// The recovery line on the first well alone: T from the slope.
	h.input("fit-model", string(project.RecoveryLine))
	h.click("fit")
	tt = h.app.Current().Tests[0]
	rf := currentFit(&tt)
	var d models.Data
	for i, tm := range scenarioWells(sc, nil)[0].Data.Time {
		if tm > sc.Stop*units.Minute {
			d.Time = append(d.Time, tm-sc.Stop*units.Minute)
			d.Value = append(d.Value, scenarioWells(sc, nil)[0].Data.Value[i])
		}
	}
	rl, err := models.RecoveryLine(sc.Q, sc.Stop*units.Minute, d, nil)
	if err != nil {
		t.Fatal(err)
	}
	if T, _ := rf.Param("T"); math.Abs(T.Value/rl.T-1) > 1e-9 {
		t.Errorf("recovery line T %v, models.RecoveryLine %v", T.Value, rl.T)
	}
	h.byID("result-Sratio")

	// The report carries the stop, the second well, every fit and the
	// hints.
	h.click("tab-report")
	rep := h.text("report")
	for _, want := range []string{"Pump stopped360", "Also read inCH-B", "Hantush–Jacob", "Theis recovery line", "Suggestion:"} {
		if !strings.Contains(rep, want) {
			t.Errorf("the report lacks %q", want)
		}
	}
}

// TestPumpBadInputs checks that each model's bad inputs give a message
// naming what is wrong, and that what was typed is kept.
func TestPumpBadInputs(t *testing.T) {
	sc := pumpScenario
	h := newHarness(t, nil)
	pumpSession(h, sc)
	h.click("tab-test")
	// A step schedule out of order: step 2 at 100 min, step 3 at 50.
	h.click("add-step")
	h.click("add-step")
	h.input("step-0-start", "100")
	h.input("step-0-rate", "9")
	h.input("step-1-start", "50")
	h.input("step-1-rate", "7")
	h.click("tab-fit")
	h.click("fit")
	if s := h.text("fit-status"); !strings.Contains(s, "step 3 start") || !strings.Contains(s, "out of order") {
		t.Errorf("out-of-order steps: %q", s)
	}
	if got := h.app.Current().Tests[0].Pump.Steps[1].StartText; got != "50" {
		t.Errorf("typed step start lost: %q", got)
	}
	h.click("tab-test")
	h.input("step-1-start", "x")
	if s := h.text("step-1-start-msg"); !strings.Contains(s, "not a number") {
		t.Errorf("bad step text: %q", s)
	}
	h.click("step-1-remove")
	h.click("step-0-remove")

	// A weight that is not a number is kept, with a message.
	h.click("tab-fit")
	h.input("weight-0", "heavy")
	if s := h.text("weight-0-msg"); !strings.Contains(s, "not a weight") {
		t.Errorf("bad weight: %q", s)
	}
	h.input("weight-0", "")

	// A given boundary distance not beyond the observation well.
	h.click("tab-fit")
	h.input("fit-model", string(project.TheisNoFlow))
	h.input("bearing-main", "0")
	h.input("boundary-distance", "15") // CH-A is 22 m away towards the boundary
	h.click("fit")
	if s := h.text("fit-status"); !strings.Contains(s, "boundary") || !strings.Contains(s, "r·cos θ = 22 m") {
		t.Errorf("boundary inside the well: %q", s)
	}
	if got := h.app.Current().Tests[0].Pump.BoundaryText; got != "15" {
		t.Errorf("typed boundary lost: %q", got)
	}

	// The recovery line with no stop, then with no readings after it.
	h.input("fit-model", string(project.RecoveryLine))
	h.click("tab-test")
	h.input("pump-stop", "")
	h.click("tab-fit")
	h.click("fit")
	if s := h.text("fit-status"); !strings.Contains(s, "when the pump stopped") {
		t.Errorf("recovery without a stop: %q", s)
	}
	h.click("tab-test")
	h.input("pump-stop", "5000")
	h.click("tab-fit")
	h.click("fit")
	if s := h.text("fit-status"); !strings.Contains(s, "recovery series has 0 usable readings") {
		t.Errorf("empty recovery series: %q", s)
	}

	// Jacob's correction without the thickness.
	h.click("tab-site")
	h.input("aquifer-b", "")
	h.click("tab-fit")
	h.input("fit-model", string(project.Theis))
	h.input("jacob", "true")
	h.click("fit")
	if s := h.text("fit-status"); !strings.Contains(s, "thickness b") {
		t.Errorf("Jacob without b: %q", s)
	}
}

// TestPumpJacobCorrection checks that Jacob's correction is applied as
// models.JacobCorrection does and warned about past b/4.
func TestPumpJacobCorrection(t *testing.T) {
	sc := pumpScenario
	h := newHarness(t, nil)
	pumpSession(h, sc)
	h.click("tab-site")
	h.input("aquifer-b", "3") // thin: the drawdowns pass b/4
	h.click("tab-fit")
	h.input("fit-model", string(project.Theis))
	h.input("jacob", "true")
	h.click("fit")
	tt := h.app.Current().Tests[0]
	f := currentFit(&tt)
	if f == nil {
		t.Fatal(h.text("fit-status"))
	}
	ws := scenarioWells(sc, func(r float64) models.Model {
		return models.VariableRate{Base: models.Theis{Q: sc.Q, R: r}, Steps: models.PumpAndStop(sc.Q, sc.Stop*units.Minute)}
	})
	for k := range ws {
		c, _, err := models.JacobCorrection(ws[k].Data, 3)
		if err != nil {
			t.Fatal(err)
		}
		ws[k].Data = c
	}
	want, err := models.FitWells(ws, nil)
	if err != nil {
		t.Fatal(err)
	}
	if T, _ := f.Param("T"); math.Abs(T.Value/want.Params[0]-1) > 1e-9 {
		t.Errorf("T %v, want %v", T.Value, want.Params[0])
	}
	w := strings.Join(f.Warnings, " ")
	if !strings.Contains(w, "quarter of the saturated thickness") || !strings.Contains(w, "approximation") {
		t.Errorf("warnings %q", w)
	}
}

// TestStepDrawdownPanel types a four-step test read in the pumping well
// and checks the panel against steptest on the same readings.
func TestStepDrawdownPanel(t *testing.T) {
	h := newHarness(t, nil)
	h.click("new-project")
	h.click("tab-wells")
	h.click("add-pumping-well")
	h.input("well-0-name", "Quarry bore")
	h.input("well-0-radius", "0.15")
	h.click("tab-test")
	h.input("test-rate", "5")
	h.input("test-static", "3.2")
	h.input("test-obs-well", h.app.Current().Wells[0].ID)
	h.click("add-step")
	h.click("add-step")
	h.click("add-step")
	h.input("step-0-start", "100")
	h.input("step-0-rate", "10")
	h.input("step-1-start", "200")
	h.input("step-1-rate", "15")
	h.input("step-2-start", "300")
	h.input("step-2-rate", "20")
	// Invented: Theis drawdown at the well radius over the steps plus a
	// well loss C·Q² that follows the rate at once (B' and C our own).
	const T, S, C = 1.5e-3, 2e-4, 4e3 // m²/s, –, s²/m⁵
	sched := []models.RateStep{{Start: 0, Rate: 5e-3}, {Start: 6000, Rate: 10e-3}, {Start: 12000, Rate: 15e-3}, {Start: 18000, Rate: 20e-3}}
	var mins []float64
	for k := range 4 {
		for _, m := range []float64{1, 2, 3, 5, 8, 12, 20, 30, 45, 60, 80, 100} {
			mins = append(mins, float64(k)*100+m)
		}
	}
	ts := make([]float64, len(mins))
	for i, m := range mins {
		ts[i] = m * units.Minute
	}
	s := make([]float64, len(ts))
	models.VariableRate{Base: models.Theis{Q: 5e-3, R: 0.15}, Steps: sched}.Eval(s, ts, []float64{T, S})
	var text strings.Builder
	for i, m := range mins {
		q := sched[int(math.Min(3, math.Floor((m-1e-9)/100)))].Rate
		text.WriteString(strconv.FormatFloat(m, 'f', -1, 64) + "\t" + strconv.FormatFloat(3.2+s[i]+C*q*q, 'f', 4, 64) + "\n")
	}
	h.click("tab-readings")
	h.paste("r-0-time", text.String())
	h.click("tab-fit")
	h.byID("steptest")
	c := h.text("step-C")
	if !strings.Contains(c, "s²/m⁵") {
		t.Fatalf("no C: %q (%s)", c, h.text("steptest"))
	}
	// The same analysis, in pure Go on the readings as stored.
	tt := h.app.Current().Tests[0]
	checks := CheckReadings(&tt, mustUnit("m"))
	tm, dd, _ := UsableReadings(&tt, checks)
	an, err := stepAnalysis(tm, dd)
	if err != nil {
		t.Fatal(err)
	}
	if want := formatSig(an.Law.C, 3); !strings.HasPrefix(c, want+" ") {
		t.Errorf("page C %q, steptest %s", c, want)
	}
	if got := h.text("step-condition"); !strings.Contains(got, "Walton") {
		t.Errorf("well condition without its source: %q", got)
	}
	h.input("rorabaugh", "true")
	if got := h.text("step-n"); !strings.Contains(got, "95 % CI") {
		t.Errorf("Rorabaugh n: %q", got)
	}
	h.input("eff-rate", "12")
	if got := h.text("step-eff-at"); !strings.Contains(got, "%") {
		t.Errorf("efficiency at 12 L/s: %q", got)
	}
}

// stepAnalysis is the step test of TestStepDrawdownPanel in pure Go.
func stepAnalysis(tm, dd []float64) (*steptest.LossFit, error) {
	an, err := steptest.Analyse([]steptest.Step{{Start: 0, Rate: 5e-3}, {Start: 6000, Rate: 10e-3}, {Start: 12000, Rate: 15e-3}, {Start: 18000, Rate: 20e-3}},
		models.Data{Time: tm, Value: dd}, nil)
	if err != nil {
		return nil, err
	}
	return steptest.Jacob(an.Points(), nil)
}

// TestPumpDemo: the example's constant-rate test, still pumping, shows
// the stop indicator; its leaky test with recovery is fitted with every
// model in one tap, Hantush–Jacob chosen, and finds the invented values
// (ui/pump_demo.go) within its intervals.
func TestPumpDemo(t *testing.T) {
	h := newHarness(t, nil)
	h.click("demo-project")
	if s := h.text("can-stop"); !strings.Contains(s, "Can pumping stop?") || !(strings.Contains(s, "flat since") || strings.Contains(s, "not yet")) {
		t.Errorf("stop indicator %q", s)
	}
	h.input("test-select", "1")
	tt := h.app.Current().Tests[1]
	if len(tt.Fits) != len(pumpModels) || tt.Fit.Model != project.Hantush {
		t.Fatalf("%d fits, model %q", len(tt.Fits), tt.Fit.Model)
	}
	f := currentFit(&tt)
	for j, name := range []string{"T", "S", "B"} {
		e, _ := f.Param(name)
		truth := []float64{demoLeaky.T, demoLeaky.S, demoLeaky.B}[j]
		if !(e.Lower <= truth && truth <= e.Upper) {
			t.Errorf("%s = %v (%v – %v) misses the invented %v", name, e.Value, e.Lower, e.Upper, truth)
		}
	}
	for _, id := range []string{"compare-table", "plot-recovery", "plot-wells", "distance-T", "result-B"} {
		h.byID(id)
	}
}
