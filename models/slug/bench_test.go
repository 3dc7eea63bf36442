package slug

import (
	"testing"

	"fieldfit/models"
)

// BenchmarkResponse evaluates F(α, β) once (building its quadrature).
func BenchmarkResponse(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		Response(1e-4, 0.3)
	}
}

// BenchmarkCBPEval evaluates the model at 200 times for one (T, S): one
// quadrature shared by all times.
func BenchmarkCBPEval(b *testing.B) {
	m := CBP{CasingRadius: 0.025, WellRadius: 0.075}
	ts := logTimes(200, 0.5, 5000)
	dst := make([]float64, len(ts))
	p := []float64{1e-4, 1e-4}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		m.Eval(dst, ts, p)
	}
}

// BenchmarkCBPFit fits T and S to 100 readings from the model's own start.
func BenchmarkCBPFit(b *testing.B) {
	m := CBP{CasingRadius: 0.025, WellRadius: 0.075}
	ts := logTimes(100, 0.5, 3000)
	h := make([]float64, len(ts))
	m.Eval(h, ts, []float64{1e-4, 1e-4})
	for i := range h {
		h[i] += noise(i, 2e-3)
	}
	test := Test{Geometry: scGeom, Readings: models.Data{Time: ts, Value: h}, H0: 1}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := CooperBredehoeftPapadopulos(test, nil); err != nil {
			b.Fatal(err)
		}
	}
}
