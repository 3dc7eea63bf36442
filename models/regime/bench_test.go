package regime

import (
	"math/rand/v2"
	"testing"
)

// bench10k is 10 000 logger readings of the scenario near a no-flow
// boundary, 10 s to 10⁶ s, with 2 mm of noise.
func bench10k() (ts, s []float64) {
	rng := rand.New(rand.NewPCG(1, 1))
	ts = logTimes(10000, 10, 1e6)
	s = series(ts, func(t float64) float64 {
		return theis(scQ, scR, scT, scS, t) + theis(scQ, scRi, scT, scS, t) + 0.002*rng.NormFloat64()
	})
	return ts, s
}

// BenchmarkDiagnose: the derivative, slopes and hints of 10 000 readings.
func BenchmarkDiagnose(b *testing.B) {
	ts, s := bench10k()
	set := &Settings{Rate: scQ, Window: 0.5}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Diagnose(ts, s, set); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCanStop: the indicator on 10 000 readings.
func BenchmarkCanStop(b *testing.B) {
	ts, s := bench10k()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := CanStop(ts, s, &StopSettings{Window: 0.5}); err != nil {
			b.Fatal(err)
		}
	}
}
