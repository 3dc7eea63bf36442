package infiltration

import "testing"

// BenchmarkGreenAmptDepth solves the Green–Ampt equation at 1000 times
// from 1 s to 1 day.
func BenchmarkGreenAmptDepth(b *testing.B) {
	ts := make([]float64, 1000)
	for i := range ts {
		ts[i] = float64(i+1) * 86.4
	}
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		for _, t := range ts {
			s += GreenAmptDepth(t, 3.5e-6, 0.04)
		}
	}
	_ = s
}

// BenchmarkFitGreenAmpt fits Green–Ampt to the synthetic test (31
// readings), start search included.
func BenchmarkFitGreenAmpt(b *testing.B) {
	c := synthetic(GreenAmpt, trueParams[GreenAmpt])
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := Fit(c, GreenAmpt, nil); err != nil {
			b.Fatal(err)
		}
	}
}
