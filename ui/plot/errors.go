package plot

import (
	"errors"
	"fmt"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is.
var (
	// ErrSize: the chart width or height is out of range.
	ErrSize = errors.New("chart size out of range")
	// ErrRange: an axis range or window is unusable (NaN, infinite,
	// reversed, or ≤ 0 on a log axis).
	ErrRange = errors.New("invalid range")
	// ErrLength: the slices of a series differ in length.
	ErrLength = errors.New("slice lengths differ")
	// ErrSeries: a series field is set that its kind does not use, or
	// the kind is unknown.
	ErrSeries = errors.New("invalid series")
	// ErrStyle: a style value is out of range.
	ErrStyle = errors.New("invalid style")
)

// Error says what in a Chart is wrong. Series is the index of the series
// concerned, or -1; Field names the field ("Width", "X.Min", "Y2",
// "Style.Width", …).
type Error struct {
	Series int
	Name   string // the series name, when Series ≥ 0
	Field  string
	Err    error
}

func (e *Error) Error() string {
	msg := "plot: "
	if e.Series >= 0 {
		msg += fmt.Sprintf("series %d", e.Series)
		if e.Name != "" {
			msg += fmt.Sprintf(" (%q)", e.Name)
		}
		msg += ", "
	}
	return msg + e.Field + ": " + e.Err.Error()
}

// Unwrap returns the wrapped error.
func (e *Error) Unwrap() error { return e.Err }

func chartErr(field string, sentinel error, format string, args ...any) error {
	return &Error{Series: -1, Field: field, Err: fmt.Errorf("%w: "+format, append([]any{sentinel}, args...)...)}
}

func seriesErr(i int, name, field string, sentinel error, format string, args ...any) error {
	return &Error{Series: i, Name: name, Field: field, Err: fmt.Errorf("%w: "+format, append([]any{sentinel}, args...)...)}
}
