package regime

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"fieldfit/fitcore"
	"fieldfit/models"
)

func seq(n int) []int {
	s := make([]int, n)
	for i := range s {
		s[i] = i
	}
	return s
}

// handResult is a fitted result made by hand: n readings, p parameters
// and the residual sum of squares ssr.
func handResult(n, p int, ssr float64) *models.Result {
	return &models.Result{
		Model:  models.Theis{Q: scQ, R: scR},
		Params: make([]float64, p),
		Used:   seq(n),
		Fit:    &fitcore.Result{N: n, DoF: n - p, SSR: ssr, Status: fitcore.StepConverged},
	}
}

// TestCompareByHand: AICc and Akaike weights worked by hand (the
// arithmetic is below; the logarithms and exponentials were evaluated
// with Python's math module) for three fits of 20 readings:
//
//	A: P = 2, SSR = 0.5 → K = 3, AIC = 20·ln(0.025) + 6 = −67.777589,
//	   AICc = AIC + 2·3·4/16 = −66.277589;
//	B: P = 3, SSR = 0.3 → K = 4, AIC = 20·ln(0.015) + 8 = −75.994102,
//	   AICc = AIC + 2·4·5/15 = −73.327435;
//	C: P = 1, SSR = 1.2 → K = 2, AIC = 20·ln(0.06) + 4 = −52.268214,
//	   AICc = AIC + 2·2·3/17 = −51.562332;
//	Δ = 7.049846 (A), 0 (B), 21.765103 (C);
//	weights e^(−Δ/2)/Σ = 0.028610835, 0.971370920, 1.8245386e-5.
func TestCompareByHand(t *testing.T) {
	tab, err := Compare([]Candidate{
		{Label: "A", Result: handResult(20, 2, 0.5)},
		{Label: "B", Result: handResult(20, 3, 0.3)},
		{Label: "C", Result: handResult(20, 1, 1.2)},
	})
	if err != nil {
		t.Fatal(err)
	}
	want := []struct {
		label                    string
		k                        int
		aic, aicc, delta, weight float64
	}{
		{"B", 4, -75.99410155759854, -73.32743489093187, 0, 0.9713709197161638},
		{"A", 3, -67.77758908227872, -66.27758908227872, 7.049845808653146, 0.028610834897991277},
		{"C", 2, -52.268214335200724, -51.56233198225955, 21.76510290867232, 1.8245385844857433e-05},
	}
	if !tab.Comparable || len(tab.Rows) != 3 {
		t.Fatalf("table %+v", tab)
	}
	for i, w := range want {
		r := tab.Rows[i]
		if r.Label != w.label || r.K != w.k {
			t.Errorf("row %d: %s K=%d, want %s K=%d", i, r.Label, r.K, w.label, w.k)
			continue
		}
		for _, c := range []struct {
			name      string
			got, want float64
		}{{"AIC", r.AIC, w.aic}, {"AICc", r.AICc, w.aicc}, {"ΔAICc", r.DeltaAICc, w.delta}, {"weight", r.Weight, w.weight}} {
			if math.Abs(c.got-c.want) > 1e-12*math.Max(1, math.Abs(c.want)) {
				t.Errorf("%s: %s = %.15g, want %.15g", r.Label, c.name, c.got, c.want)
			}
		}
		if r.Lowest != (i == 0) {
			t.Errorf("%s: lowest %v", r.Label, r.Lowest)
		}
	}
	if !strings.HasPrefix(tab.Summary, "Lowest AICc: B (Akaike weight 0.97). Next: A, ΔAICc = 7.0.") ||
		!strings.Contains(tab.Summary, "stays with you") || strings.Contains(strings.ToLower(tab.Summary), "best") {
		t.Errorf("summary %q", tab.Summary)
	}
	if tab.Caution == "" {
		t.Error("no caution")
	}
}

// TestCompareFits: Theis (1935) and Cooper–Jacob (1946) fitted to the
// scenario's Theis drawdown with 3 mm of seeded noise: the Theis fit has
// the lower AICc and nearly all the weight; the Cooper–Jacob row carries
// its validity warning about the early readings; the estimates come with
// their intervals.
func TestCompareFits(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 9))
	ts := logTimes(60, 30, 1e5)
	d := models.Data{Time: ts, Value: series(ts, func(t float64) float64 { return theis(scQ, scR, scT, scS, t) + 0.003*rng.NormFloat64() })}
	th, err := models.Fit(models.Theis{Q: scQ, R: scR}, d, nil)
	if err != nil {
		t.Fatal(err)
	}
	cj, err := models.Fit(models.CooperJacob{Q: scQ, R: scR}, d, nil)
	if err != nil {
		t.Fatal(err)
	}
	tab, err := Compare([]Candidate{{Result: cj}, {Result: th}})
	if err != nil {
		t.Fatal(err)
	}
	top, next := tab.Rows[0], tab.Rows[1]
	if top.Model != "Theis (1935)" || top.Index != 1 || !top.Lowest || !(top.Weight > 0.99) || !(next.DeltaAICc > 10) {
		t.Errorf("rows %+v / %+v", top, next)
	}
	if next.Invalid == 0 || !strings.Contains(strings.Join(next.Caveats, " "), "validity rule fails") {
		t.Errorf("Cooper–Jacob: %d invalid, caveats %q", next.Invalid, next.Caveats)
	}
	e, ok := th.Estimate("T")
	if len(top.Estimates) != 2 || top.Estimates[0] != e || !ok || !(e.Lower < scT && scT < e.Upper) {
		t.Errorf("Theis estimates %+v", top.Estimates)
	}
	if top.RMSE != th.Fit.RMSE {
		t.Errorf("RMSE %g, fit's %g", top.RMSE, th.Fit.RMSE)
	}
}

// TestCompareNotComparable: fits of different readings are tabulated
// without differences, weights or a lowest row, in input order.
func TestCompareNotComparable(t *testing.T) {
	a, b := handResult(20, 2, 0.5), handResult(15, 2, 0.2)
	tab, err := Compare([]Candidate{{Label: "all", Result: a}, {Label: "late", Result: b}})
	if err != nil {
		t.Fatal(err)
	}
	if tab.Comparable || tab.Rows[0].Label != "all" || !math.IsNaN(tab.Rows[1].Weight) || !math.IsNaN(tab.Rows[0].DeltaAICc) || tab.Rows[0].Lowest || tab.Rows[1].Lowest {
		t.Errorf("table %+v", tab)
	}
	if !strings.Contains(strings.Join(tab.Notes, " "), "different readings") || math.IsNaN(tab.Rows[1].AICc) {
		t.Errorf("notes %q, AICc %g", tab.Notes, tab.Rows[1].AICc)
	}
	// Same N, other readings.
	c := handResult(20, 2, 0.4)
	c.Used[19] = 25
	tab, err = Compare([]Candidate{{Result: a}, {Result: c}})
	if err != nil || tab.Comparable {
		t.Errorf("same N, other readings: comparable %v, %v", tab.Comparable, err)
	}
}

// TestCompareEdges: too few readings for AICc, an exact fit, and bad
// candidates.
func TestCompareEdges(t *testing.T) {
	// N = 4, K = 3: N − K − 1 = 0, no AICc; the other row still gets
	// weight 1.
	tab, err := Compare([]Candidate{{Label: "three", Result: handResult(4, 2, 0.1)}, {Label: "two", Result: handResult(4, 1, 0.2)}})
	if err != nil {
		t.Fatal(err)
	}
	if tab.Rows[0].Label != "two" || tab.Rows[0].Weight != 1 || !math.IsNaN(tab.Rows[1].AICc) || !math.IsNaN(tab.Rows[1].Weight) {
		t.Errorf("rows %+v", tab.Rows)
	}
	if !strings.Contains(strings.Join(tab.Notes, " "), "too few for AICc") {
		t.Errorf("notes %q", tab.Notes)
	}
	tab, err = Compare([]Candidate{{Label: "exact", Result: handResult(10, 2, 0)}})
	if err != nil || !math.IsNaN(tab.Rows[0].AIC) || !strings.Contains(strings.Join(tab.Notes, " "), "fits exactly") {
		t.Errorf("exact fit: %+v, %v", tab, err)
	}
	noFit := handResult(10, 2, 1)
	noFit.Fit = nil
	badN := handResult(10, 2, 1)
	badN.Fit.N = 0
	cases := []struct {
		name  string
		cands []Candidate
		words string
	}{
		{"empty", nil, "no fitted results"},
		{"nil result", []Candidate{{Result: handResult(10, 2, 1)}, {Label: "x", Result: nil}}, "candidate 1 (x)"},
		{"no solver result", []Candidate{{Result: noFit}}, "candidate 0"},
		{"no readings", []Candidate{{Result: badN}}, "N = 0"},
	}
	for _, c := range cases {
		tab, err := Compare(c.cands)
		if tab != nil || !errors.Is(err, ErrCandidate) || !strings.Contains(err.Error(), c.words) {
			t.Errorf("%s: %v, %v; want an error naming %q", c.name, tab, err, c.words)
		}
	}
}
