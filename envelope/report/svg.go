package report

import (
	"math"
	"slices"

	"govern/envelope"
	"govern/envelope/analysis"
	"govern/frame"
)

// drawing maps the frame's coordinates to a picture about 1000 units
// across, to scale (Y up in the model, down in the picture), and sizes the
// marks drawn on it from a typical member length.
type drawing struct {
	mo     *frame.Model
	x0, y1 float64 // model left edge and top edge
	k      float64 // picture units per model length unit
	pad    float64 // picture units around the frame
	w, h   float64 // picture size
	u      float64 // a typical member length (the median), picture units
	diag   float64 // the largest ordinate of a diagram, model units
}

func newDrawing(mo *frame.Model) *drawing {
	all := make([]int, len(mo.Members))
	for m := range all {
		all[m] = m
	}
	return newDrawingOf(mo, all)
}

// newDrawingOf is newDrawing fitted to the members given, such as the
// beams of one floor: their nodes bound the picture, and its marks are
// sized from their lengths. Other members drawn on it fall outside.
func newDrawingOf(mo *frame.Model, members []int) *drawing {
	x0, x1, y0, y1 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	lengths := make([]float64, 0, len(members))
	for _, m := range members {
		mem := mo.Members[m]
		for _, v := range [2]int{mem.Start, mem.End} {
			n := mo.Nodes[v]
			x0, x1 = math.Min(x0, n.X), math.Max(x1, n.X)
			y0, y1 = math.Min(y0, n.Y), math.Max(y1, n.Y)
		}
		lengths = append(lengths, mo.Length(m))
	}
	if len(members) == 0 {
		for _, n := range mo.Nodes {
			x0, x1 = math.Min(x0, n.X), math.Max(x1, n.X)
			y0, y1 = math.Min(y0, n.Y), math.Max(y1, n.Y)
		}
		lengths = append(lengths, math.Max(x1-x0, y1-y0))
	}
	slices.Sort(lengths)
	lm := lengths[len(lengths)/2]
	d := &drawing{mo: mo, x0: x0, y1: y1}
	d.k = 1000 / math.Max(math.Max(x1-x0, y1-y0), lm)
	d.u = lm * d.k
	d.diag = 0.3 * lm
	d.pad = 0.6 * d.u
	d.w, d.h = (x1-x0)*d.k+2*d.pad, (y1-y0)*d.k+2*d.pad
	return d
}

// at returns the picture point of model point (x, y).
func (d *drawing) at(x, y float64) (float64, float64) {
	return (x-d.x0)*d.k + d.pad, (d.y1-y)*d.k + d.pad
}

// on returns the picture point a distance x along member m from its start
// and o across it, along its local y (model units).
func (d *drawing) on(m int, x, o float64) (float64, float64) {
	mem := d.mo.Members[m]
	a, b := d.mo.Nodes[mem.Start], d.mo.Nodes[mem.End]
	l := d.mo.Length(m)
	c, s := (b.X-a.X)/l, (b.Y-a.Y)/l
	return d.at(a.X+x*c-o*s, a.Y+x*s+o*c)
}

// onShown is on for a distance x along member m as shown (from the left
// end of a beam or rafter, see analysis.Shown) and o across it, towards the
// shown member's +y: up for a beam.
func (d *drawing) onShown(m int, x, o float64) (float64, float64) {
	if analysis.Flipped(d.mo, m) {
		return d.on(m, d.mo.Length(m)-x, -o)
	}
	return d.on(m, x, o)
}

// open writes the start of an SVG picture of the frame.
func (d *drawing) open(h *htmlOut, label string) {
	h.printf(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %s %s" role="img" aria-label="%s">`+"\n",
		svgNum(d.w), svgNum(d.h), esc(label))
}

// members draws every member as a line of the given class.
func (d *drawing) members(h *htmlOut, class string) {
	h.printf(`<g class="%s">`, class)
	for _, mem := range d.mo.Members {
		ax, ay := d.at(d.mo.Nodes[mem.Start].X, d.mo.Nodes[mem.Start].Y)
		bx, by := d.at(d.mo.Nodes[mem.End].X, d.mo.Nodes[mem.End].Y)
		h.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`, svgNum(ax), svgNum(ay), svgNum(bx), svgNum(by))
	}
	h.raw("</g>\n")
}

// elevation draws the frame with its node and member names, supports and
// releases; it returns how many names were left out for want of room.
func (d *drawing) elevation(h *htmlOut) int {
	mo := d.mo
	u := d.u
	d.members(h, "m")
	// Supports, below their nodes.
	h.raw(`<g class="sup">`)
	for _, n := range mo.Nodes {
		x, y := d.at(n.X, n.Y)
		b, t := 0.09*u, 0.12*u
		switch n.Support {
		case frame.Fixed:
			h.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="fix"/>`, svgNum(x-b), svgNum(y), svgNum(2*b), svgNum(0.05*u))
		case frame.Pinned:
			h.printf(`<path d="M%s %s L%s %s L%s %s Z"/>`, svgNum(x), svgNum(y), svgNum(x-b*0.8), svgNum(y+t), svgNum(x+b*0.8), svgNum(y+t))
			h.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`, svgNum(x-b), svgNum(y+t), svgNum(x+b), svgNum(y+t))
		case frame.Roller:
			h.printf(`<path d="M%s %s L%s %s L%s %s Z"/>`, svgNum(x), svgNum(y), svgNum(x-b*0.8), svgNum(y+t), svgNum(x+b*0.8), svgNum(y+t))
			h.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`, svgNum(x-b), svgNum(y+t+0.04*u), svgNum(x+b), svgNum(y+t+0.04*u))
		default:
			if n.Supported() {
				// Held by direction or on springs: an open square.
				h.printf(`<rect x="%s" y="%s" width="%s" height="%s" fill="none"/>`, svgNum(x-b/2), svgNum(y), svgNum(b), svgNum(b))
			}
		}
	}
	h.raw("</g>\n")
	// Releases: an open circle on the member beside the node.
	h.raw(`<g class="rel">`)
	for m, mem := range mo.Members {
		l := mo.Length(m)
		r := math.Min(0.03*u/d.k, l/8)
		if mem.Release.AtStart() {
			x, y := d.on(m, 2*r, 0)
			h.printf(`<circle cx="%s" cy="%s" r="%s"/>`, svgNum(x), svgNum(y), svgNum(r*d.k))
		}
		if mem.Release.AtEnd() {
			x, y := d.on(m, l-2*r, 0)
			h.printf(`<circle cx="%s" cy="%s" r="%s"/>`, svgNum(x), svgNum(y), svgNum(r*d.k))
		}
	}
	h.raw("</g>\n")
	// Nodes, and their names above and to the left where there is room;
	// member names at midlength beside the member; none over another.
	h.raw(`<g class="nd">`)
	for _, n := range mo.Nodes {
		x, y := d.at(n.X, n.Y)
		h.printf(`<circle cx="%s" cy="%s" r="%s"/>`, svgNum(x), svgNum(y), svgNum(0.018*u))
	}
	h.raw("</g>\n")
	nodes := &labelSet{fs: 0.08 * u}
	for _, n := range mo.Nodes {
		x, y := d.at(n.X, n.Y)
		o, b := 0.03*u, 0.03*u+ascent*0.08*u
		nodes.add(label{text: n.Name, rank: 1, at: []pos{
			{x - o, y - o, "end"}, {x + o, y - o, "start"}, {x - o, y + b, "end"}, {x + o, y + b, "start"},
			{x - o, y - o - 0.08*u, "end"}, {x + o, y - o - 0.08*u, "start"}}})
	}
	np, nd := nodes.place(nil)
	taken := make([]textBox, len(np))
	for i, l := range np {
		taken[i] = l.box
	}
	names := &labelSet{fs: 0.065 * u}
	for m, mem := range mo.Members {
		x, y := d.on(m, mo.Length(m)/2, 0)
		ex, ey := d.on(m, mo.Length(m), 0)
		ax, ay := unit(ex-x, ey-y)
		p, nx, ny := pos{x, y - 0.035*u, "middle"}, 0.0, -1.0
		if !mo.IsBeam(m) {
			p, nx, ny = pos{x + 0.035*u, y + 0.02*u, "start"}, 1, 0
		}
		names.add(label{text: mem.Name, rank: 1, at: around(p, ax, ay, nx, ny, 0.065*u)})
	}
	mp, md := names.place(taken)
	h.printf(`<g class="nn" font-size="%s">`, svgNum(0.08*u))
	writeLabels(h, "names", np)
	h.raw("</g>\n")
	h.printf(`<g class="mn" font-size="%s">`, svgNum(0.065*u))
	writeLabels(h, "names", mp)
	h.raw("</g>\n")
	return nd + md
}

// diagram is one kind of envelope drawn along the members, as they are
// shown (analysis.Shown).
type diagram struct {
	get  func(em envelope.Member, i int) envelope.Extreme
	side float64 // +1: positive values drawn towards the shown member's +y (up for a beam); −1: the other way
	// labels says where values are written: the ends, the largest
	// interior maximum, one label at mid-length, the largest deflection.
	ends, span, middle, sag bool
	format                  func(v float64) string
}

// envelopes draws, for each of the members, the diagram's largest and
// smallest values along the member with the band between them filled,
// and writes the governing values, none over another (labelSet): one
// <g class="env"> per member, holding a path for the band and one each
// for the two curves, then the values in <g class="vals">. It returns the
// scale the values are drawn to (model length per unit of value) and how
// many values were left out for want of room.
func (d *drawing) envelopes(h *htmlOut, p *Report, members []int, dg diagram) (scale float64, dropped int) {
	mo := d.mo
	big := 0.0
	for _, m := range members {
		em := p.shown(m)
		for i := range em.Stations {
			e := dg.get(em, i)
			big = math.Max(big, math.Max(math.Abs(e.Max), math.Abs(e.Min)))
		}
	}
	if big > 0 {
		scale = d.diag / big
	}
	fs := 0.065 * d.u
	vals := &labelSet{fs: fs}
	d.members(h, "g")
	h.printf(`<g class="lab" font-size="%s">`+"\n", svgNum(fs))
	var hi, lo []float64
	path := func(pts []float64, close bool) {
		for i := 0; i < len(pts); i += 2 {
			if i == 0 {
				h.raw("M")
			} else {
				h.raw(" L")
			}
			h.raw(svgNum(pts[i])).raw(" ").raw(svgNum(pts[i+1]))
		}
		if close {
			h.raw(" Z")
		}
	}
	for _, m := range members {
		em := p.shown(m)
		l := mo.Length(m)
		// The member's direction as shown, in the picture.
		sx, sy := d.onShown(m, 0, 0)
		ex, ey := d.onShown(m, l, 0)
		ax, ay := unit(ex-sx, ey-sy)
		hi, lo = hi[:0], lo[:0]
		for i, st := range em.Stations {
			e := dg.get(em, i)
			x1, y1 := d.onShown(m, st.X, dg.side*e.Max*scale)
			x2, y2 := d.onShown(m, st.X, dg.side*e.Min*scale)
			hi = append(hi, x1, y1)
			lo = append(lo, x2, y2)
		}
		h.printf(`<g class="env" data-member="%s"><path class="band" d="`, esc(mo.Members[m].Name))
		band := append(slices.Clone(hi), reversePoints(lo)...)
		path(band, true)
		h.raw(`"/><path class="hi" d="`)
		path(hi, false)
		h.raw(`"/><path class="lo" d="`)
		path(lo, false)
		h.raw(`"/>`)
		// Values.
		n := len(em.Stations)
		label := func(i int, v float64, text string, rank float64) {
			if text == "" {
				return
			}
			x := em.Stations[i].X
			shift := math.Min(0.04*d.u/d.k, l/6)
			switch i {
			case 0:
				x += shift
			case n - 1:
				x -= shift
			}
			o := dg.side * v * scale
			gap := 0.6 * fs / d.k
			if o < 0 || (o == 0 && dg.side < 0) {
				gap = -gap
			}
			px, py := d.onShown(m, x, o+gap)
			qx, qy := d.onShown(m, x, o+2*gap)
			nx, ny := qx-px, qy-py
			anchor := "middle"
			switch {
			case math.Abs(nx) > math.Abs(ny):
				anchor = "start"
				if nx < 0 {
					anchor = "end"
				}
				py += 0.35 * fs
			default:
				if ny > 0 {
					py += 0.8 * fs
				}
				if i == 0 {
					anchor = "start"
				} else if i == n-1 {
					anchor = "end"
				}
			}
			ox, oy := unit(nx, ny)
			vals.add(label{text: text, at: around(pos{px, py, anchor}, ax, ay, ox, oy, 0.9*fs), rank: rank})
		}
		larger := func(e envelope.Extreme) float64 {
			if math.Abs(e.Min) > math.Abs(e.Max) {
				return e.Min
			}
			return e.Max
		}
		significant := func(v float64) bool { return math.Abs(v) > 1e-9*big && big > 0 }
		if dg.ends {
			for _, i := range []int{0, n - 1} {
				if v := larger(dg.get(em, i)); significant(v) {
					label(i, v, dg.format(v), math.Abs(v)/big)
				}
			}
		}
		if dg.span && n > 2 {
			// The largest interior maximum, where it peaks above both ends.
			best := -1
			for i := 1; i < n-1; i++ {
				if best < 0 || dg.get(em, i).Max > dg.get(em, best).Max {
					best = i
				}
			}
			v := dg.get(em, best).Max
			if v > 0 && v > dg.get(em, 0).Max && v > dg.get(em, n-1).Max && significant(v) {
				label(best, v, dg.format(v), math.Abs(v)/big)
			}
		}
		if dg.middle {
			i := n / 2
			e := dg.get(em, i)
			if significant(e.Min) || significant(e.Max) {
				label(i, larger(e), dg.format(e.Min)+" / "+dg.format(e.Max), 1+math.Abs(larger(e))/big)
			}
		}
		if dg.sag {
			if i, v, text, ok := p.deflectionLabel(m); ok && significant(v) {
				label(i, v, text, 1+math.Abs(v)/big)
			}
		}
		h.raw("</g>\n")
	}
	out, dropped := vals.place(nil)
	writeLabels(h, "vals", out)
	h.raw("</g>\n")
	return scale, dropped
}

// writeLabels writes placed labels as the texts of a group of the class.
func writeLabels(h *htmlOut, class string, ls []placed) {
	h.printf(`<g class="%s">`, class)
	for _, l := range ls {
		h.printf(`<text x="%s" y="%s" text-anchor="%s">%s</text>`, svgNum(l.x), svgNum(l.y), l.anchor, esc(l.text))
	}
	h.raw("</g>\n")
}

// reversePoints returns the (x, y) pairs of pts in reverse order.
func reversePoints(pts []float64) []float64 {
	out := make([]float64, 0, len(pts))
	for i := len(pts) - 2; i >= 0; i -= 2 {
		out = append(out, pts[i], pts[i+1])
	}
	return out
}

// deflectionLabel returns, for the deflection drawing, the station of
// member m (as shown) where the largest deflection of its span or
// cantilever is, with its value and text; false when it is not on m.
func (p *Report) deflectionLabel(m int) (int, float64, string, bool) {
	i := p.res.SpanOf(m)
	if i < 0 {
		return 0, 0, "", false
	}
	s := p.res.Spans[i].Deflection
	if !s.Found || s.Largest.By < 0 || s.Largest.V == 0 || s.Largest.Member != m {
		return 0, 0, "", false
	}
	return s.Largest.Station, s.Largest.V, sig4(p.defl.Of(s.Largest.V)) + " (" + ratio(s.Ratio) + ")", true
}
