package analysis

import (
	"fmt"
	"math"
	"strings"

	"govern/frame"
)

// StaticsLimit is the largest out-of-balance force or moment, as a fraction
// of a case's load (frame.Balance.Relative), that a run accepts. Above it
// the solution is not trusted and Run fails. For a case with imposed
// deformations (settlements, temperature), whose reactions balance each
// other, the fraction is of the largest of its load, its largest reaction
// and the forces its deformations cause at held member ends
// (frame.Balance.Scale).
const StaticsLimit = 1e-6

// Balance is the statics check of one load case: its loads against its
// reactions, about the lower left corner of the frame, and the largest
// out-of-balance force and moment at any free joint (frame.Balance).
type Balance struct {
	Case string
	frame.Balance
	// RoundOff is the imbalance round-off alone may leave
	// (frame.Solution.RoundOff); it raises the limit above StaticsLimit
	// for an ill-conditioned stiffness matrix.
	RoundOff float64
}

// Limit is the largest imbalance the check accepts.
func (b Balance) Limit() float64 { return math.Max(StaticsLimit, b.RoundOff) }

// OK reports whether the case is in balance within Limit.
func (b Balance) OK() bool { return b.Relative() <= b.Limit() }

// statics returns the statics check of every load case of the model. A
// patterned case was solved as several loads (its rest and its pieces or
// arrangements); it is checked whole, through the sum of their solutions.
//
// The displacements each case's check sums are kept in r.sums, for Cases
// to give: the same sums, not read from the solution again.
func (r *Result) statics() []Balance {
	cs := r.Job.Model.Cases
	out := make([]Balance, len(cs))
	nn := 3 * len(r.Job.Model.Nodes)
	all := make([]float64, len(cs)*nn)
	r.sums = make([][]float64, len(cs))
	for c := range cs {
		u := all[c*nn : (c+1)*nn : (c+1)*nn]
		out[c] = Balance{Case: cs[c].Name, Balance: r.sol.BalanceSums(u, r.lay.Whole(c)), RoundOff: r.sol.RoundOff()}
		r.sums[c] = u
	}
	return out
}

// StaticsError is a statics check that failed: the cases out of balance
// by more than their limit.
type StaticsError struct {
	Balances []Balance // every case, in model order
	// Warnings are the solver's warnings, which may say why.
	Warnings []string
}

func (e *StaticsError) Error() string {
	var bad []string
	for _, b := range e.Balances {
		if b.OK() {
			continue
		}
		o := b.Out()
		of := "of its load"
		if b.Imposed {
			// Imposed deformations: the reactions balance each other.
			of = "of the largest of its load, its reactions and the forces of its imposed deformations"
		}
		bad = append(bad, fmt.Sprintf("case %q is out of balance by %.2g %s (limit %.2g): reactions miss the loads by Fx %.3g, Fy %.3g, M %.3g; largest joint residual force %.3g, moment %.3g",
			b.Case, b.Relative(), of, b.Limit(), o.Fx, o.Fy, o.M, b.JointForce, b.JointMoment))
	}
	return fmt.Sprintf("statics check failed; the results are not written:\n%s", strings.Join(bad, "\n"))
}

// CheckStatics returns a *StaticsError when a case of bs is out of
// balance, or nil.
func CheckStatics(bs []Balance) error {
	for _, b := range bs {
		if !b.OK() {
			return &StaticsError{Balances: bs}
		}
	}
	return nil
}
