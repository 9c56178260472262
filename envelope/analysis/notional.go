package analysis

import (
	"fmt"
	"math"

	"govern/combos"
	"govern/frame"
	"govern/frame/units"
)

// Notional is the set of notional loads (sway imperfection) applied in
// one analysis of a combination: horizontal forces at the nodes, each the
// ratio times the gravity load the node receives, all in one direction.
type Notional struct {
	// Direction is +1 (toward +X) or −1.
	Direction float64
	// Ratio is the notional load per unit of gravity load: 0.002 α (AISC
	// 360-16 C2.2b), plus 0.001 α with tau_b = "notional" (C2.3(c)), φ (EN
	// 1993-1-1 5.3.2), or the model's number.
	Ratio float64
	// Levels gives, per level of the job that receives gravity load, the
	// gravity load Yi there and its notional load; nodes on no level are
	// counted in the level below them.
	Levels []NotionalLevel
	// Total is the sum of the notional loads: the notional base shear.
	Total float64
	// Alternative is set for a combination without lateral load, whose
	// notional loads act in each direction as alternatives, never together.
	Alternative bool

	nodes []frame.NodeLoad // the loads, in the model's units
}

// NotionalLevel is the gravity load and notional load of one level.
type NotionalLevel struct {
	Level   string
	Y       float64
	Gravity float64 // Yi: the gravity load the level's nodes receive
	Force   float64 // the notional load there, Ratio × Gravity, along Direction
}

// gravityAtNodes returns the gravity (downward) load each node receives
// from case cs: its node loads, and each member load carried to the
// member's end nodes by the lever rule (as a simply supported member
// would carry it). Upward loads count negative.
func gravityAtNodes(mo *frame.Model, cs *frame.Case, factor float64, g []float64) {
	for _, nl := range cs.NodeLoads {
		g[nl.Node] -= factor * nl.Fy
	}
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		if ld.Direction != frame.Gravity || ld.Moment || ld.Thermal {
			continue
		}
		mem := mo.Members[ld.Member]
		p, r := leverShares(mo, ld)
		g[mem.Start] += factor * p * (1 - r)
		g[mem.End] += factor * p * r
	}
}

// lateralResultant returns the sum of the horizontal loads of case cs.
func lateralResultant(mo *frame.Model, cs *frame.Case) float64 {
	r := 0.0
	for _, nl := range cs.NodeLoads {
		r += nl.Fx
	}
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		if ld.Direction != frame.GlobalX || ld.Moment || ld.Thermal {
			continue
		}
		if ld.Point {
			r += ld.P
		} else {
			r += (ld.W + ld.WEnd) / 2 * (ld.To - ld.From)
		}
	}
	return r
}

// notionalLoads returns the notional loads of combination cb (terms on
// the cases of mo, each whole, every piece loaded) with ratio: one set in
// the direction of the resultant of its lateral loads, or, with none, one
// in each direction as alternatives.
func notionalLoads(job *Job, mo *frame.Model, cb combos.Combination, ratio float64) []Notional {
	g := make([]float64, len(mo.Nodes))
	lateral, gravity := 0.0, 0.0
	for _, t := range cb.Terms {
		gravityAtNodes(mo, &mo.Cases[t.Case], t.Factor, g)
		lateral += t.Factor * lateralResultant(mo, &mo.Cases[t.Case])
	}
	for _, v := range g {
		gravity += math.Abs(v)
	}
	dirs := []float64{1, -1}
	alt := true
	if math.Abs(lateral) > lateralTol*gravity {
		dirs, alt = []float64{math.Copysign(1, lateral)}, false
	}
	out := make([]Notional, len(dirs))
	for i, d := range dirs {
		n := Notional{Direction: d, Ratio: ratio, Alternative: alt}
		levelOf := func(y float64) int {
			k := -1
			for j, lv := range job.Levels {
				if lv.Y <= y+levelTol*(1+math.Abs(y)) {
					k = j
				}
			}
			return k
		}
		byLevel := map[int]*NotionalLevel{}
		for v, nd := range mo.Nodes {
			if g[v] == 0 || nd.Support.Restrained(0) {
				continue // held along X: the load goes straight to the support
			}
			f := d * ratio * g[v]
			n.nodes = append(n.nodes, frame.NodeLoad{Node: v, Fx: f})
			n.Total += f
			k := levelOf(nd.Y)
			lv := byLevel[k]
			if lv == nil {
				lv = &NotionalLevel{Level: "", Y: nd.Y}
				if k >= 0 {
					lv.Level, lv.Y = job.Levels[k].Name, job.Levels[k].Y
				}
				byLevel[k] = lv
			}
			lv.Gravity += g[v]
			lv.Force += f
		}
		for k := -1; k < len(job.Levels); k++ {
			if lv := byLevel[k]; lv != nil {
				n.Levels = append(n.Levels, *lv)
			}
		}
		out[i] = n
	}
	return out
}

// lateralTol is the fraction of the gravity load below which a
// combination's lateral resultant counts as none.
const lateralTol = 1e-9

// levelTol is the relative tolerance of a node's height on a level's.
const levelTol = 1e-9

// notionalRatio returns the notional load ratio of combination cb under
// the job's rule: alpha is 1 for strength, 1.6 for a first-order
// allowable combination (C2.2b's α; a second-order allowable one is
// analysed at 1.6 times its loads, which carries α). sol0 is the
// first-order solution of the combination with every piece loaded, for
// EN 1993's αm.
func notionalRatio(job *Job, mo *frame.Model, alpha float64, axial []float64) (float64, error) {
	st := &job.Sway
	extra := 0.0
	if st.TauB == TauBNotional {
		extra = 0.001 * alpha
	}
	switch st.Notional {
	case NotionalAISC360:
		return 0.002*alpha + extra, nil
	case NotionalRatio:
		return st.NotionalRatio + extra, nil
	case NotionalEN1993:
		phi, err := en1993Phi(job, mo, axial)
		return phi + extra, err
	}
	return extra, nil
}

// en1993Phi returns φ = φ0 αh αm of EN 1993-1-1 5.3.2(3)a: φ0 = 1/200,
// αh = 2/√h with 2/3 ≤ αh ≤ 1, h the height of the frame in metres, αm =
// √(0.5(1 + 1/m)), m the number of columns in the bottom row (the columns
// standing on the lowest column foot level) carrying at least half the
// average vertical load of those columns, from the axial forces axial.
func en1993Phi(job *Job, mo *frame.Model, axial []float64) (float64, error) {
	sys, err := units.NewSystem(job.Units.Force, job.Units.Length, "")
	if err != nil {
		return 0, fmt.Errorf("analysis: notional = \"en1993\" needs the frame's height in metres, and the model's units (force %q, length %q) cannot be converted: %v", job.Units.Force, job.Units.Length, err)
	}
	toM := sys.SI(units.Length.Dim)
	ylo, yhi := math.Inf(1), math.Inf(-1)
	for _, nd := range mo.Nodes {
		ylo, yhi = min(ylo, nd.Y), max(yhi, nd.Y)
	}
	h := (yhi - ylo) * toM
	ah := 1.0
	if h > 0 {
		ah = min(max(2/math.Sqrt(h), 2.0/3), 1)
	}
	foot := math.Inf(1)
	for m := range mo.Members {
		if mo.IsColumn(m) {
			foot = min(foot, mo.Nodes[mo.Bottom(m)].Y)
		}
	}
	var loads []float64
	for m := range mo.Members {
		if mo.IsColumn(m) && math.Abs(mo.Nodes[mo.Bottom(m)].Y-foot) <= levelTol*(1+math.Abs(foot)) {
			loads = append(loads, max(-axial[m], 0))
		}
	}
	mCount := 1
	if len(loads) > 0 {
		avg := 0.0
		for _, p := range loads {
			avg += p
		}
		avg /= float64(len(loads))
		mCount = 0
		for _, p := range loads {
			if p >= avg/2 {
				mCount++
			}
		}
		mCount = max(mCount, 1)
	}
	am := math.Sqrt(0.5 * (1 + 1/float64(mCount)))
	return ah * am / 200, nil
}

// NotionalLoads returns the notional loads of each combination of the job
// as Run applies them (none without Job.Sway.Notional or tau_b
// "notional"), for listing without analysing.
func NotionalLoads(job *Job) ([][]Notional, error) {
	if err := job.check(); err != nil {
		return nil, err
	}
	sv := favourableSplit(job)
	pl, err := makePlan(job, &sv)
	if err != nil {
		return nil, err
	}
	out := make([][]Notional, len(job.Combinations))
	for _, u := range pl.units {
		if u.notional != nil {
			out[u.k] = append(out[u.k], *u.notional)
		}
	}
	return out, nil
}

// leverShares returns the resultant p of member load ld and the share r
// of it its end node takes by the lever rule (1 − r at its start), as a
// simply supported member would carry it: the resultant's distance from
// the start over the length, held to 0 to 1.
func leverShares(mo *frame.Model, ld *frame.MemberLoad) (p, r float64) {
	var x float64 // the resultant's distance from the start
	if ld.Point {
		p, x = ld.P, ld.At
	} else {
		a, b := ld.From, ld.To
		p = (ld.W + ld.WEnd) / 2 * (b - a)
		if s := ld.W + ld.WEnd; s != 0 {
			x = a + (b-a)*(ld.W+2*ld.WEnd)/(3*s)
		} else {
			x = (a + b) / 2
		}
	}
	return p, min(max(x/mo.Length(ld.Member), 0), 1)
}
