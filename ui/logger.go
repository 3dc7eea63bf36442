package ui

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"fieldfit/models/units"
	"fieldfit/ui/fielddata"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// The two logger records a test can hold.
const (
	// WaterRecord is the water-level logger (depth, level or unvented
	// pressure).
	WaterRecord = "water"
	// BaroRecord is the barometric logger.
	BaroRecord = "baro"
)

// MaxLoggerFile is the largest logger file accepted, in bytes: far
// above a million readings (about 40 MB), well below what a tablet's
// browser can hold twice (the file and its columns).
const MaxLoggerFile = 256 << 20

// previewRows is the number of rows the import preview shows.
const previewRows = 8

// importPhase is where an import stands.
type importPhase int

const (
	phaseReading   importPhase = iota + 1 // the file is read into memory
	phasePreview                          // choices and mapping are shown
	phaseImporting                        // the whole file is converted
	phaseBadRows                          // some rows could not be read: skip or stop?
	phaseFailed                           // the file is not delimited text
)

// importState is a logger file on its way into the test: not part of
// the project until it is imported.
type importState struct {
	role, testID string
	file         string
	size         int64
	phase        importPhase
	progress     float64 // 0 to 1, of reading or of converting
	shown        float64 // the progress last rendered
	cancel       context.CancelFunc

	data   []byte // the whole file
	sample []byte // its first fielddata.SampleSize bytes
	det    *fielddata.Detected
	opt    fielddata.Options
	m      fielddata.Mapping // Values has at most one column
	zone   string            // the zone as typed
	mine   map[string]bool   // choices the user changed
	scan   *fielddata.DateOrderScan

	layout   *fielddata.Layout
	optErr   string
	preview  *fielddata.Record
	mapErr   string
	rec      *fielddata.Record // read, awaiting the bad-row decision
	badCount int
	err      string // phaseFailed: one sentence on why the file cannot be read
	msg      string // preview: why the last import attempt stopped
}

// Importing reports the phase of the logger import under way ("" when
// none): "reading", "preview", "importing", "bad-rows" or "failed".
func (a *App) Importing() string {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.imp == nil {
		return ""
	}
	return [...]string{"", "reading", "preview", "importing", "bad-rows", "failed"}[a.imp.phase]
}

// endImportLocked abandons the import under way, if any.
func (a *App) endImportLocked() {
	if a.imp != nil && a.imp.cancel != nil {
		a.imp.cancel()
	}
	a.imp = nil
	a.pick = ""
	delete(a.busy, "import")
}

// PickLoggerFile starts importing f as the test's water-level (role
// WaterRecord) or barometric (BaroRecord) record: the file is read in a
// goroutine, with progress, and sniffed; the preview follows.
func (a *App) PickLoggerFile(role string, f v.File) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil || f == nil || (role != WaterRecord && role != BaroRecord) {
		return
	}
	a.endImportLocked()
	imp := &importState{role: role, testID: t.ID, file: f.Name(), size: f.Size(), phase: phaseReading, mine: map[string]bool{}}
	a.imp = imp
	if imp.size > MaxLoggerFile {
		imp.phase = phaseFailed
		imp.err = fmt.Sprintf("This file is %s MB, more than the %d MB Fieldfit reads: split it, or export a shorter period.",
			formatSig(float64(imp.size)/1e6, 3), MaxLoggerFile>>20)
		return
	}
	ctx, cancel := context.WithCancel(context.Background())
	imp.cancel = cancel
	a.busy["import"] = "Reading " + imp.file + "…"
	go func() {
		defer a.recoverImport(imp)
		data, err := f.Read(ctx, func(done int64) { a.importProgress(imp, float64(done)/float64(max(imp.size, 1))) })
		var det *fielddata.Detected
		var scan *fielddata.DateOrderScan
		if err == nil {
			det, err = fielddata.Sniff(data[:min(len(data), fielddata.SampleSize)])
			if err == nil && det.Why.DateOrder.Confidence == fielddata.Unsure && det.Mapping.Time.Format != fielddata.Elapsed {
				// The sample leaves the date order open: read the date
				// column of the whole file before asking.
				scan, _ = fielddata.ScanDateOrder(ctx, bytes.NewReader(data), det.Options, det.Mapping)
			}
		}
		a.mu.Lock()
		defer func() {
			a.mu.Unlock()
			a.opt.Changed()
		}()
		if a.imp != imp {
			return
		}
		delete(a.busy, "import")
		imp.cancel = nil
		cancel()
		switch {
		case errors.Is(err, context.Canceled):
			a.imp = nil
			a.notice = "Reading " + imp.file + " was cancelled: nothing was added."
		case err != nil:
			imp.phase = phaseFailed
			imp.err = notTextMessage(err)
		default:
			imp.data, imp.sample = data, data[:min(len(data), fielddata.SampleSize)]
			a.sniffedLocked(imp, det, scan)
		}
	}()
}

// notTextMessage is the one sentence shown for a file that cannot be
// previewed.
func notTextMessage(err error) string {
	var nt *fielddata.NotTextError
	switch {
	case errors.As(err, &nt):
		return nt.Error()
	case errors.Is(err, fielddata.ErrEmpty):
		return "This file is empty: there are no readings in it."
	}
	return "This file cannot be read as delimited text (" + err.Error() + ")."
}

// recoverImport turns a panic in an import goroutine into the app's
// error banner and ends the import.
func (a *App) recoverImport(imp *importState) {
	if r := recover(); r != nil {
		a.mu.Lock()
		if a.imp == imp {
			a.imp = nil
		}
		delete(a.busy, "import")
		a.mu.Unlock()
		a.Recovered(r)
	}
}

// importProgress records progress and asks for a render at every
// percent.
func (a *App) importProgress(imp *importState, f float64) {
	a.mu.Lock()
	if a.imp != imp {
		a.mu.Unlock()
		return
	}
	imp.progress = f
	render := f-imp.shown >= 0.01 || f >= 1
	if render {
		imp.shown = f
	}
	a.mu.Unlock()
	if render {
		a.opt.Changed()
	}
}

// sniffedLocked takes Sniff's proposal: one value column (for the
// barometric record a pressure column), and the date order settled by
// the whole file when the sample could not.
func (a *App) sniffedLocked(imp *importState, det *fielddata.Detected, scan *fielddata.DateOrderScan) {
	imp.det = det
	imp.opt = det.Options
	imp.m = det.Mapping
	imp.m.Values = nil
	for _, vc := range det.Mapping.Values {
		if imp.role == BaroRecord && vc.Kind != fielddata.Pressure {
			continue
		}
		imp.m.Values = []fielddata.ValueColumn{vc}
		break
	}
	imp.zone = imp.m.Time.Zone
	if scan != nil {
		imp.scan = scan
		if scan.Order != "" {
			imp.m.Time.Order = scan.Order
		}
	}
	imp.phase = phasePreview
	a.refreshImportLocked(imp)
}

// refreshImportLocked cuts the sample again with the current choices and
// converts its first rows.
func (a *App) refreshImportLocked(imp *importState) {
	imp.optErr, imp.mapErr = "", ""
	imp.preview = nil
	lay, err := fielddata.Inspect(imp.sample, imp.opt)
	if err != nil {
		imp.optErr = settingSentence(err)
		return
	}
	imp.layout = lay
	if err := imp.m.Check(len(lay.Header)); err != nil {
		imp.mapErr = settingSentence(err)
		return
	}
	if imp.role == BaroRecord && imp.m.Values[0].Kind != fielddata.Pressure {
		imp.mapErr = "A barometric record is a column of air pressure: choose that column and the kind “pressure”."
		return
	}
	rec, err := fielddata.Preview(imp.sample, imp.opt, imp.m, previewRows)
	if err != nil {
		imp.mapErr = settingSentence(err)
		return
	}
	imp.preview = rec
}

// settingSentence writes a fielddata error as a sentence.
func settingSentence(err error) string {
	var se *fielddata.SettingError
	if errors.As(err, &se) {
		msg := se.Err.Error()
		for _, s := range []error{fielddata.ErrMapping, fielddata.ErrOption, fielddata.ErrSetting} {
			msg = strings.TrimPrefix(msg, s.Error()+": ")
		}
		field := strings.NewReplacer("values[0].", "value column ", "time.", "time ", "clockColumn", "clock column").Replace(se.Field)
		if se.Value != "" {
			return capital(fmt.Sprintf("%s (%s): %s.", field, se.Value, msg))
		}
		return capital(field + ": " + msg + ".")
	}
	return capital(strings.TrimSuffix(err.Error(), ".") + ".")
}

// importChoice names a choice of the preview in Detected.Why terms.
func (imp *importState) why(choice string) string {
	if imp.mine[choice] {
		return "chosen by you"
	}
	if imp.det == nil {
		return ""
	}
	w := imp.det.Why
	g := map[string]fielddata.Guess{"encoding": w.Encoding, "delimiter": w.Delimiter, "decimal": w.Decimal,
		"rows": w.Layout, "time": w.Time, "order": w.DateOrder, "zone": w.Zone}[choice]
	if choice == "order" && imp.scan != nil {
		g = imp.scan.Why
	}
	if choice == "value" && len(imp.m.Values) > 0 {
		for _, c := range imp.det.Columns {
			if c.Index == imp.m.Values[0].Column {
				g = c.Why
			}
		}
	}
	if g.Reason == "" {
		return ""
	}
	return g.Confidence.String() + ": " + g.Reason
}

// dateQuestion returns the question on the date order when the file
// leaves it open, or "".
func (imp *importState) dateQuestion() string {
	if imp.m.Time.Format == fielddata.Elapsed || imp.m.Time.Order != "" || imp.det == nil {
		return ""
	}
	g := imp.det.Why.DateOrder
	if imp.scan != nil {
		g = imp.scan.Why
	}
	if g.Confidence != fielddata.Unsure {
		return ""
	}
	return "Which comes first in the dates of this file, the day or the month? " + capital(g.Reason) + "."
}

// SetImportOption changes how the file is read: "encoding",
// "delimiter", "decimal", "header-row", "units-row" or "data-row" (line
// numbers, 0 or empty for none).
func (a *App) SetImportOption(field, text string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	imp := a.imp
	if imp == nil || imp.phase != phasePreview {
		return
	}
	o := &imp.opt
	line := func() int {
		n, err := strconv.Atoi(strings.TrimSpace(text))
		if err != nil || n < 0 {
			return 0
		}
		return n
	}
	switch field {
	case "encoding":
		o.Encoding = fielddata.Encoding(text)
		imp.mine["encoding"] = true
	case "delimiter":
		o.Delimiter = fielddata.Delimiter(text)
		imp.mine["delimiter"] = true
	case "decimal":
		o.Decimal = fielddata.DecimalMark(text)
		imp.mine["decimal"] = true
	case "header-row":
		o.HeaderRow = line()
		imp.mine["rows"] = true
	case "units-row":
		o.UnitsRow = line()
		imp.mine["rows"] = true
	case "data-row":
		o.DataRow = line()
		imp.mine["rows"] = true
	default:
		return
	}
	imp.msg = ""
	a.refreshImportLocked(imp)
}

// SetImportMapping changes the column mapping: "time-format"
// (datetime, date+clock, elapsed), "time-col", "clock-col" (column
// numbers from 0), "time-unit" (s, min, h, d), "date-order" (day-first,
// month-first or "" to be asked), "zone" (a UTC offset), "value-col",
// "kind" (depth, level, pressure), "unit" or "density" (kg/m³, empty for
// the default).
func (a *App) SetImportMapping(field, text string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	imp := a.imp
	if imp == nil || imp.phase != phasePreview {
		return
	}
	m := &imp.m
	col := func() (int, bool) {
		n, err := strconv.Atoi(strings.TrimSpace(text))
		return n, err == nil && n >= 0
	}
	switch field {
	case "time-format":
		m.Time.Format = fielddata.TimeFormat(text)
		if m.Time.Format == fielddata.DateAndClock && m.Time.ClockColumn == m.Time.Column {
			m.Time.ClockColumn = m.Time.Column + 1
		}
		imp.mine["time"] = true
	case "time-col":
		if n, ok := col(); ok {
			m.Time.Column = n
			imp.mine["time"] = true
		}
	case "clock-col":
		if n, ok := col(); ok {
			m.Time.ClockColumn = n
			imp.mine["time"] = true
		}
	case "time-unit":
		m.Time.Unit = text
		imp.mine["time"] = true
	case "date-order":
		m.Time.Order = fielddata.DateOrder(text)
		imp.mine["order"] = true
	case "zone":
		imp.zone = text
		imp.mine["zone"] = true
		if off, ok := parseOffset(text); ok {
			m.Time.Zone = offsetText(off)
		}
	case "value-col":
		n, ok := col()
		if !ok {
			return
		}
		vc := fielddata.ValueColumn{Column: n, Kind: fielddata.Level, Unit: "m"}
		if imp.role == BaroRecord {
			vc.Kind, vc.Unit = fielddata.Pressure, "mbar"
		}
		if len(m.Values) > 0 {
			vc.Kind, vc.Unit = m.Values[0].Kind, m.Values[0].Unit
		}
		for _, c := range imp.detectedColumns() {
			if c.Index != n {
				continue
			}
			switch c.Role {
			case fielddata.RoleDepth:
				vc.Kind = fielddata.Depth
			case fielddata.RoleLevel:
				vc.Kind = fielddata.Level
			case fielddata.RolePressure:
				vc.Kind = fielddata.Pressure
			}
			if c.Unit != "" {
				vc.Unit = c.Unit
			}
		}
		if !unitFits(vc.Kind, vc.Unit) {
			vc.Unit = defaultUnit(vc.Kind)
		}
		m.Values = []fielddata.ValueColumn{vc}
		imp.mine["value"] = true
	case "kind", "unit":
		if len(m.Values) == 0 {
			return
		}
		vc := &m.Values[0]
		if field == "kind" {
			vc.Kind = fielddata.ValueKind(text)
			if !unitFits(vc.Kind, vc.Unit) {
				vc.Unit = defaultUnit(vc.Kind)
			}
		} else {
			vc.Unit = text
		}
		imp.mine["value"] = true
	case "density":
		m.Density = 0
		if s := strings.TrimSpace(text); s != "" {
			d, err := parseNumber(s)
			if err != nil {
				d = -1 // refused by Mapping.Check with its message
			}
			m.Density = d
		}
	default:
		return
	}
	imp.msg = ""
	a.refreshImportLocked(imp)
}

// detectedColumns returns the columns as Sniff described them, when the
// reading options are still Sniff's (else the columns have moved).
func (imp *importState) detectedColumns() []fielddata.ColumnInfo {
	if imp.det == nil || imp.opt != imp.det.Options {
		return nil
	}
	return imp.det.Columns
}

// kindUnits are the units offered for each kind of value column.
var kindUnits = map[fielddata.ValueKind][]string{
	fielddata.Depth:    {"m", "cm", "mm", "ft", "in"},
	fielddata.Level:    {"m", "cm", "mm", "ft", "in"},
	fielddata.Pressure: {"kPa", "Pa", "hPa", "mbar", "bar", "psi", "m H₂O", "cm H₂O", "ft H₂O", "in H₂O"},
}

func unitFits(k fielddata.ValueKind, unit string) bool {
	u, ok := units.Lookup(unit)
	if !ok {
		return false
	}
	return slices.Contains(kindUnits[k], u.Symbol) || (k == fielddata.Pressure && u.Quantity == units.Length)
}

func defaultUnit(k fielddata.ValueKind) string {
	if us := kindUnits[k]; len(us) > 0 {
		return us[0]
	}
	return "m"
}

// UseDeviceOffset sets the time zone of the import to the device's
// current UTC offset.
func (a *App) UseDeviceOffset() {
	_, off := a.opt.Now().Zone()
	a.SetImportMapping("zone", offsetText(off))
}

// StartImport converts the whole file with the current choices, in a
// goroutine with progress; it can be cancelled.
func (a *App) StartImport() {
	a.mu.Lock()
	defer a.mu.Unlock()
	imp := a.imp
	if imp == nil || imp.phase != phasePreview || imp.optErr != "" || imp.mapErr != "" {
		return
	}
	ctx, cancel := context.WithCancel(context.Background())
	imp.cancel = cancel
	imp.phase, imp.progress, imp.shown, imp.msg = phaseImporting, 0, 0, ""
	a.busy["import"] = "Importing " + imp.file + "…"
	data, opt, m := imp.data, imp.opt, imp.m
	go func() {
		defer a.recoverImport(imp)
		rec, err := fielddata.Import(ctx, bytes.NewReader(data), opt, m, &fielddata.ImportSettings{
			Size: int64(len(data)), MaxListed: project.MaxListedBadRows,
			Progress: func(f float64) { a.importProgress(imp, f) }})
		a.mu.Lock()
		defer func() {
			a.mu.Unlock()
			a.opt.Changed()
		}()
		if a.imp != imp {
			return
		}
		delete(a.busy, "import")
		imp.cancel = nil
		cancel()
		imp.phase = phasePreview
		var bad *fielddata.BadRowsError
		var re *fielddata.RowError
		switch {
		case errors.Is(err, context.Canceled):
			imp.msg = "The import was cancelled: nothing was added."
		case errors.As(err, &bad) && rec != nil && rec.Len() > 0:
			imp.phase, imp.rec, imp.badCount = phaseBadRows, rec, bad.Count
		case errors.As(err, &bad):
			imp.msg = fmt.Sprintf("None of the rows could be read with these choices (%d tried; the first: %s). Check the columns and their units.", bad.Count, bad.First)
		case errors.Is(err, fielddata.ErrDateOrder) && errors.As(err, &re):
			imp.msg = fmt.Sprintf("Row %d: %q %s.", re.Row, re.Value, fielddata.ErrDateOrder)
		case errors.Is(err, fielddata.ErrNoData):
			imp.msg = "No readings could be read with these choices: check the header and first data rows."
		case err != nil:
			imp.msg = "The import stopped: " + settingSentence(err)
		default:
			a.commitImportLocked(imp, rec, false)
		}
	}()
}

// CancelImport stops reading or importing the file; in the preview it
// drops the file.
func (a *App) CancelImport() {
	a.mu.Lock()
	defer a.mu.Unlock()
	imp := a.imp
	if imp == nil {
		return
	}
	switch imp.phase {
	case phaseReading, phaseImporting:
		if imp.cancel != nil {
			imp.cancel() // the goroutine reports
		}
	default:
		a.endImportLocked()
	}
}

// SkipBadRows keeps the record without the rows that could not be read
// (listed with the record).
func (a *App) SkipBadRows() {
	a.mu.Lock()
	defer a.mu.Unlock()
	if imp := a.imp; imp != nil && imp.phase == phaseBadRows {
		a.commitImportLocked(imp, imp.rec, true)
	}
}

// StopAtBadRows gives up the import: nothing is added; the preview
// stays for another try.
func (a *App) StopAtBadRows() {
	a.mu.Lock()
	defer a.mu.Unlock()
	if imp := a.imp; imp != nil && imp.phase == phaseBadRows {
		imp.phase, imp.rec = phasePreview, nil
		imp.msg = "The import was stopped at the unreadable rows: nothing was added. Change the choices above, or fix the file and pick it again."
	}
}

// commitImportLocked puts an imported record into its test.
func (a *App) commitImportLocked(imp *importState, rec *fielddata.Record, skipped bool) {
	t := a.cur.Test(imp.testID)
	a.imp = nil
	if t == nil || rec == nil || len(rec.Columns) == 0 {
		return
	}
	col := rec.Columns[0]
	lr := &project.LoggerRecord{ID: project.NewID(), File: imp.file, Size: imp.size, Imported: a.opt.Now().UTC(),
		Options: rec.Options, Mapping: rec.Mapping, Name: col.Name, Kind: col.Kind, Unit: col.Unit, Density: col.Density,
		Clock: rec.Clock, Time: slices.Clip(rec.Time), Value: slices.Clip(col.Values), Lines: rec.Lines,
		Checks: project.TimeChecks{Duplicates: rec.Checks.DuplicateCount, Gaps: rec.Checks.GapCount,
			Backward: rec.Checks.BackwardCount, Interval: rec.Checks.Interval}}
	lr.Preamble = rec.Preamble[:min(len(rec.Preamble), 50)]
	lr.Bad.Count, lr.Bad.Skipped = rec.BadCount, skipped && rec.BadCount > 0
	for _, e := range rec.Bad[:min(len(rec.Bad), project.MaxListedBadRows)] {
		lr.Bad.Listed = append(lr.Bad.Listed, badRow(e))
	}
	if t.Logger == nil {
		t.Logger = &project.LoggerData{}
	}
	lg := t.Logger
	c := &lg.Conditioning
	if imp.role == BaroRecord {
		lg.Baro = lr
		if lg.Water != nil && lg.Water.Kind == fielddata.Pressure && c.Baro == nil {
			c.Baro = &fielddata.BaroCompensation{}
		}
		if c.Baro != nil {
			c.Baro.Record = lr.File
		}
	} else {
		first := lg.Water == nil
		lg.Water = lr
		if first {
			// Defaults of a first import: drawdown from the mean of the
			// readings before the start, thinned to 20 per log cycle,
			// compensated when a barometric record is there.
			if c.Static == nil {
				c.Static = &fielddata.Static{}
			}
			if c.Thin == nil {
				c.Thin = &fielddata.Thinning{}
			}
			// Elapsed times count from the pump start when the file
			// has readings on both sides of 0.
			if n := lr.Len(); !lr.Clock && c.Start == nil && n > 0 && lr.Time[0] < 0 && lr.Time[n-1] > 0 {
				zero := 0.0
				c.Start, lg.Texts.Start = &zero, "0"
			}
		}
		if lr.Kind == fielddata.Pressure && lg.Baro != nil && c.Baro == nil && first {
			c.Baro = &fielddata.BaroCompensation{Record: lg.Baro.File}
		}
		if lr.Kind != fielddata.Pressure {
			c.Baro = nil
		}
		if t.Source == "" && len(t.Readings) == 0 {
			t.Source = project.FromLogger
		}
	}
	a.notice = fmt.Sprintf("Imported %s from %s.", countWord(lr.Len(), "reading"), lr.File)
	if lr.Bad.Skipped {
		a.notice += fmt.Sprintf(" %s skipped (listed on the Logger data tab).", countWord(lr.Bad.Count, "unreadable row"))
	}
	a.readingsChangedLocked()
}

func badRow(e *fielddata.RowError) project.BadRow {
	why := e.Err.Error()
	return project.BadRow{Row: e.Row, Column: e.Name, Value: e.Value, Why: why}
}

func countWord(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return groupDigits(n) + " " + word + "s"
}

// groupDigits writes n with thin groups of three digits as CountText
// does ("12 400").
func groupDigits(n int) string {
	s := fielddata.CountText(n, 0)
	s, _, _ = strings.Cut(s, " →")
	return s
}

// RemoveLoggerRecord removes the test's water-level or barometric
// record (the conditioning settings stay, for a new import).
func (a *App) RemoveLoggerRecord(role string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	t := a.currentTest()
	if t == nil || t.Logger == nil {
		return
	}
	lg := t.Logger
	switch role {
	case WaterRecord:
		if lg.Water == nil {
			return
		}
		a.notice = "Removed the water-level record " + lg.Water.File + "."
		lg.Water = nil
	case BaroRecord:
		if lg.Baro == nil {
			return
		}
		a.notice = "Removed the barometric record " + lg.Baro.File + "."
		lg.Baro = nil
		lg.Conditioning.Baro, lg.Conditioning.Efficiency = nil, nil
	default:
		return
	}
	a.readingsChangedLocked()
}

// SetSource chooses the readings the test's fit uses: "tape" (the
// readings table) or "logger" (the conditioned logger record).
func (a *App) SetSource(s string) {
	a.editTest(func(t *project.Test) {
		switch project.Source(s) {
		case project.FromTape, project.FromLogger:
			t.Source = project.Source(s)
		}
	}, true)
}

// ---- time zones as fixed UTC offsets ----

// parseOffset reads a UTC offset: "", "UTC", "Z" (0), "+02:00", "-0530",
// "+2", "UTC+2", "GMT-05:00". Zone names are refused: the offline app
// has no zone database (time/tzdata is too big for the bundle).
func parseOffset(s string) (int, bool) {
	s = strings.TrimSpace(strings.ReplaceAll(s, "−", "-"))
	u := strings.ToUpper(s)
	switch u {
	case "", "UTC", "Z", "GMT":
		return 0, true
	}
	if strings.HasPrefix(u, "UTC") || strings.HasPrefix(u, "GMT") {
		s = strings.TrimSpace(s[3:])
	}
	if s == "" || (s[0] != '+' && s[0] != '-') {
		return 0, false
	}
	sign := 1
	if s[0] == '-' {
		sign = -1
	}
	body := s[1:]
	var h, m int
	var err error
	switch {
	case strings.Contains(body, ":"):
		hs, ms, _ := strings.Cut(body, ":")
		if len(ms) != 2 {
			return 0, false
		}
		if h, err = strconv.Atoi(hs); err != nil {
			return 0, false
		}
		if m, err = strconv.Atoi(ms); err != nil {
			return 0, false
		}
	case len(body) == 4:
		if h, err = strconv.Atoi(body[:2]); err != nil {
			return 0, false
		}
		if m, err = strconv.Atoi(body[2:]); err != nil {
			return 0, false
		}
	case len(body) >= 1 && len(body) <= 2:
		if h, err = strconv.Atoi(body); err != nil {
			return 0, false
		}
	default:
		return 0, false
	}
	if h < 0 || h > 14 || m < 0 || m > 59 || strings.ContainsAny(body, "+- ") {
		return 0, false
	}
	return sign * (h*3600 + m*60), true
}

// offsetText writes an offset as "+02:00" ("" for UTC, as
// fielddata.TimeColumns.Zone takes it).
func offsetText(off int) string {
	if off == 0 {
		return ""
	}
	sign := "+"
	if off < 0 {
		sign, off = "-", -off
	}
	return fmt.Sprintf("%s%02d:%02d", sign, off/3600, off/60%60)
}

// zoneLabel names an offset for the screen: "UTC" or "UTC+02:00".
func zoneLabel(zone string) string {
	off, ok := parseOffset(zone)
	if !ok {
		return zone
	}
	if off == 0 {
		return "UTC"
	}
	return "UTC" + offsetText(off)
}
