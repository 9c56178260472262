package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// The set-by-set factor, solves and condensation of the inner degrees of
// freedom (geometric.go) give those of the full loops over every inner
// degree of freedom, as they were written first and are written again
// here (a textbook Cholesky factor and its two substitutions, Golub and
// Van Loan, Matrix Computations, 4th ed., Alg. 4.2.1, from memory), to the
// last bit: members of random frames (releases, springs, rigid zones)
// under random axial forces, tension and compression, each with random
// loads on its inner nodes.
func TestInnerSetsAreTheFullLoops(t *testing.T) {
	for _, seed := range []uint64{1, 2, 3} {
		t.Run(fmt.Sprintf("seed %d", seed), func(t *testing.T) {
			rng := rand.New(rand.NewPCG(seed, 0))
			mo, axial := randomFrame(rng, 3, 3)
			checked := 0
			for m := range mo.Members {
				for _, f := range []float64{1, -1, 0.5 * rng.Float64()} {
					n := f * (1 + math.Abs(axial[m]))
					e, ok := newElementAxial(mo, m, n, true)
					ref, refOK := fullCondensed(mo, m, n)
					if ok != refOK {
						t.Fatalf("member %d, N = %v: stable %v, full loops %v", m, n, ok, refOK)
					}
					if !ok {
						continue
					}
					checked++
					if e.so.lii != ref.lii {
						t.Fatalf("member %d, N = %v: Cholesky factor %v, full loops %v", m, n, e.so.lii, ref.lii)
					}
					if e.flex != ref.flex {
						t.Fatalf("member %d, N = %v: condensed stiffness %v, full loops %v", m, n, e.flex, ref.flex)
					}
					var full [3 * (SubElements + 1)]float64
					for i := range full {
						full[i] = rng.NormFloat64()
					}
					if got, want := e.so.condenseLoads(&full), ref.condenseLoads(&full); got != want {
						t.Fatalf("member %d, N = %v: condensed loads %v, full loops %v", m, n, got, want)
					}
				}
			}
			if checked < len(mo.Members) {
				t.Fatalf("only %d members checked", checked)
			}
		})
	}
}

// fullRef is the condensation of a member's inner nodes by the full
// loops.
type fullRef struct {
	lii  [inner][inner]float64
	kie  [inner][6]float64
	flex [6][6]float64
}

func fullCondensed(mo *Model, m int, n float64) (fullRef, bool) {
	e0, _ := newElementAxial(mo, m, 0, false)
	k := subStiffness(e0.ea, e0.ei, e0.lf, n)
	var r fullRef
	var kii [inner][inner]float64
	for i := range inner {
		for j := range inner {
			kii[i][j] = k[innerDOF(i)][innerDOF(j)]
		}
		for j := range 6 {
			r.kie[i][j] = k[innerDOF(i)][endDOF[j]]
		}
	}
	for j := range inner {
		s := kii[j][j]
		for k := range j {
			s -= r.lii[j][k] * r.lii[j][k]
		}
		if !(s > 0) {
			return r, false
		}
		r.lii[j][j] = math.Sqrt(s)
		for i := j + 1; i < inner; i++ {
			t := kii[i][j]
			for k := range j {
				t -= r.lii[i][k] * r.lii[j][k]
			}
			r.lii[i][j] = t / r.lii[j][j]
		}
	}
	for j := range 6 {
		var col [inner]float64
		for i := range inner {
			col[i] = r.kie[i][j]
		}
		r.solve(&col)
		for i := range 6 {
			v := k[endDOF[i]][endDOF[j]]
			for q := range inner {
				v -= r.kie[q][i] * col[q]
			}
			r.flex[i][j] = v
		}
	}
	for i := range 6 {
		for j := i + 1; j < 6; j++ {
			v := (r.flex[i][j] + r.flex[j][i]) / 2
			r.flex[i][j], r.flex[j][i] = v, v
		}
	}
	return r, true
}

func (r *fullRef) solve(x *[inner]float64) {
	for i := range inner {
		s := x[i]
		for k := range i {
			s -= r.lii[i][k] * x[k]
		}
		x[i] = s / r.lii[i][i]
	}
	for i := inner - 1; i >= 0; i-- {
		s := x[i]
		for k := i + 1; k < inner; k++ {
			s -= r.lii[k][i] * x[k]
		}
		x[i] = s / r.lii[i][i]
	}
}

func (r *fullRef) condenseLoads(full *[3 * (SubElements + 1)]float64) [6]float64 {
	var fi [inner]float64
	for i := range inner {
		fi[i] = full[innerDOF(i)]
	}
	r.solve(&fi)
	var out [6]float64
	for i := range 6 {
		v := full[endDOF[i]]
		for q := range inner {
			v -= r.kie[q][i] * fi[q]
		}
		out[i] = v
	}
	return out
}
