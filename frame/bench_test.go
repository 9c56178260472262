package frame

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"
)

// pieceFrame is a regular frame with one load case per beam, as pattern
// loading builds it.
func pieceFrame(bays, storeys int) *Model {
	mo := gridFrame(bays, storeys, 1)
	for m := range mo.Members {
		if mo.IsBeam(m) {
			mo.Cases = append(mo.Cases, Case{Name: mo.Members[m].Name,
				MemberLoads: []MemberLoad{{Member: m, To: mo.Length(m), W: 10, WEnd: 10}}})
		}
	}
	return mo
}

// prepared returns the pieces of Solve up to the factorization: the
// solution with its numbering, elements and loads, and the assembled band
// (n equations, kb superdiagonals).
func prepared(_ testing.TB, mo *Model) (sol *Solution, data []float64, n, kb int) {
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order, releasedRotations(mo))
	sol = &Solution{model: mo, dof: dof, elems: make([]element, len(mo.Members))}
	for m := range mo.Members {
		sol.elems[m] = newElement(mo, m)
	}
	sol.indexLoads()
	kb = min(band, n-1)
	return sol, sol.assemble(n, kb), n, kb
}

// BenchmarkMultiColumnSolve compares the two ways of solving one load
// column per beam after a single factorization: gonum's BandCholesky.SolveTo
// (the baseline: LAPACK dpbtrs, one strided column at a time) and the
// row-major block substitution Solve uses (register-blocked), and that
// substitution as vector updates (axpy), as it was before; gonum's only on
// the smaller frames.
func BenchmarkMultiColumnSolve(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 20}, {30, 60}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, data, n, kb := prepared(b, mo)
		nc := len(mo.Cases)
		rhs := sol.rhs(n)
		name := fmt.Sprintf("%dx%d/%d-columns", size.bays, size.storeys, nc)
		b.Run(name+"/gonum-SolveTo", func(b *testing.B) {
			if size.storeys > 20 {
				b.Skip("minutes")
			}
			b.ReportAllocs()
			var ch mat.BandCholesky
			if !ch.Factorize(mat.NewSymBandDense(n, kb, append([]float64(nil), data...))) {
				b.Fatal("not positive definite")
			}
			rb := mat.NewDense(n, nc, rhs)
			var x mat.Dense
			b.ResetTimer()
			for b.Loop() {
				if err := ch.SolveTo(&x, rb); err != nil {
					b.Fatal(err)
				}
			}
		})
		for _, kernel := range []struct {
			name  string
			solve func([]float64, int, int, []float64, int)
		}{{"row-major-axpy", bandSolveAxpy}, {"row-major", bandSolve}} {
			b.Run(name+"/"+kernel.name, func(b *testing.B) {
				b.ReportAllocs()
				a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: append([]float64(nil), data...), Stride: kb + 1}
				u, ok := lapack64.Pbtrf(a)
				if !ok {
					b.Fatal("not positive definite")
				}
				x := make([]float64, len(rhs))
				b.ResetTimer()
				for b.Loop() {
					copy(x, rhs)
					kernel.solve(u.Data, n, kb, x, nc)
				}
			})
		}
	}
}

func TestRowMajorSolveMatchesGonum(t *testing.T) {
	// The same system solved both ways agrees to round-off.
	mo := pieceFrame(6, 5)
	sol, data, n, kb := prepared(t, mo)
	nc := len(mo.Cases)
	rhs := sol.rhs(n)
	var ch mat.BandCholesky
	if !ch.Factorize(mat.NewSymBandDense(n, kb, append([]float64(nil), data...))) {
		t.Fatal("not positive definite")
	}
	var want mat.Dense
	if err := ch.SolveTo(&want, mat.NewDense(n, nc, append([]float64(nil), rhs...))); err != nil {
		t.Fatal(err)
	}
	a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: append([]float64(nil), data...), Stride: kb + 1}
	u, _ := lapack64.Pbtrf(a)
	got := append([]float64(nil), rhs...)
	bandSolve(u.Data, n, kb, got, nc)
	const tol = 1e-10                     // relative to the largest displacement
	scale := mat.Norm(&want, math.Inf(1)) // largest row sum bounds every entry
	for i := range n {
		for c := range nc {
			if d := got[i*nc+c] - want.At(i, c); d > tol*scale || -d > tol*scale {
				t.Fatalf("x[%d,%d] = %g, gonum %g", i, c, got[i*nc+c], want.At(i, c))
			}
		}
	}
}

// BenchmarkConditionEstimate compares the ways of estimating ‖A⁻¹‖₁ from
// the factor: LAPACK's dpbcon (the baseline: solves guarded against
// overflow, n² work), invNorm1 (the project's band substitution, one
// column, n kb work) and invNorm1Tbsv (gonum's plain band solves, dtbsv,
// as invNorm1 was before), with the factorization for scale.
func BenchmarkConditionEstimate(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{30, 60}, {30, 300}} {
		_, data, n, kb := prepared(b, gridFrame(size.bays, size.storeys, 1))
		equilibrate(data, n, kb)
		w := kb + 1
		a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: data, Stride: w}
		u, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: append([]float64(nil), data...), Stride: w})
		if !ok {
			b.Fatal("not positive definite")
		}
		f := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: u.Data, Stride: w}
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		b.Run(name+"/factorization", func(b *testing.B) {
			b.ReportAllocs()
			c := append([]float64(nil), data...)
			for range b.N {
				copy(c, a.Data)
				lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: c, Stride: w})
			}
		})
		b.Run(name+"/dpbcon", func(b *testing.B) {
			b.ReportAllocs()
			for range b.N {
				lapack64.Pbcon(f, 1, make([]float64, 3*n), make([]int, n))
			}
		})
		b.Run(name+"/substitution", func(b *testing.B) {
			b.ReportAllocs()
			for range b.N {
				invNorm1(u.Data, n, kb)
			}
		})
		b.Run(name+"/dtbsv", func(b *testing.B) {
			b.ReportAllocs()
			for range b.N {
				invNorm1Tbsv(u.Data, n, kb)
			}
		})
	}
}

// BenchmarkBalance measures the statics check of one patterned case
// through the sum of its pieces: one load column per beam, summed.
func BenchmarkBalance(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, err := Solve(mo)
		if err != nil {
			b.Fatal(err)
		}
		cs := make([]int, len(mo.Cases))
		for c := range cs {
			cs[c] = c
		}
		b.Run(fmt.Sprintf("%dx%d/%d-columns", size.bays, size.storeys, len(cs)), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sol.BalanceOf(cs)
			}
		})
	}
}

// BenchmarkFloors measures what this machine can do, for the floors of
// docs/performance.md: the substitution's row kernel (one row of a packed
// block of 32 columns formed from 96 rows, the data in the first-level
// cache) in pure Go and with AVX, in GFLOP/s (two operations a term and
// column), and reading memory (a sum over 256 MiB), in GB/s.
func BenchmarkFloors(b *testing.B) {
	const rows = 96
	x := make([]float64, (rows+1)*solveBlock)
	for i := range x {
		x[i] = float64(i%7) - 3
	}
	idx := make([]int32, rows)
	offs := make([]int, rows)
	negs := make([]float64, rows)
	for k := range rows {
		idx[k], offs[k], negs[k] = int32(k+1), (k+1)*solveBlock, 1e-3*float64(k%5-2)
	}
	flops := float64(2 * rows * solveBlock)
	b.Run("row-kernel/pure-Go", func(b *testing.B) {
		for b.Loop() {
			combine(x, 0, 0, solveBlock, offs, negs, 1)
		}
		b.ReportMetric(flops*float64(b.N)/b.Elapsed().Seconds()/1e9, "GFLOP/s")
	})
	b.Run("row-kernel/AVX", func(b *testing.B) {
		if !hasAVX() {
			b.Skip("no AVX")
		}
		for b.Loop() {
			combine32(&x[0], &x[0], &idx[0], &negs[0], rows, 1)
		}
		b.ReportMetric(flops*float64(b.N)/b.Elapsed().Seconds()/1e9, "GFLOP/s")
	})
	b.Run("memory-read", func(b *testing.B) {
		big := make([]float64, 32<<20)
		for i := range big {
			big[i] = 1
		}
		b.ResetTimer()
		s := 0.0
		for b.Loop() {
			var s0, s1, s2, s3 float64
			for i := 0; i+4 <= len(big); i += 4 {
				s0 += big[i]
				s1 += big[i+1]
				s2 += big[i+2]
				s3 += big[i+3]
			}
			s += s0 + s1 + s2 + s3
		}
		if s == 0 {
			b.Fatal("nothing read")
		}
		b.ReportMetric(float64(8*len(big))*float64(b.N)/b.Elapsed().Seconds()/1e9, "GB/s")
	})
}

// BenchmarkSolveLoads measures the multi-column solve of Solve after the
// factorization: the right-hand sides formed block by block, substituted
// and written to the displacements, in memory reused (as
// SolveCasesReusing gives it) and in memory of their own each time; with
// AVX's blocks of 32 columns and, where the processor has it, AVX-512's of
// 64. cpu-ns/op is the process's processor time (user and system) an
// operation.
func BenchmarkSolveLoads(b *testing.B) {
	defer func(v bool) { useAVX512 = v }(useAVX512)
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}, {60, 60}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, err := Solve(mo)
		if err != nil {
			b.Fatal(err)
		}
		n, kb := sol.dofs, min(sol.band, sol.dofs-1)
		for _, wide := range []bool{false, true} {
			if wide && !hasAVX512() {
				continue
			}
			name := fmt.Sprintf("%dx%d/%d-columns/avx512=%v", size.bays, size.storeys, len(mo.Cases), wide)
			b.Run(name+"/reused", func(b *testing.B) {
				useAVX512 = wide
				b.ReportAllocs()
				buf := sol.x
				start := cpuTime()
				for b.Loop() {
					if err := sol.solveLoadsIn(n, kb, buf); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
			})
			b.Run(name+"/fresh", func(b *testing.B) {
				useAVX512 = wide
				b.ReportAllocs()
				start := cpuTime()
				for b.Loop() {
					if err := sol.solveLoadsIn(n, kb, nil); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
			})
		}
	}
}
