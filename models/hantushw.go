package models

import (
	"math"

	"gonum.org/v1/gonum/integrate/quad"
)

// HantushW returns the leaky well function of Hantush & Jacob (1955),
//
//	W(u, β) = ∫ᵤ^∞ (1/y)·exp(−y − β²/(4y)) dy,  u ≥ 0, β ≥ 0,
//
// with u = r²S/(4Tt) and β = r/B (B the leakage factor). W(u, 0) = E1(u),
// the Theis well function; W(0, β) = 2·K₀(β); and W(u, β) +
// W(β²/(4u), β) = 2·K₀(β) for every u > 0, so that W(β/2, β) = K₀(β).
//
// Method. Expanding exp(−β²/(4y)) in powers gives the convergent series
// (the form used by Hantush 1956)
//
//	W(u, β) = Σ_{n≥0} (−a)ⁿ/n! · E_{n+1}(u),  a = β²/(4u),
//
// with the generalised exponential integrals E_n computed by the recurrence
// E_{n+1}(z) = (e^(−z) − z·E_n(z))/n from E1. For u ≥ β/2 it is summed
// directly (then a ≤ β/2); for u < β/2 the reflection W(u, β) = 2K₀(β) −
// W(a, β) is used, whose series runs in powers of u < β/2. The
// alternating series loses up to a factor of about e^β·I₀(β) to rounding,
// so this is used for β ≤ 10 (relative error below 1e-10, measured
// against mpmath in the tests over 1e-10 ≤ u ≤ 50). For β > 10 the
// function is written, by y = (β/2)·eˣ, as
//
//	W(u, β) = ∫_{x₀}^∞ exp(−β·cosh x) dx,  x₀ = ln(2u/β),
//
// and the tail from |x₀| on is integrated by 24-point Gauss–Legendre
// quadrature up to where the integrand has fallen by e^(−45) (relative
// error about 1e-10); for x₀ < 0 the reflection gives W = 2K₀(β) − tail.
//
// Special cases:
//
//	HantushW(u, β) = NaN   if u or β is NaN or negative
//	HantushW(u, 0) = E1(u)
//	HantushW(0, β) = 2·K0(β) for β > 0
//	HantushW(+Inf, β) = HantushW(u, +Inf) = 0 (β > 0 for u = 0)
//
// Reference: Hantush, M.S. and Jacob, C.E. (1955), Non-steady radial flow
// in an infinite leaky aquifer, Transactions, American Geophysical Union
// 36(1), 95–100; Hantush, M.S. (1956), Analysis of data from pumping tests
// in leaky aquifers, Transactions, American Geophysical Union 37(6),
// 702–714 (citations from memory).
func HantushW(u, beta float64) float64 {
	switch {
	case math.IsNaN(u) || math.IsNaN(beta) || u < 0 || beta < 0:
		return math.NaN()
	case beta == 0:
		return E1(u)
	case math.IsInf(beta, 1) || math.IsInf(u, 1):
		return 0
	}
	k0 := 0.0
	if u < beta/2 {
		k0 = K0(beta) // the late-time form needs it
	}
	w, _, _ := hantushCore(u, beta, k0, 0, false)
	return w
}

// hantushSeriesMax is the largest β for which the series are used.
const hantushSeriesMax = 10

// hantushCore returns W(u, β) for finite u ≥ 0 and 0 < β < ∞, and when
// deriv is set also ∂W/∂u and ∂W/∂β. k0 and k1 must be K₀(β) and K₁(β)
// when u < β/2 or β > hantushSeriesMax (k1 only when deriv is set); the
// callers compute them once for many u.
func hantushCore(u, beta, k0, k1 float64, deriv bool) (w, dwdu, dwdb float64) {
	b := beta * beta / 4
	if deriv && u > 0 {
		// ∂W/∂u = −exp(−u − β²/(4u))/u, exactly.
		dwdu = -math.Exp(-u-b/u) / u
	}
	if beta > hantushSeriesMax {
		return hantushQuad(u, beta, k0, k1, deriv, dwdu)
	}
	if u >= beta/2 {
		a := b / u
		f, g := leakySums(a, u, deriv)
		w = f
		if deriv {
			// ∂W/∂β = −(β/2)·∫ᵤ^∞ y⁻²·exp(−y − b/y) dy
			//       = −(β/2)·(1/u)·Σ (−a)ⁿ/n!·E_{n+2}(u).
			dwdb = -beta / 2 * g / u
		}
		return w, dwdu, dwdb
	}
	// Late-time form: W(u, β) = 2K₀(β) − W(x, β), x = β²/(4u) > β/2.
	x := b / u
	f, g := leakySums(u, x, deriv)
	w = 2*k0 - f
	if deriv {
		// d/dβ of 2K₀(β) − W(x(β), β) with dx/dβ = 2x/β:
		// −2K₁(β) + (β/2)·W₂(x, β) + (2/β)·exp(−x − u).
		dwdb = -2*k1 + beta/2*g/x + 2/beta*math.Exp(-x-u)
	}
	return w, dwdu, dwdb
}

// hantushMaxTerms bounds the number of terms of the series; for β ≤ 10
// (a·z = β²/4 ≤ 25, a ≤ 5) they converge in fewer than 60.
const hantushMaxTerms = 90

// leakySums returns
//
//	F = Σ_{n≥0} (−a)ⁿ/n!·E_{n+1}(z),  G = Σ_{n≥0} (−a)ⁿ/n!·E_{n+2}(z)
//
// for z > 0 and 0 ≤ a ≤ z, by forward recurrence of E_n(z) from E1(z);
// G only when needG is set.
//
// Rounding errors of the recurrence grow like (−z)ⁿ/n! where n < z, but
// in F they add up to at most about ε·E1(z)·I₀(2√(az)): with az = β²/4 ≤
// 25 the relative error stays below 1e-10.
func leakySums(a, z float64, needG bool) (f, g float64) {
	if z > 1 {
		// Sum with e^(−z) factored out (E_n(z)·e^z = scaled values), so
		// that no intermediate value is subnormal when z is large.
		if z > 760 { // e^(−z) underflows; covers +Inf
			return 0, 0
		}
		f, g = leakySumsFrom(a, z, auxG(z)/z, 1, needG)
		ez := math.Exp(-z)
		return f * ez, g * ez
	}
	e1, ez := e1exp(z)
	return leakySumsFrom(a, z, e1, ez, needG)
}

// leakySumsFrom sums the series of leakySums from e1 = c·E1(z) and
// ez = c·e^(−z) for a common scale c.
func leakySumsFrom(a, z, e1, ez float64, needG bool) (f, g float64) {
	if e1 == 0 || math.IsInf(e1, 1) {
		return e1, e1
	}
	en := e1         // E_{n+1}(z)
	en1 := ez - z*e1 // E_{n+2}(z); E2 = e^(−z) − z·E1
	f, g = en, en1
	c := 1.0 // (−a)ⁿ/n!
	for n := 1; n < hantushMaxTerms; n++ {
		c *= -a / float64(n)
		en, en1 = en1, (ez-z*en1)/float64(n+1)
		tf := c * en
		f += tf
		if needG {
			tg := c * en1
			g += tg
			if math.Abs(tf) <= 1e-17*math.Abs(f) && math.Abs(tg) <= 1e-17*math.Abs(g) {
				break
			}
		} else if math.Abs(tf) <= 1e-17*math.Abs(f) {
			break
		}
	}
	return f, g
}

// hantushQuad evaluates W(u, β) and ∂W/∂β for β > hantushSeriesMax from
// the form W = ∫_{x₀}^∞ exp(−β·cosh x) dx, x₀ = ln(2u/β):
//
//	x₀ ≥ 0: W = T(x₀),          ∂W/∂β = g₀/β − C(x₀),
//	x₀ < 0: W = 2K₀(β) − T(−x₀), ∂W/∂β = g₀/β − 2K₁(β) + C(−x₀),
//
// with T(a) = ∫ₐ^∞ e^(−β cosh x) dx, C(a) = ∫ₐ^∞ cosh x·e^(−β cosh x) dx
// and g₀ = e^(−β cosh x₀) = exp(−u − β²/(4u)).
func hantushQuad(u, beta, k0, k1 float64, deriv bool, dwdu float64) (w, dwdu2, dwdb float64) {
	if u == 0 {
		return 2 * k0, 0, -2 * k1
	}
	x0 := math.Log(2 * u / beta)
	tq, cq := leakyTail(math.Abs(x0), beta, deriv)
	g0 := math.Exp(-u - beta*beta/(4*u))
	if x0 >= 0 {
		return tq, dwdu, g0/beta - cq
	}
	return 2*k0 - tq, dwdu, g0/beta - 2*k1 + cq
}

// leakyTail returns T(a) and, if needC, C(a) (see hantushQuad) for a ≥ 0,
// β > 0: with x = a + s the integrand is e^(−β cosh a)·e^(−φ(s)),
// φ(s) = β·(cosh(a+s) − cosh a) = 2β·sinh(a + s/2)·sinh(s/2), which rises
// from 0; s runs from 0 to L, φ(L) = 45, by 24-point Gauss–Legendre.
func leakyTail(a, beta float64, needC bool) (t, c float64) {
	ca := math.Cosh(a)
	if beta*ca > 760 {
		return 0, 0 // e^(−β cosh a) underflows
	}
	L := math.Acosh(ca+45/beta) - a
	var st, sc float64
	for i, xi := range leakyNodes {
		s := L * (1 + xi) / 2
		f := leakyWeights[i] * math.Exp(-2*beta*math.Sinh(a+s/2)*math.Sinh(s/2))
		st += f
		if needC {
			sc += f * math.Cosh(a+s)
		}
	}
	scale := math.Exp(-beta*ca) * L / 2
	return st * scale, sc * scale
}

// leakyNodes and leakyWeights are the 24-point Gauss–Legendre rule on
// [−1, 1].
var leakyNodes, leakyWeights = func() (x, w []float64) {
	x, w = make([]float64, 24), make([]float64, 24)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	return x, w
}()
