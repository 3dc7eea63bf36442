package models

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestNewJacobians compares the analytic Jacobians of the new models with
// central differences (gonum diff/fd) over a wide span of time, in the
// scaled parameters of TestJacobians.
func TestNewJacobians(t *testing.T) {
	ts := logTimes(40, 1, 1e7)
	steps := []RateStep{{0, 0.01}, {5000, 0.015}, {2e4, 0}, {1e5, 0.008}}
	tests := []struct {
		m Model
		p []float64
	}{
		{Hantush{Q: lkQ, R: lkR}, []float64{lkT, lkS, lkB}},
		{Hantush{Q: lkQ, R: 200}, []float64{lkT, lkS, 60}}, // β > 3
		{Hantush{Q: lkQ, R: 200}, []float64{lkT, lkS, 15}}, // β > 10: quadrature
		{Hantush{Q: -0.002, R: 0.15}, []float64{1e-4, 1e-3, 50}},
		{ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary}, []float64{scT, scS, 300}},
		{ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: ConstantHeadBoundary}, []float64{scT, scS, 300}},
		{ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary, Image: 250}, []float64{scT, scS}},
		{ImageWell{Base: Hantush{Q: lkQ, R: lkR}, Kind: ConstantHeadBoundary}, []float64{lkT, lkS, lkB, 500}},
		{VariableRate{Base: Theis{Q: 0.01, R: scR}, Steps: steps}, []float64{scT, scS}},
		{VariableRate{Base: Hantush{Q: 0.01, R: lkR}, Steps: steps}, []float64{lkT, lkS, lkB}},
		{VariableRate{Base: ImageWell{Base: Theis{Q: 0.01, R: scR}, Kind: NoFlowBoundary}, Steps: steps}, []float64{scT, scS, 400}},
	}
	for _, tc := range tests {
		checkJacobian(t, scaled{tc.m, tc.p}, ts, ones(len(tc.p)), 2e-6)
	}
	// Weak leakage (β = 1e-3): ∂s/∂B is so small that the step of
	// checkJacobian drowns in rounding; a larger step (central
	// difference error ~h²) resolves it.
	hm := Hantush{Q: lkQ, R: 10}
	hp := []float64{lkT, lkS, 1e4}
	jac := mat.NewDense(len(ts), 3, nil)
	hm.Jacobian(jac, ts, hp)
	sp, sm := make([]float64, len(ts)), make([]float64, len(ts))
	h := 1e-3 * hp[2]
	hm.Eval(sp, ts, []float64{hp[0], hp[1], hp[2] + h})
	hm.Eval(sm, ts, []float64{hp[0], hp[1], hp[2] - h})
	for i := range ts {
		want := (sp[i] - sm[i]) / (2 * h)
		if math.Abs(jac.At(i, 2)-want) > 1e-5*math.Abs(want)+1e-22 {
			t.Errorf("weak leakage: ∂s/∂B at t = %g: %v, central difference %v", ts[i], jac.At(i, 2), want)
		}
	}

	// The distance derivatives of the radial models.
	for _, tc := range []struct {
		m Radial
		p []float64
	}{
		{Theis{Q: scQ, R: scR}, []float64{scT, scS}},
		{Hantush{Q: lkQ, R: lkR}, []float64{lkT, lkS, lkB}},
		{Hantush{Q: lkQ, R: 300}, []float64{lkT, lkS, 25}},
	} {
		got := make([]float64, len(ts))
		tc.m.DistanceDerivative(got, ts, tc.p)
		r := tc.m.Distance()
		h := 1e-5 * r
		tc.m.AtDistance(r+h).Eval(sp, ts, tc.p)
		tc.m.AtDistance(r-h).Eval(sm, ts, tc.p)
		scale := 0.0
		for i := range ts {
			scale = math.Max(scale, math.Abs(sp[i]-sm[i])/(2*h))
		}
		for i := range ts {
			want := (sp[i] - sm[i]) / (2 * h)
			if math.Abs(got[i]-want) > 2e-6*math.Max(math.Abs(want), 1e-3*scale) {
				t.Errorf("%s: ∂s/∂r at t = %g: %v, central difference %v", tc.m.Name(), ts[i], got[i], want)
			}
		}
	}
}

func ones(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = 1
	}
	return v
}

// threeWells returns noisy Theis drawdowns (seeded, 1 % multiplicative
// noise) of our scenario at three invented observation wells.
func threeWells(seed uint64) []Well {
	rng := rand.New(rand.NewPCG(seed, 6))
	var wells []Well
	for k, r := range []float64{15, 45, 120} {
		m := Theis{Q: scQ, R: r}
		ts := logTimes(20+5*k, 60, 172800)
		s := make([]float64, len(ts))
		m.Eval(s, ts, []float64{scT, scS})
		w := make([]float64, len(ts))
		for i := range s {
			s[i] *= 1 + 0.01*rng.NormFloat64()
			w[i] = 1 / (s[i] * s[i])
		}
		wells = append(wells, Well{Name: []string{"near", "middle", "far"}[k], Model: m, Data: Data{Time: ts, Value: s, Weight: w}})
	}
	return wells
}

// TestFitWells checks the joint fit on noise-free and noisy readings of
// three wells: the truth comes back, each interval holds it, the per-well
// residuals and RMSE are those of the well's own model, the well weights
// act, and a joint fit has narrower intervals than a fit to one well.
func TestFitWells(t *testing.T) {
	exact := threeWells(1)
	for k := range exact {
		m := exact[k].Model
		m.Eval(exact[k].Data.Value, exact[k].Data.Time, []float64{scT, scS})
		exact[k].Data.Weight = nil
	}
	r, err := FitWells(exact, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(r.Params[0], scT) > 1e-8 || relDiff(r.Params[1], scS) > 1e-8 {
		t.Errorf("noise-free: %v, want %v, %v", r.Params, scT, scS)
	}

	wells := threeWells(2)
	r, err = FitWells(wells, nil)
	if err != nil {
		t.Fatal(err)
	}
	for j, want := range []float64{scT, scS} {
		e := r.Estimates[j]
		if !(e.Lower <= want && want <= e.Upper) {
			t.Errorf("%s = %.4g, 95 %% interval %.4g – %.4g misses %v", e.Name, e.Value, e.Lower, e.Upper, want)
		}
	}
	total := 0
	for k, w := range r.Wells {
		if w.Name != wells[k].Name || len(w.Used) != len(wells[k].Data.Time) || len(w.Residuals) != len(w.Used) {
			t.Errorf("well %d: %+v", k, w)
		}
		pred := make([]float64, len(w.Used))
		wells[k].Model.Eval(pred, wells[k].Data.Time, r.Params)
		ss := 0.0
		for i := range pred {
			res := pred[i] - wells[k].Data.Value[i]
			if math.Abs(res-w.Residuals[i]) > 1e-15 {
				t.Errorf("well %s residual %d = %v, want %v", w.Name, i, w.Residuals[i], res)
			}
			ss += res * res
		}
		if want := math.Sqrt(ss / float64(len(pred))); relDiff(w.RMSE, want) > 1e-12 {
			t.Errorf("well %s RMSE %v, want %v", w.Name, w.RMSE, want)
		}
		total += len(w.Used)
		// The well's view gives its own curve and band.
		c, lo, hi := r.Well(k).Band([]float64{3600})
		if !(lo[0] < c[0] && c[0] < hi[0]) {
			t.Errorf("well %s band at 1 h: %v – %v around %v", w.Name, lo[0], hi[0], c[0])
		}
	}
	if r.Fit.N != total {
		t.Errorf("fit of %d readings, want %d", r.Fit.N, total)
	}
	if r.Well(3) != nil || r.Well(-1) != nil {
		t.Error("Well out of range is not nil")
	}
	one, err := Fit(wells[1].Model, wells[1].Data, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !(r.Fit.StdErr[1] < one.Fit.StdErr[1]) {
		t.Errorf("σS joint %v, one well %v", r.Fit.StdErr[1], one.Fit.StdErr[1])
	}
	// A well weight of 0 means 1; a tiny weight removes the well's pull.
	wells[0].Weight = 0
	r0, err := FitWells(wells, nil)
	if err != nil || relDiff(r0.Params[0], r.Params[0]) > 1e-12 {
		t.Errorf("weight 0: %v, %v; want %v", err, r0.Params, r.Params)
	}
	wells[0].Weight, wells[2].Weight = 1e-12, 1e-12
	rw, err := FitWells(wells, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(rw.Params[0], one.Params[0]) > 1e-6 || relDiff(rw.Params[1], one.Params[1]) > 1e-5 {
		t.Errorf("weights 1e-12 on two wells: %v, want the middle well's own fit %v", rw.Params, one.Params)
	}
}

// TestFitWellsErrors checks that bad input names the well.
func TestFitWellsErrors(t *testing.T) {
	good := threeWells(3)
	with := func(f func(w []Well)) []Well {
		w := append([]Well(nil), good...)
		for k := range w {
			w[k].Data.Value = append([]float64(nil), good[k].Data.Value...)
		}
		f(w)
		return w
	}
	tests := []struct {
		name     string
		wells    []Well
		sentinel error
		index    int
		contains []string
	}{
		{"none", nil, ErrTooFewPoints, -1, []string{"no wells"}},
		{"no model", with(func(w []Well) { w[1].Model = nil }), ErrBadConstant, -1, []string{`well "middle"`, "no model"}},
		{"mixed models", with(func(w []Well) { w[2].Model = Hantush{Q: scQ, R: 120} }), ErrBadConstant, -1, []string{`well "far"`, "T, S, B", "share"}},
		{"negative weight", with(func(w []Well) { w[0].Weight = -1 }), ErrBadConstant, -1, []string{`well "near"`, "well weight = -1"}},
		{"bad reading", with(func(w []Well) { w[1].Data.Value[4] = math.NaN() }), ErrBadReading, 4, []string{`well "middle"`, "point 4", "drawdown = NaN"}},
		{"bad constant", with(func(w []Well) { w[2].Model = Theis{Q: scQ, R: 0} }), ErrBadConstant, -1, []string{`well "far"`, "r = 0"}},
		{"empty well", with(func(w []Well) { w[0].Data = Data{} }), ErrTooFewPoints, -1, []string{`well "near"`, "1 usable points needed, 0 given"}},
		{"unnamed", with(func(w []Well) { w[1].Name = ""; w[1].Data.Value[0] = math.Inf(1) }), ErrBadReading, 0, []string{"well 2", "point 0"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := FitWells(tc.wells, nil)
			if !errors.Is(err, tc.sentinel) {
				t.Fatalf("error %v, want %v", err, tc.sentinel)
			}
			var e *Error
			if !errors.As(err, &e) || e.Index != tc.index {
				t.Errorf("error %q: index %d, want %d", err, e.Index, tc.index)
			}
			for _, c := range tc.contains {
				if !strings.Contains(err.Error(), c) {
					t.Errorf("error %q does not contain %q", err, c)
				}
			}
		})
	}
	if _, err := FitWells(good, &FitSettings{Start: []float64{1}}); !errors.Is(err, ErrBadStart) {
		t.Errorf("short start: %v", err)
	}
}

// TestDistanceDrawdown checks the Cooper–Jacob distance–drawdown line
// (Cooper & Jacob 1946): on a line of our own making it returns T and S
// exactly, and on noise-free Theis drawdowns with u ≤ 0.001 at every well
// it returns them within the truncation error of W ≈ −γ − ln u (0.016 %
// of W at u = 0.001, reference §4 [lib]), with S absorbing also 2.25 ≈
// 4e^(−γ).
func TestDistanceDrawdown(t *testing.T) {
	q, tt := 0.02, 7200.0
	r := []float64{10, 30, 100}
	// s = 0.4·log10(r0/r), r0 = 900 m: T = 2.303·Q/(2π·0.4), S = 2.25·T·t/r0².
	s := make([]float64, len(r))
	for i, ri := range r {
		s[i] = 0.4 * math.Log10(900/ri)
	}
	c, err := DistanceDrawdownLine(q, tt, r, s, nil)
	if err != nil {
		t.Fatal(err)
	}
	T := math.Ln10 * q / (2 * math.Pi * 0.4)
	if relDiff(c.T, T) > 1e-12 || relDiff(c.S, 2.25*T*tt/(900*900)) > 1e-10 || relDiff(c.R0, 900) > 1e-12 || relDiff(c.DeltaS, 0.4) > 1e-12 {
		t.Errorf("line: T %v, S %v, r0 %v, Δs %v", c.T, c.S, c.R0, c.DeltaS)
	}

	rs := []float64{5, 10, 20, 40}
	ss := make([]float64, len(rs))
	tt = 1e6 // u = 40²·2e-4/(4·4e-3·1e6) = 2e-5 at the far well
	for i, ri := range rs {
		v := []float64{0}
		Theis{Q: scQ, R: ri}.Eval(v, []float64{tt}, []float64{scT, scS})
		ss[i] = v[0]
	}
	c, err = DistanceDrawdownLine(scQ, tt, rs, ss, nil)
	if err != nil {
		t.Fatal(err)
	}
	if relDiff(c.T, scT) > 2e-4 || relDiff(c.S, scS) > 1e-2 {
		t.Errorf("Theis: T = %v, S = %v; want %v, %v", c.T, c.S, scT, scS)
	}
	if c.Far != 0 || len(c.Caveats) != 0 || !(c.TErr >= 0) || !(c.TLower <= c.T && c.T <= c.TUpper) {
		t.Errorf("far %d, caveats %q, T %v ± %v", c.Far, c.Caveats, c.T, c.TErr)
	}
	// At an early time the far wells have large u and are flagged.
	for i, ri := range rs {
		v := []float64{0}
		Theis{Q: scQ, R: ri}.Eval(v, []float64{600}, []float64{scT, scS})
		ss[i] = v[0]
	}
	c, err = DistanceDrawdownLine(scQ, 600, rs, ss, &LineSettings{UMax: 0.02})
	if err != nil {
		t.Fatal(err)
	}
	if c.Far == 0 || len(c.Caveats) == 0 || !strings.Contains(c.Caveats[0], "u ≥ 0.02") {
		t.Errorf("early: far %d, caveats %q", c.Far, c.Caveats)
	}
	// Two wells: exact, no uncertainty.
	c, err = DistanceDrawdownLine(q, 7200, r[:2], s[:2], nil)
	if err != nil || !math.IsNaN(c.TErr) || len(c.Caveats) == 0 {
		t.Errorf("two wells: %v, σT %v, caveats %q", err, c.TErr, c.Caveats)
	}

	bad := []struct {
		name     string
		q, t     float64
		r, s     []float64
		sentinel error
	}{
		{"one well", q, 7200, r[:1], s[:1], ErrTooFewPoints},
		{"lengths", q, 7200, r, s[:2], ErrLength},
		{"same r", q, 7200, []float64{10, 10}, []float64{1, 2}, ErrNoTrend},
		{"rising", q, 7200, r, []float64{0.1, 0.2, 0.3}, ErrNoTrend},
		{"r zero", q, 7200, []float64{0, 10}, []float64{1, 2}, ErrBadReading},
		{"time", q, 0, r, s, ErrBadConstant},
		{"Q", 0, 7200, r, s, ErrBadConstant},
	}
	for _, b := range bad {
		if _, err := DistanceDrawdownLine(b.q, b.t, b.r, b.s, nil); !errors.Is(err, b.sentinel) {
			t.Errorf("%s: %v, want %v", b.name, err, b.sentinel)
		}
	}
}

func TestDrawdownAt(t *testing.T) {
	d := Data{Time: []float64{100, 10, 1000}, Value: []float64{2, 1, 3}, Exclude: []bool{false, false, false}}
	for _, c := range []struct{ t, want float64 }{{10, 1}, {100, 2}, {1000, 3}, {math.Sqrt(1000), 1.5}, {math.Pow(10, 2.25), 2.25}} {
		if got, err := DrawdownAt(d, c.t); err != nil || math.Abs(got-c.want) > 1e-14 {
			t.Errorf("DrawdownAt(%v) = %v, %v; want %v", c.t, got, err, c.want)
		}
	}
	d.Exclude[0] = true // now 10 → 1000 s in one step
	if got, _ := DrawdownAt(d, 100); math.Abs(got-2) > 1e-14 {
		t.Errorf("with the middle reading excluded: %v, want 2 (log interpolation)", got)
	}
	for _, tt := range []float64{5, 2000, 0, math.NaN()} {
		if _, err := DrawdownAt(d, tt); err == nil {
			t.Errorf("DrawdownAt(%v): no error", tt)
		}
	}
	if _, err := DrawdownAt(Data{Time: []float64{1, -1}, Value: []float64{1, 1}}, 1); !errors.Is(err, ErrBadReading) {
		t.Errorf("bad time: %v", err)
	}
}

// TestJacobCorrection checks Jacob's correction s′ = s − s²/(2b) (Jacob
// 1944, from memory) at values worked by hand, the identity it rests on,
// (h₀² − h²)/(2b) = s′ with h₀ = b, h = b − s, its inverse, the warning
// above b/4 (common practice) and the errors.
func TestJacobCorrection(t *testing.T) {
	d := Data{Time: []float64{60, 600, 6000, 60000}, Value: []float64{0.5, 1, 2, 3}, Weight: []float64{1, 2, 3, 4}}
	got, notes, err := JacobCorrection(d, 10)
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{0.4875, 0.95, 1.8, 2.55} // by hand
	for i := range want {
		if math.Abs(got.Value[i]-want[i]) > 1e-15 {
			t.Errorf("s′(%v) = %v, want %v", d.Value[i], got.Value[i], want[i])
		}
		b, h := 10.0, 10-d.Value[i]
		if id := (b*b - h*h) / (2 * b); math.Abs(got.Value[i]-id) > 1e-14 {
			t.Errorf("s′(%v) = %v, (h0² − h²)/(2b) = %v", d.Value[i], got.Value[i], id)
		}
		if back := JacobUncorrected(got.Value[i], 10); math.Abs(back-d.Value[i]) > 1e-14 {
			t.Errorf("uncorrected %v, want %v", back, d.Value[i])
		}
	}
	if d.Value[0] != 0.5 || got.Weight[3] != 4 || &got.Weight[0] == &d.Weight[0] {
		t.Error("the input was modified or shared")
	}
	if len(notes) != 1 || !strings.Contains(notes[0], "1 drawdowns") || !strings.Contains(notes[0], "point 3") || !strings.Contains(notes[0], "common practice") {
		t.Errorf("notes %q", notes)
	}
	if _, notes, _ := JacobCorrection(d, 100); len(notes) != 0 {
		t.Errorf("b = 100: notes %q", notes)
	}
	// The corrected Theis fit of a thick aquifer barely changes.
	if !math.IsNaN(JacobUncorrected(6, 10)) || !math.IsNaN(JacobUncorrected(1, 0)) {
		t.Error("JacobUncorrected outside its domain is not NaN")
	}
	errs := []struct {
		name     string
		d        Data
		b        float64
		sentinel error
		contains string
	}{
		{"s = b", Data{Time: []float64{1, 2}, Value: []float64{1, 10}}, 10, ErrBadReading, "point 1, drawdown = 10"},
		{"s > b", Data{Time: []float64{1}, Value: []float64{12}}, 10, ErrBadReading, "point 0"},
		{"NaN", Data{Time: []float64{1}, Value: []float64{math.NaN()}}, 10, ErrBadReading, "drawdown = NaN"},
		{"b zero", d, 0, ErrBadConstant, "b = 0"},
		{"b NaN", d, math.NaN(), ErrBadConstant, "b = NaN"},
		{"lengths", Data{Time: []float64{1, 2}, Value: []float64{1}}, 10, ErrLength, "1 values for 2 times"},
	}
	for _, e := range errs {
		_, _, err := JacobCorrection(e.d, e.b)
		if !errors.Is(err, e.sentinel) || !strings.Contains(err.Error(), e.contains) {
			t.Errorf("%s: %v, want %v containing %q", e.name, err, e.sentinel, e.contains)
		}
	}
	// An excluded reading is copied as it is, even when not correctable.
	x := Data{Time: []float64{1, 2}, Value: []float64{1, 15}, Exclude: []bool{false, true}}
	got, _, err = JacobCorrection(x, 10)
	if err != nil || got.Value[1] != 15 || !got.Exclude[1] {
		t.Errorf("excluded reading: %v, %v", got, err)
	}
}
