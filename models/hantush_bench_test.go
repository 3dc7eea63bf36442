package models

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// hantushBenchArgs are 1024 pairs (u, β), u log-uniform over 1e-10 … 50
// and β uniform over 0 … 10 (seeded), the range of the accuracy target.
var hantushBenchArgs = func() [][2]float64 {
	rng := rand.New(rand.NewPCG(11, 12))
	a := make([][2]float64, 1024)
	for i := range a {
		a[i] = [2]float64{math.Pow(10, -10+rng.Float64()*(10+math.Log10(50))), 10 * rng.Float64()}
	}
	return a
}()

// BenchmarkHantushW times one evaluation of W(u, β) over the arguments of
// hantushBenchArgs; the sub-benchmarks split them by the form used.
func BenchmarkHantushW(b *testing.B) {
	b.Run("all", func(b *testing.B) {
		b.ReportAllocs()
		s := 0.0
		for i := 0; i < b.N; i++ {
			a := hantushBenchArgs[i&1023]
			s += HantushW(a[0], a[1])
		}
		benchSink = s
	})
	for _, c := range []struct {
		name   string
		lo, hi float64 // range of β
		late   bool    // u < β/2
	}{
		{"beta<=1/early", 0, 1, false}, {"beta<=1/late", 0, 1, true},
		{"beta>1/early", 1, 10, false}, {"beta>1/late", 1, 10, true},
	} {
		var args [][2]float64
		for _, a := range hantushBenchArgs {
			if a[1] > c.lo && a[1] <= c.hi && (a[0] < a[1]/2) == c.late {
				args = append(args, a)
			}
		}
		b.Run(fmt.Sprintf("%s(%d)", c.name, len(args)), func(b *testing.B) {
			b.ReportAllocs()
			s := 0.0
			for i := 0; i < b.N; i++ {
				a := args[i%len(args)]
				s += HantushW(a[0], a[1])
			}
			benchSink = s
		})
	}
	b.Run("beta>10", func(b *testing.B) {
		b.ReportAllocs()
		s := 0.0
		for i := 0; i < b.N; i++ {
			a := hantushBenchArgs[i&1023]
			s += HantushW(a[0], 10+2*a[1])
		}
		benchSink = s
	})
}

// hantushSynth returns noisy Hantush drawdowns of our leaky scenario (1 %
// multiplicative noise, seeded) at n times from 1 min to 2 days.
func hantushSynth(n int) Data {
	ts := logTimes(n, 60, 172800)
	s := make([]float64, n)
	Hantush{Q: lkQ, R: lkR}.Eval(s, ts, []float64{lkT, lkS, lkB})
	rng := rand.New(rand.NewPCG(8, uint64(n)))
	for i := range s {
		s[i] *= 1 + 0.01*rng.NormFloat64()
	}
	return Data{Time: ts, Value: s}
}

// BenchmarkHantushFit fits the Hantush–Jacob model to n noisy readings:
// "start" includes the model's own starting-guess search, "given" starts
// from the truth scaled by 1.3, 0.7 and 2.
func BenchmarkHantushFit(b *testing.B) {
	for _, n := range []int{1000, 10000} {
		d := hantushSynth(n)
		m := Hantush{Q: lkQ, R: lkR}
		for _, c := range []struct {
			name string
			s    *FitSettings
		}{
			{"start", nil},
			{"given", &FitSettings{Start: []float64{1.3 * lkT, 0.7 * lkS, 2 * lkB}}},
		} {
			b.Run(fmt.Sprintf("n=%d/%s", n, c.name), func(b *testing.B) {
				b.ReportAllocs()
				iters := 0
				for i := 0; i < b.N; i++ {
					r, err := Fit(m, d, c.s)
					if err != nil {
						b.Fatal(err)
					}
					iters = r.Fit.Iterations
				}
				b.ReportMetric(float64(iters), "LM-iterations")
			})
		}
	}
}

// BenchmarkHantushEval and BenchmarkHantushJacobian time one pass of the
// model over 10 000 readings.
func BenchmarkHantushEval(b *testing.B) {
	d := hantushSynth(10000)
	dst := make([]float64, len(d.Time))
	p := []float64{lkT, lkS, lkB}
	m := Hantush{Q: lkQ, R: lkR}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		m.Eval(dst, d.Time, p)
	}
}

func BenchmarkHantushJacobian(b *testing.B) {
	d := hantushSynth(10000)
	dst := mat.NewDense(len(d.Time), 3, nil)
	p := []float64{lkT, lkS, lkB}
	m := Hantush{Q: lkQ, R: lkR}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		m.Jacobian(dst, d.Time, p)
	}
}

// BenchmarkFitWellsDalem times the joint fit of the four Dalem piezometers
// (50 readings) from the model's own start.
func BenchmarkFitWellsDalem(b *testing.B) {
	wells := dalemWells(b)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := FitWells(wells, nil); err != nil {
			b.Fatal(err)
		}
	}
}
