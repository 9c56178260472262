package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"govern/frame"
)

// The input echo of the page: the model as analysed, so that a checker
// can verify every input from the page alone. Every value is written with
// the digits that give it back (num), in the model's units.

// htmlNodes writes the nodes: coordinates, support and springs.
func (p *Report) htmlNodes(tb htmlTables) error {
	mo, u := p.model(), p.units()
	springs := false
	for _, n := range mo.Nodes {
		springs = springs || n.Springs != [3]float64{}
	}
	header := []string{"node", "x (" + u.Length + ")", "y (" + u.Length + ")", "support"}
	if springs {
		header = append(header, "kx ("+u.Force+"/"+u.Length+")", "ky ("+u.Force+"/"+u.Length+")", "kr ("+u.Moment()+"/rad)")
	}
	var rows [][]string
	for _, n := range mo.Nodes {
		row := []string{n.Name, num(n.X), num(n.Y), supportText(n.Support)}
		if springs {
			for _, k := range n.Springs {
				row = append(row, nonZero(k))
			}
		}
		rows = append(rows, row)
	}
	return tb.flow(Table{"Nodes", header, rows}, 3)
}

// supportText names what a support holds.
func supportText(s frame.Support) string {
	switch s {
	case frame.Free:
		return ""
	case frame.Fixed:
		return "fixed"
	case frame.Pinned:
		return "pinned"
	case frame.Roller:
		return "roller (holds y)"
	}
	var held []string
	for d, name := range []string{"x", "y", "rotation"} {
		if s.Restrained(d) {
			held = append(held, name)
		}
	}
	return "holds " + strings.Join(held, ", ")
}

// nonZero writes v, or nothing for 0.
func nonZero(v float64) string {
	if v == 0 {
		return ""
	}
	return num(v)
}

// htmlMembers writes the members: ends, length, section, releases, and
// semi-rigid ends and rigid end zones where any member has them.
func (p *Report) htmlMembers(tb htmlTables) error {
	mo, u := p.model(), p.units()
	springs, zones := false, false
	for _, m := range mo.Members {
		springs = springs || m.SpringStart != 0 || m.SpringEnd != 0
		zones = zones || m.OffsetStart != 0 || m.OffsetEnd != 0
	}
	header := []string{"member", "start", "end", "length (" + u.Length + ")", "section", "hinge at"}
	if springs {
		header = append(header, "spring at start ("+u.Moment()+"/rad)", "spring at end ("+u.Moment()+"/rad)")
	}
	if zones {
		header = append(header, "rigid zone at start ("+u.Length+")", "rigid zone at end ("+u.Length+")")
	}
	var rows [][]string
	for i, m := range mo.Members {
		hinge := map[frame.Release]string{frame.ReleaseStart: "start", frame.ReleaseEnd: "end", frame.ReleaseBoth: "both ends"}[m.Release]
		row := []string{m.Name, mo.Nodes[m.Start].Name, mo.Nodes[m.End].Name, num(mo.Length(i)), mo.Sections[m.Section].Name, hinge}
		if springs {
			row = append(row, nonZero(m.SpringStart), nonZero(m.SpringEnd))
		}
		if zones {
			row = append(row, nonZero(m.OffsetStart), nonZero(m.OffsetEnd))
		}
		rows = append(rows, row)
	}
	if springs || zones {
		return tb.table(Table{"Members", header, rows})
	}
	return tb.flow(Table{"Members", header, rows}, 2)
}

// htmlLoads writes, case by case, the loads as the model file gives them
// (when the report knows its source), the loads as applied to each member
// and node, and a drawing of them on the elevation.
func (p *Report) htmlLoads(h *htmlOut) error {
	mo, u := p.model(), p.units()
	h.raw("<section id=\"loads\" class=\"part\">\n<h2>Loads</h2>\n")
	spacing := ""
	if p.src != nil && p.src.Spacing > 0 {
		spacing = fmt.Sprintf(" An area load q acts on a beam as a line load q × %s %s, the spacing of the frames.", num(p.src.Spacing), esc(u.Length))
	}
	h.printf("<p>Each load case as the model file gives it (with its line in the file) and as applied to each member and node, in %s and %s; distances along a member from its start node. Distributed and point loads act downward (gravity, positive down) or along +X; moments counter-clockwise positive; a temperature gradient is the local +y face less the local −y face.%s The drawing shows each case's loads on the elevation, distributed loads to scale within the case.</p>\n",
		esc(u.Force), esc(u.Length), spacing)
	tb := htmlTables{h: h, heading: "h4"}
	d := newDrawing(mo)
	for c, cs := range mo.Cases {
		h.printf("<section id=\"loads-%d\">\n<h3>%s</h3>\n", c+1, esc(cs.Name))
		if p.src != nil && c < len(p.src.Loads) && len(p.src.Loads[c]) > 0 {
			var rows [][]string
			for _, e := range p.src.Loads[c] {
				rows = append(rows, []string{strconv.Itoa(e.Line), e.Text, p.becameText(e)})
			}
			if err := tb.table(Table{"As entered", []string{"line", "load", "applied as"}, rows}); err != nil {
				return err
			}
		}
		if rows := p.memberLoadRows(cs); len(rows) > 0 {
			f, l := u.Force, u.Length
			t := dropEmpty(Table{"Member loads as applied", []string{"#", "member", "load", "direction", "from (" + l + ")", "to (" + l + ")", "w at from (" + f + "/" + l + ")", "w at to (" + f + "/" + l + ")",
				"P (" + f + ")", "M (" + u.Moment() + ")", "at (" + l + ")", "ΔT", "ΔT across"}, rows})
			if err := tb.flow(t, 2); err != nil {
				return err
			}
		}
		if len(cs.NodeLoads) > 0 {
			var rows [][]string
			for i, nl := range cs.NodeLoads {
				rows = append(rows, []string{strconv.Itoa(i + 1), mo.Nodes[nl.Node].Name, num(nl.Fx), num(nl.Fy), num(nl.M)})
			}
			if err := tb.table(Table{"Node loads", []string{"#", "node", "Fx (" + u.Force + ")", "Fy (" + u.Force + ")", "M (" + u.Moment() + ")"}, rows}); err != nil {
				return err
			}
		}
		if len(cs.Displacements) > 0 {
			var rows [][]string
			for i, nd := range cs.Displacements {
				rows = append(rows, []string{strconv.Itoa(i + 1), mo.Nodes[nd.Node].Name, num(nd.Ux), num(nd.Uy), num(nd.Rz)})
			}
			if err := tb.table(Table{"Support displacements", []string{"#", "node", "ux (" + u.Length + ")", "uy (" + u.Length + ")", "rz (rad)"}, rows}); err != nil {
				return err
			}
		}
		h.raw("<figure class=\"ld\">\n")
		d.open(h, "loads of case "+cs.Name)
		left := d.loads(h, cs)
		h.raw("</svg>\n")
		h.printf("<figcaption>Loads of %s on the elevation: distributed loads as blocks with their intensity (%s/%s), point loads and node forces as arrows (%s), moments as arcs (%s).%s</figcaption>\n</figure>\n</section>\n",
			esc(cs.Name), esc(u.Force), esc(u.Length), esc(u.Force), esc(u.Moment()), leftOut(left, "values", "the tables above give every load"))
	}
	h.raw("</section>\n")
	return h.err
}

// dropEmpty returns t without the columns that are empty in every row.
func dropEmpty(t Table) Table {
	keep := make([]bool, len(t.Header))
	for _, r := range t.Rows {
		for i, c := range r {
			keep[i] = keep[i] || c != ""
		}
	}
	out := Table{Title: t.Title}
	for i, hd := range t.Header {
		if keep[i] {
			out.Header = append(out.Header, hd)
		}
	}
	for _, r := range t.Rows {
		var row []string
		for i, c := range r {
			if keep[i] {
				row = append(row, c)
			}
		}
		out.Rows = append(out.Rows, row)
	}
	return out
}

// becameText says which applied loads an entered load became, by their
// numbers in the tables below.
func (p *Report) becameText(e EnteredLoad) string {
	var parts []string
	span := func(what string, first, n int) {
		switch {
		case n == 1:
			parts = append(parts, fmt.Sprintf("%s %d", what, first+1))
		case n > 1:
			parts = append(parts, fmt.Sprintf("%ss %d to %d", what, first+1, first+n))
		}
	}
	span("member load", e.FirstMember, e.Members)
	span("node load", e.FirstNode, e.Nodes)
	span("support displacement", e.FirstDisplacement, e.Displacements)
	return strings.Join(parts, ", ")
}

// memberLoadRows lists the member loads of a case as applied.
func (p *Report) memberLoadRows(cs frame.Case) [][]string {
	mo := p.model()
	var rows [][]string
	for i, ld := range cs.MemberLoads {
		dir := "gravity"
		if ld.Direction == frame.GlobalX {
			dir = "+X"
		}
		row := make([]string, 13)
		row[0], row[1] = strconv.Itoa(i+1), mo.Members[ld.Member].Name
		switch {
		case ld.Thermal:
			row[2] = "temperature"
			row[11], row[12] = num(ld.DT), num(ld.DTGrad)
		case ld.Moment:
			row[2] = "moment"
			row[9], row[10] = num(ld.M), num(ld.At)
		case ld.Point:
			row[2], row[3] = "point", dir
			row[8], row[10] = num(ld.P), num(ld.At)
		default:
			row[2], row[3] = "distributed", dir
			row[4], row[5], row[6], row[7] = num(ld.From), num(ld.To), num(ld.W), num(ld.WEnd)
		}
		rows = append(rows, row)
	}
	return rows
}

// loads draws the loads of one case on the frame: distributed loads as
// blocks beside their members (stacked where several act on one), to one
// scale within the case; point loads and node forces as arrows of one
// length; moments as arcs; each with its value.
func (d *drawing) loads(h *htmlOut, cs frame.Case) int {
	mo := d.mo
	d.members(h, "m")
	big := 0.0
	for _, ld := range cs.MemberLoads {
		if !ld.Point && !ld.Moment && !ld.Thermal {
			big = math.Max(big, math.Max(math.Abs(ld.W), math.Abs(ld.WEnd)))
		}
	}
	depth := 0.18 * d.u // picture units of the largest intensity
	arrow := 0.22 * d.u // length of a point load's arrow
	fs := 0.06 * d.u
	h.printf(`<g class="ld" font-size="%s">`+"\n", svgNum(fs))
	// The values are placed at the end so that none overlaps another
	// (labelSet): each where it belongs if there is room, else moved
	// along and up by steps.
	vals := &labelSet{fs: fs}
	put := func(x, y float64, anchor, text string) {
		vals.add(label{text: text, at: around(pos{x, y, anchor}, 1, 0, 0, -1, 0.9*fs), rank: 1})
	}
	stack := make([]float64, len(mo.Members)) // picture units used beside each member
	// pointer draws an arrow ending at (x, y) from direction (ux, uy) (unit,
	// picture axes), with a label at its tail.
	pointer := func(x, y, ux, uy float64, text string) {
		tx, ty := x-ux*arrow, y-uy*arrow
		h.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`, svgNum(tx), svgNum(ty), svgNum(x), svgNum(y))
		hx, hy := 0.04*d.u, 0.02*d.u
		h.printf(`<path d="M%s %s L%s %s L%s %s Z"/>`, svgNum(x), svgNum(y), svgNum(x-ux*hx-uy*hy), svgNum(y-uy*hx+ux*hy), svgNum(x-ux*hx+uy*hy), svgNum(y-uy*hx-ux*hy))
		put(tx-ux*0.3*fs, ty-uy*0.6*fs+0.35*fs, "middle", text)
	}
	for _, ld := range cs.MemberLoads {
		m := ld.Member
		switch {
		case ld.Thermal:
			x, y := d.on(m, mo.Length(m)/2, 0)
			put(x, y+1.2*fs, "middle", "ΔT "+short(ld.DT)+" / "+short(ld.DTGrad))
		case ld.Moment:
			x, y := d.on(m, ld.At, 0)
			r := 0.07 * d.u
			h.printf(`<path class="arc" d="M%s %s A%s %s 0 1 0 %s %s"/>`, svgNum(x+r), svgNum(y), svgNum(r), svgNum(r), svgNum(x), svgNum(y-r))
			put(x+r, y-r, "start", short(ld.M))
		case ld.Point:
			x, y := d.on(m, ld.At, 0)
			if ld.Direction == frame.GlobalX {
				pointer(x, y, sign(ld.P), 0, short(ld.P))
			} else {
				pointer(x, y, 0, sign(ld.P), short(ld.P)) // down the picture for a positive load
			}
		case parallel(mo, m, ld.Direction):
			// Along the member's axis (a column's own weight): a block
			// would have no width, so the intensity is written beside it.
			x, y := d.on(m, (ld.From+ld.To)/2, 0)
			text := short(ld.W)
			if ld.WEnd != ld.W {
				text += " to " + short(ld.WEnd)
			}
			arrowText := " ↓"
			if ld.Direction == frame.GlobalX {
				arrowText = " →"
			}
			put(x+0.3*fs+stack[m], y, "start", text+arrowText)
			stack[m] += (float64(len(text)) + 3) * 0.6 * fs
		default:
			// A block beside the member, on the side the load comes from:
			// above for gravity, to the left for +X.
			ux, uy := 0.0, -1.0 // picture direction away from the member
			if ld.Direction == frame.GlobalX {
				ux, uy = -1, 0
			}
			base := stack[m]
			k := 0.0
			if big > 0 {
				k = depth / big
			}
			ax, ay := d.on(m, ld.From, 0)
			bx, by := d.on(m, ld.To, 0)
			ha, hb := math.Abs(ld.W)*k, math.Abs(ld.WEnd)*k
			h.printf(`<path class="blk" d="M%s %s L%s %s L%s %s L%s %s Z"/>`,
				svgNum(ax+ux*base), svgNum(ay+uy*base), svgNum(bx+ux*base), svgNum(by+uy*base),
				svgNum(bx+ux*(base+hb)), svgNum(by+uy*(base+hb)), svgNum(ax+ux*(base+ha)), svgNum(ay+uy*(base+ha)))
			text := short(ld.W)
			if ld.WEnd != ld.W {
				text += " to " + short(ld.WEnd)
			}
			top := base + math.Max(ha, hb)
			mx, my := (ax+bx)/2+ux*(top+0.3*fs), (ay+by)/2+uy*(top+0.3*fs)
			anchor := "middle"
			if ux < 0 {
				anchor = "end"
			}
			put(mx, my, anchor, text)
			stack[m] = top + 1.3*fs
		}
	}
	for _, nl := range cs.NodeLoads {
		x, y := d.at(mo.Nodes[nl.Node].X, mo.Nodes[nl.Node].Y)
		if nl.Fx != 0 {
			pointer(x, y, sign(nl.Fx), 0, short(nl.Fx))
		}
		if nl.Fy != 0 {
			pointer(x, y, 0, -sign(nl.Fy), short(nl.Fy)) // +Y is up the model, up the picture
		}
		if nl.M != 0 {
			r := 0.07 * d.u
			h.printf(`<path class="arc" d="M%s %s A%s %s 0 1 0 %s %s"/>`, svgNum(x+r), svgNum(y), svgNum(r), svgNum(r), svgNum(x), svgNum(y-r))
			put(x+r, y-r, "start", short(nl.M))
		}
	}
	for _, nd := range cs.Displacements {
		x, y := d.at(mo.Nodes[nd.Node].X, mo.Nodes[nd.Node].Y)
		put(x, y+2*fs, "middle", "imposed "+short(nd.Ux)+", "+short(nd.Uy)+", "+short(nd.Rz))
	}
	out, dropped := vals.place(nil)
	writeLabels(h, "vals", out)
	h.raw("</g>\n")
	return dropped
}

// parallel reports whether a load in direction dir acts along member m's
// axis: gravity on a vertical member, +X on a horizontal one.
func parallel(mo *frame.Model, m int, dir frame.Direction) bool {
	a, b := mo.Nodes[mo.Members[m].Start], mo.Nodes[mo.Members[m].End]
	if dir == frame.GlobalX {
		return a.Y == b.Y
	}
	return a.X == b.X
}

func sign(v float64) float64 {
	if v < 0 {
		return -1
	}
	return 1
}
