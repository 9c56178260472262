package envelope

import "slices"

// grow returns s with length n, reusing its storage when it can.
func grow[T any](s []T, n int) []T {
	if cap(s) < n {
		return make([]T, n)
	}
	return s[:n]
}

// extraTol is the fraction of a member's length within which an extra
// station falls on another station.
const extraTol = 1e-9

// stations sets w.xs to ns equally spaced stations on a member of length
// l, both ends included, merged with the extra ones, sorted; w.extra marks
// the stations that extra asked for.
func (w *work) stations(l float64, ns int, extra []float64) {
	w.xs, w.extra = w.xs[:0], w.extra[:0]
	for i := range ns {
		w.xs = append(w.xs, l*float64(i)/float64(ns-1))
		w.extra = append(w.extra, false)
	}
	w.xs[ns-1] = l // exactly the end, whatever the rounding
	for _, x := range extra {
		i, _ := slices.BinarySearch(w.xs, x)
		switch {
		case i < len(w.xs) && w.xs[i]-x <= extraTol*l:
			w.extra[i] = true
		case i > 0 && x-w.xs[i-1] <= extraTol*l:
			w.extra[i-1] = true
		default:
			w.xs = slices.Insert(w.xs, i, x)
			w.extra = slices.Insert(w.extra, i, true)
		}
	}
}
