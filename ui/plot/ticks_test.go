package plot

import (
	"math"
	"slices"
	"testing"
)

func labels(ticks []Tick) []string {
	var out []string
	for _, t := range ticks {
		if t.Label != "" {
			out = append(out, t.Label)
		}
	}
	return out
}

func values(ticks []Tick, major bool) []float64 {
	var out []float64
	for _, t := range ticks {
		if t.Major == major {
			out = append(out, t.Value)
		}
	}
	return out
}

// TestLogTicks: decades labelled, 2…9 minor ticks between, as on printed
// log paper (common practice); the label forms are our own choice.
func TestLogTicks(t *testing.T) {
	cases := []struct {
		lo, hi float64
		major  []float64
		labels []string
		minors int
	}{
		{0.7, 3000, []float64{1, 10, 100, 1000}, []string{"1", "10", "100", "1000"}, 3 + 8*3 + 2},
		{1, 10, []float64{1, 10}, []string{"1", "10"}, 8},
		{0.5, 5000, []float64{1, 10, 100, 1000}, []string{"1", "10", "100", "1000"}, 5 + 8*3 + 4},
		{0.0001, 0.01, []float64{0.0001, 0.001, 0.01}, []string{"0.0001", "0.001", "0.01"}, 16},
		{1, 1e5, nil, []string{"1", "10", "100", "1000", "10000", "100000"}, 40},
		{1, 1e6, nil, []string{"10⁰", "10¹", "10²", "10³", "10⁴", "10⁵", "10⁶"}, 48},
		{2e-7, 3e6, nil, []string{"10⁻⁶", "10⁻⁵", "10⁻⁴", "10⁻³", "10⁻²", "10⁻¹", "10⁰", "10¹", "10²", "10³", "10⁴", "10⁵", "10⁶"}, -1},
		// One decade in range: 2 and 5 are labelled too.
		{0.05, 0.5, []float64{0.1}, []string{"0.05", "0.1", "0.2", "0.5"}, -1},
		// No decade: 2 and 5.
		{1.5, 8, nil, []string{"2", "5"}, 7},
		// Not even 2 or 5: every minor tick.
		{3, 4.5, nil, []string{"3", "4"}, 2},
		{2.1e7, 4.4e7, nil, []string{"3×10⁷", "4×10⁷"}, 2},
	}
	for _, c := range cases {
		ticks := LogTicks(c.lo, c.hi)
		if c.major != nil && !slices.Equal(values(ticks, true), c.major) {
			t.Errorf("LogTicks(%g, %g) majors %v, want %v", c.lo, c.hi, values(ticks, true), c.major)
		}
		if got := labels(ticks); !slices.Equal(got, c.labels) {
			t.Errorf("LogTicks(%g, %g) labels %q, want %q", c.lo, c.hi, got, c.labels)
		}
		if c.minors >= 0 {
			if got := len(values(ticks, false)); got != c.minors {
				t.Errorf("LogTicks(%g, %g): %d minor ticks, want %d", c.lo, c.hi, got, c.minors)
			}
		}
		for i, tk := range ticks {
			if tk.Value < c.lo*(1-1e-9) || tk.Value > c.hi*(1+1e-9) {
				t.Errorf("LogTicks(%g, %g): tick %g outside the range", c.lo, c.hi, tk.Value)
			}
			if i > 0 && !(tk.Value > ticks[i-1].Value) {
				t.Errorf("LogTicks(%g, %g): ticks not increasing at %d", c.lo, c.hi, i)
			}
		}
	}
	// Minor ticks are exactly m × 10ᵏ.
	for _, tk := range LogTicks(0.7, 3000) {
		if tk.Value == 0.8 || tk.Value == 30 || tk.Value == 0.9 {
			continue
		}
		m := tk.Value / math.Pow(10, math.Floor(math.Log10(tk.Value)+1e-12))
		if math.Abs(m-math.Round(m)) > 1e-12 {
			t.Errorf("tick %v is not m × 10ᵏ", tk.Value)
		}
	}
	// A range too narrow for any m × 10ᵏ falls back to linear ticks.
	if got := labels(LogTicks(3.1, 3.9)); !slices.Equal(got, []string{"3.2", "3.4", "3.6", "3.8"}) {
		t.Errorf("LogTicks(3.1, 3.9) labels %q", got)
	}
	for _, bad := range [][2]float64{{0, 10}, {-1, 10}, {10, 1}, {5, 5}, {1, math.Inf(1)}, {math.NaN(), 1}} {
		if got := LogTicks(bad[0], bad[1]); got != nil {
			t.Errorf("LogTicks(%g, %g) = %v, want nil", bad[0], bad[1], got)
		}
	}
}

// TestLinearTicks: steps of 1, 2 or 5 × 10ᵏ nearest to range/n (Heckbert
// 1990, "Nice numbers for graph labels", Graphics Gems — from memory; the
// expected labels are worked by hand).
func TestLinearTicks(t *testing.T) {
	cases := []struct {
		lo, hi float64
		n      int
		labels []string
	}{
		{0, 10, 5, []string{"0", "2", "4", "6", "8", "10"}},
		{0, 3000, 5, []string{"0", "500", "1000", "1500", "2000", "2500", "3000"}},
		{-0.5, 2, 4, []string{"−0.5", "0.0", "0.5", "1.0", "1.5", "2.0"}},
		{-0.031, 0.029, 3, []string{"−0.02", "0.00", "0.02"}},
		{0.1, 0.4, 3, []string{"0.1", "0.2", "0.3", "0.4"}},
		{1e7, 5e7, 4, []string{"10⁷", "2×10⁷", "3×10⁷", "4×10⁷", "5×10⁷"}},
		{0, 3e-7, 3, []string{"0", "10⁻⁷", "2×10⁻⁷", "3×10⁻⁷"}},
		{99.2, 100.9, 4, []string{"99.5", "100.0", "100.5"}},
	}
	for _, c := range cases {
		ticks := LinearTicks(c.lo, c.hi, c.n)
		if got := labels(ticks); !slices.Equal(got, c.labels) {
			t.Errorf("LinearTicks(%g, %g, %d) labels %q, want %q", c.lo, c.hi, c.n, got, c.labels)
		}
		for _, tk := range ticks {
			if !tk.Major {
				t.Errorf("LinearTicks(%g, %g): minor tick %v", c.lo, c.hi, tk)
			}
		}
	}
	// Tick values are exact decimal steps, not accumulated sums.
	for _, tk := range LinearTicks(0, 1, 10) {
		want := math.Round(tk.Value*10) / 10
		if tk.Value != want {
			t.Errorf("tick %v, want %v", tk.Value, want)
		}
	}
	for _, bad := range [][2]float64{{1, 1}, {2, 1}, {math.Inf(-1), 1}, {math.NaN(), 1}, {1e300, 1.0000000000000002e300}} {
		if got := LinearTicks(bad[0], bad[1], 5); got != nil {
			t.Errorf("LinearTicks(%g, %g) = %v, want nil", bad[0], bad[1], got)
		}
	}
}

func TestNiceStep(t *testing.T) {
	for _, c := range []struct{ raw, want float64 }{
		{0.475, 0.5}, {0.625, 0.5}, {1.4, 1}, {1.6, 2}, {2.9, 2}, {3.1, 5}, {6.9, 5}, {7.1, 10}, {120, 100}, {0.0031, 0.005},
	} {
		if got := niceStep(c.raw); math.Abs(got-c.want) > 1e-15*c.want {
			t.Errorf("niceStep(%g) = %g, want %g", c.raw, got, c.want)
		}
	}
}

func TestAutoRange(t *testing.T) {
	cases := []struct {
		lo, hi float64
		ok     bool
		log    bool
		px     float64
		a, b   float64
	}{
		{0.7, 3000, true, true, 600, 0.5, 5000},
		{0.0012, 2.1, true, true, 600, 0.001, 5},
		{1, 10, true, true, 600, 1, 10},
		{3, 3, true, true, 600, 1, 10}, // one value: ×/÷ 2, then 1-2-5
		{0, 0, false, true, 600, 1, 10},
		{0, 0, false, false, 600, 0, 1},
		{-0.03, 1.9, true, false, 340, -0.5, 2}, // 6 intervals aimed at: steps of 0.5
		{0.02, 1.9, true, false, 340, 0, 2},
		{5, 5, true, false, 240, 4.4, 5.6}, // ±10 %, 4 intervals: steps of 0.2
		{0, 0, true, false, 240, -1, 1},
		{-0.012, 0.012, true, false, 190, -0.02, 0.02}, // 3 intervals: steps of 0.01
	}
	for _, c := range cases {
		a, b := autoRange(c.lo, c.hi, c.ok, c.log, c.px, false)
		if math.Abs(a-c.a) > 1e-12*math.Abs(c.a) || math.Abs(b-c.b) > 1e-12*math.Abs(c.b) {
			t.Errorf("autoRange(%g, %g, log %v) = %g, %g, want %g, %g", c.lo, c.hi, c.log, a, b, c.a, c.b)
		}
	}
}
