package regime_test

import (
	"fmt"
	"math"
	"math/rand/v2"

	"fieldfit/models"
	"fieldfit/models/regime"
)

// theis is the drawdown of our own invented test at the Harrow Bend
// wellfield: 10 L/s pumped, observation well 25 m away, T = 3e-3 m²/s,
// S = 1.5e-4 (Theis 1935).
func theis(t float64) float64 { return theisAt(25, t) }

func theisAt(r, t float64) float64 {
	const q, T, S = 0.01, 3e-3, 1.5e-4
	return q / (4 * math.Pi * T) * models.E1(r*r*S/(4*T*t))
}

// bounded adds a straight no-flow boundary whose image well lies 500 m
// from the observation well (Theis 1935 superposed in space).
func bounded(t float64) float64 { return theis(t) + theisAt(500, t) }

func logTimes(n int, a, b float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

// The hints for a test near a no-flow boundary that ran for eleven days,
// 16 readings per log cycle. The boundary keeps the derivative from quite
// reaching Q/(4πT), so the T of the flat stretch is 3 % high.
func ExampleDiagnose() {
	ts := logTimes(81, 10, 1e6)
	s := make([]float64, len(ts))
	for i, t := range ts {
		s[i] = bounded(t)
	}
	dg, err := regime.Diagnose(ts, s, &regime.Settings{Rate: 0.01})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, h := range dg.Hints {
		fmt.Printf("%v, %.4g s to %.4g s\n", h.Kind, h.From, h.To)
		fmt.Println(h.Text)
	}
	// Output:
	// flat derivative, 42.17 s to 749.9 s
	// Possible infinite-acting radial flow: from 42.17 s to 749.9 s (1.2 log cycles) the derivative stays within a ±10 % band (0.2199 to 0.2673 m), its flatter half at 0.2577 m; with Q = 0.01 m³/s this implies T = Q/(4π·ds/d ln t) = 3.088e-03 m²/s.
	// doubling derivative, 866 s to 1e+06 s
	// Possible no-flow boundary: after the flat stretch at 0.2577 m, from 866 s to 1e+06 s the derivative rises and settles at 0.5277 m, 2.05 times that level; one straight no-flow boundary doubles it.
}

// The indicator as readings come in: after 1, 5 and 40 minutes.
func ExampleCanStop() {
	ts := logTimes(61, 10, 1e4) // s
	for _, upTo := range []float64{60, 300, 2400} {
		var t, s []float64
		for _, ti := range ts {
			if ti <= upTo {
				t = append(t, ti)
				s = append(s, theis(ti))
			}
		}
		st, err := regime.CanStop(t, s, nil)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("after %.0f s: %s\n", t[len(t)-1], st.Text)
	}
	// Output:
	// after 56 s: not yet: the derivative has been within a ±10 % band (0.1867 to 0.2269 m) only since 22.39 s (0.4 of a log cycle; 0.5 needed); if it stays so, that is reached at 70.79 s, one full log cycle at 223.9 s.
	// after 282 s: flat since 35.48 s (0.9 of a log cycle), within a ±10 % band (0.2125 to 0.2571 m): one full log cycle from 35.48 s is reached at 354.8 s, in 72.98 s.
	// after 2239 s: flat since 39.81 s (1.8 log cycles), within a ±10 % band (0.2177 to 0.2642 m): one full log cycle of flat derivative was reached at 398.1 s.
}

// Two models fitted to the same readings (with 3 mm of seeded noise),
// side by side.
func ExampleCompare() {
	rng := rand.New(rand.NewPCG(1, 2))
	ts := logTimes(40, 30, 1e5)
	d := models.Data{Time: ts, Value: make([]float64, len(ts))}
	for i, t := range ts {
		d.Value[i] = theis(t) + 0.003*rng.NormFloat64()
	}
	var cands []regime.Candidate
	for _, m := range []models.Model{models.Theis{Q: 0.01, R: 25}, models.CooperJacob{Q: 0.01, R: 25}} {
		r, err := models.Fit(m, d, nil)
		if err != nil {
			fmt.Println(err)
			return
		}
		cands = append(cands, regime.Candidate{Result: r})
	}
	tab, err := regime.Compare(cands)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range tab.Rows {
		T := r.Estimates[0]
		fmt.Printf("%-20s RMSE %.3f m  AICc %7.1f  ΔAICc %5.1f  weight %.2f  T = %.2e (%.2e … %.2e) m²/s  %d readings outside validity\n",
			r.Label, r.RMSE, r.AICc, r.DeltaAICc, r.Weight, T.Value, T.Lower, T.Upper, r.Invalid)
	}
	fmt.Println(tab.Summary)
	// Output:
	// Theis (1935)         RMSE 0.003 m  AICc  -453.2  ΔAICc   0.0  weight 1.00  T = 3.00e-03 (2.99e-03 … 3.00e-03) m²/s  0 readings outside validity
	// Cooper–Jacob (1946)  RMSE 0.011 m  AICc  -356.1  ΔAICc  97.1  weight 0.00  T = 3.05e-03 (3.04e-03 … 3.07e-03) m²/s  16 readings outside validity
	// Lowest AICc: Theis (1935) (Akaike weight 1.00). Next: Cooper–Jacob (1946), ΔAICc = 97.1. The choice of model stays with you: weigh the residuals, the derivative plot and the validity warnings too.
}
