package ui

import (
	"math"
	"strconv"
	"strings"

	"fieldfit/models/slug"
	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// The slug, infiltration and decay tests share one screen, driven by the
// descriptors below: the form's fields (with the units they can be typed
// in), its choices, the readings' columns and the models of the fit step.
// Only the fit itself (kinds_fit.go) knows each kind's package.

// Unit classes of a form field: which units it may be typed in.
const (
	classNone   = iota // a plain number (porosity, a factor, a coefficient)
	classSmall         // short lengths: radii, ring diameters
	classLength        // depths and thicknesses
	classVolume        // slug and refill volumes
	classFree          // a number in the user's own free-form unit (decay)
)

// classUnits lists the units a class offers; the first is the default in
// SI projects, usDefault the default in US customary ones.
var classUnits = [...][]string{
	classSmall:  {"cm", "mm", "m", "in", "ft"},
	classLength: {"m", "cm", "ft", "in"},
	classVolume: {"L", "m³", "US gal"},
}

var usDefault = [...]string{classSmall: "in", classLength: "ft", classVolume: "US gal"}

// kindField is a number of a kind's entry form.
type kindField struct {
	key, label string
	class      int
	// positive: the value must be greater than zero; otherwise ≥ 0 is
	// checked for lengths and nothing for plain numbers.
	positive bool
	hint     string
}

// kindChoice is a choice of a kind's entry form; opts nil makes it a
// free text (decay's value unit).
type kindChoice struct {
	key, label string
	opts       func(s *project.KindSetup) []option
}

func fixed(o ...option) func(*project.KindSetup) []option {
	return func(*project.KindSetup) []option { return o }
}

// kindDesc describes one kind of test for the shared screen.
type kindDesc struct {
	kind    project.TestKind
	noun    string // "Slug test"
	fields  []kindField
	choices []kindChoice
	models  []option // model id, label
	// valueLabel is the heading of the readings' value column;
	// refillCol says whether there is a refill column.
	valueLabel func(s *project.KindSetup) string
	refillCol  func(s *project.KindSetup) bool
	timeUnit   string // default time unit of the readings
	hint       string // what the readings are, in a sentence
}

var timeUnits = []option{{"s", "seconds"}, {"min", "minutes"}, {"h", "hours"}, {"d", "days"}}

var slugDesc = &kindDesc{
	kind: project.SlugTest, noun: "Slug test", timeUnit: "s",
	fields: []kindField{
		{key: "casing-radius", label: "Casing radius r_c (where the level moves)", class: classSmall, positive: true},
		{key: "well-radius", label: "Screen radius r_w (borehole with gravel pack)", class: classSmall, positive: true},
		{key: "screen-length", label: "Screen length Le (saturated part)", class: classLength, positive: true},
		{key: "screen-bottom", label: "Depth of the screen bottom below the static level, Lw", class: classLength, positive: true},
		{key: "thickness", label: "Aquifer thickness H (b), if known", class: classLength, positive: true},
		{key: "pack-porosity", label: "Gravel-pack porosity n", hint: "Used when the level moves within the packed screen."},
		{key: "static", label: "Static depth to water", class: classLength, hint: "Needed when the readings are depths to water."},
		{key: "h0", label: "Initial displacement H0", class: classLength, hint: "Used when H0 is typed; its sign follows the readings."},
		{key: "slug-volume", label: "Slug volume, if known", class: classVolume, positive: true, hint: "Gives the expected H0 as a check."},
		{key: "br-a", label: "Bouwer–Rice A read from the curves", hint: "Leave A, B, C empty to use the built-in fits (from memory, unverified)."},
		{key: "br-b", label: "Bouwer–Rice B read from the curves"},
		{key: "br-c", label: "Bouwer–Rice C read from the curves"},
	},
	choices: []kindChoice{
		{"readings", "Readings are", fixed(option{"depth", "depth to water below the measuring point"}, option{"displacement", "displacement from the static level"})},
		{"value-unit", "Readings typed in", fixed(option{"m", "m"}, option{"cm", "cm"}, option{"ft", "ft"}, option{"in", "in"})},
		{"time-unit", "Times typed in", fixed(timeUnits...)},
		{"h0-from", "Initial displacement H0", fixed(option{"first", "from the first reading"}, option{"typed", "as typed below"})},
		{"level-in-screen", "Water level moves", fixed(option{"casing", "in the casing"}, option{"screen", "within the gravel-packed screen"})},
		{"shape", "Hvorslev geometry", func(*project.KindSetup) []option {
			var o []option
			for _, s := range slug.Shapes() {
				o = append(o, option{strconv.Itoa(int(s)), s.String()})
			}
			return o
		}},
	},
	models: []option{
		{"hvorslev", "Hvorslev (1951) basic time lag"},
		{"bouwer-rice", "Bouwer–Rice (1976)"},
		{"cbp", "Cooper–Bredehoeft–Papadopulos (1967), confined"},
	},
	valueLabel: func(s *project.KindSetup) string {
		if s.Option("readings", "depth") == "depth" {
			return "Depth to water"
		}
		return "Displacement"
	},
	refillCol: func(*project.KindSetup) bool { return false },
	hint:      "Time since the slug went in or out (or the pressure was released), and the water level then.",
}

var infilDesc = &kindDesc{
	kind: project.InfiltrationTest, noun: "Infiltration test", timeUnit: "min",
	fields: []kindField{
		{key: "inner-diameter", label: "Inner ring diameter", class: classSmall, positive: true},
		{key: "outer-diameter", label: "Outer ring diameter (double ring)", class: classSmall, positive: true, hint: "Leave empty for a single ring."},
		{key: "safety", label: "Design safety factor of the local rules", positive: true, hint: "No default: the design rate is shown once you enter the factor your rules set."},
	},
	choices: []kindChoice{
		{"readings", "Readings are", fixed(option{"levels", "water levels (refills marked)"}, option{"volumes", "volumes added to keep the level"})},
		{"level-sense", "Levels read as", fixed(option{"depth", "depth of water in the ring"}, option{"down", "distance down from a reference to the water"})},
		{"value-unit", "Readings typed in", func(s *project.KindSetup) []option {
			if s.Option("readings", "levels") == "volumes" {
				return []option{{"L", "L"}, {"m³", "m³"}, {"US gal", "US gal"}}
			}
			return []option{{"mm", "mm"}, {"cm", "cm"}, {"in", "in"}}
		}},
		{"time-unit", "Times typed in", fixed(timeUnits...)},
		{"fit-curve", "Fit", fixed(option{"cumulative", "the cumulative infiltration F"}, option{"rate", "the infiltration rate f"})},
	},
	models: []option{
		{"horton", "Horton (1940)"}, {"philip", "Philip (1957) two-term"}, {"green-ampt", "Green–Ampt (1911)"},
		{"kostiakov", "Kostiakov (1932)"}, {"modified-kostiakov", "modified Kostiakov"},
	},
	valueLabel: func(s *project.KindSetup) string {
		if s.Option("readings", "levels") == "volumes" {
			return "Volume added"
		}
		return "Water level"
	},
	refillCol: func(s *project.KindSetup) bool { return s.Option("readings", "levels") != "volumes" },
	hint:      "Time since the first reading, and the water level (with the level after a refill, if the ring was refilled right after) or the volume added.",
}

var decayDesc = &kindDesc{
	kind: project.DecayTest, noun: "Decay curve", timeUnit: "min",
	fields: []kindField{
		{key: "y0", label: "Initial value y0 (when held fixed)", class: classFree},
		{key: "baseline", label: "Baseline y∞ (when held fixed)", class: classFree},
	},
	choices: []kindChoice{
		{"value-unit", "Unit of the values (free text, e.g. mg/L)", nil},
		{"time-unit", "Times typed in", fixed(timeUnits...)},
		{"y0-mode", "Initial value y0", fixed(option{"fit", "fitted"}, option{"fixed", "held at the value below"})},
		{"baseline-mode", "Baseline y∞", fixed(option{"fit", "fitted"}, option{"fixed", "held at the value below"})},
	},
	models: []option{{"decay-1", "first-order decay to a baseline"}, {"decay-2", "two-term exponential decay"}},
	valueLabel: func(s *project.KindSetup) string {
		return "Value"
	},
	refillCol: func(*project.KindSetup) bool { return false },
	hint:      "Time since the start, and the value read.",
}

// descFor returns the descriptor of a test's kind, nil for a pumping test.
func descFor(k project.TestKind) *kindDesc {
	switch k {
	case project.SlugTest:
		return slugDesc
	case project.InfiltrationTest:
		return infilDesc
	case project.DecayTest:
		return decayDesc
	}
	return nil
}

func (d *kindDesc) field(key string) *kindField {
	for i := range d.fields {
		if d.fields[i].key == key {
			return &d.fields[i]
		}
	}
	return nil
}

func (d *kindDesc) choice(key string) *kindChoice {
	for i := range d.choices {
		if d.choices[i].key == key {
			return &d.choices[i]
		}
	}
	return nil
}

// option returns the choice key of s, the first offered when unset or
// no longer offered.
func (d *kindDesc) option(s *project.KindSetup, key string) string {
	c := d.choice(key)
	if c == nil {
		return ""
	}
	v := s.Option(key, "")
	if c.opts == nil {
		return v
	}
	opts := c.opts(s)
	if key == "time-unit" && v == "" {
		return d.timeUnit
	}
	if optionsHave(opts, v) {
		return v
	}
	return opts[0].value
}

func (d *kindDesc) model(s *project.KindSetup) string {
	if optionsHave(d.models, s.Model) {
		return s.Model
	}
	return d.models[0].value
}

// fieldUnit is the unit a field is typed in: the one recorded with its
// entry, else the default of the unit system.
func fieldUnit(f *kindField, s *project.KindSetup, sys project.UnitSystem) (units.Unit, bool) {
	if f.class == classNone || f.class == classFree {
		return units.Unit{}, false
	}
	if u, ok := units.Lookup(s.Values[f.key].Unit); ok && optionsHaveStr(classUnits[f.class], u.Symbol) {
		return u, true
	}
	if sys == project.USCustomary {
		return mustUnit(usDefault[f.class]), true
	}
	return mustUnit(classUnits[f.class][0]), true
}

func optionsHaveStr(ss []string, s string) bool {
	for _, x := range ss {
		if x == s {
			return true
		}
	}
	return false
}

// kindEntry parses text typed in field f.
func kindEntry(f *kindField, s *project.KindSetup, sys project.UnitSystem, text string) project.Entry {
	if u, ok := fieldUnit(f, s, sys); ok {
		e, _ := entryFrom(text, u)
		return e
	}
	e := project.Entry{Text: text}
	if strings.TrimSpace(text) == "" {
		e.Text = ""
		return e
	}
	if v, err := parseNumber(text); err == nil {
		e.SI, e.OK = v, true
	}
	return e
}

// kindValue returns the SI value of a field and whether one was typed.
func kindValue(s *project.KindSetup, key string) (float64, bool) {
	e, ok := s.Values[key]
	if !ok || !e.OK {
		return 0, false
	}
	return e.SI, true
}

// fieldMessages returns the message of each field of the form: not a
// number, not positive, out of range.
func (d *kindDesc) fieldMessages(s *project.KindSetup) map[string]string {
	msgs := map[string]string{}
	for _, f := range d.fields {
		e := s.Values[f.key]
		switch {
		case e.Empty():
		case !e.OK:
			msgs[f.key] = strconv.Quote(strings.TrimSpace(e.Text)) + " is not a number."
		case f.positive && !(e.SI > 0):
			msgs[f.key] = "It must be greater than zero."
		case f.class == classSmall || f.class == classLength:
			if e.SI < 0 {
				msgs[f.key] = "A length cannot be negative."
			}
		}
	}
	if e := s.Values["pack-porosity"]; d == slugDesc && e.OK && (e.SI < 0 || e.SI >= 1) {
		msgs["pack-porosity"] = "The porosity must be from 0 up to (not including) 1."
	}
	return msgs
}

// ---- readings ----

// kindData are the usable readings of a kind test, in order: times (s)
// and values (SI for slug displacements; in the readings' own unit for
// infiltration, which its package converts; as typed for decay), the
// level after a refill (NaN when none) and the row each came from.
type kindData struct {
	T, V, Refill []float64
	Row          []int
	// FromLogger says that the readings are the conditioned logger record.
	FromLogger bool
}

// checkKindRows parses the typed rows of a kind test and returns the
// usable readings and, for each row, what is wrong with it (nil when
// nothing). A row with a message stays in the table and out of the fit.
func checkKindRows(d *kindDesc, s *project.KindSetup) (kindData, [][]string) {
	var data kindData
	msgs := make([][]string, len(s.Rows))
	tu := mustUnit(d.option(s, "time-unit"))
	var vu units.Unit
	hasVU := false
	if d != decayDesc && d != infilDesc {
		vu, hasVU = units.Lookup(d.option(s, "value-unit"))
	}
	static, hasStatic := kindValue(s, "static")
	depth := d == slugDesc && d.option(s, "readings") == "depth"
	refill := d.refillCol(s)
	prev, havePrev := 0.0, false
	for i, r := range s.Rows {
		if r.Blank() {
			continue
		}
		var m []string
		tv, err := parseNumber(r.Time)
		switch {
		case strings.TrimSpace(r.Time) == "":
			m = append(m, "Time missing.")
		case err != nil:
			m = append(m, "Time "+err.Error()+".")
		case tv < 0:
			m = append(m, "The time cannot be negative.")
		case havePrev && tv*tu.Factor <= prev:
			m = append(m, "Time "+formatPlain(tv)+" "+tu.Symbol+" is not after the row above.")
		}
		val, verr := parseNumber(r.Value)
		switch {
		case strings.TrimSpace(r.Value) == "":
			m = append(m, d.valueLabel(s)+" missing.")
		case verr != nil:
			m = append(m, d.valueLabel(s)+" "+verr.Error()+".")
		}
		rf := math.NaN()
		if refill && strings.TrimSpace(r.Refill) != "" {
			if v, err := parseNumber(r.Refill); err != nil {
				m = append(m, "Refill level "+err.Error()+".")
			} else {
				rf = v
			}
		} else if !refill && strings.TrimSpace(r.Refill) != "" {
			m = append(m, "A refill level belongs to level readings; it is not used with volumes.")
		}
		if depth && !hasStatic && verr == nil {
			m = append(m, "Enter the static depth to water on the Test tab: the displacement is the depth minus it.")
		}
		if len(m) > 0 {
			msgs[i] = m
			continue
		}
		t := tv * tu.Factor
		prev, havePrev = t, true
		if hasVU {
			val = vu.ToSI(val)
		}
		if depth {
			val -= static
		}
		data.T = append(data.T, t)
		data.V = append(data.V, val)
		data.Refill = append(data.Refill, rf)
		data.Row = append(data.Row, i)
	}
	return data, msgs
}

// setKindRow sets one cell ("time", "value" or "refill") of row i, i may
// be the empty row below the last; empty rows at the end are dropped.
func setKindRow(s *project.KindSetup, i int, field, text string) bool {
	if i < 0 || i > len(s.Rows) || (field != "time" && field != "value" && field != "refill") {
		return false
	}
	if i == len(s.Rows) {
		if text == "" {
			return true
		}
		s.Rows = append(s.Rows, project.KindRow{})
	}
	r := &s.Rows[i]
	switch field {
	case "time":
		r.Time = text
	case "value":
		r.Value = text
	default:
		r.Refill = text
	}
	for n := len(s.Rows); n > 0 && s.Rows[n-1].Blank(); n-- {
		s.Rows = s.Rows[:n-1]
	}
	return true
}

// pasteKindRows fills the rows from spreadsheet text (cells separated by
// tabs, rows by lines) from row i and column field on; a first line with
// no number is a heading and skipped. It returns the rows written and a
// sentence for the user.
func pasteKindRows(s *project.KindSetup, i int, field, text string) (int, string) {
	text = strings.ReplaceAll(strings.ReplaceAll(text, "\r\n", "\n"), "\r", "\n")
	lines := strings.Split(strings.TrimRight(text, "\n"), "\n")
	cols := []string{"time", "value", "refill"}
	c0 := 0
	for j, c := range cols {
		if c == field {
			c0 = j
		}
	}
	note := ""
	if len(lines) > 1 && isHeader(lines[0], project.ElapsedMinutes) {
		note = " Skipped the heading line " + strconv.Quote(lines[0]) + "."
		lines = lines[1:]
	}
	extra := 0
	for k, line := range lines {
		for len(s.Rows) <= i+k {
			s.Rows = append(s.Rows, project.KindRow{})
		}
		for j, cell := range strings.Split(line, "\t") {
			cell = strings.TrimSpace(cell)
			if c0+j < len(cols) {
				setKindRow(s, i+k, cols[c0+j], cell)
				for len(s.Rows) <= i+k {
					s.Rows = append(s.Rows, project.KindRow{})
				}
			} else if cell != "" {
				extra++
			}
		}
	}
	for n := len(s.Rows); n > 0 && s.Rows[n-1].Blank(); n-- {
		s.Rows = s.Rows[:n-1]
	}
	msg := "Pasted " + strconv.Itoa(len(lines)) + " rows." + note
	if extra > 0 {
		msg += " " + strconv.Itoa(extra) + " cells beyond the last column were not used."
	}
	return len(lines), msg
}

// ---- actions ----

// AddKindTest adds a slug test, infiltration test or decay curve to the
// open project and shows its form.
func (a *App) AddKindTest(kind project.TestKind) {
	a.mu.Lock()
	defer a.mu.Unlock()
	d := descFor(kind)
	if a.cur == nil || d == nil {
		return
	}
	n := 1
	for _, t := range a.cur.Tests {
		if t.Kind == kind {
			n++
		}
	}
	t := project.Test{ID: project.NewID(), Kind: kind, Name: d.noun + " " + strconv.Itoa(n),
		Readings: []project.Reading{}, Setup: &project.KindSetup{}}
	// The empty pumping test made when the Test tab was first opened
	// gives way to the first test of another kind.
	if ts := a.cur.Tests; len(ts) == 1 && ts[0].Kind == project.PumpingTest && len(ts[0].Readings) == 0 &&
		ts[0].Rate.Empty() && ts[0].StaticLevel.Empty() && ts[0].Logger == nil && ts[0].Result == nil {
		a.cur.Tests = ts[:0]
	}
	a.cur.Tests = append(a.cur.Tests, t)
	a.testIdx = len(a.cur.Tests) - 1
	a.fit = fitState{}
	a.tab = TabTest
	a.focus = "test-name"
	a.changedLocked()
}

// editKind applies edit to the setup of the selected kind test and
// refits (when the fit is automatic).
func (a *App) editKind(edit func(d *kindDesc, s *project.KindSetup, sys project.UnitSystem)) {
	a.editTest(func(t *project.Test) {
		d := descFor(t.Kind)
		if d == nil {
			return
		}
		if t.Setup == nil {
			t.Setup = &project.KindSetup{}
		}
		edit(d, t.Setup, a.cur.Units)
	}, true)
}

// SetKindField sets a number of the selected kind test's form from text
// typed in its current unit.
func (a *App) SetKindField(key, text string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, sys project.UnitSystem) {
		if f := d.field(key); f != nil {
			s.SetValue(key, kindEntry(f, s, sys, text))
		}
	})
}

// SetKindFieldUnit changes the unit a field is typed in; the text stays
// and is read in the new unit.
func (a *App) SetKindFieldUnit(key, unit string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, sys project.UnitSystem) {
		f := d.field(key)
		if f == nil || f.class == classNone || f.class == classFree || !optionsHaveStr(classUnits[f.class], unit) {
			return
		}
		e := s.Values[key]
		e.Unit = unit
		s.SetValue(key, e)
		s.SetValue(key, kindEntry(f, s, sys, e.Text))
	})
}

// SetKindOption makes a choice of the selected kind test's form; a
// value not offered is ignored.
func (a *App) SetKindOption(key, value string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) {
		c := d.choice(key)
		if c == nil || (c.opts != nil && !optionsHave(c.opts(s), value)) {
			return
		}
		s.SetOption(key, strings.TrimSpace(value))
	})
}

// SetKindModel chooses the model shown in the fit step.
func (a *App) SetKindModel(m string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) {
		if optionsHave(d.models, m) {
			s.Model = m
		}
	})
}

// SetKindRow sets a cell of the readings of the selected kind test.
func (a *App) SetKindRow(i int, field, text string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) { setKindRow(s, i, field, text) })
}

// PasteKindRows fills the readings from spreadsheet text; it reports
// whether the text was taken (more than one cell).
func (a *App) PasteKindRows(i int, field, text string) bool {
	if !IsPastable(text) {
		return false
	}
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) {
		if i >= 0 && i <= len(s.Rows) {
			_, a.notice = pasteKindRows(s, i, field, text)
		}
	})
	return true
}

// SetKindWindow sets one end ("start" or "end") of the fit window from
// text typed in the readings' time unit; text that is not a positive
// number is kept and leaves that side open.
func (a *App) SetKindWindow(side, text string) {
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) {
		sec := 0.0
		if v, err := parseNumber(text); err == nil && v > 0 {
			sec = v * mustUnit(d.option(s, "time-unit")).Factor
		}
		if side == "start" {
			s.WindowStartText, s.WindowStart = text, sec
		} else {
			s.WindowEndText, s.WindowEnd = text, sec
		}
	})
}

// ClearKindWindow fits every reading again.
func (a *App) ClearKindWindow() {
	a.editKind(func(d *kindDesc, s *project.KindSetup, _ project.UnitSystem) {
		s.WindowStart, s.WindowEnd, s.WindowStartText, s.WindowEndText = 0, 0, "", ""
	})
}

// setKindWindowLocked sets the window from a drag (seconds, any order).
func (a *App) setKindWindowLocked(t *project.Test, s0, s1 float64) {
	d := descFor(t.Kind)
	if d == nil || t.Setup == nil {
		return
	}
	if s1 < s0 {
		s0, s1 = s1, s0
	}
	s := t.Setup
	tu := mustUnit(d.option(s, "time-unit"))
	s.WindowStart, s.WindowEnd = s0, s1
	s.WindowStartText = strconv.FormatFloat(s0/tu.Factor, 'g', 3, 64)
	s.WindowEndText = strconv.FormatFloat(s1/tu.Factor, 'g', 3, 64)
	a.readingsChangedLocked()
}

// kindWindowMessage says what is wrong with the typed window, or "".
func kindWindowMessage(s *project.KindSetup) string {
	var msgs []string
	for _, w := range [][2]string{{"Start", s.WindowStartText}, {"End", s.WindowEndText}} {
		if strings.TrimSpace(w[1]) == "" {
			continue
		}
		if v, err := parseNumber(w[1]); err != nil {
			msgs = append(msgs, w[0]+" "+err.Error()+"; that side is left open.")
		} else if v <= 0 {
			msgs = append(msgs, w[0]+" must be greater than zero; that side is left open.")
		}
	}
	if s.WindowStart > 0 && s.WindowEnd > 0 && s.WindowEnd <= s.WindowStart {
		msgs = append(msgs, "The end of the window must be after its start.")
	}
	return strings.Join(msgs, " ")
}
