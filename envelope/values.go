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

// valuesBlock is how many quantities ValuesRows hands a worker at a time.
const valuesBlock = 64

// ValuesRows is [Values] with each quantity's values given in one call:
// fill(i, row, tmp) sets row[c] to quantity i's three components in every
// column c; tmp, of the same length, is scratch of its own. Only the first
// effects components (1 to 3) are enveloped, the others' Extremes left
// none (zero, MaxBy and MinBy −1): a quantity of one number (a drift) is
// not placed three times. The quantities
// are enveloped on every processor, each alone, so the result does not
// depend on how many there are; fill is called from several goroutines at
// once. The error is that of the first quantity, in their order, that has
// one.
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
			tmp := make([][3]float64, len(w.ev))
			for {
				b := int(next.Add(1) - 1)
				if b >= blocks {
					return
				}
				for i := b * valuesBlock; i < min((b+1)*valuesBlock, n); i++ {
					fill(i, w.ev, tmp)
					x, ok := valueOf(e, w)
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
