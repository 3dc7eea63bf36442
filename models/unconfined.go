package models

import (
	"fmt"
	"math"
)

// jacobCorrectionWarn is the ratio s/b above which JacobCorrection warns:
// a quarter of the saturated thickness (common practice, no published
// source).
const jacobCorrectionWarn = 0.25

// JacobCorrection applies Jacob's correction for the thinning of an
// unconfined aquifer to the observed drawdowns d.Value,
//
//	s′ = s − s²/(2b),
//
// with b the initial saturated thickness (m), and returns a corrected copy
// of d (times, weights and exclusion marks carried over; d is not
// modified). Theis or Cooper–Jacob fitted to s′ then give T = K·b and the
// specific yield as S. It is an approximation: it accounts for the
// reduced transmissivity near the well (from h₀² − h² = 2b·s′) but not
// for delayed yield or vertical flow, and holds for drawdowns small
// against b and for late time; delayed-yield models are the better choice
// for early readings. Excluded readings are copied unchanged.
//
// The notes returned warn when a used drawdown exceeds b/4 (a threshold of
// common practice). A used drawdown s ≥ b (the well would be dewatered to
// its base) or a value that is not a finite number is an error naming the
// reading, as is a thickness that is not a finite positive number.
//
// Reference: Jacob, C.E. (1944), Notes on determining permeability by
// pumping tests under water-table conditions, US Geological Survey
// open-file report (citation from memory, not re-read).
func JacobCorrection(d Data, b float64) (Data, []string, error) {
	const name = "Jacob's correction (1944)"
	if bad(b) || !(b > 0) {
		return Data{}, nil, errf(name, "b", b, ErrBadConstant, "the saturated thickness must be a finite positive number of metres")
	}
	if len(d.Value) != len(d.Time) {
		return Data{}, nil, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%d values for %d times", len(d.Value), len(d.Time))}
	}
	if d.Exclude != nil && len(d.Exclude) != len(d.Time) {
		return Data{}, nil, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%d exclusion marks for %d times", len(d.Exclude), len(d.Time))}
	}
	out := Data{
		Time:  append([]float64(nil), d.Time...),
		Value: make([]float64, len(d.Value)),
	}
	if d.Weight != nil {
		out.Weight = append([]float64(nil), d.Weight...)
	}
	if d.Exclude != nil {
		out.Exclude = append([]bool(nil), d.Exclude...)
	}
	over, first, largest := 0, -1, 0.0
	for i, s := range d.Value {
		if d.Exclude != nil && d.Exclude[i] {
			out.Value[i] = s
			continue
		}
		if bad(s) {
			return Data{}, nil, &Error{Method: name, Index: i, Field: "drawdown", Value: s, Err: ErrBadReading, Reason: "not a finite number"}
		}
		if s >= b {
			return Data{}, nil, &Error{Method: name, Index: i, Field: "drawdown", Value: s, Err: ErrBadReading,
				Reason: fmt.Sprintf("drawdown reaches the saturated thickness b = %g m; the correction does not apply", b)}
		}
		if math.Abs(s) > jacobCorrectionWarn*b {
			over++
			if first < 0 {
				first = i
			}
			largest = math.Max(largest, math.Abs(s))
		}
		out.Value[i] = s - s*s/(2*b)
	}
	var notes []string
	if over > 0 {
		notes = append(notes, fmt.Sprintf(
			"%d drawdowns (the first at point %d, the largest %.3g m) exceed a quarter of the saturated thickness (b/4 = %.3g m, a threshold of common practice): Jacob's correction is a rough approximation there.",
			over, first, largest, jacobCorrectionWarn*b))
	}
	return out, notes, nil
}

// JacobUncorrected inverts Jacob's correction: it returns the drawdown s
// whose corrected value s − s²/(2b) is sc, s = b − √(b² − 2b·sc), for
// drawing a curve fitted to corrected drawdowns against the readings as
// observed. It returns NaN when sc > b/2 (no drawdown below b corrects to
// it) or b is not positive.
func JacobUncorrected(sc, b float64) float64 {
	if !(b > 0) || !(sc <= b/2) {
		return math.NaN()
	}
	// b − √(b² − 2b·sc) = 2b·sc/(b + √(b² − 2b·sc)), without cancellation.
	return 2 * b * sc / (b + math.Sqrt(b*b-2*b*sc))
}
