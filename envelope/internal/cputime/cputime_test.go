package cputime

import "testing"

// TestNowGrows: processor time is never negative and does not run
// backwards while the process works (getrusage(2) counts it up).
func TestNowGrows(t *testing.T) {
	a := Now()
	s := 0.0
	for i := range 20_000_000 {
		s += float64(i)
	}
	b := Now()
	if a < 0 || b < a {
		t.Fatalf("processor time went from %v to %v (sum %g)", a, b, s)
	}
}
