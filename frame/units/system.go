package units

import (
	"errors"
	"math"
	"strings"
)

// System is the units of a model: every value of it is in its force,
// length and temperature units, or in their products (a stress in force
// per length², a moment in force × length); angles are in radians.
type System struct {
	Force, Length, Temperature Unit
}

// NewSystem returns the system of the force, length and temperature
// units named, checking that each is of its dimension. An empty
// temperature is °C.
func NewSystem(force, length, temperature string) (System, error) {
	if temperature == "" {
		temperature = "°C"
	}
	var s System
	for _, p := range []struct {
		name string
		q    Quantity
		dst  *Unit
	}{{force, Force, &s.Force}, {length, Length, &s.Length}, {temperature, TempDiff, &s.Temperature}} {
		u, err := Parse(p.name)
		if err != nil {
			return System{}, err
		}
		if u.Dim != p.q.Dim {
			return System{}, fail(ErrDimension, "%s is %s, not %s", u.Symbol, Describe(u.Dim), p.q.Name)
		}
		*p.dst = u
	}
	return s, nil
}

// SI returns the system's unit of dimension d in newtons, metres, kelvins
// and radians: 1e3 for a force in a system of kN.
func (s System) SI(d Dim) float64 {
	return pow(s.Force.SI, d.F) * pow(s.Length.SI, d.L) * pow(s.Temperature.SI, d.T)
}

// Symbol writes the system's unit of dimension d, such as "kN/m²" or
// "kN·m/rad".
func (s System) Symbol(d Dim) string {
	var num, den []string
	add := func(sym string, n int8) {
		switch {
		case n == 1:
			num = append(num, sym)
		case n > 1:
			num = append(num, sym+superscript(int(n)))
		case n == -1:
			den = append(den, sym)
		case n < -1:
			den = append(den, sym+superscript(int(-n)))
		}
	}
	add(s.Force.Symbol, d.F)
	add(s.Length.Symbol, d.L)
	add(s.Temperature.Symbol, d.T)
	add("rad", d.A)
	out := join(num)
	if out == "" {
		out = "1"
	}
	if len(den) > 0 {
		out += "/" + join(den)
	}
	return out
}

func join(s []string) string {
	out := ""
	for i, x := range s {
		if i > 0 {
			out += "·"
		}
		out += x
	}
	return out
}

// Factor returns what a value in unit u is multiplied by to be in the
// system's unit of the same dimension.
func (s System) Factor(u Unit) float64 { return u.SI / s.SI(u.Dim) }

// From converts v, in unit u, to the system's unit of u's dimension.
func (s System) From(v float64, u Unit) float64 { return v * s.Factor(u) }

// Factor returns what a value in unit from is multiplied by to be in unit
// to; both must be of one dimension.
func Factor(from, to Unit) (float64, error) {
	if from.Dim != to.Dim {
		return 0, fail(ErrDimension, "%s is %s and %s is %s: one cannot be converted to the other", from.Symbol, Describe(from.Dim), to.Symbol, Describe(to.Dim))
	}
	return from.SI / to.SI, nil
}

// pow returns x to the whole power n.
func pow(x float64, n int8) float64 {
	if n == 0 {
		return 1
	}
	return math.Pow(x, float64(n))
}

// Value reads str, a number followed by a unit of quantity q (such as
// "2.4 kip/ft" for a line load), and returns the number in the system's
// unit of q. The error says what is wrong: a value that cannot be read
// (ErrSyntax), a symbol not in the table (ErrUnknown), or a unit of
// another dimension (ErrDimension), naming what is due.
func (s System) Value(str string, q Quantity) (float64, Unit, error) {
	t := strings.TrimSpace(str)
	ex := q.Examples
	if i := strings.IndexAny(ex, " ,"); i > 0 {
		ex = ex[:i]
	}
	switch n := numberPrefix(t); {
	case n == 0 && q != Number:
		return 0, Unit{}, fail(ErrSyntax, "%q is not a number followed by a unit, such as \"12 %s\"", str, ex)
	case n > 0 && n == len(t) && q != Number:
		return 0, Unit{}, fail(ErrSyntax, "%q has no unit: write the number without quotes for the model's own units, or give a unit, such as \"%s %s\"", str, t, ex)
	}
	v, u, err := ParseValue(str)
	if err != nil {
		return 0, Unit{}, err
	}
	if u.Dim != q.Dim {
		return 0, u, fail(ErrDimension, "%s is %s, where %s is due (such as %s)", u.Symbol, Describe(u.Dim), q.Name, q.Examples)
	}
	return s.From(v, u), u, nil
}

// ErrDimension marks a unit of another dimension than the one due.
var ErrDimension = errors.New("wrong dimension")
