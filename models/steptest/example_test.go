package steptest_test

import (
	"fmt"

	"fieldfit/models"
	"fieldfit/models/steptest"
)

// A four-step test of our own invention at the Larkspur Mill production
// well: 100-minute steps at 4, 8, 12 and 16 L/s, drawdown read by hand.
// The drawdowns at equal duration, Jacob's B and C (fitted with the
// drawdowns' covariance), the efficiency at the planned 10 L/s, the rate
// at which the efficiency falls to 85 %, and the well-condition class of
// C. (The readings were made with the Theis
// solution and a well loss of 3000 s²/m⁵, rounded to the millimetre.)
func Example() {
	steps := []steptest.Step{
		{Start: 0, Rate: 0.004},
		{Start: 6000, Rate: 0.008},
		{Start: 12000, Rate: 0.012},
		{Start: 18000, Rate: 0.016},
	}
	// Minutes after each step's start, and the drawdown (m) read then.
	minutes := []float64{1, 2, 5, 10, 20, 50, 100}
	drawdown := [][]float64{
		{0.887, 0.931, 0.989, 1.033, 1.077, 1.136, 1.180},
		{2.163, 2.208, 2.268, 2.315, 2.365, 2.437, 2.500},
		{3.579, 3.624, 3.686, 3.734, 3.787, 3.867, 3.941},
		{5.117, 5.163, 5.224, 5.274, 5.329, 5.415, 5.498},
	}
	var d models.Data
	for k, st := range steps {
		for j, m := range minutes {
			d.Time = append(d.Time, st.Start+60*m)
			d.Value = append(d.Value, drawdown[k][j])
		}
	}
	a, err := steptest.Analyse(steps, d, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("equal duration Δt = %.0f min\n", a.Duration/60)
	for _, s := range a.Steps {
		fmt.Printf("step %d: Q = %2.0f L/s  Δs = %.3f m  s_w = %.3f m\n", s.Index+1, s.Rate*1000, s.Increment, s.Drawdown)
	}
	f, err := a.Jacob(nil) // generalised least squares with a.DrawdownCov
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range f.Coefficients {
		fmt.Printf("%s = %.4g %s (95%% CI %.4g … %.4g)\n", c.Name, c.Value, c.Unit, c.Lower, c.Upper)
	}
	e, lo, hi := f.Efficiency(0.010)
	fmt.Printf("efficiency at 10 L/s: %.1f %% (%.1f … %.1f %%)\n", 100*e, 100*lo, 100*hi)
	if q, err := f.Law.RateFor(0.85); err == nil {
		fmt.Printf("efficiency 85 %% at %.1f L/s\n", 1000*q)
	}
	if cond, err := f.Condition(); err == nil {
		fmt.Printf("C = %.1f s²/ft⁵: %v\n", cond.CFeet, cond.Class)
	}
	// Output:
	// equal duration Δt = 100 min
	// step 1: Q =  4 L/s  Δs = 1.180 m  s_w = 1.180 m
	// step 2: Q =  8 L/s  Δs = 1.276 m  s_w = 2.456 m
	// step 3: Q = 12 L/s  Δs = 1.371 m  s_w = 3.827 m
	// step 4: Q = 16 L/s  Δs = 1.469 m  s_w = 5.296 m
	// B = 282.9 s/m² (95% CI 282.5 … 283.4)
	// C = 3004 s²/m⁵ (95% CI 2971 … 3038)
	// efficiency at 10 L/s: 90.4 % (90.3 … 90.5 %)
	// efficiency 85 % at 16.6 L/s
	// C = 7.9 s²/ft⁵: mild deterioration
}

// Steps read at the same duration elsewhere (for instance separate tests
// with recovery in between) go straight to the well-loss laws.
func ExampleRorabaugh() {
	pts := []steptest.Point{
		{Rate: 0.01, Drawdown: 2.82},
		{Rate: 0.02, Drawdown: 6.08},
		{Rate: 0.03, Drawdown: 9.80},
		{Rate: 0.04, Drawdown: 14.02},
		{Rate: 0.05, Drawdown: 18.78},
	}
	f, err := steptest.Rorabaugh(pts, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	n, _ := f.Coefficient("n")
	fmt.Printf("B = %.4g s/m², C = %.4g, n = %.2f (95%% CI %.2f … %.2f)\n", f.Law.B, f.Law.C, n.Value, n.Lower, n.Upper)
	fmt.Printf("nonlinear loss at 40 L/s: %.2f m of %.2f m\n", f.Law.NonlinearLoss(0.04), f.Law.Drawdown(0.04))
	// Output:
	// B = 263.7 s/m², C = 3215, n = 2.12 (95% CI 2.04 … 2.20)
	// nonlinear loss at 40 L/s: 3.48 m of 14.03 m
}

// The well-condition class of Jacob's C, with its source.
func ExampleWellCondition() {
	cond, err := steptest.WellCondition(12 * steptest.SecondSquaredPerFootFifth)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(cond)
	// Output:
	// C = 12 s²/ft⁵ lies in the class "severe clogging" (10–40 s²/ft⁵). Classes: Walton (1962), Illinois State Water Survey Bulletin 49 (from memory; guidance only).
}
