package frame

// assembleAt adds K + λ·Kg of the axial forces axial, each member's
// pencil condensed at λ·N (condensedAt) and turned to global axes, to
// the band matrix data, entry (i, i+j) at data[i·w+j] (w = kb + 1 the
// layout of Solution.assemble, definiteStride(kb) that of bandDefinite),
// with the node springs; false when some member's own block is not
// positive definite (the whole matrix then is not).
func (b *Buckling) assembleAt(data []float64, w int, lambda float64, axial []float64) bool {
	for m := range b.mems {
		p := &b.mems[m]
		k, ok := p.condensedAt(lambda * axial[m])
		if !ok {
			return false
		}
		g := toGlobal6(&k, p.c, p.s)
		for i, ei := range p.gdof {
			if ei < 0 {
				continue
			}
			row := data[ei*w:]
			for j, ej := range p.gdof {
				if ej >= ei {
					row[ej-ei] += g[i][j]
				}
			}
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
