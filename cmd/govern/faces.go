package main

import (
	"govern/envelope"
	"govern/frame"
)

// faceStations returns, for every member of mo, the distances from its start
// of the faces of the columns it frames into, as extra stations for the
// envelopes (envelope.Settings.Extra); nil when no section gives a depth.
//
// A beam (a horizontal member) gets a face station at each end where a
// column (a vertical member) whose section gives a depth meets it: half
// that depth in from the node. Where several columns meet there, typically
// the one below and the one above, the smallest depth is used: that face is
// the nearest to the joint, where the hogging moment and the shear are the
// larger, so the choice is on the safe side. Columns without a depth are
// passed over. A beam whose two faces would meet or cross (columns wider
// than the span) gets none.
func faceStations(mo *frame.Model) [][]float64 {
	half := make([]float64, len(mo.Nodes)) // half the smallest column depth at each node; 0 for none
	found := false
	for m, mem := range mo.Members {
		d := mo.Sections[mem.Section].Depth
		if d <= 0 || !mo.IsColumn(m) {
			continue
		}
		for _, n := range [2]int{mem.Start, mem.End} {
			if half[n] == 0 || d/2 < half[n] {
				half[n] = d / 2
			}
		}
		found = true
	}
	if !found {
		return nil
	}
	out := make([][]float64, len(mo.Members))
	for m, mem := range mo.Members {
		if !mo.IsBeam(m) {
			continue
		}
		l := mo.Length(m)
		a, b := half[mem.Start], half[mem.End]
		if a+b >= l {
			continue
		}
		if a > 0 {
			out[m] = append(out[m], a)
		}
		if b > 0 {
			out[m] = append(out[m], l-b)
		}
	}
	return out
}

// faceStation returns the face station of a member nearest its start
// (end 0) or its end (end 1), and false when that end has none.
func faceStation(em envelope.Member, length float64, end int) (envelope.Station, bool) {
	st := em.Stations
	if end == 0 {
		for _, s := range st {
			if s.Extra && s.X < length/2 {
				return s, true
			}
		}
		return envelope.Station{}, false
	}
	for i := len(st) - 1; i >= 0; i-- {
		if st[i].Extra && st[i].X > length/2 {
			return st[i], true
		}
	}
	return envelope.Station{}, false
}

// largestShear returns the larger magnitude of a station's shear extremes
// and the combination that gives it.
func largestShear(s envelope.Station) (float64, int) {
	if -s.V.Min > s.V.Max {
		return -s.V.Min, s.V.MinBy
	}
	return s.V.Max, s.V.MaxBy
}

// supportRows gives, for each end of each beam, the least moment (hogging
// negative) and the largest shear at the centreline of the support and at
// the column face beside each other; "-" where an end has no face.
func (a *analysis) supportRows(beams []int) [][]string {
	mo := a.job.Model
	var rows [][]string
	for _, m := range beams {
		em := a.env.Members[m]
		l := mo.Length(m)
		for end, node := range [2]int{mo.Members[m].Start, mo.Members[m].End} {
			cl := em.Stations[0]
			if end == 1 {
				cl = em.Stations[len(em.Stations)-1]
			}
			vcl, _ := largestShear(cl)
			row := []string{mo.Members[m].Name, mo.Nodes[node].Name, fixed(cl.M.Min), a.comboName(cl.M.MinBy)}
			if f, ok := faceStation(em, l, end); ok {
				vf, vby := largestShear(f)
				row = append(row, fixed(f.M.Min), fixed(f.X), a.comboName(f.M.MinBy), fixed(vcl), fixed(vf), a.comboName(vby))
			} else {
				row = append(row, "-", "-", "-", fixed(vcl), "-", "-")
			}
			rows = append(rows, row)
		}
	}
	return rows
}

// hasFaces reports whether any of the members has a face station.
func (a *analysis) hasFaces(members []int) bool {
	for _, m := range members {
		for _, s := range a.env.Members[m].Stations {
			if s.Extra {
				return true
			}
		}
	}
	return false
}
