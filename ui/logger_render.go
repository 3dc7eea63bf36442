package ui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/fielddata"
	"fieldfit/ui/plot"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// maxPlotted is the most readings a plot of a logger record draws; longer
// records are shown by every k-th reading (the first and last kept).
const maxPlotted = 1500

// acceptFiles is the accept attribute of the file pickers: delimited
// text under its usual names (any file can still be chosen).
const acceptFiles = ".csv,.txt,.tsv,.dat,.asc,.log,text/plain,text/csv"

// renderLogger is the Logger data tab.
func (a *App) renderLogger() *v.Node {
	p := a.cur
	t := a.currentTest()
	d := DisplayFor(p.Units)
	div := v.El("div", nil, a.testSelector())
	div.Add(v.TextEl("p", v.A("class", "ff-hint"), "Import the logger files of this test: the water-level logger (depth to water, level, or the pressure of an unvented logger) and, if you have one, the barometric logger. The files are read on this device only; nothing is sent anywhere."))
	div.Add(sourceSelect(a, t))
	lg := t.Logger
	if lg == nil {
		lg = &project.LoggerData{}
	}
	for _, role := range []string{WaterRecord, BaroRecord} {
		rec := lg.Water
		title, input := "Water-level logger", "logger-file"
		if role == BaroRecord {
			rec, title, input = lg.Baro, "Barometric logger (optional)", "baro-file"
		}
		card := v.El("div", v.A("id", "card-"+role, "class", "ff-card"), v.TextEl("h3", nil, title)).WithKey(role)
		if rec != nil {
			card.Add(a.recordSummary(role, rec, lg.Conditioning).WithKey("summary"))
		}
		label := "Choose the logger file"
		if rec != nil {
			label = "Import another file instead"
		}
		role := role
		in := v.El("input", v.A("id", input, "type", "file", "class", "ff-file", "accept", acceptFiles))
		in.Handle("change", func(e *v.Event) {
			if len(e.Files) > 0 {
				a.PickLoggerFile(role, e.Files[0])
			}
		})
		card.Add(v.El("div", v.A("class", "ff-field"), v.TextEl("label", v.A("for", input), label), in).WithKey("picker"))
		if a.imp != nil && a.imp.role == role && a.imp.testID == t.ID {
			card.Add(a.renderImport(a.imp, d).WithKey("import-" + a.importPhaseName(a.imp)))
		}
		div.Add(card)
	}
	if lg.Water != nil {
		div.Add(a.renderConditioning(t, lg, d))
	}
	return div
}

// sourceSelect chooses the readings the fit uses.
func sourceSelect(a *App, t *project.Test) *v.Node {
	src := string(project.FromTape)
	if t.FitsLogger() {
		src = string(project.FromLogger)
	}
	return selectField("fit-source", "The fit uses", src, []option{
		{string(project.FromTape), "the tape readings (Readings tab)"},
		{string(project.FromLogger), "the logger record (Logger data tab)"},
	}, "", a.SetSource)
}

// recordSummary describes an imported record in a few lines.
func (a *App) recordSummary(role string, r *project.LoggerRecord, c fielddata.Conditioning) *v.Node {
	box := v.El("div", v.A("id", role+"-summary", "class", "ff-summary"))
	what := map[fielddata.ValueKind]string{fielddata.Depth: "depth to water", fielddata.Level: "water level", fielddata.Pressure: "pressure"}[r.Kind]
	span := ""
	if n := r.Len(); n > 0 {
		span = fmt.Sprintf(", %s to %s", formatRecordTime(r.Time[0], r), formatRecordTime(r.Time[n-1], r))
		if r.Clock {
			span += " (" + zoneLabel(r.Mapping.Time.Zone) + ")"
		} else {
			span = fmt.Sprintf(", elapsed %s to %s min", formatRecordTime(r.Time[0], r), formatRecordTime(r.Time[n-1], r))
		}
	}
	unit := ""
	if r.Unit != "" {
		unit = " in " + r.Unit
	}
	box.Add(v.TextEl("p", v.A("class", "ff-file-name"), r.File))
	box.Add(v.TextEl("p", nil, fmt.Sprintf("%s of %s%s, column %q%s.", capital(countWord(r.Len(), "reading")), what, unit, r.Name, span)))
	var odd []string
	if r.Checks.Duplicates > 0 {
		odd = append(odd, countWord(r.Checks.Duplicates, "repeated time"))
	}
	if r.Checks.Gaps > 0 {
		odd = append(odd, countWord(r.Checks.Gaps, "gap"))
	}
	if r.Checks.Backward > 0 {
		odd = append(odd, countWord(r.Checks.Backward, "time going backwards"))
	}
	if len(odd) > 0 {
		box.Add(v.TextEl("p", v.A("class", "ff-warn-text"), "Check the logger clock: "+strings.Join(odd, ", ")+"."))
	}
	if r.Bad.Count > 0 {
		det := v.El("details", v.A("id", role+"-bad", "class", "ff-details"),
			v.TextEl("summary", nil, fmt.Sprintf("%s could not be read and %s skipped, as you chose (show them)",
				countWord(r.Bad.Count, "row"), map[bool]string{true: "was", false: "were"}[r.Bad.Count == 1])))
		det.Add(badTable(role+"-bad-rows", r.Bad.Listed, r.Bad.Count))
		box.Add(det)
	}
	if role == BaroRecord && c.Baro == nil && c.Efficiency == nil {
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), "Not used yet: turn on the compensation or the efficiency below."))
	}
	box.Add(button(role+"-remove", "Remove this record", "ff-btn ff-small ff-danger", func() { a.RemoveLoggerRecord(role) }))
	return box
}

// badTable lists unreadable rows: row, column, value, why.
func badTable(id string, rows []project.BadRow, count int) *v.Node {
	table := v.El("table", v.A("id", id, "class", "ff-readings ff-badrows"))
	table.Add(v.El("thead", nil, v.El("tr", nil,
		v.TextEl("th", v.A("scope", "col"), "Row"), v.TextEl("th", v.A("scope", "col"), "Column"),
		v.TextEl("th", v.A("scope", "col"), "Value"), v.TextEl("th", v.A("scope", "col"), "Why"))))
	body := v.El("tbody", nil)
	for i, r := range rows {
		body.Add(v.El("tr", v.A("data-bad-row", strconv.Itoa(r.Row)),
			v.TextEl("td", nil, strconv.Itoa(r.Row)), v.TextEl("td", nil, r.Column),
			v.TextEl("td", nil, r.Value), v.TextEl("td", nil, r.Why)).WithKey(strconv.Itoa(i)))
	}
	table.Add(body)
	wrap := v.El("div", v.A("class", "ff-table-wrap"), table)
	if count > len(rows) {
		wrap.Add(v.TextEl("p", v.A("class", "ff-hint"), fmt.Sprintf("The first %d of %d are listed.", len(rows), count)))
	}
	return wrap
}

// renderImport is the panel of a file being imported.
func (a *App) renderImport(imp *importState, d Display) *v.Node {
	box := v.El("div", v.A("id", "import-panel", "class", "ff-import", "data-phase", a.importPhaseName(imp)))
	mb := fileSize(imp.size)
	switch imp.phase {
	case phaseReading, phaseImporting:
		what := "Reading"
		if imp.phase == phaseImporting {
			what = "Importing"
		}
		pct := int(math.Floor(imp.progress * 100))
		box.Add(v.TextEl("p", v.A("id", "import-status", "role", "status", "aria-live", "polite"),
			fmt.Sprintf("%s %s (%s): %d %%", what, imp.file, mb, pct)))
		box.Add(v.El("progress", v.A("id", "import-progress", "class", "ff-progress", "max", "1",
			"value", strconv.FormatFloat(imp.progress, 'f', 3, 64), "aria-label", what+" the file")))
		box.Add(button("import-cancel", "Cancel", "ff-btn", a.CancelImport))
	case phaseFailed:
		box.Add(v.TextEl("p", v.A("id", "import-error", "class", "ff-msg", "role", "alert"), imp.err))
		box.Add(button("import-discard", "Close", "ff-btn", a.CancelImport))
	case phaseBadRows:
		rec := imp.rec
		box.Add(v.TextEl("h4", nil, fmt.Sprintf("%s of %s could not be read", capital(countWord(imp.badCount, "row")), imp.file)))
		var rows []project.BadRow
		for _, e := range rec.Bad {
			rows = append(rows, badRow(e))
		}
		box.Add(badTable("bad-rows", rows, imp.badCount))
		box.Add(v.TextEl("p", nil, fmt.Sprintf("The other %s were read. Skip the rows above and keep them (the rows stay listed with the record), or stop and add nothing.",
			countWord(rec.Len(), "reading"))))
		box.Add(v.El("div", v.A("class", "ff-row"),
			button("bad-skip", "Skip these rows", "ff-btn ff-primary", a.SkipBadRows),
			button("bad-stop", "Stop: add nothing", "ff-btn", a.StopAtBadRows)))
	default:
		box.Add(a.renderPreview(imp, d))
	}
	return box
}

func (a *App) importPhaseName(imp *importState) string {
	return [...]string{"", "reading", "preview", "importing", "bad-rows", "failed"}[imp.phase]
}

// whyLine is the reason shown under a choice.
func whyLine(id, text string) *v.Node {
	return v.TextEl("p", v.A("id", id, "class", "ff-why"), text)
}

// renderPreview shows the detected choices, each with its reason and
// changeable, the column mapping and the first rows converted.
func (a *App) renderPreview(imp *importState, d Display) *v.Node {
	box := v.El("div", v.A("id", "import-preview"))
	box.Add(v.TextEl("p", v.A("class", "ff-hint"), fmt.Sprintf("%s (%s): check what was found, change what is wrong, then import.",
		imp.file, fileSize(imp.size))))
	if imp.msg != "" {
		box.Add(v.TextEl("p", v.A("id", "import-msg", "class", "ff-msg", "role", "alert"), imp.msg).WithKey("msg"))
	}
	if q := imp.dateQuestion(); q != "" {
		box.Add(v.El("div", v.A("id", "imp-date-question", "class", "ff-banner ff-info", "role", "alert"),
			v.TextEl("p", nil, q),
			v.El("div", v.A("class", "ff-row"),
				button("date-day-first", "Day first (14/05/2024)", "ff-btn", func() { a.SetImportMapping("date-order", string(fielddata.DayFirst)) }),
				button("date-month-first", "Month first (05/14/2024)", "ff-btn", func() { a.SetImportMapping("date-order", string(fielddata.MonthFirst)) }))).WithKey("date-question"))
	}
	if qs := imp.openQuestions(); len(qs) > 0 {
		ul := v.El("ul", v.A("id", "imp-questions", "class", "ff-warnings"))
		for _, q := range qs {
			ul.Add(v.TextEl("li", nil, q))
		}
		box.Add(ul.WithKey("questions"))
	}
	// How the file is read.
	o := imp.opt
	read := v.El("fieldset", v.A("class", "ff-card ff-set"), v.TextEl("legend", nil, "How the file is read")).WithKey("read")
	var encs, dels []option
	for _, e := range fielddata.Encodings {
		encs = append(encs, option{string(e), map[fielddata.Encoding]string{fielddata.UTF8: "UTF-8", fielddata.UTF16LE: "UTF-16 little-endian",
			fielddata.UTF16BE: "UTF-16 big-endian", fielddata.Latin1: "Latin-1 (ISO 8859-1)", fielddata.Windows1252: "Windows-1252"}[e]})
	}
	for _, dl := range fielddata.Delimiters {
		dels = append(dels, option{string(dl), map[fielddata.Delimiter]string{fielddata.Comma: "comma ,", fielddata.Semicolon: "semicolon ;",
			fielddata.Tab: "tab", fielddata.Spaces: "spaces (aligned columns)"}[dl]})
	}
	grid := v.El("div", v.A("class", "ff-grid"))
	grid.Add(v.El("div", nil, selectField("imp-encoding", "Encoding", orDefault(string(o.Encoding), "utf-8"), encs, "",
		func(s string) { a.SetImportOption("encoding", s) }), whyLine("imp-why-encoding", imp.why("encoding"))))
	grid.Add(v.El("div", nil, selectField("imp-delimiter", "Delimiter", orDefault(string(o.Delimiter), "comma"), dels, "",
		func(s string) { a.SetImportOption("delimiter", s) }), whyLine("imp-why-delimiter", imp.why("delimiter"))))
	grid.Add(v.El("div", nil, selectField("imp-decimal", "Decimal mark", orDefault(string(o.Decimal), "point"),
		[]option{{string(fielddata.Point), "point 1.5"}, {string(fielddata.CommaMark), "comma 1,5"}}, "",
		func(s string) { a.SetImportOption("decimal", s) }), whyLine("imp-why-decimal", imp.why("decimal"))))
	line := func(n int) string {
		if n == 0 {
			return ""
		}
		return strconv.Itoa(n)
	}
	dataRow := o.DataRow
	if dataRow == 0 {
		dataRow = max(o.HeaderRow, o.UnitsRow) + 1
	}
	grid.Add(textField{id: "imp-header-row", label: "Header on line", numeric: true, value: line(o.HeaderRow), placeholder: "none",
		onInput: func(s string) { a.SetImportOption("header-row", s) }}.node())
	grid.Add(textField{id: "imp-units-row", label: "Units on line", numeric: true, value: line(o.UnitsRow), placeholder: "none",
		onInput: func(s string) { a.SetImportOption("units-row", s) }}.node())
	grid.Add(textField{id: "imp-data-row", label: "First reading on line", numeric: true, value: line(o.DataRow), placeholder: strconv.Itoa(dataRow),
		onInput: func(s string) { a.SetImportOption("data-row", s) }}.node())
	read.Add(grid, whyLine("imp-why-rows", imp.why("rows")))
	if imp.optErr != "" {
		read.Add(v.TextEl("p", v.A("id", "imp-options-msg", "class", "ff-msg", "role", "alert"), imp.optErr))
	}
	box.Add(read)
	lay := imp.layout
	if lay == nil {
		return box
	}
	if len(lay.Preamble) > 0 {
		ul := v.El("ul", v.A("id", "imp-preamble", "class", "ff-preamble"))
		for _, m := range lay.Preamble[:min(len(lay.Preamble), 8)] {
			ul.Add(v.TextEl("li", nil, fmt.Sprintf("line %d: %s", m.Row, m.Text)))
		}
		box.Add(v.El("div", nil, v.TextEl("p", v.A("class", "ff-hint"), "Lines above the header (kept as they are):"), ul).WithKey("preamble"))
	}
	box.Add(sampleTable(lay).WithKey("sample"))

	// Columns.
	m := imp.m
	cols := v.El("fieldset", v.A("class", "ff-card ff-set"), v.TextEl("legend", nil, "Columns")).WithKey("columns")
	var colOpts []option
	for i, h := range lay.Header {
		colOpts = append(colOpts, option{strconv.Itoa(i), fmt.Sprintf("%d: %s", i+1, h)})
	}
	tf := m.Time.Format
	if tf == "" {
		tf = fielddata.DateTime
	}
	cg := v.El("div", v.A("class", "ff-grid"))
	cg.Add(selectField("imp-time-format", "Time written as", string(tf), []option{
		{string(fielddata.DateTime), "date and time in one column"},
		{string(fielddata.DateAndClock), "date and clock time in two columns"},
		{string(fielddata.Elapsed), "elapsed time"},
	}, "", func(s string) { a.SetImportMapping("time-format", s) }))
	timeLabel := "Date and time column"
	switch tf {
	case fielddata.DateAndClock:
		timeLabel = "Date column"
	case fielddata.Elapsed:
		timeLabel = "Elapsed time column"
	}
	cg.Add(selectField("imp-time-col", timeLabel, strconv.Itoa(m.Time.Column), colOpts, "", func(s string) { a.SetImportMapping("time-col", s) }))
	if tf == fielddata.DateAndClock {
		cg.Add(selectField("imp-clock-col", "Clock time column", strconv.Itoa(m.Time.ClockColumn), colOpts, "", func(s string) { a.SetImportMapping("clock-col", s) }))
	}
	if tf == fielddata.Elapsed {
		cg.Add(selectField("imp-time-unit", "Elapsed time in", orDefault(m.Time.Unit, "s"), []option{{"s", "seconds"}, {"min", "minutes"}, {"h", "hours"}, {"d", "days"}},
			"", func(s string) { a.SetImportMapping("time-unit", s) }))
	}
	cols.Add(cg, whyLine("imp-why-time", imp.why("time")))
	if tf != fielddata.Elapsed {
		zg := v.El("div", v.A("class", "ff-grid"))
		zg.Add(v.El("div", nil, selectField("imp-date-order", "Dates such as 05/06/2024 are", string(m.Time.Order), []option{
			{"", "not chosen (asked when needed)"}, {string(fielddata.DayFirst), "day first (5 June)"}, {string(fielddata.MonthFirst), "month first (6 May)"},
		}, "", func(s string) { a.SetImportMapping("date-order", s) }), whyLine("imp-why-order", imp.why("order"))))
		zoneMsg := ""
		if _, ok := parseOffset(imp.zone); !ok {
			zoneMsg = fmt.Sprintf("%q is not a UTC offset: type one such as +02:00 or -05:00 (zone names are not known offline); %s is used.", imp.zone, zoneLabel(m.Time.Zone))
		}
		_, off := a.opt.Now().Zone()
		zg.Add(v.El("div", nil,
			textField{id: "imp-zone", label: "Logger clock, as a UTC offset", value: imp.zone, placeholder: "UTC", msg: zoneMsg,
				onInput: func(s string) { a.SetImportMapping("zone", s) }}.node(),
			button("imp-zone-device", "This device's offset ("+zoneLabel(offsetText(off))+")", "ff-btn ff-small", a.UseDeviceOffset),
			v.TextEl("p", v.A("class", "ff-hint"), "Fixed UTC offsets only: zone names and daylight-saving changes are not known offline. Times written with their own offset keep it."),
			whyLine("imp-why-zone", imp.why("zone"))))
		cols.Add(zg)
	}
	vg := v.El("div", v.A("class", "ff-grid"))
	valCol, kind, unit := "", fielddata.Level, ""
	if len(m.Values) > 0 {
		valCol, kind, unit = strconv.Itoa(m.Values[0].Column), m.Values[0].Kind, m.Values[0].Unit
	}
	vOpts := append([]option{{"", "(choose)"}}, colOpts...)
	vg.Add(selectField("imp-value-col", "Readings column", valCol, vOpts, "", func(s string) { a.SetImportMapping("value-col", s) }))
	if len(m.Values) > 0 {
		vg.Add(selectField("imp-kind", "The column holds", string(kind), []option{
			{string(fielddata.Depth), "depth to water"}, {string(fielddata.Level), "water level above a datum"}, {string(fielddata.Pressure), "pressure"},
		}, "", func(s string) { a.SetImportMapping("kind", s) }))
		var uOpts []option
		seen := false
		for _, u := range kindUnits[kind] {
			uOpts = append(uOpts, option{u, u})
			seen = seen || u == unit
		}
		if !seen {
			uOpts = append([]option{{unit, orDefault(unit, "(choose)")}}, uOpts...)
		}
		vg.Add(selectField("imp-unit", "Unit", unit, uOpts, "", func(s string) { a.SetImportMapping("unit", s) }))
		if kind == fielddata.Pressure {
			dens := ""
			if m.Density != 0 {
				dens = strconv.FormatFloat(m.Density, 'f', -1, 64)
			}
			vg.Add(textField{id: "imp-density", label: "Water density for pressure → head", unit: "kg/m³", numeric: true, value: dens,
				placeholder: "999.97", onInput: func(s string) { a.SetImportMapping("density", s) }}.node())
		}
	}
	cols.Add(vg, whyLine("imp-why-value", imp.why("value")))
	if kind == fielddata.Pressure && len(m.Values) > 0 {
		cols.Add(v.TextEl("p", v.A("class", "ff-hint"), "Pressure becomes the head of water above the sensor, h = p/(ρ·g), with g = 9.80665 m/s² and ρ 999.97 kg/m³ (water at 4 °C) unless typed."))
	}
	if imp.mapErr != "" {
		cols.Add(v.TextEl("p", v.A("id", "imp-mapping-msg", "class", "ff-msg", "role", "alert"), imp.mapErr))
	}
	box.Add(cols)
	if imp.preview != nil {
		box.Add(previewTable(imp.preview, d).WithKey("preview"))
	}
	row := v.El("div", v.A("class", "ff-row")).WithKey("buttons")
	start := button("import-start", "Import the whole file", "ff-btn ff-primary ff-big", a.StartImport)
	if imp.optErr != "" || imp.mapErr != "" {
		start.Set("disabled", "")
		start.Set("aria-disabled", "true")
	}
	row.Add(start, button("import-discard", "Cancel", "ff-btn", a.CancelImport))
	box.Add(row)
	return box
}

// fileSize writes a file's size in kB or MB (1000-based).
func fileSize(n int64) string {
	if n < 1e6 {
		return formatSig(float64(n)/1e3, 3) + " kB"
	}
	return formatSig(float64(n)/1e6, 3) + " MB"
}

func orDefault(s, def string) string {
	if s == "" {
		return def
	}
	return s
}

// openQuestions are the questions of the sniff that the user has not
// answered yet (the date order is asked apart).
func (imp *importState) openQuestions() []string {
	if imp.det == nil {
		return nil
	}
	var out []string
	for _, q := range imp.det.Questions() {
		key := map[string]string{"Encoding": "encoding", "Delimiter": "delimiter", "Decimal mark": "decimal", "Header": "rows",
			"Time": "time", "Date order": "order", "Time zone": "zone", "Unit": "value"}
		head, _, _ := strings.Cut(q, ":")
		if k := key[head]; imp.mine[k] || k == "order" {
			continue
		}
		if head == "Unit" && len(imp.m.Values) > 0 && imp.m.Values[0].Unit != "" {
			continue
		}
		out = append(out, q+".")
	}
	return out
}

// sampleTable shows the first rows of the sample as text.
func sampleTable(lay *fielddata.Layout) *v.Node {
	table := v.El("table", v.A("id", "imp-sample", "class", "ff-readings ff-sample"))
	head := v.El("tr", nil, v.TextEl("th", v.A("scope", "col"), "Line"))
	for i, h := range lay.Header {
		name := h
		if i < len(lay.Units) && strings.TrimSpace(lay.Units[i]) != "" {
			name += " [" + lay.Units[i] + "]"
		}
		head.Add(v.TextEl("th", v.A("scope", "col"), fmt.Sprintf("%d: %s", i+1, name)))
	}
	table.Add(v.El("thead", nil, head))
	body := v.El("tbody", nil)
	for r := 0; r < min(len(lay.Rows), 5); r++ {
		tr := v.El("tr", nil, v.TextEl("td", nil, strconv.Itoa(lay.RowNumbers[r])))
		for _, c := range lay.Rows[r] {
			tr.Add(v.TextEl("td", nil, c))
		}
		body.Add(tr.WithKey(strconv.Itoa(r)))
	}
	table.Add(body)
	return v.El("div", v.A("class", "ff-table-wrap"), v.TextEl("p", v.A("class", "ff-hint"), "The start of the file as read:"), table)
}

// previewTable shows the first readings converted to SI.
func previewTable(rec *fielddata.Record, d Display) *v.Node {
	box := v.El("div", v.A("class", "ff-table-wrap"))
	zone := "UTC"
	if rec.Clock {
		zone = zoneLabel(rec.Mapping.Time.Zone)
	}
	timeHead := "Time (" + zone + ")"
	if !rec.Clock {
		timeHead = "Elapsed time (min)"
	}
	what := "Value (m)"
	if len(rec.Columns) > 0 {
		what = map[fielddata.ValueKind]string{fielddata.Depth: "Depth to water (m)", fielddata.Level: "Level (m)",
			fielddata.Pressure: "Head of water (m)"}[rec.Columns[0].Kind]
	}
	table := v.El("table", v.A("id", "imp-preview", "class", "ff-readings"))
	table.Add(v.El("thead", nil, v.El("tr", nil, v.TextEl("th", v.A("scope", "col"), "Line"),
		v.TextEl("th", v.A("scope", "col"), timeHead), v.TextEl("th", v.A("scope", "col"), what))))
	body := v.El("tbody", nil)
	lr := &project.LoggerRecord{Clock: rec.Clock, Mapping: rec.Mapping}
	for i := range rec.Time {
		val := ""
		if len(rec.Columns) > 0 {
			val = strconv.FormatFloat(rec.Columns[0].Values[i], 'f', 4, 64)
		}
		body.Add(v.El("tr", nil, v.TextEl("td", nil, strconv.Itoa(int(rec.Row[i]))),
			v.TextEl("td", nil, formatRecordTime(rec.Time[i], lr)), v.TextEl("td", nil, val)).WithKey(strconv.Itoa(i)))
	}
	table.Add(body)
	box.Add(v.TextEl("p", v.A("class", "ff-hint"), "The first readings as they will be imported:"), table)
	if len(rec.Bad) > 0 {
		ul := v.El("ul", v.A("id", "imp-preview-bad", "class", "ff-warnings"))
		for _, e := range rec.Bad {
			ul.Add(v.TextEl("li", nil, capital(e.Error())+"."))
		}
		box.Add(v.TextEl("p", v.A("class", "ff-hint"), "Rows at the start that cannot be read with these choices:"), ul)
	}
	return box
}

// ---- conditioning ----

func (a *App) renderConditioning(t *project.Test, lg *project.LoggerData, d Display) *v.Node {
	w := lg.Water
	c := lg.Conditioning
	tx := lg.Texts
	card := v.El("div", v.A("id", "cond-panel", "class", "ff-card"), v.TextEl("h3", nil, "From the record to drawdown"))
	card.Add(v.TextEl("p", v.A("class", "ff-hint"), "Each step below is kept with the test and can be undone: clear its field or untick it. The fit and the plots follow every change."))
	timeUnit := "yyyy-mm-dd hh:mm:ss, " + zoneLabel(w.Mapping.Time.Zone)
	if !w.Clock {
		timeUnit = "min on the file's elapsed time"
	}
	pickLabel := func(which string) string {
		if a.pick == which {
			return "Tap the plot now (or here to cancel)"
		}
		return "Pick on the plot"
	}
	pg := v.El("div", v.A("class", "ff-grid"))
	for _, f := range []struct{ id, label, text string }{{"start", "Pump started", tx.Start}, {"stop", "Pump stopped", tx.Stop}} {
		f := f
		ph := "the first reading"
		if f.id == "stop" {
			ph = "after the last reading"
		}
		pg.Add(v.El("div", nil,
			textField{id: "cond-" + f.id, label: f.label, unit: timeUnit, value: f.text, placeholder: ph, msg: recordTimeMessage(f.text, w),
				onInput: func(s string) { a.SetCondition(f.id, s) }}.node(),
			button("pick-"+f.id, pickLabel(f.id), "ff-btn ff-small", func() { a.ArmPick(f.id) })))
	}
	card.Add(pg)

	// Static level.
	mode := staticMode(lg)
	quantity := map[fielddata.ValueKind]string{fielddata.Depth: "depth to water below the measuring point",
		fielddata.Level: "level above the datum", fielddata.Pressure: "head of water above the sensor"}[w.Kind]
	sg := v.El("div", v.A("class", "ff-grid"))
	sg.Add(selectField("cond-static-mode", "Static level", mode, []option{
		{StaticMean, "mean of the readings before the pump started"}, {StaticTyped, "typed"}, {StaticNone, "none (no drawdown)"},
	}, "", a.SetStaticMode))
	if mode == StaticTyped {
		msg := ""
		if c.Static == nil {
			msg = "Type the static level as a number."
			if strings.TrimSpace(tx.Static) != "" {
				msg = fmt.Sprintf("%q is not a number.", tx.Static)
			}
		}
		sg.Add(textField{id: "cond-static", label: "Static level, as " + quantity, unit: d.Length.Symbol, numeric: true, value: tx.Static, msg: msg,
			onInput: func(s string) { a.SetCondition("static", s) }}.node())
	}
	card.Add(sg)

	// Barometric record.
	check := func(id, label string, on bool, f func(bool)) *v.Node {
		in := v.El("input", v.A("id", id, "type", "checkbox", "class", "ff-check", "checked", strconv.FormatBool(on)))
		in.Handle("change", func(e *v.Event) { f(e.Checked) })
		return v.El("label", v.A("class", "ff-checklabel", "for", id), in, v.T(" "+label))
	}
	bg := v.El("div", v.A("class", "ff-steps"))
	if lg.Baro == nil {
		bg.Add(v.TextEl("p", v.A("class", "ff-hint"), "No barometric record: import the barometric logger's file above to compensate an unvented logger or to correct for barometric efficiency."))
	} else {
		if w.Kind == fielddata.Pressure {
			bg.Add(check("cond-baro", "Subtract the barometric record (unvented logger)", c.Baro != nil, func(on bool) { a.SetConditionOn("baro", on) }))
			if c.Baro != nil {
				bg.Add(textField{id: "cond-baro-shift", label: "Shift of the barometric logger's clock", unit: "s", numeric: true, value: tx.Shift, placeholder: "0",
					onInput: func(s string) { a.SetCondition("shift", s) }}.node())
			}
		}
		beMsg := ""
		if strings.TrimSpace(tx.BE) != "" && c.Efficiency == nil {
			beMsg = fmt.Sprintf("%q is not a barometric efficiency from 0 to 1; no correction is made.", tx.BE)
		}
		bg.Add(textField{id: "cond-be", label: "Barometric efficiency BE, 0 to 1 (empty: no correction)", numeric: true, value: tx.BE, msg: beMsg,
			onInput: func(s string) { a.SetCondition("be", s) }}.node())
	}
	bg.Add(check("cond-trend", "Remove the trend of the readings before pumping (straight line, extended)", c.Trend != nil, func(on bool) { a.SetConditionOn("trend", on) }))
	bg.Add(check("cond-thin", "Thin the readings evenly in log time for the fit", c.Thin != nil, func(on bool) { a.SetConditionOn("thin", on) }))
	if c.Thin != nil {
		pcMsg := ""
		if s := strings.TrimSpace(tx.PerCycle); s != "" && perCycle(s) == 0 {
			pcMsg = fmt.Sprintf("%q is not a whole number from 1 to 1000; %d is used.", tx.PerCycle, fielddata.DefaultPerCycle)
		}
		bg.Add(textField{id: "cond-per-cycle", label: "Readings per log cycle", numeric: true, value: tx.PerCycle,
			placeholder: strconv.Itoa(fielddata.DefaultPerCycle), msg: pcMsg, onInput: func(s string) { a.SetCondition("per-cycle", s) }}.node())
	}
	card.Add(bg)
	card.Add(a.renderRates(lg, d))

	res, err := a.conditionedLocked(t)
	if err != nil {
		card.Add(v.TextEl("p", v.A("id", "cond-error", "class", "ff-msg", "role", "alert"), settingSentence(err)))
	} else {
		count := res.ThinSummary()
		if count == "" {
			count = countWord(res.Pumping.Len()+res.Recovery.Len(), "reading") + " (not thinned)"
		}
		card.Add(v.TextEl("p", v.A("id", "thin-count", "class", "ff-count"), count))
		sum := fmt.Sprintf("Before pumping: %s · pumping: %s · recovery: %s.", countWord(res.Antecedent.Len(), "reading"),
			countWord(res.Pumping.Len(), "reading"), countWord(res.Recovery.Len(), "reading"))
		if res.HasStatic {
			lv := res.Static
			if w.Kind == fielddata.Depth {
				lv = -lv
			}
			sum += fmt.Sprintf(" Static level %s %s (%s).", formatSig(d.Length.FromSI(lv), 5), d.Length.Symbol, quantity)
		}
		card.Add(v.TextEl("p", v.A("id", "cond-summary"), sum))
		if len(res.Notes) > 0 {
			ul := v.El("ul", v.A("id", "cond-notes", "class", "ff-notes-list"))
			for _, n := range res.Notes {
				ul.Add(v.TextEl("li", nil, n))
			}
			card.Add(ul)
		}
	}
	if !t.FitsLogger() {
		card.Add(v.TextEl("p", v.A("class", "ff-hint"), "The fit uses the tape readings: choose “the logger record” above to fit this record."))
	}
	card.Add(a.loggerPlots(t, lg, res, d))
	return card
}

// renderRates is the pumping-rate schedule table.
func (a *App) renderRates(lg *project.LoggerData, d Display) *v.Node {
	_, msgs := rateSchedule(lg)
	box := v.El("div", v.A("id", "rates-box"), v.TextEl("h4", nil, "Pumping rate schedule"),
		v.TextEl("p", v.A("class", "ff-hint"), "One row per rate step, from the pump start (0 min). A constant-rate test has one row; the constant-rate fit uses the Test tab's rate, or this first step when that is empty."))
	table := v.El("table", v.A("id", "rates", "class", "ff-readings"))
	table.Add(v.El("thead", nil, v.El("tr", nil, v.TextEl("th", v.A("scope", "col"), "From (min)"),
		v.TextEl("th", v.A("scope", "col"), "Rate"), v.TextEl("th", v.A("scope", "col"), "Unit"), v.TextEl("th", nil, ""))))
	body := v.El("tbody", nil)
	var uOpts []option
	for _, u := range RateUnits(a.cur.Units) {
		uOpts = append(uOpts, option{u.Symbol, u.Symbol})
	}
	for i, r := range lg.Rates {
		i := i
		pre := fmt.Sprintf("rate-%d-", i)
		cell := func(field, value, label string) *v.Node {
			in := v.El("input", v.A("id", pre+field, "type", "text", "class", "ff-input ff-cell", "value", value, "inputmode", "decimal", "aria-label", label))
			in.Handle("input", func(e *v.Event) { a.SetRate(i, field, e.Value) })
			return v.El("td", nil, in)
		}
		sel := v.El("select", v.A("id", pre+"unit", "class", "ff-select", "aria-label", fmt.Sprintf("Step %d unit", i+1)))
		opts := uOpts
		if !optionsHave(opts, r.Unit) {
			opts = append([]option{{r.Unit, r.Unit}}, opts...)
		}
		for _, o := range opts {
			sel.Add(v.TextEl("option", v.A("value", o.value), o.label).WithKey(o.value))
		}
		sel.Set("value", r.Unit)
		sel.Handle("change", func(e *v.Event) { a.SetRate(i, "unit", e.Value) })
		body.Add(v.El("tr", v.A("data-rate", strconv.Itoa(i)),
			cell("start", r.Start, fmt.Sprintf("Step %d start (min)", i+1)), cell("rate", r.Rate, fmt.Sprintf("Step %d rate", i+1)),
			v.El("td", nil, sel),
			v.El("td", nil, button(pre+"remove", "Remove", "ff-btn ff-small", func() { a.RemoveRate(i) }))).WithKey(strconv.Itoa(i)))
		if m := msgs[i]; m != "" {
			body.Add(v.El("tr", nil, v.TextEl("td", v.A("id", pre+"msg", "class", "row-msg", "colspan", "4"), m)).WithKey("m" + strconv.Itoa(i)))
		}
	}
	table.Add(body)
	box.Add(v.El("div", v.A("class", "ff-table-wrap"), table))
	if m := msgs[-1]; m != "" {
		box.Add(v.TextEl("p", v.A("id", "rates-msg", "class", "ff-msg"), m))
	}
	box.Add(button("rate-add", "+ Rate step", "ff-btn ff-small", a.AddRate))
	return box
}

func optionsHave(opts []option, value string) bool {
	for _, o := range opts {
		if o.value == value {
			return true
		}
	}
	return false
}

// stride returns the indices of at most maxPlotted readings of n: every
// k-th, with the last.
func stride(n int) []int {
	k := max(1, (n+maxPlotted-1)/maxPlotted)
	idx := make([]int, 0, n/k+2)
	for i := 0; i < n; i += k {
		idx = append(idx, i)
	}
	if n > 0 && idx[len(idx)-1] != n-1 {
		idx = append(idx, n-1)
	}
	return idx
}

// loggerPlots draws the raw record (tap to pick the start or stop) and
// the conditioned drawdown.
func (a *App) loggerPlots(t *project.Test, lg *project.LoggerData, res *fielddata.Result, d Display) *v.Node {
	w := lg.Water
	box := v.El("div", v.A("class", "ff-plots"))
	n := w.Len()
	if n == 0 {
		return box
	}
	t0 := w.Time[0]
	idx := stride(n)
	x := make([]float64, len(idx))
	y := make([]float64, len(idx))
	for j, i := range idx {
		x[j] = (w.Time[i] - t0) / units.Hour
		y[j] = d.Length.FromSI(w.Value[i])
	}
	xlab := "hours since " + formatRecordTime(t0, w)
	if w.Clock {
		xlab += " (" + zoneLabel(w.Mapping.Time.Zone) + ")"
	} else {
		xlab = "hours of the file's elapsed time, from " + formatRecordTime(t0, w) + " min"
	}
	ylab := map[fielddata.ValueKind]string{fielddata.Depth: "depth to water", fielddata.Level: "water level",
		fielddata.Pressure: "pressure as head of water"}[w.Kind] + " (" + d.Length.Symbol + ")"
	title := "The record as imported"
	if len(idx) < n {
		title += fmt.Sprintf(" (every %d-th of %s shown)", idx[1]-idx[0], countWord(n, "reading"))
	}
	raw := plot.Chart{Title: title, Height: 420, X: plot.Axis{Label: xlab}, Y: plot.Axis{Label: ylab, Invert: w.Kind == fielddata.Depth},
		Series: []plot.Series{{Name: w.File, Kind: plot.Line, X: x, Y: y, Style: plot.Style{Color: plot.Blue, Width: 2.5}}}}
	if c := lg.Conditioning; c.Start != nil {
		stop := w.Time[n-1]
		if c.Stop != nil {
			stop = *c.Stop
		}
		raw.Window = &[2]float64{(*c.Start - t0) / units.Hour, (stop - t0) / units.Hour}
		raw.WindowLabel = "pumping"
	}
	rn, lay, err := raw.Render()
	if err != nil {
		box.Add(v.TextEl("p", v.A("id", "plot-raw", "class", "ff-msg"), "This plot cannot be drawn: "+err.Error()))
	} else {
		root := fromPlot(rn)
		root.Set("id", "plot-raw")
		root.Set("class", "ff-plot")
		if a.pick != "" {
			root.Set("data-pick", a.pick)
		}
		root.Handle("click", func(e *v.Event) {
			if e.Width <= 0 {
				return
			}
			px := e.X * lay.Width / e.Width
			px = math.Max(lay.Plot.Left, math.Min(lay.Plot.Right, px))
			a.PickTime(t0 + lay.X.Value(px)*units.Hour)
		})
		box.Add(v.El("figure", v.A("class", "ff-figure"), root))
	}
	if res == nil || !res.HasStatic || res.Pumping.Len() == 0 {
		return box
	}
	// Conditioned drawdown, semilog: every reading (greyed, at most
	// maxPlotted) and the thinned ones the fit uses.
	p := res.Pumping
	var ax, ay []float64
	for _, i := range stride(p.Len()) {
		if p.Elapsed[i] > 0 {
			ax = append(ax, p.Elapsed[i]/units.Minute)
			ay = append(ay, d.Length.FromSI(p.Drawdown[i]))
		}
	}
	th := p.Thinned()
	var tx, ty []float64
	for i, e := range th.Elapsed {
		if e > 0 {
			tx = append(tx, e/units.Minute)
			ty = append(ty, d.Length.FromSI(th.Drawdown[i]))
		}
	}
	if len(ax) == 0 {
		return box
	}
	used := make([]bool, len(ax))
	dd := plot.Chart{Title: "Drawdown while pumping (semilog)", Height: 460,
		X: plot.Axis{Label: "time since pumping started (min)", Log: true}, Y: plot.Axis{Label: "drawdown s (" + d.Length.Symbol + ")"},
		Series: []plot.Series{{Name: "every reading", Kind: plot.Points, X: ax, Y: ay, Used: used, Style: plot.Style{Size: 6}}}}
	if p.Keep != nil {
		dd.Series = append(dd.Series, plot.Series{Name: "thinned: " + res.ThinSummary(), Kind: plot.Points, X: tx, Y: ty,
			Style: plot.Style{Color: plot.Blue, Marker: plot.Circle}})
	}
	dn, _, err := dd.Render()
	if err != nil {
		box.Add(v.TextEl("p", v.A("id", "plot-drawdown", "class", "ff-msg"), "This plot cannot be drawn: "+err.Error()))
		return box
	}
	droot := fromPlot(dn)
	droot.Set("id", "plot-drawdown")
	droot.Set("class", "ff-plot")
	return box.Add(v.El("figure", v.A("class", "ff-figure"), droot))
}
