package frame

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"
)

// CriticalTol is the relative width of the bracket [CriticalFactor]
// narrows αcr to.
const CriticalTol = 1e-6

// maxCritical is the largest critical load factor sought: past it the
// axial forces are taken to make no difference (αcr reported as +Inf).
const maxCritical = 1e12

// ErrNoCritical is wrapped by the error of [CriticalFactor] when no
// factor up to a trillion makes the stiffness singular.
var ErrNoCritical = errors.New("no critical load factor")

// CriticalFactor returns αcr, the elastic critical load factor of the
// model under the axial forces axial (one per member, tension positive):
// the smallest λ > 0 for which K + λ·Kg is singular, K the elastic
// stiffness and Kg the geometric stiffness of the axial forces (with each
// member's flexible part subdivided, SubElements). It returns +Inf when
// no member is in compression, or when no λ up to 1e12 makes it singular.
//
// The stiffness is positive definite exactly for 0 ≤ λ < αcr, so the band
// Cholesky factorization (LAPACK dpbtrf) succeeds exactly below αcr and
// fails above it: each trial λ is judged by it. Trials come from a
// Newton step on the eigenproblem: at the largest λ known to be below
// αcr, inverse iteration on the factor there finds the smallest μ > 0
// with K(λ) + μ K′(λ) singular (K′ the derivative of the condensed
// stiffness in λ), and λ + μ is tried, just below and just above, until
// the bracket is narrower than CriticalTol of αcr; bisection where a
// step fails. No dense eigen solve is made. A model the first-order
// solve refuses is refused with the same error.
func criticalBisect(mo *Model, axial []float64) (float64, error) {
	if compressed, err := checkAxial(mo, axial); err != nil {
		return 0, err
	} else if !compressed {
		return math.Inf(1), nil
	}
	if err := checkEquations(mo); err != nil {
		return 0, err
	}
	if err := mo.Validate(); err != nil {
		return 0, err
	}
	released := releasedRotations(mo)
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order, released)
	if err := checkMemory(mo, n, band, Options{}); err != nil {
		return 0, err
	}
	if n == 0 {
		return math.Inf(1), nil
	}
	sol := &Solution{model: mo, dofs: n, band: band, cond: 1, dof: dof, released: released}
	sol.elems = make([]element, len(mo.Members))
	kb := min(band, n-1)
	w := kb + 1
	scaled := make([]float64, len(axial))
	// assemble returns K + λ Kg in band storage, or nil when a member
	// buckles between its held ends (the whole matrix is then not
	// positive definite).
	assemble := func(lambda float64) []float64 {
		for m := range mo.Members {
			scaled[m] = lambda * axial[m]
			e, ok := newElementAxial(mo, m, scaled[m], true)
			if !ok {
				return nil
			}
			sol.elems[m] = e
		}
		return sol.assemble(n, kb)
	}
	// factor returns the matrix at λ and its upper Cholesky factor, or
	// false where it is not positive definite.
	factor := func(lambda float64) (a, u []float64, ok bool) {
		a = assemble(lambda)
		if a == nil {
			return nil, nil, false
		}
		f, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: slices.Clone(a), Stride: w})
		return a, f.Data, ok
	}
	a0, u0, ok := factor(0)
	if !ok {
		// The first-order stiffness is not positive definite: let Solve
		// say why.
		if _, err := Solve(&Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members}); err != nil {
			return 0, err
		}
		return 0, errors.New("frame: CriticalFactor: the stiffness is not positive definite")
	}
	lo, hi := 0.0, math.Inf(1)
	aLo, uLo := a0, u0
	x := make([]float64, n)
	y := make([]float64, n)
	fails := 0 // trials failed since the last that succeeded
	sub := make([]float64, n*min(subspace, n))
	warm := false
	for range 200 {
		if hi-lo <= CriticalTol*lo {
			return (lo + hi) / 2, nil
		}
		// The first step only has to land near αcr: the Rayleigh functional
		// and the next step, started from its subspace, do the rest.
		tol := inverseTol
		if !warm {
			tol = firstTol
		}
		cand := newtonStep(assemble, aLo, uLo, lo, n, kb, x, sub, warm, tol)
		warm = true
		if cand > lo && !math.IsInf(cand, 0) {
			// The Rayleigh functional of the mode found: the λ at which
			// xᵀ K(λ) x = 0, as good as the mode squared.
			cand = rayleighRoot(assemble, aLo, x, y, lo, min(cand, hi), n, kb)
		}
		switch {
		case !(cand > lo) || math.IsInf(cand, 0) || math.IsNaN(cand):
			if math.IsInf(hi, 1) {
				cand = max(2*lo, 1)
			} else {
				cand = (lo + hi) / 2
			}
		case cand >= hi:
			// The last trial from this λ failed, most often by a hair: come
			// nearer, by more each time it fails again.
			cand = hi - (hi-lo)*retreat[min(max(fails-1, 0), len(retreat)-1)]
		}
		if cand > maxCritical {
			if math.IsInf(hi, 1) {
				return math.Inf(1), nil
			}
			cand = (lo + hi) / 2
		}
		below := cand * (1 - CriticalTol/4)
		if a, u, ok := factor(below); ok {
			lo, aLo, uLo, fails = below, a, u, 0
		} else {
			hi = below
			fails++
			continue
		}
		above := cand * (1 + CriticalTol/4)
		if above >= hi {
			continue
		}
		if a, u, ok := factor(above); ok {
			lo, aLo, uLo = above, a, u // and a new Newton step from there
		} else {
			hi = above
		}
	}
	return 0, fmt.Errorf("frame: CriticalFactor: %w found between %g and %g", ErrNoCritical, lo, hi)
}

// retreat gives, by the number of trials that have failed in a row, how
// far below the last failed one the next is put, as a share of the
// bracket.
var retreat = [...]float64{1e-4, 1e-2, 0.1, 0.5}

// rayleighRoot returns the λ in (lo, hi] at which xᵀ K(λ) x = 0 (a = K(lo)),
// by the Illinois variant of regula falsi; hi when xᵀ K(hi) x is still
// positive. K(λ) past a member's own buckling counts as negative.
func rayleighRoot(assemble func(float64) []float64, a, x, y []float64, lo, hi float64, n, kb int) float64 {
	f := func(lambda float64, m []float64) float64 {
		if m == nil {
			if m = assemble(lambda); m == nil {
				return math.Inf(-1)
			}
		}
		bandMulVec(y, m, x, n, kb)
		return dot(x, y)
	}
	fa, fb := f(lo, a), f(hi, nil)
	if !(fa > 0) {
		return math.NaN()
	}
	if fb > 0 {
		return hi
	}
	if math.IsInf(fb, -1) {
		fb = -fa // a member buckles: bisect the first step
	}
	side := 0
	for range 30 {
		c := (lo*fb - hi*fa) / (fb - fa)
		if !(c > lo && c < hi) {
			c = (lo + hi) / 2
		}
		fc := f(c, nil)
		if math.IsInf(fc, -1) {
			fc = -math.Abs(fa)
		}
		if fc > 0 {
			lo, fa = c, fc
			if side == -1 {
				fb /= 2
			}
			side = -1
		} else {
			hi, fb = c, fc
			if side == 1 {
				fa /= 2
			}
			side = 1
		}
		if hi-lo <= CriticalTol/16*hi {
			break
		}
	}
	return (lo + hi) / 2
}

// maxInverse bounds the steps of inverse iteration of one Newton step, and
// inverseTol is the relative change of the Rayleigh quotient that ends
// it: the quotient's error is of the order of the square of the
// eigenvector's, and a Newton step is judged by the factorization anyway.
const (
	maxInverse = 40
	inverseTol = 1e-6
	firstTol   = 1e-6
)

// subspace is the number of vectors of the subspace iteration of a
// Newton step: enough that the buckling modes of a frame's storeys, whose
// factors lie close together, are told apart by the Rayleigh–Ritz
// projection rather than by the slow convergence of one vector.
const subspace = 6

// newtonStep returns λ + μ for the smallest μ > 0 with K(λ) + μ K′(λ)
// singular, found by subspace iteration with the factor u of a = K(λ)
// and a Rayleigh–Ritz projection on the subspace (a dense eigenproblem of
// its size only); K′ by a difference of the assembled matrices. NaN when
// no positive μ is found. x receives the mode, of length n.
//
// sub, n × p row-major, is the subspace to start from when warm is set
// (the last step's, whose modes are near), else a fixed start; it
// receives the subspace reached. tol is the relative change of μ that ends
// the iteration.
func newtonStep(assemble func(float64) []float64, a, u []float64, lambda float64, n, kb int, x, sub []float64, warm bool, tol float64) float64 {
	step := 1e-4 * max(lambda, 1)
	a1 := assemble(lambda + step)
	if a1 == nil {
		step = -step
		if a1 = assemble(lambda + step); a1 == nil {
			return math.NaN()
		}
	}
	d := make([]float64, len(a))
	for i := range d {
		d[i] = -(a1[i] - a[i]) / step // −K′
	}
	p := min(subspace, n)
	// The subspace, row-major n × p as bandSolve takes it, and −K′ times it.
	y := make([]float64, n*p)
	dx := make([]float64, n*p)
	col, out := make([]float64, n), make([]float64, n)
	for j := range p {
		for i := range n {
			if warm {
				col[i] = sub[i*p+j]
			} else {
				// A fixed start with every direction in it.
				col[i] = math.Sin(float64((i+1)*(j+1))*0.7548776662) + b2f(j == 0)
			}
		}
		bandMulVec(out, d, col, n, kb)
		for i := range n {
			dx[i*p+j] = out[i]
		}
	}
	sy := make([]float64, n*p)
	mu := math.NaN()
	var ritz *mat.Dense
	bs := newBandSolver(u, n, kb) // the factor's terms listed once for every step
	for range maxInverse {
		copy(y, dx)
		copy(sy, dx)   // K Y = −K′ X: no product needed
		bs.solve(y, p) // Y = K⁻¹ (−K′) X
		bandMulBlock(dx, d, y, n, kb, p)
		as, bs := mat.NewSymDense(p, nil), mat.NewSymDense(p, nil)
		for j := range p {
			for k := j; k < p; k++ {
				var sa, sb float64
				for i := range n {
					sa += y[i*p+j] * sy[i*p+k]
					sb += y[i*p+j] * dx[i*p+k]
				}
				as.SetSym(j, k, sa)
				bs.SetSym(j, k, sb)
			}
		}
		// Bs z = θ As z with As = L Lᵀ: C = L⁻¹ Bs L⁻ᵀ, z = L⁻ᵀ w.
		var ch mat.Cholesky
		if !ch.Factorize(as) {
			return math.NaN()
		}
		var l, linv mat.TriDense
		ch.LTo(&l)
		if err := linv.InverseTri(&l); err != nil {
			return math.NaN()
		}
		var c mat.Dense
		c.Mul(&linv, bs)
		c.Mul(&c, linv.T())
		cs := mat.NewSymDense(p, nil)
		for j := range p {
			for k := j; k < p; k++ {
				cs.SetSym(j, k, (c.At(j, k)+c.At(k, j))/2)
			}
		}
		var eig mat.EigenSym
		if !eig.Factorize(cs, true) {
			return math.NaN()
		}
		theta := eig.Values(nil)
		var w mat.Dense
		eig.VectorsTo(&w)
		// Largest θ first: the smallest μ = 1/θ.
		z := mat.NewDense(p, p, nil)
		z.Mul(linv.T(), &w)
		ritz = mat.NewDense(p, p, nil)
		for j := range p {
			for k := range p {
				ritz.Set(j, k, z.At(j, p-1-k))
			}
		}
		next := math.NaN()
		if th := theta[p-1]; th > 0 {
			next = 1 / th
		}
		// The next subspace: the Ritz vectors, and −K′ times them from dx.
		xn := make([]float64, n*p)
		dn := make([]float64, n*p)
		for i := range n {
			for k := range p {
				var sx, sd float64
				for j := range p {
					r := ritz.At(j, k)
					sx += y[i*p+j] * r
					sd += dx[i*p+j] * r
				}
				xn[i*p+k], dn[i*p+k] = sx, sd
			}
		}
		copy(y, xn)
		copy(dx, dn)
		done := math.Abs(next-mu) <= tol*math.Abs(next)
		mu = next
		if done || math.IsNaN(mu) {
			break
		}
	}
	for i := range n {
		x[i] = y[i*p]
	}
	copy(sub, y)
	if !(mu > 0) {
		return math.NaN()
	}
	return lambda + mu
}

func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

// bandMulBlock sets y to A x for the p columns of x (n × p, row-major),
// A symmetric in upper band storage: one pass over the band for all.
func bandMulBlock(y, a, x []float64, n, kb, p int) {
	w := kb + 1
	clear(y)
	for i := range n {
		row := a[i*w : (i+1)*w]
		yi, xi := y[i*p:(i+1)*p], x[i*p:(i+1)*p]
		axpy(yi, row[0], xi)
		for d := 1; d < w && i+d < n; d++ {
			if row[d] == 0 {
				continue
			}
			axpy(yi, row[d], x[(i+d)*p:(i+d+1)*p])
			axpy(y[(i+d)*p:(i+d+1)*p], row[d], xi)
		}
	}
}

// bandMulVec sets y to A x, A symmetric in upper band storage (n
// equations, kb superdiagonals, row-major).
func bandMulVec(y, a, x []float64, n, kb int) {
	w := kb + 1
	clear(y)
	for i := range n {
		row := a[i*w : (i+1)*w]
		y[i] += row[0] * x[i]
		for d := 1; d < w && i+d < n; d++ {
			y[i] += row[d] * x[i+d]
			y[i+d] += row[d] * x[i]
		}
	}
}

func dot(x, y []float64) float64 {
	s := 0.0
	for i := range x {
		s += x[i] * y[i]
	}
	return s
}

// checkAxial panics unless axial gives one axial force per member of mo,
// returns an error for one that is not a finite number, and says whether
// any member is in compression (without which nothing buckles).
func checkAxial(mo *Model, axial []float64) (compressed bool, err error) {
	if len(axial) != len(mo.Members) {
		panic("frame: CriticalFactor: axial does not give one axial force per member")
	}
	for _, n := range axial {
		if !finite(n) {
			return false, fmt.Errorf("frame: CriticalFactor: axial force %v is not a finite number", n)
		}
		compressed = compressed || n < 0
	}
	return compressed, nil
}
