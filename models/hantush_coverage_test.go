package models

import (
	"math/rand/v2"
	"testing"
)

// TestHantushCoverage repeats the coverage test of TestCoverage for the
// Hantush–Jacob model: in 200 seeded synthetic datasets of our own leaky
// scenario (Q = 8 L/s, r = 25 m, T = 3e-3 m²/s, S = 4e-4, B = 400 m, 30
// log-spaced readings from 1 min to 2 days, 1 % multiplicative Gaussian
// noise, weights 1/s²) the 95 % confidence intervals of T, S and B, and
// the 95 % band of the curve at three times, must cover the truth in
// 88–99 % of the datasets (binomial 95 % range for 200 trials at p = 0.95
// about 92–98 %; the margin allows for the first-order approximation).
// Every fit starts from the model's own starting guess.
func TestHantushCoverage(t *testing.T) {
	const trials = 200
	m := Hantush{Q: lkQ, R: lkR}
	truthP := []float64{lkT, lkS, lkB}
	ts := logTimes(30, 60, 172800)
	truth := make([]float64, len(ts))
	m.Eval(truth, ts, truthP)
	bandT := []float64{300, 7200, 86400}
	bandTruth := make([]float64, len(bandT))
	m.Eval(bandTruth, bandT, truthP)

	rng := rand.New(rand.NewPCG(20240615, 3))
	covered := make([]int, 3)
	band := make([]int, len(bandT))
	fails := 0
	for k := 0; k < trials; k++ {
		obs := make([]float64, len(ts))
		w := make([]float64, len(ts))
		for i, s := range truth {
			obs[i] = s * (1 + 0.01*rng.NormFloat64())
			w[i] = 1 / (obs[i] * obs[i])
		}
		r, err := Fit(m, Data{Time: ts, Value: obs, Weight: w}, nil)
		if err != nil || !r.Fit.Status.Converged() {
			fails++
			continue
		}
		for j, e := range r.Estimates {
			if e.Lower <= truthP[j] && truthP[j] <= e.Upper {
				covered[j]++
			}
		}
		_, lo, hi := r.Band(bandT)
		for i := range bandT {
			if lo[i] <= bandTruth[i] && bandTruth[i] <= hi[i] {
				band[i]++
			}
		}
	}
	pct := func(n int) float64 { return 100 * float64(n) / trials }
	t.Logf("T covered %.1f %%, S %.1f %%, B %.1f %%; band at %v s: %.1f %%, %.1f %%, %.1f %%; failed fits %d",
		pct(covered[0]), pct(covered[1]), pct(covered[2]), bandT, pct(band[0]), pct(band[1]), pct(band[2]), fails)
	if fails > 0 {
		t.Errorf("%d of %d fits failed or did not converge", fails, trials)
	}
	in := func(n int) bool { p := pct(n); return p >= 88 && p <= 99 }
	for j, name := range []string{"T", "S", "B"} {
		if !in(covered[j]) {
			t.Errorf("coverage of the 95 %% interval of %s: %.1f %%; want 88–99 %%", name, pct(covered[j]))
		}
	}
	for i := range bandT {
		if !in(band[i]) {
			t.Errorf("coverage of the 95 %% band at t = %v s: %.1f %%; want 88–99 %%", bandT[i], pct(band[i]))
		}
	}
}
