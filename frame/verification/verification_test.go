package verification

import (
	"testing"
)

// TestPublishedCases runs every case of the catalogue through the solvers;
// each quantity must match its published value within its tolerance and
// every case must pass its statics check. The sources are named in the
// catalogue (sources.go, cases.go) beside each case.
func TestPublishedCases(t *testing.T) {
	cases := Cases()
	if len(cases) < 30 {
		t.Errorf("%d cases, want at least 30", len(cases))
	}
	for _, r := range Run(cases) {
		t.Run(r.Case+"/"+r.Quantity+"/"+r.Method.String(), func(t *testing.T) {
			if r.Err != nil {
				t.Fatal(r.Err)
			}
			if r.Statics > StaticsTol {
				t.Errorf("statics out of balance by %g of the load", r.Statics)
			}
			if !r.Pass() {
				t.Errorf("computed %.10g, published %.10g: relative difference %.3g above %.3g", r.Computed, r.Published, r.RelDiff(), r.Tol)
			}
		})
	}
}
