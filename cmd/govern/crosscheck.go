package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"govern/frame/distribution"
)

// crossCheckFlag is the fraction of a case's largest end moment above which
// the two methods are reported as differing. Moment distribution neglects the
// axial strain the stiffness solver includes; the unequal shortening of the
// columns of a building frame moves its end moments by up to a few percent.
const crossCheckFlag = 0.05

// writeCrossCheck solves every case again by moment distribution and prints,
// for each, the largest difference in member end moments from the direct
// stiffness solution, or why the method does not apply.
func (a *analysis) writeCrossCheck(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	fmt.Fprintf(w, "\nCross-check by moment distribution (Hardy Cross; members axially rigid, independent of the stiffness solver)\n")
	md, err := distribution.Solve(mo, nil)
	if err != nil {
		var na *distribution.NotApplicableError
		if errors.As(err, &na) {
			fmt.Fprintf(w, "Not made: moment distribution as implemented does not apply to this model: %s.\n", escape(na.Reason))
			return nil
		}
		fmt.Fprintf(w, "Not made: %s.\n", escape(err.Error()))
		return nil
	}
	if md.Sway {
		fmt.Fprintf(w, "With the sway correction for the storey at joints %s.\n", escape(strings.Join(md.SwayNodes, ", ")))
	} else {
		fmt.Fprintf(w, "Every joint is held against sway: no sway correction.\n")
	}
	fmt.Fprintf(w, "End moments in %s. Moment distribution neglects axial strain, so differences of up to a few percent come from\n", escape(u.Moment()))
	fmt.Fprintf(w, "the unequal shortening of the columns; one above %g%% of the case's largest end moment is marked \"differs\".\n", 100*crossCheckFlag)
	t := newTable(w, "case", "largest difference", "at", "largest end moment", "relative", "check")
	for c := range mo.Cases {
		worst, at, scale := 0.0, "", 0.0
		for m, mem := range mo.Members {
			f := a.endForces(c, m)
			s, e := md.EndMoments(c, m)
			for _, x := range []struct {
				stiff, dist float64
				node        int
			}{{f[2], s, mem.Start}, {f[5], e, mem.End}} {
				scale = math.Max(scale, math.Abs(x.stiff))
				if d := math.Abs(x.stiff - x.dist); d > worst || at == "" {
					worst, at = d, fmt.Sprintf("%s at %s", mem.Name, mo.Nodes[x.node].Name)
				}
			}
		}
		rel := 0.0
		if worst > 0 {
			rel = worst / scale
		}
		check := "agrees"
		if rel > crossCheckFlag {
			check = "differs"
		}
		if err := t.Append([]string{mo.Cases[c].Name, sci(worst), at, fixed(scale), sci(rel), check}); err != nil {
			return err
		}
	}
	return t.Render()
}

// endForces returns member m's end forces in original case c, adding up the
// loads the case was solved as when it is patterned.
func (a *analysis) endForces(c, m int) [6]float64 {
	var f [6]float64
	for _, col := range a.lay.Whole(c) {
		g := a.sol.EndForces(col, m)
		for i := range f {
			f[i] += g[i]
		}
	}
	return f
}
