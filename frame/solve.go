package frame

import (
	"cmp"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	lapackgo "gonum.org/v1/gonum/lapack/gonum"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// Solution holds the displacements of every load case of a model, solved
// together. Member end forces, station values and reactions are computed
// from them on demand, so memory grows with nodes × cases, not members ×
// cases.
type Solution struct {
	model *Model
	elems []element

	// x holds the free displacements, row-major: x[e*nc+c] is equation e
	// in case c; dof[3*node+d] is the equation of direction d at a node, or
	// -1 where the support holds it, or -2-k where the support holds it
	// and some case imposes a displacement there: imposed[k*nc+c] is the
	// displacement in case c.
	x       []float64
	dof     []int
	imposed []float64
	zero    []float64 // a zero for every case: the displacements where a support holds a node

	// Loads by case and member: for case c, loaded[c] lists the members
	// carrying loads (ascending), span[c][i] the range of byMember[c] holding
	// member loaded[c][i]'s loads, and fem[c][6i:6i+6] its fixed-end forces
	// (local, releases condensed).
	loaded   [][]int32
	span     [][][2]int32
	byMember [][]int32
	fem      [][]float64
	// By member: the cases loading it, ascending (casesOn), and for each
	// its place in loaded (onMember: fem[c][6i:6i+6] are its fixed-end
	// forces).
	casesOn  [][]int32
	onMember [][]loadRef

	// Members meeting at each node, for reactions and residuals.
	atNode [][]int32

	// moments is set when some member carries a concentrated moment.
	moments bool

	// released[node] is true where every member end is released and no
	// support holds the rotation: it carries nothing and is not solved for.
	released []bool

	dofs, band int
	cond       float64
	warnings   []string

	// axial is Options.Axial of a second-order solve, nil otherwise.
	axial []float64

	// factor is the band Cholesky factor of the stiffness scaled by pow2
	// (upper, row-major, band+1 a row; nil when there was nothing to
	// solve), kept to solve more cases on it ([Solution.SolveCases]).
	factor, pow2 []float64
	// terms lists the factor's terms for the multi-column substitution,
	// made once, by the first solve of more than one column, for every
	// solution that shares the factor ([Solution.SolveCases]).
	terms *sharedTerms
}

// sharedTerms is the bandSolver of a factor, made on first use by
// whichever solution sharing the factor solves more than one column
// first (they may solve at once).
type sharedTerms struct {
	once sync.Once
	bs   *bandSolver
}

// solver returns the bandSolver of sol's factor (n equations, kb
// superdiagonals), making it the first time.
func (sol *Solution) solver(n, kb int) *bandSolver {
	t := sol.terms
	t.once.Do(func() { t.bs = newBandSolver(sol.factor, n, kb) })
	return t.bs
}

// Info describes the system of equations a model gives.
type Info struct {
	Equations int // free degrees of freedom
	Bandwidth int // half-bandwidth after reverse Cuthill–McKee numbering
	Columns   int // load columns solved at once: the model's load cases
}

// Solve validates mo, assembles its stiffness matrix in band storage,
// scales it by powers of two (exactly), factors it once with gonum's banded
// Cholesky (LAPACK dpbtrf), estimates the condition number of the matrix
// scaled to unit diagonal, and solves every load case in one multi-column
// solve.
//
// A model past the size limits gets an error wrapping [ErrTooLarge]; a
// structure that cannot carry load a [*MechanismError]; a stiffness matrix
// whose estimated condition number is above [RefuseCond], an
// [*IllConditionedError] (wrapping [ErrIllConditioned]); results that
// overflow, an error wrapping [ErrNotFinite]. A matrix ill-conditioned enough
// to cost the results most of their digits (above [WarnCond]) is solved, with
// a warning in [Solution.Warnings].
func Solve(mo *Model) (*Solution, error) { return SolveWith(mo, Options{}) }

// SolveWith is [Solve] with options: [Options.AcceptIllConditioned] solves
// a model whose condition number is between [RefuseCond] and [MaxCond].
func SolveWith(mo *Model, opt Options) (*Solution, error) {
	if err := checkEquations(mo); err != nil {
		return nil, err
	}
	if err := mo.Validate(); err != nil {
		return nil, err
	}
	parts := unsupportedParts(mo)
	released := releasedRotations(mo)
	dof, n, band := dofMap(mo, nodeOrder(mo), released)
	if err := checkMemory(mo, n, band, opt); err != nil {
		return nil, err
	}
	if opt.Axial != nil && len(opt.Axial) != len(mo.Members) {
		panic("frame: Options.Axial does not give one axial force per member")
	}
	sol := &Solution{model: mo, dofs: n, band: band, cond: 1, dof: dof, released: released, axial: opt.Axial}
	sol.elems = make([]element, len(mo.Members))
	sol.atNode = make([][]int32, len(mo.Nodes))
	var sos []secondOrder // the members' second-order parts, in one block
	if opt.Axial != nil {
		sos = make([]secondOrder, len(mo.Members))
	}
	for m, mem := range mo.Members {
		if opt.Axial != nil {
			e, ok := newElementAxialIn(mo, m, opt.Axial[m], true, &sos[m])
			if !ok {
				return nil, fmt.Errorf("%w: member %q buckles between its ends under N = %.6g", ErrUnstable, mem.Name, opt.Axial[m])
			}
			sol.elems[m] = e
		} else {
			sol.elems[m] = newElement(mo, m)
		}
		sol.atNode[mem.Start] = append(sol.atNode[mem.Start], int32(m))
		if mem.End != mem.Start {
			sol.atNode[mem.End] = append(sol.atNode[mem.End], int32(m))
		}
	}
	sol.indexLoads()
	sol.indexImposed()

	if n == 0 {
		if err := sol.checkDiagonal(nil, 0, dof, parts, released); err != nil {
			return nil, err
		}
		return sol, nil
	}
	kb := min(band, n-1)
	w := kb + 1
	data := sol.assemble(n, kb)
	if err := sol.checkDiagonal(data, kb, dof, parts, released); err != nil {
		return nil, err
	}
	if err := checkStiffness(data); err != nil {
		return nil, err
	}
	// Scaled by powers of two, D K D, the factorization and the solution
	// are those of K to the last bit; only the condition estimate below
	// sees the scaling.
	d := scalePow2(data, n, kb)

	// Factor a copy with gonum's LAPACK band Cholesky: the estimate reads
	// the matrix. Without it the matrix is factored in place (a failed
	// factorization is diagnosed on a matrix assembled anew below).
	estimate := !opt.SkipCondition
	a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: data, Stride: w}
	if estimate {
		a.Data = slices.Clone(data)
	}
	u, ok := lapack64.Pbtrf(a)
	if ok && estimate {
		sol.cond = equilibratedCond(data, u.Data, n, kb)
	} else if ok {
		sol.cond = math.NaN()
	}
	if !ok && opt.Axial != nil {
		return nil, fmt.Errorf("%w: the stiffness with the geometric stiffness is not positive definite", ErrUnstable)
	}
	if !ok || estimate && sol.cond > diagnoseCond {
		// data now holds a factor: assemble the matrix of the same members
		// made alike in stiffness, which has the same mechanisms, scale it
		// to unit diagonal and search it.
		clear(data)
		kin, h := sol.kinematic()
		sol.assembleTo(data, kb, kin)
		scale := equilibrate(data, n, kb)
		if err := sol.diagnose(data, n, kb, dof, scale, h); err != nil {
			return nil, err
		}
		if !ok {
			return nil, &IllConditionedError{Cond: math.Inf(1)}
		}
	}
	if estimate {
		if !(sol.cond <= MaxCond) {
			return nil, &IllConditionedError{Cond: sol.cond}
		}
		if sol.cond > RefuseCond && !opt.AcceptIllConditioned {
			return nil, &IllConditionedError{Cond: sol.cond, Acceptable: true}
		}
		if w := condWarning(sol.cond); w != "" {
			sol.warnings = append(sol.warnings, w)
		}
	}

	// K x = b is solved as (D K D)(D⁻¹ x) = D b.
	sol.factor, sol.pow2, sol.terms = u.Data, d, &sharedTerms{}
	if err := sol.solveLoads(n, kb); err != nil {
		return nil, err
	}
	return sol, nil
}

// solveLoads forms the right-hand sides of sol's cases and solves them on
// its factor (n equations, kb superdiagonals, scaled by sol.pow2).
func (sol *Solution) solveLoads(n, kb int) error {
	return sol.solveLoadsIn(n, kb, nil)
}

// solveLoadsIn is solveLoads with the displacements in buf when it holds
// as many (its values are overwritten), else in memory of their own.
//
// One column is formed in x and solved by the vector substitutions
// (bandSolveScaled). More are formed block by block where the
// substitution packs them (bandSolver.solveBlocks, rhsBlock), straight
// into the packed rows, scaled there: x is then only written, once, as
// each block's solution is unpacked, not cleared, formed and read again
// first (each entry's terms are added in the same order as rhs adds them,
// and scaled alike: the same numbers to the last bit).
func (sol *Solution) solveLoadsIn(n, kb int, buf []float64) error {
	nc := len(sol.model.Cases)
	var x []float64
	var finite bool
	if nc <= 1 {
		x = sol.rhsIn(n, buf)
		finite = bandSolveScaled(sol.factor, n, kb, x, nc, sol.pow2)
	} else {
		if cap(buf) >= n*nc {
			x = buf[:n*nc] // every value is written by the solve
		} else {
			x = make([]float64, n*nc)
		}
		d := sol.pow2
		finite = sol.solver(n, kb).solveBlocks(x, nc, d, func(dst []float64, lo, hi, bw int) {
			sol.rhsBlock(dst, lo, hi, bw, d)
		})
	}
	sol.x = x
	sol.zero = make([]float64, nc)
	if finite {
		return nil
	}
	return sol.checkFinite() // which case
}

// checkStiffness refuses a stiffness matrix that overflowed, which only
// numbers far outside any consistent set of units can cause.
func checkStiffness(data []float64) error {
	for _, v := range data {
		if !finite(v) {
			return fmt.Errorf("%w: the stiffness matrix overflowed; check that E, A and I are in the declared units", ErrNotFinite)
		}
	}
	return nil
}

// scalePow2 scales the band matrix data (n equations, kb superdiagonals,
// positive diagonal) in place to D K D, D = diag(d) with each d[i] the power
// of two that brings the diagonal to between 1/2 and 2, and returns d.
// Multiplying by a power of two is exact, and so is every step of a
// Cholesky factorization and of the substitutions on the scaled system: the
// solution is that of K to the last bit.
func scalePow2(data []float64, n, kb int) []float64 {
	w := kb + 1
	d := make([]float64, n)
	for i := range n {
		_, k := math.Frexp(data[i*w]) // K[i][i] in [2^(k-1), 2^k)
		d[i] = math.Ldexp(1, -(k >> 1))
	}
	scaleBand(data, d, n, kb)
	return d
}

// equilibrate scales the band matrix data (n equations, kb superdiagonals,
// positive diagonal) in place to unit diagonal, S K S with S = diag(scale),
// scale[i] = 1/√K[i][i], and returns scale.
func equilibrate(data []float64, n, kb int) []float64 {
	w := kb + 1
	scale := make([]float64, n)
	for i := range n {
		scale[i] = 1 / math.Sqrt(data[i*w])
	}
	scaleBand(data, scale, n, kb)
	return scale
}

// scaleBand replaces the band matrix data by S data S, S = diag(s).
func scaleBand(data, s []float64, n, kb int) {
	w := kb + 1
	for i := range n {
		row := data[i*w : (i+1)*w]
		for j := range row {
			if i+j < n {
				// |K[i][j]| ≤ √(K[i][i] K[j][j]): no overflow in this order.
				row[j] = row[j] * s[i] * s[i+j]
			}
		}
	}
}

// equilibratedCond returns the estimated condition number (1-norm) of the
// matrix scaled to unit diagonal, given a (n equations, kb superdiagonals)
// with a diagonal near 1 and its upper Cholesky factor u: with
// E = diag(1/√a[i][i]), E a E = (u E)ᵀ(u E), so u E is the factor whose
// condition is estimated (invNorm1), and ‖E a E‖₁ is summed from a.
// a is overwritten with u E.
func equilibratedCond(a, u []float64, n, kb int) float64 {
	w := kb + 1
	e := make([]float64, n)
	for i := range n {
		e[i] = 1 / math.Sqrt(a[i*w])
	}
	col := make([]float64, n)
	for i := range n {
		for j := 0; j < w && i+j < n; j++ {
			v := math.Abs(a[i*w+j]) * e[i] * e[i+j]
			col[i+j] += v
			if j > 0 {
				col[i] += v
			}
		}
	}
	anorm := 0.0
	for _, v := range col {
		anorm = max(anorm, v)
	}
	for i := range n {
		for j := 0; j < w && i+j < n; j++ {
			a[i*w+j] = u[i*w+j] * e[i+j]
		}
	}
	if inv, ok := invNorm1(a, n, kb); ok {
		return anorm * inv
	}
	f := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: a, Stride: w}
	if rc := lapack64.Pbcon(f, anorm, make([]float64, 3*n), make([]int, n)); rc > 0 {
		return 1 / rc
	}
	return math.Inf(1)
}

// invNorm1 estimates ‖A⁻¹‖₁ for A = UᵀU, u its upper band Cholesky factor
// (n equations, kb superdiagonals, row-major), by LAPACK's estimator
// (dlacn2, the reverse-communication driver), as dpbcon does, its solves
// made by the project's own band substitution, one column at a time
// (bandSolveVec: bandSolve's column to the last bit). dpbcon solves with dlatbs, which guards against overflow
// by scanning the whole solution at each of its n steps: n² work, minutes
// for a frame of 30 bays and 2000 storeys, whose factorization takes a
// second. The substitution takes n kb, and no memory of the size of the
// factor. ok is false when a solve overflowed, and only dpbcon can tell
// the size of the inverse.
func invNorm1(u []float64, n, kb int) (est float64, ok bool) {
	x, v, sign := make([]float64, n), make([]float64, n), make([]int, n)
	var kase int
	var save [3]int
	for {
		est, kase = lapackgo.Implementation{}.Dlacn2(n, v, x, sign, est, kase, &save)
		if kase == 0 {
			return est, finite(est)
		}
		// A is symmetric: A⁻¹ and A⁻ᵀ are the same, U⁻¹ U⁻ᵀ.
		bandSolveVec(u, n, kb, x)
		for _, xi := range x {
			if !finite(xi) {
				return 0, false
			}
		}
	}
}

// scaleRows multiplies row i of the n × nc row-major matrix x by scale[i].
func scaleRows(x, scale []float64, nc int) {
	for i, s := range scale {
		row := x[i*nc : (i+1)*nc]
		for k := range row {
			row[k] *= s
		}
	}
}

// assemble returns the stiffness matrix in upper band storage, row-major
// with kb superdiagonals: entry (i, j), j >= i, at [i*(kb+1)+j-i].
func (sol *Solution) assemble(n, kb int) []float64 {
	data := make([]float64, n*(kb+1))
	clear(data) // written before it is read: see rhs
	sol.assembleTo(data, kb, sol.elems)
	return data
}

// assembleTo adds the stiffness matrix of the members elems (one for each
// member of the model) to data, in the layout of assemble.
func (sol *Solution) assembleTo(data []float64, kb int, elems []element) {
	mo, dof, w := sol.model, sol.dof, kb+1
	for m, mem := range mo.Members {
		g := elems[m].global()
		ends := [2]int{mem.Start, mem.End}
		for i := range 6 {
			ei := dof[3*ends[i/3]+i%3]
			if ei < 0 {
				continue
			}
			for j := range 6 {
				if ej := dof[3*ends[j/3]+j%3]; ej >= ei {
					data[ei*w+ej-ei] += g[i][j]
				}
			}
		}
	}
	for v := range mo.Nodes {
		for d, k := range mo.Nodes[v].Springs {
			if e := dof[3*v+d]; e >= 0 && k > 0 {
				data[e*w] += k
			}
		}
	}
}

// indexImposed gives each held direction where some case imposes a
// displacement a place in sol.imposed (dof -2-k), with the displacement
// of every case there.
func (sol *Solution) indexImposed() {
	mo := sol.model
	nc := len(mo.Cases)
	for c := range mo.Cases {
		for _, nd := range mo.Cases[c].Displacements {
			for d, v := range [3]float64{nd.Ux, nd.Uy, nd.Rz} {
				i := 3*nd.Node + d
				if v == 0 || !mo.Nodes[nd.Node].Support.Restrained(d) {
					continue // Validate refuses a displacement where nothing holds the node
				}
				if sol.dof[i] == -1 {
					sol.dof[i] = -2 - len(sol.imposed)/nc
					sol.imposed = append(sol.imposed, make([]float64, nc)...)
				}
				sol.imposed[(-2-sol.dof[i])*nc+c] += v
			}
		}
	}
}

// rhs returns the right-hand sides, row-major n × cases: node loads less
// the fixed-end forces of the member loads.
func (sol *Solution) rhs(n int) []float64 { return sol.rhsIn(n, nil) }

// rhsIn is rhs in buf when it holds as many values (its own are
// overwritten), else in memory of its own.
func (sol *Solution) rhsIn(n int, buf []float64) []float64 {
	nc := len(sol.model.Cases)
	var x []float64
	if cap(buf) >= n*nc {
		x = buf[:n*nc]
	} else {
		x = make([]float64, n*nc)
	}
	// Zeros written first, on every processor, a run of rows each: fresh
	// memory first read is mapped to the system's zero page, and the
	// first write to it then faults again and flushes every processor's
	// address translations; first written, it faults once.
	workers := max(min(runtime.GOMAXPROCS(0), n*nc>>16), 1)
	var wg sync.WaitGroup
	for k := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			clear(x[k*n/workers*nc : (k+1)*n/workers*nc])
		}()
	}
	wg.Wait()
	// Each case's column alone, the cases split in runs between the
	// processors: the same sums in the same order on any number.
	workers = max(min(runtime.GOMAXPROCS(0), nc/64), 1)
	for k := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			sol.rhsOf(x, k*nc/workers, (k+1)*nc/workers)
		}()
	}
	wg.Wait()
	if len(sol.imposed) > 0 {
		sol.imposedRHS(x)
	}
	return x
}

// rhsOf adds to x (see rhs) the loads of cases lo up to hi.
func (sol *Solution) rhsOf(x []float64, lo, hi int) {
	nc := len(sol.model.Cases)
	for c := lo; c < hi; c++ {
		sol.rhsCol(x, nc, c, c)
	}
}

// rhsCol adds the loads of case c to column at of dst, rows of stride
// values: node loads, then less the fixed-end forces of the loaded
// members in their order.
func (sol *Solution) rhsCol(dst []float64, stride, at, c int) {
	mo, dof := sol.model, sol.dof
	for _, nl := range mo.Cases[c].NodeLoads {
		for d, v := range [3]float64{nl.Fx, nl.Fy, nl.M} {
			if e := dof[3*nl.Node+d]; e >= 0 {
				dst[e*stride+at] += v
			}
		}
	}
	for i, m32 := range sol.loaded[c] {
		m := int(m32)
		var fg [6]float64
		sol.elems[m].toGlobal(&fg, (*[6]float64)(sol.fem[c][6*i:]))
		ends := [2]int{mo.Members[m].Start, mo.Members[m].End}
		for k := range 6 {
			if e := dof[3*ends[k/3]+k%3]; e >= 0 {
				dst[e*stride+at] -= fg[k]
			}
		}
	}
}

// rhsBlock forms in dst the right-hand sides of cases lo up to hi, packed
// as the substitution takes them (rows of bw ≥ hi − lo values, the rest
// of each row zero) and each row i scaled by d[i]: rhs's numbers, packed.
func (sol *Solution) rhsBlock(dst []float64, lo, hi, bw int, d []float64) {
	n := sol.dofs
	dst = dst[:n*bw]
	clear(dst)
	for c := lo; c < hi; c++ {
		sol.rhsCol(dst, bw, c-lo, c)
	}
	if len(sol.imposed) > 0 {
		sol.imposedTo(dst, bw, lo, hi)
	}
	if d != nil {
		for i := range n {
			row := dst[i*bw : i*bw+hi-lo]
			s := d[i]
			for k := range row {
				row[k] *= s
			}
		}
	}
}

// imposedRHS subtracts from the right-hand sides x the forces that the
// imposed displacements of held directions cause at the free ones: the
// columns of the stiffness matrix of those directions times the
// displacements.
func (sol *Solution) imposedRHS(x []float64) {
	nc := len(sol.model.Cases)
	sol.imposedTo(x, nc, 0, nc)
}

// imposedTo is imposedRHS for cases lo up to hi, case c in column c − lo
// of dst, rows of stride values: each value's terms in the same order.
func (sol *Solution) imposedTo(dst []float64, stride, lo, hi int) {
	mo, dof := sol.model, sol.dof
	nc := len(mo.Cases)
	for m, mem := range mo.Members {
		ends := [2]int{mem.Start, mem.End}
		var codes [6]int
		has := false
		for k := range 6 {
			codes[k] = dof[3*ends[k/3]+k%3]
			has = has || codes[k] < -1
		}
		if !has {
			continue
		}
		g := sol.elems[m].global()
		for c := lo; c < hi; c++ {
			var ug [6]float64
			nonzero := false
			for k, e := range codes {
				if e < -1 {
					ug[k] = sol.imposed[(-2-e)*nc+c]
					nonzero = nonzero || ug[k] != 0
				}
			}
			if !nonzero {
				continue
			}
			for i, e := range codes {
				if e < 0 {
					continue
				}
				v := 0.0
				for j := range 6 {
					v += g[i][j] * ug[j]
				}
				dst[e*stride+c-lo] -= v
			}
		}
	}
}

// indexLoads groups each case's member loads by member and computes their
// fixed-end forces.
func (sol *Solution) indexLoads() {
	mo := sol.model
	nc := len(mo.Cases)
	sol.loaded, sol.span = make([][]int32, nc), make([][][2]int32, nc)
	sol.byMember, sol.fem = make([][]int32, nc), make([][]float64, nc)
	for c := range mo.Cases {
		loads := mo.Cases[c].MemberLoads
		idx := make([]int32, len(loads))
		for i := range idx {
			idx[i] = int32(i)
		}
		if !slices.IsSortedFunc(idx, func(i, j int32) int { return cmp.Compare(loads[i].Member, loads[j].Member) }) {
			slices.SortStableFunc(idx, func(i, j int32) int { return cmp.Compare(loads[i].Member, loads[j].Member) })
		}
		var members []int32
		var spans [][2]int32
		for i := 0; i < len(idx); {
			m := loads[idx[i]].Member
			j := i
			for j < len(idx) && loads[idx[j]].Member == m {
				j++
			}
			members = append(members, int32(m))
			spans = append(spans, [2]int32{int32(i), int32(j)})
			i = j
		}
		for i := range loads {
			sol.moments = sol.moments || loads[i].Moment
		}
		fem := make([]float64, 6*len(members))
		for i, m32 := range members {
			e := &sol.elems[m32]
			e.fixedEnd((*[6]float64)(fem[6*i:]), loads, idx[spans[i][0]:spans[i][1]])
		}
		sol.loaded[c], sol.span[c], sol.byMember[c], sol.fem[c] = members, spans, idx, fem
	}
	sol.casesOn, sol.onMember = written[[]int32](len(mo.Members)), written[[]loadRef](len(mo.Members)) // appended to
	for c := range mo.Cases {
		for i, m := range sol.loaded[c] {
			sol.casesOn[m] = append(sol.casesOn[m], int32(c))
			sol.onMember[m] = append(sol.onMember[m], loadRef{c: int32(c), i: int32(i)})
		}
	}
}

// loadRef is a case loading a member and the member's place in the case's
// list of loaded members.
type loadRef struct{ c, i int32 }

// loadsOn returns the indices of case c's loads on member m and their
// fixed-end forces (nil when there are none).
func (sol *Solution) loadsOn(c, m int) ([]int32, *[6]float64) {
	ms := sol.loaded[c]
	i, found := slices.BinarySearch(ms, int32(m))
	if !found {
		return nil, nil
	}
	sp := sol.span[c][i]
	return sol.byMember[c][sp[0]:sp[1]], (*[6]float64)(sol.fem[c][6*i:])
}
