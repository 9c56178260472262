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

// A set built in code: an office's rule "1.3G + 1.5(Q or S)", with a
// mistake that Validate finds (a ψ factor asked of the permanent load),
// then corrected.
func ExampleSet_Validate() {
	set := &combos.Set{Name: "office", Rules: []combos.Rule{{
		ID: "R1", Text: "1.3G + 1.5(Q or S)",
		Terms: []combos.RuleTerm{
			{Choices: []combos.Choice{{Kind: combos.Dead, Factor: 1.3, Psi: combos.Psi0}}},
			{Choices: []combos.Choice{{Kind: combos.Live, Factor: 1.5}, {Kind: combos.Snow, Factor: 1.5}}, Lead: true},
		},
	}}}
	fmt.Println(set.Validate())
	set.Rules[0].Terms[0].Choices[0].Psi = combos.NoPsi
	fmt.Println(set.Validate())
	cases := []combos.Case{{Name: "G", Kind: combos.Dead}, {Name: "Q", Kind: combos.Live}, {Name: "S", Kind: combos.Snow}}
	cs, _ := set.Generate(cases, nil, combos.Params{})
	for _, cb := range cs {
		fmt.Println(cb.Name)
	}
	// Output:
	// rule "R1", term 1: psi applies to variable loads; dead load has no ψ factors
	// <nil>
	// R1 1.3G+1.5Q
	// R1 1.3G+1.5S
}
