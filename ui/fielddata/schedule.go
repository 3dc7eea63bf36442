package fielddata

import (
	"fmt"
	"math"
	"strconv"

	"fieldfit/models/units"
)

// RateStep is one step of a pumping-rate schedule: from Start on, the
// pump runs at Rate until the next step begins or the pump stops.
type RateStep struct {
	// Start is when the step begins, in s since pumping started; the
	// first step starts at 0.
	Start float64 `json:"start"`
	// Rate is the pumping rate Q in m³/s (negative for injection).
	Rate float64 `json:"rate"`
	// Unit is the symbol of the unit the rate was given in, kept for
	// display ("L/s", "m³/h", "US gpm" …).
	Unit string `json:"unit,omitempty"`
}

// NewRateStep makes a step from a rate given in the unit with symbol
// unit (package units, quantity Rate).
func NewRateStep(start, rate float64, unit string) (RateStep, error) {
	u, ok := units.Lookup(unit)
	if !ok || u.Quantity != units.Rate {
		return RateStep{}, settingErr(ErrSetting, "unit", unit, "a unit of pumping rate (L/s, m³/h, US gpm …) is expected")
	}
	s := RateStep{Start: start, Rate: u.ToSI(rate), Unit: u.Symbol}
	if math.IsNaN(s.Rate) || math.IsInf(s.Rate, 0) {
		return RateStep{}, settingErr(ErrSetting, "rate", strconv.FormatFloat(rate, 'g', -1, 64), "the rate must be a finite number")
	}
	return s, nil
}

// Schedule is a pumping-rate schedule, steps in time order: the input of
// variable-rate (step test) and recovery models. A constant-rate test has
// one step.
type Schedule []RateStep

// Check reports the first step that is wrong: the first not at 0, times
// not increasing or not finite, rates not finite, or a step that starts
// at or after the pump stopped (duration, s since pumping started; 0 or
// +Inf when the stop is not known).
func (s Schedule) Check(duration float64) error {
	for i, st := range s {
		f := fmt.Sprintf("rates[%d]", i)
		ts := strconv.FormatFloat(st.Start, 'g', -1, 64)
		switch {
		case math.IsNaN(st.Start) || math.IsInf(st.Start, 0):
			return settingErr(ErrSetting, f+".start", ts, "the start must be a finite time")
		case math.IsNaN(st.Rate) || math.IsInf(st.Rate, 0):
			return settingErr(ErrSetting, f+".rate", strconv.FormatFloat(st.Rate, 'g', -1, 64), "the rate must be a finite number")
		case i == 0 && st.Start != 0:
			return settingErr(ErrSetting, f+".start", ts, "the first step starts when pumping starts (0 s)")
		case i > 0 && !(st.Start > s[i-1].Start):
			return settingErr(ErrSetting, f+".start", ts, "a step must start after the step before it (%g s)", s[i-1].Start)
		case duration > 0 && !math.IsInf(duration, 1) && st.Start >= duration:
			return settingErr(ErrSetting, f+".start", ts, "the step starts after the pump stopped (%g s)", duration)
		}
	}
	return nil
}

// RateAt returns the rate (m³/s) at t seconds since pumping started: the
// rate of the last step that started at or before t, 0 before 0 or with
// no steps. It does not know when the pump stopped (see Result.RateAt).
func (s Schedule) RateAt(t float64) float64 {
	q := 0.0
	for _, st := range s {
		if st.Start > t {
			break
		}
		q = st.Rate
	}
	return q
}
