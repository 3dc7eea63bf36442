package regime

import (
	"errors"
	"strconv"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is. Errors
// in the readings themselves (a time out of order, a NaN …) come from
// package diagnostic as *diagnostic.InputError values naming the index.
var (
	// ErrSetting: a setting is out of its range.
	ErrSetting = errors.New("unusable setting")
	// ErrCandidate: a fitted result given to Compare cannot be used.
	ErrCandidate = errors.New("unusable fitted result")
)

// Error says what is wrong and where: the index (of a candidate in
// Compare, or -1), the field, the offending value and why.
type Error struct {
	// Index is the 0-based index of the candidate concerned, or -1.
	Index int
	// Label is the candidate's label, when there is one.
	Label string
	// Field names the setting or value at fault.
	Field string
	// Value is the offending value of Field.
	Value float64
	// Reason says what is wrong in plain words.
	Reason string
	// Err is the sentinel.
	Err error
}

func (e *Error) Error() string {
	msg := "regime: "
	if e.Index >= 0 {
		msg += "candidate " + strconv.Itoa(e.Index)
		if e.Label != "" {
			msg += " (" + e.Label + ")"
		}
		msg += ", "
	}
	if e.Field != "" {
		msg += e.Field + " = " + strconv.FormatFloat(e.Value, 'g', -1, 64) + ": "
	}
	if e.Reason != "" {
		return msg + e.Reason
	}
	return msg + e.Err.Error()
}

// Unwrap returns the sentinel.
func (e *Error) Unwrap() error { return e.Err }

func settingErr(field string, v float64, reason string) error {
	return &Error{Index: -1, Field: field, Value: v, Reason: reason, Err: ErrSetting}
}
