package models

import (
	"fmt"
	"math"

	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

const hantushName = "Hantush–Jacob (1955)"

// Hantush is the Hantush–Jacob (1955) model of drawdown in a leaky
// confined aquifer: a confined aquifer of infinite extent, overlain (or
// underlain) by an aquitard through which water leaks from an unpumped
// aquifer whose head stays constant, around a fully penetrating well
// pumped at a constant rate:
//
//	s(t) = Q/(4πT)·W(u, β),  u = r²S/(4Tt),  β = r/B  [m],
//
// with W the leaky well function (HantushW), Q the pumping rate (m³/s; >
// 0 for abstraction), R the distance r from the pumped well (m) and t the
// time since pumping started (s). The fitted parameters are the
// transmissivity T (m²/s), the storativity S (−) and the leakage factor B
// = √(T·c) (m), all positive, where c = b′/K′ is the hydraulic resistance
// of the aquitard (its thickness over its vertical hydraulic
// conductivity); LeakageResistance gives c with its uncertainty. B is
// chosen over c or the leakance 1/c because it is what the drawdown
// depends on at one distance (through β = r/B) and it stays well scaled
// when leakage is weak (B ≫ r). The storage of the aquitard is neglected
// (Hantush & Jacob's assumption). With B → ∞ the model becomes Theis.
//
// The Jacobian is analytic, with ∂W/∂u = −exp(−u − β²/(4u))/u and ∂W/∂β
// from the series of HantushW:
//
//	∂s/∂T = Q/(4πT²)·(exp(−u − β²/(4u)) − W),
//	∂s/∂S = −Q/(4πTS)·exp(−u − β²/(4u)),
//	∂s/∂B = −Q/(4πT)·(β/B)·∂W/∂β.
//
// At t = 0 the model gives s = 0; for t < 0 it gives NaN.
//
// Reference: Hantush, M.S. and Jacob, C.E. (1955), Non-steady radial flow
// in an infinite leaky aquifer, Transactions, American Geophysical Union
// 36(1), 95–100 (citation from memory).
type Hantush struct {
	Q, R float64
}

func (m Hantush) Name() string { return hantushName }

func (m Hantush) Params() []ParamInfo {
	return append(theisParams(), ParamInfo{Name: "B", Long: "leakage factor", Unit: "m", Quantity: units.Length, Positive: true})
}

func (m Hantush) Check() error { return checkWell(hantushName, m.Q, m.R) }

func (m Hantush) CheckPoint(t, y float64) error { return checkDrawdown(t, y) }

// leakyConsts holds the constants of one evaluation of the model.
type leakyConsts struct {
	a, bu, beta, k0, k1 float64
}

func (m Hantush) consts(p []float64) leakyConsts {
	T, S, B := p[0], p[1], p[2]
	c := leakyConsts{a: m.Q / (4 * math.Pi * T), bu: m.R * m.R * S / (4 * T), beta: m.R / B}
	if c.beta > 0 && !math.IsInf(c.beta, 1) {
		c.k0, c.k1 = K0(c.beta), K1(c.beta)
	}
	return c
}

// w returns W(u, β) and, if deriv, its derivatives, for u = bu/t.
func (c *leakyConsts) w(t float64, deriv bool) (w, dwdu, dwdb, u float64) {
	u = c.bu / t
	switch {
	case !(t >= 0) || math.IsNaN(c.beta):
		return math.NaN(), math.NaN(), math.NaN(), u
	case t == 0 || math.IsInf(c.beta, 1):
		return 0, 0, 0, u
	case c.beta == 0:
		w, ex := e1exp(u)
		return w, -ex / u, 0, u
	}
	w, dwdu, dwdb = hantushCore(u, c.beta, c.k0, c.k1, deriv)
	return w, dwdu, dwdb, u
}

func (m Hantush) Eval(dst, t, p []float64) {
	c := m.consts(p)
	for i, ti := range t {
		w, _, _, _ := c.w(ti, false)
		dst[i] = c.a * w
	}
}

func (m Hantush) Jacobian(dst *mat.Dense, t, p []float64) {
	T, S, B := p[0], p[1], p[2]
	c := m.consts(p)
	raw := dst.RawMatrix()
	for i, ti := range t {
		w, dwdu, dwdb, u := c.w(ti, true)
		row := raw.Data[i*raw.Stride : i*raw.Stride+3]
		g := -u * dwdu // exp(−u − β²/(4u))
		if ti == 0 {
			g = 0
		}
		row[0] = c.a / T * (g - w)
		row[1], row[2] = 0, 0
		// Guard the limits of degenerate parameters (S or B underflowed
		// to 0 in a wild step), where the products below are 0·∞ but the
		// derivatives vanish.
		if g != 0 {
			row[1] = -c.a / S * g
		}
		if dwdb != 0 {
			row[2] = -c.a * c.beta / B * dwdb
		}
	}
}

// hantushStartBetas are the values of β = r/B tried by Start; the first
// stands for no leakage (B = 1000·r).
var hantushStartBetas = []float64{1e-3, 0.01, 0.03, 0.06, 0.1, 0.2, 0.35, 0.6, 1, 1.5, 2.5}

// Start searches the type curves W(u, β) for the best match of the
// readings, as a hydrogeologist matches the Hantush family by eye: for
// each of a set of β from 0.001 to 2.5 and trial values of b = r²S/(4T)
// (u at the last reading from 1e-8 to u at the first equal to 30, five
// steps per decade), the best factor Q/(4πT) is linear and found in
// closed form; the best (β, b) is refined on a finer grid. The Theis start
// (Cooper–Jacob line of the late readings) with β = 0.001 competes too.
// All on at most 64 of the readings.
func (m Hantush) Start(t, y []float64) ([]float64, error) {
	return leakyStart(hantushName, m.Q, m.R, t, y)
}

func leakyStart(method string, q, r float64, t, y []float64) ([]float64, error) {
	ts, ys := subsample(t, y, 64)
	f := make([]float64, len(ts))
	tmin, tmax := math.Inf(1), 0.0
	for _, ti := range ts {
		tmin, tmax = math.Min(tmin, ti), math.Max(tmax, ti)
	}
	type cand struct{ T, S, beta, ssr float64 }
	best := cand{ssr: math.Inf(1)}
	// try evaluates the curve for (lb = log10 b, beta) with the best
	// factor and keeps it if it beats the best so far.
	try := func(lb, beta float64) {
		b := math.Pow(10, lb)
		k0 := K0(beta)
		var sfy, sff float64
		for i, ti := range ts {
			w, _, _ := hantushCore(b/ti, beta, k0, 0, false)
			f[i] = w
			sfy += w * ys[i]
			sff += w * w
		}
		if !(sff > 0) {
			return
		}
		a := sfy / sff
		T := q / (4 * math.Pi * a)
		if !(T > 0) || bad(T) {
			return
		}
		sum := 0.0
		for i := range f {
			d := a*f[i] - ys[i]
			sum += d * d
		}
		if sum < best.ssr {
			best = cand{T, 4 * T * b / (r * r), beta, sum}
		}
	}
	lo, hi := math.Log10(1e-8*tmax), math.Log10(30*tmin)
	for _, beta := range hantushStartBetas {
		for lb := lo; lb <= hi; lb += 0.2 {
			try(lb, beta)
		}
	}
	if T, S, ok := lateCooperJacob(q, r, t, y); ok {
		try(math.Log10(r*r*S/(4*T)), hantushStartBetas[0])
	}
	if best.ssr == math.Inf(1) {
		return nil, errf(method, "", 0, ErrNoTrend,
			"no starting guess: the readings do not grow with time in the sense of the pumping rate (Q = %.4g m³/s)", q)
	}
	// Refine around the best point: b by 0.05 decades, β by a factor 1.25.
	c0 := best
	lb0 := math.Log10(r * r * c0.S / (4 * c0.T))
	for db := -0.2; db <= 0.2001; db += 0.05 {
		for k := -2; k <= 2; k++ {
			try(lb0+db, c0.beta*math.Pow(1.25, float64(k)))
		}
	}
	if !(best.T > 0) || !(best.S > 0) || bad(best.T) || bad(best.S) {
		return nil, errf(method, "", 0, ErrNoTrend, "no starting guess: the readings do not match any leaky type curve")
	}
	return []float64{best.T, best.S, r / best.beta}, nil
}

// Validity accepts every reading with t > 0 and notes when the leakage
// cannot be told from the data: when, at the last reading, W(u, β)
// differs from the Theis W(u) by less than 1 % (B then rests on that
// small departure), or when β = r/B exceeds 10 (drawdown of less than
// 2·K₀(10) ≈ 4e-5 of Q/(4πT): the well hardly feels the pumping).
func (m Hantush) Validity(ok []bool, t, p []float64) []string {
	return leakyValidity(ok, t, p, m.R)
}

func leakyValidity(ok []bool, t, p []float64, r float64) []string {
	T, S, B := p[0], p[1], p[2]
	tmax := 0.0
	for i, ti := range t {
		ok[i] = ti > 0
		tmax = math.Max(tmax, ti)
	}
	if len(t) == 0 || !(tmax > 0) {
		return nil
	}
	var notes []string
	beta := r / B
	u := r * r * S / (4 * T * tmax)
	if dev := 1 - HantushW(u, beta)/E1(u); dev < 0.01 {
		notes = append(notes, fmt.Sprintf("At the last reading the leaky curve departs from the Theis curve by only %.2g %% (β = r/B = %.3g): the data hardly show leakage, so B is poorly determined.", 100*dev, beta))
	}
	if beta > 10 {
		notes = append(notes, fmt.Sprintf("β = r/B = %.3g exceeds 10: the leakage factor is so short that the well hardly feels the pumping; check the distance and the readings.", beta))
	}
	return notes
}

// LeakageResistance returns the hydraulic resistance of the aquitard c =
// B²/T (s) of a fit whose parameters include T and B (Hantush and the
// models built on it), with its standard error by the delta method,
//
//	(σ_c/c)² = 4(σ_B/B)² + (σ_T/T)² − 4·cov(B, T)/(B·T),
//
// and its confidence interval c ± t_q·σ_c (clipped at zero, at the fit's
// confidence level). The leakance is 1/c.
func LeakageResistance(r *Result) (Estimate, error) {
	const method = "leakage resistance"
	iT, iB := -1, -1
	if r != nil {
		for j, e := range r.Estimates {
			switch e.Name {
			case "T":
				iT = j
			case "B":
				iB = j
			}
		}
	}
	if iT < 0 || iB < 0 {
		return Estimate{}, errf(method, "", 0, ErrBadConstant, "the fit has no parameters T and B")
	}
	T, B := r.Params[iT], r.Params[iB]
	c := B * B / T
	e := Estimate{
		ParamInfo: ParamInfo{Name: "c", Long: "hydraulic resistance of the aquitard", Unit: "s", Quantity: units.Time, Positive: true},
		Value:     c, StdErr: math.NaN(), Lower: math.NaN(), Upper: math.NaN(),
	}
	if r.Fit != nil && r.Fit.Covariance != nil {
		cov := r.Fit.Covariance
		v := 4*cov.At(iB, iB)/(B*B) + cov.At(iT, iT)/(T*T) - 4*cov.At(iB, iT)/(B*T)
		e.StdErr = c * math.Sqrt(math.Max(v, 0))
		e.Lower = math.Max(0, c-r.Fit.TValue*e.StdErr)
		e.Upper = c + r.Fit.TValue*e.StdErr
	}
	return e, nil
}
