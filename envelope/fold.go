package envelope

import (
	"math"
	"slices"

	"govern/frame"
)

// Folding, for exact placement (the envelope's hot path). A pattern piece
// that does not load a member leaves it unloaded between its ends: along
// it N and V are constant and, in first order, M = M₀ + x·V is linear. So,
// per member,
//
//   - each column's end forces are computed once, from the contiguous
//     displacement rows of the member's ends (frame.Solution.EndForcesEach);
//   - for N and V the pieces that do not load the member are classified
//     (adverse either way, or round-off), counted, summed and ranked once
//     for all the stations: the fold (foldCase);
//   - for M each such piece is classified at each station from its M₀ and
//     V: with AVX from a table of every piece's M at every station, formed
//     and classified four stations at once (table.go, firstSigns), so
//     that at each station only the pieces the ranking may keep are
//     listed; else station by station, with no table;
//   - the pieces that load the member (usually one: the span itself), the
//     original cases and the member's own loads are evaluated exactly at
//     every station, as before.
//
// Second order. In a second-order solution (frame.Options.Axial) M also
// carries N·(v(x) − v(0)), v the member's displacement across its axis;
// for a piece that does not load the member v(x) − v(0) is linear in the
// local displacements u of the member's nodes, Σₖ Hᵢₖ·uₖ at station i,
// with weights H of the member's condensed sub-element shape
// (frame.Solution.SecondOrderWeightsTo, frame.Sway). So each column's u is
// read once from the same rows, in the same pass as its end forces
// (frame.Solution.StartForcesAndDisplacementsEach), each piece's M at
// each station is M₀ + x·V + N·Σₖ Hᵢₖ·uₖ, formed once per member into a
// table (foldCase.mt) and classified from it station by station (with
// AVX, table.go: the table four stations at once, one to a lane, with
// each station's sum of the pieces' M; then the sums, largest sizes and
// counts by sign, four stations at once, so that at each station only
// the pieces the ranking may keep are listed); N and V
// fold as in first order, the concurrent M of the pieces folded for them
// being ΣM₀ + x·ΣV + N·Σₖ Hᵢₖ·Σuₖ; the pieces that load the member and
// the original cases add their second-order moment from their own shape
// (frame.Solution.SecondFrom), and so do the deflections.
//
// In first order with AVX, the fold of N and V classifies the units for
// both effects at once (foldSigns) and lists only those the ranking may
// keep (listReaching), as for M. The table's numbers are those of the
// loop station by station to the last bit (each product rounded, then
// added: no fused multiply-add; not where the compiler would fuse the
// pure-Go loop's, goFuses), and so are the sums, largest sizes and counts
// formed from it: members in first order are folded as before, to the
// last bit, with AVX and without.
//
// Ranking. Of the units of each sign only the most influential are
// listed; the ranking at a station (and the fold's of N and V) is seeded
// from the units the list kept at the station before, or at the last
// station of the member before (seed.go), and ranks only the units that
// reach the seed, found in the pass that sums that sign's units (in
// second order with AVX, in a pass of their own, listReaching, which
// also leaves out those below the share of the largest): the lists are
// the same as without the seed.
//
// Member factors (live load reduction, factors.go) scale every column of
// a case in the member by one factor per effect. Each piece is then
// classified and ranked by its scaled effect, as the unfolded path scales
// it, and the fold's sums are kept unscaled and scaled at each station;
// where the factors depend on the combination (evaluator.parts) the N and
// V fold is formed once per set of factors, and each set's extremes are
// merged as unfolded.
//
// Each piece is classified from the very numbers the unfolded path
// computes (frame.Solution.StationsTo, times the member's factors), so
// the same pieces are loaded, counted and listed; only the order of the
// sums changes (the fold's sums first, then the pieces that load the
// member; the concurrent M of the pieces folded for N or V is formed from
// their sums; the factors applied to sums rather than to each piece),
// which changes results by round-off (a few units in the 16th digit). The
// spans lists do not depend on the order pieces are met (the heap keeps
// the largest by size, ties to the earlier piece). Members in first order
// without factors are folded as before, to the last bit. On the 30 × 60
// frame in second order 24 of the 1 385 845 numbers of the JSON output
// changed in their printed digits (ten significant), by at most 1e-10 of
// their size (2e-13 of the member's moments for a moment acting with an
// extreme that is itself almost zero); with live load reduction 13 to 14
// of 1.4 million, by at most 1e-9 of their size (docs/performance.md).
//
// What counts as round-off in the member (noiseAt) is, as before, 1e-9 of
// the largest size of each effect over every column and station,
// unscaled; for a linear M the largest size is at the member's ends,
// which are stations; in second order every station's M is seen. It is
// over every column, the units of patterned cases no combination uses
// included: those are neither folded nor scanned (evaluator.used), but
// their largest M is still found, for the round-off of the others (in
// second order from a bound of each unit's M over the member, evaluated
// at the stations only where the bound passes the largest so far).
//
// A member is folded only with exact placement of the force envelope, and
// when no concentrated moment acts exactly at one of its stations (the
// stations' values past them are then formed from the whole table, the
// unfolded path); a station whose extremes are not finite is formed again
// on the unfolded path, which names the case at fault.

// fold is one goroutine's folded member.
type fold struct {
	ends [][6]float64   // every column's local forces at the member's start (StartForcesEach)
	orig []frame.Forces // the original cases' stations: c*ns+i
	// In second order (second): every column's local displacements of
	// the member's nodes (DisplacementsEach), the member's weights at the
	// stations and its axial force, which give N·(v(x) − v(0)) (frame.Sway).
	second bool
	disp   [][6]float64
	wts    [][6]float64
	n      float64
	wmax   [6]float64     // the largest size of each weight over the stations
	held   [][6]float64   // scratch: the displacements of the units that load the member
	cases  []foldCase     // per patterned case
	mv     []float64      // scratch: the M of each unit at the station
	mv2    []float64      // scratch: the scaled V of each unit (foldSigned)
	own    []frame.Forces // scratch: the units that load the member at the station
	// scratch: the units at the station whose M is positive, negative and
	// round-off (classify)
	pos, neg, zer []int32
	ranked        [2][]int32 // scratch: the units of each sign that reach the seed
	// seed holds, per set of member factors, patterned case and sign
	// (k*len(cases)+p), the smallest size of M the list kept at the
	// previous station of the member (0 if not full), and kept the units
	// of that list.
	seed [][2]float64
	kept [][2][]int32
	// keptNV holds, likewise, the units of the lists of N and V
	// ([j][s]) of the member folded before (foldCase.fold).
	keptNV [][2][2][]int32
	// seq is the last foldNV.id given.
	seq uint64
}

// foldCase is one patterned case folded over the current member.
type foldCase struct {
	// The units that load the member (indices into the case's units,
	// ascending) and their values at the stations (k*ns+i for own[k]).
	own   []int
	ownAt []frame.Forces
	// Every unit's N, and V and M₀ (M = M₀ + x·V), zero for the units
	// that load the member, which are taken from ownAt instead.
	n, v, a []float64
	// In second order: every unit's local displacements of the member's
	// nodes (a view of fold.disp), and its M at every station, station by
	// station (mt[i*len(n)+u]; zero for the units that load the member).
	u  [][6]float64
	mt []float64
	// In first order, with AVX, mt holds every unit's M = M₀ + x·V at
	// every station too (firstSigns). tabled is whether mt holds the
	// table.
	tabled bool
	// When summed, tot[i] is the sum of row i of mt over the units, in
	// their order from +0, as classify forms it (table.go).
	tot    []float64
	summed bool
	// When signed, sg[i] is what the classification of station i by the
	// sign of M gives (table.go), with the member's round-off.
	sg     []stationSigns
	signed bool
	// The fold over the units that do not load the member, for N and V,
	// one per set of member factors (evaluator.parts, or one).
	nv []foldNV
}

// foldNV is the fold of a patterned case's units that do not load the
// member, for N (j = 0) and V (j = 1), each unit classified by its effect
// scaled by the member's factors for the case: per class (0 positive, 1
// round-off) the sums of N, V and M₀ (unscaled); per sign (0 positive, 1
// negative) the count, the largest size and the most influential units
// (see exactPlacement), scaled.
type foldNV struct {
	sum   [2][2][3]float64
	sumU  [2][2][6]float64 // in second order, the sums of their displacements
	count [2][2]int
	big   [2][2]float64
	top   [2][2][]candidate
	totN  float64 // their sums of N and V, unscaled
	totV  float64
	// id tells this fold from every other of the scratch (fold.seq).
	id uint64
}

// folding is whether members are folded at all; the tests turn it off to
// compare the two paths.
var folding = true

// foldable reports whether member m's forces can be folded (see above).
func (e *evaluator) foldable(w *work, sol *frame.Solution, m int) (*exactPlacement, bool) {
	pl, ok := w.place.(*exactPlacement)
	if !folding || !ok || e.nEff != 3 || e.unitCase == nil {
		return nil, false
	}
	if sol.HasMomentLoads() {
		ns, nc := len(w.xs), len(e.mo.Cases)
		w.jump = grow(w.jump, ns*nc)
		if sol.MomentJumpsTo(w.jump, m, w.xs) {
			return nil, false
		}
	}
	return pl, true
}

// load folds member m (stations w.xs) into f and sets w.noiseAt.
func (f *fold) load(e *evaluator, w *work, sol *frame.Solution, m int) {
	ns, nc := len(w.xs), len(e.mo.Cases)
	f.ends = grow(f.ends, nc)
	// The start gives N, V, M and the deflections anywhere; in second
	// order with the nodes' displacements, read from the same rows.
	f.second = !sol.Unloaded(m)
	if !f.second {
		sol.StartForcesEach(f.ends, m)
	} else {
		f.disp = grow(f.disp, nc)
		sol.StartForcesAndDisplacementsEach(f.ends, f.disp, m)
		f.wts = grow(f.wts, ns)
		f.n = sol.SecondOrderWeightsTo(f.wts, m, w.xs)
	}
	var big [3]float64 // largest sizes, for the round-off
	see := func(v frame.Forces) {
		if a := math.Abs(v.N); a > big[0] {
			big[0] = a
		}
		if a := math.Abs(v.V); a > big[1] {
			big[1] = a
		}
		if a := math.Abs(v.M); a > big[2] {
			big[2] = a
		}
	}
	// The original cases, and the units that load the member, exactly at
	// every station, taken inside the member at its start.
	exact := func(dst []frame.Forces, c int) {
		sol.StationsFrom(dst, c, m, &f.ends[c], w.xs)
		if f.second {
			sol.SecondFrom(dst, nil, c, m, &f.disp[c], f.wts, w.xs)
		}
		s := sol.StartLoad(c, m)
		dst[0].N += s.N
		dst[0].V += s.V
		for _, v := range dst {
			see(v)
		}
	}
	f.orig = grow(f.orig, e.nOrig*ns)
	for c := range e.nOrig {
		exact(f.orig[c*ns:(c+1)*ns], c)
	}
	if cap(f.cases) < len(e.lay.Patterned) {
		f.cases = make([]foldCase, len(e.lay.Patterned))
	}
	f.cases = f.cases[:len(e.lay.Patterned)]
	parts := e.parts
	if parts == nil {
		parts = []*evaluator{e}
	}
	f.seed = grow(f.seed, len(parts)*len(e.lay.Patterned))
	if n := len(parts) * len(e.lay.Patterned); cap(f.kept) < n {
		f.kept = make([][2][]int32, n)
		f.keptNV = make([][2][2][]int32, n)
	} else {
		f.kept, f.keptNV = f.kept[:n], f.keptNV[:n]
	}
	for p := range f.cases {
		fc := &f.cases[p]
		fc.own, fc.ownAt = fc.own[:0], fc.ownAt[:0]
	}
	for _, c32 := range sol.CasesOn(m) {
		c := int(c32)
		if c < e.nOrig {
			continue
		}
		p := e.unitCase[c-e.nOrig]
		fc := &f.cases[p]
		fc.own = append(fc.own, c-e.first[p])
		at := len(fc.ownAt)
		fc.ownAt = slices.Grow(fc.ownAt, ns)[:at+ns]
		exact(fc.ownAt[at:at+ns], c)
	}
	l := w.xs[ns-1]
	xmax := 0.0 // the farthest station, for the bounds of M
	for _, x := range w.xs {
		xmax = max(xmax, math.Abs(x))
	}
	if f.second {
		f.wmax = [6]float64{}
		for i := range f.wts {
			for k, h := range f.wts[i] {
				f.wmax[k] = max(f.wmax[k], math.Abs(h))
			}
		}
	}
	for p, pc := range e.lay.Patterned {
		fc := &f.cases[p]
		nu := len(pc.Units)
		fc.n, fc.v, fc.a = grow(fc.n, nu), grow(fc.v, nu), grow(fc.a, nu)
		ends := f.ends[e.first[p] : e.first[p]+nu]
		if !f.second {
			largestFirst(&big, fc.n[:nu], fc.v[:nu], fc.a[:nu], ends, fc.own, l)
			fc.tabled, fc.summed = false, false // below, with AVX
			continue
		}
		for u := range ends {
			g := &ends[u]
			fc.n[u], fc.v[u], fc.a[u] = -g[0], g[1], -g[2]
		}
		for _, u := range fc.own { // seen above, exactly
			fc.n[u], fc.v[u], fc.a[u] = 0, 0, 0
		}
		// Second order: M at every station, as StationsTo forms it. The
		// units that load the member were seen above, exactly: their
		// displacements are held at zero meanwhile, so that their M here
		// is 0.
		fc.u = f.disp[e.first[p] : e.first[p]+nu]
		bm := big[2]
		an, av, au := fc.a[:nu], fc.v[:nu], fc.u[:nu]
		f.held = f.held[:0]
		for _, u := range fc.own {
			f.held = append(f.held, au[u])
			au[u] = [6]float64{}
		}
		for u, n := range fc.n[:nu] {
			if b := math.Abs(n); b > big[0] {
				big[0] = b
			}
			if b := math.Abs(av[u]); b > big[1] {
				big[1] = b
			}
		}
		if !anyUses(parts, p) {
			// Read by no combination: only its largest size of M counts,
			// for what is round-off in the others. A unit whose bound
			// (|M₀| + l·|V| + |N|·Σₖ maxᵢ|Hᵢₖ|·|uₖ|, with room for the
			// rounding) does not pass the largest so far cannot raise it.
			absN := math.Abs(f.n)
			for u := range au {
				d := &au[u]
				sw := f.wmax[0]*math.Abs(d[0]) + f.wmax[1]*math.Abs(d[1]) + f.wmax[2]*math.Abs(d[2]) +
					f.wmax[3]*math.Abs(d[3]) + f.wmax[4]*math.Abs(d[4]) + f.wmax[5]*math.Abs(d[5])
				if b := (math.Abs(fc.a[u]) + xmax*math.Abs(av[u]) + absN*sw) * (1 + boundRoom); b <= bm {
					continue
				}
				for i, x := range w.xs {
					if mm := (fc.a[u] + x*av[u]) + f.n*frame.Sway(&f.wts[i], d); mm > bm {
						bm = mm
					} else if -mm > bm {
						bm = -mm
					}
				}
			}
			big[2] = bm
			for k, u := range fc.own {
				au[u] = f.held[k]
			}
			continue
		}
		fc.mt, fc.tabled = grow(fc.mt, ns*nu), true
		// Station by station (momentTable, table.go), the weights held:
		// the same sums, in the same order, as frame.Sway. The weights of
		// the nodes' axial
		// displacements (0 and 3) are zero at every station of a member
		// whose displacement across it does not depend on them (every
		// one, as frame forms them): their terms, ±0 for a finite
		// displacement, leave the sum as it is (a sum begun at +0 is
		// never −0), and are left out. (A displacement that is not
		// finite makes the column's end forces not finite too, and the
		// station is formed again on the unfolded path.)
		axialFree := f.wmax[0] == 0 && f.wmax[3] == 0
		fc.summed = false
		if axialFree {
			fc.tot = grow(fc.tot, ns)
			bm, fc.summed = momentTable(fc.mt, fc.tot, w.xs, f.wts, f.n, an, av, au, bm)
		} else {
			bm = momentTableGo(fc.mt, w.xs, f.wts, f.n, an, av, au, bm)
		}
		big[2] = bm
		for k, u := range fc.own {
			au[u] = f.held[k]
			for i := range ns {
				// Held at zero, a unit that loads the member added +0 to
				// the sums of the rows (which then leave them as they
				// are, a sum begun at +0 being never −0), unless the
				// weights or the axial force are not finite.
				if math.Float64bits(fc.mt[i*nu+u]) != 0 {
					fc.summed = false
				}
				fc.mt[i*nu+u] = 0
			}
		}
	}
	for j := range big {
		w.noiseAt[j] = big[j] * roundOff
	}
	for p := range f.cases {
		fc := &f.cases[p]
		if !f.second {
			// With AVX, M at every station into the table, each
			// station's sum and its sums, largest sizes and counts by
			// sign (firstSigns): the numbers scanFolded forms otherwise,
			// to the last bit. The units that load the member have M₀ =
			// V = N = 0: +0 at every station (x ≥ 0), round-off, which
			// leaves the sums as they are.
			fc.signed = false
			if nu := len(fc.n); useAVX && nu > 0 && anyUses(parts, p) {
				fc.mt, fc.tot, fc.sg = grow(fc.mt, ns*nu), grow(fc.tot, ns), grow(fc.sg, ns)
				fc.signed = firstSigns(fc.mt, fc.tot, fc.sg, w.xs, fc.a[:nu], fc.v[:nu], fc.n[:nu], w.noiseAt[2])
				fc.tabled, fc.summed = fc.signed, fc.signed
			}
			continue
		}
		if fc.signed = fc.summed && anyUses(parts, p); fc.signed {
			fc.sg = grow(fc.sg, ns)
			signsOf(fc.sg, fc.mt, fc.n, fc.v, w.noiseAt[2])
		}
	}
	for p, pc := range e.lay.Patterned {
		fc := &f.cases[p]
		if cap(fc.nv) < len(parts) {
			fc.nv = make([]foldNV, len(parts))
		}
		fc.nv = fc.nv[:len(parts)]
		for k, q := range parts {
			if q.uses(p) {
				fc.fold(f, w, &fc.nv[k], &f.keptNV[k*len(f.cases)+p], f.second, scaleOf(q, m, pc.Case))
				f.seq++
				fc.nv[k].id = f.seq
			}
		}
	}
}

// largestFirst sets n, v and a to the units' N, V and M₀ in a
// first-order member from their local forces at its start (ends), zero
// for the units that load it (own, ascending), and raises big to the
// largest sizes of N, V and M over the others, M at the member's start
// (M₀) and at its end (M₀ + l·V), NaN left out: what load's plain
// comparisons give (a size of zero raises none), in one pass, the sizes
// kept in registers.
//
// With AVX the units between those of own go through largestFirstAVX,
// each run of them in one call: the same numbers, and the same sizes
// (the largest of the same sizes, whichever order they are met in).
func largestFirst(big *[3]float64, n, v, a []float64, ends [][6]float64, own []int, l float64) {
	if useAVX {
		largestFirstRuns(big, n, v, a, ends, own, l)
		return
	}
	bn, bv, bm := big[0], big[1], big[2]
	v, a, ends = v[:len(n)], a[:len(n)], ends[:len(n)]
	for u := range n {
		if len(own) > 0 && own[0] == u {
			n[u], v[u], a[u] = 0, 0, 0
			own = own[1:]
			continue
		}
		g := &ends[u]
		x, y, z := -g[0], g[1], -g[2]
		n[u], v[u], a[u] = x, y, z
		if s := math.Abs(x); s > bn {
			bn = s
		}
		if s := math.Abs(y); s > bv {
			bv = s
		}
		if s := math.Abs(z); s > bm {
			bm = s
		}
		if s := math.Abs(z + l*y); s > bm {
			bm = s
		}
	}
	big[0], big[1], big[2] = bn, bv, bm
}

// bigConsts is what largestFirstAVX reads: the signs of g[0] and g[2]
// (flipped: N and M₀ are their negations), the mask of a size in lanes 0
// to 2 (lane 3, g[3], cleared to +0) and the member's length.
type bigConsts struct {
	flip, size [4]float64
	l          float64
}

// largestFirstRuns is largestFirst with AVX: the units of own zero, as
// largestFirst meets them (ascending: an entry not past the one before
// is never met, nor any after it), the runs between them through
// largestFirstAVX.
func largestFirstRuns(big *[3]float64, n, v, a []float64, ends [][6]float64, own []int, l float64) {
	nu := len(n)
	v, a, ends = v[:nu], a[:nu], ends[:nu]
	const sign, size = 1 << 63, 1<<63 - 1
	c := bigConsts{
		flip: [4]float64{math.Float64frombits(sign), 0, math.Float64frombits(sign), 0},
		size: [4]float64{math.Float64frombits(size), math.Float64frombits(size), math.Float64frombits(size), 0},
		l:    l,
	}
	b := [4]float64{big[0], big[1], big[2], big[2]}
	run := func(from, to int) {
		if to > from {
			largestFirstAVX(&ends[from], &n[from], &v[from], &a[from], to-from, &c, &b)
		}
	}
	from := 0
	for _, u := range own {
		if u < from || u >= nu {
			break // never met by largestFirst's loop
		}
		run(from, u)
		n[u], v[u], a[u] = 0, 0, 0
		from = u + 1
	}
	run(from, nu)
	big[0], big[1], big[2] = b[0], b[1], b[2]
	if b[3] > b[2] {
		big[2] = b[3]
	}
}

// boundRoom is the room a bound of the size of M leaves for the rounding
// of its terms (each within a few units of the 16th digit).
const boundRoom = 1e-12

// anyUses reports whether some evaluator of parts uses patterned case p.
func anyUses(parts []*evaluator, p int) bool {
	for _, q := range parts {
		if q.uses(p) {
			return true
		}
	}
	return false
}

// scaleOf returns the factors of evaluator e on original case c's N, V
// and M in member m: 1 without member factors.
func scaleOf(e *evaluator, m, c int) [3]float64 {
	if e.fac != nil && e.fac[m] != nil {
		return e.fac[m][c]
	}
	return [3]float64{1, 1, 1}
}

// fold forms in nv fc's fold for N and V over the units that do not load
// the member (those of own have zero entries: round-off, adding nothing),
// each classified by its effect times sc, as the unfolded path scales it.
// Each effect's units are listed by sign (classify, into f's scratch) and
// summed, sized and ranked list by list, each sum in the order of the
// units.
//
// The ranking is seeded as scanFolded seeds it, from kept, the units of
// the lists of the member folded before with this scratch, which it then
// holds this member's.
//
// In first order with AVX, the two effects are classified, summed and
// sized at once (foldSigns), and only the units the ranking may keep are
// listed (listReaching), as scanFolded does for M: the same numbers and
// lists.
func (fc *foldCase) fold(f *fold, w *work, nv *foldNV, kept *[2][2][]int32, second bool, sc [3]float64) {
	nv.sumU = [2][2][6]float64{}
	scaled := sc != [3]float64{1, 1, 1}
	nu := len(fc.n)
	fn, fv, fa := fc.n[:nu], fc.v[:nu], fc.a[:nu]
	if !second && useAVX && nu > 0 {
		fc.foldSigned(f, w, nv, kept, sc)
		return
	}
	if scaled {
		nv.totN, nv.totV = 0, 0
		for u, n := range fn {
			nv.totN += n
			nv.totV += fv[u]
		}
	}
	f.pos, f.neg, f.zer = grow(f.pos, nu), grow(f.neg, nu), grow(f.zer, nu)
	for j, vals := range [2][]float64{fn, fv} {
		x := vals
		if scaled {
			f.mv = grow(f.mv, nu)
			x = f.mv[:nu]
			for u, y := range vals {
				x[u] = sc[j] * y
			}
		}
		t, np, nn, nr := classify(x, w.noiseAt[j], f.pos, f.neg, f.zer)
		if !scaled && j == 0 {
			nv.totN = t
		} else if !scaled {
			nv.totV = t
		}
		pos, neg, zer := f.pos[:np], f.neg[:nn], f.zer[:nr]
		var pre [2]float64
		if seeds(w) {
			for s := range pre {
				pre[s], _ = keptAt(kept[j][s], x, w.noiseAt[j], s == 1, w.share, w.limit)
			}
		}
		ranked := [2][]int32{pos, neg}
		sum := &nv.sum[j]
		if pre[0] > 0 {
			f.ranked[0] = grow(f.ranked[0], nu)
			var n int
			sum[0][0], sum[0][1], sum[0][2], nv.big[j][0], n = sumsReaching(pos, fn, fv, fa, x, pre[0], f.ranked[0])
			ranked[0] = f.ranked[0][:n]
		} else {
			sum[0][0], sum[0][1], sum[0][2], nv.big[j][0] = sumsOver(pos, fn, fv, fa, x)
		}
		sum[1][0], sum[1][1], sum[1][2], _ = sumsOver(zer, fn, fv, fa, x)
		if pre[1] > 0 {
			f.ranked[1] = grow(f.ranked[1], nu)
			var n int
			nv.big[j][1], n = largestReaching(neg, x, -pre[1], f.ranked[1])
			ranked[1] = f.ranked[1][:n]
		} else {
			nv.big[j][1] = largestOver(neg, x)
		}
		nv.count[j] = [2]int{np, nn}
		if second {
			for _, u := range pos {
				addU(&nv.sumU[j][0], &fc.u[u])
			}
			own := fc.own // round-off, and not summed
			for _, u := range zer {
				for len(own) > 0 && own[0] < int(u) {
					own = own[1:]
				}
				if len(own) > 0 && own[0] == int(u) {
					continue
				}
				addU(&nv.sumU[j][1], &fc.u[u])
			}
		}
		// The most influential, with the threshold seeded from the
		// largest, and from the lists of the member before: most units
		// fall short of it at one comparison.
		for s := range ranked {
			h := rankListed(nv.top[j][s][:0], ranked[s], x, s == 1, max(w.share*nv.big[j][s], pre[s]), w.limit)
			// Sorted once for the member (rankListed sorts a list of a
			// limited length): each station's copy is then sorted for
			// exactPlacement.pieces, which sorts a list in place
			// otherwise.
			nv.top[j][s] = h
			kept[j][s] = kept[j][s][:0]
			for _, c := range h {
				kept[j][s] = append(kept[j][s], int32(c.piece))
			}
		}
	}
}

// foldSigned is fold in first order with AVX (foldSigns): for each effect
// the units' values (scaled by sc), their sums, largest sizes and counts
// by sign, and the units of each sign that reach both the seed and the
// share of the largest, listed in their order, ranked; every unit the
// ranking of fold accepts (its thresholds are at least the share of the
// largest, and it ranks only the units that reach the seed), so the same
// lists.
func (fc *foldCase) foldSigned(f *fold, w *work, nv *foldNV, kept *[2][2][]int32, sc [3]float64) {
	nu := len(fc.n)
	fn, fv, fa := fc.n[:nu], fc.v[:nu], fc.a[:nu]
	xs := [2][]float64{fn, fv}
	if sc != [3]float64{1, 1, 1} {
		f.mv, f.mv2 = grow(f.mv, nu), grow(f.mv2, nu)
		xs = [2][]float64{f.mv[:nu], f.mv2[:nu]}
		nv.totN, nv.totV = 0, 0
		for u, n := range fn {
			xs[0][u], xs[1][u] = sc[0]*n, sc[1]*fv[u]
			nv.totN += n
			nv.totV += fv[u]
		}
	}
	sg, tot := foldSigns(xs[0], xs[1], fn, fv, fa, [2]float64{w.noiseAt[0], w.noiseAt[1]})
	if sc == [3]float64{1, 1, 1} {
		nv.totN, nv.totV = tot[0], tot[1]
	}
	f.ranked[0], f.ranked[1] = grow(f.ranked[0], nu+4), grow(f.ranked[1], nu+4)
	for j, x := range xs {
		nz := w.noiseAt[j]
		g := &sg[j]
		nv.sum[j] = [2][3]float64{g.pos, g.zero}
		nv.big[j], nv.count[j] = g.big, g.count
		var pre [2]float64
		if seeds(w) {
			for s := range pre {
				pre[s], _ = keptAt(kept[j][s], x, nz, s == 1, w.share, w.limit)
			}
		}
		above := math.Nextafter(nz, math.Inf(1)) // a size past the round-off
		if !(above < math.Inf(1)) {
			above = math.NaN() // none is: no unit listed
		}
		cut := [2]float64{w.share * g.big[0], w.share * g.big[1]}
		ranked := listReaching(x, max(pre[0], cut[0], above), max(pre[1], cut[1], above), f.ranked[0], f.ranked[1])
		for s := range ranked {
			h := rankListed(nv.top[j][s][:0], ranked[s], x, s == 1, max(cut[s], pre[s]), w.limit)
			nv.top[j][s] = h
			kept[j][s] = kept[j][s][:0]
			for _, c := range h {
				kept[j][s] = append(kept[j][s], int32(c.piece))
			}
		}
	}
}

// listReaching lists in r0, in their order, the units whose M (mv) is at
// least t0, and in r1 those whose M is at most −t1 (t0, t1 > 0), and
// returns the two lists. r0 and r1 hold at least len(mv) + 4 entries (see
// listReachingAVX). Most units reach neither: one well-predicted branch
// each (with AVX, for four).
func listReaching(mv []float64, t0, t1 float64, r0, r1 []int32) [2][]int32 {
	r0, r1 = r0[:len(mv)+4], r1[:len(mv)+4]
	n0, n1, from := 0, 0, 0
	if useAVX && len(mv) >= 4 {
		from = len(mv) &^ 3
		n0, n1 = listReachingAVX(&mv[0], from, t0, t1, &r0[0], &r1[0], lanes)
	}
	for u := from; u < len(mv); u++ {
		m := mv[u]
		if m >= t0 || -m >= t1 {
			if m >= t0 {
				r0[n0] = int32(u)
				n0++
			} else {
				r1[n1] = int32(u)
				n1++
			}
		}
	}
	return [2][]int32{r0[:n0], r1[:n1]}
}

// addU adds u to s.
func addU(s, u *[6]float64) {
	for k := range s {
		s[k] += u[k]
	}
}

// classify lists in pos, neg and zer, in ascending order, the units
// whose M (mv) is positive past the round-off nz, negative past it, and
// round-off (any other, NaN included), and returns the sum of every M in
// the order of the units and how many are in each list. pos, neg and zer
// hold at least len(mv) entries. It has no branch per unit: each index is
// written to every list, and only the list it belongs to moves on.
func classify(mv []float64, nz float64, pos, neg, zer []int32) (m0 float64, np, nn, nr int) {
	pos, neg, zer = pos[:len(mv)], neg[:len(mv)], zer[:len(mv)]
	for u, m := range mv {
		m0 += m
		pos[np] = int32(u)
		neg[nn] = int32(u)
		zer[nr] = int32(u)
		p, n := b2i(m > nz), b2i(m < -nz)
		np += p
		nn += n
		nr += 1 - p - n
	}
	return m0, np, nn, nr
}

// signsAt classifies the units' M at one station (mv, round-off nz)
// into f's scratch and forms over them what stationSigns holds and the
// sum of every M; it lists, in their order, the units of each sign that
// reach pre (every unit of the sign where pre is 0), for the ranking.
// (A function of its own, so that its loops keep their variables in
// registers.)
func (f *fold) signsAt(fc *foldCase, mv []float64, nz float64, pre [2]float64) (sg stationSigns, m0 float64, ranked [2][]int32) {
	nu := len(fc.n)
	f.pos, f.neg, f.zer = grow(f.pos, nu), grow(f.neg, nu), grow(f.zer, nu)
	m0, cp, cn, cz := classify(mv, nz, f.pos, f.neg, f.zer)
	pos, neg, zer := f.pos[:cp], f.neg[:cn], f.zer[:cz]
	ranked = [2][]int32{pos, neg}
	sg.count = [2]int{cp, cn}
	ps := &sg.pos
	if pre[0] > 0 {
		f.ranked[0] = grow(f.ranked[0], nu)
		var nr int
		ps[0], ps[1], ps[2], sg.big[0], nr = sumsReaching(pos, fc.n, fc.v, mv, mv, pre[0], f.ranked[0])
		ranked[0] = f.ranked[0][:nr]
	} else {
		ps[0], ps[1], ps[2], sg.big[0] = sumsOver(pos, fc.n, fc.v, mv, mv)
	}
	zs := &sg.zero
	zs[0], zs[1], zs[2], _ = sumsOver(zer, fc.n, fc.v, mv, mv)
	if pre[1] > 0 {
		f.ranked[1] = grow(f.ranked[1], nu)
		var nr int
		sg.big[1], nr = largestReaching(neg, mv, -pre[1], f.ranked[1])
		ranked[1] = f.ranked[1][:nr]
	} else {
		sg.big[1] = largestOver(neg, mv)
	}
	return sg, m0, ranked
}

// b2i is 1 for true and 0 for false, without a branch.
func b2i(b bool) int {
	var i int
	if b {
		i = 1
	}
	return i
}

// sumsOver returns the sums of n, v and a over the units listed, in their
// order, and the largest size of x over them (largestOver).
func sumsOver(list []int32, n, v, a, x []float64) (sn, sv, sa, big float64) {
	var hb uint64
	for _, u := range list {
		sn += n[u]
		sv += v[u]
		sa += a[u]
		hb = max(hb, math.Float64bits(x[u])&^(1<<63))
	}
	return sn, sv, sa, math.Float64frombits(hb)
}

// largestOver returns the largest size of vals over the units listed, 0
// for none, NaN apart: the sizes compared as their bits, which order as
// the numbers do, without a branch.
func largestOver(list []int32, vals []float64) float64 {
	var hb uint64
	for _, u := range list {
		hb = max(hb, math.Float64bits(vals[u])&^(1<<63))
	}
	return math.Float64frombits(hb)
}

// rankListed adds to h, a heap of keepLargest, the units listed (of one
// sign, past the round-off) by the size of their value in vals (negated
// for the negative ones), in their order, that reach thr. With a limit
// to the list and h empty, it keeps h sorted the smallest first
// (keepAscending: a heap too, the same units), so that it need not be
// sorted for exactPlacement.pieces.
func rankListed(h []candidate, list []int32, vals []float64, negative bool, thr float64, limit int) []candidate {
	if limit != math.MaxInt && len(h) == 0 {
		for _, u := range list {
			x := vals[u]
			if negative {
				x = -x
			}
			if x >= thr {
				h = keepAscending(h, candidate{piece: int(u), a: x}, limit)
				if len(h) == limit && h[0].a >= thr {
					thr = math.Nextafter(h[0].a, math.Inf(1))
				}
			}
		}
		return h
	}
	for _, u := range list {
		x := vals[u]
		if negative {
			x = -x
		}
		if x >= thr {
			h = keepLargest(h, candidate{piece: int(u), a: x}, limit)
			if len(h) == limit && h[0].a >= thr {
				thr = math.Nextafter(h[0].a, math.Inf(1))
			}
		}
	}
	return h
}

// scanFolded is scan at station i of the folded member f: the same sums,
// largest sizes, counts and most influential units per patterned case,
// for the set k of member factors (of evaluator e), whose factors on each
// original case in the member are row (nil for none).
func (pl *exactPlacement) scanFolded(e *evaluator, w *work, f *fold, i, k int, row [][3]float64) {
	ns := len(w.xs)
	x := w.xs[i]
	np := len(e.lay.Patterned)
	for p, pc := range e.lay.Patterned {
		if !e.uses(p) {
			continue // read by no combination
		}
		fc := &f.cases[p]
		nv := &fc.nv[k]
		sc := [3]float64{1, 1, 1}
		if row != nil {
			sc = row[pc.Case]
		}
		scaled := sc != [3]float64{1, 1, 1}
		seed := &f.seed[k*np+p]
		var sum [3][2][3]float64
		var zero [3][3]float64
		var big [3][2]float64
		var count [3][2]int
		var tot [3]float64
		top := &pl.top[p]
		// N and V: the fold, scaled.
		tot[0], tot[1] = sc[0]*nv.totN, sc[1]*nv.totV
		for j := range 2 {
			s := &nv.sum[j]
			sum[j][0] = [3]float64{s[0][0], s[0][1], s[0][2] + x*s[0][1]}
			zero[j] = [3]float64{s[1][0], s[1][1], s[1][2] + x*s[1][1]}
			if f.second {
				sum[j][0][2] += f.n * frame.Sway(&f.wts[i], &nv.sumU[j][0])
				zero[j][2] += f.n * frame.Sway(&f.wts[i], &nv.sumU[j][1])
			}
			if scaled {
				for q := range 3 {
					sum[j][0][q] *= sc[q]
					zero[j][q] *= sc[q]
				}
			}
			big[j], count[j] = nv.big[j], nv.count[j]
			top[j][0] = append(top[j][0][:0], nv.top[j][0]...)
			top[j][1] = append(top[j][1][:0], nv.top[j][1]...)
		}
		// Without units that load the member, N and V are the fold's.
		pl.nvID[p] = 0
		if len(fc.own) == 0 {
			pl.nvID[p] = nv.id
		}
		// M: every unit's value at x (mv), then the units listed by sign
		// (classify), so that the sums and the largest sizes are formed
		// over each list without a branch per unit, the largest sizes
		// first so that the threshold for ranking is seeded with them.
		var mv []float64
		nu := len(fc.n)
		if fc.tabled {
			mv = fc.mt[i*nu : (i+1)*nu]
			if scaled {
				f.mv = grow(f.mv, nu)
				for u, m := range mv {
					f.mv[u] = sc[2] * m
				}
				mv = f.mv
			}
		} else {
			f.mv = grow(f.mv, nu)
			mv = f.mv[:nu]
			fa, fv := fc.a[:nu], fc.v[:nu]
			if scaled {
				for u, a := range fa {
					mv[u] = (a + x*fv[u]) * sc[2]
				}
			} else {
				for u, a := range fa {
					mv[u] = a + x*fv[u]
				}
			}
		}
		nz := w.noise[2]
		// Unscaled, with AVX, the sums, largest sizes and counts by sign
		// were formed four stations at once (signsOf, from the table of
		// either order), and only the units the ranking may keep are
		// listed, below.
		fast := !scaled && fc.signed
		// The seed of the ranking (keptAt, see below) from the units the
		// list kept at the previous station, or at the member's first
		// station at the last station of the member enveloped before with
		// this scratch: the units below it are left out of the ranking as
		// each sign's sum or largest size is formed (ranked), and only
		// the others are ranked. Any list of distinct units gives a seed
		// that changes nothing; one of units close to the largest, a high
		// one.
		kept := &f.kept[k*np+p]
		var pre [2]float64
		var full [2]bool
		if seeds(w) {
			for s := range pre {
				pre[s], full[s] = keptAt(kept[s], mv, nz, s == 1, w.share, w.limit)
			}
		}
		var sg stationSigns
		var m0 float64
		var ranked [2][]int32
		if fast {
			sg, m0 = fc.sg[i], fc.tot[i]
		} else {
			sg, m0, ranked = f.signsAt(fc, mv, nz, pre)
		}
		ps, zs, cp, cn := sg.pos, sg.zero, sg.count[0], sg.count[1]
		big[2] = sg.big
		// The values of the units that load the member, scaled.
		f.own = grow(f.own, len(fc.own))
		for q := range fc.own {
			v := fc.ownAt[q*ns+i]
			if scaled {
				v = frame.Forces{N: sc[0] * v.N, V: sc[1] * v.V, M: sc[2] * v.M}
			}
			f.own[q] = v
			for j, y := range [3]float64{v.N, v.V, v.M} {
				if y > w.noise[j] && y > big[j][0] {
					big[j][0] = y
				} else if y < -w.noise[j] && -y > big[j][1] {
					big[j][1] = -y
				}
			}
		}
		// Ranking: a unit must reach w.share of the largest; and the
		// seed: w.share of the largest size here of the units kept, and
		// when all the list's length of them are still of its sign the
		// smallest of their sizes here (at least that many units reach
		// it, and the largest are among them); else, after the member's
		// first station, half the smallest size the list kept at the
		// previous one. When fewer than the list's length reach the
		// seed, the units are ranked again without it (below); when
		// enough do, those are the largest, the seed made no difference,
		// and far fewer units went through the heap. Each sign's units
		// are ranked in their order, as one pass over every unit ranks
		// them.
		cut := [2]float64{w.share * big[2][0], w.share * big[2][1]}
		thr := cut
		if w.limit != math.MaxInt {
			for s := range thr {
				t := pre[s]
				if !full[s] && i > 0 {
					t = max(t, seed[s]/2)
				}
				thr[s] = max(thr[s], t)
			}
		}
		count[2][0], count[2][1] = count[2][0]+cp, count[2][1]+cn
		if scaled {
			ps[0], ps[1] = sc[0]*ps[0], sc[1]*ps[1]
			zs[0], zs[1] = sc[0]*zs[0], sc[1]*zs[1]
		}
		sum[2][0], zero[2], tot[2] = ps, zs, m0
		if fast {
			// The units of each sign that reach both the seed and the
			// share of the largest, in their order: every unit either
			// ranking below accepts (its thresholds are at least the
			// share of the largest, and it ranks only the units that
			// reach the seed), so the same lists.
			above := math.Nextafter(nz, math.Inf(1)) // a size past the round-off
			if !(above < math.Inf(1)) {
				above = math.NaN() // none is: no unit listed
			}
			f.ranked[0], f.ranked[1] = grow(f.ranked[0], nu+4), grow(f.ranked[1], nu+4)
			ranked = listReaching(mv[:nu], max(pre[0], cut[0], above), max(pre[1], cut[1], above), f.ranked[0], f.ranked[1])
		}
		for s := range ranked {
			neg := s == 1
			h := rankListed(top[2][s][:0], ranked[s], mv, neg, thr[s], w.limit)
			if len(h) < w.limit && thr[s] > cut[s] {
				h = rankListed(h[:0], ranked[s], mv, neg, cut[s], w.limit)
			}
			top[2][s] = h
			seed[s] = 0
			if len(h) == w.limit {
				seed[s] = h[0].a
			}
			kept[s] = kept[s][:0]
			for _, c := range h {
				kept[s] = append(kept[s], int32(c.piece))
			}
		}
		// The units that load the member, exactly.
		for q, u := range fc.own {
			v := f.own[q]
			vv := [3]float64{v.N, v.V, v.M}
			tot[0] += v.N
			tot[1] += v.V
			tot[2] += v.M
			for j, y := range vv {
				var s int
				switch {
				case y > w.noise[j]:
					t := &sum[j][0]
					t[0] += v.N
					t[1] += v.V
					t[2] += v.M
				case y < -w.noise[j]:
					s, y = 1, -y
				default:
					z := &zero[j]
					z[0] += v.N
					z[1] += v.V
					z[2] += v.M
					continue
				}
				count[j][s]++
				if y >= w.share*big[j][s] {
					top[j][s] = keepLargest(top[j][s], candidate{piece: u, a: y}, w.limit)
				}
			}
		}
		for j := range 3 {
			for q := range 3 {
				sum[j][1][q] = tot[q] - sum[j][0][q] - zero[j][q]
			}
		}
		pl.sum[p], pl.big[p], pl.count[p] = sum, big, count
	}
}

// scanOne is scan of one effect (the deflections' evaluator e), reading
// column c's value at station i from vals[c*ns+i] rather than from w.ev:
// the same sums in the same order, largest sizes, counts and most
// influential units, the ranking's threshold seeded with the largest size
// (a first pass), so that most units are rejected at one comparison.
func (pl *exactPlacement) scanOne(e *evaluator, w *work, vals []float64, ns, i int) {
	nz := w.noise[0]
	clear(pl.nvID)
	for p, pc := range e.lay.Patterned {
		if !e.uses(p) {
			continue // read by no combination
		}
		lo := e.first[p]
		nu := len(pc.Units)
		var big [2]float64
		for u := range nu {
			x := vals[(lo+u)*ns+i]
			if x > nz && x > big[0] {
				big[0] = x
			} else if x < -nz && -x > big[1] {
				big[1] = -x
			}
		}
		thr := [2]float64{w.share * big[0], w.share * big[1]}
		top := &pl.top[p]
		top[0][0], top[0][1] = top[0][0][:0], top[0][1][:0]
		var tot, pos, zero float64
		var count [2]int
		for u := range nu {
			x := vals[(lo+u)*ns+i]
			tot += x
			s, a := 0, x
			switch {
			case x > nz:
				pos += x
			case x < -nz:
				s, a = 1, -x
			default:
				zero += x
				continue
			}
			count[s]++
			if a >= thr[s] {
				h := keepLargest(top[0][s], candidate{piece: u, a: a}, w.limit)
				top[0][s] = h
				if len(h) == w.limit && h[0].a >= thr[s] {
					thr[s] = math.Nextafter(h[0].a, math.Inf(1))
				}
			}
		}
		var sum [3][2][3]float64
		sum[0][0][0] = pos
		sum[0][1][0] = tot - pos - zero
		// The other components are zero, as scan leaves them: tot − 0 − 0.
		pl.sum[p] = sum
		pl.big[p] = [3][2]float64{big}
		pl.count[p] = [3][2]int{count}
	}
}
