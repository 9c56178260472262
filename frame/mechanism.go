package frame

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// MechanismError reports a structure that cannot carry load: some degrees of
// freedom are not held by any member or support.
type MechanismError struct {
	Free []FreeDOF // the free directions found, in equation order
}

// FreeDOF names a node and a direction (ux, uy or rz) that nothing holds.
type FreeDOF struct {
	Node      string
	Direction string
}

func (e *MechanismError) Error() string {
	var b strings.Builder
	b.WriteString("the structure is a mechanism (it cannot carry load):")
	for i, f := range e.Free {
		if i == 8 {
			fmt.Fprintf(&b, "; and %d more", len(e.Free)-i)
			break
		}
		sep := " "
		if i > 0 {
			sep = "; "
		}
		fmt.Fprintf(&b, "%snode %q is free to %s", sep, f.Node, dirWords[f.Direction])
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
var ErrIllConditioned = errors.New("stiffness matrix is too ill-conditioned to solve")

// A Cholesky pivot counts as zero, its degree of freedom held by nothing but
// round-off, when it is below pivotTol of its own diagonal or below
// pivotAbsTol of the largest diagonal (round-off scales with the stiffest
// members, such as nearly rigid axial links). diagnoseCond is the condition
// number above which the pivots are examined.
const (
	pivotTol     = 1e-10
	pivotAbsTol  = 1e-13
	diagnoseCond = 1e8
)

// checkDiagonal finds degrees of freedom that no member stiffens at all,
// such as the rotation of a node where every member end is hinged.
func (sol *Solution) checkDiagonal(data []float64, kb int, dof []int) error {
	var free []FreeDOF
	for v := range sol.model.Nodes {
		for d := range 3 {
			if e := dof[3*v+d]; e >= 0 && !(data[e*(kb+1)] > 0) {
				free = append(free, FreeDOF{sol.model.Nodes[v].Name, dirNames[d]})
			}
		}
	}
	if len(free) > 0 {
		return &MechanismError{Free: free}
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
		f := FreeDOF{sol.model.Nodes[at[best].node].Name, dirNames[at[best].d]}
		if !seen[f] {
			seen[f] = true
			free = append(free, f)
		}
	}
	return &MechanismError{Free: free}
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
