package frame

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// A structure that cannot carry load is found in three steps (see
// docs/analysis.md): parts joined to no support, from the members alone;
// directions that no member stiffens at all, from the diagonal of the
// assembled matrix; and any other mechanism, from the pivots of a
// factorization that watches them.

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
	// Note, when not empty, is a hint on the likely cause.
	Note string
}

// FreeDOF names a node and a direction (ux, uy or rz) that nothing holds.
type FreeDOF struct {
	Node      string
	Direction string
	Reason    string // why, where known, such as "every member end there is released"
}

// Reasons given in [FreeDOF].
const reasonReleased = "every member end there is released (hinged) and no support holds its rotation"

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
	}
	if e.Note != "" {
		b.WriteString(" (")
		b.WriteString(e.Note)
		b.WriteString(")")
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
// matrix is so ill-conditioned that the results would carry no correct digits.
var ErrIllConditioned = errors.New("the stiffness matrix is too ill-conditioned to solve")

// A Cholesky pivot counts as zero, its degree of freedom held by nothing but
// round-off, when it is below pivotTol of its own diagonal or below
// pivotAbsTol of the largest diagonal (round-off scales with the stiffest
// members, such as nearly rigid axial links). diagnoseCond is the condition
// number above which the pivots are examined.
const (
	pivotTol     = 1e-10
	pivotAbsTol  = 1e-13
	diagnoseCond = 1e8
	spreadNote   = 1e10 // ratio of largest to smallest diagonal that earns a note on units
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
	for v, nd := range mo.Nodes {
		if nd.Support != Free {
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

// checkDiagonal finds degrees of freedom that no member stiffens at all,
// such as the rotation of a node where every member end is hinged.
//
// It reports them together with the parts of the frame joined to no support,
// which unsupportedParts found before assembly; the nodes of those parts are
// not listed again.
func (sol *Solution) checkDiagonal(data []float64, kb int, dof []int, parts [][]int) error {
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
	for v := range sol.model.Nodes {
		if inPart[v] {
			continue
		}
		for d := range 3 {
			if e := dof[3*v+d]; e >= 0 && !(data[e*(kb+1)] > 0) {
				free = append(free, FreeDOF{Node: sol.model.Nodes[v].Name, Direction: dirNames[d], Reason: reasonReleased})
			}
		}
	}
	if len(free) > 0 || len(names) > 0 {
		return &MechanismError{Unsupported: names, Free: free}
	}
	return nil
}

// diagnose repeats the factorization in plain Go, watching every pivot: a
// pivot that has fallen to a tiny fraction of its diagonal means that
// degree of freedom is held by nothing but round-off. Each such one is
// restrained and the factorization goes on, so every free direction is found.
func (sol *Solution) diagnose(data []float64, n, kb int, dof []int) error {
	u := append([]float64(nil), data...)
	w := kb + 1
	var bad []int
	maxDiag := 0.0
	for i := range n {
		maxDiag = math.Max(maxDiag, data[i*w])
	}
	for i := range n {
		diag := data[i*w]
		p := u[i*w]
		if !(p > pivotTol*diag) || !(p > pivotAbsTol*maxDiag) {
			bad = append(bad, i)

			u[i*w] = 1
			for j := 1; j < w && i+j < n; j++ {
				u[i*w+j] = 0
			}
			continue
		}
		p = math.Sqrt(p)
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
		z := nullVector(u, w, i)
		best, bestV := i, 0.0
		for e := 0; e <= i; e++ {
			v := math.Abs(z[e])
			if at[e].d == 2 {
				v *= lc / 2
			}
			if v > bestV {
				best, bestV = e, v
			}
		}
		f := FreeDOF{Node: sol.model.Nodes[at[best].node].Name, Direction: dirNames[at[best].d]}

		if !seen[f] {
			seen[f] = true
			free = append(free, f)
		}
	}
	me := &MechanismError{Free: free}
	minDiag := math.Inf(1)
	for i := range n {
		minDiag = math.Min(minDiag, data[i*w])
	}
	if spread := maxDiag / minDiag; spread > spreadNote {
		me.Note = fmt.Sprintf("the stiffnesses on the diagonal span %.0f orders of magnitude, so what holds these may be lost in round-off: check that E, A and I are in the declared units", math.Log10(spread))
	}
	return me
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
