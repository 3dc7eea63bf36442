// Package decay fits decay curves — a tracer diluting, a head or a
// concentration relaxing to a baseline — and reports the rate constant and
// the half-life with their uncertainty.
//
// The one-term form is first-order decay to a baseline,
//
//	y = y∞ + (y0 − y∞)·e^(−k t),
//
// and the optional two-term form y = y∞ + a1·e^(−k1 t) + a2·e^(−k2 t). Fit
// fits either by damped Newton least squares (models.Fit and package
// fitcore), with y0 or y∞ optionally held at known values, and returns k,
// the half-life ln 2/k with its standard error and interval by the delta
// method from the covariance, y0 and y∞. Units are free-form strings
// carried through to the result.
//
// Bad readings are reported as *models.Error values naming the reading;
// readings that do not change are an error. Nothing here panics on user
// input.
//
// Package decay is pure Go and knows nothing of the browser.
package decay
