package steptest

import (
	"encoding/binary"
	"math"
	"testing"

	"fieldfit/models"
)

func floats(data []byte) []float64 {
	v := make([]float64, len(data)/8)
	for i := range v {
		v[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[8*i:]))
	}
	return v
}

func encode(v ...float64) []byte {
	b := make([]byte, 8*len(v))
	for i, x := range v {
		binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
	}
	return b
}

// FuzzAnalyse feeds arbitrary schedules, readings and settings to Analyse
// and the well-loss fits: they must return an error or a consistent
// result, never panic.
func FuzzAnalyse(f *testing.F) {
	steps := scSchedule()
	d := scReadings(steps, 6, 0, nil)
	var sched []float64
	for _, s := range steps {
		sched = append(sched, s.Start, s.Rate)
	}
	var read []float64
	for i := range d.Time {
		read = append(read, d.Time[i], d.Value[i])
	}
	f.Add(uint8(4), encode(sched...), encode(read...), 0.0, 0.0, false)
	f.Add(uint8(4), encode(sched...), encode(read...), 3000.0, 0.3, true)
	f.Add(uint8(2), encode(0, 1, 10, 2), encode(1, 1, 5, 2, 10, 3, 11, 4, 20, 5), 0.0, 0.0, false)
	f.Add(uint8(3), encode(0, 1, 0, 2, math.NaN(), 3), encode(1, math.Inf(1)), -1.0, 2.0, false)
	f.Add(uint8(2), encode(0, 1e-300, 1e300, 1e300), encode(1e-300, 1e300, 1e301, -1e300, math.Inf(1), 0), 1e-320, 1e-9, true)
	f.Fuzz(func(t *testing.T, ns uint8, sched, read []byte, dur, late float64, logTime bool) {
		sv := floats(sched)
		n := min(int(ns%8), len(sv)/2)
		st := make([]Step, n)
		for k := range st {
			st[k] = Step{Start: sv[2*k], Rate: sv[2*k+1]}
		}
		rv := floats(read)
		var dd models.Data
		for i := 0; i+1 < len(rv); i += 2 {
			dd.Time = append(dd.Time, rv[i])
			dd.Value = append(dd.Value, rv[i+1])
		}
		set := &Settings{Duration: dur, Late: late}
		if logTime {
			set.Trend = TrendLogTime
		}
		a, err := Analyse(st, dd, set)
		if err != nil {
			if a != nil || err.Error() == "" {
				t.Fatalf("result %v with error %q", a, err)
			}
			return
		}
		if len(a.Steps) != n {
			t.Fatalf("%d step results for %d steps", len(a.Steps), n)
		}
		sum := 0.0
		for k, s := range a.Steps {
			sum += s.Increment
			if s.Drawdown != sum && !math.IsNaN(sum) {
				t.Fatalf("step %d: s_w %g is not the sum of the increments %g", k, s.Drawdown, sum)
			}
			if len(s.Readings) == 0 || (k+1 < n && s.Line == nil) {
				t.Fatalf("step %d: %d readings, line %v", k, len(s.Readings), s.Line)
			}
		}
		pts := a.Points()
		if a.DrawdownCov == nil || a.DrawdownCov.SymmetricDim() != n {
			t.Fatalf("drawdown covariance %v for %d steps", a.DrawdownCov, n)
		}
		for _, fit := range []func([]Point, *FitSettings) (*LossFit, error){
			Jacob, Rorabaugh,
			func(_ []Point, s *FitSettings) (*LossFit, error) { return a.Jacob(s) },
			func(_ []Point, s *FitSettings) (*LossFit, error) { return a.Rorabaugh(s) },
		} {
			lf, err := fit(pts, nil)
			if err != nil {
				if err.Error() == "" {
					t.Fatal("empty error message")
				}
				continue
			}
			if len(lf.Residuals) != len(pts) || len(lf.Coefficients) < 2 {
				t.Fatalf("fit %+v", lf)
			}
			lf.Efficiency(pts[0].Rate)
			lf.Condition()
			lf.Law.RateFor(0.8)
		}
	})
}
