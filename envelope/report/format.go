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

// fixed formats a value for a table with two decimals.
func fixed(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	if s == "-0.00" {
		s = "0.00"
	}
	return s
}

// fixed3 formats a distance along a member with three decimals.
func fixed3(v float64) string { return strconv.FormatFloat(clean(v), 'f', 3, 64) }

// sci formats a small positive quantity such as a residual.
func sci(v float64) string { return strconv.FormatFloat(clean(v), 'e', 1, 64) }

// sig4 formats a small length such as a deflection to four significant
// figures, without an exponent.
func sig4(v float64) string {
	v = clean(v)
	if v == 0 {
		return "0"
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
	case a >= 1000:
		return strconv.FormatFloat(clean(v), 'f', 0, 64)
	case a >= 10:
		return strconv.FormatFloat(clean(v), 'f', 1, 64)
	case a >= 0.1:
		return strconv.FormatFloat(clean(v), 'f', 2, 64)
	}
	return sig4(v)
}

// ratio formats a span/deflection ratio as "L/412".
func ratio(r float64) string {
	if math.IsInf(r, 0) || math.IsNaN(r) {
		return "-"
	}
	return "L/" + strconv.FormatFloat(math.Floor(r), 'f', 0, 64)
}

// outputDigits is the number of significant digits numbers are written
// with in JSON and CSV. Results carry far fewer correct digits than a
// float64's 17 (the loads and stiffnesses behind them are known to three
// or four), and ten keep every value distinct from its neighbours while
// making a tall frame's files a third smaller than full precision.
const outputDigits = 10

// appendNum appends v with outputDigits significant digits, trailing zeros
// dropped, in exponent form only for magnitudes below 1e-4 or from
// 10^outputDigits up (strconv's 'g' format; valid JSON either way).
func appendNum(dst []byte, v float64) []byte {
	return strconv.AppendFloat(dst, clean(v), 'g', outputDigits, 64)
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
func svgNum(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

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
