package frame

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// CriticalTol is the relative width of the bracket [CriticalFactor]
// narrows αcr to.
const CriticalTol = 1e-7

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
func CriticalFactor(mo *Model, axial []float64) (float64, error) {
	if len(axial) != len(mo.Members) {
		panic("frame: CriticalFactor: axial does not give one axial force per member")
	}
	compressed := false
	for _, n := range axial {
		if !finite(n) {
			return 0, fmt.Errorf("frame: CriticalFactor: axial force %v is not a finite number", n)
		}
		compressed = compressed || n < 0
	}
	if !compressed {
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
	if err := checkStorage(mo, n, band); err != nil {
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
	for range 200 {
		if hi-lo <= CriticalTol*lo {
			return (lo + hi) / 2, nil
		}
		cand := newtonStep(assemble, aLo, uLo, lo, n, kb, x)
		switch {
		case !(cand > lo) || math.IsInf(cand, 0):
			if math.IsInf(hi, 1) {
				cand = max(2*lo, 1)
			} else {
				cand = (lo + hi) / 2
			}
		case cand >= hi:
			cand = (lo + hi) / 2
		}
		if cand > maxCritical {
			if math.IsInf(hi, 1) {
				return math.Inf(1), nil
			}
			cand = (lo + hi) / 2
		}
		below := cand * (1 - CriticalTol/4)
		if a, u, ok := factor(below); ok {
			lo, aLo, uLo = below, a, u
		} else {
			hi = below
			continue
		}
		above := cand * (1 + CriticalTol/4)
		if above >= hi {
			continue
		}
		if a, u, ok := factor(above); ok {
			lo, aLo, uLo = above, a, u
		} else {
			hi = above
		}
	}
	return 0, fmt.Errorf("frame: CriticalFactor: %w found between %g and %g", ErrNoCritical, lo, hi)
}

// newtonStep returns λ + μ for the smallest μ > 0 with K(λ) + μ K′(λ)
// singular, found by inverse iteration with the factor u of a = K(λ);
// K′ by a difference of the assembled matrices. NaN when no positive μ is
// found. x is scratch of length n.
func newtonStep(assemble func(float64) []float64, a, u []float64, lambda float64, n, kb int, x []float64) float64 {
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
		d[i] = (a1[i] - a[i]) / step
	}
	y := make([]float64, n)
	for i := range x {
		// A fixed start with every direction in it.
		x[i] = 1 + 0.1*math.Sin(float64(i))
	}
	mu := math.NaN()
	for it := range 300 {
		bandMulVec(y, d, x, n, kb)
		for i := range y {
			y[i] = -y[i]
		}
		bandSolve(u, n, kb, y, 1)
		norm := 0.0
		for _, v := range y {
			norm += v * v
		}
		norm = math.Sqrt(norm)
		if !(norm > 0) || !finite(norm) {
			return math.NaN()
		}
		for i := range y {
			x[i] = y[i] / norm
		}
		// Rayleigh quotient of the pencil: μ = −xᵀ K x / xᵀ K′ x.
		bandMulVec(y, a, x, n, kb)
		num := dot(x, y)
		bandMulVec(y, d, x, n, kb)
		den := dot(x, y)
		next := -num / den
		if it > 2 && math.Abs(next-mu) <= 1e-12*math.Abs(next) {
			mu = next
			break
		}
		mu = next
	}
	if !(mu > 0) {
		return math.NaN()
	}
	return lambda + mu
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
