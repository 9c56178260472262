package report

import (
	"math"
	"testing"
)

// TestNoNegativeZero: a value that rounds to zero is shown without a
// minus sign by every formatter that rounds; a small value that does not
// round to zero keeps its sign.
func TestNoNegativeZero(t *testing.T) {
	for _, c := range []struct {
		name string
		f    func(float64) string
		v    float64
		want string
	}{
		{"fixed", fixed, -0.004, "0.00"},
		{"fixed of negative zero", fixed, math.Copysign(0, -1), "0.00"},
		{"fixed keeps a sign", fixed, -0.005001, "-0.01"},
		{"fixed3", fixed3, -0.0004, "0.000"},
		{"short", short, -0.1004, "-0.10"},
		{"short of thousands", short, -0.4, "-0.40"},
		{"svgNum", svgNum, -0.001, "0.00"},
		{"sig4 of negative zero", sig4, math.Copysign(0, -1), "0"},
	} {
		if got := c.f(c.v); got != c.want {
			t.Errorf("%s(%g) = %q, want %q", c.name, c.v, got, c.want)
		}
	}
	for _, s := range []string{"-0", "-0.00", "-0.000e+00"} {
		if got := unsigned(s); got[0] == '-' {
			t.Errorf("unsigned(%q) = %q", s, got)
		}
	}
	for _, s := range []string{"-0.01", "-1e-20", "-10", "0.00"} {
		if got := unsigned(s); got != s {
			t.Errorf("unsigned(%q) = %q, want it as it is", s, got)
		}
	}
}
