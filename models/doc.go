// Package models holds the published analytical models of field tests —
// starting with the Theis (1935) and Cooper–Jacob (1946) solutions for
// pumping tests and Theis recovery — and the special functions they need,
// and fits them to readings with package fitcore.
//
// Each model is a plain Go value that implements Model: the constants of
// the test (pumping rate Q, distance r …) are its fields, and it supplies
// the names, SI units and ranges of its fitted parameters, the forward
// model, its analytic Jacobian, a starting guess from the data and a
// validity rule; its doc comment gives the equations and the published
// reference. Fit builds a fitcore.Problem from a Model and the readings
// (residual = model − observed, optional weights, a time window and an
// exclusion mask; positive parameters in log space) and returns the
// parameters by name with standard errors and confidence intervals;
// Result.Band gives the confidence band of the fitted curve for plots.
//
// The straight-line methods (CooperJacobLine, RecoveryLine) are linear
// least-squares fits with their own results; CooperJacobLine also supplies
// the starting guess for the Theis fit.
//
// Beyond the confined aquifer: Hantush is the Hantush–Jacob (1955) leaky
// aquifer with its well function HantushW (and the Bessel functions K0,
// K1 it needs); VariableRate superposes any model linear in the rate
// (RateModel) over a schedule of rates, for step changes, stops and a
// fit of drawdown and recovery together (PumpAndStop, JoinRecovery);
// ImageWell adds one straight no-flow or constant-head boundary to a
// Radial model by an image well, and BoundaryDerivativeRatio and
// HantushDerivativeRatio give the log-derivative the diagnostics expect;
// JacobCorrection corrects drawdowns in an unconfined aquifer. FitWells
// fits one model jointly to several observation wells sharing its
// parameters, and DistanceDrawdownLine is the Cooper–Jacob line in
// distance at one time.
//
// Everything is in SI units: time in s, drawdown and distance in m, rate in
// m³/s, transmissivity in m²/s. Package fieldfit/models/units converts at
// the edges. E1, the exponential integral (the Theis well function),
// is accurate to a few units in the last place for 1e-300 ≤ x ≤ 700.
//
// Bad readings and constants are reported as *Error values naming the
// point, field and value; nothing here panics on user data.
//
// Results are a preliminary field interpretation; a submission to a
// regulator must be prepared or reviewed by a licensed hydrogeologist and
// follow the local rules.
//
// Package models is pure Go and knows nothing of the browser.
package models
