package ui

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// SetTab shows a section of the project screen. Opening the test,
// readings or fit tab of a project without a test creates one.
func (a *App) SetTab(tab string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	switch tab {
	case TabSite, TabWells, TabReport:
	case TabTest, TabReadings, TabFit, TabLogger:
		if a.cur != nil && len(a.cur.Tests) == 0 {
			a.addTestLocked()
		}
	default:
		return
	}
	a.tab = tab
}

// Tab returns the shown section of the project screen.
func (a *App) Tab() string {
	a.mu.Lock()
	defer a.mu.Unlock()
	return a.tab
}

// editProject applies edit to the open project and records the change.
func (a *App) editProject(edit func(p *project.Project, d Display), refit bool) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil {
		return
	}
	edit(a.cur, DisplayFor(a.cur.Units))
	if refit {
		a.readingsChangedLocked()
	} else {
		a.changedLocked()
	}
}

// SetProjectField sets "name", "site", "notes", "units" (si or us) or
// "thickness" (in the display length unit) of the open project.
func (a *App) SetProjectField(field, text string) {
	a.editProject(func(p *project.Project, d Display) {
		switch field {
		case "name":
			p.Name = text
		case "site":
			p.Site = text
		case "notes":
			p.Notes = text
		case "units":
			if u := project.UnitSystem(text); u.Valid() {
				p.Units = u
			}
		case "thickness":
			p.Thickness, _ = entryFrom(text, d.Length)
		}
	}, field == "thickness")
}

// AddWell adds a pumping or observation well and focuses its name.
func (a *App) AddWell(kind project.WellKind) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil || (kind != project.Pumping && kind != project.Observation) {
		return
	}
	n := 1
	for _, w := range a.cur.Wells {
		if w.Kind == kind {
			n++
		}
	}
	name := fmt.Sprintf("OW-%d", n)
	if kind == project.Pumping {
		name = fmt.Sprintf("PW-%d", n)
	}
	w := project.Well{ID: project.NewID(), Name: name, Kind: kind}
	a.cur.Wells = append(a.cur.Wells, w)
	i := len(a.cur.Wells) - 1
	// A test without its wells takes the new ones.
	for j := range a.cur.Tests {
		t := &a.cur.Tests[j]
		if kind == project.Pumping && t.PumpingWell == "" {
			t.PumpingWell = w.ID
		}
		if t.ObservationWell == "" {
			t.ObservationWell = w.ID
		} else if ow := a.cur.Well(t.ObservationWell); kind == project.Observation && ow != nil && ow.Kind == project.Pumping {
			t.ObservationWell = w.ID
		}
	}
	if kind == project.Pumping {
		a.focus = fmt.Sprintf("well-%d-radius", i)
	} else {
		a.focus = fmt.Sprintf("well-%d-distance", i)
	}
	a.readingsChangedLocked()
}

// wellFields are the number fields of a well, by the name used in ids.
var wellFields = []string{"radius", "screen-top", "screen-bottom", "mp", "distance"}

func wellEntry(w *project.Well, field string) *project.Entry {
	switch field {
	case "radius":
		return &w.Radius
	case "screen-top":
		return &w.ScreenTop
	case "screen-bottom":
		return &w.ScreenBottom
	case "mp":
		return &w.MPElevation
	case "distance":
		return &w.Distance
	}
	return nil
}

// SetWellField sets a field of well i: "name" or one of the number fields
// (typed in the display length unit).
func (a *App) SetWellField(i int, field, text string) {
	a.editProject(func(p *project.Project, d Display) {
		if i < 0 || i >= len(p.Wells) {
			return
		}
		w := &p.Wells[i]
		if field == "name" {
			w.Name = text
			return
		}
		if e := wellEntry(w, field); e != nil {
			*e, _ = entryFrom(text, d.Length)
		}
	}, field == "distance" || field == "radius")
}

// RemoveWell removes well i on the second press; the first press arms the
// button.
func (a *App) RemoveWell(i int) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil || i < 0 || i >= len(a.cur.Wells) {
		return
	}
	id := a.cur.Wells[i].ID
	if a.removeArm != id {
		a.removeArm = id
		return
	}
	a.removeArm = ""
	a.cur.RemoveWell(id)
	a.readingsChangedLocked()
}

// checkWell returns the messages of the fields of well w, by field.
func checkWell(w *project.Well, d Display) map[string]string {
	msgs := map[string]string{}
	for _, f := range wellFields {
		e := wellEntry(w, f)
		if !e.Empty() && !e.OK {
			if _, err := parseNumber(e.Text); err != nil {
				msgs[f] = capital(err.Error()) + "."
			}
		}
	}
	pos := func(f, what string) {
		if e := wellEntry(w, f); e.OK && e.SI <= 0 {
			msgs[f] = capital(what) + " must be greater than zero."
		}
	}
	pos("radius", "the radius")
	if w.Kind == project.Observation {
		pos("distance", "the distance")
		if w.Distance.Empty() {
			msgs["distance"] = "Needed for the fit: the distance r from the pumping well."
		}
	}
	if w.ScreenTop.OK && w.ScreenTop.SI < 0 {
		msgs["screen-top"] = "The depth of the screen top cannot be negative."
	}
	if w.ScreenTop.OK && w.ScreenBottom.OK && w.ScreenBottom.SI <= w.ScreenTop.SI {
		msgs["screen-bottom"] = fmt.Sprintf("The screen bottom (%s %s) must be deeper than its top (%s %s).",
			formatSig(d.Length.FromSI(w.ScreenBottom.SI), 4), d.Length.Symbol,
			formatSig(d.Length.FromSI(w.ScreenTop.SI), 4), d.Length.Symbol)
	}
	return msgs
}

func capital(s string) string {
	if s == "" {
		return s
	}
	if s[0] == '"' {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// addTestLocked adds a constant-rate test with the project's wells.
func (a *App) addTestLocked() {
	d := DisplayFor(a.cur.Units)
	t := project.Test{ID: project.NewID(), Name: fmt.Sprintf("Constant-rate test %d", len(a.cur.Tests)+1),
		TimeMode: project.ElapsedMinutes, DepthUnit: d.Length.Symbol, Readings: []project.Reading{},
		Rate: project.Entry{Unit: d.Rate.Symbol}}
	for _, w := range a.cur.Wells {
		if w.Kind == project.Pumping && t.PumpingWell == "" {
			t.PumpingWell = w.ID
		}
		if w.Kind == project.Observation && t.ObservationWell == "" {
			t.ObservationWell = w.ID
		}
	}
	if t.ObservationWell == "" {
		t.ObservationWell = t.PumpingWell
	}
	a.cur.Tests = append(a.cur.Tests, t)
	a.testIdx = len(a.cur.Tests) - 1
	a.fit = fitState{}
	a.changedLocked()
}

// AddTest adds a new test to the open project and shows its form.
func (a *App) AddTest() {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil {
		return
	}
	a.addTestLocked()
	a.tab = TabTest
	a.focus = "test-name"
}

// SelectTest shows test i of the open project.
func (a *App) SelectTest(i int) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.cur == nil || i < 0 || i >= len(a.cur.Tests) {
		return
	}
	a.testIdx = i
	a.fit = fitState{}
	a.endImportLocked()
	a.restorePlotLocked()
}

// startLayout is the layout of the datetime-local input.
const startLayout = "2006-01-02T15:04"

// SetTestField sets a field of the selected test: "name", "start"
// (yyyy-mm-ddThh:mm), "rate" (in the rate unit), "rate-unit", "static"
// (display length unit), "pumping-well", "obs-well" (well IDs),
// "time-mode" or "depth-unit".
func (a *App) SetTestField(field, text string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil {
		return
	}
	d := DisplayFor(a.cur.Units)
	switch field {
	case "name":
		t.Name = text
		a.changedLocked()
		return
	case "start":
		t.StartText = text
		if st, err := time.Parse(startLayout, strings.TrimSpace(text)); err == nil {
			t.Start = st
		} else if st, err := time.Parse(startLayout+":05", strings.TrimSpace(text)); err == nil {
			t.Start = st
		} else {
			t.Start = time.Time{}
		}
	case "rate":
		u := rateUnit(t, d)
		t.Rate, _ = entryFrom(text, u)
	case "rate-unit":
		if u, ok := units.Lookup(text); ok && u.Quantity == units.Rate {
			t.Rate, _ = entryFrom(t.Rate.Text, u)
			t.Rate.Unit = u.Symbol
		}
	case "static":
		t.StaticLevel, _ = entryFrom(text, d.Length)
	case "pumping-well":
		if w := a.cur.Well(text); w != nil || text == "" {
			t.PumpingWell = text
		}
	case "obs-well":
		if w := a.cur.Well(text); w != nil || text == "" {
			t.ObservationWell = text
		}
	case "time-mode":
		if m := project.TimeMode(text); m == project.ElapsedMinutes || m == project.ClockTime {
			t.TimeMode = m
		}
	case "depth-unit":
		if u, ok := units.Lookup(text); ok && u.Quantity == units.Length {
			t.DepthUnit = u.Symbol
		}
	default:
		return
	}
	a.readingsChangedLocked()
}

// rateUnit is the unit the rate of t is typed in.
func rateUnit(t *project.Test, d Display) units.Unit {
	if u, ok := units.Lookup(t.Rate.Unit); ok && u.Quantity == units.Rate {
		return u
	}
	return d.Rate
}

// testMessages returns the messages of the test form, by field.
func testMessages(p *project.Project, t *project.Test) map[string]string {
	msgs := map[string]string{}
	if strings.TrimSpace(t.StartText) != "" && t.Start.IsZero() {
		msgs["start"] = fmt.Sprintf("%q is not a date and time (yyyy-mm-dd hh:mm).", t.StartText)
	}
	if t.TimeMode == project.ClockTime && t.Start.IsZero() {
		msgs["start"] = "Clock times need the start date and time of pumping."
	}
	if !t.Rate.Empty() && !t.Rate.OK {
		msgs["rate"] = fmt.Sprintf("%q is not a number.", t.Rate.Text)
	} else if t.Rate.OK && t.Rate.SI <= 0 {
		msgs["rate"] = "The pumping rate must be greater than zero."
	}
	if !t.StaticLevel.Empty() && !t.StaticLevel.OK {
		msgs["static"] = fmt.Sprintf("%q is not a number.", t.StaticLevel.Text)
	}
	if t.ObservationWell == "" {
		msgs["obs-well"] = "Choose the well the readings are taken in (add wells on the Wells tab)."
	}
	return msgs
}

// ---- readings ----

// SetReading sets the text of a cell of the readings table; i may be the
// empty row below the last.
func (a *App) SetReading(i int, field, text string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil {
		return
	}
	t, commit := a.readingsTestLocked(t)
	if SetReading(t, i, field, text) {
		commit()
		a.readingsChangedLocked()
	}
}

// PasteReadings fills the table from spreadsheet text at row i, field; it
// reports whether the text was taken (more than one cell), so that the
// browser's own paste goes ahead otherwise.
func (a *App) PasteReadings(i int, field, text string) bool {
	if !IsPastable(text) {
		return false
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil {
		return false
	}
	t, commit := a.readingsTestLocked(t)
	if i < 0 || i > len(t.Readings) {
		return false
	}
	n, msg := PasteReadings(t, i, field, text)
	commit()
	a.notice = msg
	if n > 0 {
		a.focus = "r-" + strconv.Itoa(min(i+n, len(t.Readings))) + "-time"
	}
	a.readingsChangedLocked()
	return true
}

// EnterInReading moves on from a cell after Enter: from the time to the
// depth of the same row, from the depth to the time of the next row.
func (a *App) EnterInReading(i int, field string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if field == "time" {
		a.focus = fmt.Sprintf("r-%d-depth", i)
	} else {
		a.focus = fmt.Sprintf("r-%d-time", i+1)
	}
}

// Notice returns the last short notice.
func (a *App) Notice() string {
	a.mu.Lock()
	defer a.mu.Unlock()
	return a.notice
}
