package report

import (
	"io"
	"math"
	"slices"
	"strings"

	"govern/envelope"
	"govern/envelope/analysis"
)

// DesignShearNote heads the design CSV's columns of the shear at d from a
// face: taking the shear there is the user's decision.
const DesignShearNote = "confirm the conditions of ACI 318-19 9.4.3.2 / EN 1992-1-1 6.2.1(8) hold: the support reaction compresses the end of the member and no concentrated load acts between the face and d"

// designColumnStates are the states of a column the design CSV gives.
var designColumnStates = []string{"N max", "N min", "|M| max"}

// WriteDesignCSV writes the design values of every member, one row per
// member, ready for a spreadsheet: for a beam (shown from its left end,
// +M sagging) the least moment at each support face (the centreline where
// the support has no face), the largest moment in the span, the largest
// shear at each face and, where its section gives the effective depth d,
// at d from each face; for a column or another member the axial force and
// moment of each of N max, N min and |M| max with the end moments M1, M2
// of that state, M1/M2 and the curvature. Each value has its position and
// governing combination. Where a point load lies within d of a face the
// face's shear is given for the shear at d, and the note column says so.
// Columns of the other kind of member are empty. The last rows give the
// source of the results (program, model file, SHA-256, run date) and, for
// an ill-conditioned stiffness matrix, its condition number.
func (p *Report) WriteDesignCSV(w io.Writer) error {
	mo := p.model()
	u := p.units()
	f, mm := " ("+p.force.Label+")", " ("+p.moment.Label+")"
	x := " (" + u.Length + ")"
	header := []string{"member", "kind", "from node", "to node", "length" + x}
	for _, side := range []string{"left", "right"} {
		header = append(header, "M min at "+side+" support"+mm, "M min at "+side+" x"+x, "M min at "+side+" governing")
		if side == "left" {
			header = append(header, "M max in span"+mm, "M max in span x"+x, "M max in span governing")
		}
	}
	for _, side := range []string{"left", "right"} {
		header = append(header, "|V| at "+side+" support"+f, "|V| at "+side+" x"+x, "|V| at "+side+" governing",
			"|V| at d from "+side+" face"+f+" ["+DesignShearNote+"]", "|V| at d from "+side+" x"+x, "|V| at d from "+side+" governing")
	}
	for _, s := range designColumnStates {
		header = append(header, s+": N"+f, s+": M"+mm, s+": x"+x, s+": governing", s+": M1"+mm, s+": M2"+mm, s+": M1/M2", s+": curvature")
	}
	header = append(header, "note")
	cw := newCSVWriter(w)
	if err := cw.Write(header); err != nil {
		return err
	}
	beamCols := 3*3 + 2*6
	for m, mem := range mo.Members {
		from, to := analysis.ShownEnds(mo, m)
		row := []string{mem.Name, "", mo.Nodes[from].Name, mo.Nodes[to].Name, plain(mo.Length(m))}
		var note []string
		if mo.IsBeam(m) {
			row[1] = "beam"
			cells, n, err := p.designBeam(m)
			if err != nil {
				return err
			}
			row = append(row, cells...)
			note = n
			row = append(row, make([]string, 8*len(designColumnStates))...)
		} else {
			row[1] = "column"
			if !mo.IsColumn(m) {
				row[1] = "other"
			}
			row = append(row, make([]string, beamCols)...)
			for _, s := range p.statesOf(m) {
				if !slices.Contains(designColumnStates, s.what) {
					continue
				}
				if s.pk.by < 0 {
					row = append(row, make([]string, 8)...)
					continue
				}
				cells := []string{num(p.force.Of(s.pk.with[0])), num(p.moment.Of(s.pk.with[2])), position(s.pk.x), p.comboName(s.pk.by)}
				if s.ok {
					m1, m2, _, r, c := endPair(s.ends)
					cells = append(cells, num(p.moment.Of(m1)), num(p.moment.Of(m2)), r, c)
				} else {
					cells = append(cells, "", "", "", "")
				}
				row = append(row, cells...)
			}
		}
		if fs := memberFactors(p.job(), m); len(fs) > 0 {
			// The values above are reduced: say by what.
			note = append(note, "live load reduced: "+factorsCell(p.job(), fs))
		}
		row = append(row, strings.Join(note, "; "))
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	// Rows for the whole model: the source of the results, and an
	// ill-conditioned stiffness matrix's condition number; the name under
	// member, the kind "source" or "model", the value under note.
	var model [][2]string
	if s := p.src; s != nil {
		model = s.csvFields()
	}
	if p.conditionNote() != "" {
		model = append(model, [2]string{"condition_number", num(p.res.Condition())})
	}
	for _, f := range model {
		row := make([]string, len(header))
		row[0], row[1], row[len(row)-1] = f[0], "source", f[1]
		if f[0] == "condition_number" {
			row[1] = "model"
		}
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// designBeam gives the beam cells of the design CSV for beam m, as shown,
// and the notes of its row.
func (p *Report) designBeam(m int) ([]string, []string, error) {
	mo := p.model()
	em := p.shown(m)
	faces := p.res.ShownFaces(m)
	l := mo.Length(m)
	flip := analysis.Flipped(mo, m)
	n := len(em.Stations)
	// The station at each support: its face, else its centreline.
	support := func(end int) envelope.Station {
		if st, ok := analysis.FaceStation(em, faces, end); ok {
			return st
		}
		if end == 0 {
			return em.Stations[0]
		}
		return em.Stations[n-1]
	}
	left, right := support(0), support(1)
	var cells, notes []string
	hog := func(st envelope.Station) {
		cells = append(cells, num(p.moment.Of(st.M.Min)), position(st.X), p.comboName(st.M.MinBy))
	}
	hog(left)
	pk := memberPeaks(em)
	cells = append(cells, num(p.moment.Of(pk.hi[2].v)), position(pk.hi[2].x), p.comboName(pk.hi[2].by))
	hog(right)
	// The effective depth of the beam's section.
	d := 0.0
	if eds, sec := p.job().EffectiveDepths, mo.Members[m].Section; sec < len(eds) {
		d = eds[sec]
	}
	for end, st := range []envelope.Station{left, right} {
		v, by := largestShear(st)
		cells = append(cells, num(p.force.Of(v)), position(st.X), p.comboName(by))
		if d <= 0 {
			cells = append(cells, "", "", "")
			continue
		}
		// d from the face, towards the span (shown x).
		at := st.X + d
		if end == 1 {
			at = st.X - d
		}
		if at <= left.X || at >= right.X {
			cells = append(cells, "", "", "")
			notes = append(notes, sideName(end)+": d reaches past the other face; no shear at d")
			continue
		}
		if q, ok := p.pointLoadBetween(m, st.X, at); ok {
			cells = append(cells, num(p.force.Of(v)), position(st.X), p.comboName(by))
			notes = append(notes, sideName(end)+": a point load at x = "+fixed(q)+" lies within d of the face: the face's shear is given")
			continue
		}
		raw := at
		if flip {
			raw = l - at
		}
		sts, err := p.res.StationsAt(m, []float64{raw})
		if err != nil {
			return nil, nil, err
		}
		vd, byd := largestShear(sts[0])
		cells = append(cells, num(p.force.Of(vd)), position(at), p.comboName(byd))
	}
	return cells, notes, nil
}

func sideName(end int) string {
	if end == 0 {
		return "left"
	}
	return "right"
}

// pointLoadBetween reports whether a point load of any load case on beam m
// lies between a and b (x as shown, from its left end), the end nearer the
// face excluded, and gives its shown position.
func (p *Report) pointLoadBetween(m int, a, b float64) (float64, bool) {
	mo := p.model()
	lo, hi := math.Min(a, b), math.Max(a, b)
	for _, c := range mo.Cases {
		for _, ld := range c.MemberLoads {
			if ld.Member != m || !ld.Point || ld.P == 0 {
				continue
			}
			x := ld.At
			if analysis.Flipped(mo, m) {
				x = mo.Length(m) - x
			}
			if (a < b && x > lo && x <= hi) || (a > b && x >= lo && x < hi) {
				return x, true
			}
		}
	}
	return 0, false
}
