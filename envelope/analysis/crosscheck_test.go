package analysis

import (
	"context"
	"fmt"
	"testing"
)

func TestCrossCheckMultiStorey(t *testing.T) {
	// Two storeys and two bays free to sway at both floors, with gravity,
	// live and wind cases (regularJob). Moment distribution agrees with
	// the stiffness solver to 1e-6 of the largest end moment when the areas
	// are multiplied by 1e6 (no axial strain), and with the model as given
	// once its estimate of axial strain is added, within the limit derived
	// from the estimate's second term (docs/verification.md).
	res, err := Run(context.Background(), regularJob(2, 2, false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	cc, err := res.CrossCheck()
	if err != nil {
		t.Fatal(err)
	}
	if got := fmt.Sprint(cc.SwayLines); !cc.Sway || got != "[[A1 B1 C1] [A2 B2 C2]]" {
		t.Fatalf("sway lines %s", got)
	}
	if cc.RigidErr != nil || len(cc.Cases) != 4 {
		t.Fatalf("%+v", cc)
	}
	for _, c := range cc.Cases {
		t.Logf("case %s: largest %.4g; A×1e6: relative %.2g (limit %.2g); as given: difference %.3g, first term %.3g, less it %.3g (limit %.3g)",
			c.Case, c.Largest, c.RigidRelative, c.RigidLimit, c.Given.Difference, c.Axial, c.Corrected.Difference, c.Limit)
		if !(c.RigidRelative <= CrossCheckRigidLimit) || !c.RigidAgrees() {
			t.Errorf("case %s: without axial strain relative difference %g", c.Case, c.RigidRelative)
		}
		if !c.Estimated || !c.GivenAgrees() || !(c.Corrected.Difference < c.Given.Difference) {
			t.Errorf("case %s: as given %+v", c.Case, c)
		}
		// Axial strain is real here: the plain difference is above what
		// the check without it allows.
		if !(c.Given.Difference > 10*CrossCheckRigidLimit*c.Largest) {
			t.Errorf("case %s: difference %g as given", c.Case, c.Given.Difference)
		}
	}
}
