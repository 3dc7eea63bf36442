package infiltration

import "math"

// xMinusLog1p returns x − ln(1 + x) for x ≥ 0 without the cancellation of
// the direct form at small x (series below 0.01).
func xMinusLog1p(x float64) float64 {
	if x < 0.01 {
		// x²/2 − x³/3 + x⁴/4 − … − x⁹/9: the first omitted term is below
		// 2e-15 of the sum.
		s, p := 0.0, x
		for k := 2; k <= 9; k++ {
			p *= x
			if k%2 == 0 {
				s += p / float64(k)
			} else {
				s -= p / float64(k)
			}
		}
		return s
	}
	return x - math.Log1p(x)
}

// GreenAmptDepth returns the cumulative infiltration F (m) of the
// Green–Ampt (1911) model at time t (s) for the conductivity K (m/s) and
// the product P = ψΔθ of the wetting-front suction head and the moisture
// deficit (m), the root of
//
//	F − P ln(1 + F/P) = K t.
//
// With x = F/P and τ = Kt/P it solves x − ln(1 + x) = τ by Newton's
// method, safeguarded by bisection: the left side is increasing and convex
// in x, and the root is bracketed by [τ, τ + √(2τ)] (at x = τ the left side
// falls short of τ by ln(1 + τ); at τ + √(2τ) it is not below τ). A step
// that leaves the bracket is replaced by bisection. It returns 0 at t = 0
// and NaN for t < 0 or parameters that are not positive and finite.
func GreenAmptDepth(t, K, P float64) float64 {
	x, ok := greenAmptX(t, K, P)
	if !ok {
		return math.NaN()
	}
	return P * x
}

// GreenAmptRate returns the infiltration rate f = K(ψΔθ/F + 1) (m/s) at
// time t (s): +Inf at t = 0, NaN where GreenAmptDepth is NaN.
func GreenAmptRate(t, K, P float64) float64 {
	x, ok := greenAmptX(t, K, P)
	if !ok {
		return math.NaN()
	}
	return K * (1/x + 1)
}

// greenAmptX returns x = F/P.
func greenAmptX(t, K, P float64) (float64, bool) {
	if !(t >= 0) || !(K > 0) || !(P > 0) || bad(t) || bad(K) || bad(P) {
		return math.NaN(), false
	}
	tau := K * t / P
	if tau == 0 {
		return 0, true
	}
	if bad(tau) {
		return math.NaN(), false
	}
	lo, hi := tau, tau+math.Sqrt(2*tau)
	h := func(x float64) float64 { return xMinusLog1p(x) - tau }
	for h(hi) < 0 { // does not happen in exact arithmetic; a safeguard
		lo, hi = hi, 2*hi
	}
	x := hi // from the right, Newton on a convex increasing function converges monotonically
	for k := 0; k < 100; k++ {
		hx := h(x)
		if hx == 0 {
			return x, true
		}
		if hx > 0 {
			hi = x
		} else {
			lo = x
		}
		d := x / (1 + x) // h'(x)
		next := x - hx/d
		if math.Abs(next-x) <= 4e-16*x {
			return next, true
		}
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		x = next
	}
	return x, true
}
