package combos_test

import (
	"fmt"

	"govern/combos"
)

// The strength combinations of ASCE/SEI 7-16 section 2.3.1 for a frame
// with dead, floor live and wind load cases, wind acting from either side.
func ExampleSet_Generate() {
	set, err := combos.Standard("asce7-16-strength")
	if err != nil {
		fmt.Println(err)
		return
	}
	cases := []combos.Case{
		{Name: "D", Kind: combos.Dead},
		{Name: "L", Kind: combos.Live},
		{Name: "W", Kind: combos.Wind},
	}
	info := []combos.CaseInfo{2: {Reversible: true}}
	cs, err := set.Generate(cases, info, combos.Params{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, cb := range cs {
		fmt.Println(cb.Name)
	}
	// Output:
	// 2.3.1-1 1.4D
	// 2.3.1-2 1.2D+1.6L
	// 2.3.1-4 1.2D+1.0W+1.0L
	// 2.3.1-4 1.2D-1.0W+1.0L
	// 2.3.1-5 0.9D+1.0W
	// 2.3.1-5 0.9D-1.0W
}
