package frame

import "slices"

// SolveCases solves the load cases cases with the stiffness sol was solved
// with, on the factor [SolveWith] made of it: the model of the new
// solution is sol's model with its cases replaced by cases (the same
// nodes, sections and members, and, in second order, the same axial
// forces), and its results are those SolveWith gives that model with
// sol's options, to the last bit, without assembling, factoring or
// estimating the condition of the stiffness again. Its condition number
// and warnings are sol's.
//
// The cases are validated as SolveWith validates them: a case that does
// not fit the model is a [ValidationErrors], a moment at a node whose
// rotation is free a [*MechanismError], results that overflow an error
// wrapping [ErrNotFinite]. sol is not changed, and the two solutions may
// be read at once.
func (sol *Solution) SolveCases(cases []Case) (*Solution, error) {
	mo := *sol.model
	mo.Cases = cases
	if err := mo.Validate(); err != nil {
		return nil, err
	}
	if err := checkMemory(&mo, sol.dofs, sol.band, Options{}); err != nil {
		return nil, err
	}
	if free := releasedMoments(&mo, sol.released, nil); len(free) > 0 {
		return nil, &MechanismError{Free: free}
	}
	out := &Solution{model: &mo, elems: sol.elems, atNode: sol.atNode, released: sol.released,
		dof: slices.Clone(sol.dof), dofs: sol.dofs, band: sol.band, cond: sol.cond,
		warnings: slices.Clip(sol.warnings), axial: sol.axial, factor: sol.factor, pow2: sol.pow2}
	for i, e := range out.dof {
		if e < -1 {
			out.dof[i] = -1 // imposed in sol's cases: indexImposed numbers the new ones
		}
	}
	out.indexLoads()
	out.indexImposed()
	n := sol.dofs
	if n == 0 {
		return out, nil
	}
	if err := out.solveLoads(n, min(sol.band, n-1)); err != nil {
		return nil, err
	}
	return out, nil
}
