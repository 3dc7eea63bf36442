package slug

import (
	"math"

	"fieldfit/models"
	"fieldfit/models/units"
)

// Caution is the notice every slug-test result carries.
const Caution = "Preliminary field interpretation. A submission to a regulator must be prepared or reviewed by a licensed hydrogeologist (or the equivalent licensed professional) and follow the local rules and codes."

// InUnit is an estimate converted to a display unit.
type InUnit struct {
	Unit                        units.Unit
	Value, StdErr, Lower, Upper float64
}

// Result is the interpretation of a slug test by one method.
type Result struct {
	// Method names the method, e.g. "Hvorslev (1951)".
	Method string
	// Shape names the Hvorslev geometry and its shape factor formula
	// (empty for the other methods).
	Shape string

	// K is the hydraulic conductivity, m/s, with its standard error and
	// confidence interval (at the solver's level, 95 % by default), and
	// KIn the same in m/s, m/d, ft/d and cm/s.
	K   models.Estimate
	KIn []InUnit

	// DecayRate m (1/s), T0 = 1/m (s, Hvorslev's basic time lag) and
	// Intercept (the line's H/H0 at t = 0) describe the straight line of
	// ln(H/H0) of the Hvorslev and Bouwer–Rice methods; they are zero
	// for Cooper–Bredehoeft–Papadopulos. The interval of T0 is the image
	// of that of m.
	DecayRate, T0 models.Estimate
	Intercept     float64

	// LnReRw is ln(Re/r_w) of Bouwer–Rice, and Coefficients the A, B, C
	// (or C alone) it used (zero for the other methods).
	LnReRw       float64
	Coefficients Coefficients

	// Transmissivity T (m²/s) and Storativity S of
	// Cooper–Bredehoeft–Papadopulos (zero for the other methods).
	Transmissivity, Storativity models.Estimate

	// Normalised holds the readings as H/H0, and Fit the underlying fit
	// (of ln(H/H0) for the line methods, of H/H0 for CBP) with its
	// residuals, covariance and solver status.
	Normalised *Normalised
	Fit        *models.Result

	// Assumptions list the geometry and conditions the method assumes,
	// as plain sentences; Caveats are warnings about this fit.
	Assumptions []string
	Caveats     []string
	// Caution is the notice to show with the result (see Caution).
	Caution string
}

// Curve returns the fitted normalised head H/H0 at the times t (s) and
// the limits of its pointwise confidence band (see models.Result.Band);
// for the line methods the band of ln(H/H0) is mapped through exp.
func (r *Result) Curve(t []float64) (h, lower, upper []float64) {
	h, lower, upper = r.Fit.Band(t)
	if _, ok := r.Fit.Model.(logLine); ok {
		for i := range h {
			h[i], lower[i], upper[i] = math.Exp(h[i]), math.Exp(lower[i]), math.Exp(upper[i])
		}
	}
	return h, lower, upper
}

var kInfo = models.ParamInfo{Name: "K", Long: "hydraulic conductivity", Unit: "m/s", Quantity: units.Conductivity, Positive: true}

// kUnits are the units K is reported in.
var kUnits = []string{"m/s", "m/d", "ft/d", "cm/s"}

// scale returns c·e as a new estimate described by info (c > 0).
func scale(e models.Estimate, c float64, info models.ParamInfo) models.Estimate {
	return models.Estimate{ParamInfo: info, Value: c * e.Value, StdErr: c * e.StdErr, Lower: c * e.Lower, Upper: c * e.Upper}
}

// convert returns e in each of the units named by symbols.
func convert(e models.Estimate, symbols []string) []InUnit {
	out := make([]InUnit, 0, len(symbols))
	for _, s := range symbols {
		u, ok := units.Lookup(s)
		if !ok {
			panic("slug: unknown unit " + s) // a programming error: the symbols are ours
		}
		out = append(out, InUnit{Unit: u, Value: u.FromSI(e.Value), StdErr: u.FromSI(e.StdErr), Lower: u.FromSI(e.Lower), Upper: u.FromSI(e.Upper)})
	}
	return out
}
