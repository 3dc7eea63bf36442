package models

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
)

// TestImageWellTheis checks the image-well drawdown against its
// definition s = s_Theis(r) ± s_Theis(rᵢ), and two limits that follow
// from it and are published in the classical theory of a well near a
// straight boundary (from memory): near a constant-head boundary the
// drawdown reaches the steady state s = Q/(2πT)·ln(rᵢ/r) (from
// W(u) − W(uρ²) → 2 ln ρ); near a no-flow boundary the late
// drawdown rises by 2·Q/(4πT)·ln 10 = 2.303·Q/(2πT) per log cycle, twice
// the Cooper–Jacob slope.
func TestImageWellTheis(t *testing.T) {
	p := []float64{scT, scS}
	ri := 400.0
	ts := logTimes(30, 60, 1e9)
	for _, kind := range []BoundaryKind{NoFlowBoundary, ConstantHeadBoundary} {
		m := ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: kind, Image: ri}
		got := make([]float64, len(ts))
		m.Eval(got, ts, p)
		a := make([]float64, len(ts))
		b := make([]float64, len(ts))
		Theis{Q: scQ, R: scR}.Eval(a, ts, p)
		Theis{Q: scQ, R: ri}.Eval(b, ts, p)
		for i := range ts {
			if want := a[i] + kind.sign()*b[i]; relDiff(got[i], want) > 1e-14 {
				t.Errorf("%v: s(%v) = %v, want %v", kind, ts[i], got[i], want)
			}
		}
		last := got[len(ts)-1]
		switch kind {
		case ConstantHeadBoundary:
			if want := scQ / (2 * math.Pi * scT) * math.Log(ri/scR); relDiff(last, want) > 1e-5 {
				t.Errorf("steady drawdown near a constant-head boundary %v, want Q/(2πT)·ln(rᵢ/r) = %v", last, want)
			}
		case NoFlowBoundary:
			s2 := make([]float64, 2)
			m.Eval(s2, []float64{1e9, 1e10}, p)
			if want := math.Ln10 * scQ / (2 * math.Pi * scT); relDiff(s2[1]-s2[0], want) > 1e-4 {
				t.Errorf("late slope near a no-flow boundary %v per log cycle, want 2.303·Q/(2πT) = %v", s2[1]-s2[0], want)
			}
		}
	}
}

// TestBoundaryDerivativeRatio checks the derivative ratio against the
// log-derivative of the image-well model by central differences, and its
// limits (2 for no-flow, 0 for constant head, 1 before the image is felt).
func TestBoundaryDerivativeRatio(t *testing.T) {
	p := []float64{scT, scS}
	ri := 300.0
	for _, kind := range []BoundaryKind{NoFlowBoundary, ConstantHeadBoundary} {
		m := ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: kind, Image: ri}
		for _, tt := range []float64{30, 600, 1e4, 1e5, 1e6, 1e8} {
			d := fd.Derivative(func(x float64) float64 {
				s := make([]float64, 1)
				m.Eval(s, []float64{math.Exp(x)}, p)
				return s[0]
			}, math.Log(tt), &fd.Settings{Formula: fd.Central, Step: 1e-4})
			u := scR * scR * scS / (4 * scT * tt)
			got := BoundaryDerivativeRatio(kind, u, ri/scR)
			if want := d / (scQ / (4 * math.Pi * scT)); math.Abs(got-want) > 1e-7 {
				t.Errorf("%v at t = %v: ratio %v, model derivative %v", kind, tt, got, want)
			}
		}
	}
	for _, c := range []struct {
		kind       BoundaryKind
		u, rho, to float64
	}{
		{NoFlowBoundary, 1e-12, 10, 2}, {ConstantHeadBoundary, 1e-12, 10, 0}, {NoFlowBoundary, 1e-7, 1e5, 1},
	} {
		if got := BoundaryDerivativeRatio(c.kind, c.u, c.rho); math.Abs(got-c.to) > 2e-6 {
			t.Errorf("%v: ratio(%v, %v) = %v, want → %v", c.kind, c.u, c.rho, got, c.to)
		}
	}
	for _, c := range [][3]float64{{1, -1, 5}, {1, 0.1, 0.5}, {0, 0.1, 5}, {1, math.NaN(), 5}} {
		if v := BoundaryDerivativeRatio(BoundaryKind(c[0]), c[1], c[2]); !math.IsNaN(v) {
			t.Errorf("BoundaryDerivativeRatio(%v, %v, %v) = %v, want NaN", c[0], c[1], c[2], v)
		}
	}
	// Hantush: rises to e^(−β) at u = β/2, then falls towards zero; equal
	// to t·ds/dt of the model over Q/(4πT).
	beta := 0.2
	if got := HantushDerivativeRatio(beta/2, beta); relDiff(got, math.Exp(-beta)) > 1e-15 {
		t.Errorf("HantushDerivativeRatio at u = β/2: %v, want e^(−β) = %v", got, math.Exp(-beta))
	}
	h := Hantush{Q: lkQ, R: lkR}
	hp := []float64{lkT, lkS, lkB}
	for _, tt := range []float64{60, 3600, 86400, 1e7} {
		d := fd.Derivative(func(x float64) float64 {
			s := make([]float64, 1)
			h.Eval(s, []float64{math.Exp(x)}, hp)
			return s[0]
		}, math.Log(tt), &fd.Settings{Formula: fd.Central, Step: 1e-4})
		u := lkR * lkR * lkS / (4 * lkT * tt)
		if got, want := HantushDerivativeRatio(u, lkR/lkB), d/(lkQ/(4*math.Pi*lkT)); math.Abs(got-want) > 1e-7 {
			t.Errorf("Hantush at t = %v: ratio %v, model derivative %v", tt, got, want)
		}
	}
	if !math.IsNaN(HantushDerivativeRatio(-1, 1)) || HantushDerivativeRatio(0, 1) != 0 || HantushDerivativeRatio(0, 0) != 1 {
		t.Error("HantushDerivativeRatio special cases")
	}
}

// TestImageWellRoundTrip fits the fitted-distance image model, Theis and
// Hantush based, to readings of our own scenario (a boundary at 150 m from
// the pumped well, the observation well 30 m from it on the line to the
// boundary: rᵢ = 270 m): noise-free readings give the truth back, and the
// 95 % intervals of noisy readings (seeded, 1 %, weights 1/s²) hold it.
func TestImageWellRoundTrip(t *testing.T) {
	ri := 270.0
	cases := []struct {
		name  string
		m     ImageWell
		truth []float64
	}{
		{"Theis no-flow", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary}, []float64{scT, scS, ri}},
		{"Theis constant head", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: ConstantHeadBoundary}, []float64{scT, scS, ri}},
		{"Hantush no-flow", ImageWell{Base: Hantush{Q: lkQ, R: scR}, Kind: NoFlowBoundary}, []float64{lkT, lkS, 1500, ri}},
		{"Theis given distance", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary, Image: ri}, []float64{scT, scS}},
	}
	rng := rand.New(rand.NewPCG(20240617, 5))
	ts := logTimes(40, 30, 3*86400)
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := make([]float64, len(ts))
			c.m.Eval(s, ts, c.truth)
			r, err := Fit(c.m, Data{Time: ts, Value: s}, nil)
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
			r, err = Fit(c.m, Data{Time: ts, Value: obs, Weight: w}, nil)
			if err != nil {
				t.Fatal(err)
			}
			for j, e := range r.Estimates {
				if !(e.Lower <= c.truth[j] && c.truth[j] <= e.Upper) {
					t.Errorf("noisy: %s = %.4g, 95 %% interval %.4g – %.4g misses %v", e.Name, e.Value, e.Lower, e.Upper, c.truth[j])
				}
			}
			if len(r.Caveats) != 0 {
				t.Errorf("caveats %q", r.Caveats)
			}
		})
	}
}

// TestImageWellErrors checks bad boundary inputs and the validity notes.
func TestImageWellErrors(t *testing.T) {
	d := synth(12)
	tests := []struct {
		name     string
		m        Model
		contains []string
	}{
		{"image at r", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary, Image: scR}, []string{"ri = 30", "greater than the distance to the pumped well (r = 30 m)"}},
		{"image nearer", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: ConstantHeadBoundary, Image: 10}, []string{"ri = 10"}},
		{"image negative", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary, Image: -100}, []string{"ri = -100"}},
		{"image NaN", ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary, Image: math.NaN()}, []string{"ri = NaN"}},
		{"no kind", ImageWell{Base: Theis{Q: scQ, R: scR}}, []string{"boundary kind = 0", "no-flow or constant-head"}},
		{"no base", ImageWell{Kind: NoFlowBoundary}, []string{"no model"}},
		{"bad base", ImageWell{Base: Hantush{Q: 0, R: scR}, Kind: NoFlowBoundary}, []string{"Q = 0"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Fit(tc.m, d, nil)
			if !errors.Is(err, ErrBadConstant) {
				t.Fatalf("error %v, want %v", err, ErrBadConstant)
			}
			for _, c := range tc.contains {
				if !strings.Contains(err.Error(), c) {
					t.Errorf("error %q does not contain %q", err, c)
				}
			}
		})
	}
	// A fitted rᵢ that does not exceed r makes every reading invalid.
	m := ImageWell{Base: Theis{Q: scQ, R: scR}, Kind: NoFlowBoundary}
	ok := make([]bool, len(d.Time))
	notes := m.Validity(ok, d.Time, []float64{scT, scS, 20})
	if len(notes) == 0 || !strings.Contains(notes[len(notes)-1], "does not exceed") {
		t.Errorf("rᵢ = 20 m < r: notes %q", notes)
	}
	for i := range ok {
		if ok[i] {
			t.Errorf("reading %d valid with rᵢ < r", i)
		}
	}
	// A far image well is not seen in the data.
	notes = m.Validity(ok, d.Time, []float64{scT, scS, 1e5})
	if len(notes) == 0 || !strings.Contains(notes[len(notes)-1], "poorly determined") {
		t.Errorf("rᵢ = 100 km: notes %q", notes)
	}
	if s := BoundaryKind(7).String(); s != "BoundaryKind(7)" {
		t.Errorf("String of an unknown kind: %q", s)
	}
}
