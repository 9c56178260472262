package envelope

import "math"

// The table of a second-order member's moments (fold.go): every unit's M
// at every station, M = (M₀ + x·V) + N·Σₖ Hᵢₖ·uₖ, for a member whose
// weights of the nodes' axial displacements (k = 0 and 3) are zero at
// every station, their terms left out. With AVX (table_amd64.s) four
// stations are formed at once, one to a lane, unit after unit: the same
// operations in the same order as the pure-Go loop, each product rounded
// and then added, so the same numbers to the last bit; and, in the same
// pass, each station's sum of the units' M in their order, which the
// classification of the station would otherwise form as a chain of
// additions of its own (classify).
//
// Once the member's round-off is known, the table is classified four
// stations at once too (signsOf): each lane adds, unit after unit, the
// unit's N, V and M to its station's sums of the positive or of the
// round-off units, and +0 to the others (a sum begun at +0 is never −0,
// so +0 leaves it as it is), and keeps the largest size of each sign and
// the counts: the numbers classify, sumsOver and largestOver form one
// station at a time, to the last bit. A station then needs no lists of
// its units by sign: only the few that reach the ranking's seed and
// share of the largest are listed (listReaching, four units compared at
// once). Without AVX (or with -tags purego) the stations are classified
// one by one as before.
//
// A first-order member's table is simpler, M = M₀ + x·V, and the
// round-off is known before it is formed (from the units' M at the
// member's ends): it is formed and classified in one pass, four stations
// at once (firstSigns), the same numbers as classify and the sums form
// from scanFolded's loop. The fold of N and V of such a member classifies
// the units for both effects at once, two lanes (foldSigns).

// momentLanes is what momentRowsAVX reads: the four lanes' stations and
// weights (H₁, H₂, H₄, H₅), the member's axial force and the mask that
// clears a number's sign.
type momentLanes struct {
	x, w1, w2, w4, w5 [4]float64
	n                 float64
	mask              uint64
}

// momentTable sets mt[i*nu+u], nu = len(a), to unit u's M at station i
// (xs, with the weights wts and axial force n; a, v and d the units' M₀,
// V and local displacements of the member's nodes), for a member whose
// weights 0 and 3 are zero. It returns the largest of bm and the sizes of
// the M formed, NaN left out, and whether it set tot[i] to the sum of
// row i over the units, in their order from +0 (with AVX; tot holds at
// least len(xs) entries then).
func momentTable(mt, tot, xs []float64, wts [][6]float64, n float64, a, v []float64, d [][6]float64, bm float64) (float64, bool) {
	nu, ns := len(a), len(xs)
	if nu == 0 || ns == 0 {
		return bm, false
	}
	v, d, mt, tot = v[:nu], d[:nu], mt[:ns*nu], tot[:ns]
	if useAVX {
		p := momentLanes{n: n, mask: 1<<63 - 1}
		var rows [4]*float64
		var out [8]float64
		for i0 := 0; i0 < ns; i0 += 4 {
			// A last group of fewer than four repeats its last station:
			// the same numbers, written twice to the same row.
			for l := range 4 {
				i := min(i0+l, ns-1)
				wi := &wts[i]
				p.x[l], p.w1[l], p.w2[l], p.w4[l], p.w5[l] = xs[i], wi[1], wi[2], wi[4], wi[5]
				rows[l] = &mt[i*nu]
			}
			momentRowsAVX(&rows, &a[0], &v[0], &d[0], nu, &p, &out)
			for l := range min(4, ns-i0) {
				tot[i0+l] = out[l]
				if out[4+l] > bm {
					bm = out[4+l]
				}
			}
		}
		return bm, true
	}
	return momentTableGo(mt, xs, wts, n, a, v, d, bm), false
}

// momentTableGo is momentTable in pure Go, without the sums, for any
// weights: the terms of weights 0 and 3 are ±0 where those are zero (d
// finite), and leave a sum begun at +0 as it is, so that the numbers are
// those of momentTable's four terms.
func momentTableGo(mt, xs []float64, wts [][6]float64, n float64, a, v []float64, d [][6]float64, bm float64) float64 {
	nu := len(a)
	v, d = v[:nu], d[:nu]
	for i, x := range xs {
		wi := &wts[i]
		w0, w1, w2, w3, w4, w5 := wi[0], wi[1], wi[2], wi[3], wi[4], wi[5]
		row := mt[i*nu : (i+1)*nu]
		for u := range row {
			du := &d[u]
			sw := 0.0
			sw += w0 * du[0]
			sw += w1 * du[1]
			sw += w2 * du[2]
			sw += w3 * du[3]
			sw += w4 * du[4]
			sw += w5 * du[5]
			mm := (a[u] + x*v[u]) + n*sw
			row[u] = mm
			if mm > bm {
				bm = mm
			} else if -mm > bm {
				bm = -mm
			}
		}
	}
	return bm
}

// signConsts is what signSumsAVX reads: the round-off nz and −nz, the
// mask that clears a number's sign and 1, four lanes each.
type signConsts struct {
	nz, negNz, mask, one [4]float64
}

// stationSigns is, at one station of a folded second-order member, what
// classify, sumsOver and largestOver form over a patterned case's units
// by the sign of their M: the sums of N, V and M of the positive units
// and of the round-off ones, the largest size of M of each sign and how
// many units are of each.
type stationSigns struct {
	pos, zero [3]float64
	big       [2]float64
	count     [2]int
}

// signsOf sets sg[i] to station i's stationSigns over the units of the
// table mt (nu = len(n), ns = len(sg) stations, n and v the units' N and
// V) with round-off nz, four stations at once (AVX only).
func signsOf(sg []stationSigns, mt, n, v []float64, nz float64) {
	nu, ns := len(n), len(sg)
	if nu == 0 {
		for i := range sg {
			sg[i] = stationSigns{}
		}
		return
	}
	v, mt = v[:nu], mt[:ns*nu]
	c := signConsts{}
	for l := range 4 {
		c.nz[l], c.negNz[l], c.mask[l], c.one[l] = nz, -nz, math.Float64frombits(1<<63-1), 1
	}
	var rows [4]*float64
	var out [10][4]float64
	for i0 := 0; i0 < ns; i0 += 4 {
		for l := range 4 {
			rows[l] = &mt[min(i0+l, ns-1)*nu]
		}
		signSumsAVX(&rows, &n[0], &v[0], nu, &c, &out)
		for l := range min(4, ns-i0) {
			sg[i0+l] = stationSigns{
				pos:   [3]float64{out[0][l], out[1][l], out[2][l]},
				zero:  [3]float64{out[3][l], out[4][l], out[5][l]},
				big:   [2]float64{out[6][l], out[7][l]},
				count: [2]int{int(out[8][l]), int(out[9][l])},
			}
		}
	}
}

// firstConsts is what firstSignsAVX reads: the four lanes' stations, the
// round-off nz and −nz, and 1.
type firstConsts struct {
	x, nz, negNz, one [4]float64
}

// firstSigns sets mt[i*nu+u], nu = len(a), to unit u's M = a[u] + xs[i]·v[u]
// at station i of a first-order member (a, v and n the units' M₀, V and
// N), tot[i] to the sum of row i over the units, in their order from +0,
// and sg[i] to station i's stationSigns with round-off nz, four stations
// at once with AVX (firstSignsAVX): the numbers scanFolded's loop forms
// station by station (a + x·v, then classify, sumsOver and largestOver),
// to the last bit. It reports whether it formed them: not without AVX,
// nor for no unit.
func firstSigns(mt, tot []float64, sg []stationSigns, xs, a, v, n []float64, nz float64) bool {
	nu, ns := len(a), len(xs)
	if !useAVX || nu == 0 || ns == 0 {
		return false
	}
	v, n, mt, tot, sg = v[:nu], n[:nu], mt[:ns*nu], tot[:ns], sg[:ns]
	c := firstConsts{}
	for l := range 4 {
		c.nz[l], c.negNz[l], c.one[l] = nz, -nz, 1
	}
	var rows [4]*float64
	var out [11][4]float64
	for i0 := 0; i0 < ns; i0 += 4 {
		// A last group of fewer than four repeats its last station: the
		// same numbers, written twice to the same row.
		for l := range 4 {
			i := min(i0+l, ns-1)
			c.x[l] = xs[i]
			rows[l] = &mt[i*nu]
		}
		firstSignsAVX(&rows, &a[0], &v[0], &n[0], nu, &c, &out)
		for l := range min(4, ns-i0) {
			tot[i0+l] = out[10][l]
			sg[i0+l] = stationSigns{
				pos:   [3]float64{out[0][l], out[1][l], out[2][l]},
				zero:  [3]float64{out[3][l], out[4][l], out[5][l]},
				big:   [2]float64{out[6][l], out[7][l]},
				count: [2]int{int(out[8][l]), int(out[9][l])},
			}
		}
	}
	return true
}

// foldConsts is what foldSignsAVX reads: the round-off nz and −nz of N and
// of V, the mask that clears a number's sign and 1, a lane for each.
type foldConsts struct {
	nz, negNz, mask, one [2]float64
}

// foldSigns is, for N (j = 0, the units classified by xn) and V (j = 1,
// by xv), what classify, sumsOver and largestOver form over the units of
// a first-order member for its fold (foldCase.fold), both at once with
// AVX (foldSignsAVX): in sg[j] the sums of n, v and a of the positive and
// of the round-off units (past nz[j]), in their order from +0, the
// largest size of each sign and the counts, and in tot[j] the sum of the
// values, as classify forms it; to the last bit. len(xn) = len(xv) =
// len(n) = len(v) = len(a) > 0; AVX only.
func foldSigns(xn, xv, n, v, a []float64, nz [2]float64) (sg [2]stationSigns, tot [2]float64) {
	nu := len(n)
	xn, xv, v, a = xn[:nu], xv[:nu], v[:nu], a[:nu]
	c := foldConsts{nz: nz, negNz: [2]float64{-nz[0], -nz[1]}}
	for l := range 2 {
		c.mask[l], c.one[l] = math.Float64frombits(1<<63-1), 1
	}
	x := [2]*float64{&xn[0], &xv[0]}
	var out [11][2]float64
	foldSignsAVX(&x, &n[0], &v[0], &a[0], nu, &c, &out)
	for l := range 2 {
		sg[l] = stationSigns{
			pos:   [3]float64{out[0][l], out[1][l], out[2][l]},
			zero:  [3]float64{out[3][l], out[4][l], out[5][l]},
			big:   [2]float64{out[6][l], out[7][l]},
			count: [2]int{int(out[8][l]), int(out[9][l])},
		}
		tot[l] = out[10][l]
	}
	return sg, tot
}

// laneTable gives, for each mask of four lanes (bit l for lane l), the
// lanes set in order (the rest 0) and how many are set: what
// listReachingAVX lists a group of four units by.
type laneTable struct {
	idx [16][4]int32
	cnt [16]uint8
}

// lanes is the laneTable.
var lanes = func() *laneTable {
	var lt laneTable
	for m := range 16 {
		for l := range 4 {
			if m&(1<<l) != 0 {
				lt.idx[m][lt.cnt[m]] = int32(l)
				lt.cnt[m]++
			}
		}
	}
	return &lt
}()
