package infiltration

import (
	"encoding/binary"
	"errors"
	"math"
	"testing"

	"fieldfit/models"
)

func f64(b []byte) float64 { return math.Float64frombits(binary.LittleEndian.Uint64(b)) }

// fuzzSheet decodes b into at most 40 readings of 25 bytes: time, value,
// refill level (float64 each) and a flag byte (bit 0: refill).
func fuzzSheet(b []byte) []Reading {
	var rs []Reading
	for len(b) >= 25 && len(rs) < 40 {
		rs = append(rs, Reading{Time: f64(b), Value: f64(b[8:]), RefillTo: f64(b[16:]), Refill: b[24]&1 == 1})
		b = b[25:]
	}
	return rs
}

func encodeSheet(rs []Reading) []byte {
	var b []byte
	for _, r := range rs {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(r.Time))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(r.Value))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(r.RefillTo))
		flag := byte(0)
		if r.Refill {
			flag = 1
		}
		b = append(b, flag)
	}
	return b
}

var units4 = []string{"mm", "cm", "in", "L", "m³", "US gal", "x"}

// FuzzRebuild checks the refill reconstruction on any sheet: no panics,
// errors name a reading inside the sheet, and a rebuilt series has F(0) =
// 0, increasing times and rates consistent with the depths.
func FuzzRebuild(f *testing.F) {
	f.Add(encodeSheet(birchfieldReadings()), 0.3, uint8(0), false, false)
	f.Add(encodeSheet(birchfieldReadings()), 0.3, uint8(1), true, true)
	f.Add(encodeSheet([]Reading{{Time: 0}, {Time: 60, Value: 0.5}}), 0.3, uint8(3), false, true)
	f.Add([]byte{}, 0.0, uint8(6), false, false)
	f.Fuzz(func(t *testing.T, b []byte, d float64, unit uint8, down, volumes bool) {
		test := Test{InnerDiameter: d, Unit: units4[int(unit)%len(units4)], DistanceDown: down, Readings: fuzzSheet(b)}
		if volumes {
			test.Kind = Volumes
		}
		c, err := Rebuild(test)
		if err != nil {
			var e *models.Error
			if !errors.As(err, &e) || e.Index >= len(test.Readings) || e.Error() == "" {
				t.Fatalf("error %v is not a *models.Error inside the sheet", err)
			}
			return
		}
		n := len(test.Readings)
		if len(c.Time) != n || len(c.Depth) != n || len(c.Rate) != n-1 || c.Time[0] != 0 || c.Depth[0] != 0 {
			t.Fatalf("rebuilt series of %d readings: %d times, %d depths, %d rates", n, len(c.Time), len(c.Depth), len(c.Rate))
		}
		for i := 1; i < n; i++ {
			// t − t0 may round two close times far from the origin together.
			if !(c.Time[i] >= c.Time[i-1]) {
				t.Fatalf("time %d: %g after %g", i, c.Time[i], c.Time[i-1])
			}
		}
	})
}

func birchfieldReadings() []Reading {
	return []Reading{
		{Time: 0, Value: 150}, {Time: 300, Value: 141}, {Time: 600, Value: 134},
		{Time: 900, Value: 128.5, Refill: true, RefillTo: 150}, {Time: 1500, Value: 140},
		{Time: 2100, Value: 131}, {Time: 2700, Value: 122.5, Refill: true, RefillTo: 150},
		{Time: 3600, Value: 139}, {Time: 4500, Value: 128},
	}
}

// FuzzGreenAmpt checks the safeguarded Newton solve on any t, K, ψΔθ: the
// result is NaN only outside the domain, and otherwise meets the implicit
// equation to rounding and lies in its bracket.
func FuzzGreenAmpt(f *testing.F) {
	f.Add(3600.0, 1.8e-6, 0.05681)
	f.Add(1e-9, 10.0, 2.0)
	f.Add(1e12, 1e-3, 1e-9)
	f.Add(0.0, 1.0, 1.0)
	f.Fuzz(func(t *testing.T, tt, K, P float64) {
		F := GreenAmptDepth(tt, K, P)
		inDomain := tt >= 0 && K > 0 && P > 0 && !bad(tt) && !bad(K) && !bad(P) && !bad(K*tt/P)
		if !inDomain {
			if !math.IsNaN(F) && !(tt == 0 && K > 0 && P > 0 && !bad(K) && !bad(P)) {
				t.Fatalf("F(%g, %g, %g) = %g outside the domain", tt, K, P, F)
			}
			return
		}
		x := F / P
		tau := K * tt / P
		if math.IsNaN(x) || x < tau*(1-1e-15) || x > (tau+math.Sqrt(2*tau))*(1+1e-15) {
			t.Fatalf("τ = %g: x = %g outside [τ, τ + √(2τ)]", tau, x)
		}
		if tau > 0 && math.Abs(xMinusLog1p(x)-tau) > 1e-12*tau {
			t.Fatalf("τ = %g: x − ln(1+x) = %g", tau, xMinusLog1p(x))
		}
	})
}

// FuzzFit checks Fit on any cumulative series and settings: no panics,
// errors name a reading inside the data.
func FuzzFit(f *testing.F) {
	f.Add(encodeSheet(birchfieldReadings()), uint8(0), false, 0.0, 0.0)
	f.Add(encodeSheet(birchfieldReadings()), uint8(2), true, 600.0, 3000.0)
	f.Add(encodeSheet(birchfieldReadings()[:3]), uint8(4), true, 0.0, 0.0)
	f.Fuzz(func(t *testing.T, b []byte, method uint8, rate bool, from, to float64) {
		test := Test{InnerDiameter: 0.3, Unit: "mm", Readings: fuzzSheet(b)}
		if len(test.Readings) > 16 {
			test.Readings = test.Readings[:16]
		}
		c, err := Rebuild(test)
		if err != nil {
			return
		}
		m := Method(method % uint8(numMethods))
		r, err := Fit(c, m, &Settings{Rate: rate, From: from, To: to})
		if err != nil {
			var e *models.Error
			if !errors.As(err, &e) || e.Index >= len(test.Readings) {
				t.Fatalf("error %v is not a *models.Error inside the data", err)
			}
		}
		if r == nil && err == nil {
			t.Fatal("nil result without error")
		}
		if r != nil && (len(r.Estimates) != len(laws[m].params) || r.Caution == "") {
			t.Fatalf("incomplete result %+v", r)
		}
	})
}
