package ui

import (
	"math"
	"strconv"
	"strings"
	"time"

	"fieldfit/models"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// pumpOf returns the pumping-test data of t, creating it.
func pumpOf(t *project.Test) *project.PumpData {
	if t.Pump == nil {
		t.Pump = &project.PumpData{}
	}
	return t.Pump
}

// stepMessages checks the typed rate steps of t in the rate unit u and
// stores their SI values; it returns one message per bad step ("" for a
// good one).
func stepMessages(t *project.Test, u units.Unit) []string {
	if t.Pump == nil {
		return nil
	}
	msgs := make([]string, len(t.Pump.Steps))
	for i := range t.Pump.Steps {
		s := &t.Pump.Steps[i]
		s.OK = false
		st, err1 := parseNumber(s.StartText)
		q, err2 := parseNumber(s.RateText)
		switch {
		case err1 != nil:
			msgs[i] = "Start " + err1.Error() + "."
		case err2 != nil:
			msgs[i] = "Rate " + err2.Error() + "."
		case st <= 0:
			msgs[i] = "The step must start after the pump started (time > 0)."
		case q < 0:
			msgs[i] = "The rate must not be negative (0 for a pause)."
		default:
			s.Start, s.Rate, s.OK = st*units.Minute, u.ToSI(q), true
		}
	}
	return msgs
}

// stopMessage says what is wrong with the typed stop time, or "".
func stopMessage(pd *project.PumpData) string {
	if pd == nil || strings.TrimSpace(pd.StopText) == "" {
		return ""
	}
	v, err := parseNumber(pd.StopText)
	switch {
	case err != nil:
		return "Stop " + err.Error() + "; the test is taken as still pumping."
	case v <= 0:
		return "The stop must be after the start (time > 0); the test is taken as still pumping."
	}
	return ""
}

// pumpRequest adds the schedule, the other wells and the model settings
// of the pumping test t to req, and says what is missing.
func pumpRequest(p *project.Project, t *project.Test, req *FitRequest, main *project.Well) []string {
	var missing []string
	d := DisplayFor(p.Units)
	if main != nil {
		req.Name = main.Name
	}
	pd := t.Pump
	if pd == nil {
		pd = &project.PumpData{}
	}
	req.Weight, req.Angle = wellSetting(pd.Main)
	// The schedule: the first rate from time zero, the steps, the stop.
	msgs := stepMessages(t, rateUnit(t, d))
	sched := []models.RateStep{{Start: 0, Rate: req.Q}}
	for i, s := range pd.Steps {
		if msgs[i] != "" {
			missing = append(missing, "Rate step "+strconv.Itoa(i+2)+": "+msgs[i])
		} else {
			sched = append(sched, models.RateStep{Start: s.Start, Rate: s.Rate})
		}
	}
	if stopMessage(pd) == "" && pd.Stop > 0 {
		req.Stop = pd.Stop
		sched = append(sched, models.RateStep{Start: pd.Stop})
	}
	if len(sched) > 1 {
		req.Steps = sched
		if req.Q > 0 {
			if err := (models.VariableRate{Base: models.Theis{Q: req.Q, R: 1}, Steps: sched}).Check(); err != nil {
				missing = append(missing, "The pumping schedule on the Test tab: "+scheduleSentence(err))
			}
		}
	}
	// The other observation wells.
	for k := range pd.Wells {
		wr := &pd.Wells[k]
		w := p.Well(wr.WellID)
		if w == nil || w.ID == t.ObservationWell {
			continue
		}
		times, dd := seriesReadings(t, wr)
		if len(times) == 0 {
			continue // nothing read there yet: shown on the Readings tab
		}
		ws := WellSeries{Name: w.Name, Time: times, Drawdown: dd}
		ws.Weight, ws.Angle = wellSetting(wr.Setting)
		if r, ok := w.Distance.Value(); ok && r > 0 {
			ws.R = r
		} else {
			missing = append(missing, "Enter the distance of "+quoteName(w.Name)+" from the pumping well on the Wells tab (its readings are in the joint fit).")
		}
		req.More = append(req.More, ws)
	}
	if pd.BoundaryText != "" {
		if v, err := parseNumber(pd.BoundaryText); err == nil && v > 0 {
			req.Boundary = d.Length.ToSI(v)
		}
	}
	req.Jacob = pd.Jacob
	// What the chosen model needs.
	pm := pumpModelOf(req.Model)
	switch {
	case pm == nil:
		missing = append(missing, "Choose a model.")
	case pm.build == nil:
		n := 0
		for _, tm := range req.Time {
			if req.Stop > 0 && tm > req.Stop {
				n++
			}
		}
		switch {
		case req.Stop == 0:
			missing = append(missing, "Enter when the pump stopped on the Test tab: the recovery line reads the readings after the stop.")
		case n < 3:
			missing = append(missing, "The recovery series has "+strconv.Itoa(n)+" usable readings after the stop at "+formatSig(req.Stop/units.Minute, 4)+" min; the recovery line needs 3.")
		}
	case pm.jacob && req.Jacob && !(req.Thickness > 0):
		missing = append(missing, "Enter the aquifer thickness b on the Site tab for Jacob's correction.")
	}
	if pm != nil && pm.build != nil && req.Boundary > 0 && req.Q > 0 {
		for _, ws := range req.wells() {
			if ws.R <= 0 {
				continue
			}
			if err := pm.build(req, &ws).Check(); err != nil {
				missing = append(missing, "The boundary distance for "+quoteName(ws.Name)+": "+scheduleSentence(err))
				break
			}
		}
	}
	return missing
}

// scheduleSentence is the reason of a models error, as a sentence.
func scheduleSentence(err error) string {
	if e, ok := err.(*models.Error); ok && e.Reason != "" {
		s := e.Reason
		if e.Field != "" {
			s = e.Field + ": " + s
		}
		return s + "."
	}
	return err.Error() + "."
}

// wellSetting returns the weight (0 means 1) and the bearing in radians
// (90° when not given) of a well setting.
func wellSetting(s project.WellSetting) (weight, angle float64) {
	angle = math.Pi / 2
	if s.BearingOK {
		angle = s.Bearing * math.Pi / 180
	}
	return s.Weight, angle
}

// seriesView returns a test that shows the readings of wr in place of
// t's own, for the readings table and its checks.
func seriesView(t *project.Test, wr *project.WellReadings) *project.Test {
	v := *t
	v.Readings, v.StaticLevel = wr.Readings, wr.StaticLevel
	return &v
}

// seriesReadings returns the usable times (s) and drawdowns (m) of the
// other well wr of t.
func seriesReadings(t *project.Test, wr *project.WellReadings) (times, dd []float64) {
	v := seriesView(t, wr)
	checks := CheckReadings(v, depthUnit(t))
	wr.Readings = v.Readings
	times, dd, _ = UsableReadings(v, checks)
	return times, dd
}

// ---- actions ----

// SetPumpField sets a field of the selected test's pumping data from
// typed text: "stop" (minutes), "boundary" (display length), "jacob"
// ("true"/"false"), "distance-at" (minutes), "step-duration" (minutes),
// "rorabaugh" ("true"/"false"), "efficiency-rate" (rate unit), and for a
// well ("main" or the index of an other well as "well-K-"): "weight" and
// "bearing" (degrees). Text that cannot be read is kept with a message.
func (a *App) SetPumpField(field, text string) {
	a.editTest(func(t *project.Test) {
		pd := pumpOf(t)
		v, err := parseNumber(text)
		ok := err == nil
		minutes := 0.0
		if ok && v > 0 {
			minutes = v * units.Minute
		}
		switch field {
		case "stop":
			pd.StopText, pd.Stop = text, minutes
		case "boundary":
			pd.BoundaryText = text
			pd.Boundary = 0
			if ok && v > 0 {
				pd.Boundary = DisplayFor(a.cur.Units).Length.ToSI(v)
			}
		case "jacob":
			pd.Jacob = text == "true"
		case "distance-at":
			pd.DistanceAtText, pd.DistanceAt = text, minutes
		case "step-duration":
			pd.StepDurationText, pd.StepDuration = text, minutes
		case "rorabaugh":
			pd.Rorabaugh = text == "true"
		case "efficiency-rate":
			pd.EfficiencyRateText, pd.EfficiencyRate = text, 0
			if ok && v > 0 {
				pd.EfficiencyRate = rateUnit(t, DisplayFor(a.cur.Units)).ToSI(v)
			}
		default:
			who, what, found := strings.Cut(field, ":")
			if !found {
				return
			}
			s := &pd.Main
			if who != "main" {
				k, err := strconv.Atoi(who)
				if err != nil || k < 0 || k >= len(pd.Wells) {
					return
				}
				s = &pd.Wells[k].Setting
			}
			switch what {
			case "weight":
				s.WeightText, s.Weight = text, 0
				if ok && v >= 0 {
					s.Weight = v
				}
			case "bearing":
				s.BearingText, s.Bearing, s.BearingOK = text, v, ok
			}
		}
	}, true)
}

// AddRateStep adds an empty rate step to the schedule.
func (a *App) AddRateStep() {
	a.editTest(func(t *project.Test) {
		pd := pumpOf(t)
		pd.Steps = append(pd.Steps, project.RateStepEntry{})
	}, false)
}

// SetRateStep sets the "start" (minutes) or "rate" (rate unit) text of
// step i.
func (a *App) SetRateStep(i int, field, text string) {
	a.editTest(func(t *project.Test) {
		pd := pumpOf(t)
		if i < 0 || i >= len(pd.Steps) {
			return
		}
		if field == "start" {
			pd.Steps[i].StartText = text
		} else {
			pd.Steps[i].RateText = text
		}
		stepMessages(t, rateUnit(t, DisplayFor(a.cur.Units)))
	}, true)
}

// RemoveRateStep deletes step i.
func (a *App) RemoveRateStep(i int) {
	a.editTest(func(t *project.Test) {
		pd := pumpOf(t)
		if i >= 0 && i < len(pd.Steps) {
			pd.Steps = append(pd.Steps[:i], pd.Steps[i+1:]...)
		}
	}, true)
}

// AddWellReadings starts the readings of an other observation well of
// the selected test and shows its table.
func (a *App) AddWellReadings(wellID string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil || a.cur.Well(wellID) == nil || wellID == t.ObservationWell {
		return
	}
	pd := pumpOf(t)
	for k, wr := range pd.Wells {
		if wr.WellID == wellID {
			a.fit.series = k + 1
			return
		}
	}
	pd.Wells = append(pd.Wells, project.WellReadings{WellID: wellID, Readings: []project.Reading{}})
	a.fit.series = len(pd.Wells)
	a.changedLocked()
}

// ShowSeries shows the readings of the main well (0) or of other well
// k (1-based) in the readings table.
func (a *App) ShowSeries(k int) {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.fit.series = k
}

// SetSeriesStatic sets the static level (display length) of the other
// well shown.
func (a *App) SetSeriesStatic(text string) {
	a.editTest(func(t *project.Test) {
		if wr := a.seriesLocked(t); wr != nil {
			wr.StaticLevel, _ = entryFrom(text, DisplayFor(a.cur.Units).Length)
		}
	}, true)
}

// seriesLocked returns the other well whose readings are shown, or nil
// for the main well.
func (a *App) seriesLocked(t *project.Test) *project.WellReadings {
	if a.fit.series <= 0 || t.Pump == nil || a.fit.series > len(t.Pump.Wells) {
		a.fit.series = 0
		return nil
	}
	return &t.Pump.Wells[a.fit.series-1]
}

// readingsTestLocked returns the test whose Readings and StaticLevel are
// those of the table shown, and a function that stores the table's
// edits back.
func (a *App) readingsTestLocked(t *project.Test) (*project.Test, func()) {
	wr := a.seriesLocked(t)
	if wr == nil {
		return t, func() {}
	}
	v := seriesView(t, wr)
	return v, func() { wr.Readings = v.Readings }
}

// storeFit puts f, fitted at the time at, into t.Fits in place of the
// fit of the same model, and reports whether it was not there yet with
// these inputs.
func storeFit(t *project.Test, f project.ModelFit, at time.Time) bool {
	f.At = at
	for i := range t.Fits {
		if t.Fits[i].Model == f.Model {
			if t.Fits[i].Inputs == f.Inputs {
				return false
			}
			t.Fits[i] = f
			return true
		}
	}
	t.Fits = append(t.Fits, f)
	return true
}

// FitAll fits every model whose inputs are complete, one after the
// other, for the comparison table; the chosen model's fit stays on
// screen.
func (a *App) FitAll() {
	a.mu.Lock()
	defer a.mu.Unlock()
	a.fit.all = true
	a.runFitLocked()
}
