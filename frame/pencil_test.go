package frame

import (
	"math/rand/v2"
	"testing"
)

// TestCondensedAtIsSchur checks condensedAt, the blocks of K + n·Kg
// condensed with each sum of the node block formed once, against the
// whole matrix condensed by schurIn (condensedAtSchur, the way it was
// first done): the same numbers to the last bit, and the same refusals,
// for every member of random frames (fixed seed; releases, springs,
// rigid zones) at axial forces from tension to beyond the member's own
// buckling load.
func TestCondensedAtIsSchur(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 5))
	for _, size := range [][2]int{{2, 3}, {5, 4}} {
		mo, _ := randomFrame(rng, size[0], size[1])
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		t.Run("", func(t *testing.T) {
			refused := 0
			for m := range b.mems {
				p := &b.mems[m]
				for _, f := range []float64{0, 1, 1e3, -1, -1e2, -1e3, -1e4, -1e5} {
					n := f * 10 * (1 + rng.Float64()) // kN
					got, ok := p.condensedAt(n)
					want, wok := p.condensedAtSchur(n)
					if ok != wok {
						t.Fatalf("member %d at N = %g: positive definite %v, by schurIn %v", m, n, ok, wok)
					}
					if !ok {
						refused++
						continue
					}
					if got != want {
						t.Fatalf("member %d at N = %g: %v, by schurIn %v", m, n, got, want)
					}
				}
			}
			if refused == 0 {
				t.Errorf("%d × %d frame: no member refused: the forces do not reach a member's own buckling", size[0], size[1])
			}
		})
	}
}

// condensedAtSchur is condensedAt as it was first written, all of K + n·Kg
// condensed by schurIn: the fast one is checked against it bit for bit.
func (p *pencil) condensedAtSchur(n float64) (k [6][6]float64, ok bool) {
	keep := 6 + p.ni
	_, _, _, kk := p.parts()
	var a [maxFull][maxFull]float64
	for i := range keep {
		copy(a[i][:keep], kk[i*keep:(i+1)*keep])
	}
	for _, e := range p.gnz {
		v := n * e.v
		a[e.i][e.j] += v
		if e.i != e.j {
			a[e.j][e.i] += v
		}
	}
	if !schurIn(&a, keep, 6) {
		return k, false
	}
	for i := range 6 {
		for j := range 6 {
			k[i][j] = (a[i][j] + a[j][i]) / 2
		}
	}
	return k, true
}

// BenchmarkCondensedAt measures condensedAt for every member of a random
// 30 × 60 frame at its axial force, once each, as the check of a factor
// takes them.
func BenchmarkCondensedAt(b *testing.B) {
	mo, axial := randomFrame(rand.New(rand.NewPCG(18, 1)), 30, 60)
	bk, err := NewBuckling(mo)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("30x60", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			for m := range bk.mems {
				if _, ok := bk.mems[m].condensedAt(axial[m]); !ok {
					b.Fatal("own block not positive definite")
				}
			}
		}
	})
}
