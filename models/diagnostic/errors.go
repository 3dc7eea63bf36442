package diagnostic

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors wrapped by *InputError; test for them with errors.Is.
var (
	// ErrLength: the time and drawdown slices differ in length.
	ErrLength = errors.New("time and drawdown have different lengths")
	// ErrTooFew: fewer than two points.
	ErrTooFew = errors.New("at least two points are needed")
	// ErrNotFinite: a value is NaN or infinite.
	ErrNotFinite = errors.New("not a finite number")
	// ErrNonPositiveTime: a time is zero or negative, so it has no logarithm.
	ErrNonPositiveTime = errors.New("time must be greater than zero")
	// ErrUnsorted: a time (or abscissa) is smaller than the one before it.
	ErrUnsorted = errors.New("times are not in increasing order")
	// ErrDuplicateTime: a time (or abscissa) equals the one before it.
	ErrDuplicateTime = errors.New("time equals the previous time")
	// ErrWindow: the smoothing window is negative, NaN or infinite.
	ErrWindow = errors.New("smoothing window must be a finite number ≥ 0")
	// ErrRange: a sampling range or count is unusable.
	ErrRange = errors.New("invalid sampling range")
)

// InputError says which value is wrong and where. Index is the 0-based
// position in the input slices (or -1 when the error concerns no single
// point); Field names the input ("t", "s", "x", "window", …).
type InputError struct {
	Index int
	Field string
	Value float64
	Err   error
}

func (e *InputError) Error() string {
	msg := "diagnostic: "
	if e.Index >= 0 {
		msg += fmt.Sprintf("index %d, ", e.Index)
	}
	msg += fmt.Sprintf("%s = %s: %v", e.Field, formatValue(e.Value), e.Err)
	return msg
}

// Unwrap returns the sentinel error.
func (e *InputError) Unwrap() error { return e.Err }

func formatValue(v float64) string {
	switch {
	case math.IsNaN(v):
		return "NaN"
	case math.IsInf(v, 1):
		return "+Inf"
	case math.IsInf(v, -1):
		return "-Inf"
	}
	return fmt.Sprintf("%g", v)
}
