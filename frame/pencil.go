package frame

import "math"

// maxOwn is the most degrees of freedom a member keeps of its own: the
// transverse displacement and rotation of each inner node, and a
// released or sprung rotation at either end.
const maxOwn = 2*(SubElements-1) + 2

// maxKeep is the most degrees of freedom of a pencil (the nodes' six and
// the member's own), and maxFull that with the inner nodes' axial ones,
// which are condensed while it is built.
const (
	maxKeep = 6 + maxOwn
	maxFull = maxKeep + SubElements - 1
)

// pencil is one member's part of K and of Kg per unit axial force, over
// its nodes' six local degrees of freedom and ni of its own. Its numbers
// (d) lie packed one member after another, in the order solveK reads
// them: K's own block inverted (ni × ni), K's own rows at the node
// columns (ni × 6) and the product of the two (ni × 6); apart from them
// (k), K over all 6 + ni degrees of freedom, row-major, for the check of
// a factor.
type pencil struct {
	c, s float64
	gdof [6]int // equation of each node degree of freedom, or < 0
	ni   int
	off  int       // where its own degrees of freedom start in a vector
	d    []float64 // its numbers for solveK (above)
	k    []float64 // K over all its degrees of freedom
	gnz  []gEntry  // the entries of Kg per unit axial force that are not zero, upper triangle, tension positive
}

// gEntry is one entry of a pencil's Kg, at row i and column j.
type gEntry struct {
	i, j uint8
	v    float64
}

// parts returns the pencil's packed numbers: K's own block inverted,
// its own rows, their product, and K.
func (p *pencil) parts() (inv, kin, w, k []float64) {
	ni := p.ni
	d := p.d
	return d[:ni*ni], d[ni*ni : ni*ni+6*ni], d[ni*ni+6*ni : ni*ni+12*ni], p.k
}

// pencilStore is the memory the pencils of a run of members share:
// their numbers and Kg's entries are appended to it.
type pencilStore struct {
	d, k []float64
	gnz  []gEntry
}

// build sets p's parts from the member e, appending its numbers to st,
// and returns the local stiffness at the nodes with its own degrees of
// freedom condensed out (e's own, to rounding); ok is false when K's own
// block is not positive definite.
func (p *pencil) build(e *element, st *pencilStore) (k [6][6]float64, ok bool) {
	p.c, p.s = e.c, e.s
	// Degrees of freedom: 0-5 the nodes' (local axes); then the own end
	// rotations; then v, θ of each inner node; last u of each inner node
	// (condensed here).
	own := [2]int{-1, -1}
	d := 6
	for side := range 2 {
		rel := e.release.AtStart()
		if side == 1 {
			rel = e.release.AtEnd()
		}
		if rel || e.spring[side] > 0 {
			own[side] = d
			d++
		}
	}
	ni := d - 6 + 2*(SubElements-1)
	keep := 6 + ni
	// sub maps each of the subdivided member's 15 degrees of freedom to
	// the full ones: sub = Σ coef · full (one or two terms).
	type term struct {
		j int
		c float64
	}
	var sub [3 * (SubElements + 1)][2]term
	var terms [3 * (SubElements + 1)]int
	set := func(i int, t ...term) {
		terms[i] = copy(sub[i][:], t)
	}
	set(0, term{0, 1})
	set(1, term{1, 1}, term{2, e.a})
	set(2, term{2, 1})
	if own[0] >= 0 {
		set(2, term{own[0], 1})
	}
	last := 3 * SubElements
	set(last, term{3, 1})
	set(last+1, term{4, 1}, term{5, -e.b})
	set(last+2, term{5, 1})
	if own[1] >= 0 {
		set(last+2, term{own[1], 1})
	}
	for j := 1; j < SubElements; j++ {
		set(3*j, term{d + 2*(SubElements-1) + j - 1, 1})
		set(3*j+1, term{d + 2*(j-1), 1})
		set(3*j+2, term{d + 2*(j-1) + 1, 1})
	}
	k0 := subStiffness(e.ea, e.ei, e.lf, 0)
	k1 := subStiffness(0, 0, e.lf, 1)
	var a0, a1 [maxFull][maxFull]float64
	for i := range k0 {
		for j := range k0 {
			for _, ti := range sub[i][:terms[i]] {
				for _, tj := range sub[j][:terms[j]] {
					a0[ti.j][tj.j] += ti.c * tj.c * k0[i][j]
					a1[ti.j][tj.j] += ti.c * tj.c * k1[i][j]
				}
			}
		}
	}
	for side, r := range [2]int{2, 5} {
		if o := own[side]; o >= 0 && !(side == 0 && e.release.AtStart() || side == 1 && e.release.AtEnd()) {
			ks := e.spring[side]
			a0[o][o] += ks
			a0[r][r] += ks
			a0[o][r] -= ks
			a0[r][o] -= ks
		}
	}
	a1[2][2] += e.a
	a1[5][5] += e.b
	// Condense the inner axial ones out of K (Kg has none of them), then
	// the member's own.
	if !schurIn(&a0, keep+SubElements-1, keep) {
		return k, false
	}
	var lii [maxOwn][maxOwn]float64
	if !ownFactor(&a0, keep, &lii) {
		return k, false
	}
	p.ni = ni
	at := len(st.d)
	st.d = append(st.d, make([]float64, ni*ni+12*ni)...)
	p.d = st.d[at:len(st.d):len(st.d)]
	at = len(st.k)
	st.k = append(st.k, make([]float64, keep*keep)...)
	p.k = st.k[at:len(st.k):len(st.k)]
	inv, kin, w, kk := p.parts()
	for i := range ni {
		for j := range 6 {
			kin[6*i+j] = a0[6+i][j]
		}
	}
	for j := range ni {
		var col [maxOwn]float64
		col[j] = 1
		ownSolve(&lii, ni, &col)
		for i := range ni {
			inv[i*ni+j] = col[i]
		}
	}
	for i := range ni {
		for j := range 6 {
			s := 0.0
			for q := range ni {
				s += inv[i*ni+q] * kin[6*q+j]
			}
			w[6*i+j] = s
		}
	}
	for i := range keep {
		copy(kk[i*keep:(i+1)*keep], a0[i][:keep])
	}
	g0 := len(st.gnz)
	for i := range keep {
		for j := i; j < keep; j++ {
			if a1[i][j] != 0 {
				st.gnz = append(st.gnz, gEntry{uint8(i), uint8(j), a1[i][j]})
			}
		}
	}
	p.gnz = st.gnz[g0:len(st.gnz):len(st.gnz)]
	if !schurIn(&a0, keep, 6) {
		return k, false
	}
	for i := range 6 {
		for j := range 6 {
			k[i][j] = (a0[i][j] + a0[j][i]) / 2
		}
	}
	return k, true
}

// condensedAt returns the pencil's K + n·Kg (n the axial force, tension
// positive) with its own degrees of freedom condensed out, the local
// stiffness at the nodes; ok is false when the own block of K + n·Kg is
// not positive definite (its Cholesky factorization fails). It is
// schurIn's arithmetic on the pencil's blocks, each sum of the node
// block formed once for both of its places (the two are the same
// products in the same order): the same numbers, a third of the work.
func (p *pencil) condensedAt(n float64) (k [6][6]float64, ok bool) {
	ni := p.ni
	keep := 6 + ni
	kk := p.k[:keep*keep]
	// a = K + n·Kg: the node block, the own rows at the node columns
	// (lower left) and the own block.
	var nn [6][6]float64
	var on [maxOwn][6]float64
	var oo [maxOwn][maxOwn]float64
	for i := range 6 {
		copy(nn[i][:], kk[i*keep:i*keep+6])
	}
	for i := range ni {
		r := kk[(6+i)*keep : (7+i)*keep]
		copy(on[i][:], r[:6])
		copy(oo[i][:ni], r[6:])
	}
	for _, e := range p.gnz {
		v := n * e.v
		i, j := int(e.i), int(e.j)
		switch {
		case j < 6: // i ≤ j < 6
			nn[i][j] += v
			if i != j {
				nn[j][i] += v
			}
		case i < 6: // a node row, an own column: its mirror is in on
			on[j-6][i] += v
		default:
			oo[i-6][j-6] += v
			if i != j {
				oo[j-6][i-6] += v
			}
		}
	}
	// The own block's Cholesky factor, column by column (schurIn).
	var l [maxOwn][maxOwn]float64
	for j := range ni {
		lj := &l[j]
		s := oo[j][j]
		for q := range j {
			s -= lj[q] * lj[q]
		}
		if !(s > 0) {
			return k, false
		}
		d := math.Sqrt(s)
		lj[j] = d
		for i := j + 1; i < ni; i++ {
			li := &l[i]
			t := oo[i][j]
			for q := range j {
				t -= li[q] * lj[q]
			}
			li[j] = t / d
		}
	}
	// y[j] = L⁻¹ (column j of the own rows), then the node block less
	// Σ y[i][q] y[j][q].
	// Row i of all six columns at once: each y[j][i] by the same
	// operations in the same order as column by column, the six
	// divisions independent of each other.
	var y [6][maxOwn]float64
	for i := range ni {
		li := &l[i]
		d := li[i]
		s := on[i]
		for q := range i {
			v := li[q]
			s[0] -= v * y[0][q]
			s[1] -= v * y[1][q]
			s[2] -= v * y[2][q]
			s[3] -= v * y[3][q]
			s[4] -= v * y[4][q]
			s[5] -= v * y[5][q]
		}
		y[0][i], y[1][i], y[2][i] = s[0]/d, s[1]/d, s[2]/d
		y[3][i], y[4][i], y[5][i] = s[3]/d, s[4]/d, s[5]/d
	}
	for i := range 6 {
		yi := &y[i]
		for j := i; j < 6; j++ {
			yj := &y[j]
			s := 0.0
			for q := range ni {
				s += yi[q] * yj[q]
			}
			v := ((nn[i][j] - s) + (nn[j][i] - s)) / 2
			k[i][j], k[j][i] = v, v
		}
	}
	return k, true
}

// schurIn replaces a[:keep][:keep] by its Schur complement a[:keep, :keep]
// − a[:keep, keep:r] a[keep:r, keep:r]⁻¹ a[keep:r, :keep] (r rows of a in
// use, keep ≤ maxKeep and r − keep ≤ maxOwn), a[keep:r, keep:r] by
// Cholesky factorization; false when that is not positive definite.
// The rest of a is left as it was.
func schurIn(a *[maxFull][maxFull]float64, r, keep int) bool {
	z := r - keep
	if z == 0 {
		return true
	}
	// Arrays of the sizes needed only: they are zeroed at each call.
	var l [maxOwn][maxOwn]float64
	for j := range z {
		s := a[keep+j][keep+j]
		for q := range j {
			s -= l[j][q] * l[j][q]
		}
		if !(s > 0) {
			return false
		}
		l[j][j] = math.Sqrt(s)
		for i := j + 1; i < z; i++ {
			t := a[keep+i][keep+j]
			for q := range j {
				t -= l[i][q] * l[j][q]
			}
			l[i][j] = t / l[j][j]
		}
	}
	// Each column j of a[keep:r, :keep]: y = L⁻¹ a[keep:, j]; then
	// a[i][j] −= yᵢ · yⱼ summed, a[:keep, keep:] = a[keep:, :keep]ᵀ.
	var y [maxKeep][maxOwn]float64 // y[j] = L⁻¹ column j
	for j := range keep {
		for i := range z {
			s := a[keep+i][j]
			for q := range i {
				s -= l[i][q] * y[j][q]
			}
			y[j][i] = s / l[i][i]
		}
	}
	for i := range keep {
		for j := range keep {
			s := 0.0
			for q := range z {
				s += y[i][q] * y[j][q]
			}
			a[i][j] -= s
		}
	}
	return true
}

// ownFactor sets lii to the lower Cholesky factor of a[6:keep, 6:keep],
// false when it is not positive definite.
func ownFactor(a *[maxFull][maxFull]float64, keep int, lii *[maxOwn][maxOwn]float64) bool {
	ni := keep - 6
	for j := range ni {
		s := a[6+j][6+j]
		for q := range j {
			s -= lii[j][q] * lii[j][q]
		}
		if !(s > 0) {
			return false
		}
		lii[j][j] = math.Sqrt(s)
		for i := j + 1; i < ni; i++ {
			t := a[6+i][6+j]
			for q := range j {
				t -= lii[i][q] * lii[j][q]
			}
			lii[i][j] = t / lii[j][j]
		}
	}
	return true
}

// ownSolve overwrites x[:ni] with (L Lᵀ)⁻¹ x, L = lii.
func ownSolve(lii *[maxOwn][maxOwn]float64, ni int, x *[maxOwn]float64) {
	for i := range ni {
		s := x[i]
		for k := range i {
			s -= lii[i][k] * x[k]
		}
		x[i] = s / lii[i][i]
	}
	for i := ni - 1; i >= 0; i-- {
		s := x[i]
		for k := i + 1; k < ni; k++ {
			s -= lii[k][i] * x[k]
		}
		x[i] = s / lii[i][i]
	}
}

// ownDOFs returns how many degrees of freedom member mem keeps of its
// own in its pencil: each inner node's transverse displacement and
// rotation, and a released or sprung end rotation.
func ownDOFs(mem *Member) int {
	ni := 2 * (SubElements - 1)
	if mem.Release.AtStart() || mem.SpringStart > 0 {
		ni++
	}
	if mem.Release.AtEnd() || mem.SpringEnd > 0 {
		ni++
	}
	return ni
}
