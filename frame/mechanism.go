package frame

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// A structure that cannot carry load is found in four steps (see
// docs/analysis.md): parts joined to no support, from the members alone;
// moments applied where every member end is released, from the loads;
// directions that no member stiffens at all, from the diagonal of the
// assembled matrix; and any other mechanism, from the pivots of a
// factorization that watches them, of the matrix the same frame would have
// with every member alike in stiffness (element.kinematic).
//
// The rotation of a node where every member end is released, and that no
// support holds, is not a mechanism: no member carries moment there, so it
// carries nothing, and it is left out of the equations (releasedRotations).

// MechanismError reports a structure that cannot carry load: parts of it
// that no support holds, or directions at nodes that no member or support
// holds.
type MechanismError struct {
	// Unsupported lists, for each part of the frame joined to no support at
	// all, the names of its nodes in model order. Such a part is free to
	// move along X and Y and to rotate as a whole.
	Unsupported [][]string
	// Free lists the other free directions found, in equation order.
	Free []FreeDOF
}

// FreeDOF names a node and a direction (ux, uy or rz) that nothing holds.
type FreeDOF struct {
	Node      string
	Direction string
	Reason    string // why, where known, such as "every member end there is released"
	// Case, when not empty, names the load case that loads the free
	// direction: a moment applied where every member end is released.
	Case string
}

// Reasons given in [FreeDOF].
const (
	reasonReleased = "every member end there is released (hinged) and no support holds its rotation"
	reasonNothing  = "no member or support stiffens it"
)

// maxNamed is how many nodes and free directions a message lists before
// giving the count of the rest.
const maxNamed = 8

func (e *MechanismError) Error() string {
	var b strings.Builder
	b.WriteString("the structure is a mechanism (it cannot carry load):")
	sep := " "
	for _, part := range e.Unsupported {
		b.WriteString(sep)
		sep = "; "
		b.WriteString("nodes ")
		for i, name := range part {
			if i == maxNamed {
				fmt.Fprintf(&b, " and %d more", len(part)-i)
				break
			}
			if i > 0 {
				b.WriteString(", ")
			}
			fmt.Fprintf(&b, "%q", name)
		}
		b.WriteString(" form a part joined to no support, free to move along X (ux) and Y (uy) and to rotate (rz)")
	}
	for i, f := range e.Free {
		if i == maxNamed {
			fmt.Fprintf(&b, "; and %d more free directions", len(e.Free)-i)
			break
		}
		b.WriteString(sep)
		sep = "; "
		fmt.Fprintf(&b, "node %q is free to %s", f.Node, dirWords[f.Direction])
		if f.Reason != "" {
			b.WriteString(": ")
			b.WriteString(f.Reason)
		}
		if f.Case != "" {
			fmt.Fprintf(&b, ", so nothing resists the moment that case %q applies there", f.Case)
		}
	}
	return b.String()
}

var dirWords = map[string]string{
	"ux": "move along X (ux)",
	"uy": "move along Y (uy)",
	"rz": "rotate (rz)",
}

var dirNames = [3]string{"ux", "uy", "rz"}

// ErrIllConditioned is wrapped by the error Solve returns when the stiffness
// matrix is so ill-conditioned that the results would carry fewer than three
// correct digits, or none.
var ErrIllConditioned = errors.New("the stiffness matrix is too ill-conditioned to solve")

// The mechanism search works on the kinematic matrix: the stiffness matrix
// the frame would have with every member alike, as stiff across its length
// as along it (element.kinematic), scaled to unit diagonal. A mechanism
// moves every member as a rigid body, whatever the members' stiffnesses,
// so that matrix has exactly the mechanisms of the frame; but it has none
// of the disparity between stiff and flexible members that makes a sound
// frame's own matrix ill-conditioned, so a direction the frame holds keeps
// a Rayleigh quotient set by the frame's geometry, however stiff its
// stiffest member (measured: 0.14 for a cantilever, 0.01 for a regular
// frame of 20 × 10 bays and storeys, 6e-5 for 30 × 60, where the frames'
// own matrices went down to 1e-14 with one column of A = 1e13), while a
// mechanism z, closed at pivot i, has a quotient zᵀKz/|z|² that is zero in
// exact arithmetic and of the size of the factorization's round-off in
// floating point: about (kb + 1) ε at most for a half-bandwidth kb and
// machine epsilon ε (measured: no larger than 9e-17 either way, below
// 0.5 (kb + 1) ε). A quotient at or below pivotTol (kb + 1) ε is a
// direction held by nothing. The search runs only when the factorization
// of the frame's own matrix fails or its estimated condition number is
// above diagnoseCond, the refusal limit; when it finds nothing the frame
// is sound and ill-conditioned, and is treated as such.
const (
	pivotTol     = 4
	diagnoseCond = RefuseCond
)

// unsupportedParts returns the connected parts of the frame (nodes joined by
// members, releases or not: a hinge still carries force) that contain no
// supported node, each as its node indices in increasing order, the parts
// ordered by their first node. Nodes that no member touches are left to
// [Model.Validate].
func unsupportedParts(mo *Model) [][]int {
	parent := make([]int, len(mo.Nodes))
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	touched := make([]bool, len(mo.Nodes))
	for _, m := range mo.Members {
		touched[m.Start], touched[m.End] = true, true
		a, b := find(m.Start), find(m.End)
		if a != b {
			parent[max(a, b)] = min(a, b)
		}
	}
	supported := make([]bool, len(mo.Nodes))
	for v := range mo.Nodes {
		if mo.Nodes[v].Supported() {
			supported[find(v)] = true
		}
	}
	index := map[int]int{} // root → position in parts
	var parts [][]int
	for v := range mo.Nodes {
		r := find(v)
		if !touched[v] || supported[r] {
			continue
		}
		k, ok := index[r]
		if !ok {
			k = len(parts)
			index[r] = k
			parts = append(parts, nil)
		}
		parts[k] = append(parts[k], v)
	}
	return parts
}

// ReleasedRotations returns, for each node, whether its rotation carries
// nothing: members join it, every member end there is released, and its
// support does not hold its rotation. A moment applied at such a node is a
// mechanism for the case that applies it (a MechanismError naming the
// node and the case).
func (mo *Model) ReleasedRotations() []bool { return releasedRotations(mo) }

// releasedRotations returns, for each node, whether its rotation carries
// nothing: members join it, every member end there is released, and its
// support does not hold its rotation. Such a rotation has no stiffness and
// no load (fixed-end moments are condensed at a released end), so it is
// left out of the equations; a moment applied there is a mechanism
// (releasedMoments).
func releasedRotations(mo *Model) []bool {
	joined := make([]bool, len(mo.Nodes))
	rigid := make([]bool, len(mo.Nodes)) // some member end is not released
	for _, m := range mo.Members {
		joined[m.Start], joined[m.End] = true, true
		// A released end with a rigid zone still turns its node: the
		// zone carries the hinge's force round the node.
		if !m.Release.AtStart() || m.OffsetStart > 0 {
			rigid[m.Start] = true
		}
		if !m.Release.AtEnd() || m.OffsetEnd > 0 {
			rigid[m.End] = true
		}
	}
	out := make([]bool, len(mo.Nodes))
	for v, nd := range mo.Nodes {
		out[v] = joined[v] && !rigid[v] && !nd.Support.Restrained(2) && !(nd.Springs[2] > 0)
	}
	return out
}

// releasedMoments returns, for each node whose rotation carries nothing
// (released) and each case that applies a moment there (the node loads of
// the case at that node summed), the free direction, nodes in model order
// and then cases in model order. Nodes marked in skip are left out.
func releasedMoments(mo *Model, released []bool, skip map[int]bool) []FreeDOF {
	var free []FreeDOF
	sums := map[int]float64{}
	var order []int
	byNode := make([][]string, len(mo.Nodes))
	for c := range mo.Cases {
		clear(sums)
		order = order[:0]
		for _, nl := range mo.Cases[c].NodeLoads {
			if !released[nl.Node] || nl.M == 0 {
				continue
			}
			if _, ok := sums[nl.Node]; !ok {
				order = append(order, nl.Node)
			}
			sums[nl.Node] += nl.M
		}
		for _, v := range order {
			if sums[v] != 0 {
				byNode[v] = append(byNode[v], mo.Cases[c].Name)
			}
		}
	}
	for v, cases := range byNode {
		if skip[v] {
			continue
		}
		for _, c := range cases {
			free = append(free, FreeDOF{Node: mo.Nodes[v].Name, Direction: "rz", Reason: reasonReleased, Case: c})
		}
	}
	return free
}

// checkDiagonal finds degrees of freedom that no member stiffens at all,
// which only stiffnesses that underflow to zero can leave now that the
// rotations of fully released nodes are out of the equations.
//
// It reports them together with the parts of the frame joined to no support,
// which unsupportedParts found before assembly, and the moments applied
// where nothing carries them (releasedMoments); the nodes of those parts are
// not listed again. data is nil when there are no equations.
func (sol *Solution) checkDiagonal(data []float64, kb int, dof []int, parts [][]int, released []bool) error {
	var free []FreeDOF
	inPart := map[int]bool{}
	var names [][]string
	for _, p := range parts {
		ns := make([]string, len(p))
		for i, v := range p {
			inPart[v] = true
			ns[i] = sol.model.Nodes[v].Name
		}
		names = append(names, ns)
	}
	free = append(free, releasedMoments(sol.model, released, inPart)...)
	for v := range sol.model.Nodes {
		if inPart[v] || data == nil {
			continue
		}
		for d := range 3 {
			if e := dof[3*v+d]; e >= 0 && !(data[e*(kb+1)] > 0) {
				free = append(free, FreeDOF{Node: sol.model.Nodes[v].Name, Direction: dirNames[d], Reason: reasonNothing})
			}
		}
	}
	if len(free) > 0 || len(names) > 0 {
		return &MechanismError{Unsupported: names, Free: free}
	}
	return nil
}

// kinematic returns the members of the frame made alike in stiffness
// (element.kinematic), and for each node the length h in which its
// rotation is taken in them: the longest member held rigidly there (1
// where none is, and the node's rotation is not an unknown).
func (sol *Solution) kinematic() ([]element, []float64) {
	mo := sol.model
	h := make([]float64, len(mo.Nodes))
	for m, mem := range mo.Members {
		l := sol.elems[m].l
		if !mem.Release.AtStart() {
			h[mem.Start] = max(h[mem.Start], l)
		}
		if !mem.Release.AtEnd() {
			h[mem.End] = max(h[mem.End], l)
		}
	}
	for v := range h {
		if h[v] == 0 {
			h[v] = 1
		}
	}
	kin := make([]element, len(mo.Members))
	for m, mem := range mo.Members {
		// A released end's rotation is condensed out: any h will do.
		h1, h2 := h[mem.Start], h[mem.End]
		if mem.Release.AtStart() {
			h1 = sol.elems[m].l
		}
		if mem.Release.AtEnd() {
			h2 = sol.elems[m].l
		}
		kin[m] = sol.elems[m].kinematic(h1, h2)
	}
	return kin, h
}

// diagnose factors the kinematic matrix scaled to unit diagonal (data, with
// scale[i] the factor applied to row and column i) in plain Go, watching
// every pivot. A zero pivot i in exact arithmetic means a mechanism z
// (z[i] = 1, z[j] = 0 beyond i) that strains nothing; in floating point
// that pivot is p = zᵀ(A + E)z for the round-off E of the factorization, so
// it is the Rayleigh quotient p/|z|² (pivotWatch), not p, that falls to the
// level of E. Where it does, that degree of freedom is held by nothing: it
// is restrained and the factorization goes on, so every free direction is
// found. h[v] is the length in which the kinematic matrix takes the
// rotation of node v (Solution.kinematic).
func (sol *Solution) diagnose(data []float64, n, kb int, dof []int, scale, h []float64) error {
	u := append([]float64(nil), data...)
	w := kb + 1
	tol := pivotTol * float64(w) * 0x1p-52
	var bad []int
	watch := newPivotWatch(kb)
	for i := range n {
		p := u[i*w]
		if !(watch.quotient(u, i, p) > tol) {
			bad = append(bad, i)
			watch.take(i, 1)

			u[i*w] = 1
			for j := 1; j < w && i+j < n; j++ {
				u[i*w+j] = 0
			}
			continue
		}
		p = math.Sqrt(p)
		watch.take(i, p)
		u[i*w] = p
		for j := 1; j < w && i+j < n; j++ {
			u[i*w+j] /= p
		}
		// Update the trailing band: a[j][l] -= u[i][j] u[i][l].
		for j := 1; j < w && i+j < n; j++ {
			uij := u[i*w+j]
			if uij == 0 {
				continue
			}
			row := (i + j) * w
			for l := j; l < w && i+l < n; l++ {
				u[row+l-j] -= uij * u[i*w+l]
			}
		}
	}
	if len(bad) == 0 {
		return nil
	}
	type where struct{ node, d int }
	at := make([]where, n)
	lc := 0.0 // mean member length, to weigh rotations against translations
	for v := range sol.model.Nodes {
		for d := range 3 {
			if e := dof[3*v+d]; e >= 0 {
				at[e] = where{v, d}
			}
		}
	}
	for m := range sol.model.Members {
		lc += sol.elems[m].l / float64(len(sol.model.Members))
	}
	var free []FreeDOF
	seen := map[FreeDOF]bool{}
	for _, i := range bad {
		// The mechanism's shape in the scaled unknowns, then in
		// displacements and rotations.
		z := nullVector(u, w, i)
		best, bestV := i, 0.0
		for e := 0; e <= i; e++ {
			v := math.Abs(z[e] * scale[e])
			if at[e].d == 2 {
				v *= lc / 2 / h[at[e].node] // the rotation is h θ
			}
			// Near ties (a rigid-body motion moves many nodes alike) go
			// to the first equation, whatever the round-off.
			if v > bestV*(1+1e-6) {
				best, bestV = e, v
			}
		}
		f := FreeDOF{Node: sol.model.Nodes[at[best].node].Name, Direction: dirNames[at[best].d]}

		if !seen[f] {
			seen[f] = true
			free = append(free, f)
		}
	}
	return &MechanismError{Free: free}
}

// pivotWatch follows a band Cholesky factorization U of a matrix A (kb
// superdiagonals) as it is formed row by row, to give at each pivot the
// Rayleigh quotient of the mechanism that pivot would close. With the rows
// before i factored (U_B), the mechanism is z = (−U_B⁻¹ c, 1), where c is
// the column of U above the pivot, zero outside the last kb places (the
// window): Uz = 0 but for row i. Its quotient is zᵀAz/|z|² = p/(1 + cᵀGc)
// for the pivot p and G = U_B⁻ᵀ U_B⁻¹. Bordering U_B by column (c, d), d the
// new diagonal, leaves G's leading block as it is and gives it the new row
// −(Gc)ᵀ/d and diagonal (cᵀGc + 1)/d², so G's window block follows in one
// kb × kb product a row, twice the work of a step of the factorization.
type pivotWatch struct {
	kb     int
	g      []float64 // kb × kb: G on the window, row i at i % kb
	c, gc  []float64 // by window place: the column of U above the pivot; G c
	cgc    float64   // cᵀGc at the current pivot
	frozen bool      // no window: kb is 0
}

func newPivotWatch(kb int) *pivotWatch {
	return &pivotWatch{kb: kb, g: make([]float64, kb*kb), c: make([]float64, kb), gc: make([]float64, kb), frozen: kb == 0}
}

// quotient returns the Rayleigh quotient of the mechanism pivot p of
// equation i would close; u is the factor so far, in upper band storage
// (rows before i final).
func (pw *pivotWatch) quotient(u []float64, i int, p float64) float64 {
	if pw.frozen {
		pw.cgc = 0
		return p
	}
	kb := pw.kb
	w := kb + 1
	clear(pw.c)
	for r := max(0, i-kb); r < i; r++ {
		pw.c[r%kb] = u[r*w+i-r]
	}
	pw.cgc = 0
	for s := range kb {
		row := pw.g[s*kb : (s+1)*kb]
		v := 0.0
		for t, c := range pw.c {
			v += row[t] * c
		}
		pw.gc[s] = v
		pw.cgc += pw.c[s] * v
	}
	return p / (1 + pw.cgc)
}

// take moves the window on past equation i, whose diagonal in U is d (√p,
// or 1 where diagnose restrains it). The place of i is that of i − kb,
// which leaves the window.
func (pw *pivotWatch) take(i int, d float64) {
	if pw.frozen {
		return
	}
	kb := pw.kb
	si := i % kb
	for s := range kb {
		v := -pw.gc[s] / d
		pw.g[s*kb+si], pw.g[si*kb+s] = v, v
	}
	pw.g[si*kb+si] = (pw.cgc + 1) / (d * d)
}

// nullVector returns the shape z[0..i] of the mechanism found at a zero
// pivot i of the upper band factor u (row-major, width w): z[i] = 1 and the
// earlier equations U z = 0 hold, so z moves without straining anything.
func nullVector(u []float64, w, i int) []float64 {
	z := make([]float64, i+1)
	z[i] = 1
	for r := i - 1; r >= 0; r-- {
		sum := 0.0
		for c := r + 1; c <= i && c-r < w; c++ {
			sum += u[r*w+c-r] * z[c]
		}
		z[r] = -sum / u[r*w]
	}
	return z
}
