package fielddata

import (
	"errors"
	"fmt"
	"strings"
	"unicode/utf8"
)

// Sentinel errors. The errors of this package wrap one of them; test with
// errors.Is. The cell-level ones read as the end of a sentence after the
// cell's text ("12,3x" is not a number).
var (
	// ErrEmpty: the file holds no bytes, or only blank lines.
	ErrEmpty = errors.New("the file is empty")
	// ErrNotText: the file is not delimited text (see *NotTextError).
	ErrNotText = errors.New("not delimited text")
	// ErrNotNumber: a value cell does not hold a decimal number in the
	// chosen decimal mark.
	ErrNotNumber = errors.New("is not a number")
	// ErrTime: a time cell cannot be read as a date, a clock time or an
	// elapsed time.
	ErrTime = errors.New("is not a time")
	// ErrMissing: a mapped cell is empty.
	ErrMissing = errors.New("the cell is empty")
	// ErrFields: a row has fewer fields than the mapping needs.
	ErrFields = errors.New("too few fields")
	// ErrQuote: a quoted field is not closed on its line.
	ErrQuote = errors.New("a quote is not closed")
	// ErrLineTooLong: a line is longer than MaxLine bytes; the file is
	// not a logger file of readings.
	ErrLineTooLong = errors.New("line too long")
	// ErrDateOrder: dates such as 05/06/2024 are in the file and the
	// Mapping does not say whether the day or the month comes first.
	// Import stops on it whatever the bad-row policy: it is a question for
	// the user, not a bad row.
	ErrDateOrder = errors.New("can be read day-first or month-first: choose the date order")
	// ErrBadRows: some rows could not be read (see *BadRowsError).
	ErrBadRows = errors.New("rows could not be read")
	// ErrNoData: no row of readings could be read.
	ErrNoData = errors.New("no readings could be read")
	// ErrMapping: the column mapping does not fit the file or is
	// incomplete (see *SettingError).
	ErrMapping = errors.New("invalid column mapping")
	// ErrOption: a reading option is unknown or out of range.
	ErrOption = errors.New("invalid option")
	// ErrSetting: a conditioning setting is out of range or inconsistent
	// with the data (see *SettingError).
	ErrSetting = errors.New("invalid setting")
	// ErrSeries: a series handed to a conditioning function is unusable
	// (lengths differ, not finite, too short).
	ErrSeries = errors.New("unusable series")
)

// maxValueText is the longest cell text kept in a RowError.
const maxValueText = 60

// RowError says which cell of which row could not be read, like
// encoding/csv's ParseError. Row is the 1-based line number in the file
// as a text editor counts it (preamble and header lines included).
type RowError struct {
	Row    int
	Column int    // 0-based column index, or -1 when the row as a whole is at fault
	Name   string // the column's header text (or "column 3" when the file has none)
	Value  string // the cell's text, cut to 60 characters
	Err    error  // wraps one of the sentinels above
}

func (e *RowError) Error() string {
	var b strings.Builder
	fmt.Fprintf(&b, "row %d", e.Row)
	switch {
	case e.Name != "":
		fmt.Fprintf(&b, ", column %q", e.Name)
	case e.Column >= 0:
		fmt.Fprintf(&b, ", column %d", e.Column+1)
	}
	b.WriteString(": ")
	if e.Value != "" {
		fmt.Fprintf(&b, "%q ", e.Value)
	}
	b.WriteString(e.Err.Error())
	return b.String()
}

func (e *RowError) Unwrap() error { return e.Err }

// cellText makes the Value of a RowError: valid UTF-8, at most
// maxValueText runes.
func cellText(b []byte) string {
	s := strings.ToValidUTF8(string(b), "\uFFFD")
	if utf8.RuneCountInString(s) > maxValueText {
		r := []rune(s)
		s = string(r[:maxValueText]) + "…"
	}
	return s
}

// BadRowsError is returned by Import, together with the record of the
// rows that could be read, when rows could not be read and the policy is
// CollectBadRows: the user decides whether to keep the record without them
// (skip) or to give up (stop). Count is the number of bad rows, First the
// first of them; Record.Bad lists them.
type BadRowsError struct {
	Count int
	First *RowError
}

func (e *BadRowsError) Error() string {
	if e.Count == 1 {
		return fmt.Sprintf("1 row could not be read: %v", e.First)
	}
	return fmt.Sprintf("%d rows could not be read; the first: %v", e.Count, e.First)
}

// Unwrap returns ErrBadRows and the first RowError, so that both
// errors.Is(err, ErrBadRows) and errors.As(err, &rowErr) work.
func (e *BadRowsError) Unwrap() []error { return []error{ErrBadRows, e.First} }

// NotTextError says that a file is not delimited text, in one sentence
// naming what it looks like.
type NotTextError struct {
	// Kind is what the file looks like: "a ZIP archive (spreadsheet
	// workbooks are ZIP archives)", "a PNG image", "binary data" …
	Kind string
}

func (e *NotTextError) Error() string {
	return "This file is " + e.Kind + ", not delimited text: export the readings from the logger software as CSV or plain text and open that file."
}

func (e *NotTextError) Unwrap() error { return ErrNotText }

// SettingError names a setting (of a Mapping, Options, Conditioning or a
// rate schedule) whose value is wrong, and why.
type SettingError struct {
	Field string // e.g. "values[1].unit", "stop", "rates[2].start"
	Value string // the offending value as text, or ""
	Err   error  // wraps ErrMapping, ErrOption or ErrSetting
}

func (e *SettingError) Error() string {
	if e.Value != "" {
		return fmt.Sprintf("%s = %s: %v", e.Field, e.Value, e.Err)
	}
	return fmt.Sprintf("%s: %v", e.Field, e.Err)
}

func (e *SettingError) Unwrap() error { return e.Err }

func settingErr(sentinel error, field, value, format string, args ...any) *SettingError {
	return &SettingError{Field: field, Value: value, Err: fmt.Errorf("%w: "+format, append([]any{sentinel}, args...)...)}
}
