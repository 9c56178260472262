package units

import (
	"maps"
	"math"
	"slices"
)

// Exact definitions, from which every inch-pound unit follows (NIST
// Special Publication 811, 2008 edition, Appendix B, recalled from memory;
// the inch and the pound are those of the international yard and pound
// agreement of 1959).
const (
	inch      = 0.0254          // m, exactly
	foot      = 12 * inch       // m, exactly 0.3048
	poundMass = 0.45359237      // kg, exactly
	gravity   = 9.80665         // m/s², standard gravity, exactly
	poundF    = 4.4482216152605 // N: poundMass × gravity, the exact product
	kip       = 1000 * poundF   // N
)

// symbol is one entry of the table: a unit symbol, its dimension, its
// value in newtons, metres, kelvins and radians, and where that value
// comes from.
type symbol struct {
	name   string
	dim    Dim
	si     float64
	source string
}

// Sources of the values.
const (
	srcSI     = "SI: the unit or its decimal prefix (BIPM, The International System of Units, 9th edition)"
	srcInch   = "1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811 Appendix B)"
	srcFoot   = "1 ft = 12 in = 0.3048 m exactly (NIST SP 811 Appendix B)"
	srcPound  = "1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N exactly (NIST SP 811 Appendix B)"
	srcKip    = "1 kip = 1000 lbf (NIST SP 811 Appendix B)"
	srcUS     = "from the exact lbf, kip, in and ft above"
	srcKelvin = "a temperature difference of 1 K = 1 °C (SI); no offset"
	srcFahr   = "a temperature difference of 1 °F = 5/9 K exactly (NIST SP 811 Appendix B); no offset"
	srcDegree = "1° = π/180 rad (SI, units accepted for use with the SI)"
)

var (
	dF = Force.Dim
	dL = Length.Dim
	dT = TempDiff.Dim
	dA = Rotation.Dim
	dS = Stress.Dim
)

// table lists every symbol a unit may be built of. A symbol that names a
// product of others, such as "psf" or "kNm", stands for that product.
var table = []symbol{
	// Forces.
	{"N", dF, 1, srcSI},
	{"kN", dF, 1e3, srcSI},
	{"MN", dF, 1e6, srcSI},
	{"lbf", dF, poundF, srcPound},
	{"kip", dF, kip, srcKip},
	// Lengths.
	{"mm", dL, 1e-3, srcSI},
	{"cm", dL, 1e-2, srcSI},
	{"m", dL, 1, srcSI},
	{"in", dL, inch, srcInch},
	{"ft", dL, foot, srcFoot},
	// Stresses and pressures.
	{"Pa", dS, 1, srcSI},
	{"kPa", dS, 1e3, srcSI},
	{"MPa", dS, 1e6, srcSI},
	{"GPa", dS, 1e9, srcSI},
	{"psi", dS, poundF / (inch * inch), srcUS},
	{"ksi", dS, kip / (inch * inch), srcUS},
	{"psf", dS, poundF / (foot * foot), srcUS},
	{"ksf", dS, kip / (foot * foot), srcUS},
	// Forces per length and per volume.
	{"plf", LineLoad.Dim, poundF / foot, srcUS},
	{"klf", LineLoad.Dim, kip / foot, srcUS},
	{"pcf", UnitWeight.Dim, poundF / (foot * foot * foot), srcUS},
	{"kcf", UnitWeight.Dim, kip / (foot * foot * foot), srcUS},
	// Moments written as one word.
	{"kNm", Moment.Dim, 1e3, srcSI},
	{"Nmm", Moment.Dim, 1e-3, srcSI},
	{"MNm", Moment.Dim, 1e6, srcSI},
	// Temperature differences.
	{"K", dT, 1, srcKelvin},
	{"°C", dT, 1, srcKelvin},
	{"°F", dT, 5.0 / 9.0, srcFahr},
	// Plane angles.
	{"rad", dA, 1, srcSI},
	{"mrad", dA, 1e-3, srcSI},
	{"°", dA, math.Pi / 180, srcDegree},
}

// aliases are other ways the trade writes a symbol of the table.
var aliases = map[string]string{
	"lb": "lbf", "lbs": "lbf", "kips": "kip",
	"inch": "in", "inches": "in", "foot": "ft", "feet": "ft",
	"degC": "°C", "℃": "°C", "degF": "°F", "℉": "°F",
	"deg": "°", "degree": "°", "degrees": "°",
}

// bySymbol finds a symbol of the table, or through an alias.
func bySymbol(s string) (symbol, bool) {
	if a, ok := aliases[s]; ok {
		s = a
	}
	for _, e := range table {
		if e.name == s {
			return e, true
		}
	}
	return symbol{}, false
}

// Symbols returns every symbol of the table and every alias, for messages
// and documents.
func Symbols() []string {
	out := make([]string, 0, len(table)+len(aliases))
	for _, e := range table {
		out = append(out, e.name)
	}
	return append(out, slices.Sorted(maps.Keys(aliases))...)
}
