package envelope

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// Values envelopes n quantities that are not member stations, such as
// the displacements of nodes or the drift of a storey, over the
// combinations cs at the indices idx, by the rules of the reactions: get
// returns quantity i's three components in column c of the solution (a
// load case or a pattern piece of lay.Model when lay is not nil); each
// component's largest and smallest value is formed as a station's are,
// with the combination (an index into cs) and the pieces loaded. what(i,
// q) names component q of quantity i in an error.
//
// get may be called from several goroutines at once.
func Values(sol *frame.Solution, cs []combos.Combination, idx []int, set Settings, lay *patterns.Layout, n int,
	get func(c, i int) [3]float64, what func(i, q int) string) ([][3]Extreme, error) {
	return ValuesRows(sol, cs, idx, set, lay, n, 3, func(i int, row, _ [][3]float64) {
		for c := range row {
			row[c] = get(c, i)
		}
	}, what)
}

// ValuesBlock is how many quantities ValuesRows hands a worker at a time:
// quantities k·ValuesBlock to (k+1)·ValuesBlock − 1, filled in their
// order by one worker.
const ValuesBlock = valuesBlock

const valuesBlock = 64

// ValuesRows is [Values] with each quantity's values given in one call:
// fill(i, row, tmp) sets row[c] to quantity i's three components in every
// column c; tmp, of the same length, is scratch of its own, the worker's:
// the quantities of one block of ValuesBlock are filled one after the
// other, in their order, with the same tmp, which keeps what fill left in
// it for the next (a quantity's values that the next one shares). Only
// the first effects components (1 to 3) are enveloped, the others'
// Extremes left none (zero, MaxBy and MinBy −1), and taken as zero in
// the values acting with the extremes (MaxWith, MinWith), whatever fill
// sets them to: a quantity of one number (a drift) is not placed three
// times. The quantities are enveloped on every processor, each alone, so
// the result does not depend on how many there are; fill is called from
// several goroutines at once. The error is that of the first quantity,
// in their order, that has one.
func ValuesRows(sol *frame.Solution, cs []combos.Combination, idx []int, set Settings, lay *patterns.Layout, n, effects int,
	fill func(i int, row, tmp [][3]float64), what func(i, q int) string) ([][3]Extreme, error) {
	if len(idx) == 0 {
		return nil, ErrNoCombinations
	}
	if effects < 1 || effects > 3 {
		panic("envelope: ValuesRows: effects must be 1, 2 or 3")
	}
	mo := sol.Model()
	if lay != nil && lay.Model != mo {
		panic("envelope: solution is not of the layout's model")
	}
	e := newEvaluator(mo, cs, idx, effects, set, lay)
	out := make([][3]Extreme, n)
	blocks := (n + valuesBlock - 1) / valuesBlock
	workers := max(min(runtime.GOMAXPROCS(0), blocks), 1)
	firstErr := make([]int, workers) // per worker, the first quantity in error, n for none
	errs := make([]error, workers)
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := range workers {
		firstErr[k] = n
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := e.scratch()
			rs := newRowScan(e, w)
			tmp := make([][3]float64, len(w.ev))
			for {
				b := int(next.Add(1) - 1)
				if b >= blocks {
					return
				}
				for i := b * valuesBlock; i < min((b+1)*valuesBlock, n); i++ {
					fill(i, w.ev, tmp)
					if effects < 3 {
						zeroPast(w.ev, effects)
					}
					x, ok := valueOfRow(e, w, rs)
					if !ok {
						if i < firstErr[k] {
							firstErr[k] = i
							errs[k] = e.nonFinite(w, func(q int) string { return what(i, q) })
						}
						continue
					}
					out[i] = x
				}
			}
		}()
	}
	wg.Wait()
	best := -1
	for k := range workers {
		if firstErr[k] < n && (best < 0 || firstErr[k] < firstErr[best]) {
			best = k
		}
	}
	if best >= 0 {
		return nil, errs[best]
	}
	return out, nil
}

// zeroPast sets the components from q on of every row to zero.
func zeroPast(rows [][3]float64, q int) {
	for c := range rows {
		for k := q; k < 3; k++ {
			rows[c][k] = 0
		}
	}
}

// valueOf envelopes the values in w.ev as a station's; ok is false when
// the envelope is not finite.
func valueOf(e *evaluator, w *work) (x [3]Extreme, ok bool) {
	// The largest sizes, compared as their bits (which order as the
	// sizes do, a NaN above all), in registers.
	var b0, b1, b2 uint64
	for c := range w.ev {
		v := &w.ev[c]
		b0 = max(b0, math.Float64bits(v[0])&^(1<<63))
		b1 = max(b1, math.Float64bits(v[1])&^(1<<63))
		b2 = max(b2, math.Float64bits(v[2])&^(1<<63))
	}
	w.noise = [3]float64{math.Float64frombits(b0) * roundOff, math.Float64frombits(b1) * roundOff, math.Float64frombits(b2) * roundOff}
	x = e.station(w)
	for j := e.nEff; j < 3; j++ {
		x[j] = Extreme{MaxBy: -1, MinBy: -1}
	}
	return x, allFinite(&x, e.nEff)
}

// rowScan is one worker's scratch for scanRow: the units listed as
// candidates for the spans lists, effect by effect, and, per patterned
// case, effect and sign, the smallest size kept in the list of the
// quantity before (0 when that list was not full), which seeds the
// ranking of the next.
type rowScan struct {
	list  [3][]int32 // per effect, the units listed for ranking (classify)
	every []int32    // every unit, in order
	seed  [][3][2]float64
}

// newRowScan returns the scratch for scanRow, or nil when the quantities
// are not placed piece by piece (exact placement over a layout whose
// every column past the load cases is a pattern piece): valueOf's general
// path then envelopes them.
func newRowScan(e *evaluator, w *work) *rowScan {
	if !rowScans {
		return nil
	}
	if _, ok := w.place.(*exactPlacement); !ok || e.lay == nil || e.unitCase == nil || e.first == nil {
		return nil
	}
	n := 0
	for _, pc := range e.lay.Patterned {
		n = max(n, len(pc.Units))
	}
	rs := &rowScan{every: make([]int32, n), seed: make([][3][2]float64, len(e.lay.Patterned))}
	for j := range e.nEff {
		rs.list[j] = make([]int32, n)
	}
	for i := range rs.every {
		rs.every[i] = int32(i)
	}
	return rs
}

// rowScans is whether ValuesRows scans the rows of a layout placed piece
// by piece with scanRow; the benchmarks turn it off to compare.
var rowScans = true

// valueOfRow is valueOf, the same values to the last bit, with the
// patterned cases' units scanned by scanRow; rs nil, or a value that is
// not finite, takes valueOf's path.
func valueOfRow(e *evaluator, w *work, rs *rowScan) (x [3]Extreme, ok bool) {
	if rs == nil {
		return valueOf(e, w)
	}
	pl := w.place.(*exactPlacement)
	// The largest sizes (valueOf), and per patterned case the largest
	// positive and the largest negative value of each component, as
	// bits: a positive number's order as the numbers', a negative one's
	// size with its sign cleared.
	var b0, b1, b2 uint64
	if e.nEff == 1 {
		// One component enveloped, the others zero (ValuesRows): its
		// sizes alone; the others' are zero.
		b0 = largestSizes1(e, w, pl)
	} else {
		b0, b1, b2 = largestSizes(e, w, pl)
	}
	if max(b0, b1, b2) >= 0x7ff0000000000000 { // an infinity or a NaN
		return valueOf(e, w)
	}
	w.noise = [3]float64{math.Float64frombits(b0) * roundOff, math.Float64frombits(b1) * roundOff, math.Float64frombits(b2) * roundOff}
	clear(pl.nvID)
	for p := range e.lay.Patterned {
		if e.uses(p) {
			pl.scanRow(e, w, rs, p)
		}
	}
	x = e.scanned(w)
	for j := e.nEff; j < 3; j++ {
		x[j] = Extreme{MaxBy: -1, MinBy: -1}
	}
	return x, allFinite(&x, e.nEff)
}

// largestSizes returns the largest size of each component over every
// column, as bits, and sets pl.big (valueOfRow).
func largestSizes(e *evaluator, w *work, pl *exactPlacement) (b0, b1, b2 uint64) {
	for c := range e.nOrig {
		v := &w.ev[c]
		b0 = max(b0, math.Float64bits(v[0])&^(1<<63))
		b1 = max(b1, math.Float64bits(v[1])&^(1<<63))
		b2 = max(b2, math.Float64bits(v[2])&^(1<<63))
	}
	for p, pc := range e.lay.Patterned {
		var p0, p1, p2, n0, n1, n2 uint64
		if units := w.ev[e.first[p] : e.first[p]+len(pc.Units)]; useAVX && len(units) > 0 {
			p0, p1, p2, n0, n1, n2 = largestSigns(units)
			b0, b1, b2 = max(b0, p0, n0), max(b1, p1, n1), max(b2, p2, n2)
			pl.big[p] = [3][2]float64{{math.Float64frombits(p0), math.Float64frombits(n0)},
				{math.Float64frombits(p1), math.Float64frombits(n1)}, {math.Float64frombits(p2), math.Float64frombits(n2)}}
			continue
		}
		for _, v := range w.ev[e.first[p] : e.first[p]+len(pc.Units)] {
			x0, x1, x2 := math.Float64bits(v[0]), math.Float64bits(v[1]), math.Float64bits(v[2])
			// All ones for a negative number.
			m0, m1, m2 := uint64(int64(x0)>>63), uint64(int64(x1)>>63), uint64(int64(x2)>>63)
			p0, n0 = max(p0, x0&^m0), max(n0, x0&m0)
			p1, n1 = max(p1, x1&^m1), max(n1, x1&m1)
			p2, n2 = max(p2, x2&^m2), max(n2, x2&m2)
		}
		n0, n1, n2 = n0&^(1<<63), n1&^(1<<63), n2&^(1<<63)
		b0, b1, b2 = max(b0, p0, n0), max(b1, p1, n1), max(b2, p2, n2)
		pl.big[p] = [3][2]float64{{math.Float64frombits(p0), math.Float64frombits(n0)},
			{math.Float64frombits(p1), math.Float64frombits(n1)}, {math.Float64frombits(p2), math.Float64frombits(n2)}}
	}
	return b0, b1, b2
}

// largestSigns returns, as bits, the largest positive value of each
// component of units (+0 for none) and the largest size of a negative one
// (+0 for none), as largestSizes forms them with AVX (largestSignsAVX): a
// component with a NaN gives a NaN for both, as the bits of a NaN of
// either sign give one there (largestSizes then reports a size past
// every number, and valueOfRow takes valueOf's path). len(units) > 0.
func largestSigns(units [][3]float64) (p0, p1, p2, n0, n1, n2 uint64) {
	var out [3][4]float64
	largestSignsAVX(&units[0], len(units), &out)
	var pos, neg [3]uint64
	for q := range 3 {
		pos[q], neg[q] = math.Float64bits(out[0][q]), math.Float64bits(0-out[1][q])
		if math.Float64bits(out[2][q]) != 0 {
			pos[q], neg[q] = math.Float64bits(math.NaN()), math.Float64bits(math.NaN())
		}
	}
	return pos[0], pos[1], pos[2], neg[0], neg[1], neg[2]
}

// largestSizes1 is largestSizes for the first component alone, the others
// zero: their sizes in pl.big are zero.
func largestSizes1(e *evaluator, w *work, pl *exactPlacement) (b0 uint64) {
	for c := range e.nOrig {
		b0 = max(b0, math.Float64bits(w.ev[c][0])&^(1<<63))
	}
	for p, pc := range e.lay.Patterned {
		var p0, n0 uint64
		if units := w.ev[e.first[p] : e.first[p]+len(pc.Units)]; useAVX && len(units) > 0 {
			// The other components are zero: their sizes too.
			p0, _, _, n0, _, _ = largestSigns(units)
			b0 = max(b0, p0, n0)
			pl.big[p] = [3][2]float64{{math.Float64frombits(p0), math.Float64frombits(n0)}}
			continue
		}
		for _, v := range w.ev[e.first[p] : e.first[p]+len(pc.Units)] {
			x0 := math.Float64bits(v[0])
			m0 := uint64(int64(x0) >> 63) // all ones for a negative number
			p0, n0 = max(p0, x0&^m0), max(n0, x0&m0)
		}
		n0 &^= 1 << 63
		b0 = max(b0, p0, n0)
		pl.big[p] = [3][2]float64{{math.Float64frombits(p0), math.Float64frombits(n0)}}
	}
	return b0
}

// scanRow is scan for patterned case p, its largest sizes of each sign
// already in pl.big[p] (whatever the round-off): the same sums, added in
// the same order, largest sizes, counts and most influential units. The
// units are classified effect by effect, in a pass without a branch on
// their signs: each positive sum adds every unit, the others as +0, which
// leaves a sum that is never −0 unchanged to the bit (the round-off units,
// rare, are added with a branch). The units that reach the ranking's
// threshold are listed in the same pass and ranked after it, the threshold seeded with half the
// smallest size kept for the quantity before (the neighbouring node, most
// often), and ranked again without that seed when fewer than a full list
// reach it.
func (pl *exactPlacement) scanRow(e *evaluator, w *work, rs *rowScan, p int) {
	units := w.ev[e.first[p] : e.first[p]+len(e.lay.Patterned[p].Units)]
	nu := len(units)
	big, top := &pl.big[p], &pl.top[p]
	var cut, thr [3][2]float64
	for j := range e.nEff {
		for s := range 2 {
			if !(big[j][s] > w.noise[j]) { // sizes past the round-off only
				big[j][s] = 0
			}
			cut[j][s] = w.share * big[j][s]
			thr[j][s] = cut[j][s]
			if w.limit != math.MaxInt {
				thr[j][s] = max(thr[j][s], rs.seed[p][j][s]/2)
			}
		}
	}
	var sum [3][2][3]float64
	var zero [3][3]float64
	var count [3][2]int
	var tot [3]float64
	var listed [3]int
	switch {
	case e.nEff == 1:
		// The other components are zero (ValuesRows): so are their sums.
		listed[0] = rs.classify1(units, w.noise[0], &thr[0], &sum[0][0], &zero[0], &tot, &count[0])
	case e.nEff == 3 && classify3s:
		listed = rs.classify3(units, &w.noise, &thr, &sum, &zero, &tot, &count)
	default:
		for j := range e.nEff {
			if j == 0 {
				listed[j] = rs.classify(units, j, w.noise[j], &thr[j], &sum[j][0], &zero[j], &tot, &count[j])
			} else { // the sums of all the units are the first pass's
				listed[j] = rs.classifyPart(units, j, w.noise[j], &thr[j], &sum[j][0], &zero[j], &count[j])
			}
		}
	}
	for j := range e.nEff {
		for s := range 2 {
			neg := s == 1
			h := rankRow(top[j][s][:0], units, j, neg, w.noise[j], rs.list[j][:listed[j]], thr[j][s], w.limit)
			if len(h) < w.limit && thr[j][s] > cut[j][s] {
				// Fewer than a full list reached the seed: every unit
				// past the round-off that reaches the cut, again.
				h = rankRow(h[:0], units, j, neg, w.noise[j], rs.every[:nu], cut[j][s], w.limit)
			}
			top[j][s] = h
			rs.seed[p][j][s] = 0
			if len(h) == w.limit {
				rs.seed[p][j][s] = h[0].a
			}
		}
	}
	for j := range 3 {
		for q := range 3 {
			sum[j][1][q] = tot[q] - sum[j][0][q] - zero[j][q]
		}
	}
	pl.sum[p], pl.count[p] = sum, count
}

// classify is scanRow's pass over the units for effect j: the sums of
// its positive units (pos), of its round-off ones and of all, in their
// order, the counts of each sign, and in rs.list[j] the units past the
// round-off that reach their sign's thr; it returns how many are listed.
// A pass per effect keeps its sums in registers.
func (rs *rowScan) classify(units [][3]float64, j int, nz float64, thr *[2]float64, pos, zero, tot *[3]float64, count *[2]int) int {
	list := rs.list[j][:len(units)]
	tp, tn := thr[0], thr[1]
	var s0, s1, s2, t0, t1, t2 float64
	var np, nn, k int
	for i := range units {
		v := &units[i]
		x := v[j]
		t0 += v[0]
		t1 += v[1]
		t2 += v[2]
		p, n := b2i(x > nz), b2i(x < -nz)
		if p|n == 0 {
			zero[0] += v[0]
			zero[1] += v[1]
			zero[2] += v[2]
		}
		m := -uint64(p)
		s0 += math.Float64frombits(math.Float64bits(v[0]) & m)
		s1 += math.Float64frombits(math.Float64bits(v[1]) & m)
		s2 += math.Float64frombits(math.Float64bits(v[2]) & m)
		np += p
		nn += n
		list[k] = int32(i)
		k += p&b2i(x >= tp) | n&b2i(-x >= tn)
	}
	*pos, *tot = [3]float64{s0, s1, s2}, [3]float64{t0, t1, t2}
	*count = [2]int{np, nn}
	return k
}

// classify3s is whether scanRow classifies the units for the three
// effects in one pass with AVX (classify3); the tests turn it off to
// compare.
var classify3s = true

// class3Consts is what classify3AVX reads, a lane per effect: the
// round-off nz and −nz, the thresholds of the positive units and the
// negated ones of the negative units, and 1.
type class3Consts struct {
	nz, negNz, tp, negTn, one [4]float64
}

// class3Out is what classify3AVX forms, a lane per component: per effect
// the sums of the positive units; the sums of all; per effect (lane) the
// counts of each sign; per effect the sums of the round-off units.
type class3Out struct {
	pos         [3][4]float64
	tot, cp, cn [4]float64
	zero        [3][4]float64
}

// classify3 is classify for the three effects at once, with AVX, in one
// pass over the units (classify3AVX): for each effect j the same sums,
// in the same order, counts and list rs.list[j] as classify's pass for
// j, and the sums of all the units; it returns how many units are listed
// for each effect. zero must hold zeros. Without AVX, or for no unit, it
// is classify and classifyPart, effect by effect.
func (rs *rowScan) classify3(units [][3]float64, nz *[3]float64, thr *[3][2]float64, pos *[3][2][3]float64, zero *[3][3]float64, tot *[3]float64, count *[3][2]int) (listed [3]int) {
	if !useAVX || len(units) == 0 {
		listed[0] = rs.classify(units, 0, nz[0], &thr[0], &pos[0][0], &zero[0], tot, &count[0])
		for j := 1; j < 3; j++ {
			listed[j] = rs.classifyPart(units, j, nz[j], &thr[j], &pos[j][0], &zero[j], &count[j])
		}
		return listed
	}
	var c class3Consts
	for j := range 3 {
		c.nz[j], c.negNz[j], c.tp[j], c.negTn[j], c.one[j] = nz[j], -nz[j], thr[j][0], -thr[j][1], 1
	}
	var out class3Out
	l0, l1, l2 := rs.list[0][:len(units)], rs.list[1][:len(units)], rs.list[2][:len(units)]
	listed[0], listed[1], listed[2] = classify3AVX(&units[0], len(units), &c, &l0[0], &l1[0], &l2[0], &out)
	for j := range 3 {
		pos[j][0] = [3]float64{out.pos[j][0], out.pos[j][1], out.pos[j][2]}
		zero[j] = [3]float64{out.zero[j][0], out.zero[j][1], out.zero[j][2]}
		count[j] = [2]int{int(out.cp[j]), int(out.cn[j])}
	}
	*tot = [3]float64{out.tot[0], out.tot[1], out.tot[2]}
	return listed
}

// classifyPart is classify without the sums of all the units, which the
// pass for the first effect forms.
func (rs *rowScan) classifyPart(units [][3]float64, j int, nz float64, thr *[2]float64, pos, zero *[3]float64, count *[2]int) int {
	list := rs.list[j][:len(units)]
	tp, tn := thr[0], thr[1]
	var s0, s1, s2 float64
	var np, nn, k int
	for i := range units {
		v := &units[i]
		x := v[j]
		p, n := b2i(x > nz), b2i(x < -nz)
		if p|n == 0 {
			zero[0] += v[0]
			zero[1] += v[1]
			zero[2] += v[2]
		}
		m := -uint64(p)
		s0 += math.Float64frombits(math.Float64bits(v[0]) & m)
		s1 += math.Float64frombits(math.Float64bits(v[1]) & m)
		s2 += math.Float64frombits(math.Float64bits(v[2]) & m)
		np += p
		nn += n
		list[k] = int32(i)
		k += p&b2i(x >= tp) | n&b2i(-x >= tn)
	}
	*pos = [3]float64{s0, s1, s2}
	*count = [2]int{np, nn}
	return k
}

// classify1 is classify for effect 0 of units whose other components are
// zero: their sums are +0, as classify forms them.
func (rs *rowScan) classify1(units [][3]float64, nz float64, thr *[2]float64, pos, zero, tot *[3]float64, count *[2]int) int {
	list := rs.list[0][:len(units)]
	tp, tn := thr[0], thr[1]
	var s0, t0 float64
	var np, nn, k int
	for i := range units {
		x := units[i][0]
		t0 += x
		p, n := b2i(x > nz), b2i(x < -nz)
		if p|n == 0 {
			zero[0] += x
		}
		s0 += math.Float64frombits(math.Float64bits(x) & -uint64(p))
		np += p
		nn += n
		list[k] = int32(i)
		k += p&b2i(x >= tp) | n&b2i(-x >= tn)
	}
	*pos, *tot = [3]float64{s0}, [3]float64{t0}
	*count = [2]int{np, nn}
	return k
}

// rankRow adds to h, a heap of keepLargest, the units listed by the size
// of their component j (negated for the negative ones), in their order,
// that are past the round-off nz and reach thr: as exactPlacement.scan
// ranks them.
func rankRow(h []candidate, units [][3]float64, j int, negative bool, nz float64, list []int32, thr float64, limit int) []candidate {
	for _, i := range list {
		a := units[i][j]
		if negative {
			a = -a
		}
		if a > nz && a >= thr {
			h = keepLargest(h, candidate{piece: int(i), a: a}, limit)
			if len(h) == limit && h[0].a >= thr {
				thr = math.Nextafter(h[0].a, math.Inf(1))
			}
		}
	}
	return h
}
