package envelope

// candidate is a loaded piece and the size of its effect.
type candidate struct {
	piece int
	a     float64
}

// less orders candidates by size, a later piece counting as smaller.
func (c candidate) less(d candidate) bool {
	return c.a < d.a || (c.a == d.a && c.piece > d.piece)
}

// keepLargest adds c to h, a min-heap on a of at most limit candidates,
// dropping the smallest when full: what remains are the limit largest seen.
// Equal sizes keep the earlier piece.
//
// The heap is the usual implicit binary tree in a slice: the children of
// h[i] are h[2i+1] and h[2i+2], and no child is less than its parent, so
// h[0] is the smallest kept, the one a larger candidate replaces.
func keepLargest(h []candidate, c candidate, limit int) []candidate {
	if len(h) < limit {
		h = append(h, c)
		for i := len(h) - 1; i > 0; {
			up := (i - 1) / 2
			if !h[i].less(h[up]) {
				break
			}
			h[i], h[up] = h[up], h[i]
			i = up
		}
		return h
	}
	if !h[0].less(c) {
		return h
	}
	h[0] = c
	for i := 0; ; {
		l, r, min := 2*i+1, 2*i+2, i
		if l < len(h) && h[l].less(h[min]) {
			min = l
		}
		if r < len(h) && h[r].less(h[min]) {
			min = r
		}
		if min == i {
			return h
		}
		h[i], h[min] = h[min], h[i]
		i = min
	}
}

// sortSmallestFirst sorts c, the smallest candidate first (candidate.less),
// by insertion: a list of at most maxSpans, at the cost of one comparison
// per candidate when it is sorted already. So sorted, a list is still a
// heap of keepLargest (no child less than its parent), and it can be read
// from its end, the largest first (keepDescending).
func sortSmallestFirst(c []candidate) {
	for i := 1; i < len(c); i++ {
		x := c[i]
		if !x.less(c[i-1]) {
			continue
		}
		k := i
		for ; k > 0 && x.less(c[k-1]); k-- {
			c[k] = c[k-1]
		}
		c[k] = x
	}
}

// keepDescending adds c to h, at most limit candidates sorted the largest
// first (candidate.less), dropping the smallest when full: what remains
// are the limit largest seen, in order, the same as keepLargest keeps.
// Candidates given the largest first each cost one comparison.
func keepDescending(h []candidate, c candidate, limit int) []candidate {
	n := len(h)
	if n == limit {
		if !h[n-1].less(c) {
			return h
		}
		n--
	} else {
		h = append(h, c)
	}
	k := n
	for ; k > 0 && h[k-1].less(c); k-- {
		h[k] = h[k-1]
	}
	h[k] = c
	return h
}

// keepAscending adds c to h, at most limit candidates sorted the smallest
// first (candidate.less), dropping the smallest when full: what remains
// are the limit largest seen, the same as keepLargest keeps, in order (so
// a heap of keepLargest too). For a short list the moves cost less than
// the heap's comparisons and its sorting after.
func keepAscending(h []candidate, c candidate, limit int) []candidate {
	n := len(h)
	if n < limit {
		h = append(h, c)
		k := n
		for ; k > 0 && c.less(h[k-1]); k-- {
			h[k] = h[k-1]
		}
		h[k] = c
		return h
	}
	if !h[0].less(c) {
		return h
	}
	// h[0] dropped: c goes after every other kept one less than it.
	k := 0
	for ; k+1 < n && h[k+1].less(c); k++ {
		h[k] = h[k+1]
	}
	h[k] = c
	return h
}
