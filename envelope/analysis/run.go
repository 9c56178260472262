package analysis

import (
	"context"
	"fmt"
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

	// The first-order solution of every load case and pattern piece, from
	// which every combination is formed: an optimisation of the
	// first-order analysis, not part of the contract.
	lay    *patterns.Layout
	sol    *frame.Solution
	spanOf []int // member → index into Spans, -1 for none
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
	lay, err := patterns.Expand(sv.model, sv.patterned, job.Segments, mode)
	if err != nil {
		return nil, err
	}
	sv.namePieces(job, lay)
	report(opt, Progress{Phase: fmt.Sprintf("solving %d loads (%d load cases, %d pattern pieces or arrangements)",
		len(lay.Model.Cases), len(sv.model.Cases), len(lay.Model.Cases)-len(sv.model.Cases))})
	solver := opt.Solver
	solver.PerMember += perMember(job, sv, lay, opt)
	sol, err := frame.SolveWith(lay.Model, solver)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	r := &Result{Job: job, lay: lay, sol: sol, Patterns: lay.Mode, Segments: lay.Segments, Info: sol.Info(),
		Warnings: append(slices.Clip(sol.Warnings()), Plausibility(job)...)}
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
	if opt.Progress != nil {
		total := len(job.Model.Members) * set.Stations
		for _, xs := range set.Extra {
			total += len(xs)
		}
		set.Progress = new(atomic.Int64)
		report(opt, Progress{Phase: fmt.Sprintf("solved %d loads; enveloping stations", len(lay.Model.Cases)), Total: int64(total), Done: set.Progress})
	}
	env, err := envelope.Compute(sol, sv.combinations, set, lay)
	if err != nil {
		return nil, err
	}
	// The job's combinations, index for index: a favourable factor's split
	// (favourableSplit) is how they were solved, not what they are.
	r.solved = env.Combinations
	env.Combinations = job.Combinations
	r.Envelope = env
	r.Combinations = make([]Combination, len(job.Combinations))
	for k, cb := range job.Combinations {
		r.Combinations[k] = Combination{Combination: cb, Condition: sol.Cond()}
		if job.Methods != nil {
			r.Combinations[k].Method = job.Methods[k]
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
	var across *envelope.Envelope // deflections across the lines of runs with a ridge
	if lines := ridgeLines(job.Model, r.Spans); lines != nil && len(env.Service) > 0 {
		// The ends of the members are enough: a ridge is a node.
		ends := set
		ends.Stations, ends.Extra, ends.Lines, ends.Progress = 2, nil, lines, nil
		if across, err = envelope.Compute(sol, job.Combinations, ends, lay); err != nil {
			return nil, err
		}
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
	return envelope.EndMoments(r.sol, r.solved, r.Envelope.Settings, r.lay, m, x, k, j, hi, want)
}

// EndMomentsOf is EndMoments for several states of member m at once
// (envelope.EndMomentsOf).
func (r *Result) EndMomentsOf(m int, states []envelope.State) []envelope.State {
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

// StationsAt returns the envelopes of member m, in its own axes, at the
// points xs from its start, over the strength combinations as the
// envelope forms them (see envelope.StationsAt).
func (r *Result) StationsAt(m int, xs []float64) ([]envelope.Station, error) {
	return envelope.StationsAt(r.sol, r.solved, r.Envelope.Settings, r.lay, m, xs)
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

// perMember is what the envelopes will hold per member, for the estimate
// of the run's memory: each member's stations, with two faces on a beam.
func perMember(job *Job, sv solved, lay *patterns.Layout, opt Options) float64 {
	pieces := len(lay.Model.Cases) - len(sv.model.Cases)
	service := slices.ContainsFunc(sv.combinations, func(c combos.Combination) bool { return c.Service })
	return float64(job.Settings.Stations+2) * envelope.StationBytes(pieces, service, opt.allPieces)
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
	return frame.EstimateMemory(lay.Model, frame.Options{PerMember: perMember(job, sv, lay, Options{})})
}
