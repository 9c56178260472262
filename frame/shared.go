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
	return sol.solveCases(cases, nil)
}

// SolveCasesReusing is [Solution.SolveCases] with the memory of spent's
// displacements, when spent is not nil and they are at least as many,
// taken for the new solution's: a caller that solves set after set of
// cases, each read and let go before the next, is spared allocating that
// memory afresh each time (and the system mapping it in page by page).
// The results are those of SolveCases to the last bit. spent gives up its
// displacements whether or not the solve succeeds: it must not be read
// again, and reading its results panics. It panics when spent is sol.
func (sol *Solution) SolveCasesReusing(cases []Case, spent *Solution) (*Solution, error) {
	if spent == nil {
		return sol.solveCases(cases, nil)
	}
	if spent == sol {
		panic("frame: SolveCasesReusing: spent is the solution whose factor solves the cases")
	}
	buf := spent.x
	// Emptied of its model too, so that no result of it, not even of a
	// member held at both ends (which reads no displacement), is given.
	spent.x, spent.zero, spent.imposed, spent.model = nil, nil, nil, nil
	return sol.solveCases(cases, buf)
}

// solveCases is SolveCases with the displacements in buf when it holds as
// many (solveLoadsIn).
func (sol *Solution) solveCases(cases []Case, buf []float64) (*Solution, error) {
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
		warnings: slices.Clip(sol.warnings), axial: sol.axial, factor: sol.factor, pow2: sol.pow2, terms: sol.terms}
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
	if err := out.solveLoadsIn(n, min(sol.band, n-1), buf); err != nil {
		return nil, err
	}
	return out, nil
}
