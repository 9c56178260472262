package envelope

import (
	"errors"
	"fmt"
	"math"
	"math/bits"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// Extreme is the largest and smallest value of one force over all
// combinations (and, for patterned cases, arrangements), with the index of
// the combination that gives each, the forces acting at the same place in
// that same loading, and the pattern pieces it loads.
type Extreme struct {
	Max       float64
	MaxBy     int
	MaxWith   [3]float64 // N, V, M (Fx, Fy, M for a reaction) acting with Max
	MaxSpans  []int      // the most influential pattern pieces loaded for Max, indices into Envelope.Pieces
	MaxLoaded int        // how many pattern pieces are loaded for Max, listed or not
	Min       float64
	MinBy     int
	MinWith   [3]float64
	MinSpans  []int
	MinLoaded int
}

// empty returns an Extreme that any value replaces.
func empty() Extreme {
	return Extreme{Max: math.Inf(-1), MaxBy: -1, Min: math.Inf(1), MinBy: -1}
}

// Station holds the envelopes at one point of a member.
type Station struct {
	X       float64 // distance from the start node
	Extra   bool    // the station was asked for by Settings.Extra
	N, V, M Extreme
}

// Member holds the stations of one member, sorted by X.
type Member struct {
	Member   int // index into the model's members
	Stations []Station
	// Deflection holds, station by station, the envelope of the member's
	// deflection relative to its chord (along local y, see
	// frame.Solution.Deflection) over the service combinations; nil when
	// there are none. MaxWith and MinWith are zero.
	Deflection []Extreme
	// LineDeflection is Deflection measured across the member's line of
	// Settings.Lines from its reference (see [Line]); nil when the member
	// has none or there are no service combinations.
	LineDeflection []Extreme
}

// Reaction holds the envelopes of the reaction at one supported node.
// Components the support does not restrain are zero, and so are their
// entries in MaxWith and MinWith.
type Reaction struct {
	Node      int // index into the model's nodes
	Fx, Fy, M Extreme
}

// Settings control how envelopes are formed.
type Settings struct {
	// Stations is the number of equally spaced stations per member, both
	// ends included; at least 2.
	Stations int
	// Extra, when not nil, lists for member m the distances from its start
	// of stations to add to the equally spaced ones, such as the faces of
	// the columns a beam frames into. One that falls on an equally spaced
	// station (within 1e-9 of the length) marks it instead. Members past
	// the end of Extra get none.
	Extra [][]float64
	// Kinds gives the kind of each load case of the model before its
	// patterned cases are placed, in model order (the cases combination
	// terms refer to). A case of a permanent kind acts in every
	// combination with its factor; a variable one only where adverse,
	// unless AsWritten. Compute panics when it does not give one kind per
	// case.
	Kinds []combos.Kind
	// AsWritten makes every case of a combination act with its factor
	// everywhere, instead of variable cases acting only where adverse.
	// Pieces of a case patterned "exact" or "exhaustive" are still placed
	// where adverse: that is what patterning asks for.
	AsWritten bool
	// Lines, when not nil, gives for member m the line its deflections are
	// also measured across (Member.LineDeflection), such as the span of a
	// beam it is part of. Members past the end of Lines, or with the zero
	// Line, get none.
	Lines []Line
	// AllSpans lists every loaded piece in MaxSpans and MinSpans, not only
	// those with at least spanShare of the largest piece's effect.
	AllSpans bool
	// Progress, when not nil, counts the stations enveloped so far, for a
	// caller that reports progress from another goroutine.
	Progress *atomic.Int64
}

// Envelope is the result of [Compute].
type Envelope struct {
	Settings     Settings
	Combinations []combos.Combination
	Pieces       []patterns.Piece // the pattern pieces spans refer to; nil without patterns
	Members      []Member
	Reactions    []Reaction
	// Strength lists the combinations the envelopes of forces and
	// reactions are taken over, Service those of the deflections (indices
	// into Combinations). See [Compute].
	Strength, Service []int
}

// ErrNoCombinations is returned when there is nothing to envelope.
var ErrNoCombinations = errors.New("envelope: no load combinations")

// A loaded piece is listed in MaxSpans or MinSpans when its own effect is
// at least spanShare of the largest single piece's, and among the maxSpans
// largest. Pieces with less influence are loaded too (exact placement puts
// every adverse piece on; MaxLoaded counts them) but are not named, so that
// the lists of a tall frame stay readable and its output tractable.
const (
	spanShare = 0.01
	maxSpans  = 16
)

// roundOff is the fraction of the largest size of an effect in a member
// (or of a reaction component at a node), over every load case and piece,
// at or below which a pattern piece's effect counts as round-off: such a
// piece is neither loaded for that effect nor listed or counted.
const roundOff = 1e-9

// Compute forms the envelopes of every member and support over the
// combinations cs. sol must be the solution of lay.Model when lay is not
// nil (pattern loading), or of the model itself when lay is nil.
// Combination terms refer to the original cases, which lead the expanded
// model's cases.
//
// Forces and reactions are enveloped over the strength combinations (those
// not marked Service), or over every combination when all are service ones.
// Deflections are enveloped over the service combinations, with the same
// rules for variable cases and pattern pieces, when there are any.
func Compute(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout) (*Envelope, error) {
	if len(cs) == 0 {
		return nil, ErrNoCombinations
	}
	if set.Stations < 2 {
		return nil, fmt.Errorf("envelope: %d stations per member; need at least 2", set.Stations)
	}
	mo := sol.Model()
	if lay != nil && lay.Model != mo {
		panic("envelope: solution is not of the layout's model")
	}
	if err := checkLines(mo, set.Lines); err != nil {
		return nil, err
	}
	if len(set.Extra) > len(mo.Members) {
		return nil, fmt.Errorf("envelope: extra stations for %d members; the model has %d", len(set.Extra), len(mo.Members))
	}
	for m, xs := range set.Extra {
		l := mo.Length(m)
		for _, x := range xs {
			if !(x >= 0 && x <= l) {
				return nil, fmt.Errorf("envelope: member %q: extra station at %g is not on the member (length %g)", mo.Members[m].Name, x, l)
			}
		}
	}
	env := &Envelope{Settings: set, Combinations: cs}
	env.Strength, env.Service = split(cs)
	e := newEvaluator(mo, cs, env.Strength, 3, set, lay)
	for _, cb := range cs {
		for _, t := range cb.Terms {
			if t.Case < 0 || t.Case >= e.nOrig {
				return nil, fmt.Errorf("envelope: combination %q refers to case %d of %d", cb.Name, t.Case, e.nOrig)
			}
		}
	}
	if len(env.Service) > 0 {
		d := *e
		d.cs, d.index, d.nEff = pick(cs, env.Service), env.Service, 1
		e.defl = &d
	}
	if lay != nil {
		env.Pieces = lay.Pieces
	}
	env.Members = make([]Member, len(mo.Members))
	errs := make([]error, len(mo.Members))
	// Members are independent: share them out among the processors.
	var wg sync.WaitGroup
	next := make(chan int, len(mo.Members))
	for m := range mo.Members {
		next <- m
	}
	close(next)
	for range min(runtime.GOMAXPROCS(0), len(mo.Members)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := e.scratch()
			for m := range next {
				env.Members[m], errs[m] = e.member(w, sol, m)
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	w := e.scratch()
	components := [3]string{"Fx", "Fy", "M"}
	for v, nd := range mo.Nodes {
		if nd.Support == frame.Free {
			continue
		}
		w.noise = [3]float64{}
		for c := range mo.Cases {
			fx, fy, mz := sol.Reaction(c, v)
			w.ev[c] = [3]float64{fx, fy, mz}
			for j, r := range w.ev[c] {
				w.noise[j] = math.Max(w.noise[j], math.Abs(r))
			}
		}
		for j := range w.noise {
			w.noise[j] *= roundOff
		}
		x := e.station(w)
		if !allFinite(&x, 3) {
			return nil, e.nonFinite(w, func(q int) string { return fmt.Sprintf("%s at node %q", components[q], nd.Name) })
		}
		env.Reactions = append(env.Reactions, Reaction{Node: v, Fx: x[0], Fy: x[1], M: x[2]})
	}
	return env, nil
}

// evaluator holds what is fixed for one Compute call and one kind of
// envelope: forces over the strength combinations, or deflections over
// the service ones.
type evaluator struct {
	mo        *frame.Model         // the model solved (the layout's, with patterns)
	cs        []combos.Combination // the combinations enveloped
	index     []int                // their indices in the combinations given to Compute
	nEff      int                  // effects enveloped: 3 (N, V, M) or 1 (deflection)
	defl      *evaluator           // the deflections' evaluator, nil without service combinations
	set       Settings
	lay       *patterns.Layout
	nOrig     int    // original cases, leading the columns
	always    []bool // column acts whatever its sign (permanent, or as written)
	patternOf []int  // original case → index into lay.Patterned, or -1
	first     []int  // column of each patterned case's first unit; its units follow in order
	mode      patterns.Mode
}

func newEvaluator(mo *frame.Model, cs []combos.Combination, idx []int, nEff int, set Settings, lay *patterns.Layout) *evaluator {
	e := &evaluator{mo: mo, cs: pick(cs, idx), index: idx, nEff: nEff, set: set, lay: lay, nOrig: len(mo.Cases)}
	if lay != nil {
		e.mode = lay.Mode
		for _, p := range lay.Patterned {
			e.nOrig -= len(p.Units)
		}
	}
	if len(set.Kinds) != e.nOrig {
		panic(fmt.Sprintf("envelope: Settings.Kinds gives %d kinds for %d load cases", len(set.Kinds), e.nOrig))
	}
	e.always = make([]bool, len(mo.Cases))
	for c := range e.nOrig {
		e.always[c] = set.AsWritten || set.Kinds[c].Permanent()
	}
	e.patternOf = make([]int, e.nOrig)
	for c := range e.patternOf {
		e.patternOf[c] = -1
	}
	if lay != nil {
		for i, p := range lay.Patterned {
			e.patternOf[p.Case] = i
			if len(p.Units) == 0 {
				e.first = append(e.first, 0)
				continue
			}
			e.first = append(e.first, p.Units[0].Column)
			for k, u := range p.Units {
				if u.Column != p.Units[0].Column+k {
					panic("envelope: a patterned case's units are not consecutive columns")
				}
			}
		}
	}
	return e
}

// work is one goroutine's scratch space.
type work struct {
	xs    []float64          // station positions of the current member
	extra []bool             // whether each was asked for by Settings.Extra
	at    []frame.Forces     // every column at every station of the member
	defl  []float64          // every column's deflection at every station
	line  []float64          // every column's deflection across the member's line
	start []frame.Forces     // every column's point loads at the member's start
	noise [3]float64         // effects of a piece at or below these are round-off
	ev    [][3]float64       // effects of every column at the station
	sum   [][3][2][3]float64 // exact: per patterned case, effect, sign: sum of same-signed units
	big   [][3][2]float64    // exact: largest single |effect| in each of those sets
	best  [][3][2]int        // code: unit with the largest (sign 0) and smallest (sign 1) effect
	tmp   [6][]int           // spans being collected: max and min of N, V, M
	cand  [6][]candidate     // exact: loaded pieces that may be listed

	// exact: per patterned case, effect and sign, how many units are of that
	// sign and the most influential of them (min-heaps of unit indices).
	count [][3][2]int
	top   [][3][2][]candidate
	limit int // most pieces listed: maxSpans, or unlimited with AllSpans
}

func (e *evaluator) scratch() *work {
	w := &work{ev: make([][3]float64, e.nOrig)}
	if e.lay != nil {
		w.ev = make([][3]float64, len(e.lay.Model.Cases))
		n := len(e.lay.Patterned)
		w.sum, w.big, w.best = make([][3][2][3]float64, n), make([][3][2]float64, n), make([][3][2]int, n)
		w.count, w.top = make([][3][2]int, n), make([][3][2][]candidate, n)
	}
	w.limit = maxSpans
	if e.set.AllSpans {
		w.limit = math.MaxInt
	}
	return w
}

// member envelopes the stations of member m.
func (e *evaluator) member(w *work, sol *frame.Solution, m int) (Member, error) {
	l := sol.Model().Length(m)
	var extra []float64
	if m < len(e.set.Extra) {
		extra = e.set.Extra[m]
	}
	w.stations(l, e.set.Stations, extra)
	ns, nc := len(w.xs), len(w.ev)
	w.at = grow(w.at, ns*nc)
	if e.defl != nil {
		w.defl = grow(w.defl, ns*nc)
		sol.StationsAndDeflectionsTo(w.at, w.defl, m, w.xs)
	} else {
		sol.StationsTo(w.at, m, w.xs)
	}
	// The first station is at x = 0: take it inside the member, past any
	// point load at its start.
	w.start = grow(w.start, nc)
	sol.StartLoadsTo(w.start, m)
	for c, f := range w.start {
		w.at[c*ns].N += f.N
		w.at[c*ns].V += f.V
	}
	var line Line
	if e.defl != nil && m < len(e.set.Lines) {
		line = e.set.Lines[m]
	}
	if !line.none() {
		w.line = grow(w.line, ns*nc)
		lineDeflectionsTo(w.line, w.defl, sol, m, line, w.xs)
	}
	// Round-off: only pattern pieces are judged by it.
	patterned := e.lay != nil && len(e.lay.Patterned) > 0
	var noise [3]float64
	var noiseDefl, noiseLine float64
	if patterned {
		for _, f := range w.at {
			// Plain comparisons: math.Max's care for NaN and signed zeros
			// costs a third of the envelope's time here.
			if a := math.Abs(f.N); a > noise[0] {
				noise[0] = a
			}
			if a := math.Abs(f.V); a > noise[1] {
				noise[1] = a
			}
			if a := math.Abs(f.M); a > noise[2] {
				noise[2] = a
			}
		}
		if e.defl != nil {
			noiseDefl = largest(w.defl)
		}
		if !line.none() {
			noiseLine = largest(w.line)
		}
		for j := range noise {
			noise[j] *= roundOff
		}
		noiseDefl *= roundOff
		noiseLine *= roundOff
	}
	name := sol.Model().Members[m].Name
	effects := [3]string{"N", "V", "M"}
	st := make([]Station, ns)
	var defl, lineDefl []Extreme
	if e.defl != nil {
		defl = make([]Extreme, ns)
	}
	if !line.none() {
		lineDefl = make([]Extreme, ns)
	}
	for i, x := range w.xs {
		for c := range w.ev {
			f := w.at[c*ns+i]
			w.ev[c] = [3]float64{f.N, f.V, f.M}
		}
		w.noise = noise
		ex := e.station(w)
		if !allFinite(&ex, 3) {
			return Member{}, e.nonFinite(w, func(q int) string { return fmt.Sprintf("%s of member %q at x = %g", effects[q], name, x) })
		}
		st[i] = Station{X: x, Extra: w.extra[i], N: ex[0], V: ex[1], M: ex[2]}
		for _, d := range [2]struct {
			vals  []float64
			noise float64
			dst   []Extreme
			what  string
		}{{w.defl, noiseDefl, defl, ""}, {w.line, noiseLine, lineDefl, " across its line"}} {
			if d.dst == nil {
				continue
			}
			for c := range w.ev {
				w.ev[c] = [3]float64{d.vals[c*ns+i], 0, 0}
			}
			w.noise = [3]float64{d.noise}
			ex := e.defl.station(w)
			if !allFinite(&ex, 1) {
				return Member{}, e.defl.nonFinite(w, func(int) string { return fmt.Sprintf("the deflection of member %q at x = %g%s", name, x, d.what) })
			}
			ex[0].MaxWith, ex[0].MinWith = [3]float64{}, [3]float64{}
			d.dst[i] = ex[0]
		}
	}
	if e.set.Progress != nil {
		e.set.Progress.Add(int64(ns))
	}
	return Member{Member: m, Stations: st, Deflection: defl, LineDeflection: lineDefl}, nil
}

// largest returns the largest magnitude in v.
func largest(v []float64) float64 {
	a := 0.0
	for _, x := range v {
		if b := math.Abs(x); b > a {
			a = b
		}
	}
	return a
}

// station forms the three extremes from the column effects in w.ev.
func (e *evaluator) station(w *work) [3]Extreme {
	e.aggregate(w)
	out := [3]Extreme{empty(), empty(), empty()}
	for k := range e.cs {
		for j := range e.nEff {
			if hi := e.contrib(w, k, j, true); hi[j] > out[j].Max {
				out[j].Max, out[j].MaxBy, out[j].MaxWith = hi[j], k, hi
			}
			if lo := e.contrib(w, k, j, false); lo[j] < out[j].Min {
				out[j].Min, out[j].MinBy, out[j].MinWith = lo[j], k, lo
			}
		}
	}
	if e.lay != nil && len(e.lay.Patterned) > 0 {
		e.spans(w, &out)
	}
	// Name the combinations by their index in Compute's list.
	for j := range e.nEff {
		if out[j].MaxBy >= 0 {
			out[j].MaxBy = e.index[out[j].MaxBy]
		}
		if out[j].MinBy >= 0 {
			out[j].MinBy = e.index[out[j].MinBy]
		}
	}
	return out
}

// aggregate prepares, for each patterned case, what every combination
// needs of its units: in exact mode the sums of the units whose effect is
// positive and of those whose effect is negative, for each effect, and the
// largest single magnitude in each; in code mode the units with the largest
// and the smallest effect.
func (e *evaluator) aggregate(w *work) {
	if e.lay == nil {
		return
	}
	for p, pc := range e.lay.Patterned {
		units := w.ev[e.first[p] : e.first[p]+len(pc.Units)]
		switch e.mode {
		case patterns.Exact:
			// One pass: the sums, the largest magnitudes, how many units
			// are of each sign, and the most influential units of each
			// sign, for the spans lists.
			var sum [3][2][3]float64
			var big [3][2]float64
			var count [3][2]int
			top := &w.top[p]
			for j := range top {
				top[j][0], top[j][1] = top[j][0][:0], top[j][1][:0]
			}
			// Only the positive sums (and those of round-off) are
			// accumulated; the negative ones are the total less them.
			var tot [3]float64
			var zero [3][3]float64
			var thr [3][2]float64
			for i, v := range units {
				tot[0] += v[0]
				tot[1] += v[1]
				tot[2] += v[2]
				for j := range e.nEff {
					x := v[j]
					s, a := 0, x
					switch {
					case x > w.noise[j]:
						t := &sum[j][0]
						t[0] += v[0]
						t[1] += v[1]
						t[2] += v[2]
					case x < -w.noise[j]:
						s, a = 1, -x
					default:
						z := &zero[j]
						z[0] += v[0]
						z[1] += v[1]
						z[2] += v[2]
						continue
					}
					count[j][s]++
					if a > big[j][s] {
						big[j][s] = a
					}
					// thr is what a unit must reach to be listed: spanShare of
					// the largest so far and, once the heap is full, more than
					// its smallest. Most units fall short at this one test.
					if a >= thr[j][s] {
						h := keepLargest(top[j][s], candidate{piece: i, a: a}, w.limit)
						top[j][s] = h
						t := spanShare * big[j][s]
						if len(h) == w.limit && h[0].a > t {
							t = math.Nextafter(h[0].a, math.Inf(1))
						}
						thr[j][s] = t
					}
				}
			}
			for j := range e.nEff {
				for q := range 3 {
					sum[j][1][q] = tot[q] - sum[j][0][q] - zero[j][q]
				}
			}
			w.sum[p], w.big[p], w.count[p] = sum, big, count
		case patterns.Code:
			for j := range e.nEff {
				hi, lo := 0, 0
				for i, v := range units {
					if v[j] > units[hi][j] {
						hi = i
					}
					if v[j] < units[lo][j] {
						lo = i
					}
				}
				w.best[p][j] = [2]int{hi, lo}
			}
		}
	}
}

// contrib returns the forces (N, V, M) of combination k when its loads are
// placed to make effect j largest (hi) or smallest.
func (e *evaluator) contrib(w *work, k, j int, hi bool) [3]float64 {
	var tot [3]float64
	var ex []exTerm // exhaustive pattern terms
	for _, t := range e.cs[k].Terms {
		f, c := t.Factor, t.Case
		// The case as a whole, or a patterned case's rest.
		if v := w.ev[c]; e.always[c] || (hi && f*v[j] > 0) || (!hi && f*v[j] < 0) {
			tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
		}
		p := e.patternOf[c]
		if p < 0 {
			continue
		}
		want := hi == (f >= 0) // the largest unfactored effect is wanted
		switch e.mode {
		case patterns.Exact:
			s := 1
			if want {
				s = 0
			}
			v := w.sum[p][j][s]
			tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
		case patterns.Code:
			if v, ok := e.codeUnit(w, p, j, f, want); ok {
				tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
			}
		case patterns.Exhaustive:
			ex = e.exTerms(w, ex, p, f)
		}
	}
	if len(ex) > 0 {
		best := exhaustive(ex, j, hi, w.noise[j])
		for i, t := range ex {
			if best&(1<<i) != 0 {
				tot[0], tot[1], tot[2] = tot[0]+t.f*t.v[0], tot[1]+t.f*t.v[1], tot[2]+t.f*t.v[2]
			}
		}
	}
	return tot
}

// codeUnit returns the effects of the code arrangement of patterned case p
// chosen for effect j, and whether it acts: with variable loads adverse, an
// arrangement that would relieve the effect is left off.
func (e *evaluator) codeUnit(w *work, p, j int, f float64, want bool) ([3]float64, bool) {
	i := w.best[p][j][1]
	if want {
		i = w.best[p][j][0]
	}
	v := w.ev[e.first[p]+i]
	if math.Abs(v[j]) <= w.noise[j] {
		return v, false // round-off: not loaded
	}
	hi := want == (f >= 0)
	return v, e.set.AsWritten || (hi && f*v[j] > 0) || (!hi && f*v[j] < 0)
}

func (e *evaluator) exTerms(w *work, ex []exTerm, p int, f float64) []exTerm {
	for i, u := range e.lay.Patterned[p].Units {
		ex = append(ex, exTerm{f: f, v: w.ev[e.first[p]+i], pieces: u.Pieces})
	}
	return ex
}

// spans fills in the pattern pieces loaded for each extreme in out. For
// exact placement every adverse piece is loaded (counted in MaxLoaded,
// MinLoaded); the most influential of them are listed, at most maxSpans,
// each with at least spanShare of the largest one's effect (all of them
// with AllSpans). For code arrangements the arrangement's pieces are listed,
// for exhaustive search the pieces of the best subset with at least
// spanShare of the largest one's factored effect. Each patterned case's
// units are scanned once for all the extremes that need them.
func (e *evaluator) spans(w *work, out *[3]Extreme) {
	share, limit := spanShare, w.limit
	if e.set.AllSpans {
		share = 0
	}
	for k := range w.cand {
		w.cand[k] = w.cand[k][:0]
		w.tmp[k] = w.tmp[k][:0]
	}
	var loaded [6]int
	for p, pc := range e.lay.Patterned {
		for j := range e.nEff {
			for side, by := range [2]int{out[j].MaxBy, out[j].MinBy} {
				if by < 0 {
					continue
				}
				k, hi := 2*j+side, side == 0
				// The factor of this case in the winning combination.
				f, has := 0.0, false
				for _, t := range e.cs[by].Terms {
					if t.Case == pc.Case {
						f, has = f+t.Factor, true
					}
				}
				if !has || f == 0 {
					continue
				}
				want := hi == (f >= 0)
				switch e.mode {
				case patterns.Exact:
					s := 1
					if want {
						s = 0
					}
					loaded[k] += w.count[p][j][s]
					cut := share * w.big[p][j][s]
					for _, c := range w.top[p][j][s] {
						if c.a >= cut {
							// Factored, so that pieces of cases with different
							// factors rank fairly against each other.
							w.cand[k] = keepLargest(w.cand[k], candidate{piece: pc.Units[c.piece].Pieces[0], a: c.a * math.Abs(f)}, limit)
						}
					}
				case patterns.Code:
					if _, ok := e.codeUnit(w, p, j, f, want); ok {
						i := w.best[p][j][1]
						if want {
							i = w.best[p][j][0]
						}
						w.tmp[k] = append(w.tmp[k], pc.Units[i].Pieces...)
						loaded[k] += len(pc.Units[i].Pieces)
					}
				case patterns.Exhaustive:
					loaded[k] += e.exhaustiveSpans(w, by, j, hi, p, share, &w.tmp[k])
				}
			}
		}
	}
	total := 0
	for k := range w.tmp {
		if c := w.cand[k]; len(c) > 0 {
			// Exact placement: the most influential first.
			slices.SortFunc(c, func(x, y candidate) int {
				if x.less(y) {
					return 1
				}
				if y.less(x) {
					return -1
				}
				return 0
			})
			// A piece repeats only when a combination names its case twice.
			var seen map[int]bool
			if len(c) > 32 {
				seen = make(map[int]bool, len(c))
			}
			for _, x := range c {
				if seen != nil {
					if seen[x.piece] {
						continue
					}
					seen[x.piece] = true
				} else if slices.Contains(w.tmp[k], x.piece) {
					continue
				}
				w.tmp[k] = append(w.tmp[k], x.piece)
			}
		} else {
			sortUnique(&w.tmp[k])
		}
		total += len(w.tmp[k])
	}
	for j := range 3 {
		out[j].MaxLoaded, out[j].MinLoaded = loaded[2*j], loaded[2*j+1]
	}
	if total == 0 {
		return
	}
	// Copy the lists into one exact-size slice per station: appending to the
	// results directly would grow hundreds of thousands of slices on a tall
	// frame.
	buf := make([]int, total)
	at := 0
	take := func(k int) []int {
		n := copy(buf[at:], w.tmp[k])
		s := buf[at : at+n : at+n]
		at += n
		return s
	}
	for j := range 3 {
		out[j].MaxSpans = take(2 * j)
		out[j].MinSpans = take(2*j + 1)
	}
}

// candidate is a loaded piece and the size of its effect.
type candidate struct {
	piece int
	a     float64
}

// keepLargest adds c to h, a min-heap on a of at most limit candidates,
// dropping the smallest when full: what remains are the limit largest seen.
// Equal sizes keep the earlier piece.
func keepLargest(h []candidate, c candidate, limit int) []candidate {
	if len(h) < limit {
		h = append(h, c)
		for i := len(h) - 1; i > 0; {
			up := (i - 1) / 2
			if !h[i].less(h[up]) {
				break
			}
			h[i], h[up] = h[up], h[i]
			i = up
		}
		return h
	}
	if !h[0].less(c) {
		return h
	}
	h[0] = c
	for i := 0; ; {
		l, r, min := 2*i+1, 2*i+2, i
		if l < len(h) && h[l].less(h[min]) {
			min = l
		}
		if r < len(h) && h[r].less(h[min]) {
			min = r
		}
		if min == i {
			return h
		}
		h[i], h[min] = h[min], h[i]
		i = min
	}
}

// less orders candidates by size, a later piece counting as smaller.
func (c candidate) less(d candidate) bool {
	return c.a < d.a || (c.a == d.a && c.piece > d.piece)
}

// exhaustiveSpans appends to dst the pieces of patterned case p in the best
// subset for combination k, effect j, with at least share of the largest
// one's factored effect, and returns how many of p's pieces that subset loads.
func (e *evaluator) exhaustiveSpans(w *work, k, j int, hi bool, p int, share float64, dst *[]int) int {
	var ex []exTerm
	from := -1
	for _, t := range e.cs[k].Terms {
		if q := e.patternOf[t.Case]; q >= 0 {
			if q == p {
				from = len(ex)
			}
			ex = e.exTerms(w, ex, q, t.Factor)
		}
	}
	if from < 0 {
		return 0
	}
	best := exhaustive(ex, j, hi, w.noise[j])
	big := 0.0
	for i, t := range ex {
		if best&(1<<i) != 0 {
			big = math.Max(big, math.Abs(t.f*t.v[j]))
		}
	}
	n := 0
	for i := from; i < from+len(e.lay.Patterned[p].Units); i++ {
		if best&(1<<i) == 0 {
			continue
		}
		n++
		if t := ex[i]; math.Abs(t.f*t.v[j]) >= share*big {
			*dst = append(*dst, t.pieces...)
		}
	}
	return n
}

// exTerm is one piece's factored contribution in exhaustive mode.
type exTerm struct {
	f      float64
	v      [3]float64
	pieces []int
}

// exhaustive tries every on/off subset of the terms, in Gray-code order so
// that each step switches one piece, and returns the subset (as a bit mask)
// giving the largest (hi) or smallest sum of effect j. Ties keep the
// earlier subset in that order; the empty subset comes first. A term whose
// unfactored effect is at most noise (round-off) is never in the subset.
func exhaustive(ts []exTerm, j int, hi bool, noise float64) uint32 {
	best := bestSubset(ts, j, hi)
	for i, t := range ts {
		if math.Abs(t.v[j]) <= noise {
			best &^= 1 << i
		}
	}
	return best
}

func bestSubset(ts []exTerm, j int, hi bool) uint32 {
	n := len(ts)
	var sum, bestV float64
	var mask, best uint32
	for i := uint32(1); i < 1<<n; i++ {
		b := bits.TrailingZeros32(i)
		mask ^= 1 << b
		v := ts[b].f * ts[b].v[j]
		if mask&(1<<b) != 0 {
			sum += v
		} else {
			sum -= v
		}
		if (hi && sum > bestV) || (!hi && sum < bestV) {
			bestV, best = sum, mask
		}
	}
	return best
}

// sortUnique sorts s and removes repeats; lists are usually sorted already.
func sortUnique(s *[]int) {
	if !slices.IsSorted(*s) {
		slices.Sort(*s)
	}
	*s = slices.Compact(*s)
}
