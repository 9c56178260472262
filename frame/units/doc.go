// Package units reads the units of measure a structural engineer writes,
// such as "kN", "kip/ft", "in4" or "kN·m/rad", and converts values between
// them.
//
// # Dimensions
//
// A unit has a dimension ([Dim]): powers of force, length, temperature
// difference and plane angle. Force rather than mass is a base, as in the
// trade's units (kip, psf, kN/m³); the angle is kept apart so that a
// moment (kN·m) is not taken for a rotational stiffness (kN·m/rad). The
// quantities a model gives ([Quantity]) each have one dimension, and a
// value of another dimension is refused by the caller, never converted.
//
// # Units and their sources
//
// Every unit is a product of the symbols of one small table (table.go),
// each with its value in newtons, metres, kelvins and radians and the
// source of that value. The inch-pound units are exact by definition: the
// international inch of 1959 is 25.4 mm exactly, the pound-force is the
// weight of the avoirdupois pound, 0.45359237 kg exactly, under standard
// gravity, 9.80665 m/s² exactly, so 1 lbf = 4.4482216152605 N exactly; the
// kip is 1000 lbf (NIST Special Publication 811, 2008 edition, Appendix B,
// recalled from memory). Temperatures are differences only: a kelvin and a
// degree Celsius are the same step and a degree Fahrenheit is 5/9 of it;
// no offset is ever applied.
//
// # Writing a unit
//
// A unit is a product of symbols, each with an optional whole power, then
// optionally "/" and a product of symbols in the denominator: "kN/m",
// "kip*ft", "kN·m/rad", "in4", "in^4", "in⁴", "kN/m3", "1/°F". Symbols in
// a product are joined by "*", "·", "⋅", "." or "-" ("kip-ft"); a power is
// written after its symbol as digits, after "^" (with an optional minus)
// or as superscripts. Symbols are case-sensitive (mN and MN differ). Only
// one "/" is allowed: everything after it is the denominator. [Parse]
// reads a unit, [ParseValue] a number followed by a unit ("2.4 kip/ft").
//
// # Conversion
//
// A [System] is the force, length and temperature units of a model; the
// unit of any other dimension follows from them (a model in kN and m takes
// stresses in kN/m², moments in kN·m, rotations in radians). [System.From]
// converts a value in any unit to the system's unit of its dimension.
//
// Nothing passed to this package is modified; its tables are read only.
package units
