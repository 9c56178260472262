package analysis

import (
	"runtime"
	"sync"
	"sync/atomic"

	"govern/frame"
)

// CaseResult is the unfactored result of one load case of the job: a
// patterned case with every piece loaded (the case as written), every
// other case as it is. Notional loads and other effects that belong to a
// combination are in no case.
type CaseResult struct {
	Name string
	// Reactions are the reactions of every node a support or a spring
	// holds, in model order, in global axes (Fx +X, Fy +Y, M
	// counter-clockwise); a component that nothing holds is 0.
	Reactions []Reaction
	// Reduced, for a case with live load reduction (Job.MemberFactors),
	// holds the reactions beside the unreduced ones above, node for node:
	// at each, the sum of the members' end forces times their factors
	// for that component ([Result.ReducedReactions]); nil for a case no
	// member factor scales.
	Reduced []Reaction
	// Ends holds, per member in model order, its end forces: the forces
	// the nodes exert on it at its start and end, written as internal
	// forces in the member's own axes and signs, as the envelopes'
	// stations (N + in tension, M + with the local −y face in tension,
	// V = dM/dx, x from the start node). They equal the stations' values
	// at x = 0 and x = L, but for a point load or moment exactly at an
	// end, which the member carries to the node: the end force is the
	// node's side of it.
	Ends []MemberEnds
	// Displacements holds, per node in model order, its global
	// displacements.
	Displacements []Displacement
}

// Reaction is the reaction of one node, global.
type Reaction struct {
	Node       int
	Fx, Fy, M  float64
	Components [3]bool // which of Fx, Fy, M a support or a spring holds
}

// MemberEnds is a member's internal forces at its start and end.
type MemberEnds struct {
	Member     int
	Start, End frame.Forces
}

// Displacement is a node's displacement, global: Ux along +X, Uy along
// +Y (length), Rz counter-clockwise (radians). Where every member end at
// the node is released and nothing holds its rotation, the node has no
// one rotation: RotationFree is set and Rz is 0.
type Displacement struct {
	Node         int
	Ux, Uy, Rz   float64
	RotationFree bool
}

// Cases returns the unfactored results of every load case of the job, in
// model order: reactions, member end forces and node displacements. They
// are formed from the first-order solution Run made, on request; the
// envelopes do not need them.
func (r *Result) Cases() []CaseResult {
	mo := r.Job.Model
	out := make([]CaseResult, len(mo.Cases))
	cols := make([][]int, len(mo.Cases))
	for c := range mo.Cases {
		cols[c] = r.lay.Whole(c)
		out[c] = CaseResult{Name: mo.Cases[c].Name, Ends: make([]MemberEnds, len(mo.Members)), Displacements: make([]Displacement, len(mo.Nodes))}
	}
	// The end forces of every column of a member at once, summed case by
	// case over its columns in order: the sums of endForces, to the last
	// bit, without reading the displacements column by column. Members
	// by chunks and the displacements and reactions case by case, each
	// alone, on every processor: the cases first, the largest of which
	// (a patterned one, summed over its pieces) would else be left to
	// one processor at the end.
	const chunk = 64
	chunks := (len(mo.Members) + chunk - 1) / chunk
	tasks := len(mo.Cases) + chunks
	var next atomic.Int64
	var wg sync.WaitGroup
	for range max(min(runtime.GOMAXPROCS(0), tasks), 1) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var ends [][6]float64
			var u []float64
			for {
				k := int(next.Add(1) - 1)
				if k >= tasks {
					return
				}
				if k < len(mo.Cases) {
					if u == nil && (k >= len(r.sums) || r.sums[k] == nil) {
						u = make([]float64, 3*len(mo.Nodes)) // the statics check's sums are not there
					}
					r.caseNodes(&out[k], k, cols[k], u)
					continue
				}
				if ends == nil {
					ends = make([][6]float64, len(r.sol.Model().Cases))
				}
				k -= len(mo.Cases)
				for m := k * chunk; m < min((k+1)*chunk, len(mo.Members)); m++ {
					r.sol.EndForcesEach(ends, m)
					for c := range mo.Cases {
						// Six sums in registers, each over the columns in order.
						var f0, f1, f2, f3, f4, f5 float64
						for _, col := range cols[c] {
							g := &ends[col]
							f0, f1, f2 = f0+g[0], f1+g[1], f2+g[2]
							f3, f4, f5 = f3+g[3], f4+g[4], f5+g[5]
						}
						f := [6]float64{f0, f1, f2, f3, f4, f5}
						// The local end forces the nodes exert
						// (frame.Solution.EndForces) as internal forces: at the
						// start N = −f0, V = f1, M = −f2; at the end N = f3,
						// V = −f4, M = f5. A released end's are exactly zero.
						out[c].Ends[m] = MemberEnds{Member: m, Start: frame.Forces{N: -f[0], V: f[1], M: -f[2]}, End: frame.Forces{N: f[3], V: -f[4], M: f[5]}}
					}
				}
			}
		}()
	}
	wg.Wait()
	return out
}

// caseNodes sets the displacements of every node and the reactions of
// case c, the sum of the columns cols, in cr; u is scratch of 3 × the
// number of nodes.
func (r *Result) caseNodes(cr *CaseResult, c int, cols []int, u []float64) {
	mo := r.Job.Model
	if c < len(r.sums) && r.sums[c] != nil {
		u = r.sums[c] // the statics check's, the same sums (statics)
	} else {
		r.sol.DisplacementSums(u, cols)
	}
	for v := range mo.Nodes {
		nd := &mo.Nodes[v]
		d := Displacement{Node: v, RotationFree: r.sol.RotationFree(v), Ux: u[3*v], Uy: u[3*v+1]}
		if !d.RotationFree {
			d.Rz = u[3*v+2]
		}
		cr.Displacements[v] = d
		if !nd.Supported() {
			continue
		}
		re := Reaction{Node: v}
		for k := range re.Components {
			re.Components[k] = nd.Reacts(k)
		}
		for _, col := range cols {
			fx, fy, m := r.sol.Reaction(col, v)
			re.Fx, re.Fy, re.M = re.Fx+fx, re.Fy+fy, re.M+m
		}
		cr.Reactions = append(cr.Reactions, re)
	}
	if r.reduced(c) {
		for i, rr := range r.ReducedReactions(c) {
			re := cr.Reactions[i]
			re.Fx, re.Fy, re.M = rr.Reduced[0], rr.Reduced[1], rr.Reduced[2]
			cr.Reduced = append(cr.Reduced, re)
		}
	}
}

// Shown returns the end forces of the member as the tables and the report
// show it (see ShownMember): for a beam or rafter drawn from right to left,
// its right end's as the first and its left end's as the second, with M of
// opposite sign (V and N keep theirs); else start and end as they are.
func (e MemberEnds) Shown(mo *frame.Model) (from, to frame.Forces) {
	if !Flipped(mo, e.Member) {
		return e.Start, e.End
	}
	flip := func(f frame.Forces) frame.Forces { return frame.Forces{N: f.N, V: f.V, M: -f.M} }
	return flip(e.End), flip(e.Start)
}
