package modelfile

import (
	"math"
	"slices"

	"govern/combos"
	"govern/envelope/reduction"
	"govern/frame"
	"govern/frame/units"
)

// reduced is a case with reduction = "...": what its table gives, read
// when the case is, and turned into member factors once every case and
// member is known (reduce).
type reduced struct {
	t        *table
	rc       reduction.Case
	hasWidth bool
	hasLo    bool
}

// memberKeys are the keys of a [[member]] or [[assign]] that reduction
// reads.
var memberKeys = []string{"tributary_area", "tributary_width", "kll"}

// readMemberReduction reads a member's or an assignment's own tributary
// area, tributary width and K_LL; ok says whether it gives any.
func readMemberReduction(t *table) (m reduction.Member, ok bool) {
	for _, k := range memberKeys {
		ok = ok || t.has(k)
	}
	if !ok {
		return m, false
	}
	if v, given := t.qtyOK("tributary_area", units.Area, 0); given && !(v > 0) {
		t.fail("tributary_area", problem(ErrValue, "tributary_area = %g: must be greater than zero", v))
	} else {
		m.Area = v
	}
	if v, given := t.qtyOK("tributary_width", units.Length, 0); given && !(v > 0) {
		t.fail("tributary_width", problem(ErrValue, "tributary_width = %g: must be greater than zero", v))
	} else {
		m.Width = v
	}
	if v, given := t.numOK("kll", 0); given && !(v >= 1 && v <= 4) {
		t.fail("kll", problem(ErrValue, "kll = %g: ASCE/SEI 7-16 Table 4.7-1 gives K_LL from 1 to 4", v))
	} else {
		m.KLL = v
	}
	return m, true
}

// setMemberReduction gives member i the values of own that are set.
func (r *reader) setMemberReduction(i int, own reduction.Member) {
	for len(r.redMembers) <= i {
		r.redMembers = append(r.redMembers, reduction.Member{})
	}
	m := &r.redMembers[i]
	if own.Area > 0 {
		m.Area = own.Area
	}
	if own.Width > 0 {
		m.Width = own.Width
	}
	if own.KLL > 0 {
		m.KLL = own.KLL
	}
}

// readEN1991Rule reads en1991_rule: "alpha-n" (the default, αn for
// columns) or "smaller" (the smaller of αA and αn).
func readEN1991Rule(t *table, def bool) bool {
	if !t.has("en1991_rule") {
		return def
	}
	v := t.str("en1991_rule", "")
	if t.oneOf("en1991_rule", v, "alpha-n", "smaller") {
		return v == "smaller"
	}
	return def
}

// loadRange is the member and node loads one [[case.load]] added.
type loadRange struct {
	t                  *table
	typ                string
	from, to           int // member loads
	nodesFrom, nodesTo int // node loads
}

// readCaseReduction reads the reduction keys of case table t, the case
// being c (index ci) of kind k, whose loads are lr. It reports loads a
// reduced case may not have.
func (r *reader) readCaseReduction(t *table, ci int, c *frame.Case, k combos.Kind, kindOK bool, lr []loadRange) {
	keys := []string{"use", "lo", "slope", "tributary_width", "en1991_rule"}
	if !t.has("reduction") {
		for _, key := range keys {
			if t.has(key) {
				t.use(key)
				t.fail(key, problem(ErrValue, "%s without reduction: it says how a case with reduction = \"asce7-16\" or \"en1991\" is reduced", key))
			}
		}
		return
	}
	word := t.str("reduction", "")
	if !t.oneOf("reduction", word, reduction.Rules...) {
		t.known(keys...)
		return
	}
	rule := reduction.Rule(slices.Index(reduction.Rules, word) + 1)
	if kindOK && k != combos.Live && k != combos.RoofLive {
		t.fail("reduction", problem(ErrValue, "reduction = %q: only live and roof-live cases are reduced, not %s load", word, k))
	}
	rd := reduced{t: t, rc: reduction.Case{Case: ci, Rule: rule, Roof: k == combos.RoofLive && rule == reduction.ASCE716,
		Loaded: make([]bool, len(r.job.Model.Members)), Smaller: r.en1991Smaller}}
	if u := t.str("use", "office"); t.oneOf("use", u, reduction.Uses...) {
		rd.rc.Use = reduction.Use(slices.Index(reduction.Uses, u))
	}
	if t.has("use") && (rule != reduction.ASCE716 || rd.rc.Roof) {
		t.fail("use", problem(ErrValue, "use: ASCE/SEI 7-16 4.7.3-4.7.5 name the uses of floors; it applies to a live case with reduction = \"asce7-16\""))
	}
	lo, hasLo := t.qtyOK("lo", units.Pressure, 0)
	if hasLo && !(lo > 0) {
		t.fail("lo", problem(ErrValue, "lo = %g: must be greater than zero", lo))
		hasLo = false
	}
	rd.hasLo = hasLo
	rd.rc.Lo = lo
	slope, hasSlope := t.numOK("slope", 0)
	switch {
	case hasSlope && !rd.rc.Roof:
		t.fail("slope", problem(ErrValue, "slope: the roof slope of ASCE/SEI 7-16 4.8.2 (R2) applies to a roof-live case with reduction = \"asce7-16\""))
	case hasSlope && !(slope >= 0):
		t.fail("slope", problem(ErrValue, "slope = %g: the rise on 12 must not be negative", slope))
	default:
		rd.rc.Rise = slope
	}
	if w, ok := t.qtyOK("tributary_width", units.Length, 0); ok {
		if !(w > 0) {
			t.fail("tributary_width", problem(ErrValue, "tributary_width = %g: must be greater than zero", w))
		}
		rd.rc.Width, rd.hasWidth = w, true
	}
	rd.rc.Smaller = readEN1991Rule(t, r.en1991Smaller)
	if t.has("en1991_rule") && rule != reduction.EN1991 {
		t.fail("en1991_rule", problem(ErrValue, "en1991_rule applies to a case with reduction = \"en1991\""))
	}
	// What the case's loads may be: area loads, whose q is Lo; udl and
	// node loads only standing for the area load lo.
	spacing := 0.0
	if r.job.Grid != nil {
		spacing = r.job.Grid.Spacing
	}
	for _, l := range lr {
		switch l.typ {
		case "area":
			for _, ml := range c.MemberLoads[l.from:l.to] {
				rd.rc.Loaded[ml.Member] = true
				if !hasLo && spacing > 0 {
					rd.rc.Lo = max(rd.rc.Lo, ml.W/spacing)
				}
			}
		case "udl":
			if !hasLo {
				l.t.fail("type", problem(ErrValue, "a udl in a case with reduction = %q: give the case lo, the area load (per area) it stands for, or use an area load", word))
				continue
			}
			for _, ml := range c.MemberLoads[l.from:l.to] {
				rd.rc.Loaded[ml.Member] = true
			}
		case "node":
			if !hasLo {
				l.t.fail("type", problem(ErrValue, "a node load in a case with reduction = %q: give the case lo, the area load (per area) it stands for, or put the load in a case without reduction", word))
				continue
			}
			// The load stands for the area |Fy|/lo, carried by the
			// columns under its node.
			if rd.rc.NodeArea == nil {
				rd.rc.NodeArea = make([]float64, len(r.job.Model.Nodes))
			}
			for _, nl := range c.NodeLoads[l.nodesFrom:l.nodesTo] {
				rd.rc.NodeArea[nl.Node] += math.Abs(nl.Fy) / lo
			}
		case "point":
			l.t.fail("type", problem(ErrValue, "a point load in a case with reduction = %q: concentrated live loads are never reduced; put it in a case without reduction", word))
		default:
			l.t.fail("type", problem(ErrValue, "a %s load in a case with reduction = %q: only area loads (and udl or node loads standing for lo) are reduced; put it in a case without reduction", l.typ, word))
		}
	}
	r.reduce = append(r.reduce, rd)
}

// reduceCases turns the reduced cases into the job's member factors,
// once every member, case, combination and method is known. They apply
// with any [analysis] settings: in a second-order analysis the geometric
// stiffness is from the unreduced loads (docs/analysis.md).
func (r *reader) reduceCases() {
	job := r.job
	for _, rd := range r.reduce {
		rc := rd.rc
		if !rd.hasWidth {
			if job.Grid != nil {
				rc.Width = job.Grid.Spacing
			}
		}
		if rc.Width == 0 && !r.membersHaveWidths(rc.Loaded) {
			if !r.gridFailed && !r.spacingBad {
				rd.t.fail("reduction", problem(ErrMissing, "reduction needs the tributary width of the beams: [grid] spacing, tributary_width on the case, or tributary_width on every loaded member"))
			}
			continue
		}
		if rc.Rule == reduction.EN1991 {
			info := r.caseInfo[rc.Case]
			kind := job.Cases[rc.Case].Kind
			rc.Category = info.Category
			psi0, ok := info.PsiFactor(combos.Psi0, kind)
			if rc.Category == "" || len(rc.Category) != 1 {
				rd.t.fail("reduction", problem(ErrMissing, "reduction = \"en1991\" needs the case's category (A to H; EN 1991-1-1 6.3.1.2 reduces A to D)"))
				continue
			}
			if !ok {
				continue // reported where the combinations need it, or given
			}
			rc.Psi0 = psi0
		}
		for len(r.redMembers) < len(job.Model.Members) {
			r.redMembers = append(r.redMembers, reduction.Member{})
		}
		job.MemberFactors = append(job.MemberFactors, reduction.Factors(job.Model, job.System, r.redMembers, rc)...)
	}
}

// membersHaveWidths reports whether every loaded member gives its own
// tributary width (columns' areas are found from the beams' widths).
func (r *reader) membersHaveWidths(loaded []bool) bool {
	some := false
	for m, l := range loaded {
		if !l {
			continue
		}
		some = true
		if m >= len(r.redMembers) || r.redMembers[m].Width == 0 {
			return false
		}
	}
	return some
}
