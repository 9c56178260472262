package frame

import (
	"fmt"
	"math"
)

// Support is the restraint at a node.
type Support uint8

const (
	Free   Support = iota // no restraint
	Fixed                 // ux, uy and rz restrained
	Pinned                // ux and uy restrained
	Roller                // uy restrained; free to move along X
)

var supportNames = [...]string{"free", "fixed", "pinned", "roller"}

func (s Support) String() string {
	if int(s) < len(supportNames) {
		return supportNames[s]
	}
	return fmt.Sprintf("Support(%d)", uint8(s))
}

// Restrained reports whether degree of freedom d (0 ux, 1 uy, 2 rz) is held.
func (s Support) Restrained(d int) bool {
	switch s {
	case Fixed:
		return true
	case Pinned:
		return d < 2
	case Roller:
		return d == 1
	}
	return false
}

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
}

// Section holds the properties of a member cross-section.
type Section struct {
	Name   string
	E      float64 // modulus of elasticity, force/length²
	A      float64 // area, length²
	I      float64 // second moment of area about the bending axis, length⁴
	Weight float64 // self weight, force/length; 0 when not given
	// Depth is the overall depth of the section in the plane of the frame,
	// length; 0 when not given. The solver does not use it: it places the
	// faces of columns for design (see package envelope's Settings.Extra).
	Depth float64
}

// Member is a prismatic beam-column between two nodes.
type Member struct {
	Name       string
	Start, End int // node indices
	Section    int // section index
	Release    Release
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
	seen := map[string]bool{}
	for _, n := range mo.Nodes {
		if seen[n.Name] {
			add("node %q: duplicate name", n.Name)
		}
		seen[n.Name] = true
		if !finite(n.X) || !finite(n.Y) {
			add("node %q: coordinates must be finite numbers", n.Name)
		}
		if n.Support > Roller {
			add("node %q: unknown support %v", n.Name, n.Support)
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
		if l := mo.Length(i); !(l > 0) {
			add("member %q: zero length (nodes %q and %q coincide)", m.Name, mo.Nodes[m.Start].Name, mo.Nodes[m.End].Name)
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
