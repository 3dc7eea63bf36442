// Package diagnostic computes the log-derivative ds/d ln t of a drawdown or
// recovery series, the diagnostic curve read beside the drawdown on a
// log–log plot.
//
// Derivative follows Bourdet, Ayoub & Pirard (1989), "Use of pressure
// derivative in well-test interpretation", SPE Formation Evaluation 4(2):
// at each point i the derivative is the weighted central difference
//
//	D_i = (Δs₁/Δx₁ · Δx₂ + Δs₂/Δx₂ · Δx₁) / (Δx₁ + Δx₂)
//
// with x = ln t, Δx₁ = x_i − x_j, Δs₁ = s_i − s_j, Δx₂ = x_k − x_i,
// Δs₂ = s_k − s_i, where j is the nearest earlier point and k the nearest
// later point that lie at least L away from i in ln t. L is the smoothing
// window (Settings.Window, in natural-log units; DefaultWindow = 0.2 is
// common practice). The stencil is the slope at x_i of the parabola through
// the three points, so it is exact for any s that is a quadratic in ln t.
// Where no earlier (later) point lies L away, the one-sided forward
// (backward) difference is used and the point is marked so the caller can
// show it as end-affected.
//
// DerivativeOnAxis applies the same stencil to any increasing abscissa that
// is already logarithmic, for example the superposition time of a recovery
// or a variable-rate test. For recovery by Agarwal (1980) equivalent time,
// pass the equivalent time as t to Derivative.
//
// SampleCurve samples a smooth model curve and its log-derivative t·ds/dt on
// a logarithmic grid, exactly when the model gives ds/dt and otherwise by a
// Richardson-extrapolated central difference, for drawing the fitted curve's
// derivative beside the data derivative.
//
// Package diagnostic is pure Go; it knows nothing of the browser.
package diagnostic
