package analysis

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// unit is one analysis of a combination of the job: the combination as
// solved (its terms on the solved model's cases, its notional case
// among them), how it is analysed, and its notional loads. A
// combination without lateral load whose notional loads act in either
// direction has two units, one per direction.
type unit struct {
	k         int                // the job's combination
	cb        combos.Combination // as solved
	bare      combos.Combination // as solved without its notional case
	method    Method
	scale     float64   // 1.6 for a second-order allowable combination, else 1
	notional  *Notional // nil for none
	axial     []float64 // the axial forces of its geometric stiffness (second order)
	critical  float64   // αcr of the combination as written, with its stiffness
	nominal   float64   // αcr with the sections as given
	iteration int
	// final is the iteration's last solve (second order), on whose factor
	// the envelopes solve their cases; nil once they have.
	final *frame.Solution
}

// plan lists the units of a job, with the solved model grown by the
// notional cases.
type plan struct {
	units []unit
	// simple is set when every combination is one first-order analysis
	// with the sections as given and no notional load: Run then envelopes
	// them all at once as it always has.
	simple bool
}

// methodOf returns the method of combination k.
func (j *Job) methodOf(k int) Method {
	if j.Methods == nil {
		return Method{}
	}
	return j.Methods[k]
}

// checkStability returns an error for stability settings Run cannot apply.
func (j *Job) checkStability() error {
	st := &j.Sway
	for _, f := range []struct {
		name string
		v    float64
	}{{"StrengthEI", st.StrengthEI}, {"StrengthEA", st.StrengthEA}, {"NotionalRatio", st.NotionalRatio}, {"Tolerance", st.Tolerance}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return fmt.Errorf("analysis: Sway.%s = %v: must be a finite number >= 0", f.name, f.v)
		}
	}
	if st.StrengthEI > 1 || st.StrengthEA > 1 {
		return fmt.Errorf("analysis: stiffness factors %v on EI and %v on EA: a reduction is at most 1", st.StrengthEI, st.StrengthEA)
	}
	ns := len(j.Model.Sections)
	if st.SectionI != nil && len(st.SectionI) != ns {
		return fmt.Errorf("analysis: Sway.SectionI gives %d factors for %d sections", len(st.SectionI), ns)
	}
	for i, f := range st.SectionI {
		if !(f >= 0 && f <= 1) {
			return fmt.Errorf("analysis: section %q: factor on I %v must be from 0 to 1", j.Model.Sections[i].Name, f)
		}
	}
	if st.Fy != nil && len(st.Fy) != ns {
		return fmt.Errorf("analysis: Sway.Fy gives %d values for %d sections", len(st.Fy), ns)
	}
	if st.TauB == TauBFy {
		for i, fy := range st.Fy {
			if !(fy >= 0) || math.IsInf(fy, 0) {
				return fmt.Errorf("analysis: section %q: Fy %v must be a finite number >= 0", j.Model.Sections[i].Name, fy)
			}
		}
	}
	if st.Notional > NotionalRatio || st.TauB > TauBNotional {
		return errors.New("analysis: unknown notional load rule or τb choice")
	}
	for k, m := range j.Methods {
		if m.Stiffness > Service {
			return fmt.Errorf("analysis: combination %q: unknown stiffness %v", j.Combinations[k].Name, m.Stiffness)
		}
	}
	return nil
}

// makePlan returns the units of the job and grows sv's model by one
// notional case per unit that has notional loads.
func makePlan(job *Job, sv *solved) (*plan, error) {
	pl := &plan{simple: job.Sway.Notional == NoNotional && job.Sway.TauB != TauBNotional}
	for k := range job.Combinations {
		// Allowable alone changes nothing without notional loads.
		if m := job.methodOf(k); m.SecondOrder || m.Stiffness != Nominal {
			pl.simple = false
		}
	}
	base := sv.model
	var added []frame.Case
	for k, cb := range sv.combinations {
		m := job.methodOf(k)
		u := unit{k: k, cb: cb, bare: cb, method: m, scale: 1}
		if m.SecondOrder && m.Allowable {
			u.scale = AllowableScale
		}
		if pl.simple {
			pl.units = append(pl.units, u)
			continue
		}
		alpha := 1.0
		if m.Allowable && !m.SecondOrder {
			alpha = AllowableScale
		}
		var axial []float64
		if job.Sway.Notional == NotionalEN1993 {
			sol, err := frame.Solve(combined(base, base.Sections, base.Members, cb, 1, nil))
			if err != nil {
				return nil, fmt.Errorf("combination %q: %w", job.Combinations[k].Name, err)
			}
			axial = axialForces(sol, 0)
		}
		ratio, err := notionalRatio(job, base, alpha, axial)
		if err != nil {
			return nil, err
		}
		// Notional loads stand for the imperfections that strength design
		// must allow for; service combinations take none.
		if ratio == 0 || cb.Service {
			pl.units = append(pl.units, u)
			continue
		}
		for _, n := range notionalLoads(job, base, cb, ratio) {
			v := u
			n := n
			v.notional = &n
			c := len(base.Cases) + len(added)
			dir := "+X"
			if n.Direction < 0 {
				dir = "−X"
			}
			added = append(added, frame.Case{Name: fmt.Sprintf("notional %s (%s)", dir, job.Combinations[k].Name), NodeLoads: n.nodes})
			v.cb.Terms = append(slices.Clip(cb.Terms), combos.Term{Case: c, Factor: 1})
			pl.units = append(pl.units, v)
		}
	}
	if len(added) > 0 {
		mo := *base
		mo.Cases = append(slices.Clip(base.Cases), added...)
		sv.model = &mo
		for range added {
			sv.kinds = append(sv.kinds, combos.Dead) // always acts in its combination
		}
	}
	return pl, nil
}

// combinedOf returns the combination of each unit of us as one case, every
// case of base at u.scale times its factor and every piece loaded (as
// combined gives it).
func combinedOf(base *frame.Model, us []*unit) []frame.Case {
	out := make([]frame.Case, len(us))
	for i, u := range us {
		out[i] = combined(base, base.Sections, base.Members, u.cb, u.scale, nil).Cases[0]
	}
	return out
}

// combined returns a model with the nodes of base, the sections and
// members given, and one load case: the cases of cb at scale times their
// factors, each whole (every pattern piece loaded).
func combined(base *frame.Model, sections []frame.Section, members []frame.Member, cb combos.Combination, scale float64, extra *frame.Case) *frame.Model {
	var c frame.Case
	c.Name = cb.Name
	// Each list made at its length at once: a patterned frame's
	// combination holds thousands of member loads, which appending would
	// copy over and over as the list grows.
	var nm, nn, nd int
	count := func(src *frame.Case) {
		nm, nn, nd = nm+len(src.MemberLoads), nn+len(src.NodeLoads), nd+len(src.Displacements)
	}
	for _, t := range cb.Terms {
		count(&base.Cases[t.Case])
	}
	if extra != nil {
		count(extra)
	}
	if nm > 0 {
		c.MemberLoads = make([]frame.MemberLoad, 0, nm)
	}
	if nn > 0 {
		c.NodeLoads = make([]frame.NodeLoad, 0, nn)
	}
	if nd > 0 {
		c.Displacements = make([]frame.NodeDisplacement, 0, nd)
	}
	add := func(src *frame.Case, f float64) {
		for _, ld := range src.MemberLoads {
			ld.W, ld.WEnd, ld.P, ld.M, ld.DT, ld.DTGrad = f*ld.W, f*ld.WEnd, f*ld.P, f*ld.M, f*ld.DT, f*ld.DTGrad
			c.MemberLoads = append(c.MemberLoads, ld)
		}
		for _, nl := range src.NodeLoads {
			nl.Fx, nl.Fy, nl.M = f*nl.Fx, f*nl.Fy, f*nl.M
			c.NodeLoads = append(c.NodeLoads, nl)
		}
		for _, nd := range src.Displacements {
			nd.Ux, nd.Uy, nd.Rz = f*nd.Ux, f*nd.Uy, f*nd.Rz
			c.Displacements = append(c.Displacements, nd)
		}
	}
	for _, t := range cb.Terms {
		add(&base.Cases[t.Case], scale*t.Factor)
	}
	if extra != nil {
		add(extra, scale)
	}
	return &frame.Model{Nodes: base.Nodes, Sections: sections, Members: members, Cases: []frame.Case{c}}
}

// axialForces returns the axial force (tension positive) of every member
// in case c: the mean of its ends' where member loads along it make it
// vary.
func axialForces(sol *frame.Solution, c int) []float64 {
	mo := sol.Model()
	out := make([]float64, len(mo.Members))
	for m := range out {
		out[m] = meanAxial(sol.EndForces(c, m))
	}
	return out
}

// meanAxial is the axial force (tension positive) of a member of end
// forces f in its local axes: the mean of its ends'.
func meanAxial(f [6]float64) float64 { return (-f[0] + f[3]) / 2 }

// axialForcesFirst returns axialForces(sol, c) for the first n cases c,
// read member by member: a member's displacements in neighbouring cases
// share cache lines, which case by case are read again from memory for
// every case.
func axialForcesFirst(sol *frame.Solution, n int) [][]float64 {
	mo := sol.Model()
	out := make([][]float64, n)
	for c := range out {
		out[c] = make([]float64, len(mo.Members))
	}
	for m := range mo.Members {
		for c := range out {
			out[c][m] = meanAxial(sol.EndForces(c, m))
		}
	}
	return out
}

// stiffnessOf returns the sections and members of mo with stiffness s: the
// sections as given (Nominal), or copies scaled by the job's factors, one
// per section.
func (j *Job) stiffnessOf(mo *frame.Model, s Stiffness) ([]frame.Section, []frame.Member) {
	st := &j.Sway
	if s == Nominal {
		return mo.Sections, mo.Members
	}
	secs := slices.Clone(mo.Sections)
	for i := range secs {
		fi, fa := 1.0, 1.0
		var own float64
		if st.SectionI != nil {
			own = st.SectionI[i]
		}
		switch s {
		case Strength:
			if st.StrengthEI > 0 {
				fi = st.StrengthEI
			}
			if st.StrengthEA > 0 {
				fa = st.StrengthEA
			}
			if own > 0 {
				fi *= own
			}
		case Service:
			if own > 0 {
				fi = min(1.4*own, 1)
			}
		}
		secs[i].I *= fi
		secs[i].A *= fa
	}
	return secs, mo.Members
}

// tauB returns sections and members with τb of AISC 360-16 C2.3(b)
// applied to the bending stiffness of each member whose section gives Fy,
// from its axial force: each member gets its own section. alpha is 1 for
// strength, 1.6 for allowable.
func (j *Job) tauB(secs []frame.Section, members []frame.Member, axial []float64, alpha float64) ([]frame.Section, []frame.Member) {
	if j.Sway.TauB != TauBFy || j.Sway.Fy == nil {
		return secs, members
	}
	out := slices.Clone(secs)
	mem := slices.Clone(members)
	for m := range mem {
		s := members[m].Section
		fy := j.Sway.Fy[s]
		if fy <= 0 {
			continue
		}
		pns := fy * j.Model.Sections[s].A
		ratio := alpha * max(-axial[m], 0) / pns
		if ratio <= 0.5 {
			continue
		}
		tau := max(4*ratio*(1-ratio), 0)
		sec := secs[s]
		sec.Name = fmt.Sprintf("%s (τb %s)", sec.Name, members[m].Name)
		sec.I *= tau
		if !(sec.I > 0) {
			sec.I = math.SmallestNonzeroFloat64 * 1e10
		}
		mem[m].Section = len(out)
		out = append(out, sec)
	}
	return out, mem
}

// firstAxial returns unit u's combination as a model with stiffness stiff
// (combined: every case at its factor times u.scale and every piece
// loaded, as one case) and the axial forces of its first-order solve,
// made on the factor of the first-order solution of the stiffness
// (firstOrder; the same numbers to the last bit,
// frame.Solution.SolveCases).
func (r *Result) firstAxial(u *unit, base *frame.Model, stiff Stiffness) (*frame.Model, []float64, error) {
	secs, mems := r.Job.stiffnessOf(base, stiff)
	mo := combined(base, secs, mems, u.cb, u.scale, nil)
	var sol *frame.Solution
	var err error
	if shareFactors {
		var first *frame.Solution
		if first, err = r.firstOrder(base, stiff); err == nil {
			sol, err = first.SolveCases(mo.Cases)
		}
	} else {
		sol, err = frame.SolveWith(mo, r.solver)
	}
	if err != nil {
		return nil, nil, fmt.Errorf("combination %q: %w", r.Job.Combinations[u.k].Name, err)
	}
	return mo, axialForces(sol, 0), nil
}

// iterateFrom solves unit u's combination, given as a model mo with its
// stiffness with the axial forces n of its first-order solve
// (firstAxial), in second order: the axial forces of one solve give the
// geometric stiffness of the next until they change by less than the
// tolerance. It sets u.axial, u.iteration and u.final (u's critical load
// factors are found apart: iterateAll). The steps between leave out the
// condition estimate (frame.Options.SkipCondition): their results are not
// reported, and the last solve, with the axial forces and τb reductions
// the envelopes use, is estimated, refused and warned of as every solve
// is.
func (r *Result) iterateFrom(u *unit, mo *frame.Model, n []float64) error {
	job := r.Job
	name := job.Combinations[u.k].Name
	tol := job.Sway.Tolerance
	if tol == 0 {
		tol = DefaultTolerance
	}
	secs, mems := mo.Sections, mo.Members
	var sol *frame.Solution
	var err error
	alpha := 1.0
	if u.method.Allowable {
		alpha = AllowableScale
	}
	for it := 1; ; it++ {
		s2, m2 := job.tauB(secs, mems, n, alpha/u.scale)
		mo.Sections, mo.Members = s2, m2
		so := r.solver
		so.Axial = n
		so.SkipCondition = true
		sol, err = frame.SolveWith(mo, so)
		if err != nil {
			return fmt.Errorf("combination %q: second-order analysis: %w", name, err)
		}
		next := axialForces(sol, 0)
		big, change := 0.0, 0.0
		for m := range n {
			big = max(big, math.Abs(next[m]))
			change = max(change, math.Abs(next[m]-n[m]))
		}
		n = next
		if change <= tol*big {
			u.iteration = it
			break
		}
		if it >= MaxIterations {
			return fmt.Errorf("combination %q: the second-order analysis did not converge in %d iterations (axial forces still change by %.3g of the largest): the frame is close to buckling under it", name, MaxIterations, change/big)
		}
	}
	// The combination's own statics, on the deformed geometry, with the
	// stiffness the envelopes use (the τb reductions of n).
	mo.Sections, mo.Members = job.tauB(secs, mems, n, alpha/u.scale)
	so := r.solver
	so.Axial = n
	sol, err = frame.SolveWith(mo, so)
	if err != nil {
		return fmt.Errorf("combination %q: second-order analysis: %w", name, err)
	}
	if b := sol.Balance(0); b.Relative() > max(StaticsLimit, sol.RoundOff()) {
		return fmt.Errorf("combination %q: the second-order solution is out of balance by %.2g of its load on the deformed geometry", name, b.Relative())
	}
	u.axial = n
	u.final = sol
	return nil
}

// iterations are the second-order units' iterations under way
// (iterateAll), by index into the plan's units.
type iterations struct {
	first, critical, iterated []error // of the first-order solve, αcr, the iteration
	// The storeys' first-order analyses (storeySolveAll), made beside the
	// iterations, and their errors: filled in and returned in the groups'
	// order (storey).
	storeys     []*storeyAnalysis
	storeyErr   []error
	storeysDone chan struct{}
	done        []chan struct{}
	critDone    chan struct{}
	stop        atomic.Bool
	wg          sync.WaitGroup
}

// err waits for unit i's iteration and critical load factors and returns
// its error: the first of its first-order solve's, its critical load
// factor's and its iteration's, nil for none.
func (it *iterations) err(i int) error {
	<-it.done[i]
	<-it.critDone
	switch {
	case it.first[i] != nil:
		return it.first[i]
	case it.critical[i] != nil:
		return it.critical[i]
	}
	return it.iterated[i]
}

// storey waits for the storeys' analyses and returns unit i's, and its
// error.
func (it *iterations) storey(i int) (*storeyAnalysis, error) {
	<-it.storeysDone
	return it.storeys[i], it.storeyErr[i]
}

// close leaves the iterations not begun undone and waits for those under
// way and the critical load factors.
func (it *iterations) close() {
	it.stop.Store(true)
	it.wg.Wait()
}

// iterateAll starts the iterations of the second-order units second
// (indices into pl.units, in the groups' order) once their first-order
// solves are made, side by side, and returns them under way: each unit's
// result is waited for as the envelopes come to it (iterations.err), so
// that the first groups are enveloped while the later units iterate. The
// iterations are independent of each other and of the envelopes: they
// are taken in order by one worker per processor. The units' critical
// load factors are found beside them, every unit of a stiffness on one
// factor of it (criticalEach: the later units' Lanczos iterations start
// from the first's, bucklingstart.go in package frame), each stiffness in
// the order it first comes. The caller closes it.
func (r *Result) iterateAll(pl *plan, base *frame.Model, second []int) *iterations {
	n := len(pl.units)
	it := &iterations{first: make([]error, n), critical: make([]error, n), iterated: make([]error, n),
		storeys: make([]*storeyAnalysis, n), storeyErr: make([]error, n), storeysDone: make(chan struct{}),
		done: make([]chan struct{}, n), critDone: make(chan struct{})}
	mos, ns := make([]*frame.Model, n), make([][]float64, n)
	eachShared(len(second), func(q int) {
		i := second[q]
		mos[i], ns[i], it.first[i] = r.firstAxial(&pl.units[i], base, pl.units[i].method.Stiffness)
	})
	// Each storey's list of stability indices, made here as setStability
	// makes it for the first strength combination: the workers' analyses
	// read the storeys (unitShears) while the groups fill the lists, so
	// they are not made then.
	for _, i := range second {
		if !r.Job.Combinations[pl.units[i].k].Service {
			for si := range r.Storeys {
				if r.Storeys[si].Stability == nil {
					r.Storeys[si].Stability = make([]StoreyStability, len(r.Job.Combinations))
				}
			}
			break
		}
	}
	// The units of each stiffness, in the order it first comes, but for
	// those whose first-order solve failed.
	var stiffs []Stiffness
	for _, i := range second {
		if s := pl.units[i].method.Stiffness; !slices.Contains(stiffs, s) {
			stiffs = append(stiffs, s)
		}
	}
	unitsOf := func(s Stiffness) (us []*unit, idx []int) {
		for _, i := range second {
			if pl.units[i].method.Stiffness == s && it.first[i] == nil {
				us, idx = append(us, &pl.units[i]), append(idx, i)
			}
		}
		return us, idx
	}
	it.wg.Add(2)
	go func() {
		defer it.wg.Done()
		defer close(it.critDone)
		for _, s := range stiffs {
			us, idx := unitsOf(s)
			if len(us) == 0 {
				continue
			}
			axial := make([][]float64, len(idx))
			for q, i := range idx {
				axial[q] = ns[i]
			}
			if !criticalTogether {
				for q, u := range us {
					it.critical[idx[q]] = r.critical(u, base, axial[q], s)
				}
				continue
			}
			for q, err := range r.criticalEach(us, base, axial, s) {
				it.critical[idx[q]] = err
			}
		}
	}()
	// The storeys' first-order analyses, on the factor of the first-order
	// solution of each stiffness, every unit's together (each its own
	// solve where that failed: its error names the storeys).
	go func() {
		defer it.wg.Done()
		defer close(it.storeysDone)
		for _, s := range stiffs {
			us, idx := unitsOf(s)
			var first *frame.Solution
			if shareFactors {
				first, _ = r.firstOrder(base, s)
			}
			if first == nil {
				for q, u := range us {
					it.storeys[idx[q]], it.storeyErr[idx[q]] = r.storeySolve(u, base, s, nil)
				}
				continue
			}
			sas, errs := r.storeySolveAll(us, base, s, first)
			for q, i := range idx {
				it.storeys[i], it.storeyErr[i] = sas[q], errs[q]
			}
		}
	}()
	next := make(chan int, len(second))
	for _, i := range second {
		it.done[i] = make(chan struct{})
		next <- i
	}
	close(next)
	for range min(runtime.GOMAXPROCS(0), len(second)) {
		it.wg.Add(1)
		go func() {
			defer it.wg.Done()
			for i := range next {
				if it.first[i] == nil && !it.stop.Load() {
					it.iterated[i] = r.iterateFrom(&pl.units[i], mos[i], ns[i])
				}
				close(it.done[i])
			}
		}()
	}
	if !iterationsBeside {
		for _, i := range second {
			<-it.done[i]
		}
	}
	return it
}

// critical sets u's critical load factors, for the combination as
// written, from the first-order axial forces n of its loads at u.scale.
func (r *Result) critical(u *unit, base *frame.Model, n []float64, stiff Stiffness) error {
	return r.criticalOf([]*unit{u}, base, [][]float64{n}, stiff)
}

// criticalOf sets the critical load factors of the units us, each from
// its first-order axial forces ns[i], found side by side on one factor of
// the stiffness (frame.Buckling.Factors); the first error in their order.
func (r *Result) criticalOf(us []*unit, base *frame.Model, ns [][]float64, stiff Stiffness) error {
	for _, err := range r.criticalEach(us, base, ns, stiff) {
		if err != nil {
			return err
		}
	}
	return nil
}

// criticalEach is criticalOf with each unit's error, nil for none: a
// second-order unit's when its factor is not above its limit; where the
// factors side by side fail, each unit's own, found alone.
func (r *Result) criticalEach(us []*unit, base *frame.Model, ns [][]float64, stiff Stiffness) []error {
	job := r.Job
	errs := make([]error, len(us))
	as, err := r.criticalFactors(base, stiff, ns)
	noms := as
	if err == nil && stiff != Nominal {
		noms, err = r.criticalFactors(base, Nominal, ns)
	}
	if err != nil {
		if len(us) > 1 {
			// Which combination: each alone.
			for i, u := range us {
				errs[i] = r.critical(u, base, ns[i], stiff)
			}
			return errs
		}
		errs[0] = fmt.Errorf("combination %q: critical load factor: %w", job.Combinations[us[0].k].Name, err)
		return errs
	}
	for i, u := range us {
		name := job.Combinations[u.k].Name
		u.critical = sixFigures(as[i] * u.scale)
		u.nominal = sixFigures(noms[i] * u.scale)
		limit := 1.0
		if u.method.Allowable {
			limit = AllowableScale
		}
		if !(u.critical > limit) {
			err := fmt.Errorf("%w: combination %q: the critical load factor αcr = %.4g is not above %g: the frame buckles under it (with %s stiffness)", ErrBuckles, name, u.critical, limit, stiff)
			if u.method.SecondOrder {
				errs[i] = err
				continue
			}
			// A first-order analysis can still be made; what it gives does
			// not stand, and the warning says so (see docs/analysis.md).
			r.mu.Lock()
			r.buckled = append(r.buckled, buckled{u.k, err.Error() + "; the first-order results of this combination do not stand"})
			r.mu.Unlock()
		}
	}
	return errs
}

// bucklingOnce is the factored elastic stiffness of one stiffness, made
// by the first combination that needs it.
type bucklingOnce struct {
	once sync.Once
	b    *frame.Buckling
	err  error
}

// criticalFactors returns αcr of each set of axial forces ns with
// stiffness stiff:
// the elastic stiffness is factored once per stiffness for every
// combination (frame.NewBuckling).
func (r *Result) criticalFactors(base *frame.Model, stiff Stiffness, ns [][]float64) ([]float64, error) {
	r.mu.Lock()
	if r.buckling == nil {
		r.buckling = map[Stiffness]*bucklingOnce{}
	}
	bo := r.buckling[stiff]
	if bo == nil {
		bo = &bucklingOnce{}
		r.buckling[stiff] = bo
	}
	r.mu.Unlock()
	bo.once.Do(func() {
		secs, mems := r.Job.stiffnessOf(base, stiff)
		bo.b, bo.err = frame.NewBuckling(&frame.Model{Nodes: base.Nodes, Sections: secs, Members: mems})
	})
	if bo.err != nil {
		return nil, bo.err
	}
	return bo.b.Factors(ns)
}

// firstOnce is the first-order solution of one stiffness, made by the
// first combination that needs it.
type firstOnce struct {
	once sync.Once
	sol  *frame.Solution
	err  error
}

// firstOrder returns a first-order solution with stiffness stiff of base's
// nodes, sections and members, on whose factor more cases are solved
// (frame.Solution.SolveCases): r.sol with the sections as given, else one
// with no load, solved once per stiffness for every combination.
func (r *Result) firstOrder(base *frame.Model, stiff Stiffness) (*frame.Solution, error) {
	if stiff == Nominal && r.sol != nil {
		return r.sol, nil
	}
	r.mu.Lock()
	if r.firsts == nil {
		r.firsts = map[Stiffness]*firstOnce{}
	}
	fo := r.firsts[stiff]
	if fo == nil {
		fo = &firstOnce{}
		r.firsts[stiff] = fo
	}
	r.mu.Unlock()
	fo.once.Do(func() {
		secs, mems := r.Job.stiffnessOf(base, stiff)
		fo.sol, fo.err = frame.SolveWith(&frame.Model{Nodes: base.Nodes, Sections: secs, Members: mems, Cases: []frame.Case{{Name: "no load"}}}, r.solver)
	})
	return fo.sol, fo.err
}

// ErrBuckles marks a combination under which the frame buckles.
var ErrBuckles = errors.New("the frame buckles")

// request is one envelope Run forms over every unit: its settings, and
// whether the units' notional cases are left out.
type request struct {
	set  envelope.Settings
	bare bool
}

// envelopes forms the envelopes of the requests over every unit of the
// plan: units analysed alike (first order, one stiffness) together on one
// solution, each second-order unit on its own; merged combination by
// combination.
func (r *Result) envelopes(pl *plan, sv *solved, lay *patterns.Layout, reqs []request, vals []*valuesRequest, opt Options) ([]*envelope.Envelope, error) {
	job := r.Job
	type group struct {
		stiff  Stiffness
		second bool
		units  []int
	}
	var groups []group
	firstOf := map[Stiffness]int{}
	for i, u := range pl.units {
		if u.method.SecondOrder {
			groups = append(groups, group{stiff: u.method.Stiffness, second: true, units: []int{i}})
			continue
		}
		g, ok := firstOf[u.method.Stiffness]
		if !ok {
			g = len(groups)
			firstOf[u.method.Stiffness] = g
			groups = append(groups, group{stiff: u.method.Stiffness})
		}
		groups[g].units = append(groups[g].units, i)
	}
	var second []int // the second-order units, in the groups' order
	for _, g := range groups {
		if g.second {
			second = append(second, g.units[0])
		}
	}
	its := r.iterateAll(pl, sv.model, second)
	defer its.close()
	mg := make([]*merger, len(reqs))
	for i := range reqs {
		mg[i] = newMerger(job.Combinations)
	}
	// The solution of the last second-order group, once enveloped: the
	// next one's displacements take its memory (frame.SolveCasesReusing).
	var spent *frame.Solution
	for _, g := range groups {
		sol := r.sol
		glay := lay
		if g.second || g.stiff != Nominal {
			secs, mems := job.stiffnessOf(lay.Model, g.stiff)
			var axial []float64
			if g.second {
				u := &pl.units[g.units[0]]
				if err := its.err(g.units[0]); err != nil {
					return nil, err
				}
				axial = u.axial
				alpha := 1.0
				if u.method.Allowable {
					alpha = AllowableScale
				}
				secs, mems = job.tauB(secs, mems, axial, alpha/u.scale)
			}
			mo := *lay.Model
			mo.Sections, mo.Members = secs, mems
			l2 := *lay
			l2.Model = &mo
			if leaveOutUnits && !usesPatterns(lay, pl, g.units) {
				// No combination of the group has a patterned term: their
				// pieces are read by none (neither summed nor listed, and
				// round-off is judged for pieces only), so they are not
				// solved for.
				l2 = withoutUnits(lay)
				mo.Cases = l2.Model.Cases
				l2.Model = &mo
			}
			glay = &l2
			var err error
			so := opt.Solver
			so.Axial = axial
			if g.second && shareFactors {
				// The iteration's last solve has this stiffness (the same
				// sections, members and axial forces): its factor solves
				// the cases, to the same numbers as a solve of their own.
				u := &pl.units[g.units[0]]
				sol, err = u.final.SolveCasesReusing(mo.Cases, spent)
				u.final, spent = nil, nil
				if err == nil {
					l2.Model = sol.Model() // equal to mo, the iteration's copy
				}
			} else {
				sol, err = frame.SolveWith(&mo, so)
			}
			if err != nil {
				return nil, fmt.Errorf("combination %q: %w", job.Combinations[pl.units[g.units[0]].k].Name, err)
			}
			for _, w := range sol.Warnings() {
				if !slices.Contains(r.Warnings, w) {
					r.Warnings = append(r.Warnings, w)
				}
			}
		}
		if !g.second {
			// sol has the group's stiffness: the combinations' axial
			// forces and storey drifts are solved on its factor.
			var us []*unit
			for _, i := range g.units {
				us = append(us, &pl.units[i])
			}
			if err := r.firstOrderStability(us, sv.model, g.stiff, sol); err != nil {
				return nil, err
			}
		} else {
			// The storeys' first-order analyses, made beside the
			// iterations.
			sa, err := its.storey(g.units[0])
			if err != nil {
				return nil, err
			}
			r.setStoreys(&pl.units[g.units[0]], sv.model, sa)
			its.storeys[g.units[0]] = nil
		}
		for _, i := range g.units {
			u := &pl.units[i]
			cb := &r.Combinations[u.k]
			cb.CriticalFactor = minCritical(cb.CriticalFactor, u.critical)
			cb.CriticalNominal = minCritical(cb.CriticalNominal, u.nominal)
			cb.Iterations = max(cb.Iterations, u.iteration)
			cb.Condition = max(cb.Condition, sol.Cond())
			if u.notional != nil {
				cb.Notional = append(cb.Notional, *u.notional)
			}
		}
		for q, rq := range reqs {
			cs := make([]combos.Combination, len(g.units))
			idx := make([]int, len(g.units))
			for i, ui := range g.units {
				u := &pl.units[ui]
				cs[i], idx[i] = u.cb, u.k
				if rq.bare {
					cs[i] = u.bare
				}
			}
			env, err := envelope.Compute(sol, cs, rq.set, glay)
			if err != nil {
				return nil, err
			}
			mg[q].add(env, idx)
			if q == 0 {
				for _, vr := range vals {
					if err := vr.add(sol, glay, cs, idx, rq.set); err != nil {
						return nil, err
					}
				}
			}
		}
		if g.second && shareFactors {
			spent = sol // read no more
		}
	}
	out := make([]*envelope.Envelope, len(reqs))
	for q := range reqs {
		out[q] = mg[q].env
		out[q].Settings = reqs[q].set
		if lay != nil {
			out[q].Pieces = lay.Pieces
		}
	}
	return out, nil
}

// iterationsBeside is whether the envelopes of a second-order run's
// first groups are formed while its later units iterate, rather than
// after every unit has; the tests turn it off to compare.
var iterationsBeside = true

// criticalTogether is whether the critical load factors of a
// second-order run's units are found side by side (iterateAll) rather
// than each alone; the tests turn it off to compare.
var criticalTogether = true

// shareFactors is whether a second-order unit's solves reuse the factors
// of solves with the same stiffness (its first-order solves r.sol's, its
// envelope the iteration's last solve's) rather than factor their own;
// the tests turn it off to compare.
var shareFactors = true

// leaveOutUnits is whether a group of combinations without patterned
// terms is solved without the pattern pieces; the tests turn it off to
// compare.
var leaveOutUnits = true

// usesPatterns reports whether some unit of us (indices into pl.units)
// has a term on a patterned case of lay.
func usesPatterns(lay *patterns.Layout, pl *plan, us []int) bool {
	for _, i := range us {
		for _, t := range pl.units[i].cb.Terms {
			for _, pc := range lay.Patterned {
				if t.Case == pc.Case {
					return true
				}
			}
		}
	}
	return false
}

// withoutUnits returns lay with its patterned cases' units left out: its
// model has the original cases only (each patterned case as its rest).
func withoutUnits(lay *patterns.Layout) patterns.Layout {
	l2 := *lay
	n := len(lay.Model.Cases)
	l2.Patterned = make([]patterns.Patterned, len(lay.Patterned))
	for p, pc := range lay.Patterned {
		n -= len(pc.Units)
		pc.Units = nil
		l2.Patterned[p] = pc
	}
	mo := *lay.Model
	mo.Cases = lay.Model.Cases[:n:n]
	l2.Model = &mo
	return l2
}

// minCritical returns the smaller of two critical load factors, 0 being
// none yet.
func minCritical(a, b float64) float64 {
	if a == 0 {
		return b
	}
	return min(a, b)
}

// merger gathers envelopes formed over parts of the combinations into one
// over all of them: at each station the larger maximum and the smaller
// minimum, the first combination (in the job's order) of equal values.
type merger struct {
	env               *envelope.Envelope
	strength, service []bool // per job combination
}

func newMerger(cs []combos.Combination) *merger {
	mg := &merger{strength: make([]bool, len(cs)), service: make([]bool, len(cs))}
	anyStrength := false
	for k, cb := range cs {
		mg.service[k] = cb.Service
		mg.strength[k] = !cb.Service
		anyStrength = anyStrength || !cb.Service
	}
	env := &envelope.Envelope{Combinations: cs}
	for k := range cs {
		if !anyStrength {
			mg.strength[k] = true
		}
		if mg.strength[k] {
			env.Strength = append(env.Strength, k)
		}
		if mg.service[k] {
			env.Service = append(env.Service, k)
		}
	}
	mg.env = env
	return mg
}

func emptyExtreme() envelope.Extreme {
	return envelope.Extreme{Max: math.Inf(-1), MaxBy: -1, Min: math.Inf(1), MinBy: -1}
}

// mergeExtreme takes into d the extremes of s, whose combinations idx
// maps to the job's.
func mergeExtreme(d *envelope.Extreme, s *envelope.Extreme, idx []int) {
	if s.MaxBy >= 0 {
		by := idx[s.MaxBy]
		if d.MaxBy < 0 || s.Max > d.Max || s.Max == d.Max && by < d.MaxBy {
			d.Max, d.MaxBy, d.MaxWith, d.MaxSpans, d.MaxLoaded = s.Max, by, s.MaxWith, s.MaxSpans, s.MaxLoaded
		}
	}
	if s.MinBy >= 0 {
		by := idx[s.MinBy]
		if d.MinBy < 0 || s.Min < d.Min || s.Min == d.Min && by < d.MinBy {
			d.Min, d.MinBy, d.MinWith, d.MinSpans, d.MinLoaded = s.Min, by, s.MinWith, s.MinSpans, s.MinLoaded
		}
	}
}

// add merges src, formed over the job's combinations idx (src's
// combination i is the job's idx[i]): its forces and reactions where they
// are over strength combinations, its deflections where over service ones.
func (mg *merger) add(src *envelope.Envelope, idx []int) {
	forces := len(src.Strength) > 0 && mg.strength[idx[src.Strength[0]]]
	defl := len(src.Service) > 0
	d := mg.env
	if d.Members == nil {
		d.Members = make([]envelope.Member, len(src.Members))
		for m, sm := range src.Members {
			dm := &d.Members[m]
			dm.Member = sm.Member
			dm.Stations = make([]envelope.Station, len(sm.Stations))
			for i, st := range sm.Stations {
				dm.Stations[i] = envelope.Station{X: st.X, Extra: st.Extra, N: emptyExtreme(), V: emptyExtreme(), M: emptyExtreme()}
			}
			if len(d.Service) > 0 {
				dm.Deflection = make([]envelope.Extreme, len(sm.Stations))
				for i := range dm.Deflection {
					dm.Deflection[i] = emptyExtreme()
				}
			}
		}
		d.Reactions = make([]envelope.Reaction, len(src.Reactions))
		for i, sr := range src.Reactions {
			d.Reactions[i] = envelope.Reaction{Node: sr.Node, Fx: emptyExtreme(), Fy: emptyExtreme(), M: emptyExtreme()}
		}
	}
	for m := range src.Members {
		sm, dm := &src.Members[m], &d.Members[m]
		if forces {
			for i := range sm.Stations {
				s, t := &sm.Stations[i], &dm.Stations[i]
				mergeExtreme(&t.N, &s.N, idx)
				mergeExtreme(&t.V, &s.V, idx)
				mergeExtreme(&t.M, &s.M, idx)
			}
		}
		if defl {
			for i := range sm.Deflection {
				mergeExtreme(&dm.Deflection[i], &sm.Deflection[i], idx)
			}
			if sm.LineDeflection != nil {
				if dm.LineDeflection == nil {
					dm.LineDeflection = make([]envelope.Extreme, len(sm.LineDeflection))
					for i := range dm.LineDeflection {
						dm.LineDeflection[i] = emptyExtreme()
					}
				}
				for i := range sm.LineDeflection {
					mergeExtreme(&dm.LineDeflection[i], &sm.LineDeflection[i], idx)
				}
			}
		}
	}
	if forces {
		for i := range src.Reactions {
			s, t := &src.Reactions[i], &d.Reactions[i]
			mergeExtreme(&t.Fx, &s.Fx, idx)
			mergeExtreme(&t.Fy, &s.Fy, idx)
			mergeExtreme(&t.M, &s.M, idx)
		}
	}
}

// firstOrderCritical sets unit u's critical load factors from a
// first-order solve of its combination with stiffness stiff.
func (r *Result) firstOrderCritical(u *unit, base *frame.Model, stiff Stiffness) error {
	secs, mems := r.Job.stiffnessOf(base, stiff)
	s0, err := frame.SolveWith(combined(base, secs, mems, u.cb, u.scale, nil), r.solver)
	if err != nil {
		return fmt.Errorf("combination %q: %w", r.Job.Combinations[u.k].Name, err)
	}
	return r.critical(u, base, axialForces(s0, 0), stiff)
}

// FirstOrderLimit is the critical load factor below which a first-order
// analysis of a strength combination is warned about: the second-order
// effects 1/(αcr − 1) then exceed 5 % (αcr < 21).
const FirstOrderLimit = 21

// stabilityWarnings returns a warning for each strength combination
// analysed in first order whose critical load factor is below
// FirstOrderLimit.
func (r *Result) stabilityWarnings() []string {
	slices.SortStableFunc(r.buckled, func(a, b buckled) int { return a.k - b.k })
	var out []string
	for _, b := range r.buckled {
		if !slices.Contains(out, b.msg) {
			out = append(out, b.msg)
		}
	}
	for _, cb := range r.Combinations {
		if cb.Service || cb.Method.SecondOrder || !(cb.CriticalFactor > 1) || cb.CriticalFactor >= FirstOrderLimit {
			continue
		}
		out = append(out, fmt.Sprintf("combination %q: critical load factor αcr = %.3g, so second-order effects 1/(αcr − 1) = %.0f %% exceed 5 %% (αcr < %d); this analysis is first-order: EN 1993-1-1 5.2.1(3) asks αcr ≥ 10 for it, ACI 318-19 6.6.4.3 a stability index Q ≤ 0.05; set [analysis] second_order = true",
			cb.Name, cb.CriticalFactor, 100/(cb.CriticalFactor-1), FirstOrderLimit))
	}
	return out
}

// buckled is the warning of a first-order combination with αcr ≤ 1.
type buckled struct {
	k   int
	msg string
}

// firstOrderStability sets the critical load factors and the storeys'
// stability indices of the first-order units us, analysed with stiffness
// stiff on sol: the storeys beside the critical load factors, whose
// Lanczos iteration starts on one processor (they share nothing they
// write). The error is the critical load factors', else the storeys'.
func (r *Result) firstOrderStability(us []*unit, base *frame.Model, stiff Stiffness, sol *frame.Solution) error {
	comb := combinedOf(base, us)
	if stabilityShared {
		if ok, err := r.firstOrderStabilityShared(us, base, stiff, sol, comb); ok {
			sharedStability.Add(1)
			return err
		}
	}
	// Where the cases solved together fail, the critical load factors and
	// the storeys each solve their own, for the error they give.
	var storeys error
	done := make(chan struct{})
	go func() {
		defer close(done)
		storeys = r.storeyStabilityAll(us, base, stiff, sol, comb)
	}()
	err := r.criticalAll(us, base, stiff, sol, comb)
	<-done
	if err != nil {
		return err
	}
	return storeys
}

// stabilityShared is whether firstOrderStability solves the cases of the
// critical load factors and of the storeys together
// (firstOrderStabilityShared); the tests turn it off to compare, and
// count in sharedStability the calls that did.
var (
	stabilityShared = true
	sharedStability atomic.Int64
)

// firstOrderStabilityShared is firstOrderStability with the cases of
// the critical load factors and of the storeys solved together, once, on
// the factor of sol: each combination (combinedOf) in a load column of its
// own, the storeys' horizontal loads and unit storey shears after them
// (storeyStabilityAll), a strength combination at a factor of 1 read from
// its critical load factor's column rather than solved again. Each
// column is substituted on its own, in the same order of operations
// whatever the columns beside it (frame.Solution.SolveCases), so the
// results are those of criticalAll and storeyStabilityAll to the last
// bit, without validating the model, indexing the combinations' loads and
// solving them twice. ok is false, and nothing is set, where the solve
// fails: the two then solve apart, for the error each gives.
func (r *Result) firstOrderStabilityShared(us []*unit, base *frame.Model, stiff Stiffness, sol *frame.Solution, comb []frame.Case) (ok bool, err error) {
	if len(us) == 0 {
		return false, nil
	}
	job := r.Job
	cases := make([]frame.Case, len(us))
	for i := range us {
		cases[i] = comb[i]
		// Names of their own, none another's here: a combination's
		// alternatives share its name.
		cases[i].Name = fmt.Sprintf("combination %d", i+1)
	}
	// The storeys of each strength combination: the column of its
	// combination at a factor of 1 and of its horizontal loads.
	type storeyUnit struct {
		u        *unit
		comb     int
		lat      int
		hx       []float64
		critical bool // comb is the unit's critical load factor's column
	}
	var storeys []storeyUnit
	shears := 0
	if len(r.Storeys) > 0 {
		secs, mems := job.stiffnessOf(base, stiff)
		for i, u := range us {
			if job.Combinations[u.k].Service {
				continue
			}
			su := storeyUnit{u: u, comb: i, critical: true}
			c := comb[i]
			if u.scale != 1 {
				c = combined(base, secs, mems, u.cb, 1, nil).Cases[0]
				su.comb, su.critical = -1, false
			}
			all, hx := r.stabilityCases(base, secs, mems, c)
			if su.comb < 0 {
				all.Cases[0].Name = fmt.Sprintf("unscaled %d", len(storeys)+1)
				su.comb = len(cases)
				cases = append(cases, all.Cases[0])
			}
			all.Cases[1].Name = fmt.Sprintf("lateral %d", len(storeys)+1)
			su.lat, su.hx = len(cases), hx
			cases = append(cases, all.Cases[1])
			storeys = append(storeys, su)
		}
		if len(storeys) > 0 {
			shears = len(cases)
			cases = append(cases, r.unitShears(base)...)
		}
	}
	s, err := sol.SolveCases(cases)
	if err != nil {
		return false, nil
	}
	ns := axialForcesFirst(s, len(us))
	// The storeys beside the critical load factors, as firstOrderStability
	// has them: they share nothing they write.
	done := make(chan struct{})
	go func() {
		defer close(done)
		for _, su := range storeys {
			var axial []float64
			if su.critical {
				axial = slices.Clone(ns[su.comb]) // the same numbers: axialForces of the same column
			} else {
				axial = axialForces(s, su.comb)
			}
			r.setStabilityOf(su.u, base, s, axial, su.lat, shears, su.hx)
		}
	}()
	err = r.criticalOf(us, base, ns, stiff)
	<-done
	return true, err
}

// criticalAll sets the critical load factors of the first-order units us,
// analysed with stiffness stiff on sol: their combinations comb
// (combinedOf) solved together on the factor of sol's stiffness (a load
// column each), and their factors found side by side; the first error in
// their order.
func (r *Result) criticalAll(us []*unit, base *frame.Model, stiff Stiffness, sol *frame.Solution, comb []frame.Case) error {
	if len(us) == 0 {
		return nil
	}
	cases := make([]frame.Case, len(us))
	for i := range us {
		cases[i] = comb[i]
		cases[i].Name = fmt.Sprintf("unit %d", i+1) // a combination's alternatives share its name
	}
	s0, err := sol.SolveCases(cases)
	if err != nil {
		// Which combination: each alone.
		for _, u := range us {
			if err := r.firstOrderCritical(u, base, stiff); err != nil {
				return err
			}
		}
		return err
	}
	ns := make([][]float64, len(us))
	for i := range us {
		ns[i] = axialForces(s0, i)
	}
	return r.criticalOf(us, base, ns, stiff)
}

// sixFigures rounds a critical load factor to the six significant figures
// frame.CriticalTol finds it to, so that its last digits are not those of
// the search.
func sixFigures(a float64) float64 {
	if a == 0 || math.IsInf(a, 0) || math.IsNaN(a) {
		return a
	}
	e := math.Pow(10, 5-math.Floor(math.Log10(math.Abs(a))))
	return math.Round(a*e) / e
}

// unitOf returns the unit whose solution serves combination k: its first
// unit when it is second-order (each has its own), else the first unit of
// the first-order ones of its stiffness (they share one); -1 when every
// combination shares r.sol.
func (r *Result) unitOf(k int) int {
	if r.units == nil {
		return -1
	}
	m := r.Job.methodOf(k)
	for i, u := range r.units {
		if m.SecondOrder && u.k == k {
			return i
		}
		if !m.SecondOrder && !u.method.SecondOrder && u.method.Stiffness == m.Stiffness {
			if m.Stiffness == Nominal {
				return -1
			}
			return i
		}
	}
	return -1
}

// solutionOnce is solutionFor without keeping a solution it forms: the
// caller lets it go when done.
func (r *Result) solutionOnce(k int) (*frame.Solution, *patterns.Layout, error) {
	return r.solution(k, false)
}

// solutionFor returns the solution of every load case and piece that
// combination k was enveloped from, with its layout: r.sol for the
// first-order ones with the sections as given; else that of its unit,
// solved again on request and kept (the envelopes did not keep it).
func (r *Result) solutionFor(k int) (*frame.Solution, *patterns.Layout, error) {
	return r.solution(k, true)
}

// solution is solutionFor, keeping a solution it forms when keep is set.
func (r *Result) solution(k int, keep bool) (*frame.Solution, *patterns.Layout, error) {
	u := r.unitOf(k)
	if u < 0 {
		return r.sol, r.lay, nil
	}
	r.mu.Lock()
	defer r.mu.Unlock()
	if sol := r.solutions[u]; sol != nil {
		l2 := *r.lay
		l2.Model = sol.Model()
		return sol, &l2, nil
	}
	un := &r.units[u]
	secs, mems := r.Job.stiffnessOf(r.lay.Model, un.method.Stiffness)
	so := r.solver
	if un.method.SecondOrder {
		alpha := 1.0
		if un.method.Allowable {
			alpha = AllowableScale
		}
		secs, mems = r.Job.tauB(secs, mems, un.axial, alpha/un.scale)
		so.Axial = un.axial
	}
	mo := *r.lay.Model
	mo.Sections, mo.Members = secs, mems
	sol, err := frame.SolveWith(&mo, so)
	if err != nil {
		return nil, nil, err
	}
	if keep {
		if r.solutions == nil {
			r.solutions = map[int]*frame.Solution{}
		}
		r.solutions[u] = sol
	}
	l2 := *r.lay
	l2.Model = sol.Model()
	return sol, &l2, nil
}
