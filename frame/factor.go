package frame

import (
	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// The stiffness matrix of the free degrees of freedom is held in upper
// symmetric band storage: n equations, half-bandwidth kb, row i holding
// K[i][i] … K[i][i+kb], so that K[i][j] is a[i*(kb+1)+j-i] for
// i ≤ j ≤ i+kb. This is LAPACK's and gonum's row-major band layout.

func symBand(a []float64, n, kb int) blas64.SymmetricBand {
	return blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Stride: kb + 1, Data: a}
}

// factorBand returns the Cholesky factor U (K = UᵀU) of the band matrix a in
// a new slice of the same layout, or ok false when a is not positive
// definite. a is not modified.
func factorBand(a []float64, n, kb int) (u []float64, ok bool) {
	u = append([]float64(nil), a...)
	_, ok = lapack64.Pbtrf(symBand(u, n, kb))
	return u, ok
}

// bandCond returns the estimated condition number ‖K‖₁ ‖K⁻¹‖₁ of the band
// matrix a from its Cholesky factor u: the norm of K is computed exactly
// from a, that of its inverse estimated by LAPACK's dpbcon (Higham's
// refinement of Hager's method), which never overestimates it and is
// usually within a factor of a few of it.
//
// gonum's mat.BandCholesky.Cond takes the norm of the factor in place of the
// norm of K, which understates a badly conditioned matrix by many orders of
// magnitude (about the square root for a diagonal one), so it is not used.
func bandCond(a, u []float64, n, kb int) float64 {
	if n == 0 {
		return 1
	}
	work := make([]float64, 3*n)
	iwork := make([]int, n)
	norm := lapack64.Lansb(lapack.MaxColumnSum, symBand(a, n, kb), work)
	rcond := lapack64.Pbcon(symBand(u, n, kb), norm, work, iwork)
	return 1 / rcond
}

// solveBandTo overwrites b, n rows by nrhs columns stored row-major, with the
// solution X of UᵀU X = b.
func solveBandTo(b []float64, u []float64, n, kb, nrhs int) {
	t := blas64.TriangularBand{Uplo: blas.Upper, Diag: blas.NonUnit, N: n, K: kb, Stride: kb + 1, Data: u}
	lapack64.Pbtrs(t, blas64.General{Rows: n, Cols: nrhs, Stride: nrhs, Data: b})
}
