package diagnostic

import (
	"fmt"
	"math"
)

// MaxSamples is the largest sample count SampleCurve accepts.
const MaxSamples = 1_000_000

// Steps in ln t of the central differences that SampleCurve extrapolates
// when a curve has no analytic derivative: h, h/2 and h/4 with h = 0.02.
const sampleStep = 0.02

// Curve is a smooth model curve s(t) to sample, such as a fitted Theis
// drawdown.
type Curve struct {
	// S returns the model value at time t > 0. It is required.
	S func(t float64) float64
	// DS, if not nil, returns the exact derivative ds/dt at t, and the
	// log-derivative is t·DS(t). If DS is nil the log-derivative is the
	// central difference of S in ln t with steps 0.02, 0.01 and 0.005,
	// Richardson-extrapolated to sixth order: S is then evaluated at
	// t·e^(±0.02) too, just outside [tMin, tMax] at the ends.
	DS func(t float64) float64
}

// Samples are a model curve and its log-derivative on a grid.
type Samples struct {
	T []float64 // sample times, logarithmically spaced, T[0] = tMin, T[n−1] = tMax
	S []float64 // S(T[i])
	D []float64 // ds/d ln t at T[i]
	// Exact is true when D came from Curve.DS, false when it came from
	// the extrapolated differences.
	Exact bool
}

// SampleCurve samples the curve c and its log-derivative ds/d ln t at n
// logarithmically spaced times from tMin to tMax (0 < tMin < tMax, 2 ≤ n ≤
// MaxSamples). Unlike Derivative it applies no smoothing window: it gives
// the model's own derivative, to be drawn beside the data derivative.
//
// A NaN or infinite model value is an error (an *InputError naming the
// sample index and time, wrapping ErrNotFinite).
func SampleCurve(c Curve, tMin, tMax float64, n int) (*Samples, error) {
	if c.S == nil {
		return nil, &InputError{Index: -1, Field: "curve", Value: math.NaN(),
			Err: fmt.Errorf("%w: Curve.S is nil", ErrRange)}
	}
	bad := func(field string, v float64, why string) error {
		return &InputError{Index: -1, Field: field, Value: v, Err: fmt.Errorf("%w: %s", ErrRange, why)}
	}
	switch {
	case !(tMin > 0) || math.IsInf(tMin, 0):
		return nil, bad("tMin", tMin, "must be a finite time > 0")
	case !(tMax > tMin) || math.IsInf(tMax, 0):
		return nil, bad("tMax", tMax, "must be finite and greater than tMin")
	case n < 2 || n > MaxSamples:
		return nil, bad("n", float64(n), fmt.Sprintf("must be from 2 to %d", MaxSamples))
	}
	out := &Samples{
		T:     make([]float64, n),
		S:     make([]float64, n),
		D:     make([]float64, n),
		Exact: c.DS != nil,
	}
	x0, x1 := math.Log(tMin), math.Log(tMax)
	dx := (x1 - x0) / float64(n-1)
	for i := range out.T {
		t := math.Exp(x0 + float64(i)*dx)
		switch i {
		case 0:
			t = tMin
		case n - 1:
			t = tMax
		}
		out.T[i] = t
		s := c.S(t)
		if math.IsNaN(s) || math.IsInf(s, 0) {
			return nil, &InputError{Index: i, Field: "S(t)", Value: s,
				Err: fmt.Errorf("%w (at t = %g)", ErrNotFinite, t)}
		}
		out.S[i] = s
		var d float64
		if c.DS != nil {
			ds := c.DS(t)
			d = t * ds
			if math.IsNaN(ds) || math.IsInf(d, 0) {
				return nil, &InputError{Index: i, Field: "DS(t)", Value: ds,
					Err: fmt.Errorf("%w (at t = %g)", ErrNotFinite, t)}
			}
		} else {
			var err error
			if d, err = logSlope(c.S, t); err != nil {
				return nil, &InputError{Index: i, Field: "S(t)", Value: math.NaN(),
					Err: fmt.Errorf("%w (near t = %g, for the derivative)", err, t)}
			}
		}
		out.D[i] = d
	}
	return out, nil
}

// logSlope returns d s(e^x)/dx at x = ln t by Richardson extrapolation of
// central differences with steps h, h/2, h/4.
func logSlope(s func(float64) float64, t float64) (float64, error) {
	var c [3]float64
	h := sampleStep
	for l := range c {
		a, b := s(t*math.Exp(h)), s(t*math.Exp(-h))
		c[l] = (a - b) / (2 * h)
		if math.IsNaN(c[l]) || math.IsInf(c[l], 0) {
			return 0, ErrNotFinite
		}
		h /= 2
	}
	r0 := (4*c[1] - c[0]) / 3
	r1 := (4*c[2] - c[1]) / 3
	return (16*r1 - r0) / 15, nil
}
