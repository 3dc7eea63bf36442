package models

import (
	"encoding/binary"
	"math"
	"testing"
)

// FuzzHantushW checks that HantushW never panics, returns NaN exactly for
// invalid arguments, and otherwise a value between 0 and the bounds
// E1(u) and 2K0(β), satisfying the reflection identity where both sides
// are well scaled.
func FuzzHantushW(f *testing.F) {
	for _, c := range [][2]float64{
		{1e-10, 0}, {0.01, 0.05}, {5, 10}, {5, 10.000001}, {0, 3}, {50, 30}, {-1, 1}, {1, -1}, {1e300, 1e-300},
		{735.02, 6.002222222222223}, // found by fuzzing: W subnormal, once larger than E1(u)
	} {
		f.Add(c[0], c[1])
	}
	f.Fuzz(func(t *testing.T, u, beta float64) {
		w := HantushW(u, beta)
		if math.IsNaN(u) || math.IsNaN(beta) || u < 0 || beta < 0 {
			if !math.IsNaN(w) {
				t.Fatalf("W(%v, %v) = %v, want NaN", u, beta, w)
			}
			return
		}
		if math.IsNaN(w) || w < 0 {
			t.Fatalf("W(%v, %v) = %v", u, beta, w)
		}
		if e := E1(u); w > e*(1+1e-12) {
			t.Fatalf("W(%v, %v) = %v > E1(u) = %v", u, beta, w, e)
		}
		if beta > 0 {
			k := 2 * K0(beta)
			if w > k*(1+1e-12) {
				t.Fatalf("W(%v, %v) = %v > 2K0(β) = %v", u, beta, w, k)
			}
			u2 := beta * beta / (4 * u)
			if beta <= 30 && beta >= 1e-6 && u > 1e-12 && u < 700 && u2 < 700 && u2 > 1e-12 {
				if sum := w + HantushW(u2, beta); math.Abs(sum-k) > 1e-9*k {
					t.Fatalf("W(%v, %v) + W(%v, %v) = %v, want 2K0 = %v", u, beta, u2, beta, sum, k)
				}
			}
		}
	})
}

// fuzzSteps decodes b into a schedule: each 16 bytes are a start and a
// rate, at most 6 steps.
func fuzzSteps(b []byte) []RateStep {
	var s []RateStep
	for len(b) >= 16 && len(s) < 6 {
		s = append(s, RateStep{
			Start: math.Float64frombits(binary.LittleEndian.Uint64(b)),
			Rate:  math.Float64frombits(binary.LittleEndian.Uint64(b[8:])),
		})
		b = b[16:]
	}
	return s
}

func stepSeed(steps []RateStep) []byte {
	var b []byte
	for _, s := range steps {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(s.Start))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(s.Rate))
	}
	return b
}

// FuzzVariableRate checks that a fit over any schedule and readings never
// panics and reports bad input as an *Error.
func FuzzVariableRate(f *testing.F) {
	f.Add(stepSeed([]RateStep{{0, scQ}, {3600, 2 * scQ}, {7200, 0}}), fuzzSeed(12), false)
	f.Add(stepSeed([]RateStep{{0, scQ}, {-1, 0}}), fuzzSeed(6), true)
	f.Add(stepSeed([]RateStep{{0, 0}}), fuzzSeed(4), false)
	f.Add(stepSeed(nil), fuzzSeed(4), false)
	f.Fuzz(func(t *testing.T, sb, db []byte, leaky bool) {
		steps := fuzzSteps(sb)
		d := fuzzData(db, false)
		var base RateModel = Theis{Q: scQ, R: scR}
		if leaky {
			base = Hantush{Q: scQ, R: scR}
		}
		m := VariableRate{Base: base, Steps: steps}
		res, err := Fit(m, d, &FitSettings{Solver: nil})
		checkErr(t, err, len(d.Time))
		if err == nil && len(res.Residuals) != len(res.Used) {
			t.Fatalf("%d residuals for %d readings", len(res.Residuals), len(res.Used))
		}
		if err == nil {
			res.Band([]float64{1, 1e3, 1e5})
		}
	})
}

// FuzzImageWell checks the boundary model's input validation and fit.
func FuzzImageWell(f *testing.F) {
	f.Add(fuzzSeed(12), scR, 0.0, 1)
	f.Add(fuzzSeed(12), scR, 270.0, 2)
	f.Add(fuzzSeed(8), scR, scR, 1)
	f.Add(fuzzSeed(8), 0.5, -3.0, 3)
	f.Fuzz(func(t *testing.T, db []byte, r, image float64, kind int) {
		d := fuzzData(db, false)
		m := ImageWell{Base: Theis{Q: scQ, R: r}, Kind: BoundaryKind(kind), Image: image}
		res, err := Fit(m, d, nil)
		checkErr(t, err, len(d.Time))
		if err == nil && len(res.Valid) != len(res.Used) {
			t.Fatalf("%d validity flags for %d readings", len(res.Valid), len(res.Used))
		}
		_ = BoundaryDerivativeRatio(BoundaryKind(kind), r, image)
	})
}

// FuzzJoinRecovery checks that joining any two series never panics, and
// that a successful join keeps every reading.
func FuzzJoinRecovery(f *testing.F) {
	f.Add(fuzzSeed(6), fuzzSeed(6), 86400.0, false)
	f.Add([]byte{}, fuzzSeed(3), 3600.0, true)
	f.Add(fuzzSeed(3), []byte{}, 3600.0, false)
	f.Add(fuzzSeed(3), fuzzSeed(3), math.NaN(), false)
	f.Fuzz(func(t *testing.T, pb, rb []byte, tp float64, mask bool) {
		p, r := fuzzData(pb, mask), fuzzData(rb, mask)
		d, err := JoinRecovery(p, r, tp)
		checkErr(t, err, max(len(p.Time), len(r.Time)))
		if err == nil && len(d.Time) != len(p.Time)+len(r.Time) {
			t.Fatalf("%d readings joined from %d + %d", len(d.Time), len(p.Time), len(r.Time))
		}
	})
}

// FuzzJacobCorrection checks the correction of any readings and
// thickness: no panic, an *Error or a copy of the same length.
func FuzzJacobCorrection(f *testing.F) {
	f.Add(fuzzSeed(10), 20.0, false)
	f.Add(fuzzSeed(10), 0.5, true)
	f.Add(fuzzSeed(2), -1.0, false)
	f.Fuzz(func(t *testing.T, db []byte, b float64, mask bool) {
		d := fuzzData(db, mask)
		c, _, err := JacobCorrection(d, b)
		checkErr(t, err, len(d.Time))
		if err == nil {
			if len(c.Value) != len(d.Value) {
				t.Fatalf("%d corrected values for %d", len(c.Value), len(d.Value))
			}
			for i, v := range c.Value {
				if (d.Exclude == nil || !d.Exclude[i]) && !(v <= d.Value[i]) {
					t.Fatalf("corrected %v > observed %v", v, d.Value[i])
				}
			}
		}
	})
}

// FuzzFitWells checks the joint fit of two wells of any readings and
// distances with the leaky model.
func FuzzFitWells(f *testing.F) {
	f.Add(fuzzSeed(10), fuzzSeed(8), scR, 90.0, 1.0)
	f.Add(fuzzSeed(3), []byte{}, scR, 0.0, -1.0)
	f.Fuzz(func(t *testing.T, ab, bb []byte, r1, r2, w2 float64) {
		a, b := fuzzData(ab, false), fuzzData(bb, false)
		wells := []Well{
			{Model: Hantush{Q: scQ, R: r1}, Data: a},
			{Model: Hantush{Q: scQ, R: r2}, Data: b, Weight: w2},
		}
		res, err := FitWells(wells, nil)
		checkErr(t, err, max(len(a.Time), len(b.Time)))
		if err == nil && (len(res.Wells) != 2 || len(res.Wells[0].Residuals)+len(res.Wells[1].Residuals) != res.Fit.N) {
			t.Fatalf("inconsistent result")
		}
	})
}

// FuzzDistanceDrawdown checks the distance–drawdown line on any wells.
func FuzzDistanceDrawdown(f *testing.F) {
	f.Add(fuzzSeed(4), scQ, 3600.0, 0.0)
	f.Add(fuzzSeed(1), -scQ, 0.0, 2.0)
	f.Fuzz(func(t *testing.T, db []byte, q, tt, umax float64) {
		d := fuzzData(db, false) // times as distances
		c, err := DistanceDrawdownLine(q, tt, d.Time, d.Value, &LineSettings{UMax: umax})
		checkErr(t, err, len(d.Time))
		if err == nil && (len(c.U) != len(d.Time) || !(c.T > 0)) {
			t.Fatalf("%d u values for %d wells, T = %v", len(c.U), len(d.Time), c.T)
		}
		_, err = DrawdownAt(fuzzData(db, true), tt)
		checkErr(t, err, len(d.Time))
	})
}
