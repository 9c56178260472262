package envelope

import (
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
func Values(sol *frame.Solution, cs []combos.Combination, idx []int, set Settings, lay *patterns.Layout, n int,
	get func(c, i int) [3]float64, what func(i, q int) string) ([][3]Extreme, error) {
	if len(idx) == 0 {
		return nil, ErrNoCombinations
	}
	mo := sol.Model()
	if lay != nil && lay.Model != mo {
		panic("envelope: solution is not of the layout's model")
	}
	e := newEvaluator(mo, cs, idx, 3, set, lay)
	w := e.scratch()
	out := make([][3]Extreme, n)
	for i := range n {
		w.noise = [3]float64{}
		for c := range w.ev {
			w.ev[c] = get(c, i)
			for j, v := range w.ev[c] {
				if v < 0 {
					v = -v
				}
				w.noise[j] = max(w.noise[j], v)
			}
		}
		for j := range w.noise {
			w.noise[j] *= roundOff
		}
		x := e.station(w)
		if !allFinite(&x, 3) {
			return nil, e.nonFinite(w, func(q int) string { return what(i, q) })
		}
		out[i] = x
	}
	return out, nil
}
