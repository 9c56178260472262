package modelfile

import (
	"cmp"
	"math"
	"slices"
)

// The position checks look for points near each other and for points on
// segments. Both sort the points into square cells and look only in the
// cells around each point or along each segment, so that they take time
// in proportion to the model, not its square, and find every pair within
// the tolerance whatever lies between the two in any one sort order.

// cellPoint is a point in the cell (cx, cy).
type cellPoint struct {
	cx, cy int64
	i      int32
}

// cells holds finite points sorted by cell, then index.
type cells struct {
	size float64 // side of a cell
	pts  []cellPoint
	cols map[int64][2]int32 // the points of each column of cells, as a range of pts
}

// maxCells keeps cell numbers exact: a cell is never smaller than 2⁻⁵⁰ of
// the largest coordinate, so that no cell number passes 2⁵⁰.
const maxCells = 0x1p-50

// newCells sorts the finite points of xs, ys into cells of side at least
// size.
func newCells(xs, ys []float64, size float64) *cells {
	big := 0.0
	for i := range xs {
		if finite(xs[i], ys[i]) {
			big = max(big, math.Abs(xs[i]), math.Abs(ys[i]))
		}
	}
	c := &cells{size: max(size, big*maxCells)}
	c.pts = make([]cellPoint, 0, len(xs))
	for i := range xs {
		if finite(xs[i], ys[i]) {
			cx, cy := c.cell(xs[i], ys[i])
			c.pts = append(c.pts, cellPoint{cx, cy, int32(i)})
		}
	}
	slices.SortFunc(c.pts, func(a, b cellPoint) int {
		if a.cx != b.cx {
			return cmp.Compare(a.cx, b.cx)
		}
		if a.cy != b.cy {
			return cmp.Compare(a.cy, b.cy)
		}
		return cmp.Compare(a.i, b.i)
	})
	c.cols = map[int64][2]int32{}
	for k := 0; k < len(c.pts); {
		e := k + 1
		for e < len(c.pts) && c.pts[e].cx == c.pts[k].cx {
			e++
		}
		c.cols[c.pts[k].cx] = [2]int32{int32(k), int32(e)}
		k = e
	}
	return c
}

func finite(x, y float64) bool {
	return !math.IsNaN(x) && !math.IsNaN(y) && !math.IsInf(x, 0) && !math.IsInf(y, 0)
}

func (c *cells) cell(x, y float64) (int64, int64) {
	return int64(math.Floor(x / c.size)), int64(math.Floor(y / c.size))
}

// column returns the points in cells (cx, cy0) to (cx, cy1), which are
// neighbours in the sorted order.
func (c *cells) column(cx, cy0, cy1 int64) []cellPoint {
	r, ok := c.cols[cx]
	if !ok {
		return nil
	}
	col := c.pts[r[0]:r[1]]
	lo, _ := slices.BinarySearchFunc(col, cy0, cellCompare)
	hi, _ := slices.BinarySearchFunc(col[lo:], cy1+1, cellCompare)
	return col[lo : lo+hi]
}

func cellCompare(p cellPoint, cy int64) int { return cmp.Compare(p.cy, cy) }

// nearPoints calls visit(i, j) for pairs of points i < j within tol of each
// other, for each j in turn with i increasing, until visit returns true.
// Points with a NaN or infinite coordinate are left out. A cluster of
// very many points within a few tol of each other costs the square of its
// size; past a budget of such work the search stops, which can only
// happen in a model with thousands of coincident nodes, each of them
// already a problem.
func nearPoints(xs, ys []float64, tol float64, visit func(i, j int) bool) {
	c := newCells(xs, ys, 2*tol)
	budget := 32*len(c.pts) + 1<<20
	var cand []int32
	at := make([]int32, len(xs)) // position of each point in c.pts
	for k, p := range c.pts {
		at[p.i] = int32(k)
	}
	for j := range xs {
		if !finite(xs[j], ys[j]) {
			continue
		}
		p := c.pts[at[j]]
		cand = cand[:0]
		for dx := int64(-1); dx <= 1; dx++ {
			col := c.column(p.cx+dx, p.cy-1, p.cy+1)
			budget -= len(col)
			for _, q := range col {
				if int(q.i) < j && math.Hypot(xs[j]-xs[q.i], ys[j]-ys[q.i]) <= tol {
					cand = append(cand, q.i)
				}
			}
		}
		if budget < 0 {
			return
		}
		slices.Sort(cand)
		for _, i := range cand {
			if visit(int(i), j) {
				break
			}
		}
	}
}

// pointsOnSegments calls visit(s, p, along) for each point p that lies on
// the interior of segment s (points segs[s][0] to segs[s][1]): within tol
// of its line, and more than tol from either end, along being its distance
// from the first end. Segments and points with a NaN or infinite
// coordinate are left out.
func pointsOnSegments(xs, ys []float64, segs [][2]int, tol float64, visit func(s, p int, along float64)) {
	// Cells about as large as the median segment: a segment crosses a few,
	// and a cell holds a few points of a regular frame.
	var lengths []float64
	for _, e := range segs {
		if l := math.Hypot(xs[e[1]]-xs[e[0]], ys[e[1]]-ys[e[0]]); !math.IsNaN(l) && !math.IsInf(l, 0) {
			lengths = append(lengths, l)
		}
	}
	if len(lengths) == 0 {
		return
	}
	slices.Sort(lengths)
	c := newCells(xs, ys, max(lengths[len(lengths)/2], 4*tol))
	test := func(s int, e [2]int, l float64, p int) {
		if p == e[0] || p == e[1] {
			return
		}
		ax, ay := xs[e[0]], ys[e[0]]
		ux, uy := (xs[e[1]]-ax)/l, (ys[e[1]]-ay)/l
		px, py := xs[p]-ax, ys[p]-ay
		along := px*ux + py*uy
		if math.Abs(px*uy-py*ux) <= tol && along > tol && along < l-tol {
			visit(s, p, along)
		}
	}
	var lo, hi []int64 // the run of cells in each column a segment passes
	for s, e := range segs {
		ax, ay, bx, by := xs[e[0]], ys[e[0]], xs[e[1]], ys[e[1]]
		l := math.Hypot(bx-ax, by-ay)
		if !finite(ax, ay) || !finite(bx, by) || !(l > 2*tol) || math.IsInf(l, 0) {
			continue
		}
		// Sample the segment at most a cell apart: a point within tol of
		// it is then less than a cell from a sample, so in one of the nine
		// cells around it.
		steps := math.Ceil(l / c.size)
		if 9*(steps+1) > float64(len(c.pts)) { // as cheap to test every point
			for _, q := range c.pts {
				test(s, e, l, int(q.i))
			}
			continue
		}
		// The cells within one of the samples' cells, column by column:
		// along a segment both cell numbers run one way, so in each column
		// they are one run of cells.
		n := int(steps)
		c0x, _ := c.cell(ax, ay)
		c1x, _ := c.cell(bx, by)
		first := min(c0x, c1x) - 1
		width := int(max(c0x, c1x)-first) + 2
		lo, hi = lo[:0], hi[:0]
		for range width {
			lo, hi = append(lo, math.MaxInt64), append(hi, math.MinInt64)
		}
		for k := 0; k <= n; k++ {
			f := float64(k) / float64(n)
			cx, cy := c.cell(ax+f*(bx-ax), ay+f*(by-ay))
			for d := int64(-1); d <= 1; d++ {
				if w := int(cx + d - first); w >= 0 && w < width {
					lo[w], hi[w] = min(lo[w], cy-1), max(hi[w], cy+1)
				}
			}
		}
		for w := range width {
			if lo[w] <= hi[w] {
				for _, q := range c.column(first+int64(w), lo[w], hi[w]) {
					test(s, e, l, int(q.i))
				}
			}
		}
	}
}
