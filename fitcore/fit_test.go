package fitcore_test

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"fieldfit/fitcore"
)

// line is y = a + b·x on the given points, with an analytic Jacobian.
func line(x, y []float64) *fitcore.Problem {
	return &fitcore.Problem{
		N:      len(x),
		Params: []fitcore.Param{{Name: "a"}, {Name: "b"}},
		Residuals: func(dst, p []float64) {
			for i := range dst {
				dst[i] = p[0] + p[1]*x[i] - y[i]
			}
		},
		Jacobian: func(dst *mat.Dense, p []float64) {
			for i := range x {
				dst.Set(i, 0, 1)
				dst.Set(i, 1, x[i])
			}
		},
		Observed: y,
	}
}

// TestStraightLine checks the fit, standard errors and confidence interval
// of a straight line against the closed-form ordinary least-squares
// formulas (any regression text, e.g. Draper & Smith, Applied Regression
// Analysis, ch. 1) and Student's t quantile t(0.975, 3) = 3.182446305 from
// the standard tables (scipy.stats.t.ppf gives 3.1824463052842638).
func TestStraightLine(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5}
	y := []float64{2.1, 3.9, 6.2, 7.8, 10.1}
	res, err := fitcore.Fit(line(x, y), []float64{0, 0}, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Closed form: b = Sxy/Sxx, a = ȳ − b x̄.
	var mx, my float64
	for i := range x {
		mx += x[i] / 5
		my += y[i] / 5
	}
	var sxx, sxy, ssr float64
	for i := range x {
		sxx += (x[i] - mx) * (x[i] - mx)
		sxy += (x[i] - mx) * (y[i] - my)
	}
	b := sxy / sxx
	a := my - b*mx
	for i := range x {
		r := y[i] - a - b*x[i]
		ssr += r * r
	}
	s2 := ssr / 3
	seB := math.Sqrt(s2 / sxx)
	seA := math.Sqrt(s2 * (1.0/5 + mx*mx/sxx))
	checks := []struct {
		what      string
		got, want float64
	}{
		{"a", res.Params[0], a},
		{"b", res.Params[1], b},
		{"se(a)", res.StdErr[0], seA},
		{"se(b)", res.StdErr[1], seB},
		{"t", res.TValue, 3.182446305284264},
		{"upper(b)", res.Upper[1], b + 3.182446305284264*seB},
		{"SSR", res.SSR, ssr},
	}
	for _, c := range checks {
		if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
			t.Errorf("%s = %.12g, want %.12g", c.what, c.got, c.want)
		}
	}
	if !res.Status.Converged() {
		t.Errorf("status %v", res.Status)
	}
	if res.R2 < 0.99 || res.R2 > 1 {
		t.Errorf("R² = %v", res.R2)
	}
}

func TestErrors(t *testing.T) {
	x := []float64{1, 2, 3, 4}
	y := []float64{1, 2, 3, 4}
	nanY := []float64{1, math.NaN(), 3, 4}
	cases := []struct {
		name    string
		prob    func() *fitcore.Problem
		start   []float64
		want    error
		mention string
	}{
		{"too few", func() *fitcore.Problem { return line(x[:1], y[:1]) }, []float64{0, 0}, fitcore.ErrTooFewObservations, "1 observations for 2"},
		{"all weights zero but one", func() *fitcore.Problem {
			p := line(x, y)
			p.Weights = []float64{1, 0, 0, 0}
			return p
		}, []float64{0, 0}, fitcore.ErrTooFewObservations, ""},
		{"NaN observed", func() *fitcore.Problem { return line(x, nanY) }, []float64{0, 0}, fitcore.ErrNonFinite, "observation 1"},
		{"NaN start", func() *fitcore.Problem { return line(x, y) }, []float64{math.NaN(), 0}, fitcore.ErrNonFinite, `parameter "a"`},
		{"wrong start length", func() *fitcore.Problem { return line(x, y) }, []float64{0}, fitcore.ErrBadProblem, "1 values for 2"},
		{"non-positive start", func() *fitcore.Problem {
			p := line(x, y)
			p.Params[1].Positive = true
			return p
		}, []float64{0, -1}, fitcore.ErrBadStart, `parameter "b"`},
		{"outside bounds", func() *fitcore.Problem {
			p := line(x, y)
			p.Params[0].Lower, p.Params[0].Upper = 1, 2
			return p
		}, []float64{0, 1}, fitcore.ErrBadStart, "bounds"},
		{"negative weight", func() *fitcore.Problem {
			p := line(x, y)
			p.Weights = []float64{1, 1, -1, 1}
			return p
		}, []float64{0, 0}, fitcore.ErrBadProblem, "observation 2"},
		{"NaN model at start", func() *fitcore.Problem {
			p := line(x, y)
			p.Residuals = func(dst, q []float64) {
				for i := range dst {
					dst[i] = math.Log(q[0] - float64(i))
				}
			}
			p.Jacobian = nil
			return p
		}, []float64{1.5, 0}, fitcore.ErrNonFinite, "observation 2"},
		{"zero column", func() *fitcore.Problem {
			p := line(x, y)
			p.Jacobian = nil
			p.Residuals = func(dst, q []float64) {
				for i := range dst {
					dst[i] = q[0] - y[i]
				}
			}
			return p
		}, []float64{0, 0}, fitcore.ErrZeroColumn, `parameter "b"`},
		{"no residual function", func() *fitcore.Problem { return &fitcore.Problem{N: 3, Params: []fitcore.Param{{}}} }, []float64{0}, fitcore.ErrBadProblem, "no residual"},
		{"NaN Jacobian", func() *fitcore.Problem {
			p := line(x, y)
			p.Jacobian = func(dst *mat.Dense, q []float64) { dst.Set(3, 1, math.Inf(1)) }
			return p
		}, []float64{0, 0}, fitcore.ErrNonFinite, "observation 3"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := fitcore.Fit(c.prob(), c.start, nil)
			if err == nil {
				t.Fatalf("no error; result %+v", res)
			}
			if !errors.Is(err, c.want) {
				t.Errorf("error %q does not wrap %q", err, c.want)
			}
			var fe *fitcore.Error
			if !errors.As(err, &fe) {
				t.Errorf("error %T is not a *fitcore.Error", err)
			}
			if !strings.Contains(err.Error(), c.mention) {
				t.Errorf("error %q does not mention %q", err, c.mention)
			}
		})
	}
}

// TestIllConditioned fits y = a·x + b·x (two parameters with the same
// effect): the result must warn and name both.
func TestIllConditioned(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5, 6}
	y := []float64{1.1, 1.9, 3.2, 3.9, 5.1, 6.0}
	p := &fitcore.Problem{
		N:      len(x),
		Params: []fitcore.Param{{Name: "T"}, {Name: "S"}},
		Residuals: func(dst, q []float64) {
			for i := range dst {
				dst[i] = (q[0]+q[1])*x[i] + 1e-9*q[1]*x[i]*x[i] - y[i]
			}
		},
	}
	res, err := fitcore.Fit(p, []float64{0.3, 0.3}, nil)
	if err != nil {
		t.Fatal(err)
	}
	joined := strings.Join(res.Warnings, " ")
	if !strings.Contains(joined, "cannot tell apart parameters") || !strings.Contains(joined, "T") || !strings.Contains(joined, "S") {
		t.Errorf("warnings %q do not name T and S as not identifiable (condition %g)", res.Warnings, res.Condition)
	}
	if res.Condition < 1e10 {
		t.Errorf("condition %g, want > 1e10", res.Condition)
	}
}

// TestPositiveAndBounds checks that log-space and bounded parameters
// stay feasible and reach the minimum.
func TestPositiveAndBounds(t *testing.T) {
	// y = A e^(−k x) with A = 2, k = 0.5 exactly (a zero-residual fit).
	x := []float64{0, 1, 2, 3, 4, 5}
	y := make([]float64, len(x))
	for i := range x {
		y[i] = 2 * math.Exp(-0.5*x[i])
	}
	p := &fitcore.Problem{
		N:      len(x),
		Params: []fitcore.Param{{Name: "A", Positive: true}, {Name: "k", Lower: 0, Upper: 0.4}},
		Residuals: func(dst, q []float64) {
			for i := range dst {
				dst[i] = q[0]*math.Exp(-q[1]*x[i]) - y[i]
			}
		},
	}
	res, err := fitcore.Fit(p, []float64{10, 0.1}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if res.Params[1] != 0.4 {
		t.Errorf("k = %v, want it held at its upper bound 0.4", res.Params[1])
	}
	if !strings.Contains(strings.Join(res.Warnings, " "), "at its bound") {
		t.Errorf("no bound warning in %q", res.Warnings)
	}
	p.Params[1] = fitcore.Param{Name: "k", Positive: true}
	res, err = fitcore.Fit(p, []float64{10, 0.1}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(res.Params[0]-2) > 1e-9 || math.Abs(res.Params[1]-0.5) > 1e-9 {
		t.Errorf("params %v, want [2 0.5]", res.Params)
	}
}

// TestSettingsDefaultsAndLimits: the iteration cap is reported as such.
func TestIterationLimit(t *testing.T) {
	d := readNIST(t, "MGH09")
	res, err := fitcore.Fit(d.problem(nistModels["MGH09"], true), d.starts[0], &fitcore.Settings{MaxIterations: 3})
	if err != nil {
		t.Fatal(err)
	}
	if res.Status != fitcore.IterationLimit || res.Iterations != 3 {
		t.Errorf("status %v after %d iterations, want the iteration limit after 3", res.Status, res.Iterations)
	}
	if len(res.Warnings) == 0 {
		t.Error("no warning that the fit did not converge")
	}
}

// FuzzFit runs the solver on arbitrary data and starts of an exponential
// model: it must never panic and never return a non-finite parameter with
// a nil error.
func FuzzFit(f *testing.F) {
	f.Add(1.0, 0.5, 2.0, 0.1, 3.0, 0.02, 5.0, 0.0, false, 0.0)
	f.Add(-1.0, 1e300, 1e-300, math.Inf(1), 0.0, 1.0, 1.0, 1.0, true, 1.0)
	f.Add(math.NaN(), 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, true, -1.0)
	f.Fuzz(func(t *testing.T, y0, y1, y2, y3, a0, k0, scale, w0 float64, positive bool, lower float64) {
		x := []float64{0, 1, 2, 3}
		y := []float64{y0, y1, y2, y3}
		p := &fitcore.Problem{
			N:      4,
			Params: []fitcore.Param{{Name: "A", Positive: positive}, {Name: "k"}},
			Residuals: func(dst, q []float64) {
				for i := range dst {
					dst[i] = q[0]*math.Exp(-q[1]*x[i]*scale) - y[i]
				}
			},
			Weights: []float64{1, 1, math.Abs(w0), 1},
		}
		if lower != 0 {
			p.Params[1].Lower, p.Params[1].Upper = lower, math.Inf(1)
		}
		res, err := fitcore.Fit(p, []float64{a0, k0}, &fitcore.Settings{MaxIterations: 200})
		if err != nil {
			return
		}
		for j, v := range res.Params {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("parameter %d = %v with a nil error", j, v)
			}
		}
	})
}

// BenchmarkFitExponential fits y = A e^(−k x) to n noisy points with the
// analytic Jacobian.
func BenchmarkFitExponential(b *testing.B) {
	for _, n := range []int{100, 10000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			rng := rand.New(rand.NewPCG(1, 2))
			x := make([]float64, n)
			y := make([]float64, n)
			for i := range x {
				x[i] = 10 * float64(i) / float64(n)
				y[i] = 3*math.Exp(-0.7*x[i]) + 0.01*rng.NormFloat64()
			}
			p := &fitcore.Problem{
				N:      n,
				Params: []fitcore.Param{{Name: "A", Positive: true}, {Name: "k", Positive: true}},
				Residuals: func(dst, q []float64) {
					for i := range dst {
						dst[i] = q[0]*math.Exp(-q[1]*x[i]) - y[i]
					}
				},
				Jacobian: func(dst *mat.Dense, q []float64) {
					for i := range x {
						e := math.Exp(-q[1] * x[i])
						dst.Set(i, 0, e)
						dst.Set(i, 1, -q[0]*x[i]*e)
					}
				},
			}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := fitcore.Fit(p, []float64{1, 1}, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkNIST fits every NIST problem from start 2 once per iteration.
func BenchmarkNIST(b *testing.B) {
	data := map[string]*nistData{}
	for _, c := range nistTable {
		data[c.name] = readNIST(b, c.name)
	}
	b.ReportAllocs()
	for b.Loop() {
		for _, c := range nistTable {
			if c.start != 2 {
				continue
			}
			d := data[c.name]
			if _, err := fitcore.Fit(d.problem(nistModels[c.name], true), d.starts[1], nil); err != nil {
				b.Fatal(err)
			}
		}
	}
}
