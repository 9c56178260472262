package units

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func mustSystem(t *testing.T, f, l, temp string) System {
	t.Helper()
	s, err := NewSystem(f, l, temp)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestSystemValue converts values written with units into
// models of kN and m, kip and ft, and N and mm; each expected value is
// worked by hand from the exact definitions (1 in = 25.4 mm, 1 ft = 12 in,
// 1 lbf = 4.4482216152605 N, 1 kip = 1000 lbf).
func TestSystemValue(t *testing.T) {
	const lbf = 4.4482216152605
	kNm := mustSystem(t, "kN", "m", "")
	kipft := mustSystem(t, "kip", "ft", "°F")
	nmm := mustSystem(t, "N", "mm", "K")
	for _, tc := range []struct {
		name string
		s    System
		in   string
		q    Quantity
		want float64
	}{
		{"ksi to ksf", kipft, "29000 ksi", Stress, 29000 * 144},
		{"in4 to ft4", kipft, "1830 in4", Inertia, 1830.0 / 20736},
		{"in2 to ft2", kipft, "26.5 in2", Area, 26.5 / 144},
		{"psf to ksf", kipft, "50 psf", Pressure, 0.05},
		{"kip/ft to kN/m", kNm, "2.4 kip/ft", LineLoad, 2.4 * 1000 * lbf / 1000 / 0.3048},
		{"kN to N", nmm, "12 kN", Force, 12000},
		{"mm to m", kNm, "8400 mm", Length, 8.4},
		{"m to ft", kipft, "3.048 m", Length, 10},
		{"GPa to N/mm²", nmm, "200 GPa", Stress, 200000},
		{"MPa to kN/m²", kNm, "30000 MPa", Stress, 30e6},
		{"pcf to kip/ft³", kipft, "150 pcf", UnitWeight, 0.15},
		{"kN/m³ to N/mm³", nmm, "24 kN/m3", UnitWeight, 24e-6},
		{"kip·ft to kN·m", kNm, "1 kip*ft", Moment, lbf * 0.3048},
		{"kip·in/rad to kip·ft/rad", kipft, "12000 kip*in/rad", RotSpring, 1000},
		{"kip/in to kN/m", kNm, "1 kip/in", Spring, lbf / 0.0254},
		{"°F to K", nmm, "18 °F", TempDiff, 10},
		{"°C to °F", kipft, "10 °C", TempDiff, 18},
		{"1/°F to 1/K", nmm, "6.5e-6 1/°F", Expansion, 6.5e-6 * 1.8},
		{"degree to rad", kNm, "180 degree", Rotation, math.Pi},
		{"mrad to rad", kNm, "2.5 mrad", Rotation, 0.0025},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, _, err := tc.s.Value(tc.in, tc.q)
			if err != nil {
				t.Fatal(err)
			}
			if rel := math.Abs(got-tc.want) / math.Abs(tc.want); rel > exactTol {
				t.Errorf("%s: %.17g, want %.17g", tc.in, got, tc.want)
			}
		})
	}
}

func TestSystemValueOfTheWrongDimension(t *testing.T) {
	s := mustSystem(t, "kN", "m", "")
	for _, tc := range []struct {
		in   string
		q    Quantity
		want string
	}{
		{"2.4 kip", LineLoad, "kip is a force, where a force per length is due (such as kN/m or kip/ft)"},
		{"8 m", LineLoad, "m is a length, where a force per length is due"},
		{"50 kN*m", RotSpring, "kN·m is a moment (force × length), where a rotational stiffness (moment per radian) is due"},
		{"3 kN*m2", Moment, "kN·m² is of dimension force × length², where a moment"},
	} {
		t.Run(tc.in, func(t *testing.T) {
			_, _, err := s.Value(tc.in, tc.q)
			if err == nil || !errors.Is(err, ErrDimension) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%v, want %q", err, tc.want)
			}
		})
	}
}

func TestNewSystem(t *testing.T) {
	s := mustSystem(t, "kip", "ft", "")
	if got := s.Symbol(Stress.Dim); got != "kip/ft²" {
		t.Errorf("stress in %s", got)
	}
	if got := s.Symbol(RotSpring.Dim); got != "kip·ft/rad" {
		t.Errorf("rotational stiffness in %s", got)
	}
	if got := s.Symbol(Expansion.Dim); got != "1/°C" {
		t.Errorf("expansion in %s", got)
	}
	for _, tc := range []struct{ f, l, temp, want string }{
		{"m", "m", "", "m is a length, not a force"},
		{"kN", "kN", "", "kN is a force, not a length"},
		{"kN", "m", "rad", "rad is a rotation, not a temperature difference"},
		{"tonf", "m", "", `"tonf" is not a unit govern knows`},
	} {
		if _, err := NewSystem(tc.f, tc.l, tc.temp); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s, %s, %s: %v, want %q", tc.f, tc.l, tc.temp, err, tc.want)
		}
	}
}
