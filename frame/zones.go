package frame

// RigidZones returns the rigid end zones that the depths of the sections
// give each member of mo, times factor (0 to 1), as [start, end] lengths:
// a beam (a horizontal member) end takes half the depth of the column (a
// vertical member) it frames into, and a column end half the depth of the
// beam. Where several members of the other kind meet at the node (the
// column below and the one above, the beams on either side) the smallest
// depth is taken: the shortest zone, which leaves the member the more
// flexible. Sections without a depth are passed over, and so are sloping
// members. A member whose two zones would meet or cross (columns wider
// than the span), as for the faces of columns, gets none. Nothing in mo is changed; see
// [Model.SetRigidZones].
func RigidZones(mo *Model, factor float64) [][2]float64 {
	// Half the smallest depth of the columns and of the beams at each node.
	col := make([]float64, len(mo.Nodes))
	beam := make([]float64, len(mo.Nodes))
	for m, mem := range mo.Members {
		d := mo.Sections[mem.Section].Depth / 2
		var at []float64
		switch {
		case d <= 0:
			continue
		case mo.IsColumn(m):
			at = col
		case mo.IsBeam(m):
			at = beam
		default:
			continue
		}
		for _, n := range [2]int{mem.Start, mem.End} {
			if at[n] == 0 || d < at[n] {
				at[n] = d
			}
		}
	}
	out := make([][2]float64, len(mo.Members))
	for m, mem := range mo.Members {
		var other []float64
		switch {
		case mo.IsBeam(m):
			other = col
		case mo.IsColumn(m):
			other = beam
		default:
			continue
		}
		a, b := factor*other[mem.Start], factor*other[mem.End]
		if l := mo.Length(m); !(l-a-b > offsetTol*l) {
			continue
		}
		out[m] = [2]float64{a, b}
	}
	return out
}

// SetRigidZones gives every member of mo the rigid end zones of
// [RigidZones] at the ends for which keep returns false (keep may be nil):
// keep says which ends were given zones of their own.
func (mo *Model) SetRigidZones(factor float64, keep func(m, side int) bool) {
	z := RigidZones(mo, factor)
	for m := range mo.Members {
		if keep == nil || !keep(m, 0) {
			mo.Members[m].OffsetStart = z[m][0]
		}
		if keep == nil || !keep(m, 1) {
			mo.Members[m].OffsetEnd = z[m][1]
		}
	}
}
