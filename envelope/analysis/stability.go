package analysis

import (
	"slices"

	"govern/frame"
)

// Stability is what the stiffness of a job's frame says before any load
// case is solved.
type Stability struct {
	Info      frame.Info
	Condition float64 // estimated condition number, scaled to unit diagonal
	Warnings  []string
}

// CheckStability factorizes the stiffness matrix of job's frame, without
// solving any load case, to find a structure that cannot carry load (a
// mechanism, returned as the error) and to estimate the matrix's
// condition number. The node loads come along: a moment where every
// member end is released is a mechanism for that case; so do the imposed
// displacements, which are checked against the supports.
func CheckStability(job *Job, opt frame.Options) (*Stability, error) {
	mo := job.Model
	cases := make([]frame.Case, len(mo.Cases))
	for i, c := range mo.Cases {
		cases[i] = frame.Case{Name: c.Name, NodeLoads: c.NodeLoads, Displacements: c.Displacements}
	}
	sol, err := frame.SolveWith(&frame.Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members, Cases: cases}, opt)
	if err != nil {
		return nil, err
	}
	warnings := append(slices.Clip(sol.Warnings()), Plausibility(job)...)
	return &Stability{Info: sol.Info(), Condition: sol.Cond(), Warnings: warnings}, nil
}
