package distribution

import (
	"errors"
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
	// AxialStrain makes Solve estimate, for every case, the effect of the
	// axial strain it neglects ([Result.AxialStrain]). It takes two more
	// distributions per case.
	AxialStrain bool
}

// Result holds the end moments of every member in every case.
type Result struct {
	// Sway reports whether sway corrections were made; SwayLines names the
	// joints of each beam line free to move along X (a storey), one sway
	// correction each, in the order of their first joint in the model.
	Sway      bool
	SwayLines [][]string
	// Sweeps is the largest number of sweeps any distribution took.
	Sweeps int

	// Indeterminate names, with Options.AxialStrain, the members whose
	// axial force statics does not give (between two supports that hold
	// them along their axis): their axial strain is left out of
	// AxialStrain.
	Indeterminate []string

	nm      int
	moments []float64 // [case][2*member+side]
	axial   []float64 // [case][term][2*member+side]: the effect of axial strain
	sway    []float64 // [case][line]: the movement along X of each sway line
}

// EndMoments returns the moments the joints exert on the start and end of
// member m in case c, counter-clockwise positive.
func (r *Result) EndMoments(c, m int) (start, end float64) {
	i := (c*r.nm + m) * 2
	return r.moments[i], r.moments[i+1]
}

// AxialStrain returns the estimated change in the end moments (start, end)
// of member m in case c that the axial strain of the members causes, which
// moment distribution otherwise neglects; only with Options.AxialStrain.
// The change is a series: its first term is what the frame gives when the
// elongations of its members under the axial forces of the case (found by
// statics from the end moments) are imposed on it, and each further term
// is the same for the axial forces the previous term causes. First is the
// first term; second the second, whose size says how much the first
// leaves out.
func (r *Result) AxialStrain(c, m int) (first, second [2]float64) {
	if r.axial == nil {
		panic("distribution: AxialStrain without Options.AxialStrain")
	}
	i := (2*c*r.nm + m) * 2
	j := i + 2*r.nm
	return [2]float64{r.axial[i], r.axial[i+1]}, [2]float64{r.axial[j], r.axial[j+1]}
}

// Drift returns the movement along X (+X positive, length units of the
// model) of sway line j (an index of SwayLines) in case c: the amplitude of
// its sway correction, since each correction is a unit movement of its line.
func (r *Result) Drift(c, j int) float64 {
	return r.sway[c*len(r.SwayLines)+j]
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
	tol, maxSweeps, axial := 1e-12, 100000, false
	if opt != nil {
		axial = opt.AxialStrain
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
	ns := len(st.lines)
	res := &Result{nm: len(mo.Members), moments: make([]float64, 2*len(mo.Cases)*len(mo.Members)),
		sway: make([]float64, len(mo.Cases)*ns)}
	for _, g := range st.lines {
		var names []string
		for v, n := range mo.Nodes {
			if st.group[v] == g && !st.tip[v] {
				names = append(names, n.Name)
			}
		}
		res.SwayLines = append(res.SwayLines, names)
	}
	res.Sway = ns > 0
	d := &distributor{st: st, tol: tol, maxSweeps: maxSweeps}
	if err := d.swayCorrections(); err != nil {
		var bad *singularError
		if errors.As(err, &bad) {
			return nil, notApplicable("the joints %s are free to move along X and no column resists it", strings.Join(quote(res.SwayLines[bad.line]), ", "))
		}
		return nil, err
	}
	var psi []float64
	if axial {
		psi = make([]float64, len(mo.Members))
		res.axial = make([]float64, 4*len(mo.Cases)*len(mo.Members))
		for _, k := range st.indeterminate() {
			res.Indeterminate = append(res.Indeterminate, mo.Members[k].Name)
		}
	}
	for c := range mo.Cases {
		m, alpha, err := d.solve(c, nil)
		if err != nil {
			return nil, fmt.Errorf("case %q: %w", mo.Cases[c].Name, err)
		}
		copy(res.sway[c*ns:], alpha)
		copy(res.moments[2*c*len(mo.Members):], m)
		if axial {
			if err := d.axialStrain(res, c, m, psi); err != nil {
				return nil, fmt.Errorf("case %q: axial strain: %w", mo.Cases[c].Name, err)
			}
		}
	}
	res.Sweeps = d.sweeps
	return res, nil
}

// distributor distributes the moments of one structure, with its sway
// corrections made once and used for every case.
type distributor struct {
	st           *structure
	tol          float64
	maxSweeps    int
	sweeps       int         // the largest number of sweeps any distribution took
	units        [][]float64 // end moments of the unit sway of each line
	sw           *swaySystem // the storey shear equations
	props, alpha []float64
}

// swayCorrections distributes a unit sway of each beam line free to move
// along X, every other line held, and factors the storey shear equations:
// entry (i, j) is the force the prop of line i must exert to hold the frame
// in the unit sway of line j.
func (d *distributor) swayCorrections() error {
	st := d.st
	ns := len(st.lines)
	if ns == 0 {
		return nil
	}
	k := make([]float64, ns*ns)
	col := make([]float64, ns)
	psi := make([]float64, len(st.mo.Members))
	for j := range ns {
		st.swayRotations(psi, j)
		m, err := d.distribute(-1, psi)
		if err != nil {
			return err
		}
		d.units = append(d.units, m)
		st.props(col, -1, m)
		for i := range ns {
			k[i*ns+j] = col[i]
		}
	}
	sw, bad := factor(k, ns)
	if sw == nil {
		return &singularError{line: bad}
	}
	d.sw = sw
	d.props, d.alpha = make([]float64, ns), make([]float64, ns)
	return nil
}

// singularError is a set of storey shear equations with no solution: the
// line's movement along X is not resisted.
type singularError struct{ line int }

func (e *singularError) Error() string { return fmt.Sprintf("sway line %d is not resisted", e.line) }

// solve returns the end moments of case c (c < 0: no loads) with the
// imposed chord rotations psi (nil: none), the sway corrections added so
// that no prop force remains, and the amplitudes of the corrections (the
// movement of each sway line along X). The amplitudes are overwritten by
// the next call.
func (d *distributor) solve(c int, psi []float64) ([]float64, []float64, error) {
	st := d.st
	m, err := d.distribute(c, psi)
	if err != nil {
		return nil, nil, err
	}
	if d.sw == nil {
		return m, nil, nil
	}
	// The storey shear equations: the amplitudes that make every prop
	// force vanish, Σj k[i][j] αj = −p[i].
	st.props(d.props, c, m)
	for i, p := range d.props {
		d.alpha[i] = -p
	}
	d.sw.solve(d.alpha)
	for j, a := range d.alpha {
		for i := range m {
			m[i] += a * d.units[j][i]
		}
	}
	return m, d.alpha, nil
}

func (d *distributor) distribute(c int, psi []float64) ([]float64, error) {
	m, sweeps, err := d.st.distribute(c, psi, d.tol, d.maxSweeps)
	d.sweeps = max(d.sweeps, sweeps)
	return m, err
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
	// lines are the beam lines free to move along X (groups), and line
	// gives each node's index among them, or -1.
	lines []int
	line  []int
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
		ends: make([][]int, nn), joint: make([]bool, nn), group: make([]int, nn), line: make([]int, nn)}
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
// finds the ones no support holds, each of which gets a sway correction.
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
	st.lines = order
	index := make(map[int]int, len(order))
	for i, g := range order {
		index[g] = i
	}
	for v := range mo.Nodes {
		st.line[v] = -1
		if i, ok := index[st.group[v]]; ok && !st.tip[v] {
			st.line[v] = i
		}
	}
	return nil
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

// swayRotations sets psi[m] to the chord rotation of member m in a unit
// movement along X of sway line j, every other line held: the columns
// between the line and the next ones rotate.
func (st *structure) swayRotations(psi []float64, j int) {
	at := func(v int) float64 {
		if st.line[v] == j {
			return 1
		}
		return 0
	}
	for m, mem := range st.mo.Members {
		psi[m] = st.chordRotation(m, at(mem.Start), 0, at(mem.End), 0)
	}
}

// chordRotation returns the rotation, counter-clockwise, of the chord of
// member m when its start moves by (us, vs) and its end by (ue, ve): the
// movement across the member (local y is (−s, c)) over its length.
func (st *structure) chordRotation(m int, us, vs, ue, ve float64) float64 {
	c, s := st.c[m], st.s[m]
	return ((-s*ue + c*ve) - (-s*us + c*vs)) / st.l[m]
}

// distribute returns the end moments ([2*m+side]) of case c (c < 0: no
// loads) with the chord rotations psi imposed on the members (nil: none),
// the frame held against sway, and the number of sweeps it took.
func (st *structure) distribute(c int, psi []float64, tol float64, maxSweeps int) ([]float64, int, error) {
	mo := st.mo
	nm := len(mo.Members)
	mom := make([]float64, 2*nm)
	ref := 0.0
	// Fixed-end moments, from loads and from the chord rotations: −6EIψ/L
	// at both ends (a hinge is released below).
	for m := range mo.Members {
		if st.cantTip[m] >= 0 {
			continue
		}
		var fs, fe float64
		if c >= 0 {
			r := st.loads(c, m)
			fs, fe = r.fs, r.fe
		}
		if psi != nil {
			f := -6 * st.ei[m] * psi[m] / st.l[m]
			fs += f
			fe += f
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

// props sets dst[i] to the force along X that a prop at sway line i must
// exert to hold it, with end moments mom in case c (c < 0: no loads).
func (st *structure) props(dst []float64, c int, mom []float64) {
	mo := st.mo
	clear(dst)
	// X forces on the free body of each line: its joints, its beams and
	// the cantilevers it holds, and the columns' end shears.
	add := func(v int, f float64) {
		if i := st.line[v]; i >= 0 {
			dst[i] -= f
		}
	}
	for v := range mo.Nodes {
		fx, _ := st.nodeForce(c, v)
		add(v, fx)
	}
	for m, mem := range mo.Members {
		r := st.loads(c, m)
		if side := st.cantTip[m]; side >= 0 {
			near := mem.Start
			if side == 0 {
				near = mem.End
			}
			// The tip's node load is counted with the line of the
			// cantilever's root: the tip is in no line.
			tipNode := mem.Start + mem.End - near
			fx, _ := st.nodeForce(c, tipNode)
			add(near, r.gx+fx)
			continue
		}
		if st.s[m] == 0 {
			add(mem.Start, r.gx) // a beam takes its X load along its axis
			continue
		}
		// Column: transverse end forces the joints exert on it, by statics.
		ms, me := mom[2*m], mom[2*m+1]
		fe := -(ms + me + r.q1) / st.l[m]
		fs := -fe - r.q0
		// The column pushes on a joint with s·F along X (local y is (-s, 0)).
		add(mem.Start, st.s[m]*fs)
		add(mem.End, st.s[m]*fe)
	}
}
