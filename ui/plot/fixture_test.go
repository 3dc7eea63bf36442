package plot

import "math"

// Test charts of our own invented scenario: a pumping test at "Alder Lane"
// with an observation well B2 at 18 m. The drawdowns follow the Theis
// curve with a small deterministic ripple; they are drawing fixtures, not
// reference values.

// caution is the notice every results view carries.
const caution = "Preliminary field interpretation. A submission to a regulator must be prepared or reviewed by a licensed hydrogeologist and follow local rules."

// wellFn is the Theis well function W(u) = E1(u) by its power series (DLMF
// §6.6.2), accurate enough for drawing fixtures at u ≤ 5.
func wellFn(u float64) float64 {
	const gamma = 0.57721566490153286
	sum, term := 0.0, 1.0
	for k := 1; k < 80; k++ {
		term *= -u / float64(k)
		sum += term / float64(k)
	}
	return -gamma - math.Log(u) - sum
}

// Alder Lane scenario in the chart units: t in min, s in m.
const (
	fxA  = 0.32 // Q/(4πT), m
	fxU0 = 1.6  // u·t, min
)

func fxDrawdown(t float64) float64   { return fxA * wellFn(fxU0/t) }
func fxDerivative(t float64) float64 { return fxA * math.Exp(-fxU0/t) }

func fxTimes(n int, t0, t1 float64) []float64 {
	t := make([]float64, n)
	for i := range t {
		t[i] = t0 * math.Pow(t1/t0, float64(i)/float64(n-1))
	}
	return t
}

// logLogChart is the diagnostic chart: drawdown and derivative with the
// fitted curves, the band and the fit window; one reading is missing and
// one time is zero.
func logLogChart() *Chart {
	t := fxTimes(34, 0.5, 1500)
	s := make([]float64, len(t))
	d := make([]float64, len(t))
	used := make([]bool, len(t))
	for i, ti := range t {
		s[i] = fxDrawdown(ti) * (1 + 0.03*math.Sin(2.7*float64(i)))
		d[i] = fxDerivative(ti) * (1 + 0.08*math.Sin(1.9*float64(i)+1))
		used[i] = ti >= 3 && ti <= 900
	}
	s[12] = math.NaN() // a reading that could not be taken
	t = append([]float64{0}, t...)
	s = append([]float64{0}, s...)
	d = append([]float64{0}, d...)
	used = append([]bool{false}, used...)

	tc := fxTimes(60, 0.4, 2000)
	sc := make([]float64, len(tc))
	dc := make([]float64, len(tc))
	lo := make([]float64, len(tc))
	hi := make([]float64, len(tc))
	for i, ti := range tc {
		sc[i] = fxDrawdown(ti)
		dc[i] = fxDerivative(ti)
		lo[i] = sc[i] * 0.85
		hi[i] = sc[i] * 1.15
	}
	return &Chart{
		Title: "Alder Lane pumping test — observation well B2 (r = 18 m)",
		X:     Axis{Label: "time since pumping started (min)", Log: true},
		Y:     Axis{Label: "drawdown and derivative (m)", Log: true},
		Series: []Series{
			{Name: "drawdown", Kind: Points, X: t, Y: s, Used: used},
			{Name: "Theis fit", Kind: Line, X: tc, Y: sc},
			{Name: "derivative ds/d ln t", Kind: Points, X: t, Y: d, Used: used},
			{Name: "fit derivative", Kind: Line, X: tc, Y: dc},
			{Name: "95 % band of the fit", Kind: Band, X: tc, Y: lo, Y2: hi},
		},
		Window: &[2]float64{3, 900},
		Notes:  []string{caution},
	}
}

// semilogChart is drawdown against log time with a Cooper–Jacob line.
func semilogChart() *Chart {
	t := fxTimes(30, 1, 1000)
	s := make([]float64, len(t))
	for i, ti := range t {
		s[i] = fxDrawdown(ti) + 0.01*math.Sin(3.1*float64(i))
	}
	// Cooper–Jacob line s = A·(ln(t/u0) − γ) through two end points.
	cj := func(t float64) float64 { return fxA * (math.Log(t/fxU0) - 0.5772156649) }
	return &Chart{
		Width: 900, Height: 560,
		X: Axis{Label: "time since pumping started (min)", Log: true},
		Y: Axis{Label: "drawdown (m)", Invert: true},
		Series: []Series{
			{Name: "drawdown B2", Kind: Points, X: t, Y: s, Style: Style{Marker: Square}},
			{Name: "Cooper–Jacob line", Kind: Line, X: []float64{2, 1000}, Y: []float64{cj(2), cj(1000)}},
		},
		Window: &[2]float64{20, 1000},
		Notes:  []string{caution},
	}
}
