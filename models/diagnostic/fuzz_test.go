package diagnostic

import (
	"encoding/binary"
	"math"
	"testing"
)

// FuzzDerivative feeds arbitrary series and windows: the functions must
// return an error or a result whose stencil indices are consistent, never
// panic.
func FuzzDerivative(f *testing.F) {
	enc := func(v ...float64) []byte {
		b := make([]byte, 8*len(v))
		for i, x := range v {
			binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
		}
		return b
	}
	f.Add(enc(1, 0.1, 2, 0.2, 4, 0.35, 8, 0.4, 16, 0.5), 0.0)
	f.Add(enc(1, 0, 1, 0), 0.2)
	f.Add(enc(3, 1, 2, 1), 0.2)
	f.Add(enc(1, math.NaN(), 2, 1), -1.0)
	f.Add(enc(1e-300, 1e300, 1e300, -1e300, math.Inf(1), 0), 1e-12)
	f.Add([]byte{1, 2, 3}, math.NaN())
	f.Fuzz(func(t *testing.T, data []byte, window float64) {
		n := len(data) / 16
		tt, s := make([]float64, n), make([]float64, n)
		for i := 0; i < n; i++ {
			tt[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i:]))
			s[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[16*i+8:]))
		}
		set := &Settings{Window: window}
		for _, fn := range []func([]float64, []float64, *Settings) (*Result, error){Derivative, DerivativeOnAxis} {
			res, err := fn(tt, s, set)
			if err != nil {
				if res != nil {
					t.Fatalf("result with error %v", err)
				}
				if err.Error() == "" {
					t.Fatal("empty error message")
				}
				continue
			}
			if len(res.D) != n || len(res.Stencil) != n || len(res.Left) != n || len(res.Right) != n {
				t.Fatalf("lengths %d %d %d %d, want %d", len(res.D), len(res.Stencil), len(res.Left), len(res.Right), n)
			}
			for i := range res.D {
				if l, r := res.Left[i], res.Right[i]; l < 0 || l > i || r < i || r >= n || l == r {
					t.Fatalf("i=%d: neighbours %d, %d", i, l, r)
				}
			}
		}
	})
}
