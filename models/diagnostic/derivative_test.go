package diagnostic

import (
	"bufio"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"
)

// logspace returns n times from 10^a to 10^b, evenly spaced in log t.
func logspace(a, b float64, n int) []float64 {
	t := make([]float64, n)
	for i := range t {
		t[i] = math.Pow(10, a+(b-a)*float64(i)/float64(n-1))
	}
	return t
}

// randomTimes returns n strictly increasing times with random gaps in
// ln t (from 0.001 to 0.3), starting at t0.
func randomTimes(rng *rand.Rand, t0 float64, n int) []float64 {
	t := make([]float64, n)
	x := math.Log(t0)
	for i := range t {
		t[i] = math.Exp(x)
		x += 0.001 + 0.299*rng.Float64()
	}
	return t
}

func closeRel(got, want, tol float64) bool {
	if got == want {
		return true
	}
	return math.Abs(got-want) <= tol*math.Max(math.Abs(want), 1e-300)
}

// TestDerivativeSemilogLine: the log-derivative of s = a + b ln t is b at
// every point, ends included (analytic; every stencil is exact for a line).
func TestDerivativeSemilogLine(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	const a, b = 0.37, 0.165
	cases := []struct {
		name   string
		t      []float64
		window float64
	}{
		{"log-even default window", logspace(-1, 4, 101), 0},
		{"log-even window 1 cycle", logspace(-1, 4, 101), WindowFromCycles(1)},
		{"random gaps default window", randomTimes(rng, 0.5, 400), 0},
		{"random gaps nearest neighbours", randomTimes(rng, 3, 400), 1e-9},
		{"random gaps wide window", randomTimes(rng, 3, 400), 2.5},
		{"two points", []float64{10, 11}, 0},
		{"three points within the window", []float64{10, 10.5, 11}, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := make([]float64, len(c.t))
			for i, ti := range c.t {
				s[i] = a + b*math.Log(ti)
			}
			res, err := Derivative(c.t, s, &Settings{Window: c.window})
			if err != nil {
				t.Fatal(err)
			}
			for i, d := range res.D {
				if !closeRel(d, b, 1e-9) {
					t.Errorf("i=%d t=%g (%v): D = %.15g, want %g", i, c.t[i], res.Stencil[i], d, b)
				}
			}
		})
	}
}

// TestDerivativeQuadratic: the three-point weighted difference is the slope
// of the parabola through the three points (property of the stencil), so
// for s = a + b x + c x² (x = ln t) a central value is exactly b + 2cx_i and
// a one-sided value is the chord slope b + c(x_i + x_k). A plain average of
// the two slopes would fail this for uneven spacing.
func TestDerivativeQuadratic(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	const a, b, c = 0.1, 0.25, 0.04
	for _, w := range []float64{1e-9, 0.1, 0.2, 0.7} {
		tt := randomTimes(rng, 0.2, 300)
		x := make([]float64, len(tt))
		s := make([]float64, len(tt))
		for i, ti := range tt {
			x[i] = math.Log(ti)
			s[i] = a + b*x[i] + c*x[i]*x[i]
		}
		res, err := Derivative(tt, s, &Settings{Window: w})
		if err != nil {
			t.Fatal(err)
		}
		counts := map[Stencil]int{}
		for i, d := range res.D {
			st := res.Stencil[i]
			counts[st]++
			j, k := res.Left[i], res.Right[i]
			var want float64
			switch {
			case j == i:
				want = b + c*(x[i]+x[k])
			case k == i:
				want = b + c*(x[j]+x[i])
			default:
				want = b + 2*c*x[i]
			}
			if !closeRel(d, want, 1e-8) {
				t.Errorf("window %g, i=%d (%v, j=%d, k=%d): D = %.15g, want %.15g", w, i, st, j, k, d, want)
			}
			if st == Central && (x[i]-x[j] < w || x[k]-x[i] < w) {
				t.Errorf("window %g, i=%d: neighbours %d, %d closer than the window", w, i, j, k)
			}
		}
		if counts[Central] == 0 || counts[Forward] == 0 || counts[Backward] == 0 {
			t.Errorf("window %g: stencils used %v, want all of central, forward, backward", w, counts)
		}
	}
}

// TestDerivativeUnitSlope: for s = c·t the exact log-derivative is c·t, a
// unit-slope line on log–log axes (analytic). On evenly log-spaced data
// with step Δ the central stencil gives c·t·sinh(Δ)/Δ (analytic: the
// stencil applied to e^x), so D/t is one constant and the bias vanishes as
// the spacing and window shrink.
func TestDerivativeUnitSlope(t *testing.T) {
	const c = 0.0042
	for _, tc := range []struct {
		perDecade int
		window    float64
		maxRel    float64 // bound on |D/(c t) − 1| at central points
	}{
		{10, 0.2, 0.0089},  // Δ = 0.230: sinh(Δ)/Δ − 1 = 0.0088
		{100, 1e-9, 9e-5},  // Δ = 0.023: 8.8e-5 relative
		{1000, 1e-9, 9e-7}, // Δ = 0.0023: 8.8e-7
	} {
		tt := logspace(0, 3, 3*tc.perDecade+1)
		s := make([]float64, len(tt))
		for i, ti := range tt {
			s[i] = c * ti
		}
		res, err := Derivative(tt, s, &Settings{Window: tc.window})
		if err != nil {
			t.Fatal(err)
		}
		delta := math.Ln10 / float64(tc.perDecade)
		if tc.window > delta {
			delta *= math.Ceil(tc.window / delta)
		}
		wantRatio := math.Sinh(delta) / delta
		for i, d := range res.D {
			if res.Stencil[i] != Central {
				continue
			}
			ratio := d / (c * tt[i])
			if !closeRel(ratio, wantRatio, 1e-9) {
				t.Errorf("%d/decade i=%d: D/(ct) = %.15g, want sinh(Δ)/Δ = %.15g", tc.perDecade, i, ratio, wantRatio)
			}
			if math.Abs(ratio-1) > tc.maxRel {
				t.Errorf("%d/decade i=%d: D/(ct) − 1 = %g, want ≤ %g", tc.perDecade, i, ratio-1, tc.maxRel)
			}
		}
	}
}

type theisRow struct{ t, u, e1, s, d float64 }

// readTheisTable reads ../../testdata/diagnostic/theis_derivative.tsv,
// generated with mpmath 1.2.1 by theis_derivative_mpmath.py beside it.
func readTheisTable(t testing.TB) []theisRow {
	t.Helper()
	f, err := os.Open("../../testdata/diagnostic/theis_derivative.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var rows []theisRow
	sc := bufio.NewScanner(f)
	for line := 1; sc.Scan(); line++ {
		if strings.HasPrefix(sc.Text(), "#") {
			continue
		}
		fs := strings.Split(sc.Text(), "\t")
		if len(fs) != 5 {
			t.Fatalf("line %d: %d fields, want 5", line, len(fs))
		}
		var v [5]float64
		for i, f := range fs {
			if v[i], err = strconv.ParseFloat(f, 64); err != nil {
				t.Fatalf("line %d field %d: %v", line, i+1, err)
			}
		}
		rows = append(rows, theisRow{v[0], v[1], v[2], v[3], v[4]})
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	if len(rows) != 101 {
		t.Fatalf("%d rows, want 101", len(rows))
	}
	return rows
}

// Parameters of the mpmath table (our own scenario), SI units.
const (
	tabQ = 0.012  // m³/s
	tabT = 4.5e-3 // m²/s
	tabS = 2.0e-4
	tabR = 25.0 // m
)

// TestDerivativeTheis compares the derivative of Theis drawdowns with the
// exact log-derivative (Q/4πT)·exp(−u), both from the mpmath table. The
// tolerance is the leading truncation error of each stencil, with f = s as
// a function of x = ln t, f” = A·u·e^(−u), f”' = A·u(u − 1)·e^(−u)
// (analytic):
// central |err| ≤ Δ₁Δ₂/6·max|f”'|, one-sided |err| ≤ Δ/2·max|f”| +
// Δ²/6·max|f”'|, each with 20 % margin for higher-order terms.
func TestDerivativeTheis(t *testing.T) {
	rows := readTheisTable(t)
	tt := make([]float64, len(rows))
	s := make([]float64, len(rows))
	for i, r := range rows {
		tt[i], s[i] = r.t, r.s
	}
	A := tabQ / (4 * math.Pi * tabT)
	u0 := tabR * tabR * tabS / (4 * tabT) // u = u0/t
	maxAbs := func(x0, x1 float64, f func(u float64) float64) float64 {
		m := 0.0
		for q := 0; q <= 64; q++ {
			x := x0 + (x1-x0)*float64(q)/64
			m = math.Max(m, math.Abs(f(u0*math.Exp(-x))))
		}
		return m
	}
	f2 := func(u float64) float64 { return A * u * math.Exp(-u) }
	f3 := func(u float64) float64 { return A * u * (u - 1) * math.Exp(-u) }
	for _, w := range []float64{0, 0.5} {
		res, err := Derivative(tt, s, &Settings{Window: w})
		if err != nil {
			t.Fatal(err)
		}
		for i, d := range res.D {
			j, k := res.Left[i], res.Right[i]
			xi, xj, xk := math.Log(tt[i]), math.Log(tt[j]), math.Log(tt[k])
			var tol float64
			switch res.Stencil[i] {
			case Central:
				tol = (xi - xj) * (xk - xi) / 6 * maxAbs(xj, xk, f3)
			default:
				h := xk - xj
				tol = h/2*maxAbs(xj, xk, f2) + h*h/6*maxAbs(xj, xk, f3)
			}
			tol = 1.2*tol + 1e-12
			if err := math.Abs(d - rows[i].d); err > tol {
				t.Errorf("window %g, t=%g s (%v): D = %.10g, exact %.10g, error %.3g > %.3g",
					w, tt[i], res.Stencil[i], d, rows[i].d, err, tol)
			}
		}
		// Late time (u < 1e-4): the derivative stabilises at Q/(4πT),
		// the infinite-acting radial flow plateau (analytic).
		if last := res.D[len(res.D)-3]; !closeRel(last, A, 1e-3) {
			t.Errorf("window %g: late derivative %.6g, want Q/(4πT) = %.6g", w, last, A)
		}
	}
}

func TestStencilChoice(t *testing.T) {
	x := []float64{0, 0.25, 0.5, 0.75, 1, 1.25, 1.5, 1.75, 2}
	s := make([]float64, len(x))
	res, err := DerivativeOnAxis(x, s, &Settings{Window: 0.5})
	if err != nil {
		t.Fatal(err)
	}
	wantSt := []Stencil{Forward, Forward, Central, Central, Central, Central, Central, Backward, Backward}
	wantL := []int{0, 1, 0, 1, 2, 3, 4, 5, 6}
	wantR := []int{2, 3, 4, 5, 6, 7, 8, 7, 8}
	for i := range x {
		if res.Stencil[i] != wantSt[i] || res.Left[i] != wantL[i] || res.Right[i] != wantR[i] {
			t.Errorf("i=%d: %v (%d, %d), want %v (%d, %d)", i,
				res.Stencil[i], res.Left[i], res.Right[i], wantSt[i], wantL[i], wantR[i])
		}
	}
	// A series shorter than the window: every point uses the two ends.
	short, err := DerivativeOnAxis([]float64{0, 0.0625, 0.25}, []float64{1, 2, 4}, &Settings{Window: 0.5})
	if err != nil {
		t.Fatal(err)
	}
	for i, st := range short.Stencil {
		if st != Span || short.Left[i] != 0 || short.Right[i] != 2 {
			t.Errorf("short i=%d: %v (%d, %d), want span (0, 2)", i, st, short.Left[i], short.Right[i])
		}
	}
	// Hand values: the ends are the chord (4 − 1)/0.25 = 12; the middle
	// has slopes 16 and 2/0.1875 and gives (16·0.1875 + 2)/0.25 = 44/3.
	for i, want := range []float64{12, 44.0 / 3, 12} {
		if !closeRel(short.D[i], want, 1e-15) {
			t.Errorf("short D[%d] = %g, want %g", i, short.D[i], want)
		}
	}
	if short.Window != 0.5 {
		t.Errorf("Window = %g, want 0.5", short.Window)
	}
	def, _ := DerivativeOnAxis(x, s, nil)
	if def.Window != DefaultWindow {
		t.Errorf("nil settings: Window = %g, want %g", def.Window, DefaultWindow)
	}
}

func TestDerivativeErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	ok := []float64{1, 2, 3, 4, 5, 6}
	cases := []struct {
		name   string
		t, s   []float64
		window float64
		err    error
		index  int
		field  string
		msg    string
	}{
		{"NaN time", []float64{1, 2, 3, nan, 5, 6}, ok, 0, ErrNotFinite, 3, "t", "index 3, t = NaN"},
		{"infinite time", []float64{1, 2, inf, 4, 5, 6}, ok, 0, ErrNotFinite, 2, "t", "index 2, t = +Inf"},
		{"zero time", []float64{0, 2, 3, 4, 5, 6}, ok, 0, ErrNonPositiveTime, 0, "t", "index 0, t = 0"},
		{"negative time", []float64{1, 2, 3, 4, -5, 6}, ok, 0, ErrNonPositiveTime, 4, "t", "index 4, t = -5"},
		{"unsorted", []float64{1, 3, 2, 4, 5, 6}, ok, 0, ErrUnsorted, 2, "t", "index 2, t = 2"},
		{"duplicate", []float64{1, 2, 3, 4, 4, 6}, ok, 0, ErrDuplicateTime, 4, "t", "index 4, t = 4"},
		{"equal in ln t", []float64{1e15, 1e15 + 0.125}, []float64{1, 2}, 0, ErrDuplicateTime, 1, "t", "index 1"},
		{"NaN drawdown", ok, []float64{1, nan, 3, 4, 5, 6}, 0, ErrNotFinite, 1, "s", "index 1, s = NaN"},
		{"infinite drawdown", ok, []float64{1, 2, 3, 4, 5, -inf}, 0, ErrNotFinite, 5, "s", "index 5, s = -Inf"},
		{"lengths differ", ok, ok[:5], 0, ErrLength, -1, "len(s)", "len(t) = 6"},
		{"one point", ok[:1], ok[:1], 0, ErrTooFew, -1, "len(t)", "at least two"},
		{"no points", nil, nil, 0, ErrTooFew, -1, "len(t)", "len(t) = 0"},
		{"negative window", ok, ok, -0.1, ErrWindow, -1, "window", "window = -0.1"},
		{"NaN window", ok, ok, nan, ErrWindow, -1, "window", "window = NaN"},
		{"infinite window", ok, ok, inf, ErrWindow, -1, "window", "window = +Inf"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := Derivative(c.t, c.s, &Settings{Window: c.window})
			if err == nil {
				t.Fatalf("no error, result %v", res.D)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("error %q does not wrap %q", err, c.err)
			}
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %T is not *InputError", err)
			}
			if ie.Index != c.index || ie.Field != c.field {
				t.Errorf("index %d field %q, want %d %q", ie.Index, ie.Field, c.index, c.field)
			}
			if !strings.Contains(err.Error(), c.msg) {
				t.Errorf("message %q does not contain %q", err, c.msg)
			}
		})
	}
	_, err := DerivativeOnAxis([]float64{0, 1, nan}, []float64{0, 1, 2}, nil)
	var ie *InputError
	if !errors.As(err, &ie) || ie.Index != 2 || ie.Field != "x" || !errors.Is(err, ErrNotFinite) {
		t.Errorf("DerivativeOnAxis NaN x: %v", err)
	}
	_, err = DerivativeOnAxis([]float64{-3, -1, -2}, []float64{0, 1, 2}, nil)
	if !errors.As(err, &ie) || ie.Index != 2 || !errors.Is(err, ErrUnsorted) {
		t.Errorf("DerivativeOnAxis unsorted x: %v", err)
	}
}

func TestDerivativeKeepsInput(t *testing.T) {
	tt := []float64{1, 2, 4, 8, 16}
	s := []float64{0.1, 0.3, 0.4, 0.6, 0.65}
	t0, s0 := append([]float64(nil), tt...), append([]float64(nil), s...)
	if _, err := Derivative(tt, s, nil); err != nil {
		t.Fatal(err)
	}
	for i := range tt {
		if tt[i] != t0[i] || s[i] != s0[i] {
			t.Fatalf("input changed at %d", i)
		}
	}
}

func TestWindowFromCycles(t *testing.T) {
	// 1 log10 cycle = ln 10 natural-log units (analytic).
	if got := WindowFromCycles(1); got != math.Ln10 {
		t.Errorf("WindowFromCycles(1) = %g, want ln 10", got)
	}
	if got := WindowFromCycles(DefaultWindow / math.Ln10); !closeRel(got, DefaultWindow, 1e-15) {
		t.Errorf("round trip %g", got)
	}
}

func TestStencilString(t *testing.T) {
	for st, want := range map[Stencil]string{Central: "central", Forward: "forward", Backward: "backward", Span: "span", 9: "Stencil(9)"} {
		if st.String() != want {
			t.Errorf("%d: %q, want %q", st, st.String(), want)
		}
	}
}

func BenchmarkDerivative100k(b *testing.B) {
	const n = 100_000
	tt := logspace(0, 5, n)
	s := make([]float64, n)
	rng := rand.New(rand.NewPCG(5, 6))
	for i, ti := range tt {
		s[i] = 0.2*math.Log(ti) + 0.001*rng.NormFloat64()
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Derivative(tt, s, nil); err != nil {
			b.Fatal(err)
		}
	}
}
