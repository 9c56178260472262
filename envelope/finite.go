package envelope

import (
	"errors"
	"fmt"
	"math"
)

// ErrNotFinite is wrapped by the error [Compute] returns for a result that
// is not a finite number.
var ErrNotFinite = errors.New("not a finite number")

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// allFinite reports whether every value that out's first n extremes carry
// is a finite number and names a combination.
func allFinite(out *[3]Extreme, n int) bool {
	for j := range n {
		x := &out[j]
		if x.MaxBy < 0 || x.MinBy < 0 || !finite(x.Max) || !finite(x.Min) {
			return false
		}
		for q := range 3 {
			if !finite(x.MaxWith[q]) || !finite(x.MinWith[q]) {
				return false
			}
		}
	}
	return true
}

// nonFinite returns the error for extremes that are not all finite numbers
// (see allFinite), naming what makes them so: a load case whose own value
// is not finite, or else the first combination that sums to one that is
// not. what(q) names effect q at the place being enveloped, such as
// `V of member "B1-C1" at x = 0`.
func (e *evaluator) nonFinite(w *work, what func(q int) string) error {
	for c, v := range w.ev {
		for q := range e.nEff {
			if !finite(v[q]) {
				return fmt.Errorf("case %q: %s is %v, %w: a load is too large", e.mo.Cases[c].Name, what(q), v[q], ErrNotFinite)
			}
		}
	}
	for k := range e.cs {
		for j := range e.nEff {
			for _, hi := range [2]bool{true, false} {
				v := w.place.combine(e, w, k, j, hi)
				for q := range e.nEff {
					if !finite(v[q]) {
						return fmt.Errorf("combination %q: %s is %v, %w: a factor or a load is too large", e.cs[k].Name, what(q), v[q], ErrNotFinite)
					}
				}
			}
		}
	}
	return fmt.Errorf("%s is %w", what(0), ErrNotFinite)
}
