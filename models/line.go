package models

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// StraightLine is a weighted least-squares straight line y = Intercept +
// Slope·x with the standard errors of its coefficients,
//
//	Var(Slope) = s²/Sxx,  Var(Intercept) = s²(1/Σw + x̄²/Sxx),
//	Cov = −x̄·s²/Sxx,  s² = Σ wᵢ rᵢ² / (N − 2),
//
// where x̄ is the weighted mean of x and Sxx = Σ wᵢ(xᵢ − x̄)².
type StraightLine struct {
	Intercept, Slope       float64
	InterceptErr, SlopeErr float64
	// Cov is the covariance of Intercept and Slope.
	Cov float64
	// N is the number of points, DoF = N − 2.
	N, DoF int
	// RMSE = √(Σ wᵢ rᵢ² / N).
	RMSE float64
	// Confidence is the level of the confidence band and intervals, and
	// TValue the Student's t quantile for it on DoF degrees of freedom.
	Confidence, TValue float64
}

// At returns the line's value at x.
func (l *StraightLine) At(x float64) float64 { return l.Intercept + l.Slope*x }

// BandAt returns the limits of the pointwise confidence band of the line
// at x: At(x) ± TValue·√(Var(Intercept) + 2x·Cov + x²·Var(Slope)).
func (l *StraightLine) BandAt(x float64) (lower, upper float64) {
	v := l.InterceptErr*l.InterceptErr + 2*x*l.Cov + x*x*l.SlopeErr*l.SlopeErr
	h := l.TValue * math.Sqrt(math.Max(v, 0))
	y := l.At(x)
	return y - h, y + h
}

// fitLine fits y = a + b·x by weighted least squares (w nil = unit
// weights). It reports false when x has no spread. It needs len(x) ≥ 3 for
// finite standard errors.
func fitLine(x, y, w []float64, confidence float64) (StraightLine, bool) {
	if confidence == 0 {
		confidence = 0.95
	}
	n := len(x)
	var sw, sx, sy float64
	for i := range x {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		sw += wi
		sx += wi * x[i]
		sy += wi * y[i]
	}
	xm, ym := sx/sw, sy/sw
	var sxx, sxy float64
	for i := range x {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		dx := x[i] - xm
		sxx += wi * dx * dx
		sxy += wi * dx * (y[i] - ym)
	}
	if !(sxx > 0) || n < 2 {
		return StraightLine{}, false
	}
	b := sxy / sxx
	a := ym - b*xm
	var ssr float64
	for i := range x {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		r := y[i] - a - b*x[i]
		ssr += wi * r * r
	}
	l := StraightLine{Intercept: a, Slope: b, N: n, DoF: n - 2, RMSE: math.Sqrt(ssr / float64(n)), Confidence: confidence}
	if l.DoF > 0 {
		s2 := ssr / float64(l.DoF)
		l.SlopeErr = math.Sqrt(s2 / sxx)
		l.InterceptErr = math.Sqrt(s2 * (1/sw + xm*xm/sxx))
		l.Cov = -xm * s2 / sxx
		l.TValue = distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(l.DoF)}.Quantile(0.5 + confidence/2)
	} else {
		l.SlopeErr, l.InterceptErr, l.Cov, l.TValue = math.NaN(), math.NaN(), math.NaN(), math.NaN()
	}
	return l, true
}

// LineSettings controls the straight-line methods (CooperJacobLine,
// RecoveryLine). The zero value works, and a nil *LineSettings means the
// zero value.
type LineSettings struct {
	// From and To bound the time window of the line, s: only readings with
	// From ≤ t ≤ To are used. A zero From or To leaves that side open.
	From, To float64

	// UMax is the largest u = r²S/(4Tt) at which the Cooper–Jacob line
	// is taken to hold. If UMax is 0 it is defaulted to 0.01 (Cooper &
	// Jacob 1946, from memory, reference §4); 0.05 and 0.1 are common
	// practice. RecoveryLine does not use it.
	UMax float64

	// Confidence is the level of the confidence intervals and band. If
	// Confidence is 0 it is defaulted to 0.95.
	Confidence float64
}

func (s *LineSettings) uMax() float64 {
	if s.UMax == 0 {
		return 0.01
	}
	return s.UMax
}
