package analysis

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestUnitsShown: the factors from the model's units to the output units
// follow the exact definitions (1 lbf = 4.4482216152605 N, 1 in = 25.4 mm,
// 1 ft = 12 in; NIST SP 811 Appendix B, recalled from memory), and an
// output unit that cannot be converted to is refused.
func TestUnitsShown(t *testing.T) {
	const tol = 1e-15
	f, m, d, err := Units{Force: "kip", Length: "ft", Output: OutputUnits{Force: "kN", Moment: "kip*in", Deflection: "in"}}.Shown()
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		s     Shown
		label string
		f     float64
	}{{f, "kN", 4.4482216152605}, {m, "kip·in", 12}, {d, "in", 12}} {
		if c.s.Label != c.label || math.Abs(c.s.Factor-c.f) > tol*c.f {
			t.Errorf("%+v, want %s × %.17g", c.s, c.label, c.f)
		}
	}
	f, m, d, err = Units{Force: "N", Length: "mm"}.Shown()
	if err != nil || f != (Shown{"N", 1}) || m != (Shown{"N·mm", 1}) || d != (Shown{"mm", 1}) {
		t.Errorf("the model's own: %v %v %v %v", f, m, d, err)
	}
	for _, tc := range []struct {
		u    Units
		want string
	}{
		{Units{Force: "kN", Length: "m", Output: OutputUnits{Moment: "kN"}}, `output unit "kN": kN is a force, not a moment`},
		{Units{Force: "kN", Length: "m", Output: OutputUnits{Deflection: "furlong"}}, `output unit "furlong": "furlong" is not a unit govern knows`},
		{Units{Force: "tonnes", Length: "m", Output: OutputUnits{Deflection: "mm"}}, `the model's units (force "tonnes", length "m") are not units that can be converted`},
	} {
		_, _, _, err := tc.u.Shown()
		if err == nil || !errors.Is(err, ErrUnits) || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%+v: %v, want %q", tc.u, err, tc.want)
		}
	}
}
