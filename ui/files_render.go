package ui

import (
	"strconv"
	"strings"

	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// renderFilesBar is the list screen's bar of project files: import, and
// export of every project, with the reminder of unexported changes.
func (a *App) renderFilesBar() *v.Node {
	bar := v.El("div", v.A("id", "files-bar", "class", "ff-card"))
	in := v.El("input", v.A("id", "import-file", "type", "file", "class", "ff-file", "accept", ".json,application/json"))
	in.Handle("change", func(e *v.Event) {
		if len(e.Files) > 0 {
			a.ImportFile(e.Files[0])
		}
	})
	bar.Add(v.El("div", v.A("class", "ff-field"),
		v.TextEl("label", v.A("for", "import-file"), "Import a project file (.fieldfit.json)"), in))
	old := 0
	now := a.opt.Now()
	for _, it := range a.list {
		if it.Unexported && !it.Since.IsZero() && now.Sub(it.Since) > ExportReminder {
			old++
		}
	}
	if a.opt.Download != nil && len(a.list) > 0 {
		if old > 0 {
			bar.Add(v.TextEl("p", v.A("id", "export-reminder", "class", "ff-banner ff-warn", "role", "status"),
				strconv.Itoa(old)+" "+plural(old, "project has", "projects have")+" changes not exported for more than a day. Export them to keep a copy off this device."))
		}
		bar.Add(button("export-all", "Export all projects", "ff-btn", a.ExportAll))
	}
	return bar
}

// exportBadge says on a list item whether the project changed since its
// last export.
func exportBadge(it ListItem) *v.Node {
	if !it.Unexported {
		return v.TextEl("span", v.A("class", "ff-sub ff-exported"), "exported")
	}
	return v.TextEl("span", v.A("class", "ff-sub ff-unexported", "data-unexported", "true"), "changed since last export")
}

// renderMerge is the decisions screen: each part changed on both sides,
// the device's copy beside the incoming one.
func (a *App) renderMerge() *v.Node {
	pm := a.files.merge
	m := pm.m
	s := v.El("section", v.A("id", "screen-merge", "class", "ff-screen"))
	from := "the file “" + pm.from + "”"
	switch {
	case pm.from == "":
		from = "another tab or window"
	case strings.HasPrefix(pm.from, "unsaved"):
		from = "the " + pm.from
	}
	s.Add(v.TextEl("h2", nil, "“"+m.Local.Name+"”: changed on this device and in "+from))
	s.Add(v.TextEl("p", v.A("class", "ff-hint"), "Parts changed on one side only are taken as they are ("+
		strconv.Itoa(m.Count(project.TakeIncoming)+m.Count(project.OnlyIncoming))+" from "+from+", "+
		strconv.Itoa(m.Count(project.KeepLocal)+m.Count(project.OnlyLocal))+" from this device). For each part below, changed on both sides, choose which to keep. Nothing is stored until you apply."))
	undecided := 0
	for _, p := range m.Conflicts() {
		key := p.Key
		c := pm.choices[key]
		if c == project.Undecided {
			undecided++
		}
		card := v.El("div", v.A("class", "ff-card ff-merge-part", "data-part", key)).WithKey(key)
		what := map[string]string{"details": "Project details", "well": "Well", "test": "Test"}[p.What]
		card.Add(v.TextEl("h3", nil, what+": "+p.Name))
		grid := v.El("div", v.A("class", "ff-grid ff-merge-sides"))
		grid.Add(side("On this device", p.Local), side("In "+from, p.Incoming))
		card.Add(grid)
		row := v.El("div", v.A("class", "ff-row"))
		opt := func(choice, label string, is project.Choice) {
			b := button("merge-"+choice+"-"+key, label, "ff-btn", func() { a.ChooseMerge(key, choice) })
			b.Set("aria-pressed", strconv.FormatBool(c == is))
			if c == is {
				b.Set("class", "ff-btn ff-primary")
			}
			row.Add(b)
		}
		opt("local", "Keep this device's", project.ChooseLocal)
		opt("incoming", "Take the incoming", project.ChooseIncoming)
		if p.What != "details" {
			opt("both", "Keep both", project.ChooseBoth)
		}
		card.Add(row)
		s.Add(card)
	}
	apply := button("merge-apply", "Apply these decisions", "ff-btn ff-primary", a.ApplyMerge)
	if undecided > 0 {
		apply.Set("disabled", "")
		apply.Set("aria-disabled", "true")
	}
	return s.Add(v.El("div", v.A("class", "ff-actions"), apply,
		button("merge-cancel", "Cancel: change nothing", "ff-btn", a.CancelMerge)))
}

// side describes one copy of a part for the decisions screen.
func side(title string, obj any) *v.Node {
	box := v.El("div", v.A("class", "ff-merge-side"), v.TextEl("h4", nil, title))
	var lines []string
	var st project.Stamp
	switch o := obj.(type) {
	case *project.Project:
		st = o.Details
		lines = append(lines, "Name: "+o.Name, "Site: "+o.Site, "Units: "+string(o.Units),
			"Aquifer thickness: "+entryText(o.Thickness), "Notes: "+clip(o.Notes, 200))
	case *project.Well:
		st = o.Stamp
		lines = append(lines, "Name: "+o.Name, "Kind: "+string(o.Kind), "Distance r: "+entryText(o.Distance),
			"Radius: "+entryText(o.Radius))
	case *project.Test:
		st = o.Stamp
		lines = append(lines, "Name: "+o.Name, "Start: "+o.StartText, "Rate: "+entryText(o.Rate),
			"Static level: "+entryText(o.StaticLevel), strconv.Itoa(len(o.Readings))+" readings in the table")
		if n := len(o.Readings); n > 0 {
			r := o.Readings[n-1]
			lines = append(lines, "Last reading: "+r.TimeText+" → "+r.DepthText)
		}
		if o.Logger != nil && o.Logger.Water != nil {
			lines = append(lines, "Logger record: "+o.Logger.Water.File+", "+strconv.Itoa(o.Logger.Water.Len())+" readings")
		}
		if o.Result != nil {
			lines = append(lines, "Fitted: T = "+strconv.FormatFloat(o.Result.T.Value, 'g', 3, 64)+" m²/s, S = "+strconv.FormatFloat(o.Result.S.Value, 'g', 3, 64))
		}
	default:
		return box.Add(v.TextEl("p", nil, "(not there)"))
	}
	lines = append(lines, "Changed "+st.Changed.Local().Format("2006-01-02 15:04")+", revision "+strconv.FormatInt(st.Rev, 10))
	ul := v.El("ul", v.A("class", "ff-merge-lines"))
	for _, l := range lines {
		ul.Add(v.TextEl("li", nil, l))
	}
	return box.Add(ul)
}

func entryText(e project.Entry) string {
	if e.Empty() {
		return "–"
	}
	return strings.TrimSpace(e.Text + " " + e.Unit)
}

func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n]) + "…"
}
