package models

import (
	"fmt"
	"math"

	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// CooperJacobResult is a Cooper–Jacob straight-line analysis of drawdown
// against log₁₀ time; see CooperJacobLine.
type CooperJacobResult struct {
	// Line is s = Intercept + Slope·log₁₀(t / 1 s), fitted on the window.
	Line StraightLine
	// DeltaS is the drawdown per log cycle of time (= Line.Slope), m.
	DeltaS float64
	// T0 is the time at which the line crosses zero drawdown, s.
	T0 float64
	// T = 2.303·Q/(4π·ΔS), m²/s, and S = 2.25·T·t0/r², with their standard
	// errors propagated from those of the slope and intercept (first
	// order), and confidence intervals T ± t_q·TErr, S ± t_q·SErr clipped
	// at zero, at Line.Confidence.
	T, S                           float64
	TErr, SErr                     float64
	TLower, TUpper, SLower, SUpper float64
	// UMax is the validity threshold used; TimeValid = r²S/(4T·UMax) is
	// the earliest time from which u < UMax, s.
	UMax, TimeValid float64
	// U holds u = r²S/(4Tt) for every reading of the Data, used or not
	// (NaN where the time is not positive and finite).
	U []float64
	// Used holds the indices of the readings on the line; Excluded and
	// Outside count readings left out by the mask (or a zero weight) and by
	// the window. Early counts the used readings with u ≥ UMax.
	Used                     []int
	Excluded, Outside, Early int
	// Caveats are plain sentences for the user about the line's validity.
	Caveats []string
}

// Band returns the line's drawdown at the times t (s) and the limits of
// its pointwise confidence band.
func (c *CooperJacobResult) Band(t []float64) (curve, lower, upper []float64) {
	curve = make([]float64, len(t))
	lower = make([]float64, len(t))
	upper = make([]float64, len(t))
	for i, ti := range t {
		x := math.Log10(ti)
		curve[i] = c.Line.At(x)
		lower[i], upper[i] = c.Line.BandAt(x)
	}
	return curve, lower, upper
}

const cooperJacobName = "Cooper–Jacob (1946)"

// CooperJacobLine fits the Cooper–Jacob (1946) straight line to drawdown d
// (d.Time since pumping started, s; d.Value drawdown, m) observed at the
// distance r (m) from a well pumped at the constant rate q (m³/s) —
//
//	s ≈ (2.303·Q/(4πT))·log₁₀(2.25·T·t/(r²S)),
//
// by weighted linear least squares of s on log₁₀ t over the settings' time
// window, and returns
//
//	T = 2.303·Q/(4π·Δs),  S = 2.25·T·t0/r²,
//
// with Δs the drawdown per log cycle and t0 the time of zero drawdown on
// the line (2.303 is ln 10 exactly). The line holds for u = r²S/(4Tt) <
// UMax; the result gives u for every reading, the time from which u <
// UMax, and a caveat when the window starts earlier.
//
// Reference: Cooper, H.H. and Jacob, C.E. (1946), A generalized graphical
// method for evaluating formation constants and summarizing well-field
// history, Transactions, American Geophysical Union 27(4), 526–534.
func CooperJacobLine(q, r float64, d Data, s *LineSettings) (*CooperJacobResult, error) {
	if s == nil {
		s = &LineSettings{}
	}
	if err := checkWell(cooperJacobName, q, r); err != nil {
		return nil, err
	}
	umax := s.uMax()
	if !(umax > 0 && umax <= 1) {
		return nil, errf(cooperJacobName, "UMax", s.UMax, ErrBadConstant, "the u threshold must lie in (0, 1]")
	}
	if !(s.Confidence >= 0 && s.Confidence < 1) {
		return nil, errf(cooperJacobName, "confidence", s.Confidence, ErrBadConstant, "the confidence level must lie in (0, 1)")
	}
	sel, err := selectPoints(cooperJacobName, d, s.From, s.To, checkDrawdown)
	if err != nil {
		return nil, err
	}
	if len(sel.idx) < 3 {
		return nil, sel.tooFew(cooperJacobName, 3)
	}
	c, err := cooperJacobCore(q, r, sel.t, sel.y, sel.w, s.Confidence)
	if err != nil {
		return nil, err
	}
	c.UMax = umax
	c.TimeValid = r * r * c.S / (4 * c.T * umax)
	c.Used, c.Excluded, c.Outside = sel.idx, sel.excluded, sel.outside
	c.U = make([]float64, len(d.Time))
	for i, ti := range d.Time {
		c.U[i] = math.NaN()
		if ti > 0 && !math.IsInf(ti, 1) {
			c.U[i] = r * r * c.S / (4 * c.T * ti)
		}
	}
	first := math.Inf(1)
	for _, i := range sel.idx {
		if c.U[i] >= umax {
			c.Early++
			first = math.Min(first, d.Time[i])
		}
	}
	if c.Early > 0 {
		c.Caveats = append(c.Caveats, fmt.Sprintf(
			"%d of the %d points on the line (from t = %.4g s) have u ≥ %g, where the straight line does not yet hold; start the window at t ≥ %.4g s.",
			c.Early, len(sel.idx), first, umax, c.TimeValid))
	}
	if len(sel.idx)-c.Early < 3 {
		c.Caveats = append(c.Caveats, fmt.Sprintf(
			"Fewer than 3 points on the line have u < %g; T and S from this line are not reliable.", umax))
	}
	return c, nil
}

// checkWell checks the pumping rate and distance shared by the drawdown
// models.
func checkWell(method string, q, r float64) error {
	if bad(q) || q == 0 {
		return errf(method, "Q", q, ErrBadConstant, "the pumping rate must be a finite number other than zero")
	}
	if bad(r) || !(r > 0) {
		return errf(method, "r", r, ErrBadConstant, "the distance from the pumped well must be a finite positive number")
	}
	return nil
}

// cooperJacobCore fits the line to already validated readings and derives
// T, S and their errors.
func cooperJacobCore(q, r float64, t, y, w []float64, confidence float64) (*CooperJacobResult, error) {
	x := make([]float64, len(t))
	for i, ti := range t {
		x[i] = math.Log10(ti)
	}
	l, ok := fitLine(x, y, w, confidence)
	if !ok {
		return nil, errf(cooperJacobName, "time", t[0], ErrNoTrend, "all readings on the line are at the same time")
	}
	b, a := l.Slope, l.Intercept
	T := math.Ln10 * q / (4 * math.Pi * b)
	if !(T > 0) || bad(T) {
		return nil, errf(cooperJacobName, "slope", b, ErrNoTrend,
			"drawdown does not grow with log time in the same sense as the pumping rate (%.4g m per log cycle for Q = %.4g m³/s)", b, q)
	}
	t0 := math.Pow(10, -a/b)
	S := 2.25 * T * t0 / (r * r)
	c := &CooperJacobResult{Line: l, DeltaS: b, T0: t0, T: T, S: S}
	// First-order propagation: ln T = const − ln b;
	// ln S = const − ln b − (a/b)·ln 10.
	c.TErr = T * l.SlopeErr / math.Abs(b)
	ga := -math.Ln10 / b
	gb := -1/b + a*math.Ln10/(b*b)
	vs := ga*ga*l.InterceptErr*l.InterceptErr + 2*ga*gb*l.Cov + gb*gb*l.SlopeErr*l.SlopeErr
	c.SErr = S * math.Sqrt(math.Max(vs, 0))
	c.TLower, c.TUpper = math.Max(0, T-l.TValue*c.TErr), T+l.TValue*c.TErr
	c.SLower, c.SUpper = math.Max(0, S-l.TValue*c.SErr), S+l.TValue*c.SErr
	return c, nil
}

// lateCooperJacob fits the Cooper–Jacob line to the late part of the
// readings, as a starting guess for the curve fits: first to the later half
// of the log-time span, then, if the first line says that u < 0.05 from a
// later time on and at least 3 readings lie there, to those readings.
func lateCooperJacob(q, r float64, t, y []float64) (T, S float64, ok bool) {
	tmin, tmax := math.Inf(1), 0.0
	for _, ti := range t {
		tmin, tmax = math.Min(tmin, ti), math.Max(tmax, ti)
	}
	fit := func(from float64) (float64, float64, bool) {
		var tt, yy []float64
		for i, ti := range t {
			if ti >= from {
				tt, yy = append(tt, ti), append(yy, y[i])
			}
		}
		if len(tt) < 3 {
			return 0, 0, false
		}
		c, err := cooperJacobCore(q, r, tt, yy, nil, 0)
		if err != nil || bad(c.S) || !(c.S > 0) {
			return 0, 0, false
		}
		return c.T, c.S, true
	}
	T, S, ok = fit(math.Sqrt(tmin * tmax))
	if !ok {
		T, S, ok = fit(tmin)
	}
	if !ok {
		return 0, 0, false
	}
	if from := r * r * S / (4 * T * 0.05); from > tmin {
		if T2, S2, ok2 := fit(from); ok2 {
			T, S = T2, S2
		}
	}
	return T, S, true
}

// CooperJacob is the Cooper–Jacob (1946) straight-line approximation of the
// Theis drawdown as a curve model, for fitting by Fit (the direct linear
// analysis is CooperJacobLine):
//
//	s(t) = Q/(4πT)·ln(2.25·T·t/(r²S))  [m],
//
// valid for u = r²S/(4Tt) < UMax. Q is the constant pumping rate (m³/s, >
// 0 for abstraction) and R the distance from the pumped well (m). The
// fitted parameters are T (m²/s) and S (−), both positive. The Jacobian is
//
//	∂s/∂T = Q/(4πT²)·(1 − ln(2.25·T·t/(r²S))),  ∂s/∂S = −Q/(4πTS).
//
// Reference: Cooper, H.H. and Jacob, C.E. (1946), Transactions, American
// Geophysical Union 27(4), 526–534.
type CooperJacob struct {
	Q, R float64
	// UMax is the validity threshold on u; zero means 0.01 (Cooper &
	// Jacob 1946, from memory, reference §4).
	UMax float64
}

func (m CooperJacob) Name() string { return cooperJacobName }

func (m CooperJacob) Params() []ParamInfo { return theisParams() }

func (m CooperJacob) Check() error {
	if err := checkWell(cooperJacobName, m.Q, m.R); err != nil {
		return err
	}
	if !(m.UMax >= 0 && m.UMax <= 1) {
		return errf(cooperJacobName, "UMax", m.UMax, ErrBadConstant, "the u threshold must lie in (0, 1]")
	}
	return nil
}

func (m CooperJacob) CheckPoint(t, y float64) error { return checkDrawdown(t, y) }

func (m CooperJacob) Eval(dst, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	c := 2.25 * T / (m.R * m.R * S)
	for i, ti := range t {
		dst[i] = a * math.Log(c*ti)
	}
}

func (m CooperJacob) Jacobian(dst *mat.Dense, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	c := 2.25 * T / (m.R * m.R * S)
	raw := dst.RawMatrix()
	for i, ti := range t {
		row := raw.Data[i*raw.Stride : i*raw.Stride+2]
		row[0] = a / T * (1 - math.Log(c*ti))
		row[1] = -a / S
	}
}

// Start fits the line to the later half of the log-time span and refines
// it on the readings with u < 0.05.
func (m CooperJacob) Start(t, y []float64) ([]float64, error) {
	T, S, ok := lateCooperJacob(m.Q, m.R, t, y)
	if !ok {
		return nil, errf(cooperJacobName, "", 0, ErrNoTrend,
			"no straight line with drawdown growing with log time fits the late readings")
	}
	return []float64{T, S}, nil
}

// Validity marks the readings with u < UMax.
func (m CooperJacob) Validity(ok []bool, t, p []float64) []string {
	umax := m.UMax
	if umax == 0 {
		umax = 0.01
	}
	T, S := p[0], p[1]
	early := 0
	for i, ti := range t {
		ok[i] = m.R*m.R*S/(4*T*ti) < umax
		if !ok[i] {
			early++
		}
	}
	if early == 0 {
		return nil
	}
	return []string{fmt.Sprintf("%d of %d points have u ≥ %g (before t = %.4g s), where the Cooper–Jacob approximation does not hold; use the Theis model or a later window.",
		early, len(t), umax, m.R*m.R*S/(4*T*umax))}
}

func theisParams() []ParamInfo {
	return []ParamInfo{
		{Name: "T", Long: "transmissivity", Unit: "m²/s", Quantity: units.Transmissivity, Positive: true},
		{Name: "S", Long: "storativity", Unit: "1", Quantity: units.Dimensionless, Positive: true},
	}
}
