package steptest

import (
	"errors"
	"strconv"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is.
var (
	// ErrSchedule: the step schedule cannot be used (fewer than two
	// steps, a start time out of order, a rate that is not positive).
	ErrSchedule = errors.New("unusable step schedule")
	// ErrReading: a reading (time, drawdown or weight) cannot be used.
	ErrReading = errors.New("unusable reading")
	// ErrLength: the columns of the readings have different lengths.
	ErrLength = errors.New("columns of different lengths")
	// ErrNoReadings: a step has no readings, or too few for what is
	// asked of it.
	ErrNoReadings = errors.New("too few readings in a step")
	// ErrDuration: the equal duration Δt is not covered by the readings
	// of every step.
	ErrDuration = errors.New("duration not covered by the readings")
	// ErrSetting: a setting is out of its range.
	ErrSetting = errors.New("unusable setting")
	// ErrTooFewSteps: fewer step drawdowns than the well-loss law needs.
	ErrTooFewSteps = errors.New("too few steps")
	// ErrNoTrend: the data do not show what the method needs, e.g. a
	// single distinct rate.
	ErrNoTrend = errors.New("data do not show the needed trend")
	// ErrFit: the solver failed; the wrapped fitcore error says why.
	ErrFit = errors.New("fit failed")
	// ErrLaw: a well-loss law or efficiency cannot give the asked value.
	ErrLaw = errors.New("well-loss law cannot give this value")
)

// Error says what is wrong and where: the step (0-based index, or -1), the
// reading (0-based index into the readings, or -1), the field, the
// offending value and why. Its message numbers steps from 1 ("step 2 of
// 4") as a field sheet does, and readings by their 0-based index ("point
// 14") as package models does.
type Error struct {
	// Step is the 0-based index of the step concerned, or -1.
	Step int
	// Steps is the number of steps in the schedule (for the message), or 0.
	Steps int
	// Reading is the 0-based index of the reading concerned, or -1.
	Reading int
	// Field names the value: "start", "rate", "time", "drawdown",
	// "weight", "Duration" …; empty when no single value is at fault.
	Field string
	// Value is the offending value of Field.
	Value float64
	// Reason says what is wrong in plain words.
	Reason string
	// Err is the sentinel (ErrSchedule …) or the wrapped cause.
	Err error
}

func (e *Error) Error() string {
	msg := "steptest: "
	if e.Step >= 0 {
		msg += "step " + strconv.Itoa(e.Step+1)
		if e.Steps > 0 {
			msg += " of " + strconv.Itoa(e.Steps)
		}
		msg += ", "
	}
	if e.Reading >= 0 {
		msg += "point " + strconv.Itoa(e.Reading) + ", "
	}
	if e.Field != "" {
		msg += e.Field + " = " + strconv.FormatFloat(e.Value, 'g', -1, 64) + ": "
	}
	switch {
	case e.Reason != "":
		msg += e.Reason
	case e.Err != nil:
		msg += e.Err.Error()
	}
	if e.Reason != "" && e.Err != nil && !isSentinel(e.Err) {
		msg += ": " + e.Err.Error()
	}
	return msg
}

// Unwrap returns the sentinel or the wrapped cause.
func (e *Error) Unwrap() error { return e.Err }

func isSentinel(err error) bool {
	switch err {
	case ErrSchedule, ErrReading, ErrLength, ErrNoReadings, ErrDuration, ErrSetting,
		ErrTooFewSteps, ErrNoTrend, ErrFit, ErrLaw:
		return true
	}
	return false
}
