package models

import (
	"fmt"
	"math"
	"sort"
)

// DistanceResult is a Cooper–Jacob distance–drawdown analysis at one
// time; see DistanceDrawdownLine.
type DistanceResult struct {
	// Line is s = Intercept + Slope·log₁₀(r / 1 m), fitted to the wells.
	Line StraightLine
	// DeltaS is the fall of drawdown per log cycle of distance (= −Slope),
	// m.
	DeltaS float64
	// R0 is the distance at which the line reaches zero drawdown, m.
	R0 float64
	// Time is the time of the analysis, s.
	Time float64
	// T = 2.303·Q/(2π·Δs) (m²/s) and S = 2.25·T·t/r0², with standard errors
	// propagated from the line (first order) and confidence intervals
	// clipped at zero, at Line.Confidence. With two wells the line is
	// exact and the errors are NaN.
	T, S                           float64
	TErr, SErr                     float64
	TLower, TUpper, SLower, SUpper float64
	// UMax is the validity threshold used and U holds u = r²S/(4Tt) at
	// each well; Far counts the wells with u ≥ UMax, where the line does
	// not hold yet.
	UMax float64
	U    []float64
	Far  int
	// Caveats are plain sentences for the user about the line's validity.
	Caveats []string
}

// DistanceDrawdownLine fits the Cooper–Jacob (1946) straight line of
// drawdown against the logarithm of distance, at one time t (s) after
// pumping started at the constant rate q (m³/s), to the drawdowns s (m)
// observed at the distances r (m) of two or more observation wells:
//
//	s ≈ (2.303·Q/(2πT))·log₁₀(r0/r),  r0² = 2.25·T·t/S,
//
// so that
//
//	T = 2.303·Q/(2π·Δs),  S = 2.25·T·t/r0²,
//
// with Δs the fall of drawdown per log cycle of distance and r0 the
// distance of zero drawdown on the line (2.303 is ln 10 exactly). The line
// holds where u = r²S/(4Tt) < UMax (LineSettings.UMax, default 0.01), so
// at the far wells last; the result gives u at each well and a caveat for
// those beyond. Only UMax and Confidence of the settings are used.
// DrawdownAt reads each well's drawdown at the chosen time.
//
// Reference: Cooper, H.H. and Jacob, C.E. (1946), A generalized graphical
// method for evaluating formation constants and summarizing well-field
// history, Transactions, American Geophysical Union 27(4), 526–534.
func DistanceDrawdownLine(q, t float64, r, s []float64, set *LineSettings) (*DistanceResult, error) {
	const name = "Cooper–Jacob distance–drawdown (1946)"
	if set == nil {
		set = &LineSettings{}
	}
	if bad(q) || q == 0 {
		return nil, errf(name, "Q", q, ErrBadConstant, "the pumping rate must be a finite number other than zero")
	}
	if bad(t) || !(t > 0) {
		return nil, errf(name, "time", t, ErrBadConstant, "the time of the analysis must be a finite positive number of seconds")
	}
	umax := set.uMax()
	if !(umax > 0 && umax <= 1) {
		return nil, errf(name, "UMax", set.UMax, ErrBadConstant, "the u threshold must lie in (0, 1]")
	}
	if !(set.Confidence >= 0 && set.Confidence < 1) {
		return nil, errf(name, "confidence", set.Confidence, ErrBadConstant, "the confidence level must lie in (0, 1)")
	}
	if len(r) != len(s) {
		return nil, &Error{Method: name, Index: -1, Err: ErrLength, Reason: fmt.Sprintf("%d drawdowns for %d distances", len(s), len(r))}
	}
	if len(r) < 2 {
		return nil, &Error{Method: name, Index: -1, Err: ErrTooFewPoints, Reason: fmt.Sprintf("2 wells needed, %d given", len(r))}
	}
	x := make([]float64, len(r))
	for i := range r {
		if bad(r[i]) || !(r[i] > 0) {
			return nil, &Error{Method: name, Index: i, Field: "r", Value: r[i], Err: ErrBadReading, Reason: "the distance must be a finite positive number"}
		}
		if bad(s[i]) {
			return nil, &Error{Method: name, Index: i, Field: "drawdown", Value: s[i], Err: ErrBadReading, Reason: "not a finite number"}
		}
		x[i] = math.Log10(r[i])
	}
	l, ok := fitLine(x, s, nil, set.Confidence)
	if !ok {
		return nil, errf(name, "r", r[0], ErrNoTrend, "all wells are at the same distance")
	}
	b, a := l.Slope, l.Intercept
	T := math.Ln10 * q / (2 * math.Pi * -b)
	if !(T > 0) || bad(T) {
		return nil, errf(name, "slope", b, ErrNoTrend,
			"drawdown does not fall with distance in the sense of the pumping rate (%.4g m per log cycle for Q = %.4g m³/s)", b, q)
	}
	r0 := math.Pow(10, -a/b)
	S := 2.25 * T * t / (r0 * r0)
	c := &DistanceResult{Line: l, DeltaS: -b, R0: r0, Time: t, T: T, S: S, UMax: umax}
	// ln T = const − ln(−b); ln S = const + ln T + 2 ln10·a/b.
	c.TErr = T * l.SlopeErr / math.Abs(b)
	ga := 2 * math.Ln10 / b
	gb := -1/b - 2*math.Ln10*a/(b*b)
	vs := ga*ga*l.InterceptErr*l.InterceptErr + 2*ga*gb*l.Cov + gb*gb*l.SlopeErr*l.SlopeErr
	c.SErr = S * math.Sqrt(math.Max(vs, 0))
	if math.IsNaN(l.SlopeErr) {
		c.SErr = math.NaN()
	}
	c.TLower, c.TUpper = math.Max(0, T-l.TValue*c.TErr), T+l.TValue*c.TErr
	c.SLower, c.SUpper = math.Max(0, S-l.TValue*c.SErr), S+l.TValue*c.SErr
	c.U = make([]float64, len(r))
	rFar := 0.0
	for i, ri := range r {
		c.U[i] = ri * ri * S / (4 * T * t)
		if c.U[i] >= umax {
			c.Far++
			rFar = math.Max(rFar, ri)
		}
	}
	if c.Far > 0 {
		c.Caveats = append(c.Caveats, fmt.Sprintf(
			"%d of the %d wells (out to r = %.4g m) have u ≥ %g at t = %.4g s, where the straight line does not hold yet; choose a later time (t ≥ %.4g s for all wells) or leave them out.",
			c.Far, len(r), rFar, umax, t, rFar*rFar*S/(4*T*umax)))
	}
	if len(r) == 2 {
		c.Caveats = append(c.Caveats, "Two wells define the line exactly; it gives no uncertainty.")
	}
	return c, nil
}

// DrawdownAt returns the drawdown of the readings d at the time t (s), by
// linear interpolation in log time between the nearest readings before
// and after t that are used (not excluded, weight not zero), or the
// reading itself at that time. It does not extrapolate: t outside the
// span of the used readings is an error.
func DrawdownAt(d Data, t float64) (float64, error) {
	const name = "drawdown at a time"
	sel, err := selectPoints(name, d, 0, 0, checkDrawdown)
	if err != nil {
		return math.NaN(), err
	}
	if bad(t) || !(t > 0) {
		return math.NaN(), errf(name, "time", t, ErrBadConstant, "the time must be a finite positive number of seconds")
	}
	if len(sel.idx) == 0 {
		return math.NaN(), sel.tooFew(name, 1)
	}
	order := make([]int, len(sel.t))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return sel.t[order[a]] < sel.t[order[b]] })
	first, last := sel.t[order[0]], sel.t[order[len(order)-1]]
	if t < first || t > last {
		return math.NaN(), errf(name, "time", t, ErrBadConstant,
			"the time lies outside the readings (from %g s to %g s); drawdown is not extrapolated", first, last)
	}
	k := sort.Search(len(order), func(k int) bool { return sel.t[order[k]] >= t })
	hi := order[k]
	if sel.t[hi] == t {
		return sel.y[hi], nil
	}
	lo := order[k-1]
	t0, t1 := sel.t[lo], sel.t[hi]
	f := math.Log(t/t0) / math.Log(t1/t0)
	return sel.y[lo] + f*(sel.y[hi]-sel.y[lo]), nil
}
