package fitcore_test

import (
	"fmt"
	"math"

	"fieldfit/fitcore"
)

// ExampleFit fits a first-order decay y = A·e^(−k t) to five readings,
// both parameters positive (fitted in log space), with finite differences.
// The same numbers come from scipy.optimize.curve_fit with
// scipy.stats.t.ppf(0.975, 3).
func ExampleFit() {
	t := []float64{0, 1, 2, 3, 4}
	y := []float64{10.1, 6.0, 3.7, 2.2, 1.4}
	p := &fitcore.Problem{
		N:      len(t),
		Params: []fitcore.Param{{Name: "A", Positive: true}, {Name: "k", Positive: true}},
		Residuals: func(dst, q []float64) {
			for i := range dst {
				dst[i] = q[0]*math.Exp(-q[1]*t[i]) - y[i]
			}
		},
	}
	res, err := fitcore.Fit(p, []float64{5, 1}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(res.Status.Converged())
	for j, par := range p.Params {
		fmt.Printf("%s = %.4f (95%% CI %.4f … %.4f)\n", par.Name, res.Params[j], res.Lower[j], res.Upper[j])
	}
	// Output:
	// true
	// A = 10.0696 (95% CI 9.8777 … 10.2615)
	// k = 0.5049 (95% CI 0.4861 … 0.5236)
}
