package models

//go:generate sh -c "/usr/bin/python3 ../testdata/models/bessel_coefficients.py > bessel_coef.go"

import "math"

// K0 returns the modified Bessel function of the second kind of order
// zero, K₀(x), for x > 0. The Hantush–Jacob leaky well function tends to
// 2·K₀(β) at late time; see HantushW.
//
// For 0 < x ≤ 2 it sums the power series (DLMF 10.31.2)
//
//	K₀(x) = −(ln(x/2) + γ)·I₀(x) + Σ_{k≥1} H_k·(x²/4)ᵏ/(k!)²,
//	I₀(x) = Σ_{k≥0} (x²/4)ᵏ/(k!)²,
//
// with H_k = 1 + 1/2 + … + 1/k, and for x > 2 it writes K₀(x) =
// e^(−x)/√x · g₀(x) with g₀ from a Chebyshev expansion in 4/x − 1 computed
// with mpmath (testdata/models/bessel_coefficients.py). The relative error
// is below 5e-15 (largest just below x = 2, where the series cancels),
// measured against mpmath in the tests.
//
// Special cases:
//
//	K0(NaN)  = NaN
//	K0(x)    = NaN  for x < 0
//	K0(±0)   = +Inf
//	K0(+Inf) = 0
//
// K0(x) underflows gradually above about 700.
func K0(x float64) float64 {
	switch {
	case x > 0 && x <= 2:
		q := x * x / 4
		return besselSeries(&besselI0c, q)*-(math.Log(x/2)+EulerGamma) + besselSeries(&besselK0c, q)
	case x > 2 && x < 760:
		return math.Exp(-x) * (clenshaw(besselK0Cheb[:], 4/x-1) / math.Sqrt(x))
	case x >= 760: // covers +Inf
		return 0
	case x == 0:
		return math.Inf(1)
	}
	return math.NaN()
}

// K1 returns the modified Bessel function of the second kind of order
// one, K₁(x) = −K₀′(x), for x > 0. The derivative of the Hantush–Jacob
// well function with respect to β needs it.
//
// For 0 < x ≤ 2 it sums the power series (DLMF 10.31.1 with ψ(k+1) =
// H_k − γ)
//
//	K₁(x) = 1/x + (x/2)·[(ln(x/2) + γ)·Σ aₖ − ½·Σ (H_k + H_{k+1})·aₖ],
//	aₖ = (x²/4)ᵏ/(k!·(k+1)!),
//
// and for x > 2 it writes K₁(x) = e^(−x)/√x · g₁(x) with g₁ from a
// Chebyshev expansion like that of K0. The special cases are those of K0.
func K1(x float64) float64 {
	switch {
	case x > 0 && x <= 2:
		q := x * x / 4
		return 1/x + x/2*((math.Log(x/2)+EulerGamma)*besselSeries(&besselI1c, q)-besselSeries(&besselK1c, q))
	case x > 2 && x < 760:
		return math.Exp(-x) * (clenshaw(besselK1Cheb[:], 4/x-1) / math.Sqrt(x))
	case x >= 760:
		return 0
	case x == 0:
		return math.Inf(1)
	}
	return math.NaN()
}

// besselTerms is the number of terms of the power series for x ≤ 2
// (x²/4 ≤ 1): the last coefficients are below 1e-19.
const besselTerms = 15

// Coefficients of the power series of K0 and K1 in q = x²/4:
// besselI0c[k] = 1/(k!)², besselK0c[k] = H_k/(k!)², besselI1c[k] =
// 1/(k!(k+1)!), besselK1c[k] = (H_k + H_{k+1})/(2·k!(k+1)!).
var besselI0c, besselK0c, besselI1c, besselK1c = func() (i0, k0, i1, k1 [besselTerms]float64) {
	fact, h := 1.0, 0.0 // k!, H_k
	for k := 0; k < besselTerms; k++ {
		if k > 0 {
			fact *= float64(k)
			h += 1 / float64(k)
		}
		fact1 := fact * float64(k+1)
		h1 := h + 1/float64(k+1)
		i0[k] = 1 / (fact * fact)
		k0[k] = h / (fact * fact)
		i1[k] = 1 / (fact * fact1)
		k1[k] = (h + h1) / (2 * fact * fact1)
	}
	return
}()

// besselSeries evaluates Σ c[k]·qᵏ by Horner's rule.
func besselSeries(c *[besselTerms]float64, q float64) float64 {
	s := c[besselTerms-1]
	for k := besselTerms - 2; k >= 0; k-- {
		s = s*q + c[k]
	}
	return s
}

// clenshaw evaluates c₀ + Σ_{j≥1} c_j·T_j(t) by Clenshaw's recurrence (c₀
// is already halved).
func clenshaw(c []float64, t float64) float64 {
	var b1, b2 float64
	t2 := 2 * t
	for j := len(c) - 1; j >= 1; j-- {
		b1, b2 = t2*b1-b2+c[j], b1
	}
	return t*b1 - b2 + c[0]
}
