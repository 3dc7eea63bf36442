package models

import (
	"errors"
	"fmt"
	"strconv"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is.
var (
	// ErrBadReading: a reading (time, value or weight) cannot be used.
	ErrBadReading = errors.New("unusable reading")
	// ErrBadConstant: a constant of the test (pumping rate, distance,
	// pumping time …) cannot be used.
	ErrBadConstant = errors.New("unusable test constant")
	// ErrTooFewPoints: fewer usable points than the method needs.
	ErrTooFewPoints = errors.New("too few points")
	// ErrLength: the columns of the data have different lengths.
	ErrLength = errors.New("columns of different lengths")
	// ErrBadStart: a starting guess has the wrong length or a value
	// outside its parameter's range.
	ErrBadStart = errors.New("unusable starting guess")
	// ErrNoTrend: the data do not show the trend the method needs, e.g.
	// drawdown that does not grow with time.
	ErrNoTrend = errors.New("data do not show the expected trend")
	// ErrFit: the solver failed; the wrapped fitcore error says why.
	ErrFit = errors.New("fit failed")
)

// Error says what is wrong and where: the method, the index of the point
// (or -1), the field or constant concerned, the offending value and why.
type Error struct {
	// Method is the model or method, e.g. "Theis (1935)".
	Method string
	// Index is the 0-based index of the point in the Data, or -1 when the
	// error is not about one point.
	Index int
	// Field names the column or constant: "time", "drawdown", "weight",
	// "Q", "r", a parameter name …; it is empty when the error is about
	// no single value.
	Field string
	// Value is the offending value of Field.
	Value float64
	// Reason says what is wrong in plain words.
	Reason string
	// Err is the sentinel (ErrBadReading …) or the wrapped cause.
	Err error
}

func (e *Error) Error() string {
	msg := "models: "
	if e.Method != "" {
		msg += e.Method + ": "
	}
	if e.Index >= 0 {
		msg += "point " + strconv.Itoa(e.Index) + ", "
	}
	if e.Field != "" {
		msg += e.Field + " = " + strconv.FormatFloat(e.Value, 'g', -1, 64) + ": "
	}
	if e.Reason != "" {
		msg += e.Reason
	} else if e.Err != nil {
		msg += e.Err.Error()
	}
	if e.Reason != "" && e.Err != nil && !isSentinel(e.Err) {
		msg += ": " + e.Err.Error()
	}
	return msg
}

func (e *Error) Unwrap() error { return e.Err }

func isSentinel(err error) bool {
	switch err {
	case ErrBadReading, ErrBadConstant, ErrTooFewPoints, ErrLength, ErrBadStart, ErrNoTrend, ErrFit:
		return true
	}
	return false
}

// errf builds an *Error without a point index.
func errf(method, field string, value float64, sentinel error, format string, args ...any) *Error {
	return &Error{Method: method, Index: -1, Field: field, Value: value, Err: sentinel, Reason: fmt.Sprintf(format, args...)}
}
