package ui

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// renderSchedule is the pumping schedule card of the Test tab: the stop
// and the changes of rate.
func (a *App) renderSchedule(t *project.Test, d Display) *v.Node {
	pd := t.Pump
	if pd == nil {
		pd = &project.PumpData{}
	}
	ru := rateUnit(t, d)
	card := v.El("div", v.A("id", "schedule", "class", "ff-card"),
		v.TextEl("h3", nil, "Pumping schedule"),
		v.TextEl("p", v.A("class", "ff-hint"), "The rate above runs from the start. Add a step for every change of rate (a step test, a rate that drifted) and the time the pump stopped: readings after the stop are recovery, typed on the same clock."),
		textField{id: "pump-stop", label: "Pump stopped at", unit: "min since the start", numeric: true, value: pd.StopText,
			placeholder: "still pumping", msg: stopMessage(pd), onInput: func(s string) { a.SetPumpField("stop", s) }}.node())
	msgs := stepMessages(t, ru)
	for i, s := range pd.Steps {
		i := i
		pre := "step-" + strconv.Itoa(i) + "-"
		row := v.El("div", v.A("class", "ff-grid ff-step", "data-step", strconv.Itoa(i)),
			textField{id: pre + "start", label: "Step " + strconv.Itoa(i+2) + " from", unit: "min", numeric: true, value: s.StartText,
				msg: msgs[i], onInput: func(s string) { a.SetRateStep(i, "start", s) }}.node(),
			textField{id: pre + "rate", label: "Rate", unit: ru.Symbol, numeric: true, value: s.RateText,
				onInput: func(s string) { a.SetRateStep(i, "rate", s) }}.node(),
			button(pre+"remove", "Remove step", "ff-btn ff-small", func() { a.RemoveRateStep(i) }))
		card.Add(row.WithKey("step" + strconv.Itoa(i)))
	}
	return card.Add(button("add-step", "+ Rate step", "ff-btn ff-small", a.AddRateStep))
}

// seriesSelector is the choice, on the Readings tab, of the well whose
// readings the table shows.
func (a *App) seriesSelector(t *project.Test, d Display) *v.Node {
	p := a.cur
	main := "(the well chosen on the Test tab)"
	if w := p.Well(t.ObservationWell); w != nil {
		main = w.Name
	}
	opts := []option{{"0", main}}
	have := map[string]bool{t.ObservationWell: true}
	if t.Pump != nil {
		for k, wr := range t.Pump.Wells {
			name := "(removed well)"
			if w := p.Well(wr.WellID); w != nil {
				name = w.Name
			}
			have[wr.WellID] = true
			opts = append(opts, option{strconv.Itoa(k + 1), name})
		}
	}
	for _, w := range p.Wells {
		if !have[w.ID] {
			opts = append(opts, option{"add:" + w.ID, "+ readings of " + w.Name})
		}
	}
	div := v.El("div", v.A("class", "ff-card"))
	if len(opts) > 1 {
		div.Add(selectField("readings-well", "Readings of", strconv.Itoa(a.fit.series), opts, "", func(s string) {
			if id, ok := strings.CutPrefix(s, "add:"); ok {
				a.AddWellReadings(id)
			} else if k, err := strconv.Atoi(s); err == nil {
				a.ShowSeries(k)
			}
		}))
	}
	if wr := a.seriesLocked(t); wr != nil {
		msg := ""
		if !wr.StaticLevel.Empty() && !wr.StaticLevel.OK {
			msg = "“" + wr.StaticLevel.Text + "” is not a number."
		}
		div.Add(textField{id: "series-static", label: "Static water level of this well, depth below measuring point", unit: d.Length.Symbol,
			numeric: true, value: shownText(wr.StaticLevel, d.Length), msg: msg, onInput: a.SetSeriesStatic}.node())
		div.Add(v.TextEl("p", v.A("class", "ff-hint"), "Times on the test's clock, as for the first well. Wells with readings are fitted together with shared T and S."))
	}
	return div
}

// pumpControls are the fit step's settings of the pumping-test models.
func (a *App) pumpControls(t *project.Test, d Display) *v.Node {
	pd := t.Pump
	if pd == nil {
		pd = &project.PumpData{}
	}
	box := v.El("div", v.A("class", "ff-pumpctl"))
	pm := pumpModelOf(t.Fit.ModelOrDefault())
	if pm != nil && pm.jacob {
		box.Add(checkField("jacob", " Unconfined: apply Jacob's correction s′ = s − s²/(2b) (an approximation)", pd.Jacob,
			func(on bool) { a.SetPumpField("jacob", strconv.FormatBool(on)) }))
	}
	boundary := pm != nil && (pm.id == project.TheisNoFlow || pm.id == project.TheisConstantHead)
	if boundary {
		msg := ""
		if pd.BoundaryText != "" && pd.Boundary == 0 {
			msg = "“" + pd.BoundaryText + "” is not a distance greater than zero; the distance is fitted."
		}
		box.Add(textField{id: "boundary-distance", label: "Distance from the pumping well to the boundary", unit: d.Length.Symbol, numeric: true,
			value: pd.BoundaryText, placeholder: "fitted", msg: msg, onInput: func(s string) { a.SetPumpField("boundary", s) }}.node())
	}
	// Weights (several wells) and bearings (a boundary) per well: the
	// test's own well ("main") and the others with readings (by index).
	mainName := "first well"
	if w := a.cur.Well(t.ObservationWell); w != nil {
		mainName = w.Name
	}
	keys, names, sets := []string{"main"}, []string{mainName}, []project.WellSetting{pd.Main}
	for k, wr := range pd.Wells {
		if w := a.cur.Well(wr.WellID); w != nil && len(wr.Readings) > 0 {
			keys, names, sets = append(keys, strconv.Itoa(k)), append(names, w.Name), append(sets, wr.Setting)
		}
	}
	if len(keys) > 1 || boundary {
		grid := v.El("div", v.A("class", "ff-grid"))
		for i, key := range keys {
			key, ws := key, sets[i]
			if len(keys) > 1 {
				msg := ""
				if w, err := parseNumber(ws.WeightText); ws.WeightText != "" && (err != nil || w <= 0) {
					msg = "“" + ws.WeightText + "” is not a weight greater than zero; 1 is used."
				}
				grid.Add(textField{id: "weight-" + key, label: "Weight of " + names[i], numeric: true, value: ws.WeightText, placeholder: "1",
					msg: msg, onInput: func(s string) { a.SetPumpField(key+":weight", s) }}.node())
			}
			if boundary {
				msg := ""
				if ws.BearingText != "" && !ws.BearingOK {
					msg = "“" + ws.BearingText + "” is not a number of degrees; 90° is used."
				}
				grid.Add(textField{id: "bearing-" + key, label: "Angle of " + names[i] + " from the direction of the boundary", unit: "°", numeric: true,
					value: ws.BearingText, placeholder: "90", msg: msg, onInput: func(s string) { a.SetPumpField(key+":bearing", s) }}.node())
			}
		}
		box.Add(grid)
	}
	return box
}

func checkField(id, label string, on bool, f func(bool)) *v.Node {
	in := v.El("input", v.A("id", id, "type", "checkbox", "class", "ff-check", "checked", strconv.FormatBool(on)))
	in.Handle("change", func(e *v.Event) { f(e.Checked) })
	return v.El("div", v.A("class", "ff-row"), v.El("label", v.A("class", "ff-checklabel", "for", id), in, v.T(label)))
}

// modelOptions are the choices of the model select.
func modelOptions() []option {
	opts := make([]option, len(pumpModels))
	for i, pm := range pumpModels {
		opts[i] = option{string(pm.id), pm.label}
	}
	return opts
}

// currentFit returns the stored fit of t's chosen model, or nil.
func currentFit(t *project.Test) *project.ModelFit {
	for i := range t.Fits {
		if project.Model(t.Fits[i].Model) == t.Fit.ModelOrDefault() {
			return &t.Fits[i]
		}
	}
	return nil
}

// estimateText formats an estimate in its display unit with its
// interval.
func estimateText(e project.NamedEstimate, d Display) (float64, string) {
	u := paramUnit(e.Unit, d)
	if e.Unit == "s" {
		u = mustUnit("d")
	}
	val := u.FromSI(e.Value)
	sym := ""
	if u.Symbol != "1" {
		sym = " " + u.Symbol
	}
	if e.Lower == e.Value && e.Upper == e.Value {
		return val, formatSig(val, 3) + sym
	}
	return val, ciText(val, u.FromSI(e.Lower), u.FromSI(e.Upper), sym)
}

// ciText is a value with its unit and 95 % interval, 3 digits.
func ciText(v, lo, hi float64, unit string) string {
	return formatSig(v, 3) + unit + " (95 % CI " + formatSig(lo, 3) + " – " + formatSig(hi, 3) + ")"
}

// paramLabels name the parameters of the models beyond T, S and K.
var paramLabels = map[string]string{
	"B":    "Leakage factor B",
	"c":    "Aquitard resistance c = B²/T",
	"a":    "Distance to the boundary a",
	"S′/S": "Storativity ratio S′/S (recovery)",
}

// extraResults adds the parameters of the chosen model other than T, S
// and K to the results list.
func extraResults(t *project.Test, d Display, item func(id, label string, value float64, text string)) {
	f := currentFit(t)
	if f == nil || t.Result == nil || f.Inputs == "" || !strings.HasSuffix(f.Inputs, t.Result.Inputs) {
		return
	}
	for _, e := range f.Params {
		if label, ok := paramLabels[e.Name]; ok {
			val, s := estimateText(e, d)
			item("result-"+paramID(e.Name), label, val, s)
		}
	}
}

func paramID(name string) string {
	if name == "S′/S" {
		return "Sratio"
	}
	return name
}

// renderCompare is the comparison table of every model fitted to the
// test.
func (a *App) renderCompare(t *project.Test, d Display) *v.Node {
	box := v.El("div", v.A("id", "compare", "class", "ff-card"), v.TextEl("h3", nil, "Models compared"))
	if len(t.Fits) == 0 {
		return box.Add(v.TextEl("p", v.A("class", "ff-hint"), "Fit a model, or every model at once, to compare them here."))
	}
	req, _ := a.fitRequestLocked(t)
	data := req.dataPrint() + "/"
	cur := currentFit(t)
	group := ""
	if cur != nil {
		group = fitGroup(cur.Inputs)
	}
	best := math.Inf(1)
	for _, f := range t.Fits {
		if fitGroup(f.Inputs) == group && strings.HasPrefix(f.Inputs, data) && f.AICc != 0 {
			best = math.Min(best, f.AICc)
		}
	}
	rows := append([]project.ModelFit(nil), t.Fits...)
	sort.SliceStable(rows, func(i, j int) bool {
		gi, gj := fitGroup(rows[i].Inputs) == group, fitGroup(rows[j].Inputs) == group
		if gi != gj {
			return gi
		}
		return rows[i].AICc < rows[j].AICc
	})
	var cells [][]string
	var keys []string
	for _, f := range rows {
		stale := !strings.HasPrefix(f.Inputs, data)
		same := fitGroup(f.Inputs) == group
		delta, aic := "—", "—"
		if f.AICc != 0 {
			aic = strconv.FormatFloat(f.AICc, 'f', 1, 64)
			if !stale && same && !math.IsInf(best, 0) {
				delta = strconv.FormatFloat(f.AICc-best, 'f', 1, 64)
			}
		}
		ps := ""
		for k, e := range f.Params {
			_, s := estimateText(e, d)
			if k > 0 {
				ps += "; "
			}
			ps += e.Name + " = " + s
		}
		warn := strings.Join(f.Warnings, " ")
		switch {
		case stale:
			warn = "Readings or settings changed since this fit: fit again to compare. " + warn
		case !same:
			warn = "Fitted to other readings than the chosen model (AICc not comparable). " + warn
		}
		name := modelName(project.Model(f.Model))
		if project.Model(f.Model) == t.Fit.ModelOrDefault() {
			name += " (chosen)"
		}
		cells = append(cells, []string{name, strconv.Itoa(f.N), formatSig(d.Length.FromSI(f.RMSE), 3), aic, delta, ps, warn})
		keys = append(keys, f.Model)
	}
	box.Add(dataTable("compare-table", []string{"Model", "N", "RMSE (" + d.Length.Symbol + ")", "AICc", "ΔAICc", "Parameters (95 % CI)", "Warnings"}, cells, keys))
	return box.Add(v.TextEl("p", v.A("class", "ff-hint"), "A lower AICc means the readings support that model better for its number of parameters; differences under about 2 hardly count (Burnham & Anderson 2002, from memory). It does not make a model right: the choice stays with you — weigh the residuals, the derivative and the warnings too."))
}

// fitGroup is the part of ModelFit.Inputs that says which readings were
// used.
func fitGroup(inputs string) string {
	parts := strings.SplitN(inputs, "/", 3)
	if len(parts) < 2 {
		return inputs
	}
	return parts[0] + "/" + parts[1]
}

func hasParam(f *project.ModelFit, name string) bool {
	_, ok := f.Param(name)
	return ok
}

// dataTable is reportTable in a scrolling wrapper; keys, when not nil,
// identify the rows (attribute data-row).
func dataTable(id string, head []string, rows [][]string, keys []string) *v.Node {
	tb := reportTable(id, head, rows)
	tb.Set("class", "ff-compare")
	for i, tr := range tb.Children[1].Children {
		if keys != nil {
			tr.Set("data-row", keys[i]).WithKey(keys[i])
		}
	}
	return v.El("div", v.A("class", "ff-table-wrap"), tb)
}
