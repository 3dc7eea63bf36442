package fielddata

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"fieldfit/models/units"
)

// TimeFormat says how the time of a reading is written.
type TimeFormat string

const (
	// DateTime: one cell with a date and an optional clock time, ISO 8601
	// (2024-05-14T08:30:00.5Z, 2024-05-14 08:30:00+02:00) or with day and
	// month in the order of TimeColumns.Order (14.05.2024 08:30,
	// 05/14/2024 8:30:00 PM).
	DateTime TimeFormat = "datetime"
	// DateAndClock: a date cell and a separate clock-time cell
	// (08:30:00, 8:30 PM, 08:30:00.25).
	DateAndClock TimeFormat = "date+clock"
	// Elapsed: time since some start, as a number in TimeColumns.Unit or
	// as h:mm:ss.
	Elapsed TimeFormat = "elapsed"
)

// DateOrder says whether the day or the month comes first in dates such
// as 05/06/2024. Dates with the year first need none.
type DateOrder string

const (
	DayFirst   DateOrder = "day-first"
	MonthFirst DateOrder = "month-first"
)

// ValueKind says what a value column measures.
type ValueKind string

const (
	// Depth is the depth to water below a measuring point; it grows as
	// the level falls. Unit: a length.
	Depth ValueKind = "depth"
	// Level is the water level above a datum. Unit: a length.
	Level ValueKind = "level"
	// Pressure is a transducer or barometric pressure. Unit: a pressure,
	// or a length of water column (m, cm, ft, in, read as m H₂O …). It is
	// converted on import to the head of water h = p/(ρ·gn), in m.
	Pressure ValueKind = "pressure"
)

// TimeColumns says which columns hold the time and how it is written.
// The zero value reads a date and time in column 0, in UTC.
type TimeColumns struct {
	// Format is how the time is written; "" means DateTime.
	Format TimeFormat `json:"format,omitempty"`
	// Column is the 0-based column of the date and time, of the date
	// (DateAndClock), or of the elapsed time.
	Column int `json:"column"`
	// ClockColumn is the 0-based column of the clock time (DateAndClock
	// only).
	ClockColumn int `json:"clockColumn,omitempty"`
	// Order is the order of day and month in dates that do not start
	// with the year. "" means not chosen: Import then stops with
	// ErrDateOrder at the first such date.
	Order DateOrder `json:"order,omitempty"`
	// Unit is the symbol of the unit of elapsed times written as numbers
	// ("s", "min", "h", "d"); "" means seconds.
	Unit string `json:"unit,omitempty"`
	// Zone is the time zone of clock times written without an offset:
	// "" (UTC), a fixed offset such as "+02:00", or an IANA name such as
	// "Europe/Berlin" when LoadZone is set (daylight-saving changes
	// applied; in the hour that repeats when clocks go back, the earlier
	// reading is assumed). Times written with Z or an offset keep their
	// own.
	Zone string `json:"zone,omitempty"`
}

func (t TimeColumns) format() TimeFormat {
	if t.Format == "" {
		return DateTime
	}
	return t.Format
}

// ValueColumn maps one column of readings.
type ValueColumn struct {
	// Column is the 0-based column index.
	Column int `json:"column"`
	// Name is the column's name as shown; "" means the header text.
	Name string `json:"name,omitempty"`
	// Kind is what the column measures.
	Kind ValueKind `json:"kind"`
	// Unit is the symbol of the unit the values are written in, as known
	// to package units ("m", "ft", "kPa", "psi", "mbar", "cm H₂O" …).
	Unit string `json:"unit"`
}

// Mapping says which columns of a file hold the time and which the
// readings, and how to convert them.
type Mapping struct {
	Time   TimeColumns   `json:"time"`
	Values []ValueColumn `json:"values"`
	// Density is the density of the water column (kg/m³) used to turn
	// pressure into head; 0 means units.WaterDensity (999.97 kg/m³,
	// water at 4 °C, reference §9). Water at 10 °C is about 999.7, at
	// 20 °C about 998.2.
	Density float64 `json:"density,omitempty"`
}

func (m Mapping) density() float64 {
	if m.Density == 0 {
		return units.WaterDensity
	}
	return m.Density
}

// columns returns the number of fields a row needs.
func (m Mapping) need() int {
	n := m.Time.Column + 1
	if m.Time.format() == DateAndClock {
		n = max(n, m.Time.ClockColumn+1)
	}
	for _, v := range m.Values {
		n = max(n, v.Column+1)
	}
	return n
}

// Check reports the first setting of m that cannot work. ncols is the
// number of columns of the file (0 if unknown; columns are then checked
// row by row on import).
func (m Mapping) Check(ncols int) error {
	col := func(field string, c int) error {
		if c < 0 {
			return settingErr(ErrMapping, field, strconv.Itoa(c), "column numbers start at 0")
		}
		if ncols > 0 && c >= ncols {
			return settingErr(ErrMapping, field, strconv.Itoa(c), "the file has %d columns", ncols)
		}
		return nil
	}
	used := map[int]string{}
	use := func(field string, c int) error {
		if err := col(field, c); err != nil {
			return err
		}
		if prev, dup := used[c]; dup {
			return settingErr(ErrMapping, field, strconv.Itoa(c), "column %d is already mapped as %s", c, prev)
		}
		used[c] = field
		return nil
	}
	switch m.Time.format() {
	case DateTime, Elapsed:
	case DateAndClock:
		if err := use("time.clockColumn", m.Time.ClockColumn); err != nil {
			return err
		}
	default:
		return settingErr(ErrMapping, "time.format", string(m.Time.Format), "unknown time format")
	}
	if err := use("time.column", m.Time.Column); err != nil {
		return err
	}
	switch m.Time.Order {
	case "", DayFirst, MonthFirst:
	default:
		return settingErr(ErrMapping, "time.order", string(m.Time.Order), "unknown date order")
	}
	if m.Time.format() == Elapsed {
		if _, err := elapsedFactor(m.Time.Unit); err != nil {
			return err
		}
	}
	if _, err := parseZone(m.Time.Zone); err != nil {
		return &SettingError{Field: "time.zone", Value: m.Time.Zone, Err: fmt.Errorf("%w: %v", ErrMapping, err)}
	}
	if len(m.Values) == 0 {
		return settingErr(ErrMapping, "values", "", "map at least one column of readings")
	}
	for i, v := range m.Values {
		f := fmt.Sprintf("values[%d]", i)
		if err := use(f+".column", v.Column); err != nil {
			return err
		}
		if _, err := valueFactor(v.Kind, v.Unit, m.density()); err != nil {
			if se, ok := err.(*SettingError); ok {
				se.Field = f + "." + se.Field
			}
			return err
		}
	}
	if d := m.Density; d != 0 && (math.IsNaN(d) || d < 500 || d > 2000) {
		return settingErr(ErrMapping, "density", strconv.FormatFloat(d, 'g', -1, 64), "a water density in kg/m³ is expected (about 1000)")
	}
	return nil
}

func elapsedFactor(sym string) (float64, error) {
	if sym == "" {
		return units.Second, nil
	}
	u, ok := units.Lookup(sym)
	if !ok || u.Quantity != units.Time {
		return 0, settingErr(ErrMapping, "time.unit", sym, "a unit of time (s, min, h, d) is expected")
	}
	return u.Factor, nil
}

// valueFactor returns the factor that turns a value written in unit into
// SI metres: of length for Depth and Level, of water head with density rho
// for Pressure.
func valueFactor(kind ValueKind, unit string, rho float64) (float64, error) {
	if strings.TrimSpace(unit) == "" {
		return 0, settingErr(ErrMapping, "unit", "", "choose the unit of the column")
	}
	u, ok := units.Lookup(unit)
	if !ok {
		return 0, settingErr(ErrMapping, "unit", unit, "unknown unit")
	}
	switch kind {
	case Depth, Level:
		if u.Quantity != units.Length {
			return 0, settingErr(ErrMapping, "unit", unit, "a %s needs a unit of length (m, cm, ft, in)", kind)
		}
		return u.Factor, nil
	case Pressure:
		if u.Quantity == units.Length {
			w, ok := units.Lookup(u.Symbol + " H₂O")
			if !ok {
				return 0, settingErr(ErrMapping, "unit", unit, "no water column unit for %s", u.Symbol)
			}
			u = w
		}
		if u.Quantity != units.Pressure {
			return 0, settingErr(ErrMapping, "unit", unit, "a pressure needs a unit of pressure (Pa, kPa, mbar, psi, m H₂O …)")
		}
		return units.WaterHead(u.Factor, rho), nil
	}
	return 0, settingErr(ErrMapping, "kind", string(kind), "a column is a depth, a level or a pressure")
}

// unitAliases maps spellings found in file headers to symbols of package
// units. It only respells; every factor is package units'.
var unitAliases = map[string]string{
	"meter": "m", "meters": "m", "metre": "m", "metres": "m",
	"foot": "ft", "feet": "ft",
	"inch": "in", "inches": "in",
	"sec": "s", "secs": "s", "second": "s", "seconds": "s",
	"mins": "min", "minute": "min", "minutes": "min",
	"hr": "h", "hrs": "h", "hour": "h", "hours": "h",
	"day": "d", "days": "d",
	"pa": "Pa", "kpa": "kPa", "hpa": "hPa", "mbar": "mbar", "mb": "mbar", "millibar": "mbar", "bar": "bar",
	"psi": "psi", "psia": "psi", "psig": "psi",
	"mh2o": "m H₂O", "m h2o": "m H₂O", "mwc": "m H₂O", "m wc": "m H₂O",
	"cmh2o": "cm H₂O", "cm h2o": "cm H₂O",
	"fth2o": "ft H₂O", "ft h2o": "ft H₂O",
	"inh2o": "in H₂O", "in h2o": "in H₂O",
}

// lookupUnit finds the unit named by text from a header: the symbol
// itself or a respelling.
func lookupUnit(text string) (units.Unit, bool) {
	s := strings.TrimSpace(text)
	if s == "" {
		return units.Unit{}, false
	}
	if u, ok := units.Lookup(s); ok {
		return u, true
	}
	l := strings.ToLower(strings.ReplaceAll(s, "₂", "2"))
	if a, ok := unitAliases[l]; ok {
		return units.Lookup(a)
	}
	return units.Unit{}, false
}

// headerUnit finds a unit written in a column name: "Level (m)",
// "Pressure [kPa]", "Depth_ft", "Time/min". It returns the unit symbol
// and the name without it.
func headerUnit(name string) (symbol string, rest string) {
	n := strings.TrimSpace(name)
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}, {"{", "}"}} {
		if j := strings.LastIndex(n, p[1]); j == len(n)-len(p[1]) && j > 0 {
			if i := strings.LastIndex(n[:j], p[0]); i >= 0 {
				if u, ok := lookupUnit(n[i+1 : j]); ok {
					return u.Symbol, strings.TrimSpace(n[:i])
				}
			}
		}
	}
	for _, sep := range []string{" in ", ",", "_", "/", " "} {
		if i := strings.LastIndex(n, sep); i > 0 {
			if u, ok := lookupUnit(n[i+len(sep):]); ok {
				return u.Symbol, strings.TrimSpace(n[:i])
			}
		}
	}
	return "", n
}
