package units

import (
	"math"
	"math/big"
	"testing"
)

// rat parses an exact decimal or fraction.
func rat(s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		panic("bad rational " + s)
	}
	return r
}

func mulR(a ...*big.Rat) *big.Rat {
	out := big.NewRat(1, 1)
	for _, x := range a {
		out.Mul(out, x)
	}
	return out
}

func divR(a, b *big.Rat) *big.Rat { return new(big.Rat).Quo(a, b) }

// exactTol is the relative difference allowed between a factor of the
// table, computed in floating point from the exact definitions, and the
// exact value rounded once: a few units in the last place.
const exactTol = 1e-15

// TestTableAgainstExactDefinitions checks the value of every symbol of the
// table against its definition, computed exactly in rational arithmetic:
// 1 in = 0.0254 m, 1 ft = 12 in, 1 lbf = 0.45359237 kg × 9.80665 m/s²,
// 1 kip = 1000 lbf, 1 °F (a difference) = 5/9 K, SI prefixes (NIST SP 811,
// 2008, Appendix B; BIPM SI Brochure, 9th edition; recalled from memory).
func TestTableAgainstExactDefinitions(t *testing.T) {
	in := rat("0.0254")
	ft := mulR(rat("12"), in)
	lbf := mulR(rat("0.45359237"), rat("9.80665"))
	kip := mulR(rat("1000"), lbf)
	ft2, ft3, in2 := mulR(ft, ft), mulR(ft, ft, ft), mulR(in, in)
	exact := map[string]*big.Rat{
		"N": rat("1"), "kN": rat("1000"), "MN": rat("1000000"),
		"lbf": lbf, "kip": kip,
		"mm": rat("0.001"), "cm": rat("0.01"), "m": rat("1"), "in": in, "ft": ft,
		"Pa": rat("1"), "kPa": rat("1000"), "MPa": rat("1000000"), "GPa": rat("1000000000"),
		"psi": divR(lbf, in2), "ksi": divR(kip, in2), "psf": divR(lbf, ft2), "ksf": divR(kip, ft2),
		"plf": divR(lbf, ft), "klf": divR(kip, ft), "pcf": divR(lbf, ft3), "kcf": divR(kip, ft3),
		"kNm": rat("1000"), "Nmm": rat("0.001"), "MNm": rat("1000000"),
		"K": rat("1"), "°C": rat("1"), "°F": rat("5/9"),
		"rad": rat("1"), "mrad": rat("0.001"),
	}
	t.Run("the pound-force is the exact product", func(t *testing.T) {
		if lbf.Cmp(rat("4.4482216152605")) != 0 {
			t.Fatalf("0.45359237 × 9.80665 = %s, not 4.4482216152605", lbf.FloatString(16))
		}
	})
	for _, e := range table {
		t.Run(e.name, func(t *testing.T) {
			if e.name == "°" {
				// π/180 is not rational: against π to 40 digits.
				pi, _ := new(big.Float).SetPrec(200).SetString("3.141592653589793238462643383279502884197")
				want, _ := new(big.Float).Quo(pi, big.NewFloat(180)).Float64()
				if rel := math.Abs(e.si-want) / want; rel > exactTol {
					t.Errorf("° = %.17g rad, want π/180 = %.17g", e.si, want)
				}
				return
			}
			x, ok := exact[e.name]
			if !ok {
				t.Fatalf("no exact definition for %q in the test", e.name)
			}
			want, _ := x.Float64()
			if rel := math.Abs(e.si-want) / want; rel > exactTol {
				t.Errorf("%s = %.17g, exact %.17g (relative %.1e)", e.name, e.si, want, rel)
			}
		})
	}
}

// TestTableAgainstPublishedFactors checks the table against the
// conversion factors of NIST SP 811 (2008), Appendix B.9, as published to
// seven significant digits (recalled from memory).
func TestTableAgainstPublishedFactors(t *testing.T) {
	const published = 5e-7 // seven significant digits
	for _, tc := range []struct {
		unit string
		si   float64
	}{
		{"lbf", 4.448222},
		{"kip", 4.448222e3},
		{"in", 2.54e-2},
		{"ft", 3.048e-1},
		{"psi", 6.894757e3},
		{"ksi", 6.894757e6},
		{"psf", 4.788026e1},
		{"lbf/ft", 1.459390e1},
		{"lbf/ft3", 1.570875e2},
		{"lbf·ft", 1.355818},
		{"lbf·in", 1.129848e-1},
		{"in4", 4.162314e-7},
		{"ft4", 8.630975e-3},
		{"in2", 6.4516e-4},
		{"ft2", 9.290304e-2},
		{"°", 1.745329e-2},
		{"°F", 5.555556e-1},
	} {
		t.Run(tc.unit, func(t *testing.T) {
			u := MustParse(tc.unit)
			if rel := math.Abs(u.SI-tc.si) / tc.si; rel > published {
				t.Errorf("%s = %.10g in SI, published %.7g", tc.unit, u.SI, tc.si)
			}
		})
	}
}

func TestSymbolsAreUnique(t *testing.T) {
	seen := map[string]bool{}
	for _, s := range Symbols() {
		if seen[s] {
			t.Errorf("%q twice", s)
		}
		seen[s] = true
	}
	for a, s := range aliases {
		if _, ok := bySymbol(s); !ok {
			t.Errorf("alias %q stands for %q, which is not in the table", a, s)
		}
	}
}
