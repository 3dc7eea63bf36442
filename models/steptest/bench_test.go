package steptest

import (
	"math/rand/v2"
	"testing"
)

// BenchmarkAnalyse: logger readings of the four-step scenario, 2500 per
// step (10 000 in all), analysed and fitted by Jacob's law with the
// drawdowns' covariance (generalised least squares).
func BenchmarkAnalyse(b *testing.B) {
	steps := scSchedule()
	d := scReadings(steps, 2500, 0.005, rand.New(rand.NewPCG(1, 1)))
	b.ReportAllocs()
	for b.Loop() {
		a, err := Analyse(steps, d, nil)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := a.Jacob(nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRorabaugh: the nonlinear fit of six step drawdowns.
func BenchmarkRorabaugh(b *testing.B) {
	law := Law{B: 250, C: 5000, N: 2.6}
	rng := rand.New(rand.NewPCG(5, 6))
	var pts []Point
	for _, q := range []float64{0.01, 0.02, 0.03, 0.04, 0.05, 0.06} {
		pts = append(pts, Point{q, law.Drawdown(q) * (1 + 0.01*rng.NormFloat64())})
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Rorabaugh(pts, nil); err != nil {
			b.Fatal(err)
		}
	}
}
