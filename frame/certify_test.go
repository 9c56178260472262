package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// TestAssembleAt checks the assembly of the check of a factor against
// the first-order one: at λ = 0 the band of K, the pencils condensed and
// turned by toGlobal6, is the band the elements give (Solution.assemble,
// each member's Tᵀ k T by full products) to 1e-12 of its largest entry,
// on random frames (fixed seed) with node springs; and toGlobal6 is the
// element's global() on random matrices and angles to 1e-13.
func TestAssembleAt(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 8))
	for _, size := range [][2]int{{1, 1}, {3, 4}, {7, 5}} {
		mo, axial := randomFrame(rng, size[0], size[1])
		mo.Nodes[len(mo.Nodes)-1].Springs = [3]float64{3e3, 0, 5e2}
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		want := b.sol.assemble(b.n, b.kb)
		got := make([]float64, len(want))
		if !b.assembleAt(got, b.kb+1, 0, axial) {
			t.Fatal("K not positive definite")
		}
		scale := 0.0
		for _, v := range want {
			scale = max(scale, math.Abs(v))
		}
		for i := range got {
			if math.Abs(got[i]-want[i]) > 1e-12*scale {
				t.Fatalf("%d × %d frame: entry %d is %.15g, the elements' %.15g", size[0], size[1], i, got[i], want[i])
			}
		}
	}
	for range 20 {
		var e element
		a := 2 * math.Pi * rng.Float64()
		e.c, e.s = math.Cos(a), math.Sin(a)
		for i := range 6 {
			for j := range 6 {
				e.k[i][j] = rng.Float64() - 0.5
			}
		}
		want := e.global()
		got := toGlobal6(&e.k, e.c, e.s)
		for i := range 6 {
			for j := range 6 {
				if math.Abs(got[i][j]-want[i][j]) > 1e-13 {
					t.Fatalf("angle %g: [%d][%d] %.17g, global() %.17g", a, i, j, got[i][j], want[i][j])
				}
			}
		}
	}
}

// BenchmarkCertify measures the check of a factor found (definite: K +
// λ·Kg at λ just below αcr assembled and factored, a window of rows at a
// time, definiteBand) on random frames of the sizes of the 30 × 60 and
// 60 × 60 frames, against the same check on the whole band assembled at
// once (assembleAt), factored blocked (bandDefinite) and unblocked
// (bandCholesky, as it was). Beside the time, cpu-ns/op is the process's
// processor time per operation.
func BenchmarkCertify(b *testing.B) {
	for _, size := range [][2]int{{30, 60}, {60, 60}} {
		mo, axial := randomFrame(rand.New(rand.NewPCG(18, 1)), size[0], size[1])
		bk, err := NewBuckling(mo)
		if err != nil {
			b.Fatal(err)
		}
		alpha, err := bk.Factor(axial)
		if err != nil {
			b.Fatal(err)
		}
		lambda := (1 - certifyGap) * alpha
		name := fmt.Sprintf("%dx%d", size[0], size[1])
		run := func(b *testing.B, check func() bool) {
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				if !check() {
					b.Fatal("not positive definite below αcr")
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		}
		b.Run(name+"/window", func(b *testing.B) {
			var sc certifyScratch
			run(b, func() bool { return bk.definite(lambda, axial, &sc) })
		})
		b.Run(name+"/whole-blocked", func(b *testing.B) {
			data := make([]float64, definiteLen(bk.n, bk.kb))
			run(b, func() bool {
				clear(data)
				return bk.assembleAt(data, definiteStride(bk.kb), lambda, axial) && bandDefinite(data, bk.n, bk.kb)
			})
		})
		b.Run(name+"/whole-unblocked", func(b *testing.B) {
			data := make([]float64, bk.n*(bk.kb+1))
			run(b, func() bool {
				clear(data)
				return bk.assembleAt(data, bk.kb+1, lambda, axial) && bandCholesky(data, bk.n, bk.kb)
			})
		})
	}
}

// TestDefiniteBand checks the check of definiteness as it assembles and
// factors a window of rows at a time (definiteBand) against the whole
// band assembled (assembleAt) and factored by the unblocked band
// Cholesky factorization (bandCholesky, itself checked against LAPACK's
// dpbtrf): the same answer for K + λ·Kg at λ from 0 to far past αcr
// (0.999 and 1.001 αcr either side of it, Sylvester's law of inertia;
// and at 1e4 αcr some member's own block not positive definite), on
// random frames (fixed seed), some tall enough for the window to move
// many times, with node springs.
func TestDefiniteBand(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 9))
	for _, size := range [][2]int{{1, 1}, {2, 3}, {3, 40}, {1, 90}, {6, 12}} {
		mo, axial := randomFrame(rng, size[0], size[1])
		mo.Nodes[len(mo.Nodes)-1].Springs = [3]float64{3e3, 0, 5e2}
		mo.Nodes[len(mo.Nodes)/2].Springs = [3]float64{0, 1e3, 0}
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		alpha, err := b.Factor(axial)
		if err != nil {
			t.Fatal(err)
		}
		moves := b.n+3 > 4*(definiteBlock+b.kb+3)
		var sc certifyScratch
		for _, f := range []float64{0, 0.5, 0.999, 1.001, 1.5, 3, 1e4} {
			lambda := f * alpha
			want := make([]float64, b.n*(b.kb+1))
			wantOK := b.assembleAt(want, b.kb+1, lambda, axial) && bandCholesky(want, b.n, b.kb)
			if got := b.definiteBand(lambda, axial, &sc); got != wantOK {
				t.Fatalf("%d × %d frame (window moves %v), λ = %g αcr: positive definite %v, the whole band %v", size[0], size[1], moves, f, got, wantOK)
			}
			if f < 1 && !wantOK || f > 1 && wantOK {
				t.Fatalf("%d × %d frame, λ = %g αcr: positive definite %v", size[0], size[1], f, wantOK)
			}
		}
	}
}
