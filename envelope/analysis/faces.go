package analysis

import (
	"math"

	"govern/envelope"
	"govern/frame"
)

// ColumnFaces returns, for every member of mo, the distances from its start
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
func ColumnFaces(mo *frame.Model) [][2]float64 {
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

// FaceCount returns the number of beam ends that have a face station.
func (r *Result) FaceCount() int {
	n := 0
	for _, f := range r.Faces {
		for _, x := range f {
			if x >= 0 {
				n++
			}
		}
	}
	return n
}

// ShownFaces returns the faces of member m as it is shown (see Shown):
// from the left end of a beam drawn right to left; -1 for none.
func (r *Result) ShownFaces(m int) [2]float64 {
	at := [2]float64{-1, -1}
	if r.Faces == nil {
		return at
	}
	mo := r.Job.Model
	if !Flipped(mo, m) {
		return r.Faces[m]
	}
	for end, x := range r.Faces[m] {
		if x >= 0 {
			at[1-end] = mo.Length(m) - x
		}
	}
	return at
}

// FaceStation returns the station of em at the face at its start (end 0)
// or its end (end 1), faces being the member's faces (ShownFaces for a
// member as shown), and false when that end has none. The station is the
// marked one nearest the face (one falling within round-off of an equally
// spaced station marks that one).
func FaceStation(em envelope.Member, faces [2]float64, end int) (envelope.Station, bool) {
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

// HasFaces reports whether any of the members has a face station.
func (r *Result) HasFaces(members []int) bool {
	for _, m := range members {
		for _, s := range r.Envelope.Members[m].Stations {
			if s.Extra {
				return true
			}
		}
	}
	return false
}
