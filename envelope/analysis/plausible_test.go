package analysis

import (
	"strings"
	"testing"

	"govern/frame"
)

// beamJob is a job of one 6-unit-long beam of section s, in the units
// force and length.
func beamJob(force, length string, s frame.Section, l float64) *Job {
	return &Job{
		Units: Units{Force: force, Length: length},
		Model: &frame.Model{
			Sections: []frame.Section{s},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: l, Support: frame.Roller}},
			Members:  []frame.Member{{Name: "a-b", End: 1}},
		},
	}
}

// TestPlausibility: each check on a slip and on the same section without
// it. Sections: a 300 × 600 concrete beam (A = 0.18 m², I = 5.4e-3 m⁴,
// r = 0.173 m = 0.289 × depth, bh³/12) and a W21x83 (A = 24.4 in²,
// I = 1830 in⁴, d = 21.4 in; AISC Manual Table 1-1, recalled from memory).
func TestPlausibility(t *testing.T) {
	const in2, in4 = 1.0 / 144, 1.0 / 20736 // in² and in⁴ in ft² and ft⁴
	concrete := frame.Section{Name: "B", E: 30e6, A: 0.18, I: 5.4e-3, Depth: 0.6}
	w21 := frame.Section{Name: "W21x83", E: 29000 * 144, A: 24.4 * in2, I: 1830 * in4, Depth: 21.4 / 12}
	for _, tc := range []struct {
		name string
		job  *Job
		want []string // the whole of each warning, or its start
	}{
		{"concrete beam in kN and m", beamJob("kN", "m", concrete, 8), nil},
		{"W21x83 in kip and ft", beamJob("kip", "ft", w21, 30), nil},
		{"the concrete beam in N and mm", beamJob("N", "mm", frame.Section{Name: "B", E: 30e3, A: 0.18e6, I: 5.4e9, Depth: 600}, 8000), nil},
		{"E in psi in a model in kip and ft", beamJob("kip", "ft", func() frame.Section { s := w21; s.E = 29e6; return s }(), 30),
			[]string{`section "W21x83": E = 2.9e+07 kip/ft² is 1389 GPa, outside the 1 to 250 GPa (145 to 36,000 ksi; 20885 to 5.221e+06 kip/ft² in this model's units) of building materials: E looks like psi in a kip, ft model`}},
		{"E of a unit the model does not know", beamJob("tonnes", "m", func() frame.Section { s := concrete; s.E = 30; return s }(), 8), nil},
		{"depth in mm in a model in m", beamJob("kN", "m", func() frame.Section { s := concrete; s.Depth = 600; return s }(), 8),
			[]string{`section "B": its radius of gyration r = √(I/A) = 0.1732 m is 0.0002887 times its depth 600 m, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4): depth looks like mm in a m model`}},
		{"I in mm⁴ in a model in m, without a depth", beamJob("kN", "m", func() frame.Section { s := concrete; s.I = 5.4e9; s.Depth = 0; return s }(), 8),
			[]string{`member "a-b" (section "B"): L/r = 4.619e-05 (L = 8 m, r = √(I/A) = 173205 m), below 4: shorter than any member is deep: I looks like mm⁴ in a m model`}},
		{"a member axially rigid on purpose (A × 1e6)", beamJob("kN", "m", func() frame.Section { s := concrete; s.A *= 1e6; return s }(), 8), nil},
		// A true tie of 20 m, a 20 mm rod (r = d/4 = 5 mm), is slenderer
		// than 1000 too: the warning cannot tell it from a slip, and guesses.
		{"a slender tie, 20 m of a 20 mm rod", beamJob("kN", "m", frame.Section{Name: "rod", E: 200e6, A: 3.14e-4, I: 7.85e-9}, 20),
			[]string{`member "a-b" (section "rod"): L/r = 4000 (L = 20 m, r = √(I/A) = 0.005 m), above 1000: more slender than any member of a frame: A looks like cm² in a m model`}},
		{"labels only: no slip is named", beamJob("tonnes", "m", func() frame.Section { s := concrete; s.Depth = 600; return s }(), 8),
			[]string{`section "B": its radius of gyration r = √(I/A) = 0.1732 m is 0.0002887 times its depth 600 m, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4): check the units of A, I and depth`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Plausibility(tc.job)
			if len(got) != len(tc.want) {
				t.Fatalf("warnings\n%s\nwant %d", strings.Join(got, "\n"), len(tc.want))
			}
			for i := range got {
				if got[i] != tc.want[i] {
					t.Errorf("\n got: %s\nwant: %s", got[i], tc.want[i])
				}
			}
		})
	}
}
