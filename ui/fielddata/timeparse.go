package fielddata

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// timeParser reads the time cells of a row into seconds: Unix seconds
// (UTC) for dates and clock times, seconds for elapsed times.
type timeParser struct {
	order  DateOrder
	zone   zoneRule
	factor float64 // elapsed unit, s
	mark   byte    // decimal mark of elapsed numbers

	haveKey bool // cache of the last local hour's UTC offset
	lastKey int64
	lastOff int64
}

// zoneRule turns local wall-clock times without an offset into UTC.
type zoneRule struct {
	loc *time.Location // nil: the fixed offset off
	off int64          // seconds east of UTC
}

// LoadZone, when not nil, finds the zone of an IANA name such as
// "Europe/Berlin" given as TimeColumns.Zone; nil (the default) accepts
// fixed UTC offsets only. A program with a zone database may set it to
// time.LoadLocation (the native tests do). The browser app leaves it
// nil: time/tzdata would add about 450 kB to app.wasm, and
// time.LoadLocation alone links the code that reads zone files.
var LoadZone func(name string) (*time.Location, error)

// parseZone reads a time zone setting: "" or "UTC" or "Z" (UTC), a fixed
// offset ("+02:00", "-0530", "UTC+2") or, with LoadZone, an IANA name
// ("Europe/Berlin").
func parseZone(s string) (zoneRule, error) {
	s = strings.TrimSpace(s)
	switch strings.ToUpper(s) {
	case "", "UTC", "Z", "GMT":
		return zoneRule{}, nil
	}
	u := s
	if up := strings.ToUpper(u); strings.HasPrefix(up, "UTC") || strings.HasPrefix(up, "GMT") {
		u = u[3:]
	}
	if u != "" && (u[0] == '+' || u[0] == '-') {
		if off, n, ok := scanOffset([]byte(u), 0); ok && n == len(u) {
			return zoneRule{off: off}, nil
		}
		return zoneRule{}, fmt.Errorf("%q is not a UTC offset such as +02:00", s)
	}
	if LoadZone == nil {
		return zoneRule{}, fmt.Errorf("time zone names such as %q are not known here: use a UTC offset such as +02:00", s)
	}
	loc, err := LoadZone(s)
	if err != nil || loc == nil {
		return zoneRule{}, fmt.Errorf("unknown time zone %q (use an offset such as +02:00, or a name such as Europe/Berlin)", s)
	}
	return zoneRule{loc: loc}, nil
}

func digit(c byte) bool { return c >= '0' && c <= '9' }

// scanInt reads up to max digits at b[i:].
func scanInt(b []byte, i, max int) (v, n int) {
	for n < max && i+n < len(b) && digit(b[i+n]) {
		v = v*10 + int(b[i+n]-'0')
		n++
	}
	return v, n
}

// dateParts is a date as written: g1 sep g2 sep g3.
type dateParts struct {
	g1, g2, g3 int
	yearFirst  bool // g1 has four digits: year, month, day
	year2      bool // g3 has two digits
}

// scanDate reads a date at b[i:]: a four-digit year first (2024-05-14,
// 2024/05/14, 2024.05.14) or day and month before the year (14/05/2024,
// 05-14-2024, 14.05.24). It returns the index after the date.
func scanDate(b []byte, i int) (dateParts, int, bool) {
	var d dateParts
	g1, n1 := scanInt(b, i, 4)
	if n1 == 0 || (n1 == 3) || i+n1 >= len(b) {
		return d, 0, false
	}
	sep := b[i+n1]
	if sep != '-' && sep != '/' && sep != '.' {
		return d, 0, false
	}
	j := i + n1 + 1
	g2, n2 := scanInt(b, j, 2)
	if n2 == 0 || j+n2 >= len(b) || b[j+n2] != sep {
		return d, 0, false
	}
	j += n2 + 1
	g3, n3 := scanInt(b, j, 4)
	j += n3
	if j < len(b) && digit(b[j]) {
		return d, 0, false
	}
	switch {
	case n1 == 4 && (n3 == 1 || n3 == 2):
		d = dateParts{g1: g1, g2: g2, g3: g3, yearFirst: true}
	case n1 <= 2 && (n3 == 4 || n3 == 2):
		d = dateParts{g1: g1, g2: g2, g3: g3, year2: n3 == 2}
	default:
		return d, 0, false
	}
	return d, j, true
}

// ambiguous reports whether the date's day and month could be swapped.
func (d dateParts) ambiguous() bool { return !d.yearFirst }

// ymd resolves the date with the date order.
func (d dateParts) ymd(order DateOrder) (y, m, day int, err error) {
	if d.yearFirst {
		y, m, day = d.g1, d.g2, d.g3
	} else {
		y = d.g3
		if d.year2 {
			// POSIX strptime %y: 69–99 are 1969–1999, 00–68 are 2000–2068.
			if y >= 69 {
				y += 1900
			} else {
				y += 2000
			}
		}
		switch order {
		case DayFirst:
			day, m = d.g1, d.g2
		case MonthFirst:
			m, day = d.g1, d.g2
		default:
			return 0, 0, 0, ErrDateOrder
		}
	}
	if y < 1000 {
		return 0, 0, 0, fmt.Errorf("%w (year %d)", ErrTime, y)
	}
	if m < 1 || m > 12 {
		how := ""
		if !d.yearFirst {
			how = ", dates read " + string(order)
		}
		return 0, 0, 0, fmt.Errorf("%w (month %d%s)", ErrTime, m, how)
	}
	if day < 1 || day > daysIn(y, m) {
		return 0, 0, 0, fmt.Errorf("%w (day %d of a month with %d days)", ErrTime, day, daysIn(y, m))
	}
	return y, m, day, nil
}

func leap(y int) bool { return y%4 == 0 && (y%100 != 0 || y%400 == 0) }

func daysIn(y, m int) int {
	switch m {
	case 2:
		if leap(y) {
			return 29
		}
		return 28
	case 4, 6, 9, 11:
		return 30
	}
	return 31
}

// daysFromCivil returns the days since 1970-01-01 of a proleptic
// Gregorian date (H. Hinnant, "chrono-Compatible Low-Level Date
// Algorithms", days_from_civil; valid here for years ≥ 1).
func daysFromCivil(y, m, d int) int64 {
	if m <= 2 {
		y--
	}
	era := y / 400
	yoe := y - era*400
	mp := (m + 9) % 12
	doy := (153*mp+2)/5 + d - 1
	doe := yoe*365 + yoe/4 - yoe/100 + doy
	return int64(era)*146097 + int64(doe) - 719468
}

// clock is a time of day as written.
type clock struct {
	sec     int     // seconds since midnight
	frac    float64 // fraction of a second
	off     int64   // UTC offset written with the time, s east
	hasZone bool
	hour    int
}

// scanClock reads a clock time at b[i:] to the end of b: h:mm, h:mm:ss,
// h:mm:ss.fff (or ,fff), an optional AM/PM (am, a.m., …) and an optional
// zone (Z, UTC, ±hh:mm, ±hhmm, ±hh). b has no trailing blanks.
func scanClock(b []byte, i int) (clock, error) {
	var c clock
	h, nh := scanInt(b, i, 2)
	if nh == 0 || i+nh >= len(b) || b[i+nh] != ':' {
		return c, ErrTime
	}
	i += nh + 1
	mi, nm := scanInt(b, i, 2)
	if nm != 2 {
		return c, ErrTime
	}
	i += 2
	s := 0
	if i < len(b) && b[i] == ':' {
		var ns int
		s, ns = scanInt(b, i+1, 2)
		if ns != 2 {
			return c, ErrTime
		}
		i += 3
		if i < len(b) && (b[i] == '.' || b[i] == ',') && i+1 < len(b) && digit(b[i+1]) {
			i++
			var f, scale int64 = 0, 1
			for ; i < len(b) && digit(b[i]); i++ {
				if scale < 1e9 {
					f = f*10 + int64(b[i]-'0')
					scale *= 10
				}
			}
			c.frac = float64(f) / float64(scale)
		}
	}
	for i < len(b) && b[i] == ' ' {
		i++
	}
	// AM / PM.
	if i < len(b) && (b[i]|0x20 == 'a' || b[i]|0x20 == 'p') {
		pm := b[i]|0x20 == 'p'
		j := i + 1
		if j < len(b) && b[j] == '.' {
			j++
		}
		if j < len(b) && b[j]|0x20 == 'm' {
			j++
			if j < len(b) && b[j] == '.' {
				j++
			}
			if h < 1 || h > 12 {
				return c, fmt.Errorf("%w (hour %d with AM/PM)", ErrTime, h)
			}
			if h == 12 {
				h = 0
			}
			if pm {
				h += 12
			}
			i = j
			for i < len(b) && b[i] == ' ' {
				i++
			}
		}
	}
	if h > 23 || mi > 59 || s > 59 {
		return c, fmt.Errorf("%w (%02d:%02d:%02d is not a time of day)", ErrTime, h, mi, s)
	}
	c.hour = h
	c.sec = h*3600 + mi*60 + s
	// Zone.
	if i < len(b) {
		switch {
		case b[i] == 'Z' || b[i] == 'z':
			c.hasZone = true
			i++
		case len(b)-i >= 3 && (strings.EqualFold(string(b[i:i+3]), "UTC") || strings.EqualFold(string(b[i:i+3]), "GMT")):
			c.hasZone = true
			i += 3
			if i < len(b) {
				off, n, ok := scanOffset(b, i)
				if !ok {
					return c, ErrTime
				}
				c.off = off
				i += n
			}
		case b[i] == '+' || b[i] == '-':
			off, n, ok := scanOffset(b, i)
			if !ok {
				return c, ErrTime
			}
			c.hasZone, c.off = true, off
			i += n
		}
	}
	if i != len(b) {
		return c, ErrTime
	}
	return c, nil
}

// scanOffset reads ±hh, ±hhmm or ±hh:mm (also ±h) at b[i:].
func scanOffset(b []byte, i int) (off int64, n int, ok bool) {
	if i >= len(b) || (b[i] != '+' && b[i] != '-') {
		return 0, 0, false
	}
	neg := b[i] == '-'
	j := i + 1
	h, nh := scanInt(b, j, 2)
	if nh == 0 {
		return 0, 0, false
	}
	j += nh
	m := 0
	if j < len(b) && b[j] == ':' {
		var nm int
		m, nm = scanInt(b, j+1, 2)
		if nm != 2 {
			return 0, 0, false
		}
		j += 3
	} else if nh == 2 {
		if mm, nm := scanInt(b, j, 2); nm == 2 {
			m = mm
			j += 2
		}
	}
	if h > 14 || m > 59 {
		return 0, 0, false
	}
	off = int64(h*3600 + m*60)
	if neg {
		off = -off
	}
	return off, j - i, true
}

// toUnix turns a local date and clock into Unix seconds.
func (p *timeParser) toUnix(y, m, d int, c clock) float64 {
	days := daysFromCivil(y, m, d)
	naive := days*86400 + int64(c.sec)
	var off int64
	switch {
	case c.hasZone:
		off = c.off
	case p.zone.loc == nil:
		off = p.zone.off
	default:
		key := days*24 + int64(c.hour)
		if !p.haveKey || key != p.lastKey {
			t := time.Date(y, time.Month(m), d, c.hour, 0, 0, 0, p.zone.loc)
			_, o := t.Zone()
			p.haveKey, p.lastKey, p.lastOff = true, key, int64(o)
		}
		off = p.lastOff
	}
	return float64(naive-off) + c.frac
}

// stamp reads a date with an optional clock time in one cell: ISO 8601
// (2024-05-14T08:30:00.5+02:00, with T or a space) or day and month in the
// mapping's order (14/05/2024 8:30 PM).
func (p *timeParser) stamp(cell []byte) (float64, error) {
	cell = trimBlank(cell)
	dp, i, ok := scanDate(cell, 0)
	if !ok {
		return 0, ErrTime
	}
	y, m, d, err := dp.ymd(p.order)
	if err != nil {
		return 0, err
	}
	var c clock
	if i < len(cell) {
		if cell[i] != 'T' && cell[i] != 't' && cell[i] != ' ' {
			return 0, ErrTime
		}
		for i++; i < len(cell) && cell[i] == ' '; i++ {
		}
		if c, err = scanClock(cell, i); err != nil {
			return 0, err
		}
	}
	return p.toUnix(y, m, d, c), nil
}

// dateClock reads a date cell and a clock cell.
func (p *timeParser) dateClock(dcell, ccell []byte) (float64, error) {
	dcell = trimBlank(dcell)
	dp, i, ok := scanDate(dcell, 0)
	if !ok {
		return 0, ErrTime
	}
	if i != len(dcell) {
		// A date column may carry a midnight time ("14/05/2024 00:00:00").
		rest := strings.TrimLeft(string(dcell[i:]), " T")
		if strings.Trim(rest, "0:. ") != "" {
			return 0, fmt.Errorf("%w (a date, without a time of day, is expected in this column)", ErrTime)
		}
	}
	y, m, d, err := dp.ymd(p.order)
	if err != nil {
		return 0, err
	}
	c, err := scanClock(trimBlank(ccell), 0)
	if err != nil {
		return 0, errClock{err}
	}
	return p.toUnix(y, m, d, c), nil
}

// errClock marks an error of the clock cell of a date and clock pair.
type errClock struct{ error }

func (e errClock) Unwrap() error { return e.error }

// elapsed reads an elapsed time: a number in the mapping's unit, or
// [-]h:mm:ss[.f].
func (p *timeParser) elapsed(cell []byte) (float64, error) {
	if v, ok := parseNumber(cell, p.mark); ok {
		return v * p.factor, nil
	}
	cell = trimBlank(cell)
	neg := len(cell) > 0 && cell[0] == '-'
	if neg {
		cell = cell[1:]
	}
	h, nh := scanInt(cell, 0, 9)
	if nh == 0 || nh >= len(cell) || cell[nh] != ':' {
		return 0, ErrTime
	}
	rest := cell[nh+1:]
	if len(rest) < 5 || rest[2] != ':' || !digit(rest[0]) || !digit(rest[1]) {
		return 0, fmt.Errorf("%w (elapsed times are written as a number or as h:mm:ss)", ErrTime)
	}
	mi := int(rest[0]-'0')*10 + int(rest[1]-'0')
	sec, ok := parseNumber(rest[3:], '.')
	if !ok || mi > 59 || sec < 0 || sec >= 60 || rest[3] == '-' || rest[3] == '+' {
		return 0, ErrTime
	}
	v := float64(h)*3600 + float64(mi)*60 + sec
	if neg {
		v = -v
	}
	return v, nil
}

// parseClockOnly reads a clock cell alone (for Sniff).
func parseClockOnly(cell []byte) bool {
	_, err := scanClock(trimBlank(cell), 0)
	return err == nil
}

// FormatTime writes a time on a series' time axis for messages: a UTC
// date and time when clock is true, else the seconds.
func FormatTime(t float64, clock bool) string {
	if !clock {
		return strconv.FormatFloat(t, 'f', -1, 64) + " s"
	}
	if math.IsNaN(t) || math.IsInf(t, 0) {
		return "?"
	}
	sec := math.Floor(t)
	ts := time.Unix(int64(sec), int64(math.Round((t-sec)*1e9))).UTC()
	if ts.Nanosecond() == 0 {
		return ts.Format("2006-01-02 15:04:05Z")
	}
	return ts.Format("2006-01-02 15:04:05.999Z")
}

// UnixSeconds returns t as seconds on the clock time axis of Import.
func UnixSeconds(t time.Time) float64 {
	return float64(t.Unix()) + float64(t.Nanosecond())/1e9
}

// TimeOf returns the time of s seconds on the clock time axis, in UTC.
func TimeOf(s float64) time.Time {
	sec := math.Floor(s)
	return time.Unix(int64(sec), int64(math.Round((s-sec)*1e9))).UTC()
}
