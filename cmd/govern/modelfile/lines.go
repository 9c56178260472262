package modelfile

import "govern/frame"

// CoordTol is the distance under which two coordinates are the same.
const CoordTol = coordTol

// Lines returns the X positions that the "line A" selectors of job's model
// file name: the grid's column lines, or without a grid every distinct node
// X from the left; line i is named LineName(i).
func Lines(job *Job) []float64 {
	if job.Grid != nil {
		return job.Grid.Lines
	}
	return distinct(job.Model.Nodes, func(n frame.Node) float64 { return n.X })
}
