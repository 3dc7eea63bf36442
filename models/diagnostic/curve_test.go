package diagnostic

import (
	"errors"
	"math"
	"testing"
)

// e1 is the exponential integral E1(u) for u > 0: the power series
// E1 = −γ − ln u − Σ (−u)^k/(k·k!) for u ≤ 1, and the continued fraction
// evaluated by the modified Lentz method for u > 1 (DLMF §6.6.2, §6.9.1).
// It is checked against mpmath and Abramowitz & Stegun in TestE1.
func e1(u float64) float64 {
	const gamma = 0.57721566490153286 // Euler's constant, DLMF §5.2
	if u <= 1 {
		sum, term := 0.0, 1.0
		for k := 1; k < 60; k++ {
			term *= -u / float64(k)
			d := term / float64(k)
			sum += d
			if math.Abs(d) < 1e-17*math.Abs(sum) {
				break
			}
		}
		return -gamma - math.Log(u) - sum
	}
	const tiny = 1e-300
	b := u + 1
	c := 1 / tiny
	d := 1 / b
	h := d
	for i := 1; i < 200; i++ {
		an := -float64(i * i)
		b += 2
		d = 1 / (an*d + b)
		c = b + an/c
		del := c * d
		h *= del
		if math.Abs(del-1) < 1e-16 {
			break
		}
	}
	return h * math.Exp(-u)
}

func TestE1(t *testing.T) {
	// Abramowitz & Stegun (1964), Table 5.1, as quoted in
	// /work/shared/reference/README.md §2, to the table's 9 decimals
	// (E1 for 0.5 ≤ x ≤ 2, x·eˣ·E1(x) for x ≥ 2). The tolerance is 2e-9
	// because A&S's last digit at x = 0.5 and 5 differs from mpmath
	// (reference README §2).
	for _, c := range []struct {
		u, want float64
		scaled  bool
	}{
		{0.5, 0.559773595, false},
		{1, 0.219383934, false},
		{2, 0.048900511, false},
		{5, 0.852110880, true},
		{10, 0.915633339, true},
	} {
		got := e1(c.u)
		if c.scaled {
			got *= c.u * math.Exp(c.u)
		}
		if math.Abs(got-c.want) > 2e-9 {
			t.Errorf("E1(%g) (scaled %v) = %.12g, A&S %.9f", c.u, c.scaled, got, c.want)
		}
	}
	// mpmath 1.2.1, column E1_u of testdata/diagnostic/theis_derivative.tsv.
	for _, r := range readTheisTable(t) {
		if got := e1(r.u); !closeRel(got, r.e1, 1e-13) {
			t.Errorf("E1(%g) = %.17g, mpmath %.17g", r.u, got, r.e1)
		}
	}
}

func theisCurve() (Curve, float64) {
	A := tabQ / (4 * math.Pi * tabT)
	u0 := tabR * tabR * tabS / (4 * tabT)
	return Curve{S: func(t float64) float64 { return A * e1(u0/t) }}, u0
}

// TestSampleCurveTheis: the sampled derivative of the Theis curve equals
// (Q/4πT)·exp(−u) (analytic), by the extrapolated differences and exactly
// when the model gives ds/dt = (Q/4πT)·exp(−u)/t.
func TestSampleCurveTheis(t *testing.T) {
	c, u0 := theisCurve()
	A := tabQ / (4 * math.Pi * tabT)
	exact := func(t float64) float64 { return A * math.Exp(-u0/t) }
	num, err := SampleCurve(c, 1, 1e5, 201)
	if err != nil {
		t.Fatal(err)
	}
	if num.Exact {
		t.Error("Exact = true without DS")
	}
	for i, ti := range num.T {
		// Relative 1e-8 of the plateau value; early points where the
		// derivative is tiny are judged against the plateau too.
		if d := num.D[i]; math.Abs(d-exact(ti)) > 1e-8*A {
			t.Errorf("numeric t=%g: D = %.12g, exact %.12g", ti, d, exact(ti))
		}
	}
	c.DS = func(t float64) float64 { return exact(t) / t }
	ex, err := SampleCurve(c, 1, 1e5, 201)
	if err != nil {
		t.Fatal(err)
	}
	if !ex.Exact {
		t.Error("Exact = false with DS")
	}
	rows := readTheisTable(t)
	for i, r := range rows { // the table has 20 points per decade, the samples 40
		ti := ex.T[2*i]
		if !closeRel(ti, r.t, 1e-14) {
			t.Fatalf("sample %d at t = %.17g, want %.17g", 2*i, ti, r.t)
		}
		if !closeRel(ex.D[2*i], r.d, 1e-12) {
			t.Errorf("exact t=%g: D = %.15g, mpmath %.15g", ti, ex.D[2*i], r.d)
		}
		if !closeRel(ex.S[2*i], r.s, 1e-12) {
			t.Errorf("t=%g: S = %.15g, mpmath %.15g", ti, ex.S[2*i], r.s)
		}
	}
	if ex.T[0] != 1 || ex.T[200] != 1e5 {
		t.Errorf("ends %g, %g, want 1, 1e5", ex.T[0], ex.T[200])
	}
}

func TestSampleCurveErrors(t *testing.T) {
	good := Curve{S: math.Log}
	nanAfter := Curve{S: func(t float64) float64 {
		if t > 50 {
			return math.NaN()
		}
		return t
	}}
	cases := []struct {
		name       string
		c          Curve
		tMin, tMax float64
		n          int
		err        error
		index      int
	}{
		{"nil S", Curve{}, 1, 10, 5, ErrRange, -1},
		{"tMin zero", good, 0, 10, 5, ErrRange, -1},
		{"tMin NaN", good, math.NaN(), 10, 5, ErrRange, -1},
		{"tMax below tMin", good, 10, 1, 5, ErrRange, -1},
		{"tMax infinite", good, 1, math.Inf(1), 5, ErrRange, -1},
		{"one sample", good, 1, 10, 1, ErrRange, -1},
		{"too many samples", good, 1, 10, MaxSamples + 1, ErrRange, -1},
		{"model NaN", nanAfter, 1, 100, 3, ErrNotFinite, 2},
		{"exact derivative NaN", Curve{S: math.Log, DS: func(float64) float64 { return math.NaN() }}, 1, 100, 3, ErrNotFinite, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := SampleCurve(c.c, c.tMin, c.tMax, c.n)
			if !errors.Is(err, c.err) {
				t.Fatalf("error %v, want %v", err, c.err)
			}
			var ie *InputError
			if !errors.As(err, &ie) || ie.Index != c.index {
				t.Errorf("error %v: want index %d", err, c.index)
			}
		})
	}
	// NaN only in the difference stencil beyond the last sample.
	edge := Curve{S: func(t float64) float64 {
		if t > 100 {
			return math.NaN()
		}
		return t
	}}
	if _, err := SampleCurve(edge, 1, 100, 3); !errors.Is(err, ErrNotFinite) {
		t.Errorf("NaN beyond tMax in the stencil: %v", err)
	}
}
