package project

import (
	"encoding/base64"
	"encoding/binary"
	"errors"
	"fmt"
	"math"
	"time"

	"fieldfit/ui/fielddata"
	"fieldfit/ui/project/jsonc"
)

// Source says which readings of a test the fit uses.
type Source string

const (
	// FromTape fits the readings table (tape readings typed or pasted).
	// The zero value "" means FromTape too.
	FromTape Source = "tape"
	// FromLogger fits the conditioned, thinned drawdown of the imported
	// water-level logger record (Test.Logger).
	FromLogger Source = "logger"
)

// LoggerData holds the logger records imported for a test and the
// conditioning that turns them into drawdown.
type LoggerData struct {
	// Water is the water-level (or unvented pressure) logger's record;
	// nil before one is imported.
	Water *LoggerRecord `json:"water,omitempty"`
	// Baro is the barometric logger's record, nil without one.
	Baro *LoggerRecord `json:"baro,omitempty"`
	// Conditioning holds the steps applied to Water; each is undone by
	// clearing its field (see fielddata.Conditioning).
	Conditioning fielddata.Conditioning `json:"conditioning"`
	// Texts keep what was typed in the conditioning fields, whether or
	// not it could be read.
	Texts LoggerTexts `json:"texts,omitempty"`
	// Rates are the rows of the pumping-rate schedule as typed; the rows
	// that can be read make Conditioning.Rates.
	Rates []RateRow `json:"rates,omitempty"`
}

// LoggerTexts are the texts typed in the conditioning fields.
type LoggerTexts struct {
	// Start and Stop are the pump's start and stop: a date and time in
	// the water record's time zone ("2024-05-14 08:00:00") for records
	// with clock times, minutes on the record's elapsed axis otherwise.
	Start string `json:"start,omitempty"`
	Stop  string `json:"stop,omitempty"`
	// Static is the typed static level (in the project's length unit,
	// in the record's quantity), and StaticMode how the static level is
	// found: "mean", "typed" or "none" ("" means as Conditioning.Static
	// says; a typed level that cannot be read leaves Static nil).
	Static     string `json:"static,omitempty"`
	StaticMode string `json:"staticMode,omitempty"`
	// BE is the barometric efficiency (0 to 1).
	BE string `json:"be,omitempty"`
	// PerCycle is the number of readings kept per log cycle.
	PerCycle string `json:"perCycle,omitempty"`
	// Shift is the barometric clock shift (s).
	Shift string `json:"shift,omitempty"`
}

// RateRow is one row of the rate schedule as typed: Start in minutes
// since the pump started, Rate in Unit.
type RateRow struct {
	Start string `json:"start"`
	Rate  string `json:"rate"`
	Unit  string `json:"unit"`
}

// MaxListedBadRows is how many unreadable rows a LoggerRecord lists; all
// of them are counted.
const MaxListedBadRows = 200

// LoggerRecord is one imported logger file: where it came from, how it
// was read, and its readings in SI. Time and Value are never changed in
// place once imported (Clone shares them).
type LoggerRecord struct {
	// ID identifies this import; a new import of the same file gets a
	// new one.
	ID string `json:"id"`
	// File is the name of the file as picked, Size its length in bytes.
	File     string    `json:"file"`
	Size     int64     `json:"size,omitempty"`
	Imported time.Time `json:"imported"`
	// Options and Mapping are how the file was read (detected, then
	// changed by the user); Mapping has the one value column imported.
	Options fielddata.Options `json:"options"`
	Mapping fielddata.Mapping `json:"mapping"`
	// Name, Kind, Unit and Density describe the value column (see
	// fielddata.Series).
	Name    string              `json:"name"`
	Kind    fielddata.ValueKind `json:"kind"`
	Unit    string              `json:"unit,omitempty"`
	Density float64             `json:"density,omitempty"`
	// Clock reports that Time holds Unix seconds (UTC); else elapsed
	// seconds as in the file.
	Clock bool `json:"clock,omitempty"`
	// Time (s) and Value (m: depth, level or head of water) have one
	// entry per reading, stored compactly (see Samples).
	Time  Samples `json:"time"`
	Value Samples `json:"value"`
	// Preamble holds the metadata lines above the header (at most 50).
	Preamble []fielddata.MetaLine `json:"preamble,omitempty"`
	// Lines is the number of lines read.
	Lines int `json:"lines,omitempty"`
	// Bad summarises the rows that could not be read and what the user
	// decided.
	Bad BadRows `json:"bad"`
	// Checks counts the odd times found on import.
	Checks TimeChecks `json:"checks"`
}

// BadRows summarises the unreadable rows of an import.
type BadRows struct {
	// Count is the number of rows that could not be read.
	Count int `json:"count,omitempty"`
	// Listed are the first MaxListedBadRows of them.
	Listed []BadRow `json:"listed,omitempty"`
	// Skipped records the user's decision to keep the record without
	// them (an import with bad rows is only stored when they are
	// skipped).
	Skipped bool `json:"skipped,omitempty"`
}

// BadRow is one unreadable row: its line in the file, the column, the
// cell's text and why it could not be read.
type BadRow struct {
	Row    int    `json:"row"`
	Column string `json:"column,omitempty"`
	Value  string `json:"value,omitempty"`
	Why    string `json:"why"`
}

// TimeChecks counts what was odd about the times of a record.
type TimeChecks struct {
	Duplicates int `json:"duplicates,omitempty"`
	Gaps       int `json:"gaps,omitempty"`
	Backward   int `json:"backward,omitempty"`
	// Interval is the median interval between readings (s).
	Interval float64 `json:"interval,omitempty"`
}

// Len returns the number of readings.
func (r *LoggerRecord) Len() int { return len(r.Time) }

// Series returns the record as a fielddata.Series; the slices are shared.
func (r *LoggerRecord) Series() fielddata.Series {
	return fielddata.Series{Name: r.Name, Kind: r.Kind, Unit: r.Unit, Density: r.Density, Clock: r.Clock,
		Time: r.Time, Value: r.Value}
}

// check reports what is inconsistent in the record.
func (r *LoggerRecord) check(what string) error {
	if r.ID == "" {
		return fmt.Errorf("%w: the %s logger record has no id", ErrInvalid, what)
	}
	if len(r.Time) != len(r.Value) {
		return fmt.Errorf("%w: the %s logger record %q has %d times and %d values", ErrInvalid, what, r.File, len(r.Time), len(r.Value))
	}
	switch r.Kind {
	case fielddata.Depth, fielddata.Level, fielddata.Pressure:
	default:
		return fmt.Errorf("%w: the %s logger record %q has kind %q", ErrInvalid, what, r.File, r.Kind)
	}
	for i := range r.Time {
		if !finite(r.Time[i]) || !finite(r.Value[i]) {
			return fmt.Errorf("%w: the %s logger record %q: reading %d is not finite", ErrInvalid, what, r.File, i+1)
		}
	}
	return nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// clone returns a copy of d whose settings can be changed without
// touching d; the readings are shared.
func (d *LoggerData) clone() *LoggerData {
	if d == nil {
		return nil
	}
	q := *d
	q.Water = d.Water.clone()
	q.Baro = d.Baro.clone()
	q.Conditioning = CloneConditioning(d.Conditioning)
	q.Rates = append([]RateRow(nil), d.Rates...)
	return &q
}

func (r *LoggerRecord) clone() *LoggerRecord {
	if r == nil {
		return nil
	}
	q := *r
	q.Mapping.Values = append([]fielddata.ValueColumn(nil), r.Mapping.Values...)
	q.Preamble = append([]fielddata.MetaLine(nil), r.Preamble...)
	q.Bad.Listed = append([]BadRow(nil), r.Bad.Listed...)
	return &q
}

// CloneConditioning returns a deep copy of c.
func CloneConditioning(c fielddata.Conditioning) fielddata.Conditioning {
	q := c
	cp := func(p *float64) *float64 {
		if p == nil {
			return nil
		}
		v := *p
		return &v
	}
	q.Start, q.Stop = cp(c.Start), cp(c.Stop)
	if c.Baro != nil {
		b := *c.Baro
		q.Baro = &b
	}
	if c.Efficiency != nil {
		e := *c.Efficiency
		q.Efficiency = &e
	}
	if c.Trend != nil {
		t := *c.Trend
		q.Trend = &t
	}
	if c.Static != nil {
		s := *c.Static
		q.Static = &s
	}
	if c.Thin != nil {
		t := *c.Thin
		q.Thin = &t
	}
	if c.Rates != nil {
		q.Rates = append(fielddata.Schedule{}, c.Rates...)
	}
	return q
}

// Samples is a column of readings that is stored compactly: in JSON it
// is a string of the base64 (standard alphabet, padded) encoding of the
// values as little-endian IEEE 754 float64, 8 bytes a reading, so that
// every value comes back exactly; a million readings take 10.7 MB of
// text. A JSON array of numbers is read too (for files written by hand).
type Samples []float64

// MarshalJSON writes the samples as a base64 string.
func (s Samples) MarshalJSON() ([]byte, error) { return s.AppendJSON(nil) }

// AppendJSON appends the samples to dst as a base64 string.
func (s Samples) AppendJSON(dst []byte) ([]byte, error) {
	const chunk = 3 * 1024 // values encoded at a time: 24 kB, a multiple of 3 bytes
	var raw [8 * chunk]byte
	dst = append(dst, '"')
	for k := 0; k < len(s); k += chunk {
		part := s[k:min(k+chunk, len(s))]
		for i, v := range part {
			binary.LittleEndian.PutUint64(raw[8*i:], math.Float64bits(v))
		}
		dst = base64.StdEncoding.AppendEncode(dst, raw[:8*len(part)])
	}
	return append(dst, '"'), nil
}

// errSamples is wrapped by the errors of Samples.UnmarshalJSON.
var errSamples = errors.New("samples must be a base64 string of little-endian float64 values or an array of numbers")

// UnmarshalJSON reads a base64 string (or an array of numbers).
func (s *Samples) UnmarshalJSON(b []byte) error {
	if len(b) > 0 && b[0] == '[' {
		var v []float64
		if err := jsonc.Unmarshal(b, &v); err != nil {
			return fmt.Errorf("%w: %v", errSamples, err)
		}
		*s = v
		return nil
	}
	if string(b) == "null" {
		*s = nil
		return nil
	}
	if len(b) < 2 || b[0] != '"' || b[len(b)-1] != '"' {
		return errSamples
	}
	body := b[1 : len(b)-1]
	raw := make([]byte, base64.StdEncoding.DecodedLen(len(body)))
	n, err := base64.StdEncoding.Decode(raw, body)
	if err != nil {
		return fmt.Errorf("%w: %v", errSamples, err)
	}
	if n%8 != 0 {
		return fmt.Errorf("%w: %d bytes is not a whole number of values", errSamples, n)
	}
	v := make([]float64, n/8)
	for i := range v {
		v[i] = math.Float64frombits(binary.LittleEndian.Uint64(raw[8*i:]))
	}
	*s = v
	return nil
}
