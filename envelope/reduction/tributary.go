package reduction

import (
	"math"

	"govern/envelope/analysis"
	"govern/frame"
	"govern/frame/units"
)

// Clauses named in the factors' basis.
const (
	ClauseFloor = "ASCE/SEI 7-16 4.7.2"
	ClauseRoof  = "ASCE/SEI 7-16 4.8.2"
	ClauseEN    = "EN 1991-1-1 6.3.1.2"
	// OneFloorRule says how a column's V and M were found.
	OneFloorRule = "one-floor rule: the larger factor of the floors at its ends"
)

// geometry is what finding tributary areas needs of a frame.
type geometry struct {
	mo      *frame.Model
	members []Member
	c       *Case
	spanOf  []int // members' span (index into spans), -1 for none
	spans   []analysis.Span
	ridge   []bool  // nodes that are a ridge or valley: they hold no run
	above   []int   // the column standing on each node, -1 for none
	toArea  float64 // model length² to m²
	toForce float64 // model force to kN
}

func newGeometry(mo *frame.Model, sys units.System, members []Member, c *Case) *geometry {
	g := &geometry{mo: mo, members: members, c: c, spans: analysis.Spans(mo),
		spanOf: make([]int, len(mo.Members)), ridge: make([]bool, len(mo.Nodes)), above: make([]int, len(mo.Nodes)),
		toArea: sys.SI(units.Area.Dim), toForce: sys.SI(units.Force.Dim) / 1e3}
	for m := range g.spanOf {
		g.spanOf[m] = -1
	}
	for n := range g.above {
		g.above[n] = -1
	}
	for i, s := range g.spans {
		switch s.Kind {
		case analysis.KindRidge, analysis.KindValley:
			g.ridge[s.Node] = true
		default:
			for _, m := range s.Members {
				g.spanOf[m] = i
			}
		}
	}
	for m := range mo.Members {
		if mo.IsColumn(m) && g.above[mo.Bottom(m)] < 0 {
			g.above[mo.Bottom(m)] = m
		}
	}
	return g
}

// width returns member m's tributary width.
func (g *geometry) width(m int) float64 {
	if m < len(g.members) && g.members[m].Width > 0 {
		return g.members[m].Width
	}
	return g.c.Width
}

// plan returns member m's length in plan (along X).
func (g *geometry) plan(m int) float64 {
	mem := g.mo.Members[m]
	return math.Abs(g.mo.Nodes[mem.End].X - g.mo.Nodes[mem.Start].X)
}

// spanArea returns the area of span s, whole (all) or the part the case
// loads.
func (g *geometry) spanArea(s *analysis.Span, all bool) float64 {
	a := 0.0
	for _, m := range s.Members {
		if all || g.c.Loaded[m] {
			a += g.plan(m) * g.width(m)
		}
	}
	return a
}

// share returns the part of span s that node n carries: all of a
// cantilever at its root and of a rafter whose other end is a ridge,
// half of a span held at both ends, none elsewhere.
func (g *geometry) share(s *analysis.Span, n int) float64 {
	switch {
	case s.Kind == analysis.KindCantilever:
		if s.Root == n {
			return 1
		}
		return 0
	case s.Left != n && s.Right != n:
		return 0
	}
	other := s.Left
	if other == n {
		other = s.Right
	}
	if g.ridge[other] {
		return 1
	}
	return 0.5
}

// floorArea returns the area the case loads that node n carries: its
// share of every span ending there, and the area its node loads stand
// for.
func (g *geometry) floorArea(n int) float64 {
	a := 0.0
	if n < len(g.c.NodeArea) {
		a = g.c.NodeArea[n]
	}
	for i := range g.spans {
		s := &g.spans[i]
		if s.Kind == analysis.KindRidge || s.Kind == analysis.KindValley {
			continue
		}
		if f := g.share(s, n); f > 0 {
			a += f * g.spanArea(s, false)
		}
	}
	return a
}

// Factors returns the factors of case c in every member it loads or that
// carries its load down (beams of the spans it loads, columns under
// them), with their basis, for the model mo in units sys; members gives
// each member's own values (nil, or one per member). A member the case
// neither loads nor carries down has none: its effects are not reduced.
func Factors(mo *frame.Model, sys units.System, members []Member, c Case) []analysis.MemberFactor {
	g := newGeometry(mo, sys, members, &c)
	var out []analysis.MemberFactor
	for m := range mo.Members {
		var f analysis.MemberFactor
		var ok bool
		if mo.IsColumn(m) {
			f, ok = g.column(m)
		} else {
			f, ok = g.beam(m)
		}
		if ok {
			f.Member, f.Case = m, c.Case
			out = append(out, f)
		}
	}
	return out
}

// own returns member m's own tributary area and K_LL, 0 for none.
func (g *geometry) own(m int) (area, kll float64) {
	if m < len(g.members) {
		return g.members[m].Area, g.members[m].KLL
	}
	return 0, 0
}

// beam returns the factor of beam m: its span's area, one floor.
func (g *geometry) beam(m int) (analysis.MemberFactor, bool) {
	i := g.spanOf[m]
	if i < 0 {
		return analysis.MemberFactor{}, false
	}
	s := &g.spans[i]
	if g.spanArea(s, false) == 0 {
		return analysis.MemberFactor{}, false // the case does not load it
	}
	at, kll := g.own(m)
	if at == 0 {
		at = g.spanArea(s, true)
	}
	if kll == 0 {
		p := Interior
		if s.Kind == analysis.KindCantilever {
			p = Cantilever
		}
		kll = KLL(false, p)
	}
	v, b := g.rule(at, kll, 1, false)
	return analysis.MemberFactor{N: v, V: v, M: v, Basis: b}, true
}

// column returns the factor of column m: N from the floors at and above
// its top reached through its stack, V and M by the one-floor rule.
func (g *geometry) column(m int) (analysis.MemberFactor, bool) {
	mo := g.mo
	bottom := mo.Bottom(m)
	top := mo.Members[m].Start
	if top == bottom {
		top = mo.Members[m].End
	}
	total, floors := 0.0, 0
	for n, guard := top, 0; n >= 0 && guard <= len(mo.Members); guard++ {
		if a := g.floorArea(n); a > 0 {
			total += a
			floors++
		}
		up := g.above[n]
		if up < 0 {
			break
		}
		next := mo.Members[up].Start
		if next == n {
			next = mo.Members[up].End
		}
		n = next
	}
	if floors == 0 {
		return analysis.MemberFactor{}, false
	}
	at, kll := g.own(m)
	if at == 0 {
		at = total
	}
	if kll == 0 {
		kll = KLL(true, Interior)
	}
	n, b := g.rule(at, kll, floors, true)
	f := analysis.MemberFactor{N: n, Basis: b}
	// V and M: the larger one-floor factor of the floors at its ends.
	ends := 0.0
	for _, e := range [2]int{bottom, top} {
		if a := g.floorArea(e); a > 0 {
			v, _ := g.rule(a, kll, 1, false)
			ends = math.Max(ends, v)
		}
	}
	if ends == 0 {
		ends = 1
	}
	f.V, f.M = ends, ends
	f.Basis.Ends = OneFloorRule
	if g.c.Rule == EN1991 {
		// αn only where the imposed load leads; αA (with "smaller")
		// in every combination.
		acc := 1.0
		if g.c.Smaller {
			acc, _ = AlphaA(g.c.Category, g.c.Psi0, at*g.toArea)
		}
		if acc != n {
			f.Accompanying, f.HasAccompanying = [3]float64{acc, ends, ends}, true
		}
	}
	return f, true
}

// rule returns the factor on N of a member with tributary area at (model
// units) and K_LL kll supporting floors floors, and its basis; column
// says it is a column (EN 1991-1-1: αn, or the smaller of αA and αn).
func (g *geometry) rule(at, kll float64, floors int, column bool) (float64, analysis.FactorBasis) {
	c := g.c
	a := at * g.toArea // m²
	b := analysis.FactorBasis{Area: at, Floors: floors}
	var v float64
	var lim Limit
	switch {
	case c.Rule == EN1991:
		b.Rule = ClauseEN
		if column {
			v, lim = AlphaN(c.Category, c.Psi0, floors)
			if c.Smaller {
				if va, la := AlphaA(c.Category, c.Psi0, a); va < v {
					v, lim = va, la
				}
			}
		} else {
			v, lim = AlphaA(c.Category, c.Psi0, a)
		}
	case c.Roof:
		b.Rule = ClauseRoof
		v, lim = Roof(SI, a, c.Rise, c.Lo*g.toPressure())
	default:
		b.Rule, b.KLL = ClauseFloor, kll
		v, lim = Floor(SI, kll, a, floors, c.Use, c.Lo*g.toPressure())
	}
	b.Limit = string(lim)
	return v, b
}

// toPressure returns the factor from the model's force/length² to kN/m².
func (g *geometry) toPressure() float64 { return g.toForce / g.toArea }
