package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// The register-blocked substitution gives the vector-update one's results
// to the last bit, on one processor or two: the sums are formed in the same
// order whatever the blocks and whoever forms them. (Agreement with gonum's
// own solver is TestRowMajorSolveMatchesGonum.) Both kernels: the pure-Go
// one every processor can run, and AVX where this one has it.
func TestSubstitutionIsTheReferenceToTheLastBit(t *testing.T) {
	// The pure-Go kernel, AVX's blocks of 32 and AVX-512's of 64.
	type kernel struct{ avx, avx512 bool }
	kernels := []kernel{{false, false}}
	if hasAVX() {
		kernels = append(kernels, kernel{true, false})
	} else {
		t.Log("no AVX here: the pure-Go kernel only")
	}
	if hasAVX512() {
		kernels = append(kernels, kernel{true, true})
	} else {
		t.Log("no AVX-512 here: blocks of 64 columns not checked")
	}
	defer func(v, w bool) { useAVX, useAVX512 = v, w }(useAVX, useAVX512)
	// 30 columns (one partial block), 36 (one whole and one partial; with
	// AVX-512 one wide block, padded), 72 (two whole and a partial one;
	// with AVX-512 a wide block and a narrow one); 6 and 7 (the narrow
	// widths of an iteration).
	for _, size := range []struct{ bays, storeys int }{{6, 5}, {3, 12}, {8, 9}, {2, 3}, {7, 1}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, u, n, kb := factorPieces(t, mo)
		nc := len(mo.Cases)
		rhs := sol.rhs(n)
		want := append([]float64(nil), rhs...)
		bandSolveAxpy(u.Data, n, kb, want, nc)
		for _, procs := range []int{1, 2} {
			for _, avx := range kernels {
				t.Run(fmt.Sprintf("%dx%d/GOMAXPROCS=%d/avx=%v/avx512=%v", size.bays, size.storeys, procs, avx.avx, avx.avx512), func(t *testing.T) {
					defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
					useAVX, useAVX512 = avx.avx, avx.avx512
					got := append([]float64(nil), rhs...)
					bandSolve(u.Data, n, kb, got, nc)
					for i := range got {
						if got[i] != want[i] {
							t.Fatalf("x[%d, %d] = %v, reference %v", i/nc, i%nc, got[i], want[i])
						}
					}
					// Scaled by powers of two as the blocks are packed:
					// scaling the rows before and after, to the last bit.
					d := make([]float64, n)
					for i := range d {
						d[i] = math.Ldexp(1, i%7-3)
					}
					scaled := append([]float64(nil), rhs...)
					scaleRows(scaled, d, nc)
					bandSolve(u.Data, n, kb, scaled, nc)
					scaleRows(scaled, d, nc)
					got = append(got[:0], rhs...)
					bandSolveScaled(u.Data, n, kb, got, nc, d)
					for i := range got {
						if got[i] != scaled[i] {
							t.Fatalf("scaled: x[%d, %d] = %v, rows scaled apart %v", i/nc, i%nc, got[i], scaled[i])
						}
					}
				})
			}
		}
	}
}

// bandSolveAxpy is the substitution as it was before it was register-blocked
// (substitution.go), kept as the reference it must equal to the last bit.
// It overwrites the n × nrhs row-major matrix x with U⁻¹ U⁻ᵀ x,
// where u is an upper band Cholesky factor (row-major, kb superdiagonals).
// Rows of x are contiguous, so each step is a long vector update; columns
// are split into blocks shared among the processors.
func bandSolveAxpy(u []float64, n, kb int, x []float64, nrhs int) {
	if nrhs == 0 {
		return
	}
	const block = 64
	nb := (nrhs + block - 1) / block
	workers := min(runtime.GOMAXPROCS(0), nb)
	var wg sync.WaitGroup
	next := make(chan int, nb)
	for b := range nb {
		next <- b
	}
	close(next)
	w := kb + 1
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for b := range next {
				lo, hi := b*block, min((b+1)*block, nrhs)
				// Forward: Uᵀ y = x. Rows above the block's first nonzero
				// stay zero: a load on one member fills only a few rows.
				start := n
			scan:
				for i := range n {
					for _, v := range x[i*nrhs+lo : i*nrhs+hi] {
						if v != 0 {
							start = i
							break scan
						}
					}
				}
				for i := start; i < n; i++ {
					xi := x[i*nrhs+lo : i*nrhs+hi]
					d := 1 / u[i*w]
					for k := range xi {
						xi[k] *= d
					}
					for j := 1; j < w && i+j < n; j++ {
						uij := u[i*w+j]
						if uij == 0 {
							continue
						}
						axpy(x[(i+j)*nrhs+lo:(i+j)*nrhs+hi], -uij, xi)
					}
				}
				// Backward: U x = y.
				for i := n - 1; i >= 0; i-- {
					xi := x[i*nrhs+lo : i*nrhs+hi]
					for j := 1; j < w && i+j < n; j++ {
						uij := u[i*w+j]
						if uij == 0 {
							continue
						}
						axpy(xi, -uij, x[(i+j)*nrhs+lo:(i+j)*nrhs+hi])
					}
					d := 1 / u[i*w]
					for k := range xi {
						xi[k] *= d
					}
				}
			}
		}()
	}
	wg.Wait()
}

// The one-column substitution of the condition estimate (bandSolveVec)
// gives bandSolve's column to the last bit, for a vector full from its
// first row and for one that is zero down to a row (the forward
// substitution starts there), and agrees with gonum's band triangular
// solves (dtbsv, Uᵀ then U) to round-off.
func TestColumnSubstitutionIsBandSolve(t *testing.T) {
	const tol = 1e-12 // relative to the largest entry: the same solves, other orders of the sums
	rng := rand.New(rand.NewPCG(3, 0))
	for _, size := range []struct{ bays, storeys int }{{6, 5}, {3, 12}, {2, 3}, {7, 1}} {
		mo := pieceFrame(size.bays, size.storeys)
		_, u, n, kb := factorPieces(t, mo)
		full := make([]float64, n)
		for i := range full {
			full[i] = rng.Float64() - 0.5
		}
		late := make([]float64, n)
		late[n/2], late[n-1] = 1, -2
		for _, tc := range []struct {
			name string
			rhs  []float64
		}{{"full", full}, {"zero to the middle", late}} {
			name, rhs := tc.name, tc.rhs
			t.Run(fmt.Sprintf("%dx%d/%s", size.bays, size.storeys, name), func(t *testing.T) {
				want := append([]float64(nil), rhs...)
				bandSolve(u.Data, n, kb, want, 1)
				got := append([]float64(nil), rhs...)
				bandSolveVec(u.Data, n, kb, got)
				for i := range got {
					if got[i] != want[i] {
						t.Fatalf("x[%d] = %v, bandSolve %v", i, got[i], want[i])
					}
				}
				tb := append([]float64(nil), rhs...)
				f := blas64.TriangularBand{Uplo: blas.Upper, Diag: blas.NonUnit, N: n, K: kb, Data: u.Data, Stride: kb + 1}
				blas64.Tbsv(blas.Trans, f, blas64.Vector{N: n, Data: tb, Inc: 1})
				blas64.Tbsv(blas.NoTrans, f, blas64.Vector{N: n, Data: tb, Inc: 1})
				big := 0.0
				for _, v := range tb {
					big = max(big, math.Abs(v))
				}
				for i := range got {
					if math.Abs(got[i]-tb[i]) > tol*big {
						t.Fatalf("x[%d] = %v, dtbsv %v", i, got[i], tb[i])
					}
				}
			})
		}
	}
}

// TestOneColumnIsTheBlockedSolveToTheLastBit checks that a single load
// column, solved by the plain vector substitutions, has the numbers the
// blocked substitution gives it among others: each column of the
// frames' cases alone against all of them together, scaled by powers of
// two as a solve scales them.
func TestOneColumnIsTheBlockedSolveToTheLastBit(t *testing.T) {
	for _, size := range []struct{ bays, storeys int }{{6, 5}, {3, 12}, {2, 3}} {
		t.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(t *testing.T) {
			mo := pieceFrame(size.bays, size.storeys)
			sol, u, n, kb := factorPieces(t, mo)
			nc := len(mo.Cases)
			rhs := sol.rhs(n)
			d := make([]float64, n)
			for i := range d {
				d[i] = math.Ldexp(1, i%5-2)
			}
			all := append([]float64(nil), rhs...)
			newBandSolver(u.Data, n, kb).solveScaled(all, nc, d)
			nonzero := 0
			for c := range nc {
				col := make([]float64, n)
				for i := range col {
					col[i] = rhs[i*nc+c]
				}
				bandSolveScaled(u.Data, n, kb, col, 1, d)
				for i, v := range col {
					if v != all[i*nc+c] || math.Signbit(v) != math.Signbit(all[i*nc+c]) {
						t.Fatalf("case %d, row %d: alone %v, among the others %v", c, i, v, all[i*nc+c])
					}
					if v != 0 {
						nonzero++
					}
				}
			}
			if nonzero == 0 {
				t.Fatal("every displacement is zero: nothing compared")
			}
		})
	}
}

// The substitution reports whether every value it leaves is a finite
// number, as checkFinite would find (IEEE 754: ∞ − ∞ and NaN − NaN are
// NaN): a load column of +Inf, of NaN or of −Inf, in a whole block, in
// the last (padded) partial one, and alone (the vector substitution), on
// one processor or two.
func TestSubstitutionReportsNonFinite(t *testing.T) {
	mo := pieceFrame(6, 6) // 36 columns: a whole block and a partial one
	sol, u, n, kb := factorPieces(t, mo)
	nc := len(mo.Cases)
	rhs := sol.rhs(n)
	d := make([]float64, n)
	for i := range d {
		d[i] = 1
	}
	for _, procs := range []int{1, 2} {
		for _, tc := range []struct {
			name   string
			col    int
			v      float64
			finite bool
		}{{"finite", 0, 0, true}, {"+Inf, whole block", 3, math.Inf(1), false}, {"NaN, partial block", 33, math.NaN(), false},
			{"−Inf, partial block", 35, math.Inf(-1), false}} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				x := append([]float64(nil), rhs...)
				if !tc.finite {
					x[(n/2)*nc+tc.col] = tc.v
				}
				got := bandSolveScaled(u.Data, n, kb, x, nc, d)
				want := true
				for _, v := range x {
					want = want && finite(v)
				}
				if got != want || got != tc.finite {
					t.Errorf("finite %v, the values say %v, want %v", got, want, tc.finite)
				}
				one := make([]float64, n)
				for i := range n {
					one[i] = x[i*nc+tc.col]
				}
				if !tc.finite {
					one[n/2] = tc.v
				} else {
					for i := range n {
						one[i] = rhs[i*nc+tc.col]
					}
				}
				if got := bandSolveScaled(u.Data, n, kb, one, 1, d); got != tc.finite {
					t.Errorf("one column: finite %v, want %v", got, tc.finite)
				}
			})
		}
	}
}

// factorPieces returns the pieces of Solve for mo up to the
// factorization (prepared) with the band Cholesky factor of its stiffness
// (gonum's dpbtrf), n equations and kb superdiagonals.
func factorPieces(t *testing.T, mo *Model) (sol *Solution, u blas64.TriangularBand, n, kb int) {
	t.Helper()
	sol, data, n, kb := prepared(t, mo)
	a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: data, Stride: kb + 1}
	var ok bool
	u, ok = lapack64.Pbtrf(a)
	if !ok {
		t.Fatal("not positive definite")
	}
	return sol, u, n, kb
}
