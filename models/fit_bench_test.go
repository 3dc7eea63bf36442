package models

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// BenchmarkTheisFit fits the Theis model to n noisy readings of our own
// scenario (1 % multiplicative noise, 1 min – 2 days) from a Cooper–Jacob
// start computed once outside the loop.
func BenchmarkTheisFit(b *testing.B) {
	for _, n := range []int{1000, 10000, 100000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			d := synth(n)
			rng := rand.New(rand.NewPCG(7, uint64(n)))
			for i := range d.Value {
				d.Value[i] *= 1 + 0.01*rng.NormFloat64()
			}
			m := Theis{Q: scQ, R: scR}
			c, err := CooperJacobLine(scQ, scR, d, &LineSettings{From: 3600})
			if err != nil {
				b.Fatal(err)
			}
			s := &FitSettings{Start: []float64{c.T, c.S}}
			b.ReportAllocs()
			b.ResetTimer()
			iters := 0
			for i := 0; i < b.N; i++ {
				r, err := Fit(m, d, s)
				if err != nil {
					b.Fatal(err)
				}
				iters = r.Fit.Iterations
			}
			b.ReportMetric(float64(iters), "LM-iterations")
		})
	}
}

// BenchmarkTheisEval and BenchmarkTheisJacobian time one pass of the model
// over 10 000 readings, the work of one LM iteration.
func BenchmarkTheisEval(b *testing.B) {
	d := synth(10000)
	dst := make([]float64, len(d.Time))
	p := []float64{scT, scS}
	m := Theis{Q: scQ, R: scR}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		m.Eval(dst, d.Time, p)
	}
}
