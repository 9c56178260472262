package distribution

import "math"

// swaySystem is the factored matrix of the storey shear equations: entry
// (i, j) is the force the prop of sway line i exerts to hold the frame in
// a unit sway of line j. Each line's equation says that its prop force
// vanishes: the shear of the storey below it balances the shear of the
// storey above and the loads along X on the line.
type swaySystem struct {
	n    int
	lu   []float64 // row-major, L below the diagonal (unit), U on and above
	perm []int     // row i of lu is row perm[i] of the matrix
}

// singularTol is the smallest pivot accepted, as a fraction of the largest
// diagonal entry: below it a line (or a group of lines) has nothing that
// resists its movement along X.
const singularTol = 1e-10

// factor factors the n×n matrix k (row-major, not kept) by Gaussian
// elimination with partial pivoting. When the matrix is singular it
// returns nil and the line whose equation failed.
func factor(k []float64, n int) (*swaySystem, int) {
	sw := &swaySystem{n: n, lu: append([]float64(nil), k...), perm: make([]int, n)}
	a := sw.lu
	scale := 0.0
	for i := range n {
		sw.perm[i] = i
		scale = math.Max(scale, math.Abs(a[i*n+i]))
	}
	for col := range n {
		p := col
		for i := col + 1; i < n; i++ {
			if math.Abs(a[i*n+col]) > math.Abs(a[p*n+col]) {
				p = i
			}
		}
		if !(math.Abs(a[p*n+col]) > singularTol*scale) {
			return nil, col
		}
		if p != col {
			for j := range n {
				a[p*n+j], a[col*n+j] = a[col*n+j], a[p*n+j]
			}
			sw.perm[p], sw.perm[col] = sw.perm[col], sw.perm[p]
		}
		piv := a[col*n+col]
		for i := col + 1; i < n; i++ {
			f := a[i*n+col] / piv
			a[i*n+col] = f
			for j := col + 1; j < n; j++ {
				a[i*n+j] -= f * a[col*n+j]
			}
		}
	}
	return sw, -1
}

// solve overwrites b with the solution x of k x = b.
func (sw *swaySystem) solve(b []float64) {
	n, a := sw.n, sw.lu
	x := make([]float64, n)
	for i := range n {
		x[i] = b[sw.perm[i]]
	}
	for i := range n {
		for j := range i {
			x[i] -= a[i*n+j] * x[j]
		}
	}
	for i := n - 1; i >= 0; i-- {
		for j := i + 1; j < n; j++ {
			x[i] -= a[i*n+j] * x[j]
		}
		x[i] /= a[i*n+i]
	}
	copy(b, x)
}
