package models

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// readE1Table reads testdata/models/e1_mpmath.tsv (source: mpmath, generated
// by testdata/models/e1_mpmath.py).
func readE1Table(t testing.TB) (xs, want []float64) {
	t.Helper()
	f, err := os.Open("../testdata/models/e1_mpmath.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	line := 0
	for sc.Scan() {
		line++
		s := sc.Text()
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		fields := strings.Split(s, "\t")
		if len(fields) != 2 {
			t.Fatalf("e1_mpmath.tsv line %d: %d fields, want 2", line, len(fields))
		}
		x, err1 := strconv.ParseFloat(fields[0], 64)
		y, err2 := strconv.ParseFloat(fields[1], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("e1_mpmath.tsv line %d: %v %v", line, err1, err2)
		}
		xs = append(xs, x)
		want = append(want, y)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return xs, want
}

func TestE1Mpmath(t *testing.T) {
	xs, want := readE1Table(t)
	if len(xs) < 5000 {
		t.Fatalf("only %d reference points", len(xs))
	}
	worst, at := 0.0, 0.0
	for i, x := range xs {
		got := E1(x)
		rel := math.Abs(got-want[i]) / want[i]
		if rel > worst {
			worst, at = rel, x
		}
		if !(rel <= 1e-13) {
			t.Errorf("E1(%v) = %v, want %v (mpmath); relative error %.3g", x, got, want[i], rel)
		}
	}
	t.Logf("max relative error vs mpmath over %d points: %.3g at x = %v", len(xs), worst, at)
}

// TestE1Published checks E1 against published tables. Sources, named
// beside each value: [H] Huisman (1972), Groundwater Recovery, Table 4.1;
// [AS] Abramowitz & Stegun (1964), Handbook of Mathematical Functions,
// Table 5.1, which tabulates (E1(x) + ln x + γ)/x for x ≤ 0.5, E1(x) for
// 0.5 ≤ x ≤ 2 and x·eˣ·E1(x) for x ≥ 2 (converted here); [Wz] Wenzel
// (1942), USGS Water-Supply Paper 887, values from memory. The tolerance is
// half a unit in the last published digit, or 2e-9 relative for the [AS]
// auxiliary forms (whose last digit differs from mpmath at a few
// arguments, reference §2).
func TestE1Published(t *testing.T) {
	type form int
	const (
		plain  form = iota // the table gives E1(x)
		smallX             // (E1 + ln x + γ)/x
		largeX             // x·eˣ·E1(x)
	)
	tests := []struct {
		x      float64
		table  float64
		form   form
		absTol float64 // 0: use relTol
		relTol float64
		source string
	}{
		{1e-15, 33.9616, plain, 5e-5, 0, "[H] Table 4.1"},
		{1e-10, 22.4486, plain, 5e-5, 0, "[H] Table 4.1"},
		{1e-8, 17.8435, plain, 5e-5, 0, "[Wz] from memory"},
		{1e-6, 13.2383, plain, 5e-5, 0, "[Wz] from memory"},
		{1e-5, 10.9357, plain, 5e-5, 0, "[H] Table 4.1"},
		{1e-4, 8.6332, plain, 5e-5, 0, "[Wz] from memory"},
		{1e-3, 6.3315, plain, 5e-5, 0, "[Wz] from memory"},
		{0.01, 0.9975055452, smallX, 0, 2e-9, "[AS] Table 5.1"},
		{0.1, 0.9755453033, smallX, 0, 2e-9, "[AS] Table 5.1"},
		{0.5, 0.559773595, plain, 5e-10, 0, "[AS] Table 5.1"},
		{1, 0.219383934, plain, 5e-10, 0, "[AS] Table 5.1"},
		{1, 0.2194, plain, 5e-5, 0, "[H] Table 4.1"},
		{2, 0.048900511, plain, 5e-10, 0, "[AS] Table 5.1"},
		{2, 0.04890, plain, 5e-6, 0, "[H] Table 4.1"},
		{3, 0.01305, plain, 5e-6, 0, "[H] Table 4.1"},
		{5, 0.852110880, largeX, 0, 2e-9, "[AS] Table 5.1"},
		{5, 0.001148, plain, 5e-7, 0, "[H] Table 4.1"},
		{9.9, 0.000004637, plain, 5e-10, 0, "[H] Table 4.1"},
		{10, 0.915633339, largeX, 0, 2e-9, "[AS] Table 5.1"},
	}
	for _, tc := range tests {
		got := E1(tc.x)
		var cmp float64 // the computed value in the table's form
		switch tc.form {
		case plain:
			cmp = got
		case smallX:
			cmp = (got + math.Log(tc.x) + EulerGamma) / tc.x
		case largeX:
			cmp = tc.x * math.Exp(tc.x) * got
		}
		diff := math.Abs(cmp - tc.table)
		if tc.absTol > 0 && diff > tc.absTol || tc.absTol == 0 && diff > tc.relTol*math.Abs(tc.table) {
			t.Errorf("E1(%v): table form %.12g, want %.12g (%s); difference %.3g", tc.x, cmp, tc.table, tc.source, diff)
		}
	}
}

// TestE1ReferenceLibrary checks the library values listed in reference §2
// (computed there with scipy/mpmath), to their printed digits.
func TestE1ReferenceLibrary(t *testing.T) {
	tests := []struct{ x, want float64 }{
		{1e-15, 33.96156073}, {1e-10, 22.44863527}, {1e-8, 17.84346509},
		{1e-6, 13.23829589}, {1e-5, 10.9357198}, {1e-4, 8.633224705},
		{1e-3, 6.331539364}, {0.01, 4.037929577}, {0.1, 1.822923958},
		{0.5, 0.5597735948}, {1, 0.2193839344}, {2, 0.04890051071},
		{5, 0.001148295591}, {9.9, 4.636887757e-6}, {10, 4.15696893e-6},
	}
	for _, tc := range tests {
		if got := E1(tc.x); math.Abs(got-tc.want) > 6e-10*tc.want {
			t.Errorf("E1(%v) = %.12g, want %.10g (scipy/mpmath, reference §2)", tc.x, got, tc.want)
		}
	}
}

func TestE1Special(t *testing.T) {
	tests := []struct {
		x, want float64
	}{
		{math.NaN(), math.NaN()},
		{-1, math.NaN()},
		{-1e-300, math.NaN()},
		{math.Inf(-1), math.NaN()},
		{0, math.Inf(1)},
		{math.Copysign(0, -1), math.Inf(1)},
		{math.Inf(1), 0},
		{746, 0},
		{1e10, 0},
	}
	for _, tc := range tests {
		got := E1(tc.x)
		if !(got == tc.want || math.IsNaN(got) && math.IsNaN(tc.want)) {
			t.Errorf("E1(%v) = %v, want %v", tc.x, got, tc.want)
		}
		if w, ex := e1exp(tc.x); !(w == got || math.IsNaN(w) && math.IsNaN(got)) || !(ex == math.Exp(-tc.x) || math.IsNaN(ex) && math.IsNaN(tc.want)) {
			t.Errorf("e1exp(%v) = %v, %v; want %v, %v", tc.x, w, ex, got, math.Exp(-tc.x))
		}
	}
	// Gradual underflow: positive and decreasing up to 730, not increasing
	// beyond, zero from 740 on.
	prev := E1(700)
	for x := 700.5; x <= 750; x += 0.5 {
		v := E1(x)
		if x <= 730 && !(v > 0 && v < prev) || v > prev || x >= 740 && v != 0 {
			t.Errorf("E1(%v) = %v after E1(%v) = %v", x, v, x-0.5, prev)
		}
		prev = v
	}
	if TheisW(0.25) != E1(0.25) {
		t.Error("TheisW differs from E1")
	}
}

// TestE1SmallLimit checks the limit E1(x) → −γ − ln x + x (A&S 5.1.11,
// from memory)
// for tiny x, including the smallest float64 values.
func TestE1SmallLimit(t *testing.T) {
	for _, x := range []float64{math.SmallestNonzeroFloat64, 1e-320, 1e-308, 1e-200, 1e-100, 1e-30, 1e-17, 1e-12} {
		want := -EulerGamma - math.Log(x) + x
		if got := E1(x); math.Abs(got-want) > 2e-16*want {
			t.Errorf("E1(%v) = %.17g, want −γ − ln x + x = %.17g", x, got, want)
		}
	}
}

// TestE1Monotone checks that E1 decreases across the boundaries of the
// intervals of its expansions, between float64 neighbours, and that e1exp
// agrees with E1 and math.Exp.
func TestE1Monotone(t *testing.T) {
	edges := []float64{1, 32, 745}
	for k := 0; k < 5; k++ {
		a := math.Ldexp(1, k)
		edges = append(edges, a, a*math.Sqrt2, 2*a)
	}
	for _, x := range edges {
		lo, hi := math.Nextafter(x, 0), math.Nextafter(x, math.Inf(1))
		a, b, c := E1(lo), E1(x), E1(hi)
		if !(a >= b && b >= c) {
			t.Errorf("E1 not decreasing at %v: %v, %v, %v", x, a, b, c)
		}
		// The step between neighbours should be E1′·(hi − lo), E1′ = −e^(−x)/x.
		slope := math.Exp(-x) / x * (hi - lo)
		if d := math.Abs((a-c)-slope) / b; d > 4.5e-16 {
			t.Errorf("E1 jumps by %.3g (relative) at %v", d, x)
		}
	}
	for x := 1e-3; x < 800; x *= 1.37 {
		w, ex := e1exp(x)
		if w != E1(x) || ex != math.Exp(-x) {
			t.Errorf("e1exp(%v) = %v, %v; want %v, %v", x, w, ex, E1(x), math.Exp(-x))
		}
	}
}

// TestCooperJacobTruncation checks the relative error of the
// approximation W(u) ≈ −γ − ln u against the values of reference §4
// (computed there with scipy/mpmath), to their printed digits.
func TestCooperJacobTruncation(t *testing.T) {
	tests := []struct{ u, pct, tol float64 }{
		{0.001, 0.016, 5e-4}, {0.01, 0.247, 5e-4}, {0.02, 0.593, 5e-4},
		{0.05, 2.001, 5e-4}, {0.1, 5.352, 5e-4}, {0.2, 15.6, 0.05},
	}
	for _, tc := range tests {
		w := E1(tc.u)
		got := 100 * (w - (-EulerGamma - math.Log(tc.u))) / w
		if math.Abs(got-tc.pct) > tc.tol {
			t.Errorf("u = %v: truncation error %.4f %%, want %v %% (scipy/mpmath, reference §4)", tc.u, got, tc.pct)
		}
	}
}

func FuzzE1(f *testing.F) {
	for _, x := range []float64{0, 1e-300, 0.5, 1, 1.4142135623730951, 31.999, 700, 745.1, -1} {
		f.Add(x)
	}
	f.Fuzz(func(t *testing.T, x float64) {
		v := E1(x)
		switch {
		case math.IsNaN(x) || x < 0:
			if !math.IsNaN(v) {
				t.Errorf("E1(%v) = %v, want NaN", x, v)
			}
		case x == 0:
			if !math.IsInf(v, 1) {
				t.Errorf("E1(0) = %v", v)
			}
		default:
			// e^(−x)/(x+1) < E1(x) ≤ e^(−x)/x (A&S 5.1.19, from memory).
			if v < 0 || math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("E1(%v) = %v", x, v)
			}
			if x > 1e-300 && x < 700 {
				ex := math.Exp(-x)
				if !(v <= ex/x*(1+1e-15)) || !(v >= ex/(x+1)*(1-1e-15)) {
					t.Errorf("E1(%v) = %v outside the bounds (%v, %v) of A&S 5.1.19", x, v, ex/(x+1), ex/x)
				}
			}
		}
	})
}
