package envelope

import (
	"fmt"
	"math"

	"govern/frame"
)

// member envelopes the stations of member m: it evaluates every column at
// every station at once (evaluate), or folds the member (fold.go), then
// forms the extremes station by station (station).
func (e *evaluator) member(w *work, sol *frame.Solution, m int) (Member, error) {
	e.placeStations(w, sol, m)
	if pl, ok := e.foldable(w, sol, m); ok {
		w.fold.load(e, w, sol, m)
		if e.defl != nil {
			ns, nc := len(w.xs), len(w.ev)
			w.defl = grow(w.defl, ns*nc)
			for c := range nc {
				d := w.defl[c*ns : (c+1)*ns]
				if f := &w.fold; f.second {
					sol.SecondFrom(nil, d, c, m, &f.disp[c], f.wts, w.xs)
				} else {
					sol.DeflectionsFrom(d, c, m, &f.ends[c], w.xs)
				}
			}
		}
		line := e.lineDeflections(w, sol, m)
		if mem, err := e.stationsOf(w, sol, m, line, pl); err == nil {
			return mem, nil
		}
		// Not finite somewhere: the unfolded path names what.
	}
	line := e.evaluate(w, sol, m)
	return e.stationsOf(w, sol, m, line, nil)
}

// stationsOf forms the extremes of member m station by station, from the
// member folded (folded, its placement) or from the table of every
// column's values (folded nil).
func (e *evaluator) stationsOf(w *work, sol *frame.Solution, m int, line Line, folded *exactPlacement) (Member, error) {
	ns := len(w.xs)
	name := sol.Model().Members[m].Name
	effects := [3]string{"N", "V", "M"}
	st := make([]Station, ns)
	var defl, lineDefl []Extreme
	if e.defl != nil {
		defl = make([]Extreme, ns)
	}
	if !line.none() {
		lineDefl = make([]Extreme, ns)
	}
	for i, x := range w.xs {
		var ex [3]Extreme
		w.noise = w.noiseAt
		if folded != nil {
			ex = e.foldedStation(w, m, i, folded)
			if !allFinite(&ex, 3) {
				return Member{}, ErrNotFinite
			}
		} else {
			// Every column at the station, with the member's factors
			// (live load reduction) where it has them (factors.go).
			ex = e.forces(w, m, i)
			if !allFinite(&ex, 3) {
				return Member{}, e.nonFinite(w, func(q int) string { return fmt.Sprintf("%s of member %q at x = %g", effects[q], name, x) })
			}
		}
		st[i] = Station{X: x, Extra: w.extra[i], N: ex[0], V: ex[1], M: ex[2]}
		for _, d := range [2]struct {
			vals  []float64
			noise float64
			dst   []Extreme
			what  string
		}{{w.defl, w.noiseDefl, defl, ""}, {w.line, w.noiseLine, lineDefl, " across its line"}} {
			if d.dst == nil {
				continue
			}
			var ex [3]Extreme
			w.noise = [3]float64{d.noise}
			if folded != nil {
				// Only the original cases' values are read from w.ev.
				for c := range e.nOrig {
					w.ev[c] = [3]float64{d.vals[c*ns+i], 0, 0}
				}
				folded.scanOne(e.defl, w, d.vals, ns, i)
				ex = e.defl.scanned(w)
			} else {
				for c := range w.ev {
					w.ev[c] = [3]float64{d.vals[c*ns+i], 0, 0}
				}
				ex = e.defl.station(w)
			}
			if !allFinite(&ex, 1) {
				return Member{}, e.defl.nonFinite(w, func(int) string { return fmt.Sprintf("the deflection of member %q at x = %g%s", name, x, d.what) })
			}
			ex[0].MaxWith, ex[0].MinWith = [3]float64{}, [3]float64{}
			d.dst[i] = ex[0]
		}
	}
	if e.set.Progress != nil {
		e.set.Progress.Add(int64(ns))
	}
	return Member{Member: m, Stations: st, Deflection: defl, LineDeflection: lineDefl}, nil
}

// foldedStation forms the extremes of N, V and M at station i of the
// folded member m, with e's member factors, as forces does unfolded.
func (e *evaluator) foldedStation(w *work, m, i int, pl *exactPlacement) [3]Extreme {
	if e.parts == nil {
		return e.foldedWith(w, m, i, 0, pl)
	}
	var out [3]Extreme
	for k, p := range e.parts {
		x := p.foldedWith(w, m, i, k, pl)
		if k == 0 {
			out = x
			continue
		}
		merge(&out, &x, e.nEff)
	}
	return out
}

// foldedWith is foldedStation with e's factors alone, the k-th set of
// member factors of the fold.
func (e *evaluator) foldedWith(w *work, m, i, k int, pl *exactPlacement) [3]Extreme {
	ns := len(w.xs)
	var row [][3]float64
	if e.fac != nil {
		row = e.fac[m]
	}
	for c := range e.nOrig {
		f := w.fold.orig[c*ns+i]
		if row == nil {
			w.ev[c] = [3]float64{f.N, f.V, f.M}
		} else {
			s := &row[c]
			w.ev[c] = [3]float64{s[0] * f.N, s[1] * f.V, s[2] * f.M}
		}
	}
	w.noise = w.noiseAt
	pl.scanFolded(e, w, &w.fold, i, k, row)
	return e.scanned(w)
}

// evaluate fills w with every column's values at every station of member
// m (w.xs): the forces, and with service combinations the deflections
// relative to the chord and across the member's line, which it returns
// (the zero Line for none); and what counts as round-off in the member.
func (e *evaluator) evaluate(w *work, sol *frame.Solution, m int) Line {
	e.placeStations(w, sol, m)
	ns, nc := len(w.xs), len(w.ev)
	w.at = grow(w.at, ns*nc)
	if e.defl != nil {
		w.defl = grow(w.defl, ns*nc)
		sol.StationsAndDeflectionsTo(w.at, w.defl, m, w.xs)
	} else {
		sol.StationsTo(w.at, m, w.xs)
	}
	// Concentrated moments exactly at a station: M is also taken past them.
	w.jump = grow(w.jump, ns*nc)
	w.jumps = sol.MomentJumpsTo(w.jump, m, w.xs)
	// The first station is at x = 0: take it inside the member, past any
	// point load at its start.
	w.start = grow(w.start, nc)
	sol.StartLoadsTo(w.start, m)
	for c, f := range w.start {
		w.at[c*ns].N += f.N
		w.at[c*ns].V += f.V
	}
	// Round-off: only pattern pieces are judged by it.
	var noise [3]float64
	if e.patterned {
		for _, f := range w.at {
			// Plain comparisons: math.Max's care for NaN and signed zeros
			// costs a third of the envelope's time here.
			if a := math.Abs(f.N); a > noise[0] {
				noise[0] = a
			}
			if a := math.Abs(f.V); a > noise[1] {
				noise[1] = a
			}
			if a := math.Abs(f.M); a > noise[2] {
				noise[2] = a
			}
		}
		for j := range noise {
			noise[j] *= roundOff
		}
	}
	w.noiseAt = noise
	return e.lineDeflections(w, sol, m)
}

// placeStations sets w.xs and w.extra to the stations of member m.
func (e *evaluator) placeStations(w *work, sol *frame.Solution, m int) {
	var extra []float64
	if m < len(e.set.Extra) {
		extra = e.set.Extra[m]
	}
	w.stations(sol.Model().Length(m), e.set.Stations, extra)
}

// lineDeflections fills w.line from w.defl, the deflections relative to
// the chord, for a member on a line, and sets what counts as round-off in
// the deflections; it returns the member's line (the zero Line for none).
func (e *evaluator) lineDeflections(w *work, sol *frame.Solution, m int) Line {
	var line Line
	if e.defl != nil && m < len(e.set.Lines) {
		line = e.set.Lines[m]
	}
	if !line.none() {
		w.line = grow(w.line, len(w.xs)*len(w.ev))
		lineDeflectionsTo(w.line, w.defl, sol, m, line, w.xs)
	}
	var noiseDefl, noiseLine float64
	if e.patterned {
		if e.defl != nil {
			noiseDefl = largest(w.defl) * roundOff
		}
		if !line.none() {
			noiseLine = largest(w.line) * roundOff
		}
	}
	w.noiseDefl, w.noiseLine = noiseDefl, noiseLine
	return line
}

// pastMoments takes into the extremes of M at station i (ex[2]) the values
// past the concentrated moments that act exactly there, where M jumps:
// the station's values are those before them, and the larger and the
// smaller of the two sides are the station's extremes, whichever way the
// member was drawn. w.ev holds the station's values before them.
func (e *evaluator) pastMoments(w *work, ex *[3]Extreme, i int) {
	ns := len(w.xs)
	jumps := false
	for c := range w.ev {
		if d := w.jump[c*ns+i]; d != 0 {
			if w.fac != nil {
				d *= w.fac[e.caseOf[c]][2]
			}
			w.ev[c][2] += d
			jumps = true
		}
	}
	if !jumps {
		return
	}
	past := e.station(w)
	m, p := &ex[2], &past[2]
	if p.Max > m.Max {
		m.Max, m.MaxBy, m.MaxWith, m.MaxSpans, m.MaxLoaded = p.Max, p.MaxBy, p.MaxWith, p.MaxSpans, p.MaxLoaded
	}
	if p.Min < m.Min {
		m.Min, m.MinBy, m.MinWith, m.MinSpans, m.MinLoaded = p.Min, p.MinBy, p.MinWith, p.MinSpans, p.MinLoaded
	}
}

// largest returns the largest magnitude in v.
func largest(v []float64) float64 {
	a := 0.0
	for _, x := range v {
		if b := math.Abs(x); b > a {
			a = b
		}
	}
	return a
}
