package regime

import (
	"errors"
	"math"
	"strings"
	"testing"

	"fieldfit/models/diagnostic"
)

// TestCanStopTheis: for the scenario's Theis drawdown read to 10⁵ s the
// derivative Q/(4πT)·e^(−u) has been flat within ±10 % since it came
// within the band of its last value: e^(−u₁) = (0.9/1.1)·e^(−u_last), so
// u₁ = u_last − ln(0.9/1.1) (analytic); t₁ = r²S/(4T·u₁) = 39.3 s, give or
// take the readings' spacing and the derivative's smoothing.
func TestCanStopTheis(t *testing.T) {
	ts := logTimes(81, 10, 1e5)
	s := series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) })
	st, err := CanStop(ts, s, nil)
	if err != nil {
		t.Fatal(err)
	}
	b := scR * scR * scS / (4 * scT)
	u1 := b/ts[len(ts)-1] - math.Log(0.9/1.1)
	t1 := b / u1
	if !st.Flat || st.Since < t1/1.2 || st.Since > t1*1.2 {
		t.Errorf("flat %v since %g s, want since about %.4g s", st.Flat, st.Since, t1)
	}
	if math.Abs(st.Cycles-math.Log10(1e5/st.Since)) > 1e-12 || st.OneCycleAt != 10*st.Since || st.Remaining > 0 {
		t.Errorf("cycles %g, one cycle at %g, remaining %g", st.Cycles, st.OneCycleAt, st.Remaining)
	}
	if !strings.HasPrefix(st.Text, "flat since ") || !strings.Contains(st.Text, "log cycles)") || !strings.Contains(st.Text, "was reached") {
		t.Errorf("text %q", st.Text)
	}
	t.Log(st.Text)
}

// TestCanStopCases: the indicator while readings come in (our own
// scenario): early readings, a jump at the last reading, a flat stretch not yet half a cycle long, one
// between half a cycle and a full cycle, a falling drawdown, and too few
// readings.
func TestCanStopCases(t *testing.T) {
	const a, b = 0.3, 0.1 // s = a + b·ln t: derivative exactly b (analytic)
	line := func(t float64) float64 { return a + b*math.Log(t) }
	theisAt := func(t float64) float64 { return theis(scQ, scR, scT, scS, t) }
	cases := []struct {
		name     string
		ts       []float64
		f        func(float64) float64
		flat     bool
		prefix   string
		words    []string
		since    float64
		tolSince float64
	}{
		// Theis to 30 s: u_last = 0.26, so the band is entered at
		// u₁ = 0.26 + 0.2007, t₁ = 16.9 s (analytic, as above).
		{"early Theis", logTimes(21, 1, 30), theisAt, false, "not yet: ", []string{"only since", "0.5 needed"}, 16.9, 0.2},
		{"jump at the last reading", logTimes(21, 1, 100), func(t float64) float64 {
			if t == 100 {
				return line(t) + 0.5
			}
			return line(t)
		}, false, "not yet: ", []string{"still changing"}, 100, 1e-12},
		{"short flat stretch", logTimes(13, 100, 200), line, false, "not yet: ", []string{"only since 100 s", "0.3 of a log cycle; 0.5 needed", "316.2 s", "1000 s"}, 100, 1e-12},
		{"flat for 0.7 cycle", logTimes(15, 100, 500), line, true, "flat since 100 s (0.7 of a log cycle)", []string{"reached at 1000 s, in 500 s"}, 100, 1e-12},
		{"flat for 2 cycles", logTimes(21, 100, 1e4), line, true, "flat since 100 s (2.0 log cycles)", []string{"was reached at 1000 s"}, 100, 1e-12},
		{"drawdown falling", logTimes(10, 1, 10), func(t float64) float64 { return 1 / t }, false, "not yet: ", []string{"not positive"}, math.NaN(), 0},
		{"two readings", []float64{1, 2}, line, false, "not yet: 2 reading(s)", nil, math.NaN(), 0},
		{"no readings", nil, line, false, "not yet: 0 reading(s)", nil, math.NaN(), 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			st, err := CanStop(c.ts, series(c.ts, c.f), nil)
			if err != nil {
				t.Fatal(err)
			}
			if st.Flat != c.flat || !strings.HasPrefix(st.Text, c.prefix) {
				t.Errorf("flat %v, text %q; want %v, %q…", st.Flat, st.Text, c.flat, c.prefix)
			}
			for _, w := range c.words {
				if !strings.Contains(st.Text, w) {
					t.Errorf("text %q lacks %q", st.Text, w)
				}
			}
			if math.IsNaN(c.since) != math.IsNaN(st.Since) || !math.IsNaN(c.since) && math.Abs(st.Since-c.since) > c.tolSince*c.since {
				t.Errorf("since %g, want %g", st.Since, c.since)
			}
			t.Log(st.Text)
		})
	}
}

// TestCanStopSettings: a tighter tolerance and a longer span change the
// verdict; bad settings and readings are errors naming the field or index.
func TestCanStopSettings(t *testing.T) {
	ts := logTimes(41, 10, 1e4)
	s := series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) })
	loose, err := CanStop(ts, s, nil)
	if err != nil {
		t.Fatal(err)
	}
	tight, err := CanStop(ts, s, &StopSettings{Tolerance: 0.01})
	if err != nil {
		t.Fatal(err)
	}
	if !(tight.Since > loose.Since) {
		t.Errorf("±1 %% flat since %g, ±10 %% since %g", tight.Since, loose.Since)
	}
	long, err := CanStop(ts, s, &StopSettings{Cycles: 3})
	if err != nil {
		t.Fatal(err)
	}
	if long.Flat || long.Since != loose.Since {
		t.Errorf("3 cycles: flat %v since %g", long.Flat, long.Since)
	}
	bad := []struct {
		set   *StopSettings
		t, s  []float64
		err   error
		words string
	}{
		{&StopSettings{Tolerance: -0.1}, ts, s, ErrSetting, "Tolerance = -0.1"},
		{&StopSettings{Cycles: math.Inf(1)}, ts, s, ErrSetting, "Cycles = +Inf"},
		{&StopSettings{MinPoints: 1}, ts, s, ErrSetting, "MinPoints = 1"},
		{&StopSettings{Window: math.NaN()}, ts, s, ErrSetting, "Window = NaN"},
		{nil, []float64{3, 2, 1}, []float64{1, 2, 3}, diagnostic.ErrUnsorted, "index 1"},
		{nil, []float64{1, 2}, []float64{1}, diagnostic.ErrLength, "len(s)"},
		{nil, []float64{0, 1, 2}, []float64{1, 2, 3}, diagnostic.ErrNonPositiveTime, "index 0"},
	}
	for _, c := range bad {
		st, err := CanStop(c.t, c.s, c.set)
		if st != nil || !errors.Is(err, c.err) || !strings.Contains(err.Error(), c.words) {
			t.Errorf("%+v: %v, %v; want %v naming %q", c.set, st, err, c.err, c.words)
		}
	}
}
