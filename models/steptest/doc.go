// Package steptest analyses step-drawdown tests: it takes each step's
// drawdown in the pumped well at equal duration by superposition, fits the
// well-loss laws of Jacob (1947) and Rorabaugh (1953), and gives the well
// efficiency and the well-condition class of the nonlinear loss
// coefficient.
//
// # Equal-duration drawdown (Hantush–Bierschenk)
//
// A step test pumps one well at rates Q₁ < Q₂ < … in a row, each step
// starting where the previous one ends. Analyse takes, for every step k, the
// incremental drawdown Δs_k at the same duration Δt after the step's start:
// the drawdown observed at t_k + Δt less the drawdown the previous step's
// trend would have reached at that time had the rate not changed. The trend
// of step k−1 is a Cooper–Jacob straight line fitted to the late part of
// that step's readings and extended. The drawdown of a well pumped at the
// constant rate Q_k for the time Δt is then the sum
//
//	s_w,k = Δs_1 + Δs_2 + … + Δs_k,
//
// because drawdowns superpose in time. The method is that of Bierschenk
// (1963), Determining well efficiency by multiple step-drawdown tests,
// IASH Publication 64, and Hantush (1964), Hydraulics of wells, Advances in
// Hydroscience 1 (both from memory: neither was re-read).
//
// The trend line is fitted in one of two time axes (Settings.Trend):
//
//   - TrendSuperposition (the default): the superposition time of the rate
//     history up to step k−1,
//     X(t) = Σ_{i≤k−1} (Q_i − Q_{i−1})/Q_{k−1} · ln(t − t_i),
//     in which the Cooper–Jacob drawdown of the whole history, plus a well
//     loss that changes only with the rate, is exactly a straight line
//     s = a + b·X; so the extended trend carries no bias from the earlier
//     steps while the Cooper–Jacob approximation holds;
//   - TrendLogTime: ln of the time since the test began, the axis of the
//     usual hand-drawn semilog plot; it bends after the first step, so its
//     extension is an approximation.
//
// For the first step both axes are ln(t − t₁).
//
// # Well-loss laws
//
// Jacob (1947), Drawdown test to determine effective radius of artesian
// well, Transactions ASCE 112: s_w = BQ + CQ². Jacob fits it by ordinary
// least squares of the specific drawdown s_w/Q on Q (intercept B, slope C)
// and gives standard errors and confidence intervals from Student's t.
// Rorabaugh (1953), Graphical and theoretical analysis of step-drawdown test
// of artesian well, Proceedings ASCE 79 (separate 362): s_w = BQ + CQⁿ.
// Rorabaugh fits B, C and n by damped Newton least squares (package
// fitcore) on the same specific drawdowns, so that n = 2 reproduces Jacob.
// Both references are from memory.
//
// The summed drawdowns s_w,k share readings and trend lines, so their
// errors are correlated and grow from step to step. Analyse derives their
// covariance from the sensitivity of each s_w,k to the raw readings
// (Analysis.DrawdownCov), and Analysis.Jacob and Analysis.Rorabaugh fit
// the laws by generalised least squares with it, which gives intervals
// that hold the true coefficients as often as they claim (the package's
// coverage tests); Jacob and Rorabaugh on bare points fit by ordinary
// least squares, whose intervals are then too narrow.
//
// The well efficiency at a rate Q is the share of the drawdown due to the
// aquifer (linear) loss: E = BQ / s_w (common practice). LossFit.Efficiency
// gives it with a confidence interval by the delta method; Law.RateFor
// gives the rate at which the efficiency falls to a given value.
//
// WellCondition places Jacob's C in the classes of Walton (1962), Selected
// analytical methods for well and aquifer evaluation, Illinois State Water
// Survey Bulletin 49 (from memory): below 5 s²/ft⁵ properly developed,
// 5–10 mild deterioration, 10–40 severe clogging, above 40 difficult to
// restore. They are guidance from one region's wells, not a rule.
//
// Everything is in SI units: time in s, drawdown in m, rate in m³/s, B in
// s/m², C in s²/m⁵ (for n = 2; s^n/m^(3n−1) in general).
//
// Results are a preliminary field interpretation (see Caution).
//
// Package steptest is pure Go and knows nothing of the browser.
package steptest
