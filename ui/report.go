package ui

import (
	"math"
	"strconv"
	"strings"
	"time"

	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// The report of a test is the Report tab: a printable page (the browser's
// Print or Save as PDF makes the paper or the PDF; web/static/report.css
// is its print style sheet, A4 or US Letter) and the exports of the test's
// readings, fitted curves and plots.
//
// # Adding the sections of a kind of test
//
// The report is generic: renderReport builds, in this order,
//
//	title block (project, site, test, kind, dates) and the caution
//	Site and wells            generic: site, aquifer thickness, every well
//	ReportKind.Test           the kind's test and schedule
//	Data summary              generic: tape readings, logger records, the
//	                          conditioning applied; then ReportKind.Data
//	ReportKind.Plots          the kind's plots
//	Fitted parameters         generic: a table of ReportKind.Fits (or
//	                          Test.Fits) with 95 % intervals, RMSE, AICc,
//	                          ΔAICc when several models were fitted, and
//	                          each fit's validity notes
//	ReportKind.After          the kind's own results (hints, step analysis …)
//	Notes                     generic: the project's notes
//	the caution again
//
// A kind registers its part once, from an init function in its own file:
//
//	func init() {
//		reportKinds[project.SlugTest] = ReportKind{
//			Test:  func(a *App, rc *ReportContext) []*v.Node { … },
//			Plots: func(a *App, rc *ReportContext) []*v.Node { … },
//			Readings: func(a *App, rc *ReportContext) *CSVTable { … },
//		}
//	}
//
// Every function is optional and is called from Render with the App's
// lock held: it must return quickly, must not lock a.mu, and may use the
// a.…Locked helpers (a.fitRequestLocked, a.conditionedLocked) and the
// builders reportSection, reportPairs and reportTable. Plots are
// <svg class="ff-plot" id="…"> elements inside a <figure> (chartNode
// makes them); the report adds the SVG and PNG export buttons to each one
// by itself. User text goes into Text and attribute values only.

// ReportKind is what one kind of test adds to the generic report and to
// the exports. Any field may be nil.
type ReportKind struct {
	// Label names the kind in the title block, e.g. "Slug test"; empty
	// means the kind's own name.
	Label string
	// Test returns the sections that describe the test: its set-up and
	// schedule (rates, stop time, slug volume, ring size …).
	Test func(a *App, rc *ReportContext) []*v.Node
	// Data returns rows added to the generic data summary, as label and
	// value pairs (counts of the kind's own readings, its conditioning).
	Data func(a *App, rc *ReportContext) [][2]string
	// Plots returns the plots, each a figure with an svg.ff-plot inside.
	Plots func(a *App, rc *ReportContext) []*v.Node
	// Fits returns the fits to tabulate; nil means Test.Fits.
	Fits func(a *App, rc *ReportContext) []project.ModelFit
	// Group names the readings a fit was made of: ΔAICc compares only
	// fits of the same group. nil groups fits by their number of readings.
	Group func(f *project.ModelFit) string
	// After returns sections shown after the fitted parameters.
	After func(a *App, rc *ReportContext) []*v.Node
	// Readings returns the readings as a table for the CSV export; nil
	// (or a nil table) offers no readings export.
	Readings func(a *App, rc *ReportContext) *CSVTable
	// Curves returns the fitted curves as a table for the CSV export.
	Curves func(a *App, rc *ReportContext) *CSVTable
	// RMSE formats a fit's RMSE with the unit of the quantity fitted;
	// nil means a length in the display unit (drawdown).
	RMSE func(rc *ReportContext, f project.ModelFit) string
}

// reportKinds holds each kind's part of the report. Kinds add themselves
// in init functions (see above); a kind without an entry gets the generic
// report only.
var reportKinds = map[project.TestKind]ReportKind{}

// ReportContext is what the report functions of a kind are given: the
// open project, the test reported on, and the display units.
type ReportContext struct {
	P *project.Project
	T *project.Test
	D Display
	// Now is the time the report is made.
	Now time.Time
}

// Paper sizes of the printed report.
const (
	PaperA4     = "a4"
	PaperLetter = "letter"
)

// reportState is the Report tab's state that is not part of the project.
type reportState struct {
	paper string // PaperA4 or PaperLetter; "" means by the unit system
}

// paperLocked is the chosen paper: A4 unless the project is in US
// customary units (Letter), until the user chooses.
func (a *App) paperLocked() string {
	if a.report.paper != "" {
		return a.report.paper
	}
	if a.cur != nil && a.cur.Units == project.USCustomary {
		return PaperLetter
	}
	return PaperA4
}

// SetPaper chooses the paper of the printed report: PaperA4 or
// PaperLetter; anything else is ignored.
func (a *App) SetPaper(paper string) {
	if paper != PaperA4 && paper != PaperLetter {
		return
	}
	a.mu.Lock()
	a.report.paper = paper
	a.mu.Unlock()
}

// PrintReport opens the browser's print dialog (print or save as PDF) on
// the report; nothing happens where printing is not available.
func (a *App) PrintReport() {
	a.mu.Lock()
	f := a.opt.Print
	a.mu.Unlock()
	if f != nil {
		f()
	}
}

// kindLabel names a kind of test for the report.
func kindLabel(k project.TestKind) string {
	if rk, ok := reportKinds[k]; ok && rk.Label != "" {
		return rk.Label
	}
	switch k {
	case project.PumpingTest:
		return "Pumping test"
	case project.SlugTest:
		return "Slug test"
	case project.InfiltrationTest:
		return "Infiltration test"
	case project.DecayTest:
		return "Decay curve"
	}
	return string(k)
}

// renderReport is the Report tab: the controls (not printed), then the
// report itself, article#report.
func (a *App) renderReport() *v.Node {
	p := a.cur
	t := a.currentTest()
	div := v.El("div", nil, a.testSelector())
	if t == nil {
		return div.Add(v.TextEl("p", v.A("class", "ff-hint"), "Add a test first: the report is made per test."))
	}
	rc := &ReportContext{P: p, T: t, D: DisplayFor(p.Units), Now: a.opt.Now()}
	rk := reportKinds[t.Kind]
	paper := a.paperLocked()

	row := v.El("div", v.A("class", "ff-row"))
	if a.opt.Print != nil {
		row.Add(button("report-print", "Print or save as PDF", "ff-btn ff-primary", a.PrintReport))
	}
	for _, e := range []struct {
		what, label string
		on          bool
	}{{"readings", "Readings as CSV", rk.Readings != nil}, {"curves", "Fitted curves as CSV", rk.Curves != nil}} {
		if e.on && a.opt.Download != nil {
			what := e.what
			row.Add(button("export-"+what, e.label, "ff-btn", func() { a.ExportCSV(what) }))
		}
	}
	div.Add(v.El("div", v.A("id", "report-controls", "class", "ff-card ff-noprint"),
		selectField("report-paper", "Paper", paper, []option{{PaperA4, "A4"}, {PaperLetter, "US Letter"}}, "", a.SetPaper),
		row, v.TextEl("p", v.A("class", "ff-hint"), "The report below is what prints. Each plot can also be saved on its own, as SVG (for drawings) or PNG (for documents).")))

	art := v.El("article", v.A("id", "report", "class", "ff-report", "data-paper", paper),
		a.reportTitle(rc), reportCaution("report-caution-top"), reportSite(rc))
	fits := func(a *App, rc *ReportContext) []*v.Node {
		fs := rc.T.Fits
		if rk.Fits != nil {
			fs = rk.Fits(a, rc)
		}
		return []*v.Node{reportFits(rc, fs, rk.Group)}
	}
	for i, f := range []func(*App, *ReportContext) []*v.Node{rk.Test, reportData, rk.Plots, fits, rk.After} {
		if f == nil {
			continue
		}
		ns := f(a, rc)
		if i == 2 && len(ns) > 0 { // the plots
			sec := reportSection("report-plots", "Plots", ns...)
			sec.Set("class", "ff-rsec ff-rplots")
			a.addPlotExports(sec, rc)
			ns = []*v.Node{sec}
		}
		art.Add(ns...)
	}
	if strings.TrimSpace(p.Notes) != "" {
		art.Add(reportSection("report-notes", "Notes", v.TextEl("p", v.A("class", "ff-rnotes"), p.Notes)))
	}
	art.Add(reportCaution("report-caution"), v.TextEl("p", v.A("class", "ff-rfoot"), "Made with Fieldfit on "+
		rc.Now.Local().Format(dateTime)+" from project revision "+strconv.FormatInt(p.Rev, 10)+"."))
	return div.Add(art)
}

// dateTime is the layout of the report's dates and times.
const dateTime = "2006-01-02 15:04"

// reportSection is a titled section of the report.
func reportSection(id, title string, children ...*v.Node) *v.Node {
	return v.El("section", v.A("id", id, "class", "ff-rsec"), v.TextEl("h2", nil, title)).Add(children...)
}

// reportPairs is a two-column table of labels and values; rows with an
// empty value are left out.
func reportPairs(id string, rows [][2]string) *v.Node {
	body := v.El("tbody", nil)
	for _, r := range rows {
		if r[1] != "" {
			body.Add(v.El("tr", nil, v.TextEl("th", v.A("scope", "row"), r[0]), v.TextEl("td", nil, r[1])))
		}
	}
	return v.El("table", v.A("id", id, "class", "ff-rpairs"), body)
}

// reportTable is a table with a header row.
func reportTable(id string, head []string, rows [][]string) *v.Node {
	body := v.El("tbody", nil)
	for _, r := range append([][]string{head}, rows...) {
		tag, tr := "th", v.El("tr", nil)
		if len(body.Children) > 0 {
			tag = "td"
		}
		for _, c := range r {
			tr.Add(v.TextEl(tag, nil, c))
		}
		body.Add(tr)
	}
	head0 := body.Children[0]
	body.Children = body.Children[1:]
	return v.El("table", v.A("id", id, "class", "ff-rtable"), v.El("thead", nil, head0), body)
}

func reportCaution(id string) *v.Node {
	return v.TextEl("p", v.A("id", id, "class", "ff-caution ff-rcaution", "role", "note"), Caution)
}

// orNone is s, or a dash when s is blank.
func orNone(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

func (a *App) reportTitle(rc *ReportContext) *v.Node {
	p, t := rc.P, rc.T
	name := t.Name
	if strings.TrimSpace(name) == "" {
		name = "Test " + strconv.Itoa(a.testIdx+1)
	}
	d := rc.D
	return v.El("header", v.A("class", "ff-rhead"),
		v.TextEl("p", v.A("class", "ff-rkind"), "Field test report · "+kindLabel(t.Kind)),
		v.TextEl("h1", v.A("id", "report-title"), name),
		reportPairs("report-ident", [][2]string{
			{"Project", orNone(p.Name)},
			{"Site", orNone(p.Site)},
			{"Test started", startText(t)},
			{"Project last changed", p.Changed.Local().Format(dateTime)},
			{"Report made", rc.Now.Local().Format(dateTime)},
			{"Units", d.Length.Symbol + ", " + d.Transmissivity.Symbol + ", " + d.Conductivity.Symbol + "; times in min"},
		}))
}

// startText is when the test started, as a date and time.
func startText(t *project.Test) string {
	if t.Start.IsZero() {
		return t.StartText
	}
	return t.Start.Format(dateTime)
}

// shownEntry shows an entry in display unit u with its unit (as typed when
// typed in u), what was typed when it is not a number, or a dash.
func shownEntry(e project.Entry, u units.Unit) string {
	switch {
	case e.OK:
		return shownText(e, u) + " " + u.Symbol
	case e.Empty():
		return "—"
	}
	return "“" + e.Text + "” (not a number)"
}

// reportSite is the generic site and wells section.
func reportSite(rc *ReportContext) *v.Node {
	p, t, L := rc.P, rc.T, rc.D.Length
	var rows [][]string
	for _, w := range p.Wells {
		kind, dist := "pumping", "—"
		if w.Kind == project.Observation {
			kind, dist = "observation", shownEntry(w.Distance, L)
		}
		read := w.ID == t.ObservationWell
		if t.Pump != nil {
			for _, pw := range t.Pump.Wells {
				read = read || pw.WellID == w.ID
			}
		}
		if read {
			kind += ", readings"
		}
		screen := "—"
		if w.ScreenTop.OK || w.ScreenBottom.OK {
			screen = shownEntry(w.ScreenTop, L) + " – " + shownEntry(w.ScreenBottom, L)
		}
		rows = append(rows, []string{orNone(w.Name), kind, dist, shownEntry(w.Radius, L), screen, shownEntry(w.MPElevation, L)})
	}
	return reportSection("report-site", "Site and wells",
		reportPairs("report-site-table", [][2]string{{"Site", orNone(p.Site)}, {"Aquifer thickness b", shownEntry(p.Thickness, L)}}),
		reportTable("report-wells", []string{"Well", "Kind", "Distance r", "Radius", "Screen (depth below MP)", "MP elevation"}, rows))
}

// reportData is the generic data summary: the tape readings, the logger
// records and the conditioning applied, then the kind's rows.
func reportData(a *App, rc *ReportContext) []*v.Node {
	t := rc.T
	bad := 0
	for _, r := range t.Readings {
		if !r.Blank() && !(r.TimeOK && r.DepthOK) {
			bad++
		}
	}
	src := "the readings table"
	if t.FitsLogger() {
		src = "the logger record"
	}
	rows := [][2]string{
		{"Tape readings", countWord(len(t.Readings), "row") + " in the readings table, " + countWord(bad, "row") + " that could not be read"},
		{"Fitted from", src},
	}
	if lg := t.Logger; lg != nil && lg.Water != nil {
		for i, r := range []*project.LoggerRecord{lg.Water, lg.Baro} {
			if r != nil {
				rows = append(rows, [2]string{[]string{"Logger record", "Barometric record"}[i],
					"“" + r.File + "”: " + countWord(len(r.Time), "reading") + ", " + countWord(r.Bad.Count, "row") + " skipped as unreadable"})
			}
		}
		s := conditioningText(lg)
		if res, err := a.conditionedLocked(t); err != nil {
			s += ". " + settingSentence(err)
		} else {
			s += ". Before pumping " + countWord(res.Antecedent.Len(), "reading") + ", pumping " +
				countWord(res.Pumping.Len(), "reading") + ", recovery " + countWord(res.Recovery.Len(), "reading") +
				". " + res.ThinSummary() + " " + strings.Join(res.Notes, " ")
		}
		rows = append(rows, [2]string{"Conditioning applied", s})
	}
	if reportKinds[t.Kind].Data != nil {
		rows = append(rows, reportKinds[t.Kind].Data(a, rc)...)
	}
	return []*v.Node{reportSection("report-data", "Data summary", reportPairs("report-data-table", rows))}
}

// conditioningText lists the conditioning steps set on a logger record.
func conditioningText(lg *project.LoggerData) string {
	c := lg.Conditioning
	mode := staticMode(lg)
	var steps []string
	for _, s := range []struct {
		on   bool
		text string
	}{
		{mode == "mean", "static level from the mean before pumping"},
		{mode == "typed", "static level typed (" + lg.Texts.Static + ")"},
		{c.Baro != nil, "barometric record subtracted"},
		{c.Efficiency != nil, "barometric efficiency " + lg.Texts.BE},
		{c.Trend != nil, "trend before pumping removed"},
		{c.Thin != nil, "thinned in log time"},
		{len(c.Rates) > 1, countWord(len(c.Rates), "rate step")},
	} {
		if s.on {
			steps = append(steps, s.text)
		}
	}
	if len(steps) == 0 {
		return "None"
	}
	return strings.Join(steps, "; ")
}

// reportFits is the table of fitted models: one row per parameter, each
// with its 95 % interval in display units, and per model its RMSE, AICc
// and, with several fits of the same readings, ΔAICc; then each fit's
// validity notes.
func reportFits(rc *ReportContext, fits []project.ModelFit, group func(*project.ModelFit) string) *v.Node {
	sec := reportSection("report-fits", "Fitted parameters")
	if len(fits) == 0 {
		return sec.Add(v.TextEl("p", nil, "No fit yet."))
	}
	delta := deltaAICc(fits, group)
	var rows [][]string
	var notes []*v.Node
	for i, f := range fits {
		name := fitModelName(f.Model)
		model := []string{name, formatSig(rc.D.Length.FromSI(f.RMSE), 3) + " " + rc.D.Length.Symbol, strconv.Itoa(f.N), "", ""}
		if rk := reportKinds[rc.T.Kind]; rk.RMSE != nil {
			model[1] = rk.RMSE(rc, f)
		}
		if f.AICc != 0 {
			model[3] = formatSig(f.AICc, 4)
		}
		if delta != nil && !math.IsNaN(delta[i]) {
			model[4] = strconv.FormatFloat(delta[i], 'f', 1, 64)
		}
		for _, pe := range f.Params {
			u := paramUnit(pe.Unit, rc.D)
			sym := " " + u.Symbol
			if u.Symbol == "1" {
				sym = ""
			}
			ci := formatSig(u.FromSI(pe.Lower), 3) + " – " + formatSig(u.FromSI(pe.Upper), 3) + sym
			if pe.NoCI {
				ci = "none (not identifiable)"
			}
			rows = append(rows, []string{model[0], pe.Name, formatSig(u.FromSI(pe.Value), 3) + sym, ci, model[1], model[2], model[3], model[4]})
			model = []string{"", "", "", "", ""}
		}
		if len(f.Warnings) > 0 {
			ul := v.El("ul", v.A("class", "ff-warnings"))
			for _, w := range f.Warnings {
				ul.Add(v.TextEl("li", nil, w))
			}
			notes = append(notes, v.TextEl("h3", nil, "Validity notes: "+name), ul)
		}
	}
	sec.Add(reportTable("report-fits-table", []string{"Model", "Parameter", "Value", "95 % interval", "RMSE", "Readings", "AICc", "ΔAICc"}, rows))
	if delta != nil {
		// "Under about 2": Burnham & Anderson (2002), from memory.
		sec.Add(v.TextEl("p", v.A("class", "ff-rsmall"), "ΔAICc is each model's small-sample Akaike criterion less the lowest among the fits of the same readings: lower is better supported; differences under about 2 do not tell the models apart. The choice of model stays with the hydrogeologist."))
	}
	return sec.Add(notes...)
}

// deltaAICc returns AICc − the lowest AICc of the fits of the same group
// (group(f), or the number of readings when group is nil) for each fit
// with an AICc, NaN for the others. It returns nil unless at least two
// fits of one group compare.
func deltaAICc(fits []project.ModelFit, group func(*project.ModelFit) string) []float64 {
	key := func(i int) string {
		if group != nil {
			return group(&fits[i])
		}
		return strconv.Itoa(fits[i].N)
	}
	best := map[string]float64{}
	count := map[string]int{}
	for i, f := range fits {
		if f.AICc != 0 && !math.IsNaN(f.AICc) {
			k := key(i)
			if b, ok := best[k]; !ok || f.AICc < b {
				best[k] = f.AICc
			}
			count[k]++
		}
	}
	out := make([]float64, len(fits))
	compare := false
	for i, f := range fits {
		out[i] = math.NaN()
		if k := key(i); count[k] > 1 && f.AICc != 0 {
			out[i] = f.AICc - best[k]
			compare = true
		}
	}
	if !compare {
		return nil
	}
	return out
}

// paramUnit is the display unit of a parameter given in SI unit sym: the
// project's units for lengths, transmissivity and conductivity, the SI
// unit itself otherwise.
func paramUnit(sym string, d Display) units.Unit {
	switch sym {
	case "m":
		return d.Length
	case "m²/s":
		return d.Transmissivity
	case "m/s":
		return d.Conductivity
	case "", "1", "–":
		return mustUnit("1")
	}
	if u, ok := units.Lookup(sym); ok {
		return u
	}
	return units.Unit{Symbol: sym, Factor: 1}
}

// fitModelName is the printed name of a model key of ModelFit.
func fitModelName(m string) string {
	if l := kindModelLabel(m); l != "" {
		return l
	}
	return modelName(project.Model(m))
}
