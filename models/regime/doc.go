// Package regime reads a pumping test's drawdown and its log-derivative for
// the flow regimes they suggest, says whether the derivative has been flat
// long enough to stop pumping, and compares models fitted to the same
// readings.
//
// Diagnose computes the log-derivative ds/d ln t (Bourdet, Ayoub & Pirard
// 1989, package diagnostic) and looks for four patterns, each reported as
// a suggestion with the time range it covers, the numbers behind it and a
// plain sentence giving the reason:
//
//   - unit slope: drawdown and derivative both rise in proportion to time
//     (log–log slopes near 1), as while the well's own storage is emptied;
//   - flat derivative: infinite-acting radial flow, in which the Theis
//     (1935) drawdown rises by Q/(4πT) per unit of ln t, so that the flat
//     level gives T = Q/(4π·ds/d ln t) (Cooper & Jacob 1946);
//   - derivative falling below its flat level to the end: leakage through
//     an aquitard (Hantush & Jacob 1955) or a recharge (constant-head)
//     boundary, both of which make the drawdown level off;
//   - derivative doubling after a flat stretch: one straight no-flow
//     boundary, whose image well adds a second Theis derivative equal to
//     the first at late time (method of images; Ferris et al. 1962, USGS
//     Water-Supply Paper 1536-E, from memory); a rise that
//     has not (yet) reached double is reported as a rising derivative.
//
// The pattern rules and their tolerances are our own, set as Settings whose
// zero values are common practice; they are suggestions for a person who
// looks at the plots, not a diagnosis.
//
// CanStop says, while readings come in, whether the derivative has been
// flat within a tolerance (±10 %) over the last part of a log cycle (half a
// cycle) and when one full log cycle of flat derivative will be reached.
//
// Compare tabulates several models fitted to the same readings with RMSE,
// the corrected Akaike information criterion AICc (Hurvich & Tsai 1989),
// AICc differences and Akaike weights (Burnham & Anderson 2002), the
// parameters with their confidence intervals and the validity warnings,
// sorted by AICc; the choice of model stays with the user.
//
// Results are a preliminary field interpretation (see Caution).
//
// Package regime is pure Go and knows nothing of the browser.
package regime
