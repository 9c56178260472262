package report

import (
	"fmt"
	"math"
	"strings"

	"govern/envelope"
	"govern/envelope/analysis"
)

// Table is a titled table of text cells. The design values are formed
// once as tables, and the terminal and the report render the same ones.
type Table struct {
	Title  string
	Header []string
	Rows   [][]string
}

// design is every table of design values of a report, as formed once.
type design struct {
	governing     string // the note above the design values
	groups        []groupDesign
	deflection    *Table  // nil without service combinations or spans
	limits        *Table  // nil without a limited service combination or spans
	reactions     *Table  // nil without supports
	withReactions *Table  // each extreme with its concurrent reaction; nil without supports
	stability     []Table // the frame's stability (stability.go)
	reduction     *Table  // the member factors of live load reduction; nil without any
	// reducedReactions are the reduced cases' reactions, unreduced and
	// reduced; nil without member factors.
	reducedReactions *Table
	staticsTop       string // the note above the statics table
	statics          Table
}

// groupDesign is the tables of one floor, column line or the others.
type groupDesign struct {
	analysis.Group
	title, id string
	tables    []Table
}

// Tables returns the tables of design values in the order the terminal
// shows them: per floor, column line and the other members; the
// deflections of spans and cantilevers; the reactions; the statics check.
func (p *Report) Tables() []Table {
	d := p.tables()
	var out []Table
	for _, g := range d.groups {
		out = append(out, g.tables...)
	}
	if d.deflection != nil {
		out = append(out, *d.deflection)
	}
	if d.limits != nil {
		out = append(out, *d.limits)
	}
	if d.reactions != nil {
		out = append(out, *d.reactions, *d.withReactions)
	}
	if d.reduction != nil {
		out = append(out, *d.reduction)
	}
	if d.reducedReactions != nil {
		out = append(out, *d.reducedReactions)
	}
	out = append(out, d.stability...)
	return append(out, d.statics)
}

// lowerFirst returns s with its first letter in lower case.
func lowerFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToLower(s[:1]) + s[1:]
}

func newDesign(p *Report) *design {
	u := p.units()
	d := &design{governing: fmt.Sprintf("Governing design values%s (in %s; %s: x from the left end, +M sagging; columns: x from the start node)", p.overStrength(), u.Length, p.shownFromLeft())}
	groups := analysis.Groups(p.job())
	// The column states of every group's tables at once: in second order
	// each combination's solution is then formed once and let go.
	var states []int
	for _, g := range groups {
		if g.Kind != analysis.Floor {
			states = append(states, g.Members...)
		}
	}
	p.prefetchStates(states)
	for _, g := range groups {
		gd := groupDesign{Group: g}
		switch g.Kind {
		case analysis.Floor:
			if g.Index >= 0 {
				gd.title, gd.id = fmt.Sprintf("Beams at %s (y = %s %s)", g.Level, fixed(g.Y), u.Length), fmt.Sprintf("level-%d", g.Index)
			} else {
				gd.title, gd.id = fmt.Sprintf("Beams at y = %s %s, on no grid level", fixed(g.Y), u.Length), fmt.Sprintf("level-y%d", g.Off)
			}
		case analysis.ColumnLine:
			if g.Line != "" {
				gd.title, gd.id = fmt.Sprintf("Columns on line %s (x = %s %s)", g.Line, fixed(g.X), u.Length), "line-"+g.Line
			} else {
				gd.title, gd.id = fmt.Sprintf("Columns at x = %s %s, on no grid line", fixed(g.X), u.Length), fmt.Sprintf("line-x%d", g.Off)
			}
		default:
			gd.title, gd.id = "Other members", "other"
		}
		gd.tables = p.groupTables(gd)
		d.groups = append(d.groups, gd)
	}
	d.deflection = p.deflectionTable()
	d.limits = p.limitTable()
	d.reactions = p.reactionTable()
	if d.reactions != nil {
		d.reactions.Title += reductionNote(p.job())
	}
	d.withReactions = p.reactionStateTable()
	if d.withReactions != nil {
		d.withReactions.Title += reductionNote(p.job())
	}
	d.reduction = p.reductionTable()
	d.reducedReactions = p.reducedReactionTable()
	d.stability = p.stabilityTables()
	d.staticsTop, d.statics = p.staticsTable()
	return d
}

// peak is the governing value of one effect over a member's stations, with
// where it occurs, the combination, the pieces loaded and the forces acting
// with it.
type peak struct {
	v, x   float64
	by     int
	spans  []int
	loaded int
	with   [3]float64
}

// peaks holds a member's peaks of N, V, M: largest and smallest over the
// stations.
type peaks struct {
	hi, lo [3]peak
}

func memberPeaks(em envelope.Member) peaks {
	var p peaks
	for j := range 3 {
		p.hi[j].v, p.lo[j].v = math.Inf(-1), math.Inf(1)
	}
	for _, st := range em.Stations {
		for j, e := range [3]envelope.Extreme{st.N, st.V, st.M} {
			if e.Max > p.hi[j].v {
				p.hi[j] = peak{e.Max, st.X, e.MaxBy, e.MaxSpans, e.MaxLoaded, e.MaxWith}
			}
			if e.Min < p.lo[j].v {
				p.lo[j] = peak{e.Min, st.X, e.MinBy, e.MinSpans, e.MinLoaded, e.MinWith}
			}
		}
	}
	return p
}

// largest returns the peak of larger size of effect j, as a magnitude.
func (p peaks) largest(j int) peak {
	v := p.hi[j]
	if -p.lo[j].v > v.v {
		v = p.lo[j]
		v.v = -v.v
	}
	return v
}

// groupTables gives the design values of one group of members: for a
// floor (beams) the largest sagging and hogging moment and largest shear,
// and with column faces the values at the supports, centreline and face;
// for a column line or the others, the largest tension and compression
// with the moment acting with each, the largest moment and shear.
func (p *Report) groupTables(g groupDesign) []Table {
	mo := p.model()
	u := p.units()
	force, moment, at := p.force.Label, p.moment.Label, "at x ("+u.Length+")"
	if g.Kind != analysis.Floor {
		return []Table{p.withReduction(Table{g.title, columnHeader(force, moment, u.Length), p.columnRows(g.Members)}, g.Members),
			{"End moments, " + lowerFirst(g.title) + ": each governing value with the forces acting with it and the moments at the member's ends in the same state (the same combination and pieces loaded)" + reductionNote(p.job()), stateHeader(force, moment, u.Length, p.pieces() > 0), p.stateRows(g.Members)}}
	}
	patterned := p.pieces() > 0
	header := []string{"beam", "+M (" + moment + ")", at, "governing"}
	if patterned {
		header = append(header, "spans loaded")
	}
	header = append(header, "with V ("+force+")", "-M ("+moment+")", at, "governing")
	if patterned {
		header = append(header, "spans loaded")
	}
	header = append(header, "with V ("+force+")", "|V| ("+force+")", at, "governing", "with M ("+moment+")")
	var rows [][]string
	for _, m := range g.Members {
		pk := memberPeaks(p.shown(m))
		v := pk.largest(1)
		row := []string{mo.Members[m].Name, fixed(p.moment.Of(pk.hi[2].v)), fixed(pk.hi[2].x), p.comboName(pk.hi[2].by)}
		if patterned {
			row = append(row, p.shortSpans(pk.hi[2].spans, pk.hi[2].loaded))
		}
		row = append(row, fixed(p.force.Of(pk.hi[2].with[1])), fixed(p.moment.Of(pk.lo[2].v)), fixed(pk.lo[2].x), p.comboName(pk.lo[2].by))
		if patterned {
			row = append(row, p.shortSpans(pk.lo[2].spans, pk.lo[2].loaded))
		}
		row = append(row, fixed(p.force.Of(pk.lo[2].with[1])), fixed(p.force.Of(v.v)), fixed(v.x), p.comboName(v.by), fixed(p.moment.Of(v.with[2])))
		rows = append(rows, row)
	}
	out := []Table{p.withReduction(Table{g.title, header, rows}, g.Members)}
	if !p.res.HasFaces(g.Members) {
		return out
	}
	header = []string{"beam", "support", "M min, centreline (" + moment + ")", "governing", "M min, face (" + moment + ")", "face at x (" + u.Length + ")", "governing",
		"|V| centreline (" + force + ")", "governing", "|V| face (" + force + ")", "governing"}
	return append(out, Table{g.title + ": at the supports, centreline and column face" + reductionNote(p.job()), header, p.supportRows(g.Members)})
}

func columnHeader(force, moment, length string) []string {
	return []string{"member", "N max (" + force + ")", "with M (" + moment + ")", "governing", "N min (" + force + ")", "with M (" + moment + ")", "governing", "|M| (" + moment + ")", "at x (" + length + ")", "governing", "|V| (" + force + ")", "governing"}
}

// columnRows gives, per member, the largest tension and compression (N is
// positive in tension) with the moment acting with each, and the largest
// moment and shear in magnitude.
func (p *Report) columnRows(members []int) [][]string {
	mo := p.model()
	var rows [][]string
	for _, m := range members {
		pk := memberPeaks(p.shown(m))
		mm, v := pk.largest(2), pk.largest(1)
		f, mf := p.force.Of, p.moment.Of
		rows = append(rows, []string{mo.Members[m].Name,
			fixed(f(pk.hi[0].v)), fixed(mf(pk.hi[0].with[2])), p.comboName(pk.hi[0].by),
			fixed(f(pk.lo[0].v)), fixed(mf(pk.lo[0].with[2])), p.comboName(pk.lo[0].by),
			fixed(mf(mm.v)), fixed(mm.x), p.comboName(mm.by),
			fixed(f(v.v)), p.comboName(v.by)})
	}
	return rows
}

// largestShear returns the larger magnitude of a station's shear extremes
// and the combination that gives it.
func largestShear(s envelope.Station) (float64, int) {
	if -s.V.Min > s.V.Max {
		return -s.V.Min, s.V.MinBy
	}
	return s.V.Max, s.V.MaxBy
}

// supportRows gives, for each end of each beam at a support (an end of
// its span or a cantilever's root, not a free end nor a node inside a
// span), the least moment (hogging negative) and the largest shear at the
// centreline of the support and at the column face beside each other,
// each with its governing combination; "-" where an end has no face.
func (p *Report) supportRows(beams []int) [][]string {
	mo := p.model()
	var rows [][]string
	for _, m := range beams {
		em := p.shown(m)
		at := p.res.ShownFaces(m)
		from, to := analysis.ShownEnds(mo, m)
		for end, node := range [2]int{from, to} {
			if !p.res.HeldAt(m, node) {
				continue
			}
			cl := em.Stations[0]
			if end == 1 {
				cl = em.Stations[len(em.Stations)-1]
			}
			vcl, vclBy := largestShear(cl)
			row := []string{mo.Members[m].Name, mo.Nodes[node].Name, fixed(p.moment.Of(cl.M.Min)), p.comboName(cl.M.MinBy)}
			if f, ok := analysis.FaceStation(em, at, end); ok {
				vf, vby := largestShear(f)
				row = append(row, fixed(p.moment.Of(f.M.Min)), fixed(f.X), p.comboName(f.M.MinBy), fixed(p.force.Of(vcl)), p.comboName(vclBy), fixed(p.force.Of(vf)), p.comboName(vby))
			} else {
				row = append(row, "-", "-", "-", fixed(p.force.Of(vcl)), p.comboName(vclBy), "-", "-")
			}
			rows = append(rows, row)
		}
	}
	return rows
}

// reactionRoundOff is the fraction of the largest reaction component of a
// kind (Fx, Fy or M, over every support) at or below which a value is
// zero to round-off, and has no governing combination.
const reactionRoundOff = 1e-9

// reactionTable gives the envelope of every restrained reaction component;
// nil without supports. A value that is zero to round-off names no
// governing combination ("-"): which combination gives it is round-off.
func (p *Report) reactionTable() *Table {
	return p.reactionTableOf(p.res.Envelope.Reactions, "Reactions (global: +X right, +Y up, M counter-clockwise)")
}

// reactionTableOf is reactionTable for the reactions rs, with a title.
func (p *Report) reactionTableOf(rs []envelope.Reaction, title string) *Table {
	if len(rs) == 0 {
		return nil
	}
	mo := p.model()
	// The largest size of each component over every support, for what
	// counts as zero.
	var largest [3]float64
	for _, r := range rs {
		for d, e := range [3]envelope.Extreme{r.Fx, r.Fy, r.M} {
			if mo.Nodes[r.Node].Support.Restrained(d) {
				largest[d] = math.Max(largest[d], math.Max(math.Abs(e.Max), math.Abs(e.Min)))
			}
		}
	}
	// by names the combination of a value, "-" for one that is zero to
	// round-off: no combination governs it.
	by := func(d int, v float64, k int) string {
		if math.Abs(v) <= reactionRoundOff*largest[d] {
			return "-"
		}
		return p.comboName(k)
	}
	var rows [][]string
	for _, r := range rs {
		node := mo.Nodes[r.Node]
		name := node.Name
		for d, e := range []struct {
			label string
			s     analysis.Shown
			x     envelope.Extreme
		}{{"Fx (" + p.force.Label + ")", p.force, r.Fx}, {"Fy (" + p.force.Label + ")", p.force, r.Fy}, {"M (" + p.moment.Label + ")", p.moment, r.M}} {
			if !node.Reacts(d) {
				continue
			}
			rows = append(rows, []string{name, e.label, fixed(e.s.Of(e.x.Max)), by(d, e.x.Max, e.x.MaxBy), fixed(e.s.Of(e.x.Min)), by(d, e.x.Min, e.x.MinBy)})
			name = ""
		}
	}
	return &Table{title, []string{"node", "component", "max", "governing", "min", "governing"}, rows}
}

// reactionStateTable gives, for every restrained reaction component of
// every support, its largest and smallest value with the reaction acting
// with it at that node in the same state (the same combination and loaded
// pieces): what a foundation is designed for. nil without supports.
func (p *Report) reactionStateTable() *Table {
	env := p.res.Envelope
	if len(env.Reactions) == 0 {
		return nil
	}
	mo := p.model()
	// The largest size of each component over every support, for what
	// counts as zero.
	var largest [3]float64
	for _, r := range env.Reactions {
		for d, e := range [3]envelope.Extreme{r.Fx, r.Fy, r.M} {
			if mo.Nodes[r.Node].Support.Restrained(d) {
				largest[d] = math.Max(largest[d], math.Max(math.Abs(e.Max), math.Abs(e.Min)))
			}
		}
	}
	// by names the combination of a value, "-" for one that is zero to
	// round-off: no combination governs it.
	by := func(d int, v float64, k int) string {
		if math.Abs(v) <= reactionRoundOff*largest[d] {
			return "-"
		}
		return p.comboName(k)
	}
	patterned := p.pieces() > 0
	comps := [3]struct {
		name string
		s    analysis.Shown
	}{{"Fx", p.force}, {"Fy", p.force}, {"M", p.moment}}
	var rows [][]string
	for _, r := range env.Reactions {
		node := mo.Nodes[r.Node]
		name := node.Name
		for d, x := range [3]envelope.Extreme{r.Fx, r.Fy, r.M} {
			if !node.Reacts(d) {
				continue
			}
			for _, e := range [2]struct {
				what   string
				v      float64
				k      int
				with   [3]float64
				spans  []int
				loaded int
			}{{"max", x.Max, x.MaxBy, x.MaxWith, x.MaxSpans, x.MaxLoaded}, {"min", x.Min, x.MinBy, x.MinWith, x.MinSpans, x.MinLoaded}} {
				row := []string{name, comps[d].name + " " + e.what, fixed(comps[d].s.Of(e.v)), by(d, e.v, e.k)}
				if patterned {
					row = append(row, p.shortSpans(e.spans, e.loaded))
				}
				for c, w := range e.with {
					if node.Reacts(c) {
						row = append(row, fixed(comps[c].s.Of(w)))
					} else {
						row = append(row, "-")
					}
				}
				rows = append(rows, row)
				name = ""
			}
		}
	}
	f, m := p.force.Label, p.moment.Label
	header := []string{"node", "extreme", "value", "governing"}
	if patterned {
		header = append(header, "spans loaded")
	}
	header = append(header, "with Fx ("+f+")", "with Fy ("+f+")", "with M ("+m+")")
	return &Table{"Foundation loads: each extreme of a reaction with the whole reaction at its node in the same state, the same combination and pieces loaded (global: +X right, +Y up, M counter-clockwise)", header, rows}
}

// spanName names a span, cantilever or rafter by its end nodes, left to
// right, and a ridge or valley by its node.
func (p *Report) spanName(s *analysis.Span) string {
	if s.Kind == analysis.KindRidge || s.Kind == analysis.KindValley {
		return p.model().Nodes[s.Node].Name
	}
	return p.model().Nodes[s.Left].Name + "–" + p.model().Nodes[s.Right].Name
}

// hasRidges reports whether a run changes slope: whether there are
// rafters, ridges or valleys.
func (p *Report) hasRidges() bool {
	for i := range p.res.Spans {
		if k := p.res.Spans[i].Kind; k != analysis.KindSpan && k != analysis.KindCantilever {
			return true
		}
	}
	return false
}

// spanMembers lists the members of a span: all of up to three, else the
// first and the last and how many.
func (p *Report) spanMembers(s *analysis.Span) string {
	mo := p.model()
	if len(s.Members) <= 3 {
		names := make([]string, len(s.Members))
		for i, m := range s.Members {
			names[i] = mo.Members[m].Name
		}
		return strings.Join(names, " ")
	}
	return fmt.Sprintf("%s … %s (%d)", mo.Members[s.Members[0]].Name, mo.Members[s.Members[len(s.Members)-1]].Name, len(s.Members))
}

// deflectionTable gives, span by span and cantilever by cantilever, the
// largest downward and upward deflection over the service combinations and
// span/deflection; nil without service combinations or spans.
func (p *Report) deflectionTable() *Table {
	if p.service() == 0 || len(p.res.Spans) == 0 {
		return nil
	}
	u := p.units()
	levels := analysis.Levels(p.job())
	var rows [][]string
	for i := range p.res.Spans {
		r := &p.res.Spans[i]
		s := r.Deflection
		if !s.Found {
			continue
		}
		kind, level := r.Kind.String(), "-"
		if r.Beam {
			level = analysis.LevelName(p.job(), levels, r.Members[0])
		}
		row := []string{p.spanName(r), kind, p.spanMembers(r), level, fixed(r.Length)}
		// A span that never moves one way has nothing to show for it.
		if s.Down.V < 0 {
			row = append(row, sig4(p.defl.Of(s.Down.V)), fixed(s.Down.X), p.comboName(s.Down.By))
		} else {
			row = append(row, "0", "-", "-")
		}
		if s.Up.V > 0 {
			row = append(row, sig4(p.defl.Of(s.Up.V)), fixed(s.Up.X), p.comboName(s.Up.By))
		} else {
			row = append(row, "0", "-", "-")
		}
		rows = append(rows, append(row, ratio(s.Ratio)))
	}
	l, d := u.Length, p.defl.Label
	title := fmt.Sprintf("Deflection of spans and cantilevers, service combinations (+ up; deflections in %s, x in %s from the left end): spans from the chord between their displaced ends, cantilevers from their displaced root", d, l)
	if p.hasRidges() {
		title += "; rafters (the straight parts of a run that changes slope) from the chord between their displaced ends; a ridge or valley, where the slope changes, across the line between the ends of its run, from the chord between them"
	}
	return &Table{title, []string{"span", "kind", "members", "level", "length (" + l + ")", "down (" + d + ")", "at x (" + l + ")", "governing", "up (" + d + ")", "at x (" + l + ")", "governing", "span/deflection (cantilever: 2 × length)"}, rows}
}

// limitTable gives, span by span and cantilever by cantilever, each
// service combination with a limit: the largest deflection under it alone
// and where, span/deflection and whether it passes (at least the limit)
// or exceeds it; nil without one.
func (p *Report) limitTable() *Table {
	u := p.units()
	var rows [][]string
	for i := range p.res.Spans {
		r := &p.res.Spans[i]
		name := p.spanName(r)
		for _, c := range r.Limits {
			d := c.Deflection.Largest
			row := []string{name, r.Kind.String(), p.comboName(c.Combination), "L/" + shortest(c.Limit)}
			if d.By >= 0 {
				row = append(row, sig4(p.defl.Of(d.V)), fixed(d.X))
			} else {
				row = append(row, "0", "-")
			}
			check := "pass"
			if !c.Pass() {
				check = "EXCEEDS"
			}
			rows = append(rows, append(row, ratio(c.Deflection.Ratio), check))
			name = ""
		}
	}
	if len(rows) == 0 {
		return nil
	}
	l, d := u.Length, p.defl.Label
	return &Table{fmt.Sprintf("Deflection limits: every service combination with a limit, on every span and cantilever, under that combination alone (+ up; deflections in %s, x in %s from the left end; a cantilever's span/deflection over twice its length)", d, l),
		[]string{"span", "kind", "combination", "limit", "largest (" + d + ")", "at x (" + l + ")", "span/deflection", "check"}, rows}
}

// staticsTable gives the statics check of every case, with the note
// above it.
func (p *Report) staticsTable() (string, Table) {
	bs := p.res.Statics
	limit := analysis.StaticsLimit
	if len(bs) > 0 {
		limit = bs[0].Limit()
	}
	about := "the global origin"
	if len(bs) > 0 && (bs[0].X0 != 0 || bs[0].Y0 != 0) {
		about = fmt.Sprintf("(%s, %s), the lower left corner of the frame", shortest(bs[0].X0), shortest(bs[0].Y0))
	}
	note := fmt.Sprintf("\nStatics check of each load case: sums about %s, forces in %s, moments in %s;\n"+
		"largest joint residual as force / moment; out of balance as a fraction of the load, limit %.2g", about, p.force.Label, p.moment.Label, limit)
	var rows [][]string
	for _, b := range bs {
		check := "ok"
		if !b.OK() {
			check = "FAIL"
		}
		f, m := p.force.Of, p.moment.Of
		rows = append(rows, []string{b.Case, fixed(f(b.Applied.Fx)), fixed(f(b.Reactions.Fx)), fixed(f(b.Applied.Fy)), fixed(f(b.Reactions.Fy)),
			fixed(m(b.Applied.M)), fixed(m(b.Reactions.M)), sci(f(b.JointForce)) + " / " + sci(m(b.JointMoment)), sci(b.Relative()), check})
	}
	fu, mu := " ("+p.force.Label+")", " ("+p.moment.Label+")"
	return note, Table{"", []string{"case", "loads ΣFx" + fu, "reactions ΣFx" + fu, "loads ΣFy" + fu, "reactions ΣFy" + fu, "loads ΣM" + mu, "reactions ΣM" + mu, "joint residual (" + p.force.Label + " / " + p.moment.Label + ")", "out of balance", "check"}, rows}
}
