package frame

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/mat"
)

// Buckling holds what the critical load factors of one model under any
// number of sets of axial forces share: the elastic stiffness K, factored
// once. It is safe for concurrent use.
//
// The stiffness with the geometric stiffness of axial forces λ·N is linear
// in λ only before the sub-elements' inner nodes and the members' own end
// rotations (releases, rotational springs) are condensed out, so the
// eigenproblem is posed over all of them: K x = λ (−Kg) x, with those
// degrees of freedom kept (the inner nodes' axial ones, which Kg does not
// touch, are condensed). K is applied inverted by eliminating each
// member's own degrees of freedom (pencil.go) and one band Cholesky
// factor of what is left, the stiffness the first-order solve uses
// (bandchol.go). αcr is 1/μ for the largest μ of K⁻¹(−Kg), found by
// Lanczos iteration in the K inner product with full
// reorthogonalization; each step is one band forward and back
// substitution (bucklingband.go) and one product with Kg.
type Buckling struct {
	model *Model
	n     int // equations of the band
	kb    int
	u     []float64 // upper band Cholesky factor of the condensed K
	mems  []pencil
	size  int       // n plus every member's own degrees of freedom
	sol   *Solution // the numbering, for the check of a factor found
	lt    []float64 // u by columns (transposeBand)
	first []int32   // firstRows of u
	last  []int32   // lastCols of u

	// The checks of definiteness (certifyOrder).
	firstEq, placeOf []int32
	gdofs            [][6]int32
	springs          []float64
}

// NewBuckling factors the elastic stiffness of mo for [Buckling.Factor].
// A model the first-order solve refuses is refused with the same error.
func NewBuckling(mo *Model) (*Buckling, error) {
	if err := checkEquations(mo); err != nil {
		return nil, err
	}
	if err := mo.Validate(); err != nil {
		return nil, err
	}
	released := releasedRotations(mo)
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order, released)
	if err := checkMemory(mo, n, band, Options{}); err != nil {
		return nil, err
	}
	b := &Buckling{model: mo, n: n, mems: make([]pencil, len(mo.Members))}
	sol := &Solution{model: mo, dofs: n, band: band, cond: 1, dof: dof, released: released}
	sol.elems = make([]element, len(mo.Members))
	if !b.buildPencils(sol.elems) {
		return nil, b.refuse()
	}
	off := n
	for m, mem := range mo.Members {
		p := &b.mems[m]
		ends := [2]int{mem.Start, mem.End}
		for i := range 6 {
			p.gdof[i] = dof[3*ends[i/3]+i%3]
		}
		p.off = off
		off += p.ni
	}
	b.size = off
	b.sol = sol
	if n == 0 {
		return b, nil
	}
	b.kb = min(band, n-1)
	data := sol.assemble(n, b.kb)
	if !bandCholesky(data, n, b.kb) {
		return nil, b.refuse()
	}
	b.u = data
	b.first = firstRows(b.u, n, b.kb)
	b.last = lastCols(b.u, n, b.kb)
	b.lt = transposeBand(b.u, n, b.kb)
	b.certifyOrder()
	return b, nil
}

// buildPencils builds every member's pencil and sets elems[m] to member
// m's element with the local stiffness its pencil condenses, on every
// processor (each member alone: the same on any number); false when some
// member's own block of K is not positive definite.
func (b *Buckling) buildPencils(elems []element) bool {
	mo := b.model
	const chunk = 64
	chunks := (len(mo.Members) + chunk - 1) / chunk
	var next atomic.Int64
	var bad atomic.Bool
	var wg sync.WaitGroup
	for range max(min(runtime.GOMAXPROCS(0), chunks), 1) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				c := int(next.Add(1) - 1)
				if c >= chunks || bad.Load() {
					return
				}
				lo, hi := c*chunk, min((c+1)*chunk, len(mo.Members))
				// One store for the run: the members' numbers lie
				// together, in the order solveK reads them.
				sd, sk := 0, 0
				for m := lo; m < hi; m++ {
					ni := ownDOFs(&mo.Members[m])
					sd += ni*ni + 12*ni
					sk += (6 + ni) * (6 + ni)
				}
				st := pencilStore{d: make([]float64, 0, sd), k: make([]float64, 0, sk), gnz: make([]gEntry, 0, 48*(hi-lo))}
				for m := lo; m < hi; m++ {
					e := newElement(mo, m)
					k, ok := b.mems[m].build(&e, &st)
					if !ok {
						bad.Store(true)
						return
					}
					e.k = k
					elems[m] = e
				}
			}
		}()
	}
	wg.Wait()
	return !bad.Load()
}

// refuse returns why the first-order stiffness is not positive definite.
func (b *Buckling) refuse() error {
	mo := b.model
	if _, err := Solve(&Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members}); err != nil {
		return err
	}
	return errors.New("frame: CriticalFactor: the stiffness is not positive definite")
}

// local returns the member's node degrees of freedom of column c of the
// block x (k columns, row-major) in local axes.
func (p *pencil) local(x []float64, c, k int) [6]float64 {
	var g, l [6]float64
	for i, e := range p.gdof {
		if e >= 0 {
			g[i] = x[e*k+c]
		}
	}
	for n := 0; n < 6; n += 3 {
		l[n] = p.c*g[n] + p.s*g[n+1]
		l[n+1] = -p.s*g[n] + p.c*g[n+1]
		l[n+2] = g[n+2]
	}
	return l
}

// addGlobal adds the local node forces l, turned to global axes, to
// column c of the block y (k columns).
func (p *pencil) addGlobal(y []float64, l *[6]float64, c, k int) {
	for n := 0; n < 6; n += 3 {
		g := [3]float64{p.c*l[n] - p.s*l[n+1], p.s*l[n] + p.c*l[n+1], l[n+2]}
		for i := range 3 {
			if e := p.gdof[n+i]; e >= 0 {
				y[e*k+c] += g[i]
			}
		}
	}
}

// bandSolveVec overwrites x with U⁻¹ U⁻ᵀ x, u an upper band Cholesky
// factor (row-major, kb superdiagonals): bandSolve for one column, in the
// same order of operations.
func bandSolveVec(u []float64, n, kb int, x []float64) {
	w := kb + 1
	for i := range n {
		xi := x[i] * (1 / u[i*w])
		x[i] = xi
		row := u[i*w+1 : i*w+min(w, n-i)]
		y := x[i+1 : i+1+len(row)]
		for j, v := range row {
			if v != 0 {
				y[j] += -v * xi
			}
		}
	}
	for i := n - 1; i >= 0; i-- {
		row := u[i*w+1 : i*w+min(w, n-i)]
		y := x[i+1 : i+1+len(row)]
		s := x[i]
		for j, v := range row {
			if v != 0 {
				s += -v * y[j]
			}
		}
		x[i] = s * (1 / u[i*w])
	}
}

// mulKg sets column c of the block y to −Kg x for the axial forces
// axials[c], x and y of b.size rows and len(axials) columns: four columns
// at a time, then one (each column's numbers the same either way).
func (b *Buckling) mulKg(y, x []float64, axials [][]float64) {
	clear(y)
	k := len(axials)
	for m := range b.mems {
		p := &b.mems[m]
		c := 0
		for ; c+4 <= k; c += 4 {
			p.mulKg4(y, x, k, c, [4]float64{axials[c][m], axials[c+1][m], axials[c+2][m], axials[c+3][m]})
		}
		for ; c < k; c++ {
			if nm := axials[c][m]; nm != 0 {
				p.mulKg1(y, x, k, c, nm)
			}
		}
	}
}

// mulKg1 adds −nm·Kg x of the member to column c of the block y (k
// columns).
func (p *pencil) mulKg1(y, x []float64, k, c int, nm float64) {
	var z [maxKeep]float64
	d := 6 + p.ni
	l := p.local(x, c, k)
	copy(z[:6], l[:])
	for i := range p.ni {
		z[6+i] = x[(p.off+i)*k+c]
	}
	var f [maxKeep]float64
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

// mulKg4 is mulKg1 for columns c to c+3 at once, nm their axial forces
// (a column whose force is 0 gets nothing).
func (p *pencil) mulKg4(y, x []float64, k, c int, nm [4]float64) {
	if nm == [4]float64{} {
		return
	}
	var z [maxKeep][4]float64
	l := p.local4(x, k, c)
	copy(z[:6], l[:])
	for i := range p.ni {
		copy(z[6+i][:], x[(p.off+i)*k+c:(p.off+i)*k+c+4])
	}
	var f [maxKeep][4]float64
	for _, e := range p.gnz {
		fi, zj := &f[e.i], &z[e.j]
		fi[0] += e.v * zj[0]
		fi[1] += e.v * zj[1]
		fi[2] += e.v * zj[2]
		fi[3] += e.v * zj[3]
		if e.i != e.j {
			fj, zi := &f[e.j], &z[e.i]
			fj[0] += e.v * zi[0]
			fj[1] += e.v * zi[1]
			fj[2] += e.v * zi[2]
			fj[3] += e.v * zi[3]
		}
	}
	for cc, n := range nm {
		if n == 0 {
			continue
		}
		for i := 6; i < 6+p.ni; i++ {
			y[(p.off+i-6)*k+c+cc] += -n * f[i][cc]
		}
		fn := [6]float64{-n * f[0][cc], -n * f[1][cc], -n * f[2][cc], -n * f[3][cc], -n * f[4][cc], -n * f[5][cc]}
		p.addGlobal(y, &fn, c+cc, k)
	}
}

// Lanczos limits: the most steps, and the estimated error of the largest
// Ritz value θ, relative to it, at which it is taken as found: the
// residual bound (an eigenvalue lies within it), or, once that is below
// lanczosNear, its square over the gap to the next Ritz value (the error
// of θ itself; met early by a Ritz value that is not yet the largest
// eigenvalue's, hence the bound). Either way the result stands only by
// the check of [Buckling.Factors]: Ritz values lie below the largest
// eigenvalue μ, so 1/θ is never below αcr, and the check bounds αcr from
// below within certifyGap.
const (
	maxLanczos  = 300
	lanczosTol  = 1e-9
	lanczosNear = 1e-4
)

// Factor returns αcr for the axial forces axial (one per member, tension
// positive), as [CriticalFactor].
func (b *Buckling) Factor(axial []float64) (float64, error) {
	a, err := b.Factors([][]float64{axial})
	if err != nil {
		return 0, err
	}
	return a[0], nil
}

// Factors returns αcr for each set of axial forces of axials, as
// [Buckling.Factor] for each: the first set's iteration alone, then the
// others' side by side, each from its own Ritz vector on the first set's
// Lanczos vectors (bucklingstart.go; each step's substitutions one pass
// over the factor for all); each within certifyGap of the set's αcr, as
// one by one, and the same on every run.
//
// Each factor found is certified: it is 1/θ for the largest Ritz value θ,
// never below αcr, and K + λ·Kg must be positive definite at λ =
// (1 − certifyGap)/θ (one band Cholesky factorization, Sylvester's law of
// inertia), so that αcr lies within certifyGap below it. Where the check
// fails (a mode missed), αcr is found by the search that factors
// K + λ·Kg at trial λ instead.
func (b *Buckling) Factors(axials [][]float64) ([]float64, error) {
	mo := b.model
	out := make([]float64, len(axials))
	var run [][]float64
	var at []int
	for c, axial := range axials {
		if len(axial) != len(mo.Members) {
			panic("frame: Buckling.Factors: axial does not give one axial force per member")
		}
		compressed := false
		for _, v := range axial {
			if !finite(v) {
				return nil, fmt.Errorf("frame: CriticalFactor: axial force %v is not a finite number", v)
			}
			compressed = compressed || v < 0
		}
		if !compressed || b.size == 0 {
			out[c] = math.Inf(1)
			continue
		}
		run, at = append(run, axial), append(at, c)
	}
	// A fixed start with every direction in it: z, and r = K⁻¹ z, then
	// K-normalized.
	z := make([]float64, b.size)
	for i := range z {
		z[i] = math.Sin(float64(i+1)*0.7548776662) + 0.5
	}
	r := slices.Clone(z)
	b.solveK(r, 1)
	if nr := math.Sqrt(dot(r, z)); nr > 0 {
		for i := range r {
			r[i] /= nr
			z[i] /= nr
		}
	}
	// The first set alone; the others side by side, each from its own
	// Ritz vector on the first set's Lanczos vectors (bucklingstart.go),
	// with the fixed start's every direction mixed in: the modes of a
	// frame's combinations are much alike, and lie mostly in the space
	// the first set's iteration has spanned.
	mus, errs, first := b.lanczos(run[:min(1, len(run))], [][]float64{slices.Clone(r)}, [][]float64{slices.Clone(z)}, len(run) > 1, nil)
	if len(run) > 1 {
		rest := run[1:]
		var rs, zs [][]float64
		pool := &vectors{size: b.size}
		if first != nil {
			rs, zs = b.ritzStarts(rest, first, r, z)
			// The first set's vectors, read no more, are the later sets'
			// to write over (memory already touched: fresh memory is slow
			// to map in).
			pool.put(first.qs)
			pool.put(first.ps)
			first = nil
		} else {
			rs, zs = make([][]float64, len(rest)), make([][]float64, len(rest))
			for i := range rest {
				rs[i], zs[i] = slices.Clone(r), slices.Clone(z)
			}
		}
		// Each set's recurrence is its own (every column of a step in the
		// same order of operations as alone): the sets split between the
		// processors give the same numbers.
		parts := min(runtime.GOMAXPROCS(0), len(rest))
		ms, es := make([][]float64, parts), make([][]error, parts)
		var wg sync.WaitGroup
		for i := range parts {
			wg.Add(1)
			go func() {
				defer wg.Done()
				lo, hi := i*len(rest)/parts, (i+1)*len(rest)/parts
				ms[i], es[i], _ = b.lanczos(rest[lo:hi], rs[lo:hi], zs[lo:hi], false, pool)
			}()
		}
		wg.Wait()
		for i := range parts {
			mus, errs = append(mus, ms[i]...), append(errs, es[i]...)
		}
	}
	fail := make([]error, len(axials))
	next := make(chan int, len(run))
	for i := range run {
		next <- i
	}
	close(next)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), len(run)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var sc certifyScratch
			for i := range next {
				c := at[i]
				if errs[i] != nil {
					out[c], fail[c] = criticalBisect(mo, run[i])
					continue
				}
				out[c], fail[c] = b.certify(mus[i], run[i], &sc)
			}
		}()
	}
	wg.Wait()
	if err := errors.Join(fail...); err != nil {
		return nil, err
	}
	return out, nil
}

// certify returns 1/mu when the check bounds αcr of axial within
// certifyGap below it (+Inf for mu ≤ 1e-12 when the stiffness is positive
// definite up to λ = 1e12), else αcr by the search of factorizations.
func (b *Buckling) certify(mu float64, axial []float64, sc *certifyScratch) (float64, error) {
	switch {
	case !(mu > 1/maxCritical):
		if b.definite(maxCritical, axial, sc) {
			return math.Inf(1), nil
		}
	case b.definite((1-certifyGap)/mu, axial, sc):
		return 1 / mu, nil
	}
	return criticalBisect(b.model, axial)
}

// certifyGap is how far below the factor found the stiffness must still
// be positive definite: within the six figures reported.
const certifyGap = 1e-6

// certifyScratch is the memory of one check of definiteness (definite),
// kept for the next: fresh memory is slow to touch.
type certifyScratch struct {
	data []float64       // the window of rows of definiteBand
	g    [][6][6]float64 // each member's condensed stiffness in global axes, in the order of certifyOrder
}

// definite reports whether K + λ·Kg of axial is positive definite; sc,
// when not nil, lends it its memory.
func (b *Buckling) definite(lambda float64, axial []float64, sc *certifyScratch) bool {
	if sc == nil {
		sc = &certifyScratch{}
	}
	if b.n == 0 {
		for m := range b.mems {
			if _, ok := b.mems[m].condensedAt(lambda * axial[m]); !ok {
				return false
			}
		}
		return true
	}
	return b.definiteBand(lambda, axial, sc)
}

// lanczos returns, for each set of axial forces, the largest eigenvalue μ
// of K⁻¹(−Kg) (0 or less when none is positive), by Lanczos iteration in
// the K inner product with full reorthogonalization, every set's side by
// side, set c from r0[c] (w0[c] = K r0[c]; both its own, overwritten:
// they become its first Lanczos vector). With keep, first is the first
// set's iteration once its μ is found (nil when it is not). Its vectors
// are taken from pool, and a set's given back once it is done, when pool
// is not nil (without keep); else made.
func (b *Buckling) lanczos(axials [][]float64, r0, w0 [][]float64, keep bool, pool *vectors) (mus []float64, errs []error, first *krylov) {
	size, k := b.size, len(axials)
	type recurrence struct {
		qs, ps      [][]float64 // K-orthonormal q, and p = K q
		alpha, beta []float64
		r, w        []float64 // the next residual, and K r
		top         float64   // the largest |α|, the scale of the operator
		done        bool
	}
	mus, errs = make([]float64, k), make([]error, k)
	recs := make([]recurrence, k)
	for c := range recs {
		recs[c].r, recs[c].w = r0[c], w0[c]
	}
	var active []int
	var block, out []float64
	var ax [][]float64
	for j := 0; j < min(maxLanczos, size); j++ {
		active = active[:0]
		for c := range recs {
			rc := &recs[c]
			if rc.done {
				continue
			}
			// Reorthogonalize r against every q, and w = K r alike.
			reorthogonalize(rc.r, rc.w, rc.qs, rc.ps)
			bb := dot(rc.r, rc.w)
			if j == 0 && !(bb > 0) {
				errs[c] = errors.New("frame: CriticalFactor: the stiffness is not positive definite")
				rc.done = true
				continue
			}
			if j > 0 {
				if !(bb > 0) || math.Sqrt(bb) <= 1e-13*rc.top {
					// An invariant subspace: T's eigenvalues are exact.
					mus[c], _, _ = tridiagTop(rc.alpha, rc.beta, 0)
					rc.done = true
					if keep && c == 0 {
						first = &krylov{rc.qs, rc.ps, rc.alpha, rc.beta}
					}
					continue
				}
				rc.beta = append(rc.beta, math.Sqrt(bb))
			}
			nb := math.Sqrt(bb)
			for i := range rc.r {
				rc.r[i] /= nb
				rc.w[i] /= nb
			}
			rc.qs, rc.ps = append(rc.qs, rc.r), append(rc.ps, rc.w)
			active = append(active, c)
		}
		if len(active) == 0 {
			break
		}
		na := len(active)
		block = slices.Grow(block[:0], size*na)[:size*na]
		out = slices.Grow(out[:0], size*na)[:size*na]
		ax = ax[:0]
		for a, c := range active {
			q := recs[c].qs[j]
			for i, v := range q {
				block[i*na+a] = v
			}
			ax = append(ax, axials[c])
		}
		b.mulKg(out, block, ax) // −Kg q = K r
		copy(block, out)
		b.solveK(block, na)
		for a, c := range active {
			rc := &recs[c]
			rc.r, rc.w = pool.get(size), pool.get(size)
			for i := range size { // every entry written
				rc.r[i], rc.w[i] = block[i*na+a], out[i*na+a]
			}
			q, p := rc.qs[j], rc.ps[j]
			al := dot(q, rc.w)
			rc.alpha = append(rc.alpha, al)
			rc.top = max(rc.top, math.Abs(al))
			axpy(rc.r, -al, q)
			axpy(rc.w, -al, p)
			if j > 0 {
				axpy(rc.r, -rc.beta[j-1], rc.qs[j-1])
				axpy(rc.w, -rc.beta[j-1], rc.ps[j-1])
			}
			theta, res, gap := tridiagTop(rc.alpha, rc.beta, math.Sqrt(max(dot(rc.r, rc.w), 0)))
			if res <= lanczosTol*math.Abs(theta) || res <= lanczosNear*math.Abs(theta) && res*res <= lanczosTol*gap*math.Abs(theta) {
				mus[c] = theta
				rc.done = true
			} else if j+1 >= min(maxLanczos, size) {
				if j+1 < maxLanczos {
					mus[c] = theta // the whole space: exact
				} else {
					errs[c] = fmt.Errorf("frame: CriticalFactor: %w: the largest eigenvalue did not converge in %d steps", ErrNoCritical, maxLanczos)
				}
				rc.done = true
			}
			if rc.done {
				if keep && c == 0 && errs[c] == nil {
					first = &krylov{rc.qs, rc.ps, rc.alpha, rc.beta}
				} else if !keep {
					pool.put(rc.qs)
					pool.put(rc.ps)
				}
				rc.qs, rc.ps = nil, nil
			}
		}
	}
	return mus, errs, first
}

// vectors lends the Lanczos iterations of one call of [Buckling.Factors]
// vectors of size numbers, those of the iterations done before them when
// there are any; safe for concurrent use. A nil *vectors makes each.
type vectors struct {
	mu   sync.Mutex
	size int
	free [][]float64
}

// poisonVectors, set by the tests, fills each vector lent again with NaN:
// a value read before it is written would show in every result.
var poisonVectors = false

// get returns a vector of size numbers, of any values (p.size when p is
// not nil).
func (p *vectors) get(size int) []float64 {
	if p != nil {
		p.mu.Lock()
		defer p.mu.Unlock()
		if n := len(p.free); n > 0 {
			v := p.free[n-1]
			p.free = p.free[:n-1]
			if poisonVectors {
				for i := range v {
					v[i] = math.NaN()
				}
			}
			return v
		}
	}
	return make([]float64, size)
}

// put gives the vectors vs back to p, to be written over; nothing when p
// is nil.
func (p *vectors) put(vs [][]float64) {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	for _, v := range vs {
		if len(v) == p.size {
			p.free = append(p.free, v)
		}
	}
}

// ritzVector returns Q s and P s for s the eigenvector of the largest
// eigenvalue of the tridiagonal matrix of alpha and beta.
func ritzVector(qs, ps [][]float64, alpha, beta []float64) (y, ky []float64) {
	m := len(alpha)
	t := mat.NewSymDense(m, nil)
	for i := range m {
		t.SetSym(i, i, alpha[i])
		if i+1 < m {
			t.SetSym(i, i+1, beta[i])
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(t, true) {
		return nil, nil
	}
	var v mat.Dense
	eig.VectorsTo(&v)
	y, ky = written[float64](len(qs[0])), written[float64](len(qs[0])) // added to before stored to
	for j := range m {
		axpy(y, v.At(j, m-1), qs[j])
		axpy(ky, v.At(j, m-1), ps[j])
	}
	return y, ky
}

// tridiagTop returns the largest eigenvalue of the symmetric tridiagonal
// matrix of diagonal alpha and off-diagonal beta, its residual bound
// next·|last component of its eigenvector|, and its distance to the next
// eigenvalue (+Inf for a 1 × 1 matrix).
func tridiagTop(alpha, beta []float64, next float64) (theta, res, gap float64) {
	m := len(alpha)
	t := mat.NewSymDense(m, nil)
	for i := range m {
		t.SetSym(i, i, alpha[i])
		if i+1 < m {
			t.SetSym(i, i+1, beta[i])
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(t, true) {
		return math.NaN(), math.Inf(1), 0
	}
	vals := eig.Values(nil)
	var v mat.Dense
	eig.VectorsTo(&v)
	gap = math.Inf(1)
	if m > 1 {
		gap = vals[m-1] - vals[m-2]
	}
	return vals[m-1], next * math.Abs(v.At(m-1, m-1)), gap
}

// CriticalFactor returns αcr, the elastic critical load factor of the
// model under the axial forces axial (one per member, tension positive):
// the smallest λ > 0 for which K + λ·Kg is singular, K the elastic
// stiffness and Kg the geometric stiffness of the axial forces (with each
// member's flexible part subdivided, SubElements). It returns +Inf when
// no member is in compression, or when no λ up to 1e12 makes it singular.
// For several sets of axial forces on one model, [NewBuckling] factors K
// once for all. A model the first-order solve refuses is refused with
// the same error.
func CriticalFactor(mo *Model, axial []float64) (float64, error) {
	if compressed, err := checkAxial(mo, axial); err != nil {
		return 0, err
	} else if !compressed {
		return math.Inf(1), nil
	}
	b, err := NewBuckling(mo)
	if err != nil {
		return 0, err
	}
	return b.Factor(axial)
}
