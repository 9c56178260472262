package main

import (
	"sort"

	"govern/cmd/govern/modelfile"
)

// columnLine is an X position where columns stand, with the name the model
// gives it.
type columnLine struct {
	x    float64
	name string // the line's letters; "" for a position on no grid line
	off  int    // for one on no grid line: 1, 2, … from the left
}

// columnLines returns the X positions of the columns of a job, from the
// left, named as the model's "line A" selectors name them: with a [grid]
// the grid's lines (and any column off them unnamed), without one every
// distinct node X lettered from the left (modelfile.Lines).
func columnLines(job *modelfile.Job) []columnLine {
	var out []columnLine
	for i, x := range modelfile.Lines(job) {
		out = append(out, columnLine{x: x, name: modelfile.LineName(i)})
	}
	mo := job.Model
	var off []columnLine
	for m, mem := range mo.Members {
		if x := mo.Nodes[mem.Start].X; mo.IsColumn(m) && nearest(out, x) < 0 && nearest(off, x) < 0 {
			off = append(off, columnLine{x: x})
			sort.Slice(off, func(i, j int) bool { return off[i].x < off[j].x })
		}
	}
	for i := range off {
		off[i].off = i + 1
	}
	out = append(out, off...)
	sort.SliceStable(out, func(i, j int) bool { return out[i].x < out[j].x })
	return out
}

// nearest returns the index of the line at x (within the model's
// coordinate tolerance) in lines, sorted by x; -1 for none.
func nearest(lines []columnLine, x float64) int {
	i := sort.Search(len(lines), func(i int) bool { return lines[i].x >= x-modelfile.CoordTol })
	if i < len(lines) && lines[i].x <= x+modelfile.CoordTol {
		return i
	}
	return -1
}

// lineOf returns the index of the line at x, which must be one of lines.
func lineOf(lines []columnLine, x float64) int {
	i := nearest(lines, x)
	if i < 0 {
		panic("cmd/govern: a column on no line")
	}
	return i
}
