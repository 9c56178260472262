package frame

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// cantilever returns a horizontal member of length l fixed at node "a" and
// free at node "b", whose three free degrees of freedom are those of b.
func cantilever(l, e, a, i float64) *Model {
	return &Model{
		Sections: []Section{{Name: "S", E: e, A: a, I: i}},
		Nodes:    []Node{{Name: "a", Support: Fixed}, {Name: "b", X: l}},
		Members:  []Member{{Name: "a-b", Start: 0, End: 1}},
		Cases:    []Case{{Name: "P", NodeLoads: []NodeLoad{{Node: 1, Fy: -1}}}},
	}
}

// cantileverCond returns the 1-norm condition number of the tip stiffness
// matrix of a cantilever, from the closed forms of the stiffness
// K = [EA/L; 12EI/L³, 6EI/L²; 6EI/L², 4EI/L] and of its inverse, the tip
// flexibility [L/EA; L³/3EI, L²/2EI; L²/2EI, L/EI] (tip deflection and
// rotation under an end load and an end moment, beam tables; common practice).
func cantileverCond(l, e, a, i float64) float64 {
	ei := e * i
	k := math.Max(e*a/l, math.Max(12*ei/(l*l*l)+6*ei/(l*l), 6*ei/(l*l)+4*ei/l))
	f := math.Max(l/(e*a), math.Max(l*l*l/(3*ei)+l*l/(2*ei), l*l/(2*ei)+l/ei))
	return k * f
}

// condTol is the relative agreement asked of the condition estimate on a
// 3 × 3 matrix, where LAPACK's estimator finds the exact 1-norm of the
// inverse.
const condTol = 1e-9

func TestConditionNumberAgainstClosedForm(t *testing.T) {
	for _, tc := range []struct {
		name       string
		l, e, a, i float64
		warn       bool
	}{
		{"steel cantilever, consistent units", 4, 200e6, 0.01, 1e-4, false},
		{"area entered in mm² with E in kN/m²", 4, 200e6, 1e4, 1e-4, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sol, err := Solve(cantilever(tc.l, tc.e, tc.a, tc.i))
			if err != nil {
				t.Fatal(err)
			}
			want := cantileverCond(tc.l, tc.e, tc.a, tc.i)
			if got := sol.Cond(); !near(got, want, condTol) {
				t.Errorf("Cond() = %.6g, want %.6g", got, want)
			}
			w := sol.Warnings()
			if !tc.warn {
				if len(w) != 0 {
					t.Errorf("unexpected warnings %q", w)
				}
				return
			}
			msg := fmt.Sprintf("the stiffness matrix is ill-conditioned: estimated condition number %.2g, so results may have lost about %.0f of their 16 significant digits; %s",
				want, math.Log10(want), illAdvice)
			if len(w) != 1 || w[0] != msg {
				t.Errorf("warnings %q\nwant [%q]", w, msg)
			}
			// The tip deflection PL³/3EI is still right to the digits left
			// (beam tables; common practice).
			_, uy, _ := sol.Displacement(0, 1)
			if d := tc.l * tc.l * tc.l / (3 * tc.e * tc.i); !near(-uy, d, math.Pow(10, -(16-math.Log10(want)))*10) {
				t.Errorf("tip deflection %g, want %g", -uy, d)
			}
		})
	}
}

func TestStiffnessLostInRoundOffIsNamed(t *testing.T) {
	// Axial stiffness 10^16 times the bending stiffness (A in mm² and then
	// some): the bending stiffness of b is below 1e-13 of the largest
	// diagonal, which the solver cannot tell from round-off, so the
	// mechanism it reports carries a note on units.
	_, err := Solve(cantilever(4, 200e6, 1e12, 1e-4))
	var me *MechanismError
	if !errors.As(err, &me) {
		t.Fatalf("err = %v, want a mechanism", err)
	}
	// Diagonal: EA/L = 5e19 against 12EI/L³ = 3750: 16 orders.
	want := `the structure is a mechanism (it cannot carry load): node "b" is free to move along Y (uy); node "b" is free to rotate (rz) (the stiffnesses on the diagonal span 16 orders of magnitude, so what holds these may be lost in round-off: check that E, A and I are in the declared units)`
	if err.Error() != want {
		t.Errorf("error\n got: %s\nwant: %s", err, want)
	}
}
