package models

import (
	"fmt"
	"math"

	"fieldfit/fitcore"
	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// BoundaryKind is the kind of a straight boundary of the aquifer.
type BoundaryKind int

const (
	// NoFlowBoundary is an impermeable boundary (a fault, the edge of
	// the aquifer): its image well pumps like the real one, and its
	// drawdown adds.
	NoFlowBoundary BoundaryKind = iota + 1
	// ConstantHeadBoundary is a boundary at fixed head (a river or lake in
	// full contact with the aquifer): its image well injects at the
	// pumping rate, and its drawdown subtracts.
	ConstantHeadBoundary
)

func (k BoundaryKind) String() string {
	switch k {
	case NoFlowBoundary:
		return "no-flow boundary"
	case ConstantHeadBoundary:
		return "constant-head boundary"
	}
	return fmt.Sprintf("BoundaryKind(%d)", int(k))
}

// sign is +1 for a no-flow and −1 for a constant-head boundary.
func (k BoundaryKind) sign() float64 {
	if k == ConstantHeadBoundary {
		return -1
	}
	return 1
}

// ImageWell adds one straight boundary to a radial drawdown model by the
// method of images: the boundary is replaced by an image well at the
// mirror image of the pumped well, pumping at the same rate (no-flow
// boundary) or injecting at it (constant-head boundary), so that
//
//	s(t) = s_b(t; r) ± s_b(t; rᵢ)  [m],
//
// with s_b the drawdown of Base (Theis or Hantush) at the distance r of
// the observation point from the pumped well (Base's own R) and at its
// distance rᵢ from the image well, + for a no-flow and − for a
// constant-head boundary. The observation point lies on the side of the
// pumped well, so rᵢ > r; rᵢ = 2a when the drawdown is read in the pumped
// well itself, a being its distance from the boundary. With several
// observation wells at known positions rᵢ follows from the geometry; from
// one well it is fitted. In a joint fit (FitWells) give each well its
// own Image, or use BoundaryLine, which fits the distance of the
// boundary and gives each well its own rᵢ from its bearing: a fitted rᵢ
// of ImageWell would be one parameter shared by all wells, which holds
// only for wells equally far from the image well.
//
// If Image is zero, rᵢ is fitted as the last parameter "ri" (m, positive),
// after Base's parameters; otherwise rᵢ = Image is given and must exceed
// r. The Jacobian is analytic: Base's Jacobian at r and at rᵢ, and ∂s/∂rᵢ
// = ±∂s_b/∂r at rᵢ (Radial.DistanceDerivative).
//
// At late time the log-derivative ds/d ln t of Theis drawdown tends to
// twice its infinite-aquifer value near a no-flow boundary and to zero
// near a constant-head one; see BoundaryDerivativeRatio.
//
// Reference: the method of images for one straight boundary, as set out
// for pumping tests by Ferris, Knowles, Brown & Stallman (1962), Theory
// of aquifer tests, USGS Water-Supply Paper 1536-E (citation from memory).
type ImageWell struct {
	Base  Radial
	Kind  BoundaryKind
	Image float64 // distance from the observation point to the image well, m; 0: fitted
}

func (m ImageWell) Name() string {
	if m.Base == nil {
		return "image well"
	}
	return fmt.Sprintf("%s with a %s (image well)", m.Base.Name(), m.Kind)
}

func (m ImageWell) fitted() bool { return m.Image == 0 }

func (m ImageWell) Params() []ParamInfo {
	if m.Base == nil {
		return nil
	}
	p := m.Base.Params()
	if m.fitted() {
		p = append(p, ParamInfo{Name: "ri", Long: "distance to the image well", Unit: "m", Quantity: units.Length, Positive: true})
	}
	return p
}

// Check checks Base, the kind of boundary and a given image distance,
// which must be a finite number greater than the distance r of Base.
func (m ImageWell) Check() error {
	name := m.Name()
	if m.Base == nil {
		return errf(name, "", 0, ErrBadConstant, "no model to add the boundary to")
	}
	if err := m.Base.Check(); err != nil {
		return err
	}
	if m.Kind != NoFlowBoundary && m.Kind != ConstantHeadBoundary {
		return errf(name, "boundary kind", float64(m.Kind), ErrBadConstant, "the boundary must be no-flow or constant-head")
	}
	if !m.fitted() {
		r := m.Base.Distance()
		if bad(m.Image) || !(m.Image > r) {
			return errf(name, "ri", m.Image, ErrBadConstant,
				"the distance to the image well must be a finite number greater than the distance to the pumped well (r = %g m); 0 fits it", r)
		}
	}
	return nil
}

func (m ImageWell) CheckPoint(t, y float64) error { return m.Base.CheckPoint(t, y) }

func (m ImageWell) Rate() float64 { return m.Base.Rate() }

// split returns Base's parameters and the image distance.
func (m ImageWell) split(p []float64) (pb []float64, ri float64) {
	if m.fitted() {
		return p[:len(p)-1], p[len(p)-1]
	}
	return p, m.Image
}

func (m ImageWell) Eval(dst, t, p []float64) {
	pb, ri := m.split(p)
	m.Base.Eval(dst, t, pb)
	v := make([]float64, len(t))
	m.Base.AtDistance(ri).Eval(v, t, pb)
	sg := m.Kind.sign()
	for i := range dst {
		dst[i] += sg * v[i]
	}
}

func (m ImageWell) Jacobian(dst *mat.Dense, t, p []float64) {
	pb, ri := m.split(p)
	nb := len(pb)
	n := len(t)
	if n == 0 {
		return
	}
	jb := dst.Slice(0, n, 0, nb).(*mat.Dense)
	m.Base.Jacobian(jb, t, pb)
	img := m.Base.AtDistance(ri)
	ji := mat.NewDense(n, nb, nil)
	img.Jacobian(ji, t, pb)
	sg := m.Kind.sign()
	rb, ri2 := jb.RawMatrix(), ji.RawMatrix()
	for i := 0; i < n; i++ {
		row, add := rb.Data[i*rb.Stride:i*rb.Stride+nb], ri2.Data[i*ri2.Stride:i*ri2.Stride+nb]
		for j := range row {
			row[j] += sg * add[j]
		}
	}
	if m.fitted() {
		d := make([]float64, n)
		img.DistanceDerivative(d, t, pb)
		for i := range d {
			dst.Set(i, nb, sg*d[i])
		}
	}
}

// Start takes Base's starting guess from the earlier half (in log time)
// of the readings, before a boundary shows, and from all readings. When
// rᵢ is fitted it tries image distances from 1.05·r to the distance at
// which the image well would not be felt by the last reading (u = 10 at
// rᵢ), five per decade, each refined by at most 12 Levenberg–Marquardt
// iterations of the whole model, and keeps the result with the smallest
// sum of squares. The readings are subsampled to at most 64.
func (m ImageWell) Start(t, y []float64) ([]float64, error) {
	if err := m.Check(); err != nil {
		return nil, err
	}
	name := m.Name()
	nb := len(m.Base.Params())
	tmin, tmax := math.Inf(1), 0.0
	for _, ti := range t {
		tmin, tmax = math.Min(tmin, ti), math.Max(tmax, ti)
	}
	var cands [][]float64
	var firstErr error
	var te, ye []float64
	for i, ti := range t {
		if ti <= math.Sqrt(tmin*tmax) {
			te, ye = append(te, ti), append(ye, y[i])
		}
	}
	for _, d := range [][2][]float64{{te, ye}, {t, y}} {
		if len(d[0]) < nb+1 {
			continue
		}
		p, err := m.Base.Start(d[0], d[1])
		if err != nil {
			if firstErr == nil {
				firstErr = err
			}
			continue
		}
		cands = append(cands, p)
	}
	if len(cands) == 0 {
		if firstErr != nil {
			return nil, firstErr
		}
		return nil, errf(name, "", 0, ErrTooFewPoints, "too few readings for a starting guess")
	}
	ts, ys := subsample(t, y, 64)
	f := make([]float64, len(ts))
	ssr := func(p []float64) float64 {
		m.Eval(f, ts, p)
		sum := 0.0
		for i := range f {
			d := f[i] - ys[i]
			sum += d * d
		}
		if bad(sum) {
			return math.Inf(1)
		}
		return sum
	}
	r := m.Base.Distance()
	var best []float64
	bestSSR := math.Inf(1)
	keep := func(p []float64, v float64) {
		if v < bestSSR {
			best, bestSSR = p, v
		}
	}
	for _, pb := range cands {
		if !m.fitted() {
			keep(pb, ssr(pb))
			continue
		}
		T, S := pb[0], pb[1]
		rmax := math.Sqrt(40 * T * tmax / S) // u = 10 at the last reading
		if !(rmax > 1.05*r) || bad(rmax) {
			rmax = 1000 * r
		}
		// Base's parameters from readings that may already feel the
		// boundary are biased, so each trial distance is refined with a
		// few damped Newton steps of the whole model.
		for lr := math.Log10(1.05 * r); lr <= math.Log10(rmax)+1e-9; lr += 0.2 {
			p := append(append([]float64(nil), pb...), math.Pow(10, lr))
			if q, v, ok := quickFit(m, ts, ys, p, 12); ok && q[len(q)-1] > r {
				keep(q, v)
			} else {
				keep(p, ssr(p))
			}
		}
	}
	if best == nil {
		return nil, errf(name, "", 0, ErrNoTrend, "no starting guess: the model gives no finite drawdown for the readings")
	}
	return best, nil
}

// Validity applies Base's validity rule and adds notes when rᵢ does not
// exceed r (the image well would lie nearer than the pumped well: not a
// straight boundary beyond the well; every reading is then marked invalid)
// or when the image well changes the drawdown at the last reading by less
// than 1 % (rᵢ rests on that small effect).
func (m ImageWell) Validity(ok []bool, t, p []float64) []string {
	pb, ri := m.split(p)
	notes := m.Base.Validity(ok, t, pb)
	r := m.Base.Distance()
	if !(ri > r) {
		for i := range ok {
			ok[i] = false
		}
		return append(notes, fmt.Sprintf("The distance to the image well (rᵢ = %.4g m) does not exceed the distance to the pumped well (r = %.4g m): the fit does not describe a straight boundary beyond the well; try the model without a boundary or fix rᵢ.", ri, r))
	}
	tmax := 0.0
	for _, ti := range t {
		tmax = math.Max(tmax, ti)
	}
	if tmax > 0 {
		s := make([]float64, 1)
		si := make([]float64, 1)
		m.Base.Eval(s, []float64{tmax}, pb)
		m.Base.AtDistance(ri).Eval(si, []float64{tmax}, pb)
		if math.Abs(si[0]) < 0.01*math.Abs(s[0]) {
			notes = append(notes, fmt.Sprintf("The image well changes the drawdown at the last reading by only %.2g %%: the data hardly show the boundary, so rᵢ is poorly determined.", 100*math.Abs(si[0]/s[0])))
		}
	}
	return notes
}

// BoundaryDerivativeRatio returns the log-derivative ds/d ln t of Theis
// drawdown near one straight boundary, as a ratio to the value Q/(4πT) of
// infinite-acting radial flow:
//
//	D = e^(−u) ± e^(−u·ρ²),  u = r²S/(4Tt),  ρ = rᵢ/r,
//
// with + for a no-flow and − for a constant-head boundary (it follows
// from t·∂W(u)/∂t = e^(−u) for the real and the image well). As u → 0 it
// tends to 2 (the derivative doubles: a no-flow boundary) or to 0 (it
// falls towards zero: a constant-head boundary); before the image well is
// felt it is e^(−u) → 1. It returns NaN for u < 0, ρ < 1 or an unknown
// kind.
func BoundaryDerivativeRatio(kind BoundaryKind, u, rho float64) float64 {
	if !(u >= 0) || !(rho >= 1) || (kind != NoFlowBoundary && kind != ConstantHeadBoundary) {
		return math.NaN()
	}
	return math.Exp(-u) + kind.sign()*math.Exp(-u*rho*rho)
}

// HantushDerivativeRatio returns the log-derivative ds/d ln t of
// Hantush–Jacob drawdown as a ratio to Q/(4πT):
//
//	D = exp(−u − β²/(4u)),
//
// which rises to a maximum e^(−β) at u = β/2 and then falls towards zero
// as the leakage takes over (steady state). It returns NaN for u or β
// negative or NaN.
func HantushDerivativeRatio(u, beta float64) float64 {
	if !(u >= 0) || !(beta >= 0) {
		return math.NaN()
	}
	if u == 0 {
		if beta == 0 {
			return 1
		}
		return 0
	}
	return math.Exp(-u - beta*beta/(4*u))
}

// quickFit runs at most iter Levenberg–Marquardt iterations of m on the
// readings t, y from start and returns the point reached and its sum of
// squares; ok is false when the solver fails.
func quickFit(m Model, t, y, start []float64, iter int) (p []float64, ssr float64, ok bool) {
	info := m.Params()
	prob := &fitcore.Problem{
		N:      len(t),
		Params: make([]fitcore.Param, len(info)),
		Residuals: func(dst, p []float64) {
			m.Eval(dst, t, p)
			for i := range dst {
				dst[i] -= y[i]
			}
		},
		Jacobian: func(dst *mat.Dense, p []float64) { m.Jacobian(dst, t, p) },
	}
	for j, pi := range info {
		prob.Params[j] = fitcore.Param{Name: pi.Name, Positive: pi.Positive}
	}
	fr, err := fitcore.Fit(prob, start, &fitcore.Settings{MaxIterations: iter})
	if fr == nil || err != nil || !validStart(info, fr.Params) || bad(fr.SSR) {
		return nil, 0, false
	}
	return fr.Params, fr.SSR, true
}
