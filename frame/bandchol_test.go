package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// randomBand returns a symmetric band matrix (upper band storage, n
// equations, kb superdiagonals) B Bᵀ-like and diagonally dominant by the
// factor dom (positive definite for dom > 1 by Gershgorin's theorem),
// with some entries zero, and shifted by shift on the diagonal.
func randomBand(rng *rand.Rand, n, kb int, dom, shift float64) []float64 {
	w := kb + 1
	a := make([]float64, n*w)
	rowSum := make([]float64, n)
	for i := range n {
		for j := 1; j < w && i+j < n; j++ {
			if rng.IntN(5) == 0 {
				continue
			}
			v := rng.Float64() - 0.5
			a[i*w+j] = v
			rowSum[i] += math.Abs(v)
			rowSum[i+j] += math.Abs(v)
		}
	}
	for i := range n {
		a[i*w] = dom*rowSum[i] + shift + 1e-3
	}
	return a
}

// TestBandCholesky checks the band Cholesky factorization of the check
// of a factor (bandCholesky) against LAPACK's dpbtrf (gonum): the same
// factor to 1e-12 of the largest entry on positive definite matrices
// (diagonally dominant: Gershgorin's theorem), and both refusing
// matrices that are not (a negative diagonal entry, or one dominant
// matrix shifted far down); with and without AVX, and one row at a time
// (bandCholeskyRows, LAPACK's dpbtf2 in row-major order), the same
// numbers to the last bit.
func TestBandCholesky(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 7))
	for _, tc := range []struct {
		n, kb      int
		dom, shift float64
		definite   bool
	}{
		{1, 0, 2, 0, true}, {5, 4, 2, 0, true}, {40, 3, 1.5, 0, true}, {200, 37, 1.1, 0, true},
		{300, 96, 1.2, 0, true}, {301, 96, 1.2, 0, true}, {7, 2, 1.5, 0, true}, {6, 30, 1.5, 0, true},
		{60, 9, 2, -1e6, false}, {120, 20, 0.2, -8, false},
	} {
		a := randomBand(rng, tc.n, tc.kb, tc.dom, tc.shift)
		want, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: tc.n, K: tc.kb, Data: slices.Clone(a), Stride: tc.kb + 1})
		got := slices.Clone(a)
		gotOK := bandCholesky(got, tc.n, tc.kb)
		one := slices.Clone(a)
		if oneOK := bandCholeskyRows(one, tc.n, tc.kb); oneOK != gotOK || gotOK && !slices.Equal(one, got) {
			t.Fatalf("n %d, kb %d: two rows at a time differ from one at a time", tc.n, tc.kb)
		}
		if ok != tc.definite || gotOK != ok {
			t.Fatalf("n %d, kb %d: positive definite %v, LAPACK %v, meant %v", tc.n, tc.kb, gotOK, ok, tc.definite)
		}
		if ok {
			scale := 0.0
			for _, v := range want.Data {
				scale = max(scale, math.Abs(v))
			}
			for i := range got {
				if math.Abs(got[i]-want.Data[i]) > 1e-12*scale {
					t.Fatalf("n %d, kb %d: entry %d is %.15g, LAPACK's %.15g", tc.n, tc.kb, i, got[i], want.Data[i])
				}
			}
		}
		if useAVX {
			plain := slices.Clone(a)
			useAVX = false
			plainOK := bandCholesky(plain, tc.n, tc.kb)
			useAVX = true
			if plainOK != gotOK {
				t.Fatalf("n %d, kb %d: without AVX positive definite %v, with %v", tc.n, tc.kb, plainOK, gotOK)
			}
			for i := range got {
				if gotOK && plain[i] != got[i] {
					t.Fatalf("n %d, kb %d: entry %d is %.17g without AVX, %.17g with", tc.n, tc.kb, i, plain[i], got[i])
				}
			}
		}
	}
}

// BenchmarkBandCholesky measures the band Cholesky factorization of the
// check of a factor (bandCholesky), the blocked one of the checks of
// definiteness (bandDefinite) and LAPACK's dpbtrf (gonum) on matrices of
// the bands of the 30 × 60 and 60 × 60 frames and smaller ones.
func BenchmarkBandCholesky(b *testing.B) {
	for _, size := range [][2]int{{600, 30}, {2000, 60}, {5580, 98}, {10980, 182}} {
		a := randomBand(rand.New(rand.NewPCG(5, 5)), size[0], size[1], 1.2, 0)
		c := make([]float64, len(a))
		b.Run(fmt.Sprintf("%dx%d/own", size[0], size[1]), func(b *testing.B) {
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				copy(c, a)
				if !bandCholesky(c, size[0], size[1]) {
					b.Fatal("not positive definite")
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
		p := padBand(a, size[0], size[1])
		d := make([]float64, len(p))
		b.Run(fmt.Sprintf("%dx%d/blocked", size[0], size[1]), func(b *testing.B) {
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				copy(d, p)
				if !bandDefinite(d, size[0], size[1]) {
					b.Fatal("not positive definite")
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
		b.Run(fmt.Sprintf("%dx%d/lapack", size[0], size[1]), func(b *testing.B) {
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				copy(c, a)
				if _, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: size[0], K: size[1], Data: c, Stride: size[1] + 1}); !ok {
					b.Fatal("not positive definite")
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
	}
}

// bandCholeskyRows is bandCholesky one row at a time: row i pivoted and
// scaled, then each row below it less its outer product.
func bandCholeskyRows(a []float64, n, kb int) bool {
	w := kb + 1
	for i := range n {
		m := min(kb, n-1-i)
		row := a[i*w : i*w+m+1]
		if !(row[0] > 0) {
			return false
		}
		d := math.Sqrt(row[0])
		row[0] = d
		r := 1 / d
		for j := 1; j <= m; j++ {
			row[j] *= r
		}
		for j := 1; j <= m; j++ {
			v := row[j]
			y := a[(i+j)*w : (i+j)*w+m-j+1]
			for c := range y {
				y[c] -= v * row[j+c]
			}
		}
	}
	return true
}

// TestBandCholeskyProfile checks the band Cholesky factorization on
// matrices whose rows end short of the band, at random places (some rows
// with nothing right of the diagonal), as the stiffness of a frame
// ordered by reverse Cuthill–McKee does: the same numbers as one row at
// a time over the whole band (bandCholeskyRows, LAPACK's dpbtf2 in
// row-major order) to the last bit, zeros but for their sign, and
// LAPACK's dpbtrf (gonum) to 1e-12 of the largest entry.
func TestBandCholeskyProfile(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 8))
	for _, tc := range []struct{ n, kb int }{{2, 1}, {9, 4}, {50, 12}, {301, 96}, {400, 40}} {
		t.Run(fmt.Sprintf("%dx%d", tc.n, tc.kb), func(t *testing.T) {
			w := tc.kb + 1
			a := randomBand(rng, tc.n, tc.kb, 1.2, 0)
			for i := range tc.n {
				end := rng.IntN(w) // the profile: rows ending anywhere
				if i%2 == 1 {
					end = w/2 + rng.IntN(w-w/2) // or in the band's second half
				}
				for j := end + 1; j < w; j++ {
					a[i*w+j] = 0
				}
			}
			want, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: tc.n, K: tc.kb, Data: slices.Clone(a), Stride: w})
			got := slices.Clone(a)
			gotOK := bandCholesky(got, tc.n, tc.kb)
			one := slices.Clone(a)
			oneOK := bandCholeskyRows(one, tc.n, tc.kb)
			if !ok || !gotOK || !oneOK {
				t.Fatalf("positive definite %v, one row at a time %v, LAPACK %v; meant to be", gotOK, oneOK, ok)
			}
			scale := 0.0
			for _, v := range want.Data {
				scale = max(scale, math.Abs(v))
			}
			for i := range got {
				if got[i] != one[i] {
					t.Fatalf("entry %d is %.17g, one row at a time %.17g", i, got[i], one[i])
				}
				if math.Abs(got[i]-want.Data[i]) > 1e-12*scale {
					t.Fatalf("entry %d is %.15g, LAPACK's %.15g", i, got[i], want.Data[i])
				}
			}
		})
	}
}

// padBand returns the band matrix a (n equations, kb superdiagonals,
// kb + 1 numbers a row) in the storage of bandDefinite.
func padBand(a []float64, n, kb int) []float64 {
	ld := definiteStride(kb)
	p := make([]float64, definiteLen(n, kb))
	for i := range n {
		copy(p[i*ld:i*ld+kb+1], a[i*(kb+1):(i+1)*(kb+1)])
	}
	return p
}

// TestBandDefinite checks the blocked factorization of the checks of
// definiteness (bandDefinite) against LAPACK's dpbtrf (gonum): the same
// factor to 1e-12 of its largest entry on positive definite matrices
// (diagonally dominant: Gershgorin's theorem; some with rows ending
// short of the band, as a stiffness ordered by reverse Cuthill–McKee),
// its padding still zero; and the same answer on matrices that are not:
// a dominant matrix shifted far down, and ones made indefinite at one
// pivot on purpose, the last among them (the diagonal entry set to what
// the rows above take from it, less a little: the pivot LAPACK's
// factorization finds, 1e-6 of its entry, is then negative). With
// AVX-512, with AVX alone (rankUpdate4Rows) and in Go (also -tags
// purego).
func TestBandDefinite(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 9))
	for _, tc := range []struct {
		n, kb   int
		profile bool
		fail    int // the pivot made to fail, −1 for none
		shift   float64
	}{
		{1, 0, false, -1, 0}, {3, 1, false, -1, 0}, {5, 4, false, -1, 0}, {40, 3, false, -1, 0},
		{200, 37, false, -1, 0}, {301, 96, true, -1, 0}, {300, 96, false, -1, 0}, {6, 30, false, -1, 0},
		{97, 23, true, -1, 0}, {1000, 182, true, -1, 0}, {17, 8, false, -1, 0}, {33, 9, true, -1, 0},
		{60, 9, false, -1, -1e6}, {120, 20, false, 0, 0}, {120, 20, false, 77, 0}, {301, 96, true, 300, 0},
		{500, 98, true, 499, 0}, {500, 98, false, 250, 0}, {9, 8, false, 8, 0},
	} {
		for _, path := range []struct{ avx512, avx bool }{{true, true}, {false, true}, {false, false}} {
			if path.avx512 && !useAVX512 || path.avx && !useAVX {
				continue
			}
			name := fmt.Sprintf("%dx%d/fail%d/avx512=%v/avx=%v", tc.n, tc.kb, tc.fail, path.avx512, path.avx)
			t.Run(name, func(t *testing.T) {
				defer func(avx512, avx bool) { useAVX512, useAVX = avx512, avx }(useAVX512, useAVX)
				useAVX512, useAVX = path.avx512, path.avx
				w := tc.kb + 1
				a := randomBand(rand.New(rand.NewPCG(uint64(tc.n), uint64(tc.kb))), tc.n, tc.kb, 1.2, tc.shift)
				if tc.profile {
					for i := range tc.n {
						for j := rng.IntN(w) + 1; j < w; j++ {
							a[i*w+j] = 0
						}
					}
				}
				if tc.fail >= 0 {
					// The pivot of row fail is the entry less what the
					// rows above take from it: factor the rows above
					// alone (LAPACK) and set the entry to that, less 1e-6.
					f := tc.fail
					above, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: tc.n, K: tc.kb, Data: slices.Clone(a), Stride: w})
					if !ok {
						t.Fatal("not positive definite before it is made not to be")
					}
					taken := 0.0
					for r := max(0, f-tc.kb); r < f; r++ {
						u := above.Data[r*w+f-r]
						taken += u * u
					}
					a[f*w] = taken - 1e-6*a[f*w]
				}
				definite := tc.fail < 0 && tc.shift == 0
				want, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: tc.n, K: tc.kb, Data: slices.Clone(a), Stride: w})
				got := padBand(a, tc.n, tc.kb)
				gotOK := bandDefinite(got, tc.n, tc.kb)
				if ok != definite || gotOK != ok {
					t.Fatalf("positive definite %v, LAPACK %v, meant %v", gotOK, ok, definite)
				}
				if !ok {
					return
				}
				scale := 0.0
				for _, v := range want.Data {
					scale = max(scale, math.Abs(v))
				}
				ld := definiteStride(tc.kb)
				for i := range tc.n {
					for j := range ld - 4 {
						g := got[i*ld+j]
						if j > tc.kb {
							if g != 0 {
								t.Fatalf("row %d: padding %d is %g", i, j, g)
							}
							continue
						}
						if math.Abs(g-want.Data[i*w+j]) > 1e-12*scale {
							t.Fatalf("entry (%d, %d) is %.15g, LAPACK's %.15g", i, i+j, g, want.Data[i*w+j])
						}
					}
				}
			})
		}
	}
}
