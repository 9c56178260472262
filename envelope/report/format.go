package report

import (
	"fmt"
	"math"
	"strconv"

	"govern/envelope/analysis"
)

// Every number the outputs show is formatted here.

// clean turns negative zero into zero, so that output does not show "-0".
func clean(v float64) float64 {
	if v == 0 {
		return 0
	}
	return v
}

// unsigned drops the minus sign of a number that rounded to zero, such as
// "-0.00" or "-0": output never shows a negative zero.
func unsigned(s string) string {
	if len(s) < 2 || s[0] != '-' {
		return s
	}
	for i := 1; i < len(s) && s[i] != 'e'; i++ {
		if s[i] != '0' && s[i] != '.' {
			return s
		}
	}
	return s[1:]
}

// Numbers in tables have a bounded width: from hugeValue up (and for a
// deflection below tinyValue) they are written with an exponent and four
// significant figures, such as 1.235e+12, never as hundreds of digits. A
// frame in N and mm reaches 10⁹ N·mm (1000 kN·m) and more, and is still
// written in full.
const (
	hugeValue = 1e12
	tinyValue = 1e-9
)

// exponent formats v with an exponent and four significant figures.
func exponent(v float64) string { return strconv.FormatFloat(v, 'e', 3, 64) }

// fixed formats a value for a table with two decimals.
func fixed(v float64) string {
	if math.Abs(v) >= hugeValue {
		return exponent(v)
	}
	return unsigned(strconv.FormatFloat(v, 'f', 2, 64))
}

// fixed3 formats a distance along a member with three decimals.
func fixed3(v float64) string {
	if math.Abs(v) >= hugeValue {
		return exponent(v)
	}
	return unsigned(strconv.FormatFloat(v, 'f', 3, 64))
}

// sci formats a small positive quantity such as a residual.
func sci(v float64) string { return strconv.FormatFloat(clean(v), 'e', 1, 64) }

// sig4 formats a small length such as a deflection to four significant
// figures, without an exponent between tinyValue and hugeValue.
func sig4(v float64) string {
	v = clean(v)
	if v == 0 {
		return "0"
	}
	if a := math.Abs(v); a >= hugeValue || a < tinyValue {
		return exponent(v)
	}
	d := 3 - int(math.Floor(math.Log10(math.Abs(v))))
	d = max(0, min(d, 12))
	return strconv.FormatFloat(v, 'f', d, 64)
}

// sig6 formats a value to six significant digits; "-" for NaN.
func sig6(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	return strconv.FormatFloat(clean(v), 'g', 6, 64)
}

// short formats a value written on a diagram: four significant figures or
// so, without an exponent.
func short(v float64) string {
	a := math.Abs(v)
	switch {
	case a >= hugeValue:
		return exponent(v)
	case a >= 1000:
		return unsigned(strconv.FormatFloat(v, 'f', 0, 64))
	case a >= 10:
		return unsigned(strconv.FormatFloat(v, 'f', 1, 64))
	case a >= 0.1:
		return unsigned(strconv.FormatFloat(v, 'f', 2, 64))
	}
	return sig4(v)
}

// ratio formats a span/deflection ratio as "L/412", rounded down (the
// safe side). A ratio below 1, a deflection larger than the span (which
// points to a unit slip), keeps two significant figures, rounded down,
// such as "L/0.0019", never "L/0"; one from 10⁹ up is written with an
// exponent, such as "L/1.2e+09".
func ratio(r float64) string {
	switch {
	case math.IsInf(r, 0) || math.IsNaN(r) || r < 0:
		return "-"
	case r >= 1e9:
		return "L/" + strconv.FormatFloat(twoFigures(r), 'e', 1, 64)
	case r >= 1:
		return "L/" + strconv.FormatFloat(math.Floor(r), 'f', 0, 64)
	}
	return "L/" + strconv.FormatFloat(twoFigures(r), 'g', 2, 64)
}

// twoFigures returns r > 0 rounded down to two significant figures.
func twoFigures(r float64) float64 {
	step := math.Pow(10, math.Floor(math.Log10(r))-1)
	return math.Floor(r/step*(1+1e-12)) * step
}

// outputDigits is the number of significant digits numbers are written
// with in JSON and CSV. Results carry far fewer correct digits than a
// float64's 17 (the loads and stiffnesses behind them are known to three
// or four), and ten keep every value distinct from its neighbours while
// making a tall frame's files a third smaller than full precision.
const outputDigits = 10

// appendNum appends v with outputDigits significant digits, trailing zeros
// dropped, in exponent form only for magnitudes below 1e-4 or from
// 10^outputDigits up (strconv's 'g' format, to the byte: appendTen;
// valid JSON either way).
func appendNum(dst []byte, v float64) []byte {
	return appendTen(dst, clean(v))
}

// num formats a value for CSV or JSON (appendNum).
func num(v float64) string { return string(appendNum(nil, v)) }

// position formats a station's x for CSV: twelve significant digits.
func position(v float64) string { return strconv.FormatFloat(v, 'g', 12, 64) }

// shortest formats a coordinate with the fewest digits that give it back.
func shortest(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// plain formats an input value as it would be typed, without an exponent
// for the magnitudes of section properties.
func plain(v float64) string {
	if a := math.Abs(v); a != 0 && (a < 1e-6 || a >= 1e15) {
		return num(v)
	}
	return strconv.FormatFloat(clean(v), 'f', -1, 64)
}

// svgNum formats a drawing coordinate: two decimals are plenty.
func svgNum(v float64) string { return unsigned(strconv.FormatFloat(v, 'f', 2, 64)) }

// relDiff formats a relative difference; below 1e-12 it is round-off and
// shown as a bound, so that the report does not depend on the last bits of
// the arithmetic.
func relDiff(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	if v < 1e-12 {
		return "< 1e-12"
	}
	return strconv.FormatFloat(v, 'e', 1, 64)
}

// bound returns the smallest power of ten not below v (at least 1e-16), so
// that a round-off figure is reported without its platform-dependent digits.
func bound(v float64) string {
	return strconv.FormatFloat(math.Pow(10, math.Ceil(math.Log10(math.Max(v, 1e-16)))), 'e', 0, 64)
}

// mib formats a size in bytes as whole MiB, rounded up.
func mib(n int) string { return fmt.Sprintf("%d MiB", (n+1<<20-1)>>20) }

// isNumber reports whether a table cell holds a number, to align it right.
func isNumber(s string) bool {
	_, err := strconv.ParseFloat(s, 64)
	return err == nil
}

// shownShort formats a value written on a diagram (short) in the unit s
// shows it in.
func shownShort(s analysis.Shown) func(float64) string {
	return func(v float64) string { return short(s.Of(v)) }
}
