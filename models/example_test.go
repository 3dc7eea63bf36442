package models_test

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/units"
)

func ExampleE1() {
	for _, u := range []float64{1e-5, 0.01, 1, 5} {
		fmt.Printf("W(%g) = %.9f\n", u, models.E1(u))
	}
	// Output:
	// W(1e-05) = 10.935719800
	// W(0.01) = 4.037929577
	// W(1) = 0.219383934
	// W(5) = 0.001148296
}

// readings returns the drawdowns of an invented observation well, 30 m
// from a well pumped at 12 L/s (T = 4.0e-3 m²/s, S = 2e-4), read at 20
// log-spaced times from 1 min to 2 days, with a small fixed error added.
func readings() models.Data {
	m := models.Theis{Q: 12 * units.LitrePerSecond, R: 30}
	t := make([]float64, 20)
	for i := range t {
		t[i] = 60 * math.Pow(2880, float64(i)/19)
	}
	s := make([]float64, len(t))
	m.Eval(s, t, []float64{4.0e-3, 2e-4})
	for i := range s {
		s[i] += 0.004 * math.Sin(float64(5*i)) // ±4 mm
	}
	return models.Data{Time: t, Value: s}
}

func ExampleFit() {
	m := models.Theis{Q: 12 * units.LitrePerSecond, R: 30}
	r, err := models.Fit(m, readings(), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	T, _ := r.Estimate("T")
	S, _ := r.Estimate("S")
	perDay, _ := units.Lookup("m²/d")
	fmt.Printf("%s, converged: %v\n", m.Name(), r.Fit.Status.Converged())
	fmt.Printf("T = %.1f m²/d (95 %%: %.1f – %.1f)\n", perDay.FromSI(T.Value), perDay.FromSI(T.Lower), perDay.FromSI(T.Upper))
	fmt.Printf("S = %.3g (95 %%: %.3g – %.3g)\n", S.Value, S.Lower, S.Upper)
	// Output:
	// Theis (1935), converged: true
	// T = 345.3 m²/d (95 %: 344.4 – 346.2)
	// S = 0.000201 (95 %: 0.000198 – 0.000203)
}

func ExampleResult_Band() {
	m := models.Theis{Q: 12 * units.LitrePerSecond, R: 30}
	r, err := models.Fit(m, readings(), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	curve, lo, hi := r.Band([]float64{3600, 86400})
	for i := range curve {
		fmt.Printf("s = %.3f m (95 %% band %.3f – %.3f)\n", curve[i], lo[i], hi[i])
	}
	// Output:
	// s = 1.240 m (95 % band 1.239 – 1.241)
	// s = 1.999 m (95 % band 1.996 – 2.001)
}

func ExampleCooperJacobLine() {
	d := readings()
	c, err := models.CooperJacobLine(12*units.LitrePerSecond, 30, d, &models.LineSettings{From: 4 * units.Hour})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Δs = %.3f m per log cycle, t0 = %.1f s\n", c.DeltaS, c.T0)
	fmt.Printf("T = %.2e m²/s ± %.1e, S = %.2e ± %.1e\n", c.T, c.TErr, c.S, c.SErr)
	fmt.Printf("u < %g from t = %.0f s; %d early points\n", c.UMax, c.TimeValid, c.Early)
	// Output:
	// Δs = 0.552 m per log cycle, t0 = 20.7 s
	// T = 3.98e-03 m²/s ± 3.1e-05, S = 2.06e-04 ± 1.1e-05
	// u < 0.01 from t = 1166 s; 0 early points
}

func ExampleTheisRecoveryLine() {
	// Residual drawdown 10 min after a 2-day pumping test of our own
	// scenario, by the full Theis recovery model and by its straight line.
	q, T, S, r := 12*units.LitrePerSecond, 4.0e-3, 2e-4, 30.0
	tp, tr := 2*units.Day, 10*units.Minute
	m := models.TheisRecovery{Q: q, R: r, PumpTime: tp}
	s := make([]float64, 1)
	m.Eval(s, []float64{tr}, []float64{T, S})
	fmt.Printf("s′ = %.4f m (line %.4f m)\n", s[0], models.TheisRecoveryLine(q, T, tp, tr))
	fmt.Printf("Agarwal equivalent time %.1f s\n", models.AgarwalTime(tp, tr))
	// Output:
	// s′ = 1.3483 m (line 1.3528 m)
	// Agarwal equivalent time 597.9 s
}
