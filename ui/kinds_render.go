package ui

import (
	"math"
	"strconv"
	"strings"

	"fieldfit/models/infiltration"
	"fieldfit/models/slug"
	"fieldfit/models/units"
	"fieldfit/ui/plot"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// renderKindTab returns the Test, Readings or Fit tab of a slug test,
// infiltration test or decay curve, or nil when the selected test is a
// pumping test (or the tab is not one of these).
func (a *App) renderKindTab(tab string) *v.Node {
	t := a.currentTest()
	if t == nil || descFor(t.Kind) == nil {
		return nil
	}
	if t.Setup == nil {
		t.Setup = &project.KindSetup{}
	}
	d := descFor(t.Kind)
	switch tab {
	case TabTest:
		return a.renderKindForm(d, t)
	case TabReadings:
		return a.renderKindReadings(d, t)
	case TabFit:
		return a.renderKindFit(d, t)
	}
	return nil
}

// kindAddButtons are the buttons that add a test of each kind.
func (a *App) kindAddButtons() []*v.Node {
	var bs []*v.Node
	for _, d := range []*kindDesc{slugDesc, infilDesc, decayDesc} {
		k := d.kind
		bs = append(bs, button("add-"+string(k)+"-test", "+ "+d.noun, "ff-btn ff-small", func() { a.AddKindTest(k) }))
	}
	return bs
}

func (a *App) renderKindForm(d *kindDesc, t *project.Test) *v.Node {
	s := t.Setup
	div := v.El("div", nil, a.testSelector())
	card := v.El("div", v.A("class", "ff-card", "data-kind", string(d.kind)),
		v.TextEl("h3", nil, d.noun),
		textField{id: "test-name", label: "Test name", value: t.Name,
			onInput: func(x string) { a.SetTestField("name", x) }}.node())
	start := v.El("input", v.A("id", "test-start", "type", "datetime-local", "class", "ff-input", "value", t.StartText))
	start.Handle("input", func(e *v.Event) { a.SetTestField("start", e.Value) })
	card.Add(v.El("div", v.A("class", "ff-field"), v.TextEl("label", v.A("for", "test-start"), "Test started (date and time)"), start))
	if d == slugDesc {
		opts := []option{{"", "(none)"}}
		for _, w := range a.cur.Wells {
			opts = append(opts, option{w.ID, orDefault(w.Name, "(unnamed)")})
		}
		card.Add(selectField("test-obs-well", "Well tested", t.ObservationWell, opts, "", func(x string) { a.SetTestField("obs-well", x) }))
	}
	grid := v.El("div", v.A("class", "ff-grid"))
	for _, c := range d.choices {
		key := c.key
		if c.opts == nil {
			grid.Add(textField{id: "k-" + key, label: c.label, value: s.Option(key, ""),
				onInput: func(x string) { a.SetKindOption(key, x) }}.node())
			continue
		}
		grid.Add(selectField("k-"+key, c.label, d.option(s, key), c.opts(s), "", func(x string) { a.SetKindOption(key, x) }))
	}
	card.Add(grid)
	msgs := d.fieldMessages(s)
	// Always there, empty when all is well, so that a message appearing
	// while the user types does not move the inputs.
	chk := v.TextEl("p", v.A("id", "k-check", "class", "ff-msg", "role", "alert"), a.kindCheck(d, t))
	if chk.Text == "" {
		chk.Set("class", "ff-msg ff-msg-empty")
	}
	card.Add(chk)
	grid = v.El("div", v.A("class", "ff-grid"))
	for i := range d.fields {
		f := &d.fields[i]
		key := f.key
		e := s.Values[key]
		u, hasUnit := fieldUnit(f, s, a.cur.Units)
		unit := ""
		if f.class == classFree {
			unit = s.Option("value-unit", "")
		}
		msg := msgs[key]
		node := textField{id: "k-" + key, label: f.label, unit: unit, numeric: true, value: e.Text, msg: msg,
			onInput: func(x string) { a.SetKindField(key, x) }}.node()
		if f.hint != "" {
			node.Add(v.TextEl("p", v.A("class", "ff-hint"), f.hint))
		}
		if hasUnit {
			var opts []option
			for _, sym := range classUnits[f.class] {
				opts = append(opts, option{sym, sym})
			}
			node.Add(selectField("k-"+key+"-unit", "unit", u.Symbol, opts, "", func(x string) { a.SetKindFieldUnit(key, x) }))
		}
		grid.Add(node)
	}
	card.Add(grid)
	if d == slugDesc {
		card.Add(v.TextEl("p", v.A("id", "k-h0-check", "class", "ff-hint", "role", "status"), a.h0Check(t)))
	}
	return div.Add(card)
}

// kindCheck says what is wrong with the form as a whole (a geometry that
// cannot be), naming the field, or "".
func (a *App) kindCheck(d *kindDesc, t *project.Test) string {
	req, _ := a.kindRequestLocked(t)
	var err error
	switch d {
	case slugDesc:
		if g := req.Slug.Geometry; g.CasingRadius > 0 && g.WellRadius > 0 {
			err = g.Check()
		}
	case infilDesc:
		if o := req.Infil.OuterDiameter; o > 0 && o <= req.Infil.InnerDiameter {
			return "The outer ring must be wider than the inner ring."
		}
	}
	if err != nil {
		return kindError(err, req.Data).Error()
	}
	return ""
}

// h0Check is the line beside H0: the H0 used and the one expected from
// the slug volume.
func (a *App) h0Check(t *project.Test) string {
	req, _ := a.kindRequestLocked(t)
	if len(req.Data.T) == 0 {
		return "H0 appears here once there are readings."
	}
	nd, err := slug.Normalise(req.Slug, 0)
	if err != nil {
		return "H0 cannot be found yet: " + kindError(err, req.Data).Error()
	}
	return strings.Join(nd.Notes, " ")
}

func (a *App) renderKindReadings(d *kindDesc, t *project.Test) *v.Node {
	s := t.Setup
	div := v.El("div", nil, a.testSelector())
	tu := d.option(s, "time-unit")
	vu := d.option(s, "value-unit")
	div.Add(v.TextEl("p", v.A("id", "readings-info", "class", "ff-hint"),
		d.hint+" Enter moves on; paste from a spreadsheet fills many rows."))
	if t.FitsLogger() {
		div.Add(v.TextEl("p", v.A("class", "ff-banner ff-info"), "The fit uses the logger record (Logger data tab), not these readings."))
	}
	refill := d.refillCol(s)
	cols := []string{"time", "value"}
	head := v.El("tr", nil, v.TextEl("th", v.A("scope", "col"), "#"),
		v.TextEl("th", v.A("scope", "col"), "Time ("+tu+")"),
		v.TextEl("th", v.A("scope", "col"), d.valueLabel(s)+" ("+orDefault(vu, "as read")+")"))
	if refill {
		cols = append(cols, "refill")
		head.Add(v.TextEl("th", v.A("scope", "col"), "Refilled to, right after ("+vu+")"))
	}
	data, msgs := checkKindRows(d, s)
	table := v.El("table", v.A("id", "k-readings", "class", "ff-readings"), v.El("thead", nil, head))
	body := v.El("tbody", nil)
	n := len(s.Rows)
	for i := 0; i <= n; i++ {
		var r project.KindRow
		var m []string
		if i < n {
			r, m = s.Rows[i], msgs[i]
		}
		tr := v.El("tr", v.A("data-row", strconv.Itoa(i), "class", "ff-rrow")).WithKey("k" + strconv.Itoa(i))
		tr.Add(v.TextEl("td", v.A("class", "ff-rownum"), strconv.Itoa(i+1)))
		vals := []string{r.Time, r.Value, r.Refill}
		for j, field := range cols {
			i, field := i, field
			id := "kr-" + strconv.Itoa(i) + "-" + field
			in := v.El("input", v.A("id", id, "type", "text", "class", "ff-input ff-cell", "value", vals[j],
				"inputmode", "decimal", "autocomplete", "off", "enterkeyhint", "next",
				"aria-label", "Row "+strconv.Itoa(i+1)+" "+field))
			in.Handle("input", func(e *v.Event) { a.SetKindRow(i, field, e.Value) })
			in.Handle("paste", func(e *v.Event) {
				if a.PasteKindRows(i, field, e.Pasted) {
					e.Prevent = true
				}
			})
			tr.Add(v.El("td", nil, in))
		}
		body.Add(tr)
		if len(m) > 0 {
			body.Add(v.El("tr", v.A("class", "ff-msgrow"),
				v.TextEl("td", v.A("id", "kr-"+strconv.Itoa(i)+"-msg", "class", "row-msg", "colspan", strconv.Itoa(len(cols)+1), "role", "alert"),
					strings.Join(m, " "))).WithKey("km" + strconv.Itoa(i)))
		}
	}
	table.Add(body)
	div.Add(v.El("div", v.A("class", "ff-table-wrap"), table))
	div.Add(v.TextEl("p", v.A("id", "readings-count", "class", "ff-hint"),
		strconv.Itoa(n)+" readings, "+strconv.Itoa(len(data.T))+" usable for the fit."))
	return div
}

// ---- fit step ----

func (a *App) renderKindFit(d *kindDesc, t *project.Test) *v.Node {
	s := t.Setup
	if a.kfit.tid != t.ID && !a.kfit.running && len(t.Fits) > 0 {
		a.runKindFitLocked(t) // the curves of the stored fit
	}
	div := v.El("div", nil, a.testSelector())
	ctl := v.El("div", v.A("class", "ff-card ff-fitctl"))
	ctl.Add(sourceSelect(a, t))
	ctl.Add(selectField("fit-model", "Model", d.model(s), d.models, "", a.SetKindModel))
	tu := d.option(s, "time-unit")
	ctl.Add(v.El("div", v.A("class", "ff-grid"),
		textField{id: "window-start", label: "Fit window from", unit: tu, numeric: true, value: s.WindowStartText,
			placeholder: "first reading", onInput: func(x string) { a.SetKindWindow("start", x) }}.node(),
		textField{id: "window-end", label: "Fit window to", unit: tu, numeric: true, value: s.WindowEndText,
			placeholder: "last reading", onInput: func(x string) { a.SetKindWindow("end", x) }}.node()))
	if m := kindWindowMessage(s); m != "" {
		ctl.Add(v.TextEl("p", v.A("id", "window-msg", "class", "ff-msg"), m))
	}
	hint := "Or drag across the first plot to choose the window."
	if d == slugDesc {
		hint += " For a \"double straight line\" (a draining gravel pack), drag across the second, flatter straight segment only."
	}
	ctl.Add(v.TextEl("p", v.A("class", "ff-hint"), hint))
	auto := v.El("input", v.A("id", "auto-fit", "type", "checkbox", "class", "ff-check", "checked", strconv.FormatBool(!t.Fit.Manual)))
	auto.Handle("change", func(e *v.Event) { a.SetAutoFit(e.Checked) })
	ctl.Add(v.El("div", v.A("class", "ff-row"),
		button("fit", "Fit", "ff-btn ff-primary ff-big", a.RunFit),
		button("window-clear", "Use all readings", "ff-btn", a.ClearKindWindow),
		v.El("label", v.A("class", "ff-checklabel", "for", "auto-fit"), auto, v.T(" Refit as readings change"))))
	div.Add(ctl)
	req, missing := a.kindRequestLocked(t)
	f := storedFit(t, req.Model)
	status := ""
	switch {
	case a.kfit.tid == t.ID && a.kfit.running:
		status = "Fitting…"
	case a.kfit.tid == t.ID && a.kfit.msg != "":
		status = a.kfit.msg
	case f == nil && len(missing) > 0:
		status = strings.Join(missing, " ")
	case f == nil:
		status = "Not fitted yet."
	case len(missing) == 0 && f.Inputs != req.Fingerprint():
		status = "The readings or settings changed since this fit: press Fit to update."
		if !t.Fit.Manual {
			status = "Updating the fit…"
		}
	default:
		status = "Fitted " + optionLabel(d.models, f.Model) + " at " + f.At.Local().Format("15:04:05") + ": " + f.Status + "."
	}
	div.Add(v.TextEl("p", v.A("id", "fit-status", "class", "ff-status", "role", "status", "aria-live", "polite"), status))
	div.Add(a.renderKindResults(d, t, f))
	div.Add(a.renderKindPlots(d, t, req))
	return div
}

func optionLabel(opts []option, v string) string {
	for _, o := range opts {
		if o.value == v {
			return o.label
		}
	}
	return v
}

// kindParamLabels are the headings of the stored parameters.
var kindParamLabels = map[string]string{
	"K": "Hydraulic conductivity K", "T0": "Basic time lag T0", "T": "Transmissivity T", "S": "Storativity S",
	"steady rate": "Steady infiltration rate", "design rate": "Design rate (steady rate ÷ safety factor)",
	"y0": "Initial value y0", "y∞": "Baseline y∞", "k": "Rate constant k",
}

// displayUnits returns the units a stored parameter of SI unit si is
// shown in: several for K and the steady rates.
func displayUnits(kind project.TestKind, si string, sys project.UnitSystem, timeUnit string) []units.Unit {
	us := sys == project.USCustomary
	var syms []string
	switch si {
	case "m/s":
		if kind == project.SlugTest {
			syms = []string{"m/s", "m/d", "ft/d", "cm/s"}
		} else if us {
			syms = []string{"in/h", "mm/h", "m/s"}
		} else {
			syms = []string{"mm/h", "in/h", "m/s"}
		}
	case "m²/s":
		syms = []string{DisplayFor(sys).Transmissivity.Symbol}
	case "s":
		syms = []string{timeUnit}
	case "m":
		syms = []string{DisplayFor(sys).Length.Symbol}
		if kind == project.InfiltrationTest {
			syms = []string{map[bool]string{false: "mm", true: "in"}[us]}
		}
	case "1/s":
		u := mustUnit(timeUnit)
		return []units.Unit{{Symbol: "1/" + u.Symbol, Factor: 1 / u.Factor}}
	default:
		return []units.Unit{{Symbol: si, Factor: 1}}
	}
	out := make([]units.Unit, len(syms))
	for i, s := range syms {
		out[i] = mustUnit(s)
	}
	return out
}

func (a *App) renderKindResults(d *kindDesc, t *project.Test, f *project.ModelFit) *v.Node {
	box := v.El("div", v.A("id", "results", "class", "ff-card ff-results"), v.TextEl("h3", nil, "Results"))
	if f == nil {
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), "No fit yet."))
	} else {
		tu := d.option(t.Setup, "time-unit")
		dl := v.El("dl", v.A("class", "ff-dl"))
		for i, p := range f.Params {
			label := kindParamLabels[p.Name]
			if label == "" {
				label = p.Name
			}
			for j, u := range displayUnits(t.Kind, p.Unit, a.cur.Units, tu) {
				val := u.FromSI(p.Value)
				text := formatSig(val, 3)
				if u.Symbol != "" && u.Symbol != "1" {
					text += " " + u.Symbol
				}
				if p.NoCI {
					text += " (no confidence interval: see the warnings)"
				} else {
					text += " (95 % CI " + formatSig(u.FromSI(p.Lower), 3) + " – " + formatSig(u.FromSI(p.Upper), 3) + ")"
				}
				dd := v.TextEl("dd", v.A("id", "kres-"+strconv.Itoa(i)+"-"+strconv.Itoa(j), "data-param", p.Name, "data-unit", u.Symbol), text)
				if val == val {
					dd.Set("data-value", strconv.FormatFloat(val, 'g', 10, 64))
				}
				if j > 0 {
					label = ""
				}
				dl.Add(v.TextEl("dt", nil, label), dd)
			}
		}
		dl.Add(v.TextEl("dt", nil, "RMSE"), v.TextEl("dd", v.A("id", "result-rmse"), kindRMSE(&ReportContext{P: a.cur, T: t}, *f)))
		dl.Add(v.TextEl("dt", nil, "Iterations"), v.TextEl("dd", v.A("id", "result-iterations"),
			strconv.Itoa(f.Iterations)+" ("+strconv.Itoa(f.N)+" readings used)"))
		box.Add(dl)
		list := func(id, title string, ss []string) {
			if len(ss) == 0 {
				return
			}
			ul := v.El("ul", v.A("id", id, "class", "ff-warnings"))
			for _, s := range ss {
				ul.Add(v.TextEl("li", nil, s))
			}
			box.Add(v.TextEl("h4", nil, title), ul)
		}
		list("result-warnings", "Warnings", f.Warnings)
		list("result-notes", "Assumptions and notes", f.Notes)
	}
	box.Add(v.TextEl("p", v.A("id", "caution", "class", "ff-caution", "role", "note"), Caution))
	return box
}

// ---- plots ----

func (a *App) renderKindPlots(d *kindDesc, t *project.Test, req *KindRequest) *v.Node {
	box := v.El("div", v.A("id", "plots", "class", "ff-plots"))
	s := t.Setup
	tu := mustUnit(d.option(s, "time-unit"))
	data := req.Data
	if len(data.T) == 0 {
		return box.Add(v.TextEl("p", v.A("class", "ff-hint"), "The plots appear once there are usable readings."))
	}
	out := a.kfit.out
	if a.kfit.tid != t.ID || out == nil || out.Fit.Inputs != req.Fingerprint() || len(out.Used) != len(data.T) {
		out = nil
	}
	xs := make([]float64, len(data.T))
	for i, x := range data.T {
		xs[i] = x / tu.Factor
	}
	xlab := "time since the start (" + tu.Symbol + ")"
	var window *[2]float64
	if a.kfit.tid == t.ID && a.kfit.dragging {
		window = &[2]float64{a.kfit.dragStart / tu.Factor, a.kfit.dragEnd / tu.Factor}
	} else if s.WindowStart > 0 || s.WindowEnd > 0 {
		w0, w1 := s.WindowStart/tu.Factor, s.WindowEnd/tu.Factor
		if w1 == 0 {
			w1 = xs[len(xs)-1]
		}
		window = &[2]float64{w0, w1}
	}
	var used []bool
	if out != nil {
		used = out.Used
	}
	notes := []string{Caution}
	// The observed main quantity and its display unit.
	var ys []float64
	var yu units.Unit
	title, ylab, logY := "", "", false
	var rateX, rateY []float64
	var ru units.Unit
	switch d {
	case slugDesc:
		nd, err := slug.Normalise(req.Slug, 0)
		if err != nil {
			return box.Add(v.TextEl("p", v.A("class", "ff-msg"), "No plot yet: "+kindError(err, data).Error()))
		}
		ys, yu = nd.Data.Value, units.Unit{Symbol: "", Factor: 1}
		title, ylab, logY = "Normalised head H/H0 (semilog)", "H/H0", true
	case infilDesc:
		c, err := infiltration.Rebuild(req.Infil)
		if err != nil {
			return box.Add(v.TextEl("p", v.A("class", "ff-msg"), "No plot yet: "+kindError(err, data).Error()))
		}
		yu = displayUnits(d.kind, "m", a.cur.Units, "")[0]
		ru = displayUnits(d.kind, "m/s", a.cur.Units, "")[0]
		ys = c.Depth
		title, ylab = "Cumulative infiltration F", "F ("+yu.Symbol+")"
		for i, r := range c.Rate {
			rateX = append(rateX, (c.Time[i]+c.Time[i+1])/2/tu.Factor)
			rateY = append(rateY, ru.FromSI(r))
		}
	default:
		ys, yu = data.V, units.Unit{Factor: 1}
		title, ylab = "Decay curve", "value ("+orDefault(req.ValueUnit, "as read")+")"
	}
	yd := make([]float64, len(ys))
	for i, y := range ys {
		yd[i] = yu.FromSI(y)
	}
	ts := curveTimes(data.T)
	main := plot.Chart{Title: title, X: plot.Axis{Label: xlab}, Y: plot.Axis{Label: ylab, Log: logY}, Window: window, Notes: notes}
	var tsd []float64
	for _, x := range ts {
		tsd = append(tsd, x/tu.Factor)
	}
	addCurve := func(c *plot.Chart, f func([]float64) ([]float64, []float64, []float64), u units.Unit, name string) {
		y, lo, hi := f(ts)
		for i := range y {
			y[i], lo[i], hi[i] = u.FromSI(y[i]), u.FromSI(lo[i]), u.FromSI(hi[i])
		}
		c.Series = append(c.Series, plot.Series{Name: "95 % band", Kind: plot.Band, X: tsd, Y: lo, Y2: hi},
			plot.Series{Name: name, Kind: plot.Line, X: tsd, Y: y, Style: plot.Style{Color: plot.Orange}})
	}
	mname := optionLabel(d.models, req.Model) + " fit"
	if out != nil && out.curve != nil {
		addCurve(&main, out.curve, yu, mname)
	}
	main.Series = append(main.Series, plot.Series{Name: "readings", Kind: plot.Points, X: xs, Y: yd, Used: used,
		Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	box.Add(a.kindChartNode("plot-kind", &main, tu.Factor))
	if d == infilDesc && len(rateX) > 0 {
		rc := plot.Chart{Title: "Infiltration rate f", X: plot.Axis{Label: xlab}, Y: plot.Axis{Label: "f (" + ru.Symbol + ")"}, Window: window, Notes: notes}
		if out != nil && out.rate != nil {
			addCurve(&rc, out.rate, ru, mname)
		}
		rc.Series = append(rc.Series, plot.Series{Name: "mean rate of each interval (at its middle)", Kind: plot.Points, X: rateX, Y: rateY,
			Style: plot.Style{Color: plot.Blue, Marker: plot.Square}})
		box.Add(a.kindChartNode("plot-rate", &rc, 0))
	}
	if out != nil {
		var rx, ry []float64
		for i, r := range out.Residual {
			if !math.IsNaN(r) {
				rx, ry = append(rx, xs[i]), append(ry, r)
			}
		}
		if len(rx) > 0 {
			rc := plot.Chart{Title: "Residuals (fit − observed)", X: plot.Axis{Label: xlab}, Y: plot.Axis{Label: "residual of " + out.residLabel + " (SI)"}, Notes: notes,
				Series: []plot.Series{
					{Name: "zero", Kind: plot.Line, X: []float64{xs[0], xs[len(xs)-1]}, Y: []float64{0, 0}, Style: plot.Style{Color: plot.Black, Dash: plot.Dotted, Width: 2}},
					{Name: "residual", Kind: plot.Points, X: rx, Y: ry, Style: plot.Style{Color: plot.Blue, Marker: plot.Square}},
				}}
			box.Add(a.kindChartNode("plot-residuals", &rc, 0))
		}
	}
	return box
}

// curveTimes are 120 times from the first reading to the last, for the
// fitted curves (the first strictly after 0 only when the readings start
// there, so that rates infinite at t = 0 stay drawable).
func curveTimes(t []float64) []float64 {
	lo, hi := t[0], t[len(t)-1]
	if !(hi > lo) {
		return []float64{lo}
	}
	const n = 120
	out := make([]float64, n)
	for i := range out {
		out[i] = lo + (hi-lo)*float64(i)/(n-1)
	}
	if out[0] == 0 {
		out[0] = (hi - lo) * 1e-4
	}
	return out
}

// kindChartNode renders a chart; when factor > 0 dragging across it
// chooses the fit window (x in time units of factor seconds).
func (a *App) kindChartNode(id string, c *plot.Chart, factor float64) *v.Node {
	n, lay, err := c.Render()
	if err != nil {
		return v.TextEl("p", v.A("id", id, "class", "ff-msg"), "This plot cannot be drawn: "+err.Error())
	}
	root := fromPlot(n)
	root.Set("id", id)
	root.Set("class", "ff-plot")
	wrap := v.El("figure", v.A("class", "ff-figure"), root)
	if factor <= 0 {
		return wrap
	}
	root.Set("data-drag", "window")
	px := func(e *v.Event) float64 { return e.X * lay.Width / math.Max(e.Width, 1) }
	toSeconds := func(e *v.Event) float64 {
		p := math.Max(lay.Plot.Left, math.Min(lay.Plot.Right, px(e)))
		return math.Max(0, lay.X.Value(p)*factor)
	}
	var startPx float64
	root.Handle("pointerdown", func(e *v.Event) {
		e.Prevent = true
		startPx = px(e)
		a.DragKindWindow("start", toSeconds(e), 0)
	})
	root.Handle("pointermove", func(e *v.Event) { a.DragKindWindow("move", toSeconds(e), 0) })
	root.Handle("pointerup", func(e *v.Event) { a.DragKindWindow("end", toSeconds(e), math.Abs(px(e)-startPx)) })
	root.Handle("pointercancel", func(e *v.Event) { a.DragKindWindow("cancel", 0, 0) })
	return wrap
}

// DragKindWindow follows a drag across the first plot of a kind test's
// fit step, as DragWindow does for a pumping test: phase "start", "move",
// "end" (moved in viewBox pixels; under minDragPx is a tap) or "cancel";
// s is the time under the pointer (s).
func (a *App) DragKindWindow(phase string, s, moved float64) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil || descFor(t.Kind) == nil {
		return
	}
	if a.kfit.tid != t.ID {
		a.kfit = kindState{tid: t.ID}
	}
	k := &a.kfit
	switch phase {
	case "start":
		k.dragging, k.dragStart, k.dragEnd = true, s, s
	case "move":
		if k.dragging {
			k.dragEnd = s
		}
	case "end":
		if k.dragging {
			k.dragging = false
			if moved >= minDragPx {
				a.setKindWindowLocked(t, k.dragStart, s)
			}
		}
	default:
		k.dragging = false
	}
}
