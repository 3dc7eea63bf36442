package ui

import (
	"strconv"

	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// The report sections of the slug, infiltration and decay tests (see
// ReportKind): the form as entered, the plots of the Fit tab, the
// assumptions of each fit and the readings as CSV. The table of fitted
// parameters is the report's own, from Test.Fits.
func init() {
	for _, d := range []*kindDesc{slugDesc, infilDesc, decayDesc} {
		reportKinds[d.kind] = ReportKind{Label: d.noun, Test: kindReportTest, Data: kindReportData, Plots: kindReportPlots,
			After: kindReportAfter, Readings: kindReadingsCSV, RMSE: kindRMSE}
	}
}

func kindSetupOf(t *project.Test) (*kindDesc, *project.KindSetup) {
	s := t.Setup
	if s == nil {
		s = &project.KindSetup{}
	}
	return descFor(t.Kind), s
}

func kindReportTest(a *App, rc *ReportContext) []*v.Node {
	d, s := kindSetupOf(rc.T)
	rows := [][2]string{{"Test", orNone(rc.T.Name)}, {"Started", orNone(startText(rc.T))}}
	if d == slugDesc {
		rows = append(rows, [2]string{"Well tested", wellName(rc.P, rc.T.ObservationWell)})
	}
	for _, c := range d.choices {
		val := d.option(s, c.key)
		if c.opts != nil {
			val = optionLabel(c.opts(s), val)
		}
		rows = append(rows, [2]string{c.label, val})
	}
	for _, f := range d.fields {
		if e := s.Values[f.key]; !e.Empty() {
			rows = append(rows, [2]string{f.label, e.Text + " " + e.Unit})
		}
	}
	win := "all readings"
	if s.WindowStart > 0 || s.WindowEnd > 0 {
		tu := d.option(s, "time-unit")
		win = orDefault(s.WindowStartText, "first reading") + " to " + orDefault(s.WindowEndText, "last reading") + " " + tu
	}
	rows = append(rows, [2]string{"Model shown", optionLabel(d.models, d.model(s))}, [2]string{"Fit window", win})
	return []*v.Node{reportSection("report-test", d.noun, reportPairs("report-test-pairs", rows))}
}

func kindReportData(a *App, rc *ReportContext) [][2]string {
	d, s := kindSetupOf(rc.T)
	data, _ := checkKindRows(d, s)
	return [][2]string{{"Readings typed", strconv.Itoa(len(s.Rows)) + " (" + strconv.Itoa(len(data.T)) + " usable)"}}
}

func kindReportPlots(a *App, rc *ReportContext) []*v.Node {
	d, _ := kindSetupOf(rc.T)
	if a.kfit.tid != rc.T.ID && !a.kfit.running && len(rc.T.Fits) > 0 {
		a.runKindFitLocked(rc.T) // the curves of the stored fit
	}
	req, _ := a.kindRequestLocked(rc.T)
	return []*v.Node{a.renderKindPlots(d, rc.T, req)}
}

func kindReportAfter(a *App, rc *ReportContext) []*v.Node {
	var out []*v.Node
	for _, f := range rc.T.Fits {
		if len(f.Notes) == 0 {
			continue
		}
		ul := v.El("ul", nil)
		for _, n := range f.Notes {
			ul.Add(v.TextEl("li", nil, n))
		}
		out = append(out, reportSection("", "Assumptions and notes: "+fitModelName(f.Model), ul))
	}
	return out
}

func kindReadingsCSV(a *App, rc *ReportContext) *CSVTable {
	d, s := kindSetupOf(rc.T)
	if len(s.Rows) == 0 {
		return nil
	}
	tb := &CSVTable{Meta: exportMeta(rc, "readings"),
		Head: []string{"time (" + d.option(s, "time-unit") + ")", d.valueLabel(s) + " (" + d.option(s, "value-unit") + ")"}}
	if d.refillCol(s) {
		tb.Head = append(tb.Head, "refilled to ("+d.option(s, "value-unit")+")")
	}
	for _, r := range s.Rows {
		row := []string{r.Time, r.Value}
		if d.refillCol(s) {
			row = append(row, r.Refill)
		}
		tb.Rows = append(tb.Rows, row)
	}
	return tb
}

// kindRMSE is the RMSE of a fit with the unit of the quantity fitted.
func kindRMSE(rc *ReportContext, f project.ModelFit) string {
	d, s := kindSetupOf(rc.T)
	x := formatSig(f.RMSE, 3)
	switch d {
	case slugDesc:
		if f.Model == "cbp" {
			return x + " (of H/H0)"
		}
		return x + " (of ln(H/H0))"
	case infilDesc:
		if d.option(s, "fit-curve") == "rate" {
			u := displayUnits(d.kind, "m/s", rc.P.Units, "")[0]
			return formatSig(u.FromSI(f.RMSE), 3) + " " + u.Symbol
		}
		u := displayUnits(d.kind, "m", rc.P.Units, "")[0]
		return formatSig(u.FromSI(f.RMSE), 3) + " " + u.Symbol
	}
	return x + " " + d.option(s, "value-unit")
}

// kindModelLabel is the name of a model of the slug, infiltration or
// decay tests, or "".
func kindModelLabel(m string) string {
	for _, d := range []*kindDesc{slugDesc, infilDesc, decayDesc} {
		if optionsHave(d.models, m) {
			return optionLabel(d.models, m)
		}
	}
	return ""
}
