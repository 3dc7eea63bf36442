package models

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// TestVariableRateTwoSteps checks that a two-step schedule gives the sum
// of two shifted Theis solutions, s = s₁(t; Q₁) + s₁(t − t₁; Q₂ − Q₁), the
// principle of superposition (Theis 1935), and that the Jacobian is the
// same sum.
func TestVariableRateTwoSteps(t *testing.T) {
	q1, q2, t1 := 0.010, 0.016, 7200.0
	p := []float64{scT, scS}
	m := VariableRate{Base: Theis{Q: q1, R: scR}, Steps: []RateStep{{0, q1}, {t1, q2}}}
	ts := append(logTimes(30, 10, 2e5), t1, 0)
	got := make([]float64, len(ts))
	m.Eval(got, ts, p)
	for i, ti := range ts {
		a := []float64{0}
		b := []float64{0}
		Theis{Q: q1, R: scR}.Eval(a, []float64{ti}, p)
		if ti > t1 {
			Theis{Q: q2 - q1, R: scR}.Eval(b, []float64{ti - t1}, p)
		}
		if want := a[0] + b[0]; relDiff(got[i], want) > 1e-14 && math.Abs(got[i]-want) > 1e-300 {
			t.Errorf("s(%v) = %.15g, want Theis sum %.15g", ti, got[i], want)
		}
	}
	// The base rate only sets the scale.
	m2 := VariableRate{Base: Theis{Q: 1, R: scR}, Steps: m.Steps}
	got2 := make([]float64, len(ts))
	m2.Eval(got2, ts, p)
	for i := range got {
		if relDiff(got2[i], got[i]) > 1e-14 && got[i] != 0 {
			t.Errorf("base rate 1: s(%v) = %v, want %v", ts[i], got2[i], got[i])
		}
	}
}

// TestVariableRateRecovery checks residual drawdown by superposition
// (VariableRate with PumpAndStop) against the Theis recovery check values
// of reference §5 [lib] (Q = 500, T = 250, S = 1e-4, r = 30, pumping time
// 1, consistent units) and against the mpmath values of
// testdata/models/recovery_mpmath.tsv (source: mpmath, recovery_mpmath.py).
func TestVariableRateRecovery(t *testing.T) {
	ref := []struct{ tr, s float64 }{{0.01, 0.733104}, {0.1, 0.381507}, {1, 0.110311}}
	m := VariableRate{Base: Theis{Q: 500, R: 30}, Steps: PumpAndStop(500, 1)}
	for _, c := range ref {
		got := make([]float64, 1)
		m.Eval(got, []float64{1 + c.tr}, []float64{250, 1e-4})
		if math.Abs(got[0]-c.s) > 5e-7 {
			t.Errorf("t′ = %v: s′ = %.7f by superposition, want %v (reference §5)", c.tr, got[0], c.s)
		}
	}
	rows := readTSV(t, "../testdata/models/recovery_mpmath.tsv", 8, false)
	for _, v := range rows {
		q, T, S, r, tp, tr, want := v[0], v[1], v[2], v[3], v[4], v[5], v[6]
		got := make([]float64, 1)
		VariableRate{Base: Theis{Q: q, R: r}, Steps: PumpAndStop(q, tp)}.Eval(got, []float64{tp + tr}, []float64{T, S})
		// The difference of two drawdowns loses digits in late recovery,
		// about W/ΔW units in the last place.
		if relDiff(got[0], want) > 1e-10 {
			t.Errorf("s′(t′ = %g) = %.15g by superposition, want %.15g (mpmath)", tr, got[0], want)
		}
	}
}

// TestVariableRateRoundTrip fits noisy readings (seeded, 1 % noise, weights
// 1/s²) of a schedule of our own — three rising steps and a stop — with the
// Hantush model superposed, and with Theis, and checks that the 95 %
// intervals hold the truth and that noise-free readings give it back.
func TestVariableRateRoundTrip(t *testing.T) {
	steps := []RateStep{{0, 0.004}, {3 * 3600, 0.007}, {6 * 3600, 0.010}, {9 * 3600, 0}}
	cases := []struct {
		name  string
		base  RateModel
		truth []float64
	}{
		{"Hantush", Hantush{Q: 0.004, R: lkR}, []float64{lkT, lkS, lkB}},
		{"Theis", Theis{Q: 0.004, R: scR}, []float64{scT, scS}},
	}
	rng := rand.New(rand.NewPCG(20240616, 4))
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := VariableRate{Base: c.base, Steps: steps}
			var ts []float64
			for k := range steps {
				t0 := steps[k].Start
				ts = append(ts, logTimes(12, t0+60, t0+3*3600-60)...)
			}
			s := make([]float64, len(ts))
			m.Eval(s, ts, c.truth)
			r, err := Fit(m, Data{Time: ts, Value: s}, nil)
			if err != nil {
				t.Fatal(err)
			}
			for j := range c.truth {
				if relDiff(r.Params[j], c.truth[j]) > 1e-6 {
					t.Errorf("noise-free: %s = %v, want %v (start %v)", r.Estimates[j].Name, r.Params[j], c.truth[j], r.Start)
				}
			}
			obs := make([]float64, len(s))
			w := make([]float64, len(s))
			for i := range s {
				obs[i] = s[i] * (1 + 0.01*rng.NormFloat64())
				w[i] = 1 / (obs[i] * obs[i])
			}
			r, err = Fit(m, Data{Time: ts, Value: obs, Weight: w}, nil)
			if err != nil {
				t.Fatal(err)
			}
			for j, e := range r.Estimates {
				if !(e.Lower <= c.truth[j] && c.truth[j] <= e.Upper) {
					t.Errorf("noisy: %s = %.4g, 95 %% interval %.4g – %.4g misses %v", e.Name, e.Value, e.Lower, e.Upper, c.truth[j])
				}
			}
		})
	}
}

// TestDrawdownAndRecovery fits drawdown and recovery together after
// JoinRecovery, and recovery alone (the starting guess then comes from
// the superposition line), on readings of our scenario.
func TestDrawdownAndRecovery(t *testing.T) {
	tp := 86400.0
	p := []float64{scT, scS}
	pump := Data{Time: logTimes(20, 60, tp)}
	pump.Value = make([]float64, len(pump.Time))
	Theis{Q: scQ, R: scR}.Eval(pump.Value, pump.Time, p)
	rec := Data{Time: logTimes(20, 30, tp)}
	rec.Value = make([]float64, len(rec.Time))
	TheisRecovery{Q: scQ, R: scR, PumpTime: tp}.Eval(rec.Value, rec.Time, p)

	joined, err := JoinRecovery(pump, rec, tp)
	if err != nil {
		t.Fatal(err)
	}
	if len(joined.Time) != 40 || joined.Time[20] != tp+rec.Time[0] || joined.Value[39] != rec.Value[19] {
		t.Fatalf("joined series: %d readings, t[20] = %v", len(joined.Time), joined.Time[20])
	}
	m := VariableRate{Base: Theis{Q: scQ, R: scR}, Steps: PumpAndStop(scQ, tp)}
	for _, d := range []struct {
		name string
		d    Data
	}{{"both", joined}, {"recovery only", Data{Time: joined.Time[20:], Value: joined.Value[20:]}}} {
		r, err := Fit(m, d.d, nil)
		if err != nil {
			t.Fatalf("%s: %v", d.name, err)
		}
		if relDiff(r.Params[0], scT) > 1e-7 || relDiff(r.Params[1], scS) > 1e-6 {
			t.Errorf("%s: T, S = %v from start %v; want %v, %v", d.name, r.Params, r.Start, scT, scS)
		}
	}
	// Recovery alone with the Hantush model superposed: the start from
	// the superposition line still leads to the truth.
	hp := []float64{lkT, lkS, lkB}
	hm := VariableRate{Base: Hantush{Q: lkQ, R: lkR}, Steps: PumpAndStop(lkQ, tp)}
	hr := Data{Time: logTimes(25, tp+30, 3*tp)}
	hr.Value = make([]float64, len(hr.Time))
	hm.Eval(hr.Value, hr.Time, hp)
	r, err := Fit(hm, hr, nil)
	if err != nil {
		t.Fatal(err)
	}
	for j := range hp {
		if relDiff(r.Params[j], hp[j]) > 1e-5 {
			t.Errorf("Hantush recovery only: %s = %v from start %v, want %v", r.Estimates[j].Name, r.Params[j], r.Start, hp[j])
		}
	}
}

// TestVariableRateErrors checks that bad schedules and recovery series
// give errors that say which step or series is wrong.
func TestVariableRateErrors(t *testing.T) {
	d := synth(10)
	th := Theis{Q: scQ, R: scR}
	tests := []struct {
		name     string
		m        Model
		sentinel error
		contains []string
	}{
		{"out of order", VariableRate{Base: th, Steps: []RateStep{{0, 0.01}, {7200, 0.02}, {3600, 0}}}, ErrBadConstant,
			[]string{"step 3 start = 3600", "out of order", "after step 2"}},
		{"same start", VariableRate{Base: th, Steps: []RateStep{{0, 0.01}, {0, 0.02}}}, ErrBadConstant, []string{"step 2 start = 0"}},
		{"no steps", VariableRate{Base: th}, ErrBadConstant, []string{"no steps"}},
		{"NaN rate", VariableRate{Base: th, Steps: []RateStep{{0, 0.01}, {60, math.NaN()}}}, ErrBadConstant, []string{"step 2 rate = NaN"}},
		{"Inf start", VariableRate{Base: th, Steps: []RateStep{{math.Inf(-1), 0.01}}}, ErrBadConstant, []string{"step 1 start = -Inf"}},
		{"zero first rate", VariableRate{Base: th, Steps: []RateStep{{0, 0}, {60, 0.01}}}, ErrBadConstant, []string{"step 1 rate = 0"}},
		{"no base", VariableRate{Steps: PumpAndStop(scQ, 100)}, ErrBadConstant, []string{"no model"}},
		{"bad base", VariableRate{Base: Theis{Q: scQ, R: -1}, Steps: PumpAndStop(scQ, 100)}, ErrBadConstant, []string{"r = -1"}},
		{"reading before start", VariableRate{Base: th, Steps: []RateStep{{600, 0.01}}}, ErrBadReading, []string{"point 0", "t > 600 s"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Fit(tc.m, d, nil)
			if !errors.Is(err, tc.sentinel) {
				t.Fatalf("error %v, want %v", err, tc.sentinel)
			}
			for _, c := range tc.contains {
				if !strings.Contains(err.Error(), c) {
					t.Errorf("error %q does not contain %q", err, c)
				}
			}
		})
	}

	rec := Data{Time: []float64{10, 100, 1000}, Value: []float64{1, 0.5, 0.2}}
	joinTests := []struct {
		name      string
		pump, rec Data
		tp        float64
		sentinel  error
		index     int
		contains  []string
	}{
		{"empty recovery", d, Data{}, 86400, ErrTooFewPoints, -1, []string{"recovery series is empty"}},
		{"pumping time", d, rec, 0, ErrBadConstant, -1, []string{"pumping time = 0"}},
		{"recovery time", d, Data{Time: []float64{10, 0}, Value: []float64{1, 1}}, 2e5, ErrBadReading, 1, []string{"point 1", "recovery time = 0", "t′ > 0"}},
		{"drawdown after stop", d, rec, 3600, ErrBadReading, 5, []string{"point 5", "stop at 3600 s"}},
		{"lengths", d, Data{Time: []float64{1, 2}, Value: []float64{1}}, 2e5, ErrLength, -1, []string{"recovery series: 1 values for 2 times"}},
	}
	for _, tc := range joinTests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := JoinRecovery(tc.pump, tc.rec, tc.tp)
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
}

// TestVariableRateValidity checks that the validity of Cooper–Jacob
// superposed follows each term: readings soon after a change of rate have
// u ≥ 0.01 for that term.
func TestVariableRateValidity(t *testing.T) {
	m := VariableRate{Base: CooperJacob{Q: scQ, R: scR}, Steps: PumpAndStop(scQ, 86400)}
	ts := []float64{60, 3600, 86400 + 60, 86400 + 3600}
	ok := make([]bool, len(ts))
	notes := m.Validity(ok, ts, []float64{scT, scS})
	want := []bool{false, true, false, true} // b = r²S/(4T) = 11.25 s; u < 0.01 from 1125 s
	for i := range ts {
		if ok[i] != want[i] {
			t.Errorf("valid(%v) = %v, want %v", ts[i], ok[i], want[i])
		}
	}
	if len(notes) != 2 || !strings.Contains(notes[1], "change of rate at t = 8.64e+04 s") {
		t.Errorf("notes %q", notes)
	}
}

// TestRecoveryAgarwal checks the superposed recovery against Agarwal's
// (1980) equivalent time (formula from memory, reference §5): the
// recovered drawdown s(tp) − s′(t′) equals the drawdown of the same
// constant-rate test at t_e = tp·t′/(tp + t′) up to the truncation error
// of the logarithmic approximation, small when u at t_e is small.
func TestRecoveryAgarwal(t *testing.T) {
	tp := 2 * 86400.0
	p := []float64{scT, scS}
	m := VariableRate{Base: Theis{Q: scQ, R: scR}, Steps: PumpAndStop(scQ, tp)}
	sp := []float64{0}
	Theis{Q: scQ, R: scR}.Eval(sp, []float64{tp}, p)
	for _, tr := range []float64{3600, 7200, 86400, 4 * 86400} {
		rec := []float64{0}
		m.Eval(rec, []float64{tp + tr}, p)
		te := AgarwalTime(tp, tr)
		se := []float64{0}
		Theis{Q: scQ, R: scR}.Eval(se, []float64{te}, p)
		u := scR * scR * scS / (4 * scT * te) // ≤ 3.2e-3
		if math.Abs((sp[0]-rec[0])-se[0]) > 2*u*scQ/(4*math.Pi*scT) {
			t.Errorf("t′ = %v: s(tp) − s′ = %v, s(t_e = %v) = %v", tr, sp[0]-rec[0], te, se[0])
		}
	}
}
