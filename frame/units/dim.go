package units

import "strings"

// Dim is the dimension of a quantity: the powers of force (F), length
// (L), temperature difference (T) and plane angle (A) it is a product of.
// The zero Dim is a pure number.
type Dim struct{ F, L, T, A int8 }

// mul returns the dimension of a product of d and e to the power p.
func (d Dim) mul(e Dim, p int8) Dim {
	return Dim{d.F + p*e.F, d.L + p*e.L, d.T + p*e.T, d.A + p*e.A}
}

// Quantity is a kind of value a model gives: its dimension, how messages
// name it and units it is usually given in.
type Quantity struct {
	Dim      Dim
	Name     string // such as "a force per length"
	Examples string // such as "kN/m or kip/ft"
}

// The quantities of a plane frame model. Spring and LineLoad share a
// dimension (force per length), as do Stress and Pressure: they differ in
// how messages name them.
var (
	Number      = Quantity{Dim{}, "a pure number", "no unit"}
	Force       = Quantity{Dim{F: 1}, "a force", "kN or kip"}
	Length      = Quantity{Dim{L: 1}, "a length", "m, mm or ft"}
	Area        = Quantity{Dim{L: 2}, "an area", "m², mm² or in²"}
	Inertia     = Quantity{Dim{L: 4}, "a second moment of area (length⁴)", "m⁴, mm⁴ or in⁴"}
	Stress      = Quantity{Dim{F: 1, L: -2}, "a stress (force per area)", "MPa, GPa or ksi"}
	Pressure    = Quantity{Dim{F: 1, L: -2}, "a pressure (force per area)", "kPa, kN/m² or psf"}
	LineLoad    = Quantity{Dim{F: 1, L: -1}, "a force per length", "kN/m or kip/ft"}
	UnitWeight  = Quantity{Dim{F: 1, L: -3}, "a weight per volume", "kN/m³ or pcf"}
	Moment      = Quantity{Dim{F: 1, L: 1}, "a moment (force × length)", "kN·m or kip·ft"}
	TempDiff    = Quantity{Dim{T: 1}, "a temperature difference", "K, °C or °F"}
	Expansion   = Quantity{Dim{T: -1}, "a coefficient of thermal expansion (per degree)", "1/K or 1/°F"}
	Rotation    = Quantity{Dim{A: 1}, "a rotation", "rad, mrad or degree"}
	Spring      = Quantity{Dim{F: 1, L: -1}, "a stiffness (force per length)", "kN/m or kip/in"}
	RotSpring   = Quantity{Dim{F: 1, L: 1, A: -1}, "a rotational stiffness (moment per radian)", "kN·m/rad or kip·in/rad"}
	quantityRow = []Quantity{Number, Force, Length, Area, Inertia, Stress, LineLoad, UnitWeight, Moment, TempDiff, Expansion, Rotation, RotSpring}
)

// Describe names dimension d for a message: the name of the quantity of
// that dimension, such as "a force per length", or else its powers, such
// as "force × length²".
func Describe(d Dim) string {
	for _, q := range quantityRow {
		if q.Dim == d {
			return q.Name
		}
	}
	return "of dimension " + d.String()
}

// String writes d as a product of powers, such as "force × length⁻²".
func (d Dim) String() string {
	var parts []string
	for _, p := range []struct {
		name string
		n    int8
	}{{"force", d.F}, {"length", d.L}, {"temperature", d.T}, {"angle", d.A}} {
		switch p.n {
		case 0:
		case 1:
			parts = append(parts, p.name)
		default:
			parts = append(parts, p.name+superscript(int(p.n)))
		}
	}
	if len(parts) == 0 {
		return "1 (a pure number)"
	}
	return strings.Join(parts, " × ")
}
