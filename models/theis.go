package models

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

const theisName = "Theis (1935)"

// Theis is the Theis (1935) model of drawdown in a confined aquifer of
// infinite extent around a fully penetrating well pumped at a constant
// rate:
//
//	s(t) = Q/(4πT)·W(u),  u = r²S/(4Tt),  W(u) = E1(u)  [m],
//
// with Q the pumping rate (m³/s; > 0 for abstraction, < 0 for injection),
// R the distance r from the pumped well to the observation point (m) and t
// the time since pumping started (s). The fitted parameters are the
// transmissivity T (m²/s) and the storativity S (−), both positive. The
// Jacobian is analytic (dW/du = −e^(−u)/u):
//
//	∂s/∂T = Q/(4πT²)·(e^(−u) − W(u)),  ∂s/∂S = −Q·e^(−u)/(4πTS).
//
// At t = 0 the model gives s = 0; for t < 0 it gives NaN.
//
// Reference: Theis, C.V. (1935), The relation between the lowering of the
// piezometric surface and the rate and duration of discharge of a well
// using ground-water storage, Transactions, American Geophysical Union
// 16(2), 519–524.
type Theis struct {
	Q, R float64
}

func (m Theis) Name() string { return theisName }

func (m Theis) Params() []ParamInfo { return theisParams() }

func (m Theis) Check() error { return checkWell(theisName, m.Q, m.R) }

func (m Theis) CheckPoint(t, y float64) error { return checkDrawdown(t, y) }

func (m Theis) Eval(dst, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	b := m.R * m.R * S / (4 * T)
	for i, ti := range t {
		dst[i] = a * E1(b/ti)
	}
}

func (m Theis) Jacobian(dst *mat.Dense, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	b := m.R * m.R * S / (4 * T)
	raw := dst.RawMatrix()
	for i, ti := range t {
		w, ex := e1exp(b / ti)
		row := raw.Data[i*raw.Stride : i*raw.Stride+2]
		row[0] = a / T * (ex - w)
		row[1] = -a / S * ex
	}
}

// Start returns the Cooper–Jacob line of the late readings (see
// CooperJacob.Start) or, when that fails or fits worse, the best match
// of the Theis curve found by a one-dimensional search: for trial values of
// b = r²S/(4T) the best factor Q/(4πT) is linear and found in closed form.
// Both are computed on at most 64 of the readings.
func (m Theis) Start(t, y []float64) ([]float64, error) {
	return theisTypeStart(theisName, m.Q, m.R, t, y, func(dst, tt []float64, b float64) {
		for i, ti := range tt {
			dst[i] = E1(b / ti)
		}
	})
}

// theisTypeStart is the starting-guess search shared by the models of the
// form s = Q/(4πT)·F(t; b), b = r²S/(4T): shape(dst, t, b) writes F.
func theisTypeStart(method string, q, r float64, t, y []float64, shape func(dst, t []float64, b float64)) ([]float64, error) {
	ts, ys := subsample(t, y, 64)
	f := make([]float64, len(ts))
	ssr := func(T, S float64) float64 {
		shape(f, ts, r*r*S/(4*T))
		a := q / (4 * math.Pi * T)
		sum := 0.0
		for i := range f {
			d := a*f[i] - ys[i]
			sum += d * d
		}
		return sum
	}

	bestT, bestS, best := 0.0, 0.0, math.Inf(1)
	if T, S, ok := lateCooperJacob(q, r, t, y); ok {
		if v := ssr(T, S); v < best {
			bestT, bestS, best = T, S, v
		}
	}

	tmin, tmax := math.Inf(1), 0.0
	for _, ti := range ts {
		tmin, tmax = math.Min(tmin, ti), math.Max(tmax, ti)
	}
	// b/t is u: search u at the last reading from 1e-8 to u at the first
	// reading equal to 30, ten steps per decade.
	lo, hi := math.Log10(1e-8*tmax), math.Log10(30*tmin)
	for lb := lo; lb <= hi; lb += 0.1 {
		b := math.Pow(10, lb)
		shape(f, ts, b)
		var sfy, sff float64
		for i := range f {
			sfy += f[i] * ys[i]
			sff += f[i] * f[i]
		}
		if !(sff > 0) {
			continue
		}
		a := sfy / sff // Q/(4πT)
		T := q / (4 * math.Pi * a)
		if !(T > 0) || bad(T) {
			continue
		}
		S := 4 * T * b / (r * r)
		sum := 0.0
		for i := range f {
			d := a*f[i] - ys[i]
			sum += d * d
		}
		if sum < best {
			bestT, bestS, best = T, S, sum
		}
	}
	if best == math.Inf(1) || !(bestT > 0) || !(bestS > 0) || bad(bestT) || bad(bestS) {
		return nil, errf(method, "", 0, ErrNoTrend,
			"no starting guess: the readings do not grow with time in the sense of the pumping rate (Q = %.4g m³/s)", q)
	}
	return []float64{bestT, bestS}, nil
}

// Validity accepts every reading with t > 0 (the model's assumptions of a
// confined, infinite, homogeneous aquifer cannot be judged from one
// drawdown curve) and notes when all readings lie on the straight-line
// part of the curve (u < 0.01).
func (m Theis) Validity(ok []bool, t, p []float64) []string {
	T, S := p[0], p[1]
	umax := 0.0
	for i, ti := range t {
		ok[i] = ti > 0
		umax = math.Max(umax, m.R*m.R*S/(4*T*ti))
	}
	if len(t) > 0 && umax < 0.01 {
		return []string{fmt.Sprintf("All points have u < 0.01 (largest %.3g): the curve is on its straight-line part, where T and S rest on the slope and the time of zero drawdown alone, as in the Cooper–Jacob method.", umax)}
	}
	return nil
}

// subsample returns at most maxN readings of t, y, evenly spaced by index
// (the first and the last included); it returns t, y themselves when they
// are short enough.
func subsample(t, y []float64, maxN int) (ts, ys []float64) {
	if len(t) <= maxN {
		return t, y
	}
	ts, ys = make([]float64, maxN), make([]float64, maxN)
	for k := range ts {
		i := k * (len(t) - 1) / (maxN - 1)
		ts[k], ys[k] = t[i], y[i]
	}
	return ts, ys
}
