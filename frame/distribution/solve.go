package distribution

import (
	"fmt"
	"math"
	"strings"

	"govern/frame"
)

// NotApplicableError says why moment distribution, as implemented here, does
// not apply to a model.
type NotApplicableError struct {
	Reason string
}

func (e *NotApplicableError) Error() string {
	return "moment distribution does not apply: " + e.Reason
}

func notApplicable(format string, args ...any) error {
	return &NotApplicableError{Reason: fmt.Sprintf(format, args...)}
}

// Options controls the iteration. The zero value gives the defaults.
type Options struct {
	// Tol is the largest unbalanced joint moment accepted, as a fraction of
	// the largest fixed-end or applied moment of the distribution; 1e-12
	// when zero.
	Tol float64
	// MaxSweeps is the largest number of sweeps over the joints; 100000 when
	// zero.
	MaxSweeps int
}

// Result holds the end moments of every member in every case.
type Result struct {
	// Sway reports whether the sway correction was made; SwayNodes names the
	// joints that sway together.
	Sway      bool
	SwayNodes []string
	// Sweeps is the largest number of sweeps any distribution took.
	Sweeps int

	nm      int
	moments []float64 // [case][2*member+side]
}

// EndMoments returns the moments the joints exert on the start and end of
// member m in case c, counter-clockwise positive.
func (r *Result) EndMoments(c, m int) (start, end float64) {
	i := (c*r.nm + m) * 2
	return r.moments[i], r.moments[i+1]
}

// orientationTol is the relative tolerance under which a member counts as
// horizontal or vertical.
const orientationTol = 1e-6

// Solve analyses every load case of mo by moment distribution. It returns a
// *NotApplicableError when the method does not apply to the model, and other
// errors for a model it cannot solve (a joint that nothing holds, a
// distribution that does not converge). The model must be valid
// ([frame.Model.Validate]).
func Solve(mo *frame.Model, opt *Options) (*Result, error) {
	tol, maxSweeps := 1e-12, 100000
	if opt != nil {
		if opt.Tol > 0 {
			tol = opt.Tol
		}
		if opt.MaxSweeps > 0 {
			maxSweeps = opt.MaxSweeps
		}
	}
	if err := applicable(mo); err != nil {
		return nil, err
	}
	st, err := newStructure(mo)
	if err != nil {
		return nil, err
	}
	res := &Result{nm: len(mo.Members), moments: make([]float64, 2*len(mo.Cases)*len(mo.Members))}
	var unit []float64 // moments of the unit sway
	var unitProp float64
	if st.swayGroup >= 0 {
		res.Sway = true
		for v, n := range mo.Nodes {
			if st.group[v] == st.swayGroup && !st.tip[v] {
				res.SwayNodes = append(res.SwayNodes, n.Name)
			}
		}
		m, sweeps, err := st.distribute(-1, tol, maxSweeps)
		if err != nil {
			return nil, err
		}
		res.Sweeps = max(res.Sweeps, sweeps)
		unit, unitProp = m, st.prop(-1, m)
		if !(math.Abs(unitProp) > 0) {
			return nil, notApplicable("the joints %s are free to move along X and no column resists it", strings.Join(quote(res.SwayNodes), ", "))
		}
	}
	for c := range mo.Cases {
		m, sweeps, err := st.distribute(c, tol, maxSweeps)
		if err != nil {
			return nil, fmt.Errorf("case %q: %w", mo.Cases[c].Name, err)
		}
		res.Sweeps = max(res.Sweeps, sweeps)
		if unit != nil {
			alpha := -st.prop(c, m) / unitProp
			for i := range m {
				m[i] += alpha * unit[i]
			}
		}
		copy(res.moments[2*c*len(mo.Members):], m)
	}
	return res, nil
}

func quote(names []string) []string {
	out := make([]string, len(names))
	for i, n := range names {
		out[i] = fmt.Sprintf("%q", n)
	}
	return out
}

// structure is what the model's geometry and supports fix for every case.
type structure struct {
	mo      *frame.Model
	l, c, s []float64 // member length and direction cosines
	ei      []float64
	tip     []bool // node is the free tip of a cantilever
	cantTip []int  // per member: side (0 start, 1 end) of its free tip, or -1
	// kind of each member end, [2*m+side].
	kind  []endKind
	k     []float64 // rotational stiffness of an active end
	ends  [][]int   // per node: member ends (2*m+side) attached to it
	joint []bool    // node is balanced (free to rotate, two or more active ends)
	group []int     // per node: beam line it moves with along X (-1 for tips)
	// swayGroup is the one beam line free to move along X, or -1.
	swayGroup int
}

// endKind classifies a member end.
type endKind uint8

const (
	active    endKind = iota // takes a share of the joint's unbalanced moment, or is clamped
	released                 // hinge: moment zero
	pinnedEnd                // the only active end at a joint free to rotate: moment set by the joint's load
	statical                 // end of a cantilever: moment from statics
)

func newStructure(mo *frame.Model) (*structure, error) {
	nm, nn := len(mo.Members), len(mo.Nodes)
	st := &structure{mo: mo, l: make([]float64, nm), c: make([]float64, nm), s: make([]float64, nm), ei: make([]float64, nm),
		tip: make([]bool, nn), cantTip: make([]int, nm), kind: make([]endKind, 2*nm), k: make([]float64, 2*nm),
		ends: make([][]int, nn), joint: make([]bool, nn), group: make([]int, nn), swayGroup: -1}
	for m, mem := range mo.Members {
		a, b := mo.Nodes[mem.Start], mo.Nodes[mem.End]
		dx, dy := b.X-a.X, b.Y-a.Y
		l := math.Hypot(dx, dy)
		st.l[m], st.c[m], st.s[m] = l, dx/l, dy/l
		if math.Abs(dx) > orientationTol*l && math.Abs(dy) > orientationTol*l {
			return nil, notApplicable("member %q is inclined; only horizontal beams and vertical columns are handled", mem.Name)
		}
		// Snap to exact axes so that chord rotations are clean.
		if math.Abs(dy) <= orientationTol*l {
			st.c[m], st.s[m] = math.Copysign(1, dx), 0
		} else {
			st.c[m], st.s[m] = 0, math.Copysign(1, dy)
		}
		sec := mo.Sections[mem.Section]
		st.ei[m] = sec.E * sec.I
		st.ends[mem.Start] = append(st.ends[mem.Start], 2*m)
		st.ends[mem.End] = append(st.ends[mem.End], 2*m+1)
		st.cantTip[m] = -1
		if mem.Release.AtStart() {
			st.kind[2*m] = released
		}
		if mem.Release.AtEnd() {
			st.kind[2*m+1] = released
		}
	}
	// Cantilevers: a member whose end is at an unsupported node that no other
	// member reaches.
	for v, n := range mo.Nodes {
		if n.Support != frame.Free || len(st.ends[v]) != 1 {
			continue
		}
		e := st.ends[v][0]
		m, side := e/2, e%2
		other := 2*m + 1 - side
		if st.kind[other] == released || st.cantTip[m] >= 0 {
			return nil, fmt.Errorf("member %q: nothing holds it (a free end and a hinge or another free end)", mo.Members[m].Name)
		}
		st.tip[v] = true
		st.cantTip[m] = side
		st.kind[e], st.kind[other] = statical, statical
	}
	if err := st.checkVertical(); err != nil {
		return nil, err
	}
	if err := st.findSway(); err != nil {
		return nil, err
	}
	// Pinned ends: a joint free to rotate with a single active end.
	for v, n := range mo.Nodes {
		if n.Support == frame.Fixed || st.tip[v] {
			continue
		}
		var act []int
		for _, e := range st.ends[v] {
			if st.kind[e] == active {
				act = append(act, e)
			}
		}
		switch len(act) {
		case 0:
		case 1:
			st.kind[act[0]] = pinnedEnd
		default:
			st.joint[v] = true
		}
	}
	// Stiffness of active ends: 4EI/L, or 3EI/L when the far end is pinned.
	for m := range mo.Members {
		for side := range 2 {
			e, far := 2*m+side, 2*m+1-side
			if st.kind[e] != active {
				continue
			}
			if st.kind[far] == active {
				st.k[e] = 4 * st.ei[m] / st.l[m]
			} else {
				st.k[e] = 3 * st.ei[m] / st.l[m]
			}
		}
	}
	return st, nil
}

// checkVertical makes sure every joint but a cantilever tip is held
// vertically: by a support, or through columns (axially rigid) down to one.
func (st *structure) checkVertical() error {
	mo := st.mo
	held := make([]bool, len(mo.Nodes))
	var queue []int
	for v, n := range mo.Nodes {
		if n.Support.Restrained(1) {
			held[v] = true
			queue = append(queue, v)
		}
	}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		for _, e := range st.ends[v] {
			m := e / 2
			if st.c[m] != 0 || st.cantTip[m] >= 0 {
				continue // not a column
			}
			mem := mo.Members[m]
			w := mem.Start
			if w == v {
				w = mem.End
			}
			if !held[w] {
				held[w] = true
				queue = append(queue, w)
			}
		}
	}
	for v, n := range mo.Nodes {
		if !held[v] && !st.tip[v] {
			return notApplicable("node %q is not held vertically (no support or column below it); only joints held against vertical movement are handled", n.Name)
		}
	}
	return nil
}

// findSway groups the joints into beam lines that move together along X and
// finds the ones no support holds.
func (st *structure) findSway() error {
	mo := st.mo
	parent := make([]int, len(mo.Nodes))
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for m, mem := range mo.Members {
		if st.s[m] == 0 && st.cantTip[m] < 0 {
			parent[find(mem.Start)] = find(mem.End)
		}
	}
	held := map[int]bool{}
	for v, n := range mo.Nodes {
		if n.Support.Restrained(0) {
			held[find(v)] = true
		}
	}
	free := map[int][]string{}
	var order []int
	for v, n := range mo.Nodes {
		st.group[v] = -1
		if st.tip[v] {
			continue
		}
		g := find(v)
		st.group[v] = g
		if !held[g] {
			if _, ok := free[g]; !ok {
				order = append(order, g)
			}
			free[g] = append(free[g], n.Name)
		}
	}
	switch len(order) {
	case 0:
		return nil
	case 1:
		st.swayGroup = order[0]
		return nil
	}
	var lines []string
	for i, g := range order {
		if i == 3 {
			lines = append(lines, fmt.Sprintf("and %d more", len(order)-i))
			break
		}
		names := quote(free[g])
		if len(names) > 4 {
			names = append(names[:4], "...")
		}
		lines = append(lines, "("+strings.Join(names, ", ")+")")
	}
	return notApplicable("%d beam lines are free to sway, %s; the sway correction here is for a single storey", len(order), strings.Join(lines, ", "))
}

// loads returns the reduction of case c's loads on member m; c < 0 is the
// unloaded frame.
func (st *structure) loads(c, m int) memberLoads {
	var r memberLoads
	if c >= 0 {
		r.add(&st.mo.Cases[c], m, st.l[m], st.c[m], st.s[m])
	}
	return r
}

// nodeMoment returns the moment applied at node v in case c.
func (st *structure) nodeMoment(c, v int) float64 {
	if c < 0 {
		return 0
	}
	sum := 0.0
	for _, nl := range st.mo.Cases[c].NodeLoads {
		if nl.Node == v {
			sum += nl.M
		}
	}
	return sum
}

// nodeForce returns the force applied at node v in case c.
func (st *structure) nodeForce(c, v int) (fx, fy float64) {
	if c < 0 {
		return 0, 0
	}
	for _, nl := range st.mo.Cases[c].NodeLoads {
		if nl.Node == v {
			fx += nl.Fx
			fy += nl.Fy
		}
	}
	return fx, fy
}

// swayOf returns the X movement of node v in the unit sway (1 for the joints
// of the sway line, 0 for the rest).
func (st *structure) swayOf(v int) float64 {
	if st.swayGroup >= 0 && st.group[v] == st.swayGroup {
		return 1
	}
	return 0
}

// distribute returns the end moments of case c ([2*m+side]) with the frame
// held against sway, or, for c < 0, those of a unit sway of the sway line,
// and the number of sweeps it took.
func (st *structure) distribute(c int, tol float64, maxSweeps int) ([]float64, int, error) {
	mo := st.mo
	nm := len(mo.Members)
	mom := make([]float64, 2*nm)
	ref := 0.0
	// Fixed-end moments, from loads or from the chord rotation of a sway.
	for m, mem := range mo.Members {
		if st.cantTip[m] >= 0 {
			continue
		}
		var fs, fe float64
		if c >= 0 {
			r := st.loads(c, m)
			fs, fe = r.fs, r.fe
		} else if st.s[m] != 0 {
			// Column: the ends move across it by -s·ux; chord rotation ψ.
			psi := (-st.s[m]*st.swayOf(mem.End) + st.s[m]*st.swayOf(mem.Start)) / st.l[m]
			fs = -6 * st.ei[m] * psi / st.l[m]
			fe = fs
		}
		mom[2*m], mom[2*m+1] = fs, fe
		ref = math.Max(ref, math.Max(math.Abs(fs), math.Abs(fe)))
	}
	// Cantilevers, by statics.
	for m, mem := range mo.Members {
		side := st.cantTip[m]
		if side < 0 {
			continue
		}
		tipNode, tipPos, nearPos := mem.End, st.l[m], 0.0
		if side == 0 {
			tipNode, tipPos, nearPos = mem.Start, 0, st.l[m]
		}
		r := st.loads(c, m)
		fx, fy := st.nodeForce(c, tipNode)
		mt := st.nodeMoment(c, tipNode)
		ft := -st.s[m]*fx + st.c[m]*fy // transverse component of the tip force
		mn := -(mt + r.q1 - nearPos*r.q0 + (tipPos-nearPos)*ft)
		mom[2*m+side], mom[2*m+1-side] = mt, mn
		ref = math.Max(ref, math.Max(math.Abs(mt), math.Abs(mn)))
	}
	for v := range mo.Nodes {
		ref = math.Max(ref, math.Abs(st.nodeMoment(c, v)))
	}
	// Hinges carry no moment, and a pinned end takes what its joint needs:
	// set each and carry half of the change to the far end.
	for m := range mo.Members {
		for side := range 2 {
			if e := 2*m + side; st.kind[e] == released {
				st.release(mom, e, 0)
			}
		}
	}
	for v, n := range mo.Nodes {
		if n.Support == frame.Fixed || st.tip[v] {
			continue
		}
		var pin = -1
		rest := st.nodeMoment(c, v)
		for _, e := range st.ends[v] {
			if st.kind[e] == pinnedEnd {
				pin = e
			} else {
				rest -= mom[e]
			}
		}
		if pin < 0 {
			continue
		}
		st.release(mom, pin, rest)
	}
	// Joints free to rotate with no active end must already balance.
	for v, n := range mo.Nodes {
		if n.Support == frame.Fixed || st.tip[v] || st.joint[v] {
			continue
		}
		u := st.unbalanced(c, v, mom)
		if math.Abs(u) > 1e-9*math.Max(ref, 1e-300) {
			return nil, 0, fmt.Errorf("node %q is free to rotate and nothing resists its moment %g", n.Name, u)
		}
	}
	if ref == 0 {
		return mom, 0, nil
	}
	for sweep := 1; sweep <= maxSweeps; sweep++ {
		worst := 0.0
		for v := range mo.Nodes {
			if !st.joint[v] {
				continue
			}
			u := st.unbalanced(c, v, mom)
			worst = math.Max(worst, math.Abs(u))
			sumK := 0.0
			for _, e := range st.ends[v] {
				if st.kind[e] == active {
					sumK += st.k[e]
				}
			}
			for _, e := range st.ends[v] {
				if st.kind[e] != active {
					continue
				}
				d := u * st.k[e] / sumK
				mom[e] += d
				if far := e ^ 1; st.kind[far] == active {
					mom[far] += d / 2
				}
			}
		}
		if worst <= tol*ref {
			return mom, sweep, nil
		}
	}
	return nil, 0, fmt.Errorf("moment distribution did not converge in %d sweeps", maxSweeps)
}

// release sets end e to the moment target and carries half of the change to
// the far end when the far end is active (a pinned or hinged end).
func (st *structure) release(mom []float64, e int, target float64) {
	d := target - mom[e]
	mom[e] = target
	if far := e ^ 1; st.kind[far] == active {
		mom[far] += d / 2
	}
}

// unbalanced returns the moment joint v needs from its member ends: the
// applied moment less the sum of the end moments there.
func (st *structure) unbalanced(c, v int, mom []float64) float64 {
	u := st.nodeMoment(c, v)
	for _, e := range st.ends[v] {
		u -= mom[e]
	}
	return u
}

// prop returns the force along X that a prop at the sway line must exert to
// hold it, with end moments mom in case c (c < 0: no loads).
func (st *structure) prop(c int, mom []float64) float64 {
	mo := st.mo
	g := st.swayGroup
	in := func(v int) bool { return st.group[v] == g }
	sum := 0.0 // X forces on the free body: sway-line joints, their beams and cantilevers
	for v := range mo.Nodes {
		if in(v) {
			fx, _ := st.nodeForce(c, v)
			sum += fx
		}
	}
	for m, mem := range mo.Members {
		r := st.loads(c, m)
		if side := st.cantTip[m]; side >= 0 {
			near, tipNode := mem.Start, mem.End
			if side == 0 {
				near, tipNode = mem.End, mem.Start
			}
			if in(near) {
				fx, _ := st.nodeForce(c, tipNode)
				sum += r.gx + fx
			}
			continue
		}
		if st.s[m] == 0 {
			if in(mem.Start) {
				sum += r.gx // a beam of the sway line takes its X load along its axis
			}
			continue
		}
		// Column: transverse end forces the joints exert on it, by statics.
		ms, me := mom[2*m], mom[2*m+1]
		fe := -(ms + me + r.q1) / st.l[m]
		fs := -fe - r.q0
		// The column pushes on a joint with s·F along X (local y is (-s, 0)).
		if in(mem.Start) {
			sum += st.s[m] * fs
		}
		if in(mem.End) {
			sum += st.s[m] * fe
		}
	}
	return -sum
}
