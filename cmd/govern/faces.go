package main

import (
	"math"

	"govern/envelope"
	"govern/frame"
)

// columnFaces returns, for every member of mo, the distances from its start
// of the faces of the columns it frames into at its start and at its end,
// -1 where there is none; nil when no section gives a depth.
//
// A beam (a horizontal member) has a face at each end where a column (a
// vertical member) whose section gives a depth meets it: half that depth
// in from the node. Where several columns meet there, typically the one
// below and the one above, the smallest depth is used: that face is the
// nearest to the joint, where the hogging moment and the shear are the
// larger, so the choice is on the safe side. Columns without a depth are
// passed over. A beam whose two faces would meet or cross (columns wider
// than the span) has none.
func columnFaces(mo *frame.Model) [][2]float64 {
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
	out := make([][2]float64, len(mo.Members))
	for m, mem := range mo.Members {
		out[m] = [2]float64{-1, -1}
		if !mo.IsBeam(m) {
			continue
		}
		l := mo.Length(m)
		a, b := half[mem.Start], half[mem.End]
		if a+b >= l {
			continue
		}
		if a > 0 {
			out[m][0] = a
		}
		if b > 0 {
			out[m][1] = l - b
		}
	}
	return out
}

// faceStations returns the faces as extra stations for the envelopes
// (envelope.Settings.Extra); nil for none.
func faceStations(faces [][2]float64) [][]float64 {
	if faces == nil {
		return nil
	}
	out := make([][]float64, len(faces))
	for m, f := range faces {
		for _, x := range f {
			if x >= 0 {
				out[m] = append(out[m], x)
			}
		}
	}
	return out
}

// faceStation returns the station of em at the face at its start (end 0)
// or its end (end 1), faces being the member's columnFaces, and false when
// that end has none. The station is the marked one nearest the face (one
// falling within round-off of an equally spaced station marks that one).
func faceStation(em envelope.Member, faces [2]float64, end int) (envelope.Station, bool) {
	x := faces[end]
	if x < 0 {
		return envelope.Station{}, false
	}
	best := -1
	for i, s := range em.Stations {
		if s.Extra && (best < 0 || math.Abs(s.X-x) < math.Abs(em.Stations[best].X-x)) {
			best = i
		}
	}
	if best < 0 {
		return envelope.Station{}, false
	}
	return em.Stations[best], true
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
		em := a.shown(m)
		// The faces as shown: from the left end of a beam drawn right to left.
		at := [2]float64{-1, -1}
		if a.faces != nil {
			at = a.faces[m]
			if flipped(mo, m) {
				at = [2]float64{-1, -1}
				for end, x := range a.faces[m] {
					if x >= 0 {
						at[1-end] = mo.Length(m) - x
					}
				}
			}
		}
		from, to := shownEnds(mo, m)
		for end, node := range [2]int{from, to} {
			cl := em.Stations[0]
			if end == 1 {
				cl = em.Stations[len(em.Stations)-1]
			}
			vcl, _ := largestShear(cl)
			row := []string{mo.Members[m].Name, mo.Nodes[node].Name, fixed(cl.M.Min), a.comboName(cl.M.MinBy)}
			if f, ok := faceStation(em, at, end); ok {
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
