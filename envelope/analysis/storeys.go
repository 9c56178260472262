package analysis

import (
	"fmt"
	"math"
	"slices"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// NodeDisplacement is the envelope of the displacements of one node: ux,
// uy (length) and rz (radians, counter-clockwise), over the service
// combinations when there are any, else over the strength ones (as
// member deflections are), each with its governing combination.
// RotationFree is set where every member end at the node is released:
// its rotation is not one number, and Rz is zero.
type NodeDisplacement struct {
	Node         int
	Ux, Uy, Rz   envelope.Extreme
	RotationFree bool
}

// Storey is one storey of the frame: the columns between two consecutive
// levels of the job, its drift and its stability indices.
type Storey struct {
	Bottom, Top Level
	Height      float64
	Columns     []int // members that are columns from Bottom to Top
	// Drift is the envelope of the storey's drift Δ, the displacement
	// along X of a column's top less its bottom's, enveloped as a quantity
	// of its own over the combinations of the node displacements; of the
	// storey's columns, the one whose drift is largest in size
	// (DriftColumn).
	Drift       envelope.Extreme
	DriftColumn int
	// Stability holds per combination of the job its stability indices;
	// the zero value for a service combination.
	Stability []StoreyStability
}

// StoreyStability are the stability indices of one storey under one
// combination, from first-order analyses with the combination's
// stiffness: P from the combination, every case at its factor and every
// pattern piece loaded; H and ΔH under the horizontal loads of the
// combination, or, where they give the storey no shear, under a unit
// storey shear (Unit).
type StoreyStability struct {
	P   float64 // ΣPu: the axial compression of the storey's columns
	Pmf float64 // the part of P in moment-frame columns (neither end released)
	H   float64 // the storey shear (Vus)
	// DeltaH is the first-order drift (Δo) under H: the largest of the
	// storey's columns'.
	DeltaH float64
	Unit   bool
	// Q is the stability index ΣPu Δo/(Vus lc) of ACI 318-19 6.6.4.4.1,
	// lc the storey height.
	Q float64
	// RM = 1 − 0.15 Pmf/P and B2 = 1/(1 − α P/Pe,story) with Pe,story =
	// RM H L/ΔH (AISC 360-16 Appendix 8, α = 1.6 for an allowable
	// combination): +Inf where α P reaches Pe,story.
	RM, B2 float64
}

// storeys returns the storeys of the job: consecutive levels with
// columns between them.
func storeysOf(job *Job) []Storey {
	mo := job.Model
	// The columns with the heights of their bottom and top, in model
	// order, found once for every storey.
	type column struct {
		m      int
		yb, yt float64
	}
	var cols []column
	if len(job.Levels) > 1 {
		for m, mem := range mo.Members {
			if !mo.IsColumn(m) {
				continue
			}
			b := mo.Bottom(m)
			t := mem.Start + mem.End - b
			cols = append(cols, column{m, mo.Nodes[b].Y, mo.Nodes[t].Y})
		}
	}
	var out []Storey
	for i := 1; i < len(job.Levels); i++ {
		lo, hi := job.Levels[i-1], job.Levels[i]
		tol := levelTol * (1 + math.Abs(hi.Y))
		s := Storey{Bottom: lo, Top: hi, Height: hi.Y - lo.Y}
		for _, c := range cols {
			if math.Abs(c.yb-lo.Y) <= tol && math.Abs(c.yt-hi.Y) <= tol {
				s.Columns = append(s.Columns, c.m)
			}
		}
		if len(s.Columns) > 0 && s.Height > 0 {
			out = append(out, s)
		}
	}
	return out
}

// columnDrift returns the displacement along X of column m's top less its
// bottom's in column c of sol.
func columnDrift(sol *frame.Solution, c, m int) float64 {
	mo := sol.Model()
	mem := mo.Members[m]
	b := mo.Bottom(m)
	t := mem.Start + mem.End - b
	ut, _, _ := sol.Displacement(c, t)
	ub, _, _ := sol.Displacement(c, b)
	return ut - ub
}

// displacementTargets returns, per job combination, whether node
// displacements and drifts are enveloped over it: the service
// combinations when there are any, else every one.
func displacementTargets(cs []combos.Combination) []bool {
	out := make([]bool, len(cs))
	service := false
	for _, cb := range cs {
		service = service || cb.Service
	}
	for k, cb := range cs {
		out[k] = cb.Service || !service
	}
	return out
}

// valuesRequest is an envelope of quantities other than stations (node
// displacements, drifts), formed group by group with the envelopes.
type valuesRequest struct {
	n int
	// effects is how many of a quantity's three components are enveloped
	// (envelope.ValuesRows): 3 for a node's displacements, 1 for a drift.
	effects int
	// fill sets row[c] to quantity i in every column c of sol; tmp is
	// scratch of the same length, the worker's, that prev, the quantity
	// it filled just before, left (−1 for none: envelope.ValuesRows).
	fill func(sol *frame.Solution, i, prev int, row, tmp [][3]float64)
	what func(i, q int) string
	// order, when not nil, is the order in which the quantities are
	// enveloped, such as the drifts' up each column line.
	order   []int
	targets []bool // per job combination, whether it is enveloped over
	out     [][3]envelope.Extreme
}

// add envelopes the request over the combinations cs (cs[i] is the job's
// combination idx[i]) solved in sol, and merges the result.
func (vr *valuesRequest) add(sol *frame.Solution, lay *patterns.Layout, cs []combos.Combination, idx []int, set envelope.Settings) error {
	var sel []int
	for i, k := range idx {
		if vr.targets[k] {
			sel = append(sel, i)
		}
	}
	if len(sel) == 0 || vr.n == 0 {
		return nil
	}
	set.Stations, set.Extra, set.Lines, set.Progress = 2, nil, nil, nil
	// at(order, q) is the quantity enveloped q-th.
	at := func(order []int, q int) int {
		if order == nil {
			return q
		}
		return order[q]
	}
	values := func(order []int) ([][3]envelope.Extreme, error) {
		return envelope.ValuesRows(sol, cs, sel, set, lay, vr.n, vr.effects, func(q int, row, tmp [][3]float64) {
			prev := -1
			if q%envelope.ValuesBlock != 0 {
				prev = at(order, q-1)
			}
			vr.fill(sol, at(order, q), prev, row, tmp)
		}, func(q, k int) string { return vr.what(at(order, q), k) })
	}
	vals, err := values(vr.order)
	if err != nil && vr.order != nil {
		// The error of the first quantity in error in their own order.
		_, err = values(nil)
	}
	if err != nil {
		return err
	}
	if vr.out == nil {
		vr.out = make([][3]envelope.Extreme, vr.n)
		for i := range vr.out {
			for q := range 3 {
				vr.out[i][q] = emptyExtreme()
			}
		}
	}
	for p := range vals {
		i := at(vr.order, p)
		for q := range 3 {
			mergeExtreme(&vr.out[i][q], &vals[p][q], idx)
		}
	}
	return nil
}

// displacementRequests returns the requests for the node displacements
// and the drifts of the storeys' columns.
func (r *Result) displacementRequests() (nodes, drifts *valuesRequest) {
	mo := r.Job.Model
	targets := displacementTargets(r.Job.Combinations)
	dir := [3]string{"ux", "uy", "rz"}
	nodes = &valuesRequest{n: len(mo.Nodes), effects: 3, targets: targets,
		fill: func(sol *frame.Solution, v, _ int, row, _ [][3]float64) {
			sol.DisplacementsTo(row, v)
			if sol.RotationFree(v) {
				for c := range row {
					row[c][2] = 0
				}
			}
		},
		what: func(v, q int) string { return fmt.Sprintf("%s of node %q", dir[q], mo.Nodes[v].Name) }}
	var cols, bottom, top []int
	for _, s := range r.Storeys {
		for _, m := range s.Columns {
			b := mo.Bottom(m)
			mem := mo.Members[m]
			cols, bottom, top = append(cols, m), append(bottom, b), append(top, mem.Start+mem.End-b)
		}
	}
	drifts = &valuesRequest{n: len(cols), effects: 1, targets: targets, order: upLines(bottom, top),
		fill: func(sol *frame.Solution, i, prev int, row, tmp [][3]float64) {
			// columnDrift in every column: the top's ux less the bottom's.
			// tmp keeps the top's ux, the bottom's of the column above
			// when that comes next (upLines).
			// ux alone is read (frame.Solution.DisplacementTo), a third
			// of a node's displacements.
			if prev < 0 || top[prev] != bottom[i] {
				sol.DisplacementTo(tmp, bottom[i], 0)
			}
			sol.DisplacementTo(row, top[i], 0)
			for c := range row {
				ut := row[c][0]
				row[c] = [3]float64{ut - tmp[c][0]}
				tmp[c][0] = ut
			}
		},
		what: func(i, _ int) string {
			return fmt.Sprintf("the drift of column %q", mo.Members[cols[i]].Name)
		}}
	return nodes, drifts
}

// upLines returns an order of the columns with bottom and top nodes
// bottom[i] and top[i] in which each is followed by the one standing on
// it, where there is one: up each column line, from its foot (a column on
// no other), the lines in the order of their feet, then any columns left
// in their own order.
func upLines(bottom, top []int) []int {
	above := map[int][]int{} // node → the columns whose bottom it is, in order
	below := map[int]bool{}  // the nodes that are some column's top
	for i := range bottom {
		above[bottom[i]] = append(above[bottom[i]], i)
		below[top[i]] = true
	}
	order := make([]int, 0, len(bottom))
	placed := make([]bool, len(bottom))
	up := func(i int) {
		for i >= 0 && !placed[i] {
			placed[i] = true
			order = append(order, i)
			next := -1
			for _, j := range above[top[i]] {
				if !placed[j] {
					next = j
					break
				}
			}
			i = next
		}
	}
	for i := range bottom {
		if !below[bottom[i]] {
			up(i)
		}
	}
	for i := range bottom {
		up(i)
	}
	return order
}

// setDisplacements keeps the envelopes of the requests in r.
func (r *Result) setDisplacements(nodes, drifts *valuesRequest) {
	mo := r.Job.Model
	if nodes.out != nil {
		r.Displacements = make([]NodeDisplacement, len(mo.Nodes))
		for v := range mo.Nodes {
			x := nodes.out[v]
			r.Displacements[v] = NodeDisplacement{Node: v, Ux: x[0], Uy: x[1], Rz: x[2], RotationFree: r.sol.RotationFree(v)}
		}
	}
	if drifts.out == nil {
		return
	}
	i := 0
	for s := range r.Storeys {
		st := &r.Storeys[s]
		best := -1.0
		for _, m := range st.Columns {
			d := drifts.out[i][0]
			i++
			if size := max(math.Abs(d.Max), math.Abs(d.Min)); size > best {
				best, st.Drift, st.DriftColumn = size, d, m
			}
		}
		st.Drift.MaxWith, st.Drift.MinWith = [3]float64{}, [3]float64{}
	}
}

// storeyStability fills the stability indices of every storey for the
// strength combination of unit u, analysed with stiffness stiff: on the
// factor of first, a first-order solution with that stiffness, when it is
// not nil.
func (r *Result) storeyStability(u *unit, base *frame.Model, stiff Stiffness, first *frame.Solution) error {
	sa, err := r.storeySolve(u, base, stiff, first)
	if err != nil {
		return err
	}
	r.setStoreys(u, base, sa)
	return nil
}

// storeyAnalysis is the first-order analysis of the storeys of a unit's
// combination (storeySolve), nil for none: its solution, in which its
// combination at a factor of 1, its horizontal loads alone and the first
// unit storey shear are the cases comb, lat and shear; its horizontal
// load at each node.
type storeyAnalysis struct {
	sol              *frame.Solution
	comb, lat, shear int
	hx               []float64
}

// storeySolveAll is storeySolve for the units us of stiffness stiff, on
// the factor of first (not nil): their combinations and horizontal loads
// and once for all of them the unit storey shears, solved together (the
// same numbers as each alone to the last bit: the same factor, the same
// substitutions); where that fails, each alone, for its error.
func (r *Result) storeySolveAll(us []*unit, base *frame.Model, stiff Stiffness, first *frame.Solution) ([]*storeyAnalysis, []error) {
	job := r.Job
	out, errs := make([]*storeyAnalysis, len(us)), make([]error, len(us))
	if len(r.Storeys) == 0 {
		return out, errs
	}
	secs, mems := job.stiffnessOf(base, stiff)
	var cases []frame.Case
	var at []int
	var hxs [][]float64
	for i, u := range us {
		if job.Combinations[u.k].Service {
			continue
		}
		all, hx := r.stabilityCases(base, secs, mems, combined(base, secs, mems, u.cb, 1, nil).Cases[0])
		// Names of their own: a combination's alternatives share its name.
		all.Cases[0].Name = fmt.Sprintf("combination %d", len(at)+1)
		all.Cases[1].Name = fmt.Sprintf("lateral %d", len(at)+1)
		cases = append(cases, all.Cases...)
		at, hxs = append(at, i), append(hxs, hx)
	}
	if len(at) == 0 {
		return out, errs
	}
	shears := len(cases)
	cases = append(cases, r.unitShears(base)...)
	sol, err := first.SolveCases(cases)
	if err != nil {
		for _, i := range at {
			out[i], errs[i] = r.storeySolve(us[i], base, stiff, first)
		}
		return out, errs
	}
	for q, i := range at {
		out[i] = &storeyAnalysis{sol: sol, comb: 2 * q, lat: 2*q + 1, shear: shears, hx: hxs[q]}
	}
	return out, errs
}

// storeySolve is storeyStability's analysis, made apart from setStoreys,
// which fills the storeys from it: it writes nothing of r's.
func (r *Result) storeySolve(u *unit, base *frame.Model, stiff Stiffness, first *frame.Solution) (*storeyAnalysis, error) {
	job := r.Job
	if len(r.Storeys) == 0 || job.Combinations[u.k].Service {
		return nil, nil
	}
	secs, mems := job.stiffnessOf(base, stiff)
	all, hx := r.stabilityCases(base, secs, mems, combined(base, secs, mems, u.cb, 1, nil).Cases[0])
	cases := append(all.Cases, r.unitShears(base)...)
	var sol *frame.Solution
	var err error
	if first != nil {
		sol, err = first.SolveCases(cases)
	} else {
		all.Cases = cases
		sol, err = frame.SolveWith(all, r.solver)
	}
	if err != nil {
		return nil, fmt.Errorf("combination %q: storey stability: %w", job.Combinations[u.k].Name, err)
	}
	return &storeyAnalysis{sol: sol, comb: 0, lat: 1, shear: 2, hx: hx}, nil
}

// setStoreys fills the stability indices of every storey for unit u from
// its analysis sa (storeySolve; nil: nothing to fill).
func (r *Result) setStoreys(u *unit, base *frame.Model, sa *storeyAnalysis) {
	if sa != nil {
		r.setStability(u, base, sa.sol, sa.comb, sa.lat, sa.shear, sa.hx)
	}
}

// storeyStabilityAll is storeyStability for the first-order units us
// analysed on sol (stiffness stiff), comb their combinations
// (combinedOf): those at a factor of 1 and their horizontal loads, and
// once for all of them the unit storey shears, solved on sol's factor
// together.
func (r *Result) storeyStabilityAll(us []*unit, base *frame.Model, stiff Stiffness, sol *frame.Solution, comb []frame.Case) error {
	job := r.Job
	if len(r.Storeys) == 0 {
		return nil
	}
	secs, mems := job.stiffnessOf(base, stiff)
	var strength []*unit
	var cases []frame.Case
	var hxs [][]float64
	for i, u := range us {
		if job.Combinations[u.k].Service {
			continue
		}
		c := comb[i]
		if u.scale != 1 {
			c = combined(base, secs, mems, u.cb, 1, nil).Cases[0]
		}
		all, hx := r.stabilityCases(base, secs, mems, c)
		// Names of their own: a combination's alternatives share its name.
		all.Cases[0].Name = fmt.Sprintf("combination %d", len(strength)+1)
		all.Cases[1].Name = fmt.Sprintf("lateral %d", len(strength)+1)
		strength = append(strength, u)
		cases = append(cases, all.Cases...)
		hxs = append(hxs, hx)
	}
	if len(strength) == 0 {
		return nil
	}
	shears := len(cases)
	cases = append(cases, r.unitShears(base)...)
	s2, err := sol.SolveCases(cases)
	if err != nil {
		// Which combination: each alone.
		for _, u := range strength {
			if err := r.storeyStability(u, base, stiff, sol); err != nil {
				return err
			}
		}
		return fmt.Errorf("storey stability: %w", err)
	}
	for i, u := range strength {
		r.setStability(u, base, s2, 2*i, 2*i+1, shears, hxs[i])
	}
	return nil
}

// stabilityCases returns a combination's case comb (every case at its
// factor and every piece loaded) and its horizontal loads alone, as the
// two cases of a model with the sections and members given; and the
// horizontal load at each node, by the lever rule.
func (r *Result) stabilityCases(base *frame.Model, secs []frame.Section, mems []frame.Member, comb frame.Case) (*frame.Model, []float64) {
	all := &frame.Model{Nodes: base.Nodes, Sections: secs, Members: mems, Cases: []frame.Case{comb}}
	var lateral frame.Case
	for _, ld := range all.Cases[0].MemberLoads {
		if ld.Direction == frame.GlobalX && !ld.Moment && !ld.Thermal {
			lateral.MemberLoads = append(lateral.MemberLoads, ld)
		}
	}
	for _, nl := range all.Cases[0].NodeLoads {
		if nl.Fx != 0 {
			lateral.NodeLoads = append(lateral.NodeLoads, frame.NodeLoad{Node: nl.Node, Fx: nl.Fx})
		}
	}
	lateral.Name = "lateral"
	all.Cases = append(all.Cases, lateral)
	hx := make([]float64, len(base.Nodes))
	lateralAtNodes(all, &lateral, hx)
	return all, hx
}

// unitShears returns a case per storey: a unit storey shear at its top,
// shared by the free nodes of that level.
func (r *Result) unitShears(base *frame.Model) []frame.Case {
	out := make([]frame.Case, 0, len(r.Storeys))
	for _, s := range r.Storeys {
		c := frame.Case{Name: "unit " + s.Top.Name}
		var free []int
		for v, nd := range base.Nodes {
			if math.Abs(nd.Y-s.Top.Y) <= levelTol*(1+math.Abs(s.Top.Y)) && !nd.Support.Restrained(0) && nd.Springs[0] == 0 {
				free = append(free, v)
			}
		}
		for _, v := range free {
			c.NodeLoads = append(c.NodeLoads, frame.NodeLoad{Node: v, Fx: 1 / float64(len(free))})
		}
		out = append(out, c)
	}
	return out
}

// setStability fills the stability indices of every storey for unit u
// from sol: its combination in column comb, its horizontal loads in
// column lat, the unit shear of storey i in column shear+i; hx the
// horizontal load at each node.
func (r *Result) setStability(u *unit, base *frame.Model, sol *frame.Solution, comb, lat, shear int, hx []float64) {
	r.setStabilityOf(u, base, sol, axialForces(sol, comb), lat, shear, hx)
}

// setStabilityOf is setStability with the axial forces of the
// combination's column given (axialForces).
func (r *Result) setStabilityOf(u *unit, base *frame.Model, sol *frame.Solution, axial []float64, lat, shear int, hx []float64) {
	job := r.Job
	alpha := 1.0
	if u.method.Allowable {
		alpha = AllowableScale
	}
	// The nodes with a horizontal load, in model order: adding a zero
	// leaves a storey shear as it is (+0 + −0 is +0), so those are
	// skipped.
	var loaded []int
	for v, h := range hx {
		if h != 0 {
			loaded = append(loaded, v)
		}
	}
	for si := range r.Storeys {
		s := &r.Storeys[si]
		if s.Stability == nil {
			s.Stability = make([]StoreyStability, len(job.Combinations))
		}
		var st StoreyStability
		for _, m := range s.Columns {
			p := max(-axial[m], 0)
			st.P += p
			if base.Members[m].Release == frame.ReleaseNone {
				st.Pmf += p
			}
		}
		// The storey shear: the horizontal loads above its bottom.
		for _, v := range loaded {
			if base.Nodes[v].Y > s.Bottom.Y+levelTol*(1+math.Abs(s.Bottom.Y)) {
				st.H += hx[v]
			}
		}
		col := lat
		if math.Abs(st.H) <= lateralTol*max(st.P, 1e-300) || st.H == 0 {
			col, st.H, st.Unit = shear+si, 1, true
		}
		for _, m := range s.Columns {
			d := columnDrift(sol, col, m)
			if math.Abs(d) > math.Abs(st.DeltaH) {
				st.DeltaH = d
			}
		}
		st.H, st.DeltaH = math.Abs(st.H), math.Abs(st.DeltaH)
		st.RM = 1
		if st.P > 0 {
			st.RM = 1 - 0.15*st.Pmf/st.P
		}
		if st.H > 0 && st.DeltaH > 0 {
			st.Q = st.P * st.DeltaH / (st.H * s.Height)
			if d := 1 - alpha*st.Q/st.RM; d > 0 {
				st.B2 = 1 / d
			} else {
				st.B2 = math.Inf(1)
			}
		} else {
			st.B2 = 1
		}
		// Keep the worst alternative of notional loads.
		if old := s.Stability[u.k]; old.Q >= st.Q && old.RM != 0 {
			continue
		}
		s.Stability[u.k] = st
	}
}

// lateralAtNodes adds to hx the horizontal loads of case cs at the nodes,
// member loads carried to their ends by the lever rule.
func lateralAtNodes(mo *frame.Model, cs *frame.Case, hx []float64) {
	for _, nl := range cs.NodeLoads {
		hx[nl.Node] += nl.Fx
	}
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		if ld.Direction != frame.GlobalX || ld.Moment || ld.Thermal {
			continue
		}
		mem := mo.Members[ld.Member]
		p, r := leverShares(mo, ld)
		hx[mem.Start] += p * (1 - r)
		hx[mem.End] += p * r
	}
}

// Amplification is one column's governing moment in a second-order run
// beside the first-order moment of the same state: the same combination,
// at the same station, with its loads placed for the same extreme
// (largest or smallest) of a first-order analysis with the same stiffness.
type Amplification struct {
	Member int
	X      float64 // the station, from the member's start
	By     int     // the combination
	Second float64 // |M|, second order
	First  float64 // |M|, first order
	// Ratio is Second/First; above AmplificationLimit it is flagged (ACI
	// 318-19 6.2.5.3).
	Ratio float64
}

// AmplificationLimit is the ratio of second-order to first-order moment
// above which ACI 318-19 6.2.5.3 asks for a review of the frame.
const AmplificationLimit = 1.4

// amplifications fills r.Amplifications for the columns governed by a
// second-order combination.
func (r *Result) amplifications(pl *plan, sv *solved, lay *patterns.Layout, set envelope.Settings) error {
	job, mo := r.Job, r.Job.Model
	type item struct {
		m, station int
		hi         bool
		second     float64
	}
	byCombo := map[int][]item{}
	for m := range mo.Members {
		if !mo.IsColumn(m) {
			continue
		}
		em := &r.Envelope.Members[m]
		best, it := -1.0, item{m: m}
		for i, st := range em.Stations {
			if st.M.MaxBy >= 0 && math.Abs(st.M.Max) > best {
				best, it.station, it.hi = math.Abs(st.M.Max), i, true
			}
			if st.M.MinBy >= 0 && math.Abs(st.M.Min) > best {
				best, it.station, it.hi = math.Abs(st.M.Min), i, false
			}
		}
		st := em.Stations[it.station]
		k := st.M.MinBy
		if it.hi {
			k = st.M.MaxBy
		}
		if k < 0 || !job.methodOf(k).SecondOrder || best <= 0 {
			continue
		}
		it.second = best
		byCombo[k] = append(byCombo[k], it)
	}
	sols := map[Stiffness]*frame.Solution{Nominal: r.sol}
	for k := range job.Combinations {
		items := byCombo[k]
		if len(items) == 0 {
			continue
		}
		stiff := job.methodOf(k).Stiffness
		sol := sols[stiff]
		glay := lay
		if sol == nil {
			secs, mems := job.stiffnessOf(lay.Model, stiff)
			m2 := *lay.Model
			m2.Sections, m2.Members = secs, mems
			var err error
			if sol, err = frame.SolveWith(&m2, r.solver); err != nil {
				return err
			}
			sols[stiff] = sol
		}
		if sol.Model() != lay.Model {
			l2 := *lay
			l2.Model = sol.Model()
			glay = &l2
		}
		var cs []combos.Combination
		for _, u := range pl.units {
			if u.k == k {
				cs = append(cs, u.cb)
			}
		}
		idx := make([]int, len(cs))
		for i := range idx {
			idx[i] = i
		}
		nc := len(sol.Model().Cases)
		vals := make([][]frame.Forces, len(items))
		for i, it := range items {
			vals[i] = make([]frame.Forces, nc)
			sol.StationsTo(vals[i], it.m, []float64{r.Envelope.Members[it.m].Stations[it.station].X})
			// With member factors (live load reduction) the first-order
			// moment is scaled as the second-order one was.
			if set.Factors != nil {
				for c, s := range columnFactors(set.Factors, glay, set.Kinds, &cs[0], it.m) {
					vals[i][c].N *= s[0]
					vals[i][c].V *= s[1]
					vals[i][c].M *= s[2]
				}
			}
		}
		ex, err := envelope.Values(sol, cs, idx, set, glay, len(items),
			func(c, i int) [3]float64 { f := vals[i][c]; return [3]float64{f.N, f.V, f.M} },
			func(i, q int) string { return fmt.Sprintf("the moment of column %q", mo.Members[items[i].m].Name) })
		if err != nil {
			return err
		}
		for i, it := range items {
			first := ex[i][2].Min
			if it.hi {
				first = ex[i][2].Max
			}
			a := Amplification{Member: it.m, X: r.Envelope.Members[it.m].Stations[it.station].X, By: k, Second: it.second, First: math.Abs(first)}
			a.Ratio = math.Inf(1)
			if a.First > 0 {
				a.Ratio = a.Second / a.First
			}
			r.Amplifications = append(r.Amplifications, a)
		}
	}
	slices.SortFunc(r.Amplifications, func(a, b Amplification) int { return a.Member - b.Member })
	return nil
}
