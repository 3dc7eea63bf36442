package ui

import (
	"context"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// fitState is the fit step's state that is not part of the project.
type fitState struct {
	running bool
	timer   func() // stops a pending automatic fit
	again   bool   // inputs changed while a fit ran
	out     *FitOutcome
	msg     string // why no fit can be made, or the last error
	// drag is a fit window being dragged on the plot, in seconds.
	dragging  bool
	dragStart float64
	dragEnd   float64
	// series is the well whose readings table is shown: 0 the test's
	// own, k the k-th other well of Test.Pump.
	series int
	// all is set while every model is being fitted in turn.
	all bool
}

// currentTest returns the selected test of the open project, or nil.
func (a *App) currentTest() *project.Test {
	if a.cur == nil || len(a.cur.Tests) == 0 {
		return nil
	}
	if a.testIdx < 0 || a.testIdx >= len(a.cur.Tests) {
		a.testIdx = 0
	}
	return &a.cur.Tests[a.testIdx]
}

// depthUnit is the unit the readings' depths are typed in.
func depthUnit(t *project.Test) units.Unit {
	if u, ok := units.Lookup(t.DepthUnit); ok && u.Quantity == units.Length {
		return u
	}
	return mustUnit("m")
}

// fitRequest assembles the fit of test t of project p, or says in plain
// sentences what is missing. The readings are the tape readings of the
// table, or the logger record conditioned by cond (conditionTest when
// nil) when the test fits the logger record.
func fitRequest(p *project.Project, t *project.Test, cond conditioner) (FitRequest, []string) {
	var req FitRequest
	var missing []string
	req.Model = t.Fit.ModelOrDefault()
	if q, ok := t.Rate.Value(); ok && q > 0 {
		req.Q = q
	}
	if t.FitsLogger() {
		missing = append(missing, loggerReadings(&req, t, cond)...)
	} else if _, ok := t.StaticLevel.Value(); !ok {
		missing = append(missing, "Enter the static water level on the Test tab.")
	}
	if !(req.Q > 0) {
		where := "on the Test tab"
		if t.FitsLogger() {
			where += ", or as the first step of the rate schedule on the Logger data tab"
		}
		missing = append(missing, "Enter the pumping rate (greater than zero) "+where+".")
	}
	w := p.Well(t.ObservationWell)
	switch {
	case w == nil:
		missing = append(missing, "Choose the well the readings were taken in on the Test tab.")
	case w.Kind == project.Pumping:
		if r, ok := w.Radius.Value(); ok && r > 0 {
			req.R = r
		} else {
			missing = append(missing, fmt.Sprintf("Enter the radius of the pumping well %s on the Wells tab.", quoteName(w.Name)))
		}
	default:
		if r, ok := w.Distance.Value(); ok && r > 0 {
			req.R = r
		} else {
			missing = append(missing, fmt.Sprintf("Enter the distance of %s from the pumping well on the Wells tab.", quoteName(w.Name)))
		}
	}
	if !t.FitsLogger() {
		checks := CheckReadings(t, depthUnit(t))
		req.Time, req.Drawdown, _ = UsableReadings(t, checks)
	}
	if len(req.Time) < 3 {
		missing = append(missing, fmt.Sprintf("At least 3 usable readings are needed (%d so far).", len(req.Time)))
	}
	req.From, req.To = t.Fit.WindowStart, t.Fit.WindowEnd
	if req.To > 0 && req.To <= req.From {
		missing = append(missing, "The end of the fit window must be after its start.")
	}
	if b, ok := p.Thickness.Value(); ok && b > 0 {
		req.Thickness = b
	}
	req.CJUMax = t.Fit.CJUMaxOrDefault()
	missing = append(missing, pumpRequest(p, t, &req, w)...)
	return req, missing
}

// fitRequestLocked is fitRequest for the open project, with the app's
// cache of the conditioned logger record.
func (a *App) fitRequestLocked(t *project.Test) (FitRequest, []string) {
	return fitRequest(a.cur, t, a.conditionedLocked)
}

func quoteName(s string) string {
	if strings.TrimSpace(s) == "" {
		return "(unnamed well)"
	}
	return "“" + s + "”"
}

// RunFit fits the selected test now.
func (a *App) RunFit() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.runFitLocked()
}

func (a *App) runFitLocked() {
	if a.fit.timer != nil {
		a.fit.timer()
		a.fit.timer = nil
	}
	t := a.currentTest()
	if t == nil {
		return
	}
	if t.Kind != project.PumpingTest {
		a.runKindFitLocked(t)
		return
	}
	if a.fit.running {
		a.fit.again = true
		return
	}
	req, missing := a.fitRequestLocked(t)
	if len(missing) > 0 {
		a.fit.msg = strings.Join(missing, " ")
		a.fit.out = nil
		a.fit.all = false
		return
	}
	// The other models, when all are fitted in turn: those whose inputs
	// are complete; the chosen one last, so its fit stays on screen.
	var others []FitRequest
	var skipped []string
	if a.fit.all {
		a.fit.all = false
		saved := t.Fit.Model
		for _, pm := range pumpModels {
			if pm.id == req.Model {
				continue
			}
			t.Fit.Model = pm.id
			r, miss := a.fitRequestLocked(t)
			if len(miss) > 0 {
				skipped = append(skipped, pm.short+" ("+miss[0]+")")
				continue
			}
			others = append(others, r)
		}
		t.Fit.Model = saved
	}
	a.fit.msg = ""
	a.fit.running = true
	pid, tid := a.cur.ID, t.ID
	fitFn := a.opt.Fit
	a.goBusy("fit", "Fitting…", func(ctx context.Context) {
		var fits []project.ModelFit
		var failed []string
		for _, r := range others {
			if o, err := fitFn(ctx, r); err == nil {
				fits = append(fits, o.Fit)
			} else {
				failed = append(failed, modelName(r.Model)+": "+err.Error())
			}
		}
		out, err := fitFn(ctx, req)
		a.mu.Lock()
		defer a.mu.Unlock()
		a.fit.running = false
		cur := a.currentTest()
		if a.cur == nil || a.cur.ID != pid || cur == nil || cur.ID != tid {
			return
		}
		now := a.opt.Now().UTC()
		for _, f := range fits {
			storeFit(cur, f, now)
		}
		if len(fits) > 0 {
			a.changedLocked()
		}
		if err != nil {
			a.fit.msg = "The fit failed: " + err.Error()
			a.fit.out = nil
		} else {
			out.Result.At = now
			a.fit.out = out
			if cur.Result == nil || cur.Result.Inputs != out.Result.Inputs || storeFit(cur, out.Fit, now) {
				r := out.Result
				cur.Result = &r
				storeFit(cur, out.Fit, now)
				a.changedLocked()
			}
		}
		if len(skipped)+len(failed) > 0 {
			a.notice = "Not fitted: " + strings.Join(append(skipped, failed...), "; ")
		}
		if a.fit.again {
			a.fit.again = false
			a.scheduleFitLocked()
		}
	})
}

// readingsChangedLocked is called after any edit that changes what a fit
// would use: the results are refitted after AutoFitDelay unless the test
// is on manual fitting.
func (a *App) readingsChangedLocked() {
	a.changedLocked()
	if t := a.currentTest(); t != nil && !t.Fit.Manual {
		a.scheduleFitLocked()
	}
}

func (a *App) scheduleFitLocked() {
	if a.fit.timer != nil {
		a.fit.timer()
	}
	a.fit.timer = a.opt.After(AutoFitDelay, func() {
		a.mu.Lock()
		a.fit.timer = nil
		a.runFitLocked()
		a.mu.Unlock()
		a.opt.Changed()
	})
}

// restorePlotLocked refits a test that has a stored result, so that the
// plots have their curve and band; the stored result is kept when the
// inputs are the same.
func (a *App) restorePlotLocked() {
	if t := a.currentTest(); t != nil && t.Result != nil {
		a.runFitLocked()
	}
}

// SetModel chooses the model of the selected test.
func (a *App) SetModel(m project.Model) {
	a.editTest(func(t *project.Test) {
		if pumpModelOf(m) != nil {
			t.Fit.Model = m
		}
	}, true)
}

// CJUMaxChoices are the Cooper–Jacob u thresholds offered: 0.01 after
// Cooper & Jacob (1946) (from memory), 0.05 and 0.1 common practice.
var CJUMaxChoices = []float64{0.01, 0.05, 0.1}

// SetCJUMax sets the u threshold of the Cooper–Jacob validity from one of
// CJUMaxChoices; any other text is ignored.
func (a *App) SetCJUMax(text string) {
	v, err := strconv.ParseFloat(strings.TrimSpace(text), 64)
	if err != nil || !slices.Contains(CJUMaxChoices, v) {
		return
	}
	a.editTest(func(t *project.Test) { t.Fit.CJUMax = v }, true)
}

// SetAutoFit turns the automatic refit on or off.
func (a *App) SetAutoFit(on bool) {
	a.editTest(func(t *project.Test) { t.Fit.Manual = !on }, on)
}

// MaxSmoothing is the widest derivative smoothing window accepted, in log
// cycles.
const MaxSmoothing = 2.0

// smoothingMessage says what is wrong with the typed smoothing, or "".
func smoothingMessage(f project.FitSettings) string {
	if strings.TrimSpace(f.SmoothingText) == "" || f.Smoothing > 0 {
		return ""
	}
	return fmt.Sprintf("%q is not a window from 0 to %g log cycles; %g is used.", f.SmoothingText, MaxSmoothing, project.DefaultSmoothing)
}

// SetSmoothing sets the derivative smoothing L (log cycles) from text.
func (a *App) SetSmoothing(text string) {
	a.editTest(func(t *project.Test) {
		t.Fit.SmoothingText = text
		t.Fit.Smoothing = 0
		if v, err := parseNumber(text); err == nil && v > 0 && v <= MaxSmoothing {
			t.Fit.Smoothing = v
		}
	}, false)
}

// SetWindowText sets one end ("start" or "end") of the fit window from
// minutes typed. Text that is not a number is kept and the side is left
// open, with a message.
func (a *App) SetWindowText(side, text string) {
	a.editTest(func(t *project.Test) {
		v, err := parseNumber(text)
		sec := 0.0
		if err == nil && v > 0 {
			sec = v * units.Minute
		}
		if side == "start" {
			t.Fit.WindowStartText, t.Fit.WindowStart = text, sec
		} else {
			t.Fit.WindowEndText, t.Fit.WindowEnd = text, sec
		}
	}, true)
}

// ClearWindow fits every reading again.
func (a *App) ClearWindow() {
	a.editTest(func(t *project.Test) {
		t.Fit.WindowStart, t.Fit.WindowEnd = 0, 0
		t.Fit.WindowStartText, t.Fit.WindowEndText = "", ""
	}, true)
}

// setWindowSeconds sets the fit window from a drag (seconds, any order).
func (a *App) setWindowLocked(t *project.Test, s0, s1 float64) {
	if s1 < s0 {
		s0, s1 = s1, s0
	}
	t.Fit.WindowStart, t.Fit.WindowEnd = s0, s1
	t.Fit.WindowStartText = formatPlain3(s0 / units.Minute)
	t.Fit.WindowEndText = formatPlain3(s1 / units.Minute)
	a.readingsChangedLocked()
}

func formatPlain3(v float64) string {
	return strings.ReplaceAll(formatSig(v, 3), "−", "-")
}

// windowMessage says what is wrong with the typed window, or "".
func windowMessage(f project.FitSettings) string {
	var msgs []string
	for _, s := range []struct{ name, text string }{{"Start", f.WindowStartText}, {"End", f.WindowEndText}} {
		if strings.TrimSpace(s.text) == "" {
			continue
		}
		v, err := parseNumber(s.text)
		switch {
		case err != nil:
			msgs = append(msgs, s.name+" "+err.Error()+"; that side is left open.")
		case v <= 0:
			msgs = append(msgs, s.name+" must be greater than zero; that side is left open.")
		}
	}
	if f.WindowStart > 0 && f.WindowEnd > 0 && f.WindowEnd <= f.WindowStart {
		msgs = append(msgs, "The end of the window must be after its start.")
	}
	return strings.Join(msgs, " ")
}

// editTest applies edit to the selected test, records the change, and
// refits when refit is true (and the fit is automatic).
func (a *App) editTest(edit func(t *project.Test), refit bool) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil {
		return
	}
	edit(t)
	if refit {
		a.readingsChangedLocked()
	} else {
		a.changedLocked()
	}
}
