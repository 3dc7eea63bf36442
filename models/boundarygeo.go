package models

import (
	"fmt"
	"math"

	"fieldfit/models/units"

	"gonum.org/v1/gonum/mat"
)

// BoundaryLine is one straight boundary placed by its geometry, for a
// joint fit of several observation wells (FitWells): the boundary lies at
// the distance a from the pumped well, and the observation point at the
// distance r (Base's R) in a direction making the angle θ (Angle, radians)
// with the perpendicular from the pumped well to the boundary. The image
// well sits on that perpendicular at 2a, so the observation point is
//
//	rᵢ = √(r² + 4a² − 4·a·r·cos θ)  [m]
//
// from it, and the drawdown is that of ImageWell with this rᵢ. θ = 0 puts
// the point between the pumped well and the boundary (rᵢ = 2a − r), θ =
// π/2 alongside the pumped well (rᵢ = √(r² + 4a²)), θ = π behind it (rᵢ =
// 2a + r). Each well of a joint fit has its own r and θ and so its own
// rᵢ, while a is one parameter shared by all: a fitted ImageWell distance
// rᵢ would instead be one value for every well, which holds only for
// wells equally far from the image well.
//
// If A is zero, a is fitted as the last parameter "a" (m, positive) after
// Base's; otherwise a = A is given. The point must lie on the pumped
// well's side of the boundary, a > r·cos θ (so rᵢ > r). The Jacobian is
// analytic: ImageWell's with ∂s/∂a = ±∂s_b/∂r(rᵢ) · (4a − 2r·cos θ)/rᵢ.
//
// Reference: the method of images as in ImageWell (Ferris et al. 1962,
// citation from memory); the distance follows from the law of cosines.
type BoundaryLine struct {
	Base  Radial
	Kind  BoundaryKind
	Angle float64 // θ, radians
	A     float64 // distance from the pumped well to the boundary, m; 0: fitted
}

func (m BoundaryLine) Name() string {
	if m.Base == nil {
		return "boundary line"
	}
	return fmt.Sprintf("%s with a %s", m.Base.Name(), m.Kind)
}

func (m BoundaryLine) fitted() bool { return m.A == 0 }

func (m BoundaryLine) Params() []ParamInfo {
	if m.Base == nil {
		return nil
	}
	p := m.Base.Params()
	if m.fitted() {
		p = append(p, ParamInfo{Name: "a", Long: "distance from the pumped well to the boundary", Unit: "m", Quantity: units.Length, Positive: true})
	}
	return p
}

// Check checks Base, the kind, the angle and a given distance a, which
// must be a finite positive number with the observation point on the
// pumped well's side (a > r·cos θ).
func (m BoundaryLine) Check() error {
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
	if bad(m.Angle) {
		return errf(name, "angle", m.Angle, ErrBadConstant, "the angle must be a finite number of radians")
	}
	if !m.fitted() {
		if bad(m.A) || !(m.A > 0) {
			return errf(name, "a", m.A, ErrBadConstant, "the distance to the boundary must be a finite positive number of metres; 0 fits it")
		}
		if rc := m.Base.Distance() * math.Cos(m.Angle); !(m.A > rc) {
			return errf(name, "a", m.A, ErrBadConstant,
				"the boundary must lie beyond the observation point: a must exceed r·cos θ = %.4g m", rc)
		}
	}
	return nil
}

func (m BoundaryLine) CheckPoint(t, y float64) error { return m.Base.CheckPoint(t, y) }

func (m BoundaryLine) Rate() float64 { return m.Base.Rate() }

// ImageDistance returns rᵢ for the boundary distance a.
func (m BoundaryLine) ImageDistance(a float64) float64 {
	r := m.Base.Distance()
	return math.Sqrt(math.Max(r*r+4*a*a-4*a*r*math.Cos(m.Angle), 0))
}

// image returns Base's parameters, a, and the ImageWell with the given rᵢ.
func (m BoundaryLine) image(p []float64) (pb []float64, a float64, iw ImageWell) {
	pb, a = p, m.A
	if m.fitted() {
		pb, a = p[:len(p)-1], p[len(p)-1]
	}
	return pb, a, ImageWell{Base: m.Base, Kind: m.Kind, Image: m.ImageDistance(a)}
}

func (m BoundaryLine) Eval(dst, t, p []float64) {
	pb, _, iw := m.image(p)
	iw.Eval(dst, t, pb)
}

func (m BoundaryLine) Jacobian(dst *mat.Dense, t, p []float64) {
	pb, a, iw := m.image(p)
	n, nb := len(t), len(pb)
	if n == 0 {
		return
	}
	iw.Jacobian(dst.Slice(0, n, 0, nb).(*mat.Dense), t, pb)
	if !m.fitted() {
		return
	}
	ri := iw.Image
	dri := (4*a - 2*m.Base.Distance()*math.Cos(m.Angle)) / ri
	d := make([]float64, n)
	m.Base.AtDistance(ri).DistanceDerivative(d, t, pb)
	sg := m.Kind.sign()
	for i := range d {
		dst.Set(i, nb, sg*d[i]*dri)
	}
}

// Start is ImageWell's start with rᵢ fitted, turned into a by
// a = (r·cos θ + √(rᵢ² − r²·sin² θ))/2.
func (m BoundaryLine) Start(t, y []float64) ([]float64, error) {
	if err := m.Check(); err != nil {
		return nil, err
	}
	if !m.fitted() {
		_, _, iw := m.image(nil)
		return iw.Start(t, y)
	}
	p, err := ImageWell{Base: m.Base, Kind: m.Kind}.Start(t, y)
	if err != nil {
		return nil, err
	}
	r, ri := m.Base.Distance(), p[len(p)-1]
	sn := r * math.Sin(m.Angle)
	p[len(p)-1] = (r*math.Cos(m.Angle) + math.Sqrt(math.Max(ri*ri-sn*sn, 0))) / 2
	if !(p[len(p)-1] > 0) {
		p[len(p)-1] = ri / 2
	}
	return p, nil
}

// Validity is ImageWell's with rᵢ from a, and a note when the fitted a
// does not put the observation point on the pumped well's side.
func (m BoundaryLine) Validity(ok []bool, t, p []float64) []string {
	pb, a, iw := m.image(p)
	notes := iw.Validity(ok, t, pb)
	if rc := m.Base.Distance() * math.Cos(m.Angle); !(a > rc) {
		notes = append(notes, fmt.Sprintf("The fitted boundary distance (a = %.4g m) puts the boundary on the near side of the observation point (r·cos θ = %.4g m).", a, rc))
	}
	return notes
}
