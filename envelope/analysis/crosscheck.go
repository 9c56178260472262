package analysis

import (
	"math"

	"govern/frame/distribution"
)

// CrossCheckFlag is the fraction of a case's largest end moment above which
// the two methods are reported as differing. Moment distribution neglects the
// axial strain the stiffness solver includes; the unequal shortening of the
// columns of a building frame moves its end moments by up to a few percent.
const CrossCheckFlag = 0.05

// CrossCheck is the comparison of every load case's member end moments with
// those found again by moment distribution (package frame/distribution),
// independently of the stiffness solver.
type CrossCheck struct {
	// Sway is set when the frame was solved with the sway correction of
	// its storey, at the joints SwayNodes.
	Sway      bool
	SwayNodes []string
	Cases     []CaseCheck // per load case, in model order
}

// CaseCheck is the cross-check of one load case: the largest difference
// in member end moments, where it is, and how large it is against the
// case's largest end moment.
type CaseCheck struct {
	Case       string
	Difference float64
	// Member and Node say where the largest difference is: the member's
	// end at the node.
	Member, Node int
	Largest      float64 // the largest end moment by the stiffness solver
	Relative     float64 // Difference / Largest; 0 when Difference is
}

// Agrees reports whether the two methods agree within CrossCheckFlag.
func (c CaseCheck) Agrees() bool { return c.Relative <= CrossCheckFlag }

// CrossCheck solves every load case again by moment distribution and
// compares the member end moments. Where the method does not apply to the
// frame, the error is a *distribution.NotApplicableError saying why.
func (r *Result) CrossCheck() (*CrossCheck, error) {
	mo := r.Job.Model
	md, err := distribution.Solve(mo, nil)
	if err != nil {
		return nil, err
	}
	out := &CrossCheck{Sway: md.Sway, SwayNodes: md.SwayNodes}
	for c := range mo.Cases {
		cc := CaseCheck{Case: mo.Cases[c].Name, Member: -1, Node: -1}
		for m, mem := range mo.Members {
			f := r.endForces(c, m)
			s, e := md.EndMoments(c, m)
			for _, x := range []struct {
				stiff, dist float64
				node        int
			}{{f[2], s, mem.Start}, {f[5], e, mem.End}} {
				cc.Largest = math.Max(cc.Largest, math.Abs(x.stiff))
				if d := math.Abs(x.stiff - x.dist); d > cc.Difference || cc.Member < 0 {
					cc.Difference, cc.Member, cc.Node = d, m, x.node
				}
			}
		}
		if cc.Difference > 0 {
			cc.Relative = cc.Difference / cc.Largest
		}
		out.Cases = append(out.Cases, cc)
	}
	return out, nil
}
