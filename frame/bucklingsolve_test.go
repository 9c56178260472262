package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// solveKRef overwrites each of the k columns of x (b.size rows, row-major)
// with K⁻¹ times it: each member's own degrees of freedom eliminated,
// the band factor, and them recovered. Each column's arithmetic is the
// same whatever k.
func (b *Buckling) solveKRef(x []float64, k int) {
	var t [maxOwn]float64
	for m := range b.mems {
		p := &b.mems[m]
		inv, kin, _, _ := p.parts()
		for c := range k {
			for i := range p.ni {
				s := 0.0
				for q := range p.ni {
					s += inv[i*p.ni+q] * x[(p.off+q)*k+c]
				}
				t[i] = s
			}
			var l [6]float64
			for i := range p.ni {
				ti := t[i]
				for j := range 6 {
					l[j] -= kin[6*i+j] * ti
				}
				x[(p.off+i)*k+c] = ti
			}
			p.addGlobal(x, &l, c, k)
		}
	}
	switch {
	case b.n == 0:
	case k == 1:
		bandSolveVec(b.u, b.n, b.kb, x[:b.n])
	default:
		bandSolveColsRef(b.u, b.n, b.kb, x[:b.n*k], k)
	}
	for m := range b.mems {
		p := &b.mems[m]
		_, _, w, _ := p.parts()
		for c := range k {
			l := p.local(x, c, k)
			for i := range p.ni {
				s := 0.0
				for j := range 6 {
					s += w[6*i+j] * l[j]
				}
				x[(p.off+i)*k+c] -= s
			}
		}
	}
}

// bandSolveColsRef is bandSolveVec for the k columns of x (row-major, n
// rows), each column in the same order of operations as alone: one pass
// over the factor for all.
func bandSolveColsRef(u []float64, n, kb int, x []float64, k int) {
	w := kb + 1
	for i := range n {
		xi := x[i*k : (i+1)*k]
		d := 1 / u[i*w]
		for c := range xi {
			xi[c] *= d
		}
		row := u[i*w+1 : i*w+min(w, n-i)]
		for j, v := range row {
			if v == 0 {
				continue
			}
			y := x[(i+1+j)*k : (i+2+j)*k]
			for c := range y {
				y[c] += -v * xi[c]
			}
		}
	}
	for i := n - 1; i >= 0; i-- {
		xi := x[i*k : (i+1)*k]
		row := u[i*w+1 : i*w+min(w, n-i)]
		for j, v := range row {
			if v == 0 {
				continue
			}
			y := x[(i+1+j)*k : (i+2+j)*k]
			for c := range xi {
				xi[c] += -v * y[c]
			}
		}
		d := 1 / u[i*w]
		for c := range xi {
			xi[c] *= d
		}
	}
}

// TestSolveKAsBefore checks the solves of the Lanczos iteration (solveK:
// the packed own blocks, the band substitutions by partial sums) on
// random frames (fixed seed) for 1 to 9 columns:
//   - against the column-by-column form they replace (solveKRef, kept
//     here, bandSolveVec's order of operations): the same to solveKTol of
//     the column's largest number (the sums are in another order);
//   - each column the same to the last bit solved alone or with the
//     others, and with or without AVX (the numbers may not depend on the
//     number of processors);
//   - an independent product: K (K⁻¹ x) = x, K formed from the pencils
//     before their own degrees of freedom are condensed, to 1e-9 of x's
//     scale.
func TestSolveKAsBefore(t *testing.T) {
	const solveKTol = 1e-9
	rng := rand.New(rand.NewPCG(21, 4))
	for _, size := range [][2]int{{1, 1}, {3, 5}, {6, 4}, {12, 9}} {
		mo, _ := randomFrame(rng, size[0], size[1])
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		for k := 1; k <= 9; k++ {
			x := make([]float64, b.size*k)
			for i := range x {
				x[i] = rng.Float64() - 0.5
			}
			got, want := append([]float64(nil), x...), append([]float64(nil), x...)
			b.solveK(got, k)
			b.solveKRef(want, k)
			for c := range k {
				scale := 0.0
				for i := range b.size {
					scale = max(scale, abs(want[i*k+c]))
				}
				for i := range b.size {
					if abs(got[i*k+c]-want[i*k+c]) > solveKTol*scale {
						t.Fatalf("%d × %d frame, %d columns: entry %d of column %d is %.17g, before %.17g", size[0], size[1], k, i, c, got[i*k+c], want[i*k+c])
					}
				}
				alone := make([]float64, b.size)
				for i := range alone {
					alone[i] = x[i*k+c]
				}
				b.solveK(alone, 1)
				for i := range alone {
					if alone[i] != got[i*k+c] {
						t.Fatalf("%d × %d frame, %d columns: entry %d of column %d is %.17g, alone %.17g", size[0], size[1], k, i, c, got[i*k+c], alone[i])
					}
				}
			}
			if useAVX {
				plain := append([]float64(nil), x...)
				useAVX = false
				b.solveK(plain, k)
				useAVX = true
				for i := range plain {
					if plain[i] != got[i] {
						t.Fatalf("%d × %d frame, %d columns: entry %d is %.17g with AVX, %.17g without", size[0], size[1], k, i, got[i], plain[i])
					}
				}
			}
			if k == 1 {
				back := b.mulK(got)
				scale := 0.0
				for _, v := range x {
					scale = max(scale, abs(v))
				}
				for i := range back {
					if abs(back[i]-x[i]) > 1e-9*scale {
						t.Fatalf("%d × %d frame: K K⁻¹ x differs from x at %d: %.10g, %.10g", size[0], size[1], i, back[i], x[i])
					}
				}
			}
		}
	}
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}

// mulK returns K x over every degree of freedom of the pencils (the
// band's and the members' own), formed from each member's K before its
// own degrees of freedom are condensed: the band of the condensed
// stiffness (with the node springs) at the nodes, plus for each member
// its uncondensed node block less its condensed one, and its own rows
// and columns. An independent product, for TestSolveKAsBefore.
func (b *Buckling) mulK(x []float64) []float64 {
	y := make([]float64, len(x))
	kc := b.sol.assemble(b.n, b.kb)
	bandMulVec(y[:b.n], kc, x[:b.n], b.n, b.kb)
	for m := range b.mems {
		p := &b.mems[m]
		ni, d := p.ni, 6+p.ni
		_, _, _, kk := p.parts()
		l := p.local(x, 0, 1)
		z := make([]float64, d)
		copy(z, l[:])
		copy(z[6:], x[p.off:p.off+ni])
		var f [6]float64
		for i := range d {
			s := 0.0
			for j := range d {
				a := kk[i*d+j]
				if i < 6 && j < 6 {
					a -= b.sol.elems[m].k[i][j]
				}
				s += a * z[j]
			}
			if i < 6 {
				f[i] = s
			} else {
				y[p.off+i-6] = s
			}
		}
		p.addGlobal(y, &f, 0, 1)
	}
	return y
}

// BenchmarkSolveK measures one solve of the Lanczos iteration (solveK)
// of 1, 4 and 8 columns on the random 30 × 60 frame, and the
// column-by-column form it replaced (solveKRef).
func BenchmarkSolveK(b *testing.B) {
	mo, _ := randomFrame(rand.New(rand.NewPCG(18, 2)), 30, 60)
	bk, err := NewBuckling(mo)
	if err != nil {
		b.Fatal(err)
	}
	for _, k := range []int{1, 4, 8} {
		x := make([]float64, bk.size*k)
		for i := range x {
			x[i] = float64(i%7) - 3
		}
		for _, f := range []struct {
			name  string
			solve func([]float64, int)
		}{{"new", bk.solveK}, {"before", bk.solveKRef}} {
			b.Run(fmt.Sprintf("k%d/%s", k, f.name), func(b *testing.B) {
				b.ReportAllocs()
				y := make([]float64, len(x))
				start := cpuTime()
				for b.Loop() {
					copy(y, x)
					f.solve(y, k)
				}
				b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
			})
		}
	}
}

// TestReorthogonalize checks the fused Gram–Schmidt pass of the Lanczos
// iteration against the plain one (a product, then two vector updates,
// for each q in turn): r and w the same to 1e-12 of their largest
// entries (the products are summed in another order), for vectors of
// lengths 1 to 13 and 1 to 5 previous vectors (fixed seed); and r
// K-orthogonal to every q after it, |pᵀr| ≤ 1e-12 ‖r‖ (r as given), for
// orthonormal qs (the identity as K, p = q).
func TestReorthogonalize(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 9))
	for n := 1; n <= 13; n++ {
		for m := 1; m <= min(5, n); m++ {
			qs, ps := make([][]float64, m), make([][]float64, m)
			for j := range m {
				q := make([]float64, n)
				for i := range q {
					q[i] = rng.Float64() - 0.5
				}
				// Orthonormal (plain Gram–Schmidt twice).
				for range 2 {
					for l := range j {
						s := dot(qs[l], q)
						axpy(q, -s, qs[l])
					}
				}
				nq := math.Sqrt(dot(q, q))
				for i := range q {
					q[i] /= nq
				}
				qs[j], ps[j] = q, q
			}
			r := make([]float64, n)
			for i := range r {
				r[i] = rng.Float64() - 0.5
			}
			w := append([]float64(nil), r...)
			nr := math.Sqrt(dot(r, r))
			r2, w2 := append([]float64(nil), r...), append([]float64(nil), w...)
			reorthogonalize(r, w, qs, ps)
			for q := range qs {
				s := dot(ps[q], r2)
				axpy(r2, -s, qs[q])
				axpy(w2, -s, ps[q])
			}
			scale := 0.0
			for i := range r2 {
				scale = max(scale, abs(r2[i]), abs(w2[i]))
			}
			for i := range r {
				if abs(r[i]-r2[i]) > 1e-12*max(scale, 1e-300) || abs(w[i]-w2[i]) > 1e-12*max(scale, 1e-300) {
					t.Fatalf("n %d, %d vectors: entry %d: r %.17g, w %.17g; plainly %.17g, %.17g", n, m, i, r[i], w[i], r2[i], w2[i])
				}
			}
			for q := range qs {
				if s := dot(ps[q], r); abs(s) > 1e-12*max(nr, 1e-300) {
					t.Errorf("n %d, %d vectors: pᵀr = %g against vector %d", n, m, s, q)
				}
			}
		}
	}
}

// mulKgRef sets column c of the block y to −Kg x for the axial forces
// axials[c], x and y of b.size rows and len(axials) columns.
func (b *Buckling) mulKgRef(y, x []float64, axials [][]float64) {
	clear(y)
	k := len(axials)
	var z [6 + maxOwn]float64
	for m := range b.mems {
		p := &b.mems[m]
		d := 6 + p.ni
		for c, axial := range axials {
			nm := axial[m]
			if nm == 0 {
				continue
			}
			l := p.local(x, c, k)
			copy(z[:6], l[:])
			for i := range p.ni {
				z[6+i] = x[(p.off+i)*k+c]
			}
			var f [6 + maxOwn]float64
			for _, e := range p.gnz {
				f[e.i] += e.v * z[e.j]
				if e.i != e.j {
					f[e.j] += e.v * z[e.i]
				}
			}
			for i := 6; i < d; i++ {
				y[(p.off+i-6)*k+c] += -nm * f[i]
			}
			fn := [6]float64{-nm * f[0], -nm * f[1], -nm * f[2], -nm * f[3], -nm * f[4], -nm * f[5]}
			p.addGlobal(y, &fn, c, k)
		}
	}
}

// TestMulKgAsBefore checks the product with Kg of the Lanczos iteration
// (mulKg, four columns at a time) against the column-by-column form it
// replaces (mulKgRef, kept here) on random frames (fixed seed), 1 to 9
// columns, some members without axial force in some columns: the same
// numbers to the last bit (a zero's sign aside), each column's terms
// being added in the same order.
func TestMulKgAsBefore(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 11))
	for _, size := range [][2]int{{1, 1}, {4, 3}} {
		mo, axial := randomFrame(rng, size[0], size[1])
		b, err := NewBuckling(mo)
		if err != nil {
			t.Fatal(err)
		}
		for k := 1; k <= 9; k++ {
			axials := make([][]float64, k)
			for c := range axials {
				axials[c] = make([]float64, len(axial))
				for m := range axial {
					if rng.IntN(5) > 0 {
						axials[c][m] = axial[m] * (0.5 + rng.Float64())
					}
				}
			}
			x := make([]float64, b.size*k)
			for i := range x {
				x[i] = rng.Float64() - 0.5
			}
			got, want := make([]float64, len(x)), make([]float64, len(x))
			b.mulKg(got, x, axials)
			b.mulKgRef(want, x, axials)
			for i := range got {
				if got[i] != want[i] {
					t.Fatalf("%d × %d frame, %d columns: entry %d is %.17g, before %.17g", size[0], size[1], k, i, got[i], want[i])
				}
			}
		}
	}
}
