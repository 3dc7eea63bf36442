// Package fitcore solves weighted nonlinear least-squares problems by the
// damped Newton (Levenberg–Marquardt) method and reports the uncertainty of
// the fitted parameters.
//
// A Problem says what to minimise, ½ Σ wᵢ rᵢ(p)², with an optional analytic
// Jacobian and per-parameter constraints; Settings say how hard to try (the
// zero value works); Fit returns a Result with the parameters, why the fit
// stopped, the covariance s²(JᵀWJ)⁻¹, standard errors, confidence intervals
// from Student's t, the correlation matrix and warnings about
// identifiability.
//
// Each iteration solves the damped normal equations
//
//	(JᵀWJ + λ·D) δ = −JᵀWr,   D = diag(JᵀWJ) (largest seen so far)
//
// by a Cholesky factorisation, falling back to a QR least-squares solve of
// the augmented system when the factorisation fails. λ is adapted from the
// ratio of actual to predicted reduction of the cost, following Marquardt
// (1963), J. SIAM 11(2), with the update rule of Nielsen (1999), IMM-REP-
// 1999-05, and the scaling of Moré (1978), "The Levenberg–Marquardt algorithm:
// implementation and theory", Numerical Analysis (Dundee 1977), Springer.
//
// Package fitcore knows nothing of hydrogeology; it is pure Go.
package fitcore
