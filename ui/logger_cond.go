package ui

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"fieldfit/models/units"
	"fieldfit/ui/fielddata"
	"fieldfit/ui/project"
	"fieldfit/ui/project/jsonc"
)

// condCache keeps the last conditioned logger record, so that renders
// and fits do not run the pipeline again for unchanged settings.
type condCache struct {
	key string
	res *fielddata.Result
	err error
}

// conditioner conditions a test's logger record.
type conditioner func(t *project.Test) (*fielddata.Result, error)

// errNoLogger: the test has no water-level record.
var errNoLogger = errors.New("no water-level logger record imported")

// conditionTest runs fielddata.Apply on the test's logger records.
func conditionTest(t *project.Test) (*fielddata.Result, error) {
	lg := t.Logger
	if lg == nil || lg.Water == nil {
		return nil, errNoLogger
	}
	var baro *fielddata.Series
	if lg.Baro != nil {
		s := lg.Baro.Series()
		baro = &s
	}
	return fielddata.Apply(lg.Water.Series(), baro, lg.Conditioning)
}

// conditionedLocked is conditionTest with the app's cache.
func (a *App) conditionedLocked(t *project.Test) (*fielddata.Result, error) {
	lg := t.Logger
	if lg == nil || lg.Water == nil {
		return nil, errNoLogger
	}
	settings, _ := jsonc.Marshal(lg.Conditioning)
	key := t.ID + "|" + lg.Water.ID + "|"
	if lg.Baro != nil {
		key += lg.Baro.ID
	}
	key += "|" + string(settings)
	if a.cond.key == key {
		return a.cond.res, a.cond.err
	}
	res, err := conditionTest(t)
	a.cond = condCache{key: key, res: res, err: err}
	return res, err
}

// loggerReadings adds the conditioned logger readings of t to a fit
// request: the thinned pumping segment after the start (t > 0); the
// reading at the start itself cannot be fitted. It returns what is
// missing.
func loggerReadings(req *FitRequest, t *project.Test, cond conditioner) []string {
	if t.Logger == nil || t.Logger.Water == nil {
		return []string{"Import the water-level logger file on the Logger data tab, or fit the tape readings."}
	}
	if cond == nil {
		cond = conditionTest
	}
	res, err := cond(t)
	if err != nil {
		return []string{"The logger record cannot be conditioned: " + settingSentence(err)}
	}
	if !res.HasStatic {
		return []string{"Choose how the static level is found on the Logger data tab: drawdown needs it."}
	}
	th := res.Pumping.Thinned()
	for i, e := range th.Elapsed {
		if e > 0 {
			req.Time = append(req.Time, e)
			req.Drawdown = append(req.Drawdown, th.Drawdown[i])
		}
	}
	if req.Q == 0 {
		if len(res.Rates) > 0 && res.Rates[0].Rate > 0 {
			req.Q = res.Rates[0].Rate
		}
	}
	return nil
}

// ---- conditioning settings ----

// editLogger applies edit to the conditioning of the selected test's
// logger record and refits.
func (a *App) editLogger(edit func(lg *project.LoggerData)) {
	a.editTest(func(t *project.Test) {
		if t.Logger == nil {
			t.Logger = &project.LoggerData{}
		}
		edit(t.Logger)
	}, true)
}

// SetCondition sets a conditioning field from typed text: "start" and
// "stop" (date and time in the record's zone, or minutes for elapsed
// records), "static" (the typed static level, display length unit),
// "be" (barometric efficiency 0 to 1; empty: no correction),
// "per-cycle" (readings per log cycle; empty: 20), "shift" (s added to
// the barometric times). Clearing a field undoes its step; text that
// cannot be read is kept, with a message, and the step is left out.
func (a *App) SetCondition(field, text string) {
	a.mu.Lock()
	d := DisplayFor(project.SI)
	if a.cur != nil {
		d = DisplayFor(a.cur.Units)
	}
	a.mu.Unlock()
	a.editLogger(func(lg *project.LoggerData) {
		c := &lg.Conditioning
		tx := &lg.Texts
		switch field {
		case "start", "stop":
			var at *float64
			if s, ok := parseRecordTime(text, lg.Water); ok {
				at = &s
			}
			if field == "start" {
				tx.Start, c.Start = text, at
			} else {
				tx.Stop, c.Stop = text, at
			}
		case "static":
			tx.Static = text
			if staticMode(lg) == StaticTyped {
				c.Static = typedStatic(text, d)
			}
		case "be":
			tx.BE = text
			c.Efficiency = nil
			if v, err := parseNumber(text); err == nil && v >= 0 && v <= 1 {
				c.Efficiency = &fielddata.BaroEfficiency{BE: v}
			}
		case "per-cycle":
			tx.PerCycle = text
			if c.Thin != nil {
				c.Thin.PerCycle = perCycle(text)
			}
		case "shift":
			tx.Shift = text
			if c.Baro != nil {
				c.Baro.Shift = 0
				if v, err := parseNumber(text); err == nil {
					c.Baro.Shift = v
				}
			}
		}
	})
}

// perCycle reads the typed readings per log cycle: 0 (the default 20)
// when empty or not a whole number from 1 to 1000.
func perCycle(text string) int {
	n, err := strconv.Atoi(strings.TrimSpace(text))
	if err != nil || n < 1 || n > 1000 {
		return 0
	}
	return n
}

// SetConditionOn turns a step on or off: "baro" (compensation with the
// barometric record), "trend" (pre-test trend removal), "thin"
// (thinning per log cycle).
func (a *App) SetConditionOn(step string, on bool) {
	a.editLogger(func(lg *project.LoggerData) {
		c := &lg.Conditioning
		switch step {
		case "baro":
			c.Baro = nil
			if on {
				c.Baro = &fielddata.BaroCompensation{}
				if lg.Baro != nil {
					c.Baro.Record = lg.Baro.File
				}
				if v, err := parseNumber(lg.Texts.Shift); err == nil {
					c.Baro.Shift = v
				}
			}
		case "trend":
			c.Trend = nil
			if on {
				c.Trend = &fielddata.Trend{}
			}
		case "thin":
			c.Thin = nil
			if on {
				c.Thin = &fielddata.Thinning{PerCycle: perCycle(lg.Texts.PerCycle)}
			}
		}
	})
}

// Static level modes of the conditioning panel.
const (
	StaticMean  = "mean"  // mean of the readings before the pump started
	StaticTyped = "typed" // typed
	StaticNone  = "none"  // no drawdown
)

// SetStaticMode chooses how the static level is found.
func (a *App) SetStaticMode(mode string) {
	a.mu.Lock()
	d := DisplayFor(project.SI)
	if a.cur != nil {
		d = DisplayFor(a.cur.Units)
	}
	a.mu.Unlock()
	a.editLogger(func(lg *project.LoggerData) {
		c := &lg.Conditioning
		switch mode {
		case StaticMean:
			c.Static = &fielddata.Static{}
		case StaticTyped:
			c.Static = typedStatic(lg.Texts.Static, d)
		case StaticNone:
			c.Static = nil
		default:
			return
		}
		lg.Texts.StaticMode = mode
	})
}

// typedStatic is the static level typed in the display length unit; nil
// when the text is not a number.
func typedStatic(text string, d Display) *fielddata.Static {
	v, err := parseNumber(text)
	if err != nil {
		return nil
	}
	return &fielddata.Static{Typed: true, Value: d.Length.ToSI(v)}
}

// staticMode is how lg finds its static level.
func staticMode(lg *project.LoggerData) string {
	c := lg.Conditioning
	switch {
	case lg.Texts.StaticMode != "":
		return lg.Texts.StaticMode
	case c.Static == nil:
		return StaticNone
	case c.Static.Typed:
		return StaticTyped
	}
	return StaticMean
}

// ArmPick makes the next tap on the raw-record plot set the pump's
// "start" or "stop" ("" disarms).
func (a *App) ArmPick(which string) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if which == a.pick || (which != "start" && which != "stop") {
		a.pick = ""
		return
	}
	a.pick = which
}

// PickTime sets the armed start or stop to s (on the water record's time
// axis), as a tap on the plot does.
func (a *App) PickTime(s float64) {
	a.mu.Lock()
	which := a.pick
	a.pick = ""
	t := a.currentTest()
	if which == "" || t == nil || t.Logger == nil || t.Logger.Water == nil || math.IsNaN(s) || math.IsInf(s, 0) {
		a.mu.Unlock()
		return
	}
	w := t.Logger.Water
	// Round to the second (clock) or to 0.01 s (elapsed) so that the
	// text reads back to the same value.
	if w.Clock {
		s = math.Round(s)
	} else {
		s = math.Round(s*100) / 100
	}
	text := formatRecordTime(s, w)
	a.mu.Unlock()
	a.SetCondition(which, text)
}

// Picking returns the armed pick, "start", "stop" or "".
func (a *App) Picking() string {
	a.mu.Lock()
	defer a.mu.Unlock()
	return a.pick
}

// ---- rate schedule ----

// SetRate sets a cell of rate row i ("start" in minutes since the pump
// started, "rate", "unit"); i may be the row after the last.
func (a *App) SetRate(i int, field, text string) {
	a.mu.Lock()
	d := DisplayFor(project.SI)
	if a.cur != nil {
		d = DisplayFor(a.cur.Units)
	}
	a.mu.Unlock()
	a.editLogger(func(lg *project.LoggerData) {
		if i < 0 || i > len(lg.Rates) {
			return
		}
		if i == len(lg.Rates) {
			lg.Rates = append(lg.Rates, project.RateRow{Start: "0", Unit: d.Rate.Symbol})
			if i > 0 {
				lg.Rates[i].Start, lg.Rates[i].Unit = "", lg.Rates[i-1].Unit
			}
		}
		r := &lg.Rates[i]
		switch field {
		case "start":
			r.Start = text
		case "rate":
			r.Rate = text
		case "unit":
			r.Unit = text
		}
		lg.Conditioning.Rates, _ = rateSchedule(lg)
	})
}

// AddRate adds a row to the rate schedule.
func (a *App) AddRate() {
	a.mu.Lock()
	n := 0
	if t := a.currentTest(); t != nil && t.Logger != nil {
		n = len(t.Logger.Rates)
	}
	a.mu.Unlock()
	a.SetRate(n, "", "")
}

// RemoveRate deletes rate row i.
func (a *App) RemoveRate(i int) {
	a.editLogger(func(lg *project.LoggerData) {
		if i < 0 || i >= len(lg.Rates) {
			return
		}
		lg.Rates = append(lg.Rates[:i], lg.Rates[i+1:]...)
		lg.Conditioning.Rates, _ = rateSchedule(lg)
	})
}

// rateSchedule reads the rate rows into a schedule. Rows that cannot be
// read, and a schedule that fails its check, give no schedule (nil) and
// messages by row (-1 for the schedule as a whole).
func rateSchedule(lg *project.LoggerData) (fielddata.Schedule, map[int]string) {
	msgs := map[int]string{}
	var s fielddata.Schedule
	for i, r := range lg.Rates {
		if strings.TrimSpace(r.Start) == "" && strings.TrimSpace(r.Rate) == "" {
			continue
		}
		st, err := parseNumber(r.Start)
		if err != nil {
			msgs[i] = "Start " + err.Error() + "."
			continue
		}
		q, err := parseNumber(r.Rate)
		if err != nil {
			msgs[i] = "Rate " + err.Error() + "."
			continue
		}
		step, err := fielddata.NewRateStep(st*units.Minute, q, r.Unit)
		if err != nil {
			msgs[i] = settingSentence(err)
			continue
		}
		s = append(s, step)
	}
	if len(msgs) > 0 {
		return nil, msgs
	}
	dur := math.Inf(1)
	if c := lg.Conditioning; c.Start != nil && c.Stop != nil {
		dur = *c.Stop - *c.Start
	}
	if err := s.Check(dur); err != nil {
		msgs[-1] = settingSentence(err)
		return nil, msgs
	}
	return s, msgs
}

// ---- times on a record's axis ----

// recordZone is the fixed zone of a record's clock times.
func recordZone(r *project.LoggerRecord) *time.Location {
	off := 0
	if r != nil {
		off, _ = parseOffset(r.Mapping.Time.Zone)
	}
	if off == 0 {
		return time.UTC
	}
	return time.FixedZone(zoneLabel(offsetText(off)), off)
}

// recordTimeLayouts are the layouts a typed date and time is read in.
var recordTimeLayouts = []string{"2006-01-02 15:04:05", "2006-01-02 15:04", "2006-01-02T15:04:05", "2006-01-02T15:04"}

// parseRecordTime reads a typed time on the record's axis: a date and
// time in the record's zone for clock records, minutes for elapsed
// ones. Empty text, or text that cannot be read, is not a time.
func parseRecordTime(text string, r *project.LoggerRecord) (float64, bool) {
	s := strings.TrimSpace(text)
	if s == "" {
		return 0, false
	}
	if r != nil && !r.Clock {
		v, err := parseNumber(s)
		if err != nil {
			return 0, false
		}
		return v * units.Minute, true
	}
	for _, l := range recordTimeLayouts {
		if t, err := time.ParseInLocation(l, s, recordZone(r)); err == nil {
			return fielddata.UnixSeconds(t), true
		}
	}
	return 0, false
}

// formatRecordTime writes a time on the record's axis as parseRecordTime
// reads it.
func formatRecordTime(s float64, r *project.LoggerRecord) string {
	if r != nil && !r.Clock {
		return strconv.FormatFloat(s/units.Minute, 'f', -1, 64)
	}
	t := fielddata.TimeOf(s).In(recordZone(r))
	return t.Format("2006-01-02 15:04:05")
}

// recordTimeMessage says what is wrong with a typed start or stop, or "".
func recordTimeMessage(text string, r *project.LoggerRecord) string {
	if strings.TrimSpace(text) == "" {
		return ""
	}
	if _, ok := parseRecordTime(text, r); ok {
		return ""
	}
	if r != nil && !r.Clock {
		return fmt.Sprintf("%q is not a number of minutes.", text)
	}
	return fmt.Sprintf("%q is not a date and time (yyyy-mm-dd hh:mm:ss, %s).", text, zoneLabel(r.Mapping.Time.Zone))
}
