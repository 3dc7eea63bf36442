// Package dense holds the few dense linear-algebra operations that the
// solver in fitcore and the models need: the Gram matrix AᵀA and the
// product Aᵀx of a tall matrix, a Cholesky factorisation with its solve
// and inverse, and a linear least-squares solve by Householder QR.
//
// The arithmetic is gonum's (the project's linear-algebra library): the
// unblocked LAPACK routines Dpotf2, Dgeqr2 and Dorm2r of
// gonum.org/v1/gonum/lapack/gonum and the triangular solve Dtrsv of
// gonum.org/v1/gonum/blas/gonum, called directly. Package mat would reach
// the same routines through their blocked drivers, the workspace query
// Ilaenv and condition estimates computed whether or not they are needed;
// for the problems of a field fit (at most about ten parameters, up to a
// million rows) the unblocked routines are as fast, and calling them alone
// keeps the rest of LAPACK out of the WebAssembly bundle.
//
// Matrices are gonum's row-major blas64.General and blas64.Symmetric
// (upper triangle), so a *mat.Dense or *mat.SymDense is passed by its
// RawMatrix or RawSymmetric.
package dense
