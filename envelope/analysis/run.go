package analysis

import (
	"context"
	"fmt"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// Options are the choices of one run that are not the job's.
type Options struct {
	// Solver passes options on to frame.SolveWith, such as accepting an
	// ill-conditioned stiffness matrix.
	Solver frame.Options
	// Progress, when not nil, is called at the start of each phase of the
	// run, from the goroutine that called Run.
	Progress func(Progress)

	// placement, when set, overrides the job's pattern placement, and
	// allPieces lists every loaded piece in the envelopes (ComparePatterns).
	placement *patterns.Mode
	allPieces bool
}

// Progress says what Run is doing.
type Progress struct {
	Phase string // such as "solving 52 loads (4 load cases, 48 pattern pieces or arrangements)"
	// Total is the units of work of a counted phase (stations to
	// envelope), 0 for a phase that is not counted. Done, not nil for a
	// counted phase, is advanced by Run's workers as they go and may be
	// read from any goroutine until Run returns.
	Total int64
	Done  *atomic.Int64
}

// Result is an analysed job: the envelopes over its combinations, how each
// combination was analysed, and what the tables and drawings are built
// from. It is never modified after Run returns, so its readers may run
// at once.
type Result struct {
	Job *Job // the job analysed

	// Combinations holds, per combination of the job and in its order,
	// how it was analysed.
	Combinations []Combination
	// Envelope holds the envelopes of forces, deflections and reactions
	// over the combinations (package envelope).
	Envelope *envelope.Envelope
	// Patterns is the placement the patterned cases were analysed with
	// and Segments the pieces per beam.
	Patterns patterns.Mode
	Segments int
	// Info is the size of the stiffness equations, the same for every
	// combination.
	Info frame.Info
	// Warnings are the solver's, such as an ill-conditioned stiffness
	// matrix, then those of numbers that look like a slip of units
	// ([Plausibility], and span/deflection under the service combinations).
	Warnings []string
	// Faces holds, per member, the distances from its start of the faces
	// of the columns it frames into at its start and end, -1 where there is
	// none; nil when no section gives a depth (ColumnFaces).
	Faces [][2]float64
	// Spans are the spans and cantilevers of beams and rafters, with their
	// deflections over the service combinations.
	Spans []Span
	// Statics is the statics check of every load case, in model order;
	// Run has refused any case out of balance.
	Statics []Balance
	// Displacements are the envelopes of the nodes' displacements, in
	// model order; Storeys the storeys between the job's levels.
	Displacements []NodeDisplacement
	Storeys       []Storey
	// Amplifications gives, for each column whose governing moment comes
	// from a second-order combination, that moment beside the first-order
	// one of the same state; by member.
	Amplifications []Amplification
	// BareReactions are the reaction envelopes with the notional loads left
	// out (their base shear: AISC 360-16 C2.2b User Note), in the order of
	// Envelope.Reactions; nil without notional loads.
	BareReactions []envelope.Reaction

	// The first-order solution of every load case and pattern piece, from
	// which every combination is formed: an optimisation of the
	// first-order analysis, not part of the contract.
	lay    *patterns.Layout
	sol    *frame.Solution
	spanOf []int // member → index into Spans, -1 for none
	// sums holds, per load case, the displacements of sol summed over its
	// columns (frame.Solution.DisplacementSums), as the statics check
	// formed them; read only.
	sums [][]float64

	solver  frame.Options // the options of every solve
	mu      sync.Mutex    // guards buckled and solutions
	buckled []buckled     // first-order combinations with αcr ≤ 1, as warnings
	// buckling holds the factored elastic stiffness of each stiffness the
	// critical load factors are found with, shared by every combination.
	buckling map[Stiffness]*bucklingOnce
	// firsts holds the first-order solution, with no load, of each
	// stiffness other than the sections as given that second-order
	// combinations are analysed with: their starts and storeys are solved
	// on its factor (firstOrder).
	firsts map[Stiffness]*firstOnce
	// units are the analyses of the combinations when they are not all one
	// first-order analysis with the sections as given (nil then), and
	// solutions those solved again on request (solutionFor), by unit.
	units     []unit
	solutions map[int]*frame.Solution
	// The combinations as they were enveloped (favourableSplit), index
	// for index with the job's.
	solved []combos.Combination
	// finders holds EndMomentsOf's reusable evaluators.
	finders sync.Pool
}

// Combination is one combination of the job as it was analysed.
type Combination struct {
	combos.Combination
	Method Method
	// Condition is the estimated condition number of its stiffness matrix,
	// scaled to unit diagonal (frame.Solution.Cond).
	Condition float64
	// CriticalFactor is αcr, the elastic critical load factor of the
	// combination as written, every case at its factor and every pattern
	// piece loaded (notional loads included), with the stiffness it is
	// analysed with: the smallest factor on its loads at which the frame
	// buckles (frame.CriticalFactor); +Inf where nothing is in
	// compression. The least over its notional alternatives.
	CriticalFactor float64
	// CriticalNominal is αcr with the sections as given (what EN 1993-1-1
	// 5.2.1(3) compares with 10); CriticalFactor where the stiffness is
	// nominal.
	CriticalNominal float64
	// Iterations is the number of second-order solves of the iteration on
	// the axial forces; 0 for a first-order analysis.
	Iterations int
	// Notional holds its notional loads: none, one set, or one per
	// direction as alternatives.
	Notional []Notional
}

// Condition returns the largest estimated condition number of the
// stiffness matrices of the combinations.
func (r *Result) Condition() float64 {
	c := 0.0
	for _, cb := range r.Combinations {
		c = max(c, cb.Condition)
	}
	return c
}

// Run places the patterned loads of job, solves every load case and forms
// the envelopes over the combinations, with the column faces as extra
// stations and the deflections of spans and cantilevers. It checks the
// statics of every load case and returns a *StaticsError when one is out
// of balance. ctx is checked between phases.
//
// Input errors are returned: a job whose parts do not match its model,
// one that asks for what is not applied yet (ErrNotApplied), a load case
// no combination uses (ErrUnused, unless Job.AllowUnused), a frame that
// is a mechanism or too ill-conditioned to solve (package frame).
func Run(ctx context.Context, job *Job, opt Options) (*Result, error) {
	if err := job.check(); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	mode := job.Patterns
	if opt.placement != nil {
		mode = *opt.placement
	}
	sv := favourableSplit(job)
	pl, err := makePlan(job, &sv)
	if err != nil {
		return nil, err
	}
	lay, err := patterns.Expand(sv.model, sv.patterned, job.Segments, mode)
	if err != nil {
		return nil, err
	}
	sv.namePieces(job, lay)
	report(opt, Progress{Phase: fmt.Sprintf("solving %d loads (%d load cases, %d pattern pieces or arrangements)",
		len(lay.Model.Cases), len(sv.model.Cases), len(lay.Model.Cases)-len(sv.model.Cases))})
	solver := opt.Solver
	held := memoryOptions(job, sv, lay, opt)
	solver.PerMember += held.PerMember
	solver.Held, solver.Solutions, solver.Growth = held.Held, held.Solutions, held.Growth
	// The elastic stiffness with the sections as given, factored for the
	// critical load factors (every run finds them) beside the solve, whose
	// assembly and factorization take one processor.
	nominal := &bucklingOnce{}
	go nominal.once.Do(func() {
		nominal.b, nominal.err = frame.NewBuckling(&frame.Model{Nodes: sv.model.Nodes, Sections: sv.model.Sections, Members: sv.model.Members})
	})
	sol, err := frame.SolveWith(lay.Model, solver)
	if err == nil {
		err = ctx.Err()
	}
	if err != nil {
		nominal.once.Do(func() {}) // done with it
		return nil, err
	}
	r := &Result{Job: job, lay: lay, sol: sol, solver: opt.Solver, Patterns: lay.Mode, Segments: lay.Segments, Info: sol.Info(),
		Warnings: append(slices.Clip(sol.Warnings()), Plausibility(job)...), buckling: map[Stiffness]*bucklingOnce{Nominal: nominal}}
	r.Faces = ColumnFaces(job.Model)
	r.Spans = spans(job.Model)
	set := envelope.Settings{
		Stations:  job.Settings.Stations,
		AsWritten: job.Settings.AsWritten,
		Extra:     faceStations(r.Faces),
		Lines:     spanLines(job.Model, r.Spans),
		Kinds:     sv.kinds,
		AllSpans:  opt.allPieces,
	}
	if job.Actions != nil {
		if g := job.Actions.Groups(); g != nil {
			// The adverse parts of favourable permanent cases join no set.
			for len(g) < len(sv.kinds) {
				g = append(g, -1)
			}
			set.Groups = g
		}
	}
	r.Combinations = make([]Combination, len(job.Combinations))
	for k, cb := range job.Combinations {
		r.Combinations[k] = Combination{Combination: cb, Method: job.methodOf(k)}
		if pl.simple {
			r.Combinations[k].Condition = sol.Cond()
		}
	}
	var ends envelope.Settings // the ends of the members, for the deflections across ridges
	lines := ridgeLines(job.Model, r.Spans)
	if lines != nil {
		// The ends of the members are enough: a ridge is a node.
		ends = set
		ends.Stations, ends.Extra, ends.Lines, ends.Progress = 2, nil, lines, nil
	}
	groups := 1 // the Compute calls over the members: one per group of units analysed alike
	if !pl.simple {
		groups = 0
		first := map[Stiffness]bool{}
		for _, u := range pl.units {
			if u.method.SecondOrder {
				groups++
			} else if !first[u.method.Stiffness] {
				first[u.method.Stiffness] = true
				groups++
			}
		}
	}
	if opt.Progress != nil {
		total := len(job.Model.Members) * set.Stations
		for _, xs := range set.Extra {
			total += len(xs)
		}
		set.Progress = new(atomic.Int64)
		report(opt, Progress{Phase: fmt.Sprintf("solved %d loads; enveloping stations", len(lay.Model.Cases)), Total: int64(total * groups), Done: set.Progress})
	}
	r.Storeys = storeysOf(job)
	// The requests of the nodes' displacements and the storeys' drifts,
	// read from the storeys before their stability is written beside.
	nodes, drifts := r.displacementRequests()
	var stability error // reported after the envelopes' errors, which say more
	var stable chan struct{}
	if pl.simple {
		// The combinations' axial forces and storey drifts, solved on the
		// factor of sol, whose stiffness they share, and their critical
		// load factors: beside the envelopes, which read nothing of them
		// (the first combination's Lanczos iteration is one processor's
		// work, the envelopes' members fill the other). Closed when done.
		us := make([]*unit, len(pl.units))
		for i := range us {
			us[i] = &pl.units[i]
		}
		stable = make(chan struct{})
		go func() {
			defer close(stable)
			stability = r.firstOrderStability(us, sv.model, Nominal, sol)
		}()
		if !stabilityBeside {
			<-stable
		}
	}
	var env, across *envelope.Envelope // across: deflections across the lines of runs with a ridge
	if pl.simple {
		set.Factors = job.envelopeFactors(len(sv.kinds))
		env, err = envelope.Compute(sol, sv.combinations, set, lay)
		if err == nil {
			idx := make([]int, len(sv.combinations))
			for k := range idx {
				idx[k] = k
			}
			for _, vr := range []*valuesRequest{nodes, drifts} {
				if err = vr.add(sol, lay, sv.combinations, idx, set); err != nil {
					break
				}
			}
		}
		<-stable // its error after the envelopes'
		if err != nil {
			return nil, err
		}
		if stability != nil {
			return nil, stability
		}
		for i := range pl.units {
			u := &pl.units[i]
			cb := &r.Combinations[u.k]
			cb.CriticalFactor, cb.CriticalNominal = u.critical, u.nominal
		}
	} else {
		// Member factors scale each case's and piece's effects on the
		// combination's own stiffness, second-order included: its geometric
		// stiffness is from the unreduced axial forces (iterate), fixed, so
		// the effects of its columns superpose as in first order.
		set.Factors = job.envelopeFactors(len(sv.kinds))
		reqs := []request{{set: set}}
		if job.Sway.Notional != NoNotional || job.Sway.TauB == TauBNotional {
			bare := set
			bare.Stations, bare.Extra, bare.Lines, bare.Progress = 2, nil, nil, nil
			reqs = append(reqs, request{set: bare, bare: true})
		}
		if lines != nil {
			reqs = append(reqs, request{set: ends})
		}
		envs, err := r.envelopes(pl, &sv, lay, reqs, []*valuesRequest{nodes, drifts}, opt)
		if err != nil {
			return nil, err
		}
		env = envs[0]
		if job.Sway.Notional != NoNotional || job.Sway.TauB == TauBNotional {
			r.BareReactions = envs[1].Reactions
		}
		if lines != nil {
			across = envs[len(envs)-1]
		}
	}
	r.setDisplacements(nodes, drifts)
	r.Warnings = append(r.Warnings, r.stabilityWarnings()...)
	// The job's combinations, index for index: a favourable factor's split
	// (favourableSplit) is how they were solved, not what they are.
	r.solved = env.Combinations
	if !pl.simple {
		// Each combination as its (first) unit was solved, notional loads
		// included; and how to solve it again on request (solutionFor).
		r.solved = slices.Clone(sv.combinations)
		for i := len(pl.units) - 1; i >= 0; i-- {
			r.solved[pl.units[i].k] = pl.units[i].cb
		}
		r.units = pl.units
	}
	env.Combinations = job.Combinations
	r.Envelope = env
	if !pl.simple {
		if err := r.amplifications(pl, &sv, lay, set); err != nil {
			return nil, err
		}
	}
	r.Statics = r.statics()
	if err := CheckStatics(r.Statics); err != nil {
		se := err.(*StaticsError)
		se.Warnings = r.Warnings
		return nil, se
	}
	r.spanOf = make([]int, len(job.Model.Members))
	for m := range r.spanOf {
		r.spanOf[m] = -1
	}
	if pl.simple && lines != nil && len(env.Service) > 0 {
		if across, err = envelope.Compute(sol, job.Combinations, ends, lay); err != nil {
			return nil, err
		}
	}
	if len(env.Service) == 0 {
		across = nil
	}
	for i := range r.Spans {
		s := &r.Spans[i]
		if !s.ofLine() {
			if across != nil {
				s.Deflection = r.ridgeDeflection(s, across)
			}
			continue
		}
		for _, m := range s.Members {
			r.spanOf[m] = i
		}
		if len(env.Service) > 0 {
			s.Deflection = r.spanDeflection(s)
		}
	}
	if err := r.limitChecks(set); err != nil {
		return nil, err
	}
	r.Warnings = append(r.Warnings, newPlausibility(job).spanWarnings(r)...)
	return r, nil
}

// stabilityBeside is whether a first-order run finds its combinations'
// critical load factors and storeys' stability beside the envelopes
// rather than before them; the tests turn it off to compare.
var stabilityBeside = true

func report(opt Options, p Progress) {
	if opt.Progress != nil {
		opt.Progress(p)
	}
}

// SpanOf returns the index in r.Spans of the span, cantilever or rafter
// member m is part of, -1 for none.
func (r *Result) SpanOf(m int) int { return r.spanOf[m] }

// EndMoments returns the moments at the start and end of member m, in its
// own axes, in the state that gives an extreme of its envelope: effect j
// (0 N, 1 V, 2 M) at the station at x, largest (hi) or smallest, value
// want, under combination k (see envelope.EndMoments); ok is false when
// that state does not give want again.
func (r *Result) EndMoments(m int, x float64, k, j int, hi bool, want float64) (ends [2]float64, ok bool) {
	sol, lay, err := r.solutionFor(k)
	if err != nil {
		return ends, false
	}
	return envelope.EndMoments(sol, r.solved, r.Envelope.Settings, lay, m, x, k, j, hi, want)
}

// EndMomentsOf is EndMoments for several states of member m at once
// (envelope.EndMomentsOf); each state with the solution of its
// combination (second order: its own).
func (r *Result) EndMomentsOf(m int, states []envelope.State) []envelope.State {
	if r.units == nil {
		// A finder's evaluator and scratch, formed once and reused member
		// after member: a design table asks for every member's states.
		f, _ := r.finders.Get().(*envelope.EndsFinder)
		if f == nil {
			f = envelope.NewEndsFinder(r.sol, r.solved, r.Envelope.Settings, r.lay)
		}
		out := f.Of(m, states)
		r.finders.Put(f)
		return out
	}
	out := make([]envelope.State, len(states))
	byKey := map[int][]int{} // unit of the solution → states
	var order []int
	for i, st := range states {
		u := r.unitOf(st.By)
		if _, ok := byKey[u]; !ok {
			order = append(order, u)
		}
		byKey[u] = append(byKey[u], i)
	}
	for _, u := range order {
		idx := byKey[u]
		sub := make([]envelope.State, len(idx))
		for q, i := range idx {
			sub[q] = states[i]
		}
		sol, lay, err := r.solutionFor(states[idx[0]].By)
		if err != nil {
			for _, i := range idx {
				out[i] = states[i]
			}
			continue
		}
		got := envelope.EndMomentsOf(sol, r.solved, r.Envelope.Settings, lay, m, sub)
		for q, i := range idx {
			out[i] = got[q]
		}
	}
	return out
}

// EndMomentsOfMany is EndMomentsOf for the states of several members,
// states[i] those of member ms[i]: in a run with combinations analysed
// apart, each one's solution is formed once for every member (or taken
// from those kept) and let go before the next, so that no more than one
// is held at a time.
func (r *Result) EndMomentsOfMany(ms []int, states [][]envelope.State) [][]envelope.State {
	out := make([][]envelope.State, len(ms))
	if r.units == nil {
		eachShared(len(ms), func(i int) {
			out[i] = envelope.EndMomentsOf(r.sol, r.solved, r.Envelope.Settings, r.lay, ms[i], states[i])
		})
		return out
	}
	type at struct{ i, q int } // member ms[i], its state q
	byUnit := map[int][]at{}
	var order []int
	for i := range ms {
		out[i] = slices.Clone(states[i])
		for q, st := range states[i] {
			u := r.unitOf(st.By)
			if _, ok := byUnit[u]; !ok {
				order = append(order, u)
			}
			byUnit[u] = append(byUnit[u], at{i, q})
		}
	}
	for _, u := range order {
		list := byUnit[u]
		sol, lay, err := r.solutionOnce(states[list[0].i][list[0].q].By)
		if err != nil {
			continue // the states as they are: not found
		}
		// The runs of one member's states, shared among the processors.
		var runs [][2]int
		for a := 0; a < len(list); {
			b := a
			for b < len(list) && list[b].i == list[a].i {
				b++
			}
			runs = append(runs, [2]int{a, b})
			a = b
		}
		eachShared(len(runs), func(k int) {
			a, b := runs[k][0], runs[k][1]
			sub := make([]envelope.State, b-a)
			for q := range sub {
				sub[q] = states[list[a+q].i][list[a+q].q]
			}
			got := envelope.EndMomentsOf(sol, r.solved, r.Envelope.Settings, lay, ms[list[a].i], sub)
			for q := range sub {
				out[list[a+q].i][list[a+q].q] = got[q]
			}
		})
	}
	return out
}

// eachShared calls f(i) for i in [0, n), shared among the processors.
func eachShared(n int, f func(i int)) {
	next := make(chan int, n)
	for i := range n {
		next <- i
	}
	close(next)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				f(i)
			}
		}()
	}
	wg.Wait()
}

// StationsAt returns the envelopes of member m, in its own axes, at the
// points xs from its start, over the strength combinations as the
// envelope forms them (see envelope.StationsAt); in a run with
// combinations analysed apart (second order, reduced stiffness), each
// group of them on its own solution, merged.
func (r *Result) StationsAt(m int, xs []float64) ([]envelope.Station, error) {
	if r.units == nil {
		return envelope.StationsAt(r.sol, r.solved, r.Envelope.Settings, r.lay, m, xs)
	}
	var out []envelope.Station
	strength := newMerger(r.Job.Combinations).strength
	seen := map[int]bool{}
	for _, u := range r.units {
		g := r.unitOf(u.k)
		if seen[g] || !strength[u.k] {
			continue
		}
		seen[g] = true
		sol, lay, err := r.solutionFor(u.k)
		if err != nil {
			return nil, err
		}
		// The strength combinations this solution serves.
		var cs []combos.Combination
		var idx []int
		for _, v := range r.units {
			if r.unitOf(v.k) == g && strength[v.k] {
				cs, idx = append(cs, v.cb), append(idx, v.k)
			}
		}
		st, err := envelope.StationsAt(sol, cs, r.Envelope.Settings, lay, m, xs)
		if err != nil {
			return nil, err
		}
		if out == nil {
			out = make([]envelope.Station, len(st))
			for i := range st {
				out[i] = envelope.Station{X: st[i].X, Extra: st[i].Extra, N: emptyExtreme(), V: emptyExtreme(), M: emptyExtreme()}
			}
		}
		for i := range st {
			mergeExtreme(&out[i].N, &st[i].N, idx)
			mergeExtreme(&out[i].V, &st[i].V, idx)
			mergeExtreme(&out[i].M, &st[i].M, idx)
		}
	}
	return out, nil
}

// endForces returns member m's end forces in load case c, adding up the
// loads the case was solved as when it is patterned.
func (r *Result) endForces(c, m int) [6]float64 {
	var f [6]float64
	for _, col := range r.lay.Whole(c) {
		g := r.sol.EndForces(col, m)
		for i := range f {
			f[i] += g[i]
		}
	}
	return f
}

// EstimateMemory returns the estimate of the peak memory, in bytes, of
// running job, which Run refuses past frame.MaxMemory (an error wrapping
// frame.ErrTooLarge), and the size of its system of equations. It places
// the patterned loads but solves nothing.
func EstimateMemory(job *Job) (float64, frame.Info, error) {
	if err := job.check(); err != nil {
		return 0, frame.Info{}, err
	}
	sv := favourableSplit(job)
	lay, err := patterns.Expand(sv.model, sv.patterned, job.Segments, job.Patterns)
	if err != nil {
		return 0, frame.Info{}, err
	}
	return frame.EstimateMemory(lay.Model, memoryOptions(job, sv, lay, Options{}))
}
