package frame

import (
	"errors"
	"fmt"
	"math"
)

// Conditioning. Results computed in float64 (about 16 significant digits)
// lose about log10(κ) digits to a condition number κ. Above warnCond they
// may have lost most of them and [Solve] warns; above maxCond none is left
// and it refuses.
const (
	warnCond = 1e8
	maxCond  = 1e16
)

// illAdvice says where to look when the matrix is ill-conditioned.
const illAdvice = "look for very stiff members next to very flexible ones, or for E, A or I entered in units other than those declared"

// ErrNotFinite is wrapped by the error Solve returns when results overflow.
var ErrNotFinite = errors.New("the results are not finite numbers")

// condWarning returns the warning an estimated condition number cond earns,
// or "".
func condWarning(cond float64) string {
	if !(cond > warnCond) {
		return ""
	}
	return fmt.Sprintf("the stiffness matrix is ill-conditioned: estimated condition number %.2g, so results may have lost about %.0f of their 16 significant digits; %s",
		cond, math.Log10(cond), illAdvice)
}

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
