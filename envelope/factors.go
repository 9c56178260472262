package envelope

import (
	"fmt"
	"math"
	"slices"

	"govern/combos"
	"govern/frame"
)

// Factors scale the effects of load cases in members before they are
// combined, such as the factors of live load reduction (package
// envelope/reduction): in member m, case c's N, V and M are multiplied by
// Of[m][c] in every combination and every pattern piece of the case,
// except that in a combination where c does not lead ([Leads])
// Accompanying[m][c] is taken instead when Accompanying gives one for m
// (EN 1991-1-1 6.3.1.2(11): αn only where the imposed load leads).
//
// A reaction is formed from the end forces of the members meeting at the
// support, each scaled by its member's factors for the same load case
// (N along the member, V across it, M), less the loads applied at the
// node; a case scaled in no member there keeps its reaction as solved.
// Deflections are never scaled.
type Factors struct {
	// Of[m], when not nil, holds one entry per load case of
	// Settings.Kinds: the factors on N, V and M. Members past its end,
	// or with nil, are not scaled.
	Of [][][3]float64
	// Accompanying[m], when not nil, replaces Of[m] in the combinations
	// where a case does not lead. Nil, or members past its end: Of
	// applies in every combination.
	Accompanying [][][3]float64
}

// Scale returns the factors on N, V and M of original case c in member m
// in a combination where c leads (lead) or does not: Accompanying[m][c]
// where c does not lead and Accompanying gives a row for m, else
// Of[m][c], else 1 for each.
func (f *Factors) Scale(m, c int, lead bool) [3]float64 {
	if f == nil {
		return [3]float64{1, 1, 1}
	}
	if !lead && m < len(f.Accompanying) && f.Accompanying[m] != nil {
		return f.Accompanying[m][c]
	}
	if m < len(f.Of) && f.Of[m] != nil {
		return f.Of[m][c]
	}
	return [3]float64{1, 1, 1}
}

// Leads reports whether case c leads in combination cb: is one of its
// Lead cases, when the combination names them; otherwise (a combination
// written in a model, or a case alone) when c has a term whose factor is
// at least as large in size as that of every other variable case (kinds
// gives each case's kind).
func Leads(cb *combos.Combination, c int, kinds []combos.Kind) bool {
	if cb.Lead != nil {
		return slices.Contains(cb.Lead, c)
	}
	own, largest := -1.0, 0.0
	for _, t := range cb.Terms {
		if t.Case == c {
			own = math.Max(own, math.Abs(t.Factor))
		} else if t.Case < len(kinds) && !kinds[t.Case].Permanent() {
			largest = math.Max(largest, math.Abs(t.Factor))
		}
	}
	return own > 0 && own >= largest
}

// check returns an error for factors that do not fit model mo with nOrig
// original cases.
func (f *Factors) check(mo *frame.Model, nOrig int) error {
	for _, tab := range [2][][][3]float64{f.Of, f.Accompanying} {
		if len(tab) > len(mo.Members) {
			return fmt.Errorf("envelope: factors for %d members; the model has %d", len(tab), len(mo.Members))
		}
		for m, row := range tab {
			if row == nil {
				continue
			}
			if len(row) != nOrig {
				return fmt.Errorf("envelope: member %q: factors for %d load cases; there are %d", mo.Members[m].Name, len(row), nOrig)
			}
			for c, s := range row {
				for _, v := range s {
					if !(v >= 0) || math.IsInf(v, 0) {
						return fmt.Errorf("envelope: member %q, case %d: factor %v is not a number at least 0", mo.Members[m].Name, c, v)
					}
				}
			}
		}
	}
	return nil
}

// setFactors gives e the factors of set.Factors: one table when they do
// not depend on the combination, else one part of e for each set of
// combinations that agree on which scaled cases lead, each with its own
// table (forces and reaction merge the parts' extremes).
// cs is the whole list of combinations given to Compute.
func (e *evaluator) setFactors(f *Factors, cs []combos.Combination) {
	table := func(lead func(c int) bool) [][][3]float64 {
		out := make([][][3]float64, len(e.mo.Members))
		for m := range out {
			var of, acc [][3]float64
			if m < len(f.Of) {
				of = f.Of[m]
			}
			if m < len(f.Accompanying) {
				acc = f.Accompanying[m]
			}
			if of == nil && acc == nil {
				continue
			}
			row := make([][3]float64, e.nOrig)
			for c := range row {
				row[c] = [3]float64{1, 1, 1}
				switch {
				case acc != nil && !lead(c):
					row[c] = acc[c]
				case of != nil:
					row[c] = of[c]
				}
			}
			out[m] = row
		}
		return out
	}
	// The cases whose factor depends on the combination.
	var varying []int
	for c := range e.nOrig {
		for m, row := range f.Accompanying {
			of := [3]float64{1, 1, 1}
			if m < len(f.Of) && f.Of[m] != nil {
				of = f.Of[m][c]
			}
			if row != nil && row[c] != of {
				varying = append(varying, c)
				break
			}
		}
	}
	if len(varying) == 0 {
		e.fac = table(func(int) bool { return true })
		return
	}
	// Group the combinations by which of those cases lead in them.
	keys := map[string]int{}
	var idx [][]int
	var leads [][]bool
	for k := range e.cs {
		key := make([]byte, len(varying))
		l := make([]bool, e.nOrig)
		for i, c := range varying {
			if Leads(&e.cs[k], c, e.set.Kinds) {
				key[i], l[c] = 1, true
			}
		}
		g, ok := keys[string(key)]
		if !ok {
			g = len(idx)
			keys[string(key)] = g
			idx, leads = append(idx, nil), append(leads, l)
		}
		idx[g] = append(idx[g], e.index[k])
	}
	for g := range idx {
		p := *e
		p.cs, p.index, p.defl = pick(cs, idx[g]), idx[g], nil
		p.plan()
		l := leads[g]
		p.fac = table(func(c int) bool { return l[c] })
		e.parts = append(e.parts, &p)
	}
}

// forces forms the extremes of N, V and M at station i of member m from
// the columns' forces in w.at, with e's factors.
func (e *evaluator) forces(w *work, m, i int) [3]Extreme {
	if e.parts == nil {
		return e.forcesWith(w, m, i)
	}
	var out [3]Extreme
	for k, p := range e.parts {
		x := p.forcesWith(w, m, i)
		if k == 0 {
			out = x
			continue
		}
		merge(&out, &x, e.nEff)
	}
	return out
}

func (e *evaluator) forcesWith(w *work, m, i int) [3]Extreme {
	ns := len(w.xs)
	w.fac = nil
	if e.fac != nil {
		w.fac = e.fac[m]
	}
	if w.fac == nil {
		for c := range w.ev {
			f := w.at[c*ns+i]
			w.ev[c] = [3]float64{f.N, f.V, f.M}
		}
	} else {
		for c := range w.ev {
			f, s := w.at[c*ns+i], &w.fac[e.caseOf[c]]
			w.ev[c] = [3]float64{s[0] * f.N, s[1] * f.V, s[2] * f.M}
		}
	}
	w.noise = w.noiseAt
	ex := e.station(w)
	if w.jumps {
		e.pastMoments(w, &ex, i)
	}
	return ex
}

// merge keeps in out the worse of out's and x's extremes of each of the
// first n effects, of equal values the one of the earlier combination.
func merge(out, x *[3]Extreme, n int) {
	for j := range n {
		o, y := &out[j], &x[j]
		if y.Max > o.Max || (y.Max == o.Max && y.MaxBy < o.MaxBy) {
			o.Max, o.MaxBy, o.MaxWith, o.MaxSpans, o.MaxLoaded = y.Max, y.MaxBy, y.MaxWith, y.MaxSpans, y.MaxLoaded
		}
		if y.Min < o.Min || (y.Min == o.Min && y.MinBy < o.MinBy) {
			o.Min, o.MinBy, o.MinWith, o.MinSpans, o.MinLoaded = y.Min, y.MinBy, y.MinWith, y.MinSpans, y.MinLoaded
		}
	}
}

// reactions fills w.ev with every column's reaction at supported node v,
// with e's factors: the reaction as solved for a case no member at v
// scales, else the members' scaled end forces less the node's loads.
// at lists the members meeting at v.
func (e *evaluator) reactionsTo(w *work, sol *frame.Solution, v int, at []int) {
	for c := range e.mo.Cases {
		fx, fy, mz := sol.Reaction(c, v)
		w.ev[c] = [3]float64{fx, fy, mz}
		if e.fac == nil {
			continue
		}
		oc := e.caseOf[c]
		scaled := false
		for _, m := range at {
			if row := e.fac[m]; row != nil && row[oc] != [3]float64{1, 1, 1} {
				scaled = true
			}
		}
		if !scaled {
			continue
		}
		var r [3]float64
		for _, m := range at {
			f := sol.EndForces(c, m)
			s := [3]float64{1, 1, 1}
			if row := e.fac[m]; row != nil {
				s = row[oc]
			}
			mem := &e.mo.Members[m]
			a, b := e.mo.Nodes[mem.Start], e.mo.Nodes[mem.End]
			dx, dy := b.X-a.X, b.Y-a.Y
			l := math.Hypot(dx, dy)
			cs, sn := dx/l, dy/l
			for _, end := range [2]int{0, 3} {
				if (end == 0 && mem.Start != v) || (end == 3 && mem.End != v) {
					continue
				}
				n, q, mm := s[0]*f[end], s[1]*f[end+1], s[2]*f[end+2]
				r[0] += cs*n - sn*q
				r[1] += sn*n + cs*q
				r[2] += mm
			}
		}
		for _, nl := range e.mo.Cases[c].NodeLoads {
			if nl.Node == v {
				r[0] -= nl.Fx
				r[1] -= nl.Fy
				r[2] -= nl.M
			}
		}
		nd := &e.mo.Nodes[v]
		for d := range 3 {
			if !nd.Reacts(d) {
				r[d] = 0
			}
		}
		w.ev[c] = r
	}
}
