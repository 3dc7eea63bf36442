package ui

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// Caution is the notice shown on every results view.
const Caution = "Preliminary field interpretation only. Any submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// Render returns the whole screen as it is now.
func (a *App) Render() *v.Node {
	a.mu.Lock()
	defer a.mu.Unlock()
	root := v.El("div", v.A("id", "app-root", "class", "ff-app"))
	top := v.El("header", v.A("class", "ff-top"),
		v.TextEl("h1", v.A("class", "ff-brand"), "Fieldfit"))
	if label := a.busyLabel(); label != "" {
		top.Add(v.TextEl("span", v.A("id", "busy", "class", "ff-busy", "role", "status"), label))
	}
	root.Add(top)
	if a.fatal != "" {
		root.Add(v.TextEl("div", v.A("id", "fatal", "class", "ff-banner ff-error", "role", "alert"), a.fatal))
	}
	if a.problem != "" {
		b := v.El("div", v.A("id", "storage-status", "class", "ff-banner ff-warn", "role", "alert"),
			v.TextEl("p", nil, a.problem))
		if a.cur != nil && a.opt.Download != nil {
			b.Add(button("export-current-banner", "Export this project", "ff-btn", a.ExportCurrent))
		}
		root.Add(b)
	}
	if a.notice != "" {
		root.Add(v.TextEl("div", v.A("id", "notice", "class", "ff-notice", "role", "status", "aria-live", "polite"), a.notice))
	}
	if a.files.merge != nil {
		root.Add(a.renderMerge())
	} else if a.screen == ProjectScreen && a.cur != nil {
		root.Add(a.renderProject())
	} else {
		root.Add(a.renderList())
	}
	return root
}

func (a *App) busyLabel() string {
	if len(a.busy) == 0 {
		return ""
	}
	keys := make([]string, 0, len(a.busy))
	for k := range a.busy {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return a.busy[keys[0]]
}

// ---- small builders ----

func button(id, label, class string, f func()) *v.Node {
	b := v.TextEl("button", v.A("type", "button", "class", class), label)
	if id != "" {
		b.Set("id", id)
	}
	return b.Handle("click", func(*v.Event) { f() })
}

// textField is a labelled text input with its message line.
type textField struct {
	id, label, unit, value, msg string
	numeric                     bool
	placeholder                 string
	onInput                     func(string)
}

func (f textField) node() *v.Node {
	label := f.label
	if f.unit != "" {
		label += " (" + f.unit + ")"
	}
	in := v.El("input", v.A("id", f.id, "type", "text", "class", "ff-input", "value", f.value,
		"autocomplete", "off", "spellcheck", "false"))
	if f.numeric {
		in.Set("inputmode", "decimal")
	}
	if f.placeholder != "" {
		in.Set("placeholder", f.placeholder)
	}
	if f.msg != "" {
		in.Set("aria-invalid", "true")
		in.Set("aria-describedby", f.id+"-msg")
	}
	on := f.onInput
	in.Handle("input", func(e *v.Event) { on(e.Value) })
	div := v.El("div", v.A("class", "ff-field"),
		v.TextEl("label", v.A("for", f.id), label), in)
	msgClass := "ff-msg"
	if f.msg == "" {
		msgClass += " ff-msg-empty"
	}
	div.Add(v.TextEl("p", v.A("id", f.id+"-msg", "class", msgClass), f.msg))
	return div
}

type option struct{ value, label string }

func selectField(id, label, value string, opts []option, msg string, onChange func(string)) *v.Node {
	sel := v.El("select", v.A("id", id, "class", "ff-select"))
	for _, o := range opts {
		sel.Add(v.TextEl("option", v.A("value", o.value), o.label).WithKey(o.value))
	}
	sel.Set("value", value)
	sel.Handle("change", func(e *v.Event) { onChange(e.Value) })
	div := v.El("div", v.A("class", "ff-field"), v.TextEl("label", v.A("for", id), label), sel)
	if msg != "" {
		div.Add(v.TextEl("p", v.A("id", id+"-msg", "class", "ff-msg"), msg))
	}
	return div
}

// ---- project list ----

func (a *App) renderList() *v.Node {
	s := v.El("section", v.A("id", "screen-list", "class", "ff-screen"))
	s.Add(v.El("div", v.A("class", "ff-actions"),
		button("new-project", "New project", "ff-btn ff-primary", a.NewProject)), a.renderFilesBar())
	if a.undo != nil {
		s.Add(v.El("div", v.A("id", "undo-bar", "class", "ff-banner ff-info", "role", "status"),
			v.TextEl("span", nil, fmt.Sprintf("Deleted “%s”.", a.undo.rec.Name)),
			button("undo-delete", "Undo", "ff-btn", a.Undo)))
	}
	if a.listErr != "" {
		s.Add(v.TextEl("p", v.A("id", "list-error", "class", "ff-banner ff-warn"), a.listErr))
	}
	if !a.loaded {
		return s.Add(v.TextEl("p", v.A("class", "ff-hint"), "Reading the projects on this device…"))
	}
	if len(a.list) == 0 {
		s.Add(v.El("div", v.A("id", "empty-list", "class", "ff-card ff-empty"),
			v.TextEl("h2", nil, "No projects on this device yet"),
			v.TextEl("p", nil, "Start a new project, or open the example: an invented site with a pumping test already entered and fitted. You can delete the example like any project."),
			button("demo-project", "Open the example project", "ff-btn", a.CreateDemo)))
		return s
	}
	ul := v.El("ul", v.A("id", "project-list", "class", "ff-list"))
	for _, it := range a.list {
		ul.Add(a.renderListItem(it))
	}
	return s.Add(v.TextEl("h2", nil, "Projects on this device"), ul)
}

func (a *App) renderListItem(it ListItem) *v.Node {
	id := it.ID
	li := v.El("li", v.A("class", "ff-item", "data-project-id", id)).WithKey(id)
	if a.renaming == id {
		in := v.El("input", v.A("id", "rename-input", "type", "text", "class", "ff-input", "value", a.renameTo,
			"aria-label", "New name of the project"))
		in.Handle("input", func(e *v.Event) { a.SetRenameText(e.Value) })
		in.Handle("keydown", func(e *v.Event) {
			switch e.Key {
			case "Enter":
				e.Prevent = true
				a.CommitRename()
			case "Escape":
				a.CancelRename()
			}
		})
		return li.Add(in, v.El("div", v.A("class", "ff-row"),
			button("rename-save", "Save name", "ff-btn ff-primary", a.CommitRename),
			button("rename-cancel", "Cancel", "ff-btn", a.CancelRename)))
	}
	name := it.Name
	if strings.TrimSpace(name) == "" {
		name = "(no name)"
	}
	open := v.El("button", v.A("type", "button", "class", "ff-open", "data-action", "open"),
		v.TextEl("span", v.A("class", "project-name"), name),
		v.TextEl("span", v.A("class", "ff-sub"), "changed "+it.Changed.Local().Format("2006-01-02 15:04")), exportBadge(it))
	open.Handle("click", func(*v.Event) { a.Open(id) })
	li.Add(open)
	if a.askDel == id {
		return li.Add(v.El("div", v.A("class", "ff-confirm", "role", "alertdialog", "aria-label", "Confirm delete"),
			v.TextEl("p", nil, fmt.Sprintf("Delete “%s” from this device? You can undo for %d seconds.", name, int(UndoWindow.Seconds()))),
			v.El("div", v.A("class", "ff-row"),
				button("confirm-delete", "Delete", "ff-btn ff-danger", a.ConfirmDelete),
				button("cancel-delete", "Keep", "ff-btn", a.CancelDelete))))
	}
	row := v.El("div", v.A("class", "ff-row ff-item-actions"))
	act := func(action, label string, f func(string)) {
		b := v.TextEl("button", v.A("type", "button", "class", "ff-btn ff-small", "data-action", action), label)
		row.Add(b.Handle("click", func(*v.Event) { f(id) }))
	}
	act("rename", "Rename", a.StartRename)
	act("duplicate", "Duplicate", a.Duplicate)
	if a.opt.Download != nil {
		act("export", "Export file", a.Export)
	}
	act("delete", "Delete", a.AskDelete)
	return li.Add(row)
}

// ---- project screen ----

var tabs = []struct{ id, label string }{
	{TabSite, "Site"}, {TabWells, "Wells"}, {TabTest, "Test"}, {TabReadings, "Readings"}, {TabLogger, "Logger data"}, {TabFit, "Fit & plots"}, {TabReport, "Report"},
}

func (a *App) renderProject() *v.Node {
	p := a.cur
	s := v.El("section", v.A("id", "screen-project", "class", "ff-screen"))
	bar := v.El("div", v.A("class", "ff-projbar"),
		button("back-to-list", "‹ Projects", "ff-btn", a.Back))
	name := p.Name
	if strings.TrimSpace(name) == "" {
		name = "(no name)"
	}
	bar.Add(v.TextEl("h2", v.A("id", "project-title", "class", "ff-title"), name))
	if a.opt.Download != nil {
		bar.Add(button("export-current", "Export file", "ff-btn", a.ExportCurrent))
	}
	s.Add(bar)
	nav := v.El("nav", v.A("class", "ff-tabs", "role", "tablist"))
	for _, t := range tabs {
		tab := t.id
		b := button("tab-"+tab, t.label, "ff-tab", func() { a.setTabLocked(tab) })
		b.Set("role", "tab")
		b.Set("aria-selected", strconv.FormatBool(a.tab == tab))
		nav.Add(b)
	}
	s.Add(nav)
	panel := v.El("div", v.A("id", "panel-"+a.tab, "class", "ff-panel", "role", "tabpanel"))
	if k := a.renderKindTab(a.tab); k != nil {
		return s.Add(panel.Add(k))
	}
	switch a.tab {
	case TabWells:
		panel.Add(a.renderWells())
	case TabTest:
		panel.Add(a.renderTest())
	case TabReadings:
		panel.Add(a.renderReadings())
	case TabFit:
		panel.Add(a.renderFit())
	case TabLogger:
		panel.Add(a.renderLogger())
	case TabReport:
		panel.Add(a.renderReport())
	default:
		panel.Add(a.renderSite())
	}
	return s.Add(panel)
}

// setTabLocked is SetTab for handlers (which run without the lock held).
func (a *App) setTabLocked(tab string) { a.SetTab(tab) }

func (a *App) renderSite() *v.Node {
	p := a.cur
	d := DisplayFor(p.Units)
	b := thicknessMsg(p.Thickness)
	notes := v.El("textarea", v.A("id", "project-notes", "class", "ff-input ff-notes", "rows", "4", "value", p.Notes))
	notes.Handle("input", func(e *v.Event) { a.SetProjectField("notes", e.Value) })
	return v.El("div", v.A("class", "ff-card"),
		textField{id: "project-name", label: "Project name", value: p.Name,
			onInput: func(s string) { a.SetProjectField("name", s) }}.node(),
		textField{id: "project-site", label: "Site", value: p.Site,
			onInput: func(s string) { a.SetProjectField("site", s) }}.node(),
		selectField("project-units", "Units shown", string(p.Units), []option{
			{string(project.SI), "SI (m, L/s, m²/d)"}, {string(project.USCustomary), "US customary (ft, US gpm, ft²/d)"},
		}, "", func(s string) { a.SetProjectField("units", s) }),
		textField{id: "aquifer-b", label: "Aquifer thickness b, if known", unit: d.Length.Symbol, numeric: true,
			value: shownText(p.Thickness, d.Length), msg: b,
			onInput: func(s string) { a.SetProjectField("thickness", s) }}.node(),
		v.El("div", v.A("class", "ff-field"), v.TextEl("label", v.A("for", "project-notes"), "Notes"), notes),
	)
}

func thicknessMsg(e project.Entry) string {
	switch {
	case !e.Empty() && !e.OK:
		return fmt.Sprintf("%q is not a number.", e.Text)
	case e.OK && e.SI <= 0:
		return "The thickness must be greater than zero."
	}
	return ""
}

func (a *App) renderWells() *v.Node {
	p := a.cur
	d := DisplayFor(p.Units)
	div := v.El("div", nil)
	div.Add(v.El("div", v.A("class", "ff-actions"),
		button("add-pumping-well", "+ Pumping well", "ff-btn", func() { a.AddWell(project.Pumping) }),
		button("add-observation-well", "+ Observation well", "ff-btn", func() { a.AddWell(project.Observation) })))
	if len(p.Wells) == 0 {
		div.Add(v.TextEl("p", v.A("class", "ff-hint"), "No wells yet: add the pumping well and the observation wells."))
	}
	for i := range p.Wells {
		w := &p.Wells[i]
		i := i
		msgs := checkWell(w, d)
		kind := "Pumping well"
		if w.Kind == project.Observation {
			kind = "Observation well"
		}
		card := v.El("div", v.A("class", "ff-card ff-well", "data-well-id", w.ID, "data-well-index", strconv.Itoa(i),
			"data-kind", string(w.Kind))).WithKey(w.ID)
		card.Add(v.TextEl("h3", nil, kind))
		pre := fmt.Sprintf("well-%d-", i)
		card.Add(textField{id: pre + "name", label: "Name", value: w.Name,
			onInput: func(s string) { a.SetWellField(i, "name", s) }}.node())
		grid := v.El("div", v.A("class", "ff-grid"))
		num := func(field, label string) {
			e := wellEntry(w, field)
			grid.Add(textField{id: pre + field, label: label, unit: d.Length.Symbol, numeric: true,
				value: shownText(*e, d.Length), msg: msgs[field],
				onInput: func(s string) { a.SetWellField(i, field, s) }}.node())
		}
		if w.Kind == project.Observation {
			num("distance", "Distance r to the pumping well")
		}
		num("radius", "Well radius")
		num("screen-top", "Screen top, depth below measuring point")
		num("screen-bottom", "Screen bottom, depth below measuring point")
		num("mp", "Measuring-point elevation")
		card.Add(grid)
		label := "Remove well"
		if a.removeArm == w.ID {
			label = "Tap again to remove"
		}
		card.Add(button(pre+"remove", label, "ff-btn ff-small ff-danger", func() { a.RemoveWell(i) }))
		div.Add(card)
	}
	return div
}

func (a *App) renderTest() *v.Node {
	p := a.cur
	t := a.currentTest()
	d := DisplayFor(p.Units)
	div := v.El("div", nil)
	div.Add(a.testSelector())
	msgs := testMessages(p, t)
	ru := rateUnit(t, d)
	var rateOpts []option
	seen := false
	for _, u := range RateUnits(p.Units) {
		rateOpts = append(rateOpts, option{u.Symbol, u.Symbol})
		seen = seen || u.Symbol == ru.Symbol
	}
	if !seen {
		rateOpts = append(rateOpts, option{ru.Symbol, ru.Symbol})
	}
	var pumpOpts, obsOpts []option
	pumpOpts = append(pumpOpts, option{"", "(none)"})
	obsOpts = append(obsOpts, option{"", "(choose)"})
	for _, w := range p.Wells {
		name := w.Name
		if strings.TrimSpace(name) == "" {
			name = "(unnamed)"
		}
		if w.Kind == project.Pumping {
			pumpOpts = append(pumpOpts, option{w.ID, name})
			obsOpts = append(obsOpts, option{w.ID, name + " (the pumping well itself)"})
		} else {
			obsOpts = append(obsOpts, option{w.ID, name})
		}
	}
	card := v.El("div", v.A("class", "ff-card"),
		textField{id: "test-name", label: "Test name", value: t.Name,
			onInput: func(s string) { a.SetTestField("name", s) }}.node())
	start := v.El("input", v.A("id", "test-start", "type", "datetime-local", "class", "ff-input", "value", t.StartText))
	start.Handle("input", func(e *v.Event) { a.SetTestField("start", e.Value) })
	startDiv := v.El("div", v.A("class", "ff-field"), v.TextEl("label", v.A("for", "test-start"), "Pump started (date and time)"), start)
	if m := msgs["start"]; m != "" {
		startDiv.Add(v.TextEl("p", v.A("id", "test-start-msg", "class", "ff-msg"), m))
	}
	card.Add(startDiv)
	rate := v.El("div", v.A("class", "ff-grid"),
		textField{id: "test-rate", label: "Pumping rate Q", unit: ru.Symbol, numeric: true, value: t.Rate.Text, msg: msgs["rate"],
			onInput: func(s string) { a.SetTestField("rate", s) }}.node(),
		selectField("test-rate-unit", "Unit of Q", ru.Symbol, rateOpts, "", func(s string) { a.SetTestField("rate-unit", s) }))
	card.Add(rate)
	card.Add(textField{id: "test-static", label: "Static water level, depth below measuring point", unit: d.Length.Symbol, numeric: true,
		value: shownText(t.StaticLevel, d.Length), msg: msgs["static"],
		onInput: func(s string) { a.SetTestField("static", s) }}.node())
	card.Add(selectField("test-pumping-well", "Pumping well", t.PumpingWell, pumpOpts, "", func(s string) { a.SetTestField("pumping-well", s) }))
	card.Add(selectField("test-obs-well", "Readings taken in", t.ObservationWell, obsOpts, msgs["obs-well"], func(s string) { a.SetTestField("obs-well", s) }))
	card.Add(v.El("div", v.A("class", "ff-grid"),
		selectField("test-time-mode", "Times typed as", string(timeMode(t)), []option{
			{string(project.ElapsedMinutes), "Elapsed minutes since the pump started"},
			{string(project.ClockTime), "Clock time (hh:mm or hh:mm:ss)"},
		}, "", func(s string) { a.SetTestField("time-mode", s) }),
		selectField("test-depth-unit", "Depths typed in", depthUnit(t).Symbol, []option{
			{"m", "metres (m)"}, {"ft", "feet (ft)"}, {"cm", "centimetres (cm)"},
		}, "", func(s string) { a.SetTestField("depth-unit", s) })))
	return div.Add(card, a.renderSchedule(t, d))
}

func timeMode(t *project.Test) project.TimeMode {
	if t.TimeMode == "" {
		return project.ElapsedMinutes
	}
	return t.TimeMode
}

func (a *App) testSelector() *v.Node {
	p := a.cur
	row := v.El("div", v.A("class", "ff-actions"))
	if len(p.Tests) > 1 {
		var opts []option
		for i, t := range p.Tests {
			name := t.Name
			if strings.TrimSpace(name) == "" {
				name = fmt.Sprintf("Test %d", i+1)
			}
			opts = append(opts, option{strconv.Itoa(i), name})
		}
		row.Add(selectField("test-select", "Test", strconv.Itoa(a.testIdx), opts, "", func(s string) {
			if i, err := strconv.Atoi(s); err == nil {
				a.SelectTest(i)
			}
		}))
	}
	row.Add(button("add-test", "+ Pumping test", "ff-btn ff-small", a.AddTest))
	row.Add(a.kindAddButtons()...)
	return row
}

// ---- readings ----

func (a *App) renderReadings() *v.Node {
	p := a.cur
	t0 := a.currentTest()
	d := DisplayFor(p.Units)
	du := depthUnit(t0)
	t, commit := a.readingsTestLocked(t0)
	checks := CheckReadings(t, du)
	commit()
	div := v.El("div", nil, a.testSelector(), a.seriesSelector(t0, d))
	static, hasStatic := t.StaticLevel.Value()
	info := "Static level not entered yet (Test tab): drawdown appears once it is."
	if hasStatic {
		info = fmt.Sprintf("Drawdown = depth − static level (%s %s). Enter moves on; paste from a spreadsheet (time ⇥ depth) fills many rows.",
			formatSig(d.Length.FromSI(static), 4), d.Length.Symbol)
	}
	div.Add(v.TextEl("p", v.A("id", "readings-info", "class", "ff-hint"), info))
	timeLabel := "Elapsed time (min)"
	placeholder := "min"
	if timeMode(t) == project.ClockTime {
		timeLabel, placeholder = "Clock time (hh:mm:ss)", "hh:mm"
	}
	table := v.El("table", v.A("id", "readings", "class", "ff-readings"))
	table.Add(v.El("thead", nil, v.El("tr", nil,
		v.TextEl("th", v.A("scope", "col"), "#"),
		v.TextEl("th", v.A("scope", "col"), timeLabel),
		v.TextEl("th", v.A("scope", "col"), "Depth to water ("+du.Symbol+")"),
		v.TextEl("th", v.A("scope", "col"), "Drawdown ("+d.Length.Symbol+")"),
	)))
	body := v.El("tbody", nil)
	n := len(t.Readings)
	for i := 0; i <= n; i++ {
		var r project.Reading
		var c RowCheck
		if i < n {
			r, c = t.Readings[i], checks[i]
		}
		body.Add(a.readingRow(i, r, c, d, placeholder))
		if len(c.Messages) > 0 {
			body.Add(v.El("tr", v.A("class", "ff-msgrow", "data-msg-row", strconv.Itoa(i)),
				v.TextEl("td", v.A("id", fmt.Sprintf("r-%d-msg", i), "class", "row-msg", "colspan", "4", "role", "alert"),
					strings.Join(c.Messages, " "))).WithKey(fmt.Sprintf("m%d", i)))
		}
	}
	table.Add(body)
	usable := 0
	for _, c := range checks {
		if c.Usable {
			usable++
		}
	}
	div.Add(v.El("div", v.A("class", "ff-table-wrap"), table))
	div.Add(v.TextEl("p", v.A("id", "readings-count", "class", "ff-hint"),
		fmt.Sprintf("%d readings, %d usable for the fit.", n, usable)))
	return div
}

func (a *App) readingRow(i int, r project.Reading, c RowCheck, d Display, placeholder string) *v.Node {
	class := "ff-rrow"
	if len(c.Messages) > 0 {
		class += " ff-bad"
	}
	tr := v.El("tr", v.A("data-row", strconv.Itoa(i), "class", class)).WithKey(fmt.Sprintf("r%d", i))
	cell := func(field, value, label, ph string) *v.Node {
		id := fmt.Sprintf("r-%d-%s", i, field)
		in := v.El("input", v.A("id", id, "type", "text", "class", "ff-input ff-cell", "value", value,
			"inputmode", "decimal", "autocomplete", "off", "enterkeyhint", "next", "aria-label", label, "placeholder", ph))
		if len(c.Messages) > 0 {
			in.Set("aria-describedby", fmt.Sprintf("r-%d-msg", i))
		}
		in.Handle("input", func(e *v.Event) { a.SetReading(i, field, e.Value) })
		in.Handle("keydown", func(e *v.Event) {
			if e.Key == "Enter" {
				e.Prevent = true
				a.EnterInReading(i, field)
			}
		})
		in.Handle("paste", func(e *v.Event) {
			if a.PasteReadings(i, field, e.Pasted) {
				e.Prevent = true
			}
		})
		return v.El("td", nil, in)
	}
	dd := ""
	if c.HasDrawdown {
		dd = formatSig(d.Length.FromSI(c.Drawdown), 3)
		if strings.Contains(dd, "×") {
			dd = strconv.FormatFloat(d.Length.FromSI(c.Drawdown), 'f', 3, 64)
		}
	}
	tr.Add(v.TextEl("td", v.A("class", "ff-rownum"), strconv.Itoa(i+1)),
		cell("time", r.TimeText, fmt.Sprintf("Row %d time", i+1), placeholder),
		cell("depth", r.DepthText, fmt.Sprintf("Row %d depth to water", i+1), ""),
		v.TextEl("td", v.A("id", fmt.Sprintf("r-%d-dd", i), "class", "ff-dd"), dd))
	return tr
}

// ---- fit ----

func (a *App) renderFit() *v.Node {
	p := a.cur
	t := a.currentTest()
	d := DisplayFor(p.Units)
	div := v.El("div", nil, a.testSelector())
	ctl := v.El("div", v.A("class", "ff-card ff-fitctl"))
	ctl.Add(sourceSelect(a, t))
	ctl.Add(selectField("fit-model", "Model", string(t.Fit.ModelOrDefault()), modelOptions(),
		"", func(s string) { a.SetModel(project.Model(s)) }), a.pumpControls(t, d))
	ctl.Add(v.El("div", v.A("class", "ff-grid"),
		textField{id: "window-start", label: "Fit window from", unit: "min", numeric: true, value: t.Fit.WindowStartText,
			placeholder: "first reading", onInput: func(s string) { a.SetWindowText("start", s) }}.node(),
		textField{id: "window-end", label: "Fit window to", unit: "min", numeric: true, value: t.Fit.WindowEndText,
			placeholder: "last reading", onInput: func(s string) { a.SetWindowText("end", s) }}.node(),
	))
	ctl.Add(selectField("cj-umax", "Cooper–Jacob valid while u <", strconv.FormatFloat(t.Fit.CJUMaxOrDefault(), 'g', -1, 64), []option{
		{"0.01", "0.01 (Cooper & Jacob 1946)"}, {"0.05", "0.05 (many textbooks)"}, {"0.1", "0.1 (looser field rule)"},
	}, "", a.SetCJUMax))
	ctl.Add(textField{id: "smoothing", label: "Derivative smoothing L", unit: "log cycles", numeric: true,
		value: t.Fit.SmoothingText, placeholder: strconv.FormatFloat(project.DefaultSmoothing, 'g', -1, 64),
		msg: smoothingMessage(t.Fit), onInput: a.SetSmoothing}.node())
	if m := windowMessage(t.Fit); m != "" {
		ctl.Add(v.TextEl("p", v.A("id", "window-msg", "class", "ff-msg"), m))
	}
	ctl.Add(v.TextEl("p", v.A("class", "ff-hint"), "Or drag across the log–log plot to choose the window."))
	auto := v.El("input", v.A("id", "auto-fit", "type", "checkbox", "class", "ff-check", "checked", strconv.FormatBool(!t.Fit.Manual)))
	auto.Handle("change", func(e *v.Event) { a.SetAutoFit(e.Checked) })
	ctl.Add(v.El("div", v.A("class", "ff-row"),
		button("fit", "Fit", "ff-btn ff-primary ff-big", a.RunFit),
		button("fit-all", "Fit every model", "ff-btn", a.FitAll),
		button("window-clear", "Use all readings", "ff-btn", a.ClearWindow),
		v.El("label", v.A("class", "ff-checklabel", "for", "auto-fit"), auto, v.T(" Refit as readings change"))))
	div.Add(ctl)
	status := a.fitStatus(t)
	div.Add(v.TextEl("p", v.A("id", "fit-status", "class", "ff-status", "role", "status", "aria-live", "polite"), status))
	div.Add(a.renderResults(p, t, d))
	div.Add(a.renderPumpPanels(t, d)...)
	div.Add(a.renderPlots(p, t, d))
	return div
}

func (a *App) fitStatus(t *project.Test) string {
	switch {
	case a.fit.running:
		return "Fitting…"
	case a.fit.msg != "":
		return a.fit.msg
	case t.Result == nil:
		return "Not fitted yet."
	}
	req, missing := a.fitRequestLocked(t)
	if len(missing) == 0 && req.Fingerprint() != t.Result.Inputs {
		if t.Fit.Manual {
			return "The readings or settings changed since this fit: press Fit to update."
		}
		return "Updating the fit…"
	}
	return fmt.Sprintf("Fitted %s at %s: %s.", modelName(t.Result.Model), t.Result.At.Local().Format("15:04:05"), t.Result.Status)
}

func (a *App) renderResults(p *project.Project, t *project.Test, d Display) *v.Node {
	box := v.El("div", v.A("id", "results", "class", "ff-card ff-results"))
	box.Add(v.TextEl("h3", nil, "Results"))
	r := t.Result
	if r == nil {
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), "No fit yet."))
	} else {
		dl := v.El("dl", v.A("class", "ff-dl"))
		item := func(id, label string, value float64, text string) {
			dd := v.TextEl("dd", v.A("id", id), text)
			if value == value { // not NaN
				dd.Set("data-value", strconv.FormatFloat(value, 'g', 10, 64))
			}
			dl.Add(v.TextEl("dt", nil, label), dd)
		}
		est := func(e project.Estimate, u units.Unit) (float64, string) {
			val := u.FromSI(e.Value)
			s := formatSig(val, 3)
			if u.Symbol != "1" {
				s += " " + u.Symbol
			}
			return val, s + " (95 % CI " + formatSig(u.FromSI(e.Lower), 3) + " – " + formatSig(u.FromSI(e.Upper), 3) + ")"
		}
		val, s := est(r.T, d.Transmissivity)
		item("result-T", "Transmissivity T", val, s)
		if f := currentFit(t); f == nil || hasParam(f, "S") {
			val, s = est(r.S, mustUnit("1"))
			item("result-S", "Storativity S (–)", val, s)
		}
		extraResults(t, d, item)
		if r.HasK {
			val, s = est(r.K, d.Conductivity)
			item("result-K", "Hydraulic conductivity K = T/b", val, s)
		} else {
			item("result-K", "Hydraulic conductivity K", nan(), "Enter the aquifer thickness b on the Site tab to get K = T/b.")
		}
		item("result-rmse", "RMSE of drawdown", d.Length.FromSI(r.RMSE), formatSig(d.Length.FromSI(r.RMSE), 3)+" "+d.Length.Symbol)
		item("result-iterations", "Iterations", float64(r.Iterations), fmt.Sprintf("%d (%d readings used)", r.Iterations, r.N))
		item("result-cj", "Cooper–Jacob valid from", r.EarliestValid/units.Minute,
			fmt.Sprintf("t ≥ %s min (u < %g)", formatSig(r.EarliestValid/units.Minute, 3), t.Fit.CJUMaxOrDefault()))
		box.Add(dl)
		if len(r.Warnings) > 0 {
			ul := v.El("ul", v.A("id", "result-warnings", "class", "ff-warnings"))
			for _, w := range r.Warnings {
				ul.Add(v.TextEl("li", nil, w))
			}
			box.Add(ul)
		}
	}
	box.Add(v.TextEl("p", v.A("id", "caution", "class", "ff-caution", "role", "note"), Caution))
	return box
}
