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
		Plots:    pumpReportPlots,
		Fits:     pumpReportFits,
		Group:    func(f *project.ModelFit) string { return fitGroup(f.Inputs) },
		After:    pumpReportAfter,
		Readings: pumpReadingsCSV,
		Curves:   pumpCurvesCSV,
	}
}

// pumpReportPlots are the Fit tab's plots, once there are readings.
func pumpReportPlots(a *App, rc *ReportContext) []*v.Node {
	if req, _ := a.fitRequestLocked(rc.T); len(req.Time) == 0 {
		return nil
	}
	return []*v.Node{a.renderPlots(rc.P, rc.T, rc.D)}
}

func wellName(p *project.Project, id string) string {
	if w := p.Well(id); w != nil {
		return orNone(w.Name)
	}
	return "—"
}

// minutesText is a time in minutes, or alt when it is zero (not set).
func minutesText(s float64, alt string) string {
	if s == 0 {
		return alt
	}
	return formatSig(s/units.Minute, 3) + " min"
}

func pumpReportTest(a *App, rc *ReportContext) []*v.Node {
	p, t, d := rc.P, rc.T, rc.D
	times := "elapsed minutes"
	if timeMode(t) == project.ClockTime {
		times = "clock time"
	}
	f := t.Fit
	rows := [][2]string{
		{"Test", orNone(t.Name)},
		{"Pump started", orNone(startText(t))},
		{"Pumping rate Q", shownEntry(t.Rate, rateUnit(t, d))},
		{"Static water level (depth below MP)", shownEntry(t.StaticLevel, d.Length)},
		{"Pumping well", wellName(p, t.PumpingWell)},
		{"Readings taken in", wellName(p, t.ObservationWell)},
		{"Times recorded as", times},
		{"Model fitted", modelName(f.ModelOrDefault())},
		{"Fit window", minutesText(f.WindowStart, "first reading") + " to " + minutesText(f.WindowEnd, "last reading")},
		{"Derivative smoothing L", strconv.FormatFloat(f.SmoothingOrDefault(), 'g', 3, 64) + " log cycles"},
	}
	var rs [][]string
	if pd := t.Pump; pd != nil {
		rows = append(rows, [2]string{"Pump stopped", minutesText(pd.Stop, "")})
		if pd.Jacob {
			rows = append(rows, [2]string{"Unconfined aquifer", "Jacob's correction s′ = s − s²/(2b) applied"})
		}
		if pd.Boundary > 0 {
			rows = append(rows, [2]string{"Distance to the boundary (given)", formatSig(d.Length.FromSI(pd.Boundary), 4) + " " + d.Length.Symbol})
		}
		for _, w := range pd.Wells {
			rows = append(rows, [2]string{"Also read in", wellName(p, w.WellID) + ": " + countWord(len(w.Readings), "row") +
				", static level " + shownEntry(w.StaticLevel, d.Length)})
		}
		if len(pd.Steps) > 0 {
			rs = append(rs, []string{"0", shownEntry(t.Rate, rateUnit(t, d))})
		}
		for _, st := range pd.Steps {
			rs = append(rs, []string{orNone(st.StartText), orNone(st.RateText) + " " + rateUnit(t, d).Symbol})
		}
	}
	if lg := t.Logger; lg != nil && lg.Water != nil {
		rows = append(rows, [2]string{"Pump start and stop on the logger record", orNone(lg.Texts.Start) + " to " + orNone(lg.Texts.Stop)})
		for _, r := range lg.Rates {
			rs = append(rs, []string{r.Start, r.Rate + " " + r.Unit})
		}
	}
	sec := reportSection("report-test", "Test and schedule", reportPairs("report-test-table", rows))
	if len(rs) > 0 {
		sec.Add(v.TextEl("h3", nil, "Pumping rate schedule"), reportTable("report-rates", []string{"From (min)", "Rate"}, rs))
	}
	return []*v.Node{sec}
}

func pumpReportData(a *App, rc *ReportContext) [][2]string {
	req, missing := a.fitRequestLocked(rc.T)
	span, largest := "", ""
	if n := len(req.Time); n > 0 {
		span = formatSig(req.Time[0]/units.Minute, 3) + " – " + formatSig(req.Time[n-1]/units.Minute, 3) + " min"
		smax := math.Inf(-1)
		for _, s := range req.Drawdown {
			smax = math.Max(smax, s)
		}
		largest = formatSig(rc.D.Length.FromSI(smax), 3) + " " + rc.D.Length.Symbol
	}
	return [][2]string{
		{"Usable for the fit", countWord(len(req.Time), "reading")},
		{"Time span", span},
		{"Largest drawdown", largest},
		{"Missing for a fit", strings.Join(missing, " ")},
	}
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
	req, _ := a.fitRequestLocked(t)
	hints, stop, _ := pumpHints(t, &req, rc.D)
	var hr [][2]string
	for _, h := range hints {
		hr = append(hr, [2]string{"Derivative", h})
	}
	hr = append(hr, [2]string{"Can pumping stop?", stop}, [2]string{"Note", hintsNote})
	return []*v.Node{reportSection("report-validity", "Fit and validity", reportPairs("report-validity-table", rows)),
		reportSection("report-hints", "Flow-regime hints", reportPairs("report-hints-table", hr))}
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
	du := depthUnit(t)
	tb := &CSVTable{Meta: exportMeta(rc, "readings"), Head: []string{"row", "time as typed", "depth as typed (" + du.Symbol + ")",
		"elapsed time (s)", "depth to water (m)", "drawdown (m)", "in fit window", "fitted drawdown (m)", "residual, fit − observed (m)", "note"}}
	// Each row of the table is a tape row (its index in the readings
	// table) or, for the logger record, a reading of the fit; fit[i] is
	// the reading of the fit that row i is, or −1.
	n := len(req.Time)
	var checks []RowCheck
	fit := make([]int, n)
	for i := range fit {
		fit[i] = i
	}
	if !t.FitsLogger() {
		checks = CheckReadings(t, du)
		_, _, used := UsableReadings(t, checks)
		n = len(t.Readings)
		fit = make([]int, n)
		for i := range fit {
			fit[i] = -1
		}
		for k, i := range used {
			fit[i] = k
		}
	}
	if n == 0 {
		return nil
	}
	for i := 0; i < n; i++ {
		row := make([]string, 10)
		if checks != nil {
			r, c := t.Readings[i], checks[i]
			row[0], row[1], row[2], row[9] = strconv.Itoa(i+1), r.TimeText, r.DepthText, strings.Join(c.Messages, " ")
			if r.TimeOK {
				row[3] = csvNum(r.Elapsed)
			}
			if r.DepthOK {
				row[4] = csvNum(r.Depth)
			}
			if c.HasDrawdown {
				row[5] = csvNum(c.Drawdown)
			}
		}
		row[6] = "not usable"
		if k := fit[i]; k >= 0 {
			row[3], row[5], row[6] = csvNum(req.Time[k]), csvNum(req.Drawdown[k]), "no"
			if (req.From == 0 || req.Time[k] >= req.From) && (req.To == 0 || req.Time[k] <= req.To) {
				row[6] = "yes"
			}
			if out != nil {
				row[7], row[8] = csvNum(out.Residual[k]+req.Drawdown[k]), csvNum(out.Residual[k])
			}
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
