package models

import (
	"encoding/binary"
	"errors"
	"math"
	"testing"
)

// fuzzData decodes b into readings: each 16 bytes are a time and a value
// (little-endian float64), at most 64 readings. When mask is set, every
// reading whose time's low byte is odd is excluded.
func fuzzData(b []byte, mask bool) Data {
	var d Data
	for len(b) >= 16 && len(d.Time) < 64 {
		d.Time = append(d.Time, math.Float64frombits(binary.LittleEndian.Uint64(b)))
		d.Value = append(d.Value, math.Float64frombits(binary.LittleEndian.Uint64(b[8:])))
		if mask {
			d.Exclude = append(d.Exclude, b[0]&1 == 1)
		}
		b = b[16:]
	}
	return d
}

// fuzzSeed encodes noise-free readings of our scenario as a seed corpus
// entry.
func fuzzSeed(n int) []byte {
	d := synth(n)
	b := make([]byte, 0, 16*n)
	for i := range d.Time {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(d.Time[i]))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(d.Value[i]))
	}
	return b
}

// checkErr fails unless err is nil or an *Error whose point index lies in
// the data.
func checkErr(t *testing.T, err error, n int) {
	t.Helper()
	if err == nil {
		return
	}
	var e *Error
	if !errors.As(err, &e) {
		t.Fatalf("error %q (%T) is not an *Error", err, err)
	}
	if e.Index >= n {
		t.Fatalf("error %q names point %d of %d", err, e.Index, n)
	}
	if e.Error() == "" {
		t.Fatal("empty error message")
	}
}

// FuzzTheisFit checks that Fit of the Theis model never panics on any
// readings, rate, distance or window, and returns either an *Error or a
// result whose parts are consistent.
func FuzzTheisFit(f *testing.F) {
	f.Add(fuzzSeed(12), scQ, scR, 0.0, 0.0, false)
	f.Add(fuzzSeed(5), -scQ, 0.1, 100.0, 1e5, true)
	f.Add(fuzzSeed(3), 0.0, scR, 0.0, 0.0, false)
	f.Add([]byte{}, scQ, scR, 0.0, 0.0, false)
	f.Fuzz(func(t *testing.T, b []byte, q, r, from, to float64, mask bool) {
		d := fuzzData(b, mask)
		res, err := Fit(Theis{Q: q, R: r}, d, &FitSettings{From: from, To: to})
		checkErr(t, err, len(d.Time))
		if res == nil {
			if err == nil {
				t.Fatal("nil result without error")
			}
			return
		}
		if len(res.Params) != 2 || len(res.Estimates) != 2 || len(res.Residuals) != len(res.Used) || len(res.Valid) != len(res.Used) {
			t.Fatalf("inconsistent result: %d params, %d estimates, %d residuals, %d valid, %d used",
				len(res.Params), len(res.Estimates), len(res.Residuals), len(res.Valid), len(res.Used))
		}
		if len(res.Used)+res.Excluded+res.Outside != len(d.Time) {
			t.Fatalf("used %d + excluded %d + outside %d ≠ %d readings", len(res.Used), res.Excluded, res.Outside, len(d.Time))
		}
		for _, i := range res.Used {
			if d.Exclude != nil && d.Exclude[i] || !(d.Time[i] > 0) {
				t.Fatalf("reading %d (t = %v) used", i, d.Time[i])
			}
		}
		res.Band([]float64{1, 100, 1e4})
	})
}

// FuzzCooperJacobLine checks that the straight-line analysis never panics
// and reports bad input as an *Error.
func FuzzCooperJacobLine(f *testing.F) {
	f.Add(fuzzSeed(12), scQ, scR, 0.0, 0.0, 0.0)
	f.Add(fuzzSeed(4), scQ, scR, 1e3, 0.0, 0.05)
	f.Fuzz(func(t *testing.T, b []byte, q, r, from, to, umax float64) {
		d := fuzzData(b, false)
		c, err := CooperJacobLine(q, r, d, &LineSettings{From: from, To: to, UMax: umax})
		checkErr(t, err, len(d.Time))
		if err == nil {
			if len(c.U) != len(d.Time) || !(c.T > 0) {
				t.Fatalf("%d u values for %d readings, T = %v", len(c.U), len(d.Time), c.T)
			}
			c.Band([]float64{1, 1e3})
		}
	})
}

// FuzzRecoveryFit checks the Theis recovery model and line the same way.
func FuzzRecoveryFit(f *testing.F) {
	f.Add(fuzzSeed(10), scQ, scR, 3600.0)
	f.Add(fuzzSeed(2), scQ, scR, 0.0)
	f.Fuzz(func(t *testing.T, b []byte, q, r, tp float64) {
		d := fuzzData(b, false)
		_, err := Fit(TheisRecovery{Q: q, R: r, PumpTime: tp}, d, nil)
		checkErr(t, err, len(d.Time))
		_, err = RecoveryLine(q, tp, d, nil)
		checkErr(t, err, len(d.Time))
	})
}
