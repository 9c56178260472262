package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"govern/frame"
)

// staticsLimit is the largest out-of-balance force or moment, as a fraction
// of a case's load (frame.Balance.Relative), that a run accepts. Above it the
// solution is not trusted and the run fails.
const staticsLimit = 1e-6

// caseBalance is the statics check of one load case.
type caseBalance struct {
	name string
	b    frame.Balance
}

func (cb caseBalance) ok() bool { return cb.b.Relative() <= staticsLimit }

// balances returns the statics check of every load case of the model. A
// patterned case was solved as several loads (its rest and its pieces or
// arrangements); it is checked whole, through the sum of their solutions.
func (a *analysis) balances() []caseBalance {
	cs := a.job.Model.Cases
	out := make([]caseBalance, len(cs))
	for c := range cs {
		out[c] = caseBalance{name: cs[c].Name, b: a.sol.BalanceOf(a.lay.Whole(c))}
	}
	return out
}

// staticsError returns an error naming every case whose statics check fails,
// or nil.
func staticsError(bs []caseBalance) error {
	var bad []string
	for _, cb := range bs {
		if cb.ok() {
			continue
		}
		o := cb.b.Out()
		bad = append(bad, fmt.Sprintf("case %q is out of balance by %.2g of its load (limit %g): reactions miss the loads by Fx %.3g, Fy %.3g, M %.3g; largest joint residual force %.3g, moment %.3g",
			cb.name, cb.b.Relative(), staticsLimit, o.Fx, o.Fy, o.M, cb.b.JointForce, cb.b.JointMoment))
	}
	if len(bad) == 0 {
		return nil
	}
	return fmt.Errorf("statics check failed; the results are not written:\n%s", strings.Join(bad, "\n"))
}

// sci formats a small positive quantity such as a residual.
func sci(v float64) string { return strconv.FormatFloat(clean(v), 'e', 1, 64) }

// writeStatics prints the statics check of every case.
func (a *analysis) writeStatics(w io.Writer, bs []caseBalance) error {
	return a.staticsTable(textTables{w}, bs)
}

// staticsTable gives the statics check of every case.
func (a *analysis) staticsTable(tb tables, bs []caseBalance) error {
	u := a.job.Units
	if err := tb.note(fmt.Sprintf("\nStatics check of each load case: sums about the global origin, forces in %s, moments in %s;\n"+
		"largest joint residual as force / moment; out of balance as a fraction of the load, limit %g", u.Force, u.Moment(), staticsLimit)); err != nil {
		return err
	}
	var rows [][]string
	for _, cb := range bs {
		b := cb.b
		check := "ok"
		if !cb.ok() {
			check = "FAIL"
		}
		rows = append(rows, []string{cb.name, fixed(b.Applied.Fx), fixed(b.Reactions.Fx), fixed(b.Applied.Fy), fixed(b.Reactions.Fy),
			fixed(b.Applied.M), fixed(b.Reactions.M), sci(b.JointForce) + " / " + sci(b.JointMoment), sci(b.Relative()), check})
	}
	return tb.table("", []string{"case", "loads ΣFx", "reactions ΣFx", "loads ΣFy", "reactions ΣFy", "loads ΣM", "reactions ΣM", "joint residual", "out of balance", "check"}, rows)
}
