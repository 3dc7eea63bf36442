package fielddata

import "fmt"

// Encoding names the text encoding of a file.
type Encoding string

// The encodings Fieldfit reads. A byte order mark at the start of the file
// is dropped; for UTF-16 it also overrides the byte order chosen.
const (
	UTF8        Encoding = "utf-8"
	UTF16LE     Encoding = "utf-16le"
	UTF16BE     Encoding = "utf-16be"
	Latin1      Encoding = "iso-8859-1"
	Windows1252 Encoding = "windows-1252"
)

// Encodings lists the encodings offered to the user.
var Encodings = []Encoding{UTF8, UTF16LE, UTF16BE, Latin1, Windows1252}

// Delimiter names the character between the fields of a row.
type Delimiter string

// The delimiters Fieldfit reads. Spaces means any run of spaces or tabs
// (columns aligned with blanks); leading and trailing blanks are ignored.
const (
	Comma     Delimiter = "comma"
	Semicolon Delimiter = "semicolon"
	Tab       Delimiter = "tab"
	Spaces    Delimiter = "spaces"
)

// Delimiters lists the delimiters offered to the user.
var Delimiters = []Delimiter{Comma, Semicolon, Tab, Spaces}

func (d Delimiter) byte() byte {
	switch d {
	case Semicolon:
		return ';'
	case Tab:
		return '\t'
	case Spaces:
		return ' '
	}
	return ','
}

// DecimalMark names the character between the whole and the fractional
// part of numbers.
type DecimalMark string

// The decimal marks Fieldfit reads. Thousands separators are not read: a
// number written with one is reported as not a number.
const (
	Point     DecimalMark = "point"
	CommaMark DecimalMark = "comma"
)

func (m DecimalMark) byte() byte {
	if m == CommaMark {
		return ','
	}
	return '.'
}

// Options say how to read the text of a file: its encoding, the delimiter
// and decimal mark, and which lines hold the header, the units and the
// first data row. The zero value reads UTF-8, comma-delimited text with a
// decimal point and no header, data from line 1. Sniff proposes Options
// for a file; every field can be changed by the user.
type Options struct {
	// Encoding is the text encoding; "" means UTF8.
	Encoding Encoding `json:"encoding,omitempty"`
	// Delimiter separates the fields; "" means Comma. Fields may be
	// quoted with double quotes ("" inside stands for one quote).
	Delimiter Delimiter `json:"delimiter,omitempty"`
	// Decimal is the decimal mark of numbers; "" means Point. It must
	// differ from the delimiter.
	Decimal DecimalMark `json:"decimal,omitempty"`
	// HeaderRow is the 1-based line number of the row of column names; 0
	// means the file has none (columns are called "column 1", …).
	HeaderRow int `json:"headerRow,omitempty"`
	// UnitsRow is the 1-based line number of a row of units under the
	// header (e.g. ";;m;°C"); 0 means none.
	UnitsRow int `json:"unitsRow,omitempty"`
	// DataRow is the 1-based line number of the first row of readings;
	// 0 means the line after the header and units rows (1 without them).
	// Every line before it other than the header and units rows is kept
	// as preamble.
	DataRow int `json:"dataRow,omitempty"`
}

func (o Options) encoding() Encoding {
	if o.Encoding == "" {
		return UTF8
	}
	return o.Encoding
}

func (o Options) delimiter() Delimiter {
	if o.Delimiter == "" {
		return Comma
	}
	return o.Delimiter
}

func (o Options) decimal() DecimalMark {
	if o.Decimal == "" {
		return Point
	}
	return o.Decimal
}

// dataRow returns the first data line (1-based).
func (o Options) dataRow() int {
	if o.DataRow > 0 {
		return o.DataRow
	}
	return max(o.HeaderRow, o.UnitsRow) + 1
}

// Check reports the first option that is unknown or inconsistent.
func (o Options) Check() error {
	switch o.encoding() {
	case UTF8, UTF16LE, UTF16BE, Latin1, Windows1252:
	default:
		return settingErr(ErrOption, "encoding", string(o.Encoding), "unknown encoding")
	}
	switch o.delimiter() {
	case Comma, Semicolon, Tab, Spaces:
	default:
		return settingErr(ErrOption, "delimiter", string(o.Delimiter), "unknown delimiter")
	}
	switch o.decimal() {
	case Point, CommaMark:
	default:
		return settingErr(ErrOption, "decimal", string(o.Decimal), "unknown decimal mark")
	}
	if o.decimal() == CommaMark && o.delimiter() == Comma {
		return settingErr(ErrOption, "decimal", string(o.Decimal), "a decimal comma needs another delimiter than the comma")
	}
	for _, f := range []struct {
		name string
		v    int
	}{{"headerRow", o.HeaderRow}, {"unitsRow", o.UnitsRow}, {"dataRow", o.DataRow}} {
		if f.v < 0 {
			return settingErr(ErrOption, f.name, fmt.Sprint(f.v), "line numbers start at 1 (0 means none)")
		}
	}
	d := o.dataRow()
	if o.HeaderRow > 0 && o.HeaderRow >= d {
		return settingErr(ErrOption, "headerRow", fmt.Sprint(o.HeaderRow), "the header row must come before the first data row (%d)", d)
	}
	if o.UnitsRow > 0 && o.UnitsRow >= d {
		return settingErr(ErrOption, "unitsRow", fmt.Sprint(o.UnitsRow), "the units row must come before the first data row (%d)", d)
	}
	if o.UnitsRow > 0 && o.UnitsRow == o.HeaderRow {
		return settingErr(ErrOption, "unitsRow", fmt.Sprint(o.UnitsRow), "the units row cannot be the header row")
	}
	return nil
}

// Confidence says how sure Sniff is of a choice.
type Confidence int

const (
	// Unsure: the file does not tell; the screen must ask the user. It
	// is the zero value.
	Unsure Confidence = iota
	// Likely: the choice fits the sample but the evidence is indirect.
	Likely
	// Sure: the sample leaves no doubt (a byte order mark, a day 14 in
	// the first place of a date, …).
	Sure
)

func (c Confidence) String() string {
	switch c {
	case Likely:
		return "likely"
	case Sure:
		return "sure"
	}
	return "unsure"
}

// Guess is how sure Sniff is of one choice, and why, in a sentence for
// the user.
type Guess struct {
	Confidence Confidence
	Reason     string
}
