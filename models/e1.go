package models

//go:generate sh -c "/usr/bin/python3 ../testdata/models/e1_coefficients.py > e1_coef.go"

import "math"

// EulerGamma is the Euler–Mascheroni constant γ (DLMF §5.2,
// 0.57721 56649 01532 86060 …).
const EulerGamma = 0.57721566490153286060651209008240243

// E1 returns the exponential integral
//
//	E1(x) = ∫ₓ^∞ e^(−y)/y dy,  x > 0,
//
// which is also the well function W(u) of Theis (1935); see TheisW.
//
// For 0 < x ≤ 1 it uses the series E1(x) = −γ − ln x + x·P(x) (Abramowitz
// & Stegun 1964, eq. 5.1.11, from memory), and for x > 1 E1(x) =
// e^(−x)/x · G(x), where P and G are smooth auxiliary functions evaluated from
// Chebyshev expansions on short intervals (twelve of them) that were
// computed to 40 digits with mpmath and rounded once to float64 (see
// testdata/models/e1_coefficients.py). The relative error is below 1e-15
// for 1e-300 ≤ x ≤ 700, measured against mpmath in the tests.
//
// Special cases:
//
//	E1(NaN)  = NaN
//	E1(x)    = NaN  for x < 0 (E1 is real only for x > 0)
//	E1(±0)   = +Inf (E1(x) grows like −γ − ln x as x → 0)
//	E1(+Inf) = 0
//
// E1(x) underflows gradually for x above about 700 and is 0 for x above
// about 740.
func E1(x float64) float64 {
	switch {
	case x > 0 && x <= 1:
		return x*polyP(2*x-1) - EulerGamma - math.Log(x)
	case x > 1 && x <= 745:
		return math.Exp(-x) * (auxG(x) / x)
	case x > 745: // e^(−x) underflows; covers +Inf
		return 0
	case x == 0:
		return math.Inf(1)
	}
	return math.NaN() // x < 0 or NaN
}

// TheisW returns the Theis (1935) well function W(u) = E1(u) for the
// argument u = r²S/(4Tt) ≥ 0. It is E1 under its hydrogeological name, with
// the same special cases.
func TheisW(u float64) float64 { return E1(u) }

// e1exp returns E1(x) and e^(−x) together; the Jacobians of the Theis-type
// models need both, and for x > 1 the exponential comes for free.
func e1exp(x float64) (e1, ex float64) {
	switch {
	case x > 0 && x <= 1:
		return x*polyP(2*x-1) - EulerGamma - math.Log(x), math.Exp(-x)
	case x > 1 && x <= 745:
		ex = math.Exp(-x)
		return ex * (auxG(x) / x), ex
	case x > 745:
		return 0, math.Exp(-x)
	case x == 0:
		return math.Inf(1), 1
	}
	return math.NaN(), math.NaN()
}

// auxG returns G(x) = x·eˣ·E1(x) for x > 1.
func auxG(x float64) float64 {
	if x >= 32 {
		return poly12(&e1Z, 64/x-1)
	}
	// x = m·2ᵉ with m in [1, 2), 0 ≤ e ≤ 4.
	b := math.Float64bits(x)
	e := int(b>>52) - 1023
	m := math.Float64frombits(b&(1<<52-1) | 1023<<52)
	j := 2 * e
	mp := &e1MapLow
	if m >= math.Sqrt2 {
		j++
		mp = &e1MapHigh
	}
	return poly14(&e1G[j], m*mp[0]+mp[1])
}

// polyP evaluates P at t = 2x − 1.
func polyP(t float64) float64 { return poly12(&e1P, t) }

// poly12 evaluates c₀ + c₁t + … + c₁₁t¹¹ as two interleaved Horner chains
// in t² (even and odd terms), which halves the dependency chain.
func poly12(c *[12]float64, t float64) float64 {
	t2 := t * t
	ev := c[10]
	od := c[11]
	ev = ev*t2 + c[8]
	od = od*t2 + c[9]
	ev = ev*t2 + c[6]
	od = od*t2 + c[7]
	ev = ev*t2 + c[4]
	od = od*t2 + c[5]
	ev = ev*t2 + c[2]
	od = od*t2 + c[3]
	ev = ev*t2 + c[0]
	od = od*t2 + c[1]
	return ev + t*od
}

// poly14 evaluates c₀ + c₁t + … + c₁₃t¹³ like poly12.
func poly14(c *[14]float64, t float64) float64 {
	t2 := t * t
	ev := c[12]
	od := c[13]
	ev = ev*t2 + c[10]
	od = od*t2 + c[11]
	ev = ev*t2 + c[8]
	od = od*t2 + c[9]
	ev = ev*t2 + c[6]
	od = od*t2 + c[7]
	ev = ev*t2 + c[4]
	od = od*t2 + c[5]
	ev = ev*t2 + c[2]
	od = od*t2 + c[3]
	ev = ev*t2 + c[0]
	od = od*t2 + c[1]
	return ev + t*od
}
