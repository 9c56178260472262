package analysis

import (
	"math"

	"govern/frame"
	"govern/frame/distribution"
)

// The cross-check compares the stiffness solver's member end moments with
// those of moment distribution (package frame/distribution), which shares
// nothing with it but the model. Moment distribution takes the members as
// axially rigid; the stiffness solver does not, so the two are compared
// twice (docs/verification.md):
//
//   - without axial strain: the stiffness solver solves the frame again with
//     every member's area multiplied by CrossCheckAreaFactor, and the two
//     must agree to CrossCheckRigidLimit of the case's largest end moment,
//     plus the axial strain left in the stiffened frame (the first term of
//     moment distribution's estimate over CrossCheckAreaFactor) and the
//     round-off of the stiffened frame's solution (its condition estimate
//     times 2⁻⁵²), both below 1e-6 in frames of a few storeys and larger in
//     tall ones;
//   - as given: moment distribution estimates the effect of axial strain as
//     a series (distribution.Result.AxialStrain), and the difference less
//     its first term must be at most CrossCheckRemainder times its second
//     term plus CrossCheckRigidLimit of the case's largest end moment. The
//     remainder of a series whose terms shrink at least by half is at most
//     twice its first neglected term; where the second term is more than
//     CrossCheckRatio of the first, the estimate is not trusted and the
//     case is compared without axial strain alone.
const (
	CrossCheckAreaFactor = 1e6
	CrossCheckRigidLimit = 1e-6
	CrossCheckRemainder  = 2.0
	CrossCheckRatio      = 0.5
)

// CrossCheck is the comparison of every load case's member end moments with
// those found again by moment distribution, independently of the stiffness
// solver.
type CrossCheck struct {
	// Sway is set when the frame was solved with sway corrections, one for
	// each beam line free to move along X (a storey), whose joints
	// SwayLines names.
	Sway      bool
	SwayLines [][]string
	// Indeterminate names the members whose axial force statics does not
	// give, left out of the estimate of axial strain.
	Indeterminate []string
	// RigidErr says why the comparison without axial strain was not made
	// (the stiffness solver refused the frame with its areas multiplied),
	// or is nil; RigidCond is the condition estimate of that frame's
	// stiffness matrix.
	RigidErr  error
	RigidCond float64
	Cases     []CaseCheck // per load case, in model order
}

// Difference is the largest difference in member end moments between
// moment distribution and the stiffness solver in one load case, and
// where it is: the end of Member at Node (-1 for none).
type Difference struct {
	Difference   float64
	Member, Node int
}

// CaseCheck is the cross-check of one load case.
type CaseCheck struct {
	Case string
	// Largest is the case's largest end moment by the stiffness solver,
	// the model as given.
	Largest float64
	// Rigid compares moment distribution with the stiffness solver with
	// every area multiplied by CrossCheckAreaFactor, whose largest end
	// moment is RigidLargest; RigidRelative is the difference over it and
	// RigidLimit the most it may be: CrossCheckRigidLimit + Axial /
	// (CrossCheckAreaFactor × RigidLargest) + RigidCond × 2⁻⁵².
	Rigid         Difference
	RigidLargest  float64
	RigidRelative float64
	RigidLimit    float64
	// Given compares moment distribution with the model as given.
	Given Difference
	// Axial and Second are the largest end moments of the first two terms
	// of moment distribution's estimate of the effect of axial strain.
	Axial, Second float64
	// Corrected is the largest difference from the stiffness solver once
	// the first term is added to moment distribution's end moments, and
	// Limit the most it may be: CrossCheckRemainder × Second +
	// CrossCheckRigidLimit × Largest. Estimated is false where Second is
	// more than CrossCheckRatio × Axial, and there is then no limit.
	Corrected Difference
	Limit     float64
	Estimated bool
}

// RigidAgrees reports whether the two methods agree without axial strain,
// within RigidLimit.
func (c CaseCheck) RigidAgrees() bool { return c.RigidRelative <= c.RigidLimit }

// GivenAgrees reports whether moment distribution with its estimate of
// axial strain agrees with the model as given, within Limit.
func (c CaseCheck) GivenAgrees() bool { return c.Estimated && c.Corrected.Difference <= c.Limit }

// CrossCheck solves every load case again by moment distribution and
// compares the member end moments. Where the method does not apply to the
// frame, the error is a *distribution.NotApplicableError saying why.
func (r *Result) CrossCheck() (*CrossCheck, error) {
	mo := r.Job.Model
	md, err := distribution.Solve(mo, &distribution.Options{AxialStrain: true})
	if err != nil {
		return nil, err
	}
	out := &CrossCheck{Sway: md.Sway, SwayLines: md.SwayLines, Indeterminate: md.Indeterminate}
	rigid, err := frame.SolveWith(rigidModel(mo), frame.Options{AcceptIllConditioned: true})
	if err != nil {
		out.RigidErr = err
		rigid = nil
	} else {
		out.RigidCond = rigid.Cond()
	}
	for c := range mo.Cases {
		cc := CaseCheck{Case: mo.Cases[c].Name, Rigid: noDifference, Given: noDifference, Corrected: noDifference}
		for m, mem := range mo.Members {
			f := r.endForces(c, m)
			var g [6]float64
			if rigid != nil {
				g = rigid.EndForces(c, m)
			}
			s, e := md.EndMoments(c, m)
			first, second := md.AxialStrain(c, m)
			for i, x := range []struct {
				given, rigid, dist float64
				node               int
			}{{f[2], g[2], s, mem.Start}, {f[5], g[5], e, mem.End}} {
				cc.Largest = math.Max(cc.Largest, math.Abs(x.given))
				cc.RigidLargest = math.Max(cc.RigidLargest, math.Abs(x.rigid))
				cc.Axial = math.Max(cc.Axial, math.Abs(first[i]))
				cc.Second = math.Max(cc.Second, math.Abs(second[i]))
				cc.Given.widen(math.Abs(x.given-x.dist), m, x.node)
				cc.Corrected.widen(math.Abs(x.given-x.dist-first[i]), m, x.node)
				if rigid != nil {
					cc.Rigid.widen(math.Abs(x.rigid-x.dist), m, x.node)
				}
			}
		}
		cc.RigidLimit = CrossCheckRigidLimit + out.RigidCond*0x1p-52
		if cc.RigidLargest > 0 {
			cc.RigidLimit += cc.Axial / CrossCheckAreaFactor / cc.RigidLargest
		}
		if cc.Rigid.Difference > 0 {
			cc.RigidRelative = cc.Rigid.Difference / cc.RigidLargest
		}
		cc.Estimated = cc.Second <= CrossCheckRatio*cc.Axial
		if cc.Estimated {
			cc.Limit = CrossCheckRemainder*cc.Second + CrossCheckRigidLimit*cc.Largest
		}
		out.Cases = append(out.Cases, cc)
	}
	return out, nil
}

var noDifference = Difference{Member: -1, Node: -1}

// widen makes d the larger of itself and difference v at member m's end
// at node.
func (d *Difference) widen(v float64, m, node int) {
	if v > d.Difference || d.Member < 0 {
		d.Difference, d.Member, d.Node = v, m, node
	}
}

// rigidModel returns mo with every member's area multiplied by
// CrossCheckAreaFactor, sharing everything else with it.
func rigidModel(mo *frame.Model) *frame.Model {
	out := *mo
	out.Sections = make([]frame.Section, len(mo.Sections))
	for i, s := range mo.Sections {
		s.A *= CrossCheckAreaFactor
		out.Sections[i] = s
	}
	return &out
}
