package report

import (
	"io"

	"govern/envelope/analysis"
	"govern/frame"
)

// cases returns the unfactored results of every load case, formed on
// first use and shared by the writers.
func (p *Report) cases() []analysis.CaseResult {
	p.casesOnce.Do(func() { p.caseResults = p.res.Cases() })
	return p.caseResults
}

// jsonCases writes the top-level "cases" list: per load case its
// reactions (the components held), the internal forces at both ends of
// every member (member axes) and the displacements of every node.
func (p *Report) jsonCases(j *jsonWriter) {
	mo := p.model()
	j.raw(",\n \"cases\": [")
	for i, c := range p.cases() {
		j.sep(i, ",").raw("\n  {\"name\": ").str(c.Name).raw(", \"reactions\": [")
		for k, r := range c.Reactions {
			j.sep(k, ", ").raw("{\"node\": ").str(mo.Nodes[r.Node].Name)
			v := [3]float64{p.force.Of(r.Fx), p.force.Of(r.Fy), p.moment.Of(r.M)}
			for d, key := range reactionForces {
				if r.Components[d] {
					j.raw(", \"").raw(key).raw("\": ").num(v[d])
				}
			}
			j.raw("}")
		}
		if c.Reduced != nil {
			// Live load reduction: node for node, each member's end force
			// there times its factor (analysis.Result.ReducedReactions).
			j.raw("],\n   \"reduced_reactions\": [")
			for k, r := range c.Reduced {
				j.sep(k, ", ").raw("{\"node\": ").str(mo.Nodes[r.Node].Name)
				v := [3]float64{p.force.Of(r.Fx), p.force.Of(r.Fy), p.moment.Of(r.M)}
				for d, key := range reactionForces {
					if r.Components[d] {
						j.raw(", \"").raw(key).raw("\": ").num(v[d])
					}
				}
				j.raw("}")
			}
		}
		j.raw("],\n   \"members\": [")
		end := func(f frame.Forces) {
			j.raw("{\"N\": ").num(p.force.Of(f.N)).raw(", \"V\": ").num(p.force.Of(f.V)).raw(", \"M\": ").num(p.moment.Of(f.M)).raw("}")
		}
		for k, e := range c.Ends {
			j.sep(k, ",").raw("\n    {\"name\": ").str(mo.Members[e.Member].Name).raw(", \"start\": ")
			end(e.Start)
			j.raw(", \"end\": ")
			end(e.End)
			j.raw("}")
		}
		j.raw("],\n   \"displacements\": [")
		for k, d := range c.Displacements {
			j.sep(k, ",").raw("\n    {\"node\": ").str(mo.Nodes[d.Node].Name).raw(", \"ux\": ").num(p.defl.Of(d.Ux)).raw(", \"uy\": ").num(p.defl.Of(d.Uy))
			if !d.RotationFree {
				j.raw(", \"rz\": ").num(d.Rz)
			}
			j.raw("}")
		}
		j.raw("]}")
	}
	j.raw("\n ]")
}

// WriteCasesCSV writes the unfactored results of every load case, one
// value a row: case, what (reaction, member end, displacement), the node
// or member, the end, the quantity, its value and unit. Members' end
// forces are in the member's own axes, as the envelopes' CSV.
func (p *Report) WriteCasesCSV(w io.Writer) error {
	mo := p.model()
	cw := newCSVWriter(w)
	if err := cw.Write([]string{"case", "result", "name", "end", "quantity", "value", "unit"}); err != nil {
		return err
	}
	row := func(c, what, name, end, q string, v float64, unit string) error {
		return cw.Write([]string{c, what, name, end, q, num(v), unit})
	}
	for _, c := range p.cases() {
		for _, rs := range []struct {
			what string
			rs   []analysis.Reaction
		}{{"reaction", c.Reactions}, {"reduced reaction", c.Reduced}} {
			for _, r := range rs.rs {
				v := [3]float64{p.force.Of(r.Fx), p.force.Of(r.Fy), p.moment.Of(r.M)}
				units := [3]string{p.force.Label, p.force.Label, p.moment.Label}
				for d, key := range reactionForces {
					if r.Components[d] {
						if err := row(c.Name, rs.what, mo.Nodes[r.Node].Name, "", key, v[d], units[d]); err != nil {
							return err
						}
					}
				}
			}
		}
		for _, e := range c.Ends {
			for k, f := range [2]frame.Forces{e.Start, e.End} {
				at := [2]string{"start", "end"}[k]
				for _, q := range []struct {
					key  string
					v    float64
					unit string
				}{{"N", p.force.Of(f.N), p.force.Label}, {"V", p.force.Of(f.V), p.force.Label}, {"M", p.moment.Of(f.M), p.moment.Label}} {
					if err := row(c.Name, "member", mo.Members[e.Member].Name, at, q.key, q.v, q.unit); err != nil {
						return err
					}
				}
			}
		}
		for _, d := range c.Displacements {
			name := mo.Nodes[d.Node].Name
			if err := row(c.Name, "displacement", name, "", "ux", p.defl.Of(d.Ux), p.defl.Label); err != nil {
				return err
			}
			if err := row(c.Name, "displacement", name, "", "uy", p.defl.Of(d.Uy), p.defl.Label); err != nil {
				return err
			}
			if !d.RotationFree {
				if err := row(c.Name, "displacement", name, "", "rz", d.Rz, "rad"); err != nil {
					return err
				}
			}
		}
	}
	if s := p.src; s != nil {
		// The source, a row each: result "source", its name under name
		// and its value under value.
		for _, f := range s.csvFields() {
			if err := cw.Write([]string{"", "source", f[0], "", "", f[1], ""}); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// htmlCases writes the section of unfactored results per load case: the
// reactions, the member end forces (beams from the left, +M sagging, as
// the other tables) and the node displacements.
func (p *Report) htmlCases(h *htmlOut) error {
	mo := p.model()
	u := p.units()
	f, m, d := p.force.Label, p.moment.Label, p.defl.Label
	h.raw("<section id=\"cases\" class=\"part\">\n<h2>Load case results</h2>\n")
	h.printf("<p>Each load case alone, unfactored; a patterned case with every span loaded. Reactions in global axes (Fx +X, Fy +Y, M counter-clockwise), only where a support or spring holds the node. Member end forces as the other tables show them: beams and rafters from the left end (+M sagging), columns from the start node (+M with the local −y face in tension); N + in tension, V = dM/dx. Displacements in global axes, rotation in radians counter-clockwise. Lengths in %s.</p>\n", esc(u.Length))
	tb := htmlTables{h: h, heading: "h4"}
	bulk := htmlTables{h: h, heading: "h4", noPrint: true}
	h.raw("<p class=\"print\">The member end forces and node displacements of each case are not printed: they are in the report on screen and in the cases CSV.</p>\n")
	for _, c := range p.cases() {
		h.printf("<h3>%s</h3>\n", esc(c.Name))
		var rows [][]string
		cells := func(row []string, r analysis.Reaction) []string {
			for d, v := range [3]float64{p.force.Of(r.Fx), p.force.Of(r.Fy), p.moment.Of(r.M)} {
				if r.Components[d] {
					row = append(row, fixed(v))
				} else {
					row = append(row, "")
				}
			}
			return row
		}
		for i, r := range c.Reactions {
			row := cells([]string{mo.Nodes[r.Node].Name}, r)
			if c.Reduced != nil {
				row = cells(row, c.Reduced[i])
			}
			rows = append(rows, row)
		}
		header, title := []string{"node", "Fx (" + f + ")", "Fy (" + f + ")", "M (" + m + ")"}, "Reactions of "+c.Name
		if c.Reduced != nil {
			// Live load reduction: the reduced reactions beside, labelled.
			header = append(header, "reduced Fx ("+f+")", "reduced Fy ("+f+")", "reduced M ("+m+")")
			title += " (reduced: each member's end force times its live load factor)"
		}
		if len(rows) > 0 {
			if err := tb.table(Table{title, header, rows}); err != nil {
				return err
			}
		}
		rows = nil
		for _, e := range c.Ends {
			from, to := analysis.ShownEnds(mo, e.Member)
			a, b := e.Shown(mo)
			rows = append(rows, []string{mo.Members[e.Member].Name, mo.Nodes[from].Name, fixed(p.force.Of(a.N)), fixed(p.force.Of(a.V)), fixed(p.moment.Of(a.M)),
				mo.Nodes[to].Name, fixed(p.force.Of(b.N)), fixed(p.force.Of(b.V)), fixed(p.moment.Of(b.M))})
		}
		// Bulk data, in the cases CSV too: shown on screen, not printed.
		if err := bulk.flow(Table{"Member end forces of " + c.Name, []string{"member", "from", "N (" + f + ")", "V (" + f + ")", "M (" + m + ")", "to", "N (" + f + ")", "V (" + f + ")", "M (" + m + ")"}, rows}, 2); err != nil {
			return err
		}
		rows = nil
		for _, x := range c.Displacements {
			rz := "free"
			if !x.RotationFree {
				rz = sig4(x.Rz)
			}
			rows = append(rows, []string{mo.Nodes[x.Node].Name, sig4(p.defl.Of(x.Ux)), sig4(p.defl.Of(x.Uy)), rz})
		}
		if err := bulk.flow(Table{"Node displacements of " + c.Name, []string{"node", "ux (" + d + ")", "uy (" + d + ")", "rz (rad)"}, rows}, 3); err != nil {
			return err
		}
	}
	h.raw("</section>\n")
	return h.err
}
