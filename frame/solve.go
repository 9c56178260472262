package frame

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// Solution holds the displacements and member end forces of every load case
// of a model, solved together.
type Solution struct {
	model *Model
	elems []element

	disp []float64 // [case][3*node+d]
	end  []float64 // [case][6*member+i], local end forces
	reac []float64 // [case][3*node+d], global reactions (zero at free dofs)

	// byMember[c] lists case c's member loads sorted by member; first[c][m]
	// is where member m's loads start in that list.
	byMember [][]int32
	first    [][]int32

	dofs, band int
	cond       float64
}

// Info describes the system of equations a model gives.
type Info struct {
	Equations int // free degrees of freedom
	Bandwidth int // half-bandwidth after reverse Cuthill–McKee numbering
}

// Describe returns the size of the system of equations of mo without
// solving it. mo must be valid.
func Describe(mo *Model) Info {
	_, n, band := dofMap(mo, rcmOrder(adjacency(mo)))
	return Info{Equations: n, Bandwidth: band}
}

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

// Solve validates mo, assembles its stiffness matrix, factors it once and
// solves every load case in one multi-column solve.
func Solve(mo *Model) (*Solution, error) {
	if err := mo.Validate(); err != nil {
		return nil, err
	}
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order)
	sol := &Solution{model: mo, dofs: n, band: band, cond: 1}
	sol.elems = make([]element, len(mo.Members))
	for m := range mo.Members {
		sol.elems[m] = newElement(mo, m)
	}
	sol.indexLoads()

	nc := len(mo.Cases)
	nn, nm := len(mo.Nodes), len(mo.Members)
	// Fixed-end forces of every member in every case, local and condensed.
	fixed := make([]float64, nc*6*nm)
	for c := range mo.Cases {
		cs := &mo.Cases[c]
		for m := range mo.Members {
			idx := sol.loadsOn(c, m)
			if len(idx) == 0 {
				continue
			}
			e := &sol.elems[m]
			var f [6]float64
			for _, i := range idx {
				addFixedEnd(&f, &cs.MemberLoads[i], e.c, e.s, e.l)
			}
			e.condenseLoads(&f)
			copy(fixed[(c*nm+m)*6:], f[:])
		}
	}

	sol.disp = make([]float64, nc*3*nn)
	if n > 0 {
		kb := min(band, n-1)
		data := make([]float64, n*(kb+1))
		for m, mem := range mo.Members {
			g := sol.elems[m].global()
			ends := [2]int{mem.Start, mem.End}
			for i := range 6 {
				ei := dof[3*ends[i/3]+i%3]
				if ei < 0 {
					continue
				}
				for j := range 6 {
					ej := dof[3*ends[j/3]+j%3]
					if ej < ei {
						continue
					}
					data[ei*(kb+1)+ej-ei] += g[i][j]
				}
			}
		}
		if err := sol.checkDiagonal(data, kb, dof); err != nil {
			return nil, err
		}
		rhs := mat.NewDense(n, max(nc, 1), nil)
		for c := range mo.Cases {
			for _, nl := range mo.Cases[c].NodeLoads {
				for d, v := range [3]float64{nl.Fx, nl.Fy, nl.M} {
					if e := dof[3*nl.Node+d]; e >= 0 {
						rhs.Set(e, c, rhs.At(e, c)+v)
					}
				}
			}
			for m, mem := range mo.Members {
				fl := (*[6]float64)(fixed[(c*nm+m)*6:])
				var fg [6]float64
				sol.elems[m].toGlobal(&fg, fl)
				ends := [2]int{mem.Start, mem.End}
				for i := range 6 {
					if e := dof[3*ends[i/3]+i%3]; e >= 0 && fg[i] != 0 {
						rhs.Set(e, c, rhs.At(e, c)-fg[i])
					}
				}
			}
		}
		k := mat.NewSymBandDense(n, kb, append([]float64(nil), data...))
		var ch mat.BandCholesky
		ok := ch.Factorize(k)
		if !ok || ch.Cond() > diagnoseCond {
			if err := sol.diagnose(data, n, kb, dof); err != nil {
				return nil, err
			}
			if !ok {
				return nil, fmt.Errorf("frame: %w (the matrix is not positive definite)", ErrIllConditioned)
			}
		}
		sol.cond = ch.Cond()
		var x mat.Dense
		if err := ch.SolveTo(&x, rhs); err != nil {
			return nil, fmt.Errorf("frame: %w: condition number %.3g", ErrIllConditioned, sol.cond)
		}
		for c := range nc {
			for v := range nn {
				for d := range 3 {
					if e := dof[3*v+d]; e >= 0 {
						sol.disp[c*3*nn+3*v+d] = x.At(e, c)
					}
				}
			}
		}
	}

	// Member end forces: f = k u + f_fixed, in local axes.
	sol.end = make([]float64, nc*6*nm)
	sol.reac = make([]float64, nc*3*nn)
	for c := range nc {
		for m, mem := range mo.Members {
			e := &sol.elems[m]
			var ug, ul [6]float64
			copy(ug[:3], sol.disp[c*3*nn+3*mem.Start:])
			copy(ug[3:], sol.disp[c*3*nn+3*mem.End:])
			e.toLocal(&ul, &ug)
			f := sol.end[(c*nm+m)*6 : (c*nm+m)*6+6]
			for i := range 6 {
				v := fixed[(c*nm+m)*6+i]
				for j := range 6 {
					v += e.k[i][j] * ul[j]
				}
				f[i] = v
			}
			// Reactions: R = Σ (end forces on members, global) − node loads.
			var fg [6]float64
			e.toGlobal(&fg, (*[6]float64)(f))
			for i, v := range [2]int{mem.Start, mem.End} {
				if mo.Nodes[v].Support == Free {
					continue
				}
				for d := range 3 {
					if mo.Nodes[v].Support.Restrained(d) {
						sol.reac[c*3*nn+3*v+d] += fg[3*i+d]
					}
				}
			}
		}
		for _, nl := range mo.Cases[c].NodeLoads {
			for d, v := range [3]float64{nl.Fx, nl.Fy, nl.M} {
				if mo.Nodes[nl.Node].Support.Restrained(d) {
					sol.reac[c*3*nn+3*nl.Node+d] -= v
				}
			}
		}
	}
	return sol, nil
}

// indexLoads sorts each case's member loads by member.
func (sol *Solution) indexLoads() {
	mo := sol.model
	sol.byMember = make([][]int32, len(mo.Cases))
	sol.first = make([][]int32, len(mo.Cases))
	for c := range mo.Cases {
		loads := mo.Cases[c].MemberLoads
		idx := make([]int32, len(loads))
		for i := range idx {
			idx[i] = int32(i)
		}
		sort.SliceStable(idx, func(i, j int) bool { return loads[idx[i]].Member < loads[idx[j]].Member })
		first := make([]int32, len(mo.Members)+1)
		for _, i := range idx {
			first[loads[i].Member+1]++
		}
		for m := range mo.Members {
			first[m+1] += first[m]
		}
		sol.byMember[c], sol.first[c] = idx, first
	}
}

// loadsOn returns the indices of case c's loads on member m.
func (sol *Solution) loadsOn(c, m int) []int32 {
	f := sol.first[c]
	return sol.byMember[c][f[m]:f[m+1]]
}

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

// Model returns the model that was solved.
func (sol *Solution) Model() *Model { return sol.model }

// Info returns the size of the system that was solved.
func (sol *Solution) Info() Info { return Info{Equations: sol.dofs, Bandwidth: sol.band} }

// Cond returns the estimated condition number of the stiffness matrix.
func (sol *Solution) Cond() float64 { return sol.cond }

// Displacement returns the global displacements (ux, uy, rz) of node v in
// case c.
func (sol *Solution) Displacement(c, v int) (ux, uy, rz float64) {
	d := sol.disp[c*3*len(sol.model.Nodes)+3*v:]
	return d[0], d[1], d[2]
}

// EndForces returns the local forces the nodes exert on member m in case c:
// start axial, transverse, moment; end axial, transverse, moment.
func (sol *Solution) EndForces(c, m int) [6]float64 {
	return [6]float64(sol.end[(c*len(sol.model.Members)+m)*6:])
}

// Reaction returns the global reaction (Fx, Fy, M) at node v in case c;
// components the support does not restrain are zero.
func (sol *Solution) Reaction(c, v int) (fx, fy, m float64) {
	r := sol.reac[c*3*len(sol.model.Nodes)+3*v:]
	return r[0], r[1], r[2]
}

// At returns the internal forces of member m in case c at distance x from
// its start. Values come from the end forces and the member's own loads by
// statics, never by interpolation. At a point load the value just before the
// load is returned.
func (sol *Solution) At(c, m int, x float64) Forces {
	e := &sol.elems[m]
	f := sol.end[(c*len(sol.model.Members)+m)*6:]
	return stationForces(f[0], f[1], f[2], x, e.l, e.c, e.s, sol.model.Cases[c].MemberLoads, sol.loadsOn(c, m))
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
