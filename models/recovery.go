package models

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

const recoveryName = "Theis recovery (1935)"

// TheisRecovery is the Theis (1935) model of residual drawdown after a
// well pumped at the constant rate Q for the time PumpTime has stopped,
// by superposition of an injection at rate Q from the moment the pump
// stopped:
//
//	s′(t′) = Q/(4πT)·[W(u) − W(u′)],  u = r²S/(4Tt),  u′ = r²S/(4Tt′),
//
// with t′ the time since pumping stopped (s; the model's time variable)
// and t = PumpTime + t′ the time since pumping started. R is the distance
// from the pumped well (m). The fitted parameters are T (m²/s) and S (−),
// both positive; the storativity during recovery is taken equal to that
// during pumping (S′ = S). For late recovery (u, u′ small) the model tends
// to the straight line of TheisRecoveryLine and depends on S only weakly.
// The Jacobian is analytic:
//
//	∂s′/∂T = Q/(4πT²)·[(e^(−u) − e^(−u′)) − (W(u) − W(u′))],
//	∂s′/∂S = −Q/(4πTS)·(e^(−u) − e^(−u′)).
//
// Reference: Theis, C.V. (1935), Transactions, American Geophysical Union
// 16(2), 519–524.
type TheisRecovery struct {
	Q, R     float64
	PumpTime float64 // duration of pumping before the stop, s
}

func (m TheisRecovery) Name() string { return recoveryName }

func (m TheisRecovery) Params() []ParamInfo { return theisParams() }

func (m TheisRecovery) Check() error {
	if err := checkWell(recoveryName, m.Q, m.R); err != nil {
		return err
	}
	if bad(m.PumpTime) || !(m.PumpTime > 0) {
		return errf(recoveryName, "pumping time", m.PumpTime, ErrBadConstant, "the duration of pumping must be a finite positive number of seconds")
	}
	return nil
}

func (m TheisRecovery) CheckPoint(t, y float64) error {
	if !(t > 0) {
		return &Error{Index: -1, Field: "time", Value: t, Err: ErrBadReading,
			Reason: "time since pumping stopped must be positive (t′ > 0)"}
	}
	if bad(y) {
		return &Error{Index: -1, Field: "residual drawdown", Value: y, Err: ErrBadReading, Reason: "not a finite number"}
	}
	return nil
}

// wDiff returns W(u) − W(u′) for u = b/(tp + t′), u′ = b/t′, taking the
// logarithms out of the difference when both are small so that late
// recovery keeps its precision: for x ≤ 1, W(x) = −γ − ln x + x·P(x), so
// W(u) − W(u′) = ln(1 + tp/t′) + u·P(u) − u′·P(u′).
func wDiff(b, tp, tr float64) float64 {
	u, u2 := b/(tp+tr), b/tr
	if u2 <= 1 {
		return math.Log1p(tp/tr) + u*polyP(2*u-1) - u2*polyP(2*u2-1)
	}
	return E1(u) - E1(u2)
}

func (m TheisRecovery) Eval(dst, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	b := m.R * m.R * S / (4 * T)
	for i, tr := range t {
		dst[i] = a * wDiff(b, m.PumpTime, tr)
	}
}

func (m TheisRecovery) Jacobian(dst *mat.Dense, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	b := m.R * m.R * S / (4 * T)
	raw := dst.RawMatrix()
	for i, tr := range t {
		u, u2 := b/(m.PumpTime+tr), b/tr
		dw := wDiff(b, m.PumpTime, tr)
		de := math.Exp(-u) - math.Exp(-u2)
		row := raw.Data[i*raw.Stride : i*raw.Stride+2]
		row[0] = a / T * (de - dw)
		row[1] = -a / S * de
	}
}

// Start takes T from the recovery straight line of the later half (in
// log time) of the readings and S from a one-dimensional search with that
// T on at most 64 of the readings.
func (m TheisRecovery) Start(t, y []float64) ([]float64, error) {
	tmin, tmax := math.Inf(1), 0.0
	for _, ti := range t {
		tmin, tmax = math.Min(tmin, ti), math.Max(tmax, ti)
	}
	var x, yy []float64
	for i, ti := range t {
		if ti >= math.Sqrt(tmin*tmax) {
			x = append(x, math.Log10((m.PumpTime+ti)/ti))
			yy = append(yy, y[i])
		}
	}
	if len(x) < 3 {
		x, yy = x[:0], yy[:0]
		for i, ti := range t {
			x = append(x, math.Log10((m.PumpTime+ti)/ti))
			yy = append(yy, y[i])
		}
	}
	l, ok := fitLine(x, yy, nil, 0)
	T := math.Ln10 * m.Q / (4 * math.Pi * l.Slope)
	if !ok || !(T > 0) || bad(T) {
		return nil, errf(recoveryName, "", 0, ErrNoTrend,
			"no starting guess: residual drawdown does not fall as t/t′ falls")
	}
	ts, ys := subsample(t, y, 64)
	f := make([]float64, len(ts))
	bestS, best := 0.0, math.Inf(1)
	for ls := -8.0; ls <= 0; ls += 0.1 {
		S := math.Pow(10, ls)
		m.Eval(f, ts, []float64{T, S})
		sum := 0.0
		for i := range f {
			d := f[i] - ys[i]
			sum += d * d
		}
		if sum < best {
			bestS, best = S, sum
		}
	}
	return []float64{T, bestS}, nil
}

// Validity marks the readings where u′ = r²S/(4Tt′) < 0.01, on the
// straight-line part of the recovery; the Theis recovery model itself
// holds at every t′ > 0 under its assumptions, so the note only says how
// much of the data lies on the line.
func (m TheisRecovery) Validity(ok []bool, t, p []float64) []string {
	T, S := p[0], p[1]
	for i, tr := range t {
		ok[i] = tr > 0
	}
	b := m.R * m.R * S / (4 * T)
	late := 0
	for _, tr := range t {
		if b/tr < 0.01 {
			late++
		}
	}
	if late < len(t) && late < 3 {
		return []string{fmt.Sprintf("Only %d of %d points have u′ < 0.01 (t′ ≥ %.4g s); T rests on early recovery, where the result depends on S as well.", late, len(t), b/0.01)}
	}
	return nil
}

// TheisRecoveryLine returns the straight-line approximation of Theis
// (1935) residual drawdown, valid when u′ = r²S/(4Tt′) is small:
//
//	s′ ≈ 2.303·Q/(4πT)·log₁₀(t/t′),  t = tp + t′,
//
// for the pumping rate q (m³/s), transmissivity T (m²/s), pumping time tp
// and time since pumping stopped tr (s), with S′ = S.
func TheisRecoveryLine(q, T, tp, tr float64) float64 {
	return q / (4 * math.Pi * T) * math.Log1p(tp/tr)
}

// AgarwalTime returns the equivalent time of Agarwal (1980),
// t_e = tp·t′/(tp + t′), for the pumping time tp and the time since
// pumping stopped tr (s): recovery, plotted against t_e, can be read with
// the drawdown type curves. (Formula and citation from memory, reference
// §5: Agarwal, R.G. (1980), Society of Petroleum Engineers paper 9289.)
func AgarwalTime(tp, tr float64) float64 {
	return tp * tr / (tp + tr)
}

// RecoveryResult is a straight-line analysis of Theis recovery; see
// RecoveryLine.
type RecoveryResult struct {
	// Line is s′ = Intercept + Slope·log₁₀(t/t′), fitted on the window.
	Line StraightLine
	// DeltaS is the residual drawdown per log cycle of t/t′, m.
	DeltaS float64
	// T = 2.303·Q/(4π·ΔS′), m²/s, with its standard error and confidence
	// interval (clipped at zero) at Line.Confidence.
	T, TErr, TLower, TUpper float64
	// Ratio is S′/S = 10^(Intercept/Slope), the inverse of t/t′ at zero
	// residual drawdown on the line (1 when the line passes through the
	// origin), with its standard error. A ratio well below 1 often means
	// recharge or a boundary; well above 1, that the rate or the static
	// level is off.
	Ratio, RatioErr float64
	// Used, Excluded and Outside are as in CooperJacobResult.
	Used              []int
	Excluded, Outside int
}

// Band returns the line's residual drawdown at the times since pumping
// stopped tr (s) and the limits of its pointwise confidence band.
func (c *RecoveryResult) Band(tp float64, tr []float64) (curve, lower, upper []float64) {
	curve = make([]float64, len(tr))
	lower = make([]float64, len(tr))
	upper = make([]float64, len(tr))
	for i, ti := range tr {
		x := math.Log10((tp + ti) / ti)
		curve[i] = c.Line.At(x)
		lower[i], upper[i] = c.Line.BandAt(x)
	}
	return curve, lower, upper
}

// RecoveryLine fits the Theis (1935) recovery straight line
//
//	s′ = ΔS′·log₁₀(t/t′) + c,  T = 2.303·Q/(4π·ΔS′),  S′/S = 10^(c/ΔS′)
//
// by weighted linear least squares to residual drawdown d (d.Time the time
// since pumping stopped t′, s; d.Value the residual drawdown, m) after a
// well pumped at rate q (m³/s) for the time tp (s). Choose a window of late
// recovery (small t/t′), where u′ is small. The UMax setting is not used.
func RecoveryLine(q, tp float64, d Data, s *LineSettings) (*RecoveryResult, error) {
	const method = "Theis recovery line (1935)"
	if s == nil {
		s = &LineSettings{}
	}
	if bad(q) || q == 0 {
		return nil, errf(method, "Q", q, ErrBadConstant, "the pumping rate must be a finite number other than zero")
	}
	if bad(tp) || !(tp > 0) {
		return nil, errf(method, "pumping time", tp, ErrBadConstant, "the duration of pumping must be a finite positive number of seconds")
	}
	if !(s.Confidence >= 0 && s.Confidence < 1) {
		return nil, errf(method, "confidence", s.Confidence, ErrBadConstant, "the confidence level must lie in (0, 1)")
	}
	m := TheisRecovery{Q: q, R: 1, PumpTime: tp}
	sel, err := selectPoints(method, d, s.From, s.To, m.CheckPoint)
	if err != nil {
		return nil, err
	}
	if len(sel.idx) < 3 {
		return nil, sel.tooFew(method, 3)
	}
	x := make([]float64, len(sel.t))
	for i, tr := range sel.t {
		x[i] = math.Log10((tp + tr) / tr)
	}
	l, ok := fitLine(x, sel.y, sel.w, s.Confidence)
	if !ok {
		return nil, errf(method, "time", sel.t[0], ErrNoTrend, "all readings on the line are at the same time")
	}
	T := math.Ln10 * q / (4 * math.Pi * l.Slope)
	if !(T > 0) || bad(T) {
		return nil, errf(method, "slope", l.Slope, ErrNoTrend,
			"residual drawdown does not fall with log(t/t′) in the sense of the pumping rate (%.4g m per log cycle for Q = %.4g m³/s)", l.Slope, q)
	}
	c := &RecoveryResult{Line: l, DeltaS: l.Slope, T: T, Used: sel.idx, Excluded: sel.excluded, Outside: sel.outside}
	c.TErr = T * l.SlopeErr / math.Abs(l.Slope)
	c.TLower, c.TUpper = math.Max(0, T-l.TValue*c.TErr), T+l.TValue*c.TErr
	a, b := l.Intercept, l.Slope
	c.Ratio = math.Pow(10, a/b)
	ga, gb := math.Ln10/b, -a*math.Ln10/(b*b)
	v := ga*ga*l.InterceptErr*l.InterceptErr + 2*ga*gb*l.Cov + gb*gb*l.SlopeErr*l.SlopeErr
	c.RatioErr = c.Ratio * math.Sqrt(math.Max(v, 0))
	return c, nil
}
