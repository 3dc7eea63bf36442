package slug

import (
	"encoding/binary"
	"errors"
	"math"
	"testing"

	"fieldfit/models"
)

func f64(b []byte) float64 { return math.Float64frombits(binary.LittleEndian.Uint64(b)) }

// fuzzReadings decodes b into at most 48 readings of 16 bytes (time,
// displacement).
func fuzzReadings(b []byte) models.Data {
	var d models.Data
	for len(b) >= 16 && len(d.Time) < 48 {
		d.Time = append(d.Time, f64(b))
		d.Value = append(d.Value, f64(b[8:]))
		b = b[16:]
	}
	return d
}

func seedReadings(test Test) []byte {
	var b []byte
	for i := range test.Readings.Time {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(test.Readings.Time[i]))
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(test.Readings.Value[i]))
	}
	return b
}

// checkResult fails unless err is nil or a *models.Error naming a reading
// inside the data, and a result is consistent.
func checkResult(t *testing.T, r *Result, err error, n int) {
	t.Helper()
	if err != nil {
		var e *models.Error
		if !errors.As(err, &e) || e.Index >= n || e.Error() == "" {
			t.Fatalf("error %v (%T) is not a *models.Error inside the data", err, err)
		}
	}
	if r == nil {
		if err == nil {
			t.Fatal("nil result without error")
		}
		return
	}
	if r.Fit == nil || r.Normalised == nil || len(r.KIn) != 4 || r.Caution == "" || len(r.Assumptions) == 0 {
		t.Fatalf("incomplete result %+v", r)
	}
}

// FuzzGeometry checks geometry validation and the three methods on any
// geometry: no panics, errors name a field, and an accepted geometry
// gives finite positive shape factors and ln(Re/r_w).
func FuzzGeometry(f *testing.F) {
	f.Add(0.025, 0.075, 3.0, 6.0, 15.0, 0.3, true, uint8(0))
	f.Add(0.025, 0.05, 1.5, 0.0, 0.0, 0.0, false, uint8(3))
	f.Add(0.0, 0.05, 1.5, 2.0, 1.0, 1.0, false, uint8(9))
	f.Add(0.05, 0.05, 0.01, 0.02, 0.02, 0.0, true, uint8(1))
	test := lineTest(scGeom, 0.01, 0)
	f.Fuzz(func(t *testing.T, rc, rw, le, lw, h, n float64, inScreen bool, shape uint8) {
		g := Geometry{CasingRadius: rc, WellRadius: rw, ScreenLength: le, ScreenBottom: lw, AquiferThickness: h, PackPorosity: n, LevelInScreen: inScreen}
		err := g.Check()
		if err != nil {
			var e *models.Error
			if !errors.As(err, &e) || e.Field == "" || !errors.Is(err, models.ErrBadConstant) {
				t.Fatalf("geometry error %v does not name a field", err)
			}
		} else if r := g.EffectiveCasingRadius(); !(r > 0) || math.IsInf(r, 0) {
			t.Fatalf("accepted geometry %+v: effective radius %v", g, r)
		}
		s := Shape(shape % uint8(numShapes+1))
		if F, ferr := s.Factor(g); ferr == nil && (!(F > 0) || math.IsInf(F, 0)) {
			t.Fatalf("%v on %+v: factor %v", s, g, F)
		}
		if v, _, lerr := LnReRw(g, Coefficients{A: 2, B: 0.3, C: 1.5}); lerr == nil && !(v > 0) {
			t.Fatalf("ln(Re/rw) = %v on %+v", v, g)
		}
		tt := test
		tt.Geometry = g
		n0 := len(tt.Readings.Time)
		r, err := Hvorslev(tt, s, nil)
		checkResult(t, r, err, n0)
		r, err = BouwerRice(tt, nil, nil)
		checkResult(t, r, err, n0)
	})
}

// FuzzReadings checks normalisation and the fits on any readings, H0,
// volume and window: no panics, errors name a reading inside the data.
func FuzzReadings(f *testing.F) {
	good := lineTest(scGeom, 0.01, 0)
	f.Add(seedReadings(good), 0.0, 0.001, 0.0, 0.0, false)
	f.Add(seedReadings(good), 0.5, 0.0, 50.0, 300.0, true)
	f.Add([]byte{}, 0.0, 0.0, 0.0, 0.0, false)
	f.Add(seedReadings(good)[:48], -0.5, -1.0, 10.0, 1.0, true)
	f.Fuzz(func(t *testing.T, b []byte, h0, vol, from, to float64, cbp bool) {
		d := fuzzReadings(b)
		test := Test{Geometry: scGeom, Readings: d, H0: h0, SlugVolume: vol}
		s := &Settings{From: from, To: to}
		nd, err := Normalise(test, 0)
		if err == nil && len(nd.Data.Value) != len(d.Time) {
			t.Fatalf("normalised %d of %d readings", len(nd.Data.Value), len(d.Time))
		}
		r, err := Hvorslev(test, ScreenLong, s)
		checkResult(t, r, err, len(d.Time))
		if cbp && len(d.Time) <= 16 {
			r, err = CooperBredehoeftPapadopulos(test, s)
			checkResult(t, r, err, len(d.Time))
		}
	})
}
