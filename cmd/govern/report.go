package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"govern/envelope"
)

// reportStyle is the report's whole style sheet: plain, and printable on
// A4 or Letter paper in landscape.
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
svg text { font-family: Arial, sans-serif; fill: #111; }
.m line { stroke: #222; stroke-width: 1.8px; }
.g line { stroke: #999; stroke-width: 1px; }
.sup path, .sup rect { fill: #fff; stroke: #222; stroke-width: 1px; }
.sup rect.fix { fill: #777; }
.sup line { stroke: #222; stroke-width: 1px; }
.rel circle { fill: #fff; stroke: #222; stroke-width: 1.2px; }
.nd circle { fill: #222; }
.mn text { fill: #555; }
.band { fill: #8a8a8a; fill-opacity: .25; stroke: none; }
.hi { fill: none; stroke: #b3261e; stroke-width: 1.3px; }
.lo { fill: none; stroke: #1d4f9c; stroke-width: 1.3px; }
.key .hi-k { color: #b3261e; font-weight: 600; }
.key .lo-k { color: #1d4f9c; font-weight: 600; }
section.part { break-before: page; }
@media print {
  body { margin: 0; padding: 0; max-width: none; font-size: 9pt; }
  table { font-size: 7.5pt; }
  table.st { font-size: 6.5pt; }
  nav { display: none; }
}
footer { margin-top: 2em; }
`

// writeReport writes the whole analysis as one self-contained HTML page:
// the model, the frame and its envelopes drawn on the elevation, the
// design values and the station tables floor by floor and column line by
// column line, the reactions, the combinations, the statics check and the
// caution. The page needs no script and no network, and is well-formed
// XML. It is written as it is formed, so a large frame's report never sits
// in memory.
func (a *analysis) writeReport(w io.Writer, bal []caseBalance) error {
	h := newHTMLOut(w)
	title := a.job.Title
	if title == "" {
		title = "Envelopes"
	}
	h.raw("<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n")
	h.printf("<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n", esc(title), reportStyle)
	h.printf("<header>\n<h1>%s</h1>\n", esc(title))
	h.printf("<p class=\"meta\">Envelopes of N, V and M by the direct stiffness method; %s; units: force %s, length %s.</p>\n",
		esc(a.combinationCount()), esc(a.job.Units.Force), esc(a.job.Units.Length))
	h.printf("<p class=\"caution\"><strong>Caution.</strong> %s</p>\n", esc(caution))
	if note := a.conditionNote(); note != "" {
		h.printf("<p class=\"caution\">%s</p>\n", esc(note))
	}
	h.raw("</header>\n")

	groups := a.groups()
	h.raw("<nav><h2>Contents</h2><ol>\n")
	entries := [][2]string{{"model", "Model"}, {"elevation", "Elevation"}, {"moment", "Moment envelope"}, {"shear", "Shear envelope"}}
	if a.hasColumns() {
		entries = append(entries, [2]string{"axial", "Axial force envelope of the columns"})
	}
	if len(a.env.Service) > 0 {
		entries = append(entries, [2]string{"deflection", "Deflection envelope"})
	}
	for _, g := range groups {
		entries = append(entries, [2]string{g.id, g.title})
	}
	entries = append(entries, [2]string{"reactions", "Reactions"}, [2]string{"combinations", "Load combinations"}, [2]string{"statics", "Statics check"})
	for _, e := range entries {
		h.printf("<li><a href=\"#%s\">%s</a></li>\n", esc(e[0]), esc(e[1]))
	}
	h.raw("</ol></nav>\n")

	a.reportModel(h, bal)
	if err := a.reportFigures(h); err != nil {
		return err
	}
	h.raw("<section class=\"part\">\n<h2>Design values and stations</h2>\n")
	over := ""
	if s := len(a.env.Service); s > 0 && s < len(a.env.Combinations) {
		over = " over the strength combinations"
	}
	h.printf("<p>Governing design values%s, then the envelope at every station of every member. x is measured in %s from the left end of a beam or rafter, whichever way it was entered, and from the start node of a column; M is positive sagging for a beam or rafter (lower face in tension) and for a column positive with its local −y face in tension (see the conventions); N positive in tension, V = dM/dx. δ is the deflection of a beam or rafter from the line of its span or cantilever, + up (as in the table of deflections), and of a column from its chord. Combinations are numbered as in <a href=\"#combinations\">the list</a>; pieces of patterned cases loaded for an extreme are listed under its combination (the first three, then how many more). Rows marked face are at the face of a column.</p>\n",
		esc(over), esc(a.job.Units.Length))
	tb := htmlTables{h: h, heading: "h4"}
	for _, g := range groups {
		h.printf("<section id=\"%s\">\n<h3>%s</h3>\n", esc(g.id), esc(g.title))
		// The section's heading names the group already.
		sub := retitled{tb, func(t string) string {
			t = strings.TrimPrefix(t, g.title)
			if t == "" {
				return "Design values"
			}
			t = strings.TrimPrefix(t, ": ")
			return strings.ToUpper(t[:1]) + t[1:]
		}}
		if err := a.groupTables(sub, g); err != nil {
			return err
		}
		a.stationTable(h, g)
		h.raw("</section>\n")
	}
	h.raw("</section>\n")

	h.raw("<section id=\"reactions\" class=\"part\">\n<h2>Reactions</h2>\n")
	if err := a.reactionTable(retitled{htmlTables{h: h, heading: "h3"}, func(t string) string { return strings.TrimPrefix(t, "Reactions ") }}); err != nil {
		return err
	}
	if len(a.env.Reactions) == 0 {
		h.raw("<p>No node is supported.</p>\n")
	}
	h.raw("</section>\n")
	a.reportCombinations(h)
	h.raw("<section id=\"statics\">\n<h2>Statics check</h2>\n")
	if err := a.staticsTable(htmlTables{h: h, heading: "h3"}, bal); err != nil {
		return err
	}
	h.raw("</section>\n")
	h.printf("<footer>\n<p class=\"caution\"><strong>Caution.</strong> %s</p>\n</footer>\n</body>\n</html>\n", esc(caution))
	return h.flush()
}

// retitled passes tables on with their titles changed by f.
type retitled struct {
	tables
	f func(string) string
}

func (r retitled) table(title string, header []string, rows [][]string) error {
	return r.tables.table(r.f(title), header, rows)
}

func (a *analysis) hasColumns() bool {
	for m := range a.job.Model.Members {
		if a.job.Model.IsColumn(m) {
			return true
		}
	}
	return false
}

// reportModel writes the model summary: the analysis, sections, load cases.
func (a *analysis) reportModel(h *htmlOut, bal []caseBalance) {
	mo := a.job.Model
	u := a.job.Units
	info := a.sol.Info()
	supported, beams, cols := census(mo)
	h.raw("<section id=\"model\">\n<h2>Model</h2>\n")
	rows := [][]string{
		{"units", fmt.Sprintf("force %s, length %s; moments in %s (labels only: no unit is converted)", u.Force, u.Length, u.Moment())},
		{"nodes", fmt.Sprintf("%d, %d supported", len(mo.Nodes), supported)},
		{"members", fmt.Sprintf("%d: %d beams, %d columns, %d other", len(mo.Members), beams, cols, len(mo.Members)-beams-cols)},
		{"equations", fmt.Sprintf("%d free degrees of freedom, half-bandwidth %d", info.Equations, info.Bandwidth)},
		{"load cases", strconv.Itoa(len(mo.Cases))},
		{"combinations", a.combinationCount()},
		{"stations", fmt.Sprintf("%d equally spaced per member, both ends included", a.env.Settings.Stations)},
		{"variable loads", variableLoads(a.env.Settings.AsWritten)},
	}
	if n := a.faceCount(); n > 0 {
		rows = append(rows, []string{"column faces", fmt.Sprintf("%d beam ends get a station at the face of the column they frame into", n)})
	}
	if len(a.job.Patterned) > 0 {
		var names []string
		for _, c := range a.job.Patterned {
			names = append(names, mo.Cases[c].Name)
		}
		rows = append(rows, []string{"patterned cases", fmt.Sprintf("%s: %s placement, %d pieces (%d per beam)", strings.Join(names, ", "), a.lay.Mode, len(a.lay.Pieces), a.lay.Segments)})
	}
	if a.job.Set != nil {
		rows = append(rows, []string{"combination set", a.job.Set.Name + ": " + a.job.Set.Title})
	}
	tb := htmlTables{h: h, heading: "h3"}
	tb.table("Analysis", nil, rows)

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
		rows = append(rows, []string{s.Name, plain(s.E), plain(s.A), plain(s.I), plain(s.Weight), depth, strconv.Itoa(count[i])})
	}
	l := u.Length
	tb.table("Sections", []string{"section", "E (" + u.Force + "/" + l + "²)", "A (" + l + "²)", "I (" + l + "⁴)", "weight (" + u.Force + "/" + l + ")", "depth (" + l + ")", "members"}, rows)

	rows = rows[:0]
	patterned := map[int]bool{}
	for _, c := range a.job.Patterned {
		patterned[c] = true
	}
	for c, cs := range mo.Cases {
		yes := func(b bool) string {
			if b {
				return "yes"
			}
			return ""
		}
		rev := false
		if c < len(a.job.CaseInfo) {
			rev = a.job.CaseInfo[c].Reversible
		}
		if acts := a.job.Actions; acts != nil {
			// a case changes sign with its alternative
			p := acts.Of[c]
			rev = acts.List[p.Action].Alternatives[p.Alternative].Reversible
		}
		b := bal[c].b.Applied
		rows = append(rows, []string{cs.Name, a.job.Cases[c].Kind.String(), yes(patterned[c]), yes(rev), strconv.Itoa(len(cs.MemberLoads)), strconv.Itoa(len(cs.NodeLoads)), fixed(b.Fx), fixed(b.Fy)})
	}
	tb.table("Load cases", []string{"case", "kind", "patterned", "reversible", "member loads", "node loads", "ΣFx (" + u.Force + ")", "ΣFy (" + u.Force + ")"}, rows)
	h.raw("</section>\n")
}

// reportFigures draws the elevation and the envelopes on it, with the
// table of beam deflections below their figure.
func (a *analysis) reportFigures(h *htmlOut) error {
	mo := a.job.Model
	u := a.job.Units
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
	if s := len(a.env.Service); s > 0 && s < len(a.env.Combinations) {
		over = "the strength combinations"
	}

	h.raw("<section id=\"elevation\" class=\"part\">\n<h2>Elevation</h2>\n<figure>\n")
	d.open(h, "elevation of the frame")
	d.elevation(h)
	h.raw("</svg>\n")
	h.printf("<figcaption>The frame to scale, with node and member names. Supports: filled bar fixed, triangle pinned, triangle on a line roller (free along X). An open circle on a member marks a moment release (hinge) at that end.</figcaption>\n</figure>\n</section>\n")

	figure := func(id, title, label, caption string, members []int, dg diagram) {
		h.printf("<section id=\"%s\" class=\"part\">\n<h2>%s</h2>\n<figure>\n", id, esc(title))
		d.open(h, label)
		d.envelopes(h, a, members, dg)
		h.raw("</svg>\n")
		h.printf("<figcaption>%s %s</figcaption>\n</figure>\n</section>\n", caption, key)
	}
	forces := func(j int) func(em envelope.Member, i int) envelope.Extreme {
		return func(em envelope.Member, i int) envelope.Extreme {
			st := em.Stations[i]
			return [3]envelope.Extreme{st.N, st.V, st.M}[j]
		}
	}
	figure("moment", "Moment envelope", "moment envelope",
		fmt.Sprintf("Bending moment M (%s) over %s, along every member, drawn on the tension side: sagging below a beam. Values: the larger in size at each end, and the largest sagging moment where it peaks within a member.", esc(u.Moment()), over),
		all, diagram{get: forces(2), side: -1, ends: true, span: true, format: short})
	figure("shear", "Shear envelope", "shear envelope",
		fmt.Sprintf("Shear force V (%s) over %s, positive drawn above a beam and on the local +y side of a column (left of a column drawn upwards). Values: the larger in size at each end.", esc(u.Force), over),
		all, diagram{get: forces(1), side: 1, ends: true, format: short})
	if len(cols) > 0 {
		figure("axial", "Axial force envelope of the columns", "axial force envelope",
			fmt.Sprintf("Axial force N (%s) of the columns over %s, tension positive, drawn on the local +y side (left of a column drawn upwards). Value at mid-height: smallest / largest.", esc(u.Force), over),
			cols, diagram{get: forces(0), side: 1, middle: true, format: short})
	}
	if len(a.env.Service) > 0 {
		figure("deflection", "Deflection envelope", "deflection envelope",
			fmt.Sprintf("Deflection (%s) over the service combinations, drawn as it moves, exaggerated: of beams and rafters from the chord between the displaced ends of their span, or for a cantilever from its displaced root; of columns from their own chord. Value: the largest of each span and cantilever, with span/deflection (twice the length for a cantilever).", esc(u.Length)),
			all, diagram{get: shownDeflection, side: 1, sag: true, format: sig4})
		// The table below the figure is the terminal's.
		return a.deflectionTable(htmlTables{h: h, heading: "h3"})
	}
	return h.err
}

// stationTable writes the envelope at every station of the group's
// members: one table, a heading row and a block of rows per member.
func (a *analysis) stationTable(h *htmlOut, g memberGroup) {
	mo := a.job.Model
	u := a.job.Units
	defl := len(a.env.Service) > 0
	cols := 14
	h.raw("<h4>Stations</h4>\n<table class=\"st\">\n<thead><tr>")
	head := []string{"x (" + u.Length + ")", "", "N max (" + u.Force + ")", "comb.", "N min (" + u.Force + ")", "comb.",
		"V max (" + u.Force + ")", "comb.", "V min (" + u.Force + ")", "comb.", "M max (" + u.Moment() + ")", "comb.", "M min (" + u.Moment() + ")", "comb."}
	if defl {
		head = append(head, "δ max ("+u.Length+")", "comb.", "δ min ("+u.Length+")", "comb.")
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
		h.printf("<td class=\"c\" title=\"%s\">%d", esc(a.env.Combinations[k].Name), k+1)
		if len(spans) > 0 {
			h.printf("<br/><span class=\"sp\">%s</span>", esc(a.shortSpans(spans, loaded)))
		}
		h.raw("</td>")
	}
	cell := func(v float64, f func(float64) string) { h.printf("<td class=\"n\">%s</td>", f(v)) }
	for _, m := range g.members {
		em := a.shown(m)
		mem := mo.Members[m]
		from, to := shownEnds(mo, m)
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
			for _, e := range [3]envelope.Extreme{st.N, st.V, st.M} {
				cell(e.Max, fixed)
				by(e.MaxBy, e.MaxSpans, e.MaxLoaded)
				cell(e.Min, fixed)
				by(e.MinBy, e.MinSpans, e.MinLoaded)
			}
			if defl {
				e := shownDeflection(em, i)
				cell(e.Max, sig4)
				by(e.MaxBy, e.MaxSpans, e.MaxLoaded)
				cell(e.Min, sig4)
				by(e.MinBy, e.MinSpans, e.MinLoaded)
			}
			h.raw("</tr>\n")
		}
		h.raw("</tbody>\n")
	}
	h.raw("</table>\n")
}

// shownDeflection is the deflection the report shows at station i of a
// member as shown: across the line of its span or cantilever for a beam or
// rafter, from its own chord for a column.
func shownDeflection(em envelope.Member, i int) envelope.Extreme {
	if em.LineDeflection != nil {
		return em.LineDeflection[i]
	}
	return em.Deflection[i]
}

// plain formats an input value as it would be typed, without an exponent
// for the magnitudes of section properties.
func plain(v float64) string {
	if a := math.Abs(v); a != 0 && (a < 1e-6 || a >= 1e15) {
		return num(v)
	}
	return strconv.FormatFloat(clean(v), 'f', -1, 64)
}

// fixed3 formats a distance along a member with three decimals.
func fixed3(v float64) string { return strconv.FormatFloat(clean(v), 'f', 3, 64) }

// reportCombinations lists the combinations, numbered, with their factors.
func (a *analysis) reportCombinations(h *htmlOut) {
	mo := a.job.Model
	h.raw("<section id=\"combinations\">\n<h2>Load combinations</h2>\n")
	if s := a.job.Set; s != nil {
		h.printf("<p>Generated from %s (%s), then the model's own.</p>\n", esc(s.Name), esc(s.Title))
	}
	h.raw("<table>\n<thead><tr><th>#</th><th>combination</th><th>rule</th><th>use</th>")
	for _, c := range mo.Cases {
		h.raw("<th>").text(c.Name).raw("</th>")
	}
	h.raw("</tr></thead>\n<tbody>\n")
	for k, cb := range a.env.Combinations {
		use := "strength"
		if cb.Service {
			use = "service"
		}
		h.printf("<tr><td class=\"n\">%d</td><td>%s</td><td>%s</td><td>%s</td>", k+1, esc(cb.Name), esc(cb.Rule), use)
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
