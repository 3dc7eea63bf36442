package decay_test

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/decay"
)

func ExampleFit() {
	// Our own invented tracer test: electrical conductivity in the Hollins
	// Beck observation well after a salt slug, read every 2 min.
	var d models.Data
	for i := 0; i <= 60; i++ {
		t := 2 * float64(i)
		d.Time = append(d.Time, t)
		d.Value = append(d.Value, 1.4+7.8*math.Exp(-0.045*t)+0.02*math.Sin(float64(3*i)))
	}
	r, err := decay.Fit(d, &decay.Settings{ValueUnit: "mS/cm", TimeUnit: "min"})
	if err != nil {
		fmt.Println(err)
		return
	}
	k, h := r.Rates[0], r.HalfLives[0]
	fmt.Printf("k = %.4f 1/%s (95 %%: %.4f – %.4f)\n", k.Value, r.TimeUnit, k.Lower, k.Upper)
	fmt.Printf("half-life = %.2f %s (95 %%: %.2f – %.2f)\n", h.Value, r.TimeUnit, h.Lower, h.Upper)
	fmt.Printf("y0 = %.3f %s, baseline = %.3f %s\n", r.Y0.Value, r.ValueUnit, r.Baseline.Value, r.ValueUnit)
	// Output:
	// k = 0.0450 1/min (95 %: 0.0448 – 0.0452)
	// half-life = 15.41 min (95 %: 15.34 – 15.47)
	// y0 = 9.200 mS/cm, baseline = 1.400 mS/cm
}
