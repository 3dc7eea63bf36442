package models_test

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/units"
)

func ExampleHantushW() {
	for _, c := range [][2]float64{{0.01, 0}, {0.01, 0.1}, {0.1, 0.5}, {1e-6, 1}} {
		fmt.Printf("W(%g, %g) = %.6f\n", c[0], c[1], models.HantushW(c[0], c[1]))
	}
	fmt.Printf("2·K0(1) = %.6f\n", 2*models.K0(1))
	// Output:
	// W(0.01, 0) = 4.037930
	// W(0.01, 0.1) = 3.815017
	// W(0.1, 0.5) = 1.442196
	// W(1e-06, 1) = 0.842049
	// 2·K0(1) = 0.842049
}

// leakyWells returns the readings of two invented piezometers, 20 m and
// 70 m from a well pumped at 9 L/s in a leaky aquifer (T = 250 m²/d,
// S = 3e-4, B = 600 m), read at 16 times from 2 min to 1 day, with a small
// fixed error added.
func leakyWells() []models.Well {
	q := 9 * units.LitrePerSecond
	p := []float64{250 * units.SquareMetrePerDay, 3e-4, 600}
	var wells []models.Well
	for k, r := range []float64{20, 70} {
		m := models.Hantush{Q: q, R: r}
		t := make([]float64, 16)
		for i := range t {
			t[i] = 2 * units.Minute * math.Pow(720, float64(i)/15)
		}
		s := make([]float64, len(t))
		m.Eval(s, t, p)
		for i := range s {
			s[i] += 0.003 * math.Sin(float64(3*i+k)) // ±3 mm
		}
		wells = append(wells, models.Well{Name: fmt.Sprintf("PZ-%d", k+1), Model: m, Data: models.Data{Time: t, Value: s}})
	}
	return wells
}

func ExampleFitWells() {
	r, err := models.FitWells(leakyWells(), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	T, _ := r.Estimate("T")
	S, _ := r.Estimate("S")
	B, _ := r.Estimate("B")
	c, _ := models.LeakageResistance(r.Well(0))
	perDay, _ := units.Lookup("m²/d")
	fmt.Printf("T = %.0f m²/d (95 %%: %.0f – %.0f)\n", perDay.FromSI(T.Value), perDay.FromSI(T.Lower), perDay.FromSI(T.Upper))
	fmt.Printf("S = %.2e, B = %.0f m, c = %.0f d\n", S.Value, B.Value, c.Value/units.Day)
	for _, w := range r.Wells {
		fmt.Printf("%s: %d readings, RMSE %.1f mm\n", w.Name, len(w.Used), 1000*w.RMSE)
	}
	// Output:
	// T = 250 m²/d (95 %: 249 – 251)
	// S = 3.00e-04, B = 601 m, c = 1447 d
	// PZ-1: 16 readings, RMSE 2.3 mm
	// PZ-2: 16 readings, RMSE 1.7 mm
}

func ExampleVariableRate() {
	// A test of our own: 6 L/s for 2 h, 10 L/s for 2 h, then the pump
	// stops; Theis drawdown 40 m away (T = 2e-3 m²/s, S = 1e-4).
	steps := []models.RateStep{
		{Start: 0, Rate: 6 * units.LitrePerSecond},
		{Start: 2 * units.Hour, Rate: 10 * units.LitrePerSecond},
		{Start: 4 * units.Hour, Rate: 0},
	}
	m := models.VariableRate{Base: models.Theis{Q: steps[0].Rate, R: 40}, Steps: steps}
	t := []float64{1 * units.Hour, 3 * units.Hour, 5 * units.Hour, 24 * units.Hour}
	s := make([]float64, len(t))
	m.Eval(s, t, []float64{2e-3, 1e-4})
	for i := range t {
		fmt.Printf("t = %2.0f h: s = %.3f m\n", t[i]/units.Hour, s[i])
	}
	// Output:
	// t =  1 h: s = 1.103 m
	// t =  3 h: s = 2.100 m
	// t =  5 h: s = 0.557 m
	// t = 24 h: s = 0.059 m
}

func ExampleJoinRecovery() {
	// Drawdown during 1 day of pumping at 12 L/s and recovery after it,
	// invented readings 30 m away, fitted together by superposition.
	q, tp := 12*units.LitrePerSecond, 1*units.Day
	p := []float64{4e-3, 2e-4}
	pump := models.Data{Time: []float64{60, 600, 3600, 21600, 86400}}
	pump.Value = make([]float64, len(pump.Time))
	models.Theis{Q: q, R: 30}.Eval(pump.Value, pump.Time, p)
	rec := models.Data{Time: []float64{60, 600, 3600, 21600, 86400}}
	rec.Value = make([]float64, len(rec.Time))
	models.TheisRecovery{Q: q, R: 30, PumpTime: tp}.Eval(rec.Value, rec.Time, p)

	d, err := models.JoinRecovery(pump, rec, tp)
	if err != nil {
		fmt.Println(err)
		return
	}
	m := models.VariableRate{Base: models.Theis{Q: q, R: 30}, Steps: models.PumpAndStop(q, tp)}
	r, err := models.Fit(m, d, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d readings; T = %.2e m²/s, S = %.2e\n", len(r.Used), r.Params[0], r.Params[1])
	// Output:
	// 10 readings; T = 4.00e-03 m²/s, S = 2.00e-04
}

func ExampleImageWell() {
	// Theis drawdown 30 m from the pumped well, with a no-flow boundary
	// whose image well is 270 m from the observation well (our scenario).
	m := models.ImageWell{Base: models.Theis{Q: 12 * units.LitrePerSecond, R: 30}, Kind: models.NoFlowBoundary, Image: 270}
	t := []float64{600, 86400}
	s := make([]float64, len(t))
	m.Eval(s, t, []float64{4e-3, 2e-4})
	fmt.Printf("%s\n", m.Name())
	fmt.Printf("s(10 min) = %.3f m, s(1 d) = %.3f m\n", s[0], s[1])
	u := 30.0 * 30 * 2e-4 / (4 * 4e-3 * 86400)
	fmt.Printf("derivative ratio at 1 d: %.2f\n", models.BoundaryDerivativeRatio(models.NoFlowBoundary, u, 270.0/30))
	// Output:
	// Theis (1935) with a no-flow boundary (image well)
	// s(10 min) = 0.839 m, s(1 d) = 2.949 m
	// derivative ratio at 1 d: 1.99
}

func ExampleJacobCorrection() {
	d := models.Data{Time: []float64{600, 3600, 36000}, Value: []float64{0.8, 1.5, 2.6}}
	c, notes, err := models.JacobCorrection(d, 9.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.3f\n", c.Value)
	for _, n := range notes {
		fmt.Println(n)
	}
	// Output:
	// [0.766 1.382 2.244]
	// 1 drawdowns (the first at point 2, the largest 2.6 m) exceed a quarter of the saturated thickness (b/4 = 2.38 m, a threshold of common practice): Jacob's correction is a rough approximation there.
}

func ExampleDistanceDrawdownLine() {
	// Theis drawdown of our scenario (12 L/s, T = 4e-3 m²/s, S = 2e-4) at
	// three invented observation wells, 5 h after pumping started; with
	// real records DrawdownAt reads each well's drawdown at that time.
	q := 12 * units.LitrePerSecond
	r := []float64{8, 25, 60}
	s := make([]float64, len(r))
	for i, ri := range r {
		v := []float64{0}
		models.Theis{Q: q, R: ri}.Eval(v, []float64{5 * units.Hour}, []float64{4e-3, 2e-4})
		s[i] = v[0]
	}
	c, err := models.DistanceDrawdownLine(q, 5*units.Hour, r, s, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Δs = %.3f m per log cycle, r0 = %.0f m\n", c.DeltaS, c.R0)
	fmt.Printf("T = %.2e m²/s, S = %.2e, wells beyond u < %g: %d\n", c.T, c.S, c.UMax, c.Far)
	// Output:
	// Δs = 1.099 m per log cycle, r0 = 902 m
	// T = 4.00e-03 m²/s, S = 1.99e-04, wells beyond u < 0.01: 0
}
