package fitcore

import (
	"math"

	"gonum.org/v1/gonum/blas/blas64"
)

// symEigen returns the eigenvalues of the small symmetric matrix a in
// ascending order, and the eigenvector of the smallest one, by the cyclic
// Jacobi method (Golub & Van Loan, Matrix Computations, §8.5). For the
// few parameters of a fit it is as fast as LAPACK's tridiagonal QR, more
// accurate for the small eigenvalues of a scaled matrix, and keeps LAPACK's
// eigensolver out of the WebAssembly bundle. It reports false when the
// sweeps do not converge or a is not finite.
func symEigen(a blas64.Symmetric) (vals, minVec []float64, ok bool) {
	n := a.N
	w := make([]float64, n*n) // working copy, row-major
	v := make([]float64, n*n) // accumulated rotations, columns are vectors
	for i := 0; i < n; i++ {
		v[i*n+i] = 1
		for j := 0; j < n; j++ {
			x := symAt(a, i, j)
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, nil, false
			}
			w[i*n+j] = x
		}
	}
	for sweep := 0; sweep < 100; sweep++ {
		off, diag := 0.0, 0.0
		for i := 0; i < n; i++ {
			diag += w[i*n+i] * w[i*n+i]
			for j := i + 1; j < n; j++ {
				off += w[i*n+j] * w[i*n+j]
			}
		}
		if off <= eps*eps*diag || off == 0 {
			vals = make([]float64, n)
			for i := range vals {
				vals[i] = w[i*n+i]
			}
			k := 0
			for i := range vals {
				if vals[i] < vals[k] {
					k = i
				}
			}
			minVec = make([]float64, n)
			for i := range minVec {
				minVec[i] = v[i*n+k]
			}
			sortFloats(vals)
			return vals, minVec, true
		}
		for p := 0; p < n; p++ {
			for q := p + 1; q < n; q++ {
				apq := w[p*n+q]
				if apq == 0 {
					continue
				}
				// The rotation that zeroes w[p][q].
				theta := (w[q*n+q] - w[p*n+p]) / (2 * apq)
				t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(theta*theta+1))
				c := 1 / math.Sqrt(t*t+1)
				s := t * c
				for k := 0; k < n; k++ {
					wkp, wkq := w[k*n+p], w[k*n+q]
					w[k*n+p], w[k*n+q] = c*wkp-s*wkq, s*wkp+c*wkq
				}
				for k := 0; k < n; k++ {
					wpk, wqk := w[p*n+k], w[q*n+k]
					w[p*n+k], w[q*n+k] = c*wpk-s*wqk, s*wpk+c*wqk
				}
				for k := 0; k < n; k++ {
					vkp, vkq := v[k*n+p], v[k*n+q]
					v[k*n+p], v[k*n+q] = c*vkp-s*vkq, s*vkp+c*vkq
				}
			}
		}
	}
	return nil, nil, false
}

func sortFloats(x []float64) {
	for i := 1; i < len(x); i++ {
		for j := i; j > 0 && x[j] < x[j-1]; j-- {
			x[j], x[j-1] = x[j-1], x[j]
		}
	}
}
