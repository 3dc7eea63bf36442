package regime

import (
	"encoding/binary"
	"math"
	"testing"
)

func encode(v ...float64) []byte {
	b := make([]byte, 8*len(v))
	for i, x := range v {
		binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
	}
	return b
}

// FuzzDiagnose feeds arbitrary series and settings to Diagnose and
// CanStop: they must return an error or a consistent result, never panic.
func FuzzDiagnose(f *testing.F) {
	var seed []float64
	for _, t := range logTimes(40, 10, 1e6) {
		seed = append(seed, t, theis(scQ, scR, scT, scS, t)+theis(scQ, scRi, scT, scS, t))
	}
	f.Add(encode(seed...), 0.0, 0.0, 0.0, 0.0)
	f.Add(encode(seed...), 0.01, 0.5, 0.05, 0.2)
	f.Add(encode(1, 0.1, 2, 0.2, 4, 0.35, 8, 0.4, 16, 0.5), 0.0, 1e-9, 0.3, 0.0)
	f.Add(encode(1, 0, 2, 0, 3, 0, 4, 0), 1.0, 0.0, 0.0, 0.0)
	f.Add(encode(1, 1, 2, -1, 3, 1, 4, -1, 5, 1e300), 0.0, 0.0, 0.0, 0.0)
	f.Add(encode(1e-300, 1e300, 1e300, -1e300, math.Inf(1), 0), math.NaN(), -1.0, 2.0, 1e-12)
	f.Fuzz(func(t *testing.T, data []byte, rate, window, tol, cycles float64) {
		n := len(data) / 16
		ts, s := make([]float64, n), make([]float64, n)
		for i := 0; i < n; i++ {
			ts[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i:]))
			s[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i+8:]))
		}
		dg, err := Diagnose(ts, s, &Settings{Rate: rate, Window: window, FlatTol: tol, MinCycles: cycles})
		if err != nil {
			if dg != nil || err.Error() == "" {
				t.Fatalf("result %v with error %q", dg, err)
			}
		} else {
			if len(dg.Slope) != n || len(dg.DerivSlope) != n {
				t.Fatalf("slopes %d, %d for %d readings", len(dg.Slope), len(dg.DerivSlope), n)
			}
			for _, h := range dg.Hints {
				if h.First < 0 || h.Last >= n || h.First > h.Last || h.From != ts[h.First] || h.To != ts[h.Last] || h.Text == "" {
					t.Fatalf("hint %+v for %d readings", h, n)
				}
			}
		}
		st, err := CanStop(ts, s, &StopSettings{Tolerance: tol, Cycles: cycles, Window: window})
		if err != nil {
			if st != nil || err.Error() == "" {
				t.Fatalf("stop %v with error %q", st, err)
			}
			return
		}
		if st.Text == "" || st.SinceIndex >= n || (st.Flat && st.SinceIndex < 0) {
			t.Fatalf("stop %+v for %d readings", st, n)
		}
	})
}
