package slug_test

import (
	"fmt"
	"math"

	"fieldfit/models"
	"fieldfit/models/slug"
)

// mw3 returns a falling-head test of our own invented well MW-3: 50 mm
// casing, 150 mm borehole, 3 m screen 6 m deep in a 15 m aquifer, a 1 L
// slug, readings every few seconds with a small fixed error.
func mw3() slug.Test {
	g := slug.Geometry{CasingRadius: 0.025, WellRadius: 0.075, ScreenLength: 3, ScreenBottom: 6, AquiferThickness: 15}
	var t, h []float64
	for i := 0; i <= 30; i++ {
		ti := 4 * float64(i)
		t = append(t, ti)
		h = append(h, 0.5*math.Exp(-ti/35)*(1+0.002*math.Sin(float64(7*i))))
	}
	return slug.Test{Geometry: g, Readings: models.Data{Time: t, Value: h}, SlugVolume: 0.001}
}

func ExampleHvorslev() {
	r, err := slug.Hvorslev(mw3(), slug.ScreenLong, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(r.Method, "—", r.Shape)
	fmt.Printf("T0 = %.1f s\n", r.T0.Value)
	for _, k := range r.KIn {
		fmt.Printf("K = %.3g %s (95 %%: %.3g – %.3g)\n", k.Value, k.Unit.Symbol, k.Lower, k.Upper)
	}
	// Output:
	// Hvorslev (1951) — screen in uniform soil, L/R > 8: F = 2πL/ln(L/R)
	// T0 = 35.0 s
	// K = 1.1e-05 m/s (95 %: 1.1e-05 – 1.1e-05)
	// K = 0.949 m/d (95 %: 0.948 – 0.949)
	// K = 3.11 ft/d (95 %: 3.11 – 3.11)
	// K = 0.0011 cm/s (95 %: 0.0011 – 0.0011)
}

func ExampleBouwerRice() {
	// A, B, C as read from the curves of Bouwer & Rice (1976) for
	// Le/r_w = 40 (values invented for the example).
	coef := &slug.Coefficients{A: 2.4, B: 0.37, C: 1.9, Source: "read from the paper's Fig. 3"}
	r, err := slug.BouwerRice(mw3(), coef, &slug.Settings{From: 8})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("ln(Re/rw) = %.3f\n", r.LnReRw)
	fmt.Printf("K = %.3g m/s (95 %%: %.3g – %.3g)\n", r.K.Value, r.K.Lower, r.K.Upper)
	fmt.Println(r.Caution)
	// Output:
	// ln(Re/rw) = 2.814
	// K = 8.38e-06 m/s (95 %: 8.37e-06 – 8.38e-06)
	// Preliminary field interpretation. A submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes.
}

func ExampleCooperBredehoeftPapadopulos() {
	// Readings of our own invention made with the model itself (T =
	// 2e-5 m²/s, S = 1e-4) and a small fixed error.
	g := slug.Geometry{CasingRadius: 0.025, WellRadius: 0.075, ScreenLength: 3, AquiferThickness: 3}
	m := slug.CBP{CasingRadius: g.CasingRadius, WellRadius: g.WellRadius}
	var t []float64
	for i := 0; i < 30; i++ {
		t = append(t, 2*math.Pow(2000, float64(i)/29))
	}
	h := make([]float64, len(t))
	m.Eval(h, t, []float64{2e-5, 1e-4})
	for i := range h {
		h[i] = 0.4 * (h[i] + 0.002*math.Sin(float64(7*i)))
	}
	r, err := slug.CooperBredehoeftPapadopulos(slug.Test{Geometry: g, Readings: models.Data{Time: t, Value: h}, H0: 0.4}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T = %.3g m²/s (95 %%: %.3g – %.3g)\n", r.Transmissivity.Value, r.Transmissivity.Lower, r.Transmissivity.Upper)
	fmt.Printf("S = %.2g\n", r.Storativity.Value)
	fmt.Printf("K = %.3g m/s\n", r.K.Value)
	// Output:
	// T = 2.01e-05 m²/s (95 %: 1.98e-05 – 2.04e-05)
	// S = 9.7e-05
	// K = 6.69e-06 m/s
}

func ExampleResponse() {
	for _, beta := range []float64{0.1, 1, 10} {
		fmt.Printf("F(α = 1e-3, β = %g) = %.6f\n", beta, slug.Response(1e-3, beta))
	}
	// Output:
	// F(α = 1e-3, β = 0.1) = 0.918328
	// F(α = 1e-3, β = 1) = 0.572903
	// F(α = 1e-3, β = 10) = 0.048215
}
