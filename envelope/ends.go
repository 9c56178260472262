package envelope

import (
	"fmt"
	"math"
	"slices"

	"govern/combos"

	"govern/frame"
	"govern/patterns"
)

// stateTol is the fraction of the largest size of an effect in the member
// within which the state formed again must give the extreme it is asked
// for: the same sums in the same order give it to the last bit, but the
// check must not fail on the last bit.
const stateTol = 1e-9

// EndMoments returns the moments at the start and at the end of member m
// (its own axes, as in Station.M) in the state that gives an extreme of
// effect j (0 N, 1 V, 2 M) at the station at x: combination k (an index
// into cs), with its variable cases and pattern pieces
// placed as Compute placed them to make that effect largest (hi) or
// smallest there. want is the extreme's value, which the state must give
// again; ok is false when it does not (a station that is not one of the
// member's, or another combination), and the ends are then zero. sol,
// cs, set and lay must be those Compute was given; none is modified.
//
// A variable case, a patterned case's piece or arrangement acts or not by
// the sign of its effect j at x alone, so the same decisions, applied to
// the effects at the member's ends, give the ends' moments of the state.
func EndMoments(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout, m int, x float64, k, j int, hi bool, want float64) (ends [2]float64, ok bool) {
	r := EndMomentsOf(sol, cs, set, lay, m, []State{{X: x, By: k, Effect: j, Hi: hi, Want: want}})
	return r[0].Ends, r[0].OK
}

// State names the state of an extreme of a member's envelope: the
// station at X, effect Effect (0 N, 1 V, 2 M) made largest (Hi) or
// smallest by combination By (an index into the combinations), with the
// value Want; and, once found, the member's end moments in it.
type State struct {
	X          float64
	By, Effect int
	Hi         bool
	Want       float64
	Ends       [2]float64 // filled by EndMomentsOf
	OK         bool       // filled by EndMomentsOf: the state gave Want again
}

// EndMomentsOf is EndMoments for several states of member m at once: the
// member is evaluated once. It returns the states with Ends and OK set;
// states is not modified.
func EndMomentsOf(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout, m int, states []State) []State {
	return NewEndsFinder(sol, cs, set, lay).Of(m, states)
}

// An EndsFinder is EndMomentsOf for the members of one solution, one after
// the other, with the evaluator and its scratch space formed once: a
// design table asks for the states of every member. It is not for
// concurrent use; sol, cs, set and lay must be those Compute was given.
type EndsFinder struct {
	sol *frame.Solution
	e   *evaluator
	w   *work
}

// NewEndsFinder returns an EndsFinder (see EndMomentsOf).
func NewEndsFinder(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout) *EndsFinder {
	f := &EndsFinder{sol: sol}
	if len(cs) == 0 {
		return f
	}
	set.Progress = nil
	all := make([]int, len(cs))
	for k := range all {
		all[k] = k
	}
	f.e = newEvaluator(sol.Model(), cs, all, 3, set, lay)
	if set.Factors != nil {
		f.e.setFactors(set.Factors, cs)
	}
	f.w = f.e.scratch()
	return f
}

// Of is EndMomentsOf for member m.
func (f *EndsFinder) Of(m int, states []State) []State {
	out := slices.Clone(states)
	if f.e == nil || m < 0 || m >= len(f.sol.Model().Members) {
		return out
	}
	f.e.placeStations(f.w, f.sol, m)
	if pl, ok := f.e.foldable(f.w, f.sol, m); ok && pl != nil {
		f.e.evaluateFor(f.w, f.sol, m, out)
	} else {
		f.e.evaluate(f.w, f.sol, m)
	}
	for q := range out {
		out[q].Ends, out[q].OK = f.e.endMoments(f.w, m, &out[q])
	}
	return out
}

// endMoments finds the end moments of state s of member m, evaluated in
// w (see EndMoments). With member factors (Settings.Factors) the columns
// are scaled as Compute scales them, by the factors of the part of the
// combinations s.By is in.
func (e *evaluator) endMoments(w *work, m int, s *State) ([2]float64, bool) {
	j, k, hi, want := s.Effect, s.By, s.Hi, s.Want
	if j < 0 || j > 2 || k < 0 || k >= len(e.cs) {
		return [2]float64{}, false
	}
	for _, p := range e.parts {
		if i := slices.Index(p.index, k); i >= 0 {
			e, k = p, i
			break
		}
	}
	var fac [][3]float64
	if e.fac != nil {
		fac = e.fac[m]
	}
	one := [3]float64{1, 1, 1}
	ns := len(w.xs)
	i := slices.Index(w.xs, s.X)
	if i < 0 {
		return [2]float64{}, false
	}
	// The two slots other than j carry the ends' moments through the
	// placement: its decisions read slot j only.
	a, b := (j+1)%3, (j+2)%3
	if a > b {
		a, b = b, a
	}
	// The largest the sum could be, term by term, for the tolerance.
	scale := 0.0
	fmax := 0.0
	for _, t := range e.cs[k].Terms {
		fmax = math.Max(fmax, math.Abs(t.Factor))
	}
	for c := range w.ev {
		scale += fmax * math.Abs(eff(w.at[c*ns+i], j))
	}
	for _, past := range []bool{false, true} {
		if past && (j != 2 || !w.jumps) {
			break
		}
		for c := range w.ev {
			f := &one
			if fac != nil {
				f = &fac[e.caseOf[c]]
			}
			var v [3]float64
			v[j] = eff(w.at[c*ns+i], j)
			if past {
				v[j] += w.jump[c*ns+i]
			}
			v[j] *= f[j]
			v[a], v[b] = f[2]*w.at[c*ns].M, f[2]*w.at[c*ns+ns-1].M
			w.ev[c] = v
		}
		w.noise = w.noiseAt
		// Only effect j decides, and only its sums are combined.
		w.only = j + 1
		w.place.scan(e, w)
		w.only = 0
		tot := w.place.combine(e, w, k, j, hi)
		if math.Abs(tot[j]-want) <= stateTol*(scale+math.Abs(want)) {
			return [2]float64{tot[a], tot[b]}, true
		}
	}
	return [2]float64{}, false
}

// eff returns effect j (N, V, M) of f.
func eff(f frame.Forces, j int) float64 {
	switch j {
	case 0:
		return f.N
	case 1:
		return f.V
	}
	return f.M
}

// StationsAt returns the envelopes of member m at the points xs (distances
// from its start, on the member), over the strength combinations of cs as
// Compute forms them: the member is enveloped again with xs as extra
// stations (Settings.Extra), and the station at each point returned, in
// the order of xs. A point within round-off of another station gives that
// station. sol, cs, set and lay must be those Compute was given; none is
// modified.
func StationsAt(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout, m int, xs []float64) ([]Station, error) {
	mo := sol.Model()
	if m < 0 || m >= len(mo.Members) {
		panic(fmt.Sprintf("envelope: StationsAt: member %d of %d", m, len(mo.Members)))
	}
	l := mo.Length(m)
	for _, x := range xs {
		if !(x >= 0 && x <= l) {
			return nil, fmt.Errorf("envelope: member %q: station at %g is not on the member (length %g)", mo.Members[m].Name, x, l)
		}
	}
	extra := slices.Clone(xs)
	if m < len(set.Extra) {
		extra = append(extra, set.Extra[m]...)
	}
	set.Extra = make([][]float64, m+1)
	set.Extra[m] = extra
	set.Progress, set.Lines = nil, nil
	strength, _ := split(cs)
	e := newEvaluator(mo, cs, strength, 3, set, lay)
	if set.Factors != nil {
		e.setFactors(set.Factors, cs)
	}
	em, err := e.member(e.scratch(), sol, m)
	if err != nil {
		return nil, err
	}
	out := make([]Station, len(xs))
	for k, x := range xs {
		best := 0
		for i, st := range em.Stations {
			if math.Abs(st.X-x) < math.Abs(em.Stations[best].X-x) {
				best = i
			}
		}
		out[k] = em.Stations[best]
	}
	return out, nil
}

// evaluateFor is evaluate for the states of member m alone, the member
// folded (fold.go): every column's forces at the stations the states ask
// for and at the ends, which is all endMoments reads, from the same
// numbers evaluate forms (the fold's exact values, and N = −f0, V = f1,
// M = −f2 + x·f1 for a column that does not load the member), with the
// same round-off threshold. Stations the states do not name are left as
// they were. No concentrated moment acts at a station (foldable).
func (e *evaluator) evaluateFor(w *work, sol *frame.Solution, m int, states []State) {
	w.fold.load(e, w, sol, m)
	w.jumps = false
	ns, nc := len(w.xs), len(w.ev)
	w.at = grow(w.at, ns*nc)
	need := []int{0, ns - 1}
	for _, s := range states {
		if i := slices.Index(w.xs, s.X); i >= 0 {
			need = append(need, i)
		}
	}
	f := &w.fold
	for c := range nc {
		row := w.at[c*ns : (c+1)*ns]
		if c < e.nOrig {
			for _, i := range need {
				row[i] = f.orig[c*ns+i]
			}
			continue
		}
		p := e.unitCase[c-e.nOrig]
		fc := &f.cases[p]
		if k, own := slices.BinarySearch(fc.own, c-e.first[p]); own {
			for _, i := range need {
				row[i] = fc.ownAt[k*ns+i]
			}
			continue
		}
		g := &f.ends[c]
		for _, i := range need {
			row[i] = frame.Forces{N: -g[0], V: g[1], M: -g[2] + w.xs[i]*g[1]}
		}
	}
}
