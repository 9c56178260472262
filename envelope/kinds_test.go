package envelope

import (
	"strings"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// testKinds are the kinds of the load cases of this package's test models,
// by name.
var testKinds = map[string]combos.Kind{
	"D": combos.Dead, "P": combos.Dead,
	"L": combos.Live, "L1": combos.Live, "L2": combos.Live,
	"Lr": combos.RoofLive, "W": combos.Wind,
}

// kindsOf gives the kind of each load case of the model solved by sol,
// before its patterned cases were placed (lay, nil without patterns).
func kindsOf(sol *frame.Solution, lay *patterns.Layout) []combos.Kind {
	cases := sol.Model().Cases
	n := len(cases)
	if lay != nil {
		for _, p := range lay.Patterned {
			n -= len(p.Units)
		}
	}
	ks := make([]combos.Kind, n)
	for c := range n {
		k, ok := testKinds[strings.Fields(cases[c].Name)[0]]
		if !ok {
			panic("envelope test: no kind for case " + cases[c].Name)
		}
		ks[c] = k
	}
	return ks
}

// casesOf gives the load cases of the model solved by sol as the
// combination rules see them.
func casesOf(sol *frame.Solution) []combos.Case {
	ks := kindsOf(sol, nil)
	cs := make([]combos.Case, len(ks))
	for c, k := range ks {
		cs[c] = combos.Case{Name: sol.Model().Cases[c].Name, Kind: k}
	}
	return cs
}
