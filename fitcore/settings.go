package fitcore

// Settings controls the solver. The zero value is ready to use, and a nil
// *Settings means the zero value; each field documents its default.
type Settings struct {
	// MaxIterations caps the number of accepted or rejected LM
	// iterations. If MaxIterations is 0 it is defaulted to 1000.
	MaxIterations int

	// MaxEvaluations caps the number of calls to Problem.Residuals,
	// including those made for finite differences. If MaxEvaluations is 0
	// it is defaulted to 200·(P+1)·(P+1) and at least 20000.
	MaxEvaluations int

	// StepTol stops the fit when the relative step ‖δ‖/(‖p‖+StepTol) of
	// the working parameters falls below it. If StepTol is 0 it is
	// defaulted to 1e-12.
	StepTol float64

	// GradTol stops the fit when the largest cosine between the weighted
	// residual vector and a column of the weighted Jacobian,
	// max |gⱼ|/(‖Jⱼ‖·‖r‖), falls below it (Moré 1978). If GradTol is 0 it
	// is defaulted to 1e-12.
	GradTol float64

	// CostTol stops the fit when both the actual and the predicted
	// reduction of the cost by an accepted step are below CostTol·cost,
	// or when a rejected step predicted less than rounding can resolve.
	// If CostTol is 0 it is defaulted to 1e-15.
	CostTol float64

	// InitialLambda is the starting damping λ, which multiplies the
	// scaling D = diag(JᵀWJ). If InitialLambda is 0 it is defaulted to
	// 1e-3.
	InitialLambda float64

	// StepFactor scales every proposed step (0 < StepFactor ≤ 1); a
	// smaller factor makes the fit more cautious on hard problems. If
	// StepFactor is 0 it is defaulted to 1.
	StepFactor float64

	// LineSearch, if true, backtracks along a rejected step (halving it
	// up to 10 times) before raising λ. It helps on problems with long
	// curved valleys. The default is false.
	LineSearch bool

	// DiffStep is the relative step of central finite differences when
	// Problem.Jacobian is nil: hⱼ = DiffStep·max(|pⱼ|, tiny). If DiffStep
	// is 0 it is defaulted to the cube root of machine epsilon, about
	// 6e-6.
	DiffStep float64

	// Confidence is the level of the reported confidence intervals. If
	// Confidence is 0 it is defaulted to 0.95.
	Confidence float64

	// IllConditioned is the condition number of the scaled JᵀWJ above
	// which the result warns that parameters are not identifiable from
	// the data. If IllConditioned is 0 it is defaulted to 1e10.
	IllConditioned float64
}
