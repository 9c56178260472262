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

// BenchmarkCertify measures the check of a factor found (definite: the
// assembly of K + λ·Kg at λ just below αcr and its blocked factorization,
// bandDefinite) on random frames of the sizes of the 30 × 60 and 60 × 60
// frames, against the same check by the unblocked factorization
// (assembleAt in the layout of Solution.assemble, bandCholesky), as it
// was.
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
		b.Run(name+"/blocked", func(b *testing.B) {
			b.ReportAllocs()
			var sc certifyScratch
			for b.Loop() {
				if !bk.definite(lambda, axial, &sc) {
					b.Fatal("not positive definite below αcr")
				}
			}
		})
		b.Run(name+"/unblocked", func(b *testing.B) {
			b.ReportAllocs()
			data := make([]float64, bk.n*(bk.kb+1))
			for b.Loop() {
				clear(data)
				if !bk.assembleAt(data, bk.kb+1, lambda, axial) || !bandCholesky(data, bk.n, bk.kb) {
					b.Fatal("not positive definite below αcr")
				}
			}
		})
	}
}
