package slug

import (
	"fmt"
	"math"
	"sort"

	"fieldfit/models"
	"fieldfit/models/units"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"
)

const cbpName = "Cooper–Bredehoeft–Papadopulos (1967)"

// The response F(α, β) is integrated on the axis x = ln u, where
//
//	F = (8α/π²) ∫ g(x) dx,  g(x) = exp(−β e^(2x)/α) / f(e^x).
//
// With u = e^x the integrand decays exponentially at both ends (like
// e^(2x) as x → −∞, where f ≈ 16α²/(π²u²), and at least like e^(−x) as
// x → +∞). It is smooth on the scale of one unit of x except near the
// root u* of u Y0(u) − 2α Y1(u), which small α brings close to
// √(2α/|ln u*|): there f ≈ A² + B'²(x − x*)² has a minimum, and 1/f a
// peak of half-width w = |A/B'| ≈ π/(4|ln(u*/2)|) in x (A = u J0 − 2α J1,
// B' = dB/dx at the root). The integral is therefore taken by 10-point
// Gauss–Legendre panels of width cbpPanel, graded down to w/2 around each
// such peak, from cbpLowSpan below the smaller of ln √α and ln √(α/β) to
// where β u²/α exceeds cbpCut.
const (
	cbpPanel   = 0.5
	cbpOrder   = 10
	cbpXMax    = 40.0 // u ≈ 2.4e17: beyond it the tail is below 1e-17
	cbpLowSpan = 14.0 // the integrand is below e^(−28) of its peak there
	// cbpCut: the integration stops where β u²/α exceeds cbpCut, where
	// the exponential factor is below e^(−cbpCut) ≈ 2e-22.
	cbpCut = 50.0
	// cbpY0Root is the first zero of Y0, about 0.8936: below it u Y0(u)
	// is negative, and the roots of u Y0 − 2α Y1 lie below it.
	cbpY0Root = 0.8935769662791675
)

// glX, glW are the Gauss–Legendre nodes and weights on [−1, 1].
var glX, glW = func() ([]float64, []float64) {
	x, w := make([]float64, cbpOrder), make([]float64, cbpOrder)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	return x, w
}()

// cbpQuad is the quadrature of the response for one α over a range of β:
// for each node, u², the weight times 1/f, and the weight times the
// α-derivative factor (1/f − α ∂f/∂α /f²).
type cbpQuad struct {
	alpha      float64
	u2, wq, wd []float64
}

// cbpB is u Y0(u) − 2α Y1(u) at u = e^x.
func cbpB(x, alpha float64) float64 {
	u := math.Exp(x)
	return u*math.Y0(u) - 2*alpha*math.Y1(u)
}

// cbpPeaks returns the narrow peaks (centre x*, half-width w < cbpPanel)
// of the integrand in [lo, hi].
func cbpPeaks(alpha, lo, hi float64) (xs, ws []float64) {
	top := math.Min(hi, math.Log(cbpY0Root))
	const scan = 0.125
	x, b := lo, cbpB(lo, alpha)
	for x < top {
		x2 := math.Min(x+scan, top)
		b2 := cbpB(x2, alpha)
		if (b > 0) != (b2 > 0) {
			a, c := x, x2
			for k := 0; k < 60 && c-a > 1e-13; k++ {
				m := 0.5 * (a + c)
				if (cbpB(m, alpha) > 0) == (b > 0) {
					a = m
				} else {
					c = m
				}
			}
			r := 0.5 * (a + c)
			u := math.Exp(r)
			j0, j1, y0, y1 := math.J0(u), math.J1(u), math.Y0(u), math.Y1(u)
			A := u*j0 - 2*alpha*j1
			// dB/du = Y0 − u Y1 − 2α (Y0 − Y1/u); dB/dx = u dB/du.
			dB := u * (y0 - u*y1 - 2*alpha*(y0-y1/u))
			if w := math.Abs(A / dB); w < cbpPanel && w > 0 {
				xs, ws = append(xs, r), append(ws, w)
			}
		}
		x, b = x2, b2
	}
	return xs, ws
}

// cbpEdges returns the panel edges on [lo, hi]: a uniform grid of width
// cbpPanel, refined around each narrow peak by edges at offsets whose
// spacing starts at w/2 and doubles up to cbpPanel.
func cbpEdges(lo, hi float64, xs, ws []float64) []float64 {
	var e []float64
	for x := lo; x < hi; x += cbpPanel {
		e = append(e, x)
	}
	e = append(e, hi)
	for k, xc := range xs {
		off, step := 0.0, ws[k]/2
		for off < 2*cbpPanel {
			for _, x := range []float64{xc - off, xc + off} {
				if x > lo && x < hi {
					e = append(e, x)
				}
			}
			off += step
			step = math.Min(2*step, cbpPanel)
		}
	}
	sort.Float64s(e)
	out := e[:1]
	for _, x := range e[1:] {
		if x-out[len(out)-1] > 1e-12 {
			out = append(out, x)
		}
	}
	return out
}

// newCBPQuad builds the quadrature for α and β in [bmin, bmax] (bmin > 0).
func newCBPQuad(alpha, bmin, bmax float64) *cbpQuad {
	lo := 0.5*math.Log(alpha) - cbpLowSpan
	if bmax > 1 {
		lo -= 0.5 * math.Log(bmax)
	}
	hi := math.Min(cbpXMax, 0.5*math.Log(cbpCut*alpha/bmin))
	q := &cbpQuad{alpha: alpha}
	if !(hi > lo) {
		return q
	}
	xs, ws := cbpPeaks(alpha, lo, hi)
	edges := cbpEdges(lo, hi, xs, ws)
	n := (len(edges) - 1) * cbpOrder
	q.u2, q.wq, q.wd = make([]float64, 0, n), make([]float64, 0, n), make([]float64, 0, n)
	for k := 0; k+1 < len(edges); k++ {
		c, h := 0.5*(edges[k]+edges[k+1]), 0.5*(edges[k+1]-edges[k])
		for i := range glX {
			u := math.Exp(c + h*glX[i])
			j0, j1, y0, y1 := math.J0(u), math.J1(u), math.Y0(u), math.Y1(u)
			a := u*j0 - 2*alpha*j1
			b := u*y0 - 2*alpha*y1
			inv := 1 / (a*a + b*b)
			df := -4*j1*a - 4*y1*b // ∂f/∂α
			w := h * glW[i]
			q.u2 = append(q.u2, u*u)
			q.wq = append(q.wq, w*inv)
			q.wd = append(q.wd, w*(inv-alpha*inv*inv*df))
		}
	}
	return q
}

// eval returns F(α, β) and, when deriv is set, ∂F/∂α and ∂F/∂β:
//
//	∂F/∂β = −(8/π²) ∫ u² e/f dx,
//	∂F/∂α = (8/π²) ∫ [1/f − α (∂f/∂α)/f² + (β u²/α)/f] e dx,
//	∂f/∂α = −4 J1 (u J0 − 2α J1) − 4 Y1 (u Y0 − 2α Y1),
//
// with e = exp(−β u²/α).
func (q *cbpQuad) eval(beta float64, deriv bool) (F, dA, dB float64) {
	c := beta / q.alpha
	var s, sa, sb float64
	for k, u2 := range q.u2 {
		x := c * u2
		if x > cbpCut {
			break // the nodes are in increasing u
		}
		e := math.Exp(-x)
		s += q.wq[k] * e
		if deriv {
			sa += (q.wd[k] + x*q.wq[k]) * e
			sb += u2 * q.wq[k] * e
		}
	}
	k8 := 8 / (math.Pi * math.Pi)
	return k8 * q.alpha * s, k8 * sa, -k8 * sb
}

// Response returns the normalised head H/H0 = F(α, β) of the Cooper,
// Bredehoeft & Papadopulos (1967) slug test in a confined aquifer,
//
//	F(α, β) = (8α/π²) ∫₀^∞ exp(−βu²/α) / (u·f(u)) du,
//	f(u) = [u J0(u) − 2α J1(u)]² + [u Y0(u) − 2α Y1(u)]²,
//
// with α = r_w²S/r_c² and β = T t/r_c². F(α, 0) = 1. It returns NaN when α
// is not positive or β is negative or either is not finite. The integral
// is evaluated by Gauss–Legendre panels in ln u (see the package tests for
// its agreement with mpmath).
func Response(alpha, beta float64) float64 {
	if !(alpha > 0) || !(beta >= 0) || math.IsInf(alpha, 0) || math.IsInf(beta, 0) {
		return math.NaN()
	}
	if beta == 0 {
		return 1
	}
	F, _, _ := newCBPQuad(alpha, beta, beta).eval(beta, false)
	return F
}

// CBP is the Cooper, Bredehoeft & Papadopulos (1967) model of a slug test
// in a fully penetrating well in a confined aquifer, as a models.Model:
//
//	H/H0 = F(α, β),  α = r_w²S/r_c²,  β = T t/r_c²,
//
// (see Response) with t the time since the slug was introduced or removed
// (s) and H/H0 the normalised head. The fitted parameters are the
// transmissivity T (m²/s) and the storativity S (−), both positive.
// CasingRadius is r_c, the radius of the casing where the water level
// moves (the effective radius when it moves in a gravel-packed screen);
// WellRadius is r_w, the radius of the screened well (m). The Jacobian is
// analytic: ∂F/∂T = (t/r_c²)∂F/∂β, ∂F/∂S = (r_w²/r_c²)∂F/∂α.
//
// Reference: Cooper, H.H., Bredehoeft, J.D. and Papadopulos, I.S. (1967),
// Response of a finite-diameter well to an instantaneous charge of water,
// Water Resources Research 3(1), 263–269.
type CBP struct {
	CasingRadius, WellRadius float64
}

func (m CBP) Name() string { return cbpName }

func (m CBP) Params() []models.ParamInfo {
	return []models.ParamInfo{
		{Name: "T", Long: "transmissivity", Unit: "m²/s", Quantity: units.Transmissivity, Positive: true},
		{Name: "S", Long: "storativity", Unit: "1", Quantity: units.Dimensionless, Positive: true},
	}
}

func (m CBP) Check() error {
	if bad(m.CasingRadius) || !(m.CasingRadius > 0) {
		return &models.Error{Method: cbpName, Index: -1, Field: "casing radius", Value: m.CasingRadius, Err: models.ErrBadConstant,
			Reason: "the casing radius must be a finite positive length"}
	}
	if bad(m.WellRadius) || !(m.WellRadius > 0) {
		return &models.Error{Method: cbpName, Index: -1, Field: "well radius", Value: m.WellRadius, Err: models.ErrBadConstant,
			Reason: "the well (screen) radius must be a finite positive length"}
	}
	return nil
}

func (m CBP) CheckPoint(t, y float64) error { return checkNormalised(t, y, false) }

// quad returns α and the quadrature for the times t at the parameters p,
// or nil when α or the β range is not usable (F is then NaN, or 1 at
// t = 0).
func (m CBP) quad(t, p []float64) (float64, *cbpQuad) {
	T, S := p[0], p[1]
	rc2 := m.CasingRadius * m.CasingRadius
	alpha := m.WellRadius * m.WellRadius * S / rc2
	bmin, bmax := math.Inf(1), 0.0
	for _, ti := range t {
		if b := T * ti / rc2; b > 0 {
			bmin, bmax = math.Min(bmin, b), math.Max(bmax, b)
		}
	}
	if !(alpha > 0) || bad(alpha) || !(bmax > 0) || bad(bmax) || bad(bmin) {
		return alpha, nil
	}
	return alpha, newCBPQuad(alpha, bmin, bmax)
}

func (m CBP) Eval(dst, t, p []float64) {
	T := p[0]
	rc2 := m.CasingRadius * m.CasingRadius
	alpha, q := m.quad(t, p)
	for i, ti := range t {
		switch b := T * ti / rc2; {
		case b == 0 && alpha > 0:
			dst[i] = 1
		case q == nil || !(b > 0) || bad(b):
			dst[i] = math.NaN()
		default:
			dst[i], _, _ = q.eval(b, false)
		}
	}
}

func (m CBP) Jacobian(dst *mat.Dense, t, p []float64) {
	T := p[0]
	rc2 := m.CasingRadius * m.CasingRadius
	ra := m.WellRadius * m.WellRadius / rc2
	_, q := m.quad(t, p)
	for i, ti := range t {
		b := T * ti / rc2
		if q == nil || !(b > 0) || bad(b) {
			dst.Set(i, 0, 0)
			dst.Set(i, 1, 0)
			continue
		}
		_, dA, dB := q.eval(b, true)
		// At α far below the published curves (S → 0 on data that
		// fall as one exponential) the α-derivative underflows to NaN:
		// the curve no longer depends on α there, so it is 0.
		if bad(dA) {
			dA = 0
		}
		if bad(dB) {
			dB = 0
		}
		dst.Set(i, 0, dB*ti/rc2)
		dst.Set(i, 1, dA*ra)
	}
}

// cbpStartAlphas are the trial values of α of the starting-guess search,
// two per decade.
var cbpStartAlphas = func() []float64 {
	var a []float64
	for e := -10.0; e <= -0.5; e += 0.5 {
		a = append(a, math.Pow(10, e))
	}
	return a
}()

// Start matches the curve to the readings: for each trial α (two per
// decade from 1e-10 to 0.3) it finds β at which F(α, β) equals the
// normalised head of a mid reading, which gives T, and keeps the α with
// the least sum of squares over at most 64 readings.
func (m CBP) Start(t, y []float64) ([]float64, error) {
	ts, ys := subsample(t, y, 64)
	// The reference reading: the one whose head is closest to 0.5 among
	// those between 0.05 and 0.95.
	ref := -1
	for i := range ts {
		if ts[i] > 0 && ys[i] > 0.05 && ys[i] < 0.95 && (ref < 0 || math.Abs(ys[i]-0.5) < math.Abs(ys[ref]-0.5)) {
			ref = i
		}
	}
	if ref < 0 {
		return nil, &models.Error{Method: cbpName, Index: -1, Err: models.ErrNoTrend,
			Reason: "no reading has a normalised head between 0.05 and 0.95: the recovery is not seen in the readings"}
	}
	rc2 := m.CasingRadius * m.CasingRadius
	ra := m.WellRadius * m.WellRadius / rc2
	bestT, bestS, best := 0.0, 0.0, math.Inf(1)
	f := make([]float64, len(ts))
	for _, alpha := range cbpStartAlphas {
		beta := solveBeta(alpha, ys[ref])
		if !(beta > 0) {
			continue
		}
		T := beta * rc2 / ts[ref]
		S := alpha / ra
		m.Eval(f, ts, []float64{T, S})
		sum := 0.0
		for i := range f {
			d := f[i] - ys[i]
			sum += d * d
		}
		if sum < best {
			bestT, bestS, best = T, S, sum
		}
	}
	if math.IsInf(best, 1) || bad(bestT) || bad(bestS) {
		return nil, &models.Error{Method: cbpName, Index: -1, Err: models.ErrNoTrend,
			Reason: "no starting guess: the readings do not follow the shape of the type curves"}
	}
	return []float64{bestT, bestS}, nil
}

// solveBeta returns β with F(α, β) = level by bisection in ln β.
func solveBeta(alpha, level float64) float64 {
	lo, hi := math.Log(1e-8), math.Log(1e8)
	q := newCBPQuad(alpha, 1e-8, 1e8)
	F := func(lb float64) float64 { f, _, _ := q.eval(math.Exp(lb), false); return f }
	if F(hi) > level || F(lo) < level {
		return math.NaN()
	}
	for k := 0; k < 50; k++ {
		mid := 0.5 * (lo + hi)
		if F(mid) > level {
			lo = mid
		} else {
			hi = mid
		}
	}
	return math.Exp(0.5 * (lo + hi))
}

// Validity accepts every reading after the start and notes the two usual
// limits of the method: S rests on the shape of the curve alone, and
// α > 0.1 is outside the range of the published type curves.
func (m CBP) Validity(ok []bool, t, p []float64) []string {
	for i, ti := range t {
		ok[i] = ti > 0
	}
	var notes []string
	rc2 := m.CasingRadius * m.CasingRadius
	alpha := m.WellRadius * m.WellRadius * p[1] / rc2
	if alpha > 0.1 {
		notes = append(notes, fmt.Sprintf("The fitted α = r_w²S/r_c² = %.3g is above 0.1, beyond the type curves usually drawn; check S and the radii.", alpha))
	}
	notes = append(notes, "S from a slug test rests on the shape of the curve alone: the type curves of neighbouring α differ little, so treat S as an order of magnitude.")
	return notes
}

// subsample returns at most maxN readings of t, y, evenly spaced by index
// (the first and the last included).
func subsample(t, y []float64, maxN int) (ts, ys []float64) {
	if len(t) <= maxN {
		return t, y
	}
	ts, ys = make([]float64, maxN), make([]float64, maxN)
	for k := range ts {
		i := k * (len(t) - 1) / (maxN - 1)
		ts[k], ys[k] = t[i], y[i]
	}
	return ts, ys
}

func bad(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }

// CooperBredehoeftPapadopulos fits the Cooper, Bredehoeft & Papadopulos
// (1967) type curves to the normalised head of the test (see CBP) by
// damped Newton least squares (models.Fit) on the window of the settings,
// and returns T and S with their confidence intervals and
//
//	K = T/b,
//
// with b the aquifer thickness when it is given, else the screen length
// (the tested thickness); when neither is given K is NaN and a caveat
// says so. The casing radius is the effective one (Geometry).
func CooperBredehoeftPapadopulos(t Test, s *Settings) (*Result, error) {
	if s == nil {
		s = &Settings{}
	}
	g := t.Geometry
	if err := g.check(cbpName); err != nil {
		return nil, err
	}
	nd, err := Normalise(t, s.H0Tolerance)
	if err != nil {
		setMethod(err, cbpName)
		return nil, err
	}
	m := CBP{CasingRadius: g.EffectiveCasingRadius(), WellRadius: g.WellRadius}
	fr, err := models.Fit(m, nd.Data, s.fitSettings())
	if fr == nil {
		return nil, err
	}
	T, _ := fr.Estimate("T")
	S, _ := fr.Estimate("S")
	r := &Result{
		Method:         cbpName,
		Transmissivity: T,
		Storativity:    S,
		Normalised:     nd,
		Fit:            fr,
		Caution:        Caution,
	}
	r.Assumptions = append(g.assumptions(),
		"The aquifer is confined, of uniform thickness and infinite extent, and the well fully penetrates it; the slug is introduced instantaneously (Cooper, Bredehoeft & Papadopulos 1967).",
		fmt.Sprintf("r_w = %g m, α = r_w²S/r_c² = %.3g at the fitted S.", g.WellRadius, g.WellRadius*g.WellRadius*S.Value/(m.CasingRadius*m.CasingRadius)))
	b := g.AquiferThickness
	switch {
	case b > 0:
		r.Assumptions = append(r.Assumptions, fmt.Sprintf("K = T/b with b = the aquifer thickness, %g m.", b))
		if g.ScreenLength > 0 && g.ScreenLength < b {
			r.Caveats = append(r.Caveats, fmt.Sprintf("The screen (%g m) is shorter than the aquifer (%g m) while the method assumes a fully penetrating well: T is that of the tested interval at best, and K = T/b may be low.", g.ScreenLength, b))
		}
	case g.ScreenLength > 0:
		b = g.ScreenLength
		r.Assumptions = append(r.Assumptions, fmt.Sprintf("K = T/b with b = the screen length, %g m (the aquifer thickness was not given).", b))
	default:
		r.Caveats = append(r.Caveats, "No aquifer thickness or screen length was given, so K = T/b cannot be computed.")
	}
	if b > 0 {
		r.K = scale(T, 1/b, kInfo)
	} else {
		r.K = models.Estimate{ParamInfo: kInfo, Value: math.NaN(), StdErr: math.NaN(), Lower: math.NaN(), Upper: math.NaN()}
	}
	r.KIn = convert(r.K, kUnits)
	if a := g.WellRadius * g.WellRadius * S.Value / (m.CasingRadius * m.CasingRadius); a < cbpMinAlpha {
		r.Caveats = append(r.Caveats, fmt.Sprintf("The fit ran to α = r_w²S/r_c² = %.3g, below %g, the smallest α of the type curves of Cooper, Bredehoeft & Papadopulos (1967) (from memory): S is not determined by these readings and its interval means nothing. Readings that fall as one exponential are better read by Hvorslev or Bouwer–Rice.", a, cbpMinAlpha))
	}
	r.Caveats = append(r.Caveats, fr.Caveats...)
	return r, err
}

// cbpMinAlpha is the smallest α of the published type curves of Cooper,
// Bredehoeft & Papadopulos (1967), 1e-10 (from memory).
const cbpMinAlpha = 1e-10
