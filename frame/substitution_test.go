package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
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

// The kernels that read rows following each other (combine32c,
// combine64c) and the one that forms two rows of the forward substitution
// together (combinePair, by combine64x2) give the pure-Go row sums of
// combine to the last bit (the same products added in the same order):
// rows of random numbers, two rows reading 40 and 33 rows, 44 and 40
// (either one reading rows alone first), and pairs combinePair must
// refuse (too few rows in common, or a row not read in between).
func TestContiguousKernelsAreTheRowSums(t *testing.T) {
	if !hasAVX512() {
		t.Skip("no AVX-512 here")
	}
	defer func(v, w bool) { useAVX, useAVX512 = v, w }(useAVX, useAVX512)
	useAVX, useAVX512 = true, true
	rng := rand.New(rand.NewPCG(5, 0))
	const rows = 64
	random := func(bw int) []float64 {
		x := make([]float64, rows*bw)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		return x
	}
	// reference forms row i from rows first up to last − 1 by combine.
	reference := func(x []float64, bw, i, first, last int, negs []float64, d float64) {
		var offs []int
		for k := first; k < last; k++ {
			offs = append(offs, k*bw)
		}
		combine(x, i*bw, 0, bw, offs, negs, d)
	}
	same := func(t *testing.T, got, want []float64) {
		t.Helper()
		for k := range got {
			if math.Float64bits(got[k]) != math.Float64bits(want[k]) {
				t.Fatalf("value %d (row %d): %v, combine %v", k, k/wideBlock, got[k], want[k])
			}
		}
	}
	for _, bw := range []int{solveBlock, wideBlock} {
		t.Run(fmt.Sprintf("combine%dc", bw), func(t *testing.T) {
			x := random(bw)
			negs := make([]float64, 30)
			for k := range negs {
				negs[k] = rng.NormFloat64()
			}
			want := slices.Clone(x)
			reference(want, bw, 50, 10, 40, negs, 0.75)
			if bw == solveBlock {
				combine32c(&x[50*bw], &x[10*bw], &negs[0], 30, 0.75)
			} else {
				combine64c(&x[50*bw], &x[10*bw], &negs[0], 30, 0.75)
			}
			same(t, x, want)
		})
	}
	for _, tc := range []struct {
		name      string
		i, f0, f1 int
		paired    bool
	}{{"row i reads more", 45, 5, 12, true}, {"row i+1 reads more", 50, 6, 3, true},
		{"as many", 40, 20, 20, true}, {"few in common", 40, 20, 33, false}} {
		t.Run("combinePair/"+tc.name, func(t *testing.T) {
			x := random(wideBlock)
			i, f0, f1 := tc.i, tc.f0, tc.f1
			fwd := &terms{at: []int{0, i - f0, i - f0 + i + 1 - f1}}
			for k := f0; k < i; k++ {
				fwd.rows, fwd.negs = append(fwd.rows, int32(k)), append(fwd.negs, rng.NormFloat64())
			}
			for k := f1; k <= i; k++ {
				fwd.rows, fwd.negs = append(fwd.rows, int32(k)), append(fwd.negs, rng.NormFloat64())
			}
			want := slices.Clone(x)
			reference(want, wideBlock, i, f0, i, fwd.negs[:i-f0], 0.5)
			reference(want, wideBlock, i+1, f1, i+1, fwd.negs[i-f0:], 0.25)
			got := slices.Clone(x)
			if ok := combinePair(got, i, fwd, 0, fwd.at[1], fwd.at[1], fwd.at[2], 0.5, 0.25); ok != tc.paired {
				t.Fatalf("combinePair did it: %v, want %v", ok, tc.paired)
			}
			if !tc.paired {
				same(t, got, x) // untouched
				return
			}
			same(t, got, want)
		})
	}
	t.Run("combinePair/a row not read", func(t *testing.T) {
		// Row i + 1 skips row i − 3 (a zero factor): not paired.
		x := random(wideBlock)
		i := 40
		fwd := &terms{}
		for k := 10; k < i; k++ {
			fwd.rows, fwd.negs = append(fwd.rows, int32(k)), append(fwd.negs, 1)
		}
		n0 := len(fwd.rows)
		for k := 10; k <= i; k++ {
			if k != i-3 {
				fwd.rows, fwd.negs = append(fwd.rows, int32(k)), append(fwd.negs, 1)
			}
		}
		fwd.at = []int{0, n0, len(fwd.rows)}
		if combinePair(x, i, fwd, 0, n0, n0, len(fwd.rows), 1, 1) {
			t.Fatal("paired rows that do not read rows following each other")
		}
	})
}
