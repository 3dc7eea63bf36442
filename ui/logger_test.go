package ui

import (
	"bytes"
	"context"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"fieldfit/models"
	"fieldfit/ui/fielddata"
	"fieldfit/ui/project"
	v "fieldfit/ui/view"
)

// memFile is a picked file held in memory. Read hands it out in chunks
// with progress, as the browser's File API does; with block set it waits
// for block (or the context) first.
type memFile struct {
	name  string
	data  []byte
	block chan struct{}
	reads atomic.Int32
}

func (f *memFile) Name() string { return f.name }
func (f *memFile) Size() int64  { return int64(len(f.data)) }
func (f *memFile) Read(ctx context.Context, progress func(int64)) ([]byte, error) {
	f.reads.Add(1)
	if f.block != nil {
		select {
		case <-ctx.Done():
			return nil, ctx.Err()
		case <-f.block:
		}
	}
	const chunk = 1000
	for off := 0; off < len(f.data); off += chunk {
		if progress != nil {
			progress(int64(min(off+chunk, len(f.data))))
		}
	}
	return bytes.Clone(f.data), nil
}

// loggerFixture is a file of testdata/fielddata (written by
// make_fixtures.py: an invented site and invented loggers).
func loggerFixture(t *testing.T, name string) *memFile {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "testdata", "fielddata", name))
	if err != nil {
		t.Fatal(err)
	}
	return &memFile{name: name, data: b}
}

// pick chooses a file in the file input with the given id.
func (h *harness) pick(id string, f v.File) {
	h.t.Helper()
	if !h.byID(id).Fire("change", &v.Event{Files: []v.File{f}}) {
		h.t.Fatalf("#%s has no change handler", id)
	}
	h.settle()
}

// loggerTest makes a project with a pumping well, an observation well at
// 20 m and a test at 5 L/s, and opens the Logger data tab.
func loggerTest(h *harness) {
	h.t.Helper()
	h.click("new-project")
	h.input("project-name", "Larkspur Flats")
	h.click("tab-wells")
	h.click("add-pumping-well")
	h.input("well-0-radius", "0.1")
	h.click("add-observation-well")
	h.input("well-1-distance", "20")
	h.click("tab-test")
	h.input("test-rate", "5")
	h.click("tab-logger")
}

func (h *harness) test0() project.Test {
	return h.app.Current().Tests[0]
}

// importFixture picks a fixture, answers the zone question with +02:00
// when the file asks it, and imports it.
func (h *harness) importFixture(input, name string) {
	h.t.Helper()
	h.pick(input, loggerFixture(h.t, name))
	if got := h.app.Importing(); got != "preview" {
		h.t.Fatalf("%s: phase %q after picking, want preview; %s", name, got, h.render())
	}
	if h.render().ByID("imp-zone") != nil {
		h.input("imp-zone", "+02:00")
	}
	h.click("import-start")
	if got := h.app.Importing(); got != "" {
		h.t.Fatalf("%s: phase %q after importing; %s", name, got, h.render().ByID("import-panel"))
	}
}

// TestLoggerPressureAndBaro is the main path: an unvented logger in kPa
// and a barometric logger in mbar (pressure-kpa.csv, baro-mbar.csv),
// conditioned and fitted.
func TestLoggerPressureAndBaro(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	var changed atomic.Int32
	h.app.opt.Changed = func() { changed.Add(1) }
	h.pick("logger-file", loggerFixture(t, "pressure-kpa.csv"))
	if n := changed.Load(); n < 3 {
		t.Errorf("reading the file asked for %d renders; progress needs more", n)
	}
	// The detected choices, each with its reason.
	for id, want := range map[string]string{"imp-delimiter": "comma", "imp-decimal": "point", "imp-encoding": "utf-8",
		"imp-time-format": "datetime", "imp-value-col": "1", "imp-kind": "pressure", "imp-unit": "kPa"} {
		if got := h.byID(id).Attrs["value"]; got != want {
			t.Errorf("#%s = %q, want %q", id, got, want)
		}
	}
	if got := h.byID("imp-header-row").Attrs["value"]; got != "4" {
		t.Errorf("header row %q, want 4", got)
	}
	for _, id := range []string{"imp-why-delimiter", "imp-why-decimal", "imp-why-encoding", "imp-why-time", "imp-why-zone"} {
		if h.text(id) == "" {
			t.Errorf("#%s gives no reason", id)
		}
	}
	// The preamble gives the clock's offset; the first preview row is
	// 07:00 at UTC+02:00 with the head of 164.972 kPa of water.
	if got := h.byID("imp-zone").Attrs["value"]; got != "UTC+02:00" || !strings.Contains(h.text("imp-why-zone"), "line 3") {
		t.Errorf("zone %q (%s), want UTC+02:00 from line 3 of the preamble", got, h.text("imp-why-zone"))
	}
	if got := h.text("imp-preview"); !strings.Contains(got, "2024-05-14 07:00:00") || !strings.Contains(got, "16.8230") {
		// 164.972 kPa / (999.97 kg/m³ · 9.80665 m/s²) = 16.82297 m
		// (reference §9 constants; hand computation).
		t.Errorf("preview %q", got)
	}
	h.click("import-start")
	lg := h.test0().Logger
	if lg == nil || lg.Water == nil || lg.Water.Len() != 301 || lg.Water.Kind != fielddata.Pressure || !lg.Water.Clock {
		t.Fatalf("water record %+v", lg)
	}
	if h.test0().Source != project.FromLogger {
		t.Errorf("source %q: a test without tape readings fits its logger record", h.test0().Source)
	}
	// The barometric record; compensation turns itself on.
	h.importFixture("baro-file", "baro-mbar.csv")
	lg = h.test0().Logger
	if lg.Baro == nil || lg.Baro.Len() != 65 || lg.Conditioning.Baro == nil || lg.Conditioning.Baro.Record != "baro-mbar.csv" {
		t.Fatalf("barometric record %+v, compensation %+v", lg.Baro, lg.Conditioning.Baro)
	}
	// The pump ran from 08:00 to 11:00 local time (make_fixtures.py).
	h.input("cond-start", "2024-05-14 08:00")
	h.input("cond-stop", "2024-05-14 11:00:00")
	h.input("cond-trend", "true")
	if got := h.text("cond-summary"); !strings.Contains(got, "Before pumping: 60 readings · pumping: 181 readings · recovery: 60 readings") {
		t.Errorf("summary %q", got)
	}
	// Static 6.500 m of head above the sensor (the generator's).
	if got := h.text("cond-summary"); !strings.Contains(got, "6.5000 m") {
		t.Errorf("static level not 6.500 m: %q", got)
	}
	res, err := conditionTest(&lg2(h).Tests[0])
	if err != nil {
		t.Fatal(err)
	}
	want := fielddata.CountText(241, res.Pumping.Kept()+res.Recovery.Kept())
	if got := h.text("thin-count"); got != want || res.Pumping.Kept() >= 181 {
		t.Errorf("#thin-count %q, want %q", got, want)
	}
	// The drawdowns are the generator's, s = 0.8 log10(1 + t/60 s), to
	// the rounding of the file (0.001 kPa).
	for i, e := range res.Pumping.Elapsed {
		if s := 0.8 * math.Log10(1+e/60); math.Abs(res.Pumping.Drawdown[i]-s) > 3e-4 {
			t.Errorf("t = %v s: s = %.5f, want %.5f", e, res.Pumping.Drawdown[i], s)
		}
	}
	// Fit: the page's T and S are models.Fit's on the thinned pumping
	// readings after the start.
	h.click("tab-fit")
	h.click("fit")
	th := res.Pumping.Thinned()
	var ts, ss []float64
	for i, e := range th.Elapsed {
		if e > 0 {
			ts, ss = append(ts, e), append(ss, th.Drawdown[i])
		}
	}
	ref, err := models.Fit(models.Theis{Q: 5e-3, R: 20}, models.Data{Time: ts, Value: ss}, nil)
	if err != nil {
		t.Fatal(err)
	}
	r := h.test0().Result
	if r == nil || math.Abs(r.T.Value-ref.Params[0]) > 1e-9*ref.Params[0] || math.Abs(r.S.Value-ref.Params[1]) > 1e-9*ref.Params[1] || r.N != len(ts) {
		t.Fatalf("fit %+v, models.Fit %v on %d readings; status %q", r, ref.Params, len(ts), h.text("fit-status"))
	}
	// Loose check against the generator: its late slope is 0.8 m per log
	// cycle, so Cooper–Jacob gives T = 2.3 Q/(4π · 0.8 m) (the fixture's
	// curve is not a Theis curve, hence 15 %).
	if cj := 2.303 * 5e-3 / (4 * math.Pi * 0.8); math.Abs(r.T.Value-cj) > 0.15*cj {
		t.Errorf("T = %v m²/s, the generator's slope gives %v", r.T.Value, cj)
	}
	// Without the compensation the barometric swing (±1.5 mbar) is back:
	// the drawdowns move.
	h.click("tab-logger")
	h.input("cond-baro", "false")
	raw, _ := conditionTest(&lg2(h).Tests[0])
	worst := 0.0
	for i, e := range raw.Pumping.Elapsed {
		worst = math.Max(worst, math.Abs(raw.Pumping.Drawdown[i]-0.8*math.Log10(1+e/60)))
	}
	if worst < 5e-3 {
		t.Errorf("without compensation the drawdown is within %v m of the generator", worst)
	}
	// Everything is stored.
	st := h.stored(h.app.Current().ID).Tests[0].Logger
	if st == nil || st.Water.Len() != 301 || st.Baro.Len() != 65 || st.Conditioning.Baro != nil || st.Conditioning.Trend == nil ||
		st.Texts.Start != "2024-05-14 08:00" || !reflect.DeepEqual(st.Water.Time, lg.Water.Time) {
		t.Errorf("stored logger data %+v", st)
	}
}

// lg2 returns the open project (a copy).
func lg2(h *harness) *project.Project { return h.app.Current() }

// TestLoggerSemicolonComma: semicolons, decimal commas, a date column and
// a clock column, day-first dates, depths to water.
func TestLoggerSemicolonComma(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.pick("logger-file", loggerFixture(t, "semicolon-comma.csv"))
	for id, want := range map[string]string{"imp-delimiter": "semicolon", "imp-decimal": "comma", "imp-time-format": "date+clock",
		"imp-time-col": "0", "imp-clock-col": "1", "imp-date-order": "day-first", "imp-kind": "depth", "imp-unit": "m"} {
		if got := h.byID(id).Attrs["value"]; got != want {
			t.Errorf("#%s = %q, want %q", id, got, want)
		}
	}
	if !strings.Contains(h.text("imp-why-decimal"), "decimal comma") {
		t.Errorf("decimal reason %q", h.text("imp-why-decimal"))
	}
	if got := h.text("imp-preamble"); !strings.Contains(got, "Larkspur Flats") {
		t.Errorf("preamble %q", got)
	}
	h.input("imp-zone", "+02:00")
	h.click("import-start")
	w := h.test0().Logger.Water
	if w == nil || w.Len() != 11 || w.Kind != fielddata.Depth {
		t.Fatalf("record %+v", w)
	}
	// 14.05.2024 23:55 at UTC+02:00 is 21:55 UTC; depth 12,300 m.
	if want := fielddata.UnixSeconds(time.Date(2024, 5, 14, 21, 55, 0, 0, time.UTC)); w.Time[0] != want || w.Value[0] != 12.3 {
		t.Errorf("first reading %v %v", w.Time[0], w.Value[0])
	}
	// The summary names the span in the record's zone.
	if got := h.text("water-summary"); !strings.Contains(got, "2024-05-14 23:55:00 to 2024-05-15 00:05:00 (UTC+02:00)") {
		t.Errorf("summary %q", got)
	}
}

// TestLoggerAmbiguousDates: every date could be day-first or month-first;
// the screen asks and the import waits for the answer.
func TestLoggerAmbiguousDates(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.pick("logger-file", loggerFixture(t, "ambiguous-dates.csv"))
	q := h.text("imp-date-question")
	if !strings.Contains(q, "day or the month") || !strings.Contains(q, "12 or less") {
		t.Errorf("question %q", q)
	}
	// The preview cannot convert the dates either: it says so, and the
	// import waits.
	if got := h.text("imp-mapping-msg"); !strings.Contains(got, "Row 2") || !strings.Contains(got, "choose the date order") {
		t.Errorf("preview without an answer: %q", got)
	}
	if _, off := h.byID("import-start").Attrs["disabled"]; !off {
		t.Error("the import can start without the date order")
	}
	h.click("import-start")
	if h.test0().Logger != nil {
		t.Fatal("a record was added without the date order")
	}
	h.click("date-day-first")
	if h.render().ByID("imp-date-question") != nil {
		t.Error("question still asked after the answer")
	}
	if got := h.text("imp-why-order"); got != "chosen by you" {
		t.Errorf("order reason %q", got)
	}
	h.click("import-start")
	w := h.test0().Logger.Water
	// 05/06/2024 day-first is 5 June (UTC, the zone left as it is).
	if want := fielddata.UnixSeconds(time.Date(2024, 6, 5, 8, 0, 0, 0, time.UTC)); w == nil || w.Time[0] != want || w.Mapping.Time.Order != fielddata.DayFirst {
		t.Fatalf("record %+v", w)
	}
}

// TestLoggerGarbageRows: unreadable rows are listed (row, column, value,
// why); stop adds nothing, skip keeps the rest and lists them with the
// record.
func TestLoggerGarbageRows(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.pick("logger-file", loggerFixture(t, "garbage-rows.csv"))
	h.click("import-start")
	if got := h.app.Importing(); got != "bad-rows" {
		t.Fatalf("phase %q, want bad-rows", got)
	}
	table := h.text("bad-rows")
	for _, want := range []string{"4", "Depth to water (m)", "n/a", "is not a number", "5.1.65", "ERR"} {
		if !strings.Contains(table, want) {
			t.Errorf("bad-row table lacks %q: %q", want, table)
		}
	}
	h.click("bad-stop")
	if h.test0().Logger != nil || h.app.Importing() != "preview" || !strings.Contains(h.text("import-msg"), "nothing was added") {
		t.Fatalf("stop: logger %+v, phase %q", h.test0().Logger, h.app.Importing())
	}
	h.click("import-start")
	h.click("bad-skip")
	w := h.test0().Logger.Water
	if w == nil || w.Bad.Count == 0 || !w.Bad.Skipped || len(w.Bad.Listed) != w.Bad.Count || w.Len() == 0 {
		t.Fatalf("record after skip %+v", w)
	}
	if w.Bad.Listed[0].Row != 4 || w.Bad.Listed[0].Value != "n/a" || w.Bad.Listed[0].Column != "Depth to water (m)" {
		t.Errorf("first bad row %+v", w.Bad.Listed[0])
	}
	if got := h.text("water-bad"); !strings.Contains(got, "could not be read") || !strings.Contains(got, "n/a") {
		t.Errorf("listed with the record: %q", got)
	}
	if st := h.stored(h.app.Current().ID).Tests[0].Logger.Water; st.Bad.Count != w.Bad.Count || !st.Bad.Skipped {
		t.Errorf("stored bad rows %+v", st.Bad)
	}
}

// TestLoggerNotText: a file that is not delimited text gets one sentence.
func TestLoggerNotText(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.pick("logger-file", &memFile{name: "site photo.png", data: []byte("\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR")})
	got := h.text("import-error")
	if !strings.Contains(got, "PNG image") || strings.Count(got, ". ") > 0 || !strings.HasSuffix(got, ".") {
		t.Errorf("#import-error %q: want one sentence naming a PNG image", got)
	}
	h.click("import-discard")
	if h.app.Importing() != "" || h.test0().Logger != nil {
		t.Error("the failed file was kept")
	}
	h.pick("logger-file", &memFile{name: "empty.csv", data: []byte("\n\n")})
	if got := h.text("import-error"); got != "This file is empty: there are no readings in it." {
		t.Errorf("empty file: %q", got)
	}
}

// TestLoggerCancelReading: the cancel button stops a file being read;
// nothing is added.
func TestLoggerCancelReading(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	f := loggerFixture(t, "pressure-kpa.csv")
	f.block = make(chan struct{})
	h.byID("logger-file").Fire("change", &v.Event{Files: []v.File{f}})
	if h.app.Importing() != "reading" || h.render().ByID("import-progress") == nil {
		t.Fatalf("phase %q while reading, progress bar %v", h.app.Importing(), h.render().ByID("import-progress"))
	}
	h.byID("import-cancel").Fire("click", nil)
	h.settle()
	if h.app.Importing() != "" || h.test0().Logger != nil || !strings.Contains(h.app.Notice(), "cancelled") {
		t.Errorf("after cancel: phase %q, notice %q", h.app.Importing(), h.app.Notice())
	}
}

// TestConditioningStoredAndUndone: every setting is stored with the test
// and read back by the codec; clearing a field undoes its step.
func TestConditioningStoredAndUndone(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.importFixture("logger-file", "pressure-kpa.csv")
	h.importFixture("baro-file", "baro-mbar.csv")
	h.input("cond-start", "2024-05-14 08:00")
	h.input("cond-stop", "2024-05-14 11:00")
	h.input("cond-trend", "true")
	h.input("cond-baro-shift", "30")
	h.input("cond-be", "0.4")
	h.input("cond-per-cycle", "12")
	h.input("cond-static-mode", "typed")
	h.input("cond-static", "6,5")
	h.click("rate-add")
	h.input("rate-0-rate", "5")
	h.input("rate-0-unit", "L/s")
	h.click("rate-add")
	h.input("rate-1-start", "60")
	h.input("rate-1-rate", "5.5")
	id := h.app.Current().ID
	c := h.stored(id).Tests[0].Logger.Conditioning
	on := fielddata.UnixSeconds(time.Date(2024, 5, 14, 6, 0, 0, 0, time.UTC))
	want := fielddata.Conditioning{Start: &on, Stop: ptr(on + 3*3600),
		Baro:       &fielddata.BaroCompensation{Record: "baro-mbar.csv", Shift: 30},
		Efficiency: &fielddata.BaroEfficiency{BE: 0.4}, Trend: &fielddata.Trend{},
		Static: &fielddata.Static{Typed: true, Value: 6.5}, Thin: &fielddata.Thinning{PerCycle: 12},
		Rates: fielddata.Schedule{{Start: 0, Rate: 5e-3, Unit: "L/s"}, {Start: 3600, Rate: 5.5e-3, Unit: "L/s"}}}
	if !reflect.DeepEqual(c, want) {
		t.Fatalf("stored conditioning\n got %s\nwant %s", jsonOf(c), jsonOf(want))
	}
	// Undo each step by clearing its field.
	steps := []struct {
		name string
		do   func()
		gone func(c fielddata.Conditioning) bool
	}{
		{"start", func() { h.input("cond-start", "") }, func(c fielddata.Conditioning) bool { return c.Start == nil }},
		{"stop", func() { h.input("cond-stop", "") }, func(c fielddata.Conditioning) bool { return c.Stop == nil }},
		{"efficiency", func() { h.input("cond-be", "") }, func(c fielddata.Conditioning) bool { return c.Efficiency == nil }},
		{"trend", func() { h.input("cond-trend", "false") }, func(c fielddata.Conditioning) bool { return c.Trend == nil }},
		{"compensation", func() { h.input("cond-baro", "false") }, func(c fielddata.Conditioning) bool { return c.Baro == nil }},
		{"thinning", func() { h.input("cond-thin", "false") }, func(c fielddata.Conditioning) bool { return c.Thin == nil }},
		{"static", func() { h.input("cond-static-mode", "none") }, func(c fielddata.Conditioning) bool { return c.Static == nil }},
		{"rates", func() { h.click("rate-1-remove"); h.click("rate-0-remove") }, func(c fielddata.Conditioning) bool { return c.Rates == nil }},
	}
	for _, s := range steps {
		s.do()
		if c := h.stored(id).Tests[0].Logger.Conditioning; !s.gone(c) {
			t.Errorf("clearing %s left %s", s.name, jsonOf(c))
		}
	}
	if c := h.stored(id).Tests[0].Logger.Conditioning; !reflect.DeepEqual(c, fielddata.Conditioning{}) {
		t.Errorf("after undoing every step: %s", jsonOf(c))
	}
	// The text typed is kept, even when it cannot be read.
	h.input("cond-start", "8 o'clock")
	if tx := h.stored(id).Tests[0].Logger.Texts; tx.Start != "8 o'clock" || h.stored(id).Tests[0].Logger.Conditioning.Start != nil {
		t.Errorf("unreadable start: %+v", tx)
	}
	if got := h.text("cond-start-msg"); !strings.Contains(got, "not a date and time") || !strings.Contains(got, "UTC+02:00") {
		t.Errorf("message %q", got)
	}
}

func ptr(x float64) *float64 { return &x }

func jsonOf(c fielddata.Conditioning) string {
	p := &project.Project{ID: "x", Tests: []project.Test{{ID: "t", Logger: &project.LoggerData{Conditioning: c}}}}
	b, _ := project.Marshal(p)
	s := string(b)
	i := strings.Index(s, `"conditioning"`)
	return strings.Join(strings.Fields(s[i:]), " ")
}

// TestPickOnPlot: after "Pick on the plot", a tap on the raw-record plot
// sets the pump start or stop at the time under the finger.
func TestPickOnPlot(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.importFixture("logger-file", "pressure-kpa.csv")
	w := h.test0().Logger.Water
	tap := func(which string, x float64) float64 {
		t.Helper()
		h.click("pick-" + which)
		if h.app.Picking() != which || h.byID("plot-raw").Attrs["data-pick"] != which {
			t.Fatalf("the %s pick is not armed", which)
		}
		// The element is 480 CSS px wide; x is where the finger lands.
		h.byID("plot-raw").Fire("click", &v.Event{X: x, Width: 480})
		h.settle()
		if h.app.Picking() != "" {
			t.Error("the pick stays armed after the tap")
		}
		lg := h.test0().Logger
		at, text := lg.Conditioning.Start, lg.Texts.Start
		if which == "stop" {
			at, text = lg.Conditioning.Stop, lg.Texts.Stop
		}
		if at == nil || *at < w.Time[0]-3600 || *at > w.Time[w.Len()-1]+3600 || text != formatRecordTime(*at, w) {
			t.Fatalf("%s after a tap at %v px: %v, text %q", which, x, at, text)
		}
		return *at
	}
	s1 := tap("start", 200)
	s2 := tap("start", 240)
	if !(s2 > s1) {
		t.Errorf("a tap further right gave an earlier start: %v then %v", s1, s2)
	}
	if stop := tap("stop", 400); !(stop > s2) {
		t.Errorf("stop %v not after start %v", stop, s2)
	}
	// A tap without an armed pick changes nothing.
	before := h.test0().Logger.Conditioning
	h.byID("plot-raw").Fire("click", &v.Event{X: 100, Width: 480})
	h.settle()
	if !reflect.DeepEqual(h.test0().Logger.Conditioning, before) {
		t.Error("an unarmed tap changed the conditioning")
	}
}

// TestRateSchedule: rows as typed, read into the schedule; a wrong row
// has a message and no schedule is stored until it is fixed.
func TestRateSchedule(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.importFixture("logger-file", "elapsed-seconds.csv")
	h.click("rate-add")
	h.input("rate-0-rate", "4")
	h.click("rate-add")
	h.input("rate-1-start", "30")
	h.input("rate-1-rate", "fast")
	if got := h.text("rate-1-msg"); !strings.Contains(got, `"fast" is not a number`) {
		t.Errorf("row message %q", got)
	}
	if h.test0().Logger.Conditioning.Rates != nil {
		t.Error("a schedule with a wrong row was stored")
	}
	h.input("rate-1-rate", "6")
	if r := h.test0().Logger.Conditioning.Rates; len(r) != 2 || r[1].Start != 1800 || r[1].Rate != 6e-3 {
		t.Errorf("schedule %+v", r)
	}
	h.input("rate-1-start", "0")
	if got := h.text("rates-msg"); !strings.Contains(got, "must start after the step before it") {
		t.Errorf("schedule message %q", got)
	}
	// An elapsed record takes its start and stop in minutes.
	h.input("cond-start", "0")
	if c := h.test0().Logger.Conditioning; c.Start == nil || *c.Start != 0 {
		t.Errorf("elapsed start %v", c.Start)
	}
	// With the Test tab's rate cleared, the fit takes the first step's.
	h.click("tab-test")
	h.input("test-rate", "")
	h.click("tab-logger")
	h.input("rate-1-start", "30")
	req, missing := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil)
	if len(missing) > 0 || req.Q != 4e-3 {
		t.Errorf("fit request Q = %v, missing %q", req.Q, missing)
	}
}

// TestSourceSelector: the tape readings and the logger record are two
// sources; the fit uses the one chosen.
func TestSourceSelector(t *testing.T) {
	h := newHarness(t, nil)
	fieldSession(h)
	h.click("tab-logger")
	h.importFixture("logger-file", "elapsed-seconds.csv")
	if h.test0().Source == project.FromLogger {
		t.Error("a test with tape readings switched to its logger record by itself")
	}
	tape, _ := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil)
	h.input("fit-source", "logger")
	req, missing := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil)
	if len(missing) > 0 || len(req.Time) == 0 || len(req.Time) == len(tape.Time) {
		t.Fatalf("logger request: %d readings (tape %d), missing %q", len(req.Time), len(tape.Time), missing)
	}
	// The elapsed file holds 2 readings before the start and one at it;
	// thinned at 20 per log cycle, every reading after t = 0 is kept
	// (they are sparser than that).
	if len(req.Time) != 34 || req.Time[0] != 1 {
		t.Errorf("logger readings %v", req.Time)
	}
	h.click("tab-fit")
	if got := h.byID("fit-source").Attrs["value"]; got != "logger" {
		t.Errorf("fit tab source %q", got)
	}
	h.input("fit-source", "tape")
	again, _ := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil)
	if !reflect.DeepEqual(again.Time, tape.Time) {
		t.Error("back on tape readings, the request differs")
	}
	// The static level of the Test tab is not needed for the logger.
	h.click("tab-test")
	h.input("test-static", "")
	h.click("tab-fit")
	h.input("fit-source", "logger")
	if _, missing := fitRequest(h.app.Current(), &h.app.Current().Tests[0], nil); len(missing) > 0 {
		t.Errorf("missing %q", missing)
	}
}

func TestParseOffset(t *testing.T) {
	for _, tc := range []struct {
		in  string
		off int
		ok  bool
	}{
		{"", 0, true}, {"UTC", 0, true}, {"Z", 0, true}, {"+02:00", 7200, true}, {"-0530", -19800, true},
		{"UTC+2", 7200, true}, {"GMT-05:00", -18000, true}, {"−03:00", -10800, true}, {"+14", 50400, true},
		{"Europe/Berlin", 0, false}, {"+15", 0, false}, {"+02:7", 0, false}, {"2", 0, false}, {"+0a:00", 0, false},
	} {
		off, ok := parseOffset(tc.in)
		if off != tc.off || ok != tc.ok {
			t.Errorf("parseOffset(%q) = %d, %v; want %d, %v", tc.in, off, ok, tc.off, tc.ok)
		}
		if ok {
			if back, _ := parseOffset(offsetText(off)); back != off {
				t.Errorf("offsetText(%d) = %q reads back as %d", off, offsetText(off), back)
			}
		}
	}
}

// TestZoneNameRefused: a zone name is refused on screen with the reason,
// and the offset in force is named.
func TestZoneNameRefused(t *testing.T) {
	h := newHarness(t, nil)
	loggerTest(h)
	h.pick("logger-file", loggerFixture(t, "pressure-kpa.csv"))
	h.input("imp-zone", "Europe/Berlin")
	if got := h.text("imp-zone-msg"); !strings.Contains(got, "not a UTC offset") || !strings.Contains(got, "UTC+02:00 is used") {
		t.Errorf("zone message %q", got)
	}
	h.click("imp-zone-device")
	if got := h.byID("imp-zone").Attrs["value"]; got != "" { // the test clock is UTC
		t.Errorf("device offset %q", got)
	}
	if strconv.Quote(h.text("imp-zone-msg")) != `""` {
		t.Errorf("message after the device offset: %q", h.text("imp-zone-msg"))
	}
}

// loggerReference runs the pipeline of the page natively on the same
// fixtures and settings: import at UTC+02:00, compensation, static level
// from the hour before 08:00, the pump from 08:00 to 11:00, thinned to
// perCycle a log cycle, Theis with Q = 5 L/s, r = 20 m.
func loggerReference(t *testing.T, perCycle int) (count string, T, S float64) {
	t.Helper()
	read := func(name string) fielddata.Series {
		b, err := os.ReadFile(filepath.Join("..", "testdata", "fielddata", name))
		if err != nil {
			t.Fatal(err)
		}
		d, err := fielddata.Sniff(b)
		if err != nil {
			t.Fatal(err)
		}
		m := d.Mapping
		m.Values = m.Values[:1]
		m.Time.Zone = "+02:00"
		rec, err := fielddata.Import(context.Background(), bytes.NewReader(b), d.Options, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		return rec.Series(0)
	}
	water, baro := read("pressure-kpa.csv"), read("baro-mbar.csv")
	on := fielddata.UnixSeconds(time.Date(2024, 5, 14, 8, 0, 0, 0, time.FixedZone("", 7200)))
	off := on + 3*3600
	res, err := fielddata.Apply(water, &baro, fielddata.Conditioning{Start: &on, Stop: &off,
		Baro: &fielddata.BaroCompensation{Record: "baro-mbar.csv"}, Static: &fielddata.Static{},
		Thin: &fielddata.Thinning{PerCycle: perCycle}})
	if err != nil {
		t.Fatal(err)
	}
	th := res.Pumping.Thinned()
	var ts, ss []float64
	for i, e := range th.Elapsed {
		if e > 0 {
			ts, ss = append(ts, e), append(ss, th.Drawdown[i])
		}
	}
	fit, err := models.Fit(models.Theis{Q: 5e-3, R: 20}, models.Data{Time: ts, Value: ss}, nil)
	if err != nil {
		t.Fatal(err)
	}
	return res.ThinSummary(), fit.Params[0], fit.Params[1]
}
