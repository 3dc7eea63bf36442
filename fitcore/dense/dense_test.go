package dense

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// The reference for every routine is gonum's package mat (a
// general-purpose linear-algebra library): SymOuterK, MulVec, Cholesky
// and QR solve the same problems through LAPACK's blocked drivers.

func randDense(rng *rand.Rand, m, n int, cond float64) *mat.Dense {
	a := mat.NewDense(m, n, nil)
	for i := 0; i < m; i++ {
		for j := 0; j < n; j++ {
			// Columns of very different scale and, for cond > 1,
			// nearly parallel: like a Jacobian of a poorly resolved fit.
			v := rng.NormFloat64() * math.Pow(cond, -float64(j)/float64(max(n-1, 1)))
			if j > 0 && cond > 1 {
				v += a.At(i, 0) * 0.9
			}
			a.Set(i, j, v)
		}
	}
	return a
}

func newSym(n int) blas64.Symmetric {
	return blas64.Symmetric{N: n, Stride: n, Uplo: blas.Upper, Data: make([]float64, n*n)}
}

func relDiff(a, b float64) float64 {
	return math.Abs(a-b) / math.Max(math.Max(math.Abs(a), math.Abs(b)), 1e-300)
}

var shapes = []struct {
	m, n int
	cond float64
}{
	{1, 1, 1}, {3, 2, 1}, {10, 3, 1}, {50, 5, 1e3}, {200, 8, 1e6}, {1000, 10, 1}, {40, 10, 1e8},
}

func TestGramAndMulTVec(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, sh := range shapes {
		a := randDense(rng, sh.m, sh.n, sh.cond)
		x := make([]float64, sh.m)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		x[0] = 0 // a skipped row
		var want mat.SymDense
		want.SymOuterK(1, a.T())
		got := newSym(sh.n)
		Gram(got, a.RawMatrix())
		for i := 0; i < sh.n; i++ {
			for j := i; j < sh.n; j++ {
				if d := relDiff(got.Data[i*sh.n+j], want.At(i, j)); d > 1e-14 {
					t.Errorf("%d×%d: AᵀA[%d,%d] = %g, mat %g", sh.m, sh.n, i, j, got.Data[i*sh.n+j], want.At(i, j))
				}
			}
		}
		var wv mat.VecDense
		wv.MulVec(a.T(), mat.NewVecDense(sh.m, x))
		y := make([]float64, sh.n)
		MulTVec(y, a.RawMatrix(), x)
		for j := range y {
			// Sums of terms of both signs: compare against their scale.
			scale := 0.0
			for i := 0; i < sh.m; i++ {
				scale += math.Abs(x[i] * a.At(i, j))
			}
			if d := math.Abs(y[j] - wv.AtVec(j)); d > 1e-14*scale {
				t.Errorf("%d×%d: Aᵀx[%d] = %g, mat %g", sh.m, sh.n, j, y[j], wv.AtVec(j))
			}
		}
	}
}

func TestCholesky(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, sh := range shapes {
		a := randDense(rng, sh.m+sh.n, sh.n, sh.cond)
		var s mat.SymDense
		s.SymOuterK(1, a.T())
		b := make([]float64, sh.n)
		for i := range b {
			b[i] = rng.NormFloat64()
		}
		var ref mat.Cholesky
		if !ref.Factorize(&s) {
			t.Fatalf("%d×%d: mat refuses the matrix", sh.m, sh.n)
		}
		var c Cholesky
		if !c.Factorize(s.RawSymmetric()) {
			t.Fatalf("%d×%d: Factorize failed", sh.m, sh.n)
		}
		var wx mat.VecDense
		_ = ref.SolveVecTo(&wx, mat.NewVecDense(sh.n, b)) // a Condition error still gives x
		x := make([]float64, sh.n)
		c.SolveVec(x, b)
		// Both solutions carry an error of order cond·ε; compare to it.
		tol := 1e-13 * math.Max(1, ref.Cond())
		for j := range x {
			if d := relDiff(x[j], wx.AtVec(j)); d > tol {
				t.Errorf("%d×%d (cond %.1e): x[%d] = %.17g, mat %.17g", sh.m, sh.n, ref.Cond(), j, x[j], wx.AtVec(j))
			}
		}
		// Whiten: zᵀz = xᵀA⁻¹x, checked against mat's solve.
		z := append([]float64(nil), b...)
		c.Whiten(z)
		zz, bx := 0.0, 0.0
		for j := range z {
			zz += z[j] * z[j]
			bx += b[j] * wx.AtVec(j)
		}
		if d := relDiff(zz, bx); d > tol {
			t.Errorf("%d×%d: zᵀz = %.17g, bᵀA⁻¹b by mat %.17g", sh.m, sh.n, zz, bx)
		}
		var winv mat.SymDense
		_ = ref.InverseTo(&winv)
		inv := newSym(sh.n)
		c.InverseTo(inv)
		for i := 0; i < sh.n; i++ {
			for j := i; j < sh.n; j++ {
				scale := math.Sqrt(winv.At(i, i) * winv.At(j, j))
				if d := math.Abs(inv.Data[i*sh.n+j] - winv.At(i, j)); d > tol*scale {
					t.Errorf("%d×%d: A⁻¹[%d,%d] = %g, mat %g", sh.m, sh.n, i, j, inv.Data[i*sh.n+j], winv.At(i, j))
				}
			}
		}
		// The same factor as mat's (Dpotrf runs Dpotf2 for these sizes).
		var u mat.TriDense
		ref.UTo(&u)
		for i := 0; i < sh.n; i++ {
			for j := i; j < sh.n; j++ {
				if got, want := c.u[i*sh.n+j], u.At(i, j); got != want {
					t.Errorf("%d×%d: U[%d,%d] = %g, mat %g", sh.m, sh.n, i, j, got, want)
				}
			}
		}
	}
	// Not positive definite, and not finite.
	var c Cholesky
	for _, bad := range [][]float64{{1, 2, 2, 1}, {1, 0, 0, -1}, {math.NaN(), 0, 0, 1}, {0, 0, 0, 0}} {
		s := mat.NewSymDense(2, bad)
		if c.Factorize(s.RawSymmetric()) {
			t.Errorf("%v: factorised", bad)
		}
	}
}

func TestLeastSquares(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, sh := range shapes {
		a := randDense(rng, sh.m, sh.n, sh.cond)
		b := make([]float64, sh.m)
		for i := range b {
			b[i] = rng.NormFloat64()
		}
		var qr mat.QR
		qr.Factorize(a)
		var wx mat.VecDense
		_ = qr.SolveVecTo(&wx, false, mat.NewVecDense(sh.m, b))
		x := make([]float64, sh.n)
		ac := mat.DenseCopyOf(a)
		bc := append([]float64(nil), b...)
		cond := LeastSquares(x, ac.RawMatrix(), bc)
		if !(cond >= 1) || math.IsInf(cond, 0) {
			t.Fatalf("%d×%d: condition %g", sh.m, sh.n, cond)
		}
		// mat estimates the same condition number (Dtrcon, a lower
		// bound within a small factor of the exact value).
		if est := qr.Cond(); est > cond*(1+1e-12) || est < cond/10 {
			t.Errorf("%d×%d: condition %g, mat's estimate %g", sh.m, sh.n, cond, est)
		}
		tol := 1e-14 * math.Max(1, cond)
		for j := range x {
			if d := relDiff(x[j], wx.AtVec(j)); d > tol {
				t.Errorf("%d×%d (cond %.1e): x[%d] = %.17g, mat %.17g", sh.m, sh.n, cond, j, x[j], wx.AtVec(j))
			}
		}
	}
	// Rank deficient: a zero column; too few rows.
	a := mat.NewDense(3, 2, []float64{1, 0, 2, 0, 3, 0})
	if c := LeastSquares(make([]float64, 2), a.RawMatrix(), []float64{1, 2, 3}); !math.IsInf(c, 1) {
		t.Errorf("zero column: condition %g", c)
	}
	a = mat.NewDense(1, 2, []float64{1, 2})
	if c := LeastSquares(make([]float64, 2), a.RawMatrix(), []float64{1}); !math.IsInf(c, 1) {
		t.Errorf("1×2: condition %g", c)
	}
}

// An exact system: the solution of a consistent problem with integer
// data is known by construction.
func TestLeastSquaresExact(t *testing.T) {
	a := mat.NewDense(4, 2, []float64{1, 1, 1, 2, 1, 3, 1, 4})
	b := []float64{3, 5, 7, 9} // 1 + 2·x
	x := make([]float64, 2)
	LeastSquares(x, a.RawMatrix(), b)
	if math.Abs(x[0]-1) > 1e-14 || math.Abs(x[1]-2) > 1e-14 {
		t.Errorf("x = %v, want [1 2]", x)
	}
}

// The normal equations of a fit with many rows: Gram, MulTVec and the
// Cholesky solve, against mat doing the same.
func benchData(m, n int) (*mat.Dense, []float64) {
	rng := rand.New(rand.NewPCG(7, 8))
	a := randDense(rng, m, n, 10)
	x := make([]float64, m)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return a, x
}

func BenchmarkNormalEquations(b *testing.B) {
	for _, m := range []int{1000, 1000000} {
		a, r := benchData(m, 4)
		b.Run("dense/rows="+itoa(m), func(b *testing.B) {
			b.ReportAllocs()
			g := newSym(4)
			y, x := make([]float64, 4), make([]float64, 4)
			var c Cholesky
			for b.Loop() {
				Gram(g, a.RawMatrix())
				MulTVec(y, a.RawMatrix(), r)
				c.Factorize(g)
				c.SolveVec(x, y)
			}
		})
		b.Run("mat/rows="+itoa(m), func(b *testing.B) {
			b.ReportAllocs()
			g := mat.NewSymDense(4, nil)
			var y, x mat.VecDense
			rv := mat.NewVecDense(m, r)
			var c mat.Cholesky
			for b.Loop() {
				g.SymOuterK(1, a.T())
				y.MulVec(a.T(), rv)
				c.Factorize(g)
				_ = c.SolveVecTo(&x, &y)
			}
		})
	}
}

func BenchmarkLeastSquares(b *testing.B) {
	for _, m := range []int{1000, 100000} {
		a, r := benchData(m, 4)
		b.Run("dense/rows="+itoa(m), func(b *testing.B) {
			b.ReportAllocs()
			ac := mat.NewDense(m, 4, nil)
			bc := make([]float64, m)
			x := make([]float64, 4)
			for b.Loop() {
				ac.Copy(a)
				copy(bc, r)
				LeastSquares(x, ac.RawMatrix(), bc)
			}
		})
		b.Run("mat/rows="+itoa(m), func(b *testing.B) {
			b.ReportAllocs()
			rv := mat.NewVecDense(m, r)
			var x mat.VecDense
			for b.Loop() {
				var qr mat.QR
				qr.Factorize(a)
				_ = qr.SolveVecTo(&x, false, rv)
			}
		})
	}
}

func itoa(i int) string {
	s := ""
	for {
		s = string(rune('0'+i%10)) + s
		i /= 10
		if i == 0 {
			return s
		}
	}
}
