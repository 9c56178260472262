package envelope

import "math"

// Seeding the ranking of the units (fold.go; exact.go's scan, for the
// unfolded stations and the nodes). Of the units of one sign at a station
// only the most influential are listed (maxSpans, with at least spanShare
// of the largest), and a unit below what the list keeps in the end is
// ranked for nothing. The units the list kept at the previous station, or
// at the last station of the member before (the last node before), are
// mostly still among the largest: their sizes here bound from below what
// the list will keep, and on the folded path the units below the bound
// are left out of the ranking as each sign's sum is formed, in the same
// pass. The bound never changes the list: any list of distinct units
// gives one that the units kept reach (keptAt), whichever units it names.

// seeding is whether the ranking is seeded from the units kept before;
// the tests turn it off to compare.
var seeding = true

// seeds reports whether w's rankings are seeded: with seeding, and a
// limit to the lists (not with AllSpans).
func seeds(w *work) bool { return seeding && w.limit != math.MaxInt }

// sumsReaching is sumsOver(list, n, v, a, x), and lists in ranked, in
// their order, the units whose x reaches thr; it returns how many.
// ranked holds at least len(list) entries.
func sumsReaching(list []int32, n, v, a, x []float64, thr float64, ranked []int32) (sn, sv, sa, big float64, nr int) {
	ranked = ranked[:len(list)]
	var hb uint64
	for _, u := range list {
		y := x[u]
		sn += n[u]
		sv += v[u]
		sa += a[u]
		hb = max(hb, math.Float64bits(y)&^(1<<63))
		ranked[nr] = u
		nr += b2i(y >= thr)
	}
	return sn, sv, sa, math.Float64frombits(hb), nr
}

// largestReaching is largestOver(list, vals), and lists in ranked, in
// their order, the units whose value is at most negThr (for a list of
// negative values, those whose size reaches −negThr); it returns how
// many. ranked holds at least len(list) entries.
func largestReaching(list []int32, vals []float64, negThr float64, ranked []int32) (float64, int) {
	ranked = ranked[:len(list)]
	var hb uint64
	nr := 0
	for _, u := range list {
		m := vals[u]
		hb = max(hb, math.Float64bits(m)&^(1<<63))
		ranked[nr] = u
		nr += b2i(m <= negThr)
	}
	return math.Float64frombits(hb), nr
}

// keptAt returns a size that the ranking of the units of one sign (of
// the sign asked: negative, below −nz, else above nz) can start from
// without changing the list it makes: the units listed in units
// (distinct) are those kept at another station or member. Of them, those
// of the sign at mv count: the largest size among them times share is at
// most share times the largest size of the sign, which a unit must reach
// anyway; and when all limit of them are of the sign (full), at least
// limit units reach the smallest size among them, so the limit largest
// do too. It returns 0 when no unit listed is of the sign.
//
// The sizes of the sign are numbers above nz ≥ 0 (not NaN), so their bits
// order as they do: the smallest and the largest are kept as bits, with
// no branch on the sizes (a unit not of the sign leaves them as they
// are, as all ones and as zero).
func keptAt(units []int32, mv []float64, nz float64, negative bool, share float64, limit int) (t float64, full bool) {
	lo, hi, q := math.Float64bits(math.Inf(1)), uint64(0), 0
	for _, u := range units {
		x := mv[u]
		if negative {
			x = -x
		}
		of := b2i(x > nz)
		m := -uint64(of) // all ones for a size of the sign
		b := math.Float64bits(x)
		lo = min(lo, b|^m)
		hi = max(hi, b&m)
		q += of
	}
	t = share * math.Float64frombits(hi)
	if q == limit && len(units) == limit {
		return max(t, math.Float64frombits(lo)), true
	}
	return t, false
}

// keptRows is keptAt's full bound for effect j of rows of values (a
// station's or a node's, exact.go's scan): the smallest size at rows of
// the units listed when all limit of them (distinct) are of the sign
// asked, past nz; else 0.
func keptRows(units []int32, rows [][3]float64, j int, nz float64, negative bool, limit int) float64 {
	if len(units) != limit {
		return 0
	}
	lo := math.Inf(1)
	for _, u := range units {
		x := rows[u][j]
		if negative {
			x = -x
		}
		if !(x > nz) {
			return 0
		}
		lo = min(lo, x)
	}
	return lo
}
