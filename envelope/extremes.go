package envelope

// station forms the extremes of the first e.nEff effects from the column
// effects in w.ev (at one station of a member, or at a support): for each
// combination and effect the loads are placed to make the effect largest,
// then smallest, and the worst over the combinations is kept with the
// forces acting with it and the pattern pieces it loads.
func (e *evaluator) station(w *work) [3]Extreme {
	w.place.scan(e, w)
	return e.scanned(w)
}

// scanned is station once the placement has scanned the station.
func (e *evaluator) scanned(w *work) [3]Extreme {
	out := w.place.extremes(e, w)
	if e.patterned {
		e.spans(w, &out)
	}
	// Name the combinations by their index in Compute's list.
	for j := range e.nEff {
		if out[j].MaxBy >= 0 {
			out[j].MaxBy = e.index[out[j].MaxBy]
		}
		if out[j].MinBy >= 0 {
			out[j].MinBy = e.index[out[j].MinBy]
		}
	}
	return out
}
