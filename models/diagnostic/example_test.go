package diagnostic_test

import (
	"fmt"
	"math"

	"fieldfit/models/diagnostic"
)

// Drawdown that rises by 0.23 m per log10 cycle of time has the constant
// log-derivative 0.23/ln 10 ≈ 0.1 m; the end points use one-sided
// differences.
func ExampleDerivative() {
	t := []float64{1, 2, 5, 10, 20, 50, 100} // min
	s := make([]float64, len(t))
	for i, ti := range t {
		s[i] = 0.05 + 0.23*math.Log10(ti) // m
	}
	res, err := diagnostic.Derivative(t, s, &diagnostic.Settings{Window: 0.5})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := range t {
		fmt.Printf("t=%3g min  ds/dln t=%.4f m  %v\n", t[i], res.D[i], res.Stencil[i])
	}
	_, err = diagnostic.Derivative([]float64{1, 2, 2, 3}, []float64{0, 1, 2, 3}, nil)
	fmt.Println(err)
	// Output:
	// t=  1 min  ds/dln t=0.0999 m  forward
	// t=  2 min  ds/dln t=0.0999 m  central
	// t=  5 min  ds/dln t=0.0999 m  central
	// t= 10 min  ds/dln t=0.0999 m  central
	// t= 20 min  ds/dln t=0.0999 m  central
	// t= 50 min  ds/dln t=0.0999 m  central
	// t=100 min  ds/dln t=0.0999 m  backward
	// diagnostic: index 2, t = 2: time equals the previous time
}

// The derivative of a fitted curve, sampled for drawing.
func ExampleSampleCurve() {
	c := diagnostic.Curve{
		S:  func(t float64) float64 { return 0.3 * math.Sqrt(t) },
		DS: func(t float64) float64 { return 0.15 / math.Sqrt(t) },
	}
	smp, err := diagnostic.SampleCurve(c, 1, 100, 3)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := range smp.T {
		fmt.Printf("t=%.4g s=%.2f ds/dln t=%.2f\n", smp.T[i], smp.S[i], smp.D[i])
	}
	// Output:
	// t=1 s=0.30 ds/dln t=0.15
	// t=10 s=0.95 ds/dln t=0.47
	// t=100 s=3.00 ds/dln t=1.50
}
