package units

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestParse reads the units the trade writes, each against its value built
// from the table's exact definitions (the dimension and SI value follow
// from the symbols, so each check is of the parser, not of the table).
func TestParse(t *testing.T) {
	const in, ft, lbf, kip = 0.0254, 0.3048, 4.4482216152605, 4448.2216152605
	for _, tc := range []struct {
		s      string
		symbol string
		dim    Dim
		si     float64
	}{
		{"kN", "kN", Force.Dim, 1e3},
		{"kips", "kip", Force.Dim, kip},
		{"lb", "lbf", Force.Dim, lbf},
		{"kN/m", "kN/m", LineLoad.Dim, 1e3},
		{"N/mm", "N/mm", LineLoad.Dim, 1e3},
		{"kip/ft", "kip/ft", LineLoad.Dim, kip / ft},
		{"klf", "klf", LineLoad.Dim, kip / ft},
		{"plf", "plf", LineLoad.Dim, lbf / ft},
		{"lbf/ft", "lbf/ft", LineLoad.Dim, lbf / ft},
		{"kip/in", "kip/in", Spring.Dim, kip / in},
		{"kN/m3", "kN/m³", UnitWeight.Dim, 1e3},
		{"kN/m³", "kN/m³", UnitWeight.Dim, 1e3},
		{"kN/m^3", "kN/m³", UnitWeight.Dim, 1e3},
		{"pcf", "pcf", UnitWeight.Dim, lbf / (ft * ft * ft)},
		{"in4", "in⁴", Inertia.Dim, in * in * in * in},
		{"in^4", "in⁴", Inertia.Dim, in * in * in * in},
		{"in⁴", "in⁴", Inertia.Dim, in * in * in * in},
		{"cm4", "cm⁴", Inertia.Dim, 1e-8},
		{"mm²", "mm²", Area.Dim, 1e-6},
		{"ft2", "ft²", Area.Dim, ft * ft},
		{"N/mm2", "N/mm²", Stress.Dim, 1e6},
		{"ksi", "ksi", Stress.Dim, kip / (in * in)},
		{"kN*m", "kN·m", Moment.Dim, 1e3},
		{"kN·m", "kN·m", Moment.Dim, 1e3},
		{"kN.m", "kN·m", Moment.Dim, 1e3},
		{"kNm", "kNm", Moment.Dim, 1e3},
		{"kip-ft", "kip·ft", Moment.Dim, kip * ft},
		{"kip*in", "kip·in", Moment.Dim, kip * in},
		{"lbf·ft", "lbf·ft", Moment.Dim, lbf * ft},
		{"N*mm", "N·mm", Moment.Dim, 1e-3},
		{"kN*m/rad", "kN·m/rad", RotSpring.Dim, 1e3},
		{"kip*in/rad", "kip·in/rad", RotSpring.Dim, kip * in},
		{"K", "K", TempDiff.Dim, 1},
		{"°C", "°C", TempDiff.Dim, 1},
		{"degF", "°F", TempDiff.Dim, 5.0 / 9},
		{"1/K", "1/K", Expansion.Dim, 1},
		{"1/°F", "1/°F", Expansion.Dim, 9.0 / 5},
		{"K^-1", "K⁻¹", Expansion.Dim, 1},
		{"°F⁻¹", "°F⁻¹", Expansion.Dim, 9.0 / 5},
		{"rad", "rad", Rotation.Dim, 1},
		{"mrad", "mrad", Rotation.Dim, 1e-3},
		{"degree", "°", Rotation.Dim, math.Pi / 180},
		{" kN / m ", "kN/m", LineLoad.Dim, 1e3},
	} {
		t.Run(tc.s, func(t *testing.T) {
			u, err := Parse(tc.s)
			if err != nil {
				t.Fatal(err)
			}
			if u.Symbol != tc.symbol || u.Dim != tc.dim {
				t.Errorf("%q: %s of %v, want %s of %v", tc.s, u.Symbol, u.Dim, tc.symbol, tc.dim)
			}
			if rel := math.Abs(u.SI-tc.si) / tc.si; rel > exactTol {
				t.Errorf("%q = %.17g in SI, want %.17g", tc.s, u.SI, tc.si)
			}
		})
	}
}

func TestParseErrors(t *testing.T) {
	for _, tc := range []struct {
		s, want string
		is      error
	}{
		{"kis", `"kis" is not a unit govern knows (did you mean "ksi"?)`, ErrUnknown},
		{"KN", `"KN" is not a unit govern knows (did you mean "kN"?)`, ErrUnknown},
		{"tonf", `"tonf" is not a unit govern knows`, ErrUnknown},
		{"kN m", `cannot follow kN; join symbols with * or ·`, ErrSyntax},
		{"kN/m/m", `more than one "/"`, ErrSyntax},
		{"m^9", `powers are 1 to 6`, ErrSyntax},
		{"m^", `"^" must be followed by a power`, ErrSyntax},
		{"kN*", `ends with a separator`, ErrSyntax},
		{"", `the unit is empty`, ErrSyntax},
		{"kN/", `a "/" with nothing after it`, ErrSyntax},
		{"1", `is a number, not a unit`, ErrSyntax},
	} {
		t.Run(tc.s, func(t *testing.T) {
			_, err := Parse(tc.s)
			if err == nil || !strings.Contains(err.Error(), tc.want) || !errors.Is(err, tc.is) {
				t.Errorf("%q: %v, want %q (%v)", tc.s, err, tc.want, tc.is)
			}
		})
	}
}

func TestParseValue(t *testing.T) {
	for _, tc := range []struct {
		s      string
		v      float64
		symbol string
	}{
		{"29000 ksi", 29000, "ksi"},
		{"2.4 kip/ft", 2.4, "kip/ft"},
		{"-12.5kN", -12.5, "kN"},
		{"8.4e3 mm", 8400, "mm"},
		{"6.5e-6 1/°F", 6.5e-6, "1/°F"},
		{"6.5e-6/°F", 6.5e-6, "1/°F"},
		{".5 in", 0.5, "in"},
		{"  50   psf ", 50, "psf"},
	} {
		t.Run(tc.s, func(t *testing.T) {
			v, u, err := ParseValue(tc.s)
			if err != nil {
				t.Fatal(err)
			}
			if v != tc.v || u.Symbol != tc.symbol {
				t.Errorf("%q: %g %s, want %g %s", tc.s, v, u.Symbol, tc.v, tc.symbol)
			}
		})
	}
	for _, tc := range []struct{ s, want string }{
		{"12", `has no unit`},
		{"kN", `is not a number followed by a unit`},
		{"1,830 in4", `without a decimal comma or digit separators`},
		{"29_000 ksi", `without a decimal comma or digit separators`},
		{"1e999 kN", `is not a finite number`},
		{"nan kN", `is not a number followed by a unit`},
	} {
		t.Run(tc.s, func(t *testing.T) {
			if _, _, err := ParseValue(tc.s); err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%q: %v, want %q", tc.s, err, tc.want)
			}
		})
	}
}
