package fitcore

import "gonum.org/v1/gonum/mat"

// Status says why a fit stopped.
type Status int

const (
	// NotStarted means the fit failed before its first iteration.
	NotStarted Status = iota
	// StepConverged means the relative step fell below Settings.StepTol.
	StepConverged
	// GradientConverged means the scaled gradient fell below
	// Settings.GradTol.
	GradientConverged
	// CostConverged means the relative change of the cost fell below
	// Settings.CostTol.
	CostConverged
	// ExactFit means the cost reached zero to machine precision.
	ExactFit
	// IterationLimit means Settings.MaxIterations was reached.
	IterationLimit
	// EvaluationLimit means Settings.MaxEvaluations was reached.
	EvaluationLimit
	// Stalled means no step could lower the cost even with the largest
	// damping.
	Stalled
	// Failed means the fit stopped on an error.
	Failed
)

// Converged reports whether s is one of the convergence statuses.
func (s Status) Converged() bool {
	switch s {
	case StepConverged, GradientConverged, CostConverged, ExactFit:
		return true
	}
	return false
}

func (s Status) String() string {
	switch s {
	case NotStarted:
		return "not started"
	case StepConverged:
		return "converged: small relative step"
	case GradientConverged:
		return "converged: small gradient"
	case CostConverged:
		return "converged: small change of cost"
	case ExactFit:
		return "converged: zero residual"
	case IterationLimit:
		return "stopped: iteration limit"
	case EvaluationLimit:
		return "stopped: evaluation limit"
	case Stalled:
		return "stopped: no step lowers the cost"
	case Failed:
		return "failed"
	}
	return "unknown status"
}

// Result is the outcome of a fit. Fit returns a partial Result together
// with an error when it stops on an error after the start point.
type Result struct {
	// Params are the fitted parameters (len P), in the problem's own
	// (not log) space.
	Params []float64
	// Status says why the fit stopped.
	Status Status
	// Iterations counts LM iterations; Evaluations counts calls of
	// Problem.Residuals (finite differences included); JacobianEvals
	// counts Jacobian evaluations (analytic or numerical).
	Iterations, Evaluations, JacobianEvals int

	// N is the number of observations with non-zero weight and DoF = N−P
	// the degrees of freedom.
	N, DoF int
	// SSR is the weighted residual sum of squares Σ wᵢ rᵢ², Cost = SSR/2.
	SSR, Cost float64
	// Sigma2 = SSR/DoF is the residual variance s² (NaN when DoF = 0).
	Sigma2 float64
	// RMSE = √(SSR/N) is the root-mean-square weighted residual.
	RMSE float64
	// R2 is the coefficient of determination 1 − SSR/SST, computed only
	// when Problem.Observed is set (NaN otherwise).
	R2 float64

	// Covariance is s²(JᵀWJ)⁻¹ at the solution (P×P), taken from the
	// factorisation. StdErr are the square roots of its diagonal.
	Covariance *mat.SymDense
	StdErr     []float64
	// Correlation is the correlation matrix of the parameters.
	Correlation *mat.SymDense
	// Lower and Upper bound the confidence interval of each parameter
	// at Settings.Confidence with Student's t on DoF degrees of freedom.
	// For a Positive parameter the interval is symmetric in p (the
	// linear approximation), clipped at zero from below.
	Lower, Upper []float64
	// TValue is the Student's t quantile used for the intervals.
	TValue float64
	// Condition is the condition number of the column-scaled JᵀWJ.
	Condition float64

	// Warnings are plain sentences about the fit, for instance which
	// parameters the data cannot tell apart.
	Warnings []string
}
