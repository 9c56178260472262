package analysis

import (
	"fmt"
	"math"

	"govern/combos"
	"govern/envelope"
	"govern/patterns"
)

// checkFactors returns an error for member factors that do not fit the
// job's model: a member or case that is not there, a factor that is not a
// number at least 0, a member and case given twice.
func (j *Job) checkFactors() error {
	seen := map[[2]int]bool{}
	for i, f := range j.MemberFactors {
		if f.Member < 0 || f.Member >= len(j.Model.Members) || f.Case < 0 || f.Case >= len(j.Model.Cases) {
			return fmt.Errorf("analysis: member factor %d is of member %d, case %d; the model has %d members, %d cases", i, f.Member, f.Case, len(j.Model.Members), len(j.Model.Cases))
		}
		for _, v := range [6]float64{f.N, f.V, f.M, f.Accompanying[0], f.Accompanying[1], f.Accompanying[2]} {
			if !(v >= 0) || math.IsInf(v, 0) {
				return fmt.Errorf("analysis: member %q, case %q: factor %v is not a number at least 0", j.Model.Members[f.Member].Name, j.Model.Cases[f.Case].Name, v)
			}
		}
		k := [2]int{f.Member, f.Case}
		if seen[k] {
			return fmt.Errorf("analysis: member %q, case %q: two member factors", j.Model.Members[f.Member].Name, j.Model.Cases[f.Case].Name)
		}
		seen[k] = true
	}
	return nil
}

// envelopeFactors returns the job's member factors as the envelope takes
// them, for nOrig original cases (the job's, and the favourable parts
// favourableSplit adds, which no factor scales); nil without any.
func (j *Job) envelopeFactors(nOrig int) *envelope.Factors {
	if len(j.MemberFactors) == 0 {
		return nil
	}
	f := &envelope.Factors{Of: make([][][3]float64, len(j.Model.Members))}
	row := func(tab [][][3]float64, m int) [][3]float64 {
		if tab[m] == nil {
			tab[m] = make([][3]float64, nOrig)
			for c := range tab[m] {
				tab[m][c] = [3]float64{1, 1, 1}
			}
		}
		return tab[m]
	}
	for _, mf := range j.MemberFactors {
		row(f.Of, mf.Member)[mf.Case] = [3]float64{mf.N, mf.V, mf.M}
	}
	// Where a member has accompanying factors for some case, its other
	// cases keep their factors where they do not lead.
	for _, mf := range j.MemberFactors {
		if !mf.HasAccompanying {
			continue
		}
		if f.Accompanying == nil {
			f.Accompanying = make([][][3]float64, len(j.Model.Members))
		}
		if f.Accompanying[mf.Member] == nil {
			f.Accompanying[mf.Member] = append([][3]float64(nil), f.Of[mf.Member]...)
		}
		f.Accompanying[mf.Member][mf.Case] = mf.Accompanying
	}
	return f
}

// CaseReaction is the reaction of one load case at one supported node:
// as solved, and formed from the end forces of the members meeting there
// each scaled by its member factors for the case (live load reduction),
// global Fx, Fy, M.
type CaseReaction struct {
	Node      int // index into the model's nodes
	Unreduced [3]float64
	Reduced   [3]float64
}

// ReducedReactions returns the reaction of load case c at every supported
// node, in node order, as solved and reduced: the sum over the members at
// the node of each member's end force times its factor for that component
// (N along the member, V across it, M; Job.MemberFactors, the factors
// where the case leads), less the loads applied at the node. Where no
// member there is scaled for c the two are the same.
func (r *Result) ReducedReactions(c int) []CaseReaction {
	mo := r.Job.Model
	if c < 0 || c >= len(mo.Cases) {
		panic(fmt.Sprintf("analysis: ReducedReactions: case %d of %d", c, len(mo.Cases)))
	}
	fac := map[int][3]float64{}
	for _, f := range r.Job.MemberFactors {
		if f.Case == c {
			fac[f.Member] = [3]float64{f.N, f.V, f.M}
		}
	}
	at := make([][]int, len(mo.Nodes))
	for m, mem := range mo.Members {
		at[mem.Start] = append(at[mem.Start], m)
		if mem.End != mem.Start {
			at[mem.End] = append(at[mem.End], m)
		}
	}
	var out []CaseReaction
	for v := range mo.Nodes {
		nd := &mo.Nodes[v]
		if !nd.Supported() {
			continue
		}
		cr := CaseReaction{Node: v}
		for _, col := range r.lay.Whole(c) {
			fx, fy, mz := r.sol.Reaction(col, v)
			cr.Unreduced[0] += fx
			cr.Unreduced[1] += fy
			cr.Unreduced[2] += mz
		}
		cr.Reduced = cr.Unreduced
		scaled := false
		for _, m := range at[v] {
			if s, ok := fac[m]; ok && s != [3]float64{1, 1, 1} {
				scaled = true
			}
		}
		if scaled {
			var sum [3]float64
			for _, m := range at[v] {
				s, ok := fac[m]
				if !ok {
					s = [3]float64{1, 1, 1}
				}
				f := r.endForces(c, m)
				mem := mo.Members[m]
				a, b := mo.Nodes[mem.Start], mo.Nodes[mem.End]
				l := math.Hypot(b.X-a.X, b.Y-a.Y)
				cs, sn := (b.X-a.X)/l, (b.Y-a.Y)/l
				for _, end := range [2]int{0, 3} {
					if (end == 0 && mem.Start != v) || (end == 3 && mem.End != v) {
						continue
					}
					n, q := s[0]*f[end], s[1]*f[end+1]
					sum[0] += cs*n - sn*q
					sum[1] += sn*n + cs*q
					sum[2] += s[2] * f[end+2]
				}
			}
			for _, nl := range mo.Cases[c].NodeLoads {
				if nl.Node == v {
					sum[0] -= nl.Fx
					sum[1] -= nl.Fy
					sum[2] -= nl.M
				}
			}
			for d := range 3 {
				if !nd.Reacts(d) {
					sum[d] = 0
				}
			}
			cr.Reduced = sum
		}
		out = append(out, cr)
	}
	return out
}

// reduced reports whether a member factor scales case c.
func (r *Result) reduced(c int) bool {
	for _, f := range r.Job.MemberFactors {
		if f.Case == c {
			return true
		}
	}
	return false
}

// columnFactors returns the factors f puts on N, V and M of member m in
// each column (load case or pattern piece) of lay's model, in combination
// cb: each column takes its case's, as the case leads in cb or not.
func columnFactors(f *envelope.Factors, lay *patterns.Layout, kinds []combos.Kind, cb *combos.Combination, m int) [][3]float64 {
	out := make([][3]float64, len(lay.Model.Cases))
	caseOf := make([]int, len(out))
	for c := range caseOf {
		caseOf[c] = c
	}
	for _, p := range lay.Patterned {
		for _, u := range p.Units {
			caseOf[u.Column] = p.Case
		}
	}
	for c := range out {
		oc := caseOf[c]
		out[c] = f.Scale(m, oc, envelope.Leads(cb, oc, kinds))
	}
	return out
}
