package fitcore

import (
	"errors"
	"fmt"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is.
var (
	// ErrTooFewObservations: fewer observations with non-zero weight
	// than free parameters.
	ErrTooFewObservations = errors.New("fewer observations than parameters")
	// ErrNonFinite: a NaN or infinite value in the data, the start
	// point, a residual, the Jacobian or a step.
	ErrNonFinite = errors.New("not a finite number")
	// ErrBadStart: the start point violates a constraint.
	ErrBadStart = errors.New("start value outside the parameter's constraints")
	// ErrZeroColumn: a parameter has no effect on any residual.
	ErrZeroColumn = errors.New("parameter has no effect on the residuals")
	// ErrBadProblem: the problem definition is inconsistent (lengths,
	// missing Residuals, negative weights).
	ErrBadProblem = errors.New("invalid problem")
	// ErrSingular: JᵀWJ is singular at the solution, so no covariance
	// can be given.
	ErrSingular = errors.New("JᵀWJ is singular")
)

// Error describes what went wrong and where. Param is the index of the
// parameter concerned (or -1) and Obs the index of the observation (or -1).
type Error struct {
	Op    string // the stage: "check", "start", "jacobian", "step", "covariance"
	Param int
	Name  string // name of the parameter, when Param ≥ 0
	Obs   int
	Value float64 // the offending value, when there is one
	Err   error
}

func (e *Error) Error() string {
	msg := "fitcore: " + e.Op + ": "
	switch {
	case e.Param >= 0 && e.Obs >= 0:
		msg += fmt.Sprintf("parameter %s, observation %d: ", e.paramName(), e.Obs)
	case e.Param >= 0:
		msg += fmt.Sprintf("parameter %s: ", e.paramName())
	case e.Obs >= 0:
		msg += fmt.Sprintf("observation %d: ", e.Obs)
	}
	msg += e.Err.Error()
	if e.Value != 0 || errors.Is(e.Err, ErrNonFinite) || errors.Is(e.Err, ErrBadStart) {
		msg += fmt.Sprintf(" (value %g)", e.Value)
	}
	return msg
}

func (e *Error) paramName() string {
	if e.Name != "" {
		return fmt.Sprintf("%q", e.Name)
	}
	return fmt.Sprintf("#%d", e.Param)
}

func (e *Error) Unwrap() error { return e.Err }
