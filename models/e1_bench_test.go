package models

import (
	"math"
	"testing"
)

var benchSink float64

// benchArgs are 1024 arguments spread log-uniformly over 1e-8 … 50, the
// range of u met in pumping tests, so that every branch is exercised.
var benchArgs = func() []float64 {
	xs := make([]float64, 1024)
	for i := range xs {
		xs[i] = 1e-8 * math.Pow(5e9, float64((i*389)%1024)/1023)
	}
	return xs
}()

// BenchmarkE1 and BenchmarkExp run over the same arguments so that their
// ns/op compare directly.
func BenchmarkE1(b *testing.B) {
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += E1(benchArgs[i&1023])
	}
	benchSink = s
}

func BenchmarkExp(b *testing.B) {
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += math.Exp(-benchArgs[i&1023])
	}
	benchSink = s
}

func BenchmarkLog(b *testing.B) {
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += math.Log(benchArgs[i&1023])
	}
	benchSink = s
}
