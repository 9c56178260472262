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

// TestBoundedNumbers: numbers have a bounded width (an exponent past
// 10¹²), and span/deflection below 1 is shown as it is, never as L/0.
func TestBoundedNumbers(t *testing.T) {
	for _, c := range []struct {
		name string
		f    func(float64) string
		v    float64
		want string
	}{
		{"fixed, a moment in N·mm", fixed, 1.23456789e9, "1234567890.00"},
		{"fixed, huge", fixed, -1.5e300, "-1.500e+300"},
		{"fixed3, huge", fixed3, 2e15, "2.000e+15"},
		{"sig4, a unit slip's deflection", sig4, -3050.4, "-3050"},
		{"sig4, huge", sig4, -8.4375e292, "-8.438e+292"},
		{"sig4, tiny", sig4, 1.23456e-12, "1.235e-12"},
		{"sig4, small", sig4, 1.588e-4, "0.0001588"},
		{"short, huge", short, 7e20, "7.000e+20"},
		{"ratio", ratio, 412.9, "L/412"},
		{"ratio below 1", ratio, 6 / 3050.4, "L/0.0019"},
		{"ratio of a third", ratio, 0.35, "L/0.35"},
		{"ratio just below 1", ratio, 0.999, "L/0.99"},
		{"ratio, huge", ratio, 1.26e15, "L/1.2e+15"},
		{"ratio of no deflection", ratio, math.Inf(1), "-"},
	} {
		if got := c.f(c.v); got != c.want {
			t.Errorf("%s: %g gives %q, want %q", c.name, c.v, got, c.want)
		}
	}
	for _, v := range []float64{math.MaxFloat64, -math.MaxFloat64, 1e-300, -1e-300, 123456789012.345} {
		for name, f := range map[string]func(float64) string{"fixed": fixed, "fixed3": fixed3, "sig4": sig4, "short": short} {
			if s := f(v); len(s) > 16 {
				t.Errorf("%s(%g) = %q: %d characters", name, v, s, len(s))
			}
		}
	}
}
