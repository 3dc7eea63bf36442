package regime

import (
	"fmt"
	"math"

	"fieldfit/models/diagnostic"
)

// StopSettings control CanStop. The zero value works, and a nil
// *StopSettings means the zero value.
type StopSettings struct {
	// Tolerance is the relative band of a flat derivative: every value
	// over the stretch lies within ±Tolerance of one level. If Tolerance
	// is 0 it is defaulted to 0.10 (±10 %, common practice).
	Tolerance float64

	// Cycles is the span, in log₁₀ cycles of time up to the last reading,
	// over which the derivative must have been flat. If Cycles is 0 it is
	// defaulted to 0.5 (common practice).
	Cycles float64

	// Window is the smoothing window of the derivative in natural-log
	// units (diagnostic.Settings.Window). If Window is 0 it is defaulted
	// to diagnostic.DefaultWindow (0.2).
	Window float64

	// MinPoints is the least number of readings in the flat stretch. If
	// MinPoints is 0 it is defaulted to 3.
	MinPoints int
}

// Stop is the outcome of CanStop.
type Stop struct {
	// Flat reports whether the derivative has been flat within the
	// tolerance for at least the required part of a log cycle up to the
	// last reading (and over MinPoints readings).
	Flat bool
	// Readings is the number of readings given.
	Readings int
	// Since is the time of the first reading of the flat stretch that
	// ends at the last reading, s (t₁), and SinceIndex its index; the
	// stretch may be a single reading. Both are NaN / −1 with fewer than
	// 3 readings or when the last derivative is not positive.
	Since      float64
	SinceIndex int
	// Last is the time of the last reading, s.
	Last float64
	// Cycles = log₁₀(Last/Since) is the span of the flat stretch, and
	// Need the span required (StopSettings.Cycles).
	Cycles, Need float64
	// Level is the median derivative over the flat stretch, m, Low and
	// High its least and largest value, and Deviation the largest
	// |D/Level − 1| over it.
	Level, Low, High, Deviation float64
	// FlatAt = Since·10^Need is when the required span is reached if the
	// derivative stays flat, s.
	FlatAt float64
	// OneCycleAt = 10·Since is when one full log cycle of flat
	// derivative is reached, and Remaining = OneCycleAt − Last the time
	// left until then (≤ 0 once reached), s.
	OneCycleAt, Remaining float64
	// Text is the indicator in words: it starts "flat since …" or
	// "not yet: …".
	Text string
	// Derivative is the log-derivative of the readings (nil with fewer
	// than 3 readings).
	Derivative *diagnostic.Result
}

// CanStop tells, from the readings so far (t since pumping began, s,
// strictly increasing; s the drawdown, m), whether the derivative
// ds/d ln t has been flat within ±Tolerance of one level from some time t₁
// to the last reading over at least Cycles log cycles, and when one full
// log cycle of flat derivative (t₁ → 10·t₁) will be reached. The flat
// stretch is the longest run of readings ending at the last one whose
// derivatives are positive and satisfy max·(1 − tol) ≤ min·(1 + tol).
//
// With fewer than 3 readings it gives a "not yet" and no error. Whether
// the flat stretch is radial flow (and not, say, a level reached by
// leakage) is for the user to judge with the plots and Diagnose.
//
// Errors in the readings are the *diagnostic.InputError values of
// diagnostic.Derivative, naming the index; bad settings are *Error values.
func CanStop(t, s []float64, set *StopSettings) (*Stop, error) {
	var z StopSettings
	if set != nil {
		z = *set
	}
	tol, need, minPts := z.Tolerance, z.Cycles, z.MinPoints
	if tol == 0 {
		tol = 0.10
	}
	if need == 0 {
		need = 0.5
	}
	if minPts == 0 {
		minPts = 3
	}
	switch {
	case bad(tol) || !(tol > 0 && tol < 1):
		return nil, settingErr("Tolerance", z.Tolerance, "must lie in (0, 1)")
	case bad(need) || !(need > 0 && need <= 100):
		return nil, settingErr("Cycles", z.Cycles, "must lie in (0, 100]")
	case bad(z.Window) || z.Window < 0:
		return nil, settingErr("Window", z.Window, "the smoothing window must be a finite number ≥ 0")
	case minPts < 2:
		return nil, settingErr("MinPoints", float64(z.MinPoints), "at least 2 readings are needed")
	}
	n := len(t)
	st := &Stop{Readings: n, Since: math.NaN(), SinceIndex: -1, Last: math.NaN(), Cycles: 0, Need: need,
		Level: math.NaN(), Low: math.NaN(), High: math.NaN(), Deviation: math.NaN(), FlatAt: math.NaN(), OneCycleAt: math.NaN(), Remaining: math.NaN()}
	if n < 3 {
		if len(s) != n {
			// Let diagnostic name the mismatch.
			_, err := diagnostic.Derivative(t, s, nil)
			return nil, err
		}
		st.Text = fmt.Sprintf("not yet: %d reading(s) so far; a derivative needs at least 3.", n)
		return st, nil
	}
	der, err := diagnostic.Derivative(t, s, &diagnostic.Settings{Window: z.Window})
	if err != nil {
		return nil, err
	}
	st.Derivative = der
	d := der.D
	st.Last = t[n-1]
	if !(d[n-1] > 0) {
		st.Text = fmt.Sprintf("not yet: the derivative at the last reading (%s) is %.4g m, not positive: the drawdown is not rising.", fmtTime(st.Last), d[n-1])
		return st, nil
	}
	hi, lo := d[n-1], d[n-1]
	k := n - 1
	for k > 0 && d[k-1] > 0 {
		h, l := math.Max(hi, d[k-1]), math.Min(lo, d[k-1])
		if h*(1-tol) > l*(1+tol) {
			break
		}
		hi, lo = h, l
		k--
	}
	st.SinceIndex, st.Since = k, t[k]
	st.Low, st.High = lo, hi
	st.Cycles = math.Log10(st.Last / st.Since)
	st.Level = median(d[k:])
	st.Deviation = 0
	for _, v := range d[k:] {
		st.Deviation = math.Max(st.Deviation, math.Abs(v/st.Level-1))
	}
	st.FlatAt = st.Since * math.Pow(10, need)
	st.OneCycleAt = 10 * st.Since
	st.Remaining = st.OneCycleAt - st.Last
	st.Flat = st.Cycles >= need && n-k >= minPts

	band := fmt.Sprintf("within a ±%.0f %% band (%.4g to %.4g m)", 100*tol, st.Low, st.High)
	switch {
	case st.Flat && st.Remaining <= 0:
		st.Text = fmt.Sprintf("flat since %s (%s), %s: one full log cycle of flat derivative was reached at %s.",
			fmtTime(st.Since), cyclesText(st.Cycles, false), band, fmtTime(st.OneCycleAt))
	case st.Flat:
		st.Text = fmt.Sprintf("flat since %s (%s), %s: one full log cycle from %s is reached at %s, in %s.",
			fmtTime(st.Since), cyclesText(st.Cycles, false), band, fmtTime(st.Since), fmtTime(st.OneCycleAt), fmtTime(st.Remaining))
	case k == n-1:
		st.Text = fmt.Sprintf("not yet: the derivative at the last reading (%.4g m at %s) is not within ±%.0f %% of the one before; it is still changing.",
			d[n-1], fmtTime(st.Last), 100*tol)
	case n-k < minPts:
		st.Text = fmt.Sprintf("not yet: the derivative has been %s over only %d readings since %s (%d needed).",
			band, n-k, fmtTime(st.Since), minPts)
	default:
		st.Text = fmt.Sprintf("not yet: the derivative has been %s only since %s (%s; %.2g needed); if it stays so, that is reached at %s, one full log cycle at %s.",
			band, fmtTime(st.Since), cyclesText(st.Cycles, true), need, fmtTime(st.FlatAt), fmtTime(st.OneCycleAt))
	}
	return st, nil
}

// cyclesText words a span in log cycles: "0.7 of a log cycle", "2.0 log
// cycles". With down, the span is rounded down to a tenth, so that a
// stretch just short of the required span never reads as long enough.
func cyclesText(c float64, down bool) string {
	if down {
		c = math.Floor(c*10+1e-9) / 10
	} else {
		c = math.Round(c*10) / 10
	}
	if c < 1 {
		return fmt.Sprintf("%.1f of a log cycle", c)
	}
	return fmt.Sprintf("%.1f log cycles", c)
}
