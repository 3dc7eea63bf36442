package models

import (
	"bufio"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
)

// Our own scenario (invented): a well pumped at 12 L/s, observed 30 m
// away, in an aquifer with T = 4.0e-3 m²/s and S = 2e-4.
const (
	scQ = 0.012
	scR = 30.0
	scT = 4.0e-3
	scS = 2e-4
)

// logTimes returns n times log-spaced from a to b.
func logTimes(n int, a, b float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

func relDiff(a, b float64) float64 { return math.Abs(a-b) / math.Max(math.Abs(b), 1e-300) }

// checkJacobian compares m.Jacobian with central differences (gonum
// diff/fd) at the times ts and parameters p.
func checkJacobian(t *testing.T, m Model, ts, p []float64, tol float64) {
	t.Helper()
	n, np := len(ts), len(p)
	got := mat.NewDense(n, np, nil)
	m.Jacobian(got, ts, p)
	want := mat.NewDense(n, np, nil)
	fd.Jacobian(want, func(y, x []float64) { m.Eval(y, ts, x) }, p, &fd.JacobianSettings{
		Formula: fd.Central,
		Step:    1e-6 * math.Min(math.Abs(p[0]), math.Abs(p[1])),
	})
	// Scale-aware check: compare each column relative to its largest entry
	// and each entry relative to itself.
	for j := 0; j < np; j++ {
		scale := 0.0
		for i := 0; i < n; i++ {
			scale = math.Max(scale, math.Abs(want.At(i, j)))
		}
		for i := 0; i < n; i++ {
			g, w := got.At(i, j), want.At(i, j)
			if math.Abs(g-w) > tol*math.Max(math.Abs(w), 1e-3*scale) {
				t.Errorf("%s: ∂f/∂%s at t = %g: analytic %.10g, central difference %.10g", m.Name(), m.Params()[j].Name, ts[i], g, w)
			}
		}
	}
}

func TestJacobians(t *testing.T) {
	ts := logTimes(40, 1, 1e7)
	tests := []struct {
		m Model
		p []float64
	}{
		{Theis{Q: scQ, R: scR}, []float64{scT, scS}},
		{Theis{Q: -0.005, R: 0.15}, []float64{2e-5, 1e-3}},
		{Theis{Q: 0.05, R: 250}, []float64{1e-2, 1e-5}},
		{CooperJacob{Q: scQ, R: scR}, []float64{scT, scS}},
		{TheisRecovery{Q: scQ, R: scR, PumpTime: 172800}, []float64{scT, scS}},
		{TheisRecovery{Q: 0.002, R: 5, PumpTime: 3600}, []float64{1e-4, 1e-3}},
	}
	for _, tc := range tests {
		// fd uses a fixed absolute step; scale the parameters to order 1
		// by checking in terms of p/p0 through a wrapper.
		checkJacobian(t, scaled{tc.m, tc.p}, ts, []float64{1, 1}, 2e-6)
	}
}

// scaled expresses a model in the parameters q = p/p0, so that one finite
// difference step suits every parameter.
type scaled struct {
	Model
	p0 []float64
}

func (s scaled) un(q []float64) []float64 {
	p := make([]float64, len(q))
	for j := range q {
		p[j] = q[j] * s.p0[j]
	}
	return p
}

func (s scaled) Eval(dst, t, q []float64) { s.Model.Eval(dst, t, s.un(q)) }

func (s scaled) Jacobian(dst *mat.Dense, t, q []float64) {
	s.Model.Jacobian(dst, t, s.un(q))
	r, c := dst.Dims()
	for i := 0; i < r; i++ {
		for j := 0; j < c; j++ {
			dst.Set(i, j, dst.At(i, j)*s.p0[j])
		}
	}
}

// TestTheisDrawdown checks the Theis drawdown against s = Q/(4πT)·W(u)
// with W from the published table of Huisman (1972), Table 4.1 [H], and
// Abramowitz & Stegun Table 5.1 [AS]: times are chosen so that u hits a
// tabulated argument.
func TestTheisDrawdown(t *testing.T) {
	m := Theis{Q: scQ, R: scR}
	a := scQ / (4 * math.Pi * scT)
	b := scR * scR * scS / (4 * scT)
	tests := []struct {
		u, w, tol float64
		source    string
	}{
		{1e-5, 10.9357, 5e-5, "[H]"},
		{1, 0.219383934, 5e-10, "[AS]"},
		{2, 0.048900511, 5e-10, "[AS]"},
		{3, 0.01305, 5e-6, "[H]"},
	}
	for _, tc := range tests {
		got := make([]float64, 1)
		m.Eval(got, []float64{b / tc.u}, []float64{scT, scS})
		if math.Abs(got[0]-a*tc.w) > a*tc.tol {
			t.Errorf("s at u = %v: %.10g m, want Q/(4πT)·W = %.10g m (W from %s)", tc.u, got[0], a*tc.w, tc.source)
		}
	}
	// At t = 0 the drawdown is zero; before it, NaN.
	got := make([]float64, 2)
	m.Eval(got, []float64{0, -1}, []float64{scT, scS})
	if got[0] != 0 || !math.IsNaN(got[1]) {
		t.Errorf("s(0), s(−1) = %v, want 0, NaN", got)
	}
}

// TestRecoveryMpmath checks Theis residual drawdown and its straight-line
// form against testdata/models/recovery_mpmath.tsv (source: mpmath; the
// first rows are the check values of reference §5, [lib]).
func TestRecoveryMpmath(t *testing.T) {
	f, err := os.Open("../testdata/models/recovery_mpmath.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	rows := 0
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		var v [8]float64
		for k, s := range strings.Split(line, "\t") {
			if v[k], err = strconv.ParseFloat(s, 64); err != nil {
				t.Fatal(err)
			}
		}
		q, T, S, r, tp, tr, want, wantLine := v[0], v[1], v[2], v[3], v[4], v[5], v[6], v[7]
		got := make([]float64, 1)
		TheisRecovery{Q: q, R: r, PumpTime: tp}.Eval(got, []float64{tr}, []float64{T, S})
		if relDiff(got[0], want) > 1e-13 {
			t.Errorf("s′(t′ = %g) = %.15g, want %.15g (mpmath)", tr, got[0], want)
		}
		if l := TheisRecoveryLine(q, T, tp, tr); relDiff(l, wantLine) > 1e-14 {
			t.Errorf("line s′(t′ = %g) = %.15g, want %.15g (mpmath)", tr, l, wantLine)
		}
		rows++
	}
	if rows < 10 {
		t.Fatalf("only %d rows", rows)
	}
	// Reference §5 to its printed digits (scipy/mpmath [lib]).
	ref := []struct{ tr, s, line float64 }{
		{0.01, 0.733104, 0.734519}, {0.1, 0.381507, 0.381637}, {1, 0.110311, 0.110318},
	}
	for _, c := range ref {
		got := make([]float64, 1)
		TheisRecovery{Q: 500, R: 30, PumpTime: 1}.Eval(got, []float64{c.tr}, []float64{250, 1e-4})
		if math.Abs(got[0]-c.s) > 5e-7 || math.Abs(TheisRecoveryLine(500, 250, 1, c.tr)-c.line) > 5e-7 {
			t.Errorf("t′ = %v: s′ = %.7f, line %.7f; want %v, %v (reference §5)", c.tr, got[0], TheisRecoveryLine(500, 250, 1, c.tr), c.s, c.line)
		}
	}
}

// TestAgarwalTime checks t_e = tp·t′/(tp + t′) (Agarwal 1980, from memory,
// reference §5) at values worked by hand and its limits t_e → t′ for
// t′ ≪ tp and t_e → tp for t′ ≫ tp.
func TestAgarwalTime(t *testing.T) {
	if got := AgarwalTime(3600, 3600); got != 1800 {
		t.Errorf("AgarwalTime(1 h, 1 h) = %v s, want 1800", got)
	}
	if got := AgarwalTime(100, 25); got != 20 {
		t.Errorf("AgarwalTime(100, 25) = %v, want 20", got)
	}
	if got := AgarwalTime(1e6, 1); relDiff(got, 1) > 2e-6 {
		t.Errorf("AgarwalTime(1e6, 1) = %v, want ≈ 1", got)
	}
	if got := AgarwalTime(10, 1e9); relDiff(got, 10) > 2e-8 {
		t.Errorf("AgarwalTime(10, 1e9) = %v, want ≈ 10", got)
	}
}

// synth returns noise-free Theis drawdowns of the scenario at n times from
// 1 min to 2 days.
func synth(n int) Data {
	ts := logTimes(n, 60, 172800)
	s := make([]float64, n)
	Theis{Q: scQ, R: scR}.Eval(s, ts, []float64{scT, scS})
	return Data{Time: ts, Value: s}
}

func TestTheisFitExact(t *testing.T) {
	d := synth(30)
	for _, start := range [][]float64{nil, {1e-1, 1e-6}, {1e-5, 0.1}} {
		r, err := Fit(Theis{Q: scQ, R: scR}, d, &FitSettings{Start: start})
		if err != nil {
			t.Fatalf("start %v: %v", start, err)
		}
		T, _ := r.Estimate("T")
		S, _ := r.Estimate("S")
		if relDiff(T.Value, scT) > 1e-8 || relDiff(S.Value, scS) > 1e-8 {
			t.Errorf("start %v: T = %v, S = %v; want %v, %v", start, T.Value, S.Value, scT, scS)
		}
		if T.Unit != "m²/s" || S.Unit != "1" || T.Long != "transmissivity" {
			t.Errorf("estimates carry %+v, %+v", T.ParamInfo, S.ParamInfo)
		}
		if len(r.Used) != 30 || len(r.Residuals) != 30 || len(r.Valid) != 30 {
			t.Errorf("used %d, residuals %d, valid %d", len(r.Used), len(r.Residuals), len(r.Valid))
		}
	}
}

// TestTheisInjection checks that a negative rate (injection, negative
// drawdown) fits as well.
func TestTheisInjection(t *testing.T) {
	d := synth(25)
	for i := range d.Value {
		d.Value[i] = -d.Value[i]
	}
	r, err := Fit(Theis{Q: -scQ, R: scR}, d, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(r.Params[0], scT) > 1e-8 || relDiff(r.Params[1], scS) > 1e-8 {
		t.Errorf("T, S = %v, want %v, %v", r.Params, scT, scS)
	}
}

func TestFitWindowAndMask(t *testing.T) {
	d := synth(40)
	// Spoil some readings and exclude them: by the mask, a zero weight
	// and the window. Excluded readings may hold anything.
	d.Exclude = make([]bool, 40)
	d.Weight = make([]float64, 40)
	for i := range d.Weight {
		d.Weight[i] = 1
	}
	d.Value[3], d.Exclude[3] = math.NaN(), true
	d.Value[7], d.Weight[7] = 99, 0
	d.Time[0], d.Exclude[0] = -5, true
	d.Value[39] = -7 // outside the window below
	s := &FitSettings{From: 100, To: 1.5e5}
	r, err := Fit(Theis{Q: scQ, R: scR}, d, s)
	if err != nil {
		t.Fatal(err)
	}
	if r.Excluded != 3 || r.Outside < 2 {
		t.Errorf("excluded %d, outside %d; want 3 and ≥ 2", r.Excluded, r.Outside)
	}
	for _, i := range r.Used {
		if i == 0 || i == 3 || i == 7 || i == 39 || d.Time[i] < 100 || d.Time[i] > 1.5e5 {
			t.Errorf("reading %d (t = %v) was used", i, d.Time[i])
		}
	}
	if len(r.Used)+r.Excluded+r.Outside != 40 {
		t.Errorf("used %d + excluded %d + outside %d ≠ 40", len(r.Used), r.Excluded, r.Outside)
	}
	if relDiff(r.Params[0], scT) > 1e-8 || relDiff(r.Params[1], scS) > 1e-8 {
		t.Errorf("T, S = %v", r.Params)
	}
}

// TestFitErrors checks that bad input gives an *Error that names the
// point, field and value and wraps the right sentinel.
func TestFitErrors(t *testing.T) {
	good := synth(10)
	with := func(f func(d *Data)) Data {
		d := Data{Time: append([]float64(nil), good.Time...), Value: append([]float64(nil), good.Value...)}
		f(&d)
		return d
	}
	th := Theis{Q: scQ, R: scR}
	tests := []struct {
		name     string
		m        Model
		d        Data
		s        *FitSettings
		sentinel error
		index    int
		contains []string
	}{
		{"time zero", th, with(func(d *Data) { d.Time[4] = 0 }), nil, ErrBadReading, 4, []string{"point 4", "time = 0", "t > 0"}},
		{"negative time", th, with(func(d *Data) { d.Time[2] = -60 }), nil, ErrBadReading, 2, []string{"point 2", "time = -60"}},
		{"NaN time", th, with(func(d *Data) { d.Time[1] = math.NaN() }), nil, ErrBadReading, 1, []string{"point 1", "time = NaN"}},
		{"NaN reading", th, with(func(d *Data) { d.Value[6] = math.NaN() }), nil, ErrBadReading, 6, []string{"point 6", "drawdown = NaN"}},
		{"Inf reading", th, with(func(d *Data) { d.Value[0] = math.Inf(1) }), nil, ErrBadReading, 0, []string{"point 0", "drawdown = +Inf"}},
		{"bad weight", th, with(func(d *Data) { d.Weight = make([]float64, 10); d.Weight[5] = -1 }), nil, ErrBadReading, 5, []string{"point 5", "weight = -1"}},
		{"Q zero", Theis{Q: 0, R: scR}, good, nil, ErrBadConstant, -1, []string{"Q = 0"}},
		{"Q NaN", Theis{Q: math.NaN(), R: scR}, good, nil, ErrBadConstant, -1, []string{"Q = NaN"}},
		{"Q Inf", Theis{Q: math.Inf(1), R: scR}, good, nil, ErrBadConstant, -1, []string{"Q = +Inf"}},
		{"r zero", Theis{Q: scQ, R: 0}, good, nil, ErrBadConstant, -1, []string{"r = 0"}},
		{"r negative", Theis{Q: scQ, R: -3}, good, nil, ErrBadConstant, -1, []string{"r = -3"}},
		{"two points", th, Data{Time: good.Time[:2], Value: good.Value[:2]}, nil, ErrTooFewPoints, -1, []string{"3 usable points needed, 2 given"}},
		{"window leaves two", th, good, &FitSettings{From: good.Time[8]}, ErrTooFewPoints, -1, []string{"2 given", "8 outside"}},
		{"lengths", th, Data{Time: good.Time, Value: good.Value[:9]}, nil, ErrLength, -1, []string{"9 values for 10 times"}},
		{"mask length", th, Data{Time: good.Time, Value: good.Value, Exclude: make([]bool, 3)}, nil, ErrLength, -1, []string{"3 exclusion marks"}},
		{"start length", th, good, &FitSettings{Start: []float64{1}}, ErrBadStart, -1, []string{"1 starting values for 2"}},
		{"start negative", th, good, &FitSettings{Start: []float64{1e-3, -1}}, ErrBadStart, -1, []string{"S = -1", "positive"}},
		{"start NaN", th, good, &FitSettings{Start: []float64{math.NaN(), 1e-4}}, ErrBadStart, -1, []string{"T = NaN"}},
		{"window reversed", th, good, &FitSettings{From: 100, To: 10}, ErrBadReading, -1, []string{"window"}},
		{"no trend", th, with(func(d *Data) {
			for i := range d.Value {
				d.Value[i] = -d.Value[i]
			}
		}), nil, ErrNoTrend, -1, []string{"Q = 0.012"}},
		{"pump time", TheisRecovery{Q: scQ, R: scR, PumpTime: 0}, good, nil, ErrBadConstant, -1, []string{"pumping time = 0"}},
		{"recovery time", TheisRecovery{Q: scQ, R: scR, PumpTime: 100}, with(func(d *Data) { d.Time[9] = 0 }), nil, ErrBadReading, 9, []string{"point 9", "t′ > 0"}},
		{"UMax", CooperJacob{Q: scQ, R: scR, UMax: 2}, good, nil, ErrBadConstant, -1, []string{"UMax = 2"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Fit(tc.m, tc.d, tc.s)
			if err == nil {
				t.Fatalf("no error; result %v", r.Params)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error %q does not wrap %v", err, tc.sentinel)
			}
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %q is not an *Error", err)
			}
			if e.Index != tc.index {
				t.Errorf("error %q: index %d, want %d", err, e.Index, tc.index)
			}
			for _, c := range tc.contains {
				if !strings.Contains(err.Error(), c) {
					t.Errorf("error %q does not contain %q", err, c)
				}
			}
		})
	}
}

func TestCooperJacobLine(t *testing.T) {
	// Noise-free Theis drawdown late enough that u ≤ 1e-3: the line gives
	// T and S within the truncation error of W ≈ −γ − ln u (0.016 % of W
	// at u = 0.001, reference §4) — a little more for S, which also
	// absorbs 2.25 ≈ 4e^(−γ) = 2.2458.
	ts := logTimes(20, 3e4, 3e6) // u from 5e-3 down to 5e-5
	s := make([]float64, len(ts))
	Theis{Q: scQ, R: scR}.Eval(s, ts, []float64{scT, scS})
	d := Data{Time: ts, Value: s}
	c, err := CooperJacobLine(scQ, scR, d, &LineSettings{From: 2e5})
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(c.T, scT) > 2e-3 || relDiff(c.S, scS) > 1e-2 {
		t.Errorf("T = %v, S = %v; want %v, %v", c.T, c.S, scT, scS)
	}
	if c.Early != 0 || len(c.Caveats) != 0 {
		t.Errorf("early %d, caveats %q", c.Early, c.Caveats)
	}
	// Δs = 2.303 Q/(4πT) exactly for a line; t0 from the intercept.
	if want := math.Ln10 * scQ / (4 * math.Pi * c.T); relDiff(c.DeltaS, want) > 1e-14 {
		t.Errorf("Δs = %v, want %v", c.DeltaS, want)
	}
	if want := 2.25 * c.T * c.T0 / (scR * scR); relDiff(c.S, want) > 1e-14 {
		t.Errorf("S = %v, want 2.25·T·t0/r² = %v", c.S, want)
	}
	if want := scR * scR * c.S / (4 * c.T * 0.01); relDiff(c.TimeValid, want) > 1e-14 {
		t.Errorf("TimeValid = %v, want %v", c.TimeValid, want)
	}
	for i, u := range c.U {
		if want := scR * scR * c.S / (4 * c.T * ts[i]); relDiff(u, want) > 1e-14 {
			t.Errorf("u[%d] = %v, want %v", i, u, want)
		}
	}
	if len(c.Used)+c.Outside != len(ts) {
		t.Errorf("used %d, outside %d", len(c.Used), c.Outside)
	}

	// With the whole early record the early readings are flagged.
	d = synth(30)
	c, err = CooperJacobLine(scQ, scR, d, &LineSettings{UMax: 0.05})
	if err != nil {
		t.Fatal(err)
	}
	if c.Early == 0 || len(c.Caveats) == 0 || !strings.Contains(c.Caveats[0], "u ≥ 0.05") {
		t.Errorf("early %d, caveats %q", c.Early, c.Caveats)
	}
	// The line's T and S are farther off with early readings: that is
	// what the caveat is for.
	if relDiff(c.T, scT) < 1e-3 {
		t.Errorf("T = %v is unexpectedly close to %v", c.T, scT)
	}
}

// TestCooperJacobErrors checks that the standard errors of the line,
// propagated to T and S by hand, agree with those of the same model fitted
// by Levenberg–Marquardt (a reparametrisation of the same straight line,
// so the optimum and the first-order covariance must coincide).
func TestCooperJacobErrors(t *testing.T) {
	d := synth(40)
	for i := range d.Value {
		d.Value[i] *= 1 + 0.01*math.Sin(float64(7*i))
	}
	ls := &LineSettings{From: 2e4, UMax: 0.1}
	c, err := CooperJacobLine(scQ, scR, d, ls)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Fit(CooperJacob{Q: scQ, R: scR}, d, &FitSettings{From: 2e4})
	if err != nil {
		t.Fatal(err)
	}
	checks := []struct {
		what      string
		line, fit float64
	}{
		{"T", c.T, r.Params[0]}, {"S", c.S, r.Params[1]},
		{"σT", c.TErr, r.Fit.StdErr[0]}, {"σS", c.SErr, r.Fit.StdErr[1]},
		{"T upper", c.TUpper, r.Fit.Upper[0]}, {"S upper", c.SUpper, r.Fit.Upper[1]},
	}
	for _, ck := range checks {
		if relDiff(ck.line, ck.fit) > 1e-6 {
			t.Errorf("%s: line %.10g, LM fit %.10g", ck.what, ck.line, ck.fit)
		}
	}
	// The line's band at a data time contains the line value and is as
	// wide as the delta-method band of the LM fit.
	tb := []float64{5e4, 1.7e5}
	_, lo, hi := c.Band(tb)
	_, lo2, hi2 := r.Band(tb)
	for i := range tb {
		if relDiff(hi[i]-lo[i], hi2[i]-lo2[i]) > 1e-6 {
			t.Errorf("band width at t = %v: line %v, LM %v", tb[i], hi[i]-lo[i], hi2[i]-lo2[i])
		}
	}
}

func TestCooperJacobLineErrors(t *testing.T) {
	d := synth(10)
	tests := []struct {
		name     string
		q, r     float64
		d        Data
		s        *LineSettings
		sentinel error
	}{
		{"Q zero", 0, scR, d, nil, ErrBadConstant},
		{"r NaN", scQ, math.NaN(), d, nil, ErrBadConstant},
		{"UMax", scQ, scR, d, &LineSettings{UMax: -1}, ErrBadConstant},
		{"confidence", scQ, scR, d, &LineSettings{Confidence: 1.5}, ErrBadConstant},
		{"two points", scQ, scR, Data{Time: d.Time[:2], Value: d.Value[:2]}, nil, ErrTooFewPoints},
		{"one time", scQ, scR, Data{Time: []float64{5, 5, 5}, Value: []float64{1, 2, 3}}, nil, ErrNoTrend},
		{"falling", scQ, scR, Data{Time: []float64{1, 10, 100}, Value: []float64{3, 2, 1}}, nil, ErrNoTrend},
		{"bad time", scQ, scR, Data{Time: []float64{1, 0, 100}, Value: []float64{3, 2, 1}}, nil, ErrBadReading},
	}
	for _, tc := range tests {
		if _, err := CooperJacobLine(tc.q, tc.r, tc.d, tc.s); !errors.Is(err, tc.sentinel) {
			t.Errorf("%s: error %v, want %v", tc.name, err, tc.sentinel)
		}
	}
}

func TestRecoveryLine(t *testing.T) {
	// Noise-free residual drawdown of the scenario after 2 days of
	// pumping; late recovery (t′ ≥ 1 h) lies on the line with S′ = S.
	tp := 172800.0
	m := TheisRecovery{Q: scQ, R: scR, PumpTime: tp}
	tr := logTimes(30, 60, 5e5)
	s := make([]float64, len(tr))
	m.Eval(s, tr, []float64{scT, scS})
	c, err := RecoveryLine(scQ, tp, Data{Time: tr, Value: s}, &LineSettings{From: 3600})
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(c.T, scT) > 5e-3 || math.Abs(c.Ratio-1) > 0.02 {
		t.Errorf("T = %v, S′/S = %v; want %v, 1", c.T, c.Ratio, scT)
	}
	// The Theis recovery fit recovers T and S exactly.
	r, err := Fit(m, Data{Time: tr, Value: s}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(r.Params[0], scT) > 1e-7 || relDiff(r.Params[1], scS) > 1e-6 {
		t.Errorf("Theis recovery fit: %v, want %v, %v (start %v)", r.Params, scT, scS, r.Start)
	}
	// A straight line of our own making: s′ = 0.3·log10(t/t′) + 0.03, so
	// T = 2.303·Q/(4π·0.3) and S′/S = 10^(0.1).
	x := []float64{1, 10, 100, 1000}
	y := make([]float64, len(x))
	for i, ti := range x {
		y[i] = 0.3*math.Log10((tp+ti)/ti) + 0.03
	}
	c, err = RecoveryLine(scQ, tp, Data{Time: x, Value: y}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(c.T, math.Ln10*scQ/(4*math.Pi*0.3)) > 1e-12 || relDiff(c.Ratio, math.Pow(10, 0.1)) > 1e-12 {
		t.Errorf("T = %v, ratio = %v", c.T, c.Ratio)
	}
	if _, err := RecoveryLine(scQ, 0, Data{Time: x, Value: y}, nil); !errors.Is(err, ErrBadConstant) {
		t.Errorf("zero pumping time: %v", err)
	}
}

// TestTheisStartRegimes checks that the default starting guess leads the
// fit to the truth on noise-free data of our own making in different
// parts of the Theis curve: early only (u > 0.5), late only (u < 0.01, the
// straight-line part), a pumping well (r = 0.15 m) and a distant
// observation well with a short record.
func TestTheisStartRegimes(t *testing.T) {
	tests := []struct {
		name       string
		q, r, T, S float64
		t0, t1     float64
	}{
		{"scenario", scQ, scR, scT, scS, 60, 172800},
		{"early only", scQ, scR, scT, scS, 5, 40},
		{"late only", scQ, scR, scT, scS, 3000, 172800},
		{"pumping well", 0.02, 0.15, 1e-3, 1e-4, 10, 86400},
		{"far, short", 0.005, 400, 5e-2, 1e-3, 600, 7200},
		{"tight aquifer", 1e-4, 10, 1e-6, 1e-5, 60, 1e6},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := Theis{Q: tc.q, R: tc.r}
			ts := logTimes(25, tc.t0, tc.t1)
			s := make([]float64, len(ts))
			m.Eval(s, ts, []float64{tc.T, tc.S})
			r, err := Fit(m, Data{Time: ts, Value: s}, nil)
			if err != nil {
				t.Fatal(err)
			}
			if relDiff(r.Params[0], tc.T) > 1e-6 || relDiff(r.Params[1], tc.S) > 1e-6 {
				t.Errorf("T, S = %v from start %v; want %v, %v (status %v)", r.Params, r.Start, tc.T, tc.S, r.Fit.Status)
			}
		})
	}
}
