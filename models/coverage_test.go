package models

import (
	"math/rand/v2"
	"testing"
)

// TestCoverage checks the covariance of the Theis fit, not only its
// optimum: in 200 seeded synthetic datasets of our own scenario (Q = 12
// L/s, r = 30 m, T = 4.0e-3 m²/s, S = 2e-4, 30 log-spaced readings from 1
// min to 2 days, 1 % multiplicative Gaussian noise) the 95 % confidence
// intervals of T and S, and the 95 % band of the curve at three times,
// must cover the truth in 88–99 % of the datasets (the binomial 95 % range
// for 200 trials at p = 0.95 is about 92–98 %; the margin allows for the
// first-order approximation).
//
// The noise is proportional to the drawdown, so the readings are weighted
// by 1/s²; the unweighted fit, whose covariance assumes equal errors, is
// reported too.
func TestCoverage(t *testing.T) {
	const trials = 200
	m := Theis{Q: scQ, R: scR}
	ts := logTimes(30, 60, 172800)
	truth := make([]float64, len(ts))
	m.Eval(truth, ts, []float64{scT, scS})
	bandT := []float64{300, 7200, 86400}
	bandTruth := make([]float64, len(bandT))
	m.Eval(bandTruth, bandT, []float64{scT, scS})

	rng := rand.New(rand.NewPCG(20240611, 1))
	type tally struct {
		T, S, fails int
		band        []int
	}
	weighted := tally{band: make([]int, len(bandT))}
	plain := tally{band: make([]int, len(bandT))}
	for k := 0; k < trials; k++ {
		obs := make([]float64, len(ts))
		w := make([]float64, len(ts))
		for i, s := range truth {
			obs[i] = s * (1 + 0.01*rng.NormFloat64())
			w[i] = 1 / (obs[i] * obs[i])
		}
		for _, c := range []struct {
			d  Data
			tl *tally
		}{
			{Data{Time: ts, Value: obs, Weight: w}, &weighted},
			{Data{Time: ts, Value: obs}, &plain},
		} {
			r, err := Fit(m, c.d, nil)
			if err != nil || !r.Fit.Status.Converged() {
				c.tl.fails++
				continue
			}
			T, _ := r.Estimate("T")
			S, _ := r.Estimate("S")
			if T.Lower <= scT && scT <= T.Upper {
				c.tl.T++
			}
			if S.Lower <= scS && scS <= S.Upper {
				c.tl.S++
			}
			_, lo, hi := r.Band(bandT)
			for i := range bandT {
				if lo[i] <= bandTruth[i] && bandTruth[i] <= hi[i] {
					c.tl.band[i]++
				}
			}
		}
	}
	pct := func(n int) float64 { return 100 * float64(n) / trials }
	t.Logf("weighted 1/s²: T covered %.1f %%, S %.1f %%, band at %v s: %.1f %%, %.1f %%, %.1f %%; failed fits %d",
		pct(weighted.T), pct(weighted.S), bandT, pct(weighted.band[0]), pct(weighted.band[1]), pct(weighted.band[2]), weighted.fails)
	t.Logf("unweighted:    T covered %.1f %%, S %.1f %%, band at %v s: %.1f %%, %.1f %%, %.1f %%; failed fits %d",
		pct(plain.T), pct(plain.S), bandT, pct(plain.band[0]), pct(plain.band[1]), pct(plain.band[2]), plain.fails)
	if weighted.fails > 0 {
		t.Errorf("%d of %d weighted fits failed or did not converge", weighted.fails, trials)
	}
	in := func(n int) bool { p := pct(n); return p >= 88 && p <= 99 }
	if !in(weighted.T) || !in(weighted.S) {
		t.Errorf("coverage of the 95 %% intervals: T %.1f %%, S %.1f %%; want 88–99 %%", pct(weighted.T), pct(weighted.S))
	}
	for i := range bandT {
		if !in(weighted.band[i]) {
			t.Errorf("coverage of the 95 %% band at t = %v s: %.1f %%; want 88–99 %%", bandT[i], pct(weighted.band[i]))
		}
	}
}
