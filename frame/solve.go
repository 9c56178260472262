package frame

import (
	"fmt"
	"math"
	"sort"
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
	warnings   []string
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

// Solve validates mo, assembles its stiffness matrix, factors it once and
// solves every load case in one multi-column solve.
//
// A model past the size limits gets an error wrapping [ErrTooLarge]; a
// structure that cannot carry load a [*MechanismError]; a stiffness matrix
// too ill-conditioned for the results to carry any correct digit an error
// wrapping [ErrIllConditioned]. A matrix ill-conditioned enough to cost the
// results most of their digits is solved, with a warning in
// [Solution.Warnings].
func Solve(mo *Model) (*Solution, error) {
	if err := checkEquations(mo); err != nil {
		return nil, err
	}
	if err := mo.Validate(); err != nil {
		return nil, err
	}
	parts := unsupportedParts(mo)
	order := rcmOrder(adjacency(mo))
	dof, n, band := dofMap(mo, order)
	if err := checkStorage(mo, n, band); err != nil {
		return nil, err
	}
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
		if err := sol.checkDiagonal(data, kb, dof, parts); err != nil {
			return nil, err
		}
		nr := max(nc, 1)
		rhs := make([]float64, n*nr) // row-major, one column per case
		for c := range mo.Cases {
			for _, nl := range mo.Cases[c].NodeLoads {
				for d, v := range [3]float64{nl.Fx, nl.Fy, nl.M} {
					if e := dof[3*nl.Node+d]; e >= 0 {
						rhs[e*nr+c] += v
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
						rhs[e*nr+c] -= fg[i]
					}
				}
			}
		}
		u, ok := factorBand(data, n, kb)
		cond := math.Inf(1)
		if ok {
			cond = bandCond(data, u, n, kb)
		}
		if !ok || cond > diagnoseCond {
			if err := sol.diagnose(data, n, kb, dof); err != nil {
				return nil, err
			}
			if !ok {
				return nil, fmt.Errorf("%w (the matrix is not positive definite although no mechanism was found); %s", ErrIllConditioned, illAdvice)
			}
		}
		sol.cond = cond
		if !(cond <= refuseCond) {
			return nil, fmt.Errorf("%w: estimated condition number %.2g, so the results would carry no correct digit; %s", ErrIllConditioned, cond, illAdvice)
		}
		if cond > warnCond {
			sol.warnings = append(sol.warnings, fmt.Sprintf("the stiffness matrix is ill-conditioned: estimated condition number %.2g, so results may have lost about %.0f of their 16 significant digits; %s",
				cond, math.Log10(cond), illAdvice))
		}
		solveBandTo(rhs, u, n, kb, nr)
		for c := range nc {
			for v := range nn {
				for d := range 3 {
					if e := dof[3*v+d]; e >= 0 {
						sol.disp[c*3*nn+3*v+d] = rhs[e*nr+c]
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
	if err := sol.checkFinite(); err != nil {
		return nil, err
	}
	return sol, nil
}

// checkFinite reports results that overflowed, which only numbers far
// outside any consistent set of units can cause.
func (sol *Solution) checkFinite() error {
	nn, nm := len(sol.model.Nodes), len(sol.model.Members)
	for c := range sol.model.Cases {
		for _, v := range [][]float64{sol.disp[c*3*nn : (c+1)*3*nn], sol.end[c*6*nm : (c+1)*6*nm], sol.reac[c*3*nn : (c+1)*3*nn]} {
			for _, x := range v {
				if !finite(x) {
					return fmt.Errorf("case %q: %w (the arithmetic overflowed); check that loads, E, A and I are in the declared units", sol.model.Cases[c].Name, ErrNotFinite)
				}
			}
		}
	}
	return nil
}

// Warnings returns what the engineer should know about the solution that
// did not stop it, such as an ill-conditioned stiffness matrix; nil when
// there is nothing to say.
func (sol *Solution) Warnings() []string { return sol.warnings }

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

// Model returns the model that was solved.
func (sol *Solution) Model() *Model { return sol.model }

// Info returns the size of the system that was solved.
func (sol *Solution) Info() Info { return Info{Equations: sol.dofs, Bandwidth: sol.band} }

// Cond returns the estimated 1-norm condition number ‖K‖₁ ‖K⁻¹‖₁ of the
// stiffness matrix K of the free degrees of freedom; 1 when there are none.
// Results lose about log10(Cond) of the 16 significant digits of float64.
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
