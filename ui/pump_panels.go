package ui

import (
	"strconv"

	"fieldfit/models"
	"fieldfit/models/diagnostic"
	"fieldfit/models/regime"
	"fieldfit/models/steptest"
	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// renderPumpPanels are the fit step's panels of a pumping test beyond
// the results: the comparison table, the flow-regime hints and the stop
// indicator, the step-drawdown analysis and the distance–drawdown line.
func (a *App) renderPumpPanels(t *project.Test, d Display) []*v.Node {
	req, _ := a.fitRequestLocked(t)
	out := []*v.Node{a.renderCompare(t, d), renderHints(t, &req, d)}
	if n := a.stepPanel(t, &req, d); n != nil {
		out = append(out, n)
	}
	if n := a.distancePanel(t, &req, d); n != nil {
		out = append(out, n)
	}
	return out
}

// pumpingPart returns the readings taken while the pump ran.
func pumpingPart(req *FitRequest) (ts, ss []float64) {
	for i, tm := range req.Time {
		if req.Stop == 0 || tm <= req.Stop {
			ts, ss = append(ts, tm), append(ss, req.Drawdown[i])
		}
	}
	return ts, ss
}

// pumpHints are the flow-regime hints of the main well's drawdown while
// pumping, as suggestions with their reason, and, while the pump runs,
// whether pumping can stop ("" after the stop).
func pumpHints(t *project.Test, req *FitRequest, d Display) (hints []string, stop string, flat bool) {
	ts, ss := pumpingPart(req)
	if len(ts) < 5 {
		return []string{"Hints appear from 5 readings taken while pumping."}, "", false
	}
	win := diagnostic.WindowFromCycles(t.Fit.SmoothingOrDefault())
	q := req.Q
	if len(req.Steps) > 2 || len(req.Steps) == 2 && req.Steps[1].Rate != 0 {
		q = 0 // the rate changes: no T from a flat stretch
	}
	dg, err := regime.Diagnose(ts, ss, &regime.Settings{Rate: q, Window: win})
	switch {
	case err != nil:
		hints = append(hints, "No hints: "+err.Error())
	case len(dg.Hints) == 0:
		hints = append(hints, "No clear pattern in the derivative yet (no stretch of half a log cycle that is flat, rising, falling or of unit slope).")
	}
	if err == nil {
		for _, h := range dg.Hints {
			s := "Suggestion: " + h.Text
			if h.Kind == regime.Flat && h.T > 0 {
				s += " This level implies T ≈ " + formatSig(d.Transmissivity.FromSI(h.T), 3) + " " + d.Transmissivity.Symbol + "."
			}
			hints = append(hints, s)
		}
	}
	if req.Stop > 0 {
		return hints, "", false
	}
	st, err := regime.CanStop(ts, ss, &regime.StopSettings{Window: win})
	if err != nil {
		return hints, "Cannot tell: " + err.Error(), false
	}
	stop = st.Text
	if st.Remaining > 0 {
		stop += " One more log cycle of flat derivative at " + formatSig(st.OneCycleAt/units.Minute, 3) + " min, " +
			formatSig(st.Remaining/units.Minute, 3) + " min from the last reading."
	}
	return hints, stop, st.Flat
}

// hintsNote says what the hints are.
const hintsNote = "Hints and the stop indicator are suggestions from the shape of the derivative (tolerances of common practice); judge them with the plots."

// renderHints shows the flow-regime hints and the stop indicator.
func renderHints(t *project.Test, req *FitRequest, d Display) *v.Node {
	box := v.El("div", v.A("id", "hints", "class", "ff-card"), v.TextEl("h3", nil, "What the derivative suggests"))
	hints, stop, flat := pumpHints(t, req, d)
	ul := v.El("ul", v.A("id", "hint-list", "class", "ff-hints"))
	for _, h := range hints {
		ul.Add(v.TextEl("li", nil, h))
	}
	box.Add(ul)
	if stop != "" {
		class := "ff-stop"
		if flat {
			class += " ff-stop-yes"
		}
		box.Add(v.El("div", v.A("id", "can-stop", "class", class, "role", "status"),
			v.TextEl("strong", nil, "Can pumping stop? "), v.T(stop)))
	}
	return box.Add(v.TextEl("p", v.A("class", "ff-hint"), hintsNote))
}

// stepPanel is the step-drawdown analysis, shown when the schedule has
// two or more pumping rates.
func (a *App) stepPanel(t *project.Test, req *FitRequest, d Display) *v.Node {
	var steps []steptest.Step
	for _, s := range req.Steps {
		if s.Rate > 0 {
			steps = append(steps, steptest.Step{Start: s.Start, Rate: s.Rate})
		}
	}
	if len(steps) < 2 {
		return nil
	}
	pd := t.Pump
	box := v.El("div", v.A("id", "steptest", "class", "ff-card"), v.TextEl("h3", nil, "Step-drawdown test"))
	box.Add(textField{id: "step-duration", label: "Drawdown of each step taken at", unit: "min after its start", numeric: true,
		value: pd.StepDurationText, placeholder: "shortest step", onInput: func(s string) { a.SetPumpField("step-duration", s) }}.node())
	if w := a.cur.Well(t.ObservationWell); w == nil || w.Kind != project.Pumping {
		box.Add(v.TextEl("p", v.A("class", "ff-msg"), "The step-drawdown analysis reads the drawdown in the pumping well: choose it under “Readings taken in” on the Test tab."))
	}
	ts, ss := pumpingPart(req)
	an, err := steptest.Analyse(steps, models.Data{Time: ts, Value: ss}, &steptest.Settings{Duration: pd.StepDuration})
	if err != nil {
		return box.Add(v.TextEl("p", v.A("id", "step-msg", "class", "ff-msg"), err.Error()))
	}
	ru := rateUnit(t, d)
	var rows [][]string
	for _, s := range an.Steps {
		rows = append(rows, []string{strconv.Itoa(s.Index + 1), formatSig(ru.FromSI(s.Rate), 3), formatSig(d.Length.FromSI(s.Drawdown), 3), formatSig(s.Specific, 3) + " s/m²"})
	}
	box.Add(v.TextEl("p", nil, "Each step's drawdown at Δt = "+formatSig(an.Duration/units.Minute, 3)+" min by superposition (Hantush–Bierschenk)."),
		dataTable("step-table", []string{"Step", "Rate (" + ru.Symbol + ")", "Drawdown at Δt (" + d.Length.Symbol + ")", "Specific drawdown s/Q"}, rows, nil))
	pts := an.Points()
	law, err := steptest.Jacob(pts, nil)
	if err != nil {
		return box.Add(v.TextEl("p", v.A("id", "step-msg", "class", "ff-msg"), err.Error()))
	}
	dl := v.El("dl", v.A("class", "ff-dl"))
	item := func(id, label, text string) { dl.Add(v.TextEl("dt", nil, label), v.TextEl("dd", v.A("id", id), text)) }
	for _, c := range law.Coefficients {
		item("step-"+c.Name, c.Long+" "+c.Name, ciText(c.Value, c.Lower, c.Upper, " "+c.Unit))
	}
	effAt := func(q float64) string {
		e, lo, hi := law.Efficiency(q)
		return ciText(100*e, 100*lo, 100*hi, " %")
	}
	for _, s := range an.Steps {
		item("step-eff-"+strconv.Itoa(s.Index), "Efficiency BQ/s_w at step "+strconv.Itoa(s.Index+1), effAt(s.Rate))
	}
	box.Add(textField{id: "eff-rate", label: "Efficiency at the rate", unit: ru.Symbol, numeric: true, value: pd.EfficiencyRateText,
		onInput: func(s string) { a.SetPumpField("efficiency-rate", s) }}.node())
	if pd.EfficiencyRate > 0 {
		item("step-eff-at", "Efficiency at "+formatSig(ru.FromSI(pd.EfficiencyRate), 3)+" "+ru.Symbol, effAt(pd.EfficiencyRate))
	}
	if cond, err := law.Condition(); err == nil {
		item("step-condition", "Well condition (guidance)", cond.String())
	}
	box.Add(checkField("rorabaugh", " Also fit Rorabaugh's exponent n (s_w = BQ + CQⁿ)", pd.Rorabaugh,
		func(on bool) { a.SetPumpField("rorabaugh", strconv.FormatBool(on)) }))
	if pd.Rorabaugh {
		if rb, err := steptest.Rorabaugh(pts, nil); err != nil {
			item("step-n", "Rorabaugh n", err.Error())
		} else if c, ok := rb.Coefficient("n"); ok {
			item("step-n", "Rorabaugh n", ciText(c.Value, c.Lower, c.Upper, ""))
		}
	}
	box.Add(dl)
	for _, c := range append(an.Caveats, law.Caveats...) {
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), c))
	}
	return box
}

// distancePanel is the distance–drawdown line at a chosen time, shown
// with two or more observation wells.
func (a *App) distancePanel(t *project.Test, req *FitRequest, d Display) *v.Node {
	wells := req.wells()
	if len(wells) < 2 {
		return nil
	}
	pd := t.Pump
	box := v.El("div", v.A("id", "distance", "class", "ff-card"), v.TextEl("h3", nil, "Distance–drawdown (Cooper–Jacob in r)"))
	box.Add(textField{id: "distance-at", label: "At the time", unit: "min since the start", numeric: true, value: pd.DistanceAtText,
		placeholder: "latest read at every well", onInput: func(s string) { a.SetPumpField("distance-at", s) }}.node())
	at := pd.DistanceAt
	if at == 0 {
		for k, w := range wells {
			last := 0.0
			for _, tm := range w.Time {
				if req.Stop == 0 || tm <= req.Stop {
					last = tm
				}
			}
			if k == 0 || last < at {
				at = last
			}
		}
	}
	var r, s []float64
	for _, w := range wells {
		wd := models.Data{Time: w.Time, Value: w.Drawdown}
		if req.Stop > 0 {
			// Drawdown while pumping only: recovery is not on the line.
			wd.Exclude = make([]bool, len(w.Time))
			for i, tm := range w.Time {
				wd.Exclude[i] = tm > req.Stop
			}
		}
		dd, err := models.DrawdownAt(wd, at)
		if err != nil {
			return box.Add(v.TextEl("p", v.A("id", "distance-msg", "class", "ff-msg"), quoteName(w.Name)+": "+err.Error()))
		}
		r, s = append(r, w.R), append(s, dd)
	}
	res, err := models.DistanceDrawdownLine(req.Q, at, r, s, &models.LineSettings{UMax: req.CJUMax})
	if err != nil {
		return box.Add(v.TextEl("p", v.A("id", "distance-msg", "class", "ff-msg"), err.Error()))
	}
	dl := v.El("dl", v.A("class", "ff-dl"))
	_, ts := estimateText(namedEstimate("T", "m²/s", res.T, res.TLower, res.TUpper), d)
	_, sss := estimateText(namedEstimate("S", "", res.S, res.SLower, res.SUpper), d)
	dl.Add(v.TextEl("dt", nil, "Time"), v.TextEl("dd", nil, formatSig(at/units.Minute, 4)+" min"),
		v.TextEl("dt", nil, "Transmissivity T"), v.TextEl("dd", v.A("id", "distance-T"), ts),
		v.TextEl("dt", nil, "Storativity S"), v.TextEl("dd", v.A("id", "distance-S"), sss),
		v.TextEl("dt", nil, "Zero drawdown at r₀"), v.TextEl("dd", nil, formatSig(d.Length.FromSI(res.R0), 3)+" "+d.Length.Symbol))
	box.Add(dl)
	for _, c := range res.Caveats {
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), c))
	}
	return box
}
