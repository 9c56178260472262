package report

import (
	"bufio"
	"fmt"
	"html"
	"io"
	"strconv"
	"strings"

	"govern/envelope"
	"govern/envelope/analysis"
)

// reportStyle is the report's whole style sheet: plain, and printable on
// A4 or Letter paper in landscape. In print the tables are set smaller
// and the station tables, data rather than a calculation, are left out
// (a line says where they are), so that a 45-member frame prints in
// about 15 pages.
const reportStyle = `
@page { size: landscape; margin: 10mm; }
body { font: 10pt/1.35 "Helvetica Neue", Arial, sans-serif; color: #111; margin: 1.5em auto; max-width: 1400px; padding: 0 1em; }
h1 { font-size: 17pt; margin: 0 0 .2em; }
h2 { font-size: 13pt; border-bottom: 1px solid #888; margin: 1.6em 0 .5em; break-after: avoid; }
h3 { font-size: 11pt; margin: 1.2em 0 .4em; break-after: avoid; }
h4 { font-size: 10pt; margin: 1em 0 .3em; break-after: avoid; }
p { margin: .3em 0 .6em; }
.meta { color: #444; }
.caution { border: 2px solid #a33; background: #fff3f3; padding: .5em .8em; }
nav ol { columns: 2; margin: .3em 0; }
table { border-collapse: collapse; font-size: 8.5pt; margin: .3em 0 1em; }
th, td { border: 1px solid #bbb; padding: 1px 5px; vertical-align: top; }
th { background: #eee; font-weight: 600; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
thead { display: table-header-group; }
tr { break-inside: avoid; }
tr.mh th { text-align: left; background: #dde6ee; }
tr.face td { background: #f6f3e6; }
table.st { font-size: 7.5pt; }
td.c { text-align: right; max-width: 9em; }
.sp { color: #555; font-size: 6.5pt; }
figure { margin: .5em 0 1.2em; break-inside: avoid; }
figcaption { font-size: 8.5pt; color: #333; }
svg { display: block; width: 100%; height: auto; max-height: 170mm; }
svg line, svg path, svg circle, svg rect { vector-effect: non-scaling-stroke; }
svg text { font-family: Arial, "Liberation Sans", Helvetica, sans-serif; fill: #111; }
.m line { stroke: #222; stroke-width: 1.8px; }
.g line { stroke: #999; stroke-width: 1px; }
.sup path, .sup rect { fill: #fff; stroke: #222; stroke-width: 1px; }
.sup rect.fix { fill: #777; }
.sup line { stroke: #222; stroke-width: 1px; }
.rel circle { fill: #fff; stroke: #222; stroke-width: 1.2px; }
.nd circle { fill: #222; }
.ld line, .ld path.arc { stroke: #7a3b00; stroke-width: 1.2px; fill: none; }
.ld path { fill: #7a3b00; }
.ld path.blk { fill: #c9873c; fill-opacity: .35; stroke: #7a3b00; stroke-width: 1px; }
.mn text { fill: #555; }
.band { fill: #8a8a8a; fill-opacity: .25; stroke: none; }
.hi { fill: none; stroke: #b3261e; stroke-width: 1.3px; }
.lo { fill: none; stroke: #1d4f9c; stroke-width: 1.3px; }
.key .hi-k { color: #b3261e; font-weight: 600; }
.key .lo-k { color: #1d4f9c; font-weight: 600; }
section.part { break-before: page; }
.flow2, .flow3 { column-gap: 2em; }
.flow2 { columns: 2; }
.flow3 { columns: 3; }
.flow2 table, .flow3 table { margin-top: 0; }
figure.ld svg { max-height: 80mm; }
p.print { display: none; }
@media print {
  body { margin: 0; padding: 0; max-width: none; font-size: 8.5pt; line-height: 1.15; }
  h2 { margin: 1em 0 .3em; }
  h3 { margin: .5em 0 .2em; }
  h4 { margin: .4em 0 .1em; }
  p { margin: .2em 0 .3em; }
  table { font-size: 6.5pt; margin: .2em 0 .5em; }
  th, td { padding: 0 2px; line-height: 1.1; }
  table.st, h4.st, .np { display: none; }
  figure.ld svg { max-height: 50mm; }
  section.part { break-before: auto; }
  #moment, #shear, #axial, #deflection { break-before: page; }
  #deflection svg { max-height: 100mm; }
  p.print { display: block; font-size: 7pt; color: #444; }
  .flow2 table, .flow3 table { font-size: 6.5pt; }
  nav { display: none; }
}
footer { margin-top: 2em; }
`

// WriteHTML writes the whole analysis as one self-contained HTML page:
// the model, the frame and its envelopes drawn on the elevation (SVG), the
// design values and the station tables floor by floor and column line by
// column line, the reactions, the combinations, the statics check and the
// caution. The page needs no script and no network, and is well-formed
// XML. It is written as it is formed, so a large frame's report never sits
// in memory.
func (p *Report) WriteHTML(w io.Writer) error {
	job := p.job()
	h := newHTMLOut(w)
	title := job.Title
	if title == "" {
		title = "Envelopes"
	}
	h.raw("<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n")
	h.printf("<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n", esc(title), reportStyle)
	h.printf("<header>\n<h1>%s</h1>\n", esc(title))
	if s := p.src; s != nil {
		h.raw("<table class=\"src\"><tbody>\n")
		for _, f := range s.fields() {
			h.printf("<tr><th>%s</th><td>%s</td></tr>\n", esc(f[0]), esc(f[1]))
		}
		h.raw("</tbody></table>\n")
	}
	h.printf("<p class=\"meta\">Envelopes of N, V and M by the direct stiffness method; %s; %s.</p>\n",
		esc(p.combinationCount()), esc(p.unitsText()))
	h.printf("<p class=\"meta\">%s</p>\n", esc(p.analysisText()))
	h.printf("<p class=\"caution\"><strong>Caution.</strong> %s</p>\n", esc(Caution))
	if note := p.conditionNote(); note != "" {
		h.printf("<p class=\"caution\">%s</p>\n", esc(note))
	}
	h.raw("</header>\n")

	d := p.tables()
	h.raw("<nav><h2>Contents</h2><ol>\n")
	entries := [][2]string{{"model", "Model"}, {"loads", "Loads"}, {"elevation", "Elevation"}, {"moment", "Moment envelope"}, {"shear", "Shear envelope"}}
	if p.hasColumns() {
		entries = append(entries, [2]string{"axial", "Axial force envelope of the columns"})
	}
	if p.service() > 0 {
		entries = append(entries, [2]string{"deflection", "Deflection envelope"})
	}
	for _, g := range d.groups {
		entries = append(entries, [2]string{g.id, g.title})
	}
	entries = append(entries, [2]string{"reactions", "Reactions"}, [2]string{"stability", "Frame stability"}, [2]string{"cases", "Load case results"}, [2]string{"combinations", "Load combinations"}, [2]string{"statics", "Statics check"})
	for _, e := range entries {
		h.printf("<li><a href=\"#%s\">%s</a></li>\n", esc(e[0]), esc(e[1]))
	}
	h.raw("</ol></nav>\n")

	p.htmlModel(h)
	if err := p.htmlLoads(h); err != nil {
		return err
	}
	if err := p.htmlFigures(h); err != nil {
		return err
	}
	h.raw("<section class=\"part\">\n<h2>Design values and stations</h2>\n")
	h.printf("<p>Governing design values%s, then the envelope at every station of every member. x is measured in %s from the left end of a beam or rafter, whichever way it was entered, and from the start node of a column; M is positive sagging for a beam or rafter (lower face in tension) and for a column positive with its local −y face in tension (see the conventions); N positive in tension, V = dM/dx. δ is the deflection of a beam or rafter from the line of its span or cantilever, + up (as in the table of deflections), and of a column from its chord. Combinations are numbered as in <a href=\"#combinations\">the list</a>; pieces of patterned cases loaded for an extreme are listed under its combination (the first three, then how many more). Rows marked face are at the face of a column.</p>\n",
		esc(p.overStrength()), esc(job.Units.Length))
	tb := htmlTables{h: h, heading: "h4"}
	for _, g := range d.groups {
		h.printf("<section id=\"%s\">\n<h3>%s</h3>\n", esc(g.id), esc(g.title))
		for i, t := range g.tables {
			tt := tb
			if g.Kind != analysis.Floor && i == 0 && len(g.tables) > 1 {
				// The table of end moments after it holds every value.
				tt.noPrint = true
				h.raw("<p class=\"print\">The summary table of these members is not printed: the table of end moments holds each of its values.</p>\n")
			}
			// The section's heading names the group already.
			t.Title = strings.TrimPrefix(t.Title, g.title)
			if t.Title == "" {
				t.Title = "Design values"
			} else {
				t.Title = strings.TrimPrefix(t.Title, ": ")
				t.Title = strings.ToUpper(t.Title[:1]) + t.Title[1:]
			}
			if err := tt.table(t); err != nil {
				return err
			}
		}
		p.stationTable(h, g.Members)
		h.raw("</section>\n")
	}
	h.raw("</section>\n")

	h.raw("<section id=\"reactions\" class=\"part\">\n<h2>Reactions</h2>\n")
	if t := d.reactions; t != nil {
		r := *t
		r.Title = strings.TrimPrefix(r.Title, "Reactions ")
		h.raw("<p class=\"print\">The envelope of the reactions is not printed: the foundation loads below hold each of its values.</p>\n")
		if err := (htmlTables{h: h, heading: "h3", noPrint: true}).table(r); err != nil {
			return err
		}
		r = *d.withReactions
		if err := (htmlTables{h: h, heading: "h3"}).table(r); err != nil {
			return err
		}
	} else {
		h.raw("<p>No node is supported.</p>\n")
	}
	h.raw("</section>\n")
	if t := d.reduction; t != nil {
		h.raw("<section id=\"reduction\" class=\"part\">\n<h2>Live load reduction</h2>\n")
		if err := (htmlTables{h: h, heading: "h3"}).table(*t); err != nil {
			return err
		}
		if r := d.reducedReactions; r != nil {
			if err := (htmlTables{h: h, heading: "h3"}).table(*r); err != nil {
				return err
			}
		}
		h.raw("</section>\n")
	}
	h.raw("<section id=\"stability\" class=\"part\">\n<h2>Frame stability</h2>\n")
	for _, t := range d.stability {
		if err := (htmlTables{h: h, heading: "h3"}).table(t); err != nil {
			return err
		}
	}
	h.raw("</section>\n")
	if err := p.htmlCases(h); err != nil {
		return err
	}
	p.htmlCombinations(h)
	h.raw("<section id=\"statics\">\n<h2>Statics check</h2>\n")
	st := htmlTables{h: h, heading: "h3"}
	if err := st.note(d.staticsTop); err != nil {
		return err
	}
	if err := st.table(d.statics); err != nil {
		return err
	}
	h.raw("</section>\n")
	h.printf("<footer>\n<p class=\"caution\"><strong>Caution.</strong> %s</p>\n</footer>\n</body>\n</html>\n", esc(Caution))
	return h.flush()
}

func (p *Report) hasColumns() bool {
	for m := range p.model().Members {
		if p.model().IsColumn(m) {
			return true
		}
	}
	return false
}

// htmlModel writes the model summary: the analysis, sections, load cases.
func (p *Report) htmlModel(h *htmlOut) {
	job, mo := p.job(), p.model()
	u := job.Units
	supported, beams, cols := census(mo)
	h.raw("<section id=\"model\">\n<h2>Model</h2>\n")
	rows := [][]string{
		{"units", p.unitsText()},
		{"nodes", fmt.Sprintf("%d, %d supported", len(mo.Nodes), supported)},
		{"members", fmt.Sprintf("%d: %d beams, %d columns, %d other", len(mo.Members), beams, cols, len(mo.Members)-beams-cols)},
		{"equations", fmt.Sprintf("%d free degrees of freedom, half-bandwidth %d", p.res.Info.Equations, p.res.Info.Bandwidth)},
		{"load cases", strconv.Itoa(len(mo.Cases))},
		{"combinations", p.combinationCount()},
		{"stations", fmt.Sprintf("%d equally spaced per member, both ends included", p.res.Envelope.Settings.Stations)},
		{"variable loads", variableLoads(p.res.Envelope.Settings.AsWritten)},
	}
	if n := p.res.FaceCount(); n > 0 {
		rows = append(rows, []string{"column faces", fmt.Sprintf("%d beam ends get a station at the face of the column they frame into", n)})
	}
	if names := p.patternedNames(); len(names) > 0 {
		rows = append(rows, []string{"patterned cases", strings.Join(names, ", ") + ": " + p.placement()})
	}
	if job.Set != nil {
		rows = append(rows, []string{"combination set", job.Set.Name + ": " + job.Set.Title})
	}
	tb := htmlTables{h: h, heading: "h3"}
	tb.table(Table{"Analysis", nil, rows})

	rows = rows[:0]
	count := make([]int, len(mo.Sections))
	for _, m := range mo.Members {
		count[m.Section]++
	}
	for i, s := range mo.Sections {
		depth := "-"
		if s.Depth > 0 {
			depth = plain(s.Depth)
		}
		alpha := "-"
		if s.Alpha > 0 {
			alpha = plain(s.Alpha)
		}
		rows = append(rows, []string{s.Name, plain(s.E), plain(s.A), plain(s.I), plain(s.Weight), depth, alpha, strconv.Itoa(count[i])})
	}
	l := u.Length
	tb.table(Table{"Sections", []string{"section", "E (" + u.Force + "/" + l + "²)", "A (" + l + "²)", "I (" + l + "⁴)", "weight (" + u.Force + "/" + l + ")", "depth (" + l + ")", "α (per degree)", "members"}, rows})
	p.htmlNodes(tb)
	p.htmlMembers(tb)

	rows = rows[:0]
	patterned := map[int]bool{}
	for _, c := range job.Patterned {
		patterned[c] = true
	}
	yes := func(b bool) string {
		if b {
			return "yes"
		}
		return ""
	}
	for c, cs := range mo.Cases {
		b := p.res.Statics[c].Applied
		rows = append(rows, []string{cs.Name, job.Cases[c].Kind.String(), yes(patterned[c]), yes(reversible(job, c)), strconv.Itoa(len(cs.MemberLoads)), strconv.Itoa(len(cs.NodeLoads)), fixed(p.force.Of(b.Fx)), fixed(p.force.Of(b.Fy))})
	}
	tb.table(Table{"Load cases", []string{"case", "kind", "patterned", "reversible", "member loads", "node loads", "ΣFx (" + p.force.Label + ")", "ΣFy (" + p.force.Label + ")"}, rows})
	h.raw("</section>\n")
}

// htmlFigures draws the elevation and the envelopes on it, with the
// table of beam deflections below their figure.
func (p *Report) htmlFigures(h *htmlOut) error {
	mo := p.model()
	d := newDrawing(mo)
	all := make([]int, len(mo.Members))
	var cols []int
	for m := range mo.Members {
		all[m] = m
		if mo.IsColumn(m) {
			cols = append(cols, m)
		}
	}
	key := "<span class=\"key\"><span class=\"hi-k\">red</span>: largest value, <span class=\"lo-k\">blue</span>: smallest, shaded between</span>"
	over := "the combinations"
	if p.overStrength() != "" {
		over = p.designCombinations()
	}

	h.raw("<section id=\"elevation\" class=\"part\">\n<h2>Elevation</h2>\n<figure>\n")
	d.open(h, "elevation of the frame")
	left := d.elevation(h)
	h.raw("</svg>\n")
	h.printf("<figcaption>The frame to scale, with node and member names. Supports: filled bar fixed, triangle pinned, triangle on a line roller (free along X). An open circle on a member marks a moment release (hinge) at that end.%s</figcaption>\n</figure>\n</section>\n", leftOut(left, "names", "the tables name every node and member"))

	// figure draws a diagram; caption may hold one %s, for the scale.
	figure := func(id, title, label, caption string, members []int, dg diagram, scaleText func(float64) string) {
		h.printf("<section id=\"%s\" class=\"part\">\n<h2>%s</h2>\n<figure>\n", id, esc(title))
		d.open(h, label)
		scale, dropped := d.envelopes(h, p, members, dg)
		h.raw("</svg>\n")
		if scaleText != nil {
			caption += " " + scaleText(scale)
		}
		h.printf("<figcaption>%s%s %s</figcaption>\n</figure>\n", caption, leftOut(dropped, "values", "every value is in the tables"), key)
		if dropped > 0 && dg.ends {
			// Too dense to write every value: the beams again, floor by
			// floor, each floor's drawing fitted to its beams.
			for _, g := range p.tables().groups {
				if g.Kind != analysis.Floor || len(g.Members) == 0 {
					continue
				}
				fd := newDrawingOf(mo, g.Members)
				h.printf("<figure class=\"floor\">\n")
				fd.open(h, label+", "+g.title)
				_, left := fd.envelopes(h, p, g.Members, dg)
				h.raw("</svg>\n")
				h.printf("<figcaption>%s: %s, to a scale of its own.%s</figcaption>\n</figure>\n", esc(title), esc(lowerFirst(g.title)), leftOut(left, "values", "every value is in the tables"))
			}
		}
		h.raw("</section>\n")
	}
	forces := func(j int) func(em envelope.Member, i int) envelope.Extreme {
		return func(em envelope.Member, i int) envelope.Extreme {
			st := em.Stations[i]
			return [3]envelope.Extreme{st.N, st.V, st.M}[j]
		}
	}
	figure("moment", "Moment envelope", "moment envelope",
		fmt.Sprintf("Bending moment M (%s) over %s, along every member, drawn on the tension side: sagging below a beam. Values: the larger in size at each end, and the largest sagging moment where it peaks within a member.", esc(p.moment.Label), over),
		all, diagram{get: forces(2), side: -1, ends: true, span: true, format: shownShort(p.moment)}, nil)
	figure("shear", "Shear envelope", "shear envelope",
		fmt.Sprintf("Shear force V (%s) over %s, positive drawn above a beam and on the local +y side of a column (left of a column drawn upwards). Values: the larger in size at each end.", esc(p.force.Label), over),
		all, diagram{get: forces(1), side: 1, ends: true, format: shownShort(p.force)}, nil)
	if len(cols) > 0 {
		figure("axial", "Axial force envelope of the columns", "axial force envelope",
			fmt.Sprintf("Axial force N (%s) of the columns over %s, tension positive, drawn on the local +y side (left of a column drawn upwards). Value at mid-height: smallest / largest.", esc(p.force.Label), over),
			cols, diagram{get: forces(0), side: 1, middle: true, format: shownShort(p.force)}, nil)
	}
	if p.service() > 0 {
		figure("deflection", "Deflection envelope", "deflection envelope",
			fmt.Sprintf("Deflection (%s) over the service combinations, drawn as it moves, exaggerated: of beams and rafters from the chord between the displaced ends of their span, or for a cantilever from its displaced root; of columns from their own chord. Value: the largest of each span and cantilever, with span/deflection (twice the length for a cantilever).", esc(p.defl.Label)),
			all, diagram{get: analysis.ShownDeflection, side: 1, sag: true, format: func(v float64) string { return sig4(p.defl.Of(v)) }},
			func(scale float64) string {
				if scale == 0 {
					return "Nothing deflects."
				}
				return fmt.Sprintf("Scale: deflections drawn %s times their true size, lengths to scale.", sig4(scale))
			})
		// The table below the figure is the terminal's.
		for _, t := range []*Table{p.tables().deflection, p.tables().limits} {
			if t != nil {
				if err := (htmlTables{h: h, heading: "h3"}).table(*t); err != nil {
					return err
				}
			}
		}
	}
	return h.err
}

// leftOut says how many labels of a drawing were left out for want of
// room, and where they are found; "" for none.
func leftOut(n int, what, where string) string {
	if n == 0 {
		return ""
	}
	if n == 1 {
		return fmt.Sprintf(" 1 of the %s is left out where it would overlap others; %s.", what, where)
	}
	return fmt.Sprintf(" %d %s are left out where they would overlap others; %s.", n, what, where)
}

// stationTable writes the envelope at every station of the members of a
// group: one table, a heading row and a block of rows per member.
func (p *Report) stationTable(h *htmlOut, members []int) {
	mo := p.model()
	u := p.units()
	env := p.res.Envelope
	defl := p.service() > 0
	cols := 14
	h.raw("<h4 class=\"st\">Stations</h4>\n<p class=\"print\">The envelope at every station of these members is in the report on screen and in the CSV; it is not printed.</p>\n<table class=\"st\">\n<thead><tr>")
	f, mu := p.force.Label, p.moment.Label
	head := []string{"x (" + u.Length + ")", "", "N max (" + f + ")", "comb.", "N min (" + f + ")", "comb.",
		"V max (" + f + ")", "comb.", "V min (" + f + ")", "comb.", "M max (" + mu + ")", "comb.", "M min (" + mu + ")", "comb."}
	if defl {
		head = append(head, "δ max ("+p.defl.Label+")", "comb.", "δ min ("+p.defl.Label+")", "comb.")
		cols += 4
	}
	for _, c := range head {
		h.raw("<th>").text(c).raw("</th>")
	}
	h.raw("</tr></thead>\n")
	by := func(k int, spans []int, loaded int) {
		if k < 0 {
			h.raw("<td></td>")
			return
		}
		h.printf("<td class=\"c\" title=\"%s\">%d", esc(env.Combinations[k].Name), k+1)
		if len(spans) > 0 {
			h.printf("<br/><span class=\"sp\">%s</span>", esc(p.shortSpans(spans, loaded)))
		}
		h.raw("</td>")
	}
	cell := func(v float64, f func(float64) string) { h.printf("<td class=\"n\">%s</td>", f(v)) }
	for _, m := range members {
		em := p.shown(m)
		mem := mo.Members[m]
		from, to := analysis.ShownEnds(mo, m)
		h.printf("<tbody>\n<tr class=\"mh\"><th colspan=\"%d\">%s: %s to %s, %s, length %s %s</th></tr>\n", cols,
			esc(mem.Name), esc(mo.Nodes[from].Name), esc(mo.Nodes[to].Name), esc(mo.Sections[mem.Section].Name), fixed(mo.Length(m)), esc(u.Length))
		for i, st := range em.Stations {
			if st.Extra {
				h.raw("<tr class=\"face\">")
			} else {
				h.raw("<tr>")
			}
			cell(st.X, fixed3)
			if st.Extra {
				h.raw("<td>face</td>")
			} else {
				h.raw("<td></td>")
			}
			for k, e := range [3]envelope.Extreme{st.N, st.V, st.M} {
				s := [3]analysis.Shown{p.force, p.force, p.moment}[k]
				cell(s.Of(e.Max), fixed)
				by(e.MaxBy, e.MaxSpans, e.MaxLoaded)
				cell(s.Of(e.Min), fixed)
				by(e.MinBy, e.MinSpans, e.MinLoaded)
			}
			if defl {
				e := analysis.ShownDeflection(em, i)
				cell(p.defl.Of(e.Max), sig4)
				by(e.MaxBy, e.MaxSpans, e.MaxLoaded)
				cell(p.defl.Of(e.Min), sig4)
				by(e.MinBy, e.MinSpans, e.MinLoaded)
			}
			h.raw("</tr>\n")
		}
		h.raw("</tbody>\n")
	}
	h.raw("</table>\n")
}

// htmlCombinations lists the combinations, numbered, with their factors.
func (p *Report) htmlCombinations(h *htmlOut) {
	job, mo := p.job(), p.model()
	h.raw("<section id=\"combinations\">\n<h2>Load combinations</h2>\n")
	if s := job.Set; s != nil {
		h.printf("<p>Generated from %s (%s), then the model's own.</p>\n", esc(s.Name), esc(s.Title))
	}
	h.raw("<table>\n<thead><tr><th>#</th><th>combination</th><th>rule</th><th>use</th>")
	for _, c := range mo.Cases {
		h.raw("<th>").text(c.Name).raw("</th>")
	}
	h.raw("</tr></thead>\n<tbody>\n")
	for k, cb := range p.res.Envelope.Combinations {
		h.printf("<tr><td class=\"n\">%d</td><td>%s</td><td>%s</td><td>%s</td>", k+1, esc(cb.Name), esc(cb.Rule), use(cb))
		for c := range mo.Cases {
			f, has := 0.0, false
			for _, t := range cb.Terms {
				if t.Case == c {
					f, has = f+t.Factor, true
				}
			}
			if has {
				h.printf("<td class=\"n\">%s</td>", num(f))
			} else {
				h.raw("<td></td>")
			}
		}
		h.raw("</tr>\n")
	}
	h.raw("</tbody>\n</table>\n</section>\n")
}

// htmlOut writes markup to a buffered writer, keeping the first error.
// The markup is written well-formed (every element closed, attributes
// quoted, only the XML entities), so that it also reads as XML.
type htmlOut struct {
	w   *bufio.Writer
	err error
}

func newHTMLOut(w io.Writer) *htmlOut { return &htmlOut{w: bufio.NewWriterSize(w, 1<<16)} }

// raw writes s as it is: markup.
func (h *htmlOut) raw(s string) *htmlOut {
	if h.err == nil {
		_, h.err = h.w.WriteString(s)
	}
	return h
}

// text writes s escaped, as text or an attribute value.
func (h *htmlOut) text(s string) *htmlOut { return h.raw(esc(s)) }

// printf writes formatted markup; string arguments must be escaped first
// with esc.
func (h *htmlOut) printf(format string, args ...any) *htmlOut {
	if h.err == nil {
		_, h.err = fmt.Fprintf(h.w, format, args...)
	}
	return h
}

func (h *htmlOut) flush() error {
	if h.err != nil {
		return h.err
	}
	return h.w.Flush()
}

// esc escapes s for text or an attribute value, and drops the control
// characters that XML does not allow (a name in a model may hold them).
func esc(s string) string {
	if strings.IndexFunc(s, badXML) >= 0 {
		s = strings.Map(func(r rune) rune {
			if badXML(r) {
				return -1
			}
			return r
		}, s)
	}
	return html.EscapeString(s)
}

func badXML(r rune) bool {
	return (r < 0x20 && r != '\t' && r != '\n' && r != '\r') || r == 0xFFFE || r == 0xFFFF
}

// htmlTables renders tables as HTML, each with a heading.
type htmlTables struct {
	h       *htmlOut
	heading string // "h3", "h4"
	// noPrint leaves the tables out in print (class np): another table
	// that is printed holds each of their values.
	noPrint bool
}

func (t htmlTables) note(text string) error {
	t.h.raw("<p>")
	for i, line := range strings.Split(strings.TrimSpace(text), "\n") {
		if i > 0 {
			t.h.raw("<br/>")
		}
		t.h.text(line)
	}
	t.h.raw("</p>\n")
	return t.h.err
}

// flow writes a long, narrow table flowing in n columns of the page
// (2 or 3), so that it takes fewer pages.
func (t htmlTables) flow(tb Table, n int) error {
	class, attr := "", ""
	if t.noPrint {
		class, attr = " np", ` class="np"`
	}
	if tb.Title != "" {
		t.h.printf("<%s%s>%s</%s>\n", t.heading, attr, esc(tb.Title), t.heading)
		tb.Title = ""
	}
	t.h.printf("<div class=\"flow%d%s\">\n", n, class)
	err := t.table(tb)
	t.h.raw("</div>\n")
	return err
}

func (t htmlTables) table(tb Table) error {
	h := t.h
	class := ""
	if t.noPrint {
		class = ` class="np"`
	}
	if tb.Title != "" {
		h.printf("<%s%s>%s</%s>\n", t.heading, class, esc(tb.Title), t.heading)
	}
	h.printf("<table%s>\n", class)
	if len(tb.Header) > 0 {
		h.raw("<thead><tr>")
		for _, c := range tb.Header {
			h.raw("<th>").text(c).raw("</th>")
		}
		h.raw("</tr></thead>\n")
	}
	h.raw("<tbody>\n")
	for _, r := range tb.Rows {
		h.raw("<tr>")
		for _, c := range r {
			if isNumber(c) {
				h.raw(`<td class="n">`)
			} else {
				h.raw("<td>")
			}
			h.text(c).raw("</td>")
		}
		h.raw("</tr>\n")
	}
	h.raw("</tbody>\n</table>\n")
	return h.err
}
