package distribution

import "govern/frame"

// applicable returns a *NotApplicableError for what this solver does not
// model: elastic supports, supports that hold other sets of directions
// than the named kinds, semi-rigid member ends, rigid end zones, and the
// loads it has no fixed-end moments for (concentrated moments on members,
// changes of temperature, imposed displacements). The stiffness solver
// handles them all; the cross-check is refused rather than made with a
// frame or a load other than the model's.
func applicable(mo *frame.Model) error {
	for _, n := range mo.Nodes {
		switch {
		case n.Springs != [3]float64{}:
			return notApplicable("node %q has a spring support (kx, ky or kr)", n.Name)
		case n.Support != frame.Free && n.Support != frame.Fixed && n.Support != frame.Pinned && n.Support != frame.Roller:
			return notApplicable("node %q is held in the directions %s; only free, fixed, pinned and roller supports are handled", n.Name, n.Support)
		}
	}
	for _, m := range mo.Members {
		switch {
		case m.SpringStart > 0 || m.SpringEnd > 0:
			return notApplicable("member %q has a semi-rigid end (a rotational spring)", m.Name)
		case m.OffsetStart > 0 || m.OffsetEnd > 0:
			return notApplicable("member %q has rigid end zones", m.Name)
		}
	}
	for _, c := range mo.Cases {
		if len(c.Displacements) > 0 {
			return notApplicable("case %q imposes displacements on supports", c.Name)
		}
		for _, ld := range c.MemberLoads {
			switch {
			case ld.Moment:
				return notApplicable("case %q has a concentrated moment on member %q", c.Name, mo.Members[ld.Member].Name)
			case ld.Thermal:
				return notApplicable("case %q has a change of temperature of member %q", c.Name, mo.Members[ld.Member].Name)
			}
		}
	}
	return nil
}
