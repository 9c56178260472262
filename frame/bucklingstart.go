package frame

import (
	"sync"

	"gonum.org/v1/gonum/mat"
)

// The starts of the later sets of axial forces of [Buckling.Factors]:
// each set's own Ritz vector on the space the first set's Lanczos
// iteration spanned (a Rayleigh–Ritz projection of its K⁻¹(−Kg) there),
// instead of the first set's mode for all. A frame's combinations buckle
// in modes much alike, which that space holds nearly whole: on the
// 30 × 60 frame each later set then takes 3 Lanczos steps where it took
// 5 or 6 from the first set's mode.

// krylov is one set's Lanczos iteration: its K-orthonormal vectors qs,
// ps = K qs, and the tridiagonal matrix of alpha and beta.
type krylov struct {
	qs, ps      [][]float64
	alpha, beta []float64
}

// maxRitzBasis (a variable for the tests) is the most Lanczos vectors
// of the first set the others' starts are projected on: with more, its
// mode alone (an iteration that long is a frame whose modes the first
// set's space says little of, and the projection's work grows with the
// square of the vectors).
var maxRitzBasis = 32

// startMix is the share of the fixed start mixed into each later set's
// Ritz vector, so that every direction is in its start (a mode the first
// set's space misses is still found, or else the check of the factor
// sends it to the search by factorizations).
const startMix = 1e-4

// ritzStarts returns each set of axials' start, K-normalized to within
// the mix, and K times it: the Ritz vector of its largest Ritz value on
// the first set's Lanczos vectors (its mode alone when there are more
// than maxRitzBasis), plus startMix times the fixed start r (z = K r).
func (b *Buckling) ritzStarts(axials [][]float64, first *krylov, r, z []float64) (rs, zs [][]float64) {
	qs, ps := first.qs, first.ps
	if len(qs) > maxRitzBasis {
		y, ky := ritzVector(qs, ps, first.alpha, first.beta)
		if y == nil {
			y, ky = r, z
		}
		qs, ps = [][]float64{y}, [][]float64{ky}
	}
	m, size := len(qs), b.size
	hs := b.project(axials, qs)
	rs, zs = make([][]float64, len(axials)), make([][]float64, len(axials))
	for c := range axials {
		y, ky := written[float64](size), written[float64](size) // added to before stored to
		var eig mat.EigenSym
		if eig.Factorize(mat.NewSymDense(m, hs[c]), true) {
			var v mat.Dense
			eig.VectorsTo(&v)
			for j := range m {
				axpy(y, v.At(j, m-1), qs[j])
				axpy(ky, v.At(j, m-1), ps[j])
			}
		}
		for i := range y {
			y[i] += startMix * r[i]
			ky[i] += startMix * z[i]
		}
		rs[c], zs[c] = y, ky
	}
	return rs, zs
}

// project returns, for each set of axial forces, Qᵀ(−Kg)Q (m × m,
// row-major, both triangles), Q the m columns qs: member by member, each
// column's local numbers, Kg per unit force times them, their products
// (the same for every set), times each set's force. The members are
// taken in two fixed halves, side by side, their sums added: the same
// numbers on any number of processors.
func (b *Buckling) project(axials [][]float64, qs [][]float64) [][]float64 {
	m := len(qs)
	half := len(b.mems) / 2
	var parts [2][][]float64
	var wg sync.WaitGroup
	for h := range 2 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			lo, hi := 0, half
			if h == 1 {
				lo, hi = half, len(b.mems)
			}
			parts[h] = b.projectMembers(axials, qs, lo, hi)
		}()
	}
	wg.Wait()
	hs := parts[0]
	for c, h := range hs {
		for i := range m {
			for j := i; j < m; j++ {
				h[i*m+j] += parts[1][c][i*m+j]
			}
			for j := range i {
				h[i*m+j] = h[j*m+i]
			}
		}
	}
	return hs
}

// projectMembers is project's upper triangles over the members lo to
// hi − 1 alone.
func (b *Buckling) projectMembers(axials [][]float64, qs [][]float64, lo, hi int) [][]float64 {
	m := len(qs)
	hs := make([][]float64, len(axials))
	for c := range hs {
		hs[c] = make([]float64, m*m)
	}
	z := make([][maxKeep]float64, m)
	f := make([][maxKeep]float64, m)
	mm := make([]float64, m*m)
	for mi := lo; mi < hi; mi++ {
		p := &b.mems[mi]
		loaded := false
		for _, axial := range axials {
			loaded = loaded || axial[mi] != 0
		}
		if !loaded {
			continue
		}
		d := 6 + p.ni
		for j, q := range qs {
			l := p.local(q, 0, 1)
			zj, fj := &z[j], &f[j]
			copy(zj[:6], l[:])
			copy(zj[6:d], q[p.off:p.off+p.ni])
			*fj = [maxKeep]float64{}
			for _, e := range p.gnz {
				fj[e.i] += e.v * zj[e.j]
				if e.i != e.j {
					fj[e.j] += e.v * zj[e.i]
				}
			}
		}
		for i := range m {
			zi := z[i][:d]
			for j := i; j < m; j++ {
				fj := f[j][:d]
				s := 0.0
				for t, v := range zi {
					s += v * fj[t]
				}
				mm[i*m+j] = s
			}
		}
		for c, axial := range axials {
			nm := axial[mi]
			if nm == 0 {
				continue
			}
			h := hs[c]
			for i := range m {
				for j := i; j < m; j++ {
					h[i*m+j] += -nm * mm[i*m+j]
				}
			}
		}
	}
	return hs
}
