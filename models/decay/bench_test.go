package decay

import (
	"math"
	"testing"

	"fieldfit/models"
)

// BenchmarkFitOneTerm fits the one-term form to 1000 readings, start
// search included.
func BenchmarkFitOneTerm(b *testing.B) {
	var d models.Data
	for i := 0; i < 1000; i++ {
		t := 0.12 * float64(i)
		d.Time = append(d.Time, t)
		d.Value = append(d.Value, 1.4+7.8*math.Exp(-0.045*t)+0.02*math.Sin(float64(3*i)))
	}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := Fit(d, nil); err != nil {
			b.Fatal(err)
		}
	}
}
