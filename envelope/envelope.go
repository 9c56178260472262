package envelope

import (
	"errors"
	"fmt"
	"math"
	"math/bits"
	"runtime"
	"slices"
	"sync"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// Extreme is the largest and smallest value of one force over all
// combinations (and, for patterned cases, arrangements), with the index of
// the combination that gives each, the forces acting at the same place in
// that same loading, and the pattern pieces it loads.
type Extreme struct {
	Max      float64
	MaxBy    int
	MaxWith  [3]float64 // N, V, M (Fx, Fy, M for a reaction) acting with Max
	MaxSpans []int      // pattern pieces loaded for Max, indices into Envelope.Pieces
	Min      float64
	MinBy    int
	MinWith  [3]float64
	MinSpans []int
}

// empty returns an Extreme that any value replaces.
func empty() Extreme {
	return Extreme{Max: math.Inf(-1), MaxBy: -1, Min: math.Inf(1), MinBy: -1}
}

// Station holds the envelopes at one point of a member.
type Station struct {
	X       float64 // distance from the start node
	N, V, M Extreme
}

// Member holds the stations of one member, sorted by X.
type Member struct {
	Member   int // index into the model's members
	Stations []Station
}

// Reaction holds the envelopes of the reaction at one supported node.
// Components the support does not restrain are zero.
type Reaction struct {
	Node      int // index into the model's nodes
	Fx, Fy, M Extreme
}

// Settings control how envelopes are formed.
type Settings struct {
	// Stations is the number of equally spaced stations per member, both
	// ends included; at least 2.
	Stations int
	// AsWritten makes every case of a combination act with its factor
	// everywhere, instead of variable cases acting only where adverse.
	// Pieces of a case patterned "exact" or "exhaustive" are still placed
	// where adverse: that is what patterning asks for.
	AsWritten bool
	// AllSpans lists every loaded piece in MaxSpans and MinSpans, not only
	// those with at least spanShare of the largest piece's effect.
	AllSpans bool
}

// Envelope is the result of [Compute].
type Envelope struct {
	Settings     Settings
	Combinations []combos.Combination
	Pieces       []patterns.Piece // the pattern pieces spans refer to; nil without patterns
	Members      []Member
	Reactions    []Reaction
}

// ErrNoCombinations is returned when there is nothing to envelope.
var ErrNoCombinations = errors.New("envelope: no load combinations")

// spanShare is the smallest share of the largest single piece's
// contribution for which a loaded piece is listed in MaxSpans or MinSpans.
// Pieces with less influence are loaded too (exact placement puts every
// adverse piece on) but are not named, so that the lists of a tall frame
// stay readable.
const spanShare = 0.01

// Compute forms the envelopes of every member and support over the
// combinations cs. sol must be the solution of lay.Model when lay is not
// nil (pattern loading), or of the model itself when lay is nil.
// Combination terms refer to the original cases, which lead the expanded
// model's cases.
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
	e := newEvaluator(mo, cs, set, lay)
	for _, cb := range cs {
		for _, t := range cb.Terms {
			if t.Case < 0 || t.Case >= e.nOrig {
				return nil, fmt.Errorf("envelope: combination %q refers to case %d of %d", cb.Name, t.Case, e.nOrig)
			}
		}
	}
	env := &Envelope{Settings: set, Combinations: cs}
	if lay != nil {
		env.Pieces = lay.Pieces
	}
	env.Members = make([]Member, len(mo.Members))
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
				env.Members[m] = e.member(w, sol, m)
			}
		}()
	}
	wg.Wait()
	w := e.scratch()
	for v, nd := range mo.Nodes {
		if nd.Support == frame.Free {
			continue
		}
		for c := range mo.Cases {
			fx, fy, mz := sol.Reaction(c, v)
			w.ev[c] = [3]float64{fx, fy, mz}
		}
		x := e.station(w)
		env.Reactions = append(env.Reactions, Reaction{Node: v, Fx: x[0], Fy: x[1], M: x[2]})
	}
	return env, nil
}

// evaluator holds what is fixed for one Compute call.
type evaluator struct {
	cs        []combos.Combination
	set       Settings
	lay       *patterns.Layout
	nOrig     int    // original cases, leading the columns
	always    []bool // column acts whatever its sign (permanent, or as written)
	patternOf []int  // original case → index into lay.Patterned, or -1
	mode      patterns.Mode
}

func newEvaluator(mo *frame.Model, cs []combos.Combination, set Settings, lay *patterns.Layout) *evaluator {
	e := &evaluator{cs: cs, set: set, lay: lay, nOrig: len(mo.Cases)}
	e.always = make([]bool, len(mo.Cases))
	for c := range mo.Cases {
		e.always[c] = set.AsWritten || !mo.Cases[c].Variable()
	}
	if lay != nil {
		e.mode = lay.Mode
		for _, p := range lay.Patterned {
			e.nOrig -= len(p.Units)
		}
	}
	e.patternOf = make([]int, e.nOrig)
	for c := range e.patternOf {
		e.patternOf[c] = -1
	}
	if lay != nil {
		for i, p := range lay.Patterned {
			e.patternOf[p.Case] = i
		}
	}
	return e
}

// work is one goroutine's scratch space.
type work struct {
	ev   [][3]float64       // effects of every column at the station
	sum  [][3][2][3]float64 // exact: per patterned case, effect, sign: sum of same-signed units
	big  [][3][2]float64    // exact: largest single |effect| in each of those sets
	best [][3][2]int        // code: unit with the largest (sign 0) and smallest (sign 1) effect
}

func (e *evaluator) scratch() *work {
	w := &work{ev: make([][3]float64, e.nOrig)}
	if e.lay != nil {
		w.ev = make([][3]float64, len(e.lay.Model.Cases))
		n := len(e.lay.Patterned)
		w.sum, w.big, w.best = make([][3][2][3]float64, n), make([][3][2]float64, n), make([][3][2]int, n)
	}
	return w
}

func (e *evaluator) member(w *work, sol *frame.Solution, m int) Member {
	mo := sol.Model()
	l := mo.Length(m)
	st := make([]Station, e.set.Stations)
	for i := range st {
		x := l * float64(i) / float64(e.set.Stations-1)
		if i == e.set.Stations-1 {
			x = l // exactly the end, whatever the rounding
		}
		for c := range w.ev {
			f := sol.At(c, m, x)
			w.ev[c] = [3]float64{f.N, f.V, f.M}
		}
		ex := e.station(w)
		st[i] = Station{X: x, N: ex[0], V: ex[1], M: ex[2]}
	}
	return Member{Member: m, Stations: st}
}

// station forms the three extremes from the column effects in w.ev.
func (e *evaluator) station(w *work) [3]Extreme {
	e.aggregate(w)
	out := [3]Extreme{empty(), empty(), empty()}
	for k := range e.cs {
		for j := range 3 {
			if hi := e.contrib(w, k, j, true, nil); hi[j] > out[j].Max {
				out[j].Max, out[j].MaxBy, out[j].MaxWith = hi[j], k, hi
			}
			if lo := e.contrib(w, k, j, false, nil); lo[j] < out[j].Min {
				out[j].Min, out[j].MinBy, out[j].MinWith = lo[j], k, lo
			}
		}
	}
	if e.lay != nil && len(e.lay.Patterned) > 0 {
		for j := range 3 {
			if out[j].MaxBy >= 0 {
				e.contrib(w, out[j].MaxBy, j, true, &out[j].MaxSpans)
			}
			if out[j].MinBy >= 0 {
				e.contrib(w, out[j].MinBy, j, false, &out[j].MinSpans)
			}
		}
	}
	return out
}

// aggregate prepares, for each patterned case, what every combination
// needs of its units: in exact mode the sums of the units whose effect is
// positive and of those whose effect is negative, for each effect; in code
// mode the units with the largest and the smallest effect.
func (e *evaluator) aggregate(w *work) {
	if e.lay == nil {
		return
	}
	for p, pc := range e.lay.Patterned {
		switch e.mode {
		case patterns.Exact:
			w.sum[p], w.big[p] = [3][2][3]float64{}, [3][2]float64{}
			for _, u := range pc.Units {
				v := w.ev[u.Column]
				for j := range 3 {
					s := 0
					if v[j] < 0 {
						s = 1
					} else if v[j] == 0 {
						continue
					}
					for q := range 3 {
						w.sum[p][j][s][q] += v[q]
					}
					w.big[p][j][s] = math.Max(w.big[p][j][s], math.Abs(v[j]))
				}
			}
		case patterns.Code:
			for j := range 3 {
				hi, lo := 0, 0
				for i, u := range pc.Units {
					v := w.ev[u.Column][j]
					if v > w.ev[pc.Units[hi].Column][j] {
						hi = i
					}
					if v < w.ev[pc.Units[lo].Column][j] {
						lo = i
					}
				}
				w.best[p][j] = [2]int{hi, lo}
			}
		}
	}
}

// contrib returns the forces (N, V, M) of combination k when its loads are
// placed to make effect j largest (hi) or smallest. When spans is not nil it
// also lists the pattern pieces loaded.
func (e *evaluator) contrib(w *work, k, j int, hi bool, spans *[]int) [3]float64 {
	var tot [3]float64
	add := func(f float64, v [3]float64) {
		for q := range 3 {
			tot[q] += f * v[q]
		}
	}
	adverse := func(f, v float64) bool { return (hi && f*v > 0) || (!hi && f*v < 0) }
	var ex []exTerm // exhaustive pattern terms
	for _, t := range e.cs[k].Terms {
		f, c := t.Factor, t.Case
		// The case as a whole, or a patterned case's rest.
		if e.always[c] || adverse(f, w.ev[c][j]) {
			add(f, w.ev[c])
		}
		p := e.patternOf[c]
		if p < 0 {
			continue
		}
		pc := &e.lay.Patterned[p]
		want := hi == (f >= 0) // want the largest unpatterned effect
		switch e.mode {
		case patterns.Exact:
			s := 1
			if want {
				s = 0
			}
			add(f, w.sum[p][j][s])
			if spans != nil {
				cut := spanShare * w.big[p][j][s]
				if e.set.AllSpans {
					cut = 0
				}
				for _, u := range pc.Units {
					if v := w.ev[u.Column][j]; (s == 0 && v > 0 || s == 1 && v < 0) && math.Abs(v) >= cut {
						*spans = append(*spans, u.Pieces...)
					}
				}
			}
		case patterns.Code:
			i := w.best[p][j][1]
			if want {
				i = w.best[p][j][0]
			}
			u := pc.Units[i]
			if e.set.AsWritten || adverse(f, w.ev[u.Column][j]) {
				add(f, w.ev[u.Column])
				if spans != nil {
					*spans = append(*spans, u.Pieces...)
				}
			}
		case patterns.Exhaustive:
			for _, u := range pc.Units {
				ex = append(ex, exTerm{f: f, v: w.ev[u.Column], pieces: u.Pieces})
			}
		}
	}
	if len(ex) > 0 {
		best := exhaustive(ex, j, hi)
		for i, t := range ex {
			if best&(1<<i) != 0 {
				add(t.f, t.v)
			}
		}
		if spans != nil {
			big := 0.0
			share := spanShare
			if e.set.AllSpans {
				share = 0
			}
			for i, t := range ex {
				if best&(1<<i) != 0 {
					big = math.Max(big, math.Abs(t.f*t.v[j]))
				}
			}
			for i, t := range ex {
				if best&(1<<i) != 0 && math.Abs(t.f*t.v[j]) >= share*big {
					*spans = append(*spans, t.pieces...)
				}
			}
		}
	}
	if spans != nil {
		sortUnique(spans)
	}
	return tot
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
// earlier subset in that order; the empty subset comes first.
func exhaustive(ts []exTerm, j int, hi bool) uint32 {
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

func sortUnique(s *[]int) {
	slices.Sort(*s)
	*s = slices.Compact(*s)
}
