package steptest

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// TestJacobByHand: the regression of s_w/Q on Q worked by hand for three
// points (Q, s_w/Q) = (1, 3), (2, 4), (3, 6):
//
//	Q̄ = 2, ȳ = 13/3, Sxx = 2, Sxy = 3 → C = 3/2, B = 13/3 − 3 = 4/3;
//	residuals 1/6, −1/3, 1/6 → SSR = 1/6, s² = SSR/1 = 1/6;
//	SE(C) = √(s²/Sxx) = √(1/12), SE(B) = √(s²(1/3 + 4/2)) = √(7/18),
//	Cov(B, C) = −Q̄·s²/Sxx = −1/6, RMSE = √(SSR/3) = √(1/18);
//
// and t(0.975, 1) = tan(0.475π) = 12.7062047361747 (Student's t on one
// degree of freedom is the Cauchy distribution, whose quantile is
// tan(π(p − ½))).
func TestJacobByHand(t *testing.T) {
	pts := []Point{{1, 3}, {2, 8}, {3, 18}}
	f, err := Jacob(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	const tq = 12.7062047361747
	b, _ := f.Coefficient("B")
	c, _ := f.Coefficient("C")
	checks := []struct {
		name      string
		got, want float64
	}{
		{"B", b.Value, 4.0 / 3},
		{"C", c.Value, 1.5},
		{"SE(B)", b.StdErr, math.Sqrt(7.0 / 18)},
		{"SE(C)", c.StdErr, math.Sqrt(1.0 / 12)},
		{"Cov(B, C)", f.Cov.At(0, 1), -1.0 / 6},
		{"RMSE", f.RMSE, math.Sqrt(1.0 / 18)},
		{"t", f.TValue, tq},
		{"B lower", b.Lower, 4.0/3 - tq*math.Sqrt(7.0/18)},
		{"C upper", c.Upper, 1.5 + tq*math.Sqrt(1.0/12)},
		{"residual 1", f.Residuals[0], -1.0 / 6},
		{"residual 2", f.Residuals[1], 1.0 / 3},
	}
	for _, k := range checks {
		if math.Abs(k.got-k.want) > 1e-12*math.Max(1, math.Abs(k.want)) {
			t.Errorf("%s = %.16g, want %.16g", k.name, k.got, k.want)
		}
	}
	if f.DoF != 1 || f.N != 3 || f.Method != JacobName || f.Law.N != 2 {
		t.Errorf("DoF %d N %d method %q n %g", f.DoF, f.N, f.Method, f.Law.N)
	}
}

// TestJacobExact: drawdowns made exactly by s_w = BQ + CQ² (our own
// numbers, B = 250 s/m², C = 1500 s²/m⁵) give B and C back to rounding and
// no scatter; with two steps the line is exact and no interval is given.
func TestJacobExact(t *testing.T) {
	law := Law{B: 250, C: 1500, N: 2}
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04} {
		pts = append(pts, Point{q, law.Drawdown(q)})
	}
	f, err := Jacob(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(f.Law.B, 250) > 1e-12 || relDiff(f.Law.C, 1500) > 1e-10 || f.RMSE > 1e-10 {
		t.Errorf("B = %.15g, C = %.15g, RMSE = %g", f.Law.B, f.Law.C, f.RMSE)
	}
	if len(f.Caveats) != 0 {
		t.Errorf("caveats %q", f.Caveats)
	}
	two, err := Jacob(pts[:2], nil)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := two.Coefficient("B")
	if relDiff(two.Law.C, 1500) > 1e-10 || !math.IsNaN(b.StdErr) || two.Cov != nil || len(two.Caveats) == 0 {
		t.Errorf("two steps: C %g, SE(B) %g, Cov %v, caveats %q", two.Law.C, b.StdErr, two.Cov, two.Caveats)
	}
	if e, lo, hi := two.Efficiency(0.02); !math.IsNaN(lo) || !math.IsNaN(hi) || relDiff(e, 5/5.6) > 1e-12 {
		t.Errorf("two steps: efficiency %g (%g … %g)", e, lo, hi)
	}
}

// TestLaw: efficiency and the rate for an efficiency, by hand for
// B = 250 s/m², C = 1500 s²/m⁵: at Q = 0.02 m³/s, s_w = 5 + 0.6 = 5.6 m,
// E = 5/5.6; E = 0.8 at Q = 250·0.2/(1500·0.8) = 1/24 m³/s.
func TestLaw(t *testing.T) {
	l := Law{B: 250, C: 1500, N: 2}
	if got := l.Efficiency(0.02); math.Abs(got-5/5.6) > 1e-15 {
		t.Errorf("E(0.02) = %.17g, want %.17g", got, 5/5.6)
	}
	if l.LinearLoss(0.02) != 5 || math.Abs(l.NonlinearLoss(0.02)-0.6) > 1e-15 {
		t.Errorf("losses %g, %g", l.LinearLoss(0.02), l.NonlinearLoss(0.02))
	}
	q, err := l.RateFor(0.8)
	if err != nil || math.Abs(q-1.0/24) > 1e-16 {
		t.Errorf("RateFor(0.8) = %.17g, %v; want 1/24", q, err)
	}
	// Round trip for a Rorabaugh law.
	r := Law{B: 250, C: 5000, N: 2.6}
	for _, e := range []float64{0.5, 0.7, 0.9, 0.99} {
		q, err := r.RateFor(e)
		if err != nil {
			t.Fatal(err)
		}
		if got := r.Efficiency(q); math.Abs(got-e) > 1e-13 {
			t.Errorf("n = 2.6: E(RateFor(%g)) = %.15g", e, got)
		}
	}
	bad := []struct {
		law   Law
		e     float64
		field string
	}{
		{l, 0, "efficiency"},
		{l, 1, "efficiency"},
		{l, math.NaN(), "efficiency"},
		{Law{B: -1, C: 1, N: 2}, 0.5, "B"},
		{Law{B: 1, C: 0, N: 2}, 0.5, "C"},
		{Law{B: 1, C: 1, N: 1}, 0.5, "n"},
	}
	for _, c := range bad {
		_, err := c.law.RateFor(c.e)
		var e *Error
		if !errors.As(err, &e) || e.Field != c.field || !errors.Is(err, ErrLaw) {
			t.Errorf("RateFor(%g) on %+v: error %v, want one about %s", c.e, c.law, err, c.field)
		}
	}
}

// TestEfficiencyInterval: the delta-method interval of the efficiency
// equals t·√(gᵀ·Cov·g) with g the gradient of E(B, C, n) taken by central
// differences here (an independent check of the analytic gradient).
func TestEfficiencyInterval(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	law := Law{B: 250, C: 5000, N: 2.6}
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04, 0.05, 0.06} {
		pts = append(pts, Point{q, law.Drawdown(q) * (1 + 0.01*rng.NormFloat64())})
	}
	for _, fit := range []func([]Point, *FitSettings) (*LossFit, error){Jacob, Rorabaugh} {
		f, err := fit(pts, nil)
		if err != nil {
			t.Fatal(err)
		}
		const q = 0.035
		e, lo, hi := f.Efficiency(q)
		p := []float64{f.Law.B, f.Law.C, f.Law.N}
		np, _ := f.Cov.Dims()
		g := make([]float64, np)
		for j := range g {
			h := 1e-6 * p[j]
			up, dn := append([]float64(nil), p...), append([]float64(nil), p...)
			up[j] += h
			dn[j] -= h
			g[j] = (Law{up[0], up[1], up[2]}.Efficiency(q) - Law{dn[0], dn[1], dn[2]}.Efficiency(q)) / (2 * h)
		}
		v := 0.0
		for a := range g {
			for b := range g {
				v += g[a] * f.Cov.At(a, b) * g[b]
			}
		}
		half := f.TValue * math.Sqrt(v)
		if relDiff(e-lo, half) > 1e-6 || relDiff(hi-e, half) > 1e-6 {
			t.Errorf("%s: E = %g, interval %g … %g, want ± %g", f.Method, e, lo, hi, half)
		}
	}
}

// TestRorabaughExact: drawdowns made exactly by s_w = BQ + CQⁿ with n = 2.6
// (our own numbers) give B, C and n back.
func TestRorabaughExact(t *testing.T) {
	law := Law{B: 250, C: 5000, N: 2.6}
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04, 0.05} {
		pts = append(pts, Point{q, law.Drawdown(q)})
	}
	f, err := Rorabaugh(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(f.Law.B, 250) > 1e-8 || relDiff(f.Law.C, 5000) > 1e-6 || relDiff(f.Law.N, 2.6) > 1e-8 {
		t.Errorf("B = %.12g, C = %.12g, n = %.12g", f.Law.B, f.Law.C, f.Law.N)
	}
	if f.Method != RorabaughName || f.Solver == nil || !f.Solver.Status.Converged() || len(f.Coefficients) != 3 {
		t.Errorf("method %q, solver %v", f.Method, f.Solver)
	}
}

// TestRorabaughNoisy: with 0.5 % seeded noise on s_w the 95 % intervals of
// B, C and n contain the generator's values (our own numbers); the
// correlation of C and n is reported by the solver when it is extreme.
func TestRorabaughNoisy(t *testing.T) {
	law := Law{B: 250, C: 5000, N: 2.6}
	rng := rand.New(rand.NewPCG(11, 12))
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04, 0.05, 0.06} {
		pts = append(pts, Point{q, law.Drawdown(q) * (1 + 0.005*rng.NormFloat64())})
	}
	f, err := Rorabaugh(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	truth := map[string]float64{"B": 250, "C": 5000, "n": 2.6}
	for _, c := range f.Coefficients {
		if !(c.Lower <= truth[c.Name] && truth[c.Name] <= c.Upper) {
			t.Errorf("%s = %g (%g … %g) misses %g", c.Name, c.Value, c.Lower, c.Upper, truth[c.Name])
		}
	}
}

// TestRorabaughBounds: data whose best exponent lies outside the range
// put n at its bound, with a caveat.
func TestRorabaughBounds(t *testing.T) {
	law := Law{B: 250, C: 3e6, N: 4.5}
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04, 0.05} {
		pts = append(pts, Point{q, law.Drawdown(q)})
	}
	f, err := Rorabaugh(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	if f.Law.N != 3.5 || !strings.Contains(strings.Join(f.Caveats, " "), "end of its range") {
		t.Errorf("n = %g, caveats %q", f.Law.N, f.Caveats)
	}
	g, err := Rorabaugh(pts, &FitSettings{NMax: 6})
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(g.Law.N, 4.5) > 1e-6 {
		t.Errorf("NMax 6: n = %g, want 4.5", g.Law.N)
	}
}

// TestLossBadInput: bad step drawdowns and settings give errors naming the
// step and wrapping the right sentinel.
func TestLossBadInput(t *testing.T) {
	good := []Point{{0.01, 2.6}, {0.02, 5.6}, {0.03, 8.9}, {0.04, 12.4}}
	with := func(k int, p Point) []Point {
		c := append([]Point(nil), good...)
		c[k] = p
		return c
	}
	type fitFunc func([]Point, *FitSettings) (*LossFit, error)
	cases := []struct {
		name  string
		fit   fitFunc
		pts   []Point
		set   *FitSettings
		err   error
		words []string
	}{
		{"Jacob one step", Jacob, good[:1], nil, ErrTooFewSteps, []string{"at least 2 steps, 1 given"}},
		{"Jacob zero rate", Jacob, with(2, Point{0, 8.9}), nil, ErrSchedule, []string{"step 3 of 4", "rate = 0"}},
		{"Jacob NaN drawdown", Jacob, with(1, Point{0.02, math.NaN()}), nil, ErrReading, []string{"step 2 of 4", "drawdown = NaN"}},
		{"Jacob negative drawdown", Jacob, with(0, Point{0.01, -1}), nil, ErrReading, []string{"step 1 of 4", "drawdown = -1"}},
		{"Jacob same rates", Jacob, []Point{{0.01, 1}, {0.01, 1.1}, {0.01, 1.2}}, nil, ErrNoTrend, []string{"same rate"}},
		{"Jacob confidence", Jacob, good, &FitSettings{Confidence: -0.5}, ErrSetting, []string{"Confidence = -0.5"}},
		{"Rorabaugh three steps", Rorabaugh, good[:3], nil, ErrTooFewSteps, []string{"at least 4 steps, 3 given"}},
		{"Rorabaugh two rates", Rorabaugh, []Point{{0.01, 1}, {0.01, 1.1}, {0.02, 2.4}, {0.02, 2.5}}, nil, ErrNoTrend, []string{"2 distinct rates"}},
		{"Rorabaugh range", Rorabaugh, good, &FitSettings{NMin: 3, NMax: 2}, ErrSetting, []string{"NMin < NMax"}},
		{"Rorabaugh falling", Rorabaugh, []Point{{0.01, 3}, {0.02, 5}, {0.03, 6.5}, {0.04, 7.5}}, nil, ErrNoTrend, []string{"does not rise"}},
		{"Rorabaugh infinite rate", Rorabaugh, with(3, Point{math.Inf(1), 12.4}), nil, ErrSchedule, []string{"step 4 of 4", "rate = +Inf"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			f, err := c.fit(c.pts, c.set)
			if err == nil {
				t.Fatalf("no error; fit %+v", f)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("error %v does not wrap %v", err, c.err)
			}
			for _, w := range c.words {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not say %q", err, w)
				}
			}
		})
	}
}

// TestJacobCaveats: a negative C and an interval of C that includes zero
// are pointed out.
func TestJacobCaveats(t *testing.T) {
	neg, err := Jacob([]Point{{0.01, 3}, {0.02, 5.9}, {0.03, 8.7}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(neg.Caveats, " "), "not positive") {
		t.Errorf("negative C %g: caveats %q", neg.Law.C, neg.Caveats)
	}
	if _, err := neg.Condition(); !errors.Is(err, ErrLaw) {
		t.Errorf("condition of a negative C: %v", err)
	}
	weak, err := Jacob([]Point{{0.01, 2.5}, {0.02, 5.1}, {0.03, 7.45}, {0.04, 10.1}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if c, _ := weak.Coefficient("C"); !(c.Value > 0 && c.Lower < 0) || !strings.Contains(strings.Join(weak.Caveats, " "), "includes zero") {
		t.Errorf("weak C %+v: caveats %q", c, weak.Caveats)
	}
}
