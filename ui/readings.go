package ui

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"fieldfit/models/units"
	"fieldfit/ui/project"
)

// RowCheck is what the readings table shows for one row: the parsed
// values, the drawdown and the messages. Messages never replace what was
// typed; a row with messages is simply left out of the fit.
type RowCheck struct {
	// Elapsed (s) and Depth (m) are valid when TimeOK and DepthOK.
	Elapsed float64
	TimeOK  bool
	Depth   float64
	DepthOK bool
	// Drawdown (m) = Depth − static level, valid when HasDrawdown.
	Drawdown    float64
	HasDrawdown bool
	// Messages say, in plain words, what is wrong with the row.
	Messages []string
	// Usable reports whether the row goes into the fit.
	Usable bool
}

// maxClockBack is how far a clock time may fall behind the row above
// before it is read as the next day rather than a mistake.
const maxClockBack = 12 * time.Hour

// ParseClock reads a time of day "hh:mm" or "hh:mm:ss" (also with "."
// or "h" between hours and minutes) and returns the seconds since
// midnight.
func ParseClock(text string) (float64, error) {
	s := strings.TrimSpace(text)
	s = strings.ReplaceAll(s, "h", ":")
	if !strings.Contains(s, ":") {
		s = strings.ReplaceAll(s, ".", ":")
	}
	parts := strings.Split(s, ":")
	if len(parts) < 2 || len(parts) > 3 {
		return 0, fmt.Errorf("%q is not a clock time (hh:mm or hh:mm:ss)", strings.TrimSpace(text))
	}
	var hms [3]float64
	limits := [3]float64{24, 60, 60}
	for i, p := range parts {
		var v float64
		var err error
		if i == 2 {
			v, err = strconv.ParseFloat(p, 64)
		} else {
			var n int
			n, err = strconv.Atoi(p)
			v = float64(n)
		}
		if err != nil || v < 0 || v >= limits[i] || p == "" {
			return 0, fmt.Errorf("%q is not a clock time (hh:mm or hh:mm:ss)", strings.TrimSpace(text))
		}
		hms[i] = v
	}
	return hms[0]*3600 + hms[1]*60 + hms[2], nil
}

// CheckReadings parses every reading of t (times in t.TimeMode, depths in
// unit length) and checks the rows: not a number, missing values, times
// not after the pump start or not after the row above, negative drawdown.
// It stores the parsed SI values back into t.Readings and returns one
// RowCheck per reading.
func CheckReadings(t *project.Test, length units.Unit) []RowCheck {
	checks := make([]RowCheck, len(t.Readings))
	static, hasStatic := t.StaticLevel.Value()
	startSec := float64(t.Start.Hour()*3600+t.Start.Minute()*60+t.Start.Second()) + float64(t.Start.Nanosecond())/1e9
	prevT, havePrev := 0.0, false
	prevClock, dayOffset, haveClock := 0.0, 0.0, false
	for i := range t.Readings {
		r := &t.Readings[i]
		c := &checks[i]
		if r.Blank() {
			r.TimeOK, r.DepthOK, r.Elapsed, r.Depth = false, false, 0, 0
			continue
		}
		// Time.
		r.TimeOK, r.Elapsed = false, 0
		timeText := strings.TrimSpace(r.TimeText)
		switch {
		case timeText == "":
			c.Messages = append(c.Messages, "Time missing.")
		case t.TimeMode == project.ClockTime:
			sec, err := ParseClock(timeText)
			switch {
			case err != nil:
				c.Messages = append(c.Messages, "Time "+err.Error()+".")
			case t.Start.IsZero():
				c.Messages = append(c.Messages, "Set the test start time to use clock times.")
			default:
				if haveClock && sec+dayOffset < prevClock-maxClockBack.Seconds() {
					dayOffset += 86400
				}
				abs := sec + dayOffset
				prevClock, haveClock = abs, true
				r.Elapsed, r.TimeOK = abs-startSec, true
			}
		default:
			v, err := parseNumber(timeText)
			if err != nil {
				c.Messages = append(c.Messages, "Time "+err.Error()+".")
			} else {
				r.Elapsed, r.TimeOK = v*units.Minute, true
			}
		}
		if r.TimeOK {
			switch {
			case r.Elapsed <= 0:
				c.Messages = append(c.Messages, fmt.Sprintf("Time %s min is not after the pump start.", formatPlain(r.Elapsed/units.Minute)))
			case havePrev && r.Elapsed <= prevT:
				c.Messages = append(c.Messages, fmt.Sprintf("Time %s min is not after the row above (%s min).",
					formatPlain(r.Elapsed/units.Minute), formatPlain(prevT/units.Minute)))
			default:
				prevT, havePrev = r.Elapsed, true
				c.Elapsed, c.TimeOK = r.Elapsed, true
			}
		}
		// Depth.
		r.DepthOK, r.Depth = false, 0
		if strings.TrimSpace(r.DepthText) == "" {
			c.Messages = append(c.Messages, "Depth to water missing.")
		} else if v, err := parseNumber(r.DepthText); err != nil {
			c.Messages = append(c.Messages, "Depth "+err.Error()+".")
		} else {
			r.Depth, r.DepthOK = length.ToSI(v), true
			c.Depth, c.DepthOK = r.Depth, true
		}
		if r.DepthOK && hasStatic {
			c.Drawdown, c.HasDrawdown = r.Depth-static, true
			if c.Drawdown < 0 {
				c.Messages = append(c.Messages, fmt.Sprintf("Negative drawdown (%s %s): the water is above the static level.",
					formatSig(length.FromSI(c.Drawdown), 3), length.Symbol))
			}
		}
		c.Usable = c.TimeOK && c.DepthOK && c.HasDrawdown && c.Drawdown >= 0
	}
	return checks
}

// SetReading sets the text of one cell (field "time" or "depth") of row
// i, growing the table when i is the empty row below the last, and drops
// empty rows at the end. It returns false for an unknown field or row.
func SetReading(t *project.Test, i int, field, text string) bool {
	if i < 0 || i > len(t.Readings) || (field != "time" && field != "depth") {
		return false
	}
	if i == len(t.Readings) {
		if text == "" {
			return true
		}
		t.Readings = append(t.Readings, project.Reading{})
	}
	if field == "time" {
		t.Readings[i].TimeText = text
	} else {
		t.Readings[i].DepthText = text
	}
	for n := len(t.Readings); n > 0 && t.Readings[n-1].Blank(); n-- {
		t.Readings = t.Readings[:n-1]
	}
	return true
}

// PasteReadings puts spreadsheet text (rows on lines, cells separated by
// tabs) into the table from row i and field ("time" or "depth") on,
// overwriting the cells it covers and adding rows as needed. A first line
// in which no cell is a number is taken as a header and skipped. Cells
// beyond the depth column are ignored. It returns the number of rows
// written and a sentence for the user.
func PasteReadings(t *project.Test, i int, field, text string) (int, string) {
	text = strings.ReplaceAll(strings.ReplaceAll(text, "\r\n", "\n"), "\r", "\n")
	lines := strings.Split(strings.TrimRight(text, "\n"), "\n")
	col := 0
	if field == "depth" {
		col = 1
	}
	var notes []string
	if len(lines) > 1 && isHeader(lines[0], t.TimeMode) {
		notes = append(notes, fmt.Sprintf("Skipped the heading line %q.", lines[0]))
		lines = lines[1:]
	}
	extra := 0
	n := 0
	for k, line := range lines {
		cells := strings.Split(line, "\t")
		row := i + k
		for len(t.Readings) <= row {
			t.Readings = append(t.Readings, project.Reading{})
		}
		for j, cell := range cells {
			switch col + j {
			case 0:
				t.Readings[row].TimeText = strings.TrimSpace(cell)
			case 1:
				t.Readings[row].DepthText = strings.TrimSpace(cell)
			default:
				if strings.TrimSpace(cell) != "" {
					extra++
				}
			}
		}
		n++
	}
	for m := len(t.Readings); m > 0 && t.Readings[m-1].Blank(); m-- {
		t.Readings = t.Readings[:m-1]
	}
	msg := fmt.Sprintf("Pasted %d rows.", n)
	if n == 1 {
		msg = "Pasted 1 row."
	}
	if extra > 0 {
		notes = append(notes, fmt.Sprintf("%d cells beyond the depth column were not used.", extra))
	}
	if len(notes) > 0 {
		msg += " " + strings.Join(notes, " ")
	}
	return n, msg
}

// isHeader reports whether no cell of line reads as a time or a number.
func isHeader(line string, mode project.TimeMode) bool {
	for _, cell := range strings.Split(line, "\t") {
		if strings.TrimSpace(cell) == "" {
			continue
		}
		if _, err := parseNumber(cell); err == nil {
			return false
		}
		if _, err := ParseClock(cell); err == nil {
			return false
		}
	}
	return true
}

// IsPastable reports whether text holds more than one cell (a tab or a
// line break), so that a paste should fill the table rather than one
// input.
func IsPastable(text string) bool {
	return strings.ContainsAny(strings.TrimRight(text, "\r\n"), "\t\n\r")
}

// UsableReadings returns the elapsed times (s) and drawdowns (m) of the
// usable rows, in order, with their row indexes.
func UsableReadings(t *project.Test, checks []RowCheck) (times, drawdowns []float64, rows []int) {
	for i, c := range checks {
		if c.Usable {
			times = append(times, c.Elapsed)
			drawdowns = append(drawdowns, c.Drawdown)
			rows = append(rows, i)
		}
	}
	return times, drawdowns, rows
}
