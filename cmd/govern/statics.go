package main

import (
	"fmt"
	"io"
	"math"
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
	// roundOff is the imbalance round-off alone may leave
	// (frame.Solution.RoundOff); it raises the limit above staticsLimit for
	// an ill-conditioned stiffness matrix.
	roundOff float64
}

// limit is the largest imbalance the check accepts.
func (cb caseBalance) limit() float64 { return math.Max(staticsLimit, cb.roundOff) }

func (cb caseBalance) ok() bool { return cb.b.Relative() <= cb.limit() }

// balances returns the statics check of every load case of the model. A
// patterned case was solved as several loads (its rest and its pieces or
// arrangements); it is checked whole, through the sum of their solutions.
func (a *analysis) balances() []caseBalance {
	cs := a.job.Model.Cases
	out := make([]caseBalance, len(cs))
	for c := range cs {
		out[c] = caseBalance{name: cs[c].Name, b: a.sol.BalanceOf(a.lay.Whole(c)), roundOff: a.sol.RoundOff()}
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
		bad = append(bad, fmt.Sprintf("case %q is out of balance by %.2g of its load (limit %.2g): reactions miss the loads by Fx %.3g, Fy %.3g, M %.3g; largest joint residual force %.3g, moment %.3g",
			cb.name, cb.b.Relative(), cb.limit(), o.Fx, o.Fy, o.M, cb.b.JointForce, cb.b.JointMoment))
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
	limit := staticsLimit
	if len(bs) > 0 {
		limit = bs[0].limit()
	}
	about := "the global origin"
	if len(bs) > 0 && (bs[0].b.X0 != 0 || bs[0].b.Y0 != 0) {
		about = fmt.Sprintf("(%s, %s), the lower left corner of the frame", strconv.FormatFloat(bs[0].b.X0, 'g', -1, 64), strconv.FormatFloat(bs[0].b.Y0, 'g', -1, 64))
	}
	if err := tb.note(fmt.Sprintf("\nStatics check of each load case: sums about %s, forces in %s, moments in %s;\n"+
		"largest joint residual as force / moment; out of balance as a fraction of the load, limit %.2g", about, u.Force, u.Moment(), limit)); err != nil {
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
