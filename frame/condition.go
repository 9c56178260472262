package frame

import (
	"errors"
	"fmt"
	"math"
)

// Conditioning. Results computed in float64 (about 16 significant digits)
// lose about log10(κ) digits to a condition number κ, which [Solve]
// estimates for the stiffness matrix scaled to unit diagonal (see
// [Solution.Cond]): a change of consistent units, or one very stiff member
// alone, leaves it as it is. The limits apply to that estimate.
const (
	// WarnCond is the condition number above which results may have lost
	// more than half of their digits: [Solve] warns.
	WarnCond = 1e8
	// RefuseCond is the condition number above which fewer than three
	// digits are left: [Solve] refuses unless [Options.AcceptIllConditioned].
	RefuseCond = 1e13
	// MaxCond is the condition number above which no digit is left: [Solve]
	// always refuses.
	MaxCond = 1e16
)

// Options changes how [SolveWith] treats a model; the zero value is what
// [Solve] does.
type Options struct {
	// AcceptIllConditioned solves a model whose estimated condition number
	// is above RefuseCond (but not above MaxCond), with a warning that says
	// so, where Solve refuses it with an [*IllConditionedError]. Its results
	// may carry fewer than three correct digits; whoever shows them must
	// show [Solution.Cond] with them.
	AcceptIllConditioned bool
	// PerMember is the memory, in bytes, the caller will hold for each
	// member while the solution is in use (an envelope's stations), counted
	// in the estimate of the run's peak memory that [MaxMemory] limits.
	PerMember float64
	// Held, when not nil, gives the other memory, in bytes, the caller
	// adds to the estimate for a system of equations of info's size (what
	// it solves and keeps beside the solution), the heap's growth over it
	// included.
	Held func(info Info) float64
	// Solutions is how many solutions of the model's every load case the
	// caller holds at once, for the estimate (0 counts as 1): 2 where
	// combinations solved apart (second-order) each form one beside this.
	Solutions int
	// Growth is how far the heap grows past what is live at the caller's
	// peak, for the estimate: the solutions and PerMember are counted
	// Growth times (0 counts as 2, the garbage collector's default target).
	Growth float64
	// Axial, when not nil, gives per member the axial force N (tension
	// positive, force) whose geometric stiffness is added to the member's:
	// a second-order analysis of the model's cases about that state of
	// axial force (P-Δ and P-δ; see SubElements). Every case is solved with
	// the one stiffness, so cases still add up; whoever iterates on the
	// axial forces supplies them (see [Solution.Axial]). Station moments
	// then include N times the member's transverse displacement from its
	// start node, and the statics check takes moments on the deformed
	// geometry. A stiffness that is not positive definite under them is
	// an error wrapping [ErrUnstable].
	Axial []float64
	// SkipCondition factors the stiffness without estimating its condition
	// number: for a solution whose results nobody reports, such as an
	// intermediate step of an iteration whose last solve is estimated.
	// [Solution.Cond] is then NaN, and the solve neither refuses nor warns
	// of ill-conditioning, nor searches an ill-conditioned matrix for a
	// near-mechanism: a stiffness is refused only when it cannot be
	// factored at all (an [*IllConditionedError] with Cond +Inf, or, with
	// Axial, an error wrapping [ErrUnstable]) or the results overflow.
	// Mechanisms that show in the matrix's diagonal are found as always.
	SkipCondition bool
}

// illAdvice says where to look when the matrix is ill-conditioned.
const illAdvice = "look for very stiff members next to very flexible ones, or for E, A or I entered in units other than those declared"

// ErrNotFinite is wrapped by the error Solve returns when results overflow.
var ErrNotFinite = errors.New("the results are not finite numbers")

// IllConditionedError is the error [Solve] returns for a stiffness matrix
// whose estimated condition number is above [RefuseCond]. It wraps
// [ErrIllConditioned].
type IllConditionedError struct {
	// Cond is the estimate, as Solution.Cond would give it; +Inf when the
	// matrix could not be factored at all (it is not positive definite to
	// the precision of the arithmetic) although no mechanism was found.
	Cond float64
	// Acceptable is true when [Options.AcceptIllConditioned] would have
	// solved it (Cond is not above MaxCond).
	Acceptable bool
}

func (e *IllConditionedError) Error() string {
	if math.IsInf(e.Cond, 1) {
		return fmt.Sprintf("%v: its factorization failed (it is not positive definite to the precision of the arithmetic, although nothing in the frame is free to move), so the results would carry no correct digit; %s", ErrIllConditioned, illAdvice)
	}
	if !e.Acceptable {
		return fmt.Sprintf("%v: estimated condition number %.2g, so the results would carry no correct digit; %s", ErrIllConditioned, e.Cond, illAdvice)
	}
	return fmt.Sprintf("%v: estimated condition number %.2g, above the limit %.0e, so the results may have lost about %.0f of their 16 significant digits, leaving fewer than three; %s",
		ErrIllConditioned, e.Cond, RefuseCond, math.Log10(e.Cond), illAdvice)
}

// Unwrap returns [ErrIllConditioned].
func (e *IllConditionedError) Unwrap() error { return ErrIllConditioned }

// condWarning returns the warning an estimated condition number cond earns,
// or "".
func condWarning(cond float64) string {
	if !(cond > WarnCond) {
		return ""
	}
	accepted := ""
	if cond > RefuseCond {
		accepted = fmt.Sprintf(", above the limit %.0e and solved only because that was accepted", RefuseCond)
	}
	return fmt.Sprintf("the stiffness matrix is ill-conditioned: estimated condition number %.2g%s, so results may have lost about %.0f of their 16 significant digits; %s",
		cond, accepted, math.Log10(cond), illAdvice)
}

// RoundOff returns the imbalance, as a fraction of the load, that round-off
// alone can leave in a statics check ([Balance.Relative]) of this solution:
// 10 κ ε for the estimated condition number κ and machine epsilon ε. The
// joint residuals are differences of the end forces of stiff and flexible
// members meeting at a joint, each carrying a relative error of about ε, so
// they grow with κ: measured, they stay below κ ε on frames with κ from
// 1e8 to 4e13 (nearly rigid links beside slender columns, a member stiff
// axially and slender in bending). A caller that checks statics should
// allow the larger of its own limit and this.
func (sol *Solution) RoundOff() float64 { return 10 * sol.cond * 0x1p-52 }

// checkFinite reports displacements that overflowed, which only numbers
// far outside any consistent set of units can cause.
func (sol *Solution) checkFinite() error {
	nc := len(sol.model.Cases)
	for i, v := range sol.x {
		if !finite(v) {
			return fmt.Errorf("case %q: %w (the arithmetic overflowed); check that loads, E, A and I are in the declared units", sol.model.Cases[i%nc].Name, ErrNotFinite)
		}
	}
	return nil
}

// Warnings returns what the engineer should know about the solution that
// did not stop it, such as an ill-conditioned stiffness matrix; nil when
// there is nothing to say.
func (sol *Solution) Warnings() []string { return sol.warnings }
