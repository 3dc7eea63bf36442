package decay

import (
	"encoding/binary"
	"errors"
	"math"
	"testing"

	"fieldfit/models"
)

// FuzzFit checks Fit on any readings, form and fixed values: no panics;
// errors are *models.Error values naming a reading inside the data; a
// result has one half-life per rate constant.
func FuzzFit(f *testing.F) {
	seed := func(d models.Data) []byte {
		var b []byte
		for i := range d.Time {
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(d.Time[i]))
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(d.Value[i]))
		}
		return b
	}
	sc := scenario(func(int) float64 { return 0 })
	f.Add(seed(sc), false, false, 0.0, false, 0.0)
	f.Add(seed(sc), true, false, 0.0, true, 1.4)
	f.Add(seed(sc)[:64], false, true, 9.2, false, 0.0)
	f.Add([]byte{}, false, false, 0.0, false, 0.0)
	f.Fuzz(func(t *testing.T, b []byte, two, fixY0 bool, y0 float64, fixBase bool, base float64) {
		var d models.Data
		for len(b) >= 16 && len(d.Time) < 40 {
			d.Time = append(d.Time, math.Float64frombits(binary.LittleEndian.Uint64(b)))
			d.Value = append(d.Value, math.Float64frombits(binary.LittleEndian.Uint64(b[8:])))
			b = b[16:]
		}
		s := &Settings{FixY0: fixY0, Y0: y0, FixBaseline: fixBase, Baseline: base}
		if two {
			s.Form = TwoTerm
		}
		r, err := Fit(d, s)
		if err != nil {
			var e *models.Error
			if !errors.As(err, &e) || e.Index >= len(d.Time) || e.Error() == "" {
				t.Fatalf("error %v (%T) is not a *models.Error inside the data", err, err)
			}
		}
		if r == nil {
			if err == nil {
				t.Fatal("nil result without error")
			}
			return
		}
		if len(r.HalfLives) != len(r.Rates) || (two && len(r.Rates) != 2) || (!two && len(r.Rates) != 1) {
			t.Fatalf("%d rates, %d half-lives", len(r.Rates), len(r.HalfLives))
		}
	})
}
