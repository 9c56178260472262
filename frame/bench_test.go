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

// prepared returns the pieces of Solve up to the factorization.
func prepared(b *testing.B, mo *Model) (sol *Solution, data []float64, n, kb int) {
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
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order, releasedRotations(mo))
	sol := &Solution{model: mo, dof: dof, elems: make([]element, len(mo.Members))}
	for m := range mo.Members {
		sol.elems[m] = newElement(mo, m)
	}
	sol.indexLoads()
	kb := min(band, n-1)
	data := sol.assemble(n, kb)
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

// BenchmarkConditionEstimate compares the two ways of estimating
// ‖A⁻¹‖₁ from the factor: LAPACK's dpbcon (the baseline: solves guarded
// against overflow, n² work) and invNorm1 (plain band solves, n kb work),
// with the factorization for scale.
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
		b.Run(name+"/plain", func(b *testing.B) {
			b.ReportAllocs()
			for range b.N {
				invNorm1(u.Data, n, kb)
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
