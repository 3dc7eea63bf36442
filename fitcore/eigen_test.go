package fitcore

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestSymEigen checks the Jacobi eigensolver against gonum's LAPACK-based
// mat.EigenSym (a general-purpose reference library) on random symmetric
// matrices, well and badly conditioned.
func TestSymEigen(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := 0; trial < 200; trial++ {
		n := 1 + trial%9
		a := mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			for j := i; j < n; j++ {
				a.SetSym(i, j, rng.NormFloat64())
			}
		}
		if trial%3 == 0 && n > 1 {
			// Nearly singular: make two rows almost the same.
			for j := 0; j < n; j++ {
				a.SetSym(1, j, a.At(0, j)*(1+1e-9))
			}
			a.SetSym(1, 1, a.At(0, 0)*(1+2e-9))
		}
		vals, vec, ok := symEigen(a.RawSymmetric())
		if !ok {
			t.Fatalf("trial %d: no convergence", trial)
		}
		var es mat.EigenSym
		if !es.Factorize(a, true) {
			t.Fatalf("trial %d: gonum failed", trial)
		}
		want := es.Values(nil)
		scale := math.Max(math.Abs(want[0]), math.Abs(want[n-1]))
		for i := range want {
			if math.Abs(vals[i]-want[i]) > 1e-12*scale {
				t.Errorf("trial %d: eigenvalue %d = %g, want %g", trial, i, vals[i], want[i])
			}
		}
		// The vector of the smallest eigenvalue: a·v = λ·v, ‖v‖ = 1.
		var av mat.VecDense
		av.MulVec(a, mat.NewVecDense(n, vec))
		norm := 0.0
		for i := range vec {
			norm += vec[i] * vec[i]
			if math.Abs(av.AtVec(i)-vals[0]*vec[i]) > 1e-10*scale {
				t.Errorf("trial %d: a·v − λv = %g at %d", trial, av.AtVec(i)-vals[0]*vec[i], i)
			}
		}
		if math.Abs(norm-1) > 1e-12 {
			t.Errorf("trial %d: ‖v‖² = %g", trial, norm)
		}
	}
	if _, _, ok := symEigen(mat.NewSymDense(2, []float64{1, math.NaN(), math.NaN(), 1}).RawSymmetric()); ok {
		t.Error("NaN matrix accepted")
	}
}
