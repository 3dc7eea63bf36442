package ui

import (
	"math"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// The pumping test's part of the report and of the exports (see
// ReportKind): the test and its schedule, what the fit used, the plots of
// the Fit tab, the fit as a row of the fitted-parameters table, the
// Cooper–Jacob validity, and the readings and fitted curve as CSV.
func init() {
	reportKinds[project.PumpingTest] = ReportKind{
		Label:    "Pumping test",
		Test:     pumpReportTest,
		Data:     pumpReportData,
		Plots:    func(a *App, rc *ReportContext) []*v.Node { return []*v.Node{a.renderPlots(rc.P, rc.T, rc.D)} },
		Fits:     pumpReportFits,
		After:    pumpReportAfter,
		Readings: pumpReadingsCSV,
		Curves:   pumpCurvesCSV,
	}
}

func wellName(p *project.Project, id string) string {
	w := p.Well(id)
	if w == nil {
		return ""
	}
	return orNone(w.Name)
}

// startText is when the test started, as a date and time.
func startText(t *project.Test) string {
	if t.Start.IsZero() {
		return t.StartText
	}
	return t.Start.Format("2006-01-02 15:04")
}

func pumpReportTest(a *App, rc *ReportContext) []*v.Node {
	p, t, d := rc.P, rc.T, rc.D
	rate := ""
	if !t.Rate.Empty() {
		rate = shownEntry(t.Rate, rateUnit(t, d))
	}
	obs := wellName(p, t.ObservationWell)
	if w := p.Well(t.ObservationWell); w != nil && w.Kind == project.Pumping {
		obs += " (the pumping well itself)"
	}
	times := "elapsed minutes"
	if timeMode(t) == project.ClockTime {
		times = "clock time"
	}
	f := t.Fit
	window := "all readings"
	if f.WindowStart > 0 || f.WindowEnd > 0 {
		lo, hi := "first reading", "last reading"
		if f.WindowStart > 0 {
			lo = formatSig(f.WindowStart/units.Minute, 3) + " min"
		}
		if f.WindowEnd > 0 {
			hi = formatSig(f.WindowEnd/units.Minute, 3) + " min"
		}
		window = lo + " to " + hi
	}
	rows := [][2]string{
		{"Test", orNone(t.Name)},
		{"Pump started", orNone(startText(t))},
		{"Pumping rate Q", orNone(rate)},
		{"Static water level (depth below MP)", orNone(shownEntry(t.StaticLevel, d.Length))},
		{"Pumping well", orNone(wellName(p, t.PumpingWell))},
		{"Readings taken in", orNone(obs)},
		{"Times recorded as", times},
		{"Model fitted", modelName(f.ModelOrDefault())},
		{"Fit window", window},
		{"Derivative smoothing L", strconv.FormatFloat(f.SmoothingOrDefault(), 'g', 3, 64) + " log cycles"},
	}
	if lg := t.Logger; lg != nil && lg.Water != nil {
		rows = append(rows, [2]string{"Pump start on the logger record", lg.Texts.Start}, [2]string{"Pump stop on the logger record", lg.Texts.Stop})
	}
	sec := reportSection("report-test", "Test and schedule", reportPairs("report-test-table", rows))
	if lg := t.Logger; lg != nil && len(lg.Rates) > 0 {
		var rs [][]string
		for _, r := range lg.Rates {
			rs = append(rs, []string{orNone(r.Start), orNone(r.Rate), orNone(r.Unit)})
		}
		sec.Add(v.TextEl("h3", nil, "Pumping rate schedule"),
			reportTable("report-rates", []string{"From (min)", "Rate", "Unit"}, rs))
	}
	return []*v.Node{sec}
}

func pumpReportData(a *App, rc *ReportContext) [][2]string {
	req, missing := a.fitRequestLocked(rc.T)
	rows := [][2]string{{"Usable for the fit", countWord(len(req.Time), "reading")}}
	if n := len(req.Time); n > 0 {
		lo, hi, smax := math.Inf(1), math.Inf(-1), math.Inf(-1)
		for i := range req.Time {
			lo, hi, smax = math.Min(lo, req.Time[i]), math.Max(hi, req.Time[i]), math.Max(smax, req.Drawdown[i])
		}
		rows = append(rows,
			[2]string{"Time span", formatSig(lo/units.Minute, 3) + " – " + formatSig(hi/units.Minute, 3) + " min"},
			[2]string{"Largest drawdown", formatSig(rc.D.Length.FromSI(smax), 3) + " " + rc.D.Length.Symbol})
	}
	if len(missing) > 0 {
		rows = append(rows, [2]string{"Missing for a fit", strings.Join(missing, " ")})
	}
	return rows
}

// resultFit is a pumping test's last fit as a row of the fits table.
func resultFit(r *project.FitResult) project.ModelFit {
	f := project.ModelFit{Model: string(r.Model), RMSE: r.RMSE, N: r.N, Iterations: r.Iterations,
		Status: r.Status, Warnings: r.Warnings, Inputs: r.Inputs, At: r.At,
		Params: []project.NamedEstimate{
			{Name: "T", Unit: "m²/s", Value: r.T.Value, Lower: r.T.Lower, Upper: r.T.Upper},
			{Name: "S", Value: r.S.Value, Lower: r.S.Lower, Upper: r.S.Upper},
		}}
	if r.HasK {
		f.Params = append(f.Params, project.NamedEstimate{Name: "K = T/b", Unit: "m/s", Value: r.K.Value, Lower: r.K.Lower, Upper: r.K.Upper})
	}
	return f
}

func pumpReportFits(a *App, rc *ReportContext) []project.ModelFit {
	if len(rc.T.Fits) > 0 || rc.T.Result == nil {
		return rc.T.Fits
	}
	return []project.ModelFit{resultFit(rc.T.Result)}
}

func pumpReportAfter(a *App, rc *ReportContext) []*v.Node {
	t := rc.T
	r := t.Result
	if r == nil {
		return nil
	}
	rows := [][2]string{
		{"Fitted", r.At.Local().Format("2006-01-02 15:04") + ", " + modelName(r.Model) + ", " + strconv.Itoa(r.Iterations) + " iterations: " + r.Status},
		{"Cooper–Jacob straight line valid from", "t ≥ " + formatSig(r.EarliestValid/units.Minute, 3) + " min (u < " +
			strconv.FormatFloat(t.Fit.CJUMaxOrDefault(), 'g', -1, 64) + ")"},
	}
	if req, missing := a.fitRequestLocked(t); len(missing) == 0 && req.Fingerprint() != r.Inputs {
		rows = append(rows, [2]string{"Attention", "The readings or settings changed after this fit: fit again before relying on it."})
	}
	return []*v.Node{reportSection("report-validity", "Fit and validity", reportPairs("report-validity-table", rows))}
}

// pumpReadingsCSV is the readings the fit uses: every row of the tape
// table (with what was typed, the SI values and why a row is not used),
// or the conditioned logger readings; with the fitted drawdown and the
// residual where the current fit has them.
func pumpReadingsCSV(a *App, rc *ReportContext) *CSVTable {
	t := rc.T
	req, _ := a.fitRequestLocked(t)
	out := a.fit.out
	if out == nil || t.Result == nil || len(out.Residual) != len(req.Time) || out.Result.Inputs != req.Fingerprint() {
		out = nil
	}
	fitted := func(i int) (inWin, fit, res string) {
		in := (req.From == 0 || req.Time[i] >= req.From) && (req.To == 0 || req.Time[i] <= req.To)
		inWin = "no"
		if in {
			inWin = "yes"
		}
		if out != nil {
			fit, res = csvNum(out.Residual[i]+req.Drawdown[i]), csvNum(out.Residual[i])
		}
		return
	}
	tb := &CSVTable{Meta: exportMeta(rc, "readings")}
	if t.FitsLogger() {
		if len(req.Time) == 0 {
			return nil
		}
		tb.Head = []string{"elapsed time (s)", "drawdown (m)", "in fit window", "fitted drawdown (m)", "residual, fit − observed (m)"}
		for i := range req.Time {
			w, f, r := fitted(i)
			tb.Rows = append(tb.Rows, []string{csvNum(req.Time[i]), csvNum(req.Drawdown[i]), w, f, r})
		}
		return tb
	}
	if len(t.Readings) == 0 {
		return nil
	}
	du := depthUnit(t)
	checks := CheckReadings(t, du)
	_, _, rows := UsableReadings(t, checks)
	usable := make(map[int]int, len(rows))
	for k, i := range rows {
		usable[i] = k
	}
	tb.Head = []string{"row", "time as typed", "depth as typed (" + du.Symbol + ")", "elapsed time (s)", "depth to water (m)",
		"drawdown (m)", "in fit window", "fitted drawdown (m)", "residual, fit − observed (m)", "note"}
	for i, r := range t.Readings {
		c := checks[i]
		row := []string{strconv.Itoa(i + 1), r.TimeText, r.DepthText, "", "", "", "", "", "", strings.Join(c.Messages, " ")}
		if r.TimeOK {
			row[3] = csvNum(r.Elapsed)
		}
		if r.DepthOK {
			row[4] = csvNum(r.Depth)
		}
		if c.HasDrawdown {
			row[5] = csvNum(c.Drawdown)
		}
		if k, ok := usable[i]; ok {
			row[6], row[7], row[8] = fitted(k)
		} else {
			row[6] = "not usable"
		}
		tb.Rows = append(tb.Rows, row)
	}
	return tb
}

// curvePoints is how many times, log-spaced over the readings, the fitted
// curve is given at in the CSV export.
const curvePoints = 200

// pumpCurvesCSV is the current fit's drawdown curve and its 95 % band at
// log-spaced times over the readings.
func pumpCurvesCSV(a *App, rc *ReportContext) *CSVTable {
	t := rc.T
	req, missing := a.fitRequestLocked(t)
	out := a.fit.out
	if len(missing) > 0 || out == nil || t.Result == nil || out.Result.Inputs != req.Fingerprint() || len(req.Time) < 2 {
		return nil
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range req.Time {
		if x > 0 {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
		}
	}
	if !(hi > lo) {
		return nil
	}
	ts := make([]float64, curvePoints)
	for i := range ts {
		ts[i] = lo * math.Pow(hi/lo, float64(i)/(curvePoints-1))
	}
	c, l, h := out.Band(ts)
	name := modelName(t.Result.Model)
	tb := &CSVTable{Meta: append(exportMeta(rc, "fitted curve"), [2]string{"model", name})}
	tb.Head = []string{"elapsed time (s)", "elapsed time (min)", name + " drawdown (m)", "95 % band lower (m)", "95 % band upper (m)"}
	for i := range ts {
		tb.Rows = append(tb.Rows, []string{csvNum(ts[i]), csvNum(ts[i] / units.Minute), csvNum(c[i]), csvNum(l[i]), csvNum(h[i])})
	}
	return tb
}
