package regime

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"fieldfit/models"
)

// Candidate is one fitted model offered to Compare.
type Candidate struct {
	// Label names the candidate in the table; empty means the model's
	// name (Result.Model.Name()).
	Label string
	// Result is the fit, from models.Fit.
	Result *models.Result
}

// Row is one line of the comparison table.
type Row struct {
	// Index is the candidate's position in the input; Label its label and
	// Model the model's name.
	Index        int
	Label, Model string
	// N is the number of readings fitted, P the number of fitted
	// parameters and K = P + 1 the number counted by the criterion (the
	// parameters and the residual variance).
	N, P, K int
	// SSR is the (weighted) residual sum of squares and RMSE = √(SSR/N).
	SSR, RMSE float64
	// AIC = N·ln(SSR/N) + 2K and AICc = AIC + 2K(K + 1)/(N − K − 1);
	// AICc is NaN when N ≤ K + 1 and both are NaN when SSR = 0.
	AIC, AICc float64
	// DeltaAICc = AICc − the lowest AICc of the table, and Weight the
	// Akaike weight exp(−Δ/2)/Σ exp(−Δⱼ/2); NaN when the fits cannot be
	// compared (Table.Comparable) or this row's AICc is NaN.
	DeltaAICc, Weight float64
	// Lowest marks the row with the lowest AICc (at most one row).
	Lowest bool
	// Estimates are the fitted parameters with standard errors and
	// confidence intervals.
	Estimates []models.Estimate
	// Converged reports whether the solver converged.
	Converged bool
	// Invalid counts the readings at which the model's validity rule
	// fails (models.Result.Valid).
	Invalid int
	// Caveats are the fit's validity warnings and the solver's warnings.
	Caveats []string
}

// Table is the outcome of Compare.
type Table struct {
	// Rows are sorted by AICc, lowest first, when the fits are
	// comparable, and kept in input order otherwise.
	Rows []Row
	// Comparable reports whether every fit used the same readings, so
	// that AICc values can be compared.
	Comparable bool
	// Summary is one plain sentence on the lowest AICc, leaving the
	// choice to the user.
	Summary string
	// Notes are plain sentences about the comparison.
	Notes []string
	// Caution is the notice to show with the table.
	Caution string
}

// Compare tabulates models fitted to the same readings: RMSE, AICc
// (Hurvich & Tsai 1989, Biometrika 76(2), from memory),
//
//	AIC = N·ln(SSR/N) + 2K,  AICc = AIC + 2K(K + 1)/(N − K − 1),
//
// with K = P + 1 — the fitted parameters and the residual variance, as
// for least squares with normal errors of unknown variance (Burnham &
// Anderson 2002, Model Selection and Multimodel Inference, 2nd ed., from
// memory) — the difference ΔAICc to the lowest, the Akaike weights
// exp(−Δᵢ/2)/Σ exp(−Δⱼ/2), the parameters with their confidence intervals
// and the validity warnings. Rows are sorted by AICc. A smaller AICc
// means the data support that model better for its number of parameters;
// it does not make the model right, and the choice stays with the user.
//
// AICc compares fits of the same readings only (same N, the same Used
// indices; with weights, the same weights). When the fits used different
// readings, the table gives every row's AICc but no ΔAICc, weights or
// lowest row, keeps the input order and says why. Errors are *Error values
// naming the candidate (a nil result, no solver result, no readings).
func Compare(cands []Candidate) (*Table, error) {
	if len(cands) == 0 {
		return nil, &Error{Index: -1, Err: ErrCandidate, Reason: "no fitted results to compare"}
	}
	tab := &Table{Comparable: true, Caution: Caution}
	for i, c := range cands {
		r := c.Result
		if r == nil || r.Fit == nil || r.Model == nil {
			return nil, &Error{Index: i, Label: c.Label, Err: ErrCandidate, Reason: "no fitted result (the fit failed or was not run)"}
		}
		label := c.Label
		if label == "" {
			label = r.Model.Name()
		}
		f := r.Fit
		if f.N <= 0 || bad(f.SSR) || f.SSR < 0 {
			return nil, &Error{Index: i, Label: label, Field: "N", Value: float64(f.N), Err: ErrCandidate,
				Reason: fmt.Sprintf("the fit has %d readings and SSR %g: nothing to compare", f.N, f.SSR)}
		}
		row := Row{
			Index: i, Label: label, Model: r.Model.Name(),
			N: f.N, P: len(r.Params), SSR: f.SSR, RMSE: math.Sqrt(f.SSR / float64(f.N)),
			DeltaAICc: math.NaN(), Weight: math.NaN(),
			Estimates: append([]models.Estimate(nil), r.Estimates...),
			Converged: f.Status.Converged(),
			Caveats:   append([]string(nil), r.Caveats...),
		}
		row.K = row.P + 1
		row.AIC, row.AICc = aicc(row.N, row.K, row.SSR)
		for _, ok := range r.Valid {
			if !ok {
				row.Invalid++
			}
		}
		if row.Invalid > 0 {
			row.Caveats = append(row.Caveats, fmt.Sprintf("%d of %d readings lie where the model's validity rule fails.", row.Invalid, len(r.Valid)))
		}
		switch {
		case row.SSR == 0:
			tab.Notes = append(tab.Notes, fmt.Sprintf("%s fits exactly (SSR = 0): no AIC can be given.", label))
		case math.IsNaN(row.AICc):
			tab.Notes = append(tab.Notes, fmt.Sprintf("%s: %d readings are too few for AICc with K = %d (N must exceed K + 1).", label, row.N, row.K))
		}
		tab.Rows = append(tab.Rows, row)
	}
	first := cands[0].Result
	for i, c := range cands[1:] {
		if c.Result.Fit.N != first.Fit.N || !slices.Equal(c.Result.Used, first.Used) {
			tab.Comparable = false
			tab.Notes = append(tab.Notes, fmt.Sprintf(
				"%s and %s were fitted to different readings (%d and %d used): their AICc values cannot be compared, so no differences, weights or lowest row are given. Fit every model to the same readings to compare them.",
				tab.Rows[0].Label, tab.Rows[i+1].Label, first.Fit.N, c.Result.Fit.N))
			break
		}
	}
	if !tab.Comparable {
		tab.Summary = "No comparison: the fits used different readings."
		return tab, nil
	}
	sort.SliceStable(tab.Rows, func(a, b int) bool {
		x, y := tab.Rows[a].AICc, tab.Rows[b].AICc
		if math.IsNaN(y) {
			return !math.IsNaN(x)
		}
		return x < y
	})
	best := tab.Rows[0].AICc
	if math.IsNaN(best) {
		tab.Summary = "No comparison: no fit has an AICc."
		return tab, nil
	}
	var sum float64
	for i := range tab.Rows {
		r := &tab.Rows[i]
		if math.IsNaN(r.AICc) {
			continue
		}
		r.DeltaAICc = r.AICc - best
		r.Weight = math.Exp(-r.DeltaAICc / 2)
		sum += r.Weight
	}
	for i := range tab.Rows {
		tab.Rows[i].Weight /= sum
	}
	tab.Rows[0].Lowest = true
	top := tab.Rows[0]
	tab.Summary = fmt.Sprintf("Lowest AICc: %s (Akaike weight %.2f).", top.Label, top.Weight)
	if len(tab.Rows) > 1 && !math.IsNaN(tab.Rows[1].DeltaAICc) {
		tab.Summary += fmt.Sprintf(" Next: %s, ΔAICc = %.1f.", tab.Rows[1].Label, tab.Rows[1].DeltaAICc)
	}
	tab.Summary += " The choice of model stays with you: weigh the residuals, the derivative plot and the validity warnings too."
	tab.Notes = append(tab.Notes, "Differences in AICc below about 2 mean the readings hardly prefer one model to the other (Burnham & Anderson 2002, from memory).")
	return tab, nil
}

// aicc returns AIC and AICc for n readings, k counted parameters and the
// residual sum of squares ssr; NaN where they are not defined.
func aicc(n, k int, ssr float64) (aic, aicc float64) {
	if !(ssr > 0) {
		return math.NaN(), math.NaN()
	}
	N, K := float64(n), float64(k)
	aic = N*math.Log(ssr/N) + 2*K
	if n-k-1 <= 0 {
		return aic, math.NaN()
	}
	return aic, aic + 2*K*(K+1)/(N-K-1)
}
