package report

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"govern/envelope/analysis"
	"govern/frame/distribution"
)

// maxSwayLines is the number of sway lines the cross-check names.
const maxSwayLines = 12

// writeCrossCheck solves every case again by moment distribution and prints,
// for each, the largest difference in member end moments from the direct
// stiffness solution, without axial strain and as given, or why the method
// does not apply.
func (p *Report) writeCrossCheck(w io.Writer) error {
	mo := p.model()
	fmt.Fprintf(w, "\nCross-check by moment distribution (Hardy Cross; members axially rigid, independent of the stiffness solver)\n")
	cc, err := p.res.CrossCheck()
	if err != nil {
		var na *distribution.NotApplicableError
		if errors.As(err, &na) {
			fmt.Fprintf(w, "Not made: moment distribution as implemented does not apply to this model: %s.\n", Escape(na.Reason))
			return nil
		}
		fmt.Fprintf(w, "Not made: %s.\n", Escape(err.Error()))
		return nil
	}
	switch n := len(cc.SwayLines); n {
	case 0:
		fmt.Fprintf(w, "Every joint is held against sway: no sway correction.\n")
	case 1:
		fmt.Fprintf(w, "With the sway correction for the storey at joints %s.\n", Escape(strings.Join(cc.SwayLines[0], ", ")))
	default:
		var lines []string
		for i, l := range cc.SwayLines {
			if i == maxSwayLines && n > maxSwayLines+1 {
				lines = append(lines, fmt.Sprintf("and %d more", n-i))
				break
			}
			if len(l) > 4 {
				lines = append(lines, fmt.Sprintf("%s to %s", l[0], l[len(l)-1]))
			} else {
				lines = append(lines, strings.Join(l, ", "))
			}
		}
		fmt.Fprintf(w, "With a sway correction for each of %d storeys, their amplitudes from the storey shear equations, at joints\n%s.\n", n, Escape(strings.Join(lines, "; ")))
	}
	at := func(d analysis.Difference) string {
		if d.Member < 0 {
			return ""
		}
		return fmt.Sprintf("%s at %s", mo.Members[d.Member].Name, mo.Nodes[d.Node].Name)
	}
	word := func(ok bool) string {
		if ok {
			return "agrees"
		}
		return "differs"
	}
	m := p.moment // end moments in the output unit of moments
	unit := Escape(m.Label)
	fmt.Fprintf(w, "End moments in %s. Without axial strain: against the stiffness solver with every member's area multiplied by %s;\n", unit, sci(analysis.CrossCheckAreaFactor))
	fmt.Fprintf(w, "the two must agree to %s of the case's largest end moment, plus the axial strain left (by the estimate below)\n", sci(analysis.CrossCheckRigidLimit))
	if cc.RigidErr != nil {
		fmt.Fprintf(w, "and the round-off of that solution.\nNot made: the stiffness solver refused the frame with its areas multiplied: %s.\n", Escape(cc.RigidErr.Error()))
	} else {
		fmt.Fprintf(w, "and the round-off of that solution (its condition estimate %s times 2^-52).\n", sci(cc.RigidCond))
		t := newTable(w, "case", "largest difference", "at", "largest end moment", "relative", "limit", "check")
		for _, c := range cc.Cases {
			if err := t.Append([]string{c.Case, sci(m.Of(c.Rigid.Difference)), at(c.Rigid), fixed(m.Of(c.RigidLargest)), sci(c.RigidRelative),
				sci(c.RigidLimit), word(c.RigidAgrees())}); err != nil {
				return err
			}
		}
		if err := t.Render(); err != nil {
			return err
		}
	}
	fmt.Fprintf(w, "As given: moment distribution estimates the effect of the axial strain it neglects (first term: the members'\n")
	fmt.Fprintf(w, "elongations under the axial forces found by statics, imposed on the frame); the difference less that estimate\n")
	fmt.Fprintf(w, "must be at most %g times the estimate's second term plus %s of the largest end moment (docs/verification.md).\n", analysis.CrossCheckRemainder, sci(analysis.CrossCheckRigidLimit))
	if len(cc.Indeterminate) > 0 {
		fmt.Fprintf(w, "Statics does not give the axial force of %s, left out of the estimate.\n", Escape(strings.Join(cc.Indeterminate, ", ")))
	}
	t := newTable(w, "case", "largest difference", "axial strain estimate", "difference less estimate", "at", "limit", "check")
	for _, c := range cc.Cases {
		limit, check := fixed(m.Of(c.Limit)), word(c.GivenAgrees())
		if !c.Estimated {
			limit, check = "-", "not estimated"
		}
		if err := t.Append([]string{c.Case, fixed(m.Of(c.Given.Difference)), fixed(m.Of(c.Axial)), fixed(m.Of(c.Corrected.Difference)), at(c.Corrected),
			limit, check}); err != nil {
			return err
		}
	}
	if err := t.Render(); err != nil {
		return err
	}
	for _, c := range cc.Cases {
		if !c.Estimated {
			fmt.Fprintf(w, "Case %s: the estimate's second term is more than %g of its first, so it does not bound what the first leaves out;\nthe case is checked without axial strain alone.\n", Escape(c.Case), analysis.CrossCheckRatio)
		}
	}
	return nil
}
