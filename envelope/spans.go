package envelope

import "slices"

// A loaded piece is listed in MaxSpans or MinSpans when its own effect is
// at least spanShare of the largest single piece's, and among the maxSpans
// largest. Pieces with less influence are loaded too (exact placement puts
// every adverse piece on; MaxLoaded counts them) but are not named, so that
// the lists of a tall frame stay readable and its output tractable.
const (
	spanShare = 0.01
	maxSpans  = 16
)

// spanList collects the pieces loaded for one extreme at a station: in the
// order found (code, exhaustive), or ranked by influence (exact), the most
// influential kept.
type spanList struct {
	pieces []int
	ranked []candidate
	sorted bool // ranked is sorted the largest first already (exactPlacement.pieces)
	// distinct is whether no two units name the same piece (evaluator),
	// so that no piece can repeat in ranked.
	distinct bool
}

// order leaves in l.pieces the list to give: the ranked pieces, the most
// influential first, or else the pieces sorted; each once. It returns how
// many there are.
func (l *spanList) order() int {
	if c := l.ranked; len(c) > 0 {
		if !l.sorted {
			sortLargestFirst(c)
		}
		// A piece repeats only when two units name it (a hand-made
		// layout).
		if l.distinct {
			for _, x := range c {
				l.pieces = append(l.pieces, x.piece)
			}
			return len(l.pieces)
		}
		var seen map[int]bool
		if len(c) > 32 {
			seen = make(map[int]bool, len(c))
		}
		for _, x := range c {
			if seen != nil {
				if seen[x.piece] {
					continue
				}
				seen[x.piece] = true
			} else if slices.Contains(l.pieces, x.piece) {
				continue
			}
			l.pieces = append(l.pieces, x.piece)
		}
	} else {
		sortUnique(&l.pieces)
	}
	return len(l.pieces)
}

// spans fills in the pattern pieces loaded for each extreme in out. For
// exact placement every adverse piece is loaded (counted in MaxLoaded,
// MinLoaded); the most influential of them are listed, at most maxSpans,
// each with at least spanShare of the largest one's effect (all of them
// with AllSpans). For code arrangements the arrangement's pieces are listed,
// for exhaustive search the pieces of the best subset with at least
// spanShare of the largest one's factored effect. Each patterned case's
// units are scanned once for all the extremes that need them.
func (e *evaluator) spans(w *work, out *[3]Extreme) {
	for k := range w.lists {
		w.lists[k].pieces = w.lists[k].pieces[:0]
		w.lists[k].ranked = w.lists[k].ranked[:0]
		w.lists[k].sorted = false
		w.lists[k].distinct = e.distinct
	}
	var loaded [6]int
	total := 0
	pl, _ := w.place.(*exactPlacement)
	for j := range e.nEff {
		for side, by := range [2]int{out[j].MaxBy, out[j].MinBy} {
			k, hi := 2*j+side, side == 0
			l := &w.lists[k]
			if by < 0 {
				total += l.order()
				continue
			}
			// N and V of a station whose every patterned case's are
			// those of the same folds as at the station before, for the
			// same combination: the same list. (The deflections, one
			// effect, met between two stations, leave the lists kept.)
			var c *spanCache
			cacheable := pl != nil && j < 2 && e.nEff == 3
			if cacheable {
				c = &w.spanCache[k]
				if len(c.ids) != len(e.lay.Patterned) {
					c.ids = make([]uint64, len(e.lay.Patterned))
					c.e = nil
				}
				same := c.e == e && c.by == by
				for p := range e.lay.Patterned {
					id := pl.nvID[p]
					cacheable = cacheable && id != 0
					same = same && id == c.ids[p]
					c.ids[p] = id
				}
				if same && cacheable {
					l.pieces = append(l.pieces, c.pieces...)
					loaded[k] = c.loaded
					total += len(l.pieces)
					continue
				}
				c.e = nil
			}
			for p, pc := range e.lay.Patterned {
				// The factor of this case in the winning combination.
				f, has := 0.0, false
				for _, t := range e.cs[by].Terms {
					if t.Case == pc.Case {
						f, has = f+t.Factor, true
					}
				}
				if !has || f == 0 {
					continue
				}
				loaded[k] += w.place.pieces(e, w, l, by, p, j, f, hi)
			}
			total += l.order()
			if cacheable {
				c.e, c.by, c.loaded = e, by, loaded[k]
				c.pieces = append(c.pieces[:0], l.pieces...)
			}
		}
	}
	for k := 2 * e.nEff; k < len(w.lists); k++ {
		total += w.lists[k].order()
	}
	for j := range 3 {
		out[j].MaxLoaded, out[j].MinLoaded = loaded[2*j], loaded[2*j+1]
	}
	if total == 0 {
		return
	}
	// Copy the lists into exact-size slices of a chunk shared by many
	// stations (each slice's capacity its length): appending to the results
	// directly would grow hundreds of thousands of slices on a tall frame,
	// and a slice per station would be as many allocations.
	if len(w.spanBuf) < total {
		w.spanBuf = make([]int, max(total, spanChunk))
	}
	buf := w.spanBuf
	w.spanBuf = w.spanBuf[total:]
	at := 0
	take := func(k int) []int {
		n := copy(buf[at:], w.lists[k].pieces)
		s := buf[at : at+n : at+n]
		at += n
		return s
	}
	for j := range 3 {
		out[j].MaxSpans = take(2 * j)
		out[j].MinSpans = take(2*j + 1)
	}
}

// spanCache is one spans list of N or V as spans last formed it at a
// folded station (exactPlacement.nvID): the evaluator (nil for none),
// the combination, each patterned case's fold, how many pieces it loads
// and the list.
type spanCache struct {
	e      *evaluator
	by     int
	ids    []uint64
	loaded int
	pieces []int
}

// spanChunk is how many pieces the lists of the stations share one
// allocation for (spans).
const spanChunk = 2048

// sortLargestFirst sorts c, the largest candidate first (candidate.less):
// a short list (at most maxSpans per patterned case, unless AllSpans) by
// insertion, without a call per comparison. Candidates that neither is
// less than the other are the same piece with the same size, so the order
// is the one any sort gives.
func sortLargestFirst(c []candidate) {
	if len(c) > 4*maxSpans {
		slices.SortFunc(c, func(x, y candidate) int {
			if x.less(y) {
				return 1
			}
			if y.less(x) {
				return -1
			}
			return 0
		})
		return
	}
	for i := 1; i < len(c); i++ {
		x := c[i]
		k := i
		for ; k > 0 && c[k-1].less(x); k-- {
			c[k] = c[k-1]
		}
		c[k] = x
	}
}

// sortUnique sorts s and removes repeats; lists are usually sorted already.
func sortUnique(s *[]int) {
	if !slices.IsSorted(*s) {
		slices.Sort(*s)
	}
	*s = slices.Compact(*s)
}
