package fielddata

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"
)

func near(t *testing.T, what string, got, want []float64, tol float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d values, want %d (%v)", what, len(got), len(want), got)
	}
	for i := range got {
		if math.Abs(got[i]-want[i]) > tol {
			t.Errorf("%s[%d] = %.10g, want %.10g", what, i, got[i], want[i])
		}
	}
}

func TestInterpolate(t *testing.T) {
	bt := []float64{0, 10, 10, 30}
	bv := []float64{1, 2, 4, 0}
	got := Interpolate([]float64{-5, 0, 5, 10, 20, 30, 40}, bt, bv)
	// Hand computation: before the record the first value (1); at 5, half
	// way from 1 to 2 (1.5); at the repeated time 10 the later reading (4);
	// at 20, half way from 4 to 0 (2); after the record the last value (0).
	near(t, "Interpolate", got, []float64{1, 1, 1.5, 4, 2, 0, 0}, 1e-15)
}

func TestBaroCompensation(t *testing.T) {
	// An unvented logger's readings as head of water (m) and a barometric
	// logger's, read at other times (Import gives both in m).
	water := Series{Name: "LF-OB1", Kind: Pressure, Time: []float64{0, 60, 120, 180}, Value: []float64{15.400, 15.350, 15.280, 15.260}}
	baro := Series{Name: "FB-3301", Kind: Pressure, Time: []float64{-30, 90, 210}, Value: []float64{10.330, 10.360, 10.300}}
	// Hand computation, barometer interpolated linearly to the water times:
	//   t =   0: 10.330 + (10.360 − 10.330)·30/120 = 10.3375
	//   t =  60: 10.330 + (10.360 − 10.330)·90/120 = 10.3525
	//   t = 120: 10.360 + (10.300 − 10.360)·30/120 = 10.3450
	//   t = 180: 10.360 + (10.300 − 10.360)·90/120 = 10.3150
	// water column above the sensor = total − barometer:
	//   15.400 − 10.3375 = 5.0625;  15.350 − 10.3525 = 4.9975
	//   15.280 − 10.3450 = 4.9350;  15.260 − 10.3150 = 4.9450
	res, err := Apply(water, &baro, Conditioning{Baro: &BaroCompensation{}})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "compensated", res.Pumping.Level, []float64{5.0625, 4.9975, 4.935, 4.945}, 1e-12)
	if res.Coverage == nil || !res.Coverage.Covered() || len(res.Notes) != 0 {
		t.Errorf("coverage %+v, notes %q", res.Coverage, res.Notes)
	}
	// With a static level of 5.0625 m typed, the drawdowns are
	// 0, 0.065, 0.1275, 0.1175.
	res, _ = Apply(water, &baro, Conditioning{Baro: &BaroCompensation{}, Static: &Static{Typed: true, Value: 5.0625}})
	near(t, "drawdown", res.Pumping.Drawdown, []float64{0, 0.065, 0.1275, 0.1175}, 1e-12)

	// The barometric head computed with another density is rescaled:
	// h·ρ_baro/ρ_water, at t = 0: 10.3375·1000/999.97 = 10.33781013430403
	// (mpmath), so 15.400 − 10.33781013430403 = 5.06218986569597.
	b2 := baro
	b2.Density = 1000
	res, _ = Apply(water, &b2, Conditioning{Baro: &BaroCompensation{}})
	near(t, "density", res.Pumping.Level[:1], []float64{15.400 - 10.33781013430403}, 1e-12)

	// A logger clock 30 s behind: shifting the barometer by +30 s puts its
	// readings at 0, 120, 240, and the barometer at t = 60 becomes
	// 10.345 (half way from 10.330 to 10.360): 15.350 − 10.345 = 5.005.
	res, _ = Apply(water, &baro, Conditioning{Baro: &BaroCompensation{Shift: 30}})
	near(t, "shifted", res.Pumping.Level[:2], []float64{15.400 - 10.330, 15.350 - 10.345}, 1e-12)
}

func TestBaroCoverage(t *testing.T) {
	water := Series{Kind: Pressure, Time: []float64{0, 10, 20, 30, 40, 50}, Value: []float64{15, 15, 15, 15, 15, 15}}
	baro := Series{Kind: Pressure, Time: []float64{15, 25, 35}, Value: []float64{10, 10.2, 10.4}}
	res, err := Apply(water, &baro, Conditioning{Baro: &BaroCompensation{}})
	if err != nil {
		t.Fatal(err)
	}
	if c := res.Coverage; c.Before != 2 || c.After != 2 || c.Covered() {
		t.Errorf("coverage %+v", c)
	}
	if len(res.Notes) != 1 || !strings.Contains(res.Notes[0], "does not cover the test: 2 readings before it and 2 after it") {
		t.Errorf("notes %q", res.Notes)
	}
	// the nearest barometric reading for those outside: 15 − 10, 15 − 10.4
	near(t, "held", res.Pumping.Level, []float64{5, 5, 4.9, 4.7, 4.6, 4.6}, 1e-12)
	res, _ = Apply(water, &baro, Conditioning{Baro: &BaroCompensation{DropUncovered: true}})
	if res.Dropped != 4 || res.Pumping.Len() != 2 || !strings.Contains(res.Notes[0], "they were left out") {
		t.Errorf("dropped %d, %d left, notes %q", res.Dropped, res.Pumping.Len(), res.Notes)
	}
	// A gap in the barometric record is noted.
	baro = Series{Kind: Pressure, Time: []float64{0, 10, 20, 30, 40, 50, 60}, Value: []float64{10, 10, 10, 10, 10, 10, 10}}
	baro.Time = []float64{-10, 0, 5, 10, 45, 50, 55}
	res, _ = Apply(water, &baro, Conditioning{Baro: &BaroCompensation{}})
	if res.Coverage.LongestGap != 35 || len(res.Notes) != 1 || !strings.Contains(res.Notes[0], "gap of 35 s") {
		t.Errorf("coverage %+v, notes %q", res.Coverage, res.Notes)
	}
}

func TestBaroEfficiency(t *testing.T) {
	water := Series{Kind: Level, Time: []float64{0, 100, 200}, Value: []float64{10, 10, 10}}
	baro := Series{Kind: Pressure, Time: []float64{0, 100, 200}, Value: []float64{10.30, 10.40, 10.20}}
	// Hand computation, L_c = L + BE·(B − B(start)), BE = 0.5, B(start) = 10.30:
	//   10 + 0.5·0 = 10;  10 + 0.5·0.10 = 10.05;  10 + 0.5·(−0.10) = 9.95
	res, err := Apply(water, &baro, Conditioning{Efficiency: &BaroEfficiency{BE: 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "corrected", res.Pumping.Level, []float64{10, 10.05, 9.95}, 1e-12)
	// For a depth record the same correction, in depth: 10, 9.95, 10.05.
	water.Kind = Depth
	res, _ = Apply(water, &baro, Conditioning{Efficiency: &BaroEfficiency{BE: 0.5}})
	near(t, "depth", res.Pumping.Level, []float64{-10, -9.95, -10.05}, 1e-12)
}

func TestTrendAndStatic(t *testing.T) {
	// Levels rising 0.001 m/s before pumping starts at t = 0.
	s := Series{Kind: Level, Time: []float64{-180, -120, -60, 0, 60}, Value: []float64{10.00, 10.06, 10.12, 10.18, 10.10}}
	// Hand computation: the line through the antecedent readings has slope
	// 0.001 m/s and reaches 10.18 at t = 0; removing 0.001·t leaves
	// 10.18, 10.18, 10.18 before pumping, 10.18 at 0 and 10.10 − 0.06 =
	// 10.04 at 60 s. The static level is their mean, 10.18, and the
	// drawdowns 0 and 0.14.
	res, err := Apply(s, nil, Conditioning{Start: ptr(0), Trend: &Trend{}, Static: &Static{}})
	if err != nil {
		t.Fatal(err)
	}
	if tr := res.Trend; tr == nil || !closeTo(tr.Slope, 0.001, 1e-12) || !closeTo(tr.Level, 10.18, 1e-12) || tr.N != 3 {
		t.Errorf("trend %+v", res.Trend)
	}
	near(t, "antecedent", res.Antecedent.Level, []float64{10.18, 10.18, 10.18}, 1e-12)
	if !closeTo(res.Static, 10.18, 1e-12) {
		t.Errorf("static %v", res.Static)
	}
	near(t, "drawdown", res.Pumping.Drawdown, []float64{0, 0.14}, 1e-12)
	// Without trend removal the static level is the plain mean, 10.06.
	res, _ = Apply(s, nil, Conditioning{Start: ptr(0), Static: &Static{}})
	near(t, "plain", res.Pumping.Drawdown, []float64{10.06 - 10.18, 10.06 - 10.10}, 1e-12)
	// A window of 130 s fits the last two antecedent readings only.
	res, _ = Apply(s, nil, Conditioning{Start: ptr(0), Trend: &Trend{Window: 130}})
	if res.Trend.N != 2 {
		t.Errorf("window: %+v", res.Trend)
	}
	// Depth to water: a typed static depth of 5.00 m and depths 5.00, 5.25
	// give drawdowns 0 and 0.25.
	d := Series{Kind: Depth, Time: []float64{0, 60}, Value: []float64{5.00, 5.25}}
	res, _ = Apply(d, nil, Conditioning{Static: &Static{Typed: true, Value: 5}})
	near(t, "depth drawdown", res.Pumping.Drawdown, []float64{0, 0.25}, 1e-12)
	// Errors: no antecedent readings for a mean or a trend.
	if _, err := Apply(d, nil, Conditioning{Static: &Static{}}); !errors.Is(err, ErrSetting) {
		t.Errorf("static without antecedent: %v", err)
	}
	if _, err := Apply(d, nil, Conditioning{Start: ptr(30), Trend: &Trend{}}); !errors.Is(err, ErrSetting) || !strings.Contains(err.Error(), "1 found") {
		t.Errorf("trend from one reading: %v", err)
	}
}

func TestSplit(t *testing.T) {
	tt := make([]float64, 11)
	v := make([]float64, 11)
	for i := range tt {
		tt[i], v[i] = float64(i), float64(i)
	}
	res, err := Apply(Series{Kind: Level, Time: tt, Value: v}, nil, Conditioning{Start: ptr(3), Stop: ptr(7)})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "antecedent", res.Antecedent.Time, []float64{0, 1, 2}, 0)
	near(t, "antecedent elapsed", res.Antecedent.Elapsed, []float64{-3, -2, -1}, 0)
	near(t, "pumping", res.Pumping.Time, []float64{3, 4, 5, 6, 7}, 0)
	near(t, "pumping elapsed", res.Pumping.Elapsed, []float64{0, 1, 2, 3, 4}, 0)
	near(t, "recovery", res.Recovery.Time, []float64{8, 9, 10}, 0)
	near(t, "recovery elapsed", res.Recovery.Elapsed, []float64{1, 2, 3}, 0)
	if res.Antecedent.Drawdown != nil || res.HasStatic {
		t.Error("drawdown without a static level")
	}
	// Out of order readings are put in order, and said so.
	res, _ = Apply(Series{Kind: Level, Time: []float64{0, 2, 1}, Value: []float64{5, 7, 6}, Row: []int32{2, 3, 4}}, nil, Conditioning{})
	near(t, "sorted", res.Pumping.Level, []float64{5, 6, 7}, 0)
	if res.Sorted != 2 || fmt.Sprint(res.Pumping.Row) != "[2 4 3]" || !strings.Contains(res.Notes[0], "out of time order") {
		t.Errorf("sorted %d rows %v notes %q", res.Sorted, res.Pumping.Row, res.Notes)
	}
}

func TestThinLog(t *testing.T) {
	secs := func(n int) []float64 {
		e := make([]float64, n)
		for i := range e {
			e[i] = float64(i + 1)
		}
		return e
	}
	// Counts from testdata/fielddata/thin_counts.py (exact integer
	// arithmetic, independent of this code). The first is also counted by
	// hand: 1 s to 1000 s every second at 10 per cycle keeps 1, 2, 3, 4,
	// 6, 7, 8 (bins 0, 3, 4, 6, 7, 8, 9 of the first cycle; bins 1, 2 and
	// 5 hold no whole second), one in each of the 20 bins from 10 s to
	// 1000 s, and 1000 s: 7 + 20 + 1 = 28.
	for _, tc := range []struct{ n, per, want int }{
		{1000, 10, 28}, {12400, 20, 72}, {3600, 20, 62}, {86400, 20, 89}, {100, 5, 11},
	} {
		keep := ThinLog(secs(tc.n), tc.per)
		if len(keep) != tc.want || keep[0] != 0 || keep[len(keep)-1] != tc.n-1 {
			t.Errorf("ThinLog(1…%d s, %d) kept %d, want %d (first %d, last %d)", tc.n, tc.per, len(keep), tc.want, keep[0], keep[len(keep)-1])
		}
		for i := 1; i < len(keep); i++ {
			if keep[i] <= keep[i-1] {
				t.Fatalf("indices not increasing: %v", keep)
			}
		}
	}
	if got := ThinLog(secs(1000), 10)[:7]; fmt.Sprint(got) != "[0 1 2 3 5 6 7]" {
		t.Errorf("first cycle kept %v (indices of 1, 2, 3, 4, 6, 7, 8 s)", got)
	}
	// Readings already log-spaced at N per cycle are all kept.
	e := make([]float64, 61)
	for k := range e {
		e[k] = math.Pow(10, float64(k)/20) * 1.0001
	}
	if keep := ThinLog(e, 20); len(keep) != 61 {
		t.Errorf("log-spaced: kept %d of 61", len(keep))
	}
	// Elapsed ≤ 0 is kept; the default is 20 per cycle.
	if keep := ThinLog([]float64{-5, 0, 1, 1.01, 1.02, 1000}, 0); fmt.Sprint(keep) != "[0 1 2 5]" {
		t.Errorf("kept %v", keep)
	}
	if keep := ThinLog(nil, 20); len(keep) != 0 {
		t.Errorf("empty: %v", keep)
	}
	for _, tc := range []struct {
		a, b int
		want string
	}{
		{12400, 143, "12\u00a0400 → 143 readings"}, {1000, 28, "1000 → 28 readings"}, {1234567, 1, "1\u00a0234\u00a0567 → 1 reading"},
	} {
		if got := CountText(tc.a, tc.b); got != tc.want {
			t.Errorf("CountText(%d, %d) = %q, want %q", tc.a, tc.b, got, tc.want)
		}
	}
}

func TestApplyThinning(t *testing.T) {
	n := 4000
	tt := make([]float64, n)
	v := make([]float64, n)
	for i := range tt {
		tt[i] = float64(i - 399) // 399 s before pumping, 1 s to 3600 s of pumping
		v[i] = 10
	}
	res, err := Apply(Series{Kind: Level, Time: tt, Value: v}, nil, Conditioning{Start: ptr(0), Stop: ptr(1800), Thin: &Thinning{}, Static: &Static{}})
	if err != nil {
		t.Fatal(err)
	}
	// Pumping: 0 s (kept, elapsed 0) and 1…1800 s; recovery t′ = 1…1800 s.
	// Each of the 1…1800 s runs keeps as many as 1…1800 s at 20 per cycle;
	// with 0 s one more for pumping.
	k1800 := len(ThinLog(func() []float64 {
		e := make([]float64, 1800)
		for i := range e {
			e[i] = float64(i + 1)
		}
		return e
	}(), 20))
	if res.Pumping.Kept() != k1800+1 || res.Recovery.Kept() != k1800 || res.Antecedent.Keep != nil {
		t.Errorf("kept %d and %d, want %d and %d", res.Pumping.Kept(), res.Recovery.Kept(), k1800+1, k1800)
	}
	if want := CountText(1801+1800, 2*k1800+1); res.ThinSummary() != want {
		t.Errorf("summary %q, want %q", res.ThinSummary(), want)
	}
	th := res.Pumping.Thinned()
	if th.Len() != res.Pumping.Kept() || th.Elapsed[1] != 1 || len(th.Drawdown) != th.Len() {
		t.Errorf("thinned %+v", th)
	}
}

func TestSchedule(t *testing.T) {
	s1, err := NewRateStep(0, 5, "L/s")
	if err != nil || s1.Rate != 0.005 || s1.Unit != "L/s" {
		t.Fatalf("%+v %v", s1, err)
	}
	s2, _ := NewRateStep(3600, 18, "m³/h") // 0.005 m³/s
	s3, _ := NewRateStep(7200, 150, "US gpm")
	if !closeTo(s3.Rate, 150*6.30901964e-5, 1e-12) { // reference §9: 1 gpm = 6.30901964e-5 m³/s
		t.Errorf("gpm: %v", s3.Rate)
	}
	sch := Schedule{s1, s2, s3}
	if err := sch.Check(10800); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ t, q float64 }{{-1, 0}, {0, 0.005}, {3599, 0.005}, {3600, 18.0 / 3600}, {9000, s3.Rate}} {
		if got := sch.RateAt(tc.t); !closeTo(got, tc.q, 1e-15) {
			t.Errorf("RateAt(%v) = %v, want %v", tc.t, got, tc.q)
		}
	}
	for _, tc := range []struct {
		s     Schedule
		dur   float64
		field string
	}{
		{Schedule{{Start: 60, Rate: 1}}, 0, "rates[0].start"},
		{Schedule{{Start: 0, Rate: 1}, {Start: 0, Rate: 2}}, 0, "rates[1].start"},
		{Schedule{{Start: 0, Rate: 1}, {Start: 600, Rate: 2}, {Start: 300, Rate: 3}}, 0, "rates[2].start"},
		{Schedule{{Start: 0, Rate: math.NaN()}}, 0, "rates[0].rate"},
		{Schedule{{Start: 0, Rate: math.Inf(1)}}, 0, "rates[0].rate"},
		{Schedule{{Start: math.NaN(), Rate: 1}}, 0, "rates[0].start"},
		{Schedule{{Start: 0, Rate: 1}, {Start: 4000, Rate: 2}}, 3600, "rates[1].start"},
	} {
		err := tc.s.Check(tc.dur)
		var se *SettingError
		if !errors.As(err, &se) || se.Field != tc.field || !errors.Is(err, ErrSetting) {
			t.Errorf("%+v: %v, want an error in %s", tc.s, err, tc.field)
		}
	}
	if _, err := NewRateStep(0, 5, "m"); !errors.Is(err, ErrSetting) {
		t.Errorf("a rate in metres: %v", err)
	}
	// Through Apply: checked against the stop, and 0 once the pump stopped.
	s := Series{Kind: Level, Time: []float64{0, 10, 20}, Value: []float64{1, 1, 1}}
	res, err := Apply(s, nil, Conditioning{Start: ptr(0), Stop: ptr(15), Rates: Schedule{s1}})
	if err != nil || res.RateAt(10) != 0.005 || res.RateAt(16) != 0 {
		t.Errorf("%v %v", err, res)
	}
	if _, err := Apply(s, nil, Conditioning{Start: ptr(0), Stop: ptr(15), Rates: Schedule{s1, {Start: 20, Rate: 1}}}); !errors.Is(err, ErrSetting) {
		t.Errorf("a step after the stop: %v", err)
	}
}

func TestConditioningSettings(t *testing.T) {
	// The zero value is stored as nothing at all.
	b, _ := json.Marshal(Conditioning{})
	if string(b) != "{}" {
		t.Errorf("zero value stored as %s", b)
	}
	c := Conditioning{Start: ptr(1715666400), Stop: ptr(1715677200), Baro: &BaroCompensation{Record: "FB-3301"},
		Efficiency: &BaroEfficiency{BE: 0.4}, Trend: &Trend{}, Static: &Static{}, Thin: &Thinning{PerCycle: 15},
		Rates: Schedule{{Start: 0, Rate: 0.005, Unit: "L/s"}}}
	b, _ = json.Marshal(c)
	var back Conditioning
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	b2, _ := json.Marshal(back)
	if string(b) != string(b2) {
		t.Errorf("round trip %s → %s", b, b2)
	}
	// Undo a step: clear its field.
	back.Trend = nil
	if b3, _ := json.Marshal(back); strings.Contains(string(b3), "trend") {
		t.Errorf("cleared trend still stored: %s", b3)
	}
	for _, tc := range []struct {
		c     Conditioning
		field string
	}{
		{Conditioning{Start: ptr(math.NaN())}, "start"},
		{Conditioning{Start: ptr(10), Stop: ptr(10)}, "stop"},
		{Conditioning{Efficiency: &BaroEfficiency{BE: 1.2}}, "efficiency.be"},
		{Conditioning{Trend: &Trend{Window: -1}}, "trend.window"},
		{Conditioning{Static: &Static{Typed: true, Value: math.Inf(1)}}, "static.value"},
		{Conditioning{Thin: &Thinning{PerCycle: -3}}, "thin.perCycle"},
		{Conditioning{Baro: &BaroCompensation{Shift: math.NaN()}}, "baro.shift"},
	} {
		var se *SettingError
		if err := tc.c.Check(); !errors.As(err, &se) || se.Field != tc.field {
			t.Errorf("%s: %v", tc.field, err)
		}
	}
	s := Series{Kind: Level, Time: []float64{0, 1}, Value: []float64{1, 1}}
	for _, tc := range []struct {
		name  string
		water Series
		baro  *Series
		c     Conditioning
	}{
		{"no barometer", Series{Kind: Pressure, Time: []float64{0}, Value: []float64{1}}, nil, Conditioning{Baro: &BaroCompensation{}}},
		{"level compensated", s, &Series{Kind: Pressure, Time: []float64{0}, Value: []float64{1}}, Conditioning{Baro: &BaroCompensation{}}},
		{"barometer not a pressure", Series{Kind: Pressure, Time: []float64{0}, Value: []float64{1}}, &s, Conditioning{Baro: &BaroCompensation{}}},
		{"clock and elapsed", Series{Kind: Pressure, Clock: true, Time: []float64{0}, Value: []float64{1}}, &Series{Kind: Pressure, Time: []float64{0}, Value: []float64{1}}, Conditioning{Baro: &BaroCompensation{}}},
	} {
		if _, err := Apply(tc.water, tc.baro, tc.c); !errors.Is(err, ErrSetting) {
			t.Errorf("%s: %v", tc.name, err)
		}
	}
	for _, bad := range []Series{
		{Kind: Level},
		{Kind: Level, Time: []float64{0, 1}, Value: []float64{1}},
		{Kind: Level, Time: []float64{0, math.NaN()}, Value: []float64{1, 1}},
		{Kind: "flow", Time: []float64{0}, Value: []float64{1}},
	} {
		if _, err := Apply(bad, nil, Conditioning{}); !errors.Is(err, ErrSeries) {
			t.Errorf("%+v: %v", bad, err)
		}
	}
}

// TestPressureFixtures runs the whole chain on the fixtures of an unvented
// logger in kPa and a barometric logger in mbar (make_fixtures.py): import,
// compensation, trend removal, static level from the antecedent readings,
// split at the pump's start and stop, thinning. The drawdowns must come
// back as the generator's formula, to the rounding of the files (0.001
// kPa = 0.1 mm of water).
func TestPressureFixtures(t *testing.T) {
	read := func(name string) *Record {
		d, b := sniffed(t, name)
		m := d.Mapping
		m.Time.Zone = "+02:00"
		rec, err := importBytes(b, d.Options, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		return rec
	}
	water, baro := read("pressure-kpa.csv"), read("baro-mbar.csv")
	on := UnixSeconds(time.Date(2024, 5, 14, 8, 0, 0, 0, time.FixedZone("", 7200)))
	off := on + 3*3600
	bs := baro.Series(0)
	c := Conditioning{Start: &on, Stop: &off, Baro: &BaroCompensation{Record: "FB-3301"}, Trend: &Trend{}, Static: &Static{}}
	res, err := Apply(water.Series(0), &bs, c)
	if err != nil {
		t.Fatal(err)
	}
	if res.Antecedent.Len() != 60 || res.Pumping.Len() != 181 || res.Recovery.Len() != 60 || len(res.Notes) != 1 {
		t.Fatalf("segments %d %d %d, notes %q", res.Antecedent.Len(), res.Pumping.Len(), res.Recovery.Len(), res.Notes)
	}
	// The trend of the generator: 0.002 m/h; static 6.500 m above the sensor.
	if !closeTo(res.Trend.Slope, 0.002/3600, 2e-2) || math.Abs(res.Static-6.5) > 2e-4 {
		t.Errorf("trend %+v, static %v", res.Trend, res.Static)
	}
	s := func(t float64) float64 { return 0.8 * math.Log10(1+t/60) }
	for i, e := range res.Pumping.Elapsed {
		if d := res.Pumping.Drawdown[i]; math.Abs(d-s(e)) > 3e-4 {
			t.Errorf("pumping t = %v s: s = %.5f, want %.5f", e, d, s(e))
		}
	}
	for i, e := range res.Recovery.Elapsed {
		want := s(e+10800) - s(e)
		if d := res.Recovery.Drawdown[i]; math.Abs(d-want) > 3e-4 {
			t.Errorf("recovery t′ = %v s: s′ = %.5f, want %.5f", e, d, want)
		}
	}
	for i, d := range res.Antecedent.Drawdown {
		if math.Abs(d) > 3e-4 {
			t.Errorf("antecedent %d: %v", i, d)
		}
	}
	// Undo the compensation: the barometric swing (±1.5 mbar, ±15 mm)
	// comes back into the drawdown.
	c.Baro = nil
	raw, err := Apply(water.Series(0), nil, c)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for i, e := range raw.Pumping.Elapsed {
		worst = math.Max(worst, math.Abs(raw.Pumping.Drawdown[i]-s(e)))
	}
	if worst < 5e-3 {
		t.Errorf("without compensation the drawdown is within %v m of the formula", worst)
	}
}
