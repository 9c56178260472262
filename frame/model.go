package frame

import (
	"fmt"
	"math"
)

// Support is the restraint at a node: the set of its directions that are
// held, one bit each (ux 1, uy 2, rz 4). The named kinds are Free, Fixed,
// Pinned and Roller; any other set is a restraint by direction, such as
// HoldX alone (a floor held laterally only) or HoldY|HoldRZ.
type Support uint8

const (
	Free   Support = 0                      // no restraint
	HoldX  Support = 1                      // ux restrained
	HoldY  Support = 2                      // uy restrained
	HoldRZ Support = 4                      // rz restrained
	Fixed          = HoldX | HoldY | HoldRZ // ux, uy and rz restrained
	Pinned         = HoldX | HoldY          // ux and uy restrained
	Roller         = HoldY                  // uy restrained; free to move along X
)

// Hold returns the support that holds the directions d (0 ux, 1 uy, 2 rz).
func Hold(d ...int) Support {
	var s Support
	for _, k := range d {
		s |= 1 << k
	}
	return s
}

func (s Support) String() string {
	switch s {
	case Free:
		return "free"
	case Fixed:
		return "fixed"
	case Pinned:
		return "pinned"
	case Roller:
		return "roller"
	}
	if s > Fixed {
		return fmt.Sprintf("Support(%d)", uint8(s))
	}
	out := ""
	for d, n := range [3]string{"x", "y", "rotation"} {
		if s.Restrained(d) {
			if out != "" {
				out += "+"
			}
			out += n
		}
	}
	return out
}

// Restrained reports whether degree of freedom d (0 ux, 1 uy, 2 rz) is held.
func (s Support) Restrained(d int) bool { return d >= 0 && d < 3 && s&(1<<d) != 0 }

// Release is a moment release (hinge) at one or both ends of a member.
type Release uint8

const (
	ReleaseNone  Release = iota // rigidly connected at both ends
	ReleaseStart                // hinge at the start node
	ReleaseEnd                  // hinge at the end node
	ReleaseBoth                 // hinges at both ends
)

var releaseNames = [...]string{"none", "start", "end", "both"}

func (r Release) String() string {
	if int(r) < len(releaseNames) {
		return releaseNames[r]
	}
	return fmt.Sprintf("Release(%d)", uint8(r))
}

// AtStart reports whether the start end is hinged.
func (r Release) AtStart() bool { return r == ReleaseStart || r == ReleaseBoth }

// AtEnd reports whether the end node end is hinged.
func (r Release) AtEnd() bool { return r == ReleaseEnd || r == ReleaseBoth }

// Node is a joint of the frame.
type Node struct {
	Name    string
	X, Y    float64
	Support Support
	// Springs are the stiffnesses of elastic supports in the directions
	// the support does not hold: kx and ky (force/length) and kr
	// (moment/radian); 0 where there is none. A spring's reaction is −k
	// times the node's displacement in its direction.
	Springs [3]float64
}

// Supported reports whether anything holds the node: its support or a
// spring. Such a node has reactions.
func (n *Node) Supported() bool {
	return n.Support != Free || n.Springs != [3]float64{}
}

// Reacts reports whether the node has a reaction in direction d (0 ux,
// 1 uy, 2 rz): the support holds it or a spring acts in it.
func (n *Node) Reacts(d int) bool { return n.Support.Restrained(d) || n.Springs[d] > 0 }

// Section holds the properties of a member cross-section.
type Section struct {
	Name   string
	E      float64 // modulus of elasticity, force/length²
	A      float64 // area, length²
	I      float64 // second moment of area about the bending axis, length⁴
	Weight float64 // self weight, force/length; 0 when not given
	// Depth is the overall depth of the section in the plane of the frame,
	// length; 0 when not given. It places the faces of columns for design
	// (see package envelope's Settings.Extra) and sets the rigid end zones
	// of [Model.SetRigidZones]; the solver uses it only for the curvature
	// of a temperature gradient ([MemberLoad] Thermal).
	Depth float64
	// Alpha is the coefficient of thermal expansion, 1/temperature; 0 when
	// not given. Needed by temperature loads.
	Alpha float64
}

// Member is a prismatic beam-column between two nodes.
//
// Its ends may be rigid (the default), released (a hinge: Release) or
// semi-rigid: a rotational spring of stiffness SpringStart or SpringEnd
// (moment/radian) between the member's end and the node, in series with
// the member. OffsetStart and OffsetEnd are rigid end zones (length): the
// member is rigid for that distance from its node, along its axis, and
// flexible between; the releases and springs act at the ends of the
// flexible part. Loads, stations and results are measured from the start
// node along the whole length between the nodes.
type Member struct {
	Name       string
	Start, End int // node indices
	Section    int // section index
	Release    Release

	SpringStart, SpringEnd float64 // rotational stiffness of a semi-rigid end; 0: none
	OffsetStart, OffsetEnd float64 // rigid end zones, length; 0: none
}

// Model is a plane frame with its load cases. The zero value is an empty
// model; [Model.Validate] reports what is missing.
type Model struct {
	Nodes    []Node
	Sections []Section
	Members  []Member
	Cases    []Case
}

// Length returns the length of member m.
func (mo *Model) Length(m int) float64 {
	c, s, l := mo.geometry(m)
	_, _ = c, s
	return l
}

// geometry returns the direction cosines and length of member m.
func (mo *Model) geometry(m int) (c, s, l float64) {
	a, b := mo.Nodes[mo.Members[m].Start], mo.Nodes[mo.Members[m].End]
	dx, dy := b.X-a.X, b.Y-a.Y
	l = math.Hypot(dx, dy)
	return dx / l, dy / l, l
}

// orientationTol is the relative tolerance under which a member counts as
// horizontal or vertical.
const orientationTol = 1e-6

// IsBeam reports whether member m is horizontal.
func (mo *Model) IsBeam(m int) bool {
	a, b := mo.Nodes[mo.Members[m].Start], mo.Nodes[mo.Members[m].End]
	return math.Abs(b.Y-a.Y) <= orientationTol*math.Hypot(b.X-a.X, b.Y-a.Y)
}

// PlumbTol is how far out of plumb a column may be: a member counts as a
// column when the horizontal distance between its ends is at most this
// fraction of the difference in their heights. A hundredth is well past
// the erection tolerances of the codes (a few thousandths), so that a
// column set out a millimetre off its line is still a column, and well
// short of a deliberately raking member.
const PlumbTol = 0.01

// IsColumn reports whether member m is vertical, or out of plumb by at
// most PlumbTol.
func (mo *Model) IsColumn(m int) bool {
	a, b := mo.Nodes[mo.Members[m].Start], mo.Nodes[mo.Members[m].End]
	return math.Abs(b.X-a.X) <= PlumbTol*math.Abs(b.Y-a.Y)
}

// Bottom returns the lower end node of member m (its start when both are
// at one height): where a column stands.
func (mo *Model) Bottom(m int) int {
	mem := mo.Members[m]
	if mo.Nodes[mem.End].Y < mo.Nodes[mem.Start].Y {
		return mem.End
	}
	return mem.Start
}

// Validate checks that the model is complete and consistent: names are
// unique, references are in range, members have length, sections are
// positive and finite, loads lie on their members. It returns every problem
// found, joined, or nil.
func (mo *Model) Validate() error {
	var errs ValidationErrors
	add := func(format string, args ...any) { errs = append(errs, fmt.Errorf(format, args...)) }
	if len(mo.Nodes) == 0 {
		add("model has no nodes")
	}
	if len(mo.Members) == 0 {
		add("model has no members")
	}
	// The names of the nodes, then of the sections, members and cases,
	// each in turn: sized at once for the most, not grown and rehashed.
	seen := make(map[string]bool, max(len(mo.Nodes), len(mo.Sections), len(mo.Members), len(mo.Cases)))
	for _, n := range mo.Nodes {
		if seen[n.Name] {
			add("node %q: duplicate name", n.Name)
		}
		seen[n.Name] = true
		if !finite(n.X) || !finite(n.Y) {
			add("node %q: coordinates must be finite numbers", n.Name)
		}
		if n.Support > Fixed {
			add("node %q: unknown support %v", n.Name, n.Support)
		}
		for d, k := range n.Springs {
			switch {
			case !(k >= 0) || !finite(k):
				add("node %q: spring %s must be a finite number >= 0, not %v", n.Name, springNames[d], k)
			case k > 0 && n.Support.Restrained(d):
				add("node %q: spring %s acts in a direction the support holds", n.Name, springNames[d])
			}
		}
	}
	clear(seen)
	for _, s := range mo.Sections {
		if seen[s.Name] {
			add("section %q: duplicate name", s.Name)
		}
		seen[s.Name] = true
		for _, p := range []struct {
			key string
			v   float64
		}{{"E", s.E}, {"A", s.A}, {"I", s.I}} {
			if !(p.v > 0) || !finite(p.v) {
				add("section %q: %s must be a positive finite number, not %v", s.Name, p.key, p.v)
			}
		}
		if s.Weight < 0 || !finite(s.Weight) {
			add("section %q: weight must be a finite number >= 0, not %v", s.Name, s.Weight)
		}
		if s.Depth < 0 || !finite(s.Depth) {
			add("section %q: depth must be a finite number >= 0, not %v", s.Name, s.Depth)
		}
		if s.Alpha < 0 || !finite(s.Alpha) {
			add("section %q: alpha must be a finite number >= 0, not %v", s.Name, s.Alpha)
		}
	}
	clear(seen)
	connected := make([]bool, len(mo.Nodes))
	for i, m := range mo.Members {
		if seen[m.Name] {
			add("member %q: duplicate name", m.Name)
		}
		seen[m.Name] = true
		if m.Start < 0 || m.Start >= len(mo.Nodes) || m.End < 0 || m.End >= len(mo.Nodes) {
			add("member %q: node index out of range", m.Name)
			continue
		}
		if m.Section < 0 || m.Section >= len(mo.Sections) {
			add("member %q: section index out of range", m.Name)
		}
		if m.Release > ReleaseBoth {
			add("member %q: unknown release %v", m.Name, m.Release)
		}
		connected[m.Start], connected[m.End] = true, true
		l := mo.Length(i)
		if !(l > 0) {
			add("member %q: zero length (nodes %q and %q coincide)", m.Name, mo.Nodes[m.Start].Name, mo.Nodes[m.End].Name)
		}
		for _, p := range []struct {
			key      string
			v        float64
			released bool
		}{{"start", m.SpringStart, m.Release.AtStart()}, {"end", m.SpringEnd, m.Release.AtEnd()}} {
			switch {
			case !(p.v >= 0) || !finite(p.v):
				add("member %q: the spring at its %s must be a finite number >= 0, not %v", m.Name, p.key, p.v)
			case p.v > 0 && p.released:
				add("member %q: a spring at its %s, which is released; give a release or a spring, not both", m.Name, p.key)
			}
		}
		if !(m.OffsetStart >= 0) || !finite(m.OffsetStart) || !(m.OffsetEnd >= 0) || !finite(m.OffsetEnd) {
			add("member %q: rigid end zones must be finite numbers >= 0, not %v and %v", m.Name, m.OffsetStart, m.OffsetEnd)
		} else if l > 0 && !(l-m.OffsetStart-m.OffsetEnd > offsetTol*l) {
			add("member %q: rigid end zones %g and %g leave no flexible length (length %g)", m.Name, m.OffsetStart, m.OffsetEnd, l)
		}
	}
	for i, n := range mo.Nodes {
		if !connected[i] {
			add("node %q: not connected to any member", n.Name)
		}
	}
	clear(seen)
	for _, c := range mo.Cases {
		if seen[c.Name] {
			add("case %q: duplicate name", c.Name)
		}
		seen[c.Name] = true
		for _, err := range c.validate(mo) {
			errs = append(errs, fmt.Errorf("case %q: %w", c.Name, err))
		}
	}
	if len(errs) == 0 {
		return nil
	}
	return errs
}

// springNames names the springs of a node, by direction.
var springNames = [3]string{"kx", "ky", "kr"}

// offsetTol is the least flexible length, as a fraction of the member's,
// that rigid end zones must leave.
const offsetTol = 1e-6

// ValidationErrors lists every problem [Model.Validate] found.
type ValidationErrors []error

func (e ValidationErrors) Error() string {
	s := ""
	for i, err := range e {
		if i > 0 {
			s += "\n"
		}
		s += err.Error()
	}
	return s
}

// Unwrap returns the individual errors.
func (e ValidationErrors) Unwrap() []error { return e }

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
