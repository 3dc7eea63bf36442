package fitcore

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"

	"fieldfit/fitcore/dense"
)

const (
	eps  = 0x1p-52
	tiny = 1e-300
	// lambdaMax bounds the damping; beyond it no step can lower the cost.
	lambdaMax = 1e32
)

// defaults returns a copy of s with every zero field replaced by its
// documented default.
func (s *Settings) defaults(np int) Settings {
	var d Settings
	if s != nil {
		d = *s
	}
	if d.MaxIterations <= 0 {
		d.MaxIterations = 1000
	}
	if d.MaxEvaluations <= 0 {
		d.MaxEvaluations = max(200*(np+1)*(np+1), 20000)
	}
	if d.StepTol <= 0 {
		d.StepTol = 1e-12
	}
	if d.GradTol <= 0 {
		d.GradTol = 1e-12
	}
	if d.CostTol <= 0 {
		d.CostTol = 1e-15
	}
	if d.InitialLambda <= 0 {
		d.InitialLambda = 1e-3
	}
	if d.StepFactor <= 0 || d.StepFactor > 1 {
		d.StepFactor = 1
	}
	if d.DiffStep <= 0 {
		d.DiffStep = math.Cbrt(eps)
	}
	if d.Confidence <= 0 || d.Confidence >= 1 {
		d.Confidence = 0.95
	}
	if d.IllConditioned <= 0 {
		d.IllConditioned = 1e10
	}
	return d
}

// solver holds the state and scratch storage of one fit, allocated once
// and reused by every iteration.
type solver struct {
	p   *Problem
	set Settings
	n   int // observations
	np  int // parameters
	sw  []float64

	q, qNew   []float64 // working parameters (ln p for Positive ones)
	pv, pNew  []float64 // parameters in the problem's space
	r, rNew   []float64 // weighted residuals √wᵢ rᵢ
	rPlus     []float64 // finite-difference scratch
	rMinus    []float64
	pScratch  []float64
	jac       *mat.Dense       // weighted Jacobian in working space (N×P)
	a         blas64.Symmetric // JᵀWJ, upper triangle
	damped    blas64.Symmetric // JᵀWJ + λD, upper triangle
	chol      dense.Cholesky
	g, delta  []float64 // gradient JᵀWr and step
	diag      []float64 // scaling D, the largest diag(JᵀWJ) seen
	colScale  []float64
	cost      float64
	evals     int
	jacEvals  int
	iteration int
}

// Fit minimises ½ Σ wᵢ rᵢ(p)² from start and returns the result. A nil
// settings means the defaults. start is not modified.
//
// When the fit stops on an error after a valid start point, Fit returns
// the partial result (the best point reached) together with the error.
func Fit(p *Problem, start []float64, settings *Settings) (*Result, error) {
	if err := check(p, start); err != nil {
		return nil, err
	}
	s := newSolver(p, settings)
	for j, v := range start {
		s.q[j] = s.toWork(j, v)
	}
	s.fromWork(s.pv, s.q)
	res := &Result{Params: make([]float64, s.np), Status: NotStarted}
	copy(res.Params, s.pv)

	if err := s.residuals(s.r, s.pv); err != nil {
		e := err.(*Error)
		e.Op = "start"
		return nil, e
	}
	s.cost = half(s.r)
	if err := s.jacobian(true); err != nil {
		return nil, err
	}
	status, err := s.iterate()
	copy(res.Params, s.pv)
	res.Status = status
	res.Iterations = s.iteration
	res.Evaluations = s.evals
	res.JacobianEvals = s.jacEvals
	if err != nil {
		res.Status = Failed
		s.summary(res)
		return res, err
	}
	s.summary(res)
	return res, nil
}

// check validates the problem and the start point.
func check(p *Problem, start []float64) error {
	bad := func(obs int, msg string) error {
		return &Error{Op: "check", Param: -1, Obs: obs, Err: wrap(ErrBadProblem, msg)}
	}
	if p == nil || p.Residuals == nil {
		return bad(-1, "no residual function")
	}
	np := len(p.Params)
	if np == 0 {
		return bad(-1, "no parameters")
	}
	if len(start) != np {
		return bad(-1, "start has "+itoa(len(start))+" values for "+itoa(np)+" parameters")
	}
	if p.N <= 0 {
		return &Error{Op: "check", Param: -1, Obs: -1, Err: ErrTooFewObservations}
	}
	if p.Weights != nil && len(p.Weights) != p.N {
		return bad(-1, "weights have "+itoa(len(p.Weights))+" values for "+itoa(p.N)+" observations")
	}
	if p.Observed != nil && len(p.Observed) != p.N {
		return bad(-1, "observed values have "+itoa(len(p.Observed))+" values for "+itoa(p.N)+" observations")
	}
	used := p.N
	for i, w := range p.Weights {
		switch {
		case math.IsNaN(w) || math.IsInf(w, 0):
			return &Error{Op: "check", Param: -1, Obs: i, Value: w, Err: wrap(ErrNonFinite, "weight")}
		case w < 0:
			return &Error{Op: "check", Param: -1, Obs: i, Value: w, Err: wrap(ErrBadProblem, "negative weight")}
		case w == 0:
			used--
		}
	}
	for i, y := range p.Observed {
		if math.IsNaN(y) || math.IsInf(y, 0) {
			return &Error{Op: "check", Param: -1, Obs: i, Value: y, Err: wrap(ErrNonFinite, "observed value")}
		}
	}
	if used < np {
		return &Error{Op: "check", Param: -1, Obs: -1, Err: wrap(ErrTooFewObservations,
			itoa(used)+" observations for "+itoa(np)+" parameters")}
	}
	for j, v := range start {
		par := p.Params[j]
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &Error{Op: "start", Param: j, Name: par.Name, Obs: -1, Value: v, Err: ErrNonFinite}
		}
		if par.Positive && v <= 0 {
			return &Error{Op: "start", Param: j, Name: par.Name, Obs: -1, Value: v, Err: wrap(ErrBadStart, "must be positive")}
		}
		if par.bounded() {
			if math.IsNaN(par.Lower) || math.IsNaN(par.Upper) || par.Lower > par.Upper {
				return &Error{Op: "check", Param: j, Name: par.Name, Obs: -1, Err: wrap(ErrBadProblem, "lower bound above upper bound")}
			}
			if v < par.Lower || v > par.Upper {
				return &Error{Op: "start", Param: j, Name: par.Name, Obs: -1, Value: v, Err: wrap(ErrBadStart, "outside the bounds")}
			}
		}
	}
	return nil
}

func newSolver(p *Problem, settings *Settings) *solver {
	np := len(p.Params)
	n := p.N
	s := &solver{
		p:        p,
		set:      settings.defaults(np),
		n:        n,
		np:       np,
		q:        make([]float64, np),
		qNew:     make([]float64, np),
		pv:       make([]float64, np),
		pNew:     make([]float64, np),
		pScratch: make([]float64, np),
		r:        make([]float64, n),
		rNew:     make([]float64, n),
		rPlus:    make([]float64, n),
		rMinus:   make([]float64, n),
		jac:      mat.NewDense(n, np, nil),
		a:        newSym(np),
		damped:   newSym(np),
		g:        make([]float64, np),
		delta:    make([]float64, np),
		diag:     make([]float64, np),
		colScale: make([]float64, np),
	}
	if p.Weights != nil {
		s.sw = make([]float64, n)
		for i, w := range p.Weights {
			s.sw[i] = math.Sqrt(w)
		}
	}
	return s
}

// toWork maps a parameter value to the working space.
func (s *solver) toWork(j int, v float64) float64 {
	if s.p.Params[j].Positive {
		return math.Log(v)
	}
	return v
}

// fromWork maps working parameters to the problem's space, projecting
// them onto the bounds.
func (s *solver) fromWork(dst, q []float64) {
	for j, v := range q {
		par := s.p.Params[j]
		if par.Positive {
			v = math.Exp(v)
		}
		dst[j] = par.clamp(v)
	}
}

// project moves working parameters onto the bounds in place.
func (s *solver) project(q []float64) {
	for j := range q {
		par := s.p.Params[j]
		if !par.bounded() {
			continue
		}
		if par.Positive {
			lo, hi := math.Inf(-1), math.Inf(1)
			if par.Lower > 0 {
				lo = math.Log(par.Lower)
			}
			if par.Upper > 0 {
				hi = math.Log(par.Upper)
			}
			q[j] = math.Max(lo, math.Min(hi, q[j]))
		} else {
			q[j] = par.clamp(q[j])
		}
	}
}

// residuals evaluates the weighted residuals at pv into dst and reports
// the first non-finite one.
func (s *solver) residuals(dst, pv []float64) error {
	copy(s.pScratch, pv)
	s.p.Residuals(dst, s.pScratch)
	s.evals++
	for i, v := range dst {
		if s.sw != nil {
			if s.sw[i] == 0 {
				dst[i] = 0
				continue
			}
			v *= s.sw[i]
			dst[i] = v
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &Error{Op: "step", Param: -1, Obs: i, Value: v, Err: wrap(ErrNonFinite, "residual")}
		}
	}
	return nil
}

// jacobian fills s.jac with the weighted Jacobian in working space at
// the current point, and forms JᵀWJ and the gradient JᵀWr. At the start
// it also rejects parameters with no effect on any residual.
func (s *solver) jacobian(atStart bool) error {
	s.jacEvals++
	op := "jacobian"
	if atStart {
		op = "start"
	}
	if s.p.Jacobian != nil {
		copy(s.pScratch, s.pv)
		s.p.Jacobian(s.jac, s.pScratch)
		// Chain rule for log-space parameters (∂p/∂ln p = p) and the
		// row weights √wᵢ.
		for j := 0; j < s.np; j++ {
			s.colScale[j] = 1
			if s.p.Params[j].Positive {
				s.colScale[j] = s.pv[j]
			}
		}
		raw := s.jac.RawMatrix()
		for i := 0; i < s.n; i++ {
			row := raw.Data[i*raw.Stride : i*raw.Stride+s.np]
			w := 1.0
			if s.sw != nil {
				w = s.sw[i]
			}
			for j := range row {
				row[j] *= s.colScale[j] * w
			}
		}
	} else if err := s.finiteDifferences(); err != nil {
		return err
	}
	raw := s.jac.RawMatrix()
	for i := 0; i < s.n; i++ {
		row := raw.Data[i*raw.Stride : i*raw.Stride+s.np]
		for j, v := range row {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &Error{Op: op, Param: j, Name: s.p.Params[j].Name, Obs: i, Value: v, Err: wrap(ErrNonFinite, "derivative")}
			}
		}
	}
	dense.Gram(s.a, s.jac.RawMatrix())
	dense.MulTVec(s.g, s.jac.RawMatrix(), s.r)
	for j := 0; j < s.np; j++ {
		d := s.a.Data[j*s.a.Stride+j]
		if atStart && d == 0 {
			return &Error{Op: op, Param: j, Name: s.p.Params[j].Name, Obs: -1, Err: ErrZeroColumn}
		}
		if d > s.diag[j] {
			s.diag[j] = d
		}
	}
	return nil
}

// finiteDifferences fills s.jac by central differences in working space,
// weighted like the residuals.
func (s *solver) finiteDifferences() error {
	h0 := s.set.DiffStep
	for j := 0; j < s.np; j++ {
		copy(s.qNew, s.q)
		qj := s.q[j]
		var h float64
		if s.p.Params[j].Positive {
			h = h0 // a relative step in p
		} else {
			h = h0 * math.Max(math.Abs(qj), 1e-8)
		}
		// Make h exactly representable relative to qj.
		tmp := qj + h
		h = tmp - qj
		s.qNew[j] = qj + h
		s.project(s.qNew)
		hp := s.qNew[j] - qj
		s.fromWork(s.pNew, s.qNew)
		if err := s.residuals(s.rPlus, s.pNew); err != nil {
			hp = 0
			copy(s.rPlus, s.r)
		}
		s.qNew[j] = qj - h
		s.project(s.qNew)
		hm := qj - s.qNew[j]
		s.fromWork(s.pNew, s.qNew)
		if err := s.residuals(s.rMinus, s.pNew); err != nil {
			hm = 0
			copy(s.rMinus, s.r)
		}
		den := hp + hm
		if den == 0 {
			e := &Error{Op: "jacobian", Param: j, Name: s.p.Params[j].Name, Obs: -1,
				Err: wrap(ErrNonFinite, "residuals are not finite on either side of the point")}
			return e
		}
		for i := 0; i < s.n; i++ {
			s.jac.Set(i, j, (s.rPlus[i]-s.rMinus[i])/den)
		}
	}
	return nil
}

// iterate runs the Levenberg–Marquardt iterations from the current point.
func (s *solver) iterate() (Status, error) {
	set := s.set
	lambda := set.InitialLambda
	nu := 2.0
	if s.cost == 0 {
		return ExactFit, nil
	}
	for {
		if s.iteration >= set.MaxIterations {
			return IterationLimit, nil
		}
		if s.evals >= set.MaxEvaluations {
			return EvaluationLimit, nil
		}
		if s.gradientSmall() {
			return GradientConverged, nil
		}
		s.iteration++

		if !s.solveStep(lambda) {
			lambda *= nu
			nu *= 2
			if lambda > lambdaMax {
				return Stalled, nil
			}
			continue
		}
		// Scale the step and form the trial point.
		d := s.delta
		for j := range d {
			d[j] *= set.StepFactor
		}
		accepted, pred, actual, err := s.trial(d)
		if err != nil {
			return Failed, err
		}
		if !accepted && set.LineSearch {
			for k := 0; k < 10 && !accepted; k++ {
				for j := range d {
					d[j] *= 0.5
				}
				accepted, pred, actual, err = s.trial(d)
				if err != nil {
					return Failed, err
				}
			}
		}
		if !accepted {
			if pred <= 4*eps*s.cost {
				// No step the model predicts can lower the cost by more
				// than rounding: the minimum is reached to machine
				// precision.
				return CostConverged, nil
			}
			lambda *= nu
			nu *= 2
			if lambda > lambdaMax {
				return Stalled, nil
			}
			continue
		}
		rho := actual / pred
		lambda *= math.Max(1.0/3, 1-math.Pow(2*rho-1, 3))
		lambda = math.Max(lambda, 1e-300)
		nu = 2
		oldCost := s.cost
		stepNorm, qNorm := 0.0, 0.0
		for j := range d {
			dj := math.Sqrt(s.diag[j]) * (s.qNew[j] - s.q[j])
			qj := math.Sqrt(s.diag[j]) * s.q[j]
			stepNorm += dj * dj
			qNorm += qj * qj
		}
		copy(s.q, s.qNew)
		copy(s.pv, s.pNew)
		copy(s.r, s.rNew)
		s.cost = half(s.r)
		if s.cost == 0 {
			return ExactFit, nil
		}
		if err := s.jacobian(false); err != nil {
			return Failed, err
		}
		if math.Sqrt(stepNorm) <= set.StepTol*(math.Sqrt(qNorm)+set.StepTol) {
			return StepConverged, nil
		}
		if actual <= set.CostTol*oldCost && pred <= set.CostTol*oldCost {
			return CostConverged, nil
		}
	}
}

// gradientSmall applies the cosine test of Moré (1978).
func (s *solver) gradientSmall() bool {
	rn := math.Sqrt(2 * s.cost)
	if rn == 0 {
		return true
	}
	worst := 0.0
	for j := 0; j < s.np; j++ {
		cn := math.Sqrt(s.a.Data[j*s.a.Stride+j])
		if cn == 0 {
			continue
		}
		worst = math.Max(worst, math.Abs(s.g[j])/(cn*rn))
	}
	return worst <= s.set.GradTol
}

// solveStep solves (JᵀWJ + λD) δ = −JᵀWr into s.delta by Cholesky,
// falling back to a QR solve of the equivalent augmented least-squares
// problem. It reports false when neither gives a finite step.
func (s *solver) solveStep(lambda float64) bool {
	copy(s.damped.Data, s.a.Data)
	for j := 0; j < s.np; j++ {
		s.damped.Data[j*s.np+j] += lambda * s.diag[j]
	}
	if s.chol.Factorize(s.damped) {
		s.chol.SolveVec(s.delta, s.g)
		for j := range s.delta {
			s.delta[j] = -s.delta[j]
		}
		if finiteVec(s.delta) {
			return true
		}
	}
	// Fallback: min ‖[J; √(λD)] δ + [r; 0]‖ by QR.
	np := s.np
	aug := blas64.General{Rows: s.n + np, Cols: np, Stride: np, Data: make([]float64, (s.n+np)*np)}
	jac := s.jac.RawMatrix()
	for i := 0; i < s.n; i++ {
		copy(aug.Data[i*np:i*np+np], jac.Data[i*jac.Stride:i*jac.Stride+np])
	}
	for j := 0; j < np; j++ {
		aug.Data[(s.n+j)*np+j] = math.Sqrt(lambda * s.diag[j])
	}
	rhs := make([]float64, s.n+np)
	for i := 0; i < s.n; i++ {
		rhs[i] = -s.r[i]
	}
	if math.IsInf(dense.LeastSquares(s.delta, aug, rhs), 1) {
		return false
	}
	return finiteVec(s.delta)
}

// trial evaluates q + d. It returns whether the cost went down, the
// predicted and the actual reduction. A non-finite residual counts as
// a failed step, not an error.
func (s *solver) trial(d []float64) (accepted bool, pred, actual float64, err error) {
	for j := range d {
		s.qNew[j] = s.q[j] + d[j]
	}
	s.project(s.qNew)
	// Predicted reduction of the Gauss–Newton model for the taken step:
	// −gᵀh − ½ hᵀAh.
	pred = 0
	for j := 0; j < s.np; j++ {
		hj := s.qNew[j] - s.q[j]
		pred -= s.g[j] * hj
		ah := 0.0
		for k := 0; k < s.np; k++ {
			ah += symAt(s.a, j, k) * (s.qNew[k] - s.q[k])
		}
		pred -= 0.5 * hj * ah
	}
	same := true
	for j := range s.q {
		if s.qNew[j] != s.q[j] {
			same = false
			break
		}
	}
	if same || !(pred > 0) {
		return false, math.Max(pred, 0), 0, nil
	}
	s.fromWork(s.pNew, s.qNew)
	if e := s.residuals(s.rNew, s.pNew); e != nil {
		return false, pred, 0, nil
	}
	newCost := half(s.rNew)
	actual = s.cost - newCost
	return actual > 0, pred, actual, nil
}

func half(r []float64) float64 {
	// Scaled sum of squares, safe from overflow for large residuals.
	var scale, ssq float64 = 0, 1
	for _, v := range r {
		if v == 0 {
			continue
		}
		a := math.Abs(v)
		if scale < a {
			ssq = 1 + ssq*(scale/a)*(scale/a)
			scale = a
		} else {
			ssq += (a / scale) * (a / scale)
		}
	}
	return 0.5 * scale * scale * ssq
}

func finiteVec(v []float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

// newSym returns an n×n symmetric matrix stored in its upper triangle.
func newSym(n int) blas64.Symmetric {
	return blas64.Symmetric{N: n, Stride: n, Uplo: blas.Upper, Data: make([]float64, n*n)}
}

// symAt returns element (i, j) of a symmetric matrix stored upper.
func symAt(a blas64.Symmetric, i, j int) float64 {
	if i > j {
		i, j = j, i
	}
	return a.Data[i*a.Stride+j]
}
