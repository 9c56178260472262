package analysis

import (
	"govern/combos"
	"govern/envelope"
)

// LimitCheck is the deflection of a span, cantilever or rafter under one
// service combination that carries a limit (combos.Combination.Limit),
// against that limit.
type LimitCheck struct {
	Combination int     // index into the job's combinations
	Limit       float64 // span/deflection allowed: 360 for span/360
	// Deflection is the span's deflection under that combination alone,
	// its loads placed for the largest downward and upward deflection at
	// each station as for the envelope (By is Combination).
	Deflection SpanDeflection
}

// Pass reports whether the span's span/deflection is at least the limit:
// its largest deflection at most its length (twice that of a cantilever)
// over the limit.
func (c LimitCheck) Pass() bool { return c.Deflection.Ratio >= c.Limit }

// limitChecks fills the Limits of every span, cantilever and rafter, one
// per service combination with a limit, in combination order: each
// combination is enveloped on its own (set, with the spans' lines), so
// that every limited combination is checked, not only the one that
// deflects most. A ridge or valley gets none.
func (r *Result) limitChecks(set envelope.Settings) error {
	set.Progress = nil
	for k, cb := range r.Job.Combinations {
		if !cb.Service || cb.Limit <= 0 {
			continue
		}
		sol, lay, err := r.solutionFor(k) // second order: its own
		if err != nil {
			return err
		}
		env, err := envelope.Compute(sol, []combos.Combination{r.solved[k]}, set, lay)
		if err != nil {
			return err
		}
		for i := range r.Spans {
			s := &r.Spans[i]
			if !s.ofLine() {
				continue
			}
			d := r.spanDeflectionIn(s, env)
			if !d.Found {
				continue
			}
			for _, g := range []*Sag{&d.Down, &d.Up, &d.Largest} {
				if g.By == 0 {
					g.By = k
				}
			}
			s.Limits = append(s.Limits, LimitCheck{Combination: k, Limit: cb.Limit, Deflection: d})
		}
	}
	return nil
}
