package dense

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	blasgonum "gonum.org/v1/gonum/blas/gonum"
	lapackgonum "gonum.org/v1/gonum/lapack/gonum"
)

var (
	bl blasgonum.Implementation
	la lapackgonum.Implementation
)

// ConditionTolerance is the condition number above which a matrix is
// singular to working precision (about 1/ε, the value package mat uses).
const ConditionTolerance = 1e16

// Gram sets the upper triangle of c (n×n) to AᵀA for the m×n matrix a.
// Each element is summed over the rows in row order, as BLAS Dsyrk does,
// with one pass over a.
func Gram(c blas64.Symmetric, a blas64.General) {
	n := a.Cols
	if c.N != n || c.Uplo != blas.Upper {
		panic("dense: Gram: shape or triangle mismatch")
	}
	for i := 0; i < n; i++ {
		clear(c.Data[i*c.Stride+i : i*c.Stride+n])
	}
	for l := 0; l < a.Rows; l++ {
		row := a.Data[l*a.Stride : l*a.Stride+n]
		for i, v := range row {
			if v == 0 {
				continue
			}
			ci := c.Data[i*c.Stride+i : i*c.Stride+n]
			for j, w := range row[i:] {
				ci[j] += v * w
			}
		}
	}
}

// MulTVec sets y (len n) to Aᵀx for the m×n matrix a and x of len m,
// summing in row order as BLAS Dgemv does, with one pass over a.
func MulTVec(y []float64, a blas64.General, x []float64) {
	n := a.Cols
	if len(y) != n || len(x) != a.Rows {
		panic("dense: MulTVec: length mismatch")
	}
	clear(y)
	for i, xi := range x {
		if xi == 0 {
			continue
		}
		row := a.Data[i*a.Stride : i*a.Stride+n]
		for j, v := range row {
			y[j] += xi * v
		}
	}
}

// Cholesky is the factorisation A = UᵀU of a symmetric positive definite
// matrix, U upper triangular. The zero value is ready for Factorize.
type Cholesky struct {
	n int
	u []float64 // U, row-major n×n, upper triangle
}

// Factorize computes the factorisation of the symmetric matrix a (its
// upper triangle is read) with LAPACK's unblocked Dpotf2. It reports
// false when a is not positive definite (or not finite); the receiver is
// then unusable until the next successful Factorize.
func (c *Cholesky) Factorize(a blas64.Symmetric) bool {
	n := a.N
	if a.Uplo != blas.Upper {
		panic("dense: Cholesky: lower triangle")
	}
	c.n = n
	if cap(c.u) < n*n {
		c.u = make([]float64, n*n)
	}
	c.u = c.u[:n*n]
	clear(c.u)
	for i := 0; i < n; i++ {
		copy(c.u[i*n+i:i*n+n], a.Data[i*a.Stride+i:i*a.Stride+n])
	}
	ok := la.Dpotf2(blas.Upper, n, c.u, max(n, 1))
	if !ok {
		c.n = -1
	}
	return ok
}

// SolveVec solves A x = b into x; x and b may be the same slice. The
// two triangular solves are BLAS Dtrsv; no condition estimate is made.
func (c *Cholesky) SolveVec(x, b []float64) {
	n := c.n
	if n < 0 || len(x) != n || len(b) != n {
		panic("dense: Cholesky.SolveVec: not factorised or length mismatch")
	}
	copy(x, b)
	if n == 0 {
		return
	}
	bl.Dtrsv(blas.Upper, blas.Trans, blas.NonUnit, n, c.u, n, x, 1)
	bl.Dtrsv(blas.Upper, blas.NoTrans, blas.NonUnit, n, c.u, n, x, 1)
}

// Whiten solves Uᵀz = x in place (BLAS Dtrsv). When A is the covariance
// of a random vector x, z has the identity covariance: generalised least
// squares with covariance A is ordinary least squares of whitened
// residuals and whitened Jacobian columns.
func (c *Cholesky) Whiten(x []float64) {
	n := c.n
	if n < 0 || len(x) != n {
		panic("dense: Cholesky.Whiten: not factorised or length mismatch")
	}
	if n == 0 {
		return
	}
	bl.Dtrsv(blas.Upper, blas.Trans, blas.NonUnit, n, c.u, n, x, 1)
}

// InverseTo sets the upper triangle of dst (n×n) to A⁻¹, one column at a
// time by SolveVec.
func (c *Cholesky) InverseTo(dst blas64.Symmetric) {
	n := c.n
	if n < 0 || dst.N != n || dst.Uplo != blas.Upper {
		panic("dense: Cholesky.InverseTo: not factorised or shape mismatch")
	}
	col := make([]float64, n)
	for j := 0; j < n; j++ {
		clear(col)
		col[j] = 1
		c.SolveVec(col, col)
		for i := 0; i <= j; i++ {
			dst.Data[i*dst.Stride+j] = col[i]
		}
	}
}

// LeastSquares sets x (len n) to the vector that minimises ‖A x − b‖₂ for
// the m×n matrix a and b of len m, by Householder QR (LAPACK's unblocked
// Dgeqr2 and Dorm2r, then Dtrsv with R). a and b are overwritten: a by
// the factorisation, b by Qᵀb.
//
// It returns the condition number of R in the infinity norm, computed
// exactly from R⁻¹ (package mat estimates the same quantity). It is +Inf,
// and x is not set, when A has fewer rows than columns or R has a zero on
// its diagonal. A result with a condition above ConditionTolerance is not
// to be trusted.
func LeastSquares(x []float64, a blas64.General, b []float64) (cond float64) {
	m, n := a.Rows, a.Cols
	if len(x) != n || len(b) != m {
		panic("dense: LeastSquares: length mismatch")
	}
	if m < n {
		return math.Inf(1)
	}
	if n == 0 {
		return 1
	}
	tau := make([]float64, n)
	work := make([]float64, n)
	la.Dgeqr2(m, n, a.Data, a.Stride, tau, work)
	la.Dorm2r(blas.Left, blas.Trans, m, 1, n, a.Data, a.Stride, tau, b, 1, work)
	norm := 0.0
	for i := 0; i < n; i++ {
		if a.Data[i*a.Stride+i] == 0 {
			return math.Inf(1)
		}
		s := 0.0
		for _, v := range a.Data[i*a.Stride+i : i*a.Stride+n] {
			s += math.Abs(v)
		}
		norm = math.Max(norm, s)
	}
	copy(x, b[:n])
	bl.Dtrsv(blas.Upper, blas.NoTrans, blas.NonUnit, n, a.Data, a.Stride, x, 1)
	// ‖R⁻¹‖∞ from its columns R⁻¹eⱼ: the largest row sum of |R⁻¹|.
	rows := tau // reuse: tau is no longer needed
	clear(rows)
	col := work
	for j := 0; j < n; j++ {
		clear(col)
		col[j] = 1
		bl.Dtrsv(blas.Upper, blas.NoTrans, blas.NonUnit, n, a.Data, a.Stride, col, 1)
		for i, v := range col {
			rows[i] += math.Abs(v)
		}
	}
	inv := 0.0
	for _, s := range rows {
		inv = math.Max(inv, s)
	}
	cond = norm * inv
	if math.IsNaN(cond) {
		cond = math.Inf(1)
	}
	return cond
}
