package regime

import (
	"math"

	"fieldfit/models"
)

// Our own scenario (invented): observation well OB-2 at the Harrow Bend
// wellfield, 25 m from a well pumped at 10 L/s, in an aquifer with
// T = 3e-3 m²/s and S = 1.5e-4; the Theis derivative's flat level is
// Q/(4πT) = 0.2653 m.
const (
	scQ = 0.01
	scR = 25.0
	scT = 3e-3
	scS = 1.5e-4
	// scRi is the distance from OB-2 to the image well of a straight
	// boundary, m.
	scRi = 500.0
)

// logTimes returns n times log-spaced from a to b, s.
func logTimes(n int, a, b float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

// theis is the Theis (1935) drawdown, m (models.E1 is checked against
// Abramowitz & Stegun Table 5.1 in package models).
func theis(q, r, T, S, t float64) float64 {
	return q / (4 * math.Pi * T) * models.E1(r*r*S/(4*T*t))
}

// series evaluates f at the times ts.
func series(ts []float64, f func(t float64) float64) []float64 {
	s := make([]float64, len(ts))
	for i, t := range ts {
		s[i] = f(t)
	}
	return s
}

// hantushW is the Hantush–Jacob leaky well function
// W(u, β) = ∫_u^∞ (1/y)·exp(−y − β²/(4y)) dy, integrated here by the
// composite Simpson rule in z = ln y from ln u to ln 60 (the integrand is
// below e^(−60) beyond), with 4000 intervals; TestHantushW checks it
// against reference §3.
func hantushW(u, beta float64) float64 {
	a, b := math.Log(u), math.Log(60)
	if a >= b {
		return 0
	}
	const m = 4000
	h := (b - a) / m
	f := func(z float64) float64 {
		y := math.Exp(z)
		return math.Exp(-y - beta*beta/(4*y))
	}
	sum := f(a) + f(b)
	for k := 1; k < m; k++ {
		w := 2.0
		if k%2 == 1 {
			w = 4
		}
		sum += w * f(a+float64(k)*h)
	}
	return sum * h / 3
}
