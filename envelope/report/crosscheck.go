package report

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"govern/envelope/analysis"
	"govern/frame/distribution"
)

// writeCrossCheck solves every case again by moment distribution and prints,
// for each, the largest difference in member end moments from the direct
// stiffness solution, or why the method does not apply.
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
	if cc.Sway {
		fmt.Fprintf(w, "With the sway correction for the storey at joints %s.\n", Escape(strings.Join(cc.SwayNodes, ", ")))
	} else {
		fmt.Fprintf(w, "Every joint is held against sway: no sway correction.\n")
	}
	fmt.Fprintf(w, "End moments in %s. Moment distribution neglects axial strain, so differences of up to a few percent come from\n", Escape(p.moment.Label))
	fmt.Fprintf(w, "the unequal shortening of the columns; one above %g%% of the case's largest end moment is marked \"differs\".\n", 100*analysis.CrossCheckFlag)
	t := newTable(w, "case", "largest difference", "at", "largest end moment", "relative", "check")
	for _, c := range cc.Cases {
		at := ""
		if c.Member >= 0 {
			at = fmt.Sprintf("%s at %s", mo.Members[c.Member].Name, mo.Nodes[c.Node].Name)
		}
		check := "agrees"
		if !c.Agrees() {
			check = "differs"
		}
		if err := t.Append([]string{c.Case, sci(p.moment.Of(c.Difference)), at, fixed(p.moment.Of(c.Largest)), sci(c.Relative), check}); err != nil {
			return err
		}
	}
	return t.Render()
}
