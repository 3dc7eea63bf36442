package diagnostic

import (
	"fmt"
	"math"
)

// DefaultWindow is the smoothing window L used when Settings.Window is 0:
// 0.2 in natural-log units (about 0.087 of a log10 cycle). Common practice;
// values from about 0.1 to 0.5 are in use, larger ones for noisier logger
// data.
const DefaultWindow = 0.2

// WindowFromCycles converts a smoothing window given in log10 cycles to
// natural-log units, the unit of Settings.Window: L = cycles · ln 10.
func WindowFromCycles(cycles float64) float64 { return cycles * math.Ln10 }

// Settings control the derivative. A nil *Settings or the zero value works.
type Settings struct {
	// Window is the smoothing window L in natural-log units of time
	// (ln t), the least distance between a point and each of the two
	// neighbours used with it. If Window is 0, DefaultWindow is used.
	// Use WindowFromCycles for a window given in log10 cycles. A tiny
	// positive window (say 1e-9) uses the nearest neighbours, with no
	// smoothing. Negative, NaN or infinite values are an error.
	Window float64
}

func (s *Settings) window() (float64, error) {
	if s == nil || s.Window == 0 {
		return DefaultWindow, nil
	}
	if s.Window < 0 || math.IsNaN(s.Window) || math.IsInf(s.Window, 0) {
		return 0, &InputError{Index: -1, Field: "window", Value: s.Window, Err: ErrWindow}
	}
	return s.Window, nil
}

// Stencil says which difference gave a derivative value.
type Stencil uint8

const (
	// Central: both neighbours lie at least L away (the three-point
	// weighted difference of Bourdet et al. 1989).
	Central Stencil = iota
	// Forward: no earlier point lies L away (start of the series); the
	// one-sided difference to the later neighbour is used.
	Forward
	// Backward: no later point lies L away (end of the series); the
	// one-sided difference from the earlier neighbour is used.
	Backward
	// Span: neither side has a point L away (the series is shorter than
	// the window around this point); the first and last points of the
	// series are used as neighbours, with the three-point difference for
	// inner points and the one-sided one at the two ends.
	Span
)

func (s Stencil) String() string {
	switch s {
	case Central:
		return "central"
	case Forward:
		return "forward"
	case Backward:
		return "backward"
	case Span:
		return "span"
	}
	return fmt.Sprintf("Stencil(%d)", uint8(s))
}

// Result holds the derivative of a series, one value per input point.
type Result struct {
	// D[i] is ds/d ln t at t[i] (ds/dx at x[i] for DerivativeOnAxis),
	// in the unit of s.
	D []float64
	// Stencil[i] says which difference gave D[i]. Values other than
	// Central are end-affected and biased where the curve bends.
	Stencil []Stencil
	// Left[i] and Right[i] are the indices of the neighbour points used
	// with point i; Left[i] == i for a forward difference and
	// Right[i] == i for a backward one.
	Left, Right []int
	// Window is the smoothing window L that was used.
	Window float64
}

// Derivative returns the log-derivative ds/d ln t of the series (t[i],
// s[i]) by the method of Bourdet, Ayoub & Pirard (1989), with the smoothing
// window of settings (nil means defaults). t is any positive time unit (the
// derivative does not depend on it) and must be strictly increasing; s is a
// drawdown, a recovery (residual drawdown subtracted from the drawdown at
// the pump stop), or any finite quantity. The inputs are not modified.
//
// Errors are *InputError values that name the index and value at fault and
// wrap ErrLength, ErrTooFew, ErrNotFinite, ErrNonPositiveTime, ErrUnsorted,
// ErrDuplicateTime or ErrWindow.
func Derivative(t, s []float64, settings *Settings) (*Result, error) {
	if err := checkLengths(len(t), len(s)); err != nil {
		return nil, err
	}
	x := make([]float64, len(t))
	for i, ti := range t {
		if math.IsNaN(ti) || math.IsInf(ti, 0) {
			return nil, &InputError{Index: i, Field: "t", Value: ti, Err: ErrNotFinite}
		}
		if ti <= 0 {
			return nil, &InputError{Index: i, Field: "t", Value: ti, Err: ErrNonPositiveTime}
		}
		if i > 0 {
			if err := checkOrder(i, "t", t[i-1], ti); err != nil {
				return nil, err
			}
		}
		x[i] = math.Log(ti)
		if i > 0 && x[i] <= x[i-1] {
			// Distinct times whose logarithms round to the same value.
			return nil, &InputError{Index: i, Field: "t", Value: ti,
				Err: fmt.Errorf("%w (indistinguishable from the previous time in ln t)", ErrDuplicateTime)}
		}
	}
	return derivative(x, s, settings)
}

// DerivativeOnAxis returns ds/dx of the series (x[i], s[i]) with the same
// weighted three-point stencil and window as Derivative, for an abscissa
// that is already logarithmic (for example a superposition time function of
// a recovery or variable-rate test). x must be finite and strictly
// increasing; the window is in the units of x.
func DerivativeOnAxis(x, s []float64, settings *Settings) (*Result, error) {
	if err := checkLengths(len(x), len(s)); err != nil {
		return nil, err
	}
	for i, xi := range x {
		if math.IsNaN(xi) || math.IsInf(xi, 0) {
			return nil, &InputError{Index: i, Field: "x", Value: xi, Err: ErrNotFinite}
		}
		if i > 0 {
			if err := checkOrder(i, "x", x[i-1], xi); err != nil {
				return nil, err
			}
		}
	}
	return derivative(x, s, settings)
}

func checkLengths(nt, ns int) error {
	if nt != ns {
		return &InputError{Index: -1, Field: "len(s)", Value: float64(ns),
			Err: fmt.Errorf("%w (len(t) = %d)", ErrLength, nt)}
	}
	if nt < 2 {
		return &InputError{Index: -1, Field: "len(t)", Value: float64(nt), Err: ErrTooFew}
	}
	return nil
}

func checkOrder(i int, field string, prev, cur float64) error {
	switch {
	case cur < prev:
		return &InputError{Index: i, Field: field, Value: cur,
			Err: fmt.Errorf("%w (previous %s)", ErrUnsorted, formatValue(prev))}
	case cur == prev:
		return &InputError{Index: i, Field: field, Value: cur, Err: ErrDuplicateTime}
	}
	return nil
}

// derivative applies the stencil; x is finite and strictly increasing and
// len(x) == len(s) ≥ 2.
func derivative(x, s []float64, settings *Settings) (*Result, error) {
	L, err := settings.window()
	if err != nil {
		return nil, err
	}
	for i, si := range s {
		if math.IsNaN(si) || math.IsInf(si, 0) {
			return nil, &InputError{Index: i, Field: "s", Value: si, Err: ErrNotFinite}
		}
	}
	n := len(x)
	res := &Result{
		D:       make([]float64, n),
		Stencil: make([]Stencil, n),
		Left:    make([]int, n),
		Right:   make([]int, n),
		Window:  L,
	}
	// j is the largest index with x[i]−x[j] ≥ L (or −1) and k the
	// smallest index with x[k]−x[i] ≥ L (or n); both only move forward
	// as i grows, so the pass is O(n).
	j, k := -1, 0
	for i := 0; i < n; i++ {
		for j+1 < i && x[i]-x[j+1] >= L {
			j++
		}
		if k <= i {
			k = i + 1
		}
		for k < n && x[k]-x[i] < L {
			k++
		}
		left, right := j, k
		var st Stencil
		switch {
		case left >= 0 && right < n:
			st = Central
		case right < n:
			st, left = Forward, i
		case left >= 0:
			st, right = Backward, i
		default:
			st, left, right = Span, 0, n-1
		}
		res.Stencil[i] = st
		res.Left[i], res.Right[i] = left, right
		res.D[i] = stencil(x, s, left, i, right)
	}
	return res, nil
}

// stencil returns the weighted difference at i with neighbours j ≤ i ≤ k,
// j < k; with j == i or k == i it is the one-sided difference.
func stencil(x, s []float64, j, i, k int) float64 {
	switch {
	case j == i:
		return (s[k] - s[i]) / (x[k] - x[i])
	case k == i:
		return (s[i] - s[j]) / (x[i] - x[j])
	}
	d1, d2 := x[i]-x[j], x[k]-x[i]
	m1, m2 := (s[i]-s[j])/d1, (s[k]-s[i])/d2
	return (m1*d2 + m2*d1) / (d1 + d2)
}
