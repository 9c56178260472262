package frame

import (
	"cmp"
	"slices"
)

// assembleAt adds K + λ·Kg of the axial forces axial, each member's
// pencil condensed at λ·N (condensedAt) and turned to global axes, to
// the band matrix data, entry (i, i+j) at data[i·w+j] (w = kb + 1 the
// layout of Solution.assemble, definiteStride(kb) that of bandDefinite),
// with the node springs; false when some member's own block is not
// positive definite (the whole matrix then is not).
func (b *Buckling) assembleAt(data []float64, w int, lambda float64, axial []float64) bool {
	for m := range b.mems {
		if !b.addMember(data, w, m, lambda*axial[m]) {
			return false
		}
	}
	mo := b.model
	for v := range mo.Nodes {
		for d, k := range mo.Nodes[v].Springs {
			if e := b.sol.dof[3*v+d]; e >= 0 && k > 0 {
				data[e*w] += k
			}
		}
	}
	return true
}

// addMember adds member m's K + Kg of the axial force nm, its pencil
// condensed at nm (condensedAt) and turned to global axes, to the band
// matrix data, entry (i, i+j) at data[i·w+j]; false when its own block
// is not positive definite.
func (b *Buckling) addMember(data []float64, w, m int, nm float64) bool {
	p := &b.mems[m]
	k, ok := p.condensedAt(nm)
	if !ok {
		return false
	}
	g := toGlobal6(&k, p.c, p.s)
	var gdof [6]int32
	for i, e := range p.gdof {
		gdof[i] = int32(e)
	}
	scatter(data, w, 0, &gdof, &g)
	return true
}

// scatter adds a member's stiffness g in global axes, its node degrees
// of freedom's equations gdof (< 0 for none), to the band matrix data,
// entry (i, i+j) at data[(i−base)·w+j].
func scatter(data []float64, w, base int, gdof *[6]int32, g *[6][6]float64) {
	for i, ei := range gdof {
		if ei < 0 {
			continue
		}
		row := data[(int(ei)-base)*w:]
		for j, ej := range gdof {
			if ej >= ei {
				row[ej-ei] += g[i][j]
			}
		}
	}
}

// certifyOrder sets what the checks of definiteness (definite) share:
// the members in the order of their first equation (those with none
// first), and in that order each one's first equation (−1 for none),
// its node degrees of freedom's equations, and its place in it; and the
// springs' stiffness at each equation.
func (b *Buckling) certifyOrder() {
	first := make([]int32, len(b.mems))
	order := make([]int32, len(b.mems))
	for m := range b.mems {
		f := -1
		for _, e := range b.mems[m].gdof {
			if e >= 0 && (f < 0 || e < f) {
				f = e
			}
		}
		first[m], order[m] = int32(f), int32(m)
	}
	slices.SortStableFunc(order, func(x, y int32) int { return cmp.Compare(first[x], first[y]) })
	b.firstEq = make([]int32, len(b.mems))
	b.placeOf = make([]int32, len(b.mems))
	b.gdofs = make([][6]int32, len(b.mems))
	for at, m := range order {
		b.firstEq[at], b.placeOf[m] = first[m], int32(at)
		for i, e := range b.mems[m].gdof {
			b.gdofs[at][i] = int32(e)
		}
	}
	b.springs = make([]float64, b.n)
	mo := b.model
	for v := range mo.Nodes {
		for d, k := range mo.Nodes[v].Springs {
			if e := b.sol.dof[3*v+d]; e >= 0 && k > 0 {
				b.springs[e] += k
			}
		}
	}
}

// definiteBand reports whether K + λ·Kg of axial is positive definite,
// b.n > 0: the band is assembled and factored (bandDefinite's steps) as
// it goes, each step's rows cleared and given their springs and the
// members whose first equation they hold (certifyOrder) just before it,
// in a window of rows that the rows done leave: a few times the band's
// width, where the band of the whole matrix is megabytes. The members
// are condensed beforehand, in their order.
func (b *Buckling) definiteBand(lambda float64, axial []float64, sc *certifyScratch) bool {
	n, kb := b.n, b.kb
	ld := definiteStride(kb)
	// A step reaches definiteBlock + kb + 3 rows; the window holds four
	// times that, and when the next step's rows run past its end, the
	// rows not done are moved to its start.
	rows := min(n+3, 4*(definiteBlock+kb+3))
	if len(sc.data) != rows*ld {
		sc.data = make([]float64, rows*ld)
	}
	a := sc.data
	// Every member condensed first, one after another as their numbers
	// lie (its own block's definiteness the first answer), each kept at
	// its place in the order of first equations, read in turn below.
	if len(sc.g) != len(b.mems) {
		sc.g = make([][6][6]float64, len(b.mems))
	}
	for m := range b.mems {
		p := &b.mems[m]
		k, ok := p.condensedAt(lambda * axial[m])
		if !ok {
			return false
		}
		sc.g[b.placeOf[m]] = toGlobal6(&k, p.c, p.s)
	}
	base, ready := 0, 0 // a holds rows base to ready − 1, assembled so far
	next := 0
	for lo := 0; lo < n; lo += definiteBlock {
		hi := min(lo+definiteBlock, n)
		need := min(hi+kb+3, n+3)
		if need-base > rows {
			copy(a, a[(lo-base)*ld:(ready-base)*ld])
			base = lo
		}
		clear(a[(ready-base)*ld : (need-base)*ld])
		for e := ready; e < min(need, n); e++ {
			a[(e-base)*ld] = b.springs[e]
		}
		ready = need
		for ; next < len(b.firstEq) && int(b.firstEq[next]) < hi; next++ {
			scatter(a, ld, base, &b.gdofs[next], &sc.g[next])
		}
		if !definiteStep(a, kb, lo-base, hi-base, n-1-base) {
			return false
		}
	}
	return true
}

// toGlobal6 returns Tᵀ k T for the local stiffness k of a member of
// direction cosines c, s: T turns each node's (x, y) by the member's
// angle and keeps its rotation, so only those pairs are combined.
func toGlobal6(k *[6][6]float64, c, s float64) [6][6]float64 {
	// k T: columns 0, 1 and 3, 4 combined.
	var kt [6][6]float64
	for i := range 6 {
		r := &k[i]
		kt[i] = [6]float64{c*r[0] - s*r[1], s*r[0] + c*r[1], r[2], c*r[3] - s*r[4], s*r[3] + c*r[4], r[5]}
	}
	// Tᵀ (k T): rows alike.
	var g [6][6]float64
	for j := range 6 {
		for n := 0; n < 6; n += 3 {
			a, b := kt[n][j], kt[n+1][j]
			g[n][j] = c*a - s*b
			g[n+1][j] = s*a + c*b
			g[n+2][j] = kt[n+2][j]
		}
	}
	return g
}
