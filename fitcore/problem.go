package fitcore

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// Problem defines a weighted nonlinear least-squares problem: find the
// parameters p that minimise ½ Σ wᵢ rᵢ(p)² over N observations.
//
// The solver never modifies a Problem; a Problem may be reused for several
// fits but must not be shared by concurrent fits unless its functions are
// safe for concurrent use.
type Problem struct {
	// N is the number of observations (residuals). It must be at least
	// the number of parameters.
	N int

	// Params describes each parameter: its name (used in messages and
	// warnings) and its constraints. Its length is the number of
	// parameters P.
	Params []Param

	// Residuals writes rᵢ(p), i = 0…N-1, into dst (len N). It must not
	// modify p or retain dst. A non-finite residual is reported as an
	// error at the start point and treated as a failed step elsewhere.
	// For a curve fit the usual choice is rᵢ = model(xᵢ; p) − yᵢ.
	Residuals func(dst, p []float64)

	// Jacobian, if not nil, writes ∂rᵢ/∂pⱼ into dst (N×P). It must not
	// modify p. If Jacobian is nil, central finite differences with a
	// step scaled to each parameter are used.
	Jacobian func(dst *mat.Dense, p []float64)

	// Weights, if not nil, holds wᵢ ≥ 0 for each observation (len N).
	// A zero weight excludes the observation. If Weights is nil every
	// weight is one.
	Weights []float64

	// Observed, if not nil, holds the observed values yᵢ (len N); it is
	// used only to report the coefficient of determination R².
	Observed []float64
}

// Param describes one parameter of a Problem.
type Param struct {
	// Name identifies the parameter in errors and warnings, e.g. "T".
	Name string

	// Positive makes the solver work with ln p instead of p, so that the
	// parameter stays positive and scale-free. The start value must be
	// positive.
	Positive bool

	// Lower and Upper bound the parameter. If both are zero the
	// parameter is unbounded; otherwise use math.Inf(-1) or math.Inf(1)
	// for an open side. Steps are projected onto the bounds.
	Lower, Upper float64
}

func (p Param) bounded() bool { return p.Lower != 0 || p.Upper != 0 }

func (p Param) clamp(v float64) float64 {
	if !p.bounded() {
		return v
	}
	return math.Max(p.Lower, math.Min(p.Upper, v))
}
